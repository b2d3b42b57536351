//! Parsed TOML table -> [`RawCase`], collecting every unknown key and wrong type with its key
//! path instead of stopping at the first.
//!
//! serde reports one error per call and, for values, names the failing key path without array
//! positions. So each section and each array entry is deserialized on its own (which gives
//! the position), and after each error the offending key is removed and the table tried again,
//! until it deserializes or a required key is missing. The raw structs' serde derives stay
//! the single source of truth for the key names: the list of valid keys in a suggestion is
//! taken from serde's own "expected one of" text.

use serde::de::DeserializeOwned;
use toml::{Table, Value};

use super::issue::{nearest, suggestion, ValidationIssue};
use super::raw::{RawCase, RawShell, RawStation, RawZone, CASE_KEYS};

/// Retries per table; each retry removes one key, so this bounds the work on hostile input.
const MAX_RETRIES: usize = 256;

/// Turns a parsed case file into raw structs, or every structural problem found.
pub fn decode_case(mut table: Table) -> Result<RawCase, Vec<ValidationIssue>> {
    let mut issues = Vec::new();
    let unknown: Vec<String> = table
        .keys()
        .filter(|k| !CASE_KEYS.contains(&k.as_str()))
        .cloned()
        .collect();
    for key in unknown {
        issues.push(ValidationIssue::key(
            key.clone(),
            format!("unknown key; {}", suggestion(&key, CASE_KEYS)),
        ));
        table.remove(&key);
    }

    let title = match table.remove("title") {
        None => None,
        Some(Value::String(s)) => Some(s),
        Some(other) => {
            issues.push(ValidationIssue::new(
                "title",
                render(&other),
                "expected a string in quotes",
            ));
            None
        }
    };
    let shell = match table.remove("shell") {
        Some(v) => decode_shell(v, &mut issues),
        None => {
            issues.push(ValidationIssue::key(
                "shell",
                "missing section [shell]: give elastic_modulus_gpa, density_kg_m3 and the \
                 stations",
            ));
            None
        }
    };
    let lining = decode_optional_array(table.remove("lining"), "lining", &mut issues);
    let point_mass = decode_optional_array(table.remove("point_mass"), "point_mass", &mut issues);
    let opening = decode_optional_array(table.remove("opening"), "opening", &mut issues);
    let base = decode_optional_table(table.remove("base"), "base", &mut issues);
    let stage = table
        .remove("stage")
        .map(|v| decode_array(v, "stage", &mut issues));
    // [wind] is optional here: only the commands that run wind checks need it, and they
    // say so (`modes` and `scale` run without it).
    let wind = decode_optional_table(table.remove("wind"), "wind", &mut issues);
    let along_wind = decode_optional_table(table.remove("along_wind"), "along_wind", &mut issues);
    let vortex = decode_optional_table(table.remove("vortex"), "vortex", &mut issues);
    let criteria = decode_optional_table(table.remove("criteria"), "criteria", &mut issues);
    let model = decode_optional_table(table.remove("model"), "model", &mut issues);
    let remedy = decode_optional_table(table.remove("remedy"), "remedy", &mut issues);
    let project = decode_optional_table(table.remove("project"), "project", &mut issues);
    let reinforcement =
        decode_optional_table(table.remove("reinforcement"), "reinforcement", &mut issues);
    let design = decode_optional_table(table.remove("design"), "design", &mut issues);
    // [[uncertain]] and [[rank_correlation]] belong to `risk` (read by `input::uncertain` and
    // `input::rank_correlation`); other commands ignore them.
    table.remove("uncertain");
    table.remove("rank_correlation");

    if !issues.is_empty() {
        return Err(issues);
    }
    match (
        shell,
        lining,
        point_mass,
        opening,
        base,
        stage,
        wind,
        along_wind,
        vortex,
        criteria,
        model,
        remedy,
        project,
        reinforcement,
        design,
    ) {
        (
            Some(shell),
            Some(lining),
            Some(point_mass),
            Some(opening),
            Some(base),
            stage,
            Some(wind),
            Some(along_wind),
            Some(vortex),
            Some(criteria),
            Some(model),
            Some(remedy),
            Some(project),
            Some(reinforcement),
            Some(design),
        ) => {
            let stage = match stage {
                None => None,
                Some(Some(s)) => Some(s),
                // Every failure above pushed an issue, so this arm is unreachable in practice;
                // it stays an error rather than a panic.
                Some(None) => return Err(vec![ValidationIssue::key("stage", "unreadable")]),
            };
            Ok(RawCase {
                title,
                shell,
                lining: lining.unwrap_or_default(),
                point_mass: point_mass.unwrap_or_default(),
                opening: opening.unwrap_or_default(),
                base,
                stage,
                wind,
                along_wind,
                vortex: vortex.unwrap_or_default(),
                criteria: criteria.unwrap_or_default(),
                model,
                remedy,
                project,
                reinforcement,
                design,
            })
        }
        _ => Err(vec![ValidationIssue::key(
            "case",
            "could not be read (no specific problem was recorded)",
        )]),
    }
}

