//! EN 1991-1-4 Annex E approach 2 (E.1.5.3, spectral method; from memory, unverified):
//!
//! (sigma_y / b)^2 = c1 + sqrt(c1^2 + c2)
//! c1 = (a_L^2 / 2)(1 - Sc / (4 pi K_a))
//! c2 = (rho b^2 / m_e)(a_L^2 / K_a)(C_c^2 / St^4)(b / h)
//! y_max = k_p sigma_y,  k_p = sqrt(2) [1 + 1.2 atan(0.75 (Sc / (4 pi K_a))^4)]
//!
//! Table E.6 (circular section, from memory): Re <= 1e5: C_c = 0.02, K_a,max = 2.0;
//! Re = 5e5: 0.005, 0.5; Re >= 1e6: 0.01, 1.0; a_L = 0.4. Between the listed Re we interpolate
//! linearly in log10(Re) (our choice, consistent with our reading of Figure E.2). K_a = K_a,max
//! is used, the conservative zero-turbulence value.
//! Units: m, kg/m, kg/m3; the rest dimensionless.

use std::f64::consts::PI;

use serde::Serialize;

/// Normalised limiting amplitude a_L (Table E.6, from memory).
pub const A_L: f64 = 0.4;

/// (C_c, K_a,max) of a circular section at Reynolds number `reynolds` (Table E.6, from memory;
/// log10(Re) interpolation between rows is our choice).
pub fn table_e6(reynolds: f64) -> (f64, f64) {
    const ROWS: [(f64, f64, f64); 3] = [(1e5, 0.02, 2.0), (5e5, 0.005, 0.5), (1e6, 0.01, 1.0)];
    if reynolds <= ROWS[0].0 {
        return (ROWS[0].1, ROWS[0].2);
    }
    for w in ROWS.windows(2) {
        let ((r0, c0, k0), (r1, c1, k1)) = (w[0], w[1]);
        if reynolds <= r1 {
            let t = (reynolds / r0).log10() / (r1 / r0).log10();
            return (c0 + t * (c1 - c0), k0 + t * (k1 - k0));
        }
    }
    (ROWS[2].1, ROWS[2].2)
}

/// Peak factor k_p = sqrt(2) [1 + 1.2 atan(0.75 (Sc / (4 pi K_a))^4)].
pub fn peak_factor(scruton: f64, k_a: f64) -> f64 {
    let r = scruton / (4.0 * PI * k_a);
    std::f64::consts::SQRT_2 * (1.0 + 1.2 * (0.75 * r.powi(4)).atan())
}

/// Inputs of approach 2 for one mode.
#[derive(Debug, Clone, Copy)]
pub struct Approach2Params {
    pub diameter_m: f64,
    pub strouhal: f64,
    pub scruton: f64,
    pub equivalent_mass_kg_m: f64,
    pub air_density_kg_m3: f64,
    /// Height of the structure h, m.
    pub height_m: f64,
    pub reynolds: f64,
}

/// Approach 2 result.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct Amplitude2 {
    pub c_c: f64,
    pub k_a: f64,
    pub a_l: f64,
    /// Standard deviation of the displacement at the largest antinode, m.
    pub sigma_y_m: f64,
    pub peak_factor: f64,
    /// Peak amplitude at the largest antinode, m.
    pub y_max_m: f64,
}

/// Approach 2 amplitude (see the module doc).
pub fn amplitude(p: &Approach2Params) -> Amplitude2 {
    let (c_c, k_a) = table_e6(p.reynolds);
    let b = p.diameter_m;
    let a2 = A_L * A_L;
    let c1 = 0.5 * a2 * (1.0 - p.scruton / (4.0 * PI * k_a));
    let c2 = p.air_density_kg_m3 * b * b / p.equivalent_mass_kg_m
        * (a2 / k_a)
        * (c_c * c_c / p.strouhal.powi(4))
        * (b / p.height_m);
    let root = (c1 * c1 + c2).sqrt();
    // c1 + root cancels badly when c1 < 0 (high Sc): use c2 / (root - c1) there.
    let var = if c1 >= 0.0 {
        c1 + root
    } else {
        c2 / (root - c1)
    };
    let sigma_y_m = b * var.sqrt();
    let k_p = peak_factor(p.scruton, k_a);
    Amplitude2 {
        c_c,
        k_a,
        a_l: A_L,
        sigma_y_m,
        peak_factor: k_p,
        y_max_m: k_p * sigma_y_m,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn low_scruton_approaches_the_limiting_amplitude() {
        // Sc -> 0 with negligible c2: sigma_y / b -> a_L (the meaning of a_L, E.1.5.3).
        let a = amplitude(&Approach2Params {
            diameter_m: 1.0,
            strouhal: 0.18,
            scruton: 1e-9,
            equivalent_mass_kg_m: 1e12,
            air_density_kg_m3: 1.25,
            height_m: 50.0,
            reynolds: 2e6,
        });
        assert!((a.sigma_y_m - A_L).abs() < 1e-6);
        assert!((a.peak_factor - std::f64::consts::SQRT_2).abs() < 1e-9);
    }
}
