//! The design note's station table for long station lists: above
//! [`CONDENSE_ABOVE_STATIONS`] stations (a shell profile exported point by point) the table
//! shows the first and the last station and every break of slope of the outer diameter D or
//! the wall t, and a warning says so. Dropped stations are those that linear interpolation
//! between the rows shown reproduces to within [`CONDENSE_TOLERANCE_M`] in both D and t, half
//! the last digit the table prints (mm), so the condensed table describes the same shell to
//! the precision shown. The analysis always uses every station.
//!
//! Pure: station lists in, indices and text out. Units: m.

use crate::case::Station;

/// Station counts above this are shown condensed in the note.
pub const CONDENSE_ABOVE_STATIONS: usize = 2_000;

/// Largest deviation, m, of a dropped station's D or t from the straight line between the
/// rows shown: half a millimetre, half the last digit of the note's 3-decimal columns.
pub const CONDENSE_TOLERANCE_M: f64 = 0.0005;

/// Largest deviation, m, of a station from the chord of its neighbours that still counts as
/// "on a straight line" (rounding of the input, not a change of slope).
const STRAIGHT_TOLERANCE_M: f64 = 1e-9;

/// Indices of the stations that keep D(z) and t(z) piecewise linear to within `tol_m`:
/// the first, the last, every corner between straight runs (exactly, where the slope of D
/// or t changes) and, along a curved stretch, as few stations as reproduce it to `tol_m`.
/// A step (two stations at the same height) keeps both.
pub fn slope_breaks(stations: &[Station], tol_m: f64) -> Vec<usize> {
    let n = stations.len();
    if n <= 2 {
        return (0..n).collect();
    }
    // Stations off the chord of their neighbours.
    let bent: Vec<bool> = (0..n)
        .map(|i| {
            if i == 0 || i == n - 1 {
                return false;
            }
            let (a, s, b) = (stations[i - 1], stations[i], stations[i + 1]);
            if s.z_m <= a.z_m || b.z_m <= s.z_m {
                return true;
            }
            let t = (s.z_m - a.z_m) / (b.z_m - a.z_m);
            let off = |pa: f64, ps: f64, pb: f64| (pa + t * (pb - pa) - ps).abs();
            off(a.outer_diameter_m, s.outer_diameter_m, b.outer_diameter_m) > STRAIGHT_TOLERANCE_M
                || off(a.wall_m, s.wall_m, b.wall_m) > STRAIGHT_TOLERANCE_M
        })
        .collect();
    // Corners: bent stations next to a straight run (the ends of a curved stretch count).
    let corners: Vec<usize> = (0..n)
        .filter(|&i| i == 0 || i == n - 1 || (bent[i] && (!bent[i - 1] || !bent[i + 1])))
        .collect();
    let mut kept = vec![0];
    for w in corners.windows(2) {
        let part = fit_runs(&stations[w[0]..=w[1]], tol_m);
        kept.extend(part.into_iter().skip(1).map(|k| w[0] + k));
    }
    kept
}

/// Greedy piecewise-linear fit: from each kept station the range of slopes that passes
/// within `tol_m` of every station so far is narrowed one station at a time; the station
/// before the first one the line cannot reach is kept. O(n). First and last always kept.
fn fit_runs(stations: &[Station], tol_m: f64) -> Vec<usize> {
    let n = stations.len();
    let mut kept = vec![0];
    let mut anchor = 0;
    let mut range = [(f64::NEG_INFINITY, f64::INFINITY); 2];
    let mut j = 1;
    while j < n {
        let a = stations[anchor];
        let s = stations[j];
        let dz = s.z_m - a.z_m;
        let d = [s.outer_diameter_m - a.outer_diameter_m, s.wall_m - a.wall_m];
        let fits = dz > 0.0
            && (0..2).all(|k| {
                let slope = d[k] / dz;
                slope >= range[k].0 && slope <= range[k].1
            });
        if fits {
            for k in 0..2 {
                range[k].0 = range[k].0.max((d[k] - tol_m) / dz);
                range[k].1 = range[k].1.min((d[k] + tol_m) / dz);
            }
            j += 1;
            continue;
        }
        // The line to j misses an earlier station: j - 1 ends the straight run; a step
        // (j at the anchor's height) makes j a row of its own.
        anchor = if j - 1 != anchor { j - 1 } else { j };
        kept.push(anchor);
        range = [(f64::NEG_INFINITY, f64::INFINITY); 2];
        if anchor == j {
            j += 1;
        }
    }
    if kept.last() != Some(&(n - 1)) {
        kept.push(n - 1);
    }
    kept
}

/// The stations the note's table shows: all of them up to [`CONDENSE_ABOVE_STATIONS`],
/// otherwise the slope breaks at [`CONDENSE_TOLERANCE_M`].
pub fn shown_stations(stations: &[Station]) -> Vec<usize> {
    if stations.len() <= CONDENSE_ABOVE_STATIONS {
        (0..stations.len()).collect()
    } else {
        slope_breaks(stations, CONDENSE_TOLERANCE_M)
    }
}

/// The sentence under a condensed table (plain text, no markup), or `None` when the table
/// shows every station.
pub fn condensed_note(stations: &[Station]) -> Option<String> {
    (stations.len() > CONDENSE_ABOVE_STATIONS).then(|| {
        format!(
            "The case has {} stations; this table shows {} of them: the first, the last and \
             every break of slope of D or t. Linear interpolation between the rows shown gives \
             every other station to within 0.5 mm. The analysis used all {} stations \
             (sections.csv lists the section properties along the height).",
            stations.len(),
            shown_stations(stations).len(),
            stations.len()
        )
    })
}

