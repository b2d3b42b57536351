//! A borrowed view of one mode shape along the height, with exact-enough integrals over it.
//!
//! Units: heights in m, the shape dimensionless (normalised to max |Phi| = 1 by `modal`),
//! slopes in 1/m. Between nodes the shape is the cubic Hermite interpolant of the nodal
//! displacements and rotations, i.e. exactly the shape the beam elements carry (any FE text on
//! Hermite beam elements). Without rotations it falls back to linear interpolation.
//! Integrals use 4-point Gauss-Legendre per element (exact for polynomials up to degree 7, so
//! exact for Phi, Phi^2 and m Phi^2 with linear m on a Hermite element; |Phi| is made exact
//! by splitting an element where Phi changes sign).

use crate::modal::{Mode, StageModel};

/// Gauss-Legendre points on [0, 1] and their weights (4 points; Abramowitz & Stegun 25.4.30).
pub(crate) const GAUSS4: [(f64, f64); 4] = [
    (0.069_431_844_202_973_71, 0.173_927_422_568_726_93),
    (0.330_009_478_207_571_87, 0.326_072_577_431_273_07),
    (0.669_990_521_792_428_1, 0.326_072_577_431_273_07),
    (0.930_568_155_797_026_3, 0.173_927_422_568_726_93),
];

/// One mode shape on the node grid of its stage (borrowed, no allocation).
#[derive(Debug, Clone, Copy)]
pub struct ModeShape<'a> {
    z_m: &'a [f64],
    phi: &'a [f64],
    slope_per_m: Option<&'a [f64]>,
}

impl<'a> ModeShape<'a> {
    /// A shape from node heights (strictly increasing), nodal displacements and optionally
    /// nodal slopes dPhi/dz. Lengths must agree (programmer error otherwise).
    #[track_caller]
    pub fn new(z_m: &'a [f64], phi: &'a [f64], slope_per_m: Option<&'a [f64]>) -> Self {
        assert!(z_m.len() >= 2, "a mode shape needs at least two nodes");
        assert_eq!(
            z_m.len(),
            phi.len(),
            "node heights and displacements differ in length"
        );
        if let Some(s) = slope_per_m {
            assert_eq!(
                z_m.len(),
                s.len(),
                "node heights and slopes differ in length"
            );
        }
        ModeShape {
            z_m,
            phi,
            slope_per_m,
        }
    }

    /// The shape of `mode` on the nodes of `model`; uses the rotations when the mode has one
    /// per node.
    #[track_caller]
    pub fn from_mode(model: &'a StageModel, mode: &'a Mode) -> Self {
        let slope = (mode.rotation_per_m.len() == model.z_m.len())
            .then_some(mode.rotation_per_m.as_slice());
        ModeShape::new(&model.z_m, &mode.displacement, slope)
    }

