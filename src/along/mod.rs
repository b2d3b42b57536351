//! Along-wind action on the shell by EN 1991-1-4 (chapters 4, 5, 6, 7.9 and Annex B
//! procedure 1) per stage, the along-wind action at each mode's critical speed, its
//! combination with the across-wind inertia moments, and which of the two governs.
//!
//! Which wind drives what: the along-wind design action uses the EN site wind
//! (`[wind] terrain_category`, `basic_speed_m_s`, ...); the vortex checks keep the
//! `[wind] reference_speed_m_s` profile. At the critical speed the EN profile is scaled to
//! v_crit at the mode's shedding height.
//!
//! Units: SI (m, m/s, Hz, kg/m, N/m, N, N m, Pa). References: see each submodule.
//! Screening tool: a licensed engineer checks the results against the National Annex.

pub mod critical;
pub mod force_coefficient;
pub mod line_load;
pub mod structural_factor;
pub mod terrain;

use serde::Serialize;
use thiserror::Error;

use crate::case::{AlongWindSpec, Case};
use crate::modal::StageModes;
use crate::wind::{StageVortex, VortexResults};

pub use critical::{Governs, ModeCombination};
pub use line_load::{AlongPoint, ForceCoefficient};
pub use structural_factor::StructuralFactor;
pub use terrain::EnProfile;

/// Why the along-wind action of a stage cannot be computed.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum AlongError {
    /// The stage has no mode (the structural factor needs the first one).
    #[error("stage `{stage}`: no mode available for the structural factor c_s c_d")]
    NoMode { stage: String },
    /// The case has no `[wind]` (air density and viscosity come from there).
    #[error("missing section [wind]: the along-wind action needs the site wind")]
    MissingWind,
}

/// Along-wind results of one stage.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct StageAlongWind {
    pub stage: String,
    pub height_m: f64,
    /// c_prob applied to v_b for this stage.
    pub c_prob: f64,
    /// v_b of this stage (c_prob c_dir c_season v_b,0), m/s.
    pub basic_speed_m_s: f64,
    /// z_s = 0.6 h (Figure 6.1), not below z_min, m.
    pub reference_height_m: f64,
    /// Outer diameter at z_s, m.
    pub width_m: f64,
    pub mean_speed_at_reference_m_s: f64,
    pub turbulence_intensity_at_reference: f64,
    pub length_scale_m: f64,
    /// Effective slenderness (Table 7.16) and psi_lambda (Figure 7.36); None with a user c_f.
    pub slenderness: Option<f64>,
    pub end_effect_factor: Option<f64>,
    /// c_f at z_s (used in delta_a).
    pub force_coefficient_at_reference: f64,
    pub force_coefficient_given: bool,
    pub frequency_hz: f64,
    pub equivalent_mass_kg_m: f64,
    pub log_decrement_structural: f64,
    pub log_decrement_aerodynamic: f64,
    pub log_decrement_total: f64,
    pub factor: StructuralFactor,
    /// (6.1) with R^2 = 0, used at the critical speeds.
    pub cscd_background_only: f64,
    pub peak_factor_background_only: f64,
    /// Design action along the height.
    pub points: Vec<AlongPoint>,
    /// (z_m, moment_nm) of the design action, for the resistance check.
    pub moment_nm: Vec<(f64, f64)>,
    /// Per mode that is not screened out: the combination at its critical speed.
    pub modes: Vec<ModeCombination>,
    pub governs: Governs,
    pub warnings: Vec<String>,
}

/// The EN profile of a stage with `c_prob` on v_b.
pub fn stage_profile(spec: &AlongWindSpec, air_density_kg_m3: f64, c_prob: f64) -> EnProfile {
    EnProfile {
        terrain: spec.terrain,
        basic_speed_m_s: c_prob * spec.c_dir * spec.c_season * spec.basic_speed_m_s,
        orography_factor: spec.orography_factor,
        air_density_kg_m3,
    }
}

