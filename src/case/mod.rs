//! The validated model of one stack: every quantity in SI units (m, kg, N, Pa, s), every
//! cross-field rule already checked by `input::validate`.
//!
//! The engineering core (`section`, `fem`, `modal`, `wind`, ...) only ever sees these types,
//! never the raw case file, so it can rely on the invariants documented on each field.

use serde::Serialize;

mod resistance;
pub use resistance::{DesignFactors, ReinforcementZone, ResistanceSpec};

/// One stack design: shell, non-structural masses, foundation, stages, site wind and the
/// vortex-shedding check settings.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Case {
    /// Free text from the case file.
    pub title: String,
    pub shell: Shell,
    /// Lining zones; mass only, never stiffness.
    pub linings: Vec<Lining>,
    /// Platforms, caps, equipment; each in every stage or in the stages it names.
    pub point_masses: Vec<PointMass>,
    /// Foundation springs; `None` = fixed base.
    pub base: Option<BaseSprings>,
    /// Foundation mass and rotary inertia, moving with the springs (zero = none; a component
    /// on a rigid base direction is ignored, and the reader warns).
    pub base_inertia: BaseInertia,
    /// At least one stage.
    pub stages: Vec<Stage>,
    /// Site wind; `None` when the case file has no `[wind]` (modal commands only: the
    /// commands that run wind checks refuse such a case).
    pub wind: Option<Wind>,
    /// EN 1991-1-4 site wind and along-wind settings; `None` when `[wind]` gives no
    /// `terrain_category` (no along-wind action is computed then).
    pub along_wind: Option<AlongWindSpec>,
    pub vortex: Vortex,
    pub criteria: Criteria,
    /// Aeroelastic model planning inputs (`[model]`), if given.
    pub model: Option<ModelSpec>,
    /// Remedies to size and re-check (`[remedy]`), if given.
    pub remedy: Option<RemedySpec>,
    /// Title-block keys of the design note (`[project]`); every key optional.
    pub project: Project,
    /// RC shell resistance inputs (`[reinforcement]`, `[shell] characteristic_strength_mpa`,
    /// `[design]`); `None` without `[reinforcement]` (the resistance checks are skipped).
    pub resistance: Option<ResistanceSpec>,
    /// Which file the case was read from and its SHA-256, set by the reader
    /// (`input::load_case`, `input::demo_case`); `None` for a case built in code.
    pub source: Option<CaseSource>,
}

/// `[project]`: free text for the design note's title block (trimmed; empty = absent).
#[derive(Debug, Clone, Default, PartialEq, Eq, Serialize)]
pub struct Project {
    pub job: Option<String>,
    pub revision: Option<String>,
    pub prepared_by: Option<String>,
    pub checked_by: Option<String>,
}

/// The identity of the case file a result was computed from.
#[derive(Debug, Clone, PartialEq, Eq, Serialize)]
pub struct CaseSource {
    /// The file name as given (the built-in demo: `data/demo.toml`).
    pub file_name: String,
    /// SHA-256 of the exact bytes read (the demo: of the text embedded in the binary),
    /// 64 lower-case hex digits.
    pub sha256_hex: String,
    /// True for the built-in demo case (no file was read).
    pub built_in_demo: bool,
}

impl CaseSource {
    /// The identity of `bytes` read from `file_name`.
    pub fn of_bytes(file_name: &str, bytes: &[u8], built_in_demo: bool) -> Self {
        use sha2::{Digest, Sha256};
        let digest = Sha256::digest(bytes);
        let sha256_hex = digest.iter().map(|b| format!("{b:02x}")).collect();
        CaseSource {
            file_name: file_name.to_string(),
            sha256_hex,
            built_in_demo,
        }
    }
}

/// Beam theory of the shell elements.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub enum BeamTheory {
    /// Bending + shear deformation (Cowper's coefficient) + rotary inertia.
    Timoshenko,
    /// Bending only.
    EulerBernoulli,
}

