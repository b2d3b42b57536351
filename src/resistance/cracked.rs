//! Elastic stresses on the cracked annulus (concrete carries no tension, steel and concrete
//! linear): the strain plane for a given axial force and moment, and the stress range in the
//! vertical bars when the moment alternates between +M and -M at constant N (across-wind
//! vibration about a mean of zero, EN 1991-1-4 E.1.4 inertia loads are harmonic).
//!
//! For a plane with neutral axis y_n and curvature k, N = k F(y_n) and M = k G(y_n) with
//! F = E_c int_{y>y_n} (y - y_n) b dy + E_s sum A_s (y_s - y_n) and G likewise with the extra
//! factor y; the neutral axis solves M F - N G = 0 (common practice for cracked-section
//! analysis of circular shells; the concrete modulus is the shell's, short-term, since vortex
//! cycles are fast). Units: N, N m, Pa, m.

use std::f64::consts::PI;

use super::annulus::RcAnnulus;
use super::ultimate::StrainPlane;

/// An annulus with elastic moduli for the cracked-section analysis.
#[derive(Debug, Clone, PartialEq)]
pub struct CrackedSection {
    pub annulus: RcAnnulus,
    pub concrete_modulus_pa: f64,
    pub steel_modulus_pa: f64,
}

impl CrackedSection {
    /// (F, G) per unit curvature for neutral axis `y_n` in direction `phi`.
    fn stiffness(&self, phi: f64, y_n: f64, splits: usize) -> (f64, f64) {
        let (fc, gc) = self
            .annulus
            .integrate_over_width(phi, y_n, &[y_n], splits, |y| y - y_n);
        let (mut f, mut g) = (self.concrete_modulus_pa * fc, self.concrete_modulus_pa * gc);
        let intervals = self.annulus.remaining_intervals(phi);
        for ring in &self.annulus.rings {
            let r = ring.radius_m;
            let per_rad = self.steel_modulus_pa * ring.area_m2 / (2.0 * PI);
            for &(a, b) in &intervals {
                let ds = b.sin() - a.sin();
                let dc2 = 0.5 * (b - a) + 0.25 * ((2.0 * b).sin() - (2.0 * a).sin());
                f += per_rad * (r * ds - y_n * (b - a));
                g += per_rad * (r * r * dc2 - y_n * r * ds);
            }
        }
        (f, g)
    }

    /// Strain plane under axial force `axial_n` (compression positive, >= 0) and moment
    /// `moment_nm` > 0 compressing the `phi` side. `None` when no plane exists (tension
    /// beyond what the bars carry elastically is not a service state of a chimney).
    pub fn plane(&self, phi: f64, axial_n: f64, moment_nm: f64) -> Option<StrainPlane> {
        let (y_min, y_max) = self.annulus.extent(phi);
        let h = y_max - y_min;
        let splits = 2;
        let g = |y_n: f64| {
            let (f, gg) = self.stiffness(phi, y_n, splits);
            moment_nm * f - axial_n * gg
        };
        // g > 0 far below the section (small eccentricity side), g < 0 at the top fibre.
        let mut b = y_max;
        let mut gb = g(b);
        let mut a = y_min - h;
        let mut ga = g(a);
        let mut tries = 0;
        while ga <= 0.0 && tries < 60 {
            a = y_min - (a - y_min).abs() * 4.0;
            ga = g(a);
            tries += 1;
        }
        if ga <= 0.0 || gb >= 0.0 {
            return None;
        }
        let mut side = 0i8;
        for _ in 0..300 {
            let c = (a * gb - b * ga) / (gb - ga);
            let gc = g(c);
            if (b - a).abs() < 1e-13 * h || gc == 0.0 {
                a = c;
                break;
            }
            if gc > 0.0 {
                a = c;
                ga = gc;
                if side == 1 {
                    gb *= 0.5;
                }
                side = 1;
            } else {
                b = c;
                gb = gc;
                if side == -1 {
                    ga *= 0.5;
                }
                side = -1;
            }
        }
        let y_n = a;
        let (f, gg) = self.stiffness(phi, y_n, splits);
        let k = if gg.abs() > 0.0 {
            moment_nm / gg
        } else {
            axial_n / f
        };
        Some(StrainPlane {
            curvature_per_m: k,
            neutral_axis_y_m: y_n,
        })
    }

