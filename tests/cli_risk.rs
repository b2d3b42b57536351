//! `risk` and `risk-merge` through the binary: 1, 3 and 8 shards, each run as its own
//! process and merged, give byte-identical files to the unsharded run (fast keys, and a
//! re-solved key with --keep-samples, rank-correlated fast keys); hostile inputs exit 2 with a message naming the
//! problem. No outside reference is involved: the checks are of the project's own contract
//! (design.md: sharding and merge, exit codes).

use std::path::Path;

use assert_cmd::Command;

mod risk_common;
use predicates::prelude::*;
use risk_common::{case_with, risk, CORRELATIONS, FAST};

const RESOLVE: &str = r#"
[[uncertain]]
key = "lining[0].mass_per_area_kg_m2"
distribution = "normal"
mean = 240.0
cov = 0.1

[[uncertain]]
key = "base.rotational_stiffness_gnm_per_rad"
distribution = "lognormal"
mean = 1500.0
cov = 0.3

[[uncertain]]
key = "vortex.log_decrement"
distribution = "uniform"
low = 0.02
high = 0.04
"#;

fn files(dir: &Path) -> Vec<(String, Vec<u8>)> {
    let mut v: Vec<(String, Vec<u8>)> = std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap())
        .filter(|e| !e.file_name().to_string_lossy().starts_with('.'))
        .map(|e| {
            (
                e.file_name().to_string_lossy().into_owned(),
                std::fs::read(e.path()).unwrap(),
            )
        })
        .collect();
    v.sort();
    v
}

fn shards_merge_to_the_single_run(extra: &str, samples: &str, keep: bool) {
    shards_merge_with(extra, samples, keep, &[]);
}

fn shards_merge_with(extra: &str, samples: &str, keep: bool, flags: &[&str]) {
    let dir = tempfile::tempdir().unwrap();
    let case = case_with(dir.path(), "case.toml", extra);
    let mut common = vec!["--samples", samples, "--seed", "42"];
    if keep {
        common.push("--keep-samples");
    }
    common.extend_from_slice(flags);
    let single = dir.path().join("single");
    risk(&case, &common, &single).success();
    let want = files(&single);
    assert!(want.iter().any(|(n, _)| n == "risk.csv"));
    assert_eq!(want.iter().any(|(n, _)| n == "risk_samples.csv"), keep);
    for n in [1u32, 3, 8] {
        let mut dirs = Vec::new();
        for k in 1..=n {
            let d = dir.path().join(format!("s{n}_{k}"));
            let shard = format!("{k}/{n}");
            let mut a = common.clone();
            a.extend(["--shard", shard.as_str()]);
            risk(&case, &a, &d).success();
            assert!(d.join("risk_partial.json").exists());
            dirs.push(d);
        }
        // Merge in a scrambled order: the result must not depend on it.
        dirs.reverse();
        let merged = dir.path().join(format!("merged{n}"));
        Command::cargo_bin("stackwake")
            .unwrap()
            .arg("risk-merge")
            .args(&dirs)
            .arg("--out")
            .arg(&merged)
            .assert()
            .success();
        let got = files(&merged);
        assert_eq!(got.len(), want.len(), "{n} shards");
        for ((gn, gb), (wn, wb)) in got.iter().zip(&want) {
            assert_eq!(gn, wn);
            if gn == ".stackwake-manifest" {
                continue;
            }
            assert!(gb == wb, "{n} shards: {gn} differs from the single run");
        }
    }
}

#[test]
fn shards_of_fast_samples_merge_to_the_single_run() {
    shards_merge_to_the_single_run(FAST, "20000", false);
}

#[test]
fn shards_of_rank_correlated_samples_merge_to_the_single_run() {
    shards_merge_to_the_single_run(&format!("{FAST}\n{CORRELATIONS}"), "20000", true);
}

#[test]
fn shards_with_resistance_quantities_merge_to_the_single_run() {
    shards_merge_with(FAST, "240", true, &["--with-resistance"]);
}

