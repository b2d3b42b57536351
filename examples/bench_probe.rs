use stackwake::case::*;

#[path = "../tests/common/mod.rs"]
mod common;
fn main() {
    let n: usize = std::env::args()
        .nth(1)
        .map(|s| s.parse().unwrap())
        .unwrap_or(20000);
    let case = common::shell_case(
        &[(0.0, 16.0, 0.55), (60.0, 13.0, 0.40), (180.0, 9.0, 0.22)],
        32e9,
        2500.0,
        BeamTheory::Timoshenko,
    );
    let stage = case.stages[0].clone();
    let t = std::time::Instant::now();
    let (b, s) = stackwake::fem::solve_stage(&case, &stage, Some(n), 10).unwrap();
    let t1 = t.elapsed();
    let _ = b;
    println!(
        "build {:?} solve {:?} it {}",
        t1,
        t.elapsed() - t1,
        s.iterations
    );
}
