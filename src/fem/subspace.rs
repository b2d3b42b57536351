//! Lowest eigenpairs of K phi = omega^2 M phi by subspace iteration on K^-1 M (Bathe,
//! Finite Element Procedures, 1996, sec. 11.6), with K^-1 applied exactly by the
//! flexibility recursion, and a Sturm-sequence count proving that no mode below the last
//! reported one was skipped.
//!
//! One cycle applies K^-1 M twice and then takes one Rayleigh-Ritz step on the projected
//! pencil: the applications cost O(N p) and square the convergence ratio
//! lambda_i / lambda_(p+1) per cycle, the projections cost O(N p^2). The projected stiffness
//! is formed as Y^T (M Z) with Y = K^-1 M Z, so K itself is never used in a product: every
//! operation adds quantities of like magnitude.
//!
//! Stopping: the first application of a cycle, Z = K^-1 M X, also gives the exact residual
//! of the previous Ritz pairs, |Z - X / lambda|_M (no extra operator application), and the
//! iteration stops when every wanted mode is below 1e-7 relative (its eigenvalue is then
//! accurate to ~1e-14) and the guard mode below 1e-4.
//!
//! Fine meshes start from the modes of a coarse mesh of the same stage interpolated onto the
//! fine nodes (see [`lowest_modes_from`]): the interpolation error is almost entirely
//! high-wavenumber, which one application of K^-1 M removes, so one or two fine cycles
//! suffice and the cost stays O(N).

use nalgebra::DMatrix;

use super::block::{band_times_block, Block};
use super::model::BeamModel;
use super::operator::{apply_and_mass, ResidualSums};
use super::SolverError;

/// Converged lowest eigenpairs of one beam model.
#[derive(Debug, Clone)]
pub struct Solution {
    /// Eigenvalues omega^2, (rad/s)^2, ascending.
    pub eigenvalues: Vec<f64>,
    /// Eigenvectors (all dofs x modes, dof-major), M-orthonormal: phi^T M phi = I.
    pub vectors: Block,
    /// Number of eigenvalues below `shift` from the Sturm count.
    pub sturm_count: usize,
    /// Shift used for the Sturm count, (rad/s)^2.
    pub shift: f64,
    /// Largest relative residual |K^-1 M phi - phi / omega^2|_M / |phi / omega^2|_M.
    pub max_relative_residual: f64,
    pub iterations: usize,
}

/// Rayleigh-Ritz cycles before the solver gives up (each applies K^-1 M twice, so this is
/// 300 operator applications). Ordinary stacks need 5 to 12 from generic start vectors.
const MAX_ITERATIONS: usize = 150;
/// Relative residual every wanted mode must reach before iteration stops. The eigenvalue
/// error is then ~ its square over the relative gap (~1e-14), and the mode shape error
/// ~1e-7, both far below the discretisation error of any practical mesh.
const VECTOR_TOLERANCE: f64 = 1e-7;
/// Relative residual the guard mode (the one above the last wanted) must reach: it only
/// places the Sturm shift, and its eigenvalue error is ~ the square of this.
const GUARD_TOLERANCE: f64 = 1e-4;

/// Solves the small pencil kr q = lambda mr q; returns ascending eigenvalues and mr-normalised
/// vectors.
fn projected_eigen(
    kr: DMatrix<f64>,
    mr: DMatrix<f64>,
) -> Result<(Vec<f64>, DMatrix<f64>), SolverError> {
    let p = kr.nrows();
    // Scale the basis to unit M-norm first (symmetric diagonal scaling of the pencil; the
    // subspace and so the Ritz pairs are unchanged). K^-1 M shrinks each direction by its
    // eigenvalue, so when the spectrum spans many decades (huge point masses, a very soft
    // base spring) the unscaled mr has a condition number ~ (lambda_p / lambda_1)^2 that
    // makes its Cholesky factorisation fail although the basis is well conditioned.
    let scale: Vec<f64> = (0..p).map(|i| 1.0 / mr[(i, i)].sqrt()).collect();
    if scale.iter().any(|s| !s.is_finite() || *s <= 0.0) {
        return Err(SolverError::LostBasis);
    }
    let kr = DMatrix::from_fn(p, p, |i, j| kr[(i, j)] * scale[i] * scale[j]);
    let mr = DMatrix::from_fn(p, p, |i, j| mr[(i, j)] * scale[i] * scale[j]);
    let chol = mr.cholesky().ok_or(SolverError::LostBasis)?;
    let l = chol.l();
    // C = L^-1 Kr L^-T.
    let linv_k = l
        .solve_lower_triangular(&kr)
        .ok_or(SolverError::LostBasis)?;
    let c = l
        .solve_lower_triangular(&linv_k.transpose())
        .ok_or(SolverError::LostBasis)?;
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
    let mut q = l
        .transpose()
        .solve_upper_triangular(&v)
        .ok_or(SolverError::LostBasis)?;
    for (i, s) in scale.iter().enumerate() {
        q.row_mut(i).scale_mut(*s);
    }
    Ok((values, q))
}

