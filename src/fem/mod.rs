//! Finite-element beam model of a stage and its exact, O(N) eigen-solver.
//!
//! * [`element`]: tapered Timoshenko / Euler-Bernoulli element with exact static
//!   flexibility, stiffness and consistent mass.
//! * [`model`]: mesh and assembly of one stage (banded K and M, point masses, base springs).
//! * [`compliance_fit`]: compliance integrals of nearly uniform elements from a few samples.
//! * [`flexibility`]: K^-1 applied exactly by the statically-determinate recursion.
//! * [`operator`]: the same recursion fused with the mass product (two sweeps, two cores on
//!   fine meshes), the operator the eigen-solver applies.
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
pub use subspace::{lowest_modes, lowest_modes_from, Solution, SturmCount};

/// Why the eigen-solver refused to report modes (never wrong numbers instead).
#[derive(Debug, Error, Clone, PartialEq)]
pub enum SolverError {
    /// More modes were asked for than the mesh has free dofs.
    #[error("{modes} modes requested but the mesh has only {dofs} free degrees of freedom; use more elements")]
    TooFewDofs { modes: usize, dofs: usize },
    /// Subspace iteration did not converge.
    #[error("eigen-solver did not converge in {iterations} iterations; the inputs that do this are extreme ratios: the thinnest shell.stations wall_m against its diameter, a point_mass mass_kg far above the shell's mass, base springs far softer or stiffer than the shell, a small stage stiffness_factor")]
    NoConvergence { iterations: usize },
    /// The iteration basis became linearly dependent (Rayleigh-Ritz mass not positive).
    #[error("eigen-solver lost its basis (projected mass matrix not positive definite): masses or stiffnesses span too many decades; the inputs that do this are extreme ratios: the thinnest shell.stations wall_m against its diameter, a point_mass mass_kg far above the shell's mass, base springs far softer or stiffer than the shell, a small stage stiffness_factor")]
    LostBasis,
    /// A non-positive or non-finite eigenvalue appeared.
    #[error("eigen-solver found a non-positive or non-finite eigenvalue at iteration {iteration}; the inputs that do this are extreme ratios: the thinnest shell.stations wall_m against its diameter, a point_mass mass_kg far above the shell's mass, base springs far softer or stiffer than the shell, a small stage stiffness_factor")]
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

/// Width of the fine-mesh block (and the number of coarse modes that start it): the wanted
/// modes and at least one guard, rounded up to whole four-lane chunks for the kernels.
pub fn fine_block_width(modes: usize) -> usize {
    (modes + 2).div_ceil(4) * 4
}

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
    let wanted = fine_block_width(modes);
    let coarse = BeamModel::build(case, stage, Some(COARSE_ELEMENTS), wanted);
    let coarse_solution = lowest_modes(&coarse, wanted)?;
    // The coarse eigenvalues agree with the fine ones to far better than their gaps, so
    // the Sturm count of the fine model can run on another core at a shift placed from
    // them while the fine iteration runs; `verify` recounts if the shift turns out not to
    // separate the fine eigenvalues.
    let (lower, upper) = (
        coarse_solution.eigenvalues[modes - 1],
        coarse_solution.eigenvalues[modes],
    );
    let shift = (lower * upper).sqrt();
    // The count runs in constant memory on a thread of its own; the iteration stays on the
    // calling thread, whose allocator arena then keeps (and hands to the next solve) the
    // big work blocks. In a rayon join both halves would run on pool threads, and the
    // blocks of successive solves would be spread over several arenas.
    let (converged, count) = std::thread::scope(|scope| {
        let counter = scope.spawn(|| fine.stiffness.negative_pivots_shifted(shift, &fine.mass));
        let start = interpolate_modes(&coarse, &coarse_solution.vectors, &fine);
        let converged = subspace::iterate(&fine, modes, start);
        let count = counter
            .join()
            .unwrap_or_else(|e| std::panic::resume_unwind(e));
        (converged, count)
    });
    let solution = subspace::verify(&fine, modes, converged?, Some(SturmCount { shift, count }))?;
    Ok((fine, solution))
}

