//! `[[rank_correlation]]` through the binary:
//! - the Spearman rank correlations of the kept samples (risk_samples.csv, one row per
//!   sample) equal the scipy.stats.spearmanr values of the same file (scipy 1.17.1, script
//!   tests/reference/risk_rank_correlation_spearman.py, run on this case and settings;
//!   tolerance 1e-12: both compute the same statistic from the same printed numbers), and
//!   the targets within 4 / sqrt(N - 1) (four standard deviations of the sample Spearman
//!   coefficient of independent samples, variance 1 / (N - 1), from memory; the Gaussian
//!   copula's expected Spearman is the target exactly, Pearson 1907 / Headrick 2016 eq. (1));
//! - the note and summary.json list the correlations and say the influence is total
//!   association; a fixed (not continuous) marginal is warned about;
//! - hostile tables (unknown key, |rho| >= 1, a self-pair, a duplicate pair, a combination
//!   that is not positive definite) exit 2 naming the field and rule, writing nothing.

use std::path::Path;

use assert_cmd::Command;

mod risk_common;
use predicates::prelude::*;
use risk_common::{case_with, risk, spearman, CORRELATIONS, FAST};

/// The input columns of risk_samples.csv, one value per sample.
fn sampled_inputs(path: &Path, keys: &[&str]) -> Vec<Vec<f64>> {
    let mut r = csv::Reader::from_path(path).unwrap();
    let head = r.headers().unwrap().clone();
    let col: Vec<usize> = keys
        .iter()
        .map(|k| head.iter().position(|h| h == *k).unwrap())
        .collect();
    let mut last = String::new();
    let mut out = vec![Vec::new(); keys.len()];
    for rec in r.records() {
        let rec = rec.unwrap();
        if rec[0] == *last {
            continue;
        }
        last = rec[0].to_string();
        for (o, &c) in out.iter_mut().zip(&col) {
            o.push(rec[c].parse::<f64>().unwrap());
        }
    }
    out
}

#[test]
fn kept_samples_have_the_target_rank_correlations() {
    let dir = tempfile::tempdir().unwrap();
    let case = case_with(dir.path(), "case.toml", &format!("{FAST}\n{CORRELATIONS}"));
    let out = dir.path().join("out");
    risk(
        &case,
        &["--samples", "4000", "--seed", "17", "--keep-samples"],
        &out,
    )
    .success()
    .stdout(predicate::str::contains(
        "every sample reused the case's modes",
    ));
    let keys = [
        "vortex.log_decrement",
        "vortex.strouhal",
        "uncertainty.c_lat_factor",
        "wind.reference_speed_m_s",
    ];
    let cols = sampled_inputs(&out.join("risk_samples.csv"), &keys);
    let n = cols[0].len();
    assert_eq!(n, 4000);
    // (a, b, target, scipy.stats.spearmanr of this file)
    let pairs = [
        (0, 1, -0.3, -0.30700050831253173),
        (3, 1, 0.5, 0.5000174960010935),
        (2, 0, 0.4, 0.40837302902331424),
    ];
    let tol = 4.0 / ((n - 1) as f64).sqrt();
    for (a, b, target, scipy) in pairs {
        let got = spearman(&cols[a], &cols[b]);
        assert!(
            (got - scipy).abs() <= 1e-12,
            "{} / {}: {got} vs scipy {scipy}",
            keys[a],
            keys[b]
        );
        assert!(
            (got - target).abs() <= tol,
            "{} / {}: {got} vs target {target} (tol {tol:.3})",
            keys[a],
            keys[b]
        );
    }
    let summary = std::fs::read_to_string(out.join("summary.json")).unwrap();
    let j: serde_json::Value = serde_json::from_str(&summary).unwrap();
    let rc = j["risk"]["rank_correlations"].as_array().unwrap();
    assert_eq!(rc.len(), 3);
    assert_eq!(rc[1]["keys"][1], "wind.reference_speed_m_s");
    assert_eq!(rc[1]["spearman"], 0.5);
    let r = rc[1]["normal_score_correlation"].as_f64().unwrap();
    // 2 sin(pi / 12) (Pearson 1907).
    assert!((r - 0.517_638_090_205_041_5).abs() < 1e-15, "{r}");
    assert!(j["risk"]["influence_method"]
        .as_str()
        .unwrap()
        .contains("total association"));
    let note = std::fs::read_to_string(out.join("risk.html")).unwrap();
    assert!(note.contains("<h2>Rank correlations</h2>"));
    assert!(note.contains("vortex.log_decrement / vortex.strouhal"));
    assert!(note.contains("not its unique contribution"));
    let tornado = std::fs::read_to_string(out.join("risk_influence.svg")).unwrap();
    assert!(tornado.contains("total, not unique, association"));
}

