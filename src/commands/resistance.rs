//! The resistance part of `check`: resistance.csv and the verdict table that leads the
//! terminal output (utilisation M_Ed / M_Rd and fatigue damage of the vertical bars, per
//! stage, EN 1992-1-1 6.1 and 6.8.4).

use crate::error::Error;
use crate::report::csv::{safe_text, to_csv_with_header};
use crate::report::staging::Staging;
use crate::report::table;
use crate::resistance::actions::ResistanceResults;

/// Printed instead of the table when the case has no `[reinforcement]`.
pub const SKIPPED_LINE: &str =
    "RC shell resistance and reinforcement fatigue: skipped (the case has no [reinforcement]).\n";

/// resistance.csv columns (contract, design.md).
pub const RESISTANCE_COLUMNS: [&str; 7] = [
    "stage",
    "z_m",
    "action",
    "axial_force_n",
    "design_moment_nm",
    "resistance_moment_nm",
    "utilisation",
];

/// Writes resistance.csv into the staging folder.
pub fn stage_resistance_file(staging: &mut Staging, r: &ResistanceResults) -> Result<(), Error> {
    let mut rows: Vec<_> = r
        .stages
        .iter()
        .flat_map(|s| s.rows.iter().cloned())
        .collect();
    for row in &mut rows {
        row.stage = safe_text(&row.stage);
    }
    staging.write(
        "resistance.csv",
        &to_csv_with_header("resistance.csv", &RESISTANCE_COLUMNS, &rows)?,
    )?;
    Ok(())
}

fn verdict(u: f64) -> &'static str {
    if u > 1.0 {
        "EXCEEDS"
    } else {
        "ok"
    }
}

/// The stage verdict table: governing utilisation (height, action) and fatigue damage.
pub fn verdict_table(r: &ResistanceResults) -> String {
    let rows: Vec<Vec<String>> = r
        .stages
        .iter()
        .map(|s| {
            let (u, z, a) = s.governing.as_ref().map_or(
                ("-".to_string(), "-".to_string(), "no action".to_string()),
                |g| {
                    (
                        format!("{:.3}", g.utilisation),
                        format!("{:.1}", g.z_m),
                        g.action.clone(),
                    )
                },
            );
            let worst = s.governing.as_ref().map_or(0.0, |g| g.utilisation);
            vec![
                s.stage.clone(),
                u,
                z,
                a,
                format!("{:.3e}", s.damage),
                format!("{:.1}", s.damage_z_m),
                if worst > 1.0 || s.damage > 1.0 {
                    "EXCEEDS".to_string()
                } else {
                    "ok".to_string()
                },
            ]
        })
        .collect();
    let mut out = String::from(
        "RC shell resistance (EN 1992-1-1 6.1: M_Ed / M_Rd(N_Ed)) and fatigue of the vertical bars (6.8.4, Table 6.3N)\n",
    );
    out.push_str(&table::render(
        &[
            "stage",
            "utilisation",
            "at_z_m",
            "governing_action",
            "fatigue_damage",
            "damage_at_z_m",
            "verdict",
        ],
        &rows,
    ));
    out.push_str(&format!(
        "fatigue damage summed over the stages: {:.3e} ({})\n",
        r.total_damage,
        verdict(r.total_damage)
    ));
    out
}