/// The reinforced-concrete shell.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Shell {
    /// Young's modulus, Pa (> 0).
    pub elastic_modulus_pa: f64,
    /// Concrete density, kg/m3 (> 0).
    pub density_kg_m3: f64,
    /// Poisson's ratio, 0 <= nu < 0.5.
    pub poisson_ratio: f64,
    pub beam: BeamTheory,
    /// At least two stations; `z_m` increasing from 0; 0 < 2 wall < outer diameter. Two
    /// consecutive stations at the same height are a wall step (the first holds below, the
    /// second above); never three at one height, never a step at the base or the top.
    pub stations: Vec<Station>,
    /// Concrete zones with their own material values (no overlap, inside the shell).
    pub zones: Vec<ConcreteZone>,
    /// Flue and access openings (none overlapping at one height, together at most half the
    /// circumference, each narrower than the shell).
    pub openings: Vec<Opening>,
}

/// The concrete of one part of the shell (`[[shell.zone]]`); `None` = the `[shell]` value.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct ConcreteZone {
    /// Zone limits, m (0 <= from < to <= shell height).
    pub from_z_m: f64,
    pub to_z_m: f64,
    /// Pa.
    pub elastic_modulus_pa: Option<f64>,
    /// kg/m3.
    pub density_kg_m3: Option<f64>,
    pub poisson_ratio: Option<f64>,
    /// f_ck, Pa: stored for the reinforced-concrete resistance; not used by the beam model.
    pub characteristic_strength_pa: Option<f64>,
}

/// The material of the shell at one height.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Material {
    pub elastic_modulus_pa: f64,
    pub density_kg_m3: f64,
    pub poisson_ratio: f64,
}

impl Material {
    /// Shear modulus G = E / (2 (1 + nu)), Pa.
    pub fn shear_modulus_pa(&self) -> f64 {
        self.elastic_modulus_pa / (2.0 * (1.0 + self.poisson_ratio))
    }
}

/// A flue or access opening (`[[opening]]`): removes the annular sector of half-angle
/// asin(width / D) at every height from `from_z_m` to `to_z_m`.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Opening {
    /// Limits, m (0 <= from < to <= shell height).
    pub from_z_m: f64,
    pub to_z_m: f64,
    /// Clear width across the opening at the outer face, m.
    pub width_m: f64,
    /// Azimuth of the opening's centre line, rad.
    pub azimuth_rad: f64,
    pub label: String,
}

/// Foundation mass and rotary inertia (`[base] mass_kg`, `rotary_inertia_kg_m2`).
#[derive(Debug, Clone, Copy, Default, PartialEq, Serialize)]
pub struct BaseInertia {
    /// kg, on the lateral base dof (>= 0).
    pub mass_kg: f64,
    /// kg m2 about the base, on the rotational base dof (>= 0).
    pub rotary_inertia_kg_m2: f64,
}

impl Shell {
    /// Shear modulus G = E / (2 (1 + nu)), Pa.
    pub fn shear_modulus_pa(&self) -> f64 {
        self.elastic_modulus_pa / (2.0 * (1.0 + self.poisson_ratio))
    }

    /// Height of the complete shell, m.
    pub fn height_m(&self) -> f64 {
        self.stations.last().map(|s| s.z_m).unwrap_or(0.0)
    }

    /// The material at height `z_m`: the first zone that holds it, else the `[shell]` values.
    /// The mesh has nodes at zone limits, so callers ask at an element's midpoint.
    pub fn material_at(&self, z_m: f64) -> Material {
        let mut m = Material {
            elastic_modulus_pa: self.elastic_modulus_pa,
            density_kg_m3: self.density_kg_m3,
            poisson_ratio: self.poisson_ratio,
        };
        if let Some(z) = self
            .zones
            .iter()
            .find(|z| z.from_z_m <= z_m && z_m <= z.to_z_m)
        {
            m.elastic_modulus_pa = z.elastic_modulus_pa.unwrap_or(m.elastic_modulus_pa);
            m.density_kg_m3 = z.density_kg_m3.unwrap_or(m.density_kg_m3);
            m.poisson_ratio = z.poisson_ratio.unwrap_or(m.poisson_ratio);
        }
        m
    }

    /// The openings that cut the wall at height `z_m` (limits included).
    pub fn openings_at(&self, z_m: f64) -> impl Iterator<Item = &Opening> {
        self.openings
            .iter()
            .filter(move |o| o.from_z_m <= z_m && z_m <= o.to_z_m)
    }

