//! Remedies for modes that lock in with too large a response, each re-checked with the same
//! EN 1991-1-4 Annex E functions as the check and reported next to the unmitigated result:
//!
//! * [`required`]: the structural log decrement (and Scruton number) that meets the user's
//!   criteria, per approach, for every failing mode (computed whenever a mode fails);
//! * [`tmd`]: a tuned mass damper on one mode (`[remedy.tmd]`), Den Hartog tuning, equivalent
//!   added damping, placement at the antinode, the damper's stroke;
//! * [`strakes`]: helical strakes over a height range (`[remedy.strakes]`), the user's factor
//!   on c_lat, the EN condition on Sc, the along-wind drag coefficient for the designer.
//!
//! Pure: results are plain serialisable data for tables, CSV and the design note.
//! Units: SI (m, kg, Pa, Hz); decrements and ratios dimensionless.

pub mod recheck;
pub mod required;
pub mod strakes;
pub mod tmd;

use std::f64::consts::PI;

use serde::Serialize;

use crate::case::{Case, TmdMass, VortexMethod};
use crate::modal::StageModes;
use crate::wind::{Verdict, VortexResults};

use recheck::ModeContext;
pub use required::Required;

/// A mode's response and verdict (before or after a remedy), all by one method.
#[derive(Debug, Clone, Serialize)]
pub struct Outcome {
    /// The EN 1991-1-4 Annex E approach that gives `tip_amplitude_m`, `max_stress_pa` and
    /// `verdict`.
    pub method: VortexMethod,
    /// Structural log decrement used (with any added damping).
    pub log_decrement: f64,
    pub scruton: f64,
    /// Approach 1 / 2 tip amplitudes, m (`None` = not computed).
    pub approach1_tip_amplitude_m: Option<f64>,
    pub approach2_tip_amplitude_m: Option<f64>,
    /// Tip amplitude and largest stress by `method`, m and Pa.
    pub tip_amplitude_m: Option<f64>,
    pub max_stress_pa: Option<f64>,
    pub verdict: Verdict,
}

/// Required structural damping of one failing mode.
#[derive(Debug, Clone, Serialize)]
pub struct RequiredDamping {
    pub stage: String,
    pub mode: usize,
    /// The unmitigated result by approach 1 (the "before" of the approach 1 row).
    pub approach1_before: Outcome,
    /// The unmitigated result by approach 2 (the "before" of the approach 2 row).
    pub approach2_before: Outcome,
    pub approach1: Required,
    pub approach2: Required,
}

/// A tuned mass damper on one mode of one stage.
#[derive(Debug, Clone, Serialize)]
pub struct TmdResult {
    pub stage: String,
    pub mode: usize,
    /// mu = m_tmd / M_modal, the modal mass with the shape normalised to 1 at the damper.
    pub mass_ratio: f64,
    pub mass_kg: f64,
    pub modal_mass_kg: f64,
    /// Damper location: the mode's largest antinode, m.
    pub location_z_m: f64,
    /// Den Hartog f_tmd / f_mode.
    pub frequency_ratio: f64,
    pub tmd_frequency_hz: f64,
    /// Den Hartog damper damping ratio.
    pub tmd_damping_ratio: f64,
    pub spring_stiffness_n_m: f64,
    pub damper_coefficient_n_s_m: f64,
    /// Equivalent viscous damping ratio added to the mode (equal-peak idealisation).
    pub equivalent_damping_ratio: f64,
    pub added_log_decrement: f64,
    pub before: Outcome,
    pub after: Outcome,
    /// Damper stroke per unit main amplitude at the mode's frequency (2-dof steady state).
    pub stroke_per_main: f64,
    /// Peak relative displacement of the damper mass, m.
    pub stroke_m: Option<f64>,
}

