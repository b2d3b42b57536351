//! summary.json: every number of the note's tables for scripts: the validated case (SI
//! units), the modes of every stage (without the shape arrays, which are in
//! mode_shapes.csv), the completeness check, the vortex results of every stage and mode
//! (all three methods and the loads along the height) and the warnings. No timestamp, so two
//! runs on the same case give the same file.

use serde::Serialize;

use super::{ReportError, ReportInput, CAUTIONS};
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
            .map(|s| StageSummary {
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
