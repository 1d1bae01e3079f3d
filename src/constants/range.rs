//! Published validity ranges of fits, and the warnings given outside them.

use crate::warning::Warning;
use serde::Serialize;

/// The published validity range of a fit, with how well its coefficients
/// are known.
///
/// # Example
/// ```
/// use travertine::constants::FitRange;
/// let r = FitRange::new("lueker2000", (2.0, 35.0), (19.0, 43.0));
/// let mut warnings = Vec::new();
/// r.check_for("K1 and K2", 25.0, 35.0, &mut warnings);
/// assert!(warnings.is_empty());
/// r.check_for("K1 and K2", 40.0, 35.0, &mut warnings);
/// assert_eq!(warnings.len(), 1);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct FitRange {
    /// Author-year name of the fit.
    pub name: &'static str,
    /// Lowest and highest temperature, °C.
    pub temperature_c: (f64, f64),
    /// Lowest and highest practical salinity.
    pub salinity: (f64, f64),
}

impl FitRange {
    /// A range from its name and its temperature and salinity limits.
    ///
    /// ```
    /// # use travertine::constants::FitRange;
    /// let r = FitRange::new("weiss1974", (-1.0, 40.0), (0.0, 40.0));
    /// assert_eq!(r.name, "weiss1974");
    /// ```
    pub const fn new(name: &'static str, temperature_c: (f64, f64), salinity: (f64, f64)) -> Self {
        Self {
            name,
            temperature_c,
            salinity,
        }
    }

    /// Whether a temperature (°C) and salinity lie inside the range.
    ///
    /// ```
    /// # use travertine::constants::FitRange;
    /// let r = FitRange::new("x", (0.0, 40.0), (0.0, 40.0));
    /// assert!(r.contains(10.0, 5.0));
    /// assert!(!r.contains(10.0, 45.0));
    /// ```
    pub fn contains(&self, temperature_c: f64, salinity: f64) -> bool {
        // A small allowance keeps rounding at the edges from raising warnings.
        const EPS: f64 = 1e-9;
        temperature_c >= self.temperature_c.0 - EPS
            && temperature_c <= self.temperature_c.1 + EPS
            && salinity >= self.salinity.0 - EPS
            && salinity <= self.salinity.1 + EPS
    }

    /// Pushes a warning for `constant` when the conditions are outside the
    /// range. A fit with a salinity range of (0, 0) is a pure-water fit and is
    /// checked on temperature alone.
    ///
    /// ```
    /// # use travertine::constants::FitRange;
    /// let r = FitRange::new("mucci1983", (5.0, 40.0), (5.0, 44.0));
    /// let mut w = Vec::new();
    /// r.check_for("calcite and aragonite", 2.0, 35.0, &mut w);
    /// assert!(w[0].to_string().contains("mucci1983"));
    /// ```
    pub fn check_for(
        &self,
        constant: &'static str,
        temperature_c: f64,
        salinity: f64,
        warnings: &mut Vec<Warning>,
    ) {
        let s = if self.salinity == (0.0, 0.0) {
            0.0
        } else {
            salinity
        };
        if !self.contains(temperature_c, s) {
            warnings.push(Warning::Extrapolated {
                constant,
                range: *self,
                temperature_c,
                salinity,
            });
        }
    }
}
