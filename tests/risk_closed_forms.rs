//! Monte Carlo results of the risk engine against closed forms:
//! - E lognormal only (fixed base, so f1(E) = f1(E_case) sqrt(E / E_case) exactly; generalised
//!   eigenproblem with K proportional to E, common practice): the 5/50/95 % points of f1
//!   equal f1(E_case) sqrt(Q_E(q) / E_case), Q_E the lognormal quantile (standard normal
//!   quantiles from scipy.stats.norm.ppf, scipy 1.17). Tolerance: 4 Monte Carlo standard
//!   errors of a sample quantile, sqrt(q (1 - q) / N) / pdf (common practice), plus the
//!   sketch's stated relative accuracy 1e-4.
//! - log decrement lognormal only on EN 1991-1-4 Annex E approach 1 where K_W does not change
//!   (capped at 0.6 by (E.8), or, as here, L_j fixed at 6 b because y / b < 0.1 at the case
//!   and at the limit, Table E.4) and c_lat is its full value (Table E.3, v_crit / v_m <=
//!   0.83): the amplitude is proportional to 1 / Sc, i.e. to 1 / delta (E.7), and decreasing
//!   in delta, so P(tip > limit) =
//!   P(delta < delta_case y_case / limit) = Phi((ln d* - m) / s); Phi from libm's erfc (a
//!   reference library, not project code). Tolerance: 4 binomial standard errors.
//! - zero variance: every probability is 0 or 1 and equals the deterministic verdict.
//! - the reported standard error shrinks as 1 / sqrt(N).

use std::path::Path;

use stackwake::case::Case;
use stackwake::input;
use stackwake::risk::distribution::{Distribution, Family};
use stackwake::risk::run::run_range;
use stackwake::risk::{case_event, Accumulator, Engine, Role, UncertainInput, MODE_EVENTS};

fn no_full(_: &[f64]) -> Result<Case, String> {
    Err("this test samples shortcut keys only".into())
}

fn input(key: &str, role: Role, d: Distribution, case_value: f64) -> UncertainInput {
    UncertainInput {
        key: key.into(),
        role,
        distribution: d,
        described: String::new(),
        case_value,
    }
}

fn run(
    case: &Case,
    inputs: &[UncertainInput],
    n: u64,
    seed: u64,
) -> (Engine<'static>, Accumulator) {
    // Leaked so the engine can outlive this helper in the tests (a few small values).
    let case: &'static Case = Box::leak(Box::new(case.clone()));
    let inputs: &'static [UncertainInput] = Box::leak(inputs.to_vec().into_boxed_slice());
    let e = Engine::new(case, inputs, seed, &no_full).unwrap();
    assert!(e.shortcut);
    let (acc, _) = run_range(&e, 0, n, None, &|_| {});
    (e, acc)
}

fn fixed_base_demo() -> Case {
    let mut t = input::parse_case_text(input::DEMO_CASE_TOML, "demo").unwrap();
    t.remove("base");
    input::parse_case_table(t, Path::new(""), "demo").unwrap()
}

fn phi(x: f64) -> f64 {
    0.5 * libm::erfc(-x / std::f64::consts::SQRT_2)
}

#[test]
fn lognormal_modulus_gives_the_closed_form_frequency_percentiles() {
    let case = fixed_base_demo();
    let cov: f64 = 0.10;
    let d = Distribution::from_mean_cov(Family::Lognormal, 32.0, cov);
    let n = 200_000;
    let (e, acc) = run(
        &case,
        &[input(
            "shell.elastic_modulus_gpa",
            Role::ElasticModulus,
            d,
            32.0,
        )],
        n,
        11,
    );
    let s = (1.0 + cov * cov).ln().sqrt();
    let m = 32f64.ln() - 0.5 * s * s;
    // scipy.stats.norm.ppf(0.05), ppf(0.5), ppf(0.95)
    let z = [
        (0.05, -1.6448536269514729),
        (0.5, 0.0),
        (0.95, 1.6448536269514722),
    ];
    for (j, k) in e.kernels.iter().enumerate() {
        let f_case = case_modes_frequency(&case, k.stage_index, k.mode);
        let sk = &acc.sketches[j * stackwake::risk::QUANTITIES.len()];
        for (q, zq) in z {
            let want = f_case * ((m + s * zq).exp() / 32.0).sqrt();
            let got = sk.quantile(q).unwrap();
            let pdf_z = (-0.5 * zq * zq).exp() / (2.0 * std::f64::consts::PI).sqrt();
            let rel_se = 0.5 * s * (q * (1.0 - q) / n as f64).sqrt() / pdf_z;
            let tol = 4.0 * rel_se + 1e-4;
            assert!(
                ((got - want) / want).abs() <= tol,
                "stage {} mode {} p{q}: {got} vs closed form {want} (tol {tol:e})",
                k.stage_index,
                k.mode
            );
        }
    }
}

