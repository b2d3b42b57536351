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
pub mod shape;
pub mod shedding;
pub mod stage_climate;
pub mod verdict;

use serde::Serialize;

use crate::case::{Case, Stage, VortexMethod, Wind};
use crate::modal::{Mode, StageModel, StageModes};

pub use error::{site_wind, WindError};
pub use group::GroupRule;
pub use loads::LoadPoint;
pub use shape::ModeShape;
pub use shedding::HeightBand;
pub use stage_climate::StageClimate;
pub use verdict::Verdict;

/// Results of every stage.
#[derive(Debug, Clone, Serialize)]
pub struct VortexResults {
    /// The site's 50-year wind (the case's `[wind]`); each stage's own design wind is in its
    /// [`StageVortex::climate`].
    pub wind: Wind,
    pub stages: Vec<StageVortex>,
    /// Case-level warnings, each given once (e.g. the GB 50009 outer-face taper).
    pub warnings: Vec<String>,
}

/// Results of one stage.
#[derive(Debug, Clone, Serialize)]
pub struct StageVortex {
    pub stage: String,
    /// The stage's wind (return period, c_prob), duration and damping.
    pub climate: StageClimate,
    pub modes: Vec<ModeVortex>,
    /// Stage-level warnings (e.g. fewer modes available than requested).
    pub warnings: Vec<String>,
}

/// What one method gives for one mode, in a common form for comparison tables.
#[derive(Debug, Clone, Serialize)]
pub struct MethodSummary {
    pub method: VortexMethod,
    /// Whether the method computes a response for this mode (false: screened out or outside
    /// its conditions).
    pub applies: bool,
    /// Peak across-wind amplitude at the top, m.
    pub tip_amplitude_m: Option<f64>,
    pub base_moment_nm: Option<f64>,
    /// Largest |extreme-fibre stress| over the height, Pa.
    pub max_stress_pa: Option<f64>,
    pub fatigue_cycles: Option<f64>,
}

/// EN 1991-1-4 approach 1 details.
#[derive(Debug, Clone, Serialize)]
pub struct Approach1Result {
    /// Figure E.2 value at Re (from memory; log10-Re interpolation is our reading).
    pub c_lat0: f64,
    /// In-line group factor on c_lat (1 = single stack).
    pub c_lat_group_factor: f64,
    /// c_lat used (Table E.3 and group factor applied).
    pub c_lat: f64,
    /// v_crit / v_m at the centre of L_j (Table E.3 argument).
    pub speed_ratio_lj: f64,
    pub correlation_length_m: f64,
    pub correlation_centre_z_m: f64,
    /// K (E.9) from the mode shape.
    pub k: f64,
    pub kw_uncapped: f64,
    pub kw: f64,
    /// Peak amplitude at the largest antinode, m.
    pub y_max_m: f64,
    pub tip_amplitude_m: f64,
    pub base_moment_nm: f64,
    pub max_stress_pa: f64,
    pub fatigue_cycles: f64,
    pub iterations: usize,
}

/// EN 1991-1-4 approach 2 details.
#[derive(Debug, Clone, Serialize)]
pub struct Approach2Result {
    pub c_c: f64,
    pub k_a: f64,
    pub a_l: f64,
    pub sigma_y_m: f64,
    pub peak_factor: f64,
    pub y_max_m: f64,
    pub tip_amplitude_m: f64,
    pub base_moment_nm: f64,
    pub max_stress_pa: f64,
    pub fatigue_cycles: f64,
}

