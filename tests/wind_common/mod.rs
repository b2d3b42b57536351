//! Hand-built inputs for the wind tests: a case, a uniform tube and mode shapes, so the wind
//! module can be tested without the FE solver. Data are invented for tests.
#![allow(dead_code)]

use stackwake::case::{
    Arrangement, BeamTheory, Case, Criteria, Group, Profile, Shell, Stage, Station, Vortex,
    VortexMethod, Wind,
};
use stackwake::modal::{CompletenessCheck, Mode, StageModel, StageModes};

/// Uniform wind of `speed` at every height (power law with exponent 0).
pub fn uniform_wind(speed: f64) -> Wind {
    Wind {
        reference_speed_m_s: speed,
        reference_height_m: 10.0,
        profile: Profile::Power { exponent: 0.0 },
        air_density_kg_m3: 1.25,
        kinematic_viscosity_m2_s: 15e-6,
        c_prob_k: 0.2,
        c_prob_n: 0.5,
    }
}

pub fn case(wind: Wind, method: VortexMethod, criteria: Criteria) -> Case {
    Case {
        base_inertia: Default::default(),
        title: "invented test case".into(),
        shell: Shell {
            zones: vec![],
            openings: vec![],
            elastic_modulus_pa: 32e9,
            density_kg_m3: 2500.0,
            poisson_ratio: 0.2,
            beam: BeamTheory::EulerBernoulli,
            stations: vec![
                Station {
                    z_m: 0.0,
                    outer_diameter_m: 4.0,
                    wall_m: 0.3,
                },
                Station {
                    z_m: 80.0,
                    outer_diameter_m: 4.0,
                    wall_m: 0.3,
                },
            ],
        },
        linings: vec![],
        point_masses: vec![],
        base: None,
        stages: vec![stage()],
        wind: Some(wind),
        along_wind: None,
        vortex: Vortex {
            method,
            strouhal: None,
            log_decrement: 0.03,
            damping_ratio: None,
            modes: 3,
            design_life_years: 50.0,
            group: None,
        },
        criteria,
        model: None,
        remedy: None,
        project: Default::default(),
        resistance: None,
        source: None,
    }
}

pub fn group(count: u32, spacing_m: f64) -> Group {
    Group {
        count,
        spacing_m,
        arrangement: Arrangement::InLine,
    }
}

pub fn stage() -> Stage {
    Stage {
        name: "lined".into(),
        lining: true,
        stiffness_factor: 1.0,
        top_z_m: None,
        duration_years: None,
        return_period_years: None,
        log_decrement: None,
    }
}

/// Uniform tube of height h, diameter d, wall t, distributed mass m (kg/m), n_el elements.
pub fn uniform_tube(h: f64, d: f64, t: f64, m: f64, n_el: usize) -> StageModel {
    let z: Vec<f64> = (0..=n_el).map(|i| h * i as f64 / n_el as f64).collect();
    let n = z.len();
    let di = d - 2.0 * t;
    let i = std::f64::consts::PI / 64.0 * (d.powi(4) - di.powi(4));
    StageModel {
        z_m: z,
        outer_diameter_m: vec![d; n],
        wall_m: vec![t; n],
        shell_mass_kg_m: vec![m; n],
        lining_mass_kg_m: vec![0.0; n],
        point_masses: vec![],
        second_moment_m4: vec![i; n],
        element_shell_mass_kg_m: vec![],
        area_m2: vec![],
        section_modulus_m3: vec![],
        sections_below: vec![],
    }
}

/// Mode with Phi = (z/h)^2 (EN 1991-1-4 F.3, from memory) on the model's nodes.
pub fn parabola_mode(model: &StageModel, number: usize, f: f64, m_e: f64) -> Mode {
    let h = model.height_m();
    Mode {
        number,
        frequency_hz: f,
        displacement: model.z_m.iter().map(|z| (z / h).powi(2)).collect(),
        rotation_per_m: model.z_m.iter().map(|z| 2.0 * z / (h * h)).collect(),
        modal_mass_kg: 0.0,
        equivalent_mass_kg_m: m_e,
    }
}

/// Exact Euler-Bernoulli cantilever mode (Blevins, Formulas for Natural Frequency and Mode
/// Shape, table 8-1: lambda_1..5), normalised to 1 at the tip.
pub fn cantilever_mode(model: &StageModel, number: usize, f: f64, m_e: f64) -> Mode {
    const LAMBDA: [f64; 5] = [
        1.875_104_07,
        4.694_091_13,
        7.854_757_44,
        10.995_540_73,
        14.137_168_39,
    ];
    let l = LAMBDA[number - 1];
    let h = model.height_m();
    let s = (l.cosh() + l.cos()) / (l.sinh() + l.sin());
    let w = |x: f64| (l * x).cosh() - (l * x).cos() - s * ((l * x).sinh() - (l * x).sin());
    let dw = |x: f64| l * ((l * x).sinh() + (l * x).sin() - s * ((l * x).cosh() - (l * x).cos()));
    let tip = w(1.0);
    Mode {
        number,
        frequency_hz: f,
        displacement: model.z_m.iter().map(|z| w(z / h) / tip).collect(),
        rotation_per_m: model.z_m.iter().map(|z| dw(z / h) / tip / h).collect(),
        modal_mass_kg: 0.0,
        equivalent_mass_kg_m: m_e,
    }
}

pub fn stage_modes(model: StageModel, modes: Vec<Mode>) -> StageModes {
    let elements = model.z_m.len() - 1;
    StageModes {
        stage: stage(),
        model,
        check: CompletenessCheck {
            sturm_count: modes.len(),
            shift_rad2_s2: 0.0,
            modes_reported: modes.len(),
            max_relative_residual: 0.0,
            iterations: 0,
            sign_changes: vec![],
        },
        modes,
        elements,
    }
}
