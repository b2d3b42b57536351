//! Properties of the hollow circular (annulus) shell section, m-based SI.
//!
//! Thin-walled tube formulas are exact for the annulus: A = pi/4 (D^2 - d^2),
//! I = pi/64 (D^4 - d^4), d = D - 2t (any structural mechanics text). Cowper's (1966) shear
//! coefficient for a hollow circular section,
//! k = 6(1+nu)(1+m^2)^2 / ((7+6nu)(1+m^2)^2 + (20+12nu)m^2), m = d/D
//! (G. R. Cowper, J. Appl. Mech. 33 (1966) 335-340, table 1).
//!
//! [`opening`]: the net section where flue and access openings cut the wall.

use serde::Serialize;

pub mod opening;

/// Properties of one annulus section, SI.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Annulus {
    pub outer_diameter_m: f64,
    pub wall_m: f64,
}

impl Annulus {
    pub fn new(outer_diameter_m: f64, wall_m: f64) -> Self {
        Annulus {
            outer_diameter_m,
            wall_m,
        }
    }

    /// Inner diameter d = D - 2t, m.
    pub fn inner_diameter_m(&self) -> f64 {
        self.outer_diameter_m - 2.0 * self.wall_m
    }

    /// Cross-section area A = pi/4 (D^2 - d^2) = pi t (D - t), m2 (the second form avoids
    /// cancellation for thin walls).
    pub fn area_m2(&self) -> f64 {
        std::f64::consts::PI * self.wall_m * (self.outer_diameter_m - self.wall_m)
    }

    /// Second moment of area I = pi/64 (D^4 - d^4), m4, written as
    /// pi/64 (D^2 + d^2)(D + d)(D - d) to keep thin walls exact.
    pub fn second_moment_m4(&self) -> f64 {
        let d_out = self.outer_diameter_m;
        let d_in = self.inner_diameter_m();
        std::f64::consts::PI / 64.0
            * (d_out * d_out + d_in * d_in)
            * (d_out + d_in)
            * (2.0 * self.wall_m)
    }

    /// Elastic section modulus W = I / (D/2), m3.
    pub fn section_modulus_m3(&self) -> f64 {
        self.second_moment_m4() / (0.5 * self.outer_diameter_m)
    }

    /// Cowper's shear coefficient for a hollow circular section (Cowper 1966, table 1).
    pub fn cowper_shear_coefficient(&self, poisson_ratio: f64) -> f64 {
        let nu = poisson_ratio;
        let m = self.inner_diameter_m() / self.outer_diameter_m;
        let m2 = m * m;
        let a = (1.0 + m2) * (1.0 + m2);
        6.0 * (1.0 + nu) * a / ((7.0 + 6.0 * nu) * a + (20.0 + 12.0 * nu) * m2)
    }
}

/// One row of `sections.csv`: the shell (and lining) properties at a mesh node.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct SectionRow {
    pub z_m: f64,
    pub outer_diameter_m: f64,
    pub wall_m: f64,
    pub area_m2: f64,
    pub second_moment_m4: f64,
    pub section_modulus_m3: f64,
    pub shear_coefficient: f64,
    pub shell_mass_kg_m: f64,
    pub lining_mass_kg_m: f64,
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn thin_tube_formulas_match_textbook_forms() {
        // I = pi/64 (D^4 - d^4), A = pi/4 (D^2 - d^2) (any mechanics text).
        let s = Annulus::new(16.0, 0.55);
        let d = 16.0 - 1.1;
        let pi = std::f64::consts::PI;
        assert_relative_eq!(
            s.area_m2(),
            pi / 4.0 * (256.0 - d * d),
            max_relative = 1e-14
        );
        assert_relative_eq!(
            s.second_moment_m4(),
            pi / 64.0 * (16f64.powi(4) - d.powi(4)),
            max_relative = 1e-13
        );
    }

    #[test]
    fn cowper_limits() {
        // Cowper (1966) table 1: solid circle k = 6(1+nu)/(7+6nu); thin-walled tube
        // k = 2(1+nu)/(4+3nu).
        let nu = 0.3;
        let solid = Annulus::new(1.0, 0.5);
        assert_relative_eq!(
            solid.cowper_shear_coefficient(nu),
            6.0 * (1.0 + nu) / (7.0 + 6.0 * nu),
            max_relative = 1e-14
        );
        let thin = Annulus::new(1.0, 1e-7);
        assert_relative_eq!(
            thin.cowper_shear_coefficient(nu),
            2.0 * (1.0 + nu) / (4.0 + 3.0 * nu),
            max_relative = 1e-6
        );
    }
}
