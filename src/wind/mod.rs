//! Vortex-shedding checks of every stage and mode: shedding section, critical speed, E.1.2
//! screening, across-wind amplitude by EN 1991-1-4 Annex E approaches 1 and 2 and by
//! GB 50009-2012 App. H.1, inertia loads, shear, bending moment and stress along the height,
//! fatigue cycles, in-line group effects, and the verdict against the user's criteria.
//!
//! Units: SI throughout (m, m/s, Hz, kg/m, N, N m, Pa); units are in every field name.
//! References: see each submodule; many clause numbers and constants are from memory and are
//! flagged where they are used. The method chosen in the case governs the verdict; the other
//! methods are reported alongside for comparison (GB 50009 is a comparison row unless chosen).
//!
//! The lock-in band ([`shedding::lock_in_band`]) is our own addition, not a code method.

pub mod approach1;
pub mod approach2;
pub mod constants;
mod error;
pub mod fatigue;
pub mod gb50009;
mod gb_check;
pub mod group;
pub mod loads;
pub mod probability;
pub mod profile;
mod results;
pub mod shape;
pub mod shedding;
pub mod stage_climate;
pub mod verdict;

use crate::case::{Case, Stage, VortexMethod, Wind};
use crate::modal::{Mode, StageModel, StageModes};

pub use error::{site_wind, WindError};
pub use group::GroupRule;
pub use loads::LoadPoint;
pub use results::*;
pub use shape::ModeShape;
pub use shedding::HeightBand;
pub use stage_climate::StageClimate;
pub use verdict::Verdict;

/// Checks every stage (in the order given). Needs the case's `[wind]`.
pub fn check_all(case: &Case, stages: &[StageModes]) -> Result<VortexResults, WindError> {
    let wind = *site_wind(case, "check")?;
    let stages = stages
        .iter()
        .map(|s| check_stage(case, s))
        .collect::<Result<Vec<StageVortex>, WindError>>()?;
    let warnings = gb_check::taper_warning(&stages).into_iter().collect();
    Ok(VortexResults {
        wind,
        stages,
        warnings,
    })
}

/// Checks the first `case.vortex.modes` modes of one stage. Needs the case's `[wind]`.
pub fn check_stage(case: &Case, stage_modes: &StageModes) -> Result<StageVortex, WindError> {
    let mut warnings = Vec::new();
    let wanted = case.vortex.modes;
    if stage_modes.modes.len() < wanted {
        warnings.push(format!(
            "stage `{}`: {} modes requested, {} available",
            stage_modes.stage.name,
            wanted,
            stage_modes.modes.len()
        ));
    }
    let modes = stage_modes
        .modes
        .iter()
        .take(wanted)
        .map(|m| check_mode(case, &stage_modes.stage, &stage_modes.model, m))
        .collect::<Result<Vec<ModeVortex>, WindError>>()?;
    Ok(StageVortex {
        stage: stage_modes.stage.name.clone(),
        climate: StageClimate::of(case, &stage_modes.stage, site_wind(case, "check")?),
        modes,
        warnings,
    })
}

/// Critical damping ratio for GB 50009: the case's `vortex.damping_ratio`, or 0.05, the
/// first-mode value GB 50009-2012 H.1.1 gives for concrete structures (the tool is for RC
/// shells; H.1.1 lets higher modes take the first mode's value).
pub fn damping_ratio(case: &Case) -> f64 {
    case.vortex
        .damping_ratio
        .unwrap_or(gb50009::DAMPING_RATIO_CONCRETE)
}

