//! Recognising an input by its name: the canonical snake_case names with
//! the unit in the name (`alkalinity_mg_l_caco3`, `temperature_c`), and the
//! common spellings with the unit in brackets (`Alkalinity (mg/L as
//! CaCO3)`, `Temp [°C]`, `pH (NBS)`), case and spacing insensitive.
//!
//! The field sheet reads its headers here, and the bindings (C, Python)
//! find their inputs here by name with [`NamedInput::find`], so that one
//! vocabulary, made from the list of inputs, serves all of them.
//!
//! A header whose name is known but whose unit cannot be determined is a
//! [`HeaderIssue`]: the sheet stops before any row is read. A unit is never
//! guessed: plain `mg/L` is accepted only where the name says what the mass
//! is of (calcium as Ca, bicarbonate as HCO3, total ammonia *nitrogen* as
//! N), never for alkalinity, DIC or hardness.

use crate::base::units::{Quantity, Unit};
use crate::properties::scales::PhScale;
use crate::sample::inputs::{Input, NameHint, INPUTS};
use crate::sample::values::{Conductivity, InputValue};

mod units;

// The sheet reads the unit of a cell with it.
#[cfg_attr(not(feature = "sheet"), allow(unused_imports))]
pub(crate) use units::cell_unit;
use units::{interpret, is_unit_text, unit_note};

/// How the cells of a recognised column are read.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) enum Reading {
    /// A plain number, turned into the field's base unit (°C, dbar, atm,
    /// mg/L, mol/kg, fraction) as `value * scale + offset`.
    Number {
        scale: f64,
        offset: f64,
        /// The unit as written in messages.
        label: &'static str,
    },
    /// A number in this unit.
    Quantity(Unit),
    /// Conductivity in µS/cm (after `scale`), specific (at 25 °C) or not.
    Conductivity { scale: f64, specific: bool },
    /// pH on this scale (`None`: the medium's default).
    Ph(Option<PhScale>),
    /// A name (medium, scale, fit).
    Text,
}

impl Reading {
    const PLAIN: Reading = Reading::Number {
        scale: 1.0,
        offset: 0.0,
        label: "",
    };

    /// The text of a difference (an uncertainty) given as `text` under a
    /// name read this way, in a form that names its unit: a number in the
    /// name's unit gets that unit, a scaled number (°F) is scaled without
    /// its offset (a difference), a conductivity goes to µS/cm as the
    /// name's readings are (at the sample temperature or at 25 °C); a
    /// percentage, a pH difference, a plain number or text that is not a
    /// number is left as it is. The one reading of `<column>_u` cells and
    /// of `NAME=VALUE` settings named by a column.
    pub(crate) fn difference_text(self, text: String) -> String {
        if text.ends_with('%') {
            return text;
        }
        match self {
            Reading::Quantity(unit) => match text.trim().parse::<f64>() {
                Ok(_) => format!("{} {}", text.trim(), unit.spelling()),
                Err(_) => text,
            },
            // A difference: the scale of the unit, not its offset.
            Reading::Number { scale, .. } if scale != 1.0 => match text.trim().parse::<f64>() {
                Ok(x) => format!("{}", x * scale),
                Err(_) => text,
            },
            Reading::Conductivity { scale, .. } => match text.trim().parse::<f64>() {
                Ok(x) => format!("{} uS/cm", x * scale),
                Err(_) => text,
            },
            _ => text,
        }
    }
}

/// A recognised column.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Column {
    pub field: Input,
    pub reading: Reading,
    /// A note on a unit read only approximately as written (`ppm` as
    /// mg/L, `ppt` as practical salinity), for the sheet's summary.
    pub note: Option<&'static str>,
}

/// A header whose field is known but whose unit is not.
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct HeaderIssue {
    pub field: Input,
    /// What is wrong, in words.
    pub problem: String,
}

