//! The along-wind action at a mode's critical speed, its combination with the across-wind
//! inertia moment, and which case governs along the height.
//!
//! At the critical speed: the EN profile of the stage is scaled so that v_m at the mode's
//! shedding height equals v_crit (every term of chapter 4 scales with v_b), and the
//! along-wind load is the mean plus the background (quasi-static gust) part,
//! c_s c_d|_(R^2 = 0) c_f q_p b, i.e. (6.1) with the resonant term dropped and k_p from
//! (B.4) with nu at its (B.5) floor. Why no resonant part: the along-wind resonance at n_1
//! and the across-wind lock-in of mode i are separate narrow-band responses that do not
//! peak together; the background part is what acts quasi-statically at that speed (our
//! choice, stated in the note). I_v and B^2 do not depend on the speed, so this factor is
//! the same for every mode of a stage; c_f changes with Re.
//!
//! Combination M_comb(z) = sqrt(M_across(z)^2 + M_along,crit(z)^2): square root of the sum
//! of squares of two perpendicular moments on a circular section, whose resultant it is
//! (statics, exact for a section with the same modulus in every direction); taking both
//! peaks at once is common practice.
//!
//! Units: m, m/s, N m.

use serde::Serialize;

/// The combined moment of one mode.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct ModeCombination {
    pub mode: usize,
    pub critical_speed_m_s: f64,
    /// Height where v_m equals v_crit (the mode's shedding height), m.
    pub reference_height_m: f64,
    /// v_b scale that brings the EN profile to v_crit at the reference height.
    pub speed_factor: f64,
    /// (z_m, moment_nm) of the along-wind load at v_crit.
    pub along_moment_nm: Vec<(f64, f64)>,
    /// (z_m, moment_nm) of the across-wind inertia loads (governing vortex method).
    pub across_moment_nm: Vec<(f64, f64)>,
    /// (z_m, moment_nm) of sqrt(across^2 + along^2).
    pub combined_moment_nm: Vec<(f64, f64)>,
}

/// sqrt(a^2 + b^2) node by node; both on the same node heights.
pub fn combine_moments(across: &[(f64, f64)], along: &[(f64, f64)]) -> Vec<(f64, f64)> {
    assert_eq!(across.len(), along.len(), "moments on the same nodes");
    across
        .iter()
        .zip(along)
        .map(|(&(z, a), &(_, b))| (z, a.hypot(b)))
        .collect()
}

/// A height range where the vortex case governs.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct GoverningRange {
    pub from_z_m: f64,
    pub to_z_m: f64,
}

/// Which case governs a stage.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Governs {
    /// Ranges where the largest combined moment over the modes exceeds the along-wind
    /// design moment.
    pub vortex_ranges: Vec<GoverningRange>,
    /// Largest combined / design moment at the base (None when no mode is combined).
    pub base_ratio: Option<f64>,
    /// Largest ratio over the height and where (nodes with zero design moment skipped).
    pub max_ratio: Option<(f64, f64)>,
    /// The one-line answer.
    pub statement: String,
}

/// Compares the envelope of the combined moments with the design moment node by node.
pub fn governs(design: &[(f64, f64)], combined: &[&[(f64, f64)]]) -> Governs {
    if combined.is_empty() {
        return Governs {
            vortex_ranges: Vec::new(),
            base_ratio: None,
            max_ratio: None,
            statement: "along-wind design governs everywhere (no vortex case applies)".into(),
        };
    }
    let envelope: Vec<f64> = (0..design.len())
        .map(|i| combined.iter().map(|c| c[i].1.abs()).fold(0.0, f64::max))
        .collect();
    let ratio = |i: usize| -> Option<f64> {
        let d = design[i].1.abs();
        (d > 0.0).then(|| envelope[i] / d)
    };
    let mut ranges: Vec<GoverningRange> = Vec::new();
    let mut open: Option<f64> = None;
    let mut max_ratio: Option<(f64, f64)> = None;
    for i in 0..design.len() {
        let z = design[i].0;
        let r = ratio(i);
        if let Some(r) = r {
            if max_ratio.is_none_or(|(m, _)| r > m) {
                max_ratio = Some((r, z));
            }
        }
        let exceeds = r.is_some_and(|r| r > 1.0);
        match (exceeds, open) {
            (true, None) => open = Some(z),
            (false, Some(from)) => {
                ranges.push(GoverningRange {
                    from_z_m: from,
                    to_z_m: design[i - 1].0,
                });
                open = None;
            }
            _ => {}
        }
    }
    if let Some(from) = open {
        // Up to the last node with a design moment (the top has none).
        let last = (0..design.len())
            .rev()
            .find(|&i| ratio(i).is_some())
            .unwrap_or(0);
        ranges.push(GoverningRange {
            from_z_m: from,
            to_z_m: design[last].0,
        });
    }
    let base_ratio = ratio(0);
    let base = base_ratio.map_or(String::new(), |r| format!("; ratio at the base {r:.2}"));
    let statement = match (ranges.is_empty(), max_ratio) {
        (true, Some((r, z))) => format!(
            "along-wind design governs everywhere (largest vortex/design ratio {r:.2} at \
             {z:.0} m{base})"
        ),
        (true, None) => "along-wind design governs everywhere".into(),
        (false, m) => {
            let list: Vec<String> = ranges
                .iter()
                .map(|g| format!("{:.0}-{:.0} m", g.from_z_m, g.to_z_m))
                .collect();
            let (r, z) = m.unwrap_or((f64::NAN, f64::NAN));
            format!(
                "vortex case governs {}, ratio {r:.2} at {z:.0} m{base}",
                list.join(", ")
            )
        }
    };
    Governs {
        vortex_ranges: ranges,
        base_ratio,
        max_ratio,
        statement,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn combination_reduces_to_either_part() {
        let z = [0.0, 10.0, 20.0];
        let zero: Vec<(f64, f64)> = z.iter().map(|&z| (z, 0.0)).collect();
        let m: Vec<(f64, f64)> = z.iter().map(|&z| (z, 3.0e6 - 1.0e5 * z)).collect();
        assert_eq!(combine_moments(&zero, &m), m);
        assert_eq!(combine_moments(&m, &zero), m);
        let both = combine_moments(&m, &m);
        assert!((both[0].1 - 3.0e6 * 2f64.sqrt()).abs() < 1e-6);
    }

    #[test]
    fn governing_ranges_and_statement() {
        let design = [
            (0.0, 10.0),
            (10.0, 6.0),
            (20.0, 3.0),
            (30.0, 1.0),
            (40.0, 0.0),
        ];
        let comb = [
            (0.0, 8.0),
            (10.0, 7.0),
            (20.0, 4.0),
            (30.0, 0.5),
            (40.0, 0.0),
        ];
        let g = governs(&design, &[&comb]);
        assert_eq!(
            g.vortex_ranges,
            vec![GoverningRange {
                from_z_m: 10.0,
                to_z_m: 20.0
            }]
        );
        assert!((g.base_ratio.unwrap() - 0.8).abs() < 1e-12);
        assert!(g
            .statement
            .starts_with("vortex case governs 10-20 m, ratio 1.33 at 20 m"));
        let low = [
            (0.0, 1.0),
            (10.0, 1.0),
            (20.0, 1.0),
            (30.0, 0.5),
            (40.0, 0.0),
        ];
        let g = governs(&design, &[&low]);
        assert!(g
            .statement
            .starts_with("along-wind design governs everywhere"));
    }
}
