//! Errors of the whole crate.
//!
//! Every variant names the field that was wrong, the value it had and,
//! where one exists, the accepted range or the accepted units, so that a
//! message can be shown to a user as it is.

pub use super::field::Field;
use thiserror::Error;

/// Why a pH needs its scale in saline water, and how to choose it: the
/// text of [`Error::UnstatedPhScale`], for front ends that say it before
/// any value is read.
pub const PH_SCALE_ADVICE: &str = "the pH scale is not stated, and it changes the answer (NBS \
     and total differ by about 0.1 to 0.15 pH in sea water); state it: nbs for a meter \
     calibrated with NBS/IUPAC buffers, total for spectrophotometric or Tris-buffer work, \
     seawater or free where the method reports those";

/// The result type of this crate.
pub type Result<T> = std::result::Result<T, Error>;

/// Everything that can go wrong while describing a water or solving it.
///
/// # Example
/// ```
/// use travertine::{Conditions, Error};
/// let err = Conditions::new(300.0, 35.0).unwrap_err();
/// assert!(matches!(err, Error::OutOfRange { field: travertine::base::field::Field::Temperature, .. }));
/// assert!(err.to_string().contains("300"));
/// ```
#[derive(Debug, Clone, PartialEq, Error)]
#[non_exhaustive]
pub enum Error {
    /// A number lies outside the range the crate accepts for that field.
    #[error(
        "{field} = {}{} is outside the accepted range {} to {}{}",
        shown(*value),
        spaced(unit),
        shown_bound(*min),
        shown_bound(*max),
        spaced(unit)
    )]
    OutOfRange {
        /// The field, for example `temperature_c`.
        field: Field,
        /// The value given.
        value: f64,
        /// The smallest accepted value.
        min: f64,
        /// The largest accepted value.
        max: f64,
        /// The unit of `value`, `min` and `max` (may be empty; a leading
        /// space is allowed and ignored). For a value typed with a unit it
        /// is that unit, and `value` is the number as typed.
        unit: &'static str,
    },
    /// A number was NaN or infinite.
    #[error("{field} = {} is not a finite number", shown(*value))]
    NotFinite {
        /// The field.
        field: Field,
        /// The value given.
        value: f64,
    },
    /// Text that should have been a number was not one.
    #[error("{field}: `{text}` is not a number{}", slip.map_or(String::new(), |s| format!("; {}", s.advice(text))))]
    NotANumber {
        /// The field.
        field: Field,
        /// The text given.
        text: String,
        /// The likely slip, where one is recognised (a unicode minus, a
        /// decimal comma, a thousands separator, a hexadecimal number).
        slip: Option<NumberSlip>,
    },
    /// A concentration or gas value was given without a unit.
    #[error("{field}: `{text}` has no unit; accepted units: {accepted}")]
    MissingUnit {
        /// The field.
        field: Field,
        /// The text given.
        text: String,
        /// The units this field accepts.
        accepted: String,
    },
    /// A unit was not recognised, or is not one this field accepts.
    #[error("{field}: unit `{unit}` is not accepted here; accepted units: {accepted}")]
    WrongUnit {
        /// The field.
        field: Field,
        /// The unit given.
        unit: String,
        /// The units this field accepts.
        accepted: String,
    },
    /// Two measured parameters that cannot be used together.
    #[error("{first} and {second} cannot be used together: {reason}")]
    IncompatiblePair {
        /// The first parameter.
        first: Field,
        /// The second parameter.
        second: Field,
        /// Why not.
        reason: &'static str,
    },
    /// The two measured parameters are valid one by one, but no water fits both.
    #[error("no water fits {first} = {first_value} with {second} = {second_value}: {reason}")]
    NoWaterFits {
        /// The first parameter.
        first: Field,
        /// Its value, with unit.
        first_value: String,
        /// The second parameter.
        second: Field,
        /// Its value, with unit.
        second_value: String,
        /// Why no water fits.
        reason: String,
    },
    /// The solver did not converge. This is reported, never returned as a number.
    #[error("the solver did not converge for {first} with {second} after {iterations} iterations")]
    NoConvergence {
        /// The first parameter.
        first: Field,
        /// The second parameter.
        second: Field,
        /// Iterations spent.
        iterations: u32,
    },
    /// A published fit was named that does not exist for this constant.
    #[error("{constant}: unknown fit `{name}`; accepted: {accepted}")]
    UnknownFit {
        /// The constant, for example `carbonic`.
        constant: Field,
        /// The name given.
        name: String,
        /// The accepted names.
        accepted: String,
    },
    /// An option chosen that belongs to the other medium.
    #[error("{field} `{name}` is for {medium} water only: {hint}")]
    WrongMedium {
        /// The option, for example `boron`.
        field: Field,
        /// The choice given.
        name: String,
        /// The medium it belongs to.
        medium: &'static str,
        /// What to do instead.
        hint: &'static str,
    },
    /// A name that must be one of a fixed set was not.
    #[error("{field}: unknown choice `{name}`; accepted: {accepted}")]
    UnknownChoice {
        /// The field.
        field: Field,
        /// The name given.
        name: String,
        /// The accepted names.
        accepted: String,
    },
    /// A pH was given in saline water without its scale. Between the NBS
    /// scale of a glass electrode and the total scale of spectrophotometric
    /// work lie about 0.1 to 0.15 pH, which moves Ω by a quarter or more,
    /// so the scale is never assumed there.
    #[error("pH {ph} in saline water: {}", PH_SCALE_ADVICE)]
    UnstatedPhScale {
        /// The pH given.
        ph: f64,
    },
    /// Two inputs that contradict each other.
    #[error("{first} and {second} disagree: {reason}")]
    Inconsistent {
        /// The first input.
        first: Field,
        /// The second input.
        second: Field,
        /// How they disagree.
        reason: &'static str,
    },
    /// An input that is required was not given.
    #[error("{field} is required and was not given{why}")]
    Missing {
        /// The field.
        field: Field,
        /// Why it is needed, with a leading "; " (may be empty).
        why: &'static str,
    },
    /// The wrong number of values of one kind was given.
    #[error("give exactly {} {what}; {given} given", in_words(*.wanted))]
    WrongCount {
        /// The field of the kind counted.
        field: Field,
        /// How many were given.
        given: usize,
        /// How many are needed.
        wanted: usize,
        /// What is counted.
        what: &'static str,
    },
    /// A target that cannot be reached the way asked (a dose of a chemical
    /// that moves the quantity the other way, or not far enough).
    #[error("{field}: {reason}")]
    Unreachable {
        /// What was aimed at, for example `target`.
        field: Field,
        /// Why, with the limit where there is one.
        reason: String,
    },
    /// A water already beyond a target in the direction a chemical moves
    /// it (alkalinity above the target for a base, below it for an acid):
    /// no dose of that chemical reaches the target, and none is needed if
    /// the target was a limit.
    #[error("{field}: {reason}")]
    PastTarget {
        /// What was aimed at, for example `target`.
        field: Field,
        /// Where the water is, and which way the chemical moves it.
        reason: String,
    },
    /// A computed quantity (for example density) could not be evaluated.
    #[error("{field} could not be computed: {reason}")]
    Computation {
        /// The quantity.
        field: Field,
        /// Why not.
        reason: String,
    },
    // issue 11: toxic fractions and flags
    /// A profile of quality-flag limits that cannot be read: a file that
    /// is not there, TOML that does not parse, a key that is not a limit,
    /// a limit outside its accepted range. The message names the profile,
    /// the line and the key where they are known.
    #[error("profile {origin}{}{}: {problem}", line.map_or(String::new(), |l| format!(", line {l}")), key.as_ref().map_or(String::new(), |k| format!(", key `{k}`")))]
    BadProfile {
        /// The profile: a built-in name or the path of a file.
        origin: String,
        /// The line of the file (from 1), where known.
        line: Option<usize>,
        /// The key, with its table (`limits.ph_low_nbs`), where known.
        key: Option<String>,
        /// What is wrong and what is accepted.
        problem: String,
    },
}

