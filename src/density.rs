//! Density of the sample, for per-litre units.
//!
//! TEOS-10 (IOC, SCOR & IAPSO 2010) through the `gsw` crate:
//! reference salinity from practical salinity (`sr_from_sp`, used as
//! absolute salinity), conservative temperature from the temperature
//! (`ct_from_pt`, since at the surface potential and in-situ temperature are
//! equal), then `rho(SA, CT, 0)`. Density is taken at the surface pressure,
//! because per-litre measurements are made on samples at the surface.

use crate::error::{Error, Result};

/// Density in kg/m³ at the surface, from practical salinity and temperature (°C).
///
/// Check value (computed with the Millero & Poisson 1981 EOS-80 equation, which
/// TEOS-10 agrees with here): 1023.3431 kg/m³ at S 35, 25 °C.
///
/// # Errors
/// [`Error::Computation`] if TEOS-10 refuses the inputs.
///
/// # Example
/// ```
/// let rho = travertine::density::density_kg_m3(35.0, 25.0)?;
/// assert!((rho - 1023.3431).abs() < 0.01);
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn density_kg_m3(salinity: f64, temperature_c: f64) -> Result<f64> {
    let fail = |e: gsw::Error| Error::Computation {
        field: "density",
        reason: format!("{e:?}"),
    };
    let sa = gsw::conversions::sr_from_sp(salinity);
    let ct = gsw::conversions::ct_from_pt(sa, temperature_c).map_err(fail)?;
    let rho = gsw::volume::rho(sa, ct, 0.0).map_err(fail)?;
    if rho.is_finite() && rho > 900.0 && rho < 1100.0 {
        Ok(rho)
    } else {
        Err(Error::Computation {
            field: "density",
            reason: format!("TEOS-10 gave {rho} kg/m3"),
        })
    }
}
