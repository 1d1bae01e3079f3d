//! Every input, described once: its command-line flag, its canonical sheet
//! column, its help line, the units or names it accepts and the spellings a
//! sheet header may give it.
//!
//! The command line builds its flags from [`INPUTS`], the sheet recognises
//! its headers from the same rows, and a [`Sample`](super::Sample) is
//! filled through [`Sample::put`](super::Sample::put) and
//! [`Sample::set`](super::Sample::set) whatever the source. An error names
//! its [`Field`]; [`Input::from_field`] turns that into the input, and so
//! into a flag or a column, in this one place. Adding an input means adding
//! one row here and one slot in `Sample`.

use crate::base::error::{check_range, Error, NumberSlip, Result};
use crate::base::field::Field;
use crate::base::units::{list_units, number_len, Quantity, Unit, MOLAR_UNITS};
use crate::properties::atmosphere::{ELEVATION_MAX_M, ELEVATION_MIN_M, KPA_PER_ATM};
use crate::properties::scales::PhScale;
use crate::sample::measured::Parameter;
use crate::sample::values::{Choice, Conductivity, InputValue};

pub(crate) mod header;
mod list;

pub use header::{column_guide, number_column, NamedInput, UnreadName};
pub use list::INPUTS;

/// A measured total of the sample.
///
/// ```
/// use travertine::sample::inputs::Total;
/// assert_eq!(Total::Ammonia.field().name(), "ammonia");
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum Total {
    /// Total phosphate.
    Phosphate,
    /// Total silicate.
    Silicate,
    /// Total ammonia (NH3 + NH4+).
    Ammonia,
    /// Total sulfide.
    Sulfide,
    /// Calcium.
    Calcium,
    /// Total hardness.
    Hardness,
    /// Magnesium.
    Magnesium,
    /// Sodium.
    Sodium,
    /// Potassium.
    Potassium,
    /// Chloride.
    Chloride,
    /// Sulfate.
    Sulfate,
    /// Measured total boron.
    Boron,
}

/// The total's name, as in messages (`phosphate`, `calcium`).
///
/// ```
/// use travertine::sample::inputs::Total;
/// assert_eq!(Total::Calcium.to_string(), "calcium");
/// ```
impl std::fmt::Display for Total {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        self.field().fmt(f)
    }
}

/// The input's name, as in messages (`alkalinity`, `temperature`).
///
/// ```
/// use travertine::sample::inputs::Input;
/// assert_eq!(Input::Temperature.to_string(), "temperature");
/// ```
impl std::fmt::Display for Input {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}

impl Total {
    /// Every total, in the order of [`Sample::totals`](super::Sample::totals).
    pub const ALL: [Total; 12] = [
        Total::Phosphate,
        Total::Silicate,
        Total::Ammonia,
        Total::Sulfide,
        Total::Calcium,
        Total::Hardness,
        Total::Magnesium,
        Total::Sodium,
        Total::Potassium,
        Total::Chloride,
        Total::Sulfate,
        Total::Boron,
    ];

    /// Its place in [`Total::ALL`].
    ///
    /// ```
    /// # use travertine::sample::inputs::Total;
    /// assert_eq!(Total::ALL[Total::Calcium.index()], Total::Calcium);
    /// ```
    pub fn index(self) -> usize {
        Total::ALL.iter().position(|t| *t == self).unwrap_or(0)
    }

    /// The field errors name it by.
    ///
    /// ```
    /// # use travertine::sample::inputs::Total;
    /// assert_eq!(Total::Boron.field().name(), "boron_total");
    /// ```
    pub fn field(self) -> Field {
        match self {
            Total::Phosphate => Field::Phosphate,
            Total::Silicate => Field::Silicate,
            Total::Ammonia => Field::Ammonia,
            Total::Sulfide => Field::Sulfide,
            Total::Calcium => Field::Calcium,
            Total::Hardness => Field::Hardness,
            Total::Magnesium => Field::Magnesium,
            Total::Sodium => Field::Sodium,
            Total::Potassium => Field::Potassium,
            Total::Chloride => Field::Chloride,
            Total::Sulfate => Field::Sulfate,
            Total::Boron => Field::BoronTotal,
        }
    }

