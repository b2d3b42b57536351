//! Exact O(N) application of K^-1 for a cantilever (with optional base springs).
//!
//! Why not factorise K: K's entries scale like EI/h^3 while the smooth low modes carry
//! energy of order EI/L^3, so any factorisation of K loses ~ (L/h)^3 in relative accuracy
//! when solving for a smooth right-hand side. A cantilever is statically determinate: the
//! shear and moment in every element follow from the loads above it by summation from the tip
//! down, each element deforms under them with its exact 2x2 flexibility (clamped at its lower
//! node), the base springs take the resultant, and slopes and deflections are integrated
//! upward. Every step adds quantities of like magnitude, so K^-1 f is accurate to rounding at
//! any mesh size.

use super::model::BeamModel;

/// u = K^-1 f. `f` and `u` hold all dofs (w, theta per node, two bubbles per element);
/// forces on removed base dofs are taken by the rigid support and the removed dofs of `u`
/// are zero. Bubbles are energy-orthogonal to the nodal shapes: a 2x2 block per element.
#[track_caller]
pub fn apply_inverse_stiffness(model: &BeamModel, f: &[f64], u: &mut [f64]) {
    let n_nodes = model.z_m.len();
    assert!(f.len() == 4 * n_nodes - 2 && u.len() == 4 * n_nodes - 2);
    // Down sweep: store the resultant force P_i (N) and moment C_i (N m) of all loads at
    // nodes >= i about node i, in u as scratch (P in the w slot, C in the theta slot).
    let mut p_above = 0.0;
    let mut c_above = 0.0;
    for i in (0..n_nodes).rev() {
        let lever = if i + 1 < n_nodes { model.elements[i].length_m } else { 0.0 };
        let c_i = f[4 * i + 1] + c_above + p_above * lever;
        let p_i = f[4 * i] + p_above;
        u[4 * i] = p_i;
        u[4 * i + 1] = c_i;
        p_above = p_i;
        c_above = c_i;
    }
    // Base: springs take the resultant; a rigid direction stays at zero.
    let mut w = match model.base_lateral_n_per_m {
        Some(k) => u[0] / k,
        None => 0.0,
    };
    let mut theta = match model.base_rotational_nm_per_rad {
        Some(k) => u[1] / k,
        None => 0.0,
    };
    u[0] = w;
    u[1] = theta;
    // Up sweep through the elements with the end loads P_{e+1}, C_{e+1}.
    for (e, el) in model.elements.iter().enumerate() {
        let b = e + 1;
        let p = u[4 * b];
        let c = u[4 * b + 1];
        let [f_ww, f_wt, f_tt] = el.flexibility;
        let w_b = w + el.length_m * theta + f_ww * p + f_wt * c;
        let theta_b = theta + f_wt * p + f_tt * c;
        u[4 * b] = w_b;
        u[4 * b + 1] = theta_b;
        w = w_b;
        theta = theta_b;
        let [b11, b12, b22] = el.bubble_flexibility;
        let (f1, f2) = (f[4 * e + 2], f[4 * e + 3]);
        u[4 * e + 2] = b11 * f1 + b12 * f2;
        u[4 * e + 3] = b12 * f1 + b22 * f2;
    }
}