/// Helical strakes, one mode of one stage.
#[derive(Debug, Clone, Serialize)]
pub struct StrakesResult {
    pub stage: String,
    pub mode: usize,
    pub from_z_m: f64,
    pub to_z_m: f64,
    /// User input (EN 1991-1-4 gives no value).
    pub c_lat_factor: f64,
    /// Fraction of int_Lj |Phi| on the straked range, at the re-checked L_j.
    pub coverage: f64,
    pub effective_c_lat_factor: f64,
    /// EN 1991-1-4 credits strakes only for Sc > 8 (from memory).
    pub en_condition_met: bool,
    /// Along-wind force coefficient over the straked part, for the along-wind design.
    pub drag_coefficient: f64,
    pub before: Outcome,
    /// Re-checked response (approach 1; approach 2 has no c_lat). When the EN condition is
    /// not met the verdict is the unmitigated one (no credit).
    pub after: Outcome,
}

/// Everything the remedies found.
#[derive(Debug, Clone, Default, Serialize)]
pub struct RemedyResults {
    pub required_damping: Vec<RequiredDamping>,
    pub tmd: Vec<TmdResult>,
    pub strakes: Vec<StrakesResult>,
    pub warnings: Vec<String>,
}

/// One row of remedy.csv and of the remedy table.
#[derive(Debug, Clone, Serialize)]
pub struct RemedyRow {
    pub stage: String,
    pub mode: usize,
    pub remedy: String,
    pub log_decrement: Option<f64>,
    pub scruton: Option<f64>,
    pub tip_amplitude_before_m: Option<f64>,
    pub tip_amplitude_after_m: Option<f64>,
    pub max_stress_before_pa: Option<f64>,
    pub max_stress_after_pa: Option<f64>,
    pub verdict_before: String,
    pub verdict_after: String,
    pub note: String,
}

fn outcome_of(ctx: &ModeContext, delta: f64, y1: Option<f64>, y2: Option<f64>) -> Outcome {
    let method = ctx.governing_en();
    let y = match method {
        VortexMethod::En1991E2 => y2,
        _ => y1,
    };
    let (tip, stress, verdict) = match y {
        Some(y) => {
            let r = ctx.effects(y);
            (r.tip_amplitude_m, r.max_stress_pa, ctx.judge(y))
        }
        None => (None, None, ctx.checked.verdict.clone()),
    };
    Outcome {
        method,
        log_decrement: delta,
        scruton: ctx.scruton(delta),
        approach1_tip_amplitude_m: y1.map(|y| y * ctx.tip_per_antinode),
        approach2_tip_amplitude_m: y2.map(|y| y * ctx.tip_per_antinode),
        tip_amplitude_m: tip,
        max_stress_pa: stress,
        verdict,
    }
}

/// The check's own (unmitigated) result for a mode by one EN approach, as an [`Outcome`]:
/// tip, stress and verdict all from `method`, whichever method governs the check. A
/// screened-out mode keeps the check's verdict.
fn checked_outcome(ctx: &ModeContext, method: VortexMethod) -> Outcome {
    let m = ctx.checked;
    let y = match method {
        VortexMethod::En1991E2 => m.approach2.as_ref().map(|a| a.y_max_m),
        _ => m.approach1.as_ref().map(|a| a.y_max_m),
    };
    let (tip, stress, verdict) = match y {
        Some(y) => {
            let r = ctx.effects(y);
            (r.tip_amplitude_m, r.max_stress_pa, ctx.judge(y))
        }
        None => (None, None, m.verdict.clone()),
    };
    Outcome {
        method,
        log_decrement: m.log_decrement,
        scruton: m.scruton,
        approach1_tip_amplitude_m: m.approach1.as_ref().map(|a| a.tip_amplitude_m),
        approach2_tip_amplitude_m: m.approach2.as_ref().map(|a| a.tip_amplitude_m),
        tip_amplitude_m: tip,
        max_stress_pa: stress,
        verdict,
    }
}

/// The label of an EN approach in remedy rows.
fn approach_name(method: VortexMethod) -> &'static str {
    match method {
        VortexMethod::En1991E2 => "approach 2",
        _ => "approach 1",
    }
}

