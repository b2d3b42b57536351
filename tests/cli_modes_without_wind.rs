//! Only the commands that run wind checks need `[wind]` (issue 12): `modes` and `scale` run on
//! a case without it, `check` and `sweep` refuse it in one line with exit code 2.
//! Source: the project's command contract (design notes, "Commands"); no outside source.

use assert_cmd::Command;
use predicates::prelude::*;

/// An example case file with its [wind] section removed.
fn without_wind(example: &str) -> (tempfile::TempDir, std::path::PathBuf) {
    let text =
        std::fs::read_to_string(format!("{}/examples/{example}", env!("CARGO_MANIFEST_DIR")))
            .unwrap();
    let mut out = String::new();
    let mut in_wind = false;
    for line in text.lines() {
        if line.starts_with('[') {
            in_wind = line.trim() == "[wind]";
        }
        if !in_wind {
            out.push_str(line);
            out.push('\n');
        }
    }
    assert!(!out.contains("[wind]") && !out.contains("reference_speed_m_s"));
    let dir = tempfile::tempdir().unwrap();
    let case = dir.path().join("case.toml");
    std::fs::write(&case, out).unwrap();
    (dir, case)
}

#[test]
fn modes_runs_without_wind() {
    let (dir, case) = without_wind("uniform_tube.toml");
    let out = dir.path().join("out");
    Command::cargo_bin("stackwake")
        .unwrap()
        .args([
            "modes",
            case.to_str().unwrap(),
            "--out",
            out.to_str().unwrap(),
        ])
        .assert()
        .code(0)
        .stderr(predicate::str::contains("[wind]").not());
    let modes = std::fs::read_to_string(out.join("modes.csv")).unwrap();
    assert_eq!(modes.lines().count(), 1 + 5, "{modes}");
}

#[test]
fn scale_runs_without_wind() {
    let (dir, case) = without_wind("wind_tunnel_model.toml");
    let out = dir.path().join("out");
    Command::cargo_bin("stackwake")
        .unwrap()
        .args([
            "scale",
            case.to_str().unwrap(),
            "--out",
            out.to_str().unwrap(),
        ])
        .assert()
        .code(0);
    let model_case = std::fs::read_to_string(out.join("model_case.toml")).unwrap();
    assert!(!model_case.contains("\n[wind]"), "{model_case}");
    let speeds = std::fs::read_to_string(out.join("scale_speeds.csv")).unwrap();
    assert!(!speeds.contains("design wind"), "{speeds}");
}

#[test]
fn check_and_sweep_refuse_a_case_without_wind() {
    let (dir, case) = without_wind("uniform_tube.toml");
    let out = dir.path().join("out");
    Command::cargo_bin("stackwake")
        .unwrap()
        .args([
            "check",
            case.to_str().unwrap(),
            "--out",
            out.to_str().unwrap(),
        ])
        .assert()
        .code(2)
        .stderr(predicate::str::contains(
            "missing section [wind]: `check` runs the vortex-shedding checks",
        ));
    assert!(!out.exists(), "nothing written");
    Command::cargo_bin("stackwake")
        .unwrap()
        .args([
            "sweep",
            case.to_str().unwrap(),
            "--vary",
            "shell.elastic_modulus_gpa=28:32:3",
            "--out",
            out.to_str().unwrap(),
        ])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("missing section [wind]: `sweep`"));
}
