//! Errors through the binary name the user's own input and the rule: control characters in
//! names, bidirectional controls kept visible, terminal-safe messages, bounds on heights,
//! walls, masses and springs that would otherwise give nonsense or make the eigen-solver
//! give up. Each row asserts the exit code and the message; robustness checks of our own
//! error contract (`path = value: rule`, common practice for input validation), no outside
//! engineering reference is involved.

use assert_cmd::Command;

/// A small valid case (invented numbers); each row edits one piece of it.
const BASE: &str = r#"title = "Invented names-and-bounds base case"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
stations = [
  { z_m = 0.0,   outer_diameter_m = 12.0, wall_m = 0.40 },
  { z_m = 50.0,  outer_diameter_m = 10.0, wall_m = 0.30 },
  { z_m = 100.0, outer_diameter_m = 8.0,  wall_m = 0.20 },
]
[[point_mass]]
z_m = 90.0
mass_kg = 10000.0
label = "platform"
[[stage]]
name = "shell"
lining = false
[wind]
reference_speed_m_s = 25.0
"#;

fn edit(from: &str, to: &str) -> String {
    assert!(BASE.contains(from), "edit target not in BASE: {from}");
    BASE.replacen(from, to, 1)
}

/// Runs `args` (the case file appended first as `case.toml`) in a fresh folder.
fn run(case: &str, args: &[&str]) -> (i32, String, String, tempfile::TempDir) {
    let dir = tempfile::tempdir().expect("temp dir");
    std::fs::write(dir.path().join("case.toml"), case).expect("write case");
    let out = Command::cargo_bin("stackwake")
        .expect("binary")
        .current_dir(dir.path())
        .args(args)
        .output()
        .expect("run");
    (
        out.status.code().unwrap_or(-1),
        String::from_utf8_lossy(&out.stdout).into_owned(),
        String::from_utf8_lossy(&out.stderr).into_owned(),
        dir,
    )
}

fn refused(case: &str, args: &[&str], expected: &[&str]) {
    let (code, _, stderr, dir) = run(case, args);
    assert_eq!(code, 2, "stderr: {stderr}");
    for e in expected {
        assert!(stderr.contains(e), "expected {e:?} in: {stderr}");
    }
    assert!(!stderr.contains("internal error"), "{stderr}");
    assert!(
        !dir.path().join("out").exists(),
        "an output folder was left"
    );
}

#[test]
fn a_title_with_a_control_character_is_refused() {
    refused(
        &edit(
            "title = \"Invented names-and-bounds base case\"",
            "title = \"bell\\u0007here\"",
        ),
        &["check", "case.toml", "--out", "out"],
        &["title = \"bell\\u{7}here\": must not contain control characters (\\u{7} at character 5)"],
    );
}

#[test]
fn control_characters_in_stage_names_and_labels_are_refused() {
    refused(
        &edit("name = \"shell\"", "name = \"sh\\u001b[2Kell\""),
        &["check", "case.toml", "--out", "out"],
        &["stage[0].name = \"sh\\u{1b}[2Kell\": must not contain control characters"],
    );
    refused(
        &edit("label = \"platform\"", "label = \"plat\\u0085form\""),
        &["check", "case.toml", "--out", "out"],
        &["point_mass[0].label", "\\u{85} at character 5"],
    );
    refused(
        &format!("{BASE}[project]\njob = \"J\\u007f1\"\n"),
        &["check", "case.toml", "--out", "out"],
        &["project.job", "\\u{7f}"],
    );
}

#[test]
fn an_unknown_key_with_a_terminal_escape_does_not_reach_stderr_raw() {
    let case = format!("{BASE}\"bad\\u001b[2Kkey\" = 1\n");
    let (code, stdout, stderr, _dir) = run(&case, &["check", "case.toml", "--out", "out"]);
    assert_eq!(code, 2, "stderr: {stderr}");
    assert!(!stderr.contains('\u{1b}'), "raw ESC on stderr: {stderr:?}");
    assert!(stderr.contains("bad\\u{1b}[2Kkey"), "{stderr}");
    assert!(!stdout.contains("pass"), "{stdout}");
}

