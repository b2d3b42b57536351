//! Unit tests of the case-file rules, one broken rule per test.

use std::path::Path;

use super::*;
use crate::input::{parse_case, InputError};

/// A small valid case; tests replace one line to break one rule.
const BASE: &str = r#"
title = "Invented test stack"
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
[wind]
reference_speed_m_s = 25.0
"#;

fn run(text: &str) -> Result<Case, Vec<String>> {
    match parse_case(text, Path::new("."), "t.toml") {
        Ok(c) => Ok(c),
        Err(InputError::Invalid { issues, .. }) => {
            Err(issues.iter().map(|i| i.to_string()).collect())
        }
        Err(other) => Err(vec![other.to_string()]),
    }
}

fn with(from: &str, to: &str) -> String {
    assert!(BASE.contains(from), "test edit target missing: {from}");
    BASE.replacen(from, to, 1)
}

fn append(extra: &str) -> String {
    format!("{BASE}\n{extra}\n")
}

/// The case must fail with exactly this one message.
fn fails_with(text: &str, expected: &str) {
    match run(text) {
        Ok(_) => panic!("accepted, expected: {expected}"),
        Err(errs) => assert_eq!(errs, vec![expected.to_string()]),
    }
}

#[test]
fn base_case_gets_defaults_and_si_units() {
    let case = run(BASE).expect("base case is valid");
    assert_eq!(case.shell.elastic_modulus_pa, 32.0e9);
    assert_eq!(case.shell.poisson_ratio, 0.2);
    assert_eq!(case.shell.beam, BeamTheory::Timoshenko);
    assert_eq!(case.stages, default_stages(true));
    assert_eq!(case.stages.len(), 2);
    assert_eq!(case.base, None);
    assert_eq!(case.wind.unwrap().reference_height_m, 10.0);
    assert_eq!(
        case.wind.unwrap().profile,
        Profile::Power { exponent: 0.16 }
    );
    assert_eq!(case.wind.unwrap().air_density_kg_m3, 1.25);
    assert_eq!(case.wind.unwrap().kinematic_viscosity_m2_s, 1.5e-5);
    assert_eq!(case.vortex.method, VortexMethod::En1991E1);
    assert_eq!(case.vortex.log_decrement, 0.03);
    assert_eq!(case.vortex.modes, 3);
    assert_eq!(case.vortex.design_life_years, 50.0);
    assert!(case.criteria.is_empty());
    assert_eq!(case.point_masses[0].label, "point mass at 90 m");
    assert_eq!(case.title, "Invented test stack");
}

#[test]
fn no_lining_and_no_stages_gives_one_stage() {
    // Two default stages "shell only" and "lined" would be the same structure.
    let text = with(
        "[[lining]]\nfrom_z_m = 5.0\nto_z_m = 100.0\nmass_per_length_kg_m = 3000.0\n",
        "",
    );
    let case = run(&text).expect("valid");
    assert_eq!(case.stages.len(), 1);
    assert_eq!(case.stages[0].name, "shell only");
    assert!(!case.stages[0].lining);
}

#[test]
fn unit_conversions() {
    let case = run(&append(
        "[base]\nrotational_stiffness_gnm_per_rad = 800.0\nlateral_stiffness_mn_per_m = 5000.0\n\
         [criteria]\nstress_mpa = 3.0\n[model]\nelastic_modulus_gpa = 3.0\ndensity_kg_m3 = 1200.0",
    ))
    .expect("valid");
    let base = case.base.expect("springs");
    assert_eq!(base.rotational_nm_per_rad, Some(800.0e9));
    assert_eq!(base.lateral_n_per_m, Some(5000.0e6));
    assert_eq!(case.criteria.stress_pa, Some(3.0e6));
    let model = case.model.expect("model");
    assert_eq!(model.elastic_modulus_pa, 3.0e9);
    assert_eq!(model.poisson_ratio, 0.35);
    assert_eq!(model.max_blockage, 0.05);
}

