//! Invariants of the EN 1991-1-4 Annex E approach 1 formula (E.7) and of cantilever statics,
//! checked on seeded random inputs (proptest):
//! - y ~ 1/Sc: doubling delta_s halves the amplitude when L_j does not change ((E.7));
//! - y ~ c_lat when L_j does not change ((E.7));
//! - v_crit = b n / St scales with n (E.1.3.1);
//! - base moment = int F_w(s) s ds + sum P_k z_k (statics of a cantilever), checked against
//!   an independent midpoint-rule integral on a fine grid.

mod wind_common;
use wind_common as common;

use proptest::prelude::*;
use stackwake::case::{Criteria, VortexMethod};
use stackwake::wind::{self, approach1, ModeShape};

proptest! {
    #![proptest_config(ProptestConfig::with_cases(64))]

    #[test]
    fn doubling_damping_halves_amplitude(
        b in 2.0f64..20.0, st in 0.1f64..0.25, sc in 5.0f64..80.0, x in 0.1f64..1.0, c in 0.1f64..0.8,
    ) {
        let h = 6.0 * b / x;
        let p = approach1::Approach1Params { diameter_m: b, strouhal: st, scruton: sc, k: 0.13 };
        let p2 = approach1::Approach1Params { scruton: 2.0 * sc, ..p };
        let kw = |l: f64| approach1::kw_cantilever_table(l, h);
        let a = approach1::amplitude(&p, kw, |_| c);
        let a2 = approach1::amplitude(&p2, kw, |_| c);
        prop_assume!(a.correlation_length_m == a2.correlation_length_m);
        prop_assert!((a2.y_max_m / a.y_max_m - 0.5).abs() < 1e-12);
    }

    #[test]
    fn amplitude_scales_with_c_lat(
        b in 2.0f64..20.0, sc in 5.0f64..80.0, x in 0.1f64..1.0, c in 0.05f64..0.4, f in 1.1f64..3.0,
    ) {
        let h = 6.0 * b / x;
        let p = approach1::Approach1Params { diameter_m: b, strouhal: 0.18, scruton: sc, k: 0.13 };
        let kw = |l: f64| approach1::kw_cantilever_table(l, h);
        let a = approach1::amplitude(&p, kw, |_| c);
        let a2 = approach1::amplitude(&p, kw, |_| f * c);
        prop_assume!(a.correlation_length_m == a2.correlation_length_m);
        prop_assert!((a2.y_max_m / a.y_max_m - f).abs() < 1e-10);
    }

    #[test]
    fn critical_speed_scales_with_frequency(n in 0.05f64..3.0, k in 1.1f64..4.0) {
        let model = common::uniform_tube(80.0, 4.0, 0.3, 12000.0, 20);
        let case = common::case(common::uniform_wind(30.0), VortexMethod::En1991E1, Criteria::default());
        let r1 = wind::check_mode(&case, &stackwake::case::Stage::in_service("s", true), &model, &common::parabola_mode(&model, 1, n, 12000.0)).unwrap();
        let r2 = wind::check_mode(&case, &stackwake::case::Stage::in_service("s", true), &model, &common::parabola_mode(&model, 1, k * n, 12000.0)).unwrap();
        prop_assert!((r2.critical_speed_m_s / r1.critical_speed_m_s - k).abs() < 1e-12);
    }

    #[test]
    fn base_moment_is_integral_of_inertia_force_times_lever_arm(
        m0 in 5000.0f64..30000.0, m1 in 2000.0f64..20000.0, lining in 0.0f64..8000.0,
        from in 5.0f64..40.0, tip_mass in 0.0f64..80000.0, mode_no in 1usize..4,
    ) {
        // Tapered invented tube with a lining zone from node `k0` up and a tip point mass.
        let n_el = 40;
        let mut model = common::uniform_tube(80.0, 4.0, 0.3, 1.0, n_el);
        let k0 = (from / 2.0).round() as usize;
        for i in 0..=n_el {
            let t = i as f64 / n_el as f64;
            model.shell_mass_kg_m[i] = m0 + (m1 - m0) * t;
            model.lining_mass_kg_m[i] = if i >= k0 { lining } else { 0.0 };
        }
        model.point_masses = vec![(n_el, tip_mass)];
        let mode = common::cantilever_mode(&model, mode_no, 0.4 * mode_no as f64, 10000.0);
        let case = common::case(common::uniform_wind(60.0), VortexMethod::En1991E1, Criteria::default());
        let r = wind::check_mode(&case, &stackwake::case::Stage::in_service("s", true), &model, &mode).unwrap();
        prop_assume!(!r.loads.is_empty());
        let y = r.approach1.as_ref().unwrap().y_max_m;
        let w2 = (2.0 * std::f64::consts::PI * mode.frequency_hz).powi(2);
        // independent midpoint rule, 8000 strips, piecewise mass from the nodal data
        let shape = ModeShape::from_mode(&model, &mode);
        let strips = 8000;
        let dz = 80.0 / strips as f64;
        let z_lining = model.z_m[k0];
        let mut m_base = 0.0;
        // Sum of |contributions|: higher modes' base moments cancel between the positive and
        // negative lobes, so the tolerance is relative to the size of the terms.
        let mut m_abs = 0.0;
        for s in 0..strips {
            let z = (s as f64 + 0.5) * dz;
            let mass = m0 + (m1 - m0) * z / 80.0 + if z > z_lining { lining } else { 0.0 };
            let term = mass * w2 * shape.value_at(z) * y * z * dz;
            m_base += term;
            m_abs += term.abs();
        }
        let tip = tip_mass * w2 * mode.displacement[n_el] * y * 80.0;
        m_base += tip;
        m_abs += tip.abs();
        let got = r.loads[0].moment_nm;
        prop_assert!((got - m_base).abs() <= 1e-6 * m_abs.max(1.0), "{got} vs {m_base} (terms {m_abs})");
        prop_assert_eq!(got, r.approach1.as_ref().unwrap().base_moment_nm);
        // stress = M / (I / (D/2)) of the uncracked annulus
        let w = model.second_moment_m4[0] / 2.0;
        prop_assert!((r.loads[0].stress_pa - got / w).abs() < 1e-9 * got.abs().max(1.0));
    }
}
