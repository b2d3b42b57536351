//! Plausibility rules: values that pass every hard rule of `validate` but that a practitioner
//! would want to be asked about, because they are the usual unit or key slips and some of
//! them turn a verdict to "ok". Each warning names the key, the value, the plausible range and
//! the likely slip; the input is never changed. Two of them are errors instead (exit 2):
//! stacks of a group closer than one base diameter (the shells would intersect) and, in
//! `scale`, a model blocking more than the whole test section (in `similitude`).
//!
//! The ranges are common practice for tall RC chimneys (see the design notes: E 25-40 GPa,
//! design life 50 years, structural log decrement of RC shells a few hundredths), widened so
//! that only slips are caught:
//! - concrete E 20-50 GPa (3.4 is a slip for 34, 340 for 34);
//! - first frequency >= 0.05 Hz (a 300 m RC chimney has f1 of about 0.2 Hz);
//! - rigid-body mode: a mode whose displacement comes almost entirely from the base springs
//!   (see [`RIGID_BODY_SHARE`]);
//! - a foundation spring more than [`RIGID_SPRING_RATIO`] times the shell's own base
//!   stiffness is numerically rigid (a value in N m/rad typed into the GN m/rad key);
//! - mean reference wind speed <= 55 m/s (the strongest 10-minute mean speeds of design
//!   codes stay below ~50 m/s; 94 is a km/h value; over 100 m/s is an error in `validate`);
//! - log_decrement 0.01-0.3 (below: a damping ratio typed for it, delta = 2 pi zeta);
//! - design_life_years <= 200;
//! - stages (wind checks only): a stage without `duration_years` whose shell is not complete,
//!   or which leaves out the case's lining, is judged as in service (50-year wind, cycles over
//!   the design life): it is asked about; a stage lasting longer than the design life, and a
//!   stage log_decrement outside 0.01-0.3, are asked about too;
//! - group spacing: closer than 1 base diameter an error, closer than 3 a warning (the
//!   in-line rule's range, EN 1991-1-4 Annex E, from memory: 1 <= a/b, with the interference
//!   of close stacks not covered well below a/b = 3; common practice).
//!
//! Units: SI inside; messages show the value as written in the case file.

use crate::case::{Case, Shell, Vortex};
use crate::modal::StageModes;
use crate::section::Annulus;

use super::issue::ValidationIssue;
use super::validate::num;

/// Plausible concrete modulus, GPa (common practice, widened).
pub const CONCRETE_E_GPA: (f64, f64) = (20.0, 50.0);
/// Lowest plausible first natural frequency, Hz (common practice).
pub const MIN_FIRST_FREQUENCY_HZ: f64 = 0.05;
/// A mode is "essentially rigid-body motion on the springs" when at least this share of its
/// largest displacement comes from the base: with u(z) the mode and u_rb(z) = u(0) +
/// theta(0) z the rigid-body motion of the base's translation and rotation, the share is
/// 1 - max |u - u_rb| / max |u| (our own rule; a well-founded stack on a raft or piles has
/// shares of a few tens of percent at most).
pub const RIGID_BODY_SHARE: f64 = 0.95;
/// A spring is numerically rigid when k_theta H / EI_base or k_lat H^3 / (3 EI_base)
/// exceeds this: its flexibility then changes the frequencies by about 1e-8 relative or
/// less, below what any input number carries (our own rule).
pub const RIGID_SPRING_RATIO: f64 = 1e8;
/// Highest plausible mean (10-minute) reference wind speed, m/s (common practice).
pub const MAX_REFERENCE_SPEED_M_S: f64 = 55.0;
/// Plausible structural log decrement (common practice, widened).
pub const LOG_DECREMENT: (f64, f64) = (0.01, 0.3);
/// Longest plausible design life, years (common practice).
pub const MAX_DESIGN_LIFE_YEARS: f64 = 200.0;
/// Group spacing / base diameter below which the in-line rule is stretched (warning).
pub const MIN_GROUP_SPACING_RATIO: f64 = 3.0;

