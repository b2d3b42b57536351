//! The FE check of a scaled model against its prototype, f_prototype / (f_model k_f) - 1.
//! Sources: the scale relations are data/reference/README.md: published dimensional analysis
//! ("Aeroelastic model similitude"); the claims checked here follow from them: the
//! distorted-thickness similitude is exact for thin walls in bending (Euler-Bernoulli,
//! t/D -> 0), and exact for any wall and beam theory when the model is geometrically similar
//! (k_rho = 1, same Poisson's ratio), because then every dimensionless group of the
//! Timoshenko beam (slenderness, E/G, I/(A L^2)) is the same in model and prototype. Where
//! neither holds the deviation is whatever the two FE runs give, and the plan must report
//! exactly that. All cases invented.

mod common;

use std::path::Path;

use stackwake::case::{BaseSprings, BeamTheory, Case, Lining, LiningMass, ModelSpec, PointMass};
use stackwake::input::parse_case;
use stackwake::modal::{analyse_case, ModalOptions, StageModes};
use stackwake::similitude::measured::{to_prototype, ModelMeasurement};
use stackwake::similitude::{design, plan, ScalePlan};

const OPTIONS: ModalOptions = ModalOptions {
    modes: 3,
    min_elements: Some(60),
};

fn with_model(mut case: Case, e_pa: f64, rho: f64, nu: f64, k_l: f64) -> Case {
    case.model = Some(ModelSpec {
        length_scale: Some(k_l),
        elastic_modulus_pa: e_pa,
        density_kg_m3: rho,
        poisson_ratio: nu,
        min_wall_m: None,
        tunnel_width_m: None,
        tunnel_height_m: None,
        max_blockage: 0.05,
        tunnel_speed_min_m_s: None,
        tunnel_speed_max_m_s: None,
    });
    case
}

/// A tapered stack with every mass and spring form the model case scales.
fn stack(t_base: f64, t_top: f64, beam: BeamTheory) -> Case {
    let mut case = common::shell_case(
        &[
            (0.0, 14.0, t_base),
            (60.0, 11.0, 0.5 * (t_base + t_top)),
            (150.0, 8.0, t_top),
        ],
        32e9,
        2500.0,
        beam,
    );
    case.linings = vec![Lining {
        from_z_m: 10.0,
        to_z_m: 150.0,
        mass: LiningMass::PerLength {
            mass_per_length_kg_m: 2500.0,
        },
    }];
    case.point_masses = vec![PointMass {
        rotary_inertia_kg_m2: 0.0,
        z_m: 146.0,
        mass_kg: 20000.0,
        label: "top".into(),
        stages: None,
    }];
    case.base = Some(BaseSprings {
        rotational_nm_per_rad: Some(9e11),
        lateral_n_per_m: Some(6e9),
    });
    case
}

fn run(case: &Case) -> (ScalePlan, Vec<StageModes>, Vec<StageModes>) {
    let d = design(case, None).expect("design");
    let model = parse_case(&d.model.toml, Path::new("."), "model").expect("model case reads back");
    let p = analyse_case(case, OPTIONS).expect("prototype modes");
    let m = analyse_case(&model, OPTIONS).expect("model modes");
    (plan(case, d, &p, &m), p, m)
}

#[test]
fn thin_walled_euler_bernoulli_model_matches_within_half_a_percent() {
    // t/D = 0.001-0.0014 in the prototype, k_rho = 2500/1150 = 2.17.
    let case = with_model(
        stack(0.014, 0.011, BeamTheory::EulerBernoulli),
        3.2e9,
        1150.0,
        0.35,
        125.0,
    );
    let (plan, _, _) = run(&case);
    assert_eq!(plan.consistency.len(), 3);
    for r in &plan.consistency {
        assert!(
            r.deviation.abs() < 0.005,
            "{} mode {}: {}",
            r.stage,
            r.mode,
            r.deviation
        );
    }
}

