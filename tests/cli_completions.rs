//! `stackwake completions SHELL` through the binary: every supported shell gets a non-empty
//! script that names every subcommand; an unknown shell is a usage error (exit 2).

use assert_cmd::Command;
use predicates::prelude::*;

const SUBCOMMANDS: &[&str] = &["check", "modes", "new", "scale", "sweep", "completions"];

#[test]
fn every_shell_gets_a_script_naming_the_subcommands() {
    for shell in ["bash", "zsh", "fish", "powershell"] {
        let out = Command::cargo_bin("stackwake")
            .unwrap()
            .args(["completions", shell])
            .assert()
            .success()
            .get_output()
            .stdout
            .clone();
        let script = String::from_utf8(out).unwrap();
        assert!(script.len() > 200, "{shell}: script too short:\n{script}");
        for sub in SUBCOMMANDS {
            assert!(script.contains(sub), "{shell}: no `{sub}` in\n{script}");
        }
        // Options of the subcommands are completed too (fish writes `-l vary`).
        assert!(script.contains("vary"), "{shell}: no vary option");
    }
}

#[test]
fn unknown_shell_is_a_usage_error() {
    Command::cargo_bin("stackwake")
        .unwrap()
        .args(["completions", "tcsh"])
        .assert()
        .code(2)
        .stderr(predicate::str::contains("tcsh"));
}
