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
//!
//! Each element also carries two internal "bubble" dofs: the exact static solutions of the
//! element clamped at both ends under a uniform lateral load (q1, m) and under a uniform
//! distributed moment (q2, rad). They vanish with their slopes at both nodes and are
//! energy-orthogonal to the end-load shapes (Betti), so K is block-diagonal in them (a 2x2
//! block per element) and K^-1 remains an O(N) recursion. Without them the shear force is
//! constant in an element and translational and rotary inertia loads are not represented, so
//! Timoshenko frequencies converge only as h^2; with them both theories converge at least as
//! h^4.
//! Element dofs are ordered (w_a, theta_a, q1, q2, w_b, theta_b).
//!
//! Integrals over the taper use Gauss-Legendre rules whose order grows with the element's
//! property variation, so they are exact to rounding, not midpoint approximations.

use super::compliance_fit;
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
    /// (1 / E I(s), 1 / k G A(s)) in 1/(N m2) and 1/N, the integrands of the compliance;
    /// 1 / k G A = 0 for Euler-Bernoulli. Override when both share work.
    fn compliance_rates(&self, s_m: f64) -> (f64, f64) {
        let kga = self.shear_stiffness_n(s_m);
        let shear = if kga.is_finite() { 1.0 / kga } else { 0.0 };
        (1.0 / self.bending_stiffness_nm2(s_m), shear)
    }
}

/// The cumulative compliance integrals at one point s of the element:
/// F_k(s) = int_0^s u^k / EI(u) du (k = 0..3), G(s) = int_0^s du / kGA(u),
/// G1(s) = int_0^s u du / kGA(u).
#[derive(Debug, Clone, Copy, Default, PartialEq)]
pub struct Compliance {
    f0: f64,
    f1: f64,
    f2: f64,
    f3: f64,
    g: f64,
    g1: f64,
}

impl Compliance {
    /// These integrals (over [0, s]) followed by `next`, the integrals of the same
    /// properties over the adjacent interval [s, s + h'] taken about its own start:
    /// (a + v)^k expanded binomially with a = s. Every term is positive, so nothing cancels.
    pub fn extended(&self, s_m: f64, next: &Compliance) -> Compliance {
        let a = s_m;
        let a2 = a * a;
        Compliance {
            f0: self.f0 + next.f0,
            f1: self.f1 + a * next.f0 + next.f1,
            f2: self.f2 + a2 * next.f0 + 2.0 * a * next.f1 + next.f2,
            f3: self.f3 + a2 * a * next.f0 + 3.0 * a2 * next.f1 + 3.0 * a * next.f2 + next.f3,
            g: self.g + next.g,
            g1: self.g1 + a * next.g + next.g1,
        }
    }
}

/// Number of Gauss points for the compliance integrals. The integrands behave like
/// 1 / (1 + eps s/h)^4, analytic with the nearest singularity ~ h / eps away, so an n-point
/// Gauss rule converges like (eps / 3)^(2n) or faster; aim at 1e-17 plus one point of margin.
fn compliance_points(variation: f64) -> usize {
    if variation <= 1e-14 {
        return 2; // F3 integrates s^3 exactly with 2 points
    }
    let digits = (3.0 / variation).log10().max(0.3);
    let n = (17.0 / (2.0 * digits)).ceil() as usize + 1;
    n.clamp(2, gauss::MAX_POINTS)
}

fn compliance_at<P: ElementProperties>(p: &P, s_m: f64, points: usize) -> Compliance {
    let (xs, ws) = gauss::rule(points);
    let half = 0.5 * s_m;
    let mut c = Compliance::default();
    for (x, w) in xs.iter().zip(ws) {
        let u = half * (1.0 + x);
        let wt = w * half;
        let (inv_ei, inv_kga) = p.compliance_rates(u);
        c.f0 += wt * inv_ei;
        c.f1 += wt * u * inv_ei;
        c.f2 += wt * u * u * inv_ei;
        c.f3 += wt * u * u * u * inv_ei;
        c.g += wt * inv_kga;
        c.g1 += wt * u * inv_kga;
    }
    c
}

/// Most mass Gauss points (see [`mass_points`]).
const MAX_MASS_POINTS: usize = 8;

