//! Linearly tapered Euler-Bernoulli cantilevers, modes 1-3.
//! Source: Ozdemir Ozgumus & Kaya, Int. J. Mech. Mater. Eng. (2015), table 1, with the
//! values reproduced with scipy (data/reference/README.md): C_n = omega_n L^2 sqrt(m0 / EI0), base
//! properties, taper alpha = D_top / D_base.
//! Models: a tube with constant d/D (t = 0.1 D: I ~ D^4, A ~ D^2, the solid-cone case) and a
//! thin tube of constant wall (t = 1e-6 D_top: I ~ D^3, A ~ D within ~1e-6).

mod common;

use stackwake::case::BeamTheory;
use stackwake::section::Annulus;

const L: f64 = 100.0;

fn coefficients(d_base: f64, alpha: f64, wall: impl Fn(f64) -> f64) -> Vec<f64> {
    let d_top = alpha * d_base;
    let case = common::shell_case(
        &[(0.0, d_base, wall(d_base)), (L, d_top, wall(d_top))],
        30e9,
        2500.0,
        BeamTheory::EulerBernoulli,
    );
    let base = Annulus::new(d_base, wall(d_base));
    let ei0 = 30e9 * base.second_moment_m4();
    let m0 = 2500.0 * base.area_m2();
    common::frequencies(&case, 3, Some(400))
        .iter()
        .map(|f| 2.0 * std::f64::consts::PI * f * L * L * (m0 / ei0).sqrt())
        .collect()
}

fn check(label: &str, got: &[f64], want: [f64; 3]) {
    for k in 0..3 {
        let rel = (got[k] - want[k]).abs() / want[k];
        assert!(
            rel < 5e-6,
            "{label} mode {}: {} vs {} (rel {rel:.1e})",
            k + 1,
            got[k],
            want[k]
        );
    }
}

#[test]
fn constant_d_over_d_tube_is_the_solid_cone() {
    let table = [
        (0.8, [3.85512, 21.05675, 56.63035]),
        (0.6, [4.31878, 20.04998, 51.33463]),
        (0.4, [5.00903, 19.06486, 45.73836]),
        (0.2, [6.19639, 18.38547, 39.83363]),
    ];
    for (alpha, want) in table {
        let got = coefficients(8.0, alpha, |d| 0.1 * d);
        check(&format!("cone alpha {alpha}"), &got, want);
    }
}

#[test]
fn constant_wall_thin_tube() {
    let table = [
        (0.8, [3.60827, 20.62102, 56.19228]),
        (0.6, [3.73708, 19.11381, 50.35365]),
        (0.4, [3.93428, 17.48786, 44.02481]),
        (0.2, [4.29249, 15.74270, 36.88455]),
    ];
    for (alpha, want) in table {
        let wall = 1e-6 * alpha * 8.0;
        let got = coefficients(8.0, alpha, |_| wall);
        check(&format!("thin tube alpha {alpha}"), &got, want);
    }
}
