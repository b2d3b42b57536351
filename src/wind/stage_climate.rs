//! The wind, duration and damping a stage is judged with.
//!
//! A construction stage lasts months, not the design life, so EN 1991-1-6 lets its design
//! wind have a shorter return period (Table 3.1, from memory; see `probability`). The stage's
//! mean speeds are the site's 50-year speeds times c_prob (EN 1991-1-4 (4.2)): they enter the
//! E.1.2 screen, the Table E.3 ratio of approach 1 and every speed printed for the stage.
//! Fatigue cycles are a different matter: they count how often the site's wind climate
//! passes the critical speed, so they keep v_0 from the 50-year mean speed and are counted
//! over the stage's duration (an in-service stage: the design life). The stage's own
//! structural log decrement (default `vortex.log_decrement`) enters its Scruton number.
//!
//! Units: years, m/s; c_prob and the log decrement are dimensionless.

use serde::Serialize;

use crate::case::{Case, Stage, Wind};

use super::probability;

/// What one stage is judged with.
#[derive(Debug, Clone, Copy, Serialize)]
pub struct StageClimate {
    /// The stage's duration, years; `None` = in service.
    pub duration_years: Option<f64>,
    /// Years the fatigue cycles are counted over (duration, or the design life).
    pub judged_years: f64,
    /// Return period of the stage's design wind, years.
    pub return_period_years: f64,
    /// True when the case file gives `return_period_years` for the stage (else the default:
    /// 50 years in service, EN 1991-1-6 Table 3.1 from the duration).
    pub return_period_given: bool,
    /// EN 1991-1-4 (4.2) factor on the site's mean speeds.
    pub c_prob: f64,
    /// Structural log decrement of the stage.
    pub log_decrement: f64,
    /// True when the case file gives `log_decrement` for the stage.
    pub log_decrement_given: bool,
    /// The site's wind scaled by `c_prob`: the stage's design wind.
    pub wind: Wind,
    /// The site's (50-year) wind: v_0 of the fatigue count comes from it.
    pub site_wind: Wind,
}

impl StageClimate {
    /// The climate of `stage` at a site whose 50-year wind is `site_wind`.
    pub fn of(case: &Case, stage: &Stage, site_wind: &Wind) -> Self {
        let c_prob = probability::stage_c_prob(stage, site_wind);
        StageClimate {
            duration_years: stage.duration_years,
            judged_years: stage.judged_years(case.vortex.design_life_years),
            return_period_years: probability::stage_return_period_years(stage),
            return_period_given: stage.return_period_years.is_some(),
            c_prob,
            log_decrement: stage.log_decrement(&case.vortex),
            log_decrement_given: stage.log_decrement.is_some(),
            wind: site_wind.scaled(c_prob),
            site_wind: *site_wind,
        }
    }

    /// True for a stage judged as in service (no duration).
    pub fn in_service(&self) -> bool {
        self.duration_years.is_none()
    }
}
