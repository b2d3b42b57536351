//! The result types of the vortex-shedding checks: per case, stage and mode, with every
//! intermediate value of each method (EN 1991-1-4 Annex E approaches 1 and 2, GB 50009 App.
//! H), and their table rows. Units SI (m, m/s, Pa, N m, Hz).

use serde::Serialize;

use super::*;

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
