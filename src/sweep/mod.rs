//! Design sweeps: a full grid of case-file values (`--vary KEY=FROM:TO:STEPS`), each variant
//! analysed exactly like `check` (same modal options, same vortex checks), reduced to one row
//! per stage and mode, and the lock-in map over two swept keys.
//!
//! Pure: the grid, the per-variant analysis and the map; reading the case, editing its keys
//! and writing files live in `input`, `commands::sweep` and `report`.
//! Units: the swept values are in the case file's own units (the key names them); results SI.

use std::fmt;

use serde::Serialize;
use thiserror::Error;

use crate::case::{Case, VortexMethod, Wind};
use crate::modal::{analyse_case, ModalError, ModalOptions, StageModes};
use crate::remedy::recheck::ModeContext;
use crate::remedy::required;
use crate::wind::{self, ModeVortex, Verdict};

/// Largest grid accepted (variants).
pub const MAX_VARIANTS: usize = 1_000_000;

/// One swept key: STEPS values from FROM to TO, evenly spaced, ends included.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Vary {
    pub key: String,
    pub from: f64,
    pub to: f64,
    pub steps: usize,
}

/// Why a `--vary` argument is unusable.
#[derive(Debug, Clone, PartialEq, Eq, Error)]
pub enum VaryError {
    #[error("--vary {arg}: {rule}")]
    Bad { arg: String, rule: String },
}

impl Vary {
    /// Parses `KEY=FROM:TO:STEPS`.
    pub fn parse(arg: &str) -> Result<Vary, VaryError> {
        let bad = |rule: &str| VaryError::Bad {
            arg: arg.to_string(),
            rule: rule.to_string(),
        };
        let (key, range) = arg.split_once('=').ok_or_else(|| {
            bad("expected KEY=FROM:TO:STEPS, e.g. shell.elastic_modulus_gpa=28:36:9")
        })?;
        let key = key.trim();
        if key.is_empty() {
            return Err(bad("the key is empty"));
        }
        let parts: Vec<&str> = range.split(':').map(str::trim).collect();
        let [from, to, steps] = parts.as_slice() else {
            return Err(bad("expected FROM:TO:STEPS after the key, e.g. 28:36:9"));
        };
        let num = |s: &str, what: &str| -> Result<f64, VaryError> {
            s.parse::<f64>()
                .ok()
                .filter(|v| v.is_finite())
                .ok_or_else(|| bad(&format!("{what} `{s}` is not a finite number")))
        };
        let from = num(from, "FROM")?;
        let to = num(to, "TO")?;
        let steps: usize = steps
            .parse()
            .map_err(|_| bad(&format!("STEPS `{steps}` is not a whole number >= 1")))?;
        if steps == 0 {
            return Err(bad("STEPS must be at least 1"));
        }
        if steps == 1 && from != to {
            return Err(bad(
                "STEPS = 1 needs FROM = TO (one value); use STEPS >= 2 for a range",
            ));
        }
        Ok(Vary {
            key: key.to_string(),
            from,
            to,
            steps,
        })
    }

    /// The values, ends exact.
    pub fn values(&self) -> Vec<f64> {
        if self.steps == 1 {
            return vec![self.from];
        }
        let n = (self.steps - 1) as f64;
        (0..self.steps)
            .map(|i| {
                if i + 1 == self.steps {
                    self.to
                } else {
                    self.from + (self.to - self.from) * (i as f64 / n)
                }
            })
            .collect()
    }
}

/// Number of variants of the full grid, or `None` above [`MAX_VARIANTS`].
pub fn grid_size(vary: &[Vary]) -> Option<usize> {
    vary.iter()
        .try_fold(1usize, |acc, v| acc.checked_mul(v.steps))
        .filter(|&n| n <= MAX_VARIANTS)
}

/// The values of variant `index` (first key slowest, last key fastest).
pub fn grid_point(vary: &[Vary], index: usize) -> Vec<f64> {
    let mut rest = index;
    let mut idx = vec![0; vary.len()];
    for (k, v) in vary.iter().enumerate().rev() {
        idx[k] = rest % v.steps;
        rest /= v.steps;
    }
    vary.iter().zip(idx).map(|(v, i)| v.values()[i]).collect()
}

/// Index of each key's value in variant `index`.
pub fn grid_indices(vary: &[Vary], index: usize) -> Vec<usize> {
    let mut rest = index;
    let mut idx = vec![0; vary.len()];
    for (k, v) in vary.iter().enumerate().rev() {
        idx[k] = rest % v.steps;
        rest /= v.steps;
    }
    idx
}

