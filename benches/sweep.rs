//! Sweep speed: 10 000 variants x 2 stages x 3 modes with approach 1 (the invented demo stack
//! without its partial-height stage), and the cost breakdown of one stage analysis: mesh and
//! section integration, eigen-solve, modal post-processing, wind checks, the EN along-wind
//! action with its combination at the critical speeds (the demo's [wind] gets
//! terrain_category "II" and basic_speed_m_s 26 for this), and the per-variant
//! case-table edit + validation, and the RC shell resistance along the stage's height (every
//! mesh node, every vortex action; the demo with an invented `[reinforcement]` added).
//! Prints a table; run with `cargo bench --bench sweep`.
//! Figures are wall-clock medians on the current machine.

use std::path::Path;
use std::time::{Duration, Instant};

use stackwake::along::stage_along_wind;
use stackwake::commands::sweep::run_grid;
use stackwake::fem::{lowest_modes, BeamModel};
use stackwake::input::{keypath, parse_case_table, parse_case_text, DEMO_CASE_TOML};
use stackwake::modal::stage_modes;
use stackwake::resistance::{self, along_height::check_stage};
use stackwake::sweep::Vary;
use stackwake::wind;

fn median(mut v: Vec<Duration>) -> Duration {
    v.sort();
    v[v.len() / 2]
}

fn time<F: FnMut()>(runs: usize, mut f: F) -> Duration {
    f();
    median(
        (0..runs)
            .map(|_| {
                let t = Instant::now();
                f();
                t.elapsed()
            })
            .collect(),
    )
}

fn us(d: Duration) -> f64 {
    d.as_secs_f64() * 1e6
}

fn main() {
    // As the binary does at start-up.
    stackwake::process::reuse_freed_blocks();
    let mut table = parse_case_text(DEMO_CASE_TOML, "demo").expect("demo");
    // Two stages (shell only, lined): drop the partial-height stage.
    if let Some(toml::Value::Array(stages)) = table.get_mut("stage") {
        stages.remove(0);
    }
    // The EN site wind, so the sweep also computes the along-wind action (EN 1991-1-4).
    if let Some(toml::Value::Table(w)) = table.get_mut("wind") {
        w.insert("terrain_category".into(), toml::Value::String("II".into()));
        w.insert("basic_speed_m_s".into(), toml::Value::Float(26.0));
    }
    let case = parse_case_table(table.clone(), Path::new("."), "demo").expect("valid");
    assert_eq!(case.stages.len(), 2);
    let stage = case.stages[1].clone();
    let modes = case.vortex.modes;
    let runs = 201;

    let t_mesh = time(runs, || {
        std::hint::black_box(BeamModel::build(&case, &stage, None, modes));
    });
    let beam = BeamModel::build(&case, &stage, None, modes);
    let t_eig = time(runs, || {
        std::hint::black_box(lowest_modes(&beam, modes).expect("solve"));
    });
    let sol = lowest_modes(&beam, modes).expect("solve");
    let t_post = time(runs, || {
        std::hint::black_box(stage_modes(&stage, &beam, &sol));
    });
    let sm = stage_modes(&stage, &beam, &sol);
    let t_wind = time(runs, || {
        std::hint::black_box(wind::check_stage(&case, &sm).unwrap());
    });
    let sv = wind::check_stage(&case, &sm).unwrap();
    let spec = case.along_wind.expect("EN site wind");
    let t_along = time(runs, || {
        std::hint::black_box(stage_along_wind(&case, &spec, &sm, &sv, 1.0).unwrap());
    });
    let t_input = time(runs, || {
        let mut t = table.clone();
        keypath::set_number(&mut t, "shell.elastic_modulus_gpa", 31.0).unwrap();
        std::hint::black_box(parse_case_table(t, Path::new("."), "demo").expect("valid"));
    });
    let total = t_mesh + t_eig + t_post + t_wind + t_along;
    // Resistance: the demo with invented reinforcement (the demo itself has none).
    let rtext = DEMO_CASE_TOML.replacen(
        "[shell]\n",
        "[shell]\ncharacteristic_strength_mpa = 40.0\n",
        1,
    )
        + "\n[reinforcement]\ncharacteristic_strength_mpa = 500.0\n[[reinforcement.zone]]\n\
           from_z_m = 0.0\nto_z_m = 210.0\nouter_ratio = 0.003\ninner_ratio = 0.002\n\
           outer_cover_m = 0.06\ninner_cover_m = 0.05\n";
    let rcase = stackwake::input::parse_case(&rtext, Path::new("."), "demo+steel").expect("valid");
    let rspec = rcase.resistance.clone().expect("reinforcement");
    let rsv = wind::check_stage(&rcase, &sm).unwrap();
    let (actions, fatigue) = resistance::actions::vortex_actions(&rsv, rspec.factors.gamma_q);
    let e_c = rcase.shell.elastic_modulus_pa;
    let t_res = time(runs, || {
        std::hint::black_box(
            check_stage(&stage.name, &rspec, &sm.model, e_c, actions.clone(), &[]).unwrap(),
        );
    });
    let t_res_fat = time(runs, || {
        std::hint::black_box(
            check_stage(
                &stage.name,
                &rspec,
                &sm.model,
                e_c,
                actions.clone(),
                &fatigue,
            )
            .unwrap(),
        );
    });
    println!(
        "one stage analysis (lined, {} elements, {modes} modes), single thread, median of {runs}",
        beam.elements.len()
    );
    println!("{:<44} {:>10}", "part", "us");
    for (name, d) in [
        ("mesh + section integration (BeamModel::build)", t_mesh),
        ("eigen-solve (subspace + Sturm check)", t_eig),
        ("modal post-processing (shapes, m_e)", t_post),
        ("wind checks (approach 1/2, GB, loads)", t_wind),
        ("along-wind action + combination (EN)", t_along),
    ] {
        println!("{name:<44} {:>10.1}", us(d));
    }
    println!("{:<44} {:>10.1}", "stage analysis total", us(total));
    println!(
        "{:<44} {:>10.1}",
        format!(
            "resistance: M_Rd + {} actions, {} nodes",
            actions.len(),
            sm.model.z_m.len()
        ),
        us(t_res)
    );
    println!(
        "{:<44} {:>10.1}",
        "resistance incl. bar fatigue (cracked section)",
        us(t_res_fat)
    );
    println!(
        "{:<44} {:>10.1}",
        "per variant: table edit + validation",
        us(t_input)
    );

    let vary = vec![
        Vary::parse("shell.elastic_modulus_gpa=28:36:100").unwrap(),
        Vary::parse("vortex.log_decrement=0.02:0.06:100").unwrap(),
    ];
    let t = Instant::now();
    let v = run_grid(&table, Path::new("."), "demo", &vary, &|| {}).expect("sweep");
    let secs = t.elapsed().as_secs_f64();
    println!(
        "sweep: {} variants x 2 stages x {modes} modes on {} threads: {secs:.2} s ({:.3} ms per variant, {:.3} ms per stage analysis per core)",
        v.len(),
        rayon::current_num_threads(),
        secs * 1e3 / v.len() as f64,
        secs * 1e3 * rayon::current_num_threads() as f64 / (2.0 * v.len() as f64)
    );
}
