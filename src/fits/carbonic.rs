//! First and second dissociation constants of carbonic acid in saline water.
//!
//! Each fit gives K1 = [H+]\[HCO3-\]/\[CO2*\] and K2 = [H+]\[CO3--\]/[HCO3-] in
//! mol per kg of solution, on the pH scale the authors used. The caller
//! converts them to the working scale.

use super::FitRange;
use crate::base::numeric::Real;
use crate::properties::scales::PhScale;
use serde::Serialize;

/// A published fit of K1 and K2 for saline water.
///
/// # Example
/// ```
/// use travertine::fits::CarbonicFit;
/// let fit: CarbonicFit = "lueker2000".parse()?;
/// let (k1, k2) = fit.k1_k2(298.15, 35.0);
/// assert!((-k1.log10() - 5.8472).abs() < 5e-5);
/// assert!((-k2.log10() - 8.9660).abs() < 5e-5);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize)]
#[non_exhaustive]
pub enum CarbonicFit {
    /// Lueker, Dickson & Keeling (2000), total scale; t 2–35 °C, S 19–43.
    #[serde(rename = "lueker2000")]
    Lueker2000,
    /// Millero et al. (2006), sea-water scale; t 0–50 °C, S 0–50.
    #[serde(rename = "millero2006")]
    Millero2006,
    /// Roy et al. (1993), total scale; t 0–45 °C, S 5–45.
    #[serde(rename = "roy1993")]
    Roy1993,
    /// Dickson & Millero (1987) refit of Mehrbach et al. (1973), sea-water
    /// scale; about t 2–35 °C, S 20–40.
    #[serde(rename = "dickson-millero1987")]
    DicksonMillero1987,
}

impl CarbonicFit {
    /// Every fit, in the order shown to users.
    pub const ALL: [CarbonicFit; 4] = [
        CarbonicFit::Lueker2000,
        CarbonicFit::Millero2006,
        CarbonicFit::Roy1993,
        CarbonicFit::DicksonMillero1987,
    ];

    /// The author-year name.
    ///
    /// ```
    /// # use travertine::fits::CarbonicFit;
    /// assert_eq!(CarbonicFit::Roy1993.name(), "roy1993");
    /// ```
    pub fn name(self) -> &'static str {
        self.range().name
    }

    /// The pH scale of the published fit.
    ///
    /// ```
    /// # use travertine::{fits::CarbonicFit, PhScale};
    /// assert_eq!(CarbonicFit::Millero2006.scale(), PhScale::Seawater);
    /// ```
    pub fn scale(self) -> PhScale {
        match self {
            CarbonicFit::Lueker2000 | CarbonicFit::Roy1993 => PhScale::Total,
            CarbonicFit::Millero2006 | CarbonicFit::DicksonMillero1987 => PhScale::Seawater,
        }
    }

    /// The published validity range.
    ///
    /// ```
    /// # use travertine::fits::CarbonicFit;
    /// assert_eq!(CarbonicFit::Lueker2000.range().salinity, (19.0, 43.0));
    /// ```
    pub fn range(self) -> FitRange {
        match self {
            CarbonicFit::Lueker2000 => FitRange::new("lueker2000", (2.0, 35.0), (19.0, 43.0)),
            CarbonicFit::Millero2006 => FitRange::new("millero2006", (0.0, 50.0), (0.0, 50.0)),
            CarbonicFit::Roy1993 => FitRange::new("roy1993", (0.0, 45.0), (5.0, 45.0)),
            CarbonicFit::DicksonMillero1987 => {
                FitRange::new("dickson-millero1987", (2.0, 35.0), (20.0, 40.0))
            }
        }
    }

    /// K1 and K2 (mol/kg-soln, on [`CarbonicFit::scale`]) at temperature T (K)
    /// and practical salinity S.
    ///
    /// ```
    /// # use travertine::fits::CarbonicFit;
    /// let (k1, k2) = CarbonicFit::Millero2006.k1_k2(298.15, 35.0);
    /// assert!((-k1.log10() - 5.8401).abs() < 5e-5);
    /// assert!((-k2.log10() - 8.9636).abs() < 5e-5);
    /// ```
    ///
    /// Generic over [`Real`]: on `f64` the value, on a
    /// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
    /// and its derivatives.
    #[inline]
    pub fn k1_k2<R: Real>(self, temperature_k: R, salinity: R) -> (R, R) {
        let (a, b) = match self {
            CarbonicFit::Lueker2000 => lueker2000_pk1_pk2(temperature_k, salinity),
            CarbonicFit::Millero2006 => millero2006_pk1_pk2(temperature_k, salinity),
            CarbonicFit::Roy1993 => {
                let (l1, l2) = roy1993_ln_k1_k2(temperature_k, salinity);
                return (l1.exp(), l2.exp());
            }
            CarbonicFit::DicksonMillero1987 => dickson_millero1987_pk1_pk2(temperature_k, salinity),
        };
        ((-a).pow10(), (-b).pow10())
    }
}

