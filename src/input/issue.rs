//! One problem found in a case file: where (`path`), what was written (`value`) and which rule
//! it breaks (`rule`), displayed as `path = value: rule`, or `path: rule` when there is no
//! value to show (an unknown or missing key).
//!
//! Paths use the case file's own key names; array positions count from 0, like the position
//! of the entry in the file (`shell.stations[0]` is the first station). Also holds the
//! nearest-key suggestion used for misspelt keys and choices.

use std::fmt;

/// A single problem in a case file or its stations CSV.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct ValidationIssue {
    /// Where: a key path such as `shell.stations[2].wall_m`, or a CSV place such as
    /// `stations.csv line 3, column wall_m`.
    pub path: String,
    /// What was written, as written (numbers in plain notation, strings quoted); `None` for
    /// unknown or missing keys.
    pub value: Option<String>,
    /// The rule it breaks, with a hint where one helps.
    pub rule: String,
}

impl ValidationIssue {
    /// An issue with a value to show.
    pub fn new(path: impl Into<String>, value: impl Into<String>, rule: impl Into<String>) -> Self {
        ValidationIssue {
            path: path.into(),
            value: Some(value.into()),
            rule: rule.into(),
        }
    }

    /// An issue about a key as a whole (unknown, missing, conflicting).
    pub fn key(path: impl Into<String>, rule: impl Into<String>) -> Self {
        ValidationIssue {
            path: path.into(),
            value: None,
            rule: rule.into(),
        }
    }
}

impl fmt::Display for ValidationIssue {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match &self.value {
            Some(v) => write!(f, "{} = {}: {}", self.path, v, self.rule),
            None => write!(f, "{}: {}", self.path, self.rule),
        }
    }
}

/// Levenshtein edit distance between two keys (characters, not bytes).
pub fn edit_distance(a: &str, b: &str) -> usize {
    let b_chars: Vec<char> = b.chars().collect();
    let mut prev: Vec<usize> = (0..=b_chars.len()).collect();
    let mut cur = vec![0; b_chars.len() + 1];
    for (i, ca) in a.chars().enumerate() {
        cur[0] = i + 1;
        for (j, &cb) in b_chars.iter().enumerate() {
            let substitution = prev[j] + usize::from(ca != cb);
            cur[j + 1] = substitution.min(prev[j + 1] + 1).min(cur[j] + 1);
        }
        std::mem::swap(&mut prev, &mut cur);
    }
    prev[b_chars.len()]
}

/// The candidate nearest to `given`, if it is close enough to be a plausible misspelling:
/// at most a third of the longer name's characters differ (at least 2 allowed), or one
/// name contains the other (a missing unit suffix such as `wall` for `wall_m`), or `given`
/// is one edit away from the candidate's first word (`densty` for `density_kg_m3`).
pub fn nearest<'a>(given: &str, candidates: &[&'a str]) -> Option<&'a str> {
    let given_lc = given.to_lowercase();
    candidates
        .iter()
        .map(|&c| (edit_distance(&given_lc, c), c))
        .filter(|&(d, c)| {
            let longest = given_lc.chars().count().max(c.chars().count());
            d <= (longest / 3).max(2)
                || (given_lc.len() >= 3 && (c.contains(&given_lc) || given_lc.contains(c)))
                || (given_lc.len() >= 4
                    && edit_distance(&given_lc, c.split('_').next().unwrap_or(c)) <= 1)
        })
        .min_by_key(|&(d, _)| d)
        .map(|(_, c)| c)
}

/// "did you mean X?" when one candidate is close, else the full list of valid names.
pub fn suggestion(given: &str, candidates: &[&str]) -> String {
    match nearest(given, candidates) {
        Some(c) => format!("did you mean {c}?"),
        None => format!("valid keys here: {}", candidates.join(", ")),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn display_with_and_without_value() {
        let with = ValidationIssue::new("shell.stations[2].wall_m", "0.9", "too thick");
        assert_eq!(
            with.to_string(),
            "shell.stations[2].wall_m = 0.9: too thick"
        );
        let without = ValidationIssue::key("shell.foo", "unknown key");
        assert_eq!(without.to_string(), "shell.foo: unknown key");
    }

    #[test]
    fn edit_distance_basics() {
        assert_eq!(edit_distance("", ""), 0);
        assert_eq!(edit_distance("abc", ""), 3);
        assert_eq!(edit_distance("kitten", "sitting"), 3);
        assert_eq!(
            edit_distance("elastic_modulus_gp", "elastic_modulus_gpa"),
            1
        );
    }

    #[test]
    fn nearest_picks_close_names_only() {
        let keys = [
            "elastic_modulus_gpa",
            "density_kg_m3",
            "poisson_ratio",
            "wall_m",
        ];
        assert_eq!(
            nearest("elastic_modulus_gp", &keys),
            Some("elastic_modulus_gpa")
        );
        assert_eq!(nearest("densty_kg_m3", &keys), Some("density_kg_m3"));
        assert_eq!(nearest("wall", &keys), Some("wall_m"));
        assert_eq!(nearest("colour", &keys), None);
        assert_eq!(
            suggestion("colour", &["a_m", "b_m"]),
            "valid keys here: a_m, b_m"
        );
    }
}
