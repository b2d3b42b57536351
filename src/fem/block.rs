//! A block of p vectors stored dof-major (row i holds dof i of all p vectors contiguously),
//! so the banded product, the K^-1 recursion and the Rayleigh-Ritz projections each stream
//! once through memory and work on p values at a time.

use nalgebra::DMatrix;

use super::band::{SymBand, HALF_BAND};

/// dofs x p values, row-major.
#[derive(Debug, Clone, PartialEq)]
pub struct Block {
    pub dofs: usize,
    pub width: usize,
    pub data: Vec<f64>,
}

impl Block {
    pub fn zeros(dofs: usize, width: usize) -> Self {
        Block {
            dofs,
            width,
            data: vec![0.0; dofs * width],
        }
    }

    pub fn row(&self, i: usize) -> &[f64] {
        &self.data[i * self.width..(i + 1) * self.width]
    }

    pub fn row_mut(&mut self, i: usize) -> &mut [f64] {
        &mut self.data[i * self.width..(i + 1) * self.width]
    }

    pub fn get(&self, i: usize, j: usize) -> f64 {
        self.data[i * self.width + j]
    }

    pub fn set(&mut self, i: usize, j: usize, v: f64) {
        self.data[i * self.width + j] = v;
    }

    /// Column j as a vector.
    pub fn column(&self, j: usize) -> Vec<f64> {
        (0..self.dofs).map(|i| self.get(i, j)).collect()
    }

    /// The first `k` columns.
    pub fn leading(&self, k: usize) -> Block {
        let mut out = Block::zeros(self.dofs, k);
        for i in 0..self.dofs {
            out.row_mut(i).copy_from_slice(&self.row(i)[..k]);
        }
        out
    }

    /// A^T B (p x q) for blocks of the same length.
    #[track_caller]
    pub fn gram(&self, other: &Block) -> DMatrix<f64> {
        assert_eq!(self.dofs, other.dofs);
        let (p, q) = (self.width, other.width);
        let mut acc = vec![0.0; p * q];
        for i in 0..self.dofs {
            let a = self.row(i);
            let b = other.row(i);
            for (r, &av) in a.iter().enumerate() {
                if av == 0.0 {
                    continue;
                }
                let dst = &mut acc[r * q..(r + 1) * q];
                for (d, &bv) in dst.iter_mut().zip(b) {
                    *d += av * bv;
                }
            }
        }
        DMatrix::from_row_slice(p, q, &acc)
    }

    /// (A^T B, A^T C) in one pass over the rows, for pairs known to be symmetric
    /// (B and C of the same width as A): only the upper triangles are accumulated and then
    /// mirrored, which halves the work. In the subspace iteration A^T B = Y^T K Y and
    /// A^T C = Y^T M Y.
    #[track_caller]
    pub fn gram_pair(&self, b: &Block, c: &Block) -> (DMatrix<f64>, DMatrix<f64>) {
        assert!(self.dofs == b.dofs && self.dofs == c.dofs);
        assert!(b.width == self.width && c.width == self.width);
        let p = self.width;
        let mut ab = vec![0.0; p * p];
        let mut ac = vec![0.0; p * p];
        kernels::gram_pair_upper(self, b, c, &mut ab, &mut ac);
        let mirror = |acc: &[f64]| {
            DMatrix::from_fn(p, p, |r, k| {
                if r <= k {
                    acc[r * p + k]
                } else {
                    acc[k * p + r]
                }
            })
        };
        (mirror(&ab), mirror(&ac))
    }

    /// out = self * Q (Q is width x k).
    #[track_caller]
    pub fn times(&self, q: &DMatrix<f64>, out: &mut Block) {
        assert!(q.nrows() == self.width && out.width == q.ncols() && out.dofs == self.dofs);
        let mut spare = Block::zeros(0, q.ncols());
        let empty = Block::zeros(0, self.width);
        kernels::times_pair(self, &empty, q, out, &mut spare);
    }

