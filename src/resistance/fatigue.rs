//! Fatigue damage of the vertical reinforcement, EN 1992-1-1 6.8.4: S-N curve of
//! Table 6.3N for straight bars (N* = 1e6, k1 = 5, k2 = 9, Delta sigma_Rsk = 162.5 MPa),
//! the applied range multiplied by gamma_F,fat (recommended 1.0) and the resisting range
//! divided by gamma_S,fat (1.15), Palmgren-Miner sum (6.70). Both factors are case-file keys
//! (`[design] gamma_f_fat`, `gamma_s_fat`), passed in here.
//!
//! Sources read: a public copy (French edition) of EN 1992-1-1 6.8.4 with Table 6.3N
//! and the note on gamma_F,fat; gamma_S,fat = 1.15 because the 2.4.2.4 (1) note recommends
//! the persistent-situation factors of Table 2.1N (gamma_s = 1.15) for gamma_S,fat, as
//! quoted from the standard in a public question-answering corpus (see
//! data/reference/README.md, "RC shell resistance"). Units: Pa, cycles.

/// An S-N curve of EN 1992-1-1 Figure 6.30 / Table 6.3N.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct SnCurve {
    /// N*, cycles at the knee.
    pub knee_cycles: f64,
    /// Slope k1 left of the knee (N < N*).
    pub k1: f64,
    /// Slope k2 right of the knee.
    pub k2: f64,
    /// Delta sigma_Rsk at N* cycles, Pa.
    pub reference_range_pa: f64,
}

impl SnCurve {
    /// Table 6.3N, straight and bent bars (bent-bar reduction not applied: chimney verticals
    /// are straight).
    pub const STRAIGHT_BARS: SnCurve = SnCurve {
        knee_cycles: 1.0e6,
        k1: 5.0,
        k2: 9.0,
        reference_range_pa: 162.5e6,
    };

    /// Cycles to failure N(Delta sigma) for the design range `gamma_f_fat * range_pa` against
    /// the resisting curve divided by `gamma_s_fat`.
    pub fn cycles_to_failure(&self, range_pa: f64, gamma_f_fat: f64, gamma_s_fat: f64) -> f64 {
        let applied = gamma_f_fat * range_pa;
        if applied <= 0.0 {
            return f64::INFINITY;
        }
        let resisting = self.reference_range_pa / gamma_s_fat;
        let ratio = resisting / applied;
        let k = if ratio <= 1.0 { self.k1 } else { self.k2 };
        self.knee_cycles * ratio.powf(k)
    }

    /// Miner damage n / N(Delta sigma) of `cycles` cycles of one range.
    pub fn damage(&self, range_pa: f64, cycles: f64, gamma_f_fat: f64, gamma_s_fat: f64) -> f64 {
        if cycles <= 0.0 || range_pa <= 0.0 {
            return 0.0;
        }
        cycles / self.cycles_to_failure(range_pa, gamma_f_fat, gamma_s_fat)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn damage_by_hand_from_the_sn_formula() {
        // EN 1992-1-1 6.8.4, Table 6.3N straight bars. By hand: range 100 MPa, gamma_F 1.0,
        // gamma_S 1.15: resisting 162.5/1.15 = 141.304 MPa > 100, so k2 = 9:
        // N = 1e6 (1.41304)^9 = 2.2459e7 cycles; 1e7 cycles -> D = 0.44525.
        let c = SnCurve::STRAIGHT_BARS;
        let n = c.cycles_to_failure(100e6, 1.0, 1.15);
        let hand = 1e6 * (162.5f64 / 1.15 / 100.0).powi(9);
        assert!((n - hand).abs() / hand < 1e-12);
        assert!((hand - 2.2459e7).abs() / 2.2459e7 < 1e-4, "{hand}");
        let d = c.damage(100e6, 1e7, 1.0, 1.15);
        assert!((d - 0.44525).abs() < 1e-4, "{d}");
        // Above the knee: 200 MPa -> k1 = 5: N = 1e6 (141.304/200)^5 = 1.7605e5.
        let n = c.cycles_to_failure(200e6, 1.0, 1.15);
        assert!((n - 1.7605e5).abs() / 1.7605e5 < 1e-4, "{n}");
        // At the knee the two branches meet: N = N*.
        let n = c.cycles_to_failure(162.5e6 / 1.15, 1.0, 1.15);
        assert!((n - 1e6).abs() < 1e-3);
    }
}
