//! `[[uncertain]]` tables (risk screening): which case-file key varies and how. Read from
//! the parsed case table; every problem is collected with its field path
//! (`uncertain[1].cov = -0.1: must be > 0`). Whether each key exists in the case is checked
//! by the risk command with the sweep's own key rules (the same key paths are accepted).
//!
//! Keys of one entry: `key` (case-file key path, or the risk-only
//! [`crate::risk::C_LAT_FACTOR_KEY`]), `distribution` = normal | lognormal | uniform | gumbel,
//! `mean` and `cov` (sd / mean), or for uniform `low` and `high` instead, optional
//! `truncate_low`, `truncate_high`. Units: those of the key.

use toml::{Table, Value};

use super::decode::render;
use super::issue::ValidationIssue;
use crate::risk::distribution::{Distribution, DistributionError, Family};

/// Largest number of `[[uncertain]]` entries.
pub const MAX_UNCERTAIN: usize = 64;

/// One entry as read and checked (the key itself is checked by the caller).
#[derive(Debug, Clone, PartialEq)]
pub struct UncertainEntry {
    pub key: String,
    pub distribution: Distribution,
    /// What the user wrote, one line, for the note and summary.json.
    pub described: String,
}

const KEYS: &[&str] = &[
    "key",
    "distribution",
    "mean",
    "cov",
    "low",
    "high",
    "truncate_low",
    "truncate_high",
];

/// The `[[key]]` tables of a case table (absent = none), refused when `key` is not an array
/// or holds more than `max` entries (`why_max` explains the limit in the message).
pub(crate) fn table_array<'a>(
    table: &'a Table,
    key: &str,
    max: usize,
    why_max: &str,
) -> Result<&'a [Value], Vec<ValidationIssue>> {
    let Some(v) = table.get(key) else {
        return Ok(&[]);
    };
    let Value::Array(entries) = v else {
        return Err(vec![ValidationIssue::new(
            key,
            render(v),
            format!("expected [[{key}]] tables"),
        )]);
    };
    if entries.len() > max {
        return Err(vec![ValidationIssue::new(
            key,
            format!("{} entries", entries.len()),
            format!("at most {max} [[{key}]] entries{why_max}"),
        )]);
    }
    Ok(entries)
}

/// Reads the `[[uncertain]]` entries of a case table (absent = none).
pub fn read(table: &Table) -> Result<Vec<UncertainEntry>, Vec<ValidationIssue>> {
    let entries = table_array(table, "uncertain", MAX_UNCERTAIN, "")?;
    let mut issues = Vec::new();
    let mut out = Vec::new();
    for (i, e) in entries.iter().enumerate() {
        if let Some(entry) = read_entry(i, e, &mut issues) {
            if out.iter().any(|o: &UncertainEntry| o.key == entry.key) {
                issues.push(ValidationIssue::new(
                    format!("uncertain[{i}].key"),
                    format!("{:?}", entry.key),
                    "each key may be uncertain only once",
                ));
            }
            out.push(entry);
        }
    }
    if issues.is_empty() {
        Ok(out)
    } else {
        Err(issues)
    }
}

fn number(t: &Table, path: &str, name: &str, issues: &mut Vec<ValidationIssue>) -> Option<f64> {
    match t.get(name)? {
        Value::Float(f) if f.is_finite() => Some(*f),
        Value::Integer(i) => Some(*i as f64),
        other => {
            issues.push(ValidationIssue::new(
                format!("{path}.{name}"),
                render(other),
                "expected a finite number",
            ));
            None
        }
    }
}

/// Entry `path` of a `[[key]]` array as a table, with an issue for each key not in `known`
/// (`None`, with an issue, when it is not a table).
pub(crate) fn entry_table<'a>(
    path: &str,
    v: &'a Value,
    known: &[&str],
    issues: &mut Vec<ValidationIssue>,
) -> Option<&'a Table> {
    let Value::Table(t) = v else {
        issues.push(ValidationIssue::new(path, render(v), "expected a table"));
        return None;
    };
    for k in t.keys() {
        if !known.contains(&k.as_str()) {
            issues.push(ValidationIssue::key(
                format!("{path}.{k}"),
                format!("unknown key; valid keys: {}", known.join(", ")),
            ));
        }
    }
    Some(t)
}

