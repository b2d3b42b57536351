//! Streamed, mergeable statistics of a risk run: the per-(stage, mode) quantities and
//! events, their exact sums, sketches and event counts, and the influence sums
//! ([`Accumulator`]). Exact integers throughout, so any split of the samples merges to
//! bit-identical numbers (see [`super::stats`]). Units: the quantities' own (SI).

use serde::{Deserialize, Serialize};

use super::kernel::ModeSample;
use super::stats::{ExactSum, Sketch};

/// Per-(stage, mode) quantities, in risk.csv order (with `--with-resistance` the
/// [`RESISTANCE_QUANTITIES`] follow each mode's).
pub const QUANTITIES: [&str; 5] = [
    "frequency_hz",
    "critical_speed_m_s",
    "scruton",
    "tip_amplitude_m",
    "max_stress_pa",
];

fn quantity_values(s: &ModeSample) -> [f64; 5] {
    [
        s.frequency_hz,
        s.critical_speed_m_s,
        s.scruton,
        s.tip_amplitude_m,
        s.max_stress_pa,
    ]
}

/// Events per (stage, mode), in order.
pub const MODE_EVENTS: [&str; 4] = ["in_e12_range", "tip_exceeds", "stress_exceeds", "exceeds"];

/// Per-(stage, mode) resistance quantities (`--with-resistance`), after every mode's
/// [`QUANTITIES`] in the accumulator.
pub const RESISTANCE_QUANTITIES: [&str; 2] = ["vortex_utilisation", "fatigue_damage"];

/// Per-(stage, mode) resistance events, after the case event in the accumulator.
pub const RESISTANCE_EVENTS: [&str; 2] = ["utilisation_exceeds", "damage_exceeds"];

/// Per-stage resistance quantity (`--with-resistance`): the stage's fatigue damage, max over
/// the height of the sum over its modes (as `check`), after the per-mode resistance
/// quantities; then [`TOTAL_DAMAGE_QUANTITY`], the sum over the stages. Each has the event
/// "> 1" after the per-mode resistance events.
pub const STAGE_DAMAGE_QUANTITY: &str = "stage_fatigue_damage";
/// The case's fatigue damage summed over the stages (see [`STAGE_DAMAGE_QUANTITY`]).
pub const TOTAL_DAMAGE_QUANTITY: &str = "total_fatigue_damage";

fn mode_events(s: &ModeSample) -> [bool; 4] {
    [s.in_range, s.tip_exceeds, s.stress_exceeds, s.exceeds]
}

/// Streamed statistics of a range of samples (mergeable; see [`super::stats`]).
#[derive(Debug, Clone, PartialEq, Serialize, Deserialize)]
pub struct Accumulator {
    /// Valid samples.
    pub samples: u64,
    /// Samples refused by a case-file rule or the solver.
    pub invalid: u64,
    /// The first refusal message met (lowest sample index), with its index.
    pub first_invalid: Option<(u64, String)>,
    /// Per (stage, mode) x quantity: exact sum and sketch.
    pub sums: Vec<ExactSum>,
    pub sketches: Vec<Sketch>,
    /// Event counts: per (stage, mode) x [`MODE_EVENTS`], then per stage "exceeds", then the
    /// case "exceeds".
    pub events: Vec<u64>,
    /// Per event x input: exact sum of the 53-bit integers behind U over the samples with
    /// the event, as (high, low) u64 halves of a u128.
    pub influence: Vec<(u64, u64)>,
    /// Whether the resistance quantities and events follow (see [`resistance_quantity`],
    /// [`resistance_event`]).
    #[serde(default)]
    pub resistance: bool,
    /// Number of (stage, mode) entries and of stages.
    pub mode_entries: usize,
    pub stage_entries: usize,
}

/// Index into `sums` / `sketches` of resistance quantity `q` of mode `j`.
pub fn resistance_quantity(modes: usize, j: usize, q: usize) -> usize {
    modes * QUANTITIES.len() + j * RESISTANCE_QUANTITIES.len() + q
}

/// Index into `events` of resistance event `e` of mode `j`.
pub fn resistance_event(modes: usize, stages: usize, j: usize, e: usize) -> usize {
    modes * MODE_EVENTS.len() + stages + 1 + j * RESISTANCE_EVENTS.len() + e
}

