//! CLI: the root folder and the home folder themselves are refused as output folders
//! (exit 2, a message naming the folder and what to do), before anything is written: a run
//! into `/` as root would otherwise put its files (and its lock and manifest) among the
//! system's, and a later run would remove the earlier run's files there.

use std::collections::BTreeSet;
use std::path::Path;

use assert_cmd::Command;
use predicates::prelude::*;
use predicates::str::contains;

fn names(dir: &Path) -> BTreeSet<String> {
    std::fs::read_dir(dir)
        .unwrap()
        .map(|e| e.unwrap().file_name().to_string_lossy().into_owned())
        .collect()
}

#[test]
fn out_root_is_refused_before_anything_is_written() {
    let before = names(Path::new("/"));
    for verb in ["check", "modes"] {
        let mut cmd = Command::cargo_bin("stackwake").unwrap();
        cmd.arg(verb);
        if verb == "modes" {
            cmd.arg(concat!(env!("CARGO_MANIFEST_DIR"), "/data/demo.toml"));
        }
        cmd.args(["--out", "/"])
            .assert()
            .code(2)
            .stderr(contains("refusing / as the output folder").and(contains("root folder")));
    }
    let after = names(Path::new("/"));
    let added: Vec<_> = after.difference(&before).collect();
    assert!(
        !added.iter().any(|n| n.ends_with(".csv")
            || n.ends_with(".svg")
            || n.starts_with(".stackwake")
            || n.as_str() == "report.html"
            || n.as_str() == "summary.json"),
        "files appeared in /: {added:?}"
    );
}

#[test]
fn out_home_is_refused_but_a_subfolder_of_it_works() {
    let home = tempfile::tempdir().unwrap();
    Command::cargo_bin("stackwake")
        .unwrap()
        .env("HOME", home.path())
        .args(["check", "--out"])
        .arg(home.path())
        .assert()
        .code(2)
        .stderr(contains("the home folder ($HOME)").and(contains("subfolder")));
    assert!(names(home.path()).is_empty(), "nothing written into HOME");
    // The same folder through `..` is the same folder.
    let spelled = home.path().join("x").join("..");
    std::fs::create_dir(home.path().join("x")).unwrap();
    Command::cargo_bin("stackwake")
        .unwrap()
        .env("HOME", home.path())
        .args(["check", "--out"])
        .arg(&spelled)
        .assert()
        .code(2)
        .stderr(contains("the home folder ($HOME)"));
    assert_eq!(names(home.path()), BTreeSet::from(["x".to_string()]));
    let sub = home.path().join("results");
    let code = Command::cargo_bin("stackwake")
        .unwrap()
        .env("HOME", home.path())
        .args(["check", "--out"])
        .arg(&sub)
        .output()
        .unwrap()
        .status
        .code();
    assert!(matches!(code, Some(0 | 1)), "exit {code:?}");
    assert!(sub.join("modes.csv").is_file() && sub.join("report.html").is_file());
}
