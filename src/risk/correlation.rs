//! Rank correlations between `[[uncertain]]` inputs, sampled through a Gaussian copula so
//! that every sample stays a pure function of (seed, sample index) and shards stay
//! independent.
//!
//! For sample i the independent uniforms u_j (from [`super::rng`]) of the correlated inputs
//! become standard normals z_j = Phi^-1(u_j); z' = L z with L the Cholesky factor of the
//! normal-score correlation matrix R; u'_j = Phi(z'_j) is again uniform on (0, 1), and each
//! input's own (possibly truncated) quantile maps u'_j to its sample, so every marginal is
//! exactly as without correlation.
//!
//! The user gives Spearman's rank correlation rho_s. For a bivariate normal the Pearson
//! correlation that has rank correlation rho_s is R = 2 sin(pi rho_s / 6) (Pearson 1907, "On
//! further methods of determining correlation"; read in Headrick, "A note on the
//! relationship between the Pearson product-moment and the Spearman rank-based coefficients
//! of correlation", Open Journal of Statistics 6 (2016) 1025-1027, eq. (1); the inverse
//! rho_s = (6 / pi) asin(R / 2) is the large-sample limit of Moran's eq. (2) there). Ranks
//! do not change under the increasing maps Phi and F^-1, so the inputs' Spearman
//! correlation is rho_s exactly, whatever the (continuous) marginals.
//!
//! u'_j is rounded to the 53-bit grid of [`super::rng::bits_to_uniform`] (an error below
//! 2^-53 in probability), so the influence sums stay exact integers and shards merge
//! bit-identically. Inputs in no pair keep their uniforms untouched.
//!
//! Pure and unitless (correlations, probabilities).

use serde::{Deserialize, Serialize};

use super::distribution::{normal_cdf, normal_quantile};

/// The Pearson correlation of the normal scores that gives Spearman's `rho_s`:
/// 2 sin(pi rho_s / 6) (Pearson 1907, Headrick 2016 eq. (1)).
pub fn normal_score_correlation(rho_s: f64) -> f64 {
    2.0 * (std::f64::consts::PI * rho_s / 6.0).sin()
}

/// Spearman's rank correlation of a bivariate normal (or Gaussian copula) with Pearson
/// correlation `r`: (6 / pi) asin(r / 2), the inverse of [`normal_score_correlation`].
pub fn spearman_of_normal(r: f64) -> f64 {
    6.0 / std::f64::consts::PI * (r / 2.0).asin()
}

/// One validated pair: input indices (in `[[uncertain]]` order, a < b) and the target
/// Spearman coefficient, |rho_s| < 1.
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct RankPair {
    pub a: usize,
    pub b: usize,
    pub spearman: f64,
}

/// The pairs as read, with their keys, for the outputs.
#[derive(Debug, Clone, PartialEq, serde::Serialize, serde::Deserialize)]
pub struct CorrelationInfo {
    /// The two keys, in `[[uncertain]]` order.
    pub keys: [String; 2],
    /// Spearman's rank correlation as given.
    pub spearman: f64,
    /// The normal-score (Gaussian copula) correlation 2 sin(pi rho_s / 6) used.
    pub normal_score_correlation: f64,
}

/// Why the pairs cannot be sampled together.
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
pub enum CorrelationError {
    /// R is not positive definite: the Cholesky pivot of input `input` (index in
    /// `[[uncertain]]` order) is `pivot` <= 0, given the inputs before it.
    #[error(
        "the normal-score correlation matrix is not positive definite (Cholesky pivot \
         {pivot:.3e} at input {input})"
    )]
    NotPositiveDefinite { input: usize, pivot: f64 },
}

/// The Gaussian copula of a run: identity (no pairs) or the Cholesky factor over the
/// correlated inputs.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Copula {
    /// Indices (into the inputs) of the correlated inputs, increasing.
    members: Vec<usize>,
    /// Lower-triangular Cholesky factor of R over `members`, row-major, m x m.
    lower: Vec<f64>,
    /// Per member row: whether the row has an off-diagonal entry (otherwise z' = z and the
    /// uniform is kept as drawn).
    mixes: Vec<bool>,
}

/// Smallest accepted Cholesky pivot (squared diagonal): below it R is singular to rounding
/// and the copula would be degenerate.
const MIN_PIVOT: f64 = 1e-10;

impl Copula {
    /// From validated pairs. Pairs are assumed distinct, a != b, indices in range and
    /// |rho_s| < 1 (the reader checks); R must be positive definite.
    pub fn new(pairs: &[RankPair]) -> Result<Copula, CorrelationError> {
        let mut members: Vec<usize> = pairs.iter().flat_map(|p| [p.a, p.b]).collect();
        members.sort_unstable();
        members.dedup();
        let m = members.len();
        let pos = |i: usize| members.iter().position(|&x| x == i).unwrap_or(0);
        let mut r = vec![0.0; m * m];
        for k in 0..m {
            r[k * m + k] = 1.0;
        }
        for p in pairs {
            let (i, j) = (pos(p.a), pos(p.b));
            let v = normal_score_correlation(p.spearman);
            r[i * m + j] = v;
            r[j * m + i] = v;
        }
        let lower =
            cholesky(&r, m).map_err(|(k, pivot)| CorrelationError::NotPositiveDefinite {
                input: members[k],
                pivot,
            })?;
        let mixes = (0..m)
            .map(|i| (0..i).any(|j| lower[i * m + j] != 0.0))
            .collect();
        Ok(Copula {
            members,
            lower,
            mixes,
        })
    }

