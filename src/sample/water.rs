//! A water sample: its medium, conditions, composition and choice of fits.

use crate::base::error::{check_range, Result};
use crate::base::field::Field;
use crate::base::warning::Warnings;
use crate::fits::Fits;
use crate::properties::activity::ActivityModel;
use crate::sample::composition::Composition;
use crate::sample::conditions::Conditions;
use crate::sample::values::Conductivity;
use serde::Serialize;

/// The ionic medium a set of constants is fitted to.
///
/// ```
/// use travertine::Medium;
/// assert_eq!(Medium::Saline.name(), "saline");
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize)]
#[serde(rename_all = "lowercase")]
#[non_exhaustive]
pub enum Medium {
    /// Brackish to sea water: stoichiometric constants fitted against salinity.
    Saline,
    /// Fresh water: thermodynamic constants with activity coefficients.
    Fresh,
}

impl Medium {
    /// The plain name, as in the JSON key `water`.
    ///
    /// ```
    /// # use travertine::Medium;
    /// assert_eq!(Medium::Saline.name(), "saline");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            Medium::Saline => "saline",
            Medium::Fresh => "fresh",
        }
    }
    /// The temperatures this medium accepts, °C: −2 to 50 in saline water
    /// (the widest saline carbonic fit, Millero et al. 2006), 0 to 100 in
    /// fresh water (Plummer & Busenberg 1982).
    ///
    /// ```
    /// # use travertine::Medium;
    /// assert_eq!(Medium::Saline.temperature_range_c(), (-2.0, 50.0));
    /// assert_eq!(Medium::Fresh.temperature_range_c(), (0.0, 100.0));
    /// ```
    pub fn temperature_range_c(self) -> (f64, f64) {
        match self {
            Medium::Saline => (SALINE_TEMPERATURE_MIN_C, SALINE_TEMPERATURE_MAX_C),
            Medium::Fresh => (FRESH_TEMPERATURE_MIN_C, FRESH_TEMPERATURE_MAX_C),
        }
    }

    /// Checks a temperature against [`Medium::temperature_range_c`].
    ///
    /// # Errors
    /// [`crate::Error::OutOfRange`] naming this medium's range.
    ///
    /// ```
    /// # use travertine::Medium;
    /// let e = Medium::Fresh.check_temperature_c(-1.0).unwrap_err();
    /// assert!(e.to_string().contains("0 to 100 °C"));
    /// ```
    pub fn check_temperature_c(self, temperature_c: f64) -> Result<f64> {
        let (lo, hi) = self.temperature_range_c();
        check_range(Field::Temperature, temperature_c, lo, hi, " °C")
    }
}

/// Lowest temperature accepted for saline water, °C.
pub const SALINE_TEMPERATURE_MIN_C: f64 = -2.0;
/// Lowest practical salinity accepted for saline water: below it nothing
/// of the saline fits is published, and the fresh medium applies.
pub const SALINE_SALINITY_MIN: f64 = 0.1;
/// Highest temperature accepted for saline water, °C: the top of the widest
/// saline carbonic fit (Millero et al. 2006).
pub const SALINE_TEMPERATURE_MAX_C: f64 = 50.0;
/// Lowest temperature accepted for fresh water, °C: the bottom of Plummer
/// & Busenberg (1982).
pub const FRESH_TEMPERATURE_MIN_C: f64 = 0.0;
/// Highest temperature accepted for fresh water, °C: the top of Plummer
/// & Busenberg (1982).
pub const FRESH_TEMPERATURE_MAX_C: f64 = 100.0;

/// A water sample: medium, conditions, composition and fits, validated once.
///
/// # Example
/// ```
/// use travertine::{Conditions, Measured, PhScale, Water};
/// let water = Water::saline(Conditions::new(25.0, 35.0)?)?;
/// let state = water.solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
/// assert!((state.ph(PhScale::Total) - 8.0402).abs() < 5e-4); // worked value computed from Lueker et al. (2000), Dickson (1990), Lee et al. (2010), Millero (1995) and Weiss (1974)
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq, Serialize)]
#[non_exhaustive]
pub struct Water {
    medium: Medium,
    conditions: Conditions,
    composition: Composition,
    fits: Fits,
    fresh: FreshOptions,
    /// Cautions about the inputs the water was made from (a salinity and
    /// a conductivity that disagree), passed on to every state solved.
    #[serde(skip)]
    input_cautions: Warnings,
    /// The conductivity the water was described by, where it was.
    #[serde(skip)]
    conductivity: Option<GivenConductivity>,
}

