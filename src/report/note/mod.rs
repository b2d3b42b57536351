//! report.html: the self-contained design note. Inline CSS and inline SVG only: no scripts,
//! no fonts, no links to anything outside the file, so it opens offline and prints on A4
//! with "page x of y" on every page. The markup is well-formed XML (every element closed,
//! only numeric character references), so it can be checked with an XML parser.
//!
//! Every piece of user-supplied text (title, `[project]` keys, stage names, point-mass
//! labels, warnings that quote them) goes through [`html_escape`]; the SVGs are escaped by
//! their backend. One file per part of the note: title block, inputs, method (with the
//! table of constants not read from the standard), modes, verdicts (every intermediate value
//! of every method), stage comparison, loads, remedies.
//!
//! Headings and layout are our own. Units: SI, with the unit in every column head.

mod along;
mod comparison;
mod drawn;
mod inputs;
mod loads;
mod markup;
mod method;
mod modes;
pub(crate) mod page_style;
mod remedies;
mod resistance;
mod summary;
mod title_block;
mod verdicts;

use std::fmt::Write as _;

pub use markup::html_escape;

use super::svg::Plot;
use super::{ReportInput, CAUTIONS};

/// Renders the design note. `date` is printed as given (ISO date), so tests can fix it.
pub fn render(input: &ReportInput, plots: &[Plot], date: &str) -> String {
    let plot = |file: &str| plots.iter().position(|p| p.file == file);
    let mut fig_no = 0;
    let mut put = |out: &mut String, file: &str| {
        if let Some(i) = plot(file) {
            fig_no += 1;
            markup::figure(out, &plots[i], fig_no);
        }
    };
    let title = html_escape(&input.case.title);
    let mut o = String::new();
    let _ = write!(
        o,
        "<!DOCTYPE html>\n<html lang=\"en\" xmlns=\"http://www.w3.org/1999/xhtml\">\n<head>\n\
         <meta charset=\"utf-8\" />\n<title>{title}</title>\n<style>{}</style>\n</head>\n<body>\n",
        page_style::CSS
    );
    title_block::write(&mut o, input.case, date);
    o.push_str("<h2>1 Scope and cautions</h2>\n<p>This note screens the stack for across-wind vortex-shedding lock-in in the first modes of every construction stage and quantifies the response where lock-in can occur");
    if input.along.is_some() {
        o.push_str("; it gives the along-wind design action of EN 1991-1-4 and the vortex case combined with it");
    }
    if input.resistance.is_some() {
        o.push_str("; it checks the reinforced-concrete shell's moment resistance and the fatigue of its vertical bars (EN 1992-1-1)");
    }
    o.push_str(".</p>\n<div class=\"cautions\"><ul>\n");
    for c in CAUTIONS {
        let _ = writeln!(o, "<li>{}</li>", html_escape(c));
    }
    o.push_str("</ul></div>\n<h3>1.1 Verdict at a glance</h3>\n");
    summary::write(&mut o, input);
    o.push_str("<h2>2 Inputs</h2>\n");
    inputs::write(&mut o, input);
    resistance::write_inputs(&mut o, input);
    put(&mut o, "shell.svg");
    o.push_str("<section class=\"major\">\n<h2>3 Method</h2>\n");
    method::write(&mut o);
    o.push_str("</section>\n<section class=\"major\">\n<h2>4 Natural modes by stage</h2>\n");
    modes::write(&mut o, input);
    put(&mut o, "modes.svg");
    o.push_str("</section>\n<section class=\"major\">\n<h2>5 Vortex-shedding verdicts</h2>\n");
    verdicts::write(&mut o, input);
    put(&mut o, "wind_map.svg");
    put(&mut o, "response.svg");
    o.push_str("</section>\n<section class=\"major\">\n<h2>6 Stage comparison</h2>\n");
    comparison::write(&mut o, input);
    put(&mut o, "stages.svg");
    o.push_str("</section>\n<section class=\"major\">\n<h2>7 Loads</h2>\n");
    loads::write(&mut o, input);
    put(&mut o, "envelopes.svg");
    o.push_str("</section>\n");
    let mut next = 8;
    if let Some(along) = input.along {
        let _ = writeln!(
            o,
            "<section class=\"major\">\n<h2>{next} Along-wind action and the vortex case</h2>"
        );
        along::write(&mut o, along);
        o.push_str(&which_speed(input.case));
        put(&mut o, "along_moments.svg");
        o.push_str("</section>\n");
        next += 1;
    }
    if let Some(r) = input.resistance {
        let _ = writeln!(
            o,
            "<section class=\"major\">\n<h2>{next} Resistance of the RC shell and fatigue of the reinforcement</h2>"
        );
        let factors = input
            .case
            .resistance
            .as_ref()
            .map(|s| s.factors)
            .unwrap_or_default();
        resistance::write(&mut o, r, &factors);
        put(&mut o, "resistance.svg");
        o.push_str("</section>\n");
        next += 1;
    }
    if let Some(r) = input.remedies.filter(|r| !r.is_empty()) {
        let _ = writeln!(o, "<section class=\"major\">\n<h2>{next} Remedies</h2>");
        remedies::write(&mut o, r);
        o.push_str("</section>\n");
        next += 1;
    }
    if let Some(fragment) = input.model_plan_html {
        let _ = writeln!(
            o,
            "<section class=\"major\">\n<h2>{next} Aeroelastic model plan</h2>"
        );
        o.push_str(fragment);
        o.push_str("</section>\n");
        next += 1;
    }
    let _ = writeln!(o, "<h2>{next} Warnings</h2>");
    if input.warnings.is_empty() {
        o.push_str("<p>None.</p>\n");
    } else {
        o.push_str("<ul>\n");
        for w in input.warnings {
            let _ = writeln!(o, "<li>{}</li>", html_escape(w));
        }
        o.push_str("</ul>\n");
    }
    let _ = writeln!(
        o,
        "<footer>Screening tool: results must be checked by a licensed engineer against the \
         local code and the governing standard's National Annex. No warranty. Tables of this \
         note: modes.csv, vortex.csv, lock_in.csv, loads.csv, along_wind.csv (with the EN site wind), resistance.csv (with [reinforcement]), summary.json.</footer>\n</body>\n</html>"
    );
    o
}

