//! Density of the sample, for per-litre units.
//!
//! The one-atmosphere equation of state of sea water of Millero & Poisson
//! (1981), the EOS-80 standard (UNESCO 1981), verified:
//!
//! ```text
//! rho   = rho_w + A S + B S^1.5 + C S^2                               (kg/m3, t in °C)
//! A     = 8.24493e-1 - 4.0899e-3 t + 7.6438e-5 t² - 8.2467e-7 t³ + 5.3875e-9 t⁴
//! B     = -5.72466e-3 + 1.0227e-4 t - 1.6546e-6 t²
//! C     = 4.8314e-4
//! rho_w = 999.842594 + 6.793952e-2 t - 9.095290e-3 t² + 1.001685e-4 t³
//!         - 1.120083e-6 t⁴ + 6.536332e-9 t⁵
//! ```
//! Density is taken at the surface pressure, because per-litre measurements
//! are made on samples at the surface. It agrees with TEOS-10 (`gsw::volume::rho`)
//! to within 0.01 kg/m³ over the natural range (tested), and costs a tenth
//! as much, which matters on the per-row path of a field sheet.
//!
//! Both functions are generic over [`Real`]: on `f64` they give the numbers
//! the library reports, on a [`crate::base::numeric::Tangent`] the same
//! values with their derivatives.

use crate::base::error::{Error, Result};
use crate::base::field::Field;
use crate::base::numeric::Real;

/// Density in kg/m³ at the surface, from practical salinity and temperature (°C).
///
/// Check values (computed from the equation of Millero & Poisson 1981):
/// 1023.3431 kg/m³ at S 35, 25 °C; 997.0480 for pure water at 25 °C;
/// 1027.6755 at S 35, 5 °C.
///
/// # Errors
/// [`Error::Computation`] for a non-finite or implausible result (judged
/// on the value).
///
/// # Example
/// ```
/// use travertine::base::numeric::{Real, Tangent};
/// use travertine::properties::density::density_kg_m3;
/// let rho = density_kg_m3(35.0, 25.0)?;
/// assert!((rho - 1023.3431).abs() < 1e-4);
/// // With dρ/dS and dρ/dt: denser with salt, lighter when warmer.
/// let r = density_kg_m3(Tangent::<2>::source(35.0, 0), Tangent::source(25.0, 1))?;
/// assert_eq!(r.value(), rho);
/// assert!(r.d[0] > 0.7 && r.d[1] < 0.0);
/// # Ok::<(), travertine::Error>(())
/// ```
#[inline]
pub fn density_kg_m3<R: Real>(salinity: R, temperature_c: R) -> Result<R> {
    let t = temperature_c;
    let s = salinity;
    let rho_w = t
        * (t * (t * (t * (t * 6.536332e-9 + -1.120083e-6) + 1.001685e-4) + -9.095290e-3)
            + 6.793952e-2)
        + 999.842594;
    let a = t * (t * (t * (t * 5.3875e-9 + -8.2467e-7) + 7.6438e-5) + -4.0899e-3) + 8.24493e-1;
    let b = t * (t * 1.6546e-6).subtracted_from(1.0227e-4) + -5.72466e-3;
    let c = 4.8314e-4;
    let rho = if s.value() == 0.0 {
        // The S^1.5 term is ±0 here, which adds nothing to the f64 value,
        // and its slope is 0 (from above); through √S its derivative
        // would be 0 · ∞.
        rho_w + a * s + s * c * s
    } else {
        rho_w + a * s + b * s * s.sqrt() + s * c * s
    };
    let v = rho.value();
    if v.is_finite() && v > 900.0 && v < 1100.0 {
        Ok(rho)
    } else {
        Err(Error::Computation {
            field: Field::Density,
            reason: format!("the equation of state gave {v} kg/m3"),
        })
    }
}

/// Standard acceleration of gravity, m/s², the conventional value fixed by
/// the 3rd General Conference on Weights and Measures (CGPM 1901) and kept
/// in ISO 80000-3. Local gravity lies between about 9.780 (equator) and
/// 9.832 m/s² (poles), within 0.3 % of it.
pub const STANDARD_GRAVITY_M_S2: f64 = 9.80665;

/// Deepest depth accepted, m (a little beyond the deepest ocean, about
/// 10 900 m; its pressure stays inside the accepted 12 000 dbar).
pub const DEPTH_MAX_M: f64 = 11_000.0;

