//! Re-solving one mode's EN 1991-1-4 Annex E response with changed damping and/or a factor on
//! c_lat, reusing everything the check computed (shedding section, St, Re, equivalent mass).
//!
//! The Scruton number is linear in the structural log decrement (E.1.3.3), so a new decrement
//! scales it; approach 1 is re-solved as a fixed point (Table E.4 L_j with Table E.3 c_lat, as
//! in `wind::approach1`), approach 2 from its closed form. Load effects scale with the antinode
//! amplitude. Units: SI.

use crate::case::{Case, VortexMethod, Wind};
use crate::modal::{Mode, StageModel};
use crate::wind::approach1::{self, Approach1Params};
use crate::wind::verdict::{self, Response, Verdict};
use crate::wind::{approach2, loads, profile, ModeShape, ModeVortex};

/// The mode as the check saw it, with what a remedy needs to re-solve it.
pub struct ModeContext<'a> {
    pub case: &'a Case,
    /// The stage's design wind the check used (the site's wind x c_prob).
    pub wind: &'a Wind,
    pub model: &'a StageModel,
    pub mode: &'a Mode,
    pub checked: &'a ModeVortex,
    pub shape: ModeShape<'a>,
    /// Tip amplitude per antinode amplitude.
    pub tip_per_antinode: f64,
    /// Largest |stress| per metre of antinode amplitude, Pa/m.
    pub stress_per_antinode_pa_m: f64,
}

impl<'a> ModeContext<'a> {
    pub fn new(
        case: &'a Case,
        wind: &'a Wind,
        model: &'a StageModel,
        mode: &'a Mode,
        checked: &'a ModeVortex,
    ) -> Self {
        let shape = ModeShape::from_mode(model, mode);
        let ia = shape.largest_antinode();
        let phi_a = mode.displacement[ia];
        let top = model.z_m.len() - 1;
        let unit = loads::inertia_loads(model, &shape, mode.frequency_hz, 1.0 / phi_a);
        ModeContext {
            case,
            wind,
            model,
            mode,
            checked,
            shape,
            tip_per_antinode: (mode.displacement[top] / phi_a).abs(),
            stress_per_antinode_pa_m: loads::max_abs_stress_pa(&unit),
        }
    }

    /// Scruton number at structural log decrement `delta`.
    pub fn scruton(&self, delta: f64) -> f64 {
        self.checked.scruton * delta / self.checked.log_decrement
    }

    /// Approach 1 antinode amplitude at decrement `delta`, with c_lat multiplied by
    /// `c_lat_factor(L_j)` (1 = unchanged), m.
    pub fn approach1_y_m(&self, delta: f64, c_lat_factor: impl Fn(f64) -> f64) -> f64 {
        let c = self.checked;
        let z_a = c.reference_height_m;
        let group = c.approach1.as_ref().map_or(1.0, |a| a.c_lat_group_factor);
        let c_lat0 = approach1::c_lat0_circular(c.reynolds);
        let params = Approach1Params {
            diameter_m: c.diameter_m,
            strouhal: c.strouhal,
            scruton: self.scruton(delta),
            k: approach1::k_mode_shape(&self.shape),
        };
        let wind = self.wind;
        let ratio_at = |l: f64| {
            let (a, b) = approach1::correlation_interval(&self.shape, z_a, l);
            let v = profile::mean_speed_m_s(wind, 0.5 * (a + b));
            if v > 0.0 {
                c.critical_speed_m_s / v
            } else {
                f64::INFINITY
            }
        };
        approach1::amplitude(
            &params,
            |l| approach1::kw_mode_shape(&self.shape, z_a, l),
            |l| group * c_lat0 * approach1::c_lat_speed_factor(ratio_at(l)) * c_lat_factor(l),
        )
        .y_max_m
    }

    /// Approach 2 antinode amplitude at decrement `delta`, m.
    pub fn approach2_y_m(&self, delta: f64) -> f64 {
        let c = self.checked;
        approach2::amplitude(&approach2::Approach2Params {
            diameter_m: c.diameter_m,
            strouhal: c.strouhal,
            scruton: self.scruton(delta),
            equivalent_mass_kg_m: c.equivalent_mass_kg_m,
            air_density_kg_m3: self.wind.air_density_kg_m3,
            height_m: self.model.height_m(),
            reynolds: c.reynolds,
        })
        .y_max_m
    }

    /// Tip amplitude and largest stress for an antinode amplitude.
    pub fn effects(&self, y_m: f64) -> Response {
        Response {
            tip_amplitude_m: Some(y_m * self.tip_per_antinode),
            max_stress_pa: Some(y_m * self.stress_per_antinode_pa_m),
        }
    }

    /// Verdict of an antinode amplitude against the case's criteria.
    pub fn judge(&self, y_m: f64) -> Verdict {
        let top = self.model.outer_diameter_m.len() - 1;
        verdict::judge(
            &self.case.criteria,
            false,
            self.effects(y_m),
            self.model.outer_diameter_m[top],
            &[],
        )
    }

    /// The EN approach that decides remedy verdicts: the case's method, or approach 1 when
    /// GB 50009 governs (its damping enters differently; remedies are sized by EN).
    pub fn governing_en(&self) -> VortexMethod {
        match self.case.vortex.method {
            VortexMethod::En1991E2 => VortexMethod::En1991E2,
            _ => VortexMethod::En1991E1,
        }
    }
}