fn read_entry(i: usize, v: &Value, issues: &mut Vec<ValidationIssue>) -> Option<UncertainEntry> {
    let path = format!("uncertain[{i}]");
    let before = issues.len();
    let t = entry_table(&path, v, KEYS, issues)?;
    let key = match t.get("key") {
        Some(Value::String(s)) if !s.trim().is_empty() => Some(s.trim().to_string()),
        Some(other) => {
            issues.push(ValidationIssue::new(
                format!("{path}.key"),
                render(other),
                "expected a case-file key path in quotes, e.g. \"shell.elastic_modulus_gpa\"",
            ));
            None
        }
        None => {
            issues.push(ValidationIssue::key(
                format!("{path}.key"),
                "missing: give the case-file key path that is uncertain",
            ));
            None
        }
    };
    let family = match t.get("distribution") {
        Some(Value::String(s)) => match Family::from_key(s) {
            Some(f) => Some(f),
            None => {
                issues.push(ValidationIssue::new(
                    format!("{path}.distribution"),
                    format!("{s:?}"),
                    "expected \"normal\", \"lognormal\", \"uniform\" or \"gumbel\"",
                ));
                None
            }
        },
        Some(other) => {
            issues.push(ValidationIssue::new(
                format!("{path}.distribution"),
                render(other),
                "expected \"normal\", \"lognormal\", \"uniform\" or \"gumbel\"",
            ));
            None
        }
        None => {
            issues.push(ValidationIssue::key(
                format!("{path}.distribution"),
                "missing: give normal, lognormal, uniform or gumbel",
            ));
            None
        }
    };
    let mean = number(t, &path, "mean", issues);
    let cov = number(t, &path, "cov", issues);
    let low = number(t, &path, "low", issues);
    let high = number(t, &path, "high", issues);
    let tl = number(t, &path, "truncate_low", issues);
    let th = number(t, &path, "truncate_high", issues);
    let family = family?;
    let dist = match (family, mean, cov, low, high) {
        (Family::Uniform, None, None, Some(lo), Some(hi)) => {
            if lo > hi {
                issues.push(ValidationIssue::new(
                    format!("{path}.high"),
                    format!("{hi}"),
                    format!("must be >= low = {lo}"),
                ));
                None
            } else {
                Some(Distribution::uniform(lo, hi))
            }
        }
        (_, Some(m), Some(c), None, None) => {
            let mut ok = true;
            if c <= 0.0 {
                issues.push(ValidationIssue::new(
                    format!("{path}.cov"),
                    format!("{c}"),
                    "must be > 0 (coefficient of variation = sd / mean; leave the key out of \
                     [[uncertain]] to keep it fixed)",
                ));
                ok = false;
            } else if c > 3.0 {
                issues.push(ValidationIssue::new(
                    format!("{path}.cov"),
                    format!("{c}"),
                    "must be <= 3 (a fraction, not a percentage: 10 % is 0.10)",
                ));
                ok = false;
            }
            if m <= 0.0 {
                issues.push(ValidationIssue::new(
                    format!("{path}.mean"),
                    format!("{m}"),
                    "must be > 0 (the cov is relative to the mean)",
                ));
                ok = false;
            }
            ok.then(|| Distribution::from_mean_cov(family, m, c))
        }
        _ => {
            let want = if family == Family::Uniform {
                "give mean and cov, or low and high (not both)"
            } else {
                "give mean and cov (low and high are for uniform only)"
            };
            issues.push(ValidationIssue::key(
                format!("{path}.{}", if mean.is_none() { "mean" } else { "cov" }),
                want,
            ));
            None
        }
    };
    if let (Some(a), Some(b)) = (tl, th) {
        if a >= b {
            issues.push(ValidationIssue::new(
                format!("{path}.truncate_high"),
                format!("{b}"),
                format!("must be > truncate_low = {a}"),
            ));
            return None;
        }
    }
    let dist = dist?;
    let dist = match dist.truncated(tl, th) {
        Ok(d) => d,
        Err(DistributionError::NoMass { probability }) => {
            issues.push(ValidationIssue::new(
                format!("{path}.truncate_low"),
                format!("{tl:?}..{th:?}"),
                format!(
                    "the truncation keeps probability {probability:.3e} of the distribution: \
                     nothing to sample; widen truncate_low/truncate_high"
                ),
            ));
            return None;
        }
    };
    if issues.len() > before {
        return None;
    }
    let mut described = family.key().to_string();
    match (mean, cov, low, high) {
        (Some(m), Some(c), _, _) => described.push_str(&format!(", mean {m}, cov {c}")),
        (_, _, Some(l), Some(h)) => described.push_str(&format!(", {l} to {h}")),
        _ => {}
    }
    if tl.is_some() || th.is_some() {
        described.push_str(&format!(
            ", truncated to [{}, {}]",
            tl.map_or("-inf".into(), |v| v.to_string()),
            th.map_or("+inf".into(), |v| v.to_string())
        ));
    }
    Some(UncertainEntry {
        key: key?,
        distribution: dist,
        described,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    fn issues(text: &str) -> Vec<String> {
        let t: Table = toml::from_str(text).unwrap();
        read(&t)
            .unwrap_err()
            .iter()
            .map(|i| i.to_string())
            .collect()
    }

    #[test]
    fn reads_entries_and_names_bad_fields() {
        let t: Table = toml::from_str(
            "[[uncertain]]\nkey = \"vortex.strouhal\"\ndistribution = \"normal\"\nmean = 0.18\ncov = 0.05\ntruncate_low = 0.1\n",
        )
        .unwrap();
        let e = read(&t).unwrap();
        assert_eq!(e.len(), 1);
        assert_eq!(
            e[0].described,
            "normal, mean 0.18, cov 0.05, truncated to [0.1, +inf]"
        );
        let m = issues(
            "[[uncertain]]\nkey = \"a.b\"\ndistribution = \"normal\"\nmean = 1.0\ncov = -0.1\n",
        );
        assert!(
            m[0].contains("uncertain[0].cov = -0.1: must be > 0"),
            "{m:?}"
        );
        let m = issues(
            "[[uncertain]]\nkey = \"a.b\"\ndistribution = \"weibull\"\nmean = 1.0\ncov = 0.1\n",
        );
        assert!(m[0].contains("uncertain[0].distribution"), "{m:?}");
        let m = issues("[[uncertain]]\nkey = \"a.b\"\ndistribution = \"normal\"\nmean = 1.0\ncov = 0.01\ntruncate_low = 2.0\n");
        assert!(m[0].contains("keeps probability 0.000e0"), "{m:?}");
        let m = issues("[[uncertain]]\nkey = \"a.b\"\ndistribution = \"normal\"\nmean = 1.0\ncov = 0.1\nsd = 3\n");
        assert!(m[0].contains("uncertain[0].sd"), "{m:?}");
    }
}

#[cfg(test)]
mod starter_tests {
    /// The commented [[uncertain]] examples of the starter template read without a problem.
    #[test]
    fn starter_examples_read() {
        let text = crate::commands::new::STARTER_TOML;
        let start = text
            .find("# [[uncertain]]")
            .expect("starter shows [[uncertain]]");
        let block: String = text[start..]
            .lines()
            .map(|l| {
                l.strip_prefix("# ")
                    .or_else(|| l.strip_prefix('#'))
                    .unwrap_or(l)
            })
            // Prose lines between the examples stay comments.
            .map(|l| {
                if l.trim().is_empty() || l.starts_with('[') || l.contains(" = ") {
                    format!("{l}\n")
                } else {
                    format!("# {l}\n")
                }
            })
            .collect();
        let t: toml::Table = toml::from_str(&block).unwrap();
        let entries = super::read(&t).unwrap();
        assert_eq!(entries.len(), 6);
        assert!(entries
            .iter()
            .any(|e| e.key == crate::risk::C_LAT_FACTOR_KEY));
        // The commented [[rank_correlation]] example pairs two of those keys.
        let rc = crate::input::rank_correlation::read(&t, &entries).unwrap();
        assert_eq!(rc.pairs.len(), 1);
        assert!(rc.warnings.is_empty());
    }
}
