//! Risk speed: Monte Carlo samples of the invented demo stack through the shortcut (modes
//! reused) and through the re-solve path (every sample edited, validated and re-solved).
//! Prints a table; run with `cargo bench --bench risk`. Wall-clock seconds on the current
//! machine, all cores (rayon); targets from issue 17: 1 000 000 samples with E, damping,
//! Strouhal and c_lat uncertain in under 10 s; 100 000 samples with lining mass and
//! foundation stiffness uncertain too in under 30 s.
//!
//! With the demo's base springs E does not scale the whole stiffness matrix: E samples take
//! their modes from the stiffness family (interpolated over full solves, built once; its
//! build time is the "setup" column). The fixed-base row is the exact sqrt(E) shortcut. The
//! last row measures the opt-in resistance quantities (`--with-resistance`: a
//! cracked-section solve per height and mode in lock-in), which have no target.

use std::path::Path;
use std::time::Instant;

use stackwake::case::Case;
use stackwake::input::{keypath, parse_case_table, parse_case_text, DEMO_CASE_TOML};
use stackwake::risk::distribution::{Distribution, Family};
use stackwake::risk::run::run_range;
use stackwake::risk::{role_of, Engine, Role, Scaling, UncertainInput, C_LAT_FACTOR_KEY};

/// CPU seconds (user + system) of this process so far: on a shared machine the wall time
/// also counts other processes' turns, CPU / threads is the idle-machine estimate.
fn cpu_seconds() -> f64 {
    // SAFETY: getrusage only writes into the struct it is given.
    let mut u: libc::rusage = unsafe { std::mem::zeroed() };
    unsafe { libc::getrusage(libc::RUSAGE_SELF, &mut u) };
    let t = |v: libc::timeval| v.tv_sec as f64 + v.tv_usec as f64 * 1e-6;
    t(u.ru_utime) + t(u.ru_stime)
}

struct Row {
    label: &'static str,
    samples: u64,
    /// Issue 17's target, seconds (`None`: no target, a measurement).
    target_s: Option<f64>,
    springs: bool,
    /// `--with-resistance`: utilisation and fatigue damage per sample.
    resistance: bool,
    keys: Vec<(&'static str, Family, f64, f64)>,
}

fn main() {
    stackwake::process::reuse_freed_blocks();
    let fast = vec![
        ("vortex.log_decrement", Family::Lognormal, 0.03, 0.4),
        ("vortex.strouhal", Family::Lognormal, 0.18, 0.08),
        (C_LAT_FACTOR_KEY, Family::Lognormal, 1.0, 0.25),
    ];
    let mut with_e = vec![("shell.elastic_modulus_gpa", Family::Lognormal, 32.0, 0.15)];
    with_e.extend(fast.iter().copied());
    let mut resolve = with_e.clone();
    resolve.push(("lining[0].mass_per_area_kg_m2", Family::Normal, 240.0, 0.10));
    resolve.push((
        "base.rotational_stiffness_gnm_per_rad",
        Family::Lognormal,
        1500.0,
        0.4,
    ));
    let rows = [
        Row {
            label: "demo (springs): E, damping, St, c_lat",
            samples: 1_000_000,
            target_s: Some(10.0),
            springs: true,
            resistance: false,
            keys: with_e.clone(),
        },
        Row {
            label: "demo, fixed base: E, damping, St, c_lat",
            samples: 1_000_000,
            target_s: Some(10.0),
            springs: false,
            resistance: false,
            keys: with_e.clone(),
        },
        Row {
            label: "demo (springs): damping, St, c_lat",
            samples: 1_000_000,
            target_s: Some(10.0),
            springs: true,
            resistance: false,
            keys: fast.clone(),
        },
        Row {
            label: "demo (springs): E, damping, St, c_lat, lining, rocking spring",
            samples: 100_000,
            target_s: Some(30.0),
            springs: true,
            resistance: false,
            keys: resolve,
        },
        Row {
            label: "demo, fixed base: E, damping, St, c_lat, --with-resistance",
            samples: 8_192,
            target_s: None,
            springs: false,
            resistance: true,
            keys: with_e.clone(),
        },
    ];
    println!(
        "{:<64} {:>10} {:>10} {:>8} {:>9} {:>12} {:>14} {:>8}",
        "case and uncertain keys",
        "samples",
        "path",
        "setup s",
        "seconds",
        "us/sample",
        "CPU s/threads",
        "target"
    );
    for row in rows {
        let mut table = parse_case_text(DEMO_CASE_TOML, "demo").unwrap();
        if !row.springs {
            table.remove("base");
        }
        let case = parse_case_table(table.clone(), Path::new(""), "demo").unwrap();
        let inputs: Vec<UncertainInput> = row
            .keys
            .iter()
            .map(|&(key, family, mean, cov)| UncertainInput {
                key: key.into(),
                role: role_of(key, Scaling::of(false, row.springs)),
                distribution: Distribution::from_mean_cov(family, mean, cov),
                described: String::new(),
                case_value: mean,
            })
            .collect();
        let full = |values: &[f64]| -> Result<Case, String> {
            let mut t = table.clone();
            for (inp, &x) in inputs.iter().zip(values) {
                if inp.role != Role::CLatFactor {
                    keypath::insert_number(&mut t, &inp.key, x).map_err(|e| e.to_string())?;
                }
            }
            parse_case_table(t, Path::new(""), "demo").map_err(|e| e.to_string())
        };
        let setup = Instant::now();
        let mut engine = Engine::new(&case, &inputs, 1, &full).unwrap();
        if row.resistance {
            engine = engine.with_resistance().unwrap();
        }
        let setup_s = setup.elapsed().as_secs_f64();
        let c0 = cpu_seconds();
        let t = Instant::now();
        let (acc, _) = run_range(&engine, 0, row.samples, None, &|_| {});
        let s = t.elapsed().as_secs_f64();
        let cpu = (cpu_seconds() - c0) / rayon::current_num_threads() as f64;
        assert_eq!(acc.samples + acc.invalid, row.samples);
        println!(
            "{:<64} {:>10} {:>10} {:>8.2} {:>9.2} {:>12.2} {:>14.2} {:>8}",
            row.label,
            row.samples,
            match (engine.shortcut, engine.family.is_some()) {
                (true, true) => "family",
                (true, false) => "shortcut",
                _ => "re-solve",
            },
            setup_s,
            s,
            s * 1e6 / row.samples as f64,
            cpu,
            row.target_s
                .map_or("-".to_string(), |t| format!("{t:.0} s"))
        );
    }
    println!(
        "threads: {}; wall-clock seconds include other processes' turns on a shared machine",
        rayon::current_num_threads()
    );
}
