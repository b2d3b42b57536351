//! Lowest eigenpairs of K phi = omega^2 M phi by subspace iteration on K^-1 M (Bathe,
//! Finite Element Procedures, 1996, sec. 11.6), with K^-1 applied exactly by the
//! flexibility recursion, a Rayleigh-Ritz step on the projected pencil each iteration, and a
//! Sturm-sequence count proving that no mode below the last reported one was skipped.
//!
//! The projected stiffness is formed as Y^T (M X) with Y = K^-1 M X, so K itself is never
//! used in a product: every operation adds quantities of like magnitude.

use nalgebra::{DMatrix, DVector};

use super::flexibility::apply_inverse_stiffness;
use super::model::BeamModel;
use super::SolverError;

/// Converged lowest eigenpairs of one beam model.
#[derive(Debug, Clone)]
pub struct Solution {
    /// Eigenvalues omega^2, (rad/s)^2, ascending.
    pub eigenvalues: Vec<f64>,
    /// Eigenvectors (all dofs x modes), M-orthonormal: phi^T M phi = I.
    pub vectors: DMatrix<f64>,
    /// Number of eigenvalues below `shift` from the Sturm count.
    pub sturm_count: usize,
    /// Shift used for the Sturm count, (rad/s)^2.
    pub shift: f64,
    /// Largest relative residual |K^-1 M phi - phi / omega^2|_M / |phi / omega^2|_M.
    pub max_relative_residual: f64,
    pub iterations: usize,
}

/// Relative change of the eigenvalues between iterations that counts as converged.
const TOLERANCE: f64 = 1e-12;
const MAX_ITERATIONS: usize = 300;

fn apply_operator(model: &BeamModel, x: &DMatrix<f64>, mx: &mut DMatrix<f64>, y: &mut DMatrix<f64>) {
    for j in 0..x.ncols() {
        model.mass.mul_vec(x.column(j).as_slice(), mx.column_mut(j).as_mut_slice());
        apply_inverse_stiffness(model, mx.column(j).as_slice(), y.column_mut(j).as_mut_slice());
    }
}

fn mass_product(model: &BeamModel, y: &DMatrix<f64>, my: &mut DMatrix<f64>) {
    for j in 0..y.ncols() {
        model.mass.mul_vec(y.column(j).as_slice(), my.column_mut(j).as_mut_slice());
    }
}

/// Solves the small pencil kr q = lambda mr q; returns ascending eigenvalues and mr-normalised
/// vectors.
fn projected_eigen(kr: DMatrix<f64>, mr: DMatrix<f64>) -> Result<(Vec<f64>, DMatrix<f64>), SolverError> {
    let p = kr.nrows();
    let chol = mr.cholesky().ok_or(SolverError::LostBasis)?;
    let l = chol.l();
    // C = L^-1 Kr L^-T.
    let linv_k = l.solve_lower_triangular(&kr).ok_or(SolverError::LostBasis)?;
    let c = l.solve_lower_triangular(&linv_k.transpose()).ok_or(SolverError::LostBasis)?;
    let c = 0.5 * (&c + c.transpose());
    let eig = c.symmetric_eigen();
    let mut order: Vec<usize> = (0..p).collect();
    order.sort_by(|&a, &b| eig.eigenvalues[a].total_cmp(&eig.eigenvalues[b]));
    let values: Vec<f64> = order.iter().map(|&i| eig.eigenvalues[i]).collect();
    let mut v = DMatrix::zeros(p, p);
    for (k, &i) in order.iter().enumerate() {
        v.set_column(k, &eig.eigenvectors.column(i));
    }
    // Q = L^-T V.
    let q = l.transpose().solve_upper_triangular(&v).ok_or(SolverError::LostBasis)?;
    Ok((values, q))
}

