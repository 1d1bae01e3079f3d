//! First and second dissociation constants of carbonic acid in saline water.
//!
//! Each fit gives K1 = [H+]\[HCO3-\]/\[CO2*\] and K2 = [H+]\[CO3--\]/[HCO3-] in
//! mol per kg of solution, on the pH scale the authors used. The caller
//! converts them to the working scale.

use super::FitRange;
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
    #[inline]
    pub fn k1_k2(self, temperature_k: f64, salinity: f64) -> (f64, f64) {
        let (a, b) = match self {
            CarbonicFit::Lueker2000 => lueker2000_pk1_pk2(temperature_k, salinity),
            CarbonicFit::Millero2006 => millero2006_pk1_pk2(temperature_k, salinity),
            CarbonicFit::Roy1993 => {
                let (l1, l2) = roy1993_ln_k1_k2(temperature_k, salinity);
                return (l1.exp(), l2.exp());
            }
            CarbonicFit::DicksonMillero1987 => dickson_millero1987_pk1_pk2(temperature_k, salinity),
        };
        (
            crate::base::numeric::pow10(-a),
            crate::base::numeric::pow10(-b),
        )
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
#[inline]
pub fn lueker2000_pk1_pk2(temperature_k: f64, salinity: f64) -> (f64, f64) {
    let (t, s) = (temperature_k, salinity);
    let ln_t = t.ln();
    let pk1 = 3633.86 / t - 61.2172 + 9.67770 * ln_t - 0.011555 * s + 0.0001152 * s * s;
    let pk2 = 471.78 / t + 25.9290 - 3.16967 * ln_t - 0.01781 * s + 0.0001122 * s * s;
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
#[inline]
pub fn millero2006_pk1_pk2(temperature_k: f64, salinity: f64) -> (f64, f64) {
    let (t, s) = (temperature_k, salinity);
    let ln_t = t.ln();
    let rs = s.sqrt();
    let pk10 = -126.34048 + 6320.813 / t + 19.568224 * ln_t;
    let pk20 = -90.18333 + 5143.692 / t + 14.613358 * ln_t;
    let a1 = 13.4191 * rs + 0.0331 * s - 5.33e-5 * s * s;
    let b1 = -530.123 * rs - 6.103 * s;
    let c1 = -2.06950 * rs;
    let a2 = 21.0894 * rs + 0.1248 * s - 3.687e-4 * s * s;
    let b2 = -772.483 * rs - 20.051 * s;
    let c2 = -3.3336 * rs;
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
#[inline]
pub fn roy1993_ln_k1_k2(temperature_k: f64, salinity: f64) -> (f64, f64) {
    let (t, s) = (temperature_k, salinity);
    let ln_t = t.ln();
    let rs = s.sqrt();
    let to_soln = (1.0 - 0.001005 * s).ln();
    let l1 = 2.83655 - 2307.1266 / t - 1.5529413 * ln_t
        + (-0.20760841 - 4.0484 / t) * rs
        + 0.08468345 * s
        - 0.00654208 * s * rs
        + to_soln;
    let l2 = -9.226508 - 3351.6106 / t - 0.2005743 * ln_t
        + (-0.106901773 - 23.9722 / t) * rs
        + 0.1130822 * s
        - 0.00846934 * s * rs
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
#[inline]
pub fn dickson_millero1987_pk1_pk2(temperature_k: f64, salinity: f64) -> (f64, f64) {
    let (t, s) = (temperature_k, salinity);
    let pk1 = 3670.7 / t - 62.008 + 9.7944 * t.ln() - 0.0118 * s + 0.000116 * s * s;
    let pk2 = 1394.7 / t + 4.777 - 0.0184 * s + 0.000118 * s * s;
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
