//! Output safety through the binary: an unwritable output path is named before any analysis
//! is done; an existing output folder is replaced completely or not at all (a run is
//! interrupted by a folder standing where one of its files must go, which stops even root,
//! unlike permission bits); no temporary folders are left behind. Robustness checks of our
//! own contract; no outside reference is involved.

use std::collections::BTreeMap;
use std::path::Path;

use assert_cmd::Command;

fn stackwake() -> Command {
    Command::cargo_bin("stackwake").expect("binary built")
}

/// Every file under `dir` (relative path -> bytes), folders as `None`.
fn snapshot(dir: &Path) -> BTreeMap<String, Option<Vec<u8>>> {
    let mut out = BTreeMap::new();
    let mut stack = vec![dir.to_path_buf()];
    while let Some(d) = stack.pop() {
        for entry in std::fs::read_dir(&d).expect("list") {
            let p = entry.expect("entry").path();
            let rel = p.strip_prefix(dir).expect("prefix").display().to_string();
            if p.is_dir() {
                out.insert(rel, None);
                stack.push(p);
            } else {
                out.insert(rel, Some(std::fs::read(&p).expect("read")));
            }
        }
    }
    out
}

fn run_demo(out: &Path, extra: &[&str]) -> (Option<i32>, String, String) {
    let o = stackwake()
        .arg("modes")
        .arg("--out")
        .arg(out)
        .args(extra)
        .output()
        .expect("run");
    (
        o.status.code(),
        String::from_utf8_lossy(&o.stdout).into_owned(),
        String::from_utf8_lossy(&o.stderr).into_owned(),
    )
}

#[test]
fn output_under_a_regular_file_is_refused_naming_the_path_before_analysis() {
    let dir = tempfile::tempdir().expect("temp dir");
    std::fs::write(dir.path().join("plain"), b"not a folder").expect("write");
    let out = dir.path().join("plain/out");
    let (code, stdout, stderr) = run_demo(&out, &[]);
    assert_eq!(code, Some(2), "{stderr}");
    assert_eq!(
        stderr.trim(),
        format!(
            "error: cannot create the output folder {}: {} is a file, not a folder",
            out.display(),
            dir.path().join("plain").display()
        )
    );
    // Refused before the analysis: nothing about modes was printed.
    assert!(stdout.is_empty(), "{stdout}");
    assert_eq!(snapshot(dir.path()).len(), 1);
}

#[test]
fn output_path_that_is_a_file_is_refused() {
    let dir = tempfile::tempdir().expect("temp dir");
    let out = dir.path().join("report.csv");
    std::fs::write(&out, b"keep me").expect("write");
    let (code, _, stderr) = run_demo(&out, &[]);
    assert_eq!(code, Some(2));
    assert_eq!(
        stderr.trim(),
        format!(
            "error: output path {} exists and is not a folder",
            out.display()
        )
    );
    assert_eq!(std::fs::read(&out).expect("read"), b"keep me");
}

#[test]
fn output_in_an_unwritable_system_folder_is_refused() {
    let out = Path::new("/proc/stackwake-test-out");
    let (code, stdout, stderr) = run_demo(out, &[]);
    assert_eq!(code, Some(2), "{stderr}");
    assert!(stderr.contains("/proc/stackwake-test-out"), "{stderr}");
    assert!(stdout.is_empty());
}

#[test]
fn a_blocked_file_leaves_the_existing_folder_untouched() {
    let dir = tempfile::tempdir().expect("temp dir");
    let out = dir.path().join("out");
    // A first, complete run.
    let (code, _, stderr) = run_demo(&out, &["--modes", "2"]);
    assert_eq!(code, Some(0), "{stderr}");
    // Make the last file of the set unwritable for anyone: a folder in its place.
    std::fs::remove_file(out.join("sections.csv")).expect("remove");
    std::fs::create_dir(out.join("sections.csv")).expect("mkdir");
    std::fs::write(out.join("sections.csv/inside.txt"), b"x").expect("write");
    let before = snapshot(dir.path());

    // A second run with different settings would change modes.csv and mode_shapes.csv.
    let (code, stdout, stderr) = run_demo(&out, &["--modes", "3"]);
    assert_eq!(code, Some(2), "{stderr}");
    assert_eq!(
        stderr.trim(),
        format!(
            "error: cannot replace {}: it is not a plain file (no output file was changed)",
            out.join("sections.csv").display()
        )
    );
    // Refused before the analysis.
    assert!(stdout.is_empty(), "{stdout}");
    assert_eq!(
        snapshot(dir.path()),
        before,
        "output folder changed or temp files left"
    );
}

