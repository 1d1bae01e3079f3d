//! Output: a state as an aligned table with units, or as JSON, both made
//! from one list of outputs ([`Output`]), which the field sheet's computed
//! columns use too. Each output's precision rule ([`Digits`]) is given in
//! that list; [`Precision`] chooses between it and every digit.

mod digits;
mod dose;
mod fields;
mod json;
mod record;
mod table;

// issue 13: uncertainty
pub mod uncertainty;
pub mod uncertainty_report;

pub use digits::{Digits, Precision};
pub use dose::{dose_changes, dose_json, dose_json_with_uncertainty};
pub use dose::{dose_table, dose_table_with_uncertainty};
pub use fields::{Output, Place, Section, Value};
pub use json::{json, json_with_profile, Judged};
pub use record::{Caution, Item, Record};
pub use table::{key_figures, table, table_on_scale, table_with_profile, table_with_uncertainty};
