//! `scale`: plans an aeroelastic wind-tunnel model of the case's stack (`[model]` table),
//! checks the model by computation against the prototype, and optionally converts the lab's
//! measurements on the model back to the prototype.
//!
//! Outputs: `scale.csv` (quantity,prototype_over_model), `model_case.toml` (the model as a
//! case file), `scale_speeds.csv` (tunnel speeds and Reynolds numbers per stage and mode),
//! `scale_check.csv` (FE frequencies of model and prototype), `scale_plan.json` (the whole
//! plan); with `--measured`: `measured_prototype.csv` and `prototype_amplitude_vs_speed.svg`.

use crate::case::Case;
use std::path::Path;

use serde::Serialize;

use crate::error::Error;
use crate::modal::{analyse_case, ModalOptions};
use crate::report::csv::{safe_text, to_csv, to_csv_with_header};
use crate::report::scale_plot::amplitude_vs_speed_svg;
use crate::report::staging::Staging;
use crate::report::table;
use crate::similitude::factors::factor_text;
use crate::similitude::measured::{to_prototype, PrototypeValues};
use crate::similitude::{self, ScalePlan};

use super::CommandReport;

/// Options of `scale`.
#[derive(Debug, Clone, Default)]
pub struct ScaleOptions {
    /// Overrides `model.length_scale`.
    pub length_scale: Option<f64>,
    /// The lab's measurements on the model (CSV).
    pub measured: Option<std::path::PathBuf>,
    /// Minimum number of beam elements for both FE runs.
    pub min_elements: Option<usize>,
}

/// One row of scale.csv (contract: quantity,prototype_over_model).
#[derive(Debug, Clone, Serialize)]
pub struct ScaleCsvRow {
    pub quantity: &'static str,
    pub prototype_over_model: f64,
}

/// One row of scale_speeds.csv.
#[derive(Debug, Clone, Serialize)]
pub struct SpeedCsvRow {
    pub stage: String,
    pub mode: String,
    pub prototype_frequency_hz: Option<f64>,
    pub reference_height_m: f64,
    pub prototype_diameter_m: f64,
    pub prototype_speed_m_s: f64,
    pub model_speed_m_s: f64,
    pub in_tunnel_range: String,
    pub prototype_reynolds: f64,
    pub prototype_regime: &'static str,
    pub model_reynolds: f64,
    pub model_regime: &'static str,
}

fn range_cell(v: Option<bool>) -> String {
    match v {
        Some(true) => "yes".into(),
        Some(false) => "no".into(),
        None => String::new(),
    }
}

fn speed_rows(plan: &ScalePlan) -> Vec<SpeedCsvRow> {
    let mut rows: Vec<SpeedCsvRow> = plan
        .speeds
        .iter()
        .map(|r| SpeedCsvRow {
            stage: safe_text(&r.stage),
            mode: r.mode.to_string(),
            prototype_frequency_hz: Some(r.prototype_frequency_hz),
            reference_height_m: r.shedding_height_m,
            prototype_diameter_m: r.prototype_diameter_m,
            prototype_speed_m_s: r.prototype_critical_speed_m_s,
            model_speed_m_s: r.model_speed_m_s,
            in_tunnel_range: range_cell(r.in_tunnel_range),
            prototype_reynolds: r.prototype_reynolds,
            prototype_regime: r.prototype_regime.label(),
            model_reynolds: r.model_reynolds,
            model_regime: r.model_regime.label(),
        })
        .collect();
    if let Some(d) = &plan.design_speed {
        rows.push(SpeedCsvRow {
            stage: "design wind at the top".into(),
            mode: String::new(),
            prototype_frequency_hz: None,
            reference_height_m: d.height_m,
            prototype_diameter_m: plan
                .design
                .model
                .stations
                .last()
                .map(|s| s.outer_diameter_m)
                .unwrap_or(0.0)
                * plan.design.factors.length,
            prototype_speed_m_s: d.prototype_speed_m_s,
            model_speed_m_s: d.model_speed_m_s,
            in_tunnel_range: range_cell(d.in_tunnel_range),
            prototype_reynolds: d.prototype_reynolds,
            prototype_regime: d.prototype_regime.label(),
            model_reynolds: d.model_reynolds,
            model_regime: d.model_regime.label(),
        });
    }
    rows
}

/// The terminal summary of a plan.
pub fn plan_text(plan: &ScalePlan) -> String {
    let k = &plan.design.factors;
    let mut out = format!(
        "{}\naeroelastic model at k_l = {} ({})\n\n",
        plan.prototype_title,
        factor_text(k.length),
        plan.design.length_scale_source.label()
    );
    let rows: Vec<Vec<String>> = plan
        .factor_rows
        .iter()
        .map(|r| {
            vec![
                r.quantity.to_string(),
                factor_text(r.prototype_over_model),
                r.condition.to_string(),
            ]
        })
        .collect();
    out.push_str(&table::render(
        &["quantity", "prototype_over_model", "similitude condition"],
        &rows,
    ));
    if let Some(b) = &plan.design.blockage {
        out.push_str(&format!(
            "blockage {:.2} % (limit {:.1} %), model height {:.3} m (limit {:.3} m)\n",
            100.0 * b.blockage_ratio,
            100.0 * b.max_blockage,
            b.model_height_m,
            b.max_model_height_m
        ));
    }
    out.push_str(&format!(
        "model log decrement to reproduce: {:.4}\n\n",
        plan.model_log_decrement
    ));
    let rows: Vec<Vec<String>> = speed_rows(plan)
        .iter()
        .map(|r| {
            vec![
                r.stage.clone(),
                r.mode.clone(),
                format!("{:.2}", r.prototype_speed_m_s),
                format!("{:.3}", r.model_speed_m_s),
                format!("{:.2e} {}", r.prototype_reynolds, r.prototype_regime),
                format!("{:.2e} {}", r.model_reynolds, r.model_regime),
            ]
        })
        .collect();
    out.push_str(&table::render(
        &[
            "stage",
            "mode",
            "prototype_speed_m_s",
            "tunnel_speed_m_s",
            "prototype_re",
            "model_re",
        ],
        &rows,
    ));
    let rows: Vec<Vec<String>> = plan.consistency.iter().map(|r| r.cells()).collect();
    out.push_str("\ncheck of the model by computation, f_prototype / (f_model k_f) - 1:\n");
    out.push_str(&table::render(
        &["stage", "mode", "prototype_hz", "model_hz", "deviation"],
        &rows,
    ));
    out.push('\n');
    for c in &plan.reynolds_cautions {
        out.push_str(&format!("note: {c}\n"));
    }
    out
}

