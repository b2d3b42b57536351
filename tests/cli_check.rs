//! The `check` command through the binary: contract columns of vortex.csv, exit codes 3
//! (no criteria: every verdict "not judged") and 1 (a criterion set below the computed
//! response).

use assert_cmd::Command;
use predicates::prelude::*;

const VORTEX_HEADER: &str =
    "stage,mode,frequency_hz,reference_height_m,diameter_m,strouhal,critical_speed_m_s,\
mean_speed_m_s,speed_ratio,reynolds,scruton,tip_amplitude_m,base_moment_nm,fatigue_cycles,verdict";

fn example(extra: &str) -> (tempfile::TempDir, std::path::PathBuf) {
    let dir = tempfile::tempdir().unwrap();
    let text = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/examples/uniform_tube.toml"
    ))
    .unwrap();
    // The tests here bring their own criteria (or none): the example's are taken out.
    let text = &text[..text
        .find("\n# Acceptance criterion")
        .expect("example's criteria")];
    let case = dir.path().join("case.toml");
    std::fs::write(&case, format!("{text}\n{extra}")).unwrap();
    (dir, case)
}

#[test]
fn no_criteria_exits_3_with_contract_columns() {
    let (dir, case) = example("");
    let out = dir.path().join("out");
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("check")
        .arg(&case)
        .arg("--out")
        .arg(&out)
        .assert()
        .code(3)
        .stderr(predicate::str::contains("no [criteria] given: no verdict is judged").count(1));
    let vortex = std::fs::read_to_string(out.join("vortex.csv")).unwrap();
    assert_eq!(vortex.lines().next().unwrap(), VORTEX_HEADER);
    // No lining and no [[stage]]: one default stage x three modes.
    assert_eq!(vortex.lines().count(), 1 + 3);
    for line in vortex.lines().skip(1) {
        let verdict = line.rsplit(',').next().unwrap();
        assert_eq!(verdict, "not judged", "{line}");
    }
    let loads = std::fs::read_to_string(out.join("loads.csv")).unwrap();
    assert_eq!(
        loads.lines().next().unwrap(),
        "stage,mode,z_m,inertia_force_n_m,shear_n,moment_nm,stress_pa"
    );
    // The note's verdict at a glance says the same as the exit code.
    let note = std::fs::read_to_string(out.join("report.html")).unwrap();
    assert!(note.contains("Overall: nothing is judged: the case gives no criteria (exit code 3)."));
}

#[test]
fn criterion_below_the_response_exits_1() {
    let (dir, case) = example("[criteria]\ntip_amplitude_m = 0.001\n");
    let out = dir.path().join("out");
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("check")
        .arg(&case)
        .arg("--out")
        .arg(&out)
        .assert()
        .code(1)
        .stdout(predicate::str::contains("exceeds: tip amplitude"));
    assert!(
        out.join("vortex.csv").exists(),
        "outputs are written when a check fails"
    );
}

#[test]
fn generous_criterion_exits_0_with_ok() {
    let (dir, case) = example("[criteria]\ntip_amplitude_m = 5.0\nstress_mpa = 500.0\n");
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("check")
        .arg(&case)
        .arg("--out")
        .arg(dir.path().join("out"))
        .assert()
        .code(0)
        .stdout(predicate::str::contains(" ok"));
}

#[test]
fn model_table_adds_the_model_plan_to_the_note() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("check")
        .arg(concat!(
            env!("CARGO_MANIFEST_DIR"),
            "/examples/wind_tunnel_model.toml"
        ))
        .arg("--out")
        .arg(&out)
        .assert()
        .code(predicate::in_iter([0, 1, 3]));
    let html = std::fs::read_to_string(out.join("report.html")).unwrap();
    assert!(html.contains("Aeroelastic model plan"));
}

#[test]
fn no_criteria_statement_is_in_the_note_and_summary_and_exit_3_is_documented() {
    let (dir, case) = example("");
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
        .code(3);
    let json: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(out.join("summary.json")).unwrap()).unwrap();
    let warnings = json["warnings"].as_array().unwrap();
    assert_eq!(
        warnings
            .iter()
            .filter(|w| w.as_str().unwrap().starts_with("no [criteria] given"))
            .count(),
        1
    );
    let html = std::fs::read_to_string(out.join("report.html")).unwrap();
    assert!(html.contains("no [criteria] given: no verdict is judged"));
    // README and --help document exit code 3 beside 0, 1 and 2.
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("--help")
        .assert()
        .code(0)
        .stdout(predicate::str::contains(
            "3  the analysis ran but nothing was judged",
        ));
    let readme =
        std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/README.md")).unwrap();
    assert!(readme.contains("`3` the analysis ran but nothing was judged"));
}