#[test]
fn a_right_to_left_override_in_a_stage_name_is_shown_as_its_code() {
    let case = edit("name = \"shell\"", "name = \"rev\\u202Eersed\"");
    let (code, stdout, stderr, dir) = run(&case, &["check", "case.toml", "--out", "out"]);
    assert!(code == 0 || code == 1 || code == 3, "stderr: {stderr}");
    let out = dir.path().join("out");
    let html = std::fs::read_to_string(out.join("report.html")).expect("report.html");
    assert!(!html.contains('\u{202E}'), "raw U+202E in report.html");
    assert!(
        html.contains("rev\\u{202e}ersed"),
        "stage name not in the note"
    );
    let mut svgs = 0;
    for entry in std::fs::read_dir(&out).expect("out") {
        let path = entry.expect("entry").path();
        if path.extension().is_some_and(|e| e == "svg") {
            svgs += 1;
            let svg = std::fs::read_to_string(&path).expect("svg");
            assert!(
                !svg.contains('\u{202E}'),
                "raw U+202E in {}",
                path.display()
            );
        }
    }
    assert!(svgs > 0, "no SVG written");
    assert!(!stderr.contains('\u{202E}') && !stdout.contains('\u{202E}'));
    // A message that echoes the name (a remedy naming an unknown stage) shows the code too.
    let bad = format!("{case}[remedy.tmd]\nmode = 1\nmass_ratio = 0.02\nstage = \"x\\u202Ey\"\n");
    let (code, _, stderr, _dir) = run(&bad, &["check", "case.toml", "--out", "out"]);
    assert_eq!(code, 2, "stderr: {stderr}");
    assert!(
        !stderr.contains('\u{202E}'),
        "raw U+202E on stderr: {stderr:?}"
    );
    assert!(stderr.contains("x\\u{202e}y"), "{stderr}");
}

#[test]
fn an_empty_stations_csv_names_the_key() {
    let start = BASE.find("stations = [").expect("stations");
    let end = BASE[start..].find("]\n").expect("end") + start + 2;
    let case = format!("{}stations_csv = \"\"\n{}", &BASE[..start], &BASE[end..]);
    refused(
        &case,
        &["check", "case.toml", "--out", "out"],
        &["shell.stations_csv = \"\": must name a CSV file"],
    );
    let (_, _, stderr, _dir) = run(&case, &["check", "case.toml", "--out", "out"]);
    assert!(!stderr.contains("directory"), "{stderr}");
}

#[test]
fn a_stage_of_a_nanometre_is_refused_with_the_bound() {
    refused(
        &edit("lining = false", "lining = false\ntop_z_m = 1e-9"),
        &["check", "case.toml", "--out", "out"],
        &["stage[0].top_z_m = 1e-9: must be at least 1 m"],
    );
}

#[test]
fn a_stack_of_a_thousand_kilometres_is_refused_with_the_bound() {
    let case = edit("z_m = 100.0", "z_m = 1000000.0").replace("z_m = 90.0", "z_m = 50.0");
    refused(
        &case,
        &["check", "case.toml", "--out", "out"],
        &["shell.stations[2].z_m = 1e6: the shell's height must be at most 1000 m"],
    );
}

#[test]
fn inputs_that_made_the_solver_give_up_are_refused_by_name() {
    let args = ["check", "case.toml", "--out", "out"];
    refused(
        &edit("wall_m = 0.20", "wall_m = 1e-9"),
        &args,
        &["shell.stations[2].wall_m = 1e-9: the wall must be at least 0.008 m"],
    );
    refused(
        &edit("mass_kg = 10000.0", "mass_kg = 1e20"),
        &args,
        &["point_mass[0].mass_kg = 1e20: must be at most 10 times the shell's own mass"],
    );
    refused(
        &edit("lining = false", "lining = false\nstiffness_factor = 1e-12"),
        &args,
        &["stage[0].stiffness_factor = 1e-12: must be between 0.05 and 2"],
    );
    refused(
        &format!("{BASE}[base]\nrotational_stiffness_gnm_per_rad = 1e-30\n"),
        &args,
        &[
            "base.rotational_stiffness_gnm_per_rad = 1e-30: is",
            "must be between 0.0001 and 1e14 times",
        ],
    );
    refused(
        &format!("{BASE}[base]\nlateral_stiffness_mn_per_m = 1e30\n"),
        &args,
        &["base.lateral_stiffness_mn_per_m = 1e30: is", "a rigid base"],
    );
    for (case, _) in [
        (edit("wall_m = 0.20", "wall_m = 1e-9"), "wall"),
        (edit("mass_kg = 10000.0", "mass_kg = 1e20"), "mass"),
    ] {
        let (_, _, stderr, _dir) = run(&case, &args);
        assert!(!stderr.contains("lost its basis"), "{stderr}");
    }
}

