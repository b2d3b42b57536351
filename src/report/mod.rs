//! Output: CSV tables, plots, the HTML design note and the JSON summary, all written through
//! [`staging::Staging`] so an output folder is written completely or not at all. The only
//! module besides `input` that touches files; it only reads result types.

pub mod csv;
pub mod staging;
pub mod sweep;
pub mod table;

use std::path::PathBuf;

use thiserror::Error;

/// Why output could not be written.
#[derive(Debug, Error)]
pub enum ReportError {
    /// A file or folder could not be written.
    #[error("cannot write {path}: {source}")]
    Write {
        path: PathBuf,
        #[source]
        source: std::io::Error,
    },
    /// The output path exists and is not a folder.
    #[error("output path {path} exists and is not a folder")]
    NotAFolder { path: PathBuf },
    /// A file in the output folder is read-only; nothing was replaced.
    #[error("cannot replace {path}: the file is read-only (no output file was changed)")]
    ReadOnly { path: PathBuf },
    /// CSV serialisation failed.
    #[error("cannot format {file}: {message}")]
    Format { file: String, message: String },
}
