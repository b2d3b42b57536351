//! A block of p vectors stored dof-major (row i holds dof i of all p vectors contiguously),
//! so the banded product, the K^-1 recursion and the Rayleigh-Ritz projections each stream
//! once through memory and work on p values at a time.

use nalgebra::DMatrix;
use rayon::prelude::*;

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

    /// The first `k` columns, compacted in place (no second block).
    pub fn into_leading(mut self, k: usize) -> Block {
        let p = self.width;
        assert!(k <= p);
        // Row i moves from i p to i k <= i p: moving rows in increasing order never
        // overwrites a row not yet moved.
        for i in 0..self.dofs {
            self.data.copy_within(i * p..i * p + k, i * k);
        }
        self.data.truncate(self.dofs * k);
        self.width = k;
        self
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

    /// Rows `r0..r1` as a borrowed view.
    fn rows(&self, r0: usize, r1: usize) -> Rows<'_> {
        Rows {
            dofs: r1 - r0,
            width: self.width,
            data: &self.data[r0 * self.width..r1 * self.width],
        }
    }

    fn all_rows(&self) -> Rows<'_> {
        self.rows(0, self.dofs)
    }

    /// Blocks this large are processed by all cores (fine meshes); smaller ones stay on the
    /// calling thread, which in a sweep is already one of many.
    fn is_large(&self) -> bool {
        self.dofs > 2 * CHUNK_ROWS && self.dofs * self.width >= PARALLEL_ENTRIES
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
        let partial = |r0: usize| {
            let r1 = (r0 + CHUNK_ROWS).min(self.dofs);
            let mut ab = vec![0.0; p * p];
            let mut ac = vec![0.0; p * p];
            kernels::gram_pair_upper(
                self.rows(r0, r1),
                b.rows(r0, r1),
                c.rows(r0, r1),
                &mut ab,
                &mut ac,
            );
            (ab, ac)
        };
        let starts: Vec<usize> = (0..self.dofs).step_by(CHUNK_ROWS).collect();
        // Partial sums per fixed-size chunk, added in chunk order: the result does not
        // depend on the number of threads.
        let partials: Vec<_> = if self.is_large() {
            starts.par_iter().map(|&r0| partial(r0)).collect()
        } else {
            starts.iter().map(|&r0| partial(r0)).collect()
        };
        let mut ab = vec![0.0; p * p];
        let mut ac = vec![0.0; p * p];
        for (pab, pac) in partials {
            for k in 0..p * p {
                ab[k] += pab[k];
                ac[k] += pac[k];
            }
        }
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
        self.times_into(None, q, out, None);
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
        self.times_into(Some(other), q, out_a, Some(out_b));
    }

    fn times_into(
        &self,
        other: Option<&Block>,
        q: &DMatrix<f64>,
        out_a: &mut Block,
        out_b: Option<&mut Block>,
    ) {
        let (p, k) = (self.width, q.ncols());
        if k == 0 {
            return;
        }
        let qt = kernels::lane_major(q);
        let empty = Block::zeros(0, p);
        let one = |r0: usize, xa: &mut [f64], xb: &mut [f64]| {
            let rows = xa.len() / k;
            let yb = match other {
                Some(o) => o.rows(r0, r0 + rows),
                None => empty.all_rows(),
            };
            let mut va = RowsMut {
                dofs: rows,
                width: k,
                data: xa,
            };
            let mut vb = RowsMut {
                dofs: xb.len() / k,
                width: k,
                data: xb,
            };
            kernels::times_pair(self.rows(r0, r0 + rows), yb, &qt, &mut va, &mut vb);
        };
        let large = self.is_large();
        match out_b {
            Some(out_b) if large => out_a
                .data
                .par_chunks_mut(CHUNK_ROWS * k)
                .zip(out_b.data.par_chunks_mut(CHUNK_ROWS * k))
                .enumerate()
                .for_each(|(c, (xa, xb))| one(c * CHUNK_ROWS, xa, xb)),
            Some(out_b) => one(0, &mut out_a.data, &mut out_b.data),
            None if large => out_a
                .data
                .par_chunks_mut(CHUNK_ROWS * k)
                .enumerate()
                .for_each(|(c, xa)| one(c * CHUNK_ROWS, xa, &mut [])),
            None => one(0, &mut out_a.data, &mut []),
        }
    }
}

