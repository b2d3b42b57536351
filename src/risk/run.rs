//! Runs a range of samples on all cores (rayon) in fixed chunks. The statistics are exact
//! integers (see `stats`), so the thread schedule cannot change a result; rows kept for
//! `risk_samples.csv` are collected in sample order.

use rayon::prelude::*;

use super::kernel::ModeSample;
use super::stats::inv_ln_gamma;
use super::{Accumulator, Engine};

/// Samples per work chunk (also the progress step).
pub const CHUNK: u64 = 4096;

/// Writes one sample's rows (index, sampled values, results or `None` when invalid).
pub type RowWriter = dyn Fn(u64, &[f64], Option<&[ModeSample]>, &mut Vec<u8>) + Sync;

/// Runs samples [from, to): the statistics, and the kept rows when `rows` is given.
/// `progress(n)` is called after each chunk with its sample count.
pub fn run_range(
    engine: &Engine,
    from: u64,
    to: u64,
    rows: Option<&RowWriter>,
    progress: &(dyn Fn(u64) + Sync),
) -> (Accumulator, Vec<u8>) {
    let chunks: Vec<(u64, u64)> = (from..to)
        .step_by(CHUNK as usize)
        .map(|a| (a, (a + CHUNK).min(to)))
        .collect();
    let stage_of: Vec<usize> = engine.kernels.iter().map(|k| k.stage_index).collect();
    let n_in = engine.inputs.len();
    let inv = inv_ln_gamma();
    let res = engine.resistance.is_some();
    let empty = || Accumulator::with_resistance(engine.modes(), engine.stages, n_in, res);
    let one = |&(a, b): &(u64, u64)| {
        let mut acc = empty();
        let mut text = Vec::new();
        let mut bits = vec![0u64; n_in];
        let mut values = vec![0f64; n_in];
        let mut out = vec![ModeSample::default(); engine.modes()];
        let mut scratch = engine.scratch();
        for i in a..b {
            engine.draw(i, &mut bits, &mut values);
            let mut message = None;
            let ok = engine.evaluate_with(&values, &mut out, &mut message, &mut scratch)
                && out.iter().all(finite);
            if ok {
                acc.add(&out, &stage_of, &bits, inv);
            } else {
                acc.add_invalid(
                    i,
                    Some(message.unwrap_or_else(|| "a result is not finite".into())),
                );
            }
            if let Some(w) = rows {
                w(i, &values, ok.then_some(out.as_slice()), &mut text);
            }
        }
        progress(b - a);
        (acc, text)
    };
    if rows.is_none() {
        // Memory flat in N: chunk results are merged as they finish (one accumulator per
        // thread at a time), never collected.
        let total = chunks
            .par_iter()
            .map(|c| one(c).0)
            .reduce(empty, |mut x, y| {
                x.merge(&y);
                x
            });
        return (total, Vec::new());
    }
    // Kept rows must come out in sample order: collect the chunks in order.
    let parts: Vec<(Accumulator, Vec<u8>)> = chunks.par_iter().map(one).collect();
    let mut total = empty();
    let mut text = Vec::new();
    for (acc, t) in &parts {
        total.merge(acc);
        text.extend_from_slice(t);
    }
    (total, text)
}

fn finite(s: &ModeSample) -> bool {
    [
        s.frequency_hz,
        s.critical_speed_m_s,
        s.scruton,
        s.tip_amplitude_m,
        s.max_stress_pa,
        s.vortex_utilisation,
        s.fatigue_damage,
    ]
    .iter()
    .all(|v| v.is_finite() && *v >= 0.0)
}
