//! Section 1.1 of the note: the verdict at a glance, one row per stage, the reinforced-
//! concrete checks first (utilisation M_Ed / M_Rd, EN 1992-1-1 6.1; fatigue damage of the
//! vertical bars, EN 1992-1-1 6.8.4) and then the vortex-shedding criteria of the
//! governing EN 1991-1-4 Annex E method, with where each number is worked out in the note.
//! The same verdict decides the exit code (0 pass, 1 a check fails, 3 nothing judged).
//! Units: dimensionless ratios, heights in m.

use std::fmt::Write as _;

use super::comparison::stage_verdict;
use super::markup::{heads, n, num, sci, t, Cell, Table};
use crate::report::ReportInput;

/// Writes the table and the overall line.
pub(super) fn write(out: &mut String, input: &ReportInput) {
    let resistance = input.resistance;
    let mut any_fails = false;
    let mut any_judged = false;
    let mut rows = Vec::new();
    for (i, sv) in input.vortex.stages.iter().enumerate() {
        let vortex = stage_verdict(sv);
        let vortex_fails = vortex.starts_with("exceeds");
        any_judged |= vortex != "not judged";
        let mut row = vec![t(&sv.stage)];
        let mut stage_fails = vortex_fails;
        if let Some(r) = resistance {
            let s = r.stages.get(i);
            let g = s.and_then(|s| s.governing.as_ref());
            let u = g.map_or(0.0, |g| g.utilisation);
            let d = s.map_or(0.0, |s| s.damage);
            stage_fails |= u > 1.0 || d > 1.0;
            any_judged = true;
            let judged = |ok: bool, v: String| if ok { n(v) } else { Cell::Bad(v) };
            row.push(judged(
                u <= 1.0,
                g.map_or("-".into(), |g| {
                    format!("{} at {} m ({})", num(u, 3), num(g.z_m, 1), g.action)
                }),
            ));
            row.push(judged(
                d <= 1.0,
                s.map_or("-".into(), |s| {
                    format!("{} at {} m", sci(d), num(s.damage_z_m, 1))
                }),
            ));
        }
        row.push(if vortex_fails {
            Cell::Bad(vortex.clone())
        } else {
            t(&vortex)
        });
        any_fails |= stage_fails;
        row.push(if stage_fails {
            Cell::Bad("fails".into())
        } else if vortex == "not judged" && resistance.is_none() {
            t("not judged")
        } else {
            t("passes")
        });
        rows.push(row);
    }
    let mut head = vec!["stage"];
    if resistance.is_some() {
        head.extend([
            "largest utilisation M_Ed/M_Rd (-), EN 1992-1-1 6.1",
            "fatigue damage D of the bars (-), EN 1992-1-1 6.8.4",
        ]);
    }
    head.extend([
        "vortex-shedding criteria, EN 1991-1-4 Annex E (governing method)",
        "stage",
    ]);
    Table {
        head: heads(&head),
        rows,
    }
    .write(out);
    let mut total_fails = false;
    if let Some(r) = resistance {
        total_fails = r.total_damage > 1.0;
        let _ = write!(
            out,
            "<p>Fatigue damage summed over the stages: {} (limit 1). ",
            sci(r.total_damage)
        );
    } else {
        out.push_str(
            "<p>No [reinforcement] is given: the shell's resistance and the bars' fatigue are \
             not checked. ",
        );
    }
    let overall = if any_fails || total_fails {
        "a check fails (exit code 1)"
    } else if any_judged {
        "every judged check passes (exit code 0)"
    } else {
        "nothing is judged: the case gives no criteria (exit code 3)"
    };
    let _ = writeln!(
        out,
        "Overall: {overall}. Utilisation and damage are worked out in the resistance section, \
         the vortex criteria in the vortex-shedding verdicts and the stage comparison; a limit \
         of 1 is exceeded where the cell is marked.</p>"
    );
}
