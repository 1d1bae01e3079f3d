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