    /// The mass units accepted beside the molar ones, each with the molar
    /// (or, as CaCO3, equivalent-based molar) mass it converts with, g/mol.
    pub(crate) fn mass_units(self) -> &'static [(Unit, f64)] {
        use crate::base::units::*;
        const CACO3: (Unit, f64) = (Unit::MgPerLCaCO3, CACO3_G_MOL);
        match self {
            Total::Phosphate => &[(Unit::MgPerLP, P_G_MOL)],
            Total::Silicate => &[(Unit::MgPerLSi, SI_G_MOL)],
            Total::Ammonia => &[(Unit::MgPerLN, N_G_MOL)],
            Total::Sulfide => &[(Unit::MgPerLS, S_G_MOL)],
            Total::Calcium => &[(Unit::MgPerLCa, CA_G_MOL), CACO3],
            Total::Hardness => &[CACO3],
            Total::Magnesium => &[(Unit::MgPerLMg, MG_G_MOL), CACO3],
            Total::Sodium => &[(Unit::MgPerLNa, NA_G_MOL)],
            Total::Potassium => &[(Unit::MgPerLK, K_G_MOL)],
            Total::Chloride => &[(Unit::MgPerLCl, CL_G_MOL)],
            Total::Sulfate => &[(Unit::MgPerLSO4, SO4_G_MOL)],
            Total::Boron => &[],
        }
    }

    /// Every unit accepted: the molar units and the mass units.
    ///
    /// ```
    /// # use travertine::{sample::inputs::Total, units::Unit};
    /// assert!(Total::Ammonia.units().contains(&Unit::MgPerLN));
    /// assert!(Total::Calcium.units().contains(&Unit::MgPerLCaCO3));
    /// ```
    pub fn units(self) -> Vec<Unit> {
        let mut v = MOLAR_UNITS.to_vec();
        v.extend(self.mass_units().iter().map(|(u, _)| *u));
        v
    }

    /// The unit plain "mg/L" means for this total, where its name says what
    /// the mass is of (calcium as Ca, sodium as Na, ...); `None` where plain
    /// mg/L is ambiguous (phosphate as P or as PO4, hardness as CaCO3 or as
    /// the ions).
    ///
    /// ```
    /// # use travertine::{sample::inputs::Total, units::Unit};
    /// assert_eq!(Total::Calcium.own_mass_unit(), Some(Unit::MgPerLCa));
    /// assert_eq!(Total::Phosphate.own_mass_unit(), None);
    /// ```
    pub fn own_mass_unit(self) -> Option<Unit> {
        match self {
            Total::Calcium => Some(Unit::MgPerLCa),
            Total::Magnesium => Some(Unit::MgPerLMg),
            Total::Sodium => Some(Unit::MgPerLNa),
            Total::Potassium => Some(Unit::MgPerLK),
            Total::Chloride => Some(Unit::MgPerLCl),
            Total::Sulfate => Some(Unit::MgPerLSO4),
            _ => None,
        }
    }
}

/// An input of a sample.
///
/// ```
/// use travertine::sample::inputs::Input;
/// assert_eq!(Input::Temperature.flag(), "temperature");
/// assert_eq!(Input::Temperature.column(), "temperature_c");
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum Input {
    /// A measured carbonate parameter.
    Carbon(Parameter),
    /// Temperature of the measurement, °C.
    Temperature,
    /// Practical salinity.
    Salinity,
    /// Conductivity, at the sample temperature or specific (at 25 °C).
    Conductivity,
    /// Gauge pressure, dbar.
    Pressure,
    /// Barometric pressure: the total pressure of the air over the water
    /// (base unit atm).
    Barometric,
    /// A measured total.
    Total(Total),
    /// Fraction of the total hardness that is calcium.
    CalciumFraction,
    /// Total dissolved solids, mg/L.
    Tds,
    /// Ionic strength, mol/kg.
    IonicStrength,
    /// fresh, saline or auto.
    Medium,
    /// The scale of a pH that names none.
    PhScale,
    /// K1 and K2 fit.
    CarbonicFit,
    /// Total boron ratio.
    BoronFit,
    /// KF fit.
    FluorideFit,
    /// KS fit.
    BisulfateFit,
    /// Activity model.
    Activity,
    // issue 11: depth profiles
    /// Depth below the water surface, m: becomes the pressure (see
    /// [`crate::properties::density::pressure_dbar_at_depth`]).
    Depth,
    // issue 11: air–water CO2 exchange
    /// Wind speed at 10 m, m/s.
    Wind,
    /// CO2 in the air, dry mole fraction, ppm.
    AirCo2,
    /// Elevation of the water surface above sea level, m.
    Elevation,
    /// Surface area of the lake, km².
    LakeArea,
    /// A gas transfer velocity k600 given directly, cm/h.
    K600,
    /// The model of the gas transfer velocity.
    GasTransfer,
    // issue 12: the volume a dose treats
    /// The volume of water a dose treats, m³.
    PondVolume,
    /// The area of a pond, m² (with its mean depth, the volume a dose treats).
    PondArea,
    /// The mean depth of a pond, m.
    MeanDepth,
}

