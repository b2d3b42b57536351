//! Uniform Euler-Bernoulli cantilevers with a tip mass and with a rotational base spring.
//! Source: Karnovsky & Lebed, Formulas for Structural Dynamics (2004), sec. 7.5.3, frequency
//! equation 1 + cos l cosh l + mu l (cos l sinh l - sin l cosh l) = 0 with mu = M / (m L);
//! the rotational spring R = k_theta L / EI gives the same equation with mu = 1 / R. The
//! roots lambda_1 below were computed with scipy from that equation (data/reference/README.md).
//! Model: 60 m tube, D = 4 m, t = 0.2 m, E = 30 GPa, rho = 2500 kg/m3, 400 elements.

mod common;

use stackwake::case::{BaseSprings, BeamTheory, PointMass};

const L: f64 = 60.0;

fn f1_from_lambda(lambda: f64, ei: f64, m: f64) -> f64 {
    lambda * lambda / (2.0 * std::f64::consts::PI * L * L) * (ei / m).sqrt()
}

#[test]
fn tip_mass_ratios_match_the_frequency_equation() {
    let cases = [
        (0.1, 1.722742),
        (0.2, 1.616400),
        (0.5, 1.419964),
        (1.0, 1.247917),
        (2.0, 1.076196),
        (5.0, 0.870021),
        (10.0, 0.735782),
    ];
    for (mu, lambda) in cases {
        let mut case = common::uniform_tube(L, 4.0, 0.2, BeamTheory::EulerBernoulli);
        let (ei, m) = common::tube_ei_m(&case);
        case.point_masses.push(PointMass {
            rotary_inertia_kg_m2: 0.0,
            z_m: L,
            mass_kg: mu * m * L,
            label: "tip".into(),
            stages: None,
        });
        let f = common::frequencies(&case, 3, Some(400));
        let exact = f1_from_lambda(lambda, ei, m);
        // The table roots have 7 significant digits: compare to 2e-6.
        assert!(
            (f[0] - exact).abs() / exact < 2e-6,
            "mu = {mu}: {} vs {exact}",
            f[0]
        );
    }
}

#[test]
fn blevins_tip_mass_ratio_one() {
    // Blevins, Formulas for Natural Frequency and Mode Shape, table 8-8 (from memory):
    // lambda_1 = 1.2479 for M / (m L) = 1.
    let mut case = common::uniform_tube(L, 4.0, 0.2, BeamTheory::EulerBernoulli);
    let (ei, m) = common::tube_ei_m(&case);
    case.point_masses.push(PointMass {
        rotary_inertia_kg_m2: 0.0,
        z_m: L,
        mass_kg: m * L,
        label: "tip".into(),
        stages: None,
    });
    let f = common::frequencies(&case, 3, Some(200));
    let exact = f1_from_lambda(1.2479, ei, m);
    assert!((f[0] - exact).abs() / exact < 1e-4);
}

#[test]
fn rotational_base_spring_matches_the_frequency_equation() {
    for (r, lambda) in [(1.0, 1.247917), (10.0, 1.722742), (100.0, 1.856787)] {
        let mut case = common::uniform_tube(L, 4.0, 0.2, BeamTheory::EulerBernoulli);
        let (ei, m) = common::tube_ei_m(&case);
        case.base = Some(BaseSprings {
            rotational_nm_per_rad: Some(r * ei / L),
            lateral_n_per_m: None,
        });
        let f = common::frequencies(&case, 3, Some(400));
        let exact = f1_from_lambda(lambda, ei, m);
        assert!(
            (f[0] - exact).abs() / exact < 2e-6,
            "R = {r}: {} vs {exact}",
            f[0]
        );
    }
}

#[test]
fn stiff_lateral_spring_approaches_the_fixed_base() {
    // A lateral base spring 1e6 times stiffer than the shell's 3 EI / L^3 changes f1 by
    // less than 1e-5 (common practice: a spring that stiff is a support).
    let fixed = common::uniform_tube(L, 4.0, 0.2, BeamTheory::EulerBernoulli);
    let (ei, _) = common::tube_ei_m(&fixed);
    let mut sprung = fixed.clone();
    sprung.base = Some(BaseSprings {
        rotational_nm_per_rad: None,
        lateral_n_per_m: Some(1e6 * 3.0 * ei / L.powi(3)),
    });
    let a = common::frequencies(&fixed, 3, Some(60));
    let b = common::frequencies(&sprung, 3, Some(60));
    assert!(b[0] < a[0] && (a[0] - b[0]) / a[0] < 1e-5);
}

#[test]
fn a_tip_mass_listed_for_one_stage_is_in_that_stage_only() {
    // `point_mass.stages`: the same shell in two stages, the tip mass (mu = 1) present only in
    // the first. Stage "rig": Karnovsky & Lebed sec. 7.5.3, lambda_1 = 1.247917 (scipy root);
    // stage "bare": the plain cantilever, lambda_1 = 1.87510407 (Blevins table 8-1).
    let mut case = common::uniform_tube(L, 4.0, 0.2, BeamTheory::EulerBernoulli);
    let (ei, m) = common::tube_ei_m(&case);
    let bare = stackwake::case::Stage::in_service("bare", false);
    let rig = stackwake::case::Stage::in_service("rig", false);
    case.stages = vec![rig, bare];
    case.point_masses.push(PointMass {
        z_m: L,
        mass_kg: m * L,
        label: "climbing rig".into(),
        stages: Some(vec!["rig".into()]),
        rotary_inertia_kg_m2: 0.0,
    });
    let stages = stackwake::modal::analyse_case(
        &case,
        stackwake::modal::ModalOptions {
            modes: 3,
            min_elements: Some(400),
        },
    )
    .unwrap();
    for (s, lambda) in [(&stages[0], 1.247917), (&stages[1], 1.875_104_07)] {
        let exact = f1_from_lambda(lambda, ei, m);
        let f = s.modes[0].frequency_hz;
        // Same tolerance as the tip-mass table above (7 significant digits).
        assert!(
            (f - exact).abs() / exact < 2e-6,
            "stage {}: {f} vs {exact}",
            s.stage.name
        );
    }
}
