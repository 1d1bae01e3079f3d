//! Ammonium in sea water.

use super::FitRange;
use crate::base::numeric::Real;

/// Published range of the Johansson & Wedborg (1980) fit (from memory, unverified).
pub const JOHANSSON_WEDBORG1980_RANGE: FitRange =
    FitRange::new("johansson-wedborg1980", (5.0, 30.0), (20.0, 40.0));

/// pKa of NH4⁺ in sea water, Johansson & Wedborg (1980).
///
/// ```text
/// pKa = -0.467 + 0.00113 S + 2887.9/T
/// ```
/// Coefficients from memory (unverified). The scale is taken to be the
/// sea-water scale (unverified). The Khoo et al. (1977) expression is not
/// used: it carries a known error (Bell et al. 2007). Check value (computed):
/// 9.2586 at S 35, 25 °C.
///
/// ```
/// let pk = travertine::fits::ammonia::johansson_wedborg1980_pka(298.15, 35.0);
/// assert!((pk - 9.2586).abs() < 5e-5);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn johansson_wedborg1980_pka<R: Real>(temperature_k: R, salinity: R) -> R {
    salinity * 0.00113 + -0.467 + temperature_k.under(2887.9)
}
