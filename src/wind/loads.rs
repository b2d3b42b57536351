//! Inertia loads of a vibrating mode and the shear, bending moment and extreme-fibre stress
//! they cause along the height.
//!
//! F_w(s) = m(s) (2 pi n)^2 Phi(s) y_max per metre (EN 1991-1-4 E.1.4 (E.3), from memory);
//! a point mass M_k at node k carries the concentrated force M_k (2 pi n)^2 Phi_k y_max
//! (same d'Alembert reasoning, common practice). Shear V(z) = int_z^h f ds + sum_{z_k >= z} P_k
//! and moment M(z) = int_z^h f (s - z) ds + sum P_k (z_k - z) (statics of a cantilever);
//! values at a node are for the section just below it, so a point force at that node is
//! included. Stress sigma = M / W with W = I / (D/2) of the uncracked annulus.
//! Units: N/m, N, N m, Pa.
//!
//! The integration runs element by element from the top down with 4-point Gauss on the Hermite
//! shape, so it is exact for linear mass and cubic Phi.

use serde::Serialize;

use crate::modal::StageModel;
use crate::wind::shape::{ModeShape, GAUSS4};

/// Load effects at one node.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct LoadPoint {
    pub z_m: f64,
    /// Distributed force per metre at the node, N/m.
    pub line_force_n_m: f64,
    /// Concentrated force at the node (point masses), N.
    pub point_force_n: f64,
    /// Shear just below the node, N.
    pub shear_n: f64,
    /// Bending moment, N m.
    pub moment_nm: f64,
    /// Extreme-fibre bending stress of the uncracked annulus, Pa.
    pub stress_pa: f64,
}

/// Shear and moment at every node (written into `shear_n`, `moment_nm`, each of node count)
/// under the line load `scale * w(e, t) * Phi(e, t)` per metre and point forces
/// `(node, N)`. `w(e, t)` is a weight inside element e at local coordinate t (mass for
/// inertia loads, diameter for pressure loads). No allocation.
pub fn internal_forces(
    shape: &ModeShape,
    scale: f64,
    w: impl Fn(usize, f64) -> f64,
    point_forces_n: &[(usize, f64)],
    shear_n: &mut [f64],
    moment_nm: &mut [f64],
) {
    let z = shape.z_m();
    let n = z.len();
    assert!(
        shear_n.len() == n && moment_nm.len() == n,
        "output length must equal node count"
    );
    let point_at = |i: usize| -> f64 {
        point_forces_n
            .iter()
            .filter(|(k, _)| *k == i)
            .map(|(_, p)| p)
            .sum()
    };
    shear_n[n - 1] = point_at(n - 1);
    moment_nm[n - 1] = 0.0;
    for e in (0..n - 1).rev() {
        let len = z[e + 1] - z[e];
        let mut force = 0.0;
        let mut lever = 0.0;
        for &(t, wt) in &GAUSS4 {
            let f = scale * w(e, t) * shape.eval(e, t) * wt * len;
            force += f;
            lever += f * t * len;
        }
        shear_n[e] = shear_n[e + 1] + force + point_at(e);
        moment_nm[e] = moment_nm[e + 1] + shear_n[e + 1] * len + lever;
    }
}

/// Inertia loads of the mode with peak amplitude `y_max_m` at the largest antinode
/// (EN 1991-1-4 E.1.4), with shear, moment and stress at every node.
pub fn inertia_loads(
    model: &StageModel,
    shape: &ModeShape,
    frequency_hz: f64,
    y_max_m: f64,
) -> Vec<LoadPoint> {
    let omega2 = (2.0 * std::f64::consts::PI * frequency_hz).powi(2);
    let scale = omega2 * y_max_m;
    let phi = shape.nodal();
    let points: Vec<(usize, f64)> = model
        .point_masses
        .iter()
        .map(|&(i, m)| (i, m * scale * phi[i]))
        .collect();
    let line: Vec<f64> = (0..phi.len())
        .map(|i| (model.shell_mass_kg_m[i] + model.lining_mass_kg_m[i]) * scale * phi[i])
        .collect();
    effects(
        model,
        shape,
        scale,
        |e, t| crate::wind::shape::element_mass_kg_m(model, e, t),
        &points,
        &line,
    )
}

/// Static effects of a line load `scale * w(e, t) * Phi` plus point forces, packaged per node;
/// `line_force_n_m` gives the nodal line-load values for the report.
pub fn effects(
    model: &StageModel,
    shape: &ModeShape,
    scale: f64,
    w: impl Fn(usize, f64) -> f64,
    point_forces_n: &[(usize, f64)],
    line_force_n_m: &[f64],
) -> Vec<LoadPoint> {
    let n = model.z_m.len();
    let mut shear = vec![0.0; n];
    let mut moment = vec![0.0; n];
    internal_forces(shape, scale, w, point_forces_n, &mut shear, &mut moment);
    (0..n)
        .map(|i| {
            // The net section's modulus at openings and the weaker side where the section
            // jumps (see `StageModel::section_modulus_m3`).
            let section_modulus_m3 = model.stress_modulus_m3(i);
            LoadPoint {
                z_m: model.z_m[i],
                line_force_n_m: line_force_n_m[i],
                point_force_n: point_forces_n
                    .iter()
                    .filter(|(k, _)| *k == i)
                    .map(|(_, p)| p)
                    .sum(),
                shear_n: shear[i],
                moment_nm: moment[i],
                stress_pa: moment[i] / section_modulus_m3,
            }
        })
        .collect()
}

/// Largest |stress| over the height, Pa.
pub fn max_abs_stress_pa(loads: &[LoadPoint]) -> f64 {
    loads.iter().map(|l| l.stress_pa.abs()).fold(0.0, f64::max)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn uniform_load_on_a_cantilever() {
        // q = 2 N/m on Phi = 1, h = 10: V(0) = 20 N, M(0) = q h^2 / 2 = 100 N m (statics).
        let z: Vec<f64> = (0..=4).map(|i| 2.5 * i as f64).collect();
        let p = vec![1.0; 5];
        let s = vec![0.0; 5];
        let shape = ModeShape::new(&z, &p, Some(&s));
        let mut v = vec![0.0; 5];
        let mut m = vec![0.0; 5];
        internal_forces(&shape, 2.0, |_, _| 1.0, &[(4, 3.0)], &mut v, &mut m);
        assert!((v[0] - 23.0).abs() < 1e-12);
        assert!((m[0] - (100.0 + 30.0)).abs() < 1e-12);
        assert!((m[2] - (2.0 * 25.0 / 2.0 + 3.0 * 5.0)).abs() < 1e-12);
        assert_eq!(v[4], 3.0);
    }
}
