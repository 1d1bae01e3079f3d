//! Reading a standard uncertainty as a user writes it, `NAME=VALUE`, for
//! the command line, the field sheet and later bindings alike (issue 13).
//!
//! - **NAME** is an input as its command-line flag or its canonical sheet
//!   column names it (`ph`, `alkalinity`, `alkalinity_mg_l_caco3`,
//!   `temperature`, `calcium`, `wind`, ...; every carbonate parameter and
//!   every input of [`INPUT_SOURCES`]), or a constant: `pk0`, `pk1`, `pk2`,
//!   `pkb`, `pkw`, `pksp_calcite`, `pksp_aragonite`, `boron_total` and the
//!   others of [`ConstantName::ALL`] (`pks`, `pkf`, `pkp1`, ..., `pknh4`,
//!   `pkh2s`). Case and `-`/`_` do not matter. An input may also be named
//!   by any column name with its unit, as a sheet header or a binding's
//!   input names it (`alkalinity_umol_kg`, `ph_total`, `temperature_f`,
//!   `Alkalinity (mg/L as CaCO3)`): a bare number is then in that unit, as
//!   in the column's `<column>_u` cell (`alkalinity_umol_kg=2` is
//!   2 µmol/kg, `temperature_f=0.18` is 0.1 °C).
//! - **VALUE** is relative, `2%` (of the value; of K itself for a
//!   constant), or absolute in one of the input's own units: a pH in pH
//!   units (`0.01`), a temperature in °C (`0.1`, or `0.2 °F` as a
//!   difference), a salinity as a plain number, a conductivity with its
//!   unit (`10uS/cm`, `0.01 mS/cm`; µS/cm@25C too, the same size), an
//!   ionic strength in mol/kg (`0.0005`, or `0.5 mmol/kg`), an amount with its unit
//!   (`2umol/kg`, `1 mg/L CaCO3`, `0.05 mg/L N`), a gas in µatm, atm, Pa or
//!   kPa, the wind in m/s or km/h, a constant in pK units, the total boron
//!   with its unit (`4 umol/kg`).
//!
//! A [`Setting`] is read without the sample; [`Setting::resolve`] turns it
//! into the [`Size`] of [`Uncertainties`] for the pair measured (an amount
//! per litre against one per kg goes through the water's density).
//!
//! ```
//! use travertine::decisions::uncertainty_settings::Setting;
//! let s: Setting = "alkalinity=2umol/kg".parse()?;
//! assert_eq!(s.name(), "alkalinity");
//! let e = "pk3=0.01".parse::<Setting>().unwrap_err();
//! assert!(e.to_string().contains("pk3"));
//! # Ok::<(), travertine::decisions::uncertainty_settings::SettingError>(())
//! ```

use crate::base::units::{list_units, number_len, Amount, Quantity, Unit};
use crate::decisions::uncertainty::{Size, Source, Uncertainties, INPUT_SOURCES};
use crate::medium::ConstantName;
use crate::sample::inputs::{Input, Total, INPUTS};
use crate::sample::measured::{Measured, MeasuredValue, Parameter};
use crate::sample::values::{Conductivity, CONDUCTIVITY_UNITS};
use thiserror::Error;