    /// Outer diameter and wall thickness just above `z_m`: at a wall step the upper station,
    /// elsewhere the same as [`Shell::geometry_at`], m.
    pub fn geometry_above(&self, z_m: f64) -> (f64, f64) {
        let st = &self.stations;
        // The first station strictly above z; the one before it holds at and just above z.
        let i = st.partition_point(|s| s.z_m <= z_m);
        if i == 0 {
            return (st[0].outer_diameter_m, st[0].wall_m);
        }
        let a = st[i - 1];
        if a.z_m == z_m || i == st.len() {
            return (a.outer_diameter_m, a.wall_m);
        }
        self.geometry_at(z_m)
    }

    /// Outer diameter and wall thickness at height `z_m` (linear between stations, clamped to
    /// the ends; at a wall step the lower station, the value just below), m.
    pub fn geometry_at(&self, z_m: f64) -> (f64, f64) {
        let st = &self.stations;
        if z_m <= st[0].z_m {
            return (st[0].outer_diameter_m, st[0].wall_m);
        }
        // The first station at or above z (station tables can be long: binary search).
        let i = st.partition_point(|s| s.z_m < z_m);
        if i == st.len() {
            let last = st[st.len() - 1];
            return (last.outer_diameter_m, last.wall_m);
        }
        let (a, b) = (st[i - 1], st[i]);
        let t = (z_m - a.z_m) / (b.z_m - a.z_m);
        (
            a.outer_diameter_m + t * (b.outer_diameter_m - a.outer_diameter_m),
            a.wall_m + t * (b.wall_m - a.wall_m),
        )
    }
}

/// A shell station; diameter and wall vary linearly between stations.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Station {
    pub z_m: f64,
    pub outer_diameter_m: f64,
    pub wall_m: f64,
}

/// How a lining zone's mass is given.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub enum LiningMass {
    /// kg per metre of height.
    PerLength { mass_per_length_kg_m: f64 },
    /// kg per m2 of the shell's inner face: m = value * pi * (D - 2 t).
    PerArea { mass_per_area_kg_m2: f64 },
    /// A layer: m = rho * pi * (D - 2 t - 2 gap - t_l) * t_l.
    Layer {
        thickness_m: f64,
        density_kg_m3: f64,
        gap_m: f64,
    },
}

/// A lining zone between two heights (inside the shell, from < to).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Lining {
    pub from_z_m: f64,
    pub to_z_m: f64,
    pub mass: LiningMass,
}

impl Lining {
    /// Lining mass per metre of height at a section with outer diameter `d_m` and wall `t_m`,
    /// kg/m. Zero outside `[from_z_m, to_z_m]` is the caller's business.
    pub fn mass_per_length_kg_m(&self, d_m: f64, t_m: f64) -> f64 {
        match self.mass {
            LiningMass::PerLength {
                mass_per_length_kg_m,
            } => mass_per_length_kg_m,
            LiningMass::PerArea {
                mass_per_area_kg_m2,
            } => mass_per_area_kg_m2 * std::f64::consts::PI * (d_m - 2.0 * t_m),
            LiningMass::Layer {
                thickness_m,
                density_kg_m3,
                gap_m,
            } => {
                density_kg_m3
                    * std::f64::consts::PI
                    * (d_m - 2.0 * t_m - 2.0 * gap_m - thickness_m)
                    * thickness_m
            }
        }
    }
}

/// A concentrated mass with an optional rotary inertia.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct PointMass {
    pub z_m: f64,
    pub mass_kg: f64,
    /// About a horizontal axis through the mass, kg m2 (>= 0; 0 = translational only).
    pub rotary_inertia_kg_m2: f64,
    pub label: String,
    /// Names of the stages the mass is present in (a climbing formwork rig, a crane);
    /// `None` = every stage. Each name is a stage of the case, and the mass lies at or below
    /// the top of each stage it is present in.
    pub stages: Option<Vec<String>>,
}

impl PointMass {
    /// Whether the mass is present in the stage named `stage`.
    pub fn is_in_stage(&self, stage: &str) -> bool {
        self.stages
            .as_ref()
            .is_none_or(|names| names.iter().any(|n| n == stage))
    }
}

/// Foundation springs at z = 0. `None` in a component = rigid in that direction.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct BaseSprings {
    /// N m / rad.
    pub rotational_nm_per_rad: Option<f64>,
    /// N / m.
    pub lateral_n_per_m: Option<f64>,
}

