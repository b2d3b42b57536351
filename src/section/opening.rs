//! Net section of the annulus at an opening level: the shell wall minus the annular sectors
//! that flue and access openings remove, in m-based SI (m, m2, m3, m4, rad).
//!
//! An opening of clear width `w` at the outer face, centred at azimuth `alpha`, removes the
//! annular sector of half-angle beta = asin(w / D) (D = outer diameter): the usual
//! idealisation of the trade (common practice). The net section's area, centroid and second
//! moments are exact integrals over annular sectors (polar coordinates, any mechanics text):
//! for radii r..R and angles t1..t2,
//!   A   = (t2 - t1) (R^2 - r^2) / 2,
//!   S_x = int x dA = (R^3 - r^3) / 3 (sin t2 - sin t1),
//!   S_y = int y dA = (R^3 - r^3) / 3 (cos t1 - cos t2),
//!   I_xx = int y^2 dA = (R^4 - r^4) / 8 ((t2 - t1) - (sin 2t2 - sin 2t1) / 2),
//!   I_yy = int x^2 dA = (R^4 - r^4) / 8 ((t2 - t1) + (sin 2t2 - sin 2t1) / 2),
//!   I_xy = int x y dA = (R^4 - r^4) / 16 (cos 2t1 - cos 2t2),
//! taken as the full annulus minus the removed sectors, then moved to the net centroid
//! (parallel axes) and turned to principal axes. The beam model bends in one plane, so it
//! uses the smaller principal second moment (conservative for frequency and stress), and the
//! stress there uses the extreme fibre of the net section measured from that neutral axis.
//!
//! Azimuth is measured in the section plane from the x axis (x, y through the shell's
//! centre); the later reinforced-concrete resistance work reuses [`Cut`] (half-angle and
//! azimuth) for the same openings.

use std::f64::consts::{PI, TAU};

use thiserror::Error;

use super::Annulus;

/// Why a set of openings cannot be cut from a section.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum OpeningError {
    /// The clear width is not smaller than the outer diameter (asin undefined).
    #[error(
        "opening width {width_m} m is not smaller than the outer diameter {outer_diameter_m} m"
    )]
    WiderThanShell { width_m: f64, outer_diameter_m: f64 },
    /// Two openings share part of the circumference at one height.
    #[error("openings {first} and {second} overlap around the circumference")]
    Overlap { first: usize, second: usize },
    /// The openings together remove more than half the circumference.
    #[error("openings remove {removed_fraction:.3} of the circumference (more than half)")]
    MoreThanHalf { removed_fraction: f64 },
}

/// One opening at one height: the removed sector, centred at `azimuth_rad`, of half-angle
/// `half_angle_rad` (0 < beta < pi/2).
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Cut {
    pub half_angle_rad: f64,
    pub azimuth_rad: f64,
}

/// Half-angle beta = asin(w / D) of an opening of clear width `width_m` in a shell of outer
/// diameter `outer_diameter_m`, rad.
pub fn half_angle_rad(width_m: f64, outer_diameter_m: f64) -> Result<f64, OpeningError> {
    if width_m > 0.0 && width_m < outer_diameter_m {
        Ok((width_m / outer_diameter_m).asin())
    } else {
        Err(OpeningError::WiderThanShell {
            width_m,
            outer_diameter_m,
        })
    }
}

impl Cut {
    /// The cut of an opening of width `width_m` at `azimuth_rad` in a shell of outer
    /// diameter `outer_diameter_m`.
    pub fn new(width_m: f64, azimuth_rad: f64, outer_diameter_m: f64) -> Result<Cut, OpeningError> {
        Ok(Cut {
            half_angle_rad: half_angle_rad(width_m, outer_diameter_m)?,
            azimuth_rad,
        })
    }
}

/// Angle wrapped into [0, 2 pi).
fn wrap(angle_rad: f64) -> f64 {
    let a = angle_rad.rem_euclid(TAU);
    if a >= TAU {
        0.0
    } else {
        a
    }
}

/// Checks that the cuts neither overlap nor remove more than half the circumference.
/// Touching edges are not an overlap.
pub fn check_cuts(cuts: &[Cut]) -> Result<(), OpeningError> {
    for (i, a) in cuts.iter().enumerate() {
        for (j, b) in cuts.iter().enumerate().skip(i + 1) {
            let gap = wrap(a.azimuth_rad - b.azimuth_rad);
            let gap = gap.min(TAU - gap);
            if gap < a.half_angle_rad + b.half_angle_rad {
                return Err(OpeningError::Overlap {
                    first: i,
                    second: j,
                });
            }
        }
    }
    let removed: f64 = cuts.iter().map(|c| 2.0 * c.half_angle_rad).sum();
    if removed > PI {
        return Err(OpeningError::MoreThanHalf {
            removed_fraction: removed / TAU,
        });
    }
    Ok(())
}

