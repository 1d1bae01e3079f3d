//! The values an input takes besides numbers and quantities: the medium
//! chosen, a conductivity reading, a chosen name, and a value of any input.

use crate::base::error::{Error, Result};
use crate::base::field::Field;
use crate::base::units::{Quantity, Unit};
use crate::fits::{BisulfateFit, BoronTotalFit, CarbonicFit, FluorideFit, GasTransfer};
use crate::properties::activity::ActivityModel;
use crate::properties::scales::PhScale;

/// Which medium to use.
///
/// ```
/// use travertine::sample::values::MediumChoice;
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
                field: Field::Medium,
                name: s.to_string(),
                accepted: "fresh, saline, auto".to_string(),
            }),
        }
    }
}

/// The name `FromStr` reads: `auto`, `fresh`, `saline`.
///
/// ```
/// use travertine::sample::values::MediumChoice;
/// for m in [MediumChoice::Auto, MediumChoice::Fresh, MediumChoice::Saline] {
///     assert_eq!(m.to_string().parse::<MediumChoice>()?, m);
/// }
/// # Ok::<(), travertine::Error>(())
/// ```
impl std::fmt::Display for MediumChoice {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(match self {
            MediumChoice::Auto => "auto",
            MediumChoice::Fresh => "fresh",
            MediumChoice::Saline => "saline",
        })
    }
}

/// A conductivity reading.
///
/// ```
/// use travertine::sample::values::Conductivity;
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
    /// # use travertine::sample::values::Conductivity;
    /// assert!(Conductivity::parse("350").is_err());
    /// ```
    pub fn parse(text: &str) -> Result<Self> {
        let q = Quantity::parse(Field::Conductivity, text, &CONDUCTIVITY_UNITS)?;
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

impl Conductivity {
    /// The reading, µS/cm (at the sample temperature or at 25 °C, as given).
    ///
    /// ```
    /// # use travertine::sample::values::Conductivity;
    /// assert_eq!(Conductivity::parse("0.41 mS/cm")?.us_cm(), 410.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn us_cm(self) -> f64 {
        match self {
            Conductivity::AtTemperature { us_cm } | Conductivity::Specific { us_cm } => us_cm,
        }
    }

    /// The same kind of reading with another value, µS/cm.
    ///
    /// ```
    /// # use travertine::sample::values::Conductivity;
    /// let c = Conductivity::Specific { us_cm: 350.0 }.with_us_cm(360.0);
    /// assert_eq!(c, Conductivity::Specific { us_cm: 360.0 });
    /// ```
    #[must_use]
    pub fn with_us_cm(self, us_cm: f64) -> Self {
        match self {
            Conductivity::AtTemperature { .. } => Conductivity::AtTemperature { us_cm },
            Conductivity::Specific { .. } => Conductivity::Specific { us_cm },
        }
    }

    /// What the reading gives a water at `temperature_c`: its specific
    /// conductance at 25 °C (µS/cm) and its practical salinity. A reading
    /// at the sample temperature is compensated to 25 °C linearly
    /// ([`specific_conductance_us_cm`]) and turned into salinity at that
    /// temperature; a specific conductance is turned into salinity at
    /// 25 °C ([`salinity_from_conductivity`], PSS-78 with the Hill et al.
    /// 1986 extension), both at 0 dbar. This is the one path from a
    /// conductivity to a water ([`crate::sample::Sample::water`] and the
    /// propagation of its uncertainty alike).
    ///
    /// # Errors
    /// As [`specific_conductance_us_cm`] and [`salinity_from_conductivity`].
    ///
    /// ```
    /// # use travertine::sample::values::Conductivity;
    /// // 42.914 mS/cm at 15 °C is salinity 35 (UNESCO 1983 / TEOS-10 check value).
    /// let (spc, s) = Conductivity::AtTemperature { us_cm: 42914.0 }.specific_and_salinity(15.0)?;
    /// assert!((s - 34.9968).abs() < 1e-3 && spc > 42914.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    ///
    /// [`specific_conductance_us_cm`]: crate::properties::conductivity::specific_conductance_us_cm
    /// [`salinity_from_conductivity`]: crate::properties::conductivity::salinity_from_conductivity
    pub fn specific_and_salinity(self, temperature_c: f64) -> Result<(f64, f64)> {
        use crate::properties::conductivity::{
            salinity_from_conductivity, specific_conductance_us_cm,
        };
        match self {
            Conductivity::AtTemperature { us_cm } => {
                let spc = specific_conductance_us_cm(us_cm, temperature_c)?;
                Ok((spc, salinity_from_conductivity(us_cm, temperature_c, 0.0)?))
            }
            Conductivity::Specific { us_cm } => {
                crate::base::error::check_range(
                    Field::Conductivity,
                    us_cm,
                    0.0,
                    100_000.0,
                    " µS/cm",
                )?;
                Ok((us_cm, salinity_from_conductivity(us_cm, 25.0, 0.0)?))
            }
        }
    }
}

