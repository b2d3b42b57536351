//! Geometry of a reinforced-concrete annulus with optional removed sectors (openings): the
//! concrete width at a distance y from the centre measured along a bending direction, the
//! angular ranges where the shell (and its bars) remain, and the breakpoints where that width
//! stops being smooth (so quadrature never straddles a kink).
//!
//! Angles: azimuths in radians, a sector spans azimuth +/- half-angle. The bending direction
//! `phi` points to the compressed side; in the local frame y = r cos(theta - phi).
//! Units: m, m2, rad.

use std::f64::consts::{PI, TAU};

use crate::fem::gauss;

/// A sector removed from the annulus (concrete and bars), e.g. a flue opening of clear width
/// w at outer diameter D: half-angle asin(w / D) (design.md, `[[opening]]`).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Sector {
    /// Half-angle beta, 0 < beta <= pi/2, rad.
    pub half_angle_rad: f64,
    /// Azimuth of the sector's centre line, rad.
    pub azimuth_rad: f64,
}

/// One layer of vertical bars smeared into a thin ring (common practice for chimney shells
/// with many closely spaced bars).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BarRing {
    /// Radius of the bar centres, m.
    pub radius_m: f64,
    /// Steel area of the complete ring (before openings are removed), m2.
    pub area_m2: f64,
}

/// An annular RC section.
#[derive(Debug, Clone, PartialEq)]
pub struct RcAnnulus {
    pub outer_radius_m: f64,
    pub inner_radius_m: f64,
    pub rings: Vec<BarRing>,
    /// Removed sectors; they must not overlap each other.
    pub sectors: Vec<Sector>,
}

/// Wrap an angle into [-pi, pi).
pub fn wrap_pi(a: f64) -> f64 {
    (a + PI).rem_euclid(TAU) - PI
}

impl RcAnnulus {
    /// Annulus with two bar layers given as ratios of the gross concrete area (design.md
    /// `[[reinforcement.zone]]`), covers measured from each face to the bar centres.
    pub fn with_ratios(
        outer_diameter_m: f64,
        wall_m: f64,
        outer_ratio: f64,
        inner_ratio: f64,
        outer_cover_m: f64,
        inner_cover_m: f64,
        sectors: Vec<Sector>,
    ) -> Self {
        let ro = 0.5 * outer_diameter_m;
        let ri = ro - wall_m;
        let area = PI * (ro * ro - ri * ri);
        let mut rings = Vec::with_capacity(2);
        if outer_ratio > 0.0 {
            rings.push(BarRing {
                radius_m: ro - outer_cover_m,
                area_m2: outer_ratio * area,
            });
        }
        if inner_ratio > 0.0 {
            rings.push(BarRing {
                radius_m: ri + inner_cover_m,
                area_m2: inner_ratio * area,
            });
        }
        RcAnnulus {
            outer_radius_m: ro,
            inner_radius_m: ri,
            rings,
            sectors,
        }
    }

    /// Gross concrete area of the full annulus, m2.
    pub fn gross_area_m2(&self) -> f64 {
        PI * (self.outer_radius_m.powi(2) - self.inner_radius_m.powi(2))
    }

    /// Angular intervals (psi_lo, psi_hi) in the local frame of bending direction `phi`
    /// (psi = theta - phi, within [-pi, pi]) where the shell remains.
    pub fn remaining_intervals(&self, phi: f64) -> Vec<(f64, f64)> {
        let mut removed: Vec<(f64, f64)> = Vec::new();
        for s in &self.sectors {
            let c = wrap_pi(s.azimuth_rad - phi);
            let (lo, hi) = (c - s.half_angle_rad, c + s.half_angle_rad);
            // Split a sector that crosses +/- pi into two pieces inside [-pi, pi].
            if lo < -PI {
                removed.push((lo + TAU, PI));
                removed.push((-PI, hi));
            } else if hi > PI {
                removed.push((lo, PI));
                removed.push((-PI, hi - TAU));
            } else {
                removed.push((lo, hi));
            }
        }
        removed.sort_by(|a, b| a.0.total_cmp(&b.0));
        let mut out = Vec::new();
        let mut start = -PI;
        for (lo, hi) in removed {
            if lo > start {
                out.push((start, lo));
            }
            start = start.max(hi);
        }
        if start < PI {
            out.push((start, PI));
        }
        out
    }

