//! K^-1 M applied to a block of vectors in two fused sweeps over the elements.
//!
//! Y = K^-1 L for a block of loads L (the flexibility recursion of
//! [`crate::fem::flexibility`]) followed by M Y (the banded product of
//! [`crate::fem::block::band_times_block`]) in two passes instead of three, element by element:
//! * the down sweep (tip to base) turns the loads into the resultant force P (N) and moment
//!   C (N m) at every node, kept in Y's w and theta rows, and writes the bubble
//!   displacements (local to each element);
//! * the up sweep (base to tip) integrates slope and deflection through each element, and as
//!   soon as rows 4e..4e + 3 are final (they need Y only up to node e + 1) forms their rows
//!   of M Y from the band rows, while both are still in cache.
//!
//! Optionally the up sweep also accumulates the exact Ritz residuals of the previous Ritz
//! pairs (X, lambda) when L = M X: |Y - X / lambda|_M^2 = (Y - X/lambda)^T (M Y - M X/lambda),
//! so the stopping test costs no pass of its own.
//!
//! Blocks of more than 2^18 values are swept in two halves at once, split at the middle
//! element S: the lower half starts its down sweep as if nothing acted above S and gathers
//! how its resultants and the displacement of S depend on the resultants (P_S, C_S) from
//! above (statics and the recursion are linear), so after both down sweeps the lower half is
//! corrected on the fly and both up sweeps run at once. The sweeps are bound by memory
//! traffic, which two cores share well (two half-size sweeps take the time of one). The
//! split does not depend on the thread count, so neither do the results.
//!
//! Units: loads in N and N m (per unit of the vectors' scale), displacements in m and rad.
//! Every operation adds quantities of like magnitude, as in the separate kernels, so the
//! result is exact to rounding at any mesh size.

use super::band::{SymBand, HALF_BAND};
use super::block::Block;
use super::model::BeamModel;

/// Running sums of the Ritz residuals for the first `k` columns (see [`apply_and_mass`]).
#[derive(Debug, Clone)]
pub struct ResidualSums<'a> {
    /// The Ritz vectors X and M X whose images are being formed (L = M X).
    pub x: &'a Block,
    pub mx: &'a Block,
    /// 1 / lambda of the first k Ritz values.
    pub inverse_values: Vec<f64>,
    /// sum (y - x/lambda)(My - Mx/lambda) per column.
    pub squared: Vec<f64>,
    /// sum x (M x) per column (the squared M-norm of x).
    pub norms: Vec<f64>,
}

impl<'a> ResidualSums<'a> {
    pub fn new(x: &'a Block, mx: &'a Block, values: &[f64]) -> Self {
        let k = values.len();
        ResidualSums {
            x,
            mx,
            inverse_values: values.iter().map(|v| 1.0 / v).collect(),
            squared: vec![0.0; k],
            norms: vec![0.0; k],
        }
    }

    /// Relative residuals |K^-1 M x - x / lambda|_M / |x / lambda|_M per column.
    pub fn relative(&self) -> Vec<f64> {
        (0..self.squared.len())
            .map(|c| {
                self.squared[c].max(0.0).sqrt() / (self.inverse_values[c] * self.norms[c].sqrt())
            })
            .collect()
    }
}

/// Structural extent of band row r (r < 4 N): how many super-diagonals (`upper`) and
/// sub-diagonals (`lower`) can be non-zero. Row 4e + j belongs to element e: w_e (j = 0) and
/// theta_e (j = 1) couple with elements e - 1 and e, the bubbles (j = 2, 3) only within e.
const UPPER: [usize; 4] = [5, 4, 3, 2];
const LOWER: [usize; 4] = [4, 5, 2, 3];

/// y = K^-1 loads and my = M y in two sweeps; with `residual`, also its sums over all rows.
#[track_caller]
pub fn apply_and_mass(
    model: &BeamModel,
    loads: &Block,
    y: &mut Block,
    my: &mut Block,
    residual: Option<&mut ResidualSums<'_>>,
) {
    let p = loads.width;
    let dofs = model.dofs();
    assert!(loads.dofs == dofs && y.dofs == dofs && my.dofs == dofs);
    assert!(y.width == p && my.width == p);
    if let Some(r) = &residual {
        assert!(r.x.dofs == dofs && r.mx.dofs == dofs && r.x.width == p && r.mx.width == p);
        assert!(r.inverse_values.len() <= p);
    }
    if p == 0 {
        return;
    }
    // The AVX2 + FMA sweeps when the CPU has them (each sweep function dispatches itself,
    // see `with_fma!`); `body` picks the sequential or the split form.
    #[cfg(target_arch = "x86_64")]
    if super::block::kernels::has_fma() {
        return kernel::body::<true>(model, loads, y, my, residual);
    }
    kernel::body::<false>(model, loads, y, my, residual)
}

