//! Validation of the `[[opening]]` tables: flue and access openings.
//!
//! Rules: limits inside the shell and in order, width > 0 and smaller than the outer
//! diameter everywhere over the opening's height, azimuth a finite angle; at every height the
//! openings there must not overlap around the circumference and must together remove at
//! most half of it. The half-angle beta = asin(width / D) grows as D shrinks, and D is linear
//! between stations, so checking each stretch between stations and opening limits at its
//! smaller end diameter covers every height. Geometry from [`crate::section::opening`].

use std::f64::consts::PI;

use crate::case::Opening;
use crate::input::raw::RawOpening;
use crate::section::opening::half_angle_rad;

use super::*;

/// Every opening of `raw`; entries with problems are dropped (their issues recorded).
pub(super) fn check_openings(
    c: &mut Checker,
    raw: &[RawOpening],
    shell: Option<&Shell>,
) -> Vec<Opening> {
    let height_m = shell.map(Shell::height_m);
    let mut openings = Vec::new();
    // (file index, opening) of the entries that passed their own rules.
    let mut kept: Vec<usize> = Vec::new();
    for (i, o) in raw.iter().enumerate() {
        let p = format!("opening[{i}]");
        let before = c.issues.len();
        c.height_range(&p, o.from_z_m, o.to_z_m, height_m);
        c.positive(&format!("{p}.width_m"), o.width_m);
        let azimuth_deg = o.azimuth_deg.unwrap_or(0.0);
        let az_path = format!("{p}.azimuth_deg");
        if c.finite(&az_path, azimuth_deg) && azimuth_deg.abs() > 360.0 {
            c.fail(
                &az_path,
                azimuth_deg,
                "must be between -360 and 360 degrees",
            );
        }
        if c.issues.len() != before {
            continue;
        }
        let label = match o.label.as_deref().map(str::trim) {
            Some(l) if !l.is_empty() => l.to_string(),
            _ => format!("opening at {} m", num(o.from_z_m)),
        };
        kept.push(i);
        openings.push(Opening {
            from_z_m: o.from_z_m,
            to_z_m: o.to_z_m,
            width_m: o.width_m,
            azimuth_rad: azimuth_deg.to_radians(),
            label,
        });
    }
    if let Some(shell) = shell {
        let degrees: Vec<f64> = kept
            .iter()
            .map(|&i| raw[i].azimuth_deg.unwrap_or(0.0))
            .collect();
        check_fit(c, shell, &openings, &kept, &degrees);
    }
    openings
}

/// The heights where the set of openings or the diameter's slope can change, over the
/// openings' ranges.
fn breakpoints(shell: &Shell, openings: &[Opening]) -> Vec<f64> {
    let st = &shell.stations;
    let mut z: Vec<f64> = Vec::new();
    for o in openings {
        z.push(o.from_z_m);
        z.push(o.to_z_m);
        let lo = st.partition_point(|s| s.z_m <= o.from_z_m);
        let hi = st.partition_point(|s| s.z_m < o.to_z_m);
        z.extend(st[lo..hi.max(lo)].iter().map(|s| s.z_m));
    }
    z.sort_by(|a, b| a.total_cmp(b));
    z.dedup();
    z
}

