//! The shell as drawn (wall step, concrete zones, an opening, foundation mass and rotary
//! inertia, a tip mass with rotary inertia), Euler-Bernoulli and Timoshenko, against an
//! independent ODE shooting solution computed with scipy.
//!
//! Source: tests/reference/shell_as_drawn/shooting.py (solve_ivp DOP853 + brentq, net
//! section of the opening by scipy dblquad; shares no code with stackwake), whose output
//! tests/reference/shell_as_drawn/frequencies.csv is committed and read here. Every case is
//! invented; the script's header states the model and boundary conditions.
//! Tolerance 1e-6 relative: the shooting roots are solved to ~1e-11 and the 300-element FE
//! converges as h^4 (< 1e-8 here); 1e-6 still catches any wrong section (a 1 % error in I
//! moves f by 0.5 %) or a lost inertia term.

mod common;

use std::f64::consts::PI;

use stackwake::case::{
    BaseInertia, BaseSprings, BeamTheory, Case, ConcreteZone, Opening, PointMass, Station,
};

fn reference() -> Vec<(String, String, usize, f64)> {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tests/reference/shell_as_drawn/frequencies.csv"
    );
    let text = std::fs::read_to_string(path).unwrap();
    text.lines()
        .filter(|l| !l.starts_with('#') && !l.starts_with("case,"))
        .map(|l| {
            let c: Vec<&str> = l.split(',').collect();
            (
                c[0].to_string(),
                c[1].to_string(),
                c[2].parse().unwrap(),
                c[3].parse().unwrap(),
            )
        })
        .collect()
}

fn tube(h: f64, d: f64, t: f64, beam: BeamTheory) -> Case {
    common::shell_case(&[(0.0, d, t), (h, d, t)], 32e9, 2500.0, beam)
}

fn case_named(name: &str, beam: BeamTheory) -> Case {
    match name {
        "stepped_wall" => {
            let mut c = tube(80.0, 8.0, 0.40, beam);
            c.shell.stations = vec![
                Station {
                    z_m: 0.0,
                    outer_diameter_m: 8.0,
                    wall_m: 0.40,
                },
                Station {
                    z_m: 30.0,
                    outer_diameter_m: 8.0,
                    wall_m: 0.40,
                },
                Station {
                    z_m: 30.0,
                    outer_diameter_m: 8.0,
                    wall_m: 0.25,
                },
                Station {
                    z_m: 80.0,
                    outer_diameter_m: 8.0,
                    wall_m: 0.25,
                },
            ];
            c
        }
        "two_zones" => {
            let mut c = tube(80.0, 8.0, 0.30, beam);
            c.shell.zones = vec![
                ConcreteZone {
                    from_z_m: 0.0,
                    to_z_m: 30.0,
                    elastic_modulus_pa: Some(36e9),
                    density_kg_m3: Some(2550.0),
                    poisson_ratio: None,
                    characteristic_strength_pa: Some(50e6),
                },
                ConcreteZone {
                    from_z_m: 30.0,
                    to_z_m: 80.0,
                    elastic_modulus_pa: Some(28e9),
                    density_kg_m3: None,
                    poisson_ratio: Some(0.15),
                    characteristic_strength_pa: None,
                },
            ];
            c
        }
        "opening" => {
            let mut c = tube(60.0, 6.0, 0.30, beam);
            c.shell.openings = vec![Opening {
                from_z_m: 5.0,
                to_z_m: 15.0,
                width_m: 2.5,
                azimuth_rad: 0.0,
                label: "flue inlet".into(),
            }];
            c
        }
        "foundation_inertia" => {
            let mut c = tube(80.0, 8.0, 0.30, beam);
            c.base = Some(BaseSprings {
                rotational_nm_per_rad: Some(500e9),
                lateral_n_per_m: Some(3000e6),
            });
            c.base_inertia = BaseInertia {
                mass_kg: 2.0e6,
                rotary_inertia_kg_m2: 5.0e8,
            };
            c
        }
        "tip_rotary_inertia" => {
            let mut c = tube(80.0, 8.0, 0.30, beam);
            c.point_masses.push(PointMass {
                z_m: 80.0,
                mass_kg: 2.0e5,
                rotary_inertia_kg_m2: 5.0e6,
                label: "tip".into(),
                stages: None,
            });
            c
        }
        other => panic!("unknown reference case {other}"),
    }
}

#[test]
fn shell_as_drawn_matches_the_shooting_solution() {
    let rows = reference();
    assert!(rows.len() >= 25, "reference file incomplete");
    let mut checked = 0;
    let mut worst = 0.0f64;
    for beam_name in ["euler-bernoulli", "timoshenko"] {
        let beam = if beam_name == "timoshenko" {
            BeamTheory::Timoshenko
        } else {
            BeamTheory::EulerBernoulli
        };
        for name in [
            "stepped_wall",
            "two_zones",
            "opening",
            "foundation_inertia",
            "tip_rotary_inertia",
        ] {
            let f = common::frequencies(&case_named(name, beam), 3, Some(300));
            for (_, _, mode, exact) in rows.iter().filter(|r| r.0 == name && r.1 == beam_name) {
                let got = f[mode - 1];
                worst = worst.max((got - exact).abs() / exact);
                assert!(
                    (got - exact).abs() / exact < 1e-6,
                    "{name} {beam_name} mode {mode}: {got} vs {exact}"
                );
                checked += 1;
            }
        }
    }
    assert_eq!(checked, rows.len());
    eprintln!("largest relative difference to the shooting solution: {worst:.2e}");
}

#[test]
fn the_opening_lowers_the_frequency_and_an_opposite_azimuth_gives_the_same() {
    // The smaller principal second moment does not depend on which way the opening faces.
    let plain = common::frequencies(&tube(60.0, 6.0, 0.30, BeamTheory::Timoshenko), 2, Some(200));
    let mut a = case_named("opening", BeamTheory::Timoshenko);
    let fa = common::frequencies(&a, 2, Some(200));
    a.shell.openings[0].azimuth_rad = PI * 0.7;
    let fb = common::frequencies(&a, 2, Some(200));
    assert!(fa[0] < plain[0]);
    assert!((fa[0] - fb[0]).abs() / fa[0] < 1e-10);
}
