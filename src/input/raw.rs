//! The case file exactly as the user wrote it: serde structs that mirror the TOML contract in
//! the design notes key for key, with `deny_unknown_fields` everywhere so a misspelt key is
//! an error, never silently ignored.
//!
//! Units are those of the file (GPa, GN m/rad, MN/m, MPa where the key says so; m, kg, s
//! elsewhere). Optional keys stay `Option` here: defaults are applied in `validate`, so this
//! layer records only what is written. `decode` fills these structs from a parsed TOML table
//! and collects every unknown key and wrong type with its path.

use serde::Deserialize;

/// The whole case file.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawCase {
    pub title: Option<String>,
    pub shell: RawShell,
    #[serde(default)]
    pub lining: Vec<RawLining>,
    #[serde(default)]
    pub point_mass: Vec<RawPointMass>,
    #[serde(default)]
    pub opening: Vec<RawOpening>,
    pub base: Option<RawBase>,
    /// `None` = the default stages; `Some(vec![])` (an explicit empty array) is an error.
    pub stage: Option<Vec<RawStage>>,
    /// `None`: no `[wind]` (enough for `modes` and `scale`; the wind checks refuse it).
    pub wind: Option<RawWind>,
    /// `[along_wind]`: optional settings of the EN along-wind action.
    pub along_wind: Option<RawAlongWind>,
    #[serde(default)]
    pub vortex: RawVortex,
    #[serde(default)]
    pub criteria: RawCriteria,
    pub model: Option<RawModel>,
    pub remedy: Option<RawRemedy>,
    pub project: Option<RawProject>,
    /// `None`: no `[reinforcement]`; the resistance checks are skipped.
    pub reinforcement: Option<RawReinforcement>,
    /// `None`: recommended partial factors.
    pub design: Option<RawDesign>,
}

/// Top-level keys of the case file, in file order.
pub const CASE_KEYS: &[&str] = &[
    "title",
    "shell",
    "lining",
    "point_mass",
    "opening",
    "base",
    "stage",
    "wind",
    "along_wind",
    "vortex",
    "criteria",
    "model",
    "remedy",
    "project",
    "reinforcement",
    "design",
    "uncertain",
    "rank_correlation",
];

/// `[reinforcement]`: vertical bars of the shell (resistance issue).
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawReinforcement {
    /// f_yk, MPa.
    pub characteristic_strength_mpa: f64,
    /// E_s, GPa (default 200).
    pub elastic_modulus_gpa: Option<f64>,
    #[serde(default)]
    pub zone: Vec<RawReinforcementZone>,
}

/// `[[reinforcement.zone]]`: steel ratios and covers over a height range.
#[derive(Debug, Clone, Copy, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawReinforcementZone {
    pub from_z_m: f64,
    pub to_z_m: f64,
    pub outer_ratio: f64,
    pub inner_ratio: f64,
    pub outer_cover_m: f64,
    pub inner_cover_m: f64,
}

/// `[design]`: partial factors (absent keys take the recommended values).
#[derive(Debug, Clone, Copy, Default, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawDesign {
    pub gamma_c: Option<f64>,
    pub gamma_s: Option<f64>,
    pub alpha_cc: Option<f64>,
    pub gamma_g_sup: Option<f64>,
    pub gamma_g_inf: Option<f64>,
    pub gamma_q: Option<f64>,
    pub gamma_f_fat: Option<f64>,
    pub gamma_s_fat: Option<f64>,
}

/// `[project]`: title-block text of the design note.
#[derive(Debug, Clone, Default, PartialEq, Eq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawProject {
    pub job: Option<String>,
    pub revision: Option<String>,
    pub prepared_by: Option<String>,
    pub checked_by: Option<String>,
}

/// `[shell]`.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawShell {
    pub elastic_modulus_gpa: f64,
    pub density_kg_m3: f64,
    pub poisson_ratio: Option<f64>,
    pub beam: Option<RawBeam>,
    pub stations: Option<Vec<RawStation>>,
    pub stations_csv: Option<String>,
    /// Equivalent surface roughness k, mm (EN 1991-1-4 Table 7.13; along-wind only).
    pub surface_roughness_mm: Option<f64>,
    /// f_ck, MPa (needed by the resistance checks).
    pub characteristic_strength_mpa: Option<f64>,
    /// `[[shell.zone]]`: concrete zones.
    #[serde(default)]
    pub zone: Vec<RawZone>,
}

/// `[[shell.zone]]`: a height range with any of its own material values.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawZone {
    pub from_z_m: f64,
    pub to_z_m: f64,
    pub elastic_modulus_gpa: Option<f64>,
    pub density_kg_m3: Option<f64>,
    pub poisson_ratio: Option<f64>,
    pub characteristic_strength_mpa: Option<f64>,
}

/// `[[opening]]`: a flue or access opening.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawOpening {
    pub from_z_m: f64,
    pub to_z_m: f64,
    pub width_m: f64,
    pub azimuth_deg: Option<f64>,
    pub label: Option<String>,
}

/// `beam = "timoshenko" | "euler-bernoulli"`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum RawBeam {
    Timoshenko,
    EulerBernoulli,
}

/// One entry of `shell.stations` (or one row of the stations CSV).
#[derive(Debug, Clone, Copy, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawStation {
    pub z_m: f64,
    pub outer_diameter_m: f64,
    pub wall_m: f64,
}

