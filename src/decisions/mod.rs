//! Decisions made from a state: the CO2 exchange with the air, the toxic
//! fractions, doses, blends, quality flags and uncertainty. Each lands here
//! in its own module, reading [`crate::state::State`] and calling the flow
//! ([`crate::flow`]) for any new solve.
//!
//! - [`flags`](mod@flags): quality flags, a state judged against the limits of a
//!   [`Profile`] ([`profile`]: TOML files and the built-in profiles). The
//!   toxic fractions themselves (un-ionised ammonia, hydrogen sulfide) are
//!   figures of the state ([`crate::state::State::nh3_fraction`]).
//! - [`uncertainty`]: the standard uncertainty of every computed quantity
//!   from those of the inputs and the constants, with its budget and a
//!   Monte Carlo check.

// issue 11: quality flags
pub mod flags;
pub mod profile;

pub use flags::{codes_into, flags, not_judged, Flag};
pub use profile::{Limits, Plausibility, Profile, DEFAULT_PROFILE};

pub mod blend;
pub mod dose;
pub mod volume;
// issue 13: uncertainty
pub mod dose_uncertainty;
pub mod uncertainty;
pub mod uncertainty_settings;