/// Widths, overlaps and the half-circumference rule at every height.
fn check_fit(
    c: &mut Checker,
    shell: &Shell,
    openings: &[Opening],
    index: &[usize],
    azimuth_deg: &[f64],
) {
    let mut wide_reported = vec![false; openings.len()];
    let mut pairs_reported: Vec<(usize, usize)> = Vec::new();
    let mut half_reported = false;
    let z = breakpoints(shell, openings);
    'heights: for w in z.windows(2) {
        let (lo, hi) = (w[0], w[1]);
        let mid = 0.5 * (lo + hi);
        let (d_lo, d_hi) = (shell.geometry_above(lo).0, shell.geometry_at(hi).0);
        let (d_min, z_at) = if d_lo <= d_hi { (d_lo, lo) } else { (d_hi, hi) };
        let active: Vec<usize> = (0..openings.len())
            .filter(|&k| openings[k].from_z_m <= mid && mid <= openings[k].to_z_m)
            .collect();
        let mut beta = Vec::with_capacity(active.len());
        for &k in &active {
            match half_angle_rad(openings[k].width_m, d_min) {
                Ok(b) => beta.push(b),
                Err(_) => {
                    if !wide_reported[k] {
                        wide_reported[k] = true;
                        c.fail(
                            format!("opening[{}].width_m", index[k]),
                            openings[k].width_m,
                            format!(
                                "wider than the shell: the outer diameter is {} m at z = {} m; \
                                 the clear width must be less than the diameter",
                                num(d_min),
                                num(z_at)
                            ),
                        );
                    }
                    continue 'heights;
                }
            }
        }
        for (a, &ka) in active.iter().enumerate() {
            for (b, &kb) in active.iter().enumerate().skip(a + 1) {
                let gap =
                    (openings[ka].azimuth_rad - openings[kb].azimuth_rad).rem_euclid(2.0 * PI);
                let gap = gap.min(2.0 * PI - gap);
                if gap < beta[a] + beta[b] && !pairs_reported.contains(&(ka, kb)) {
                    pairs_reported.push((ka, kb));
                    c.fail(
                        format!("opening[{}].azimuth_deg", index[kb]),
                        azimuth_deg[kb],
                        format!(
                            "overlaps opening[{}] (\"{}\") at z = {} m: centres {:.1} deg \
                             apart, half-angles asin(width / D) {:.1} and {:.1} deg; openings \
                             at one height must not overlap",
                            index[ka],
                            openings[ka].label,
                            num(z_at),
                            gap.to_degrees(),
                            beta[a].to_degrees(),
                            beta[b].to_degrees()
                        ),
                    );
                }
            }
        }
        let removed: f64 = beta.iter().map(|b| 2.0 * b).sum();
        if removed > PI && !half_reported {
            half_reported = true;
            let last = *active.last().unwrap_or(&0);
            let names: Vec<String> = active
                .iter()
                .map(|&k| format!("opening[{}]", index[k]))
                .collect();
            c.fail(
                format!("opening[{}].width_m", index[last]),
                openings[last].width_m,
                format!(
                    "the openings at z = {} m ({}) remove {:.0} % of the circumference; at \
                     most half may be removed",
                    num(z_at),
                    names.join(", "),
                    100.0 * removed / (2.0 * PI)
                ),
            );
        }
    }
}

/// A stage's top inside an opening (from < top < to) is refused: the stage would hold half
/// an opening whose lintel is not yet cast, which is no section the net-section rules
/// describe. An opening wholly above a stage's top is simply not in that stage (the shell
/// is not built there yet).
pub(super) fn check_stage_tops(c: &mut Checker, stages: &[Stage], openings: &[Opening]) {
    for (i, st) in stages.iter().enumerate() {
        let Some(top) = st.top_z_m else { continue };
        for (k, o) in openings.iter().enumerate() {
            if o.from_z_m < top && top < o.to_z_m {
                c.fail(
                    format!("stage[{i}].top_z_m"),
                    top,
                    format!(
                        "lies inside opening[{k}] ({} to {} m): put the stage's top at or \
                         below the opening's bottom, or at or above its top",
                        num(o.from_z_m),
                        num(o.to_z_m)
                    ),
                );
            }
        }
    }
}

#[cfg(test)]
mod tests {
    use std::path::Path;

    use crate::input::parse_case;

