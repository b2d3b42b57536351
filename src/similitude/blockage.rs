//! Wind-tunnel blockage and the proposed length scale k_l.
//!
//! The model's frontal area is int D(z) dz / k_l^2 (D linear between stations, so the
//! trapezoid rule is exact). The blockage ratio is that area over the test-section area
//! W x H. Common practice keeps it at or below 5-8 % so that no blockage correction is
//! needed; the default limit 0.05 (`input::validate::DEFAULT_MAX_BLOCKAGE`) is the cautious
//! end of that range (common practice). The model must also fit the test-section height
//! with room above its tip: we allow the model height to be at most
//! [`MAX_HEIGHT_FRACTION`] of the tunnel height (our choice; it keeps the tip clear of the
//! ceiling boundary layer, common practice).
//!
//! The proposed k_l is the smallest value of the series 1, 1.25, 1.5, 2, 2.5, 3, 4, 5, 6, 8
//! x 10^n (our choice of "round" scales) that meets both limits: a larger model is better
//! (higher Reynolds number, thicker walls) so we want the smallest admissible k_l.

use serde::Serialize;

use crate::case::Shell;

/// Largest model height as a fraction of the test-section height (our choice).
pub const MAX_HEIGHT_FRACTION: f64 = 0.75;

/// Mantissas of the round length scales, per decade.
pub const ROUND_SCALES: [f64; 10] = [1.0, 1.25, 1.5, 2.0, 2.5, 3.0, 4.0, 5.0, 6.0, 8.0];

/// Frontal area of the prototype shell, int D dz, m2.
pub fn frontal_area_m2(shell: &Shell) -> f64 {
    shell
        .stations
        .windows(2)
        .map(|w| 0.5 * (w[0].outer_diameter_m + w[1].outer_diameter_m) * (w[1].z_m - w[0].z_m))
        .sum()
}

/// How the model sits in the tunnel.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Blockage {
    pub tunnel_width_m: f64,
    pub tunnel_height_m: f64,
    pub prototype_frontal_area_m2: f64,
    pub model_frontal_area_m2: f64,
    /// Model frontal area / test-section area.
    pub blockage_ratio: f64,
    pub max_blockage: f64,
    pub model_height_m: f64,
    /// Largest admissible model height, m (MAX_HEIGHT_FRACTION x tunnel height).
    pub max_model_height_m: f64,
    /// Smallest k_l meeting both limits exactly (before rounding).
    pub min_length_scale: f64,
}

impl Blockage {
    /// The blockage of the model at scale `k_l`.
    pub fn at_scale(
        shell: &Shell,
        k_l: f64,
        tunnel_width_m: f64,
        tunnel_height_m: f64,
        max_blockage: f64,
    ) -> Blockage {
        let area = frontal_area_m2(shell);
        let section = tunnel_width_m * tunnel_height_m;
        let max_model_height_m = MAX_HEIGHT_FRACTION * tunnel_height_m;
        let k_area = (area / (max_blockage * section)).sqrt();
        let k_height = shell.height_m() / max_model_height_m;
        Blockage {
            tunnel_width_m,
            tunnel_height_m,
            prototype_frontal_area_m2: area,
            model_frontal_area_m2: area / (k_l * k_l),
            blockage_ratio: area / (k_l * k_l) / section,
            max_blockage,
            model_height_m: shell.height_m() / k_l,
            max_model_height_m,
            min_length_scale: k_area.max(k_height),
        }
    }

    /// Whether the model at this scale meets both limits.
    pub fn fits(&self) -> bool {
        self.blockage_ratio <= self.max_blockage * (1.0 + 1e-12)
            && self.model_height_m <= self.max_model_height_m * (1.0 + 1e-12)
    }
}

/// The smallest round scale (see [`ROUND_SCALES`]) that is >= `minimum` (> 0).
pub fn round_up_scale(minimum: f64) -> f64 {
    let mut decade = 10f64.powf(minimum.log10().floor());
    loop {
        for m in ROUND_SCALES {
            let k = m * decade;
            // Tolerance so that an exact round minimum (e.g. 200) is not pushed up by
            // rounding in log10.
            if k >= minimum * (1.0 - 1e-12) {
                return k;
            }
        }
        decade *= 10.0;
    }
}

/// The proposed length scale for a tunnel: the smallest round k_l with the model inside
/// both limits, and never below 1 (no model larger than the prototype).
pub fn propose_length_scale(
    shell: &Shell,
    tunnel_width_m: f64,
    tunnel_height_m: f64,
    max_blockage: f64,
) -> f64 {
    let b = Blockage::at_scale(shell, 1.0, tunnel_width_m, tunnel_height_m, max_blockage);
    round_up_scale(b.min_length_scale.max(1.0))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::case::{BeamTheory, Station};

    fn cone() -> Shell {
        Shell {
            zones: vec![],
            openings: vec![],
            elastic_modulus_pa: 30e9,
            density_kg_m3: 2500.0,
            poisson_ratio: 0.2,
            beam: BeamTheory::Timoshenko,
            stations: vec![
                Station {
                    z_m: 0.0,
                    outer_diameter_m: 12.0,
                    wall_m: 0.4,
                },
                Station {
                    z_m: 100.0,
                    outer_diameter_m: 8.0,
                    wall_m: 0.2,
                },
            ],
        }
    }

    #[test]
    fn frontal_area_of_a_cone_is_mean_diameter_times_height() {
        assert!((frontal_area_m2(&cone()) - 1000.0).abs() < 1e-9);
    }

    #[test]
    fn round_scales() {
        assert_eq!(round_up_scale(200.0), 200.0);
        assert_eq!(round_up_scale(201.0), 250.0);
        assert_eq!(round_up_scale(81.0), 100.0);
        assert_eq!(round_up_scale(1.1), 1.25);
        assert_eq!(round_up_scale(0.9), 1.0);
    }

    #[test]
    fn proposal_meets_the_limits_and_the_next_smaller_round_scale_does_not() {
        // 1000 m2 of frontal area, 2 m x 1.5 m tunnel, 5 %: k_l >= sqrt(1000 / 0.15) = 81.6;
        // height 100 m / (0.75 x 1.5 m) = 88.9 governs -> 100.
        let k = propose_length_scale(&cone(), 2.0, 1.5, 0.05);
        assert_eq!(k, 100.0);
        assert!(Blockage::at_scale(&cone(), k, 2.0, 1.5, 0.05).fits());
        assert!(!Blockage::at_scale(&cone(), 80.0, 2.0, 1.5, 0.05).fits());
    }
}
