//! Validation of the `[[stage]]` tables and the default stages, and of the stage names
//! a `[[point_mass]]` lists in `stages`.
//!
//! Rules of the per-stage wind, duration and damping: `duration_years` > 0;
//! `return_period_years` > 1 (EN 1991-1-4 (4.2) takes p = 1 / return period, which must be
//! below 1); `log_decrement` between 0 and 1 like `vortex.log_decrement`. A point mass listed
//! for a stage must lie at or below that stage's top. Units and sources as in the parent
//! module.

use super::*;

pub(super) fn check_stages(c: &mut Checker, raw: &RawCase, height_m: Option<f64>) -> Vec<Stage> {
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
        if let Some(d) = s.duration_years {
            ok &= c.positive(&format!("{p}.duration_years"), d);
        }
        if let Some(t) = s.return_period_years {
            let path = format!("{p}.return_period_years");
            ok &= c.finite(&path, t)
                && (t > 1.0
                    || c.fail(
                        &path,
                        t,
                        "must be > 1 year (EN 1991-1-4 (4.2) uses p = 1 / return period, which \
                         must be below 1)",
                    ));
        }
        if let Some(d) = s.log_decrement {
            ok &= c.open(&format!("{p}.log_decrement"), d, 0.0, 1.0);
        }
        if ok {
            stages.push(Stage {
                name,
                lining: s.lining,
                stiffness_factor: factor,
                top_z_m: s.top_z_m,
                duration_years: s.duration_years,
                return_period_years: s.return_period_years,
                log_decrement: s.log_decrement,
            });
        }
    }
    stages
}

/// The stages used when the case file gives none: the shell alone and, when the case has
/// lining zones, the finished (lined) stack. Without lining the two would be the same
/// structure, so only the first is made.
pub fn default_stages(has_lining: bool) -> Vec<Stage> {
    let mut stages = vec![Stage::in_service("shell only", false)];
    if has_lining {
        stages.push(Stage::in_service("lined", true));
    }
    stages
}

/// The probability factor of every stage must come out finite and positive with the site's
/// K and n (EN 1991-1-4 (4.2): 1 - K ln(-ln(1 - p)) > 0).
pub(super) fn check_stage_c_prob(c: &mut Checker, raw: &RawCase, stages: &[Stage], wind: &Wind) {
    for s in stages {
        let t = crate::wind::probability::stage_return_period_years(s);
        let f = crate::wind::probability::stage_c_prob(s, wind);
        if !(f.is_finite() && f > 0.0) {
            let i = raw
                .stage
                .as_ref()
                .and_then(|r| r.iter().position(|r| r.name.trim() == s.name));
            let path = i.map_or("wind.c_prob_k".to_string(), |i| {
                format!("stage[{i}].return_period_years")
            });
            c.fail(
                path,
                t,
                format!(
                    "gives c_prob = {} with wind.c_prob_k = {} and wind.c_prob_n = {} \
                     (EN 1991-1-4 (4.2)); it must be finite and > 0",
                    num(f),
                    num(wind.c_prob_k),
                    num(wind.c_prob_n)
                ),
            );
        }
    }
}

/// `point_mass[i].stages`: every name is a stage of the case (given or default), and a mass
/// lies at or below the top of every stage it is present in. `stages` are the stages that
/// passed validation; `all_stages_valid` says whether that is all of them (an unknown name is
/// only reported when every stage could be read, so a broken stage does not cause a second,
/// misleading error).
pub(super) fn check_point_mass_stages(
    c: &mut Checker,
    raw: &RawCase,
    stages: &[Stage],
    all_stages_valid: bool,
    shell: Option<&Shell>,
) {
    let listed = || {
        stages
            .iter()
            .map(|s| format!("{:?}", s.name))
            .collect::<Vec<_>>()
            .join(", ")
    };
    for (i, pm) in raw.point_mass.iter().enumerate() {
        let p = format!("point_mass[{i}]");
        if let Some(names) = &pm.stages {
            if names.is_empty() {
                c.key(
                    format!("{p}.stages"),
                    "empty: name at least one stage, or leave stages out for every stage",
                );
            }
            for (j, name) in names.iter().enumerate() {
                if all_stages_valid && !stages.iter().any(|s| s.name == name.trim()) {
                    c.issues.push(ValidationIssue::new(
                        format!("{p}.stages[{j}]"),
                        format!("{name:?}"),
                        format!("no stage of that name (stages: {})", listed()),
                    ));
                }
            }
        }
        let (Some(shell), true) = (shell, pm.z_m.is_finite()) else {
            continue;
        };
        for s in stages {
            let present = pm
                .stages
                .as_ref()
                .is_none_or(|names| names.iter().any(|n| n.trim() == s.name));
            let top = s.height_m(shell);
            if present && pm.z_m > top && pm.z_m <= shell.height_m() {
                c.fail(
                    format!("{p}.z_m"),
                    pm.z_m,
                    format!(
                        "above the top of stage {:?} ({} m), where the mass is present; give \
                         {p}.stages = [...] naming only the stages that carry it",
                        s.name,
                        num(top)
                    ),
                );
            }
        }
    }
}
