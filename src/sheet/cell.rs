//! Reading one cell of a recognised column.
//!
//! An empty cell, or one of the usual "not measured" marks (`NA`, `N/A`,
//! `-`, `—`), means "not measured". A number may be followed by the
//! column's own unit (`25 °C` in a °C column); any other text is an error
//! for that row only.

use super::header::{cell_unit, Column, Reading};
use crate::base::error::{Error, NumberSlip};
use crate::base::units::number_len;
use crate::base::units::Quantity;
use crate::sample::values::Conductivity;
use crate::sample::values::InputValue;

/// One value of a row.
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum Cell<'a> {
    /// A number in the unit of its column (NaN: not measured).
    Number(f64),
    /// A text, read as a cell of a sheet is (a name such as `fresh`, or a
    /// number with the column's unit).
    Text(&'a str),
    /// Not measured.
    Empty,
}

/// Why a cell cannot be read.
#[derive(Debug, Clone, PartialEq)]
pub(crate) enum Problem {
    /// Not a number; with the likely slip where one is recognised (`7,9`
    /// without `--decimal-comma`, a unicode minus, `0x…`, `2,300`).
    NotANumber(Option<NumberSlip>),
    NotFinite,
    /// A unit after the number other than the column's.
    OtherUnit {
        cell: &'static str,
        column: &'static str,
    },
    /// A name that is not one of the choices.
    Choice(Error),
}

impl Problem {
    /// The message, with the column and the cell text.
    pub(crate) fn message(&self, header: &str, text: &str) -> String {
        let text = shorten(text);
        match self {
            Problem::NotANumber(None) => format!("column `{header}`: `{text}` is not a number"),
            Problem::NotANumber(Some(NumberSlip::DecimalComma)) => format!(
                "column `{header}`: `{text}` is not a number (a decimal comma? give --decimal-comma)"
            ),
            Problem::NotANumber(Some(slip)) => format!(
                "column `{header}`: `{text}` is not a number; {}",
                slip.advice(&text)
            ),
            Problem::NotFinite => format!("column `{header}`: `{text}` is not a finite number"),
            Problem::OtherUnit { cell, column } if !cell.is_empty() && !column.is_empty() => {
                format!(
                    "column `{header}`: `{text}` is in {cell}, but the column is in {column}; \
                     write the value in {column}"
                )
            }
            Problem::OtherUnit { .. } => format!(
                "column `{header}`: `{text}` carries a unit other than the column's; write the \
                 number alone"
            ),
            Problem::Choice(e) => format!("column `{header}`: {e}"),
        }
    }

    /// The stable code of the problem, as the library's errors have
    /// ([`crate::error::ErrorKind::code`]).
    pub(crate) fn code(&self) -> &'static str {
        match self {
            Problem::NotANumber(_) => "not_a_number",
            Problem::NotFinite => "not_finite",
            Problem::OtherUnit { .. } => "wrong_unit",
            Problem::Choice(e) => e.kind().code(),
        }
    }

    /// The message without the cell text, for counting alike problems.
    pub(crate) fn key(&self, header: &str) -> String {
        match self {
            Problem::NotANumber(_) => {
                format!("column `{header}`: not a number")
            }
            Problem::NotFinite => format!("column `{header}`: not a finite number"),
            Problem::OtherUnit { .. } => {
                format!("column `{header}`: a unit other than the column's")
            }
            Problem::Choice(_) => format!("column `{header}`: unknown name"),
        }
    }
}

/// At most 40 characters of a cell, for messages.
pub(crate) fn shorten(text: &str) -> String {
    const MAX: usize = 40;
    if text.chars().count() <= MAX {
        return text.to_string();
    }
    let head: String = text.chars().take(MAX).collect();
    format!("{head}… ({} bytes)", text.len())
}

/// Whether the trimmed text means "not measured".
fn not_measured(t: &str) -> bool {
    t.is_empty()
        || matches!(t, "-" | "--" | "—" | "–")
        || t.eq_ignore_ascii_case("na")
        || t.eq_ignore_ascii_case("n/a")
}

/// Exact powers of ten.
const POW10: [f64; 16] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15,
];

