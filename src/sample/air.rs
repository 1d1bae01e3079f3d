//! The air over a water, as the exchange of CO2 with it needs it: the wind,
//! the CO2 of the air, the lake's area, a transfer velocity given directly
//! and the model of the transfer velocity. The barometric pressure is part
//! of the water's [`Conditions`](crate::sample::Conditions) (it also turns
//! xCO2 into pCO2).
//!
//! The exchange itself is computed from a solved state
//! ([`State::with_exchange`](crate::state::State::with_exchange)).

use crate::base::error::{check_range, Error, Result};
use crate::base::field::Field;
use crate::fits::transfer::GasTransfer;
use crate::sample::water::Medium;

/// CO2 in the air when none is given, ppm (dry mole fraction): the global
/// mean at the Earth's surface for 2023, 419.3 ppm (NOAA Global Monitoring
/// Laboratory, global marine surface sites, annual mean; from memory,
/// unverified). It rises by about 2.5 ppm a year, and the air over land
/// varies by tens of ppm between day and night, so a local value is better;
/// a note says whenever this one is used.
pub const DEFAULT_AIR_CO2_PPM: f64 = 419.3;
/// The year of [`DEFAULT_AIR_CO2_PPM`].
pub const DEFAULT_AIR_CO2_YEAR: u16 = 2023;
/// Accepted wind speeds at 10 m, m/s (calm to a hurricane's).
pub const WIND_RANGE_M_S: (f64, f64) = (0.0, 60.0);
/// Accepted CO2 in air, ppm: the glacial atmosphere (about 180 ppm) and
/// the air of greenhouses and fish houses (a few thousand ppm) are inside.
pub const AIR_CO2_RANGE_PPM: (f64, f64) = (100.0, 10_000.0);
/// Accepted lake areas, km²: a pond of one square metre to the Caspian Sea
/// (about 371 000 km²).
pub const LAKE_AREA_RANGE_KM2: (f64, f64) = (1e-6, 400_000.0);
/// Accepted transfer velocities k600, cm/h (0 to 1200 m/d; steep mountain
/// streams reach hundreds of m/d).
pub const K600_RANGE_CM_H: (f64, f64) = (0.0, 5000.0);

/// The air side of a water's exchange of CO2, validated value by value;
/// [`Air::check`] validates the combination.
///
/// # Example
/// ```
/// use travertine::sample::air::Air;
/// use travertine::fits::GasTransfer;
/// use travertine::Medium;
/// let air = Air::new().with_wind_m_s(4.2)?.with_co2_ppm(425.0)?;
/// assert_eq!(air.model_in(Medium::Fresh), GasTransfer::ColeCaraco1998);
/// assert_eq!(air.model_in(Medium::Saline), GasTransfer::Wanninkhof2014);
/// let lake = air.with_lake_area_km2(3.1)?;
/// assert_eq!(lake.model_in(Medium::Fresh), GasTransfer::VachonPrairie2013);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Default)]
#[non_exhaustive]
pub struct Air {
    wind_m_s: Option<f64>,
    co2_ppm: Option<f64>,
    lake_area_km2: Option<f64>,
    k600_cm_h: Option<f64>,
    model: Option<GasTransfer>,
}

impl Air {
    /// Nothing known of the air: no wind, the default CO2
    /// ([`DEFAULT_AIR_CO2_PPM`]), the model by the medium.
    ///
    /// ```
    /// # use travertine::sample::air::{Air, DEFAULT_AIR_CO2_PPM};
    /// assert_eq!(Air::new().co2_ppm(), DEFAULT_AIR_CO2_PPM);
    /// assert!(!Air::new().co2_stated());
    /// ```
    pub fn new() -> Self {
        Self::default()
    }

    /// With a wind speed at 10 m, m/s.
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside [`WIND_RANGE_M_S`].
    ///
    /// ```
    /// # use travertine::sample::air::Air;
    /// assert!(Air::new().with_wind_m_s(-1.0).is_err());
    /// ```
    pub fn with_wind_m_s(mut self, wind_m_s: f64) -> Result<Self> {
        let (lo, hi) = WIND_RANGE_M_S;
        self.wind_m_s = Some(check_range(Field::Wind, wind_m_s, lo, hi, " m/s")?);
        Ok(self)
    }

