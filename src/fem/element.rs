//! The tapered beam element: exact static flexibility, stiffness derived from it, and a
//! consistent mass matrix built with the element's exact static deflection shapes.
//!
//! Nodal unknowns per node: lateral displacement w (m) and section rotation theta (rad);
//! element dofs ordered (w_a, theta_a, w_b, theta_b), a = lower node.
//!
//! Why "flexibility first": a cantilever is statically determinate, so the element clamped
//! at its lower node and loaded at its upper node by an end force P (N) and end moment C (N m)
//! has the exact end deformations
//!   theta_b - theta_a          = C F0 + P (h F0 - F1)
//!   w_b - w_a - h theta_a      = C (h F0 - F1) + P (h^2 F0 - 2 h F1 + F2 + G)
//! with F_k = int_0^h s^k / EI(s) ds and G = int_0^h 1 / (k G A(s)) ds (G = 0 for
//! Euler-Bernoulli). The element stiffness is the inverse of that 2x2 flexibility expanded by
//! equilibrium, so the global K is applied *exactly* by the O(N) recursion of
//! [`crate::fem::flexibility`]. For a uniform Euler-Bernoulli element this stiffness is the
//! classical Hermite-cubic one and the shapes below are the Hermite cubics; for a uniform
//! Timoshenko element it is the "interdependent interpolation" element (exact static shapes).
//! Integrals over the taper use Gauss-Legendre rules whose order grows with the element's
//! property variation, so they are exact to rounding, not midpoint approximations.

use super::gauss;

/// Section properties along one element as functions of the local coordinate s in [0, h].
pub trait ElementProperties {
    /// Bending stiffness E I(s), N m2.
    fn bending_stiffness_nm2(&self, s_m: f64) -> f64;
    /// Shear stiffness k G A(s), N; `f64::INFINITY` for Euler-Bernoulli.
    fn shear_stiffness_n(&self, s_m: f64) -> f64;
    /// Translational mass per length (shell + lining), kg/m.
    fn mass_per_length_kg_m(&self, s_m: f64) -> f64;
    /// Rotary inertia per length rho I(s), kg m; 0 for Euler-Bernoulli.
    fn rotary_inertia_kg_m(&self, s_m: f64) -> f64;
    /// Relative variation of the properties over the element (0 for a uniform element); sets
    /// the quadrature order.
    fn relative_variation(&self) -> f64;
}

/// The cumulative compliance integrals at one point s of the element.
#[derive(Debug, Clone, Copy, Default, PartialEq)]
struct Compliance {
    f0: f64,
    f1: f64,
    f2: f64,
    g: f64,
}

/// Number of Gauss points for the compliance integrals: a Gauss rule of n points on a
/// function of relative variation eps has error ~ eps^(2n); aim at 1e-17.
fn compliance_points(variation: f64) -> usize {
    if variation <= 1e-14 {
        return 2; // F2 integrates s^2 exactly with 2 points
    }
    let digits = -variation.log10();
    let n = (17.0 / (2.0 * digits.max(0.3))).ceil() as usize + 1;
    n.clamp(2, gauss::MAX_POINTS)
}

fn compliance_at<P: ElementProperties>(p: &P, s_m: f64, points: usize) -> Compliance {
    let (xs, ws) = gauss::rule(points);
    let half = 0.5 * s_m;
    let mut c = Compliance::default();
    for (x, w) in xs.iter().zip(ws) {
        let u = half * (1.0 + x);
        let wt = w * half;
        let inv_ei = 1.0 / p.bending_stiffness_nm2(u);
        c.f0 += wt * inv_ei;
        c.f1 += wt * u * inv_ei;
        c.f2 += wt * u * u * inv_ei;
        let kga = p.shear_stiffness_n(u);
        if kga.is_finite() {
            c.g += wt / kga;
        }
    }
    c
}

/// Gauss points of the mass integral: the integrand is m(s) (degree <= 2) times products of
/// near-cubic shapes, degree <= 8, so 5 points are exact for a uniform or linearly tapered
/// element; a few more cover the non-polynomial part of strongly tapered elements.
fn mass_points(variation: f64) -> usize {
    if variation <= 1e-14 {
        5
    } else if variation < 1e-3 {
        6
    } else {
        8
    }
}

/// One assembled element: its length, exact flexibility and 4x4 stiffness and mass.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Element {
    /// Length h, m.
    pub length_m: f64,
    /// Flexibility of the element clamped at its lower node: [f_ww, f_wt, f_tt] with
    /// (w_rel, theta_rel) = [[f_ww, f_wt], [f_wt, f_tt]] (P, C); units m/N, 1/N, 1/(N m).
    pub flexibility: [f64; 3],
    /// Element stiffness (w_a, theta_a, w_b, theta_b).
    pub stiffness: [[f64; 4]; 4],
    /// Consistent element mass (w_a, theta_a, w_b, theta_b).
    pub mass: [[f64; 4]; 4],
}