#[test]
fn resistance_quantities_are_in_the_outputs_and_need_reinforcement() {
    let dir = tempfile::tempdir().unwrap();
    let case = case_with(dir.path(), "case.toml", FAST);
    let out = dir.path().join("out");
    risk(
        &case,
        &["--samples", "64", "--with-resistance", "--keep-samples"],
        &out,
    )
    .success();
    let csv = std::fs::read_to_string(out.join("risk.csv")).unwrap();
    assert!(csv.contains("shell only,1,vortex_utilisation,"), "{csv}");
    assert!(csv.contains("lined,1,fatigue_damage,"), "{csv}");
    let samples = std::fs::read_to_string(out.join("risk_samples.csv")).unwrap();
    assert!(samples
        .lines()
        .next()
        .unwrap()
        .ends_with(
            "max_stress_pa,vortex_utilisation,fatigue_damage,stage_fatigue_damage,total_fatigue_damage,verdict"
        ));
    let hist = std::fs::read_to_string(out.join("risk_histograms.svg")).unwrap();
    assert!(hist.contains("shell only: fatigue damage") && hist.contains("D = 1"));
    assert!(
        hist.contains("shell only mode 1: vortex utilisation"),
        "{hist}"
    );
    let note = std::fs::read_to_string(out.join("risk.html")).unwrap();
    assert!(note.contains("vortex_utilisation") && note.contains("EN 1992-1-1"));
    // Without the flag: no resistance rows.
    let plain = dir.path().join("plain");
    risk(&case, &["--samples", "64"], &plain).success();
    let csv = std::fs::read_to_string(plain.join("risk.csv")).unwrap();
    assert!(!csv.contains("vortex_utilisation"));
    // Without [reinforcement]: refused, nothing written.
    let mut t =
        stackwake::input::parse_case_text(stackwake::input::DEMO_CASE_TOML, "demo").unwrap();
    t.remove("reinforcement");
    let bare = dir.path().join("bare.toml");
    std::fs::write(&bare, format!("{}\n{FAST}", toml::to_string(&t).unwrap())).unwrap();
    let none = dir.path().join("none");
    risk(&bare, &["--samples", "10", "--with-resistance"], &none)
        .code(2)
        .stderr(predicate::str::contains(
            "--with-resistance = on: the case has no [reinforcement]",
        ));
    assert!(!none.exists());
}

/// E and a stage's stiffness factor on the demo's base springs: the stiffness family.
const ON_SPRINGS: &str = r#"
[[uncertain]]
key = "shell.elastic_modulus_gpa"
distribution = "lognormal"
mean = 32.0
cov = 0.15

[[uncertain]]
key = "stage[1].stiffness_factor"
distribution = "uniform"
low = 0.8
high = 1.1

[[uncertain]]
key = "vortex.log_decrement"
distribution = "lognormal"
mean = 0.03
cov = 0.4
"#;

#[test]
fn shards_of_stiffness_family_samples_merge_to_the_single_run() {
    shards_merge_with(ON_SPRINGS, "3000", true, &["--with-resistance"]);
}

#[test]
fn the_stiffness_family_is_described_in_the_outputs() {
    let dir = tempfile::tempdir().unwrap();
    let case = case_with(dir.path(), "case.toml", ON_SPRINGS);
    let out = dir.path().join("out");
    risk(&case, &["--samples", "500"], &out).success();
    let note = std::fs::read_to_string(out.join("risk.html")).unwrap();
    assert!(
        note.contains("<h2>Modes over the shell stiffness</h2>"),
        "{note}"
    );
    assert!(note.contains("interpolated over the shell stiffness (below)"));
    let json = std::fs::read_to_string(out.join("summary.json")).unwrap();
    let v: serde_json::Value = serde_json::from_str(&json).unwrap();
    let text = v.to_string();
    assert!(text.contains("\"stiffness_family\":{"), "{text}");
    assert!(text.contains("\"interpolated\":true"), "{text}");
}

#[test]
fn shards_of_re_solved_samples_merge_to_the_single_run_with_samples() {
    shards_merge_to_the_single_run(RESOLVE, "48", true);
}

#[test]
fn hostile_inputs_exit_2_with_clear_messages() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    let bad = |name: &str, extra: &str, args: &[&str], needle: &str| {
        let case = case_with(dir.path(), name, extra);
        risk(&case, args, &out)
            .code(2)
            .stderr(predicate::str::contains(needle));
        assert!(!out.exists(), "{name}: nothing written");
    };
    let entry = |key: &str, rest: &str| {
        format!("[[uncertain]]\nkey = \"{key}\"\ndistribution = \"lognormal\"\n{rest}\n")
    };
    bad(
        "unknown.toml",
        &entry("shell.elastic_modulus_gpx", "mean = 32.0\ncov = 0.1"),
        &["--samples", "10"],
        "uncertain[0].key",
    );
    bad(
        "cov.toml",
        &entry("shell.elastic_modulus_gpa", "mean = 32.0\ncov = 0.0"),
        &["--samples", "10"],
        "uncertain[0].cov = 0: must be > 0",
    );
    bad(
        "trunc.toml",
        &entry(
            "vortex.log_decrement",
            "mean = 0.03\ncov = 0.1\ntruncate_low = 0.5\ntruncate_high = 0.6",
        ),
        &["--samples", "10"],
        "nothing to sample",
    );
    bad(
        "normal.toml",
        "[[uncertain]]\nkey = \"vortex.log_decrement\"\ndistribution = \"normal\"\nmean = 0.03\ncov = 0.5\n",
        &["--samples", "10"],
        "truncate it",
    );
    bad("zero.toml", FAST, &["--samples", "0"], "--samples = 0");
    bad(
        "shard.toml",
        FAST,
        &["--samples", "10", "--shard", "9/8"],
        "--shard = 9/8",
    );
    bad(
        "shard0.toml",
        FAST,
        &["--samples", "10", "--shard", "0/8"],
        "between 1 and N",
    );

    // Shards of two different cases are refused by the merge.
    let a = case_with(dir.path(), "a.toml", FAST);
    let b = case_with(dir.path(), "b.toml", &format!("{FAST}\n# another case\n"));
    let (da, db) = (dir.path().join("da"), dir.path().join("db"));
    risk(&a, &["--samples", "100", "--shard", "1/2"], &da).success();
    risk(&b, &["--samples", "100", "--shard", "2/2"], &db).success();
    let merged = dir.path().join("m");
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("risk-merge")
        .arg(&da)
        .arg(&db)
        .arg("--out")
        .arg(&merged)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("partial result of another case"));
    assert!(!merged.exists());
    // A missing shard is refused too.
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("risk-merge")
        .arg(&da)
        .arg("--out")
        .arg(&merged)
        .assert()
        .code(2)
        .stderr(predicate::str::contains("1 of 2 shards given"));
}

