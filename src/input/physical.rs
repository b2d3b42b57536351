//! Bounds on sizes, masses and stiffnesses that pass the basic rules (finite, positive,
//! ordered) but describe no stack, give nonsense results or make the eigen-solver give up
//! (a 1e-9 m wall, a 1e20 kg point mass, a 1e-30 foundation spring). Each bound says what
//! it is and why in its message, and names the user's own key.
//!
//! Checked on the validated shell (so heights and sections are already consistent); the
//! stations are named as the user gave them (inline key path or CSV line).
//!
//! Units: SI (m, kg, N m/rad, N/m); the case file's GN m/rad and MN/m are converted here.

use super::issue::ValidationIssue;
use super::raw::RawCase;
use super::stations_csv::CsvStations;
use crate::case::Shell;

/// Tallest shell accepted, m: the tallest structures ever built are under 1 km and the
/// tallest chimneys about 420 m (from memory).
pub const MAX_HEIGHT_M: f64 = 1000.0;
/// Shortest shell or stage accepted, m. Absolute, and small, because `scale` runs its
/// wind-tunnel models (tens of cm to a few m) through the same rules; a 1 cm shell is
/// smaller than any aeroelastic model of a stack (common practice). Prototype stages are
/// held by the relative bound [`MIN_STAGE_FRACTION`] as well.
pub const MIN_HEIGHT_M: f64 = 0.01;
/// A stage's top must also reach this fraction of the complete shell's height: a stage of
/// under 1 % of the stack is a foundation ring (common practice).
pub const MIN_STAGE_FRACTION: f64 = 0.01;
/// Thinnest wall, m: 0.1 mm is thinner than any shell that can be cast or made as a
/// wind-tunnel model (RC chimney walls are rarely under 0.15 m, aeroelastic model walls
/// about 0.5-5 mm; common practice). The relative bound [`MAX_DIAMETER_PER_WALL`] keeps the
/// thin ring well conditioned at every size.
pub const MIN_WALL_M: f64 = 1e-4;
/// Largest diameter-to-wall ratio: beyond 1000 the shell is a membrane that ovalises
/// rather than bending as a beam (common practice); the beam model no longer applies.
pub const MAX_DIAMETER_PER_WALL: f64 = 1000.0;
/// Heaviest point mass as a multiple of the shell's own mass: platforms, flue ducts and
/// dampers weigh a fraction of the shell; beyond ten times the masses span too many decades
/// for the eigen-solver to keep its basis (common practice).
pub const MAX_POINT_MASS_PER_SHELL_MASS: f64 = 10.0;
/// Stage stiffness factor range (multiplier on E and G): a cracked RC section keeps a
/// large share of its stiffness (0.5-1.0 is common practice); outside 0.05-2 the factor is
/// no longer a cracking allowance.
pub const STIFFNESS_FACTOR_RANGE: (f64, f64) = (0.05, 2.0);
/// Foundation spring range, as the spring over the shell's own stiffness at the base
/// (k_rot H / EI, k_lat H^3 / (3 EI)). Wide on purpose: a spring in the wrong unit (MN/m
/// for GN/m, N m/rad for GN m/rad) still solves and gets a plausibility warning; only
/// below 1e-4 (the stack is a rigid body on the spring, the solver loses its basis) and
/// above 1e14 (stiffer than round-off can tell from a rigid base) is it refused. Bounds
/// found by running the solver across the range (our own measurement): 800 ratios from 1e-6
/// to 1e-1 on the demo and a uniform 60 m tube failed up to 5.6e-5 and never above 1e-4
/// (tests/input_spring_ratio_bound_solves.rs keeps the band above the bound solving).
pub const SPRING_RATIO_RANGE: (f64, f64) = (1e-4, 1e14);

/// A value in a form the user recognises (exponent form for huge or tiny ones).
pub(crate) fn shown(v: f64) -> String {
    let a = v.abs();
    if a != 0.0 && !(1e-4..1e6).contains(&a) {
        format!("{v:e}")
    } else {
        format!("{v}")
    }
}

/// The shell's own mass, kg (rings of mean diameter D - t, linear between stations).
pub fn shell_mass_kg(shell: &Shell) -> f64 {
    let area = |d: f64, t: f64| std::f64::consts::PI * (d - t) * t;
    shell
        .stations
        .windows(2)
        .map(|w| {
            let (a, b) = (w[0], w[1]);
            0.5 * (area(a.outer_diameter_m, a.wall_m) + area(b.outer_diameter_m, b.wall_m))
                * (b.z_m - a.z_m)
        })
        .sum::<f64>()
        * shell.density_kg_m3
}

/// Bending stiffness EI of the base section, N m2.
fn base_ei_nm2(shell: &Shell) -> f64 {
    let s = shell.stations[0];
    let inner = s.outer_diameter_m - 2.0 * s.wall_m;
    shell.elastic_modulus_pa * std::f64::consts::PI / 64.0
        * (s.outer_diameter_m.powi(4) - inner.powi(4))
}

