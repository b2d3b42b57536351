//! The `sweep` command through the binary: a bad key stops with exit 2 naming it; a two-key
//! grid writes sweep.csv and the lock-in map; an invalid grid point is a row, not an abort.

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
        "shell.elastic_modulus_gpa,shell.stations[0].wall_m,stage,mode,frequency_hz,critical_speed_m_s,speed_ratio,tip_amplitude_m,verdict"
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
