//! Validation of the `[shell]` section and its station table (inline or CSV): diameters,
//! walls, heights (two stations at one height are a wall step, three an error), materials.
//! Concrete zones are checked in `zone`, openings in `opening`.
//!
//! Units and sources as in the parent module.

use super::*;

/// `[shell]` and its stations; `None` when anything in it is wrong.
pub(super) fn check_shell(
    c: &mut Checker,
    raw: &RawCase,
    csv: Option<&CsvStations>,
) -> Option<Shell> {
    let before = c.issues.len();
    let s = &raw.shell;
    let e_path = "shell.elastic_modulus_gpa";
    let e = s.elastic_modulus_gpa;
    if c.positive(e_path, e) {
        if e > 1000.0 {
            c.fail(e_path, e, "looks like Pa or MPa; give E in GPa (e.g. 32.0)");
        } else if e < 1.0 {
            c.fail(
                e_path,
                e,
                "below 1 GPa: looks like the wrong unit; give E in GPa (e.g. 32.0)",
            );
        }
    }
    let rho_path = "shell.density_kg_m3";
    if c.positive(rho_path, s.density_kg_m3) && !(500.0..=10000.0).contains(&s.density_kg_m3) {
        c.fail(
            rho_path,
            s.density_kg_m3,
            "outside 500-10000 kg/m3: looks like the wrong unit; give kg/m3 (e.g. 2500.0)",
        );
    }
    let nu = s.poisson_ratio.unwrap_or(DEFAULT_POISSON_RATIO);
    c.poisson("shell.poisson_ratio", nu);

    let rows: Option<Vec<(Place, RawStation)>> = match (&s.stations, &s.stations_csv, csv) {
        (Some(_), Some(_), _) => {
            c.key(
                "shell",
                "stations and stations_csv given together; give only one",
            );
            None
        }
        (None, None, _) => {
            c.key(
                "shell.stations",
                "missing; give stations = [{ z_m = ..., outer_diameter_m = ..., wall_m = ... }, \
                 ...] or stations_csv = \"file.csv\"",
            );
            None
        }
        (Some(list), None, _) => Some(
            list.iter()
                .enumerate()
                .map(|(i, st)| (Place::Inline(i), *st))
                .collect(),
        ),
        (None, Some(_), Some(csv)) => Some(
            csv.rows
                .iter()
                .map(|r| {
                    (
                        Place::Csv {
                            label: &csv.label,
                            line: r.line,
                        },
                        r.station,
                    )
                })
                .collect(),
        ),
        (None, Some(name), None) => {
            c.key(
                "shell.stations_csv",
                format!("the file \"{name}\" was not read"),
            );
            None
        }
    };
    let rows = rows?;
    check_stations(c, &rows, s.stations_csv.as_deref());

    (c.issues.len() == before).then(|| Shell {
        elastic_modulus_pa: e * 1e9,
        density_kg_m3: s.density_kg_m3,
        poisson_ratio: nu,
        beam: match s.beam.unwrap_or(RawBeam::Timoshenko) {
            RawBeam::Timoshenko => BeamTheory::Timoshenko,
            RawBeam::EulerBernoulli => BeamTheory::EulerBernoulli,
        },
        stations: rows
            .iter()
            .map(|(_, r)| Station {
                z_m: r.z_m,
                outer_diameter_m: r.outer_diameter_m,
                wall_m: r.wall_m,
            })
            .collect(),
        zones: Vec::new(),
        openings: Vec::new(),
    })
}

pub(super) fn check_stations(
    c: &mut Checker,
    rows: &[(Place, RawStation)],
    csv_name: Option<&str>,
) {
    let whole = csv_name.unwrap_or("shell.stations");
    if rows.len() < 2 {
        c.key(
            whole,
            format!(
                "{} station(s) given; at least 2 are needed (base and top)",
                rows.len()
            ),
        );
    }
    let height_m = rows.last().map(|(_, r)| r.z_m).unwrap_or(0.0);
    let mut previous_z: Option<f64> = None;
    let mut step_height: Option<f64> = None;
    for (i, (place, st)) in rows.iter().enumerate() {
        let z_path = place.field("z_m");
        if c.finite(&z_path, st.z_m) {
            if i == 0 && st.z_m != 0.0 {
                c.fail(
                    &z_path,
                    st.z_m,
                    "the first station must be at z = 0 (top of the foundation)",
                );
            }
            if let Some(prev) = previous_z {
                if st.z_m == prev {
                    // A wall step: the previous station holds below, this one above.
                    if step_height == Some(st.z_m) {
                        c.fail(
                            &z_path,
                            st.z_m,
                            "a third station at the height of a wall step; a step is exactly \
                             two stations (the first holds below, the second above)",
                        );
                    } else if st.z_m == 0.0 {
                        c.fail(
                            &z_path,
                            st.z_m,
                            "a wall step at the base (z = 0) has no shell below it; give one \
                             station at z = 0",
                        );
                    } else if i + 1 == rows.len() {
                        c.fail(
                            &z_path,
                            st.z_m,
                            "a wall step at the top has no shell above it; give one station \
                             at the top",
                        );
                    }
                    step_height = Some(st.z_m);
                } else if st.z_m < prev {
                    c.fail(
                        &z_path,
                        st.z_m,
                        format!(
                            "must be above the previous station ({} m); list stations from the \
                             base upward",
                            num(prev)
                        ),
                    );
                }
            }
            previous_z = Some(st.z_m);
        } else {
            previous_z = None;
        }
        let d_path = place.field("outer_diameter_m");
        let d_ok = c.positive(&d_path, st.outer_diameter_m);
        // Every station in mm is named (not only the first): the user fixes all in one pass.
        let mut d_mm = false;
        if d_ok {
            if st.outer_diameter_m > 200.0 {
                d_mm = true;
                c.fail(
                    &d_path,
                    st.outer_diameter_m,
                    "over 200 m: are the sizes in mm? give metres",
                );
            } else if height_m.is_finite() && height_m > 0.0 && st.outer_diameter_m > height_m {
                d_mm = true;
                c.fail(
                    &d_path,
                    st.outer_diameter_m,
                    format!(
                        "diameter larger than the height ({} m): are the sizes in mm?",
                        num(height_m)
                    ),
                );
            }
        }
        let t_path = place.field("wall_m");
        let t_ok = c.positive(&t_path, st.wall_m);
        if t_ok
            && d_ok
            && !d_mm
            && 2.0 * st.wall_m >= st.outer_diameter_m
            && (WALL_MM_HINT_M.0..=WALL_MM_HINT_M.1).contains(&st.wall_m)
        {
            // A wall beside a diameter in metres that reads as 50-2000 mm is a wall in mm (RC
            // chimney shells are 0.15-1.0 m thick, common practice): say so instead of the
            // half-diameter rule.
            c.fail(
                &t_path,
                st.wall_m,
                format!(
                    "more than half the outer diameter ({} m); is the wall in mm? give metres \
                     ({} mm = {} m)",
                    num(st.outer_diameter_m),
                    num(st.wall_m),
                    num(st.wall_m / 1000.0)
                ),
            );
        } else if t_ok && d_ok && 2.0 * st.wall_m >= st.outer_diameter_m {
            c.fail(
                &t_path,
                st.wall_m,
                format!(
                    "wall must be less than half the outer diameter ({} m / 2)",
                    num(st.outer_diameter_m)
                ),
            );
        }
    }
}

