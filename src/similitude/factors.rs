//! Scale factors of a distorted-thickness aeroelastic model of a chimney, k_x = prototype /
//! model, all dimensionless.
//!
//! Source: "Aeroelastic model similitude" in the project's references (published dimensional
//! analysis). Inputs: the length scale k_l (diameters and heights), the structural density
//! ratio k_rho = rho_prototype / rho_model and the modulus ratio k_E = E_prototype / E_model.
//! The model is tested in the same air as the prototype stands in (k_rho_air = 1).
//!
//! Derivation (each condition named):
//! - Geometric similarity of the outer shape: every length and diameter scales by k_l.
//! - Mass ratio structure/air, m / (rho_air b^2), identical: the mass per length scales by
//!   k_rho_air k_l^2 = k_l^2. The shell's mass per length is ~ rho pi D t, so
//!   k_rho k_l k_h = k_l^2, hence the wall-thickness scale k_h = k_l / k_rho (the wall is
//!   "distorted": it does not scale like the diameter unless k_rho = 1).
//! - Cauchy number rho_air v^2 / (E_eff) identical, with the effective bending stiffness
//!   per mass: EI / (m L^2 v^2) identical. EI ~ E D^3 t scales by k_E k_l^3 k_h, m by k_l^2,
//!   L^2 by k_l^2, so k_v^2 = k_E k_h / k_l, k_v = sqrt(k_E k_h / k_l).
//! - Strouhal number n b / v identical: k_f = k_v / k_l; time scales by 1 / k_f.
//! - Displacements scale like lengths, k_l (the amplitude per diameter y/b is identical).
//! - Strain: curvature x distance from the axis, (k_l / k_l^2) x k_l = 1.
//! - Stress = E x strain: k_E.
//! - Lining mass per area of the inner face: mass per length k_l^2 over a perimeter k_l
//!   gives k_l; a lining given per length scales by k_l^2.
//! - Point masses: mass per length x length, k_l^3.
//! - Foundation springs: lateral stiffness ~ EI / L^3 = k_E k_l^3 k_h / k_l^3 = k_E k_h;
//!   rotational stiffness ~ EI / L = k_E k_h k_l^2. Both keep the spring-to-shell stiffness
//!   ratios (and so the mode shapes) identical; with the masses above the spring-mass
//!   frequencies scale by k_f as well.
//! - Structural log decrement: identical (1); the model must reproduce the prototype's.
//! - Reynolds number b v / nu with the same air: k_l k_v, NOT matched (see `reynolds`).
//!
//! The thin-wall forms (A ~ D t, I ~ D^3 t) make the similitude exact only as t/D -> 0 and
//! without shear deformation; `consistency` measures how far a real model is off.

use serde::Serialize;

/// Every scale factor of a model plan, prototype / model.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct ScaleFactors {
    /// k_l: heights and diameters.
    pub length: f64,
    /// k_rho: structural density.
    pub density: f64,
    /// k_E: Young's modulus.
    pub elastic_modulus: f64,
    /// k_h = k_l / k_rho: wall thickness.
    pub wall_thickness: f64,
    /// k_v = sqrt(k_E k_h / k_l): wind speed.
    pub velocity: f64,
    /// k_f = k_v / k_l: frequency.
    pub frequency: f64,
    /// 1 / k_f: time.
    pub time: f64,
    /// k_l: displacement.
    pub displacement: f64,
    /// 1: strain.
    pub strain: f64,
    /// k_E: stress.
    pub stress: f64,
    /// k_l^2: mass per length.
    pub mass_per_length: f64,
    /// k_l: lining mass per area.
    pub lining_mass_per_area: f64,
    /// k_l^3: point masses.
    pub point_mass: f64,
    /// k_E k_h k_l^2: rotational foundation spring.
    pub rotational_stiffness: f64,
    /// k_E k_h: lateral foundation spring.
    pub lateral_stiffness: f64,
    /// 1: structural log decrement.
    pub log_decrement: f64,
    /// 1: air density (same air).
    pub air_density: f64,
    /// k_l k_v: Reynolds number (not matched).
    pub reynolds: f64,
}

impl ScaleFactors {
    /// The factors for length scale `k_l`, density ratio `k_rho` and modulus ratio `k_e`
    /// (all prototype / model, all > 0).
    pub fn new(k_l: f64, k_rho: f64, k_e: f64) -> ScaleFactors {
        let k_h = k_l / k_rho;
        let k_v = (k_e * k_h / k_l).sqrt();
        let k_f = k_v / k_l;
        ScaleFactors {
            length: k_l,
            density: k_rho,
            elastic_modulus: k_e,
            wall_thickness: k_h,
            velocity: k_v,
            frequency: k_f,
            time: 1.0 / k_f,
            displacement: k_l,
            strain: 1.0,
            stress: k_e,
            mass_per_length: k_l * k_l,
            lining_mass_per_area: k_l,
            point_mass: k_l * k_l * k_l,
            rotational_stiffness: k_e * k_h * k_l * k_l,
            lateral_stiffness: k_e * k_h,
            log_decrement: 1.0,
            air_density: 1.0,
            reynolds: k_l * k_v,
        }
    }

