//! Reading a case file: TOML (+ optional stations CSV) -> raw serde structs -> validated
//! [`crate::case::Case`] in SI units. The only module besides `report` that touches files.
//!
//! Stages: size and emptiness checks before parsing; TOML syntax (line and column from the
//! toml crate); structure (`decode`: unknown keys with a suggestion, wrong types, missing
//! keys); the stations CSV if named; then every engineering rule (`validate`). Each stage
//! reports all of its problems at once. Nothing here panics on any input.

pub mod decode;
pub mod issue;
pub mod keypath;
pub mod limits;
pub mod measured_csv;
pub mod names;
pub mod physical;
pub mod plausibility;
pub mod rank_correlation;
pub mod raw;
mod read;
pub mod risk_partial;
pub mod stations_csv;
pub mod uncertain;
pub mod validate;

use std::fmt;
use std::path::{Path, PathBuf};

use thiserror::Error;

use crate::case::Case;

pub use issue::ValidationIssue;
pub use measured_csv::{load_measured, parse_measured_csv};
use read::{read_limited, ReadFailure};
pub use stations_csv::{parse_stations_csv, CsvStations};

/// Largest case file or stations CSV accepted, bytes (10 MiB; real ones are a few kB).
pub const MAX_INPUT_BYTES: u64 = 10 * 1024 * 1024;

/// The built-in demo case (an invented stack), as shipped in `data/demo.toml`.
pub const DEMO_CASE_TOML: &str = include_str!("../../data/demo.toml");

/// Why a case file could not be turned into a [`Case`].
#[derive(Debug, Error)]
pub enum InputError {
    /// A partial result of `risk --shard` cannot be used (`risk-merge`).
    #[error("{path}: not a usable partial result of `stackwake risk --shard`: {reason}")]
    Partial { path: PathBuf, reason: String },
    /// The file could not be read.
    #[error("cannot read {path}: {source}")]
    Read {
        path: PathBuf,
        #[source]
        source: std::io::Error,
    },
    /// The file is not UTF-8 text.
    #[error("{label} is not UTF-8 text (save it as UTF-8 from your editor or spreadsheet)")]
    NotText { label: String },
    /// The file is over [`MAX_INPUT_BYTES`].
    #[error("{label} is {size}; a {kind} is at most 10 MB")]
    TooLarge {
        label: String,
        /// What the file is for ("case file", "stations CSV").
        kind: &'static str,
        size: MegaBytes,
    },
    /// More than [`MAX_INPUT_BYTES`] could be read (a device such as `/dev/zero`, or a file
    /// that grows while it is read); reading stopped at the limit.
    #[error("{label}: more than 10 MB read; a {kind} is at most 10 MB (reading stopped there)")]
    OverLimit { label: String, kind: &'static str },
    /// The path names something that is not a regular file (a folder, FIFO, device or
    /// socket): reading a FIFO or a device would block or never end, so it is refused.
    #[error(
        "{label} is {what}, not a regular file; a {kind} must be a regular file of at most 10 MB"
    )]
    NotRegularFile {
        label: String,
        kind: &'static str,
        /// "a folder", "a named pipe (FIFO)", "a device", "a socket".
        what: &'static str,
    },
    /// The case file holds no settings at all.
    #[error("{label} is empty: a case file needs at least [shell] ([wind] too for `check` and `sweep`; see the built-in demo case)")]
    Empty { label: String },
    /// Not valid TOML.
    #[error("{label}, line {line}, column {column}: TOML syntax error: {message}")]
    Syntax {
        label: String,
        /// 1-based.
        line: usize,
        /// 1-based, in characters.
        column: usize,
        message: String,
    },
    /// The stations CSV named by `stations_csv` could not be read.
    #[error("{label}: cannot read the stations CSV {path}{how}: {source}")]
    StationsCsv {
        /// The case file naming the CSV.
        label: String,
        /// The file looked for (a relative `stations_csv` resolved against the case file's
        /// folder).
        path: PathBuf,
        /// How `path` was found from `stations_csv`, e.g. ` (stations_csv = "s.csv",
        /// relative to the case file's folder)`; empty for an absolute name.
        how: String,
        #[source]
        source: std::io::Error,
    },
    /// Readable, but some values break the rules; every problem is listed.
    #[error("{label}: {} problem{}:\n{}", issues.len(), if issues.len() == 1 { "" } else { "s" }, IssueList(issues))]
    Invalid {
        label: String,
        issues: Vec<ValidationIssue>,
    },
}

/// A file size, shown in MB (MiB) the way a file manager shows it.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub struct MegaBytes(pub u64);

impl fmt::Display for MegaBytes {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        let mb = self.0 as f64 / (1024.0 * 1024.0);
        if mb >= 20.0 {
            write!(f, "{mb:.0} MB")
        } else {
            write!(f, "{mb:.1} MB")
        }
    }
}

/// Issues one per line, indented.
struct IssueList<'a>(&'a [ValidationIssue]);