#[test]
fn ordinary_springs_and_factors_still_run() {
    let case = format!(
        "{}[base]\nrotational_stiffness_gnm_per_rad = 1500.0\nlateral_stiffness_mn_per_m = 8000.0\n",
        // The platform at 90 m stands only on the complete shell of a second stage.
        edit("lining = false", "lining = false\nstiffness_factor = 0.7\ntop_z_m = 50.0")
            .replacen(
                "label = \"platform\"",
                "label = \"platform\"\nstages = [\"complete\"]",
                1
            )
            .replacen(
                "[wind]",
                "[[stage]]\nname = \"complete\"\nlining = false\n[wind]",
                1
            )
    );
    let (code, _, stderr, _dir) = run(&case, &["check", "case.toml", "--out", "out"]);
    assert!(code == 0 || code == 1 || code == 3, "stderr: {stderr}");
}

#[test]
fn a_dangling_symlink_as_out_is_named_as_a_link() {
    let dir = tempfile::tempdir().expect("temp dir");
    std::fs::write(dir.path().join("case.toml"), BASE).expect("write case");
    std::os::unix::fs::symlink("/nonexistent/stackwake-target", dir.path().join("out"))
        .expect("symlink");
    let out = Command::cargo_bin("stackwake")
        .expect("binary")
        .current_dir(dir.path())
        .args(["check", "case.toml", "--out", "out"])
        .output()
        .expect("run");
    let stderr = String::from_utf8_lossy(&out.stderr);
    assert_eq!(out.status.code(), Some(2), "{stderr}");
    assert!(
        stderr.contains(
            "out is a symbolic link to /nonexistent/stackwake-target, which does not exist"
        ),
        "{stderr}"
    );
    assert!(!stderr.contains("File exists"), "{stderr}");
    // The link is left as it was.
    assert!(std::fs::symlink_metadata(dir.path().join("out"))
        .expect("link")
        .file_type()
        .is_symlink());
}

#[test]
fn new_on_a_folder_says_it_is_a_folder_with_or_without_force() {
    for force in [false, true] {
        let dir = tempfile::tempdir().expect("temp dir");
        std::fs::create_dir(dir.path().join("job")).expect("mkdir");
        let mut args = vec!["new", "job"];
        if force {
            args.push("--force");
        }
        let out = Command::cargo_bin("stackwake")
            .expect("binary")
            .current_dir(dir.path())
            .args(&args)
            .output()
            .expect("run");
        let stderr = String::from_utf8_lossy(&out.stderr);
        assert_eq!(out.status.code(), Some(2), "{stderr}");
        assert!(
            stderr.contains("FILE = job: is a folder; `new` writes a case file: give a file name, e.g. job/case.toml"),
            "{stderr}"
        );
        assert!(!stderr.contains("not a folder"), "{stderr}");
        assert_eq!(
            std::fs::read_dir(dir.path().join("job"))
                .expect("dir")
                .count(),
            0
        );
    }
}

/// A length scale that makes the generated model's point masses underflow is refused as
/// the option the user set, not as a key of the generated model case.
#[test]
fn scale_blames_the_length_scale_the_user_gave() {
    let case = format!("{BASE}[model]\nelastic_modulus_gpa = 3.0\ndensity_kg_m3 = 1200.0\n");
    let (code, _, stderr, dir) = run(
        &case,
        &[
            "scale",
            "case.toml",
            "--length-scale",
            "1e120",
            "--out",
            "out",
        ],
    );
    assert_eq!(code, 2, "{stderr}");
    assert!(
        stderr.contains("--length-scale = 1e120: must be between 1 and 10000"),
        "{stderr}"
    );
    assert!(!stderr.contains("point_mass[0]"), "{stderr}");
    assert!(!dir.path().join("out").exists());
    let in_file = format!(
        "{BASE}[model]\nelastic_modulus_gpa = 3.0\ndensity_kg_m3 = 1200.0\nlength_scale = 0.5\n"
    );
    refused(
        &in_file,
        &["scale", "case.toml", "--out", "out"],
        &["model.length_scale = 0.5: must be between 1 and 10000"],
    );
}
