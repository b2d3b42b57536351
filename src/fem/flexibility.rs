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

use super::block::Block;
use super::model::BeamModel;

/// u = K^-1 f for a block of load vectors (see [`apply_inverse_stiffness`]).
#[track_caller]
pub fn apply_inverse_stiffness_block(model: &BeamModel, f: &Block, u: &mut Block) {
    let n_nodes = model.z_m.len();
    let p = f.width;
    assert!(f.dofs == 4 * n_nodes - 2 && u.dofs == f.dofs && u.width == p);
    let ops = &model.operator;
    // Down sweep: resultant force P_i (N) and moment C_i (N m) of all loads at nodes >= i
    // about node i, stored in u as scratch (P in the w row, C in the theta row).
    for i in (0..n_nodes).rev() {
        let (w_row, t_row) = (4 * i, 4 * i + 1);
        if i + 1 < n_nodes {
            let lever = ops[i].length_m;
            let (below, above) = u.data.split_at_mut(4 * (i + 1) * p);
            let p_above = &above[..p];
            let c_above = &above[p..2 * p];
            let fw = f.row(w_row);
            let ft = f.row(t_row);
            let (pw, ct) = below[w_row * p..(t_row + 1) * p].split_at_mut(p);
            for c in 0..p {
                ct[c] = ft[c] + c_above[c] + p_above[c] * lever;
                pw[c] = fw[c] + p_above[c];
            }
        } else {
            u.row_mut(w_row).copy_from_slice(f.row(w_row));
            u.row_mut(t_row).copy_from_slice(f.row(t_row));
        }
    }
    // Base: springs take the resultant; a rigid direction stays at zero.
    for c in 0..p {
        u.data[c] = model.base_lateral_n_per_m.map_or(0.0, |k| u.data[c] / k);
        u.data[p + c] = model
            .base_rotational_nm_per_rad
            .map_or(0.0, |k| u.data[p + c] / k);
    }
    // Up sweep through the elements with the end loads P_{e+1}, C_{e+1}.
    for (e, el) in ops.iter().enumerate() {
        let [f_ww, f_wt, f_tt] = el.flexibility;
        let h = el.length_m;
        let (lower, upper) = u.data.split_at_mut(4 * (e + 1) * p);
        let w_a = &lower[4 * e * p..(4 * e + 1) * p];
        let t_a = &lower[(4 * e + 1) * p..(4 * e + 2) * p];
        let (wb, rest) = upper.split_at_mut(p);
        let tb = &mut rest[..p];
        for c in 0..p {
            let (load, moment) = (wb[c], tb[c]);
            wb[c] = w_a[c] + h * t_a[c] + f_ww * load + f_wt * moment;
            tb[c] = t_a[c] + f_wt * load + f_tt * moment;
        }
        let [b11, b12, b22] = el.bubble_flexibility;
        for c in 0..p {
            let (f1, f2) = (f.data[(4 * e + 2) * p + c], f.data[(4 * e + 3) * p + c]);
            lower[(4 * e + 2) * p + c] = b11 * f1 + b12 * f2;
            lower[(4 * e + 3) * p + c] = b12 * f1 + b22 * f2;
        }
    }
}

/// u = K^-1 f for one vector.
pub fn apply_inverse_stiffness(model: &BeamModel, f: &[f64], u: &mut [f64]) {
    let fb = Block {
        dofs: f.len(),
        width: 1,
        data: f.to_vec(),
    };
    let mut ub = Block::zeros(f.len(), 1);
    apply_inverse_stiffness_block(model, &fb, &mut ub);
    u.copy_from_slice(&ub.data);
}
