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
    /// Second moment of area of the shell at the nodes, m4: at opening levels the net
    /// section's smaller principal value.
    pub second_moment_m4: Vec<f64>,
    /// Shell mass per metre at each element's bottom and top, kg/m: differs from the nodal
    /// values where the section jumps (wall steps, zone limits, opening limits). Empty = use
    /// the nodal values.
    pub element_shell_mass_kg_m: Vec<[f64; 2]>,
    /// Net area at the nodes, m2. Empty = the annulus of the nodal D and t.
    pub area_m2: Vec<f64>,
    /// Section modulus just above the nodes, m3: I / (D/2) of the annulus, or at openings
    /// the net section's I_min over its extreme fibre from that neutral axis. Empty =
    /// I / (D/2). Stresses use [`StageModel::stress_modulus_m3`].
    pub section_modulus_m3: Vec<f64>,
    /// The section just below each node where it differs from the one above: (node index,
    /// section).
    pub sections_below: Vec<(usize, NodeSection)>,
}

/// The shell section on one side of a node.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct NodeSection {
    pub outer_diameter_m: f64,
    pub wall_m: f64,
    /// Net area, m2.
    pub area_m2: f64,
    /// Net smaller principal second moment, m4.
    pub second_moment_m4: f64,
    /// Net section modulus in that direction, m3.
    pub section_modulus_m3: f64,
    pub shell_mass_kg_m: f64,
}

impl NodeSection {
    /// The section of element `data` at local coordinate `s_m`.
    pub fn of(data: &fem::model::ElementData, s_m: f64) -> NodeSection {
        let a = data.annulus(s_m);
        let (area_m2, second_moment_m4, section_modulus_m3) = if data.openings.is_empty() {
            (a.area_m2(), a.second_moment_m4(), a.section_modulus_m3())
        } else {
            let n = data.net_section(s_m);
            (n.area_m2, n.second_moment_min_m4, n.section_modulus_m3())
        };
        NodeSection {
            outer_diameter_m: a.outer_diameter_m,
            wall_m: a.wall_m,
            area_m2,
            second_moment_m4,
            section_modulus_m3,
            shell_mass_kg_m: data.density_kg_m3 * area_m2,
        }
    }

    /// Whether two sides differ by more than rounding.
    fn differs(&self, other: &NodeSection) -> bool {
        let off = |a: f64, b: f64| (a - b).abs() > 1e-12 * a.abs().max(b.abs());
        off(self.outer_diameter_m, other.outer_diameter_m)
            || off(self.wall_m, other.wall_m)
            || off(self.area_m2, other.area_m2)
            || off(self.second_moment_m4, other.second_moment_m4)
            || off(self.section_modulus_m3, other.section_modulus_m3)
            || off(self.shell_mass_kg_m, other.shell_mass_kg_m)
    }
}

impl StageModel {
    /// The section modulus for the stress at node `i`, m3: the weaker side where the
    /// section jumps (conservative: the moment is continuous, the stress is not).
    pub fn stress_modulus_m3(&self, i: usize) -> f64 {
        let above = match self.section_modulus_m3.get(i) {
            Some(&w) => w,
            None => self.second_moment_m4[i] / (0.5 * self.outer_diameter_m[i]),
        };
        match self.sections_below.iter().find(|(k, _)| *k == i) {
            Some((_, b)) => above.min(b.section_modulus_m3),
            None => above,
        }
    }

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
    /// Sign changes of each mode's displacement (k - 1 for mode k of a cantilever).
    pub sign_changes: Vec<usize>,
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
    let (beam, solution) = fem::solve_stage(case, stage, options.min_elements, options.modes)
        .map_err(|source| ModalError::Solver {
            stage: stage.name.clone(),
            source,
        })?;
    Ok(stage_modes(stage, &beam, &solution))
}

/// Number of sign changes of a displacement shape, ignoring values below 1e-9 of the
/// maximum (nodes exactly at zero).
pub fn sign_changes(displacement: &[f64]) -> usize {
    let mut changes = 0;
    let mut last = 0.0f64;
    for &w in displacement {
        if w.abs() < 1e-9 {
            continue;
        }
        if last != 0.0 && w.signum() != last.signum() {
            changes += 1;
        }
        last = w;
    }
    changes
}

