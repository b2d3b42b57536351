//! Section 8 of the note (when remedies were sized): each remedy next to the unmitigated
//! result of the same stage and mode.

use std::fmt::Write as _;

use super::markup::html_escape;

/// The remedy table: each remedy next to the unmitigated result of the same stage and mode.
pub(super) fn write(o: &mut String, remedies: &crate::remedy::RemedyResults) {
    o.push_str(
        "<p>Each remedy is re-checked with the same EN 1991-1-4 Annex E functions as the \
         unmitigated stack; \"before\" is the unmitigated result. The tuned-mass-damper \
         damping is an equal-peak (Den Hartog) idealisation; the strake factor on c_lat is user \
         input (the standard gives none).</p>\n<table>\n<thead><tr><th>stage</th><th>mode i</th>\
         <th>remedy</th><th>&#948;<sub>s</sub> (-)</th><th>Sc (-)</th>\
         <th>y<sub>tip</sub> before (m)</th><th>y<sub>tip</sub> after (m)</th>\
         <th>&#963;<sub>max</sub> before (MPa)</th><th>&#963;<sub>max</sub> after (MPa)</th>\
         <th>verdict before</th><th>verdict after</th></tr></thead>\n<tbody>\n",
    );
    let num = |v: Option<f64>, scale: f64, digits: usize| {
        v.map_or_else(|| "-".to_string(), |x| format!("{:.digits$}", x * scale))
    };
    let short = |v: &str| v.split(':').next().unwrap_or(v).to_string();
    let rows = remedies.rows();
    for r in &rows {
        let _ = writeln!(
            o,
            "<tr><td>{}</td><td class=\"n\">{}</td><td>{}</td><td class=\"n\">{}</td>\
             <td class=\"n\">{}</td><td class=\"n\">{}</td><td class=\"n\">{}</td>\
             <td class=\"n\">{}</td><td class=\"n\">{}</td><td>{}</td><td>{}</td></tr>",
            html_escape(&r.stage),
            r.mode,
            html_escape(&r.remedy),
            num(r.log_decrement, 1.0, 4),
            num(r.scruton, 1.0, 1),
            num(r.tip_amplitude_before_m, 1.0, 4),
            num(r.tip_amplitude_after_m, 1.0, 4),
            num(r.max_stress_before_pa, 1e-6, 2),
            num(r.max_stress_after_pa, 1e-6, 2),
            html_escape(&short(&r.verdict_before)),
            html_escape(&short(&r.verdict_after)),
        );
    }
    o.push_str("</tbody>\n</table>\n<ul>\n");
    for r in rows.iter().filter(|r| !r.note.is_empty()) {
        let _ = writeln!(
            o,
            "<li>{} mode {} ({}): {}</li>",
            html_escape(&r.stage),
            r.mode,
            html_escape(&r.remedy),
            html_escape(&r.note)
        );
    }
    o.push_str("</ul>\n");
}
