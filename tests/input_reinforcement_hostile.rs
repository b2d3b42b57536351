//! Hostile and edge inputs of `[reinforcement]`, `[[reinforcement.zone]]`, `[shell]
//! characteristic_strength_mpa` and `[design]`: every bad value is an error naming its
//! field (`path = value: rule`), never a panic. Limits: EN 1992-1-1 Table 3.1 (f_ck 12-90 MPa,
//! public copy), 3.2.2 (f_yk 400-600 MPa, memory), 9.5.2 (3) (ratio <= 0.08, memory), 3.1.6
//! (alpha_cc 0.8-1.0, public copy); covers inside the wall (geometry); the fatigue factors
//! gamma_f_fat, gamma_s_fat 1.0-2.0 (recommended 1.0 / 1.15, EN 1992-1-1 6.8.4 (1) note and
//! Table 2.1N; the 2.0 ceiling is common practice).

use std::path::Path;

use stackwake::input::{parse_case, InputError};

const BASE: &str = r#"
title = "Invented test stack"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
characteristic_strength_mpa = 40.0
stations = [
  { z_m = 0.0,   outer_diameter_m = 12.0, wall_m = 0.40 },
  { z_m = 100.0, outer_diameter_m = 8.0,  wall_m = 0.20 },
]
[wind]
reference_speed_m_s = 25.0
[reinforcement]
characteristic_strength_mpa = 500.0
[[reinforcement.zone]]
from_z_m = 0.0
to_z_m = 40.0
outer_ratio = 0.004
inner_ratio = 0.002
outer_cover_m = 0.05
inner_cover_m = 0.05
[[reinforcement.zone]]
from_z_m = 40.0
to_z_m = 100.0
outer_ratio = 0.0025
inner_ratio = 0.0015
outer_cover_m = 0.05
inner_cover_m = 0.05
"#;

fn errors(text: &str) -> Vec<String> {
    match parse_case(text, Path::new("."), "t.toml") {
        Ok(_) => vec![],
        Err(InputError::Invalid { issues, .. }) => issues.iter().map(|i| i.to_string()).collect(),
        Err(other) => vec![other.to_string()],
    }
}

fn with(from: &str, to: &str) -> String {
    assert!(BASE.contains(from), "{from}");
    BASE.replacen(from, to, 1)
}

fn expect(text: &str, needle: &str) {
    let e = errors(text);
    assert!(
        e.iter().any(|m| m.contains(needle)),
        "{needle} not in {e:?}"
    );
}

#[test]
fn valid_case_reads_with_recommended_factors() {
    let case = parse_case(BASE, Path::new("."), "t.toml").unwrap();
    let r = case.resistance.expect("resistance spec");
    assert_eq!(r.concrete_strength_pa, 40e6);
    assert_eq!(r.steel_modulus_pa, 200e9);
    assert_eq!(r.zones.len(), 2);
    assert_eq!(r.factors.gamma_c, 1.5);
    assert_eq!(r.factors.gamma_g_sup, 1.35);
    assert_eq!(r.zone_at(40.0).outer_ratio, 0.004);
    assert_eq!(r.zone_at(40.1).outer_ratio, 0.0025);
}

#[test]
fn without_reinforcement_there_is_no_spec() {
    let text = BASE.split("[reinforcement]").next().unwrap().to_string();
    let case = parse_case(&text, Path::new("."), "t.toml").unwrap();
    assert!(case.resistance.is_none());
}

#[test]
fn ratio_negative_or_above_8_percent() {
    expect(
        &with("outer_ratio = 0.004", "outer_ratio = -0.001"),
        "reinforcement.zone[0].outer_ratio = -0.001: must be 0 to 0.08",
    );
    expect(
        &with("inner_ratio = 0.0015", "inner_ratio = 0.09"),
        "reinforcement.zone[1].inner_ratio = 0.09: must be 0 to 0.08",
    );
}

