//! SVG plot of the prototype tip amplitude against the prototype wind speed, converted from
//! the lab's model measurements (`stackwake scale --measured`). Hand-written SVG: points
//! joined in speed order, linear axes from zero with round tick steps, axis titles with
//! units, every text escaped.

use super::note::html_escape as escape;

const WIDTH: f64 = 640.0;
const HEIGHT: f64 = 420.0;
const LEFT: f64 = 80.0;
const RIGHT: f64 = 20.0;
const TOP: f64 = 40.0;
const BOTTOM: f64 = 60.0;

/// A round tick step (1, 2 or 5 x 10^n) giving about five intervals up to `max`.
fn tick_step(max: f64) -> f64 {
    let raw = max / 5.0;
    let decade = 10f64.powf(raw.log10().floor());
    [1.0, 2.0, 5.0, 10.0]
        .iter()
        .map(|m| m * decade)
        .find(|s| *s >= raw)
        .unwrap_or(10.0 * decade)
}

/// Axis end: the smallest multiple of the step at or above the data maximum (at least one
/// step, so an all-zero series still has an axis).
fn axis(max: f64) -> (f64, f64) {
    let max = if max > 0.0 && max.is_finite() {
        max
    } else {
        1.0
    };
    let step = tick_step(max);
    (step, (max / step).ceil().max(1.0) * step)
}

fn label(v: f64, step: f64) -> String {
    let decimals = if step >= 1.0 {
        0
    } else {
        (-step.log10().floor()) as usize
    };
    format!("{v:.decimals$}")
}

/// The plot; `points` are (prototype speed m/s, prototype tip amplitude m), any order.
pub fn amplitude_vs_speed_svg(title: &str, points: &[(f64, f64)]) -> String {
    let mut pts: Vec<(f64, f64)> = points
        .iter()
        .copied()
        .filter(|(x, y)| x.is_finite() && y.is_finite())
        .collect();
    pts.sort_by(|a, b| a.0.total_cmp(&b.0));
    let (xs, xmax) = axis(pts.iter().map(|p| p.0).fold(0.0, f64::max));
    let (ys, ymax) = axis(pts.iter().map(|p| p.1).fold(0.0, f64::max));
    let pw = WIDTH - LEFT - RIGHT;
    let ph = HEIGHT - TOP - BOTTOM;
    let sx = |x: f64| LEFT + pw * x / xmax;
    let sy = |y: f64| TOP + ph * (1.0 - y / ymax);
    let mut s = format!(
        "<svg xmlns=\"http://www.w3.org/2000/svg\" width=\"{WIDTH}\" height=\"{HEIGHT}\" viewBox=\"0 0 {WIDTH} {HEIGHT}\" font-family=\"sans-serif\" font-size=\"12\">\n\
         <rect width=\"100%\" height=\"100%\" fill=\"white\"/>\n\
         <text x=\"{}\" y=\"22\" text-anchor=\"middle\" font-size=\"14\">{}</text>\n",
        WIDTH / 2.0,
        escape(title)
    );
    let mut x = 0.0;
    while x <= xmax * (1.0 + 1e-9) {
        s.push_str(&format!(
            "<line x1=\"{0:.1}\" y1=\"{1:.1}\" x2=\"{0:.1}\" y2=\"{2:.1}\" stroke=\"#ddd\"/>\n<text x=\"{0:.1}\" y=\"{3:.1}\" text-anchor=\"middle\">{4}</text>\n",
            sx(x), TOP, TOP + ph, TOP + ph + 16.0, label(x, xs)
        ));
        x += xs;
    }
    let mut y = 0.0;
    while y <= ymax * (1.0 + 1e-9) {
        s.push_str(&format!(
            "<line x1=\"{0:.1}\" y1=\"{1:.1}\" x2=\"{2:.1}\" y2=\"{1:.1}\" stroke=\"#ddd\"/>\n<text x=\"{3:.1}\" y=\"{4:.1}\" text-anchor=\"end\">{5}</text>\n",
            LEFT, sy(y), LEFT + pw, LEFT - 6.0, sy(y) + 4.0, label(y, ys)
        ));
        y += ys;
    }
    s.push_str(&format!(
        "<rect x=\"{LEFT}\" y=\"{TOP}\" width=\"{pw}\" height=\"{ph}\" fill=\"none\" stroke=\"black\"/>\n\
         <text x=\"{}\" y=\"{}\" text-anchor=\"middle\">prototype mean wind speed (m/s)</text>\n\
         <text x=\"18\" y=\"{}\" text-anchor=\"middle\" transform=\"rotate(-90 18 {})\">prototype tip amplitude (m)</text>\n",
        LEFT + pw / 2.0,
        HEIGHT - 14.0,
        TOP + ph / 2.0,
        TOP + ph / 2.0
    ));
    if !pts.is_empty() {
        let path: Vec<String> = pts
            .iter()
            .map(|(x, y)| format!("{:.2},{:.2}", sx(*x), sy(*y)))
            .collect();
        s.push_str(&format!(
            "<polyline points=\"{}\" fill=\"none\" stroke=\"#1f4e9c\" stroke-width=\"1.5\"/>\n",
            path.join(" ")
        ));
        for (x, y) in &pts {
            s.push_str(&format!(
                "<circle cx=\"{:.2}\" cy=\"{:.2}\" r=\"3\" fill=\"#1f4e9c\"/>\n",
                sx(*x),
                sy(*y)
            ));
        }
    }
    s.push_str("</svg>\n");
    s
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn axes_are_round_and_cover_the_data() {
        assert_eq!(axis(23.0), (5.0, 25.0));
        assert_eq!(axis(0.37), (0.1, 0.4));
        assert_eq!(axis(0.0), (0.2, 1.0));
    }

    #[test]
    fn title_is_escaped_and_points_are_drawn() {
        let svg = amplitude_vs_speed_svg("a <b> & c", &[(20.0, 0.1), (10.0, 0.05)]);
        assert!(svg.contains("a &lt;b&gt; &amp; c"));
        assert_eq!(svg.matches("<circle").count(), 2);
        assert!(svg.contains("prototype tip amplitude (m)"));
    }
}
