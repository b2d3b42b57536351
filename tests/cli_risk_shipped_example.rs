//! The shipped `examples/risk/risk_case.toml` runs, and stays the built-in demo plus
//! `[[uncertain]]` inputs (it once lagged behind the demo and was refused by validation).
//! No outside reference: the checks are of the project's own files and terminal format.

use assert_cmd::Command;

const EXAMPLE: &str = "examples/risk/risk_case.toml";

#[test]
fn example_is_the_demo_plus_uncertain_inputs() {
    let example = std::fs::read_to_string(EXAMPLE).unwrap();
    let demo = stackwake::input::DEMO_CASE_TOML;
    // Everything from [shell] on is the demo's text; the example only adds a title and the
    // [[uncertain]] tables at the end.
    let body = |s: &str| s[s.find("[shell]").unwrap()..].to_string();
    let (example_body, demo_body) = (body(&example), body(demo));
    assert!(
        example_body.starts_with(demo_body.trim_end()),
        "examples/risk/risk_case.toml no longer repeats data/demo.toml from [shell] on"
    );
    let extra = &example_body[demo_body.trim_end().len()..];
    assert!(extra.contains("[[uncertain]]"));
    assert!(!extra.contains("[shell]") && !extra.contains("[[stage]]"));
}

#[test]
fn example_runs_and_prints_rounded_probabilities() {
    let out = tempfile::tempdir().unwrap();
    let assert = Command::cargo_bin("stackwake")
        .unwrap()
        .args(["risk", EXAMPLE, "--samples", "64", "--seed", "7", "--out"])
        .arg(out.path().join("r"))
        .assert()
        .success();
    let stdout = String::from_utf8_lossy(&assert.get_output().stdout).into_owned();
    let line = stdout
        .lines()
        .find(|l| l.contains("P(case exceeds any)"))
        .unwrap_or_else(|| panic!("no case line in:\n{stdout}"));
    // "P(case exceeds any) = 0.8594 +- ..." : four decimals, not the full f64.
    let p = line.split(" = ").nth(1).unwrap().split(' ').next().unwrap();
    assert_eq!(p.split('.').nth(1).map(str::len), Some(4), "{line}");
    assert!(out.path().join("r").join("risk.csv").is_file());
}