/// Gauge pressure at a depth below the water surface, dbar: the weight of
/// the water above, with the density of this water at one atmosphere.
///
/// ```text
/// P = rho g z / 10^4     (dbar; 1 dbar = 10^4 Pa)
/// rho  density of the sample at its temperature and salinity, one atmosphere
///      (Millero & Poisson 1981, EOS-80: density_kg_m3), kg/m3
/// g    standard gravity, 9.80665 m/s2 (CGPM 1901; STANDARD_GRAVITY_M_S2)
/// z    depth below the surface, m
/// ```
/// The density is taken as constant down the column, which is the
/// hydrostatic relation dP/dz = rho g integrated at one density. What that
/// leaves out, with its size (the first two checked against TEOS-10 in this
/// module's tests):
/// - *compression:* water is denser under pressure, so the true pressure
///   is higher by about 0.025 % at 100 m, 0.12 % at 500 m and 0.24 % at
///   1000 m, in fresh and sea water alike;
/// - *a layered column:* the water above a sample is not at the sample's
///   temperature. Fresh water's density changes by about 0.3 % between
///   4 and 25 °C, so a warm layer over a cold sample makes the pressure at
///   most 0.3 % lower than given here, a few tenths of a dbar in a lake;
/// - *local gravity:* within 0.3 % of the standard value.
///
/// At lake depths (up to a few hundred metres) these are fractions of a
/// dbar and change no result of the crate measurably, so the column is not
/// integrated. In the deep ocean give the pressure a CTD measured (or
/// TEOS-10's `p_from_z`, which integrates the compressible ocean at a
/// latitude) rather than a depth.
///
/// # Units
/// `depth_m` in m, `temperature_c` in °C, `salinity` practical salinity;
/// returns dbar. Generic over [`Real`] like [`density_kg_m3`].
///
/// # Errors
/// [`Error::OutOfRange`] or [`Error::NotFinite`] for a depth outside 0 to
/// [`DEPTH_MAX_M`]; as [`density_kg_m3`].
///
/// # Example
/// ```
/// use travertine::properties::density::{density_kg_m3, pressure_dbar_at_depth};
/// // 100 m of fresh water at 10 °C: rho = 999.70 kg/m3, so 98.04 dbar.
/// let p = pressure_dbar_at_depth(100.0, 0.0, 10.0)?;
/// let rho = density_kg_m3(0.0, 10.0)?;
/// assert_eq!(p, rho * 9.80665 * 100.0 / 1e4);
/// assert!((p - 98.04).abs() < 0.005);
/// assert!(pressure_dbar_at_depth(-1.0, 0.0, 10.0).is_err());
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn pressure_dbar_at_depth<R: Real>(depth_m: R, salinity: R, temperature_c: R) -> Result<R> {
    crate::base::error::check_range(Field::Depth, depth_m.value(), 0.0, DEPTH_MAX_M, " m")?;
    let rho = density_kg_m3(salinity, temperature_c)?;
    Ok(rho * STANDARD_GRAVITY_M_S2 * depth_m / 1e4)
}

#[cfg(test)]
mod tests {
    use super::density_kg_m3;

    /// EOS-80 against TEOS-10 (gsw) over the natural range.
    #[test]
    fn agrees_with_teos10() {
        for s in [0.0, 0.5, 5.0, 20.0, 35.0, 40.0] {
            for t in [0.0, 5.0, 15.0, 25.0, 35.0] {
                let sa = gsw::conversions::sr_from_sp(s);
                let ct = gsw::conversions::ct_from_pt(sa, t).unwrap();
                let teos = gsw::volume::rho(sa, ct, 0.0).unwrap();
                let eos80 = density_kg_m3(s, t).unwrap();
                assert!(
                    (teos - eos80).abs() < 0.02,
                    "S {s} t {t}: {teos} vs {eos80}"
                );
            }
        }
    }

    /// The pressure of a column of one density against the hydrostatic
    /// equation integrated with the TEOS-10 density under pressure
    /// (`gsw::volume::rho`, the compressible water), at standard gravity:
    /// the bounds the doc of `pressure_dbar_at_depth` states.
    #[test]
    fn depth_to_pressure_against_a_compressible_column() {
        use super::{pressure_dbar_at_depth, STANDARD_GRAVITY_M_S2};
        for (s, t) in [
            (0.0, 4.0),
            (0.0, 25.0),
            (0.2, 10.0),
            (35.0, 2.0),
            (35.0, 20.0),
        ] {
            let sa = gsw::conversions::sr_from_sp(s);
            let ct = gsw::conversions::ct_from_pt(sa, t).unwrap();
            // dP/dz = rho(P) g, by the midpoint rule in 0.5 m steps.
            let (mut p, mut z, dz) = (0.0, 0.0, 0.5);
            for (depth, bound) in [(100.0, 3e-4), (500.0, 1.3e-3), (1000.0, 2.6e-3)] {
                while z < depth {
                    let rho0 = gsw::volume::rho(sa, ct, p).unwrap();
                    let half = p + 0.5 * dz * rho0 * STANDARD_GRAVITY_M_S2 / 1e4;
                    let rho = gsw::volume::rho(sa, ct, half).unwrap();
                    p += dz * rho * STANDARD_GRAVITY_M_S2 / 1e4;
                    z += dz;
                }
                let ours = pressure_dbar_at_depth(depth, s, t).unwrap();
                let low = 1.0 - ours / p;
                assert!(
                    (0.0..bound).contains(&low),
                    "S {s}, {t} °C, {depth} m: {ours} dbar against {p} ({low:e} low)"
                );
            }
        }
    }

    #[test]
    fn check_values() {
        // Millero & Poisson (1981), values computed from the equation .
        assert!((density_kg_m3(0.0, 25.0).unwrap() - 997.0480).abs() < 1e-4);
        assert!((density_kg_m3(35.0, 5.0).unwrap() - 1027.6755).abs() < 1e-4);
    }
}