    /// Extreme y of the remaining concrete in the local frame: (y_min, y_max).
    pub fn extent(&self, phi: f64) -> (f64, f64) {
        let (ro, ri) = (self.outer_radius_m, self.inner_radius_m);
        let mut lo = f64::INFINITY;
        let mut hi = f64::NEG_INFINITY;
        for (a, b) in self.remaining_intervals(phi) {
            for psi in [a, b] {
                for r in [ro, ri] {
                    let y = r * psi.cos();
                    lo = lo.min(y);
                    hi = hi.max(y);
                }
            }
            if a <= 0.0 && 0.0 <= b {
                hi = hi.max(ro);
            }
            if a <= -PI + 1e-15 || b >= PI - 1e-15 {
                lo = lo.min(-ro);
            }
        }
        (lo, hi)
    }

    /// Concrete width (length of the chord y = const inside the remaining concrete), m.
    pub fn width_m(&self, phi: f64, y: f64) -> f64 {
        let (ro, ri) = (self.outer_radius_m, self.inner_radius_m);
        if y.abs() >= ro {
            return 0.0;
        }
        let xo = (ro * ro - y * y).sqrt();
        let xi = (ri * ri - y * y).max(0.0).sqrt();
        let mut w = 2.0 * (xo - xi);
        for s in &self.sectors {
            let (xl, xu) = cone_chord(wrap_pi(s.azimuth_rad - phi), s.half_angle_rad, y);
            if xu > xl {
                // Overlap of [xl, xu] with [-xo, -xi] and [xi, xo].
                w -= overlap(xl, xu, -xo, -xi) + overlap(xl, xu, xi, xo);
            }
        }
        w.max(0.0)
    }

    /// y values where the width is not smooth: +/- radii, 0, and sector corners.
    pub fn width_breakpoints(&self, phi: f64, out: &mut Vec<f64>) {
        let (ro, ri) = (self.outer_radius_m, self.inner_radius_m);
        out.extend_from_slice(&[-ro, -ri, ri, ro]);
        if !self.sectors.is_empty() {
            out.push(0.0);
        }
        for s in &self.sectors {
            let c = wrap_pi(s.azimuth_rad - phi);
            for psi in [c - s.half_angle_rad, c + s.half_angle_rad] {
                out.push(ro * psi.cos());
                out.push(ri * psi.cos());
            }
        }
    }
}

impl RcAnnulus {
    /// (int f b dy, int f b y dy) over the remaining concrete above `y_from`, exact up to
    /// quadrature: the annulus is the disc of the outer radius minus the disc of the inner one
    /// (each less its cone of removed sectors); each disc is integrated in u with y = R sin u,
    /// which makes the chord width 2 R cos u smooth, split at every kink (sector corners, the
    /// apex line y = 0, and `extra_breaks`, NaN entries ignored), by composite 8-point
    /// Gauss-Legendre with `splits` sub-pieces per smooth piece.
    pub fn integrate_over_width(
        &self,
        phi: f64,
        y_from: f64,
        extra_breaks: &[f64],
        splits: usize,
        f: impl Fn(f64) -> f64,
    ) -> (f64, f64) {
        let cones: Vec<(f64, f64)> = self
            .sectors
            .iter()
            .map(|s| (wrap_pi(s.azimuth_rad - phi), s.half_angle_rad))
            .collect();
        let (xs, ws) = gauss::rule(POINTS);
        let (mut n, mut m) = (0.0, 0.0);
        let mut bps: Vec<f64> = Vec::with_capacity(16);
        for (radius, sign) in [(self.outer_radius_m, 1.0), (self.inner_radius_m, -1.0)] {
            if radius <= 0.0 || y_from >= radius {
                continue;
            }
            let u_from = if y_from <= -radius {
                -0.5 * PI
            } else {
                (y_from / radius).asin()
            };
            bps.clear();
            bps.push(u_from);
            bps.push(0.5 * PI);
            let add_y = |y: f64, bps: &mut Vec<f64>| {
                if y.is_finite() && y.abs() < radius {
                    bps.push((y / radius).asin());
                }
            };
            for &yb in extra_breaks {
                add_y(yb, &mut bps);
            }
            if !cones.is_empty() {
                add_y(0.0, &mut bps);
            }
            for &(c, b) in &cones {
                add_y(radius * (c - b).cos(), &mut bps);
                add_y(radius * (c + b).cos(), &mut bps);
            }
            bps.retain(|&u| u >= u_from);
            bps.sort_by(f64::total_cmp);
            bps.dedup_by(|a, b| (*a - *b).abs() <= 1e-15);
            for seg in bps.windows(2) {
                let len = (seg[1] - seg[0]) / splits as f64;
                for k in 0..splits {
                    let mid = seg[0] + (k as f64 + 0.5) * len;
                    let half = 0.5 * len;
                    for (&s, &w) in xs.iter().zip(ws) {
                        let u = mid + half * s;
                        let (sin_u, cos_u) = u.sin_cos();
                        let y = radius * sin_u;
                        let x_edge = radius * cos_u;
                        let mut width = 2.0 * x_edge;
                        for &(c, b) in &cones {
                            let (xl, xu) = cone_chord(c, b, y);
                            width -= overlap(xl, xu, -x_edge, x_edge);
                        }
                        let v = sign * f(y) * width * radius * cos_u * half * w;
                        n += v;
                        m += v * y;
                    }
                }
            }
        }
        (n, m)
    }
}