/// A plain decimal (`-12.345`: sign, at most 15 digits, one point, no
/// exponent) read exactly: the digits as an integer below 2^53 divided by
/// an exact power of ten is the correctly rounded value (Clinger 1990), the
/// same as `str::parse`. `None` for anything else.
fn plain_decimal(b: &[u8]) -> Option<f64> {
    let (negative, digits) = match b.first()? {
        b'-' => (true, &b[1..]),
        b'+' => (false, &b[1..]),
        _ => (false, b),
    };
    let mut mantissa: u64 = 0;
    let mut count = 0usize;
    let mut decimals = None;
    for (i, &c) in digits.iter().enumerate() {
        match c {
            b'0'..=b'9' => {
                count += 1;
                if count > 15 {
                    return None;
                }
                mantissa = mantissa * 10 + u64::from(c - b'0');
            }
            b'.' if decimals.is_none() => decimals = Some(digits.len() - i - 1),
            _ => return None,
        }
    }
    if count == 0 {
        return None;
    }
    let v = mantissa as f64 / POW10[decimals.unwrap_or(0)];
    Some(if negative { -v } else { v })
}

/// A number with an optional unit after it.
fn number(column: &Column, t: &str, decimal_comma: bool) -> Result<f64, Problem> {
    let mut swapped = [0u8; 64];
    let bytes = if decimal_comma && t.len() <= swapped.len() && t.contains(',') {
        if t.contains('.') {
            return Err(Problem::NotANumber(None));
        }
        for (dst, src) in swapped.iter_mut().zip(t.bytes()) {
            *dst = if src == b',' { b'.' } else { src };
        }
        &swapped[..t.len()]
    } else {
        t.as_bytes()
    };
    let n = number_len(bytes);
    if n == 0 {
        let lower = t.trim_start_matches(['+', '-']).to_ascii_lowercase();
        if lower.starts_with("nan") || lower.starts_with("inf") {
            return Err(Problem::NotFinite);
        }
        return Err(Problem::NotANumber(NumberSlip::find(t)));
    }
    // The prefix is ASCII, so it ends on a char boundary of `t` as well.
    let prefix = if bytes.as_ptr() == t.as_ptr() {
        Some(&t[..n])
    } else {
        std::str::from_utf8(&bytes[..n]).ok()
    };
    let value: f64 = match plain_decimal(&bytes[..n]) {
        Some(v) => v,
        None => prefix
            .and_then(|s| s.parse().ok())
            .ok_or(Problem::NotANumber(None))?,
    };
    let rest = t[n..].trim();
    if !rest.is_empty() {
        match cell_unit(column, rest) {
            Some(r) if r == column.reading => {}
            Some(r) => {
                return Err(Problem::OtherUnit {
                    cell: label(r),
                    column: label(column.reading),
                })
            }
            None => {
                return Err(Problem::NotANumber(NumberSlip::find(t)));
            }
        }
    }
    if !value.is_finite() {
        return Err(Problem::NotFinite);
    }
    Ok(value)
}

fn label(r: Reading) -> &'static str {
    match r {
        Reading::Number { label, .. } => label,
        Reading::Quantity(u) => u.spelling(),
        Reading::Conductivity { scale, specific } => match (scale == 1.0, specific) {
            (true, false) => "uS/cm",
            (false, false) => "mS/cm",
            (true, true) => "uS/cm@25C",
            (false, true) => "mS/cm@25C",
        },
        Reading::Ph(Some(s)) => s.name(),
        _ => "",
    }
}

/// Reads a number given as a number (not as text) in a column: in the
/// column's unit, as a cell holding it would be read. A name column takes
/// no number.
pub(crate) fn number_value(column: &Column, v: f64) -> Result<Option<InputValue>, Problem> {
    if !v.is_finite() {
        return Err(Problem::NotFinite);
    }
    Ok(Some(match column.reading {
        Reading::Text => return Err(Problem::NotANumber(None)),
        Reading::Number { scale, offset, .. } => InputValue::Number(v * scale + offset),
        Reading::Quantity(unit) => InputValue::Quantity(Quantity::new(v, unit)),
        Reading::Conductivity { scale, specific } => {
            let us_cm = v * scale;
            InputValue::Conductivity(if specific {
                Conductivity::Specific { us_cm }
            } else {
                Conductivity::AtTemperature { us_cm }
            })
        }
        Reading::Ph(scale) => InputValue::Ph(v, scale),
    }))
}

