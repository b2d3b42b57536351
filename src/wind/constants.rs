//! Registry of the method constants whose values were implemented without the published
//! standard at hand: each entry says its value, where it is used, and what it has been
//! checked against since (a public copy of the standard, or nothing: "from
//! memory"). The design note renders this list as one table in its method section, and a
//! unit test checks that every entry carries a source status, so a constant cannot be added
//! here without saying where it comes from.
//!
//! The values are taken from the constants the code uses (not retyped) where a single
//! constant exists, so the table cannot drift from the calculation.
//! Sources and search record: data/reference/README.md, section "Constants registry".

use crate::wind::{approach1, approach2, fatigue, gb50009, probability, shedding};

/// How far a constant has been checked.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum SourceStatus {
    /// Agrees with a public copy of the standard (named in `checked_against`).
    ConfirmedByPublicText,
    /// Recalled from the standard; no public text found that states it.
    FromMemory,
    /// Our own reading or choice where the standard gives a chart or nothing.
    OurOwnChoice,
}

impl SourceStatus {
    /// Short label for the note.
    pub fn label(self) -> &'static str {
        match self {
            SourceStatus::ConfirmedByPublicText => "confirmed",
            SourceStatus::FromMemory => "from memory",
            SourceStatus::OurOwnChoice => "our own choice",
        }
    }
}

/// One constant of the methods.
#[derive(Debug, Clone, PartialEq)]
pub struct ConstantEntry {
    /// Symbol and clause, e.g. "St (EN 1991-1-4 E.1.3.2, Figure E.1)".
    pub name: &'static str,
    /// The value as used (text, so tables and rules can be listed too).
    pub value: String,
    /// Where the code uses it.
    pub used_in: &'static str,
    pub status: SourceStatus,
    /// What it was checked against (repository and path of the public copy), or
    /// what was searched without result.
    pub checked_against: &'static str,
}

const SWE: &str = "repo of GitHub user mpentek (TU Munich wind engineering course notebooks), Ex04WindEffOnStructHighrise/\
                   swe_ws2021_4_2_structural_effects.ipynb";
const VIV: &str = "repo EricS98/VIV-Time-Domain-Simulation-Tool";
const GB: &str = "repo longyu8101/GB50009, build/html/H.html and docs/8.html (the text of source/H.rst and source/8.rst)";
const NOT_FOUND: &str = "no public text found that states it (searches listed in \
                         data/reference/README.md)";

