//! E and a stage's stiffness factor on base springs (the demo's foundation): samples through
//! the stiffness family (modes interpolated in ln s over full solves, src/risk/
//! stiffness_family.rs) against the full `check` analysis of the same edited case, re-read
//! and re-solved: per stage and mode the frequency, v_crit, Scruton number, tip amplitude,
//! largest stress and the verdict flags (EN 1991-1-4 Annex E approaches 1 and 2), and with
//! the resistance quantities the vortex utilisation and fatigue damage (EN 1992-1-1 6.1,
//! 6.8.4).
//!
//! The reference is the project's own full analysis; what is checked is that skipping the
//! eigen-solve changes nothing that matters. Tolerance 3e-6 relative: the family is built
//! to a deviation of at most 3e-7 from full solves (stiffness_family::TOLERANCE, a few
//! times the eigen-solver's own convergence level, where its shapes jump as its iteration
//! count changes), and the Annex E chain amplifies a relative input error by a small factor
//! (amplitude ~ 1 / Sc and K_W; stresses ~ n^2): 10 is allowed. Away from those jumps the
//! agreement is at rounding level; the test prints the measured worst (about 4e-14 for
//! the modal results and 7e-13 for utilisation and damage when written).
//!
//! Also: with springs E x 1.13 does not give f x sqrt(1.13), so the sqrt shortcut would be
//! wrong there (why the family exists).

use std::path::Path;

mod risk_common;

use stackwake::case::Case;
use stackwake::input::{self, keypath};
use stackwake::risk::distribution::{Distribution, Family};
use stackwake::risk::kernel::{self, ModeSample};
use stackwake::risk::{case_modes, role_of, Engine, Role, Scaling, UncertainInput};

const TOL: f64 = 3e-6;

fn table(method: &str) -> toml::Table {
    let mut t = input::parse_case_text(input::DEMO_CASE_TOML, "demo").unwrap();
    assert!(t.contains_key("base"), "the demo stands on springs");
    t["vortex"]
        .as_table_mut()
        .unwrap()
        .insert("method".into(), toml::Value::String(method.into()));
    t
}

fn inputs(scaling: Scaling) -> Vec<UncertainInput> {
    [
        ("shell.elastic_modulus_gpa", Family::Lognormal, 32.0, 0.15),
        ("stage[1].stiffness_factor", Family::Normal, 1.0, 0.08),
        ("vortex.log_decrement", Family::Lognormal, 0.03, 0.4),
        ("vortex.strouhal", Family::Lognormal, 0.18, 0.08),
    ]
    .iter()
    .map(|&(key, family, mean, cov)| UncertainInput {
        key: key.into(),
        role: role_of(key, scaling),
        distribution: Distribution::from_mean_cov(family, mean, cov),
        described: String::new(),
        case_value: mean,
    })
    .collect()
}

fn edit(t: &toml::Table, inputs: &[UncertainInput], values: &[f64]) -> Result<Case, String> {
    let mut t = t.clone();
    for (inp, &x) in inputs.iter().zip(values) {
        keypath::insert_number(&mut t, &inp.key, x).map_err(|e| e.to_string())?;
    }
    input::parse_case_table(t, Path::new(""), "demo").map_err(|e| e.to_string())
}

fn close(a: f64, b: f64, tol: f64) -> bool {
    (a - b).abs() <= tol * a.abs().max(b.abs()).max(1e-300)
}

/// The full `check` of the edited case, per (stage, mode) in kernel order.
fn full_check(case: &Case) -> Vec<ModeSample> {
    let stages = case_modes(case).unwrap();
    let r = stackwake::wind::check_all(case, &stages).unwrap();
    let mut out = Vec::new();
    for (sv, sm) in r.stages.iter().zip(&stages) {
        let top = *sm.model.outer_diameter_m.last().unwrap();
        for m in &sv.modes {
            out.push(kernel::from_check(m, &case.criteria, top));
        }
    }
    out
}