/// Reads a cell; `Ok(None)` when it is empty or marked as not measured.
pub(crate) fn parse(
    column: &Column,
    bytes: &[u8],
    decimal_comma: bool,
) -> Result<Option<InputValue>, Problem> {
    let trimmed = bytes.trim_ascii();
    // The common case, a plain decimal, needs no more than a look at its bytes.
    let fast = if column.reading == Reading::Text {
        None
    } else {
        plain_decimal(trimmed)
    };
    let t = match fast {
        Some(_) => "",
        None => {
            let Ok(text) = std::str::from_utf8(trimmed) else {
                return Err(Problem::NotANumber(None));
            };
            let t = text.trim();
            if not_measured(t) {
                return Ok(None);
            }
            t
        }
    };
    let value = |decimal_comma| match fast {
        Some(v) => Ok(v),
        None => number(column, t, decimal_comma),
    };
    let parsed = match column.reading {
        Reading::Text => column.field.read(t).map_err(Problem::Choice)?,
        Reading::Number { scale, offset, .. } => {
            InputValue::Number(value(decimal_comma)? * scale + offset)
        }
        Reading::Quantity(unit) => InputValue::Quantity(Quantity::new(value(decimal_comma)?, unit)),
        Reading::Conductivity { scale, specific } => {
            let us_cm = value(decimal_comma)? * scale;
            InputValue::Conductivity(if specific {
                Conductivity::Specific { us_cm }
            } else {
                Conductivity::AtTemperature { us_cm }
            })
        }
        Reading::Ph(scale) => InputValue::Ph(value(decimal_comma)?, scale),
    };
    Ok(Some(parsed))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::properties::scales::PhScale;
    use crate::sample::inputs::Input;
    use crate::sample::measured::Parameter;
    use crate::sheet::header::{recognise, Recognition};

    fn col(h: &str) -> Column {
        match recognise(h) {
            Recognition::Column(c) => c,
            other => panic!("{other:?}"),
        }
    }

    #[test]
    fn plain_decimals_read_as_the_standard_library_does() {
        for text in [
            "0",
            "7.9",
            "-12.345",
            "+3.5",
            "2300",
            "0.000123",
            "123456789012345",
            "8.",
            ".5",
            "99999.99999",
            "1.1",
            "0.1",
            "-0.0",
        ] {
            let fast = plain_decimal(text.as_bytes());
            let std: f64 = text.parse().unwrap();
            assert_eq!(fast.map(f64::to_bits), Some(std.to_bits()), "{text}");
        }
        // Found by the fuzzer: twenty digits overflowed the mantissa.
        for text in [
            "",
            "-",
            ".",
            "1e5",
            "1234567890123456",
            "99999999999999999999999",
            "1.2.3",
            "7,9",
        ] {
            assert_eq!(plain_decimal(text.as_bytes()), None, "{text}");
        }
    }

    #[test]
    fn numbers_units_and_marks() {
        let ph = col("pH (NBS)");
        assert_eq!(
            parse(&ph, b" 7.9 ", false),
            Ok(Some(InputValue::Ph(7.9, Some(PhScale::Nbs))))
        );
        assert_eq!(parse(&ph, b"", false), Ok(None));
        assert_eq!(parse(&ph, b"NA", false), Ok(None));
        assert_eq!(parse(&ph, b"7..9", false), Err(Problem::NotANumber(None)));
        assert_eq!(
            parse(&ph, b"7,9", false),
            Err(Problem::NotANumber(Some(NumberSlip::DecimalComma)))
        );
        assert_eq!(
            parse(&ph, "\u{2212}7".as_bytes(), false),
            Err(Problem::NotANumber(Some(NumberSlip::UnicodeMinus)))
        );
        assert_eq!(
            parse(&ph, b"7,9", true),
            Ok(Some(InputValue::Ph(7.9, Some(PhScale::Nbs))))
        );
        assert_eq!(parse(&ph, b"NaN", false), Err(Problem::NotFinite));
        assert_eq!(parse(&ph, b"-inf", false), Err(Problem::NotFinite));
        assert_eq!(parse(&ph, b"1e999", false), Err(Problem::NotFinite));
        assert_eq!(parse(&ph, b"\xff7", false), Err(Problem::NotANumber(None)));

        let t = col("Temp [°C]");
        assert_eq!(
            parse(&t, b"25 C", false),
            Ok(Some(InputValue::Number(25.0)))
        );
        assert_eq!(
            parse(&t, b"78 F", false),
            Err(Problem::OtherUnit {
                cell: "°F",
                column: "°C"
            })
        );
        let f = col("temperature_f");
        let Ok(Some(InputValue::Number(c))) = parse(&f, b"77", false) else {
            panic!()
        };
        assert!((c - 25.0).abs() < 1e-12); // 77 °F is 25 °C (definition of the scales)

        let ta = col("Alkalinity (mg/L as CaCO3)");
        assert_eq!(ta.field, Input::Carbon(Parameter::Alkalinity));
        assert!(parse(&ta, b"120 mg/L as CaCO3", false).is_ok());
        assert!(parse(&ta, b"120 umol/kg", false).is_err());
    }
}
