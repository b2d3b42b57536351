//! The scaled model as a case file of its own (TOML text), so that it can be run through
//! `stackwake modes` like any stack and checked against the prototype.
//!
//! Every prototype quantity is divided by its scale factor (see `factors`): heights and
//! diameters by k_l, walls by k_h, lining mass per area by k_l, lining mass per length by
//! k_l^2, a lining layer's thickness and gap by k_l (same lining density: its mass per
//! length then scales by k_l^2 up to the wall distortion), point masses by k_l^3, springs by
//! k_E k_h k_l^2 (rotation) and k_E k_h (lateral). The shell material is the model material.
//! The `[wind]` and `[vortex]` sections are at model scale so that the file passes the
//! case-file rules and its speeds mean tunnel speeds: reference speed / k_v, reference
//! height, roughness length and z_min / k_l, same air, same Strouhal number and log
//! decrement; a group spacing / k_l; amplitude criteria / k_l, stress criteria / k_E.
//!
//! Every scaled number is rounded to [`SIGNIFICANT_DIGITS`] significant digits before it is
//! written (`94.4`, not `94.39999999999999`): the prototype's own data rarely carry more
//! than four digits and a model maker works to far coarser tolerances (0.01 mm on a 1 mm
//! wall is 1 %), while six digits move a model frequency by at most ~1e-6 relative, far
//! below the 0.1 % the FE check of model against prototype reports. The file is the one
//! the FE check runs, so the check sees exactly what the user gets.

use serde::Serialize;

use crate::case::{BeamTheory, Case, LiningMass, ModelSpec, Profile};

use super::factors::{factor_text, ScaleFactors};
use super::SimilitudeError;

/// One station of the model shell, model units (m).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct ModelStation {
    pub z_m: f64,
    pub outer_diameter_m: f64,
    pub wall_m: f64,
    /// True when the wall is thinner than the model maker's minimum (`min_wall_m`).
    pub below_min_wall: bool,
}

/// The model case: its text and the numbers a report needs.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ModelCase {
    /// The case file (TOML).
    pub toml: String,
    pub stations: Vec<ModelStation>,
    /// Model lining masses per area, kg/m2 (one per prototype lining given per area).
    pub lining_mass_per_area_kg_m2: Vec<f64>,
    /// Model point masses, kg (label, mass).
    pub point_masses_kg: Vec<(String, f64)>,
    /// Thin-wall warnings.
    pub warnings: Vec<String>,
}

#[derive(Serialize)]
struct File {
    title: String,
    shell: FileShell,
    #[serde(skip_serializing_if = "Vec::is_empty")]
    lining: Vec<FileLining>,
    #[serde(skip_serializing_if = "Vec::is_empty")]
    point_mass: Vec<FilePointMass>,
    #[serde(skip_serializing_if = "Vec::is_empty")]
    opening: Vec<FileOpening>,
    #[serde(skip_serializing_if = "Option::is_none")]
    base: Option<FileBase>,
    stage: Vec<FileStage>,
    #[serde(skip_serializing_if = "Option::is_none")]
    wind: Option<FileWind>,
    vortex: FileVortex,
    #[serde(skip_serializing_if = "Option::is_none")]
    criteria: Option<FileCriteria>,
}

#[derive(Serialize)]
struct FileShell {
    elastic_modulus_gpa: f64,
    density_kg_m3: f64,
    poisson_ratio: f64,
    beam: &'static str,
    stations: Vec<FileStation>,
}

#[derive(Serialize)]
struct FileStation {
    z_m: f64,
    outer_diameter_m: f64,
    wall_m: f64,
}

#[derive(Serialize)]
struct FileLining {
    from_z_m: f64,
    to_z_m: f64,
    #[serde(skip_serializing_if = "Option::is_none")]
    mass_per_length_kg_m: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    mass_per_area_kg_m2: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    thickness_m: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    density_kg_m3: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    gap_m: Option<f64>,
}

#[derive(Serialize)]
struct FilePointMass {
    z_m: f64,
    mass_kg: f64,
    #[serde(skip_serializing_if = "is_zero")]
    rotary_inertia_kg_m2: f64,
    label: String,
    #[serde(skip_serializing_if = "Option::is_none")]
    stages: Option<Vec<String>>,
}

