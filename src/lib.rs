//! stackwake: vortex-shedding lock-in screening of tall reinforced-concrete chimneys.
//!
//! Data flow (one direction): `input` (case file -> validated [`case::Case`]) -> [`section`]
//! (annulus properties along the height) -> [`fem`] (Hermite beam elements, exact O(N)
//! eigen-solver) -> [`modal`] (modes per construction stage) -> `wind` (EN 1991-1-4 Annex E,
//! GB 50009 App. H) -> `report` (CSV, SVG, HTML, JSON). Only `input` and `report` touch files.
//!
//! All quantities are SI inside; units are in every field name.
//!
//! This is a screening tool: results must be checked by a licensed engineer against the local
//! code and the governing standard's National Annex. No warranty.

// Numerical kernels index several arrays in lockstep; iterator chains would hide that.
#![allow(clippy::needless_range_loop)]

pub mod along;
pub mod case;
pub mod commands;
pub mod error;
pub mod fem;
pub mod input;
pub mod modal;
pub mod process;
pub mod remedy;
pub mod report;
pub mod resistance;
pub mod risk;
pub mod section;
pub mod similitude;
pub mod sweep;
pub mod wind;