#[test]
fn base_with_one_component_is_rigid_in_the_other() {
    let case = run(&append("[base]\nrotational_stiffness_gnm_per_rad = 800.0")).expect("valid");
    let base = case.base.expect("springs");
    assert_eq!(base.lateral_n_per_m, None);
    let case = run(&append("[base]")).expect("valid");
    assert_eq!(case.base, None);
}

#[test]
fn non_finite_numbers() {
    fails_with(
        &with("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = nan"),
        "shell.elastic_modulus_gpa = nan: must be a finite number",
    );
    fails_with(
        &with("mass_kg = 10000.0", "mass_kg = inf"),
        "point_mass[0].mass_kg = inf: must be a finite number",
    );
}

#[test]
fn station_sizes() {
    fails_with(
        &with(
            "outer_diameter_m = 10.0, wall_m = 0.30",
            "outer_diameter_m = 0.0, wall_m = 0.30",
        ),
        "shell.stations[1].outer_diameter_m = 0: must be > 0",
    );
    fails_with(
        &with("wall_m = 0.30", "wall_m = -0.3"),
        "shell.stations[1].wall_m = -0.3: must be > 0",
    );
    fails_with(
        &with("wall_m = 0.30", "wall_m = 5.0"),
        "shell.stations[1].wall_m = 5: wall must be less than half the outer diameter (10 m / 2)",
    );
}

#[test]
fn station_order() {
    fails_with(
        &with("z_m = 0.0,", "z_m = 2.0,"),
        "shell.stations[0].z_m = 2: the first station must be at z = 0 (top of the foundation)",
    );
    fails_with(
        &with("z_m = 50.0,", "z_m = 100.0,"),
        "shell.stations[2].z_m = 100: a wall step at the top has no shell above it; give one \
         station at the top",
    );
    fails_with(
        &with("z_m = 50.0,", "z_m = 120.0,"),
        "shell.stations[2].z_m = 100: must be above the previous station (120 m); list \
         stations from the base upward",
    );
}

#[test]
fn station_count_and_source() {
    let one = BASE.replace(
        "  { z_m = 50.0,  outer_diameter_m = 10.0, wall_m = 0.30 },\n  { z_m = 100.0, outer_diameter_m = 8.0,  wall_m = 0.20 },\n",
        "",
    );
    let errs = run(&one).unwrap_err();
    assert!(
        errs.contains(
            &"shell.stations: 1 station(s) given; at least 2 are needed (base and top)".to_string()
        ),
        "{errs:?}"
    );
    fails_with(
        &with(
            "density_kg_m3 = 2500.0",
            "density_kg_m3 = 2500.0\nstations_csv = \"s.csv\"",
        ),
        "shell: stations and stations_csv given together; give only one",
    );
}

#[test]
fn plausibility_hints() {
    fails_with(
        &with(
            "elastic_modulus_gpa = 32.0",
            "elastic_modulus_gpa = 32000000000.0",
        ),
        "shell.elastic_modulus_gpa = 32000000000: looks like Pa or MPa; give E in GPa (e.g. 32.0)",
    );
    fails_with(
        &with("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = 0.032"),
        "shell.elastic_modulus_gpa = 0.032: below 1 GPa: looks like the wrong unit; give E in GPa (e.g. 32.0)",
    );
    fails_with(
        &with("density_kg_m3 = 2500.0", "density_kg_m3 = 2.5"),
        "shell.density_kg_m3 = 2.5: outside 500-10000 kg/m3: looks like the wrong unit; give kg/m3 (e.g. 2500.0)",
    );
    fails_with(
        &with("outer_diameter_m = 12.0", "outer_diameter_m = 120.0"),
        "shell.stations[0].outer_diameter_m = 120: diameter larger than the height (100 m): are the sizes in mm?",
    );
    let mm = with(
        "outer_diameter_m = 12.0, wall_m = 0.40",
        "outer_diameter_m = 12000.0, wall_m = 0.40",
    );
    let errs = run(&mm).unwrap_err();
    assert_eq!(errs, vec!["shell.stations[0].outer_diameter_m = 12000: over 200 m: are the sizes in mm? give metres".to_string()]);
    fails_with(
        &with("reference_speed_m_s = 25.0", "reference_speed_m_s = 120.0"),
        "wind.reference_speed_m_s = 120: over 100 m/s: is it in km/h? give m/s",
    );
}