/// Area, first and second moments of a region about the shell's centre (m2, m3, m4).
#[derive(Debug, Clone, Copy, Default, PartialEq)]
pub struct SectorIntegrals {
    pub area_m2: f64,
    /// int x dA, int y dA.
    pub first_moment_m3: [f64; 2],
    /// int y^2 dA (about the x axis).
    pub i_xx_m4: f64,
    /// int x^2 dA (about the y axis).
    pub i_yy_m4: f64,
    /// int x y dA.
    pub i_xy_m4: f64,
}

/// The integrals of the annular sector r_in..r_out, t1..t2 (t2 > t1) about the centre; the
/// differences of powers are factored so thin walls keep their digits.
pub fn annular_sector(r_in_m: f64, r_out_m: f64, t1_rad: f64, t2_rad: f64) -> SectorIntegrals {
    let t = r_out_m - r_in_m;
    let (r, q) = (r_out_m, r_in_m);
    let d2 = (r + q) * t;
    let d3 = (r * r + r * q + q * q) * t;
    let d4 = (r * r + q * q) * (r + q) * t;
    let span = t2_rad - t1_rad;
    let s2 = (2.0 * t2_rad).sin() - (2.0 * t1_rad).sin();
    SectorIntegrals {
        area_m2: 0.5 * span * d2,
        first_moment_m3: [
            d3 / 3.0 * (t2_rad.sin() - t1_rad.sin()),
            d3 / 3.0 * (t1_rad.cos() - t2_rad.cos()),
        ],
        i_xx_m4: d4 / 8.0 * (span - 0.5 * s2),
        i_yy_m4: d4 / 8.0 * (span + 0.5 * s2),
        i_xy_m4: d4 / 16.0 * ((2.0 * t1_rad).cos() - (2.0 * t2_rad).cos()),
    }
}

/// The net section at one height.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct NetSection {
    /// Net area, m2.
    pub area_m2: f64,
    /// Net centroid (x, y) from the shell's centre, m.
    pub centroid_m: [f64; 2],
    /// Larger and smaller principal second moments about the net centroid, m4.
    pub second_moment_max_m4: f64,
    pub second_moment_min_m4: f64,
    /// Direction of the neutral axis of the smaller principal second moment, rad from x.
    pub min_axis_angle_rad: f64,
    /// Largest distance of the net section from that neutral axis, m.
    pub extreme_fibre_m: f64,
}

impl NetSection {
    /// Elastic section modulus about the weaker principal axis, I_min / extreme fibre, m3.
    pub fn section_modulus_m3(&self) -> f64 {
        self.second_moment_min_m4 / self.extreme_fibre_m
    }
}

/// The net section of `annulus` with `cuts` removed. No cuts: the annulus itself, with the
/// same numbers as [`Annulus`].
pub fn net_section(annulus: &Annulus, cuts: &[Cut]) -> Result<NetSection, OpeningError> {
    let r_out = 0.5 * annulus.outer_diameter_m;
    if cuts.is_empty() {
        let i = annulus.second_moment_m4();
        return Ok(NetSection {
            area_m2: annulus.area_m2(),
            centroid_m: [0.0, 0.0],
            second_moment_max_m4: i,
            second_moment_min_m4: i,
            min_axis_angle_rad: 0.0,
            extreme_fibre_m: r_out,
        });
    }
    check_cuts(cuts)?;
    let r_in = r_out - annulus.wall_m;
    let full = annular_sector(r_in, r_out, 0.0, TAU);
    let mut net = full;
    for c in cuts {
        let s = annular_sector(
            r_in,
            r_out,
            c.azimuth_rad - c.half_angle_rad,
            c.azimuth_rad + c.half_angle_rad,
        );
        net.area_m2 -= s.area_m2;
        net.first_moment_m3[0] -= s.first_moment_m3[0];
        net.first_moment_m3[1] -= s.first_moment_m3[1];
        net.i_xx_m4 -= s.i_xx_m4;
        net.i_yy_m4 -= s.i_yy_m4;
        net.i_xy_m4 -= s.i_xy_m4;
    }
    let a = net.area_m2;
    let cx = net.first_moment_m3[0] / a;
    let cy = net.first_moment_m3[1] / a;
    let ixx = net.i_xx_m4 - a * cy * cy;
    let iyy = net.i_yy_m4 - a * cx * cx;
    let ixy = net.i_xy_m4 - a * cx * cy;
    let mean = 0.5 * (ixx + iyy);
    let radius = (0.25 * (ixx - iyy).powi(2) + ixy * ixy).sqrt();
    // I about an axis at angle phi: mean + (Ixx - Iyy)/2 cos 2phi - Ixy sin 2phi; smallest
    // where (cos 2phi, sin 2phi) points against ((Ixx - Iyy)/2, -Ixy).
    let phi = 0.5 * ixy.atan2(0.5 * (iyy - ixx));
    let fibre = extreme_fibre_m(r_in, r_out, cuts, [cx, cy], phi);
    Ok(NetSection {
        area_m2: a,
        centroid_m: [cx, cy],
        second_moment_max_m4: mean + radius,
        second_moment_min_m4: mean - radius,
        min_axis_angle_rad: phi,
        extreme_fibre_m: fibre,
    })
}