/// Evaluates the coarse model's vectors at the fine model's nodes with the coarse elements'
/// exact shapes (fine bubbles start at zero). `coarse` and `fine` must be meshes of the same
/// stage of the same case (as in [`solve_stage`]); they are only start vectors, so a
/// mismatch would cost iterations, not accuracy.
///
/// The shapes at s need the compliance integrals of the coarse element over [0, s]. Both
/// meshes have nodes on every station, so each fine element inside a coarse one has the same
/// (linear) section data and its own integrals are a piece of the coarse ones: walking up the
/// fine nodes of a coarse element, the integrals grow by each fine element's, shifted to the
/// coarse element's origin ([`element::Compliance::extended`]). Only the first piece of each
/// coarse element is integrated afresh. Coarse elements are independent, so large meshes
/// use all cores.
pub fn interpolate_modes(coarse: &BeamModel, vectors: &Block, fine: &BeamModel) -> Block {
    let width = vectors.width;
    let mut out = Block::zeros(fine.dofs(), width);
    if width == 0 {
        return out;
    }
    let n_coarse = coarse.elements.len();
    let n_nodes = fine.z_m.len();
    // Fine nodes with z_E <= z < z_(E+1) belong to coarse element E; the top node to the last.
    let first_node = |e: usize| match e {
        0 => 0,
        e if e >= n_coarse => n_nodes,
        e => fine.z_m.partition_point(|&z| z < coarse.z_m[e]),
    };
    // Node i owns rows 4i..4i + 4 (w, theta and the bubbles of element i, left at zero); the
    // top node has only its w and theta rows.
    let mut pieces = Vec::with_capacity(n_coarse);
    let mut rest = &mut out.data[..];
    let mut row_end_prev = 0;
    for e in 0..n_coarse {
        let (start, end) = (first_node(e), first_node(e + 1));
        let row_end = (4 * end).min(fine.dofs());
        let (piece, tail) = rest.split_at_mut((row_end - row_end_prev) * width);
        pieces.push((e, start..end, piece));
        rest = tail;
        row_end_prev = row_end;
    }
    let fill = |(e, nodes, piece): (usize, std::ops::Range<usize>, &mut [f64])| {
        let el = &coarse.elements[e];
        let data = &coarse.element_data[e];
        let r = el.end_load_map();
        let base = coarse.z_m[e];
        let mut previous: Option<(f64, element::Compliance)> = None;
        for (k, j) in nodes.enumerate() {
            let s = (fine.z_m[j] - base).clamp(0.0, el.length_m);
            let c = match previous {
                None => element::Element::compliance_to(data, s),
                Some((s_prev, c_prev)) => c_prev.extended(s_prev, &fine.elements[j - 1].compliance),
            };
            previous = Some((s, c));
            let (nw, nt) = el.shapes_with(c, s, &r);
            let rows = &mut piece[4 * k * width..(4 * k + 2) * width];
            for col in 0..width {
                let (mut w, mut t) = (0.0, 0.0);
                for i in 0..6 {
                    let u = vectors.get(4 * e + i, col);
                    w += nw[i] * u;
                    t += nt[i] * u;
                }
                rows[col] = w;
                rows[width + col] = t;
            }
        }
    };
    if n_nodes > PARALLEL_NODES {
        pieces.into_par_iter().for_each(fill);
    } else {
        pieces.into_iter().for_each(fill);
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn interpolation_by_extended_compliance_matches_direct_shapes() {
        // The reference is each coarse element's exact shapes evaluated directly (its own
        // Gauss rules over [0, s]) at every fine node.
        let case = crate::input::demo_case();
        for stage in &case.stages {
            let coarse = BeamModel::build(&case, stage, Some(30), 3);
            let fine = BeamModel::build(&case, stage, Some(1234), 3);
            let width = 3;
            let mut vectors = Block::zeros(coarse.dofs(), width);
            for (i, v) in vectors.data.iter_mut().enumerate() {
                *v = ((i * 7919 % 1000) as f64 / 500.0 - 1.0) * 1e-3;
            }
            let out = interpolate_modes(&coarse, &vectors, &fine);
            let n_coarse = coarse.elements.len();
            let mut largest = 0.0f64;
            let mut worst = 0.0f64;
            for (i, &z) in fine.z_m.iter().enumerate() {
                let e = coarse.z_m[1..n_coarse]
                    .partition_point(|&zc| zc <= z)
                    .min(n_coarse - 1);
                let s = (z - coarse.z_m[e]).clamp(0.0, coarse.elements[e].length_m);
                let (nw, nt) = coarse.elements[e].shapes(&coarse.element_data[e], s);
                for c in 0..width {
                    let (mut w, mut t) = (0.0, 0.0);
                    for k in 0..6 {
                        w += nw[k] * vectors.get(4 * e + k, c);
                        t += nt[k] * vectors.get(4 * e + k, c);
                    }
                    largest = largest.max(w.abs());
                    worst = worst.max((out.get(4 * i, c) - w).abs());
                    worst =
                        worst.max((out.get(4 * i + 1, c) - t).abs() * coarse.elements[e].length_m);
                }
            }
            assert!(
                worst <= 1e-12 * largest,
                "stage {}: {worst:e} vs {largest:e}",
                stage.name
            );
        }
    }
}