#[test]
fn poisson_range() {
    fails_with(
        &with(
            "density_kg_m3 = 2500.0",
            "density_kg_m3 = 2500.0\npoisson_ratio = 0.5",
        ),
        "shell.poisson_ratio = 0.5: must be >= 0 and < 0.5",
    );
    fails_with(
        &with(
            "density_kg_m3 = 2500.0",
            "density_kg_m3 = 2500.0\npoisson_ratio = -0.1",
        ),
        "shell.poisson_ratio = -0.1: must be >= 0 and < 0.5",
    );
}

#[test]
fn lining_zone() {
    fails_with(
        &with("from_z_m = 5.0", "from_z_m = -1.0"),
        "lining[0].from_z_m = -1: below the base of the shell (z = 0)",
    );
    fails_with(
        &with("to_z_m = 100.0", "to_z_m = 101.0"),
        "lining[0].to_z_m = 101: above the top of the shell (100 m)",
    );
    fails_with(
        &with("to_z_m = 100.0", "to_z_m = 5.0"),
        "lining[0].to_z_m = 5: must be above from_z_m (5 m)",
    );
}

#[test]
fn lining_mass_forms() {
    fails_with(
        &with("mass_per_length_kg_m = 3000.0", "mass_per_length_kg_m = 3000.0\nmass_per_area_kg_m2 = 200.0"),
        "lining[0]: mass_per_length_kg_m and mass_per_area_kg_m2 given together; give exactly one mass form",
    );
    fails_with(
        &with("mass_per_length_kg_m = 3000.0", ""),
        "lining[0]: no mass given; give exactly one of mass_per_length_kg_m, mass_per_area_kg_m2 or thickness_m + density_kg_m3 (+ gap_m)",
    );
    fails_with(
        &with("mass_per_length_kg_m = 3000.0", "thickness_m = 0.1"),
        "lining[0].density_kg_m3: missing; a layer lining needs thickness_m and density_kg_m3",
    );
    fails_with(
        &with("mass_per_length_kg_m = 3000.0", "mass_per_area_kg_m2 = 0.0"),
        "lining[0].mass_per_area_kg_m2 = 0: must be > 0",
    );
    fails_with(
        &with(
            "mass_per_length_kg_m = 3000.0",
            "thickness_m = 0.1\ndensity_kg_m3 = 1900.0\ngap_m = -0.1",
        ),
        "lining[0].gap_m = -0.1: must be >= 0",
    );
    let layer = run(&with(
        "mass_per_length_kg_m = 3000.0",
        "thickness_m = 0.1\ndensity_kg_m3 = 1900.0",
    ))
    .expect("valid layer");
    assert_eq!(
        layer.linings[0].mass,
        LiningMass::Layer {
            thickness_m: 0.1,
            density_kg_m3: 1900.0,
            gap_m: 0.0
        }
    );
}

#[test]
fn lining_layer_must_fit_inside_the_shell() {
    // At the top: D - 2 t - 2 gap - t_l = 8 - 0.4 - 6 - 2 = -0.4 m.
    fails_with(
        &with("mass_per_length_kg_m = 3000.0", "thickness_m = 2.0\ndensity_kg_m3 = 1900.0\ngap_m = 3.0"),
        "lining[0].thickness_m = 2: the layer does not fit inside the shell at z = 100 m: D - 2 t - 2 gap - t_l = -0.400 m, must be > 0",
    );
}

#[test]
fn point_mass_rules() {
    fails_with(
        &with("z_m = 90.0", "z_m = 150.0"),
        "point_mass[0].z_m = 150: outside the shell (0 to 100 m)",
    );
    fails_with(
        &with("mass_kg = 10000.0", "mass_kg = 0.0"),
        "point_mass[0].mass_kg = 0: must be > 0",
    );
}