impl fmt::Display for IssueList<'_> {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        for (i, issue) in self.0.iter().enumerate() {
            if i > 0 {
                writeln!(f)?;
            }
            write!(f, "  {issue}")?;
        }
        Ok(())
    }
}

impl InputError {
    /// The individual problems, when the error is a list of them.
    pub fn issues(&self) -> &[ValidationIssue] {
        match self {
            InputError::Invalid { issues, .. } => issues,
            _ => &[],
        }
    }
}

/// Loads and validates a case file; a relative `stations_csv` is resolved against the case
/// file's folder.
pub fn load_case(path: &Path) -> Result<Case, InputError> {
    let label = path.display().to_string();
    let text = read_case_file(path, &label)?;
    let base_dir = path.parent().unwrap_or_else(|| Path::new(""));
    let mut case = parse_case(&text, base_dir, &label)?;
    // `text` holds exactly the bytes read (UTF-8 is checked, nothing converted), so this is
    // the file's own SHA-256.
    let name = path
        .file_name()
        .map_or_else(|| label.clone(), |n| n.to_string_lossy().into_owned());
    case.source = Some(crate::case::CaseSource::of_bytes(
        &name,
        text.as_bytes(),
        false,
    ));
    Ok(case)
}

/// Reads a case file into its TOML table without validating it (sweeps edit the table
/// per variant, then validate with [`parse_case_table`]).
pub fn read_case_table(path: &Path) -> Result<toml::Table, InputError> {
    let label = path.display().to_string();
    let text = read_case_file(path, &label)?;
    parse_case_text(&text, &label)
}

fn read_case_file(path: &Path, label: &str) -> Result<String, InputError> {
    read_limited(path, label, "case file").map_err(|e| match e {
        ReadFailure::Io(source) => InputError::Read {
            path: path.to_path_buf(),
            source,
        },
        ReadFailure::Other(e) => e,
    })
}

/// Parses and validates case-file text. `base_dir` is where a relative `stations_csv` is
/// looked for; `file_label` names the file in messages.
pub fn parse_case(text: &str, base_dir: &Path, file_label: &str) -> Result<Case, InputError> {
    parse_case_from(text, file_label, |name| {
        read_stations_file(base_dir, name, file_label)
    })
}

/// Parses and validates case-file text without touching the file system: when the case
/// names a `stations_csv`, `stations_csv_text` is used as that file's text (`None` gives
/// the same error as a missing file). The whole path from text to [`Case`] that
/// [`load_case`] takes, for tests and fuzzing.
pub fn parse_case_with_csv(
    text: &str,
    file_label: &str,
    stations_csv_text: Option<&str>,
) -> Result<Case, InputError> {
    parse_case_from(text, file_label, |name| match stations_csv_text {
        Some(csv) if csv.len() as u64 > MAX_INPUT_BYTES => Err(InputError::TooLarge {
            label: name.to_string(),
            kind: "stations CSV",
            size: MegaBytes(csv.len() as u64),
        }),
        Some(csv) => Ok(csv.to_string()),
        None => Err(InputError::StationsCsv {
            label: file_label.to_string(),
            path: PathBuf::from(name),
            how: String::new(),
            source: std::io::Error::from(std::io::ErrorKind::NotFound),
        }),
    })
}

/// The common path: `read_csv` fetches the text of the stations CSV named in the case.
/// Parses case-file text into a TOML table (size, emptiness and syntax checks only).
pub fn parse_case_text(text: &str, file_label: &str) -> Result<toml::Table, InputError> {
    let label = file_label.to_string();
    if text.len() as u64 > MAX_INPUT_BYTES {
        return Err(InputError::TooLarge {
            label,
            kind: "case file",
            size: MegaBytes(text.len() as u64),
        });
    }
    let text = text.strip_prefix('\u{feff}').unwrap_or(text);
    if text.trim().is_empty() {
        return Err(InputError::Empty { label });
    }
    toml::from_str(text).map_err(|e| {
        let (line, column) = e
            .span()
            .map(|s| line_column(text, s.start))
            .unwrap_or((1, 1));
        InputError::Syntax {
            label: label.clone(),
            line,
            column,
            message: e.message().trim().replace('\n', "; "),
        }
    })
}

/// Validates an already parsed case-file table (used by sweeps, which edit one parsed table
/// per variant instead of re-parsing text). Same rules and messages as [`parse_case`].
pub fn parse_case_table(
    table: toml::Table,
    base_dir: &Path,
    file_label: &str,
) -> Result<Case, InputError> {
    parse_table_with(table, file_label, |name| {
        read_stations_file(base_dir, name, file_label)
    })
}

/// Reads the stations CSV named `name` in a case file in `base_dir`. A relative name is
/// resolved against the case file's folder (not the working folder), and every message
/// shows the resolved path and says so.
fn read_stations_file(base_dir: &Path, name: &str, file_label: &str) -> Result<String, InputError> {
    let csv_path = base_dir.join(name);
    let shown = std::path::absolute(&csv_path).unwrap_or_else(|_| csv_path.clone());
    let how = if Path::new(name).is_absolute() {
        String::new()
    } else {
        format!(" (stations_csv = {name:?}, relative to the case file's folder)")
    };
    let label = format!("{}{how}", shown.display());
    read_limited(&csv_path, &label, "stations CSV").map_err(|e| match e {
        ReadFailure::Io(source) => InputError::StationsCsv {
            label: file_label.to_string(),
            path: shown.clone(),
            how: how.clone(),
            source,
        },
        ReadFailure::Other(e) => e,
    })
}

