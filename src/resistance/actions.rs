//! The design actions available to the resistance check, per stage, and the whole-case run.
//!
//! Today: each vortex mode's inertia moment (EN 1991-1-4 E.1.4, governing method, the
//! `loads` of [`crate::wind::ModeVortex`]) times gamma_Q of `[design]` (EN 1990 Table
//! A1.2(B): the inertia loads of E.1.4 are characteristic values of a wind action, so they
//! take the factor of a leading variable action; recommended 1.5, as in the public
//! implementations listed in data/reference/README.md). The
//! along-wind design moment (EN 1991-1-4 5.3 with c_s c_d, [`crate::along`]) and each mode's
//! combined case at the critical speed (sqrt(M_across^2 + M_along,crit^2), common practice)
//! are further [`ActionCurve`]s with the same gamma_Q ([`along_wind_actions`]); `extra` takes
//! any others as (stage name, curve).

use serde::Serialize;

use super::along_height::{check_stage, ActionCurve, FatigueAction, StageResistance};
use super::ResistanceError;
use crate::case::Case;
use crate::modal::StageModes;
use crate::wind::{StageVortex, VortexResults};

/// Source text of the vortex load factor.
pub const VORTEX_FACTOR_SOURCE: &str = "gamma_Q of [design] (EN 1990 Table A1.2(B), leading \
     variable action; the E.1.4 inertia loads are characteristic wind-action effects)";

/// Source text of the along-wind and combined-case load factor.
pub const ALONG_FACTOR_SOURCE: &str = "gamma_Q of [design] (EN 1990 Table A1.2(B), wind as the \
     leading variable action)";

/// The along-wind design moment of a stage and each mode's combined moment at its critical
/// speed, as characteristic action curves with gamma_Q.
pub fn along_wind_actions(along: &crate::along::StageAlongWind, gamma_q: f64) -> Vec<ActionCurve> {
    let mut out = vec![ActionCurve {
        name: "along-wind".into(),
        load_factor: gamma_q,
        factor_source: ALONG_FACTOR_SOURCE.to_string(),
        moment_nm: along.moment_nm.clone(),
    }];
    out.extend(along.modes.iter().map(|m| ActionCurve {
        name: format!("combined mode {}", m.mode),
        load_factor: gamma_q,
        factor_source: ALONG_FACTOR_SOURCE.to_string(),
        moment_nm: m.combined_moment_nm.clone(),
    }));
    out
}

/// Every stage's resistance check.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ResistanceResults {
    pub stages: Vec<StageResistance>,
    /// Sum over the stages of each stage's largest damage (conservative: the worst heights of
    /// different stages need not coincide).
    pub total_damage: f64,
}

impl ResistanceResults {
    /// Largest utilisation of any stage, height and action.
    pub fn max_utilisation(&self) -> f64 {
        self.stages
            .iter()
            .filter_map(|s| s.governing.as_ref().map(|g| g.utilisation))
            .fold(0.0, f64::max)
    }

    /// True when a utilisation or the damage exceeds 1.
    pub fn any_exceeds(&self) -> bool {
        self.max_utilisation() > 1.0
            || self.total_damage > 1.0
            || self.stages.iter().any(|s| s.damage > 1.0)
    }
}

/// The vortex moment curves of one stage: an action per mode with a response, and its
/// fatigue cycles.
pub fn vortex_actions(sv: &StageVortex, gamma_q: f64) -> (Vec<ActionCurve>, Vec<FatigueAction>) {
    let mut actions = Vec::new();
    let mut fatigue = Vec::new();
    for m in &sv.modes {
        if m.loads.is_empty() {
            continue;
        }
        let curve: Vec<(f64, f64)> = m.loads.iter().map(|l| (l.z_m, l.moment_nm)).collect();
        actions.push(ActionCurve {
            name: format!("vortex mode {}", m.mode),
            load_factor: gamma_q,
            factor_source: VORTEX_FACTOR_SOURCE.to_string(),
            moment_nm: curve.clone(),
        });
        if let Some(cycles) = m.governing_summary().fatigue_cycles {
            fatigue.push(FatigueAction {
                mode: m.mode,
                moment_amplitude_nm: curve,
                cycles,
            });
        }
    }
    (actions, fatigue)
}

/// A section that cannot carry its axial force, with where.
#[derive(Debug, Clone, PartialEq)]
pub struct StageFailure {
    pub stage: String,
    pub z_m: f64,
    pub error: ResistanceError,
}

/// Runs the check for every stage; `None` without `[reinforcement]`. `extra` adds further
/// action curves to the named stages.
pub fn check_case(
    case: &Case,
    stages: &[StageModes],
    vortex: &VortexResults,
    extra: &[(String, ActionCurve)],
) -> Result<Option<ResistanceResults>, StageFailure> {
    let Some(spec) = &case.resistance else {
        return Ok(None);
    };
    let mut out = Vec::with_capacity(stages.len());
    for sm in stages {
        let name = &sm.stage.name;
        let (mut actions, fatigue) = vortex
            .stages
            .iter()
            .find(|s| &s.stage == name)
            .map(|sv| vortex_actions(sv, spec.factors.gamma_q))
            .unwrap_or_default();
        actions.extend(
            extra
                .iter()
                .filter(|(s, _)| s == name)
                .map(|(_, a)| a.clone()),
        );
        let r = check_stage(
            name,
            spec,
            &sm.model,
            case.shell.elastic_modulus_pa,
            actions,
            &fatigue,
        )
        .map_err(|(z_m, error)| StageFailure {
            stage: name.clone(),
            z_m,
            error,
        })?;
        out.push(r);
    }
    let total_damage = out.iter().map(|s| s.damage).sum();
    Ok(Some(ResistanceResults {
        stages: out,
        total_damage,
    }))
}
