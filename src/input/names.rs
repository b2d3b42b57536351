//! Rules for the free text of a case (title, stage names, point-mass and opening labels, `[project]`,
//! a remedy's stage) and the escaping of user text printed to a terminal.
//!
//! Names are copied into every SVG, `report.html`, the CSVs and the terminal. A control
//! character (C0, DEL or C1) makes an XML file ill-formed (a standalone SVG with U+0007 does
//! not open) and can move or erase lines on a terminal, so names holding one are refused.
//! Bidirectional controls (U+202A-202E, U+2066-2069, U+200E/200F, U+061C) are legal in XML
//! but an unterminated right-to-left override reverses the text that follows it, so they
//! are kept visible instead: each one is replaced by its code as `\u{202e}`.
//!
//! No units: text only.

use super::issue::ValidationIssue;
use super::raw::RawCase;
use crate::case::Case;

/// A C0 control, DEL or a C1 control (Unicode general category Cc).
pub fn is_control(c: char) -> bool {
    c.is_control()
}

/// A Unicode bidirectional formatting character (embeddings, overrides, isolates, marks).
pub fn is_bidi_control(c: char) -> bool {
    matches!(
        c,
        '\u{202A}'..='\u{202E}' | '\u{2066}'..='\u{2069}' | '\u{200E}' | '\u{200F}' | '\u{061C}'
    )
}

/// `c` written visibly, as Rust writes it in a string: `\u{7}`.
fn code(c: char) -> String {
    format!("\\u{{{:x}}}", c as u32)
}

/// `text` with every bidirectional control replaced by its visible code.
pub fn neutral(text: &str) -> String {
    if !text.chars().any(is_bidi_control) {
        return text.to_string();
    }
    text.chars()
        .map(|c| {
            if is_bidi_control(c) {
                code(c)
            } else {
                c.to_string()
            }
        })
        .collect()
}

/// `text` safe to print on a terminal: control characters other than newline and tab, and
/// bidirectional controls, are written as their codes (`\u{1b}`), so a message that echoes a
/// user's key or value cannot move the cursor, erase a line or reverse the text after it.
pub fn terminal_safe(text: &str) -> String {
    let unsafe_char = |c: char| (is_control(c) && c != '\n' && c != '\t') || is_bidi_control(c);
    if !text.chars().any(unsafe_char) {
        return text.to_string();
    }
    text.chars()
        .map(|c| {
            if unsafe_char(c) {
                code(c)
            } else {
                c.to_string()
            }
        })
        .collect()
}

/// Every name of the raw case with its key path.
fn names(raw: &RawCase) -> Vec<(String, &str)> {
    let mut all = Vec::new();
    if let Some(t) = &raw.title {
        all.push(("title".to_string(), t.as_str()));
    }
    if let Some(p) = &raw.project {
        for (key, v) in [
            ("job", &p.job),
            ("revision", &p.revision),
            ("prepared_by", &p.prepared_by),
            ("checked_by", &p.checked_by),
        ] {
            if let Some(v) = v {
                all.push((format!("project.{key}"), v.as_str()));
            }
        }
    }
    for (i, s) in raw.stage.iter().flatten().enumerate() {
        all.push((format!("stage[{i}].name"), s.name.as_str()));
    }
    for (i, pm) in raw.point_mass.iter().enumerate() {
        if let Some(l) = &pm.label {
            all.push((format!("point_mass[{i}].label"), l.as_str()));
        }
    }
    for (i, o) in raw.opening.iter().enumerate() {
        if let Some(l) = &o.label {
            all.push((format!("opening[{i}].label"), l.as_str()));
        }
    }
    if let Some(r) = &raw.remedy {
        if let Some(s) = r.tmd.as_ref().and_then(|t| t.stage.as_ref()) {
            all.push(("remedy.tmd.stage".to_string(), s.as_str()));
        }
        if let Some(s) = r.strakes.as_ref().and_then(|t| t.stage.as_ref()) {
            all.push(("remedy.strakes.stage".to_string(), s.as_str()));
        }
    }
    if let Some(f) = &raw.shell.stations_csv {
        all.push(("shell.stations_csv".to_string(), f.as_str()));
    }
    all
}

/// Names holding a control character, each with the first such character and its place.
pub fn check_names(raw: &RawCase) -> Vec<ValidationIssue> {
    names(raw)
        .into_iter()
        .filter_map(|(path, text)| {
            let (at, c) = text.chars().enumerate().find(|&(_, c)| is_control(c))?;
            Some(ValidationIssue::new(
                path,
                format!("\"{}\"", terminal_safe(text)),
                format!(
                    "must not contain control characters ({} at character {}); names are \
                     printed in the SVGs, the note and on the terminal, where they break the \
                     file or the display",
                    code(c),
                    at + 1
                ),
            ))
        })
        .collect()
}

/// A `stations_csv` that names no file (empty or blank).
pub fn check_stations_csv_name(name: &str) -> Option<ValidationIssue> {
    name.trim().is_empty().then(|| {
        ValidationIssue::new(
            "shell.stations_csv",
            format!("{name:?}"),
            "must name a CSV file (relative to the case file's folder); leave the key out \
             to give the stations inline",
        )
    })
}

/// The validated case with bidirectional controls in every name made visible.
pub fn neutralise(case: &mut Case) {
    case.title = neutral(&case.title);
    for v in [
        &mut case.project.job,
        &mut case.project.revision,
        &mut case.project.prepared_by,
        &mut case.project.checked_by,
    ]
    .into_iter()
    .flatten()
    {
        *v = neutral(v);
    }
    for s in &mut case.stages {
        s.name = neutral(&s.name);
    }
    for pm in &mut case.point_masses {
        pm.label = neutral(&pm.label);
    }
    for o in &mut case.shell.openings {
        o.label = neutral(&o.label);
    }
    if let Some(r) = &mut case.remedy {
        if let Some(s) = r.tmd.as_mut().and_then(|t| t.stage.as_mut()) {
            *s = neutral(s);
        }
        if let Some(s) = r.strakes.as_mut().and_then(|t| t.stage.as_mut()) {
            *s = neutral(s);
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn bidi_controls_become_visible_codes() {
        assert_eq!(neutral("a\u{202E}b"), "a\\u{202e}b");
        assert_eq!(neutral("plain"), "plain");
        assert_eq!(neutral("\u{2066}x\u{2069}"), "\\u{2066}x\\u{2069}");
    }

    #[test]
    fn terminal_text_keeps_lines_but_not_escapes() {
        assert_eq!(terminal_safe("a\nb\tc"), "a\nb\tc");
        assert_eq!(terminal_safe("k\u{1b}[2K"), "k\\u{1b}[2K");
        assert_eq!(
            terminal_safe("\u{7f}\u{85}\u{202E}"),
            "\\u{7f}\\u{85}\\u{202e}"
        );
    }
}
