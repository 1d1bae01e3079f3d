//! Decisions made from a state: the CO2 exchange with the air, the toxic
//! fractions, doses, blends, quality flags and uncertainty. Empty for now;
//! each lands here in its own module, reading [`crate::state::State`] and
//! calling the flow ([`crate::flow`]) for any new solve.

pub mod blend;
pub mod dose;
pub mod volume;
