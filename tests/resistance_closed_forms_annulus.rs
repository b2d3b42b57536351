//! Moment resistance of RC annuli against closed forms and independent integrations.
//!
//! - Thin ring of steel alone (concrete strength ~0) at N = 0: elastic-perfectly-plastic ring
//!   at the ultimate curvature, M = (2 A_s r / pi) [f_yd sin p + E_s e_max ((pi/2 - p)/2 -
//!   sin(2p)/4)], cos p = eps_yd / e_max (integration of sigma r cos over the ring, by hand;
//!   tends to the plastic (2/pi) A_s f_yd r, references.md). Tolerance 1e-7 relative.
//! - Full annulus at pure compression: N_Rd = A_c f_cd + A_s sigma_s(eps_c2) (EN 1992-1-1
//!   6.1 (5), uniform strain eps_c2). Tolerance 1e-12.
//! - Annulus with a removed sector: scipy reference (tests/reference/rc_annulus_mrd.py,
//!   quad + brentq in polar coordinates, no shared code), tolerance 1e-6; and a brute-force
//!   polar midpoint integration written below, tolerance 2e-4 (its grid error).

use std::f64::consts::PI;

use stackwake::resistance::{BarRing, Concrete, RcAnnulus, RcSection, Sector, Steel};

fn chimney(sectors: Vec<Sector>) -> RcSection {
    RcSection {
        annulus: RcAnnulus::with_ratios(10.0, 0.4, 0.003, 0.002, 0.05, 0.05, sectors),
        concrete: Concrete::eurocode(40e6, 1.5, 1.0),
        steel: Steel::eurocode(500e6, 200e9, 1.15),
    }
}

#[test]
fn steel_ring_alone_matches_the_elastic_plastic_closed_form() {
    let (ro, r, a_s) = (4.2, 4.0, 0.06);
    let steel = Steel::eurocode(500e6, 200e9, 1.15);
    let mut concrete = Concrete::eurocode(30e6, 1.5, 1.0);
    concrete.design_strength_pa = 1e-9;
    let sec = RcSection {
        annulus: RcAnnulus {
            outer_radius_m: ro,
            inner_radius_m: 3.8,
            rings: vec![BarRing {
                radius_m: r,
                area_m2: a_s,
            }],
            sectors: vec![],
        },
        concrete,
        steel,
    };
    let u = sec.moment_resistance(0.0, 0.0).unwrap();
    // Symmetric ring at N = 0: neutral axis through the centre, eps_cu2 at the outer face.
    let e_max = concrete.strain_cu2 * r / ro;
    let p = (steel.yield_strain() / e_max).acos();
    let exact = 2.0 * a_s * r / PI
        * (steel.design_yield_pa * p.sin()
            + steel.elastic_modulus_pa * e_max * ((0.5 * PI - p) / 2.0 - (2.0 * p).sin() / 4.0));
    assert!(
        (u.moment_nm - exact).abs() / exact < 1e-7,
        "{} {exact}",
        u.moment_nm
    );
    assert!(exact < 2.0 / PI * a_s * steel.design_yield_pa * r);
}

#[test]
fn full_annulus_pure_compression() {
    let sec = chimney(vec![]);
    let a = &sec.annulus;
    let a_s: f64 = a.rings.iter().map(|r| r.area_m2).sum();
    let exact = a.gross_area_m2() * sec.concrete.design_strength_pa
        + a_s * sec.steel.stress_pa(sec.concrete.strain_c2);
    assert!((sec.axial_compression_resistance_n(0.0) - exact).abs() / exact < 1e-12);
    // Just below N_Rd the moment resistance is nearly zero; above it there is none.
    let m = sec
        .moment_resistance(0.0, 0.999_999 * exact)
        .unwrap()
        .moment_nm;
    let m0 = sec.moment_resistance(0.0, 0.5 * exact).unwrap().moment_nm;
    assert!(m >= 0.0 && m < 1e-3 * m0, "{m} {m0}");
    assert!(sec.moment_resistance(0.0, 1.000_001 * exact).is_err());
}

#[test]
fn annulus_with_and_without_a_sector_matches_scipy() {
    // tests/reference/rc_annulus_mrd.py, N = 60 MN.
    let n = 60e6;
    let full = chimney(vec![]).moment_resistance(0.0, n).unwrap().moment_nm;
    assert!((full - 377_336_892.835_894).abs() / full < 1e-6, "{full}");
    let sector = |az: f64| {
        vec![Sector {
            half_angle_rad: 0.35,
            azimuth_rad: az,
        }]
    };
    let comp = chimney(sector(0.0))
        .moment_resistance(0.0, n)
        .unwrap()
        .moment_nm;
    assert!((comp - 309_856_112.699_582).abs() / comp < 1e-6, "{comp}");
    let tens = chimney(sector(PI))
        .moment_resistance(0.0, n)
        .unwrap()
        .moment_nm;
    assert!((tens - 353_049_302.896_408).abs() / tens < 1e-6, "{tens}");
}

/// Brute-force (N, M) for neutral-axis depth x: midpoint rule over a polar grid.
fn brute(sec: &RcSection, phi: f64, x: f64, y_top: f64) -> (f64, f64) {
    let a = &sec.annulus;
    let (nt, nr) = (6000, 40);
    let kap = sec.concrete.strain_cu2 / x;
    let yn = y_top - x;
    let removed = |t: f64| {
        a.sectors.iter().any(|s| {
            let d = (t - s.azimuth_rad + PI).rem_euclid(2.0 * PI) - PI;
            d.abs() < s.half_angle_rad
        })
    };
    let (mut n, mut m) = (0.0, 0.0);
    let dt = 2.0 * PI / nt as f64;
    let dr = (a.outer_radius_m - a.inner_radius_m) / nr as f64;
    for i in 0..nt {
        let t = (i as f64 + 0.5) * dt;
        if removed(t) {
            continue;
        }
        let c = (t - phi).cos();
        for j in 0..nr {
            let r = a.inner_radius_m + (j as f64 + 0.5) * dr;
            let y = r * c;
            let s = sec.concrete.stress_pa(kap * (y - yn));
            n += s * r * dr * dt;
            m += s * r * dr * dt * y;
        }
        for ring in &a.rings {
            let y = ring.radius_m * c;
            let s = sec.steel.stress_pa(kap * (y - yn)) * ring.area_m2 / (2.0 * PI) * dt;
            n += s;
            m += s * y;
        }
    }
    (n, m)
}

#[test]
fn asymmetric_sector_matches_a_brute_force_polar_integration() {
    let sec = chimney(vec![Sector {
        half_angle_rad: 0.4,
        azimuth_rad: 0.5,
    }]);
    let phi = 0.2; // the sector sits across the compressed side, off-centre
    let n_ed = 50e6;
    let u = sec.moment_resistance(phi, n_ed).unwrap();
    // Highest remaining fibre: the sector covers azimuths 0.1..0.9, so the edge at 0.1 rad
    // (0.1 rad from phi) is the top: y_top = R_o cos(0.1).
    let y_top = 5.0 * (0.1f64).cos();
    let (mut lo, mut hi) = (0.05, 9.0);
    for _ in 0..60 {
        let mid = 0.5 * (lo + hi);
        if brute(&sec, phi, mid, y_top).0 < n_ed {
            lo = mid;
        } else {
            hi = mid;
        }
    }
    let (_, m) = brute(&sec, phi, 0.5 * (lo + hi), y_top);
    assert!((u.moment_nm - m).abs() / m < 2e-4, "{} {m}", u.moment_nm);
}
