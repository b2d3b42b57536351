//! Sweep outputs: `sweep.csv` (one row per variant x stage x mode; an invalid variant is one
//! row whose verdict says why) and `sweep_map.svg`, the lock-in map over two swept keys.
//! With more than two swept keys the map says, under its title, that each cell is the worst
//! case over the keys it does not show.
//!
//! `required_log_decrement` in sweep.csv: empty when the mode needs no more damping (within
//! the criteria, screened out or not judged), `inf` when no structural log decrement up to
//! 4 meets the criteria.
//!
//! The map is hand-written SVG that reads in greyscale: each class has its own fill AND
//! pattern (hatching for `exceeds`, cross-hatching for `invalid`), and cells large enough
//! carry a text label (class initial and the smallest speed ratio v_crit / v_m).
//! Units: the swept keys' own units; speed ratios dimensionless.

pub use super::note::html_escape as escape;
use std::fmt::Write as _;

use super::csv::safe_text;
use super::ReportError;
use crate::sweep::{Class, LockInMap, Variant, VariantOutcome, Vary};

/// Number in CSV: shortest text that reads back to the same f64.
fn num(v: f64) -> String {
    format!("{v}")
}

/// sweep.csv bytes.
pub fn sweep_csv(vary: &[Vary], variants: &[Variant]) -> Result<Vec<u8>, ReportError> {
    let fmt_err = |e: ::csv::Error| ReportError::Format {
        file: "sweep.csv".into(),
        message: e.to_string(),
    };
    let mut w = ::csv::Writer::from_writer(Vec::new());
    let mut header: Vec<String> = vary.iter().map(|v| safe_text(&v.key)).collect();
    for h in [
        "stage",
        "mode",
        "frequency_hz",
        "critical_speed_m_s",
        "speed_ratio",
        "scruton",
        "tip_amplitude_m",
        "max_stress_pa",
        "required_log_decrement",
        "verdict",
    ] {
        header.push(h.to_string());
    }
    w.write_record(&header).map_err(fmt_err)?;
    for v in variants {
        let keys: Vec<String> = v.values.iter().map(|&x| num(x)).collect();
        match &v.outcome {
            VariantOutcome::Rows(rows) => {
                for r in rows {
                    let mut rec = keys.clone();
                    rec.extend([
                        safe_text(&r.stage),
                        r.mode.to_string(),
                        num(r.frequency_hz),
                        r.critical_speed_m_s.map(num).unwrap_or_default(),
                        r.speed_ratio.map(num).unwrap_or_default(),
                        r.scruton.map(num).unwrap_or_default(),
                        r.tip_amplitude_m.map(num).unwrap_or_default(),
                        r.max_stress_pa.map(num).unwrap_or_default(),
                        r.required_log_decrement.map(num).unwrap_or_default(),
                        r.verdict.to_string(),
                    ]);
                    w.write_record(&rec).map_err(fmt_err)?;
                }
            }
            VariantOutcome::Invalid(msg) | VariantOutcome::Failed(msg) => {
                let word = if matches!(v.outcome, VariantOutcome::Invalid(_)) {
                    "invalid"
                } else {
                    "error"
                };
                let mut rec = keys.clone();
                // Empty cells for every result column but the verdict.
                rec.extend(std::iter::repeat_n(String::new(), 9));
                rec.push(format!("{word}: {}", msg.replace('\n', "; ")));
                w.write_record(&rec).map_err(fmt_err)?;
            }
        }
    }
    w.into_inner().map_err(|e| ReportError::Format {
        file: "sweep.csv".into(),
        message: e.to_string(),
    })
}

fn fill(class: Class) -> &'static str {
    match class {
        Class::Clear => "#ffffff",
        Class::Ok => "#d9d9d9",
        Class::NotJudged => "#a6a6a6",
        Class::Exceeds => "url(#hatch)",
        Class::Invalid => "url(#cross)",
    }
}

fn tick(v: f64) -> String {
    let s = format!("{v:.4}");
    let s = s.trim_end_matches('0').trim_end_matches('.');
    s.to_string()
}

