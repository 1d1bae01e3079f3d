//! Boric acid: its dissociation constant and total boron from salinity.

use super::FitRange;
use crate::base::numeric::Real;
use serde::Serialize;

/// Published range of Dickson (1990) KB.
pub const DICKSON1990_KB_RANGE: FitRange = FitRange::new("dickson1990", (0.0, 45.0), (5.0, 45.0));

/// ln KB of Dickson (1990), total scale, mol/kg-soln.
///
/// ```text
/// ln KB = (-8966.90 - 2890.53 S^0.5 - 77.942 S + 1.728 S^1.5 - 0.0996 S^2)/T
///         + 148.0248 + 137.1942 S^0.5 + 1.62142 S
///         - (24.4344 + 25.085 S^0.5 + 0.2474 S) ln T + 0.053105 S^0.5 T
/// ```
/// Coefficients verified. Valid t 0–45 °C, S 5–45. Check value (Dickson,
/// Sabine & Christian 2007): ln KB = −19.7964 at S 35, 25 °C.
///
/// ```
/// let l = travertine::fits::boron::dickson1990_ln_kb(298.15, 35.0);
/// assert!((l - -19.7964).abs() < 5e-5);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn dickson1990_ln_kb<R: Real>(temperature_k: R, salinity: R) -> R {
    let (t, s) = (temperature_k, salinity);
    let rs = s.sqrt();
    ((rs * 2890.53).subtracted_from(-8966.90) - s * 77.942 + s * 1.728 * rs - s * 0.0996 * s) / t
        + 148.0248
        + rs * 137.1942
        + s * 1.62142
        - (rs * 25.085 + 24.4344 + s * 0.2474) * t.ln()
        + rs * 0.053105 * t
}

/// The ratio of total boron to salinity.
///
/// # Example
/// ```
/// use travertine::fits::BoronTotalFit;
/// let tb = BoronTotalFit::Lee2010.total_mol_kg(35.0);
/// assert!((tb * 1e6 - 432.5).abs() < 0.05);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Default)]
#[non_exhaustive]
pub enum BoronTotalFit {
    /// Lee et al. (2010): B/S = 0.1336 mg/kg (verified).
    #[default]
    #[serde(rename = "lee2010")]
    Lee2010,
    /// Uppström (1974): B/Cl = 0.232 mg/g, chlorinity = S/1.80655 (verified).
    #[serde(rename = "uppstrom1974")]
    Uppstrom1974,
}

impl BoronTotalFit {
    /// Every choice.
    pub const ALL: [BoronTotalFit; 2] = [BoronTotalFit::Lee2010, BoronTotalFit::Uppstrom1974];

    /// Author-year name.
    ///
    /// ```
    /// # use travertine::fits::BoronTotalFit;
    /// assert_eq!(BoronTotalFit::Uppstrom1974.name(), "uppstrom1974");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            BoronTotalFit::Lee2010 => "lee2010",
            BoronTotalFit::Uppstrom1974 => "uppstrom1974",
        }
    }

    /// Total boron, mol/kg-soln, at practical salinity S.
    ///
    /// ```text
    /// lee2010:      TB = 0.1336e-3 / 10.811 * S
    /// uppstrom1974: TB = 0.232e-3 / 10.811 * S / 1.80655
    /// ```
    /// Check values (computed from the ratios): 432.5 and 415.8 µmol/kg at S 35.
    ///
    /// ```
    /// # use travertine::fits::BoronTotalFit;
    /// assert!((BoronTotalFit::Uppstrom1974.total_mol_kg(35.0) * 1e6 - 415.8).abs() < 0.05);
    /// ```
    ///
    /// Generic over [`Real`]: on `f64` the value, on a
    /// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
    /// and its derivatives.
    #[inline]
    pub fn total_mol_kg<R: Real>(self, salinity: R) -> R {
        match self {
            BoronTotalFit::Lee2010 => salinity * (0.1336e-3 / 10.811),
            BoronTotalFit::Uppstrom1974 => salinity * (0.232e-3 / 10.811) / 1.80655,
        }
    }
}

fit_from_str!(BoronTotalFit, crate::base::field::Field::BoronFit);

/// The plain name, as [`BoronTotalFit::name`] gives it.
///
/// ```
/// assert_eq!(travertine::fits::BoronTotalFit::Lee2010.to_string(), "lee2010");
/// ```
impl std::fmt::Display for BoronTotalFit {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}
