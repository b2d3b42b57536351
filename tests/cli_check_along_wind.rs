//! `check` with the EN site wind through the binary: along_wind.csv with the contract columns
//! (design note contract), summary.json's per-stage along_wind factors, the terminal's
//! "which governs" line; without terrain_category no along_wind.csv is written.

use assert_cmd::Command;

const ALONG_HEADER: &str = "stage,z_m,mean_speed_m_s,turbulence_intensity,peak_pressure_pa,\
force_coefficient,line_load_n_m,shear_n,moment_nm,stress_pa";

fn demo_with(extra_wind: &str) -> (tempfile::TempDir, std::path::PathBuf) {
    let dir = tempfile::tempdir().unwrap();
    let text = std::fs::read_to_string(concat!(env!("CARGO_MANIFEST_DIR"), "/data/demo.toml"))
        .unwrap()
        // The demo gives the EN site wind itself: take it out, then add the test's own.
        .replace("terrain_category = \"II\"\nbasic_speed_m_s = 26.0\n", "")
        .replace("[wind]\n", &format!("[wind]\n{extra_wind}"));
    assert!(!extra_wind.is_empty() || !text.contains("terrain_category ="));
    let case = dir.path().join("case.toml");
    std::fs::write(&case, text).unwrap();
    (dir, case)
}

#[test]
fn en_site_wind_gives_along_wind_outputs() {
    let (dir, case) = demo_with("terrain_category = \"III\"\nbasic_speed_m_s = 27.0\n");
    let out = dir.path().join("out");
    let assert = Command::cargo_bin("stackwake")
        .unwrap()
        .arg("check")
        .arg(&case)
        .arg("--out")
        .arg(&out)
        .assert()
        .code(1);
    let stdout = String::from_utf8(assert.get_output().stdout.clone()).unwrap();
    assert!(stdout.contains("along-wind design action"), "{stdout}");
    assert!(stdout.contains("governs"), "{stdout}");
    let csv = std::fs::read_to_string(out.join("along_wind.csv")).unwrap();
    assert_eq!(csv.lines().next().unwrap(), ALONG_HEADER);
    let svg = std::fs::read_to_string(out.join("along_moments.svg")).unwrap();
    assert!(svg.starts_with("<svg") || svg.starts_with("<?xml"));
    let html = std::fs::read_to_string(out.join("report.html")).unwrap();
    assert!(html.contains("Along-wind action and the vortex case"));
    // The base row of the first stage carries the largest moment of that stage.
    let first: Vec<f64> = csv
        .lines()
        .nth(1)
        .unwrap()
        .split(',')
        .skip(1)
        .map(|v| v.parse().unwrap())
        .collect();
    assert_eq!(first[0], 0.0);
    assert!(first[7] > 0.0 && first[8] > 0.0);
    let json: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(out.join("summary.json")).unwrap()).unwrap();
    for s in json["stages"].as_array().unwrap() {
        let a = &s["along_wind"];
        for key in [
            "cscd",
            "background_factor",
            "resonance_factor",
            "peak_factor",
            "log_decrement_total",
        ] {
            assert!(a[key].as_f64().is_some_and(f64::is_finite), "{key}: {a}");
        }
        assert!(a["combined"].is_array());
    }
}

#[test]
fn without_terrain_category_no_along_wind_file() {
    let (dir, case) = demo_with("");
    let out = dir.path().join("out");
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("check")
        .arg(&case)
        .arg("--out")
        .arg(&out)
        .assert()
        .code(1); // the demo exceeds its criteria in some modes
    assert!(out.join("vortex.csv").exists());
    assert!(!out.join("along_wind.csv").exists());
    assert!(!out.join("along_moments.svg").exists());
}

/// The note says which wind speed drives which check when the case gives both ways
/// (along-wind issue: "the note says which speed each check used").
#[test]
fn the_note_says_which_wind_drives_which_check() {
    let (dir, case) = demo_with("terrain_category = \"III\"\nbasic_speed_m_s = 27.0\n");
    let out = dir.path().join("out");
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("check")
        .arg(&case)
        .arg("--out")
        .arg(&out)
        .assert()
        .code(1);
    let html = std::fs::read_to_string(out.join("report.html")).unwrap();
    assert!(
        html.contains("Which wind drives which check"),
        "no speed statement"
    );
    assert!(html.contains("<code>wind.reference_speed_m_s</code> = 26 m/s at 10 m"));
    assert!(html.contains("terrain category III from v<sub>b,0</sub> = 27 m/s"));
}
