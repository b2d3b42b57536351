//! Raw case file -> validated [`Case`] in SI units (GPa -> Pa, GN m/rad -> N m/rad,
//! MN/m -> N/m, MPa -> Pa), with the documented defaults applied.
//!
//! Every rule is checked and every problem collected (the user fixes a file in one pass, not
//! one error per run). Besides hard rules (finite, positive, ordered, inside the shell) there
//! are plausibility rules that catch wrong units, the commonest case-file mistake: E far from
//! the GPa range, densities outside 500-10000 kg/m3, diameters in mm.
//!
//! Defaults and their sources: structural log decrement 0.03 for RC chimneys (EN 1991-1-4
//! Table F.2, from memory); z_min of the log profile from the terrain category whose z0 is
//! nearest in log scale (EN 1991-1-4 Table 4.1: z0 = 0.003/0.01/0.05/0.3/1.0 m ->
//! z_min = 1/1/2/5/10 m); air 1.25 kg/m3 and 1.5e-5 m2/s (EN 1991-1-4); power-law exponent
//! 0.16 (DIN EN 1991-1-4/NA Table NA.B.2, category II); Poisson's ratio 0.2 for concrete
//! (common practice).

use std::collections::HashSet;

use crate::case::{
    AlongWindSpec, Arrangement, BaseSprings, BeamTheory, Case, Criteria, Group, Lining, LiningMass,
    ModelSpec, PointMass, Profile, RemedySpec, Shell, Stage, Station, StrakesSpec, TerrainCategory,
    TmdMass, TmdSpec, Vortex, VortexMethod, Wind,
};

use super::issue::ValidationIssue;
use super::raw::{
    RawArrangement, RawBeam, RawCase, RawLining, RawMethod, RawModel, RawProfile, RawRemedy,
    RawStation, RawTerrain, RawVortex, RawWind,
};
use super::stations_csv::CsvStations;

mod along_wind;
mod base;
mod design;
mod lining;
mod model;
mod opening;
mod reinforcement;
mod remedy;
mod shell;
mod stage;
#[cfg(test)]
mod tests;

/// The issue texts of a case file's validation (empty when it is valid), for the rule
/// modules' unit tests.
#[cfg(test)]
pub(crate) fn case_errors(text: &str) -> Vec<String> {
    match crate::input::parse_case(text, std::path::Path::new("."), "t.toml") {
        Ok(_) => vec![],
        Err(crate::input::InputError::Invalid { issues, .. }) => {
            issues.iter().map(|i| i.to_string()).collect()
        }
        Err(e) => vec![e.to_string()],
    }
}
mod vortex;
mod wind;
mod zone;

use along_wind::check_along_wind;
use design::check_design;
use lining::check_lining;
use model::check_model;
use reinforcement::check_resistance;
pub use reinforcement::{CONCRETE_STRENGTH_MPA, MAX_RATIO, STEEL_STRENGTH_MPA};
use remedy::check_remedy;
use shell::check_shell;
pub use stage::default_stages;
use stage::{check_point_mass_stages, check_stage_c_prob, check_stages};
use vortex::check_vortex;
use wind::check_wind;

