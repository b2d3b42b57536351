//! The terminal tables of `check`: the vortex verdicts, the stages' wind and damping, the
//! remedies and the along-wind lines. Text only; units in every column head.

use crate::remedy::RemedyResults;
use crate::report::table;
use crate::wind;

use super::check::CheckResults;

fn fmt_opt(v: Option<f64>, digits: usize) -> String {
    v.map_or_else(|| "-".to_string(), |x| format!("{x:.digits$}"))
}

fn band_text(m: &wind::ModeVortex) -> String {
    match &m.lock_in_band {
        Some(b) => format!("{:.0}-{:.0} m", b.from_z_m, b.to_z_m),
        None => "none".to_string(),
    }
}

/// The compact verdict table for the terminal.
pub fn verdict_table(results: &CheckResults) -> String {
    let mut rows = Vec::new();
    for s in &results.vortex.stages {
        for m in &s.modes {
            let g = m.governing_summary();
            rows.push(vec![
                s.stage.clone(),
                m.mode.to_string(),
                format!("{:.3}", m.frequency_hz),
                format!("{:.1}", m.reference_height_m),
                format!("{:.2}", m.critical_speed_m_s),
                format!("{:.2}", m.mean_speed_m_s),
                format!("{:.2}", m.speed_ratio),
                format!("{:.1}", m.scruton),
                fmt_opt(g.tip_amplitude_m, 4),
                fmt_opt(g.max_stress_pa.map(|p| p / 1e6), 2),
                band_text(m),
                m.verdict.to_string(),
            ]);
        }
    }
    table::render(
        &[
            "stage",
            "mode",
            "frequency_hz",
            "ref_height_m",
            "v_crit_m_s",
            "v_mean_m_s",
            "speed_ratio",
            "scruton",
            "tip_amplitude_m",
            "max_stress_mpa",
            "lock_in_band*",
            "verdict",
        ],
        &rows,
    )
}

/// The stages' own wind, duration and damping (EN 1991-1-4 (4.2), EN 1991-1-6 Table 3.1).
pub fn stage_table(results: &CheckResults) -> String {
    let rows: Vec<Vec<String>> = results
        .vortex
        .stages
        .iter()
        .map(|s| {
            let c = &s.climate;
            vec![
                s.stage.clone(),
                c.duration_years
                    .map_or("in service".into(), |d| format!("{d}")),
                format!("{}", c.judged_years),
                format!("{}", c.return_period_years),
                format!("{:.4}", c.c_prob),
                format!("{:.2}", c.wind.reference_speed_m_s),
                format!("{}", c.log_decrement),
            ]
        })
        .collect();
    table::render(
        &[
            "stage",
            "duration_years",
            "cycles_over_years",
            "return_period_years",
            "c_prob",
            "v_ref_m_s",
            "log_decrement",
        ],
        &rows,
    )
}

/// The remedy table: each remedy beside the unmitigated result.
pub fn remedy_table(remedies: &RemedyResults) -> String {
    let rows: Vec<Vec<String>> = remedies
        .rows()
        .into_iter()
        .map(|r| {
            vec![
                r.stage,
                r.mode.to_string(),
                r.remedy,
                fmt_opt(r.log_decrement, 4),
                fmt_opt(r.scruton, 1),
                fmt_opt(r.tip_amplitude_before_m, 4),
                fmt_opt(r.tip_amplitude_after_m, 4),
                fmt_opt(r.max_stress_before_pa.map(|p| p / 1e6), 2),
                fmt_opt(r.max_stress_after_pa.map(|p| p / 1e6), 2),
                r.verdict_after,
            ]
        })
        .collect();
    table::render(
        &[
            "stage",
            "mode",
            "remedy",
            "log_decrement",
            "scruton",
            "tip_before_m",
            "tip_after_m",
            "stress_before_mpa",
            "stress_after_mpa",
            "verdict_after",
        ],
        &rows,
    )
}

/// The terminal's along-wind lines: every factor of c_s c_d, the base moment and which
/// case governs, per stage.
pub fn along_table(along: &[crate::along::StageAlongWind]) -> String {
    let mut out = String::from(
        "\nalong-wind design action (EN 1991-1-4 6.3.1 + Annex B procedure 1, EN site wind) and \
         the vortex case at v_crit (sqrt(M_across^2 + M_along,crit^2))\n",
    );
    for s in along {
        let f = &s.factor;
        let base = s.moment_nm.first().map_or(0.0, |p| p.1);
        out.push_str(&format!(
            "  {}: z_s {:.1} m, v_m {:.2} m/s, I_v {:.3}, L {:.1} m, c_f {:.3}, delta {:.4} \
             (s {:.4} + a {:.4}), B^2 {:.3}, R^2 {:.3}, k_p {:.3}, c_s c_d {:.3}, \
             M_base {:.4e} N m\n    {}\n",
            s.stage,
            s.reference_height_m,
            s.mean_speed_at_reference_m_s,
            s.turbulence_intensity_at_reference,
            s.length_scale_m,
            s.force_coefficient_at_reference,
            s.log_decrement_total,
            s.log_decrement_structural,
            s.log_decrement_aerodynamic,
            f.background_factor,
            f.resonance_factor,
            f.peak_factor,
            f.cscd,
            base,
            s.governs.statement
        ));
    }
    out
}