fn is_zero(v: &f64) -> bool {
    *v == 0.0
}

/// An opening, geometrically similar (every length / k_l).
#[derive(Serialize)]
struct FileOpening {
    from_z_m: f64,
    to_z_m: f64,
    width_m: f64,
    azimuth_deg: f64,
    label: String,
}

#[derive(Serialize)]
struct FileBase {
    #[serde(skip_serializing_if = "Option::is_none")]
    rotational_stiffness_gnm_per_rad: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    lateral_stiffness_mn_per_m: Option<f64>,
    #[serde(skip_serializing_if = "is_zero")]
    mass_kg: f64,
    #[serde(skip_serializing_if = "is_zero")]
    rotary_inertia_kg_m2: f64,
}

#[derive(Serialize)]
struct FileStage {
    name: String,
    lining: bool,
    stiffness_factor: f64,
    #[serde(skip_serializing_if = "Option::is_none")]
    top_z_m: Option<f64>,
    // Durations and return periods are not scaled (the model's speeds scale by the same
    // c_prob as the prototype's); the log decrement is identical in model and prototype.
    #[serde(skip_serializing_if = "Option::is_none")]
    duration_years: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    return_period_years: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    log_decrement: Option<f64>,
}

#[derive(Serialize)]
struct FileWind {
    reference_speed_m_s: f64,
    reference_height_m: f64,
    profile: &'static str,
    #[serde(skip_serializing_if = "Option::is_none")]
    exponent: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    roughness_m: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    z_min_m: Option<f64>,
    air_density_kg_m3: f64,
    kinematic_viscosity_m2_s: f64,
    c_prob_k: f64,
    c_prob_n: f64,
}

#[derive(Serialize)]
struct FileVortex {
    method: &'static str,
    #[serde(skip_serializing_if = "Option::is_none")]
    strouhal: Option<f64>,
    log_decrement: f64,
    #[serde(skip_serializing_if = "Option::is_none")]
    damping_ratio: Option<f64>,
    modes: i64,
    design_life_years: f64,
    #[serde(skip_serializing_if = "Option::is_none")]
    group: Option<FileGroup>,
}

#[derive(Serialize)]
struct FileGroup {
    count: i64,
    spacing_m: f64,
    arrangement: &'static str,
}

#[derive(Serialize)]
struct FileCriteria {
    #[serde(skip_serializing_if = "Option::is_none")]
    tip_amplitude_m: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    tip_amplitude_per_diameter: Option<f64>,
    #[serde(skip_serializing_if = "Option::is_none")]
    stress_mpa: Option<f64>,
}

/// Significant digits of the numbers in the model case file (see the module doc for why).
pub const SIGNIFICANT_DIGITS: usize = 6;

/// `v` rounded to `digits` significant decimal digits (the nearest f64 to the rounded
/// decimal, so it prints short). Non-finite values and zero are returned unchanged.
pub fn round_significant(v: f64, digits: usize) -> f64 {
    if !v.is_finite() || v == 0.0 || digits == 0 {
        return v;
    }
    // Formatting does the decimal rounding exactly (round-half-even on the exact binary
    // value); parsing returns the nearest f64 to that decimal.
    format!("{:.*e}", digits - 1, v).parse().unwrap_or(v)
}

/// Shorthand used for every scaled number written to the file.
fn r(v: f64) -> f64 {
    round_significant(v, SIGNIFICANT_DIGITS)
}

/// Text safe for a one-line TOML comment.
fn one_line(s: &str) -> String {
    s.chars()
        .map(|c| if c.is_control() { ' ' } else { c })
        .collect()
}

