//! Validation of `[design]`: partial factors, each defaulting to its recommended value.
//!
//! Bounds (errors): gamma_c and gamma_s 1.0-2.0 (EN 1992-1-1 Table 2.1N: 1.5 / 1.15
//! persistent, 1.2 / 1.0 accidental, public quotations of the table; 2.0 a generous ceiling,
//! common practice); alpha_cc 0.8-1.0 (EN 1992-1-1 3.1.6 (1)P note, public copy);
//! gamma_G,sup and gamma_Q 1.0-2.0, gamma_G,inf 0.0-1.0 and not above gamma_G,sup (EN 1990
//! Table A1.2(B): 1.35 / 1.00 / 1.5, as in the public implementations `xcfem/xc` and
//! `DanBeranek/desssign`; sources in data/reference/README.md); the fatigue factors
//! gamma_F,fat and gamma_S,fat 1.0-2.0 (recommended 1.0, EN 1992-1-1 6.8.4 (1) note, and
//! 1.15, the 2.4.2.4 (1) note with Table 2.1N; a factor below 1 would credit the bars with
//! more fatigue life than the S-N curve gives, and 2.0 is a generous ceiling, common
//! practice).

use super::*;
use crate::case::DesignFactors;
use crate::input::raw::RawDesign;

pub(super) fn check_design(c: &mut Checker, raw: Option<&RawDesign>) -> DesignFactors {
    let d = DesignFactors::default();
    let Some(r) = raw else {
        return d;
    };
    let mut pick = |key: &str, v: Option<f64>, default: f64, lo: f64, hi: f64| -> f64 {
        match v {
            None => default,
            Some(x) => {
                let path = format!("design.{key}");
                if c.finite(&path, x) && !(lo..=hi).contains(&x) {
                    c.fail(&path, x, format!("must be between {lo} and {hi}"));
                }
                x
            }
        }
    };
    let f = DesignFactors {
        gamma_c: pick("gamma_c", r.gamma_c, d.gamma_c, 1.0, 2.0),
        gamma_s: pick("gamma_s", r.gamma_s, d.gamma_s, 1.0, 2.0),
        alpha_cc: pick("alpha_cc", r.alpha_cc, d.alpha_cc, 0.8, 1.0),
        gamma_g_sup: pick("gamma_g_sup", r.gamma_g_sup, d.gamma_g_sup, 1.0, 2.0),
        gamma_g_inf: pick("gamma_g_inf", r.gamma_g_inf, d.gamma_g_inf, 0.0, 1.0),
        gamma_q: pick("gamma_q", r.gamma_q, d.gamma_q, 1.0, 2.0),
        gamma_f_fat: pick("gamma_f_fat", r.gamma_f_fat, d.gamma_f_fat, 1.0, 2.0),
        gamma_s_fat: pick("gamma_s_fat", r.gamma_s_fat, d.gamma_s_fat, 1.0, 2.0),
    };
    if f.gamma_g_inf > f.gamma_g_sup {
        c.fail(
            "design.gamma_g_inf",
            f.gamma_g_inf,
            format!(
                "must not exceed design.gamma_g_sup ({})",
                num(f.gamma_g_sup)
            ),
        );
    }
    f
}
