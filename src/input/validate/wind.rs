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
