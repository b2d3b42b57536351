//! EN 1991-1-4 Annex E approach 1 (E.1.5.2): peak across-wind amplitude of one mode from the
//! lateral force coefficient, the correlation length and the mode shape.
//!
//! y_F,max / b = (1 / St^2)(1 / Sc) K Kw c_lat                                    (E.7)
//! Kw = sum int_Lj |Phi| ds / sum int_lj |Phi| ds <= 0.6                          (E.8)
//! K  = sum int_lj |Phi| ds / (4 pi sum int_lj Phi^2 ds)                          (E.9)
//! Units: m, m/s; everything else dimensionless.
//!
//! Sources and confidence (see data/reference/README.md): Tables E.3, E.4, E.5 and
//! expressions (E.7)-(E.9) agree with the TU Munich Structural Wind Engineering notebooks
//! (2020-21); Figure E.2 (c_lat,0 of a circular section) is from memory and is a chart on a
//! log-Re axis: interpolating linearly in log10(Re) between its corner points is our reading.
//! We deliberately do NOT add a floor on c_lat or a cap L_j <= 0.75 h: neither is in the
//! standard.
//!
//! K and Kw are integrals over the computed mode shape (one shedding region centred on the
//! mode's largest antinode, shifted to stay on the structure); for Phi = (z/h)^2 they reproduce
//! Table E.5 (K = 5/(12 pi) = 0.1326, Kw = 3x(1 - x + x^2/3)).
//!
//! L_j depends on the amplitude (Table E.4) and c_lat on the mean speed at the centre of L_j
//! (Table E.3), so the amplitude is a fixed point, found by iteration from y = 0.

use std::f64::consts::PI;

use serde::Serialize;

use crate::case::Wind;
use crate::wind::profile;
use crate::wind::shape::ModeShape;

/// Kw upper bound (EN 1991-1-4 (E.8)).
pub const KW_MAX: f64 = 0.6;
/// K of a cantilever's first mode, Table E.5 (rounded).
pub const K_CANTILEVER_TABLE: f64 = 0.13;

/// Basic lateral force coefficient c_lat,0 of a circular section vs Reynolds number
/// (EN 1991-1-4 Figure E.2, corner values from memory; linear in log10(Re) between them is our
/// reading of the log-axis chart): 0.7 up to 3e5, 0.2 at 5e5 .. 5e6, 0.3 from 1e7.
pub fn c_lat0_circular(reynolds: f64) -> f64 {
    const POINTS: [(f64, f64); 4] = [(3e5, 0.7), (5e5, 0.2), (5e6, 0.2), (1e7, 0.3)];
    if reynolds <= POINTS[0].0 {
        return POINTS[0].1;
    }
    for w in POINTS.windows(2) {
        let ((r0, c0), (r1, c1)) = (w[0], w[1]);
        if reynolds <= r1 {
            let t = (reynolds / r0).log10() / (r1 / r0).log10();
            return c0 + t * (c1 - c0);
        }
    }
    POINTS[3].1
}

/// c_lat / c_lat,0 vs the speed ratio v_crit / v_m,Lj (EN 1991-1-4 Table E.3): 1 up to 0.83,
/// 3 - 2.4 ratio up to 1.25, 0 above.
pub fn c_lat_speed_factor(speed_ratio: f64) -> f64 {
    if speed_ratio <= 0.83 {
        1.0
    } else if speed_ratio < 1.25 {
        3.0 - 2.4 * speed_ratio
    } else {
        0.0
    }
}

/// Effective correlation length L_j / b vs y_F / b (EN 1991-1-4 Table E.4): 6 below 0.1,
/// 4.8 + 12 y/b up to 0.6, 12 above.
pub fn correlation_length_per_diameter(y_per_diameter: f64) -> f64 {
    if y_per_diameter < 0.1 {
        6.0
    } else if y_per_diameter <= 0.6 {
        4.8 + 12.0 * y_per_diameter
    } else {
        12.0
    }
}

/// Kw of a cantilever's first mode (EN 1991-1-4 Table E.5): 3x(1 - x + x^2/3), x = L_j / l,
/// uncapped (apply [`KW_MAX`] yourself).
pub fn kw_cantilever_table(correlation_length_m: f64, height_m: f64) -> f64 {
    let x = (correlation_length_m / height_m).min(1.0);
    3.0 * x * (1.0 - x + x * x / 3.0)
}

/// K = int |Phi| / (4 pi int Phi^2) over the whole structure (EN 1991-1-4 (E.9)).
pub fn k_mode_shape(shape: &ModeShape) -> f64 {
    let h = shape.height_m();
    let z0 = shape.z_m()[0];
    shape.integral_abs(z0, h) / (4.0 * PI * shape.integral_sq(z0, h))
}