/// The common path: `read_csv` fetches the text of the stations CSV named in the case.
fn parse_case_from(
    text: &str,
    file_label: &str,
    read_csv: impl FnOnce(&str) -> Result<String, InputError>,
) -> Result<Case, InputError> {
    let table = parse_case_text(text, file_label)?;
    parse_table_with(table, file_label, read_csv)
}

fn parse_table_with(
    table: toml::Table,
    file_label: &str,
    read_csv: impl FnOnce(&str) -> Result<String, InputError>,
) -> Result<Case, InputError> {
    let label = file_label.to_string();
    if table.is_empty() {
        return Err(InputError::Empty { label });
    }
    let raw = decode::decode_case(table).map_err(|issues| InputError::Invalid {
        label: label.clone(),
        issues,
    })?;

    let csv = match &raw.shell.stations_csv {
        Some(name) if raw.shell.stations.is_none() => {
            if let Some(issue) = names::check_stations_csv_name(name) {
                return Err(InputError::Invalid {
                    label,
                    issues: vec![issue],
                });
            }
            let text = read_csv(name)?;
            match parse_stations_csv(&text, name) {
                Ok(csv) => Some(csv),
                Err(csv_issues) => {
                    // Report the CSV's problems together with the rest of the case file's.
                    let mut issues = csv_issues;
                    if let Err(more) = validate::validate(
                        &raw,
                        Some(&CsvStations {
                            label: name.clone(),
                            rows: Vec::new(),
                        }),
                    ) {
                        issues.extend(
                            more.into_iter()
                                .filter(|i| !i.path.starts_with(name.as_str())),
                        );
                    }
                    return Err(InputError::Invalid { label, issues });
                }
            }
        }
        _ => None,
    };
    let mut case = validate::validate(&raw, csv.as_ref())
        .map_err(|issues| InputError::Invalid { label, issues })?;
    names::neutralise(&mut case);
    Ok(case)
}

/// The built-in demo case (an invented 210 m flue stack).
pub fn demo_case() -> Case {
    // The embedded text is fixed at compile time and checked by a unit test below, so a
    // failure here is a build defect, not bad user input.
    let mut case = parse_case(DEMO_CASE_TOML, Path::new("."), "built-in demo case")
        .expect("the embedded demo case is valid (checked by tests)");
    case.source = Some(crate::case::CaseSource::of_bytes(
        "data/demo.toml",
        DEMO_CASE_TOML.as_bytes(),
        true,
    ));
    case
}

/// 1-based line and character column of a byte offset.
fn line_column(text: &str, offset: usize) -> (usize, usize) {
    let mut offset = offset.min(text.len());
    while !text.is_char_boundary(offset) {
        offset -= 1;
    }
    let before = &text[..offset];
    let line = before.matches('\n').count() + 1;
    let line_start = before.rfind('\n').map(|i| i + 1).unwrap_or(0);
    let column = before[line_start..].chars().count() + 1;
    (line, column)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn demo_case_is_valid() {
        let case = demo_case();
        assert!(case.title.to_lowercase().contains("invented"));
        assert!(case.shell.stations.len() >= 5);
        assert_eq!(case.stages.len(), 3);
    }

    #[test]
    fn csv_given_as_text_matches_the_csv_read_from_disk() {
        let dir = Path::new(env!("CARGO_MANIFEST_DIR")).join("examples");
        let from_disk = load_case(&dir.join("csv_stations.toml")).expect("example loads");
        let text = std::fs::read_to_string(dir.join("csv_stations.toml")).expect("read");
        let csv = std::fs::read_to_string(dir.join("stations.csv")).expect("read");
        let from_text =
            parse_case_with_csv(&text, "csv_stations.toml", Some(&csv)).expect("text loads");
        // Same model; only the reader knows which file (and digest) it came from.
        assert!(from_disk.source.is_some() && from_text.source.is_none());
        let from_disk = Case {
            source: None,
            ..from_disk
        };
        assert_eq!(from_disk, from_text);
        let err = parse_case_with_csv(&text, "csv_stations.toml", None).unwrap_err();
        assert!(matches!(err, InputError::StationsCsv { .. }), "{err}");
    }

    #[test]
    fn line_column_counts_from_one() {
        assert_eq!(line_column("ab\ncd", 0), (1, 1));
        assert_eq!(line_column("ab\ncd", 4), (2, 2));
        assert_eq!(line_column("é\nx", 1), (1, 1));
    }

    #[test]
    fn megabytes_display() {
        assert_eq!(MegaBytes(52 * 1024 * 1024).to_string(), "52 MB");
        assert_eq!(MegaBytes(10 * 1024 * 1024 + 200_000).to_string(), "10.2 MB");
    }
}