/// The 2x4 map R from nodal dofs to the end loads (P, C) at the upper node: R = F^-1 T with
/// T = [[-1, -h, 1, 0], [0, -1, 0, 1]].
fn end_load_map(flex: [f64; 3], h: f64) -> [[f64; 4]; 2] {
    let [a, b, c] = flex;
    let det = a * c - b * b;
    let inv = [[c / det, -b / det], [-b / det, a / det]];
    let t = [[-1.0, -h, 1.0, 0.0], [0.0, -1.0, 0.0, 1.0]];
    let mut r = [[0.0; 4]; 2];
    for i in 0..2 {
        for j in 0..4 {
            r[i][j] = inv[i][0] * t[0][j] + inv[i][1] * t[1][j];
        }
    }
    r
}

/// Exact static shape functions at s: (N_w, N_theta), each over (w_a, theta_a, w_b, theta_b).
fn shapes_at(c: Compliance, s: f64, h: f64, r: &[[f64; 4]; 2]) -> ([f64; 4], [f64; 4]) {
    let cw = s * c.f0 - c.f1; // w due to unit C
    let pw = s * h * c.f0 - (s + h) * c.f1 + c.f2 + c.g; // w due to unit P
    let ct = c.f0; // theta due to unit C
    let pt = h * c.f0 - c.f1; // theta due to unit P
    let mut nw = [0.0; 4];
    let mut nt = [0.0; 4];
    for j in 0..4 {
        nw[j] = cw * r[1][j] + pw * r[0][j];
        nt[j] = ct * r[1][j] + pt * r[0][j];
    }
    nw[0] += 1.0;
    nw[1] += s;
    nt[1] += 1.0;
    (nw, nt)
}

/// Sample points of an element for post-processing: (s, N_w) at the mass Gauss points with
/// their weights.
pub struct ShapeSamples {
    pub s_m: Vec<f64>,
    pub weight_m: Vec<f64>,
    pub displacement_shapes: Vec<[f64; 4]>,
}

impl Element {
    /// Integrates the element of length `h` with properties `p`.
    pub fn integrate<P: ElementProperties>(p: &P, h: f64) -> Element {
        let variation = p.relative_variation();
        let np = compliance_points(variation);
        let end = compliance_at(p, h, np);
        let flexibility = [
            h * h * end.f0 - 2.0 * h * end.f1 + end.f2 + end.g,
            h * end.f0 - end.f1,
            end.f0,
        ];
        let r = end_load_map(flexibility, h);
        // K = T^T F^-1 T = T^T R.
        let t = [[-1.0, -h, 1.0, 0.0], [0.0, -1.0, 0.0, 1.0]];
        let mut stiffness = [[0.0; 4]; 4];
        for i in 0..4 {
            for j in 0..4 {
                stiffness[i][j] = t[0][i] * r[0][j] + t[1][i] * r[1][j];
            }
        }
        let mut mass = [[0.0; 4]; 4];
        let (xs, ws) = gauss::rule(mass_points(variation));
        for (x, w) in xs.iter().zip(ws) {
            let s = 0.5 * h * (1.0 + x);
            let wt = 0.5 * h * w;
            let c = compliance_at(p, s, np);
            let (nw, nt) = shapes_at(c, s, h, &r);
            let m = p.mass_per_length_kg_m(s) * wt;
            let j_rot = p.rotary_inertia_kg_m(s) * wt;
            for i in 0..4 {
                for j in 0..4 {
                    mass[i][j] += m * nw[i] * nw[j] + j_rot * nt[i] * nt[j];
                }
            }
        }
        for i in 0..4 {
            for j in 0..i {
                let avg = 0.5 * (stiffness[i][j] + stiffness[j][i]);
                stiffness[i][j] = avg;
                stiffness[j][i] = avg;
                let avg = 0.5 * (mass[i][j] + mass[j][i]);
                mass[i][j] = avg;
                mass[j][i] = avg;
            }
        }
        Element {
            length_m: h,
            flexibility,
            stiffness,
            mass,
        }
    }

