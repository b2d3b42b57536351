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
    Arrangement, BaseSprings, BeamTheory, Case, Criteria, Group, Lining, LiningMass, ModelSpec,
    PointMass, Profile, RemedySpec, Shell, Stage, Station, StrakesSpec, TmdMass, TmdSpec, Vortex,
    VortexMethod, Wind,
};

use super::issue::ValidationIssue;
use super::raw::{
    RawArrangement, RawBeam, RawCase, RawLining, RawMethod, RawModel, RawProfile, RawRemedy,
    RawStation, RawVortex, RawWind,
};
use super::stations_csv::CsvStations;

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
    let shell = check_shell(&mut c, raw, csv);
    let height_m = shell.as_ref().map(Shell::height_m);
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
        if z_ok && m_ok {
            let label = match pm.label.as_deref().map(str::trim) {
                Some(l) if !l.is_empty() => l.to_string(),
                _ => format!("point mass at {} m", num(pm.z_m)),
            };
            point_masses.push(PointMass {
                z_m: pm.z_m,
                mass_kg: pm.mass_kg,
                label,
            });
        }
    }

    let base = raw.base.as_ref().and_then(|b| {
        let rot = c.optional_positive(
            "base.rotational_stiffness_gnm_per_rad",
            b.rotational_stiffness_gnm_per_rad,
        );
        let lat = c.optional_positive(
            "base.lateral_stiffness_mn_per_m",
            b.lateral_stiffness_mn_per_m,
        );
        (rot.is_some() || lat.is_some()).then(|| BaseSprings {
            rotational_nm_per_rad: rot.map(|v| v * 1e9),
            lateral_n_per_m: lat.map(|v| v * 1e6),
        })
    });

    let stages = check_stages(&mut c, raw, height_m);
    // `None` = no [wind] in the file; `Some(None)` = a [wind] with problems.
    let wind = raw.wind.as_ref().map(|w| check_wind(&mut c, w));
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
            stages,
            wind: wind.flatten(),
            vortex,
            criteria,
            model,
            remedy,
            project: project_text(raw.project.as_ref()),
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

/// `[shell]` and its stations; `None` when anything in it is wrong.
fn check_shell(c: &mut Checker, raw: &RawCase, csv: Option<&CsvStations>) -> Option<Shell> {
    let before = c.issues.len();
    let s = &raw.shell;
    let e_path = "shell.elastic_modulus_gpa";
    let e = s.elastic_modulus_gpa;
    if c.positive(e_path, e) {
        if e > 1000.0 {
            c.fail(e_path, e, "looks like Pa or MPa; give E in GPa (e.g. 32.0)");
        } else if e < 1.0 {
            c.fail(
                e_path,
                e,
                "below 1 GPa: looks like the wrong unit; give E in GPa (e.g. 32.0)",
            );
        }
    }
    let rho_path = "shell.density_kg_m3";
    if c.positive(rho_path, s.density_kg_m3) && !(500.0..=10000.0).contains(&s.density_kg_m3) {
        c.fail(
            rho_path,
            s.density_kg_m3,
            "outside 500-10000 kg/m3: looks like the wrong unit; give kg/m3 (e.g. 2500.0)",
        );
    }
    let nu = s.poisson_ratio.unwrap_or(DEFAULT_POISSON_RATIO);
    c.poisson("shell.poisson_ratio", nu);

    let rows: Option<Vec<(Place, RawStation)>> = match (&s.stations, &s.stations_csv, csv) {
        (Some(_), Some(_), _) => {
            c.key(
                "shell",
                "stations and stations_csv given together; give only one",
            );
            None
        }
        (None, None, _) => {
            c.key(
                "shell.stations",
                "missing; give stations = [{ z_m = ..., outer_diameter_m = ..., wall_m = ... }, \
                 ...] or stations_csv = \"file.csv\"",
            );
            None
        }
        (Some(list), None, _) => Some(
            list.iter()
                .enumerate()
                .map(|(i, st)| (Place::Inline(i), *st))
                .collect(),
        ),
        (None, Some(_), Some(csv)) => Some(
            csv.rows
                .iter()
                .map(|r| {
                    (
                        Place::Csv {
                            label: &csv.label,
                            line: r.line,
                        },
                        r.station,
                    )
                })
                .collect(),
        ),
        (None, Some(name), None) => {
            c.key(
                "shell.stations_csv",
                format!("the file \"{name}\" was not read"),
            );
            None
        }
    };
    let rows = rows?;
    check_stations(c, &rows, s.stations_csv.as_deref());

    (c.issues.len() == before).then(|| Shell {
        elastic_modulus_pa: e * 1e9,
        density_kg_m3: s.density_kg_m3,
        poisson_ratio: nu,
        beam: match s.beam.unwrap_or(RawBeam::Timoshenko) {
            RawBeam::Timoshenko => BeamTheory::Timoshenko,
            RawBeam::EulerBernoulli => BeamTheory::EulerBernoulli,
        },
        stations: rows
            .iter()
            .map(|(_, r)| Station {
                z_m: r.z_m,
                outer_diameter_m: r.outer_diameter_m,
                wall_m: r.wall_m,
            })
            .collect(),
    })
}