/// Rows per parallel chunk (a fixed size, so sums do not depend on the thread count).
const CHUNK_ROWS: usize = 4096;
/// Blocks with at least this many entries use all cores.
const PARALLEL_ENTRIES: usize = 1 << 18;

/// One four-row tile of the Ritz update (X_A, X_B) = (Y_A Q, Y_B Q): `ya`, `yb` are 4 x p
/// row-major, `xa`, `xb` 4 x k, `qt` is Q laid out lane-major (groups of four columns, each
/// p rows of four). With `pair` false only X_A is formed.
pub(crate) struct TimesTile<'a> {
    pub ya: &'a [f64],
    pub yb: &'a [f64],
    pub qt: &'a [f64],
    pub p: usize,
    pub k: usize,
    pub xa: &'a mut [f64],
    pub xb: &'a mut [f64],
    pub pair: bool,
}

/// A borrowed range of rows of a [`Block`].
#[derive(Debug, Clone, Copy)]
struct Rows<'a> {
    dofs: usize,
    width: usize,
    data: &'a [f64],
}

impl Rows<'_> {
    fn row(&self, i: usize) -> &[f64] {
        &self.data[i * self.width..(i + 1) * self.width]
    }
}

/// A mutably borrowed range of rows of a [`Block`].
#[derive(Debug)]
struct RowsMut<'a> {
    dofs: usize,
    width: usize,
    data: &'a mut [f64],
}

impl RowsMut<'_> {
    fn row_mut(&mut self, i: usize) -> &mut [f64] {
        &mut self.data[i * self.width..(i + 1) * self.width]
    }
}

/// y = A x for a symmetric band matrix and a block. Each output row gathers its at most
/// 2 HALF_BAND + 1 neighbours, so it is written once (no scattered updates).
#[track_caller]
pub fn band_times_block(a: &SymBand, x: &Block, y: &mut Block) {
    let n = a.dim();
    assert!(x.dofs == n && y.dofs == n && x.width == y.width);
    let p = x.width;
    if p == 0 {
        return;
    }
    let one = |r0: usize, ys: &mut [f64]| {
        let mut view = RowsMut {
            dofs: ys.len() / p,
            width: p,
            data: ys,
        };
        kernels::band_times(a, x.all_rows(), r0, &mut view);
    };
    if x.is_large() {
        y.data
            .par_chunks_mut(CHUNK_ROWS * p)
            .enumerate()
            .for_each(|(c, ys)| one(c * CHUNK_ROWS, ys));
    } else {
        one(0, &mut y.data);
    }
}

/// The dense inner loops, written over lanes of four columns with the accumulators held in
/// registers, compiled twice: for the x86-64 baseline and, chosen at run time when the CPU
/// has them, for AVX2 with fused multiply-add. Results of the two differ only by rounding.
pub(crate) mod kernels {
    use super::{Rows, RowsMut, TimesTile, HALF_BAND};
    use crate::fem::band::SymBand;
    #[cfg(target_arch = "x86_64")]
    use crate::fem::simd_avx2;
    use nalgebra::DMatrix;

    const LANES: usize = 4;

    /// a * b + c, fused or not.
    trait MulAdd {
        fn mul_add(a: f64, b: f64, c: f64) -> f64;

        /// A hand-tiled band product of a four-row tile: returns how many leading columns
        /// it formed (0: none, the portable tile does them all).
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
        fn times_tile(_tile: TimesTile<'_>) -> bool {
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
        fn times_tile(tile: TimesTile<'_>) -> bool {
            // SAFETY: as for `band_tile`.
            unsafe { simd_avx2::times_tile(tile) };
            true
        }
    }