/// A setting that cannot be read or used. Each variant names the setting
/// as typed, and [`SettingError::code`] gives a stable snake_case code.
#[derive(Debug, Clone, PartialEq, Error)]
#[non_exhaustive]
pub enum SettingError {
    /// No `=` between the name and the value.
    #[error("uncertainty `{setting}`: write NAME=VALUE, such as ph=0.01, alkalinity=2umol/kg or pk1=0.01")]
    NoEquals {
        /// The setting as typed.
        setting: String,
    },
    /// A name that is neither an input whose uncertainty is propagated nor
    /// a constant.
    #[error("uncertainty `{setting}`: `{name}` is not an input or constant with an uncertainty{}; accepted: {accepted}", hint.as_ref().map(|h| format!(" (did you mean `{h}`?)")).unwrap_or_default())]
    UnknownName {
        /// The setting as typed.
        setting: String,
        /// The name as typed.
        name: String,
        /// The nearest accepted name, where one is close.
        hint: Option<String>,
        /// The accepted names.
        accepted: String,
    },
    /// A value that does not read in the units of its name.
    #[error("uncertainty `{setting}`: `{value}` is not an uncertainty of {name}; accepted: {accepted}, or a percentage such as 2%")]
    BadValue {
        /// The setting as typed.
        setting: String,
        /// The name, as the setting names it.
        name: String,
        /// The value as typed.
        value: String,
        /// The units the name accepts.
        accepted: String,
    },
    /// A value below zero or not finite.
    #[error("uncertainty `{setting}`: {value} is out of range: a standard uncertainty is finite and 0 or more")]
    OutOfRange {
        /// The setting as typed.
        setting: String,
        /// The number read.
        value: f64,
    },
    /// A carbonate parameter that is not one of the pair measured.
    #[error("uncertainty `{setting}`: {name} was not measured; the pair is {pair}")]
    NotMeasured {
        /// The setting as typed.
        setting: String,
        /// The parameter.
        name: String,
        /// The pair measured.
        pair: String,
    },
}

impl SettingError {
    /// A stable snake_case code.
    ///
    /// ```
    /// # use travertine::decisions::uncertainty_settings::Setting;
    /// assert_eq!("ph".parse::<Setting>().unwrap_err().code(), "uncertainty_no_equals");
    /// ```
    pub fn code(&self) -> &'static str {
        match self {
            SettingError::NoEquals { .. } => "uncertainty_no_equals",
            SettingError::UnknownName { .. } => "uncertainty_unknown_name",
            SettingError::BadValue { .. } => "uncertainty_bad_value",
            SettingError::OutOfRange { .. } => "uncertainty_out_of_range",
            SettingError::NotMeasured { .. } => "uncertainty_not_measured",
        }
    }

    /// The setting as typed.
    ///
    /// ```
    /// # use travertine::decisions::uncertainty_settings::Setting;
    /// assert_eq!("ph=x".parse::<Setting>().unwrap_err().setting(), "ph=x");
    /// ```
    pub fn setting(&self) -> &str {
        match self {
            SettingError::NoEquals { setting }
            | SettingError::UnknownName { setting, .. }
            | SettingError::BadValue { setting, .. }
            | SettingError::OutOfRange { setting, .. }
            | SettingError::NotMeasured { setting, .. } => setting,
        }
    }
}

/// What a setting gives the uncertainty of.
///
/// ```
/// use travertine::decisions::uncertainty_settings::Target;
/// use travertine::medium::ConstantName;
/// assert_eq!(Target::from_name("PKsp-Calcite"), Some(Target::Constant(ConstantName::KspCalcite)));
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum Target {
    /// An input: a carbonate parameter or one of [`INPUT_SOURCES`].
    Input(Input),
    /// A constant (its pK), or the total boron.
    Constant(ConstantName),
}

/// A name as compared: lower case, `-` and spaces as `_`.
fn normal(name: &str) -> String {
    name.trim()
        .to_lowercase()
        .chars()
        .map(|c| if c == '-' || c == ' ' { '_' } else { c })
        .collect()
}

/// The setting name of a constant: `pk1`, `pksp_calcite`, `boron_total`.
///
/// ```
/// use travertine::decisions::uncertainty_settings::constant_name;
/// use travertine::medium::ConstantName;
/// assert_eq!(constant_name(ConstantName::Kh2s), "pkh2s");
/// assert_eq!(constant_name(ConstantName::BoronTotal), "boron_total");
/// ```
pub fn constant_name(c: ConstantName) -> String {
    match c {
        ConstantName::BoronTotal => "boron_total".to_string(),
        c => format!("p{}", normal(c.name())),
    }
}

/// The inputs whose uncertainty a setting may give: every carbonate
/// parameter, then [`INPUT_SOURCES`], in the order of the list of inputs.
fn inputs() -> impl Iterator<Item = &'static crate::sample::inputs::InputSpec> {
    INPUTS
        .iter()
        .filter(|s| matches!(s.input, Input::Carbon(_)) || INPUT_SOURCES.contains(&s.input))
}

