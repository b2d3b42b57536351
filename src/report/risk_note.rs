//! risk.html: the probabilistic screening note of `stackwake risk` (self-contained, plots
//! inline): the run, the inputs and their correlations, the methods, every risk.csv row with
//! five significant digits, the histograms and the influence plot, and the cautions.
//! Units: those of each quantity (SI, named in the quantity).

use std::fmt::Write as _;

use super::note::html_escape as escape;
use super::risk::*;
use crate::risk::{Accumulator, RiskHeader};

/// Five significant digits: plain between 1e-3 and 1e6, scientific outside (fatigue damage
/// spans tens of decades, stresses are millions of Pa).
fn significant(x: f64) -> String {
    if x == 0.0 {
        "0".into()
    } else if (1e-3..1e6).contains(&x.abs()) {
        let decimals = (4 - x.abs().log10().floor() as i32).max(0) as usize;
        format!("{x:.decimals$}")
    } else {
        format!("{x:.4e}")
    }
}

/// risk.html: the probabilistic screening note (self-contained; the plots inline).
pub fn risk_html(h: &RiskHeader, a: &Accumulator, hist: &str, tornado: &str) -> String {
    let mut s =
        String::from("<!DOCTYPE html>\n<html lang=\"en\">\n<head>\n<meta charset=\"utf-8\">\n");
    let _ = writeln!(
        s,
        "<title>Lock-in risk: {}</title>\n<style>{}</style>\n</head>\n<body>",
        escape(&h.title),
        super::note::page_style::CSS
    );
    let _ = writeln!(s, "<h1>Lock-in risk screening: {}</h1>", escape(&h.title));
    let _ = writeln!(
        s,
        "<p>Case file {} (SHA-256 <code>{}</code>), {} samples, seed {}, governing method {}.</p>",
        escape(&h.case_file),
        escape(&h.case_sha256),
        h.samples,
        h.seed,
        escape(&h.method)
    );
    s.push_str("<h2>Cautions</h2>\n<ul>\n");
    for c in super::CAUTIONS {
        let _ = writeln!(s, "<li>{}</li>", escape(c));
    }
    s.push_str(
        "<li>Probabilities are conditional on the design wind of the case and on the input \
         distributions below; they are not annual failure probabilities.</li>\n</ul>\n",
    );
    s.push_str("<h2>Uncertain inputs</h2>\n<table><thead><tr><th>key</th><th>distribution</th><th>case value</th><th>modes</th></tr></thead><tbody>\n");
    if h.inputs.is_empty() {
        s.push_str("<tr><td colspan=\"4\">none: every sample is the case itself</td></tr>\n");
    }
    for i in &h.inputs {
        let _ = writeln!(
            s,
            "<tr><td>{}</td><td>{}</td><td class=\"n\">{}</td><td>{}</td></tr>",
            escape(&i.key),
            escape(&i.described),
            i.case_value.map_or_else(|| "default".to_string(), num),
            if i.interpolated {
                "interpolated over the shell stiffness (below)"
            } else if i.keeps_modes {
                "reused (scaled)"
            } else {
                "re-solved per sample"
            }
        );
    }
    s.push_str("</tbody></table>\n");
    stiffness_family_section(&mut s, h);
    s.push_str("<h2>Rank correlations</h2>\n");
    if h.correlations.is_empty() {
        s.push_str("<p>None: the inputs are sampled independently.</p>\n");
    } else {
        s.push_str("<table><thead><tr><th>keys</th><th>Spearman rho_s</th><th>normal-score R = 2 sin(pi rho_s / 6)</th></tr></thead><tbody>\n");
        for c in &h.correlations {
            let _ = writeln!(
                s,
                "<tr><td>{} / {}</td><td class=\"n\">{}</td><td class=\"n\">{:.6}</td></tr>",
                escape(&c.keys[0]),
                escape(&c.keys[1]),
                num(c.spearman),
                c.normal_score_correlation
            );
        }
        let _ = writeln!(
            s,
            "</tbody></table>\n<p>{}.</p>",
            escape(CORRELATION_METHOD)
        );
    }
    let influence = influence_method(h);
    s.push_str("<h2>Method</h2>\n<ul>\n");
    if h.resistance {
        let _ = writeln!(s, "<li>{}</li>", escape(RESISTANCE_METHOD));
    }
    for line in [
        "Each sample is checked like <code>check</code>: the same modes (re-solved only when a \
         sample changes mass, geometry or springs; otherwise the case's modes with frequencies \
         scaled by the square root of the stiffness factor, or on base springs the modes \
         interpolated over the shell stiffness, see above), the EN 1991-1-4 Annex E chain of \
         the governing method and the case's criteria.",
        "Sample i draws from a counter-based stream of (seed, i), so any shard or thread count \
         gives the same samples; statistics are exact integer counts and sums, merged exactly.",
        PERCENTILE_METHOD,
        influence.as_str(),
        "Standard error of a probability p from N samples: sqrt(p (1 - p) / N).",
        "Tip amplitude and stress are 0 in samples screened out by E.1.2 (v_crit &gt; 1.25 v_m).",
    ] {
        let _ = writeln!(s, "<li>{line}</li>");
    }
    let _ = writeln!(
        s,
        "</ul>\n<p>{} valid samples, {} invalid (left out).</p>",
        a.samples, a.invalid
    );
    s.push_str("<h2>Results per stage and mode</h2>\n<table><thead><tr><th>stage</th><th>mode</th><th>quantity</th><th>mean</th><th>p05</th><th>p50</th><th>p95</th><th>P(exceeding)</th><th>standard error</th></tr></thead><tbody>\n");
    let o = |v: Option<f64>| v.map(significant).unwrap_or_default();
    for r in rows(h, a) {
        let _ = writeln!(
            s,
            "<tr><td>{}</td><td>{}</td><td>{}</td><td class=\"n\">{}</td><td class=\"n\">{}</td><td class=\"n\">{}</td><td class=\"n\">{}</td><td class=\"n\">{}</td><td class=\"n\">{}</td></tr>",
            escape(&r.stage),
            escape(&r.mode),
            escape(&r.quantity),
            o(r.mean),
            o(r.p05),
            o(r.p50),
            o(r.p95),
            o(r.probability_exceeding),
            r.standard_error.map(|x| format!("{x:.2e}")).unwrap_or_default()
        );
    }
    s.push_str("</tbody></table>\n<h2>Distributions</h2>\n");
    s.push_str(hist);
    s.push_str("<h2>What drives the probability</h2>\n");
    s.push_str(tornado);
    s.push_str("</body>\n</html>\n");
    s
}

