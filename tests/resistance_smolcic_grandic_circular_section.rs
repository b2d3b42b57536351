//! M_Rd(N) of a solid circular RC section: a published worked example, read second-hand,
//! and independent scipy references.
//!
//! Published example: Z. Smolcic and D. Grandic, "Interaction diagrams for reinforced
//! concrete circular cross-section", Gradevinar 64 (2012) 1 (Croatian civil engineering
//! journal). The article's own text could not be read (only its first page is stored in the
//! searchable copies); its example is known through a public verification script of the
//! open-source xc package: diameter 500 mm, C30/37, B500, bars at 50 mm from the face,
//! N_Ed = 1570 kN, M_Ed = 392 kN m needs A_s = 41.55 cm2 (that script sets alpha_cc = 0.85
//! and 21 bars of 16 mm, its own choices).
//!
//! What the numbers themselves say (our reading, not the article's text): with
//! f_cd = 30 / 1.5 = 20 MPa (alpha_cc = 1.0, the EN recommended value) and A_c = pi D^2 / 4,
//! nu_Ed = N / (A_c f_cd) = 0.3998, mu_Ed = M / (A_c D f_cd) = 0.1996, and
//! omega = 0.46 gives A_s = omega A_c f_cd / f_yd = 41.547 cm2, the published 41.55 cm2. So
//! the example is a design-chart reading at nu = 0.40, mu = 0.20 with omega read to two
//! digits, and alpha_cc = 1.0 (with 0.85: nu = 0.470, but mu = 0.2349 and omega = 0.5412,
//! not chart values).
//!
//! Our smeared-ring model at that point (tests/reference/rc_discrete_bars_smearing.py,
//! scipy, shares no code with stackwake): omega = 0.4503 (A_s = 40.673 cm2, 2.1 % less steel
//! than the chart reading); with the published 41.55 cm2, M_Rd = 396.28 kN m, 1.1 % above
//! 392. Smearing is not the cause: 21 discrete bars of 16 mm give M_Rd between -0.11 % and
//! +0.12 % of the smeared ring of the same area (worst / best bar orientation). The rest is
//! the chart's reading resolution (omega to 0.01 is +/-1.1 % of the steel), so this source
//! cannot establish agreement within 1 %: the 1 % asked for by issue 16 is NOT established by
//! a first-hand example (see data/reference/README.md for what was searched and rejected).
//! The tests below pin the exact numbers against scipy (1e-6) and the published gaps in
//! narrow bands, so a change in the numerics shows up.

use std::f64::consts::PI;

use stackwake::resistance::{BarRing, Concrete, RcAnnulus, RcSection, Steel};

const N_ED: f64 = 1570e3;
const M_ED: f64 = 392e3;
const A_S_PUBLISHED_M2: f64 = 41.55e-4;

fn column(alpha_cc: f64, steel_area_m2: f64) -> RcSection {
    RcSection {
        annulus: RcAnnulus {
            outer_radius_m: 0.25,
            inner_radius_m: 0.0,
            rings: vec![BarRing {
                radius_m: 0.20,
                area_m2: steel_area_m2,
            }],
            sectors: vec![],
        },
        concrete: Concrete::eurocode(30e6, 1.5, alpha_cc),
        steel: Steel::eurocode(500e6, 200e9, 1.15),
    }
}

fn mrd(alpha_cc: f64, steel_area_m2: f64) -> f64 {
    column(alpha_cc, steel_area_m2)
        .moment_resistance(0.0, N_ED)
        .unwrap()
        .moment_nm
}

#[test]
fn solid_column_matches_the_scipy_reference() {
    let u = column(0.85, A_S_PUBLISHED_M2)
        .moment_resistance(0.0, N_ED)
        .unwrap();
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
fn the_examples_numbers_are_a_chart_reading_with_alpha_cc_one() {
    // nu, mu, omega of the published numbers with our design strengths at alpha_cc = 1.0
    // (EN 1992-1-1 3.1.6 f_cd = alpha_cc f_ck / gamma_c, 3.2.7 f_yd = f_yk / gamma_s)
    // come out round (module doc); the bands are the rounding of the printed values
    // (four significant digits of 41.55).
    let sec = column(1.0, A_S_PUBLISHED_M2);
    let a_c = PI * 0.25 * 0.25;
    let f_cd = sec.concrete.design_strength_pa;
    let f_yd = sec.steel.design_yield_pa;
    let nu = N_ED / (a_c * f_cd);
    let mu = M_ED / (a_c * 0.5 * f_cd);
    let omega = A_S_PUBLISHED_M2 * f_yd / (a_c * f_cd);
    assert!((nu - 0.40).abs() < 5e-4, "{nu}");
    assert!((mu - 0.20).abs() < 5e-4, "{mu}");
    assert!((omega - 0.46).abs() < 5e-5, "{omega}");
    // At alpha_cc = 0.85: nu = 0.470 but mu = 0.2349 and omega = 0.5412, neither a
    // two-digit chart value.
    let f_cd_085 = column(0.85, A_S_PUBLISHED_M2).concrete.design_strength_pa;
    let off_grid = |x: f64| ((100.0 * x).round() / 100.0 - x).abs();
    assert!(off_grid(M_ED / (a_c * 0.5 * f_cd_085)) > 1e-3);
    assert!(off_grid(A_S_PUBLISHED_M2 * f_yd / (a_c * f_cd_085)) > 1e-3);
}

#[test]
fn exact_steel_for_the_published_point_matches_scipy() {
    // tests/reference/rc_discrete_bars_smearing.py: the smeared area giving
    // M_Rd(1570 kN) = 392 kN m at alpha_cc = 1.0 is 40.672824 cm2 (brentq, xtol 1e-12;
    // ring summed at 20000 points, < 1e-7). Tolerance 1e-6 on M (both integrate to ~1e-8).
    let m = mrd(1.0, 40.672_823_66e-4);
    assert!((m - M_ED).abs() / M_ED < 1e-6, "{m}");
    // 21 bars of 16 mm smeared (42.223 cm2), same script: 366989.039 / 399566.197 N m.
    let a21 = 21.0 * PI * 0.008 * 0.008;
    for (alpha_cc, reference) in [(0.85, 366_989.039), (1.0, 399_566.197)] {
        let m = mrd(alpha_cc, a21);
        assert!((m - reference).abs() / reference < 1e-6, "{alpha_cc}: {m}");
    }
}

#[test]
fn published_example_gaps_stay_as_recorded() {
    // Smolcic & Grandic example (module doc): with the published 41.55 cm2 our M_Rd is
    // +1.1 % above 392 kN m at alpha_cc = 1.0 (the value the example's numbers imply) and
    // -7.2 % at the xc script's 0.85 (in steel: the exact omega 0.4503 of
    // `exact_steel_for_the_published_point_matches_scipy` is 2.1 % below the chart reading
    // 0.46). Not a 1 % agreement: a record of the gap.
    let rh = (mrd(1.0, A_S_PUBLISHED_M2) - M_ED) / M_ED;
    let rl = (mrd(0.85, A_S_PUBLISHED_M2) - M_ED) / M_ED;
    assert!((0.010..0.012).contains(&rh), "{rh}");
    assert!((-0.073..-0.071).contains(&rl), "{rl}");
}
