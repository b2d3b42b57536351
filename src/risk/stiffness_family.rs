//! The modes of a stack on base springs as a smooth function of its shell stiffness, for
//! samples of E and of the stages' stiffness factors without an eigen-solve each.
//!
//! Why it is needed: E and a stiffness factor multiply the shell's stiffness matrix but not
//! the foundation springs, so K(s) = s K_shell + K_springs (s = E / E_case times the stage's
//! stiffness factor over its case value) and neither the frequencies nor the shapes scale
//! exactly. The mass is unchanged.
//!
//! Why it works: for simple eigenvalues of a symmetric pencil (K(s), M) with K analytic in
//! s, the eigenvalues and normalised eigenvectors are analytic in s (Rellich's theorem on
//! analytic perturbation of symmetric matrices; Kato, Perturbation Theory for Linear
//! Operators, ch. II, from memory). The bending modes of a cantilever are simple. So every
//! input of the Annex E arithmetic that the kernel holds (frequency, equivalent mass, K,
//! K_W at the plateaus, the shape and its slope, the unit stresses and moments) is a smooth
//! function of ln s, and a Chebyshev interpolant in ln s ([`super::chebyshev`]) converges
//! geometrically. The maxima over the height (stress, utilisation) are taken after
//! interpolating their curves, since a maximum can switch height and is not smooth.
//!
//! How it is checked: the interval is that of the stiffness inputs' quantiles at
//! [`super::FAMILY_TAIL`] and 1 - [`super::FAMILY_TAIL`] ([`super::Engine`]); panels of
//! degree [`DEGREE`] in ln s are halved until each one's half-degree interpolant deviates
//! from the full solves at the other points by at most [`TOLERANCE`], every field measured
//! ([`ModeKernel::deviation`]). Each point is the full analysis of the case with E scaled
//! (the same solver, kernels and rules as a re-solved sample). A stage whose largest
//! antinode moves to another node across the interval, a failed solve, or more than
//! [`MAX_PANELS`] panels leaves the run on the re-solve path, and the note says so.
//!
//! Accuracy: the solver stops each mode at a relative residual of 1e-7, so the shapes of
//! two full solves at nearby E agree only to about the solver's convergence level (the
//! eigenvalues far better), and jump by up to about 1e-7 where its iteration count
//! changes. [`TOLERANCE`] is a few times that level: a sample through the family differs
//! from its own full solve by about as much as a full solve may differ from the exact
//! discrete eigenvectors. The tests compare samples through the family with the full check
//! of the edited case.
//!
//! Smoothness of the fields: the shapes are piecewise cubic (Hermite elements), so an
//! integral of |Phi| is only twice differentiable in s where a root of Phi crosses a node,
//! and once where it crosses the end of a correlation length; the panels halve around
//! those points ([`super::chebyshev::adapt`]). ModeShape::integral_abs splits elements at
//! the roots, without which these integrals would jump.
//!
//! Units: s dimensionless; fields in SI as in [`ModeKernel`].

use serde::{Deserialize, Serialize};

use super::case_modes;
use super::chebyshev::{self, AdaptError};
use super::kernel::{kernels_direct, ModeKernel, SampleInputs};
use super::resistance_kernel::{unit_moments, ResistanceKernel};
use crate::case::Case;

/// Largest accepted relative deviation of a panel's half-degree interpolant at its other
/// points (every field of every mode and stage; vectors relative to their largest entry).
/// A few times the eigen-solver's own level: it stops each mode at a relative residual of
/// 1e-7, and where its iteration count changes between two stiffnesses the shapes jump
/// (measured on the demo: 5e-8 to 1e-7), so no interpolant of full solves can be held
/// much tighter, and a tolerance at the jump size would send runs to the re-solve path.
pub const TOLERANCE: f64 = 3e-7;
/// Degree of each panel's interpolant (17 solves per panel).
pub const DEGREE: usize = 16;
/// Most panels before the family is given up.
pub const MAX_PANELS: usize = 64;

/// What the outputs say about a family.
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct FamilyInfo {
    /// The interval of the shell stiffness scale s covered.
    pub low_scale: f64,
    pub high_scale: f64,
    /// Number of panels in ln s and of full solves made.
    pub panels: usize,
    pub solves: usize,
    /// Degree of each panel's interpolant.
    pub degree: usize,
    /// The doubling test's largest deviation (see [`super::chebyshev`]).
    pub measured_deviation: f64,
    pub tolerance: f64,
}

