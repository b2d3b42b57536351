//! The demo design note printed to PDF by a real browser (headless Chromium) and read back
//! with `pdftotext` (poppler-utils): every page carries "page x of y" (CSS paged media margin
//! boxes), every section heading and the title block are in the printed text, and no word is
//! printed outside the A4 text width (210 mm - 14 mm right margin), so the wide verdict
//! tables fit the page.
//!
//! Needs the Debian packages `chromium` and `poppler-utils` (`.ci/run` installs them when
//! missing). Without them the test prints a SKIPPED line on stderr and returns: it never
//! passes silently.

use std::io::Write as _;
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};

use stackwake::commands::check::{run, CheckOptions};

/// First of `names` found on PATH.
fn find_program(names: &[&str]) -> Option<PathBuf> {
    let path = std::env::var_os("PATH")?;
    for dir in std::env::split_paths(&path) {
        for name in names {
            let p = dir.join(name);
            if p.is_file() {
                return Some(p);
            }
        }
    }
    None
}

fn skip(why: &str) {
    eprintln!(
        "\n*** SKIPPED report_note_printed_pdf: {why}. The design note was NOT printed and \
         checked in a browser. Install the Debian packages chromium and poppler-utils \
         (.ci/run does) to run this test. ***\n"
    );
}

/// Runs `cmd`, killing it after `limit`.
fn run_with_timeout(cmd: &mut Command, limit: Duration) -> std::process::Output {
    let mut child = cmd
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("start the program");
    let start = Instant::now();
    loop {
        if child.try_wait().expect("wait").is_some() {
            return child.wait_with_output().expect("collect output");
        }
        if start.elapsed() > limit {
            let _ = child.kill();
            panic!("{cmd:?} did not finish within {limit:?}");
        }
        std::thread::sleep(Duration::from_millis(100));
    }
}

fn print_to_pdf(chromium: &Path, html: &Path, pdf: &Path, profile: &Path) {
    let url = format!("file://{}", html.display());
    let out = run_with_timeout(
        Command::new(chromium).args([
            "--headless",
            "--no-sandbox",
            "--disable-gpu",
            "--disable-quic",
            "--no-first-run",
            "--disable-background-networking",
            "--disable-component-update",
            "--disable-sync",
            &format!("--user-data-dir={}", profile.display()),
            &format!("--print-to-pdf={}", pdf.display()),
            "--no-pdf-header-footer",
            &url,
        ]),
        Duration::from_secs(180),
    );
    assert!(
        pdf.is_file(),
        "chromium wrote no PDF (status {:?}): {}",
        out.status,
        String::from_utf8_lossy(&out.stderr)
    );
}

/// The text of `pdf` (written to a file: a large output must not fill the pipe).
fn pdftotext(pdftotext: &Path, pdf: &Path, extra: &[&str]) -> String {
    let txt = pdf.with_extension(format!("{}.txt", extra.join("")));
    let out = run_with_timeout(
        Command::new(pdftotext).args(extra).arg(pdf).arg(&txt),
        Duration::from_secs(60),
    );
    assert!(out.status.success(), "pdftotext failed");
    std::fs::read_to_string(&txt).expect("UTF-8 text")
}

/// SHA-256 of `bytes` by the system's `sha256sum` (GNU coreutils), independent of the
/// implementation under test.
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

#[test]
fn demo_note_prints_with_page_numbers_headings_and_title_block() {
    let Some(chromium) = find_program(&["chromium", "chromium-browser", "google-chrome"]) else {
        return skip("no chromium on PATH");
    };
    let Some(to_text) = find_program(&["pdftotext"]) else {
        return skip("no pdftotext (poppler-utils) on PATH");
    };
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    run(None, &out, CheckOptions::default()).unwrap();
    let pdf = dir.path().join("note.pdf");
    let profile = dir.path().join("profile");
    std::fs::create_dir(&profile).unwrap();
    print_to_pdf(&chromium, &out.join("report.html"), &pdf, &profile);

    let text = pdftotext(&to_text, &pdf, &["-layout"]);
    // pdftotext ends every page with a form feed.
    let pages: Vec<&str> = text
        .split('\u{c}')
        .filter(|p| !p.trim().is_empty())
        .collect();
    let total = pages.len();
    assert!(total >= 5, "only {total} pages printed");
    for (i, page) in pages.iter().enumerate() {
        let want = format!("page {} of {total}", i + 1);
        assert!(page.contains(&want), "page {}: no footer \"{want}\"", i + 1);
    }

    for heading in [
        "1 Scope and cautions",
        "2 Inputs",
        "3 Method",
        "3.1 Constants not read from the published standard",
        "4 Natural modes by stage",
        "5 Vortex-shedding verdicts",
        "6 Stage comparison",
        "7 Loads",
        "8 Along-wind action and the vortex case",
        "9 Resistance of the RC shell and fatigue of the reinforcement",
        "10 Remedies",
        "11 Warnings",
    ] {
        assert!(
            text.contains(heading),
            "printed note lacks the heading {heading}"
        );
    }

    // Title block: keys and values of the demo (data/demo.toml), its digest and the version.
    let flat: String = text.split_whitespace().collect::<Vec<_>>().join(" ");
    for s in [
        "Invented demo: 210 m flue stack, inland power plant",
        "Job DEMO-0001 (invented)",
        "Revision A",
        "Case file data/demo.toml",
        "Prepared by stackwake demo",
        "Checked by to be checked by a licensed engineer",
        concat!("Program stackwake ", env!("CARGO_PKG_VERSION")),
        "Date ",
        "SHA-256",
    ] {
        assert!(flat.contains(s), "title block lacks \"{s}\"");
    }
    let digest =
        sha256sum(stackwake::input::DEMO_CASE_TOML.as_bytes()).expect("sha256sum (coreutils) runs");
    let squeezed: String = text.chars().filter(|c| !c.is_whitespace()).collect();
    assert!(
        squeezed.contains(&digest),
        "title block lacks the digest {digest}"
    );

    // Nothing is printed outside the text width: every word's right edge lies within
    // 210 mm - 14 mm (the right margin of the @page rule), in PDF points.
    let bbox = pdftotext(&to_text, &pdf, &["-bbox"]);
    let right_limit_pt = (210.0 - 14.0) / 25.4 * 72.0 + 1.0;
    let mut widest = 0.0f64;
    for line in bbox.lines().filter(|l| l.trim_start().starts_with("<word")) {
        let x_max: f64 = line
            .split("xMax=\"")
            .nth(1)
            .and_then(|r| r.split('"').next())
            .and_then(|v| v.parse().ok())
            .expect("xMax of a word");
        if x_max > widest {
            widest = x_max;
        }
        assert!(
            x_max <= right_limit_pt,
            "a word reaches x = {x_max:.1} pt, past the text width ({right_limit_pt:.1} pt): {line}"
        );
    }
    assert!(widest > 400.0, "the word boxes were read ({widest} pt)");
}
