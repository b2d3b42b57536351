//! GB 50009-2012 section 8.5.3 and Appendix H.1: across-wind resonance of circular sections.
//! A comparison method beside EN 1991-1-4 Annex E. Expression (H.1.1-1), the H1 expression
//! (H.1.1-2), the damping ratios of H.1.1, Table H.1.1 (towers and chimneys, modes 1-4) and
//! clause 8.5.3 (St = 0.2, Re = 69000 v D, the regime limits, the 15 m/s rule, the 2/3-height
//! diameter for a taper up to 0.02) were checked against a published copy of the 2012 text
//! (public copy `longyu8101/GB50009`, chapter 8 and Appendix H; see
//! data/reference/README.md).
//!
//! - St = 0.2; v_cr,j = D / (T_j St) (8.5.3-2); D at 2/3 of the height for an outer-face
//!   taper <= 0.02 (8.5.3, explanation of D). Beyond that taper the code gives no rule; we
//!   still use 2/3 H and warn once per case (our own practice).
//! - Re = 69000 v D (v in m/s, D in m; 8.5.3-1).
//! - Regimes: Re < 3e5 subcritical: if v_H > v_cr, anti-vibration measures, or keep
//!   v_cr >= 15 m/s (8.5.3(1); no load formula; the code takes T_1 for this check, we apply
//!   it to every checked mode, which is on the safe side); 3e5 <= Re < 3.5e6 supercritical
//!   (may be ignored, 8.5.3(3)); Re >= 3.5e6 with
//!   1.2 v_H > v_cr transcritical resonance: equivalent load
//!   w_Lk,j(z) = |lambda_j| v_cr^2 phi_j(z) / (12800 zeta_j)  kN/m2  (H.1.1),
//!   applied over the width D(z). The constant 12800 = 1600 x 8 bakes in rho = 1.25 kg/m3 and a
//!   lift coefficient of 0.25 (q = v^2 / 1600 kN/m2, 0.25 / 2 zeta = 1 / (8 zeta)).
//! - lambda_j (Table H.1.1, towers and chimneys, checked) vs H1/H with
//!   H1 = H (v_cr / (1.2 v_H))^(1/alpha), the height where the lock-in range starts. We find H1
//!   as the height where 1.2 v_m(z) = v_cr, which is the same for the power law and also works
//!   for the log law.
//!
//! The table's meaning is lambda_j = int_H1^H phi_j dz / int_0^H phi_j^2 dz with phi_j = 1 at
//! the top: the modal force of a uniform lift over [H1, H] divided by the generalised mass,
//! which is how 0.25 q D / (2 zeta) becomes a load proportional to phi_j. We compute that
//! integral over the actual mode shape as well, report both, and use it for modes beyond the
//! table (the code's note limits the check to modes 1-4).
//!
//! Not covered: the building rows of Table H.1.1, combination with the along-wind load
//! (Table 8.5.6), and the group/interference factors.
//! v_H is taken as the site mean speed at the top.
//! Units: SI (m, m/s, Pa, N/m); the kN constant is converted.

use serde::Serialize;

use crate::wind::shape::ModeShape;

/// Strouhal number of GB 50009-2012 8.5.3 (circular sections, checked).
pub const STROUHAL_GB: f64 = 0.2;
/// Reynolds number factor, Re = 69000 v D (GB 50009-2012 (8.5.3-1), checked).
pub const REYNOLDS_FACTOR: f64 = 69_000.0;
/// The 12800 of (H.1.1-1) in SI: Pa = v^2 / (12.8 zeta) (checked, see the module doc).
pub const LOAD_DIVISOR_SI: f64 = 12.8;
/// Outer-face taper up to which D may be taken at 2/3 of the height (GB 50009-2012 8.5.3,
/// explanation of D in (8.5.3-1), checked against a published copy of the code). 8.5.4 is
/// about torsion and holds no taper rule.
pub const MAX_TAPER_FOR_TWO_THIRDS_RULE: f64 = 0.02;
/// First-mode damping ratio of concrete structures (GB 50009-2012 H.1.1, explanation of
/// zeta_j: steel 0.01, steel buildings 0.02, concrete 0.05; higher modes may take the first
/// mode's value; checked against a published copy of the code).
pub const DAMPING_RATIO_CONCRETE: f64 = 0.05;
/// 8.5.3(1): with a subcritical lock-in (Re < 3e5, v_H > v_cr) either anti-vibration
/// measures are taken or the critical speed is kept at or above this value, m/s (GB
/// 50009-2012 8.5.3(1), checked against a published copy of the code).
pub const SUBCRITICAL_MIN_CRITICAL_SPEED_M_S: f64 = 15.0;

