//! Output: CSV tables, plots, the HTML design note and the JSON summary, all written through
//! [`staging::Staging`] so an output folder is written completely or not at all. The only
//! module besides `input` that touches files; it only reads result types.

pub mod csv;
pub mod finite;
pub mod json;
pub mod note;
pub mod risk;
mod risk_note;
pub mod risk_plots;
pub mod scale_html;
pub mod scale_plot;
pub mod staging;
pub mod station_table;
pub mod svg;
pub mod sweep;
pub mod table;

use std::path::PathBuf;

use thiserror::Error;

use crate::case::Case;
use crate::modal::StageModes;
use crate::wind::VortexResults;

/// What the report writers read: the validated case, the modes of every stage, the vortex
/// results and the run's warnings.
#[derive(Debug, Clone, Copy)]
pub struct ReportInput<'a> {
    pub case: &'a Case,
    pub stages: &'a [StageModes],
    pub vortex: &'a VortexResults,
    /// EN along-wind action per stage (same order as `stages`), when the case asks for it.
    pub along: Option<&'a [crate::along::StageAlongWind]>,
    pub warnings: &'a [String],
    /// Remedies re-checked next to the unmitigated results, when any were computed.
    pub remedies: Option<&'a crate::remedy::RemedyResults>,
    /// The aeroelastic model plan (escaped HTML fragment), when the case has `[model]`.
    pub model_plan_html: Option<&'a str>,
    /// RC shell resistance results, when the case has `[reinforcement]`.
    pub resistance: Option<&'a crate::resistance::actions::ResistanceResults>,
}

/// The cautions printed in the design note and carried in summary.json.
pub const CAUTIONS: &[&str] = &[
    "stackwake is a screening tool. Its results must be checked by a licensed engineer against \
     the local code and the governing standard's National Annex before they are used in design.",
    "Several clause numbers and constants of the methods were implemented from memory and are \
     flagged as such in the method section; verify them against the standard in force.",
    "No warranty of any kind is given for the results or their fitness for any purpose.",
];

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
    /// The output folder (or a folder above it) cannot be created.
    #[error("cannot create the output folder {path}: {reason}")]
    CannotCreate { path: PathBuf, reason: String },
    /// The output path exists and is not a folder.
    #[error("output path {path} exists and is not a folder")]
    NotAFolder { path: PathBuf },
    /// The output folder is the root folder or the home folder itself: a run would scatter
    /// its files (and remove an earlier run's) among the system's or the user's own.
    #[error(
        "refusing {path} as the output folder: it is {what} itself; give a subfolder for the \
         outputs instead (for example --out {example})"
    )]
    ProtectedFolder {
        path: PathBuf,
        /// "the root folder" or "the home folder ($HOME)".
        what: &'static str,
        example: PathBuf,
    },
    /// A file in the output folder is read-only; nothing was replaced.
    #[error("cannot replace {path}: the file is read-only (no output file was changed)")]
    ReadOnly { path: PathBuf },
    /// Something other than a plain file (a folder, a link, a device) is where an output
    /// file must go; nothing was replaced.
    #[error("cannot replace {path}: it is not a plain file (no output file was changed)")]
    Blocked { path: PathBuf },
    /// Moving a finished file into the output folder failed; the files already moved were
    /// taken back out and the originals restored.
    #[error("cannot write {path}: {source} (no output file was changed)")]
    Unchanged {
        path: PathBuf,
        #[source]
        source: std::io::Error,
    },
    /// A commit failed and the files already replaced could not all be restored; the
    /// originals not put back are in `backup` (files ending in `.previous`).
    #[error("cannot write {path}: {message}; the original files not restored are in {backup}")]
    RollbackFailed {
        path: PathBuf,
        backup: PathBuf,
        message: String,
    },
    /// CSV serialisation failed.
    #[error("cannot format {file}: {message}")]
    Format { file: String, message: String },
}
