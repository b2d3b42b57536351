//! Compliance integrals of nearly uniform elements from a few samples of the compliance
//! rates: what almost every element of a fine mesh is.
//!
//! The element needs F_k(s) = int_0^s u^k / EI(u) du (k = 0..3), G(s) = int_0^s du / kGA(u)
//! and G1(s) = int_0^s u du / kGA(u), in 1/(N m^(2-k)), at its end and at its mass Gauss
//! points. When the properties change by a relative amount v over the element, 1/EI and
//! 1/kGA behave like (1 + v x)^-4 on x = u / h in [0, 1], so their interpolating polynomial
//! at m Chebyshev points is exact to about 2 C(m + 3, 3) (v / 4)^m relative (the Chebyshev
//! interpolation bound for a function analytic in a Bernstein ellipse ~4 / v wide); m is
//! chosen to make that 1e-17, i.e. rounding. The integrals of x^k L_j(x) over [0, X] for the
//! Lagrange basis L_j and the fixed targets X are tabulated once, so an element costs m
//! samples of the rates and a few short dot products instead of a Gauss rule nested in a
//! Gauss rule. Elements that vary more use the nested rules (see [`super::element`]).

use std::sync::OnceLock;

use super::gauss;

/// Most interpolation points; elements needing more use the nested Gauss rules.
pub const MAX_NODES: usize = 14;

/// Number of Chebyshev points that make the interpolated compliance exact to rounding for a
/// relative property variation `variation`, or None when the nested Gauss rules are needed.
pub fn nodes_for(variation: f64) -> Option<usize> {
    if !variation.is_finite() {
        return None;
    }
    (2..=MAX_NODES).find(|&m| {
        let binomial = ((m + 1) * (m + 2) * (m + 3)) as f64 / 6.0;
        2.0 * binomial * (variation / 4.0).powi(m as i32) <= 1e-17
    })
}

/// Tabulated integrals for one (m, mass rule) pair.
#[derive(Debug)]
pub struct Fit {
    /// Interpolation points x_j on [0, 1].
    pub nodes: Vec<f64>,
    /// `weights[t][k][j]` = int_0^X_t x^k L_j(x) dx; targets t are the mass Gauss points
    /// (mapped to [0, 1]) and then the element end X = 1.
    pub weights: Vec<[[f64; MAX_NODES]; 4]>,
}

fn build(m: usize, mass_points: usize) -> Fit {
    let nodes: Vec<f64> = (0..m)
        .map(|j| 0.5 * (1.0 - ((2 * j + 1) as f64 * std::f64::consts::PI / (2 * m) as f64).cos()))
        .collect();
    let lagrange = |j: usize, x: f64| -> f64 {
        (0..m)
            .filter(|&i| i != j)
            .map(|i| (x - nodes[i]) / (nodes[j] - nodes[i]))
            .product()
    };
    let (mx, _) = gauss::rule(mass_points);
    let mut targets: Vec<f64> = mx.iter().map(|x| 0.5 * (1.0 + x)).collect();
    targets.push(1.0);
    // x^k L_j(x) has degree <= 3 + m - 1: 6 Gauss points are exact up to m = 6, 9 up to
    // MAX_NODES = 14. (Up to 6 the tables are those of the earlier 6-point limit, bit for
    // bit: a stiff shell on springs sits at the edge of the solver's conditioning, and a
    // rounding-level change there once cost its basis.)
    let (gx, gw) = gauss::rule(if m <= 6 { 6 } else { 9 });
    let weights = targets
        .iter()
        .map(|&target| {
            let mut w = [[0.0; MAX_NODES]; 4];
            for (x, wt) in gx.iter().zip(gw) {
                let u = 0.5 * target * (1.0 + x);
                let weight = 0.5 * target * wt;
                for j in 0..m {
                    let l = lagrange(j, u) * weight;
                    let mut power = 1.0;
                    for row in w.iter_mut() {
                        row[j] += power * l;
                        power *= u;
                    }
                }
            }
            w
        })
        .collect();
    Fit { nodes, weights }
}

/// The table for `m` points and a `mass_points`-point mass rule (5 to 8 points), built once.
pub fn fit(m: usize, mass_points: usize) -> &'static Fit {
    const RULES: usize = 4; // mass rules of 5..=8 points
    static TABLES: OnceLock<Vec<Vec<Fit>>> = OnceLock::new();
    let tables = TABLES.get_or_init(|| {
        (2..=MAX_NODES)
            .map(|m| (5..5 + RULES).map(|n| build(m, n)).collect())
            .collect()
    });
    assert!((2..=MAX_NODES).contains(&m) && (5..5 + RULES).contains(&mass_points));
    &tables[m - 2][mass_points - 5]
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn weights_integrate_polynomials_exactly() {
        // int_0^X x^k q(x) dx for q of degree < m is reproduced exactly (closed form).
        for m in 2..=MAX_NODES {
            let f = fit(m, 5);
            let (mx, _) = gauss::rule(5);
            let mut targets: Vec<f64> = mx.iter().map(|x| 0.5 * (1.0 + x)).collect();
            targets.push(1.0);
            let degree = m - 1;
            let q = |x: f64| {
                (0..=degree)
                    .map(|i| (i as f64 + 1.0) * x.powi(i as i32))
                    .sum::<f64>()
            };
            for (t, &target) in targets.iter().enumerate() {
                for k in 0..4 {
                    let exact: f64 = (0..=degree)
                        .map(|i| {
                            (i as f64 + 1.0) * target.powi((i + k + 1) as i32) / (i + k + 1) as f64
                        })
                        .sum();
                    let approx: f64 = (0..m).map(|j| f.weights[t][k][j] * q(f.nodes[j])).sum();
                    assert!(
                        (approx - exact).abs() <= 1e-14 * exact.abs(),
                        "m {m} t {t} k {k}"
                    );
                }
            }
        }
    }

    #[test]
    fn point_count_grows_with_variation() {
        assert_eq!(nodes_for(0.0), Some(2));
        assert_eq!(nodes_for(1e-6), Some(3));
        assert_eq!(nodes_for(1e-4), Some(5));
        // A 7 m element of a coarse tapered mesh (variation ~0.1) still fits; a strong
        // taper does not.
        assert_eq!(nodes_for(0.1), Some(13));
        assert!(nodes_for(0.2).is_none());
        assert!(nodes_for(f64::NAN).is_none());
    }
}