#[test]
fn family_samples_equal_the_full_check() {
    for method in ["en1991-e1", "en1991-e2"] {
        let t = table(method);
        let case = input::parse_case_table(t.clone(), Path::new(""), "demo").unwrap();
        let inp = inputs(Scaling::Shell);
        assert_eq!(inp[0].role, Role::ShellModulus);
        assert_eq!(inp[1].role, Role::ShellStageStiffness(1));
        let full = |v: &[f64]| edit(&t, &inp, v);
        let e = Engine::new(&case, &inp, 2026, &full).unwrap();
        let f = e
            .family
            .as_ref()
            .unwrap_or_else(|| panic!("no family: {:?}", e.family_error));
        assert!(e.shortcut, "{:?}", e.family_error);
        assert!(f.info.measured_deviation <= f.info.tolerance);
        eprintln!("{method}: {:?}", f.info);
        let (mut bits, mut values) = (vec![0u64; inp.len()], vec![0.0; inp.len()]);
        let mut out = vec![ModeSample::default(); e.modes()];
        let mut worst = 0.0f64;
        let mut in_range = 0;
        for i in 0..24u64 {
            e.draw(i, &mut bits, &mut values);
            let mut msg = None;
            assert!(e.evaluate(&values, &mut out, &mut msg), "{msg:?}");
            let want = full_check(&full(&values).unwrap());
            assert_eq!(want.len(), out.len());
            for (j, (got, want)) in out.iter().zip(&want).enumerate() {
                assert_eq!(got.in_range, want.in_range, "sample {i} entry {j}");
                assert_eq!(got.exceeds, want.exceeds, "sample {i} entry {j}");
                in_range += usize::from(want.in_range);
                for (name, a, b) in [
                    ("frequency", got.frequency_hz, want.frequency_hz),
                    ("v_crit", got.critical_speed_m_s, want.critical_speed_m_s),
                    ("Scruton", got.scruton, want.scruton),
                    ("tip amplitude", got.tip_amplitude_m, want.tip_amplitude_m),
                    ("stress", got.max_stress_pa, want.max_stress_pa),
                    ("load scale", got.load_scale, want.load_scale),
                ] {
                    assert!(close(a, b, TOL), "sample {i} entry {j} {name}: {a} vs {b}");
                    if b != 0.0 {
                        worst = worst.max(((a - b) / b).abs());
                    }
                }
            }
        }
        assert!(
            in_range > 0,
            "some samples must reach the Annex E amplitude"
        );
        eprintln!("{method}: largest relative difference family vs full check: {worst:e}");
    }
}

#[test]
fn family_resistance_equals_the_full_check() {
    let t = table("en1991-e1");
    let case = input::parse_case_table(t.clone(), Path::new(""), "demo").unwrap();
    let inp = inputs(Scaling::Shell);
    let full = |v: &[f64]| edit(&t, &inp, v);
    let e = Engine::new(&case, &inp, 7, &full)
        .unwrap()
        .with_resistance()
        .unwrap();
    assert!(e.family.as_ref().is_some_and(|f| f.has_moments()));
    let (mut bits, mut values) = (vec![0u64; inp.len()], vec![0.0; inp.len()]);
    let mut out = vec![ModeSample::default(); e.modes()];
    let mut worst = 0.0f64;
    let mut damaged = 0;
    for i in 0..8u64 {
        e.draw(i, &mut bits, &mut values);
        let mut msg = None;
        assert!(e.evaluate(&values, &mut out, &mut msg), "{msg:?}");
        let want = risk_common::resistance_per_mode(&full(&values).unwrap());
        assert_eq!(want.len(), out.len());
        for (j, (o, &(u, d))) in out.iter().zip(&want).enumerate() {
            assert!(close(o.vortex_utilisation, u, TOL), "{i}/{j}: {o:?} vs {u}");
            // Damage ~ (stress range)^k2 with k2 = 9 (Table 6.3N): 9 times the relative
            // error of the moments.
            assert!(
                close(o.fatigue_damage, d, 9.0 * TOL),
                "{i}/{j}: {o:?} vs {d}"
            );
            if u > 0.0 {
                worst = worst.max((o.vortex_utilisation / u - 1.0).abs());
            }
            if d > 0.0 {
                damaged += 1;
                worst = worst.max((o.fatigue_damage / d - 1.0).abs());
            }
        }
    }
    assert!(damaged > 0, "some samples must accumulate fatigue damage");
    eprintln!("resistance: largest relative difference family vs full check: {worst:e}");
}

#[test]
fn a_sample_outside_the_family_is_solved_in_full() {
    let t = table("en1991-e1");
    let case = input::parse_case_table(t.clone(), Path::new(""), "demo").unwrap();
    let inp = inputs(Scaling::Shell);
    let full = |v: &[f64]| edit(&t, &inp, v);
    let e = Engine::new(&case, &inp, 1, &full).unwrap();
    let f = e.family.as_ref().unwrap();
    // E at 1.05 times the family's upper end: beyond its interval.
    let values = [32.0 * f.info.high_scale * 1.05, 1.0, 0.03, 0.18];
    let mut out = vec![ModeSample::default(); e.modes()];
    let mut msg = None;
    assert!(e.evaluate(&values, &mut out, &mut msg), "{msg:?}");
    let want = full_check(&full(&values).unwrap());
    for (got, want) in out.iter().zip(&want) {
        assert!(close(got.frequency_hz, want.frequency_hz, 1e-12));
        assert!(close(got.tip_amplitude_m, want.tip_amplitude_m, 1e-12));
    }
}

#[test]
fn on_springs_the_frequency_does_not_scale_as_sqrt_e() {
    let t = table("en1991-e1");
    let inp = inputs(Scaling::Shell);
    let f = |e_gpa: f64| full_check(&edit(&t, &inp[..1], &[e_gpa]).unwrap())[0].frequency_hz;
    let ratio = f(32.0 * 1.13) / f(32.0);
    assert!((ratio - 1.13f64.sqrt()).abs() > 1e-3, "{ratio}");
}
