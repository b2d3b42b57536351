//! Finite-element beam model of a stage and its exact, O(N) eigen-solver.
//!
//! * [`element`]: tapered Timoshenko / Euler-Bernoulli element with exact static
//!   flexibility, stiffness and consistent mass.
//! * [`model`]: mesh and assembly of one stage (banded K and M, point masses, base springs).
//! * [`flexibility`]: K^-1 applied exactly by the statically-determinate recursion.
//! * [`band`]: banded products and the Sturm count.
//! * [`subspace`]: subspace iteration on K^-1 M with the completeness check.
//!
//! Units: m, kg, N, Pa, rad; eigenvalues in (rad/s)^2.

pub mod band;
pub mod block;
pub mod compliance_fit;
pub mod element;
pub mod flexibility;
pub mod gauss;
pub mod model;
pub mod operator;
#[cfg(target_arch = "x86_64")]
mod simd_avx2;
pub mod subspace;

use rayon::prelude::*;
use thiserror::Error;

pub use model::BeamModel;

use crate::case::{Case, Stage};
use block::Block;
pub use subspace::{lowest_modes, lowest_modes_from, Solution};

/// Why the eigen-solver refused to report modes (never wrong numbers instead).
#[derive(Debug, Error, Clone, PartialEq)]
pub enum SolverError {
    /// More modes were asked for than the mesh has free dofs.
    #[error("{modes} modes requested but the mesh has only {dofs} free degrees of freedom; use more elements")]
    TooFewDofs { modes: usize, dofs: usize },
    /// Subspace iteration did not converge.
    #[error("eigen-solver did not converge in {iterations} iterations")]
    NoConvergence { iterations: usize },
    /// The iteration basis became linearly dependent (Rayleigh-Ritz mass not positive).
    #[error("eigen-solver lost its basis (projected mass matrix not positive definite); the model may be degenerate")]
    LostBasis,
    /// A non-positive or non-finite eigenvalue appeared.
    #[error("eigen-solver found a non-positive or non-finite eigenvalue at iteration {iteration}; check masses and stiffnesses")]
    NotPositive { iteration: usize },
    /// The Sturm count disagrees with the number of modes found.
    #[error("completeness check failed: {counted} eigenvalues lie below the shift {shift:.6e} (rad/s)^2 but {expected} modes were found; a mode may have been skipped")]
    Incomplete {
        expected: usize,
        counted: usize,
        shift: f64,
    },
    /// The converged modes do not satisfy the eigen-equation.
    #[error("eigen-solver residual {residual:.3e} too large")]
    Residual { residual: f64 },
}

/// Meshes up to this many elements are solved directly; finer meshes start from the modes of
/// a mesh of this size.
pub const COARSE_ELEMENTS: usize = 200;

/// Fine meshes with more nodes than this interpolate their start vectors on all cores.
const PARALLEL_NODES: usize = 4096;

/// Builds the beam model of `stage` and solves for its lowest `modes` modes.
pub fn solve_stage(
    case: &Case,
    stage: &Stage,
    min_elements: Option<usize>,
    modes: usize,
) -> Result<(BeamModel, Solution), SolverError> {
    let fine = BeamModel::build(case, stage, min_elements, modes);
    if fine.elements.len() <= 2 * COARSE_ELEMENTS {
        let solution = lowest_modes(&fine, modes)?;
        return Ok((fine, solution));
    }
    let wanted = modes + 4;
    let coarse = BeamModel::build(case, stage, Some(COARSE_ELEMENTS), wanted);
    let coarse_solution = lowest_modes(&coarse, wanted)?;
    let start = interpolate_modes(&coarse, &coarse_solution.vectors, &fine);
    let solution = lowest_modes_from(&fine, modes, start)?;
    Ok((fine, solution))
}

/// Evaluates the coarse model's vectors at the fine model's nodes with the coarse elements'
/// exact shapes (fine bubbles start at zero). Fine nodes are independent, so large meshes
/// use all cores.
pub fn interpolate_modes(coarse: &BeamModel, vectors: &Block, fine: &BeamModel) -> Block {
    let width = vectors.width;
    let mut out = Block::zeros(fine.dofs(), width);
    if width == 0 {
        return out;
    }
    let n_coarse = coarse.elements.len();
    // Node i owns rows 4i..4i+4 (w, theta and the bubbles of element i, left at zero).
    let node = |(i, rows): (usize, &mut [f64])| {
        let z = fine.z_m[i];
        // The coarse element holding z: the last one whose bottom node is below z.
        let e = coarse.z_m[1..n_coarse]
            .partition_point(|&zc| zc < z)
            .min(n_coarse - 1);
        let s = (z - coarse.z_m[e]).clamp(0.0, coarse.elements[e].length_m);
        let (nw, nt) = coarse.elements[e].shapes(&coarse.element_data[e], s);
        for c in 0..width {
            let (mut w, mut t) = (0.0, 0.0);
            for k in 0..6 {
                let u = vectors.get(4 * e + k, c);
                w += nw[k] * u;
                t += nt[k] * u;
            }
            rows[c] = w;
            rows[width + c] = t;
        }
    };
    let chunk = 4 * width;
    if fine.z_m.len() > PARALLEL_NODES {
        out.data.par_chunks_mut(chunk).enumerate().for_each(node);
    } else {
        out.data.chunks_mut(chunk).enumerate().for_each(node);
    }
    out
}
