//! Conductivity: temperature compensation and practical salinity.
//!
//! The closed forms are generic over [`Real`]: on `f64` they give the
//! numbers the library reports, on a [`crate::base::numeric::Tangent`] the
//! same values with their derivatives. PSS-78 goes through TEOS-10 (`gsw`),
//! which computes on `f64` only.

use crate::base::error::{check_range, Error, Result};
use crate::base::field::Field;
use crate::base::numeric::Real;

/// Linear temperature-compensation coefficient, per °C: 0.0191, the value
/// of APHA Standard Methods 2510 for natural waters (common practice; from
/// memory, unverified).
pub const LINEAR_COMPENSATION_PER_C: f64 = 0.0191;

/// Specific conductance at 25 °C (µS/cm) from conductivity measured at
/// `temperature_c`, by linear compensation:
///
/// ```text
/// SpC = C / (1 + 0.0191 (t - 25))
/// ```
///
/// # Errors
/// [`Error::OutOfRange`] for a negative conductivity or above 100 000 µS/cm,
/// or a temperature outside 0–50 °C where the linear form is used (judged
/// on the values).
///
/// # Example
/// ```
/// use travertine::base::numeric::{Real, Tangent};
/// use travertine::properties::conductivity::specific_conductance_us_cm;
/// let spc = specific_conductance_us_cm(400.0, 15.0)?;
/// assert!((spc - 400.0 / (1.0 - 0.191)).abs() < 1e-9);
/// // dSpC/dC = 1 / (1 + 0.0191 (t − 25)):
/// let d = specific_conductance_us_cm(Tangent::<1>::source(400.0, 0), Real::constant(15.0))?;
/// assert_eq!(d.value(), spc);
/// assert!((d.d[0] - 1.0 / (1.0 - 0.191)).abs() < 1e-12);
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn specific_conductance_us_cm<R: Real>(conductivity_us_cm: R, temperature_c: R) -> Result<R> {
    check_range(
        Field::Conductivity,
        conductivity_us_cm.value(),
        0.0,
        100_000.0,
        " µS/cm",
    )?;
    check_range(Field::Temperature, temperature_c.value(), 0.0, 50.0, " °C")?;
    Ok(conductivity_us_cm / ((temperature_c - 25.0) * LINEAR_COMPENSATION_PER_C + 1.0))
}

/// Practical salinity from conductivity (µS/cm) measured at `temperature_c`
/// (ITS-90) and `pressure_dbar`: PSS-78 with the Hill et al. (1986)
/// low-salinity extension, through TEOS-10 (`gsw::practical_salinity::sp_from_c`).
///
/// Check value (UNESCO 1983 / TEOS-10): 42.914 mS/cm at 15 °C and 0 dbar is
/// salinity 35 (34.9968 from the rounded conductivity).
///
/// # Errors
/// [`Error::OutOfRange`] for conductivity outside 0–100 000 µS/cm;
/// [`Error::Computation`] if TEOS-10 refuses the inputs.
///
/// # Example
/// ```
/// let s = travertine::properties::conductivity::salinity_from_conductivity(42914.0, 15.0, 0.0)?;
/// assert!((s - 34.9968).abs() < 1e-3);
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn salinity_from_conductivity(
    conductivity_us_cm: f64,
    temperature_c: f64,
    pressure_dbar: f64,
) -> Result<f64> {
    check_range(
        Field::Conductivity,
        conductivity_us_cm,
        0.0,
        100_000.0,
        " µS/cm",
    )?;
    let s = gsw::practical_salinity::sp_from_c(
        conductivity_us_cm / 1000.0,
        temperature_c,
        pressure_dbar,
    )
    .map_err(|e| Error::Computation {
        field: Field::Salinity,
        reason: format!("{e:?}"),
    })?;
    if s.is_finite() {
        Ok(s.max(0.0))
    } else {
        Err(Error::Computation {
            field: Field::Salinity,
            reason: "PSS-78 gave no finite salinity".to_string(),
        })
    }
}

