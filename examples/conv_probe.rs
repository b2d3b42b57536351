use stackwake::case::*;
use stackwake::modal::{analyse_stage, ModalOptions};
#[path = "../tests/common/mod.rs"]
mod common;
fn main() {
    for beam in [BeamTheory::EulerBernoulli, BeamTheory::Timoshenko] {
        for taper in [false, true] {
            let st: Vec<(f64, f64, f64)> = if taper {
                vec![(0.0, 16.0, 0.55), (60.0, 13.0, 0.40), (180.0, 9.0, 0.22)]
            } else {
                vec![(0.0, 16.0, 0.55), (180.0, 16.0, 0.55)]
            };
            let case = common::shell_case(&st, 32e9, 2500.0, beam);
            let stage = case.stages[0].clone();
            for n in [50, 100, 200, 400, 800, 1600, 20000] {
                let t = std::time::Instant::now();
                let r = analyse_stage(
                    &case,
                    &stage,
                    ModalOptions {
                        modes: 3,
                        min_elements: Some(n),
                    },
                )
                .unwrap();
                println!(
                    "{beam:?} taper={taper} n={n} f={:.15} {:.15} {:.15} it={} res={:.1e} {:?}",
                    r.modes[0].frequency_hz,
                    r.modes[1].frequency_hz,
                    r.modes[2].frequency_hz,
                    r.check.iterations,
                    r.check.max_relative_residual,
                    t.elapsed()
                );
            }
        }
    }
}
