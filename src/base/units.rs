//! Trade units at the edges: parsing "2300 umol/kg", "120 mg/L CaCO3",
//! "2.4 meq/L", "410 uatm"; conversion to the internal units (mol/kg, atm).
//!
//! Per-litre units are turned into per-kilogram ones with the density of the
//! sample (see [`crate::properties::density`]).

use crate::base::error::{Error, Result};
use crate::base::field::Field;
use serde::Serialize;

/// Molar mass of CaCO3, g/mol (IUPAC standard atomic weights).
pub const CACO3_G_MOL: f64 = 100.0869;
/// Equivalent mass of CaCO3 for alkalinity, g/eq (half the molar mass).
pub const CACO3_G_EQ: f64 = CACO3_G_MOL / 2.0;
/// Molar mass of carbon, g/mol.
pub const C_G_MOL: f64 = 12.0107;
/// Molar mass of CO2, g/mol.
pub const CO2_G_MOL: f64 = 44.0095;
/// Molar mass of HCO3-, g/mol.
pub const HCO3_G_MOL: f64 = 61.0168;
/// Molar mass of CO3--, g/mol.
pub const CO3_G_MOL: f64 = 60.0089;
/// Molar mass of calcium, g/mol.
pub const CA_G_MOL: f64 = 40.078;
/// Molar mass of nitrogen, g/mol.
pub const N_G_MOL: f64 = 14.0067;
/// Molar mass of phosphorus, g/mol.
pub const P_G_MOL: f64 = 30.973762;
/// Molar mass of silicon, g/mol.
pub const SI_G_MOL: f64 = 28.0855;
/// Molar mass of sulfur, g/mol.
pub const S_G_MOL: f64 = 32.065;
/// Molar mass of magnesium, g/mol.
pub const MG_G_MOL: f64 = 24.305;
/// Molar mass of sodium, g/mol.
pub const NA_G_MOL: f64 = 22.98977;
/// Molar mass of potassium, g/mol.
pub const K_G_MOL: f64 = 39.0983;
/// Molar mass of chloride, g/mol.
pub const CL_G_MOL: f64 = 35.453;
/// Molar mass of sulfate, g/mol.
pub const SO4_G_MOL: f64 = 96.062;
// issue 11: toxic fractions
/// Molar mass of hydrogen, g/mol.
pub const H_G_MOL: f64 = 1.00794;
/// Molar mass of NH3, g/mol (N + 3 H).
pub const NH3_G_MOL: f64 = N_G_MOL + 3.0 * H_G_MOL;
/// Molar mass of H2S, g/mol (S + 2 H).
pub const H2S_G_MOL: f64 = S_G_MOL + 2.0 * H_G_MOL;

/// A unit that a value may carry.
///
/// # Example
/// ```
/// use travertine::base::units::Unit;
/// assert_eq!(Unit::parse("µmol/kg"), Some(Unit::UmolPerKg));
/// assert_eq!(Unit::parse("mg/L as CaCO3"), Some(Unit::MgPerLCaCO3));
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize)]
#[non_exhaustive]
pub enum Unit {
    /// µmol/kg (or µeq/kg for alkalinity).
    UmolPerKg,
    /// mmol/kg (or meq/kg).
    MmolPerKg,
    /// mol/kg (or eq/kg).
    MolPerKg,
    /// µmol/L (or µeq/L).
    UmolPerL,
    /// mmol/L (or meq/L).
    MmolPerL,
    /// mol/L.
    MolPerL,
    /// mg/L as CaCO3 (alkalinity: per equivalent of 50.04 g; hardness: per mole of 100.09 g).
    MgPerLCaCO3,
    /// mg/L as C.
    MgPerLC,
    /// mg/L as CO2.
    MgPerLCO2,
    /// mg/L as HCO3-.
    MgPerLHCO3,
    /// mg/L as CO3--.
    MgPerLCO3,
    /// mg/L as Ca.
    MgPerLCa,
    /// mg/L as N.
    MgPerLN,
    /// mg/L as P.
    MgPerLP,
    /// mg/L as Si.
    MgPerLSi,
    /// mg/L as S.
    MgPerLS,
    /// µatm.
    Uatm,
    /// atm.
    Atm,
    /// Pa.
    Pa,
    /// kPa.
    KPa,
    /// ppm (µmol/mol) of dry air.
    Ppm,
    /// mg/L as Mg.
    MgPerLMg,
    /// mg/L as Na.
    MgPerLNa,
    /// mg/L as K.
    MgPerLK,
    /// mg/L as Cl.
    MgPerLCl,
    /// mg/L as SO4.
    MgPerLSO4,
    /// mg/L (total dissolved solids).
    MgPerL,
    /// µS/cm at the sample temperature.
    USPerCm,
    /// mS/cm at the sample temperature.
    MSPerCm,
    /// µS/cm compensated to 25 °C (specific conductance).
    USPerCmAt25,
    /// mS/cm compensated to 25 °C (specific conductance).
    MSPerCmAt25,
}

