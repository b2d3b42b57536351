//! Modal and equivalent masses of a uniform Euler-Bernoulli cantilever.
//! Sources: Blevins, Formulas for Natural Frequency and Mode Shape (1979), table 8-1: with the
//! tip displacement normalised to 2, int_0^L phi^2 dx = L for every cantilever mode, so with
//! the tip (the largest displacement) normalised to 1 the generalised mass is m L / 4;
//! EN 1991-1-4 F.14 (from memory): m_e = int m Phi^2 ds / int Phi^2 ds, which equals m for a
//! uniform mass distribution, and adds M Phi(z)^2 / int Phi^2 for a point mass M (common
//! practice).

mod common;

use stackwake::case::{BeamTheory, PointMass};
use stackwake::modal::{analyse_stage, ModalOptions};

#[test]
fn uniform_cantilever_modal_mass_is_a_quarter_of_the_total() {
    let case = common::uniform_tube(90.0, 5.0, 0.25, BeamTheory::EulerBernoulli);
    let (_, m) = common::tube_ei_m(&case);
    let r = analyse_stage(
        &case,
        &case.stages[0],
        ModalOptions {
            modes: 5,
            min_elements: Some(200),
        },
    )
    .unwrap();
    for mode in &r.modes {
        let rel = (mode.modal_mass_kg - m * 90.0 / 4.0).abs() / (m * 90.0 / 4.0);
        assert!(rel < 1e-8, "mode {}: {}", mode.number, mode.modal_mass_kg);
        assert!(
            (mode.equivalent_mass_kg_m - m).abs() / m < 1e-10,
            "m_e mode {}",
            mode.number
        );
        // The tip is the largest displacement and is normalised to +1.
        assert!((mode.displacement.last().unwrap() - 1.0).abs() < 1e-12);
    }
    // k - 1 sign changes for mode k (oscillation property of cantilever modes).
    assert_eq!(r.check.sign_changes, vec![0, 1, 2, 3, 4]);
}

#[test]
fn tip_mass_enters_the_equivalent_mass() {
    let mut case = common::uniform_tube(90.0, 5.0, 0.25, BeamTheory::EulerBernoulli);
    let (_, m) = common::tube_ei_m(&case);
    case.point_masses.push(PointMass {
        rotary_inertia_kg_m2: 0.0,
        z_m: 90.0,
        mass_kg: 0.3 * m * 90.0,
        label: "cap".into(),
        stages: None,
    });
    let r = analyse_stage(
        &case,
        &case.stages[0],
        ModalOptions {
            modes: 1,
            min_elements: Some(200),
        },
    )
    .unwrap();
    let mode = &r.modes[0];
    // int Phi^2 dz by the trapezoid rule on the fine nodal shape.
    let z = &r.model.z_m;
    let w = &mode.displacement;
    let int_phi2: f64 = (1..z.len())
        .map(|i| 0.5 * (z[i] - z[i - 1]) * (w[i] * w[i] + w[i - 1] * w[i - 1]))
        .sum();
    let expected = m + 0.3 * m * 90.0 * 1.0 / int_phi2;
    assert!((mode.equivalent_mass_kg_m - expected).abs() / expected < 1e-4);
}
