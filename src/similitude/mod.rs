//! Aeroelastic wind-tunnel model planning (`stackwake scale`): scale factors from the
//! published similitude conditions, the length scale from the tunnel's blockage limit, the
//! scaled model as a case file of its own, tunnel speeds for each mode's critical speed and
//! for the design wind, the Reynolds number mismatch, the FE check of the model against the
//! prototype, and the conversion of the lab's measurements back to the prototype.
//!
//! Scale factors are k_x = prototype / model throughout. Source of the relations: the
//! "Aeroelastic model similitude" entry of the project's references (published dimensional
//! analysis); the derivation of each factor is in [`factors`].
//!
//! Pure: the command loads the case, parses the generated model case with the ordinary
//! case reader, runs the modal analysis of both and hands the results to [`plan`].

pub mod blockage;
pub mod consistency;
pub mod factors;
pub mod measured;
pub mod model_case;
pub mod reynolds;

use serde::Serialize;
use thiserror::Error;

use crate::case::{Case, ModelSpec};
use crate::modal::StageModes;

pub use blockage::Blockage;
pub use consistency::ConsistencyRow;
pub use factors::{FactorRow, ScaleFactors};
pub use model_case::{ModelCase, ModelStation};
pub use reynolds::FlowRegime;

/// Why a model plan cannot be made.
#[derive(Debug, Error)]
pub enum SimilitudeError {
    /// The case has no `[model]` table.
    #[error("the case file has no [model] table: add one with at least elastic_modulus_gpa and density_kg_m3 of the model material, and length_scale or tunnel_width_m + tunnel_height_m")]
    NoModelTable,
    /// Neither a length scale nor a tunnel size was given.
    #[error("model.length_scale: missing; give length_scale (prototype / model), or tunnel_width_m and tunnel_height_m so that one can be proposed, or --length-scale")]
    NoLengthScale,
    /// The command-line length scale is outside [`LENGTH_SCALE_RANGE`].
    #[error("--length-scale = {value}: must be between 1 and 10000 (prototype / model): a model larger than the prototype, or under 1/10000 of it, cannot be built and tested in a boundary-layer tunnel (common practice)")]
    BadLengthScale { value: String },
    /// The model would block more than the whole test section.
    #[error("blockage {percent:.0} %: the model's frontal area at k_l = {length_scale} is larger than the tunnel's test section (model.tunnel_width_m x model.tunnel_height_m); the length scale must be at least {min_length_scale:.1} for model.max_blockage (is the scale or the tunnel size in the wrong unit?)")]
    BlockageOverFull {
        percent: f64,
        length_scale: f64,
        min_length_scale: f64,
    },
    /// The model case text could not be produced.
    #[error("cannot write the model case file: {message}")]
    ModelCaseText { message: String },
}

/// Where k_l came from.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub enum LengthScaleSource {
    /// `--length-scale` on the command line.
    CommandLine,
    /// `model.length_scale` in the case file.
    CaseFile,
    /// Proposed from the tunnel size and the blockage limit.
    ProposedFromTunnel,
}

impl LengthScaleSource {
    pub fn label(self) -> &'static str {
        match self {
            LengthScaleSource::CommandLine => "given with --length-scale",
            LengthScaleSource::CaseFile => "given as model.length_scale",
            LengthScaleSource::ProposedFromTunnel => {
                "proposed: smallest round scale meeting the blockage and height limits"
            }
        }
    }
}

/// The first half of a plan: everything that does not need the FE runs.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ScaleDesign {
    pub spec: ModelSpec,
    pub factors: ScaleFactors,
    pub length_scale_source: LengthScaleSource,
    /// Present when the tunnel size is known.
    pub blockage: Option<Blockage>,
    pub model: ModelCase,
    pub warnings: Vec<String>,
}

/// Accepted length scales k_l = prototype / model. Aeroelastic chimney models are built at
/// about 1:50 to 1:1000 (common practice); below 1 the "model" is larger than the stack and
/// above 10000 a 300 m stack becomes a 30 mm model whose point masses and springs (k_l^3 and
/// more) underflow into values no workshop can make.
pub const LENGTH_SCALE_RANGE: (f64, f64) = (1.0, 10_000.0);