impl Target {
    /// The target a name gives: an input's flag, canonical column or any
    /// column name with its unit (`alkalinity_umol_kg`, `ph_total`), or a
    /// constant's name ([`constant_name`]; the total boron also as the
    /// input `boron-total` names it). `None` for any other name.
    ///
    /// ```
    /// use travertine::decisions::uncertainty_settings::Target;
    /// let alk = Target::from_name("alkalinity");
    /// assert!(alk.is_some());
    /// assert_eq!(Target::from_name("alkalinity_umol_kg"), alk);
    /// assert_eq!(Target::from_name("Alkalinity (mg/L as CaCO3)"), alk);
    /// assert_eq!(Target::from_name("colour"), None);
    /// ```
    pub fn from_name(name: &str) -> Option<Target> {
        Target::by_flag_or_constant(name).or_else(|| Target::column(name).map(|(t, _)| t))
    }

    /// The target of a flag, a canonical column or a constant's name.
    fn by_flag_or_constant(name: &str) -> Option<Target> {
        let n = normal(name);
        if let Some(spec) = inputs().find(|s| normal(s.flag) == n || normal(s.column) == n) {
            return Some(Target::Input(spec.input));
        }
        let boron = Input::Total(Total::Boron);
        if n == normal(boron.flag()) || n == normal(boron.column()) {
            return Some(Target::Constant(ConstantName::BoronTotal));
        }
        ConstantName::ALL
            .iter()
            .find(|c| constant_name(**c) == n)
            .map(|c| Target::Constant(*c))
    }

    /// The target of a column's name with its unit (`alkalinity_umol_kg`,
    /// `temperature_f`), and the name as found; `None` for a flag, which
    /// keeps the unit in the value.
    fn column(name: &str) -> Option<(Target, crate::sample::inputs::NamedInput)> {
        if inputs().any(|s| normal(s.flag) == normal(name)) {
            return None;
        }
        crate::sample::inputs::NamedInput::find(name.trim())
            .ok()
            .filter(|n| !n.takes_name())
            .and_then(|n| Target::by_flag_or_constant(n.input().flag()).map(|t| (t, n)))
    }

    /// The name as a setting writes it: the input's flag, or
    /// [`constant_name`].
    ///
    /// ```
    /// # use travertine::decisions::uncertainty_settings::Target;
    /// # use travertine::sample::inputs::Input;
    /// assert_eq!(Target::Input(Input::Temperature).name(), "temperature");
    /// ```
    pub fn name(self) -> String {
        match self {
            Target::Input(i) => i.flag().to_string(),
            Target::Constant(c) => constant_name(c),
        }
    }

    /// The source of [`crate::decisions::uncertainty`] it gives.
    pub fn source(self) -> Source {
        match self {
            Target::Input(i) => Source::Input(i),
            Target::Constant(c) => Source::Constant(c),
        }
    }

    /// The units an absolute value may be written in, for messages.
    ///
    /// ```
    /// # use travertine::decisions::uncertainty_settings::Target;
    /// # use travertine::medium::ConstantName;
    /// assert!(Target::Constant(ConstantName::K1).units().contains("pK"));
    /// ```
    pub fn units(self) -> String {
        match self {
            Target::Input(Input::Carbon(Parameter::Ph)) => "pH units (a plain number)".into(),
            Target::Input(Input::Carbon(p)) => list_units(&p.accepted_units()),
            Target::Input(Input::Total(t)) => list_units(&t.units()),
            Target::Input(Input::Temperature) => "°C (a plain number), K, °F".into(),
            Target::Input(Input::Salinity) => "practical salinity (a plain number)".into(),
            Target::Input(Input::Conductivity) => format!(
                "{} (a unit is needed; the uncertainty is in the reading's own terms, at the \
                 sample temperature or at 25 °C as it was given)",
                list_units(&CONDUCTIVITY_UNITS)
            ),
            Target::Input(Input::IonicStrength) => "mol/kg (a plain number), mmol/kg".into(),
            Target::Input(Input::Tds) => "mg/L (a plain number), g/L".into(),
            Target::Input(Input::Wind) => "m/s (a plain number), km/h".into(),
            Target::Input(_) => "a plain number".into(),
            Target::Constant(ConstantName::BoronTotal) => {
                "umol/kg, mmol/kg, mol/kg (a unit is needed)".into()
            }
            Target::Constant(_) => "pK units (a plain number)".into(),
        }
    }
}