#[test]
fn independent_runs_say_so_and_a_fixed_marginal_is_warned_about() {
    let dir = tempfile::tempdir().unwrap();
    let case = case_with(dir.path(), "plain.toml", FAST);
    let out = dir.path().join("plain");
    risk(&case, &["--samples", "200"], &out).success();
    let j: serde_json::Value =
        serde_json::from_str(&std::fs::read_to_string(out.join("summary.json")).unwrap()).unwrap();
    assert_eq!(j["risk"]["rank_correlations"].as_array().unwrap().len(), 0);
    assert!(!j["risk"]["influence_method"]
        .as_str()
        .unwrap()
        .contains("total association"));
    let fixed = r#"
[[uncertain]]
key = "vortex.log_decrement"
distribution = "uniform"
low = 0.03
high = 0.03

[[uncertain]]
key = "vortex.strouhal"
distribution = "normal"
mean = 0.18
cov = 0.05

[[rank_correlation]]
keys = ["vortex.strouhal", "vortex.log_decrement"]
coefficient = 0.5
"#;
    let case = case_with(dir.path(), "fixed.toml", fixed);
    risk(&case, &["--samples", "50"], &dir.path().join("fixed"))
        .success()
        .stderr(predicate::str::contains(
            "warning: rank correlation [\"vortex.log_decrement\", \"vortex.strouhal\"]: the \
             distribution of \"vortex.log_decrement\" is a single value (not continuous)",
        ));
}

#[test]
fn hostile_correlation_tables_exit_2_naming_the_rule() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    let bad = |name: &str, table: &str, needle: &str| {
        let case = case_with(dir.path(), name, &format!("{FAST}\n{table}"));
        risk(&case, &["--samples", "10"], &out)
            .code(2)
            .stderr(predicate::str::contains(needle));
        assert!(!out.exists(), "{name}: nothing written");
    };
    let pair = |a: &str, b: &str, c: &str| {
        format!("[[rank_correlation]]\nkeys = [\"{a}\", \"{b}\"]\ncoefficient = {c}\n")
    };
    bad(
        "unknown.toml",
        &pair("vortex.log_decrement", "shell.elastic_modulus_gpa", "0.3"),
        "rank_correlation[0].keys[1] = \"shell.elastic_modulus_gpa\": not an [[uncertain]] key",
    );
    bad(
        "one.toml",
        &pair("vortex.log_decrement", "vortex.strouhal", "1.0"),
        "rank_correlation[0].coefficient = 1: must be strictly between -1 and 1",
    );
    bad(
        "minus.toml",
        &pair("vortex.log_decrement", "vortex.strouhal", "-1.5"),
        "rank_correlation[0].coefficient = -1.5: must be strictly between -1 and 1",
    );
    bad(
        "self.toml",
        &pair("vortex.strouhal", "vortex.strouhal", "0.2"),
        "cannot be correlated with itself",
    );
    bad(
        "twice.toml",
        &format!(
            "{}{}",
            pair("vortex.strouhal", "vortex.log_decrement", "0.2"),
            pair("vortex.log_decrement", "vortex.strouhal", "0.3")
        ),
        "rank_correlation[1].keys",
    );
    bad(
        "not_pd.toml",
        &format!(
            "{}{}{}",
            pair("vortex.log_decrement", "vortex.strouhal", "0.9"),
            pair("vortex.strouhal", "uncertainty.c_lat_factor", "0.9"),
            pair("vortex.log_decrement", "uncertainty.c_lat_factor", "-0.9")
        ),
        "must be positive definite",
    );
    // The not-positive-definite message names all three pairs.
    let case = case_with(
        dir.path(),
        "not_pd2.toml",
        &format!(
            "{FAST}\n{}{}{}",
            pair("vortex.log_decrement", "vortex.strouhal", "0.9"),
            pair("vortex.strouhal", "uncertainty.c_lat_factor", "0.9"),
            pair("vortex.log_decrement", "uncertainty.c_lat_factor", "-0.9")
        ),
    );
    risk(&case, &["--samples", "10"], &out).code(2).stderr(
        predicate::str::contains("rank_correlation[0]")
            .and(predicate::str::contains("rank_correlation[1]"))
            .and(predicate::str::contains("rank_correlation[2]")),
    );
    // `check` ignores the table, like [[uncertain]].
    let case = case_with(
        dir.path(),
        "check.toml",
        &format!(
            "{FAST}\n{}",
            pair("vortex.log_decrement", "vortex.strouhal", "0.3")
        ),
    );
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("modes")
        .arg(&case)
        .arg("--out")
        .arg(dir.path().join("modes"))
        .assert()
        .success();
}
