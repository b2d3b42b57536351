//! Time to the lowest 10 modes of a tapered Timoshenko shell (invented 180 m stack with
//! lining, platform and base springs) at 200, 2 000 and 20 000 elements, plus the cost
//! breakdown of one default-mesh stage analysis. Prints a table; run with `cargo bench`.
//! Figures are wall-clock medians of repeated, interleaved runs on the current machine.

use std::time::{Duration, Instant};

use stackwake::case::*;
use stackwake::fem::{
    fine_block_width, interpolate_modes, lowest_modes, solve_stage, subspace, BeamModel,
    SturmCount, COARSE_ELEMENTS,
};

fn case() -> Case {
    let stations = [(0.0, 16.0, 0.55), (60.0, 13.0, 0.40), (180.0, 9.0, 0.22)];
    Case {
        base_inertia: Default::default(),
        title: "Invented benchmark stack".into(),
        shell: Shell {
            zones: vec![],
            openings: vec![],
            elastic_modulus_pa: 32e9,
            density_kg_m3: 2500.0,
            poisson_ratio: 0.2,
            beam: BeamTheory::Timoshenko,
            stations: stations
                .iter()
                .map(|&(z_m, outer_diameter_m, wall_m)| Station {
                    z_m,
                    outer_diameter_m,
                    wall_m,
                })
                .collect(),
        },
        linings: vec![Lining {
            from_z_m: 8.0,
            to_z_m: 180.0,
            mass: LiningMass::PerArea {
                mass_per_area_kg_m2: 300.0,
            },
        }],
        point_masses: vec![PointMass {
            rotary_inertia_kg_m2: 0.0,
            z_m: 150.0,
            mass_kg: 30000.0,
            label: "platform".into(),
            stages: None,
        }],
        base: Some(BaseSprings {
            rotational_nm_per_rad: Some(800e9),
            lateral_n_per_m: Some(5e9),
        }),
        stages: vec![Stage {
            name: "lined".into(),
            lining: true,
            stiffness_factor: 1.0,
            top_z_m: None,
            duration_years: None,
            return_period_years: None,
            log_decrement: None,
        }],
        wind: Some(Wind {
            reference_speed_m_s: 30.0,
            reference_height_m: 10.0,
            profile: Profile::Power { exponent: 0.16 },
            air_density_kg_m3: 1.25,
            kinematic_viscosity_m2_s: 1.5e-5,
            c_prob_k: 0.2,
            c_prob_n: 0.5,
        }),
        along_wind: None,
        vortex: Vortex {
            method: VortexMethod::En1991E1,
            strouhal: None,
            log_decrement: 0.03,
            damping_ratio: None,
            modes: 3,
            design_life_years: 50.0,
            group: None,
        },
        criteria: Criteria::default(),
        model: None,
        remedy: None,
        project: Default::default(),
        resistance: None,
        source: None,
    }
}

fn median(mut v: Vec<Duration>) -> Duration {
    v.sort();
    v[v.len() / 2]
}

/// (first run, median of the following `runs`): the first run of a size also pays for
/// faulting in memory the later ones reuse.
fn time<F: FnMut()>(runs: usize, mut f: F) -> (Duration, Duration) {
    let t = Instant::now();
    f();
    let first = t.elapsed();
    let warm = median(
        (0..runs)
            .map(|_| {
                let t = Instant::now();
                f();
                t.elapsed()
            })
            .collect(),
    );
    (first, warm)
}