/// `[shell]`, with each station decoded on its own so a problem names its position.
fn decode_shell(value: Value, issues: &mut Vec<ValidationIssue>) -> Option<RawShell> {
    let Value::Table(mut table) = value else {
        issues.push(ValidationIssue::new(
            "shell",
            render(&value),
            "expected a table ([shell])",
        ));
        return None;
    };
    // Leave a non-array `stations` in place: serde then reports it as a wrong type.
    let stations_array = match table.remove("stations") {
        Some(Value::Array(items)) => Some(items),
        Some(other) => {
            table.insert("stations".into(), other);
            None
        }
        None => None,
    };
    // `[[shell.zone]]` entries likewise, so a problem names the zone's position.
    let zone_value = table.remove("zone");
    let shell: Option<RawShell> = decode_table(table, "shell", issues);
    let stations: Option<Option<Vec<RawStation>>> = match stations_array {
        None => Some(None),
        Some(items) => decode_array(Value::Array(items), "shell.stations", issues).map(Some),
    };
    let zones: Option<Option<Vec<RawZone>>> =
        decode_optional_array(zone_value, "shell.zone", issues);
    let mut shell = shell?;
    if let Some(stations) = stations? {
        shell.stations = Some(stations);
    }
    if let Some(zones) = zones? {
        shell.zone = zones;
    }
    Some(shell)
}

/// An optional section: `Some(None)` when absent, `None` when present but broken.
fn decode_optional_table<T: DeserializeOwned>(
    value: Option<Value>,
    path: &str,
    issues: &mut Vec<ValidationIssue>,
) -> Option<Option<T>> {
    match value {
        None => Some(None),
        Some(v) => decode_value(v, path, issues).map(Some),
    }
}

/// An optional array of tables: `Some(None)` when absent, `None` when present but broken.
fn decode_optional_array<T: DeserializeOwned>(
    value: Option<Value>,
    path: &str,
    issues: &mut Vec<ValidationIssue>,
) -> Option<Option<Vec<T>>> {
    match value {
        None => Some(None),
        Some(v) => decode_array(v, path, issues).map(Some),
    }
}

/// An array of tables (`[[lining]]` or an inline array), each entry decoded on its own.
fn decode_array<T: DeserializeOwned>(
    value: Value,
    path: &str,
    issues: &mut Vec<ValidationIssue>,
) -> Option<Vec<T>> {
    let items = match value {
        Value::Array(items) => items,
        Value::Table(_) => {
            issues.push(ValidationIssue::key(
                path,
                format!(
                    "expected an array of tables; write [[{path}]] with double brackets for \
                     each entry"
                ),
            ));
            return None;
        }
        other => {
            issues.push(ValidationIssue::new(
                path,
                render(&other),
                "expected an array of tables",
            ));
            return None;
        }
    };
    let mut out = Vec::with_capacity(items.len());
    let mut ok = true;
    for (i, item) in items.into_iter().enumerate() {
        match decode_value::<T>(item, &format!("{path}[{i}]"), issues) {
            Some(t) => out.push(t),
            None => ok = false,
        }
    }
    ok.then_some(out)
}

/// A value that must be a table.
fn decode_value<T: DeserializeOwned>(
    value: Value,
    path: &str,
    issues: &mut Vec<ValidationIssue>,
) -> Option<T> {
    match value {
        Value::Table(t) => decode_table(t, path, issues),
        other => {
            issues.push(ValidationIssue::new(
                path,
                render(&other),
                "expected a table with keys",
            ));
            None
        }
    }
}