/// The result of reading one header.
#[derive(Debug, Clone, PartialEq)]
pub(crate) enum Recognition {
    /// A column travertine reads.
    Column(Column),
    /// A column that passes through unchanged.
    PassThrough,
    /// A known field with a unit that cannot be determined.
    Issue(HeaderIssue),
}

/// Lower case, `µ`/`μ` as `u`, subscript digits as digits, degree signs and
/// superscript charges dropped, `_` and runs of white space as one space.
pub(crate) fn normalise(text: &str) -> String {
    let mut out = String::with_capacity(text.len());
    let mut space = false;
    for ch in text.trim().trim_start_matches('\u{feff}').chars() {
        let mapped = match ch {
            'µ' | 'μ' => Some('u'),
            '₀'..='₉' => char::from_digit(ch as u32 - '₀' as u32, 10),
            '°' | 'º' | '⁻' | '⁺' | '²' | '³' => None,
            '‐' | '–' => Some('-'),
            '_' => Some(' '),
            c if c.is_whitespace() => Some(' '),
            c => Some(c),
        };
        let Some(c) = mapped else { continue };
        if c == ' ' {
            space = !out.is_empty();
            continue;
        }
        if space {
            out.push(' ');
            space = false;
        }
        for l in c.to_lowercase() {
            out.push(l);
        }
    }
    out
}

/// The guide to the columns a sheet can have: for every input of the
/// list of inputs, its canonical column, the header spellings recognised
/// and the units read. `travertine sheet --list-columns` prints it.
///
/// ```
/// let guide = travertine::sample::inputs::column_guide();
/// assert!(guide.contains("alkalinity_mg_l_caco3"));
/// assert!(guide.contains("total alkalinity"));
/// ```
pub fn column_guide() -> String {
    use std::fmt::Write;
    let mut out = String::from(
        "Columns a sheet can have. A header is read without regard to case, spacing or `_`; \
         its unit goes in brackets (`Alkalinity (mg/L as CaCO3)`), after a comma, or at the \
         end of the name (`alkalinity_mg_l_caco3`). Any other column passes through unread.\n",
    );
    for spec in INPUTS {
        let names: Vec<String> = spec
            .spellings
            .iter()
            .map(|(n, hint)| match hint {
                NameHint::Short => format!("{n} (only with a unit)"),
                NameHint::Nitrogen => format!("{n} (mg/L as N)"),
                NameHint::Phosphorus => format!("{n} (mg/L as P)"),
                NameHint::CalciumHardness => format!("{n} (as CaCO3)"),
                NameHint::Specific => format!("{n} (at 25 °C)"),
                _ => (*n).to_string(),
            })
            .collect();
        let _ = write!(
            out,
            "\n{}\n  column:  {}\n  headers: {}\n  units:   {}\n",
            spec.input.name(),
            spec.column,
            names.join(", "),
            spec.input.accepted()
        );
    }
    out.push_str(
        "\nThe computed columns are chosen with --columns; `--columns all` writes every one.\n",
    );
    // issue 13: uncertainties
    out.push_str(
        "\nStandard uncertainties: a column named as any column above followed by `_u` \
         (`ph_nbs_u`, `alkalinity_mg_l_caco3_u`, `Alkalinity (mg/L as CaCO3)_u`) gives each \
         row's uncertainty of that input, in that column's unit or as a percentage (`2%`), for \
         the carbonate parameters, temperature, salinity, calcium, phosphate, silicate, \
         ammonia, sulfide, wind and total boron. With one, or --uncertainty NAME=VALUE, or \
         --no-constant-uncertainty, every numeric computed column gets a `<column>_u` column. \
         A `_u` column without its value column is reported unused.\n",
    );
    out
}

/// The input a spelling names, from the list of inputs.
fn lookup_name(name: &str) -> Option<(Input, NameHint)> {
    let name = name.trim_matches(|c: char| c == '.' || c == ':' || c == ' ');
    INPUTS.iter().find_map(|spec| {
        spec.spellings
            .iter()
            .find(|(n, _)| *n == name)
            .map(|(_, h)| (spec.input, *h))
    })
}

