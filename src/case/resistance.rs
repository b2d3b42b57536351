//! Inputs of the reinforced-concrete shell checks (EN 1992-1-1, EN 1990): the vertical
//! reinforcement zones, f_ck and f_yk, the partial factors of `[design]`. Units SI (Pa, m).

use serde::Serialize;

use super::{ConcreteZone, Opening};

/// Inputs of the RC shell resistance checks (EN 1992-1-1).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ResistanceSpec {
    /// f_ck of `[shell]`, Pa (12-90 MPa, EN 1992-1-1 Table 3.1).
    pub concrete_strength_pa: f64,
    /// f_yk of the vertical bars, Pa.
    pub steel_strength_pa: f64,
    /// E_s, Pa.
    pub steel_modulus_pa: f64,
    /// Zones sorted by height, contiguous, covering the whole shell.
    pub zones: Vec<ReinforcementZone>,
    pub factors: DesignFactors,
    /// The shell's concrete zones (`[[shell.zone]]`), for their own f_ck.
    pub concrete_zones: Vec<ConcreteZone>,
    /// The shell's openings (`[[opening]]`): their sectors are removed from concrete and
    /// steel.
    pub openings: Vec<Opening>,
}

impl ResistanceSpec {
    /// f_ck at height `z_m`, Pa: the zone's own value where a `[[shell.zone]]` gives one
    /// (the section just below a zone limit belongs to the zone below), else `[shell]`'s.
    pub fn concrete_strength_at(&self, z_m: f64) -> f64 {
        self.concrete_zones
            .iter()
            .find(|zn| z_m >= zn.from_z_m && z_m <= zn.to_z_m)
            .and_then(|zn| zn.characteristic_strength_pa)
            .unwrap_or(self.concrete_strength_pa)
    }

    /// The zone that holds the section just below `z_m` (the first zone at the base).
    pub fn zone_at(&self, z_m: f64) -> &ReinforcementZone {
        self.zones
            .iter()
            .find(|zn| z_m > zn.from_z_m && z_m <= zn.to_z_m)
            .unwrap_or(&self.zones[0])
    }
}

/// `[[reinforcement.zone]]`: vertical steel of the two layers over a height range.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct ReinforcementZone {
    pub from_z_m: f64,
    pub to_z_m: f64,
    /// Steel area of the outer layer / gross concrete area (0..=0.08).
    pub outer_ratio: f64,
    /// Steel area of the inner layer / gross concrete area (0..=0.08).
    pub inner_ratio: f64,
    /// Outer face to bar centres, m.
    pub outer_cover_m: f64,
    /// Inner face to bar centres, m.
    pub inner_cover_m: f64,
}

/// `[design]` partial factors; defaults are the recommended values of EN 1992-1-1 2.4.2.4
/// (Table 2.1N, quoted in public copies) and 3.1.6, and EN 1990 Table A1.2(B) (public
/// implementations; see data/reference/README.md; a National Annex may override them); the
/// fatigue factors gamma_F,fat (EN 1992-1-1 6.8.4 (1) note, recommended 1.0; public copy,
/// French edition) and gamma_S,fat (EN 1992-1-1 2.4.2.4 (1) note: the persistent value of
/// Table 2.1N, 1.15, public quotation of the text).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct DesignFactors {
    pub gamma_c: f64,
    pub gamma_s: f64,
    pub alpha_cc: f64,
    pub gamma_g_sup: f64,
    pub gamma_g_inf: f64,
    pub gamma_q: f64,
    /// gamma_F,fat: multiplies the applied stress range in the fatigue check.
    pub gamma_f_fat: f64,
    /// gamma_S,fat: divides the reference range Delta sigma_Rsk of the S-N curve.
    pub gamma_s_fat: f64,
}

impl Default for DesignFactors {
    fn default() -> Self {
        DesignFactors {
            gamma_c: 1.5,
            gamma_s: 1.15,
            alpha_cc: 1.0,
            gamma_g_sup: 1.35,
            gamma_g_inf: 1.0,
            gamma_q: 1.5,
            gamma_f_fat: 1.0,
            gamma_s_fat: 1.15,
        }
    }
}
