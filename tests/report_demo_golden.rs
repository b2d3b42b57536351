//! Golden-output test of the built-in demo (an invented scenario): the small CSV tables of a
//! fresh `check` run are compared column by column with tests/golden/demo/ (regression
//! references written by stackwake itself; see the README there): text cells exactly,
//! numbers to a relative tolerance of 1e-6. Also checks that every output file is written.

use std::path::Path;

use stackwake::commands::check::{run, CheckOptions};

const REL_TOL: f64 = 1e-6;

fn read(path: &Path) -> (Vec<String>, Vec<Vec<String>>) {
    let mut r = csv::Reader::from_path(path).unwrap_or_else(|e| panic!("{path:?}: {e}"));
    let head = r.headers().unwrap().iter().map(String::from).collect();
    let rows = r
        .records()
        .map(|rec| rec.unwrap().iter().map(String::from).collect())
        .collect();
    (head, rows)
}

fn same_cell(a: &str, b: &str) -> bool {
    match (a.parse::<f64>(), b.parse::<f64>()) {
        (Ok(x), Ok(y)) => (x - y).abs() <= REL_TOL * x.abs().max(y.abs()) + 1e-12,
        _ => a == b,
    }
}

fn compare(name: &str, got_dir: &Path) {
    let golden = Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/golden/demo");
    let (gh, gr) = read(&golden.join(name));
    let (h, r) = read(&got_dir.join(name));
    assert_eq!(h, gh, "{name}: columns");
    assert_eq!(r.len(), gr.len(), "{name}: row count");
    for (i, (row, grow)) in r.iter().zip(&gr).enumerate() {
        for (c, col) in h.iter().enumerate() {
            assert!(
                same_cell(&row[c], &grow[c]),
                "{name} row {} column {col}: got {} expected {}",
                i + 1,
                row[c],
                grow[c]
            );
        }
    }
}

#[test]
fn demo_tables_match_the_golden_copies() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    let report = run(None, &out, CheckOptions::default()).unwrap();
    for name in ["modes.csv", "vortex.csv", "lock_in.csv"] {
        compare(name, &out);
    }
    for name in [
        "modes.csv",
        "mode_shapes.csv",
        "sections.csv",
        "vortex.csv",
        "loads.csv",
        "lock_in.csv",
        "shell.svg",
        "modes.svg",
        "wind_map.svg",
        "response.svg",
        "envelopes.svg",
        "stages.svg",
        "report.html",
        "summary.json",
    ] {
        assert!(out.join(name).is_file(), "{name} written");
        assert!(report.files.iter().any(|f| f.ends_with(name)));
    }
    // No temporary folder left beside the output.
    assert_eq!(std::fs::read_dir(dir.path()).unwrap().count(), 1);
}

#[test]
fn the_comparison_detects_a_change() {
    assert!(same_cell("1.0000001", "1.0"));
    assert!(!same_cell("1.00001", "1.0"));
    assert!(!same_cell("lined", "shell only"));
}

#[test]
fn summary_json_carries_the_table_numbers() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    run(None, &out, CheckOptions::default()).unwrap();
    let v: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(out.join("summary.json")).unwrap()).unwrap();
    let (_, golden) =
        read(&Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/golden/demo/vortex.csv"));
    let modes: Vec<&serde_json::Value> = v["vortex"]["stages"]
        .as_array()
        .unwrap()
        .iter()
        .flat_map(|s| s["modes"].as_array().unwrap())
        .collect();
    assert_eq!(modes.len(), golden.len());
    for (m, row) in modes.iter().zip(&golden) {
        assert_eq!(m["stage"].as_str().unwrap(), row[0]);
        assert!(same_cell(&m["critical_speed_m_s"].to_string(), &row[6]));
    }
    assert!(std::fs::metadata(out.join("summary.json")).unwrap().len() < 2_000_000);
    assert!(v["generator"].as_str().unwrap().starts_with("stackwake "));
}
