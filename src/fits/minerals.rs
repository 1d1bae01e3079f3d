//! Solubility of calcite and aragonite in sea water, and calcium from salinity.

use super::FitRange;
use crate::base::numeric::Real;

/// Published range of Mucci (1983) (from memory, unverified).
pub const MUCCI1983_RANGE: FitRange = FitRange::new("mucci1983", (5.0, 40.0), (5.0, 44.0));

/// log10 of the stoichiometric solubility products of calcite and aragonite,
/// (mol/kg-soln)², Mucci (1983).
///
/// ```text
/// log Ksp_cal  = -171.9065 - 0.077993 T + 2839.319/T + 71.595 log T
///                + (-0.77712 + 0.0028426 T + 178.34/T) S^0.5 - 0.07711 S + 0.0041249 S^1.5
/// log Ksp_arag = -171.945  - 0.077993 T + 2903.293/T + 71.595 log T
///                + (-0.068393 + 0.0017276 T + 88.135/T) S^0.5 - 0.10018 S + 0.0059415 S^1.5
/// ```
/// Coefficients from memory (unverified); the first four terms of the calcite
/// equation are Plummer & Busenberg's pure-water fit (verified). Check values
/// (computed): −6.3693 and −6.1883 at S 35, 25 °C.
///
/// ```
/// let (c, a) = travertine::fits::minerals::mucci1983_log_ksp(298.15, 35.0);
/// assert!((c - -6.3693).abs() < 5e-5 && (a - -6.1883).abs() < 5e-5);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn mucci1983_log_ksp<R: Real>(temperature_k: R, salinity: R) -> (R, R) {
    let (t, s) = (temperature_k, salinity);
    let rs = s.sqrt();
    let log_t = Real::log10(t);
    let cal = (t * 0.077993).subtracted_from(-171.9065)
        + t.under(2839.319)
        + log_t * 71.595
        + (t * 0.0028426 + -0.77712 + t.under(178.34)) * rs
        - s * 0.07711
        + s * 0.0041249 * rs;
    let arag = (t * 0.077993).subtracted_from(-171.945)
        + t.under(2903.293)
        + log_t * 71.595
        + (t * 0.0017276 + -0.068393 + t.under(88.135)) * rs
        - s * 0.10018
        + s * 0.0059415 * rs;
    (cal, arag)
}

/// Total calcium, mol/kg-soln, from Riley & Tongudai (1967):
/// `Ca = (0.02128 / 40.087) * (S / 1.80655)`. Ratio from memory (unverified).
/// Check value (computed): 0.01028 mol/kg at S 35.
///
/// ```
/// let ca = travertine::fits::minerals::riley_tongudai1967_calcium_mol_kg(35.0);
/// assert!((ca - 0.01028).abs() < 5e-6);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn riley_tongudai1967_calcium_mol_kg<R: Real>(salinity: R) -> R {
    (salinity / 1.80655) * (0.02128 / 40.087)
}
