//! An HTML fragment (a `<section>`) of a model plan for the design note. Pure: every piece of
//! user text is escaped; numbers are formatted here so the note needs no knowledge of the
//! plan's internals.

use super::note::html_escape as escape;
use crate::similitude::factors::factor_text;
use crate::similitude::ScalePlan;

fn table(head: &[&str], rows: &[Vec<String>]) -> String {
    let mut s = String::from("<table>\n<thead><tr>");
    for h in head {
        s.push_str(&format!("<th>{}</th>", escape(h)));
    }
    s.push_str("</tr></thead>\n<tbody>\n");
    for r in rows {
        s.push_str("<tr>");
        for c in r {
            s.push_str(&format!("<td>{}</td>", escape(c)));
        }
        s.push_str("</tr>\n");
    }
    s.push_str("</tbody>\n</table>\n");
    s
}

fn yes_no(v: Option<bool>) -> String {
    match v {
        Some(true) => "yes".into(),
        Some(false) => "NO".into(),
        None => "-".into(),
    }
}

/// The plan as an HTML `<section>` (no page wrapper, no styles).
pub fn render_html(plan: &ScalePlan) -> String {
    let d = &plan.design;
    let k = &d.factors;
    // No heading of its own: the note numbers and titles the section it is placed in
    // (a heading here printed "Aeroelastic model plan" twice).
    let mut s = String::from("<section class=\"scale-plan\">\n");
    s.push_str(&format!(
        "<p>Prototype: {}. Length scale k_l = {} ({}). Model material: E = {:.3} GPa, \
         density {:.0} kg/m3, Poisson's ratio {:.2}. Scales are prototype / model; the model is \
         tested in the same air.</p>\n",
        escape(&plan.prototype_title),
        factor_text(k.length),
        escape(d.length_scale_source.label()),
        d.spec.elastic_modulus_pa / 1e9,
        d.spec.density_kg_m3,
        d.spec.poisson_ratio
    ));
    s.push_str("<h3>Scale factors</h3>\n");
    let rows: Vec<Vec<String>> = plan
        .factor_rows
        .iter()
        .map(|r| {
            vec![
                r.quantity.to_string(),
                factor_text(r.prototype_over_model),
                r.condition.to_string(),
            ]
        })
        .collect();
    s.push_str(&table(
        &["quantity", "prototype / model", "similitude condition"],
        &rows,
    ));
    s.push_str(&format!(
        "<p>The model must reproduce the structural log decrement {:.4} of the prototype.</p>\n",
        plan.model_log_decrement
    ));
    if let Some(b) = &d.blockage {
        s.push_str(&format!(
            "<p>Tunnel {:.2} m x {:.2} m: model frontal area {:.4} m2, blockage {:.2} % \
             (limit {:.1} %), model height {:.3} m (limit {:.3} m).</p>\n",
            b.tunnel_width_m,
            b.tunnel_height_m,
            b.model_frontal_area_m2,
            100.0 * b.blockage_ratio,
            100.0 * b.max_blockage,
            b.model_height_m,
            b.max_model_height_m
        ));
    }
    s.push_str("<h3>Model stations</h3>\n");
    let rows: Vec<Vec<String>> = d
        .model
        .stations
        .iter()
        .map(|m| {
            vec![
                format!("{:.4}", m.z_m),
                format!("{:.2}", m.outer_diameter_m * 1e3),
                format!("{:.3}", m.wall_m * 1e3),
                if m.below_min_wall {
                    "below minimum".into()
                } else {
                    "ok".into()
                },
            ]
        })
        .collect();
    s.push_str(&table(
        &["z_m", "outer_diameter_mm", "wall_mm", "wall"],
        &rows,
    ));
    if !d.model.lining_mass_per_area_kg_m2.is_empty() || !d.model.point_masses_kg.is_empty() {
        let mut rows: Vec<Vec<String>> = d
            .model
            .lining_mass_per_area_kg_m2
            .iter()
            .map(|q| vec!["lining".into(), format!("{q:.4} kg/m2")])
            .collect();
        rows.extend(
            d.model
                .point_masses_kg
                .iter()
                .map(|(l, kg)| vec![l.clone(), format!("{:.2} g", kg * 1e3)]),
        );
        s.push_str(&table(&["model mass", "value"], &rows));
    }
    s.push_str("<h3>Tunnel speeds and Reynolds numbers</h3>\n");
    let mut rows: Vec<Vec<String>> = plan
        .speeds
        .iter()
        .map(|r| {
            vec![
                r.stage.clone(),
                r.mode.to_string(),
                format!("{:.2}", r.prototype_critical_speed_m_s),
                format!("{:.3}", r.model_speed_m_s),
                yes_no(r.in_tunnel_range),
                format!(
                    "{:.3e} ({})",
                    r.prototype_reynolds,
                    r.prototype_regime.label()
                ),
                format!("{:.3e} ({})", r.model_reynolds, r.model_regime.label()),
            ]
        })
        .collect();
    if let Some(ds) = &plan.design_speed {
        rows.push(vec![
            format!("design wind at {:.1} m", ds.height_m),
            "-".into(),
            format!("{:.2}", ds.prototype_speed_m_s),
            format!("{:.3}", ds.model_speed_m_s),
            yes_no(ds.in_tunnel_range),
            format!(
                "{:.3e} ({})",
                ds.prototype_reynolds,
                ds.prototype_regime.label()
            ),
            format!("{:.3e} ({})", ds.model_reynolds, ds.model_regime.label()),
        ]);
    }
    s.push_str(&table(
        &[
            "stage",
            "mode",
            "prototype speed (m/s)",
            "tunnel speed (m/s)",
            "in tunnel range",
            "prototype Re",
            "model Re",
        ],
        &rows,
    ));
    s.push_str("<ul>\n");
    for c in &plan.reynolds_cautions {
        s.push_str(&format!("<li>{}</li>\n", escape(c)));
    }
    s.push_str("</ul>\n<h3>Check of the model by computation</h3>\n");
    let rows: Vec<Vec<String>> = plan.consistency.iter().map(|r| r.cells()).collect();
    s.push_str(&table(
        &[
            "stage",
            "mode",
            "prototype f (Hz)",
            "model f (Hz)",
            "f_prototype / (f_model k_f) - 1",
        ],
        &rows,
    ));
    s.push_str(&format!(
        "<p>Largest deviation {:.3} %. The similitude is exact for thin walls in bending; thick \
         walls (the model wall is distorted by k_rho = {:.3}) and shear deformation show here.</p>\n",
        100.0 * plan.worst_deviation,
        k.density
    ));
    if !plan.warnings.is_empty() {
        s.push_str("<h3>Warnings</h3>\n<ul>\n");
        for w in &plan.warnings {
            s.push_str(&format!("<li>{}</li>\n", escape(w)));
        }
        s.push_str("</ul>\n");
    }
    s.push_str("</section>\n");
    s
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn escapes_markup() {
        assert_eq!(
            escape("<b>\"a\" & 'b'</b>"),
            "&lt;b&gt;&quot;a&quot; &amp; &#39;b&#39;&lt;/b&gt;"
        );
    }
}
