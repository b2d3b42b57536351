//! Validation of the along-wind inputs: the EN site wind of `[wind]` (checked in `wind.rs`),
//! `shell.surface_roughness_mm` and `[along_wind]`.
//!
//! Units: mm in the file for the roughness, m inside. Default roughness: smooth concrete,
//! EN 1991-1-4 Table 7.13 (from memory), `along::force_coefficient`.

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
