//! Section 2 of the note, the shell as drawn: wall steps, concrete zones, openings (with
//! the net-section assumption stated), point-mass and foundation rotary inertia.

use std::fmt::Write as _;

use super::markup::{heads, html_escape, n, num, opt, sci, t, Table};
use crate::case::Case;

/// Wall steps, concrete zones and openings, after the station table.
pub(super) fn write_shell(out: &mut String, c: &Case) {
    let steps: Vec<String> = c
        .shell
        .stations
        .windows(2)
        .filter(|w| w[0].z_m == w[1].z_m)
        .map(|w| {
            format!(
                "z = {} m: D {} m / t {} m below, D {} m / t {} m above",
                num(w[0].z_m, 2),
                num(w[0].outer_diameter_m, 3),
                num(w[0].wall_m, 3),
                num(w[1].outer_diameter_m, 3),
                num(w[1].wall_m, 3)
            )
        })
        .collect();
    if !steps.is_empty() {
        let _ = writeln!(
            out,
            "<p>Wall steps (two stations at one height; the model has a node there and each \
             side uses its own section): {}.</p>",
            html_escape(&steps.join("; "))
        );
    }
    if !c.shell.zones.is_empty() {
        let _ = writeln!(
            out,
            "<p>Concrete zones (elsewhere the values above hold; f<sub>ck</sub> is stored for \
             the reinforced-concrete resistance and not used by the modal model):</p>"
        );
        Table {
            head: heads(&[
                "zone",
                "from z (m)",
                "to z (m)",
                "E (GPa)",
                "ρ (kg/m³)",
                "ν (-)",
                "f_ck (MPa)",
            ]),
            rows: c
                .shell
                .zones
                .iter()
                .enumerate()
                .map(|(i, z)| {
                    vec![
                        n((i + 1).to_string()),
                        n(num(z.from_z_m, 2)),
                        n(num(z.to_z_m, 2)),
                        n(opt(z.elastic_modulus_pa.map(|e| e / 1e9), 2)),
                        n(opt(z.density_kg_m3, 0)),
                        n(opt(z.poisson_ratio, 3)),
                        n(opt(z.characteristic_strength_pa.map(|f| f / 1e6), 1)),
                    ]
                })
                .collect(),
        }
        .write(out);
    }
    if !c.shell.openings.is_empty() {
        let _ = writeln!(
            out,
            "<p>Openings: each removes the annular sector of half-angle β = asin(w / D) at \
             every height of its range (D = outer diameter there). Area, mass and second \
             moments of the net section are exact integrals over the remaining annular \
             sectors, about the net centroid. The beam model bends in one plane and uses the \
             <strong>smaller principal second moment</strong> of the net section: conservative \
             for the frequencies and the stresses. Stresses at opening levels use the net \
             section's extreme fibre measured from that neutral axis. The shear stiffness \
             there is Cowper's coefficient of the full annulus times the net area (our \
             assumption; shear is a correction). sections.csv lists the net values.</p>"
        );
        Table {
            head: heads(&[
                "opening",
                "from z (m)",
                "to z (m)",
                "width w (m)",
                "azimuth (°)",
            ]),
            rows: c
                .shell
                .openings
                .iter()
                .map(|o| {
                    vec![
                        t(&o.label),
                        n(num(o.from_z_m, 2)),
                        n(num(o.to_z_m, 2)),
                        n(num(o.width_m, 3)),
                        n(num(o.azimuth_rad.to_degrees(), 1)),
                    ]
                })
                .collect(),
        }
        .write(out);
    }
}

/// Rotary inertias of point masses and the foundation's mass and inertia, after the
/// point-mass table.
pub(super) fn write_inertias(out: &mut String, c: &Case) {
    let rotary: Vec<String> = c
        .point_masses
        .iter()
        .filter(|p| p.rotary_inertia_kg_m2 > 0.0)
        .map(|p| format!("{}: {} kg m²", p.label, sci(p.rotary_inertia_kg_m2)))
        .collect();
    if !rotary.is_empty() {
        let _ = writeln!(
            out,
            "<p>Rotary inertia of point masses (about a horizontal axis through the mass; in \
             the modes, not in the EN 1991-1-4 E.1.4 inertia loads, which are \
             translational): {}.</p>",
            html_escape(&rotary.join("; "))
        );
    }
    let b = c.base_inertia;
    if b.mass_kg > 0.0 || b.rotary_inertia_kg_m2 > 0.0 {
        let lateral = c.base.and_then(|s| s.lateral_n_per_m).is_some();
        let rotational = c.base.and_then(|s| s.rotational_nm_per_rad).is_some();
        let used = |on: bool| {
            if on {
                ""
            } else {
                " (ignored: rigid in that direction)"
            }
        };
        let _ = writeln!(
            out,
            "<p>Foundation inertia, moving with the springs: mass {} kg{}; rotary inertia \
             about the base {} kg m²{}.</p>",
            sci(b.mass_kg),
            used(lateral || b.mass_kg == 0.0),
            sci(b.rotary_inertia_kg_m2),
            used(rotational || b.rotary_inertia_kg_m2 == 0.0)
        );
    }
}