/// Every name a setting accepts, for messages: each input's flag and each
/// constant's name.
///
/// ```
/// use travertine::decisions::uncertainty_settings::accepted_names;
/// let names = accepted_names();
/// assert!(names.contains(&"ph".to_string()) && names.contains(&"pksp_aragonite".to_string()));
/// ```
pub fn accepted_names() -> Vec<String> {
    inputs()
        .map(|s| s.flag.to_string())
        .chain(ConstantName::ALL.iter().map(|c| constant_name(*c)))
        .collect()
}

/// The edit distance of two short names (Levenshtein).
fn distance(a: &str, b: &str) -> usize {
    let b: Vec<char> = b.chars().collect();
    let mut row: Vec<usize> = (0..=b.len()).collect();
    for (i, ca) in a.chars().enumerate() {
        let mut prev = row[0];
        row[0] = i + 1;
        for (j, cb) in b.iter().enumerate() {
            let here = row[j + 1];
            row[j + 1] = (prev + usize::from(ca != *cb))
                .min(row[j] + 1)
                .min(here + 1);
            prev = here;
        }
    }
    row[b.len()]
}

/// The value of a setting, before the sample is known.
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum Amountish {
    /// Per cent of the value.
    Percent(f64),
    /// A number in the unit of [`Size::Absolute`] for the target.
    Number(f64),
    /// An amount of a carbonate parameter or a total, per kg or per litre.
    Amount(Amount),
}

/// One standard uncertainty, as `NAME=VALUE` gives it.
///
/// ```
/// use travertine::decisions::uncertainty_settings::{Amountish, Setting, Target};
/// use travertine::sample::inputs::Input;
/// let t: Setting = "temperature=0.18 °F".parse()?;
/// assert_eq!(t.target(), Target::Input(Input::Temperature));
/// assert!(matches!(t.value(), Amountish::Number(v) if (v - 0.1).abs() < 1e-12));
/// # Ok::<(), travertine::decisions::uncertainty_settings::SettingError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
pub struct Setting {
    text: String,
    target: Target,
    value: Amountish,
}

impl std::str::FromStr for Setting {
    type Err = SettingError;

    /// Reads `NAME=VALUE` (see the [module](self)).
    fn from_str(text: &str) -> Result<Self, SettingError> {
        let Some((name, value)) = text.split_once('=') else {
            return Err(SettingError::NoEquals {
                setting: text.to_string(),
            });
        };
        // A column's name with its unit (`alkalinity_umol_kg`,
        // `alkalinity_mg_l_caco3`, `ph_total`, `temperature_f`), as a
        // sheet's header or a binding's input names it: a bare number is
        // in that unit, as in the column's `_u` cell. A flag (`alkalinity`)
        // keeps the unit in the value.
        if let Some((target, named)) = Target::column(name) {
            return Setting::of(target, &named.uncertainty_text(value.trim()), text);
        }
        let target = Target::from_name(name).ok_or_else(|| {
            let names = accepted_names();
            let n = normal(name);
            let hint = names
                .iter()
                .map(|c| (distance(&n, &normal(c)), c))
                .filter(|(d, _)| *d <= 2)
                .min_by_key(|(d, _)| *d)
                .map(|(_, c)| c.clone());
            SettingError::UnknownName {
                setting: text.to_string(),
                name: name.trim().to_string(),
                hint,
                accepted: names.join(", "),
            }
        })?;
        Setting::of(target, value, text)
    }
}