/// The nodal model data of a stage, for the wind module and the reports.
pub fn stage_model(beam: &BeamModel) -> StageModel {
    let n = beam.z_m.len();
    let mut model = StageModel {
        z_m: beam.z_m.clone(),
        outer_diameter_m: vec![0.0; n],
        wall_m: vec![0.0; n],
        shell_mass_kg_m: vec![0.0; n],
        lining_mass_kg_m: vec![0.0; n],
        point_masses: beam.point_masses.clone(),
        second_moment_m4: vec![0.0; n],
        element_shell_mass_kg_m: Vec::new(),
        area_m2: vec![0.0; n],
        section_modulus_m3: vec![0.0; n],
        sections_below: Vec::new(),
    };
    for i in 0..n {
        // The section just above the node (just below for the top node).
        let above = if i + 1 < n {
            NodeSection::of(&beam.element_data[i], 0.0)
        } else {
            let d = &beam.element_data[i - 1];
            NodeSection::of(d, d.length_m)
        };
        model.outer_diameter_m[i] = above.outer_diameter_m;
        model.wall_m[i] = above.wall_m;
        model.shell_mass_kg_m[i] = above.shell_mass_kg_m;
        model.second_moment_m4[i] = above.second_moment_m4;
        model.area_m2[i] = above.area_m2;
        model.section_modulus_m3[i] = above.section_modulus_m3;
        if i > 0 && i + 1 < n {
            let d = &beam.element_data[i - 1];
            let below = NodeSection::of(d, d.length_m);
            if below.differs(&above) {
                model.sections_below.push((i, below));
            }
        }
        let above = if i + 1 < n {
            beam.element_data[i].lining_mass_kg_m(0.0)
        } else {
            0.0
        };
        let below = if i > 0 {
            let d = &beam.element_data[i - 1];
            d.lining_mass_kg_m(d.length_m)
        } else {
            0.0
        };
        model.lining_mass_kg_m[i] = above.max(below);
    }
    model.element_shell_mass_kg_m = beam
        .element_data
        .iter()
        .map(|d| [d.shell_mass_kg_m(0.0), d.shell_mass_kg_m(d.length_m)])
        .collect();
    model
}

/// Quadrature data of one element for mode-shape integrals, computed once per stage.
struct ElementSamples {
    weight_m: Vec<f64>,
    mass_kg_m: Vec<f64>,
    shapes: Vec<[f64; 6]>,
}

fn element_samples(beam: &BeamModel) -> Vec<ElementSamples> {
    beam.elements
        .iter()
        .zip(&beam.element_data)
        .map(|(el, data)| {
            let s = el.shape_samples(data);
            ElementSamples {
                mass_kg_m: s
                    .s_m
                    .iter()
                    .map(|&z| data.shell_mass_kg_m(z) + data.lining_mass_kg_m(z))
                    .collect(),
                weight_m: s.weight_m,
                shapes: s.displacement_shapes,
            }
        })
        .collect()
}

/// Integrals int m w^2 dz (distributed + point masses) and int w^2 dz of a nodal dof vector
/// over the exact element shapes.
fn shape_integrals(beam: &BeamModel, samples: &[ElementSamples], u: &[f64]) -> (f64, f64) {
    let mut m_w2 = 0.0;
    let mut w2 = 0.0;
    for (e, el) in samples.iter().enumerate() {
        let ue = &u[4 * e..4 * e + 6];
        for ((wt, m), nw) in el.weight_m.iter().zip(&el.mass_kg_m).zip(&el.shapes) {
            let w: f64 = (0..6).map(|k| nw[k] * ue[k]).sum();
            m_w2 += wt * m * w * w;
            w2 += wt * w * w;
        }
    }
    for &(i, kg) in &beam.point_masses {
        m_w2 += kg * u[4 * i] * u[4 * i];
    }
    (m_w2, w2)
}

/// Converts an FE solution into reported modes.
pub fn stage_modes(stage: &Stage, beam: &BeamModel, solution: &fem::Solution) -> StageModes {
    let n_nodes = beam.z_m.len();
    let mut modes = Vec::with_capacity(solution.eigenvalues.len());
    let mut changes = Vec::new();
    let samples = element_samples(beam);
    for (k, &lambda) in solution.eigenvalues.iter().enumerate() {
        let col = solution.vectors.column(k);
        let (mut peak, mut peak_abs) = (0.0f64, 0.0f64);
        for i in 0..n_nodes {
            if col[4 * i].abs() > peak_abs {
                peak_abs = col[4 * i].abs();
                peak = col[4 * i];
            }
        }
        let scale = 1.0 / peak;
        let u: Vec<f64> = col.iter().map(|v| v * scale).collect();
        let displacement: Vec<f64> = (0..n_nodes).map(|i| u[4 * i]).collect();
        let rotation_per_m: Vec<f64> = (0..n_nodes).map(|i| u[4 * i + 1]).collect();
        let (m_w2, w2) = shape_integrals(beam, &samples, &u);
        changes.push(sign_changes(&displacement));
        modes.push(Mode {
            number: k + 1,
            frequency_hz: lambda.sqrt() / (2.0 * std::f64::consts::PI),
            displacement,
            rotation_per_m,
            // phi is M-orthonormal, so the scaled shape has generalised mass scale^2.
            modal_mass_kg: scale * scale,
            equivalent_mass_kg_m: m_w2 / w2,
        });
    }
    StageModes {
        stage: stage.clone(),
        model: stage_model(beam),
        modes,
        check: CompletenessCheck {
            sturm_count: solution.sturm_count,
            shift_rad2_s2: solution.shift,
            modes_reported: solution.eigenvalues.len(),
            max_relative_residual: solution.max_relative_residual,
            iterations: solution.iterations,
            sign_changes: changes,
        },
        elements: beam.elements.len(),
    }
}

/// Modal analysis of every stage of the case, in case order.
pub fn analyse_case(case: &Case, options: ModalOptions) -> Result<Vec<StageModes>, ModalError> {
    case.stages
        .iter()
        .map(|stage| analyse_stage(case, stage, options))
        .collect()
}
