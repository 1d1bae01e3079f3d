//! Bisulfate: its dissociation constant, the ionic strength of sea water and
//! total sulfate from salinity.

use super::FitRange;
use crate::base::error::{Error, Result};
use crate::base::field::Field;
use crate::base::numeric::Real;
use serde::Serialize;

/// Published range of Dickson (1990) KS (range from memory, unverified).
pub const DICKSON1990_KS_RANGE: FitRange = FitRange::new("dickson1990", (0.0, 45.0), (5.0, 45.0));

/// Ionic strength of sea water, mol/kg-H2O, from practical salinity.
///
/// ```text
/// I = 19.924 S / (1000 - 1.005 S)
/// ```
/// Coefficients from memory (unverified); the form is the one used with
/// Dickson (1990) KS.
///
/// ```
/// let i = travertine::fits::sulfate::seawater_ionic_strength(35.0);
/// assert!((i - 0.7227).abs() < 1e-4);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn seawater_ionic_strength<R: Real>(salinity: R) -> R {
    salinity * 19.924 / (salinity * 1.005).subtracted_from(1000.0)
}

/// ln KS of Dickson (1990) for HSO4⁻, FREE scale, mol/kg-soln.
///
/// ```text
/// ln KS = -4276.1/T + 141.328 - 23.093 ln T + (-13856/T + 324.57 - 47.986 ln T) I^0.5
///         + (35474/T - 771.54 + 114.723 ln T) I - 2698/T I^1.5 + 1776/T I^2
///         + ln(1 - 0.001005 S)
/// ```
/// Coefficients verified. Check value (Dickson, Sabine & Christian 2007):
/// ln KS = −2.30 at S 35, 25 °C.
///
/// ```
/// let l = travertine::fits::sulfate::dickson1990_ln_ks(298.15, 35.0);
/// assert!((l - -2.30).abs() < 5e-3);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn dickson1990_ln_ks<R: Real>(temperature_k: R, salinity: R) -> R {
    let t = temperature_k;
    let ln_t = t.ln();
    let i = seawater_ionic_strength(salinity);
    let ri = i.sqrt();
    t.under(-4276.1) + 141.328 - ln_t * 23.093
        + (t.under(-13856.0) + 324.57 - ln_t * 47.986) * ri
        + (t.under(35474.0) - 771.54 + ln_t * 114.723) * i
        - t.under(2698.0) * i * ri
        + t.under(1776.0) * i * i
        + (salinity * 0.001005).subtracted_from(1.0).ln()
}

/// Total sulfate, mol/kg-soln, from Morris & Riley (1966):
/// `ST = (0.1400 / 96.062) * (S / 1.80655)`. Ratio from memory (unverified).
/// Check value (computed): 0.02824 mol/kg at S 35.
///
/// ```
/// let st = travertine::fits::sulfate::morris_riley1966_total_mol_kg(35.0);
/// assert!((st - 0.02824).abs() < 5e-6);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn morris_riley1966_total_mol_kg<R: Real>(salinity: R) -> R {
    (salinity / 1.80655) * (0.1400 / 96.062)
}

/// The bisulfate fit. Only Dickson (1990) is offered; it is a value so that
/// the choice is recorded like every other.
///
/// ```
/// use travertine::fits::BisulfateFit;
/// assert_eq!(BisulfateFit::default().name(), "dickson1990");
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Default)]
#[non_exhaustive]
pub enum BisulfateFit {
    /// Dickson (1990), free scale.
    #[default]
    #[serde(rename = "dickson1990")]
    Dickson1990,
}

impl BisulfateFit {
    /// Author-year name.
    ///
    /// ```
    /// # use travertine::fits::BisulfateFit;
    /// assert_eq!(BisulfateFit::Dickson1990.name(), "dickson1990");
    /// ```
    pub fn name(self) -> &'static str {
        "dickson1990"
    }
}

impl std::str::FromStr for BisulfateFit {
    type Err = Error;
    fn from_str(s: &str) -> Result<Self> {
        if s.trim().eq_ignore_ascii_case("dickson1990") {
            Ok(BisulfateFit::Dickson1990)
        } else {
            Err(Error::UnknownFit {
                constant: Field::BisulfateFit,
                name: s.to_string(),
                accepted: "dickson1990".to_string(),
            })
        }
    }
}

/// The plain name, as [`BisulfateFit::name`] gives it.
///
/// ```
/// assert_eq!(travertine::fits::BisulfateFit::Dickson1990.to_string(), "dickson1990");
/// ```
impl std::fmt::Display for BisulfateFit {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}