impl Setting {
    /// The setting of `target` with `value` (as the value of a sheet's
    /// `<column>_u` cell); `text` is how it is named in errors.
    ///
    /// # Errors
    /// [`SettingError::BadValue`] for a value that does not read in the
    /// target's units; [`SettingError::OutOfRange`] below zero or not
    /// finite.
    ///
    /// ```
    /// use travertine::decisions::uncertainty_settings::{Setting, Target};
    /// use travertine::sample::inputs::Input;
    /// use travertine::Parameter;
    /// let ph = Target::Input(Input::Carbon(Parameter::Ph));
    /// assert!(Setting::of(ph, "0.02", "ph_nbs_u").is_ok());
    /// assert!(Setting::of(ph, "-0.02", "ph_nbs_u").is_err());
    /// ```
    pub fn of(target: Target, value: &str, text: &str) -> Result<Self, SettingError> {
        let v = value.trim();
        let bad = || SettingError::BadValue {
            setting: text.to_string(),
            name: target.name(),
            value: v.to_string(),
            accepted: target.units(),
        };
        let n = number_len(v.as_bytes());
        if n == 0 {
            return Err(bad());
        }
        let number: f64 = v[..n].parse().map_err(|_| bad())?;
        if !number.is_finite() || number < 0.0 {
            return Err(SettingError::OutOfRange {
                setting: text.to_string(),
                value: number,
            });
        }
        let rest = v[n..].trim();
        let value = if rest == "%" {
            Amountish::Percent(number)
        } else {
            absolute(target, number, rest, v).ok_or_else(bad)?
        };
        Ok(Setting {
            text: text.to_string(),
            target,
            value,
        })
    }

    /// What it gives the uncertainty of.
    pub fn target(&self) -> Target {
        self.target
    }

    /// Its name, as [`Target::name`].
    pub fn name(&self) -> String {
        self.target.name()
    }

    /// Its value, before the sample is known.
    pub fn value(&self) -> Amountish {
        self.value
    }

    /// The setting as typed.
    pub fn text(&self) -> &str {
        &self.text
    }

    /// The size of the uncertainty for the pair `a`, `b` measured in a
    /// water of density `density_kg_m3`: a percentage as it is; an amount
    /// of a carbonate parameter on the basis (per kg or per litre) of its
    /// measurement, µmol; a total in µmol/kg; any other number as read.
    ///
    /// # Errors
    /// [`SettingError::NotMeasured`] for a carbonate parameter not in the
    /// pair.
    ///
    /// ```
    /// use travertine::decisions::uncertainty_settings::Setting;
    /// use travertine::decisions::uncertainty::Size;
    /// use travertine::{units::Unit, Measured};
    /// let alk = Measured::alkalinity(120.0, Unit::MgPerLCaCO3)?;
    /// let ph = Measured::ph(7.8, None)?;
    /// let s: Setting = "alkalinity=1 mg/L CaCO3".parse().unwrap();
    /// // 1 mg/L as CaCO3 is 19.98 µmol/L, on the basis the alkalinity was given.
    /// assert!(matches!(s.resolve(&alk, &ph, 998.0).unwrap(), Size::Absolute(u) if (u - 19.98).abs() < 0.01));
    /// assert!("dic=1umol/kg".parse::<Setting>().unwrap().resolve(&alk, &ph, 998.0).is_err());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn resolve(
        &self,
        a: &Measured,
        b: &Measured,
        density_kg_m3: f64,
    ) -> Result<Size, SettingError> {
        if let Target::Input(Input::Carbon(p)) = self.target {
            if a.parameter() != p && b.parameter() != p {
                return Err(SettingError::NotMeasured {
                    setting: self.text.clone(),
                    name: p.name().to_string(),
                    pair: format!("{} and {}", a.parameter().name(), b.parameter().name()),
                });
            }
        }
        Ok(match self.value {
            Amountish::Percent(p) => Size::Percent(p),
            Amountish::Number(x) => Size::Absolute(x),
            Amountish::Amount(amount) => {
                let per_litre =
                    |m: &Measured| matches!(m.value(), MeasuredValue::Amount(Amount::PerLitre(_)));
                let measured_per_litre = match self.target {
                    Target::Input(Input::Carbon(p)) if a.parameter() == p => per_litre(a),
                    Target::Input(Input::Carbon(_)) => per_litre(b),
                    _ => false,
                };
                let mol_kg = amount.mol_kg(density_kg_m3);
                Size::Absolute(if measured_per_litre {
                    mol_kg * density_kg_m3 / 1000.0 * 1e6
                } else {
                    mol_kg * 1e6
                })
            }
        })
    }
}