/// What kind of error, as a stable snake_case code (serialised as that
/// code), for programs that act on errors without parsing messages.
///
/// ```
/// use travertine::{error::ErrorKind, Conditions};
/// let err = Conditions::new(25.0, 99.0).unwrap_err();
/// assert_eq!(err.kind(), ErrorKind::OutOfRange);
/// assert_eq!(err.kind().code(), "out_of_range");
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, serde::Serialize)]
#[serde(rename_all = "snake_case")]
#[non_exhaustive]
pub enum ErrorKind {
    /// [`Error::OutOfRange`].
    OutOfRange,
    /// [`Error::NotFinite`].
    NotFinite,
    /// [`Error::NotANumber`].
    NotANumber,
    /// [`Error::MissingUnit`].
    MissingUnit,
    /// [`Error::WrongUnit`].
    WrongUnit,
    /// [`Error::IncompatiblePair`].
    IncompatiblePair,
    /// [`Error::NoWaterFits`].
    NoWaterFits,
    /// [`Error::NoConvergence`].
    NoConvergence,
    /// [`Error::UnknownFit`].
    UnknownFit,
    /// [`Error::WrongMedium`].
    WrongMedium,
    /// [`Error::UnknownChoice`].
    UnknownChoice,
    /// [`Error::UnstatedPhScale`].
    UnstatedPhScale,
    /// [`Error::Inconsistent`].
    Inconsistent,
    /// [`Error::Missing`].
    Missing,
    /// [`Error::WrongCount`].
    WrongCount,
    /// [`Error::Computation`].
    Computation,
    /// [`Error::Unreachable`].
    Unreachable,
    /// [`Error::PastTarget`].
    PastTarget,
    // issue 11: toxic fractions and flags
    /// [`Error::BadProfile`].
    BadProfile,
}

