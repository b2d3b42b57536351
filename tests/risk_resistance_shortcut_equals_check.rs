//! The resistance quantities of a risk sample (`--with-resistance`) through the shortcut
//! against the full `check` analysis of the same edited case: per stage and mode the vortex
//! utilisation (max over the height of gamma_Q M_vortex / M_Rd(N_Ed), the `vortex mode N`
//! rows of resistance.csv, EN 1992-1-1 6.1) and the mode's fatigue damage (its worst height,
//! EN 1992-1-1 6.8.4), for samples of E, a stage's stiffness factor, the log decrement, the
//! Strouhal number and the reference wind speed.
//!
//! Why the shortcut is exact: the E.1.4 inertia moments scale with (n / n_case)^2 y with
//! shapes and masses unchanged, and N_Ed and M_Rd(N) depend on none of the sampled keys
//! (generalised eigenproblem with K scaled: same eigenvectors, common practice); the fatigue
//! damage is recomputed per height with the sample's E_c, moments, n and v_crit. Tolerance
//! 1e-9 relative (the brief's; the two paths differ by rounding of the scaled moments, the
//! eigen-solver's convergence and the cracked-section root finder's 1e-13 h tolerance).

use std::path::Path;

mod risk_common;

use stackwake::case::Case;
use stackwake::input::{self, keypath};
use stackwake::risk::distribution::Distribution;
use stackwake::risk::kernel::ModeSample;
use stackwake::risk::{case_modes, role_of, Engine, Scaling, UncertainInput};

const KEYS: [(&str, f64); 5] = [
    ("shell.elastic_modulus_gpa", 32.0),
    ("stage[1].stiffness_factor", 1.0),
    ("vortex.log_decrement", 0.03),
    ("vortex.strouhal", 0.18),
    ("wind.reference_speed_m_s", 24.0),
];

fn table(method: &str) -> toml::Table {
    let mut t = input::parse_case_text(input::DEMO_CASE_TOML, "demo").unwrap();
    // A fixed base: springs do not scale with E, so E would re-solve.
    t.remove("base");
    // Fatigue partial factors off their defaults, so both paths must honour the case's.
    let design = t
        .entry("design")
        .or_insert_with(|| toml::Value::Table(toml::Table::new()))
        .as_table_mut()
        .unwrap();
    design.insert("gamma_f_fat".into(), toml::Value::Float(1.1));
    design.insert("gamma_s_fat".into(), toml::Value::Float(1.25));
    t["vortex"]
        .as_table_mut()
        .unwrap()
        .insert("method".into(), toml::Value::String(method.into()));
    t
}

fn edited(method: &str, values: &[f64]) -> Case {
    let mut t = table(method);
    for ((k, _), v) in KEYS.iter().zip(values) {
        keypath::insert_number(&mut t, k, *v).unwrap();
    }
    input::parse_case_table(t, Path::new(""), "demo").unwrap()
}

/// Inputs fixed at the given values (a zero-width uniform): the sample is the case itself
/// unless the test passes other values.
fn fixed_inputs(keys: &[(&str, f64)]) -> Vec<UncertainInput> {
    keys.iter()
        .map(|&(k, v)| UncertainInput {
            key: k.into(),
            role: role_of(k, Scaling::Whole),
            distribution: Distribution::uniform(v, v),
            described: String::new(),
            case_value: v,
        })
        .collect()
}

fn no_full(_: &[f64]) -> Result<Case, String> {
    Err("this test samples shortcut keys only".into())
}

fn close(a: f64, b: f64, tol: f64) -> bool {
    (a - b).abs() <= tol * a.abs().max(b.abs()).max(1e-300)
}

/// Per (stage, mode) in check order: (utilisation, damage) of the full check.
fn full_check(case: &Case) -> Vec<(f64, f64)> {
    risk_common::resistance_per_mode(case)
}

#[test]
fn shortcut_resistance_equals_the_full_check() {
    for method in ["en1991-e1", "en1991-e2"] {
        let t = table(method);
        let base = input::parse_case_table(t, Path::new(""), "demo").unwrap();
        let inputs = fixed_inputs(&KEYS);
        let e = Engine::new(&base, &inputs, 1, &no_full)
            .unwrap()
            .with_resistance()
            .unwrap();
        assert!(e.shortcut);
        // Inside and outside lock-in, E and the stage factor both ways, wind both ways.
        let samples = [
            [32.0, 1.0, 0.03, 0.18, 24.0],
            [36.2, 1.0, 0.021, 0.20, 30.0],
            [27.0, 0.85, 0.045, 0.17, 22.0],
            [33.0, 1.2, 0.012, 0.18, 26.0],
            [30.0, 0.9, 0.008, 0.16, 40.0],
        ];
        let mut worst = 0.0f64;
        let mut nonzero_damage = 0;
        let mut nonzero_util = 0;
        for values in samples {
            let mut out = vec![ModeSample::default(); e.modes()];
            let mut msg = None;
            assert!(e.evaluate(&values, &mut out, &mut msg), "{msg:?}");
            let want = full_check(&edited(method, &values));
            assert_eq!(want.len(), out.len());
            for (j, (o, (u, d))) in out.iter().zip(&want).enumerate() {
                for (name, a, b) in [
                    ("utilisation", o.vortex_utilisation, *u),
                    ("damage", o.fatigue_damage, *d),
                ] {
                    let rel = (a - b).abs() / a.abs().max(b.abs()).max(1e-300);
                    if a != 0.0 || b != 0.0 {
                        worst = worst.max(rel);
                    }
                    assert!(
                        close(a, b, 1e-9),
                        "{method} {values:?} entry {j} {name}: shortcut {a} vs check {b} \
                         (rel {rel:e})"
                    );
                }
                assert_eq!(o.utilisation_exceeds, *u > 1.0);
                assert_eq!(o.damage_exceeds, *d > 1.0);
                nonzero_damage += usize::from(*d > 0.0);
                nonzero_util += usize::from(*u > 0.0);
            }
        }
        // The samples exercise the resistance path (modes in lock-in with damage).
        assert!(
            nonzero_damage >= 5 && nonzero_util >= 5,
            "{nonzero_damage} {nonzero_util}"
        );
        eprintln!("{method}: worst relative difference {worst:e}");
    }
}