/// The compliance integrals at the element end and at the mass Gauss points `xs` (on
/// [-1, 1]): interpolated from a few samples for nearly uniform elements
/// ([`compliance_fit`]), by nested Gauss rules otherwise. Both are exact to rounding.
fn compliances<P: ElementProperties>(
    p: &P,
    h: f64,
    variation: f64,
    xs: &[f64],
) -> (Compliance, [Compliance; MAX_MASS_POINTS]) {
    let mut at = [Compliance::default(); MAX_MASS_POINTS];
    match compliance_fit::nodes_for(variation) {
        Some(m) => {
            let fit = compliance_fit::fit(m, xs.len());
            let mut rates = [(0.0, 0.0); compliance_fit::MAX_NODES];
            for (rate, x) in rates.iter_mut().zip(&fit.nodes) {
                *rate = p.compliance_rates(h * x);
            }
            let h2 = h * h;
            let scales = [h, h2, h2 * h, h2 * h2];
            let integrals = |w: &[[f64; compliance_fit::MAX_NODES]; 4]| {
                let mut f = [0.0; 4];
                let (mut g, mut g1) = (0.0, 0.0);
                for (j, &(r, q)) in rates.iter().enumerate().take(m) {
                    for k in 0..4 {
                        f[k] += w[k][j] * r;
                    }
                    g += w[0][j] * q;
                    g1 += w[1][j] * q;
                }
                Compliance {
                    f0: scales[0] * f[0],
                    f1: scales[1] * f[1],
                    f2: scales[2] * f[2],
                    f3: scales[3] * f[3],
                    g: scales[0] * g,
                    g1: scales[1] * g1,
                }
            };
            for (c, w) in at.iter_mut().zip(&fit.weights[..xs.len()]) {
                *c = integrals(w);
            }
            (integrals(&fit.weights[xs.len()]), at)
        }
        None => {
            let np = compliance_points(variation);
            for (c, x) in at.iter_mut().zip(xs) {
                *c = compliance_at(p, 0.5 * h * (1.0 + x), np);
            }
            (compliance_at(p, h, np), at)
        }
    }
}

/// Gauss points of the mass integral: the integrand is m(s) (degree <= 2) times products of
/// near-cubic shapes, degree <= 8, so 5 points are exact for a uniform or linearly tapered
/// element; a few more cover the non-polynomial part of strongly tapered elements.
fn mass_points(variation: f64) -> usize {
    // Below 1e-3 (every element of a fine mesh) the non-polynomial part is ~variation times
    // the integrand and a 5-point rule leaves ~variation^10 of it: rounding.
    if variation < 1e-3 {
        5
    } else if variation < 0.3 {
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
    /// Per bubble: (M0, V0) of the clamped-clamped solution and the scale that gives it unit
    /// mean deflection (bubble 1) or unit mean rotation (bubble 2).
    bubbles: [[f64; 3]; 2],
    /// Inverse of the 2x2 bubble stiffness block (symmetric: [b11, b12, b22]).
    pub bubble_flexibility: [f64; 3],
    /// The compliance integrals over the whole element (about its lower node).
    pub compliance: Compliance,
}

/// The element's 6x6 matrices over (w_a, theta_a, q1, q2, w_b, theta_b); assembled into the
/// band and then dropped (the model keeps only [`Element`], which is much smaller).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct ElementMatrices {
    /// Element stiffness; bubbles uncoupled from nodes.
    pub stiffness: [[f64; 6]; 6],
    /// Consistent element mass.
    pub mass: [[f64; 6]; 6],
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

/// Clamped-clamped element under a uniform lateral load q and distributed moment mu:
/// V = V0 - q s, M = M0 - V0 s + q s^2/2 - mu s. Returns (M0, V0) from theta(h) = w(h) = 0.
fn bubble_end_values(end: Compliance, h: f64, q: f64, mu: f64) -> (f64, f64) {
    // theta(h): M0 F0 - V0 F1 = -q F2/2 + mu F1
    // w(h):     M0 (h F0 - F1) - V0 (h F1 - F2 - G) = -q (h F2 - F3)/2 + mu (h F1 - F2) + q G1
    let a11 = end.f0;
    let a12 = -end.f1;
    let b1 = -0.5 * q * end.f2 + mu * end.f1;
    let a21 = h * end.f0 - end.f1;
    let a22 = -(h * end.f1 - end.f2 - end.g);
    let b2 = -0.5 * q * (h * end.f2 - end.f3) + mu * (h * end.f1 - end.f2) + q * end.g1;
    let det = a11 * a22 - a12 * a21;
    ((b1 * a22 - a12 * b2) / det, (a11 * b2 - a21 * b1) / det)
}

/// Deflection and rotation at s of the clamped-clamped solution for (q, mu) with end values
/// (M0, V0) (not yet scaled).
fn bubble_at(c: Compliance, s: f64, q: f64, mu: f64, m0: f64, v0: f64) -> (f64, f64) {
    let theta = m0 * c.f0 - v0 * c.f1 + 0.5 * q * c.f2 - mu * c.f1;
    let w = m0 * (s * c.f0 - c.f1) - v0 * (s * c.f1 - c.f2) + 0.5 * q * (s * c.f2 - c.f3)
        - mu * (s * c.f1 - c.f2)
        + v0 * c.g
        - q * c.g1;
    (w, theta)
}

/// The two bubbles' loads (q, mu): uniform lateral load, uniform distributed moment.
const BUBBLE_LOADS: [(f64, f64); 2] = [(1.0, 0.0), (0.0, 1.0)];

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
    /// N_w over (w_a, theta_a, q1, q2, w_b, theta_b).
    pub displacement_shapes: Vec<[f64; 6]>,
}