/// The stable code, as in the JSON (`out_of_range`).
///
/// ```
/// use travertine::error::ErrorKind;
/// assert_eq!(ErrorKind::OutOfRange.to_string(), "out_of_range");
/// ```
impl std::fmt::Display for ErrorKind {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.code())
    }
}

// A new kind stops this match compiling: list it here and at the end of
// `ErrorKind::ALL` (the C binding gives each kind of that list a stable
// number, and a kind missing from it only a generic one).
const _: fn(ErrorKind) = |k| match k {
    ErrorKind::OutOfRange
    | ErrorKind::NotFinite
    | ErrorKind::NotANumber
    | ErrorKind::MissingUnit
    | ErrorKind::WrongUnit
    | ErrorKind::IncompatiblePair
    | ErrorKind::NoWaterFits
    | ErrorKind::NoConvergence
    | ErrorKind::UnknownFit
    | ErrorKind::WrongMedium
    | ErrorKind::UnknownChoice
    | ErrorKind::UnstatedPhScale
    | ErrorKind::Inconsistent
    | ErrorKind::Missing
    | ErrorKind::WrongCount
    | ErrorKind::Computation
    | ErrorKind::Unreachable
    | ErrorKind::PastTarget
    | ErrorKind::BadProfile => {}
};

impl ErrorKind {
    /// Every kind, in the order they were added (the C binding numbers
    /// them in this order, so a new kind goes at the end).
    ///
    /// ```
    /// use travertine::error::ErrorKind;
    /// assert_eq!(ErrorKind::ALL[0], ErrorKind::OutOfRange);
    /// ```
    pub const ALL: [ErrorKind; 19] = [
        ErrorKind::OutOfRange,
        ErrorKind::NotFinite,
        ErrorKind::NotANumber,
        ErrorKind::MissingUnit,
        ErrorKind::WrongUnit,
        ErrorKind::IncompatiblePair,
        ErrorKind::NoWaterFits,
        ErrorKind::NoConvergence,
        ErrorKind::UnknownFit,
        ErrorKind::WrongMedium,
        ErrorKind::UnknownChoice,
        ErrorKind::UnstatedPhScale,
        ErrorKind::Inconsistent,
        ErrorKind::Missing,
        ErrorKind::WrongCount,
        ErrorKind::Computation,
        ErrorKind::Unreachable,
        ErrorKind::PastTarget,
        ErrorKind::BadProfile,
    ];

