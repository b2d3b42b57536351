//! Site wind the EN 1991-1-4 way: terrain category, roughness factor, mean speed, turbulence
//! intensity, peak velocity pressure and turbulent length scale along the height.
//!
//! Units: m, m/s, Pa, kg/m3.
//!
//! References (EN 1991-1-4:2005; expressions read in the public implementation
//! `xcfem/xc`, `python_modules/actions/wind/ec1_wind.py`, which cites each expression):
//! - v_b = c_dir c_season v_b,0 (4.1), also `NBNEORIGIN/structural_design`
//!   `CODE_COMPLIANCE_SUMMARY.md`; c_prob multiplies v_b (4.2 Note 4; computed elsewhere).
//! - c_r(z) = k_r ln(max(z, z_min) / z0) (4.4), k_r = 0.19 (z0 / z0,II)^0.07, z0,II = 0.05 m
//!   (4.5); v_m = c_r c_o v_b (4.3).
//! - I_v(z) = k_I / (c_o ln(max(z, z_min) / z0)), k_I = 1 (4.7).
//! - q_p(z) = (1 + 7 I_v) 0.5 rho v_m^2 (4.8).
//! - L(z) = L_t (max(z, z_min) / z_t)^alpha, L_t = 300 m, z_t = 200 m,
//!   alpha = 0.67 + 0.05 ln(z0) (B.1), as written in two public implementations (see
//!   data/reference/README.md).
//! - Table 4.1 (z0, z_min): 0.003/0.01/0.05/0.3/1.0 m and 1/1/2/5/10 m for categories
//!   0/I/II/III/IV, as quoted with the table number in two public implementations:
//!   `DanBeranek/desssign` `src/desssign/loads/wind/constants.py` (ROUGHNESS_LENGTH,
//!   MINIMUM_HEIGHT) and `AMcCrone/tt-BS-EN-1991-1-4` `calc_engine/eu/roughness.py` (the
//!   standard's copy itself was not read).
//!
//! EN 1991-1-4 4.3.2 limits the expressions to z <= z_max = 200 m; above that we extrapolate
//! the same expressions (the caller warns).

use serde::Serialize;

/// Height up to which the EN 1991-1-4 4.3.2 expressions are given, m.
pub const Z_MAX_M: f64 = 200.0;
/// Roughness length of terrain category II, m (EN 1991-1-4 4.5, Table 4.1).
pub const Z0_II_M: f64 = 0.05;
/// Turbulence factor k_I, recommended value (EN 1991-1-4 4.7 Note 2).
pub const TURBULENCE_FACTOR: f64 = 1.0;
/// Peak factor term 7 of q_p (EN 1991-1-4 (4.8)).
pub const PEAK_PRESSURE_FACTOR: f64 = 7.0;
/// Reference length scale L_t, m, and height z_t, m (EN 1991-1-4 (B.1)).
pub const LENGTH_SCALE_REF_M: f64 = 300.0;
pub const LENGTH_SCALE_HEIGHT_M: f64 = 200.0;

pub use crate::case::TerrainCategory;

impl TerrainCategory {
    /// The case-file spellings, in table order.
    pub const KEYS: [&'static str; 5] = ["0", "I", "II", "III", "IV"];

    /// Parses the case-file spelling.
    pub fn from_key(key: &str) -> Option<Self> {
        match key {
            "0" => Some(Self::Zero),
            "I" => Some(Self::I),
            "II" => Some(Self::II),
            "III" => Some(Self::III),
            "IV" => Some(Self::IV),
            _ => None,
        }
    }

    /// The case-file spelling.
    pub fn key(self) -> &'static str {
        match self {
            Self::Zero => "0",
            Self::I => "I",
            Self::II => "II",
            Self::III => "III",
            Self::IV => "IV",
        }
    }

    /// Roughness length z0, m (Table 4.1; public implementations, see the module doc).
    pub fn roughness_m(self) -> f64 {
        match self {
            Self::Zero => 0.003,
            Self::I => 0.01,
            Self::II => 0.05,
            Self::III => 0.3,
            Self::IV => 1.0,
        }
    }

    /// Minimum height z_min, m (Table 4.1; public implementations, see the module doc).
    pub fn z_min_m(self) -> f64 {
        match self {
            Self::Zero | Self::I => 1.0,
            Self::II => 2.0,
            Self::III => 5.0,
            Self::IV => 10.0,
        }
    }
}

