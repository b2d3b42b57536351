//! Sweeps: frequencies scale exactly as sqrt(E) (the FE stiffness is linear in E and G = E /
//! (2 (1 + nu)) with a fixed mesh and no base springs; faer-style invariant check, common
//! practice), and a sweep row equals the single `check` of the same variant.

use std::path::Path;

use stackwake::commands::check::{analyse, CheckOptions};
use stackwake::commands::sweep::run_grid;
use stackwake::input::{keypath, parse_case_table, parse_case_text, DEMO_CASE_TOML};
use stackwake::sweep::{VariantOutcome, Vary};

#[test]
fn e_sweep_scales_every_frequency_as_sqrt_e() {
    let mut table = parse_case_text(DEMO_CASE_TOML, "demo").unwrap();
    // Base springs do not scale with E: remove them for the exact scaling law.
    table.remove("base");
    let vary = vec![Vary::parse("shell.elastic_modulus_gpa=20:40:3").unwrap()];
    let v = run_grid(&table, Path::new("."), "demo", &vary, &|| {}).unwrap();
    assert_eq!(v.len(), 3);
    let rows: Vec<_> = v
        .iter()
        .map(|x| match &x.outcome {
            VariantOutcome::Rows(r) => r.clone(),
            other => panic!("{other:?}"),
        })
        .collect();
    for (k, base) in rows[0].iter().enumerate() {
        let f0 = base.frequency_hz;
        for (i, e) in [(1, 30.0), (2, 40.0)] {
            let expected = f0 * (e / 20.0f64).sqrt();
            let got = rows[i][k].frequency_hz;
            assert!(
                (got / expected - 1.0).abs() < 1e-9,
                "{} mode {}: {got} vs {expected}",
                rows[i][k].stage,
                rows[i][k].mode
            );
        }
    }
}

#[test]
fn a_sweep_row_equals_the_single_check() {
    let table = parse_case_text(DEMO_CASE_TOML, "demo").unwrap();
    let vary = vec![
        Vary::parse("shell.stations[2].outer_diameter_m=13.6:15.6:2").unwrap(),
        Vary::parse("lining[0].mass_per_area_kg_m2=200:300:2").unwrap(),
    ];
    let variants = run_grid(&table, Path::new("."), "demo", &vary, &|| {}).unwrap();
    let v = &variants[3];
    assert_eq!(v.values, vec![15.6, 300.0]);
    let mut t = table.clone();
    keypath::set_number(&mut t, "shell.stations[2].outer_diameter_m", 15.6).unwrap();
    keypath::set_number(&mut t, "lining[0].mass_per_area_kg_m2", 300.0).unwrap();
    let case = parse_case_table(t, Path::new("."), "demo").unwrap();
    let single = analyse(case, CheckOptions::default()).unwrap();
    let VariantOutcome::Rows(rows) = &v.outcome else {
        panic!("{:?}", v.outcome)
    };
    let checked: Vec<_> = single.vortex.vortex_rows();
    assert_eq!(rows.len(), checked.len());
    for (r, c) in rows.iter().zip(&checked) {
        assert_eq!(r.stage, c.stage);
        assert_eq!(r.mode, c.mode);
        assert_eq!(r.frequency_hz, c.frequency_hz);
        assert_eq!(r.critical_speed_m_s, Some(c.critical_speed_m_s));
        assert_eq!(r.speed_ratio, Some(c.speed_ratio));
        assert_eq!(r.tip_amplitude_m, c.tip_amplitude_m);
        assert_eq!(r.verdict.to_string(), c.verdict);
    }
}
