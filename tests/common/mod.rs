//! Shared builders for integration tests: cases assembled directly as validated types, so the
//! engineering checks do not depend on the case-file reader.
#![allow(dead_code)]

use stackwake::case::*;

/// A shell from (z, D, t) stations with default everything else: no lining, no point mass,
/// fixed base, one stage "shell", E in Pa.
pub fn shell_case(
    stations: &[(f64, f64, f64)],
    elastic_modulus_pa: f64,
    density_kg_m3: f64,
    beam: BeamTheory,
) -> Case {
    Case {
        base_inertia: Default::default(),
        title: "test".into(),
        shell: Shell {
            zones: vec![],
            openings: vec![],
            elastic_modulus_pa,
            density_kg_m3,
            poisson_ratio: 0.2,
            beam,
            stations: stations
                .iter()
                .map(|&(z_m, outer_diameter_m, wall_m)| Station {
                    z_m,
                    outer_diameter_m,
                    wall_m,
                })
                .collect(),
        },
        linings: vec![],
        point_masses: vec![],
        base: None,
        stages: vec![Stage {
            name: "shell".into(),
            lining: false,
            stiffness_factor: 1.0,
            top_z_m: None,
            duration_years: None,
            return_period_years: None,
            log_decrement: None,
        }],
        wind: Some(Wind {
            reference_speed_m_s: 30.0,
            reference_height_m: 10.0,
            profile: Profile::Power { exponent: 0.16 },
            air_density_kg_m3: 1.25,
            kinematic_viscosity_m2_s: 1.5e-5,
            c_prob_k: 0.2,
            c_prob_n: 0.5,
        }),
        along_wind: None,
        vortex: Vortex {
            method: VortexMethod::En1991E1,
            strouhal: None,
            log_decrement: 0.03,
            damping_ratio: None,
            modes: 3,
            design_life_years: 50.0,
            group: None,
        },
        criteria: Criteria::default(),
        model: None,
        remedy: None,
        project: Default::default(),
        resistance: None,
        source: None,
    }
}

/// Uniform thin tube of height `h_m`, diameter `d_m`, wall `t_m`.
pub fn uniform_tube(h_m: f64, d_m: f64, t_m: f64, beam: BeamTheory) -> Case {
    shell_case(&[(0.0, d_m, t_m), (h_m, d_m, t_m)], 30e9, 2500.0, beam)
}

/// Bending stiffness and mass per length of a uniform tube case.
pub fn tube_ei_m(case: &Case) -> (f64, f64) {
    let s = stackwake::section::Annulus::new(
        case.shell.stations[0].outer_diameter_m,
        case.shell.stations[0].wall_m,
    );
    (
        case.shell.elastic_modulus_pa * s.second_moment_m4(),
        case.shell.density_kg_m3 * s.area_m2(),
    )
}

pub fn frequencies(case: &Case, modes: usize, elements: Option<usize>) -> Vec<f64> {
    let stage = case.stages[0].clone();
    let r = stackwake::modal::analyse_stage(
        case,
        &stage,
        stackwake::modal::ModalOptions {
            modes,
            min_elements: elements,
        },
    )
    .expect("modal analysis");
    r.modes.iter().map(|m| m.frequency_hz).collect()
}