fn check_stations(c: &mut Checker, rows: &[(Place, RawStation)], csv_name: Option<&str>) {
    let whole = csv_name.unwrap_or("shell.stations");
    if rows.len() < 2 {
        c.key(
            whole,
            format!(
                "{} station(s) given; at least 2 are needed (base and top)",
                rows.len()
            ),
        );
    }
    let height_m = rows.last().map(|(_, r)| r.z_m).unwrap_or(0.0);
    let mut previous_z: Option<f64> = None;
    for (i, (place, st)) in rows.iter().enumerate() {
        let z_path = place.field("z_m");
        if c.finite(&z_path, st.z_m) {
            if i == 0 && st.z_m != 0.0 {
                c.fail(
                    &z_path,
                    st.z_m,
                    "the first station must be at z = 0 (top of the foundation)",
                );
            }
            if let Some(prev) = previous_z {
                if st.z_m == prev {
                    c.fail(
                        &z_path,
                        st.z_m,
                        "same height as the previous station (duplicate)",
                    );
                } else if st.z_m < prev {
                    c.fail(
                        &z_path,
                        st.z_m,
                        format!(
                            "must be above the previous station ({} m); list stations from the \
                             base upward",
                            num(prev)
                        ),
                    );
                }
            }
            previous_z = Some(st.z_m);
        } else {
            previous_z = None;
        }
        let d_path = place.field("outer_diameter_m");
        let d_ok = c.positive(&d_path, st.outer_diameter_m);
        // Every station in mm is named (not only the first): the user fixes all in one pass.
        let mut d_mm = false;
        if d_ok {
            if st.outer_diameter_m > 200.0 {
                d_mm = true;
                c.fail(
                    &d_path,
                    st.outer_diameter_m,
                    "over 200 m: are the sizes in mm? give metres",
                );
            } else if height_m.is_finite() && height_m > 0.0 && st.outer_diameter_m > height_m {
                d_mm = true;
                c.fail(
                    &d_path,
                    st.outer_diameter_m,
                    format!(
                        "diameter larger than the height ({} m): are the sizes in mm?",
                        num(height_m)
                    ),
                );
            }
        }
        let t_path = place.field("wall_m");
        let t_ok = c.positive(&t_path, st.wall_m);
        if t_ok
            && d_ok
            && !d_mm
            && 2.0 * st.wall_m >= st.outer_diameter_m
            && (WALL_MM_HINT_M.0..=WALL_MM_HINT_M.1).contains(&st.wall_m)
        {
            // A wall beside a diameter in metres that reads as 50-2000 mm is a wall in mm (RC
            // chimney shells are 0.15-1.0 m thick, common practice): say so instead of the
            // half-diameter rule.
            c.fail(
                &t_path,
                st.wall_m,
                format!(
                    "more than half the outer diameter ({} m); is the wall in mm? give metres \
                     ({} mm = {} m)",
                    num(st.outer_diameter_m),
                    num(st.wall_m),
                    num(st.wall_m / 1000.0)
                ),
            );
        } else if t_ok && d_ok && 2.0 * st.wall_m >= st.outer_diameter_m {
            c.fail(
                &t_path,
                st.wall_m,
                format!(
                    "wall must be less than half the outer diameter ({} m / 2)",
                    num(st.outer_diameter_m)
                ),
            );
        }
    }
}

fn check_lining(c: &mut Checker, i: usize, l: &RawLining, shell: Option<&Shell>) -> Option<Lining> {
    let before = c.issues.len();
    let p = format!("lining[{i}]");
    let from_path = format!("{p}.from_z_m");
    let to_path = format!("{p}.to_z_m");
    let height_m = shell.map(Shell::height_m);
    let from_ok = c.finite(&from_path, l.from_z_m);
    let to_ok = c.finite(&to_path, l.to_z_m);
    if from_ok && l.from_z_m < 0.0 {
        c.fail(
            &from_path,
            l.from_z_m,
            "below the base of the shell (z = 0)",
        );
    }
    if to_ok {
        if let Some(h) = height_m {
            if l.to_z_m > h {
                c.fail(
                    &to_path,
                    l.to_z_m,
                    format!("above the top of the shell ({} m)", num(h)),
                );
            }
        }
    }
    if from_ok && to_ok && l.from_z_m >= l.to_z_m {
        c.fail(
            &to_path,
            l.to_z_m,
            format!("must be above from_z_m ({} m)", num(l.from_z_m)),
        );
    }

    let layer_keys: Vec<&str> = [
        ("thickness_m", l.thickness_m),
        ("density_kg_m3", l.density_kg_m3),
        ("gap_m", l.gap_m),
    ]
    .iter()
    .filter(|(_, v)| v.is_some())
    .map(|(k, _)| *k)
    .collect();
    let mut forms: Vec<String> = Vec::new();
    if l.mass_per_length_kg_m.is_some() {
        forms.push("mass_per_length_kg_m".into());
    }
    if l.mass_per_area_kg_m2.is_some() {
        forms.push("mass_per_area_kg_m2".into());
    }
    if !layer_keys.is_empty() {
        forms.push(format!("layer ({})", layer_keys.join(", ")));
    }
    let mass = match forms.len() {
        0 => {
            c.key(
                &p,
                "no mass given; give exactly one of mass_per_length_kg_m, mass_per_area_kg_m2 or \
                 thickness_m + density_kg_m3 (+ gap_m)",
            );
            None
        }
        1 => {
            if let Some(v) = l.mass_per_length_kg_m {
                c.positive(&format!("{p}.mass_per_length_kg_m"), v)
                    .then_some(LiningMass::PerLength {
                        mass_per_length_kg_m: v,
                    })
            } else if let Some(v) = l.mass_per_area_kg_m2 {
                c.positive(&format!("{p}.mass_per_area_kg_m2"), v)
                    .then_some(LiningMass::PerArea {
                        mass_per_area_kg_m2: v,
                    })
            } else {
                check_layer(c, &p, l)
            }
        }
        _ => {
            c.key(
                &p,
                format!(
                    "{} given together; give exactly one mass form",
                    forms.join(" and ")
                ),
            );
            None
        }
    };

    let lining = Lining {
        from_z_m: l.from_z_m,
        to_z_m: l.to_z_m,
        mass: mass?,
    };
    if c.issues.len() != before {
        return None;
    }
    if let (Some(shell), LiningMass::Layer { thickness_m, .. }) = (shell, lining.mass) {
        // Geometry is linear between stations, so the smallest clearance is at a zone end or
        // a station inside the zone.
        let heights = std::iter::once(lining.from_z_m)
            .chain(
                shell
                    .stations
                    .iter()
                    .map(|s| s.z_m)
                    .filter(|&z| z > lining.from_z_m && z < lining.to_z_m),
            )
            .chain(std::iter::once(lining.to_z_m));
        for z in heights {
            let (d, t) = shell.geometry_at(z);
            if lining.mass_per_length_kg_m(d, t) <= 0.0 {
                let gap = l.gap_m.unwrap_or(0.0);
                c.fail(
                    format!("{p}.thickness_m"),
                    thickness_m,
                    format!(
                        "the layer does not fit inside the shell at z = {} m: D - 2 t - 2 gap - \
                         t_l = {:.3} m, must be > 0",
                        num(z),
                        d - 2.0 * t - 2.0 * gap - thickness_m
                    ),
                );
                return None;
            }
        }
    }
    Some(lining)
}