/// Default Poisson's ratio of the shell concrete (common practice).
pub const DEFAULT_POISSON_RATIO: f64 = 0.2;
/// Default reference height of the wind speed, m (EN 1991-1-4 basic wind at 10 m).
pub const DEFAULT_REFERENCE_HEIGHT_M: f64 = 10.0;
/// Default power-law exponent (DIN EN 1991-1-4/NA Table NA.B.2, category II).
pub const DEFAULT_EXPONENT: f64 = 0.16;
/// Air density, kg/m3 (EN 1991-1-4 4.5).
pub const DEFAULT_AIR_DENSITY_KG_M3: f64 = 1.25;
/// Kinematic viscosity of air, m2/s (EN 1991-1-4 Annex E).
pub const DEFAULT_KINEMATIC_VISCOSITY_M2_S: f64 = 1.5e-5;
/// Structural log decrement of RC chimneys (EN 1991-1-4 Table F.2, from memory).
pub const DEFAULT_LOG_DECREMENT: f64 = 0.03;
/// Modes checked by default (modes 1-3 are the ones that usually matter, common practice).
pub const DEFAULT_MODES: usize = 3;
/// Largest number of modes a case may ask for.
pub const MAX_MODES: i64 = 20;
/// Default design life, years.
pub const DEFAULT_DESIGN_LIFE_YEARS: f64 = 50.0;
/// Default model Poisson's ratio (typical of model plastics, common practice).
pub const DEFAULT_MODEL_POISSON_RATIO: f64 = 0.35;
/// Default largest blockage ratio of a wind-tunnel model (common practice).
pub const DEFAULT_MAX_BLOCKAGE: f64 = 0.05;
/// Largest TMD mass ratio accepted: Den Hartog's tuning is a small-mu result and practical
/// dampers on stacks stay below ~0.1 (common practice).
pub const MAX_TMD_MASS_RATIO: f64 = 0.3;
/// Default along-wind force coefficient of a straked section (EN 1991-1-4, from memory).
pub const DEFAULT_STRAKES_DRAG_COEFFICIENT: f64 = 1.4;
/// A wall of more than half the diameter whose value lies in this range reads as mm (50 mm
/// to 2 m: RC chimney shells are 0.15-1.0 m, common practice), so it gets a unit hint.
pub const WALL_MM_HINT_M: (f64, f64) = (50.0, 2000.0);
/// Title when the case file gives none.
pub const DEFAULT_TITLE: &str = "untitled case";

/// EN 1991-1-4 Table 4.1: terrain roughness length z0 and minimum height z_min, m.
const TERRAIN_Z0_ZMIN_M: [(f64, f64); 5] = [
    (0.003, 1.0),
    (0.01, 1.0),
    (0.05, 2.0),
    (0.3, 5.0),
    (1.0, 10.0),
];

/// z_min of the terrain category whose z0 is nearest to `roughness_m` in log scale.
pub fn default_z_min_m(roughness_m: f64) -> f64 {
    let target = roughness_m.ln();
    TERRAIN_Z0_ZMIN_M
        .iter()
        .min_by(|a, b| {
            let da = (a.0.ln() - target).abs();
            let db = (b.0.ln() - target).abs();
            da.total_cmp(&db)
        })
        .map(|&(_, z_min)| z_min)
        .unwrap_or(1.0)
}

/// A number as the user wrote it (TOML spelling for the non-finite ones).
pub fn num(v: f64) -> String {
    if v.is_nan() {
        "nan".into()
    } else if v.is_infinite() {
        if v > 0.0 { "inf" } else { "-inf" }.into()
    } else {
        format!("{v}")
    }
}

/// Collects issues; each check returns whether the value passed.
#[derive(Default)]
struct Checker {
    issues: Vec<ValidationIssue>,
}

impl Checker {
    fn fail(&mut self, path: impl Into<String>, v: f64, rule: impl Into<String>) -> bool {
        self.issues.push(ValidationIssue::new(path, num(v), rule));
        false
    }

    fn key(&mut self, path: impl Into<String>, rule: impl Into<String>) {
        self.issues.push(ValidationIssue::key(path, rule));
    }

    fn finite(&mut self, path: &str, v: f64) -> bool {
        v.is_finite() || self.fail(path, v, "must be a finite number")
    }

    fn positive(&mut self, path: &str, v: f64) -> bool {
        self.finite(path, v) && (v > 0.0 || self.fail(path, v, "must be > 0"))
    }

    fn non_negative(&mut self, path: &str, v: f64) -> bool {
        self.finite(path, v) && (v >= 0.0 || self.fail(path, v, "must be >= 0"))
    }