/// Every unit with its canonical spelling, for messages and parsing.
const SPELLINGS: &[(Unit, &str)] = &[
    (Unit::UmolPerKg, "umol/kg"),
    (Unit::MmolPerKg, "mmol/kg"),
    (Unit::MolPerKg, "mol/kg"),
    (Unit::UmolPerL, "umol/L"),
    (Unit::MmolPerL, "mmol/L"),
    (Unit::MolPerL, "mol/L"),
    (Unit::MgPerLCaCO3, "mg/L CaCO3"),
    (Unit::MgPerLC, "mg/L C"),
    (Unit::MgPerLCO2, "mg/L CO2"),
    (Unit::MgPerLHCO3, "mg/L HCO3"),
    (Unit::MgPerLCO3, "mg/L CO3"),
    (Unit::MgPerLCa, "mg/L Ca"),
    (Unit::MgPerLN, "mg/L N"),
    (Unit::MgPerLP, "mg/L P"),
    (Unit::MgPerLSi, "mg/L Si"),
    (Unit::MgPerLS, "mg/L S"),
    (Unit::Uatm, "uatm"),
    (Unit::Atm, "atm"),
    (Unit::Pa, "Pa"),
    (Unit::KPa, "kPa"),
    (Unit::Ppm, "ppm"),
    (Unit::MgPerLMg, "mg/L Mg"),
    (Unit::MgPerLNa, "mg/L Na"),
    (Unit::MgPerLK, "mg/L K"),
    (Unit::MgPerLCl, "mg/L Cl"),
    (Unit::MgPerLSO4, "mg/L SO4"),
    (Unit::MgPerL, "mg/L"),
    (Unit::USPerCm, "uS/cm"),
    (Unit::MSPerCm, "mS/cm"),
    (Unit::USPerCmAt25, "uS/cm@25C"),
    (Unit::MSPerCmAt25, "mS/cm@25C"),
];

/// Spellings accepted besides the canonical ones (after normalising).
const ALIASES: &[(&str, Unit)] = &[
    ("ueq/kg", Unit::UmolPerKg),
    ("meq/kg", Unit::MmolPerKg),
    ("eq/kg", Unit::MolPerKg),
    ("ueq/l", Unit::UmolPerL),
    ("meq/l", Unit::MmolPerL),
    ("eq/l", Unit::MolPerL),
    ("mm", Unit::MmolPerL),
    ("umol/mol", Unit::Ppm),
    ("mg/l caco3", Unit::MgPerLCaCO3),
    ("ppm caco3", Unit::MgPerLCaCO3),
    ("mg/l co2", Unit::MgPerLCO2),
    ("mg/l c", Unit::MgPerLC),
    ("mg/l hco3", Unit::MgPerLHCO3),
    ("mg/l co3", Unit::MgPerLCO3),
    ("mg/l ca", Unit::MgPerLCa),
    ("mg/l n", Unit::MgPerLN),
    ("mg/l nh3-n", Unit::MgPerLN),
    ("mg/l nh4-n", Unit::MgPerLN),
    ("mg/l tan", Unit::MgPerLN),
    ("mg/l p", Unit::MgPerLP),
    ("mg/l po4-p", Unit::MgPerLP),
    ("mg/l si", Unit::MgPerLSi),
    ("mg/l s", Unit::MgPerLS),
    ("mg/l h2s-s", Unit::MgPerLS),
    ("ppm", Unit::Ppm),
    ("us/cm at 25c", Unit::USPerCmAt25),
    ("us/cm @ 25c", Unit::USPerCmAt25),
    ("ms/cm at 25c", Unit::MSPerCmAt25),
    ("ms/cm @ 25c", Unit::MSPerCmAt25),
];

