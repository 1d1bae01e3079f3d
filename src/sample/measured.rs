//! Measured carbonate parameters, validated at construction.

use crate::base::error::{check_range, Error, Result};
use crate::base::field::Field;
use crate::base::units::{list_units, units_with, Amount, Quantity, Unit};
use crate::base::units::{CACO3_G_EQ, CO2_G_MOL, CO3_G_MOL, C_G_MOL, HCO3_G_MOL};
use crate::properties::scales::PhScale;
use serde::Serialize;

/// Which carbonate parameter was measured.
///
/// ```
/// use travertine::Parameter;
/// assert_eq!(Parameter::Pco2.name(), "pco2");
/// assert!(Parameter::Xco2.is_gas());
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord, Serialize)]
#[serde(rename_all = "lowercase")]
#[non_exhaustive]
pub enum Parameter {
    /// Total alkalinity.
    Alkalinity,
    /// Dissolved inorganic carbon.
    Dic,
    /// pH (on a stated scale).
    Ph,
    /// Partial pressure of CO2 in air in equilibrium with the water.
    Pco2,
    /// Fugacity of CO2.
    Fco2,
    /// Mole fraction of CO2 in dry air in equilibrium with the water.
    Xco2,
    /// Dissolved CO2 plus H2CO3 (CO2*).
    Co2,
    /// Bicarbonate.
    Hco3,
    /// Carbonate.
    Co3,
}

impl Parameter {
    /// Every parameter.
    pub const ALL: [Parameter; 9] = [
        Parameter::Alkalinity,
        Parameter::Dic,
        Parameter::Ph,
        Parameter::Pco2,
        Parameter::Fco2,
        Parameter::Xco2,
        Parameter::Co2,
        Parameter::Hco3,
        Parameter::Co3,
    ];