    /// (out_a, out_b) = (self * Q, other * Q) in one pass (Q is width x k).
    #[track_caller]
    pub fn times_pair(
        &self,
        other: &Block,
        q: &DMatrix<f64>,
        out_a: &mut Block,
        out_b: &mut Block,
    ) {
        assert!(q.nrows() == self.width && other.width == self.width);
        assert!(out_a.width == q.ncols() && out_b.width == q.ncols());
        assert!(out_a.dofs == self.dofs && other.dofs == self.dofs && out_b.dofs == self.dofs);
        kernels::times_pair(self, other, q, out_a, out_b);
    }
}

/// y = A x for a symmetric band matrix and a block. Each output row gathers its at most
/// 2 HALF_BAND + 1 neighbours, so it is written once (no scattered updates).
#[track_caller]
pub fn band_times_block(a: &SymBand, x: &Block, y: &mut Block) {
    let n = a.dim();
    assert!(x.dofs == n && y.dofs == n && x.width == y.width);
    kernels::band_times(a, x, y);
}

/// The dense inner loops, written over lanes of four columns with the accumulators held in
/// registers, compiled twice: for the x86-64 baseline and, chosen at run time when the CPU
/// has them, for AVX2 with fused multiply-add. Results of the two differ only by rounding.
mod kernels {
    use super::{Block, HALF_BAND};
    use crate::fem::band::SymBand;
    #[cfg(target_arch = "x86_64")]
    use crate::fem::simd_avx2;
    use nalgebra::DMatrix;

    const LANES: usize = 4;

    /// a * b + c, fused or not.
    trait MulAdd {
        fn mul_add(a: f64, b: f64, c: f64) -> f64;

        /// A hand-tiled band product for whole lanes of a four-row tile: returns how many
        /// leading columns it formed (0: none, the portable tile does them all).
        #[inline(always)]
        fn band_tile(
            _coef: &[[f64; TILE_SPAN]; TILE_ROWS],
            _xs: &[f64],
            _p: usize,
            _out: &mut [f64],
        ) -> usize {
            0
        }

        /// A hand-tiled four-row Ritz update; false when there is none.
        #[inline(always)]
        #[allow(clippy::too_many_arguments)]
        fn times_tile(
            _ya: &[f64],
            _yb: &[f64],
            _qt: &[f64],
            _p: usize,
            _k: usize,
            _xa: &mut [f64],
            _xb: &mut [f64],
            _pair: bool,
        ) -> bool {
            false
        }
    }
    struct Plain;
    impl MulAdd for Plain {
        #[inline(always)]
        fn mul_add(a: f64, b: f64, c: f64) -> f64 {
            a * b + c
        }
    }
    #[cfg(target_arch = "x86_64")]
    struct Fused;
    #[cfg(target_arch = "x86_64")]
    impl MulAdd for Fused {
        #[inline(always)]
        fn mul_add(a: f64, b: f64, c: f64) -> f64 {
            a.mul_add(b, c)
        }

        #[inline(always)]
        fn band_tile(
            coef: &[[f64; TILE_SPAN]; TILE_ROWS],
            xs: &[f64],
            p: usize,
            out: &mut [f64],
        ) -> usize {
            // SAFETY: `Fused` is only used by the bodies compiled for, and dispatched to
            // after checking, AVX2 + FMA (see `dispatch!`).
            unsafe { simd_avx2::band_tile(coef, xs, p, out) }
        }

        #[inline(always)]
        fn times_tile(
            ya: &[f64],
            yb: &[f64],
            qt: &[f64],
            p: usize,
            k: usize,
            xa: &mut [f64],
            xb: &mut [f64],
            pair: bool,
        ) -> bool {
            // SAFETY: as for `band_tile`.
            unsafe { simd_avx2::times_tile(ya, yb, qt, p, k, xa, xb, pair) };
            true
        }
    }