mod kernel {
    use super::*;

    /// a * b + c, fused on CPUs with FMA (selected at run time), plain elsewhere.
    #[inline(always)]
    fn mul_add<const FMA: bool>(a: f64, b: f64, c: f64) -> f64 {
        if FMA {
            a.mul_add(b, c)
        } else {
            a * b + c
        }
    }

    const LANES: usize = 4;

    /// Elements ahead of the sweep whose rows are requested from memory.
    const AHEAD: usize = 6;

    /// Asks for `len` values from `at` to be brought into cache (a hint; no effect on
    /// results). The sweeps run down as well as up through blocks larger than the
    /// caches, and the hardware prefetchers follow the descending stream poorly.
    #[inline(always)]
    fn prefetch(s: &[f64], at: usize, len: usize) {
        #[cfg(target_arch = "x86_64")]
        {
            let end = (at + len).min(s.len());
            let mut i = at;
            while i < end {
                // SAFETY: i < s.len(), so the pointer is inside the slice; a prefetch never
                // faults and does not change memory.
                unsafe {
                    std::arch::x86_64::_mm_prefetch(
                        s.as_ptr().add(i) as *const i8,
                        std::arch::x86_64::_MM_HINT_T0,
                    )
                };
                i += 8;
            }
        }
        #[cfg(not(target_arch = "x86_64"))]
        let _ = (s, at, len);
    }

    #[inline(always)]
    fn lanes(s: &[f64], at: usize) -> [f64; LANES] {
        s[at..at + LANES].try_into().expect("four lanes")
    }

    /// Element e of the down sweep: bubble displacements q = B l_q and the resultants at
    /// node e from those at node e + 1 (P_a = l_w + P_b, C_a = l_t + C_b + P_b h).
    #[inline(always)]
    fn down_step<const FMA: bool>(
        [q1, q2, ca, pa]: [&mut [f64]; 4],
        [pb, cb, lw, lt, l1, l2]: [&[f64]; 6],
        [b11, b12, b22, h]: [f64; 4],
    ) {
        let one = |c: usize, q1: &mut [f64], q2: &mut [f64], ca: &mut [f64], pa: &mut [f64]| {
            q1[c] = mul_add::<FMA>(b11, l1[c], b12 * l2[c]);
            q2[c] = mul_add::<FMA>(b12, l1[c], b22 * l2[c]);
            ca[c] = mul_add::<FMA>(pb[c], h, lt[c] + cb[c]);
            pa[c] = lw[c] + pb[c];
        };
        let p = pa.len();
        let mut c0 = 0;
        while c0 + LANES <= p {
            let (v1, v2) = (lanes(l1, c0), lanes(l2, c0));
            let (vp, vc) = (lanes(pb, c0), lanes(cb, c0));
            let (vw, vt) = (lanes(lw, c0), lanes(lt, c0));
            let mut o = [[0.0; LANES]; 4];
            for l in 0..LANES {
                o[0][l] = mul_add::<FMA>(b11, v1[l], b12 * v2[l]);
                o[1][l] = mul_add::<FMA>(b12, v1[l], b22 * v2[l]);
                o[2][l] = mul_add::<FMA>(vp[l], h, vt[l] + vc[l]);
                o[3][l] = vw[l] + vp[l];
            }
            q1[c0..c0 + LANES].copy_from_slice(&o[0]);
            q2[c0..c0 + LANES].copy_from_slice(&o[1]);
            ca[c0..c0 + LANES].copy_from_slice(&o[2]);
            pa[c0..c0 + LANES].copy_from_slice(&o[3]);
            c0 += LANES;
        }
        for c in c0..p {
            one(c, q1, q2, ca, pa);
        }
    }