    /// Displacement shape functions at the mass Gauss points, for integrals of mode shapes
    /// over the element (equivalent mass, Annex E K and Kw).
    pub fn shape_samples<P: ElementProperties>(&self, p: &P) -> ShapeSamples {
        let h = self.length_m;
        let variation = p.relative_variation();
        let np = compliance_points(variation);
        let r = end_load_map(self.flexibility, h);
        let (xs, ws) = gauss::rule(mass_points(variation));
        let mut out = ShapeSamples {
            s_m: Vec::with_capacity(xs.len()),
            weight_m: Vec::with_capacity(xs.len()),
            displacement_shapes: Vec::with_capacity(xs.len()),
        };
        for (x, w) in xs.iter().zip(ws) {
            let s = 0.5 * h * (1.0 + x);
            let c = compliance_at(p, s, np);
            out.s_m.push(s);
            out.weight_m.push(0.5 * h * w);
            out.displacement_shapes.push(shapes_at(c, s, h, &r).0);
        }
        out
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    struct Uniform {
        ei: f64,
        kga: f64,
        m: f64,
        j: f64,
    }

    impl ElementProperties for Uniform {
        fn bending_stiffness_nm2(&self, _: f64) -> f64 {
            self.ei
        }
        fn shear_stiffness_n(&self, _: f64) -> f64 {
            self.kga
        }
        fn mass_per_length_kg_m(&self, _: f64) -> f64 {
            self.m
        }
        fn rotary_inertia_kg_m(&self, _: f64) -> f64 {
            self.j
        }
        fn relative_variation(&self) -> f64 {
            0.0
        }
    }

    #[rustfmt::skip]
    fn hermite_stiffness(ei: f64, h: f64) -> [[f64; 4]; 4] {
        let k = ei / h.powi(3);
        [
            [12.0 * k,      6.0 * h * k,       -12.0 * k,      6.0 * h * k],
            [6.0 * h * k,   4.0 * h * h * k,   -6.0 * h * k,   2.0 * h * h * k],
            [-12.0 * k,     -6.0 * h * k,      12.0 * k,       -6.0 * h * k],
            [6.0 * h * k,   2.0 * h * h * k,   -6.0 * h * k,   4.0 * h * h * k],
        ]
    }

    #[rustfmt::skip]
    fn hermite_mass(m: f64, h: f64) -> [[f64; 4]; 4] {
        let c = m * h / 420.0;
        [
            [156.0 * c,      22.0 * h * c,      54.0 * c,       -13.0 * h * c],
            [22.0 * h * c,   4.0 * h * h * c,   13.0 * h * c,   -3.0 * h * h * c],
            [54.0 * c,       13.0 * h * c,      156.0 * c,      -22.0 * h * c],
            [-13.0 * h * c,  -3.0 * h * h * c,  -22.0 * h * c,  4.0 * h * h * c],
        ]
    }

    #[test]
    fn uniform_euler_bernoulli_element_is_the_hermite_cubic() {
        // Classical Hermite beam element (Przemieniecki, Theory of Matrix Structural
        // Analysis, 1968, eqs. 5.111 and 11.39).
        let p = Uniform { ei: 3.0e11, kga: f64::INFINITY, m: 4.0e4, j: 0.0 };
        let h = 2.5;
        let e = Element::integrate(&p, h);
        let k = hermite_stiffness(p.ei, h);
        let m = hermite_mass(p.m, h);
        for i in 0..4 {
            for j in 0..4 {
                assert!((e.stiffness[i][j] - k[i][j]).abs() <= 1e-12 * k[0][0], "K[{i}][{j}]");
                assert!((e.mass[i][j] - m[i][j]).abs() <= 1e-12 * m[0][0], "M[{i}][{j}]");
            }
        }
    }

    #[test]
    fn uniform_timoshenko_stiffness_matches_closed_form() {
        // Timoshenko beam element with phi = 12 EI / (k G A h^2) (Przemieniecki 1968,
        // eq. 5.116): K11 = 12 EI / ((1 + phi) h^3), K22 = (4 + phi) EI / ((1 + phi) h).
        let p = Uniform { ei: 3.0e11, kga: 2.0e10, m: 4.0e4, j: 1.0e5 };
        let h = 4.0;
        let phi = 12.0 * p.ei / (p.kga * h * h);
        let e = Element::integrate(&p, h);
        assert_relative_eq!(e.stiffness[0][0], 12.0 * p.ei / ((1.0 + phi) * h.powi(3)), max_relative = 1e-13);
        assert_relative_eq!(e.stiffness[1][1], (4.0 + phi) * p.ei / ((1.0 + phi) * h), max_relative = 1e-13);
        assert_relative_eq!(e.stiffness[1][3], (2.0 - phi) * p.ei / ((1.0 + phi) * h), max_relative = 1e-13);
    }

    #[test]
    fn mass_matrix_reproduces_total_mass_and_rigid_rotation() {
        // A rigid translation u = (1, 0, 1, 0) must see the total mass m h.
        let p = Uniform { ei: 1.0e9, kga: 5.0e8, m: 300.0, j: 20.0 };
        let h = 1.7;
        let e = Element::integrate(&p, h);
        let u = [1.0, 0.0, 1.0, 0.0];
        let mut total = 0.0;
        for i in 0..4 {
            for j in 0..4 {
                total += u[i] * e.mass[i][j] * u[j];
            }
        }
        assert_relative_eq!(total, p.m * h, max_relative = 1e-13);
    }
}