    #[cfg(target_arch = "x86_64")]
    fn has_fma() -> bool {
        use std::sync::OnceLock;
        static HAS: OnceLock<bool> = OnceLock::new();
        *HAS.get_or_init(|| {
            std::arch::is_x86_feature_detected!("avx2")
                && std::arch::is_x86_feature_detected!("fma")
        })
    }

    /// Defines `$name` dispatching to the body `$body::<Fused>` compiled with AVX2 + FMA when
    /// the CPU has them, else `$body::<Plain>`.
    macro_rules! dispatch {
        ($name:ident, $fast:ident, $body:ident, ($($arg:ident: $ty:ty),*)) => {
            #[cfg(target_arch = "x86_64")]
            #[target_feature(enable = "avx2,fma")]
            fn $fast($($arg: $ty),*) {
                $body::<Fused>($($arg),*)
            }

            pub(super) fn $name($($arg: $ty),*) {
                #[cfg(target_arch = "x86_64")]
                if has_fma() {
                    // SAFETY: the CPU supports AVX2 and FMA (checked at run time above).
                    unsafe { $fast($($arg),*) };
                    return;
                }
                $body::<Plain>($($arg),*)
            }
        };
    }

    dispatch!(gram_pair_upper, gram_pair_upper_fma, gram_pair_body,
        (a: &Block, b: &Block, c: &Block, ab: &mut [f64], ac: &mut [f64]));
    dispatch!(times_pair, times_pair_fma, times_pair_body,
        (ya: &Block, yb: &Block, q: &DMatrix<f64>, xa: &mut Block, xb: &mut Block));
    dispatch!(band_times, band_times_fma, band_times_body,
        (a: &SymBand, x: &Block, y: &mut Block));

    /// Upper triangles of A^T B and A^T C, four rows of A at a time so each accumulator is
    /// loaded and stored once per eight multiply-adds.
    #[inline(always)]
    fn gram_pair_body<M: MulAdd>(a: &Block, b: &Block, c: &Block, ab: &mut [f64], ac: &mut [f64]) {
        let p = a.width;
        let rows = a.dofs;
        let mut i = 0;
        while i + 4 <= rows {
            let ar: [&[f64]; 4] = std::array::from_fn(|k| a.row(i + k));
            let br: [&[f64]; 4] = std::array::from_fn(|k| b.row(i + k));
            let cr: [&[f64]; 4] = std::array::from_fn(|k| c.row(i + k));
            for r in 0..p {
                let av = [ar[0][r], ar[1][r], ar[2][r], ar[3][r]];
                let dab = &mut ab[r * p + r..(r + 1) * p];
                let dac = &mut ac[r * p + r..(r + 1) * p];
                for (j, (x, y)) in dab.iter_mut().zip(dac.iter_mut()).enumerate() {
                    let col = r + j;
                    let mut sx = *x;
                    let mut sy = *y;
                    for k in 0..4 {
                        sx = M::mul_add(av[k], br[k][col], sx);
                        sy = M::mul_add(av[k], cr[k][col], sy);
                    }
                    *x = sx;
                    *y = sy;
                }
            }
            i += 4;
        }
        for i in i..rows {
            let (ar, br, cr) = (a.row(i), b.row(i), c.row(i));
            for r in 0..p {
                let av = ar[r];
                for col in r..p {
                    ab[r * p + col] = M::mul_add(av, br[col], ab[r * p + col]);
                    ac[r * p + col] = M::mul_add(av, cr[col], ac[r * p + col]);
                }
            }
        }
    }

    /// Q re-laid lane by lane: for each group of four output columns, the p rows of those
    /// four entries contiguously (zero-padded past the last column).
    fn lane_major(q: &DMatrix<f64>) -> Vec<f64> {
        let (p, k) = (q.nrows(), q.ncols());
        let groups = k.div_ceil(LANES);
        let mut out = vec![0.0; groups * p * LANES];
        for g in 0..groups {
            for r in 0..p {
                for l in 0..LANES {
                    let col = g * LANES + l;
                    if col < k {
                        out[(g * p + r) * LANES + l] = q[(r, col)];
                    }
                }
            }
        }
        out
    }