fn check_layer(c: &mut Checker, p: &str, l: &RawLining) -> Option<LiningMass> {
    let thickness = match l.thickness_m {
        Some(t) => c.positive(&format!("{p}.thickness_m"), t).then_some(t),
        None => {
            c.key(
                format!("{p}.thickness_m"),
                "missing; a layer lining needs thickness_m and density_kg_m3",
            );
            None
        }
    };
    let density = match l.density_kg_m3 {
        Some(r) => c.positive(&format!("{p}.density_kg_m3"), r).then_some(r),
        None => {
            c.key(
                format!("{p}.density_kg_m3"),
                "missing; a layer lining needs thickness_m and density_kg_m3",
            );
            None
        }
    };
    let gap = l.gap_m.unwrap_or(0.0);
    let gap_ok = c.non_negative(&format!("{p}.gap_m"), gap);
    match (thickness, density, gap_ok) {
        (Some(thickness_m), Some(density_kg_m3), true) => Some(LiningMass::Layer {
            thickness_m,
            density_kg_m3,
            gap_m: gap,
        }),
        _ => None,
    }
}

fn check_stages(c: &mut Checker, raw: &RawCase, height_m: Option<f64>) -> Vec<Stage> {
    let Some(raw_stages) = &raw.stage else {
        return default_stages(!raw.lining.is_empty());
    };
    if raw_stages.is_empty() {
        c.key(
            "stage",
            "no stages given; give at least one [[stage]], or leave stage out for the default \
             stages (shell only, lined)",
        );
    }
    let mut names = HashSet::new();
    let mut stages = Vec::new();
    for (i, s) in raw_stages.iter().enumerate() {
        let p = format!("stage[{i}]");
        let name = s.name.trim().to_string();
        let mut ok = true;
        if name.is_empty() {
            ok = false;
            c.issues.push(ValidationIssue::new(
                format!("{p}.name"),
                format!("{:?}", s.name),
                "must not be empty",
            ));
        } else if !names.insert(name.clone()) {
            ok = false;
            c.issues.push(ValidationIssue::new(
                format!("{p}.name"),
                format!("{:?}", s.name),
                "used by an earlier stage; stage names must be unique",
            ));
        }
        let factor = s.stiffness_factor.unwrap_or(1.0);
        ok &= c.positive(&format!("{p}.stiffness_factor"), factor);
        if let Some(top) = s.top_z_m {
            let top_path = format!("{p}.top_z_m");
            if c.finite(&top_path, top) {
                if top <= 0.0 {
                    ok = c.fail(&top_path, top, "must be above the base (> 0)");
                } else if let Some(h) = height_m.filter(|&h| top > h) {
                    ok = c.fail(
                        &top_path,
                        top,
                        format!("above the top of the shell ({} m)", num(h)),
                    );
                }
            } else {
                ok = false;
            }
        }
        if ok {
            stages.push(Stage {
                name,
                lining: s.lining,
                stiffness_factor: factor,
                top_z_m: s.top_z_m,
            });
        }
    }
    stages
}

/// The stages used when the case file gives none: the shell alone and, when the case has
/// lining zones, the finished (lined) stack. Without lining the two would be the same
/// structure, so only the first is made.
pub fn default_stages(has_lining: bool) -> Vec<Stage> {
    let mut stages = vec![Stage {
        name: "shell only".into(),
        lining: false,
        stiffness_factor: 1.0,
        top_z_m: None,
    }];
    if has_lining {
        stages.push(Stage {
            name: "lined".into(),
            lining: true,
            stiffness_factor: 1.0,
            top_z_m: None,
        });
    }
    stages
}

fn check_wind(c: &mut Checker, w: &RawWind) -> Option<Wind> {
    let before = c.issues.len();
    let v_path = "wind.reference_speed_m_s";
    if c.positive(v_path, w.reference_speed_m_s) && w.reference_speed_m_s > 100.0 {
        c.fail(
            v_path,
            w.reference_speed_m_s,
            "over 100 m/s: is it in km/h? give m/s",
        );
    }
    let z_ref = w.reference_height_m.unwrap_or(DEFAULT_REFERENCE_HEIGHT_M);
    c.positive("wind.reference_height_m", z_ref);
    let profile = match w.profile.unwrap_or(RawProfile::Power) {
        RawProfile::Power => {
            for (key, v) in [("roughness_m", w.roughness_m), ("z_min_m", w.z_min_m)] {
                if let Some(v) = v {
                    c.fail(
                        format!("wind.{key}"),
                        v,
                        "applies to profile = \"log\" only; remove it or set profile = \"log\"",
                    );
                }
            }
            let exponent = w.exponent.unwrap_or(DEFAULT_EXPONENT);
            c.open("wind.exponent", exponent, 0.0, 1.0);
            Profile::Power { exponent }
        }
        RawProfile::Log => {
            if let Some(v) = w.exponent {
                c.fail(
                    "wind.exponent",
                    v,
                    "applies to profile = \"power\" only; remove it or set profile = \"power\"",
                );
            }
            let roughness_m = match w.roughness_m {
                Some(z0) => {
                    if c.positive("wind.roughness_m", z0) && z0 > 2.0 {
                        c.fail("wind.roughness_m", z0, "must be at most 2 m");
                    }
                    z0
                }
                None => {
                    c.key(
                        "wind.roughness_m",
                        "missing; profile = \"log\" needs the roughness length z0 (EN 1991-1-4 \
                         Table 4.1, e.g. 0.05 m for terrain category II)",
                    );
                    f64::NAN
                }
            };
            let z_min_m = match w.z_min_m {
                Some(z) => {
                    c.positive("wind.z_min_m", z);
                    z
                }
                None => default_z_min_m(roughness_m),
            };
            Profile::Log {
                roughness_m,
                z_min_m,
            }
        }
    };
    let air_density_kg_m3 = w.air_density_kg_m3.unwrap_or(DEFAULT_AIR_DENSITY_KG_M3);
    c.positive("wind.air_density_kg_m3", air_density_kg_m3);
    let kinematic_viscosity_m2_s = w
        .kinematic_viscosity_m2_s
        .unwrap_or(DEFAULT_KINEMATIC_VISCOSITY_M2_S);
    c.positive("wind.kinematic_viscosity_m2_s", kinematic_viscosity_m2_s);
    (c.issues.len() == before).then_some(Wind {
        reference_speed_m_s: w.reference_speed_m_s,
        reference_height_m: z_ref,
        profile,
        air_density_kg_m3,
        kinematic_viscosity_m2_s,
    })
}