    /// The rows of scale.csv: (quantity, factor, similitude condition that fixes it).
    pub fn rows(&self) -> Vec<FactorRow> {
        let r = |quantity: &'static str, value: f64, condition: &'static str| FactorRow {
            quantity,
            prototype_over_model: value,
            condition,
        };
        vec![
            r(
                "length",
                self.length,
                "geometric similarity of the outer shape (chosen)",
            ),
            r(
                "wall_thickness",
                self.wall_thickness,
                "structure-to-air mass ratio, same air: k_h = k_l / k_rho",
            ),
            r("density", self.density, "material choice"),
            r("elastic_modulus", self.elastic_modulus, "material choice"),
            r(
                "velocity",
                self.velocity,
                "Cauchy number: k_v = sqrt(k_E k_h / k_l)",
            ),
            r(
                "frequency",
                self.frequency,
                "Strouhal number: k_f = k_v / k_l",
            ),
            r("time", self.time, "Strouhal number: 1 / k_f"),
            r(
                "displacement",
                self.displacement,
                "geometric similarity of the motion (y/b identical)",
            ),
            r("strain", self.strain, "curvature x fibre distance"),
            r("stress", self.stress, "Hooke's law: k_E x strain scale"),
            r(
                "mass_per_length",
                self.mass_per_length,
                "structure-to-air mass ratio m / (rho_air b^2)",
            ),
            r(
                "lining_mass_per_area",
                self.lining_mass_per_area,
                "mass ratio over the inner perimeter: k_l^2 / k_l",
            ),
            r("point_mass", self.point_mass, "mass ratio: k_l^2 x k_l"),
            r(
                "rotational_stiffness",
                self.rotational_stiffness,
                "spring/shell stiffness ratio EI / L: k_E k_h k_l^2",
            ),
            r(
                "lateral_stiffness",
                self.lateral_stiffness,
                "spring/shell stiffness ratio EI / L^3: k_E k_h",
            ),
            r(
                "log_decrement",
                self.log_decrement,
                "damping identical: the model must reproduce it",
            ),
            r("air_density", self.air_density, "same air"),
            r("reynolds_number", self.reynolds, "NOT matched: k_l k_v"),
        ]
    }
}

/// One row of the factor table.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct FactorRow {
    pub quantity: &'static str,
    pub prototype_over_model: f64,
    /// The similitude condition the factor follows from.
    pub condition: &'static str,
}

/// A scale factor as text for people: six significant digits, plain between 0.001 and
/// 100 000 (`200`, `0.0707107`, `94.4`), otherwise in exponent form with at least one
/// decimal (`8.0e6`, `1.23457e7`, `5.0e-5`), so a large factor is read at a glance instead
/// of counted in zeros (`8000000.000000`).
pub fn factor_text(v: f64) -> String {
    if !v.is_finite() || v == 0.0 {
        return format!("{v}");
    }
    let rounded = super::model_case::round_significant(v, 6);
    let a = rounded.abs();
    if (1e-3..1e5).contains(&a) {
        return format!("{rounded}");
    }
    // `{:e}` of the rounded value is its shortest mantissa: 8e6, 1.23457e7.
    let e = format!("{rounded:e}");
    match e.split_once('e') {
        Some((m, x)) if !m.contains('.') => format!("{m}.0e{x}"),
        _ => e,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn factor_text_is_short_and_exact_to_six_digits() {
        assert_eq!(factor_text(8.0e6), "8.0e6");
        assert_eq!(factor_text(12_345_678.0), "1.23457e7");
        assert_eq!(factor_text(5.0e-5), "5.0e-5");
        assert_eq!(factor_text(200.0), "200");
        assert_eq!(factor_text(94.39999999999999), "94.4");
        assert_eq!(factor_text(1.0 / 14.142135623730951), "0.0707107");
        assert_eq!(factor_text(-2.5e9), "-2.5e9");
        assert_eq!(factor_text(1.0), "1");
    }

    #[test]
    fn same_material_gives_froude_free_geometric_scaling() {
        // Same material (k_rho = k_E = 1): k_h = k_l, k_v = 1, k_f = 1 / k_l.
        let k = ScaleFactors::new(50.0, 1.0, 1.0);
        assert_eq!(k.wall_thickness, 50.0);
        assert!((k.velocity - 1.0).abs() < 1e-15);
        assert!((k.frequency - 0.02).abs() < 1e-15);
        assert!((k.time * k.frequency - 1.0).abs() < 1e-15);
    }

    #[test]
    fn rows_are_unique_and_positive() {
        let k = ScaleFactors::new(200.0, 2.1, 12.0);
        let rows = k.rows();
        let mut names: Vec<_> = rows.iter().map(|r| r.quantity).collect();
        names.sort();
        names.dedup();
        assert_eq!(names.len(), rows.len());
        assert!(rows.iter().all(|r| r.prototype_over_model > 0.0));
    }
}