/// Gauss points per sub-piece of [`RcAnnulus::integrate_over_width`].
const POINTS: usize = 8;

/// x-interval of the line y = const inside the cone of directions psi in [c - b, c + b]
/// (psi measured from the +y axis towards +x), b <= pi/2 so the cone is convex.
fn cone_chord(c: f64, b: f64, y: f64) -> (f64, f64) {
    let (p1, p2) = (c - b, c + b);
    // Inward half-planes: sin(psi - p1) >= 0 and sin(p2 - psi) >= 0, i.e. for p = (x, y):
    // cos(p1) x - sin(p1) y >= 0 and -cos(p2) x + sin(p2) y >= 0.
    let mut lo = f64::NEG_INFINITY;
    let mut hi = f64::INFINITY;
    for (a, k) in [(p1.cos(), -p1.sin() * y), (-p2.cos(), p2.sin() * y)] {
        // a x + k >= 0
        if a.abs() < 1e-300 {
            if k < 0.0 {
                return (0.0, 0.0);
            }
        } else if a > 0.0 {
            lo = lo.max(-k / a);
        } else {
            hi = hi.min(-k / a);
        }
    }
    (lo, hi)
}

fn overlap(a0: f64, a1: f64, b0: f64, b1: f64) -> f64 {
    (a1.min(b1) - a0.max(b0)).max(0.0)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn ring(sectors: Vec<Sector>) -> RcAnnulus {
        RcAnnulus::with_ratios(10.0, 0.4, 0.003, 0.002, 0.05, 0.05, sectors)
    }

    #[test]
    fn width_integrates_to_the_area() {
        // Integral of the width over y is the area (geometry); midpoint rule on 200k strips.
        let s = Sector {
            half_angle_rad: 0.4,
            azimuth_rad: 1.0,
        };
        let a = ring(vec![s]);
        let n = 200_000;
        let dy = 10.0 / n as f64;
        let area: f64 = (0..n)
            .map(|i| a.width_m(0.3, -5.0 + (i as f64 + 0.5) * dy) * dy)
            .sum();
        let exact = a.gross_area_m2() * (1.0 - 0.8 / TAU);
        assert!((area - exact).abs() / exact < 1e-5, "{area} {exact}");
    }

    #[test]
    fn remaining_intervals_complement_the_sectors() {
        let a = ring(vec![
            Sector {
                half_angle_rad: 0.3,
                azimuth_rad: PI - 0.1,
            },
            Sector {
                half_angle_rad: 0.2,
                azimuth_rad: 0.0,
            },
        ]);
        let total: f64 = a.remaining_intervals(0.0).iter().map(|(l, h)| h - l).sum();
        assert!((total - (TAU - 1.0)).abs() < 1e-12);
        let (lo, hi) = a.extent(0.0);
        assert!((hi - 5.0 * 0.2f64.cos()).abs() < 1e-12);
        // pi is inside the second sector, so the lowest fibre is its corner at -pi + 0.2.
        assert!((lo + 5.0 * 0.2f64.cos()).abs() < 1e-12);
    }
}