    /// A small valid case (invented) with one opening; tests change or add lines.
    const CASE: &str = r#"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
stations = [
  { z_m = 0.0,   outer_diameter_m = 12.0, wall_m = 0.40 },
  { z_m = 100.0, outer_diameter_m = 6.0,  wall_m = 0.20 },
]
[[opening]]
from_z_m = 10.0
to_z_m = 20.0
width_m = 4.0
label = "flue inlet"
"#;

    use crate::input::validate::case_errors as errors;

    fn second(from: f64, to: f64, width: f64, azimuth: f64) -> String {
        format!(
            "{CASE}[[opening]]\nfrom_z_m = {from}\nto_z_m = {to}\nwidth_m = {width}\nazimuth_deg = {azimuth}\n"
        )
    }

    #[test]
    fn an_opening_is_read_with_its_defaults() {
        let case = parse_case(CASE, Path::new("."), "t.toml").unwrap();
        let o = &case.shell.openings[0];
        assert_eq!(
            (o.from_z_m, o.to_z_m, o.width_m, o.azimuth_rad),
            (10.0, 20.0, 4.0, 0.0)
        );
        assert_eq!(o.label, "flue inlet");
        // Opposite openings of 4 m do not touch.
        assert!(errors(&second(15.0, 30.0, 4.0, 180.0)).is_empty());
    }

    #[test]
    fn an_opening_wider_than_the_shell_is_refused_where_it_is_narrowest() {
        // D = 12 - 0.06 z: 11.4 m at z = 10, 10.8 m at z = 20 (the narrower end).
        let e = errors(&CASE.replacen("width_m = 4.0", "width_m = 11.0", 1));
        assert_eq!(
            e,
            ["opening[0].width_m = 11: wider than the shell: the outer diameter is 10.8 m at z = \
              20 m; the clear width must be less than the diameter"]
        );
    }

    #[test]
    fn overlapping_openings_and_more_than_half_are_refused() {
        let e = errors(&second(15.0, 30.0, 4.0, 30.0));
        assert_eq!(e.len(), 1, "{e:?}");
        assert!(
            e[0].starts_with(
                "opening[1].azimuth_deg = 30: overlaps opening[0] (\"flue inlet\") at z = 20 m"
            ),
            "{e:?}"
        );
        // No overlap in height: the same azimuth is fine.
        assert!(errors(&second(25.0, 30.0, 4.0, 0.0)).is_empty());
        // Two 10 m openings in a ~11 m shell, opposite: 2 x 2 asin(10/10.8) > pi.
        let text = CASE.replacen("width_m = 4.0", "width_m = 10.0", 1);
        let text = format!("{text}[[opening]]\nfrom_z_m = 10.0\nto_z_m = 20.0\nwidth_m = 10.0\nazimuth_deg = 180.0\n");
        let e = errors(&text);
        assert_eq!(e.len(), 1, "{e:?}");
        assert!(
            e[0].starts_with(
                "opening[1].width_m = 10: the openings at z = 20 m (opening[0], opening[1]) remove"
            ),
            "{e:?}"
        );
        assert!(
            e[0].ends_with("of the circumference; at most half may be removed"),
            "{e:?}"
        );
    }

    #[test]
    fn limits_and_values() {
        let e = errors(&CASE.replacen("to_z_m = 20.0", "to_z_m = 120.0", 1));
        assert_eq!(
            e,
            ["opening[0].to_z_m = 120: outside the shell (0 to 100 m)"]
        );
        let e = errors(&CASE.replacen("to_z_m = 20.0", "to_z_m = 5.0", 1));
        assert_eq!(e, ["opening[0].to_z_m = 5: must be above from_z_m (10 m)"]);
        let e = errors(&CASE.replacen("width_m = 4.0", "width_m = -1.0", 1));
        assert_eq!(e, ["opening[0].width_m = -1: must be > 0"]);
        let e = errors(&second(15.0, 30.0, 4.0, 400.0));
        assert_eq!(
            e,
            ["opening[1].azimuth_deg = 400: must be between -360 and 360 degrees"]
        );
    }
}
