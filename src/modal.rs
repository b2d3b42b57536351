//! Modes per construction stage: frequency, shape, modal mass and EN 1991-1-4 equivalent mass.
//!
//! Units: heights and displacements in m (shapes dimensionless, normalised to max |w| = 1),
//! frequencies in Hz, masses in kg and kg/m.
//!
//! References: equivalent mass m_e = int m Phi^2 ds / int Phi^2 ds (EN 1991-1-4 F.14, from
//! memory); point masses enter the numerator as m_k Phi(z_k)^2 (common practice).

use serde::Serialize;
use thiserror::Error;

use crate::case::{Case, Stage};
use crate::fem::{self, BeamModel, SolverError};

/// Why a stage's modal analysis failed.
#[derive(Debug, Error)]
pub enum ModalError {
    /// The eigen-solver failed on a stage; no numbers are reported for it.
    #[error("stage `{stage}`: {source}")]
    Solver {
        stage: String,
        #[source]
        source: SolverError,
    },
}

/// The beam model of one stage as the wind module needs it: node heights and the
/// distributed and concentrated masses, all at the FE nodes.
#[derive(Debug, Clone, Serialize)]
pub struct StageModel {
    /// Node heights from the base, m (strictly increasing, first 0, last = stage height).
    pub z_m: Vec<f64>,
    /// Outer diameter at the nodes, m.
    pub outer_diameter_m: Vec<f64>,
    /// Wall thickness at the nodes, m.
    pub wall_m: Vec<f64>,
    /// Shell mass per metre at the nodes, kg/m.
    pub shell_mass_kg_m: Vec<f64>,
    /// Lining mass per metre at the nodes (0 where no lining or lining not installed), kg/m.
    /// At a lining end the value just inside the zone is used for that node.
    pub lining_mass_kg_m: Vec<f64>,
    /// Concentrated masses lumped to nodes: (node index, kg).
    pub point_masses: Vec<(usize, f64)>,
    /// Second moment of area of the shell at the nodes, m4.
    pub second_moment_m4: Vec<f64>,
}

impl StageModel {
    /// Stage height, m.
    pub fn height_m(&self) -> f64 {
        *self.z_m.last().unwrap_or(&0.0)
    }

    /// Total distributed mass per metre (shell + lining) at the nodes, kg/m.
    pub fn mass_per_length_kg_m(&self) -> Vec<f64> {
        self.shell_mass_kg_m
            .iter()
            .zip(&self.lining_mass_kg_m)
            .map(|(a, b)| a + b)
            .collect()
    }
}

/// One natural mode of one stage.
#[derive(Debug, Clone, Serialize)]
pub struct Mode {
    /// 1-based mode number.
    pub number: usize,
    pub frequency_hz: f64,
    /// Lateral displacement at the nodes, normalised to max |w| = 1 with the largest
    /// displacement positive.
    pub displacement: Vec<f64>,
    /// Rotation at the nodes for the same normalisation, rad/m.
    pub rotation_per_m: Vec<f64>,
    /// Generalised mass phi^T M phi for the normalised shape, kg.
    pub modal_mass_kg: f64,
    /// EN 1991-1-4 F.14 equivalent mass per length, kg/m.
    pub equivalent_mass_kg_m: f64,
}

impl Mode {
    pub fn period_s(&self) -> f64 {
        1.0 / self.frequency_hz
    }
}

/// How the solver proved that no mode was skipped.
#[derive(Debug, Clone, Serialize)]
pub struct CompletenessCheck {
    /// Number of eigenvalues of (K, M) below the shift sigma, counted by a Sturm sequence.
    pub sturm_count: usize,
    /// The shift, (rad/s)^2: between the last reported mode and the next one.
    pub shift_rad2_s2: f64,
    /// Number of modes reported.
    pub modes_reported: usize,
    /// Largest relative residual |K phi - w^2 M phi| / |w^2 M phi| over the reported modes.
    pub max_relative_residual: f64,
    /// Subspace iterations used.
    pub iterations: usize,
}

/// Modal analysis of one stage.
#[derive(Debug, Clone, Serialize)]
pub struct StageModes {
    pub stage: Stage,
    pub model: StageModel,
    pub modes: Vec<Mode>,
    pub check: CompletenessCheck,
    /// Number of beam elements used.
    pub elements: usize,
}

/// Options for [`analyse_stage`].
#[derive(Debug, Clone, Copy)]
pub struct ModalOptions {
    /// Number of modes to report (>= 1).
    pub modes: usize,
    /// Minimum number of elements; `None` = enough for < 0.01 % on the requested modes.
    pub min_elements: Option<usize>,
}

/// Builds the beam model of `stage` and computes its lowest `options.modes` modes.
pub fn analyse_stage(
    case: &Case,
    stage: &Stage,
    options: ModalOptions,
) -> Result<StageModes, ModalError> {
    let beam = BeamModel::build(case, stage, options.min_elements, options.modes);
    let solution =
        fem::solve_lowest(&beam, options.modes).map_err(|source| ModalError::Solver {
            stage: stage.name.clone(),
            source,
        })?;
    Ok(fem::to_stage_modes(case, stage, &beam, solution))
}

/// Modal analysis of every stage of the case, in case order.
pub fn analyse_case(case: &Case, options: ModalOptions) -> Result<Vec<StageModes>, ModalError> {
    case.stages
        .iter()
        .map(|stage| analyse_stage(case, stage, options))
        .collect()
}
