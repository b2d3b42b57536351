//! Net section of a shell with openings against closed-form annular-sector integrals.
//!
//! Source: area and second moments of an annular sector in polar coordinates (any mechanics
//! text; written out here, not taken from the code): for radii r..R and the sector
//! -beta..beta about the x axis,
//!   A_s = beta (R^2 - r^2),  S_x = 2/3 (R^3 - r^3) sin beta,
//!   int x^2 dA = (R^4 - r^4)/8 (2 beta + sin 2 beta),  int y^2 dA = (R^4 - r^4)/8 (2 beta - sin 2 beta).
//! One opening of width w at azimuth 0 removes beta = asin(w / D) (the idealisation the
//! design notes name). The remaining section is symmetric about x; its centroid sits at
//! x_c = -S_x / A_net, and the principal second moments about the centroid are
//!   I_y = pi/4 (R^4 - r^4) - (R^4 - r^4)/8 (2 beta + sin 2 beta) - A_net x_c^2,
//!   I_x = pi/4 (R^4 - r^4) - (R^4 - r^4)/8 (2 beta - sin 2 beta).
//! The extreme fibre from the weaker axis (the y axis through the centroid here) is the
//! larger of R + x_c (far side) and R cos beta - x_c (the opening's edges).
//! Tolerance 1e-12 relative: both sides are closed forms evaluated in double precision.

use std::f64::consts::PI;

use stackwake::section::opening::{net_section, Cut};
use stackwake::section::Annulus;

fn rel(a: f64, b: f64) -> f64 {
    (a - b).abs() / b.abs()
}

#[test]
fn one_opening_matches_the_sector_integrals() {
    for (d, t, w) in [
        (6.0, 0.3, 2.5),
        (16.0, 0.55, 4.0),
        (9.0, 0.22, 7.0),
        (12.0, 0.4, 0.5),
    ] {
        let (r_out, r_in): (f64, f64) = (d / 2.0, d / 2.0 - t);
        let beta = (w / d).asin();
        let p4 = r_out.powi(4) - r_in.powi(4);
        let a_net = (PI - beta) * (r_out * r_out - r_in * r_in);
        let s_x = 2.0 / 3.0 * (r_out.powi(3) - r_in.powi(3)) * beta.sin();
        let x_c = -s_x / a_net;
        let i_y = PI / 4.0 * p4 - p4 / 8.0 * (2.0 * beta + (2.0 * beta).sin()) - a_net * x_c * x_c;
        let i_x = PI / 4.0 * p4 - p4 / 8.0 * (2.0 * beta - (2.0 * beta).sin());
        let (i_min, i_max) = (i_y.min(i_x), i_y.max(i_x));
        let n = net_section(&Annulus::new(d, t), &[Cut::new(w, 0.0, d).unwrap()]).unwrap();
        assert!(rel(n.area_m2, a_net) < 1e-12, "area {d} {t} {w}");
        assert!(rel(n.centroid_m[0], x_c) < 1e-12, "centroid {d} {t} {w}");
        assert!(n.centroid_m[1].abs() < 1e-12 * d, "symmetric: y_c = 0");
        assert!(
            rel(n.second_moment_min_m4, i_min) < 1e-12,
            "I_min {d} {t} {w}"
        );
        assert!(
            rel(n.second_moment_max_m4, i_max) < 1e-12,
            "I_max {d} {t} {w}"
        );
        // Bending towards the opening is the weaker direction: I_min = I_y.
        assert_eq!(i_min, i_y);
        let fibre = (r_out + x_c).max(r_out * beta.cos() - x_c);
        assert!(rel(n.extreme_fibre_m, fibre) < 1e-12, "fibre {d} {t} {w}");
        assert!(rel(n.section_modulus_m3(), i_min / fibre) < 1e-12);
    }
}

#[test]
fn two_opposite_openings_keep_the_centroid_and_remove_two_sectors() {
    // Two equal openings at 0 and 180 deg: centroid at the centre, I_y loses both sectors'
    // int x^2 dA, I_x both sectors' int y^2 dA (closed forms above, no parallel-axis term).
    let (d, t, w) = (10.0f64, 0.35f64, 3.0f64);
    let (r_out, r_in): (f64, f64) = (d / 2.0, d / 2.0 - t);
    let beta = (w / d).asin();
    let p4 = r_out.powi(4) - r_in.powi(4);
    let i_y = PI / 4.0 * p4 - 2.0 * p4 / 8.0 * (2.0 * beta + (2.0 * beta).sin());
    let i_x = PI / 4.0 * p4 - 2.0 * p4 / 8.0 * (2.0 * beta - (2.0 * beta).sin());
    let cuts = [Cut::new(w, 0.0, d).unwrap(), Cut::new(w, PI, d).unwrap()];
    let n = net_section(&Annulus::new(d, t), &cuts).unwrap();
    assert!(rel(n.area_m2, (PI - 2.0 * beta) * (r_out * r_out - r_in * r_in)) < 1e-12);
    assert!(n.centroid_m[0].abs() < 1e-12 && n.centroid_m[1].abs() < 1e-12);
    assert!(rel(n.second_moment_min_m4, i_y.min(i_x)) < 1e-12);
    assert!(rel(n.second_moment_max_m4, i_y.max(i_x)) < 1e-12);
    // Weak axis = y; extreme fibre = the edges at R cos beta.
    assert!(rel(n.extreme_fibre_m, r_out * beta.cos()) < 1e-12);
}

#[test]
fn an_opening_at_ninety_degrees_turns_the_weak_axis() {
    // The same opening at azimuth 90 deg: the same principal values, the weak neutral axis
    // now along x (angle 0 or pi).
    let (d, t, w) = (6.0, 0.3, 2.5);
    let a = net_section(&Annulus::new(d, t), &[Cut::new(w, 0.0, d).unwrap()]).unwrap();
    let b = net_section(&Annulus::new(d, t), &[Cut::new(w, PI / 2.0, d).unwrap()]).unwrap();
    assert!(rel(b.second_moment_min_m4, a.second_moment_min_m4) < 1e-11);
    assert!(rel(b.extreme_fibre_m, a.extreme_fibre_m) < 1e-11);
    assert!(
        b.min_axis_angle_rad.sin().abs() < 1e-9,
        "{}",
        b.min_axis_angle_rad
    );
    assert!(
        (a.min_axis_angle_rad.cos()).abs() < 1e-9,
        "{}",
        a.min_axis_angle_rad
    );
}
