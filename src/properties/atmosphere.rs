//! The air over the water: barometric pressure from elevation by the
//! standard atmosphere, and the units a barometric pressure is read in.

use crate::base::numeric::Real;

/// Sea-level pressure of the standard atmosphere, kPa (ICAO 1993; U.S.
/// Standard Atmosphere 1976: 101 325 Pa).
pub const SEA_LEVEL_KPA: f64 = 101.325;
/// One standard atmosphere, kPa (by definition).
pub const KPA_PER_ATM: f64 = 101.325;
/// Sea-level temperature of the standard atmosphere, K (288.15 K, 15 °C).
pub const SEA_LEVEL_K: f64 = 288.15;
/// Temperature lapse rate of the standard troposphere, K/m (6.5 K/km).
pub const LAPSE_RATE_K_M: f64 = 0.0065;
/// The exponent g0·M/(R*·L) of the standard troposphere:
/// g0 = 9.80665 m/s², M = 0.0289644 kg/mol, R* = 8.31432 J/(mol K),
/// L = 0.0065 K/m (U.S. Standard Atmosphere 1976), which gives 5.25588.
pub const PRESSURE_EXPONENT: f64 = 9.806_65 * 0.028_964_4 / (8.314_32 * LAPSE_RATE_K_M);
/// Lowest elevation accepted, m (the shores of the Dead Sea lie near −430 m).
pub const ELEVATION_MIN_M: f64 = -500.0;
/// Highest elevation accepted, m: about the highest lakes, and the top of
/// the air-pressure range of [`crate::sample::Conditions`] (0.4 atm).
pub const ELEVATION_MAX_M: f64 = 7000.0;

/// Barometric pressure at an elevation, kPa, in the ICAO standard
/// atmosphere (the same as the U.S. Standard Atmosphere 1976 below 11 km):
///
/// ```text
/// P = P0 (1 − L h / T0)^(g0 M / (R* L))
/// P0 = 101.325 kPa, T0 = 288.15 K, L = 0.0065 K/m, exponent 5.25588
/// ```
///
/// `h` is the elevation above sea level in m, taken as the geopotential
/// height (they differ by 0.016 % of h, 0.16 m at 1000 m). It is the mean
/// pressure of a mean atmosphere: the weather moves the real pressure by
/// a few percent about it, so a barometer reading, where there is one, is
/// better.
///
/// # Units
/// Elevation in m; pressure in kPa. Generic over [`Real`]: on a
/// [`crate::base::numeric::Tangent`] it gives the same value with its
/// derivatives.
///
/// # Example
/// ```
/// use travertine::base::numeric::{Real, Tangent};
/// use travertine::properties::atmosphere::standard_pressure_kpa;
/// // ICAO / U.S. 1976 standard atmosphere table: 89.87 kPa at 1000 m.
/// assert!((standard_pressure_kpa(1000.0) - 89.87).abs() < 0.005);
/// assert_eq!(standard_pressure_kpa(0.0), 101.325);
/// // dP/dh = −P (g0 M/(R* L)) L / (T0 − L h), computed: −0.01090 kPa/m at 1000 m.
/// let p = standard_pressure_kpa(Tangent::<1>::source(1000.0, 0));
/// assert_eq!(p.value(), standard_pressure_kpa(1000.0));
/// assert!((p.d[0] + 0.01090).abs() < 1e-5);
/// ```
pub fn standard_pressure_kpa<R: Real>(elevation_m: R) -> R {
    (elevation_m * LAPSE_RATE_K_M / SEA_LEVEL_K)
        .subtracted_from(1.0)
        .powf(PRESSURE_EXPONENT)
        * SEA_LEVEL_KPA
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_exponent_is_the_published_one() {
        // U.S. Standard Atmosphere 1976: g0 M / (R* L) = 5.25588 (rounded).
        assert!((PRESSURE_EXPONENT - 5.25588).abs() < 5e-6);
    }

    #[test]
    fn table_values() {
        // ICAO / U.S. 1976 standard atmosphere: 89.87 kPa at 1000 m (the
        // published table). The others computed from the published formula
        // at geopotential heights: 2000 m 79.495, 5000 m 54.020, −500 m
        // 107.478 kPa.
        for (h, p) in [
            (1000.0, 89.875),
            (2000.0, 79.495),
            (5000.0, 54.020),
            (-500.0, 107.478),
        ] {
            assert!((standard_pressure_kpa(h) - p).abs() < 0.001, "{h} m");
        }
    }
}
