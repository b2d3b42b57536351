//! Validation of the `[[lining]]` tables: extent, layers and their mass per area.
//!
//! Units and sources as in the parent module.

use super::*;

pub(super) fn check_lining(
    c: &mut Checker,
    i: usize,
    l: &RawLining,
    shell: Option<&Shell>,
) -> Option<Lining> {
    let before = c.issues.len();
    let p = format!("lining[{i}]");
    let from_path = format!("{p}.from_z_m");
    let to_path = format!("{p}.to_z_m");
    let height_m = shell.map(Shell::height_m);
    let from_ok = c.finite(&from_path, l.from_z_m);
    let to_ok = c.finite(&to_path, l.to_z_m);
    if from_ok && l.from_z_m < 0.0 {
        c.fail(
            &from_path,
            l.from_z_m,
            "below the base of the shell (z = 0)",
        );
    }
    if to_ok {
        if let Some(h) = height_m {
            if l.to_z_m > h {
                c.fail(
                    &to_path,
                    l.to_z_m,
                    format!("above the top of the shell ({} m)", num(h)),
                );
            }
        }
    }
    if from_ok && to_ok && l.from_z_m >= l.to_z_m {
        c.fail(
            &to_path,
            l.to_z_m,
            format!("must be above from_z_m ({} m)", num(l.from_z_m)),
        );
    }

    let layer_keys: Vec<&str> = [
        ("thickness_m", l.thickness_m),
        ("density_kg_m3", l.density_kg_m3),
        ("gap_m", l.gap_m),
    ]
    .iter()
    .filter(|(_, v)| v.is_some())
    .map(|(k, _)| *k)
    .collect();
    let mut forms: Vec<String> = Vec::new();
    if l.mass_per_length_kg_m.is_some() {
        forms.push("mass_per_length_kg_m".into());
    }
    if l.mass_per_area_kg_m2.is_some() {
        forms.push("mass_per_area_kg_m2".into());
    }
    if !layer_keys.is_empty() {
        forms.push(format!("layer ({})", layer_keys.join(", ")));
    }
    let mass = match forms.len() {
        0 => {
            c.key(
                &p,
                "no mass given; give exactly one of mass_per_length_kg_m, mass_per_area_kg_m2 or \
                 thickness_m + density_kg_m3 (+ gap_m)",
            );
            None
        }
        1 => {
            if let Some(v) = l.mass_per_length_kg_m {
                c.positive(&format!("{p}.mass_per_length_kg_m"), v)
                    .then_some(LiningMass::PerLength {
                        mass_per_length_kg_m: v,
                    })
            } else if let Some(v) = l.mass_per_area_kg_m2 {
                c.positive(&format!("{p}.mass_per_area_kg_m2"), v)
                    .then_some(LiningMass::PerArea {
                        mass_per_area_kg_m2: v,
                    })
            } else {
                check_layer(c, &p, l)
            }
        }
        _ => {
            c.key(
                &p,
                format!(
                    "{} given together; give exactly one mass form",
                    forms.join(" and ")
                ),
            );
            None
        }
    };

    let lining = Lining {
        from_z_m: l.from_z_m,
        to_z_m: l.to_z_m,
        mass: mass?,
    };
    if c.issues.len() != before {
        return None;
    }
    if let (Some(shell), LiningMass::Layer { thickness_m, .. }) = (shell, lining.mass) {
        // Geometry is linear between stations, so the smallest clearance is at a zone end or
        // a station inside the zone.
        let heights = std::iter::once(lining.from_z_m)
            .chain(
                shell
                    .stations
                    .iter()
                    .map(|s| s.z_m)
                    .filter(|&z| z > lining.from_z_m && z < lining.to_z_m),
            )
            .chain(std::iter::once(lining.to_z_m));
        for z in heights {
            let (d, t) = shell.geometry_at(z);
            if lining.mass_per_length_kg_m(d, t) <= 0.0 {
                let gap = l.gap_m.unwrap_or(0.0);
                c.fail(
                    format!("{p}.thickness_m"),
                    thickness_m,
                    format!(
                        "the layer does not fit inside the shell at z = {} m: D - 2 t - 2 gap - \
                         t_l = {:.3} m, must be > 0",
                        num(z),
                        d - 2.0 * t - 2.0 * gap - thickness_m
                    ),
                );
                return None;
            }
        }
    }
    Some(lining)
}

pub(super) fn check_layer(c: &mut Checker, p: &str, l: &RawLining) -> Option<LiningMass> {
    let thickness = match l.thickness_m {
        Some(t) => c.positive(&format!("{p}.thickness_m"), t).then_some(t),
        None => {
            c.key(
                format!("{p}.thickness_m"),
                "missing; a layer lining needs thickness_m and density_kg_m3",
            );
            None
        }
    };
    let density = match l.density_kg_m3 {
        Some(r) => c.positive(&format!("{p}.density_kg_m3"), r).then_some(r),
        None => {
            c.key(
                format!("{p}.density_kg_m3"),
                "missing; a layer lining needs thickness_m and density_kg_m3",
            );
            None
        }
    };
    let gap = l.gap_m.unwrap_or(0.0);
    let gap_ok = c.non_negative(&format!("{p}.gap_m"), gap);
    match (thickness, density, gap_ok) {
        (Some(thickness_m), Some(density_kg_m3), true) => Some(LiningMass::Layer {
            thickness_m,
            density_kg_m3,
            gap_m: gap,
        }),
        _ => None,
    }
}
