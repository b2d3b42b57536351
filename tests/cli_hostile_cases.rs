//! Hostile case files through the binary: each row is a case file (and optionally the
//! stations CSV it names) and the exact line the user must see. Every row must exit with
//! code 2, print that line (field path, value and rule), leave no output folder, and never
//! reach the panic hook. Oddities that are harmless (BOM, CRLF) must load and run.
//! Robustness checks of our own error contract (`path = value: rule`, common practice for
//! input validation); no outside engineering reference is involved.

use std::path::Path;
use std::time::{Duration, Instant};

use assert_cmd::Command;

/// A small valid case (invented numbers); each row edits one piece of it.
const BASE: &str = r#"title = "Invented CLI hostile-input base case"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
stations = [
  { z_m = 0.0,   outer_diameter_m = 12.0, wall_m = 0.40 },
  { z_m = 50.0,  outer_diameter_m = 10.0, wall_m = 0.30 },
  { z_m = 100.0, outer_diameter_m = 8.0,  wall_m = 0.20 },
]
[[lining]]
from_z_m = 5.0
to_z_m = 100.0
mass_per_length_kg_m = 3000.0
[[point_mass]]
z_m = 90.0
mass_kg = 10000.0
label = "platform"
[[stage]]
name = "lined"
lining = true
[wind]
reference_speed_m_s = 25.0
"#;

/// BASE with its stations moved to `stations.csv`.
fn base_with_csv() -> String {
    let start = BASE.find("stations = [").expect("stations in BASE");
    let end = BASE[start..].find("]\n").expect("end of stations") + start + 2;
    format!(
        "{}stations_csv = \"stations.csv\"\n{}",
        &BASE[..start],
        &BASE[end..]
    )
}

const GOOD_CSV: &str = "z_m,outer_diameter_m,wall_m\n0,12,0.4\n50,10,0.3\n100,8,0.2\n";

fn edit(from: &str, to: &str) -> String {
    assert!(BASE.contains(from), "edit target not in BASE: {from}");
    BASE.replacen(from, to, 1)
}

/// One hostile input and the exact line expected on stderr (`{dir}` = the case's folder).
struct Row {
    name: &'static str,
    case: Vec<u8>,
    csv: Option<Vec<u8>>,
    expected: String,
}

fn row(name: &'static str, case: impl Into<Vec<u8>>, expected: &str) -> Row {
    Row {
        name,
        case: case.into(),
        csv: None,
        expected: expected.to_string(),
    }
}

fn csv_row(name: &'static str, csv: impl Into<Vec<u8>>, expected: &str) -> Row {
    Row {
        name,
        case: base_with_csv().into_bytes(),
        csv: Some(csv.into()),
        expected: expected.to_string(),
    }
}

fn stackwake() -> Command {
    Command::cargo_bin("stackwake").expect("binary built")
}

