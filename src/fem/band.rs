//! Symmetric banded matrices with half-bandwidth 5 (per element the dofs w_a, theta_a, q1,
//! q2, w_b, theta_b are contiguous): the product with a vector and the Sturm count of an LDL^T factorisation.

/// Half-bandwidth (number of super-diagonals) of a two-dof-per-node beam matrix.
pub const HALF_BAND: usize = 5;

/// A symmetric band matrix: `rows[i][k]` = A[i][i + k], k = 0..=HALF_BAND.
#[derive(Debug, Clone, PartialEq)]
pub struct SymBand {
    rows: Vec<[f64; HALF_BAND + 1]>,
}

impl SymBand {
    pub fn zeros(n: usize) -> Self {
        SymBand {
            rows: vec![[0.0; HALF_BAND + 1]; n],
        }
    }

    pub fn dim(&self) -> usize {
        self.rows.len()
    }

    /// All rows of the upper band, for assembly in place.
    pub(crate) fn rows_mut(&mut self) -> &mut [[f64; HALF_BAND + 1]] {
        &mut self.rows
    }

    /// Row i of the upper band: A[i][i + k], k = 0..=HALF_BAND.
    pub fn row(&self, i: usize) -> &[f64; HALF_BAND + 1] {
        &self.rows[i]
    }

    /// `A[i][j]` (any order of i, j).
    pub fn get(&self, i: usize, j: usize) -> f64 {
        let (lo, hi) = if i <= j { (i, j) } else { (j, i) };
        if hi - lo > HALF_BAND {
            0.0
        } else {
            self.rows[lo][hi - lo]
        }
    }

    /// Adds v to `A[i][j]` and `A[j][i]` (one stored entry), `|i - j| <= HALF_BAND`.
    #[track_caller]
    pub fn add(&mut self, i: usize, j: usize, v: f64) {
        let (lo, hi) = if i <= j { (i, j) } else { (j, i) };
        assert!(hi - lo <= HALF_BAND, "entry ({i}, {j}) outside the band");
        self.rows[lo][hi - lo] += v;
    }

    /// Replaces row and column i by those of the identity (a removed dof).
    pub fn set_identity_row(&mut self, i: usize) {
        self.rows[i] = [0.0; HALF_BAND + 1];
        self.rows[i][0] = 1.0;
        for k in 1..=HALF_BAND.min(i) {
            self.rows[i - k][k] = 0.0;
        }
    }

    /// y = A x.
    #[track_caller]
    pub fn mul_vec(&self, x: &[f64], y: &mut [f64]) {
        let n = self.rows.len();
        assert!(x.len() == n && y.len() == n);
        y.fill(0.0);
        for i in 0..n {
            let r = &self.rows[i];
            let mut acc = r[0] * x[i];
            for k in 1..=HALF_BAND {
                if i + k < n {
                    acc += r[k] * x[i + k];
                    y[i + k] += r[k] * x[i];
                }
            }
            y[i] += acc;
        }
    }

    /// Returns `self - sigma * other` (same band).
    pub fn shifted(&self, sigma: f64, other: &SymBand) -> SymBand {
        let rows = self
            .rows
            .iter()
            .zip(&other.rows)
            .map(|(a, b)| {
                let mut r = *a;
                for k in 0..=HALF_BAND {
                    r[k] -= sigma * b[k];
                }
                r
            })
            .collect();
        SymBand { rows }
    }

    /// Number of negative pivots of A = L D L^T (no pivoting). By Sylvester's law of
    /// inertia this is the number of negative eigenvalues of A; for A = K - sigma M it is the
    /// number of eigenvalues of (K, M) below sigma (Sturm sequence property). A zero pivot is
    /// replaced by a tiny positive one (sigma moved infinitesimally).
    pub fn negative_pivots(&self) -> usize {
        negative_pivots_of(self.rows.len(), |j| self.rows[j])
    }

    /// [`Self::negative_pivots`] of `self - sigma * other`, without forming the shifted
    /// matrix.
    pub fn negative_pivots_shifted(&self, sigma: f64, other: &SymBand) -> usize {
        assert_eq!(self.dim(), other.dim());
        negative_pivots_of(self.rows.len(), |j| {
            let mut r = self.rows[j];
            for (v, m) in r.iter_mut().zip(&other.rows[j]) {
                *v -= sigma * m;
            }
            r
        })
    }
}

