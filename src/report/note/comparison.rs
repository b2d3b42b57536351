//! Section 6 of the note: the stages side by side, mode by mode.

use super::markup::{html_escape, n, num, opt, t, Table};
use super::verdicts::verdict_cell;
use crate::report::ReportInput;
use crate::wind::ModeVortex;

pub(super) fn write(out: &mut String, input: &ReportInput) {
    let stages = &input.vortex.stages;
    let mut head: Vec<String> = vec!["mode i".into(), "quantity".into()];
    head.extend(stages.iter().map(|s| html_escape(&s.stage)));
    let n_modes = stages.iter().map(|s| s.modes.len()).max().unwrap_or(0);
    let mut rows = Vec::new();
    type Getter = fn(&ModeVortex) -> String;
    let quantities: [(&str, Getter); 4] = [
        ("n_i (Hz)", |m| num(m.frequency_hz, 4)),
        ("v_crit,i (m/s)", |m| num(m.critical_speed_m_s, 2)),
        ("v_crit / v_m (-)", |m| num(m.speed_ratio, 2)),
        ("y_tip (m), governing method", |m| {
            opt(m.governing_summary().tip_amplitude_m, 4)
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
