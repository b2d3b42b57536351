//! summary.json: every number of the note's tables for scripts: the validated case (SI
//! units), the modes of every stage (without the shape arrays, which are in
//! mode_shapes.csv), the completeness check, the vortex results of every stage and mode
//! (all three methods and the loads along the height) and the warnings. No timestamp, so two
//! runs on the same case give the same file.

use serde::Serialize;

use super::{ReportError, ReportInput, CAUTIONS};
use crate::along::StageAlongWind;
use crate::case::Case;
use crate::modal::CompletenessCheck;
use crate::wind::VortexResults;

/// The top level of summary.json.
#[derive(Debug, Serialize)]
pub struct Summary<'a> {
    pub title: &'a str,
    /// `stackwake` and its version.
    pub generator: String,
    pub cautions: &'static [&'static str],
    pub case: &'a Case,
    pub stages: Vec<StageSummary<'a>>,
    pub vortex: &'a VortexResults,
    /// Remedy re-checks (empty when none were computed).
    pub remedies: Vec<crate::remedy::RemedyRow>,
    /// RC shell resistance and reinforcement fatigue (`null` without `[reinforcement]`).
    pub resistance: Option<&'a crate::resistance::actions::ResistanceResults>,
    pub warnings: &'a [String],
}

/// One stage's modal results.
#[derive(Debug, Serialize)]
pub struct StageSummary<'a> {
    pub name: &'a str,
    pub height_m: f64,
    pub elements: usize,
    pub modes: Vec<ModeSummary>,
    pub completeness: &'a CompletenessCheck,
    /// EN 1991-1-4 along-wind action of the stage (absent without `wind.terrain_category`).
    #[serde(skip_serializing_if = "Option::is_none")]
    pub along_wind: Option<AlongStageSummary<'a>>,
}

/// The along-wind factors of one stage, the combined moments per mode, and every
/// intermediate value (`detail`).
#[derive(Debug, Serialize)]
pub struct AlongStageSummary<'a> {
    pub cscd: f64,
    pub background_factor: f64,
    pub resonance_factor: f64,
    pub peak_factor: f64,
    pub log_decrement_total: f64,
    pub governs: &'a str,
    pub combined: Vec<CombinedSummary<'a>>,
    pub detail: &'a StageAlongWind,
}

/// (z_m, moment_nm) pairs of sqrt(M_across^2 + M_along,crit^2) for one mode.
#[derive(Debug, Serialize)]
pub struct CombinedSummary<'a> {
    pub mode: usize,
    pub combined_moment_nm: &'a [(f64, f64)],
}

fn along_summary(a: &StageAlongWind) -> AlongStageSummary<'_> {
    AlongStageSummary {
        cscd: a.factor.cscd,
        background_factor: a.factor.background_factor,
        resonance_factor: a.factor.resonance_factor,
        peak_factor: a.factor.peak_factor,
        log_decrement_total: a.log_decrement_total,
        governs: &a.governs.statement,
        combined: a
            .modes
            .iter()
            .map(|m| CombinedSummary {
                mode: m.mode,
                combined_moment_nm: &m.combined_moment_nm,
            })
            .collect(),
        detail: a,
    }
}

/// One mode, without its shape.
#[derive(Debug, Serialize)]
pub struct ModeSummary {
    pub mode: usize,
    pub frequency_hz: f64,
    pub period_s: f64,
    pub modal_mass_kg: f64,
    pub equivalent_mass_kg_m: f64,
}

/// Builds the summary.
pub fn summary<'a>(input: &ReportInput<'a>) -> Summary<'a> {
    Summary {
        title: &input.case.title,
        generator: format!("stackwake {}", env!("CARGO_PKG_VERSION")),
        cautions: CAUTIONS,
        case: input.case,
        stages: input
            .stages
            .iter()
            .enumerate()
            .map(|(i, s)| StageSummary {
                name: &s.stage.name,
                height_m: s.model.height_m(),
                elements: s.elements,
                modes: s
                    .modes
                    .iter()
                    .map(|m| ModeSummary {
                        mode: m.number,
                        frequency_hz: m.frequency_hz,
                        period_s: m.period_s(),
                        modal_mass_kg: m.modal_mass_kg,
                        equivalent_mass_kg_m: m.equivalent_mass_kg_m,
                    })
                    .collect(),
                completeness: &s.check,
                along_wind: input.along.and_then(|a| a.get(i)).map(along_summary),
            })
            .collect(),
        vortex: input.vortex,
        remedies: input.remedies.map(|r| r.rows()).unwrap_or_default(),
        resistance: input.resistance,
        warnings: input.warnings,
    }
}

/// summary.json as pretty-printed bytes.
pub fn to_json(input: &ReportInput) -> Result<Vec<u8>, ReportError> {
    let mut bytes =
        serde_json::to_vec_pretty(&summary(input)).map_err(|e| ReportError::Format {
            file: "summary.json".into(),
            message: e.to_string(),
        })?;
    bytes.push(b'\n');
    Ok(bytes)
}
