//! The per-sample resistance quantities of one stage and mode (`risk --with-resistance`):
//! the vortex utilisation max_z gamma_Q M_vortex(z) / M_Rd(z) (EN 1992-1-1 6.1, the
//! `vortex mode N` action of `check`) and the fatigue damage of the vertical bars from that
//! mode's cycles (EN 1992-1-1 6.8.4, Table 6.3N; the mode's damage at its worst height, as
//! `check`'s per-mode fatigue row).
//!
//! Why this is exact in the shortcut path (only E, a stiffness factor, damping, St, c_lat or
//! the wind change): the inertia moments of E.1.4 are m (2 pi n)^2 Phi y integrated twice,
//! so with shapes and masses unchanged they are the case's unit moment curve times
//! (n / n_case)^2 y, i.e. the sample's stiffness scale times its antinode amplitude; N_Ed
//! (self-weight) and M_Rd(N) do not depend on any of those keys (M_Rd uses f_ck, f_yk, E_s
//! and the partial factors, never E_c), so the utilisation is that scalar times the case's
//! per-height ratios, maximised after scaling. The fatigue damage needs the cracked-section
//! bar stress range at every height: it is not linear in the moment (the neutral axis moves)
//! and depends on E_c (the sampled E, as `check` uses the case's `[shell]` E), so it is
//! computed per sample with the same functions as `check` ([`crate::resistance`]): the
//! expensive part, hence opt-in. The cycle count is EN 1991-1-4 E.1.5.2.6 with the
//! sample's n, v_crit and site wind ([`crate::wind::fatigue::load_cycles`]).
//!
//! Units: N, N m, Pa, m, Hz.

use crate::case::{Case, ResistanceSpec, VortexMethod};
use crate::modal::{Mode, StageModes};
use crate::resistance::along_height::{annulus_at, node_resistances, ActionCurve};
use crate::resistance::cracked::CrackedSection;
use crate::resistance::fatigue::SnCurve;
use crate::resistance::ResistanceError;
use crate::wind::{self, fatigue, loads, profile, ModeShape, StageClimate, WindError};

/// One node of a stage for the fatigue check.
#[derive(Debug, Clone)]
struct FatigueNode {
    z_m: f64,
    self_weight_n: f64,
    /// The node's cracked section with the case's concrete modulus.
    section: CrackedSection,
}

/// Precomputed resistance data of one stage and mode.
#[derive(Debug, Clone)]
pub struct ResistanceKernel {
    /// Index of the stage in the case.
    pub stage_index: usize,
    /// max over the nodes of gamma_Q |M_unit(z)| / M_Rd(z), M_unit the inertia moment per
    /// metre of antinode amplitude at the case's frequency.
    unit_utilisation: f64,
    /// M_unit(z) at each node with its sign (same interpolation as `check`'s action curve,
    /// whose magnitude it is).
    unit_moment_nm: Vec<f64>,
    /// M_Rd(z) at each node (shared by the modes of a stage).
    resistance_moment_nm: std::sync::Arc<Vec<f64>>,
    gamma_q: f64,
    /// Shared by the modes of a stage.
    nodes: std::sync::Arc<Vec<FatigueNode>>,
    eps0: f64,
    judged_years: f64,
    /// v_m / v_ref of the site's (50-year) wind at the shedding section (fatigue v_0).
    site_speed_factor: f64,
    site_reference_speed_m_s: f64,
    /// The case's fatigue partial factors (`[design] gamma_f_fat`, `gamma_s_fat`).
    gamma_f_fat: f64,
    gamma_s_fat: f64,
}

/// Why the resistance quantities cannot be prepared.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum ResistancePrepError {
    #[error("the case has no [reinforcement] (bar ratios and covers), which the resistance quantities need")]
    NoReinforcement,
    #[error(
        "the governing method {0} has no per-sample resistance path (EN 1991-1-4 approaches 1 \
         and 2 only)"
    )]
    Method(String),
    #[error("stage {stage:?} at z = {z_m} m: {error}")]
    Section {
        stage: String,
        z_m: f64,
        error: ResistanceError,
    },
    #[error(transparent)]
    Wind(#[from] WindError),
    #[error("{0}")]
    Modal(String),
}

/// What the resistance quantities of one sample give.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct ResistanceSample {
    pub vortex_utilisation: f64,
    pub fatigue_damage: f64,
}

