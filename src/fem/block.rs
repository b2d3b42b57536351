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

    /// (A^T B, A^T C) in one pass over the rows (B and C of the same width).
    #[track_caller]
    pub fn gram_pair(&self, b: &Block, c: &Block) -> (DMatrix<f64>, DMatrix<f64>) {
        assert!(self.dofs == b.dofs && self.dofs == c.dofs && b.width == c.width);
        let (p, q) = (self.width, b.width);
        let mut ab = vec![0.0; p * q];
        let mut ac = vec![0.0; p * q];
        for i in 0..self.dofs {
            let arow = self.row(i);
            let brow = b.row(i);
            let crow = c.row(i);
            for (r, &av) in arow.iter().enumerate() {
                if av == 0.0 {
                    continue;
                }
                let db = &mut ab[r * q..(r + 1) * q];
                let dc = &mut ac[r * q..(r + 1) * q];
                for ((x, y), (bv, cv)) in
                    db.iter_mut().zip(dc.iter_mut()).zip(brow.iter().zip(crow))
                {
                    *x += av * bv;
                    *y += av * cv;
                }
            }
        }
        (
            DMatrix::from_row_slice(p, q, &ab),
            DMatrix::from_row_slice(p, q, &ac),
        )
    }

    /// out = self * Q (Q is width x k).
    #[track_caller]
    pub fn times(&self, q: &DMatrix<f64>, out: &mut Block) {
        assert!(q.nrows() == self.width && out.width == q.ncols() && out.dofs == self.dofs);
        let k = q.ncols();
        // Row-major copy of Q for contiguous access.
        let qr: Vec<f64> = (0..self.width)
            .flat_map(|r| (0..k).map(move |c| (r, c)))
            .map(|(r, c)| q[(r, c)])
            .collect();
        for i in 0..self.dofs {
            let src = &self.data[i * self.width..(i + 1) * self.width];
            let dst = &mut out.data[i * k..(i + 1) * k];
            dst.fill(0.0);
            for (r, &sv) in src.iter().enumerate() {
                if sv == 0.0 {
                    continue;
                }
                for (d, &qv) in dst.iter_mut().zip(&qr[r * k..(r + 1) * k]) {
                    *d += sv * qv;
                }
            }
        }
    }
}

/// y = A x for a symmetric band matrix and a block. Each output row gathers its at most
/// 2 HALF_BAND + 1 neighbours, so it is written once (no scattered updates).
#[track_caller]
pub fn band_times_block(a: &SymBand, x: &Block, y: &mut Block) {
    let n = a.dim();
    assert!(x.dofs == n && y.dofs == n && x.width == y.width);
    let p = x.width;
    for (i, yi) in y.data.chunks_exact_mut(p).enumerate() {
        yi.fill(0.0);
        let lo = i.saturating_sub(HALF_BAND);
        let hi = (i + HALF_BAND).min(n - 1);
        for j in lo..=hi {
            let v = if j >= i {
                a.row(i)[j - i]
            } else {
                a.row(j)[i - j]
            };
            if v == 0.0 {
                continue;
            }
            for (yv, xv) in yi.iter_mut().zip(&x.data[j * p..(j + 1) * p]) {
                *yv += v * xv;
            }
        }
    }
}