/// Hard errors found only by comparing sections: a group spacing below the base diameter.
pub fn group_errors(shell: &Shell, vortex: &Vortex) -> Vec<ValidationIssue> {
    let Some(g) = vortex.group else {
        return Vec::new();
    };
    let d = shell.stations[0].outer_diameter_m;
    if g.spacing_m < d {
        vec![ValidationIssue::new(
            "vortex.group.spacing_m",
            num(g.spacing_m),
            format!(
                "closer than the base diameter ({} m): the shells would intersect; give the \
                 centre-to-centre spacing in metres",
                num(d)
            ),
        )]
    } else {
        Vec::new()
    }
}

/// Warnings on the case itself (no analysis needed).
pub fn case_warnings(case: &Case) -> Vec<String> {
    let mut out = Vec::new();
    let e_gpa = case.shell.elastic_modulus_pa / 1e9;
    if !(CONCRETE_E_GPA.0..=CONCRETE_E_GPA.1).contains(&e_gpa) {
        out.push(format!(
            "shell.elastic_modulus_gpa = {}: outside the plausible {}-{} GPa of structural \
             concrete; a slipped decimal point (3.4 or 340 for 34)?",
            num(e_gpa),
            CONCRETE_E_GPA.0,
            CONCRETE_E_GPA.1
        ));
    }
    for (i, z) in case.shell.zones.iter().enumerate() {
        if let Some(e) = z.elastic_modulus_pa.map(|e| e / 1e9) {
            if !(CONCRETE_E_GPA.0..=CONCRETE_E_GPA.1).contains(&e) {
                out.push(format!(
                    "shell.zone[{i}].elastic_modulus_gpa = {}: outside the plausible {}-{} GPa \
                     of structural concrete; a slipped decimal point (3.4 or 340 for 34)?",
                    num(e),
                    CONCRETE_E_GPA.0,
                    CONCRETE_E_GPA.1
                ));
            }
        }
    }
    if let Some(w) = &case.wind {
        if w.reference_speed_m_s > MAX_REFERENCE_SPEED_M_S {
            out.push(format!(
                "wind.reference_speed_m_s = {}: above the plausible {} m/s for a mean \
                 (10-minute) speed; a km/h value ({} km/h = {:.1} m/s)?",
                num(w.reference_speed_m_s),
                MAX_REFERENCE_SPEED_M_S,
                num(w.reference_speed_m_s),
                w.reference_speed_m_s / 3.6
            ));
        }
    }
    let delta = case.vortex.log_decrement;
    if delta < LOG_DECREMENT.0 {
        out.push(format!(
            "vortex.log_decrement = {}: below the plausible {}-{}; a damping ratio typed for \
             the log decrement (delta = 2 pi zeta: zeta = {} is delta = {:.4})?",
            num(delta),
            LOG_DECREMENT.0,
            LOG_DECREMENT.1,
            num(delta),
            2.0 * std::f64::consts::PI * delta
        ));
    } else if delta > LOG_DECREMENT.1 {
        out.push(format!(
            "vortex.log_decrement = {}: above the plausible {}-{} of a structure's own \
             damping; a percentage, or damping of a device added to the structure's?",
            num(delta),
            LOG_DECREMENT.0,
            LOG_DECREMENT.1
        ));
    }
    if case.vortex.design_life_years > MAX_DESIGN_LIFE_YEARS {
        out.push(format!(
            "vortex.design_life_years = {}: above the plausible {} years; days or months \
             typed for years?",
            num(case.vortex.design_life_years),
            MAX_DESIGN_LIFE_YEARS
        ));
    }
    if let Some(g) = case.vortex.group {
        let d = case.shell.stations[0].outer_diameter_m;
        let ratio = g.spacing_m / d;
        if (1.0..MIN_GROUP_SPACING_RATIO).contains(&ratio) {
            out.push(format!(
                "vortex.group.spacing_m = {}: {:.2} base diameters ({} m), closer than the \
                 {} diameters the in-line group rule is meant for; the interference of so \
                 close a group needs a wind-tunnel study",
                num(g.spacing_m),
                ratio,
                num(d),
                MIN_GROUP_SPACING_RATIO
            ));
        }
    }
    out.extend(spring_warnings(case));
    out.extend(base_inertia_warnings(case));
    out
}

