//! Axial force from self-weight along the height of a stage: N_G(z) = g (int_z^top m ds +
//! sum of the point masses at or above z), at each node for the section just below it (so a
//! point mass at the node is included, as in the inertia-load statics). The masses are the
//! ones the stage's beam model carries (shell, lining when installed, point masses), so
//! N_G and the modal model can never disagree. Units: N.
//!
//! g = 9.80665 m/s2 (standard gravity, CGPM 1901; common practice).

use crate::modal::StageModel;
use crate::wind::shape::element_mass_kg_m;

/// Standard acceleration of gravity, m/s2.
pub const GRAVITY_M_S2: f64 = 9.806_65;

/// Characteristic self-weight N_G at every node of the stage model (compression positive), N.
pub fn self_weight_n(model: &StageModel) -> Vec<f64> {
    let n = model.z_m.len();
    let mut out = vec![0.0; n];
    let point_at = |i: usize| -> f64 {
        model
            .point_masses
            .iter()
            .filter(|(k, _)| *k == i)
            .map(|(_, m)| m)
            .sum()
    };
    let mut mass = point_at(n - 1);
    out[n - 1] = GRAVITY_M_S2 * mass;
    for e in (0..n - 1).rev() {
        // The element mass per metre is linear in t, so the midpoint value is exact.
        let len = model.z_m[e + 1] - model.z_m[e];
        mass += element_mass_kg_m(model, e, 0.5) * len + point_at(e);
        out[e] = GRAVITY_M_S2 * mass;
    }
    out
}