fn check_vortex(c: &mut Checker, v: &RawVortex) -> Option<Vortex> {
    let before = c.issues.len();
    let method = match v.method.unwrap_or(RawMethod::En1991E1) {
        RawMethod::En1991E1 => VortexMethod::En1991E1,
        RawMethod::En1991E2 => VortexMethod::En1991E2,
        RawMethod::Gb50009H1 => VortexMethod::Gb50009H1,
    };
    if let Some(st) = v.strouhal {
        c.open("vortex.strouhal", st, 0.0, 1.0);
    }
    let log_decrement = v.log_decrement.unwrap_or(DEFAULT_LOG_DECREMENT);
    c.open("vortex.log_decrement", log_decrement, 0.0, 1.0);
    if let Some(zeta) = v.damping_ratio {
        c.open("vortex.damping_ratio", zeta, 0.0, 1.0);
    }
    let modes = v.modes.unwrap_or(DEFAULT_MODES as i64);
    if !(1..=MAX_MODES).contains(&modes) {
        c.issues.push(ValidationIssue::new(
            "vortex.modes",
            modes.to_string(),
            format!("must be 1 to {MAX_MODES}"),
        ));
    }
    let design_life_years = v.design_life_years.unwrap_or(DEFAULT_DESIGN_LIFE_YEARS);
    c.positive("vortex.design_life_years", design_life_years);
    let group = v.group.as_ref().and_then(|g| {
        let count = u32::try_from(g.count).ok().filter(|&n| n >= 2);
        if count.is_none() {
            c.issues.push(ValidationIssue::new(
                "vortex.group.count",
                g.count.to_string(),
                "must be at least 2 (the stack and one neighbour)",
            ));
        }
        let spacing_ok = c.positive("vortex.group.spacing_m", g.spacing_m);
        let arrangement = match g.arrangement.unwrap_or(RawArrangement::InLine) {
            RawArrangement::InLine => Arrangement::InLine,
        };
        match (count, spacing_ok) {
            (Some(count), true) => Some(Group {
                count,
                spacing_m: g.spacing_m,
                arrangement,
            }),
            _ => None,
        }
    });
    (c.issues.len() == before).then(|| Vortex {
        method,
        strouhal: v.strouhal,
        log_decrement,
        damping_ratio: v.damping_ratio,
        modes: usize::try_from(modes).unwrap_or(DEFAULT_MODES),
        design_life_years,
        group,
    })
}

fn check_model(c: &mut Checker, m: &RawModel) -> Option<ModelSpec> {
    let before = c.issues.len();
    let length_scale = c.optional_positive("model.length_scale", m.length_scale);
    c.positive("model.elastic_modulus_gpa", m.elastic_modulus_gpa);
    c.positive("model.density_kg_m3", m.density_kg_m3);
    let poisson_ratio = m.poisson_ratio.unwrap_or(DEFAULT_MODEL_POISSON_RATIO);
    c.poisson("model.poisson_ratio", poisson_ratio);
    let min_wall_m = c.optional_positive("model.min_wall_m", m.min_wall_m);
    let tunnel_width_m = c.optional_positive("model.tunnel_width_m", m.tunnel_width_m);
    let tunnel_height_m = c.optional_positive("model.tunnel_height_m", m.tunnel_height_m);
    let max_blockage = m.max_blockage.unwrap_or(DEFAULT_MAX_BLOCKAGE);
    if c.positive("model.max_blockage", max_blockage) && max_blockage > 0.5 {
        c.fail("model.max_blockage", max_blockage, "must be at most 0.5");
    }
    let v_min = c.optional_positive("model.tunnel_speed_min_m_s", m.tunnel_speed_min_m_s);
    let v_max = c.optional_positive("model.tunnel_speed_max_m_s", m.tunnel_speed_max_m_s);
    if let (Some(lo), Some(hi)) = (v_min, v_max) {
        if lo >= hi {
            c.fail(
                "model.tunnel_speed_max_m_s",
                hi,
                format!("must be above tunnel_speed_min_m_s ({} m/s)", num(lo)),
            );
        }
    }
    (c.issues.len() == before).then_some(ModelSpec {
        length_scale,
        elastic_modulus_pa: m.elastic_modulus_gpa * 1e9,
        density_kg_m3: m.density_kg_m3,
        poisson_ratio,
        min_wall_m,
        tunnel_width_m,
        tunnel_height_m,
        max_blockage,
        tunnel_speed_min_m_s: v_min,
        tunnel_speed_max_m_s: v_max,
    })
}

/// A remedy's optional `stage` must name a stage of the case.
fn check_remedy_stage(
    c: &mut Checker,
    path: &str,
    stage: &Option<String>,
    stages: &[Stage],
) -> Option<Option<String>> {
    match stage {
        None => Some(None),
        Some(name) => {
            let name = name.trim();
            if stages.iter().any(|s| s.name == name) {
                Some(Some(name.to_string()))
            } else {
                let known: Vec<String> = stages.iter().map(|s| format!("{:?}", s.name)).collect();
                c.issues.push(ValidationIssue::new(
                    path,
                    format!("{name:?}"),
                    format!("no such stage; the stages are {}", known.join(", ")),
                ));
                None
            }
        }
    }
}