#[test]
fn a_failed_move_during_commit_is_rolled_back() {
    use stackwake::report::staging::Staging;
    let dir = tempfile::tempdir().expect("temp dir");
    let out = dir.path().join("out");
    std::fs::create_dir(&out).expect("mkdir");
    std::fs::write(out.join("a.csv"), b"old a").expect("write");
    std::fs::write(out.join("b.csv"), b"old b").expect("write");
    let before = snapshot(dir.path());

    let mut staging = Staging::begin(&out).expect("begin");
    staging.write("a.csv", b"new a").expect("stage a");
    staging.write("b.csv", b"new b").expect("stage b");
    staging.write("c.csv", b"new c").expect("stage c");
    staging.write("d.csv", b"new d").expect("stage d");
    staging
        .check_destinations(&["a.csv", "b.csv", "c.csv", "d.csv"])
        .expect("free");
    // Interrupt the commit half-way: the staged d.csv disappears from the temporary folder
    // (as if the disk failed), so a.csv, b.csv and c.csv are moved in before d.csv fails.
    let tmp = out.join(format!(".stackwake-staging-{}", std::process::id()));
    assert!(
        tmp.join("d.csv").is_file(),
        "temporary folder layout changed"
    );
    std::fs::remove_file(tmp.join("d.csv")).expect("remove staged file");
    let err = staging.commit().expect_err("must fail");
    assert_eq!(
        err.to_string(),
        format!(
            "cannot write {}: No such file or directory (os error 2) (no output file was changed)",
            out.join("d.csv").display()
        )
    );
    // a.csv and b.csv are the originals again, c.csv is gone, no temporary folder is left.
    assert_eq!(snapshot(dir.path()), before);
}

#[test]
fn a_successful_run_replaces_every_file_and_leaves_no_temporary_folder() {
    let dir = tempfile::tempdir().expect("temp dir");
    let out = dir.path().join("out");
    assert_eq!(run_demo(&out, &["--modes", "2"]).0, Some(0));
    let first = std::fs::read(out.join("modes.csv")).expect("read");
    std::fs::write(out.join("notes.txt"), b"user's own file").expect("write");
    assert_eq!(run_demo(&out, &["--modes", "3"]).0, Some(0));
    let second = std::fs::read(out.join("modes.csv")).expect("read");
    assert_ne!(first, second);
    assert_eq!(
        std::fs::read(out.join("notes.txt")).expect("read"),
        b"user's own file"
    );
    let names: Vec<String> = std::fs::read_dir(dir.path())
        .expect("list")
        .map(|e| e.expect("entry").file_name().to_string_lossy().into_owned())
        .collect();
    assert_eq!(names, vec!["out".to_string()]);
}

#[test]
fn modes_after_check_leaves_only_its_own_outputs_and_the_users_files() {
    let dir = tempfile::tempdir().expect("temp dir");
    let out = dir.path().join("out");
    let check = stackwake()
        .arg("check")
        .arg("--out")
        .arg(&out)
        .output()
        .expect("run");
    assert!(matches!(check.status.code(), Some(0 | 1 | 3)), "{check:?}");
    assert!(out.join("report.html").is_file());
    std::fs::write(out.join("notes.txt"), b"user's own file").expect("write");
    // A file of the check run that the user edited is theirs from then on.
    std::fs::write(out.join("lock_in.csv"), b"edited by hand").expect("write");
    assert_eq!(run_demo(&out, &["--modes", "5"]).0, Some(0));
    let mut names: Vec<String> = std::fs::read_dir(&out)
        .expect("list")
        .map(|e| e.expect("entry").file_name().to_string_lossy().into_owned())
        .collect();
    names.sort();
    assert_eq!(
        names,
        [
            ".stackwake-manifest",
            "lock_in.csv",
            "mode_shapes.csv",
            "modes.csv",
            "notes.txt",
            "sections.csv"
        ]
    );
    assert_eq!(
        std::fs::read(out.join("notes.txt")).expect("read"),
        b"user's own file"
    );
    let manifest = std::fs::read_to_string(out.join(".stackwake-manifest")).expect("read");
    assert!(manifest.contains(" modes.csv\n") && !manifest.contains("report.html"));
    // No temporary folder left beside the output.
    assert_eq!(std::fs::read_dir(dir.path()).expect("list").count(), 1);
}
