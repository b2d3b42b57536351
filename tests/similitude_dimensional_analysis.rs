//! Closed-form scale relations of the aeroelastic model (scale k_x = prototype / model) on
//! invented inputs. Source of every relation: data/reference/README.md: published dimensional analysis
//! ("Aeroelastic model similitude": k_h = k_l / k_rho with the same air,
//! k_v = sqrt(k_E k_h / k_l), k_f = k_v / k_l, displacement k_l, strain 1, stress k_E,
//! lining mass per area k_l, log decrement identical, Re not matched: k_l k_v). The mass per
//! length k_l^2, point masses k_l^3 and spring scales k_E k_h k_l^2 / k_E k_h follow from the
//! same conditions (derived in src/similitude/factors.rs) and are checked here by direct
//! computation of the model's masses and by the FE runs in similitude_fe_consistency.rs.

mod common;

use std::path::Path;

use proptest::prelude::*;
use stackwake::case::{BaseSprings, BeamTheory, Lining, LiningMass, ModelSpec, PointMass};
use stackwake::input::parse_case;
use stackwake::section::Annulus;
use stackwake::similitude::{design, ScaleFactors};

/// Relative rounding of a number in the model case file: half a unit in the last of its
/// `SIGNIFICANT_DIGITS` (6) digits, 5e-6, plus a little for the division that reads it back.
const FILE_ROUNDING: f64 = 6e-6;

fn spec(e_pa: f64, rho: f64, k_l: f64) -> ModelSpec {
    ModelSpec {
        length_scale: Some(k_l),
        elastic_modulus_pa: e_pa,
        density_kg_m3: rho,
        poisson_ratio: 0.35,
        min_wall_m: None,
        tunnel_width_m: None,
        tunnel_height_m: None,
        max_blockage: 0.05,
        tunnel_speed_min_m_s: None,
        tunnel_speed_max_m_s: None,
    }
}

proptest! {
    /// data/reference/README.md: published dimensional analysis, same air (k_rho_air = 1).
    #[test]
    fn published_relations_hold(k_l in 1.0f64..1000.0, k_rho in 0.2f64..20.0, k_e in 0.5f64..100.0) {
        let k = ScaleFactors::new(k_l, k_rho, k_e);
        let close = |a: f64, b: f64| (a / b - 1.0).abs() < 1e-12;
        prop_assert!(close(k.wall_thickness * k.density, k.length));
        prop_assert!(close(k.velocity, (k_e * k.wall_thickness / k_l).sqrt()));
        prop_assert!(close(k.frequency, k.velocity / k.length));
        prop_assert!(close(k.displacement, k_l));
        prop_assert_eq!(k.strain, 1.0);
        prop_assert_eq!(k.stress, k_e);
        prop_assert!(close(k.lining_mass_per_area, k_l));
        prop_assert_eq!(k.log_decrement, 1.0);
        prop_assert_eq!(k.air_density, 1.0);
        prop_assert!(close(k.reynolds, k_l * k.velocity));
        // Derived from the mass ratio and the stiffness ratios (src/similitude/factors.rs).
        prop_assert!(close(k.mass_per_length, k_l * k_l));
        prop_assert!(close(k.point_mass, k_l * k_l * k_l));
        prop_assert!(close(k.rotational_stiffness, k_e * k.wall_thickness * k_l * k_l));
        prop_assert!(close(k.lateral_stiffness, k_e * k.wall_thickness));
        // Cauchy number rho_air v^2 / E_eff with E_eff = E t / D (thin shell bending):
        // k_v^2 = k_E k_h / k_l, i.e. the Cauchy number is identical.
        prop_assert!(close(k.velocity * k.velocity, k_e * k.wall_thickness / k_l));
    }
}

/// Worked numbers (invented): concrete 2500 kg/m3, 32 GPa; model plastic 1250 kg/m3,
/// 3.2 GPa; k_l = 100 -> k_rho = 2, k_E = 10, k_h = 50, k_v = sqrt(10 x 50 / 100) = sqrt(5),
/// k_f = sqrt(5) / 100 (data/reference/README.md: published dimensional analysis).
#[test]
fn worked_factors() {
    let k = ScaleFactors::new(100.0, 2500.0 / 1250.0, 32.0 / 3.2);
    assert!((k.wall_thickness - 50.0).abs() < 1e-12);
    assert!((k.velocity - 5f64.sqrt()).abs() < 1e-12);
    assert!((k.frequency - 5f64.sqrt() / 100.0).abs() < 1e-14);
    assert!((k.stress - 10.0).abs() < 1e-12);
    assert_eq!(k.lining_mass_per_area, 100.0);
}