/// Kernels of every stage and checked mode, in the order of [`super::kernel::kernels`].
pub fn resistance_kernels(
    case: &Case,
    stages: &[StageModes],
) -> Result<Vec<ResistanceKernel>, ResistancePrepError> {
    let spec = case
        .resistance
        .as_ref()
        .ok_or(ResistancePrepError::NoReinforcement)?;
    let eps0 = match case.vortex.method {
        VortexMethod::En1991E1 => fatigue::EPS0_APPROACH1,
        VortexMethod::En1991E2 => fatigue::EPS0_APPROACH2,
        m => return Err(ResistancePrepError::Method(m.key().to_string())),
    };
    let site = wind::site_wind(case, "risk")?;
    let mut out = Vec::new();
    for (stage_index, sm) in stages.iter().enumerate() {
        let climate = StageClimate::of(case, &sm.stage, site);
        let (mrd, nodes) = stage_nodes(spec, sm, case.shell.elastic_modulus_pa)?;
        let nodes = std::sync::Arc::new(nodes);
        let mrd = std::sync::Arc::new(mrd);
        for mode in sm.modes.iter().take(case.vortex.modes) {
            out.push(ResistanceKernel::new(
                stage_index,
                spec,
                &climate,
                sm,
                mode,
                &mrd,
                &nodes,
                eps0,
            ));
        }
    }
    Ok(out)
}

fn stage_nodes(
    spec: &ResistanceSpec,
    sm: &StageModes,
    concrete_modulus_pa: f64,
) -> Result<(Vec<f64>, Vec<FatigueNode>), ResistancePrepError> {
    let model = &sm.model;
    let nr =
        node_resistances(spec, model).map_err(|(z_m, error)| ResistancePrepError::Section {
            stage: sm.stage.name.clone(),
            z_m,
            error,
        })?;
    let nodes = nr
        .iter()
        .enumerate()
        .map(|(i, nd)| FatigueNode {
            z_m: nd.z_m,
            self_weight_n: nd.self_weight_n,
            section: CrackedSection {
                annulus: annulus_at(spec, model, i),
                concrete_modulus_pa,
                steel_modulus_pa: spec.steel_modulus_pa,
            },
        })
        .collect();
    Ok((nr.iter().map(|n| n.resistance_moment_nm).collect(), nodes))
}

/// The inertia moment per metre of antinode amplitude of `mode` at each height of
/// `node_z_m`, with its sign: the unit curve of `wind::check_mode` at the mode's own
/// frequency, interpolated to the nodes as `check`'s action curve.
pub fn unit_moments(sm: &StageModes, mode: &Mode, node_z_m: &[f64]) -> Vec<f64> {
    let model = &sm.model;
    let shape = ModeShape::from_mode(model, mode);
    let ia = shape.largest_antinode();
    let unit = loads::inertia_loads(
        model,
        &shape,
        mode.frequency_hz,
        1.0 / mode.displacement[ia],
    );
    let curve = ActionCurve {
        name: String::new(),
        load_factor: 1.0,
        factor_source: String::new(),
        moment_nm: unit.iter().map(|l| (l.z_m, l.moment_nm)).collect(),
    };
    node_z_m
        .iter()
        .map(|&z| curve.signed_moment_at(z))
        .collect()
}

impl ResistanceKernel {
    #[allow(clippy::too_many_arguments)]
    fn new(
        stage_index: usize,
        spec: &ResistanceSpec,
        climate: &StageClimate,
        sm: &StageModes,
        mode: &Mode,
        mrd: &std::sync::Arc<Vec<f64>>,
        nodes: &std::sync::Arc<Vec<FatigueNode>>,
        eps0: f64,
    ) -> Self {
        let model = &sm.model;
        let ia = ModeShape::from_mode(model, mode).largest_antinode();
        let z: Vec<f64> = nodes.iter().map(|n| n.z_m).collect();
        let mut k = ResistanceKernel {
            stage_index,
            unit_utilisation: 0.0,
            unit_moment_nm: unit_moments(sm, mode, &z),
            resistance_moment_nm: mrd.clone(),
            gamma_q: spec.factors.gamma_q,
            nodes: nodes.clone(),
            eps0,
            judged_years: climate.judged_years,
            site_speed_factor: profile::speed_factor(&climate.site_wind, model.z_m[ia]),
            site_reference_speed_m_s: climate.site_wind.reference_speed_m_s,
            gamma_f_fat: spec.factors.gamma_f_fat,
            gamma_s_fat: spec.factors.gamma_s_fat,
        };
        k.unit_utilisation = k.utilisation_of_unit_moments();
        k
    }