/// Rows of L and pivots kept at once: column j of the factorisation reads rows j..=j +
/// HALF_BAND of L and the last HALF_BAND pivots, so a ring of 8 suffices and the count runs
/// in constant memory.
const RING: usize = 8;

/// LDL^T pivot signs of the band matrix whose upper row j is `row(j)`.
fn negative_pivots_of(n: usize, row: impl Fn(usize) -> [f64; HALF_BAND + 1]) -> usize {
    // l[i % RING][k] = L[i][i - k], k = 1..=HALF_BAND; d[i % RING] = D[i].
    let mut l = [[0.0f64; HALF_BAND + 1]; RING];
    let mut d = [0.0f64; RING];
    let mut negatives = 0;
    for j in 0..n {
        let rj = row(j);
        let mut dj = rj[0];
        for k in 1..=HALF_BAND.min(j) {
            dj -= l[j % RING][k] * l[j % RING][k] * d[(j - k) % RING];
        }
        if dj == 0.0 {
            dj = f64::MIN_POSITIVE * (1.0 + rj[0].abs());
        }
        if dj < 0.0 {
            negatives += 1;
        }
        d[j % RING] = dj;
        for i in (j + 1)..n.min(j + HALF_BAND + 1) {
            // A[i][j] - sum_k L[i][k] L[j][k] D[k] over k < j inside both bands.
            let mut v = rj[i - j];
            for k in (i.saturating_sub(HALF_BAND))..j {
                v -= l[i % RING][i - k] * l[j % RING][j - k] * d[k % RING];
            }
            l[i % RING][i - j] = v / dj;
        }
    }
    negatives
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn product_matches_dense() {
        let n = 9;
        let mut a = SymBand::zeros(n);
        for i in 0..n {
            for j in i..n.min(i + HALF_BAND + 1) {
                a.add(
                    i,
                    j,
                    (1 + i * 7 + j * 3) as f64 * if i == j { 10.0 } else { 0.3 },
                );
            }
        }
        let x: Vec<f64> = (0..n).map(|i| (i as f64).sin() + 0.5).collect();
        let mut y = vec![0.0; n];
        a.mul_vec(&x, &mut y);
        for i in 0..n {
            let dense: f64 = (0..n).map(|j| a.get(i, j) * x[j]).sum();
            assert!((dense - y[i]).abs() < 1e-12 * dense.abs().max(1.0));
        }
    }

    #[test]
    fn sturm_count_of_a_diagonal_shift() {
        // diag(1..=8) - 4.5 I has four negative eigenvalues (Sylvester's law of inertia).
        let mut a = SymBand::zeros(8);
        let mut m = SymBand::zeros(8);
        for i in 0..8 {
            a.add(i, i, (i + 1) as f64);
            m.add(i, i, 1.0);
        }
        assert_eq!(a.shifted(4.5, &m).negative_pivots(), 4);
        assert_eq!(a.negative_pivots_shifted(4.5, &m), 4);
    }

    #[test]
    fn sturm_count_matches_dense_eigenvalues() {
        // Sylvester's law of inertia: the negative pivots of A = LDL^T equal the negative
        // eigenvalues of A (reference: nalgebra's dense symmetric eigen-solver).
        let n = 40;
        let mut h: u64 = 0x2545_F491_4F6C_DD1D;
        let mut next = || {
            h ^= h << 13;
            h ^= h >> 7;
            h ^= h << 17;
            (h % 10_000) as f64 / 5_000.0 - 1.0
        };
        for shift in [-3.0, -0.5, 0.0, 0.7, 2.5] {
            let mut a = SymBand::zeros(n);
            let mut m = SymBand::zeros(n);
            for i in 0..n {
                a.add(i, i, 2.0 + next());
                m.add(i, i, 1.0);
                for k in 1..=HALF_BAND.min(n - 1 - i) {
                    a.add(i, i + k, 0.4 * next());
                }
            }
            let dense = nalgebra::DMatrix::from_fn(n, n, |i, j| a.get(i, j) - shift * m.get(i, j));
            let expected = dense
                .symmetric_eigen()
                .eigenvalues
                .iter()
                .filter(|&&v| v < 0.0)
                .count();
            assert_eq!(
                a.negative_pivots_shifted(shift, &m),
                expected,
                "shift {shift}"
            );
            assert_eq!(a.shifted(shift, &m).negative_pivots(), expected);
        }
    }
}