#[test]
fn kept_samples_carry_the_stage_and_total_damage() {
    // Project contract (no outside reference): with --with-resistance each row of
    // risk_samples.csv repeats its stage's damage (max over the height of the sum over the
    // stage's modes, so at least each mode's own) and the case's total, the sum over the
    // stages.
    let dir = tempfile::tempdir().unwrap();
    let case = case_with(dir.path(), "c.toml", FAST);
    let out = dir.path().join("r");
    risk(
        &case,
        &[
            "--samples",
            "40",
            "--seed",
            "3",
            "--with-resistance",
            "--keep-samples",
        ],
        &out,
    )
    .success();
    let mut rd = csv::Reader::from_path(out.join("risk_samples.csv")).unwrap();
    let head = rd.headers().unwrap().clone();
    let col = |n: &str| {
        head.iter()
            .position(|h| h == n)
            .unwrap_or_else(|| panic!("{n}"))
    };
    let (c_sample, c_stage, c_mode_d, c_stage_d, c_total) = (
        col("sample"),
        col("stage"),
        col("fatigue_damage"),
        col("stage_fatigue_damage"),
        col("total_fatigue_damage"),
    );
    let rows: Vec<csv::StringRecord> = rd.records().map(|r| r.unwrap()).collect();
    let f = |r: &csv::StringRecord, c: usize| r[c].parse::<f64>().unwrap();
    let mut checked = 0;
    for sample in rows
        .iter()
        .map(|r| r[c_sample].to_string())
        .collect::<std::collections::BTreeSet<_>>()
    {
        let mine: Vec<&csv::StringRecord> = rows.iter().filter(|r| r[c_sample] == sample).collect();
        let mut per_stage: Vec<(String, f64)> = Vec::new();
        for r in &mine {
            let (st, d) = (r[c_stage].to_string(), f(r, c_stage_d));
            assert!(d >= f(r, c_mode_d), "stage damage below a mode's: {r:?}");
            match per_stage.iter().find(|(s, _)| *s == st) {
                Some((_, v)) => assert_eq!(*v, d, "one stage, two damages: {r:?}"),
                None => per_stage.push((st, d)),
            }
        }
        let total = f(mine[0], c_total);
        assert!(mine.iter().all(|r| f(r, c_total) == total));
        let sum: f64 = per_stage.iter().map(|(_, d)| d).sum();
        assert!(
            (sum - total).abs() <= 1e-12 * total.abs().max(1e-300),
            "{sum} vs {total}"
        );
        checked += usize::from(total > 0.0);
    }
    assert!(checked > 0, "no sample had fatigue damage");
}

#[test]
fn a_partial_of_another_format_is_refused_by_its_format() {
    // Project contract: risk-merge names the format of a partial written by another
    // stackwake version instead of failing on a field it lacks.
    let dir = tempfile::tempdir().unwrap();
    let case = case_with(dir.path(), "c.toml", FAST);
    let d = dir.path().join("s1");
    risk(&case, &["--samples", "50", "--shard", "1/1"], &d).success();
    let file = d.join("risk_partial.json");
    let text = std::fs::read_to_string(&file).unwrap();
    let old = text.replace(stackwake::risk::PARTIAL_FORMAT, "stackwake-risk-partial-1");
    assert_ne!(old, text);
    // An older layout also lacks the accumulator's layout fields.
    let old = old.replace("\"mode_entries\"", "\"unknown_a\"");
    std::fs::write(&file, old).unwrap();
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("risk-merge")
        .arg(&d)
        .arg("--out")
        .arg(dir.path().join("m"))
        .assert()
        .code(2)
        .stderr(predicate::str::contains(
            "format \"stackwake-risk-partial-1\", this stackwake reads \"stackwake-risk-partial-2\"",
        ));
}
