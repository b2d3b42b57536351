//! Structural factor c_s c_d, EN 1991-1-4 6.3.1 (6.1) with Annex B procedure 1.
//!
//! c_s c_d = (1 + 2 k_p I_v(z_s) sqrt(B^2 + R^2)) / (1 + 7 I_v(z_s))            (6.1)
//! z_s = 0.6 h for towers and chimneys (Figure 6.1), not below z_min.
//! f_L = n L(z_s) / v_m(z_s); S_L = 6.8 f_L / (1 + 10.2 f_L)^(5/3)              (B.1, B.2)
//! B^2 = 1 / (1 + 0.9 ((b + h) / L(z_s))^0.63)                                  (B.3)
//! k_p = sqrt(2 ln(nu T)) + 0.6 / sqrt(2 ln(nu T)), k_p >= 3, T = 600 s          (B.4)
//! nu = n sqrt(R^2 / (B^2 + R^2)), nu >= 0.08 Hz                                 (B.5)
//! R^2 = pi^2 / (2 delta) S_L R_h(eta_h) R_b(eta_b)                              (B.6)
//! R_l = 1/eta - (1 - exp(-2 eta)) / (2 eta^2), eta_h = 4.6 h f_L / L, eta_b = 4.6 b f_L / L
//!                                                                               (B.7, B.8)
//! delta = delta_s + delta_a (F.15); delta_a = c_f rho b v_m(z_s) / (2 n m_e)    (F.18)
//!
//! Read in the public TU Munich Structural Wind Engineering notebook (GitHub user
//! `mpentek`, exercise 4 notebook `swe_ws2021_4_2_structural_effects.ipynb`) for (B.2)-(B.8)
//! and k_p; that notebook uses the German National Annex denominator 1 + 6 I_v, the EN
//! recommended (6.1) has 1 + 7 I_v (the 7 of (4.8)), so the denominator factor is a parameter
//! here. The 1 + 7 I_v denominator of (6.1), k_p >= 3 with T = 600 s and nu >= 0.08 Hz
//! (B.4, B.5) are also printed in the published design guide "Steel Buildings in Europe,
//! Multi-Storey Steel Buildings, Part 3: Actions" (page 3-17, infosteel.be
//! images/Steel-Buildings-in-Europe/MSB03/26). delta = delta_s + delta_a (+ delta_d, none
//! here) and delta_a = c_f rho b v_m(z_s) / (2 n m_e) appear in that guide's worked example
//! (Appendix A, page 3-32, MSB03/41) as EN 1991-1-4 F.5(1) and F.5(4); the expression numbers
//! (F.15), (F.18) are from memory. The background-only factor used at the critical speed is
//! (6.1) with R^2 = 0 (see `critical`).
//!
//! Dimensionless except where the name says (m, m/s, Hz, kg/m).

use serde::Serialize;

/// Averaging time of the mean wind for k_p, s (B.4).
pub const AVERAGING_TIME_S: f64 = 600.0;
/// Floor of the up-crossing frequency nu, Hz (B.5).
pub const MIN_UPCROSSING_HZ: f64 = 0.08;
/// Floor of the peak factor k_p (B.4).
pub const MIN_PEAK_FACTOR: f64 = 3.0;
/// Reference height ratio z_s / h for towers and chimneys (Figure 6.1).
pub const REFERENCE_HEIGHT_RATIO: f64 = 0.6;
/// Denominator factor of (6.1), EN recommended expression.
pub const EN_DENOMINATOR_FACTOR: f64 = 7.0;

/// What Annex B procedure 1 needs at the reference height.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct StructuralFactorInput {
    /// Structure height h, m.
    pub height_m: f64,
    /// Width b (outer diameter at z_s), m.
    pub width_m: f64,
    /// First along-wind frequency n_1,x, Hz.
    pub frequency_hz: f64,
    /// v_m(z_s), m/s.
    pub mean_speed_m_s: f64,
    /// I_v(z_s).
    pub turbulence_intensity: f64,
    /// L(z_s), m.
    pub length_scale_m: f64,
    /// Total logarithmic decrement delta.
    pub log_decrement: f64,
}

/// Every factor of the procedure, for the note.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct StructuralFactor {
    pub reduced_frequency: f64,
    pub spectral_density: f64,
    pub background_factor: f64,
    pub eta_h: f64,
    pub eta_b: f64,
    pub admittance_h: f64,
    pub admittance_b: f64,
    pub resonance_factor: f64,
    pub upcrossing_frequency_hz: f64,
    pub peak_factor: f64,
    pub cscd: f64,
}

/// S_L (B.2).
pub fn spectral_density(f_l: f64) -> f64 {
    6.8 * f_l / (1.0 + 10.2 * f_l).powf(5.0 / 3.0)
}

/// B^2 (B.3).
pub fn background_factor(width_m: f64, height_m: f64, length_scale_m: f64) -> f64 {
    1.0 / (1.0 + 0.9 * ((width_m + height_m) / length_scale_m).powf(0.63))
}

