//! Resistance of the reinforced-concrete shell (EN 1992-1-1): design material laws, the
//! annular section with openings, the moment resistance M_Rd(N) by strain compatibility,
//! stresses on the cracked section and fatigue damage of the vertical bars.
//!
//! Pure numerics: no file access, SI units (N, m, Pa). Compression is positive throughout.

pub mod actions;
pub mod along_height;
pub mod annulus;
pub mod axial;
pub mod cracked;
pub mod fatigue;
pub mod materials;
pub mod ultimate;

pub use annulus::{BarRing, RcAnnulus, Sector};
pub use materials::{Concrete, Steel};
pub use ultimate::{RcSection, StrainPlane, Ultimate};

use thiserror::Error;

/// Failures of the section calculations.
#[derive(Debug, Clone, PartialEq, Error)]
pub enum ResistanceError {
    /// The axial force is outside what the section can carry at all.
    #[error("axial force {axial_n:.6e} N is outside the section's range {min_n:.6e} .. {max_n:.6e} N (compression positive)")]
    AxialOutOfRange {
        axial_n: f64,
        min_n: f64,
        max_n: f64,
    },
    /// No elastic cracked-section state carries the moment (fatigue check).
    #[error("no elastic cracked-section state carries the moment {moment_nm:.6e} N m")]
    NoElasticState { moment_nm: f64 },
}
