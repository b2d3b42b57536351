//! The reverse direction: the lab's measurements on the model converted to the prototype
//! with the plan's scale factors (prototype = model x k): speed x k_v, amplitude x k_l,
//! strain x 1, stress x k_E, frequency x k_f (i.e. frequency / (1/k_f)). Stress at the
//! prototype is also available from a measured strain as E_prototype x strain, which is
//! the same as model stress x k_E for a linear-elastic model.

use serde::Serialize;

use super::factors::ScaleFactors;

/// One measurement on the model (model units, SI).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct ModelMeasurement {
    /// Tunnel (model) wind speed, m/s.
    pub speed_m_s: f64,
    /// Peak across-wind tip amplitude, m.
    pub tip_amplitude_m: Option<f64>,
    /// Peak strain (dimensionless).
    pub strain: Option<f64>,
    /// Peak stress, Pa.
    pub stress_pa: Option<f64>,
    /// Response frequency, Hz.
    pub frequency_hz: Option<f64>,
}

/// One measurement converted to the prototype (SI).
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct PrototypeValues {
    pub model_speed_m_s: f64,
    pub prototype_speed_m_s: f64,
    pub prototype_tip_amplitude_m: Option<f64>,
    pub strain: Option<f64>,
    /// From a measured stress x k_E, or else from the strain x E_prototype, Pa.
    pub prototype_stress_pa: Option<f64>,
    pub prototype_frequency_hz: Option<f64>,
}

/// Converts model measurements to prototype values. `prototype_modulus_pa` turns a strain
/// into a stress when no stress was measured.
pub fn to_prototype(
    rows: &[ModelMeasurement],
    k: &ScaleFactors,
    prototype_modulus_pa: f64,
) -> Vec<PrototypeValues> {
    rows.iter()
        .map(|r| PrototypeValues {
            model_speed_m_s: r.speed_m_s,
            prototype_speed_m_s: r.speed_m_s * k.velocity,
            prototype_tip_amplitude_m: r.tip_amplitude_m.map(|a| a * k.displacement),
            strain: r.strain.map(|e| e * k.strain),
            prototype_stress_pa: r
                .stress_pa
                .map(|s| s * k.stress)
                .or(r.strain.map(|e| e * k.strain * prototype_modulus_pa)),
            prototype_frequency_hz: r.frequency_hz.map(|f| f * k.frequency),
        })
        .collect()
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn each_quantity_uses_its_factor() {
        let k = ScaleFactors::new(100.0, 2.0, 10.0);
        let out = to_prototype(
            &[ModelMeasurement {
                speed_m_s: 3.0,
                tip_amplitude_m: Some(0.002),
                strain: Some(1e-5),
                stress_pa: None,
                frequency_hz: Some(4.0),
            }],
            &k,
            30e9,
        );
        let o = out[0];
        assert!((o.prototype_speed_m_s - 3.0 * k.velocity).abs() < 1e-12);
        assert!((o.prototype_tip_amplitude_m.unwrap() - 0.2).abs() < 1e-12);
        assert_eq!(o.strain, Some(1e-5));
        assert!((o.prototype_stress_pa.unwrap() - 3e5).abs() < 1e-6);
        assert!((o.prototype_frequency_hz.unwrap() - 4.0 * k.frequency).abs() < 1e-12);
    }
}