/// Splits a header into its name and unit text: `Name (unit)`, `Name
/// [unit]` or `Name, unit`. `None` when the header has no such unit part;
/// the flag tells whether the unit was in brackets.
fn split_bracket(h: &str) -> Option<(&str, &str, bool)> {
    if let Some(open) = h.find(['(', '[']) {
        let name = &h[..open];
        let last_open = h.rfind(['(', '[']).unwrap_or(open);
        let inner = &h[last_open + 1..];
        let inner = inner
            .find([')', ']'])
            .map_or(inner, |close| &inner[..close]);
        return Some((name.trim(), inner.trim(), true));
    }
    h.split_once(',').map(|(n, u)| (n.trim(), u.trim(), false))
}

/// Unit text from the tokens of a snake_case or spaced name: `mg l caco3`
/// is `mg/l caco3`, `umol kg` is `umol/kg`.
fn unit_from_tokens(tokens: &[&str]) -> String {
    if tokens.len() >= 2 && matches!(tokens[1], "kg" | "l" | "cm") && !tokens[0].contains('/') {
        let mut s = format!("{}/{}", tokens[0], tokens[1]);
        for t in &tokens[2..] {
            s.push(' ');
            s.push_str(t);
        }
        s
    } else {
        tokens.join(" ")
    }
}

/// Reads one header.
///
/// ```text
/// alkalinity_mg_l_caco3         -> alkalinity, mg/L as CaCO3
/// Alkalinity (mg/L as CaCO3)    -> the same
/// Temp [°C]                     -> temperature, °C
/// pH (NBS)                      -> pH, NBS scale
/// Site                          -> passes through
/// Alkalinity                    -> issue: no unit
/// ```
pub(crate) fn recognise(header: &str) -> Recognition {
    let h = normalise(header);
    if let Some((name, unit, bracketed)) = split_bracket(&h) {
        return match lookup_name(name) {
            Some((field, hint)) => match interpret(field, hint, unit) {
                Ok(reading) => Recognition::Column(Column {
                    field,
                    reading,
                    note: unit_note(field, unit),
                }),
                // "Temperature, surface": a qualifier after a comma, no unit.
                Err(_) if !bracketed && !is_unit_text(unit) => Recognition::PassThrough,
                Err(problem) => Recognition::Issue(HeaderIssue { field, problem }),
            },
            None => Recognition::PassThrough,
        };
    }
    let tokens: Vec<&str> = h.split(' ').filter(|t| !t.is_empty()).collect();
    for k in (1..=tokens.len()).rev() {
        let name = tokens[..k].join(" ");
        let Some((field, hint)) = lookup_name(&name) else {
            continue;
        };
        let unit = unit_from_tokens(&tokens[k..]);
        if unit.is_empty() && hint == NameHint::Short {
            // A bare short code such as "TA" or "Ca" may be anything.
            return Recognition::PassThrough;
        }
        return match interpret(field, hint, &unit) {
            Ok(reading) => Recognition::Column(Column {
                field,
                reading,
                note: unit_note(field, &unit),
            }),
            // "temperature_notes": the rest is no unit at all, so this is
            // another column that happens to start with a known name.
            Err(_) if !unit.is_empty() && !is_unit_text(&unit) => Recognition::PassThrough,
            Err(problem) => Recognition::Issue(HeaderIssue { field, problem }),
        };
    }
    Recognition::PassThrough
}

/// The reading of a `--map` or `--set` name: any header travertine would
/// recognise, such as `alkalinity_mg_l_caco3` or `Temp [°C]`.
#[cfg_attr(not(feature = "sheet"), allow(dead_code))]
pub(crate) fn recognise_name(name: &str) -> Result<Column, Option<HeaderIssue>> {
    match recognise(name) {
        Recognition::Column(c) => Ok(c),
        Recognition::Issue(i) => Err(Some(i)),
        Recognition::PassThrough => {
            // A bare short code is fine as a --set or --map name when it
            // carries no unit of its own: `ph`, `water`, `salinity`.
            Err(None)
        }
    }
}