fn normalise(unit: &str) -> String {
    let mut u = unit
        .trim()
        .replace(['µ', 'μ'], "u")
        .to_ascii_lowercase()
        .replace(" as ", " ")
        .replace("per ", "/");
    if let Some(rest) = u.strip_prefix("as ") {
        u = rest.to_string();
    }
    // Collapse spaces around the slash and runs of spaces.
    let mut out = String::with_capacity(u.len());
    let mut last_space = false;
    for ch in u.chars() {
        if ch.is_whitespace() {
            last_space = true;
            continue;
        }
        if last_space && !out.is_empty() && !out.ends_with('/') && ch != '/' {
            out.push(' ');
        }
        last_space = false;
        out.push(ch);
    }
    out
}

impl Unit {
    /// Recognises a unit, case and spacing insensitive; `µ`, `μ` and `u` are
    /// the same; `as` may stand before the species ("mg/L as CaCO3").
    ///
    /// ```
    /// # use travertine::base::units::Unit;
    /// assert_eq!(Unit::parse("MEQ/L"), Some(Unit::MmolPerL));
    /// assert_eq!(Unit::parse("furlongs"), None);
    /// ```
    pub fn parse(text: &str) -> Option<Unit> {
        let n = normalise(text);
        SPELLINGS
            .iter()
            .find(|(_, s)| s.to_ascii_lowercase() == n)
            .map(|(u, _)| *u)
            .or_else(|| ALIASES.iter().find(|(s, _)| *s == n).map(|(_, u)| *u))
    }

    /// The canonical spelling.
    ///
    /// ```
    /// # use travertine::base::units::Unit;
    /// assert_eq!(Unit::MgPerLCaCO3.spelling(), "mg/L CaCO3");
    /// ```
    pub fn spelling(self) -> &'static str {
        SPELLINGS
            .iter()
            .find(|(u, _)| *u == self)
            .map(|(_, s)| *s)
            .unwrap_or("?")
    }
}

/// A number with its unit, as written by a user.
///
/// # Example
/// ```
/// use travertine::base::{field::Field, units::{Quantity, Unit}};
/// let q = Quantity::parse(Field::Alkalinity, "120 mg/L as CaCO3", &[Unit::MgPerLCaCO3])?;
/// assert_eq!(q.value, 120.0);
/// assert_eq!(q.unit, Unit::MgPerLCaCO3);
/// let q = Quantity::parse(Field::Dic, "2000umol/kg", &[Unit::UmolPerKg])?;
/// assert_eq!(q.value, 2000.0);
/// assert!(Quantity::parse(Field::Dic, "2000", &[Unit::UmolPerKg]).is_err());
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[non_exhaustive]
pub struct Quantity {
    /// The number.
    pub value: f64,
    /// Its unit.
    pub unit: Unit,
}

/// The number and its unit as a user writes them: `48 mg/L Ca`.
///
/// ```
/// use travertine::units::{Quantity, Unit};
/// assert_eq!(Quantity::new(48.0, Unit::MgPerLCa).to_string(), "48 mg/L Ca");
/// ```
impl std::fmt::Display for Quantity {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        write!(f, "{} {}", self.value, self.unit.spelling())
    }
}

/// Lists units for a message.
pub fn list_units(units: &[Unit]) -> String {
    units
        .iter()
        .map(|u| u.spelling())
        .collect::<Vec<_>>()
        .join(", ")
}

/// Length of the longest prefix of `s` that reads as a decimal number.
fn number_prefix_len(s: &str) -> usize {
    number_len(s.as_bytes())
}