/// The conductivity reading a water was described by
/// ([`Water::given_conductivity`]): the reading as given, and whether it
/// set the salinity (no salinity was given beside it). In fresh water it
/// also sets the specific conductance of [`FreshOptions`].
///
/// ```
/// use travertine::sample::{inputs::Input, Sample};
/// let mut s = Sample::new(12.0);
/// s.set(Input::Conductivity, "420 uS/cm")?;
/// let given = s.water()?.given_conductivity().unwrap();
/// assert_eq!(given.reading.us_cm(), 420.0);
/// assert!(given.sets_salinity);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub struct GivenConductivity {
    /// The reading, at the sample temperature or at 25 °C.
    pub reading: Conductivity,
    /// Whether the salinity was computed from it.
    pub sets_salinity: bool,
}

/// Settings of the fresh medium: the activity model and the sources of the
/// ionic strength. Set through [`Water`]'s builder methods.
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize)]
#[non_exhaustive]
pub struct FreshOptions {
    /// The activity-coefficient model.
    pub activity: ActivityModel,
    /// Specific conductance at 25 °C, µS/cm.
    pub specific_conductance_us_cm: Option<f64>,
    /// Total dissolved solids, mg/L.
    pub tds_mg_l: Option<f64>,
    /// Ionic strength given directly, mol/kg.
    pub ionic_strength: Option<f64>,
}

/// Highest practical salinity accepted for fresh water.
pub const FRESH_SALINITY_MAX: f64 = 10.0;
/// Salinity below which the automatic choice takes the fresh medium. Below
/// about S 1 (ionic strength about 0.02) the sea-water ratios of boron,
/// sulfate, fluoride and calcium no longer describe inland waters, whose ions
/// are mostly calcium and bicarbonate, and the Davies equation is accurate;
/// above it the saline fits have their data.
pub const AUTO_FRESH_BELOW_SALINITY: f64 = 1.0;