/// The shedding region of length `length_m` centred on `antinode_z_m`, shifted to lie on the
/// structure (at the top of a cantilever it runs down from the tip, as in EN 1991-1-4
/// Figure E.3). Returns (from, to), m.
pub fn correlation_interval(shape: &ModeShape, antinode_z_m: f64, length_m: f64) -> (f64, f64) {
    let (lo, hi) = (shape.z_m()[0], shape.height_m());
    if length_m >= hi - lo {
        return (lo, hi);
    }
    let mut a = antinode_z_m - 0.5 * length_m;
    let mut b = antinode_z_m + 0.5 * length_m;
    if a < lo {
        b += lo - a;
        a = lo;
    }
    if b > hi {
        a -= b - hi;
        b = hi;
    }
    (a, b)
}

/// Kw = int_Lj |Phi| / int_l |Phi| for one region centred on the antinode (EN 1991-1-4 (E.8)),
/// uncapped.
pub fn kw_mode_shape(shape: &ModeShape, antinode_z_m: f64, length_m: f64) -> f64 {
    let (a, b) = correlation_interval(shape, antinode_z_m, length_m);
    shape.integral_abs(a, b) / shape.integral_abs(shape.z_m()[0], shape.height_m())
}

/// Inputs of (E.7) that do not depend on the amplitude.
#[derive(Debug, Clone, Copy)]
pub struct Approach1Params {
    pub diameter_m: f64,
    pub strouhal: f64,
    pub scruton: f64,
    /// Mode-shape factor K (E.9).
    pub k: f64,
}

/// The fixed point of (E.7) with Table E.4.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Amplitude1 {
    /// Peak amplitude at the largest antinode, m.
    pub y_max_m: f64,
    /// Effective correlation length L_j, m.
    pub correlation_length_m: f64,
    /// Kw before the 0.6 cap.
    pub kw_uncapped: f64,
    /// Kw used (<= 0.6).
    pub kw: f64,
    /// c_lat used.
    pub c_lat: f64,
    /// Iterations of the fixed-point search.
    pub iterations: usize,
    /// False when plain iteration did not settle and bisection found the fixed point.
    pub converged_by_iteration: bool,
}

/// Solves (E.7) for the amplitude. `kw_of_length` gives the uncapped Kw for a correlation
/// length (m); `c_lat_of_length` gives c_lat (Table E.3 applied, group factor included) for a
/// correlation length, because v_m,Lj is taken at the centre of L_j. No allocation.
pub fn amplitude(
    p: &Approach1Params,
    kw_of_length: impl Fn(f64) -> f64,
    c_lat_of_length: impl Fn(f64) -> f64,
) -> Amplitude1 {
    let b = p.diameter_m;
    let scale = b / (p.strouhal * p.strouhal * p.scruton) * p.k;
    let eval = |y: f64| {
        let l = b * correlation_length_per_diameter(y / b);
        let kw_raw = kw_of_length(l);
        let kw = kw_raw.min(KW_MAX);
        let c = c_lat_of_length(l);
        (scale * kw * c, l, kw_raw, kw, c)
    };
    let pack = |y: f64, iterations: usize, by_iteration: bool| {
        let (_, l, kw_raw, kw, c) = eval(y);
        Amplitude1 {
            y_max_m: y,
            correlation_length_m: l,
            kw_uncapped: kw_raw,
            kw,
            c_lat: c,
            iterations,
            converged_by_iteration: by_iteration,
        }
    };
    let tol = 1e-12 * b;
    let mut y = 0.0;
    for it in 1..=200 {
        let next = eval(y).0;
        if (next - y).abs() <= tol + 1e-12 * next.abs() {
            return pack(next, it, true);
        }
        y = next;
    }
    // Plain iteration cycles only when c_lat falls fast with L_j (Table E.3 ramp): bisect
    // g(y) - y, which is >= 0 at y = 0 and <= 0 above the largest value g can take.
    let mut hi = (0..=24)
        .map(|i| {
            let y_probe = b * (0.1 + 0.5 * i as f64 / 24.0);
            eval(y_probe).0
        })
        .fold(eval(0.0).0, f64::max)
        * 1.000_001
        + tol;
    let mut lo = 0.0;
    for _ in 0..200 {
        let mid = 0.5 * (lo + hi);
        if eval(mid).0 - mid > 0.0 {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    pack(0.5 * (lo + hi), 400, false)
}

/// Everything approach 1 needs for one mode on the computed shape: used by the check, and by
/// remedy/sweep callers that re-solve many times.
#[derive(Debug, Clone, Copy)]
pub struct Approach1Setup<'a> {
    pub shape: ModeShape<'a>,
    pub wind: &'a Wind,
    /// Height of the largest antinode (shedding section), m.
    pub antinode_z_m: f64,
    pub diameter_m: f64,
    pub strouhal: f64,
    pub scruton: f64,
    pub critical_speed_m_s: f64,
    /// c_lat,0 from Figure E.2 at the mode's Re.
    pub c_lat0: f64,
    /// Group factor on c_lat (1 for a single stack).
    pub c_lat_group_factor: f64,
    /// K (E.9) of the shape.
    pub k: f64,
}

/// Approach 1 result at one wind level.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Solved1 {
    pub amplitude: Amplitude1,
    /// v_crit / v_m at the centre of L_j (Table E.3 argument).
    pub speed_ratio_lj: f64,
    /// Centre of the correlation length, m.
    pub correlation_centre_z_m: f64,
}

