//! Validation of the `[model]` section: mesh and beam theory.
//!
//! Units and sources as in the parent module.

use super::*;

pub(super) fn check_model(c: &mut Checker, m: &RawModel) -> Option<ModelSpec> {
    let before = c.issues.len();
    let (lo, hi) = crate::similitude::LENGTH_SCALE_RANGE;
    let length_scale = m.length_scale.filter(|&k| {
        c.finite("model.length_scale", k)
            && ((lo..=hi).contains(&k)
                || c.fail(
                    "model.length_scale",
                    k,
                    "must be between 1 and 10000 (prototype / model): a model larger than the \
                     prototype, or under 1/10000 of it, cannot be built and tested in a \
                     boundary-layer tunnel (common practice)",
                ))
    });
    c.positive("model.elastic_modulus_gpa", m.elastic_modulus_gpa);
    c.positive("model.density_kg_m3", m.density_kg_m3);
    let poisson_ratio = m.poisson_ratio.unwrap_or(DEFAULT_MODEL_POISSON_RATIO);
    c.poisson("model.poisson_ratio", poisson_ratio);
    let min_wall_m = c.optional_positive("model.min_wall_m", m.min_wall_m);
    let tunnel_width_m = c.optional_positive("model.tunnel_width_m", m.tunnel_width_m);
    let tunnel_height_m = c.optional_positive("model.tunnel_height_m", m.tunnel_height_m);
    let max_blockage = m.max_blockage.unwrap_or(DEFAULT_MAX_BLOCKAGE);
    if c.positive("model.max_blockage", max_blockage) && max_blockage > 0.5 {
        c.fail("model.max_blockage", max_blockage, "must be at most 0.5");
    }
    let v_min = c.optional_positive("model.tunnel_speed_min_m_s", m.tunnel_speed_min_m_s);
    let v_max = c.optional_positive("model.tunnel_speed_max_m_s", m.tunnel_speed_max_m_s);
    if let (Some(lo), Some(hi)) = (v_min, v_max) {
        if lo >= hi {
            c.fail(
                "model.tunnel_speed_max_m_s",
                hi,
                format!("must be above tunnel_speed_min_m_s ({} m/s)", num(lo)),
            );
        }
    }
    (c.issues.len() == before).then_some(ModelSpec {
        length_scale,
        elastic_modulus_pa: m.elastic_modulus_gpa * 1e9,
        density_kg_m3: m.density_kg_m3,
        poisson_ratio,
        min_wall_m,
        tunnel_width_m,
        tunnel_height_m,
        max_blockage,
        tunnel_speed_min_m_s: v_min,
        tunnel_speed_max_m_s: v_max,
    })
}
