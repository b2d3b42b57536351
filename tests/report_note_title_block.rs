//! The design note's title block: the SHA-256 printed for the case file equals the digest of
//! the file's bytes computed independently (GNU coreutils `sha256sum`, falling back to the
//! FIPS 180-2 example digest of a fixed file), the `[project]` keys are shown and escaped,
//! and the demo says its digest is of the embedded text.

use std::io::Write as _;
use std::process::{Command, Stdio};

use stackwake::commands::check::{run, CheckOptions};

fn parse(html: &str) -> roxmltree::Document<'_> {
    let opt = roxmltree::ParsingOptions {
        allow_dtd: true,
        ..Default::default()
    };
    roxmltree::Document::parse_with_options(html, opt).expect("report.html is well-formed XML")
}

/// The title block's value cell for `key`.
fn title_value(doc: &roxmltree::Document, key: &str) -> String {
    let table = doc
        .descendants()
        .find(|n| n.has_tag_name("table") && n.attribute("class") == Some("title"))
        .expect("title block table");
    let row = table
        .descendants()
        .filter(|n| n.has_tag_name("tr"))
        .find(|tr| {
            tr.children()
                .find(|c| c.has_tag_name("th"))
                .and_then(|th| th.text())
                == Some(key)
        })
        .unwrap_or_else(|| panic!("title block row {key}"));
    row.children()
        .find(|c| c.has_tag_name("td"))
        .and_then(|td| td.text())
        .unwrap_or("")
        .to_string()
}

fn sha256sum(bytes: &[u8]) -> Option<String> {
    let mut child = Command::new("sha256sum")
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .spawn()
        .ok()?;
    child.stdin.take()?.write_all(bytes).ok()?;
    let out = child.wait_with_output().ok()?;
    Some(
        String::from_utf8_lossy(&out.stdout)
            .split_whitespace()
            .next()?
            .to_string(),
    )
}

const CASE: &str = "title = \"Title block check\"\r\n\
[project]\r\n\
job = \"<b>J-12</b> & co\"\r\n\
revision = \"C\"\r\n\
prepared_by = \"A. Engineer\"\r\n\
[shell]\r\n\
elastic_modulus_gpa = 32.0\r\n\
density_kg_m3 = 2500.0\r\n\
stations = [\r\n\
  { z_m = 0.0, outer_diameter_m = 12.0, wall_m = 0.4 },\r\n\
  { z_m = 120.0, outer_diameter_m = 8.0, wall_m = 0.2 },\r\n\
]\r\n\
[wind]\r\n\
reference_speed_m_s = 25.0\r\n\
[vortex]\r\n\
modes = 2\r\n";

#[test]
fn title_block_digest_is_the_case_files_own() {
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("stack one.toml");
    // CRLF line ends: the digest must be of the bytes as read, not of normalised text.
    std::fs::write(&path, CASE).unwrap();
    let out = dir.path().join("out");
    run(Some(&path), &out, CheckOptions::default()).unwrap();
    let html = std::fs::read_to_string(out.join("report.html")).unwrap();
    let doc = parse(&html);

    let want = sha256sum(CASE.as_bytes()).expect("sha256sum (GNU coreutils) runs");
    assert_eq!(want.len(), 64);
    let got = title_value(&doc, "SHA-256");
    assert!(
        got.starts_with(&want),
        "title block SHA-256 {got}, sha256sum {want}"
    );
    assert_eq!(title_value(&doc, "Case file"), "stack one.toml");
    assert_eq!(title_value(&doc, "Case title"), "Title block check");
    assert_eq!(title_value(&doc, "Revision"), "C");
    assert_eq!(title_value(&doc, "Prepared by"), "A. Engineer");
    assert_eq!(title_value(&doc, "Checked by"), "(not given)");
    assert_eq!(
        title_value(&doc, "Program"),
        concat!("stackwake ", env!("CARGO_PKG_VERSION"))
    );
    // Markup in a [project] key is text, not markup.
    assert_eq!(title_value(&doc, "Job"), "<b>J-12</b> & co");
    assert!(html.contains("&lt;b&gt;J-12&lt;/b&gt; &amp; co"));
    assert!(!html.contains("<b>J-12"));
}

#[test]
fn fixed_file_digest_matches_the_published_example() {
    // FIPS 180-2, Appendix B.1: SHA-256("abc").
    let dir = tempfile::tempdir().unwrap();
    let path = dir.path().join("abc.toml");
    std::fs::write(&path, "abc").unwrap();
    let s =
        stackwake::case::CaseSource::of_bytes("abc.toml", &std::fs::read(&path).unwrap(), false);
    assert_eq!(
        s.sha256_hex,
        "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"
    );
}

#[test]
fn demo_digest_is_of_the_embedded_text_and_says_so() {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    run(None, &out, CheckOptions::default()).unwrap();
    let html = std::fs::read_to_string(out.join("report.html")).unwrap();
    let doc = parse(&html);
    let got = title_value(&doc, "SHA-256");
    let want = sha256sum(stackwake::input::DEMO_CASE_TOML.as_bytes()).expect("sha256sum runs");
    assert_eq!(got, format!("{want} (of the embedded demo text)"));
    assert!(title_value(&doc, "Case file").contains("built-in demo case"));
    // The shipped file is the embedded text.
    let file = std::fs::read(concat!(env!("CARGO_MANIFEST_DIR"), "/data/demo.toml")).unwrap();
    assert_eq!(sha256sum(&file).unwrap(), want);
}
