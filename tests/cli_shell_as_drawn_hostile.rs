//! Hostile case files for the shell as drawn (wall steps, concrete zones, openings,
//! foundation inertia) through the binary: each must exit with code 2 and print the exact
//! `path = value: rule` line, leaving no output folder; a foundation mass on a fixed base is
//! a warning, not an error. Robustness checks of our own error contract (common practice
//! for input validation); no outside engineering reference is involved.

use std::time::Duration;

use assert_cmd::Command;

/// A small valid case (invented numbers) with a wall step, two zones and an opening.
const BASE: &str = r#"title = "Invented shell-as-drawn hostile-input base case"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
stations = [
  { z_m = 0.0,   outer_diameter_m = 12.0, wall_m = 0.40 },
  { z_m = 40.0,  outer_diameter_m = 10.0, wall_m = 0.40 },
  { z_m = 40.0,  outer_diameter_m = 10.0, wall_m = 0.30 },
  { z_m = 100.0, outer_diameter_m = 8.0,  wall_m = 0.20 },
]
[[shell.zone]]
from_z_m = 0.0
to_z_m = 40.0
elastic_modulus_gpa = 36.0
[[shell.zone]]
from_z_m = 40.0
to_z_m = 100.0
density_kg_m3 = 2450.0
[[opening]]
from_z_m = 10.0
to_z_m = 18.0
width_m = 3.0
label = "flue inlet"
[[point_mass]]
z_m = 100.0
mass_kg = 10000.0
rotary_inertia_kg_m2 = 2.0e5
[base]
rotational_stiffness_gnm_per_rad = 900.0
lateral_stiffness_mn_per_m = 6000.0
mass_kg = 2.0e6
rotary_inertia_kg_m2 = 5.0e8
"#;

fn edit(from: &str, to: &str) -> String {
    assert!(BASE.contains(from), "edit target not in BASE: {from}");
    BASE.replacen(from, to, 1)
}

