//! The distributions of `[[uncertain]]` inputs and how a uniform number becomes a sample:
//! inverse transform x = F^-1(u), with truncation to [a, b] done exactly by mapping u onto
//! [F(a), F(b)] first (so a truncated sample costs the same as an untruncated one and no
//! sample is ever rejected).
//!
//! Parameters are given as mean and coefficient of variation (cov = sd / mean), or for the
//! uniform distribution as low and high:
//! - normal: x = mean + sd z, z = Phi^-1(u);
//! - lognormal: ln x normal with s^2 = ln(1 + cov^2), m = ln(mean) - s^2 / 2, so that x has
//!   exactly the given mean and cov (any statistics text; e.g. JCSS Probabilistic Model
//!   Code, Part 1, Annex);
//! - uniform: low + (high - low) u; from mean and cov the half-width is sqrt(3) sd;
//! - gumbel (largest values, type I): F(x) = exp(-exp(-(x - mu) / beta)),
//!   beta = sd sqrt(6) / pi, mu = mean - gamma_E beta, gamma_E = 0.5772156649015329 (Euler's
//!   constant) (any statistics text; common practice).
//!
//! Phi^-1 is computed by Halley's iteration on Phi(x) = u with Phi from `libm::erfc`,
//! started from Abramowitz & Stegun 26.2.23 (from memory; only a starting value, the
//! iteration converges to rounding). Checked against scipy.stats.norm.ppf in the tests.
//! Units: those of the key being sampled.

use std::f64::consts::{PI, SQRT_2};

use serde::{Deserialize, Serialize};

/// Euler's constant gamma_E.
const EULER_GAMMA: f64 = 0.577_215_664_901_532_9;

/// Which family.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum Family {
    Normal,
    Lognormal,
    Uniform,
    Gumbel,
}

impl Family {
    /// The case-file spelling.
    pub fn key(self) -> &'static str {
        match self {
            Family::Normal => "normal",
            Family::Lognormal => "lognormal",
            Family::Uniform => "uniform",
            Family::Gumbel => "gumbel",
        }
    }

    /// From the case-file spelling.
    pub fn from_key(s: &str) -> Option<Family> {
        Some(match s {
            "normal" => Family::Normal,
            "lognormal" => Family::Lognormal,
            "uniform" => Family::Uniform,
            "gumbel" => Family::Gumbel,
            _ => return None,
        })
    }
}

/// A validated distribution (parameters already in the family's own form).
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Deserialize)]
pub struct Distribution {
    pub family: Family,
    /// normal: mean; lognormal: m of ln x; uniform: low; gumbel: mu.
    pub a: f64,
    /// normal: sd; lognormal: s of ln x; uniform: high; gumbel: beta.
    pub b: f64,
    /// CDF at the lower and upper truncation points (0 and 1 when not truncated).
    pub u_low: f64,
    pub u_high: f64,
}

/// Why a distribution cannot be built (the reader adds the field path).
#[derive(Debug, Clone, PartialEq)]
pub enum DistributionError {
    /// Truncation leaves no probability.
    NoMass { probability: f64 },
}

/// Standard normal CDF Phi(x) = erfc(-x / sqrt 2) / 2.
pub fn normal_cdf(x: f64) -> f64 {
    0.5 * libm::erfc(-x / SQRT_2)
}

/// Standard normal inverse CDF for 0 < p < 1.
pub fn normal_quantile(p: f64) -> f64 {
    if p <= 0.0 {
        return f64::NEG_INFINITY;
    }
    if p >= 1.0 {
        return f64::INFINITY;
    }
    if p > 0.5 {
        // 1 - p is exact for p in (0.5, 1).
        return -normal_quantile(1.0 - p);
    }
    // Abramowitz & Stegun 26.2.23 start (|error| < 4.5e-4, from memory).
    let t = (-2.0 * p.ln()).sqrt();
    let mut x = -(t
        - (2.515_517 + 0.802_853 * t + 0.010_328 * t * t)
            / (1.0 + 1.432_788 * t + 0.189_269 * t * t + 0.001_308 * t * t * t));
    for _ in 0..8 {
        let f = normal_cdf(x) - p;
        let pdf = (-0.5 * x * x).exp() / (2.0 * PI).sqrt();
        if pdf == 0.0 {
            break;
        }
        let r = f / pdf;
        let step = r / (1.0 + 0.5 * x * r);
        x -= step;
        if step.abs() <= 1e-15 * (1.0 + x.abs()) {
            break;
        }
    }
    x
}

impl Distribution {
    /// From mean and cov (> 0; the reader checks), untruncated.
    pub fn from_mean_cov(family: Family, mean: f64, cov: f64) -> Distribution {
        let sd = cov * mean.abs();
        let (a, b) = match family {
            Family::Normal => (mean, sd),
            Family::Lognormal => {
                let s2 = (1.0 + cov * cov).ln();
                (mean.ln() - 0.5 * s2, s2.sqrt())
            }
            Family::Uniform => {
                let h = 3.0f64.sqrt() * sd;
                (mean - h, mean + h)
            }
            Family::Gumbel => {
                let beta = sd * 6.0f64.sqrt() / PI;
                (mean - EULER_GAMMA * beta, beta)
            }
        };
        Distribution {
            family,
            a,
            b,
            u_low: 0.0,
            u_high: 1.0,
        }
    }