fn check_remedy(
    c: &mut Checker,
    r: &RawRemedy,
    stages: &[Stage],
    vortex: Option<&Vortex>,
    height_m: Option<f64>,
) -> Option<RemedySpec> {
    let before = c.issues.len();
    let tmd = r.tmd.as_ref().and_then(|t| {
        let modes = vortex.map_or(MAX_MODES, |v| v.modes as i64);
        let mode_ok = if t.mode < 1 || t.mode > modes {
            c.issues.push(ValidationIssue::new(
                "remedy.tmd.mode",
                t.mode.to_string(),
                format!("must be a checked mode, 1 to {modes} (vortex.modes)"),
            ));
            false
        } else {
            true
        };
        let mass = match (t.mass_ratio, t.mass_kg) {
            (Some(mu), None) => {
                let ok = c.positive("remedy.tmd.mass_ratio", mu)
                    && (mu <= MAX_TMD_MASS_RATIO
                        || c.fail(
                            "remedy.tmd.mass_ratio",
                            mu,
                            format!(
                                "must be at most {MAX_TMD_MASS_RATIO} (Den Hartog's tuning is a \
                                 small-mass-ratio result)"
                            ),
                        ));
                ok.then_some(TmdMass::Ratio(mu))
            }
            (None, Some(kg)) => c
                .positive("remedy.tmd.mass_kg", kg)
                .then_some(TmdMass::Kg(kg)),
            (Some(_), Some(_)) => {
                c.key(
                    "remedy.tmd",
                    "give exactly one of mass_ratio and mass_kg, not both",
                );
                None
            }
            (None, None) => {
                c.key(
                    "remedy.tmd",
                    "give the damper mass: mass_ratio (to the modal mass) or mass_kg",
                );
                None
            }
        };
        let stage = check_remedy_stage(c, "remedy.tmd.stage", &t.stage, stages);
        match (mode_ok, mass, stage) {
            (true, Some(mass), Some(stage)) => Some(TmdSpec {
                mode: t.mode as usize,
                mass,
                stage,
            }),
            _ => None,
        }
    });
    let strakes = r.strakes.as_ref().and_then(|s| {
        let from_ok = c.non_negative("remedy.strakes.from_z_m", s.from_z_m)
            && within_shell(c, "remedy.strakes.from_z_m", s.from_z_m, height_m);
        let to_ok = c.finite("remedy.strakes.to_z_m", s.to_z_m)
            && within_shell(c, "remedy.strakes.to_z_m", s.to_z_m, height_m);
        if from_ok && to_ok && s.to_z_m <= s.from_z_m {
            c.fail(
                "remedy.strakes.to_z_m",
                s.to_z_m,
                format!("must be above from_z_m ({} m)", num(s.from_z_m)),
            );
        }
        let f = s.c_lat_factor;
        if c.finite("remedy.strakes.c_lat_factor", f) && !(0.0..=1.0).contains(&f) {
            c.fail(
                "remedy.strakes.c_lat_factor",
                f,
                "must be between 0 and 1 (a factor that reduces c_lat)",
            );
        }
        let cd = s
            .drag_coefficient
            .unwrap_or(DEFAULT_STRAKES_DRAG_COEFFICIENT);
        c.positive("remedy.strakes.drag_coefficient", cd);
        let stage = check_remedy_stage(c, "remedy.strakes.stage", &s.stage, stages)?;
        Some(StrakesSpec {
            from_z_m: s.from_z_m,
            to_z_m: s.to_z_m,
            c_lat_factor: f,
            drag_coefficient: cd,
            stage,
        })
    });
    (c.issues.len() == before).then_some(RemedySpec { tmd, strakes })
}

#[cfg(test)]
mod tests {
    use std::path::Path;

    use super::*;
    use crate::input::{parse_case, InputError};

    /// A small valid case; tests replace one line to break one rule.
    const BASE: &str = r#"
title = "Invented test stack"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
stations = [
  { z_m = 0.0,   outer_diameter_m = 12.0, wall_m = 0.40 },
  { z_m = 50.0,  outer_diameter_m = 10.0, wall_m = 0.30 },
  { z_m = 100.0, outer_diameter_m = 8.0,  wall_m = 0.20 },
]
[[lining]]
from_z_m = 5.0
to_z_m = 100.0
mass_per_length_kg_m = 3000.0
[[point_mass]]
z_m = 90.0
mass_kg = 10000.0
[wind]
reference_speed_m_s = 25.0
"#;

    fn run(text: &str) -> Result<Case, Vec<String>> {
        match parse_case(text, Path::new("."), "t.toml") {
            Ok(c) => Ok(c),
            Err(InputError::Invalid { issues, .. }) => {
                Err(issues.iter().map(|i| i.to_string()).collect())
            }
            Err(other) => Err(vec![other.to_string()]),
        }
    }

    fn with(from: &str, to: &str) -> String {
        assert!(BASE.contains(from), "test edit target missing: {from}");
        BASE.replacen(from, to, 1)
    }

    fn append(extra: &str) -> String {
        format!("{BASE}\n{extra}\n")
    }

    /// The case must fail with exactly this one message.
    fn fails_with(text: &str, expected: &str) {
        match run(text) {
            Ok(_) => panic!("accepted, expected: {expected}"),
            Err(errs) => assert_eq!(errs, vec![expected.to_string()]),
        }
    }

    #[test]
    fn base_case_gets_defaults_and_si_units() {
        let case = run(BASE).expect("base case is valid");
        assert_eq!(case.shell.elastic_modulus_pa, 32.0e9);
        assert_eq!(case.shell.poisson_ratio, 0.2);
        assert_eq!(case.shell.beam, BeamTheory::Timoshenko);
        assert_eq!(case.stages, default_stages(true));
        assert_eq!(case.stages.len(), 2);
        assert_eq!(case.base, None);
        assert_eq!(case.wind.unwrap().reference_height_m, 10.0);
        assert_eq!(
            case.wind.unwrap().profile,
            Profile::Power { exponent: 0.16 }
        );
        assert_eq!(case.wind.unwrap().air_density_kg_m3, 1.25);
        assert_eq!(case.wind.unwrap().kinematic_viscosity_m2_s, 1.5e-5);
        assert_eq!(case.vortex.method, VortexMethod::En1991E1);
        assert_eq!(case.vortex.log_decrement, 0.03);
        assert_eq!(case.vortex.modes, 3);
        assert_eq!(case.vortex.design_life_years, 50.0);
        assert!(case.criteria.is_empty());
        assert_eq!(case.point_masses[0].label, "point mass at 90 m");
        assert_eq!(case.title, "Invented test stack");
    }

    #[test]
    fn no_lining_and_no_stages_gives_one_stage() {
        // Two default stages "shell only" and "lined" would be the same structure.
        let text = with(
            "[[lining]]\nfrom_z_m = 5.0\nto_z_m = 100.0\nmass_per_length_kg_m = 3000.0\n",
            "",
        );
        let case = run(&text).expect("valid");
        assert_eq!(case.stages.len(), 1);
        assert_eq!(case.stages[0].name, "shell only");
        assert!(!case.stages[0].lining);
    }

