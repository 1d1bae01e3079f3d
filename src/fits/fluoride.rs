//! Hydrogen fluoride: its dissociation constant and total fluoride.

use super::FitRange;
use crate::base::numeric::Real;
use crate::fits::sulfate::seawater_ionic_strength;
use crate::properties::scales::PhScale;
use serde::Serialize;

/// A published fit of KF = [H+]\[F-\]/\[HF\].
///
/// # Example
/// ```
/// use travertine::fits::FluorideFit;
/// let kf = FluorideFit::PerezFraga1987.kf(298.15, 35.0);
/// assert!((kf.ln() - -6.09).abs() < 5e-3);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Default)]
#[non_exhaustive]
pub enum FluorideFit {
    /// Perez & Fraga (1987), total scale; about t 9–33 °C, S 10–40. Coefficients from memory (unverified).
    #[default]
    #[serde(rename = "perez-fraga1987")]
    PerezFraga1987,
    /// Dickson & Riley (1979), free scale. Coefficients from memory (unverified).
    #[serde(rename = "dickson-riley1979")]
    DicksonRiley1979,
}

impl FluorideFit {
    /// Every choice.
    pub const ALL: [FluorideFit; 2] = [FluorideFit::PerezFraga1987, FluorideFit::DicksonRiley1979];

    /// Author-year name.
    ///
    /// ```
    /// # use travertine::fits::FluorideFit;
    /// assert_eq!(FluorideFit::DicksonRiley1979.name(), "dickson-riley1979");
    /// ```
    pub fn name(self) -> &'static str {
        self.range().name
    }

    /// The pH scale of the fit.
    ///
    /// ```
    /// # use travertine::{fits::FluorideFit, PhScale};
    /// assert_eq!(FluorideFit::PerezFraga1987.scale(), PhScale::Total);
    /// ```
    pub fn scale(self) -> PhScale {
        match self {
            FluorideFit::PerezFraga1987 => PhScale::Total,
            FluorideFit::DicksonRiley1979 => PhScale::Free,
        }
    }

    /// Published validity range (Dickson & Riley's is from memory, unverified).
    ///
    /// ```
    /// # use travertine::fits::FluorideFit;
    /// assert_eq!(FluorideFit::PerezFraga1987.range().temperature_c, (9.0, 33.0));
    /// ```
    pub fn range(self) -> FitRange {
        match self {
            FluorideFit::PerezFraga1987 => {
                FitRange::new("perez-fraga1987", (9.0, 33.0), (10.0, 40.0))
            }
            FluorideFit::DicksonRiley1979 => {
                FitRange::new("dickson-riley1979", (0.0, 45.0), (5.0, 45.0))
            }
        }
    }

    /// KF (mol/kg-soln) on [`FluorideFit::scale`].
    ///
    /// ```text
    /// perez-fraga1987 (total): ln KF = 874/T - 9.68 + 0.111 S^0.5
    /// dickson-riley1979 (free): ln KF = 1590.2/T - 12.641 + 1.525 I^0.5 + ln(1 - 0.001005 S)
    /// ```
    /// Check values: ln KF = −6.09 (Perez & Fraga, Dickson, Sabine & Christian
    /// 2007) and −6.0468 (Dickson & Riley, computed) at S 35, 25 °C.
    ///
    /// ```
    /// # use travertine::fits::FluorideFit;
    /// let kf = FluorideFit::DicksonRiley1979.kf(298.15, 35.0);
    /// assert!((kf.ln() - -6.0468).abs() < 5e-4);
    /// ```
    ///
    /// Generic over [`Real`]: on `f64` the value, on a
    /// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
    /// and its derivatives.
    #[inline]
    pub fn kf<R: Real>(self, temperature_k: R, salinity: R) -> R {
        let t = temperature_k;
        match self {
            FluorideFit::PerezFraga1987 => (t.under(874.0) - 9.68 + salinity.sqrt() * 0.111).exp(),
            FluorideFit::DicksonRiley1979 => {
                let i = seawater_ionic_strength(salinity);
                (t.under(1590.2) - 12.641
                    + i.sqrt() * 1.525
                    + (salinity * 0.001005).subtracted_from(1.0).ln())
                .exp()
            }
        }
    }
}

fit_from_str!(FluorideFit, crate::base::field::Field::FluorideFit);

/// Total fluoride, mol/kg-soln, from Riley (1965):
/// `FT = (6.7e-5 / 18.998) * (S / 1.80655)`. Ratio from memory (unverified).
/// Check value (computed): 6.83e-5 mol/kg at S 35.
///
/// ```
/// let ft = travertine::fits::fluoride::riley1965_total_mol_kg(35.0);
/// assert!((ft - 6.83e-5).abs() < 5e-8);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
#[inline]
pub fn riley1965_total_mol_kg<R: Real>(salinity: R) -> R {
    (salinity / 1.80655) * (6.7e-5 / 18.998)
}

/// The plain name, as [`FluorideFit::name`] gives it.
///
/// ```
/// assert_eq!(travertine::fits::FluorideFit::DicksonRiley1979.to_string(), "dickson-riley1979");
/// ```
impl std::fmt::Display for FluorideFit {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}