/// Checks one mode of one stage with the stage's own wind, duration and damping
/// ([`StageClimate`]). Needs the case's `[wind]`.
pub fn check_mode(
    case: &Case,
    stage: &Stage,
    model: &StageModel,
    mode: &Mode,
) -> Result<ModeVortex, WindError> {
    let climate = StageClimate::of(case, stage, site_wind(case, "check")?);
    let wind = &climate.wind;
    let vortex = &case.vortex;
    let mut warnings = Vec::new();
    let shape = ModeShape::from_mode(model, mode);
    let n = mode.frequency_hz;
    let h = model.height_m();
    let top = model.z_m.len() - 1;
    let ia = shape.largest_antinode();
    let phi_a = mode.displacement[ia];
    let tip_per_antinode = (mode.displacement[top] / phi_a).abs();
    let z_ref = model.z_m[ia];
    let b = model.outer_diameter_m[ia];

    let group = vortex.group.as_ref().map(|g| group::in_line_rule(g, b));
    if let Some(w) = group.as_ref().and_then(|g| g.warning.clone()) {
        warnings.push(w);
    }
    let strouhal = match (vortex.strouhal, &group) {
        (Some(st), Some(_)) => {
            warnings.push(format!(
                "user Strouhal number {st} overrides the group rule's St; the group c_lat factor \
                 still applies"
            ));
            st
        }
        (Some(st), None) => st,
        (None, Some(g)) => g.strouhal,
        (None, None) => shedding::STROUHAL_CIRCULAR_EN,
    };
    let c_lat_group_factor = group.as_ref().map_or(1.0, |g| g.c_lat_factor);

    let v_crit = shedding::critical_speed_m_s(b, n, strouhal);
    let v_m = profile::mean_speed_m_s(wind, z_ref);
    // Fatigue cycles count the site's climate, whatever the stage's design return period.
    let v_m_site = profile::mean_speed_m_s(&climate.site_wind, z_ref);
    let re = shedding::reynolds(b, v_crit, wind.kinematic_viscosity_m2_s);
    let m_e = if mode.equivalent_mass_kg_m.is_finite() && mode.equivalent_mass_kg_m > 0.0 {
        mode.equivalent_mass_kg_m
    } else {
        let m = shape::equivalent_mass_kg_m(model, &shape);
        warnings.push(format!(
            "mode {}: equivalent mass {} from the modal analysis is unusable; {m:.1} kg/m \
             recomputed from the shape",
            mode.number, mode.equivalent_mass_kg_m
        ));
        m
    };
    let sc = shedding::scruton(climate.log_decrement, m_e, wind.air_density_kg_m3, b);
    let screened = shedding::screened_out(v_crit, v_m);
    let segments = shedding::lock_in_band(model, n, strouhal, wind);

    // Load effects per metre of antinode amplitude: the EN approaches scale them.
    let unit_loads = loads::inertia_loads(model, &shape, n, 1.0 / phi_a);
    let unit_base = unit_loads[0].moment_nm;
    let unit_stress = loads::max_abs_stress_pa(&unit_loads);

    let (approach1, approach2) = if screened {
        (None, None)
    } else {
        let setup = approach1::Approach1Setup::new(
            shape,
            wind,
            z_ref,
            b,
            strouhal,
            sc,
            v_crit,
            re,
            c_lat_group_factor,
        );
        let s = setup.solve();
        if !s.amplitude.converged_by_iteration {
            warnings.push(format!(
                "mode {}: approach 1 fixed point found by bisection (plain iteration cycled)",
                mode.number
            ));
        }
        let y1 = s.amplitude.y_max_m;
        let a1 = Approach1Result {
            c_lat0: setup.c_lat0,
            c_lat_group_factor,
            c_lat: s.amplitude.c_lat,
            speed_ratio_lj: s.speed_ratio_lj,
            correlation_length_m: s.amplitude.correlation_length_m,
            correlation_centre_z_m: s.correlation_centre_z_m,
            k: setup.k,
            kw_uncapped: s.amplitude.kw_uncapped,
            kw: s.amplitude.kw,
            y_max_m: y1,
            tip_amplitude_m: y1 * tip_per_antinode,
            base_moment_nm: unit_base * y1,
            max_stress_pa: unit_stress * y1,
            fatigue_cycles: fatigue::load_cycles(
                climate.judged_years,
                n,
                fatigue::EPS0_APPROACH1,
                v_crit,
                v_m_site,
            ),
            iterations: s.amplitude.iterations,
        };
        let r2 = approach2::amplitude(&approach2::Approach2Params {
            diameter_m: b,
            strouhal,
            scruton: sc,
            equivalent_mass_kg_m: m_e,
            air_density_kg_m3: wind.air_density_kg_m3,
            height_m: h,
            reynolds: re,
        });
        let a2 = Approach2Result {
            c_c: r2.c_c,
            k_a: r2.k_a,
            a_l: r2.a_l,
            sigma_y_m: r2.sigma_y_m,
            peak_factor: r2.peak_factor,
            y_max_m: r2.y_max_m,
            tip_amplitude_m: r2.y_max_m * tip_per_antinode,
            base_moment_nm: unit_base * r2.y_max_m,
            max_stress_pa: unit_stress * r2.y_max_m,
            fatigue_cycles: fatigue::load_cycles(
                climate.judged_years,
                n,
                fatigue::EPS0_APPROACH2,
                v_crit,
                v_m_site,
            ),
        };
        (Some(a1), Some(a2))
    };

    let (gb, gb_loads) = gb_check::gb_check(case, wind, model, &shape, mode, &mut warnings);

    let comparison = vec![
        MethodSummary {
            method: VortexMethod::En1991E1,
            applies: approach1.is_some(),
            tip_amplitude_m: approach1.as_ref().map(|a| a.tip_amplitude_m),
            base_moment_nm: approach1.as_ref().map(|a| a.base_moment_nm),
            max_stress_pa: approach1.as_ref().map(|a| a.max_stress_pa),
            fatigue_cycles: approach1.as_ref().map(|a| a.fatigue_cycles),
        },
        MethodSummary {
            method: VortexMethod::En1991E2,
            applies: approach2.is_some(),
            tip_amplitude_m: approach2.as_ref().map(|a| a.tip_amplitude_m),
            base_moment_nm: approach2.as_ref().map(|a| a.base_moment_nm),
            max_stress_pa: approach2.as_ref().map(|a| a.max_stress_pa),
            fatigue_cycles: approach2.as_ref().map(|a| a.fatigue_cycles),
        },
        MethodSummary {
            method: VortexMethod::Gb50009H1,
            applies: gb.resonance || gb.subcritical_measures_required(),
            tip_amplitude_m: gb.tip_amplitude_m,
            base_moment_nm: gb.base_moment_nm,
            max_stress_pa: gb.max_stress_pa,
            fatigue_cycles: None,
        },
    ];

    let governing = vortex.method;
    let (loads, gov_screened, extra) = match governing {
        VortexMethod::En1991E1 | VortexMethod::En1991E2 => {
            let y = match governing {
                VortexMethod::En1991E1 => approach1.as_ref().map(|a| a.y_max_m),
                _ => approach2.as_ref().map(|a| a.y_max_m),
            };
            let loads = y.map_or_else(Vec::new, |y| scale_loads(&unit_loads, y));
            (loads, screened, Vec::new())
        }
        VortexMethod::Gb50009H1 => {
            // 8.5.3(1): a subcritical lock-in asks for anti-vibration measures unless
            // v_cr >= 15 m/s.
            let extra = if gb.subcritical_measures_required() {
                vec![format!(
                    "GB 50009 8.5.3 subcritical lock-in (v_H {:.2} m/s > v_cr {:.2} m/s, \
                     v_cr < {} m/s): anti-vibration measures required",
                    gb.top_speed_m_s,
                    gb.critical_speed_m_s,
                    gb50009::SUBCRITICAL_MIN_CRITICAL_SPEED_M_S
                )]
            } else {
                Vec::new()
            };
            let applies = gb.resonance || gb.subcritical_measures_required();
            (gb_loads, !applies, extra)
        }
    };
    let summary = comparison
        .iter()
        .find(|m| m.method == governing)
        .expect("all three methods are summarised");
    let verdict = verdict::judge(
        &case.criteria,
        gov_screened,
        verdict::Response {
            tip_amplitude_m: summary.tip_amplitude_m,
            max_stress_pa: summary.max_stress_pa,
        },
        model.outer_diameter_m[top],
        &extra,
    );

    Ok(ModeVortex {
        stage: stage.name.clone(),
        mode: mode.number,
        frequency_hz: n,
        reference_height_m: z_ref,
        diameter_m: b,
        strouhal,
        critical_speed_m_s: v_crit,
        mean_speed_m_s: v_m,
        speed_ratio: v_crit / v_m,
        reynolds: re,
        log_decrement: climate.log_decrement,
        scruton: sc,
        equivalent_mass_kg_m: m_e,
        screened_out: screened,
        lock_in_band: shedding::envelope(&segments),
        lock_in_segments: segments,
        group,
        approach1,
        approach2,
        gb50009: gb,
        comparison,
        governing,
        loads,
        verdict,
        warnings,
    })
}

fn scale_loads(unit: &[LoadPoint], y: f64) -> Vec<LoadPoint> {
    unit.iter()
        .map(|l| LoadPoint {
            z_m: l.z_m,
            line_force_n_m: l.line_force_n_m * y,
            point_force_n: l.point_force_n * y,
            shear_n: l.shear_n * y,
            moment_nm: l.moment_nm * y,
            stress_pa: l.stress_pa * y,
        })
        .collect()
}
