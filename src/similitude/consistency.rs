//! The honesty check of a model plan: the FE frequencies of the scaled model against the
//! prototype's, deviation = f_prototype / (f_model k_f) - 1 per stage and mode.
//!
//! The similitude in `factors` rests on thin-wall forms (A ~ D t, I ~ D^3 t) and on pure
//! bending. It is exact for an Euler-Bernoulli shell as t/D -> 0. The model's wall is
//! distorted (t/D differs from the prototype's by k_l / k_h = k_rho), so with thick walls
//! A and I deviate from the thin-wall forms by different amounts in model and prototype,
//! and shear deformation (Timoshenko, governed by E/G and the slenderness) is not scaled at
//! all. Both show here as a non-zero deviation, per mode, before anything is built.

use serde::Serialize;

use crate::modal::StageModes;

/// One row of the check.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ConsistencyRow {
    pub stage: String,
    pub mode: usize,
    pub prototype_frequency_hz: f64,
    pub model_frequency_hz: f64,
    /// f_model x k_f: what the model predicts for the prototype, Hz.
    pub model_frequency_at_prototype_scale_hz: f64,
    /// f_prototype / (f_model k_f) - 1.
    pub deviation: f64,
}

impl ConsistencyRow {
    /// The row as display cells: stage, mode, prototype Hz, model Hz, deviation in %.
    pub fn cells(&self) -> Vec<String> {
        vec![
            self.stage.clone(),
            self.mode.to_string(),
            format!("{:.5}", self.prototype_frequency_hz),
            format!("{:.4}", self.model_frequency_hz),
            format!("{:+.3} %", 100.0 * self.deviation),
        ]
    }
}

/// Pairs the stages by position (the model case keeps the prototype's stage order and
/// names) and the modes by number.
pub fn compare(prototype: &[StageModes], model: &[StageModes], k_f: f64) -> Vec<ConsistencyRow> {
    let mut rows = Vec::new();
    for (p, m) in prototype.iter().zip(model) {
        for (mp, mm) in p.modes.iter().zip(&m.modes) {
            let predicted = mm.frequency_hz * k_f;
            rows.push(ConsistencyRow {
                stage: p.stage.name.clone(),
                mode: mp.number,
                prototype_frequency_hz: mp.frequency_hz,
                model_frequency_hz: mm.frequency_hz,
                model_frequency_at_prototype_scale_hz: predicted,
                deviation: mp.frequency_hz / predicted - 1.0,
            });
        }
    }
    rows
}

/// Largest |deviation| of the rows (0 when there are none).
pub fn worst_deviation(rows: &[ConsistencyRow]) -> f64 {
    rows.iter().map(|r| r.deviation.abs()).fold(0.0, f64::max)
}
