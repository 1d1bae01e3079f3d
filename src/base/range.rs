//! Published validity ranges of fits (the warning given outside one is
//! [`FitRange::check_for`], with the warnings).

use serde::Serialize;

/// The published validity range of a fit, with how well its coefficients
/// are known.
///
/// # Example
/// ```
/// use travertine::fits::FitRange;
/// let r = FitRange::new("lueker2000", (2.0, 35.0), (19.0, 43.0));
/// let mut warnings = Vec::new();
/// r.check_for("K1 and K2", 25.0, 35.0, &mut warnings);
/// assert!(warnings.is_empty());
/// r.check_for("K1 and K2", 40.0, 35.0, &mut warnings);
/// assert_eq!(warnings.len(), 1);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[non_exhaustive]
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
    /// # use travertine::fits::FitRange;
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
    /// # use travertine::fits::FitRange;
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
}
