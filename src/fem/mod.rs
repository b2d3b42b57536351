//! Finite-element beam model of a stage (placeholder while being written).
use thiserror::Error;
use crate::case::{Case, Stage};
use crate::modal::StageModes;
#[derive(Debug, Error)]
pub enum SolverError {
    #[error("eigen-solver did not converge")]
    NoConvergence,
}
pub struct BeamModel;
pub struct Solution;
impl BeamModel {
    pub fn build(_case: &Case, _stage: &Stage, _min: Option<usize>, _modes: usize) -> Self { unimplemented!() }
}
pub fn solve_lowest(_b: &BeamModel, _n: usize) -> Result<Solution, SolverError> { unimplemented!() }
pub fn to_stage_modes(_c: &Case, _s: &Stage, _b: &BeamModel, _x: Solution) -> StageModes { unimplemented!() }