#[test]
fn deviation_vanishes_as_the_wall_thins() {
    let dev = |t: f64| {
        let case = with_model(
            stack(t, t, BeamTheory::EulerBernoulli),
            3.2e9,
            1150.0,
            0.35,
            125.0,
        );
        run(&case).0.worst_deviation
    };
    // 16 mm at the 14 m base (D/t = 875) is about the thinnest wall the physical bounds
    // admit (outer diameter / 1000, src/input/physical.rs).
    let (thick, mid, thin) = (dev(0.4), dev(0.16), dev(0.016));
    assert!(thick > mid && mid > thin, "{thick} {mid} {thin}");
    assert!(thin < 4e-3, "{thin}");
    // First order in t/D: ten times thinner, about ten times smaller.
    assert!(mid / thin > 5.0 && mid / thin < 20.0, "{}", mid / thin);
}

#[test]
fn geometrically_similar_timoshenko_model_is_exact() {
    // Same density (k_rho = 1, so k_h = k_l) and same Poisson's ratio: thick walls and shear
    // deformation scale exactly.
    let case = with_model(
        stack(0.6, 0.3, BeamTheory::Timoshenko),
        3.0e9,
        2500.0,
        0.2,
        50.0,
    );
    let (plan, _, _) = run(&case);
    assert!(plan.worst_deviation < 1e-6, "{}", plan.worst_deviation);
}

#[test]
fn thick_timoshenko_deviation_is_the_difference_of_the_two_fe_runs() {
    let case = with_model(
        stack(0.9, 0.5, BeamTheory::Timoshenko),
        3.2e9,
        1150.0,
        0.35,
        100.0,
    );
    let (plan, p, m) = run(&case);
    let k_f = plan.design.factors.frequency;
    let mut n = 0;
    for (sp, sm) in p.iter().zip(&m) {
        for (mp, mm) in sp.modes.iter().zip(&sm.modes) {
            let row = &plan.consistency[n];
            assert_eq!(
                (row.stage.as_str(), row.mode),
                (sp.stage.name.as_str(), mp.number)
            );
            let expected = mp.frequency_hz / (mm.frequency_hz * k_f) - 1.0;
            assert!((row.deviation - expected).abs() < 1e-12);
            n += 1;
        }
    }
    assert_eq!(n, plan.consistency.len());
    // Thick, distorted walls: the model is visibly off, and the check says so.
    assert!(plan.worst_deviation > 0.01, "{}", plan.worst_deviation);
}

#[test]
fn model_frequencies_convert_back_to_the_prototypes() {
    let case = with_model(
        stack(0.014, 0.011, BeamTheory::EulerBernoulli),
        3.2e9,
        1150.0,
        0.35,
        125.0,
    );
    let (plan, p, m) = run(&case);
    let rows: Vec<ModelMeasurement> = m[0]
        .modes
        .iter()
        .map(|mode| ModelMeasurement {
            speed_m_s: 5.0,
            tip_amplitude_m: None,
            strain: None,
            stress_pa: None,
            frequency_hz: Some(mode.frequency_hz),
        })
        .collect();
    let back = to_prototype(&rows, &plan.design.factors, case.shell.elastic_modulus_pa);
    for ((b, mp), r) in back.iter().zip(&p[0].modes).zip(&plan.consistency) {
        let f = b.prototype_frequency_hz.expect("frequency");
        assert!((f - r.model_frequency_at_prototype_scale_hz).abs() < 1e-12 * f);
        assert!((f / mp.frequency_hz - 1.0).abs() < 0.005);
    }
}

#[test]
fn html_fragment_escapes_the_title_and_shows_the_check() {
    let mut case = with_model(
        stack(0.014, 0.011, BeamTheory::EulerBernoulli),
        3.2e9,
        1150.0,
        0.35,
        125.0,
    );
    case.title = "Stack <A> & \"B\"".into();
    let (plan, _, _) = run(&case);
    let html = stackwake::report::scale_html::render_html(&plan);
    assert!(html.contains("Stack &lt;A&gt; &amp; &quot;B&quot;"));
    assert!(!html.contains("<A>"));
    assert!(html.contains("f_prototype / (f_model k_f) - 1"));
    assert!(html.starts_with("<section") && html.trim_end().ends_with("</section>"));
}
