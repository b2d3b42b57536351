//! `check`: the main job. Modal analysis of every stage, vortex-shedding checks of the first
//! `[vortex] modes` modes, and every output file. Exit code 1 when a criterion is exceeded,
//! 3 when the case gives no criteria (nothing judged).

use std::path::Path;

use serde::Serialize;

use crate::case::Case;
use crate::error::Error;
use crate::modal::{analyse_case, ModalOptions, StageModes};
use crate::remedy::{self, RemedyResults};
use crate::report::csv::{safe_text, to_csv, to_csv_with_header};
use crate::report::staging::Staging;
use crate::report::{json, note, svg, ReportInput};
use crate::resistance::{self, actions::ResistanceResults};
use crate::wind::{self, VortexResults};

pub use super::check_tables::{along_table, remedy_table, stage_table, verdict_table};
use super::modes::{modes_table, stage_modal_files};
use super::CommandReport;

/// Options of `check`.
#[derive(Debug, Clone, Copy, Default)]
pub struct CheckOptions {
    /// Minimum element count; `None` = default mesh.
    pub min_elements: Option<usize>,
}

/// Everything `check` computed, for the report writers.
#[derive(Debug, Clone)]
pub struct CheckResults {
    pub case: Case,
    pub stages: Vec<StageModes>,
    pub vortex: VortexResults,
    /// EN 1991-1-4 along-wind action per stage; `None` without `wind.terrain_category`.
    pub along: Option<Vec<crate::along::StageAlongWind>>,
    /// Required damping of failing modes and the case's `[remedy]` devices, re-checked.
    pub remedies: RemedyResults,
    /// RC shell resistance and reinforcement fatigue; `None` without `[reinforcement]`.
    pub resistance: Option<ResistanceResults>,
}

/// One row of lock_in.csv: our own addition (not a code method), the band of heights over
/// which the local critical speed b(z) n / St lies below the site's mean speed.
#[derive(Debug, Clone, Serialize)]
pub struct LockInRow {
    pub stage: String,
    pub mode: usize,
    pub band_from_z_m: Option<f64>,
    pub band_to_z_m: Option<f64>,
    pub segments: usize,
}

/// Runs the analysis (pure; no files).
pub fn analyse(case: Case, options: CheckOptions) -> Result<CheckResults, Error> {
    let modal = ModalOptions {
        modes: case.vortex.modes,
        min_elements: options.min_elements,
    };
    let stages = analyse_case(&case, modal)?;
    let vortex = wind::check_all(&case, &stages)?;
    let remedies = remedy::compute(&case, &stages, &vortex);
    let along = crate::along::check_all(&case, &stages, &vortex)?;
    // The along-wind design action and the combined vortex case join the vortex actions.
    let extra: Vec<(String, resistance::along_height::ActionCurve)> =
        match (&along, &case.resistance) {
            (Some(along), Some(spec)) => along
                .iter()
                .flat_map(|a| {
                    resistance::actions::along_wind_actions(a, spec.factors.gamma_q)
                        .into_iter()
                        .map(|c| (a.stage.clone(), c))
                })
                .collect(),
            _ => Vec::new(),
        };
    let resistance =
        resistance::actions::check_case(&case, &stages, &vortex, &extra).map_err(|f| {
            Error::Resistance {
                stage: f.stage,
                z_m: f.z_m,
                source: f.error,
            }
        })?;
    Ok(CheckResults {
        case,
        stages,
        vortex,
        along,
        remedies,
        resistance,
    })
}

/// Writes remedy.csv into the staging folder.
pub fn stage_remedy_file(staging: &mut Staging, remedies: &RemedyResults) -> Result<(), Error> {
    let mut rows = remedies.rows();
    for r in &mut rows {
        r.stage = safe_text(&r.stage);
    }
    staging.write(
        "remedy.csv",
        &to_csv_with_header(
            "remedy.csv",
            &[
                "stage",
                "mode",
                "remedy",
                "log_decrement",
                "scruton",
                "tip_amplitude_before_m",
                "tip_amplitude_after_m",
                "max_stress_before_pa",
                "max_stress_after_pa",
                "verdict_before",
                "verdict_after",
                "note",
            ],
            &rows,
        )?,
    )?;
    Ok(())
}

