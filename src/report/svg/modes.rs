//! Plot 2, mode shapes: one panel per stage, the checked modes overlaid; x = displacement
//! normalised to max |w| = 1, y = height (m).

use super::style::{self, Curve, Figure, LegendEntry, LegendSample, Panel};
use super::{max_height_m, stage_columns, Plot};
use crate::report::{ReportError, ReportInput};

/// The mode-shape plot.
pub fn plot(input: &ReportInput) -> Result<Plot, ReportError> {
    let h = max_height_m(input);
    let mut n_modes = 0;
    let panels: Vec<Panel> = input
        .stages
        .iter()
        .map(|s| {
            n_modes = n_modes.max(s.modes.len());
            Panel {
                title: s.stage.name.clone(),
                x_desc: "normalised displacement (-)".into(),
                y_desc: "height z (m)".into(),
                x_range: (-1.1, 1.1),
                y_range: (0.0, h * 1.02),
                curves: s
                    .modes
                    .iter()
                    .enumerate()
                    .map(|(k, m)| Curve {
                        points: s
                            .model
                            .z_m
                            .iter()
                            .zip(&m.displacement)
                            .map(|(z, w)| (*w, *z))
                            .collect(),
                        pen: style::pen(k),
                    })
                    .collect(),
                ..Panel::default()
            }
        })
        .collect();
    let legend = (0..n_modes)
        .map(|k| LegendEntry {
            label: format!("mode {}", k + 1),
            sample: LegendSample::Line(style::pen(k)),
        })
        .collect();
    let fig = Figure {
        title: "Mode shapes by stage".into(),
        columns: stage_columns(panels.len()),
        panels,
        row_height_px: 560,
        source: input.case.title.clone(),
        legend,
        footnotes: Vec::new(),
    };
    Ok(Plot {
        file: "modes.svg",
        caption: "Mode shapes of every stage, normalised to a largest displacement of 1.".into(),
        svg: style::render(&fig, "modes.svg")?,
    })
}
