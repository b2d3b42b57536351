//! Streamed, mergeable statistics whose merged result does not depend on how the samples
//! were split (shards, threads) or in which order they were added: every state is made of
//! exact integers, so merging is exact addition and the unsharded run and any merge of
//! shards give bit-identical numbers.
//!
//! - [`ExactSum`]: the exact sum of non-negative f64 values as a fixed-point integer of
//!   2^-1074 units in 32-bit limbs (the f64 range), rounded to f64 only when read (by a
//!   fixed rule, so equal states read equal). Gives the mean.
//! - [`Sketch`]: a logarithmic-bin quantile sketch (the "DDSketch" idea: Masson, Rim & Lee,
//!   "DDSketch: a fast and fully-mergeable quantile sketch with relative-error guarantees",
//!   VLDB 2019): bin i holds the values in (g^(i-1), g^i], g = (1 + a) / (1 - a); a
//!   quantile is reported as the bin's centre 2 g^i / (g + 1), within relative error `a`
//!   ([`RELATIVE_ACCURACY`]) of the exact order statistic of rank ceil(q n). Zeros are
//!   counted exactly in their own bin. Memory grows with the range of the values, not with
//!   their number.
//! - counts: u64.
//!
//! Units: those of the quantity.

use serde::{Deserialize, Serialize};

/// Relative accuracy `a` of the quantile sketch: a reported percentile is within a factor
/// (1 +- a) of the exact sample order statistic.
pub const RELATIVE_ACCURACY: f64 = 1e-4;

/// Number of 32-bit limbs covering 2^-1074 .. 2^1024 with room for carries.
const LIMBS: usize = 70;

/// Exact sum of non-negative finite f64 values.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
pub struct ExactSum {
    limbs: Vec<u64>,
    /// Additions since the last carry propagation (each adds < 2^32 to a limb).
    #[serde(skip)]
    pending: u32,
}

impl Default for ExactSum {
    fn default() -> Self {
        ExactSum {
            limbs: vec![0; LIMBS],
            pending: 0,
        }
    }
}

impl ExactSum {
    /// Adds `x` (finite, >= 0; anything else is a programmer error).
    #[inline]
    pub fn add(&mut self, x: f64) {
        debug_assert!(
            x.is_finite() && x >= 0.0,
            "ExactSum takes finite x >= 0, got {x}"
        );
        if x == 0.0 {
            return;
        }
        let bits = x.to_bits();
        let exp = ((bits >> 52) & 0x7ff) as usize;
        let frac = bits & ((1u64 << 52) - 1);
        // value = mantissa * 2^(shift - 1074)
        let (mantissa, shift) = if exp == 0 {
            (frac, 0)
        } else {
            (frac | (1u64 << 52), exp - 1)
        };
        let limb = shift / 32;
        let wide = (mantissa as u128) << (shift % 32);
        self.limbs[limb] += (wide & 0xffff_ffff) as u64;
        self.limbs[limb + 1] += ((wide >> 32) & 0xffff_ffff) as u64;
        self.limbs[limb + 2] += (wide >> 64) as u64;
        self.pending += 1;
        if self.pending >= 1 << 30 {
            self.normalise();
        }
    }

    fn normalise(&mut self) {
        let mut carry = 0u64;
        for l in self.limbs.iter_mut() {
            let v = *l + carry;
            *l = v & 0xffff_ffff;
            carry = v >> 32;
        }
        debug_assert_eq!(carry, 0, "exact sum overflowed the f64 range");
        self.pending = 0;
    }

    /// Adds another sum.
    pub fn merge(&mut self, other: &ExactSum) {
        let mut o = other.clone();
        o.normalise();
        self.normalise();
        for (a, b) in self.limbs.iter_mut().zip(&o.limbs) {
            *a += b;
        }
        self.normalise();
    }

    /// Whether a deserialised state has the right shape (limb count, limb range).
    pub fn is_well_formed(&self) -> bool {
        self.limbs.len() == LIMBS && self.limbs.iter().all(|&l| l <= 0xffff_ffff)
    }

    /// The canonical state (carries propagated).
    pub fn canonical(&self) -> ExactSum {
        let mut s = self.clone();
        s.normalise();
        s
    }

    /// The sum as f64: the top 96 bits of the exact integer, rounded once.
    pub fn value(&self) -> f64 {
        let s = self.canonical();
        let Some(top) = s.limbs.iter().rposition(|&l| l != 0) else {
            return 0.0;
        };
        let lo = top.saturating_sub(2);
        let mut acc: u128 = 0;
        for j in (lo..=top).rev() {
            acc = (acc << 32) | s.limbs[j] as u128;
        }
        // Sticky bit: anything below the three limbs rounds as a tiny excess.
        if s.limbs[..lo].iter().any(|&l| l != 0) {
            acc |= 1;
        }
        (acc as f64) * 2f64.powi(32 * lo as i32 - 1074)
    }
}

/// Logarithmic-bin quantile sketch of non-negative values (see the module doc).
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize, Default)]
pub struct Sketch {
    /// Number of values equal to zero.
    pub zeros: u64,
    /// Index of `counts[0]`.
    pub offset: i32,
    pub counts: Vec<u64>,
    pub total: u64,
}

/// ln g, g = (1 + a) / (1 - a).
fn ln_gamma() -> f64 {
    ((1.0 + RELATIVE_ACCURACY) / (1.0 - RELATIVE_ACCURACY)).ln()
}

impl Sketch {
    /// Bin index of x > 0: ceil(ln x / ln g).
    #[inline]
    pub fn index(x: f64, inv_ln_g: f64) -> i32 {
        (x.ln() * inv_ln_g).ceil() as i32
    }