    /// Uniform on [low, high] (low <= high; low = high is a fixed value).
    pub fn uniform(low: f64, high: f64) -> Distribution {
        Distribution {
            family: Family::Uniform,
            a: low,
            b: high,
            u_low: 0.0,
            u_high: 1.0,
        }
    }

    /// Restricted to [low, high] (either may be absent).
    pub fn truncated(
        mut self,
        low: Option<f64>,
        high: Option<f64>,
    ) -> Result<Distribution, DistributionError> {
        let lo = low.map_or(0.0, |x| self.cdf(x));
        let hi = high.map_or(1.0, |x| self.cdf(x));
        let degenerate_uniform = self.family == Family::Uniform && self.a == self.b;
        if hi - lo <= 0.0 && !degenerate_uniform {
            return Err(DistributionError::NoMass {
                probability: (hi - lo).max(0.0),
            });
        }
        if degenerate_uniform {
            let inside = low.is_none_or(|l| l <= self.a) && high.is_none_or(|h| h >= self.a);
            if !inside {
                return Err(DistributionError::NoMass { probability: 0.0 });
            }
            return Ok(self);
        }
        self.u_low = lo;
        self.u_high = hi;
        Ok(self)
    }

    /// Untruncated CDF.
    pub fn cdf(&self, x: f64) -> f64 {
        match self.family {
            Family::Normal => normal_cdf((x - self.a) / self.b),
            Family::Lognormal => {
                if x <= 0.0 {
                    0.0
                } else {
                    normal_cdf((x.ln() - self.a) / self.b)
                }
            }
            Family::Uniform => {
                if self.b == self.a {
                    if x < self.a {
                        0.0
                    } else {
                        1.0
                    }
                } else {
                    ((x - self.a) / (self.b - self.a)).clamp(0.0, 1.0)
                }
            }
            Family::Gumbel => (-(-(x - self.a) / self.b).exp()).exp(),
        }
    }

    /// Untruncated inverse CDF, 0 < p < 1.
    pub fn quantile_untruncated(&self, p: f64) -> f64 {
        match self.family {
            Family::Normal => self.a + self.b * normal_quantile(p),
            Family::Lognormal => (self.a + self.b * normal_quantile(p)).exp(),
            Family::Uniform => self.a + (self.b - self.a) * p,
            Family::Gumbel => self.a - self.b * (-p.ln()).ln(),
        }
    }

    /// The sample for uniform number `u` in (0, 1) (truncation applied).
    #[inline]
    pub fn sample(&self, u: f64) -> f64 {
        let p = self.u_low + (self.u_high - self.u_low) * u;
        // Guard the ends: rounding may put p on 0 or 1 in a far tail.
        let p = p.clamp(f64::MIN_POSITIVE, 1.0 - f64::EPSILON / 2.0);
        self.quantile_untruncated(p)
    }

    /// Mean of the untruncated distribution.
    pub fn mean_untruncated(&self) -> f64 {
        match self.family {
            Family::Normal => self.a,
            Family::Lognormal => (self.a + 0.5 * self.b * self.b).exp(),
            Family::Uniform => 0.5 * (self.a + self.b),
            Family::Gumbel => self.a + EULER_GAMMA * self.b,
        }
    }

    /// Whether every sample is the same value.
    pub fn is_fixed(&self) -> bool {
        (self.family == Family::Uniform && self.a == self.b) || self.u_low == self.u_high
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn normal_quantile_matches_scipy() {
        // scipy.stats.norm.ppf (scipy 1.17), printed with repr.
        let cases = [
            (0.5, 0.0),
            (0.05, -1.6448536269514729),
            (0.975, 1.959963984540054),
            (1e-6, -4.753424308822899),
            (1e-12, -7.034483825301131),
            (0.999, 3.090232306167813),
        ];
        for (p, want) in cases {
            let got = normal_quantile(p);
            assert!(
                (got - want).abs() <= 1e-13 * (1.0 + want.abs()),
                "{p}: {got} vs {want}"
            );
        }
    }

    #[test]
    fn moments_follow_mean_and_cov() {
        for family in [
            Family::Normal,
            Family::Lognormal,
            Family::Uniform,
            Family::Gumbel,
        ] {
            let d = Distribution::from_mean_cov(family, 32.0, 0.1);
            assert!((d.mean_untruncated() - 32.0).abs() < 1e-12, "{family:?}");
            // Median by the quantile and the CDF agree.
            let x = d.quantile_untruncated(0.3);
            assert!((d.cdf(x) - 0.3).abs() < 1e-13, "{family:?}");
        }
    }

    #[test]
    fn truncation_keeps_samples_inside_and_refuses_empty_ranges() {
        let d = Distribution::from_mean_cov(Family::Normal, 1.0, 0.2)
            .truncated(Some(0.9), Some(1.1))
            .unwrap();
        for i in 1..100 {
            let x = d.sample(i as f64 / 100.0);
            assert!((0.9..=1.1).contains(&x), "{x}");
        }
        let e = Distribution::from_mean_cov(Family::Normal, 1.0, 0.01)
            .truncated(Some(5.0), None)
            .unwrap_err();
        assert_eq!(e, DistributionError::NoMass { probability: 0.0 });
        assert!(Distribution::uniform(2.0, 3.0)
            .truncated(Some(3.5), None)
            .is_err());
        assert!(Distribution::uniform(2.0, 2.0)
            .truncated(Some(1.0), None)
            .is_ok());
    }
}
