//! The response plot (response.svg) is drawn against the same speed as the note's tables:
//! the mean wind speed at each mode's shedding height z_s. Checked against the tables' own
//! results (EN 1991-1-4 approach 1 as computed by the verdict tables, self-consistency):
//! at x = v_m(z_s) every curve passes through the tabulated tip amplitude, the axis runs past
//! every mode's design speed, and the rendered SVG names the axis and marks the design speeds.

use stackwake::commands::check::{analyse, CheckOptions};
use stackwake::report::svg::response;
use stackwake::report::ReportInput;

#[test]
fn speed_axis_is_the_shedding_height_speed_and_runs_past_the_design_speed() {
    let r = analyse(stackwake::input::demo_case(), CheckOptions::default()).unwrap();
    let input = ReportInput {
        along: None,
        case: &r.case,
        stages: &r.stages,
        vortex: &r.vortex,
        warnings: &[],
        remedies: None,
        model_plan_html: None,
        resistance: None,
    };
    let fig = response::figure(&input);
    assert_eq!(fig.panels.len(), r.vortex.stages.len());
    let mut checked = 0;
    for (panel, s) in fig.panels.iter().zip(&r.vortex.stages) {
        let drawn: Vec<_> = s.modes.iter().filter(|m| m.approach1.is_some()).collect();
        assert_eq!(panel.curves.len(), drawn.len(), "{}", s.stage);
        assert!(panel.x_desc.contains("z_s"), "{}", panel.x_desc);
        for (curve, m) in panel.curves.iter().zip(&drawn) {
            let a1 = m.approach1.as_ref().unwrap();
            assert!(
                panel.x_range.1 > m.mean_speed_m_s,
                "{} mode {}: axis ends at {} m/s, design v_m {} m/s",
                s.stage,
                m.mode,
                panel.x_range.1,
                m.mean_speed_m_s
            );
            let last = curve.points.last().unwrap().0;
            assert!(
                last > m.mean_speed_m_s,
                "the curve runs past the design speed"
            );
            let at_design = curve
                .points
                .iter()
                .find(|p| p.0 == m.mean_speed_m_s)
                .expect("the design speed is a sample of the curve");
            let rel = (at_design.1 - a1.tip_amplitude_m).abs() / a1.tip_amplitude_m.max(1e-12);
            assert!(
                rel < 1e-9,
                "{} mode {}: curve {} m at v_m(z_s), table {} m",
                s.stage,
                m.mode,
                at_design.1,
                a1.tip_amplitude_m
            );
            assert!(
                panel
                    .guides
                    .iter()
                    .any(|g| g.vertical && g.at == m.mean_speed_m_s),
                "design speed of mode {} marked",
                m.mode
            );
            checked += 1;
        }
    }
    assert!(checked > 0, "the demo has modes that are not screened out");

    let svg = response::plot(&input).unwrap().svg;
    let doc = roxmltree::Document::parse(&svg).expect("response.svg parses");
    let text: String = doc
        .descendants()
        .filter(|n| n.is_text())
        .filter_map(|n| n.text())
        .collect::<Vec<_>>()
        .join(" ");
    assert!(text.contains("mean speed at z_s (m/s)"), "axis title");
    assert!(text.contains("v_m,1 = "), "design speed label of mode 1");
}