/// Every constant of the vortex-shedding methods not read from the published standard.
pub fn registry() -> Vec<ConstantEntry> {
    use SourceStatus::*;
    let e = |name, value: String, used_in, status, checked_against| ConstantEntry {
        name,
        value,
        used_in,
        status,
        checked_against,
    };
    let lambda1 = gb50009::LAMBDA_TOWERS[0][0];
    vec![
        e(
            "St, circular section (EN 1991-1-4 E.1.3.2)",
            format!("{}", shedding::STROUHAL_CIRCULAR_EN),
            "v_crit of both EN approaches (default when vortex.strouhal is not given)",
            FromMemory,
            NOT_FOUND,
        ),
        e(
            "screening factor (E.1.2)",
            format!("v_crit > {} v_m", shedding::SCREENING_FACTOR),
            "E.1.2 screening of every mode",
            ConfirmedByPublicText,
            SWE,
        ),
        e(
            "c_lat,0 corners (Figure E.2)",
            "0.7 (Re <= 3e5), 0.2 (5e5 to 5e6), 0.3 (>= 1e7)".into(),
            "approach 1",
            ConfirmedByPublicText,
            VIV,
        ),
        e(
            "c_lat,0 between corners (Figure E.2)",
            "linear in log10(Re)".into(),
            "approach 1",
            OurOwnChoice,
            "our reading of the log-Re chart; the same interpolation in repo \
             EricS98/VIV-Time-Domain-Simulation-Tool, common/math_utils.py (loglin)",
        ),
        e(
            "Table E.3 (c_lat vs v_crit/v_m,Lj)",
            "1 to 0.83; 3 - 2.4 ratio to 1.25; 0 above".into(),
            "approach 1",
            ConfirmedByPublicText,
            SWE,
        ),
        e(
            "Table E.4 (L_j/b vs y_F/b)",
            "6; 4.8 + 12 y_F/b; 12".into(),
            "approach 1",
            ConfirmedByPublicText,
            SWE,
        ),
        e(
            "K_W cap (E.8)",
            format!("{}", approach1::KW_MAX),
            "approach 1",
            ConfirmedByPublicText,
            SWE,
        ),
        e(
            "K, cantilever mode 1 (Table E.5)",
            format!(
                "{} (test value; the note uses the integral E.9)",
                approach1::K_CANTILEVER_TABLE
            ),
            "tests of the K integral",
            ConfirmedByPublicText,
            SWE,
        ),
        e(
            "a_L (Table E.7, approach 2)",
            format!("{}", approach2::A_L),
            "approach 2",
            ConfirmedByPublicText,
            VIV,
        ),
        e(
            "K_a,max (approach 2)",
            "2.0 (Re <= 1e5), 0.5 (5e5), 1.0 (>= 1e6)".into(),
            "approach 2 (K_a = K_a,max)",
            ConfirmedByPublicText,
            VIV,
        ),
        e(
            "k_p (approach 2)",
            "sqrt(2) [1 + 1.2 atan(0.75 (Sc / (4 pi K_a))^4)]".into(),
            "approach 2",
            ConfirmedByPublicText,
            VIV,
        ),
        e(
            "C_c (approach 2)",
            "0.02 (Re <= 1e5), 0.005 (5e5), 0.01 (>= 1e6)".into(),
            "approach 2",
            FromMemory,
            NOT_FOUND,
        ),
        e(
            "epsilon_0, approach 1 (load cycles)",
            format!("{}", fatigue::EPS0_APPROACH1),
            "fatigue cycles, approach 1",
            FromMemory,
            NOT_FOUND,
        ),
        e(
            "epsilon_0, approach 2 (load cycles)",
            format!("{}", fatigue::EPS0_APPROACH2),
            "fatigue cycles, approach 2",
            FromMemory,
            NOT_FOUND,
        ),
        e(
            "v_0 / v_m (load cycles)",
            format!("{}", fatigue::V0_PER_MEAN_SPEED),
            "fatigue cycles",
            FromMemory,
            NOT_FOUND,
        ),
        e(
            "T per year of design life (load cycles)",
            format!("{:.1e} s", fatigue::SECONDS_PER_YEAR),
            "fatigue cycles",
            FromMemory,
            NOT_FOUND,
        ),
        e(
            "in-line group: St(a/b)",
            "0.1 + 0.085 log10(a/b) for 1 <= a/b <= 9; 0.18 beyond".into(),
            "[vortex.group] in-line",
            FromMemory,
            NOT_FOUND,
        ),
        e(
            "in-line group: c_lat factor",
            "1.5 for a/b <= 10; 1 for a/b >= 15; linear between".into(),
            "[vortex.group] in-line",
            FromMemory,
            NOT_FOUND,
        ),
        e(
            "GB 50009: St, Re = 69000 v D",
            format!(
                "St = {}, Re factor {}",
                gb50009::STROUHAL_GB,
                gb50009::REYNOLDS_FACTOR
            ),
            "GB 50009 comparison",
            ConfirmedByPublicText,
            GB,
        ),
        e(
            "GB 50009: w = |lambda| v_cr^2 phi / (12800 zeta)",
            format!("12800 (kN/m2) = {} in Pa", gb50009::LOAD_DIVISOR_SI),
            "GB 50009 comparison",
            ConfirmedByPublicText,
            GB,
        ),
        e(
            "GB 50009: Table H.1.1 (towers)",
            format!("lambda_1 at H1/H = 0: {lambda1}, ... (4 modes x 11 rows)"),
            "GB 50009 comparison",
            ConfirmedByPublicText,
            GB,
        ),
        e(
            "c_prob, EN 1991-1-4 4.2(2)P Note 4, expression (4.2)",
            format!(
                "((1 - K ln(-ln(1 - p))) / (1 - K ln(-ln(0.98))))^n, p = 1 / T; K = {}, n = {}",
                probability::C_PROB_K,
                probability::C_PROB_N
            ),
            "every mean speed of a stage whose return period is not 50 years",
            ConfirmedByPublicText,
            "repo pcachim/eurocodesnb (notebook \"EC1-4 - Wind speed probabilities\"); also \
             the page \"Probability factor cprob\" of eurocodes-tools.com",
        ),
        e(
            "return periods of execution stages (EN 1991-1-6 Table 3.1)",
            probability::EXECUTION_RETURN_PERIODS
                .iter()
                .zip(probability::EXECUTION_DURATION_WORDS)
                .map(|((d, t), words)| format!("up to {words} ({d:.4} years): {t} years"))
                .chain([format!(
                    "longer: {} years",
                    probability::IN_SERVICE_RETURN_PERIOD_YEARS
                )])
                .collect::<Vec<_>>()
                .join("; "),
            "default return_period_years of a stage with duration_years",
            FromMemory,
            NOT_FOUND,
        ),
    ]
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_entry_names_its_source_status() {
        let r = registry();
        assert!(r.len() >= 15);
        for e in &r {
            assert!(!e.value.is_empty(), "{}: value", e.name);
            assert!(!e.used_in.is_empty(), "{}: where used", e.name);
            assert!(
                !e.checked_against.is_empty(),
                "{}: what it was checked against",
                e.name
            );
            if e.status == SourceStatus::ConfirmedByPublicText {
                assert!(
                    e.checked_against.starts_with("repo "),
                    "{}: a confirmation names the repository",
                    e.name
                );
            }
        }
        // The still unconfirmed constants of the issue are listed as such.
        for name in [
            "St, circular",
            "C_c",
            "epsilon_0, approach 1",
            "v_0 / v_m",
            "in-line group",
        ] {
            assert!(
                r.iter()
                    .any(|e| e.name.starts_with(name) && e.status == SourceStatus::FromMemory),
                "{name}"
            );
        }
    }
}
