//! Outputs of `risk` and `risk-merge`, built only from the run's header and its merged
//! statistics, so a merge of shards writes byte for byte what the unsharded run writes:
//! `risk.csv` (contract columns), `summary.json` (a `risk` section), `risk.html` (the note,
//! with the plots inline), `risk_histograms.svg`, `risk_influence.svg` (tornado of the
//! influence of each input on the probability of exceeding a criterion), and the rows of
//! `risk_samples.csv`.
//!
//! Numbers are written as the shortest text that reads back to the same f64. Histograms
//! are drawn from the quantile sketch's bins (each bin counted at its centre).
//! Units: SI, in every column name. The plots are in `risk_plots`.

use std::fmt::Write as _;

use serde::Serialize;

use super::csv::safe_text;
use super::ReportError;
use crate::risk::kernel::ModeSample;
use crate::risk::stats::RELATIVE_ACCURACY;
use crate::risk::{
    resistance_event, resistance_quantity, stage_damage_event, stage_damage_quantity, Accumulator,
    Partial, RiskHeader, MODE_EVENTS, QUANTITIES, RESISTANCE_QUANTITIES, STAGE_DAMAGE_QUANTITY,
    TOTAL_DAMAGE_QUANTITY,
};

pub use super::risk_note::risk_html;
pub use super::risk_plots::{histograms_svg, influence_svg};

pub(crate) fn num(v: f64) -> String {
    if v.is_finite() {
        format!("{v}")
    } else {
        String::new()
    }
}

/// One risk.csv row.
#[derive(Debug, Clone, Serialize)]
pub struct RiskRow {
    pub stage: String,
    pub mode: String,
    pub quantity: String,
    pub mean: Option<f64>,
    pub p05: Option<f64>,
    pub p50: Option<f64>,
    pub p95: Option<f64>,
    pub probability_exceeding: Option<f64>,
    pub standard_error: Option<f64>,
    /// Event index behind the probability (for the influence), not written to the CSV.
    #[serde(skip)]
    pub event: Option<usize>,
}

/// A row of sketch `i` of `a` (mean and percentiles) with its event's probability and
/// standard error; `text` = (stage, mode, quantity).
fn sketch_row(
    text: (String, String, String),
    a: &Accumulator,
    i: usize,
    (p, se): (Option<f64>, Option<f64>),
    event: usize,
) -> RiskRow {
    let sk = &a.sketches[i];
    RiskRow {
        stage: text.0,
        mode: text.1,
        quantity: text.2,
        mean: (sk.total > 0).then(|| a.mean_at(i)),
        p05: sk.quantile(0.05),
        p50: sk.quantile(0.50),
        p95: sk.quantile(0.95),
        probability_exceeding: p,
        standard_error: se,
        event: Some(event),
    }
}