    /// The stable snake_case code.
    ///
    /// ```
    /// # use travertine::base::error::ErrorKind;
    /// assert_eq!(ErrorKind::NoWaterFits.code(), "no_water_fits");
    /// ```
    pub fn code(self) -> &'static str {
        match self {
            ErrorKind::OutOfRange => "out_of_range",
            ErrorKind::NotFinite => "not_finite",
            ErrorKind::NotANumber => "not_a_number",
            ErrorKind::MissingUnit => "missing_unit",
            ErrorKind::WrongUnit => "wrong_unit",
            ErrorKind::IncompatiblePair => "incompatible_pair",
            ErrorKind::NoWaterFits => "no_water_fits",
            ErrorKind::NoConvergence => "no_convergence",
            ErrorKind::UnknownFit => "unknown_fit",
            ErrorKind::WrongMedium => "wrong_medium",
            ErrorKind::UnknownChoice => "unknown_choice",
            ErrorKind::UnstatedPhScale => "unstated_ph_scale",
            ErrorKind::Inconsistent => "inconsistent",
            ErrorKind::Missing => "missing",
            ErrorKind::WrongCount => "wrong_count",
            ErrorKind::Computation => "computation",
            ErrorKind::Unreachable => "unreachable",
            ErrorKind::PastTarget => "past_target",
            ErrorKind::BadProfile => "bad_profile",
        }
    }
}

/// An error serialises as `{"kind": ..., "field": ..., "message": ...}`,
/// `field` being null where the error names none.
///
/// ```
/// use travertine::Conditions;
/// let err = Conditions::new(25.0, 99.0).unwrap_err();
/// let json = serde_json::to_value(&err).unwrap();
/// assert_eq!(json["kind"], "out_of_range");
/// assert_eq!(json["field"], "salinity");
/// ```
impl serde::Serialize for Error {
    fn serialize<S: serde::Serializer>(
        &self,
        serializer: S,
    ) -> std::result::Result<S::Ok, S::Error> {
        use serde::ser::SerializeStruct;
        let mut s = serializer.serialize_struct("Error", 3)?;
        s.serialize_field("kind", &self.kind())?;
        s.serialize_field("field", &self.field())?;
        s.serialize_field("message", &self.to_string())?;
        s.end()
    }
}

impl Error {
    /// The kind of this error.
    ///
    /// ```
    /// use travertine::{error::ErrorKind, Measured};
    /// assert_eq!(Measured::ph(15.0, None).unwrap_err().kind(), ErrorKind::OutOfRange);
    /// ```
    pub fn kind(&self) -> ErrorKind {
        match self {
            Error::OutOfRange { .. } => ErrorKind::OutOfRange,
            Error::NotFinite { .. } => ErrorKind::NotFinite,
            Error::NotANumber { .. } => ErrorKind::NotANumber,
            Error::MissingUnit { .. } => ErrorKind::MissingUnit,
            Error::WrongUnit { .. } => ErrorKind::WrongUnit,
            Error::IncompatiblePair { .. } => ErrorKind::IncompatiblePair,
            Error::NoWaterFits { .. } => ErrorKind::NoWaterFits,
            Error::NoConvergence { .. } => ErrorKind::NoConvergence,
            Error::UnknownFit { .. } => ErrorKind::UnknownFit,
            Error::WrongMedium { .. } => ErrorKind::WrongMedium,
            Error::UnknownChoice { .. } => ErrorKind::UnknownChoice,
            Error::UnstatedPhScale { .. } => ErrorKind::UnstatedPhScale,
            Error::Inconsistent { .. } => ErrorKind::Inconsistent,
            Error::Missing { .. } => ErrorKind::Missing,
            Error::WrongCount { .. } => ErrorKind::WrongCount,
            Error::Computation { .. } => ErrorKind::Computation,
            Error::Unreachable { .. } => ErrorKind::Unreachable,
            Error::PastTarget { .. } => ErrorKind::PastTarget,
            Error::BadProfile { .. } => ErrorKind::BadProfile,
        }
    }

