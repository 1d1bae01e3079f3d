//! The physical conditions of a sample: temperature, salinity, pressure.

use crate::base::error::{check_range, Result};
use crate::base::field::Field;
use serde::Serialize;

/// Lowest accepted temperature, °C (sea water freezes near −1.9 °C).
pub const TEMPERATURE_MIN_C: f64 = -2.0;
/// Highest accepted temperature, °C.
pub const TEMPERATURE_MAX_C: f64 = 100.0;
/// Highest accepted practical salinity.
pub const SALINITY_MAX: f64 = 50.0;
/// Highest accepted gauge pressure, dbar (a little beyond the deepest ocean).
pub const PRESSURE_MAX_DBAR: f64 = 12_000.0;
/// Accepted barometric pressure, atm: 0.4 atm (about 7000 m in the
/// standard atmosphere, above the highest lakes) to 1.1 atm (above the
/// highest sea-level pressure recorded, about 1.08 atm).
pub const AIR_PRESSURE_RANGE_ATM: (f64, f64) = (0.4, 1.1);

/// Temperature, salinity and pressure of a sample, validated once.
///
/// # Units
/// - `temperature_c`: °C (ITS-90);
/// - `salinity`: practical salinity (PSS-78, dimensionless);
/// - `pressure_dbar`: gauge (sea) pressure in dbar, 0 at the surface;
/// - `air_pressure_atm`: total (barometric) pressure of the air over the
///   water, atm, used to turn a dry-air mole fraction into a partial
///   pressure; 1 atm unless stated.
///
/// # Example
/// ```
/// use travertine::Conditions;
/// let c = Conditions::new(25.0, 35.0)?.with_pressure_dbar(1000.0)?;
/// assert_eq!(c.temperature_c(), 25.0);
/// assert_eq!(c.pressure_dbar(), 1000.0);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[non_exhaustive]
pub struct Conditions {
    temperature_c: f64,
    salinity: f64,
    pressure_dbar: f64,
    /// `None`: not stated, 1 atm.
    air_pressure_atm: Option<f64>,
}

impl Conditions {
    /// Conditions at the surface (0 dbar) under 1 atm of air.
    ///
    /// # Errors
    /// [`crate::Error::OutOfRange`] or [`crate::Error::NotFinite`] when the
    /// temperature is outside −2 to 100 °C or the salinity outside 0 to 50.
    ///
    /// # Example
    /// ```
    /// # use travertine::Conditions;
    /// assert!(Conditions::new(25.0, 35.0).is_ok());
    /// assert!(Conditions::new(25.0, -1.0).is_err());
    /// ```
    pub fn new(temperature_c: f64, salinity: f64) -> Result<Self> {
        check_range(Field::Salinity, salinity, 0.0, SALINITY_MAX, "")?;
        Self {
            temperature_c,
            salinity,
            pressure_dbar: 0.0,
            air_pressure_atm: None,
        }
        .with_temperature_c(temperature_c)
    }

    /// The same conditions at another gauge pressure (dbar).
    ///
    /// # Errors
    /// [`crate::Error::OutOfRange`] outside 0 to 12 000 dbar.
    ///
    /// # Example
    /// ```
    /// # use travertine::Conditions;
    /// let deep = Conditions::new(2.0, 34.7)?.with_pressure_dbar(4000.0)?;
    /// assert_eq!(deep.pressure_bar(), 400.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_pressure_dbar(mut self, pressure_dbar: f64) -> Result<Self> {
        check_range(
            Field::Pressure,
            pressure_dbar,
            0.0,
            PRESSURE_MAX_DBAR,
            " dbar",
        )?;
        self.pressure_dbar = pressure_dbar;
        Ok(self)
    }

    /// The same conditions at another temperature (°C).
    ///
    /// # Errors
    /// As [`Conditions::new`].
    ///
    /// # Example
    /// ```
    /// # use travertine::Conditions;
    /// let cold = Conditions::new(25.0, 35.0)?.with_temperature_c(9.0)?;
    /// assert_eq!(cold.temperature_c(), 9.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_temperature_c(mut self, temperature_c: f64) -> Result<Self> {
        check_range(
            Field::Temperature,
            temperature_c,
            TEMPERATURE_MIN_C,
            TEMPERATURE_MAX_C,
            " °C",
        )?;
        self.temperature_c = temperature_c;
        Ok(self)
    }

    /// The same conditions under another total (barometric) air pressure
    /// (atm), for example at altitude. It converts between xCO2 and pCO2,
    /// and gives the air's pCO2 for the exchange with the air.
    ///
    /// # Errors
    /// [`crate::Error::OutOfRange`] outside 0.4 to 1.1 atm
    /// ([`AIR_PRESSURE_RANGE_ATM`]).
    ///
    /// # Example
    /// ```
    /// # use travertine::Conditions;
    /// let upland = Conditions::new(12.0, 0.1)?.with_air_pressure_atm(0.85)?;
    /// assert_eq!(upland.air_pressure_atm(), 0.85);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_air_pressure_atm(mut self, air_pressure_atm: f64) -> Result<Self> {
        let (min, max) = AIR_PRESSURE_RANGE_ATM;
        check_range(Field::Barometric, air_pressure_atm, min, max, " atm")?;
        self.air_pressure_atm = Some(air_pressure_atm);
        Ok(self)
    }

    /// Temperature, °C.
    ///
    /// ```
    /// # use travertine::Conditions;
    /// assert_eq!(Conditions::new(4.0, 0.2)?.temperature_c(), 4.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn temperature_c(&self) -> f64 {
        self.temperature_c
    }

    /// Temperature, K (T = t + 273.15).
    ///
    /// ```
    /// # use travertine::Conditions;
    /// assert_eq!(Conditions::new(25.0, 35.0)?.temperature_k(), 298.15);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn temperature_k(&self) -> f64 {
        self.temperature_c + 273.15
    }

    /// Practical salinity.
    ///
    /// ```
    /// # use travertine::Conditions;
    /// assert_eq!(Conditions::new(25.0, 35.0)?.salinity(), 35.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn salinity(&self) -> f64 {
        self.salinity
    }

    /// Gauge pressure, dbar.
    ///
    /// ```
    /// # use travertine::Conditions;
    /// assert_eq!(Conditions::new(25.0, 35.0)?.pressure_dbar(), 0.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn pressure_dbar(&self) -> f64 {
        self.pressure_dbar
    }

    /// Gauge pressure, bar (1 bar = 10 dbar).
    ///
    /// ```
    /// # use travertine::Conditions;
    /// assert_eq!(Conditions::new(25.0, 35.0)?.with_pressure_dbar(50.0)?.pressure_bar(), 5.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn pressure_bar(&self) -> f64 {
        self.pressure_dbar / 10.0
    }

    /// Total air pressure over the water, atm (1 unless stated).
    ///
    /// ```
    /// # use travertine::Conditions;
    /// assert_eq!(Conditions::new(25.0, 35.0)?.air_pressure_atm(), 1.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn air_pressure_atm(&self) -> f64 {
        self.air_pressure_atm.unwrap_or(1.0)
    }

    /// Whether the air pressure was stated ([`Conditions::with_air_pressure_atm`])
    /// rather than taken as 1 atm.
    ///
    /// ```
    /// # use travertine::Conditions;
    /// let c = Conditions::new(12.0, 0.1)?;
    /// assert!(!c.air_pressure_stated());
    /// assert!(c.with_air_pressure_atm(1.0)?.air_pressure_stated());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn air_pressure_stated(&self) -> bool {
        self.air_pressure_atm.is_some()
    }
}