/// Every bound above on a case whose shell passed its own rules.
pub fn check(raw: &RawCase, shell: &Shell, csv: Option<&CsvStations>) -> Vec<ValidationIssue> {
    let mut issues = Vec::new();
    let mut fail = |path: String, v: f64, rule: String| {
        issues.push(ValidationIssue::new(path, shown(v), rule));
    };
    let place = |i: usize, field: &str| match (raw.shell.stations.is_some(), csv) {
        (false, Some(c)) => match c.rows.get(i) {
            Some(r) => format!("{} line {}, column {field}", c.label, r.line),
            None => format!("{} station {i}, column {field}", c.label),
        },
        _ => format!("shell.stations[{i}].{field}"),
    };
    let h = shell.height_m();
    let top = shell.stations.len() - 1;
    if h > MAX_HEIGHT_M {
        fail(
            place(top, "z_m"),
            h,
            format!(
                "the shell's height must be at most {MAX_HEIGHT_M} m (the tallest structures \
                 ever built are under 1 km); is the height in mm?"
            ),
        );
    } else if h < MIN_HEIGHT_M {
        fail(
            place(top, "z_m"),
            h,
            format!(
                "the shell's height must be at least {MIN_HEIGHT_M} m (smaller than any \
                 wind-tunnel model of a stack); is the height in km?"
            ),
        );
    }
    // Every thin station is named: the user fixes all in one pass.
    for (i, st) in shell.stations.iter().enumerate() {
        let min_wall = MIN_WALL_M.max(st.outer_diameter_m / MAX_DIAMETER_PER_WALL);
        if st.wall_m < min_wall {
            fail(
                place(i, "wall_m"),
                st.wall_m,
                format!(
                    "the wall must be at least {} m here (at least {MIN_WALL_M} m, thinner \
                     than any shell that can be cast or modelled, and at least the outer diameter / \
                     {MAX_DIAMETER_PER_WALL}: a thinner shell is a membrane, not a beam)",
                    shown(min_wall)
                ),
            );
        }
    }
    let shell_mass = shell_mass_kg(shell);
    let max_mass = MAX_POINT_MASS_PER_SHELL_MASS * shell_mass;
    for (i, pm) in raw.point_mass.iter().enumerate() {
        if pm.mass_kg.is_finite() && pm.mass_kg > max_mass {
            fail(
                format!("point_mass[{i}].mass_kg"),
                pm.mass_kg,
                format!(
                    "must be at most {MAX_POINT_MASS_PER_SHELL_MASS} times the shell's own mass \
                     ({} kg); a heavier mass makes the eigen-problem ill-conditioned \
                     (platforms and dampers weigh a fraction of the shell)",
                    shown(max_mass.round())
                ),
            );
        }
    }
    let (flo, fhi) = STIFFNESS_FACTOR_RANGE;
    let min_top = MIN_HEIGHT_M.max(MIN_STAGE_FRACTION * h);
    for (i, s) in raw.stage.iter().flatten().enumerate() {
        if let Some(f) = s.stiffness_factor.filter(|f| f.is_finite() && *f > 0.0) {
            if !(flo..=fhi).contains(&f) {
                fail(
                    format!("stage[{i}].stiffness_factor"),
                    f,
                    format!(
                        "must be between {flo} and {fhi} (a multiplier on E for a cracked \
                         section, 0.5-1.0 in practice; beyond this range the stiffness is \
                         not a cracking allowance and the solver may give up)"
                    ),
                );
            }
        }
        if let Some(t) = s.top_z_m.filter(|t| t.is_finite() && *t > 0.0 && *t <= h) {
            if t < min_top {
                fail(
                    format!("stage[{i}].top_z_m"),
                    t,
                    format!(
                        "must be at least {} m ({MIN_HEIGHT_M} m and {} % of the shell's \
                         height {} m: a shorter stage is a footing, not a stack)",
                        shown(min_top),
                        MIN_STAGE_FRACTION * 100.0,
                        shown(h)
                    ),
                );
            }
        }
    }
    let ei = base_ei_nm2(shell);
    let (slo, shi) = SPRING_RATIO_RANGE;
    if let Some(b) = &raw.base {
        let springs = [
            (
                "base.rotational_stiffness_gnm_per_rad",
                b.rotational_stiffness_gnm_per_rad,
                1e9,
                ei / h,
                "EI / H",
            ),
            (
                "base.lateral_stiffness_mn_per_m",
                b.lateral_stiffness_mn_per_m,
                1e6,
                3.0 * ei / h.powi(3),
                "3 EI / H^3",
            ),
        ];
        for (path, v, to_si, own, own_name) in springs {
            let Some(v) = v.filter(|v| v.is_finite() && *v > 0.0) else {
                continue;
            };
            let ratio = v * to_si / own;
            if !(slo..=shi).contains(&ratio) {
                fail(
                    path.to_string(),
                    v,
                    format!(
                        "is {} times the shell's own stiffness at the base ({own_name} = {} in \
                         the same unit); it must be between {} and {} times: a softer \
                         spring makes the stack a rigid body and the eigen-problem \
                         ill-conditioned, a stiffer one is a rigid base (leave the key out)",
                        shown(ratio),
                        shown(own / to_si),
                        shown(slo),
                        shown(shi)
                    ),
                );
            }
        }
    }
    issues
}