/// Builds the model case of `prototype` for the model material `spec` at scales `k`.
pub fn model_case(
    prototype: &Case,
    spec: &ModelSpec,
    k: &ScaleFactors,
) -> Result<ModelCase, SimilitudeError> {
    let mut warnings = Vec::new();
    let stations: Vec<ModelStation> = prototype
        .shell
        .stations
        .iter()
        .map(|s| {
            let wall_m = r(s.wall_m / k.wall_thickness);
            let below = spec.min_wall_m.is_some_and(|min| wall_m < min);
            ModelStation {
                z_m: r(s.z_m / k.length),
                outer_diameter_m: r(s.outer_diameter_m / k.length),
                wall_m,
                below_min_wall: below,
            }
        })
        .collect();
    for (i, s) in stations.iter().enumerate() {
        if s.below_min_wall {
            warnings.push(format!(
                "model station {i} (z = {:.4} m): wall {:.3} mm is thinner than model.min_wall_m = {:.3} mm",
                s.z_m,
                s.wall_m * 1e3,
                spec.min_wall_m.unwrap_or(0.0) * 1e3
            ));
        }
    }

    let mut per_area = Vec::new();
    let lining = prototype
        .linings
        .iter()
        .map(|l| {
            let mut f = FileLining {
                from_z_m: r(l.from_z_m / k.length),
                to_z_m: r(l.to_z_m / k.length),
                mass_per_length_kg_m: None,
                mass_per_area_kg_m2: None,
                thickness_m: None,
                density_kg_m3: None,
                gap_m: None,
            };
            match l.mass {
                LiningMass::PerLength {
                    mass_per_length_kg_m,
                } => f.mass_per_length_kg_m = Some(r(mass_per_length_kg_m / k.mass_per_length)),
                LiningMass::PerArea {
                    mass_per_area_kg_m2,
                } => {
                    let q = r(mass_per_area_kg_m2 / k.lining_mass_per_area);
                    per_area.push(q);
                    f.mass_per_area_kg_m2 = Some(q);
                }
                LiningMass::Layer {
                    thickness_m,
                    density_kg_m3,
                    gap_m,
                } => {
                    f.thickness_m = Some(r(thickness_m / k.length));
                    f.density_kg_m3 = Some(density_kg_m3);
                    f.gap_m = Some(r(gap_m / k.length));
                }
            }
            f
        })
        .collect();

    let point_masses_kg: Vec<(String, f64)> = prototype
        .point_masses
        .iter()
        .map(|p| (p.label.clone(), r(p.mass_kg / k.point_mass)))
        .collect();
    let point_mass = prototype
        .point_masses
        .iter()
        .zip(&point_masses_kg)
        .map(|(p, (label, kg))| FilePointMass {
            z_m: r(p.z_m / k.length),
            mass_kg: *kg,
            // J = m r^2: mass scale times length scale squared.
            rotary_inertia_kg_m2: r(p.rotary_inertia_kg_m2 / (k.point_mass * k.length * k.length)),
            label: label.clone(),
            stages: p.stages.clone(),
        })
        .collect();
    let opening = prototype
        .shell
        .openings
        .iter()
        .map(|o| FileOpening {
            from_z_m: r(o.from_z_m / k.length),
            to_z_m: r(o.to_z_m / k.length),
            width_m: r(o.width_m / k.length),
            azimuth_deg: o.azimuth_rad.to_degrees(),
            label: o.label.clone(),
        })
        .collect();
    if !prototype.shell.zones.is_empty() {
        warnings.push(
            "shell.zone: the model is made of one material, so the concrete zones' own E, \
             density and Poisson's ratio are not reproduced in the model case; compare the \
             model and prototype frequencies in scale_check.csv"
                .to_string(),
        );
    }

    let base = prototype.base.map(|b| FileBase {
        rotational_stiffness_gnm_per_rad: b
            .rotational_nm_per_rad
            .map(|v| r(v / k.rotational_stiffness / 1e9)),
        lateral_stiffness_mn_per_m: b.lateral_n_per_m.map(|v| r(v / k.lateral_stiffness / 1e6)),
        mass_kg: r(prototype.base_inertia.mass_kg / k.point_mass),
        rotary_inertia_kg_m2: r(
            prototype.base_inertia.rotary_inertia_kg_m2 / (k.point_mass * k.length * k.length)
        ),
    });

    let stage = prototype
        .stages
        .iter()
        .map(|s| FileStage {
            name: s.name.clone(),
            lining: s.lining,
            stiffness_factor: s.stiffness_factor,
            top_z_m: s.top_z_m.map(|z| r(z / k.length)),
            duration_years: s.duration_years,
            return_period_years: s.return_period_years,
            log_decrement: s.log_decrement,
        })
        .collect();

    // A prototype without [wind] gives a model case without it (modal check only).
    let wind = prototype.wind.as_ref().map(|w| {
        let (profile, exponent, roughness_m, z_min_m) = match w.profile {
            Profile::Power { exponent } => ("power", Some(exponent), None, None),
            Profile::Log {
                roughness_m,
                z_min_m,
            } => (
                "log",
                None,
                Some(r(roughness_m / k.length)),
                Some(r(z_min_m / k.length)),
            ),
        };
        FileWind {
            reference_speed_m_s: r(w.reference_speed_m_s / k.velocity),
            reference_height_m: r(w.reference_height_m / k.length),
            profile,
            exponent,
            roughness_m,
            z_min_m,
            air_density_kg_m3: w.air_density_kg_m3,
            kinematic_viscosity_m2_s: w.kinematic_viscosity_m2_s,
            c_prob_k: w.c_prob_k,
            c_prob_n: w.c_prob_n,
        }
    });
    let v = &prototype.vortex;
    let vortex = FileVortex {
        method: v.method.key(),
        strouhal: v.strouhal,
        log_decrement: v.log_decrement,
        damping_ratio: v.damping_ratio,
        modes: v.modes as i64,
        design_life_years: v.design_life_years,
        group: v.group.map(|g| FileGroup {
            count: i64::from(g.count),
            spacing_m: r(g.spacing_m / k.length),
            arrangement: "in-line",
        }),
    };
    let c = &prototype.criteria;
    let criteria = (!c.is_empty()).then(|| FileCriteria {
        tip_amplitude_m: c.tip_amplitude_m.map(|a| r(a / k.displacement)),
        tip_amplitude_per_diameter: c.tip_amplitude_per_diameter,
        stress_mpa: c.stress_pa.map(|s| r(s / k.stress / 1e6)),
    });

    let file = File {
        title: format!(
            "Model 1:{} of: {} (generated by stackwake scale)",
            factor_text(k.length),
            prototype.title
        ),
        shell: FileShell {
            elastic_modulus_gpa: r(spec.elastic_modulus_pa / 1e9),
            density_kg_m3: spec.density_kg_m3,
            poisson_ratio: spec.poisson_ratio,
            beam: match prototype.shell.beam {
                BeamTheory::Timoshenko => "timoshenko",
                BeamTheory::EulerBernoulli => "euler-bernoulli",
            },
            stations: stations
                .iter()
                .map(|s| FileStation {
                    z_m: s.z_m,
                    outer_diameter_m: s.outer_diameter_m,
                    wall_m: s.wall_m,
                })
                .collect(),
        },
        lining,
        point_mass,
        opening,
        base,
        stage,
        wind,
        vortex,
        criteria,
    };
    let header = format!(
        "# Aeroelastic wind-tunnel model generated by `stackwake scale` from the prototype case\n\
         # \"{}\".\n\
         # Whatever that case is (invented or real), this file describes its scaled model.\n\
         # Scales, prototype / model: length k_l = {}, wall k_h = {}, velocity k_v = {},\n\
         # frequency k_f = {}, density k_rho = {}, modulus k_E = {}.\n\
         # [wind] and [vortex] are at model scale: speeds are tunnel speeds (prototype / k_v),\n\
         # heights and roughness lengths are prototype / k_l; same air, same Strouhal number and\n\
         # log decrement.\n\n",
        one_line(&prototype.title),
        factor_text(k.length),
        factor_text(k.wall_thickness),
        factor_text(k.velocity),
        factor_text(k.frequency),
        factor_text(k.density),
        factor_text(k.elastic_modulus)
    );
    let body = toml::to_string(&file).map_err(|e| SimilitudeError::ModelCaseText {
        message: e.to_string(),
    })?;
    Ok(ModelCase {
        toml: header + &body,
        stations,
        lining_mass_per_area_kg_m2: per_area,
        point_masses_kg,
        warnings,
    })
}
