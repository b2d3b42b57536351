//! Plot 5, load envelopes: per stage, |bending moment| (MN m) and |extreme-fibre stress|
//! (MPa) along the height from the inertia loads of every mode with a response (governing
//! method), and their envelope over the modes. The stress limit, if given, is marked.
//!
//! References: inertia forces F(z) = m(z) (2 pi n)^2 y(z) (EN 1991-1-4 E.1.4, from memory);
//! see [`crate::wind::loads`].

use super::style::{self, Curve, Figure, Guide, LegendEntry, LegendSample, Panel};
use super::{max_height_m, stage_columns, Plot};
use crate::report::{ReportError, ReportInput};
use crate::wind::LoadPoint;

fn envelope(per_mode: &[Vec<(f64, f64)>]) -> Vec<(f64, f64)> {
    let Some(first) = per_mode.iter().max_by_key(|c| c.len()) else {
        return Vec::new();
    };
    first
        .iter()
        .map(|&(_, z)| {
            let v = per_mode
                .iter()
                .filter_map(|c| c.iter().find(|p| (p.1 - z).abs() < 1e-9).map(|p| p.0))
                .fold(0.0, f64::max);
            (v, z)
        })
        .collect()
}

/// The envelope plot.
pub fn plot(input: &ReportInput) -> Result<Plot, ReportError> {
    let h = max_height_m(input);
    let mut moment_panels = Vec::new();
    let mut stress_panels = Vec::new();
    let mut footnotes = Vec::new();
    let mut n_modes = 0;
    let stress_limit_mpa = input.case.criteria.stress_pa.map(|p| p / 1e6);
    for sv in &input.vortex.stages {
        let mut m_curves = Vec::new();
        let mut s_curves = Vec::new();
        let mut moments = Vec::new();
        let mut stresses = Vec::new();
        for (k, m) in sv.modes.iter().enumerate() {
            n_modes = n_modes.max(k + 1);
            if m.loads.is_empty() {
                continue;
            }
            let pick = |f: fn(&LoadPoint) -> f64| -> Vec<(f64, f64)> {
                m.loads.iter().map(|l| (f(l).abs(), l.z_m)).collect()
            };
            let mc = pick(|l| l.moment_nm / 1e6);
            let sc = pick(|l| l.stress_pa / 1e6);
            m_curves.push(Curve {
                points: mc.clone(),
                pen: style::pen(k),
            });
            s_curves.push(Curve {
                points: sc.clone(),
                pen: style::pen(k),
            });
            moments.push(mc);
            stresses.push(sc);
        }
        if m_curves.is_empty() {
            footnotes.push(format!(
                "{}: no mode has a response (all screened out), no loads",
                sv.stage
            ));
        }
        if m_curves.len() > 1 {
            m_curves.push(Curve {
                points: envelope(&moments),
                pen: style::reference_pen(),
            });
            s_curves.push(Curve {
                points: envelope(&stresses),
                pen: style::reference_pen(),
            });
        }
        let top = |c: &[Curve]| {
            c.iter()
                .flat_map(|c| c.points.iter().map(|p| p.0))
                .fold(0.0f64, f64::max)
        };
        let m_top = top(&m_curves);
        let mut s_top = top(&s_curves);
        let mut guides = Vec::new();
        if let Some(l) = stress_limit_mpa {
            s_top = s_top.max(l);
            guides.push(Guide {
                at: l,
                vertical: true,
                label: format!("limit {l:.1} MPa"),
                pen: style::Pen {
                    colour: style::colour(1),
                    ..style::guide_pen()
                },
            });
        }
        let y_range = (0.0, h * 1.02);
        moment_panels.push(Panel {
            title: format!("{}: moment", sv.stage),
            x_desc: "|bending moment| (MN m)".into(),
            y_desc: "height z (m)".into(),
            x_range: (0.0, if m_top > 0.0 { m_top * 1.1 } else { 1.0 }),
            y_range,
            curves: m_curves,
            ..Panel::default()
        });
        stress_panels.push(Panel {
            title: format!("{}: stress", sv.stage),
            x_desc: "|extreme-fibre stress| (MPa)".into(),
            y_desc: "height z (m)".into(),
            x_range: (0.0, if s_top > 0.0 { s_top * 1.25 } else { 1.0 }),
            y_range,
            curves: s_curves,
            guides,
            ..Panel::default()
        });
    }
    let columns = stage_columns(moment_panels.len());
    // Rows of moments, then rows of stresses, each row holding up to `columns` stages.
    let mut panels = Vec::new();
    for (m_chunk, s_chunk) in moment_panels
        .chunks(columns)
        .zip(stress_panels.chunks(columns))
    {
        panels.extend_from_slice(m_chunk);
        panels.resize_with(panels.len().div_ceil(columns) * columns, Panel::default);
        panels.extend_from_slice(s_chunk);
        panels.resize_with(panels.len().div_ceil(columns) * columns, Panel::default);
    }
    let mut legend: Vec<LegendEntry> = (0..n_modes)
        .map(|k| LegendEntry {
            label: format!("mode {}", k + 1),
            sample: LegendSample::Line(style::pen(k)),
        })
        .collect();
    legend.push(LegendEntry {
        label: "envelope over the modes".into(),
        sample: LegendSample::Line(style::reference_pen()),
    });
    let fig = Figure {
        title: "Across-wind bending moment and stress at lock-in (governing method)".into(),
        columns,
        panels,
        row_height_px: 440,
        source: input.case.title.clone(),
        legend,
        footnotes,
    };
    Ok(Plot {
        file: "envelopes.svg",
        caption: "Bending moment and extreme-fibre stress along the height from the inertia \
                  loads of each mode at its lock-in amplitude (governing method), and their \
                  envelope."
            .into(),
        svg: style::render(&fig, "envelopes.svg")?,
    })
}
