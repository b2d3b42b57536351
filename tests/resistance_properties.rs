//! Invariants of M_Rd(N) (common practice: a section never gets stronger by losing material
//! or lever arm): M_Rd does not rise when an opening widens, when the outer cover grows or
//! when a steel ratio falls. (Inner cover is excluded on purpose: more inner cover moves the
//! inner bars outward, to a longer lever arm, and can raise M_Rd; proptest found such a case.) Seeded random sections of chimney proportions; M_Rd is the smaller over the
//! checked bending directions. A 1e-7 relative slack absorbs the integration tolerance.

use proptest::prelude::*;
use stackwake::resistance::{Concrete, RcAnnulus, RcSection, Sector, Steel};

#[allow(clippy::too_many_arguments)]
fn mrd(
    d: f64,
    t: f64,
    rho_o: f64,
    rho_i: f64,
    cover: f64,
    beta: f64,
    fck: f64,
    n_frac: f64,
) -> f64 {
    mrd2(d, t, rho_o, rho_i, cover, 0.05, beta, fck, n_frac)
}

#[allow(clippy::too_many_arguments)]
fn mrd2(
    d: f64,
    t: f64,
    rho_o: f64,
    rho_i: f64,
    outer_cover: f64,
    inner_cover: f64,
    beta: f64,
    fck: f64,
    n_frac: f64,
) -> f64 {
    let sectors = if beta > 0.0 {
        vec![Sector {
            half_angle_rad: beta,
            azimuth_rad: 0.7,
        }]
    } else {
        vec![]
    };
    let sec = RcSection {
        annulus: RcAnnulus::with_ratios(d, t, rho_o, rho_i, outer_cover, inner_cover, sectors),
        concrete: Concrete::eurocode(fck * 1e6, 1.5, 1.0),
        steel: Steel::eurocode(500e6, 200e9, 1.15),
    };
    // Axial force as a fraction of the unperforated gross concrete capacity, fixed across the
    // compared pair (so it is the same N_Ed).
    let full = std::f64::consts::PI * (d * d - (d - 2.0 * t).powi(2)) / 4.0;
    let n = n_frac * full * sec.concrete.design_strength_pa;
    sec.min_moment_resistance(n)
        .map(|u| u.moment_nm)
        .unwrap_or(0.0)
}

fn le(a: f64, b: f64) -> bool {
    a <= b + 1e-7 * b.abs().max(1.0)
}

proptest! {
    #![proptest_config(ProptestConfig { cases: 48, ..ProptestConfig::default() })]

    #[test]
    fn wider_opening_never_raises_mrd(
        d in 6.0f64..20.0, t in 0.2f64..0.8, rho in 0.001f64..0.01,
        b1 in 0.05f64..0.6, db in 0.0f64..0.5, fck in 20.0f64..80.0, nf in 0.02f64..0.3,
    ) {
        let m1 = mrd(d, t, rho, rho * 0.6, 0.05, b1, fck, nf);
        let m2 = mrd(d, t, rho, rho * 0.6, 0.05, (b1 + db).min(1.2), fck, nf);
        prop_assert!(le(m2, m1), "{m2} > {m1}");
        let m0 = mrd(d, t, rho, rho * 0.6, 0.05, 0.0, fck, nf);
        prop_assert!(le(m1, m0), "opening {m1} > full {m0}");
    }

    #[test]
    fn more_outer_cover_never_raises_mrd(
        d in 6.0f64..20.0, t in 0.25f64..0.8, rho in 0.001f64..0.01,
        c1 in 0.03f64..0.08, dc in 0.0f64..0.04, fck in 20.0f64..80.0, nf in 0.02f64..0.3,
    ) {
        let m1 = mrd2(d, t, rho, rho, c1, 0.05, 0.0, fck, nf);
        let m2 = mrd2(d, t, rho, rho, c1 + dc, 0.05, 0.0, fck, nf);
        prop_assert!(le(m2, m1), "{m2} > {m1}");
    }

    #[test]
    fn less_steel_never_raises_mrd(
        d in 6.0f64..20.0, t in 0.2f64..0.8, rho in 0.001f64..0.02,
        f in 0.0f64..1.0, fck in 20.0f64..80.0, nf in 0.02f64..0.3, beta in 0.0f64..0.5,
    ) {
        let m1 = mrd(d, t, rho, 0.002, 0.05, beta, fck, nf);
        let m2 = mrd(d, t, rho * f, 0.002, 0.05, beta, fck, nf);
        prop_assert!(le(m2, m1), "{m2} > {m1}");
    }
}