/// An absolute value of `target`: `number` followed by `unit` (empty for a
/// plain number); `None` where the unit does not fit.
fn absolute(target: Target, number: f64, unit: &str, whole: &str) -> Option<Amountish> {
    let plain = unit.is_empty();
    let quantity = |units: &[Unit]| -> Option<Quantity> {
        let field = crate::base::field::Field::Uncertainty;
        Quantity::parse(field, whole, units).ok()
    };
    Some(match target {
        Target::Input(Input::Carbon(Parameter::Ph)) if plain => Amountish::Number(number),
        Target::Input(Input::Carbon(p)) if p.is_gas() => {
            let q = quantity(&p.accepted_units())?;
            let per_unit = match q.unit {
                Unit::Uatm | Unit::Ppm => 1.0,
                Unit::Atm => 1e6,
                Unit::Pa => 1e6 / 101_325.0,
                Unit::KPa => 1e9 / 101_325.0,
                _ => return None,
            };
            Amountish::Number(q.value * per_unit)
        }
        Target::Input(Input::Carbon(p)) if p != Parameter::Ph => {
            let (mass, g) = p.mass_unit();
            Amountish::Amount(Amount::from_quantity(
                quantity(&p.accepted_units())?,
                mass,
                g,
            )?)
        }
        Target::Input(Input::Total(t)) => {
            let q = quantity(&t.units())?;
            let amount = molar(q).or_else(|| {
                t.mass_units()
                    .iter()
                    .find_map(|(m, g)| Amount::from_quantity(q, *m, *g))
            })?;
            Amountish::Amount(amount)
        }
        Target::Input(Input::Temperature) => {
            let u = unit.trim_start_matches('°').to_lowercase();
            match u.as_str() {
                "" | "c" | "k" => Amountish::Number(number),
                "f" => Amountish::Number(number * 5.0 / 9.0),
                _ => return None,
            }
        }
        Target::Input(Input::Conductivity) => {
            // µS/cm whichever unit: the @25C spellings name the same size.
            Amountish::Number(Conductivity::from_quantity(quantity(&CONDUCTIVITY_UNITS)?).us_cm())
        }
        Target::Input(Input::IonicStrength) => match unit.to_lowercase().as_str() {
            "" | "mol/kg" => Amountish::Number(number),
            "mmol/kg" => Amountish::Number(number * 1e-3),
            _ => return None,
        },
        Target::Input(Input::Tds) => match unit.to_lowercase().as_str() {
            "" | "mg/l" => Amountish::Number(number),
            "g/l" => Amountish::Number(number * 1e3),
            _ => return None,
        },
        Target::Input(Input::Wind) if plain => Amountish::Number(number),
        Target::Input(Input::Wind) => {
            Amountish::Number(number * Input::Wind.number_unit(unit)?.to_base)
        }
        Target::Input(_) if plain => Amountish::Number(number),
        Target::Constant(ConstantName::BoronTotal) => {
            let q = quantity(&[Unit::UmolPerKg, Unit::MmolPerKg, Unit::MolPerKg])?;
            Amountish::Number(molar(q)?.raw() * 1e6)
        }
        Target::Constant(_) if plain => Amountish::Number(number),
        _ => return None,
    })
}

/// The carbonate parameters of the pair `a`, `b` measured per litre, whose
/// absolute uncertainties are in µmol/L.
///
/// ```
/// use travertine::decisions::uncertainty_settings::per_litre_inputs;
/// use travertine::sample::inputs::Input;
/// use travertine::{units::Unit, Measured, Parameter};
/// let alk = Measured::alkalinity(120.0, Unit::MgPerLCaCO3)?;
/// let ph = Measured::ph(7.8, None)?;
/// assert_eq!(per_litre_inputs(&alk, &ph), vec![Input::Carbon(Parameter::Alkalinity)]);
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn per_litre_inputs(a: &Measured, b: &Measured) -> Vec<Input> {
    [a, b]
        .iter()
        .filter(|m| matches!(m.value(), MeasuredValue::Amount(Amount::PerLitre(_))))
        .map(|m| Input::Carbon(m.parameter()))
        .collect()
}

