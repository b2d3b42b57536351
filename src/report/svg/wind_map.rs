//! Plot 3, the wind map: per stage, the mean wind profile v_m(z) and each checked mode's
//! local critical speed b(z) n / St along the height, with the lock-in bands shaded (heights
//! where b(z) n / St < v_m(z); our own addition, not a code method). The speed axis is
//! limited to 1.5 x the largest mean speed so that high modes do not squash the picture;
//! modes that lie wholly beyond it are listed under the plot.
//!
//! Each stage's profile is its own design wind (the site's 50-year profile x the stage's
//! c_prob, EN 1991-1-4 (4.2)), the same speeds as the note's tables.
//!
//! Units: speeds in m/s, heights in m. References: v_crit = b n / St (EN 1991-1-4 E.1.3.1,
//! from memory), v_m(z) from the case's profile (EN 1991-1-4 4.3 or a power law).

use super::style::{self, Curve, Figure, LegendEntry, LegendSample, Panel, Shade};
use super::{max_height_m, stage_columns, Plot};
use crate::report::{ReportError, ReportInput};
use crate::wind::{profile, shedding};

/// Heights at which the mean profile is drawn: 200 steps plus the model nodes.
fn profile_heights(top_m: f64) -> Vec<f64> {
    (0..=200).map(|i| top_m * i as f64 / 200.0).collect()
}

/// The wind-map plot.
pub fn plot(input: &ReportInput) -> Result<Plot, ReportError> {
    let h = max_height_m(input);
    // Each stage's own design wind (the site's 50-year profile x the stage's c_prob).
    let v_max = input
        .vortex
        .stages
        .iter()
        .map(|sv| profile::mean_speed_m_s(&sv.climate.wind, h))
        .fold(profile::mean_speed_m_s(&input.vortex.wind, h), f64::max);
    let x_range = (0.0, 1.5 * v_max);
    let mut footnotes = Vec::new();
    let mut n_modes = 0;
    let mut any_band = vec![false; 0];
    let mut panels = Vec::new();
    for (s, sv) in input.stages.iter().zip(&input.vortex.stages) {
        let wind = &sv.climate.wind;
        let top = s.model.height_m();
        let mut panel = Panel {
            title: s.stage.name.clone(),
            x_desc: "wind speed (m/s)".into(),
            y_desc: "height z (m)".into(),
            x_range,
            y_range: (0.0, h * 1.02),
            ..Panel::default()
        };
        panel.curves.push(Curve {
            points: profile_heights(top)
                .into_iter()
                .map(|z| (profile::mean_speed_m_s(wind, z), z))
                .collect(),
            pen: style::reference_pen(),
        });
        n_modes = n_modes.max(sv.modes.len());
        let mut off_scale = Vec::new();
        any_band.resize(n_modes, false);
        for (k, m) in sv.modes.iter().enumerate() {
            let mode = s.modes.iter().find(|x| x.number == m.mode);
            let Some(mode) = mode else { continue };
            let pts: Vec<(f64, f64)> = s
                .model
                .z_m
                .iter()
                .zip(&s.model.outer_diameter_m)
                .map(|(z, b)| {
                    (
                        shedding::critical_speed_m_s(*b, mode.frequency_hz, m.strouhal),
                        *z,
                    )
                })
                .collect();
            let v_min = pts.iter().map(|p| p.0).fold(f64::INFINITY, f64::min);
            if v_min > x_range.1 {
                off_scale.push(format!("mode {} from {:.0} m/s", m.mode, v_min));
            }
            for seg in &m.lock_in_segments {
                any_band[k] = true;
                panel.shades.push(Shade {
                    x: x_range,
                    y: (seg.from_z_m, seg.to_z_m),
                    colour: style::colour(k),
                    opacity: 0.16,
                    label: Some(format!(
                        "mode {} lock-in {:.0}-{:.0} m",
                        m.mode, seg.from_z_m, seg.to_z_m
                    )),
                });
            }
            panel.curves.push(Curve {
                points: pts,
                pen: style::pen(k),
            });
        }
        if !off_scale.is_empty() {
            footnotes.push(format!(
                "{}: off the scale: {}",
                s.stage.name,
                off_scale.join(", ")
            ));
        }
        panels.push(panel);
    }
    let mut legend = vec![LegendEntry {
        label: "mean wind v_m(z)".into(),
        sample: LegendSample::Line(style::reference_pen()),
    }];
    for k in 0..n_modes {
        legend.push(LegendEntry {
            label: format!("mode {}: b(z) n / St", k + 1),
            sample: LegendSample::Line(style::pen(k)),
        });
    }
    for (k, any) in any_band.iter().enumerate() {
        if *any {
            legend.push(LegendEntry {
                label: format!("mode {} lock-in band", k + 1),
                sample: LegendSample::Fill(style::colour(k), 0.16),
            });
        }
    }
    let fig = Figure {
        title: "Wind map: where the wind reaches each mode's critical speed".into(),
        columns: stage_columns(panels.len()),
        panels,
        row_height_px: 560,
        source: input.case.title.clone(),
        legend,
        footnotes,
    };
    Ok(Plot {
        file: "wind_map.svg",
        caption: "Wind map: mean wind speed and each mode's local critical speed b(z) n / St \
                  along the height, per stage. Shaded: lock-in bands, where the local critical \
                  speed lies below the mean wind speed (our own indicator, not a code method)."
            .into(),
        svg: style::render(&fig, "wind_map.svg")?,
    })
}