/// Index into `sums` / `sketches` of the fatigue damage of stage `s` (`s` = the number of
/// stages: the total over the stages).
pub fn stage_damage_quantity(modes: usize, s: usize) -> usize {
    modes * (QUANTITIES.len() + RESISTANCE_QUANTITIES.len()) + s
}

/// Index into `events` of "fatigue damage of stage `s` > 1" (`s` = the number of stages:
/// the total).
pub fn stage_damage_event(modes: usize, stages: usize, s: usize) -> usize {
    modes * (MODE_EVENTS.len() + RESISTANCE_EVENTS.len()) + stages + 1 + s
}

impl Accumulator {
    pub fn new(modes: usize, stages: usize, inputs: usize) -> Self {
        Self::with_resistance(modes, stages, inputs, false)
    }

    /// As [`Accumulator::new`], with room for the resistance quantities and events when
    /// `resistance` (after the others, so the other indices do not move).
    pub fn with_resistance(modes: usize, stages: usize, inputs: usize, resistance: bool) -> Self {
        let r = usize::from(resistance);
        let events = modes * MODE_EVENTS.len()
            + stages
            + 1
            + r * (modes * RESISTANCE_EVENTS.len() + stages + 1);
        let quantities =
            modes * (QUANTITIES.len() + r * RESISTANCE_QUANTITIES.len()) + r * (stages + 1);
        Accumulator {
            samples: 0,
            invalid: 0,
            first_invalid: None,
            sums: vec![ExactSum::default(); quantities],
            sketches: vec![Sketch::default(); quantities],
            events: vec![0; events],
            influence: vec![(0, 0); events * inputs],
            resistance,
            mode_entries: modes,
            stage_entries: stages,
        }
    }

    /// Number of stages.
    fn stage_count(&self) -> usize {
        self.stage_entries
    }

    fn inputs(&self) -> usize {
        self.influence
            .len()
            .checked_div(self.events.len())
            .unwrap_or(0)
    }

    fn bump_influence(&mut self, event: usize, bits: &[u64]) {
        let n = bits.len();
        for (k, &b) in bits.iter().enumerate() {
            let slot = &mut self.influence[event * n + k];
            let v = (((slot.0 as u128) << 64) | slot.1 as u128) + b as u128;
            *slot = ((v >> 64) as u64, v as u64);
        }
    }

    /// Adds one valid sample.
    pub fn add(&mut self, samples: &[ModeSample], stage_of: &[usize], bits: &[u64], inv_ln_g: f64) {
        self.samples += 1;
        let nq = QUANTITIES.len();
        let ne = MODE_EVENTS.len();
        let modes = samples.len();
        let mut stage_hit = [false; 64];
        let mut any = false;
        for (j, s) in samples.iter().enumerate() {
            for (q, v) in quantity_values(s).into_iter().enumerate() {
                self.sums[j * nq + q].add(v);
                self.sketches[j * nq + q].add(v, inv_ln_g);
            }
            for (e, hit) in mode_events(s).into_iter().enumerate() {
                if hit {
                    self.events[j * ne + e] += 1;
                    self.bump_influence(j * ne + e, bits);
                }
            }
            if s.exceeds {
                if let Some(h) = stage_hit.get_mut(stage_of[j]) {
                    *h = true;
                }
                any = true;
            }
        }
        let stages = self.stage_count();
        if self.resistance {
            for (j, s) in samples.iter().enumerate() {
                for (q, v) in [s.vortex_utilisation, s.fatigue_damage]
                    .into_iter()
                    .enumerate()
                {
                    let i = resistance_quantity(modes, j, q);
                    self.sums[i].add(v);
                    self.sketches[i].add(v, inv_ln_g);
                }
                for (e, hit) in [s.utilisation_exceeds, s.damage_exceeds]
                    .into_iter()
                    .enumerate()
                {
                    if hit {
                        let i = resistance_event(modes, stages, j, e);
                        self.events[i] += 1;
                        self.bump_influence(i, bits);
                    }
                }
            }
            // Each stage's damage (max over the height of its modes' sum) and the total over
            // the stages; above 1 either fails its stage / the case, as in `check`.
            for st in 0..=stages {
                let v = if st == stages {
                    samples.first().map_or(0.0, |s| s.total_fatigue_damage)
                } else {
                    (0..modes)
                        .find(|&j| stage_of[j] == st)
                        .map_or(0.0, |j| samples[j].stage_fatigue_damage)
                };
                let i = stage_damage_quantity(modes, st);
                self.sums[i].add(v);
                self.sketches[i].add(v, inv_ln_g);
                if v > 1.0 {
                    let e = stage_damage_event(modes, stages, st);
                    self.events[e] += 1;
                    self.bump_influence(e, bits);
                    if st < stages {
                        if let Some(h) = stage_hit.get_mut(st) {
                            *h = true;
                        }
                    }
                    any = true;
                }
            }
        }
        for st in 0..stages.min(64) {
            if stage_hit[st] {
                self.events[modes * ne + st] += 1;
                self.bump_influence(modes * ne + st, bits);
            }
        }
        if any {
            let last = modes * ne + stages;
            self.events[last] += 1;
            self.bump_influence(last, bits);
        }
    }