/// A pH, with the scale it names after the number, if any: `7.92`,
/// `7.92 nbs`, `8.05 (total)`.
fn read_ph(text: &str) -> Result<InputValue> {
    let t = text.trim();
    let (number, scale) = match t.split_once(char::is_whitespace) {
        Some((n, rest)) => {
            let name = rest.trim().trim_start_matches('(').trim_end_matches(')');
            (n, Some(name.parse::<PhScale>()?))
        }
        None => (t, None),
    };
    let v = crate::base::error::plain_number(Field::Ph, number).map_err(|e| match e {
        // The whole text in the message, as typed.
        Error::NotANumber { field, slip, .. } => Error::NotANumber {
            field,
            text: text.to_string(),
            slip,
        },
        other => other,
    })?;
    Ok(InputValue::Ph(v, scale))
}

/// A unit a number of an input may be written in, beside the input's base
/// unit: how it is written in messages, the spellings it is read from and
/// how many base units one of it makes.
///
/// ```
/// use travertine::sample::inputs::Input;
/// let kpa = Input::Barometric.number_units().iter().find(|u| u.label == "kPa").unwrap();
/// assert!((kpa.to_base - 1.0 / 101.325).abs() < 1e-15); // to atm
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub struct NumberUnit {
    /// The unit as written in messages.
    pub label: &'static str,
    /// Its spellings, normalised (lower case, one space between words,
    /// `µ` as `u`), the label's own included.
    pub spellings: &'static [&'static str],
    /// Base units per one of this unit.
    pub to_base: f64,
}