/// Designs the aeroelastic model of a case with a `[model]` table and runs the FE check of
/// model against prototype (pure; no files).
pub fn compute_plan(
    case: &Case,
    length_scale: Option<f64>,
    min_elements: Option<usize>,
) -> Result<similitude::ScalePlan, Error> {
    let design = similitude::design(case, length_scale)?;
    let model_case =
        crate::input::parse_case(&design.model.toml, Path::new("."), "model_case.toml")
            .map_err(|source| Error::ModelCase { source })?;
    let modal = ModalOptions {
        modes: case.vortex.modes,
        min_elements,
    };
    let prototype_modes = analyse_case(case, modal)?;
    let model_modes = analyse_case(&model_case, modal)?;
    Ok(similitude::plan(
        case,
        design,
        &prototype_modes,
        &model_modes,
    ))
}

/// Runs `scale` on a case file with a `[model]` table and writes its outputs to `out`.
pub fn run(case_path: &Path, out: &Path, options: &ScaleOptions) -> Result<CommandReport, Error> {
    let case = super::load(Some(case_path))?;
    let measurements = match &options.measured {
        Some(p) => Some(crate::input::load_measured(p)?),
        None => None,
    };
    let mut staging = Staging::begin(out)?;
    let plan = compute_plan(&case, options.length_scale, options.min_elements)?;

    let scale_rows: Vec<ScaleCsvRow> = plan
        .factor_rows
        .iter()
        .map(|r| ScaleCsvRow {
            quantity: r.quantity,
            prototype_over_model: r.prototype_over_model,
        })
        .collect();
    staging.write("scale.csv", &to_csv("scale.csv", &scale_rows)?)?;
    staging.write("model_case.toml", plan.design.model.toml.as_bytes())?;
    staging.write(
        "scale_speeds.csv",
        &to_csv("scale_speeds.csv", &speed_rows(&plan))?,
    )?;
    let check: Vec<_> = plan
        .consistency
        .iter()
        .map(|r| {
            let mut r = r.clone();
            r.stage = safe_text(&r.stage);
            r
        })
        .collect();
    staging.write(
        "scale_check.csv",
        &to_csv_with_header(
            "scale_check.csv",
            &[
                "stage",
                "mode",
                "prototype_frequency_hz",
                "model_frequency_hz",
                "model_frequency_at_prototype_scale_hz",
                "deviation",
            ],
            &check,
        )?,
    )?;
    let json =
        serde_json::to_vec_pretty(&plan).map_err(|e| crate::report::ReportError::Format {
            file: "scale_plan.json".into(),
            message: e.to_string(),
        })?;
    staging.write("scale_plan.json", &json)?;

    let mut stdout = plan_text(&plan);
    let mut warnings = crate::input::plausibility::case_warnings(&case);
    warnings.extend(plan.warnings.iter().cloned());
    if let Some(rows) = measurements {
        let converted: Vec<PrototypeValues> =
            to_prototype(&rows, &plan.design.factors, case.shell.elastic_modulus_pa);
        let top = case.shell.height_m();
        let amplitudes: Vec<(usize, f64)> = converted
            .iter()
            .enumerate()
            .filter_map(|(i, r)| r.prototype_tip_amplitude_m.map(|a| (i + 2, a)))
            .collect();
        warnings.extend(crate::input::plausibility::measured_amplitude_warnings(
            &amplitudes,
            case.shell.geometry_at(top).0,
        ));
        staging.write(
            "measured_prototype.csv",
            &to_csv("measured_prototype.csv", &converted)?,
        )?;
        let points: Vec<(f64, f64)> = converted
            .iter()
            .filter_map(|r| {
                r.prototype_tip_amplitude_m
                    .map(|a| (r.prototype_speed_m_s, a))
            })
            .collect();
        if !points.is_empty() {
            let title = format!(
                "Prototype response from the model tests (k_l = {})",
                factor_text(plan.design.factors.length)
            );
            staging.write(
                "prototype_amplitude_vs_speed.svg",
                amplitude_vs_speed_svg(&title, &points).as_bytes(),
            )?;
        }
        stdout.push_str(&format!(
            "\nconverted {} measured rows to the prototype\n",
            converted.len()
        ));
    }
    let files = staging.commit()?;
    Ok(CommandReport {
        stdout,
        warnings,
        check_failed: false,
        not_judged: false,
        files,
    })
}
