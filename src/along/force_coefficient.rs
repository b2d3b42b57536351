//! Force coefficient of the circular shell, EN 1991-1-4 7.9.2: c_f = c_f,0 psi_lambda (7.19).
//!
//! - c_f,0 (Figure 7.28): the figure's two published curves, as written in two public
//!   implementations (`MEMAndersen/DynSys` `dynsys/wind_section.py`, which re-plots Figure
//!   7.28 from them, and `xcfem/xc` `python_modules/actions/wind/ec1_wind.py`):
//!   c_f,0 = max(clamp(0.11 / (Re/1e6)^1.4, 0.4, 1.2),
//!   1.2 + 0.18 log10(10 k/b) / (1 + 0.4 log10(Re/1e6))), k/b >= 1e-5
//!   (the lowest curve of the figure). Re = b v / nu with v the peak velocity
//!   sqrt(2 q_p / rho) (7.15). The figure is drawn up to Re = 1e7; above it we keep the
//!   expression, which rises slowly towards 1.2 (conservative, our choice).
//! - Equivalent roughness k (Table 7.13): smooth concrete 0.2 mm (rough concrete 1.0 mm), as
//!   quoted with the table number in one public EN 1991-1-4 calculator's source (file
//!   headed "Wind data constants and tables (EN 1991-1-4)", `CYL_SURFACES`; its repository
//!   is not named by the search index, see data/reference/README.md); the standard's copy
//!   itself was not read.
//! - Effective slenderness lambda (Table 7.16, circular cylinders): l >= 50 m:
//!   min(0.7 l/b, 70); l < 15 m: min(l/b, 70); linear in l between (as in `xcfem/xc`).
//!   l = the stage height (a stack standing on the ground); b = the mean outer diameter
//!   over the stage (our reading for a tapered shell).
//! - End-effect factor psi_lambda at solidity 1 (Figure 7.36): straight lines in log10(lambda)
//!   through the points (1, 0.6), (10, 0.698), (70, 0.9182), the digitisation published in
//!   `xcfem/xc` `ec1_wind.py` (`get_cylinder_end_effect_factor`). lambda <= 70 by Table 7.16.
//!
//! Dimensionless.

/// Default equivalent surface roughness of smooth concrete, m (Table 7.13; one public
/// calculator source, see the module doc).
pub const SMOOTH_CONCRETE_ROUGHNESS_M: f64 = 0.2e-3;
/// Smallest k/b of Figure 7.28 (its lowest curve).
pub const MIN_ROUGHNESS_RATIO: f64 = 1e-5;
/// Figure 7.36 at solidity 1: (lambda, psi_lambda), digitised as published in `xcfem/xc`.
pub const END_EFFECT_POINTS: [(f64, f64); 3] = [(1.0, 0.6), (10.0, 0.698), (70.0, 0.9182)];
/// Largest effective slenderness of Table 7.16.
pub const MAX_SLENDERNESS: f64 = 70.0;

/// c_f,0 of Figure 7.28 at Reynolds number `re` and roughness ratio k/b.
pub fn c_f0(re: f64, roughness_ratio: f64) -> f64 {
    // The figure starts at Re = 1e5; below it the subcritical plateau 1.2 holds.
    c_f0_from_logs(
        (re.max(1e5) / 1e6).log10(),
        (10.0 * roughness_ratio.max(MIN_ROUGHNESS_RATIO)).log10(),
    )
}

/// c_f,0 from x = log10(Re / 1e6) (x >= -1) and lk = log10(10 k/b): the same curves, with
/// logarithms computed once by the caller (the line load re-evaluates c_f at several
/// speeds, where only x changes).
pub fn c_f0_from_logs(x: f64, lk: f64) -> f64 {
    // 0.11 (Re/1e6)^-1.4 <= 0.4 for x >= log10(0.11 / 0.4) / 1.4 = -0.4005: skip the power.
    let subcritical = if x >= -0.4 {
        0.4
    } else {
        (0.11 * 10f64.powf(-1.4 * x)).clamp(0.4, 1.2)
    };
    let supercritical = 1.2 + 0.18 * lk / (1.0 + 0.4 * x);
    subcritical.max(supercritical)
}