impl Element {
    /// Integrates the element of length `h` with properties `p`.
    pub fn integrate<P: ElementProperties>(p: &P, h: f64) -> (Element, ElementMatrices) {
        let variation = p.relative_variation();
        let (xs, ws) = gauss::rule(mass_points(variation));
        let (end, at_points) = compliances(p, h, variation, xs);
        let flexibility = [
            h * h * end.f0 - 2.0 * h * end.f1 + end.f2 + end.g,
            h * end.f0 - end.f1,
            end.f0,
        ];
        let r = end_load_map(flexibility, h);
        // K = T^T F^-1 T = T^T R.
        let t = [[-1.0, -h, 1.0, 0.0], [0.0, -1.0, 0.0, 1.0]];
        let mut k4 = [[0.0; 4]; 4];
        for i in 0..4 {
            for j in 0..4 {
                k4[i][j] = t[0][i] * r[0][j] + t[1][i] * r[1][j];
            }
        }
        let ends = BUBBLE_LOADS.map(|(q, mu)| bubble_end_values(end, h, q, mu));
        // work[i][j] = int (q_i w_j + mu_i theta_j) ds: the bubble stiffness block before
        // scaling (symmetric by Betti); scale[j] = mean deflection (j = 0) or rotation (j = 1).
        let mut work = [[0.0; 2]; 2];
        let mut samples = Vec::with_capacity(xs.len());
        for ((x, w), &c) in xs.iter().zip(ws).zip(&at_points) {
            let s = 0.5 * h * (1.0 + x);
            let wt = 0.5 * h * w;
            let (nw, nt) = shapes_at(c, s, h, &r);
            let mut bw = [0.0; 2];
            let mut bt = [0.0; 2];
            for j in 0..2 {
                let (q, mu) = BUBBLE_LOADS[j];
                (bw[j], bt[j]) = bubble_at(c, s, q, mu, ends[j].0, ends[j].1);
            }
            for (i, (q, mu)) in BUBBLE_LOADS.iter().enumerate() {
                for j in 0..2 {
                    work[i][j] += wt * (q * bw[j] + mu * bt[j]);
                }
            }
            samples.push((s, wt, nw, nt, bw, bt));
        }
        // Euler-Bernoulli: a uniform distributed moment on a clamped-clamped element leaves
        // M = 0, so the moment bubble vanishes; keep its dof as an inert unit spring with no
        // mass (it then stays zero and adds one positive pivot to the Sturm count).
        let moment_bubble = work[1][1] > 1e-14 * work[0][0] * h * h;
        let scale = [
            work[0][0] / h,
            if moment_bubble {
                work[1][1] / h
            } else {
                f64::INFINITY
            },
        ];
        let k11 = work[0][0] / (scale[0] * scale[0]);
        let (k12, k22) = if moment_bubble {
            (
                0.5 * (work[0][1] + work[1][0]) / (scale[0] * scale[1]),
                work[1][1] / (scale[1] * scale[1]),
            )
        } else {
            (0.0, 1.0)
        };
        let det_b = k11 * k22 - k12 * k12;
        let bubble_flexibility = [k22 / det_b, -k12 / det_b, k11 / det_b];
        let mut mass = [[0.0; 6]; 6];
        for (s, wt, nw, nt, bw, bt) in samples {
            let sw = [
                nw[0],
                nw[1],
                bw[0] / scale[0],
                bw[1] / scale[1],
                nw[2],
                nw[3],
            ];
            let st = [
                nt[0],
                nt[1],
                bt[0] / scale[0],
                bt[1] / scale[1],
                nt[2],
                nt[3],
            ];
            let m = p.mass_per_length_kg_m(s) * wt;
            let j_rot = p.rotary_inertia_kg_m(s) * wt;
            // Upper triangle only; mirrored below (the matrix is symmetric by construction).
            for i in 0..6 {
                let (mi, ji) = (m * sw[i], j_rot * st[i]);
                for j in i..6 {
                    mass[i][j] += mi * sw[j] + ji * st[j];
                }
            }
        }
        for i in 1..6 {
            for j in 0..i {
                mass[i][j] = mass[j][i];
            }
        }
        let mut stiffness = [[0.0; 6]; 6];
        let map = [0, 1, 4, 5];
        for i in 0..4 {
            for j in 0..4 {
                stiffness[map[i]][map[j]] = 0.5 * (k4[i][j] + k4[j][i]);
            }
        }
        stiffness[2][2] = k11;
        stiffness[2][3] = k12;
        stiffness[3][2] = k12;
        stiffness[3][3] = k22;
        (
            Element {
                length_m: h,
                flexibility,
                bubbles: [
                    [ends[0].0, ends[0].1, scale[0]],
                    [ends[1].0, ends[1].1, scale[1]],
                ],
                bubble_flexibility,
                compliance: end,
            },
            ElementMatrices { stiffness, mass },
        )
    }

