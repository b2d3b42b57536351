//! Probabilistic screening (`stackwake risk`): Monte Carlo over the `[[uncertain]]` inputs
//! of a case, every sample checked like `check` (same modes, same EN 1991-1-4 Annex E
//! chain, same criteria), reduced to streamed, mergeable statistics.
//!
//! - Sample i draws uniform number j from a counter-based stream of (seed, i, j) ([`rng`]),
//!   so a sample is the same whichever shard or thread computes it.
//! - Samples that change only E, a stage's stiffness factor, the structural damping, the
//!   Strouhal number, c_lat or the reference wind speed reuse the case's modes
//!   ([`kernel`]: frequencies scale as sqrt of the stiffness factor, shapes unchanged); on
//!   base springs E and the stiffness factors take their modes from the
//!   [`stiffness_family`] (full solves interpolated over the shell stiffness); samples that
//!   change anything else (masses, geometry, springs, other keys) are written into the case
//!   file's table, validated and re-solved by the caller's `full` function.
//! - Statistics ([`stats`]) are exact integers, so any split of the samples gives
//!   bit-identical merged numbers.
//! - Influence ([`Accumulator::influence`]): the correlation between each input's
//!   probability-integral transform U = F(X) (its population rank, uniform on (0,1)) and
//!   the event indicator; a rank (Spearman-type) correlation with the population ranks,
//!   mergeable because it needs only the exact sum of U over the samples with the event.
//!   Its standard error is about (1 - r^2) / sqrt(N) (Fisher's large-sample result for a
//!   correlation coefficient; common practice). With rank-correlated inputs
//!   ([`correlation`], a Gaussian copula) U is the input's rank after the copula, and the
//!   influence measures total association with the event (including that of the inputs
//!   correlated with it), not a unique contribution.
//!
//! - Resistance (opt-in, [`resistance_kernel`]): each mode's vortex utilisation and fatigue
//!   damage, exact in the shortcut path (moment curves scaled, M_Rd unchanged).
//!
//! Pure: no file access (the caller supplies the full re-analysis).
//! Units: sampled values in the case file's units (the key names them); results SI.

pub mod accumulator;
pub mod chebyshev;
pub mod correlation;
pub mod distribution;
pub mod kernel;
pub mod resistance_kernel;
pub mod rng;
pub mod role;
pub mod run;
pub mod stats;
pub mod stiffness_family;

use serde::{Deserialize, Serialize};

use crate::case::{Case, VortexMethod};
use crate::modal::{analyse_case, ModalOptions, StageModes};
pub use accumulator::*;
use distribution::Distribution;
use kernel::{ModeKernel, ModeSample, SampleInputs};
pub use role::{role_of, Role, Scaling};

/// The risk-only key: a multiplier on c_lat (EN 1991-1-4 E.1.5.2), the model uncertainty
/// of the lateral force coefficient. Not a case-file key: it is valid only in
/// `[[uncertain]]`, and its case value is 1.
pub const C_LAT_FACTOR_KEY: &str = "uncertainty.c_lat_factor";

/// The tail probability outside the [`stiffness_family`]'s interval, per input and side:
/// a sample beyond it (about 2e-7 of the samples per stiffness input) is re-solved.
pub const FAMILY_TAIL: f64 = 1e-7;

/// A thread's working copies of the family's kernels ([`Engine::scratch`]).
#[derive(Debug, Clone, Default)]
pub struct Scratch {
    kernels: Vec<ModeKernel>,
    resistance: Vec<resistance_kernel::ResistanceKernel>,
    weights: Vec<stiffness_family::Weights>,
}

/// Largest number of samples of one run.
pub const MAX_SAMPLES: u64 = 1_000_000_000_000;

/// One `[[uncertain]]` input, validated.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct UncertainInput {
    pub key: String,
    pub role: Role,
    pub distribution: Distribution,
    /// What the user wrote, for the note: family, mean, cov, low, high, truncation.
    pub described: String,
    /// The case's own value of the key (1 for the stiffness factor when absent, 1 for
    /// [`C_LAT_FACTOR_KEY`]).
    pub case_value: f64,
}

