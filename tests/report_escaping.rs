//! Hostile text from the case file (markup in the title and stage names, a formula-like
//! stage name) appears as text in report.html and the SVGs and is neutralised in the CSVs.

use stackwake::commands::check::{run, CheckOptions};

const CASE: &str = r#"
title = "<script>alert(1)</script> & \"x\""
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
stations = [
  { z_m = 0.0, outer_diameter_m = 12.0, wall_m = 0.4 },
  { z_m = 120.0, outer_diameter_m = 8.0, wall_m = 0.2 },
]
[[stage]]
name = "=cmd"
lining = false
[[stage]]
name = "<b>bold</b> & 'q'"
lining = false
[wind]
reference_speed_m_s = 25.0
[vortex]
modes = 2
"#;

#[test]
fn user_text_is_escaped_everywhere() {
    let dir = tempfile::tempdir().unwrap();
    let case = dir.path().join("case.toml");
    std::fs::write(&case, CASE).unwrap();
    let out = dir.path().join("out");
    run(Some(&case), &out, CheckOptions::default()).unwrap();

    let html = std::fs::read_to_string(out.join("report.html")).unwrap();
    assert!(html.contains("&lt;script&gt;alert(1)&lt;/script&gt; &amp; &quot;x&quot;"));
    assert!(!html.contains("<script"));
    assert!(!html.contains("<b>bold"));
    assert!(html.contains("&lt;b&gt;bold&lt;/b&gt; &amp; &#39;q&#39;"));

    for svg in ["modes.svg", "wind_map.svg", "shell.svg", "stages.svg"] {
        let text = std::fs::read_to_string(out.join(svg)).unwrap();
        assert!(!text.contains("<script") && !text.contains("<b>"), "{svg}");
        assert!(
            text.contains("&lt;script&gt;alert(1)&lt;/script&gt;"),
            "{svg}: title"
        );
        roxmltree::Document::parse(&text).unwrap_or_else(|e| panic!("{svg}: {e}"));
    }
    let stages_svg = std::fs::read_to_string(out.join("stages.svg")).unwrap();
    assert!(stages_svg.contains("&lt;b&gt;bold&lt;/b&gt;"));

    for csv in ["modes.csv", "vortex.csv", "lock_in.csv"] {
        let text = std::fs::read_to_string(out.join(csv)).unwrap();
        assert!(text.contains("\n'=cmd,"), "{csv}: formula neutralised");
        assert!(!text.contains("\n=cmd"), "{csv}");
    }
    let json = std::fs::read_to_string(out.join("summary.json")).unwrap();
    let v: serde_json::Value = serde_json::from_str(&json).unwrap();
    assert_eq!(v["title"], "<script>alert(1)</script> & \"x\"");
}
