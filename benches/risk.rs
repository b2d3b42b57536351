//! Risk speed: Monte Carlo samples of the invented demo stack through the shortcut (modes
//! reused) and through the re-solve path (every sample edited, validated and re-solved).
//! Prints a table; run with `cargo bench --bench risk`. Wall-clock seconds on the current
//! machine, all cores (rayon); targets from issue 17: 1 000 000 samples with E, damping,
//! Strouhal and c_lat uncertain in under 10 s; 100 000 samples with lining mass and
//! foundation stiffness uncertain too in under 30 s.
//!
//! With the demo's base springs E does not scale the whole stiffness matrix, so E samples
//! re-solve there; the E shortcut row uses the demo with a fixed base.

use std::path::Path;
use std::time::Instant;

use stackwake::case::Case;
use stackwake::input::{keypath, parse_case_table, parse_case_text, DEMO_CASE_TOML};
use stackwake::risk::distribution::{Distribution, Family};
use stackwake::risk::run::run_range;
use stackwake::risk::{role_of, Engine, Role, UncertainInput, C_LAT_FACTOR_KEY};

struct Row {
    label: &'static str,
    samples: u64,
    target_s: f64,
    springs: bool,
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
            label: "demo, fixed base: E, damping, St, c_lat",
            samples: 1_000_000,
            target_s: 10.0,
            springs: false,
            keys: with_e.clone(),
        },
        Row {
            label: "demo (springs): damping, St, c_lat",
            samples: 1_000_000,
            target_s: 10.0,
            springs: true,
            keys: fast.clone(),
        },
        Row {
            label: "demo (springs): E, damping, St, c_lat, lining, rocking spring",
            samples: 100_000,
            target_s: 30.0,
            springs: true,
            keys: resolve,
        },
    ];
    println!(
        "{:<64} {:>10} {:>10} {:>9} {:>12} {:>8}",
        "case and uncertain keys", "samples", "path", "seconds", "us/sample", "target"
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
                role: role_of(key, !row.springs),
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
        let engine = Engine::new(&case, &inputs, 1, &full).unwrap();
        let t = Instant::now();
        let (acc, _) = run_range(&engine, 0, row.samples, None, &|_| {});
        let s = t.elapsed().as_secs_f64();
        assert_eq!(acc.samples + acc.invalid, row.samples);
        println!(
            "{:<64} {:>10} {:>10} {:>9.2} {:>12.2} {:>7.0} s",
            row.label,
            row.samples,
            if engine.shortcut {
                "shortcut"
            } else {
                "re-solve"
            },
            s,
            s * 1e6 / row.samples as f64,
            row.target_s
        );
    }
    println!("threads: {}", rayon::current_num_threads());
}
