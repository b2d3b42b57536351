//! Counter-based random numbers: the j-th uniform of sample i is a pure function of
//! (seed, i, j), so sample i draws the same numbers whichever shard, thread or order
//! computes it (sharding never changes a sample).
//!
//! The mixer is SplitMix64's output function (Steele, Lea & Flood, "Fast splittable
//! pseudorandom number generators", OOPSLA 2014; the finaliser constants are those of that
//! paper as used in `java.util.SplittableRandom`), applied twice to a key built from the
//! seed, the sample index and the draw number. Uniforms are the top 53 bits plus one half,
//! so they lie strictly inside (0, 1) and are exact multiples of 2^-53 (which lets the
//! influence sums be kept as exact integers, see `stats`).

/// SplitMix64 finaliser (Steele et al. 2014).
#[inline]
fn mix64(mut z: u64) -> u64 {
    z = (z ^ (z >> 30)).wrapping_mul(0xbf58_476d_1ce4_e5b9);
    z = (z ^ (z >> 27)).wrapping_mul(0x94d0_49bb_1331_11eb);
    z ^ (z >> 31)
}

/// Golden-ratio increment of SplitMix64.
const GAMMA: u64 = 0x9e37_79b9_7f4a_7c15;

/// The 53-bit integer behind uniform number `draw` of sample `index` under `seed`.
#[inline]
pub fn draw_bits(seed: u64, index: u64, draw: u64) -> u64 {
    let a = mix64(seed.wrapping_add(GAMMA.wrapping_mul(index.wrapping_add(1))));
    let b = mix64(a ^ draw.wrapping_add(1).wrapping_mul(GAMMA));
    b >> 11
}

/// Uniform in (0, 1): (bits + 1/2) 2^-53.
#[inline]
pub fn uniform(seed: u64, index: u64, draw: u64) -> f64 {
    bits_to_uniform(draw_bits(seed, index, draw))
}

/// (bits + 1/2) 2^-53, exact in f64.
#[inline]
pub fn bits_to_uniform(bits: u64) -> f64 {
    (bits as f64 + 0.5) * (1.0 / 9_007_199_254_740_992.0)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn uniforms_are_inside_the_unit_interval_and_look_uniform() {
        let n = 200_000u64;
        let mut sum = 0.0;
        let mut sum2 = 0.0;
        for i in 0..n {
            let u = uniform(7, i, 0);
            assert!(u > 0.0 && u < 1.0);
            sum += u;
            sum2 += u * u;
        }
        let mean = sum / n as f64;
        let var = sum2 / n as f64 - mean * mean;
        // Uniform(0,1): mean 1/2, variance 1/12; 5 standard errors (common practice).
        assert!((mean - 0.5).abs() < 5.0 * (1.0f64 / 12.0 / n as f64).sqrt());
        assert!((var - 1.0 / 12.0).abs() < 5e-3 / 12.0 * 10.0);
    }

    #[test]
    fn streams_depend_on_seed_index_and_draw_only() {
        assert_eq!(uniform(1, 5, 2), uniform(1, 5, 2));
        assert_ne!(uniform(1, 5, 2), uniform(1, 5, 3));
        assert_ne!(uniform(1, 5, 2), uniform(1, 6, 2));
        assert_ne!(uniform(1, 5, 2), uniform(2, 5, 2));
        assert_eq!(bits_to_uniform(0), 0.5 / 9_007_199_254_740_992.0);
    }
}