    /// The field the error is about, where there is one (for the first of a pair).
    ///
    /// ```
    /// use travertine::Conditions;
    /// use travertine::base::field::Field;
    /// assert_eq!(Conditions::new(25.0, 99.0).unwrap_err().field(), Some(Field::Salinity));
    /// ```
    pub fn field(&self) -> Option<Field> {
        match self {
            Error::OutOfRange { field, .. }
            | Error::NotFinite { field, .. }
            | Error::NotANumber { field, .. }
            | Error::MissingUnit { field, .. }
            | Error::WrongUnit { field, .. }
            | Error::UnknownChoice { field, .. }
            | Error::WrongMedium { field, .. }
            | Error::Missing { field, .. }
            | Error::WrongCount { field, .. }
            | Error::Computation { field, .. }
            | Error::Unreachable { field, .. }
            | Error::PastTarget { field, .. } => Some(*field),
            Error::UnknownFit { constant, .. } => Some(*constant),
            Error::UnstatedPhScale { .. } => Some(Field::PhScale),
            Error::IncompatiblePair { first, .. }
            | Error::Inconsistent { first, .. }
            | Error::NoWaterFits { first, .. }
            | Error::NoConvergence { first, .. } => Some(*first),
            Error::BadProfile { .. } => Some(Field::Profile),
        }
    }
}

/// A small count in words, for messages ("two"), else in digits.
fn in_words(n: usize) -> String {
    const WORDS: [&str; 5] = ["none", "one", "two", "three", "four"];
    WORDS
        .get(n)
        .map_or_else(|| n.to_string(), |w| (*w).to_string())
}

/// A number as echoed in a message: as Rust writes it (the shortest text
/// that reads back to the same number, which is what was typed for any
/// typed decimal), but in exponent form beyond 10¹⁵ or below 10⁻⁴, so that
/// `1e308` is not written out in 309 digits.
///
/// ```
/// use travertine::base::error::shown;
/// assert_eq!(shown(2300.0), "2300");
/// assert_eq!(shown(-5.0), "-5");
/// assert_eq!(shown(1e308), "1e308");
/// assert_eq!(shown(f64::INFINITY), "inf");
/// ```
pub fn shown(v: f64) -> String {
    let a = v.abs();
    if v == 0.0 || !v.is_finite() || (1e-4..1e15).contains(&a) {
        format!("{v}")
    } else {
        format!("{v:e}")
    }
}

/// A range bound as written in a message: as [`shown`], to at most six
/// significant figures (a bound converted to the unit the user typed, such
/// as 100 000 µmol/kg in mg/L CaCO3, is 5004.35).
fn shown_bound(v: f64) -> String {
    if v == 0.0 || !v.is_finite() {
        return shown(v);
    }
    let digits = 5 - v.abs().log10().floor() as i32;
    let rounded = if (0..=15).contains(&digits) {
        let p = 10f64.powi(digits);
        (v * p).round() / p
    } else {
        v
    };
    shown(rounded)
}

/// A unit after a number: a space, then the unit; nothing for no unit.
fn spaced(unit: &str) -> String {
    let u = unit.trim_start();
    if u.is_empty() {
        String::new()
    } else {
        format!(" {u}")
    }
}

