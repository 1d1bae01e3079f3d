//! Hydrogen sulfide (first dissociation) in sea water.

use super::FitRange;
use crate::base::numeric::Real;

/// Published range of the Millero, Plese & Fernandez (1988) fit (from memory, unverified).
pub const MILLERO1988_RANGE: FitRange = FitRange::new("millero1988", (0.0, 65.0), (0.0, 44.0));

/// pK1* of H2S, Millero, Plese & Fernandez (1988), total scale.
///
/// ```text
/// pK1  = -98.080 + 5765.4/T + 15.0455 ln T        (pure water)
/// pK1* = pK1 - 0.1498 S^0.5 + 0.0119 S           (their consensus fit)
/// ```
/// Coefficients seen in the published text, but the exponents of S were
/// partly lost in the scan: treat the salinity terms as unverified. Check
/// values (computed): 6.9804 at S 0 and 6.5107 at S 35, 25 °C.
///
/// ```
/// let pk = travertine::fits::sulfide::millero1988_pk1(298.15, 35.0);
/// assert!((pk - 6.5107).abs() < 5e-5);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn millero1988_pk1<R: Real>(temperature_k: R, salinity: R) -> R {
    let t = temperature_k;
    t.under(5765.4) + -98.080 + t.ln() * 15.0455 - salinity.sqrt() * 0.1498 + salinity * 0.0119
}
