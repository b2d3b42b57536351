//! The library's top-level error: every failure a command can meet, each variant carrying
//! enough context (file, field, stage) for the user to act on it. The binary maps every
//! variant to exit code 2.

use thiserror::Error;

/// Any failure of a stackwake command.
#[derive(Debug, Error)]
pub enum Error {
    /// The case file could not be read, parsed or validated.
    #[error(transparent)]
    Input(#[from] crate::input::InputError),
    /// The modal analysis of a stage failed (non-convergence or failed completeness check).
    #[error(transparent)]
    Modal(#[from] crate::modal::ModalError),
    /// Output could not be written.
    #[error(transparent)]
    Report(#[from] crate::report::ReportError),
    /// A command-line value is outside its valid range.
    #[error("{option} = {value}: {rule}")]
    Usage {
        option: String,
        value: String,
        rule: String,
    },
}