/// A quantity in a molar unit as an amount (`None` for any other unit:
/// ppm is never a concentration unit, so no mass unit matches).
fn molar(q: Quantity) -> Option<Amount> {
    Amount::from_quantity(q, Unit::Ppm, 1.0)
}

/// `base` with every setting resolved for the pair `a`, `b` in a water of
/// density `density_kg_m3` ([`Setting::resolve`]); a later setting of the
/// same name replaces an earlier one.
///
/// # Errors
/// As [`Setting::resolve`].
///
/// ```
/// use travertine::decisions::uncertainty_settings::{with_settings, Setting};
/// use travertine::decisions::uncertainty::Uncertainties;
/// use travertine::Measured;
/// let settings: Vec<Setting> = ["ph=0.01", "pk1=0.02"].iter().map(|s| s.parse().unwrap()).collect();
/// let a = Measured::ph(7.9, None)?;
/// let b = Measured::alkalinity_umol_kg(1500.0)?;
/// assert!(with_settings(Uncertainties::new(), &settings, &a, &b, 999.0).is_ok());
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn with_settings(
    base: Uncertainties,
    settings: &[Setting],
    a: &Measured,
    b: &Measured,
    density_kg_m3: f64,
) -> Result<Uncertainties, SettingError> {
    let mut u = base;
    for s in settings {
        let size = s.resolve(a, b, density_kg_m3)?;
        // The size is checked (finite, 0 or more) when read, but its
        // conversion to the pair's unit can overflow (1e308 mg/L as CaCO3):
        // the error gives the converted size. The target is one
        // `Uncertainties` takes.
        let out_of_range = |_| SettingError::OutOfRange {
            setting: s.text.clone(),
            value: size.number(),
        };
        u = match s.target {
            Target::Input(i) => u.with_input(i, size).map_err(out_of_range)?,
            Target::Constant(c) => u.with_constant(c, size).map_err(out_of_range)?,
        };
    }
    Ok(u)
}

#[cfg(test)]
mod tests {
    use super::*;

    fn setting(s: &str) -> Setting {
        s.parse().unwrap()
    }

    #[test]
    fn names_read_by_flag_column_and_constant() {
        assert_eq!(
            setting("alkalinity_mg_l_caco3=2%").target(),
            Target::Input(Input::Carbon(Parameter::Alkalinity))
        );
        assert_eq!(
            setting("PH_NBS=0.01").target(),
            Target::Input(Input::Carbon(Parameter::Ph))
        );
        assert_eq!(
            setting("pk2=0.01").target(),
            Target::Constant(ConstantName::K2)
        );
        assert_eq!(
            setting("boron-total=2%").target(),
            Target::Constant(ConstantName::BoronTotal)
        );
        // Every constant and every propagated input has a name that reads back.
        for n in accepted_names() {
            assert!(Target::from_name(&n).is_some(), "{n}");
        }
    }

    #[test]
    fn values_in_units_and_percent() {
        assert_eq!(setting("ph=0.01").value(), Amountish::Number(0.01));
        assert_eq!(setting("dic=1.5%").value(), Amountish::Percent(1.5));
        assert_eq!(
            setting("dic=2umol/kg").value(),
            Amountish::Amount(Amount::PerKg(2e-6))
        );
        assert!(
            matches!(setting("pco2=0.1 kPa").value(), Amountish::Number(v) if (v - 986.923).abs() < 1e-3)
        );
        assert!(
            matches!(setting("wind=3.6 km/h").value(), Amountish::Number(v) if (v - 1.0).abs() < 1e-12)
        );
        // 1.40067 mg/L as N is 100 µmol/L (N 14.0067 g/mol, IUPAC standard atomic weight).
        assert!(
            matches!(setting("ammonia=1.40067 mg/L N").value(), Amountish::Amount(Amount::PerLitre(v)) if (v - 1e-4).abs() < 1e-9)
        );
        assert!(
            matches!(setting("boron_total=4umol/kg").value(), Amountish::Number(v) if (v - 4.0).abs() < 1e-12)
        );
        // A conductivity in µS/cm whichever unit; a unit is needed.
        assert_eq!(
            setting("conductivity=10uS/cm").value(),
            Amountish::Number(10.0)
        );
        assert!(
            matches!(setting("specific_conductance_us_cm=0.02 mS/cm@25C").value(), Amountish::Number(v) if (v - 20.0).abs() < 1e-12)
        );
        assert_eq!(setting("conductivity=5%").value(), Amountish::Percent(5.0));
        assert_eq!(
            "conductivity=10".parse::<Setting>().unwrap_err().code(),
            "uncertainty_bad_value"
        );
        assert!(
            matches!(setting("ionic-strength=0.5 mmol/kg").value(), Amountish::Number(v) if (v - 5e-4).abs() < 1e-15)
        );
    }