    #[cfg(target_arch = "x86_64")]
    pub(crate) fn has_fma() -> bool {
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
        (a: Rows<'_>, b: Rows<'_>, c: Rows<'_>, ab: &mut [f64], ac: &mut [f64]));
    dispatch!(times_pair, times_pair_fma, times_pair_body,
        (ya: Rows<'_>, yb: Rows<'_>, qt: &[f64], xa: &mut RowsMut<'_>, xb: &mut RowsMut<'_>));
    dispatch!(band_times, band_times_fma, band_times_body,
        (a: &SymBand, x: Rows<'_>, r0: usize, y: &mut RowsMut<'_>));

    /// Upper triangles of A^T B and A^T C, four rows of A at a time so each accumulator is
    /// loaded and stored once per eight multiply-adds.
    #[inline(always)]
    fn gram_pair_body<M: MulAdd>(
        a: Rows<'_>,
        b: Rows<'_>,
        c: Rows<'_>,
        ab: &mut [f64],
        ac: &mut [f64],
    ) {
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
    pub(super) fn lane_major(q: &DMatrix<f64>) -> Vec<f64> {
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
        ya: Rows<'_>,
        yb: Rows<'_>,
        qt: &[f64],
        xa: &mut RowsMut<'_>,
        xb: &mut RowsMut<'_>,
    ) {
        let rows = ya.dofs;
        let mut i = 0;
        if yb.dofs == rows {
            while i + TILE_ROWS <= rows {
                times_tile::<M, TILE_ROWS, true>(ya, yb, qt, i, xa, xb);
                i += TILE_ROWS;
            }
            while i < rows {
                times_tile::<M, 1, true>(ya, yb, qt, i, xa, xb);
                i += 1;
            }
        } else {
            while i + TILE_ROWS <= rows {
                times_tile::<M, TILE_ROWS, false>(ya, ya, qt, i, xa, xb);
                i += TILE_ROWS;
            }
            while i < rows {
                times_tile::<M, 1, false>(ya, ya, qt, i, xa, xb);
                i += 1;
            }
        }
    }

    /// Rows i..i+R of (YA Q, YB Q), lane by lane, accumulators in registers.
    #[inline(always)]
    fn times_tile<M: MulAdd, const R: usize, const PAIR: bool>(
        ya: Rows<'_>,
        yb: Rows<'_>,
        qt: &[f64],
        i: usize,
        xa: &mut RowsMut<'_>,
        xb: &mut RowsMut<'_>,
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
            let tile = TimesTile {
                ya: ra,
                yb: rb,
                qt,
                p,
                k,
                xa: oa,
                xb: ob,
                pair: PAIR,
            };
            if M::times_tile(tile) {
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

    /// Rows r0..r0 + y.dofs of Y = A X: interior rows in tiles of four sharing one pass over
    /// their 14 neighbour rows of X; rows near the ends of the matrix (where the band is
    /// cut) and of the range, one at a time.
    #[inline(always)]
    fn band_times_body<M: MulAdd>(a: &SymBand, x: Rows<'_>, r0: usize, y: &mut RowsMut<'_>) {
        let n = a.dim();
        let p = x.width;
        let r1 = r0 + y.dofs;
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
        let single = |i: usize, y: &mut RowsMut<'_>| {
            let yi = y.row_mut(i - r0);
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
        let mut i = r0;
        while i < r1 && i < HALF_BAND {
            single(i, y);
            i += 1;
        }
        let lanes_end = p / LANES * LANES;
        while i + TILE_ROWS <= r1 && i + TILE_ROWS + HALF_BAND <= n {
            let mut coef = [[0.0; TILE_SPAN]; TILE_ROWS];
            for (t, row) in coef.iter_mut().enumerate() {
                row[t..t + ROW_SPAN].copy_from_slice(&full(i + t));
            }
            let xs = &x.data[(i - HALF_BAND) * p..(i - HALF_BAND + TILE_SPAN) * p];
            let local = i - r0;
            let ys = &mut y.data[local * p..(local + TILE_ROWS) * p];
            let done = M::band_tile(&coef, xs, p, ys);
            if done == p {
                i += TILE_ROWS;
                continue;
            }
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
                    ys[t * p + c0..t * p + c0 + LANES].copy_from_slice(lane);
                }
            }
            for col in lanes_end..p {
                for t in 0..TILE_ROWS {
                    let mut acc = 0.0;
                    for s in 0..TILE_SPAN {
                        acc = M::mul_add(coef[t][s], xs[s * p + col], acc);
                    }
                    ys[t * p + col] = acc;
                }
            }
            i += TILE_ROWS;
        }
        for i in i..r1 {
            single(i, y);
        }
    }

    #[cfg(test)]
    mod tests {
        use super::super::{band_times_block, Block};
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

        /// Reference products from their definitions (the band one column at a time with
        /// the plain symmetric band product).
        fn check(
            a: &SymBand,
            x: &Block,
            c: &Block,
            q: &DMatrix<f64>,
            got: [&Block; 3],
            ab: &DMatrix<f64>,
            ac: &DMatrix<f64>,
        ) {
            let (n, p) = (x.dofs, x.width);
            let [y, xa, xb] = got;
            let mut col_in = vec![0.0; n];
            let mut col_out = vec![0.0; n];
            for col in 0..p {
                for i in 0..n {
                    col_in[i] = x.get(i, col);
                }
                a.mul_vec(&col_in, &mut col_out);
                for i in 0..n {
                    assert!(close(y.get(i, col), col_out[i]), "band n={n} p={p}");
                }
            }
            for i in 0..n {
                for col in 0..p {
                    let xq: f64 = (0..p).map(|r| x.get(i, r) * q[(r, col)]).sum();
                    let cq: f64 = (0..p).map(|r| c.get(i, r) * q[(r, col)]).sum();
                    assert!(close(xa.get(i, col), xq), "times n={n} p={p}");
                    assert!(close(xb.get(i, col), cq), "times n={n} p={p}");
                }
            }
            for r in 0..p {
                for col in 0..p {
                    let xx: f64 = (0..n).map(|i| x.get(i, r) * x.get(i, col)).sum();
                    let xc: f64 = (0..n).map(|i| x.get(i, r) * c.get(i, col)).sum();
                    assert!(close(ab[(r, col)], xx), "gram n={n} p={p}");
                    if r <= col {
                        assert!(close(ac[(r, col)], xc), "gram n={n} p={p}");
                    }
                }
            }
        }

        // Both compiled variants, on every size class the tiles distinguish: fewer rows than
        // a tile span, ragged last tiles, widths that are not whole lanes, and (last) a block
        // large enough to be split across threads in chunks.
        #[test]
        fn kernels_match_the_definitions() {
            let mut sizes: Vec<(usize, usize)> = Vec::new();
            for n in [1, 2, 5, 6, 9, 13, 14, 15, 19, 40] {
                for p in [1, 2, 3, 4, 5, 7, 8, 18] {
                    sizes.push((n, p));
                }
            }
            sizes.push((9001, 30));
            for (n, p) in sizes {
                let seed = (n * 100 + p) as u64;
                let a = band(seed, n);
                let x = block(seed + 1, n, p);
                let c = block(seed + 2, n, p);
                let q = DMatrix::from_vec(p, p, fill(seed + 3, p * p));
                // Public, dispatched (and for the large block, parallel) entry points.
                let mut y = Block::zeros(n, p);
                let mut xa = Block::zeros(n, p);
                let mut xb = Block::zeros(n, p);
                band_times_block(&a, &x, &mut y);
                x.times_pair(&c, &q, &mut xa, &mut xb);
                let (ab, ac) = x.gram_pair(&x, &c);
                check(&a, &x, &c, &q, [&y, &xa, &xb], &ab, &ac);
                let mut xs = Block::zeros(n, p);
                x.times(&q, &mut xs);
                assert_eq!(xs, xa);
                // The portable bodies.
                fn view(b: &Block) -> Rows<'_> {
                    b.all_rows()
                }
                let qt = lane_major(&q);
                let mut y = Block::zeros(n, p);
                let mut xa = Block::zeros(n, p);
                let mut xb = Block::zeros(n, p);
                {
                    let mut vy = RowsMut {
                        dofs: n,
                        width: p,
                        data: &mut y.data,
                    };
                    band_times_body::<Plain>(&a, view(&x), 0, &mut vy);
                    let mut va = RowsMut {
                        dofs: n,
                        width: p,
                        data: &mut xa.data,
                    };
                    let mut vb = RowsMut {
                        dofs: n,
                        width: p,
                        data: &mut xb.data,
                    };
                    times_pair_body::<Plain>(view(&x), view(&c), &qt, &mut va, &mut vb);
                }
                let (mut ab, mut ac) = (vec![0.0; p * p], vec![0.0; p * p]);
                gram_pair_body::<Plain>(view(&x), view(&x), view(&c), &mut ab, &mut ac);
                let upper = |v: &[f64]| {
                    DMatrix::from_fn(
                        p,
                        p,
                        |r, k| if r <= k { v[r * p + k] } else { v[k * p + r] },
                    )
                };
                check(&a, &x, &c, &q, [&y, &xa, &xb], &upper(&ab), &upper(&ac));
            }
        }
    }
}
