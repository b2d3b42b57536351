//! Number of vortex-induced load cycles in the design life.
//!
//! Reference: EN 1991-1-4 Annex E (E.1.5.2.6, expression (E.10) or nearby; from memory):
//! N = 2 T n eps0 (v_crit / v0)^2 exp(-(v_crit / v0)^2), T = 3.2e7 s per year of design life,
//! v0 = 0.2 v_m (sqrt(2) x the modal value of the Weibull distribution of the wind speed, as
//! the standard allows), eps0 = bandwidth factor: 0.3 for approach 1, 0.15 for approach 2
//! (all from memory).

/// Seconds of wind per year of design life (EN 1991-1-4, from memory).
pub const SECONDS_PER_YEAR: f64 = 3.2e7;
/// Bandwidth factor for approach 1 (from memory).
pub const EPS0_APPROACH1: f64 = 0.3;
/// Bandwidth factor for approach 2 (from memory).
pub const EPS0_APPROACH2: f64 = 0.15;
/// v0 / v_m (from memory).
pub const V0_PER_MEAN_SPEED: f64 = 0.2;

/// Load cycles N in `design_life_years` for a mode of `frequency_hz` with critical speed
/// `critical_speed_m_s` at a section whose mean speed is `mean_speed_m_s`.
pub fn load_cycles(
    design_life_years: f64,
    frequency_hz: f64,
    eps0: f64,
    critical_speed_m_s: f64,
    mean_speed_m_s: f64,
) -> f64 {
    let v0 = V0_PER_MEAN_SPEED * mean_speed_m_s;
    if v0 <= 0.0 {
        return 0.0;
    }
    let r2 = (critical_speed_m_s / v0).powi(2);
    2.0 * SECONDS_PER_YEAR * design_life_years * frequency_hz * eps0 * r2 * (-r2).exp()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn peak_of_the_cycle_count_is_at_v_crit_equal_v0() {
        // x e^-x peaks at x = 1 (calculus): N is largest when v_crit = v0.
        let n = |v: f64| load_cycles(50.0, 0.5, EPS0_APPROACH1, v, 30.0);
        assert!(n(6.0) > n(5.9) && n(6.0) > n(6.1));
        let expect = 2.0 * 3.2e7 * 50.0 * 0.5 * 0.3 * (-1f64).exp();
        assert!((n(6.0) - expect).abs() < 1e-6 * expect);
    }
}
