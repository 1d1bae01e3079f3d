//! Speciation at a given [H+]: each acid system's species and its part of
//! the alkalinity, with derivatives, and the calcium ion pairs of fresh
//! water.

pub mod alkalinity;
pub(crate) mod calcium;
