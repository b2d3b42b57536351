//! Tuned mass damper and required damping on the invented demo stack.
//!
//! Sources: Den Hartog, Mechanical Vibrations (4th ed., 1956), sec. 3.3, optimum tuning for a
//! harmonic force, f = 1/(1+mu), zeta = sqrt(3 mu / (8 (1+mu)^3)), peak amplification
//! sqrt(1 + 2/mu) (from memory; mu = 0.02 -> 0.98039 and 0.08407 as listed in the project's
//! references). The 2-dof peaks are computed by our own frequency scan.

use std::path::Path;

use stackwake::commands::check::{analyse, CheckOptions};
use stackwake::input::{parse_case, DEMO_CASE_TOML};
use stackwake::remedy::tmd;

/// The demo without its own [remedy] tables, plus `extra`.
fn demo_with(extra: &str) -> stackwake::case::Case {
    let base = DEMO_CASE_TOML
        .split("\n[remedy")
        .next()
        .expect("split yields at least one part");
    parse_case(&format!("{base}\n{extra}\n"), Path::new("."), "demo+").expect("valid")
}

#[test]
fn den_hartog_values_for_mu_0_02() {
    // Den Hartog (from memory), values as listed in data/reference/README.md.
    assert!((tmd::den_hartog_frequency_ratio(0.02) - 0.98039).abs() < 5e-6);
    assert!((tmd::den_hartog_damping_ratio(0.02) - 0.08407).abs() < 5e-6);
}

#[test]
fn equivalent_damping_matches_the_two_dof_peak() {
    // The equal-peak idealisation: 1 / (2 zeta_eq) = peak of the tuned 2-dof system (computed
    // here by scanning the 2-dof steady state; Den Hartog's zeta_opt gives nearly equal
    // peaks, so agreement within a few percent is the expectation).
    for mu in [0.005, 0.01, 0.02, 0.05, 0.1] {
        let f = tmd::den_hartog_frequency_ratio(mu);
        let z = tmd::den_hartog_damping_ratio(mu);
        let peak = tmd::peak_main_amplification(mu, f, z, 0.0);
        let expected = 1.0 / (2.0 * tmd::equivalent_damping_ratio(mu));
        assert!(
            (peak / expected - 1.0).abs() < 0.03,
            "mu {mu}: 2-dof peak {peak}, equal-peak {expected}"
        );
        // A mistuned damper does worse than the optimum.
        let worse = tmd::peak_main_amplification(mu, 0.9 * f, z, 0.0);
        assert!(worse > peak);
    }
}

#[test]
fn tmd_recheck_decreases_amplitude_monotonically_with_mu() {
    let mut last = f64::INFINITY;
    let mut before = None;
    for mu in [0.002, 0.005, 0.01, 0.02, 0.04, 0.08] {
        let case = demo_with(&format!(
            "[remedy.tmd]\nmode = 1\nmass_ratio = {mu}\nstage = \"lined\""
        ));
        let r = analyse(case, CheckOptions::default()).expect("analysis");
        assert_eq!(r.remedies.tmd.len(), 1);
        let t = &r.remedies.tmd[0];
        assert_eq!(t.stage, "lined");
        let after = t.after.tip_amplitude_m.expect("amplitude");
        let b = t.before.tip_amplitude_m.expect("amplitude");
        assert!(after < b, "mu {mu}: {after} !< {b}");
        assert!(after < last, "mu {mu}: {after} !< {last}");
        last = after;
        before.get_or_insert(b);
        // Placed at the antinode (mode 1 of a cantilever: the top).
        assert_eq!(t.location_z_m, 210.0);
        assert!(t.stroke_m.unwrap() > after);
        assert!((t.mass_kg / t.modal_mass_kg - mu).abs() < 1e-12);
    }
}

#[test]
fn required_damping_just_meets_the_criteria() {
    let r = analyse(demo_with(""), CheckOptions::default()).expect("analysis");
    let req = r
        .remedies
        .required_damping
        .iter()
        .find(|q| q.stage == "lined" && q.mode == 1)
        .expect("lined mode 1 fails in the demo");
    let delta = req.approach1.log_decrement.expect("reachable");
    assert!(delta > 0.03);
    // Re-running the full check at the required decrement passes; slightly below fails.
    for (factor, should_fail) in [(1.0 + 1e-6, false), (1.0 - 1e-3, true)] {
        let text = DEMO_CASE_TOML.replace(
            "log_decrement = 0.03",
            &format!("log_decrement = {}", delta * factor),
        );
        let case = parse_case(&text, Path::new("."), "demo").unwrap();
        let rr = analyse(case, CheckOptions::default()).unwrap();
        let m = rr
            .vortex
            .stages
            .iter()
            .find(|s| s.stage == "lined")
            .unwrap()
            .modes[0]
            .clone();
        assert_eq!(
            m.verdict.is_exceeds(),
            should_fail,
            "factor {factor}: {}",
            m.verdict
        );
    }
    // Approach 2 is reported too.
    assert!(req.approach2.already_meets || req.approach2.log_decrement.is_some());
}

#[test]
fn strakes_reduce_the_response_and_report_drag() {
    let case = demo_with("[remedy.strakes]\nfrom_z_m = 140.0\nto_z_m = 210.0\nc_lat_factor = 0.3");
    let r = analyse(case, CheckOptions::default()).expect("analysis");
    let s = r
        .remedies
        .strakes
        .iter()
        .find(|s| s.stage == "lined" && s.mode == 1)
        .expect("strakes on lined mode 1");
    assert!(s.en_condition_met);
    assert_eq!(s.drag_coefficient, 1.4);
    assert!(
        s.coverage > 0.99,
        "L_j lies in the straked top: {}",
        s.coverage
    );
    let (b, a) = (
        s.before.tip_amplitude_m.unwrap(),
        s.after.tip_amplitude_m.unwrap(),
    );
    assert!(a < 0.5 * b, "{a} vs {b}");
}