    pub fn z_m(&self) -> &'a [f64] {
        self.z_m
    }

    pub fn nodal(&self) -> &'a [f64] {
        self.phi
    }

    /// Number of elements (node intervals).
    pub fn elements(&self) -> usize {
        self.z_m.len() - 1
    }

    /// Height of the top node, m.
    pub fn height_m(&self) -> f64 {
        self.z_m[self.z_m.len() - 1]
    }

    /// Shape at local coordinate `t` in [0, 1] of element `e`.
    #[inline]
    pub fn eval(&self, e: usize, t: f64) -> f64 {
        let (p0, p1) = (self.phi[e], self.phi[e + 1]);
        match self.slope_per_m {
            Some(s) => {
                let l = self.z_m[e + 1] - self.z_m[e];
                let t2 = t * t;
                let t3 = t2 * t;
                p0 * (1.0 - 3.0 * t2 + 2.0 * t3)
                    + s[e] * l * (t - 2.0 * t2 + t3)
                    + p1 * (3.0 * t2 - 2.0 * t3)
                    + s[e + 1] * l * (t3 - t2)
            }
            None => p0 + (p1 - p0) * t,
        }
    }

    /// Element index containing height `z_m` (clamped to the ends).
    pub fn element_at(&self, z_m: f64) -> usize {
        let n = self.z_m.len();
        match self.z_m.partition_point(|&z| z <= z_m) {
            0 => 0,
            i if i >= n => n - 2,
            i => i - 1,
        }
    }

    /// Shape at height `z_m` (clamped to the structure).
    pub fn value_at(&self, z_m: f64) -> f64 {
        let e = self.element_at(z_m);
        let (za, zb) = (self.z_m[e], self.z_m[e + 1]);
        self.eval(e, ((z_m - za) / (zb - za)).clamp(0.0, 1.0))
    }

    /// Calls `visit(e, za, lo, hi)` for each element e that overlaps [a, b] (clipped to the
    /// structure), with the element's base height za and the overlap [lo, hi] (lo < hi).
    fn pieces(&self, a_m: f64, b_m: f64, mut visit: impl FnMut(usize, f64, f64, f64)) {
        let a = a_m.max(self.z_m[0]);
        let b = b_m.min(self.height_m());
        if b <= a {
            return;
        }
        for e in self.element_at(a)..self.elements() {
            let (za, zb) = (self.z_m[e], self.z_m[e + 1]);
            if za >= b {
                break;
            }
            let (lo, hi) = (a.max(za), b.min(zb));
            if hi > lo {
                visit(e, za, lo, hi);
            }
        }
    }

    /// Integral over [a, b] (clipped to the structure) of f(element, t, z, Phi) dz.
    pub fn integrate(
        &self,
        a_m: f64,
        b_m: f64,
        mut f: impl FnMut(usize, f64, f64, f64) -> f64,
    ) -> f64 {
        let mut sum = 0.0;
        self.pieces(a_m, b_m, |e, za, lo, hi| {
            let len = self.z_m[e + 1] - za;
            for &(x, w) in &GAUSS4 {
                let z = lo + (hi - lo) * x;
                let t = (z - za) / len;
                sum += w * (hi - lo) * f(e, t, z, self.eval(e, t));
            }
        });
        sum
    }

    /// int_a^b |Phi| dz, m, exact for the element shapes: each element is split where Phi
    /// changes sign, so the Gauss rule integrates a polynomial on every piece. (Gauss points
    /// across a sign change would leave an error of up to ~1e-6 that jumps as the root moves
    /// past a point: K and K_W would then not be smooth functions of the structure, which
    /// the risk family over the shell stiffness needs.)
    pub fn integral_abs(&self, a_m: f64, b_m: f64) -> f64 {
        let mut sum = 0.0;
        self.pieces(a_m, b_m, |e, za, lo, hi| {
            let len = self.z_m[e + 1] - za;
            let (t_lo, t_hi) = ((lo - za) / len, (hi - za) / len);
            if let Some(sign) = self.one_sign(e) {
                // No root in the element: |Phi| = sign Phi, a polynomial (the usual case).
                for &(x, g) in &GAUSS4 {
                    let t = t_lo + (t_hi - t_lo) * x;
                    sum += g * (t_hi - t_lo) * len * sign * self.eval(e, t);
                }
                return;
            }
            let mut cuts = [0.0; 8];
            let n = self.sign_changes(e, t_lo, t_hi, &mut cuts);
            for w in cuts[..n].windows(2) {
                for &(x, g) in &GAUSS4 {
                    let t = w[0] + (w[1] - w[0]) * x;
                    sum += g * (w[1] - w[0]) * len * self.eval(e, t).abs();
                }
            }
        });
        sum
    }

    /// The sign of Phi on element `e` when it certainly keeps one: the cubic's Bernstein
    /// coefficients (p0, p0 + s0 l / 3, p1 - s1 l / 3, p1) all of that sign (a polynomial
    /// lies in the convex hull of its Bernstein coefficients; any text on Bezier curves).
    /// `None` when a root is possible.
    #[inline]
    fn one_sign(&self, e: usize) -> Option<f64> {
        let (p0, p1) = (self.phi[e], self.phi[e + 1]);
        let (b1, b2) = match self.slope_per_m {
            Some(s) => {
                let l = self.z_m[e + 1] - self.z_m[e];
                (p0 + s[e] * l / 3.0, p1 - s[e + 1] * l / 3.0)
            }
            None => (p0, p1),
        };
        if p0 > 0.0 && b1 > 0.0 && b2 > 0.0 && p1 > 0.0 {
            Some(1.0)
        } else if p0 < 0.0 && b1 < 0.0 && b2 < 0.0 && p1 < 0.0 {
            Some(-1.0)
        } else {
            None
        }
    }

    /// The pieces of [t_lo, t_hi] in element `e` between which Phi keeps its sign: their
    /// ends into `cuts` (t_lo, the roots inside, t_hi), returns how many.
    fn sign_changes(&self, e: usize, t_lo: f64, t_hi: f64, cuts: &mut [f64; 8]) -> usize {
        // Monotone pieces first: between the ends and the stationary points of the cubic
        // (roots of its derivative, a quadratic), each piece has at most one root.
        let mut ends = [t_lo, t_hi, t_hi, t_hi];
        let mut m = 1;
        if let Some(s) = self.slope_per_m {
            let l = self.z_m[e + 1] - self.z_m[e];
            let (p0, p1, s0, s1) = (self.phi[e], self.phi[e + 1], s[e] * l, s[e + 1] * l);
            // d/dt of the Hermite form in `eval`: qa t^2 + qb t + qc.
            let qa = 6.0 * p0 + 3.0 * s0 - 6.0 * p1 + 3.0 * s1;
            let qb = -6.0 * p0 - 4.0 * s0 + 6.0 * p1 - 2.0 * s1;
            let qc = s0;
            let mut stationary = [f64::NAN; 2];
            if qa.abs() > 1e-300 {
                let disc = qb * qb - 4.0 * qa * qc;
                if disc >= 0.0 {
                    // The stable form of the two roots (no cancellation).
                    let q = -0.5 * (qb + qb.signum() * disc.sqrt());
                    stationary = [q / qa, if q != 0.0 { qc / q } else { f64::NAN }];
                }
            } else if qb != 0.0 {
                stationary[0] = -qc / qb;
            }
            stationary.sort_by(|x, y| x.total_cmp(y));
            for t in stationary {
                if t > t_lo && t < t_hi {
                    ends[m] = t;
                    m += 1;
                }
            }
        }
        ends[m] = t_hi;
        let ends = &ends[..=m];
        let mut n = 0;
        cuts[n] = t_lo;
        n += 1;
        for w in ends.windows(2) {
            let (mut u, mut v) = (w[0], w[1]);
            let (mut fu, mut fv) = (self.eval(e, u), self.eval(e, v));
            if fu * fv < 0.0 {
                // The Illinois variant of false position on the monotone piece (the root
                // is unique there and stays bracketed; superlinear, any numerical analysis
                // text): a handful of evaluations to rounding, where bisection takes 52.
                let mut x = f64::NAN;
                let mut kept = 0i8;
                for _ in 0..100 {
                    let mut next = (u * fv - v * fu) / (fv - fu);
                    if !(next > u && next < v) {
                        next = 0.5 * (u + v);
                    }
                    if next == x {
                        break;
                    }
                    x = next;
                    let fx = self.eval(e, x);
                    if fx == 0.0 || v - u <= 1e-15 {
                        break;
                    }
                    if (fx < 0.0) == (fu < 0.0) {
                        (u, fu) = (x, fx);
                        if kept == -1 {
                            fv *= 0.5;
                        }
                        kept = -1;
                    } else {
                        (v, fv) = (x, fx);
                        if kept == 1 {
                            fu *= 0.5;
                        }
                        kept = 1;
                    }
                }
                cuts[n] = x;
                n += 1;
            }
        }
        cuts[n] = t_hi;
        n + 1
    }

    /// int_a^b Phi dz, m.
    pub fn integral(&self, a_m: f64, b_m: f64) -> f64 {
        self.integrate(a_m, b_m, |_, _, _, p| p)
    }

    /// int_a^b Phi^2 dz, m.
    pub fn integral_sq(&self, a_m: f64, b_m: f64) -> f64 {
        self.integrate(a_m, b_m, |_, _, _, p| p * p)
    }

    /// Node index of the largest |Phi| above the base (the mode's largest antinode; the top
    /// for mode 1). The base node is the top of the foundation, not exposed to shedding: a
    /// mode dominated by the foundation's own motion on its springs (a heavy raft) is checked
    /// at its largest antinode in the shell (common practice); callers scale by Phi there.
    pub fn largest_antinode(&self) -> usize {
        let first = usize::from(self.phi.len() > 1);
        let mut best = first;
        for (i, p) in self.phi.iter().enumerate().skip(first) {
            if p.abs() > self.phi[best].abs() {
                best = i;
            }
        }
        best
    }
}

