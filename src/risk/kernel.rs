//! The per-sample vortex arithmetic of one stage and mode, without re-solving the modes:
//! everything that does not change when only E, a stage's stiffness factor, the structural
//! damping, the Strouhal number, c_lat or the reference wind speed change is computed once
//! (shedding section, diameter, equivalent mass, shape factor K, K_W and the profile at the
//! two plateaus of Table E.4, load effects per metre of amplitude), and each sample costs a
//! few dozen flops and no allocation.
//!
//! Why these shortcuts are exact:
//! - E and the stiffness factor multiply the whole stiffness matrix (E and G together, the
//!   shear modulus being E / (2 (1 + nu))), mass unchanged: the eigenvectors are unchanged
//!   and every omega^2 scales by the same factor, so f scales as sqrt(factor) and the shapes,
//!   modal and equivalent masses stay (generalised eigenproblem K phi = w^2 M phi).
//! - damping, St, c_lat and the wind enter only the EN 1991-1-4 Annex E expressions (E.1.3,
//!   E.1.5.2, E.1.5.3), never K or M.
//!   The tests compare samples through this path with the full analysis of the edited case.
//!
//! Units: SI (Hz, m, m/s, kg/m, Pa).

mod interpolate;

use crate::case::{Case, Criteria, VortexMethod};
use crate::modal::{StageModel, StageModes};
use crate::wind::{
    self, approach1, approach2, profile, shedding, ModeShape, ModeVortex, StageClimate, WindError,
};

/// The sampled values that the shortcut path takes (each `None` = the case's own).
#[derive(Debug, Clone, Copy, Default)]
pub struct SampleInputs {
    /// Multiplier on omega^2 (E / E_case times stiffness_factor / its case value).
    pub stiffness_scale: f64,
    pub strouhal: Option<f64>,
    pub log_decrement: Option<f64>,
    pub reference_speed_m_s: Option<f64>,
    /// Multiplier on c_lat (approach 1), risk-only model uncertainty.
    pub c_lat_factor: f64,
}

impl SampleInputs {
    /// The case itself.
    pub fn identity() -> Self {
        SampleInputs {
            stiffness_scale: 1.0,
            strouhal: None,
            log_decrement: None,
            reference_speed_m_s: None,
            c_lat_factor: 1.0,
        }
    }
}

/// What one sample gives for one stage and mode.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub struct ModeSample {
    pub frequency_hz: f64,
    pub critical_speed_m_s: f64,
    pub scruton: f64,
    /// Governing method's peak tip amplitude, m (0 when screened out by E.1.2).
    pub tip_amplitude_m: f64,
    /// Governing method's largest |stress|, Pa (0 when screened out).
    pub max_stress_pa: f64,
    /// v_crit <= 1.25 v_m (EN 1991-1-4 E.1.2): the mode needs a check.
    pub in_range: bool,
    pub tip_exceeds: bool,
    pub stress_exceeds: bool,
    /// Verdict `exceeds` (any criterion; with the resistance quantities also
    /// utilisation > 1 or damage > 1).
    pub exceeds: bool,
    /// Factor on the case's unit inertia moments: (n / n_case)^2 times the antinode
    /// amplitude, m (0 when screened out). Used by the resistance quantities.
    pub load_scale: f64,
    /// max over the height of gamma_Q M_vortex / M_Rd (`--with-resistance`, else 0).
    pub vortex_utilisation: f64,
    /// The mode's fatigue damage of the vertical bars at its worst height (else 0).
    pub fatigue_damage: f64,
    pub utilisation_exceeds: bool,
    pub damage_exceeds: bool,
    /// The stage's fatigue damage: max over the height of the sum over its modes, as
    /// `check` (the same value on every mode of the stage; else 0).
    pub stage_fatigue_damage: f64,
    /// The sum over the stages of [`Self::stage_fatigue_damage`], as `check`'s total (the
    /// same value on every entry; else 0).
    pub total_fatigue_damage: f64,
}

