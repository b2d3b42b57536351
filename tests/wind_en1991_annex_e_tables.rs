//! Table lookups of EN 1991-1-4 Annex E at their breakpoints and between, as listed in
//! data/reference/README.md: Figure E.2 (c_lat,0, from memory; linear in log10 Re is our
//! reading of the chart), Table E.3 (c_lat vs speed ratio), Table E.4 (L_j/b vs y/b), Table E.5
//! (K, Kw of a cantilever; E.3-E.5 agree with the TU Munich notebooks per data/reference/README.md),
//! Table E.6 (approach 2 constants, from memory; log10 Re interpolation is our choice).

mod wind_common;
use wind_common as common;

use std::f64::consts::PI;

use stackwake::wind::approach1::{
    c_lat0_circular, c_lat_speed_factor, correlation_length_per_diameter, k_mode_shape,
    kw_cantilever_table, kw_mode_shape,
};
use stackwake::wind::approach2::table_e6;
use stackwake::wind::ModeShape;

fn close(a: f64, b: f64, tol: f64) -> bool {
    (a - b).abs() <= tol
}

#[test]
fn figure_e2_c_lat0_breakpoints_and_between() {
    // EN 1991-1-4 Figure E.2 (from memory)
    for (re, c) in [
        (1e4, 0.7),
        (3e5, 0.7),
        (5e5, 0.2),
        (1e6, 0.2),
        (5e6, 0.2),
        (1e7, 0.3),
        (1e8, 0.3),
    ] {
        assert!(close(c_lat0_circular(re), c, 1e-12), "Re {re}");
    }
    // geometric midpoints are arithmetic midpoints in log10 Re (our reading)
    assert!(close(c_lat0_circular((3e5f64 * 5e5).sqrt()), 0.45, 1e-12));
    assert!(close(c_lat0_circular((5e6f64 * 1e7).sqrt()), 0.25, 1e-12));
}

#[test]
fn table_e3_speed_ratio_factor() {
    // EN 1991-1-4 Table E.3
    for (r, f) in [
        (0.5, 1.0),
        (0.83, 1.0),
        (1.0, 0.6),
        (1.1, 0.36),
        (1.25, 0.0),
        (2.0, 0.0),
    ] {
        assert!(close(c_lat_speed_factor(r), f, 1e-12), "ratio {r}");
    }
}

#[test]
fn table_e4_correlation_length() {
    // EN 1991-1-4 Table E.4
    for (y, l) in [
        (0.0, 6.0),
        (0.05, 6.0),
        (0.1, 6.0),
        (0.35, 9.0),
        (0.6, 12.0),
        (1.0, 12.0),
    ] {
        assert!(
            close(correlation_length_per_diameter(y), l, 1e-12),
            "y/b {y}"
        );
    }
}

#[test]
fn table_e5_k_and_kw_integrals_for_the_parabola() {
    // EN 1991-1-4 Table E.5, cantilever: K = 0.13; Kw = 3x(1 - x + x^2/3). Our integrals over
    // Phi = (z/h)^2 give K = 5/(12 pi) = 0.1326 exactly (calculus) and the Kw formula.
    let model = common::uniform_tube(100.0, 5.0, 0.3, 1.0, 25);
    let mode = common::parabola_mode(&model, 1, 1.0, 1.0);
    let shape = ModeShape::from_mode(&model, &mode);
    let k = k_mode_shape(&shape);
    assert!(close(k, 5.0 / (12.0 * PI), 1e-12));
    assert!(close(k, 0.13, 0.005));
    for x in [0.05, 0.1, 0.25, 0.3, 0.5, 0.77, 1.0] {
        let l = 100.0 * x;
        let integral = kw_mode_shape(&shape, 100.0, l);
        assert!(
            close(integral, kw_cantilever_table(l, 100.0), 1e-12),
            "x {x}"
        );
        assert!(close(integral, 3.0 * x * (1.0 - x + x * x / 3.0), 1e-12));
    }
    // with a linear-only shape (no rotations) the integrals converge as the mesh refines
    let fine = common::uniform_tube(100.0, 5.0, 0.3, 1.0, 2000);
    let fm = common::parabola_mode(&fine, 1, 1.0, 1.0);
    let linear = ModeShape::new(&fine.z_m, &fm.displacement, None);
    assert!(close(k_mode_shape(&linear), 5.0 / (12.0 * PI), 1e-6));
}

#[test]
fn table_e6_approach2_constants() {
    // EN 1991-1-4 Table E.6 (from memory)
    assert_eq!(table_e6(5e4), (0.02, 2.0));
    assert_eq!(table_e6(1e5), (0.02, 2.0));
    let (c, k) = table_e6(5e5);
    assert!(close(c, 0.005, 1e-15) && close(k, 0.5, 1e-12));
    assert_eq!(table_e6(1e6), (0.01, 1.0));
    assert_eq!(table_e6(2.963e6), (0.01, 1.0));
    // between: arithmetic midpoint at the geometric-mean Re (our log10 interpolation)
    let (c, k) = table_e6((1e5f64 * 5e5).sqrt());
    assert!(close(c, 0.0125, 1e-12) && close(k, 1.25, 1e-12));
    let (c, k) = table_e6((5e5f64 * 1e6).sqrt());
    assert!(close(c, 0.0075, 1e-12) && close(k, 0.75, 1e-12));
}
