//! The sample: its conditions, its composition, the measured carbonate
//! parameters with the rules for a valid pair, and the [`Water`] they make.
//! [`Sample`] takes the same in trade units.

pub mod air;
pub mod composition;
pub mod conditions;
pub mod inputs;
pub mod measured;
pub mod trade;
pub mod values;
pub mod water;

pub use air::Air;
pub use composition::{Composition, Totals};
pub use conditions::Conditions;
pub use measured::{Measured, Parameter};
pub use trade::{CarbonValue, Sample};
pub use values::{Conductivity, MediumChoice};
pub use water::{Medium, Water};
