//! Every SVG plot of the demo run parses (usvg) and renders (resvg) to a non-blank image.
//! Text is not rendered here (resvg is built without its text feature, so no system fonts
//! are needed): the count of non-background pixels comes from axes, curves and shading.
//! Also checks that the axis titles are present as text in the SVG.

use stackwake::commands::check::{run, CheckOptions};

const PLOTS: [&str; 6] = [
    "shell.svg",
    "modes.svg",
    "wind_map.svg",
    "response.svg",
    "envelopes.svg",
    "stages.svg",
];

fn dark_pixels(svg: &str) -> (usize, usize) {
    let tree =
        resvg::usvg::Tree::from_str(svg, &resvg::usvg::Options::default()).expect("the SVG parses");
    let size = tree.size().to_int_size();
    let scale = 400.0 / size.width() as f32;
    let w = (size.width() as f32 * scale).ceil() as u32;
    let h = (size.height() as f32 * scale).ceil() as u32;
    let mut pixmap = resvg::tiny_skia::Pixmap::new(w, h).expect("non-empty image");
    resvg::render(
        &tree,
        resvg::tiny_skia::Transform::from_scale(scale, scale),
        &mut pixmap.as_mut(),
    );
    let dark = pixmap
        .pixels()
        .iter()
        .filter(|p| p.alpha() > 0 && (p.red() < 200 || p.green() < 200 || p.blue() < 200))
        .count();
    (dark, (w * h) as usize)
}

#[test]
fn every_plot_parses_and_renders_non_blank() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    run(None, &out, CheckOptions::default()).unwrap();
    for name in PLOTS {
        let svg = std::fs::read_to_string(out.join(name)).unwrap();
        let (dark, total) = dark_pixels(&svg);
        // Axes and curves cover well over 1 % of a plot; a blank or white image has none.
        assert!(
            dark * 100 > total,
            "{name}: only {dark} of {total} pixels drawn"
        );
        assert!(svg.contains("height z (m)") || svg.contains("(m/s)") || svg.contains("(Hz)"));
    }
    let wind = std::fs::read_to_string(out.join("wind_map.svg")).unwrap();
    assert!(wind.contains("wind speed (m/s)"));
    assert!(wind.contains("mode 1: b(z) n / St"));
    assert!(
        wind.contains("lock-in"),
        "the demo locks in: bands are labelled"
    );
}

#[test]
fn a_blank_svg_is_detected() {
    // Guards the test above against passing on anything.
    let blank = r##"<svg xmlns="http://www.w3.org/2000/svg" width="100" height="50" viewBox="0 0 100 50"><rect width="100" height="50" fill="#FFFFFF"/></svg>"##;
    assert_eq!(dark_pixels(blank).0, 0);
}