/// Aerodynamic admittance R_h or R_b (B.7, B.8); R(0) = 1 by continuity.
pub fn admittance(eta: f64) -> f64 {
    if eta < 1e-3 {
        // Taylor series of (B.7): the closed form cancels catastrophically near 0.
        return 1.0 - 2.0 * eta / 3.0 + eta * eta / 3.0 - 2.0 * eta.powi(3) / 15.0;
    }
    1.0 / eta - (1.0 - (-2.0 * eta).exp()) / (2.0 * eta * eta)
}

/// k_p and nu (B.4, B.5).
pub fn peak_factor(frequency_hz: f64, b2: f64, r2: f64) -> (f64, f64) {
    let nu = (frequency_hz * (r2 / (b2 + r2)).sqrt()).max(MIN_UPCROSSING_HZ);
    let a = (2.0 * (nu * AVERAGING_TIME_S).ln()).sqrt();
    ((a + 0.6 / a).max(MIN_PEAK_FACTOR), nu)
}

/// (6.1) from its parts, with the denominator factor (7 recommended).
pub fn combine(k_p: f64, i_v: f64, b2: f64, r2: f64, denominator_factor: f64) -> f64 {
    (1.0 + 2.0 * k_p * i_v * (b2 + r2).sqrt()) / (1.0 + denominator_factor * i_v)
}

/// Aerodynamic log decrement delta_a, EN 1991-1-4 F.5(4) (expression (F.18)): as used in the
/// worked example of the "Steel Buildings in Europe" guide cited in the module doc.
pub fn aerodynamic_log_decrement(
    force_coefficient: f64,
    air_density_kg_m3: f64,
    width_m: f64,
    mean_speed_m_s: f64,
    frequency_hz: f64,
    equivalent_mass_kg_m: f64,
) -> f64 {
    force_coefficient * air_density_kg_m3 * width_m * mean_speed_m_s
        / (2.0 * frequency_hz * equivalent_mass_kg_m)
}

/// Annex B procedure 1 with the given (6.1) denominator factor.
pub fn structural_factor_with(inp: &StructuralFactorInput, denominator: f64) -> StructuralFactor {
    let l = inp.length_scale_m;
    let f_l = inp.frequency_hz * l / inp.mean_speed_m_s;
    let s_l = spectral_density(f_l);
    let b2 = background_factor(inp.width_m, inp.height_m, l);
    let eta_h = 4.6 * inp.height_m * f_l / l;
    let eta_b = 4.6 * inp.width_m * f_l / l;
    let r_h = admittance(eta_h);
    let r_b = admittance(eta_b);
    let r2 = std::f64::consts::PI.powi(2) / (2.0 * inp.log_decrement) * s_l * r_h * r_b;
    let (k_p, nu) = peak_factor(inp.frequency_hz, b2, r2);
    StructuralFactor {
        reduced_frequency: f_l,
        spectral_density: s_l,
        background_factor: b2,
        eta_h,
        eta_b,
        admittance_h: r_h,
        admittance_b: r_b,
        resonance_factor: r2,
        upcrossing_frequency_hz: nu,
        peak_factor: k_p,
        cscd: combine(k_p, inp.turbulence_intensity, b2, r2, denominator),
    }
}

/// Annex B procedure 1 with the EN recommended (6.1).
pub fn structural_factor(inp: &StructuralFactorInput) -> StructuralFactor {
    structural_factor_with(inp, EN_DENOMINATOR_FACTOR)
}

/// The background-only factor (6.1) with R^2 = 0: k_p from (B.4) with nu at its floor.
pub fn background_only(i_v: f64, b2: f64) -> (f64, f64) {
    let (k_p, _) = peak_factor(0.0, b2, 0.0);
    (combine(k_p, i_v, b2, 0.0, EN_DENOMINATOR_FACTOR), k_p)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn admittance_limits() {
        assert!((admittance(0.0) - 1.0).abs() < 1e-12);
        assert!((admittance(1e-5) - (1.0 - 2e-5 / 3.0)).abs() < 1e-9);
        // Series and closed form agree where they meet.
        let closed = |e: f64| 1.0 / e - (1.0 - (-2.0 * e).exp()) / (2.0 * e * e);
        assert!((admittance(0.999e-3) - closed(0.999e-3)).abs() < 1e-9);
        // Large eta: R -> 1/eta - 1/(2 eta^2).
        assert!((admittance(100.0) - (0.01 - 0.5e-4)).abs() < 1e-12);
    }

    #[test]
    fn background_only_has_peak_factor_three() {
        // (B.5) floor 0.08 Hz -> sqrt(2 ln 48) + 0.6 / sqrt(2 ln 48) = 3.0 (B.4 floor 3).
        let (_, k_p) = background_only(0.15, 0.6);
        assert!((k_p - 3.0).abs() < 1e-12);
    }
}
