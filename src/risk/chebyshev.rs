//! Polynomial interpolation of a smooth function of one parameter at Chebyshev points of
//! the second kind, with the number of points chosen by a measured error: the tool behind
//! [`super::stiffness_family`].
//!
//! - Points x_j = cos(j pi / n), j = 0..n, on [-1, 1].
//! - The second (true) barycentric formula p(x) = sum_j (w_j / (x - x_j)) f_j /
//!   sum_j (w_j / (x - x_j)) with w_j = (-1)^j, halved at j = 0 and j = n. Berrut and
//!   Trefethen, "Barycentric Lagrange interpolation", SIAM Review 46(3), 2004, 501-517,
//!   sections 3 and 5 (read in a public copy of the article). It is forward stable at these
//!   points (same article, section 6), and the weights lambda_j(x) computed here are
//!   returned normalised so that sum_j lambda_j(x) = 1 and p(x) = sum_j lambda_j(x) f_j.
//! - Adaptive panels: the points of degree n are the even points of degree 2n. A panel's
//!   degree-n interpolant is judged by its deviation at the n other points of degree 2n;
//!   within the tolerance, the degree-2n interpolant (through all 2n + 1 values) is kept,
//!   otherwise the panel is halved. For an analytic function the error falls geometrically
//!   with n, so the kept interpolant is more accurate than the measured deviation (the
//!   doubling test and the splitting are those of the Chebfun system, common practice; the
//!   measured number is what is reported).
//!
//! Units: none (the caller maps its parameter onto [-1, 1]).

/// The Chebyshev points of the second kind of degree `n` (n + 1 points, from 1 down to -1).
pub fn points(n: usize) -> Vec<f64> {
    if n == 0 {
        return vec![0.0];
    }
    (0..=n)
        .map(|j| (j as f64 * std::f64::consts::PI / n as f64).cos())
        .collect()
}

/// The normalised barycentric weights lambda_j(x) of the degree-`n` points at `x` into
/// `out` (length n + 1): p(x) = sum_j lambda_j f_j. At a point itself lambda is exactly the
/// unit vector (no division by zero).
pub fn weights_at(points: &[f64], x: f64, out: &mut [f64]) {
    let n = points.len() - 1;
    if n == 0 {
        out[0] = 1.0;
        return;
    }
    if let Some(k) = points.iter().position(|&p| p == x) {
        out.iter_mut().for_each(|l| *l = 0.0);
        out[k] = 1.0;
        return;
    }
    let mut sum = 0.0;
    for (j, (&p, l)) in points.iter().zip(out.iter_mut()).enumerate() {
        let mut w = if j % 2 == 0 { 1.0 } else { -1.0 };
        if j == 0 || j == n {
            w *= 0.5;
        }
        *l = w / (x - p);
        sum += *l;
    }
    out.iter_mut().for_each(|l| *l /= sum);
}

/// What [`adapt`] found: panels covering [-1, 1], each with its interpolant.
#[derive(Debug, Clone)]
pub struct Adapted<T> {
    /// Degree of every panel's interpolant.
    pub degree: usize,
    /// Panel ends, ascending: panel i runs from `breaks[i]` to `breaks[i + 1]`.
    pub breaks: Vec<f64>,
    /// The values at each panel's points (`points(degree)` mapped onto the panel).
    pub values: Vec<Vec<T>>,
    /// Largest deviation of a kept panel's half-degree interpolant at its other points.
    pub measured_deviation: f64,
    /// Number of values computed.
    pub evaluations: usize,
}

impl<T> Adapted<T> {
    /// The panel holding `x` and the local coordinate in [-1, 1] there (x outside [-1, 1]
    /// is clamped).
    pub fn locate(&self, x: f64) -> (usize, f64) {
        locate(&self.breaks, x)
    }
}

/// The panel of `breaks` (ascending ends, at least two) holding `x` and the local
/// coordinate in [-1, 1] there (x outside is clamped to the first or last panel).
pub fn locate(breaks: &[f64], x: f64) -> (usize, f64) {
    let last = breaks.len() - 2;
    let i = breaks[1..=last].partition_point(|&b| b <= x).min(last);
    let (a, b) = (breaks[i], breaks[i + 1]);
    (i, ((2.0 * x - (a + b)) / (b - a)).clamp(-1.0, 1.0))
}

