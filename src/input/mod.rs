//! Reading a case file: TOML (+ optional stations CSV) -> raw serde structs -> validated
//! [`crate::case::Case`] in SI units. The only module besides `report` that touches files.

use std::path::{Path, PathBuf};

use thiserror::Error;

use crate::case::Case;

/// Why a case file could not be turned into a [`Case`].
#[derive(Debug, Error)]
pub enum InputError {
    /// The file could not be read.
    #[error("cannot read {path}: {source}")]
    Read {
        path: PathBuf,
        #[source]
        source: std::io::Error,
    },
}

/// Loads and validates a case file; a relative `stations_csv` is resolved against the case
/// file's folder.
pub fn load_case(path: &Path) -> Result<Case, InputError> {
    let _text = std::fs::read_to_string(path).map_err(|source| InputError::Read {
        path: path.to_path_buf(),
        source,
    })?;
    unimplemented!("input helper")
}