fit_from_str!(CarbonicFit, crate::base::field::Field::CarbonicFit);

/// pK1 and pK2 of Lueker, Dickson & Keeling (2000), total scale, mol/kg-soln.
///
/// ```text
/// pK1 = 3633.86/T - 61.2172 + 9.67770 ln T - 0.011555 S + 0.0001152 S^2
/// pK2 =  471.78/T + 25.9290 - 3.16967 ln T - 0.01781 S  + 0.0001122 S^2
/// ```
/// Coefficients verified. Valid t 2–35 °C, S 19–43. Check values (Dickson,
/// Sabine & Christian 2007): log K1 = −5.8472, log K2 = −8.9660 at S 35, 25 °C.
///
/// ```
/// let (pk1, pk2) = travertine::fits::carbonic::lueker2000_pk1_pk2(298.15, 35.0);
/// assert!((pk1 - 5.8472).abs() < 5e-5 && (pk2 - 8.9660).abs() < 5e-5);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn lueker2000_pk1_pk2<R: Real>(temperature_k: R, salinity: R) -> (R, R) {
    let (t, s) = (temperature_k, salinity);
    let ln_t = t.ln();
    let pk1 = t.under(3633.86) - 61.2172 + ln_t * 9.67770 - s * 0.011555 + s * 0.0001152 * s;
    let pk2 = t.under(471.78) + 25.9290 - ln_t * 3.16967 - s * 0.01781 + s * 0.0001122 * s;
    (pk1, pk2)
}

/// pK1 and pK2 of Millero et al. (2006), sea-water scale, mol/kg-soln.
///
/// ```text
/// pKi = pKi0 + Ai + Bi/T + Ci ln T
/// pK10 = -126.34048 + 6320.813/T + 19.568224 ln T    (Harned & Davis 1943)
/// pK20 =  -90.18333 + 5143.692/T + 14.613358 ln T    (Harned & Scholes 1941)
/// A1 = 13.4191 S^0.5 + 0.0331 S - 5.33e-5 S^2 ;  B1 = -530.123 S^0.5 - 6.103 S ;  C1 = -2.06950 S^0.5
/// A2 = 21.0894 S^0.5 + 0.1248 S - 3.687e-4 S^2 ; B2 = -772.483 S^0.5 - 20.051 S ; C2 = -3.3336 S^0.5
/// ```
/// Coefficients verified. Valid t 0–50 °C, S 0–50. Check values (the
/// authors' own): pK1* = 5.8401, pK2* = 8.9636 at S 35, 25 °C.
///
/// ```
/// let (pk1, pk2) = travertine::fits::carbonic::millero2006_pk1_pk2(298.15, 35.0);
/// assert!((pk1 - 5.8401).abs() < 5e-5 && (pk2 - 8.9636).abs() < 5e-5);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn millero2006_pk1_pk2<R: Real>(temperature_k: R, salinity: R) -> (R, R) {
    let (t, s) = (temperature_k, salinity);
    let ln_t = t.ln();
    let rs = s.sqrt();
    let pk10 = t.under(6320.813) + -126.34048 + ln_t * 19.568224;
    let pk20 = t.under(5143.692) + -90.18333 + ln_t * 14.613358;
    let a1 = rs * 13.4191 + s * 0.0331 - s * 5.33e-5 * s;
    let b1 = rs * -530.123 - s * 6.103;
    let c1 = rs * -2.06950;
    let a2 = rs * 21.0894 + s * 0.1248 - s * 3.687e-4 * s;
    let b2 = rs * -772.483 - s * 20.051;
    let c2 = rs * -3.3336;
    (
        pk10 + a1 + b1 / t + c1 * ln_t,
        pk20 + a2 + b2 / t + c2 * ln_t,
    )
}

