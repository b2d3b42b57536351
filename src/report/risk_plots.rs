//! Plots of the risk note: `risk_histograms.svg` (per stage and mode, the distribution of the
//! tip amplitude of the samples inside the E.1.2 range, or of the frequency when none is,
//! drawn from the quantile sketch's bins, each counted at its centre; with the resistance
//! quantities also each stage's fatigue damage on a log10 axis with the D = 1 limit, and the
//! vortex utilisation of every mode some sample brings into lock-in, with its limit 1) and
//! `risk_influence.svg` (a tornado per stage: the rank correlation of each input with the
//! stage's headline probability, largest first). Hand-written SVG in the project's palette;
//! bars carry their value as text, so the plots read in greyscale.
//! Units: those of the quantity (m, Hz); correlations dimensionless.

use std::fmt::Write as _;

use super::note::html_escape as escape;
use super::risk::{headline_events, influence_ranking, num};
use crate::risk::stats::{Sketch, RELATIVE_ACCURACY};
use crate::risk::{
    resistance_quantity, stage_damage_quantity, Accumulator, RiskHeader, QUANTITIES,
};

/// Histogram counts of the non-zero values of a sketch over `bins` equal bins between its
/// 0.1 % and 99.9 % points: (low edge, width, counts).
fn histogram(sk: &Sketch, bins: usize, log: bool) -> Option<(f64, f64, Vec<u64>)> {
    let nonzero = sk.total - sk.zeros;
    if nonzero == 0 {
        return None;
    }
    let q = |p: f64| {
        let rank_share = (sk.zeros as f64 + p * nonzero as f64) / sk.total as f64;
        sk.quantile(rank_share.min(1.0))
    };
    let axis = |v: f64| if log { v.log10() } else { v };
    let (lo, hi) = (axis(q(0.001)?), axis(q(0.999)?));
    let (lo, hi) = if hi > lo {
        (lo, hi)
    } else if log {
        (lo - 0.5, lo + 0.5)
    } else {
        (lo * 0.99, lo * 1.01 + 1e-300)
    };
    let width = (hi - lo) / bins as f64;
    let mut counts = vec![0u64; bins];
    let g = (1.0 + RELATIVE_ACCURACY) / (1.0 - RELATIVE_ACCURACY);
    for (k, &n) in sk.counts.iter().enumerate() {
        if n == 0 {
            continue;
        }
        let (_, top) = Sketch::bin_edges(sk.offset + k as i32);
        let centre = axis(2.0 * top / (g + 1.0));
        let b = ((centre - lo) / width).floor();
        let b = if b < 0.0 {
            0
        } else {
            (b as usize).min(bins - 1)
        };
        counts[b] += n;
    }
    Some((lo, width, counts))
}

const PANEL_W: f64 = 320.0;
const PANEL_H: f64 = 190.0;

