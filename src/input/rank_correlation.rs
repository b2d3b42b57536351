//! `[[rank_correlation]]` tables (risk screening): Spearman rank correlations between pairs
//! of `[[uncertain]]` keys, our own syntax (the case-file contract leaves it open):
//!
//! ```toml
//! [[rank_correlation]]
//! keys = ["shell.elastic_modulus_gpa", "vortex.log_decrement"]
//! coefficient = -0.3      # Spearman's rank correlation, -1 < coefficient < 1
//! ```
//!
//! Rules, every problem collected with its field path: both keys are `[[uncertain]]` keys,
//! not the same key, each unordered pair at most once, the coefficient a finite number with
//! |coefficient| < 1, and all pairs together possible (the normal-score correlation matrix
//! R_ij = 2 sin(pi rho_ij / 6) positive definite, see [`crate::risk::correlation`]); an
//! error there names the pairs involved. Unitless.

use toml::{Table, Value};

use super::decode::render;
use super::issue::ValidationIssue;
use super::uncertain::UncertainEntry;
use crate::risk::correlation::{
    normal_score_correlation, Copula, CorrelationError, CorrelationInfo, RankPair,
};

/// Largest number of `[[rank_correlation]]` entries (every pair of 64 inputs).
pub const MAX_PAIRS: usize = 64 * 63 / 2;

const KEYS: &[&str] = &["keys", "coefficient"];

/// What the reader found: the pairs (input indices), their description and warnings.
#[derive(Debug, Clone, PartialEq, Default)]
pub struct RankCorrelations {
    pub pairs: Vec<RankPair>,
    pub info: Vec<CorrelationInfo>,
    pub copula: Copula,
    pub warnings: Vec<String>,
}

/// Reads the `[[rank_correlation]]` entries of a case table against its `[[uncertain]]`
/// entries (absent = none).
pub fn read(
    table: &Table,
    entries: &[UncertainEntry],
) -> Result<RankCorrelations, Vec<ValidationIssue>> {
    let items = super::uncertain::table_array(
        table,
        "rank_correlation",
        MAX_PAIRS,
        " (every pair of 64 inputs)",
    )?;
    if items.is_empty() {
        return Ok(RankCorrelations::default());
    }
    let mut issues = Vec::new();
    let mut pairs: Vec<RankPair> = Vec::new();
    // Entry number of each accepted pair, for messages.
    let mut entry_of: Vec<usize> = Vec::new();
    for (i, item) in items.iter().enumerate() {
        if let Some(p) = read_entry(i, item, entries, &mut issues) {
            if let Some(k) = pairs.iter().position(|q| q.a == p.a && q.b == p.b) {
                issues.push(ValidationIssue::new(
                    format!("rank_correlation[{i}].keys"),
                    pair_text(entries, &p),
                    format!(
                        "this pair is already correlated by rank_correlation[{}]: give each \
                         pair once",
                        entry_of[k]
                    ),
                ));
                continue;
            }
            pairs.push(p);
            entry_of.push(i);
        }
    }
    if !issues.is_empty() {
        return Err(issues);
    }
    let copula = match Copula::new(&pairs) {
        Ok(c) => c,
        Err(CorrelationError::NotPositiveDefinite { input, pivot }) => {
            // The leading block up to `input` (members are in input order) is where the
            // factorisation fails: name the pairs inside it.
            let involved: Vec<String> = pairs
                .iter()
                .zip(&entry_of)
                .filter(|(p, _)| p.b <= input)
                .map(|(p, e)| {
                    format!(
                        "rank_correlation[{e}] {} = {}",
                        pair_text(entries, p),
                        p.spearman
                    )
                })
                .collect();
            return Err(vec![ValidationIssue::new(
                "rank_correlation",
                involved.join("; "),
                format!(
                    "these rank correlations cannot hold together: the normal-score \
                     correlation matrix R_ij = 2 sin(pi rho_ij / 6) must be positive definite \
                     (Cholesky pivot {pivot:.3e} at {:?}); make them weaker or consistent in \
                     sign",
                    entries[input].key
                ),
            )]);
        }
    };
    let mut warnings = Vec::new();
    let info = pairs
        .iter()
        .map(|p| {
            for &k in &[p.a, p.b] {
                if entries[k].distribution.is_fixed() {
                    warnings.push(format!(
                        "rank correlation {}: the distribution of {:?} is a single value (not \
                         continuous), so the correlation has no effect on it",
                        pair_text(entries, p),
                        entries[k].key
                    ));
                }
            }
            CorrelationInfo {
                keys: [entries[p.a].key.clone(), entries[p.b].key.clone()],
                spearman: p.spearman,
                normal_score_correlation: normal_score_correlation(p.spearman),
            }
        })
        .collect();
    Ok(RankCorrelations {
        pairs,
        info,
        copula,
        warnings,
    })
}

