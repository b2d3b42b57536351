//! The resistance check of one stage along its height: at every mesh node N_Ed (self-weight
//! with gamma_G,inf and gamma_G,sup, both checked, the one giving the smaller M_Rd governs),
//! M_Rd(N_Ed) of the net RC annulus (EN 1992-1-1 6.1), and M_Ed / M_Rd for every design
//! action; plus the fatigue damage of the vertical bars from the vortex moment amplitude
//! (EN 1992-1-1 6.8.4).
//!
//! Actions are generic: a named moment-along-height curve with a load factor and the source
//! of that factor, so further actions (along-wind design moment, vortex combined with
//! along-wind at the critical speed) are one more [`ActionCurve`] each.
//! Units: N, N m, Pa, m.

use serde::Serialize;

use super::annulus::{RcAnnulus, Sector};
use super::axial::self_weight_n;
use super::cracked::CrackedSection;
use super::fatigue::SnCurve;
use super::materials::{Concrete, Steel};
use super::ultimate::RcSection;
use super::ResistanceError;
use crate::case::{Opening, ResistanceSpec};
use crate::modal::StageModel;

/// A characteristic bending-moment curve along the height with its load factor.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ActionCurve {
    /// `along-wind`, `vortex mode N`, `combined mode N` (resistance.csv `action`).
    pub name: String,
    /// Partial factor on the action.
    pub load_factor: f64,
    /// Where the factor comes from (printed in the note).
    pub factor_source: String,
    /// (z_m, characteristic moment N m), z increasing; interpolated linearly to the nodes.
    pub moment_nm: Vec<(f64, f64)>,
}

impl ActionCurve {
    /// |M_k| at height z (linear between points, 0 outside).
    pub fn moment_at(&self, z: f64) -> f64 {
        self.signed_moment_at(z).abs()
    }

    /// The moment at `z` with its sign (the same interpolation as [`Self::moment_at`]).
    pub fn signed_moment_at(&self, z: f64) -> f64 {
        let p = &self.moment_nm;
        if p.is_empty() || z < p[0].0 - 1e-9 || z > p[p.len() - 1].0 + 1e-9 {
            return 0.0;
        }
        let i = p.partition_point(|q| q.0 < z);
        if i == 0 {
            return p[0].1;
        }
        if i >= p.len() {
            return p[p.len() - 1].1;
        }
        let (a, b) = (p[i - 1], p[i]);
        if (b.0 - a.0).abs() < 1e-12 {
            return b.1;
        }
        let t = (z - a.0) / (b.0 - a.0);
        a.1 + t * (b.1 - a.1)
    }
}

/// Vortex cycles of one mode for the fatigue check: the moment amplitude along the height
/// (same curve as the action, characteristic) and the cycle count.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct FatigueAction {
    pub mode: usize,
    pub moment_amplitude_nm: Vec<(f64, f64)>,
    /// Cycles over the stage's duration (EN 1991-1-4 E.1.5.2.6).
    pub cycles: f64,
}

/// One row of resistance.csv (contract columns).
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ResistanceRow {
    pub stage: String,
    pub z_m: f64,
    pub action: String,
    pub axial_force_n: f64,
    pub design_moment_nm: f64,
    pub resistance_moment_nm: f64,
    pub utilisation: f64,
}

/// The section at one node.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct NodeResistance {
    pub z_m: f64,
    /// Characteristic self-weight, N.
    pub self_weight_n: f64,
    /// The governing N_Ed and its gamma_G.
    pub axial_force_n: f64,
    pub gamma_g: f64,
    pub resistance_moment_nm: f64,
}

/// Fatigue of one mode: the worst height.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ModeFatigue {
    pub mode: usize,
    pub cycles: f64,
    pub z_m: f64,
    pub stress_range_pa: f64,
    pub damage: f64,
}

/// The governing point of a stage.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Governing {
    pub z_m: f64,
    pub action: String,
    pub utilisation: f64,
}

/// Everything of one stage.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct StageResistance {
    pub stage: String,
    pub nodes: Vec<NodeResistance>,
    pub actions: Vec<ActionCurve>,
    pub rows: Vec<ResistanceRow>,
    pub governing: Option<Governing>,
    pub fatigue: Vec<ModeFatigue>,
    /// max over the height of the sum over modes of the damage.
    pub damage: f64,
    pub damage_z_m: f64,
}

/// Sectors removed at height `z_m` by the openings there: half-angle asin(width / D_outer)
/// at the section's own outer diameter (the usual idealisation of the trade, as in the
/// beam model's net section, [`crate::section::opening`]).
pub fn sectors_at(openings: &[Opening], z_m: f64, outer_diameter_m: f64) -> Vec<Sector> {
    openings
        .iter()
        .filter(|o| o.from_z_m <= z_m && z_m <= o.to_z_m)
        .map(|o| Sector {
            // Validation keeps every opening narrower than the shell; clamp for safety.
            half_angle_rad: (o.width_m / outer_diameter_m).clamp(0.0, 1.0).asin(),
            azimuth_rad: o.azimuth_rad,
        })
        .collect()
}

