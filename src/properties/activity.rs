//! Activity coefficients of ions in fresh water.
//!
//! ```text
//! Davies:                    log γ = -A z² ( √I/(1 + √I) - 0.3 I )
//! extended Debye–Hückel:     log γ = -A z² √I / (1 + B å √I)
//! A = 1.82483e6 √ρw (ε T)^-1.5        (kg^0.5 mol^-0.5)
//! B = 50.2916 √ρw (ε T)^-0.5          (Å^-1 kg^0.5 mol^-0.5)
//! ε = 87.740 - 0.40008 t + 9.398e-4 t² - 1.410e-6 t³     (Malmberg & Maryott 1956)
//! ```
//! The Davies equation (Davies 1962) is verified; the A and B expressions and
//! the Malmberg & Maryott (1956) dielectric constant are from memory
//! (unverified); they give A = 0.5108 and B = 0.3287 at 25 °C, against the
//! tabulated 0.509–0.511 and 0.3283. ρw is the density of pure water in g/cm³
//! (TEOS-10 at S = 0). Neutral species have γ = 1 (no salting-out term).
//!
//! The functions are generic over [`Real`]: on `f64` they give the numbers
//! the library reports, on a [`crate::base::numeric::Tangent`] the same
//! values with their derivatives (charges and ion sizes stay constants).

use crate::base::error::{Error, Result};
use crate::base::field::Field;
use crate::base::numeric::Real;
use serde::Serialize;

/// A model of ionic activity coefficients.
///
/// ```
/// use travertine::properties::activity::ActivityModel;
/// let m: ActivityModel = "davies".parse()?;
/// assert_eq!(m, ActivityModel::Davies);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize, Default)]
#[non_exhaustive]
pub enum ActivityModel {
    /// Davies (1962), with the 0.3 I term; good to about I = 0.1–0.5.
    #[default]
    #[serde(rename = "davies")]
    Davies,
    /// Extended Debye–Hückel with Kielland (1937) ion sizes; good to about I = 0.1.
    #[serde(rename = "extended-debye-huckel")]
    ExtendedDebyeHuckel,
}

impl ActivityModel {
    /// The plain name.
    ///
    /// ```
    /// # use travertine::properties::activity::ActivityModel;
    /// assert_eq!(ActivityModel::ExtendedDebyeHuckel.name(), "extended-debye-huckel");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            ActivityModel::Davies => "davies",
            ActivityModel::ExtendedDebyeHuckel => "extended-debye-huckel",
        }
    }
}

impl std::str::FromStr for ActivityModel {
    type Err = Error;
    fn from_str(s: &str) -> Result<Self> {
        match s.trim().to_ascii_lowercase().as_str() {
            "davies" => Ok(ActivityModel::Davies),
            "extended-debye-huckel" => Ok(ActivityModel::ExtendedDebyeHuckel),
            _ => Err(Error::UnknownChoice {
                field: Field::Activity,
                name: s.to_string(),
                accepted: "davies, extended-debye-huckel".to_string(),
            }),
        }
    }
}

/// Dielectric constant of water, Malmberg & Maryott (1956), t in °C
/// (coefficients from memory, unverified).
///
/// ```
/// let e = travertine::properties::activity::dielectric_constant(25.0);
/// assert!((e - 78.30).abs() < 0.01); // computed from the equation; tables give 78.3–78.4
/// ```
pub fn dielectric_constant<R: Real>(temperature_c: R) -> R {
    let t = temperature_c;
    (t * 0.40008).subtracted_from(87.740) + t * 9.398e-4 * t - t * 1.410e-6 * t * t
}

/// Debye–Hückel A (log10 basis, kg^0.5 mol^-0.5) from the dielectric constant
/// and the density of pure water `rho_w_g_cm3`.
///
/// ```
/// let a = travertine::properties::activity::debye_huckel_a(25.0, 0.997048);
/// assert!((a - 0.5108).abs() < 5e-4); // computed from Malmberg & Maryott (1956); tables quote 0.509–0.511
/// ```
pub fn debye_huckel_a<R: Real>(temperature_c: R, rho_w_g_cm3: R) -> R {
    let et = dielectric_constant(temperature_c) * (temperature_c + 273.15);
    rho_w_g_cm3.sqrt() * 1.82483e6 * et.powf(-1.5)
}

/// Debye–Hückel A and B together, as [`debye_huckel_a`] and
/// [`debye_huckel_b`] give them (to rounding), from one square root:
/// with r = (εT)^(−1/2), A = 1.82483e6 √ρ r³ and B = 50.2916 √ρ r.
pub(crate) fn debye_huckel_coefficients<R: Real>(temperature_c: R, rho_w_g_cm3: R) -> (R, R) {
    let et = dielectric_constant(temperature_c) * (temperature_c + 273.15);
    let r = et.sqrt().under(1.0);
    let root_rho = rho_w_g_cm3.sqrt();
    (root_rho * 1.82483e6 * (r * r * r), root_rho * 50.2916 * r)
}