    /// Records an invalid sample.
    pub fn add_invalid(&mut self, index: u64, message: Option<String>) {
        self.invalid += 1;
        let replace = self.first_invalid.as_ref().is_none_or(|(i, _)| index < *i);
        if replace {
            self.first_invalid = Some((index, message.unwrap_or_default()));
        }
    }

    /// Adds another accumulator (exact; order does not matter).
    pub fn merge(&mut self, o: &Accumulator) {
        self.samples += o.samples;
        self.invalid += o.invalid;
        if let Some((i, m)) = &o.first_invalid {
            self.add_invalid_keep(*i, m);
        }
        for (a, b) in self.sums.iter_mut().zip(&o.sums) {
            a.merge(b);
        }
        for (a, b) in self.sketches.iter_mut().zip(&o.sketches) {
            a.merge(b);
        }
        for (a, b) in self.events.iter_mut().zip(&o.events) {
            *a += b;
        }
        for (a, b) in self.influence.iter_mut().zip(&o.influence) {
            let v = (((a.0 as u128) << 64) | a.1 as u128) + (((b.0 as u128) << 64) | b.1 as u128);
            *a = ((v >> 64) as u64, v as u64);
        }
    }

    fn add_invalid_keep(&mut self, index: u64, message: &str) {
        let replace = self.first_invalid.as_ref().is_none_or(|(i, _)| index < *i);
        if replace {
            self.first_invalid = Some((index, message.to_string()));
        }
    }

    /// The canonical form (sketches trimmed, sums normalised), for serialising.
    pub fn canonical(&self) -> Accumulator {
        Accumulator {
            sums: self.sums.iter().map(ExactSum::canonical).collect(),
            sketches: self.sketches.iter().map(Sketch::canonical).collect(),
            ..self.clone()
        }
    }

    /// Probability of event `e` over the valid samples and its Monte Carlo standard error
    /// sqrt(p (1 - p) / N) (binomial; common practice).
    pub fn probability(&self, e: usize) -> (f64, f64) {
        if self.samples == 0 {
            return (f64::NAN, f64::NAN);
        }
        let n = self.samples as f64;
        let p = self.events[e] as f64 / n;
        (p, (p * (1.0 - p) / n).sqrt())
    }

    /// Influence of input `k` on event `e`: corr(U_k, 1_event) with the population moments
    /// of U (mean 1/2, variance 1/12); `None` when the event has probability 0 or 1.
    pub fn influence(&self, e: usize, k: usize) -> Option<f64> {
        let n = self.samples as f64;
        let (p, _) = self.probability(e);
        if !(p > 0.0 && p < 1.0) {
            return None;
        }
        let (hi, lo) = self.influence[e * self.inputs() + k];
        let sum_bits = ((hi as u128) << 64) | lo as u128;
        // Sum of U = (sum of bits + hits / 2) 2^-53.
        let hits = self.events[e] as f64;
        let sum_u = (sum_bits as f64 + 0.5 * hits) / 9_007_199_254_740_992.0;
        let e_ui = sum_u / n;
        Some((e_ui - 0.5 * p) / ((1.0f64 / 12.0).sqrt() * (p * (1.0 - p)).sqrt()))
    }

    /// Mean of quantity `q` of mode `j`.
    pub fn mean(&self, j: usize, q: usize) -> f64 {
        self.mean_at(j * QUANTITIES.len() + q)
    }

    /// Mean of the quantity at index `i` of `sums` / `sketches`.
    pub fn mean_at(&self, i: usize) -> f64 {
        self.sums[i].value() / self.sketches[i].total as f64
    }
}