/// Deterministic start vectors: a uniform translation, then smooth shapes of growing
/// wavenumber plus a small hash-based perturbation so no start vector is M-orthogonal to a
/// wanted mode.
fn start_vectors(model: &BeamModel, p: usize) -> DMatrix<f64> {
    let n = model.dofs();
    let height = *model.z_m.last().unwrap_or(&1.0);
    let mut x = DMatrix::zeros(n, p);
    for j in 0..p {
        for (i, z) in model.z_m.iter().enumerate() {
            let s = z / height;
            let mut hash = (i as u64 + 1).wrapping_mul(0x9E37_79B9_7F4A_7C15) ^ (j as u64 + 7).wrapping_mul(0xC2B2_AE3D_27D4_EB4F);
            hash ^= hash >> 29;
            let noise = (hash % 10_000) as f64 / 10_000.0 - 0.5;
            let smooth = if j == 0 { s } else { (std::f64::consts::PI * (j as f64) * s).sin() * s };
            x[(4 * i, j)] = smooth + 0.05 * noise;
            x[(4 * i + 1, j)] = 0.01 * noise;
        }
        for d in 0..2 {
            if !model.is_free(d) {
                x[(d, j)] = 0.0;
            }
        }
    }
    x
}

/// The lowest `n` eigenpairs of the model.
pub fn lowest_modes(model: &BeamModel, n: usize) -> Result<Solution, SolverError> {
    let free = model.free_dofs();
    if n == 0 || n >= free {
        return Err(SolverError::TooFewDofs { modes: n, dofs: free });
    }
    let p = (2 * n).max(n + 8).min(free);
    let dofs = model.dofs();
    let mut x = start_vectors(model, p);
    let mut mx = DMatrix::zeros(dofs, p);
    let mut y = DMatrix::zeros(dofs, p);
    let mut my = DMatrix::zeros(dofs, p);
    let mut previous: Vec<f64> = vec![f64::INFINITY; p];
    let guard = (n + 1).min(p);
    let mut iterations = 0;
    let values = loop {
        iterations += 1;
        apply_operator(model, &x, &mut mx, &mut y);
        mass_product(model, &y, &mut my);
        let kr = y.tr_mul(&mx);
        let kr = 0.5 * (&kr + kr.transpose());
        let mr = y.tr_mul(&my);
        let mr = 0.5 * (&mr + mr.transpose());
        let (vals, q) = projected_eigen(kr, mr)?;
        if vals.iter().any(|v| !v.is_finite() || *v <= 0.0) {
            return Err(SolverError::NotPositive { iteration: iterations });
        }
        x = &y * &q;
        let converged = (0..n).all(|i| ((vals[i] - previous[i]) / vals[i]).abs() < TOLERANCE)
            && (guard == n || ((vals[guard - 1] - previous[guard - 1]) / vals[guard - 1]).abs() < 1e-6);
        if converged {
            break vals;
        }
        previous = vals;
        if iterations >= MAX_ITERATIONS {
            return Err(SolverError::NoConvergence { iterations });
        }
    };
    // Residuals in the flexibility form, which is exact: r = K^-1 M phi - phi / lambda.
    let phi = x.columns(0, n).into_owned();
    let mut mphi = DMatrix::zeros(dofs, n);
    let mut kinv = DMatrix::zeros(dofs, n);
    apply_operator(model, &phi, &mut mphi, &mut kinv);
    let mut max_residual: f64 = 0.0;
    for i in 0..n {
        let scaled = phi.column(i) / values[i];
        let r: DVector<f64> = kinv.column(i) - &scaled;
        let mut mr = vec![0.0; dofs];
        model.mass.mul_vec(r.as_slice(), &mut mr);
        let r_norm = r.dot(&DVector::from_vec(mr)).max(0.0).sqrt();
        let s_norm = phi.column(i).dot(&mphi.column(i)).sqrt() / values[i];
        max_residual = max_residual.max(r_norm / s_norm);
    }
    // Sturm count at a shift between the last wanted and the next eigenvalue.
    let next = if p > n { values[n] } else { 2.0 * values[n - 1] };
    let shift = (values[n - 1] * next).sqrt();
    let sturm_count = model.stiffness.shifted(shift, &model.mass).negative_pivots();
    if sturm_count != n {
        return Err(SolverError::Incomplete {
            expected: n,
            counted: sturm_count,
            shift,
        });
    }
    if max_residual > 1e-6 {
        return Err(SolverError::Residual { residual: max_residual });
    }
    Ok(Solution {
        eigenvalues: values[..n].to_vec(),
        vectors: phi,
        sturm_count,
        shift,
        max_relative_residual: max_residual,
        iterations,
    })
}