/// Debye–Hückel B (Å⁻¹ kg^0.5 mol^-0.5).
///
/// ```
/// let b = travertine::properties::activity::debye_huckel_b(25.0, 0.997048);
/// assert!((b - 0.3283).abs() < 1e-3);
/// ```
pub fn debye_huckel_b<R: Real>(temperature_c: R, rho_w_g_cm3: R) -> R {
    let et = dielectric_constant(temperature_c) * (temperature_c + 273.15);
    rho_w_g_cm3.sqrt() * 50.2916 * et.powf(-0.5)
}

/// Davies activity coefficient of an ion of charge `z` at ionic strength `i`.
///
/// ```
/// // Davies (1962), computed: γ(z = 1, I = 0.01, A = 0.509) = 0.9021
/// let g = travertine::properties::activity::davies_gamma(0.509, 1.0, 0.01);
/// assert!((g - 0.9021).abs() < 5e-5);
/// ```
pub fn davies_gamma<R: Real>(a: R, z: f64, i: R) -> R {
    let ri = i.sqrt();
    (-a * z * z * (ri / (ri + 1.0) - i * 0.3)).pow10()
}

/// Extended Debye–Hückel activity coefficient with ion size `size_angstrom`.
///
/// ```
/// let g = travertine::properties::activity::extended_debye_huckel_gamma(0.5108, 0.3287, 2.0, 6.0, 0.01);
/// assert!(g > 0.6 && g < 0.7);
/// ```
pub fn extended_debye_huckel_gamma<R: Real>(a: R, b: R, z: f64, size_angstrom: f64, i: R) -> R {
    let ri = i.sqrt();
    (-a * z * z * ri / (b * size_angstrom * ri + 1.0)).power_of(10.0)
}

/// Kielland (1937) ion-size parameters, Å (from memory, unverified).
pub mod ion_size {
    /// H+.
    pub const H: f64 = 9.0;
    /// OH-, HS-, F-, Cl-, K+ and other small monovalent ions.
    pub const SMALL_MONOVALENT: f64 = 3.5;
    /// HCO3-, H2PO4-, B(OH)4-, Na+, CaHCO3+.
    pub const HCO3: f64 = 4.5;
    /// CO3--, SO4--, HPO4--.
    pub const CO3: f64 = 4.5;
    /// Ca++.
    pub const CA: f64 = 6.0;
    /// Mg++.
    pub const MG: f64 = 8.0;
    /// PO4---.
    pub const PO4: f64 = 4.0;
}

/// Activity coefficients for one ionic strength, by charge: plain numbers
/// (`Gammas`, i.e. `Gammas<f64>`), or numbers with derivatives
/// (`Gammas<Tangent<N>>`) when made from them.
///
/// ```
/// use travertine::base::numeric::{Real, Tangent};
/// use travertine::properties::activity::{ActivityModel, Gammas};
/// let g = Gammas::new(ActivityModel::Davies, 25.0, 0.997048, 0.0);
/// assert_eq!(g.monovalent, 1.0);
/// // The same, with dγ/dI at I = 0.01:
/// let i = Tangent::<1>::source(0.01, 0);
/// let t = Gammas::new(ActivityModel::Davies, Real::constant(25.0), Real::constant(0.997048), i);
/// assert_eq!(t.monovalent.value(), Gammas::new(ActivityModel::Davies, 25.0, 0.997048, 0.01).monovalent);
/// assert!(t.monovalent.d[0] < 0.0);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[non_exhaustive]
pub struct Gammas<R: Real = f64> {
    /// H+.
    pub hydrogen: R,
    /// Monovalent anions and cations (HCO3-, OH-, ...).
    pub monovalent: R,
    /// CO3-- and other divalent anions.
    pub carbonate: R,
    /// Ca++.
    pub calcium: R,
    /// Trivalent ions (PO4---).
    pub trivalent: R,
}

impl<R: Real> Gammas<R> {
    /// The coefficients under `model` at temperature (°C), pure-water density
    /// (g/cm³) and ionic strength (mol/kg).
    ///
    /// ```
    /// # use travertine::properties::activity::{ActivityModel, Gammas};
    /// let g = Gammas::new(ActivityModel::Davies, 25.0, 0.997048, 0.01);
    /// assert!((g.monovalent - 0.9022).abs() < 1e-3);
    /// ```
    pub fn new(model: ActivityModel, temperature_c: R, rho_w_g_cm3: R, i: R) -> Self {
        let a = debye_huckel_a(temperature_c, rho_w_g_cm3);
        let b = debye_huckel_b(temperature_c, rho_w_g_cm3);
        Self::from_coefficients(model, a, b, i)
    }