fn run(case: &str) -> (Option<i32>, String, tempfile::TempDir) {
    let dir = tempfile::tempdir().expect("temp dir");
    std::fs::write(dir.path().join("case.toml"), case).expect("write case");
    let out = Command::cargo_bin("stackwake")
        .expect("binary built")
        .arg("modes")
        .arg(dir.path().join("case.toml"))
        .arg("--out")
        .arg(dir.path().join("out"))
        .args(["--modes", "2"])
        .timeout(Duration::from_secs(120))
        .output()
        .expect("run stackwake");
    (
        out.status.code(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
        dir,
    )
}

#[test]
fn the_base_case_runs_and_sections_csv_shows_the_step_and_the_opening() {
    let (code, stderr, dir) = run(BASE);
    assert_eq!(code, Some(0), "{stderr}");
    let sections = std::fs::read_to_string(dir.path().join("out/sections.csv")).unwrap();
    let at = |z: &str| -> Vec<Vec<f64>> {
        sections
            .lines()
            .skip(1)
            .map(|l| l.split(',').collect::<Vec<_>>())
            .filter(|c| c[1] == z)
            .map(|c| c[2..].iter().map(|v| v.parse().unwrap()).collect())
            .collect()
    };
    // The step: two rows at 40 m, the wall below (0.40 m) first, then above (0.30 m).
    let step = at("40.0");
    assert_eq!(step.len(), 2, "{sections}");
    assert_eq!((step[0][1], step[1][1]), (0.4, 0.3));
    // Inside the opening the area is the net one: below the gross annulus pi t (D - t).
    let row = at("14.0");
    assert!(!row.is_empty(), "a node inside the opening: {sections}");
    let (d, t, area) = (row[0][0], row[0][1], row[0][2]);
    assert!(area < std::f64::consts::PI * t * (d - t) * 0.95, "{area}");
}

#[test]
fn hostile_shell_as_drawn_inputs_name_key_value_and_rule() {
    let rows: Vec<(&str, String, &str)> = vec![
        (
            "step of three stations",
            edit(
                "  { z_m = 100.0,",
                "  { z_m = 40.0,  outer_diameter_m = 10.0, wall_m = 0.25 },\n  { z_m = 100.0,",
            ),
            "shell.stations[3].z_m = 40: a third station at the height of a wall step; a step is \
             exactly two stations (the first holds below, the second above)",
        ),
        (
            "zone outside the shell",
            edit("to_z_m = 100.0\ndensity", "to_z_m = 120.0\ndensity"),
            "shell.zone[1].to_z_m = 120: outside the shell (0 to 100 m)",
        ),
        (
            "overlapping zones",
            edit("from_z_m = 40.0\nto_z_m = 100.0", "from_z_m = 30.0\nto_z_m = 100.0"),
            "shell.zone[1].from_z_m = 30: overlaps shell.zone[0] (0 to 40 m); zones must not \
             overlap",
        ),
        (
            "a stage top inside an opening",
            BASE.to_string()
                + "[[stage]]\nname = \"shell to 14 m\"\nlining = false\ntop_z_m = 14.0\nduration_years = 0.1\n",
            "stage[0].top_z_m = 14: lies inside opening[0] (10 to 18 m): put the stage's top at \
             or below the opening's bottom, or at or above its top",
        ),
        (
            "opening wider than the shell",
            edit("width_m = 3.0", "width_m = 12.0"),
            "opening[0].width_m = 12: wider than the shell: the outer diameter is 11.1 m at z = \
             18 m; the clear width must be less than the diameter",
        ),
        (
            "openings removing more than half",
            edit("width_m = 3.0", "width_m = 10.5")
                + "[[opening]]\nfrom_z_m = 10.0\nto_z_m = 18.0\nwidth_m = 10.5\nazimuth_deg = 180.0\n",
            "opening[1].width_m = 10.5: the openings at z = 18 m (opening[0], opening[1]) remove \
             79 % of the circumference; at most half may be removed",
        ),
        (
            "overlapping openings",
            BASE.to_string()
                + "[[opening]]\nfrom_z_m = 15.0\nto_z_m = 25.0\nwidth_m = 3.0\nazimuth_deg = 20.0\n",
            "opening[1].azimuth_deg = 20: overlaps opening[0] (\"flue inlet\") at z = 18 m: \
             centres 20.0 deg apart, half-angles asin(width / D) 15.7 and 15.7 deg; openings at \
             one height must not overlap",
        ),
        (
            "negative foundation mass",
            edit("mass_kg = 2.0e6", "mass_kg = -2.0e6"),
            "base.mass_kg = -2000000: must be >= 0",
        ),
    ];
    for (name, case, expected) in rows {
        let (code, stderr, dir) = run(&case);
        assert_eq!(code, Some(2), "{name}: {stderr}");
        assert!(
            stderr
                .lines()
                .any(|l| l.trim_start_matches("error: ").trim() == expected),
            "{name}: expected line\n  {expected}\nin\n{stderr}"
        );
        assert!(!stderr.contains("panicked"), "{name}: {stderr}");
        assert!(!dir.path().join("out").exists(), "{name}: output written");
    }
}

#[test]
fn a_foundation_mass_on_a_fixed_base_is_ignored_with_a_warning() {
    let case = edit(
        "rotational_stiffness_gnm_per_rad = 900.0\nlateral_stiffness_mn_per_m = 6000.0\n",
        "",
    );
    let (code, stderr, _dir) = run(&case);
    assert_eq!(code, Some(0), "{stderr}");
    assert!(
        stderr.contains("base.mass_kg = 2000000: ignored, the base is fixed (no [base] springs)"),
        "{stderr}"
    );
    assert!(
        stderr.contains("base.rotary_inertia_kg_m2 = 500000000: ignored"),
        "{stderr}"
    );
}

#[test]
fn a_heavy_foundation_mode_is_checked_in_the_shell_not_at_the_base() {
    // The starter template with its commented foundation mass and rotary inertia switched on
    // (2e7 kg on 6000 MN/m): mode 3 is the raft sliding on its spring, largest at z = 0.
    // Shedding is evaluated at the largest antinode above the base (the foundation is not in
    // the wind), so `check` runs instead of stopping on an infinite speed ratio at z = 0.
    let dir = tempfile::tempdir().expect("temp dir");
    let template = dir.path().join("starter.toml");
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("new")
        .arg(&template)
        .assert()
        .success();
    let text = std::fs::read_to_string(&template)
        .unwrap()
        .replace("# mass_kg = 2.0e7", "mass_kg = 2.0e7")
        .replace(
            "# rotary_inertia_kg_m2 = 5.0e9",
            "rotary_inertia_kg_m2 = 5.0e9",
        );
    assert!(text.contains("\nmass_kg = 2.0e7"));
    let case = dir.path().join("heavy.toml");
    std::fs::write(&case, text).unwrap();
    let out = Command::cargo_bin("stackwake")
        .unwrap()
        .arg("check")
        .arg(&case)
        .arg("--out")
        .arg(dir.path().join("out"))
        .timeout(Duration::from_secs(120))
        .output()
        .unwrap();
    let stderr = String::from_utf8_lossy(&out.stderr);
    assert!(matches!(out.status.code(), Some(0 | 1 | 3)), "{stderr}");
    let vortex = std::fs::read_to_string(dir.path().join("out/vortex.csv")).unwrap();
    for row in vortex.lines().skip(1) {
        let reference_height_m: f64 = row.split(',').nth(3).unwrap().parse().unwrap();
        assert!(reference_height_m > 0.0, "{row}");
    }
}
