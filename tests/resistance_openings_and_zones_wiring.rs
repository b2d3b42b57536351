//! Wiring of the shell as drawn into the RC resistance: an `[[opening]]` removes its sector
//! (half-angle asin(width / D), the usual idealisation of the trade) from the section whose
//! M_Rd is checked, and a `[[shell.zone]]` f_ck replaces `[shell]`'s inside the zone. The
//! numerics of the sector removal and of M_Rd are checked against independent references
//! in their own tests (tests/resistance_*); this test checks that the case's own openings
//! and zones reach them, by comparison with the same case without them (invented stack).

use std::path::Path;

use stackwake::modal::{analyse_case, ModalOptions};
use stackwake::resistance::along_height::{node_resistances, NodeResistance};

mod resistance_common;
use resistance_common::STACK_120M;

fn resistances(extra: &str) -> Vec<NodeResistance> {
    let text = format!("{STACK_120M}{extra}");
    let case = stackwake::input::parse_case(&text, Path::new("."), "wiring").expect("valid case");
    let stages = analyse_case(
        &case,
        ModalOptions {
            modes: 1,
            min_elements: None,
        },
    )
    .expect("modes");
    node_resistances(
        case.resistance.as_ref().expect("[reinforcement]"),
        &stages[0].model,
    )
    .expect("resistance")
}

fn at(nodes: &[NodeResistance], z: f64) -> &NodeResistance {
    nodes
        .iter()
        .find(|n| (n.z_m - z).abs() < 1e-9)
        .unwrap_or_else(|| panic!("no node at {z} m"))
}

#[test]
fn an_opening_lowers_m_rd_at_its_levels_only() {
    let plain = resistances("");
    let cut = resistances(
        "[[opening]]\nfrom_z_m = 10.0\nto_z_m = 16.0\nwidth_m = 3.0\nlabel = \"flue inlet\"\n",
    );
    // The mesh has nodes at the opening's limits (the FE puts them there).
    let mid = cut
        .iter()
        .find(|n| n.z_m > 10.0 && n.z_m < 16.0)
        .or_else(|| cut.iter().find(|n| (n.z_m - 10.0).abs() < 1e-9))
        .expect("a node at the opening");
    let gross = {
        let p = plain
            .iter()
            .min_by(|a, b| (a.z_m - mid.z_m).abs().total_cmp(&(b.z_m - mid.z_m).abs()))
            .unwrap();
        p.resistance_moment_nm
    };
    assert!(
        mid.resistance_moment_nm < 0.97 * gross,
        "opening: {} vs gross {}",
        mid.resistance_moment_nm,
        gross
    );
    // Well above the opening the section and its axial force are the same (the opening's
    // missing mass lies below): the same M_Rd.
    let top_plain = &plain[plain.len() - 2];
    let top_cut = cut
        .iter()
        .find(|n| (n.z_m - top_plain.z_m).abs() < 1e-9)
        .expect("same node above");
    let rel = (top_cut.resistance_moment_nm - top_plain.resistance_moment_nm).abs()
        / top_plain.resistance_moment_nm;
    assert!(rel < 1e-9, "{rel}");
}

#[test]
fn a_zone_f_ck_applies_inside_the_zone_only() {
    let plain = resistances("");
    let strong = resistances(
        "[[shell.zone]]\nfrom_z_m = 0.0\nto_z_m = 40.0\ncharacteristic_strength_mpa = 50.0\n",
    );
    let base_plain = at(&plain, 0.0).resistance_moment_nm;
    let base_strong = at(&strong, 0.0).resistance_moment_nm;
    assert!(
        base_strong > base_plain * 1.001,
        "{base_strong} vs {base_plain}"
    );
    for n in strong.iter().filter(|n| n.z_m > 40.0 + 1e-9) {
        let p = plain
            .iter()
            .find(|p| (p.z_m - n.z_m).abs() < 1e-9)
            .expect("same node");
        let rel = (n.resistance_moment_nm - p.resistance_moment_nm).abs() / p.resistance_moment_nm;
        assert!(rel < 1e-9, "z {} m: {rel}", n.z_m);
    }
}
