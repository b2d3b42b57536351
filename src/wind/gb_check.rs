//! The GB 50009-2012 comparison of one mode (8.5.3 and Appendix H.1, see [`gb50009`] for the
//! formulas and what was checked against the published text), and the case-level warning on
//! the outer-face taper.
//!
//! Units: SI (m, m/s, Pa, N/m, N m).

use super::{damping_ratio, gb50009, loads, profile, shape, shedding};
use super::{Gb50009Result, LoadPoint, ModeShape, StageVortex};
use crate::case::{Case, Wind};
use crate::modal::{Mode, StageModel};

/// Outer-face taper of a stage, (D_base - D_top) / (2 H): the inclination of the outer face
/// that GB 50009-2012 8.5.3 limits to 0.02 for taking D at 2/3 of the height.
pub fn outer_face_taper(model: &StageModel) -> f64 {
    let top = model.z_m.len() - 1;
    (model.outer_diameter_m[0] - model.outer_diameter_m[top]).abs() / (2.0 * model.height_m())
}

/// One warning for the whole case when a GB 50009 result is shown (some mode has a resonance
/// load or a subcritical lock-in) on a stage whose outer-face taper exceeds 0.02, naming the
/// steepest such stage. GB 50009-2012 8.5.3 (explanation of D in (8.5.3-1)) allows the
/// diameter at 2/3 H only up to a taper of 0.02 and gives no rule beyond it; using 2/3 H
/// there anyway is our own practice, so the warning says so.
pub fn taper_warning(stages: &[StageVortex]) -> Option<String> {
    let (stage, taper) = stages
        .iter()
        .flat_map(|s| s.modes.iter().map(move |m| (s, m)))
        .filter(|(_, m)| m.gb50009.shows_a_result())
        .map(|(s, m)| (s.stage.as_str(), m.gb50009.outer_face_taper))
        .filter(|&(_, t)| t > gb50009::MAX_TAPER_FOR_TWO_THIRDS_RULE)
        .max_by(|a, b| a.1.total_cmp(&b.1))?;
    Some(format!(
        "GB 50009 comparison: outer-face taper (D_base - D_top) / (2 H) = {taper:.3} (stage \
         \"{stage}\") > {}: GB 50009-2012 8.5.3 takes D at 2/3 H only up to that taper and gives \
         no rule beyond it; the comparison uses D at 2/3 H anyway (our own practice)",
        gb50009::MAX_TAPER_FOR_TWO_THIRDS_RULE
    ))
}

/// GB 50009 App. H.1 for one mode (see [`gb50009`]).
pub(super) fn gb_check(
    case: &Case,
    wind: &Wind,
    model: &StageModel,
    shape: &ModeShape,
    mode: &Mode,
    warnings: &mut Vec<String>,
) -> (Gb50009Result, Vec<LoadPoint>) {
    let h = model.height_m();
    let top = model.z_m.len() - 1;
    let strouhal = case.vortex.strouhal.unwrap_or(gb50009::STROUHAL_GB);
    let z_d = 2.0 * h / 3.0;
    let d = shape::diameter_at_m(model, z_d);
    let taper = outer_face_taper(model);
    let v_cr = shedding::critical_speed_m_s(d, mode.frequency_hz, strouhal);
    let re = gb50009::reynolds(v_cr, d);
    let regime = gb50009::regime(re);
    let v_h = profile::mean_speed_m_s(wind, h);
    let h1 = gb50009::lock_in_start_m(h, v_cr, |z| profile::mean_speed_m_s(wind, z));
    let resonance = regime == gb50009::Regime::Transcritical && h1.is_some();
    let subcritical_lock_in = regime == gb50009::Regime::Subcritical && v_h > v_cr;
    // 8.5.3(1): measures, or keep v_cr >= 15 m/s.
    let subcritical_speed_rule_met =
        subcritical_lock_in.then_some(v_cr >= gb50009::SUBCRITICAL_MIN_CRITICAL_SPEED_M_S);
    let h1_eff = h1.unwrap_or(h);
    let lambda_table = gb50009::lambda_table(mode.number, h1_eff / h);
    let lambda_shape = gb50009::lambda_from_shape(shape, h1_eff);
    let lambda_used = lambda_table.or(lambda_shape);
    let zeta = damping_ratio(case);
    let mut result = Gb50009Result {
        strouhal,
        diameter_height_m: z_d,
        diameter_m: d,
        critical_speed_m_s: v_cr,
        reynolds: re,
        regime,
        top_speed_m_s: v_h,
        resonance,
        subcritical_lock_in,
        subcritical_speed_rule_met,
        outer_face_taper: taper,
        lock_in_start_m: h1,
        lambda_table,
        lambda_shape,
        lambda_used,
        damping_ratio: zeta,
        damping_ratio_is_default: case.vortex.damping_ratio.is_none(),
        tip_amplitude_m: None,
        base_moment_nm: None,
        max_stress_pa: None,
    };
    let (true, Some(lambda)) = (resonance, lambda_used) else {
        return (result, Vec::new());
    };
    // phi normalised to 1 at the top, as the code's mode coefficient.
    let phi_top = mode.displacement[top];
    if phi_top.abs() < 1e-6 {
        warnings.push(format!(
            "mode {}: the top does not move; GB 50009 load (top-normalised) not computed",
            mode.number
        ));
        return (result, Vec::new());
    }
    // Line load p = w_Lk(z) D(z) = scale * D(z) * Phi(z).
    let scale = gb50009::equivalent_pressure_pa(lambda, v_cr, 1.0 / phi_top, zeta);
    let line: Vec<f64> = (0..model.z_m.len())
        .map(|i| scale * model.outer_diameter_m[i] * mode.displacement[i])
        .collect();
    let loads = loads::effects(
        model,
        shape,
        scale,
        |e, t| shape::element_diameter_m(model, e, t),
        &[],
        &line,
    );
    // Modal response to that load: q = int p Phi / (omega^2 M*), tip = q |Phi_top|.
    let gen_force = shape.integrate(0.0, h, |e, t, _, p| {
        scale * shape::element_diameter_m(model, e, t) * p * p
    });
    let omega2 = (2.0 * std::f64::consts::PI * mode.frequency_hz).powi(2);
    let q = gen_force / (omega2 * shape::generalised_mass_kg(model, shape));
    result.tip_amplitude_m = Some((q * phi_top).abs());
    result.base_moment_nm = Some(loads[0].moment_nm.abs());
    result.max_stress_pa = Some(loads::max_abs_stress_pa(&loads));
    (result, loads)
}