    /// The plain name, as on the command line (without the dashes).
    ///
    /// ```
    /// # use travertine::Parameter;
    /// assert_eq!(Parameter::Hco3.name(), "hco3");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            Parameter::Alkalinity => "alkalinity",
            Parameter::Dic => "dic",
            Parameter::Ph => "ph",
            Parameter::Pco2 => "pco2",
            Parameter::Fco2 => "fco2",
            Parameter::Xco2 => "xco2",
            Parameter::Co2 => "co2",
            Parameter::Hco3 => "hco3",
            Parameter::Co3 => "co3",
        }
    }

    /// The field of this parameter, as errors name it.
    ///
    /// ```
    /// use travertine::{base::field::Field, Parameter};
    /// assert_eq!(Parameter::Dic.field(), Field::Dic);
    /// assert_eq!(Parameter::Dic.field().name(), Parameter::Dic.name());
    /// ```
    pub fn field(self) -> Field {
        match self {
            Parameter::Alkalinity => Field::Alkalinity,
            Parameter::Dic => Field::Dic,
            Parameter::Ph => Field::Ph,
            Parameter::Pco2 => Field::Pco2,
            Parameter::Fco2 => Field::Fco2,
            Parameter::Xco2 => Field::Xco2,
            Parameter::Co2 => Field::Co2,
            Parameter::Hco3 => Field::Hco3,
            Parameter::Co3 => Field::Co3,
        }
    }

    /// pCO2, fCO2, xCO2 and CO2* all fix the dissolved CO2: they carry the
    /// same information.
    ///
    /// ```
    /// # use travertine::Parameter;
    /// assert!(Parameter::Co2.is_gas() && !Parameter::Dic.is_gas());
    /// ```
    pub fn is_gas(self) -> bool {
        matches!(
            self,
            Parameter::Pco2 | Parameter::Fco2 | Parameter::Xco2 | Parameter::Co2
        )
    }

    /// Whether two parameters make a pair: two different ones, not two
    /// that each fix the dissolved CO2 (pCO2, fCO2, xCO2, CO2*). The rule
    /// behind [`check_pair`], for choosing a pair before any value is read.
    ///
    /// ```
    /// use travertine::Parameter;
    /// assert!(Parameter::Alkalinity.pairs_with(Parameter::Ph));
    /// assert!(!Parameter::Pco2.pairs_with(Parameter::Co2));
    /// assert!(!Parameter::Dic.pairs_with(Parameter::Dic));
    /// ```
    pub fn pairs_with(self, other: Parameter) -> bool {
        self != other && !(self.is_gas() && other.is_gas())
    }

    /// The units this parameter accepts.
    ///
    /// ```
    /// # use travertine::{Parameter, units::Unit};
    /// assert!(Parameter::Alkalinity.accepted_units().contains(&Unit::MgPerLCaCO3));
    /// assert!(Parameter::Ph.accepted_units().is_empty());
    /// ```
    pub fn accepted_units(self) -> Vec<Unit> {
        match self {
            Parameter::Alkalinity => units_with(Unit::MgPerLCaCO3),
            Parameter::Dic => units_with(Unit::MgPerLC),
            Parameter::Co2 => units_with(Unit::MgPerLCO2),
            Parameter::Hco3 => units_with(Unit::MgPerLHCO3),
            Parameter::Co3 => units_with(Unit::MgPerLCO3),
            Parameter::Pco2 | Parameter::Fco2 => vec![Unit::Uatm, Unit::Atm, Unit::Pa, Unit::KPa],
            Parameter::Xco2 => vec![Unit::Ppm],
            Parameter::Ph => Vec::new(),
        }
    }

    /// Whether this parameter accepts `unit` (no allocation).
    ///
    /// ```
    /// # use travertine::{Parameter, units::Unit};
    /// assert!(Parameter::Dic.accepts(Unit::MgPerLC));
    /// assert!(!Parameter::Dic.accepts(Unit::MgPerLCaCO3));
    /// ```
    pub fn accepts(self, unit: Unit) -> bool {
        match self {
            Parameter::Ph => false,
            Parameter::Pco2 | Parameter::Fco2 => {
                matches!(unit, Unit::Uatm | Unit::Atm | Unit::Pa | Unit::KPa)
            }
            Parameter::Xco2 => unit == Unit::Ppm,
            _ => crate::base::units::MOLAR_UNITS.contains(&unit) || unit == self.mass_unit().0,
        }
    }

    pub(crate) fn mass_unit(self) -> (Unit, f64) {
        match self {
            Parameter::Alkalinity => (Unit::MgPerLCaCO3, CACO3_G_EQ),
            Parameter::Dic => (Unit::MgPerLC, C_G_MOL),
            Parameter::Co2 => (Unit::MgPerLCO2, CO2_G_MOL),
            Parameter::Hco3 => (Unit::MgPerLHCO3, HCO3_G_MOL),
            Parameter::Co3 => (Unit::MgPerLCO3, CO3_G_MOL),
            _ => (Unit::MgPerLC, 1.0),
        }
    }

    /// Accepted range in µmol/kg (concentrations), µatm (pCO2, fCO2), ppm
    /// (xCO2) or pH units.
    ///
    /// ```
    /// # use travertine::Parameter;
    /// assert_eq!(Parameter::Ph.accepted_range(), (0.0, 14.0));
    /// ```
    pub fn accepted_range(self) -> (f64, f64) {
        match self {
            Parameter::Alkalinity => (0.0, 100_000.0),
            Parameter::Dic => (1e-3, 100_000.0),
            Parameter::Co2 | Parameter::Hco3 | Parameter::Co3 => (1e-6, 100_000.0),
            Parameter::Pco2 | Parameter::Fco2 | Parameter::Xco2 => (1e-2, 1e6),
            Parameter::Ph => (0.0, 14.0),
        }
    }

    fn range_unit(self) -> &'static str {
        match self {
            Parameter::Pco2 | Parameter::Fco2 => " µatm",
            Parameter::Xco2 => " ppm",
            Parameter::Ph => "",
            _ => " µmol/kg",
        }
    }
}

/// The value of a measured parameter in base units.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub(crate) enum MeasuredValue {
    /// mol/kg or mol/L (eq for alkalinity).
    Amount(Amount),
    /// pH and its scale (`None`: the medium's default).
    Ph(f64, Option<PhScale>),
    /// atm.
    Atm(f64),
    /// Mole fraction in dry air.
    MoleFraction(f64),
}