/// The RC annulus of node `i` of a stage: its zone's bars, its openings' sectors.
pub fn annulus_at(spec: &ResistanceSpec, model: &StageModel, i: usize) -> RcAnnulus {
    let z = model.z_m[i];
    let zone = spec.zone_at(z);
    RcAnnulus::with_ratios(
        model.outer_diameter_m[i],
        model.wall_m[i],
        zone.outer_ratio,
        zone.inner_ratio,
        zone.outer_cover_m,
        zone.inner_cover_m,
        sectors_at(&spec.openings, z, model.outer_diameter_m[i]),
    )
}

/// M_Rd at every node for the governing gamma_G (pure; no actions needed).
pub fn node_resistances(
    spec: &ResistanceSpec,
    model: &StageModel,
) -> Result<Vec<NodeResistance>, (f64, ResistanceError)> {
    let f = spec.factors;
    let steel = Steel::eurocode(spec.steel_strength_pa, spec.steel_modulus_pa, f.gamma_s);
    let ng = self_weight_n(model);
    let mut out = Vec::with_capacity(ng.len());
    for (i, &n_g) in ng.iter().enumerate() {
        let z = model.z_m[i];
        let concrete = Concrete::eurocode(spec.concrete_strength_at(z), f.gamma_c, f.alpha_cc);
        let sec = RcSection {
            annulus: annulus_at(spec, model, i),
            concrete,
            steel,
        };
        let mut best: Option<NodeResistance> = None;
        let mut gammas = vec![f.gamma_g_inf, f.gamma_g_sup];
        gammas.dedup();
        for g in gammas {
            let n_ed = g * n_g;
            let u = sec.min_moment_resistance(n_ed).map_err(|e| (z, e))?;
            if best.is_none_or(|b| u.moment_nm < b.resistance_moment_nm) {
                best = Some(NodeResistance {
                    z_m: z,
                    self_weight_n: n_g,
                    axial_force_n: n_ed,
                    gamma_g: g,
                    resistance_moment_nm: u.moment_nm,
                });
            }
        }
        out.extend(best);
    }
    Ok(out)
}

/// The stage check: rows per node and action, governing point, fatigue damage.
pub fn check_stage(
    stage: &str,
    spec: &ResistanceSpec,
    model: &StageModel,
    concrete_modulus_pa: f64,
    actions: Vec<ActionCurve>,
    fatigue: &[FatigueAction],
) -> Result<StageResistance, (f64, ResistanceError)> {
    let nodes = node_resistances(spec, model)?;
    let mut rows = Vec::with_capacity(nodes.len() * actions.len());
    let mut governing: Option<Governing> = None;
    for a in &actions {
        for nd in &nodes {
            let m_ed = a.load_factor * a.moment_at(nd.z_m);
            let u = m_ed / nd.resistance_moment_nm;
            if governing.as_ref().is_none_or(|g| u > g.utilisation) {
                governing = Some(Governing {
                    z_m: nd.z_m,
                    action: a.name.clone(),
                    utilisation: u,
                });
            }
            rows.push(ResistanceRow {
                stage: stage.to_string(),
                z_m: nd.z_m,
                action: a.name.clone(),
                axial_force_n: nd.axial_force_n,
                design_moment_nm: m_ed,
                resistance_moment_nm: nd.resistance_moment_nm,
                utilisation: u,
            });
        }
    }
    // Fatigue: N from the characteristic self-weight (gamma = 1, permanent action); the
    // fatigue partial factors of [design] (EN 1992-1-1 6.8.4, Table 2.1N).
    let f = spec.factors;
    let curve = SnCurve::STRAIGHT_BARS;
    let mut per_node = vec![0.0; nodes.len()];
    let mut modes = Vec::new();
    for fa in fatigue {
        let amp = ActionCurve {
            name: String::new(),
            load_factor: 1.0,
            factor_source: String::new(),
            moment_nm: fa.moment_amplitude_nm.clone(),
        };
        let mut worst = ModeFatigue {
            mode: fa.mode,
            cycles: fa.cycles,
            z_m: 0.0,
            stress_range_pa: 0.0,
            damage: 0.0,
        };
        for (i, nd) in nodes.iter().enumerate() {
            let m = amp.moment_at(nd.z_m);
            if m <= 0.0 {
                continue;
            }
            let sec = CrackedSection {
                annulus: annulus_at(spec, model, i),
                concrete_modulus_pa,
                steel_modulus_pa: spec.steel_modulus_pa,
            };
            let range = sec
                .max_bar_stress_range_pa(nd.self_weight_n, m)
                .ok_or((nd.z_m, ResistanceError::NoElasticState { moment_nm: m }))?;
            let d = curve.damage(range, fa.cycles, f.gamma_f_fat, f.gamma_s_fat);
            per_node[i] += d;
            if d > worst.damage || (worst.damage == 0.0 && range > worst.stress_range_pa) {
                worst.z_m = nd.z_m;
                worst.stress_range_pa = range;
                worst.damage = d;
            }
        }
        modes.push(worst);
    }
    let (k, damage) = per_node
        .iter()
        .copied()
        .enumerate()
        .fold((0, 0.0), |acc, (i, d)| if d > acc.1 { (i, d) } else { acc });
    Ok(StageResistance {
        stage: stage.to_string(),
        damage_z_m: nodes.get(k).map_or(0.0, |n| n.z_m),
        nodes,
        actions,
        rows,
        governing,
        fatigue: modes,
        damage,
    })
}