#[test]
fn stage_wind_duration_damping_and_point_mass_stages() {
    let text = append(
        "[[stage]]\nname = \"to 80 m\"\nlining = false\ntop_z_m = 80.0\nduration_years = 0.25\n\
         log_decrement = 0.02\n[[stage]]\nname = \"lined\"\nlining = true\n\
         return_period_years = 100.0",
    )
    .replacen(
        "mass_kg = 10000.0",
        "mass_kg = 10000.0\nstages = [\"lined\"]\n[[point_mass]]\nz_m = 80.0\n\
         mass_kg = 5000.0\nlabel = \"rig\"\nstages = [\" to 80 m \"]",
        1,
    )
    .replacen(
        "reference_speed_m_s = 25.0",
        "reference_speed_m_s = 25.0\nc_prob_k = 0.11\nc_prob_n = 1.0",
        1,
    );
    let case = run(&text).expect("valid");
    let (a, b) = (&case.stages[0], &case.stages[1]);
    assert_eq!(a.duration_years, Some(0.25));
    assert_eq!(a.log_decrement, Some(0.02));
    assert_eq!(a.return_period_years, None);
    assert_eq!(b.return_period_years, Some(100.0));
    assert_eq!(b.log_decrement(&case.vortex), DEFAULT_LOG_DECREMENT);
    let w = case.wind.unwrap();
    assert_eq!((w.c_prob_k, w.c_prob_n), (0.11, 1.0));
    // Names are trimmed like stage names.
    assert_eq!(
        case.point_masses[1].stages,
        Some(vec!["to 80 m".to_string()])
    );
    assert!(case.point_masses[1].is_in_stage("to 80 m"));
    assert!(!case.point_masses[1].is_in_stage("lined"));
    assert!(
        case.point_masses[0].is_in_stage("lined") && !case.point_masses[0].is_in_stage("to 80 m")
    );
    // Defaults: no keys = in service, every stage, the recommended K and n.
    let base = run(BASE).unwrap();
    assert!(base.stages.iter().all(|s| s.duration_years.is_none()));
    assert_eq!(base.point_masses[0].stages, None);
    let w = base.wind.unwrap();
    assert_eq!((w.c_prob_k, w.c_prob_n), (0.2, 0.5));
}

#[test]
fn stage_rules() {
    let stage = |body: &str| append(&format!("[[stage]]\n{body}"));
    fails_with(
        &stage("name = \"a\"\nlining = false\ntop_z_m = 0.0"),
        "stage[0].top_z_m = 0: must be above the base (> 0)",
    );
    fails_with(
        &stage("name = \"a\"\nlining = false\ntop_z_m = 120.0"),
        "stage[0].top_z_m = 120: above the top of the shell (100 m)",
    );
    fails_with(
        &stage("name = \"a\"\nlining = false\nstiffness_factor = 0.0"),
        "stage[0].stiffness_factor = 0: must be > 0",
    );
    fails_with(
        &stage("name = \"a\"\nlining = false\n[[stage]]\nname = \"a\"\nlining = true"),
        "stage[1].name = \"a\": used by an earlier stage; stage names must be unique",
    );
    fails_with(
        &stage("name = \" \"\nlining = false"),
        "stage[0].name = \" \": must not be empty",
    );
    fails_with(
        &format!("stage = []\n{BASE}"),
        "stage: no stages given; give at least one [[stage]], or leave stage out for the default stages (shell only, lined)",
    );
    // A partial stage below the first station above the base is fine (without the point
    // mass at 90 m, which would lie above the stage's top).
    let case = run(
        &stage("name = \"a\"\nlining = false\ntop_z_m = 10.0").replacen(
            "[[point_mass]]\nz_m = 90.0\nmass_kg = 10000.0\n",
            "",
            1,
        ),
    )
    .expect("valid");
    assert_eq!(case.stages[0].top_z_m, Some(10.0));
}