/// Everything fixed for a run.
pub struct Engine<'a> {
    pub case: &'a Case,
    pub inputs: &'a [UncertainInput],
    pub seed: u64,
    /// Kernels of the case's own modes (every stage, checked modes, in order).
    pub kernels: Vec<ModeKernel>,
    /// Number of stages.
    pub stages: usize,
    /// Whether every key keeps the modes and the kernel covers the governing method.
    pub shortcut: bool,
    /// Rank correlations between the inputs (identity when none; see [`correlation`]).
    pub copula: correlation::Copula,
    /// The resistance quantities per kernel (`--with-resistance`), else `None`.
    pub resistance: Option<Vec<resistance_kernel::ResistanceKernel>>,
    /// The modes over the shell stiffness when E or a stiffness factor is uncertain on
    /// base springs ([`stiffness_family`]), else `None`.
    pub family: Option<stiffness_family::StiffnessFamily>,
    /// Why that family could not be built (its samples then re-solve), for the note.
    pub family_error: Option<String>,
    /// The full analysis of a sample: the sampled values of every input (risk-only keys
    /// included, the function ignores them) -> validated case, or the message why not.
    pub full: &'a (dyn Fn(&[f64]) -> Result<Case, String> + Sync),
}

/// Why a run cannot start.
#[derive(Debug, thiserror::Error)]
pub enum RiskError {
    #[error(transparent)]
    Modal(#[from] crate::modal::ModalError),
    #[error(transparent)]
    Wind(#[from] crate::wind::WindError),
}

/// The case's modes as `check` computes them.
pub fn case_modes(case: &Case) -> Result<Vec<StageModes>, crate::modal::ModalError> {
    analyse_case(
        case,
        ModalOptions {
            modes: case.vortex.modes,
            min_elements: None,
        },
    )
}

impl<'a> Engine<'a> {
    /// Prepares a run: the case's modes and kernels.
    pub fn new(
        case: &'a Case,
        inputs: &'a [UncertainInput],
        seed: u64,
        full: &'a (dyn Fn(&[f64]) -> Result<Case, String> + Sync),
    ) -> Result<Engine<'a>, RiskError> {
        let stages = case_modes(case)?;
        let kernels = kernel::kernels(case, &stages)?;
        let shortcut = ModeKernel::supported(case.vortex.method)
            && inputs.iter().all(|i| i.role.keeps_modes());
        let mut e = Engine {
            case,
            inputs,
            seed,
            kernels,
            stages: case.stages.len(),
            shortcut,
            copula: correlation::Copula::default(),
            resistance: None,
            family: None,
            family_error: None,
            full,
        };
        e.build_family();
        Ok(e)
    }

    /// Builds the [`stiffness_family`] when the shortcut needs one (with the resistance
    /// kernels' unit moments when they are present); without it the samples re-solve.
    fn build_family(&mut self) {
        if !self.shortcut || !self.inputs.iter().any(|i| i.role.uses_family()) {
            return;
        }
        let (low, high) = self.shell_scale_range();
        match stiffness_family::StiffnessFamily::build(
            self.case,
            &self.kernels,
            self.resistance.as_deref(),
            low,
            high,
        ) {
            Ok(f) => {
                self.family = Some(f);
                self.family_error = None;
            }
            Err(e) => {
                self.family = None;
                self.family_error = Some(e.to_string());
                self.shortcut = false;
            }
        }
    }

    /// The range of the shell stiffness scale s over the stages: the product of E's and
    /// each stage's stiffness factor's ranges, each from its distribution's quantiles at
    /// [`FAMILY_TAIL`] and 1 - [`FAMILY_TAIL`] relative to the case value.
    fn shell_scale_range(&self) -> (f64, f64) {
        let range = |inp: &UncertainInput| {
            let lo = inp.distribution.sample(FAMILY_TAIL) / inp.case_value;
            let hi = inp.distribution.sample(1.0 - FAMILY_TAIL) / inp.case_value;
            (lo.min(hi), lo.max(hi))
        };
        let mut e = (1.0, 1.0);
        let mut stage = vec![(1.0f64, 1.0f64); self.stages];
        for inp in self.inputs {
            match inp.role {
                Role::ShellModulus => e = range(inp),
                Role::ShellStageStiffness(i) if i < self.stages => stage[i] = range(inp),
                _ => {}
            }
        }
        stage
            .iter()
            .fold((f64::INFINITY, 0.0f64), |(lo, hi), &(a, b)| {
                (lo.min(e.0 * a), hi.max(e.1 * b))
            })
    }

    /// The same engine with the inputs' rank correlations (a correlation changes no mode,
    /// so the shortcut stays valid).
    pub fn with_copula(mut self, copula: correlation::Copula) -> Self {
        self.copula = copula;
        self
    }

    /// The same engine with the resistance quantities of every mode (vortex utilisation,
    /// fatigue damage; [`resistance_kernel`]).
    pub fn with_resistance(mut self) -> Result<Self, resistance_kernel::ResistancePrepError> {
        let stages = case_modes(self.case)
            .map_err(|e| resistance_kernel::ResistancePrepError::Modal(e.to_string()))?;
        let rk = resistance_kernel::resistance_kernels(self.case, &stages)?;
        if rk.len() != self.kernels.len() {
            return Err(resistance_kernel::ResistancePrepError::Modal(format!(
                "{} resistance kernels for {} checked modes",
                rk.len(),
                self.kernels.len()
            )));
        }
        self.resistance = Some(rk);
        if self.family.is_some() {
            // The family again, now with the unit moment curves.
            self.build_family();
        }
        Ok(self)
    }

    /// Number of (stage, mode) pairs.
    pub fn modes(&self) -> usize {
        self.kernels.len()
    }

    /// The uniforms' integer bits (after the rank correlations: each is the input's
    /// population rank F(X)) and sampled values of sample `index`.
    pub fn draw(&self, index: u64, bits: &mut [u64], values: &mut [f64]) {
        for (j, b) in bits.iter_mut().enumerate().take(self.inputs.len()) {
            *b = rng::draw_bits(self.seed, index, j as u64);
        }
        self.copula.apply(bits);
        for (j, inp) in self.inputs.iter().enumerate() {
            values[j] = inp.distribution.sample(rng::bits_to_uniform(bits[j]));
        }
    }

    /// A thread's working copies for [`Self::evaluate_with`].
    pub fn scratch(&self) -> Scratch {
        match &self.family {
            Some(f) => Scratch {
                kernels: f.templates(),
                resistance: self.resistance.clone().unwrap_or_default(),
                weights: vec![stiffness_family::Weights::default(); self.stages],
            },
            None => Scratch::default(),
        }
    }

    /// Evaluates a sample into `out` (one entry per kernel); see [`Self::evaluate_with`].
    pub fn evaluate(
        &self,
        values: &[f64],
        out: &mut [ModeSample],
        message: &mut Option<String>,
    ) -> bool {
        self.evaluate_with(values, out, message, &mut self.scratch())
    }

    /// Evaluates the sample with the sampled `values` into `out` (one entry per kernel),
    /// using `scratch` (from [`Self::scratch`]) for the family's kernels. Returns false
    /// when the sample is invalid (a case-file rule or the solver refused it).
    pub fn evaluate_with(
        &self,
        values: &[f64],
        out: &mut [ModeSample],
        message: &mut Option<String>,
        scratch: &mut Scratch,
    ) -> bool {
        if self.shortcut {
            let mut per_stage = [1.0f64; 64];
            let mut e_scale = 1.0;
            let mut s = SampleInputs::identity();
            for (inp, &x) in self.inputs.iter().zip(values) {
                match inp.role {
                    Role::ElasticModulus | Role::ShellModulus => e_scale = x / inp.case_value,
                    Role::StageStiffness(i) | Role::ShellStageStiffness(i) if i < 64 => {
                        per_stage[i] = x / inp.case_value;
                    }
                    Role::Strouhal => s.strouhal = Some(x),
                    Role::LogDecrement => s.log_decrement = Some(x),
                    Role::ReferenceSpeed => s.reference_speed_m_s = Some(x),
                    Role::CLatFactor => s.c_lat_factor = x,
                    _ => {}
                }
            }
            let stage_scale = |i: usize| e_scale * per_stage.get(i).copied().unwrap_or(1.0);
            if let Some(f) = &self.family {
                // On base springs: each stage's kernels at its shell stiffness scale; the
                // frequencies come from the family, not from sqrt scaling.
                for (w, i) in scratch.weights.iter_mut().zip(0..) {
                    if !f.weights(stage_scale(i), w) {
                        // Outside the family's interval (a far tail): the full analysis.
                        return self.finish_full(values, out, message);
                    }
                }
                for (k, o) in out.iter_mut().enumerate() {
                    let w = &scratch.weights[self.kernels[k].stage_index];
                    f.kernel_into(k, w, &s, &mut scratch.kernels[k]);
                    *o = scratch.kernels[k].evaluate(&s);
                }
                if self.resistance.is_some() {
                    for (k, r) in scratch.resistance.iter_mut().enumerate() {
                        // A mode without amplitude reads no moment.
                        if out[k].load_scale > 0.0 {
                            f.moments_into(k, &scratch.weights[r.stage_index], r);
                        }
                    }
                    let rk = &scratch.resistance;
                    if let Err(m) = add_resistance(rk, out, s.reference_speed_m_s, e_scale) {
                        *message = Some(m);
                        return false;
                    }
                }
                return true;
            }
            for (k, o) in self.kernels.iter().zip(out.iter_mut()) {
                let mut sk = s;
                sk.stiffness_scale = stage_scale(k.stage_index);
                *o = k.evaluate(&sk);
            }
            if let Some(rk) = &self.resistance {
                if let Err(m) = add_resistance(rk, out, s.reference_speed_m_s, e_scale) {
                    *message = Some(m);
                    return false;
                }
            }
            return true;
        }
        self.finish_full(values, out, message)
    }

    fn finish_full(
        &self,
        values: &[f64],
        out: &mut [ModeSample],
        message: &mut Option<String>,
    ) -> bool {
        match self.evaluate_full(values, out) {
            Ok(()) => true,
            Err(m) => {
                *message = Some(m);
                false
            }
        }
    }

    fn evaluate_full(&self, values: &[f64], out: &mut [ModeSample]) -> Result<(), String> {
        let case = (self.full)(values)?;
        let stages = case_modes(&case).map_err(|e| e.to_string())?;
        let c_lat = self
            .inputs
            .iter()
            .zip(values)
            .find(|(i, _)| i.role == Role::CLatFactor)
            .map_or(1.0, |(_, &x)| x);
        if ModeKernel::supported(case.vortex.method) {
            let mut s = SampleInputs::identity();
            s.c_lat_factor = c_lat;
            let n = kernel::samples_direct(&case, &stages, &s, out).map_err(|e| e.to_string())?;
            if n != out.len() {
                return Err(format!(
                    "the sample has {} checked modes, the case {}",
                    n,
                    out.len()
                ));
            }
            if self.resistance.is_some() {
                let rk = resistance_kernel::resistance_kernels(&case, &stages)
                    .map_err(|e| e.to_string())?;
                add_resistance(&rk, out, None, 1.0)?;
            }
        } else {
            let r = crate::wind::check_all(&case, &stages).map_err(|e| e.to_string())?;
            let mut j = 0;
            for (sv, sm) in r.stages.iter().zip(&stages) {
                let top = sm.model.outer_diameter_m[sm.model.outer_diameter_m.len() - 1];
                for m in &sv.modes {
                    if j >= out.len() {
                        return Err("the sample has more checked modes than the case".into());
                    }
                    out[j] = kernel::from_check(m, &case.criteria, top);
                    j += 1;
                }
            }
            if j != out.len() {
                return Err("the sample has fewer checked modes than the case".into());
            }
        }
        Ok(())
    }
}

/// Evaluates the resistance quantities of every mode into `out` and folds their events into
/// `exceeds`.
fn add_resistance(
    rk: &[resistance_kernel::ResistanceKernel],
    out: &mut [ModeSample],
    site_reference_speed_m_s: Option<f64>,
    concrete_modulus_scale: f64,
) -> Result<(), String> {
    // Per stage: each node's damage summed over the stage's modes (EN 1992-1-1 6.8.4 with
    // Palmgren-Miner, as `check`); kernels come stage by stage.
    let mut node_damage: Vec<f64> = Vec::new();
    let mut stage_damage: Vec<(usize, f64)> = Vec::new();
    for (r, o) in rk.iter().zip(out.iter_mut()) {
        if stage_damage.last().is_none_or(|&(s, _)| s != r.stage_index) {
            flush_stage(&mut node_damage, &mut stage_damage);
            stage_damage.push((r.stage_index, 0.0));
            node_damage.clear();
            node_damage.resize(r.node_count(), 0.0);
        }
        let v = r
            .evaluate(
                o.load_scale,
                o.frequency_hz,
                o.critical_speed_m_s,
                site_reference_speed_m_s,
                concrete_modulus_scale,
                &mut node_damage,
            )
            .map_err(|e| e.to_string())?;
        o.vortex_utilisation = v.vortex_utilisation;
        o.fatigue_damage = v.fatigue_damage;
        // EN 1992-1-1: utilisation M_Ed / M_Rd > 1 and Miner sum > 1 fail, as in `check`.
        o.utilisation_exceeds = v.vortex_utilisation > 1.0;
        o.damage_exceeds = v.fatigue_damage > 1.0;
        o.exceeds |= o.utilisation_exceeds || o.damage_exceeds;
    }
    flush_stage(&mut node_damage, &mut stage_damage);
    let total: f64 = stage_damage.iter().map(|&(_, d)| d).sum();
    for (r, o) in rk.iter().zip(out.iter_mut()) {
        o.stage_fatigue_damage = stage_damage
            .iter()
            .find(|&&(s, _)| s == r.stage_index)
            .map_or(0.0, |&(_, d)| d);
        o.total_fatigue_damage = total;
    }
    Ok(())
}

/// Closes the current stage of [`add_resistance`]: its damage is the largest node sum.
fn flush_stage(node_damage: &mut [f64], stage_damage: &mut [(usize, f64)]) {
    if let Some(last) = stage_damage.last_mut() {
        last.1 = node_damage.iter().copied().fold(0.0, f64::max);
    }
}

/// Samples [from, to) of `n` split into `shards`: shard `k` (1-based) gets
/// [floor((k-1) n / shards), floor(k n / shards)).
pub fn shard_range(n: u64, k: u64, shards: u64) -> (u64, u64) {
    let f = |k: u64| ((k as u128 * n as u128) / shards as u128) as u64;
    (f(k - 1), f(k))
}

/// Index of the case-wide "exceeds" event.
pub fn case_event(modes: usize, stages: usize) -> usize {
    modes * MODE_EVENTS.len() + stages
}

/// Whether the vortex method's results can be reached by the kernel.
pub fn method_uses_kernel(m: VortexMethod) -> bool {
    ModeKernel::supported(m)
}

/// Format tag of partial results (2: the accumulator carries its layout and, with the
/// resistance quantities, the stage and total fatigue damage).
pub const PARTIAL_FORMAT: &str = "stackwake-risk-partial-2";

/// One input as the outputs describe it.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct InputInfo {
    pub key: String,
    pub described: String,
    /// The case's own value (`None` when the case leaves the key to its default).
    pub case_value: Option<f64>,
    /// Whether samples of this key avoid an eigen-solve.
    pub keeps_modes: bool,
    /// Whether their modes come from the [`stiffness_family`] (E or a stiffness factor on
    /// base springs).
    #[serde(default)]
    pub interpolated: bool,
}

