//! The medium: the published fits turned into one [`Constants`] value for
//! one water, saline (stoichiometric constants on the total scale) or fresh
//! (thermodynamic constants with activity coefficients folded in).

pub mod constants;
pub mod fresh;
pub mod perturb;
mod saline;

pub use constants::Constants;
pub use fresh::IonicStrengthRoute;
pub use perturb::ConstantName;