/// One measured carbonate parameter with its value, validated.
///
/// # Example
/// ```
/// use travertine::{Measured, Parameter};
/// let ta = Measured::parse(Parameter::Alkalinity, "120 mg/L as CaCO3")?;
/// assert_eq!(ta.parameter(), Parameter::Alkalinity);
/// assert!(Measured::parse(Parameter::Alkalinity, "120").is_err()); // no unit
/// assert!(Measured::ph(20.0, None).is_err());
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[non_exhaustive]
pub struct Measured {
    parameter: Parameter,
    value: MeasuredValue,
}

impl Measured {
    /// A measured parameter from a quantity with its unit.
    ///
    /// # Errors
    /// [`Error::WrongUnit`] for a unit the parameter does not accept;
    /// [`Error::OutOfRange`] or [`Error::NotFinite`] for a bad value.
    /// For pH use [`Measured::ph`].
    ///
    /// ```
    /// # use travertine::{Measured, Parameter, units::{Quantity, Unit}};
    /// let m = Measured::new(Parameter::Pco2, Quantity::new(410.0, Unit::Uatm))?;
    /// assert_eq!(m.parameter(), Parameter::Pco2);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn new(parameter: Parameter, quantity: Quantity) -> Result<Self> {
        let field = parameter.field();
        if !parameter.accepts(quantity.unit) {
            let accepted = parameter.accepted_units();
            return Err(Error::WrongUnit {
                field,
                unit: quantity.unit.spelling().to_string(),
                accepted: if accepted.is_empty() {
                    "a plain number".to_string()
                } else {
                    list_units(&accepted)
                },
            });
        }
        if !quantity.value.is_finite() {
            return Err(Error::NotFinite {
                field,
                value: quantity.value,
            });
        }
        let (min, max) = parameter.accepted_range();
        let unit = parameter.range_unit();
        // A value out of range is echoed as typed, in its unit, with the
        // range converted to that unit.
        let typed = |e: Error, checked_per_unit: f64| {
            e.in_typed_unit(quantity.value, quantity.unit.spelling(), checked_per_unit)
        };
        let value = match parameter {
            Parameter::Pco2 | Parameter::Fco2 => {
                let atm_per_unit = match quantity.unit {
                    Unit::Uatm => 1e-6,
                    Unit::Atm => 1.0,
                    Unit::Pa => 1.0 / 101_325.0,
                    _ => 1000.0 / 101_325.0,
                };
                let atm = quantity.value * atm_per_unit;
                check_range(field, atm * 1e6, min, max, unit)
                    .map_err(|e| typed(e, atm_per_unit * 1e6))?;
                MeasuredValue::Atm(atm)
            }
            Parameter::Xco2 => {
                check_range(field, quantity.value, min, max, unit)?;
                MeasuredValue::MoleFraction(quantity.value * 1e-6)
            }
            _ => {
                let (mass_unit, g) = parameter.mass_unit();
                let of = |q: Quantity| {
                    Amount::from_quantity(q, mass_unit, g).ok_or_else(|| Error::WrongUnit {
                        field,
                        unit: q.unit.spelling().to_string(),
                        accepted: list_units(&parameter.accepted_units()),
                    })
                };
                let amount = of(quantity)?;
                check_range(field, amount.raw() * 1e6, min, max, unit).map_err(|e| {
                    let one = of(Quantity::new(1.0, quantity.unit)).map_or(0.0, Amount::raw);
                    typed(e, one * 1e6)
                })?;
                MeasuredValue::Amount(amount)
            }
        };
        Ok(Self { parameter, value })
    }

    /// Parses text such as "2300umol/kg", "120 mg/L CaCO3" or, for pH, "8.1".
    ///
    /// # Errors
    /// As [`Quantity::parse`] and [`Measured::new`].
    ///
    /// ```
    /// # use travertine::{Measured, Parameter};
    /// assert!(Measured::parse(Parameter::Dic, "2.1 mmol/kg").is_ok());
    /// assert!(Measured::parse(Parameter::Ph, "7.9").is_ok());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn parse(parameter: Parameter, text: &str) -> Result<Self> {
        if parameter == Parameter::Ph {
            let v = crate::base::error::plain_number(Field::Ph, text)?;
            return Measured::ph(v, None);
        }
        let q = Quantity::parse(parameter.field(), text, &parameter.accepted_units())?;
        Measured::new(parameter, q)
    }

    /// A pH on a scale; `None` takes the medium's default scale (total in
    /// saline water).
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside 0 to 14, [`Error::NotFinite`] for NaN.
    ///
    /// ```
    /// # use travertine::{Measured, PhScale};
    /// assert!(Measured::ph(8.05, Some(PhScale::Total)).is_ok());
    /// assert!(Measured::ph(-1.0, None).is_err());
    /// ```
    pub fn ph(value: f64, scale: Option<PhScale>) -> Result<Self> {
        let (min, max) = Parameter::Ph.accepted_range();
        check_range(Field::Ph, value, min, max, "")?;
        Ok(Self {
            parameter: Parameter::Ph,
            value: MeasuredValue::Ph(value, scale),
        })
    }

    /// Total alkalinity in µmol/kg.
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside 0 to 100 000 µmol/kg.
    ///
    /// ```
    /// # use travertine::Measured;
    /// assert!(Measured::alkalinity_umol_kg(2300.0).is_ok());
    /// assert!(Measured::alkalinity_umol_kg(-5.0).is_err());
    /// ```
    pub fn alkalinity_umol_kg(value: f64) -> Result<Self> {
        Measured::new(Parameter::Alkalinity, Quantity::new(value, Unit::UmolPerKg))
    }

    /// Total alkalinity in any unit it accepts ([`Parameter::accepted_units`]), so
    /// that trade units need no conversion by hand.
    ///
    /// # Errors
    /// As [`Measured::new`]: a unit it does not accept, or a value out of range.
    ///
    /// ```
    /// use travertine::{units::Unit, Measured};
    /// assert!(Measured::alkalinity(85.0, Unit::MgPerLCaCO3).is_ok());
    /// ```
    pub fn alkalinity(value: f64, unit: Unit) -> Result<Self> {
        Measured::new(Parameter::Alkalinity, Quantity::new(value, unit))
    }

    /// DIC in any unit it accepts ([`Parameter::accepted_units`]), so
    /// that trade units need no conversion by hand.
    ///
    /// # Errors
    /// As [`Measured::new`]: a unit it does not accept, or a value out of range.
    ///
    /// ```
    /// use travertine::{units::Unit, Measured};
    /// assert!(Measured::dic(24.0, Unit::MgPerLC).is_ok());
    /// ```
    pub fn dic(value: f64, unit: Unit) -> Result<Self> {
        Measured::new(Parameter::Dic, Quantity::new(value, unit))
    }

    /// CO2 partial pressure in any unit it accepts ([`Parameter::accepted_units`]), so
    /// that trade units need no conversion by hand.
    ///
    /// # Errors
    /// As [`Measured::new`]: a unit it does not accept, or a value out of range.
    ///
    /// ```
    /// use travertine::{units::Unit, Measured};
    /// assert!(Measured::pco2(0.041, Unit::KPa).is_ok());
    /// ```
    pub fn pco2(value: f64, unit: Unit) -> Result<Self> {
        Measured::new(Parameter::Pco2, Quantity::new(value, unit))
    }

    /// CO2 fugacity in any unit it accepts ([`Parameter::accepted_units`]), so
    /// that trade units need no conversion by hand.
    ///
    /// # Errors
    /// As [`Measured::new`]: a unit it does not accept, or a value out of range.
    ///
    /// ```
    /// use travertine::{units::Unit, Measured};
    /// assert!(Measured::fco2(410.0, Unit::Uatm).is_ok());
    /// ```
    pub fn fco2(value: f64, unit: Unit) -> Result<Self> {
        Measured::new(Parameter::Fco2, Quantity::new(value, unit))
    }

    /// CO2 mole fraction in dry air in any unit it accepts ([`Parameter::accepted_units`]), so
    /// that trade units need no conversion by hand.
    ///
    /// # Errors
    /// As [`Measured::new`]: a unit it does not accept, or a value out of range.
    ///
    /// ```
    /// use travertine::{units::Unit, Measured};
    /// assert!(Measured::xco2(415.0, Unit::Ppm).is_ok());
    /// ```
    pub fn xco2(value: f64, unit: Unit) -> Result<Self> {
        Measured::new(Parameter::Xco2, Quantity::new(value, unit))
    }

    /// Dissolved CO2* in any unit it accepts ([`Parameter::accepted_units`]), so
    /// that trade units need no conversion by hand.
    ///
    /// # Errors
    /// As [`Measured::new`]: a unit it does not accept, or a value out of range.
    ///
    /// ```
    /// use travertine::{units::Unit, Measured};
    /// assert!(Measured::co2(2.5, Unit::MgPerLCO2).is_ok());
    /// ```
    pub fn co2(value: f64, unit: Unit) -> Result<Self> {
        Measured::new(Parameter::Co2, Quantity::new(value, unit))
    }

    /// Bicarbonate in any unit it accepts ([`Parameter::accepted_units`]), so
    /// that trade units need no conversion by hand.
    ///
    /// # Errors
    /// As [`Measured::new`]: a unit it does not accept, or a value out of range.
    ///
    /// ```
    /// use travertine::{units::Unit, Measured};
    /// assert!(Measured::hco3(100.0, Unit::MgPerLHCO3).is_ok());
    /// ```
    pub fn hco3(value: f64, unit: Unit) -> Result<Self> {
        Measured::new(Parameter::Hco3, Quantity::new(value, unit))
    }

    /// Carbonate in any unit it accepts ([`Parameter::accepted_units`]), so
    /// that trade units need no conversion by hand.
    ///
    /// # Errors
    /// As [`Measured::new`]: a unit it does not accept, or a value out of range.
    ///
    /// ```
    /// use travertine::{units::Unit, Measured};
    /// assert!(Measured::co3(0.5, Unit::MgPerLCO3).is_ok());
    /// ```
    pub fn co3(value: f64, unit: Unit) -> Result<Self> {
        Measured::new(Parameter::Co3, Quantity::new(value, unit))
    }

    /// DIC in µmol/kg.
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside 0.001 to 100 000 µmol/kg.
    ///
    /// ```
    /// # use travertine::Measured;
    /// assert!(Measured::dic_umol_kg(2000.0).is_ok());
    /// ```
    pub fn dic_umol_kg(value: f64) -> Result<Self> {
        Measured::new(Parameter::Dic, Quantity::new(value, Unit::UmolPerKg))
    }

    /// pCO2 in µatm.
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside 0.01 to 1 000 000 µatm.
    ///
    /// ```
    /// # use travertine::Measured;
    /// assert!(Measured::pco2_uatm(410.0).is_ok());
    /// ```
    pub fn pco2_uatm(value: f64) -> Result<Self> {
        Measured::new(Parameter::Pco2, Quantity::new(value, Unit::Uatm))
    }

    /// fCO2 in µatm.
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside 0.01 to 1 000 000 µatm.
    ///
    /// ```
    /// # use travertine::Measured;
    /// assert!(Measured::fco2_uatm(400.0).is_ok());
    /// ```
    pub fn fco2_uatm(value: f64) -> Result<Self> {
        Measured::new(Parameter::Fco2, Quantity::new(value, Unit::Uatm))
    }

    /// xCO2 of dry air in ppm.
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside 0.01 to 1 000 000 ppm.
    ///
    /// ```
    /// # use travertine::Measured;
    /// assert!(Measured::xco2_ppm(420.0).is_ok());
    /// ```
    pub fn xco2_ppm(value: f64) -> Result<Self> {
        Measured::new(Parameter::Xco2, Quantity::new(value, Unit::Ppm))
    }

    /// Dissolved CO2* in µmol/kg.
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside 1e-6 to 100 000 µmol/kg.
    ///
    /// ```
    /// # use travertine::Measured;
    /// assert!(Measured::co2_umol_kg(11.4).is_ok());
    /// ```
    pub fn co2_umol_kg(value: f64) -> Result<Self> {
        Measured::new(Parameter::Co2, Quantity::new(value, Unit::UmolPerKg))
    }

    /// Bicarbonate in µmol/kg.
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside 1e-6 to 100 000 µmol/kg.
    ///
    /// ```
    /// # use travertine::Measured;
    /// assert!(Measured::hco3_umol_kg(1777.7).is_ok());
    /// ```
    pub fn hco3_umol_kg(value: f64) -> Result<Self> {
        Measured::new(Parameter::Hco3, Quantity::new(value, Unit::UmolPerKg))
    }

    /// Carbonate in µmol/kg.
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside 1e-6 to 100 000 µmol/kg.
    ///
    /// ```
    /// # use travertine::Measured;
    /// assert!(Measured::co3_umol_kg(210.9).is_ok());
    /// ```
    pub fn co3_umol_kg(value: f64) -> Result<Self> {
        Measured::new(Parameter::Co3, Quantity::new(value, Unit::UmolPerKg))
    }

    /// A concentration parameter (alkalinity, DIC, CO2*, HCO3-, CO3--)
    /// from mol/kg, checked against its accepted range: the internal route
    /// for derived solves, which hold their amounts in mol/kg.
    pub(crate) fn per_kg(parameter: Parameter, mol_kg: f64) -> Result<Self> {
        Measured::new(parameter, Quantity::new(mol_kg * 1e6, Unit::UmolPerKg))
    }

    /// A pH whose scale is unstated, given `scale`; anything else unchanged.
    pub(crate) fn with_scale_if_unstated(self, scale: PhScale) -> Self {
        match self.value {
            MeasuredValue::Ph(v, None) => Self {
                value: MeasuredValue::Ph(v, Some(scale)),
                ..self
            },
            _ => self,
        }
    }

    /// Which parameter this is.
    ///
    /// ```
    /// # use travertine::{Measured, Parameter};
    /// assert_eq!(Measured::dic_umol_kg(2000.0)?.parameter(), Parameter::Dic);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn parameter(&self) -> Parameter {
        self.parameter
    }

    pub(crate) fn value(&self) -> MeasuredValue {
        self.value
    }

    /// The value as a number in the parameter's own unit: pH units, µmol/kg
    /// (µmol/L for an amount given per litre), µatm for pCO2 and fCO2, ppm
    /// for xCO2. The unit of an absolute uncertainty of this parameter.
    ///
    /// ```
    /// # use travertine::Measured;
    /// assert_eq!(Measured::ph(7.9, None)?.number(), 7.9);
    /// assert!((Measured::dic_umol_kg(2000.0)?.number() - 2000.0).abs() < 1e-9);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn number(&self) -> f64 {
        match self.value {
            MeasuredValue::Amount(a) => a.raw() * 1e6,
            MeasuredValue::Ph(v, _) => v,
            MeasuredValue::Atm(v) | MeasuredValue::MoleFraction(v) => v * 1e6,
        }
    }

    /// The same parameter (and pH scale, or per-kg or per-litre basis) with
    /// another value, a number in the unit of [`Measured::number`], checked
    /// as a new measurement is.
    ///
    /// # Errors
    /// As [`Measured::new`]: [`Error::OutOfRange`] or [`Error::NotFinite`].
    ///
    /// ```
    /// # use travertine::Measured;
    /// let ph = Measured::ph(7.9, None)?;
    /// assert_eq!(ph.with_number(7.91)?.number(), 7.91);
    /// assert!(ph.with_number(-0.5).is_err());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_number(&self, number: f64) -> Result<Self> {
        let unit = match self.value {
            MeasuredValue::Ph(_, scale) => return Measured::ph(number, scale),
            MeasuredValue::Amount(Amount::PerKg(_)) => Unit::UmolPerKg,
            MeasuredValue::Amount(Amount::PerLitre(_)) => Unit::UmolPerL,
            MeasuredValue::Atm(_) => Unit::Uatm,
            MeasuredValue::MoleFraction(_) => Unit::Ppm,
        };
        Measured::new(self.parameter, Quantity::new(number, unit))
    }

    /// The value as a user would read it, with its unit.
    ///
    /// ```
    /// # use travertine::Measured;
    /// assert_eq!(Measured::dic_umol_kg(2000.0)?.describe(), "2000 µmol/kg");
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn describe(&self) -> String {
        match self.value {
            MeasuredValue::Amount(Amount::PerKg(v)) => format!("{} µmol/kg", round_sig(v * 1e6)),
            MeasuredValue::Amount(Amount::PerLitre(v)) => format!("{} µmol/L", round_sig(v * 1e6)),
            MeasuredValue::Ph(v, Some(s)) => format!("{v} ({})", s.name()),
            MeasuredValue::Ph(v, None) => format!("{v}"),
            MeasuredValue::Atm(v) => format!("{} µatm", round_sig(v * 1e6)),
            MeasuredValue::MoleFraction(v) => format!("{} ppm", round_sig(v * 1e6)),
        }
    }
}