fn rows() -> Vec<Row> {
    vec![
        // Not-a-number and infinity.
        row("NaN modulus", edit("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = nan"),
            "shell.elastic_modulus_gpa = nan: must be a finite number"),
        row("infinite wall", edit("wall_m = 0.30", "wall_m = inf"),
            "shell.stations[1].wall_m = inf: must be a finite number"),
        row("-inf point mass", edit("mass_kg = 10000.0", "mass_kg = -inf"),
            "point_mass[0].mass_kg = -inf: must be a finite number"),
        // Negative and zero sizes.
        row("negative diameter", edit("outer_diameter_m = 10.0", "outer_diameter_m = -10.0"),
            "shell.stations[1].outer_diameter_m = -10: must be > 0"),
        row("zero wall", edit("wall_m = 0.40", "wall_m = 0.0"),
            "shell.stations[0].wall_m = 0: must be > 0"),
        row("zero point mass", edit("mass_kg = 10000.0", "mass_kg = 0.0"),
            "point_mass[0].mass_kg = 0: must be > 0"),
        // Wall against radius.
        row("wall over radius", edit("wall_m = 0.20", "wall_m = 4.5"),
            "shell.stations[2].wall_m = 4.5: wall must be less than half the outer diameter (8 m / 2)"),
        row("wall equal to radius", edit("wall_m = 0.20", "wall_m = 4.0"),
            "shell.stations[2].wall_m = 4: wall must be less than half the outer diameter (8 m / 2)"),
        // Stations.
        row("stations out of order", edit("z_m = 50.0", "z_m = 150.0"),
            "shell.stations[2].z_m = 100: must be above the previous station (150 m); list stations from the base upward"),
        row("duplicated station", edit("z_m = 50.0", "z_m = 0.0"),
            "shell.stations[1].z_m = 0: a wall step at the base (z = 0) has no shell below it; give one station at z = 0"),
        row("first station not at 0", edit("z_m = 0.0", "z_m = 3.0"),
            "shell.stations[0].z_m = 3: the first station must be at z = 0 (top of the foundation)"),
        // Lining ranges and forms.
        row("lining above the shell", edit("to_z_m = 100.0", "to_z_m = 130.0"),
            "lining[0].to_z_m = 130: above the top of the shell (100 m)"),
        row("lining below the base", edit("from_z_m = 5.0", "from_z_m = -5.0"),
            "lining[0].from_z_m = -5: below the base of the shell (z = 0)"),
        row("lining reversed",
            edit("from_z_m = 5.0", "from_z_m = 100.0").replacen("to_z_m = 100.0", "to_z_m = 5.0", 1),
            "lining[0].to_z_m = 5: must be above from_z_m (100 m)"),
        row("two lining forms",
            edit("mass_per_length_kg_m = 3000.0", "mass_per_length_kg_m = 3000.0\nmass_per_area_kg_m2 = 240.0"),
            "lining[0]: mass_per_length_kg_m and mass_per_area_kg_m2 given together; give exactly one mass form"),
        // Point masses and stages.
        row("point mass above the top", edit("z_m = 90.0", "z_m = 100.5"),
            "point_mass[0].z_m = 100.5: outside the shell (0 to 100 m)"),
        row("stage top at the first station", edit("lining = true", "lining = true\ntop_z_m = 0.0"),
            "stage[0].top_z_m = 0: must be above the base (> 0)"),
        row("stage top below the first station", edit("lining = true", "lining = true\ntop_z_m = -10.0"),
            "stage[0].top_z_m = -10: must be above the base (> 0)"),
        // Unknown keys (nearest valid key suggested) and wrong types.
        row("misspelt key", edit("elastic_modulus_gpa = 32.0", "elastic_modulus_gp = 32.0"),
            "shell.elastic_modulus_gp: unknown key; did you mean elastic_modulus_gpa?"),
        row("misspelt station key", edit("wall_m = 0.30", "wal_m = 0.30"),
            "shell.stations[1].wal_m: unknown key; did you mean wall_m?"),
        row("misspelt section", edit("[wind]", "[wnd]"),
            "wnd: unknown key; did you mean wind?"),
        row("string for a number", edit("mass_kg = 10000.0", "mass_kg = \"10 t\""),
            "point_mass[0].mass_kg = \"10 t\": expected a number, found a string \"10 t\""),
        row("number for a boolean", edit("lining = true", "lining = 1"),
            "stage[0].lining = 1: expected true or false, found the number 1"),
        // Wrong units.
        row("E in Pa", edit("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = 3.2e10"),
            "shell.elastic_modulus_gpa = 32000000000: looks like Pa or MPa; give E in GPa (e.g. 32.0)"),
        row("diameters in mm",
            edit("outer_diameter_m = 12.0, wall_m = 0.40", "outer_diameter_m = 12000.0, wall_m = 400.0"),
            "shell.stations[0].outer_diameter_m = 12000: over 200 m: are the sizes in mm? give metres"),
        // Empty and broken files.
        row("empty file", "",
            "{dir}/case.toml is empty: a case file needs at least [shell] ([wind] too for `check` and `sweep`; see the built-in demo case)"),
        row("comments only", "# nothing\n\n",
            "{dir}/case.toml is empty: a case file needs at least [shell] ([wind] too for `check` and `sweep`; see the built-in demo case)"),
        row("not UTF-8", b"title = \"caf\xe9\"\n".to_vec(),
            "{dir}/case.toml is not UTF-8 text (save it as UTF-8 from your editor or spreadsheet)"),
        // A case without [wind] is valid for `modes` (tests/cli_modes_without_wind.rs).
        // Stations CSV from a spreadsheet.
        // (A `;` file reads decimal commas; in a tab file the comma may mark thousands.)
        csv_row("CSV comma decimals in a tab file", "z_m\touter_diameter_m\twall_m\n0\t12\t0.4\n50\t10\t0,3\n100\t8\t0.2\n",
            "stations.csv line 3, column wall_m = \"0,3\": not a number; use a point as the decimal separator"),
        csv_row("CSV header with a unit in mm", "z (m),outer_diameter (m),wall (mm)\n0,12,400\n50,10,300\n100,8,200\n",
            "stations.csv header = \"wall (mm)\": unit \"mm\" is not read; give wall_m in metres (header wall_m or wall (m))"),
        csv_row("CSV stray unit", "z_m,outer_diameter_m,wall_m\n0,12 m,0.4\n50,10,0.3\n100,8,0.2\n",
            "stations.csv line 2, column outer_diameter_m = \"12 m\": not a number; leave out the unit (the column name gives it: metres)"),
        csv_row("CSV missing column", "z_m,outer_diameter_m\n0,12\n50,10\n100,8\n",
            "stations.csv: missing column wall_m (columns: z_m, outer_diameter_m, wall_m)"),
        csv_row("CSV diameters in mm", "z_m,outer_diameter_m,wall_m\n0,12000,400\n50,10000,300\n100,8000,200\n",
            "stations.csv line 2, column outer_diameter_m = 12000: over 200 m: are the sizes in mm? give metres"),
        csv_row("CSV with BOM, CRLF and a bad row",
            b"\xEF\xBB\xBFz_m,outer_diameter_m,wall_m\r\n0,12,0.4\r\n\r\n50,10,-0.3\r\n100,8,0.2\r\n".to_vec(),
            "stations.csv line 4, column wall_m = -0.3: must be > 0"),
        // Stages: duration, return period and damping of a stage; point masses per stage.
        row("stage duration 0", edit("lining = true", "lining = true\nduration_years = 0.0"),
            "stage[0].duration_years = 0: must be > 0"),
        row("negative stage duration", edit("lining = true", "lining = true\nduration_years = -0.5"),
            "stage[0].duration_years = -0.5: must be > 0"),
        row("return period below 1 year",
            edit("lining = true", "lining = true\nreturn_period_years = 0.5"),
            "stage[0].return_period_years = 0.5: must be > 1 year (EN 1991-1-4 (4.2) uses p = 1 / return period, which must be below 1)"),
        row("return period of 1 year",
            edit("lining = true", "lining = true\nreturn_period_years = 1.0"),
            "stage[0].return_period_years = 1: must be > 1 year (EN 1991-1-4 (4.2) uses p = 1 / return period, which must be below 1)"),
        row("stage log decrement below the floor",
            edit("lining = true", "lining = true\nlog_decrement = 0.0001"),
            "stage[0].log_decrement = 0.0001: must be at least 0.001 (below any structure's measured damping; a smaller value gives an infinite amplitude)"),
        row("stage duration of centuries",
            edit("lining = true", "lining = true\nduration_years = 5000.0"),
            "stage[0].duration_years = 5000: must be at most 1000 years, the longest design life accepted"),
        row("return period of a million years",
            edit("lining = true", "lining = true\nreturn_period_years = 1e6"),
            "stage[0].return_period_years = 1e6: must be at most 10000 years (far above the return periods of wind design; common practice)"),
        row("c_prob not positive",
            edit("lining = true", "lining = true\nreturn_period_years = 1.01")
                .replacen("reference_speed_m_s = 25.0", "reference_speed_m_s = 25.0\nc_prob_k = 1.0", 1),
            "stage[0].return_period_years = 1.01: gives c_prob = nan with wind.c_prob_k = 1 and wind.c_prob_n = 0.5 (EN 1991-1-4 (4.2)); it must be finite and > 0"),
        row("stage log decrement above 1",
            edit("lining = true", "lining = true\nlog_decrement = 1.5"),
            "stage[0].log_decrement = 1.5: must be between 0 and 1 (exclusive)"),
        row("negative c_prob K",
            edit("reference_speed_m_s = 25.0", "reference_speed_m_s = 25.0\nc_prob_k = -0.2"),
            "wind.c_prob_k = -0.2: must be > 0"),
        row("unknown stage in point_mass.stages",
            edit("label = \"platform\"", "label = \"platform\"\nstages = [\"lined\", \"shell\"]"),
            "point_mass[0].stages[1] = \"shell\": no stage of that name (stages: \"lined\")"),
        row("empty point_mass.stages",
            edit("label = \"platform\"", "label = \"platform\"\nstages = []"),
            "point_mass[0].stages: empty: name at least one stage, or leave stages out for every stage"),
        row("point mass above the top of a stage it is in",
            edit("lining = true", "lining = true\ntop_z_m = 80.0"),
            "point_mass[0].z_m = 90: above the top of stage \"lined\" (80 m), where the mass is present; give point_mass[0].stages = [...] naming only the stages that carry it"),
        Row { name: "CSV file missing", case: base_with_csv().into_bytes(), csv: None,
            expected: "{dir}/case.toml: cannot read the stations CSV {dir}/stations.csv (stations_csv = \"stations.csv\", relative to the case file's folder): No such file or directory (os error 2)".into() },
    ]
}

