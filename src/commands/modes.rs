//! `modes`: frequencies, periods, modal and equivalent masses and mode shapes of every stage.

use std::path::Path;

use crate::error::Error;
use crate::modal::{analyse_case, ModalOptions, StageModes};
use crate::report::csv::{mode_rows, section_rows, shape_csv, to_csv};
use crate::report::staging::Staging;
use crate::report::table;

use super::CommandReport;

/// The terminal table of modes with the completeness check of each stage.
pub fn modes_table(stages: &[StageModes]) -> String {
    let mut out = String::new();
    for s in stages {
        out.push_str(&format!(
            "stage \"{}\" ({} elements, height {:.2} m)\n",
            s.stage.name,
            s.elements,
            s.model.height_m()
        ));
        let rows: Vec<Vec<String>> = s
            .modes
            .iter()
            .zip(&s.check.sign_changes)
            .map(|(m, changes)| {
                vec![
                    m.number.to_string(),
                    format!("{:.4}", m.frequency_hz),
                    format!("{:.3}", m.period_s()),
                    format!("{:.4e}", m.modal_mass_kg),
                    format!("{:.0}", m.equivalent_mass_kg_m),
                    changes.to_string(),
                ]
            })
            .collect();
        out.push_str(&table::render(
            &[
                "mode",
                "frequency_hz",
                "period_s",
                "modal_mass_kg",
                "equivalent_mass_kg_m",
                "zero_crossings",
            ],
            &rows,
        ));
        out.push_str(&format!(
            "completeness: Sturm count {} eigenvalues below {:.4} Hz = {} modes reported; max residual {:.1e}\n\n",
            s.check.sturm_count,
            s.check.shift_rad2_s2.sqrt() / (2.0 * std::f64::consts::PI),
            s.check.modes_reported,
            s.check.max_relative_residual
        ));
    }
    out
}

/// The files [`stage_modal_files`] writes.
pub const MODAL_FILES: [&str; 3] = ["modes.csv", "mode_shapes.csv", "sections.csv"];

/// Writes modes.csv, mode_shapes.csv and sections.csv into the staging folder.
pub fn stage_modal_files(staging: &mut Staging, stages: &[StageModes]) -> Result<(), Error> {
    staging.write("modes.csv", &to_csv("modes.csv", &mode_rows(stages))?)?;
    staging.write("mode_shapes.csv", &shape_csv(stages)?)?;
    staging.write(
        "sections.csv",
        &to_csv("sections.csv", &section_rows(stages))?,
    )?;
    Ok(())
}

/// Runs `modes` on a case file (or the demo) and writes the modal tables to `out`.
pub fn run(
    case_path: Option<&Path>,
    out: &Path,
    options: ModalOptions,
) -> Result<CommandReport, Error> {
    let case = super::load(case_path)?;
    // The output folder is checked before the analysis, so a blocked path costs no work.
    let mut staging = Staging::begin(out)?;
    staging.check_destinations(&MODAL_FILES)?;
    let stages = analyse_case(&case, options)?;
    crate::report::finite::check_results(&case, &stages, None, None)?;
    stage_modal_files(&mut staging, &stages)?;
    let files = staging.commit()?;
    Ok(CommandReport {
        stdout: format!("{}\n\n{}", case.title, modes_table(&stages)),
        warnings: crate::input::plausibility::case_warnings(&case)
            .into_iter()
            .chain(crate::input::plausibility::modal_warnings(&case, &stages))
            .collect(),
        check_failed: false,
        not_judged: false,
        files,
    })
}