    /// Whether any input is correlated.
    pub fn is_identity(&self) -> bool {
        self.members.is_empty()
    }

    /// Turns the independent 53-bit uniforms of one sample (one per input) into the
    /// correlated ones, in place.
    #[inline]
    pub fn apply(&self, bits: &mut [u64]) {
        let m = self.members.len();
        if m == 0 {
            return;
        }
        // At most 64 inputs ([[uncertain]] limit): a stack buffer, no allocation per sample.
        let mut z = [0.0f64; 64];
        for (k, &i) in self.members.iter().enumerate() {
            z[k] = normal_quantile(super::rng::bits_to_uniform(bits[i]));
        }
        for (k, &i) in self.members.iter().enumerate() {
            if !self.mixes[k] {
                continue;
            }
            let row = &self.lower[k * m..k * m + k + 1];
            let zk: f64 = row.iter().zip(&z[..=k]).map(|(l, x)| l * x).sum();
            bits[i] = to_bits(normal_cdf(zk));
        }
    }
}

/// The 53-bit integer b whose uniform (b + 1/2) 2^-53 is nearest below-or-at p.
#[inline]
fn to_bits(p: f64) -> u64 {
    const TOP: u64 = (1u64 << 53) - 1;
    let x = (p * 9_007_199_254_740_992.0).floor();
    if x.is_nan() || x <= 0.0 {
        0
    } else if x >= TOP as f64 {
        TOP
    } else {
        x as u64
    }
}

/// Cholesky factor of the symmetric m x m matrix `a` (row-major): L with L L^T = a, or the
/// row and pivot where it fails (pivot <= [`MIN_PIVOT`]).
fn cholesky(a: &[f64], m: usize) -> Result<Vec<f64>, (usize, f64)> {
    let mut l = vec![0.0; m * m];
    for i in 0..m {
        for j in 0..=i {
            let s: f64 = (0..j).map(|k| l[i * m + k] * l[j * m + k]).sum();
            if i == j {
                let d = a[i * m + i] - s;
                if d.is_nan() || d <= MIN_PIVOT {
                    return Err((i, d));
                }
                l[i * m + i] = d.sqrt();
            } else {
                l[i * m + j] = (a[i * m + j] - s) / l[j * m + j];
            }
        }
    }
    Ok(l)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn conversion_and_inverse_agree_and_fix_the_ends() {
        // Closed form: R(0) = 0, R(+-1) = 2 sin(+-pi/6) = +-1 (Pearson 1907).
        assert_eq!(normal_score_correlation(0.0), 0.0);
        assert!((normal_score_correlation(1.0) - 1.0).abs() < 1e-15);
        assert!((normal_score_correlation(-1.0) + 1.0).abs() < 1e-15);
        for rho in [-0.95, -0.5, -0.3, 0.1, 0.4, 0.8, 0.99] {
            let r = normal_score_correlation(rho);
            assert!(r.abs() >= rho.abs() - 1e-15, "|R| >= |rho_s| for a normal");
            assert!((spearman_of_normal(r) - rho).abs() < 1e-14);
        }
    }

    #[test]
    fn cholesky_reproduces_the_matrix_and_refuses_non_positive_definite() {
        let pairs = [
            RankPair {
                a: 0,
                b: 2,
                spearman: 0.5,
            },
            RankPair {
                a: 2,
                b: 3,
                spearman: -0.3,
            },
        ];
        let c = Copula::new(&pairs).unwrap();
        assert_eq!(c.members, vec![0, 2, 3]);
        let m = 3;
        let mut llt = [0.0; 9];
        for i in 0..m {
            for j in 0..m {
                llt[i * m + j] = (0..m)
                    .map(|k| c.lower[i * m + k] * c.lower[j * m + k])
                    .sum();
            }
        }
        let r02 = normal_score_correlation(0.5);
        let r23 = normal_score_correlation(-0.3);
        #[rustfmt::skip]
        let want = [
            1.0, r02, 0.0,
            r02, 1.0, r23,
            0.0, r23, 1.0,
        ];
        for (g, w) in llt.iter().zip(want) {
            assert!((g - w).abs() < 1e-15, "{g} vs {w}");
        }
        // Three inputs pairwise +0.9, +0.9, -0.9 cannot coexist: R has a negative eigenvalue.
        let bad = [
            RankPair {
                a: 0,
                b: 1,
                spearman: 0.9,
            },
            RankPair {
                a: 1,
                b: 2,
                spearman: 0.9,
            },
            RankPair {
                a: 0,
                b: 2,
                spearman: -0.9,
            },
        ];
        let e = Copula::new(&bad).unwrap_err();
        assert!(matches!(
            e,
            CorrelationError::NotPositiveDefinite { input: 2, .. }
        ));
    }

    #[test]
    fn uncorrelated_inputs_and_identity_rows_keep_their_bits() {
        let c = Copula::new(&[RankPair {
            a: 1,
            b: 3,
            spearman: 0.6,
        }])
        .unwrap();
        let before = [11u64, 1 << 52, 77, 3 << 50, 5];
        let mut bits = before;
        c.apply(&mut bits);
        assert_eq!(bits[0], before[0]);
        assert_eq!(bits[1], before[1], "first member: z' = z");
        assert_eq!(bits[2], before[2]);
        assert_ne!(bits[3], before[3]);
        assert_eq!(bits[4], before[4]);
        let mut same = before;
        Copula::default().apply(&mut same);
        assert_eq!(same, before);
        assert_eq!(to_bits(0.0), 0);
        assert_eq!(to_bits(1.0), (1 << 53) - 1);
        assert_eq!(to_bits(0.5), 1 << 52);
    }
}