/// ln K1 and ln K2 of Roy et al. (1993), total scale, mol/kg-soln.
///
/// ```text
/// ln K1 =  2.83655 - 2307.1266/T - 1.5529413 ln T + (-0.20760841 - 4.0484/T) S^0.5
///          + 0.08468345 S - 0.00654208 S^1.5 + ln(1 - 0.001005 S)
/// ln K2 = -9.226508 - 3351.6106/T - 0.2005743 ln T + (-0.106901773 - 23.9722/T) S^0.5
///          + 0.1130822 S - 0.00846934 S^1.5 + ln(1 - 0.001005 S)
/// ```
/// Coefficients verified. Valid t 0–45 °C, S 5–45. Check values: ln K1 =
/// −13.4847, ln K2 = −20.5504 at S 35, 25 °C (computed from the equation;
/// as remembered from a 1994 handbook, unverified).
///
/// ```
/// let (l1, l2) = travertine::fits::carbonic::roy1993_ln_k1_k2(298.15, 35.0);
/// assert!((l1 - -13.4847).abs() < 5e-4 && (l2 - -20.5504).abs() < 5e-4);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn roy1993_ln_k1_k2<R: Real>(temperature_k: R, salinity: R) -> (R, R) {
    let (t, s) = (temperature_k, salinity);
    let ln_t = t.ln();
    let rs = s.sqrt();
    let to_soln = (s * 0.001005).subtracted_from(1.0).ln();
    let l1 = t.under(2307.1266).subtracted_from(2.83655) - ln_t * 1.5529413
        + t.under(4.0484).subtracted_from(-0.20760841) * rs
        + s * 0.08468345
        - s * 0.00654208 * rs
        + to_soln;
    let l2 = t.under(3351.6106).subtracted_from(-9.226508) - ln_t * 0.2005743
        + t.under(23.9722).subtracted_from(-0.106901773) * rs
        + s * 0.1130822
        - s * 0.00846934 * rs
        + to_soln;
    (l1, l2)
}

/// pK1 and pK2 of Dickson & Millero (1987), their refit of the Mehrbach et
/// al. (1973) measurements, sea-water scale, mol/kg-soln.
///
/// ```text
/// pK1 = 3670.7/T - 62.008 + 9.7944 ln T - 0.0118 S + 0.000116 S^2
/// pK2 = 1394.7/T + 4.777                 - 0.0184 S + 0.000118 S^2
/// ```
/// Coefficients verified. Valid about t 2–35 °C, S 20–40. Check values
/// (computed from the equation): pK1 = 5.8372, pK2 = 8.9554 at S 35, 25 °C.
///
/// ```
/// let (pk1, pk2) = travertine::fits::carbonic::dickson_millero1987_pk1_pk2(298.15, 35.0);
/// assert!((pk1 - 5.8372).abs() < 5e-5 && (pk2 - 8.9554).abs() < 5e-5);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn dickson_millero1987_pk1_pk2<R: Real>(temperature_k: R, salinity: R) -> (R, R) {
    let (t, s) = (temperature_k, salinity);
    let pk1 = t.under(3670.7) - 62.008 + t.ln() * 9.7944 - s * 0.0118 + s * 0.000116 * s;
    let pk2 = t.under(1394.7) + 4.777 - s * 0.0184 + s * 0.000118 * s;
    (pk1, pk2)
}

/// The plain name, as [`CarbonicFit::name`] gives it.
///
/// ```
/// assert_eq!(travertine::CarbonicFit::Lueker2000.to_string(), "lueker2000");
/// ```
impl std::fmt::Display for CarbonicFit {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}