    /// Element e of the up sweep: (w, theta) at node e + 1 from node e and the end loads
    /// (P, C) held in the node e + 1 rows.
    #[inline(always)]
    fn up_step<const FMA: bool>(
        [wb, tb]: [&mut [f64]; 2],
        [wa, ta]: [&[f64]; 2],
        [fww, fwt, ftt, h]: [f64; 4],
    ) {
        let one = |load: f64, moment: f64, w: f64, t: f64| {
            (
                mul_add::<FMA>(
                    fww,
                    load,
                    mul_add::<FMA>(fwt, moment, mul_add::<FMA>(h, t, w)),
                ),
                mul_add::<FMA>(fwt, load, mul_add::<FMA>(ftt, moment, t)),
            )
        };
        let p = wa.len();
        let mut c0 = 0;
        while c0 + LANES <= p {
            let (vp, vc) = (lanes(wb, c0), lanes(tb, c0));
            let (vw, vt) = (lanes(wa, c0), lanes(ta, c0));
            let mut o = [[0.0; LANES]; 2];
            for l in 0..LANES {
                (o[0][l], o[1][l]) = one(vp[l], vc[l], vw[l], vt[l]);
            }
            wb[c0..c0 + LANES].copy_from_slice(&o[0]);
            tb[c0..c0 + LANES].copy_from_slice(&o[1]);
            c0 += LANES;
        }
        for c in c0..p {
            (wb[c], tb[c]) = one(wb[c], tb[c], wa[c], ta[c]);
        }
    }

    /// The two halves of a split sweep: elements below `split` (L) and from `split` up (U).
    /// Blocks smaller than this many values are swept in one piece.
    const SPLIT_VALUES: usize = 1 << 18;

    /// What the lower half's down sweep gathers for the displacement of the split node S:
    /// with its resultants computed as if nothing acted above S (P^loc, C^loc), the true ones
    /// are P = P^loc + P_S and C = C^loc + C_S + P_S (z_S - z), and the up-sweep recursion
    /// gives theta_S = theta_0 + theta + alpha . (P_S, C_S) and
    /// w_S = w_0 + theta_0 z_S + w + beta . (P_S, C_S).
    struct SplitSums {
        theta: Vec<f64>,
        w: Vec<f64>,
        alpha: [f64; 2],
        beta: [f64; 2],
    }

    pub(super) fn body<const FMA: bool>(
        model: &BeamModel,
        loads: &Block,
        y: &mut Block,
        my: &mut Block,
        residual: Option<&mut ResidualSums<'_>>,
    ) {
        let split = model.operator.len() / 2;
        if loads.data.len() < SPLIT_VALUES || split < 2 {
            sequential::<FMA>(model, loads, y, my, residual);
        } else {
            halves::<FMA>(model, loads, y, my, residual, split);
        }
    }

    fn sequential<const FMA: bool>(
        model: &BeamModel,
        loads: &Block,
        y: &mut Block,
        my: &mut Block,
        mut residual: Option<&mut ResidualSums<'_>>,
    ) {
        let p = loads.width;
        let n_el = model.operator.len();
        let l = &loads.data[..];
        let yd = &mut y.data[..];
        // Top node: its resultants are its own loads.
        let top = 4 * n_el;
        yd[top * p..(top + 2) * p].copy_from_slice(&l[top * p..(top + 2) * p]);
        down_range::<FMA>(model, l, yd, 0, p, 0..n_el, None);
        base_springs(model, yd, p);
        let myd = &mut my.data[..];
        up_range::<FMA>(
            model,
            yd,
            myd,
            0,
            p,
            0..n_el,
            0..n_el,
            None,
            residual.as_deref_mut(),
        );
        top_rows::<FMA>(model, yd, myd, 0, p, residual);
    }