/// Precomputed data of one stage and mode.
#[derive(Debug, Clone)]
pub struct ModeKernel {
    pub stage_index: usize,
    pub mode: usize,
    method: VortexMethod,
    criteria: Criteria,
    frequency_hz: f64,
    diameter_m: f64,
    top_diameter_m: f64,
    antinode_z_m: f64,
    strouhal: f64,
    /// The case's own Scruton number of this mode (whatever the source of its damping).
    scruton: f64,
    equivalent_mass_kg_m: f64,
    air_density_kg_m3: f64,
    kinematic_viscosity_m2_s: f64,
    height_m: f64,
    /// v_m / v_ref at the shedding section.
    speed_factor: f64,
    tip_per_antinode: f64,
    stress_per_m: f64,
    c_lat_group_factor: f64,
    k: f64,
    /// (L, K_W uncapped, v_m / v_ref at the centre of L) at L = 6 b and 12 b.
    plateaus: [(f64, f64, f64); 2],
    /// The stage's design wind (the site's 50-year wind x the stage's c_prob).
    wind: crate::case::Wind,
    /// The stage's c_prob: a sampled site reference speed is scaled by it.
    c_prob: f64,
    /// The stage gives its own `log_decrement`: a sampled `vortex.log_decrement` does not
    /// reach it (as in the case file).
    own_log_decrement: bool,
    z_m: Vec<f64>,
    phi: Vec<f64>,
    slope: Vec<f64>,
    /// Stress of the unit inertia loads (per metre of antinode amplitude) at each load
    /// point, Pa: `stress_per_m` is its largest magnitude.
    unit_stress_pa: Vec<f64>,
}

/// What a kernel takes from the check of a mode.
#[derive(Debug, Clone, Copy)]
struct Basics {
    diameter_m: f64,
    reference_height_m: f64,
    strouhal: f64,
    scruton: f64,
    equivalent_mass_kg_m: f64,
    c_lat_group_factor: f64,
}

impl Basics {
    fn of(mv: &ModeVortex) -> Basics {
        Basics {
            diameter_m: mv.diameter_m,
            reference_height_m: mv.reference_height_m,
            strouhal: mv.strouhal,
            scruton: mv.scruton,
            equivalent_mass_kg_m: mv.equivalent_mass_kg_m,
            c_lat_group_factor: mv.group.as_ref().map_or(1.0, |g| g.c_lat_factor),
        }
    }

    /// The same values by the rules of `wind::check_mode` (shedding section at the largest
    /// antinode, St from the case / group rule / 0.18, Sc from the case's log decrement),
    /// without running the whole check: for re-solved samples. The tests compare both.
    /// Sc takes the stage's own log decrement (`stage[i].log_decrement`, else the case's),
    /// as `check_mode` does.
    fn direct(
        case: &Case,
        climate: &StageClimate,
        model: &StageModel,
        mode: &crate::modal::Mode,
    ) -> Basics {
        let wind = climate.wind;
        let shape = ModeShape::from_mode(model, mode);
        let ia = shape.largest_antinode();
        let b = model.outer_diameter_m[ia];
        let group = case
            .vortex
            .group
            .as_ref()
            .map(|g| wind::group::in_line_rule(g, b));
        let strouhal = match (case.vortex.strouhal, &group) {
            (Some(st), _) => st,
            (None, Some(g)) => g.strouhal,
            (None, None) => shedding::STROUHAL_CIRCULAR_EN,
        };
        let m_e = if mode.equivalent_mass_kg_m.is_finite() && mode.equivalent_mass_kg_m > 0.0 {
            mode.equivalent_mass_kg_m
        } else {
            wind::shape::equivalent_mass_kg_m(model, &shape)
        };
        Basics {
            diameter_m: b,
            reference_height_m: model.z_m[ia],
            strouhal,
            scruton: shedding::scruton(climate.log_decrement, m_e, wind.air_density_kg_m3, b),
            equivalent_mass_kg_m: m_e,
            c_lat_group_factor: group.as_ref().map_or(1.0, |g| g.c_lat_factor),
        }
    }
}

/// Builds the kernels of every stage and checked mode (the case's own check of each mode
/// supplies the shedding section and mass data, so both paths share one definition).
pub fn kernels(case: &Case, stages: &[StageModes]) -> Result<Vec<ModeKernel>, WindError> {
    let results = wind::check_all(case, stages)?;
    let mut out = Vec::new();
    for (si, (sv, sm)) in results.stages.iter().zip(stages).enumerate() {
        for mv in &sv.modes {
            let mode = &sm.modes[mv.mode - 1];
            let basics = Basics::of(mv);
            out.push(ModeKernel::new(case, &sv.climate, si, sm, mode, basics));
        }
    }
    Ok(out)
}

