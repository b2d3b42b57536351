//! Validation of `[base]`: foundation springs (GN m/rad, MN/m in the file) and the
//! foundation's mass and rotary inertia about the base (kg, kg m2), which move with the
//! springs. A mass or inertia on a rigid base is kept in the case (so the reader can warn
//! that it is ignored) but never enters the model.

use crate::case::BaseInertia;
use crate::input::raw::RawBase;

use super::*;

/// The springs (`None` = fixed base) and the foundation inertia.
pub(super) fn check_base(
    c: &mut Checker,
    raw: Option<&RawBase>,
) -> (Option<BaseSprings>, BaseInertia) {
    let Some(b) = raw else {
        return (None, BaseInertia::default());
    };
    let rot = c.optional_positive(
        "base.rotational_stiffness_gnm_per_rad",
        b.rotational_stiffness_gnm_per_rad,
    );
    let lat = c.optional_positive(
        "base.lateral_stiffness_mn_per_m",
        b.lateral_stiffness_mn_per_m,
    );
    let mut inertia = BaseInertia::default();
    if let Some(m) = b.mass_kg {
        if c.non_negative("base.mass_kg", m) {
            inertia.mass_kg = m;
        }
    }
    if let Some(j) = b.rotary_inertia_kg_m2 {
        if c.non_negative("base.rotary_inertia_kg_m2", j) {
            inertia.rotary_inertia_kg_m2 = j;
        }
    }
    let springs = (rot.is_some() || lat.is_some()).then(|| BaseSprings {
        rotational_nm_per_rad: rot.map(|v| v * 1e9),
        lateral_n_per_m: lat.map(|v| v * 1e6),
    });
    (springs, inertia)
}

#[cfg(test)]
mod tests {
    use std::path::Path;

    use crate::input::parse_case;

    const CASE: &str = r#"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
stations = [
  { z_m = 0.0,   outer_diameter_m = 12.0, wall_m = 0.40 },
  { z_m = 100.0, outer_diameter_m = 8.0,  wall_m = 0.20 },
]
[[point_mass]]
z_m = 100.0
mass_kg = 20000.0
rotary_inertia_kg_m2 = 1.0e5
[base]
rotational_stiffness_gnm_per_rad = 900.0
lateral_stiffness_mn_per_m = 6000.0
mass_kg = 2.0e7
rotary_inertia_kg_m2 = 5.0e9
"#;

    use crate::input::validate::case_errors as errors;

    #[test]
    fn foundation_and_point_inertia_are_read() {
        let case = parse_case(CASE, Path::new("."), "t.toml").unwrap();
        assert_eq!(case.base_inertia.mass_kg, 2.0e7);
        assert_eq!(case.base_inertia.rotary_inertia_kg_m2, 5.0e9);
        assert_eq!(case.point_masses[0].rotary_inertia_kg_m2, 1.0e5);
    }

    #[test]
    fn negative_inertias_are_refused() {
        let e = errors(&CASE.replacen("mass_kg = 2.0e7", "mass_kg = -1.0", 1));
        assert_eq!(e, ["base.mass_kg = -1: must be >= 0"]);
        let e = errors(&CASE.replacen(
            "rotary_inertia_kg_m2 = 5.0e9",
            "rotary_inertia_kg_m2 = -5.0",
            1,
        ));
        assert_eq!(e, ["base.rotary_inertia_kg_m2 = -5: must be >= 0"]);
        let e = errors(&CASE.replacen(
            "rotary_inertia_kg_m2 = 1.0e5",
            "rotary_inertia_kg_m2 = -1.0",
            1,
        ));
        assert_eq!(e, ["point_mass[0].rotary_inertia_kg_m2 = -1: must be >= 0"]);
    }
}