/// Distributed mass per metre inside element `e` at local coordinate `t`, kg/m: shell mass
/// linear between the nodes; lining mass linear between the nodes only where both nodes carry
/// lining, else zero. `StageModel` stores at a lining end the value just inside the zone, and
/// the mesh has a node on every lining end, so an element with lining at only one end lies
/// outside the zone.
#[inline]
pub fn element_mass_kg_m(model: &StageModel, e: usize, t: f64) -> f64 {
    // Per-element end values where the model has them: the shell mass jumps at wall steps,
    // zone limits and opening limits.
    let (s0, s1) = match model.element_shell_mass_kg_m.get(e) {
        Some(&[a, b]) => (a, b),
        None => (model.shell_mass_kg_m[e], model.shell_mass_kg_m[e + 1]),
    };
    let shell = s0 * (1.0 - t) + s1 * t;
    let (l0, l1) = (model.lining_mass_kg_m[e], model.lining_mass_kg_m[e + 1]);
    let lining = if l0 > 0.0 && l1 > 0.0 {
        l0 * (1.0 - t) + l1 * t
    } else {
        0.0
    };
    shell + lining
}

/// Outer diameter inside element `e` at local coordinate `t`, m (linear between nodes).
#[inline]
pub fn element_diameter_m(model: &StageModel, e: usize, t: f64) -> f64 {
    model.outer_diameter_m[e] * (1.0 - t) + model.outer_diameter_m[e + 1] * t
}

