//! Validation of the `[remedy]` section: tuned mass damper and helical strakes.
//!
//! Units and sources as in the parent module.

use super::*;

/// A remedy's optional `stage` must name a stage of the case.
pub(super) fn check_remedy_stage(
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

pub(super) fn check_remedy(
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