    /// Rows per register tile: R rows x one lane of four columns keeps 2 R independent
    /// accumulator chains in flight, which hides the multiply-add latency.
    const TILE_ROWS: usize = 4;

    /// (XA, XB) = (YA Q, YB Q); YB may have no rows (then XB is left alone).
    #[inline(always)]
    fn times_pair_body<M: MulAdd>(
        ya: &Block,
        yb: &Block,
        q: &DMatrix<f64>,
        xa: &mut Block,
        xb: &mut Block,
    ) {
        let qt = lane_major(q);
        let rows = ya.dofs;
        let mut i = 0;
        if yb.dofs == rows {
            while i + TILE_ROWS <= rows {
                times_tile::<M, TILE_ROWS, true>(ya, yb, &qt, i, xa, xb);
                i += TILE_ROWS;
            }
            while i < rows {
                times_tile::<M, 1, true>(ya, yb, &qt, i, xa, xb);
                i += 1;
            }
        } else {
            while i + TILE_ROWS <= rows {
                times_tile::<M, TILE_ROWS, false>(ya, ya, &qt, i, xa, xb);
                i += TILE_ROWS;
            }
            while i < rows {
                times_tile::<M, 1, false>(ya, ya, &qt, i, xa, xb);
                i += 1;
            }
        }
    }

    /// Rows i..i+R of (YA Q, YB Q), lane by lane, accumulators in registers.
    #[inline(always)]
    fn times_tile<M: MulAdd, const R: usize, const PAIR: bool>(
        ya: &Block,
        yb: &Block,
        qt: &[f64],
        i: usize,
        xa: &mut Block,
        xb: &mut Block,
    ) {
        let p = ya.width;
        let k = xa.width;
        if R == TILE_ROWS {
            let (ra, rb) = (&ya.data[i * p..(i + R) * p], &yb.data[i * p..(i + R) * p]);
            let (oa, ob) = if PAIR {
                (
                    &mut xa.data[i * k..(i + R) * k],
                    &mut xb.data[i * k..(i + R) * k],
                )
            } else {
                (&mut xa.data[i * k..(i + R) * k], &mut [][..])
            };
            if M::times_tile(ra, rb, qt, p, k, oa, ob, PAIR) {
                return;
            }
        }
        let sa: [&[f64]; R] = std::array::from_fn(|t| &ya.data[(i + t) * p..][..p]);
        let sb: [&[f64]; R] = std::array::from_fn(|t| &yb.data[(i + t) * p..][..p]);
        for (g, qg) in qt.chunks_exact(p * LANES).enumerate() {
            let mut acc_a = [[0.0; LANES]; R];
            let mut acc_b = [[0.0; LANES]; R];
            for (r, qv) in qg.chunks_exact(LANES).enumerate() {
                for t in 0..R {
                    let (a, b) = (sa[t][r], sb[t][r]);
                    for l in 0..LANES {
                        acc_a[t][l] = M::mul_add(a, qv[l], acc_a[t][l]);
                        if PAIR {
                            acc_b[t][l] = M::mul_add(b, qv[l], acc_b[t][l]);
                        }
                    }
                }
            }
            let c0 = g * LANES;
            let end = (c0 + LANES).min(k);
            for t in 0..R {
                let out = &mut xa.row_mut(i + t)[c0..end];
                for (l, v) in out.iter_mut().enumerate() {
                    *v = acc_a[t][l];
                }
                if PAIR {
                    let out = &mut xb.row_mut(i + t)[c0..end];
                    for (l, v) in out.iter_mut().enumerate() {
                        *v = acc_b[t][l];
                    }
                }
            }
        }
    }