    #[test]
    fn unit_conversions() {
        let case = run(&append(
            "[base]\nrotational_stiffness_gnm_per_rad = 800.0\nlateral_stiffness_mn_per_m = 5000.0\n\
             [criteria]\nstress_mpa = 3.0\n[model]\nelastic_modulus_gpa = 3.0\ndensity_kg_m3 = 1200.0",
        ))
        .expect("valid");
        let base = case.base.expect("springs");
        assert_eq!(base.rotational_nm_per_rad, Some(800.0e9));
        assert_eq!(base.lateral_n_per_m, Some(5000.0e6));
        assert_eq!(case.criteria.stress_pa, Some(3.0e6));
        let model = case.model.expect("model");
        assert_eq!(model.elastic_modulus_pa, 3.0e9);
        assert_eq!(model.poisson_ratio, 0.35);
        assert_eq!(model.max_blockage, 0.05);
    }

    #[test]
    fn base_with_one_component_is_rigid_in_the_other() {
        let case = run(&append("[base]\nrotational_stiffness_gnm_per_rad = 800.0")).expect("valid");
        let base = case.base.expect("springs");
        assert_eq!(base.lateral_n_per_m, None);
        let case = run(&append("[base]")).expect("valid");
        assert_eq!(case.base, None);
    }

    #[test]
    fn non_finite_numbers() {
        fails_with(
            &with("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = nan"),
            "shell.elastic_modulus_gpa = nan: must be a finite number",
        );
        fails_with(
            &with("mass_kg = 10000.0", "mass_kg = inf"),
            "point_mass[0].mass_kg = inf: must be a finite number",
        );
    }

    #[test]
    fn station_sizes() {
        fails_with(
            &with(
                "outer_diameter_m = 10.0, wall_m = 0.30",
                "outer_diameter_m = 0.0, wall_m = 0.30",
            ),
            "shell.stations[1].outer_diameter_m = 0: must be > 0",
        );
        fails_with(
            &with("wall_m = 0.30", "wall_m = -0.3"),
            "shell.stations[1].wall_m = -0.3: must be > 0",
        );
        fails_with(
            &with("wall_m = 0.30", "wall_m = 5.0"),
            "shell.stations[1].wall_m = 5: wall must be less than half the outer diameter (10 m / 2)",
        );
    }

    #[test]
    fn station_order() {
        fails_with(
            &with("z_m = 0.0,", "z_m = 2.0,"),
            "shell.stations[0].z_m = 2: the first station must be at z = 0 (top of the foundation)",
        );
        fails_with(
            &with("z_m = 50.0,", "z_m = 100.0,"),
            "shell.stations[2].z_m = 100: same height as the previous station (duplicate)",
        );
        fails_with(
            &with("z_m = 50.0,", "z_m = 120.0,"),
            "shell.stations[2].z_m = 100: must be above the previous station (120 m); list \
             stations from the base upward",
        );
    }

    #[test]
    fn station_count_and_source() {
        let one = BASE.replace(
            "  { z_m = 50.0,  outer_diameter_m = 10.0, wall_m = 0.30 },\n  { z_m = 100.0, outer_diameter_m = 8.0,  wall_m = 0.20 },\n",
            "",
        );
        let errs = run(&one).unwrap_err();
        assert!(
            errs.contains(
                &"shell.stations: 1 station(s) given; at least 2 are needed (base and top)"
                    .to_string()
            ),
            "{errs:?}"
        );
        fails_with(
            &with(
                "density_kg_m3 = 2500.0",
                "density_kg_m3 = 2500.0\nstations_csv = \"s.csv\"",
            ),
            "shell: stations and stations_csv given together; give only one",
        );
    }

    #[test]
    fn plausibility_hints() {
        fails_with(
            &with("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = 32000000000.0"),
            "shell.elastic_modulus_gpa = 32000000000: looks like Pa or MPa; give E in GPa (e.g. 32.0)",
        );
        fails_with(
            &with("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = 0.032"),
            "shell.elastic_modulus_gpa = 0.032: below 1 GPa: looks like the wrong unit; give E in GPa (e.g. 32.0)",
        );
        fails_with(
            &with("density_kg_m3 = 2500.0", "density_kg_m3 = 2.5"),
            "shell.density_kg_m3 = 2.5: outside 500-10000 kg/m3: looks like the wrong unit; give kg/m3 (e.g. 2500.0)",
        );
        fails_with(
            &with("outer_diameter_m = 12.0", "outer_diameter_m = 120.0"),
            "shell.stations[0].outer_diameter_m = 120: diameter larger than the height (100 m): are the sizes in mm?",
        );
        let mm = with(
            "outer_diameter_m = 12.0, wall_m = 0.40",
            "outer_diameter_m = 12000.0, wall_m = 0.40",
        );
        let errs = run(&mm).unwrap_err();
        assert_eq!(errs, vec!["shell.stations[0].outer_diameter_m = 12000: over 200 m: are the sizes in mm? give metres".to_string()]);
        fails_with(
            &with("reference_speed_m_s = 25.0", "reference_speed_m_s = 120.0"),
            "wind.reference_speed_m_s = 120: over 100 m/s: is it in km/h? give m/s",
        );
    }

    #[test]
    fn poisson_range() {
        fails_with(
            &with(
                "density_kg_m3 = 2500.0",
                "density_kg_m3 = 2500.0\npoisson_ratio = 0.5",
            ),
            "shell.poisson_ratio = 0.5: must be >= 0 and < 0.5",
        );
        fails_with(
            &with(
                "density_kg_m3 = 2500.0",
                "density_kg_m3 = 2500.0\npoisson_ratio = -0.1",
            ),
            "shell.poisson_ratio = -0.1: must be >= 0 and < 0.5",
        );
    }

    #[test]
    fn lining_zone() {
        fails_with(
            &with("from_z_m = 5.0", "from_z_m = -1.0"),
            "lining[0].from_z_m = -1: below the base of the shell (z = 0)",
        );
        fails_with(
            &with("to_z_m = 100.0", "to_z_m = 101.0"),
            "lining[0].to_z_m = 101: above the top of the shell (100 m)",
        );
        fails_with(
            &with("to_z_m = 100.0", "to_z_m = 5.0"),
            "lining[0].to_z_m = 5: must be above from_z_m (5 m)",
        );
    }