/// Modified Gram-Schmidt in the M inner product (two passes) on the columns of
/// Y = K^-1 M X, applying the same column operations to `my` (= M Y) and `mx` (= M X), so
/// Y = K^-1 (M X) still holds exactly and the projected stiffness stays Y^T (M X).
///
/// Why: K^-1 M scales each eigen-direction by 1 / lambda. When the spectrum spans many
/// decades (point masses 100 times the shell, a soft base spring) the columns of Y all lean
/// towards the lowest modes and the projected mass Y^T M Y becomes numerically singular,
/// although Y still holds the other directions to several digits; orthonormalising the
/// columns first recovers them. A column with less than ~1000 rounding units of its own
/// left is reported as a lost basis.
fn m_orthonormalize(y: &mut Block, my: &mut Block, mx: &mut Block) -> Result<(), SolverError> {
    let p = y.width;
    let dot = |a: &Block, i: usize, b: &Block, j: usize| -> f64 {
        (0..a.dofs).map(|r| a.get(r, i) * b.get(r, j)).sum()
    };
    let axpy = |blk: &mut Block, c: f64, i: usize, j: usize| {
        for r in 0..blk.dofs {
            let v = blk.get(r, j) - c * blk.get(r, i);
            blk.set(r, j, v);
        }
    };
    let scale = |blk: &mut Block, s: f64, j: usize| {
        for r in 0..blk.dofs {
            let v = blk.get(r, j) * s;
            blk.set(r, j, v);
        }
    };
    for j in 0..p {
        let original = dot(y, j, my, j).max(0.0).sqrt();
        for _pass in 0..2 {
            for i in 0..j {
                let c = dot(y, i, my, j);
                axpy(y, c, i, j);
                axpy(my, c, i, j);
                axpy(mx, c, i, j);
            }
        }
        let norm = dot(y, j, my, j).max(0.0).sqrt();
        if !(norm.is_finite() && norm > 1e-13 * original) {
            return Err(SolverError::LostBasis);
        }
        scale(y, 1.0 / norm, j);
        scale(my, 1.0 / norm, j);
        scale(mx, 1.0 / norm, j);
    }
    Ok(())
}

/// Deterministic start vectors: a uniform translation, then smooth shapes of growing
/// wavenumber plus a small hash-based perturbation so no start vector is M-orthogonal to a
/// wanted mode.
fn start_vectors(model: &BeamModel, p: usize) -> Block {
    let height = *model.z_m.last().unwrap_or(&1.0);
    let mut x = Block::zeros(model.dofs(), p);
    for j in 0..p {
        for (i, z) in model.z_m.iter().enumerate() {
            let s = z / height;
            let mut hash = (i as u64 + 1).wrapping_mul(0x9E37_79B9_7F4A_7C15)
                ^ (j as u64 + 7).wrapping_mul(0xC2B2_AE3D_27D4_EB4F);
            hash ^= hash >> 29;
            let noise = (hash % 10_000) as f64 / 10_000.0 - 0.5;
            let smooth = if j == 0 {
                s
            } else {
                (std::f64::consts::PI * (j as f64) * s).sin() * s
            };
            x.set(4 * i, j, smooth + 0.05 * noise);
            x.set(4 * i + 1, j, 0.01 * noise);
        }
    }
    clear_removed(model, &mut x);
    x
}

fn clear_removed(model: &BeamModel, x: &mut Block) {
    for d in 0..2 {
        if !model.is_free(d) {
            x.row_mut(d).fill(0.0);
        }
    }
}