fn lock_in_rows(v: &VortexResults) -> Vec<LockInRow> {
    v.stages
        .iter()
        .flat_map(|s| {
            s.modes.iter().map(move |m| LockInRow {
                stage: safe_text(&s.stage),
                mode: m.mode,
                band_from_z_m: m.lock_in_band.map(|b| b.from_z_m),
                band_to_z_m: m.lock_in_band.map(|b| b.to_z_m),
                segments: m.lock_in_segments.len(),
            })
        })
        .collect()
}

/// Writes the vortex tables (vortex.csv, loads.csv, lock_in.csv) into the staging folder.
pub fn stage_vortex_files(staging: &mut Staging, v: &VortexResults) -> Result<(), Error> {
    let mut rows = v.vortex_rows();
    for r in &mut rows {
        r.stage = safe_text(&r.stage);
    }
    staging.write("vortex.csv", &to_csv("vortex.csv", &rows)?)?;
    let mut loads = v.load_rows();
    for r in &mut loads {
        r.stage = safe_text(&r.stage);
    }
    staging.write(
        "loads.csv",
        &to_csv_with_header(
            "loads.csv",
            &[
                "stage",
                "mode",
                "z_m",
                "inertia_force_n_m",
                "shear_n",
                "moment_nm",
                "stress_pa",
            ],
            &loads,
        )?,
    )?;
    staging.write("lock_in.csv", &to_csv("lock_in.csv", &lock_in_rows(v))?)?;
    Ok(())
}

/// One row of along_wind.csv (contract columns).
#[derive(Debug, Clone, Serialize)]
pub struct AlongRow {
    pub stage: String,
    pub z_m: f64,
    pub mean_speed_m_s: f64,
    pub turbulence_intensity: f64,
    pub peak_pressure_pa: f64,
    pub force_coefficient: f64,
    pub line_load_n_m: f64,
    pub shear_n: f64,
    pub moment_nm: f64,
    pub stress_pa: f64,
}

/// Writes along_wind.csv into the staging folder.
pub fn stage_along_file(
    staging: &mut Staging,
    along: &[crate::along::StageAlongWind],
) -> Result<(), Error> {
    let rows: Vec<AlongRow> = along
        .iter()
        .flat_map(|s| {
            let stage = safe_text(&s.stage);
            s.points.iter().map(move |p| AlongRow {
                stage: stage.clone(),
                z_m: p.z_m,
                mean_speed_m_s: p.mean_speed_m_s,
                turbulence_intensity: p.turbulence_intensity,
                peak_pressure_pa: p.peak_pressure_pa,
                force_coefficient: p.force_coefficient,
                line_load_n_m: p.line_load_n_m,
                shear_n: p.shear_n,
                moment_nm: p.moment_nm,
                stress_pa: p.stress_pa,
            })
        })
        .collect();
    staging.write("along_wind.csv", &to_csv("along_wind.csv", &rows)?)?;
    Ok(())
}

/// All warnings of the run, each prefixed with its stage and the modes it concerns; a
/// message repeated for several modes of a stage is given once.
pub fn warnings(results: &CheckResults) -> Vec<String> {
    // Plausibility first: a unit slip explains whatever follows.
    let mut out = crate::input::plausibility::case_warnings(&results.case);
    out.extend(crate::input::plausibility::stage_warnings(&results.case));
    out.extend(crate::input::plausibility::modal_warnings(
        &results.case,
        &results.stages,
    ));
    // With [reinforcement] the resistance verdict is judged even without [criteria].
    if results.case.criteria.is_empty() && results.resistance.is_none() {
        out.push(crate::wind::verdict::NOT_JUDGED_STATEMENT.to_string());
    }
    out.extend(results.vortex.warnings.iter().cloned());
    out.extend(results.remedies.warnings.iter().cloned());
    for s in results.along.iter().flatten() {
        out.extend(s.warnings.iter().cloned());
    }
    out.extend(crate::report::station_table::station_count_warning(
        &results.case.shell.stations,
    ));
    for s in &results.vortex.stages {
        for w in &s.warnings {
            out.push(format!("stage \"{}\": {w}", s.stage));
        }
        let mut grouped: Vec<(String, Vec<usize>)> = Vec::new();
        for m in &s.modes {
            let prefix = format!("mode {}: ", m.mode);
            for w in &m.warnings {
                let text = w.strip_prefix(&prefix).unwrap_or(w).to_string();
                match grouped.iter_mut().find(|(t, _)| *t == text) {
                    Some((_, modes)) => modes.push(m.mode),
                    None => grouped.push((text, vec![m.mode])),
                }
            }
        }
        for (text, modes) in grouped {
            let list: Vec<String> = modes.iter().map(|m| m.to_string()).collect();
            let label = if modes.len() == 1 { "mode" } else { "modes" };
            out.push(format!(
                "stage \"{}\" {label} {}: {text}",
                s.stage,
                list.join(", ")
            ));
        }
    }
    out
}

