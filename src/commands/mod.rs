//! The commands behind the binary's verbs: each loads the case (input), runs the pure
//! analysis, and writes its outputs (report). They return what to print and whether a check
//! failed; the binary maps that to exit codes.

pub mod check;
mod check_tables;
pub mod modes;
pub mod new;
pub mod resistance;
pub mod risk;
pub mod scale;
pub mod sweep;

use std::path::{Path, PathBuf};

use crate::case::Case;
use crate::error::Error;

/// What a command did.
#[derive(Debug, Clone, Default)]
pub struct CommandReport {
    /// Text for standard output.
    pub stdout: String,
    /// Warnings for standard error.
    pub warnings: Vec<String>,
    /// True when the analysis ran and some check failed (exit code 1).
    pub check_failed: bool,
    /// True when the analysis ran but nothing was judged: no criterion given (exit code 3
    /// unless a check failed).
    pub not_judged: bool,
    /// Files written.
    pub files: Vec<PathBuf>,
}

/// Loads the case file, or the built-in demo when `path` is `None`.
pub fn load(path: Option<&Path>) -> Result<Case, Error> {
    match path {
        Some(p) => Ok(crate::input::load_case(p)?),
        None => Ok(crate::input::demo_case()),
    }
}