/// Subspace width for n wanted modes: Bathe's min(2n, n + 8), and at least n + 3 so the
/// guard eigenvalue that places the Sturm shift is itself well converged. The beam spectrum
/// grows like k^4, so lambda_n / lambda_(p+1) is small and a narrow subspace converges in a
/// few iterations; each iteration costs ~p^2 per dof.
pub fn subspace_width(n: usize) -> usize {
    (2 * n).min(n + 8).max(n + 3)
}

/// The lowest `n` eigenpairs of the model, from generic start vectors.
pub fn lowest_modes(model: &BeamModel, n: usize) -> Result<Solution, SolverError> {
    let free = model.free_dofs();
    if n == 0 || n >= free {
        return Err(SolverError::TooFewDofs {
            modes: n,
            dofs: free,
        });
    }
    let p = subspace_width(n).min(free);
    lowest_modes_from(model, n, start_vectors(model, p))
}

/// The lowest `n` eigenpairs of the model, iterating from the given start block (width > n;
/// removed base dofs are cleared).
pub fn lowest_modes_from(model: &BeamModel, n: usize, x: Block) -> Result<Solution, SolverError> {
    let converged = iterate(model, n, x)?;
    verify(model, n, converged, None)
}

/// A Sturm count made before the solve finished: `count` eigenvalues lie below `shift`
/// (rad/s)^2.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SturmCount {
    pub shift: f64,
    pub count: usize,
}

/// Converged Ritz pairs (all p of them), not yet checked for completeness.
#[derive(Debug, Clone)]
pub struct Converged {
    values: Vec<f64>,
    x: Block,
    max_residual: f64,
    iterations: usize,
}