/// Runs `stackwake modes` on the row's files; returns (exit code, stderr, folder).
fn run_row(case: &[u8], csv: Option<&[u8]>) -> (Option<i32>, String, tempfile::TempDir) {
    let dir = tempfile::tempdir().expect("temp dir");
    std::fs::write(dir.path().join("case.toml"), case).expect("write case");
    if let Some(csv) = csv {
        std::fs::write(dir.path().join("stations.csv"), csv).expect("write csv");
    }
    let out = stackwake()
        .current_dir(dir.path())
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
fn base_case_runs() {
    let (code, stderr, dir) = run_row(BASE.as_bytes(), None);
    assert_eq!(code, Some(0), "{stderr}");
    assert!(dir.path().join("out/modes.csv").is_file());
    let (code, stderr, good) = run_row(base_with_csv().as_bytes(), Some(GOOD_CSV.as_bytes()));
    assert_eq!(code, Some(0), "{stderr}");
    // A spreadsheet export with `;` and decimal commas, headers with units in brackets.
    let european = "z (m);outer diameter (m);wall (m)\n0;12;0,4\n50;10;0,3\n100;8;0,2\n";
    let (code, stderr, dir) = run_row(base_with_csv().as_bytes(), Some(european.as_bytes()));
    assert_eq!(code, Some(0), "{stderr}");
    // The same stations, so the same modes to the last digit.
    let modes = |d: &tempfile::TempDir| std::fs::read(d.path().join("out/modes.csv")).unwrap();
    assert_eq!(modes(&dir), modes(&good));
}

#[test]
fn hostile_cases_exit_2_with_the_exact_message() {
    let rows = rows();
    assert!(rows.len() >= 30, "only {} rows", rows.len());
    let mut failures = Vec::new();
    for r in &rows {
        let (code, stderr, dir) = run_row(&r.case, r.csv.as_deref());
        let expected = r
            .expected
            .replace("{dir}", &dir.path().display().to_string());
        let found = stderr
            .lines()
            .map(|l| l.trim().trim_start_matches("error: "))
            .any(|l| l == expected);
        let panicked = stderr.contains("internal error") || stderr.contains("panicked");
        let wrote = dir.path().join("out").exists()
            || std::fs::read_dir(dir.path()).expect("list").any(|e| {
                e.expect("entry")
                    .file_name()
                    .to_string_lossy()
                    .contains("partial")
            });
        if code != Some(2) || !found || panicked || wrote {
            failures.push(format!(
                "{}: exit {code:?}, output written: {wrote}\n  expected line: {expected}\n  stderr: {stderr}",
                r.name
            ));
        }
    }
    assert!(failures.is_empty(), "{}", failures.join("\n"));
}

#[test]
fn fifty_megabyte_case_file_is_refused_by_size_quickly() {
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("huge.toml");
    let line = "# padding padding padding padding padding padding padding padding padding\n";
    let mut text = String::with_capacity(50 * 1024 * 1024 + line.len());
    while text.len() < 50 * 1024 * 1024 {
        text.push_str(line);
    }
    std::fs::write(&path, &text).expect("write 50 MB");
    let start = Instant::now();
    let out = stackwake()
        .args(["modes"])
        .arg(&path)
        .arg("--out")
        .arg(dir.path().join("out"))
        .timeout(Duration::from_secs(60))
        .output()
        .expect("run");
    let stderr = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(2), "{stderr}");
    assert_eq!(
        stderr.trim(),
        format!(
            "error: {} is 50 MB; a case file is at most 10 MB",
            path.display()
        )
    );
    assert!(!dir.path().join("out").exists());
    // Refused from the file size, not after parsing 50 MB; generous bound for a loaded
    // machine, this is not a speed target.
    assert!(
        start.elapsed() < Duration::from_secs(20),
        "{:?}",
        start.elapsed()
    );
}