    /// Width of the band row span seen by one tile of output rows.
    const TILE_SPAN: usize = TILE_ROWS + 2 * HALF_BAND;
    /// Entries of one full band row.
    const ROW_SPAN: usize = 2 * HALF_BAND + 1;

    /// Y = A X: interior rows in tiles of four sharing one pass over their 14 neighbour rows
    /// of X; the few rows near the ends, where the band is cut, one at a time.
    #[inline(always)]
    fn band_times_body<M: MulAdd>(a: &SymBand, x: &Block, y: &mut Block) {
        let n = a.dim();
        let p = x.width;
        // full(i)[k] = A[i][i - HALF_BAND + k] (zero outside the matrix), read from the
        // upper band rows without a copy of the matrix.
        let full = |i: usize| -> [f64; ROW_SPAN] {
            std::array::from_fn(|k| {
                if k >= HALF_BAND {
                    if i + k - HALF_BAND < n {
                        a.row(i)[k - HALF_BAND]
                    } else {
                        0.0
                    }
                } else {
                    match (i + k).checked_sub(HALF_BAND) {
                        Some(j) => a.row(j)[HALF_BAND - k],
                        None => 0.0,
                    }
                }
            })
        };
        let single = |i: usize, y: &mut Block| {
            let yi = y.row_mut(i);
            let row = full(i);
            for (col, out) in yi.iter_mut().enumerate() {
                let mut acc = 0.0;
                for (k, &v) in row.iter().enumerate() {
                    if let Some(j) = (i + k).checked_sub(HALF_BAND).filter(|&j| j < n) {
                        acc = M::mul_add(v, x.data[j * p + col], acc);
                    }
                }
                *out = acc;
            }
        };
        let first_tile = HALF_BAND.min(n);
        for i in 0..first_tile {
            single(i, y);
        }
        let lanes_end = p / LANES * LANES;
        let mut i = first_tile;
        while i + TILE_ROWS + HALF_BAND <= n {
            let mut coef = [[0.0; TILE_SPAN]; TILE_ROWS];
            for (t, row) in coef.iter_mut().enumerate() {
                row[t..t + ROW_SPAN].copy_from_slice(&full(i + t));
            }
            let xs = &x.data[(i - HALF_BAND) * p..(i - HALF_BAND + TILE_SPAN) * p];
            let done = M::band_tile(&coef, xs, p, &mut y.data[i * p..(i + TILE_ROWS) * p]);
            for c0 in (done..lanes_end).step_by(LANES) {
                let mut acc = [[0.0; LANES]; TILE_ROWS];
                for s in 0..TILE_SPAN {
                    let xv: &[f64; LANES] =
                        xs[s * p + c0..s * p + c0 + LANES].try_into().expect("lane");
                    for t in 0..TILE_ROWS {
                        for l in 0..LANES {
                            acc[t][l] = M::mul_add(coef[t][s], xv[l], acc[t][l]);
                        }
                    }
                }
                for (t, lane) in acc.iter().enumerate() {
                    let out = &mut y.data[(i + t) * p + c0..(i + t) * p + c0 + LANES];
                    out.copy_from_slice(lane);
                }
            }
            for col in lanes_end..p {
                for t in 0..TILE_ROWS {
                    let mut acc = 0.0;
                    for s in 0..TILE_SPAN {
                        acc = M::mul_add(coef[t][s], xs[s * p + col], acc);
                    }
                    y.data[(i + t) * p + col] = acc;
                }
            }
            i += TILE_ROWS;
        }
        for i in i..n {
            single(i, y);
        }
    }

    #[cfg(test)]
    mod tests {
        use super::*;

        /// Deterministic pseudo-random fill in [-1, 1).
        fn fill(seed: u64, len: usize) -> Vec<f64> {
            let mut h = seed.wrapping_mul(0x9E37_79B9_7F4A_7C15) | 1;
            (0..len)
                .map(|_| {
                    h ^= h << 13;
                    h ^= h >> 7;
                    h ^= h << 17;
                    (h % 20_000) as f64 / 10_000.0 - 1.0
                })
                .collect()
        }