    /// Displacement and rotation shape functions (N_w, N_theta) over
    /// (w_a, theta_a, q1, q2, w_b, theta_b) at local coordinate s.
    pub fn shapes<P: ElementProperties>(&self, p: &P, s_m: f64) -> ([f64; 6], [f64; 6]) {
        let np = compliance_points(p.relative_variation());
        let c = compliance_at(p, s_m, np);
        self.shapes_with(c, s_m, &self.end_load_map())
    }

    /// The compliance integrals of `p` over [0, s] by Gauss rules (the start of a run of
    /// [`Compliance::extended`] steps).
    pub fn compliance_to<P: ElementProperties>(p: &P, s_m: f64) -> Compliance {
        compliance_at(p, s_m, compliance_points(p.relative_variation()))
    }

    /// The map from nodal dofs to end loads (see [`Element::shapes_with`]).
    pub fn end_load_map(&self) -> [[f64; 4]; 2] {
        end_load_map(self.flexibility, self.length_m)
    }

    /// [`Element::shapes`] at s from the compliance integrals `c` over [0, s] and the
    /// element's [`Element::end_load_map`] `r`.
    pub fn shapes_with(&self, c: Compliance, s_m: f64, r: &[[f64; 4]; 2]) -> ([f64; 6], [f64; 6]) {
        let h = self.length_m;
        let (nw, nt) = shapes_at(c, s_m, h, r);
        let mut bw = [0.0; 2];
        let mut bt = [0.0; 2];
        for (j, (q, mu)) in BUBBLE_LOADS.iter().enumerate() {
            let [m0, v0, scale] = self.bubbles[j];
            let (w, t) = bubble_at(c, s_m, *q, *mu, m0, v0);
            bw[j] = w / scale;
            bt[j] = t / scale;
        }
        (
            [nw[0], nw[1], bw[0], bw[1], nw[2], nw[3]],
            [nt[0], nt[1], bt[0], bt[1], nt[2], nt[3]],
        )
    }