/// Length of the leading decimal number of `b` (sign, digits, point,
/// digits, exponent), 0 when there is none.
pub(crate) fn number_len(b: &[u8]) -> usize {
    let mut i = 0;
    if i < b.len() && (b[i] == b'+' || b[i] == b'-') {
        i += 1;
    }
    let mut digits = 0;
    while i < b.len() && b[i].is_ascii_digit() {
        i += 1;
        digits += 1;
    }
    if i < b.len() && b[i] == b'.' {
        i += 1;
        while i < b.len() && b[i].is_ascii_digit() {
            i += 1;
            digits += 1;
        }
    }
    if digits == 0 {
        return 0;
    }
    if i < b.len() && (b[i] == b'e' || b[i] == b'E') {
        let mut j = i + 1;
        if j < b.len() && (b[j] == b'+' || b[j] == b'-') {
            j += 1;
        }
        let start = j;
        while j < b.len() && b[j].is_ascii_digit() {
            j += 1;
        }
        if j > start {
            i = j;
        }
    }
    i
}

impl Quantity {
    /// A quantity from a number and a unit.
    ///
    /// ```
    /// # use travertine::base::{field::Field, units::{Quantity, Unit}};
    /// let q = Quantity::new(2.4, Unit::MmolPerL);
    /// assert_eq!(q.unit.spelling(), "mmol/L");
    /// ```
    pub fn new(value: f64, unit: Unit) -> Self {
        Self { value, unit }
    }

    /// Parses "2300umol/kg" or "120 mg/L CaCO3" for `field`, accepting only
    /// `accepted` units.
    ///
    /// # Errors
    /// [`Error::MissingUnit`] for a bare number, [`Error::WrongUnit`] for a
    /// unit not in `accepted`, [`Error::NotANumber`] when no number leads the
    /// text, [`Error::NotFinite`] for NaN or infinities.
    ///
    /// ```
    /// # use travertine::base::{field::Field, units::{Quantity, Unit}};
    /// let e = Quantity::parse(Field::Alkalinity, "2300", &[Unit::UmolPerKg]).unwrap_err();
    /// assert!(e.to_string().contains("umol/kg"));
    /// ```
    pub fn parse(field: Field, text: &str, accepted: &[Unit]) -> Result<Self> {
        let t = text.trim();
        let n = number_prefix_len(t);
        let not_a_number = || Error::NotANumber {
            field,
            text: text.to_string(),
            slip: crate::base::error::NumberSlip::find(t),
        };
        if n == 0 {
            let lower = t.to_ascii_lowercase();
            let unsigned = lower.trim_start_matches(['+', '-']);
            let value = if unsigned.starts_with("nan") {
                f64::NAN
            } else if unsigned.starts_with("inf") {
                if lower.starts_with('-') {
                    f64::NEG_INFINITY
                } else {
                    f64::INFINITY
                }
            } else {
                return Err(not_a_number());
            };
            return Err(Error::NotFinite { field, value });
        }
        // `2,300umol/kg` or `0x8FC umol/kg`: a slip in the number, not a unit.
        if crate::base::error::NumberSlip::find(t).is_some() {
            return Err(not_a_number());
        }
        let value: f64 = t[..n].parse().map_err(|_| not_a_number())?;
        if !value.is_finite() {
            return Err(Error::NotFinite { field, value });
        }
        let rest = t[n..].trim();
        if rest.is_empty() {
            return Err(Error::MissingUnit {
                field,
                text: text.to_string(),
                accepted: list_units(accepted),
            });
        }
        match Unit::parse(rest) {
            Some(unit) if accepted.contains(&unit) => Ok(Self { value, unit }),
            _ => Err(Error::WrongUnit {
                field,
                unit: rest.to_string(),
                accepted: list_units(accepted),
            }),
        }
    }
}

/// An amount of substance per mass or per volume of water, in base units.
///
/// # Example
/// ```
/// use travertine::base::units::Amount;
/// let a = Amount::PerLitre(2.0e-3);
/// assert!((a.mol_kg(1000.0) - 2.0e-3).abs() < 1e-15);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[non_exhaustive]
pub enum Amount {
    /// mol (or eq) per kg of solution.
    PerKg(f64),
    /// mol (or eq) per litre of solution.
    PerLitre(f64),
}