#[test]
fn wind_rules() {
    fails_with(
        &with("reference_speed_m_s = 25.0", "reference_speed_m_s = 0.0"),
        "wind.reference_speed_m_s = 0: must be > 0",
    );
    fails_with(
        &append("exponent = 1.2"),
        "wind.exponent = 1.2: must be between 0 and 1 (exclusive)",
    );
    let log = |extra: &str| {
        with(
            "reference_speed_m_s = 25.0",
            &format!("reference_speed_m_s = 25.0\nprofile = \"log\"\n{extra}"),
        )
    };
    fails_with(
        &log(""),
        "wind.roughness_m: missing; profile = \"log\" needs the roughness length z0 (EN 1991-1-4 Table 4.1, e.g. 0.05 m for terrain category II)",
    );
    fails_with(
        &log("roughness_m = 3.0"),
        "wind.roughness_m = 3: must be at most 2 m",
    );
    fails_with(
        &log("roughness_m = 0.0"),
        "wind.roughness_m = 0: must be > 0",
    );
    fails_with(
        &log("roughness_m = 0.05\nexponent = 0.2"),
        "wind.exponent = 0.2: applies to profile = \"power\" only; remove it or set profile = \"power\"",
    );
    fails_with(
        &with("reference_speed_m_s = 25.0", "reference_speed_m_s = 25.0\nroughness_m = 0.05"),
        "wind.roughness_m = 0.05: applies to profile = \"log\" only; remove it or set profile = \"log\"",
    );
    fails_with(
        &with(
            "reference_speed_m_s = 25.0",
            "reference_speed_m_s = 25.0\nair_density_kg_m3 = -1.25",
        ),
        "wind.air_density_kg_m3 = -1.25: must be > 0",
    );
    fails_with(
        &with(
            "reference_speed_m_s = 25.0",
            "reference_speed_m_s = 25.0\nkinematic_viscosity_m2_s = 0.0",
        ),
        "wind.kinematic_viscosity_m2_s = 0: must be > 0",
    );
    let case = run(&log("roughness_m = 0.3")).expect("valid");
    assert_eq!(
        case.wind.unwrap().profile,
        Profile::Log {
            roughness_m: 0.3,
            z_min_m: 5.0
        }
    );
}

#[test]
fn z_min_defaults_follow_en1991_1_4_table_4_1() {
    // EN 1991-1-4 Table 4.1: z0 0.003/0.01/0.05/0.3/1.0 m -> z_min 1/1/2/5/10 m.
    assert_eq!(default_z_min_m(0.003), 1.0);
    assert_eq!(default_z_min_m(0.01), 1.0);
    assert_eq!(default_z_min_m(0.05), 2.0);
    assert_eq!(default_z_min_m(0.3), 5.0);
    assert_eq!(default_z_min_m(1.0), 10.0);
    // Nearest in log scale: 0.1 is nearer 0.05 (ratio 2) than 0.3 (ratio 3).
    assert_eq!(default_z_min_m(0.1), 2.0);
    assert_eq!(default_z_min_m(0.2), 5.0);
    assert_eq!(default_z_min_m(2.0), 10.0);
}

#[test]
fn vortex_rules() {
    let v = |body: &str| append(&format!("[vortex]\n{body}"));
    fails_with(
        &v("strouhal = 1.0"),
        "vortex.strouhal = 1: must be between 0 and 1 (exclusive)",
    );
    fails_with(
        &v("log_decrement = 0.0"),
        "vortex.log_decrement = 0: must be between 0 and 1 (exclusive)",
    );
    fails_with(
        &v("damping_ratio = 1.5"),
        "vortex.damping_ratio = 1.5: must be between 0 and 1 (exclusive)",
    );
    fails_with(&v("modes = 0"), "vortex.modes = 0: must be 1 to 20");
    fails_with(&v("modes = 21"), "vortex.modes = 21: must be 1 to 20");
    fails_with(
        &v("design_life_years = 0"),
        "vortex.design_life_years = 0: must be > 0",
    );
    fails_with(
        &v("[vortex.group]\ncount = 1\nspacing_m = 40.0"),
        "vortex.group.count = 1: must be at least 2 (the stack and one neighbour)",
    );
    fails_with(
        &v("[vortex.group]\ncount = 3\nspacing_m = 0.0"),
        "vortex.group.spacing_m = 0: must be > 0",
    );
    let case = run(&v(
        "method = \"gb50009-h1\"\nmodes = 5\n[vortex.group]\ncount = 3\nspacing_m = 40.0",
    ))
    .expect("valid");
    assert_eq!(case.vortex.method, VortexMethod::Gb50009H1);
    assert_eq!(case.vortex.modes, 5);
    assert_eq!(
        case.vortex.group,
        Some(Group {
            count: 3,
            spacing_m: 40.0,
            arrangement: Arrangement::InLine
        })
    );
}