/// Why [`adapt`] gave up.
#[derive(Debug, Clone, PartialEq)]
pub enum AdaptError<E> {
    /// A value could not be computed at `x`.
    Value { x: f64, error: E },
    /// A panel as narrow as allowed still deviated by `deviation` (or the panels ran out).
    NotConverged { panels: usize, deviation: f64 },
}

/// Narrowest panel before [`adapt`] gives up.
pub const MIN_PANEL_WIDTH: f64 = 1.0 / 16_777_216.0;

/// Interpolates `value` on [-1, 1] piecewise: each panel (first the whole interval) gets
/// the values at its `degree` + 1 Chebyshev points; the interpolant through every other
/// point (degree / 2, `degree` even) is compared with the values at the others, and when it
/// deviates by more than `tolerance` the panel is halved. A function that is analytic
/// except at a few points where a derivative jumps (a root of a piecewise polynomial shape
/// crossing a node) is thus met with small panels there and one large panel elsewhere.
/// `deviation(interpolated, exact)` is the caller's measure; `combine(values, lambda)`
/// builds the interpolant's value from values and weights.
pub fn adapt<T, E>(
    mut value: impl FnMut(f64) -> Result<T, E>,
    combine: impl Fn(&[T], &[f64]) -> T,
    deviation: impl Fn(&T, &T) -> f64,
    degree: usize,
    max_panels: usize,
    tolerance: f64,
) -> Result<Adapted<T>, AdaptError<E>> {
    let degree = (degree.max(2) / 2) * 2;
    let local = points(degree);
    let coarse = points(degree / 2);
    let mut lambda = vec![0.0; degree / 2 + 1];
    let mut spread = vec![0.0; degree + 1];
    let mut done: Vec<(f64, f64, Vec<T>)> = Vec::new();
    let mut todo = vec![(-1.0f64, 1.0f64)];
    let mut worst: f64 = 0.0;
    let mut evaluations = 0;
    while let Some((a, b)) = todo.pop() {
        let mut vals = Vec::with_capacity(degree + 1);
        for &t in &local {
            let x = 0.5 * (a + b) + 0.5 * (b - a) * t;
            vals.push(value(x).map_err(|error| AdaptError::Value { x, error })?);
            evaluations += 1;
        }
        let mut dev: f64 = 0.0;
        for j in (1..degree).step_by(2) {
            weights_at(&coarse, local[j], &mut lambda);
            spread.iter_mut().for_each(|v| *v = 0.0);
            for (k, &l) in lambda.iter().enumerate() {
                spread[2 * k] = l;
            }
            dev = dev.max(deviation(&combine(&vals, &spread), &vals[j]));
        }
        if dev <= tolerance {
            worst = worst.max(dev);
            done.push((a, b, vals));
            continue;
        }
        if b - a <= MIN_PANEL_WIDTH || done.len() + todo.len() + 2 > max_panels {
            return Err(AdaptError::NotConverged {
                panels: done.len() + todo.len() + 1,
                deviation: dev,
            });
        }
        let m = 0.5 * (a + b);
        todo.push((m, b));
        todo.push((a, m));
    }
    done.sort_by(|x, y| x.0.total_cmp(&y.0));
    let mut breaks = vec![-1.0];
    breaks.extend(done.iter().map(|d| d.1));
    Ok(Adapted {
        degree,
        breaks,
        values: done.into_iter().map(|d| d.2).collect(),
        measured_deviation: worst,
        evaluations,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn interp(values: &[f64], lambda: &[f64]) -> f64 {
        values.iter().zip(lambda).map(|(v, l)| v * l).sum()
    }

    #[test]
    fn reproduces_a_polynomial_of_its_degree() {
        // Interpolation is exact for polynomials of degree <= n (uniqueness; any numerical
        // analysis text). x^5 - 2 x^2 + 1 at degree 5, to rounding.
        let f = |x: f64| x.powi(5) - 2.0 * x * x + 1.0;
        let p = points(5);
        let values: Vec<f64> = p.iter().map(|&x| f(x)).collect();
        let mut l = vec![0.0; 6];
        for i in 0..=40 {
            let x = -1.0 + i as f64 / 20.0;
            weights_at(&p, x, &mut l);
            assert!((interp(&values, &l) - f(x)).abs() < 1e-14, "x = {x}");
        }
    }

    #[test]
    fn weights_sum_to_one_and_are_unit_at_a_point() {
        let p = points(16);
        let mut l = vec![0.0; 17];
        weights_at(&p, 0.123, &mut l);
        assert!((l.iter().sum::<f64>() - 1.0).abs() < 1e-14);
        weights_at(&p, p[3], &mut l);
        assert_eq!(l[3], 1.0);
        assert_eq!(l.iter().filter(|&&v| v != 0.0).count(), 1);
    }

    #[test]
    fn an_analytic_function_converges_to_rounding() {
        // exp(x) on [-1, 1]: the Chebyshev interpolant's error falls like 1 / (2^n n!)
        // (Bernstein's bound; Trefethen, Approximation Theory and Approximation Practice,
        // ch. 8, from memory) so the half degree 16 is at rounding level: one panel.
        let a = adapt(
            |x| Ok::<f64, ()>(x.exp()),
            interp,
            |a, b| (a - b).abs() / b.abs(),
            32,
            64,
            1e-13,
        )
        .unwrap();
        assert_eq!(a.values.len(), 1, "one panel");
        let p = points(a.degree);
        let mut l = vec![0.0; a.degree + 1];
        for i in 0..=200 {
            let x = -1.0 + i as f64 / 100.0;
            weights_at(&p, x, &mut l);
            assert!((interp(&a.values[0], &l) - x.exp()).abs() < 1e-14 * x.exp());
        }
    }

    #[test]
    fn a_jump_in_the_third_derivative_is_met_with_small_panels() {
        // |x - 0.3|^3 + exp(x): C2, its third derivative jumps at 0.3 (the kind of point a
        // root of a piecewise-cubic shape makes when it crosses a node). One polynomial
        // converges only algebraically there; the panels halve around 0.3 until the
        // tolerance holds, and the result is checked against the function itself.
        let f = |x: f64| (x - 0.3).abs().powi(3) + x.exp();
        let a = adapt(
            |x| Ok::<f64, ()>(f(x)),
            interp,
            |a, b| (a - b).abs(),
            16,
            256,
            1e-12,
        )
        .unwrap();
        assert!(
            a.values.len() > 2 && a.values.len() < 100,
            "{}",
            a.values.len()
        );
        let p = points(a.degree);
        let mut l = vec![0.0; a.degree + 1];
        let mut worst: f64 = 0.0;
        for i in 0..=2000 {
            let x = -1.0 + i as f64 / 1000.0;
            let (k, t) = a.locate(x);
            weights_at(&p, t, &mut l);
            worst = worst.max((interp(&a.values[k], &l) - f(x)).abs());
        }
        assert!(worst < 1e-11, "{worst:e}");
    }

    #[test]
    fn a_jump_is_refused() {
        // A step at 0.3: no polynomial panel meets the tolerance however narrow, so the
        // caller learns it.
        let r = adapt(
            |x| Ok::<f64, ()>(if x < 0.3 { 0.0 } else { 1.0 }),
            interp,
            |a, b| (a - b).abs(),
            16,
            1000,
            1e-10,
        );
        match r {
            Err(AdaptError::NotConverged { deviation, .. }) => {
                assert!(deviation > 1e-3, "{deviation}");
            }
            other => panic!("{other:?}"),
        }
    }

    #[test]
    fn a_failed_value_names_its_point() {
        let r = adapt(
            |x| if x < -0.5 { Err("no") } else { Ok(x) },
            interp,
            |a, b| (a - b).abs(),
            4,
            16,
            1e-12,
        );
        assert!(matches!(r, Err(AdaptError::Value { x, error: "no" }) if x < -0.5));
    }
}