impl Amount {
    /// In mol/kg, using the solution density in kg/m³ for per-litre amounts.
    ///
    /// ```
    /// # use travertine::base::units::Amount;
    /// assert_eq!(Amount::PerKg(1e-3).mol_kg(1025.0), 1e-3);
    /// ```
    pub fn mol_kg(self, density_kg_m3: f64) -> f64 {
        match self {
            Amount::PerKg(v) => v,
            Amount::PerLitre(v) => v * 1000.0 / density_kg_m3,
        }
    }

    /// The amount from a quantity of a species whose mass-concentration unit
    /// is `mass_unit` with molar (or equivalent) mass `g_per_mol`. Returns
    /// `None` for units that are not concentrations.
    ///
    /// ```
    /// # use travertine::base::units::{Amount, Quantity, Unit, CACO3_G_EQ};
    /// let a = Amount::from_quantity(Quantity::new(100.0, Unit::MgPerLCaCO3), Unit::MgPerLCaCO3, CACO3_G_EQ);
    /// assert!(matches!(a, Some(Amount::PerLitre(v)) if (v - 1.998e-3).abs() < 1e-6));
    /// ```
    pub fn from_quantity(q: Quantity, mass_unit: Unit, g_per_mol: f64) -> Option<Amount> {
        let v = q.value;
        Some(match q.unit {
            Unit::UmolPerKg => Amount::PerKg(v * 1e-6),
            Unit::MmolPerKg => Amount::PerKg(v * 1e-3),
            Unit::MolPerKg => Amount::PerKg(v),
            Unit::UmolPerL => Amount::PerLitre(v * 1e-6),
            Unit::MmolPerL => Amount::PerLitre(v * 1e-3),
            Unit::MolPerL => Amount::PerLitre(v),
            u if u == mass_unit => Amount::PerLitre(v * 1e-3 / g_per_mol),
            _ => return None,
        })
    }

    /// The raw value in mol/kg or mol/L, whichever it is.
    ///
    /// ```
    /// # use travertine::base::units::Amount;
    /// assert_eq!(Amount::PerLitre(3.0).raw(), 3.0);
    /// ```
    pub fn raw(self) -> f64 {
        match self {
            Amount::PerKg(v) | Amount::PerLitre(v) => v,
        }
    }
}

/// The molar-amount units every concentration field accepts.
pub const MOLAR_UNITS: [Unit; 6] = [
    Unit::UmolPerKg,
    Unit::MmolPerKg,
    Unit::MolPerKg,
    Unit::UmolPerL,
    Unit::MmolPerL,
    Unit::MolPerL,
];

/// Molar units plus one mass-concentration unit.
pub fn units_with(mass_unit: Unit) -> Vec<Unit> {
    let mut v = MOLAR_UNITS.to_vec();
    v.push(mass_unit);
    v
}

/// The unit as written in messages: `mg/L CaCO3`.
///
/// ```
/// use travertine::units::Unit;
/// assert_eq!(Unit::MgPerLCaCO3.to_string(), Unit::MgPerLCaCO3.spelling());
/// ```
impl std::fmt::Display for Unit {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.spelling())
    }
}

/// A unit from its spellings, as [`Unit::parse`] reads them.
///
/// ```
/// use travertine::units::Unit;
/// assert_eq!("umol/kg".parse::<Unit>()?, Unit::UmolPerKg);
/// assert!("furlongs".parse::<Unit>().is_err());
/// # Ok::<(), travertine::Error>(())
/// ```
impl std::str::FromStr for Unit {
    type Err = Error;
    fn from_str(s: &str) -> Result<Self> {
        Unit::parse(s).ok_or_else(|| Error::UnknownChoice {
            field: crate::base::field::Field::Unit,
            name: s.to_string(),
            accepted: "a unit such as umol/kg, mmol/L, mg/L CaCO3, uatm or ppm".to_string(),
        })
    }
}