/// Along-wind action of one stage; `c_prob` multiplies v_b (1.0 = the case's v_b).
pub fn stage_along_wind(
    case: &Case,
    spec: &AlongWindSpec,
    stage_modes: &StageModes,
    vortex: &StageVortex,
    c_prob: f64,
) -> Result<StageAlongWind, AlongError> {
    let wind = case.wind.as_ref().ok_or(AlongError::MissingWind)?;
    let model = &stage_modes.model;
    let first = stage_modes
        .modes
        .first()
        .ok_or_else(|| AlongError::NoMode {
            stage: stage_modes.stage.name.clone(),
        })?;
    let mut warnings = Vec::new();
    let profile = stage_profile(spec, wind.air_density_kg_m3, c_prob);
    let h = model.height_m();
    if h > terrain::Z_MAX_M {
        warnings.push(format!(
            "stage `{}`: height {h:.0} m above z_max = {} m of EN 1991-1-4 4.3.2; the \
             chapter 4 expressions are extrapolated",
            stage_modes.stage.name,
            terrain::Z_MAX_M
        ));
    }
    let z_s = (structural_factor::REFERENCE_HEIGHT_RATIO * h).max(spec.terrain.z_min_m());
    let b_s = line_load::diameter_at_height(model, z_s);
    let mean_b = line_load::mean_diameter_m(model);
    let cf = match spec.force_coefficient {
        Some(c) => ForceCoefficient::Given(c),
        None => ForceCoefficient::computed(
            spec.surface_roughness_m,
            wind.kinematic_viscosity_m2_s,
            h,
            mean_b,
        ),
    };
    let (slenderness, psi) = match cf {
        ForceCoefficient::Computed {
            end_effect_factor, ..
        } => (
            Some(force_coefficient::effective_slenderness(h, mean_b)),
            Some(end_effect_factor),
        ),
        ForceCoefficient::Given(_) => (None, None),
    };
    let cf_s = cf.at(&profile, z_s, b_s);
    let v_s = profile.mean_speed_m_s(z_s);
    let i_s = profile.turbulence_intensity(z_s);
    let l_s = profile.length_scale_m(z_s);
    let n1 = first.frequency_hz;
    let m_e = first.equivalent_mass_kg_m;
    // The stage's own structural log decrement (an unlined shell is less damped).
    let delta_s = vortex.climate.log_decrement;
    let delta_a = structural_factor::aerodynamic_log_decrement(
        cf_s,
        wind.air_density_kg_m3,
        b_s,
        v_s,
        n1,
        m_e,
    );
    let delta = delta_s + delta_a;
    let factor = structural_factor::structural_factor(&structural_factor::StructuralFactorInput {
        height_m: h,
        width_m: b_s,
        frequency_hz: n1,
        mean_speed_m_s: v_s,
        turbulence_intensity: i_s,
        length_scale_m: l_s,
        log_decrement: delta,
    });
    let grid = line_load::LoadGrid::new(model, &profile, &cf);
    let points = grid.points(factor.cscd);
    let moment_nm: Vec<(f64, f64)> = points.iter().map(|p| (p.z_m, p.moment_nm)).collect();

    let (cscd_bg, k_p_bg) = structural_factor::background_only(i_s, factor.background_factor);
    let modes: Vec<ModeCombination> = vortex
        .modes
        .iter()
        .filter(|m| !m.loads.is_empty() && m.loads.len() == model.z_m.len())
        .map(|m| {
            let speed_factor = m.critical_speed_m_s / profile.mean_speed_m_s(m.reference_height_m);
            let along = grid.moments(speed_factor, cscd_bg);
            let across: Vec<(f64, f64)> = m.loads.iter().map(|l| (l.z_m, l.moment_nm)).collect();
            ModeCombination {
                mode: m.mode,
                critical_speed_m_s: m.critical_speed_m_s,
                reference_height_m: m.reference_height_m,
                speed_factor,
                combined_moment_nm: critical::combine_moments(&across, &along),
                along_moment_nm: along,
                across_moment_nm: across,
            }
        })
        .collect();
    let combined: Vec<&[(f64, f64)]> = modes
        .iter()
        .map(|m| m.combined_moment_nm.as_slice())
        .collect();
    let governs = critical::governs(&moment_nm, &combined);

    Ok(StageAlongWind {
        stage: stage_modes.stage.name.clone(),
        height_m: h,
        c_prob,
        basic_speed_m_s: profile.basic_speed_m_s,
        reference_height_m: z_s,
        width_m: b_s,
        mean_speed_at_reference_m_s: v_s,
        turbulence_intensity_at_reference: i_s,
        length_scale_m: l_s,
        slenderness,
        end_effect_factor: psi,
        force_coefficient_at_reference: cf_s,
        force_coefficient_given: spec.force_coefficient.is_some(),
        frequency_hz: n1,
        equivalent_mass_kg_m: m_e,
        log_decrement_structural: delta_s,
        log_decrement_aerodynamic: delta_a,
        log_decrement_total: delta,
        factor,
        cscd_background_only: cscd_bg,
        peak_factor_background_only: k_p_bg,
        points,
        moment_nm,
        modes,
        governs,
        warnings,
    })
}

/// Every stage (same order as `stages` and `vortex.stages`); `Ok(None)` when the case gives
/// no EN site wind. `c_prob` is 1 for every stage until stage return periods are wired.
pub fn check_all(
    case: &Case,
    stages: &[StageModes],
    vortex: &VortexResults,
) -> Result<Option<Vec<StageAlongWind>>, AlongError> {
    let Some(spec) = case.along_wind.as_ref() else {
        return Ok(None);
    };
    stages
        .iter()
        .zip(&vortex.stages)
        // v_b of a construction stage has the stage's return period: EN 1991-1-4 (4.2).
        .map(|(s, v)| stage_along_wind(case, spec, s, v, v.climate.c_prob))
        .collect::<Result<Vec<_>, _>>()
        .map(Some)
}
