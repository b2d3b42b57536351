//! Along-wind line load w(z) = c_s c_d c_f(z) q_p(z) b(z) (EN 1991-1-4 5.3 (5.3) for a
//! structure of reference area b per metre; the force coefficient per height as in
//! `force_coefficient`) and the shear, bending moment and extreme-fibre stress it causes
//! along the cantilever.
//!
//! Statics of a cantilever: V(z) = int_z^h w ds, M(z) = int_z^h w (s - z) ds; stress
//! sigma = M / W with W of the gross (uncracked) annulus at the node (`section::Annulus`).
//! Each element is integrated with 4-point Gauss (`wind::shape::GAUSS4`), b linear in the
//! element; an element that contains z_min (where q_p has a kink) is split there, so the
//! integral is exact to the Gauss rule on smooth pieces.
//!
//! Units: N/m, N, N m, Pa, m.

use serde::Serialize;

use crate::along::force_coefficient::{c_f0, effective_slenderness, end_effect_factor};
use crate::along::terrain::EnProfile;
use crate::modal::StageModel;
use crate::section::Annulus;
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

/// The line load, shear, moment and stress at every node of the stage model for the
/// profile `profile`, structural factor `cscd` and force coefficient `cf`.
pub fn along_wind_loads(
    model: &StageModel,
    profile: &EnProfile,
    cscd: f64,
    cf: &ForceCoefficient,
) -> Vec<AlongPoint> {
    let z = &model.z_m;
    let n = z.len();
    let z_min = profile.terrain.z_min_m();
    let w = |e: usize, s: f64| -> f64 {
        let b = diameter_at(model, e, s);
        cscd * cf.at(profile, s, b) * profile.peak_pressure_pa(s) * b
    };
    let mut shear = vec![0.0; n];
    let mut moment = vec![0.0; n];
    for e in (0..n - 1).rev() {
        let (za, zb) = (z[e], z[e + 1]);
        let pieces: [(f64, f64); 2] = if za < z_min && z_min < zb {
            [(za, z_min), (z_min, zb)]
        } else {
            [(za, zb), (zb, zb)]
        };
        let (mut force, mut lever) = (0.0, 0.0);
        for (lo, hi) in pieces {
            if hi <= lo {
                continue;
            }
            for &(x, wt) in &GAUSS4 {
                let s = lo + (hi - lo) * x;
                let f = w(e, s) * wt * (hi - lo);
                force += f;
                lever += f * (s - za);
            }
        }
        shear[e] = shear[e + 1] + force;
        moment[e] = moment[e + 1] + shear[e + 1] * (zb - za) + lever;
    }
    (0..n)
        .map(|i| {
            let b = model.outer_diameter_m[i];
            let c = cf.at(profile, z[i], b);
            let q = profile.peak_pressure_pa(z[i]);
            let w_section = Annulus::new(b, model.wall_m[i]).section_modulus_m3();
            AlongPoint {
                z_m: z[i],
                mean_speed_m_s: profile.mean_speed_m_s(z[i]),
                turbulence_intensity: profile.turbulence_intensity(z[i]),
                peak_pressure_pa: q,
                force_coefficient: c,
                line_load_n_m: cscd * c * q * b,
                shear_n: shear[i],
                moment_nm: moment[i],
                stress_pa: moment[i] / w_section,
            }
        })
        .collect()
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
