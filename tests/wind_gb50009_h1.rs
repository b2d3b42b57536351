//! GB 50009-2012 8.5.3 and Appendix H.1 (a comparison method; 8.5.3, H.1.1 and Table H.1.1
//! checked against a published copy of the code, public copy `longyu8101/GB50009`,
//! chapter 8 and Appendix H):
//! Re = 69000 v D, St = 0.2, transcritical resonance load
//! w_Lk,j = |lambda_j| v_cr^2 phi_j(z) / (12800 zeta_j) kN/m2, lambda_j from Table H.1.1,
//! zeta_1 = 0.05 for concrete (H.1.1), subcritical lock-in: measures or v_cr >= 15 m/s
//! (8.5.3(1)).

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
    let r = wind::check_mode(
        &case,
        &stackwake::case::Stage::in_service("s", true),
        &model,
        &mode,
    )
    .unwrap();
    let g = &r.gb50009;
    assert!((g.critical_speed_m_s - 20.0).abs() < 1e-12);
    assert!((g.reynolds - 1.104e7).abs() < 1e-3);
    assert_eq!(g.regime, gb50009::Regime::Transcritical);
    assert!(g.resonance);
    assert!(g.lock_in_start_m.unwrap() < 1e-9);
    assert_eq!(g.lambda_used, Some(1.56));
    // GB 50009-2012 H.1.1: zeta_1 = 0.05 for concrete structures, the default (the case
    // gives no vortex.damping_ratio; delta_s / (2 pi) = 0.0048 is not used).
    let zeta = 0.05;
    assert_eq!(g.damping_ratio, zeta);
    assert!(g.damping_ratio_is_default);
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
    let r = wind::check_mode(
        &case,
        &stackwake::case::Stage::in_service("s", true),
        &model,
        &mode,
    )
    .unwrap();
    assert_eq!(r.gb50009.regime, gb50009::Regime::Supercritical);
    assert!(!r.gb50009.resonance && r.gb50009.tip_amplitude_m.is_none());
    assert_eq!(r.verdict.to_string(), "clear");
    // small tube, n = 0.5, D = 0.5: v_cr = 1.25, Re = 43125 (subcritical) with v_H = 30.
    let small = common::uniform_tube(20.0, 0.5, 0.05, 200.0, 20);
    let mode = common::parabola_mode(&small, 1, 0.5, 200.0);
    let r = wind::check_mode(
        &case,
        &stackwake::case::Stage::in_service("s", true),
        &small,
        &mode,
    )
    .unwrap();
    assert!(r.gb50009.subcritical_lock_in);
    // v_cr = 1.25 m/s < 15 m/s: GB 50009-2012 8.5.3(1) asks for anti-vibration measures.
    assert_eq!(r.gb50009.subcritical_speed_rule_met, Some(false));
    assert!(r
        .verdict
        .to_string()
        .starts_with("exceeds: GB 50009 8.5.3 subcritical lock-in"));
}

#[test]
fn subcritical_lock_in_with_v_cr_of_15_m_s_or_more_needs_no_measures() {
    // GB 50009-2012 8.5.3(1): for Re < 3e5 and v_H > v_cr, take anti-vibration measures OR
    // keep v_cr >= 15 m/s. Invented tube D = 0.25 m, n = 12 Hz: v_cr = 0.25 * 12 / 0.2 = 15 m/s,
    // Re = 69000 * 15 * 0.25 = 258750 < 3e5 (subcritical), v_H = 30 m/s > v_cr.
    let small = common::uniform_tube(20.0, 0.25, 0.03, 50.0, 20);
    let crit = Criteria {
        tip_amplitude_m: Some(1.0),
        ..Criteria::default()
    };
    let case = common::case(common::uniform_wind(30.0), VortexMethod::Gb50009H1, crit);
    let mode = common::parabola_mode(&small, 1, 12.0, 50.0);
    let r = wind::check_mode(
        &case,
        &stackwake::case::Stage::in_service("s", true),
        &small,
        &mode,
    )
    .unwrap();
    let g = &r.gb50009;
    assert!((g.critical_speed_m_s - 15.0).abs() < 1e-9);
    assert_eq!(g.regime, gb50009::Regime::Subcritical);
    assert!(g.subcritical_lock_in);
    assert_eq!(g.subcritical_speed_rule_met, Some(true));
    assert!(!g.subcritical_measures_required());
    assert!(!r.verdict.is_exceeds(), "{}", r.verdict);
    // Just below 15 m/s (n = 11.9 Hz: v_cr = 14.875 m/s) measures are required.
    let mode = common::parabola_mode(&small, 1, 11.9, 50.0);
    let r = wind::check_mode(
        &case,
        &stackwake::case::Stage::in_service("s", true),
        &small,
        &mode,
    )
    .unwrap();
    assert_eq!(r.gb50009.subcritical_speed_rule_met, Some(false));
    assert!(r.verdict.is_exceeds());
}

