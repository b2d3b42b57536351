//! The whole check of hand-built stages: E.1.2 screening (EN 1991-1-4 E.1.2), verdicts against
//! criteria, CSV rows, the approach 1 response curve (Table E.3), and the lock-in band (our own
//! addition). Data are invented.

mod wind_common;
use wind_common as common;

use stackwake::case::{Criteria, VortexMethod};
use stackwake::wind::{self, approach1, ModeShape};

fn worked_stage() -> stackwake::modal::StageModes {
    let model = common::uniform_tube(80.0, 4.0, 0.3, 12000.0, 40);
    let modes = vec![
        common::cantilever_mode(&model, 1, 0.5, 12000.0),
        common::cantilever_mode(&model, 2, 3.1, 12000.0),
    ];
    common::stage_modes(model, modes)
}

#[test]
fn screening_criteria_and_rows() {
    let crit = Criteria {
        tip_amplitude_m: Some(0.05),
        tip_amplitude_per_diameter: None,
        stress_pa: None,
    };
    let mut case = common::case(common::uniform_wind(30.0), VortexMethod::En1991E1, crit);
    let res = wind::check_all(&case, &[worked_stage()]).unwrap();
    let s = &res.stages[0];
    // 3 modes requested, 2 available
    assert_eq!(s.modes.len(), 2);
    assert!(s.warnings[0].contains("3 modes requested, 2 available"));
    // mode 1: tip 0.0513 m > 0.05 m (approach 1 on the exact shape, see the worked example)
    let m1 = &s.modes[0];
    assert_eq!(
        m1.verdict.to_string(),
        "exceeds: tip amplitude 0.051 m > 0.050 m"
    );
    // mode 2: v_crit = 4 * 3.1 / 0.18 = 68.9 m/s > 1.25 * 30 -> clear (E.1.2)
    let m2 = &s.modes[1];
    assert!(m2.screened_out);
    assert_eq!(m2.verdict.to_string(), "clear");
    assert!(m2.loads.is_empty() && m2.approach1.is_none());
    assert!(res.any_exceeds());
    let rows = res.vortex_rows();
    assert_eq!(rows.len(), 2);
    assert_eq!(rows[1].tip_amplitude_m, None);
    assert_eq!(res.load_rows().len(), 41);
    // CSV serialisation of the contract columns
    let mut w = csv::Writer::from_writer(vec![]);
    for r in &rows {
        w.serialize(r).unwrap();
    }
    let text = String::from_utf8(w.into_inner().unwrap()).unwrap();
    assert!(text.starts_with(
        "stage,mode,frequency_hz,reference_height_m,diameter_m,strouhal,critical_speed_m_s,\
         mean_speed_m_s,speed_ratio,reynolds,scruton,tip_amplitude_m,base_moment_nm,\
         fatigue_cycles,verdict\n"
    ));

    // Looser limit -> ok; approach 2 governing gives its own (smaller) amplitude.
    let mut case_ok = case.clone();
    case_ok.criteria.tip_amplitude_m = Some(0.06);
    assert!(!wind::check_all(&case_ok, &[worked_stage()])
        .unwrap()
        .any_exceeds());
    case.vortex.method = VortexMethod::En1991E2;
    let r2 = wind::check_stage(&case, &worked_stage()).unwrap();
    let a2 = r2.modes[0].approach2.as_ref().unwrap();
    assert_eq!(r2.modes[0].row().tip_amplitude_m, Some(a2.tip_amplitude_m));
    assert_eq!(r2.modes[0].verdict.to_string(), "ok");
}

#[test]
fn response_curve_follows_table_e3() {
    let model = common::uniform_tube(80.0, 4.0, 0.3, 12000.0, 40);
    let mode = common::parabola_mode(&model, 1, 0.5, 12000.0);
    let wind_ = common::uniform_wind(30.0);
    let shape = ModeShape::from_mode(&model, &mode);
    let v_crit = 100.0 / 9.0;
    let re = 4.0 * v_crit / 15e-6;
    let setup =
        approach1::Approach1Setup::new(shape, &wind_, 80.0, 4.0, 0.18, 36.0, v_crit, re, 1.0);
    let plateau = setup.solve().amplitude.y_max_m;
    let speeds = [v_crit / 1.3, v_crit, v_crit / 0.9, v_crit / 0.5];
    let c = approach1::response_curve(&setup, &speeds);
    assert_eq!(c[0].y_max_m, 0.0); // ratio > 1.25
    assert!((c[1].y_max_m / plateau - 0.6).abs() < 1e-9); // 3 - 2.4 * 1.0
    assert!((c[2].y_max_m / plateau - (3.0 - 2.4 * 0.9)).abs() < 1e-9);
    assert!((c[3].y_max_m / plateau - 1.0).abs() < 1e-12);
}

#[test]
fn lock_in_band_on_a_tapered_stack() {
    // Invented tapered tube: D 10 m at the base to 4 m at the top over 100 m, n = 0.3 Hz,
    // St 0.18: v_crit(z) = (10 - 0.06 z) 0.3 / 0.18; uniform 12 m/s wind -> band above
    // z = (10 - 7.2) / 0.06 = 46.67 m.
    let mut model = common::uniform_tube(100.0, 10.0, 0.3, 15000.0, 50);
    for (i, d) in model.outer_diameter_m.iter_mut().enumerate() {
        *d = 10.0 - 0.06 * model.z_m[i];
    }
    let mode = common::parabola_mode(&model, 1, 0.3, 15000.0);
    let case = common::case(
        common::uniform_wind(12.0),
        VortexMethod::En1991E1,
        Criteria::default(),
    );
    let r = wind::check_mode(
        &case,
        &stackwake::case::Stage::in_service("s", true),
        &model,
        &mode,
    )
    .unwrap();
    let band = r.lock_in_band.unwrap();
    assert!((band.from_z_m - 140.0 / 3.0).abs() < 1e-9);
    assert_eq!(band.to_z_m, 100.0);
}
