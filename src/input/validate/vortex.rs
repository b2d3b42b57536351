//! Validation of the `[vortex]` section: method, Strouhal number, damping, design life.
//!
//! Units and sources as in the parent module.

use super::*;

pub(super) fn check_vortex(c: &mut Checker, v: &RawVortex) -> Option<Vortex> {
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