impl<'a> Approach1Setup<'a> {
    /// Builds the setup, computing K from the shape and c_lat,0 from Re.
    #[allow(clippy::too_many_arguments)]
    pub fn new(
        shape: ModeShape<'a>,
        wind: &'a Wind,
        antinode_z_m: f64,
        diameter_m: f64,
        strouhal: f64,
        scruton: f64,
        critical_speed_m_s: f64,
        reynolds: f64,
        c_lat_group_factor: f64,
    ) -> Self {
        Approach1Setup {
            shape,
            wind,
            antinode_z_m,
            diameter_m,
            strouhal,
            scruton,
            critical_speed_m_s,
            c_lat0: c_lat0_circular(reynolds),
            c_lat_group_factor,
            k: k_mode_shape(&shape),
        }
    }

    fn centre(&self, length_m: f64) -> f64 {
        let (a, b) = correlation_interval(&self.shape, self.antinode_z_m, length_m);
        0.5 * (a + b)
    }

    /// Solves with the site profile scaled by `speed_scale` (1 = the design wind).
    pub fn solve_scaled(&self, speed_scale: f64) -> Solved1 {
        let ratio_at = |l: f64| {
            let v = speed_scale * profile::mean_speed_m_s(self.wind, self.centre(l));
            if v > 0.0 {
                self.critical_speed_m_s / v
            } else {
                f64::INFINITY
            }
        };
        let params = Approach1Params {
            diameter_m: self.diameter_m,
            strouhal: self.strouhal,
            scruton: self.scruton,
            k: self.k,
        };
        let amplitude = amplitude(
            &params,
            |l| kw_mode_shape(&self.shape, self.antinode_z_m, l),
            |l| self.c_lat_group_factor * self.c_lat0 * c_lat_speed_factor(ratio_at(l)),
        );
        Solved1 {
            speed_ratio_lj: ratio_at(amplitude.correlation_length_m),
            correlation_centre_z_m: self.centre(amplitude.correlation_length_m),
            amplitude,
        }
    }

    /// Solves for the design wind.
    pub fn solve(&self) -> Solved1 {
        self.solve_scaled(1.0)
    }
}

/// One point of the amplitude-vs-wind-speed curve.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct ResponsePoint {
    /// Mean speed at the shedding section, m/s.
    pub mean_speed_m_s: f64,
    /// v_crit / v_m at the centre of L_j.
    pub speed_ratio: f64,
    pub c_lat: f64,
    /// Peak amplitude at the largest antinode, m.
    pub y_max_m: f64,
}

/// Approach 1 amplitude for a range of wind levels around v_crit: the site profile is scaled so
/// that the mean speed at the shedding section takes each value in `mean_speeds_m_s`. The
/// amplitude follows c_lat's dependence on the speed ratio (Table E.3): zero below
/// v_crit / 1.25, rising linearly in the ratio, constant above v_crit / 0.83.
pub fn response_curve(setup: &Approach1Setup, mean_speeds_m_s: &[f64]) -> Vec<ResponsePoint> {
    let v_here = profile::mean_speed_m_s(setup.wind, setup.antinode_z_m);
    mean_speeds_m_s
        .iter()
        .map(|&v| {
            let s = if v_here > 0.0 { v / v_here } else { 0.0 };
            let solved = setup.solve_scaled(s);
            ResponsePoint {
                mean_speed_m_s: v,
                speed_ratio: solved.speed_ratio_lj,
                c_lat: solved.amplitude.c_lat,
                y_max_m: solved.amplitude.y_max_m,
            }
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn fixed_point_with_growing_correlation_length() {
        // Invented: large c_lat so y/b passes 0.1; check y = C Kw(L(y)) at the fixed point.
        let p = Approach1Params {
            diameter_m: 1.0,
            strouhal: 0.18,
            scruton: 5.0,
            k: K_CANTILEVER_TABLE,
        };
        let a = amplitude(&p, |l| kw_cantilever_table(l, 30.0), |_| 0.7);
        assert!(a.y_max_m > 0.1);
        let l = correlation_length_per_diameter(a.y_max_m);
        let y = 1.0 / (0.18f64.powi(2) * 5.0) * 0.13 * kw_cantilever_table(l, 30.0).min(0.6) * 0.7;
        assert!((y - a.y_max_m).abs() < 1e-9);
        assert!(a.converged_by_iteration);
    }

    #[test]
    fn interval_shifts_to_stay_on_structure() {
        let z = [0.0, 50.0, 100.0];
        let p = [0.0, 0.5, 1.0];
        let s = ModeShape::new(&z, &p, None);
        assert_eq!(correlation_interval(&s, 100.0, 24.0), (76.0, 100.0));
        assert_eq!(correlation_interval(&s, 5.0, 24.0), (0.0, 24.0));
        assert_eq!(correlation_interval(&s, 50.0, 24.0), (38.0, 62.0));
        assert_eq!(correlation_interval(&s, 50.0, 240.0), (0.0, 100.0));
    }
}