#[test]
fn oversized_stations_csv_is_refused() {
    let mut csv = String::from(GOOD_CSV);
    while csv.len() < 11 * 1024 * 1024 {
        csv.push_str("# padding padding padding padding padding padding padding padding\n");
    }
    let (code, stderr, _dir) = run_row(base_with_csv().as_bytes(), Some(csv.as_bytes()));
    assert_eq!(code, Some(2), "{stderr}");
    assert!(
        stderr.contains(
            "stations.csv (stations_csv = \"stations.csv\", relative to the case file's folder) \
             is 11.0 MB; a stations CSV is at most 10 MB"
        ),
        "{stderr}"
    );
}

#[test]
fn every_problem_is_listed_at_once() {
    let text = edit("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = -32.0")
        .replacen("wall_m = 0.30", "wall_m = 5.5", 1)
        .replacen("mass_kg = 10000.0", "mass_kg = 0.0", 1);
    let (code, stderr, dir) = run_row(text.as_bytes(), None);
    assert_eq!(code, Some(2));
    let expected = format!(
        "error: {}/case.toml: 3 problems:\n  shell.elastic_modulus_gpa = -32: must be > 0\n  \
         shell.stations[1].wall_m = 5.5: wall must be less than half the outer diameter (10 m / 2)\n  \
         point_mass[0].mass_kg = 0: must be > 0\n",
        dir.path().display()
    );
    assert_eq!(stderr, expected);
}

