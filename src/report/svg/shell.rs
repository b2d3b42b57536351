//! Plot 1, the shell: outer diameter and wall thickness against height (m), with the lining
//! zones shaded, the platforms and point masses and the tops of partial stages marked.

use super::style::{self, Curve, Figure, Guide, LegendEntry, LegendSample, Panel, Shade};
use super::Plot;
use crate::report::{ReportError, ReportInput};

fn stations(input: &ReportInput, f: impl Fn(&crate::case::Station) -> f64) -> Vec<(f64, f64)> {
    input
        .case
        .shell
        .stations
        .iter()
        .map(|s| (f(s), s.z_m))
        .collect()
}

/// Marks shared by both panels: lining zones, point masses, stage tops.
fn marks(input: &ReportInput, x_range: (f64, f64), panel: &mut Panel, labels: bool) {
    for l in &input.case.linings {
        panel.shades.push(Shade {
            x: x_range,
            y: (l.from_z_m, l.to_z_m),
            colour: style::colour(4),
            opacity: 0.18,
            label: None,
        });
    }
    for p in &input.case.point_masses {
        panel.guides.push(Guide {
            at: p.z_m,
            vertical: false,
            label: if labels {
                match &p.stages {
                    None => format!("{} ({:.1} t)", p.label, p.mass_kg / 1000.0),
                    Some(names) => format!(
                        "{} ({:.1} t; {})",
                        p.label,
                        p.mass_kg / 1000.0,
                        names.join(", ")
                    ),
                }
            } else {
                String::new()
            },
            pen: style::guide_pen(),
        });
    }
    for s in &input.case.stages {
        if let Some(top) = s.top_z_m {
            panel.guides.push(Guide {
                at: top,
                vertical: false,
                label: if labels {
                    format!("top of stage \"{}\"", s.name)
                } else {
                    String::new()
                },
                pen: style::Pen {
                    colour: style::colour(1),
                    ..style::guide_pen()
                },
            });
        }
    }
}

/// The shell plot.
pub fn plot(input: &ReportInput) -> Result<Plot, ReportError> {
    let h = input.case.shell.height_m();
    let y_range = (0.0, h * 1.02);
    let d = stations(input, |s| s.outer_diameter_m);
    let t = stations(input, |s| s.wall_m);
    let d_max = d.iter().map(|p| p.0).fold(0.0, f64::max);
    let t_max = t.iter().map(|p| p.0).fold(0.0, f64::max);
    // Room at the right for the platform labels.
    let d_range = (0.0, d_max * 1.9);
    let t_range = (0.0, t_max * 1.3);
    let mut pd = Panel {
        title: "outer diameter".into(),
        x_desc: "outer diameter (m)".into(),
        y_desc: "height z (m)".into(),
        x_range: d_range,
        y_range,
        curves: vec![Curve {
            points: d,
            pen: style::pen(0),
        }],
        ..Panel::default()
    };
    marks(input, d_range, &mut pd, true);
    let mut pt = Panel {
        title: "wall thickness".into(),
        x_desc: "wall thickness (m)".into(),
        y_desc: "height z (m)".into(),
        x_range: t_range,
        y_range,
        curves: vec![Curve {
            points: t,
            pen: style::pen(1),
        }],
        ..Panel::default()
    };
    marks(input, t_range, &mut pt, false);
    let mut legend = vec![
        LegendEntry {
            label: "outer diameter".into(),
            sample: LegendSample::Line(style::pen(0)),
        },
        LegendEntry {
            label: "wall thickness".into(),
            sample: LegendSample::Line(style::pen(1)),
        },
    ];
    if !input.case.linings.is_empty() {
        legend.push(LegendEntry {
            label: "lining zone (mass only)".into(),
            sample: LegendSample::Fill(style::colour(4), 0.18),
        });
    }
    if !input.case.point_masses.is_empty() {
        legend.push(LegendEntry {
            label: "platform / point mass".into(),
            sample: LegendSample::Line(style::guide_pen()),
        });
    }
    let fig = Figure {
        title: "Shell geometry".into(),
        panels: vec![pd, pt],
        columns: 2,
        row_height_px: 620,
        source: input.case.title.clone(),
        legend,
        footnotes: Vec::new(),
    };
    Ok(Plot {
        file: "shell.svg",
        caption: "Shell: outer diameter and wall thickness against height; lining zones shaded, \
                  platforms and tops of partial stages marked."
            .into(),
        svg: style::render(&fig, "shell.svg")?,
    })
}
