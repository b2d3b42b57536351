//! Hostile case files: every one must be refused with a message that names the field, the
//! value and the rule (or loads fine where the oddity is harmless: BOM, CRLF), and nothing
//! may panic. The expected messages are our own contract (common practice for input
//! validation: path = value: rule), not an outside reference.

use std::path::Path;

use proptest::prelude::*;
use stackwake::input::{load_case, parse_case, InputError, DEMO_CASE_TOML};

/// A small valid case (invented numbers); each hostile case edits one piece of it.
const BASE: &str = r#"title = "Invented hostile-input base case"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
stations = [
  { z_m = 0.0,   outer_diameter_m = 12.0, wall_m = 0.40 },
  { z_m = 50.0,  outer_diameter_m = 10.0, wall_m = 0.30 },
  { z_m = 100.0, outer_diameter_m = 1.6,  wall_m = 0.20 },
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

fn edit(from: &str, to: &str) -> String {
    assert!(BASE.contains(from), "edit target not in BASE: {from}");
    BASE.replacen(from, to, 1)
}

fn message(text: &str) -> String {
    match parse_case(text, Path::new("."), "hostile.toml") {
        Ok(_) => "<accepted>".to_string(),
        Err(e) => e.to_string(),
    }
}

#[test]
fn base_case_is_valid() {
    parse_case(BASE, Path::new("."), "base.toml").expect("BASE is a valid case");
}

#[test]
fn hostile_inputs_are_refused_with_exact_messages() {
    let cases: Vec<(&str, String, &str)> = vec![
        ("NaN modulus", edit("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = nan"),
         "shell.elastic_modulus_gpa = nan: must be a finite number"),
        ("infinite wall", edit("wall_m = 0.30", "wall_m = inf"),
         "shell.stations[1].wall_m = inf: must be a finite number"),
        ("-inf height", edit("z_m = 50.0", "z_m = -inf"),
         "shell.stations[1].z_m = -inf: must be a finite number"),
        ("negative diameter", edit("outer_diameter_m = 10.0", "outer_diameter_m = -10.0"),
         "shell.stations[1].outer_diameter_m = -10: must be > 0"),
        ("zero wall", edit("wall_m = 0.40", "wall_m = 0.0"),
         "shell.stations[0].wall_m = 0: must be > 0"),
        ("zero density", edit("density_kg_m3 = 2500.0", "density_kg_m3 = 0.0"),
         "shell.density_kg_m3 = 0: must be > 0"),
        ("wall over radius", edit("wall_m = 0.20", "wall_m = 0.9"),
         "shell.stations[2].wall_m = 0.9: wall must be less than half the outer diameter (1.6 m / 2)"),
        ("wall equal to radius", edit("wall_m = 0.20", "wall_m = 0.8"),
         "shell.stations[2].wall_m = 0.8: wall must be less than half the outer diameter (1.6 m / 2)"),
        ("stations out of order", edit("z_m = 50.0", "z_m = 150.0"),
         "shell.stations[2].z_m = 100: must be above the previous station (150 m); list stations from the base upward"),
        ("duplicated station", edit("z_m = 50.0", "z_m = 0.0"),
         "shell.stations[1].z_m = 0: a wall step at the base (z = 0) has no shell below it; give one station at z = 0"),
        ("first station not at 0", edit("z_m = 0.0", "z_m = 3.0"),
         "shell.stations[0].z_m = 3: the first station must be at z = 0 (top of the foundation)"),
        ("lining above the shell", edit("to_z_m = 100.0", "to_z_m = 130.0"),
         "lining[0].to_z_m = 130: above the top of the shell (100 m)"),
        ("lining below the base", edit("from_z_m = 5.0", "from_z_m = -5.0"),
         "lining[0].from_z_m = -5: below the base of the shell (z = 0)"),
        ("lining reversed", edit("from_z_m = 5.0", "from_z_m = 100.0").replacen("to_z_m = 100.0", "to_z_m = 5.0", 1),
         "lining[0].to_z_m = 5: must be above from_z_m (100 m)"),
        ("two lining forms", edit("mass_per_length_kg_m = 3000.0", "mass_per_length_kg_m = 3000.0\nthickness_m = 0.1\ndensity_kg_m3 = 1900.0"),
         "lining[0]: mass_per_length_kg_m and layer (thickness_m, density_kg_m3) given together; give exactly one mass form"),
        ("point mass above the top", edit("z_m = 90.0", "z_m = 100.5"),
         "point_mass[0].z_m = 100.5: outside the shell (0 to 100 m)"),
        ("point mass below the base", edit("z_m = 90.0", "z_m = -1.0"),
         "point_mass[0].z_m = -1: outside the shell (0 to 100 m)"),
        ("stage top below 0", edit("lining = true", "lining = true\ntop_z_m = -10.0"),
         "stage[0].top_z_m = -10: must be above the base (> 0)"),
        ("stage top above H", edit("lining = true", "lining = true\ntop_z_m = 110.0"),
         "stage[0].top_z_m = 110: above the top of the shell (100 m)"),
        ("unknown key with suggestion", edit("elastic_modulus_gpa = 32.0", "elastic_modulus_gp = 32.0"),
         "shell.elastic_modulus_gp: unknown key; did you mean elastic_modulus_gpa?"),
        ("unknown key in a station", edit("wall_m = 0.30", "wal_m = 0.30"),
         "shell.stations[1].wal_m: unknown key; did you mean wall_m?"),
        ("unknown top-level section", edit("[wind]", "[wnd]"),
         "wnd: unknown key; did you mean wind?"),
        ("unknown key in an array entry", edit("label = \"platform\"", "lable = \"platform\""),
         "point_mass[0].lable: unknown key; did you mean label?"),
        ("string for a number", edit("mass_kg = 10000.0", "mass_kg = \"10 t\""),
         "point_mass[0].mass_kg = \"10 t\": expected a number, found a string \"10 t\""),
        ("number for a boolean", edit("lining = true", "lining = 1"),
         "stage[0].lining = 1: expected true or false, found the number 1"),
        ("fractional modes", format!("{BASE}[vortex]\nmodes = 2.5\n"),
         "vortex.modes = 2.5: expected a whole number, found the number 2.5"),
        ("unknown method", format!("{BASE}[vortex]\nmethod = \"en1991-e4\"\n"),
         "vortex.method = \"en1991-e4\": unknown choice; did you mean \"en1991-e1\"?"),
        ("E in Pa", edit("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = 3.2e10"),
         "shell.elastic_modulus_gpa = 32000000000: looks like Pa or MPa; give E in GPa (e.g. 32.0)"),
        ("E in MPa", edit("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = 32000.0"),
         "shell.elastic_modulus_gpa = 32000: looks like Pa or MPa; give E in GPa (e.g. 32.0)"),
        ("diameters in mm", edit("outer_diameter_m = 12.0, wall_m = 0.40", "outer_diameter_m = 12000.0, wall_m = 400.0"),
         "shell.stations[0].outer_diameter_m = 12000: over 200 m: are the sizes in mm? give metres"),
        ("empty file", String::new(),
         "hostile.toml is empty"),
        ("whitespace and comments only", "  \n# nothing here\n\n".to_string(),
         "hostile.toml is empty"),
        ("TOML syntax error", edit("density_kg_m3 = 2500.0", "density_kg_m3 = = 2500.0"),
         "hostile.toml, line 4, column 17: TOML syntax error"),
        ("misspelt stations", edit("stations = [", "station = ["),
         "shell.station: unknown key; did you mean stations?"),
        ("missing stations", BASE.replacen(&BASE[BASE.find("stations = [").unwrap_or(0)..BASE.find("]\n[[lining]]").map(|i| i + 2).unwrap_or(0)], "", 1),
         "shell.stations: missing; give stations = [{ z_m = ..., outer_diameter_m = ..., wall_m = ... }, ...] or stations_csv = \"file.csv\""),
        ("no stages", format!("stage = []\n{}", BASE.replace("[[stage]]\nname = \"lined\"\nlining = true\n", "")),
         "stage: no stages given"),
        ("duplicate stage names", edit("lining = true", "lining = true\n[[stage]]\nname = \"lined\"\nlining = false"),
         "stage[1].name = \"lined\": used by an earlier stage; stage names must be unique"),
        ("single-bracket array section", edit("[[point_mass]]", "[point_mass]"),
         "point_mass: expected an array of tables; write [[point_mass]] with double brackets for each entry"),
        ("negative group count", format!("{BASE}[vortex.group]\ncount = -3\nspacing_m = 40.0\n"),
         "vortex.group.count = -3: must be at least 2 (the stack and one neighbour)"),
        ("stations and csv", edit("density_kg_m3 = 2500.0", "density_kg_m3 = 2500.0\nstations_csv = \"s.csv\""),
         "shell: stations and stations_csv given together; give only one"),
    ];
    assert!(cases.len() >= 30);
    let mut failures = Vec::new();
    for (name, text, expected) in &cases {
        let got = message(text);
        if !got.contains(expected) {
            failures.push(format!(
                "{name}:\n  expected: {expected}\n  got:      {got}"
            ));
        }
    }
    assert!(failures.is_empty(), "{}", failures.join("\n"));
}

#[test]
fn oversized_input_is_refused_before_parsing() {
    let big = "#".repeat(11 * 1024 * 1024);
    let err = parse_case(&big, Path::new("."), "big.toml").unwrap_err();
    assert!(matches!(err, InputError::TooLarge { .. }));
    assert_eq!(
        err.to_string(),
        "big.toml is 11.0 MB; a case file is at most 10 MB"
    );

    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("huge.toml");
    std::fs::write(&path, "#".repeat(52 * 1024 * 1024)).expect("write");
    let err = load_case(&path).unwrap_err();
    assert!(
        err.to_string()
            .ends_with("is 52 MB; a case file is at most 10 MB"),
        "{err}"
    );
}

#[test]
fn all_errors_are_collected() {
    let text = edit("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = -32.0")
        .replacen("wall_m = 0.30", "wall_m = 5.5", 1)
        .replacen("mass_kg = 10000.0", "mass_kg = 0.0", 1);
    let err = parse_case(&text, Path::new("."), "three.toml").unwrap_err();
    let shown = err.to_string();
    let lines: Vec<&str> = shown.lines().collect();
    assert_eq!(lines[0], "three.toml: 3 problems:");
    assert_eq!(
        &lines[1..],
        &[
            "  shell.elastic_modulus_gpa = -32: must be > 0",
            "  shell.stations[1].wall_m = 5.5: wall must be less than half the outer diameter (10 m / 2)",
            "  point_mass[0].mass_kg = 0: must be > 0",
        ]
    );
    assert_eq!(err.issues().len(), 3);
}

#[test]
fn unknown_keys_and_wrong_types_are_collected_together() {
    let text = edit(
        "elastic_modulus_gpa = 32.0",
        "elastic_modulus_gp = 32.0\nelastic_modulus_gpa = 32.0",
    )
    .replacen("mass_kg = 10000.0", "mass_kg = true", 1)
    .replacen("[wind]", "[wind]\nspeed = 3", 1);
    let err = parse_case(&text, Path::new("."), "t.toml").unwrap_err();
    assert_eq!(err.issues().len(), 3, "{err}");
}

/// Writes a case using `stations_csv` and the CSV beside it, then loads the case.
fn load_with_csv(csv: &[u8]) -> Result<stackwake::case::Case, InputError> {
    let dir = tempfile::tempdir().expect("temp dir");
    let case = BASE.replacen(
        "stations = [\n  { z_m = 0.0,   outer_diameter_m = 12.0, wall_m = 0.40 },\n  { z_m = 50.0,  outer_diameter_m = 10.0, wall_m = 0.30 },\n  { z_m = 100.0, outer_diameter_m = 1.6,  wall_m = 0.20 },\n]",
        "stations_csv = \"stations.csv\"",
        1,
    );
    assert!(case.contains("stations_csv"));
    std::fs::write(dir.path().join("case.toml"), case).expect("write case");
    std::fs::write(dir.path().join("stations.csv"), csv).expect("write csv");
    load_case(&dir.path().join("case.toml"))
}

#[test]
fn csv_with_bom_and_crlf_loads() {
    let csv =
        b"\xEF\xBB\xBFz_m,outer_diameter_m,wall_m\r\n0,12,0.4\r\n\r\n50,10,0.3\r\n100,8,0.2\r\n";
    let case = load_with_csv(csv).expect("BOM + CRLF CSV loads");
    assert_eq!(case.shell.stations.len(), 3);
    assert_eq!(case.shell.stations[2].outer_diameter_m, 8.0);
}

#[test]
fn csv_columns_in_any_order_with_spaces_load() {
    let csv = b"wall_m , z_m , outer_diameter_m\n 0.4 , 0 , 12 \n0.3,50,10\n0.2,100,8\n";
    let case = load_with_csv(csv).expect("reordered CSV loads");
    assert_eq!(case.shell.stations[1].wall_m, 0.3);
}

#[test]
fn csv_comma_decimals_are_read_after_semicolons_and_explained_after_tabs() {
    // The `;` leaves the comma nothing to be but the decimal mark.
    let csv = b"z_m;outer_diameter_m;wall_m\n0;12;0.4\n50;10;0,45\n100;8;0.2\n";
    let case = load_with_csv(csv).expect("semicolon CSV with a decimal comma loads");
    assert_eq!(case.shell.stations[1].wall_m, 0.45);
    // After tabs a comma may also mark thousands: refused.
    let csv = b"z_m\touter_diameter_m\twall_m\n0\t12\t0.4\n50\t10\t0,45\n100\t8\t0.2\n";
    let err = load_with_csv(csv).unwrap_err().to_string();
    assert!(
        err.contains(r#"stations.csv line 3, column wall_m = "0,45": not a number; use a point as the decimal separator"#),
        "{err}"
    );
}

#[test]
fn csv_stray_unit_is_explained() {
    let csv = b"z_m,outer_diameter_m,wall_m\n0,16 m,0.4\n50,10,0.3\n100,8,0.2\n";
    let err = load_with_csv(csv).unwrap_err().to_string();
    assert!(err.contains(r#"stations.csv line 2, column outer_diameter_m = "16 m": not a number; leave out the unit"#), "{err}");
}

#[test]
fn csv_missing_and_extra_columns_are_named() {
    let err = load_with_csv(b"z_m,outer_diameter_m,thickness\n0,12,0.4\n100,8,0.2\n")
        .unwrap_err()
        .to_string();
    assert!(
        err.contains(r#"stations.csv header = "thickness": unknown column"#),
        "{err}"
    );
    assert!(err.contains("stations.csv: missing column wall_m"), "{err}");
}

#[test]
fn csv_station_rules_name_the_line() {
    let err = load_with_csv(b"z_m,outer_diameter_m,wall_m\n0,12,0.4\n50,10,6\n100,8,0.2\n")
        .unwrap_err()
        .to_string();
    assert!(
        err.contains("stations.csv line 3, column wall_m = 6: wall must be less than half the outer diameter (10 m / 2)"),
        "{err}"
    );
}

#[test]
fn csv_problems_are_reported_with_the_case_file_problems() {
    let dir = tempfile::tempdir().expect("temp dir");
    let case = "title = \"Invented\"\n[shell]\nelastic_modulus_gpa = -1.0\ndensity_kg_m3 = 2500.0\nstations_csv = \"s.csv\"\n[wind]\nreference_speed_m_s = 25.0\n";
    std::fs::write(dir.path().join("case.toml"), case).expect("write");
    std::fs::write(
        dir.path().join("s.csv"),
        "z_m,outer_diameter_m,wall_m\n0,12,x\n",
    )
    .expect("write");
    let err = load_case(&dir.path().join("case.toml")).unwrap_err();
    let shown: Vec<String> = err.issues().iter().map(|i| i.to_string()).collect();
    assert_eq!(
        shown,
        vec![
            r#"s.csv line 2, column wall_m = "x": not a number"#.to_string(),
            "shell.elastic_modulus_gpa = -1: must be > 0".to_string(),
        ]
    );
}

#[test]
fn missing_csv_file_is_a_read_error_naming_it() {
    let dir = tempfile::tempdir().expect("temp dir");
    let clean = "[shell]\nelastic_modulus_gpa = 32.0\ndensity_kg_m3 = 2500.0\nstations_csv = \"nope.csv\"\n[wind]\nreference_speed_m_s = 25.0\n";
    std::fs::write(dir.path().join("case.toml"), clean).expect("write");
    let err = load_case(&dir.path().join("case.toml")).unwrap_err();
    assert!(matches!(err, InputError::StationsCsv { .. }), "{err}");
    assert!(err.to_string().contains("nope.csv"), "{err}");
}

#[test]
fn case_file_with_bom_and_crlf_loads() {
    let text = format!("\u{feff}{}", BASE.replace('\n', "\r\n"));
    let case = parse_case(&text, Path::new("."), "crlf.toml").expect("BOM + CRLF case loads");
    assert_eq!(case.shell.stations.len(), 3);
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("crlf.toml");
    std::fs::write(&path, text.as_bytes()).expect("write");
    load_case(&path).expect("BOM + CRLF case file loads from disk");
}

#[test]
fn non_utf8_and_missing_files_are_clear_errors() {
    let dir = tempfile::tempdir().expect("temp dir");
    let path = dir.path().join("latin1.toml");
    std::fs::write(&path, b"title = \"caf\xe9\"\n").expect("write");
    let err = load_case(&path).unwrap_err().to_string();
    assert!(err.contains("is not UTF-8 text"), "{err}");
    let err = load_case(&dir.path().join("absent.toml"))
        .unwrap_err()
        .to_string();
    assert!(err.starts_with("cannot read "), "{err}");
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(256))]

    #[test]
    fn random_text_never_panics(text in "\\PC{0,400}") {
        let _ = parse_case(&text, Path::new("."), "random.toml");
    }

    #[test]
    fn random_toml_like_text_never_panics(text in "[a-z_\\[\\]=\"{},.0-9 \n-]{0,300}") {
        let _ = parse_case(&text, Path::new("."), "random.toml");
    }

    #[test]
    fn mutated_demo_never_panics(
        edits in proptest::collection::vec((any::<prop::sample::Index>(), 0usize..4, "[ -~\n]{0,6}"), 1..6)
    ) {
        let mut text: Vec<char> = DEMO_CASE_TOML.chars().collect();
        for (at, kind, insert) in edits {
            if text.is_empty() { break; }
            let i = at.index(text.len());
            match kind {
                0 => { text.remove(i); }
                1 => { text.splice(i..i, insert.chars()); }
                2 => { let end = (i + insert.len() + 1).min(text.len()); text.drain(i..end); }
                _ => { text.splice(i..(i + 1).min(text.len()), insert.chars()); }
            }
        }
        let text: String = text.into_iter().collect();
        let _ = parse_case(&text, Path::new("."), "mutated.toml");
    }

    #[test]
    fn demo_with_a_random_number_never_panics(value in prop_oneof![
        any::<f64>(), Just(f64::NAN), Just(f64::INFINITY), Just(-0.0), Just(1e308), Just(-1e-308)
    ], slot in 0usize..40) {
        // Replace the slot-th number in the demo with an arbitrary one.
        let mut count = 0;
        let replaced: Vec<String> = DEMO_CASE_TOML
            .split(' ')
            .map(|word| {
                if word.trim_end_matches([',', '\n']).parse::<f64>().is_ok() {
                    count += 1;
                    if count == slot {
                        let tail: String = word.chars().filter(|c| *c == ',' || *c == '\n').collect();
                        let v = if value.is_nan() { "nan".to_string() } else if value.is_infinite() { if value > 0.0 { "inf".into() } else { "-inf".into() } } else { format!("{value:?}") };
                        return format!("{v}{tail}");
                    }
                }
                word.to_string()
            })
            .collect();
        let _ = parse_case(&replaced.join(" "), Path::new("."), "demo-number.toml");
    }
}