/// Deserializes one table, recording every unknown key and wrong type (see module doc).
fn decode_table<T: DeserializeOwned>(
    mut table: Table,
    path: &str,
    issues: &mut Vec<ValidationIssue>,
) -> Option<T> {
    let mut failed = false;
    // Keys dropped after a wrong type: their later "missing field" is the same problem.
    let mut dropped: Vec<String> = Vec::new();
    for _ in 0..MAX_RETRIES {
        let err = match Value::Table(table.clone()).try_into::<T>() {
            Ok(v) => return (!failed).then_some(v),
            Err(e) => e,
        };
        failed = true;
        let message = err.message().to_string();
        let inner = inner_path(&err.to_string());
        if let Some(rest) = message.strip_prefix("unknown field ") {
            let names = backticked(rest);
            let Some((key, expected)) = names.split_first() else {
                issues.push(ValidationIssue::key(path, message));
                return None;
            };
            let expected: Vec<&str> = expected.iter().map(String::as_str).collect();
            let rel = join(inner.as_deref().unwrap_or(""), key);
            issues.push(ValidationIssue::key(
                join(path, &rel),
                format!("unknown key; {}", suggestion(key, &expected)),
            ));
            if let Some(near) = nearest(key, &expected) {
                // The misspelt key was meant as this one: its "missing" is the same problem.
                dropped.push(join(inner.as_deref().unwrap_or(""), near));
            }
            if !remove_at(&mut table, &rel) {
                return None;
            }
        } else if let Some(rest) = message.strip_prefix("missing field ") {
            let key = backticked(rest).into_iter().next().unwrap_or_default();
            let rel = join(inner.as_deref().unwrap_or(""), &key);
            if !dropped.contains(&rel) {
                issues.push(ValidationIssue::key(
                    join(path, &rel),
                    "missing; this key is required",
                ));
            }
            return None;
        } else {
            let Some(rel) = inner else {
                issues.push(ValidationIssue::key(path, friendly(&message)));
                return None;
            };
            issues.push(ValidationIssue {
                path: join(path, &rel),
                value: get_at(&table, &rel).map(render),
                rule: friendly(&message),
            });
            if !remove_at(&mut table, &rel) {
                return None;
            }
            dropped.push(rel);
        }
    }
    None
}

/// The key path toml appends to a value error's Display (`...\nin `a.b`\n`).
fn inner_path(display: &str) -> Option<String> {
    let start = display.rfind("\nin `")? + "\nin `".len();
    let rest = &display[start..];
    let end = rest.find('`')?;
    Some(rest[..end].to_string())
}

/// The names between backticks, in order.
fn backticked(text: &str) -> Vec<String> {
    text.split('`')
        .skip(1)
        .step_by(2)
        .map(str::to_string)
        .collect()
}

fn join(a: &str, b: &str) -> String {
    match (a.is_empty(), b.is_empty()) {
        (true, _) => b.to_string(),
        (_, true) => a.to_string(),
        _ => format!("{a}.{b}"),
    }
}

fn get_at<'a>(table: &'a Table, rel: &str) -> Option<&'a Value> {
    let mut parts = rel.split('.');
    let mut value = table.get(parts.next()?)?;
    for part in parts {
        value = value.as_table()?.get(part)?;
    }
    Some(value)
}

/// Removes the key at a dotted path; false when it is not there (stops the retry loop).
fn remove_at(table: &mut Table, rel: &str) -> bool {
    let parts: Vec<&str> = rel.split('.').collect();
    let Some((last, parents)) = parts.split_last() else {
        return false;
    };
    let mut current = table;
    for part in parents {
        match current.get_mut(*part) {
            Some(Value::Table(t)) => current = t,
            _ => return false,
        }
    }
    current.remove(*last).is_some()
}

