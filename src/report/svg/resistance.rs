//! Plot: utilisation M_Ed / M_Rd against height per stage, one curve per action, with the
//! limit 1 marked (EN 1992-1-1 6.1; see [`crate::resistance`]).

use super::style::{self, Curve, Figure, Guide, LegendEntry, LegendSample, Panel};
use super::{max_height_m, stage_columns, Plot};
use crate::report::{ReportError, ReportInput};

/// The utilisation plot, `None` without resistance results.
pub fn plot(input: &ReportInput) -> Result<Option<Plot>, ReportError> {
    let Some(r) = input.resistance else {
        return Ok(None);
    };
    let h = max_height_m(input);
    let mut names: Vec<String> = Vec::new();
    let mut panels = Vec::new();
    for s in &r.stages {
        let mut curves = Vec::new();
        let mut top: f64 = 1.0;
        for a in &s.actions {
            let k = match names.iter().position(|x| x == &a.name) {
                Some(k) => k,
                None => {
                    names.push(a.name.clone());
                    names.len() - 1
                }
            };
            let points: Vec<(f64, f64)> = s
                .rows
                .iter()
                .filter(|row| row.action == a.name)
                .map(|row| (row.utilisation, row.z_m))
                .collect();
            top = points.iter().map(|p| p.0).fold(top, f64::max);
            curves.push(Curve {
                points,
                pen: style::pen(k),
            });
        }
        panels.push(Panel {
            title: format!("{}: utilisation", s.stage),
            x_desc: "M_Ed / M_Rd (-)".into(),
            y_desc: "height z (m)".into(),
            x_range: (0.0, top * 1.1),
            y_range: (0.0, h * 1.02),
            curves,
            guides: vec![Guide {
                at: 1.0,
                vertical: true,
                label: "limit 1".into(),
                pen: style::Pen {
                    colour: style::colour(1),
                    ..style::guide_pen()
                },
            }],
            ..Panel::default()
        });
    }
    let legend = names
        .iter()
        .enumerate()
        .map(|(k, name)| LegendEntry {
            label: name.clone(),
            sample: LegendSample::Line(style::pen(k)),
        })
        .collect();
    let fig = Figure {
        title: "Utilisation of the RC shell along the height".into(),
        columns: stage_columns(panels.len()),
        panels,
        row_height_px: 440,
        source: input.case.title.clone(),
        legend,
        footnotes: vec![],
    };
    Ok(Some(Plot {
        file: "resistance.svg",
        caption: "Utilisation M_Ed / M_Rd(N_Ed) of the reinforced-concrete shell along the \
                  height for every design action (EN 1992-1-1 6.1)."
            .into(),
        svg: style::render(&fig, "resistance.svg")?,
    }))
}