    /// Displacement shape functions at the mass Gauss points, for integrals of mode shapes
    /// over the element (equivalent mass, Annex E K and Kw).
    pub fn shape_samples<P: ElementProperties>(&self, p: &P) -> ShapeSamples {
        let h = self.length_m;
        let variation = p.relative_variation();
        let r = end_load_map(self.flexibility, h);
        let (xs, ws) = gauss::rule(mass_points(variation));
        // The same compliance integrals as `integrate` took at these points (the fit for
        // nearly uniform elements): exact to rounding, and a fraction of the nested rules.
        let (_, at_points) = compliances(p, h, variation, xs);
        let mut out = ShapeSamples {
            s_m: Vec::with_capacity(xs.len()),
            weight_m: Vec::with_capacity(xs.len()),
            displacement_shapes: Vec::with_capacity(xs.len()),
        };
        for ((x, w), &c) in xs.iter().zip(ws).zip(&at_points) {
            let s = 0.5 * h * (1.0 + x);
            out.s_m.push(s);
            out.weight_m.push(0.5 * h * w);
            let nw = shapes_at(c, s, h, &r).0;
            let mut bw = [0.0; 2];
            for (j, (q, mu)) in BUBBLE_LOADS.iter().enumerate() {
                let [m0, v0, scale] = self.bubbles[j];
                bw[j] = bubble_at(c, s, *q, *mu, m0, v0).0 / scale;
            }
            out.displacement_shapes
                .push([nw[0], nw[1], bw[0], bw[1], nw[2], nw[3]]);
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
        let p = Uniform {
            ei: 3.0e11,
            kga: f64::INFINITY,
            m: 4.0e4,
            j: 0.0,
        };
        let h = 2.5;
        let (_, e) = Element::integrate(&p, h);
        let k = hermite_stiffness(p.ei, h);
        let m = hermite_mass(p.m, h);
        let map = [0, 1, 4, 5];
        for i in 0..4 {
            for j in 0..4 {
                let (a, b) = (map[i], map[j]);
                assert!(
                    (e.stiffness[a][b] - k[i][j]).abs() <= 1e-12 * k[0][0],
                    "K[{i}][{j}]"
                );
                assert!(
                    (e.mass[a][b] - m[i][j]).abs() <= 1e-12 * m[0][0],
                    "M[{i}][{j}]"
                );
            }
        }
        // The load bubble of a uniform Euler-Bernoulli element is w = s^2 (h - s)^2 / (24 EI),
        // mean h^4 / (720 EI), so k_q1 = 720 EI / h^3 (direct integration).
        assert_relative_eq!(
            e.stiffness[2][2],
            720.0 * p.ei / h.powi(3),
            max_relative = 1e-12
        );
    }

    #[test]
    fn uniform_timoshenko_stiffness_matches_closed_form() {
        // Timoshenko beam element with phi = 12 EI / (k G A h^2) (Przemieniecki 1968,
        // eq. 5.116): K11 = 12 EI / ((1 + phi) h^3), K22 = (4 + phi) EI / ((1 + phi) h).
        let p = Uniform {
            ei: 3.0e11,
            kga: 2.0e10,
            m: 4.0e4,
            j: 1.0e5,
        };
        let h = 4.0;
        let phi = 12.0 * p.ei / (p.kga * h * h);
        let (_, e) = Element::integrate(&p, h);
        assert_relative_eq!(
            e.stiffness[0][0],
            12.0 * p.ei / ((1.0 + phi) * h.powi(3)),
            max_relative = 1e-13
        );
        assert_relative_eq!(
            e.stiffness[1][1],
            (4.0 + phi) * p.ei / ((1.0 + phi) * h),
            max_relative = 1e-13
        );
        assert_relative_eq!(
            e.stiffness[1][5],
            (2.0 - phi) * p.ei / ((1.0 + phi) * h),
            max_relative = 1e-13
        );
        for k in [0, 1, 4, 5] {
            assert_eq!(e.stiffness[2][k], 0.0);
            assert_eq!(e.stiffness[3][k], 0.0);
        }
    }

    #[test]
    fn mass_matrix_reproduces_total_mass_and_rigid_rotation() {
        // A rigid translation u = (1, 0, 1, 0) must see the total mass m h.
        let p = Uniform {
            ei: 1.0e9,
            kga: 5.0e8,
            m: 300.0,
            j: 20.0,
        };
        let h = 1.7;
        let (_, e) = Element::integrate(&p, h);
        let u = [1.0, 0.0, 0.0, 0.0, 1.0, 0.0];
        let mut total = 0.0;
        for i in 0..6 {
            for j in 0..6 {
                total += u[i] * e.mass[i][j] * u[j];
            }
        }
        assert_relative_eq!(total, p.m * h, max_relative = 1e-13);
    }

    /// A tapered annulus-like element: D and t linear in s.
    struct Tapered {
        h: f64,
        d0: f64,
        d1: f64,
        t0: f64,
        t1: f64,
        /// Reported variation; a large value forces the nested Gauss rules.
        reported: Option<f64>,
    }

    impl Tapered {
        fn dt(&self, s: f64) -> (f64, f64) {
            let x = s / self.h;
            (
                self.d0 + x * (self.d1 - self.d0),
                self.t0 + x * (self.t1 - self.t0),
            )
        }
        fn inertia(&self, s: f64) -> f64 {
            let (d, t) = self.dt(s);
            let di = d - 2.0 * t;
            std::f64::consts::PI / 64.0 * (d.powi(4) - di.powi(4))
        }
        fn area(&self, s: f64) -> f64 {
            let (d, t) = self.dt(s);
            std::f64::consts::PI * t * (d - t)
        }
    }

    impl ElementProperties for Tapered {
        fn bending_stiffness_nm2(&self, s: f64) -> f64 {
            3.2e10 * self.inertia(s)
        }
        fn shear_stiffness_n(&self, s: f64) -> f64 {
            0.5 * 1.33e10 * self.area(s)
        }
        fn mass_per_length_kg_m(&self, s: f64) -> f64 {
            2500.0 * self.area(s) + 400.0
        }
        fn rotary_inertia_kg_m(&self, s: f64) -> f64 {
            2500.0 * self.inertia(s)
        }
        fn relative_variation(&self) -> f64 {
            let dd = (self.d1 - self.d0).abs() / self.d0.min(self.d1);
            let dt = (self.t1 - self.t0).abs() / self.t0.min(self.t1);
            self.reported.unwrap_or(3.0 * dd + dt)
        }
    }

    #[test]
    fn interpolated_compliance_matches_nested_gauss_rules() {
        // Two independent quadratures of the same integrals: the interpolated path
        // (compliance_fit) against nested Gauss-Legendre rules of 9+ points, which are exact
        // to rounding for these smooth integrands.
        for rel in [0.0, 1e-8, 3e-6, 5e-5, 2e-4, 6e-4, 2e-3, 2e-2, 0.08, 0.13] {
            let (h, d0, t0) = (0.4, 12.0, 0.35);
            let fast = Tapered {
                h,
                d0,
                d1: d0 * (1.0 - rel / 4.0),
                t0,
                t1: t0 * (1.0 - rel / 4.0),
                reported: None,
            };
            assert!(compliance_fit::nodes_for(fast.relative_variation()).is_some());
            let nested = Tapered {
                reported: Some(0.05),
                ..fast
            };
            let (ef, mf) = Element::integrate(&fast, h);
            let (en, mn) = Element::integrate(&nested, h);
            for k in 0..3 {
                assert_relative_eq!(ef.flexibility[k], en.flexibility[k], max_relative = 1e-13);
                assert_relative_eq!(
                    ef.bubble_flexibility[k],
                    en.bubble_flexibility[k],
                    max_relative = 1e-11
                );
            }
            let scale = |a: &[[f64; 6]; 6]| a.iter().flatten().fold(0.0f64, |m, v| m.max(v.abs()));
            let (sm, sk) = (scale(&mn.mass), scale(&mn.stiffness));
            for i in 0..6 {
                for j in 0..6 {
                    assert!(
                        (mf.mass[i][j] - mn.mass[i][j]).abs() <= 1e-13 * sm,
                        "M {i}{j} at {rel}"
                    );
                    assert!(
                        (mf.stiffness[i][j] - mn.stiffness[i][j]).abs() <= 1e-11 * sk,
                        "K {i}{j} at {rel}"
                    );
                }
            }
        }
    }
}
