//! The solver stays exact on fine meshes: frequencies at 20 000 elements equal those at 200
//! elements to 1e-9 relative (the discretisation error at 200 Hermite elements is below that
//! for the lowest modes; h^4 convergence is common practice), on a tapered Timoshenko shell
//! with lining, platforms and base springs.

mod common;

use stackwake::case::*;
use stackwake::modal::{analyse_stage, ModalOptions};

fn tapered_case() -> Case {
    let mut case = common::shell_case(
        &[(0.0, 16.0, 0.55), (60.0, 13.0, 0.40), (180.0, 9.0, 0.22)],
        32e9,
        2500.0,
        BeamTheory::Timoshenko,
    );
    case.linings.push(Lining {
        from_z_m: 8.0,
        to_z_m: 180.0,
        mass: LiningMass::PerArea {
            mass_per_area_kg_m2: 300.0,
        },
    });
    case.point_masses.push(PointMass {
        rotary_inertia_kg_m2: 0.0,
        z_m: 150.0,
        mass_kg: 30000.0,
        label: "p".into(),
        stages: None,
    });
    case.base = Some(BaseSprings {
        rotational_nm_per_rad: Some(800e9),
        lateral_n_per_m: Some(5e9),
    });
    case.stages[0].lining = true;
    case
}

#[test]
fn twenty_thousand_elements_equal_two_hundred_to_1e9() {
    let case = tapered_case();
    let stage = case.stages[0].clone();
    let coarse = analyse_stage(
        &case,
        &stage,
        ModalOptions {
            modes: 3,
            min_elements: Some(200),
        },
    )
    .unwrap();
    let fine = analyse_stage(
        &case,
        &stage,
        ModalOptions {
            modes: 3,
            min_elements: Some(20_000),
        },
    )
    .unwrap();
    for (a, b) in coarse.modes.iter().zip(&fine.modes) {
        let rel = (a.frequency_hz - b.frequency_hz).abs() / b.frequency_hz;
        assert!(
            rel < 1e-9,
            "mode {}: {} vs {} ({rel:.2e})",
            a.number,
            a.frequency_hz,
            b.frequency_hz
        );
    }
    assert_eq!(fine.check.sturm_count, 3);
}

#[test]
fn euler_bernoulli_on_a_rigid_base_ten_modes_at_twenty_thousand_elements() {
    // The other branches of the fine-mesh path: no shear compliance, removed base dofs, ten
    // modes (a 12-column block). Same 1e-9 criterion.
    let mut case = tapered_case();
    case.shell.beam = BeamTheory::EulerBernoulli;
    case.base = None;
    let stage = case.stages[0].clone();
    let run = |elements| {
        analyse_stage(
            &case,
            &stage,
            ModalOptions {
                modes: 10,
                min_elements: Some(elements),
            },
        )
        .unwrap()
    };
    let (coarse, fine) = (run(300), run(20_000));
    for (a, b) in coarse.modes.iter().zip(&fine.modes) {
        let rel = (a.frequency_hz - b.frequency_hz).abs() / b.frequency_hz;
        assert!(rel < 1e-9, "mode {}: {rel:.2e}", a.number);
    }
    assert_eq!(fine.check.sturm_count, 10);
}

#[test]
fn frequencies_converge_monotonically_from_above() {
    // A consistent-mass conforming element gives upper bounds that decrease with refinement
    // (Rayleigh-Ritz property; common practice).
    let case = tapered_case();
    let stage = case.stages[0].clone();
    let mut last = [f64::INFINITY; 3];
    for n in [8, 16, 32, 64] {
        let r = analyse_stage(
            &case,
            &stage,
            ModalOptions {
                modes: 3,
                min_elements: Some(n),
            },
        )
        .unwrap();
        for (k, m) in r.modes.iter().enumerate() {
            assert!(
                m.frequency_hz <= last[k] * (1.0 + 1e-12),
                "n={n} mode {}",
                k + 1
            );
            last[k] = m.frequency_hz;
        }
    }
}
