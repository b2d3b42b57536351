//! The title block at the head of the note: case title, the case file's name and SHA-256
//! (of the exact bytes read; for the built-in demo, of the text embedded in the program),
//! stackwake version, date and the optional `[project]` keys. Every value is escaped.

use std::fmt::Write as _;

use super::markup::html_escape;
use crate::case::Case;

/// Writes the heading and the title-block table.
pub(super) fn write(out: &mut String, case: &Case, date: &str) {
    let _ = writeln!(out, "<h1>{}</h1>", html_escape(&case.title));
    let mut rows: Vec<(&str, String)> = Vec::new();
    let p = &case.project;
    let given = |v: &Option<String>| v.clone().unwrap_or_else(|| "(not given)".into());
    rows.push(("Job", given(&p.job)));
    rows.push(("Revision", given(&p.revision)));
    rows.push(("Case title", case.title.clone()));
    match &case.source {
        Some(s) if s.built_in_demo => {
            rows.push((
                "Case file",
                format!(
                    "{} (built-in demo case, embedded in stackwake)",
                    s.file_name
                ),
            ));
            rows.push((
                "SHA-256",
                format!("{} (of the embedded demo text)", s.sha256_hex),
            ));
        }
        Some(s) => {
            rows.push(("Case file", s.file_name.clone()));
            rows.push(("SHA-256", format!("{} (of the file as read)", s.sha256_hex)));
        }
        None => {
            rows.push(("Case file", "(none: case built in code)".into()));
            rows.push(("SHA-256", "-".into()));
        }
    }
    rows.push((
        "Program",
        format!("stackwake {}", env!("CARGO_PKG_VERSION")),
    ));
    rows.push(("Date", date.to_string()));
    rows.push(("Prepared by", given(&p.prepared_by)));
    rows.push(("Checked by", given(&p.checked_by)));
    out.push_str("<table class=\"title\"><tbody>\n");
    for (k, v) in rows {
        let _ = writeln!(
            out,
            "<tr><th>{}</th><td>{}</td></tr>",
            html_escape(k),
            html_escape(&v)
        );
    }
    out.push_str("</tbody></table>\n");
    out.push_str(
        "<p class=\"small\">Vortex-shedding design note. The SHA-256 identifies the exact \
         case file the results were computed from: <code>sha256sum FILE</code> must print \
         the same digits.</p>\n",
    );
}