    /// The coefficients under `model` from the Debye–Hückel A and B already
    /// evaluated for the temperature (see [`debye_huckel_a`],
    /// [`debye_huckel_b`]; B is used only by the extended equation), at
    /// ionic strength `i` (mol/kg). A solve that iterates the ionic strength
    /// evaluates A and B once.
    ///
    /// ```
    /// # use travertine::properties::activity::{debye_huckel_a, debye_huckel_b, ActivityModel, Gammas};
    /// let (a, b) = (debye_huckel_a(25.0, 0.997048), debye_huckel_b(25.0, 0.997048));
    /// let g = Gammas::from_coefficients(ActivityModel::Davies, a, b, 0.01);
    /// assert_eq!(g, Gammas::new(ActivityModel::Davies, 25.0, 0.997048, 0.01));
    /// ```
    pub fn from_coefficients(model: ActivityModel, a: R, b: R, i: R) -> Self {
        match model {
            ActivityModel::Davies => {
                // log γ is proportional to z²: γ2 = γ1⁴ and γ3 = γ1⁹, one
                // exponential for the three.
                let g1 = davies_gamma(a, 1.0, i);
                let g2 = (g1 * g1) * (g1 * g1);
                Self {
                    hydrogen: g1,
                    monovalent: g1,
                    carbonate: g2,
                    calcium: g2,
                    trivalent: g2 * g2 * g1,
                }
            }
            ActivityModel::ExtendedDebyeHuckel => {
                let g = |z: f64, size: f64| extended_debye_huckel_gamma(a, b, z, size, i);
                Self {
                    hydrogen: g(1.0, ion_size::H),
                    monovalent: g(1.0, ion_size::HCO3),
                    carbonate: g(2.0, ion_size::CO3),
                    calcium: g(2.0, ion_size::CA),
                    trivalent: g(3.0, ion_size::PO4),
                }
            }
        }
    }
}

/// The plain name, as [`ActivityModel::name`] gives it.
///
/// ```
/// assert_eq!(travertine::properties::activity::ActivityModel::Davies.to_string(), "davies");
/// ```
impl std::fmt::Display for ActivityModel {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The coefficients made together are those made apart, to rounding.
    #[test]
    fn debye_huckel_coefficients_together_match_apart() {
        for (t, rho) in [
            (0.0, 0.99984),
            (15.0, 0.99910),
            (25.0, 0.997048),
            (40.0, 0.99222),
        ] {
            let (a, b) = debye_huckel_coefficients(t, rho);
            assert!((a / debye_huckel_a(t, rho) - 1.0).abs() < 1e-14, "A at {t}");
            assert!((b / debye_huckel_b(t, rho) - 1.0).abs() < 1e-14, "B at {t}");
        }
    }

    /// On a `Tangent` the pair has the f64 values bit for bit (and those
    /// of the formula before it was generic), and derivatives in t and ρw
    /// that agree with central differences (step 1e-5 relative; truncation
    /// and rounding both below 1e-9 relative here).
    #[test]
    fn debye_huckel_coefficients_on_tangents() {
        use crate::base::numeric::Tangent;
        let old = |t: f64, rho: f64| {
            let d = 87.740 - 0.40008 * t + 9.398e-4 * t * t - 1.410e-6 * t * t * t;
            let et = d * (t + 273.15);
            let r = 1.0 / et.sqrt();
            let root_rho = rho.sqrt();
            (1.82483e6 * root_rho * (r * r * r), 50.2916 * root_rho * r)
        };
        for t in [0.0, 4.0, 15.0, 25.0, 40.0] {
            for rho in [0.9922, 0.99705, 0.99984] {
                let (a, b) = debye_huckel_coefficients(t, rho);
                let (oa, ob) = old(t, rho);
                assert_eq!((a.to_bits(), b.to_bits()), (oa.to_bits(), ob.to_bits()));
                let (ta, tb) =
                    debye_huckel_coefficients(Tangent::<2>::source(t, 0), Tangent::source(rho, 1));
                assert_eq!(
                    (ta.value().to_bits(), tb.value().to_bits()),
                    (a.to_bits(), b.to_bits())
                );
                for (j, x, h) in [(0, t, 1e-5 * t.abs().max(1.0)), (1, rho, 1e-5 * rho)] {
                    let at = |dx: f64| {
                        if j == 0 {
                            debye_huckel_coefficients(x + dx, rho)
                        } else {
                            debye_huckel_coefficients(t, x + dx)
                        }
                    };
                    let (hi, lo) = (at(h), at(-h));
                    let cd = ((hi.0 - lo.0) / (2.0 * h), (hi.1 - lo.1) / (2.0 * h));
                    assert!(
                        (ta.d[j] - cd.0).abs() <= 1e-7 * cd.0.abs(),
                        "dA/dx{j} at {t}"
                    );
                    assert!(
                        (tb.d[j] - cd.1).abs() <= 1e-7 * cd.1.abs(),
                        "dB/dx{j} at {t}"
                    );
                }
            }
        }
    }
}
