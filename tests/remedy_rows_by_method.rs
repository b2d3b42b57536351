//! Every "before" and "after" field of a remedy row comes from the method named in that row.
//!
//! Source: the project's own results (no outside source): a remedy row labelled "approach N"
//! must carry the tip amplitude, stress and verdict that EN 1991-1-4 Annex E approach N gave
//! in the check itself (E.1.5.2 approach 1, E.1.5.3 approach 2), never another method's. The
//! invented demo stack is a case where approach 2 passes and approach 1 fails (stage "lined",
//! mode 1), which is where mixed rows showed.

use std::path::Path;

use stackwake::case::VortexMethod;
use stackwake::commands::check::{analyse, CheckOptions, CheckResults};
use stackwake::input::{parse_case, DEMO_CASE_TOML};
use stackwake::wind::ModeVortex;

/// The demo with `method` governing, without its own [remedy] tables, plus `extra`.
fn demo(method: &str, extra: &str) -> CheckResults {
    let base = DEMO_CASE_TOML
        .split("\n[remedy")
        .next()
        .expect("split yields at least one part")
        .replace("method = \"en1991-e1\"", &format!("method = \"{method}\""));
    let case = parse_case(&format!("{base}\n{extra}\n"), Path::new("."), "demo+").expect("valid");
    analyse(case, CheckOptions::default()).expect("analysis")
}

fn mode<'a>(r: &'a CheckResults, stage: &str, mode: usize) -> &'a ModeVortex {
    r.vortex
        .stages
        .iter()
        .find(|s| s.stage == stage)
        .and_then(|s| s.modes.iter().find(|m| m.mode == mode))
        .expect("stage and mode checked")
}

/// (tip, stress) of the check's own approach-N result.
fn approach(m: &ModeVortex, method: VortexMethod) -> (f64, f64) {
    match method {
        VortexMethod::En1991E2 => {
            let a = m.approach2.as_ref().expect("approach 2 computed");
            (a.tip_amplitude_m, a.max_stress_pa)
        }
        _ => {
            let a = m.approach1.as_ref().expect("approach 1 computed");
            (a.tip_amplitude_m, a.max_stress_pa)
        }
    }
}

fn close(a: Option<f64>, b: f64) -> bool {
    a.is_some_and(|a| (a / b - 1.0).abs() < 1e-9)
}

#[test]
fn required_damping_rows_carry_their_own_approach() {
    let r = demo("en1991-e1", "");
    let rows = r.remedies.rows();
    let lined: Vec<_> = rows
        .iter()
        .filter(|row| row.stage == "lined" && row.mode == 1)
        .collect();
    assert_eq!(lined.len(), 2, "{rows:#?}");
    let m = mode(&r, "lined", 1);
    let (tip1, stress1) = approach(m, VortexMethod::En1991E1);
    let (tip2, stress2) = approach(m, VortexMethod::En1991E2);
    // The demo is the case of interest: approach 1 fails, approach 2 passes.
    assert!(m.verdict.is_exceeds());
    for row in &lined {
        if row.remedy.contains("approach 1") {
            assert!(close(row.tip_amplitude_before_m, tip1), "{row:?}");
            assert!(close(row.max_stress_before_pa, stress1), "{row:?}");
            assert!(row.verdict_before.starts_with("exceeds"), "{row:?}");
        } else {
            assert!(row.remedy.contains("approach 2"), "{row:?}");
            assert!(close(row.tip_amplitude_before_m, tip2), "{row:?}");
            // Before the fix this was approach 1's stress (3.61 MPa) and "exceeds".
            assert!(close(row.max_stress_before_pa, stress2), "{row:?}");
            assert_eq!(row.verdict_before, "ok", "{row:?}");
            assert_eq!(row.verdict_after, "ok", "{row:?}");
            assert!(
                row.log_decrement.is_none(),
                "approach 2 already meets: {row:?}"
            );
        }
    }
    // Every required-damping row of the demo, not only lined mode 1.
    for q in &r.remedies.required_damping {
        let m = mode(&r, &q.stage, q.mode);
        for (before, method) in [
            (&q.approach1_before, VortexMethod::En1991E1),
            (&q.approach2_before, VortexMethod::En1991E2),
        ] {
            let (tip, stress) = approach(m, method);
            assert_eq!(before.method, method);
            assert!(close(before.tip_amplitude_m, tip));
            assert!(close(before.max_stress_pa, stress));
        }
    }
}

#[test]
fn tmd_and_strakes_rows_compare_like_with_like() {
    let extra = "[remedy.tmd]\nmode = 1\nmass_ratio = 0.02\nstage = \"lined\"\n\
                 [remedy.strakes]\nfrom_z_m = 140.0\nto_z_m = 210.0\nc_lat_factor = 0.3\nstage = \"lined\"";
    // With approach 2 governing the TMD row is approach 2 before and after; strakes act on
    // c_lat, which only approach 1 has, so their row is approach 1 before and after.
    // With GB 50009 governing, the remedies are sized by approach 1 (before and after).
    for (method, tmd_method) in [
        ("en1991-e1", VortexMethod::En1991E1),
        ("en1991-e2", VortexMethod::En1991E2),
        ("gb50009-h1", VortexMethod::En1991E1),
    ] {
        let r = demo(method, extra);
        let m = mode(&r, "lined", 1);
        let t = &r.remedies.tmd[0];
        assert_eq!(t.before.method, tmd_method, "{method}");
        assert_eq!(t.after.method, tmd_method, "{method}");
        let (tip, stress) = approach(m, tmd_method);
        assert!(close(t.before.tip_amplitude_m, tip), "{method}");
        assert!(close(t.before.max_stress_pa, stress), "{method}");
        let s = &r.remedies.strakes[0];
        assert_eq!(s.before.method, VortexMethod::En1991E1, "{method}");
        assert_eq!(s.after.method, VortexMethod::En1991E1, "{method}");
        let (tip1, stress1) = approach(m, VortexMethod::En1991E1);
        assert!(close(s.before.tip_amplitude_m, tip1), "{method}");
        assert!(close(s.before.max_stress_pa, stress1), "{method}");
        let rows = r.remedies.rows();
        let name = if tmd_method == VortexMethod::En1991E2 {
            "approach 2"
        } else {
            "approach 1"
        };
        assert!(rows
            .iter()
            .any(|row| row.remedy.starts_with("TMD") && row.remedy.contains(name)));
        assert!(rows
            .iter()
            .any(|row| row.remedy.starts_with("strakes") && row.remedy.contains("approach 1")));
    }
}
