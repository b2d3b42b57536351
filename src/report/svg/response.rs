//! Plot 4, response against wind speed: per stage, the EN 1991-1-4 approach 1 tip amplitude
//! (m) of every mode that is not screened out by E.1.2, for a range of site wind levels
//! around the mode's critical speed. x = mean wind speed at the mode's shedding height z_s
//! (m/s), the same speed as v_m in the note's tables (the site profile is scaled). Each mode's
//! design mean speed at its z_s is marked, and the axis runs past the largest of them; the
//! amplitude limit (if any) is marked too.
//!
//! References: [`crate::wind::approach1::response_curve`] (EN 1991-1-4 E.1.5.2 with
//! Table E.3's dependence of c_lat on v_crit / v_m; clause numbers from memory).

use super::style::{self, Curve, Figure, Guide, LegendEntry, LegendSample, Panel};
use super::{stage_columns, Plot};
use crate::report::{ReportError, ReportInput};
use crate::wind::approach1::{response_curve, Approach1Setup};
use crate::wind::ModeShape;

/// Samples per curve.
const SAMPLES: usize = 121;

/// The response plot's figure (before rendering): one panel per stage, one curve per mode
/// that is not screened out, in mode order; each curve's x is the mean speed at the mode's
/// shedding height and includes the design speed itself as a sample.
pub fn figure(input: &ReportInput) -> Figure {
    let mut panels = Vec::new();
    let mut footnotes = Vec::new();
    let mut n_modes = 0;
    for (s, sv) in input.stages.iter().zip(&input.vortex.stages) {
        // The stage's own design wind (site profile x c_prob), as in the note's tables.
        let wind = &sv.climate.wind;
        let mut curves = Vec::new();
        let mut guides = Vec::new();
        let (mut x_lo, mut x_hi, mut y_hi) = (f64::INFINITY, 0.0f64, 0.0f64);
        let top = s.model.z_m.len() - 1;
        for (k, m) in sv.modes.iter().enumerate() {
            n_modes = n_modes.max(k + 1);
            let (Some(a1), Some(mode)) = (
                m.approach1.as_ref(),
                s.modes.iter().find(|x| x.number == m.mode),
            ) else {
                continue;
            };
            let shape = ModeShape::from_mode(&s.model, mode);
            let setup = Approach1Setup::new(
                shape,
                wind,
                m.reference_height_m,
                m.diameter_m,
                m.strouhal,
                m.scruton,
                m.critical_speed_m_s,
                m.reynolds,
                a1.c_lat_group_factor,
            );
            let ia = shape.largest_antinode();
            let tip_per_antinode = (mode.displacement[top] / mode.displacement[ia]).abs();
            let v_c = m.critical_speed_m_s;
            // From below the lock-in range (v_crit / 1.25 = 0.8 v_crit) to past both the end
            // of the rising branch (v_crit / 0.83 = 1.2 v_crit) and the design speed.
            let (lo, hi) = (0.7 * v_c, (1.5 * v_c).max(1.15 * m.mean_speed_m_s));
            let mut speeds: Vec<f64> = (0..SAMPLES)
                .map(|i| lo + (hi - lo) * i as f64 / (SAMPLES - 1) as f64)
                .collect();
            // The design point itself, so the curve passes through the tables' value.
            speeds.push(m.mean_speed_m_s);
            speeds.sort_by(f64::total_cmp);
            // response_curve's speed is the mean speed at the shedding section z_s.
            let pts: Vec<(f64, f64)> = response_curve(&setup, &speeds)
                .iter()
                .map(|p| (p.mean_speed_m_s, p.y_max_m * tip_per_antinode))
                .collect();
            for p in &pts {
                x_lo = x_lo.min(p.0);
                x_hi = x_hi.max(p.0);
                y_hi = y_hi.max(p.1);
            }
            curves.push(Curve {
                points: pts,
                pen: style::pen(k),
            });
            guides.push(Guide {
                at: m.mean_speed_m_s,
                vertical: true,
                // Short: three panels share the width (the caption names the lines).
                label: format!("v_m,{} = {:.1}", m.mode, m.mean_speed_m_s),
                pen: style::Pen {
                    colour: style::pen(k).colour,
                    ..style::guide_pen()
                },
            });
        }
        if curves.is_empty() {
            footnotes.push(format!(
                "{}: every checked mode screened out (EN 1991-1-4 E.1.2), no response",
                s.stage.name
            ));
            x_lo = 0.0;
            x_hi = 1.0;
        }
        let top_d = s.model.outer_diameter_m[top];
        let limit = match (
            input.case.criteria.tip_amplitude_m,
            input.case.criteria.tip_amplitude_per_diameter,
        ) {
            (Some(a), Some(r)) => Some(a.min(r * top_d)),
            (Some(a), None) => Some(a),
            (None, Some(r)) => Some(r * top_d),
            (None, None) => None,
        };
        if let Some(l) = limit {
            y_hi = y_hi.max(l);
            guides.push(Guide {
                at: l,
                vertical: false,
                label: format!("limit {l:.3} m"),
                pen: style::Pen {
                    colour: style::colour(1),
                    ..style::guide_pen()
                },
            });
        }
        let x_range = style::padded(x_lo, x_hi, 0.03);
        panels.push(Panel {
            title: s.stage.name.clone(),
            x_desc: "mean speed at z_s (m/s)".into(),
            y_desc: "tip amplitude (m)".into(),
            x_range: (x_range.0.max(0.0), x_range.1),
            y_range: (0.0, if y_hi > 0.0 { y_hi * 1.15 } else { 1.0 }),
            curves,
            guides,
            ..Panel::default()
        });
    }
    let legend = (0..n_modes)
        .map(|k| LegendEntry {
            label: format!("mode {}", k + 1),
            sample: LegendSample::Line(style::pen(k)),
        })
        .collect();
    Figure {
        title: "Tip amplitude against wind speed (EN 1991-1-4 approach 1)".into(),
        columns: stage_columns(panels.len()),
        panels,
        row_height_px: 480,
        source: input.case.title.clone(),
        legend,
        footnotes,
    }
}

/// The response plot.
pub fn plot(input: &ReportInput) -> Result<Plot, ReportError> {
    let fig = figure(input);
    Ok(Plot {
        file: "response.svg",
        caption: "Peak across-wind tip amplitude by EN 1991-1-4 approach 1 against the mean \
                  wind speed at each mode's shedding height z_s (the v_m of the tables), for \
                  scaled site winds from below each mode's critical speed to past its design \
                  speed v_m,i (dashed line per mode i); modes screened out by E.1.2 at the \
                  design wind are not drawn."
            .into(),
        svg: style::render(&fig, "response.svg")?,
    })
}