/// An input found by name, with the unit its name gives: what a bare
/// number given under that name means.
///
/// The names are those a sheet header may have
/// ([`crate::sample::inputs::INPUTS`]: the canonical columns such as
/// `alkalinity_mg_l_caco3`, `ph_total`, `temperature_c`,
/// `specific_conductance_us_cm`, any other unit in the same form such as
/// `alkalinity_umol_kg`, and the common spellings such as `Alkalinity (mg/L
/// as CaCO3)`); the names of the medium, the pH scale and the fits
/// (`water`, `ph_scale`, `carbonic`, `boron_fit`, ...) take a name rather
/// than a number. A program that is handed inputs by name (the bindings)
/// finds each name once and then reads any number of values with it.
///
/// ```
/// use travertine::sample::inputs::{Input, NamedInput};
/// use travertine::sample::values::InputValue;
/// use travertine::{units::{Quantity, Unit}, Parameter, PhScale};
/// let alk = NamedInput::find("alkalinity_mg_l_caco3")?;
/// assert_eq!(alk.input(), Input::Carbon(Parameter::Alkalinity));
/// assert_eq!(alk.number(120.0), Some(InputValue::Quantity(Quantity::new(120.0, Unit::MgPerLCaCO3))));
/// assert_eq!(NamedInput::find("ph_total")?.number(8.05), Some(InputValue::Ph(8.05, Some(PhScale::Total))));
/// // A name-valued input reads text, not a number.
/// let water = NamedInput::find("water")?;
/// assert!(water.takes_name() && water.number(1.0).is_none());
/// assert!(NamedInput::find("site").is_err());
/// assert!(NamedInput::find("alkalinity").is_err()); // no unit
/// # Ok::<(), travertine::sample::inputs::UnreadName>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct NamedInput {
    column: Column,
}

/// Why a name finds no [`NamedInput`].
///
/// ```
/// use travertine::sample::inputs::{NamedInput, UnreadName};
/// assert_eq!(NamedInput::find("depth_dbar").unwrap_err().to_string(),
///            "`depth_dbar`: `dbar` is not a unit travertine knows for depth; accepted: \
///             m; in a sheet header also ft (0.3048 m); for example depth_m");
/// assert!(matches!(NamedInput::find("colour"), Err(UnreadName::Unknown { .. })));
/// ```
#[derive(Debug, Clone, PartialEq, thiserror::Error)]
#[non_exhaustive]
pub enum UnreadName {
    /// The name is no input's.
    #[error(
        "`{name}` names no input; use a name with its unit such as alkalinity_mg_l_caco3, \
         ph_nbs, temperature_c, specific_conductance_us_cm, or an option such as water, \
         ph_scale, carbonic"
    )]
    Unknown {
        /// The name as given.
        name: String,
    },
    /// The name is an input's, but the unit it gives (or its lack of one)
    /// cannot be read.
    #[error(
        "`{name}`: {problem}; accepted: {}; for example {}",
        input.accepted(),
        input.column()
    )]
    Unit {
        /// The name as given.
        name: String,
        /// The input it names.
        input: Input,
        /// What is wrong with its unit.
        problem: String,
    },
}