    /// max over the nodes of gamma_Q |M_unit(z)| / M_Rd(z).
    fn utilisation_of_unit_moments(&self) -> f64 {
        self.unit_moment_nm
            .iter()
            .zip(self.resistance_moment_nm.iter())
            .map(|(m, r)| self.gamma_q * m.abs() / r)
            .fold(0.0, f64::max)
    }

    /// The heights of the stage's nodes, m.
    pub fn node_z_m(&self) -> Vec<f64> {
        self.nodes.iter().map(|n| n.z_m).collect()
    }

    /// Sets the unit moments to sum_j lambda_j curve(j) (unit moment curves of the same
    /// nodes at other shell stiffnesses, [`unit_moments`]) and the unit utilisation from
    /// them: for a family of modes over the shell stiffness.
    pub fn interpolate_from<'a>(&mut self, lambda: &[f64], curve: impl Fn(usize) -> &'a [f64]) {
        self.unit_moment_nm.iter_mut().for_each(|m| *m = 0.0);
        for (j, &l) in lambda.iter().enumerate() {
            if l != 0.0 {
                for (m, &v) in self.unit_moment_nm.iter_mut().zip(curve(j)) {
                    *m += l * v;
                }
            }
        }
        self.unit_utilisation = self.utilisation_of_unit_moments();
    }

    /// The unit moments at the nodes, N m per m of antinode amplitude, with their sign.
    pub fn unit_moments_nm(&self) -> &[f64] {
        &self.unit_moment_nm
    }

    /// Number of nodes of the stage (the length of `node_damage` in [`Self::evaluate`]).
    pub fn node_count(&self) -> usize {
        self.nodes.len()
    }

    /// One sample: `load_scale` = (n / n_case)^2 y (the factor on the unit moments, 0 when
    /// screened out), the sample's frequency and critical speed, its site reference speed
    /// (`None` = the case's) and the factor on the concrete modulus (E / E_case). Each
    /// node's damage of this mode is added into `node_damage` (one entry per node of the
    /// stage), so the stage's sum over its modes can be taken as `check` does.
    pub fn evaluate(
        &self,
        load_scale: f64,
        frequency_hz: f64,
        critical_speed_m_s: f64,
        site_reference_speed_m_s: Option<f64>,
        concrete_modulus_scale: f64,
        node_damage: &mut [f64],
    ) -> Result<ResistanceSample, ResistanceError> {
        if load_scale <= 0.0 {
            return Ok(ResistanceSample::default());
        }
        let v_site = site_reference_speed_m_s.unwrap_or(self.site_reference_speed_m_s)
            * self.site_speed_factor;
        let cycles = fatigue::load_cycles(
            self.judged_years,
            frequency_hz,
            self.eps0,
            critical_speed_m_s,
            v_site,
        );
        let curve = SnCurve::STRAIGHT_BARS;
        let mut damage: f64 = 0.0;
        for ((nd, &u), sum) in self
            .nodes
            .iter()
            .zip(&self.unit_moment_nm)
            .zip(node_damage.iter_mut())
        {
            let m = u.abs() * load_scale;
            if m <= 0.0 {
                continue;
            }
            // `check` takes E_c from [shell]: a sampled E reaches it.
            let scaled;
            let sec = if concrete_modulus_scale == 1.0 {
                &nd.section
            } else {
                scaled = CrackedSection {
                    concrete_modulus_pa: nd.section.concrete_modulus_pa * concrete_modulus_scale,
                    ..nd.section.clone()
                };
                &scaled
            };
            let range = sec
                .max_bar_stress_range_pa(nd.self_weight_n, m)
                .ok_or(ResistanceError::NoElasticState { moment_nm: m })?;
            let d = curve.damage(range, cycles, self.gamma_f_fat, self.gamma_s_fat);
            *sum += d;
            damage = damage.max(d);
        }
        Ok(ResistanceSample {
            vortex_utilisation: self.unit_utilisation * load_scale,
            fatigue_damage: damage,
        })
    }
}