/// One paragraph saying which wind speed drives which check (a case gives the site wind
/// both ways when it asks for the along-wind action).
fn which_speed(case: &crate::case::Case) -> String {
    let (Some(w), Some(a)) = (case.wind.as_ref(), case.along_wind.as_ref()) else {
        return String::new();
    };
    let profile = match w.profile {
        crate::case::Profile::Power { exponent } => format!("power law, exponent {exponent}"),
        crate::case::Profile::Log { roughness_m, .. } => {
            format!("logarithmic law, z<sub>0</sub> = {roughness_m} m")
        }
    };
    let terrain = match a.terrain {
        crate::case::TerrainCategory::Zero => "0",
        crate::case::TerrainCategory::I => "I",
        crate::case::TerrainCategory::II => "II",
        crate::case::TerrainCategory::III => "III",
        crate::case::TerrainCategory::IV => "IV",
    };
    format!(
        "<p>Which wind drives which check: the vortex-shedding checks (verdicts, loads, and the \
         vortex moments here) use <code>wind.reference_speed_m_s</code> = {} m/s at {} m with \
         the {profile}; the along-wind design action uses the EN 1991-1-4 chapter 4 profile of \
         terrain category {terrain} from v<sub>b,0</sub> = {} m/s (c<sub>dir</sub> = {}, \
         c<sub>season</sub> = {}, c<sub>o</sub> = {}). Both are scaled per stage by the \
         stage's c<sub>prob</sub> (see the stage comparison).</p>\n",
        w.reference_speed_m_s,
        w.reference_height_m,
        a.basic_speed_m_s,
        a.c_dir,
        a.c_season,
        a.orography_factor
    )
}
