//! Why the wind checks cannot run on a case: today only a case file without `[wind]`, which
//! the modal commands accept and the wind checks refuse, naming the command.

use thiserror::Error;

use crate::case::{Case, Wind};

/// The wind checks cannot run on this case.
#[derive(Debug, Clone, PartialEq, Eq, Error)]
pub enum WindError {
    /// The case file has no `[wind]` section.
    #[error(
        "missing section [wind]: `{command}` runs the vortex-shedding checks, which need the \
         site wind; give at least [wind] reference_speed_m_s (`stackwake modes` runs without it)"
    )]
    MissingWind {
        /// The command that needs it.
        command: &'static str,
    },
}

/// The case's site wind, or the error naming `command`.
pub fn site_wind<'a>(case: &'a Case, command: &'static str) -> Result<&'a Wind, WindError> {
    case.wind.as_ref().ok_or(WindError::MissingWind { command })
}
