//! Shared pieces of the `risk` CLI tests: the demo with extra tables, the command, and the
//! four shortcut-path uncertain inputs (invented distributions, for tests only).
#![allow(dead_code)]

use std::path::{Path, PathBuf};

use assert_cmd::Command;

/// Damping, Strouhal number, c_lat factor and wind speed: every sample reuses the modes.
pub const FAST: &str = r#"
[[uncertain]]
key = "vortex.log_decrement"
distribution = "lognormal"
mean = 0.03
cov = 0.3

[[uncertain]]
key = "vortex.strouhal"
distribution = "normal"
mean = 0.18
cov = 0.05
truncate_low = 0.12

[[uncertain]]
key = "uncertainty.c_lat_factor"
distribution = "lognormal"
mean = 1.0
cov = 0.2

[[uncertain]]
key = "wind.reference_speed_m_s"
distribution = "gumbel"
mean = 24.0
cov = 0.12
truncate_high = 60.0
"#;

/// Rank correlations between three of [`FAST`]'s inputs (Gaussian copula: still per
/// sample, so still shardable).
pub const CORRELATIONS: &str = r#"
[[rank_correlation]]
keys = ["vortex.log_decrement", "vortex.strouhal"]
coefficient = -0.3

[[rank_correlation]]
keys = ["wind.reference_speed_m_s", "vortex.strouhal"]
coefficient = 0.5

[[rank_correlation]]
keys = ["uncertainty.c_lat_factor", "vortex.log_decrement"]
coefficient = 0.4
"#;

/// Writes the built-in demo followed by `extra` to `dir/name`.
pub fn case_with(dir: &Path, name: &str, extra: &str) -> PathBuf {
    let p = dir.join(name);
    std::fs::write(&p, format!("{}\n{extra}", stackwake::input::DEMO_CASE_TOML)).unwrap();
    p
}

/// `stackwake risk CASE ARGS --out OUT`.
pub fn risk(case: &Path, args: &[&str], out: &Path) -> assert_cmd::assert::Assert {
    Command::cargo_bin("stackwake")
        .unwrap()
        .arg("risk")
        .arg(case)
        .args(args)
        .arg("--out")
        .arg(out)
        .assert()
}

/// Ranks 0..n-1 (the values are continuous: no ties).
pub fn ranks(x: &[f64]) -> Vec<f64> {
    let mut idx: Vec<usize> = (0..x.len()).collect();
    idx.sort_by(|&a, &b| x[a].total_cmp(&x[b]));
    let mut r = vec![0.0; x.len()];
    for (k, &i) in idx.iter().enumerate() {
        r[i] = k as f64;
    }
    r
}

/// Spearman's rho: Pearson correlation of the ranks.
pub fn spearman(x: &[f64], y: &[f64]) -> f64 {
    let (rx, ry) = (ranks(x), ranks(y));
    let n = x.len() as f64;
    let (mx, my) = (rx.iter().sum::<f64>() / n, ry.iter().sum::<f64>() / n);
    let (mut sxy, mut sxx, mut syy) = (0.0, 0.0, 0.0);
    for (a, b) in rx.iter().zip(&ry) {
        sxy += (a - mx) * (b - my);
        sxx += (a - mx) * (a - mx);
        syy += (b - my) * (b - my);
    }
    sxy / (sxx * syy).sqrt()
}

/// Per (stage, mode) in check order: (vortex utilisation, fatigue damage) of the full
/// `check` of `case` (the `vortex mode N` rows of resistance.csv, EN 1992-1-1 6.1, and the
/// mode's fatigue row, 6.8.4): the reference of the risk resistance tests.
pub fn resistance_per_mode(case: &stackwake::case::Case) -> Vec<(f64, f64)> {
    let stages = stackwake::risk::case_modes(case).unwrap();
    let vr = stackwake::wind::check_all(case, &stages).unwrap();
    let rr = stackwake::resistance::actions::check_case(case, &stages, &vr, &[])
        .unwrap()
        .expect("the case has [reinforcement]");
    let mut out = Vec::new();
    for (sv, sr) in vr.stages.iter().zip(&rr.stages) {
        for m in &sv.modes {
            let action = format!("vortex mode {}", m.mode);
            let u = sr
                .rows
                .iter()
                .filter(|r| r.action == action)
                .map(|r| r.utilisation)
                .fold(0.0, f64::max);
            let d = sr
                .fatigue
                .iter()
                .find(|f| f.mode == m.mode)
                .map_or(0.0, |f| f.damage);
            out.push((u, d));
        }
    }
    out
}