/// Every row, in risk.csv order.
pub fn rows(h: &RiskHeader, a: &Accumulator) -> Vec<RiskRow> {
    let mut out = Vec::new();
    let ne = MODE_EVENTS.len();
    let nq = QUANTITIES.len();
    let prob = |e: usize| {
        let (p, se) = a.probability(e);
        (p.is_finite().then_some(p), se.is_finite().then_some(se))
    };
    for (j, m) in h.modes.iter().enumerate() {
        for (q, name) in QUANTITIES.iter().enumerate() {
            let sk = &a.sketches[j * nq + q];
            let event = match *name {
                "tip_amplitude_m" if h.tip_criterion => Some(j * ne + 1),
                "max_stress_pa" if h.stress_criterion => Some(j * ne + 2),
                _ => None,
            };
            let (p, se) = event.map_or((None, None), prob);
            out.push(RiskRow {
                stage: m.stage.clone(),
                mode: m.mode.to_string(),
                quantity: name.to_string(),
                mean: (sk.total > 0).then(|| a.mean(j, q)),
                p05: sk.quantile(0.05),
                p50: sk.quantile(0.50),
                p95: sk.quantile(0.95),
                probability_exceeding: p,
                standard_error: se,
                event,
            });
        }
        if h.resistance {
            // EN 1992-1-1: P(utilisation > 1), P(damage > 1) on the quantity rows, as the
            // tip and stress criteria are on theirs.
            let modes = h.modes.len();
            for (q, name) in RESISTANCE_QUANTITIES.iter().enumerate() {
                let i = resistance_quantity(modes, j, q);
                let event = resistance_event(modes, h.stages.len(), j, q);
                let text = (m.stage.clone(), m.mode.to_string(), name.to_string());
                out.push(sketch_row(text, a, i, prob(event), event));
            }
        }
        for (e, name) in MODE_EVENTS.iter().enumerate() {
            if (e == 0) || (e == 3 && h.judged) {
                let (p, se) = prob(j * ne + e);
                out.push(RiskRow {
                    stage: m.stage.clone(),
                    mode: m.mode.to_string(),
                    quantity: name.to_string(),
                    mean: None,
                    p05: None,
                    p50: None,
                    p95: None,
                    probability_exceeding: p,
                    standard_error: se,
                    event: Some(j * ne + e),
                });
            }
        }
    }
    if h.resistance {
        // EN 1992-1-1 6.8.4: each stage's damage summed over its modes at every height, and
        // the total over the stages, as `check` judges them; P(> 1) on the rows.
        let (modes, stages) = (h.modes.len(), h.stages.len());
        for s in 0..=stages {
            let i = stage_damage_quantity(modes, s);
            let event = stage_damage_event(modes, stages, s);
            let quantity = if s < stages {
                STAGE_DAMAGE_QUANTITY
            } else {
                TOTAL_DAMAGE_QUANTITY
            };
            let stage = h.stages.get(s).cloned().unwrap_or_default();
            let text = (stage, String::new(), quantity.to_string());
            out.push(sketch_row(text, a, i, prob(event), event));
        }
    }
    if h.judged {
        let base = h.modes.len() * ne;
        for (s, name) in h.stages.iter().enumerate() {
            let (p, se) = prob(base + s);
            out.push(RiskRow {
                stage: name.clone(),
                mode: String::new(),
                quantity: "exceeds_any_mode".into(),
                mean: None,
                p05: None,
                p50: None,
                p95: None,
                probability_exceeding: p,
                standard_error: se,
                event: Some(base + s),
            });
        }
        let (p, se) = prob(base + h.stages.len());
        out.push(RiskRow {
            stage: String::new(),
            mode: String::new(),
            quantity: "exceeds_any".into(),
            mean: None,
            p05: None,
            p50: None,
            p95: None,
            probability_exceeding: p,
            standard_error: se,
            event: Some(base + h.stages.len()),
        });
    }
    out
}

fn fmt_err(file: &str) -> impl Fn(::csv::Error) -> ReportError + '_ {
    move |e| ReportError::Format {
        file: file.into(),
        message: e.to_string(),
    }
}

/// risk.csv bytes.
pub fn risk_csv(h: &RiskHeader, a: &Accumulator) -> Result<Vec<u8>, ReportError> {
    let mut w = ::csv::Writer::from_writer(Vec::new());
    let err = fmt_err("risk.csv");
    w.write_record([
        "stage",
        "mode",
        "quantity",
        "mean",
        "p05",
        "p50",
        "p95",
        "probability_exceeding",
        "standard_error",
    ])
    .map_err(&err)?;
    let o = |v: Option<f64>| v.map(num).unwrap_or_default();
    for r in rows(h, a) {
        w.write_record([
            safe_text(&r.stage),
            r.mode.clone(),
            r.quantity.clone(),
            o(r.mean),
            o(r.p05),
            o(r.p50),
            o(r.p95),
            o(r.probability_exceeding),
            o(r.standard_error),
        ])
        .map_err(&err)?;
    }
    w.into_inner().map_err(|e| ReportError::Format {
        file: "risk.csv".into(),
        message: e.to_string(),
    })
}