fn round_sig(v: f64) -> f64 {
    if v == 0.0 || !v.is_finite() {
        return v;
    }
    let mag = 10f64.powi(8 - v.abs().log10().floor() as i32);
    (v * mag).round() / mag
}

/// Checks that a pair can be used together: two different parameters, not
/// two that fix the same dissolved CO2. The one statement of the rule; the
/// command line and the sheet call it too.
///
/// # Errors
/// [`Error::IncompatiblePair`] naming both parameters and why.
///
/// ```
/// use travertine::sample::measured::check_pair;
/// use travertine::Measured;
/// let a = Measured::pco2_uatm(400.0)?;
/// assert!(check_pair(&a, &Measured::fco2_uatm(398.0)?).is_err());
/// assert!(check_pair(&a, &Measured::alkalinity_umol_kg(2300.0)?).is_ok());
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn check_pair(a: &Measured, b: &Measured) -> Result<()> {
    let (pa, pb) = (a.parameter(), b.parameter());
    if pa == pb {
        return Err(Error::IncompatiblePair {
            first: pa.field(),
            second: pb.field(),
            reason: "the same parameter twice is one measurement, and two are needed",
        });
    }
    if pa.is_gas() && pb.is_gas() {
        return Err(Error::IncompatiblePair {
            first: pa.field(),
            second: pb.field(),
            reason: "pCO2, fCO2, xCO2 and CO2* carry the same information (each fixes the \
                     dissolved CO2); pair one of them with alkalinity, DIC, pH, HCO3 or CO3",
        });
    }
    Ok(())
}

