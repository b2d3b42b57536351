//! Validation of the `[wind]` section: reference speed, profile, air properties.
//!
//! Units and sources as in the parent module.

use super::*;

pub(super) fn check_wind(c: &mut Checker, w: &RawWind) -> Option<Wind> {
    let before = c.issues.len();
    let v_path = "wind.reference_speed_m_s";
    if c.positive(v_path, w.reference_speed_m_s) && w.reference_speed_m_s > 100.0 {
        c.fail(
            v_path,
            w.reference_speed_m_s,
            "over 100 m/s: is it in km/h? give m/s",
        );
    }
    let z_ref = w.reference_height_m.unwrap_or(DEFAULT_REFERENCE_HEIGHT_M);
    c.positive("wind.reference_height_m", z_ref);
    let profile = match w.profile.unwrap_or(RawProfile::Power) {
        RawProfile::Power => {
            for (key, v) in [("roughness_m", w.roughness_m), ("z_min_m", w.z_min_m)] {
                if let Some(v) = v {
                    c.fail(
                        format!("wind.{key}"),
                        v,
                        "applies to profile = \"log\" only; remove it or set profile = \"log\"",
                    );
                }
            }
            let exponent = w.exponent.unwrap_or(DEFAULT_EXPONENT);
            c.open("wind.exponent", exponent, 0.0, 1.0);
            Profile::Power { exponent }
        }
        RawProfile::Log => {
            if let Some(v) = w.exponent {
                c.fail(
                    "wind.exponent",
                    v,
                    "applies to profile = \"power\" only; remove it or set profile = \"power\"",
                );
            }
            let roughness_m = match w.roughness_m {
                Some(z0) => {
                    if c.positive("wind.roughness_m", z0) && z0 > 2.0 {
                        c.fail("wind.roughness_m", z0, "must be at most 2 m");
                    }
                    z0
                }
                None => {
                    c.key(
                        "wind.roughness_m",
                        "missing; profile = \"log\" needs the roughness length z0 (EN 1991-1-4 \
                         Table 4.1, e.g. 0.05 m for terrain category II)",
                    );
                    f64::NAN
                }
            };
            let z_min_m = match w.z_min_m {
                Some(z) => {
                    c.positive("wind.z_min_m", z);
                    z
                }
                None => default_z_min_m(roughness_m),
            };
            Profile::Log {
                roughness_m,
                z_min_m,
            }
        }
    };
    let air_density_kg_m3 = w.air_density_kg_m3.unwrap_or(DEFAULT_AIR_DENSITY_KG_M3);
    c.positive("wind.air_density_kg_m3", air_density_kg_m3);
    let kinematic_viscosity_m2_s = w
        .kinematic_viscosity_m2_s
        .unwrap_or(DEFAULT_KINEMATIC_VISCOSITY_M2_S);
    c.positive("wind.kinematic_viscosity_m2_s", kinematic_viscosity_m2_s);
    // EN 1991-1-4 4.2(2)P Note 4, expression (4.2): K and n are positive constants of the
    // extreme-value distribution (K = 0.2, n = 0.5 recommended).
    let c_prob_k = w.c_prob_k.unwrap_or(crate::wind::probability::C_PROB_K);
    c.positive("wind.c_prob_k", c_prob_k);
    let c_prob_n = w.c_prob_n.unwrap_or(crate::wind::probability::C_PROB_N);
    c.positive("wind.c_prob_n", c_prob_n);
    (c.issues.len() == before).then_some(Wind {
        reference_speed_m_s: w.reference_speed_m_s,
        reference_height_m: z_ref,
        profile,
        air_density_kg_m3,
        kinematic_viscosity_m2_s,
        c_prob_k,
        c_prob_n,
    })
}

/// The EN 1991-1-4 site-wind keys of `[wind]` (terrain category and basic speed), checked
/// here; combined with the shell roughness and `[along_wind]` in `along_wind.rs`.
pub(super) struct EnWindKeys {
    pub terrain: TerrainCategory,
    pub basic_speed_m_s: f64,
    pub orography_factor: f64,
    pub c_dir: f64,
    pub c_season: f64,
}

/// `None` when `[wind]` gives no `terrain_category` (then none of the EN keys may appear) or
/// when a key fails.
pub(super) fn check_en_wind(c: &mut Checker, w: &RawWind) -> Option<EnWindKeys> {
    let before = c.issues.len();
    let Some(raw_terrain) = w.terrain_category else {
        for (key, v) in [
            ("basic_speed_m_s", w.basic_speed_m_s),
            ("orography_factor", w.orography_factor),
            ("c_dir", w.c_dir),
            ("c_season", w.c_season),
        ] {
            if let Some(v) = v {
                c.fail(
                    format!("wind.{key}"),
                    v,
                    "belongs to the EN site wind of the along-wind action: give \
                     wind.terrain_category too (\"0\", \"I\", \"II\", \"III\" or \"IV\")",
                );
            }
        }
        return None;
    };
    let terrain = match raw_terrain {
        RawTerrain::Zero => TerrainCategory::Zero,
        RawTerrain::I => TerrainCategory::I,
        RawTerrain::II => TerrainCategory::II,
        RawTerrain::III => TerrainCategory::III,
        RawTerrain::IV => TerrainCategory::IV,
    };
    let v_path = "wind.basic_speed_m_s";
    let basic_speed_m_s = match w.basic_speed_m_s {
        Some(v) => {
            if c.positive(v_path, v) && v > 100.0 {
                c.fail(v_path, v, "over 100 m/s: is it in km/h? give m/s");
            }
            v
        }
        None => {
            c.key(
                v_path,
                "missing; wind.terrain_category needs the basic wind speed v_b in m/s \
                 (EN 1991-1-4 4.2, from the National Annex wind map)",
            );
            f64::NAN
        }
    };
    let orography_factor = w.orography_factor.unwrap_or(1.0);
    if c.positive("wind.orography_factor", orography_factor) && orography_factor > 3.0 {
        c.fail(
            "wind.orography_factor",
            orography_factor,
            "must be at most 3 (EN 1991-1-4 Annex A.3 gives c_o of about 1 to 1.6)",
        );
    }
    let mut factor = |key: &str, v: Option<f64>| -> f64 {
        let v = v.unwrap_or(1.0);
        let path = format!("wind.{key}");
        if c.positive(&path, v) && v > 1.0 {
            c.fail(
                path,
                v,
                "must be at most 1 (EN 1991-1-4 4.2; recommended value 1)",
            );
        }
        v
    };
    let c_dir = factor("c_dir", w.c_dir);
    let c_season = factor("c_season", w.c_season);
    (c.issues.len() == before).then_some(EnWindKeys {
        terrain,
        basic_speed_m_s,
        orography_factor,
        c_dir,
        c_season,
    })
}