fn stage_selected(wanted: &Option<String>, stage: &str) -> bool {
    wanted.as_deref().is_none_or(|w| w == stage)
}

/// Sizes and re-checks every remedy: required damping for each failing mode, and the
/// `[remedy]` devices of the case.
pub fn compute(case: &Case, stages: &[StageModes], vortex: &VortexResults) -> RemedyResults {
    let mut out = RemedyResults::default();
    let spec = case.remedy.as_ref();
    for (sm, sv) in stages.iter().zip(&vortex.stages) {
        for mv in &sv.modes {
            let Some(mode) = sm.modes.iter().find(|m| m.number == mv.mode) else {
                continue;
            };
            // Each stage is re-checked with its own design wind and damping.
            let ctx = ModeContext::new(case, &sv.climate.wind, &sm.model, mode, mv);
            let delta_s = mv.log_decrement;
            // Each remedy row compares like with like: the unmitigated result by the same
            // approach that re-checks the remedy.
            let before = checked_outcome(&ctx, ctx.governing_en());

            if mv.verdict.is_exceeds() && !mv.screened_out {
                out.required_damping.push(RequiredDamping {
                    stage: sv.stage.clone(),
                    mode: mv.mode,
                    approach1_before: checked_outcome(&ctx, VortexMethod::En1991E1),
                    approach2_before: checked_outcome(&ctx, VortexMethod::En1991E2),
                    approach1: required::required(&ctx, |d| ctx.approach1_y_m(d, |_| 1.0)),
                    approach2: required::required(&ctx, |d| ctx.approach2_y_m(d)),
                });
            }

            if let Some(t) = spec.and_then(|s| s.tmd.as_ref()) {
                if t.mode == mv.mode && stage_selected(&t.stage, &sv.stage) {
                    out.tmd
                        .push(tmd_result(&ctx, t.mass, before.clone(), &mut out.warnings));
                }
            }
            if let Some(s) = spec.and_then(|s| s.strakes.as_ref()) {
                if stage_selected(&s.stage, &sv.stage) && !mv.screened_out {
                    let (from, to) = (s.from_z_m, s.to_z_m.min(sm.model.height_m()));
                    if to <= from {
                        out.warnings.push(format!(
                            "stage \"{}\": strakes ({from}-{} m) lie above the stage top; not applied",
                            sv.stage, s.to_z_m
                        ));
                        continue;
                    }
                    let z_a = mv.reference_height_m;
                    let factor = |l: f64| {
                        strakes::effective_factor(
                            strakes::coverage(&ctx.shape, z_a, l, from, to),
                            s.c_lat_factor,
                        )
                    };
                    let y1 = ctx.approach1_y_m(delta_s, factor);
                    let l = mv.diameter_m
                        * crate::wind::approach1::correlation_length_per_diameter(
                            y1 / mv.diameter_m,
                        );
                    let w = strakes::coverage(&ctx.shape, z_a, l, from, to);
                    let met = mv.scruton > strakes::MIN_SCRUTON_FOR_STRAKES;
                    let mut after = outcome_of(&ctx, delta_s, Some(y1), None);
                    // Approach 2 has no c_lat: the straked response (and so its "before") is
                    // approach 1 whatever governs.
                    after.method = VortexMethod::En1991E1;
                    let r = ctx.effects(y1);
                    after.tip_amplitude_m = r.tip_amplitude_m;
                    after.max_stress_pa = r.max_stress_pa;
                    after.verdict = ctx.judge(y1);
                    if !met {
                        let unmitigated = checked_outcome(&ctx, VortexMethod::En1991E1);
                        out.warnings.push(format!(
                            "stage \"{}\" mode {}: Sc = {:.1} <= 8: EN 1991-1-4 does not credit strakes (from memory); the straked response is shown but the verdict stays unmitigated",
                            sv.stage, mv.mode, mv.scruton
                        ));
                        after.verdict = unmitigated.verdict;
                    }
                    out.strakes.push(StrakesResult {
                        stage: sv.stage.clone(),
                        mode: mv.mode,
                        from_z_m: from,
                        to_z_m: to,
                        c_lat_factor: s.c_lat_factor,
                        coverage: w,
                        effective_c_lat_factor: strakes::effective_factor(w, s.c_lat_factor),
                        en_condition_met: met,
                        drag_coefficient: s.drag_coefficient,
                        before: checked_outcome(&ctx, VortexMethod::En1991E1),
                        after,
                    });
                }
            }
        }
    }
    if let Some(t) = spec.and_then(|s| s.tmd.as_ref()) {
        if out.tmd.is_empty() {
            out.warnings.push(format!(
                "[remedy.tmd]: mode {} was not checked in any selected stage; no damper sized",
                t.mode
            ));
        }
    }
    out
}