/// `[[lining]]`: a zone and exactly one of three mass forms.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawLining {
    pub from_z_m: f64,
    pub to_z_m: f64,
    pub mass_per_length_kg_m: Option<f64>,
    pub mass_per_area_kg_m2: Option<f64>,
    pub thickness_m: Option<f64>,
    pub density_kg_m3: Option<f64>,
    pub gap_m: Option<f64>,
}

/// `[[point_mass]]`.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawPointMass {
    pub z_m: f64,
    pub mass_kg: f64,
    pub rotary_inertia_kg_m2: Option<f64>,
    pub label: Option<String>,
    /// Names of the stages the mass is present in; `None` = every stage.
    pub stages: Option<Vec<String>>,
}

/// `[base]`: absent component = rigid in that direction.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawBase {
    pub rotational_stiffness_gnm_per_rad: Option<f64>,
    pub lateral_stiffness_mn_per_m: Option<f64>,
    pub mass_kg: Option<f64>,
    pub rotary_inertia_kg_m2: Option<f64>,
}

/// `[[stage]]`.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawStage {
    pub name: String,
    pub lining: bool,
    pub stiffness_factor: Option<f64>,
    pub top_z_m: Option<f64>,
    pub duration_years: Option<f64>,
    pub return_period_years: Option<f64>,
    pub log_decrement: Option<f64>,
}

/// `profile = "power" | "log"`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum RawProfile {
    Power,
    Log,
}

/// `[wind]`.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawWind {
    pub reference_speed_m_s: f64,
    pub reference_height_m: Option<f64>,
    pub profile: Option<RawProfile>,
    pub exponent: Option<f64>,
    pub roughness_m: Option<f64>,
    pub z_min_m: Option<f64>,
    pub air_density_kg_m3: Option<f64>,
    pub kinematic_viscosity_m2_s: Option<f64>,
    pub c_prob_k: Option<f64>,
    pub c_prob_n: Option<f64>,
    /// EN 1991-1-4 site wind for the along-wind action: "0" | "I" | "II" | "III" | "IV".
    pub terrain_category: Option<RawTerrain>,
    /// v_b (before c_dir, c_season), m/s.
    pub basic_speed_m_s: Option<f64>,
    pub orography_factor: Option<f64>,
    pub c_dir: Option<f64>,
    pub c_season: Option<f64>,
}

/// `terrain_category = "0" | "I" | "II" | "III" | "IV"` (EN 1991-1-4 Table 4.1).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Deserialize)]
pub enum RawTerrain {
    #[serde(rename = "0")]
    Zero,
    I,
    II,
    III,
    IV,
}

/// `[along_wind]`.
#[derive(Debug, Clone, Default, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawAlongWind {
    pub force_coefficient: Option<f64>,
}

/// `method = "en1991-e1" | "en1991-e2" | "gb50009-h1"`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Deserialize)]
pub enum RawMethod {
    #[serde(rename = "en1991-e1")]
    En1991E1,
    #[serde(rename = "en1991-e2")]
    En1991E2,
    #[serde(rename = "gb50009-h1")]
    Gb50009H1,
}

/// `[vortex]`; every key has a default.
#[derive(Debug, Clone, PartialEq, Default, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawVortex {
    pub method: Option<RawMethod>,
    pub strouhal: Option<f64>,
    pub log_decrement: Option<f64>,
    pub damping_ratio: Option<f64>,
    /// Whole number; kept signed so that `modes = -1` is a range error, not a type error.
    pub modes: Option<i64>,
    pub design_life_years: Option<f64>,
    pub group: Option<RawGroup>,
}

/// `arrangement = "in-line"`.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Deserialize)]
#[serde(rename_all = "kebab-case")]
pub enum RawArrangement {
    InLine,
}

/// `[vortex.group]`.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawGroup {
    /// Whole number; signed so that a negative count is a range error.
    pub count: i64,
    pub spacing_m: f64,
    pub arrangement: Option<RawArrangement>,
}

/// `[criteria]`; all optional.
#[derive(Debug, Clone, PartialEq, Default, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawCriteria {
    pub tip_amplitude_m: Option<f64>,
    pub tip_amplitude_per_diameter: Option<f64>,
    pub stress_mpa: Option<f64>,
}

/// `[model]`: aeroelastic model planning.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawModel {
    pub length_scale: Option<f64>,
    pub elastic_modulus_gpa: f64,
    pub density_kg_m3: f64,
    pub poisson_ratio: Option<f64>,
    pub min_wall_m: Option<f64>,
    pub tunnel_width_m: Option<f64>,
    pub tunnel_height_m: Option<f64>,
    pub max_blockage: Option<f64>,
    pub tunnel_speed_min_m_s: Option<f64>,
    pub tunnel_speed_max_m_s: Option<f64>,
}

/// `[remedy]`: remedies to size and re-check.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawRemedy {
    pub tmd: Option<RawTmd>,
    pub strakes: Option<RawStrakes>,
}

/// `[remedy.tmd]`: exactly one of `mass_ratio` and `mass_kg`.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawTmd {
    /// Whole number; signed so that `mode = 0` or `-1` is a range error, not a type error.
    pub mode: i64,
    pub mass_ratio: Option<f64>,
    pub mass_kg: Option<f64>,
    pub stage: Option<String>,
}

/// `[remedy.strakes]`.
#[derive(Debug, Clone, PartialEq, Deserialize)]
#[serde(deny_unknown_fields)]
pub struct RawStrakes {
    pub from_z_m: f64,
    pub to_z_m: f64,
    pub c_lat_factor: f64,
    pub drag_coefficient: Option<f64>,
    pub stage: Option<String>,
}
