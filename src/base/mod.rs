//! Base layer: errors, units, warnings with their codes, fit ranges, numeric
//! helpers and the root finder. Imports nothing else from the crate.

pub mod error;
pub mod field;
pub mod numeric;
pub mod range;
pub(crate) mod root;
pub mod units;
pub mod warning;
