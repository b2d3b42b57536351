//! Bounds that keep an accepted case physically meaningful and its run bounded in time and
//! memory. Two kinds:
//!
//! - **Ranges** of values that pass the basic rules (finite, positive) but mean nothing for
//!   a chimney and drive the results to infinity: a log decrement of 1e-310 or an air
//!   density of 1e300 kg/m3 gives a Scruton number of ~0 and an infinite amplitude. Each
//!   range says where it comes from in its message.
//! - **Counts** of list entries beyond which a larger input has no engineering meaning, so
//!   that no accepted file can make reading, validation or meshing slow (checked first,
//!   before the per-entry rules).
//!
//! Units: SI as in the case file (kg/m3, years); the log decrement is dimensionless.

use super::issue::ValidationIssue;
use super::raw::RawCase;
use super::stations_csv::CsvStations;

/// Air density range, kg/m3: about 0.7 at 3000 m altitude in summer to 1.5 at sea level at
/// -40 C (ISA standard atmosphere, common practice); 0.5-2.0 leaves margin on both sides.
pub const AIR_DENSITY_RANGE_KG_M3: (f64, f64) = (0.5, 2.0);
/// Longest return period of a stage's design wind, years: our own bound, far above the
/// 50-year basic wind of EN 1991-1-4 and any return period used in wind design (common
/// practice).
pub const MAX_RETURN_PERIOD_YEARS: f64 = 10_000.0;
/// Smallest structural log decrement: 0.001 (damping ratio 1.6e-4) is well below the
/// lowest value EN 1991-1-4 Table F.2 gives for any structure (0.012, welded steel stack
/// without lining; from memory); below it the Scruton number and the amplitude lose meaning.
pub const MIN_LOG_DECREMENT: f64 = 1e-3;
/// Smallest damping ratio, the same bound as [`MIN_LOG_DECREMENT`] (zeta = delta / (2 pi)).
pub const MIN_DAMPING_RATIO: f64 = MIN_LOG_DECREMENT / (2.0 * std::f64::consts::PI);
/// Longest design life, years: EN 1990 Table 2.1 gives 100 years for category 5
/// (monumental buildings, bridges, other civil engineering structures; read in the
/// Concrete Society's summary, see data/reference/README.md); 1000 years leaves a wide
/// margin and keeps cycle counts finite.
pub const MAX_DESIGN_LIFE_YEARS: f64 = 1000.0;

/// Most shell stations (inline or from a stations CSV): 100 000 stations on a 300 m stack
/// are 3 mm apart, far finer than any drawing gives a shell.
pub const MAX_STATIONS: usize = 100_000;
/// Most point masses: a stack carries tens of platforms and fittings, not thousands.
pub const MAX_POINT_MASSES: usize = 1_000;
/// Most linings: one per corbel zone, a few dozen at most.
pub const MAX_LININGS: usize = 1_000;
/// Most concrete zones: one per change of grade, a handful in practice.
pub const MAX_ZONES: usize = 1_000;
/// Most openings: flue inlets, access doors and ducts, a few dozen at most; the pairwise
/// overlap check stays small.
pub const MAX_OPENINGS: usize = 200;
/// Most construction stages: a slipformed shell is checked at a handful of heights.
pub const MAX_STAGES: usize = 100;

/// A value as the user can recognise it: plain for ordinary magnitudes, in exponent form
/// for the huge or tiny ones these ranges catch (1e300 rather than 301 digits).
fn shown(v: f64) -> String {
    let a = v.abs();
    if a != 0.0 && !(1e-4..1e6).contains(&a) {
        format!("{v:e}")
    } else {
        format!("{v}")
    }
}

/// Count limits; any issue here stops validation before the per-entry rules run.
pub fn check_counts(raw: &RawCase, csv: Option<&CsvStations>) -> Vec<ValidationIssue> {
    let stations = raw
        .shell
        .stations
        .as_ref()
        .map(Vec::len)
        .or(csv.map(|c| c.rows.len()))
        .unwrap_or(0);
    let station_path = match (&raw.shell.stations, csv) {
        (None, Some(c)) => c.label.clone(),
        _ => "shell.stations".to_string(),
    };
    let counts = [
        (
            station_path,
            stations,
            MAX_STATIONS,
            "stations",
            "3 mm apart on a 300 m stack",
        ),
        (
            "point_mass".to_string(),
            raw.point_mass.len(),
            MAX_POINT_MASSES,
            "point masses",
            "a stack carries tens of platforms and fittings",
        ),
        (
            "lining".to_string(),
            raw.lining.len(),
            MAX_LININGS,
            "linings",
            "one per corbel zone",
        ),
        (
            "shell.zone".to_string(),
            raw.shell.zone.len(),
            MAX_ZONES,
            "concrete zones",
            "one per change of concrete grade",
        ),
        (
            "opening".to_string(),
            raw.opening.len(),
            MAX_OPENINGS,
            "openings",
            "flue inlets, doors and ducts, a few dozen at most",
        ),
        (
            "stage".to_string(),
            raw.stage.as_ref().map_or(0, Vec::len),
            MAX_STAGES,
            "stages",
            "a shell is checked at a handful of construction heights",
        ),
    ]
    .into_iter()
    .chain(raw.point_mass.iter().enumerate().filter_map(|(i, p)| {
        let n = p.stages.as_ref().map_or(0, Vec::len);
        (n > MAX_STAGES).then(|| {
            (
                format!("point_mass[{i}].stages"),
                n,
                MAX_STAGES,
                "stage names",
                "at most one per stage",
            )
        })
    }))
    .collect::<Vec<_>>();
    counts
        .into_iter()
        .filter(|(_, n, max, _, _)| n > max)
        .map(|(path, n, max, what, why)| {
            ValidationIssue::new(
                path,
                format!("{n} entries"),
                format!("at most {max} {what} are accepted ({why})"),
            )
        })
        .collect()
}