/// A likely slip in text that should have been a number, for the hint of
/// [`Error::NotANumber`].
///
/// ```
/// use travertine::base::error::NumberSlip;
/// assert_eq!(NumberSlip::find("−5"), Some(NumberSlip::UnicodeMinus));
/// assert_eq!(NumberSlip::find("8,1"), Some(NumberSlip::DecimalComma));
/// assert_eq!(NumberSlip::find("2,300umol/kg"), Some(NumberSlip::CommaInNumber));
/// assert_eq!(NumberSlip::find("0x8FC umol/kg"), Some(NumberSlip::Hexadecimal));
/// assert_eq!(NumberSlip::find("abc"), None);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[non_exhaustive]
pub enum NumberSlip {
    /// A minus sign other than the ASCII hyphen-minus (U+2212, or a dash).
    UnicodeMinus,
    /// A comma as the decimal mark (`8,1`): one comma, followed by one,
    /// two or more than three digits.
    DecimalComma,
    /// A comma followed by exactly three digits (`2,300`): a thousands
    /// separator or a decimal comma; either way not read.
    CommaInNumber,
    /// A hexadecimal number (`0x8FC`).
    Hexadecimal,
}

impl NumberSlip {
    /// The slip in `text`, if one of the known ones is there.
    pub fn find(text: &str) -> Option<NumberSlip> {
        let t = text.trim();
        if t.starts_with([
            '\u{2212}', '\u{2013}', '\u{2014}', '\u{2012}', '\u{fe63}', '\u{ff0d}',
        ]) {
            return Some(NumberSlip::UnicodeMinus);
        }
        let b = t.trim_start_matches(['+', '-']).as_bytes();
        if b.len() > 2 && b[0] == b'0' && (b[1] == b'x' || b[1] == b'X') && b[2].is_ascii_hexdigit()
        {
            return Some(NumberSlip::Hexadecimal);
        }
        let lead = b.iter().take_while(|c| c.is_ascii_digit()).count();
        if lead > 0 && b.get(lead) == Some(&b',') {
            let after = b[lead + 1..]
                .iter()
                .take_while(|c| c.is_ascii_digit())
                .count();
            let more_comma = b.get(lead + 1 + after) == Some(&b',');
            return match after {
                0 => None,
                3 => Some(NumberSlip::CommaInNumber),
                _ if more_comma => Some(NumberSlip::CommaInNumber),
                _ => Some(NumberSlip::DecimalComma),
            };
        }
        None
    }

    /// What to do about it, for the text `text` it was found in.
    ///
    /// ```
    /// use travertine::base::error::NumberSlip;
    /// assert!(NumberSlip::DecimalComma.advice("7,9").contains("write 7.9"));
    /// assert!(NumberSlip::Hexadecimal.advice("0x8FC umol/kg").contains("0x8FC is 2300"));
    /// assert!(NumberSlip::UnicodeMinus.advice("\u{2212}5 umol/kg").contains("`-5 umol/kg`"));
    /// ```
    pub fn advice(self, text: &str) -> String {
        let t = text.trim();
        match self {
            NumberSlip::UnicodeMinus => {
                let fixed: String = t
                    .chars()
                    .map(|c| match c {
                        '\u{2212}' | '\u{2013}' | '\u{2014}' | '\u{2012}' | '\u{fe63}'
                        | '\u{ff0d}' => '-',
                        c => c,
                    })
                    .collect();
                format!(
                    "the minus sign is not the ASCII hyphen-minus (word processors and \
                     spreadsheets often write U+2212 or a dash); type `{fixed}`"
                )
            }
            NumberSlip::DecimalComma => format!(
                "a decimal comma? write {} with a decimal point; a sheet written with decimal \
                 commas is read with its decimal-comma option",
                t.replacen(',', ".", 1)
            ),
            NumberSlip::CommaInNumber => {
                let digits: String = t
                    .chars()
                    .take_while(|c| c.is_ascii_digit() || *c == ',')
                    .collect();
                format!(
                    "a comma inside the number: write {} if it separates thousands, or {} if it \
                     is a decimal mark",
                    digits.replace(',', ""),
                    digits.replacen(',', ".", 1)
                )
            }
            NumberSlip::Hexadecimal => {
                let unsigned = t.trim_start_matches(['+', '-']);
                let hex: String = unsigned[2..]
                    .chars()
                    .take_while(char::is_ascii_hexdigit)
                    .collect();
                match u64::from_str_radix(&hex, 16) {
                    Ok(v) => format!(
                        "hexadecimal numbers are not read; write the value in decimal \
                         (0x{hex} is {v})"
                    ),
                    Err(_) => "hexadecimal numbers are not read; write the value in decimal".into(),
                }
            }
        }
    }
}

