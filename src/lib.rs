//! # travertine
//!
//! The carbonate system of natural waters. From any two measured carbonate
//! parameters (alkalinity, DIC, pH, pCO2, fCO2, xCO2, CO2*, HCO3-, CO3--) and
//! the conditions of the sample, travertine computes every other one: pH on
//! every scale, each species, the CO2 fugacity and partial pressure, calcite
//! and aragonite saturation, the Revelle factor and each part of the
//! alkalinity, with published temperature-, salinity- and pressure-dependent
//! constants.
//!
//! ```
//! use travertine::{Conditions, Measured, PhScale, Water};
//!
//! // Sea water at 25 °C and salinity 35, alkalinity 2300 and DIC 2000 µmol/kg.
//! let water = Water::saline(Conditions::new(25.0, 35.0)?)?;
//! let state = water.solve(
//!     Measured::parse(travertine::Parameter::Alkalinity, "2300 umol/kg")?,
//!     Measured::dic_umol_kg(2000.0)?,
//! )?;
//! // worked values computed from Lueker et al. (2000), Dickson (1990), Lee et al. (2010), Millero (1995) and Weiss (1974)
//! assert!((state.ph(PhScale::Total) - 8.0402).abs() < 5e-4);
//! assert!((state.omega_aragonite.unwrap() - 3.346).abs() < 5e-3);
//!
//! // The same water in situ at 9 °C and 120 dbar.
//! let in_situ = state.at(Conditions::new(9.0, 35.0)?.with_pressure_dbar(120.0)?)?;
//! assert!(in_situ.pco2_uatm < state.pco2_uatm);
//! # Ok::<(), travertine::Error>(())
//! ```
//!
//! Data flow: [`Conditions`] and a [`water::Composition`] make a [`Water`];
//! [`Water::constants`] evaluates every constant once into a
//! [`constants::Constants`]; [`Water::solve`] finds [H+] from the two
//! [`Measured`] parameters and builds the [`State`].

#![forbid(unsafe_code)]
#![deny(missing_docs)]

pub mod activity;
pub mod alkalinity;
pub mod conditions;
pub mod conductivity;
pub mod constants;
pub mod density;
pub mod error;
pub mod fresh;
pub mod measured;
pub(crate) mod numeric;
pub mod prepared;
pub mod range;
pub mod report;
pub(crate) mod root;
pub mod sample;
pub mod scales;
#[cfg(feature = "sheet")]
pub mod sheet;
pub mod solve;
pub mod state;
pub mod units;
pub mod warning;
pub mod water;

pub use conditions::Conditions;
pub use error::{Error, Result};
pub use measured::{Measured, Parameter};
pub use prepared::PreparedWater;
pub use scales::PhScale;
pub use solve::{RootChoice, SolveOptions};
pub use state::State;
pub use warning::{Warning, Warnings};
pub use water::{Medium, Water};

/// The README's Rust examples, run as doctests so that they keep working.
#[cfg(doctest)]
#[doc = include_str!("../README.md")]
pub struct ReadmeDoctests;