/// Why no family was built (the run then re-solves every sample).
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum FamilyError {
    #[error("the analysis at s = {scale} failed: {message}")]
    Solve { scale: f64, message: String },
    #[error(
        "at s = {scale} stage {stage} mode {mode} has another shedding section or frame than \
         at the case's stiffness (its largest antinode moved)"
    )]
    Frame {
        scale: f64,
        stage: usize,
        mode: usize,
    },
    #[error(
        "the interpolant did not reach a deviation of {tolerance:e} with {panels} panels \
         (deviation {deviation:e})"
    )]
    NotConverged {
        panels: usize,
        deviation: f64,
        tolerance: f64,
    },
}

/// The kernels (and unit moment curves) at one point.
#[derive(Debug, Clone)]
struct AtPoint {
    kernels: Vec<ModeKernel>,
    moments: Option<Vec<Vec<f64>>>,
}

/// Kernels at Chebyshev points in ln s, ready to interpolate.
#[derive(Debug, Clone)]
pub struct StiffnessFamily {
    pub info: FamilyInfo,
    ln_low: f64,
    ln_high: f64,
    /// Panel ends in x in [-1, 1] (x = -1 at low_scale, 1 at high_scale, linear in ln s).
    breaks: Vec<f64>,
    /// The Chebyshev points of one panel (local coordinate).
    points: Vec<f64>,
    /// [kernel][panel][point].
    modes: Vec<Vec<Vec<ModeKernel>>>,
    /// [kernel][panel][point][node], with the resistance quantities.
    moments: Option<Vec<Vec<Vec<Vec<f64>>>>>,
}

/// Where one sample's stiffness falls: its panel and the weights there.
#[derive(Debug, Clone, Default)]
pub struct Weights {
    pub panel: usize,
    pub lambda: Vec<f64>,
}

impl StiffnessFamily {
    /// Builds the family of `case` over s in [low_scale, high_scale] (0 < low <= high).
    /// `reference` are the case's own kernels (the frame every point must keep) and
    /// `resistance` the case's resistance kernels when their unit moments are wanted too.
    pub fn build(
        case: &Case,
        reference: &[ModeKernel],
        resistance: Option<&[ResistanceKernel]>,
        low_scale: f64,
        high_scale: f64,
    ) -> Result<StiffnessFamily, FamilyError> {
        let (ln_low, ln_high) = (low_scale.ln(), high_scale.ln());
        let node_z: Option<Vec<Vec<f64>>> =
            resistance.map(|rk| rk.iter().map(|r| r.node_z_m()).collect());
        let value = |x: f64| -> Result<AtPoint, FamilyError> {
            let scale = scale_at(ln_low, ln_high, x);
            at_point(case, reference, node_z.as_deref(), scale)
        };
        let a = if high_scale / low_scale - 1.0 <= 1e-12 {
            // No spread: one point, every sample at it.
            chebyshev::Adapted {
                degree: 0,
                breaks: vec![-1.0, 1.0],
                values: vec![vec![value(0.0)?]],
                measured_deviation: 0.0,
                evaluations: 1,
            }
        } else {
            chebyshev::adapt(value, combine, deviation, DEGREE, MAX_PANELS, TOLERANCE).map_err(
                |e| match e {
                    AdaptError::Value { error, .. } => error,
                    AdaptError::NotConverged { panels, deviation } => FamilyError::NotConverged {
                        panels,
                        deviation,
                        tolerance: TOLERANCE,
                    },
                },
            )?
        };
        let per_kernel = |k: usize| -> Vec<Vec<ModeKernel>> {
            a.values
                .iter()
                .map(|panel| panel.iter().map(|v| v.kernels[k].clone()).collect())
                .collect()
        };
        let modes = (0..reference.len()).map(per_kernel).collect();
        let moments = resistance.map(|rk| {
            (0..rk.len())
                .map(|k| {
                    a.values
                        .iter()
                        .map(|panel| {
                            panel
                                .iter()
                                .map(|v| v.moments.as_ref().expect("moments computed")[k].clone())
                                .collect()
                        })
                        .collect()
                })
                .collect()
        });
        Ok(StiffnessFamily {
            info: FamilyInfo {
                low_scale,
                high_scale,
                panels: a.values.len(),
                solves: a.evaluations,
                degree: a.degree,
                measured_deviation: a.measured_deviation,
                tolerance: TOLERANCE,
            },
            ln_low,
            ln_high,
            breaks: a.breaks,
            points: chebyshev::points(a.degree),
            modes,
            moments,
        })
    }

    /// Whether the unit moment curves are interpolated too.
    pub fn has_moments(&self) -> bool {
        self.moments.is_some()
    }