    #[test]
    fn lining_mass_forms() {
        fails_with(
            &with("mass_per_length_kg_m = 3000.0", "mass_per_length_kg_m = 3000.0\nmass_per_area_kg_m2 = 200.0"),
            "lining[0]: mass_per_length_kg_m and mass_per_area_kg_m2 given together; give exactly one mass form",
        );
        fails_with(
            &with("mass_per_length_kg_m = 3000.0", ""),
            "lining[0]: no mass given; give exactly one of mass_per_length_kg_m, mass_per_area_kg_m2 or thickness_m + density_kg_m3 (+ gap_m)",
        );
        fails_with(
            &with("mass_per_length_kg_m = 3000.0", "thickness_m = 0.1"),
            "lining[0].density_kg_m3: missing; a layer lining needs thickness_m and density_kg_m3",
        );
        fails_with(
            &with("mass_per_length_kg_m = 3000.0", "mass_per_area_kg_m2 = 0.0"),
            "lining[0].mass_per_area_kg_m2 = 0: must be > 0",
        );
        fails_with(
            &with(
                "mass_per_length_kg_m = 3000.0",
                "thickness_m = 0.1\ndensity_kg_m3 = 1900.0\ngap_m = -0.1",
            ),
            "lining[0].gap_m = -0.1: must be >= 0",
        );
        let layer = run(&with(
            "mass_per_length_kg_m = 3000.0",
            "thickness_m = 0.1\ndensity_kg_m3 = 1900.0",
        ))
        .expect("valid layer");
        assert_eq!(
            layer.linings[0].mass,
            LiningMass::Layer {
                thickness_m: 0.1,
                density_kg_m3: 1900.0,
                gap_m: 0.0
            }
        );
    }

    #[test]
    fn lining_layer_must_fit_inside_the_shell() {
        // At the top: D - 2 t - 2 gap - t_l = 8 - 0.4 - 6 - 2 = -0.4 m.
        fails_with(
            &with("mass_per_length_kg_m = 3000.0", "thickness_m = 2.0\ndensity_kg_m3 = 1900.0\ngap_m = 3.0"),
            "lining[0].thickness_m = 2: the layer does not fit inside the shell at z = 100 m: D - 2 t - 2 gap - t_l = -0.400 m, must be > 0",
        );
    }

    #[test]
    fn point_mass_rules() {
        fails_with(
            &with("z_m = 90.0", "z_m = 150.0"),
            "point_mass[0].z_m = 150: outside the shell (0 to 100 m)",
        );
        fails_with(
            &with("mass_kg = 10000.0", "mass_kg = 0.0"),
            "point_mass[0].mass_kg = 0: must be > 0",
        );
    }

    #[test]
    fn stage_rules() {
        let stage = |body: &str| append(&format!("[[stage]]\n{body}"));
        fails_with(
            &stage("name = \"a\"\nlining = false\ntop_z_m = 0.0"),
            "stage[0].top_z_m = 0: must be above the base (> 0)",
        );
        fails_with(
            &stage("name = \"a\"\nlining = false\ntop_z_m = 120.0"),
            "stage[0].top_z_m = 120: above the top of the shell (100 m)",
        );
        fails_with(
            &stage("name = \"a\"\nlining = false\nstiffness_factor = 0.0"),
            "stage[0].stiffness_factor = 0: must be > 0",
        );
        fails_with(
            &stage("name = \"a\"\nlining = false\n[[stage]]\nname = \"a\"\nlining = true"),
            "stage[1].name = \"a\": used by an earlier stage; stage names must be unique",
        );
        fails_with(
            &stage("name = \" \"\nlining = false"),
            "stage[0].name = \" \": must not be empty",
        );
        fails_with(
            &format!("stage = []\n{BASE}"),
            "stage: no stages given; give at least one [[stage]], or leave stage out for the default stages (shell only, lined)",
        );
        // A partial stage below the first station above the base is fine.
        let case = run(&stage("name = \"a\"\nlining = false\ntop_z_m = 10.0")).expect("valid");
        assert_eq!(case.stages[0].top_z_m, Some(10.0));
    }

    #[test]
    fn wind_rules() {
        fails_with(
            &with("reference_speed_m_s = 25.0", "reference_speed_m_s = 0.0"),
            "wind.reference_speed_m_s = 0: must be > 0",
        );
        fails_with(
            &append("exponent = 1.2"),
            "wind.exponent = 1.2: must be between 0 and 1 (exclusive)",
        );
        let log = |extra: &str| {
            with(
                "reference_speed_m_s = 25.0",
                &format!("reference_speed_m_s = 25.0\nprofile = \"log\"\n{extra}"),
            )
        };
        fails_with(
            &log(""),
            "wind.roughness_m: missing; profile = \"log\" needs the roughness length z0 (EN 1991-1-4 Table 4.1, e.g. 0.05 m for terrain category II)",
        );
        fails_with(
            &log("roughness_m = 3.0"),
            "wind.roughness_m = 3: must be at most 2 m",
        );
        fails_with(
            &log("roughness_m = 0.0"),
            "wind.roughness_m = 0: must be > 0",
        );
        fails_with(
            &log("roughness_m = 0.05\nexponent = 0.2"),
            "wind.exponent = 0.2: applies to profile = \"power\" only; remove it or set profile = \"power\"",
        );
        fails_with(
            &with("reference_speed_m_s = 25.0", "reference_speed_m_s = 25.0\nroughness_m = 0.05"),
            "wind.roughness_m = 0.05: applies to profile = \"log\" only; remove it or set profile = \"log\"",
        );
        fails_with(
            &with(
                "reference_speed_m_s = 25.0",
                "reference_speed_m_s = 25.0\nair_density_kg_m3 = -1.25",
            ),
            "wind.air_density_kg_m3 = -1.25: must be > 0",
        );
        fails_with(
            &with(
                "reference_speed_m_s = 25.0",
                "reference_speed_m_s = 25.0\nkinematic_viscosity_m2_s = 0.0",
            ),
            "wind.kinematic_viscosity_m2_s = 0: must be > 0",
        );
        let case = run(&log("roughness_m = 0.3")).expect("valid");
        assert_eq!(
            case.wind.unwrap().profile,
            Profile::Log {
                roughness_m: 0.3,
                z_min_m: 5.0
            }
        );
    }