fn tmd_result(
    ctx: &ModeContext,
    mass: TmdMass,
    before: Outcome,
    warnings: &mut Vec<String>,
) -> TmdResult {
    let mv = ctx.checked;
    let modal = ctx.mode.modal_mass_kg;
    let (mu, kg) = match mass {
        TmdMass::Ratio(mu) => (mu, mu * modal),
        TmdMass::Kg(kg) => (kg / modal, kg),
    };
    if mu > crate::input::validate::MAX_TMD_MASS_RATIO {
        warnings.push(format!(
            "stage \"{}\" mode {}: TMD mass ratio {mu:.3} is large; Den Hartog's tuning is a small-mass-ratio result",
            mv.stage, mv.mode
        ));
    }
    let f_ratio = tmd::den_hartog_frequency_ratio(mu);
    let zeta_tmd = tmd::den_hartog_damping_ratio(mu);
    let zeta_eq = tmd::equivalent_damping_ratio(mu);
    let added = 2.0 * PI * zeta_eq;
    let delta_s = mv.log_decrement;
    let delta = delta_s + added;
    let f_tmd = f_ratio * mv.frequency_hz;
    let omega = 2.0 * PI * f_tmd;
    let (after, y_after) = if mv.screened_out {
        (before.clone(), None)
    } else {
        let y1 = ctx.approach1_y_m(delta, |_| 1.0);
        let y2 = ctx.approach2_y_m(delta);
        let y = match ctx.governing_en() {
            VortexMethod::En1991E2 => y2,
            _ => y1,
        };
        (outcome_of(ctx, delta, Some(y1), Some(y2)), Some(y))
    };
    let stroke_per_main =
        tmd::two_dof(1.0, mu, f_ratio, zeta_tmd, delta_s / (2.0 * PI)).stroke_per_main;
    TmdResult {
        stage: mv.stage.clone(),
        mode: mv.mode,
        mass_ratio: mu,
        mass_kg: kg,
        modal_mass_kg: modal,
        location_z_m: mv.reference_height_m,
        frequency_ratio: f_ratio,
        tmd_frequency_hz: f_tmd,
        tmd_damping_ratio: zeta_tmd,
        spring_stiffness_n_m: kg * omega * omega,
        damper_coefficient_n_s_m: 2.0 * zeta_tmd * kg * omega,
        equivalent_damping_ratio: zeta_eq,
        added_log_decrement: added,
        before,
        after,
        stroke_per_main,
        stroke_m: y_after.map(|y| y * stroke_per_main),
    }
}

impl RemedyResults {
    /// True when nothing was computed.
    pub fn is_empty(&self) -> bool {
        self.required_damping.is_empty() && self.tmd.is_empty() && self.strakes.is_empty()
    }