/// Outer diameter at height `z_m` (linear between nodes, clamped), m.
pub fn diameter_at_m(model: &StageModel, z_m: f64) -> f64 {
    let shape = ModeShape::new(&model.z_m, &model.outer_diameter_m, None);
    shape.value_at(z_m)
}

/// Equivalent mass per length m_e = (int m Phi^2 ds + sum M_k Phi_k^2) / int Phi^2 ds, kg/m
/// (EN 1991-1-4 F.14, from memory; point masses in the numerator, common practice), the same
/// definition `modal` documents.
pub fn equivalent_mass_kg_m(model: &StageModel, shape: &ModeShape) -> f64 {
    let h = shape.height_m();
    let num = shape.integrate(0.0, h, |e, t, _, p| element_mass_kg_m(model, e, t) * p * p)
        + model
            .point_masses
            .iter()
            .map(|&(i, m)| m * shape.nodal()[i].powi(2))
            .sum::<f64>();
    num / shape.integral_sq(0.0, h)
}

/// Generalised mass int m Phi^2 ds + sum M_k Phi_k^2 of the normalised shape, kg.
pub fn generalised_mass_kg(model: &StageModel, shape: &ModeShape) -> f64 {
    shape.integrate(0.0, shape.height_m(), |e, t, _, p| {
        element_mass_kg_m(model, e, t) * p * p
    }) + model
        .point_masses
        .iter()
        .map(|&(i, m)| m * shape.nodal()[i].powi(2))
        .sum::<f64>()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn abs_integral_is_exact_across_a_root_of_the_cubic() {
        // Phi = t^3 - 1/2 on one element of length 1 (nodal -1/2, 1/2, slopes 0 and 3):
        // int_0^1 |t^3 - 1/2| dt = 3 r / 4 - 1/4 with r = 2^(-1/3) (calculus).
        let z = [0.0, 1.0];
        let p = [-0.5, 0.5];
        let s = [0.0, 3.0];
        let shape = ModeShape::new(&z, &p, Some(&s));
        let r = 0.5f64.cbrt();
        assert!((shape.integral_abs(0.0, 1.0) - (0.75 * r - 0.25)).abs() < 1e-15);
        // Part of the element, the root inside: int_0.5^1 = (r - r^4 / 2 - 0.25) minus
        // int_0^0.5 (1/2 - t^3) = 0.25 - 0.015625.
        let part = (0.75 * r - 0.25) - (0.25 - 0.015_625);
        assert!((shape.integral_abs(0.5, 1.0) - part).abs() < 1e-15);
        // Linear shape (no slopes): int_0^1 |t - 0.3| = 0.09 / 2 + 0.49 / 2.
        let lin = [-0.3, 0.7];
        let shape = ModeShape::new(&z, &lin, None);
        assert!((shape.integral_abs(0.0, 1.0) - 0.29).abs() < 1e-15);
    }

    proptest::proptest! {
        #![proptest_config(proptest::prelude::ProptestConfig::with_cases(64))]
        /// Any Hermite element and sub-interval: the split Gauss rule equals a fine
        /// midpoint sum of |Phi| (200 000 cells; its error is O(h^2), below 1e-9 of the
        /// integral's scale here).
        #[test]
        fn abs_integral_matches_a_fine_midpoint_sum(
            p0 in -1.0f64..1.0, p1 in -1.0f64..1.0, s0 in -4.0f64..4.0, s1 in -4.0f64..4.0,
            a in 0.0f64..1.0, w in 0.0f64..1.0,
        ) {
            let z = [0.0, 2.0];
            let p = [p0, p1];
            let s = [s0, s1];
            let shape = ModeShape::new(&z, &p, Some(&s));
            let (lo, hi) = (2.0 * a, (2.0 * a + 2.0 * w).min(2.0));
            let n = 200_000;
            let h = (hi - lo) / n as f64;
            let fine: f64 = (0..n)
                .map(|i| shape.value_at(lo + (i as f64 + 0.5) * h).abs() * h)
                .sum();
            let got = shape.integral_abs(lo, hi);
            proptest::prop_assert!((got - fine).abs() <= 1e-9 * (1.0 + fine), "{} vs {}", got, fine);
        }
    }

    #[test]
    fn abs_integral_with_three_roots_in_one_element() {
        // Phi = (t - 0.2)(t - 0.5)(t - 0.9), nodal values and slopes from the polynomial;
        // int_0^1 |Phi| against the antiderivative split at the roots (calculus).
        let f = |t: f64| (t - 0.2) * (t - 0.5) * (t - 0.9);
        let df = |t: f64| (t - 0.5) * (t - 0.9) + (t - 0.2) * (t - 0.9) + (t - 0.2) * (t - 0.5);
        let z = [0.0, 1.0];
        let p = [f(0.0), f(1.0)];
        let s = [df(0.0), df(1.0)];
        let shape = ModeShape::new(&z, &p, Some(&s));
        // F(t) = t^4/4 - 1.6 t^3/3 + 0.73 t^2/2 - 0.09 t (expanded polynomial t^3 - 1.6 t^2
        // + 0.73 t - 0.09).
        let big = |t: f64| t.powi(4) / 4.0 - 1.6 * t.powi(3) / 3.0 + 0.73 * t * t / 2.0 - 0.09 * t;
        let cuts = [0.0, 0.2, 0.5, 0.9, 1.0];
        let exact: f64 = cuts.windows(2).map(|w| (big(w[1]) - big(w[0])).abs()).sum();
        assert!(
            (shape.integral_abs(0.0, 1.0) - exact).abs() < 1e-15,
            "{}",
            exact
        );
    }

    fn parabola(n: usize, h: f64) -> (Vec<f64>, Vec<f64>, Vec<f64>) {
        let z: Vec<f64> = (0..=n).map(|i| h * i as f64 / n as f64).collect();
        let p = z.iter().map(|z| (z / h).powi(2)).collect();
        let s = z.iter().map(|z| 2.0 * z / (h * h)).collect();
        (z, p, s)
    }

    #[test]
    fn hermite_reproduces_a_parabola_exactly() {
        let (z, p, s) = parabola(5, 80.0);
        let shape = ModeShape::new(&z, &p, Some(&s));
        for zz in [0.0, 3.3, 17.0, 40.0, 79.9] {
            assert!((shape.value_at(zz) - (zz / 80.0f64).powi(2)).abs() < 1e-12);
        }
        // int (z/h)^2 = h/3, int (z/h)^4 = h/5 (calculus).
        assert!((shape.integral(0.0, 80.0) - 80.0 / 3.0).abs() < 1e-10);
        assert!((shape.integral_sq(0.0, 80.0) - 16.0).abs() < 1e-10);
        // partial interval not on nodes: int_50^80 = (80^3 - 50^3) / (3 * 80^2)
        let exact = (80f64.powi(3) - 50f64.powi(3)) / (3.0 * 6400.0);
        assert!((shape.integral_abs(50.0, 95.0) - exact).abs() < 1e-10);
    }

    #[test]
    fn largest_antinode_and_element_lookup() {
        let z = [0.0, 1.0, 2.0, 3.0];
        let p = [0.0, -1.0, 0.5, 0.9];
        let shape = ModeShape::new(&z, &p, None);
        assert_eq!(shape.largest_antinode(), 1);
        // A foundation-dominated shape: the base moves most, the shell's antinode is used.
        let p = [1.0, 0.2, -0.4, 0.3];
        assert_eq!(ModeShape::new(&z, &p, None).largest_antinode(), 2);
        assert_eq!(shape.element_at(-1.0), 0);
        assert_eq!(shape.element_at(1.0), 1);
        assert_eq!(shape.element_at(3.0), 2);
        assert_eq!(shape.element_at(9.0), 2);
    }
}
