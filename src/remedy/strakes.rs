//! Helical strakes over a height range: the user's factor on c_lat (EN 1991-1-4 gives none, so
//! it is user input), applied in proportion to how much of the correlation length is straked.
//!
//! Partial coverage: c_lat,eff = c_lat (1 - w (1 - factor)), w = int over L_j within the
//! straked range of |Phi| / int over L_j of |Phi| (our model: the lateral force of (E.7) is
//! the |Phi|-weighted force over L_j, so unstraked parts of L_j keep their full c_lat).
//! w depends on L_j, which depends on the amplitude: it enters the approach 1 fixed point.
//! EN 1991-1-4 credits strakes only for Sc > 8 and raises the along-wind force coefficient to
//! about 1.4 over the straked part (both from memory). Units: m.

use crate::wind::approach1;
use crate::wind::ModeShape;

/// Scruton number above which EN 1991-1-4 credits strakes (from memory).
pub const MIN_SCRUTON_FOR_STRAKES: f64 = 8.0;

/// Fraction w of int_Lj |Phi| that lies in [from_z_m, to_z_m].
pub fn coverage(
    shape: &ModeShape,
    antinode_z_m: f64,
    length_m: f64,
    from_z_m: f64,
    to_z_m: f64,
) -> f64 {
    let (a, b) = approach1::correlation_interval(shape, antinode_z_m, length_m);
    let total = shape.integral_abs(a, b);
    let (lo, hi) = (a.max(from_z_m), b.min(to_z_m));
    if total <= 0.0 || hi <= lo {
        return 0.0;
    }
    (shape.integral_abs(lo, hi) / total).clamp(0.0, 1.0)
}

/// Effective factor on c_lat for coverage `w` and the user's factor.
pub fn effective_factor(w: f64, c_lat_factor: f64) -> f64 {
    1.0 - w * (1.0 - c_lat_factor)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn coverage_of_a_uniform_shape() {
        let z = [0.0, 50.0, 100.0];
        let p = [1.0, 1.0, 1.0];
        let s = ModeShape::new(&z, &p, None);
        // L_j = 24 m at the top: 76-100 m; strakes 88-100 m cover half.
        assert!((coverage(&s, 100.0, 24.0, 88.0, 100.0) - 0.5).abs() < 1e-9);
        assert_eq!(coverage(&s, 100.0, 24.0, 0.0, 50.0), 0.0);
        assert!((coverage(&s, 100.0, 24.0, 0.0, 100.0) - 1.0).abs() < 1e-12);
        assert!((effective_factor(1.0, 0.3) - 0.3).abs() < 1e-15);
        assert_eq!(effective_factor(0.0, 0.3), 1.0);
    }
}