/// A foundation mass or rotary inertia on a base that cannot move that way is ignored.
fn base_inertia_warnings(case: &Case) -> Vec<String> {
    let b = case.base_inertia;
    let lateral = case.base.and_then(|s| s.lateral_n_per_m).is_some();
    let rotational = case.base.and_then(|s| s.rotational_nm_per_rad).is_some();
    let why = |spring: &str| match case.base {
        None => "the base is fixed (no [base] springs)".to_string(),
        Some(_) => format!("the base is rigid in that direction (no base.{spring})"),
    };
    let mut out = Vec::new();
    if b.mass_kg > 0.0 && !lateral {
        out.push(format!(
            "base.mass_kg = {}: ignored, {}; the foundation mass moves only with a lateral              spring",
            num(b.mass_kg),
            why("lateral_stiffness_mn_per_m")
        ));
    }
    if b.rotary_inertia_kg_m2 > 0.0 && !rotational {
        out.push(format!(
            "base.rotary_inertia_kg_m2 = {}: ignored, {}; the foundation's rotary inertia              moves only with a rotational spring",
            num(b.rotary_inertia_kg_m2),
            why("rotational_stiffness_gnm_per_rad")
        ));
    }
    out
}

/// Warnings about the stages' durations and damping, for the commands that run wind checks.
pub fn stage_warnings(case: &Case) -> Vec<String> {
    let mut out = Vec::new();
    let h = case.shell.height_m();
    let life = case.vortex.design_life_years;
    for s in &case.stages {
        let partial = s.height_m(&case.shell) < h;
        let unlined = !s.lining && !case.linings.is_empty();
        match s.duration_years {
            None if partial || unlined => out.push(format!(
                "stage {:?} ({}): judged as in service; give duration_years for a construction \
                 stage",
                s.name,
                if partial {
                    "shell not complete"
                } else {
                    "lining not installed"
                }
            )),
            Some(d) if d > life => out.push(format!(
                "stage {:?}: duration_years = {} is longer than vortex.design_life_years = {}; \
                 leave duration_years out for an in-service stage",
                s.name,
                num(d),
                num(life)
            )),
            _ => {}
        }
        if let Some(delta) = s.log_decrement {
            if !(LOG_DECREMENT.0..=LOG_DECREMENT.1).contains(&delta) {
                out.push(format!(
                    "stage {:?}: log_decrement = {}: outside the plausible {}-{} of a \
                     structure's own damping (a damping ratio or a percentage?)",
                    s.name,
                    num(delta),
                    LOG_DECREMENT.0,
                    LOG_DECREMENT.1
                ));
            }
        }
    }
    out
}

/// Foundation springs so stiff that they are numerically rigid.
fn spring_warnings(case: &Case) -> Vec<String> {
    let Some(base) = case.base else {
        return Vec::new();
    };
    let st = case.shell.stations[0];
    let h = case.shell.height_m();
    let ei = case.shell.elastic_modulus_pa
        * Annulus::new(st.outer_diameter_m, st.wall_m).second_moment_m4();
    let mut out = Vec::new();
    let rigid = |ratio: f64, key: &str, value: f64, si: &str, factor: f64| {
        format!(
            "base.{key} = {}: {ratio:.1e} times the shell's own base stiffness, numerically rigid: the \
             model treats it as rigid in effect (the base does not move to round-off; the \
             frequencies equal a fixed base's to about 1e-8); was it typed in {si} \
             ({} {si} = {} in this key)?",
            num(value),
            num(value),
            num(value / factor)
        )
    };
    if let Some(k) = base.rotational_nm_per_rad {
        let ratio = k * h / ei;
        if ratio > RIGID_SPRING_RATIO {
            out.push(rigid(
                ratio,
                "rotational_stiffness_gnm_per_rad",
                k / 1e9,
                "N m/rad",
                1e9,
            ));
        }
    }
    if let Some(k) = base.lateral_n_per_m {
        let ratio = k * h.powi(3) / (3.0 * ei);
        if ratio > RIGID_SPRING_RATIO {
            out.push(rigid(
                ratio,
                "lateral_stiffness_mn_per_m",
                k / 1e6,
                "N/m",
                1e6,
            ));
        }
    }
    out
}

