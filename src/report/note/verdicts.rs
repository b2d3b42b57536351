//! Section 5 of the note: per stage, the critical speed and screening of every mode, then
//! every intermediate value of each method (EN 1991-1-4 Annex E approaches 1 and 2,
//! GB 50009-2012 App. H.1), then the methods side by side. Heads carry the standard's symbols
//! and units. Each table is at most 11 narrow columns so that it fits the A4 text width.

use std::fmt::Write as _;

use super::markup::{heads, html_escape, n, num, opt, sci, t, Cell, Table};
use super::method::method_name;
use crate::report::ReportInput;
use crate::wind::gb50009::Regime;
use crate::wind::{ModeVortex, StageVortex};

fn band(m: &ModeVortex) -> String {
    match &m.lock_in_band {
        Some(b) => format!("{:.0}-{:.0}", b.from_z_m, b.to_z_m),
        None => "none".into(),
    }
}

/// The verdict in one word (the reasons of an exceedance are listed under the table).
pub(super) fn verdict_cell(m: &ModeVortex) -> Cell {
    if m.verdict.is_exceeds() {
        Cell::Bad("exceeds".into())
    } else {
        t(m.verdict.to_string())
    }
}

fn exceedances(out: &mut String, modes: &[ModeVortex]) {
    let bad: Vec<&ModeVortex> = modes.iter().filter(|m| m.verdict.is_exceeds()).collect();
    if bad.is_empty() {
        return;
    }
    out.push_str("<ul class=\"small\">\n");
    for m in bad {
        let _ = writeln!(
            out,
            "<li><b>Mode {}</b>: {}</li>",
            m.mode,
            html_escape(&m.verdict.to_string())
        );
    }
    out.push_str("</ul>\n");
}

fn regime(r: Regime) -> &'static str {
    match r {
        Regime::Subcritical => "subcritical",
        Regime::Supercritical => "supercritical",
        Regime::Transcritical => "transcritical",
    }
}

/// Critical speed, E.1.2 screening, Scruton and Reynolds numbers, verdict.
fn shedding_table(out: &mut String, s: &StageVortex) {
    Table {
        head: heads(&[
            "mode i",
            "n<sub>i</sub> (Hz)",
            "z<sub>s</sub> (m)",
            "b (m)",
            "St (-)",
            "v<sub>crit,i</sub> (m/s)",
            "v<sub>m</sub>(z<sub>s</sub>) (m/s)",
            "v<sub>crit</sub>/v<sub>m</sub> (-)",
            "m<sub>i,e</sub> (kg/m)",
            "Sc (-)",
            "Re (-)",
            "verdict",
        ]),
        rows: s
            .modes
            .iter()
            .map(|m| {
                vec![
                    n(m.mode.to_string()),
                    n(num(m.frequency_hz, 4)),
                    n(num(m.reference_height_m, 1)),
                    n(num(m.diameter_m, 2)),
                    n(num(m.strouhal, 3)),
                    n(num(m.critical_speed_m_s, 2)),
                    n(num(m.mean_speed_m_s, 2)),
                    n(num(m.speed_ratio, 2)),
                    n(num(m.equivalent_mass_kg_m, 0)),
                    n(num(m.scruton, 1)),
                    n(sci(m.reynolds)),
                    verdict_cell(m),
                ]
            })
            .collect(),
    }
    .write(out);
}

fn screened_note(out: &mut String, s: &StageVortex, what: &str) -> bool {
    let screened: Vec<String> = s
        .modes
        .iter()
        .filter(|m| m.screened_out)
        .map(|m| m.mode.to_string())
        .collect();
    if screened.len() == s.modes.len() {
        let _ = writeln!(
            out,
            "<p class=\"small\">{what}: not evaluated, every mode is screened out by E.1.2 \
             (v<sub>crit</sub> &gt; 1.25 v<sub>m</sub>).</p>"
        );
        return false;
    }
    if !screened.is_empty() {
        let _ = writeln!(
            out,
            "<p class=\"small\">Not evaluated for mode{} {} (screened out by E.1.2).</p>",
            if screened.len() == 1 { "" } else { "s" },
            screened.join(", ")
        );
    }
    true
}

