//! Along-wind line load w(z) = c_s c_d c_f(z) q_p(z) b(z) (EN 1991-1-4 5.3 (5.3) for a
//! structure of reference area b per metre; the force coefficient per height as in
//! `force_coefficient`) and the shear, bending moment and extreme-fibre stress it causes
//! along the cantilever.
//!
//! Statics of a cantilever: V(z) = int_z^h w ds, M(z) = int_z^h w (s - z) ds; stress
//! sigma = M / W with W of the uncracked section at the node: the annulus, or the net
//! section at openings and the weaker side at a step ([`StageModel::stress_modulus_m3`]).
//! Each element is integrated with 4-point Gauss (`wind::shape::GAUSS4`), b linear in the
//! element, q_p exact at each Gauss point, c_f linear between its node values; an element
//! that contains z_min (where q_p has a kink) is split there.
//!
//! Units: N/m, N, N m, Pa, m.

use serde::Serialize;

use crate::along::force_coefficient::{
    c_f0, c_f0_from_logs, effective_slenderness, end_effect_factor, MIN_ROUGHNESS_RATIO,
};
use crate::along::terrain::EnProfile;
use crate::modal::StageModel;
use crate::wind::shape::GAUSS4;

/// How the force coefficient is obtained along the height.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub enum ForceCoefficient {
    /// Figure 7.28 per height (Re at the peak velocity, k/b) times psi_lambda.
    Computed {
        roughness_m: f64,
        kinematic_viscosity_m2_s: f64,
        end_effect_factor: f64,
    },
    /// The user's `along_wind.force_coefficient`, used as c_f everywhere.
    Given(f64),
}

impl ForceCoefficient {
    /// Figure 7.28 + 7.36 for a stage of height `height_m` and mean diameter `mean_b_m`.
    pub fn computed(
        roughness_m: f64,
        kinematic_viscosity_m2_s: f64,
        height_m: f64,
        mean_b_m: f64,
    ) -> Self {
        ForceCoefficient::Computed {
            roughness_m,
            kinematic_viscosity_m2_s,
            end_effect_factor: end_effect_factor(effective_slenderness(height_m, mean_b_m)),
        }
    }

    /// c_f at a section of diameter `b_m` where the profile gives the peak speed.
    pub fn at(&self, profile: &EnProfile, z_m: f64, b_m: f64) -> f64 {
        match *self {
            ForceCoefficient::Given(c) => c,
            ForceCoefficient::Computed {
                roughness_m,
                kinematic_viscosity_m2_s,
                end_effect_factor,
            } => {
                let re = b_m * profile.peak_speed_m_s(z_m) / kinematic_viscosity_m2_s;
                c_f0(re, roughness_m / b_m) * end_effect_factor
            }
        }
    }
}

/// Along-wind effects at one node.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct AlongPoint {
    pub z_m: f64,
    pub mean_speed_m_s: f64,
    pub turbulence_intensity: f64,
    pub peak_pressure_pa: f64,
    pub force_coefficient: f64,
    pub line_load_n_m: f64,
    pub shear_n: f64,
    pub moment_nm: f64,
    pub stress_pa: f64,
}

fn diameter_at(model: &StageModel, e: usize, z_m: f64) -> f64 {
    let (za, zb) = (model.z_m[e], model.z_m[e + 1]);
    let t = (z_m - za) / (zb - za);
    let d = &model.outer_diameter_m;
    d[e] + t * (d[e + 1] - d[e])
}

/// One Gauss point of the load integration.
#[derive(Debug, Clone, Copy)]
struct GaussPoint {
    element: usize,
    /// Local coordinate in the element, 0..1 (for c_f, linear between the nodes).
    t: f64,
    /// Gauss weight times the piece length, m.
    weight_m: f64,
    /// s - z_e, m.
    lever_m: f64,
    /// q_p(s) b(s) of the design profile, N/m.
    pressure_width_n_m: f64,
}

/// The along-wind load integration of one stage, prepared once: q_p b at every Gauss point
/// and the logarithms of c_f at every node. Every chapter 4 quantity scales with v_b except
/// I_v, so the load at another speed (v_b times `speed_factor`) is q_p scaled by
/// speed_factor^2 and c_f re-evaluated at the scaled Reynolds number. c_f is evaluated at the
/// nodes and taken linear between them (it varies slowly along the height).
#[derive(Debug, Clone)]
pub struct LoadGrid<'a> {
    model: &'a StageModel,
    profile: EnProfile,
    cf: ForceCoefficient,
    gauss: Vec<GaussPoint>,
    /// log10(Re / 1e6) at the design peak speed and log10(10 k/b), per node.
    log_re: Vec<f64>,
    log_roughness: Vec<f64>,
}

