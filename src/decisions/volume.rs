//! The volume of water a dose treats: given, or a pond's area times its
//! mean depth, in the units of the trade.

use crate::base::error::{check_range, Error, Result};
use crate::base::field::Field;

/// Cubic metres in one US gallon: 231 cubic inches exactly (NIST
/// Handbook 44; common practice).
pub const M3_PER_US_GALLON: f64 = 3.785_411_784e-3;
/// Square metres in one acre: 4046.856 422 4 exactly (international acre).
pub const M2_PER_ACRE: f64 = 4_046.856_422_4;
/// Metres in one foot: 0.3048 exactly.
pub const M_PER_FOOT: f64 = 0.3048;
/// Cubic metres in one acre-foot: an acre one foot deep.
pub const M3_PER_ACRE_FOOT: f64 = M2_PER_ACRE * M_PER_FOOT;
/// Kilograms in one avoirdupois pound: 0.453 592 37 exactly.
pub const KG_PER_POUND: f64 = 0.453_592_37;

/// A number and the unit text after it.
fn split(field: Field, text: &str) -> Result<(f64, String)> {
    let t = text.trim();
    let n = t
        .find(|c: char| !(c.is_ascii_digit() || matches!(c, '.' | '-' | '+' | 'e' | 'E')))
        .unwrap_or(t.len());
    let value = crate::base::error::plain_number(field, &t[..n])?;
    Ok((value, t[n..].trim().to_ascii_lowercase()))
}

fn wrong(field: Field, unit: &str, accepted: &str) -> Error {
    Error::WrongUnit {
        field,
        unit: unit.to_string(),
        accepted: accepted.to_string(),
    }
}

/// A volume of water, m³.
///
/// ```
/// use travertine::decisions::volume::Volume;
/// assert_eq!(Volume::parse("1000 m3")?.m3(), 1000.0);
/// assert!((Volume::parse("1 acre-ft")?.m3() - 1233.48).abs() < 0.01);
/// // A 0.8 ha pond 1.2 m deep.
/// assert!((Volume::of_pond("0.8 ha", "1.2 m")?.m3() - 9600.0).abs() < 1e-9);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub struct Volume {
    m3: f64,
}

/// The volume units [`Volume::parse`] reads.
pub const VOLUME_UNITS: &str = "m3, L, gal (US), acre-ft";
/// The area units [`Volume::of_pond`] reads.
pub const AREA_UNITS: &str = "m2, ha, acre";
/// The depth units [`Volume::of_pond`] reads.
pub const DEPTH_UNITS: &str = "m, ft";

impl Volume {
    /// A volume in m³.
    ///
    /// # Errors
    /// [`Error::OutOfRange`] unless positive and finite.
    pub fn from_m3(m3: f64) -> Result<Self> {
        check_range(Field::Volume, m3, 1e-9, 1e12, " m³")?;
        Ok(Volume { m3 })
    }

    /// Reads `1000 m3`, `5000 L`, `20000 gal`, `2.5 acre-ft`.
    ///
    /// # Errors
    /// [`Error::WrongUnit`] for another unit; as [`Volume::from_m3`].
    pub fn parse(text: &str) -> Result<Self> {
        let (v, unit) = split(Field::Volume, text)?;
        let per = match unit.as_str() {
            "m3" | "m³" | "m^3" | "cubic metres" | "cubic meters" => 1.0,
            "l" | "litre" | "litres" | "liter" | "liters" => 1e-3,
            "gal" | "gallon" | "gallons" | "us gal" | "usgal" => M3_PER_US_GALLON,
            "acre-ft" | "acre-feet" | "acre-foot" | "af" => M3_PER_ACRE_FOOT,
            _ => return Err(wrong(Field::Volume, &unit, VOLUME_UNITS)),
        };
        Volume::from_m3(v * per)
    }

    /// A pond's volume from its area (`0.8 ha`, `2 acre`, `5000 m2`) and
    /// mean depth (`1.2 m`, `4 ft`).
    ///
    /// # Errors
    /// [`Error::WrongUnit`] for other units; [`Error::OutOfRange`] unless
    /// both are positive.
    pub fn of_pond(area: &str, mean_depth: &str) -> Result<Self> {
        let (a, unit) = split(Field::Area, area)?;
        let m2 = a * match unit.as_str() {
            "m2" | "m²" | "m^2" => 1.0,
            "ha" | "hectare" | "hectares" => 1e4,
            "acre" | "acres" | "ac" => M2_PER_ACRE,
            _ => return Err(wrong(Field::Area, &unit, AREA_UNITS)),
        };
        check_range(Field::Area, m2, 1e-6, 1e10, " m²")?;
        let (d, unit) = split(Field::MeanDepth, mean_depth)?;
        let m = d * match unit.as_str() {
            "m" | "metre" | "metres" | "meter" | "meters" => 1.0,
            "ft" | "foot" | "feet" => M_PER_FOOT,
            _ => return Err(wrong(Field::MeanDepth, &unit, DEPTH_UNITS)),
        };
        check_range(Field::MeanDepth, m, 1e-3, 1e3, " m")?;
        Volume::from_m3(m2 * m)
    }

    /// The volume, m³.
    pub fn m3(self) -> f64 {
        self.m3
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn units_of_the_trade() {
        // Definitions: NIST Handbook 44 (US gallon, acre, foot).
        assert!((Volume::parse("1000 L").unwrap().m3() - 1.0).abs() < 1e-12);
        assert!((Volume::parse("1 gal").unwrap().m3() - 3.785411784e-3).abs() < 1e-15);
        assert!(
            (Volume::of_pond("1 acre", "1 ft").unwrap().m3() - 1_233.481_837_547_52).abs() < 1e-6
        );
        assert!(Volume::parse("10 furlongs").is_err());
        assert!(Volume::parse("-5 m3").is_err());
        assert!(Volume::of_pond("1 ha", "0 m").is_err());
    }
}
