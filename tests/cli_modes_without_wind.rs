//! Only the commands that run wind checks need `[wind]` (issue 12): `modes` and `scale` run on
//! a case without it, `check` refuses it in one line with exit code 2 and `sweep` runs a
//! modal sweep (frequencies only).
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
fn check_refuses_a_case_without_wind() {
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
}

/// A sweep of modal keys on a case without [wind] is a modal sweep: frequencies only.
/// Check value: with G = E / (2 (1 + nu)) scaled together with E, every frequency of the
/// beam scales as sqrt(E) (dimensional analysis of the beam equations; common practice).
#[test]
fn sweep_of_modal_keys_runs_without_wind() {
    let (dir, case) = without_wind("uniform_tube.toml");
    let out = dir.path().join("out");
    let assert = Command::cargo_bin("stackwake")
        .unwrap()
        .args([
            "sweep",
            case.to_str().unwrap(),
            "--vary",
            "shell.elastic_modulus_gpa=25:36:2",
            "--vary",
            "vortex.log_decrement=0.02:0.04:2",
            "--out",
            out.to_str().unwrap(),
        ])
        .assert()
        .code(0)
        .stdout(predicate::str::contains(
            "modal sweep: the case has no [wind]",
        ));
    drop(assert);
    assert!(
        !out.join("sweep_map.svg").exists(),
        "no lock-in map without wind"
    );
    let mut r = csv::Reader::from_path(out.join("sweep.csv")).unwrap();
    let head = r.headers().unwrap().clone();
    let col = |name: &str| head.iter().position(|h| h == name).unwrap();
    let (e, mode, f, ratio, verdict) = (
        col("shell.elastic_modulus_gpa"),
        col("mode"),
        col("frequency_hz"),
        col("speed_ratio"),
        col("verdict"),
    );
    let rows: Vec<csv::StringRecord> = r.records().map(|x| x.unwrap()).collect();
    assert!(!rows.is_empty());
    let freq = |e_gpa: &str, m: &str| -> f64 {
        rows.iter()
            .find(|x| x[e] == *e_gpa && x[mode] == *m)
            .unwrap_or_else(|| panic!("row E = {e_gpa}, mode {m}"))[f]
            .parse()
            .unwrap()
    };
    for m in ["1", "2"] {
        let ratio_f = freq("36", m) / freq("25", m);
        assert!(
            (ratio_f / (36.0f64 / 25.0).sqrt() - 1.0).abs() < 1e-9,
            "mode {m}: f(36)/f(25) = {ratio_f}"
        );
    }
    for x in &rows {
        assert_eq!(&x[ratio], "", "no speed ratio without wind");
        assert_eq!(&x[verdict], "not judged");
    }
}