    #[test]
    fn z_min_defaults_follow_en1991_1_4_table_4_1() {
        // EN 1991-1-4 Table 4.1: z0 0.003/0.01/0.05/0.3/1.0 m -> z_min 1/1/2/5/10 m.
        assert_eq!(default_z_min_m(0.003), 1.0);
        assert_eq!(default_z_min_m(0.01), 1.0);
        assert_eq!(default_z_min_m(0.05), 2.0);
        assert_eq!(default_z_min_m(0.3), 5.0);
        assert_eq!(default_z_min_m(1.0), 10.0);
        // Nearest in log scale: 0.1 is nearer 0.05 (ratio 2) than 0.3 (ratio 3).
        assert_eq!(default_z_min_m(0.1), 2.0);
        assert_eq!(default_z_min_m(0.2), 5.0);
        assert_eq!(default_z_min_m(2.0), 10.0);
    }

    #[test]
    fn vortex_rules() {
        let v = |body: &str| append(&format!("[vortex]\n{body}"));
        fails_with(
            &v("strouhal = 1.0"),
            "vortex.strouhal = 1: must be between 0 and 1 (exclusive)",
        );
        fails_with(
            &v("log_decrement = 0.0"),
            "vortex.log_decrement = 0: must be between 0 and 1 (exclusive)",
        );
        fails_with(
            &v("damping_ratio = 1.5"),
            "vortex.damping_ratio = 1.5: must be between 0 and 1 (exclusive)",
        );
        fails_with(&v("modes = 0"), "vortex.modes = 0: must be 1 to 20");
        fails_with(&v("modes = 21"), "vortex.modes = 21: must be 1 to 20");
        fails_with(
            &v("design_life_years = 0"),
            "vortex.design_life_years = 0: must be > 0",
        );
        fails_with(
            &v("[vortex.group]\ncount = 1\nspacing_m = 40.0"),
            "vortex.group.count = 1: must be at least 2 (the stack and one neighbour)",
        );
        fails_with(
            &v("[vortex.group]\ncount = 3\nspacing_m = 0.0"),
            "vortex.group.spacing_m = 0: must be > 0",
        );
        let case = run(&v(
            "method = \"gb50009-h1\"\nmodes = 5\n[vortex.group]\ncount = 3\nspacing_m = 40.0",
        ))
        .expect("valid");
        assert_eq!(case.vortex.method, VortexMethod::Gb50009H1);
        assert_eq!(case.vortex.modes, 5);
        assert_eq!(
            case.vortex.group,
            Some(Group {
                count: 3,
                spacing_m: 40.0,
                arrangement: Arrangement::InLine
            })
        );
    }

    #[test]
    fn criteria_and_model_rules() {
        fails_with(
            &append("[criteria]\ntip_amplitude_m = 0.0"),
            "criteria.tip_amplitude_m = 0: must be > 0",
        );
        fails_with(
            &append("[criteria]\nstress_mpa = -3"),
            "criteria.stress_mpa = -3: must be > 0",
        );
        let m = |extra: &str| {
            append(&format!(
                "[model]\nelastic_modulus_gpa = 3.0\ndensity_kg_m3 = 1200.0\n{extra}"
            ))
        };
        fails_with(
            &m("max_blockage = 0.6"),
            "model.max_blockage = 0.6: must be at most 0.5",
        );
        fails_with(
            &m("length_scale = 0.0"),
            "model.length_scale = 0: must be > 0",
        );
        fails_with(
            &m("poisson_ratio = 0.5"),
            "model.poisson_ratio = 0.5: must be >= 0 and < 0.5",
        );
        fails_with(
            &m("tunnel_speed_min_m_s = 20.0\ntunnel_speed_max_m_s = 10.0"),
            "model.tunnel_speed_max_m_s = 10: must be above tunnel_speed_min_m_s (20 m/s)",
        );
    }

    #[test]
    fn every_problem_is_collected() {
        let text = with("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = -1.0")
            .replacen("wall_m = 0.30", "wall_m = 6.0", 1)
            .replacen("mass_kg = 10000.0", "mass_kg = -5.0", 1);
        let errs = run(&text).unwrap_err();
        assert_eq!(errs.len(), 3, "{errs:?}");
    }

    #[test]
    fn remedy_rules() {
        let case = run(&append(
            "[remedy.tmd]\nmode = 1\nmass_ratio = 0.02\n[remedy.strakes]\nfrom_z_m = 60.0\nto_z_m = 100.0\nc_lat_factor = 0.3",
        ))
        .expect("valid");
        let r = case.remedy.expect("remedy");
        assert_eq!(r.tmd.unwrap().mass, TmdMass::Ratio(0.02));
        let s = r.strakes.unwrap();
        assert_eq!(s.drag_coefficient, DEFAULT_STRAKES_DRAG_COEFFICIENT);
        fails_with(
            &append("[remedy.tmd]\nmode = 1\nmass_ratio = -1.0"),
            "remedy.tmd.mass_ratio = -1: must be > 0",
        );
        fails_with(
            &append("[remedy.tmd]\nmode = 4\nmass_kg = 1000.0"),
            "remedy.tmd.mode = 4: must be a checked mode, 1 to 3 (vortex.modes)",
        );
        fails_with(
            &append("[remedy.tmd]\nmode = 1\nmass_kg = 1000.0\nmass_ratio = 0.01"),
            "remedy.tmd: give exactly one of mass_ratio and mass_kg, not both",
        );
        fails_with(
            &append("[remedy.tmd]\nmode = 1\nmass_kg = 1000.0\nstage = \"nope\""),
            "remedy.tmd.stage = \"nope\": no such stage; the stages are \"shell only\", \"lined\"",
        );
        fails_with(
            &append("[remedy.strakes]\nfrom_z_m = 60.0\nto_z_m = 50.0\nc_lat_factor = 0.3"),
            "remedy.strakes.to_z_m = 50: must be above from_z_m (60 m)",
        );
        fails_with(
            &append("[remedy.strakes]\nfrom_z_m = 60.0\nto_z_m = 90.0\nc_lat_factor = 1.5"),
            "remedy.strakes.c_lat_factor = 1.5: must be between 0 and 1 (a factor that reduces c_lat)",
        );
    }
}