#[test]
fn bom_and_crlf_case_and_csv_load_and_run() {
    let case = format!("\u{feff}{}", base_with_csv().replace('\n', "\r\n"));
    let csv = format!("\u{feff}{}", GOOD_CSV.replace('\n', "\r\n"));
    let (code, stderr, dir) = run_row(case.as_bytes(), Some(csv.as_bytes()));
    assert_eq!(code, Some(0), "{stderr}");
    let plain = run_row(BASE.as_bytes(), None);
    assert_eq!(plain.0, Some(0));
    // Same stations, same answer.
    assert_eq!(
        std::fs::read(dir.path().join("out/modes.csv")).expect("modes.csv"),
        std::fs::read(plain.2.path().join("out/modes.csv")).expect("modes.csv")
    );
}

#[test]
fn bad_command_line_values_exit_2() {
    for (args, expected) in [
        (
            vec!["--modes", "0"],
            "error: --modes = 0: must be between 1 and 20",
        ),
        (
            vec!["--modes", "21"],
            "error: --modes = 21: must be between 1 and 20",
        ),
        (
            vec!["--elements", "0"],
            "error: --elements = 0: must be between 1 and 20000",
        ),
        (
            vec!["--elements", "20001"],
            "error: --elements = 20001: must be between 1 and 20000",
        ),
    ] {
        let dir = tempfile::tempdir().expect("temp dir");
        let out = stackwake()
            .arg("modes")
            .args(&args)
            .arg("--out")
            .arg(dir.path().join("out"))
            .output()
            .expect("run");
        assert_eq!(out.status.code(), Some(2), "{args:?}");
        assert_eq!(String::from_utf8_lossy(&out.stderr).trim(), expected);
        assert!(!dir.path().join("out").exists());
    }
    let out = stackwake()
        .args(["modes", "--modes", "x"])
        .output()
        .expect("run");
    assert_eq!(out.status.code(), Some(2));
}

