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
//! # The layers
//! The crate is layered in the order data flows, and a module imports only
//! from the layers above it (`tests/layers.rs` checks every `crate::` path):
//!
//! ```text
//! base         errors, units, warnings with codes, fit ranges, the root finder
//! properties   pH scales, activity, density, conductivity
//! fits         the published fits, each a named value with its range; the choice of fits
//! sample       conditions, composition, measured parameters and the pair rules, Water
//! medium       fits -> one Constants value (saline; fresh with activities)
//! speciation   species and alkalinity at a given [H+]; the calcium ion pairs
//! solve        the pair algebra, the root policy and the fresh fixed point: one solver
//! state        the complete result, the figures derived from it, the exchange with the air
//! flow         the pipeline on one page: water -> constants -> solve -> state
//! decisions    quality flags and their profiles; exchange, doses, blends (to come)
//! output       the table and the JSON of a state
//! sheet        the CSV batch (feature `sheet`)
//! ```
//! The binary (`src/main.rs`, feature `cli`) parses arguments, calls the
//! library and prints. A [`Conditions`] and a [`Composition`] make a
//! [`Water`]; [`Water::prepare`] evaluates its constants once
//! ([`medium::Constants`]); [`Water::solve`] finds [H+] from the two
//! [`Measured`] parameters and builds the [`State`].

#![forbid(unsafe_code)]
#![deny(missing_docs)]

pub mod base;
#[cfg(feature = "chart")]
pub mod chart;
pub mod decisions;
pub mod fits;
pub mod flow;
pub mod medium;
pub mod output;
pub mod properties;
pub mod sample;
#[cfg(feature = "sheet")]
pub mod sheet;
pub mod solve;
pub mod speciation;
pub mod state;

pub use base::error::{self, Error, Result};
pub use base::units;
pub use base::warning::{Warning, Warnings};
pub use fits::{CarbonicFit, Fits};
pub use flow::PreparedWater;
pub use properties::scales::PhScale;
pub use sample::{Composition, Conditions, Measured, Medium, Parameter, Water};
pub use solve::{RootChoice, SolveOptions};
pub use state::State;

/// The README's Rust examples, run as doctests so that they keep working.
#[cfg(doctest)]
#[doc = include_str!("../README.md")]
pub struct ReadmeDoctests;
