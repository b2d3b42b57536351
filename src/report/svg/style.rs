//! The common look of every plot, and the small figure model the plot modules fill in: a
//! figure is a title, a grid of panels and one legend shared by all panels (a series keeps
//! the same pen in every panel), plus footnotes.
//!
//! Readable in black and white: every pen differs from its neighbours in dash pattern and,
//! from the fourth on, in its marker, not only in colour; shaded bands carry a text label.
//! Labels that would collide (platform names, band labels) are nudged apart. Text is laid
//! out with plotters' built-in size estimate, so no font file is needed; the SVG names
//! generic font families and the viewer picks the font. Units: pixels of the SVG viewBox.

use plotters::coord::Shift;
use plotters::element::DashedPathElement;
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, Pos, VPos};

use crate::report::ReportError;

/// Figure width, SVG pixels (scaled to the page width in the HTML note).
pub const WIDTH_PX: u32 = 1000;
/// Font family of every label.
pub const FONT: &str = "sans-serif";
const TITLE_PX: f64 = 28.0;
const PANEL_TITLE_PX: f64 = 22.0;
const AXIS_PX: f64 = 21.0;
const TICK_PX: f64 = 19.0;
const NOTE_PX: f64 = 18.0;
const LEGEND_ROW_PX: u32 = 26;
const SAMPLE_PX: i32 = 36;

/// Dash pattern of a pen.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Dash {
    Solid,
    /// On / off lengths, px.
    Dashed(u32, u32),
}

/// Marker drawn at every few points of a curve.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Marker {
    None,
    Circle,
    Square,
    Triangle,
}

/// How one series is drawn.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Pen {
    pub colour: RGBColor,
    pub dash: Dash,
    pub width: u32,
    pub marker: Marker,
}

/// Colour-blind-safe colours (Okabe and Ito's palette, darker variants so that they stay
/// distinct in grey).
const COLOURS: [RGBColor; 6] = [
    RGBColor(0, 90, 160),
    RGBColor(200, 80, 0),
    RGBColor(0, 130, 95),
    RGBColor(170, 60, 140),
    RGBColor(90, 90, 90),
    RGBColor(200, 140, 0),
];

/// The pen of series `i` (mode i+1, or stage i+1).
pub fn pen(i: usize) -> Pen {
    let dash = match i % 3 {
        0 => Dash::Solid,
        1 => Dash::Dashed(10, 6),
        _ => Dash::Dashed(3, 4),
    };
    let marker = match i / 3 {
        0 => Marker::None,
        1 => Marker::Circle,
        2 => Marker::Square,
        _ => Marker::Triangle,
    };
    Pen {
        colour: COLOURS[i % COLOURS.len()],
        dash,
        width: 3,
        marker,
    }
}

/// The pen of a reference curve (mean wind profile, envelope): thick black.
pub fn reference_pen() -> Pen {
    Pen {
        colour: RGBColor(0, 0, 0),
        dash: Dash::Solid,
        width: 4,
        marker: Marker::None,
    }
}

/// The pen of a marker line (platform, limit, design speed): thin grey dash-dot-like.
pub fn guide_pen() -> Pen {
    Pen {
        colour: RGBColor(60, 60, 60),
        dash: Dash::Dashed(6, 3),
        width: 1,
        marker: Marker::None,
    }
}

/// A curve in data coordinates.
#[derive(Debug, Clone)]
pub struct Curve {
    pub points: Vec<(f64, f64)>,
    pub pen: Pen,
}

/// A shaded rectangle in data coordinates with an optional label drawn inside at its left.
#[derive(Debug, Clone)]
pub struct Shade {
    pub x: (f64, f64),
    pub y: (f64, f64),
    pub colour: RGBColor,
    pub opacity: f64,
    pub label: Option<String>,
}

/// A horizontal (`vertical = false`, at y = `at`) or vertical guide line across the panel,
/// labelled at its end.
#[derive(Debug, Clone)]
pub struct Guide {
    pub at: f64,
    pub vertical: bool,
    pub label: String,
    pub pen: Pen,
}

/// A text placed at a data point (left-aligned, vertically centred).
#[derive(Debug, Clone)]
pub struct Note {
    pub at: (f64, f64),
    pub text: String,
}

/// One plot panel.
#[derive(Debug, Clone, Default)]
pub struct Panel {
    pub title: String,
    pub x_desc: String,
    pub y_desc: String,
    pub x_range: (f64, f64),
    pub y_range: (f64, f64),
    pub shades: Vec<Shade>,
    pub curves: Vec<Curve>,
    pub guides: Vec<Guide>,
    pub notes: Vec<Note>,
    /// Label only integer x ticks (category axes such as the mode number), with this prefix.
    pub integer_x_labels: Option<String>,
}