impl NamedInput {
    /// The input `name` names, with its unit.
    ///
    /// # Errors
    /// [`UnreadName::Unknown`] for a name of no input;
    /// [`UnreadName::Unit`] for an input's name whose unit is missing or
    /// not one of the input's (a unit is never guessed).
    ///
    /// ```
    /// use travertine::sample::inputs::{Input, NamedInput};
    /// assert_eq!(NamedInput::find("Temp [°F]")?.input(), Input::Temperature);
    /// # Ok::<(), travertine::sample::inputs::UnreadName>(())
    /// ```
    pub fn find(name: &str) -> Result<NamedInput, UnreadName> {
        match recognise(name) {
            Recognition::Column(column) => Ok(NamedInput { column }),
            Recognition::Issue(issue) => Err(UnreadName::Unit {
                name: name.to_string(),
                input: issue.field,
                problem: issue.problem,
            }),
            Recognition::PassThrough => Err(UnreadName::Unknown {
                name: name.to_string(),
            }),
        }
    }

    /// The input.
    pub fn input(self) -> Input {
        self.column.field
    }

    /// The text of a standard uncertainty `value` given under this name,
    /// with the name's unit where it is a bare number: what a sheet's
    /// `<column>_u` cell of this column means (`2` under
    /// `alkalinity_umol_kg` is 2 µmol/kg; `0.18` under `temperature_f` is
    /// 0.1 °C, a difference; `5%` stays 5 %).
    ///
    /// ```
    /// use travertine::sample::inputs::NamedInput;
    /// assert_eq!(NamedInput::find("alkalinity_umol_kg")?.uncertainty_text("2"), "2 umol/kg");
    /// assert_eq!(NamedInput::find("temperature_f")?.uncertainty_text("0.18"), "0.1");
    /// assert_eq!(NamedInput::find("ph_total")?.uncertainty_text("0.01"), "0.01");
    /// assert_eq!(NamedInput::find("dic_umol_kg")?.uncertainty_text("1%"), "1%");
    /// # Ok::<(), travertine::sample::inputs::UnreadName>(())
    /// ```
    pub fn uncertainty_text(self, value: &str) -> String {
        self.column.reading.difference_text(value.to_string())
    }

    /// Whether the input takes a name (the medium, a scale, a fit, a
    /// model) rather than a number: read it with [`Input::read`].
    pub fn takes_name(self) -> bool {
        self.column.reading == Reading::Text
    }

    /// The value a bare `number` given under this name stands for, in the
    /// unit of the name (°F turned into °C, a pH with the scale the name
    /// gives, a conductivity specific or not as the name says); `None` for
    /// an input that takes a name ([`NamedInput::takes_name`]). The number
    /// is checked where the sample is (a temperature by
    /// [`crate::sample::Sample::water`], a measured value when it is
    /// paired), not here.
    ///
    /// ```
    /// use travertine::sample::{inputs::NamedInput, values::InputValue};
    /// let t = NamedInput::find("temperature_f")?.number(50.0);
    /// assert!(matches!(t, Some(InputValue::Number(c)) if (c - 10.0).abs() < 1e-12));
    /// # Ok::<(), travertine::sample::inputs::UnreadName>(())
    /// ```
    pub fn number(self, number: f64) -> Option<InputValue> {
        Some(match self.column.reading {
            Reading::Text => return None,
            Reading::Number { scale, offset, .. } => InputValue::Number(number * scale + offset),
            Reading::Quantity(unit) => InputValue::Quantity(Quantity::new(number, unit)),
            Reading::Conductivity { scale, specific } => {
                let us_cm = number * scale;
                InputValue::Conductivity(if specific {
                    Conductivity::Specific { us_cm }
                } else {
                    Conductivity::AtTemperature { us_cm }
                })
            }
            Reading::Ph(scale) => InputValue::Ph(number, scale),
        })
    }
}