impl Water {
    /// Saline water (practical salinity about 1 to 50) at these conditions,
    /// with no nutrients and the default fits.
    ///
    /// # Errors
    /// [`crate::Error::OutOfRange`] for a temperature outside −2 to 50 °C, or a
    /// salinity below 0.1, where no saline fit is published.
    ///
    /// ```
    /// # use travertine::{Conditions, Water};
    /// assert!(Water::saline(Conditions::new(80.0, 35.0)?).is_err());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn saline(conditions: Conditions) -> Result<Self> {
        Medium::Saline.check_temperature_c(conditions.temperature_c())?;
        check_range(
            Field::Salinity,
            conditions.salinity(),
            SALINE_SALINITY_MIN,
            crate::sample::conditions::SALINITY_MAX,
            "",
        )?;
        Ok(Self {
            medium: Medium::Saline,
            conditions,
            composition: Composition::default(),
            fits: Fits::default(),
            fresh: FreshOptions::default(),
            input_cautions: Warnings::new(),
            conductivity: None,
        })
    }

    /// Fresh water (thermodynamic constants, activity coefficients, pH on the
    /// NBS scale) at these conditions.
    ///
    /// # Errors
    /// [`crate::Error::OutOfRange`] for a temperature outside 0–100 °C (the
    /// range of Plummer & Busenberg 1982) or a salinity above 10.
    ///
    /// ```
    /// # use travertine::{Conditions, Medium, Water};
    /// let w = Water::fresh(Conditions::new(18.0, 0.2)?)?;
    /// assert_eq!(w.medium(), Medium::Fresh);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn fresh(conditions: Conditions) -> Result<Self> {
        Medium::Fresh.check_temperature_c(conditions.temperature_c())?;
        check_range(
            Field::Salinity,
            conditions.salinity(),
            0.0,
            FRESH_SALINITY_MAX,
            "",
        )?;
        Ok(Self {
            medium: Medium::Fresh,
            conditions,
            composition: Composition::default(),
            fits: Fits::default(),
            fresh: FreshOptions::default(),
            input_cautions: Warnings::new(),
            conductivity: None,
        })
    }

    /// Fresh water below salinity 1 ([`AUTO_FRESH_BELOW_SALINITY`]), saline
    /// water at or above it.
    ///
    /// # Errors
    /// As [`Water::fresh`] and [`Water::saline`].
    ///
    /// ```
    /// # use travertine::{Conditions, Medium, Water};
    /// assert_eq!(Water::auto(Conditions::new(18.0, 0.2)?)?.medium(), Medium::Fresh);
    /// assert_eq!(Water::auto(Conditions::new(18.0, 30.0)?)?.medium(), Medium::Saline);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn auto(conditions: Conditions) -> Result<Self> {
        if conditions.salinity() < AUTO_FRESH_BELOW_SALINITY {
            Water::fresh(conditions)
        } else {
            Water::saline(conditions)
        }
    }

    /// With an activity-coefficient model (fresh water).
    ///
    /// ```
    /// # use travertine::{Conditions, Water, properties::activity::ActivityModel};
    /// let w = Water::fresh(Conditions::new(18.0, 0.2)?)?
    ///     .with_activity_model(ActivityModel::ExtendedDebyeHuckel);
    /// assert_eq!(w.fresh_options().activity, ActivityModel::ExtendedDebyeHuckel);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    #[must_use]
    pub fn with_activity_model(mut self, model: ActivityModel) -> Self {
        self.fresh.activity = model;
        self
    }

    /// With specific conductance at 25 °C (µS/cm), for the ionic strength of
    /// fresh water (Russell 1976).
    ///
    /// # Errors
    /// [`crate::Error::OutOfRange`] outside 0–100 000 µS/cm.
    ///
    /// ```
    /// # use travertine::{Conditions, Water};
    /// let w = Water::fresh(Conditions::new(18.0, 0.2)?)?.with_specific_conductance_us_cm(350.0)?;
    /// assert_eq!(w.fresh_options().specific_conductance_us_cm, Some(350.0));
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_specific_conductance_us_cm(mut self, value: f64) -> Result<Self> {
        check_range(Field::SpecificConductance, value, 0.0, 100_000.0, " µS/cm")?;
        self.fresh.specific_conductance_us_cm = Some(value);
        Ok(self)
    }

    /// With total dissolved solids (mg/L), for the ionic strength of fresh
    /// water (Langelier 1936).
    ///
    /// # Errors
    /// [`crate::Error::OutOfRange`] outside 0–50 000 mg/L.
    ///
    /// ```
    /// # use travertine::{Conditions, Water};
    /// let w = Water::fresh(Conditions::new(18.0, 0.2)?)?.with_tds_mg_l(250.0)?;
    /// assert_eq!(w.fresh_options().tds_mg_l, Some(250.0));
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_tds_mg_l(mut self, value: f64) -> Result<Self> {
        check_range(Field::Tds, value, 0.0, 50_000.0, " mg/L")?;
        self.fresh.tds_mg_l = Some(value);
        Ok(self)
    }

    /// With the ionic strength given directly (mol/kg, fresh water).
    ///
    /// # Errors
    /// [`crate::Error::OutOfRange`] outside 0–1 mol/kg.
    ///
    /// ```
    /// # use travertine::{Conditions, Water};
    /// let w = Water::fresh(Conditions::new(18.0, 0.2)?)?.with_ionic_strength(0.005)?;
    /// assert_eq!(w.fresh_options().ionic_strength, Some(0.005));
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_ionic_strength(mut self, value: f64) -> Result<Self> {
        check_range(Field::IonicStrength, value, 0.0, 1.0, " mol/kg")?;
        self.fresh.ionic_strength = Some(value);
        Ok(self)
    }

    /// With the fresh-medium settings of another water.
    pub(crate) fn with_fresh_options(mut self, fresh: FreshOptions) -> Self {
        self.fresh = fresh;
        self
    }

    /// The fresh-medium settings.
    ///
    /// ```
    /// # use travertine::{Conditions, Water};
    /// assert!(Water::fresh(Conditions::new(18.0, 0.2)?)?.fresh_options().tds_mg_l.is_none());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn fresh_options(&self) -> &FreshOptions {
        &self.fresh
    }

    /// With measured totals.
    ///
    /// ```
    /// # use travertine::{Conditions, Water, sample::Composition, units::Amount};
    /// let w = Water::saline(Conditions::new(10.0, 33.0)?)?
    ///     .with_composition(Composition::default().with_silicate(Amount::PerKg(50e-6))?);
    /// assert!(w.constants()?.ksi() > 0.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    #[must_use]
    pub fn with_composition(mut self, composition: Composition) -> Self {
        self.composition = composition;
        self
    }

    /// With a choice of fits.
    ///
    /// ```
    /// # use travertine::{Conditions, Water, fits::{Fits, CarbonicFit}};
    /// let w = Water::saline(Conditions::new(10.0, 33.0)?)?
    ///     .with_fits(Fits::default().with_carbonic(CarbonicFit::Roy1993));
    /// assert_eq!(w.constants()?.fits_used().carbonic, "roy1993");
    /// # Ok::<(), travertine::Error>(())
    /// ```
    #[must_use]
    pub fn with_fits(mut self, fits: Fits) -> Self {
        self.fits = fits;
        self
    }

    /// The same water at other conditions (for example in situ), keeping the
    /// medium, the measured totals and the fits.
    ///
    /// # Errors
    /// As [`Water::saline`].
    ///
    /// ```
    /// # use travertine::{Conditions, Water};
    /// let lab = Water::saline(Conditions::new(25.0, 35.0)?)?;
    /// let field = lab.at(Conditions::new(9.0, 35.0)?)?;
    /// assert_eq!(field.conditions().temperature_c(), 9.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn at(&self, conditions: Conditions) -> Result<Self> {
        let mut w = match self.medium {
            Medium::Saline => Water::saline(conditions)?,
            Medium::Fresh => Water::fresh(conditions)?,
        };
        w.composition = self.composition;
        w.fits = self.fits;
        w.fresh = self.fresh;
        w.conductivity = self.conductivity;
        Ok(w)
    }

    /// The medium.
    ///
    /// ```
    /// # use travertine::{Conditions, Medium, Water};
    /// assert_eq!(Water::saline(Conditions::new(10.0, 33.0)?)?.medium(), Medium::Saline);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn medium(&self) -> Medium {
        self.medium
    }

    /// The conditions.
    ///
    /// ```
    /// # use travertine::{Conditions, Water};
    /// assert_eq!(Water::saline(Conditions::new(10.0, 33.0)?)?.conditions().salinity(), 33.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn conditions(&self) -> &Conditions {
        &self.conditions
    }

    /// The composition.
    ///
    /// ```
    /// # use travertine::{Conditions, Water};
    /// assert!(!Water::saline(Conditions::new(10.0, 33.0)?)?.composition().calcium_given());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn composition(&self) -> &Composition {
        &self.composition
    }

    /// The fits.
    ///
    /// ```
    /// # use travertine::{Conditions, Water};
    /// assert!(Water::saline(Conditions::new(10.0, 33.0)?)?.fits().carbonic.is_none());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn fits(&self) -> &Fits {
        &self.fits
    }

    /// With cautions about the inputs it was made from, passed on to every
    /// state solved from it.
    #[must_use]
    pub(crate) fn with_input_cautions(mut self, cautions: Warnings) -> Self {
        self.input_cautions = cautions;
        self
    }

    /// As described by a conductivity `reading` ([`GivenConductivity`]);
    /// the salinity and specific conductance it gave are set by the caller.
    #[must_use]
    pub(crate) fn with_given_conductivity(
        mut self,
        reading: Conductivity,
        sets_salinity: bool,
    ) -> Self {
        self.conductivity = Some(GivenConductivity {
            reading,
            sets_salinity,
        });
        self
    }

    /// The conductivity this water was described by, where it was (a water
    /// made by [`crate::sample::Sample::water`] from a conductivity reading); the
    /// propagation of uncertainty moves it
    /// ([`crate::decisions::uncertainty`]).
    ///
    /// ```
    /// # use travertine::{Conditions, Water};
    /// assert!(Water::saline(Conditions::new(25.0, 35.0)?)?.given_conductivity().is_none());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn given_conductivity(&self) -> Option<GivenConductivity> {
        self.conductivity
    }

    /// Cautions about the inputs this water was made from, such as a
    /// salinity and a conductivity that disagree; every state solved from
    /// it carries them too.
    ///
    /// ```
    /// # use travertine::{Conditions, Water};
    /// assert!(Water::saline(Conditions::new(25.0, 35.0)?)?.input_cautions().is_empty());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn input_cautions(&self) -> &Warnings {
        &self.input_cautions
    }
}

/// The plain name, as [`Medium::name`] gives it.
///
/// ```
/// assert_eq!(travertine::Medium::Fresh.to_string(), "fresh");
/// ```
impl std::fmt::Display for Medium {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}