/// Calls `visit` with the light kernel ([`ModeKernel::light`]) of every stage and checked
/// mode of a re-solved case, in order, and the stage's modes and the mode; the check's rules
/// are restated in `Basics::direct`.
fn for_each_direct(
    case: &Case,
    stages: &[StageModes],
    mut visit: impl FnMut(ModeKernel, &StageModes, &crate::modal::Mode),
) -> Result<(), WindError> {
    let site = wind::site_wind(case, "risk")?;
    for (si, sm) in stages.iter().enumerate() {
        let climate = StageClimate::of(case, &sm.stage, site);
        for mode in sm.modes.iter().take(case.vortex.modes) {
            let basics = Basics::direct(case, &climate, &sm.model, mode);
            visit(
                ModeKernel::light(case, &climate, si, sm, mode, basics),
                sm,
                mode,
            );
        }
    }
    Ok(())
}

/// The same kernels as [`kernels`] without running the whole check (about a sixth of a
/// re-solved sample's time).
pub fn kernels_direct(case: &Case, stages: &[StageModes]) -> Result<Vec<ModeKernel>, WindError> {
    let mut out = Vec::new();
    for_each_direct(case, stages, |mut k, sm, mode| {
        k.complete(sm, mode);
        out.push(k);
    })?;
    Ok(out)
}

/// The samples of every stage and checked mode of a re-solved case at `s`, by the rules of
/// [`kernels_direct`] and [`ModeKernel::evaluate`], into `out`; a mode screened out by
/// E.1.2 skips the shape integrals and unit loads it would not read (the same
/// `evaluate`, so the same numbers). Returns the number of entries written.
pub fn samples_direct(
    case: &Case,
    stages: &[StageModes],
    s: &SampleInputs,
    out: &mut [ModeSample],
) -> Result<usize, WindError> {
    let mut j = 0;
    for_each_direct(case, stages, |mut k, sm, mode| {
        if !k.screened(s) {
            k.complete(sm, mode);
        }
        if let Some(o) = out.get_mut(j) {
            *o = k.evaluate(s);
        }
        j += 1;
    })?;
    Ok(j)
}

impl ModeKernel {
    fn new(
        case: &Case,
        climate: &StageClimate,
        stage_index: usize,
        stage_modes: &StageModes,
        mode: &crate::modal::Mode,
        mv: Basics,
    ) -> Self {
        let mut k = Self::light(case, climate, stage_index, stage_modes, mode, mv);
        k.complete(stage_modes, mode);
        k
    }

    /// The kernel without its curves and shape integrals (K, K_W, unit loads): all that
    /// [`Self::screened`] and a screened-out [`Self::evaluate`] read. [`Self::complete`]
    /// adds the rest.
    fn light(
        case: &Case,
        climate: &StageClimate,
        stage_index: usize,
        stage_modes: &StageModes,
        mode: &crate::modal::Mode,
        mv: Basics,
    ) -> Self {
        let model = &stage_modes.model;
        // Every speed of the stage comes from its own design wind (EN 1991-1-4 (4.2)).
        let wind = climate.wind;
        let top = model.z_m.len() - 1;
        let b = mv.diameter_m;
        ModeKernel {
            stage_index,
            mode: mode.number,
            method: case.vortex.method,
            criteria: case.criteria,
            frequency_hz: mode.frequency_hz,
            diameter_m: b,
            top_diameter_m: model.outer_diameter_m[top],
            antinode_z_m: mv.reference_height_m,
            strouhal: mv.strouhal,
            scruton: mv.scruton,
            equivalent_mass_kg_m: mv.equivalent_mass_kg_m,
            air_density_kg_m3: wind.air_density_kg_m3,
            kinematic_viscosity_m2_s: wind.kinematic_viscosity_m2_s,
            height_m: model.height_m(),
            speed_factor: profile::speed_factor(&wind, mv.reference_height_m),
            tip_per_antinode: 0.0,
            stress_per_m: 0.0,
            unit_stress_pa: Vec::new(),
            c_lat_group_factor: mv.c_lat_group_factor,
            k: 0.0,
            plateaus: [(b * 6.0, 0.0, 0.0), (b * 12.0, 0.0, 0.0)],
            wind,
            c_prob: climate.c_prob,
            own_log_decrement: stage_modes.stage.log_decrement.is_some(),
            z_m: Vec::new(),
            phi: Vec::new(),
            slope: Vec::new(),
        }
    }

