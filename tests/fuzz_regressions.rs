//! Replays the minimised fuzz corpora (tests/fuzz_regressions/{case_loader,analysis,check}/)
//! through the same harness as the cargo-fuzz targets (fuzz/harness.rs), without libFuzzer,
//! so every input the fuzzer found interesting stays a regression test in plain
//! `cargo test`. Robustness checks only: no outside reference is involved.

#[path = "../fuzz/harness.rs"]
mod harness;

use std::path::Path;

fn replay(folder: &str, run: fn(&[u8])) -> usize {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR"))
        .join("tests/fuzz_regressions")
        .join(folder);
    let mut paths: Vec<_> = std::fs::read_dir(&dir)
        .unwrap_or_else(|e| panic!("cannot list {}: {e}", dir.display()))
        .map(|entry| entry.expect("directory entry").path())
        .filter(|p| p.is_file())
        .collect();
    paths.sort();
    for path in &paths {
        let data = std::fs::read(path).expect("read corpus file");
        let outcome = std::panic::catch_unwind(|| run(&data));
        assert!(
            outcome.is_ok(),
            "fuzz regression input {} panicked",
            path.display()
        );
    }
    paths.len()
}

#[test]
fn case_loader_corpus_never_panics() {
    let n = replay("case_loader", harness::case_loader);
    assert!(n >= 50, "case_loader corpus has only {n} inputs");
}

#[test]
fn analysis_corpus_never_panics_and_keeps_invariants() {
    let n = replay("analysis", harness::analysis);
    assert!(n >= 20, "analysis corpus has only {n} inputs");
}

#[test]
fn check_corpus_never_panics_and_writes_readable_files() {
    let n = replay("check", |d| {
        harness::check(d);
    });
    assert!(n >= 8, "check corpus has only {n} inputs");
}

/// The `check` mapping must reach the writers, not only the validator: some seeds of the
/// replay folder run `check` to the end (exit 0 or 1) and others are refused.
#[test]
fn check_seeds_reach_the_writers() {
    let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("tests/fuzz_regressions/check");
    let mut accepted = 0;
    let mut wrote = 0;
    let mut total = 0;
    for entry in std::fs::read_dir(&dir).unwrap() {
        let data = std::fs::read(entry.unwrap().path()).unwrap();
        let text = harness::check_case_text_from(&data);
        total += 1;
        if stackwake::input::parse_case_with_csv(&text, "seed.toml", None).is_ok() {
            accepted += 1;
        }
        if harness::check(&data) {
            wrote += 1;
        }
    }
    assert!(
        accepted < total && wrote >= 2,
        "{accepted} of {total} seeds accepted, {wrote} wrote their outputs"
    );
}

#[test]
fn harness_builds_valid_cases_from_plain_bytes() {
    // The analysis mapping must reach the solver, not only the validator: a few fixed byte
    // patterns give valid cases.
    let mut valid = 0;
    for seed in 0u8..32 {
        let data: Vec<u8> = (0..64u8)
            .map(|i| i.wrapping_mul(seed).wrapping_add(seed))
            .collect();
        let (text, _) = harness::case_text_from(&data);
        if stackwake::input::parse_case_with_csv(&text, "seed.toml", None).is_ok() {
            valid += 1;
        }
        harness::analysis(&data);
    }
    assert!(valid >= 8, "only {valid} of 32 seeds give a valid case");
}