/// risk_histograms.svg: per stage and mode, the tip amplitude of the samples within the
/// E.1.2 range (or the frequency when no sample is); with the resistance quantities, per
/// stage also the fatigue damage (max over the height of the sum over the modes) on a
/// log10 axis, since it spans decades.
pub fn histograms_svg(h: &RiskHeader, a: &Accumulator) -> String {
    let cols = 3usize;
    let stages = if a.resistance { h.stages.len() } else { 0 };
    // With the resistance quantities: the vortex utilisation of every mode some sample
    // brings into lock-in (EN 1992-1-1 6.1, limit 1).
    let utilisation: Vec<(usize, &Sketch)> = if a.resistance {
        (0..h.modes.len())
            .map(|j| (j, &a.sketches[resistance_quantity(h.modes.len(), j, 0)]))
            .filter(|(_, sk)| sk.total > sk.zeros)
            .collect()
    } else {
        Vec::new()
    };
    let n = (h.modes.len() + stages + utilisation.len()).max(1);
    let rows_n = n.div_ceil(cols);
    let (w, ht) = (PANEL_W * cols as f64, 50.0 + PANEL_H * rows_n as f64);
    let mut s = String::new();
    let _ = writeln!(
        s,
        r#"<svg xmlns="http://www.w3.org/2000/svg" width="{w:.0}" height="{ht:.0}" viewBox="0 0 {w:.0} {ht:.0}" font-family="sans-serif" font-size="11">"#
    );
    let _ = writeln!(
        s,
        r#"<rect width="100%" height="100%" fill="white"/><text x="10" y="24" font-size="15" font-weight="bold">Distribution per stage and mode ({} samples)</text>"#,
        a.samples
    );
    let nq = QUANTITIES.len();
    let at = |k: usize| {
        (
            PANEL_W * (k % cols) as f64 + 40.0,
            50.0 + PANEL_H * (k / cols) as f64,
        )
    };
    for (j, m) in h.modes.iter().enumerate() {
        let tip = &a.sketches[j * nq + 3];
        let (sk, what) = if tip.total > tip.zeros {
            (tip, "tip amplitude, m")
        } else {
            (&a.sketches[j * nq], "frequency, Hz")
        };
        let title = format!("{} mode {}", m.stage, m.mode);
        panel(&mut s, at(j), &title, sk, what, false, None);
    }
    for (st, name) in h.stages.iter().enumerate().take(stages) {
        let sk = &a.sketches[stage_damage_quantity(h.modes.len(), st)];
        let title = format!("{name}: fatigue damage");
        // D = 1: the EN 1992-1-1 6.8.4 limit of the damage sum (0 on the log10 axis).
        panel(
            &mut s,
            at(h.modes.len() + st),
            &title,
            sk,
            "log10 of the stage's damage D",
            true,
            Some((0.0, "D = 1")),
        );
    }
    for (k, &(j, sk)) in utilisation.iter().enumerate() {
        let m = &h.modes[j];
        let title = format!("{} mode {}: vortex utilisation", m.stage, m.mode);
        panel(
            &mut s,
            at(h.modes.len() + stages + k),
            &title,
            sk,
            "M_Ed / M_Rd, largest over the height",
            false,
            Some((1.0, "limit 1")),
        );
    }
    s.push_str("</svg>\n");
    s
}

/// One histogram panel at `(x0, y0)`: the non-zero values of `sk` (their log10 when `log`),
/// the share of zeros (screened-out samples) under the axis.
/// `limit` (in the axis' units) draws the failure limit where it falls inside the axis.
fn panel(
    s: &mut String,
    (x0, y0): (f64, f64),
    title: &str,
    sk: &Sketch,
    what: &str,
    log: bool,
    limit: Option<(f64, &str)>,
) {
    let c = super::svg::style::colour(0);
    let (pw, ph) = (PANEL_W - 60.0, PANEL_H - 70.0);
    let _ = writeln!(
        s,
        r#"<text x="{x0}" y="{:.0}" font-weight="bold">{}</text>"#,
        y0 + 12.0,
        escape(title)
    );
    let top = y0 + 20.0;
    let _ = writeln!(
        s,
        r##"<rect x="{x0}" y="{top}" width="{pw}" height="{ph}" fill="none" stroke="#555" stroke-width="0.8"/>"##
    );
    if let Some((lo, width, counts)) = histogram(sk, 30, log) {
        let max = counts.iter().copied().max().unwrap_or(1).max(1) as f64;
        let bw = pw / counts.len() as f64;
        for (b, &cnt) in counts.iter().enumerate() {
            let bh = ph * cnt as f64 / max;
            let _ = writeln!(
                s,
                r#"<rect x="{:.1}" y="{:.1}" width="{:.1}" height="{:.1}" fill="rgb({},{},{})" fill-opacity="0.75" stroke="black" stroke-width="0.3"/>"#,
                x0 + b as f64 * bw,
                top + ph - bh,
                bw,
                bh,
                c.0,
                c.1,
                c.2
            );
        }
        let hi = lo + width * counts.len() as f64;
        if let Some((at, label)) = limit.filter(|&(at, _)| lo < at && at < hi) {
            let x = x0 + pw * (at - lo) / (hi - lo);
            let _ = writeln!(
                s,
                r##"<line x1="{x:.1}" y1="{top}" x2="{x:.1}" y2="{:.1}" stroke="#b00" stroke-width="1.2" stroke-dasharray="5 3"/><text x="{:.1}" y="{:.0}" fill="#b00">{}</text>"##,
                top + ph,
                x + 3.0,
                top + 12.0,
                escape(label)
            );
        }
        let _ = writeln!(
            s,
            r#"<text x="{x0}" y="{:.0}">{}</text><text x="{:.0}" y="{:.0}" text-anchor="end">{}</text>"#,
            top + ph + 14.0,
            tick(lo),
            x0 + pw,
            top + ph + 14.0,
            tick(hi)
        );
    } else {
        let _ = writeln!(
            s,
            r#"<text x="{:.0}" y="{:.0}" text-anchor="middle">no samples</text>"#,
            x0 + pw / 2.0,
            top + ph / 2.0
        );
    }
    let share_zero = if sk.total > 0 {
        sk.zeros as f64 / sk.total as f64
    } else {
        0.0
    };
    let _ = writeln!(
        s,
        r#"<text x="{:.0}" y="{:.0}" text-anchor="middle">{}{}</text>"#,
        x0 + pw / 2.0,
        top + ph + 30.0,
        escape(what),
        if sk.zeros > 0 {
            let zero = if log { "zero" } else { "screened out" };
            format!(" ({zero}: {:.1} %)", 100.0 * share_zero)
        } else {
            String::new()
        }
    );
}