/// Influence of each input on one event, largest |r| first: (key, r).
pub fn influence_ranking(h: &RiskHeader, a: &Accumulator, event: usize) -> Vec<(String, f64)> {
    let mut v: Vec<(String, f64)> = h
        .inputs
        .iter()
        .enumerate()
        .filter_map(|(k, i)| a.influence(event, k).map(|r| (i.key.clone(), r)))
        .collect();
    v.sort_by(|x, y| y.1.abs().total_cmp(&x.1.abs()).then(x.0.cmp(&y.0)));
    v
}

/// The headline event of each stage for the tornado: "exceeds any mode" when judged, else
/// mode 1's E.1.2 range.
pub(crate) fn headline_events(h: &RiskHeader) -> Vec<(String, usize)> {
    let ne = MODE_EVENTS.len();
    h.stages
        .iter()
        .enumerate()
        .filter_map(|(s, name)| {
            if h.judged {
                Some((format!("{name}: exceeds any mode"), h.modes.len() * ne + s))
            } else {
                let j = h.stage_of.iter().position(|&x| x == s)?;
                Some((
                    format!("{name}: mode {} in E.1.2 range", h.modes[j].mode),
                    j * ne,
                ))
            }
        })
        .collect()
}

#[derive(Serialize)]
struct InfluenceJson {
    key: String,
    rank_correlation: f64,
    standard_error: f64,
}

#[derive(Serialize)]
struct RowJson {
    #[serde(flatten)]
    row: RiskRow,
    influence: Vec<InfluenceJson>,
}

#[derive(Serialize)]
struct RiskJson<'a> {
    case_file: &'a str,
    case_sha256: &'a str,
    title: &'a str,
    samples: u64,
    valid_samples: u64,
    invalid_samples: u64,
    seed: u64,
    method: &'a str,
    inputs: &'a [crate::risk::InputInfo],
    /// The modes over the shell stiffness (E or a stiffness factor on base springs).
    #[serde(skip_serializing_if = "Option::is_none")]
    stiffness_family: Option<&'a crate::risk::stiffness_family::FamilyInfo>,
    #[serde(skip_serializing_if = "Option::is_none")]
    stiffness_family_error: Option<&'a str>,
    rank_correlations: &'a [crate::risk::correlation::CorrelationInfo],
    correlation_method: &'static str,
    percentile_relative_accuracy: f64,
    percentile_method: &'static str,
    influence_method: String,
    rows: Vec<RowJson>,
    cautions: &'static [&'static str],
}

#[derive(Serialize)]
struct SummaryJson<'a> {
    risk: RiskJson<'a>,
}

/// How percentiles are computed (note and summary.json).
pub const PERCENTILE_METHOD: &str = "logarithmic-bin quantile sketch (mergeable): a \
     percentile is within a relative 1e-4 of the sample order statistic of rank ceil(q N)";
/// How influence is computed (note and summary.json).
pub const INFLUENCE_METHOD: &str = "rank correlation between each input's population rank \
     U = F(X) and the event indicator, using the population moments of U (mean 1/2, \
     variance 1/12); standard error about (1 - r^2) / sqrt(N)";

/// How the resistance quantities are sampled (note).
pub const RESISTANCE_METHOD: &str = "Resistance (--with-resistance): per stage and mode \
     vortex_utilisation = max over the height of gamma_Q M_vortex / M_Rd(N_Ed) (EN 1992-1-1 \
     6.1, the vortex action of check) and fatigue_damage = the mode's Miner sum of the \
     vertical bars at its worst height (EN 1992-1-1 6.8.4, Table 6.3N, cracked-section bar \
     stress range with the sample's concrete E); probability_exceeding of each is P(> 1), \
     and either counts in the mode's exceeds. Samples that keep the modes scale the case's \
     moment curves by (n / n_case)^2 y (exact: shapes, N_Ed and M_Rd unchanged); on base \
     springs, E and stiffness-factor samples take the moment curves of the stiffness family \
     (interpolated over full solves, see its section). As check \
     judges it, stage_fatigue_damage is the largest sum over the stage's modes at one height \
     and total_fatigue_damage the sum over the stages; either above 1 also counts in the \
     stage's exceeds_any_mode and the case's exceeds_any";