/// A legend entry.
#[derive(Debug, Clone)]
pub enum LegendSample {
    Line(Pen),
    Fill(RGBColor, f64),
}

#[derive(Debug, Clone)]
pub struct LegendEntry {
    pub label: String,
    pub sample: LegendSample,
}

/// A whole figure.
#[derive(Debug, Clone, Default)]
pub struct Figure {
    pub title: String,
    pub panels: Vec<Panel>,
    /// Panels per row.
    pub columns: usize,
    /// Height of one panel row, px.
    pub row_height_px: u32,
    pub legend: Vec<LegendEntry>,
    pub footnotes: Vec<String>,
    /// The case title, printed small under the figure so a lone SVG says what it shows.
    pub source: String,
}

fn plot_err<E: std::fmt::Debug>(file: &str) -> impl Fn(E) -> ReportError + '_ {
    move |e| ReportError::Format {
        file: file.to_string(),
        message: format!("{e:?}"),
    }
}

/// Estimated text width with plotters' own estimate (the same one its layout uses), px.
pub fn text_width_px(text: &str, size: f64) -> i32 {
    let em = size / 1.24 / 1.24;
    (em * 0.7 * text.chars().count() as f64).round() as i32 + 2
}

/// Splits a polyline into the pieces that lie inside `x_range` (crossings interpolated), so
/// that curves running off a limited axis stop at its edge.
pub fn clip_x(points: &[(f64, f64)], x_range: (f64, f64)) -> Vec<Vec<(f64, f64)>> {
    let (lo, hi) = x_range;
    let inside = |x: f64| x >= lo && x <= hi;
    let mut out: Vec<Vec<(f64, f64)>> = Vec::new();
    let mut cur: Vec<(f64, f64)> = Vec::new();
    for (k, &(x, y)) in points.iter().enumerate() {
        if k > 0 {
            let (x0, y0) = points[k - 1];
            for edge in [lo, hi] {
                let crosses = (x0 - edge) * (x - edge) < 0.0;
                if crosses {
                    let t = (edge - x0) / (x - x0);
                    let p = (edge, y0 + t * (y - y0));
                    if inside(x0) {
                        cur.push(p);
                        out.push(std::mem::take(&mut cur));
                    } else {
                        cur.push(p);
                    }
                }
            }
        }
        if inside(x) {
            cur.push((x, y));
        } else if !cur.is_empty() {
            out.push(std::mem::take(&mut cur));
        }
    }
    if !cur.is_empty() {
        out.push(cur);
    }
    out.retain(|c| !c.is_empty());
    out
}

/// Places labels wanted at pixel positions `want` (any order) at least `gap` apart, keeping
/// them inside `[lo, hi]`; returns the positions in the input order.
pub fn spread(want: &[i32], gap: i32, lo: i32, hi: i32) -> Vec<i32> {
    let mut idx: Vec<usize> = (0..want.len()).collect();
    idx.sort_by_key(|&i| want[i]);
    let mut pos: Vec<i32> = idx.iter().map(|&i| want[i].clamp(lo, hi)).collect();
    for k in 1..pos.len() {
        if pos[k] < pos[k - 1] + gap {
            pos[k] = pos[k - 1] + gap;
        }
    }
    // Pushed past the far end: shift the whole run back.
    if let Some(&last) = pos.last() {
        if last > hi {
            let shift = last - hi;
            for p in pos.iter_mut() {
                *p -= shift;
            }
            for k in (0..pos.len().saturating_sub(1)).rev() {
                if pos[k] > pos[k + 1] - gap {
                    pos[k] = pos[k + 1] - gap;
                }
            }
        }
    }
    let mut out = vec![0; want.len()];
    for (k, &i) in idx.iter().enumerate() {
        out[i] = pos[k];
    }
    out
}

fn shape_style(p: &Pen) -> ShapeStyle {
    ShapeStyle {
        color: p.colour.to_rgba(),
        filled: false,
        stroke_width: p.width,
    }
}

