//! A sample as a user describes it: conditions, medium choice, trade-unit
//! totals, conductivity, hardness. [`Sample::water`] turns it into a
//! validated [`Water`]. The command line and the field sheet share it.

use crate::base::error::{check_range, Error, Result};
use crate::base::units::*;
use crate::fits::{BoronTotalFit, CarbonicFit, Fits, FluorideFit};
use crate::properties::activity::ActivityModel;
use crate::properties::conductivity::{salinity_from_conductivity, specific_conductance_us_cm};
use crate::sample::conditions::Conditions;
use crate::sample::{Composition, Medium, Water};

/// Which medium to use.
///
/// ```
/// use travertine::sample::trade::MediumChoice;
/// assert_eq!("auto".parse::<MediumChoice>()?, MediumChoice::Auto);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
#[non_exhaustive]
pub enum MediumChoice {
    /// Fresh below salinity 1, saline at or above it.
    #[default]
    Auto,
    /// Fresh water.
    Fresh,
    /// Saline water.
    Saline,
}

impl std::str::FromStr for MediumChoice {
    type Err = Error;
    fn from_str(s: &str) -> Result<Self> {
        match s.trim().to_ascii_lowercase().as_str() {
            "auto" => Ok(MediumChoice::Auto),
            "fresh" => Ok(MediumChoice::Fresh),
            "saline" => Ok(MediumChoice::Saline),
            _ => Err(Error::UnknownChoice {
                field: "water",
                name: s.to_string(),
                accepted: "fresh, saline, auto".to_string(),
            }),
        }
    }
}

/// A conductivity reading.
///
/// ```
/// use travertine::sample::trade::Conductivity;
/// let c = Conductivity::parse("350 uS/cm@25C")?;
/// assert_eq!(c, Conductivity::Specific { us_cm: 350.0 });
/// let c = Conductivity::parse("0.41mS/cm")?;
/// assert_eq!(c, Conductivity::AtTemperature { us_cm: 410.0 });
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum Conductivity {
    /// Measured at the sample temperature, µS/cm.
    AtTemperature {
        /// The reading.
        us_cm: f64,
    },
    /// Specific conductance, compensated to 25 °C, µS/cm.
    Specific {
        /// The reading.
        us_cm: f64,
    },
}

/// The units a conductivity accepts.
pub const CONDUCTIVITY_UNITS: [Unit; 4] = [
    Unit::USPerCm,
    Unit::MSPerCm,
    Unit::USPerCmAt25,
    Unit::MSPerCmAt25,
];

impl Conductivity {
    /// Parses "350uS/cm", "0.35 mS/cm" or, for specific conductance at 25 °C,
    /// "350 uS/cm@25C".
    ///
    /// # Errors
    /// As [`Quantity::parse`].
    ///
    /// ```
    /// # use travertine::sample::trade::Conductivity;
    /// assert!(Conductivity::parse("350").is_err());
    /// ```
    pub fn parse(text: &str) -> Result<Self> {
        let q = Quantity::parse("conductivity", text, &CONDUCTIVITY_UNITS)?;
        Ok(Conductivity::from_quantity(q))
    }

    /// From a quantity in one of [`CONDUCTIVITY_UNITS`].
    ///
    /// ```
    /// # use travertine::{sample::Conductivity, units::{Quantity, Unit}};
    /// let c = Conductivity::from_quantity(Quantity::new(1.2, Unit::MSPerCmAt25));
    /// assert_eq!(c, Conductivity::Specific { us_cm: 1200.0 });
    /// ```
    pub fn from_quantity(q: Quantity) -> Self {
        match q.unit {
            Unit::MSPerCm => Conductivity::AtTemperature {
                us_cm: q.value * 1000.0,
            },
            Unit::USPerCmAt25 => Conductivity::Specific { us_cm: q.value },
            Unit::MSPerCmAt25 => Conductivity::Specific {
                us_cm: q.value * 1000.0,
            },
            _ => Conductivity::AtTemperature { us_cm: q.value },
        }
    }
}

