//! Extreme but valid stacks through the modal analysis: each must give modes with a passing
//! completeness check (Sturm count = modes reported, k - 1 zero crossings for mode k,
//! finite positive increasing frequencies) or be refused with an error naming the stage;
//! never a panic, NaN or hang. Robustness checks; where a frequency is checked against a
//! closed form, the source is named beside it.

mod common;

use common::{shell_case, uniform_tube};
use stackwake::case::{BaseSprings, BeamTheory, Case, Lining, LiningMass, PointMass, Stage};
use stackwake::modal::{analyse_case, ModalOptions, StageModes};

/// Runs every stage and checks the completeness and sanity of what came back.
fn analyse_ok(case: &Case, modes: usize, min_elements: Option<usize>) -> Vec<StageModes> {
    let stages = analyse_case(
        case,
        ModalOptions {
            modes,
            min_elements,
        },
    )
    .unwrap_or_else(|e| panic!("refused: {e}"));
    for s in &stages {
        assert_eq!(s.modes.len(), modes, "stage {}", s.stage.name);
        assert_eq!(
            s.check.sturm_count, modes,
            "stage {}: Sturm count",
            s.stage.name
        );
        assert!(
            s.check.max_relative_residual < 1e-6,
            "stage {}: residual {}",
            s.stage.name,
            s.check.max_relative_residual
        );
        let mut last = 0.0;
        for (k, m) in s.modes.iter().enumerate() {
            assert!(
                m.frequency_hz.is_finite() && m.frequency_hz > last,
                "stage {}: f{} = {}",
                s.stage.name,
                k + 1,
                m.frequency_hz
            );
            last = m.frequency_hz;
            assert!(m.modal_mass_kg.is_finite() && m.modal_mass_kg > 0.0);
            assert!(m.equivalent_mass_kg_m.is_finite() && m.equivalent_mass_kg_m > 0.0);
            assert!(m
                .displacement
                .iter()
                .chain(&m.rotation_per_m)
                .all(|v| v.is_finite()));
        }
    }
    stages
}

/// First cantilever frequency f1 = (1.8751^2 / 2 pi) sqrt(EI / (m L^4)) (Blevins, Formulas
/// for Natural Frequency and Mode Shape, Table 8-1, clamped-free).
fn cantilever_f1(case: &Case) -> f64 {
    let (ei, m) = common::tube_ei_m(case);
    let l = case.shell.height_m();
    1.875_104_f64.powi(2) / (2.0 * std::f64::consts::PI) * (ei / (m * l.powi(4))).sqrt()
}

#[test]
fn a_1000_m_stack_works() {
    let case = shell_case(
        &[
            (0.0, 60.0, 1.5),
            (300.0, 40.0, 0.9),
            (700.0, 25.0, 0.5),
            (1000.0, 15.0, 0.3),
        ],
        35e9,
        2500.0,
        BeamTheory::Timoshenko,
    );
    let s = analyse_ok(&case, 10, None);
    // Order of magnitude only (tapered): f1 of a 1000 m RC tower lies far below 1 Hz.
    assert!(s[0].modes[0].frequency_hz > 0.005 && s[0].modes[0].frequency_hz < 0.5);
}

#[test]
fn a_slender_1000_m_uniform_tube_matches_the_cantilever_formula() {
    let case = uniform_tube(1000.0, 20.0, 0.3, BeamTheory::EulerBernoulli);
    let s = analyse_ok(&case, 5, None);
    let f1 = cantilever_f1(&case);
    assert!(
        (s[0].modes[0].frequency_hz / f1 - 1.0).abs() < 1e-4,
        "{} vs {f1}",
        s[0].modes[0].frequency_hz
    );
}

#[test]
fn a_0_05_m_wall_works() {
    let case = shell_case(
        &[(0.0, 12.0, 0.05), (100.0, 8.0, 0.05)],
        32e9,
        2500.0,
        BeamTheory::Timoshenko,
    );
    analyse_ok(&case, 5, None);
    let thin = uniform_tube(80.0, 6.0, 0.05, BeamTheory::EulerBernoulli);
    let s = analyse_ok(&thin, 3, None);
    let f1 = cantilever_f1(&thin);
    assert!((s[0].modes[0].frequency_hz / f1 - 1.0).abs() < 1e-4);
}

#[test]
fn a_wall_of_nearly_the_radius_and_a_hairline_wall_work() {
    analyse_ok(
        &shell_case(
            &[(0.0, 10.0, 4.999), (50.0, 10.0, 4.999)],
            32e9,
            2500.0,
            BeamTheory::Timoshenko,
        ),
        5,
        None,
    );
    analyse_ok(
        &shell_case(
            &[(0.0, 10.0, 0.001), (150.0, 10.0, 0.001)],
            32e9,
            2500.0,
            BeamTheory::Timoshenko,
        ),
        5,
        None,
    );
}

