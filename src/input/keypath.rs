//! Case-file key paths (`shell.stations[2].outer_diameter_m`, `lining[0].mass_per_area_kg_m2`,
//! `vortex.log_decrement`) read and written on a parsed TOML table: the syntax is the case
//! file's own (dotted tables, `[i]` for the i-th entry of an array or array of tables), so a
//! sweep needs nothing new to learn.
//!
//! Units: whatever the key names (the case file's own units).

use thiserror::Error;
use toml::{Table, Value};

/// One step of a key path.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum Step {
    Key(String),
    Index(usize),
}

/// Why a key path cannot be used.
#[derive(Debug, Clone, PartialEq, Eq, Error)]
pub enum KeyPathError {
    /// The path is not of the form `a.b[2].c`.
    #[error("`{path}`: not a case-file key path ({reason}); write e.g. shell.stations[2].wall_m")]
    Syntax { path: String, reason: String },
    /// The path names nothing in the case file.
    #[error("`{path}`: no such key in the case file ({reason})")]
    Missing { path: String, reason: String },
    /// The path names a value that is not a number.
    #[error("`{path}`: the case file's value is {found}, not a number")]
    NotNumber { path: String, found: String },
}

/// Splits `a.b[2].c` into steps.
pub fn parse(path: &str) -> Result<Vec<Step>, KeyPathError> {
    let syntax = |reason: &str| KeyPathError::Syntax {
        path: path.to_string(),
        reason: reason.to_string(),
    };
    let mut steps = Vec::new();
    if path.is_empty() {
        return Err(syntax("empty"));
    }
    for part in path.split('.') {
        let (name, mut rest) = match part.find('[') {
            Some(i) => (&part[..i], &part[i..]),
            None => (part, ""),
        };
        if name.is_empty()
            || !name
                .chars()
                .all(|c| c.is_ascii_alphanumeric() || c == '_' || c == '-')
        {
            return Err(syntax(&format!("bad key name `{name}`")));
        }
        steps.push(Step::Key(name.to_string()));
        while !rest.is_empty() {
            let Some(close) = rest.find(']') else {
                return Err(syntax("missing `]`"));
            };
            if !rest.starts_with('[') {
                return Err(syntax("text after `]`"));
            }
            let index: usize = rest[1..close]
                .parse()
                .map_err(|_| syntax(&format!("bad index `{}`", &rest[1..close])))?;
            steps.push(Step::Index(index));
            rest = &rest[close + 1..];
        }
    }
    Ok(steps)
}

fn describe(v: &Value) -> String {
    match v {
        Value::String(s) => format!("the text {s:?}"),
        Value::Boolean(b) => format!("the boolean {b}"),
        Value::Table(_) => "a table".into(),
        Value::Array(_) => "an array".into(),
        Value::Datetime(_) => "a date".into(),
        Value::Integer(_) | Value::Float(_) => "a number".into(),
    }
}

/// The number at `path` (integers are read as floats).
pub fn get_number(table: &Table, path: &str) -> Result<f64, KeyPathError> {
    let steps = parse(path)?;
    let mut t = table.clone();
    let v = walk(&mut t, path, &steps)?;
    match v {
        Value::Float(f) => Ok(*f),
        Value::Integer(i) => Ok(*i as f64),
        other => Err(KeyPathError::NotNumber {
            path: path.to_string(),
            found: describe(other),
        }),
    }
}

/// Replaces the number at `path` with `value`. An integer in the file stays an integer when
/// `value` is whole (so `vortex.modes` keeps its type); otherwise the value is written as a
/// float and validation judges it.
pub fn set_number(table: &mut Table, path: &str, value: f64) -> Result<(), KeyPathError> {
    let steps = parse(path)?;
    let slot = walk(table, path, &steps)?;
    let new = match &*slot {
        Value::Integer(_) if value.fract() == 0.0 && value.abs() < 9.0e15 => {
            Value::Integer(value as i64)
        }
        Value::Integer(_) | Value::Float(_) => Value::Float(value),
        other => {
            return Err(KeyPathError::NotNumber {
                path: path.to_string(),
                found: describe(other),
            })
        }
    };
    *slot = new;
    Ok(())
}

/// Writes `value` at `path`, creating the key, and any tables on the way to it, when absent
/// (for sweeping an optional key the file leaves to its default, e.g. `vortex.strouhal`).
/// An array entry is never created: `lining[3]` must exist. Whether the created key is one
/// the case file accepts is for the reader to judge.
pub fn insert_number(table: &mut Table, path: &str, value: f64) -> Result<(), KeyPathError> {
    match set_number(table, path, value) {
        Err(KeyPathError::Missing { .. }) => {}
        other => return other,
    }
    let steps = parse(path)?;
    let missing = |reason: String| KeyPathError::Missing {
        path: path.to_string(),
        reason,
    };
    let Some((Step::Key(last), parents)) = steps.split_last() else {
        return Err(missing(
            "an array entry cannot be created by a sweep".into(),
        ));
    };
    // Work on the table as a value (so that array entries and tables walk alike) and put
    // it back whatever happens.
    let mut root = Value::Table(std::mem::take(table));
    let result = (|| {
        let mut here = &mut root;
        let mut name = String::new();
        for step in parents {
            here = match step {
                Step::Key(k) => {
                    let Value::Table(t) = here else {
                        return Err(missing(format!("`{name}` is not a table")));
                    };
                    name = if name.is_empty() {
                        k.clone()
                    } else {
                        format!("{name}.{k}")
                    };
                    t.entry(k.clone())
                        .or_insert_with(|| Value::Table(Table::new()))
                }
                Step::Index(i) => {
                    let Value::Array(a) = here else {
                        return Err(missing(format!("`{name}` is not an array")));
                    };
                    let len = a.len();
                    name = format!("{name}[{i}]");
                    a.get_mut(*i).ok_or_else(|| {
                        missing(format!(
                            "`{}` has {len} entries, 0 to {}; a sweep cannot add one",
                            name.rsplit_once('[').map_or(name.as_str(), |p| p.0),
                            len.saturating_sub(1)
                        ))
                    })?
                }
            };
        }
        let Value::Table(t) = here else {
            return Err(missing(format!("`{name}` is not a table")));
        };
        t.insert(last.clone(), Value::Float(value));
        Ok(())
    })();
    if let Value::Table(t) = root {
        *table = t;
    }
    result
}

