//! Fuzz target: bytes -> bounded numbers -> a case file -> (if it validates) the modal
//! analysis of every stage. Extreme but valid geometry must end in modes with a passing
//! completeness check or a `ModalError` naming the stage; never a panic, NaN or a hang.
//! The mapping lives in fuzz/harness.rs, shared with tests/fuzz_regressions.rs.
#![no_main]

use libfuzzer_sys::fuzz_target;

#[path = "../harness.rs"]
mod harness;

fuzz_target!(|data: &[u8]| {
    harness::analysis(data);
});
