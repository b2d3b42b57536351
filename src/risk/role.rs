//! How each `[[uncertain]]` key's sampled value reaches the analysis ([`Role`]), given how
//! E and the stiffness factors act on the case's stiffness matrix ([`Scaling`]): exactly
//! by sqrt scaling, through the [`super::stiffness_family`] on base springs, or by
//! re-solving.

use serde::{Deserialize, Serialize};

use super::C_LAT_FACTOR_KEY;

/// How a key's sampled value reaches the analysis.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
pub enum Role {
    /// `shell.elastic_modulus_gpa`: omega^2 of every stage scales with E.
    ElasticModulus,
    /// `stage[i].stiffness_factor`: omega^2 of stage i scales with it.
    StageStiffness(usize),
    /// `shell.elastic_modulus_gpa` on base springs: the shell's stiffness scales with E,
    /// the springs' does not; modes from the [`super::stiffness_family`].
    ShellModulus,
    /// `stage[i].stiffness_factor` on base springs (as [`Role::ShellModulus`], stage i).
    ShellStageStiffness(usize),
    /// `vortex.strouhal`.
    Strouhal,
    /// `vortex.log_decrement`: every stage that does not give its own `log_decrement` (a
    /// stage's own value stays, as in the case file).
    LogDecrement,
    /// `wind.reference_speed_m_s`.
    ReferenceSpeed,
    /// [`C_LAT_FACTOR_KEY`].
    CLatFactor,
    /// Anything else: the case is edited and re-solved.
    Resolve,
}

impl Role {
    /// Whether samples of this key avoid an eigen-solve (the shell roles through the
    /// [`super::stiffness_family`], when it can be built).
    pub fn keeps_modes(self) -> bool {
        self != Role::Resolve
    }

    /// Whether samples of this key take their modes from the [`super::stiffness_family`].
    pub fn uses_family(self) -> bool {
        matches!(self, Role::ShellModulus | Role::ShellStageStiffness(_))
    }
}

/// How E and the stiffness factors act on a case's stiffness matrix.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub enum Scaling {
    /// They multiply the whole matrix (fixed base, one modulus): exact sqrt scaling.
    Whole,
    /// They multiply the shell's part but not the base springs (one modulus): the
    /// [`super::stiffness_family`].
    Shell,
    /// The shell has zones of their own modulus: E reaches only part of it; re-solve.
    Partial,
}

impl Scaling {
    /// The scaling of a case with (`zones`) concrete zones of their own and (`springs`)
    /// base springs.
    pub fn of(zones: bool, springs: bool) -> Scaling {
        match (zones, springs) {
            (true, _) => Scaling::Partial,
            (false, true) => Scaling::Shell,
            (false, false) => Scaling::Whole,
        }
    }
}

/// The role of `key` given how the case's stiffness scales. E and the stiffness factor
/// scale the frequencies exactly (sqrt) only when they multiply the whole stiffness matrix;
/// on base springs, which do not scale with E, their samples take their modes from the
/// [`super::stiffness_family`]; with zones of their own modulus they re-solve.
pub fn role_of(key: &str, scaling: Scaling) -> Role {
    let whole = scaling == Scaling::Whole;
    let shell = scaling == Scaling::Shell;
    if key == "shell.elastic_modulus_gpa" {
        return match scaling {
            Scaling::Whole => Role::ElasticModulus,
            Scaling::Shell => Role::ShellModulus,
            Scaling::Partial => Role::Resolve,
        };
    }
    match key {
        "vortex.strouhal" => return Role::Strouhal,
        "vortex.log_decrement" => return Role::LogDecrement,
        "wind.reference_speed_m_s" => return Role::ReferenceSpeed,
        C_LAT_FACTOR_KEY => return Role::CLatFactor,
        _ => {}
    }
    if let Some(rest) = key.strip_prefix("stage[") {
        if let Some((i, tail)) = rest.split_once(']') {
            if tail == ".stiffness_factor" && (whole || shell) {
                if let Ok(i) = i.parse() {
                    return if whole {
                        Role::StageStiffness(i)
                    } else {
                        Role::ShellStageStiffness(i)
                    };
                }
            }
        }
    }
    Role::Resolve
}
