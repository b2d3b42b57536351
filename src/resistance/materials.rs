//! Design stress-strain laws of EN 1992-1-1 for the section resistance: concrete
//! parabola-rectangle (3.1.7, expressions 3.17 and 3.18) with the strains of Table 3.1, and
//! reinforcing steel bilinear with a horizontal top branch (3.2.7 (2) b)).
//!
//! Sign convention: compression positive (strain and stress), as in 3.1.7 where the
//! compressive strain is written positive. Units: Pa, strain dimensionless.
//!
//! Sources read: a public copy (French edition) of NBN EN 1992-1-1:2004 section 3,
//! Table 3.1 and its analytic expressions for eps_c2, eps_cu2, n (f_ck >= 50 MPa) and 3.1.6
//! (f_cd = alpha_cc f_ck / gamma_c, alpha_cc recommended 1). Expression 3.17
//! sigma_c = f_cd (1 - (1 - eps_c / eps_c2)^n) for 0 <= eps_c < eps_c2, 3.18 sigma_c = f_cd
//! for eps_c2 <= eps_c <= eps_cu2; the 3.2.7 (2) b) steel branch f_yd = f_yk / gamma_s
//! without a strain check, and 3.17/3.18 as written above, as restated clause by clause in a
//! public EC2 code-rule dossier (see data/reference/README.md, "RC shell resistance").

/// Concrete parabola-rectangle law of EN 1992-1-1 3.1.7.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Concrete {
    /// Design compressive strength f_cd = alpha_cc f_ck / gamma_c (3.15), Pa.
    pub design_strength_pa: f64,
    /// Strain at reaching the maximum strength, eps_c2 (Table 3.1).
    pub strain_c2: f64,
    /// Ultimate strain eps_cu2 (Table 3.1).
    pub strain_cu2: f64,
    /// Exponent n of the parabola (Table 3.1).
    pub exponent: f64,
}

impl Concrete {
    /// The law for characteristic cylinder strength `f_ck_pa` with the partial factor
    /// `gamma_c` and `alpha_cc` (3.1.6 (1)P). Table 3.1: for f_ck <= 50 MPa eps_c2 = 2.0e-3,
    /// eps_cu2 = 3.5e-3, n = 2; above, eps_c2 = 2.0 + 0.085 (f_ck - 50)^0.53 per mille,
    /// eps_cu2 = 2.6 + 35 ((90 - f_ck) / 100)^4 per mille, n = 1.4 + 23.4 ((90 - f_ck)/100)^4.
    pub fn eurocode(f_ck_pa: f64, gamma_c: f64, alpha_cc: f64) -> Self {
        let f_ck_mpa = f_ck_pa / 1e6;
        let (strain_c2, strain_cu2, exponent) = if f_ck_mpa <= 50.0 {
            (2.0e-3, 3.5e-3, 2.0)
        } else {
            let q = ((90.0 - f_ck_mpa) / 100.0).max(0.0).powi(4);
            (
                (2.0 + 0.085 * (f_ck_mpa - 50.0).powf(0.53)) * 1e-3,
                (2.6 + 35.0 * q) * 1e-3,
                1.4 + 23.4 * q,
            )
        };
        Concrete {
            design_strength_pa: alpha_cc * f_ck_pa / gamma_c,
            strain_c2,
            strain_cu2,
            exponent,
        }
    }

    /// Stress at compressive strain `strain` (positive = compression); zero in tension
    /// (tensile strength ignored at the ultimate limit state, EN 1992-1-1 6.1 (2), memory).
    #[inline]
    pub fn stress_pa(&self, strain: f64) -> f64 {
        if strain <= 0.0 {
            0.0
        } else if strain < self.strain_c2 {
            let u = 1.0 - strain / self.strain_c2;
            let p = if self.exponent == 2.0 {
                u * u
            } else {
                u.powf(self.exponent)
            };
            self.design_strength_pa * (1.0 - p)
        } else {
            self.design_strength_pa
        }
    }
}

/// Reinforcing steel, bilinear with a horizontal top branch (EN 1992-1-1 3.2.7 (2) b), no
/// strain limit needed for that branch).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Steel {
    /// Design yield strength f_yd = f_yk / gamma_s, Pa.
    pub design_yield_pa: f64,
    /// Elastic modulus E_s, Pa.
    pub elastic_modulus_pa: f64,
}

impl Steel {
    /// Steel of characteristic yield strength `f_yk_pa` with partial factor `gamma_s`.
    pub fn eurocode(f_yk_pa: f64, elastic_modulus_pa: f64, gamma_s: f64) -> Self {
        Steel {
            design_yield_pa: f_yk_pa / gamma_s,
            elastic_modulus_pa,
        }
    }

    /// Design yield strain eps_yd = f_yd / E_s.
    pub fn yield_strain(&self) -> f64 {
        self.design_yield_pa / self.elastic_modulus_pa
    }

    /// Stress at strain `strain` (compression positive), symmetric in tension.
    #[inline]
    pub fn stress_pa(&self, strain: f64) -> f64 {
        (self.elastic_modulus_pa * strain).clamp(-self.design_yield_pa, self.design_yield_pa)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn table_3_1_strains_match_the_tabulated_classes() {
        // EN 1992-1-1 Table 3.1 (public copy): C55 eps_c2 2.2, eps_cu2 3.1, n 1.75; C70 2.4,
        // 2.7, 1.45; C90 2.6, 2.6, 1.4 (per mille). The table rounds to 0.1 per mille / 0.05.
        for (fck, c2, cu2, n) in [
            (30.0, 2.0, 3.5, 2.0),
            (55.0, 2.2, 3.1, 1.75),
            (70.0, 2.4, 2.7, 1.45),
            (90.0, 2.6, 2.6, 1.4),
        ] {
            let c = Concrete::eurocode(fck * 1e6, 1.5, 1.0);
            assert!(
                (c.strain_c2 * 1e3 - c2).abs() < 0.051,
                "{fck}: {}",
                c.strain_c2
            );
            assert!(
                (c.strain_cu2 * 1e3 - cu2).abs() < 0.051,
                "{fck}: {}",
                c.strain_cu2
            );
            assert!((c.exponent - n).abs() < 0.026, "{fck}: {}", c.exponent);
        }
    }

    #[test]
    fn parabola_rectangle_shape() {
        // 3.17 at half of eps_c2 with n = 2: 1 - 0.25 = 0.75 f_cd (by hand).
        let c = Concrete::eurocode(30e6, 1.5, 1.0);
        assert!((c.design_strength_pa - 20e6).abs() < 1e-6);
        assert!((c.stress_pa(1e-3) - 15e6).abs() < 1e-6);
        assert_eq!(c.stress_pa(3e-3), 20e6);
        assert_eq!(c.stress_pa(-1e-3), 0.0);
    }

    #[test]
    fn steel_bilinear() {
        let s = Steel::eurocode(500e6, 200e9, 1.15);
        assert!((s.design_yield_pa - 434.78e6).abs() < 0.01e6);
        assert!((s.stress_pa(1e-3) - 200e6).abs() < 1e-6);
        assert_eq!(s.stress_pa(-0.01), -s.design_yield_pa);
    }
}