/// Warnings on the modal results: a first frequency below 0.05 Hz, a mode that is essentially
/// rigid-body motion on the base springs.
pub fn modal_warnings(case: &Case, stages: &[StageModes]) -> Vec<String> {
    let mut out = Vec::new();
    let spring_keys = match case.base {
        Some(b) => match (b.rotational_nm_per_rad, b.lateral_n_per_m) {
            (Some(_), Some(_)) => {
                "base.rotational_stiffness_gnm_per_rad and base.lateral_stiffness_mn_per_m"
            }
            (Some(_), None) => "base.rotational_stiffness_gnm_per_rad",
            _ => "base.lateral_stiffness_mn_per_m",
        },
        None => "",
    };
    for s in stages {
        if let Some(m) = s.modes.first() {
            if m.frequency_hz < MIN_FIRST_FREQUENCY_HZ {
                out.push(format!(
                    "stage \"{}\": first frequency {:.4} Hz is below the plausible {} Hz of a \
                     tall RC stack; check E, the densities and the foundation springs (a spring \
                     in the wrong unit, e.g. 0.0094 MN/m)",
                    s.stage.name, m.frequency_hz, MIN_FIRST_FREQUENCY_HZ
                ));
            }
        }
        if case.base.is_none() {
            continue;
        }
        for m in &s.modes {
            let share = rigid_body_share(&s.model.z_m, &m.displacement, &m.rotation_per_m);
            if share >= RIGID_BODY_SHARE {
                out.push(format!(
                    "stage \"{}\" mode {}: {:.0} % of the mode's displacement is rigid-body \
                     motion on the foundation springs (plausible: well below {:.0} %); are \
                     {spring_keys} in their units (GN m/rad, MN/m)?",
                    s.stage.name,
                    m.number,
                    100.0 * share,
                    100.0 * RIGID_BODY_SHARE
                ));
            }
        }
    }
    out
}

/// The share of a mode's largest displacement that is rigid-body motion of the base:
/// 1 - max |u - (u_0 + theta_0 z)| / max |u| (see [`RIGID_BODY_SHARE`]).
pub fn rigid_body_share(z_m: &[f64], displacement: &[f64], rotation: &[f64]) -> f64 {
    let (Some(&u0), Some(&t0)) = (displacement.first(), rotation.first()) else {
        return 0.0;
    };
    let max_u = displacement.iter().fold(0.0_f64, |a, u| a.max(u.abs()));
    if max_u <= 0.0 {
        return 0.0;
    }
    let max_elastic = z_m
        .iter()
        .zip(displacement)
        .fold(0.0_f64, |a, (z, u)| a.max((u - (u0 + t0 * z)).abs()));
    1.0 - max_elastic / max_u
}

/// `scale --measured`: converted tip amplitudes larger than the prototype's top diameter
/// (model amplitudes in mm typed into a column in m).
pub fn measured_amplitude_warnings(
    amplitudes_m: &[(usize, f64)],
    prototype_top_diameter_m: f64,
) -> Vec<String> {
    let rows: Vec<String> = amplitudes_m
        .iter()
        .filter(|(_, a)| a.abs() > prototype_top_diameter_m)
        .map(|(line, a)| format!("line {line}: {a:.3} m"))
        .collect();
    if rows.is_empty() {
        return Vec::new();
    }
    vec![format!(
        "measured tip_amplitude_m converted to the prototype exceeds the prototype's top \
         diameter {prototype_top_diameter_m:.2} m (plausible: a fraction of it) at {}; were \
         the model amplitudes given in mm instead of m?",
        rows.join(", ")
    )]
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rigid_body_share_of_pure_and_elastic_shapes() {
        let z = [0.0, 50.0, 100.0];
        // Pure rigid rotation about the base: share 1.
        assert!((rigid_body_share(&z, &[0.0, 0.5, 1.0], &[0.01, 0.01, 0.01]) - 1.0).abs() < 1e-12);
        // Fixed-base shape: share 0.
        assert_eq!(
            rigid_body_share(&z, &[0.0, 0.3, 1.0], &[0.0, 0.01, 0.02]),
            0.0
        );
        // Base translation 0.2 of a tip 1.0, no rotation: share 0.2.
        assert!((rigid_body_share(&z, &[0.2, 0.5, 1.0], &[0.0, 0.0, 0.0]) - 0.2).abs() < 1e-12);
    }
}
