//! GB 50009-2012 8.5.3 and Appendix H.1 (a comparison method; H.1.1 and Table H.1.1 checked
//! against a published copy of the code, the 8.5.3 constants from memory):
//! Re = 69000 v D, St = 0.2, transcritical resonance load
//! w_Lk,j = |lambda_j| v_cr^2 phi_j(z) / (12800 zeta_j) kN/m2, lambda_j from Table H.1.1.

mod wind_common;
use wind_common as common;

use stackwake::case::{Criteria, VortexMethod};
use stackwake::wind::{self, gb50009, ModeShape};

#[test]
fn table_h11_rows_agree_with_their_defining_integral() {
    // lambda_j = int_H1^H phi / int_0^H phi^2 for the uniform Euler-Bernoulli cantilever
    // (Blevins table 8-1 shapes) is within 0.06 of the tower rows of GB 50009-2012 Table H.1.1
    // at every tabulated H1/H: the table means that integral.
    let model = common::uniform_tube(100.0, 5.0, 0.3, 1.0, 200);
    for mode_no in 1..=3 {
        let mode = common::cantilever_mode(&model, mode_no, 1.0, 1.0);
        let shape = ModeShape::from_mode(&model, &mode);
        for i in 0..=10 {
            let x = i as f64 / 10.0;
            let from_shape = gb50009::lambda_from_shape(&shape, 100.0 * x).unwrap();
            let table = gb50009::lambda_table(mode_no, x).unwrap();
            assert!(
                (from_shape.abs() - table.abs()).abs() < 0.06,
                "mode {mode_no} H1/H {x}: shape {from_shape}, table {table}"
            );
        }
    }
}

#[test]
fn table_h11_mode_4_row() {
    // GB 50009-2012 Table H.1.1, towers, mode 4: 0.30 at H1/H = 0, -0.23 at 0.4, 0.16 at 0.6,
    // and halfway between 0.1 (0.33) and 0.2 (0.02).
    assert_eq!(gb50009::lambda_table(4, 0.0), Some(0.30));
    assert!((gb50009::lambda_table(4, 0.4).unwrap() + 0.23).abs() < 1e-12);
    assert!((gb50009::lambda_table(4, 0.6).unwrap() - 0.16).abs() < 1e-12);
    assert!((gb50009::lambda_table(4, 0.15).unwrap() - 0.175).abs() < 1e-12);
    assert_eq!(gb50009::lambda_table(5, 0.5), None);
}

#[test]
fn transcritical_load_and_tip_amplitude() {
    // Invented uniform tube, D = 8 m, n = 0.5 Hz: v_cr = 8 * 0.5 / 0.2 = 20 m/s,
    // Re = 69000 * 20 * 8 = 1.104e7 (transcritical). Uniform wind 30 m/s: 1.2 v_H > v_cr from
    // the ground, H1 = 0, lambda_1 = 1.56 (GB 50009-2012 Table H.1.1).
    let m = 20000.0;
    let model = common::uniform_tube(80.0, 8.0, 0.4, m, 40);
    let mode = common::cantilever_mode(&model, 1, 0.5, m);
    let case = common::case(
        common::uniform_wind(30.0),
        VortexMethod::Gb50009H1,
        Criteria::default(),
    );
    let r = wind::check_mode(&case, "s", &model, &mode);
    let g = &r.gb50009;
    assert!((g.critical_speed_m_s - 20.0).abs() < 1e-12);
    assert!((g.reynolds - 1.104e7).abs() < 1e-3);
    assert_eq!(g.regime, gb50009::Regime::Transcritical);
    assert!(g.resonance);
    assert!(g.lock_in_start_m.unwrap() < 1e-9);
    assert_eq!(g.lambda_used, Some(1.56));
    let zeta = 0.03 / (2.0 * std::f64::consts::PI);
    assert!((g.damping_ratio - zeta).abs() < 1e-15);
    // Top pressure 1.56 * 400 / (12.8 zeta) Pa; line load x D (kN/m2 -> Pa conversion).
    let p_top = 1.56 * 400.0 / (12.8 * zeta) * 8.0;
    let top = r.loads.last().unwrap();
    assert!((top.line_force_n_m - p_top).abs() < 1e-6 * p_top);
    // Modal response of p = c phi on a uniform tube: q = c int phi^2 / (w^2 m int phi^2),
    // tip = p_top / (w^2 m) (our derivation; see gb50009 module doc).
    let w2 = std::f64::consts::PI.powi(2);
    assert!((g.tip_amplitude_m.unwrap() - p_top / (w2 * m)).abs() < 1e-9 * p_top / (w2 * m));
    assert_eq!(r.governing, VortexMethod::Gb50009H1);
    assert_eq!(r.row().tip_amplitude_m, g.tip_amplitude_m);
    assert_eq!(r.row().fatigue_cycles, None);
}

#[test]
fn supercritical_is_not_a_resonance_and_subcritical_lock_in_is_flagged() {
    // b = 4, n = 0.5: v_cr = 10, Re = 2.76e6 (supercritical): GB computes no load.
    let model = common::uniform_tube(80.0, 4.0, 0.3, 12000.0, 20);
    let mode = common::parabola_mode(&model, 1, 0.5, 12000.0);
    let crit = Criteria {
        tip_amplitude_m: Some(1.0),
        ..Criteria::default()
    };
    let case = common::case(common::uniform_wind(30.0), VortexMethod::Gb50009H1, crit);
    let r = wind::check_mode(&case, "s", &model, &mode);
    assert_eq!(r.gb50009.regime, gb50009::Regime::Supercritical);
    assert!(!r.gb50009.resonance && r.gb50009.tip_amplitude_m.is_none());
    assert_eq!(r.verdict.to_string(), "clear");
    // small tube, n = 0.5, D = 0.5: v_cr = 1.25, Re = 43125 (subcritical) with v_H = 30.
    let small = common::uniform_tube(20.0, 0.5, 0.05, 200.0, 20);
    let mode = common::parabola_mode(&small, 1, 0.5, 200.0);
    let r = wind::check_mode(&case, "s", &small, &mode);
    assert!(r.gb50009.subcritical_lock_in);
    assert!(r
        .verdict
        .to_string()
        .starts_with("exceeds: GB 50009 8.5.3 subcritical lock-in"));
}