/// How the sheet reads a header that holds plain numbers: the input it is
/// read as, and the factor and offset that take a cell to the input's base
/// unit (`cell × factor + offset`; depth in m, temperature in °C, pressure
/// in dbar). `None` for a header passed through, one read otherwise (a
/// quantity with a unit, a pH, a name) or one without a unit that can be
/// read.
///
/// ```
/// use travertine::sample::inputs::Input;
/// use travertine::sample::inputs::number_column;
/// assert_eq!(number_column("Depth (m)"), Some((Input::Depth, 1.0, 0.0)));
/// assert_eq!(number_column("depth [ft]"), Some((Input::Depth, 0.3048, 0.0)));
/// assert_eq!(number_column("Station"), None);
/// ```
pub fn number_column(header: &str) -> Option<(Input, f64, f64)> {
    match recognise(header) {
        Recognition::Column(Column {
            field,
            reading: Reading::Number { scale, offset, .. },
            ..
        }) => Some((field, scale, offset)),
        _ => None,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::sample::inputs::Total;
    use crate::sample::measured::Parameter;

    fn column(h: &str) -> Column {
        match recognise(h) {
            Recognition::Column(c) => c,
            other => panic!("{h}: {other:?}"),
        }
    }

    #[test]
    fn canonical_names() {
        let c = column("alkalinity_mg_l_caco3");
        assert_eq!(c.field, Input::Carbon(Parameter::Alkalinity));
        assert_eq!(c.reading, Reading::Quantity(Unit::MgPerLCaCO3));
        assert_eq!(
            column("alkalinity_umol_kg").reading,
            Reading::Quantity(Unit::UmolPerKg)
        );
        assert_eq!(column("ph_nbs").reading, Reading::Ph(Some(PhScale::Nbs)));
        assert_eq!(
            column("ph_total").reading,
            Reading::Ph(Some(PhScale::Total))
        );
        assert_eq!(column("dic_umol_kg").field, Input::Carbon(Parameter::Dic));
        assert_eq!(column("pco2_uatm").reading, Reading::Quantity(Unit::Uatm));
        assert_eq!(column("temperature_c").field, Input::Temperature);
        assert_eq!(column("salinity").field, Input::Salinity);
        assert_eq!(
            column("conductivity_us_cm").reading,
            Reading::Conductivity {
                scale: 1.0,
                specific: false
            }
        );
        assert_eq!(
            column("specific_conductance_us_cm").reading,
            Reading::Conductivity {
                scale: 1.0,
                specific: true
            }
        );
        assert_eq!(
            column("calcium_mg_l").reading,
            Reading::Quantity(Unit::MgPerLCa)
        );
        assert_eq!(column("pressure_dbar").field, Input::Pressure);
        assert_eq!(
            column("ammonia_mg_l_n").reading,
            Reading::Quantity(Unit::MgPerLN)
        );
        assert_eq!(
            column("phosphate_umol_kg").field,
            Input::Total(Total::Phosphate)
        );
        assert_eq!(
            column("free_co2_mg_l").reading,
            Reading::Quantity(Unit::MgPerLCO2)
        );
    }

    #[test]
    fn common_spellings() {
        assert_eq!(
            column("Alkalinity (mg/L as CaCO3)").reading,
            Reading::Quantity(Unit::MgPerLCaCO3)
        );
        assert_eq!(column("Temp [°C]").field, Input::Temperature);
        assert_eq!(column("pH (NBS)").reading, Reading::Ph(Some(PhScale::Nbs)));
        assert_eq!(
            column("  TOTAL   ALKALINITY  (MG/L AS CACO3) ").field,
            Input::Carbon(Parameter::Alkalinity)
        );
        assert_eq!(
            column("Specific conductance (µS/cm)").reading,
            Reading::Conductivity {
                scale: 1.0,
                specific: true
            }
        );
        assert_eq!(
            column("Conductivity (µS/cm @ 25 °C)").reading,
            Reading::Conductivity {
                scale: 1.0,
                specific: true
            }
        );
        assert_eq!(
            column("TAN (mg/L)").reading,
            Reading::Quantity(Unit::MgPerLN)
        );
        assert_eq!(
            column("Calcium hardness (mg/L as CaCO3)").reading,
            Reading::Quantity(Unit::MgPerLCaCO3)
        );
        assert_eq!(column("pCO₂ (µatm)").field, Input::Carbon(Parameter::Pco2));
        assert_eq!(
            column("Alkalinity, meq/L").field,
            Input::Carbon(Parameter::Alkalinity)
        );
        assert!(matches!(
            column("Temp (°F)").reading,
            Reading::Number { label: "°F", .. }
        ));
        assert_eq!(column("pH").reading, Reading::Ph(None));
    }

    #[test]
    fn others_pass_through() {
        for h in [
            "Site",
            "date",
            "Sample ID",
            "notes",
            "Station depth (m)",
            "TA",
            "Ca",
            "temperature_notes",
            "",
        ] {
            assert_eq!(recognise(h), Recognition::PassThrough, "{h}");
        }
    }

    /// A depth column in metres or feet, under the spellings of the list
    /// of inputs; a depth without its unit is not guessed.
    #[test]
    fn depth_columns() {
        for (h, scale) in [
            ("depth_m", 1.0),
            ("Depth (m)", 1.0),
            ("Depth, m", 1.0),
            ("DEPTH [metres]", 1.0),
            ("Sample depth (m)", 1.0),
            ("depth_ft", 0.3048),
            ("Depth (feet)", 0.3048),
        ] {
            let c = column(h);
            assert_eq!(c.field, Input::Depth, "{h}");
            match c.reading {
                Reading::Number { scale: s, .. } => assert_eq!(s, scale, "{h}"),
                other => panic!("{h}: {other:?}"),
            }
        }
        for h in ["Depth", "Depth (fathoms)"] {
            assert!(matches!(recognise(h), Recognition::Issue(_)), "{h}");
        }
    }

    #[test]
    fn units_are_never_guessed() {
        for h in [
            "Alkalinity",
            "Alkalinity (mg/L)",
            "DIC (mg/L)",
            "Temperature",
            "Alkalinity (ppm)",
            "Hardness (mg/L)",
            "Ammonia (mg/L)",
            "Conductivity",
            "pH (lab)",
            "pCO2 (ppm)",
        ] {
            assert!(
                matches!(recognise(h), Recognition::Issue(_)),
                "{h}: {:?}",
                recognise(h)
            );
        }
    }

    /// The trade's spellings: ppm for mg/L, and ppt, ‰ or g/kg for
    /// salinity, each read with a note, and ppm of an ambiguous mass still
    /// refused (`Alkalinity (ppm)` above).
    #[test]
    fn trade_spellings_are_read_with_a_note() {
        for (h, field, reading) in [
            (
                "Alkalinity (ppm CaCO3)",
                Input::Carbon(crate::sample::measured::Parameter::Alkalinity),
                Reading::Quantity(Unit::MgPerLCaCO3),
            ),
            (
                "TAN (ppm)",
                Input::Total(crate::sample::inputs::Total::Ammonia),
                Reading::Quantity(Unit::MgPerLN),
            ),
            (
                "Calcium hardness (ppm as CaCO3)",
                Input::Total(crate::sample::inputs::Total::Calcium),
                Reading::Quantity(Unit::MgPerLCaCO3),
            ),
            (
                "Salinity (ppt)",
                Input::Salinity,
                Reading::Number {
                    scale: 1.0,
                    offset: 0.0,
                    label: "ppt",
                },
            ),
            (
                "Salinity (‰)",
                Input::Salinity,
                Reading::Number {
                    scale: 1.0,
                    offset: 0.0,
                    label: "ppt",
                },
            ),
        ] {
            match recognise(h) {
                Recognition::Column(c) => {
                    assert_eq!((c.field, c.reading), (field, reading), "{h}");
                    assert!(c.note.is_some(), "{h}: no note");
                }
                other => panic!("{h}: {other:?}"),
            }
        }
        // A unit read as written has no note.
        match recognise("Salinity (psu)") {
            Recognition::Column(c) => assert_eq!(c.note, None),
            other => panic!("{other:?}"),
        }
    }
}