/// The remaining arcs (start, end) in rad, end > start, between the cuts.
pub fn remaining_arcs(cuts: &[Cut]) -> Vec<(f64, f64)> {
    let mut edges: Vec<(f64, f64)> = cuts
        .iter()
        .map(|c| {
            let start = wrap(c.azimuth_rad - c.half_angle_rad);
            (start, start + 2.0 * c.half_angle_rad)
        })
        .collect();
    edges.sort_by(|a, b| a.0.total_cmp(&b.0));
    let mut arcs = Vec::with_capacity(edges.len());
    for (k, &(_, end)) in edges.iter().enumerate() {
        let next_start = if k + 1 < edges.len() {
            edges[k + 1].0
        } else {
            edges[0].0 + TAU
        };
        if next_start > end {
            arcs.push((end, next_start));
        }
    }
    arcs
}

/// Largest distance of the remaining sectors from the line through `centroid` at angle
/// `phi`: the distance is linear in the point, so its extremes lie on the outer arcs or at
/// the sector corners.
fn extreme_fibre_m(r_in: f64, r_out: f64, cuts: &[Cut], centroid: [f64; 2], phi: f64) -> f64 {
    // Signed distance d(p) = n . p - n . c with the axis normal n at angle psi = phi + pi/2.
    let psi = phi + 0.5 * PI;
    let k = centroid[0] * psi.cos() + centroid[1] * psi.sin();
    let (mut hi, mut lo) = (f64::NEG_INFINITY, f64::INFINITY);
    let inside = |angle: f64, a: f64, b: f64| {
        let rel = wrap(angle - a);
        rel <= b - a
    };
    for (a, b) in remaining_arcs(cuts) {
        for r in [r_in, r_out] {
            for t in [a, b] {
                let v = r * (t - psi).cos();
                hi = hi.max(v);
                lo = lo.min(v);
            }
        }
        if inside(psi, a, b) {
            hi = hi.max(r_out);
        }
        if inside(psi + PI, a, b) {
            lo = lo.min(-r_out);
        }
    }
    (hi - k).max(k - lo)
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn no_cut_is_the_annulus() {
        let a = Annulus::new(10.0, 0.3);
        let n = net_section(&a, &[]).unwrap();
        assert_eq!(n.area_m2, a.area_m2());
        assert_eq!(n.section_modulus_m3(), a.section_modulus_m3());
    }

    #[test]
    fn full_sector_matches_the_annulus() {
        // The whole ring as one sector reproduces pi/4 (D^2 - d^2) and pi/64 (D^4 - d^4).
        let a = Annulus::new(10.0, 0.3);
        let s = annular_sector(4.7, 5.0, 0.0, TAU);
        assert_relative_eq!(s.area_m2, a.area_m2(), max_relative = 1e-13);
        assert_relative_eq!(s.i_xx_m4, a.second_moment_m4(), max_relative = 1e-13);
        assert_relative_eq!(s.i_yy_m4, a.second_moment_m4(), max_relative = 1e-13);
        assert!(s.i_xy_m4.abs() < 1e-12 * a.second_moment_m4());
    }

    #[test]
    fn rotating_the_opening_keeps_the_principal_values() {
        let a = Annulus::new(12.0, 0.4);
        let base = net_section(&a, &[Cut::new(3.0, 0.0, 12.0).unwrap()]).unwrap();
        for az in [0.3, 1.0, 2.5, -1.2] {
            let n = net_section(&a, &[Cut::new(3.0, az, 12.0).unwrap()]).unwrap();
            assert_relative_eq!(n.area_m2, base.area_m2, max_relative = 1e-12);
            assert_relative_eq!(
                n.second_moment_min_m4,
                base.second_moment_min_m4,
                max_relative = 1e-10
            );
            assert_relative_eq!(
                n.extreme_fibre_m,
                base.extreme_fibre_m,
                max_relative = 1e-10
            );
        }
    }

    #[test]
    fn overlap_and_half_are_refused() {
        let c = |w: f64, az: f64| Cut::new(w, az, 10.0).unwrap();
        assert!(matches!(
            check_cuts(&[c(4.0, 0.0), c(4.0, 0.5)]),
            Err(OpeningError::Overlap { .. })
        ));
        // Three openings of 9 m in a 10 m shell remove 3 x 2 asin(0.9) = 6.8 rad > pi.
        let big = [c(9.0, 0.0), c(9.0, 2.2), c(9.0, 4.4)];
        assert!(check_cuts(&big).is_err());
        assert!(half_angle_rad(10.0, 10.0).is_err());
        assert!(check_cuts(&[c(4.0, 0.0), c(4.0, PI)]).is_ok());
    }
}
