//! Section 6 of the note: the stages side by side, first with what each is judged with (its
//! design wind's return period and c_prob, EN 1991-1-4 (4.2); its duration; its damping) and
//! its own verdict, then mode by mode.

use super::markup::{html_escape, n, num, opt, sci, t, Table};
use super::verdicts::verdict_cell;
use crate::report::ReportInput;
use crate::wind::{ModeVortex, StageClimate, StageVortex};

/// The stage's own verdict in a word: which modes exceed, or whether it passes.
pub(super) fn stage_verdict(s: &StageVortex) -> String {
    let failing: Vec<String> = s
        .modes
        .iter()
        .filter(|m| m.verdict.is_exceeds())
        .map(|m| m.mode.to_string())
        .collect();
    if !failing.is_empty() {
        format!("exceeds (mode {})", failing.join(", "))
    } else if s.modes.iter().all(|m| m.verdict.is_not_judged()) {
        "not judged".into()
    } else {
        "ok".into()
    }
}

fn conditions(out: &mut String, input: &ReportInput) {
    let stages = &input.vortex.stages;
    let mut head: Vec<String> = vec!["quantity".into()];
    head.extend(stages.iter().map(|s| html_escape(&s.stage)));
    type Getter = fn(&StageClimate) -> String;
    let quantities: [(&str, Getter); 6] = [
        ("duration (years)", |c| {
            c.duration_years.map_or("in service".into(), |d| num(d, 3))
        }),
        ("fatigue cycles counted over (years)", |c| {
            num(c.judged_years, 3)
        }),
        ("return period of the design wind (years)", |c| {
            num(c.return_period_years, 1)
        }),
        ("c_prob (-), EN 1991-1-4 (4.2)", |c| num(c.c_prob, 4)),
        ("v_ref of the stage (m/s) = c_prob × 50-year v_ref", |c| {
            num(c.wind.reference_speed_m_s, 2)
        }),
        ("structural log decrement δ_s (-)", |c| {
            num(c.log_decrement, 4)
        }),
    ];
    let mut rows: Vec<Vec<_>> = quantities
        .iter()
        .map(|(name, get)| {
            let mut r = vec![t(*name)];
            r.extend(stages.iter().map(|s| n(get(&s.climate))));
            r
        })
        .collect();
    let mut r = vec![t("the stage's own verdict")];
    r.extend(stages.iter().map(|s| t(stage_verdict(s))));
    rows.push(r);
    Table { head, rows }.write(out);
    out.push_str(
        "<p>Each stage is judged with its own design wind: the site's 50-year mean speeds \
         times c_prob of the stage's return period (default 50 years in service; for a stage \
         with a duration, the recommended return period of EN 1991-1-6 Table 3.1, from \
         memory). The E.1.2 screen, the Table E.3 ratio and every speed printed for a stage \
         use these speeds. Fatigue cycles count the site's wind climate (v_0 from the \
         50-year mean speed) over the stage's duration, an in-service stage over the design \
         life. Required damping is sized only for modes whose stage's own verdict fails.</p>\n",
    );
}

pub(super) fn write(out: &mut String, input: &ReportInput) {
    conditions(out, input);
    let stages = &input.vortex.stages;
    let mut head: Vec<String> = vec!["mode i".into(), "quantity".into()];
    head.extend(stages.iter().map(|s| html_escape(&s.stage)));
    let n_modes = stages.iter().map(|s| s.modes.len()).max().unwrap_or(0);
    let mut rows = Vec::new();
    type Getter = fn(&ModeVortex) -> String;
    let quantities: [(&str, Getter); 7] = [
        ("n_i (Hz)", |m| num(m.frequency_hz, 4)),
        ("v_crit,i (m/s)", |m| num(m.critical_speed_m_s, 2)),
        ("v_m of the stage (m/s)", |m| num(m.mean_speed_m_s, 2)),
        ("v_crit / v_m (-)", |m| num(m.speed_ratio, 2)),
        ("Sc (-)", |m| num(m.scruton, 2)),
        ("y_tip (m), governing method", |m| {
            opt(m.governing_summary().tip_amplitude_m, 4)
        }),
        ("N load cycles in the stage (-)", |m| {
            m.governing_summary().fatigue_cycles.map_or("-".into(), sci)
        }),
    ];
    for k in 1..=n_modes {
        for (name, get) in &quantities {
            let mut r = vec![n(k.to_string()), t(*name)];
            for s in stages {
                r.push(n(s
                    .modes
                    .iter()
                    .find(|m| m.mode == k)
                    .map_or("-".into(), get)));
            }
            rows.push(r);
        }
        let mut r = vec![n(k.to_string()), t("verdict")];
        for s in stages {
            r.push(
                s.modes
                    .iter()
                    .find(|m| m.mode == k)
                    .map_or(t("-"), verdict_cell),
            );
        }
        rows.push(r);
    }
    Table { head, rows }.write(out);
}