/// The date printed in the design note: `STACKWAKE_DATE` if set (reproducible output for
/// tests and archives), else today's UTC date.
pub fn note_date() -> String {
    match std::env::var("STACKWAKE_DATE") {
        Ok(d) if !d.trim().is_empty() => d.trim().to_string(),
        _ => today_utc(),
    }
}

/// Today's UTC date as YYYY-MM-DD (civil-from-days, proleptic Gregorian calendar).
fn today_utc() -> String {
    let secs = std::time::SystemTime::now()
        .duration_since(std::time::UNIX_EPOCH)
        .map_or(0, |d| d.as_secs());
    let (y, m, d) = civil_from_days((secs / 86_400) as i64);
    format!("{y:04}-{m:02}-{d:02}")
}

/// Year, month, day of a day count since 1970-01-01 (H. Hinnant's `civil_from_days`
/// algorithm, public domain).
fn civil_from_days(days: i64) -> (i64, u32, u32) {
    let z = days + 719_468;
    let era = z.div_euclid(146_097);
    let doe = z.rem_euclid(146_097);
    let yoe = (doe - doe / 1460 + doe / 36_524 - doe / 146_096) / 365;
    let doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    let mp = (5 * doy + 2) / 153;
    let d = (doy - (153 * mp + 2) / 5 + 1) as u32;
    let m = if mp < 10 { mp + 3 } else { mp - 9 } as u32;
    (yoe + era * 400 + i64::from(m <= 2), m, d)
}

/// Writes the plots (SVG), the design note (report.html) and summary.json into the
/// staging folder, so they are committed together with the CSVs or not at all.
pub fn stage_note_files(
    staging: &mut Staging,
    results: &CheckResults,
    warnings: &[String],
    model_plan_html: Option<String>,
    date: &str,
) -> Result<(), Error> {
    let input = ReportInput {
        case: &results.case,
        stages: &results.stages,
        vortex: &results.vortex,
        along: results.along.as_deref(),
        warnings,
        remedies: Some(&results.remedies),
        model_plan_html: model_plan_html.as_deref(),
        resistance: results.resistance.as_ref(),
    };
    let plots = svg::all_plots(&input)?;
    for p in &plots {
        staging.write(p.file, p.svg.as_bytes())?;
    }
    staging.write("report.html", note::render(&input, &plots, date).as_bytes())?;
    staging.write("summary.json", &json::to_json(&input)?)?;
    Ok(())
}

/// Every file `check` writes (their destinations are checked before the analysis).
pub const CHECK_FILES: [&str; 19] = [
    "along_wind.csv",
    "along_moments.svg",
    "modes.csv",
    "mode_shapes.csv",
    "sections.csv",
    "vortex.csv",
    "loads.csv",
    "lock_in.csv",
    "remedy.csv",
    "shell.svg",
    "modes.svg",
    "wind_map.svg",
    "response.svg",
    "envelopes.svg",
    "stages.svg",
    "report.html",
    "summary.json",
    "resistance.csv",
    "resistance.svg",
];

