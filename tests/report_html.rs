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
    assert_eq!(html.matches("<svg").count(), 8, "all eight plots inline");
    for heading in [
        "1 Scope and cautions",
        "2 Inputs",
        "3 Method",
        "4 Natural modes by stage",
        "5 Vortex-shedding verdicts",
        "6 Stage comparison",
        "7 Loads",
        "8 Along-wind action and the vortex case",
        "9 Resistance of the RC shell and fatigue of the reinforcement",
        "10 Remedies",
        "11 Warnings",
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

/// Rows (cell texts) of the table after each `<h4>` whose text is `title`, in document order.
fn tables_after_h4(doc: &roxmltree::Document, title: &str) -> Vec<(Vec<String>, Vec<Vec<String>>)> {
    let text = |n: roxmltree::Node| -> String {
        n.descendants()
            .filter(|d| d.is_text())
            .filter_map(|d| d.text())
            .collect()
    };
    doc.descendants()
        .filter(|n| n.has_tag_name("h4") && text(*n) == title)
        .filter_map(|h| {
            h.next_siblings()
                .skip(1)
                .filter(|n| n.is_element())
                .take_while(|n| !n.has_tag_name("h4") && !n.has_tag_name("h3"))
                .find(|n| n.has_tag_name("table"))
        })
        .map(|table| {
            let head = table
                .descendants()
                .filter(|n| n.has_tag_name("th"))
                .map(text)
                .collect();
            let rows = table
                .descendants()
                .filter(|n| n.has_tag_name("tr"))
                .map(|tr| {
                    tr.children()
                        .filter(|c| c.has_tag_name("td"))
                        .map(text)
                        .collect::<Vec<_>>()
                })
                .filter(|r| !r.is_empty())
                .collect();
            (head, rows)
        })
        .collect()
}

#[test]
fn every_intermediate_value_of_every_method_is_tabulated() {
    let html = demo_html();
    let doc = parse(&html);
    let results = analyse(stackwake::input::demo_case(), CheckOptions::default()).unwrap();
    let f = |x: f64, d: usize| format!("{x:.d$}");
    let e = |x: f64| format!("{x:.3e}");
    let a1 = tables_after_h4(&doc, "EN 1991-1-4 approach 1 (E.1.5.2)");
    let a2 = tables_after_h4(&doc, "EN 1991-1-4 approach 2 (E.1.5.3)");
    let gb = tables_after_h4(&doc, "GB 50009-2012 Appendix H.1");
    let stages_with_a1: Vec<_> = results
        .vortex
        .stages
        .iter()
        .filter(|s| s.modes.iter().any(|m| m.approach1.is_some()))
        .collect();
    assert_eq!(a1.len(), stages_with_a1.len());
    assert_eq!(a2.len(), stages_with_a1.len());
    assert_eq!(gb.len(), results.vortex.stages.len());
    // Heads carry the standard's symbols, not column names.
    for h in [
        "clat,0",
        "clat",
        "Lj (m)",
        "centre of Lj",
        "K (-)",
        "KW (-)",
        "yF,max (m)",
    ] {
        assert!(
            a1[0].0.iter().any(|c| c.contains(h)),
            "approach 1 head {h}: {:?}",
            a1[0].0
        );
    }
    for h in ["Cc (-)", "Ka", "aL (-)", "\u{3c3}y (m)", "kp (-)"] {
        assert!(
            a2[0].0.iter().any(|c| c.contains(h)),
            "approach 2 head {h}: {:?}",
            a2[0].0
        );
    }
    for h in ["regime", "H1 (m)", "\u{3bb}j (-)", "\u{3b6}j (-)"] {
        assert!(
            gb[0].0.iter().any(|c| c.contains(h)),
            "GB head {h}: {:?}",
            gb[0].0
        );
    }
    assert!(!html.contains("base_moment_mnm") && !html.contains("tip_amplitude_m<"));
    for (k, s) in stages_with_a1.iter().enumerate() {
        for m in &s.modes {
            let (Some(r1), Some(r2)) = (&m.approach1, &m.approach2) else {
                continue;
            };
            let want1 = vec![
                m.mode.to_string(),
                f(r1.c_lat0, 3),
                f(r1.speed_ratio_lj, 3),
                f(r1.c_lat, 3),
                f(r1.correlation_length_m, 1),
                f(r1.correlation_centre_z_m, 1),
                f(r1.k, 4),
                format!(
                    "{}{}",
                    f(r1.kw, 3),
                    if r1.kw_uncapped > r1.kw { " (cap)" } else { "" }
                ),
                f(r1.y_max_m, 4),
                f(r1.tip_amplitude_m, 4),
                e(r1.fatigue_cycles),
            ];
            assert!(
                a1[k].1.contains(&want1),
                "{} mode {}: {want1:?} in {:?}",
                s.stage,
                m.mode,
                a1[k].1
            );
            let want2 = vec![
                m.mode.to_string(),
                f(r2.c_c, 4),
                f(r2.k_a, 3),
                f(r2.a_l, 2),
                f(r2.sigma_y_m, 4),
                f(r2.peak_factor, 3),
                f(r2.y_max_m, 4),
                f(r2.tip_amplitude_m, 4),
                e(r2.fatigue_cycles),
            ];
            assert!(
                a2[k].1.contains(&want2),
                "{} mode {}: {want2:?}",
                s.stage,
                m.mode
            );
        }
    }
    for (k, s) in results.vortex.stages.iter().enumerate() {
        for m in &s.modes {
            let g = &m.gb50009;
            let row = gb[k]
                .1
                .iter()
                .find(|r| r[0] == m.mode.to_string())
                .expect("GB row");
            assert_eq!(row[1], f(g.diameter_m, 2));
            assert_eq!(row[2], f(g.critical_speed_m_s, 2));
            assert_eq!(row[3], e(g.reynolds));
            assert_eq!(row[6], g.lock_in_start_m.map_or("-".into(), |v| f(v, 1)));
            assert_eq!(row[7], g.lambda_used.map_or("-".into(), |v| f(v, 3)));
            assert_eq!(row[8], f(g.damping_ratio, 4));
        }
    }
    // Table 3.1 lists every registry entry.
    for entry in stackwake::wind::constants::registry() {
        assert!(
            html.contains(&format!(
                "<td>{}</td>",
                entry
                    .name
                    .replace('&', "&amp;")
                    .replace('<', "&lt;")
                    .replace('>', "&gt;")
            )),
            "{}",
            entry.name
        );
    }
}

#[test]
fn verdict_at_a_glance_agrees_with_the_results_and_the_exit_code() {
    // Project contract (no outside reference): section 1.1 lists every stage with its
    // largest utilisation, its fatigue damage and its vortex verdict as computed, marks a
    // stage "fails" exactly when one of them exceeds its limit, and names the exit code.
    let html = demo_html();
    let doc = parse(&html);
    let results = analyse(stackwake::input::demo_case(), CheckOptions::default()).unwrap();
    let r = results
        .resistance
        .as_ref()
        .expect("the demo has [reinforcement]");
    let h = doc
        .descendants()
        .find(|n| {
            n.has_tag_name("h3")
                && n.descendants()
                    .filter_map(|d| d.text())
                    .collect::<String>()
                    .starts_with("1.1 Verdict at a glance")
        })
        .expect("section 1.1");
    let table = h
        .next_siblings()
        .skip(1)
        .find(|n| n.is_element())
        .filter(|n| n.has_tag_name("table"))
        .expect("a table follows 1.1");
    let rows: Vec<Vec<String>> = table
        .descendants()
        .filter(|n| n.has_tag_name("tr"))
        .map(|tr| {
            tr.children()
                .filter(|c| c.has_tag_name("td"))
                .map(|td| td.text().unwrap_or("").to_string())
                .collect::<Vec<_>>()
        })
        .filter(|r| !r.is_empty())
        .collect();
    assert_eq!(rows.len(), results.vortex.stages.len());
    for ((row, sv), sr) in rows.iter().zip(&results.vortex.stages).zip(&r.stages) {
        assert_eq!(row[0], sv.stage);
        let g = sr.governing.as_ref().unwrap();
        assert!(
            row[1].starts_with(&format!("{:.3}", g.utilisation)),
            "{row:?}"
        );
        let vortex_fails = sv.modes.iter().any(|m| m.verdict.is_exceeds());
        assert_eq!(row[3].starts_with("exceeds"), vortex_fails, "{row:?}");
        let fails = vortex_fails || g.utilisation > 1.0 || sr.damage > 1.0;
        assert_eq!(row[4], if fails { "fails" } else { "passes" }, "{row:?}");
    }
    // The demo fails on purpose (README): exit code 1, said in the note.
    assert!(html.contains("Overall: a check fails (exit code 1)."));
}
