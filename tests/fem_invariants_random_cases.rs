//! Invariants of the beam model and solver on random valid stacks (proptest):
//! * K^-1 from the flexibility recursion is the inverse of the assembled banded K, and it is
//!   symmetric (Maxwell-Betti reciprocity);
//! * the modes are M-orthonormal and satisfy the eigen-equation;
//! * frequencies scale as sqrt(E / rho) and as 1 / L for a geometrically similar stack;
//! * adding lining mass never raises a frequency (Rayleigh quotient);
//! * stiffness_factor s scales every frequency by sqrt(s) exactly.
//!
//! Sources: dimensional analysis and Rayleigh's principle (common practice).

mod common;

use proptest::prelude::*;
use stackwake::case::*;
use stackwake::fem::block::{band_times_block, Block};
use stackwake::fem::flexibility::apply_inverse_stiffness;
use stackwake::fem::{solve_stage, BeamModel};
use stackwake::modal::{analyse_stage, ModalOptions};

fn arb_case() -> impl Strategy<Value = Case> {
    (
        60.0f64..250.0,
        6.0f64..20.0,
        0.35f64..0.9,
        0.01f64..0.04,
        0.02f64..0.05,
        prop::bool::ANY,
        prop::option::of((1e9f64..1e12, 1e8f64..1e11)),
        prop::option::of((0.1f64..0.9, 1e3f64..2e5)),
    )
        .prop_map(|(h, d0, taper, t0_ratio, t1_ratio, timo, base, pm)| {
            let d1 = d0 * taper;
            let beam = if timo {
                BeamTheory::Timoshenko
            } else {
                BeamTheory::EulerBernoulli
            };
            let mut case = common::shell_case(
                &[
                    (0.0, d0, t0_ratio * d0),
                    (
                        0.4 * h,
                        0.5 * (d0 + d1),
                        0.5 * (t0_ratio * d0 + t1_ratio * d1),
                    ),
                    (h, d1, t1_ratio * d1),
                ],
                32e9,
                2450.0,
                beam,
            );
            case.base = base.map(|(kr, kl)| BaseSprings {
                rotational_nm_per_rad: Some(kr * 1e3),
                lateral_n_per_m: Some(kl),
            });
            if let Some((frac, kg)) = pm {
                case.point_masses.push(PointMass {
                    rotary_inertia_kg_m2: 0.0,
                    z_m: frac * h,
                    mass_kg: kg,
                    label: "p".into(),
                    stages: None,
                });
            }
            case.linings.push(Lining {
                from_z_m: 0.1 * h,
                to_z_m: h,
                mass: LiningMass::PerArea {
                    mass_per_area_kg_m2: 250.0,
                },
            });
            case
        })
}

fn freqs(case: &Case, lining: bool, factor: f64) -> Vec<f64> {
    let stage = Stage {
        name: "s".into(),
        lining,
        stiffness_factor: factor,
        top_z_m: None,
        duration_years: None,
        return_period_years: None,
        log_decrement: None,
    };
    analyse_stage(
        case,
        &stage,
        ModalOptions {
            modes: 3,
            min_elements: Some(40),
        },
    )
    .unwrap()
    .modes
    .iter()
    .map(|m| m.frequency_hz)
    .collect()
}

/// K^-1 by the recursion against the banded K: componentwise backward error of K u = f and
/// reciprocity (Betti).
fn check_recursion_inverts_the_banded_stiffness(case: &Case, seed: u64) {
    let stage = Stage {
        name: "s".into(),
        lining: true,
        stiffness_factor: 1.0,
        top_z_m: None,
        duration_years: None,
        return_period_years: None,
        log_decrement: None,
    };
    let model = BeamModel::build(case, &stage, Some(12), 3);
    let n = model.dofs();
    // Two deterministic load patterns (zero on removed base dofs).
    let pattern = |step: u64, modulus: u64| -> Vec<f64> {
        (0..n)
            .map(|i| {
                if model.is_free(i) {
                    (((i as u64 * step + seed) % modulus) as f64 - (modulus / 2) as f64) * 1e3
                } else {
                    0.0
                }
            })
            .collect()
    };
    let (f, g) = (pattern(7919, 97), pattern(104729, 89));
    let mut u = vec![0.0; n];
    let mut v = vec![0.0; n];
    apply_inverse_stiffness(&model, &f, &mut u);
    apply_inverse_stiffness(&model, &g, &mut v);
    // K u = f, judged by the componentwise backward error |K u - f|_i / (sum_j |K_ij u_j|
    // + |f_i|) (Higham, Accuracy and Stability of Numerical Algorithms, 2002, sec. 7.2):
    // K is ill-conditioned when a point mass or lining end leaves a very short element
    // next to long ones, so the forward residual against |f| alone is not a measure of
    // the recursion's accuracy, while the backward error must be rounding-sized.
    let mut ku = vec![0.0; n];
    model.stiffness.mul_vec(&u, &mut ku);
    for i in (0..n).filter(|&i| model.is_free(i)) {
        let magnitude: f64 = (i.saturating_sub(5)..n.min(i + 6))
            .map(|j| (model.stiffness.get(i, j) * u[j]).abs())
            .sum::<f64>()
            + f[i].abs();
        assert!(
            (ku[i] - f[i]).abs() <= 1e-12 * magnitude,
            "dof {}: {} vs {} (terms {:e})",
            i,
            ku[i],
            f[i],
            magnitude
        );
    }
    // Reciprocity: g . K^-1 f = f . K^-1 g.
    let a: f64 = g.iter().zip(&u).map(|(x, y)| x * y).sum();
    let b: f64 = f.iter().zip(&v).map(|(x, y)| x * y).sum();
    assert!((a - b).abs() <= 1e-10 * a.abs().max(b.abs()));
}

