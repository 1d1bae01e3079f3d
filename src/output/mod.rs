//! Output: a state as an aligned table with units, or as JSON.

mod table;

pub use table::{json, table};
