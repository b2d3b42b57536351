//! Replays the minimised fuzz corpora (tests/fuzz_regressions/{case_loader,analysis}/)
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
