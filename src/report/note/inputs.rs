//! Section 2 of the note: the inputs as validated (SI units; heads name the unit).

use std::fmt::Write as _;

use super::markup::{heads, html_escape, n, num, sci, t, Table};
use super::method::method_name;
use crate::case::{BeamTheory, LiningMass, Profile};
use crate::report::ReportInput;

pub(super) fn write(out: &mut String, input: &ReportInput) {
    let c = input.case;
    out.push_str("<h3>2.1 Shell</h3>\n");
    Table {
        head: heads(&["quantity", "value"]),
        rows: vec![
            vec![
                t("elastic modulus E (GPa)"),
                n(num(c.shell.elastic_modulus_pa / 1e9, 2)),
            ],
            vec![t("density ρ (kg/m³)"), n(num(c.shell.density_kg_m3, 0))],
            vec![t("Poisson's ratio ν (-)"), n(num(c.shell.poisson_ratio, 3))],
            vec![
                t("beam theory"),
                t(match c.shell.beam {
                    BeamTheory::Timoshenko => {
                        "Timoshenko (shear deformation, Cowper's coefficient, rotary inertia)"
                    }
                    BeamTheory::EulerBernoulli => "Euler-Bernoulli (bending only)",
                }),
            ],
            vec![t("height (m)"), n(num(c.shell.height_m(), 2))],
        ],
    }
    .write(out);
    Table {
        head: heads(&["station", "z (m)", "outer diameter b (m)", "wall t (m)"]),
        rows: crate::report::station_table::shown_stations(&c.shell.stations)
            .into_iter()
            .map(|i| (i, &c.shell.stations[i]))
            .map(|(i, s)| {
                vec![
                    n((i + 1).to_string()),
                    n(num(s.z_m, 2)),
                    n(num(s.outer_diameter_m, 3)),
                    n(num(s.wall_m, 3)),
                ]
            })
            .collect(),
    }
    .write(out);
    if let Some(note) = crate::report::station_table::condensed_note(&c.shell.stations) {
        let _ = writeln!(out, "<p>{}</p>", html_escape(&note));
    }
    super::drawn::write_shell(out, c);
    out.push_str("<h3>2.2 Lining, platforms and foundation</h3>\n");
    if c.linings.is_empty() {
        out.push_str("<p>No lining.</p>\n");
    } else {
        Table {
            head: heads(&["lining zone", "from z (m)", "to z (m)", "mass given as"]),
            rows: c
                .linings
                .iter()
                .enumerate()
                .map(|(i, l)| {
                    let how = match l.mass {
                        LiningMass::PerLength {
                            mass_per_length_kg_m,
                        } => format!("{mass_per_length_kg_m:.1} kg/m of height"),
                        LiningMass::PerArea {
                            mass_per_area_kg_m2,
                        } => format!("{mass_per_area_kg_m2:.1} kg/m2 of the shell's inner face"),
                        LiningMass::Layer {
                            thickness_m,
                            density_kg_m3,
                            gap_m,
                        } => format!(
                            "layer {thickness_m:.3} m thick, {density_kg_m3:.0} kg/m3, \
                             gap {gap_m:.3} m"
                        ),
                    };
                    vec![
                        n((i + 1).to_string()),
                        n(num(l.from_z_m, 2)),
                        n(num(l.to_z_m, 2)),
                        t(how),
                    ]
                })
                .collect(),
        }
        .write(out);
    }
    if !c.point_masses.is_empty() {
        Table {
            head: heads(&["point mass", "z (m)", "mass (kg)", "present in stages"]),
            rows: c
                .point_masses
                .iter()
                .map(|p| {
                    vec![
                        t(&p.label),
                        n(num(p.z_m, 2)),
                        n(num(p.mass_kg, 0)),
                        t(p.stages
                            .as_ref()
                            .map_or("every stage".into(), |s| s.join(", "))),
                    ]
                })
                .collect(),
        }
        .write(out);
    }
    let base = match &c.base {
        None => "fixed base".to_string(),
        Some(b) => format!(
            "rotational spring {}; lateral spring {}",
            b.rotational_nm_per_rad
                .map_or("rigid".into(), |k| format!("{:.1} GN m/rad", k / 1e9)),
            b.lateral_n_per_m
                .map_or("rigid".into(), |k| format!("{:.1} MN/m", k / 1e6))
        ),
    };
    let _ = writeln!(out, "<p>Foundation: {}.</p>", html_escape(&base));
    super::drawn::write_inertias(out, c);
    out.push_str("<h3>2.3 Construction stages</h3>\n");
    Table {
        head: heads(&[
            "stage",
            "lining installed",
            "stiffness factor",
            "shell top (m)",
            "duration (years)",
            "return period of the wind (years)",
            "log decrement δ_s (-)",
        ]),
        rows: c
            .stages
            .iter()
            .map(|s| {
                let period = crate::wind::probability::stage_return_period_years(s);
                vec![
                    t(&s.name),
                    t(if s.lining { "yes" } else { "no" }),
                    n(num(s.stiffness_factor, 2)),
                    n(num(s.height_m(&c.shell), 2)),
                    t(s.duration_years.map_or("in service".into(), |d| num(d, 3))),
                    t(match (s.return_period_years, s.duration_years) {
                        (Some(_), _) => num(period, 1),
                        (None, None) => format!("{} (default, in service)", num(period, 0)),
                        (None, Some(_)) => {
                            format!("{} (EN 1991-1-6 Table 3.1)", num(period, 0))
                        }
                    }),
                    t(s.log_decrement.map_or(
                        format!("{} (vortex)", num(c.vortex.log_decrement, 4)),
                        |d| num(d, 4),
                    )),
                ]
            })
            .collect(),
    }
    .write(out);
    out.push_str("<h3>2.4 Wind and vortex-shedding settings</h3>\n");
    let profile = match input.vortex.wind.profile {
        Profile::Power { exponent } => format!("power law, exponent {exponent:.3}"),
        Profile::Log {
            roughness_m,
            z_min_m,
        } => format!(
            "logarithmic (EN 1991-1-4 4.3), z0 = {roughness_m:.3} m, z_min = {z_min_m:.1} m"
        ),
    };
    let mut rows = vec![
        vec![
            t("mean wind speed at reference height, 50-year (m/s)"),
            n(num(input.vortex.wind.reference_speed_m_s, 2)),
        ],
        vec![
            t("reference height (m)"),
            n(num(input.vortex.wind.reference_height_m, 1)),
        ],
        vec![t("profile"), t(profile)],
        vec![
            t("air density ρ (kg/m³)"),
            n(num(input.vortex.wind.air_density_kg_m3, 3)),
        ],
        vec![
            t("kinematic viscosity ν (m²/s)"),
            n(sci(input.vortex.wind.kinematic_viscosity_m2_s)),
        ],
        vec![
            t("c_prob shape parameter K (-), EN 1991-1-4 (4.2)"),
            n(num(input.vortex.wind.c_prob_k, 3)),
        ],
        vec![
            t("c_prob exponent n (-), EN 1991-1-4 (4.2)"),
            n(num(input.vortex.wind.c_prob_n, 3)),
        ],
        vec![t("governing method"), t(method_name(c.vortex.method))],
        vec![
            t("Strouhal number (-)"),
            t(c.vortex
                .strouhal
                .map_or("method default".into(), |s| num(s, 3))),
        ],
        vec![
            t("structural log decrement δ_s (-)"),
            n(num(c.vortex.log_decrement, 4)),
        ],
        vec![
            t("GB 50009 comparison: damping ratio ζ (-)"),
            n(num(crate::wind::damping_ratio(c), 4)),
        ],
        vec![t("modes checked"), n(c.vortex.modes.to_string())],
        vec![
            t("design life (years)"),
            n(num(c.vortex.design_life_years, 0)),
        ],
    ];
    if let Some(g) = &c.vortex.group {
        rows.push(vec![
            t("group of stacks"),
            t(format!("{} in line, spacing {:.1} m", g.count, g.spacing_m)),
        ]);
    }
    if let Some(a) = &c.along_wind {
        rows.push(vec![
            t("along-wind (EN 1991-1-4): terrain category"),
            t(a.terrain.key()),
        ]);
        rows.push(vec![
            t("along-wind: basic speed v_b,0 (m/s)"),
            n(num(a.basic_speed_m_s, 2)),
        ]);
        rows.push(vec![
            t("along-wind: c_dir, c_season, c_o (-)"),
            t(format!(
                "{}, {}, {}",
                num(a.c_dir, 2),
                num(a.c_season, 2),
                num(a.orography_factor, 2)
            )),
        ]);
        rows.push(vec![
            t("along-wind: surface roughness k (mm)"),
            n(num(a.surface_roughness_m * 1e3, 3)),
        ]);
        rows.push(vec![
            t("along-wind: force coefficient c_f (-)"),
            t(a.force_coefficient.map_or("EN 1991-1-4 7.9.2".into(), |v| {
                format!("{} (user)", num(v, 3))
            })),
        ]);
    }
    let cr = &c.criteria;
    rows.push(vec![
        t("criterion: tip amplitude (m)"),
        t(cr.tip_amplitude_m.map_or("-".into(), |v| num(v, 3))),
    ]);
    rows.push(vec![
        t("criterion: tip amplitude / top diameter (-)"),
        t(cr.tip_amplitude_per_diameter
            .map_or("-".into(), |v| num(v, 3))),
    ]);
    rows.push(vec![
        t("criterion: extreme-fibre stress (MPa)"),
        t(cr.stress_pa.map_or("-".into(), |v| num(v / 1e6, 2))),
    ]);
    Table {
        head: heads(&["setting", "value"]),
        rows,
    }
    .write(out);
}