/// Approach 1 (E.1.5.2): c_lat,0, Table E.3, L_j and its centre, K, K_W, y_F,max.
fn approach1_table(out: &mut String, s: &StageVortex) {
    out.push_str("<h4>EN 1991-1-4 approach 1 (E.1.5.2)</h4>\n");
    if !screened_note(out, s, "Approach 1") {
        return;
    }
    let group = s
        .modes
        .iter()
        .filter_map(|m| m.approach1.as_ref())
        .any(|a| a.c_lat_group_factor != 1.0);
    let mut rows = Vec::new();
    for m in &s.modes {
        let Some(a) = &m.approach1 else { continue };
        rows.push(vec![
            n(m.mode.to_string()),
            n(num(a.c_lat0, 3)),
            n(num(a.speed_ratio_lj, 3)),
            n(num(a.c_lat, 3)),
            n(num(a.correlation_length_m, 1)),
            n(num(a.correlation_centre_z_m, 1)),
            n(num(a.k, 4)),
            n(format!(
                "{}{}",
                num(a.kw, 3),
                if a.kw_uncapped > a.kw { " (cap)" } else { "" }
            )),
            n(num(a.y_max_m, 4)),
            n(num(a.tip_amplitude_m, 4)),
            n(sci(a.fatigue_cycles)),
        ]);
    }
    Table {
        head: heads(&[
            "mode i",
            "c<sub>lat,0</sub> (-) Fig. E.2",
            "v<sub>crit</sub>/v<sub>m,Lj</sub> (-)",
            "c<sub>lat</sub> (-) Tab. E.3",
            "L<sub>j</sub> (m) Tab. E.4",
            "centre of L<sub>j</sub>, z (m)",
            "K (-) (E.9)",
            "K<sub>W</sub> (-) (E.8)",
            "y<sub>F,max</sub> (m) (E.7)",
            "y<sub>tip</sub> (m)",
            "N (-)",
        ]),
        rows,
    }
    .write(out);
    let mut note = String::from(
        "y<sub>F,max</sub> at the largest antinode z<sub>s</sub>; y<sub>tip</sub> scaled by \
         the mode shape; N load cycles in the design life.",
    );
    if group {
        let f: Vec<String> = s
            .modes
            .iter()
            .filter_map(|m| m.approach1.as_ref().map(|a| (m.mode, a.c_lat_group_factor)))
            .map(|(k, f)| format!("mode {k}: {f:.3}"))
            .collect();
        let _ = write!(
            note,
            " c<sub>lat</sub> includes the in-line group factor ({}).",
            f.join(", ")
        );
    }
    let _ = writeln!(out, "<p class=\"small\">{note}</p>");
}

/// Approach 2 (E.1.5.3): C_c, K_a, a_L, sigma_y, k_p.
fn approach2_table(out: &mut String, s: &StageVortex) {
    out.push_str("<h4>EN 1991-1-4 approach 2 (E.1.5.3)</h4>\n");
    if !screened_note(out, s, "Approach 2") {
        return;
    }
    let mut rows = Vec::new();
    for m in &s.modes {
        let Some(a) = &m.approach2 else { continue };
        rows.push(vec![
            n(m.mode.to_string()),
            n(num(a.c_c, 4)),
            n(num(a.k_a, 3)),
            n(num(a.a_l, 2)),
            n(num(a.sigma_y_m, 4)),
            n(num(a.peak_factor, 3)),
            n(num(a.y_max_m, 4)),
            n(num(a.tip_amplitude_m, 4)),
            n(sci(a.fatigue_cycles)),
        ]);
    }
    Table {
        head: heads(&[
            "mode i",
            "C<sub>c</sub> (-)",
            "K<sub>a</sub> = K<sub>a,max</sub> (-)",
            "a<sub>L</sub> (-)",
            "&#963;<sub>y</sub> (m)",
            "k<sub>p</sub> (-)",
            "y<sub>max</sub> = k<sub>p</sub> &#963;<sub>y</sub> (m)",
            "y<sub>tip</sub> (m)",
            "N (-)",
        ]),
        rows,
    }
    .write(out);
}

