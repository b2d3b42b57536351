//! The verdict of one stage/mode against the user's criteria.
//!
//! `not judged`: the case gives no `[criteria]`, so nothing can be judged (not even a
//! screened-out mode is called a pass: scripts read the exit code, and exit 0 must mean "every
//! judged check passes"); `clear`: screened out by EN 1991-1-4 E.1.2 (or, with GB 50009
//! governing, outside its resonance conditions); `ok`: a response exists and meets every
//! criterion; `exceeds: ...` lists each criterion exceeded with the values, e.g.
//! "exceeds: tip amplitude 0.41 m > 0.35 m".

use std::fmt;

use serde::{Serialize, Serializer};

use crate::case::Criteria;

/// Outcome of one mode's check.
#[derive(Debug, Clone, PartialEq)]
pub enum Verdict {
    Clear,
    Ok,
    /// No criterion given: the response (if any) is reported but not judged.
    NotJudged,
    /// Each entry names the criterion and the values.
    Exceeds(Vec<String>),
}

impl Verdict {
    pub fn is_exceeds(&self) -> bool {
        matches!(self, Verdict::Exceeds(_))
    }

    pub fn is_not_judged(&self) -> bool {
        matches!(self, Verdict::NotJudged)
    }
}

impl fmt::Display for Verdict {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Verdict::Clear => f.write_str("clear"),
            Verdict::Ok => f.write_str("ok"),
            Verdict::NotJudged => f.write_str("not judged"),
            Verdict::Exceeds(what) => write!(f, "exceeds: {}", what.join("; ")),
        }
    }
}

impl Serialize for Verdict {
    fn serialize<S: Serializer>(&self, s: S) -> Result<S::Ok, S::Error> {
        s.collect_str(self)
    }
}

/// What a method found for one mode, as the verdict needs it.
#[derive(Debug, Clone, Copy, Default)]
pub struct Response {
    /// Peak tip amplitude, m (`None` = no amplitude computed).
    pub tip_amplitude_m: Option<f64>,
    /// Largest |extreme-fibre stress| over the height, Pa.
    pub max_stress_pa: Option<f64>,
}

/// The one-line statement printed (stderr, note warnings, summary.json) when a case has no
/// criteria.
pub const NOT_JUDGED_STATEMENT: &str = "no [criteria] given: no verdict is judged (every \
     verdict says \"not judged\"; exit code 3); give criteria.tip_amplitude_m, \
     criteria.tip_amplitude_per_diameter or criteria.stress_mpa";

/// Judges one mode. `extra_failures` are method-specific failures that hold whatever the
/// criteria (e.g. a GB 50009 subcritical lock-in); they count only when criteria are given.
/// Without criteria every mode is [`Verdict::NotJudged`], screened out or not.
pub fn judge(
    criteria: &Criteria,
    screened_out: bool,
    response: Response,
    top_diameter_m: f64,
    extra_failures: &[String],
) -> Verdict {
    if criteria.is_empty() {
        return Verdict::NotJudged;
    }
    if screened_out {
        return Verdict::Clear;
    }
    let mut what = Vec::new();
    if let Some(tip) = response.tip_amplitude_m {
        if let Some(limit) = criteria.tip_amplitude_m {
            if tip > limit {
                what.push(format!("tip amplitude {tip:.3} m > {limit:.3} m"));
            }
        }
        if let Some(ratio) = criteria.tip_amplitude_per_diameter {
            let limit = ratio * top_diameter_m;
            if tip > limit {
                what.push(format!(
                    "tip amplitude {tip:.3} m > {ratio} x top diameter {top_diameter_m:.3} m = {limit:.3} m"
                ));
            }
        }
    }
    if let (Some(stress), Some(limit)) = (response.max_stress_pa, criteria.stress_pa) {
        if stress > limit {
            what.push(format!(
                "stress {:.2} MPa > {:.2} MPa",
                stress / 1e6,
                limit / 1e6
            ));
        }
    }
    what.extend(extra_failures.iter().cloned());
    if what.is_empty() {
        Verdict::Ok
    } else {
        Verdict::Exceeds(what)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn verdict_texts() {
        let c = Criteria {
            tip_amplitude_m: Some(0.35),
            tip_amplitude_per_diameter: None,
            stress_pa: Some(5e6),
        };
        let r = Response {
            tip_amplitude_m: Some(0.41),
            max_stress_pa: Some(4e6),
        };
        let v = judge(&c, false, r, 8.0, &[]);
        assert_eq!(v.to_string(), "exceeds: tip amplitude 0.410 m > 0.350 m");
        assert_eq!(judge(&c, true, r, 8.0, &[]), Verdict::Clear);
        assert_eq!(
            judge(&Criteria::default(), false, r, 8.0, &[]),
            Verdict::NotJudged
        );
        // No criteria is not a pass, even for a screened-out mode.
        assert_eq!(
            judge(&Criteria::default(), true, r, 8.0, &[]),
            Verdict::NotJudged
        );
        assert_eq!(Verdict::NotJudged.to_string(), "not judged");
        let ok = Response {
            tip_amplitude_m: Some(0.1),
            max_stress_pa: Some(1e6),
        };
        assert_eq!(judge(&c, false, ok, 8.0, &[]), Verdict::Ok);
        let frac = Criteria {
            tip_amplitude_per_diameter: Some(0.04),
            ..Criteria::default()
        };
        assert!(judge(&frac, false, r, 8.0, &[]).is_exceeds());
        assert_eq!(serde_json::to_string(&Verdict::Clear).unwrap(), "\"clear\"");
    }
}