const fn unit(label: &'static str, spellings: &'static [&'static str], to_base: f64) -> NumberUnit {
    NumberUnit {
        label,
        spellings,
        to_base,
    }
}

/// The units of the barometric pressure (base unit atm).
const BAROMETRIC_UNITS: &[NumberUnit] = &[
    unit("kPa", &["kpa"], 1.0 / KPA_PER_ATM),
    unit("hPa", &["hpa", "mbar", "mb"], 0.1 / KPA_PER_ATM),
    unit("atm", &["atm"], 1.0),
    unit("mmHg", &["mmhg", "mm hg", "torr"], 1.0 / 760.0),
];
/// The units of the wind speed (base unit m/s).
const WIND_UNITS: &[NumberUnit] = &[
    unit("m/s", &["m/s", "m s", "m s-1", "ms-1", "mps"], 1.0),
    unit("km/h", &["km/h", "km h", "kmh", "kph", "km/hr"], 1.0 / 3.6),
];
/// The units of CO2 in air (base unit ppm, µmol/mol of dry air).
const AIR_CO2_UNITS: &[NumberUnit] = &[unit("ppm", &["ppm", "ppmv", "umol/mol"], 1.0)];
/// The units of an elevation (base unit m).
const ELEVATION_UNITS: &[NumberUnit] = &[
    unit(
        "m",
        &["m", "metres", "meters", "m asl", "masl", "m a.s.l."],
        1.0,
    ),
    unit("ft", &["ft", "feet", "ft asl"], 0.3048),
];
/// The units of a lake area (base unit km²).
const AREA_UNITS: &[NumberUnit] = &[
    unit("km2", &["km2", "km²", "km^2", "sq km"], 1.0),
    unit("ha", &["ha", "hectare", "hectares"], 0.01),
];
/// The units of a transfer velocity (base unit cm/h).
const VELOCITY_UNITS: &[NumberUnit] = &[
    unit("cm/h", &["cm/h", "cm h", "cm/hr", "cm hr", "cm h-1"], 1.0),
    unit(
        "m/d",
        &["m/d", "m d", "m/day", "m day", "m d-1"],
        100.0 / 24.0,
    ),
];

/// The units of a volume of water (base unit m³). US gallon: 231 cubic
/// inches exactly; acre-foot: an international acre one foot deep (NIST
/// Handbook 44; common practice).
const VOLUME_UNITS: &[NumberUnit] = &[
    unit(
        "m3",
        &["m3", "m³", "m^3", "cubic metres", "cubic meters"],
        1.0,
    ),
    unit("L", &["l", "litre", "litres", "liter", "liters"], 1e-3),
    unit(
        "gal",
        &["gal", "gallon", "gallons", "us gal", "usgal"],
        3.785_411_784e-3,
    ),
    unit(
        "acre-ft",
        &["acre-ft", "acre-feet", "acre-foot", "af", "acre ft"],
        1_233.481_837_547_52,
    ),
];
/// The units of a pond's area (base unit m²); an international acre is
/// 4046.856 422 4 m² exactly.
const POND_AREA_UNITS: &[NumberUnit] = &[
    unit("m2", &["m2", "m²", "m^2", "sq m"], 1.0),
    unit("ha", &["ha", "hectare", "hectares"], 1e4),
    unit("acre", &["acre", "acres", "ac"], 4_046.856_422_4),
];
/// The units of a mean depth (base unit m); a foot is 0.3048 m exactly.
const DEPTH_UNITS: &[NumberUnit] = &[
    unit("m", &["m", "metre", "metres", "meter", "meters"], 1.0),
    unit("ft", &["ft", "foot", "feet"], 0.3048),
];

/// A unit text as the spellings of [`NumberUnit`] are written: trimmed,
/// lower case, `µ` as `u`, no space around `/`, single spaces.
fn unit_text(text: &str) -> String {
    let lower = text.trim().to_lowercase().replace(['µ', 'μ'], "u");
    let words: Vec<&str> = lower.split_whitespace().collect();
    words.join(" ").replace(" /", "/").replace("/ ", "/")
}

/// How the spelling of a header reads.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[non_exhaustive]
pub enum NameHint {
    /// An ordinary name.
    None,
    /// A chemical symbol or short code: recognised only with a unit.
    Short,
    /// The name says "nitrogen": plain mg/L means mg/L as N.
    Nitrogen,
    /// The name says "phosphate-P": plain mg/L means mg/L as P.
    Phosphorus,
    /// Calcium hardness: mg/L as CaCO3 or molar only.
    CalciumHardness,
    /// Specific conductance: at 25 °C whatever the unit says.
    Specific,
}

/// One row of the list of inputs.
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub struct InputSpec {
    /// The input.
    pub input: Input,
    /// The long command-line flag, without the dashes.
    pub flag: &'static str,
    /// The canonical sheet column, in the most common field unit.
    pub column: &'static str,
    /// One line of help: what it is and what it accepts.
    pub help: &'static str,
    /// The spellings a sheet header may give, after normalising (lower
    /// case, `_` as space, µ as u), with how each reads.
    pub spellings: &'static [(&'static str, NameHint)],
}

