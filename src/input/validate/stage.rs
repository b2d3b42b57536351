//! Validation of the `[[stage]]` tables and the default stages.
//!
//! Units and sources as in the parent module.

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
