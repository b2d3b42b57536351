//! N_Ed from self-weight equals g times the sum of the masses above z, per stage (statics of
//! a cantilever under its own weight; common practice), and the utilisation scales linearly
//! with the load factor (M_Rd does not depend on the action).
//!
//! Model: tapered shell 0-120 m (D 12 -> 8 m, t 0.4 -> 0.25 m), lining 10-120 m of
//! 3000 kg/m, point masses 20 t at 60 m and 15 t at 120 m; stages "shell only" (no lining)
//! and "lined". The reference masses are computed here from the stations and the case, with
//! no library code: the shell mass per metre rho A(z) is integrated with Simpson's rule on a
//! fine grid (A is quadratic in z between stations, so Simpson is exact), whereas the beam
//! model carries mass linear between its nodes. The tolerance 2e-3 relative covers that
//! linearisation on the default mesh.

mod common;

use stackwake::case::{
    BeamTheory, DesignFactors, Lining, LiningMass, PointMass, ReinforcementZone, ResistanceSpec,
    Stage,
};
use stackwake::modal::{analyse_case, ModalOptions};
use stackwake::resistance::along_height::{check_stage, node_resistances, ActionCurve};
use stackwake::resistance::axial::{self_weight_n, GRAVITY_M_S2};

fn case() -> stackwake::case::Case {
    let mut c = common::shell_case(
        &[(0.0, 12.0, 0.40), (120.0, 8.0, 0.25)],
        32e9,
        2500.0,
        BeamTheory::Timoshenko,
    );
    c.linings = vec![Lining {
        from_z_m: 10.0,
        to_z_m: 120.0,
        mass: LiningMass::PerLength {
            mass_per_length_kg_m: 3000.0,
        },
    }];
    c.point_masses = vec![
        PointMass {
            z_m: 60.0,
            mass_kg: 20e3,
            label: "platform".into(),
            stages: None,
            rotary_inertia_kg_m2: 0.0,
        },
        PointMass {
            z_m: 120.0,
            mass_kg: 15e3,
            label: "cap".into(),
            stages: None,
            rotary_inertia_kg_m2: 0.0,
        },
    ];
    c.stages = vec![
        Stage {
            name: "shell only".into(),
            lining: false,
            stiffness_factor: 1.0,
            top_z_m: None,
            duration_years: None,
            return_period_years: None,
            log_decrement: None,
        },
        Stage {
            name: "lined".into(),
            lining: true,
            stiffness_factor: 1.0,
            top_z_m: None,
            duration_years: None,
            return_period_years: None,
            log_decrement: None,
        },
    ];
    c.resistance = Some(ResistanceSpec {
        concrete_strength_pa: 40e6,
        steel_strength_pa: 500e6,
        steel_modulus_pa: 200e9,
        zones: vec![ReinforcementZone {
            from_z_m: 0.0,
            to_z_m: 120.0,
            outer_ratio: 0.003,
            inner_ratio: 0.002,
            outer_cover_m: 0.05,
            inner_cover_m: 0.05,
        }],
        factors: DesignFactors::default(),
        concrete_zones: Vec::new(),
        openings: Vec::new(),
    });
    c
}

/// Mass above z by hand: shell (Simpson), lining, point masses at or above z.
fn mass_above(z: f64, lined: bool) -> f64 {
    let area = |s: f64| {
        let d = 12.0 - 4.0 * s / 120.0;
        let t = 0.40 - 0.15 * s / 120.0;
        std::f64::consts::PI / 4.0 * (d * d - (d - 2.0 * t).powi(2))
    };
    let n = 2000;
    let h = (120.0 - z) / n as f64;
    let mut simpson = area(z) + area(120.0);
    for k in 1..n {
        simpson += area(z + k as f64 * h) * if k % 2 == 1 { 4.0 } else { 2.0 };
    }
    let shell = 2500.0 * simpson * h / 3.0;
    let lining = if lined {
        3000.0 * (120.0 - z.max(10.0))
    } else {
        0.0
    };
    let points: f64 = [(60.0, 20e3), (120.0, 15e3)]
        .iter()
        .filter(|(zp, _)| *zp >= z - 1e-9)
        .map(|(_, m)| m)
        .sum();
    shell + lining + points
}

#[test]
fn self_weight_is_g_times_the_mass_above() {
    let c = case();
    let stages = analyse_case(
        &c,
        ModalOptions {
            modes: 1,
            min_elements: None,
        },
    )
    .unwrap();
    for sm in &stages {
        let n = self_weight_n(&sm.model);
        for (i, &z) in sm.model.z_m.iter().enumerate() {
            let exact = GRAVITY_M_S2 * mass_above(z, sm.stage.lining);
            assert!(
                (n[i] - exact).abs() / exact < 2e-3,
                "{} z = {z}: {} vs {exact}",
                sm.stage.name,
                n[i]
            );
        }
        // N_Ed reported is gamma_G,inf or gamma_G,sup times N_G.
        let spec = c.resistance.as_ref().unwrap();
        for (nd, &ng) in node_resistances(spec, &sm.model).unwrap().iter().zip(&n) {
            assert!(nd.gamma_g == 1.0 || nd.gamma_g == 1.35);
            assert!((nd.axial_force_n - nd.gamma_g * ng).abs() <= 1e-9 * ng);
        }
    }
}

#[test]
fn utilisation_scales_linearly_with_the_load_factor() {
    let c = case();
    let stages = analyse_case(
        &c,
        ModalOptions {
            modes: 1,
            min_elements: None,
        },
    )
    .unwrap();
    let sm = &stages[1];
    let spec = c.resistance.as_ref().unwrap();
    let curve = |f: f64| ActionCurve {
        name: "test".into(),
        load_factor: f,
        factor_source: "test".into(),
        moment_nm: sm
            .model
            .z_m
            .iter()
            .map(|&z| (z, 1e6 * (120.0 - z)))
            .collect(),
    };
    let a = check_stage("lined", spec, &sm.model, 32e9, vec![curve(1.0)], &[]).unwrap();
    let b = check_stage("lined", spec, &sm.model, 32e9, vec![curve(2.5)], &[]).unwrap();
    for (ra, rb) in a.rows.iter().zip(&b.rows) {
        assert!((rb.utilisation - 2.5 * ra.utilisation).abs() <= 1e-12 * rb.utilisation.max(1e-30));
    }
}