    /// Largest stress range in any bar (Pa) when the moment alternates between +M and -M about
    /// the bending direction `phi` at constant axial force. `None` if no elastic plane exists.
    pub fn bar_stress_range_pa(
        &self,
        phi: f64,
        axial_n: f64,
        moment_amplitude_nm: f64,
    ) -> Option<f64> {
        if moment_amplitude_nm <= 0.0 {
            return Some(0.0);
        }
        let p_plus = self.plane(phi, axial_n, moment_amplitude_nm)?;
        let p_minus = self.plane(phi + PI, axial_n, moment_amplitude_nm)?;
        let mut candidates = vec![0.0, PI];
        for (a, b) in self.annulus.remaining_intervals(phi) {
            candidates.push(a);
            candidates.push(b);
        }
        let remaining = self.annulus.remaining_intervals(phi);
        let es = self.steel_modulus_pa;
        let mut best: f64 = 0.0;
        for ring in &self.annulus.rings {
            for &psi in &candidates {
                let psi = super::annulus::wrap_pi(psi);
                let inside = remaining
                    .iter()
                    .any(|&(a, b)| psi >= a - 1e-12 && psi <= b + 1e-12);
                if !inside {
                    continue;
                }
                let y = ring.radius_m * psi.cos();
                // In the frame phi + pi the same bar sits at -y.
                let s1 = es * p_plus.strain(y);
                let s2 = es * p_minus.strain(-y);
                best = best.max((s1 - s2).abs());
            }
        }
        Some(best)
    }

    /// Stress range as [`Self::bar_stress_range_pa`], the largest over the directions of
    /// [`super::RcSection::directions`]'s rule (one for a full annulus).
    pub fn max_bar_stress_range_pa(&self, axial_n: f64, moment_amplitude_nm: f64) -> Option<f64> {
        let dirs: Vec<f64> = if self.annulus.sectors.is_empty() {
            vec![0.0]
        } else {
            self.annulus
                .sectors
                .iter()
                .flat_map(|s| {
                    let a = s.azimuth_rad;
                    [a, a + PI, a + 0.5 * PI, a - 0.5 * PI]
                })
                .collect()
        };
        let mut best: f64 = 0.0;
        for phi in dirs {
            best = best.max(self.bar_stress_range_pa(phi, axial_n, moment_amplitude_nm)?);
        }
        Some(best)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::resistance::annulus::BarRing;

    #[test]
    fn steel_ring_alone_in_pure_bending_matches_the_elastic_ring() {
        // Concrete modulus ~0: only a thin steel ring of area A at radius r carries M, so the
        // extreme bar stress is M r / I with I = A r^2 / 2 (thin ring, any mechanics text);
        // the range between +M and -M is twice that.
        let (r, a, m) = (4.0, 0.05, 2.0e7);
        let sec = CrackedSection {
            annulus: RcAnnulus {
                outer_radius_m: 4.2,
                inner_radius_m: 3.8,
                rings: vec![BarRing {
                    radius_m: r,
                    area_m2: a,
                }],
                sectors: vec![],
            },
            concrete_modulus_pa: 1e-3,
            steel_modulus_pa: 200e9,
        };
        let range = sec.bar_stress_range_pa(0.0, 0.0, m).unwrap();
        let exact = 2.0 * m * r / (a * r * r / 2.0);
        assert!((range - exact).abs() / exact < 1e-6, "{range} {exact}");
    }

    #[test]
    fn uncracked_section_under_large_axial_force_is_linear() {
        // Whole section compressed: stress = N/A_t + M y / I_t of the transformed section
        // (beam theory); range at the extreme bar = 2 M r E_s / (E_c I_c + E_s I_s).
        let ann = RcAnnulus::with_ratios(10.0, 0.4, 0.003, 0.0, 0.05, 0.05, vec![]);
        let (ec, es) = (30e9, 200e9);
        let sec = CrackedSection {
            annulus: ann.clone(),
            concrete_modulus_pa: ec,
            steel_modulus_pa: es,
        };
        let (ro, ri) = (ann.outer_radius_m, ann.inner_radius_m);
        let ic = PI / 4.0 * (ro.powi(4) - ri.powi(4));
        let ring = ann.rings[0];
        let is = ring.area_m2 * ring.radius_m.powi(2) / 2.0;
        let m = 1.0e6;
        let range = sec.bar_stress_range_pa(0.0, 5.0e7, m).unwrap();
        let exact = 2.0 * m * ring.radius_m * es / (ec * ic + es * is);
        assert!((range - exact).abs() / exact < 1e-8, "{range} {exact}");
    }
}
