//! CO2 solubility, fugacity and the vapour pressure of water.

use super::FitRange;
use crate::base::numeric::Real;

/// Gas constant in cm³ atm mol⁻¹ K⁻¹, as used with Weiss (1974) virial coefficients.
pub const R_CM3_ATM: f64 = 82.0578;

/// Published range of Weiss (1974) K0: −1 to 40 °C, salinity 0 to 40.
/// The range is from memory (unverified).
pub const WEISS1974_RANGE: FitRange = FitRange::new("weiss1974", (-1.0, 40.0), (0.0, 40.0));

/// Published range of Weiss & Price (1980) water vapour pressure (from memory, unverified).
pub const WEISS_PRICE1980_RANGE: FitRange =
    FitRange::new("weiss-price1980", (0.0, 40.0), (0.0, 40.0));

/// ln K0, CO2 solubility in mol kg⁻¹ atm⁻¹, Weiss (1974).
///
/// ```text
/// ln K0 = -60.2409 + 93.4517 (100/T) + 23.3585 ln(T/100)
///         + S (0.023517 - 0.023656 (T/100) + 0.0047036 (T/100)^2)
/// ```
/// Coefficients verified against the published text. Basis: per kg of solution,
/// for the fugacity of CO2. Check value: ln K0 = −3.5617 at S 35, 25 °C
/// (Dickson, Sabine & Christian 2007).
///
/// # Example
/// ```
/// let ln_k0 = travertine::fits::gas::weiss1974_ln_k0(298.15, 35.0);
/// assert!((ln_k0 - -3.5617).abs() < 5e-5);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn weiss1974_ln_k0<R: Real>(temperature_k: R, salinity: R) -> R {
    let t100 = temperature_k / 100.0;
    t100.under(93.4517)
        + -60.2409
        + t100.ln() * 23.3585
        + salinity * ((t100 * 0.023656).subtracted_from(0.023517) + t100 * 0.0047036 * t100)
}

/// Fugacity coefficient fCO2/pCO2 of CO2 in air, Weiss (1974).
///
/// ```text
/// B     = -1636.75 + 12.0408 T - 3.27957e-2 T^2 + 3.16528e-5 T^3   (cm3/mol, verified)
/// delta =  57.7 - 0.118 T                                           (cm3/mol, from memory, unverified)
/// fCO2/pCO2 = exp( P (B + 2 delta) / (R T) )
/// ```
/// The (1 − xCO2)² factor of the δ term is taken as 1: below 2000 ppm that
/// changes the coefficient by less than 1e-5 relative, and it keeps the factor a
/// function of the conditions alone. P is the total pressure in atm.
/// Check value: 0.996810 at 25 °C and 1 atm (computed from the equation).
///
/// # Example
/// ```
/// let f = travertine::fits::gas::weiss1974_fugacity_factor(298.15, 1.0);
/// assert!((f - 0.996810).abs() < 2e-6);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn weiss1974_fugacity_factor<R: Real>(temperature_k: R, air_pressure_atm: R) -> R {
    let t = temperature_k;
    let b = t * 12.0408 + -1636.75 - t * 3.27957e-2 * t + t * 3.16528e-5 * t * t;
    let delta = (t * 0.118).subtracted_from(57.7);
    (air_pressure_atm * (b + delta * 2.0) / (t * R_CM3_ATM)).exp()
}

/// Water vapour pressure over sea water, atm, Weiss & Price (1980).
///
/// ```text
/// ln pH2O = 24.4543 - 67.4509 (100/T) - 4.8489 ln(T/100) - 0.000544 S
/// ```
/// Coefficients from memory (unverified). Check value: 0.030655 atm at S 35,
/// 25 °C (computed from the equation).
///
/// # Example
/// ```
/// let p = travertine::fits::gas::weiss_price1980_vapour_pressure_atm(298.15, 35.0);
/// assert!((p - 0.030655).abs() < 2e-6);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn weiss_price1980_vapour_pressure_atm<R: Real>(temperature_k: R, salinity: R) -> R {
    let t100 = temperature_k / 100.0;
    (t100.under(67.4509).subtracted_from(24.4543) - t100.ln() * 4.8489 - salinity * 0.000544).exp()
}
