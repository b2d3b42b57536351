//! Critical wind speeds of the modes, the design wind speed at the top, and the Reynolds
//! number mismatch between prototype and model.
//!
//! Critical speed v_crit,i = b n_i / St (EN 1991-1-4 E.1.3.1), St = `vortex.strouhal` or
//! 0.18 for a circular section at every Re (EN 1991-1-4 Annex E, Figure E.1, from memory),
//! b = the outer diameter where the mode's displacement is largest (the top for mode 1).
//! This is a deliberately small stand-in for the wind module's shedding model.
//!
//! Reynolds number Re = b v / nu (EN 1991-1-4 E.1.3.4). The model runs at Re / (k_l k_v)
//! in the same air. Flow regimes of a smooth circular cylinder (Roshko, J. Fluid Mech. 10
//! (1961); boundaries from memory, they move with surface roughness and turbulence):
//! sub-critical below 3e5 (laminar separation, St ~ 0.2, strong regular shedding),
//! critical 3e5 to 5e5 (drag crisis; this is where EN 1991-1-4 Figure E.2 drops c_lat,0
//! from 0.7 to 0.2), super-critical 5e5 to 3.5e6 (weak, irregular shedding), trans-critical
//! above 3.5e6 (turbulent separation; regular shedding returns).

use serde::Serialize;

use crate::case::{Case, Profile};
use crate::modal::Mode;

/// Strouhal number of a circular section (EN 1991-1-4 Annex E, Figure E.1, from memory).
pub const CIRCULAR_STROUHAL: f64 = 0.18;

/// The Strouhal number used for the critical speeds.
pub fn strouhal(case: &Case) -> f64 {
    case.vortex.strouhal.unwrap_or(CIRCULAR_STROUHAL)
}

/// Shedding diameter of a mode: the outer diameter at the node of largest |displacement|,
/// m, with that node's height.
pub fn shedding_diameter_m(z_m: &[f64], outer_diameter_m: &[f64], mode: &Mode) -> (f64, f64) {
    let mut best = 0;
    for (i, w) in mode.displacement.iter().enumerate() {
        if w.abs() > mode.displacement[best].abs() {
            best = i;
        }
    }
    (z_m[best], outer_diameter_m[best])
}

/// v_crit = b n / St, m/s (EN 1991-1-4 E.1.3.1).
pub fn critical_speed_m_s(diameter_m: f64, frequency_hz: f64, strouhal: f64) -> f64 {
    diameter_m * frequency_hz / strouhal
}

/// Re = b v / nu (EN 1991-1-4 E.1.3.4).
pub fn reynolds(diameter_m: f64, speed_m_s: f64, kinematic_viscosity_m2_s: f64) -> f64 {
    diameter_m * speed_m_s / kinematic_viscosity_m2_s
}

/// Flow regime of a smooth circular cylinder.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
pub enum FlowRegime {
    SubCritical,
    Critical,
    SuperCritical,
    TransCritical,
}

impl FlowRegime {
    /// The regime at Reynolds number `re` (boundaries from memory, see the module doc).
    pub fn of(re: f64) -> FlowRegime {
        if re < 3e5 {
            FlowRegime::SubCritical
        } else if re < 5e5 {
            FlowRegime::Critical
        } else if re < 3.5e6 {
            FlowRegime::SuperCritical
        } else {
            FlowRegime::TransCritical
        }
    }

    pub fn label(self) -> &'static str {
        match self {
            FlowRegime::SubCritical => "sub-critical",
            FlowRegime::Critical => "critical",
            FlowRegime::SuperCritical => "super-critical",
            FlowRegime::TransCritical => "trans-critical",
        }
    }
}

/// Mean wind speed at height `z_m` of the case's profile, m/s: the power law
/// v_ref (z / z_ref)^alpha, or the EN 1991-1-4 4.3 log law scaled to v_ref at z_ref,
/// v_ref ln(max(z, z_min) / z0) / ln(max(z_ref, z_min) / z0).
/// `None` when the case has no `[wind]`.
pub fn mean_speed_m_s(case: &Case, z_m: f64) -> Option<f64> {
    let w = case.wind.as_ref()?;
    Some(match w.profile {
        Profile::Power { exponent } => {
            w.reference_speed_m_s * (z_m / w.reference_height_m).powf(exponent)
        }
        Profile::Log {
            roughness_m,
            z_min_m,
        } => {
            w.reference_speed_m_s * (z_m.max(z_min_m) / roughness_m).ln()
                / (w.reference_height_m.max(z_min_m) / roughness_m).ln()
        }
    })
}

/// The cautions that go with every Reynolds comparison (common practice).
pub fn cautions() -> Vec<String> {
    vec![
        "The Reynolds number is not matched: with the same air the model runs at Re / (k_l k_v). \
         A prototype in the super- or trans-critical range is tested in the sub-critical range, \
         where shedding is stronger and more regular, the lift coefficient larger (EN 1991-1-4 \
         Figure E.2: c_lat,0 0.7 instead of 0.2-0.3) and the lock-in band wider: model amplitudes \
         are usually conservative, but not reliably so."
            .into(),
        "Common remedies: roughen the model surface (sand, ribs or trip wires) to move its flow \
         towards the prototype's regime, calibrate the roughness on a rigid sectional model, and \
         report results as a function of Re where the tunnel allows."
            .into(),
        "The approaching flow must be scaled too: mean profile and turbulence intensity of the \
         site at k_l; turbulence weakens lock-in."
            .into(),
    ]
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn critical_speed_of_the_references_worked_check() {
        // data/reference/README.md worked check: b = 4 m, n1 = 0.5 Hz, St = 0.18 -> 11.111 m/s,
        // Re = 2.963e6 with nu = 1.5e-5 (EN 1991-1-4 E.1.3.1 and E.1.3.4).
        let v = critical_speed_m_s(4.0, 0.5, 0.18);
        assert!((v - 11.1111).abs() < 1e-3);
        assert!((reynolds(4.0, v, 1.5e-5) / 2.963e6 - 1.0).abs() < 1e-3);
    }

    #[test]
    fn regimes_are_ordered() {
        assert_eq!(FlowRegime::of(1e4), FlowRegime::SubCritical);
        assert_eq!(FlowRegime::of(4e5), FlowRegime::Critical);
        assert_eq!(FlowRegime::of(1e6), FlowRegime::SuperCritical);
        assert_eq!(FlowRegime::of(1e7), FlowRegime::TransCritical);
    }
}
