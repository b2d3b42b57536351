//! The `modes` command through the binary: contract columns, exit codes, field-named errors.

use assert_cmd::Command;
use predicates::prelude::*;

fn header(path: &std::path::Path) -> String {
    std::fs::read_to_string(path)
        .unwrap()
        .lines()
        .next()
        .unwrap()
        .to_string()
}

#[test]
fn modes_on_the_demo_writes_the_contract_columns() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    Command::cargo_bin("stackwake")
        .unwrap()
        .args(["modes", "--out"])
        .arg(&out)
        .assert()
        .success()
        .stdout(predicate::str::contains("Sturm count"));
    assert_eq!(
        header(&out.join("modes.csv")),
        "stage,mode,frequency_hz,period_s,modal_mass_kg,equivalent_mass_kg_m"
    );
    assert_eq!(
        header(&out.join("mode_shapes.csv")),
        "stage,mode,z_m,displacement"
    );
    // Default: five modes for every stage of the demo.
    let rows = std::fs::read_to_string(out.join("modes.csv"))
        .unwrap()
        .lines()
        .count()
        - 1;
    let stages = stackwake::input::demo_case().stages.len();
    assert_eq!(rows, 5 * stages);
    // Shapes are normalised to max |displacement| = 1.
    let shapes = std::fs::read_to_string(out.join("mode_shapes.csv")).unwrap();
    let max = shapes
        .lines()
        .skip(1)
        .map(|l| l.rsplit(',').next().unwrap().parse::<f64>().unwrap().abs())
        .fold(0.0, f64::max);
    assert!((max - 1.0).abs() < 1e-12);
}

#[test]
fn bad_case_file_exits_2_naming_the_field() {
    let dir = tempfile::tempdir().unwrap();
    let case = dir.path().join("bad.toml");
    let text = stackwake::input::DEMO_CASE_TOML.replacen(
        "elastic_modulus_gpa = ",
        "elastic_modulus_gpa = -",
        1,
    );
    std::fs::write(&case, text).unwrap();
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("modes")
        .arg(&case)
        .arg("--out")
        .arg(dir.path().join("out"))
        .assert()
        .code(2)
        .stderr(predicate::str::contains("shell.elastic_modulus_gpa = -"));
    assert!(!dir.path().join("out").exists(), "no output on error");
}

#[test]
fn out_of_range_option_exits_2() {
    Command::cargo_bin("stackwake")
        .unwrap()
        .args(["modes", "--modes", "0"])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("--modes = 0"));
}
