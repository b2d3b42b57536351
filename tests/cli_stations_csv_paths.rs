//! CLI: `stations_csv` is resolved against the case file's folder (not the working folder),
//! every message about it shows the resolved path and says how it was found, and a file that
//! is not a stations CSV (here `/proc/self/environ`, which holds the process's environment)
//! is refused without any of its content in the message.

use assert_cmd::Command;
use predicates::prelude::*;
use predicates::str::contains;

const SHELL: &str = "[shell]\nelastic_modulus_gpa = 32.0\ndensity_kg_m3 = 2500.0\n";
const WIND: &str = "[wind]\nreference_speed_m_s = 25.0\n";

fn case_with_csv(dir: &std::path::Path, name: &str) -> std::path::PathBuf {
    let case = dir.join("case.toml");
    std::fs::write(&case, format!("{SHELL}stations_csv = {name:?}\n{WIND}")).unwrap();
    case
}

#[test]
fn a_relative_csv_is_found_beside_the_case_file_from_another_working_folder() {
    let dir = tempfile::tempdir().unwrap();
    let elsewhere = tempfile::tempdir().unwrap();
    std::fs::write(
        dir.path().join("s.csv"),
        "z_m,outer_diameter_m,wall_m\n0,12,0.4\n100,8,0.25\n",
    )
    .unwrap();
    let case = case_with_csv(dir.path(), "s.csv");
    Command::cargo_bin("stackwake")
        .unwrap()
        .current_dir(elsewhere.path())
        .arg("modes")
        .arg(&case)
        .arg("--out")
        .arg(elsewhere.path().join("out"))
        .assert()
        .success();
}

#[test]
fn a_missing_relative_csv_is_shown_resolved_and_said_to_be_relative() {
    let dir = tempfile::tempdir().unwrap();
    let elsewhere = tempfile::tempdir().unwrap();
    let case = case_with_csv(dir.path(), "sub/nope.csv");
    let resolved = dir.path().join("sub/nope.csv");
    Command::cargo_bin("stackwake")
        .unwrap()
        .current_dir(elsewhere.path())
        .arg("modes")
        .arg(&case)
        .arg("--out")
        .arg(elsewhere.path().join("out"))
        .assert()
        .code(2)
        .stderr(
            contains(resolved.display().to_string())
                .and(contains(r#"stations_csv = "sub/nope.csv""#))
                .and(contains("relative to the case file's folder")),
        );
}

#[test]
fn proc_self_environ_is_refused_without_echoing_the_environment() {
    let dir = tempfile::tempdir().unwrap();
    let case = case_with_csv(dir.path(), "/proc/self/environ");
    Command::cargo_bin("stackwake")
        .unwrap()
        .env("STACKWAKE_TEST_SECRET", "hunter2-do-not-print")
        .arg("modes")
        .arg(&case)
        .arg("--out")
        .arg(dir.path().join("out"))
        .assert()
        .code(2)
        .stderr(
            contains("/proc/self/environ")
                .and(contains("not a stations header"))
                .and(contains("hunter2").not())
                .and(contains("STACKWAKE_TEST_SECRET").not())
                .and(contains("PATH=").not()),
        )
        .stdout(contains("hunter2").not());
    assert!(!dir.path().join("out").exists());
}
