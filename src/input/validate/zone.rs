//! Validation of the `[[shell.zone]]` tables: concrete zones with their own modulus,
//! density, Poisson's ratio or characteristic strength.
//!
//! Rules: limits inside the shell and in order, zones not overlapping (touching is fine), at
//! least one value per zone, each value under the same rule as its `[shell]` counterpart.
//! The characteristic strength f_ck is only stored (for the reinforced-concrete
//! resistance): 12-90 MPa, the 14 strength classes C12/15 to C90/105 of EN 1992-1-1
//! Table 3.1 (read in public summaries of the table, see data/reference/README.md). Units as in the parent module (GPa, MPa in the file; Pa inside).

use crate::case::ConcreteZone;
use crate::input::raw::RawZone;

use super::*;

/// f_ck range of EN 1992-1-1 Table 3.1, MPa (C12/15 to C90/105; data/reference/README.md).
pub const CHARACTERISTIC_STRENGTH_RANGE_MPA: (f64, f64) = (12.0, 90.0);

/// Every zone of `raw`, in file order; `None` entries are dropped (their issues recorded).
pub(super) fn check_zones(
    c: &mut Checker,
    raw: &[RawZone],
    height_m: Option<f64>,
) -> Vec<ConcreteZone> {
    let mut zones = Vec::new();
    let mut placed: Vec<(usize, f64, f64)> = Vec::new();
    for (i, z) in raw.iter().enumerate() {
        let p = format!("shell.zone[{i}]");
        let before = c.issues.len();
        c.height_range(&p, z.from_z_m, z.to_z_m, height_m);
        if z.elastic_modulus_gpa.is_none()
            && z.density_kg_m3.is_none()
            && z.poisson_ratio.is_none()
            && z.characteristic_strength_mpa.is_none()
        {
            c.key(
                &p,
                "a zone gives none of elastic_modulus_gpa, density_kg_m3, poisson_ratio, \
                 characteristic_strength_mpa; give at least one or remove the zone",
            );
        }
        if let Some(e) = z.elastic_modulus_gpa {
            let path = format!("{p}.elastic_modulus_gpa");
            if c.positive(&path, e) && !(1.0..=1000.0).contains(&e) {
                c.fail(
                    &path,
                    e,
                    "outside 1-1000 GPa: looks like the wrong unit; give E in GPa (e.g. 34.0)",
                );
            }
        }
        if let Some(rho) = z.density_kg_m3 {
            let path = format!("{p}.density_kg_m3");
            if c.positive(&path, rho) && !(500.0..=10000.0).contains(&rho) {
                c.fail(
                    &path,
                    rho,
                    "outside 500-10000 kg/m3: looks like the wrong unit; give kg/m3 (e.g. 2500.0)",
                );
            }
        }
        if let Some(nu) = z.poisson_ratio {
            c.poisson(&format!("{p}.poisson_ratio"), nu);
        }
        if let Some(f) = z.characteristic_strength_mpa {
            let path = format!("{p}.characteristic_strength_mpa");
            let (lo, hi) = CHARACTERISTIC_STRENGTH_RANGE_MPA;
            if c.positive(&path, f) && !(lo..=hi).contains(&f) {
                c.fail(
                    &path,
                    f,
                    format!(
                        "outside {lo}-{hi} MPa, the strength classes C12/15 to C90/105 of \
                         EN 1992-1-1 Table 3.1; give f_ck in MPa (e.g. 40.0)"
                    ),
                );
            }
        }
        if c.issues.len() != before {
            continue;
        }
        for &(j, from, to) in &placed {
            if z.from_z_m < to && from < z.to_z_m {
                c.fail(
                    format!("{p}.from_z_m"),
                    z.from_z_m,
                    format!(
                        "overlaps shell.zone[{j}] ({} to {} m); zones must not overlap",
                        num(from),
                        num(to)
                    ),
                );
            }
        }
        placed.push((i, z.from_z_m, z.to_z_m));
        zones.push(ConcreteZone {
            from_z_m: z.from_z_m,
            to_z_m: z.to_z_m,
            elastic_modulus_pa: z.elastic_modulus_gpa.map(|e| e * 1e9),
            density_kg_m3: z.density_kg_m3,
            poisson_ratio: z.poisson_ratio,
            characteristic_strength_pa: z.characteristic_strength_mpa.map(|f| f * 1e6),
        });
    }
    zones
}

#[cfg(test)]
mod tests {
    use std::path::Path;

    use crate::input::parse_case;

    /// A small valid case (invented) with two zones; tests change one line.
    const CASE: &str = r#"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
stations = [
  { z_m = 0.0,   outer_diameter_m = 12.0, wall_m = 0.40 },
  { z_m = 100.0, outer_diameter_m = 8.0,  wall_m = 0.20 },
]
[[shell.zone]]
from_z_m = 0.0
to_z_m = 40.0
elastic_modulus_gpa = 36.0
characteristic_strength_mpa = 50.0
[[shell.zone]]
from_z_m = 40.0
to_z_m = 100.0
density_kg_m3 = 2400.0
poisson_ratio = 0.18
"#;

    use crate::input::validate::case_errors as errors;

    #[test]
    fn zones_are_read_in_si_and_the_material_follows_them() {
        let case = parse_case(CASE, Path::new("."), "t.toml").unwrap();
        let z = &case.shell.zones;
        assert_eq!(z.len(), 2);
        assert_eq!(z[0].elastic_modulus_pa, Some(36e9));
        assert_eq!(z[0].characteristic_strength_pa, Some(50e6));
        let low = case.shell.material_at(20.0);
        assert_eq!((low.elastic_modulus_pa, low.density_kg_m3), (36e9, 2500.0));
        let high = case.shell.material_at(70.0);
        assert_eq!(
            (high.elastic_modulus_pa, high.density_kg_m3),
            (32e9, 2400.0)
        );
        assert_eq!(high.poisson_ratio, 0.18);
    }

    #[test]
    fn bad_zones_name_key_value_and_rule() {
        let e = errors(&CASE.replacen("to_z_m = 100.0", "to_z_m = 120.0", 1));
        assert_eq!(
            e,
            ["shell.zone[1].to_z_m = 120: outside the shell (0 to 100 m)"]
        );
        let e = errors(&CASE.replacen("from_z_m = 40.0", "from_z_m = 30.0", 1));
        assert_eq!(
            e,
            ["shell.zone[1].from_z_m = 30: overlaps shell.zone[0] (0 to 40 m); zones must not overlap"]
        );
        let e = errors(&CASE.replacen(
            "characteristic_strength_mpa = 50.0",
            "characteristic_strength_mpa = 5000.0",
            1,
        ));
        assert!(
            e[0].starts_with("shell.zone[0].characteristic_strength_mpa = 5000: outside 12-90 MPa"),
            "{e:?}"
        );
        let e = errors(&CASE.replacen(
            "elastic_modulus_gpa = 36.0",
            "elastic_modulus_gpa = 36000.0",
            1,
        ));
        assert!(
            e[0].starts_with("shell.zone[0].elastic_modulus_gpa = 36000: outside 1-1000 GPa"),
            "{e:?}"
        );
        let e = errors(&CASE.replacen("density_kg_m3 = 2400.0\npoisson_ratio = 0.18\n", "", 1));
        assert!(
            e[0].starts_with("shell.zone[1]: a zone gives none of"),
            "{e:?}"
        );
        let e = errors(&CASE.replacen("poisson_ratio = 0.18", "poisson_ratio = 0.6", 1));
        assert_eq!(
            e,
            ["shell.zone[1].poisson_ratio = 0.6: must be >= 0 and < 0.5"]
        );
    }
}
