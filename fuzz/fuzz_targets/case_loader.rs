//! Fuzz target: any bytes -> case file text (+ stations CSV text) -> validated `Case`.
//! Must never panic or hang; every input ends in `Ok` or a typed `InputError`.
//! The byte-to-input mapping lives in fuzz/harness.rs so the regression test
//! (tests/fuzz_regressions.rs) replays the corpus through exactly the same code.
#![no_main]

use libfuzzer_sys::fuzz_target;

#[path = "../harness.rs"]
mod harness;

fuzz_target!(|data: &[u8]| {
    harness::case_loader(data);
});