/// GB 50009-2012 App. H.1 details (comparison method; see wind::gb50009 for what was checked).
#[derive(Debug, Clone, Serialize)]
pub struct Gb50009Result {
    pub strouhal: f64,
    /// Height where the diameter is taken (2/3 H), m.
    pub diameter_height_m: f64,
    pub diameter_m: f64,
    pub critical_speed_m_s: f64,
    /// Re = 69000 v_cr D.
    pub reynolds: f64,
    pub regime: gb50009::Regime,
    /// Mean speed at the top, m/s.
    pub top_speed_m_s: f64,
    /// Transcritical resonance condition (Re >= 3.5e6 and 1.2 v_H > v_cr): load computed.
    pub resonance: bool,
    /// Subcritical (Re < 3e5) with v_H > v_cr: GB 50009-2012 8.5.3(1) asks for
    /// anti-vibration measures or v_cr >= 15 m/s (no load formula).
    pub subcritical_lock_in: bool,
    /// With a subcritical lock-in: whether v_cr >= 15 m/s, the 8.5.3(1) alternative to
    /// measures (`None` when there is no subcritical lock-in).
    pub subcritical_speed_rule_met: Option<bool>,
    /// Outer-face taper (D_base - D_top) / (2 H) of the stage; 8.5.3 allows the diameter at
    /// 2/3 H for a taper up to 0.02.
    pub outer_face_taper: f64,
    /// H1, m, when 1.2 v_H > v_cr.
    pub lock_in_start_m: Option<f64>,
    /// lambda_j of Table H.1.1 (towers, modes 1-4).
    pub lambda_table: Option<f64>,
    /// lambda_j by its defining integral over the computed shape.
    pub lambda_shape: Option<f64>,
    /// lambda_j used (table if available, else the integral).
    pub lambda_used: Option<f64>,
    /// zeta_j used in (H.1.1-1).
    pub damping_ratio: f64,
    /// True when `damping_ratio` is the default 0.05 of H.1.1 (concrete), false when the
    /// case file gives `vortex.damping_ratio`.
    pub damping_ratio_is_default: bool,
    /// Tip amplitude from the modal response to the equivalent load, m (our derivation).
    pub tip_amplitude_m: Option<f64>,
    pub base_moment_nm: Option<f64>,
    pub max_stress_pa: Option<f64>,
}

/// Everything about one stage/mode.
#[derive(Debug, Clone, Serialize)]
pub struct ModeVortex {
    pub stage: String,
    pub mode: usize,
    pub frequency_hz: f64,
    /// Shedding section: the mode's largest antinode, m.
    pub reference_height_m: f64,
    /// Outer diameter at the reference height, m.
    pub diameter_m: f64,
    /// St used by the EN methods (user override, group rule, or 0.18).
    pub strouhal: f64,
    pub critical_speed_m_s: f64,
    /// The stage's mean speed at the reference height (the site's 50-year speed x c_prob).
    pub mean_speed_m_s: f64,
    /// v_crit / v_m at the reference height.
    pub speed_ratio: f64,
    pub reynolds: f64,
    /// Structural log decrement of the stage used in `scruton`.
    pub log_decrement: f64,
    pub scruton: f64,
    pub equivalent_mass_kg_m: f64,
    /// EN 1991-1-4 E.1.2: v_crit > 1.25 v_m, no further EN check.
    pub screened_out: bool,
    /// Our own addition (not a code method): envelope of the heights where b(z) n / St is
    /// below v_m(z); `None` when nowhere.
    pub lock_in_band: Option<HeightBand>,
    /// The individual segments of the lock-in band.
    pub lock_in_segments: Vec<HeightBand>,
    /// In-line group rule applied, if a group is given.
    pub group: Option<GroupRule>,
    pub approach1: Option<Approach1Result>,
    pub approach2: Option<Approach2Result>,
    pub gb50009: Gb50009Result,
    /// The three methods side by side; `governing` says which one decides.
    pub comparison: Vec<MethodSummary>,
    pub governing: VortexMethod,
    /// Load effects of the governing method along the height (empty when nothing applies).
    pub loads: Vec<LoadPoint>,
    pub verdict: Verdict,
    pub warnings: Vec<String>,
}

