//! Fuzz target: bytes -> a case file with wind and vortex values over their accepted ranges
//! and extreme but plausible geometry -> `check` end to end (analysis, plots, CSV, JSON and
//! the note) into a scratch folder. Never a panic or a hang; either every written file reads
//! back with finite numbers, or an error with nothing left behind.
//! The mapping lives in fuzz/harness.rs, shared with tests/fuzz_regressions.rs.
#![no_main]

use libfuzzer_sys::fuzz_target;

#[path = "../harness.rs"]
mod harness;

fuzz_target!(|data: &[u8]| {
    let _wrote = harness::check(data);
});