/// GB 50009-2012 App. H.1: regime, H1, lambda_j, zeta.
fn gb_table(out: &mut String, s: &StageVortex) {
    out.push_str("<h4>GB 50009-2012 Appendix H.1</h4>\n");
    Table {
        head: heads(&[
            "mode j",
            "D at 2H/3 (m)",
            "v<sub>cr</sub> (m/s)",
            "Re (-)",
            "regime",
            "v<sub>H</sub> (m/s)",
            "H<sub>1</sub> (m)",
            "&#955;<sub>j</sub> (-)",
            "&#950;<sub>j</sub> (-)",
            "y<sub>tip</sub> (m)",
            "M<sub>base</sub> (MN&#183;m)",
        ]),
        rows: s
            .modes
            .iter()
            .map(|m| {
                let g = &m.gb50009;
                vec![
                    n(m.mode.to_string()),
                    n(num(g.diameter_m, 2)),
                    n(num(g.critical_speed_m_s, 2)),
                    n(sci(g.reynolds)),
                    t(regime(g.regime)),
                    n(num(g.top_speed_m_s, 2)),
                    n(opt(g.lock_in_start_m, 1)),
                    n(opt(g.lambda_used, 3)),
                    n(num(g.damping_ratio, 4)),
                    n(opt(g.tip_amplitude_m, 4)),
                    n(opt(g.base_moment_nm.map(|v| v / 1e6), 1)),
                ]
            })
            .collect(),
    }
    .write(out);
    let st = s.modes.first().map_or(f64::NAN, |m| m.gb50009.strouhal);
    let _ = writeln!(
        out,
        "<p class=\"small\">St = {} (GB 50009 8.5.3); Re = 69000 v<sub>cr</sub> D; \
         H<sub>1</sub> where 1.2 v<sub>H</sub> reaches v<sub>cr</sub> (\"-\": no lock-in \
         range); &#955;<sub>j</sub> from Table H.1.1 (by its defining integral beyond mode 4); \
         &#950;<sub>j</sub> the damping ratio used. Load computed only in the transcritical \
         regime with 1.2 v<sub>H</sub> &gt; v<sub>cr</sub>.</p>",
        num(st, 2)
    );
}

fn side_by_side(out: &mut String, s: &StageVortex) {
    let mut rows = Vec::new();
    for m in &s.modes {
        for c in &m.comparison {
            rows.push(vec![
                n(m.mode.to_string()),
                t(format!(
                    "{}{}",
                    c.method.key(),
                    if c.method == m.governing {
                        " (governing)"
                    } else {
                        ""
                    }
                )),
                t(if c.applies { "yes" } else { "no" }),
                n(opt(c.tip_amplitude_m, 4)),
                n(opt(c.base_moment_nm.map(|v| v / 1e6), 1)),
                n(opt(c.max_stress_pa.map(|v| v / 1e6), 2)),
                n(c.fatigue_cycles.map_or("-".into(), sci)),
            ]);
        }
    }
    out.push_str(
        "<h4>Methods side by side</h4>\n<p class=\"small\">\"no\": screened out, or outside the \
         method's conditions.</p>\n",
    );
    Table {
        head: heads(&[
            "mode i",
            "method",
            "response computed",
            "y<sub>tip</sub> (m)",
            "M<sub>base</sub> (MN&#183;m)",
            "&#963;<sub>max</sub> (MPa)",
            "N (-)",
        ]),
        rows,
    }
    .write(out);
}

pub(super) fn write(out: &mut String, input: &ReportInput) {
    let _ = writeln!(
        out,
        "<p>Governing method: {}. The other methods are listed for comparison. Symbols: \
         z<sub>s</sub> shedding height (largest antinode), b outer diameter there, \
         v<sub>m</sub>(z<sub>s</sub>) design mean wind speed there.</p>",
        method_name(input.case.vortex.method)
    );
    for s in &input.vortex.stages {
        let _ = writeln!(out, "<h3>Stage \"{}\"</h3>", html_escape(&s.stage));
        shedding_table(out, s);
        exceedances(out, &s.modes);
        let bands: Vec<String> = s
            .modes
            .iter()
            .map(|m| format!("mode {}: {}", m.mode, band(m)))
            .collect();
        let _ = writeln!(
            out,
            "<p class=\"small\">Lock-in band (our own indicator, not a code method; heights in \
             m where b(z) n / St &lt; v<sub>m</sub>(z)): {}.</p>",
            html_escape(&bands.join("; "))
        );
        approach1_table(out, s);
        approach2_table(out, s);
        gb_table(out, s);
        side_by_side(out, s);
    }
}