/// One checked (stage, mode) and the case's own result.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct ModeInfo {
    pub stage: String,
    pub mode: usize,
    pub case_frequency_hz: f64,
    pub case_verdict: String,
}

/// What a run is about: identical in every shard of one run, so the merge can refuse
/// partial results of another case or other settings.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct RiskHeader {
    pub format: String,
    pub case_file: String,
    pub case_sha256: String,
    pub title: String,
    pub samples: u64,
    pub seed: u64,
    pub method: String,
    /// Whether the case gives any criterion (otherwise nothing is judged).
    pub judged: bool,
    pub tip_criterion: bool,
    pub stress_criterion: bool,
    pub keep_samples: bool,
    pub inputs: Vec<InputInfo>,
    pub stages: Vec<String>,
    pub modes: Vec<ModeInfo>,
    /// Stage index of each mode entry.
    pub stage_of: Vec<usize>,
    /// Rank correlations between the inputs (empty: independent).
    #[serde(default)]
    pub correlations: Vec<correlation::CorrelationInfo>,
    /// Whether the resistance quantities are sampled (`--with-resistance`).
    #[serde(default)]
    pub resistance: bool,
    /// The modes over the shell stiffness, when built ([`stiffness_family`]).
    #[serde(default)]
    pub stiffness_family: Option<stiffness_family::FamilyInfo>,
    /// Why it could not be built (the samples then re-solve).
    #[serde(default)]
    pub stiffness_family_error: Option<String>,
}

/// A shard's result.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Partial {
    pub header: RiskHeader,
    pub shard: u64,
    pub shards: u64,
    pub from: u64,
    pub to: u64,
    pub accumulator: Accumulator,
}
