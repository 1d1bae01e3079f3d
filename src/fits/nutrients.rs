//! Phosphoric and silicic acids in sea water, Millero (1995).

use super::FitRange;
use crate::fits::sulfate::seawater_ionic_strength;

/// Published range of the Millero (1995) phosphate and silicate fits
/// (range from memory, unverified).
pub const MILLERO1995_NUTRIENT_RANGE: FitRange =
    FitRange::new("millero1995", (0.0, 45.0), (0.0, 45.0));

/// ln KP1, ln KP2, ln KP3 of phosphoric acid, Millero (1995), total scale,
/// mol/kg-soln.
///
/// ```text
/// ln KP1 = -4576.752/T + 115.525 - 18.453 ln T + (-106.736/T + 0.69171) S^0.5 + (-0.65643/T - 0.01844) S
/// ln KP2 = -8814.715/T + 172.0883 - 27.927 ln T + (-160.340/T + 1.3566) S^0.5 + (0.37335/T - 0.05778) S
/// ln KP3 = -3070.75/T - 18.141 + (17.27039/T + 2.81197) S^0.5 + (-44.99486/T - 0.09984) S
/// ```
/// KP1 and KP2 verified; KP3 from memory (unverified). Check values (Dickson,
/// Sabine & Christian 2007): −3.71, −13.727, −20.24 at S 35, 25 °C.
///
/// ```
/// let (a, b, c) = travertine::fits::nutrients::millero1995_ln_kp(298.15, 35.0);
/// assert!((a - -3.71).abs() < 5e-3 && (b - -13.727).abs() < 5e-4 && (c - -20.24).abs() < 5e-3);
/// ```
#[inline]
pub fn millero1995_ln_kp(temperature_k: f64, salinity: f64) -> (f64, f64, f64) {
    let (t, s) = (temperature_k, salinity);
    let ln_t = t.ln();
    let rs = s.sqrt();
    let kp1 = -4576.752 / t + 115.525 - 18.453 * ln_t
        + (-106.736 / t + 0.69171) * rs
        + (-0.65643 / t - 0.01844) * s;
    let kp2 = -8814.715 / t + 172.0883 - 27.927 * ln_t
        + (-160.340 / t + 1.3566) * rs
        + (0.37335 / t - 0.05778) * s;
    let kp3 = -3070.75 / t - 18.141 + (17.27039 / t + 2.81197) * rs + (-44.99486 / t - 0.09984) * s;
    (kp1, kp2, kp3)
}

/// ln KSi of silicic acid, Millero (1995), total scale, mol/kg-soln.
///
/// ```text
/// ln KSi = -8904.2/T + 117.385 - 19.334 ln T + (-458.79/T + 3.5913) I^0.5 + (188.74/T - 1.5998) I
///          + (-12.1652/T + 0.07871) I^2 + ln(1 - 0.001005 S)
/// ```
/// Coefficients from memory (unverified). Check value (Dickson, Sabine &
/// Christian 2007): ln KSi = −21.61 at S 35, 25 °C.
///
/// ```
/// let l = travertine::fits::nutrients::millero1995_ln_ksi(298.15, 35.0);
/// assert!((l - -21.61).abs() < 5e-3);
/// ```
#[inline]
pub fn millero1995_ln_ksi(temperature_k: f64, salinity: f64) -> f64 {
    let t = temperature_k;
    let i = seawater_ionic_strength(salinity);
    -8904.2 / t + 117.385 - 19.334 * t.ln()
        + (-458.79 / t + 3.5913) * i.sqrt()
        + (188.74 / t - 1.5998) * i
        + (-12.1652 / t + 0.07871) * i * i
        + (1.0 - 0.001005 * salinity).ln()
}
