//! Cautions that travel with a result. They are values, formatted only when
//! shown, so a solve that raises one stays cheap.

use crate::constants::FitRange;
use serde::{Serialize, Serializer};
use std::fmt;

/// A caution about a result: a fit used outside its published range, a
/// second root, an approximation.
///
/// Serialised as its message (a JSON string).
///
/// # Example
/// ```
/// use travertine::{Conditions, Measured, Water};
/// let s = Water::saline(Conditions::new(25.0, 5.0)?)?
///     .solve(Measured::ph(7.8, None)?, Measured::dic_umol_kg(600.0)?)?;
/// // Perez & Fraga (1987) KF is published for salinity 10 to 40.
/// assert!(s.warnings.iter().any(|w| w.to_string().contains("perez-fraga1987")));
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub enum Warning {
    /// A fit used outside its published range.
    Extrapolated {
        /// The constant, for example "KF".
        constant: &'static str,
        /// The fit and its range.
        range: FitRange,
        /// Temperature used, °C.
        temperature_c: f64,
        /// Salinity used.
        salinity: f64,
    },
    /// A pair with two roots: the other one.
    OtherRoot {
        /// First parameter.
        first: &'static str,
        /// Second parameter.
        second: &'static str,
        /// pH of the other root on `scale`.
        ph: f64,
        /// The scale.
        scale: &'static str,
        /// Whether the other root has the higher pH.
        higher: bool,
    },
    /// A fixed caution.
    Note(&'static str),
    /// Any other caution.
    Text(String),
}

impl fmt::Display for Warning {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Warning::Extrapolated {
                constant,
                range,
                temperature_c,
                salinity,
            } => {
                let r = range;
                if r.salinity == (0.0, 0.0) {
                    write!(
                        f,
                        "{constant} ({}) is extrapolated: published for {} to {} °C, used at {} °C",
                        r.name, r.temperature_c.0, r.temperature_c.1, temperature_c
                    )
                } else {
                    write!(
                        f,
                        "{constant} ({}) is extrapolated: published for {} to {} °C and salinity \
                         {} to {}, used at {} °C and salinity {}",
                        r.name,
                        r.temperature_c.0,
                        r.temperature_c.1,
                        r.salinity.0,
                        r.salinity.1,
                        temperature_c,
                        (salinity * 1e4).round() / 1e4
                    )
                }
            }
            Warning::OtherRoot {
                first,
                second,
                ph,
                scale,
                higher,
            } => {
                let which = if *higher { "higher" } else { "lower" };
                write!(
                    f,
                    "{first} with {second} also fits a water of pH {ph:.4} ({scale} scale); ask \
                     for the {which}-pH root to get it"
                )
            }
            Warning::Note(s) => f.write_str(s),
            Warning::Text(s) => f.write_str(s),
        }
    }
}

impl Serialize for Warning {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        serializer.collect_str(self)
    }
}
