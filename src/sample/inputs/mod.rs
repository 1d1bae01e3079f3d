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

use crate::base::error::{Error, Result};
use crate::base::field::Field;
use crate::base::units::{list_units, Quantity, Unit, MOLAR_UNITS};
use crate::properties::scales::PhScale;
use crate::sample::measured::Parameter;
use crate::sample::values::{Choice, Conductivity, InputValue};

mod list;

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
    /// Air pressure over the water, atm.
    AirPressure,
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
    /// assert_eq!(Input::AirPressure.field(), Field::AirPressure);
    /// ```
    pub fn field(self) -> Field {
        match self {
            Input::Carbon(p) => p.field(),
            Input::Temperature => Field::Temperature,
            Input::Salinity => Field::Salinity,
            Input::Conductivity => Field::Conductivity,
            Input::Pressure => Field::Pressure,
            Input::AirPressure => Field::AirPressure,
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
            Input::AirPressure => "air pressure",
            Input::CalciumFraction => "calcium fraction",
            Input::IonicStrength => "ionic strength",
            Input::PhScale => "ph scale",
            Input::CarbonicFit => "carbonic fit",
            Input::BoronFit => "boron fit",
            Input::FluorideFit => "fluoride fit",
            Input::BisulfateFit => "bisulfate fit",
            Input::Activity => "activity model",
            Input::Depth => "depth",
            other => other.field().name(),
        }
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
        )
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
            Input::AirPressure => "atm, hPa, mbar, kPa, mmHg".into(),
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
            (_, v) => v.to_string(),
        }
    }

    /// Reads the text of a command-line value or a `--set` value: a plain
    /// number in the input's base unit (°C, practical salinity, dbar, atm,
    /// fraction, mol/kg, m), a number with a unit, or a name. A pH may
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
            Input::Temperature
            | Input::Salinity
            | Input::Pressure
            | Input::AirPressure
            | Input::CalciumFraction
            | Input::IonicStrength
            | Input::Depth => InputValue::Number(number()?),
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