        fn block(seed: u64, dofs: usize, width: usize) -> Block {
            Block {
                dofs,
                width,
                data: fill(seed, dofs * width),
            }
        }

        fn band(seed: u64, n: usize) -> SymBand {
            let mut a = SymBand::zeros(n);
            let v = fill(seed, n * (HALF_BAND + 1));
            for i in 0..n {
                for k in 0..=HALF_BAND.min(n - 1 - i) {
                    a.add(i, i + k, v[i * (HALF_BAND + 1) + k]);
                }
            }
            a
        }

        fn close(a: f64, b: f64) -> bool {
            (a - b).abs() <= 1e-12 * (1.0 + b.abs())
        }

        // Reference: the plain triple loops (definition of the products). Both compiled
        // variants are checked on every size class the tiles distinguish: fewer rows than a
        // tile span, ragged last tiles and widths that are not whole lanes.
        #[test]
        fn kernels_match_the_definitions() {
            for n in [1, 2, 5, 6, 9, 13, 14, 15, 19, 40] {
                for p in [1, 2, 3, 4, 5, 7, 8, 18] {
                    let seed = (n * 100 + p) as u64;
                    let a = band(seed, n);
                    let x = block(seed + 1, n, p);
                    let c = block(seed + 2, n, p);
                    let q = DMatrix::from_vec(p, p, fill(seed + 3, p * p));
                    let mut y = Block::zeros(n, p);
                    let mut xa = Block::zeros(n, p);
                    let mut xb = Block::zeros(n, p);
                    let check = |y: &Block, xa: &Block, xb: &Block, ab: &[f64], ac: &[f64]| {
                        for i in 0..n {
                            for col in 0..p {
                                let ax: f64 = (0..n).map(|j| a.get(i, j) * x.get(j, col)).sum();
                                assert!(close(y.get(i, col), ax), "band n={n} p={p}");
                                let xq: f64 = (0..p).map(|r| x.get(i, r) * q[(r, col)]).sum();
                                let cq: f64 = (0..p).map(|r| c.get(i, r) * q[(r, col)]).sum();
                                assert!(close(xa.get(i, col), xq), "times n={n} p={p}");
                                assert!(close(xb.get(i, col), cq), "times n={n} p={p}");
                            }
                        }
                        for r in 0..p {
                            for col in r..p {
                                let xx: f64 = (0..n).map(|i| x.get(i, r) * x.get(i, col)).sum();
                                let xc: f64 = (0..n).map(|i| x.get(i, r) * c.get(i, col)).sum();
                                assert!(close(ab[r * p + col], xx), "gram n={n} p={p}");
                                assert!(close(ac[r * p + col], xc), "gram n={n} p={p}");
                            }
                        }
                    };
                    let (mut ab, mut ac) = (vec![0.0; p * p], vec![0.0; p * p]);
                    band_times_body::<Plain>(&a, &x, &mut y);
                    times_pair_body::<Plain>(&x, &c, &q, &mut xa, &mut xb);
                    gram_pair_body::<Plain>(&x, &x, &c, &mut ab, &mut ac);
                    check(&y, &xa, &xb, &ab, &ac);
                    let (mut ab, mut ac) = (vec![0.0; p * p], vec![0.0; p * p]);
                    band_times(&a, &x, &mut y);
                    times_pair(&x, &c, &q, &mut xa, &mut xb);
                    gram_pair_upper(&x, &x, &c, &mut ab, &mut ac);
                    check(&y, &xa, &xb, &ab, &ac);
                    // The single-block product (no partner) leaves the second output alone.
                    let mut untouched = Block::zeros(0, p);
                    let mut xs = Block::zeros(n, p);
                    times_pair(&x, &Block::zeros(0, p), &q, &mut xs, &mut untouched);
                    assert_eq!(xs, xa);
                }
            }
        }
    }
}
