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
pub mod element;
pub mod flexibility;
pub mod gauss;
pub mod model;
pub mod subspace;

use thiserror::Error;

pub use model::BeamModel;
pub use subspace::{lowest_modes, Solution};

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
    Incomplete { expected: usize, counted: usize, shift: f64 },
    /// The converged modes do not satisfy the eigen-equation.
    #[error("eigen-solver residual {residual:.3e} too large")]
    Residual { residual: f64 },
}
