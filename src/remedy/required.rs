//! The structural log decrement (and Scruton number) that brings a failing mode within the
//! user's criteria, for EN 1991-1-4 Annex E approaches 1 and 2 separately.
//!
//! The amplitude falls with the Scruton number in both approaches (1/Sc in (E.7) with the
//! L_j fixed point; through c1 and k_p in approach 2), so the smallest passing decrement is
//! found by bisection on log(delta) with the full amplitude functions. Units: dimensionless
//! decrements, m.

use serde::Serialize;

use super::recheck::ModeContext;

/// Largest log decrement searched (far above any structure's damping, so "not reachable by
/// damping" is reported rather than an absurd number).
pub const MAX_LOG_DECREMENT: f64 = 4.0;

/// Result for one approach.
#[derive(Debug, Clone, Serialize)]
pub struct Required {
    /// The response already meets the criteria with the structural decrement.
    pub already_meets: bool,
    /// Smallest total structural log decrement that meets every criterion; `None` when
    /// already met or not reachable below [`MAX_LOG_DECREMENT`].
    pub log_decrement: Option<f64>,
    pub scruton: Option<f64>,
    /// Antinode amplitude at that decrement, m.
    pub y_max_m: Option<f64>,
    pub tip_amplitude_m: Option<f64>,
    /// Largest stress at that decrement, Pa.
    pub max_stress_pa: Option<f64>,
}

/// Smallest decrement in [delta_now, MAX] at which `passes` holds (monotone in delta).
pub fn smallest_passing(delta_now: f64, passes: impl Fn(f64) -> bool) -> Option<f64> {
    if !passes(MAX_LOG_DECREMENT) {
        return None;
    }
    let (mut lo, mut hi) = (delta_now.ln(), MAX_LOG_DECREMENT.ln());
    // 1e-9 relative in delta.
    while hi - lo > 1e-9 {
        let mid = 0.5 * (lo + hi);
        if passes(mid.exp()) {
            hi = mid;
        } else {
            lo = mid;
        }
    }
    Some(hi.exp())
}

/// Required decrement for one approach; `amplitude(delta)` gives the antinode amplitude.
pub fn required(ctx: &ModeContext, amplitude: impl Fn(f64) -> f64) -> Required {
    let delta_now = ctx.checked.log_decrement;
    let passes = |d: f64| !ctx.judge(amplitude(d)).is_exceeds();
    if passes(delta_now) {
        return Required {
            already_meets: true,
            log_decrement: None,
            scruton: None,
            y_max_m: None,
            tip_amplitude_m: None,
            max_stress_pa: None,
        };
    }
    let d = smallest_passing(delta_now, passes);
    let y = d.map(&amplitude);
    Required {
        already_meets: false,
        log_decrement: d,
        scruton: d.map(|d| ctx.scruton(d)),
        y_max_m: y,
        tip_amplitude_m: y.map(|y| y * ctx.tip_per_antinode),
        max_stress_pa: y.map(|y| y * ctx.stress_per_antinode_pa_m),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn bisection_finds_the_threshold() {
        let d = smallest_passing(0.03, |d| d >= 0.1234).unwrap();
        assert!((d / 0.1234 - 1.0).abs() < 1e-8);
        assert!(smallest_passing(0.03, |_| false).is_none());
    }
}