    /// lo < v < hi.
    fn open(&mut self, path: &str, v: f64, lo: f64, hi: f64) -> bool {
        self.finite(path, v)
            && ((v > lo && v < hi)
                || self.fail(
                    path,
                    v,
                    format!("must be between {lo} and {hi} (exclusive)"),
                ))
    }

    fn optional_positive(&mut self, path: &str, v: Option<f64>) -> Option<f64> {
        v.filter(|&x| self.positive(path, x))
    }

    /// A height range `{prefix}.from_z_m` .. `{prefix}.to_z_m`: both finite, inside the
    /// shell (when its height is known) and from < to. Returns whether both ends are finite
    /// and ordered.
    fn height_range(
        &mut self,
        prefix: &str,
        from_z_m: f64,
        to_z_m: f64,
        height_m: Option<f64>,
    ) -> bool {
        let from_path = format!("{prefix}.from_z_m");
        let to_path = format!("{prefix}.to_z_m");
        let from_ok = self.finite(&from_path, from_z_m);
        let to_ok = self.finite(&to_path, to_z_m);
        if from_ok {
            within_shell(self, &from_path, from_z_m, height_m);
        }
        if to_ok {
            within_shell(self, &to_path, to_z_m, height_m);
        }
        if from_ok && to_ok && from_z_m >= to_z_m {
            return self.fail(
                &to_path,
                to_z_m,
                format!("must be above from_z_m ({} m)", num(from_z_m)),
            );
        }
        from_ok && to_ok
    }

    fn poisson(&mut self, path: &str, v: f64) -> bool {
        self.finite(path, v)
            && ((0.0..0.5).contains(&v) || self.fail(path, v, "must be >= 0 and < 0.5"))
    }
}

/// Where a station came from, for messages.
#[derive(Clone, Copy)]
enum Place<'a> {
    Inline(usize),
    Csv { label: &'a str, line: u64 },
}

impl Place<'_> {
    fn field(&self, field: &str) -> String {
        match self {
            Place::Inline(i) => format!("shell.stations[{i}].{field}"),
            Place::Csv { label, line } => format!("{label} line {line}, column {field}"),
        }
    }
}