/// Shell mass of a case, kg.
fn shell_mass_kg(case: &Case) -> f64 {
    let st = &case.shell.stations;
    st.windows(2)
        .map(|w| {
            let a = |d: f64, t: f64| std::f64::consts::PI * (d - t) * t;
            0.5 * (a(w[0].outer_diameter_m, w[0].wall_m) + a(w[1].outer_diameter_m, w[1].wall_m))
                * (w[1].z_m - w[0].z_m)
                * case.shell.density_kg_m3
        })
        .sum()
}

#[test]
fn point_masses_100_times_the_shell_work() {
    let mut case = uniform_tube(120.0, 8.0, 0.3, BeamTheory::Timoshenko);
    let big = 100.0 * shell_mass_kg(&case);
    case.point_masses = vec![
        PointMass {
            rotary_inertia_kg_m2: 0.0,
            z_m: 120.0,
            mass_kg: big,
            label: "huge cap".into(),
            stages: None,
        },
        PointMass {
            rotary_inertia_kg_m2: 0.0,
            z_m: 60.0,
            mass_kg: big,
            label: "huge platform".into(),
            stages: None,
        },
        PointMass {
            rotary_inertia_kg_m2: 0.0,
            z_m: 1e-3,
            mass_kg: big,
            label: "at the base".into(),
            stages: None,
        },
    ];
    let s = analyse_ok(&case, 6, None);
    // Two dominant masses: two low modes, then a big gap to the shell's own modes.
    assert!(s[0].modes[2].frequency_hz > 10.0 * s[0].modes[1].frequency_hz);

    // A single huge tip mass: f1 -> sqrt(3 EI / L^3 / M) / 2 pi (massless cantilever with a
    // tip mass, Blevins Table 8-8, common practice for M >> shell mass).
    let mut tip = uniform_tube(120.0, 8.0, 0.3, BeamTheory::EulerBernoulli);
    let m_tip = 100.0 * shell_mass_kg(&tip);
    tip.point_masses = vec![PointMass {
        rotary_inertia_kg_m2: 0.0,
        z_m: 120.0,
        mass_kg: m_tip,
        label: "tip".into(),
        stages: None,
    }];
    let (ei, m) = common::tube_ei_m(&tip);
    // Rayleigh's correction: add 33/140 of the shell mass (Blevins Table 8-8).
    let f = (3.0 * ei / 120f64.powi(3) / (m_tip + 33.0 / 140.0 * m * 120.0)).sqrt()
        / (2.0 * std::f64::consts::PI);
    let s = analyse_ok(&tip, 3, None);
    assert!(
        (s[0].modes[0].frequency_hz / f - 1.0).abs() < 1e-3,
        "{} vs {f}",
        s[0].modes[0].frequency_hz
    );
}

#[test]
fn lining_100_times_the_shell_works() {
    let mut case = uniform_tube(100.0, 8.0, 0.3, BeamTheory::Timoshenko);
    let shell_per_m = shell_mass_kg(&case) / 100.0;
    case.linings = vec![Lining {
        from_z_m: 0.0,
        to_z_m: 100.0,
        mass: LiningMass::PerLength {
            mass_per_length_kg_m: 100.0 * shell_per_m,
        },
    }];
    case.stages[0].lining = true;
    analyse_ok(&case, 5, None);
}

/// Modes, or a refusal naming the stage; never wrong numbers.
fn analyse_ok_or_refused(case: &Case, modes: usize) {
    match analyse_case(
        case,
        ModalOptions {
            modes,
            min_elements: None,
        },
    ) {
        Ok(_) => {
            analyse_ok(case, modes, None);
        }
        Err(e) => assert!(
            e.to_string().starts_with("stage `shell`: eigen-solver"),
            "{e}"
        ),
    }
}

#[test]
fn very_soft_and_very_stiff_base_springs_work() {
    // Springs in N m/rad and N/m: from 1e-3 GN m/rad (a soft soil is ~10 GN m/rad for a
    // large raft, common practice) to effectively rigid.
    for (rot, lat) in [
        (1e6, 1e6),
        (1e18, 1e18),
        (1e18, 1e3),
        (1e9, 1e9),
        (1e6, 1e18),
    ] {
        let mut case = uniform_tube(150.0, 10.0, 0.35, BeamTheory::Timoshenko);
        case.base = Some(BaseSprings {
            rotational_nm_per_rad: Some(rot),
            lateral_n_per_m: Some(lat),
        });
        analyse_ok(&case, 5, None);
    }
    let mut case = uniform_tube(150.0, 10.0, 0.35, BeamTheory::Timoshenko);
    case.base = Some(BaseSprings {
        rotational_nm_per_rad: Some(1e6),
        lateral_n_per_m: None,
    });
    analyse_ok(&case, 5, None);
}