/// Practical salinity from conductivity as [`salinity_from_conductivity`]
/// gives it, on any [`Real`]: the value is that of
/// [`salinity_from_conductivity`] bit for bit, and the derivatives follow
/// by the chain rule, dS = ∂S/∂C dC + ∂S/∂t dt + ∂S/∂p dp.
///
/// TEOS-10 (`gsw`) computes on `f64` only, so the three partial
/// derivatives are not exact: each is a central difference of
/// [`salinity_from_conductivity`] with the step h = 1e-5 max(|x|, X), X
/// being 1 µS/cm, 1 °C and 100 dbar, one-sided and of
/// second order where a step would leave the accepted range (conductivity
/// 0 or 100 000 µS/cm, a pressure below 0). PSS-78 is a smooth
/// polynomial, so they are good to about 1e-9 relative (truncation h²,
/// rounding ε/h). On `f64` no difference is taken. Where TEOS-10 gives no
/// salinity beside the point (at zero conductivity, where PSS-78 goes as
/// √Rt and has no finite slope, it refuses the points just above), that
/// partial derivative is NaN: unknown, never a made-up zero. The value is
/// set exactly, as the root of S − s(C, t, p) = 0 ([`Real::root`]).
///
/// # Errors
/// As [`salinity_from_conductivity`] at the given values.
///
/// # Example
/// ```
/// use travertine::base::numeric::{Real, Tangent};
/// use travertine::properties::conductivity::{
///     salinity_from_conductivity, salinity_from_conductivity_generic,
/// };
/// let s = salinity_from_conductivity(42914.0, 15.0, 0.0)?;
/// let c = Tangent::<1>::source(42914.0, 0);
/// let t = salinity_from_conductivity_generic(c, Real::constant(15.0), Real::constant(0.0))?;
/// assert_eq!(t.value(), s);
/// // dS/dC against a difference taken here with a larger step:
/// let up = salinity_from_conductivity(42924.0, 15.0, 0.0)?;
/// let down = salinity_from_conductivity(42904.0, 15.0, 0.0)?;
/// assert!((t.d[0] / ((up - down) / 20.0) - 1.0).abs() < 1e-6);
/// assert_eq!(salinity_from_conductivity_generic(42914.0, 15.0, 0.0)?, s);
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn salinity_from_conductivity_generic<R: Real>(
    conductivity_us_cm: R,
    temperature_c: R,
    pressure_dbar: R,
) -> Result<R> {
    let x = [
        conductivity_us_cm.value(),
        temperature_c.value(),
        pressure_dbar.value(),
    ];
    let f = |x: [f64; 3]| salinity_from_conductivity(x[0], x[1], x[2]);
    let s = f(x)?;
    if std::any::TypeId::of::<R>() == std::any::TypeId::of::<f64>() {
        return Ok(R::constant(s));
    }
    let lower = [0.0, f64::MIN, 0.0];
    let upper = [100_000.0, f64::MAX, f64::MAX];
    let scale = [1.0, 1.0, 100.0];
    let mut slopes = [0.0; 3];
    for (j, slope) in slopes.iter_mut().enumerate() {
        let h = 1e-5 * x[j].abs().max(scale[j]);
        let at = |dx: f64| {
            let mut y = x;
            y[j] += dx;
            f(y)
        };
        let centred = x[j] - h >= lower[j] && x[j] + h <= upper[j];
        *slope = match (centred, at(h).ok(), at(-h).ok()) {
            (true, Some(hi), Some(lo)) => (hi - lo) / (2.0 * h),
            (_, Some(hi), _) if x[j] + 2.0 * h <= upper[j] => {
                at(2.0 * h).map_or(f64::NAN, |hi2| (-3.0 * s + 4.0 * hi - hi2) / (2.0 * h))
            }
            (_, _, Some(lo)) if x[j] - 2.0 * h >= lower[j] => {
                at(-2.0 * h).map_or(f64::NAN, |lo2| (3.0 * s - 4.0 * lo + lo2) / (2.0 * h))
            }
            _ => f64::NAN,
        };
    }
    // S is the root of F = S − s(C, t, p): ∂F/∂S = 1 and ∂F/∂source is
    // −(∂s/∂x)(dx/dsource), the derivatives of `residual`.
    // A slope that is not finite moves only with the sources that move its
    // input ([`Real::with_slope`]).
    let residual = conductivity_us_cm.with_slope(0.0, -slopes[0])
        + temperature_c.with_slope(0.0, -slopes[1])
        + pressure_dbar.with_slope(0.0, -slopes[2]);
    Ok(R::root(s, residual, 1.0))
}

/// Ionic strength (mol/kg) from specific conductance at 25 °C (µS/cm),
/// Russell (1976): `I = 1.6e-5 SpC` (from memory, unverified).
///
/// Generic over [`Real`].
///
/// ```
/// assert!((travertine::properties::conductivity::russell1976_ionic_strength(500.0) - 0.008).abs() < 1e-12);
/// ```
pub fn russell1976_ionic_strength<R: Real>(specific_conductance_us_cm: R) -> R {
    specific_conductance_us_cm * 1.6e-5
}

/// Ionic strength (mol/kg) from total dissolved solids (mg/L), Langelier
/// (1936): `I = 2.5e-5 TDS` (from memory, unverified).
///
/// Generic over [`Real`].
///
/// ```
/// assert!((travertine::properties::conductivity::langelier1936_ionic_strength(400.0) - 0.01).abs() < 1e-12);
/// ```
pub fn langelier1936_ionic_strength<R: Real>(tds_mg_l: R) -> R {
    tds_mg_l * 2.5e-5
}