impl<'a> LoadGrid<'a> {
    pub fn new(model: &'a StageModel, profile: &EnProfile, cf: &ForceCoefficient) -> Self {
        let z = &model.z_m;
        let z_min = profile.terrain.z_min_m();
        let mut gauss = Vec::with_capacity(4 * z.len());
        for e in 0..z.len() - 1 {
            let (za, zb) = (z[e], z[e + 1]);
            let split = za < z_min && z_min < zb;
            let pieces = if split {
                [(za, z_min), (z_min, zb)]
            } else {
                [(za, zb), (zb, zb)]
            };
            for (lo, hi) in pieces {
                if hi <= lo {
                    continue;
                }
                for &(x, wt) in &GAUSS4 {
                    let s = lo + (hi - lo) * x;
                    gauss.push(GaussPoint {
                        element: e,
                        t: (s - za) / (zb - za),
                        weight_m: wt * (hi - lo),
                        lever_m: s - za,
                        pressure_width_n_m: profile.peak_pressure_pa(s) * diameter_at(model, e, s),
                    });
                }
            }
        }
        let (log_re, log_roughness) = match *cf {
            ForceCoefficient::Computed {
                roughness_m,
                kinematic_viscosity_m2_s,
                ..
            } => z
                .iter()
                .zip(&model.outer_diameter_m)
                .map(|(&zi, &b)| {
                    let re = b * profile.peak_speed_m_s(zi) / kinematic_viscosity_m2_s;
                    (
                        (re.max(1e5) / 1e6).log10(),
                        (10.0 * (roughness_m / b).max(MIN_ROUGHNESS_RATIO)).log10(),
                    )
                })
                .unzip(),
            ForceCoefficient::Given(_) => (Vec::new(), Vec::new()),
        };
        LoadGrid {
            model,
            profile: *profile,
            cf: *cf,
            gauss,
            log_re,
            log_roughness,
        }
    }

    /// c_f at every node with v_b times `speed_factor`.
    fn node_force_coefficients(&self, speed_factor: f64) -> Vec<f64> {
        match self.cf {
            ForceCoefficient::Given(c) => vec![c; self.model.z_m.len()],
            ForceCoefficient::Computed {
                end_effect_factor, ..
            } => {
                let shift = speed_factor.log10();
                self.log_re
                    .iter()
                    .zip(&self.log_roughness)
                    .map(|(&x, &lk)| {
                        // Re >= 1e5 as in `c_f0`.
                        end_effect_factor * c_f0_from_logs((x + shift).max(-1.0), lk)
                    })
                    .collect()
            }
        }
    }

    /// Shear and moment at every node under c_s c_d c_f q_p b with v_b times `speed_factor`.
    fn internal_forces(&self, speed_factor: f64, cscd: f64, cf: &[f64]) -> (Vec<f64>, Vec<f64>) {
        let z = &self.model.z_m;
        let n = z.len();
        let scale = cscd * speed_factor * speed_factor;
        let mut force = vec![0.0; n];
        let mut lever = vec![0.0; n];
        for g in &self.gauss {
            let e = g.element;
            let c = cf[e] + g.t * (cf[e + 1] - cf[e]);
            let f = scale * c * g.pressure_width_n_m * g.weight_m;
            force[e] += f;
            lever[e] += f * g.lever_m;
        }
        let mut shear = vec![0.0; n];
        let mut moment = vec![0.0; n];
        for e in (0..n - 1).rev() {
            shear[e] = shear[e + 1] + force[e];
            moment[e] = moment[e + 1] + shear[e + 1] * (z[e + 1] - z[e]) + lever[e];
        }
        (shear, moment)
    }

    /// The design action (v_b as given) at every node.
    pub fn points(&self, cscd: f64) -> Vec<AlongPoint> {
        let cf = self.node_force_coefficients(1.0);
        let (shear, moment) = self.internal_forces(1.0, cscd, &cf);
        let m = self.model;
        let p = &self.profile;
        (0..m.z_m.len())
            .map(|i| {
                let (z, b) = (m.z_m[i], m.outer_diameter_m[i]);
                let q = p.peak_pressure_pa(z);
                // Net section at openings, weaker side at steps (as the across-wind stress).
                let w_section = m.stress_modulus_m3(i);
                AlongPoint {
                    z_m: z,
                    mean_speed_m_s: p.mean_speed_m_s(z),
                    turbulence_intensity: p.turbulence_intensity(z),
                    peak_pressure_pa: q,
                    force_coefficient: cf[i],
                    line_load_n_m: cscd * cf[i] * q * b,
                    shear_n: shear[i],
                    moment_nm: moment[i],
                    stress_pa: moment[i] / w_section,
                }
            })
            .collect()
    }