    /// The sweeps split at element `s`: each half on its own core (the sweeps are bound by
    /// memory traffic, which two cores share well), with the lower half corrected for the
    /// resultants (P_S, C_S) from above by [`SplitSums`]. The split is fixed, not set by the
    /// thread count, so results do not depend on it.
    fn halves<const FMA: bool>(
        model: &BeamModel,
        loads: &Block,
        y: &mut Block,
        my: &mut Block,
        residual: Option<&mut ResidualSums<'_>>,
        s: usize,
    ) {
        let p = loads.width;
        let n_el = model.operator.len();
        let l = &loads.data[..];
        let cut = 4 * s;
        let z_s = model.z_m[s];
        let (y_lo, y_hi) = y.data.split_at_mut(cut * p);
        let mut sums = SplitSums {
            theta: vec![0.0; p],
            w: vec![0.0; p],
            alpha: [0.0; 2],
            beta: [0.0; 2],
        };
        rayon::join(
            || down_range::<FMA>(model, l, y_lo, 0, p, 0..s, Some(&mut sums)),
            || {
                let top = 4 * n_el - cut;
                y_hi[top * p..(top + 2) * p].copy_from_slice(&l[4 * n_el * p..(4 * n_el + 2) * p]);
                down_range::<FMA>(model, l, y_hi, cut, p, s..n_el, None);
            },
        );
        // Resultants at S from above, then the base and the split node's displacements.
        let (p_s, c_s) = (y_hi[..p].to_vec(), y_hi[p..2 * p].to_vec());
        for c in 0..p {
            y_lo[c] += p_s[c];
            y_lo[p + c] = mul_add::<FMA>(p_s[c], z_s, y_lo[p + c] + c_s[c]);
        }
        base_springs(model, y_lo, p);
        let SplitSums {
            theta,
            w,
            alpha,
            beta,
        } = sums;
        for c in 0..p {
            let (w0, t0) = (y_lo[c], y_lo[p + c]);
            let t_s = t0 + theta[c] + alpha[0] * p_s[c] + alpha[1] * c_s[c];
            let w_s = w0 + t0 * z_s + w[c] + beta[0] * p_s[c] + beta[1] * c_s[c];
            y_hi[c] = w_s;
            y_hi[p + c] = t_s;
        }
        let (my_lo, my_hi) = my.data.split_at_mut(cut * p);
        let mut parts = residual.as_deref().map(|r| {
            let k = r.inverse_values.len();
            let fresh = || ResidualSums {
                squared: vec![0.0; k],
                norms: vec![0.0; k],
                ..r.clone()
            };
            (fresh(), fresh())
        });
        let (res_lo, res_hi) = match parts.as_mut() {
            Some((a, b)) => (Some(a), Some(b)),
            None => (None, None),
        };
        let correction = (&p_s[..], &c_s[..], z_s);
        rayon::join(
            || {
                up_range::<FMA>(
                    model,
                    y_lo,
                    my_lo,
                    0,
                    p,
                    0..s - 1,
                    0..s - 1,
                    Some(correction),
                    res_lo,
                )
            },
            || {
                let mut res_hi = res_hi;
                let upper = s + 1..n_el;
                let res = res_hi.as_deref_mut();
                up_range::<FMA>(model, y_hi, my_hi, cut, p, s..n_el, upper, None, res);
                top_rows::<FMA>(model, y_hi, my_hi, cut, p, res_hi);
            },
        );
        // Residual rows of elements s - 1 and s, which read both halves, last.
        let yd = &y.data[..];
        let myd = &mut my.data[..];
        element_mass_rows::<FMA>(&model.mass, yd, 0, p, s - 1, myd);
        element_mass_rows::<FMA>(&model.mass, yd, 0, p, s, myd);
        if let (Some(res), Some((lo, hi))) = (residual, parts) {
            for r in 4 * (s - 1)..4 * (s + 1) {
                accumulate::<FMA>(res, yd, myd, 0, p, r);
            }
            for part in [lo, hi] {
                for c in 0..res.squared.len() {
                    res.squared[c] += part.squared[c];
                    res.norms[c] += part.norms[c];
                }
            }
        }
    }

    /// Compiles `$body::<true>` with AVX2 + FMA as `$fast` and defines `$name` choosing it
    /// for FMA = true. The sweeps run inside rayon closures, which do not inherit the
    /// caller's target features, so each is dispatched on its own.
    macro_rules! with_fma {
        ($name:ident, $fast:ident, $body:ident, ($($arg:ident: $ty:ty),*)) => {
            #[cfg(target_arch = "x86_64")]
            #[target_feature(enable = "avx2,fma")]
            #[allow(clippy::too_many_arguments)]
            fn $fast($($arg: $ty),*) {
                $body::<true>($($arg),*)
            }

            #[allow(clippy::too_many_arguments)]
            fn $name<const FMA: bool>($($arg: $ty),*) {
                #[cfg(target_arch = "x86_64")]
                if FMA {
                    // SAFETY: FMA = true is only chosen after the run-time check of AVX2 and
                    // FMA in `apply_and_mass`.
                    unsafe { $fast($($arg),*) };
                    return;
                }
                $body::<false>($($arg),*)
            }
        };
    }

