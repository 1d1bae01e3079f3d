//! Thermodynamic (infinite-dilution) constants for fresh water.
//!
//! Carbonic acid, CO2 solubility, calcite, aragonite and the calcium ion
//! pairs are from Plummer & Busenberg (1982), verified, valid 0–100 °C
//! (the CaHCO3+ pair 0–90 °C, the CaCO3⁰ pair 5–80 °C). Every function
//! returns log10 K with T in kelvin.

use super::FitRange;
use crate::base::numeric::Real;

/// Published range of the Plummer & Busenberg (1982) carbonic acid, CO2 and mineral fits.
pub const PLUMMER_BUSENBERG1982_RANGE: FitRange =
    FitRange::new("plummer-busenberg1982", (0.0, 100.0), (0.0, 0.0));
/// Published range of their CaHCO3+ fit.
pub const CAHCO3_RANGE: FitRange =
    FitRange::new("plummer-busenberg1982 CaHCO3+", (0.0, 90.0), (0.0, 0.0));
/// Published range of their CaCO3⁰ fit.
pub const CACO3_RANGE: FitRange =
    FitRange::new("plummer-busenberg1982 CaCO3", (5.0, 80.0), (0.0, 0.0));
/// Range of the Harned & Owen pure-water Kw fit (from memory, unverified).
pub const HARNED_OWEN_RANGE: FitRange = FitRange::new("harned-owen1958", (0.0, 60.0), (0.0, 0.0));
/// Range of the Emerson et al. (1975) ammonium fit (from memory, unverified).
pub const EMERSON1975_RANGE: FitRange = FitRange::new("emerson1975", (0.0, 30.0), (0.0, 0.0));

/// log10 KH, CO2 solubility (mol kg⁻¹ atm⁻¹), Plummer & Busenberg (1982).
///
/// ```text
/// log KH = 108.3865 + 0.01985076 T - 6919.53/T - 40.45154 log T + 669365/T²
/// ```
/// Check value: −1.468 at 25 °C (Plummer & Busenberg 1982).
///
/// ```
/// let v = travertine::fits::thermodynamic::log_kh(298.15);
/// assert!((v - -1.4679).abs() < 1e-4);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
pub fn log_kh<R: Real>(t: R) -> R {
    t * 0.01985076 + 108.3865 - t.under(6919.53) - Real::log10(t) * 40.45154
        + (t * t).under(669365.0)
}

/// log10 K1 of carbonic acid, Plummer & Busenberg (1982).
///
/// ```text
/// log K1 = -356.3094 - 0.06091964 T + 21834.37/T + 126.8339 log T - 1684915/T²
/// ```
/// Check value: −6.352 at 25 °C (Plummer & Busenberg 1982).
///
/// ```
/// assert!((travertine::fits::thermodynamic::log_k1(298.15) - -6.3519).abs() < 1e-4);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
pub fn log_k1<R: Real>(t: R) -> R {
    (t * 0.06091964).subtracted_from(-356.3094) + t.under(21834.37) + Real::log10(t) * 126.8339
        - (t * t).under(1684915.0)
}

/// log10 K2 of carbonic acid, Plummer & Busenberg (1982).
///
/// ```text
/// log K2 = -107.8871 - 0.03252849 T + 5151.79/T + 38.92561 log T - 563713.9/T²
/// ```
/// Check value: −10.329 at 25 °C (Plummer & Busenberg 1982).
///
/// ```
/// assert!((travertine::fits::thermodynamic::log_k2(298.15) - -10.3289).abs() < 1e-4);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
pub fn log_k2<R: Real>(t: R) -> R {
    (t * 0.03252849).subtracted_from(-107.8871) + t.under(5151.79) + Real::log10(t) * 38.92561
        - (t * t).under(563713.9)
}

/// log10 Ksp of calcite, Plummer & Busenberg (1982).
///
/// ```text
/// log Kc = -171.9065 - 0.077993 T + 2839.319/T + 71.595 log T
/// ```
/// Check value: −8.480 ± 0.020 at 25 °C (Plummer & Busenberg 1982).
///
/// ```
/// assert!((travertine::fits::thermodynamic::log_ksp_calcite(298.15) - -8.4798).abs() < 1e-4);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
pub fn log_ksp_calcite<R: Real>(t: R) -> R {
    (t * 0.077993).subtracted_from(-171.9065) + t.under(2839.319) + Real::log10(t) * 71.595
}

/// log10 Ksp of aragonite, Plummer & Busenberg (1982).
///
/// ```text
/// log Ka = -171.9773 - 0.077993 T + 2903.293/T + 71.595 log T
/// ```
/// Check value: −8.336 ± 0.020 at 25 °C (Plummer & Busenberg 1982).
///
/// ```
/// assert!((travertine::fits::thermodynamic::log_ksp_aragonite(298.15) - -8.3361).abs() < 1e-4);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
pub fn log_ksp_aragonite<R: Real>(t: R) -> R {
    (t * 0.077993).subtracted_from(-171.9773) + t.under(2903.293) + Real::log10(t) * 71.595
}

/// log10 K of the CaHCO3+ ion pair (association), Plummer & Busenberg (1982).
///
/// ```text
/// log K = 1209.120 + 0.31294 T - 34765.05/T - 478.782 log T
/// ```
/// Check value: 1.11 at 25 °C (Plummer & Busenberg 1982).
///
/// ```
/// assert!((travertine::fits::thermodynamic::log_k_cahco3(298.15) - 1.11).abs() < 0.01);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
pub fn log_k_cahco3<R: Real>(t: R) -> R {
    t * 0.31294 + 1209.120 - t.under(34765.05) - Real::log10(t) * 478.782
}

/// log10 K of the CaCO3⁰ ion pair (association), Plummer & Busenberg (1982).
///
/// ```text
/// log K = -1228.732 - 0.299444 T + 35512.75/T + 485.818 log T
/// ```
/// Check value: 3.22 at 25 °C (Plummer & Busenberg 1982).
///
/// ```
/// assert!((travertine::fits::thermodynamic::log_k_caco3(298.15) - 3.22).abs() < 0.01);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
pub fn log_k_caco3<R: Real>(t: R) -> R {
    (t * 0.299444).subtracted_from(-1228.732) + t.under(35512.75) + Real::log10(t) * 485.818
}

/// log10 Kw of pure water, the simple fit of Harned & Owen (1958):
///
/// ```text
/// log Kw = -4470.99/T + 6.0875 - 0.01706 T
/// ```
/// Coefficients from memory (unverified). Checked against the CRC Handbook
/// table: pKw 14.946, 13.995, 13.264 at 0, 25, 50 °C.
///
/// ```
/// assert!((travertine::fits::thermodynamic::log_kw(298.15) - -13.9947).abs() < 1e-3);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
pub fn log_kw<R: Real>(t: R) -> R {
    t.under(-4470.99) + 6.0875 - t * 0.01706
}

/// pKa of NH4+ in fresh water, Emerson et al. (1975):
/// `pKa = 0.09018 + 2729.92/T`. Coefficients from memory (unverified).
/// Check value (computed): 9.2464 at 25 °C.
///
/// ```
/// assert!((travertine::fits::thermodynamic::emerson1975_pka(298.15) - 9.2464).abs() < 1e-4);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
pub fn emerson1975_pka<R: Real>(t: R) -> R {
    t.under(2729.92) + 0.09018
}