/// One stage/mode of one variant.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ModeRow {
    pub stage: String,
    pub mode: usize,
    pub frequency_hz: f64,
    /// Critical speed (EN 1991-1-4 E.1.3.1), m/s; `None` in a modal sweep (no `[wind]`).
    pub critical_speed_m_s: Option<f64>,
    /// Critical over mean speed at the shedding height; `None` in a modal sweep.
    pub speed_ratio: Option<f64>,
    /// Scruton number (EN 1991-1-4 E.4), dimensionless; `None` in a modal sweep.
    pub scruton: Option<f64>,
    /// Governing method's tip amplitude, m (`None` when screened out).
    pub tip_amplitude_m: Option<f64>,
    /// Governing method's largest across-wind stress, Pa (`None` when screened out).
    pub max_stress_pa: Option<f64>,
    /// Smallest structural log decrement that brings the mode within the criteria, by the
    /// governing EN approach (approach 1 when GB 50009 governs), as `check`'s remedy table
    /// sizes it: `None` when the mode needs none (within the criteria, screened out or
    /// not judged) and when no decrement up to
    /// [`crate::remedy::required::MAX_LOG_DECREMENT`] suffices ([`Self::damping_remedy`]
    /// tells the two apart). Always finite: no `inf` reaches sweep.csv.
    pub required_log_decrement: Option<f64>,
    /// Whether damping was needed and could be sized (see [`DampingRemedy`]).
    pub damping_remedy: DampingRemedy,
    pub verdict: Verdict,
    /// Base moment of the vortex case at v_crit, sqrt(M_across^2 + M_along,crit^2), over the
    /// along-wind design base moment (EN 1991-1-4 6.3.1); `None` without the EN site wind
    /// or when the mode has no across-wind load.
    pub combined_to_along_base_ratio: Option<f64>,
}

/// The damping answer of a mode in a sweep row.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub enum DampingRemedy {
    /// Within the criteria, screened out, or not judged.
    NotNeeded,
    /// A structural log decrement within the search range suffices (the row's
    /// `required_log_decrement`).
    Sized,
    /// No structural log decrement up to [`crate::remedy::required::MAX_LOG_DECREMENT`]
    /// brings the mode within the criteria: damping alone cannot.
    BeyondSearch,
}

impl std::fmt::Display for DampingRemedy {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            DampingRemedy::NotNeeded => f.write_str("not needed"),
            DampingRemedy::Sized => f.write_str("sized"),
            DampingRemedy::BeyondSearch => write!(
                f,
                "beyond log decrement {}: damping alone cannot",
                crate::remedy::required::MAX_LOG_DECREMENT
            ),
        }
    }
}

/// What one variant gave.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub enum VariantOutcome {
    /// Analysed: one row per stage and checked mode.
    Rows(Vec<ModeRow>),
    /// The variant breaks a case-file rule (message names the field).
    Invalid(String),
    /// The modal analysis refused the variant.
    Failed(String),
}

/// One variant: its grid values and outcome.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Variant {
    pub index: usize,
    pub values: Vec<f64>,
    pub outcome: VariantOutcome,
}

