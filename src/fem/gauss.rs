//! Gauss-Legendre quadrature rules on [-1, 1], computed once by Newton iteration on the
//! Legendre polynomials (Abramowitz & Stegun 25.4.29; nodes accurate to rounding).

use std::sync::OnceLock;

/// Largest rule available.
pub const MAX_POINTS: usize = 16;

type Rule = (Vec<f64>, Vec<f64>);

fn compute(n: usize) -> Rule {
    let mut xs = vec![0.0; n];
    let mut ws = vec![0.0; n];
    for i in 0..n {
        // Tricomi's initial guess, then Newton on P_n.
        let mut x = (std::f64::consts::PI * (i as f64 + 0.75) / (n as f64 + 0.5)).cos();
        let mut dp = 1.0;
        for _ in 0..100 {
            let (mut p0, mut p1) = (1.0, x);
            for k in 2..=n {
                let p2 = ((2 * k - 1) as f64 * x * p1 - (k - 1) as f64 * p0) / k as f64;
                p0 = p1;
                p1 = p2;
            }
            let pn = if n == 0 { 1.0 } else { p1 };
            let pn1 = if n == 1 { 1.0 } else { p0 };
            dp = n as f64 * (x * pn - pn1) / (x * x - 1.0);
            let dx = pn / dp;
            x -= dx;
            if dx.abs() < 1e-16 {
                break;
            }
        }
        xs[n - 1 - i] = x;
        ws[n - 1 - i] = 2.0 / ((1.0 - x * x) * dp * dp);
    }
    (xs, ws)
}

fn table() -> &'static Vec<Rule> {
    static TABLE: OnceLock<Vec<Rule>> = OnceLock::new();
    TABLE.get_or_init(|| {
        (0..=MAX_POINTS)
            .map(|n| if n == 0 { (vec![], vec![]) } else { compute(n) })
            .collect()
    })
}

/// The n-point rule (1 <= n <= MAX_POINTS): nodes ascending and weights.
pub fn rule(n: usize) -> (&'static [f64], &'static [f64]) {
    let r = &table()[n.clamp(1, MAX_POINTS)];
    (&r.0, &r.1)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn rules_integrate_polynomials_exactly() {
        // An n-point Gauss rule is exact for degree 2n - 1 (any numerical analysis text).
        for n in 1..=MAX_POINTS {
            let (xs, ws) = rule(n);
            for deg in 0..(2 * n) {
                let exact = if deg % 2 == 1 {
                    0.0
                } else {
                    2.0 / (deg as f64 + 1.0)
                };
                let q: f64 = xs.iter().zip(ws).map(|(x, w)| w * x.powi(deg as i32)).sum();
                assert!((q - exact).abs() < 1e-14, "n={n} deg={deg}: {q} vs {exact}");
            }
        }
    }
}
