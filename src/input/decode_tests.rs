//! Unit tests of the case-file decoder (`super`): field paths and messages of type errors.

use super::*;

fn decode(text: &str) -> Result<RawCase, Vec<String>> {
    let table: Table = toml::from_str(text).expect("test TOML is well formed");
    decode_case(table).map_err(|v| v.iter().map(|i| i.to_string()).collect())
}

const MINIMAL: &str = r#"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
stations = [{ z_m = 0, outer_diameter_m = 10.0, wall_m = 0.4 },
        { z_m = 100, outer_diameter_m = 8.0, wall_m = 0.3 }]
[wind]
reference_speed_m_s = 25.0
"#;

#[test]
fn minimal_case_decodes_and_integers_are_accepted_as_numbers() {
    let raw = decode(MINIMAL).expect("minimal case decodes");
    let stations = raw.shell.stations.expect("inline stations");
    assert_eq!(stations.len(), 2);
    assert_eq!(stations[1].z_m, 100.0);
    assert!(raw.stage.is_none());
    assert_eq!(raw.vortex, Default::default());
}

#[test]
fn unknown_keys_are_all_reported_with_paths_and_suggestions() {
    let text = MINIMAL
        .replace(
            "density_kg_m3 = 2500.0",
            "density_kg_m3 = 2500.0\ndensty = 1\ncolour = 2",
        )
        .replace("wall_m = 0.3", "wall_m = 0.3, wal_m = 1");
    let errs = decode(&text).unwrap_err();
    assert!(
        errs.contains(&"shell.densty: unknown key; did you mean density_kg_m3?".into()),
        "{errs:?}"
    );
    assert!(
        errs.iter()
            .any(|e| e.starts_with("shell.colour: unknown key; valid keys here:")),
        "{errs:?}"
    );
    assert!(
        errs.contains(&"shell.stations[1].wal_m: unknown key; did you mean wall_m?".into()),
        "{errs:?}"
    );
    assert_eq!(errs.len(), 3, "{errs:?}");
}

#[test]
fn wrong_types_name_field_and_expected_type() {
    let text = MINIMAL.replace("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = \"32\"");
    let errs = decode(&text).unwrap_err();
    assert_eq!(
        errs,
        vec![
            r#"shell.elastic_modulus_gpa = "32": expected a number, found a string "32""#
                .to_string()
        ]
    );
}

#[test]
fn unknown_choice_suggests_nearest() {
    let text = format!("{MINIMAL}\n[vortex]\nmethod = \"en1991-e3\"\n");
    let errs = decode(&text).unwrap_err();
    assert_eq!(errs.len(), 1);
    assert!(
        errs[0].starts_with(
            r#"vortex.method = "en1991-e3": unknown choice; did you mean "en1991-e1"?"#
        ),
        "{errs:?}"
    );
}

#[test]
fn missing_sections_and_keys() {
    let errs = decode("title = \"x\"\n").unwrap_err();
    assert_eq!(errs.len(), 1);
    assert!(errs[0].starts_with("shell: missing section [shell]"));
    let text = MINIMAL.replace("reference_speed_m_s = 25.0", "");
    let errs = decode(&text).unwrap_err();
    assert_eq!(
        errs,
        vec!["wind.reference_speed_m_s: missing; this key is required".to_string()]
    );
}

#[test]
fn single_bracket_array_section_gets_a_hint() {
    let text = format!("{MINIMAL}\n[lining]\nfrom_z_m = 0\nto_z_m = 10\n");
    let errs = decode(&text).unwrap_err();
    assert_eq!(errs.len(), 1);
    assert!(
        errs[0].contains("write [[lining]] with double brackets"),
        "{errs:?}"
    );
}

#[test]
fn nested_group_path() {
    let text = format!("{MINIMAL}\n[vortex.group]\ncount = 3\nspacing = 40.0\n");
    let errs = decode(&text).unwrap_err();
    assert!(
        errs.contains(&"vortex.group.spacing: unknown key; did you mean spacing_m?".into()),
        "{errs:?}"
    );
}

#[test]
fn render_is_one_short_line() {
    let long = Value::String("x".repeat(200));
    assert!(render(&long).chars().count() <= 60);
    assert_eq!(render(&Value::Float(f64::NAN)), "nan");
}

/// The case-file example of the design contract, key for key.
const CONTRACT_EXAMPLE: &str = r#"
title = "Invented example: 180 m flue stack, coastal plant"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
poisson_ratio = 0.2
beam = "timoshenko"
stations = [
  { z_m = 0.0,   outer_diameter_m = 16.0, wall_m = 0.55 },
  { z_m = 60.0,  outer_diameter_m = 13.0, wall_m = 0.40 },
  { z_m = 180.0, outer_diameter_m = 9.0,  wall_m = 0.22 },
]
[[lining]]
from_z_m = 8.0
to_z_m = 180.0
mass_per_length_kg_m = 5200.0
[[point_mass]]
z_m = 150.0
mass_kg = 30000.0
label = "platform 3"
[base]
rotational_stiffness_gnm_per_rad = 800.0
lateral_stiffness_mn_per_m = 5000.0
[[stage]]
name = "shell only"
lining = false
stiffness_factor = 0.8
top_z_m = 120.0
[wind]
reference_speed_m_s = 38.0
reference_height_m = 10.0
profile = "power"
exponent = 0.16
air_density_kg_m3 = 1.25
kinematic_viscosity_m2_s = 1.5e-5
[vortex]
method = "en1991-e1"
strouhal = 0.18
log_decrement = 0.03
modes = 3
design_life_years = 50
[vortex.group]
count = 3
spacing_m = 40.0
arrangement = "in-line"
"#;

#[test]
fn path_aware_decoding_equals_plain_serde_on_valid_files() {
    for text in [CONTRACT_EXAMPLE, crate::input::DEMO_CASE_TOML, MINIMAL] {
        let plain: RawCase = toml::from_str(text).expect("plain serde accepts the file");
        let table: Table = toml::from_str(text).expect("well formed");
        assert_eq!(decode_case(table).expect("decodes"), plain);
    }
}