/// Why one variant could not be analysed.
#[derive(Debug, thiserror::Error)]
pub enum VariantError {
    #[error(transparent)]
    Modal(#[from] ModalError),
    #[error(transparent)]
    Wind(#[from] wind::WindError),
    #[error(transparent)]
    Along(#[from] crate::along::AlongError),
}

/// Analyses one valid variant exactly as `check` does (default mesh, `vortex.modes` modes).
pub fn analyse_variant(case: &Case) -> Result<Vec<ModeRow>, VariantError> {
    let stages = analyse_case(
        case,
        ModalOptions {
            modes: case.vortex.modes,
            min_elements: None,
        },
    )?;
    if case.wind.is_none() {
        return Ok(modal_rows(&stages));
    }
    let vortex = wind::check_all(case, &stages)?;
    let along = crate::along::check_all(case, &stages, &vortex)?;
    Ok(vortex
        .stages
        .iter()
        .zip(&stages)
        .enumerate()
        .flat_map(|(i, (s, sm))| {
            let along = along.as_ref().and_then(|a| a.get(i));
            s.modes.iter().map(move |m| {
                let ratio = along.and_then(|a| {
                    let design = a.moment_nm.first()?.1;
                    let comb = a.modes.iter().find(|c| c.mode == m.mode)?;
                    Some(comb.combined_moment_nm.first()?.1 / design)
                });
                let g = m.governing_summary();
                let need = required_log_decrement(case, &s.climate.wind, sm, m);
                ModeRow {
                    stage: s.stage.clone(),
                    mode: m.mode,
                    frequency_hz: m.frequency_hz,
                    critical_speed_m_s: Some(m.critical_speed_m_s),
                    speed_ratio: Some(m.speed_ratio),
                    scruton: Some(m.scruton),
                    tip_amplitude_m: g.tip_amplitude_m,
                    max_stress_pa: g.max_stress_pa,
                    required_log_decrement: need.log_decrement(),
                    damping_remedy: need.remedy(),
                    verdict: m.verdict.clone(),
                    combined_to_along_base_ratio: ratio,
                }
            })
        })
        .collect())
}

/// Rows of a modal sweep (a case without `[wind]`): frequencies only, nothing judged.
fn modal_rows(stages: &[StageModes]) -> Vec<ModeRow> {
    stages
        .iter()
        .flat_map(|sm| {
            sm.modes.iter().map(move |m| ModeRow {
                stage: sm.stage.name.clone(),
                mode: m.number,
                frequency_hz: m.frequency_hz,
                critical_speed_m_s: None,
                speed_ratio: None,
                scruton: None,
                tip_amplitude_m: None,
                max_stress_pa: None,
                required_log_decrement: None,
                damping_remedy: DampingRemedy::NotNeeded,
                verdict: Verdict::NotJudged,
                combined_to_along_base_ratio: None,
            })
        })
        .collect()
}

/// The structural log decrement a failing mode needs (see
/// [`ModeRow::required_log_decrement`]); the same search as `check`'s remedy table.
fn required_log_decrement(case: &Case, wind: &Wind, sm: &StageModes, m: &ModeVortex) -> Need {
    if !m.verdict.is_exceeds() || m.screened_out {
        return Need(None);
    }
    let Some(mode) = sm.modes.iter().find(|x| x.number == m.mode) else {
        return Need(None);
    };
    let ctx = ModeContext::new(case, wind, &sm.model, mode, m);
    let req = match ctx.governing_en() {
        VortexMethod::En1991E2 => required::required(&ctx, |d| ctx.approach2_y_m(d)),
        _ => required::required(&ctx, |d| ctx.approach1_y_m(d, |_| 1.0)),
    };
    if req.already_meets {
        Need(None)
    } else {
        Need(Some(req.log_decrement))
    }
}

/// Outcome of the damping search: `None` = not needed; `Some(None)` = beyond the search.
struct Need(Option<Option<f64>>);

impl Need {
    fn log_decrement(&self) -> Option<f64> {
        self.0.flatten()
    }

    fn remedy(&self) -> DampingRemedy {
        match self.0 {
            None => DampingRemedy::NotNeeded,
            Some(Some(_)) => DampingRemedy::Sized,
            Some(None) => DampingRemedy::BeyondSearch,
        }
    }
}

/// Severity class of a variant for the lock-in map, worst first in [`Class::ALL`].
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Serialize)]
pub enum Class {
    /// Every checked mode screened out (E.1.2).
    Clear,
    /// Responses within every criterion.
    Ok,
    /// No criteria given: nothing judged.
    NotJudged,
    /// Some criterion exceeded.
    Exceeds,
    /// Invalid variant or failed analysis.
    Invalid,
}

impl Class {
    pub const ALL: [Class; 5] = [
        Class::Invalid,
        Class::Exceeds,
        Class::NotJudged,
        Class::Ok,
        Class::Clear,
    ];

    pub fn label(self) -> &'static str {
        match self {
            Class::Clear => "clear",
            Class::Ok => "ok",
            Class::NotJudged => "not judged",
            Class::Exceeds => "exceeds",
            Class::Invalid => "invalid",
        }
    }
}

impl fmt::Display for Class {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.label())
    }
}

/// Worst class over a variant's rows, and the smallest speed ratio (most at risk).
pub fn summarise(outcome: &VariantOutcome) -> (Class, Option<f64>) {
    match outcome {
        VariantOutcome::Rows(rows) => {
            let class = rows
                .iter()
                .map(|r| match r.verdict {
                    Verdict::Clear => Class::Clear,
                    Verdict::Ok => Class::Ok,
                    Verdict::NotJudged => Class::NotJudged,
                    Verdict::Exceeds(_) => Class::Exceeds,
                })
                .max()
                .unwrap_or(Class::Clear);
            let ratio = rows
                .iter()
                .filter_map(|r| r.speed_ratio)
                .fold(None, |a: Option<f64>, r| Some(a.map_or(r, |a| a.min(r))));
            (class, ratio)
        }
        _ => (Class::Invalid, None),
    }
}

/// One cell of the lock-in map.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct MapCell {
    pub x_index: usize,
    pub y_index: usize,
    pub class: Class,
    pub min_speed_ratio: Option<f64>,
}

/// The lock-in map over two swept keys (x = first, y = second); with more keys, each cell
/// shows the worst class and smallest ratio over the other keys' values.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct LockInMap {
    pub x: Vary,
    pub y: Vary,
    /// The swept keys the map does not show: each cell is the worst case over them.
    pub hidden: Vec<Vary>,
    pub cells: Vec<MapCell>,
}