/// How E and the stiffness factors reach the modes on base springs (the shell's stiffness
/// scales, the springs' does not): the family's interval, panels, solves and measured
/// deviation, or why there is none.
fn stiffness_family_section(s: &mut String, h: &RiskHeader) {
    if let Some(f) = &h.stiffness_family {
        s.push_str("<h2>Modes over the shell stiffness</h2>\n");
        let _ = writeln!(
            s,
            "<p>The stack stands on base springs, so E and the stiffness factors scale the \
             shell's stiffness but not the springs', and the modes do not scale as sqrt(E). \
             They were solved in full at {} shell stiffness scales s = E / E_case x \
             (stiffness factor / its case value) in [{}, {}] (the inputs' quantiles at {} and \
             1 - {}), and each sample's frequencies, shapes, equivalent masses, K, K_W and \
             unit load curves are interpolated in ln s: {} panel(s) of degree {} Chebyshev \
             interpolation. The largest relative deviation of a half-degree interpolant from \
             the full solves at its check points was {} (accepted up to {}, a few times the \
             eigen-solver's own convergence level). Away from the solver's own small jumps (where its \
             iteration count changes) the kept interpolants are more accurate than that. A \
             sample outside the interval is solved in full.</p>",
            f.solves,
            significant(f.low_scale),
            significant(f.high_scale),
            significant(crate::risk::FAMILY_TAIL),
            significant(crate::risk::FAMILY_TAIL),
            f.panels,
            f.degree,
            significant(f.measured_deviation),
            significant(f.tolerance)
        );
    } else if let Some(e) = &h.stiffness_family_error {
        s.push_str("<h2>Modes over the shell stiffness</h2>\n");
        let _ = writeln!(
            s,
            "<p>The stack stands on base springs, so E and the stiffness factors do not scale \
             the modes as sqrt(E). Interpolating the modes over the shell stiffness was not \
             possible ({}), so every sample was solved in full.</p>",
            escape(e)
        );
    }
}

#[cfg(test)]
mod tests {
    use super::significant;

    #[test]
    fn five_significant_digits_plain_or_scientific() {
        assert_eq!(significant(0.635), "0.63500");
        assert_eq!(significant(17906.326), "17906");
        assert_eq!(significant(4.72e6), "4.7200e6");
        assert_eq!(significant(7.3e-5), "7.3000e-5");
        assert_eq!(significant(0.0), "0");
    }
}
