//! Vortex-shedding quantities of one mode at its shedding section: critical speed, Reynolds
//! and Scruton numbers, the E.1.2 screening rule, and the lock-in band along a tapered shell.
//!
//! Units: m, m/s, Hz, kg/m; Re, Sc, St dimensionless.
//! References: EN 1991-1-4 Annex E (clause numbers from memory): v_crit = b n / St (E.1.3.1),
//! St = 0.18 for circular sections at all Re (Figure E.1 or Table E.1, from memory),
//! Sc = 2 delta_s m_e / (rho b^2) (E.1.3.3), Re = b v_crit / nu (E.1.3.4), screening: no check
//! needed when v_crit > 1.25 v_m (E.1.2).
//!
//! The lock-in band is our own addition, not part of any code method: the heights where the
//! local critical speed b(z) n / St lies below the local mean speed v_m(z), i.e. where the
//! section could shed at the mode's frequency in the design wind. It shows a designer where a
//! remedy (strakes, diameter change) would act.

use serde::Serialize;

use crate::case::Wind;
use crate::modal::StageModel;
use crate::wind::profile;

/// Strouhal number of a circular section, all Re (EN 1991-1-4 Figure E.1 / Table E.1, from
/// memory).
pub const STROUHAL_CIRCULAR_EN: f64 = 0.18;

/// E.1.2 screening factor: no check when v_crit > 1.25 v_m (EN 1991-1-4 E.1.2, verified
/// against the TU Munich notebooks per data/reference/README.md).
pub const SCREENING_FACTOR: f64 = 1.25;

/// Critical wind speed v_crit = b n / St, m/s (EN 1991-1-4 E.1.3.1).
pub fn critical_speed_m_s(diameter_m: f64, frequency_hz: f64, strouhal: f64) -> f64 {
    diameter_m * frequency_hz / strouhal
}

/// Reynolds number Re = b v / nu (EN 1991-1-4 E.1.3.4).
pub fn reynolds(diameter_m: f64, speed_m_s: f64, kinematic_viscosity_m2_s: f64) -> f64 {
    diameter_m * speed_m_s / kinematic_viscosity_m2_s
}

/// Scruton number Sc = 2 delta_s m_e / (rho b^2) (EN 1991-1-4 E.1.3.3); delta_s structural only.
pub fn scruton(
    log_decrement: f64,
    equivalent_mass_kg_m: f64,
    air_density_kg_m3: f64,
    diameter_m: f64,
) -> f64 {
    2.0 * log_decrement * equivalent_mass_kg_m / (air_density_kg_m3 * diameter_m * diameter_m)
}

/// EN 1991-1-4 E.1.2: true when the mode need not be checked (v_crit > 1.25 v_m).
pub fn screened_out(critical_speed_m_s: f64, mean_speed_m_s: f64) -> bool {
    critical_speed_m_s > SCREENING_FACTOR * mean_speed_m_s
}

/// A range of heights, m.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct HeightBand {
    pub from_z_m: f64,
    pub to_z_m: f64,
}

/// Heights where b(z) n / St < v_m(z) (our own addition; see the module doc). Crossings are
/// interpolated linearly between nodes. Empty when the wind never reaches the local critical
/// speed.
pub fn lock_in_band(
    model: &StageModel,
    frequency_hz: f64,
    strouhal: f64,
    wind: &Wind,
) -> Vec<HeightBand> {
    let margin = |i: usize| {
        profile::mean_speed_m_s(wind, model.z_m[i])
            - critical_speed_m_s(model.outer_diameter_m[i], frequency_hz, strouhal)
    };
    let mut bands = Vec::new();
    let mut start: Option<f64> = None;
    let mut prev = margin(0);
    if prev > 0.0 {
        start = Some(model.z_m[0]);
    }
    for i in 1..model.z_m.len() {
        let cur = margin(i);
        let (za, zb) = (model.z_m[i - 1], model.z_m[i]);
        let cross = || za + (zb - za) * prev / (prev - cur);
        match (prev > 0.0, cur > 0.0) {
            (false, true) => start = Some(cross()),
            (true, false) => {
                bands.push(HeightBand {
                    from_z_m: start.take().unwrap_or(za),
                    to_z_m: cross(),
                });
            }
            _ => {}
        }
        prev = cur;
    }
    if let Some(from) = start {
        bands.push(HeightBand {
            from_z_m: from,
            to_z_m: model.height_m(),
        });
    }
    bands
}

/// Lowest start and highest end of the lock-in segments, or `None`.
pub fn envelope(bands: &[HeightBand]) -> Option<HeightBand> {
    Some(HeightBand {
        from_z_m: bands.first()?.from_z_m,
        to_z_m: bands.last()?.to_z_m,
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::case::Profile;

    #[test]
    fn formulas_match_worked_example() {
        // data/reference/README.md worked check (hand-derived from EN 1991-1-4 E.1.3): b = 4, n = 0.5,
        // St = 0.18 -> v_crit = 11.111; Re = 2.963e6; Sc = 36.0
        let v = critical_speed_m_s(4.0, 0.5, 0.18);
        assert!((v - 11.111).abs() < 5e-4);
        assert!((reynolds(4.0, v, 15e-6) - 2.963e6).abs() < 5e2);
        assert!((scruton(0.03, 12000.0, 1.25, 4.0) - 36.0).abs() < 1e-12);
        assert!(!screened_out(v, 30.0));
        assert!(screened_out(37.6, 30.0));
        assert!(!screened_out(37.5, 30.0));
    }

    #[test]
    fn lock_in_band_of_a_cone() {
        // Invented cone: D from 10 m (base) to 4 m (top) over 100 m, n = 0.5, St = 0.2:
        // v_crit(z) = 2.5 (10 - 0.06 z); uniform wind 15 m/s -> v_crit < 15 for z > 66.67 m.
        let z: Vec<f64> = (0..=10).map(|i| 10.0 * i as f64).collect();
        let d: Vec<f64> = z.iter().map(|z| 10.0 - 0.06 * z).collect();
        let zeros = vec![0.0; z.len()];
        let model = StageModel {
            z_m: z.clone(),
            outer_diameter_m: d,
            wall_m: zeros.clone(),
            shell_mass_kg_m: zeros.clone(),
            lining_mass_kg_m: zeros.clone(),
            point_masses: vec![],
            second_moment_m4: zeros,
            element_shell_mass_kg_m: vec![],
            area_m2: vec![],
            section_modulus_m3: vec![],
            sections_below: vec![],
        };
        let wind = Wind {
            reference_speed_m_s: 15.0,
            reference_height_m: 10.0,
            profile: Profile::Power { exponent: 0.0 },
            air_density_kg_m3: 1.25,
            kinematic_viscosity_m2_s: 1.5e-5,
            c_prob_k: 0.2,
            c_prob_n: 0.5,
        };
        let bands = lock_in_band(&model, 0.5, 0.2, &wind);
        assert_eq!(bands.len(), 1);
        assert!((bands[0].from_z_m - 200.0 / 3.0).abs() < 1e-9);
        assert_eq!(bands[0].to_z_m, 100.0);
        let none = lock_in_band(&model, 2.0, 0.2, &wind);
        assert!(none.is_empty() && envelope(&none).is_none());
    }
}