#[test]
fn cover_larger_than_the_wall() {
    expect(
        &with("to_z_m = 100.0\nouter_ratio = 0.0025\ninner_ratio = 0.0015\nouter_cover_m = 0.05",
              "to_z_m = 100.0\nouter_ratio = 0.0025\ninner_ratio = 0.0015\nouter_cover_m = 0.18"),
        "reinforcement.zone[1].outer_cover_m = 0.18: outer + inner cover (0.23 m) must be less than the wall (0.2 m at z = 100 m)",
    );
    expect(
        &with("inner_cover_m = 0.05", "inner_cover_m = 0.0"),
        "reinforcement.zone[0].inner_cover_m = 0: must be > 0",
    );
}

#[test]
fn concrete_strength_outside_12_to_90() {
    for v in ["11.0", "95.0", "nan", "-40.0"] {
        let e = errors(&with(
            "characteristic_strength_mpa = 40.0",
            &format!("characteristic_strength_mpa = {v}"),
        ));
        assert!(
            e.iter()
                .any(|m| m.starts_with("shell.characteristic_strength_mpa")),
            "{v}: {e:?}"
        );
    }
    expect(
        &with("characteristic_strength_mpa = 40.0\n", ""),
        "shell.characteristic_strength_mpa: missing",
    );
}

#[test]
fn steel_strength_modulus_and_zone_coverage() {
    expect(
        &with(
            "characteristic_strength_mpa = 500.0",
            "characteristic_strength_mpa = 250.0",
        ),
        "reinforcement.characteristic_strength_mpa = 250: must be 400 to 600 MPa",
    );
    expect(
        &with(
            "[reinforcement]\n",
            "[reinforcement]\nelastic_modulus_gpa = 0.0\n",
        ),
        "reinforcement.elastic_modulus_gpa = 0: must be 150 to 250 GPa",
    );
    expect(
        &with("to_z_m = 40.0", "to_z_m = 30.0"),
        "leave 30 to 40 m without reinforcement",
    );
    expect(
        &with("to_z_m = 40.0", "to_z_m = 50.0"),
        "zones overlap between 40 and 50 m",
    );
    expect(
        &with("to_z_m = 100.0", "to_z_m = 90.0"),
        "the zones end at 90 m",
    );
    expect(
        &with(
            "outer_ratio = 0.004\ninner_ratio = 0.002",
            "outer_ratio = 0.0\ninner_ratio = 0.0",
        ),
        "a zone needs steel",
    );
    expect(
        &with("outer_cover_m = 0.05", "outer_cover_m = 0.05\nbar_size = 3"),
        "bar_size",
    );
}

#[test]
fn design_factors() {
    let d = |body: &str| format!("{BASE}[design]\n{body}\n");
    expect(
        &d("gamma_c = 0.5"),
        "design.gamma_c = 0.5: must be between 1 and 2",
    );
    expect(
        &d("alpha_cc = 0.7"),
        "design.alpha_cc = 0.7: must be between 0.8 and 1",
    );
    expect(
        &d("gamma_g_inf = 1.0\ngamma_g_sup = 1.0\ngamma_q = 9.0"),
        "design.gamma_q = 9",
    );
    expect(
        &d("gamma_g_inf = 1.0\ngamma_g_sup = 1.0\ngamma_s = inf"),
        "design.gamma_s = inf",
    );
    // Fatigue factors (EN 1992-1-1 6.8.4 (1) note and Table 2.1N; 1.0-2.0, see design.rs).
    expect(
        &d("gamma_f_fat = 0.9"),
        "design.gamma_f_fat = 0.9: must be between 1 and 2",
    );
    expect(
        &d("gamma_s_fat = 2.5"),
        "design.gamma_s_fat = 2.5: must be between 1 and 2",
    );
    expect(
        &d("gamma_s_fat = nan"),
        "design.gamma_s_fat = nan: must be a finite number",
    );
    expect(&d("gamma_f_fat = -inf"), "design.gamma_f_fat = -inf");
    expect(&d("gamma_fat = 1.1"), "gamma_fat");
    let c = parse_case(&d("gamma_c = 1.2\ngamma_q = 1.0"), Path::new("."), "t.toml").unwrap();
    let f = c.resistance.unwrap().factors;
    assert_eq!((f.gamma_c, f.gamma_q, f.gamma_s), (1.2, 1.0, 1.15));
}