#[cfg(test)]
mod step_tests {
    use std::path::Path;

    use crate::input::{parse_case, InputError};

    /// An invented shell with a wall step at 40 m (0.40 m below, 0.30 m above).
    const CASE: &str = r#"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
stations = [
  { z_m = 0.0,   outer_diameter_m = 12.0, wall_m = 0.40 },
  { z_m = 40.0,  outer_diameter_m = 11.0, wall_m = 0.40 },
  { z_m = 40.0,  outer_diameter_m = 11.0, wall_m = 0.30 },
  { z_m = 100.0, outer_diameter_m = 8.0,  wall_m = 0.20 },
]
"#;

    use crate::input::validate::case_errors as errors;

    #[test]
    fn a_step_holds_the_lower_station_below_and_the_upper_above() {
        let case = parse_case(CASE, Path::new("."), "t.toml").unwrap();
        assert_eq!(case.shell.geometry_at(40.0), (11.0, 0.40));
        assert_eq!(case.shell.geometry_above(40.0), (11.0, 0.30));
        assert_eq!(
            case.shell.geometry_above(70.0),
            case.shell.geometry_at(70.0)
        );
    }

    #[test]
    fn three_stations_at_one_height_and_steps_at_the_ends_are_refused() {
        let three = CASE.replacen(
            "  { z_m = 100.0,",
            "  { z_m = 40.0,  outer_diameter_m = 11.0, wall_m = 0.25 },\n  { z_m = 100.0,",
            1,
        );
        assert_eq!(
            errors(&three),
            [
                "shell.stations[3].z_m = 40: a third station at the height of a wall step; a step \
              is exactly two stations (the first holds below, the second above)"
            ]
        );
        let base = CASE.replacen(
            "  { z_m = 40.0,  outer_diameter_m = 11.0, wall_m = 0.40 },",
            "  { z_m = 0.0,  outer_diameter_m = 11.0, wall_m = 0.40 },",
            1,
        );
        let e = errors(&base);
        assert!(
            e[0].starts_with("shell.stations[1].z_m = 0: a wall step at the base"),
            "{e:?}"
        );
    }

    #[test]
    fn a_step_in_a_stations_csv_is_read_too() {
        let dir = tempfile::tempdir().unwrap();
        std::fs::write(
            dir.path().join("s.csv"),
            "z_m,outer_diameter_m,wall_m\n0,12,0.4\n40,11,0.4\n40,11,0.3\n100,8,0.2\n",
        )
        .unwrap();
        let text = "[shell]\nelastic_modulus_gpa = 32.0\ndensity_kg_m3 = 2500.0\nstations_csv = \"s.csv\"\n";
        let case = parse_case(text, dir.path(), "t.toml").unwrap();
        assert_eq!(case.shell.geometry_above(40.0), (11.0, 0.3));
        std::fs::write(
            dir.path().join("s.csv"),
            "z_m,outer_diameter_m,wall_m\n0,12,0.4\n40,11,0.4\n40,11,0.3\n40,11,0.2\n100,8,0.2\n",
        )
        .unwrap();
        let e = errors_in(text, dir.path());
        assert_eq!(e.len(), 1, "{e:?}");
        assert!(
            e[0].contains("line 5, column z_m = 40: a third station at the height of a wall step"),
            "{e:?}"
        );
    }

    fn errors_in(text: &str, dir: &Path) -> Vec<String> {
        match parse_case(text, dir, "t.toml") {
            Ok(_) => vec![],
            Err(InputError::Invalid { issues, .. }) => {
                issues.iter().map(|i| i.to_string()).collect()
            }
            Err(e) => vec![e.to_string()],
        }
    }
}
