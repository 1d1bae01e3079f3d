//! A water sample: its medium, conditions, composition and choice of fits.

use crate::conditions::Conditions;
use crate::constants::{BoronTotalFit, Constants, Fits, Totals};
use crate::error::{check_range, Result};
use crate::units::Amount;
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
        }
    }
}

/// Highest accepted total of a minor acid system (phosphate, silicate,
/// ammonia, sulfide), mol/kg.
pub const MINOR_TOTAL_MAX_MOL_KG: f64 = 0.01;

/// Measured totals of the acid systems and calcium. Anything not given is
/// zero (phosphate, silicate, ammonia, sulfide) or follows from salinity
/// (boron, sulfate, fluoride, calcium).
///
/// # Example
/// ```
/// use travertine::{units::Amount, water::Composition};
/// let c = Composition::default()
///     .with_phosphate(Amount::PerKg(2e-6))?
///     .with_silicate(Amount::PerKg(40e-6))?;
/// assert!(!c.calcium_given());
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize)]
pub struct Composition {
    phosphate: Option<Amount>,
    silicate: Option<Amount>,
    ammonia: Option<Amount>,
    sulfide: Option<Amount>,
    boron: Option<Amount>,
    sulfate: Option<Amount>,
    fluoride: Option<Amount>,
    calcium: Option<Amount>,
}

fn checked(field: &'static str, a: Amount, min: f64, max: f64) -> Result<Option<Amount>> {
    check_range(field, a.raw(), min, max, " mol/kg")?;
    Ok(Some(a))
}

