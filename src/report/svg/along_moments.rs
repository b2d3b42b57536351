//! Plot of the moment envelopes against height, per stage: the along-wind design moment
//! (EN 1991-1-4 6.3.1, `crate::along`), and per mode the across-wind inertia moment at
//! lock-in and the combined vortex-case moment sqrt(M_across^2 + M_along,crit^2). MN m.

use super::style::{self, Curve, Figure, LegendEntry, LegendSample, Panel};
use super::{max_height_m, stage_columns, Plot};
use crate::along::StageAlongWind;
use crate::report::{ReportError, ReportInput};

fn curve(points: &[(f64, f64)], pen: style::Pen) -> Curve {
    Curve {
        points: points.iter().map(|&(z, m)| (m.abs() / 1e6, z)).collect(),
        pen,
    }
}

/// The plot, when the case has the EN site wind.
pub fn plot(input: &ReportInput, along: &[StageAlongWind]) -> Result<Plot, ReportError> {
    let h = max_height_m(input);
    let mut n_modes = 0;
    let mut panels = Vec::new();
    for s in along {
        let mut curves = vec![curve(&s.moment_nm, style::reference_pen())];
        for m in &s.modes {
            n_modes = n_modes.max(m.mode);
            curves.push(curve(&m.combined_moment_nm, style::pen(m.mode - 1)));
            curves.push(curve(
                &m.across_moment_nm,
                style::Pen {
                    width: 1,
                    ..style::pen(m.mode - 1)
                },
            ));
        }
        let top = curves
            .iter()
            .flat_map(|c| c.points.iter().map(|p| p.0))
            .fold(0.0f64, f64::max);
        panels.push(Panel {
            title: s.stage.clone(),
            x_desc: "|bending moment| (MN m)".into(),
            y_desc: "height z (m)".into(),
            x_range: (0.0, if top > 0.0 { top * 1.1 } else { 1.0 }),
            y_range: (0.0, h * 1.02),
            curves,
            ..Panel::default()
        });
    }
    let mut legend = vec![LegendEntry {
        label: "along-wind design (EN 1991-1-4 6.3.1)".into(),
        sample: LegendSample::Line(style::reference_pen()),
    }];
    for k in 0..n_modes {
        legend.push(LegendEntry {
            label: format!("mode {}: combined (thick), across-wind (thin)", k + 1),
            sample: LegendSample::Line(style::pen(k)),
        });
    }
    let fig = Figure {
        title: "Along-wind design moment and the vortex case at v_crit".into(),
        columns: stage_columns(panels.len()),
        panels,
        row_height_px: 440,
        source: input.case.title.clone(),
        legend,
        footnotes: along
            .iter()
            .map(|s| format!("{}: {}", s.stage, s.governs.statement))
            .collect(),
    };
    Ok(Plot {
        file: "along_moments.svg",
        caption: "Along-wind design bending moment, and per mode the across-wind moment at \
                  lock-in and the combined moment with the along-wind load at the critical \
                  speed."
            .into(),
        svg: style::render(&fig, "along_moments.svg")?,
    })
}