/// How correlated inputs are sampled (note and summary.json).
pub const CORRELATION_METHOD: &str = "Gaussian copula: each sample's independent uniforms of \
     the correlated inputs become standard normals, are correlated with the Cholesky factor of \
     the normal-score matrix R_ij = 2 sin(pi rho_ij / 6) (Pearson 1907; the Spearman rank \
     correlation of the copula is then exactly rho_ij) and mapped back through Phi and each \
     input's own (truncated) quantile, so every marginal is unchanged";

/// What the influence measures when inputs are correlated.
pub const CORRELATED_INFLUENCE: &str = "With correlated inputs the influence of an input \
     measures its total association with the event (its own effect plus that of the inputs \
     correlated with it), not its unique contribution";

/// The influence method as written for this run.
pub fn influence_method(h: &RiskHeader) -> String {
    if h.correlations.is_empty() {
        INFLUENCE_METHOD.to_string()
    } else {
        format!("{INFLUENCE_METHOD}. {CORRELATED_INFLUENCE}")
    }
}

/// summary.json bytes.
pub fn summary_json(h: &RiskHeader, a: &Accumulator) -> Result<Vec<u8>, ReportError> {
    let n = a.samples as f64;
    let rows = rows(h, a)
        .into_iter()
        .map(|r| {
            let influence = r
                .event
                .map(|e| {
                    influence_ranking(h, a, e)
                        .into_iter()
                        .map(|(key, r)| InfluenceJson {
                            key,
                            rank_correlation: r,
                            standard_error: (1.0 - r * r) / n.sqrt(),
                        })
                        .collect()
                })
                .unwrap_or_default();
            RowJson { row: r, influence }
        })
        .collect();
    let s = SummaryJson {
        risk: RiskJson {
            case_file: &h.case_file,
            case_sha256: &h.case_sha256,
            title: &h.title,
            samples: h.samples,
            valid_samples: a.samples,
            invalid_samples: a.invalid,
            seed: h.seed,
            method: &h.method,
            inputs: &h.inputs,
            stiffness_family: h.stiffness_family.as_ref(),
            stiffness_family_error: h.stiffness_family_error.as_deref(),
            rank_correlations: &h.correlations,
            correlation_method: if h.correlations.is_empty() {
                "none: the inputs are sampled independently"
            } else {
                CORRELATION_METHOD
            },
            percentile_relative_accuracy: RELATIVE_ACCURACY,
            percentile_method: PERCENTILE_METHOD,
            influence_method: influence_method(h),
            rows,
            cautions: super::CAUTIONS,
        },
    };
    let mut v = serde_json::to_vec_pretty(&s).map_err(|e| ReportError::Format {
        file: "summary.json".into(),
        message: e.to_string(),
    })?;
    v.push(b'\n');
    Ok(v)
}

/// risk_partial.json bytes (compact).
pub fn partial_json(p: &Partial) -> Result<Vec<u8>, ReportError> {
    serde_json::to_vec(p).map_err(|e| ReportError::Format {
        file: "risk_partial.json".into(),
        message: e.to_string(),
    })
}