    with_fma!(down_range, down_range_fma, down_range_body, (model: &BeamModel, l: &[f64],
        yd: &mut [f64], r0: usize, p: usize, elements: std::ops::Range<usize>,
        split: Option<&mut SplitSums>));
    with_fma!(up_range, up_range_fma, up_range_body, (model: &BeamModel, yd: &mut [f64],
        myd: &mut [f64], r0: usize, p: usize, steps: std::ops::Range<usize>,
        mass: std::ops::Range<usize>, correction: Option<(&[f64], &[f64], f64)>,
        residual: Option<&mut ResidualSums<'_>>));
    with_fma!(top_rows, top_rows_fma, top_rows_body, (model: &BeamModel, yd: &[f64],
        myd: &mut [f64], r0: usize, p: usize, residual: Option<&mut ResidualSums<'_>>));

    /// Down sweep over `elements` (descending) of the rows held in `yd` from row `r0` on.
    /// The node above the range is read from `yd` when it is there, else taken as free of
    /// load (the lower half of a split sweep, which then gathers `split`).
    #[inline(always)]
    fn down_range_body<const FMA: bool>(
        model: &BeamModel,
        l: &[f64],
        yd: &mut [f64],
        r0: usize,
        p: usize,
        elements: std::ops::Range<usize>,
        mut split: Option<&mut SplitSums>,
    ) {
        let ops = &model.operator;
        let zero = vec![0.0; 2 * p];
        let rows = yd.len() / p;
        let z_s = model.z_m[elements.end];
        for e in elements.clone().rev() {
            if e >= AHEAD + elements.start {
                prefetch(l, 4 * (e - AHEAD) * p, 4 * p);
                prefetch(yd, (4 * (e - AHEAD) - r0) * p, 4 * p);
            }
            let op = &ops[e];
            let [b11, b12, b22] = op.bubble_flexibility;
            let h = op.length_m;
            let base = (4 * e - r0) * p;
            let inside = 4 * e + 6 <= r0 + rows;
            let (lower, upper) = if inside {
                let (lo, up) = yd[base..base + 6 * p].split_at_mut(4 * p);
                (lo, &*up)
            } else {
                (&mut yd[base..base + 4 * p], &zero[..])
            };
            let (pa, rest) = lower.split_at_mut(p);
            let (ca, rest) = rest.split_at_mut(p);
            let (q1, q2) = rest.split_at_mut(p);
            let (pb, cb) = upper.split_at(p);
            let at = 4 * e * p;
            let lw = &l[at..at + p];
            let lt = &l[at + p..at + 2 * p];
            let l1 = &l[at + 2 * p..at + 3 * p];
            let l2 = &l[at + 3 * p..at + 4 * p];
            if let Some(sums) = split.as_deref_mut() {
                let [fww, fwt, ftt] = op.flexibility;
                let lever = z_s - model.z_m[e + 1];
                let (cp, cc) = (fww + fwt * lever, fwt + ftt * lever);
                for c in 0..p {
                    sums.theta[c] =
                        mul_add::<FMA>(fwt, pb[c], mul_add::<FMA>(ftt, cb[c], sums.theta[c]));
                    sums.w[c] = mul_add::<FMA>(cp, pb[c], mul_add::<FMA>(cc, cb[c], sums.w[c]));
                }
                sums.alpha[0] += fwt + ftt * lever;
                sums.alpha[1] += ftt;
                sums.beta[0] += cp + cc * lever;
                sums.beta[1] += cc;
            }
            down_step::<FMA>(
                [q1, q2, ca, pa],
                [pb, cb, lw, lt, l1, l2],
                [b11, b12, b22, h],
            );
        }
    }

    /// Base: the springs take the resultants; a rigid direction stays at zero.
    fn base_springs(model: &BeamModel, yd: &mut [f64], p: usize) {
        for (row, spring) in [model.base_lateral_n_per_m, model.base_rotational_nm_per_rad]
            .into_iter()
            .enumerate()
        {
            let r = &mut yd[row * p..(row + 1) * p];
            match spring {
                Some(k) => r.iter_mut().for_each(|v| *v /= k),
                None => r.fill(0.0),
            }
        }
    }

    /// Up sweep through `steps` (each integrates element e to its upper node), then rows
    /// 4e..4e + 3 of M y for e in `mass` (each needs y up to node e + 1). `correction`
    /// (P_S, C_S, z_S) turns local resultants into true ones first (lower half of a split).
    #[allow(clippy::too_many_arguments)]
    #[inline(always)]
    fn up_range_body<const FMA: bool>(
        model: &BeamModel,
        yd: &mut [f64],
        myd: &mut [f64],
        r0: usize,
        p: usize,
        steps: std::ops::Range<usize>,
        mass: std::ops::Range<usize>,
        correction: Option<(&[f64], &[f64], f64)>,
        mut residual: Option<&mut ResidualSums<'_>>,
    ) {
        let ops = &model.operator;
        debug_assert!(mass.start >= steps.start && mass.end <= steps.end);
        for e in steps.clone() {
            if e + AHEAD < steps.end {
                prefetch(yd, (4 * (e + AHEAD) - r0) * p, 4 * p);
                prefetch(myd, (4 * (e + AHEAD) - r0) * p, 4 * p);
            }
            let op = &ops[e];
            let [fww, fwt, ftt] = op.flexibility;
            let h = op.length_m;
            let base = (4 * e - r0) * p;
            let (lower, upper) = yd[base..base + 6 * p].split_at_mut(4 * p);
            let wa = &lower[..p];
            let ta = &lower[p..2 * p];
            let (wb, tb) = upper.split_at_mut(p);
            if let Some((p_s, c_s, z_s)) = correction {
                let lever = z_s - model.z_m[e + 1];
                for c in 0..p {
                    tb[c] = mul_add::<FMA>(p_s[c], lever, tb[c] + c_s[c]);
                    wb[c] += p_s[c];
                }
            }
            up_step::<FMA>([wb, tb], [wa, ta], [fww, fwt, ftt, h]);
            if !mass.contains(&e) {
                continue;
            }
            if e == 0 {
                for j in 0..4 {
                    mass_row::<FMA>(&model.mass, yd, r0, p, j, UPPER[j], LOWER[j], myd);
                }
            } else {
                element_mass_rows::<FMA>(&model.mass, yd, r0, p, e, myd);
            }
            if let Some(res) = residual.as_deref_mut() {
                for r in 4 * e..4 * e + 4 {
                    accumulate::<FMA>(res, yd, myd, r0, p, r);
                }
            }
        }
    }

    /// Rows of M y (and residual sums) of the top node.
    #[inline(always)]
    fn top_rows_body<const FMA: bool>(
        model: &BeamModel,
        yd: &[f64],
        myd: &mut [f64],
        r0: usize,
        p: usize,
        mut residual: Option<&mut ResidualSums<'_>>,
    ) {
        let n_el = model.operator.len();
        for (r, upper) in [(4 * n_el, 1), (4 * n_el + 1, 0)] {
            mass_row::<FMA>(&model.mass, yd, r0, p, r, upper, 4 + (r - 4 * n_el), myd);
            if let Some(res) = residual.as_deref_mut() {
                accumulate::<FMA>(res, yd, myd, r0, p, r);
            }
        }
    }

    /// Rows 4e..4e + 3 (e >= 1) of M y: each is a combination of the ten rows
    /// 4e - 4..4e + 5 of y (elements e - 1 and e), taken four columns at a time with the ten
    /// rows in registers and one accumulator per output row.
    #[inline(always)]
    fn element_mass_rows<const FMA: bool>(
        a: &SymBand,
        y: &[f64],
        r0: usize,
        p: usize,
        e: usize,
        my: &mut [f64],
    ) {
        let first = 4 * e - 4;
        // coef[j][k] = M[4e + j][first + k] over the structurally non-zero entries.
        let mut coef = [[0.0; SPAN]; 4];
        for (j, row) in coef.iter_mut().enumerate() {
            let r = 4 * e + j;
            for k in 0..=UPPER[j] {
                row[4 + j + k] = a.row(r)[k];
            }
            for m in 1..=LOWER[j] {
                row[4 + j - m] = a.row(r - m)[m];
            }
        }
        let ys = &y[(first - r0) * p..(first - r0 + SPAN) * p];
        let out = &mut my[(4 * e - r0) * p..(4 * e - r0 + 4) * p];
        // Whole four-lane chunks, up to GROUP of them at once: each coefficient is
        // broadcast once and feeds every chunk's accumulator (4 x chunks independent
        // chains); y is read from L1 as multiply-add operands.
        let mut c0 = 0;
        while p - c0 >= LANES {
            let chunks = ((p - c0) / LANES).min(GROUP);
            match chunks {
                1 => mass_chunks::<FMA, 1>(&coef, ys, p, c0, out),
                2 => mass_chunks::<FMA, 2>(&coef, ys, p, c0, out),
                3 => mass_chunks::<FMA, 3>(&coef, ys, p, c0, out),
                _ => mass_chunks::<FMA, GROUP>(&coef, ys, p, c0, out),
            }
            c0 += chunks * LANES;
        }
        for c in c0..p {
            for j in 0..4 {
                let mut acc = 0.0;
                for k in 0..SPAN {
                    acc = mul_add::<FMA>(coef[j][k], ys[k * p + c], acc);
                }
                out[j * p + c] = acc;
            }
        }
    }

    /// Most four-lane chunks [`element_mass_rows`] takes at once (16 accumulators).
    const GROUP: usize = 4;
    const SPAN: usize = 10;

    /// Columns c0..c0 + 4 CH of the four rows: out[j] = sum_k coef[j][k] ys[k].
    #[inline(always)]
    fn mass_chunks<const FMA: bool, const CH: usize>(
        coef: &[[f64; SPAN]; 4],
        ys: &[f64],
        p: usize,
        c0: usize,
        out: &mut [f64],
    ) {
        let mut acc = [[[0.0; LANES]; CH]; 4];
        for k in 0..SPAN {
            let yk: [[f64; LANES]; CH] =
                std::array::from_fn(|ch| lanes(ys, k * p + c0 + ch * LANES));
            for (j, aj) in acc.iter_mut().enumerate() {
                let v = coef[j][k];
                for (a, yv) in aj.iter_mut().zip(&yk) {
                    for l in 0..LANES {
                        a[l] = mul_add::<FMA>(v, yv[l], a[l]);
                    }
                }
            }
        }
        for (j, aj) in acc.iter().enumerate() {
            for (ch, a) in aj.iter().enumerate() {
                let at = j * p + c0 + ch * LANES;
                out[at..at + LANES].copy_from_slice(a);
            }
        }
    }

    /// Row r of M y from the band: sum_k A[r][r + k] y_(r + k) over k = 0..=upper and
    /// A[r - k][r] y_(r - k) over k = 1..=lower (the structurally non-zero entries).
    #[inline(always)]
    #[allow(clippy::too_many_arguments)]
    fn mass_row<const FMA: bool>(
        a: &SymBand,
        y: &[f64],
        r0: usize,
        p: usize,
        r: usize,
        upper: usize,
        lower: usize,
        my: &mut [f64],
    ) {
        let mut terms = [(0.0f64, 0usize); 2 * HALF_BAND + 1];
        let mut count = 0;
        let own = a.row(r);
        for (k, &v) in own.iter().enumerate().take(upper + 1) {
            terms[count] = (v, r + k);
            count += 1;
        }
        for k in 1..=lower.min(r) {
            terms[count] = (a.row(r - k)[k], r - k);
            count += 1;
        }
        let terms = &terms[..count];
        let out = &mut my[(r - r0) * p..(r - r0 + 1) * p];
        let src: [&[f64]; 2 * HALF_BAND + 1] = std::array::from_fn(|t| {
            terms
                .get(t)
                .map_or(&[][..], |&(_, j)| &y[(j - r0) * p..(j - r0 + 1) * p])
        });
        let src = &src[..count];
        // Up to GROUP columns at a time, each four-lane chunk its own accumulator chain, so
        // the multiply-adds of one term over the chunks are independent.
        const GROUP: usize = 4 * LANES;
        let mut g0 = 0;
        while g0 < p {
            let width = GROUP.min(p - g0);
            let chunks = width / LANES;
            let mut acc = [[0.0; LANES]; GROUP / LANES];
            let mut tail = [0.0; LANES];
            for (&(v, _), ys) in terms.iter().zip(src) {
                let ys = &ys[g0..g0 + width];
                for (ch, a) in acc.iter_mut().enumerate().take(chunks) {
                    let yv = lanes(ys, ch * LANES);
                    for l in 0..LANES {
                        a[l] = mul_add::<FMA>(v, yv[l], a[l]);
                    }
                }
                for (t, a) in tail.iter_mut().enumerate().take(width - chunks * LANES) {
                    *a = mul_add::<FMA>(v, ys[chunks * LANES + t], *a);
                }
            }
            let o = &mut out[g0..g0 + width];
            for (ch, a) in acc.iter().enumerate().take(chunks) {
                o[ch * LANES..(ch + 1) * LANES].copy_from_slice(a);
            }
            o[chunks * LANES..].copy_from_slice(&tail[..width - chunks * LANES]);
            g0 += width;
        }
    }

    /// Adds row r's share of the residual sums.
    #[inline(always)]
    fn accumulate<const FMA: bool>(
        res: &mut ResidualSums<'_>,
        y: &[f64],
        my: &[f64],
        r0: usize,
        p: usize,
        r: usize,
    ) {
        let k = res.inverse_values.len();
        let local = (r - r0) * p;
        let yr = &y[local..local + k];
        let myr = &my[local..local + k];
        let xr = &res.x.data[r * p..r * p + k];
        let mxr = &res.mx.data[r * p..r * p + k];
        for c in 0..k {
            let inv = res.inverse_values[c];
            let d = mul_add::<FMA>(-xr[c], inv, yr[c]);
            let md = mul_add::<FMA>(-mxr[c], inv, myr[c]);
            res.squared[c] = mul_add::<FMA>(d, md, res.squared[c]);
            res.norms[c] = mul_add::<FMA>(xr[c], mxr[c], res.norms[c]);
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::fem::block::band_times_block;
    use crate::fem::flexibility::apply_inverse_stiffness_block;

    fn model(base: Option<crate::case::BaseSprings>, elements: usize) -> BeamModel {
        let mut case = crate::input::demo_case();
        case.base = base;
        let stage = case.stages[1].clone();
        BeamModel::build(&case, &stage, Some(elements), 3)
    }

    #[test]
    fn fused_sweeps_match_the_separate_kernels() {
        // The separate kernels are the definitions: u = K^-1 f (flexibility recursion), M u
        // (band product); the residual sums are checked against their formula.
        let springs = crate::case::BaseSprings {
            rotational_nm_per_rad: Some(3e11),
            lateral_n_per_m: Some(2e9),
        };
        // The large mesh takes the split (two-core) sweep for the wider blocks.
        for (base, elements, widths) in [
            (None, 37, &[1, 3, 4, 7, 13][..]),
            (Some(springs), 37, &[1, 3, 4, 7, 13][..]),
            (Some(springs), 6000, &[3, 12][..]),
            (None, 6000, &[13][..]),
        ] {
            let m = model(base, elements);
            let dofs = m.dofs();
            for &p in widths {
                let mut f = Block::zeros(dofs, p);
                for (i, v) in f.data.iter_mut().enumerate() {
                    *v = ((i * 7919 % 1000) as f64 / 500.0 - 1.0) * 1e5;
                }
                let mut u_ref = Block::zeros(dofs, p);
                apply_inverse_stiffness_block(&m, &f, &mut u_ref);
                let mut mu_ref = Block::zeros(dofs, p);
                band_times_block(&m.mass, &u_ref, &mut mu_ref);
                let (mut u, mut mu) = (Block::zeros(dofs, p), Block::zeros(dofs, p));
                // X stands in for Ritz vectors with loads M X = f.
                let x = Block {
                    dofs,
                    width: p,
                    data: f.data.iter().map(|v| v * 1e-9).collect(),
                };
                let values: Vec<f64> = (0..p.min(3)).map(|c| 10.0 + c as f64).collect();
                let mut sums = ResidualSums::new(&x, &f, &values);
                apply_and_mass(&m, &f, &mut u, &mut mu, Some(&mut sums));
                let scale = |b: &Block| b.data.iter().fold(0.0f64, |a, v| a.max(v.abs()));
                let (su, smu) = (scale(&u_ref), scale(&mu_ref));
                for i in 0..dofs * p {
                    assert!((u.data[i] - u_ref.data[i]).abs() <= 1e-12 * su, "u {i}");
                    assert!((mu.data[i] - mu_ref.data[i]).abs() <= 1e-12 * smu, "Mu {i}");
                }
                for (c, &lam) in values.iter().enumerate() {
                    // Sums in another order: compared against the sum of magnitudes.
                    let (mut sq, mut nrm, mut sq_abs, mut nrm_abs) = (0.0, 0.0, 0.0, 0.0);
                    for r in 0..dofs {
                        let d = u_ref.get(r, c) - x.get(r, c) / lam;
                        let md = mu_ref.get(r, c) - f.get(r, c) / lam;
                        sq += d * md;
                        sq_abs += (d * md).abs();
                        nrm += x.get(r, c) * f.get(r, c);
                        nrm_abs += (x.get(r, c) * f.get(r, c)).abs();
                    }
                    assert!(
                        (sums.squared[c] - sq).abs() <= 1e-12 * sq_abs,
                        "residual {c}: {} vs {sq} ({sq_abs})",
                        sums.squared[c]
                    );
                    assert!((sums.norms[c] - nrm).abs() <= 1e-12 * nrm_abs, "norm {c}");
                }
            }
        }
    }
}