/// lambda_j of Table H.1.1, towers and chimneys, modes 1-4, at H1/H = 0, 0.1, ..., 1.0
/// (GB 50009-2012 Table H.1.1, checked against a published copy of the code). Tests
/// also check that the uniform Euler-Bernoulli cantilever integral reproduces modes 1-3.
#[rustfmt::skip]
pub const LAMBDA_TOWERS: [[f64; 11]; 4] = [
    [1.56, 1.55, 1.54, 1.49, 1.42, 1.31, 1.15, 0.94, 0.68, 0.37, 0.0],
    [0.83, 0.82, 0.76, 0.60, 0.37, 0.09, -0.16, -0.33, -0.38, -0.27, 0.0],
    [0.52, 0.48, 0.32, 0.06, -0.19, -0.30, -0.21, 0.00, 0.20, 0.23, 0.0],
    [0.30, 0.33, 0.02, -0.20, -0.23, 0.03, 0.16, 0.15, -0.05, -0.18, 0.0],
];

/// Flow regime by Reynolds number (GB 50009-2012 8.5.3(1)-(3), checked).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub enum Regime {
    /// Re < 3e5.
    Subcritical,
    /// 3e5 <= Re < 3.5e6.
    Supercritical,
    /// Re >= 3.5e6.
    Transcritical,
}

/// The regime of `reynolds`.
pub fn regime(reynolds: f64) -> Regime {
    if reynolds < 3e5 {
        Regime::Subcritical
    } else if reynolds < 3.5e6 {
        Regime::Supercritical
    } else {
        Regime::Transcritical
    }
}

/// Re = 69000 v D.
pub fn reynolds(speed_m_s: f64, diameter_m: f64) -> f64 {
    REYNOLDS_FACTOR * speed_m_s * diameter_m
}

/// lambda_j from Table H.1.1 (towers; modes 1-4), linear in H1/H between the tabulated values;
/// `None` beyond mode 4.
pub fn lambda_table(mode: usize, h1_per_h: f64) -> Option<f64> {
    let row = LAMBDA_TOWERS.get(mode.checked_sub(1)?)?;
    let x = h1_per_h.clamp(0.0, 1.0) * 10.0;
    let i = (x.floor() as usize).min(9);
    let t = x - i as f64;
    Some(row[i] + t * (row[i + 1] - row[i]))
}

/// lambda_j = int_H1^H phi dz / int_0^H phi^2 dz with phi scaled to 1 at the top (the meaning
/// of Table H.1.1, see the module doc). `None` when the top does not move.
pub fn lambda_from_shape(shape: &ModeShape, h1_m: f64) -> Option<f64> {
    let top = *shape.nodal().last()?;
    if top.abs() < 1e-6 {
        return None;
    }
    let h = shape.height_m();
    let z0 = shape.z_m()[0];
    Some(shape.integral(h1_m, h) / top / (shape.integral_sq(z0, h) / (top * top)))
}

/// Height where the lock-in range starts: 1.2 v_m(H1) = v_cr, by bisection on [0, H]
/// (v_m increasing). `None` when 1.2 v_m(H) <= v_cr (no resonance in the design wind).
pub fn lock_in_start_m(
    height_m: f64,
    critical_speed_m_s: f64,
    mean_speed: impl Fn(f64) -> f64,
) -> Option<f64> {
    if 1.2 * mean_speed(height_m) <= critical_speed_m_s {
        return None;
    }
    if 1.2 * mean_speed(0.0) >= critical_speed_m_s {
        return Some(0.0);
    }
    let (mut lo, mut hi) = (0.0, height_m);
    for _ in 0..80 {
        let mid = 0.5 * (lo + hi);
        if 1.2 * mean_speed(mid) < critical_speed_m_s {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    Some(0.5 * (lo + hi))
}

/// Equivalent across-wind pressure w_Lk,j at a point where the top-normalised shape is
/// `phi_top_normalised`, Pa (H.1.1 in SI).
pub fn equivalent_pressure_pa(
    lambda: f64,
    critical_speed_m_s: f64,
    phi_top_normalised: f64,
    damping_ratio: f64,
) -> f64 {
    lambda.abs() * critical_speed_m_s.powi(2) * phi_top_normalised
        / (LOAD_DIVISOR_SI * damping_ratio)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn regimes_and_table_breakpoints() {
        assert_eq!(regime(2.9e5), Regime::Subcritical);
        assert_eq!(regime(3e5), Regime::Supercritical);
        assert_eq!(regime(3.5e6), Regime::Transcritical);
        // Table H.1.1 values at breakpoints and between (GB 50009-2012, checked)
        assert_eq!(lambda_table(1, 0.0), Some(1.56));
        assert_eq!(lambda_table(1, 1.0), Some(0.0));
        assert!((lambda_table(1, 0.45).unwrap() - 1.365).abs() < 1e-12);
        assert!((lambda_table(4, 0.2).unwrap() - 0.02).abs() < 1e-12);
        assert_eq!(lambda_table(5, 0.2), None);
        // 1.2 v(H1) = v_cr under v = z (invented): H1 = v_cr / 1.2
        let h1 = lock_in_start_m(100.0, 60.0, |z| z).unwrap();
        assert!((h1 - 50.0).abs() < 1e-9);
        assert!(lock_in_start_m(100.0, 130.0, |z| z).is_none());
    }
}
