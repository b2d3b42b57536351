//! Plain-text tables for the terminal.

/// Renders rows under a header with columns padded to their widest cell; numeric-looking
/// cells are right-aligned.
pub fn render(header: &[&str], rows: &[Vec<String>]) -> String {
    let n = header.len();
    let mut width: Vec<usize> = header.iter().map(|h| h.chars().count()).collect();
    for r in rows {
        for (i, c) in r.iter().enumerate().take(n) {
            width[i] = width[i].max(c.chars().count());
        }
    }
    let numeric = |s: &str| s.parse::<f64>().is_ok();
    let mut out = String::new();
    let line = |cells: Vec<String>, out: &mut String| {
        let parts: Vec<String> = cells
            .iter()
            .enumerate()
            .map(|(i, c)| {
                if numeric(c) {
                    format!("{c:>w$}", w = width[i])
                } else {
                    format!("{c:<w$}", w = width[i])
                }
            })
            .collect();
        out.push_str(parts.join("  ").trim_end());
        out.push('\n');
    };
    line(header.iter().map(|s| s.to_string()).collect(), &mut out);
    line(width.iter().map(|w| "-".repeat(*w)).collect(), &mut out);
    for r in rows {
        line(r.clone(), &mut out);
    }
    out
}
