//! AVX2 + FMA register tiles for the two hottest block products (see [`super::block`]):
//! the banded mass product and the Ritz update X = Y Q. Compiled only for x86-64 and called
//! only after a run-time check that the CPU has AVX2 and FMA; everywhere else the portable
//! tiles in `block.rs` run. Both give the same sums up to rounding.
//!
//! Why hand-placed registers: written as plain loops, the compiler unrolls the tile and then
//! evaluates one output row at a time, a chain of dependent multiply-adds whose latency, not
//! the arithmetic, sets the speed. Here every tile keeps eight independent accumulators.

#![cfg(target_arch = "x86_64")]

use std::arch::x86_64::*;

use super::block::TimesTile;

/// Band rows per tile and the span of input rows they touch.
pub const ROWS: usize = 4;
pub const SPAN: usize = ROWS + 2 * super::band::HALF_BAND;

/// out (ROWS x p, row-major) = coef (ROWS x SPAN) * xs (SPAN x p, row-major), all p
/// columns (the last, partial lane with masked loads and stores); returns p.
///
/// # Safety
/// The CPU must support AVX2 and FMA.
#[target_feature(enable = "avx2,fma")]
pub unsafe fn band_tile(
    coef: &[[f64; SPAN]; ROWS],
    xs: &[f64],
    p: usize,
    out: &mut [f64],
) -> usize {
    assert!(xs.len() >= SPAN * p && out.len() >= ROWS * p);
    let lanes_end = p / 4 * 4;
    let mut c0 = 0;
    // SAFETY (all pointer arithmetic below): s * p + c0 + 8 <= SPAN * p and
    // t * p + c0 + 8 <= ROWS * p by the loop bounds and the assert above.
    while c0 + 8 <= lanes_end {
        let mut acc = [[_mm256_setzero_pd(); 2]; ROWS];
        for s in 0..SPAN {
            let px = xs.as_ptr().add(s * p + c0);
            let x0 = _mm256_loadu_pd(px);
            let x1 = _mm256_loadu_pd(px.add(4));
            for t in 0..ROWS {
                let b = _mm256_set1_pd(coef[t][s]);
                acc[t][0] = _mm256_fmadd_pd(b, x0, acc[t][0]);
                acc[t][1] = _mm256_fmadd_pd(b, x1, acc[t][1]);
            }
        }
        for (t, a) in acc.iter().enumerate() {
            let po = out.as_mut_ptr().add(t * p + c0);
            _mm256_storeu_pd(po, a[0]);
            _mm256_storeu_pd(po.add(4), a[1]);
        }
        c0 += 8;
    }
    if c0 + 4 <= lanes_end {
        let mut acc = [_mm256_setzero_pd(); ROWS];
        for s in 0..SPAN {
            let x0 = _mm256_loadu_pd(xs.as_ptr().add(s * p + c0));
            for t in 0..ROWS {
                acc[t] = _mm256_fmadd_pd(_mm256_set1_pd(coef[t][s]), x0, acc[t]);
            }
        }
        for (t, a) in acc.iter().enumerate() {
            _mm256_storeu_pd(out.as_mut_ptr().add(t * p + c0), *a);
        }
        c0 += 4;
    }
    let rest = p - c0;
    if rest > 0 {
        // Lanes 0..rest of the last group; masked lanes are neither read nor written.
        let mask = _mm256_setr_epi64x(
            -1,
            if rest > 1 { -1 } else { 0 },
            if rest > 2 { -1 } else { 0 },
            0,
        );
        let mut acc = [_mm256_setzero_pd(); ROWS];
        for s in 0..SPAN {
            let x0 = _mm256_maskload_pd(xs.as_ptr().add(s * p + c0), mask);
            for t in 0..ROWS {
                acc[t] = _mm256_fmadd_pd(_mm256_set1_pd(coef[t][s]), x0, acc[t]);
            }
        }
        for (t, a) in acc.iter().enumerate() {
            _mm256_maskstore_pd(out.as_mut_ptr().add(t * p + c0), mask, *a);
        }
    }
    p
}

/// One tile of the Ritz update (see [`TimesTile`]).
///
/// # Safety
/// The CPU must support AVX2 and FMA.
#[target_feature(enable = "avx2,fma")]
pub unsafe fn times_tile(tile: TimesTile<'_>) {
    let TimesTile {
        ya,
        yb,
        qt,
        p,
        k,
        xa,
        xb,
        pair,
    } = tile;
    let groups = k.div_ceil(4);
    assert!(ya.len() >= ROWS * p && qt.len() >= groups * p * 4 && xa.len() >= ROWS * k);
    assert!(!pair || (yb.len() >= ROWS * p && xb.len() >= ROWS * k));
    for g in 0..groups {
        let qg = qt.as_ptr().add(g * p * 4);
        let mut acc_a = [_mm256_setzero_pd(); ROWS];
        let mut acc_b = [_mm256_setzero_pd(); ROWS];
        // SAFETY: r < p and t < ROWS keep every read inside the asserted lengths.
        if pair {
            for r in 0..p {
                let qv = _mm256_loadu_pd(qg.add(4 * r));
                for t in 0..ROWS {
                    let a = _mm256_set1_pd(*ya.get_unchecked(t * p + r));
                    let b = _mm256_set1_pd(*yb.get_unchecked(t * p + r));
                    acc_a[t] = _mm256_fmadd_pd(a, qv, acc_a[t]);
                    acc_b[t] = _mm256_fmadd_pd(b, qv, acc_b[t]);
                }
            }
        } else {
            for r in 0..p {
                let qv = _mm256_loadu_pd(qg.add(4 * r));
                for t in 0..ROWS {
                    let a = _mm256_set1_pd(*ya.get_unchecked(t * p + r));
                    acc_a[t] = _mm256_fmadd_pd(a, qv, acc_a[t]);
                }
            }
        }
        let c0 = 4 * g;
        let width = (k - c0).min(4);
        for t in 0..ROWS {
            store(&mut xa[t * k + c0..t * k + c0 + width], acc_a[t]);
            if pair {
                store(&mut xb[t * k + c0..t * k + c0 + width], acc_b[t]);
            }
        }
    }
}

/// Stores the first `out.len()` (<= 4) lanes of `v`.
#[target_feature(enable = "avx2,fma")]
fn store(out: &mut [f64], v: __m256d) {
    if out.len() == 4 {
        // SAFETY: exactly four f64 are writable at `out`.
        unsafe { _mm256_storeu_pd(out.as_mut_ptr(), v) };
    } else {
        let mut lane = [0.0; 4];
        // SAFETY: `lane` holds four f64.
        unsafe { _mm256_storeu_pd(lane.as_mut_ptr(), v) };
        for (o, l) in out.iter_mut().zip(lane) {
            *o = l;
        }
    }
}
