//! The SVG plots of the design note, one module per plot, drawn with plotters' SVG backend
//! (no font files needed; see [`style`]). Each plot function is pure: results in, SVG text
//! out. Text from the case file (title, stage names, labels) is escaped by the backend.
//!
//! Units: heights in m, speeds in m/s, amplitudes in m, moments in MN m, stresses in MPa,
//! frequencies in Hz (the axis titles say so).

pub mod along_moments;
pub mod envelopes;
pub mod modes;
pub mod resistance;
pub mod response;
pub mod shell;
pub mod stages;
pub mod style;
pub mod wind_map;

use super::{ReportError, ReportInput};

/// One plot of the note.
#[derive(Debug, Clone)]
pub struct Plot {
    /// File name in the output folder.
    pub file: &'static str,
    /// Caption for the design note.
    pub caption: String,
    /// The SVG document.
    pub svg: String,
}

/// Every plot, in the order of the note.
pub fn all_plots(input: &ReportInput) -> Result<Vec<Plot>, ReportError> {
    let mut plots = vec![
        shell::plot(input)?,
        modes::plot(input)?,
        wind_map::plot(input)?,
        response::plot(input)?,
        envelopes::plot(input)?,
        stages::plot(input)?,
    ];
    if let Some(along) = input.along {
        plots.push(along_moments::plot(input, along)?);
    }
    plots.extend(resistance::plot(input)?);
    Ok(plots)
}

/// Panels per row for `n` stage panels.
pub(crate) fn stage_columns(n: usize) -> usize {
    n.clamp(1, 3)
}

/// Highest stage, m.
pub(crate) fn max_height_m(input: &ReportInput) -> f64 {
    input
        .stages
        .iter()
        .map(|s| s.model.height_m())
        .fold(input.case.shell.height_m(), f64::max)
}
