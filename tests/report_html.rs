//! report.html of the demo run: well-formed (parsed as XML), self-contained (no external
//! resource: no scripts, stylesheets, images or links to the network), and its tables list
//! every stage and every mode.

use stackwake::commands::check::{analyse, run, CheckOptions};

fn demo_html() -> String {
    let dir = tempfile::tempdir().unwrap();
    let out = dir.path().join("out");
    run(None, &out, CheckOptions::default()).unwrap();
    std::fs::read_to_string(out.join("report.html")).unwrap()
}

fn parse(html: &str) -> roxmltree::Document<'_> {
    let opt = roxmltree::ParsingOptions {
        allow_dtd: true,
        ..Default::default()
    };
    roxmltree::Document::parse_with_options(html, opt).expect("report.html is well-formed XML")
}

#[test]
fn html_is_well_formed_and_self_contained() {
    let html = demo_html();
    let doc = parse(&html);
    for node in doc.descendants().filter(|n| n.is_element()) {
        let tag = node.tag_name().name();
        assert!(
            !matches!(
                tag,
                "script" | "link" | "img" | "iframe" | "object" | "embed"
            ),
            "external or active element <{tag}>"
        );
        for a in node.attributes() {
            assert!(
                a.name() != "src" && a.name() != "href",
                "attribute {}",
                a.name()
            );
        }
    }
    // The only URLs are XML namespace names.
    let stripped = html
        .replace("xmlns=\"http://www.w3.org/2000/svg\"", "")
        .replace("xmlns=\"http://www.w3.org/1999/xhtml\"", "");
    assert!(!stripped.contains("http://") && !stripped.contains("https://"));
    assert!(!stripped.contains("url("), "no CSS references");
    assert!(html.contains("@page"), "print CSS for A4");
    assert_eq!(html.matches("<svg").count(), 6, "all six plots inline");
    for heading in [
        "1 Scope and cautions",
        "2 Inputs",
        "3 Method",
        "4 Natural modes by stage",
        "5 Vortex-shedding verdicts",
        "6 Stage comparison",
        "7 Loads",
        "8 Remedies",
        "9 Warnings",
    ] {
        assert!(html.contains(heading), "missing section {heading}");
    }
    assert!(html.contains("licensed engineer") && html.contains("National Annex"));
    assert!(html.contains("No warranty"));
}

/// First-column cells of the table that follows each `<h3>` starting with `prefix`.
fn tables_after(doc: &roxmltree::Document, prefix: &str) -> Vec<(String, Vec<String>)> {
    let mut out = Vec::new();
    for h in doc.descendants().filter(|n| n.has_tag_name("h3")) {
        let text: String = h.descendants().filter_map(|n| n.text()).collect();
        if !text.starts_with(prefix) {
            continue;
        }
        let table = h
            .next_siblings()
            .skip(1) // the iterator starts with the heading itself
            .find(|n| n.is_element())
            .filter(|n| n.has_tag_name("table"))
            .expect("a table follows the stage heading");
        let first: Vec<String> = table
            .descendants()
            .filter(|n| n.has_tag_name("tr"))
            .filter_map(|tr| tr.children().find(|c| c.has_tag_name("td")))
            .map(|td| td.text().unwrap_or("").to_string())
            .collect();
        out.push((text, first));
    }
    out
}

#[test]
fn tables_list_every_stage_and_mode() {
    let html = demo_html();
    let doc = parse(&html);
    let results = analyse(stackwake::input::demo_case(), CheckOptions::default()).unwrap();
    let modal = tables_after(&doc, "Stage \"");
    // Section 4 (modes) and section 5 (verdicts) each have one heading per stage.
    assert_eq!(modal.len(), 2 * results.stages.len());
    for (k, s) in results.stages.iter().enumerate() {
        let want: Vec<String> = s.modes.iter().map(|m| m.number.to_string()).collect();
        let (head, modes) = &modal[k];
        assert!(head.contains(&s.stage.name), "{head}");
        assert_eq!(modes, &want, "modes table of {}", s.stage.name);
        let v = &results.vortex.stages[k];
        let want: Vec<String> = v.modes.iter().map(|m| m.mode.to_string()).collect();
        let (head, modes) = &modal[results.stages.len() + k];
        assert!(head.contains(&v.stage));
        assert_eq!(modes, &want, "verdict table of {}", v.stage);
    }
}