/// Draws a polyline in pixel coordinates with the pen's dash and marker.
fn draw_pixel_line<DB: DrawingBackend>(
    area: &DrawingArea<DB, Shift>,
    pts: &[(i32, i32)],
    pen: &Pen,
    marker_every: usize,
) -> Result<(), DrawingAreaErrorKind<DB::ErrorType>> {
    if pts.len() >= 2 {
        let style = shape_style(pen);
        match pen.dash {
            Dash::Solid => area.draw(&PathElement::new(pts.to_vec(), style))?,
            Dash::Dashed(on, off) => {
                area.draw(&DashedPathElement::new(pts.iter().copied(), on, off, style))?
            }
        }
    }
    if pen.marker != Marker::None && !pts.is_empty() {
        let step = marker_every.max(1);
        for (k, &p) in pts.iter().enumerate() {
            if k % step == step / 2 || pts.len() == 1 {
                draw_marker(area, p, pen)?;
            }
        }
    }
    Ok(())
}

fn draw_marker<DB: DrawingBackend>(
    area: &DrawingArea<DB, Shift>,
    (x, y): (i32, i32),
    pen: &Pen,
) -> Result<(), DrawingAreaErrorKind<DB::ErrorType>> {
    let fill = pen.colour.filled();
    match pen.marker {
        Marker::None => {}
        Marker::Circle => area.draw(&Circle::new((x, y), 5, fill))?,
        Marker::Square => area.draw(&Rectangle::new([(x - 4, y - 4), (x + 4, y + 4)], fill))?,
        Marker::Triangle => area.draw(&Polygon::new(
            vec![(x, y - 6), (x - 5, y + 4), (x + 5, y + 4)],
            fill,
        ))?,
    }
    Ok(())
}

fn text_style(size: f64) -> TextStyle<'static> {
    (FONT, size).into_font().color(&BLACK)
}

