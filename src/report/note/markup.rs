//! The note's small markup toolkit: escaping, number formats, tables and figures. Column
//! heads are our own markup (symbols with `<sub>`), written only from code; every cell and
//! every piece of user text is escaped.

use std::fmt::Write as _;

use crate::report::svg::Plot;

/// Escapes text for HTML element content and attribute values.
pub fn html_escape(s: &str) -> String {
    let mut out = String::with_capacity(s.len());
    for c in s.chars() {
        match c {
            '&' => out.push_str("&amp;"),
            '<' => out.push_str("&lt;"),
            '>' => out.push_str("&gt;"),
            '"' => out.push_str("&quot;"),
            '\'' => out.push_str("&#39;"),
            // Control characters other than tab/newline are not allowed in XML 1.0.
            c if (c as u32) < 0x20 && c != '\t' && c != '\n' => out.push('\u{fffd}'),
            c => out.push(c),
        }
    }
    out
}

/// Fixed decimals, "-" for a non-finite value.
pub(super) fn num(x: f64, digits: usize) -> String {
    if x.is_finite() {
        format!("{x:.digits$}")
    } else {
        "-".into()
    }
}

/// Scientific notation with 3 decimals, "-" for a non-finite value.
pub(super) fn sci(x: f64) -> String {
    if x.is_finite() {
        let s = format!("{x:.3e}");
        // 6.315e0 reads as a typo: between 1 and 10 the plain decimal says the same.
        s.strip_suffix("e0").map_or(s.clone(), str::to_string)
    } else {
        "-".into()
    }
}

pub(super) fn opt(x: Option<f64>, digits: usize) -> String {
    x.map_or_else(|| "-".into(), |v| num(v, digits))
}

/// A table of the note: text cells left-aligned, numbers right-aligned, failures bold.
pub(super) struct Table {
    /// Column heads as markup written by our code (never user text unescaped).
    pub head: Vec<String>,
    pub rows: Vec<Vec<Cell>>,
}

pub(super) enum Cell {
    Text(String),
    Num(String),
    Bad(String),
}

pub(super) fn t(s: impl AsRef<str>) -> Cell {
    Cell::Text(s.as_ref().to_string())
}

pub(super) fn n(s: String) -> Cell {
    Cell::Num(s)
}

/// Column heads from static markup.
pub(super) fn heads(h: &[&str]) -> Vec<String> {
    h.iter().map(|s| s.to_string()).collect()
}

impl Table {
    pub fn write(&self, out: &mut String) {
        out.push_str("<table><thead><tr>");
        for h in &self.head {
            let _ = write!(out, "<th>{h}</th>");
        }
        out.push_str("</tr></thead><tbody>");
        for r in &self.rows {
            out.push_str("<tr>");
            for c in r {
                match c {
                    Cell::Text(s) => {
                        let _ = write!(out, "<td>{}</td>", html_escape(s));
                    }
                    Cell::Num(s) => {
                        let _ = write!(out, "<td class=\"n\">{}</td>", html_escape(s));
                    }
                    Cell::Bad(s) => {
                        let _ = write!(out, "<td class=\"bad\">{}</td>", html_escape(s));
                    }
                }
            }
            out.push_str("</tr>");
        }
        out.push_str("</tbody></table>\n");
    }
}

/// An inline SVG plot with its numbered caption.
pub(super) fn figure(out: &mut String, plot: &Plot, number: usize) {
    let svg = plot.svg.trim();
    let svg = match svg.find("<svg") {
        Some(i) => &svg[i..],
        None => svg,
    };
    let _ = writeln!(
        out,
        "<figure id=\"{}\">{svg}<figcaption>Figure {number}: {}</figcaption></figure>",
        html_escape(plot.file.trim_end_matches(".svg")),
        html_escape(&plot.caption)
    );
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn escapes_markup_and_quotes() {
        assert_eq!(
            html_escape("<script>alert(1)</script> & \"x\" 'y'"),
            "&lt;script&gt;alert(1)&lt;/script&gt; &amp; &quot;x&quot; &#39;y&#39;"
        );
    }

    #[test]
    fn scientific_numbers_drop_a_zero_exponent_only() {
        assert_eq!(sci(6.3154), "6.315");
        assert_eq!(sci(0.011612), "1.161e-2");
        assert_eq!(sci(213_500.0), "2.135e5");
        assert_eq!(sci(f64::NAN), "-");
    }
}
