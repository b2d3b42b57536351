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
#[path = "decode_tests.rs"]
mod tests;
