//! Moment resistance M_Rd(N) of an RC annulus (with openings) by strain compatibility:
//! plane sections, concrete parabola-rectangle and bilinear steel (EN 1992-1-1 6.1 (2)-(7),
//! 3.1.7, 3.2.7), strain limits eps_cu2 at the extreme compressed concrete fibre, or eps_c2 at
//! the pivot (1 - eps_c2/eps_cu2) h from it when the whole section is compressed (6.1 (5),
//! Figure 6.1, from memory); steel on the horizontal branch needs no strain limit.
//! The neutral-axis depth is solved so that the internal axial force equals N_Ed.
//!
//! Integration: concrete by y-strips, N = int sigma_c(y) b(y) dy, M = int sigma_c(y) b(y) y dy,
//! split at every kink of sigma_c and b(y), each piece mapped with y = m + h sin(pi s / 2)
//! (removes the square-root end behaviour of the chord width) and integrated by composite
//! Gauss-Legendre, refined until two successive refinements agree to 1e-8 relative (so the
//! result holds 1e-6 with margin). Bars: smeared thin rings integrated in closed form.
//! Moments about the shell axis (y = 0), the line of action of the self-weight.
//! Units: N, N m, m, rad.

use std::f64::consts::PI;

use super::annulus::RcAnnulus;
use super::materials::{Concrete, Steel};
use super::ResistanceError;

/// Relative agreement required between two refinements.
const REL_TOL: f64 = 1e-8;

/// A plane strain state: strain = curvature * (y - neutral_axis_y), compression positive.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct StrainPlane {
    pub curvature_per_m: f64,
    pub neutral_axis_y_m: f64,
}

impl StrainPlane {
    #[inline]
    pub fn strain(&self, y: f64) -> f64 {
        self.curvature_per_m * (y - self.neutral_axis_y_m)
    }
}

/// Result of one M_Rd evaluation.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Ultimate {
    /// Bending direction (towards the compressed side), rad.
    pub direction_rad: f64,
    /// Moment resistance about the shell axis, N m.
    pub moment_nm: f64,
    /// Neutral-axis depth below the extreme compressed fibre, m.
    pub neutral_axis_depth_m: f64,
    pub plane: StrainPlane,
}

/// Section + materials.
#[derive(Debug, Clone, PartialEq)]
pub struct RcSection {
    pub annulus: RcAnnulus,
    pub concrete: Concrete,
    pub steel: Steel,
}

impl RcSection {
    /// Internal (N, M) of the concrete for a strain plane in direction `phi`, composite Gauss
    /// with `splits` sub-pieces per smooth piece.
    pub fn concrete_forces(&self, phi: f64, plane: &StrainPlane, splits: usize) -> (f64, f64) {
        let mut extra = [plane.neutral_axis_y_m, f64::NAN];
        if plane.curvature_per_m > 0.0 {
            extra[1] = plane.neutral_axis_y_m + self.concrete.strain_c2 / plane.curvature_per_m;
        }
        self.annulus
            .integrate_over_width(phi, plane.neutral_axis_y_m, &extra, splits, |y| {
                self.concrete.stress_pa(plane.strain(y))
            })
    }

    /// Internal (N, M) of the bars (closed form on each elastic / yielded arc).
    pub fn steel_forces(&self, phi: f64, plane: &StrainPlane) -> (f64, f64) {
        let st = &self.steel;
        let eps_y = st.yield_strain();
        let kap = plane.curvature_per_m;
        let y0 = plane.neutral_axis_y_m;
        let intervals = self.annulus.remaining_intervals(phi);
        let (mut n, mut m) = (0.0, 0.0);
        for ring in &self.annulus.rings {
            let r = ring.radius_m;
            let per_rad = ring.area_m2 / (2.0 * PI);
            // Angles (|psi|) where the strain reaches +/- eps_yd: r cos psi = y0 +/- eps_y/kap.
            let mut cuts: Vec<f64> = Vec::with_capacity(8);
            if kap > 0.0 {
                for yv in [y0 + eps_y / kap, y0 - eps_y / kap] {
                    let c = yv / r;
                    if c.abs() < 1.0 {
                        let a = c.acos();
                        cuts.push(a);
                        cuts.push(-a);
                    }
                }
            }
            for &(lo, hi) in &intervals {
                let mut pts = vec![lo, hi];
                pts.extend(cuts.iter().copied().filter(|&a| a > lo && a < hi));
                pts.sort_by(f64::total_cmp);
                for w in pts.windows(2) {
                    let (a, b) = (w[0], w[1]);
                    if b - a <= 0.0 {
                        continue;
                    }
                    let mid = 0.5 * (a + b);
                    let eps_mid = plane.strain(r * mid.cos());
                    let (ds, dc2) = (
                        b.sin() - a.sin(),
                        0.5 * (b - a) + 0.25 * ((2.0 * b).sin() - (2.0 * a).sin()),
                    );
                    if eps_mid.abs() >= eps_y {
                        let f = st.design_yield_pa.copysign(eps_mid) * per_rad;
                        n += f * (b - a);
                        m += f * r * ds;
                    } else {
                        // sigma = E kap (r cos psi - y0)
                        let e = st.elastic_modulus_pa * kap * per_rad;
                        n += e * (r * ds - y0 * (b - a));
                        m += e * (r * r * dc2 - y0 * r * ds);
                    }
                }
            }
        }
        (n, m)
    }

