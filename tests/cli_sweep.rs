//! The `sweep` command through the binary: a bad key stops with exit 2 naming it; a two-key
//! grid writes sweep.csv and the lock-in map; an invalid grid point is a row, not an abort;
//! a three-key map says it shows the worst case over the hidden key; an optional key left
//! out of the file can be swept. The required log decrement is checked against its own
//! definition (just above it the mode passes, just below it fails) and against `check`'s
//! remedy sizing; no outside reference is involved.

use assert_cmd::Command;
use predicates::prelude::*;

fn demo_file(dir: &std::path::Path) -> std::path::PathBuf {
    let p = dir.join("case.toml");
    std::fs::write(&p, stackwake::input::DEMO_CASE_TOML).unwrap();
    p
}

#[test]
fn bad_key_exits_2_naming_it() {
    let dir = tempfile::tempdir().unwrap();
    let case = demo_file(dir.path());
    let out = dir.path().join("out");
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("sweep")
        .arg(&case)
        .args(["--vary", "shell.stations[9].wall_m=0.2:0.3:2", "--out"])
        .arg(&out)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("shell.stations[9].wall_m"))
        .stderr(predicate::str::contains("has 6 entries"));
    assert!(!out.exists());
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("sweep")
        .arg(&case)
        .args(["--vary", "vortex.method=1:2:2", "--out"])
        .arg(&out)
        .assert()
        .code(2)
        .stderr(
            predicate::str::contains("vortex.method").and(predicate::str::contains("not a number")),
        );
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("sweep")
        .arg(&case)
        .args(["--vary", "shell.elastic_modulus_gpa=30:34", "--out"])
        .arg(&out)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("FROM:TO:STEPS"));
}

#[test]
fn two_key_grid_writes_csv_and_map() {
    let dir = tempfile::tempdir().unwrap();
    let case = demo_file(dir.path());
    let out = dir.path().join("out");
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("sweep")
        .arg(&case)
        .args([
            "--vary",
            "shell.elastic_modulus_gpa=30:34:2",
            "--vary",
            "shell.stations[0].wall_m=0.65:12:2",
            "--out",
        ])
        .arg(&out)
        .assert()
        .success()
        .stdout(predicate::str::contains("4 variants"));
    let csv = std::fs::read_to_string(out.join("sweep.csv")).unwrap();
    let mut lines = csv.lines();
    assert_eq!(
        lines.next().unwrap(),
        "shell.elastic_modulus_gpa,shell.stations[0].wall_m,stage,mode,frequency_hz,critical_speed_m_s,speed_ratio,scruton,tip_amplitude_m,max_stress_pa,required_log_decrement,damping_remedy,verdict"
    );
    let rows: Vec<&str> = lines.collect();
    // Two valid variants x 3 stages x 3 modes + two invalid variants (wall 12 m > D / 2).
    assert_eq!(rows.len(), 2 * 9 + 2, "{csv}");
    let invalid: Vec<&&str> = rows.iter().filter(|r| r.contains("invalid: ")).collect();
    assert_eq!(invalid.len(), 2);
    assert!(
        invalid[0].contains("shell.stations[0].wall_m"),
        "{}",
        invalid[0]
    );
    let svg = std::fs::read_to_string(out.join("sweep_map.svg")).unwrap();
    assert!(svg.starts_with("<svg"));
    assert!(svg.contains("shell.stations[0].wall_m"));
    assert!(
        svg.contains("url(#cross)"),
        "invalid cells are cross-hatched"
    );
    assert!(svg.trim_end().ends_with("</svg>"));
}

#[test]
fn three_keys_say_the_map_is_the_worst_case_over_the_hidden_one() {
    let dir = tempfile::tempdir().unwrap();
    let case = demo_file(dir.path());
    let out = dir.path().join("out");
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("sweep")
        .arg(&case)
        .args([
            "--vary",
            "shell.elastic_modulus_gpa=30:34:2",
            "--vary",
            "vortex.log_decrement=0.03:0.05:2",
            "--vary",
            "shell.density_kg_m3=2400:2500:2",
            "--out",
        ])
        .arg(&out)
        .assert()
        .success()
        .stdout(predicate::str::contains(
            "WORST case over 2 combinations of the key not shown: shell.density_kg_m3 (2 values, 2400 to 2500)",
        ));
    let svg = std::fs::read_to_string(out.join("sweep_map.svg")).unwrap();
    assert!(
        svg.contains("WORST case over 2 combinations of the key not shown: shell.density_kg_m3"),
        "{svg}"
    );
}

