//! Note section: the along-wind design action (EN 1991-1-4 6.3.1, Annex B procedure 1,
//! 7.9.2) with every factor, the along-wind action at each mode's critical speed, the
//! combined moment and which case governs. Moments in MN m, stresses in MPa.

use std::fmt::Write as _;

use super::markup::{heads, html_escape, n, num, opt, t, Table};
use crate::along::StageAlongWind;

/// Writes the section body.
pub fn write(out: &mut String, along: &[StageAlongWind]) {
    out.push_str(
        "<p>Design action w(z) = c<sub>s</sub>c<sub>d</sub> c<sub>f</sub>(z) q<sub>p</sub>(z) \
         b(z), stresses on the uncracked (net at openings) section, EN 1991-1-4 (4.8), (6.1) with Annex B procedure 1 from the \
         stage's first mode, c<sub>f</sub> = c<sub>f,0</sub> ψ<sub>λ</sub> (7.19, Figures 7.28 \
         and 7.36). At a mode's critical speed the EN profile is scaled so that v<sub>m</sub> \
         at the shedding height equals v<sub>crit</sub>; the along-wind load there is the mean \
         plus background part ((6.1) with R² = 0; the along-wind resonance at n<sub>1</sub> \
         does not peak together with the across-wind lock-in, our choice), combined as \
         M = √(M<sub>across</sub>² + M<sub>along,crit</sub>²) (resultant of perpendicular \
         moments on a circular section; common practice).</p>\n",
    );
    Table {
        head: heads(&[
            "stage",
            "z<sub>s</sub> (m)",
            "b (m)",
            "v<sub>m</sub>(z<sub>s</sub>) (m/s)",
            "I<sub>v</sub> (-)",
            "L (m)",
            "λ (-)",
            "ψ<sub>λ</sub> (-)",
            "c<sub>f</sub>(z<sub>s</sub>) (-)",
            "n<sub>1</sub> (Hz)",
            "m<sub>e</sub> (kg/m)",
            "δ<sub>s</sub> + δ<sub>a</sub> = δ (-)",
        ]),
        rows: along
            .iter()
            .map(|s| {
                vec![
                    t(&s.stage),
                    n(num(s.reference_height_m, 1)),
                    n(num(s.width_m, 2)),
                    n(num(s.mean_speed_at_reference_m_s, 2)),
                    n(num(s.turbulence_intensity_at_reference, 3)),
                    n(num(s.length_scale_m, 1)),
                    n(opt(s.slenderness, 1)),
                    n(opt(s.end_effect_factor, 3)),
                    t(format!(
                        "{}{}",
                        num(s.force_coefficient_at_reference, 3),
                        if s.force_coefficient_given {
                            " (user)"
                        } else {
                            ""
                        }
                    )),
                    n(num(s.frequency_hz, 4)),
                    n(num(s.equivalent_mass_kg_m, 0)),
                    t(format!(
                        "{} + {} = {}",
                        num(s.log_decrement_structural, 4),
                        num(s.log_decrement_aerodynamic, 4),
                        num(s.log_decrement_total, 4)
                    )),
                ]
            })
            .collect(),
    }
    .write(out);
    Table {
        head: heads(&[
            "stage",
            "f<sub>L</sub> (-)",
            "S<sub>L</sub> (-)",
            "B² (-)",
            "η<sub>h</sub>, η<sub>b</sub> (-)",
            "R<sub>h</sub>, R<sub>b</sub> (-)",
            "R² (-)",
            "ν (Hz)",
            "k<sub>p</sub> (-)",
            "c<sub>s</sub>c<sub>d</sub> (-)",
            "c<sub>s</sub>c<sub>d</sub>, R² = 0 (-)",
            "M<sub>base</sub> (MN m)",
            "σ<sub>base</sub> (MPa)",
        ]),
        rows: along
            .iter()
            .map(|s| {
                let f = &s.factor;
                let base = s.points.first();
                vec![
                    t(&s.stage),
                    n(num(f.reduced_frequency, 3)),
                    n(num(f.spectral_density, 4)),
                    n(num(f.background_factor, 3)),
                    t(format!("{}, {}", num(f.eta_h, 2), num(f.eta_b, 3))),
                    t(format!(
                        "{}, {}",
                        num(f.admittance_h, 3),
                        num(f.admittance_b, 3)
                    )),
                    n(num(f.resonance_factor, 3)),
                    n(num(f.upcrossing_frequency_hz, 3)),
                    n(num(f.peak_factor, 3)),
                    n(num(f.cscd, 3)),
                    n(num(s.cscd_background_only, 3)),
                    n(num(base.map_or(f64::NAN, |p| p.moment_nm) / 1e6, 1)),
                    n(num(base.map_or(f64::NAN, |p| p.stress_pa) / 1e6, 2)),
                ]
            })
            .collect(),
    }
    .write(out);
    let mut rows = Vec::new();
    for s in along {
        let design = s.moment_nm.first().map_or(f64::NAN, |p| p.1);
        for m in &s.modes {
            let base = |v: &[(f64, f64)]| v.first().map_or(f64::NAN, |p| p.1);
            rows.push(vec![
                t(&s.stage),
                n(m.mode.to_string()),
                n(num(m.critical_speed_m_s, 2)),
                n(num(m.reference_height_m, 1)),
                n(num(m.speed_factor, 3)),
                n(num(base(&m.across_moment_nm) / 1e6, 1)),
                n(num(base(&m.along_moment_nm) / 1e6, 1)),
                n(num(base(&m.combined_moment_nm) / 1e6, 1)),
                n(num(base(&m.combined_moment_nm) / design, 2)),
            ]);
        }
    }
    if rows.is_empty() {
        out.push_str("<p>No mode has an across-wind load (all screened out or outside the method's conditions).</p>\n");
    } else {
        Table {
            head: heads(&[
                "stage",
                "mode",
                "v<sub>crit</sub> (m/s)",
                "shedding height (m)",
                "v<sub>b</sub> scale (-)",
                "M<sub>across</sub> base (MN m)",
                "M<sub>along,crit</sub> base (MN m)",
                "M<sub>comb</sub> base (MN m)",
                "M<sub>comb</sub> / M<sub>design</sub> base (-)",
            ]),
            rows,
        }
        .write(out);
    }
    out.push_str("<ul>\n");
    for s in along {
        let _ = writeln!(
            out,
            "<li>{}: {}</li>",
            html_escape(&s.stage),
            html_escape(&s.governs.statement)
        );
    }
    out.push_str("</ul>\n");
}
