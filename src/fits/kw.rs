//! The ion product of water in sea water.

use super::FitRange;
use crate::base::numeric::Real;

/// Published range of Millero (1995) KW (range from memory, unverified).
pub const MILLERO1995_KW_RANGE: FitRange = FitRange::new("millero1995", (0.0, 45.0), (0.0, 45.0));

/// ln KW of Millero (1995), total scale, (mol/kg-soln)².
///
/// ```text
/// ln KW = 148.96502 - 13847.26/T - 23.6521 ln T
///         + (118.67/T - 5.977 + 1.0495 ln T) S^0.5 - 0.01615 S
/// ```
/// Coefficients verified (the Guide prints the constant as 148.9652; both
/// give the check value). Check value (Dickson, Sabine & Christian 2007):
/// ln KW = −30.434 at S 35, 25 °C.
///
/// ```
/// let l = travertine::fits::kw::millero1995_ln_kw(298.15, 35.0);
/// assert!((l - -30.434).abs() < 5e-4);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn millero1995_ln_kw<R: Real>(temperature_k: R, salinity: R) -> R {
    let t = temperature_k;
    let ln_t = t.ln();
    t.under(13847.26).subtracted_from(148.96502) - ln_t * 23.6521
        + (t.under(118.67) - 5.977 + ln_t * 1.0495) * salinity.sqrt()
        - salinity * 0.01615
}