/// Effective slenderness lambda of Table 7.16 for a circular cylinder of length `l_m` and
/// diameter `b_m`.
pub fn effective_slenderness(l_m: f64, b_m: f64) -> f64 {
    let long = (0.7 * l_m / b_m).min(MAX_SLENDERNESS);
    let short = (l_m / b_m).min(MAX_SLENDERNESS);
    if l_m >= 50.0 {
        long
    } else if l_m < 15.0 {
        short
    } else {
        short + (long - short) * (l_m - 15.0) / 35.0
    }
}

/// psi_lambda of Figure 7.36 at solidity 1 (log10-linear between the digitised points,
/// held at the end values outside them).
pub fn end_effect_factor(slenderness: f64) -> f64 {
    let p = END_EFFECT_POINTS;
    let lam = slenderness.clamp(p[0].0, p[p.len() - 1].0);
    let i = if lam <= p[1].0 { 0 } else { 1 };
    let ((x0, y0), (x1, y1)) = (p[i], p[i + 1]);
    y0 + (y1 - y0) * (lam / x0).log10() / (x1 / x0).log10()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn end_effect_reproduces_the_digitised_points() {
        // Figure 7.36 points as published in xcfem/xc ec1_wind.py.
        for (lam, psi) in END_EFFECT_POINTS {
            assert!((end_effect_factor(lam) - psi).abs() < 1e-12);
        }
        // Between points: straight in log10(lambda); sqrt(10 * 70) is the log midpoint.
        let mid = end_effect_factor((10.0f64 * 70.0).sqrt());
        assert!((mid - 0.5 * (0.698 + 0.9182)).abs() < 1e-12);
        assert_eq!(end_effect_factor(200.0), 0.9182);
    }

    #[test]
    fn c_f0_curves() {
        // Figure 7.28 expressions as written in MEMAndersen/DynSys wind_section.py.
        // Subcritical plateau.
        assert_eq!(c_f0(1e5, 1e-5), 1.2);
        // k/b = 1e-3 at Re = 1e7: 1.2 + 0.18 log10(1e-2) / (1 + 0.4) = 0.942857.
        assert!((c_f0(1e7, 1e-3) - (1.2 - 0.36 / 1.4)).abs() < 1e-12);
        // k/b = 1e-5 at Re = 1e6: 1.2 + 0.18 * (-4) = 0.48, above the 0.4 floor of curve 1.
        assert!((c_f0(1e6, 1e-5) - 0.48).abs() < 1e-12);
        // Below the figure's smallest k/b the lowest curve is used.
        assert_eq!(c_f0(5e6, 1e-8), c_f0(5e6, 1e-5));
        // Drag crisis: at Re = 4e5 curve 1 gives 0.11 / 0.4^1.4 = 0.397 -> floor 0.4;
        // curve 2 (k/b 1e-5) 1.2 - 0.72 / (1 + 0.4 log10 0.4) = 0.344 -> 0.4 governs.
        assert!((c_f0(4e5, 1e-5) - 0.4).abs() < 1e-12);
        // The shortcut near its threshold agrees with the plain curve.
        for re in [3.9e5, 3.97e5, 3.98e5, 4.0e5, 4.1e5] {
            let x: f64 = (re / 1e6f64).log10();
            let plain = (0.11 / (re / 1e6f64).powf(1.4)).clamp(0.4, 1.2);
            let sup = 1.2 + 0.18 * (1e-4f64).log10() / (1.0 + 0.4 * x);
            assert!((c_f0(re, 1e-5) - plain.max(sup)).abs() < 1e-12, "{re}");
        }
    }

    #[test]
    fn slenderness_table_7_16() {
        assert_eq!(effective_slenderness(100.0, 10.0), 7.0);
        assert_eq!(effective_slenderness(10.0, 1.0), 10.0);
        assert_eq!(effective_slenderness(500.0, 1.0), 70.0);
        // Halfway between 15 and 50 m: mean of l/b and 0.7 l/b.
        assert!((effective_slenderness(32.5, 2.5) - 0.85 * 13.0).abs() < 1e-12);
    }
}