/// The completeness check and the result. `counted` is a Sturm count made independently (at
/// a shift placed from a coarser model, on another core); it is used when its shift lies
/// clearly between the last wanted and the guard Ritz value, else the count is made here at
/// their geometric mean.
pub fn verify(
    model: &BeamModel,
    n: usize,
    converged: Converged,
    counted: Option<SturmCount>,
) -> Result<Solution, SolverError> {
    let Converged {
        values,
        x,
        max_residual,
        iterations,
    } = converged;
    let phi = x.into_leading(n);
    // The guard value is accurate to ~GUARD_TOLERANCE^2, the wanted ones far better.
    let inside = |s: f64| values[n - 1] * (1.0 + 1e-6) < s && s < values[n] * (1.0 - 1e-6);
    let SturmCount {
        shift,
        count: sturm_count,
    } = match counted {
        Some(c) if inside(c.shift) => c,
        _ => {
            // Sturm count at a shift between the last wanted and the next eigenvalue.
            let shift = (values[n - 1] * values[n]).sqrt();
            SturmCount {
                shift,
                count: model.stiffness.negative_pivots_shifted(shift, &model.mass),
            }
        }
    };
    if sturm_count != n {
        return Err(SolverError::Incomplete {
            expected: n,
            counted: sturm_count,
            shift,
        });
    }
    if max_residual > 1e-6 {
        return Err(SolverError::Residual {
            residual: max_residual,
        });
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

/// Subspace iteration from the start block `x` (width > n; removed base dofs are cleared)
/// until the n wanted Ritz pairs and the guard have converged.
pub fn iterate(model: &BeamModel, n: usize, mut x: Block) -> Result<Converged, SolverError> {
    let free = model.free_dofs();
    if n == 0 || n >= free || x.width <= n || x.width > free {
        return Err(SolverError::TooFewDofs {
            modes: n,
            dofs: free,
        });
    }
    clear_removed(model, &mut x);
    let p = x.width;
    let dofs = model.dofs();
    let mut mx = Block::zeros(dofs, p);
    // `w` holds Z = K^-1 (M X) and then, overwritten, Y = K^-1 (M Z): five blocks in all,
    // which matters on fine meshes where each block is several megabytes.
    let mut w = Block::zeros(dofs, p);
    let mut mz = Block::zeros(dofs, p);
    let mut my = Block::zeros(dofs, p);
    // Ritz values of the current x (None while x is still the start block).
    let mut ritz: Option<Vec<f64>> = None;
    let checked = n + 1;
    let mut iterations = 0;
    band_times_block(&model.mass, &x, &mut mx);
    let (values, max_residual) = loop {
        // Each cycle applies K^-1 M twice before one Rayleigh-Ritz step: the spectrum ratio
        // lambda_i / lambda_(p+1) is squared per cycle for one more O(N p) application,
        // while the projections cost O(N p^2).
        let from_ritz = ritz.is_some();
        if let Some(values) = ritz.take() {
            let mut sums = ResidualSums::new(&x, &mx, &values[..checked]);
            apply_and_mass(model, &mx, &mut w, &mut mz, Some(&mut sums));
            let residuals = sums.relative();
            let wanted = residuals[..n].iter().copied().fold(0.0, f64::max);
            if wanted < VECTOR_TOLERANCE && residuals[n] < GUARD_TOLERANCE {
                break (values, wanted);
            }
        } else {
            apply_and_mass(model, &mx, &mut w, &mut mz, None);
        }
        if iterations >= MAX_ITERATIONS {
            return Err(SolverError::NoConvergence { iterations });
        }
        iterations += 1;
        if from_ritz {
            apply_and_mass(model, &mz, &mut w, &mut my, None);
        } else {
            // From arbitrary start vectors a second application would let the lowest mode
            // swamp every column (by (lambda_p / lambda_1)^2); one Rayleigh-Ritz step first
            // turns the columns into near-eigenvectors, which K^-1 M only rescales. Here
            // Y = Z = K^-1 (M X), so M Y is the block just computed and the right-hand side
            // of the projection is M X.
            // (Swapped, not copied: M X is rewritten by the Ritz update below.)
            std::mem::swap(&mut my, &mut mz);
            std::mem::swap(&mut mz, &mut mx);
        }
        let y = &mut w;
        // Y = K^-1 (M Z), so Y^T (M Z) = Y^T K Y: the projected stiffness without K.
        let projected = |y: &Block, mz: &Block, my: &Block| {
            let (kr, mr) = y.gram_pair(mz, my);
            projected_eigen(kr, mr)
        };
        // The plain projection is enough for ordinary stacks; only when the spectrum spans so
        // many decades that the projected mass is numerically singular is the basis
        // M-orthonormalised first (it costs another pass over the block).
        let (vals, q) = match projected(y, &mz, &my) {
            Ok(r) => r,
            Err(SolverError::LostBasis) => {
                m_orthonormalize(y, &mut my, &mut mz)?;
                band_times_block(&model.mass, y, &mut my);
                projected(y, &mz, &my)?
            }
            Err(e) => return Err(e),
        };
        if vals.iter().any(|v| !v.is_finite() || *v <= 0.0) {
            return Err(SolverError::NotPositive {
                iteration: iterations,
            });
        }
        // X = Y Q and M X = (M Y) Q: a p x p product instead of a banded one.
        y.times_pair(&my, &q, &mut x, &mut mx);
        ritz = Some(vals);
    };
    Ok(Converged {
        values,
        x,
        max_residual,
        iterations,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn demo_model() -> BeamModel {
        let case = crate::input::demo_case();
        let stage = case.stages[1].clone();
        BeamModel::build(&case, &stage, Some(60), 4)
    }

    #[test]
    fn a_count_made_elsewhere_is_used_only_inside_the_gap() {
        let model = demo_model();
        let n = 4;
        let reference = lowest_modes(&model, n).expect("solve");
        let start = || start_vectors(&model, subspace_width(n));
        // A shift below the last wanted eigenvalue: ignored, the count is made afresh at the
        // geometric mean of the last wanted and the guard Ritz values.
        let outside = SturmCount {
            shift: 0.5 * reference.eigenvalues[n - 1],
            count: n - 1,
        };
        let s = verify(
            &model,
            n,
            iterate(&model, n, start()).unwrap(),
            Some(outside),
        )
        .unwrap();
        assert_eq!(s.sturm_count, n);
        assert_eq!(s.shift, reference.shift);
        // A shift inside the gap is used as given, and a wrong count there is reported.
        let inside = SturmCount {
            shift: reference.shift,
            count: n + 1,
        };
        let err = verify(
            &model,
            n,
            iterate(&model, n, start()).unwrap(),
            Some(inside),
        );
        assert!(matches!(err, Err(SolverError::Incomplete { counted, .. }) if counted == n + 1));
        let right = SturmCount {
            shift: reference.shift,
            count: model
                .stiffness
                .negative_pivots_shifted(reference.shift, &model.mass),
        };
        let s = verify(&model, n, iterate(&model, n, start()).unwrap(), Some(right)).unwrap();
        assert_eq!(s.eigenvalues, reference.eigenvalues);
    }
}