/// Checks a raw case and converts it to SI. `csv` holds the stations read from
/// `shell.stations_csv`, when the case names one.
pub fn validate(raw: &RawCase, csv: Option<&CsvStations>) -> Result<Case, Vec<ValidationIssue>> {
    let too_many = super::limits::check_counts(raw, csv);
    if !too_many.is_empty() {
        return Err(too_many);
    }
    let mut c = Checker::default();
    c.issues.extend(super::limits::check_ranges(raw));
    c.issues.extend(super::names::check_names(raw));
    let mut shell = check_shell(&mut c, raw, csv);
    let height_m = shell.as_ref().map(Shell::height_m);
    let zones = zone::check_zones(&mut c, &raw.shell.zone, height_m);
    let openings = opening::check_openings(&mut c, &raw.opening, shell.as_ref());
    if let Some(s) = &mut shell {
        s.zones = zones;
        s.openings = openings;
    }
    if let Some(s) = &shell {
        c.issues.extend(super::physical::check(raw, s, csv));
    }

    let linings = raw
        .lining
        .iter()
        .enumerate()
        .filter_map(|(i, l)| check_lining(&mut c, i, l, shell.as_ref()))
        .collect();

    let mut point_masses = Vec::new();
    for (i, pm) in raw.point_mass.iter().enumerate() {
        let p = format!("point_mass[{i}]");
        let z_ok = c.finite(&format!("{p}.z_m"), pm.z_m)
            && within_shell(&mut c, &format!("{p}.z_m"), pm.z_m, height_m);
        let m_ok = c.positive(&format!("{p}.mass_kg"), pm.mass_kg);
        let rotary_inertia_kg_m2 = pm.rotary_inertia_kg_m2.unwrap_or(0.0);
        let j_ok = c.non_negative(&format!("{p}.rotary_inertia_kg_m2"), rotary_inertia_kg_m2);
        if z_ok && m_ok && j_ok {
            let label = match pm.label.as_deref().map(str::trim) {
                Some(l) if !l.is_empty() => l.to_string(),
                _ => format!("point mass at {} m", num(pm.z_m)),
            };
            point_masses.push(PointMass {
                z_m: pm.z_m,
                mass_kg: pm.mass_kg,
                rotary_inertia_kg_m2,
                label,
                stages: pm
                    .stages
                    .as_ref()
                    .map(|names| names.iter().map(|n| n.trim().to_string()).collect()),
            });
        }
    }

    let (base, base_inertia) = base::check_base(&mut c, raw.base.as_ref());

    let before_stages = c.issues.len();
    let stages = check_stages(&mut c, raw, height_m);
    let stages_valid = c.issues.len() == before_stages;
    check_point_mass_stages(&mut c, raw, &stages, stages_valid, shell.as_ref());
    if stages_valid {
        if let Some(s) = &shell {
            opening::check_stage_tops(&mut c, &stages, &s.openings);
        }
    }
    // `None` = no [wind] in the file; `Some(None)` = a [wind] with problems.
    let wind = raw.wind.as_ref().map(|w| check_wind(&mut c, w));
    if let Some(Some(w)) = &wind {
        check_stage_c_prob(&mut c, raw, &stages, w);
    }
    let along_wind = check_along_wind(&mut c, raw);
    let vortex = check_vortex(&mut c, &raw.vortex);

    let criteria = Criteria {
        tip_amplitude_m: c
            .optional_positive("criteria.tip_amplitude_m", raw.criteria.tip_amplitude_m),
        tip_amplitude_per_diameter: c.optional_positive(
            "criteria.tip_amplitude_per_diameter",
            raw.criteria.tip_amplitude_per_diameter,
        ),
        stress_pa: c
            .optional_positive("criteria.stress_mpa", raw.criteria.stress_mpa)
            .map(|v| v * 1e6),
    };
    let model = raw.model.as_ref().and_then(|m| check_model(&mut c, m));
    let remedy = raw
        .remedy
        .as_ref()
        .and_then(|r| check_remedy(&mut c, r, &stages, vortex.as_ref(), height_m));

    if let (Some(s), Some(v)) = (&shell, &vortex) {
        c.issues.extend(super::plausibility::group_errors(s, v));
    }
    let factors = check_design(&mut c, raw.design.as_ref());
    let resistance = check_resistance(&mut c, raw, shell.as_ref(), factors);

    match (shell, wind, vortex) {
        (Some(shell), None | Some(Some(_)), Some(vortex)) if c.issues.is_empty() => Ok(Case {
            title: raw
                .title
                .as_deref()
                .map(str::trim)
                .filter(|t| !t.is_empty())
                .unwrap_or(DEFAULT_TITLE)
                .to_string(),
            shell,
            linings,
            point_masses,
            base,
            base_inertia,
            stages,
            wind: wind.flatten(),
            along_wind,
            vortex,
            criteria,
            model,
            remedy,
            project: project_text(raw.project.as_ref()),
            resistance,
            source: None,
        }),
        _ => Err(c.issues),
    }
}

/// `[project]`: free text, trimmed; an empty value counts as absent.
fn project_text(raw: Option<&crate::input::raw::RawProject>) -> crate::case::Project {
    let keep = |v: &Option<String>| {
        v.as_deref()
            .map(str::trim)
            .filter(|t| !t.is_empty())
            .map(String::from)
    };
    raw.map_or_else(Default::default, |p| crate::case::Project {
        job: keep(&p.job),
        revision: keep(&p.revision),
        prepared_by: keep(&p.prepared_by),
        checked_by: keep(&p.checked_by),
    })
}

fn within_shell(c: &mut Checker, path: &str, z_m: f64, height_m: Option<f64>) -> bool {
    match height_m {
        Some(h) if !(0.0..=h).contains(&z_m) => {
            c.fail(path, z_m, format!("outside the shell (0 to {} m)", num(h)))
        }
        _ => true,
    }
}
