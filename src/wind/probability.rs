//! Wind speed of a chosen return period, and the return period of an execution stage.
//!
//! * [`c_prob`]: the probability factor of EN 1991-1-4 4.2(2)P Note 4, expression (4.2),
//!   c_prob = ((1 - K ln(-ln(1 - p))) / (1 - K ln(-ln(0.98))))^n with p = 1 / return period,
//!   K = 0.2 and n = 0.5 recommended. It multiplies the 50-year (p = 0.02) mean speed, so every
//!   mean speed of a profile scales by it. Read in two public copies of the expression: the
//!   eurocodes-tools.com page "Probability factor cprob" and the notebook
//!   "EC1-4 - Wind speed probabilities" of the public repository `pcachim/eurocodesnb` (both
//!   give K = 0.2, n = 0.5 as the recommended values).
//! * [`execution_return_period_years`]: the recommended return period of the characteristic
//!   climatic actions for an execution stage of a given duration, EN 1991-1-6 Table 3.1
//!   (**from memory**: no public copy of the table was found; see data/reference/README.md):
//!   up to 3 days -> 2 years, up to 3 months -> 5 years, up to 1 year -> 10 years, longer ->
//!   50 years.
//!
//! Units: years; c_prob is dimensionless.

use crate::case::{Stage, Wind};

/// Recommended shape parameter K of expression (4.2) (EN 1991-1-4 4.2(2)P Note 4).
pub const C_PROB_K: f64 = 0.2;
/// Recommended exponent n of expression (4.2) (EN 1991-1-4 4.2(2)P Note 4).
pub const C_PROB_N: f64 = 0.5;
/// Annual exceedance probability of the basic wind velocity (EN 1991-1-4 4.2(2)P, 50 years).
pub const BASIC_ANNUAL_PROBABILITY: f64 = 0.02;
/// Return period of the basic wind velocity and of an in-service stage, years.
pub const IN_SERVICE_RETURN_PERIOD_YEARS: f64 = 50.0;

/// Days per year used to turn EN 1991-1-6's "3 days" into years (365, common practice).
const DAYS_PER_YEAR: f64 = 365.0;
/// A duration written to the bound in rounded form (0.00822 for 3 days) keeps its class:
/// bounds are compared with this relative allowance.
const BOUND_ALLOWANCE: f64 = 1e-3;

/// EN 1991-1-6 Table 3.1 (from memory): (longest duration in years, return period in years).
pub const EXECUTION_RETURN_PERIODS: [(f64, f64); 3] =
    [(3.0 / DAYS_PER_YEAR, 2.0), (0.25, 5.0), (1.0, 10.0)];
/// The durations of [`EXECUTION_RETURN_PERIODS`] as Table 3.1 writes them, for the note.
pub const EXECUTION_DURATION_WORDS: [&str; 3] = ["3 days", "3 months", "1 year"];

/// The probability factor c_prob of EN 1991-1-4 expression (4.2) for a return period of
/// `return_period_years` (> 1), with shape parameter `k` and exponent `n`. 1 at 50 years.
/// Not finite or not positive for a return period at or below 1 year, or where
/// 1 - K ln(-ln(1 - p)) <= 0 (the caller's validation refuses such input).
pub fn c_prob(return_period_years: f64, k: f64, n: f64) -> f64 {
    let p = 1.0 / return_period_years;
    let numerator = 1.0 - k * (-(-p).ln_1p()).ln();
    let denominator = 1.0 - k * (-(-BASIC_ANNUAL_PROBABILITY).ln_1p()).ln();
    (numerator / denominator).powf(n)
}

/// The recommended return period of an execution stage lasting `duration_years`
/// (EN 1991-1-6 Table 3.1, from memory), years.
pub fn execution_return_period_years(duration_years: f64) -> f64 {
    EXECUTION_RETURN_PERIODS
        .iter()
        .find(|(longest, _)| duration_years <= longest * (1.0 + BOUND_ALLOWANCE))
        .map_or(IN_SERVICE_RETURN_PERIOD_YEARS, |&(_, years)| years)
}

/// Return period of a stage's design wind, years: the stage's own value; else 50 years for
/// an in-service stage (the basic wind velocity, EN 1991-1-4 4.2(2)P) and, for a stage with a
/// duration, [`execution_return_period_years`] of that duration.
pub fn stage_return_period_years(stage: &Stage) -> f64 {
    stage.return_period_years.unwrap_or_else(|| {
        stage.duration_years.map_or(
            IN_SERVICE_RETURN_PERIOD_YEARS,
            execution_return_period_years,
        )
    })
}

/// c_prob of a stage with the site's K and n.
pub fn stage_c_prob(stage: &Stage, wind: &Wind) -> f64 {
    c_prob(
        stage_return_period_years(stage),
        wind.c_prob_k,
        wind.c_prob_n,
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn fifty_years_is_the_basic_speed() {
        assert!((c_prob(50.0, C_PROB_K, C_PROB_N) - 1.0).abs() < 1e-15);
    }

    #[test]
    fn shorter_return_periods_give_lower_speeds() {
        let c = |t: f64| c_prob(t, C_PROB_K, C_PROB_N);
        assert!(c(2.0) < c(5.0) && c(5.0) < c(10.0) && c(10.0) < c(50.0) && c(50.0) < c(100.0));
        assert!(!c(1.0).is_finite() || c(1.0) <= 0.0);
    }

    #[test]
    fn table_bounds_keep_their_class() {
        assert_eq!(execution_return_period_years(0.00822), 2.0);
        assert_eq!(execution_return_period_years(0.25), 5.0);
        assert_eq!(execution_return_period_years(0.26), 10.0);
        assert_eq!(execution_return_period_years(1.0), 10.0);
        assert_eq!(execution_return_period_years(1.01), 50.0);
    }
}
