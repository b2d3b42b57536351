//! Timoshenko / Euler-Bernoulli frequency ratios of a uniform thin tube, t/D = 0.02,
//! nu = 0.2, Cowper's shear coefficient, rotary inertia included.
//! Source: data/reference/README.md (computed with scipy by a shooting method): H/D = 10: 0.985, 0.907,
//! 0.816; H/D = 20: 0.996, 0.974, 0.941 (three digits: compared to +-0.0015).

mod common;

use stackwake::case::BeamTheory;

fn ratios(h_over_d: f64) -> Vec<f64> {
    let d = 5.0;
    let tim = common::uniform_tube(h_over_d * d, d, 0.02 * d, BeamTheory::Timoshenko);
    let eb = common::uniform_tube(h_over_d * d, d, 0.02 * d, BeamTheory::EulerBernoulli);
    let ft = common::frequencies(&tim, 3, Some(200));
    let fe = common::frequencies(&eb, 3, Some(200));
    ft.iter().zip(&fe).map(|(a, b)| a / b).collect()
}

#[test]
fn ratios_match_the_shooting_solution() {
    for (hd, want) in [(10.0, [0.985, 0.907, 0.816]), (20.0, [0.996, 0.974, 0.941])] {
        let got = ratios(hd);
        for k in 0..3 {
            assert!(
                (got[k] - want[k]).abs() < 0.0015,
                "H/D {hd} mode {}: {} vs {}",
                k + 1,
                got[k],
                want[k]
            );
        }
    }
}

#[test]
fn timoshenko_tends_to_euler_bernoulli_as_shear_stiffness_grows() {
    // Relative shear flexibility falls as (D/H)^2: the ratio rises monotonically to 1
    // (common practice).
    let mut last = 0.0;
    for hd in [5.0, 10.0, 20.0, 40.0, 80.0] {
        let r = ratios(hd)[1];
        assert!(r > last && r <= 1.0 + 1e-12, "H/D {hd}: {r}");
        last = r;
    }
    assert!(1.0 - last < 2e-3);
}