    /// Rows for remedy.csv and the terminal table, unmitigated values beside each remedy.
    pub fn rows(&self) -> Vec<RemedyRow> {
        let mut rows = Vec::new();
        for r in &self.required_damping {
            for (name, q, before) in [
                ("approach 1", &r.approach1, &r.approach1_before),
                ("approach 2", &r.approach2, &r.approach2_before),
            ] {
                let note = if q.already_meets {
                    format!(
                        "{name} already meets the criteria at delta_s = {}",
                        before.log_decrement
                    )
                } else if q.log_decrement.is_none() {
                    format!(
                        "{name}: not reachable by damping below delta = {}",
                        required::MAX_LOG_DECREMENT
                    )
                } else {
                    format!("smallest structural delta_s meeting every criterion by {name}")
                };
                let after_tip = q.tip_amplitude_m;
                rows.push(RemedyRow {
                    stage: r.stage.clone(),
                    mode: r.mode,
                    remedy: format!("required damping ({name})"),
                    log_decrement: q.log_decrement,
                    scruton: q.scruton,
                    tip_amplitude_before_m: before.tip_amplitude_m,
                    tip_amplitude_after_m: after_tip,
                    max_stress_before_pa: before.max_stress_pa,
                    max_stress_after_pa: q.max_stress_pa,
                    verdict_before: before.verdict.to_string(),
                    verdict_after: if q.already_meets {
                        "ok".into()
                    } else if q.log_decrement.is_some() {
                        "ok (at the required delta_s)".into()
                    } else {
                        "not reachable".into()
                    },
                    note,
                });
            }
        }
        for t in &self.tmd {
            rows.push(RemedyRow {
                stage: t.stage.clone(),
                mode: t.mode,
                remedy: format!(
                    "TMD mu = {:.4} ({:.0} kg at z = {:.1} m; {})",
                    t.mass_ratio,
                    t.mass_kg,
                    t.location_z_m,
                    approach_name(t.before.method)
                ),
                log_decrement: Some(t.after.log_decrement),
                scruton: Some(t.after.scruton),
                tip_amplitude_before_m: t.before.tip_amplitude_m,
                tip_amplitude_after_m: t.after.tip_amplitude_m,
                max_stress_before_pa: t.before.max_stress_pa,
                max_stress_after_pa: t.after.max_stress_pa,
                verdict_before: t.before.verdict.to_string(),
                verdict_after: t.after.verdict.to_string(),
                note: format!(
                    "Den Hartog f_tmd = {:.4} Hz (ratio {:.5}), zeta_tmd = {:.5}; added delta {:.4} (equal-peak zeta_eq {:.4}); stroke {}",
                    t.tmd_frequency_hz,
                    t.frequency_ratio,
                    t.tmd_damping_ratio,
                    t.added_log_decrement,
                    t.equivalent_damping_ratio,
                    t.stroke_m.map_or("-".to_string(), |s| format!("{s:.3} m"))
                ),
            });
        }
        for s in &self.strakes {
            rows.push(RemedyRow {
                stage: s.stage.clone(),
                mode: s.mode,
                remedy: format!(
                    "strakes {:.1}-{:.1} m, c_lat x {} (user input; {})",
                    s.from_z_m,
                    s.to_z_m,
                    s.c_lat_factor,
                    approach_name(s.before.method)
                ),
                log_decrement: Some(s.after.log_decrement),
                scruton: Some(s.after.scruton),
                tip_amplitude_before_m: s.before.tip_amplitude_m,
                tip_amplitude_after_m: s.after.tip_amplitude_m,
                max_stress_before_pa: s.before.max_stress_pa,
                max_stress_after_pa: s.after.max_stress_pa,
                verdict_before: s.before.verdict.to_string(),
                verdict_after: s.after.verdict.to_string(),
                note: format!(
                    "coverage of L_j {:.2}, effective c_lat factor {:.3}; Sc > 8 {}; along-wind c_f = {} over the straked part",
                    s.coverage,
                    s.effective_c_lat_factor,
                    if s.en_condition_met { "met" } else { "NOT met: no credit" },
                    s.drag_coefficient
                ),
            });
        }
        rows
    }
}
