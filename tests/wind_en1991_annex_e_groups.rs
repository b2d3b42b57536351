//! In-line groups of stacks, EN 1991-1-4 Annex E (E.1.5.2.6/7, expressions (E.10)-(E.11), from
//! memory; see data/reference/README.md): c_lat = 1.5 c_lat(single) for 1 <= a/b <= 10,
//! single for a/b >= 15, linear between; St = 0.1 + 0.085 log10(a/b) for 1 <= a/b <= 9, 0.18
//! beyond.

mod wind_common;
use wind_common as common;

use stackwake::case::{Criteria, VortexMethod};
use stackwake::wind::{self, group};

#[test]
fn group_rule_values_at_1_5_9_12_15() {
    // Expected values by hand from the rule above (log10 5 = 0.69897, log10 9 = 0.95424).
    let cases = [
        (1.0, 0.1, 1.5),
        (5.0, 0.159_412_450, 1.5),
        (9.0, 0.181_110_613, 1.5),
        (12.0, 0.18, 1.3),
        (15.0, 0.18, 1.0),
    ];
    for (r, st, f) in cases {
        let rule = group::in_line_rule(&common::group(3, 4.0 * r), 4.0);
        assert!((rule.spacing_ratio - r).abs() < 1e-12);
        assert!(
            (rule.strouhal - st).abs() < 1e-9,
            "a/b {r}: St {}",
            rule.strouhal
        );
        assert!((rule.c_lat_factor - f).abs() < 1e-12, "a/b {r}");
        assert!(rule.warning.is_none());
    }
    assert_eq!(group::in_line_c_lat_factor(20.0), 1.0);
    assert_eq!(group::in_line_strouhal(9.5), 0.18);
}

#[test]
fn spacing_below_one_diameter_warns_and_clamps() {
    let rule = group::in_line_rule(&common::group(2, 2.0), 4.0);
    assert!(rule.warning.as_deref().unwrap().contains("a/b = 0.500"));
    assert_eq!(rule.strouhal, 0.1);
    assert_eq!(rule.c_lat_factor, 1.5);
}

#[test]
fn group_changes_st_and_c_lat_in_the_check() {
    // a/b = 5 on the data/reference/README.md worked tube: St 0.1594, c_lat 1.5 x 0.2.
    let model = common::uniform_tube(80.0, 4.0, 0.3, 12000.0, 40);
    let mode = common::parabola_mode(&model, 1, 0.5, 12000.0);
    let mut case = common::case(
        common::uniform_wind(30.0),
        VortexMethod::En1991E1,
        Criteria::default(),
    );
    case.vortex.group = Some(common::group(3, 20.0));
    let r = wind::check_mode(
        &case,
        &stackwake::case::Stage::in_service("lined", true),
        &model,
        &mode,
    )
    .unwrap();
    assert!((r.strouhal - 0.159_412_450).abs() < 1e-9);
    assert!((r.critical_speed_m_s - 2.0 / r.strouhal).abs() < 1e-12);
    let a1 = r.approach1.unwrap();
    assert_eq!(a1.c_lat_group_factor, 1.5);
    assert!(r
        .group
        .unwrap()
        .rule
        .contains("St = 0.1 + 0.085 log10(a/b)"));
    // c_lat,0 at the new Re times 1.5 (Table E.3 factor 1 at this low speed ratio)
    assert!((a1.c_lat - 1.5 * a1.c_lat0).abs() < 1e-12);
}