fn pair_text(entries: &[UncertainEntry], p: &RankPair) -> String {
    format!("[{:?}, {:?}]", entries[p.a].key, entries[p.b].key)
}

fn read_entry(
    i: usize,
    v: &Value,
    entries: &[UncertainEntry],
    issues: &mut Vec<ValidationIssue>,
) -> Option<RankPair> {
    let path = format!("rank_correlation[{i}]");
    let before = issues.len();
    let t = super::uncertain::entry_table(&path, v, KEYS, issues)?;
    let want_keys = "expected two [[uncertain]] keys, e.g. [\"shell.elastic_modulus_gpa\", \
                     \"vortex.log_decrement\"]";
    let index = |s: &str| entries.iter().position(|e| e.key == s.trim());
    let keys = match t.get("keys") {
        Some(Value::Array(a)) if a.len() == 2 => {
            let mut idx = [0usize; 2];
            let mut ok = true;
            for (n, k) in a.iter().enumerate() {
                match k {
                    Value::String(s) => match index(s) {
                        Some(j) => idx[n] = j,
                        None => {
                            issues.push(ValidationIssue::new(
                                format!("{path}.keys[{n}]"),
                                format!("{s:?}"),
                                format!(
                                    "not an [[uncertain]] key; uncertain keys: {}",
                                    if entries.is_empty() {
                                        "none".to_string()
                                    } else {
                                        entries
                                            .iter()
                                            .map(|e| format!("{:?}", e.key))
                                            .collect::<Vec<_>>()
                                            .join(", ")
                                    }
                                ),
                            ));
                            ok = false;
                        }
                    },
                    other => {
                        issues.push(ValidationIssue::new(
                            format!("{path}.keys[{n}]"),
                            render(other),
                            want_keys,
                        ));
                        ok = false;
                    }
                }
            }
            if ok && idx[0] == idx[1] {
                issues.push(ValidationIssue::new(
                    format!("{path}.keys"),
                    render(&t["keys"]),
                    "a key cannot be correlated with itself: give two different keys",
                ));
                ok = false;
            }
            ok.then_some(idx)
        }
        Some(other) => {
            issues.push(ValidationIssue::new(
                format!("{path}.keys"),
                render(other),
                want_keys,
            ));
            None
        }
        None => {
            issues.push(ValidationIssue::key(
                format!("{path}.keys"),
                format!("missing: {want_keys}"),
            ));
            None
        }
    };
    let coefficient = match t.get("coefficient") {
        Some(Value::Float(f)) if f.is_finite() => Some(*f),
        Some(Value::Integer(n)) => Some(*n as f64),
        Some(other) => {
            issues.push(ValidationIssue::new(
                format!("{path}.coefficient"),
                render(other),
                "expected a finite number (Spearman's rank correlation, -1 < coefficient < 1)",
            ));
            None
        }
        None => {
            issues.push(ValidationIssue::key(
                format!("{path}.coefficient"),
                "missing: give Spearman's rank correlation, -1 < coefficient < 1",
            ));
            None
        }
    };
    if let Some(c) = coefficient {
        if c.abs() >= 1.0 {
            issues.push(ValidationIssue::new(
                format!("{path}.coefficient"),
                format!("{c}"),
                "must be strictly between -1 and 1 (|coefficient| = 1 makes one input a \
                 function of the other: sample it once instead)",
            ));
        }
    }
    if issues.len() > before {
        return None;
    }
    let [x, y] = keys?;
    Some(RankPair {
        a: x.min(y),
        b: x.max(y),
        spearman: coefficient?,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    const UNCERTAIN: &str = r#"
[[uncertain]]
key = "vortex.strouhal"
distribution = "normal"
mean = 0.18
cov = 0.05
[[uncertain]]
key = "vortex.log_decrement"
distribution = "lognormal"
mean = 0.03
cov = 0.3
[[uncertain]]
key = "uncertainty.c_lat_factor"
distribution = "uniform"
low = 1.0
high = 1.0
"#;

    fn read_text(extra: &str) -> Result<RankCorrelations, Vec<String>> {
        let t: Table = toml::from_str(&format!("{UNCERTAIN}\n{extra}")).unwrap();
        let e = super::super::uncertain::read(&t).unwrap();
        read(&t, &e).map_err(|v| v.iter().map(|i| i.to_string()).collect())
    }

    #[test]
    fn reads_pairs_in_input_order_and_warns_of_fixed_marginals() {
        let r = read_text(
            "[[rank_correlation]]\nkeys = [\"vortex.log_decrement\", \"vortex.strouhal\"]\ncoefficient = -0.3\n\
             [[rank_correlation]]\nkeys = [\"vortex.strouhal\", \"uncertainty.c_lat_factor\"]\ncoefficient = 0.2\n",
        )
        .unwrap();
        assert_eq!(
            r.pairs[0],
            RankPair {
                a: 0,
                b: 1,
                spearman: -0.3
            }
        );
        // Keys are listed in [[uncertain]] order, whatever order the pair was written in.
        assert_eq!(r.info[0].keys[0], "vortex.strouhal");
        assert_eq!(r.warnings.len(), 1, "{:?}", r.warnings);
        assert!(r.warnings[0].contains("uncertainty.c_lat_factor"));
        assert!(read_text("").unwrap().pairs.is_empty());
    }

    #[test]
    fn names_every_bad_field() {
        let m = read_text(
            "[[rank_correlation]]\nkeys = [\"vortex.strouhal\", \"shell.elastic_modulus_gpa\"]\ncoefficient = 0.3\n\
             [[rank_correlation]]\nkeys = [\"vortex.strouhal\", \"vortex.strouhal\"]\ncoefficient = 0.3\n\
             [[rank_correlation]]\nkeys = [\"vortex.strouhal\", \"vortex.log_decrement\"]\ncoefficient = 1.0\n\
             [[rank_correlation]]\nkeys = \"vortex.strouhal\"\nrho = 0.1\n",
        )
        .unwrap_err();
        assert!(m[0].starts_with("rank_correlation[0].keys[1] = \"shell.elastic_modulus_gpa\": not an [[uncertain]] key"), "{m:?}");
        assert!(
            m[1].contains("rank_correlation[1].keys") && m[1].contains("itself"),
            "{m:?}"
        );
        assert!(
            m[2].starts_with(
                "rank_correlation[2].coefficient = 1: must be strictly between -1 and 1"
            ),
            "{m:?}"
        );
        assert!(
            m.iter()
                .any(|s| s.starts_with("rank_correlation[3].rho: unknown key")),
            "{m:?}"
        );
        assert!(
            m.iter()
                .any(|s| s.starts_with("rank_correlation[3].keys = ")),
            "{m:?}"
        );
        let m = read_text(
            "[[rank_correlation]]\nkeys = [\"vortex.strouhal\", \"vortex.log_decrement\"]\ncoefficient = 0.3\n\
             [[rank_correlation]]\nkeys = [\"vortex.log_decrement\", \"vortex.strouhal\"]\ncoefficient = 0.1\n",
        )
        .unwrap_err();
        assert!(
            m[0].contains("already correlated by rank_correlation[0]"),
            "{m:?}"
        );
    }

    #[test]
    fn refuses_impossible_combinations_naming_the_pairs() {
        let m = read_text(
            "[[rank_correlation]]\nkeys = [\"vortex.strouhal\", \"vortex.log_decrement\"]\ncoefficient = 0.9\n\
             [[rank_correlation]]\nkeys = [\"vortex.log_decrement\", \"uncertainty.c_lat_factor\"]\ncoefficient = 0.9\n\
             [[rank_correlation]]\nkeys = [\"vortex.strouhal\", \"uncertainty.c_lat_factor\"]\ncoefficient = -0.9\n",
        )
        .unwrap_err();
        assert_eq!(m.len(), 1);
        assert!(
            m[0].starts_with("rank_correlation = rank_correlation[0]"),
            "{m:?}"
        );
        assert!(m[0].contains("rank_correlation[2]"), "{m:?}");
        assert!(m[0].contains("must be positive definite"), "{m:?}");
    }
}