fn case_modes_frequency(case: &Case, stage: usize, mode: usize) -> f64 {
    stackwake::risk::case_modes(case).unwrap()[stage].modes[mode - 1].frequency_hz
}

#[test]
fn lognormal_damping_gives_the_closed_form_exceedance_probability() {
    let case = input::demo_case();
    let stages = stackwake::risk::case_modes(&case).unwrap();
    let r = stackwake::wind::check_all(&case, &stages).unwrap();
    // "shell only", mode 1: L_j = 6 b at the case and at the limit (y / b < 0.1, Table E.4)
    // and full c_lat (checked here: the premise of the closed form).
    let mv = &r.stages[1].modes[0];
    let a1 = mv.approach1.as_ref().unwrap();
    let top = *stages[1].model.outer_diameter_m.last().unwrap();
    let limit = 0.05 * top; // the demo's criteria.tip_amplitude_per_diameter
    assert!(a1.speed_ratio_lj <= 0.83, "premise: {a1:?}");
    assert!(
        a1.y_max_m / mv.diameter_m < 0.1 && limit / mv.diameter_m < 0.1,
        "premise: {a1:?}"
    );
    assert_eq!(a1.tip_amplitude_m, a1.y_max_m, "tip is the antinode");
    let y_case = a1.tip_amplitude_m;
    let cov: f64 = 0.3;
    let d = Distribution::from_mean_cov(Family::Lognormal, 0.03, cov);
    let n = 100_000;
    let (e, acc) = run(
        &case,
        &[input("vortex.log_decrement", Role::LogDecrement, d, 0.03)],
        n,
        5,
    );
    let j = e
        .kernels
        .iter()
        .position(|k| k.stage_index == 1 && k.mode == 1)
        .unwrap();
    let (p, se) = acc.probability(j * MODE_EVENTS.len() + 1);
    let s = (1.0 + cov * cov).ln().sqrt();
    let m = 0.03f64.ln() - 0.5 * s * s;
    let d_star = 0.03 * y_case / limit;
    let want = phi((d_star.ln() - m) / s);
    assert!(want > 0.05 && want < 0.95, "{want}");
    assert!(
        (p - want).abs() <= 4.0 * se,
        "P = {p} +- {se} vs closed form {want}"
    );
}

#[test]
fn zero_variance_gives_the_deterministic_verdicts() {
    let case = input::demo_case();
    let stages = stackwake::risk::case_modes(&case).unwrap();
    let r = stackwake::wind::check_all(&case, &stages).unwrap();
    let fixed = Distribution::uniform(0.03, 0.03);
    for inputs in [
        vec![],
        vec![input(
            "vortex.log_decrement",
            Role::LogDecrement,
            fixed,
            0.03,
        )],
    ] {
        let (e, acc) = run(&case, &inputs, 64, 3);
        let mut j = 0;
        let mut any = false;
        for sv in &r.stages {
            for m in &sv.modes {
                let ne = MODE_EVENTS.len();
                let (p_range, se) = acc.probability(j * ne);
                let (p_exceeds, _) = acc.probability(j * ne + 3);
                assert_eq!(p_range, if m.screened_out { 0.0 } else { 1.0 });
                assert_eq!(p_exceeds, if m.verdict.is_exceeds() { 1.0 } else { 0.0 });
                assert_eq!(se, 0.0);
                any |= m.verdict.is_exceeds();
                j += 1;
            }
        }
        let (p_case, _) = acc.probability(case_event(e.modes(), e.stages));
        assert_eq!(p_case, if any { 1.0 } else { 0.0 });
    }
}

#[test]
fn standard_error_shrinks_as_one_over_sqrt_n() {
    let case = input::demo_case();
    let d = Distribution::from_mean_cov(Family::Lognormal, 0.03, 0.5);
    let inputs = [input("vortex.log_decrement", Role::LogDecrement, d, 0.03)];
    let (e, small) = run(&case, &inputs, 2_500, 9);
    let (_, large) = run(&case, &inputs, 40_000, 9);
    // The lined stage's "exceeds any mode": a probability well inside (0, 1).
    let ev = e.modes() * MODE_EVENTS.len() + 2;
    let (p1, se1) = small.probability(ev);
    let (p2, se2) = large.probability(ev);
    assert!(p2 > 0.1 && p2 < 0.9, "{p2}");
    let ratio = se1 / se2;
    assert!(
        (ratio / 4.0 - 1.0).abs() < 0.1,
        "SE ratio {ratio} for 16x the samples"
    );
    assert!((p1 - p2).abs() <= 4.0 * se1, "{p1} vs {p2}");
}
