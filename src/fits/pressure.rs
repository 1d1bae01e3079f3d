//! Pressure corrections of equilibrium constants, Millero (1995).
//!
//! ```text
//! ln(K_P / K_0) = -(dV / (R T)) P + 0.5 (dK / (R T)) P^2
//! dV = a0 + a1 t + a2 t^2   (cm3/mol)      dK = (b0 + b1 t) 1e-3   (cm3/mol/bar)
//! ```
//! P is gauge pressure in bar, R = 83.14472 cm³ bar mol⁻¹ K⁻¹. The form is
//! verified; the coefficients are from memory (unverified). Acid constants
//! are corrected on the sea-water scale, KS and KF on the free scale.

use crate::base::numeric::Real;

/// Gas constant, cm³ bar mol⁻¹ K⁻¹.
pub const R_CM3_BAR: f64 = 83.14472;

/// Partial molal volume and compressibility changes of one reaction.
///
/// # Example
/// ```
/// use travertine::fits::pressure::{K1, pressure_factor};
/// // Computed from the table: K1 rises 2.417-fold at 25 °C and 1000 bar.
/// assert!((pressure_factor(&K1, 25.0, 1000.0) - 2.417).abs() < 1e-3);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub struct PressureCoefficients {
    /// a0, a1, a2 of ΔV.
    pub a: [f64; 3],
    /// b0, b1 of ΔK (before the 1e-3 factor).
    pub b: [f64; 2],
}

const fn pc(a0: f64, a1: f64, a2: f64, b0: f64, b1: f64) -> PressureCoefficients {
    PressureCoefficients {
        a: [a0, a1, a2],
        b: [b0, b1],
    }
}

/// K1 of carbonic acid.
pub const K1: PressureCoefficients = pc(-25.50, 0.1271, 0.0, -3.08, 0.0877);
/// K2 of carbonic acid.
pub const K2: PressureCoefficients = pc(-15.82, -0.0219, 0.0, 1.13, -0.1475);
/// Boric acid. a2 is −2.608e-3 as in Millero (1979); the 1995 paper's +2.608e-3
/// is widely treated as a sign error.
pub const KB: PressureCoefficients = pc(-29.48, 0.1622, -2.608e-3, -2.84, 0.0);
/// Water in sea water (Millero 1983).
pub const KW: PressureCoefficients = pc(-25.60, 0.2324, -3.6246e-3, -5.13, 0.0794);
/// Bisulfate.
pub const KS: PressureCoefficients = pc(-18.03, 0.0466, 0.316e-3, -4.53, 0.0900);
/// Hydrogen fluoride.
pub const KF: PressureCoefficients = pc(-9.78, -0.0090, -0.942e-3, -3.91, 0.054);
/// First phosphoric acid dissociation.
pub const KP1: PressureCoefficients = pc(-14.51, 0.1211, -0.321e-3, -2.67, 0.0427);
/// Second phosphoric acid dissociation.
pub const KP2: PressureCoefficients = pc(-23.12, 0.1758, -2.647e-3, -5.15, 0.09);
/// Third phosphoric acid dissociation.
pub const KP3: PressureCoefficients = pc(-26.57, 0.2020, -3.042e-3, -4.08, 0.0714);
/// Silicic acid: the boric acid row, as is usual.
pub const KSI: PressureCoefficients = KB;
/// Ammonium (Millero 1995; coefficients from memory, unverified).
pub const KNH4: PressureCoefficients = pc(-26.43, 0.0889, -0.905e-3, -5.03, 0.0814);
/// Hydrogen sulfide (Millero 1995; coefficients from memory, unverified).
pub const KH2S: PressureCoefficients = pc(-14.80, 0.0020, -0.400e-3, 2.89, 0.054);
/// Calcite solubility product.
pub const CALCITE: PressureCoefficients = pc(-48.76, 0.5304, 0.0, -11.76, 0.3692);
/// Aragonite solubility product.
pub const ARAGONITE: PressureCoefficients = pc(-45.96, 0.5304, 0.0, -11.76, 0.3692);

/// K_P / K_0 for gauge pressure `pressure_bar` at `temperature_c`. At
/// P = 0 it is exactly 1 without the arithmetic, with the slope of the
/// formula there (−ΔV/(RT) per bar) for a tangent.
///
/// ```
/// use travertine::fits::pressure::{CALCITE, pressure_factor};
/// assert!((pressure_factor(&CALCITE, 25.0, 1000.0) - 3.979).abs() < 1e-3);
/// assert_eq!(pressure_factor(&CALCITE, 25.0, 0.0), 1.0);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn pressure_factor<R: Real>(c: &PressureCoefficients, temperature_c: R, pressure_bar: R) -> R {
    if pressure_bar.value() == 0.0 {
        // 1 exactly, with the slope of the formula at P = 0 (the factor is
        // smooth there; the shortcut only saves the arithmetic).
        return pressure_bar.with_slope(1.0, slope_at_zero(c, temperature_c.value()));
    }
    pressure_ln_factor(c, temperature_c, pressure_bar).exp()
}

/// ln(K_P / K_0) = (−ΔV P + ½ ΔK P²)/(R T), with ΔV = a0 + a1 t + a2 t² and
/// ΔK = (b0 + b1 t)·1e-3 (Millero 1995). Exactly 0 at P = 0, with the slope
/// −ΔV/(RT) per bar for a tangent.
///
/// ```
/// use travertine::fits::pressure::{CALCITE, pressure_ln_factor};
/// assert!((pressure_ln_factor(&CALCITE, 25.0, 1000.0) - 3.979f64.ln()).abs() < 3e-4);
/// assert_eq!(pressure_ln_factor(&CALCITE, 25.0, 0.0), 0.0);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn pressure_ln_factor<R: Real>(
    c: &PressureCoefficients,
    temperature_c: R,
    pressure_bar: R,
) -> R {
    if pressure_bar.value() == 0.0 {
        // 0 exactly, with the slope of the formula at P = 0.
        return pressure_bar.with_slope(0.0, slope_at_zero(c, temperature_c.value()));
    }
    let t = temperature_c;
    let rt = (t + 273.15) * R_CM3_BAR;
    let dv = t * c.a[1] + c.a[0] + t * c.a[2] * t;
    let dk = (t * c.b[1] + c.b[0]) * 1e-3;
    (-dv * pressure_bar + dk * 0.5 * pressure_bar * pressure_bar) / rt
}

/// d ln(K_P / K_0) / dP at P = 0: −ΔV / (R T). Only a tangent reads it;
/// on `f64` it is not computed.
#[inline]
fn slope_at_zero(c: &PressureCoefficients, temperature_c: f64) -> f64 {
    let t = temperature_c;
    -(c.a[0] + c.a[1] * t + c.a[2] * t * t) / (R_CM3_BAR * (t + 273.15))
}