/// Header line of risk_samples.csv.
pub fn samples_header(h: &RiskHeader) -> Vec<u8> {
    let mut w = ::csv::Writer::from_writer(Vec::new());
    let mut rec: Vec<String> = vec!["sample".into()];
    rec.extend(h.inputs.iter().map(|i| safe_text(&i.key)));
    for c in [
        "stage",
        "mode",
        "frequency_hz",
        "critical_speed_m_s",
        "scruton",
        "tip_amplitude_m",
        "max_stress_pa",
    ] {
        rec.push(c.into());
    }
    if h.resistance {
        rec.extend(RESISTANCE_QUANTITIES.iter().map(|c| c.to_string()));
        // The stage's and the case's damage, repeated on each of the stage's rows.
        rec.extend([STAGE_DAMAGE_QUANTITY.into(), TOTAL_DAMAGE_QUANTITY.into()]);
    }
    rec.push("verdict".into());
    let _ = w.write_record(&rec);
    w.into_inner().unwrap_or_default()
}

/// Writer of one sample's rows of risk_samples.csv (one row per stage and mode; an invalid
/// sample is one row with verdict `invalid`).
pub fn sample_row_writer(h: &RiskHeader) -> Box<crate::risk::run::RowWriter> {
    let names: Vec<(String, String)> = h
        .modes
        .iter()
        .map(|m| (safe_text(&m.stage), m.mode.to_string()))
        .collect();
    let judged = h.judged;
    let resistance = h.resistance;
    Box::new(
        move |i: u64, values: &[f64], res: Option<&[ModeSample]>, out: &mut Vec<u8>| {
            let mut w = ::csv::WriterBuilder::new().from_writer(Vec::new());
            let keys: Vec<String> = values.iter().map(|&x| num(x)).collect();
            match res {
                None => {
                    let mut rec = vec![i.to_string()];
                    rec.extend(keys.iter().cloned());
                    let blanks = 7 + if resistance { 4 } else { 0 };
                    rec.extend(std::iter::repeat_n(String::new(), blanks));
                    rec.push("invalid".into());
                    let _ = w.write_record(&rec);
                }
                Some(r) => {
                    for (s, (stage, mode)) in r.iter().zip(&names) {
                        let verdict = if !judged {
                            "not judged"
                        } else if !s.in_range {
                            "clear"
                        } else if s.exceeds {
                            "exceeds"
                        } else {
                            "ok"
                        };
                        let mut rec = vec![i.to_string()];
                        rec.extend(keys.iter().cloned());
                        rec.extend([
                            stage.clone(),
                            mode.clone(),
                            num(s.frequency_hz),
                            num(s.critical_speed_m_s),
                            num(s.scruton),
                            num(s.tip_amplitude_m),
                            num(s.max_stress_pa),
                        ]);
                        if resistance {
                            rec.extend([
                                num(s.vortex_utilisation),
                                num(s.fatigue_damage),
                                num(s.stage_fatigue_damage),
                                num(s.total_fatigue_damage),
                            ]);
                        }
                        rec.push(verdict.into());
                        let _ = w.write_record(&rec);
                    }
                }
            }
            out.extend_from_slice(&w.into_inner().unwrap_or_default());
        },
    )
}

/// The lines printed after a run.
pub fn stdout_summary(h: &RiskHeader, a: &Accumulator) -> String {
    let mut s = format!(
        "{} valid samples, {} invalid; percentiles within a relative {RELATIVE_ACCURACY:e}\n",
        a.samples, a.invalid
    );
    for r in rows(h, a) {
        if r.quantity == "exceeds_any_mode" || r.quantity == "exceeds_any" {
            let _ = writeln!(
                s,
                "  P({} {}) = {} +- {} (standard error)",
                if r.stage.is_empty() {
                    "case"
                } else {
                    r.stage.as_str()
                },
                r.quantity.replace('_', " "),
                // Four decimals: finer than any standard error the terminal line shows.
                r.probability_exceeding
                    .map(|p| format!("{p:.4}"))
                    .unwrap_or_default(),
                r.standard_error
                    .map(|v| format!("{v:.2e}"))
                    .unwrap_or_default()
            );
        }
    }
    s.push_str(
        "Screening tool: results must be checked by a licensed engineer against the local code and National Annex.\n",
    );
    s
}
