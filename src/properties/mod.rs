//! Properties of water: pH scales, activity coefficients, density and
//! conductivity. Pure functions of temperature, salinity, pressure and
//! ionic strength.

pub mod activity;
pub mod atmosphere;
pub mod conductivity;
pub mod density;
pub mod scales;