/// The EN site wind of one stage: terrain, basic speed (already times c_prob), orography.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct EnProfile {
    pub terrain: TerrainCategory,
    /// v_b of this stage = c_prob c_dir c_season v_b,0, m/s.
    pub basic_speed_m_s: f64,
    /// c_o, taken constant with height.
    pub orography_factor: f64,
    pub air_density_kg_m3: f64,
}

impl EnProfile {
    /// k_r (4.5).
    pub fn terrain_factor(&self) -> f64 {
        0.19 * (self.terrain.roughness_m() / Z0_II_M).powf(0.07)
    }

    fn log_term(&self, z_m: f64) -> f64 {
        (z_m.max(self.terrain.z_min_m()) / self.terrain.roughness_m()).ln()
    }

    /// c_r(z) (4.4).
    pub fn roughness_factor(&self, z_m: f64) -> f64 {
        self.terrain_factor() * self.log_term(z_m)
    }

    /// v_m(z) = c_r c_o v_b (4.3), m/s.
    pub fn mean_speed_m_s(&self, z_m: f64) -> f64 {
        self.roughness_factor(z_m) * self.orography_factor * self.basic_speed_m_s
    }

    /// I_v(z) (4.7).
    pub fn turbulence_intensity(&self, z_m: f64) -> f64 {
        TURBULENCE_FACTOR / (self.orography_factor * self.log_term(z_m))
    }

    /// q_p(z) (4.8), Pa.
    pub fn peak_pressure_pa(&self, z_m: f64) -> f64 {
        let v = self.mean_speed_m_s(z_m);
        (1.0 + PEAK_PRESSURE_FACTOR * self.turbulence_intensity(z_m))
            * 0.5
            * self.air_density_kg_m3
            * v
            * v
    }

    /// Peak velocity sqrt(2 q_p / rho), m/s (the speed of the Reynolds number in 7.9.2).
    pub fn peak_speed_m_s(&self, z_m: f64) -> f64 {
        (2.0 * self.peak_pressure_pa(z_m) / self.air_density_kg_m3).sqrt()
    }

    /// Turbulent length scale L(z) (B.1), m.
    pub fn length_scale_m(&self, z_m: f64) -> f64 {
        let alpha = 0.67 + 0.05 * self.terrain.roughness_m().ln();
        LENGTH_SCALE_REF_M * (z_m.max(self.terrain.z_min_m()) / LENGTH_SCALE_HEIGHT_M).powf(alpha)
    }

    /// The same profile with v_b scaled by `factor`.
    pub fn scaled(&self, factor: f64) -> Self {
        EnProfile {
            basic_speed_m_s: self.basic_speed_m_s * factor,
            ..*self
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn profile(t: TerrainCategory) -> EnProfile {
        EnProfile {
            terrain: t,
            basic_speed_m_s: 26.0,
            orography_factor: 1.0,
            air_density_kg_m3: 1.25,
        }
    }

    // Each value recomputed by hand from EN 1991-1-4 (4.3)-(4.8) and Table 4.1.
    #[test]
    fn category_ii_at_50_m() {
        let p = profile(TerrainCategory::II);
        assert!((p.terrain_factor() - 0.19).abs() < 1e-12);
        let ln = (50.0f64 / 0.05).ln();
        assert!((p.roughness_factor(50.0) - 0.19 * ln).abs() < 1e-12);
        assert!((p.turbulence_intensity(50.0) - 1.0 / ln).abs() < 1e-12);
        let vm = 0.19 * ln * 26.0;
        let qp = (1.0 + 7.0 / ln) * 0.5 * 1.25 * vm * vm;
        assert!((p.peak_pressure_pa(50.0) - qp).abs() < 1e-9 * qp);
    }

    #[test]
    fn below_z_min_is_constant() {
        let p = profile(TerrainCategory::IV);
        assert_eq!(p.mean_speed_m_s(3.0), p.mean_speed_m_s(10.0));
        assert_eq!(p.turbulence_intensity(0.0), p.turbulence_intensity(10.0));
    }

    #[test]
    fn keys_round_trip() {
        for k in TerrainCategory::KEYS {
            assert_eq!(TerrainCategory::from_key(k).unwrap().key(), k);
        }
        assert!(TerrainCategory::from_key("V").is_none());
    }

    #[test]
    fn length_scale_at_200_m_is_300_m() {
        // (B.1): L(z_t) = L_t for every category.
        for k in TerrainCategory::KEYS {
            let p = profile(TerrainCategory::from_key(k).unwrap());
            assert!((p.length_scale_m(200.0) - 300.0).abs() < 1e-9);
        }
    }
}