/// Runs `check` on a case file (or the demo) and writes every output to `out`.
pub fn run(
    case_path: Option<&Path>,
    out: &Path,
    options: CheckOptions,
) -> Result<CommandReport, Error> {
    let case = super::load(case_path)?;
    // Refused before any work or any output when the case has no [wind].
    wind::site_wind(&case, "check")?;
    let mut staging = Staging::begin(out)?;
    staging.check_destinations(&CHECK_FILES)?;
    let results = analyse(case, options)?;
    crate::report::finite::check_results(
        &results.case,
        &results.stages,
        Some(&results.vortex),
        Some(&results.remedies),
    )?;
    if let Some(r) = &results.resistance {
        if let Some((quantity, value)) = crate::report::finite::first_non_finite(r) {
            return Err(crate::report::finite::NonFiniteResult {
                place: "resistance".into(),
                quantity,
                value: format!("{value}"),
                inputs: "[reinforcement], [shell] characteristic_strength_mpa, [design] and the \
                         shell geometry"
                    .into(),
            }
            .into());
        }
    }
    stage_modal_files(&mut staging, &results.stages)?;
    stage_vortex_files(&mut staging, &results.vortex)?;
    if let Some(along) = &results.along {
        stage_along_file(&mut staging, along)?;
    }
    let mut warnings = warnings(&results);
    // The case's [model] table adds the aeroelastic model plan to the note; a plan that
    // cannot be made is a warning here (`stackwake scale` reports it as an error).
    let model_plan_html = match results.case.model {
        Some(_) => match super::scale::compute_plan(&results.case, None, options.min_elements) {
            Ok(plan) => Some(crate::report::scale_html::render_html(&plan)),
            Err(e) => {
                warnings.push(format!("aeroelastic model plan not made: {e}"));
                None
            }
        },
        None => None,
    };
    stage_note_files(
        &mut staging,
        &results,
        &warnings,
        model_plan_html,
        &note_date(),
    )?;
    stage_remedy_file(&mut staging, &results.remedies)?;
    if let Some(r) = &results.resistance {
        super::resistance::stage_resistance_file(&mut staging, r)?;
    }
    let files = staging.commit()?;
    let mut stdout = format!("{}\n\n", results.case.title);
    // The code verdict leads: utilisation and fatigue damage of the RC shell.
    match &results.resistance {
        Some(r) => stdout.push_str(&super::resistance::verdict_table(r)),
        None => stdout.push_str(super::resistance::SKIPPED_LINE),
    }
    stdout.push('\n');
    stdout.push_str(&modes_table(&results.stages));
    stdout.push_str(
        "stage wind (50-year speeds x c_prob, EN 1991-1-4 (4.2)), duration and damping\n",
    );
    stdout.push_str(&stage_table(&results));
    stdout.push_str(&format!(
        "\nvortex shedding ({}; the others are reported for comparison)\n",
        results.case.vortex.method.key()
    ));
    stdout.push_str(&verdict_table(&results));
    stdout.push_str(
        "* lock_in_band: our own addition, not a code method: heights where b(z) n / St is below the mean wind speed.\n",
    );
    if let Some(along) = &results.along {
        stdout.push_str(&along_table(along));
    }
    if !results.remedies.is_empty() {
        stdout.push_str(
            "\nremedies (each re-checked with the same EN 1991-1-4 Annex E functions; before = unmitigated)\n",
        );
        stdout.push_str(&remedy_table(&results.remedies));
        for r in results.remedies.rows() {
            stdout.push_str(&format!(
                "  {} mode {} {}: {}\n",
                r.stage, r.mode, r.remedy, r.note
            ));
        }
    }
    stdout.push_str(
        "Screening tool: results must be checked by a licensed engineer against the local code and National Annex.\n",
    );
    Ok(CommandReport {
        stdout,
        warnings,
        check_failed: results.vortex.any_exceeds()
            || results.resistance.as_ref().is_some_and(|r| r.any_exceeds()),
        not_judged: results.vortex.nothing_judged() && results.resistance.is_none(),
        files,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn civil_dates() {
        // Day counts checked with Python's datetime.date.fromordinal (general-purpose library).
        assert_eq!(civil_from_days(0), (1970, 1, 1));
        assert_eq!(civil_from_days(11_016), (2000, 2, 29));
        assert_eq!(civil_from_days(19_782), (2024, 2, 29));
        assert_eq!(civil_from_days(-1), (1969, 12, 31));
    }
}