#[test]
fn damping_ratio_default_is_0_05_and_the_case_value_overrides_it() {
    // GB 50009-2012 H.1.1: first-mode damping ratio 0.05 for concrete structures.
    assert_eq!(gb50009::DAMPING_RATIO_CONCRETE, 0.05);
    let mut case = common::case(
        common::uniform_wind(30.0),
        VortexMethod::Gb50009H1,
        Criteria::default(),
    );
    assert_eq!(wind::damping_ratio(&case), 0.05);
    case.vortex.damping_ratio = Some(0.02);
    assert_eq!(wind::damping_ratio(&case), 0.02);
    let model = common::uniform_tube(80.0, 8.0, 0.4, 20000.0, 40);
    let mode = common::cantilever_mode(&model, 1, 0.5, 20000.0);
    let g = wind::check_mode(
        &case,
        &stackwake::case::Stage::in_service("s", true),
        &model,
        &mode,
    )
    .unwrap()
    .gb50009;
    assert_eq!(g.damping_ratio, 0.02);
    assert!(!g.damping_ratio_is_default);
}

#[test]
fn table_h11_tower_rows_unchanged() {
    // GB 50009-2012 Table H.1.1, towers and chimneys (高耸结构), modes 1-4, H1/H = 0 ... 1.0,
    // as printed in the published copy named in the header.
    #[rustfmt::skip]
    let expected = [
        [1.56, 1.55, 1.54, 1.49, 1.42, 1.31, 1.15, 0.94, 0.68, 0.37, 0.0],
        [0.83, 0.82, 0.76, 0.60, 0.37, 0.09, -0.16, -0.33, -0.38, -0.27, 0.0],
        [0.52, 0.48, 0.32, 0.06, -0.19, -0.30, -0.21, 0.00, 0.20, 0.23, 0.0],
        [0.30, 0.33, 0.02, -0.20, -0.23, 0.03, 0.16, 0.15, -0.05, -0.18, 0.0],
    ];
    assert_eq!(gb50009::LAMBDA_TOWERS, expected);
    for (j, row) in expected.iter().enumerate() {
        for (i, v) in row.iter().enumerate() {
            assert_eq!(gb50009::lambda_table(j + 1, i as f64 / 10.0), Some(*v));
        }
    }
}

#[test]
fn outer_face_taper_warning_once_per_case_and_only_with_a_gb_result() {
    // GB 50009-2012 8.5.3 takes D at 2/3 H for an outer-face taper up to 0.02. Invented tapered
    // tube 8 m -> 4 m over 80 m: taper (8 - 4) / (2 x 80) = 0.025.
    let stage = |name: &str, wind_speed: f64| {
        let mut model = common::uniform_tube(80.0, 8.0, 0.4, 20000.0, 40);
        model.outer_diameter_m = model.z_m.iter().map(|z| 8.0 - 4.0 * z / 80.0).collect();
        let case = common::case(
            common::uniform_wind(wind_speed),
            VortexMethod::Gb50009H1,
            Criteria::default(),
        );
        let modes: Vec<_> = (1..=2)
            .map(|k| common::cantilever_mode(&model, k, 0.5 * k as f64, 20000.0))
            .collect();
        let mut sm = common::stage_modes(model, modes);
        sm.stage.name = name.to_string();
        (case, sm)
    };
    let (case, a) = stage("a", 60.0);
    let (_, b) = stage("b", 60.0);
    let r = wind::check_all(&case, &[a, b]).unwrap();
    let g = &r.stages[0].modes[0].gb50009;
    assert!((g.outer_face_taper - 0.025).abs() < 1e-12);
    assert!(g.resonance);
    assert_eq!(r.warnings.len(), 1, "{:?}", r.warnings);
    assert!(r.warnings[0].contains("outer-face taper"));
    assert!(!r.warnings[0].contains("wall slope"));
    for s in &r.stages {
        for m in &s.modes {
            assert!(m.warnings.iter().all(|w| !w.contains("taper")));
        }
    }
    // No wind strong enough for any GB finding: no taper warning.
    let (case, a) = stage("a", 1.0);
    let r = wind::check_all(&case, &[a]).unwrap();
    assert!(!r.stages[0].modes[0].gb50009.shows_a_result());
    assert!(r.warnings.is_empty(), "{:?}", r.warnings);
}