    /// Adds to a [`Self::light`] kernel its shape, unit loads, K and the plateaus' K_W.
    fn complete(&mut self, stage_modes: &StageModes, mode: &crate::modal::Mode) {
        let model = &stage_modes.model;
        let shape = ModeShape::from_mode(model, mode);
        let ia = shape.largest_antinode();
        let top = model.z_m.len() - 1;
        let phi_a = mode.displacement[ia];
        let unit = wind::loads::inertia_loads(model, &shape, mode.frequency_hz, 1.0 / phi_a);
        let z_a = self.antinode_z_m;
        let plateau = |l: f64| {
            let (lo, hi) = approach1::correlation_interval(&shape, z_a, l);
            (
                l,
                approach1::kw_mode_shape(&shape, z_a, l),
                profile::speed_factor(&self.wind, 0.5 * (lo + hi)),
            )
        };
        let plateaus = [plateau(self.plateaus[0].0), plateau(self.plateaus[1].0)];
        self.plateaus = plateaus;
        self.k = approach1::k_mode_shape(&shape);
        self.tip_per_antinode = (mode.displacement[top] / phi_a).abs();
        self.stress_per_m = wind::loads::max_abs_stress_pa(&unit);
        self.unit_stress_pa = unit.iter().map(|l| l.stress_pa).collect();
        self.z_m = model.z_m.clone();
        self.phi = mode.displacement.clone();
        self.slope = mode.rotation_per_m.clone();
    }

    /// Whether this kernel can evaluate the case's governing method (GB 50009 cannot: its
    /// samples go through the full check with the cached modes).
    pub fn supported(method: VortexMethod) -> bool {
        matches!(method, VortexMethod::En1991E1 | VortexMethod::En1991E2)
    }

