//! A shell given by more than 2 000 stations (a profile exported point by point) through
//! `stackwake check`: the run warns, naming the count and that the note's station table is
//! condensed, and the note's table shows the first, the last and each break of slope. Our own
//! presentation contract; no outside reference is involved.

use assert_cmd::Command;

#[test]
fn more_than_2000_stations_warn_and_condense_the_note_table() {
    let dir = tempfile::tempdir().unwrap();
    // 2 401 stations every 0.1 m; D breaks at z = 60 m (station 601), t at 150 m (1501).
    let mut csv = String::from("z_m,outer_diameter_m,wall_m\n");
    for i in 0..=2400 {
        let z = i as f64 * 0.1;
        let d = if z <= 60.0 {
            16.0 - 0.05 * z
        } else {
            13.0 - 0.02 * (z - 60.0)
        };
        let t = if z <= 150.0 {
            0.55 - 0.001 * z
        } else {
            0.40 - 0.0015 * (z - 150.0)
        };
        csv.push_str(&format!("{z:.1},{d:.6},{t:.6}\n"));
    }
    std::fs::write(dir.path().join("stations.csv"), csv).unwrap();
    let case = dir.path().join("case.toml");
    std::fs::write(
        &case,
        "title = \"Invented: long station list\"\n\
         [shell]\nelastic_modulus_gpa = 32.0\ndensity_kg_m3 = 2500.0\n\
         stations_csv = \"stations.csv\"\n\
         [wind]\nreference_speed_m_s = 25.0\n\
         [vortex]\nmodes = 2\n",
    )
    .unwrap();
    let out = dir.path().join("out");
    let o = Command::cargo_bin("stackwake")
        .unwrap()
        .arg("check")
        .arg(&case)
        .arg("--out")
        .arg(&out)
        .output()
        .unwrap();
    let stderr = String::from_utf8_lossy(&o.stderr);
    assert!(matches!(o.status.code(), Some(0 | 1 | 3)), "{stderr}");
    assert!(
        stderr.contains("the shell has 2401 stations (more than 2000)")
            && stderr.contains("station table is condensed to 4 rows"),
        "{stderr}"
    );
    let html = std::fs::read_to_string(out.join("report.html")).unwrap();
    let start = html.find("<th>station</th>").expect("station table");
    let table = &html[start..start + html[start..].find("</table>").unwrap()];
    let rows: Vec<&str> = table.split("<tr>").skip(1).collect();
    assert_eq!(rows.len(), 4, "{table}");
    for (row, number) in rows.iter().zip(["1", "601", "1501", "2401"]) {
        assert!(row.contains(&format!(">{number}<")), "{row}");
    }
    assert!(html.contains("The case has 2401 stations; this table shows 4 of them"));
    assert!(html.contains("warning") || html.contains("Warnings"));
}