fn main() {
    // As the binary does at start-up.
    stackwake::process::reuse_freed_blocks();
    let case = case();
    let stage = case.stages[0].clone();
    let sizes = [200, 2_000, 20_000];
    let solve = |n: usize| {
        let t = Instant::now();
        let (_, s) = solve_stage(&case, &stage, Some(n), 10).expect("solve");
        (
            t.elapsed(),
            s.eigenvalues[0].sqrt() / (2.0 * std::f64::consts::PI),
        )
    };
    // First (cold) runs pay for faulting in memory that later runs reuse.
    let first: Vec<Duration> = sizes.iter().map(|&n| solve(n).0).collect();
    // Rounds interleave the sizes, so a slow spell of the machine hits all of them alike and
    // the per-round ratio stays fair; the table shows medians over the rounds.
    const ROUNDS: usize = 9;
    let mut totals = vec![Vec::new(); sizes.len()];
    let mut ratios = Vec::new();
    let mut f1 = [0.0; 3];
    for _ in 0..ROUNDS {
        let small = median((0..5).map(|_| solve(sizes[0]).0).collect());
        totals[0].push(small);
        f1[0] = solve(sizes[0]).1;
        for (k, &n) in sizes.iter().enumerate().skip(1) {
            let (t, f) = solve(n);
            totals[k].push(t);
            f1[k] = f;
        }
        ratios.push(totals[2].last().unwrap().as_secs_f64() / small.as_secs_f64());
    }
    println!("lowest 10 modes, tapered Timoshenko shell (median wall-clock over {ROUNDS} interleaved rounds)");
    println!(
        "{:>10}  {:>12}  {:>12}  {:>14}  {:>14}",
        "elements", "build_ms", "total_ms", "first_run_ms", "f1_hz"
    );
    for (k, &n) in sizes.iter().enumerate() {
        let (_, build) = time(5, || {
            std::hint::black_box(BeamModel::build(&case, &stage, Some(n), 10));
        });
        println!(
            "{:>10}  {:>12.3}  {:>12.3}  {:>14.3}  {:>14.10}",
            n,
            build.as_secs_f64() * 1e3,
            median(totals[k].clone()).as_secs_f64() * 1e3,
            first[k].as_secs_f64() * 1e3,
            f1[k]
        );
    }
    ratios.sort_by(f64::total_cmp);
    println!(
        "ratio 20 000 / 200 elements: {:.1}x (median of per-round ratios; range {:.1}-{:.1}x)",
        ratios[ROUNDS / 2],
        ratios[0],
        ratios[ROUNDS - 1]
    );
    phases(&case, &stage);
    let (_, default) = time(51, || {
        std::hint::black_box(solve_stage(&case, &stage, None, 3).expect("solve"));
    });
    println!(
        "default mesh, 3 modes (one stage analysis): {:.3} ms",
        default.as_secs_f64() * 1e3
    );
}

/// Where the time of a 20 000-element solve goes: the steps of `solve_stage` run one after
/// the other (in `solve_stage` the Sturm count overlaps the interpolation and iteration on
/// the other core), medians of 9 runs.
fn phases(case: &Case, stage: &Stage) {
    let modes = 10;
    let wanted = fine_block_width(modes);
    let mut rows: Vec<(&str, Vec<f64>)> = [
        "fine model build",
        "coarse model build + solve",
        "start vectors (interpolation)",
        "fine iteration",
        "Sturm count",
        "check + compaction",
    ]
    .into_iter()
    .map(|name| (name, Vec::new()))
    .collect();
    for _ in 0..9 {
        let mut marks = vec![Instant::now()];
        let fine = BeamModel::build(case, stage, Some(20_000), modes);
        marks.push(Instant::now());
        let coarse = BeamModel::build(case, stage, Some(COARSE_ELEMENTS), wanted);
        let coarse_solution = lowest_modes(&coarse, wanted).expect("coarse");
        marks.push(Instant::now());
        let start = interpolate_modes(&coarse, &coarse_solution.vectors, &fine);
        marks.push(Instant::now());
        let converged = subspace::iterate(&fine, modes, start).expect("fine");
        marks.push(Instant::now());
        let shift =
            (coarse_solution.eigenvalues[modes - 1] * coarse_solution.eigenvalues[modes]).sqrt();
        let count = fine.stiffness.negative_pivots_shifted(shift, &fine.mass);
        marks.push(Instant::now());
        let solution = subspace::verify(&fine, modes, converged, Some(SturmCount { shift, count }))
            .expect("verify");
        marks.push(Instant::now());
        std::hint::black_box(solution);
        for (k, (_, v)) in rows.iter_mut().enumerate() {
            v.push((marks[k + 1] - marks[k]).as_secs_f64() * 1e3);
        }
    }
    println!("20 000 elements, 10 modes, step by step (median of 9 runs, ms)");
    for (name, mut v) in rows {
        v.sort_by(f64::total_cmp);
        println!("{name:>32}  {:>8.2}", v[v.len() / 2]);
    }
}
