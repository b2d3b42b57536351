//! Plausibility warnings and the related errors, through the binary (issue 12): every
//! suspicious but valid value gives one `warning:` line naming the key, the value, the
//! plausible range and the likely slip, and the run goes on with the input unchanged; the two
//! impossible ones (stacks closer than a diameter, a model larger than the test section) and
//! unit slips in the stations are errors (exit 2); a case without criteria exits 3.
//!
//! Sources: the plausible ranges are common practice for tall RC chimneys (see
//! src/input/plausibility.rs); GB 50009 and EN 1991-1-4 are not involved. Data are invented.

use assert_cmd::Command;

const BASE: &str = r#"title = "Invented plausibility test stack"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
stations = [
  { z_m = 0.0,   outer_diameter_m = 8.0, wall_m = 0.40 },
  { z_m = 100.0, outer_diameter_m = 6.0, wall_m = 0.25 },
]
[wind]
reference_speed_m_s = 25.0
[vortex]
log_decrement = 0.03
design_life_years = 50.0
[criteria]
tip_amplitude_m = 50.0
stress_mpa = 5000.0
"#;

struct Row {
    name: &'static str,
    command: &'static str,
    case: String,
    code: i32,
    /// Each must appear in stderr (and, for `check` warnings, in summary.json and the note).
    messages: Vec<&'static str>,
}

fn edit(from: &str, to: &str) -> String {
    assert!(BASE.contains(from), "edit target missing: {from}");
    BASE.replacen(from, to, 1)
}

fn rows() -> Vec<Row> {
    let row = |name, command, case: String, code, messages: Vec<&'static str>| Row {
        name,
        command,
        case,
        code,
        messages,
    };
    vec![
        row("E 3.4 GPa (for 34)", "modes", edit("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = 3.4"), 0,
            vec!["warning: shell.elastic_modulus_gpa = 3.4: outside the plausible 20-50 GPa of structural concrete; a slipped decimal point"]),
        row("E 340 GPa (for 34)", "check", edit("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = 340.0"), 0,
            vec!["warning: shell.elastic_modulus_gpa = 340: outside the plausible 20-50 GPa"]),
        row("lateral spring in the wrong unit", "modes", format!("{BASE}[base]\nlateral_stiffness_mn_per_m = 0.0094\n"), 0,
            vec!["Hz is below the plausible 0.05 Hz of a tall RC stack",
                 "of the mode's displacement is rigid-body motion on the foundation springs",
                 "are base.lateral_stiffness_mn_per_m in their units"]),
        row("rotational spring in N m/rad", "modes", format!("{BASE}[base]\nrotational_stiffness_gnm_per_rad = 3.0e12\n"), 0,
            vec!["warning: base.rotational_stiffness_gnm_per_rad = 3000000000000:",
                 "numerically rigid: the model treats it as rigid in effect",
                 "was it typed in N m/rad"]),
        row("wind speed in km/h", "check", edit("reference_speed_m_s = 25.0", "reference_speed_m_s = 94.0"), 0,
            vec!["warning: wind.reference_speed_m_s = 94: above the plausible 55 m/s for a mean (10-minute) speed; a km/h value (94 km/h = 26.1 m/s)?"]),
        row("damping ratio for the log decrement", "check", edit("log_decrement = 0.03", "log_decrement = 0.005"), 0,
            vec!["warning: vortex.log_decrement = 0.005: below the plausible 0.01-0.3; a damping ratio typed for the log decrement (delta = 2 pi zeta: zeta = 0.005 is delta = 0.0314)?"]),
        row("log decrement too large", "check", edit("log_decrement = 0.03", "log_decrement = 0.5"), 0,
            vec!["warning: vortex.log_decrement = 0.5: above the plausible 0.01-0.3"]),
        row("design life 500 years", "check", edit("design_life_years = 50.0", "design_life_years = 500.0"), 0,
            vec!["warning: vortex.design_life_years = 500: above the plausible 200 years"]),
        row("group closer than 3 diameters", "check", format!("{BASE}[vortex.group]\ncount = 2\nspacing_m = 16.0\n"), 0,
            vec!["warning: vortex.group.spacing_m = 16: 2.00 base diameters (8 m), closer than the 3 diameters the in-line group rule is meant for"]),
        row("group shells intersect", "modes", format!("{BASE}[vortex.group]\ncount = 2\nspacing_m = 5.0\n"), 2,
            vec!["vortex.group.spacing_m = 5: closer than the base diameter (8 m): the shells would intersect"]),
        row("every diameter in mm is named", "modes",
            edit("outer_diameter_m = 8.0, wall_m = 0.40", "outer_diameter_m = 8000.0, wall_m = 400.0")
                .replace("outer_diameter_m = 6.0, wall_m = 0.25", "outer_diameter_m = 6000.0, wall_m = 250.0"), 2,
            vec!["shell.stations[0].outer_diameter_m = 8000: over 200 m: are the sizes in mm? give metres",
                 "shell.stations[1].outer_diameter_m = 6000: over 200 m: are the sizes in mm? give metres"]),
        row("a wall in mm gets a unit hint", "modes", edit("wall_m = 0.25 }", "wall_m = 250.0 }"), 2,
            vec!["shell.stations[1].wall_m = 250: more than half the outer diameter (6 m); is the wall in mm? give metres (250 mm = 0.25 m)"]),
        row("no criteria: not judged, exit 3", "check", BASE.split("[criteria]").next().unwrap().to_string(), 3,
            vec!["warning: no [criteria] given: no verdict is judged (every verdict says \"not judged\"; exit code 3)"]),
    ]
}