fn walk<'a>(
    table: &'a mut Table,
    path: &str,
    steps: &[Step],
) -> Result<&'a mut Value, KeyPathError> {
    let missing = |reason: String| KeyPathError::Missing {
        path: path.to_string(),
        reason,
    };
    let Some((Step::Key(first), rest)) = steps.split_first() else {
        return Err(missing("a path starts with a key".into()));
    };
    let mut here = first.clone();
    let mut value = table
        .get_mut(first)
        .ok_or_else(|| missing(format!("`{first}` is not given")))?;
    for step in rest {
        value = match step {
            Step::Key(k) => {
                let Value::Table(t) = value else {
                    return Err(missing(format!("`{here}` is not a table")));
                };
                let next = t
                    .get_mut(k)
                    .ok_or_else(|| missing(format!("`{here}` has no key `{k}`")))?;
                here = format!("{here}.{k}");
                next
            }
            Step::Index(i) => {
                let Value::Array(a) = value else {
                    return Err(missing(format!("`{here}` is not an array")));
                };
                let len = a.len();
                let next = a.get_mut(*i).ok_or_else(|| {
                    missing(format!(
                        "`{here}` has {len} entries, 0 to {}",
                        len.saturating_sub(1)
                    ))
                })?;
                here = format!("{here}[{i}]");
                next
            }
        };
    }
    Ok(value)
}

#[cfg(test)]
mod tests {
    use super::*;

    const TEXT: &str = r#"
[shell]
elastic_modulus_gpa = 32.0
stations = [ { z_m = 0.0, wall_m = 0.5 }, { z_m = 10, wall_m = 0.3 } ]
[[lining]]
mass_per_area_kg_m2 = 240.0
[vortex]
modes = 3
method = "en1991-e1"
"#;

    #[test]
    fn reads_and_writes_the_case_file_syntax() {
        let mut t: Table = toml::from_str(TEXT).unwrap();
        assert_eq!(get_number(&t, "shell.stations[1].z_m").unwrap(), 10.0);
        set_number(&mut t, "shell.stations[1].wall_m", 0.25).unwrap();
        assert_eq!(get_number(&t, "shell.stations[1].wall_m").unwrap(), 0.25);
        set_number(&mut t, "lining[0].mass_per_area_kg_m2", 300.0).unwrap();
        assert_eq!(
            get_number(&t, "lining[0].mass_per_area_kg_m2").unwrap(),
            300.0
        );
        set_number(&mut t, "vortex.modes", 2.0).unwrap();
        assert_eq!(t["vortex"]["modes"], Value::Integer(2));
    }

    #[test]
    fn absent_keys_and_tables_can_be_inserted_but_not_array_entries() {
        let mut t: Table = toml::from_str(TEXT).unwrap();
        insert_number(&mut t, "vortex.strouhal", 0.2).unwrap();
        assert_eq!(get_number(&t, "vortex.strouhal").unwrap(), 0.2);
        insert_number(&mut t, "criteria.stress_mpa", 3.0).unwrap();
        assert_eq!(get_number(&t, "criteria.stress_mpa").unwrap(), 3.0);
        insert_number(&mut t, "shell.stations[1].extra_m", 1.0).unwrap();
        assert_eq!(get_number(&t, "shell.stations[1].extra_m").unwrap(), 1.0);
        // An existing key is set, keeping its integer type.
        insert_number(&mut t, "vortex.modes", 4.0).unwrap();
        assert_eq!(t["vortex"]["modes"], Value::Integer(4));
        let e = insert_number(&mut t, "shell.stations[7].wall_m", 0.3).unwrap_err();
        assert!(e.to_string().contains("has 2 entries"), "{e}");
        let e = insert_number(&mut t, "vortex.method.x", 1.0).unwrap_err();
        assert!(
            e.to_string().contains("`vortex.method` is not a table"),
            "{e}"
        );
    }

    #[test]
    fn bad_paths_are_named() {
        let t: Table = toml::from_str(TEXT).unwrap();
        let e = get_number(&t, "shell.stations[5].wall_m").unwrap_err();
        assert_eq!(
            e.to_string(),
            "`shell.stations[5].wall_m`: no such key in the case file (`shell.stations` has 2 entries, 0 to 1)"
        );
        let e = get_number(&t, "vortex.method").unwrap_err();
        assert!(matches!(e, KeyPathError::NotNumber { .. }), "{e}");
        assert!(matches!(parse("a..b"), Err(KeyPathError::Syntax { .. })));
        assert!(matches!(parse("a[x]"), Err(KeyPathError::Syntax { .. })));
        let e = get_number(&t, "shell.nope").unwrap_err();
        assert!(e.to_string().contains("`shell` has no key `nope`"), "{e}");
    }
}