/// Whether a pair can fit two waters (alkalinity with CO3, DIC with HCO3).
pub(crate) fn is_two_root_pair(a: &Measured, b: &Measured) -> bool {
    let mut p = [a.parameter(), b.parameter()];
    p.sort();
    matches!(
        p,
        [Parameter::Alkalinity, Parameter::Co3] | [Parameter::Dic, Parameter::Hco3]
    )
}

/// The plain name, as [`Parameter::name`] gives it.
///
/// ```
/// assert_eq!(travertine::Parameter::Alkalinity.to_string(), "alkalinity");
/// ```
impl std::fmt::Display for Parameter {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}

/// A parameter by its name (`alkalinity`, `dic`, `ph`, `pco2`, `fco2`,
/// `xco2`, `co2`, `hco3`, `co3`), case-insensitive.
///
/// ```
/// use travertine::Parameter;
/// assert_eq!("DIC".parse::<Parameter>()?, Parameter::Dic);
/// assert!("salt".parse::<Parameter>().is_err());
/// # Ok::<(), travertine::Error>(())
/// ```
impl std::str::FromStr for Parameter {
    type Err = Error;
    fn from_str(s: &str) -> Result<Self> {
        let wanted = s.trim().to_ascii_lowercase();
        Parameter::ALL
            .into_iter()
            .find(|p| p.name() == wanted)
            .ok_or_else(|| Error::UnknownChoice {
                field: Field::Parameter,
                name: s.to_string(),
                accepted: Parameter::ALL.map(|p| p.name()).join(", "),
            })
    }
}