/// The run's warning for a long station list, or `None`.
pub fn station_count_warning(stations: &[Station]) -> Option<String> {
    (stations.len() > CONDENSE_ABOVE_STATIONS).then(|| {
        format!(
            "the shell has {} stations (more than {CONDENSE_ABOVE_STATIONS}); the design \
             note's station table is condensed to {} rows (first, last and every break of \
             slope of D or t); the analysis uses every station",
            stations.len(),
            shown_stations(stations).len()
        )
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn st(z_m: f64, outer_diameter_m: f64, wall_m: f64) -> Station {
        Station {
            z_m,
            outer_diameter_m,
            wall_m,
        }
    }

    /// Linear interpolation of the kept stations at every station: largest deviation, m.
    fn worst_deviation(all: &[Station], kept: &[usize]) -> f64 {
        let mut worst: f64 = 0.0;
        for w in kept.windows(2) {
            let (a, b) = (all[w[0]], all[w[1]]);
            for s in &all[w[0]..=w[1]] {
                if b.z_m == a.z_m {
                    continue;
                }
                let t = (s.z_m - a.z_m) / (b.z_m - a.z_m);
                let d = a.outer_diameter_m + t * (b.outer_diameter_m - a.outer_diameter_m);
                let w_ = a.wall_m + t * (b.wall_m - a.wall_m);
                worst = worst
                    .max((d - s.outer_diameter_m).abs())
                    .max((w_ - s.wall_m).abs());
            }
        }
        worst
    }

    #[test]
    fn a_straight_taper_keeps_first_and_last() {
        let s: Vec<Station> = (0..3001)
            .map(|i| {
                let z = i as f64 * 0.1;
                st(z, 16.0 - 0.02 * z, 0.5 - 0.001 * z)
            })
            .collect();
        assert_eq!(slope_breaks(&s, CONDENSE_TOLERANCE_M), vec![0, 3000]);
        assert_eq!(shown_stations(&s), vec![0, 3000]);
        assert!(condensed_note(&s).unwrap().contains("3001 stations"));
        let w = station_count_warning(&s).unwrap();
        assert!(
            w.contains("3001 stations") && w.contains("condensed to 2 rows"),
            "{w}"
        );
    }

    #[test]
    fn breaks_of_diameter_and_of_wall_are_kept() {
        // D breaks at z = 60 m (index 600), t alone breaks at z = 150 m (index 1500).
        let s: Vec<Station> = (0..2501)
            .map(|i| {
                let z = i as f64 * 0.1;
                let d = if z <= 60.0 {
                    16.0 - 0.05 * z
                } else {
                    13.0 - 0.02 * (z - 60.0)
                };
                let t = if z <= 150.0 {
                    0.55 - 0.001 * z
                } else {
                    0.40 - 0.0015 * (z - 150.0)
                };
                st(z, d, t)
            })
            .collect();
        assert_eq!(
            slope_breaks(&s, CONDENSE_TOLERANCE_M),
            vec![0, 600, 1500, 2500]
        );
    }

    #[test]
    fn a_curved_profile_is_reproduced_to_the_tolerance() {
        // Hyperbolic-looking waist: D = 10 + 6 ((z - 120) / 120)^2, t constant.
        let s: Vec<Station> = (0..4001)
            .map(|i| {
                let z = i as f64 * 0.06;
                let u = (z - 120.0) / 120.0;
                st(z, 10.0 + 6.0 * u * u, 0.3)
            })
            .collect();
        let kept = slope_breaks(&s, CONDENSE_TOLERANCE_M);
        assert!(kept.len() > 10 && kept.len() < 200, "{}", kept.len());
        assert_eq!((kept[0], *kept.last().unwrap()), (0, 4000));
        assert!(worst_deviation(&s, &kept) <= CONDENSE_TOLERANCE_M * (1.0 + 1e-9));
    }

    #[test]
    fn corners_stay_exact_beside_a_curved_stretch() {
        // Straight to z = 50 m (index 500), curved to 100 m (index 1000), straight above.
        let s: Vec<Station> = (0..2201)
            .map(|i| {
                let z = i as f64 * 0.1;
                let d = if z <= 50.0 {
                    16.0 - 0.02 * z
                } else if z <= 100.0 {
                    15.0 - 0.02 * (z - 50.0) - 0.002 * (z - 50.0).powi(2)
                } else {
                    9.0 - 0.22 * (z - 100.0) / 1.0 * 0.1
                };
                st(z, d, 0.3)
            })
            .collect();
        let kept = slope_breaks(&s, CONDENSE_TOLERANCE_M);
        assert!(kept.contains(&500) && kept.contains(&1000), "{kept:?}");
        assert!(kept.len() < 120, "{}", kept.len());
        assert!(worst_deviation(&s, &kept) <= CONDENSE_TOLERANCE_M * (1.0 + 1e-9));
    }

    #[test]
    fn short_lists_are_shown_whole_and_steps_keep_both_stations() {
        let s = vec![st(0.0, 10.0, 0.4), st(5.0, 9.9, 0.4), st(10.0, 9.8, 0.4)];
        assert_eq!(shown_stations(&s), vec![0, 1, 2]);
        assert!(condensed_note(&s).is_none() && station_count_warning(&s).is_none());
        let step = vec![
            st(0.0, 10.0, 0.4),
            st(20.0, 9.0, 0.4),
            st(20.0, 9.0, 0.3),
            st(40.0, 8.0, 0.3),
        ];
        assert_eq!(slope_breaks(&step, CONDENSE_TOLERANCE_M), vec![0, 1, 2, 3]);
    }
}