#[test]
fn absurdly_soft_base_springs_work_or_are_refused() {
    // 1 N m/rad under a 150 m stack: a near-rigid-body rocking mode many decades below the
    // bending modes. Either solved with a passing completeness check or refused.
    for (rot, lat) in [(1.0, 1.0), (1e3, 1e3), (1e3, 1e18)] {
        let mut case = uniform_tube(150.0, 10.0, 0.35, BeamTheory::Timoshenko);
        case.base = Some(BaseSprings {
            rotational_nm_per_rad: Some(rot),
            lateral_n_per_m: Some(lat),
        });
        analyse_ok_or_refused(&case, 5);
    }
}

#[test]
fn a_stage_built_only_a_few_centimetres_works() {
    let mut case = shell_case(
        &[(0.0, 16.0, 0.5), (200.0, 9.0, 0.25)],
        32e9,
        2500.0,
        BeamTheory::Timoshenko,
    );
    case.stages = vec![
        Stage {
            name: "first lift".into(),
            lining: false,
            stiffness_factor: 1.0,
            top_z_m: Some(0.05),
            duration_years: None,
            return_period_years: None,
            log_decrement: None,
        },
        Stage {
            name: "one metre".into(),
            lining: false,
            stiffness_factor: 0.05,
            top_z_m: Some(1.0),
            duration_years: None,
            return_period_years: None,
            log_decrement: None,
        },
        Stage {
            name: "complete".into(),
            lining: false,
            stiffness_factor: 2.0,
            top_z_m: None,
            duration_years: None,
            return_period_years: None,
            log_decrement: None,
        },
    ];
    analyse_ok(&case, 3, None);
}

#[test]
fn five_hundred_stations_and_twenty_modes_work() {
    let stations: Vec<(f64, f64, f64)> = (0..500)
        .map(|i| {
            let z = i as f64 * 0.5;
            // A wavy taper, as from a spreadsheet with many rows.
            (
                z,
                14.0 - 0.02 * z + 0.3 * (z / 7.0).sin(),
                0.45 - 0.0008 * z,
            )
        })
        .collect();
    let case = shell_case(&stations, 32e9, 2500.0, BeamTheory::Timoshenko);
    let s = analyse_ok(&case, 20, None);
    for (k, c) in s[0].check.sign_changes.iter().enumerate() {
        assert_eq!(*c, k, "mode {} zero crossings", k + 1);
    }
}

#[test]
fn the_largest_element_count_allowed_works() {
    // --elements is capped at 20000 by the binary (beyond it the Sturm count of K - sigma M
    // loses its precision and the completeness check refuses the stage); the solver must
    // handle the cap (not a speed target: just no hang).
    let case = uniform_tube(200.0, 12.0, 0.35, BeamTheory::EulerBernoulli);
    let s = analyse_ok(&case, 3, Some(20_000));
    assert!(s[0].elements >= 20_000);
    let f1 = cantilever_f1(&case);
    assert!((s[0].modes[0].frequency_hz / f1 - 1.0).abs() < 1e-6);
}

#[test]
fn few_elements_with_many_modes_are_meshed_up_or_refused() {
    let case = uniform_tube(100.0, 8.0, 0.3, BeamTheory::Timoshenko);
    match analyse_case(
        &case,
        ModalOptions {
            modes: 20,
            min_elements: Some(1),
        },
    ) {
        Ok(stages) => assert_eq!(stages[0].check.sturm_count, 20),
        Err(e) => assert!(e.to_string().starts_with("stage `shell`"), "{e}"),
    }
}

#[test]
fn closely_spaced_nodes_work() {
    // A point mass a micrometre above a station, a lining end a micrometre below one.
    let mut case = shell_case(
        &[(0.0, 12.0, 0.4), (50.0, 10.0, 0.3), (100.0, 8.0, 0.2)],
        32e9,
        2500.0,
        BeamTheory::Timoshenko,
    );
    case.point_masses = vec![PointMass {
        rotary_inertia_kg_m2: 0.0,
        z_m: 50.000001,
        mass_kg: 2e4,
        label: "p".into(),
        stages: None,
    }];
    case.linings = vec![Lining {
        from_z_m: 1e-6,
        to_z_m: 99.999999,
        mass: LiningMass::PerLength {
            mass_per_length_kg_m: 3000.0,
        },
    }];
    case.stages[0].lining = true;
    analyse_ok(&case, 5, None);
}
