//! Validation of the along-wind inputs: the EN site wind of `[wind]` (checked in `wind.rs`),
//! `shell.surface_roughness_mm` and `[along_wind]`.
//!
//! Units: mm in the file for the roughness, m inside. Default roughness: smooth concrete,
//! EN 1991-1-4 Table 7.13 (one public calculator's source), `along::force_coefficient`.

use super::wind::check_en_wind;
use super::*;
use crate::along::force_coefficient::SMOOTH_CONCRETE_ROUGHNESS_M;

/// Largest force coefficient accepted from the user (a straked or very rough shell is about
/// 1.2-1.4; common practice).
const MAX_FORCE_COEFFICIENT: f64 = 3.0;
/// Largest equivalent roughness accepted, mm (Table 7.13 stops at a few mm; common practice).
const MAX_ROUGHNESS_MM: f64 = 100.0;

/// `None` when no along-wind action is asked for (or an input fails; the issue is recorded).
pub(super) fn check_along_wind(c: &mut Checker, raw: &RawCase) -> Option<AlongWindSpec> {
    let before = c.issues.len();
    let en = raw.wind.as_ref().and_then(|w| check_en_wind(c, w));
    let asked = raw
        .wind
        .as_ref()
        .is_some_and(|w| w.terrain_category.is_some());
    let roughness_mm = raw.shell.surface_roughness_mm;
    let force = raw.along_wind.as_ref().and_then(|a| a.force_coefficient);
    if !asked {
        let hint = "applies to the along-wind action only: give [wind] terrain_category and \
                    basic_speed_m_s, or remove it";
        if let Some(k) = roughness_mm {
            c.fail("shell.surface_roughness_mm", k, hint);
        }
        if let Some(f) = force {
            c.fail("along_wind.force_coefficient", f, hint);
        }
        if raw.along_wind.is_some() && force.is_none() {
            c.key("along_wind", hint);
        }
        return None;
    }
    let roughness_m = match roughness_mm {
        Some(k) => {
            let path = "shell.surface_roughness_mm";
            if c.positive(path, k) && k > MAX_ROUGHNESS_MM {
                c.fail(
                    path,
                    k,
                    format!("must be at most {MAX_ROUGHNESS_MM} mm (EN 1991-1-4 Table 7.13)"),
                );
            }
            k * 1e-3
        }
        None => SMOOTH_CONCRETE_ROUGHNESS_M,
    };
    if let Some(f) = force {
        let path = "along_wind.force_coefficient";
        if c.positive(path, f) && f > MAX_FORCE_COEFFICIENT {
            c.fail(path, f, format!("must be at most {MAX_FORCE_COEFFICIENT}"));
        }
    }
    let en = en?;
    (c.issues.len() == before).then_some(AlongWindSpec {
        terrain: en.terrain,
        basic_speed_m_s: en.basic_speed_m_s,
        c_dir: en.c_dir,
        c_season: en.c_season,
        orography_factor: en.orography_factor,
        surface_roughness_m: roughness_m,
        force_coefficient: force,
    })
}

#[cfg(test)]
mod tests {
    use std::path::Path;

    use crate::case::{Case, TerrainCategory};
    use crate::input::{parse_case, InputError};

    const BASE: &str = r#"
title = "Invented test stack"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
stations = [
  { z_m = 0.0,   outer_diameter_m = 12.0, wall_m = 0.40 },
  { z_m = 100.0, outer_diameter_m = 8.0,  wall_m = 0.20 },
]
[wind]
reference_speed_m_s = 25.0
terrain_category = "II"
basic_speed_m_s = 26.0
"#;

    fn run(text: &str) -> Result<Case, Vec<String>> {
        match parse_case(text, Path::new("."), "t.toml") {
            Ok(c) => Ok(c),
            Err(InputError::Invalid { issues, .. }) => {
                Err(issues.iter().map(|i| i.to_string()).collect())
            }
            Err(other) => Err(vec![other.to_string()]),
        }
    }

    fn errors(text: &str) -> Vec<String> {
        run(text).expect_err("the case must be refused")
    }

    #[test]
    fn defaults() {
        let spec = run(BASE).unwrap().along_wind.unwrap();
        assert_eq!(spec.terrain, TerrainCategory::II);
        assert_eq!(spec.orography_factor, 1.0);
        assert_eq!((spec.c_dir, spec.c_season), (1.0, 1.0));
        assert_eq!(spec.surface_roughness_m, 0.2e-3);
        assert_eq!(spec.force_coefficient, None);
        // No terrain category: no along-wind action.
        let plain = BASE.replace("terrain_category = \"II\"\nbasic_speed_m_s = 26.0\n", "");
        assert!(run(&plain).unwrap().along_wind.is_none());
    }

    #[test]
    fn unknown_terrain_category() {
        let e = errors(&BASE.replace("\"II\"", "\"V\""));
        assert!(
            e.iter().any(|m| m.starts_with("wind.terrain_category")),
            "{e:?}"
        );
    }

    #[test]
    fn negative_orography_factor() {
        let e = errors(&BASE.replace(
            "basic_speed_m_s = 26.0",
            "basic_speed_m_s = 26.0\norography_factor = -1.0",
        ));
        assert!(
            e.contains(&"wind.orography_factor = -1: must be > 0".to_string()),
            "{e:?}"
        );
    }

    #[test]
    fn zero_roughness() {
        let e = errors(&BASE.replace(
            "density_kg_m3 = 2500.0",
            "density_kg_m3 = 2500.0\nsurface_roughness_mm = 0.0",
        ));
        assert!(
            e.contains(&"shell.surface_roughness_mm = 0: must be > 0".to_string()),
            "{e:?}"
        );
    }

    #[test]
    fn en_keys_need_the_terrain_category() {
        let text = BASE.replace("terrain_category = \"II\"\n", "");
        let e = errors(&text);
        assert!(
            e.iter()
                .any(|m| m.starts_with("wind.basic_speed_m_s = 26: belongs to")),
            "{e:?}"
        );
        let e = errors(&format!(
            "{}[along_wind]\nforce_coefficient = 0.7\n",
            text.replace("basic_speed_m_s = 26.0\n", "")
        ));
        assert!(
            e.iter()
                .any(|m| m.starts_with("along_wind.force_coefficient = 0.7: applies")),
            "{e:?}"
        );
    }

    #[test]
    fn missing_basic_speed_and_bad_factors() {
        let e = errors(&BASE.replace("basic_speed_m_s = 26.0", "c_dir = 1.2"));
        assert!(
            e.iter()
                .any(|m| m.starts_with("wind.basic_speed_m_s: missing")),
            "{e:?}"
        );
        assert!(
            e.iter()
                .any(|m| m.starts_with("wind.c_dir = 1.2: must be at most 1")),
            "{e:?}"
        );
    }
}