/// Range limits on values that already passed the basic rules (finite, positive, below 1):
/// values failing those are reported by them, not twice.
pub fn check_ranges(raw: &RawCase) -> Vec<ValidationIssue> {
    let mut issues = Vec::new();
    let mut fail = |path: &str, v: f64, rule: String| {
        issues.push(ValidationIssue::new(path, shown(v), rule));
    };
    let (lo, hi) = AIR_DENSITY_RANGE_KG_M3;
    if let Some(rho) = raw
        .wind
        .as_ref()
        .and_then(|w| w.air_density_kg_m3)
        .filter(|v| v.is_finite() && *v > 0.0)
    {
        if !(lo..=hi).contains(&rho) {
            fail(
                "wind.air_density_kg_m3",
                rho,
                format!(
                    "must be between {lo} and {hi} kg/m3 (air from hot high-altitude sites to \
                     cold sea-level ones; 1.25 is the EN 1991-1-4 value)"
                ),
            );
        }
    }
    if let Some(d) = raw.vortex.log_decrement.filter(|v| *v > 0.0 && *v < 1.0) {
        if d < MIN_LOG_DECREMENT {
            fail(
                "vortex.log_decrement",
                d,
                format!(
                    "must be at least {MIN_LOG_DECREMENT} (below any structure's measured \
                     damping; EN 1991-1-4 Table F.2 starts at 0.012; a smaller value gives an \
                     infinite amplitude)"
                ),
            );
        }
    }
    if let Some(z) = raw.vortex.damping_ratio.filter(|v| *v > 0.0 && *v < 1.0) {
        if z < MIN_DAMPING_RATIO {
            fail(
                "vortex.damping_ratio",
                z,
                format!(
                    "must be at least {MIN_DAMPING_RATIO:.2e} (a log decrement of \
                     {MIN_LOG_DECREMENT}, below any structure's measured damping)"
                ),
            );
        }
    }
    if let Some(y) = raw
        .vortex
        .design_life_years
        .filter(|v| v.is_finite() && *v > 0.0)
    {
        if y > MAX_DESIGN_LIFE_YEARS {
            fail(
                "vortex.design_life_years",
                y,
                format!(
                    "must be at most {MAX_DESIGN_LIFE_YEARS} years (EN 1990 Table 2.1 gives \
                     100 years for monumental structures)"
                ),
            );
        }
    }
    for (i, st) in raw.stage.iter().flatten().enumerate() {
        if let Some(d) = st.log_decrement.filter(|v| *v > 0.0 && *v < 1.0) {
            if d < MIN_LOG_DECREMENT {
                fail(
                    &format!("stage[{i}].log_decrement"),
                    d,
                    format!(
                        "must be at least {MIN_LOG_DECREMENT} (below any structure's measured \
                         damping; a smaller value gives an infinite amplitude)"
                    ),
                );
            }
        }
        if let Some(y) = st.duration_years.filter(|v| v.is_finite() && *v > 0.0) {
            if y > MAX_DESIGN_LIFE_YEARS {
                fail(
                    &format!("stage[{i}].duration_years"),
                    y,
                    format!(
                        "must be at most {MAX_DESIGN_LIFE_YEARS} years, the longest design life \
                         accepted"
                    ),
                );
            }
        }
        if let Some(t) = st.return_period_years.filter(|v| v.is_finite() && *v > 1.0) {
            if t > MAX_RETURN_PERIOD_YEARS {
                fail(
                    &format!("stage[{i}].return_period_years"),
                    t,
                    format!(
                        "must be at most {MAX_RETURN_PERIOD_YEARS} years (far above the return \
                         periods of wind design; common practice)"
                    ),
                );
            }
        }
    }
    issues
}