#[test]
fn missing_case_file_names_the_path() {
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("absent.toml");
    let out = stackwake()
        .arg("modes")
        .arg(&path)
        .arg("--out")
        .arg(dir.path().join("out"))
        .output()
        .expect("run");
    assert_eq!(out.status.code(), Some(2));
    let stderr = String::from_utf8_lossy(&out.stderr);
    assert!(
        stderr.starts_with(&format!("error: cannot read {}: ", path.display())),
        "{stderr}"
    );
    assert!(Path::new(&path).parent().is_some());
}

#[test]
fn an_absurdly_soft_foundation_is_refused_by_name_and_writes_nothing() {
    // Valid input, absurd foundation (1 N m/rad, 1 N/m under a 150 m stack): the rocking
    // mode lies ~ten decades below the bending modes, where the eigen-solver used to give up
    // with "lost its basis" only. Validation now refuses both springs by name, with the
    // bound relative to the shell's own base stiffness.
    let case = "title = \"Invented: absurdly soft foundation\"\n[shell]\nelastic_modulus_gpa = 32.0\n\
                density_kg_m3 = 2500.0\nstations = [\n  { z_m = 0.0, outer_diameter_m = 10.0, wall_m = 0.35 },\n  \
                { z_m = 150.0, outer_diameter_m = 10.0, wall_m = 0.35 },\n]\n[base]\n\
                rotational_stiffness_gnm_per_rad = 1e-9\nlateral_stiffness_mn_per_m = 1e-6\n\
                [wind]\nreference_speed_m_s = 25.0\n";
    let (code, stderr, dir) = run_row(case.as_bytes(), None);
    assert_eq!(code, Some(2), "{stderr}");
    for key in [
        "base.rotational_stiffness_gnm_per_rad = 1e-9: is",
        "base.lateral_stiffness_mn_per_m = 1e-6: is",
    ] {
        assert!(stderr.contains(key), "{stderr}");
    }
    assert!(
        stderr.contains("must be between 0.0001 and 1e14 times"),
        "{stderr}"
    );
    assert!(!stderr.contains("eigen-solver"), "{stderr}");
    assert!(!stderr.contains("internal error"), "{stderr}");
    assert!(!dir.path().join("out").exists());
}