/// Chooses k_l and builds the factors and the model case of `case` (which must have a
/// `[model]` table). `length_scale` overrides the case file's.
pub fn design(case: &Case, length_scale: Option<f64>) -> Result<ScaleDesign, SimilitudeError> {
    let spec = case.model.ok_or(SimilitudeError::NoModelTable)?;
    if let Some(v) = length_scale {
        if !(v.is_finite() && (LENGTH_SCALE_RANGE.0..=LENGTH_SCALE_RANGE.1).contains(&v)) {
            return Err(SimilitudeError::BadLengthScale {
                value: crate::input::physical::shown(v),
            });
        }
    }
    let tunnel = match (spec.tunnel_width_m, spec.tunnel_height_m) {
        (Some(w), Some(h)) => Some((w, h)),
        _ => None,
    };
    let (k_l, source) = match (length_scale, spec.length_scale, tunnel) {
        (Some(k), _, _) => (k, LengthScaleSource::CommandLine),
        (None, Some(k), _) => (k, LengthScaleSource::CaseFile),
        (None, None, Some((w, h))) => (
            blockage::propose_length_scale(&case.shell, w, h, spec.max_blockage),
            LengthScaleSource::ProposedFromTunnel,
        ),
        (None, None, None) => return Err(SimilitudeError::NoLengthScale),
    };
    let mut warnings = Vec::new();
    let blockage =
        tunnel.map(|(w, h)| Blockage::at_scale(&case.shell, k_l, w, h, spec.max_blockage));
    if let Some(b) = &blockage {
        // Over 100 % is not a model that could be tested at all: an error, not a warning.
        if b.blockage_ratio > 1.0 {
            return Err(SimilitudeError::BlockageOverFull {
                percent: 100.0 * b.blockage_ratio,
                length_scale: k_l,
                min_length_scale: b.min_length_scale,
            });
        }
        if b.blockage_ratio > b.max_blockage * (1.0 + 1e-12) {
            warnings.push(format!(
                "blockage {:.1} % exceeds model.max_blockage = {:.1} % (k_l >= {:.1} needed)",
                100.0 * b.blockage_ratio,
                100.0 * b.max_blockage,
                b.min_length_scale
            ));
        }
        if b.model_height_m > b.max_model_height_m * (1.0 + 1e-12) {
            warnings.push(format!(
                "model height {:.3} m exceeds {:.0} % of the tunnel height ({:.3} m)",
                b.model_height_m,
                100.0 * blockage::MAX_HEIGHT_FRACTION,
                b.max_model_height_m
            ));
        }
    }
    let factors = ScaleFactors::new(
        k_l,
        case.shell.density_kg_m3 / spec.density_kg_m3,
        case.shell.elastic_modulus_pa / spec.elastic_modulus_pa,
    );
    let model = model_case::model_case(case, &spec, &factors)?;
    warnings.extend(model.warnings.iter().cloned());
    Ok(ScaleDesign {
        spec,
        factors,
        length_scale_source: source,
        blockage,
        model,
        warnings,
    })
}

/// A tunnel speed for a prototype speed.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct SpeedRow {
    pub stage: String,
    pub mode: usize,
    pub prototype_frequency_hz: f64,
    /// Height of the largest antinode (where b is taken), prototype, m.
    pub shedding_height_m: f64,
    /// Outer diameter there, prototype, m.
    pub prototype_diameter_m: f64,
    pub strouhal: f64,
    pub prototype_critical_speed_m_s: f64,
    /// Prototype critical speed / k_v, m/s.
    pub model_speed_m_s: f64,
    /// Inside the tunnel's usable range; `None` when no range was given.
    pub in_tunnel_range: Option<bool>,
    pub prototype_reynolds: f64,
    pub model_reynolds: f64,
    pub prototype_regime: FlowRegime,
    pub model_regime: FlowRegime,
}

/// The design wind at the top of the stack and its tunnel speed.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct DesignSpeed {
    pub height_m: f64,
    /// Mean speed of the case's profile at the top, m/s.
    pub prototype_speed_m_s: f64,
    pub model_speed_m_s: f64,
    pub in_tunnel_range: Option<bool>,
    pub prototype_reynolds: f64,
    pub model_reynolds: f64,
    pub prototype_regime: FlowRegime,
    pub model_regime: FlowRegime,
}

/// Everything a report needs about a model plan.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ScalePlan {
    pub prototype_title: String,
    pub design: ScaleDesign,
    pub factor_rows: Vec<FactorRow>,
    /// The structural log decrement the model must reproduce (identical to the prototype's).
    pub model_log_decrement: f64,
    pub speeds: Vec<SpeedRow>,
    /// The design wind at the top; `None` when the case has no `[wind]`.
    pub design_speed: Option<DesignSpeed>,
    pub consistency: Vec<ConsistencyRow>,
    /// Largest |f_prototype / (f_model k_f) - 1|.
    pub worst_deviation: f64,
    pub reynolds_cautions: Vec<String>,
    /// Thin walls, blockage, tunnel-speed range.
    pub warnings: Vec<String>,
}

