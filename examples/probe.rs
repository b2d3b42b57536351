use stackwake::fem::solve_stage;
fn main() {
    let case = stackwake::input::demo_case();
    let stage = case.stages[2].clone();
    let n: usize = std::env::args().nth(1).map(|s| s.parse().unwrap()).unwrap_or(3);
    let t = std::time::Instant::now();
    let mut it = 0;
    for _ in 0..500 { let (_, s) = solve_stage(&case, &stage, None, n).unwrap(); it = s.iterations; }
    println!("{:?} per solve, it {}", t.elapsed() / 500, it);
}
