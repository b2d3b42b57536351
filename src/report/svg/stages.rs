//! Plot 6, stage comparison: natural frequency (Hz), critical speed at the shedding section
//! (m/s) and governing tip amplitude (m) of each mode, the stages side by side as grouped
//! bars. Bars differ in fill shade and carry the stage number, so they read in grey.

use super::style::{self, Figure, LegendEntry, LegendSample, Note, Panel, Shade};
use super::Plot;
use crate::report::{ReportError, ReportInput};
use crate::wind::ModeVortex;

const OPACITY: [f64; 4] = [0.95, 0.55, 0.25, 0.75];

fn opacity(i: usize) -> f64 {
    OPACITY[i % OPACITY.len()]
}

fn panel(
    input: &ReportInput,
    title: &str,
    y_desc: &str,
    value: impl Fn(&ModeVortex) -> Option<f64>,
) -> Panel {
    let n_stages = input.vortex.stages.len().max(1);
    let n_modes = input
        .vortex
        .stages
        .iter()
        .map(|s| s.modes.len())
        .max()
        .unwrap_or(1)
        .max(1);
    let width = 0.8 / n_stages as f64;
    let y_top = input
        .vortex
        .stages
        .iter()
        .flat_map(|s| s.modes.iter().filter_map(&value))
        .fold(0.0f64, f64::max);
    let y_top = if y_top > 0.0 { y_top * 1.15 } else { 1.0 };
    let mut p = Panel {
        title: title.into(),
        x_desc: "mode".into(),
        y_desc: y_desc.into(),
        x_range: (0.5, n_modes as f64 + 0.5),
        y_range: (0.0, y_top),
        integer_x_labels: Some(String::new()),
        ..Panel::default()
    };
    for (i, s) in input.vortex.stages.iter().enumerate() {
        for m in &s.modes {
            let x0 = m.mode as f64 - 0.4 + i as f64 * width;
            match value(m) {
                Some(v) if v > 0.0 => {
                    p.shades.push(Shade {
                        x: (x0, x0 + width * 0.92),
                        y: (0.0, v),
                        colour: style::colour(i),
                        opacity: opacity(i),
                        label: None,
                    });
                    p.notes.push(Note {
                        at: (x0 + width * 0.2, v + y_top * 0.025),
                        text: format!("{}", i + 1),
                    });
                }
                _ => p.notes.push(Note {
                    at: (x0 + width * 0.2, y_top * 0.03),
                    text: "-".into(),
                }),
            }
        }
    }
    p
}

/// The stage comparison plot.
pub fn plot(input: &ReportInput) -> Result<Plot, ReportError> {
    let panels = vec![
        panel(input, "natural frequency", "frequency (Hz)", |m| {
            Some(m.frequency_hz)
        }),
        panel(
            input,
            "critical speed at shedding section",
            "critical speed (m/s)",
            |m| Some(m.critical_speed_m_s),
        ),
        panel(
            input,
            "tip amplitude (governing)",
            "tip amplitude (m)",
            |m| m.governing_summary().tip_amplitude_m,
        ),
    ];
    let legend = input
        .vortex
        .stages
        .iter()
        .enumerate()
        .map(|(i, s)| LegendEntry {
            label: format!("{}: {}", i + 1, s.stage),
            sample: LegendSample::Fill(style::colour(i), opacity(i)),
        })
        .collect();
    let fig = Figure {
        title: "Construction stages compared".into(),
        panels,
        columns: 3,
        row_height_px: 440,
        source: input.case.title.clone(),
        legend,
        footnotes: vec![
            "Bars are numbered by stage; \"-\" = no amplitude (screened out by EN 1991-1-4 E.1.2)."
                .into(),
        ],
    };
    Ok(Plot {
        file: "stages.svg",
        caption: "Stages side by side: frequency, critical speed and governing tip amplitude of \
                  each mode."
            .into(),
        svg: style::render(&fig, "stages.svg")?,
    })
}