fn in_range(spec: &ModelSpec, v: f64) -> Option<bool> {
    match (spec.tunnel_speed_min_m_s, spec.tunnel_speed_max_m_s) {
        (None, None) => None,
        (lo, hi) => Some(lo.is_none_or(|lo| v >= lo) && hi.is_none_or(|hi| v <= hi)),
    }
}

fn range_text(spec: &ModelSpec) -> String {
    let f = |v: Option<f64>| v.map(|x| format!("{x:.2}")).unwrap_or_else(|| "-".into());
    format!(
        "{} to {} m/s",
        f(spec.tunnel_speed_min_m_s),
        f(spec.tunnel_speed_max_m_s)
    )
}

/// Completes the plan with the modal results of the prototype and of the model (the model
/// case of `design`, read back through the case reader), stage by stage in the same order.
pub fn plan(
    case: &Case,
    design: ScaleDesign,
    prototype_modes: &[StageModes],
    model_modes: &[StageModes],
) -> ScalePlan {
    let k = design.factors;
    let spec = design.spec;
    let st = reynolds::strouhal(case);
    // Without [wind] the Reynolds numbers use the default air of the case reader.
    let nu = case.wind.as_ref().map_or(
        crate::input::validate::DEFAULT_KINEMATIC_VISCOSITY_M2_S,
        |w| w.kinematic_viscosity_m2_s,
    );
    let mut warnings = design.warnings.clone();
    let mut speeds = Vec::new();
    for s in prototype_modes {
        for m in &s.modes {
            let (z, b) = reynolds::shedding_diameter_m(&s.model.z_m, &s.model.outer_diameter_m, m);
            let v = reynolds::critical_speed_m_s(b, m.frequency_hz, st);
            let v_model = v / k.velocity;
            let re_p = reynolds::reynolds(b, v, nu);
            let re_m = reynolds::reynolds(b / k.length, v_model, nu);
            let ok = in_range(&spec, v_model);
            if ok == Some(false) {
                warnings.push(format!(
                    "stage \"{}\" mode {}: tunnel speed {:.2} m/s for the critical speed {:.2} m/s is outside the tunnel range {}",
                    s.stage.name,
                    m.number,
                    v_model,
                    v,
                    range_text(&spec)
                ));
            }
            speeds.push(SpeedRow {
                stage: s.stage.name.clone(),
                mode: m.number,
                prototype_frequency_hz: m.frequency_hz,
                shedding_height_m: z,
                prototype_diameter_m: b,
                strouhal: st,
                prototype_critical_speed_m_s: v,
                model_speed_m_s: v_model,
                in_tunnel_range: ok,
                prototype_reynolds: re_p,
                model_reynolds: re_m,
                prototype_regime: FlowRegime::of(re_p),
                model_regime: FlowRegime::of(re_m),
            });
        }
    }
    let top = case.shell.height_m();
    let (b_top, _) = case.shell.geometry_at(top);
    // The design wind row needs the case's [wind]; without it the plan has no such row.
    let design_speed = reynolds::mean_speed_m_s(case, top).map(|v_top| {
        let v_top_model = v_top / k.velocity;
        let re_p = reynolds::reynolds(b_top, v_top, nu);
        let re_m = reynolds::reynolds(b_top / k.length, v_top_model, nu);
        DesignSpeed {
            height_m: top,
            prototype_speed_m_s: v_top,
            model_speed_m_s: v_top_model,
            in_tunnel_range: in_range(&spec, v_top_model),
            prototype_reynolds: re_p,
            model_reynolds: re_m,
            prototype_regime: FlowRegime::of(re_p),
            model_regime: FlowRegime::of(re_m),
        }
    });
    if let Some(d) = design_speed
        .as_ref()
        .filter(|d| d.in_tunnel_range == Some(false))
    {
        warnings.push(format!(
            "tunnel speed {:.2} m/s for the design wind {:.2} m/s at the top is outside the tunnel range {}",
            d.model_speed_m_s,
            d.prototype_speed_m_s,
            range_text(&spec)
        ));
    }
    let consistency = consistency::compare(prototype_modes, model_modes, k.frequency);
    ScalePlan {
        prototype_title: case.title.clone(),
        factor_rows: k.rows(),
        model_log_decrement: case.vortex.log_decrement * k.log_decrement,
        speeds,
        design_speed,
        worst_deviation: consistency::worst_deviation(&consistency),
        consistency,
        reynolds_cautions: reynolds::cautions(),
        warnings,
        design,
    }
}