    /// Adds `x` (finite, >= 0).
    #[inline]
    pub fn add(&mut self, x: f64, inv_ln_g: f64) {
        self.total += 1;
        if x <= 0.0 {
            self.zeros += 1;
            return;
        }
        let i = Self::index(x, inv_ln_g);
        self.bump(i, 1);
    }

    fn bump(&mut self, i: i32, n: u64) {
        if self.counts.is_empty() {
            self.offset = i;
            self.counts.push(0);
        }
        if i < self.offset {
            let grow = (self.offset - i) as usize;
            let mut v = vec![0; grow];
            v.extend_from_slice(&self.counts);
            self.counts = v;
            self.offset = i;
        }
        let k = (i - self.offset) as usize;
        if k >= self.counts.len() {
            self.counts.resize(k + 1, 0);
        }
        self.counts[k] += n;
    }

    /// Adds another sketch (exact).
    pub fn merge(&mut self, other: &Sketch) {
        self.zeros += other.zeros;
        self.total += other.total;
        for (k, &n) in other.counts.iter().enumerate() {
            if n > 0 {
                self.bump(other.offset + k as i32, n);
            }
        }
    }

    /// The canonical form (no empty bins at the ends), so equal contents compare and
    /// serialise equal whatever the order of additions.
    pub fn canonical(&self) -> Sketch {
        let first = self.counts.iter().position(|&n| n > 0);
        let last = self.counts.iter().rposition(|&n| n > 0);
        match (first, last) {
            (Some(f), Some(l)) => Sketch {
                zeros: self.zeros,
                offset: self.offset + f as i32,
                counts: self.counts[f..=l].to_vec(),
                total: self.total,
            },
            _ => Sketch {
                zeros: self.zeros,
                offset: 0,
                counts: Vec::new(),
                total: self.total,
            },
        }
    }

    /// The q-quantile (0 < q <= 1): the bin value of the order statistic of rank
    /// ceil(q n), within relative error [`RELATIVE_ACCURACY`]. `None` when empty.
    pub fn quantile(&self, q: f64) -> Option<f64> {
        if self.total == 0 {
            return None;
        }
        let rank = ((q * self.total as f64).ceil() as u64).clamp(1, self.total);
        if rank <= self.zeros {
            return Some(0.0);
        }
        let mut seen = self.zeros;
        let lg = ln_gamma();
        for (k, &n) in self.counts.iter().enumerate() {
            seen += n;
            if seen >= rank {
                let i = self.offset + k as i32;
                let g = lg.exp();
                return Some(2.0 * (i as f64 * lg).exp() / (g + 1.0));
            }
        }
        None
    }

    /// Value range of bin `i`: (g^(i-1), g^i].
    pub fn bin_edges(i: i32) -> (f64, f64) {
        let lg = ln_gamma();
        (((i - 1) as f64 * lg).exp(), (i as f64 * lg).exp())
    }
}

/// 1 / ln g for [`Sketch::add`].
pub fn inv_ln_gamma() -> f64 {
    1.0 / ln_gamma()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn exact_sum_is_order_independent_and_exact() {
        let xs: Vec<f64> = (0..10_000)
            .map(|i| ((i * 7919) % 10_007) as f64 * 1.37e-3 + 1e-300 * (i % 3) as f64)
            .collect();
        let mut a = ExactSum::default();
        xs.iter().for_each(|&x| a.add(x));
        let mut b = ExactSum::default();
        let mut c = ExactSum::default();
        xs.iter().rev().take(3000).for_each(|&x| b.add(x));
        xs.iter().rev().skip(3000).for_each(|&x| c.add(x));
        b.merge(&c);
        assert_eq!(a.canonical(), b.canonical());
        assert_eq!(a.value().to_bits(), b.value().to_bits());
        // Exact small case: 0.1 + 0.2 as real numbers rounds to 0.30000000000000004.
        let mut s = ExactSum::default();
        s.add(0.1);
        s.add(0.2);
        assert_eq!(s.value(), 0.30000000000000004);
        let mut t = ExactSum::default();
        t.add(1e300);
        t.add(1.0);
        assert_eq!(t.value(), 1e300);
        t.add(f64::MIN_POSITIVE / 4.0);
        assert!(t.value() > 0.0);
    }

    #[test]
    fn sketch_quantiles_are_within_the_stated_accuracy() {
        let inv = inv_ln_gamma();
        let mut xs: Vec<f64> = (1..=10_001)
            .map(|i| (i as f64 * 0.37).sin().abs() * 5.0 + 0.01)
            .collect();
        let mut s = Sketch::default();
        xs.iter().for_each(|&x| s.add(x, inv));
        s.add(0.0, inv);
        xs.push(0.0);
        xs.sort_by(f64::total_cmp);
        for q in [0.05, 0.5, 0.95, 1.0] {
            let rank = ((q * xs.len() as f64).ceil() as usize).max(1);
            let exact = xs[rank - 1];
            let got = s.quantile(q).unwrap();
            assert!(
                (got - exact).abs() <= RELATIVE_ACCURACY * exact * 1.0000001,
                "{q}: {got} {exact}"
            );
        }
        assert_eq!(s.quantile(1e-9), Some(0.0));
        // Merging halves gives the same canonical sketch.
        let mut a = Sketch::default();
        let mut b = Sketch::default();
        xs.iter().step_by(2).for_each(|&x| a.add(x, inv));
        xs.iter().skip(1).step_by(2).for_each(|&x| b.add(x, inv));
        b.merge(&a);
        let mut whole = Sketch::default();
        xs.iter().for_each(|&x| whole.add(x, inv));
        assert_eq!(b.canonical(), whole.canonical());
    }
}
