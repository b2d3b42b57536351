//! Along-wind base shear and moment against closed-form integrals on a uniform tube.
//!
//! Model: uniform tube h = 120 m, b = 8 m, constant c_f (user value) and c_s c_d, EN 1991-1-4
//! log profile (4.3)-(4.8) of terrain category II, v_b = 26 m/s, c_o = 1.
//! q_p(z) = 0.5 rho v_b^2 k_r^2 (L^2 + 7 L), L = ln(max(z, z_min) / z0) (c_o = 1), so
//! V(0) = c b [q_p(z_min) z_min + int_zmin^h q_p dz],
//! M(0) = c b [q_p(z_min) z_min^2 / 2 + int_zmin^h q_p z dz], with
//! int L dz = z (L - 1), int L^2 dz = z (L^2 - 2 L + 2),
//! int z L dz = z^2/2 (L - 1/2), int z L^2 dz = z^2/2 (L^2 - L + 1/2) (calculus).
//! Tolerance 1e-6 relative: 4-point Gauss on 2-4 m elements of a smooth log integrand.

use stackwake::along::line_load::{along_wind_loads, ForceCoefficient};
use stackwake::along::terrain::EnProfile;
use stackwake::case::TerrainCategory;
use stackwake::modal::StageModel;

fn tube(h: f64, b: f64, t: f64, n: usize) -> StageModel {
    // Node at 3 m so the z_min = 2 m kink falls inside an element (the split is tested).
    let z: Vec<f64> = (0..=n).map(|i| h * i as f64 / n as f64).collect();
    let k = z.len();
    // The annulus's own I and W (stresses use the model's section modulus).
    let d_in = b - 2.0 * t;
    let i_m4 = std::f64::consts::PI / 64.0 * (b.powi(4) - d_in.powi(4));
    StageModel {
        z_m: z,
        outer_diameter_m: vec![b; k],
        wall_m: vec![t; k],
        shell_mass_kg_m: vec![1.0; k],
        lining_mass_kg_m: vec![0.0; k],
        point_masses: Vec::new(),
        second_moment_m4: vec![i_m4; k],
        element_shell_mass_kg_m: vec![[1.0, 1.0]; k - 1],
        area_m2: vec![1.0; k],
        section_modulus_m3: vec![i_m4 / (0.5 * b); k],
        sections_below: Vec::new(),
    }
}

#[test]
fn base_shear_and_moment_match_closed_form() {
    let (h, b, cf, cscd) = (120.0, 8.0, 0.8, 0.93);
    let profile = EnProfile {
        terrain: TerrainCategory::II,
        basic_speed_m_s: 26.0,
        orography_factor: 1.0,
        air_density_kg_m3: 1.25,
    };
    let model = tube(h, b, 0.3, 40);
    let pts = along_wind_loads(&model, &profile, cscd, &ForceCoefficient::Given(cf));
    let (z0, zmin, kr) = (0.05f64, 2.0f64, 0.19f64);
    let a = 0.5 * 1.25 * 26.0f64.powi(2) * kr * kr;
    let lz = |z: f64| (z / z0).ln();
    let qmin = a * (lz(zmin).powi(2) + 7.0 * lz(zmin));
    let iv = |z: f64| z * (lz(z).powi(2) - 2.0 * lz(z) + 2.0) + 7.0 * z * (lz(z) - 1.0);
    let izv =
        |z: f64| z * z / 2.0 * (lz(z).powi(2) - lz(z) + 0.5) + 7.0 * z * z / 2.0 * (lz(z) - 0.5);
    let c = cscd * cf * b;
    let v0 = c * (qmin * zmin + a * (iv(h) - iv(zmin)));
    let m0 = c * (qmin * zmin * zmin / 2.0 + a * (izv(h) - izv(zmin)));
    let rel = |x: f64, y: f64| ((x - y) / y).abs();
    assert!(rel(pts[0].shear_n, v0) < 1e-6, "{} vs {v0}", pts[0].shear_n);
    assert!(
        rel(pts[0].moment_nm, m0) < 1e-6,
        "{} vs {m0}",
        pts[0].moment_nm
    );
    assert_eq!(pts.last().unwrap().moment_nm, 0.0);
    // Stress on the gross section: M / W, W = pi/32 (D^4 - d^4) / D.
    let d = b - 0.6;
    let w = std::f64::consts::PI / 32.0 * (b.powi(4) - d.powi(4)) / b;
    assert!(rel(pts[0].stress_pa, m0 / w) < 1e-6);
}