/// A construction stage (or the finished state).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Stage {
    pub name: String,
    /// Whether the lining zones are installed.
    pub lining: bool,
    /// Multiplier on E and G (cracked section), > 0.
    pub stiffness_factor: f64,
    /// Shell built only up to this height, m (inside (0, H]); `None` = complete.
    pub top_z_m: Option<f64>,
    /// How long the stage lasts, years (> 0); `None` = in service, judged over
    /// `vortex.design_life_years`.
    pub duration_years: Option<f64>,
    /// Return period of the stage's design wind, years (> 1); `None` = the default of
    /// `wind::probability::stage_return_period_years` (50 years in service, EN 1991-1-6
    /// Table 3.1 from the duration).
    pub return_period_years: Option<f64>,
    /// Structural log decrement of the stage (0 < delta < 1); `None` = `vortex.log_decrement`.
    pub log_decrement: Option<f64>,
}

impl Stage {
    /// A complete stage of the given name and lining, stiffness factor 1, in service, with
    /// the case's wind and damping.
    pub fn in_service(name: &str, lining: bool) -> Self {
        Stage {
            name: name.to_string(),
            lining,
            stiffness_factor: 1.0,
            top_z_m: None,
            duration_years: None,
            return_period_years: None,
            log_decrement: None,
        }
    }

    /// Height of the shell in this stage, m.
    pub fn height_m(&self, shell: &Shell) -> f64 {
        self.top_z_m.unwrap_or_else(|| shell.height_m())
    }

    /// Years over which the stage is judged (fatigue cycles): its duration, or the design life
    /// for an in-service stage.
    pub fn judged_years(&self, design_life_years: f64) -> f64 {
        self.duration_years.unwrap_or(design_life_years)
    }

    /// Structural log decrement of the stage: its own, or the case's `vortex.log_decrement`.
    pub fn log_decrement(&self, vortex: &Vortex) -> f64 {
        self.log_decrement.unwrap_or(vortex.log_decrement)
    }
}

/// Mean wind profile shape.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub enum Profile {
    /// v(z) = v_ref (z / z_ref)^exponent.
    Power { exponent: f64 },
    /// EN 1991-1-4 4.3 logarithmic law, c_r(z) = k_r ln(max(z, z_min) / z0), scaled so that
    /// v(z_ref) = v_ref.
    Log { roughness_m: f64, z_min_m: f64 },
}

/// Site wind.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Wind {
    /// Mean (10-min) wind speed at `reference_height_m`, m/s.
    pub reference_speed_m_s: f64,
    pub reference_height_m: f64,
    pub profile: Profile,
    pub air_density_kg_m3: f64,
    pub kinematic_viscosity_m2_s: f64,
    /// Shape parameter K of the probability factor, EN 1991-1-4 (4.2) (0.2 recommended).
    pub c_prob_k: f64,
    /// Exponent n of the probability factor, EN 1991-1-4 (4.2) (0.5 recommended).
    pub c_prob_n: f64,
}

impl Wind {
    /// This wind with every mean speed scaled by `factor` (the profile is linear in the
    /// reference speed, so scaling it scales every height alike).
    pub fn scaled(&self, factor: f64) -> Wind {
        Wind {
            reference_speed_m_s: self.reference_speed_m_s * factor,
            ..*self
        }
    }
}

/// Terrain category of EN 1991-1-4 Table 4.1 (its table values: `along::terrain`).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub enum TerrainCategory {
    Zero,
    I,
    II,
    III,
    IV,
}

/// EN 1991-1-4 site wind (`[wind]` EN keys), shell roughness and `[along_wind]` settings.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct AlongWindSpec {
    pub terrain: TerrainCategory,
    /// `basic_speed_m_s`, m/s (> 0); v_b = c_dir c_season basic_speed_m_s (4.1).
    pub basic_speed_m_s: f64,
    /// c_dir (default 1, EN 1991-1-4 4.2 Note 2 recommended value).
    pub c_dir: f64,
    /// c_season (default 1, EN 1991-1-4 4.2 Note 3 recommended value).
    pub c_season: f64,
    /// c_o, constant with height (default 1).
    pub orography_factor: f64,
    /// Equivalent surface roughness k of the shell, m (> 0).
    pub surface_roughness_m: f64,
    /// User override of c_f; `None` = EN 1991-1-4 7.9.2.
    pub force_coefficient: Option<f64>,
}

/// Vortex-shedding method that governs the verdict (the others are reported alongside).
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub enum VortexMethod {
    /// EN 1991-1-4 Annex E approach 1 (E.1.5.2).
    En1991E1,
    /// EN 1991-1-4 Annex E approach 2 (E.1.5.3).
    En1991E2,
    /// GB 50009-2012 Appendix H.1.
    Gb50009H1,
}