/// A value as the user wrote it, on one line and cut to a readable length.
pub fn render(value: &Value) -> String {
    let text = match value {
        Value::Table(_) => "{...}".to_string(),
        Value::Array(a) if a.len() > 4 => format!("[... {} entries]", a.len()),
        other => other.to_string(),
    };
    let one_line = text.replace(['\n', '\r'], " ");
    if one_line.chars().count() > 60 {
        let cut: String = one_line.chars().take(57).collect();
        format!("{cut}...")
    } else {
        one_line
    }
}

/// serde's wording, said in terms of the case file.
fn friendly(message: &str) -> String {
    if let Some(rest) = message.strip_prefix("unknown variant ") {
        let names = backticked(rest);
        if let Some((given, choices)) = names.split_first() {
            let choices: Vec<&str> = choices.iter().map(String::as_str).collect();
            let list = choices
                .iter()
                .map(|c| format!("\"{c}\""))
                .collect::<Vec<_>>()
                .join(", ");
            return match nearest(given, &choices) {
                Some(c) => format!("unknown choice; did you mean \"{c}\"? (one of {list})"),
                None => format!("unknown choice; expected one of {list}"),
            };
        }
    }
    for prefix in ["invalid type: ", "invalid value: "] {
        if let Some(rest) = message.strip_prefix(prefix) {
            if let Some((found, expected)) = rest.rsplit_once(", expected ") {
                return format!(
                    "expected {}, found {}",
                    expected_kind(expected),
                    found_kind(found)
                );
            }
        }
    }
    message.to_string()
}

fn expected_kind(expected: &str) -> &str {
    match expected {
        "f64" | "f32" => "a number",
        "i64" | "i32" | "u32" | "u64" | "usize" => "a whole number",
        "a boolean" => "true or false",
        "a string" => "a string in quotes",
        "a sequence" => "an array",
        e if e.starts_with("struct ") || e == "a map" => "a table",
        e => e,
    }
}