/// A sample described in the trade's terms.
///
/// # Example
/// ```
/// use travertine::{sample::{Conductivity, Sample}, Medium, Measured, units::Quantity};
/// let mut s = Sample::new(22.0);
/// s.conductivity = Some(Conductivity::parse("420 uS/cm")?);
/// s.calcium = Some(Quantity::parse("calcium", "48 mg/L Ca", &Sample::calcium_units())?);
/// let water = s.water()?;
/// assert_eq!(water.medium(), Medium::Fresh);
/// let state = water.solve(Measured::parse(travertine::Parameter::Alkalinity, "120 mg/L CaCO3")?,
///                         Measured::ph(7.6, None)?)?;
/// assert!(state.langelier_index.is_some());
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq, Default)]
#[non_exhaustive]
pub struct Sample {
    /// Temperature of the measurement, °C.
    pub temperature_c: f64,
    /// Practical salinity, if known.
    pub salinity: Option<f64>,
    /// Conductivity, if measured.
    pub conductivity: Option<Conductivity>,
    /// Gauge pressure, dbar.
    pub pressure_dbar: f64,
    /// Air pressure, atm (default 1).
    pub air_pressure_atm: Option<f64>,
    /// The medium.
    pub medium: MediumChoice,
    /// K1, K2 fit (saline only).
    pub carbonic: Option<CarbonicFit>,
    /// Total boron ratio (saline only).
    pub boron: Option<BoronTotalFit>,
    /// KF fit (saline only).
    pub fluoride_fit: Option<FluorideFit>,
    /// Activity model (fresh only).
    pub activity: Option<ActivityModel>,
    /// Total phosphate.
    pub phosphate: Option<Quantity>,
    /// Total silicate.
    pub silicate: Option<Quantity>,
    /// Total ammonia nitrogen.
    pub ammonia: Option<Quantity>,
    /// Total sulfide.
    pub sulfide: Option<Quantity>,
    /// Calcium (as Ca, molar, or calcium hardness as CaCO3).
    pub calcium: Option<Quantity>,
    /// Total hardness (as CaCO3 or molar).
    pub hardness: Option<Quantity>,
    /// Fraction of the total hardness that is calcium, 0–1.
    pub calcium_fraction: Option<f64>,
    /// Magnesium.
    pub magnesium: Option<Quantity>,
    /// Sodium.
    pub sodium: Option<Quantity>,
    /// Potassium.
    pub potassium: Option<Quantity>,
    /// Chloride.
    pub chloride: Option<Quantity>,
    /// Sulfate.
    pub sulfate: Option<Quantity>,
    /// Measured total boron.
    pub boron_total: Option<Quantity>,
    /// Total dissolved solids, mg/L.
    pub tds_mg_l: Option<f64>,
    /// Ionic strength given directly, mol/kg.
    pub ionic_strength: Option<f64>,
}

fn amount(
    field: &'static str,
    q: Option<Quantity>,
    mass: &[(Unit, f64)],
) -> Result<Option<Amount>> {
    let Some(q) = q else { return Ok(None) };
    for (unit, g) in mass {
        if q.unit == *unit {
            return Ok(Amount::from_quantity(q, *unit, *g));
        }
    }
    Amount::from_quantity(q, Unit::UmolPerKg, 1.0)
        .filter(|_| MOLAR_UNITS.contains(&q.unit))
        .map(Some)
        .ok_or_else(|| {
            let mut accepted = MOLAR_UNITS.to_vec();
            accepted.extend(mass.iter().map(|(u, _)| *u));
            Error::WrongUnit {
                field,
                unit: q.unit.spelling().to_string(),
                accepted: list_units(&accepted),
            }
        })
}

impl Sample {
    /// A sample at `temperature_c`, everything else unset.
    ///
    /// ```
    /// # use travertine::sample::trade::Sample;
    /// assert_eq!(Sample::new(12.0).temperature_c, 12.0);
    /// ```
    pub fn new(temperature_c: f64) -> Self {
        Self {
            temperature_c,
            ..Self::default()
        }
    }

    /// The units calcium accepts: molar, mg/L Ca, or mg/L as CaCO3 (calcium hardness).
    ///
    /// ```
    /// # use travertine::{sample::Sample, units::Unit};
    /// assert!(Sample::calcium_units().contains(&Unit::MgPerLCaCO3));
    /// ```
    pub fn calcium_units() -> Vec<Unit> {
        let mut v = units_with(Unit::MgPerLCa);
        v.push(Unit::MgPerLCaCO3);
        v
    }