#[test]
fn resistance_needs_reinforcement() {
    let mut t = table("en1991-e1");
    t.remove("reinforcement");
    let case = input::parse_case_table(t, Path::new(""), "demo").unwrap();
    let e = Engine::new(&case, &[], 1, &no_full).unwrap();
    let err = e.with_resistance().err().unwrap().to_string();
    assert!(err.contains("[reinforcement]"), "{err}");
}

#[test]
fn re_solved_samples_give_the_full_check_resistance() {
    // A lining-mass key re-solves every sample: the engine edits, validates and re-solves
    // the case, then evaluates the resistance quantities of the edited case itself.
    let t = table("en1991-e1");
    let base = input::parse_case_table(t.clone(), Path::new(""), "demo").unwrap();
    let keys = [
        ("lining[0].mass_per_area_kg_m2", 240.0),
        ("vortex.log_decrement", 0.03),
    ];
    let inputs = fixed_inputs(&keys);
    let edit = |values: &[f64]| -> Case {
        let mut t = t.clone();
        for ((k, _), v) in keys.iter().zip(values) {
            keypath::insert_number(&mut t, k, *v).unwrap();
        }
        input::parse_case_table(t, Path::new(""), "demo").unwrap()
    };
    let full = |values: &[f64]| -> Result<Case, String> { Ok(edit(values)) };
    let e = Engine::new(&base, &inputs, 1, &full)
        .unwrap()
        .with_resistance()
        .unwrap();
    assert!(!e.shortcut);
    for values in [[200.0, 0.02], [280.0, 0.012]] {
        let mut out = vec![ModeSample::default(); e.modes()];
        let mut msg = None;
        assert!(e.evaluate(&values, &mut out, &mut msg), "{msg:?}");
        let want = full_check(&edit(&values));
        let mut nonzero = 0;
        for (o, (u, d)) in out.iter().zip(&want) {
            assert!(
                close(o.vortex_utilisation, *u, 1e-9),
                "{} vs {u}",
                o.vortex_utilisation
            );
            assert!(
                close(o.fatigue_damage, *d, 1e-9),
                "{} vs {d}",
                o.fatigue_damage
            );
            nonzero += usize::from(*d > 0.0);
        }
        assert!(nonzero > 0);
    }
}

#[test]
fn the_gb_method_has_no_resistance_path() {
    let t = table("gb50009-h1");
    let case = input::parse_case_table(t, Path::new(""), "demo").unwrap();
    let e = Engine::new(&case, &[], 1, &no_full).unwrap();
    let err = e.with_resistance().err().unwrap().to_string();
    assert!(err.contains("gb50009-h1"), "{err}");
}

/// Per stage, check's damage (max over the height of the sum over the modes) and the total
/// over the stages.
fn full_stage_damage(case: &Case) -> (Vec<f64>, f64) {
    let stages = case_modes(case).unwrap();
    let vr = stackwake::wind::check_all(case, &stages).unwrap();
    let rr = stackwake::resistance::actions::check_case(case, &stages, &vr, &[])
        .unwrap()
        .expect("the demo has [reinforcement]");
    (
        rr.stages.iter().map(|s| s.damage).collect(),
        rr.total_damage,
    )
}

#[test]
fn stage_and_total_damage_equal_the_full_check() {
    // check sums the modes' damage at each height of a stage, takes the largest sum, and
    // adds the stages; the risk engine must give the same numbers for every sample. A soft
    // shell in a strong wind puts modes 1 and 2 of a stage in lock-in together, so the sum
    // over the modes is exercised, not only the single-mode case.
    let method = "en1991-e1";
    let base = input::parse_case_table(table(method), Path::new(""), "demo").unwrap();
    let inputs = fixed_inputs(&KEYS);
    let e = Engine::new(&base, &inputs, 1, &no_full)
        .unwrap()
        .with_resistance()
        .unwrap();
    let stage_of: Vec<usize> = e.kernels.iter().map(|k| k.stage_index).collect();
    let mut two_modes = 0;
    for values in [
        [32.0, 1.0, 0.03, 0.18, 24.0],
        [5.0, 1.0, 0.01, 0.18, 40.0],
        [8.0, 0.8, 0.008, 0.17, 38.0],
    ] {
        let mut out = vec![ModeSample::default(); e.modes()];
        let mut msg = None;
        assert!(e.evaluate(&values, &mut out, &mut msg), "{msg:?}");
        let (want, total) = full_stage_damage(&edited(method, &values));
        for (j, o) in out.iter().enumerate() {
            let w = want[stage_of[j]];
            assert!(
                close(o.stage_fatigue_damage, w, 1e-9),
                "{values:?} entry {j}: stage damage {} vs check {w}",
                o.stage_fatigue_damage
            );
            assert!(
                close(o.total_fatigue_damage, total, 1e-9),
                "{values:?}: total {} vs check {total}",
                o.total_fatigue_damage
            );
        }
        for st in 0..want.len() {
            let damaged = (0..out.len())
                .filter(|&j| stage_of[j] == st && out[j].fatigue_damage > 0.0)
                .count();
            two_modes += usize::from(damaged >= 2);
        }
    }
    assert!(
        two_modes > 0,
        "no sample had two modes with damage in one stage"
    );
}
