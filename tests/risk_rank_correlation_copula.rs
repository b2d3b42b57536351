//! Rank-correlated inputs of the risk engine (Gaussian copula) against closed forms:
//! - The Spearman rank correlation of a Gaussian copula with normal-score correlation R is
//!   (6 / pi) asin(R / 2) (Pearson 1907; Headrick, Open Journal of Statistics 6 (2016)
//!   1025-1027, eq. (1)); with R = 2 sin(pi rho_s / 6) it is rho_s exactly, for any
//!   continuous marginals. A pair not given but linked through others has R = 0 (Cholesky of
//!   the given matrix), so rank correlation 0.
//!   Tolerance: 4 / sqrt(N - 1), four times the standard deviation of the sample Spearman
//!   coefficient of independent samples (its variance is 1 / (N - 1), Kendall & Stuart;
//!   from memory); for correlated pairs the variance is smaller (common practice).
//! - Every marginal is unchanged: the 5/50/95 % sample points of each input lie within its
//!   own (truncated) quantiles at q -+ 4 sqrt(q (1 - q) / N), four binomial standard errors
//!   of the empirical CDF (common practice).
//! - The shortcut stays valid (a correlation changes no mode) and the draws of a sample do
//!   not depend on which other samples are drawn.

use stackwake::case::Case;
use stackwake::input;
use stackwake::risk::correlation::{Copula, RankPair};
use stackwake::risk::distribution::{Distribution, Family};
use stackwake::risk::{role_of, Engine, Scaling, UncertainInput};

mod risk_common;
use risk_common::spearman;

fn no_full(_: &[f64]) -> Result<Case, String> {
    Err("this test samples shortcut keys only".into())
}

fn input(key: &str, d: Distribution, case_value: f64) -> UncertainInput {
    UncertainInput {
        key: key.into(),
        role: role_of(key, Scaling::Whole),
        distribution: d,
        described: String::new(),
        case_value,
    }
}

fn inputs() -> Vec<UncertainInput> {
    vec![
        input(
            "vortex.log_decrement",
            Distribution::from_mean_cov(Family::Lognormal, 0.03, 0.3),
            0.03,
        ),
        input(
            "vortex.strouhal",
            Distribution::from_mean_cov(Family::Normal, 0.18, 0.05)
                .truncated(Some(0.16), None)
                .unwrap(),
            0.18,
        ),
        input(
            "uncertainty.c_lat_factor",
            Distribution::from_mean_cov(Family::Lognormal, 1.0, 0.2),
            1.0,
        ),
        input(
            "wind.reference_speed_m_s",
            Distribution::from_mean_cov(Family::Gumbel, 24.0, 0.12),
            24.0,
        ),
    ]
}

const PAIRS: [RankPair; 2] = [
    RankPair {
        a: 0,
        b: 1,
        spearman: -0.3,
    },
    RankPair {
        a: 1,
        b: 3,
        spearman: 0.7,
    },
];

fn draws(e: &Engine, n: u64) -> Vec<Vec<f64>> {
    let k = e.inputs.len();
    let mut cols = vec![Vec::with_capacity(n as usize); k];
    let mut bits = vec![0u64; k];
    let mut values = vec![0f64; k];
    for i in 0..n {
        e.draw(i, &mut bits, &mut values);
        for (c, &v) in cols.iter_mut().zip(&values) {
            c.push(v);
        }
    }
    cols
}

#[test]
fn sampled_spearman_equals_the_target_and_marginals_are_unchanged() {
    let case = input::demo_case();
    let inputs = inputs();
    let copula = Copula::new(&PAIRS).unwrap();
    let e = Engine::new(&case, &inputs, 2026, &no_full)
        .unwrap()
        .with_copula(copula);
    assert!(e.shortcut, "a correlation changes no mode");
    let n = 100_000u64;
    let cols = draws(&e, n);
    let tol = 4.0 / ((n - 1) as f64).sqrt();
    for p in PAIRS {
        let got = spearman(&cols[p.a], &cols[p.b]);
        assert!(
            (got - p.spearman).abs() <= tol,
            "pair ({}, {}): sampled Spearman {got} vs target {} (tol {tol:.4})",
            p.a,
            p.b,
            p.spearman
        );
    }
    // Not given: (0, 3) is linked through 1 but has R = 0; 2 is in no pair.
    for (a, b) in [(0, 3), (0, 2), (2, 3)] {
        let got = spearman(&cols[a], &cols[b]);
        assert!(got.abs() <= tol, "pair ({a}, {b}): {got}, want 0");
    }
    // Marginals: sample 5/50/95 % points equal the distributions' own quantiles.
    for (k, inp) in inputs.iter().enumerate() {
        let mut x = cols[k].clone();
        x.sort_by(f64::total_cmp);
        for q in [0.05, 0.5, 0.95] {
            let dq = 4.0 * (q * (1.0 - q) / n as f64).sqrt();
            let lo = inp.distribution.sample(q - dq);
            let hi = inp.distribution.sample(q + dq);
            let got = x[((q * n as f64).ceil() as usize).min(x.len() - 1)];
            assert!(
                got >= lo && got <= hi,
                "{}: sample p{q} = {got} outside [{lo}, {hi}]",
                inp.key
            );
        }
    }
}

#[test]
fn correlated_draws_are_per_sample_and_keep_uncorrelated_inputs() {
    let case = input::demo_case();
    let inputs = inputs();
    let plain = Engine::new(&case, &inputs, 7, &no_full).unwrap();
    let corr = Engine::new(&case, &inputs, 7, &no_full)
        .unwrap()
        .with_copula(Copula::new(&PAIRS).unwrap());
    let k = inputs.len();
    let (mut b1, mut v1, mut b2, mut v2) = (vec![0; k], vec![0.0; k], vec![0; k], vec![0.0; k]);
    let mut moved = 0;
    for i in [0u64, 1, 999, 123_456_789] {
        plain.draw(i, &mut b1, &mut v1);
        corr.draw(i, &mut b2, &mut v2);
        // Input 0 is the first of the correlated ones (z' = z) and 2 is in no pair: kept
        // bit for bit.
        assert_eq!(v1[0], v2[0]);
        assert_eq!(v1[2], v2[2]);
        moved += usize::from(v1[1] != v2[1]) + usize::from(v1[3] != v2[3]);
        // The same sample index gives the same draw again (no state between samples).
        let mut b3 = vec![0; k];
        let mut v3 = vec![0.0; k];
        corr.draw(i, &mut b3, &mut v3);
        assert_eq!(b2, b3);
        assert_eq!(v2, v3);
    }
    assert!(moved >= 6, "the correlated inputs move: {moved}");
}