fn run(command: &str, case: &str, extra: &[&str]) -> (i32, String, tempfile::TempDir) {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("case.toml");
    std::fs::write(&path, case).unwrap();
    let out = Command::cargo_bin("stackwake")
        .unwrap()
        .arg(command)
        .arg(&path)
        .arg("--out")
        .arg(dir.path().join("out"))
        .args(extra)
        .output()
        .unwrap();
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&out.stderr).into_owned(),
        dir,
    )
}

#[test]
fn every_plausibility_row() {
    let mut failures = Vec::new();
    for r in rows() {
        let (code, stderr, dir) = run(r.command, &r.case, &[]);
        if code != r.code {
            failures.push(format!(
                "{}: exit {code}, expected {}\n{stderr}",
                r.name, r.code
            ));
            continue;
        }
        for m in &r.messages {
            if stderr.matches(m).count() != 1 {
                failures.push(format!("{}: stderr lacks (once) {m:?}\n{stderr}", r.name));
            }
        }
        if r.command == "check" && r.code != 2 {
            // The same warnings in summary.json and the note's warnings.
            let out = dir.path().join("out");
            let json = std::fs::read_to_string(out.join("summary.json")).unwrap();
            let summary: serde_json::Value = serde_json::from_str(&json).unwrap();
            let warnings: Vec<String> = summary["warnings"]
                .as_array()
                .unwrap()
                .iter()
                .map(|w| w.as_str().unwrap().to_string())
                .collect();
            let html = std::fs::read_to_string(out.join("report.html")).unwrap();
            for m in &r.messages {
                let text = m.strip_prefix("warning: ").unwrap_or(m);
                if !warnings.iter().any(|w| w.contains(text)) {
                    failures.push(format!("{}: summary.json warnings lack {text:?}", r.name));
                }
                // The note escapes quotes; compare up to the first one.
                let head = text.split('"').next().unwrap();
                if !html.contains(head) {
                    failures.push(format!("{}: the note lacks {head:?}", r.name));
                }
            }
        }
    }
    assert!(failures.is_empty(), "{}", failures.join("\n\n"));
}

#[test]
fn the_base_case_gives_no_plausibility_warning() {
    let (code, stderr, _dir) = run("check", BASE, &[]);
    assert_eq!(code, 0, "{stderr}");
    assert!(!stderr.contains("plausible"), "{stderr}");
}

fn model_case() -> String {
    std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/examples/wind_tunnel_model.toml"
    ))
    .unwrap()
}

#[test]
fn scale_measured_amplitudes_in_mm_typed_as_m_warn() {
    let dir = tempfile::tempdir().unwrap();
    let csv = dir.path().join("lab.csv");
    // 4.0 "m" on the model (meant 4 mm): x k_l is hundreds of metres on the prototype.
    std::fs::write(
        &csv,
        "model_speed_m_s,tip_amplitude_m\n8.0,0.0004\n10.0,4.0\n",
    )
    .unwrap();
    let (code, stderr, _d) = run(
        "scale",
        &model_case(),
        &["--measured", csv.to_str().unwrap()],
    );
    assert_eq!(code, 0, "{stderr}");
    assert_eq!(
        stderr
            .matches("measured tip_amplitude_m converted to the prototype exceeds the prototype's top diameter")
            .count(),
        1,
        "{stderr}"
    );
    assert!(stderr.contains("at line 3: "), "{stderr}");
    assert!(
        stderr.contains("were the model amplitudes given in mm instead of m?"),
        "{stderr}"
    );
    // The plausible rows give no such warning.
    std::fs::write(&csv, "model_speed_m_s,tip_amplitude_m\n8.0,0.0004\n").unwrap();
    let (code, stderr, _d) = run(
        "scale",
        &model_case(),
        &["--measured", csv.to_str().unwrap()],
    );
    assert_eq!(code, 0, "{stderr}");
    assert!(
        !stderr.contains("exceeds the prototype's top diameter"),
        "{stderr}"
    );
}

#[test]
fn scale_blockage_over_100_percent_is_an_error() {
    let (code, stderr, dir) = run("scale", &model_case(), &["--length-scale", "2"]);
    assert_eq!(code, 2, "{stderr}");
    assert!(stderr.contains("error: blockage"), "{stderr}");
    assert!(
        stderr.contains(
            "the model's frontal area at k_l = 2 is larger than the tunnel's test section"
        ),
        "{stderr}"
    );
    assert!(!dir.path().join("out").join("scale.csv").exists());
}