fn tick(v: f64) -> String {
    if v != 0.0 && (v.abs() < 1e-2 || v.abs() >= 1e5) {
        format!("{v:.3e}")
    } else {
        format!("{v:.4}")
    }
}

/// risk_influence.svg: one tornado per stage (bars of the rank correlation of each input
/// with the stage's headline event, largest first; right = raises the probability).
pub fn influence_svg(h: &RiskHeader, a: &Accumulator) -> String {
    let events = headline_events(h);
    let k = h.inputs.len().max(1);
    let panel_h = 40.0 + 22.0 * k as f64;
    let (w, ht) = (900.0, 50.0 + panel_h * events.len().max(1) as f64);
    let mut s = String::new();
    let _ = writeln!(
        s,
        r#"<svg xmlns="http://www.w3.org/2000/svg" width="{w:.0}" height="{ht:.0}" viewBox="0 0 {w:.0} {ht:.0}" font-family="sans-serif" font-size="11">"#
    );
    let _ = writeln!(
        s,
        r#"<rect width="100%" height="100%" fill="white"/><text x="10" y="24" font-size="15" font-weight="bold">Influence of each input (rank correlation with the event; right: raises its probability{})</text>"#,
        if h.correlations.is_empty() {
            ""
        } else {
            "; correlated inputs: total, not unique, association"
        }
    );
    let (left, bar_w) = (330.0, 260.0);
    let mid = left + bar_w;
    for (p, (title, e)) in events.iter().enumerate() {
        let y0 = 50.0 + panel_h * p as f64;
        let (prob, se) = a.probability(*e);
        let _ = writeln!(
            s,
            r#"<text x="10" y="{:.0}" font-weight="bold">{} (P = {}, standard error {})</text>"#,
            y0 + 12.0,
            escape(title),
            num(prob),
            if se.is_finite() {
                format!("{se:.1e}")
            } else {
                String::new()
            }
        );
        let ranking = influence_ranking(h, a, *e);
        if ranking.is_empty() {
            let _ = writeln!(
                s,
                r#"<text x="20" y="{:.0}">no influence to show: the probability is 0 or 1 (or no input is uncertain)</text>"#,
                y0 + 32.0
            );
        }
        let _ = writeln!(
            s,
            r#"<line x1="{mid}" y1="{:.0}" x2="{mid}" y2="{:.0}" stroke="black" stroke-width="1"/>"#,
            y0 + 18.0,
            y0 + panel_h - 8.0
        );
        for (i, (key, r)) in ranking.iter().enumerate() {
            let y = y0 + 22.0 + 22.0 * i as f64;
            let len = bar_w * r.abs().min(1.0);
            let x = if *r >= 0.0 { mid } else { mid - len };
            let c = super::svg::style::colour(if *r >= 0.0 { 1 } else { 0 });
            let _ = writeln!(
                s,
                r#"<text x="{:.0}" y="{:.0}" text-anchor="end">{}</text><rect x="{x:.1}" y="{:.1}" width="{len:.1}" height="15" fill="rgb({},{},{})" stroke="black" stroke-width="0.4"{}/><text x="{:.0}" y="{:.0}">{r:+.3}</text>"#,
                left - 8.0,
                y + 12.0,
                escape(key),
                y,
                c.0,
                c.1,
                c.2,
                if *r < 0.0 {
                    r#" fill-opacity="0.5""#
                } else {
                    ""
                },
                mid + bar_w + 10.0,
                y + 12.0
            );
        }
    }
    s.push_str("</svg>\n");
    s
}
