//! M_Rd(N) of a solid circular RC section: a published worked example and an independent
//! scipy reference.
//!
//! Published example: Z. Smolcic and D. Grandic, "Interaction diagrams for reinforced
//! concrete circular cross-section" (Gradevinar, Croatian civil engineering journal). Its
//! numbers as transcribed in a public verification script of the open-source xc package
//! (the article itself was not readable here): diameter 500 mm, C30/37, B500, bars at 50 mm
//! from the face, N_Ed = 1570 kN, M_Ed = 392 kN m needs A_s = 41.55 cm2; that script sets
//! alpha_cc = 0.85. With alpha_cc = 0.85 our M_Rd is 363.7 kN m, 7.2 % below 392 (the xc
//! script itself reports a capacity factor of 1.079 for that point); with alpha_cc = 1.0
//! (the EN recommended value) it is 396.3 kN m, 1.1 % above. Since the article's alpha_cc and
//! bar position could not be read, the 1 % agreement asked for is NOT established; the test
//! below pins the two readings with their stated gaps so a change in the numerics shows up.
//!
//! Reference: tests/reference/rc_annulus_mrd.py (scipy quad + brentq, shares no code with
//! stackwake) gives 363745.72 N m for the alpha_cc = 0.85 case; tolerance 1e-6 relative (the
//! library integrates to ~1e-8, the script to ~1e-11).

use stackwake::resistance::{BarRing, Concrete, RcAnnulus, RcSection, Steel};

fn column(alpha_cc: f64) -> RcSection {
    RcSection {
        annulus: RcAnnulus {
            outer_radius_m: 0.25,
            inner_radius_m: 0.0,
            rings: vec![BarRing {
                radius_m: 0.20,
                area_m2: 41.55e-4,
            }],
            sectors: vec![],
        },
        concrete: Concrete::eurocode(30e6, 1.5, alpha_cc),
        steel: Steel::eurocode(500e6, 200e9, 1.15),
    }
}

#[test]
fn solid_column_matches_the_scipy_reference() {
    let u = column(0.85).moment_resistance(0.0, 1570e3).unwrap();
    let reference = 363_745.724_063; // tests/reference/rc_annulus_mrd.py
    assert!(
        (u.moment_nm - reference).abs() / reference < 1e-6,
        "{}",
        u.moment_nm
    );
    // neutral-axis depth from the same script: 0.271848 m
    assert!((u.neutral_axis_depth_m - 0.271_848_46).abs() < 1e-6);
}

#[test]
fn published_example_brackets_by_alpha_cc() {
    // Smolcic & Grandic example (see module doc): 392 kN m lies between our alpha_cc = 0.85
    // and alpha_cc = 1.0 results, within -7.3 % .. +1.2 %.
    let low = column(0.85)
        .moment_resistance(0.0, 1570e3)
        .unwrap()
        .moment_nm;
    let high = column(1.0)
        .moment_resistance(0.0, 1570e3)
        .unwrap()
        .moment_nm;
    let (rl, rh) = ((low - 392e3) / 392e3, (high - 392e3) / 392e3);
    assert!((-0.073..-0.071).contains(&rl), "{rl}");
    assert!((0.010..0.012).contains(&rh), "{rh}");
}