fn nice_label(v: f64) -> String {
    let a = v.abs();
    if a == 0.0 {
        "0".into()
    } else if a >= 1000.0 {
        format!("{v:.0}")
    } else if a >= 10.0 {
        let s = format!("{v:.1}");
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else if a >= 0.01 {
        let s = format!("{v:.3}");
        s.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        format!("{v:.1e}")
    }
}

fn draw_panel<DB: DrawingBackend>(
    area: &DrawingArea<DB, Shift>,
    panel: &Panel,
) -> Result<(), DrawingAreaErrorKind<DB::ErrorType>> {
    let (x0, x1) = panel.x_range;
    let (y0, y1) = panel.y_range;
    let int_prefix = panel.integer_x_labels.clone();
    let x_fmt = move |v: &f64| match &int_prefix {
        Some(prefix) => {
            if (v - v.round()).abs() < 1e-9 && v.round() >= 1.0 {
                format!("{prefix}{}", v.round() as i64)
            } else {
                String::new()
            }
        }
        None => nice_label(*v),
    };
    let y_fmt = |v: &f64| nice_label(*v);
    let mut chart = ChartBuilder::on(area)
        .caption(&panel.title, text_style(PANEL_TITLE_PX))
        .margin_top(6)
        .margin_right(30)
        .margin_left(4)
        .x_label_area_size(58)
        .y_label_area_size(78)
        .build_cartesian_2d(x0..x1, y0..y1)?;
    let n_int = (x1 - x0).round().max(1.0) as usize + 1;
    chart
        .configure_mesh()
        .x_labels(if panel.integer_x_labels.is_some() {
            n_int
        } else {
            6
        })
        .y_labels(8)
        .x_label_formatter(&x_fmt)
        .y_label_formatter(&y_fmt)
        .x_desc(&panel.x_desc)
        .y_desc(&panel.y_desc)
        .axis_desc_style(text_style(AXIS_PX))
        .label_style(text_style(TICK_PX))
        .light_line_style(RGBColor(235, 235, 235))
        .bold_line_style(RGBColor(205, 205, 205))
        .draw()?;

    for s in &panel.shades {
        let xa = s.x.0.max(x0);
        let xb = s.x.1.min(x1);
        let ya = s.y.0.max(y0);
        let yb = s.y.1.min(y1);
        if xb <= xa || yb <= ya {
            continue;
        }
        chart.draw_series(std::iter::once(Rectangle::new(
            [(xa, ya), (xb, yb)],
            s.colour.mix(s.opacity).filled(),
        )))?;
    }
    let plot = chart.plotting_area();
    let (pw, ph) = plot.dim_in_pixel();
    let to_px = |x: f64, y: f64| -> (i32, i32) {
        let fx = (x - x0) / (x1 - x0);
        let fy = (y - y0) / (y1 - y0);
        (
            (fx * pw as f64).round() as i32,
            ((1.0 - fy) * ph as f64).round() as i32,
        )
    };
    let plot_px = plot.strip_coord_spec();
    for c in &panel.curves {
        for piece in clip_x(&c.points, panel.x_range) {
            let pts: Vec<(i32, i32)> = piece.iter().map(|&(x, y)| to_px(x, y)).collect();
            let every = (pts.len() / 6).max(1);
            draw_pixel_line(&plot_px, &pts, &c.pen, every)?;
        }
    }
    // Shade labels: at the left edge of each shade, nudged apart vertically.
    let labelled: Vec<&Shade> = panel.shades.iter().filter(|s| s.label.is_some()).collect();
    let want: Vec<i32> = labelled
        .iter()
        .map(|s| to_px(x0, 0.5 * (s.y.0.max(y0) + s.y.1.min(y1))).1)
        .collect();
    let got = spread(&want, 20, 10, ph as i32 - 10);
    for (s, py) in labelled.iter().zip(got) {
        let xa = to_px(s.x.0.max(x0), 0.0).0 + 4;
        plot_px.draw(&Text::new(
            s.label.clone().unwrap_or_default(),
            (xa, py),
            text_style(NOTE_PX).pos(Pos::new(HPos::Left, VPos::Center)),
        ))?;
    }
    // Guides: the line across, its label at the right (horizontal) or top (vertical) end.
    let horizontal: Vec<&Guide> = panel.guides.iter().filter(|g| !g.vertical).collect();
    let want: Vec<i32> = horizontal.iter().map(|g| to_px(x0, g.at).1 - 9).collect();
    let got = spread(&want, 20, 9, ph as i32 - 9);
    for (g, py) in horizontal.iter().zip(got) {
        if g.at < y0 || g.at > y1 {
            continue;
        }
        let y = to_px(x0, g.at).1;
        draw_pixel_line(&plot_px, &[(0, y), (pw as i32, y)], &g.pen, 1)?;
        plot_px.draw(&Text::new(
            g.label.clone(),
            (pw as i32 - 4, py),
            text_style(NOTE_PX).pos(Pos::new(HPos::Right, VPos::Center)),
        ))?;
    }
    for g in panel.guides.iter().filter(|g| g.vertical) {
        if g.at < x0 || g.at > x1 {
            continue;
        }
        let x = to_px(g.at, y0).0;
        draw_pixel_line(&plot_px, &[(x, 0), (x, ph as i32)], &g.pen, 1)?;
        let w = text_width_px(&g.label, NOTE_PX);
        let (tx, anchor) = if x + w + 6 < pw as i32 {
            (x + 4, HPos::Left)
        } else {
            (x - 4, HPos::Right)
        };
        plot_px.draw(&Text::new(
            g.label.clone(),
            (tx, 10),
            text_style(NOTE_PX).pos(Pos::new(anchor, VPos::Center)),
        ))?;
    }
    for n in &panel.notes {
        let (px, py) = to_px(n.at.0, n.at.1);
        plot_px.draw(&Text::new(
            n.text.clone(),
            (px, py),
            text_style(NOTE_PX).pos(Pos::new(HPos::Left, VPos::Center)),
        ))?;
    }
    Ok(())
}

/// Legend rows: entries packed left to right within `width` px.
fn legend_rows(entries: &[LegendEntry], width: i32) -> Vec<Vec<usize>> {
    let mut rows: Vec<Vec<usize>> = Vec::new();
    let mut used = width;
    for (i, e) in entries.iter().enumerate() {
        let w = SAMPLE_PX + 8 + text_width_px(&e.label, NOTE_PX) + 24;
        if used + w > width && !rows.last().is_some_and(|r| r.is_empty()) {
            rows.push(Vec::new());
            used = 0;
        }
        used += w;
        rows.last_mut().expect("a row was pushed").push(i);
    }
    rows
}

fn draw_legend<DB: DrawingBackend>(
    area: &DrawingArea<DB, Shift>,
    entries: &[LegendEntry],
    rows: &[Vec<usize>],
    footnotes: &[String],
) -> Result<(), DrawingAreaErrorKind<DB::ErrorType>> {
    let mut y = LEGEND_ROW_PX as i32 / 2 + 2;
    for row in rows {
        let mut x = 70;
        for &i in row {
            let e = &entries[i];
            match &e.sample {
                LegendSample::Line(p) => {
                    draw_pixel_line(area, &[(x, y), (x + SAMPLE_PX, y)], p, 1)?;
                    if p.marker != Marker::None {
                        draw_marker(area, (x + SAMPLE_PX / 2, y), p)?;
                    }
                }
                LegendSample::Fill(c, a) => {
                    area.draw(&Rectangle::new(
                        [(x, y - 7), (x + SAMPLE_PX, y + 7)],
                        c.mix(*a).filled(),
                    ))?;
                }
            }
            area.draw(&Text::new(
                e.label.clone(),
                (x + SAMPLE_PX + 8, y),
                text_style(NOTE_PX).pos(Pos::new(HPos::Left, VPos::Center)),
            ))?;
            x += SAMPLE_PX + 8 + text_width_px(&e.label, NOTE_PX) + 24;
        }
        y += LEGEND_ROW_PX as i32;
    }
    for f in footnotes {
        area.draw(&Text::new(
            f.clone(),
            (70, y),
            text_style(NOTE_PX).pos(Pos::new(HPos::Left, VPos::Center)),
        ))?;
        y += LEGEND_ROW_PX as i32;
    }
    Ok(())
}

/// Renders a figure to SVG text. `file` names the plot in error messages.
pub fn render(fig: &Figure, file: &str) -> Result<String, ReportError> {
    let columns = fig.columns.max(1);
    let n_rows = fig.panels.len().div_ceil(columns).max(1);
    let rows = legend_rows(&fig.legend, WIDTH_PX as i32 - 80);
    let mut footnotes = fig.footnotes.clone();
    if !fig.source.is_empty() {
        footnotes.push(format!("Case: {}", fig.source));
    }
    let legend_h = (rows.len() + footnotes.len()) as u32 * LEGEND_ROW_PX + 10;
    let title_h = 40;
    let height = title_h + n_rows as u32 * fig.row_height_px + legend_h;
    let mut svg = String::new();
    {
        let root = SVGBackend::with_string(&mut svg, (WIDTH_PX, height)).into_drawing_area();
        let err = plot_err(file);
        root.fill(&WHITE).map_err(&err)?;
        let (top, rest) = root.split_vertically(title_h);
        top.draw(&Text::new(
            fig.title.clone(),
            (WIDTH_PX as i32 / 2, title_h as i32 / 2 + 2),
            text_style(TITLE_PX).pos(Pos::new(HPos::Center, VPos::Center)),
        ))
        .map_err(&err)?;
        let (grid, legend) = rest.split_vertically(n_rows as u32 * fig.row_height_px);
        let cells = grid.split_evenly((n_rows, columns));
        for (panel, cell) in fig.panels.iter().zip(cells.iter()) {
            // Padding cells of an incomplete row stay empty.
            if panel.x_range.1 <= panel.x_range.0 || panel.y_range.1 <= panel.y_range.0 {
                continue;
            }
            draw_panel(cell, panel).map_err(&err)?;
        }
        draw_legend(&legend, &fig.legend, &rows, &footnotes).map_err(&err)?;
        root.present().map_err(&err)?;
    }
    Ok(svg)
}

/// Pads a data range by a fraction on each side; a zero-width range gets a unit width.
pub fn padded(lo: f64, hi: f64, fraction: f64) -> (f64, f64) {
    if !(lo.is_finite() && hi.is_finite()) {
        return (0.0, 1.0);
    }
    if hi - lo <= 1e-12 * hi.abs().max(1.0) {
        return (lo - 0.5, hi + 0.5);
    }
    let d = (hi - lo) * fraction;
    (lo - d, hi + d)
}

/// Colour for a colour index (for shades matching a pen).
pub fn colour(i: usize) -> RGBColor {
    COLOURS[i % COLOURS.len()]
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn clipping_stops_curves_at_the_axis_edge() {
        let pts = [(0.0, 0.0), (10.0, 1.0), (30.0, 2.0), (5.0, 3.0)];
        let pieces = clip_x(&pts, (0.0, 20.0));
        assert_eq!(pieces.len(), 2);
        assert_eq!(pieces[0].last().copied(), Some((20.0, 1.5)));
        assert_eq!(pieces[1][0], (20.0, 2.4)); // (30, 2) -> (5, 3) crosses x = 20 at t = 0.4
    }

    #[test]
    fn spread_keeps_labels_apart_and_inside() {
        let got = spread(&[100, 102, 50, 198], 10, 0, 200);
        assert_eq!(got[2], 50);
        assert!(got[1] - got[0] >= 10);
        assert!(got[3] <= 200 && got[3] - got[1] >= 10);
    }

    #[test]
    fn pens_differ_in_dash_or_marker_not_only_colour() {
        for i in 0..9 {
            for j in 0..i {
                let (a, b) = (pen(i), pen(j));
                assert!(a.dash != b.dash || a.marker != b.marker, "{i} vs {j}");
            }
        }
    }
}