    /// Total steel area left after the openings, m2.
    pub fn net_steel_area_m2(&self, phi: f64) -> f64 {
        let frac: f64 = self
            .annulus
            .remaining_intervals(phi)
            .iter()
            .map(|(a, b)| b - a)
            .sum::<f64>()
            / (2.0 * PI);
        frac * self.annulus.rings.iter().map(|r| r.area_m2).sum::<f64>()
    }

    /// Strain plane at the ultimate limit state for neutral-axis depth `x` below the extreme
    /// compressed fibre (direction `phi`).
    pub fn ultimate_plane(&self, phi: f64, x: f64) -> StrainPlane {
        let (y_min, y_max) = self.annulus.extent(phi);
        let h = y_max - y_min;
        let c = &self.concrete;
        let kap = if x <= h {
            c.strain_cu2 / x
        } else {
            c.strain_c2 / (x - (1.0 - c.strain_c2 / c.strain_cu2) * h)
        };
        StrainPlane {
            curvature_per_m: kap,
            neutral_axis_y_m: y_max - x,
        }
    }

    fn forces(&self, phi: f64, x: f64, splits: usize) -> (f64, f64) {
        let p = self.ultimate_plane(phi, x);
        let (nc, mc) = self.concrete_forces(phi, &p, splits);
        let (ns, ms) = self.steel_forces(phi, &p);
        (nc + ns, mc + ms)
    }

    /// Axial resistance in pure compression, N_Rd = A_c f_cd + A_s sigma_s(eps_c2) (net), N.
    pub fn axial_compression_resistance_n(&self, phi: f64) -> f64 {
        let area: f64 = self
            .annulus
            .remaining_intervals(phi)
            .iter()
            .map(|(a, b)| b - a)
            .sum::<f64>()
            / (2.0 * PI)
            * self.annulus.gross_area_m2();
        area * self.concrete.design_strength_pa
            + self.net_steel_area_m2(phi) * self.steel.stress_pa(self.concrete.strain_c2)
    }

    /// M_Rd for axial force `axial_n` (compression positive) bending towards `phi`.
    pub fn moment_resistance(&self, phi: f64, axial_n: f64) -> Result<Ultimate, ResistanceError> {
        let (y_min, y_max) = self.annulus.extent(phi);
        let h = y_max - y_min;
        let n_max = self.axial_compression_resistance_n(phi);
        let n_min = -self.net_steel_area_m2(phi) * self.steel.design_yield_pa;
        if !(axial_n > n_min && axial_n < n_max) {
            return Err(ResistanceError::AxialOutOfRange {
                axial_n,
                min_n: n_min,
                max_n: n_max,
            });
        }
        let scale = n_max - n_min;
        let mut splits = 2;
        loop {
            let x = self.solve_depth(phi, axial_n, h, scale, splits);
            let (n1, m1) = self.forces(phi, x, splits);
            let (n2, m2) = self.forces(phi, x, 2 * splits);
            let ok = (n2 - n1).abs() <= REL_TOL * scale
                && (m2 - m1).abs() <= REL_TOL * m2.abs().max(1e-3 * scale * h);
            if ok || splits >= 64 {
                let x = if ok {
                    x
                } else {
                    self.solve_depth(phi, axial_n, h, scale, 2 * splits)
                };
                let m = if ok {
                    m1
                } else {
                    self.forces(phi, x, 2 * splits).1
                };
                return Ok(Ultimate {
                    direction_rad: phi,
                    moment_nm: m,
                    neutral_axis_depth_m: x,
                    plane: self.ultimate_plane(phi, x),
                });
            }
            splits *= 2;
        }
    }

    /// Neutral-axis depth where the internal axial force equals `target`: Illinois
    /// (modified regula falsi) on ln x; N rises monotonically with x.
    fn solve_depth(&self, phi: f64, target: f64, h: f64, scale: f64, splits: usize) -> f64 {
        let f = |s: f64| self.forces(phi, s.exp(), splits).0 - target;
        let (mut a, mut b) = ((1e-7 * h).ln(), (1e4 * h).ln());
        let (mut fa, mut fb) = (f(a), f(b));
        if fa >= 0.0 {
            return a.exp();
        }
        if fb <= 0.0 {
            return b.exp();
        }
        let mut side = 0i8;
        for _ in 0..200 {
            let c = (a * fb - b * fa) / (fb - fa);
            let fc = f(c);
            if fc.abs() <= 1e-13 * scale || (b - a).abs() < 1e-14 {
                return c.exp();
            }
            if fc < 0.0 {
                a = c;
                fa = fc;
                if side == -1 {
                    fb *= 0.5;
                }
                side = -1;
            } else {
                b = c;
                fb = fc;
                if side == 1 {
                    fa *= 0.5;
                }
                side = 1;
            }
        }
        (0.5 * (a + b)).exp()
    }

    /// Bending directions to check: the symmetric one for a full annulus; for openings,
    /// towards and away from each opening and both perpendiculars (the weaker axes).
    pub fn directions(&self) -> Vec<f64> {
        if self.annulus.sectors.is_empty() {
            return vec![0.0];
        }
        self.annulus
            .sectors
            .iter()
            .flat_map(|s| {
                let a = s.azimuth_rad;
                [a, a + PI, a + 0.5 * PI, a - 0.5 * PI]
            })
            .collect()
    }

    /// The smallest M_Rd over [`Self::directions`].
    pub fn min_moment_resistance(&self, axial_n: f64) -> Result<Ultimate, ResistanceError> {
        let mut best: Option<Ultimate> = None;
        for phi in self.directions() {
            let u = self.moment_resistance(phi, axial_n)?;
            if best.is_none_or(|b| u.moment_nm < b.moment_nm) {
                best = Some(u);
            }
        }
        Ok(best.expect("at least one direction"))
    }
}