fn found_kind(found: &str) -> String {
    let kind = found.split_whitespace().next().unwrap_or("");
    match kind {
        "string" => format!("a string {}", &found["string ".len().min(found.len())..]),
        "integer" | "floating" => match backticked(found).first() {
            Some(v) => format!("the number {v}"),
            None => "a number".to_string(),
        },
        "boolean" => "true/false".to_string(),
        "map" => "a table".to_string(),
        "sequence" => "an array".to_string(),
        _ => found.to_string(),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    fn decode(text: &str) -> Result<RawCase, Vec<String>> {
        let table: Table = toml::from_str(text).expect("test TOML is well formed");
        decode_case(table).map_err(|v| v.iter().map(|i| i.to_string()).collect())
    }

    const MINIMAL: &str = r#"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
stations = [{ z_m = 0, outer_diameter_m = 10.0, wall_m = 0.4 },
            { z_m = 100, outer_diameter_m = 8.0, wall_m = 0.3 }]
[wind]
reference_speed_m_s = 25.0
"#;

    #[test]
    fn minimal_case_decodes_and_integers_are_accepted_as_numbers() {
        let raw = decode(MINIMAL).expect("minimal case decodes");
        let stations = raw.shell.stations.expect("inline stations");
        assert_eq!(stations.len(), 2);
        assert_eq!(stations[1].z_m, 100.0);
        assert!(raw.stage.is_none());
        assert_eq!(raw.vortex, Default::default());
    }

    #[test]
    fn unknown_keys_are_all_reported_with_paths_and_suggestions() {
        let text = MINIMAL
            .replace(
                "density_kg_m3 = 2500.0",
                "density_kg_m3 = 2500.0\ndensty = 1\ncolour = 2",
            )
            .replace("wall_m = 0.3", "wall_m = 0.3, wal_m = 1");
        let errs = decode(&text).unwrap_err();
        assert!(
            errs.contains(&"shell.densty: unknown key; did you mean density_kg_m3?".into()),
            "{errs:?}"
        );
        assert!(
            errs.iter()
                .any(|e| e.starts_with("shell.colour: unknown key; valid keys here:")),
            "{errs:?}"
        );
        assert!(
            errs.contains(&"shell.stations[1].wal_m: unknown key; did you mean wall_m?".into()),
            "{errs:?}"
        );
        assert_eq!(errs.len(), 3, "{errs:?}");
    }

    #[test]
    fn wrong_types_name_field_and_expected_type() {
        let text = MINIMAL.replace("elastic_modulus_gpa = 32.0", "elastic_modulus_gpa = \"32\"");
        let errs = decode(&text).unwrap_err();
        assert_eq!(
            errs,
            vec![
                r#"shell.elastic_modulus_gpa = "32": expected a number, found a string "32""#
                    .to_string()
            ]
        );
    }

    #[test]
    fn unknown_choice_suggests_nearest() {
        let text = format!("{MINIMAL}\n[vortex]\nmethod = \"en1991-e3\"\n");
        let errs = decode(&text).unwrap_err();
        assert_eq!(errs.len(), 1);
        assert!(
            errs[0].starts_with(
                r#"vortex.method = "en1991-e3": unknown choice; did you mean "en1991-e1"?"#
            ),
            "{errs:?}"
        );
    }

    #[test]
    fn missing_sections_and_keys() {
        let errs = decode("title = \"x\"\n").unwrap_err();
        assert_eq!(errs.len(), 1);
        assert!(errs[0].starts_with("shell: missing section [shell]"));
        let text = MINIMAL.replace("reference_speed_m_s = 25.0", "");
        let errs = decode(&text).unwrap_err();
        assert_eq!(
            errs,
            vec!["wind.reference_speed_m_s: missing; this key is required".to_string()]
        );
    }

    #[test]
    fn single_bracket_array_section_gets_a_hint() {
        let text = format!("{MINIMAL}\n[lining]\nfrom_z_m = 0\nto_z_m = 10\n");
        let errs = decode(&text).unwrap_err();
        assert_eq!(errs.len(), 1);
        assert!(
            errs[0].contains("write [[lining]] with double brackets"),
            "{errs:?}"
        );
    }

    #[test]
    fn nested_group_path() {
        let text = format!("{MINIMAL}\n[vortex.group]\ncount = 3\nspacing = 40.0\n");
        let errs = decode(&text).unwrap_err();
        assert!(
            errs.contains(&"vortex.group.spacing: unknown key; did you mean spacing_m?".into()),
            "{errs:?}"
        );
    }

    #[test]
    fn render_is_one_short_line() {
        let long = Value::String("x".repeat(200));
        assert!(render(&long).chars().count() <= 60);
        assert_eq!(render(&Value::Float(f64::NAN)), "nan");
    }

    /// The case-file example of the design contract, key for key.
    const CONTRACT_EXAMPLE: &str = r#"
title = "Invented example: 180 m flue stack, coastal plant"
[shell]
elastic_modulus_gpa = 32.0
density_kg_m3 = 2500.0
poisson_ratio = 0.2
beam = "timoshenko"
stations = [
  { z_m = 0.0,   outer_diameter_m = 16.0, wall_m = 0.55 },
  { z_m = 60.0,  outer_diameter_m = 13.0, wall_m = 0.40 },
  { z_m = 180.0, outer_diameter_m = 9.0,  wall_m = 0.22 },
]
[[lining]]
from_z_m = 8.0
to_z_m = 180.0
mass_per_length_kg_m = 5200.0
[[point_mass]]
z_m = 150.0
mass_kg = 30000.0
label = "platform 3"
[base]
rotational_stiffness_gnm_per_rad = 800.0
lateral_stiffness_mn_per_m = 5000.0
[[stage]]
name = "shell only"
lining = false
stiffness_factor = 0.8
top_z_m = 120.0
[wind]
reference_speed_m_s = 38.0
reference_height_m = 10.0
profile = "power"
exponent = 0.16
air_density_kg_m3 = 1.25
kinematic_viscosity_m2_s = 1.5e-5
[vortex]
method = "en1991-e1"
strouhal = 0.18
log_decrement = 0.03
modes = 3
design_life_years = 50
[vortex.group]
count = 3
spacing_m = 40.0
arrangement = "in-line"
"#;

    #[test]
    fn path_aware_decoding_equals_plain_serde_on_valid_files() {
        for text in [CONTRACT_EXAMPLE, crate::input::DEMO_CASE_TOML, MINIMAL] {
            let plain: RawCase = toml::from_str(text).expect("plain serde accepts the file");
            let table: Table = toml::from_str(text).expect("well formed");
            assert_eq!(decode_case(table).expect("decodes"), plain);
        }
    }
}