/// The model's own masses, computed from its case file, scale as the similitude requires:
/// shell + lining mass per length k_l^2 in the thin-wall limit, point masses k_l^3 exactly,
/// lining per area k_l exactly, lining per length k_l^2 exactly (data/reference/README.md: published
/// dimensional analysis).
#[test]
fn model_masses_follow_the_mass_ratio() {
    let t = 0.005; // t/D = 5e-4: thin-wall limit
    let mut case = common::shell_case(
        &[(0.0, 10.0, t), (100.0, 10.0, t)],
        30e9,
        2500.0,
        BeamTheory::EulerBernoulli,
    );
    case.linings = vec![
        Lining {
            from_z_m: 0.0,
            to_z_m: 50.0,
            mass: LiningMass::PerArea {
                mass_per_area_kg_m2: 200.0,
            },
        },
        Lining {
            from_z_m: 50.0,
            to_z_m: 100.0,
            mass: LiningMass::PerLength {
                mass_per_length_kg_m: 4000.0,
            },
        },
    ];
    case.point_masses = vec![PointMass {
        rotary_inertia_kg_m2: 0.0,
        z_m: 90.0,
        mass_kg: 20000.0,
        label: "cap".into(),
        stages: None,
    }];
    case.base = Some(BaseSprings {
        rotational_nm_per_rad: Some(5e11),
        lateral_n_per_m: Some(4e9),
    });
    let k_l = 80.0;
    case.model = Some(spec(2.5e9, 1100.0, k_l));
    let d = design(&case, None).expect("plan");
    let k = d.factors;
    let model = parse_case(&d.model.toml, Path::new("."), "model").expect("model case reads back");

    // Shell mass per length: rho pi t (D - t).
    let m_p = 2500.0 * Annulus::new(10.0, t).area_m2();
    let (dm, tm) = model.shell.geometry_at(0.5);
    let m_m = model.shell.density_kg_m3 * Annulus::new(dm, tm).area_m2();
    assert!(
        (m_p / m_m / (k_l * k_l) - 1.0).abs() < 2e-3,
        "{}",
        m_p / m_m / (k_l * k_l)
    );
    // Lining per area: exactly k_l; per length: exactly k_l^2.
    match model.linings[0].mass {
        LiningMass::PerArea {
            mass_per_area_kg_m2,
        } => {
            assert!((200.0 / mass_per_area_kg_m2 / k_l - 1.0).abs() < FILE_ROUNDING)
        }
        other => panic!("{other:?}"),
    }
    let lp = case.linings[0].mass_per_length_kg_m(10.0, t);
    let lm = model.linings[0].mass_per_length_kg_m(dm, tm);
    assert!((lp / lm / (k_l * k_l) - 1.0).abs() < 2e-3);
    let lp = case.linings[1].mass_per_length_kg_m(10.0, t);
    let lm = model.linings[1].mass_per_length_kg_m(dm, tm);
    assert!((lp / lm / (k_l * k_l) - 1.0).abs() < 4.0 * FILE_ROUNDING);
    assert!((20000.0 / model.point_masses[0].mass_kg / k.point_mass - 1.0).abs() < FILE_ROUNDING);
    assert!((model.point_masses[0].z_m * k_l / 90.0 - 1.0).abs() < FILE_ROUNDING);
    let b = model.base.expect("springs");
    assert!(
        (5e11 / b.rotational_nm_per_rad.unwrap() / k.rotational_stiffness - 1.0).abs()
            < FILE_ROUNDING
    );
    assert!((4e9 / b.lateral_n_per_m.unwrap() / k.lateral_stiffness - 1.0).abs() < FILE_ROUNDING);
    // Wind at model scale: speeds / k_v, heights / k_l; log decrement identical.
    assert!(
        (model.wind.unwrap().reference_speed_m_s * k.velocity / 30.0 - 1.0).abs() < FILE_ROUNDING
    );
    assert!((model.wind.unwrap().reference_height_m * k_l / 10.0 - 1.0).abs() < FILE_ROUNDING);
    assert_eq!(model.vortex.log_decrement, case.vortex.log_decrement);
}