impl LockInMap {
    /// One line saying that each cell is the worst case over the keys the map does not
    /// show, or `None` when the map shows every swept key.
    pub fn hidden_keys_note(&self) -> Option<String> {
        if self.hidden.is_empty() {
            return None;
        }
        let keys: Vec<String> = self
            .hidden
            .iter()
            .map(|v| format!("{} ({} values, {} to {})", v.key, v.steps, v.from, v.to))
            .collect();
        let combos: usize = self.hidden.iter().map(|v| v.steps).product();
        Some(format!(
            "Each cell is the WORST case over {combos} combinations of the key{} not shown: {};              sweep.csv has every variant.",
            if self.hidden.len() == 1 { "" } else { "s" },
            keys.join(", ")
        ))
    }
}

/// Builds the map over keys `kx`, `ky` of the grid.
pub fn lock_in_map(vary: &[Vary], kx: usize, ky: usize, variants: &[Variant]) -> LockInMap {
    let (nx, ny) = (vary[kx].steps, vary[ky].steps);
    let mut cells: Vec<MapCell> = (0..nx * ny)
        .map(|i| MapCell {
            x_index: i % nx,
            y_index: i / nx,
            class: Class::Clear,
            min_speed_ratio: None,
        })
        .collect();
    let mut seen = vec![false; nx * ny];
    for v in variants {
        let idx = grid_indices(vary, v.index);
        let c = idx[ky] * nx + idx[kx];
        let (class, ratio) = summarise(&v.outcome);
        let cell = &mut cells[c];
        cell.class = if seen[c] {
            cell.class.max(class)
        } else {
            class
        };
        seen[c] = true;
        cell.min_speed_ratio = match (cell.min_speed_ratio, ratio) {
            (Some(a), Some(b)) => Some(a.min(b)),
            (a, b) => a.or(b),
        };
    }
    LockInMap {
        x: vary[kx].clone(),
        y: vary[ky].clone(),
        hidden: vary
            .iter()
            .enumerate()
            .filter(|(k, _)| *k != kx && *k != ky)
            .map(|(_, v)| v.clone())
            .collect(),
        cells,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn parses_and_spaces_values() {
        let v = Vary::parse("shell.elastic_modulus_gpa=28:36:5").unwrap();
        assert_eq!(v.values(), vec![28.0, 30.0, 32.0, 34.0, 36.0]);
        assert_eq!(Vary::parse("a=1:1:1").unwrap().values(), vec![1.0]);
        assert!(Vary::parse("a=1:2").is_err());
        assert!(Vary::parse("a=1:2:0").is_err());
        assert!(Vary::parse("a=1:2:1").is_err());
        assert!(Vary::parse("a=x:2:3").is_err());
        assert!(Vary::parse("=1:2:3").is_err());
        // Ends are exact even when the step is not representable.
        let v = Vary::parse("k=0.1:0.7:7").unwrap().values();
        assert_eq!(v[6], 0.7);
    }

    #[test]
    fn grid_order_is_first_key_slowest() {
        let vary = vec![
            Vary::parse("a=0:1:2").unwrap(),
            Vary::parse("b=10:30:3").unwrap(),
        ];
        assert_eq!(grid_size(&vary), Some(6));
        let pts: Vec<Vec<f64>> = (0..6).map(|i| grid_point(&vary, i)).collect();
        assert_eq!(pts[0], vec![0.0, 10.0]);
        assert_eq!(pts[1], vec![0.0, 20.0]);
        assert_eq!(pts[5], vec![1.0, 30.0]);
        let big = vec![Vary::parse("a=0:1:2000").unwrap(); 2];
        assert_eq!(grid_size(&big), None);
    }

    #[test]
    fn map_names_the_hidden_keys() {
        let vary = vec![
            Vary::parse("a=0:1:2").unwrap(),
            Vary::parse("b=10:30:3").unwrap(),
            Vary::parse("c=5:6:4").unwrap(),
        ];
        let variants: Vec<Variant> = (0..24)
            .map(|i| Variant {
                index: i,
                values: grid_point(&vary, i),
                outcome: VariantOutcome::Invalid("x".into()),
            })
            .collect();
        let map = lock_in_map(&vary, 0, 1, &variants);
        assert_eq!(map.hidden, vec![vary[2].clone()]);
        let note = map.hidden_keys_note().unwrap();
        assert!(
            note.contains(
                "WORST case over 4 combinations of the key not shown: c (4 values, 5 to 6)"
            ),
            "{note}"
        );
        assert!(lock_in_map(&vary[..2], 0, 1, &variants[..6])
            .hidden_keys_note()
            .is_none());
    }
}