    fn shape(&self) -> ModeShape<'_> {
        let slope = (self.slope.len() == self.z_m.len()).then_some(self.slope.as_slice());
        ModeShape::new(&self.z_m, &self.phi, slope)
    }

    /// K_W (uncapped) and v_m / v_ref at the centre of L_j for correlation length `l`.
    #[inline]
    fn kw_and_centre_factor(&self, l: f64) -> (f64, f64) {
        for &(pl, kw, f) in &self.plateaus {
            if pl == l {
                return (kw, f);
            }
        }
        let shape = self.shape();
        let (lo, hi) = approach1::correlation_interval(&shape, self.antinode_z_m, l);
        (
            approach1::kw_mode_shape(&shape, self.antinode_z_m, l),
            profile::speed_factor(&self.wind, 0.5 * (lo + hi)),
        )
    }

    /// One sample. No allocation.
    /// The sample's frequency n, Strouhal number, reference speed, v_crit and v_m at the
    /// shedding section.
    #[inline]
    fn speeds(&self, s: &SampleInputs) -> (f64, f64, f64, f64, f64) {
        let n = self.frequency_hz * s.stiffness_scale.sqrt();
        let st = s.strouhal.unwrap_or(self.strouhal);
        let v_ref = s
            .reference_speed_m_s
            .map(|v| v * self.c_prob)
            .unwrap_or(self.wind.reference_speed_m_s);
        let v_crit = shedding::critical_speed_m_s(self.diameter_m, n, st);
        (n, st, v_ref, v_crit, v_ref * self.speed_factor)
    }

    /// Whether the sample is screened out by EN 1991-1-4 E.1.2 (then [`Self::evaluate`]
    /// reads no curve of the kernel).
    pub fn screened(&self, s: &SampleInputs) -> bool {
        let (_, _, _, v_crit, v_m) = self.speeds(s);
        shedding::screened_out(v_crit, v_m)
    }

    pub fn evaluate(&self, s: &SampleInputs) -> ModeSample {
        let (n, st, v_ref, v_crit, v_m) = self.speeds(s);
        let b = self.diameter_m;
        let sc = match s.log_decrement.filter(|_| !self.own_log_decrement) {
            Some(delta) => {
                shedding::scruton(delta, self.equivalent_mass_kg_m, self.air_density_kg_m3, b)
            }
            None => self.scruton,
        };
        let screened = shedding::screened_out(v_crit, v_m);
        let mut out = ModeSample {
            frequency_hz: n,
            critical_speed_m_s: v_crit,
            scruton: sc,
            in_range: !screened,
            ..ModeSample::default()
        };
        if screened {
            return out;
        }
        let re = shedding::reynolds(b, v_crit, self.kinematic_viscosity_m2_s);
        let y = match self.method {
            VortexMethod::En1991E2 => {
                approach2::amplitude(&approach2::Approach2Params {
                    diameter_m: b,
                    strouhal: st,
                    scruton: sc,
                    equivalent_mass_kg_m: self.equivalent_mass_kg_m,
                    air_density_kg_m3: self.air_density_kg_m3,
                    height_m: self.height_m,
                    reynolds: re,
                })
                .y_max_m
            }
            _ => {
                let c0 = approach1::c_lat0_circular(re) * self.c_lat_group_factor * s.c_lat_factor;
                let params = approach1::Approach1Params {
                    diameter_m: b,
                    strouhal: st,
                    scruton: sc,
                    k: self.k,
                };
                approach1::amplitude(
                    &params,
                    |l| self.kw_and_centre_factor(l).0,
                    |l| {
                        let v = v_ref * self.kw_and_centre_factor(l).1;
                        let ratio = if v > 0.0 { v_crit / v } else { f64::INFINITY };
                        c0 * approach1::c_lat_speed_factor(ratio)
                    },
                )
                .y_max_m
            }
        };
        out.tip_amplitude_m = y * self.tip_per_antinode;
        // Inertia loads m (2 pi n)^2 Phi y (E.1.4) scale with n^2, i.e. the stiffness scale.
        out.max_stress_pa = y * self.stress_per_m * s.stiffness_scale;
        out.load_scale = y * s.stiffness_scale;
        judge(&self.criteria, self.top_diameter_m, &mut out);
        out
    }
}

/// The exceedance flags by the rules of `wind::verdict::judge` (same comparisons).
fn judge(c: &Criteria, top_diameter_m: f64, out: &mut ModeSample) {
    if c.is_empty() || !out.in_range {
        return;
    }
    let tip = out.tip_amplitude_m;
    out.tip_exceeds = c.tip_amplitude_m.is_some_and(|l| tip > l)
        || c.tip_amplitude_per_diameter
            .is_some_and(|r| tip > r * top_diameter_m);
    out.stress_exceeds = c.stress_pa.is_some_and(|l| out.max_stress_pa > l);
    out.exceeds = out.tip_exceeds || out.stress_exceeds;
}

/// One mode's sample from the full check result (the reference for the kernel, and the
/// path taken when the kernel does not cover the governing method).
pub fn from_check(m: &ModeVortex, criteria: &Criteria, top_diameter_m: f64) -> ModeSample {
    let g = m.governing_summary();
    let mut out = ModeSample {
        frequency_hz: m.frequency_hz,
        critical_speed_m_s: m.critical_speed_m_s,
        scruton: m.scruton,
        tip_amplitude_m: g.tip_amplitude_m.unwrap_or(0.0),
        max_stress_pa: g.max_stress_pa.unwrap_or(0.0),
        in_range: !m.screened_out,
        ..ModeSample::default()
    };
    if m.governing == VortexMethod::Gb50009H1 {
        out.in_range = g.applies;
        out.exceeds = m.verdict.is_exceeds();
        out.tip_exceeds = out.exceeds;
        out.stress_exceeds = out.exceeds;
        return out;
    }
    // The governing approach's antinode amplitude: the factor on this case's unit moments.
    out.load_scale = match m.governing {
        VortexMethod::En1991E1 => m.approach1.as_ref().map_or(0.0, |a| a.y_max_m),
        _ => m.approach2.as_ref().map_or(0.0, |a| a.y_max_m),
    };
    judge(criteria, top_diameter_m, &mut out);
    out
}