impl Input {
    /// Its row of [`INPUTS`].
    ///
    /// ```
    /// # use travertine::sample::inputs::Input;
    /// assert!(Input::Tds.spec().help.contains("mg/L"));
    /// ```
    pub fn spec(self) -> &'static InputSpec {
        // Every input has a row: a unit test checks it.
        INPUTS
            .iter()
            .find(|s| s.input == self)
            .unwrap_or(&INPUTS[0])
    }

    /// The long command-line flag, without the dashes.
    pub fn flag(self) -> &'static str {
        self.spec().flag
    }

    /// The canonical sheet column.
    pub fn column(self) -> &'static str {
        self.spec().column
    }

    /// The field errors name this input by.
    ///
    /// ```
    /// # use travertine::{base::field::Field, sample::inputs::Input};
    /// assert_eq!(Input::Barometric.field(), Field::Barometric);
    /// ```
    pub fn field(self) -> Field {
        match self {
            Input::Carbon(p) => p.field(),
            Input::Temperature => Field::Temperature,
            Input::Salinity => Field::Salinity,
            Input::Conductivity => Field::Conductivity,
            Input::Pressure => Field::Pressure,
            Input::Barometric => Field::Barometric,
            Input::Total(t) => t.field(),
            Input::CalciumFraction => Field::CalciumFraction,
            Input::Tds => Field::Tds,
            Input::IonicStrength => Field::IonicStrength,
            Input::Medium => Field::Medium,
            Input::PhScale => Field::PhScale,
            Input::CarbonicFit => Field::CarbonicFit,
            Input::BoronFit => Field::BoronFit,
            Input::FluorideFit => Field::FluorideFit,
            Input::BisulfateFit => Field::BisulfateFit,
            Input::Activity => Field::Activity,
            Input::Depth => Field::Depth,
            Input::Wind => Field::Wind,
            Input::AirCo2 => Field::AirCo2,
            Input::Elevation => Field::Elevation,
            Input::LakeArea => Field::LakeArea,
            Input::K600 => Field::K600,
            Input::GasTransfer => Field::GasTransfer,
            Input::PondVolume => Field::Volume,
            Input::PondArea => Field::Area,
            Input::MeanDepth => Field::MeanDepth,
        }
    }

    /// The input an error's field points to, where it is one (specific
    /// conductance is the conductivity input).
    ///
    /// ```
    /// # use travertine::{base::field::Field, sample::inputs::Input};
    /// assert_eq!(Input::from_field(Field::SpecificConductance), Some(Input::Conductivity));
    /// assert_eq!(Input::from_field(Field::Density), None);
    /// ```
    pub fn from_field(field: Field) -> Option<Input> {
        if field == Field::SpecificConductance {
            return Some(Input::Conductivity);
        }
        INPUTS.iter().map(|s| s.input).find(|i| i.field() == field)
    }

    /// The plain name used in messages.
    pub fn name(self) -> &'static str {
        match self {
            Input::Carbon(p) => p.name(),
            Input::Temperature => "temperature",
            Input::Pressure => "pressure",
            Input::Barometric => "barometric pressure",
            Input::CalciumFraction => "calcium fraction",
            Input::IonicStrength => "ionic strength",
            Input::PhScale => "ph scale",
            Input::CarbonicFit => "carbonic fit",
            Input::BoronFit => "boron fit",
            Input::FluorideFit => "fluoride fit",
            Input::BisulfateFit => "bisulfate fit",
            Input::Activity => "activity model",
            Input::Depth => "depth",
            Input::Wind => "wind speed",
            Input::AirCo2 => "air CO2",
            Input::LakeArea => "lake area",
            Input::GasTransfer => "gas transfer model",
            Input::PondVolume => "volume",
            Input::PondArea => "pond area",
            Input::MeanDepth => "mean depth",
            other => other.field().name(),
        }
    }

    /// Whether the input serves a dose only (the volume treated): `solve`
    /// has no flag for it, and a sheet without a dose reports it unused.
    ///
    /// ```
    /// # use travertine::sample::inputs::Input;
    /// assert!(Input::PondArea.is_for_dose() && !Input::Temperature.is_for_dose());
    /// ```
    pub fn is_for_dose(self) -> bool {
        matches!(self, Input::PondVolume | Input::PondArea | Input::MeanDepth)
    }

    /// Whether the input is a name (medium, scale, fit) rather than a number.
    pub fn is_choice(self) -> bool {
        matches!(
            self,
            Input::Medium
                | Input::PhScale
                | Input::CarbonicFit
                | Input::BoronFit
                | Input::FluorideFit
                | Input::BisulfateFit
                | Input::Activity
                | Input::GasTransfer
        )
    }

    /// The units a number of this input may be written in (empty for an
    /// input read otherwise: a quantity, a conductivity, a name, or a
    /// number in one unit only).
    ///
    /// ```
    /// # use travertine::sample::inputs::Input;
    /// let labels: Vec<&str> = Input::K600.number_units().iter().map(|u| u.label).collect();
    /// assert_eq!(labels, ["cm/h", "m/d"]);
    /// ```
    pub fn number_units(self) -> &'static [NumberUnit] {
        match self {
            Input::Barometric => BAROMETRIC_UNITS,
            Input::Wind => WIND_UNITS,
            Input::AirCo2 => AIR_CO2_UNITS,
            Input::Elevation => ELEVATION_UNITS,
            Input::LakeArea => AREA_UNITS,
            Input::K600 => VELOCITY_UNITS,
            Input::PondVolume => VOLUME_UNITS,
            Input::PondArea => POND_AREA_UNITS,
            Input::MeanDepth => DEPTH_UNITS,
            _ => &[],
        }
    }

    /// Whether a number of this input must carry one of its
    /// [`Input::number_units`]: where the units differ in kind (hPa and
    /// kPa, km² and ha, cm/h and m/d) a bare number would be a guess.
    /// Wind speed (m/s), CO2 in air (ppm) and elevation (m) read a bare
    /// number in their base unit.
    ///
    /// ```
    /// # use travertine::sample::inputs::Input;
    /// assert!(Input::Barometric.unit_required());
    /// assert!(!Input::Wind.unit_required());
    /// ```
    pub fn unit_required(self) -> bool {
        matches!(
            self,
            Input::Barometric | Input::LakeArea | Input::K600 | Input::PondVolume | Input::PondArea
        )
    }

    /// The unit `text` names among [`Input::number_units`].
    ///
    /// ```
    /// # use travertine::sample::inputs::Input;
    /// assert_eq!(Input::LakeArea.number_unit("ha").map(|u| u.label), Some("ha"));
    /// assert_eq!(Input::LakeArea.number_unit("acres"), None);
    /// ```
    pub fn number_unit(self, text: &str) -> Option<&'static NumberUnit> {
        let t = unit_text(text);
        self.number_units()
            .iter()
            .find(|u| u.spellings.contains(&t.as_str()))
    }

    /// The accepted range of a number of this input, in its base unit, with
    /// that unit as errors write it; `None` where the number is checked
    /// elsewhere (by [`crate::sample::Conditions`] and its peers).
    fn number_range(self) -> Option<(f64, f64, &'static str)> {
        use crate::sample::air;
        let (lo, hi, u) = match self {
            Input::Barometric => {
                let (lo, hi) = crate::sample::conditions::AIR_PRESSURE_RANGE_ATM;
                (lo, hi, " atm")
            }
            Input::Wind => (air::WIND_RANGE_M_S.0, air::WIND_RANGE_M_S.1, " m/s"),
            Input::AirCo2 => (air::AIR_CO2_RANGE_PPM.0, air::AIR_CO2_RANGE_PPM.1, " ppm"),
            Input::Elevation => (ELEVATION_MIN_M, ELEVATION_MAX_M, " m"),
            Input::LakeArea => (
                air::LAKE_AREA_RANGE_KM2.0,
                air::LAKE_AREA_RANGE_KM2.1,
                " km2",
            ),
            Input::K600 => (air::K600_RANGE_CM_H.0, air::K600_RANGE_CM_H.1, " cm/h"),
            Input::PondVolume => (1e-6, 1e12, " m3"),
            Input::PondArea => (1e-4, 1e10, " m2"),
            Input::MeanDepth => (1e-3, 1e3, " m"),
            _ => return None,
        };
        Some((lo, hi, u))
    }

    /// Reads a number of an input with [`Input::number_units`]: a bare
    /// number in the base unit where [`Input::unit_required`] allows it,
    /// or a number with one of the units, turned into the base unit and
    /// checked against the input's range (an error gives the value and
    /// the range in the unit typed).
    fn read_number(self, text: &str) -> Result<f64> {
        let field = self.field();
        let t = text.trim();
        let n = number_len(t.as_bytes());
        let rest = t[n..].trim();
        let accepted = || {
            self.number_units()
                .iter()
                .map(|u| u.label)
                .collect::<Vec<_>>()
                .join(", ")
        };
        if n == 0 || rest.is_empty() {
            let value = crate::base::error::plain_number(field, text)?;
            if self.unit_required() {
                return Err(Error::MissingUnit {
                    field,
                    text: text.to_string(),
                    accepted: accepted(),
                });
            }
            return self.checked(value, value, "", 1.0);
        }
        if NumberSlip::find(t).is_some() {
            return Err(Error::NotANumber {
                field,
                text: text.to_string(),
                slip: NumberSlip::find(t),
            });
        }
        let value = crate::base::error::plain_number(field, &t[..n])?;
        let Some(u) = self.number_unit(rest) else {
            return Err(Error::WrongUnit {
                field,
                unit: rest.to_string(),
                accepted: accepted(),
            });
        };
        self.checked(value * u.to_base, value, u.label, u.to_base)
    }

    /// `base` checked against [`Input::number_range`]; out of range, the
    /// error gives `typed` in `label` (the base unit for an empty label).
    fn checked(self, base: f64, typed: f64, label: &'static str, to_base: f64) -> Result<f64> {
        let Some((lo, hi, unit)) = self.number_range() else {
            return Ok(base);
        };
        check_range(self.field(), base, lo, hi, unit).map_err(|e| {
            if label.is_empty() {
                e
            } else {
                e.in_typed_unit(typed, label, to_base)
            }
        })
    }

    /// The units (or values) this input accepts, for messages.
    ///
    /// ```
    /// # use travertine::sample::inputs::Input;
    /// assert!(Input::Temperature.accepted().contains("°F"));
    /// ```
    pub fn accepted(self) -> String {
        match self {
            Input::Carbon(Parameter::Ph) => {
                "a pH scale: nbs, total, seawater or free (none: NBS in fresh water; saline water \
                 needs its scale stated)"
                    .into()
            }
            Input::Carbon(p) if p.is_gas() => list_units(&p.accepted_units()),
            Input::Carbon(p) => format!(
                "{}; ppm for mg/L in a sheet header",
                list_units(&p.accepted_units())
            ),
            Input::Temperature => "°C, °F, K".into(),
            Input::Salinity => "none (practical salinity), psu, pss; in a sheet header ppt, ‰ and \
                                g/kg are read as practical salinity, with a note"
                .into(),
            Input::Conductivity => "uS/cm, mS/cm (at the sample temperature), uS/cm@25C, \
                                    mS/cm@25C (specific conductance)"
                .into(),
            Input::Pressure => "dbar, bar".into(),
            Input::Barometric => "kPa, hPa (mbar), atm, mmHg; or give the elevation instead".into(),
            Input::Wind => "m/s (a bare number), km/h".into(),
            Input::AirCo2 => "ppm of dry air (a bare number)".into(),
            Input::Elevation => "m above sea level (a bare number), ft".into(),
            Input::LakeArea => "km2, ha".into(),
            Input::K600 => "cm/h, m/d".into(),
            Input::PondVolume => "m3, L, gal (US), acre-ft".into(),
            Input::PondArea => "m2, ha, acre".into(),
            Input::MeanDepth => "m, ft".into(),
            Input::Total(t) => {
                format!("{}; ppm for mg/L in a sheet header", list_units(&t.units()))
            }
            Input::CalciumFraction => "none (0 to 1), %".into(),
            Input::Tds => "mg/L, g/L, ppm (as mg/L)".into(),
            Input::IonicStrength => "none (mol/kg), mol/kg, mmol/kg".into(),
            Input::Depth => "m; in a sheet header also ft (0.3048 m)".into(),
            _ => "none (a name in each cell)".into(),
        }
    }

    /// The text [`Input::read`] reads back to `value`: the value as typed,
    /// with the unit an input needs (`250 mg/L` for TDS).
    ///
    /// ```
    /// use travertine::sample::{inputs::Input, values::InputValue};
    /// assert_eq!(Input::Tds.write(&InputValue::Number(250.0)), "250 mg/L");
    /// assert_eq!(Input::Tds.read("250 mg/L")?, InputValue::Number(250.0));
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn write(self, value: &InputValue) -> String {
        match (self, value) {
            (Input::Tds, InputValue::Number(v)) => format!("{v} {}", Unit::MgPerL),
            // Inputs whose numbers need a unit: in their base unit.
            (Input::Barometric, InputValue::Number(v)) => format!("{v} atm"),
            (Input::LakeArea, InputValue::Number(v)) => format!("{v} km2"),
            (Input::K600, InputValue::Number(v)) => format!("{v} cm/h"),
            (Input::PondVolume, InputValue::Number(v)) => format!("{v} m3"),
            (Input::PondArea, InputValue::Number(v)) => format!("{v} m2"),
            (_, v) => v.to_string(),
        }
    }

    /// Reads the text of a command-line value or a `--set` value: a plain
    /// number in the input's base unit (°C, practical salinity, dbar,
    /// fraction, mol/kg; m/s, ppm, m), a number with a unit (a barometric
    /// pressure, a lake area and a k600 need theirs, and are turned into
    /// atm, km² and cm/h; see [`Input::number_units`]), or a name. A pH may
    /// name its scale after the number (`7.92 nbs`, `8.05 (total)`).
    ///
    /// # Errors
    /// The input's own parse error, naming its field.
    ///
    /// ```
    /// use travertine::sample::{inputs::{Input, Total}, values::InputValue};
    /// assert_eq!(Input::Temperature.read("12.5")?, InputValue::Number(12.5));
    /// assert!(matches!(Input::Total(Total::Calcium).read("40 mg/L Ca")?, InputValue::Quantity(_)));
    /// assert!(Input::Total(Total::Calcium).read("40").is_err()); // no unit
    /// use travertine::{Parameter, PhScale};
    /// assert_eq!(Input::Carbon(Parameter::Ph).read("7.92 nbs")?, InputValue::Ph(7.92, Some(PhScale::Nbs)));
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn read(self, text: &str) -> Result<InputValue> {
        let field = self.field();
        let number = || crate::base::error::plain_number(field, text);
        Ok(match self {
            Input::Carbon(Parameter::Ph) => read_ph(text)?,
            Input::Carbon(p) => {
                InputValue::Quantity(Quantity::parse(field, text, &p.accepted_units())?)
            }
            Input::Total(t) => InputValue::Quantity(Quantity::parse(field, text, &t.units())?),
            Input::Conductivity => InputValue::Conductivity(Conductivity::parse(text)?),
            Input::Tds => InputValue::Number(Quantity::parse(field, text, &[Unit::MgPerL])?.value),
            Input::Medium => InputValue::Choice(Choice::Medium(text.parse()?)),
            Input::PhScale => InputValue::Choice(Choice::Scale(text.parse()?)),
            Input::CarbonicFit => InputValue::Choice(Choice::Carbonic(text.parse()?)),
            Input::BoronFit => InputValue::Choice(Choice::Boron(text.parse()?)),
            Input::FluorideFit => InputValue::Choice(Choice::Fluoride(text.parse()?)),
            Input::BisulfateFit => InputValue::Choice(Choice::Bisulfate(text.parse()?)),
            Input::Activity => InputValue::Choice(Choice::Activity(text.parse()?)),
            Input::GasTransfer => InputValue::Choice(Choice::GasTransfer(text.parse()?)),
            // A number in one of the input's units (its list, once).
            i if !i.number_units().is_empty() => InputValue::Number(self.read_number(text)?),
            // A plain number in the base unit: temperature, salinity,
            // pressure, calcium fraction, ionic strength, depth.
            _ => InputValue::Number(number()?),
        })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_input_has_one_row_and_unique_names() {
        let mut flags = std::collections::BTreeSet::new();
        let mut columns = std::collections::BTreeSet::new();
        let mut spellings = std::collections::BTreeSet::new();
        for s in INPUTS {
            assert_eq!(s.input.spec().flag, s.flag);
            assert!(flags.insert(s.flag), "flag {} twice", s.flag);
            assert!(columns.insert(s.column), "column {} twice", s.column);
            for (n, _) in s.spellings {
                assert!(spellings.insert(*n), "spelling {n} twice");
            }
            assert_eq!(Input::from_field(s.input.field()), Some(s.input));
        }
        for p in Parameter::ALL {
            assert!(INPUTS.iter().any(|s| s.input == Input::Carbon(p)), "{p:?}");
        }
        for t in Total::ALL {
            assert!(INPUTS.iter().any(|s| s.input == Input::Total(t)), "{t:?}");
        }
    }
}