/// Reads a plain number (a pH, a temperature, a fraction), with a hint
/// when the text looks like one with a slip in it.
///
/// # Errors
/// [`Error::NotANumber`], with the slip where one is recognised;
/// [`Error::NotFinite`] for NaN or an infinity.
///
/// ```
/// use travertine::base::{error::{plain_number, Error, NumberSlip}, field::Field};
/// assert_eq!(plain_number(Field::Ph, " 7.9 ")?, 7.9);
/// assert!(matches!(plain_number(Field::Ph, "7,9"),
///     Err(Error::NotANumber { slip: Some(NumberSlip::DecimalComma), .. })));
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn plain_number(field: Field, text: &str) -> Result<f64> {
    let v: f64 = text.trim().parse().map_err(|_| Error::NotANumber {
        field,
        text: text.to_string(),
        slip: NumberSlip::find(text),
    })?;
    if !v.is_finite() {
        return Err(Error::NotFinite { field, value: v });
    }
    Ok(v)
}

impl Error {
    /// This error with its value and range in the unit the user typed: an
    /// [`Error::OutOfRange`] raised on a value converted from the number
    /// `typed` in `typed_unit`, where `base_per_unit` of the checked value
    /// make one `typed_unit`, is given again with the number as typed, in
    /// its unit, and the range converted to it. Other errors are returned
    /// as they are.
    ///
    /// ```
    /// use travertine::base::error::{check_range, Field};
    /// // −5 µmol/kg checked as mol/kg.
    /// let e = check_range(Field::Phosphate, -5e-6, 0.0, 0.01, "mol/kg").unwrap_err();
    /// let e = e.in_typed_unit(-5.0, "umol/kg", 1e-6);
    /// assert_eq!(e.to_string(), "phosphate = -5 umol/kg is outside the accepted range 0 to 10000 umol/kg");
    /// ```
    #[must_use]
    pub fn in_typed_unit(self, typed: f64, typed_unit: &'static str, base_per_unit: f64) -> Error {
        match self {
            Error::OutOfRange {
                field, min, max, ..
            } if base_per_unit.is_finite() && base_per_unit > 0.0 => Error::OutOfRange {
                field,
                value: typed,
                min: min / base_per_unit,
                max: max / base_per_unit,
                unit: typed_unit,
            },
            other => other,
        }
    }
}

/// Checks that `value` is finite and within `[min, max]`.
///
/// # Errors
/// [`Error::NotFinite`] for NaN or infinities, [`Error::OutOfRange`] otherwise.
///
/// # Example
/// ```
/// use travertine::base::error::{check_range, Field};
/// assert!(check_range(Field::Salinity, 35.0, 0.0, 50.0, "").is_ok());
/// assert!(check_range(Field::Salinity, 60.0, 0.0, 50.0, "").is_err());
/// assert!(check_range(Field::Salinity, f64::NAN, 0.0, 50.0, "").is_err());
/// ```
pub fn check_range(
    field: Field,
    value: f64,
    min: f64,
    max: f64,
    unit: &'static str,
) -> Result<f64> {
    if !value.is_finite() {
        return Err(Error::NotFinite { field, value });
    }
    if value < min || value > max {
        return Err(Error::OutOfRange {
            field,
            value,
            min,
            max,
            unit,
        });
    }
    Ok(value)
}

#[cfg(test)]
mod tests {
    use super::ErrorKind;

    /// The code of each kind is the name it is serialised with.
    #[test]
    fn kind_codes_match_their_serialised_names() {
        let kinds = ErrorKind::ALL;
        for k in kinds {
            assert_eq!(serde_json::to_value(k).unwrap(), k.code());
        }
    }
}