#[test]
fn recursion_inverts_k_with_a_very_short_element() {
    // A case proptest found: a point mass 1.3 cm above a station leaves a 1.3 cm element
    // between 5 m ones (K's condition number ~1e9); the forward residual against |f| was
    // 5e-6 while the backward error is rounding-sized.
    let mut case = common::shell_case(
        &[(0.0, 6.0, 0.06), (24.0, 4.05, 0.051), (60.0, 2.1, 0.042)],
        32e9,
        2450.0,
        BeamTheory::EulerBernoulli,
    );
    case.point_masses.push(PointMass {
        rotary_inertia_kg_m2: 0.0,
        z_m: 24.012840942622873,
        mass_kg: 1000.0,
        label: "p".into(),
        stages: None,
    });
    case.linings.push(Lining {
        from_z_m: 6.0,
        to_z_m: 60.0,
        mass: LiningMass::PerArea {
            mass_per_area_kg_m2: 250.0,
        },
    });
    case.base = None;
    check_recursion_inverts_the_banded_stiffness(&case, 0);
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 24, ..ProptestConfig::default() })]

    #[test]
    fn flexibility_recursion_inverts_the_banded_stiffness(case in arb_case(), seed in 0u64..1000) {
        check_recursion_inverts_the_banded_stiffness(&case, seed);
    }

    #[test]
    fn modes_are_mass_orthonormal_eigenvectors(case in arb_case()) {
        let stage = Stage::in_service("s", true);
        let (model, sol) = solve_stage(&case, &stage, Some(40), 4).unwrap();
        let mut mphi = Block::zeros(model.dofs(), 4);
        band_times_block(&model.mass, &sol.vectors, &mut mphi);
        let gram = sol.vectors.gram(&mphi);
        for i in 0..4 {
            for j in 0..4 {
                let want = if i == j { 1.0 } else { 0.0 };
                prop_assert!((gram[(i, j)] - want).abs() < 1e-9, "phi^T M phi [{}][{}] = {}", i, j, gram[(i, j)]);
            }
        }
        prop_assert!(sol.max_relative_residual < 1e-7);
        prop_assert_eq!(sol.sturm_count, 4);
    }

    #[test]
    fn frequencies_scale_with_material_and_size(case in arb_case(), a in 0.5f64..3.0, s in 0.3f64..3.0) {
        let f0 = freqs(&case, true, 1.0);
        // E -> a E and rho -> rho / a, lining per area -> / a: f -> a f.
        let mut c1 = case.clone();
        c1.shell.elastic_modulus_pa *= a;
        c1.shell.density_kg_m3 /= a;
        for l in &mut c1.linings {
            if let LiningMass::PerArea { mass_per_area_kg_m2 } = &mut l.mass { *mass_per_area_kg_m2 /= a; }
        }
        for p in &mut c1.point_masses { p.mass_kg /= a; }
        if let Some(b) = &mut c1.base {
            b.rotational_nm_per_rad = b.rotational_nm_per_rad.map(|k| k * a);
            b.lateral_n_per_m = b.lateral_n_per_m.map(|k| k * a);
        }
        let f1 = freqs(&c1, true, 1.0);
        // All lengths x s: masses per length x s^2 (per area x s), point masses x s^3,
        // springs: rotational x s^3, lateral x s: f -> f / s.
        let mut c2 = case.clone();
        for st in &mut c2.shell.stations { st.z_m *= s; st.outer_diameter_m *= s; st.wall_m *= s; }
        for l in &mut c2.linings {
            l.from_z_m *= s; l.to_z_m *= s;
            if let LiningMass::PerArea { mass_per_area_kg_m2 } = &mut l.mass { *mass_per_area_kg_m2 *= s; }
        }
        for p in &mut c2.point_masses { p.z_m *= s; p.mass_kg *= s.powi(3); }
        if let Some(b) = &mut c2.base {
            b.rotational_nm_per_rad = b.rotational_nm_per_rad.map(|k| k * s.powi(3));
            b.lateral_n_per_m = b.lateral_n_per_m.map(|k| k * s);
        }
        let f2 = freqs(&c2, true, 1.0);
        for k in 0..3 {
            prop_assert!((f1[k] / f0[k] - a).abs() < 1e-9 * a, "E/rho scaling mode {}", k + 1);
            prop_assert!((f2[k] * s / f0[k] - 1.0).abs() < 1e-9, "length scaling mode {}", k + 1);
        }
    }

    #[test]
    fn lining_lowers_and_stiffness_factor_scales(case in arb_case(), factor in 0.3f64..1.0) {
        let bare = freqs(&case, false, 1.0);
        let lined = freqs(&case, true, 1.0);
        for k in 0..3 {
            prop_assert!(lined[k] <= bare[k] * (1.0 + 1e-12), "mode {}", k + 1);
        }
        let mut fixed_base = case.clone();
        fixed_base.base = None;
        let f1 = freqs(&fixed_base, true, 1.0);
        let fs = freqs(&fixed_base, true, factor);
        for k in 0..3 {
            prop_assert!((fs[k] / f1[k] - factor.sqrt()).abs() < 1e-9, "mode {}", k + 1);
        }
    }
}
