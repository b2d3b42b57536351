//! Closed forms for the inertia added to the beam model: a tip mass with rotary inertia, and
//! a stiff shell rocking and sliding on foundation springs with the foundation's own mass
//! and rotary inertia.
//!
//! 1. Uniform Euler-Bernoulli cantilever with a tip mass M and rotary inertia J (Karnovsky &
//!    Lebed, Formulas for Structural Dynamics (2004), sec. 7.5.3 treat the tip mass; the
//!    rotary term is written here from the boundary conditions, not recalled): with
//!    w = A (cosh bx - cos bx) + B (sinh bx - sin bx), b^4 = m omega^2 / EI, the tip
//!    conditions EI w''(L) = omega^2 J w'(L) and EI w'''(L) = -omega^2 M w(L) give a 2x2
//!    determinant whose roots are found here by bisection. With J = 0 it reproduces the
//!    Karnovsky & Lebed root lambda_1 = 1.247917 for M / (m L) = 1 (references.md).
//!    Tolerance 2e-6: 400 elements converge far below that (h^4), and the roots are solved
//!    to 1e-12.
//! 2. Rigid body on springs (closed form, any dynamics text): a shell made 1e8 times
//!    stiffer than concrete moves as a rigid bar of mass mH on the lateral spring k_l and the
//!    rotational spring k_r, with the foundation's mass M_f and rotary inertia J_f at the
//!    base: K = diag(k_l, k_r), M = [[M_f + mH, mH^2/2], [mH^2/2, J_f + mH^3/3]] in (w0,
//!    theta0); det(K - omega^2 M) = 0. Tolerance 1e-6: the shell's own flexibility lowers the
//!    frequencies by 2.8e-5 relative at 1e5 times the stiffness, falling as 1/E (measured),
//!    so by ~3e-8 here.
//!
//! Model: 60 m tube, D = 4 m, t = 0.2 m, E = 30 GPa, rho = 2500 kg/m3 (invented).

mod common;

use stackwake::case::{BaseInertia, BaseSprings, BeamTheory, PointMass};

const L: f64 = 60.0;

fn bisect(f: impl Fn(f64) -> f64, mut a: f64, mut b: f64) -> f64 {
    let fa0 = f(a);
    for _ in 0..200 {
        let c = 0.5 * (a + b);
        if (f(c) > 0.0) == (fa0 > 0.0) {
            a = c;
        } else {
            b = c;
        }
    }
    0.5 * (a + b)
}

/// Determinant of the tip conditions for b L = l, with mu = M/(mL), j = J/(mL^3).
fn tip_determinant(l: f64, mu: f64, j: f64) -> f64 {
    let (s, c, sh, ch) = (l.sin(), l.cos(), l.sinh(), l.cosh());
    // Derivatives of the two shapes at x = L, in units of b^k:
    // phi1 = ch - c, phi2 = sh - s.
    let (p1, d1, dd1, ddd1) = (ch - c, sh + s, ch + c, sh - s);
    let (p2, d2, dd2, ddd2) = (sh - s, ch - c, sh + s, ch + c);
    // With omega^2 / EI = b^4 / m and x scaled by L:
    // EI w'' - omega^2 J w'  -> l^2 dd - j l^5 d   (units EI / L^2),
    // EI w''' + omega^2 M w  -> l^3 ddd + mu l^4 p (units EI / L^3).
    let moment = |d: f64, dd: f64| l * l * dd - j * l.powi(5) * d;
    let shear = |p: f64, ddd: f64| l.powi(3) * ddd + mu * l.powi(4) * p;
    let a11 = moment(d1, dd1);
    let a12 = moment(d2, dd2);
    let a21 = shear(p1, ddd1);
    let a22 = shear(p2, ddd2);
    (a11 * a22 - a12 * a21) / ch.powi(2)
}

#[test]
fn tip_determinant_reproduces_the_tip_mass_root() {
    // Karnovsky & Lebed sec. 7.5.3 root for mu = 1 (computed with scipy, references.md).
    let l = bisect(|l| tip_determinant(l, 1.0, 0.0), 1.0, 1.5);
    assert!((l - 1.247917).abs() < 1e-6, "{l}");
    // No tip mass: Blevins table 8-1 lambda_1 = 1.87510407.
    let l = bisect(|l| tip_determinant(l, 0.0, 0.0), 1.5, 2.5);
    assert!((l - 1.87510407).abs() < 1e-7, "{l}");
}

#[test]
fn tip_mass_with_rotary_inertia_matches_the_closed_form() {
    for (mu, j) in [(0.5, 0.01), (1.0, 0.05), (0.2, 0.2)] {
        let mut case = common::uniform_tube(L, 4.0, 0.2, BeamTheory::EulerBernoulli);
        let (ei, m) = common::tube_ei_m(&case);
        case.point_masses.push(PointMass {
            z_m: L,
            mass_kg: mu * m * L,
            rotary_inertia_kg_m2: j * m * L.powi(3),
            label: "tip".into(),
            stages: None,
        });
        let f = common::frequencies(&case, 3, Some(400));
        // Roots of the determinant, bracketed between its sign changes on a fine grid.
        let mut roots = Vec::new();
        let grid: Vec<f64> = (1..4000).map(|k| k as f64 * 0.0025).collect();
        for w in grid.windows(2) {
            let (a, b) = (tip_determinant(w[0], mu, j), tip_determinant(w[1], mu, j));
            if a * b < 0.0 {
                roots.push(bisect(|l| tip_determinant(l, mu, j), w[0], w[1]));
            }
        }
        for (k, l) in roots.iter().take(2).enumerate() {
            let exact = l * l / (2.0 * std::f64::consts::PI * L * L) * (ei / m).sqrt();
            assert!(
                (f[k] - exact).abs() / exact < 2e-6,
                "mu {mu} j {j} mode {}: {} vs {exact}",
                k + 1,
                f[k]
            );
        }
    }
}

#[test]
fn stiff_shell_on_springs_is_a_rigid_block() {
    let mut case = common::uniform_tube(L, 4.0, 0.2, BeamTheory::EulerBernoulli);
    case.shell.elastic_modulus_pa *= 1e8;
    let (_, m) = common::tube_ei_m(&case);
    let (k_l, k_r) = (2.0e9, 4.0e11);
    let (m_f, j_f) = (3.0e6, 8.0e8);
    case.base = Some(BaseSprings {
        lateral_n_per_m: Some(k_l),
        rotational_nm_per_rad: Some(k_r),
    });
    case.base_inertia = BaseInertia {
        mass_kg: m_f,
        rotary_inertia_kg_m2: j_f,
    };
    let f = common::frequencies(&case, 2, Some(200));
    let m11 = m_f + m * L;
    let m12 = m * L * L / 2.0;
    let m22 = j_f + m * L.powi(3) / 3.0;
    // det(K - w2 M) = (k_l - w2 m11)(k_r - w2 m22) - w2^2 m12^2 = a w2^2 + b w2 + c
    let a = m11 * m22 - m12 * m12;
    let b = -(k_l * m22 + k_r * m11);
    let c = k_l * k_r;
    let disc = (b * b - 4.0 * a * c).sqrt();
    let w2 = [(-b - disc) / (2.0 * a), (-b + disc) / (2.0 * a)];
    for k in 0..2 {
        let exact = w2[k].sqrt() / (2.0 * std::f64::consts::PI);
        assert!(
            (f[k] - exact).abs() / exact < 1e-6,
            "mode {}: {} vs {exact}",
            k + 1,
            f[k]
        );
    }
}