#[test]
fn an_optional_key_absent_from_the_file_can_be_swept() {
    let dir = tempfile::tempdir().unwrap();
    let case = demo_file(dir.path());
    assert!(!stackwake::input::DEMO_CASE_TOML.contains("strouhal"));
    let out = dir.path().join("out");
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("sweep")
        .arg(&case)
        .args(["--vary", "vortex.strouhal=0.16:0.20:2", "--out"])
        .arg(&out)
        .assert()
        .success()
        .stdout(predicate::str::contains("2 variants"));
    let csv = std::fs::read_to_string(out.join("sweep.csv")).unwrap();
    let crit: Vec<(String, f64)> = csv
        .lines()
        .skip(1)
        .map(|l| {
            let c: Vec<&str> = l.split(',').collect();
            (format!("{} {} {}", c[0], c[1], c[2]), c[4].parse().unwrap())
        })
        .collect();
    assert!(crit.iter().all(|(k, _)| !k.contains("invalid")), "{csv}");
    // v_crit = b n / St (EN 1991-1-4 (E.2)): the same mode at St 0.16 and 0.20 differs by
    // the ratio 0.20 / 0.16.
    let first = &crit[0];
    let same = crit
        .iter()
        .find(|(k, _)| k.starts_with("0.2 ") && k[4..] == first.0[5..])
        .expect("the same stage and mode at St 0.2");
    assert!(
        (first.1 / same.1 - 0.20 / 0.16).abs() < 1e-9,
        "{first:?} {same:?}"
    );
    // A misspelt absent key is refused before any work, saying how optional keys are swept.
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("sweep")
        .arg(&case)
        .args(["--vary", "vortex.strouhall=0.16:0.20:2", "--out"])
        .arg(dir.path().join("out2"))
        .assert()
        .code(2)
        .stderr(
            predicate::str::contains("vortex.strouhall")
                .and(predicate::str::contains("did you mean strouhal?"))
                .and(predicate::str::contains("by its full path")),
        );
    assert!(!dir.path().join("out2").exists());
}

#[test]
fn required_log_decrement_is_the_smallest_that_passes() {
    use stackwake::commands::sweep::run_variant;
    use stackwake::sweep::{VariantOutcome, Vary};
    let table =
        stackwake::input::parse_case_text(stackwake::input::DEMO_CASE_TOML, "demo").unwrap();
    let dir = std::path::Path::new(".");
    let rows = |delta: f64| {
        let vary = vec![Vary::parse(&format!("vortex.log_decrement={delta}:{delta}:1")).unwrap()];
        match run_variant(&table, dir, "demo", &vary, 0).outcome {
            VariantOutcome::Rows(r) => r,
            other => panic!("{other:?}"),
        }
    };
    let base = rows(0.03);
    let failing: Vec<_> = base.iter().filter(|r| r.verdict.is_exceeds()).collect();
    assert!(!failing.is_empty(), "the demo has a failing mode");
    // Same number as `check`'s remedy sizing (approach 1 governs the demo).
    let case = stackwake::input::demo_case();
    let stages = stackwake::modal::analyse_case(
        &case,
        stackwake::modal::ModalOptions {
            modes: case.vortex.modes,
            min_elements: None,
        },
    )
    .unwrap();
    let vortex = stackwake::wind::check_all(&case, &stages).unwrap();
    let remedies = stackwake::remedy::compute(&case, &stages, &vortex);
    for r in &base {
        let m = vortex
            .stages
            .iter()
            .find(|s| s.stage == r.stage)
            .and_then(|s| s.modes.iter().find(|m| m.mode == r.mode))
            .unwrap();
        assert_eq!(r.scruton, Some(m.scruton));
        assert_eq!(r.max_stress_pa, m.governing_summary().max_stress_pa);
        let sized = remedies
            .required_damping
            .iter()
            .find(|d| d.stage == r.stage && d.mode == r.mode)
            .and_then(|d| d.approach1.log_decrement);
        assert_eq!(
            r.required_log_decrement, sized,
            "{} mode {}",
            r.stage, r.mode
        );
    }
    for r in failing {
        let need = r
            .required_log_decrement
            .expect("a failing mode has a requirement");
        assert!(need.is_finite() && need > 0.03, "{need}");
        let at = |d: f64| {
            rows(d)
                .into_iter()
                .find(|x| x.stage == r.stage && x.mode == r.mode)
                .unwrap()
        };
        assert!(
            !at(need * 1.001).verdict.is_exceeds(),
            "{} mode {}",
            r.stage,
            r.mode
        );
        assert!(
            at(need * 0.999).verdict.is_exceeds(),
            "{} mode {}",
            r.stage,
            r.mode
        );
    }
}

/// A criterion no damping can meet (a tip amplitude of a nanometre per metre of diameter)
/// gives an empty `required_log_decrement` and says so in `damping_remedy`: no `inf`
/// reaches sweep.csv (bounded-input issue, item 1: no non-finite number in any CSV).
#[test]
fn a_criterion_beyond_any_damping_writes_no_infinity() {
    let dir = tempfile::tempdir().unwrap();
    let text = stackwake::input::DEMO_CASE_TOML.replace(
        "tip_amplitude_per_diameter = 0.05",
        "tip_amplitude_per_diameter = 1e-9",
    );
    assert!(text.contains("1e-9"));
    let case = dir.path().join("tight.toml");
    std::fs::write(&case, text).unwrap();
    let out = dir.path().join("out");
    Command::cargo_bin("stackwake")
        .unwrap()
        .args(["sweep"])
        .arg(&case)
        .args(["--vary", "vortex.log_decrement=0.02:0.04:2", "--out"])
        .arg(&out)
        .assert()
        .success();
    let csv = std::fs::read_to_string(out.join("sweep.csv")).unwrap();
    assert!(!csv.to_lowercase().contains("inf,"), "{csv}");
    assert!(!csv.contains("NaN"), "{csv}");
    assert!(
        csv.contains(",beyond log decrement 4: damping alone cannot,"),
        "{csv}"
    );
}
