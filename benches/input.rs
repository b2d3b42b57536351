//! Input speed: reading and validating large but accepted case files, the inputs that were
//! once quadratic. A generated 100 000-row stations CSV (the most stations accepted), a case
//! with 1 000 point masses (the most accepted) and one with 100 stages (the most accepted),
//! each read from disk by `input::load_case`. Prints a table; run with
//! `cargo bench --bench input`. Target: the 100 000-station read under 2 s in release.
//! Figures are wall-clock medians of 3 runs on the current machine.

use std::fmt::Write as _;
use std::path::Path;
use std::time::{Duration, Instant};

use stackwake::input::load_case;

/// The demo case's wind and vortex tables (an invented stack).
const WIND_VORTEX: &str = "[wind]\nreference_speed_m_s = 26.0\n\n[vortex]\nmodes = 3\n";

fn shell(stations: &str) -> String {
    format!("title = \"Invented bench case\"\n\n[shell]\nelastic_modulus_gpa = 32.0\ndensity_kg_m3 = 2500.0\n{stations}\n")
}

const INLINE_STATIONS: &str = "stations = [\n  { z_m = 0.0, outer_diameter_m = 16.0, wall_m = 0.5 },\n  { z_m = 200.0, outer_diameter_m = 9.0, wall_m = 0.2 },\n]\n";

fn write_cases(dir: &Path) -> Vec<(&'static str, std::path::PathBuf)> {
    let n = 100_000;
    let mut csv = String::from("z_m,outer_diameter_m,wall_m\n");
    for i in 0..n {
        let z = 200.0 * i as f64 / (n - 1) as f64;
        let _ = writeln!(
            csv,
            "{z:.6},{:.4},{:.4}",
            16.0 - 7.0 * z / 200.0,
            0.5 - 0.3 * z / 200.0
        );
    }
    std::fs::write(dir.join("stations.csv"), csv).unwrap();
    let stations_case = dir.join("stations.toml");
    std::fs::write(
        &stations_case,
        shell("stations_csv = \"stations.csv\"") + WIND_VORTEX,
    )
    .unwrap();

    let mut masses = shell(INLINE_STATIONS);
    for i in 0..1000 {
        let _ = write!(
            masses,
            "\n[[point_mass]]\nz_m = {}\nmass_kg = 1000.0\n",
            i as f64 * 0.2
        );
    }
    let masses_case = dir.join("masses.toml");
    std::fs::write(&masses_case, masses + WIND_VORTEX).unwrap();

    let mut stages = shell(INLINE_STATIONS);
    for i in 0..100 {
        let _ = write!(
            stages,
            "\n[[stage]]\nname = \"to {i} m\"\nlining = false\ntop_z_m = {}\n",
            10.0 + i as f64
        );
    }
    let stages_case = dir.join("stages.toml");
    std::fs::write(&stages_case, stages + WIND_VORTEX).unwrap();
    vec![
        ("100 000 stations (CSV)", stations_case),
        ("1 000 point masses", masses_case),
        ("100 stages", stages_case),
    ]
}

fn main() {
    let dir = std::env::temp_dir().join(format!("stackwake-bench-input-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    println!("{:<26} {:>12}", "read + validate", "median ms");
    for (name, path) in write_cases(&dir) {
        let mut runs: Vec<Duration> = (0..3)
            .map(|_| {
                let t = Instant::now();
                load_case(&path).expect("bench case is valid");
                t.elapsed()
            })
            .collect();
        runs.sort();
        println!("{name:<26} {:>12.1}", runs[1].as_secs_f64() * 1e3);
    }
    let _ = std::fs::remove_dir_all(&dir);
}