impl VortexMethod {
    /// The case-file spelling.
    pub fn key(self) -> &'static str {
        match self {
            VortexMethod::En1991E1 => "en1991-e1",
            VortexMethod::En1991E2 => "en1991-e2",
            VortexMethod::Gb50009H1 => "gb50009-h1",
        }
    }
}

/// Arrangement of a group of identical stacks.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub enum Arrangement {
    InLine,
}

/// Neighbouring identical stacks.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Group {
    /// Number of stacks in the group (>= 2).
    pub count: u32,
    /// Centre-to-centre spacing, m (> 0).
    pub spacing_m: f64,
    pub arrangement: Arrangement,
}

/// Vortex-shedding check settings.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Vortex {
    pub method: VortexMethod,
    /// User override of the Strouhal number; `None` = method default.
    pub strouhal: Option<f64>,
    /// Structural logarithmic decrement delta_s (used in the Scruton number).
    pub log_decrement: f64,
    /// Critical damping ratio for GB 50009 App. H; `None` = 0.05, GB 50009-2012 H.1.1's
    /// first-mode value for concrete structures.
    pub damping_ratio: Option<f64>,
    /// How many modes to check (>= 1).
    pub modes: usize,
    pub design_life_years: f64,
    pub group: Option<Group>,
}

/// User acceptance criteria; all optional.
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize)]
pub struct Criteria {
    /// Peak across-wind tip amplitude limit, m.
    pub tip_amplitude_m: Option<f64>,
    /// Peak across-wind tip amplitude limit as a fraction of the top diameter.
    pub tip_amplitude_per_diameter: Option<f64>,
    /// Extreme-fibre stress limit, Pa.
    pub stress_pa: Option<f64>,
}

impl Criteria {
    /// True when no criterion is set.
    pub fn is_empty(&self) -> bool {
        self.tip_amplitude_m.is_none()
            && self.tip_amplitude_per_diameter.is_none()
            && self.stress_pa.is_none()
    }
}

/// Aeroelastic model planning inputs (`[model]`).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct ModelSpec {
    /// k_l = prototype / model length; `None` = propose from the tunnel size.
    pub length_scale: Option<f64>,
    /// Model material Young's modulus, Pa.
    pub elastic_modulus_pa: f64,
    /// Model material density, kg/m3.
    pub density_kg_m3: f64,
    /// Model material Poisson's ratio.
    pub poisson_ratio: f64,
    /// Thinnest wall the model maker can produce, m.
    pub min_wall_m: Option<f64>,
    /// Tunnel test-section width and height, m.
    pub tunnel_width_m: Option<f64>,
    pub tunnel_height_m: Option<f64>,
    /// Largest model frontal area / test-section area.
    pub max_blockage: f64,
    /// Usable tunnel speed range, m/s.
    pub tunnel_speed_min_m_s: Option<f64>,
    pub tunnel_speed_max_m_s: Option<f64>,
}

/// Remedies to size and re-check (`[remedy]`).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RemedySpec {
    pub tmd: Option<TmdSpec>,
    pub strakes: Option<StrakesSpec>,
}

/// How the tuned mass damper's mass is given.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub enum TmdMass {
    /// mu = m_tmd / M_modal, the modal mass with the shape normalised to 1 at the damper.
    Ratio(f64),
    /// Damper mass, kg (mu follows per stage from the modal mass).
    Kg(f64),
}

/// A tuned mass damper on one mode (`[remedy.tmd]`).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct TmdSpec {
    /// 1-based mode number (<= `vortex.modes`).
    pub mode: usize,
    pub mass: TmdMass,
    /// Stage name; `None` = every stage.
    pub stage: Option<String>,
}

/// Helical strakes over a height range (`[remedy.strakes]`).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct StrakesSpec {
    /// Straked range, m (0 <= from < to <= shell height).
    pub from_z_m: f64,
    pub to_z_m: f64,
    /// User factor on c_lat over the straked range (EN 1991-1-4 gives none), 0..=1.
    pub c_lat_factor: f64,
    /// Along-wind force coefficient of the straked part, reported for the along-wind design.
    pub drag_coefficient: f64,
    /// Stage name; `None` = every stage.
    pub stage: Option<String>,
}
