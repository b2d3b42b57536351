//! `check` end to end on a case file with a temporary stage: vortex.csv (contract columns)
//! carries the stage's own mean speed (the site's 50-year speed x c_prob, EN 1991-1-4
//! 4.2(2)P expression (4.2), K = 0.2, n = 0.5, written out below) and the fatigue cycles
//! counted over the stage's duration (EN 1991-1-4 Annex E cycle count proportional to the
//! duration for a fixed v_0: closed form). Stage "temporary" is the in-service shell for
//! 0.5 years (EN 1991-1-6 Table 3.1, from memory: 10-year return period); the climbing rig is
//! in "rigged" only. Invented data.

use assert_cmd::Command;

const CASE: &str = r#"title = "Invented stage-wind case"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
stations = [
  { z_m = 0.0,   outer_diameter_m = 8.0, wall_m = 0.30 },
  { z_m = 120.0, outer_diameter_m = 6.0, wall_m = 0.20 },
]
[[point_mass]]
z_m = 120.0
mass_kg = 30000.0
label = "climbing rig"
stages = ["rigged"]
[[stage]]
name = "in service"
lining = false
[[stage]]
name = "temporary"
lining = false
duration_years = 0.5
[[stage]]
name = "rigged"
lining = false
duration_years = 0.5
return_period_years = 50.0
log_decrement = 0.02
[wind]
reference_speed_m_s = 24.0
[vortex]
modes = 1
"#;

fn expression_4_2(t: f64) -> f64 {
    let (k, n, p) = (0.2, 0.5, 1.0 / t);
    ((1.0 - k * (-(1.0 - p).ln()).ln()) / (1.0 - k * (-(1.0f64 - 0.02).ln()).ln())).powf(n)
}

#[test]
fn vortex_csv_has_the_stage_speed_and_the_stage_cycles() {
    let dir = tempfile::tempdir().unwrap();
    std::fs::write(dir.path().join("case.toml"), CASE).unwrap();
    let out = dir.path().join("out");
    let o = Command::cargo_bin("stackwake")
        .unwrap()
        .args(["check", "case.toml", "--out", "out"])
        .current_dir(dir.path())
        .output()
        .unwrap();
    // No criteria: nothing judged (exit 3).
    assert_eq!(o.status.code(), Some(3), "{o:?}");
    let mut r = csv::Reader::from_path(out.join("vortex.csv")).unwrap();
    let h = r.headers().unwrap().clone();
    let col = |name: &str| h.iter().position(|c| c == name).unwrap();
    let rows: Vec<csv::StringRecord> = r.records().map(Result::unwrap).collect();
    let get = |i: usize, name: &str| rows[i][col(name)].parse::<f64>().unwrap();
    assert_eq!(&rows[1][col("stage")], "temporary");
    // Same structure, the 10-year speed: ratio c_prob(10), to 1e-12 (same closed form).
    let ratio = get(1, "mean_speed_m_s") / get(0, "mean_speed_m_s");
    assert!((ratio - expression_4_2(10.0)).abs() < 1e-12, "{ratio}");
    assert_eq!(get(1, "critical_speed_m_s"), get(0, "critical_speed_m_s"));
    // Cycles over 0.5 of the 50 design years, to 1e-9 (CSV round trip of 17 digits).
    let c = get(1, "fatigue_cycles") / get(0, "fatigue_cycles");
    assert!((c - 0.01).abs() < 1e-9, "{c}");
    // The rig lowers the frequency of its stage only; its own log decrement enters Sc
    // (Sc = 2 delta m_e / (rho b^2), EN 1991-1-4 E.1.3.3): Sc / delta grows with m_e.
    assert!(get(2, "frequency_hz") < get(0, "frequency_hz"));
    assert!(get(2, "scruton") / 0.02 > get(0, "scruton") / 0.03);
    // The partial or unlined in-service stage warning is not given: the shell has no lining
    // and is complete.
    let stderr = String::from_utf8_lossy(&o.stderr);
    assert!(!stderr.contains("judged as in service"), "{stderr}");
    // The note shows the stage keys.
    let html = std::fs::read_to_string(out.join("report.html")).unwrap();
    for text in [
        "EN 1991-1-6 Table 3.1",
        "c_prob (-), EN 1991-1-4 (4.2)",
        "climbing rig",
    ] {
        assert!(html.contains(text), "{text}");
    }
}