    /// (z_m, moment_nm) at every node with v_b times `speed_factor` and factor `cscd`.
    pub fn moments(&self, speed_factor: f64, cscd: f64) -> Vec<(f64, f64)> {
        let cf = self.node_force_coefficients(speed_factor);
        let (_, moment) = self.internal_forces(speed_factor, cscd, &cf);
        self.model.z_m.iter().copied().zip(moment).collect()
    }
}

/// The line load, shear, moment and stress at every node of the stage model for the
/// profile `profile`, structural factor `cscd` and force coefficient `cf`.
pub fn along_wind_loads(
    model: &StageModel,
    profile: &EnProfile,
    cscd: f64,
    cf: &ForceCoefficient,
) -> Vec<AlongPoint> {
    LoadGrid::new(model, profile, cf).points(cscd)
}

/// Mean outer diameter over the stage height (trapezoidal over the nodes), m.
pub fn mean_diameter_m(model: &StageModel) -> f64 {
    let z = &model.z_m;
    let d = &model.outer_diameter_m;
    let area: f64 = (0..z.len() - 1)
        .map(|e| 0.5 * (d[e] + d[e + 1]) * (z[e + 1] - z[e]))
        .sum();
    area / model.height_m()
}

/// Outer diameter at height `z_m` of the stage model (linear between nodes), m.
pub fn diameter_at_height(model: &StageModel, z_m: f64) -> f64 {
    let z = &model.z_m;
    let e = z.partition_point(|&s| s <= z_m).clamp(1, z.len() - 1) - 1;
    diameter_at(model, e, z_m.clamp(z[0], z[z.len() - 1]))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::case::TerrainCategory;

    fn tapered() -> StageModel {
        let z: Vec<f64> = (0..=30).map(|i| 5.0 * i as f64).collect();
        let k = z.len();
        StageModel {
            outer_diameter_m: z.iter().map(|z| 14.0 - 0.04 * z).collect(),
            wall_m: z.iter().map(|z| 0.5 - 0.002 * z).collect(),
            z_m: z,
            shell_mass_kg_m: vec![1.0; k],
            lining_mass_kg_m: vec![0.0; k],
            point_masses: Vec::new(),
            second_moment_m4: vec![1.0; k],
            element_shell_mass_kg_m: vec![[1.0, 1.0]; k - 1],
            area_m2: vec![1.0; k],
            section_modulus_m3: vec![1.0; k],
            sections_below: Vec::new(),
        }
    }

    #[test]
    fn speed_scaling_equals_a_rebuilt_profile() {
        // The grid's scaling (q_p x s^2, log10 Re + log10 s) against a profile with v_b x s
        // built from scratch: same numbers up to rounding.
        let model = tapered();
        let p = EnProfile {
            terrain: TerrainCategory::III,
            basic_speed_m_s: 27.0,
            orography_factor: 1.1,
            air_density_kg_m3: 1.25,
        };
        let cf = ForceCoefficient::computed(0.2e-3, 1.5e-5, 150.0, mean_diameter_m(&model));
        let grid = LoadGrid::new(&model, &p, &cf);
        for s in [0.3, 0.55, 1.0] {
            let fast = grid.moments(s, 0.9);
            let slow = LoadGrid::new(&model, &p.scaled(s), &cf).points(0.9);
            for (a, b) in fast.iter().zip(&slow) {
                assert!((a.1 - b.moment_nm).abs() <= 1e-10 * slow[0].moment_nm);
            }
        }
    }

    #[test]
    fn node_force_coefficient_matches_the_figure_function() {
        let model = tapered();
        let p = EnProfile {
            terrain: TerrainCategory::II,
            basic_speed_m_s: 26.0,
            orography_factor: 1.0,
            air_density_kg_m3: 1.25,
        };
        let cf = ForceCoefficient::computed(0.2e-3, 1.5e-5, 150.0, mean_diameter_m(&model));
        let pts = along_wind_loads(&model, &p, 1.0, &cf);
        for (i, pt) in pts.iter().enumerate() {
            let want = cf.at(&p, model.z_m[i], model.outer_diameter_m[i]);
            assert!((pt.force_coefficient - want).abs() < 1e-12);
        }
    }
}
