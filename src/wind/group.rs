//! In-line groups of identical stacks (not coupled): how a neighbour changes the Strouhal
//! number and the lateral force coefficient.
//!
//! Reference: EN 1991-1-4 Annex E, in-line arrangement rule (clause E.1.5.2.6 or E.1.5.2.7,
//! expression (E.10)/(E.11); all from memory, unverified):
//! c_lat = 1.5 c_lat(single) for 1 <= a/b <= 10; c_lat = c_lat(single) for a/b >= 15; linear
//! in between. St = 0.1 + 0.085 log10(a/b) for 1 <= a/b <= 9; St = 0.18 for a/b > 9.
//! a = centre-to-centre spacing, b = diameter. The rule covers a/b >= 1 only; below that the
//! shells would overlap and we clamp to 1 with a warning.

use serde::Serialize;

use crate::case::Group;

/// Which group rule applied and what it changed.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct GroupRule {
    /// Spacing / diameter a/b at the shedding section.
    pub spacing_ratio: f64,
    /// Strouhal number the rule gives.
    pub strouhal: f64,
    /// Factor on the single-stack c_lat.
    pub c_lat_factor: f64,
    /// Human-readable description of the rule that applied.
    pub rule: String,
    /// Set when a/b lies outside the range the rule covers.
    pub warning: Option<String>,
}

/// St for an in-line group at a/b (EN 1991-1-4 (E.10)-(E.11), from memory).
pub fn in_line_strouhal(spacing_ratio: f64) -> f64 {
    let r = spacing_ratio.max(1.0);
    if r <= 9.0 {
        0.1 + 0.085 * r.log10()
    } else {
        0.18
    }
}

/// Factor on c_lat(single) for an in-line group at a/b (EN 1991-1-4, from memory).
pub fn in_line_c_lat_factor(spacing_ratio: f64) -> f64 {
    let r = spacing_ratio.max(1.0);
    if r <= 10.0 {
        1.5
    } else if r >= 15.0 {
        1.0
    } else {
        1.5 - 0.5 * (r - 10.0) / 5.0
    }
}

/// The in-line rule for `group` around a section of diameter `diameter_m`.
pub fn in_line_rule(group: &Group, diameter_m: f64) -> GroupRule {
    let r = group.spacing_m / diameter_m;
    let warning = (r < 1.0).then(|| {
        format!(
            "group spacing {:.2} m is less than the diameter {:.2} m (a/b = {:.3}): the \
             EN 1991-1-4 in-line rule covers a/b >= 1 only; a/b = 1 used",
            group.spacing_m, diameter_m, r
        )
    });
    let st_part = if r <= 9.0 {
        "St = 0.1 + 0.085 log10(a/b)"
    } else {
        "St = 0.18"
    };
    let c_part = if r <= 10.0 {
        "c_lat = 1.5 c_lat(single)"
    } else if r < 15.0 {
        "c_lat between 1.5 and 1.0 c_lat(single), linear in a/b"
    } else {
        "c_lat = c_lat(single)"
    };
    GroupRule {
        spacing_ratio: r,
        strouhal: in_line_strouhal(r),
        c_lat_factor: in_line_c_lat_factor(r),
        rule: format!(
            "EN 1991-1-4 Annex E in-line group (from memory), {} stacks, a/b = {:.2}: {}; {}",
            group.count, r, st_part, c_part
        ),
        warning,
    }
}