/// sweep_map.svg text.
pub fn lock_in_map_svg(map: &LockInMap, title: &str) -> String {
    let (nx, ny) = (map.x.steps, map.y.steps);
    let cell = (720.0 / nx.max(ny) as f64).clamp(4.0, 60.0);
    // Room under the title for the hidden-keys line when there is one.
    let top = if map.hidden.is_empty() { 60.0 } else { 72.0 };
    let left = 110.0;
    let (w, h) = (cell * nx as f64, cell * ny as f64);
    let width = left + w + 190.0;
    let height = top + h + 80.0;
    let mut s = String::new();
    let _ = writeln!(
        s,
        r#"<svg xmlns="http://www.w3.org/2000/svg" width="{width:.0}" height="{height:.0}" viewBox="0 0 {width:.0} {height:.0}" font-family="sans-serif" font-size="11">"#
    );
    s.push_str(
        r##"<defs>
<pattern id="hatch" width="6" height="6" patternUnits="userSpaceOnUse" patternTransform="rotate(45)"><rect width="6" height="6" fill="#595959"/><line x1="0" y1="0" x2="0" y2="6" stroke="#000000" stroke-width="3"/></pattern>
<pattern id="cross" width="6" height="6" patternUnits="userSpaceOnUse"><rect width="6" height="6" fill="#ffffff"/><path d="M0,0 L6,6 M6,0 L0,6" stroke="#000000" stroke-width="1"/></pattern>
</defs>
"##,
    );
    let _ = writeln!(
        s,
        r#"<text x="{left}" y="20" font-size="14">{}</text>"#,
        escape(title)
    );
    let _ = writeln!(
        s,
        r#"<text x="{left}" y="40">Lock-in map: worst verdict over stages and modes; label = smallest speed ratio v_crit / v_m</text>"#
    );
    if let Some(note) = map.hidden_keys_note() {
        let _ = writeln!(
            s,
            r#"<text x="{left}" y="58" font-weight="bold">{}</text>"#,
            escape(&note)
        );
    }
    let xs = map.x.values();
    let ys = map.y.values();
    for c in &map.cells {
        let x = left + c.x_index as f64 * cell;
        // y grows upward: the first value at the bottom.
        let y = top + (ny - 1 - c.y_index) as f64 * cell;
        let ratio = c
            .min_speed_ratio
            .map_or(String::new(), |r| format!(", speed ratio {r:.2}"));
        let _ = writeln!(
            s,
            r##"<rect x="{x:.2}" y="{y:.2}" width="{cell:.2}" height="{cell:.2}" fill="{}" stroke="#808080" stroke-width="0.5"><title>{} = {}, {} = {}: {}{}</title></rect>"##,
            fill(c.class),
            escape(&map.x.key),
            tick(xs[c.x_index]),
            escape(&map.y.key),
            tick(ys[c.y_index]),
            c.class,
            ratio
        );
        if cell >= 30.0 {
            let text = match c.min_speed_ratio {
                Some(r) => format!("{} {r:.2}", &c.class.label()[..1].to_uppercase()),
                None => c.class.label()[..1].to_uppercase(),
            };
            let (fg, bg) = match c.class {
                Class::Exceeds => ("#ffffff", "#000000"),
                _ => ("#000000", "#ffffff"),
            };
            let _ = writeln!(
                s,
                r#"<text x="{:.2}" y="{:.2}" text-anchor="middle" fill="{fg}" stroke="{bg}" stroke-width="2.5" paint-order="stroke" font-size="{:.0}">{}</text>"#,
                x + cell / 2.0,
                y + cell / 2.0 + 4.0,
                (cell / 4.0).clamp(8.0, 12.0),
                escape(&text)
            );
        }
    }
    // Axes: ticks at the ends and up to 10 between.
    let every = |n: usize| (n / 10).max(1);
    for (i, v) in xs.iter().enumerate() {
        if i % every(nx) == 0 || i + 1 == nx {
            let _ = writeln!(
                s,
                r#"<text x="{:.2}" y="{:.2}" text-anchor="middle">{}</text>"#,
                left + (i as f64 + 0.5) * cell,
                top + h + 16.0,
                tick(*v)
            );
        }
    }
    for (i, v) in ys.iter().enumerate() {
        if i % every(ny) == 0 || i + 1 == ny {
            let _ = writeln!(
                s,
                r#"<text x="{:.2}" y="{:.2}" text-anchor="end">{}</text>"#,
                left - 6.0,
                top + (ny - 1 - i) as f64 * cell + cell / 2.0 + 4.0,
                tick(*v)
            );
        }
    }
    let _ = writeln!(
        s,
        r#"<text x="{:.2}" y="{:.2}" text-anchor="middle">{}</text>"#,
        left + w / 2.0,
        top + h + 40.0,
        escape(&map.x.key)
    );
    let _ = writeln!(
        s,
        r#"<text x="20" y="{:.2}" text-anchor="middle" transform="rotate(-90 20 {:.2})">{}</text>"#,
        top + h / 2.0,
        top + h / 2.0,
        escape(&map.y.key)
    );
    // Legend.
    let lx = left + w + 20.0;
    for (i, class) in Class::ALL.iter().enumerate() {
        let ly = top + i as f64 * 24.0;
        let _ = writeln!(
            s,
            r##"<rect x="{lx:.2}" y="{ly:.2}" width="18" height="18" fill="{}" stroke="#000000" stroke-width="0.5"/><text x="{:.2}" y="{:.2}">{} ({})</text>"##,
            fill(*class),
            lx + 24.0,
            ly + 13.0,
            class.label(),
            &class.label()[..1].to_uppercase()
        );
    }
    let _ = writeln!(
        s,
        r#"<text x="{lx:.2}" y="{:.2}">Screening tool: check by a licensed engineer.</text>"#,
        top + 5.0 * 24.0 + 16.0
    );
    s.push_str("</svg>\n");
    s
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn escapes_markup() {
        assert_eq!(escape("a<b & \"c\""), "a&lt;b &amp; &quot;c&quot;");
    }
}
