//! Charts: the carbonate species of a sample against pH, a depth profile
//! and the overview of a field sheet, as SVG (drawn by `plotters`) and PNG
//! (the SVG rendered by `resvg`). Feature `chart`.
//!
//! | chart | from | what it shows |
//! |---|---|---|
//! | [`speciation()`] | one solved [`State`](crate::State) | the fraction of CO2*, HCO3⁻ and CO3²⁻ (and, on request, borate, ammonia and phosphate) against pH on the sample's scale at its temperature, salinity and pressure; the sample's pH, with its ±1 standard uncertainty band where one is given; pK1 and pK2 |
//! | [`depth_profile()`] | a sheet with a depth column | pCO2 (log axis), pH and calcite saturation against depth, depth increasing downward, one panel each |
//! | [`overview()`] | a sheet with date (and time) and site columns | pCO2 (log axis), pH, free CO2 and calcite SI (aragonite Ω in saline water) against date and time, one line per site, with the limits of the chosen quality-flag profile drawn as bands |
//!
//! The sheet charts run the sheet itself ([`crate::sheet::process`]): each
//! row is solved as `travertine sheet` solves it, error rows are left out
//! and counted in a note on the chart.
//!
//! # Design
//! Every chart has axis titles with units and a legend. Lines take their
//! colours from the palette of Okabe & Ito (2008, "Color Universal Design",
//! J*FLY), which colour-blind readers can tell apart, in an order that
//! alternates dark and light so that neighbours differ in grayscale too;
//! each line also has its own dash pattern (and, on sheet charts, its own
//! marker shape). See [`design`].
//!
//! # Example
//! ```
//! use travertine::chart::{speciation, SpeciationOptions};
//! use travertine::{Conditions, Measured, Water};
//! let pond = Water::fresh(Conditions::new(24.0, 0.2)?)?;
//! let state = pond.solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::ph(7.6, None)?)?;
//! let chart = speciation(&state, &SpeciationOptions::default())?;
//! assert!(chart.svg().contains("CO2*"));
//! assert!(chart.svg().contains("sample pH 7.60"));
//! # Ok::<(), travertine::chart::ChartError>(())
//! ```

pub mod design;
mod draw;
mod png;
mod rows;
mod sheet_charts;
mod speciation;

pub use png::svg_to_png;
pub use rows::{SheetColumns, SheetRows};
pub use sheet_charts::{depth_profile, overview, SheetChartOptions};
pub use speciation::{speciation, Include, SpeciationData, SpeciationOptions, Species};

use crate::sheet::SheetError;
use thiserror::Error;

/// A chart drawn: its SVG text and what it leaves out.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub struct Chart {
    svg: String,
    width_px: u32,
    height_px: u32,
    notes: Vec<String>,
}

impl Chart {
    /// The SVG document.
    pub fn svg(&self) -> &str {
        &self.svg
    }

    /// Width and height of the drawing, px.
    pub fn size_px(&self) -> (u32, u32) {
        (self.width_px, self.height_px)
    }

    /// The notes written on the chart (rows left out, no date column, ...),
    /// for the command line to repeat.
    pub fn notes(&self) -> &[String] {
        &self.notes
    }

    /// The chart as PNG, `scale` times its SVG size (1 to 4).
    ///
    /// # Errors
    /// [`ChartError::Png`] when the SVG cannot be rendered or encoded, or
    /// [`ChartError::BadOption`] for a scale outside 1 to 4.
    ///
    /// ```
    /// # use travertine::chart::{speciation, SpeciationOptions};
    /// # use travertine::{Conditions, Measured, Water};
    /// # let pond = Water::fresh(Conditions::new(24.0, 0.2)?)?;
    /// # let state = pond.solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::ph(7.6, None)?)?;
    /// let png = speciation(&state, &SpeciationOptions::default())?.png(1.0)?;
    /// assert!(png.starts_with(b"\x89PNG"));
    /// # Ok::<(), travertine::chart::ChartError>(())
    /// ```
    pub fn png(&self, scale: f32) -> Result<Vec<u8>, ChartError> {
        svg_to_png(&self.svg, scale)
    }
}

/// Why a chart could not be drawn.
#[derive(Debug, Error)]
#[non_exhaustive]
pub enum ChartError {
    /// The sample or its constants could not be computed.
    #[error(transparent)]
    Chemistry(#[from] crate::Error),
    /// The sheet could not be read or started.
    #[error(transparent)]
    Sheet(#[from] SheetError),
    /// The sheet has nothing to draw: no data rows, or none computed.
    #[error("{what}: nothing to draw: {why}")]
    NothingToDraw {
        /// The chart.
        what: &'static str,
        /// Why, with what to do about it.
        why: String,
    },
    /// A column the chart needs is not in the sheet.
    #[error("{what}: {why}")]
    MissingColumn {
        /// The chart.
        what: &'static str,
        /// Which column, and how to name one.
        why: String,
    },
    /// A chart option outside its accepted range.
    #[error("{option}: `{value}` {why}")]
    BadOption {
        /// The option.
        option: &'static str,
        /// The value given.
        value: String,
        /// What is accepted.
        why: String,
    },
    /// The drawing library failed.
    #[error("the chart could not be drawn: {0}")]
    Draw(String),
    /// The PNG could not be made.
    #[error("the PNG could not be made: {0}")]
    Png(String),
}

impl ChartError {
    /// A stable snake_case code.
    ///
    /// ```
    /// # use travertine::chart::ChartError;
    /// let e = ChartError::Draw("x".into());
    /// assert_eq!(e.code(), "chart_draw_failed");
    /// ```
    pub fn code(&self) -> &'static str {
        match self {
            ChartError::Chemistry(_) => "chart_sample_error",
            ChartError::Sheet(_) => "chart_sheet_error",
            ChartError::NothingToDraw { .. } => "chart_nothing_to_draw",
            ChartError::MissingColumn { .. } => "chart_missing_column",
            ChartError::BadOption { .. } => "chart_bad_option",
            ChartError::Draw(_) => "chart_draw_failed",
            ChartError::Png(_) => "chart_png_failed",
        }
    }
}

/// Any plotters drawing error, as text.
fn drawing<E: std::fmt::Display>(e: E) -> ChartError {
    ChartError::Draw(e.to_string())
}
