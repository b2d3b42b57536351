//! Mean (10-minute) wind speed along the height, m/s.
//!
//! Power law v(z) = v_ref (z / z_ref)^alpha (common practice; exponents e.g. GB 50009 terrain
//! A-D 0.12/0.15/0.22/0.30, DIN EN 1991-1-4/NA Table NA.B.2). Logarithmic law of
//! EN 1991-1-4 4.3: v_m = c_r(z) c_o v_b, c_r = k_r ln(max(z, z_min) / z0),
//! k_r = 0.19 (z0 / 0.05)^0.07 (EN 1991-1-4 (4.4), (4.5)). The case gives the mean speed at a
//! reference height, so the log profile is scaled to pass through it and the terrain factor k_r
//! (and a flat-terrain orography factor) cancels; [`terrain_factor`] is still provided for
//! reports.

use crate::case::{Profile, Wind};

/// EN 1991-1-4 (4.5) terrain factor k_r = 0.19 (z0 / z0,II)^0.07 with z0,II = 0.05 m.
pub fn terrain_factor(roughness_m: f64) -> f64 {
    0.19 * (roughness_m / 0.05).powf(0.07)
}

/// EN 1991-1-4 (4.4) roughness factor c_r(z) = k_r ln(max(z, z_min) / z0).
pub fn roughness_factor(z_m: f64, roughness_m: f64, z_min_m: f64) -> f64 {
    terrain_factor(roughness_m) * (z_m.max(z_min_m) / roughness_m).ln()
}

/// Shape of the profile: v(z) / v(z_ref).
pub fn speed_factor(wind: &Wind, z_m: f64) -> f64 {
    match wind.profile {
        Profile::Power { exponent } => {
            if z_m <= 0.0 {
                0.0
            } else {
                (z_m / wind.reference_height_m).powf(exponent)
            }
        }
        Profile::Log {
            roughness_m,
            z_min_m,
        } => {
            roughness_factor(z_m, roughness_m, z_min_m)
                / roughness_factor(wind.reference_height_m, roughness_m, z_min_m)
        }
    }
}

/// Mean wind speed at height `z_m`, m/s.
pub fn mean_speed_m_s(wind: &Wind, z_m: f64) -> f64 {
    wind.reference_speed_m_s * speed_factor(wind, z_m)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn wind(profile: Profile) -> Wind {
        Wind {
            reference_speed_m_s: 30.0,
            reference_height_m: 10.0,
            profile,
            air_density_kg_m3: 1.25,
            kinematic_viscosity_m2_s: 1.5e-5,
            c_prob_k: 0.2,
            c_prob_n: 0.5,
        }
    }

    #[test]
    fn power_law_passes_reference_and_scales() {
        let w = wind(Profile::Power { exponent: 0.16 });
        assert!((mean_speed_m_s(&w, 10.0) - 30.0).abs() < 1e-12);
        // 30 * 8^0.16 = 41.64... (calculator)
        assert!((mean_speed_m_s(&w, 80.0) - 30.0 * 8f64.powf(0.16)).abs() < 1e-12);
        assert_eq!(mean_speed_m_s(&w, 0.0), 0.0);
    }

    #[test]
    fn log_law_terrain_ii_values() {
        // EN 1991-1-4 4.3/4.4: terrain II z0 = 0.05 m gives k_r = 0.19 exactly.
        assert!((terrain_factor(0.05) - 0.19).abs() < 1e-15);
        // terrain III (z0 = 0.3): k_r = 0.19 * 6^0.07 = 0.2154 (EN 1991-1-4 (4.5), calculator)
        assert!((terrain_factor(0.3) - 0.2154).abs() < 5e-5);
        let w = wind(Profile::Log {
            roughness_m: 0.05,
            z_min_m: 2.0,
        });
        assert!((mean_speed_m_s(&w, 10.0) - 30.0).abs() < 1e-12);
        let expect = 30.0 * (100f64 / 0.05).ln() / (10f64 / 0.05).ln();
        assert!((mean_speed_m_s(&w, 100.0) - expect).abs() < 1e-12);
        // below z_min the speed is constant (EN 1991-1-4 (4.4))
        assert_eq!(mean_speed_m_s(&w, 0.5), mean_speed_m_s(&w, 2.0));
    }
}