macro_rules! setter {
    ($(#[$doc:meta])* $fn:ident, $field:ident, $name:literal, $min:expr, $max:expr) => {
        $(#[$doc])*
        ///
        /// # Errors
        /// [`crate::Error::OutOfRange`] for a negative amount or one above the accepted maximum.
        pub fn $fn(mut self, amount: Amount) -> Result<Self> {
            self.$field = checked($name, amount, $min, $max)?;
            Ok(self)
        }
    };
}

impl Composition {
    setter!(
        /// With total phosphate.
        with_phosphate, phosphate, "phosphate", 0.0, MINOR_TOTAL_MAX_MOL_KG);
    setter!(
        /// With total silicate.
        with_silicate, silicate, "silicate", 0.0, MINOR_TOTAL_MAX_MOL_KG);
    setter!(
        /// With total ammonia (NH3 + NH4+).
        with_ammonia, ammonia, "ammonia", 0.0, MINOR_TOTAL_MAX_MOL_KG);
    setter!(
        /// With total sulfide (H2S + HS-).
        with_sulfide, sulfide, "sulfide", 0.0, MINOR_TOTAL_MAX_MOL_KG);
    setter!(
        /// With measured total boron instead of the salinity ratio.
        with_boron, boron, "boron_total", 0.0, 0.01);
    setter!(
        /// With measured total sulfate instead of the salinity ratio.
        with_sulfate, sulfate, "sulfate", 0.0, 0.1);
    setter!(
        /// With measured total fluoride instead of the salinity ratio.
        with_fluoride, fluoride, "fluoride", 0.0, 0.01);
    setter!(
        /// With measured calcium instead of the salinity ratio.
        with_calcium, calcium, "calcium", 1e-9, 0.1);

    /// Whether calcium was measured.
    ///
    /// ```
    /// # use travertine::{units::Amount, water::Composition};
    /// assert!(Composition::default().with_calcium(Amount::PerKg(0.01))?.calcium_given());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn calcium_given(&self) -> bool {
        self.calcium.is_some()
    }

    /// Whether total boron was measured.
    ///
    /// ```
    /// # use travertine::water::Composition;
    /// assert!(!Composition::default().boron_given());
    /// ```
    pub fn boron_given(&self) -> bool {
        self.boron.is_some()
    }

    /// Whether total sulfate was measured.
    ///
    /// ```
    /// # use travertine::water::Composition;
    /// assert!(!Composition::default().sulfate_given());
    /// ```
    pub fn sulfate_given(&self) -> bool {
        self.sulfate.is_some()
    }

    /// Whether total fluoride was measured.
    ///
    /// ```
    /// # use travertine::water::Composition;
    /// assert!(!Composition::default().fluoride_given());
    /// ```
    pub fn fluoride_given(&self) -> bool {
        self.fluoride.is_some()
    }

    /// The totals for saline water of practical salinity `salinity`, with
    /// the density used for per-litre amounts.
    ///
    /// ```
    /// # use travertine::{constants::BoronTotalFit, water::Composition};
    /// let t = Composition::default().saline_totals(35.0, 1023.3, BoronTotalFit::Lee2010);
    /// assert!((t.boron_mol_kg * 1e6 - 432.5).abs() < 0.05);
    /// ```
    pub fn saline_totals(&self, salinity: f64, density_kg_m3: f64, boron: BoronTotalFit) -> Totals {
        let get = |a: Option<Amount>, default: f64| a.map_or(default, |a| a.mol_kg(density_kg_m3));
        use crate::constants::{fluoride, minerals, sulfate};
        Totals {
            boron_mol_kg: get(self.boron, boron.total_mol_kg(salinity)),
            sulfate_mol_kg: get(
                self.sulfate,
                sulfate::morris_riley1966_total_mol_kg(salinity),
            ),
            fluoride_mol_kg: get(self.fluoride, fluoride::riley1965_total_mol_kg(salinity)),
            phosphate_mol_kg: get(self.phosphate, 0.0),
            silicate_mol_kg: get(self.silicate, 0.0),
            ammonia_mol_kg: get(self.ammonia, 0.0),
            sulfide_mol_kg: get(self.sulfide, 0.0),
            calcium_mol_kg: get(
                self.calcium,
                minerals::riley_tongudai1967_calcium_mol_kg(salinity),
            ),
        }
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

/// A water sample: medium, conditions, composition and fits, validated once.
///
/// # Example
/// ```
/// use travertine::{Conditions, Measured, PhScale, Water};
/// let water = Water::saline(Conditions::new(25.0, 35.0)?)?;
/// let state = water.solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
/// assert!((state.ph(PhScale::Total) - 8.0402).abs() < 5e-4); // equations.md §13 worked value (computed)
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Water {
    medium: Medium,
    conditions: Conditions,
    composition: Composition,
    fits: Fits,
}

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
        check_range(
            "temperature_c",
            conditions.temperature_c(),
            SALINE_TEMPERATURE_MIN_C,
            SALINE_TEMPERATURE_MAX_C,
            " °C",
        )?;
        check_range(
            "salinity",
            conditions.salinity(),
            SALINE_SALINITY_MIN,
            crate::conditions::SALINITY_MAX,
            "",
        )?;
        Ok(Self {
            medium: Medium::Saline,
            conditions,
            composition: Composition::default(),
            fits: Fits::default(),
        })
    }

    /// With measured totals.
    ///
    /// ```
    /// # use travertine::{Conditions, Water, water::Composition, units::Amount};
    /// let w = Water::saline(Conditions::new(10.0, 33.0)?)?
    ///     .with_composition(Composition::default().with_silicate(Amount::PerKg(50e-6))?);
    /// assert!(w.constants()?.ksi > 0.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_composition(mut self, composition: Composition) -> Self {
        self.composition = composition;
        self
    }

    /// With a choice of fits.
    ///
    /// ```
    /// # use travertine::{Conditions, Water, constants::{Fits, CarbonicFit}};
    /// let w = Water::saline(Conditions::new(10.0, 33.0)?)?
    ///     .with_fits(Fits::default().with_carbonic(CarbonicFit::Roy1993));
    /// assert_eq!(w.constants()?.fits_used.carbonic, "roy1993");
    /// # Ok::<(), travertine::Error>(())
    /// ```
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
        };
        w.composition = self.composition;
        w.fits = self.fits;
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

    /// Every constant evaluated for this water.
    ///
    /// # Errors
    /// [`crate::Error::Computation`] if the density cannot be computed.
    ///
    /// ```
    /// # use travertine::{Conditions, Water};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// assert!((k.kb.ln() - -19.7964).abs() < 5e-5); // Dickson 1990, Guide check value
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn constants(&self) -> Result<Constants> {
        match self.medium {
            Medium::Saline => Constants::saline(&self.conditions, &self.composition, &self.fits),
        }
    }
}
