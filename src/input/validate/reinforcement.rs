//! Validation of `[reinforcement]`, `[[reinforcement.zone]]` and `[shell]
//! characteristic_strength_mpa` into a [`ResistanceSpec`].
//!
//! Rules (errors, each `path = value: rule`):
//! - `shell.characteristic_strength_mpa` (f_ck) 12-90 MPa: the classes of EN 1992-1-1 Table 3.1
//!   (public copy); required when `[reinforcement]` is given.
//! - `reinforcement.characteristic_strength_mpa` (f_yk) 400-600 MPa: EN 1992-1-1 3.2.2 (3)P
//!   (from memory; the same range is stated in the open-source xc package's EC2 steel module).
//! - `reinforcement.elastic_modulus_gpa` default 200 (EN 1992-1-1 3.2.7 (4), as restated in a
//!   public EC2 code-rule dossier, data/reference/README.md),
//!   150-250 accepted (common practice).
//! - Ratios 0-0.08 per layer: 0.08 of the concrete area is the most EN 1992-1-1 allows even at
//!   laps (9.5.2 (3), from memory); a zone needs some steel.
//! - Covers > 0 and outer + inner cover < the thinnest wall in the zone (bars inside the wall).
//! - Zones: from < to, sorted, not overlapping, together covering 0 .. shell height.

use super::*;
use crate::case::{DesignFactors, ReinforcementZone, ResistanceSpec};
use crate::input::raw::RawReinforcement;

/// f_ck range, MPa (Table 3.1 C12 .. C90).
pub const CONCRETE_STRENGTH_MPA: (f64, f64) = (12.0, 90.0);
/// f_yk range, MPa (3.2.2 (3)P).
pub const STEEL_STRENGTH_MPA: (f64, f64) = (400.0, 600.0);
/// E_s default and accepted range, GPa.
pub const DEFAULT_STEEL_MODULUS_GPA: f64 = 200.0;
pub const STEEL_MODULUS_GPA: (f64, f64) = (150.0, 250.0);
/// Largest steel ratio of one layer.
pub const MAX_RATIO: f64 = 0.08;

fn range(c: &mut Checker, path: &str, v: f64, (lo, hi): (f64, f64), unit: &str) -> bool {
    c.finite(path, v)
        && ((lo..=hi).contains(&v) || c.fail(path, v, format!("must be {lo} to {hi} {unit}")))
}

