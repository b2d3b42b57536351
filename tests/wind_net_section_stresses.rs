//! Stresses at opening levels and wall steps use the section that carries them: at a node
//! inside an opening sigma = M / W_net with W_net = I_min / extreme fibre of the net section
//! (closed-form annular-sector integrals, `section::opening`), and where the section jumps
//! (a wall step, an opening limit) the weaker side's modulus (the moment is continuous, the
//! stress is not; common practice). Beam bending stress sigma = M / W (any mechanics text).
//! Tolerance 1e-12 relative: the same numbers through two routes.

mod common;

use stackwake::case::{BeamTheory, Opening, Station};
use stackwake::section::opening::{net_section, Cut};
use stackwake::section::Annulus;
use stackwake::wind::loads::inertia_loads;
use stackwake::wind::shape::ModeShape;

#[test]
fn stresses_use_the_net_section_and_the_weaker_side() {
    let mut case = common::shell_case(
        &[(0.0, 6.0, 0.3), (60.0, 6.0, 0.3)],
        32e9,
        2500.0,
        BeamTheory::Timoshenko,
    );
    case.shell.stations = vec![
        Station {
            z_m: 0.0,
            outer_diameter_m: 6.0,
            wall_m: 0.30,
        },
        Station {
            z_m: 30.0,
            outer_diameter_m: 6.0,
            wall_m: 0.30,
        },
        Station {
            z_m: 30.0,
            outer_diameter_m: 6.0,
            wall_m: 0.20,
        },
        Station {
            z_m: 60.0,
            outer_diameter_m: 6.0,
            wall_m: 0.20,
        },
    ];
    case.shell.openings = vec![Opening {
        from_z_m: 5.0,
        to_z_m: 15.0,
        width_m: 2.5,
        azimuth_rad: 0.0,
        label: "flue inlet".into(),
    }];
    let stage = case.stages[0].clone();
    let r = stackwake::modal::analyse_stage(
        &case,
        &stage,
        stackwake::modal::ModalOptions {
            modes: 1,
            min_elements: Some(60),
        },
    )
    .unwrap();
    let m = &r.model;
    let mode = &r.modes[0];
    let shape = ModeShape::from_mode(m, mode);
    let loads = inertia_loads(m, &shape, mode.frequency_hz, 0.1);
    let node = |z: f64| m.z_m.iter().position(|&x| (x - z).abs() < 1e-9).unwrap();
    let w_net = net_section(&Annulus::new(6.0, 0.3), &[Cut::new(2.5, 0.0, 6.0).unwrap()])
        .unwrap()
        .section_modulus_m3();
    let w_thick = Annulus::new(6.0, 0.3).section_modulus_m3();
    let w_thin = Annulus::new(6.0, 0.2).section_modulus_m3();
    let rel = |a: f64, b: f64| (a - b).abs() / b.abs();
    // Inside the opening, and at its limits (the weaker side is the net one).
    for z in [10.0, 5.0, 15.0] {
        let i = node(z);
        assert!(
            rel(loads[i].stress_pa, loads[i].moment_nm / w_net) < 1e-12,
            "z = {z}"
        );
    }
    // At the wall step the thinner wall above governs.
    let i = node(30.0);
    assert!(rel(loads[i].stress_pa, loads[i].moment_nm / w_thin) < 1e-12);
    // Elsewhere the gross annulus.
    let i = node(20.0);
    assert!(rel(loads[i].stress_pa, loads[i].moment_nm / w_thick) < 1e-12);
    // The net section is weaker than the gross one (the opening costs stiffness and strength).
    assert!(w_net < w_thick);
}