    /// With the CO2 of the air, ppm (dry mole fraction).
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside [`AIR_CO2_RANGE_PPM`].
    ///
    /// ```
    /// # use travertine::sample::air::Air;
    /// assert_eq!(Air::new().with_co2_ppm(431.0)?.co2_ppm(), 431.0);
    /// assert!(Air::new().with_co2_ppm(42.0).is_err());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_co2_ppm(mut self, ppm: f64) -> Result<Self> {
        let (lo, hi) = AIR_CO2_RANGE_PPM;
        self.co2_ppm = Some(check_range(Field::AirCo2, ppm, lo, hi, " ppm")?);
        Ok(self)
    }

    /// With the area of the lake, km².
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside [`LAKE_AREA_RANGE_KM2`].
    ///
    /// ```
    /// # use travertine::sample::air::Air;
    /// assert!(Air::new().with_lake_area_km2(0.0).is_err());
    /// ```
    pub fn with_lake_area_km2(mut self, km2: f64) -> Result<Self> {
        let (lo, hi) = LAKE_AREA_RANGE_KM2;
        self.lake_area_km2 = Some(check_range(Field::LakeArea, km2, lo, hi, " km2")?);
        Ok(self)
    }

    /// With a transfer velocity k600 given directly, cm/h.
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside [`K600_RANGE_CM_H`].
    ///
    /// ```
    /// # use travertine::sample::air::Air;
    /// assert_eq!(Air::new().with_k600_cm_h(12.0)?.k600_cm_h(), Some(12.0));
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_k600_cm_h(mut self, cm_h: f64) -> Result<Self> {
        let (lo, hi) = K600_RANGE_CM_H;
        self.k600_cm_h = Some(check_range(Field::K600, cm_h, lo, hi, " cm/h")?);
        Ok(self)
    }

    /// With the model of the transfer velocity chosen.
    ///
    /// ```
    /// # use travertine::{sample::air::Air, fits::GasTransfer, Medium};
    /// let air = Air::new().with_model(GasTransfer::Wanninkhof2014);
    /// assert_eq!(air.model_in(Medium::Fresh), GasTransfer::Wanninkhof2014);
    /// ```
    #[must_use]
    pub fn with_model(mut self, model: GasTransfer) -> Self {
        self.model = Some(model);
        self
    }

    /// Wind speed at 10 m, m/s, if given.
    pub fn wind_m_s(&self) -> Option<f64> {
        self.wind_m_s
    }

    /// CO2 of the air, ppm: as given, else [`DEFAULT_AIR_CO2_PPM`].
    pub fn co2_ppm(&self) -> f64 {
        self.co2_ppm.unwrap_or(DEFAULT_AIR_CO2_PPM)
    }

    /// Whether the CO2 of the air was given.
    pub fn co2_stated(&self) -> bool {
        self.co2_ppm.is_some()
    }

    /// Area of the lake, km², if given.
    pub fn lake_area_km2(&self) -> Option<f64> {
        self.lake_area_km2
    }

    /// k600 given directly, cm/h.
    pub fn k600_cm_h(&self) -> Option<f64> {
        self.k600_cm_h
    }

    /// The model chosen, if one was.
    pub fn model(&self) -> Option<GasTransfer> {
        self.model
    }

    /// The model used for a water of `medium`: the one chosen; else
    /// `given` where a k600 is given; else, in fresh water,
    /// `vachon-prairie2013` where a lake area is given and
    /// `cole-caraco1998` otherwise; in saline water `wanninkhof2014`.
    ///
    /// ```
    /// # use travertine::{sample::air::Air, fits::GasTransfer, Medium};
    /// let river = Air::new().with_k600_cm_h(20.0)?;
    /// assert_eq!(river.model_in(Medium::Fresh), GasTransfer::Given);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn model_in(&self, medium: Medium) -> GasTransfer {
        match (self.model, self.k600_cm_h, self.lake_area_km2, medium) {
            (Some(m), ..) => m,
            (None, Some(_), ..) => GasTransfer::Given,
            (None, None, Some(_), Medium::Fresh) => GasTransfer::VachonPrairie2013,
            (None, None, None, Medium::Fresh) => GasTransfer::ColeCaraco1998,
            _ => GasTransfer::Wanninkhof2014,
        }
    }

    /// Checks that the inputs go together: the `given` model needs a
    /// k600; a k600 given goes with the `given` model only (any other
    /// would compute its own); `vachon-prairie2013` needs a lake area.
    ///
    /// # Errors
    /// [`Error::Missing`] for the k600 or the lake area a model needs;
    /// [`Error::IncompatiblePair`] for a k600 with a model that computes it.
    ///
    /// ```
    /// # use travertine::{sample::air::Air, fits::GasTransfer};
    /// assert!(Air::new().with_model(GasTransfer::Given).check().is_err());
    /// assert!(Air::new().with_model(GasTransfer::VachonPrairie2013).check().is_err());
    /// let both = Air::new().with_k600_cm_h(8.0)?.with_model(GasTransfer::ColeCaraco1998);
    /// assert!(both.check().is_err());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn check(&self) -> Result<()> {
        match (self.model, self.k600_cm_h, self.lake_area_km2) {
            (Some(GasTransfer::Given), None, _) => Err(Error::Missing {
                field: Field::K600,
                why: "; the gas-transfer model `given` takes the transfer velocity as given: give \
                      k600 (cm/h or m/d), or choose a model that computes it from the wind",
            }),
            (Some(m), Some(_), _) if m != GasTransfer::Given => Err(Error::IncompatiblePair {
                first: Field::K600,
                second: Field::GasTransfer,
                reason: "a k600 given directly and a model that computes k600 from the wind are \
                         two transfer velocities; give one (the model `given` uses the k600)",
            }),
            (Some(GasTransfer::VachonPrairie2013), _, None) => Err(Error::Missing {
                field: Field::LakeArea,
                why: "; the model vachon-prairie2013 uses the lake's area: give it (km2 or ha), \
                      or choose cole-caraco1998",
            }),
            _ => Ok(()),
        }
    }
}