    /// The panel and weights at stiffness scale `scale` into `out`; false when `scale` is
    /// outside the family's interval (the sample is then re-solved).
    pub fn weights(&self, scale: f64, out: &mut Weights) -> bool {
        out.lambda.resize(self.points.len(), 0.0);
        let x = if self.points.len() == 1 {
            if (scale / self.info.low_scale - 1.0).abs() > 1e-12 {
                return false;
            }
            0.0
        } else {
            (2.0 * scale.ln() - (self.ln_low + self.ln_high)) / (self.ln_high - self.ln_low)
        };
        if !(-1.0 - 1e-12..=1.0 + 1e-12).contains(&x) {
            return false;
        }
        let (i, t) = chebyshev::locate(&self.breaks, x);
        out.panel = i;
        chebyshev::weights_at(&self.points, t, &mut out.lambda);
        true
    }

    /// Kernel `k` at the weights `w` into `out` (a kernel of the same frame): its scalars,
    /// and its curves unless `s` screens the sample out (then no curve is read).
    pub fn kernel_into(&self, k: usize, w: &Weights, s: &SampleInputs, out: &mut ModeKernel) {
        let nodes = &self.modes[k][w.panel];
        out.interpolate_scalars_from(&w.lambda, |j| &nodes[j]);
        if !out.screened(s) {
            out.interpolate_curves_from(&w.lambda, |j| &nodes[j]);
        }
    }

    /// The unit moments of kernel `k` at the weights `w` into `out`.
    pub fn moments_into(&self, k: usize, w: &Weights, out: &mut ResistanceKernel) {
        if let Some(m) = &self.moments {
            let curves = &m[k][w.panel];
            out.interpolate_from(&w.lambda, |j| curves[j].as_slice());
        }
    }

    /// The kernels at the first point (templates for a thread's scratch kernels).
    pub fn templates(&self) -> Vec<ModeKernel> {
        self.modes.iter().map(|m| m[0][0].clone()).collect()
    }
}

/// s at x in [-1, 1] (x = -1: low, x = 1: high; geometric in between).
fn scale_at(ln_low: f64, ln_high: f64, x: f64) -> f64 {
    (0.5 * (ln_low + ln_high) + 0.5 * x * (ln_high - ln_low)).exp()
}

/// The full analysis of `case` with the shell's E times `scale`.
fn at_point(
    case: &Case,
    reference: &[ModeKernel],
    node_z: Option<&[Vec<f64>]>,
    scale: f64,
) -> Result<AtPoint, FamilyError> {
    let solve = |message: String| FamilyError::Solve { scale, message };
    let mut c = case.clone();
    c.shell.elastic_modulus_pa *= scale;
    let stages = case_modes(&c).map_err(|e| solve(e.to_string()))?;
    let kernels = kernels_direct(&c, &stages).map_err(|e| solve(e.to_string()))?;
    if kernels.len() != reference.len() {
        return Err(solve(format!(
            "{} checked modes instead of {}",
            kernels.len(),
            reference.len()
        )));
    }
    for (k, r) in kernels.iter().zip(reference) {
        if !k.same_frame(r) {
            return Err(FamilyError::Frame {
                scale,
                stage: r.stage_index,
                mode: r.mode,
            });
        }
    }
    let moments = node_z.map(|zs| {
        kernels
            .iter()
            .zip(zs)
            .map(|(k, z)| {
                let sm = &stages[k.stage_index];
                unit_moments(sm, &sm.modes[k.mode - 1], z)
            })
            .collect()
    });
    Ok(AtPoint { kernels, moments })
}

/// The interpolant's value at the weights `lambda` from the values at the points.
fn combine(values: &[AtPoint], lambda: &[f64]) -> AtPoint {
    let mut out = values[0].clone();
    for (k, kernel) in out.kernels.iter_mut().enumerate() {
        kernel.interpolate_from(lambda, |j| &values[j].kernels[k]);
    }
    if let Some(m) = &mut out.moments {
        for (k, curve) in m.iter_mut().enumerate() {
            curve.iter_mut().for_each(|v| *v = 0.0);
            for (j, &l) in lambda.iter().enumerate() {
                if l != 0.0 {
                    let c = &values[j].moments.as_ref().expect("same layout")[k];
                    for (o, &v) in curve.iter_mut().zip(c) {
                        *o += l * v;
                    }
                }
            }
        }
    }
    out
}

/// Largest relative deviation of every field (see [`ModeKernel::deviation`]; unit moment
/// curves relative to their largest magnitude).
fn deviation(got: &AtPoint, exact: &AtPoint) -> f64 {
    let mut worst = got
        .kernels
        .iter()
        .zip(&exact.kernels)
        .map(|(a, b)| a.deviation(b))
        .fold(0.0, f64::max);
    if let (Some(a), Some(b)) = (&got.moments, &exact.moments) {
        for (x, y) in a.iter().zip(b) {
            let scale = y.iter().fold(0.0, |m: f64, v| m.max(v.abs()));
            for (p, q) in x.iter().zip(y) {
                worst = worst.max((p - q).abs() / if scale > 0.0 { scale } else { 1.0 });
            }
        }
    }
    worst
}
