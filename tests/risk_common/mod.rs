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