/// The reading as written in messages: `410 uS/cm`, or `350 uS/cm@25C`
/// for specific conductance.
///
/// ```
/// use travertine::sample::values::Conductivity;
/// assert_eq!(Conductivity::parse("0.41 mS/cm")?.to_string(), "410 uS/cm");
/// assert_eq!(Conductivity::parse("350 uS/cm@25C")?.to_string(), "350 uS/cm@25C");
/// # Ok::<(), travertine::Error>(())
/// ```
impl std::fmt::Display for Conductivity {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            Conductivity::AtTemperature { us_cm } => write!(f, "{us_cm} {}", Unit::USPerCm),
            Conductivity::Specific { us_cm } => write!(f, "{us_cm} {}", Unit::USPerCmAt25),
        }
    }
}

/// A chosen name.
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum Choice {
    /// The medium.
    Medium(MediumChoice),
    /// The scale of a pH that names none.
    Scale(PhScale),
    /// K1 and K2.
    Carbonic(CarbonicFit),
    /// Total boron.
    Boron(BoronTotalFit),
    /// KF.
    Fluoride(FluorideFit),
    /// KS.
    Bisulfate(BisulfateFit),
    /// Activity model.
    Activity(ActivityModel),
    // issue 11: air–water CO2 exchange
    /// The model of the gas transfer velocity.
    GasTransfer(GasTransfer),
}

/// The name, as `FromStr` of its kind reads it.
///
/// ```
/// use travertine::sample::values::{Choice, MediumChoice};
/// assert_eq!(Choice::Medium(MediumChoice::Fresh).to_string(), "fresh");
/// ```
impl std::fmt::Display for Choice {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            Choice::Medium(m) => m.fmt(f),
            Choice::Scale(s) => s.fmt(f),
            Choice::Carbonic(c) => c.fmt(f),
            Choice::Boron(b) => b.fmt(f),
            Choice::Fluoride(x) => x.fmt(f),
            Choice::Bisulfate(x) => x.fmt(f),
            Choice::Activity(a) => a.fmt(f),
            Choice::GasTransfer(g) => g.fmt(f),
        }
    }
}

/// The value as it would be typed: `12.5`, `48 mg/L Ca`, `420 uS/cm`,
/// `7.92 nbs`, `fresh`.
///
/// ```
/// use travertine::sample::{inputs::Input, values::InputValue};
/// use travertine::Parameter;
/// for (input, text) in [(Input::Temperature, "12.5"), (Input::Carbon(Parameter::Ph), "7.92 nbs")] {
///     assert_eq!(input.read(text)?.to_string(), text);
/// }
/// # Ok::<(), travertine::Error>(())
/// ```
impl std::fmt::Display for InputValue {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            InputValue::Number(v) | InputValue::Ph(v, None) => write!(f, "{v}"),
            InputValue::Ph(v, Some(s)) => write!(f, "{v} {s}"),
            InputValue::Quantity(q) => q.fmt(f),
            InputValue::Conductivity(c) => c.fmt(f),
            InputValue::Choice(c) => c.fmt(f),
        }
    }
}

/// A value of an input, read from a flag, a `--set` or a cell.
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum InputValue {
    /// In the input's base unit (°C, practical salinity, dbar, atm, mg/L,
    /// mol/kg, fraction; for the exchange with the air m/s, ppm, m, km²,
    /// cm/h).
    Number(f64),
    /// A number with its unit.
    Quantity(Quantity),
    /// A conductivity reading.
    Conductivity(Conductivity),
    /// A pH and the scale it names, if any.
    Ph(f64, Option<PhScale>),
    /// A name.
    Choice(Choice),
}
