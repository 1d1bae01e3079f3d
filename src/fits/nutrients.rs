//! Phosphoric and silicic acids in sea water, Millero (1995).

use super::FitRange;
use crate::base::numeric::Real;
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
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn millero1995_ln_kp<R: Real>(temperature_k: R, salinity: R) -> (R, R, R) {
    let (t, s) = (temperature_k, salinity);
    let ln_t = t.ln();
    let rs = s.sqrt();
    let kp1 = t.under(-4576.752) + 115.525 - ln_t * 18.453
        + (t.under(-106.736) + 0.69171) * rs
        + (t.under(-0.65643) - 0.01844) * s;
    let kp2 = t.under(-8814.715) + 172.0883 - ln_t * 27.927
        + (t.under(-160.340) + 1.3566) * rs
        + (t.under(0.37335) - 0.05778) * s;
    let kp3 = t.under(-3070.75) - 18.141
        + (t.under(17.27039) + 2.81197) * rs
        + (t.under(-44.99486) - 0.09984) * s;
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
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn millero1995_ln_ksi<R: Real>(temperature_k: R, salinity: R) -> R {
    let t = temperature_k;
    let i = seawater_ionic_strength(salinity);
    t.under(-8904.2) + 117.385 - t.ln() * 19.334
        + (t.under(-458.79) + 3.5913) * i.sqrt()
        + (t.under(188.74) - 1.5998) * i
        + (t.under(-12.1652) + 0.07871) * i * i
        + (salinity * 0.001005).subtracted_from(1.0).ln()
}