/// One row of vortex.csv (contract columns, governing method).
#[derive(Debug, Clone, Serialize)]
pub struct VortexRow {
    pub stage: String,
    pub mode: usize,
    pub frequency_hz: f64,
    pub reference_height_m: f64,
    pub diameter_m: f64,
    pub strouhal: f64,
    pub critical_speed_m_s: f64,
    pub mean_speed_m_s: f64,
    pub speed_ratio: f64,
    pub reynolds: f64,
    pub scruton: f64,
    pub tip_amplitude_m: Option<f64>,
    pub base_moment_nm: Option<f64>,
    pub fatigue_cycles: Option<f64>,
    pub verdict: String,
}

/// One row of loads.csv.
#[derive(Debug, Clone, Serialize)]
pub struct LoadRow {
    pub stage: String,
    pub mode: usize,
    pub z_m: f64,
    pub inertia_force_n_m: f64,
    pub shear_n: f64,
    pub moment_nm: f64,
    pub stress_pa: f64,
}

impl Gb50009Result {
    /// 8.5.3(1): a subcritical lock-in with v_cr below 15 m/s needs anti-vibration measures.
    pub fn subcritical_measures_required(&self) -> bool {
        self.subcritical_lock_in && self.subcritical_speed_rule_met == Some(false)
    }

    /// Whether this mode's GB result carries a finding (a load, or measures required): only
    /// then is GB's outer-face taper rule worth a warning.
    pub fn shows_a_result(&self) -> bool {
        self.resonance || self.subcritical_lock_in
    }
}

impl ModeVortex {
    /// The summary of the governing method.
    pub fn governing_summary(&self) -> &MethodSummary {
        self.comparison
            .iter()
            .find(|m| m.method == self.governing)
            .unwrap_or(&self.comparison[0])
    }

    /// The vortex.csv row.
    pub fn row(&self) -> VortexRow {
        let g = self.governing_summary();
        VortexRow {
            stage: self.stage.clone(),
            mode: self.mode,
            frequency_hz: self.frequency_hz,
            reference_height_m: self.reference_height_m,
            diameter_m: self.diameter_m,
            strouhal: self.strouhal,
            critical_speed_m_s: self.critical_speed_m_s,
            mean_speed_m_s: self.mean_speed_m_s,
            speed_ratio: self.speed_ratio,
            reynolds: self.reynolds,
            scruton: self.scruton,
            tip_amplitude_m: g.tip_amplitude_m,
            base_moment_nm: g.base_moment_nm,
            fatigue_cycles: g.fatigue_cycles,
            verdict: self.verdict.to_string(),
        }
    }

    /// The loads.csv rows.
    pub fn load_rows(&self) -> impl Iterator<Item = LoadRow> + '_ {
        self.loads.iter().map(|l| LoadRow {
            stage: self.stage.clone(),
            mode: self.mode,
            z_m: l.z_m,
            inertia_force_n_m: l.line_force_n_m,
            shear_n: l.shear_n,
            moment_nm: l.moment_nm,
            stress_pa: l.stress_pa,
        })
    }
}

impl StageVortex {
    pub fn any_exceeds(&self) -> bool {
        self.modes.iter().any(|m| m.verdict.is_exceeds())
    }
}

impl VortexResults {
    /// True when any stage/mode exceeds a criterion (exit code 1).
    pub fn any_exceeds(&self) -> bool {
        self.stages.iter().any(StageVortex::any_exceeds)
    }

    /// True when no mode was judged (no criteria given; exit code 3).
    pub fn nothing_judged(&self) -> bool {
        self.stages
            .iter()
            .flat_map(|s| &s.modes)
            .all(|m| m.verdict.is_not_judged())
    }

    pub fn vortex_rows(&self) -> Vec<VortexRow> {
        self.stages
            .iter()
            .flat_map(|s| s.modes.iter().map(ModeVortex::row))
            .collect()
    }

    pub fn load_rows(&self) -> Vec<LoadRow> {
        self.stages
            .iter()
            .flat_map(|s| s.modes.iter().flat_map(ModeVortex::load_rows))
            .collect()
    }
}

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