    #[test]
    fn errors_name_the_setting() {
        let e = "alkalinity=2".parse::<Setting>().unwrap_err();
        assert_eq!(e.code(), "uncertainty_bad_value");
        assert!(e.to_string().contains("alkalinity=2") && e.to_string().contains("umol/kg"));
        let e = "pk1=-0.1".parse::<Setting>().unwrap_err();
        assert_eq!(e.code(), "uncertainty_out_of_range");
        // A column's name with its unit reads a bare number in that unit;
        // the flag needs the unit in the value.
        let a = Target::Input(Input::Carbon(Parameter::Alkalinity));
        for (text, value) in [
            (
                "alkalinity_umol_kg=2",
                Amountish::Amount(Amount::PerKg(2e-6)),
            ),
            (
                "Alkalinity (mg/L as CaCO3)=1",
                setting("alkalinity=1 mg/L CaCO3").value(),
            ),
            (
                "alkalinity_mg_l_caco3=1",
                setting("alkalinity=1 mg/L CaCO3").value(),
            ),
            ("alkalinity_umol_kg=3%", Amountish::Percent(3.0)),
        ] {
            assert_eq!(setting(text).target(), a, "{text}");
            assert_eq!(setting(text).value(), value, "{text}");
        }
        assert!(matches!(setting("temperature_f=0.18").value(),
            Amountish::Number(v) if (v - 0.1).abs() < 1e-12));
        assert_eq!(setting("ph_total=0.01").value(), setting("ph=0.01").value());
        assert_eq!(
            "alkalinity=1".parse::<Setting>().unwrap_err().code(),
            "uncertainty_bad_value"
        );
        // Finite as typed, infinite once in µmol/kg: refused with the
        // converted size, not NaN.
        let (ph, ta) = (
            Measured::ph(8.0, Some(crate::properties::scales::PhScale::Total)).unwrap(),
            Measured::alkalinity_umol_kg(2300.0).unwrap(),
        );
        let huge = [setting("alkalinity=1e308 mg/L CaCO3")];
        let e = with_settings(Uncertainties::new(), &huge, &ph, &ta, 1025.0).unwrap_err();
        assert_eq!(e.code(), "uncertainty_out_of_range");
        assert!(e.to_string().contains("inf is out of range"), "{e}");
        let e = "temprature=0.1".parse::<Setting>().unwrap_err();
        assert!(
            matches!(&e, SettingError::UnknownName { hint: Some(h), .. } if h == "temperature")
        );
        let e = "pressure=1".parse::<Setting>().unwrap_err();
        assert_eq!(e.code(), "uncertainty_unknown_name");
        assert!(e.to_string().contains("pksp_calcite"));
        assert_eq!(
            "ph 0.01".parse::<Setting>().unwrap_err().code(),
            "uncertainty_no_equals"
        );
        assert_eq!(
            "pk1=0.01 umol/kg".parse::<Setting>().unwrap_err().code(),
            "uncertainty_bad_value"
        );
    }

    #[test]
    fn an_amount_follows_the_basis_of_its_measurement() {
        let a = Measured::alkalinity_umol_kg(2300.0).unwrap();
        let b = Measured::ph(8.0, Some(crate::PhScale::Total)).unwrap();
        // 2 µmol/L at 1025 kg/m³ is 2/1.025 µmol/kg.
        let s = setting("alkalinity=2umol/L");
        assert!(
            matches!(s.resolve(&a, &b, 1025.0).unwrap(), Size::Absolute(u) if (u - 2.0 / 1.025).abs() < 1e-12)
        );
    }
}