#[test]
fn criteria_and_model_rules() {
    fails_with(
        &append("[criteria]\ntip_amplitude_m = 0.0"),
        "criteria.tip_amplitude_m = 0: must be > 0",
    );
    fails_with(
        &append("[criteria]\nstress_mpa = -3"),
        "criteria.stress_mpa = -3: must be > 0",
    );
    let m = |extra: &str| {
        append(&format!(
            "[model]\nelastic_modulus_gpa = 3.0\ndensity_kg_m3 = 1200.0\n{extra}"
        ))
    };
    fails_with(
        &m("max_blockage = 0.6"),
        "model.max_blockage = 0.6: must be at most 0.5",
    );
    fails_with(
        &m("length_scale = 0.0"),
        "model.length_scale = 0: must be between 1 and 10000 (prototype / model): a model larger than the prototype, or under 1/10000 of it, cannot be built and tested in a boundary-layer tunnel (common practice)",
    );
    fails_with(
        &m("poisson_ratio = 0.5"),
        "model.poisson_ratio = 0.5: must be >= 0 and < 0.5",
    );
    fails_with(
        &m("tunnel_speed_min_m_s = 20.0\ntunnel_speed_max_m_s = 10.0"),
        "model.tunnel_speed_max_m_s = 10: must be above tunnel_speed_min_m_s (20 m/s)",
    );
}

#[test]
fn every_problem_is_collected() {
    let text = with("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = -1.0")
        .replacen("wall_m = 0.30", "wall_m = 6.0", 1)
        .replacen("mass_kg = 10000.0", "mass_kg = -5.0", 1);
    let errs = run(&text).unwrap_err();
    assert_eq!(errs.len(), 3, "{errs:?}");
}

#[test]
fn remedy_rules() {
    let case = run(&append(
        "[remedy.tmd]\nmode = 1\nmass_ratio = 0.02\n[remedy.strakes]\nfrom_z_m = 60.0\nto_z_m = 100.0\nc_lat_factor = 0.3",
    ))
    .expect("valid");
    let r = case.remedy.expect("remedy");
    assert_eq!(r.tmd.unwrap().mass, TmdMass::Ratio(0.02));
    let s = r.strakes.unwrap();
    assert_eq!(s.drag_coefficient, DEFAULT_STRAKES_DRAG_COEFFICIENT);
    fails_with(
        &append("[remedy.tmd]\nmode = 1\nmass_ratio = -1.0"),
        "remedy.tmd.mass_ratio = -1: must be > 0",
    );
    fails_with(
        &append("[remedy.tmd]\nmode = 4\nmass_kg = 1000.0"),
        "remedy.tmd.mode = 4: must be a checked mode, 1 to 3 (vortex.modes)",
    );
    fails_with(
        &append("[remedy.tmd]\nmode = 1\nmass_kg = 1000.0\nmass_ratio = 0.01"),
        "remedy.tmd: give exactly one of mass_ratio and mass_kg, not both",
    );
    fails_with(
        &append("[remedy.tmd]\nmode = 1\nmass_kg = 1000.0\nstage = \"nope\""),
        "remedy.tmd.stage = \"nope\": no such stage; the stages are \"shell only\", \"lined\"",
    );
    fails_with(
        &append("[remedy.strakes]\nfrom_z_m = 60.0\nto_z_m = 50.0\nc_lat_factor = 0.3"),
        "remedy.strakes.to_z_m = 50: must be above from_z_m (60 m)",
    );
    fails_with(
        &append("[remedy.strakes]\nfrom_z_m = 60.0\nto_z_m = 90.0\nc_lat_factor = 1.5"),
        "remedy.strakes.c_lat_factor = 1.5: must be between 0 and 1 (a factor that reduces c_lat)",
    );
}