    /// The units of each optional total, by field name (as in the errors).
    ///
    /// ```
    /// # use travertine::{sample::Sample, units::Unit};
    /// assert!(Sample::units_for("ammonia").contains(&Unit::MgPerLN));
    /// ```
    pub fn units_for(field: &str) -> Vec<Unit> {
        match field {
            "calcium" => Self::calcium_units(),
            "hardness" | "magnesium" => {
                let mut v = units_with(Unit::MgPerLCaCO3);
                if field == "magnesium" {
                    v.push(Unit::MgPerLMg);
                }
                v
            }
            "phosphate" => units_with(Unit::MgPerLP),
            "silicate" => units_with(Unit::MgPerLSi),
            "ammonia" => units_with(Unit::MgPerLN),
            "sulfide" => units_with(Unit::MgPerLS),
            "sodium" => units_with(Unit::MgPerLNa),
            "potassium" => units_with(Unit::MgPerLK),
            "chloride" => units_with(Unit::MgPerLCl),
            "sulfate" => units_with(Unit::MgPerLSO4),
            _ => MOLAR_UNITS.to_vec(),
        }
    }

    /// The validated water.
    ///
    /// Salinity: as given; otherwise from the conductivity by PSS-78 (Hill
    /// et al. 1986 below S 2); otherwise 0. Conductivity at the sample
    /// temperature becomes specific conductance by linear compensation
    /// (0.0191 per °C). Total hardness is never taken as calcium: without a
    /// calcium fraction it counts only in the ionic strength.
    ///
    /// # Errors
    /// Any validation error of the parts, naming the field; a saline-only
    /// fit chosen for fresh water, or an activity model for saline water.
    ///
    /// ```
    /// # use travertine::{sample::{MediumChoice, Sample}, fits::CarbonicFit};
    /// let mut s = Sample::new(20.0);
    /// s.medium = MediumChoice::Fresh;
    /// s.carbonic = Some(CarbonicFit::Lueker2000);
    /// assert!(s.water().is_err());
    /// ```
    pub fn water(&self) -> Result<Water> {
        let t = self.temperature_c;
        let mut spc = None;
        let mut salinity = self.salinity;
        if let Some(c) = self.conductivity {
            let (at_t, specific) = match c {
                Conductivity::AtTemperature { us_cm } => {
                    (us_cm, specific_conductance_us_cm(us_cm, t)?)
                }
                Conductivity::Specific { us_cm } => {
                    check_range("conductivity", us_cm, 0.0, 100_000.0, " µS/cm")?;
                    (us_cm, us_cm)
                }
            };
            spc = Some(specific);
            if salinity.is_none() {
                let (c_val, t_val) = match c {
                    Conductivity::AtTemperature { .. } => (at_t, t),
                    Conductivity::Specific { .. } => (specific, 25.0),
                };
                salinity = Some(salinity_from_conductivity(c_val, t_val, 0.0)?);
            }
        }
        let mut conditions =
            Conditions::new(t, salinity.unwrap_or(0.0))?.with_pressure_dbar(self.pressure_dbar)?;
        if let Some(p) = self.air_pressure_atm {
            conditions = conditions.with_air_pressure_atm(p)?;
        }
        let water = match self.medium {
            MediumChoice::Auto => Water::auto(conditions)?,
            MediumChoice::Fresh => Water::fresh(conditions)?,
            MediumChoice::Saline => Water::saline(conditions)?,
        };
        let fresh = water.medium() == Medium::Fresh;
        if fresh {
            let saline_only = [
                ("carbonic", self.carbonic.map(|f| f.name())),
                ("boron", self.boron.map(|f| f.name())),
                ("fluoride", self.fluoride_fit.map(|f| f.name())),
            ];
            for (field, name) in saline_only {
                if let Some(name) = name {
                    return Err(Error::WrongMedium {
                        field,
                        name: name.to_string(),
                        medium: "saline",
                        hint: "fresh water uses Plummer & Busenberg (1982) with activity \
                               coefficients; drop the option, or choose --water saline",
                    });
                }
            }
        } else if let Some(model) = self.activity {
            return Err(Error::WrongMedium {
                field: "activity",
                name: model.name().to_string(),
                medium: "fresh",
                hint: "saline constants are stoichiometric and need no activity model; drop \
                       the option, or choose --water fresh",
            });
        }
        let mut fits = Fits::default();
        if let Some(f) = self.carbonic {
            fits = fits.with_carbonic(f);
        }
        if let Some(f) = self.boron {
            fits = fits.with_boron_total(f);
        }
        if let Some(f) = self.fluoride_fit {
            fits = fits.with_fluoride(f);
        }

        let mut comp = Composition::default();
        let caco3 = (Unit::MgPerLCaCO3, CACO3_G_MOL);
        if let Some(a) = amount("phosphate", self.phosphate, &[(Unit::MgPerLP, P_G_MOL)])? {
            comp = comp.with_phosphate(a)?;
        }
        if let Some(a) = amount("silicate", self.silicate, &[(Unit::MgPerLSi, SI_G_MOL)])? {
            comp = comp.with_silicate(a)?;
        }
        if let Some(a) = amount("ammonia", self.ammonia, &[(Unit::MgPerLN, N_G_MOL)])? {
            comp = comp.with_ammonia(a)?;
        }
        if let Some(a) = amount("sulfide", self.sulfide, &[(Unit::MgPerLS, S_G_MOL)])? {
            comp = comp.with_sulfide(a)?;
        }
        if let Some(a) = amount(
            "calcium",
            self.calcium,
            &[(Unit::MgPerLCa, CA_G_MOL), caco3],
        )? {
            comp = comp.with_calcium(a)?;
        }
        if let Some(h) = amount("hardness", self.hardness, &[caco3])? {
            match self.calcium_fraction {
                Some(f) => {
                    check_range("calcium_fraction", f, 0.0, 1.0, "")?;
                    if self.calcium.is_some() {
                        return Err(Error::IncompatiblePair {
                            first: "calcium",
                            second: "calcium_fraction",
                            reason: "give calcium, or hardness with a calcium fraction, not both",
                        });
                    }
                    let scale = |a: Amount, x: f64| match a {
                        Amount::PerKg(v) => Amount::PerKg(v * x),
                        Amount::PerLitre(v) => Amount::PerLitre(v * x),
                    };
                    if f > 0.0 {
                        comp = comp.with_calcium(scale(h, f))?;
                    }
                    comp = comp.with_magnesium(scale(h, 1.0 - f))?;
                }
                None if self.calcium.is_some() || self.magnesium.is_some() => {}
                None => comp = comp.with_unassigned_hardness(h)?,
            }
        }
        if let Some(a) = amount(
            "magnesium",
            self.magnesium,
            &[(Unit::MgPerLMg, MG_G_MOL), caco3],
        )? {
            comp = comp.with_magnesium(a)?;
        }
        if let Some(a) = amount("sodium", self.sodium, &[(Unit::MgPerLNa, NA_G_MOL)])? {
            comp = comp.with_sodium(a)?;
        }
        if let Some(a) = amount("potassium", self.potassium, &[(Unit::MgPerLK, K_G_MOL)])? {
            comp = comp.with_potassium(a)?;
        }
        if let Some(a) = amount("chloride", self.chloride, &[(Unit::MgPerLCl, CL_G_MOL)])? {
            comp = comp.with_chloride(a)?;
        }
        if let Some(a) = amount("sulfate", self.sulfate, &[(Unit::MgPerLSO4, SO4_G_MOL)])? {
            comp = comp.with_sulfate(a)?;
        }
        if let Some(a) = amount("boron_total", self.boron_total, &[])? {
            comp = comp.with_boron(a)?;
        }

        let mut water = water.with_fits(fits).with_composition(comp);
        if fresh {
            if let Some(m) = self.activity {
                water = water.with_activity_model(m);
            }
            if let Some(v) = spc {
                water = water.with_specific_conductance_us_cm(v)?;
            }
            if let Some(v) = self.tds_mg_l {
                water = water.with_tds_mg_l(v)?;
            }
            if let Some(v) = self.ionic_strength {
                water = water.with_ionic_strength(v)?;
            }
        }
        Ok(water)
    }
}