pub(super) fn check_resistance(
    c: &mut Checker,
    raw: &RawCase,
    shell: Option<&Shell>,
    factors: DesignFactors,
) -> Option<ResistanceSpec> {
    let fck = raw.shell.characteristic_strength_mpa;
    if let Some(v) = fck {
        range(
            c,
            "shell.characteristic_strength_mpa",
            v,
            CONCRETE_STRENGTH_MPA,
            "MPa",
        );
    }
    let r: &RawReinforcement = raw.reinforcement.as_ref()?;
    let before = c.issues.len();
    if fck.is_none() {
        c.key(
            "shell.characteristic_strength_mpa",
            "missing: f_ck is needed when [reinforcement] is given (EN 1992-1-1 Table 3.1, 12 \
             to 90 MPa)",
        );
    }
    range(
        c,
        "reinforcement.characteristic_strength_mpa",
        r.characteristic_strength_mpa,
        STEEL_STRENGTH_MPA,
        "MPa",
    );
    let es = r.elastic_modulus_gpa.unwrap_or(DEFAULT_STEEL_MODULUS_GPA);
    range(
        c,
        "reinforcement.elastic_modulus_gpa",
        es,
        STEEL_MODULUS_GPA,
        "GPa",
    );
    if r.zone.is_empty() {
        c.key(
            "reinforcement.zone",
            "missing: give at least one [[reinforcement.zone]] covering the shell",
        );
    }
    for (i, z) in r.zone.iter().enumerate() {
        let p = format!("reinforcement.zone[{i}]");
        let from_ok = c.finite(&format!("{p}.from_z_m"), z.from_z_m);
        let to_ok = c.finite(&format!("{p}.to_z_m"), z.to_z_m);
        if from_ok && to_ok && z.to_z_m <= z.from_z_m {
            c.fail(
                format!("{p}.to_z_m"),
                z.to_z_m,
                format!("must be above from_z_m ({})", num(z.from_z_m)),
            );
        }
        for (key, v) in [
            ("outer_ratio", z.outer_ratio),
            ("inner_ratio", z.inner_ratio),
        ] {
            range(
                c,
                &format!("{p}.{key}"),
                v,
                (0.0, MAX_RATIO),
                "(steel area / concrete area)",
            );
        }
        if z.outer_ratio == 0.0 && z.inner_ratio == 0.0 {
            c.fail(
                format!("{p}.outer_ratio"),
                0.0,
                "a zone needs steel: outer_ratio and inner_ratio are both 0",
            );
        }
        let oc = c.positive(&format!("{p}.outer_cover_m"), z.outer_cover_m);
        let ic = c.positive(&format!("{p}.inner_cover_m"), z.inner_cover_m);
        if let (true, true, true, true, Some(s)) = (oc, ic, from_ok, to_ok, shell) {
            // Thinnest wall over the zone: walls vary linearly between stations, so the
            // minimum is at a zone end or a station inside it.
            let mut zs: Vec<f64> = vec![z.from_z_m, z.to_z_m];
            zs.extend(
                s.stations
                    .iter()
                    .map(|st| st.z_m)
                    .filter(|&h| h > z.from_z_m && h < z.to_z_m),
            );
            let (zmin, tmin) = zs
                .iter()
                .map(|&h| (h, s.geometry_at(h.clamp(0.0, s.height_m())).1))
                .min_by(|a, b| a.1.total_cmp(&b.1))
                .unwrap_or((0.0, f64::INFINITY));
            let both = z.outer_cover_m + z.inner_cover_m;
            if both >= tmin {
                c.fail(
                    format!("{p}.outer_cover_m"),
                    z.outer_cover_m,
                    format!(
                        "outer + inner cover ({} m) must be less than the wall ({} m at z = {} m)",
                        num((both * 1e9).round() / 1e9),
                        num(tmin),
                        num(zmin)
                    ),
                );
            }
        }
    }
    // Coverage of the shell height by the zones, in order.
    if let (Some(s), false) = (shell, r.zone.is_empty()) {
        let mut zones: Vec<_> = r.zone.iter().collect();
        zones.sort_by(|a, b| a.from_z_m.total_cmp(&b.from_z_m));
        let h = s.height_m();
        let tol = 1e-9 * h.max(1.0);
        let mut reach = 0.0;
        for z in &zones {
            if z.from_z_m > reach + tol {
                c.key(
                    "reinforcement.zone",
                    format!(
                        "the zones leave {} to {} m without reinforcement; they must cover \
                         the shell from 0 to {} m",
                        num(reach),
                        num(z.from_z_m),
                        num(h)
                    ),
                );
            } else if z.from_z_m < reach - tol {
                c.key(
                    "reinforcement.zone",
                    format!(
                        "zones overlap between {} and {} m",
                        num(z.from_z_m),
                        num(reach.min(z.to_z_m))
                    ),
                );
            }
            reach = f64::max(reach, z.to_z_m);
        }
        if reach < h - tol {
            c.key(
                "reinforcement.zone",
                format!(
                    "the zones end at {} m, below the top of the shell ({} m)",
                    num(reach),
                    num(h)
                ),
            );
        }
    }
    if c.issues.len() != before {
        return None;
    }
    let mut zones: Vec<ReinforcementZone> = r
        .zone
        .iter()
        .map(|z| ReinforcementZone {
            from_z_m: z.from_z_m,
            to_z_m: z.to_z_m,
            outer_ratio: z.outer_ratio,
            inner_ratio: z.inner_ratio,
            outer_cover_m: z.outer_cover_m,
            inner_cover_m: z.inner_cover_m,
        })
        .collect();
    zones.sort_by(|a, b| a.from_z_m.total_cmp(&b.from_z_m));
    Some(ResistanceSpec {
        concrete_strength_pa: fck? * 1e6,
        steel_strength_pa: r.characteristic_strength_mpa * 1e6,
        steel_modulus_pa: es * 1e9,
        zones,
        factors,
        concrete_zones: shell.map(|s| s.zones.clone()).unwrap_or_default(),
        openings: shell.map(|s| s.openings.clone()).unwrap_or_default(),
    })
}
