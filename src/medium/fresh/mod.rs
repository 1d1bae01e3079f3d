//! The fresh medium: thermodynamic constants made apparent with activity
//! coefficients, the ionic strength, the calcium ion pairs, and the fixed
//! point that runs the shared solver of [`crate::solve`] at them; the
//! Langelier index and the calcium carbonate precipitation potential.
//!
//! The constants are apparent constants on the NBS scale, where the working
//! h is the activity of H+:
//!
//! ```text
//! K1' = K1/γ1          K2' = K2 γ1/γ2        KW' = Kw/γ1
//! KB', KSi', KH2S' = K/γ1                    KNH4' = Ka γ1
//! KP1' = KP1/γ1   KP2' = KP2 γ1/γ2   KP3' = KP3 γ2/γ3
//! Ksp' = Ksp/(γCa γ2)                        [H+] = aH/γH
//! [CaHCO3+] = K γCa [Ca][HCO3-]              [CaCO3⁰] = K γCa γ2 [Ca][CO3--]
//! ```
//! with γ1, γ2, γ3 the coefficients of ions of charge 1, 2, 3 and neutral
//! species at γ = 1.
//!
//! # One solver for both media
//! The apparent constants depend on the ionic strength I and the free
//! calcium Ca, which depend on the speciation. A solve is therefore a fixed
//! point around the shared solver:
//!
//! ```text
//! (I, Ca) → apparent constants → shared pair algebra and root → (h, DIC)
//!         → Ca from the exact pair balance at that h and DIC,
//!           I from the ions (unless it comes from conductance, TDS or salinity)
//! ```
//! repeated until I and Ca change by less than 1e-12 relative. The root
//! policy is the shared one; where a pair has two roots, each is settled at
//! its own ionic strength and calcium, so the root nearer pH 8 and the
//! other root's warning hold for the converged waters.

use crate::base::numeric::Real;
use crate::base::warning::Warning;
use crate::fits::FitsUsed;
use crate::properties::activity::ActivityModel;
use crate::sample::conditions::Conditions;
use crate::sample::Totals;
use serde::Serialize;

mod basis;
pub(crate) use basis::FreshSources;
pub(crate) mod ionic;

/// Where the ionic strength of a fresh water came from.
///
/// ```
/// use travertine::medium::IonicStrengthRoute;
/// assert_eq!(IonicStrengthRoute::MajorIons.name(), "major ions");
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[non_exhaustive]
pub enum IonicStrengthRoute {
    /// Computed from the major ions given and the carbonate species, iterated.
    #[serde(rename = "major ions")]
    MajorIons,
    /// From specific conductance, Russell (1976).
    #[serde(rename = "specific conductance (russell1976)")]
    SpecificConductance,
    /// From total dissolved solids, Langelier (1936).
    #[serde(rename = "tds (langelier1936)")]
    Tds,
    /// Given directly.
    #[serde(rename = "given")]
    Given,
    /// From salinity with sea-water ratios, I = 19.924 S/(1000 − 1.005 S).
    #[serde(rename = "salinity")]
    Salinity,
    /// Nothing given: the carbonate species, any calcium, and a monovalent ion balancing the charge.
    #[serde(rename = "alkalinity only")]
    AlkalinityOnly,
}

impl IonicStrengthRoute {
    /// The plain name, as in the output key `ionic_strength_from`.
    ///
    /// ```
    /// # use travertine::medium::IonicStrengthRoute;
    /// assert_eq!(IonicStrengthRoute::Tds.name(), "tds (langelier1936)");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            IonicStrengthRoute::MajorIons => "major ions",
            IonicStrengthRoute::SpecificConductance => "specific conductance (russell1976)",
            IonicStrengthRoute::Tds => "tds (langelier1936)",
            IonicStrengthRoute::Given => "given",
            IonicStrengthRoute::Salinity => "salinity",
            IonicStrengthRoute::AlkalinityOnly => "alkalinity only",
        }
    }
}

/// Everything about a fresh water that does not depend on its speciation:
/// the thermodynamic constants at its temperature and pressure, the
/// Debye–Hückel coefficients, the totals, the ionic-strength route and the
/// range warnings. Evaluated once per prepared water; apparent constants at
/// any ionic strength and free calcium then cost the activity coefficients
/// and a few products. Its numbers are of any [`Real`]: on `f64` those of a
/// solve, on a [`Tangent`](crate::base::numeric::Tangent) the same values
/// with their derivatives with respect to the sources seeded in
/// [`FreshSources`] (see `FreshBasis::new_at`).
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct FreshBasis<R: Real = f64> {
    pub(crate) conditions: Conditions,
    /// The temperature (°C), practical salinity and gauge pressure (dbar)
    /// of `conditions` as numbers of this type (the `at` of the constants
    /// made from this basis).
    pub(crate) at: [R; 3],
    pub(crate) model: ActivityModel,
    /// Debye–Hückel A and B at this temperature.
    pub(crate) dh_a: R,
    pub(crate) dh_b: R,
    pub(crate) kh: R,
    pub(crate) k1: R,
    pub(crate) k2: R,
    pub(crate) kw: R,
    pub(crate) kb: R,
    pub(crate) kp: (R, R, R),
    pub(crate) ksi: R,
    pub(crate) ks: R,
    pub(crate) kf: R,
    pub(crate) knh4: R,
    pub(crate) kh2s: R,
    pub(crate) ksp_calcite: R,
    pub(crate) ksp_aragonite: R,
    pub(crate) k_cahco3: R,
    pub(crate) k_caco3: R,
    pub(crate) fugacity_factor: R,
    pub(crate) vapour_pressure_atm: R,
    pub(crate) density: R,
    pub(crate) totals: Totals<R>,
    pub(crate) fits_used: FitsUsed,
    pub(crate) route: IonicStrengthRoute,
    /// The ionic strength where it does not depend on the speciation.
    pub(crate) fixed_i: Option<R>,
    /// The first ionic strength of a fixed point where it comes from the ions.
    pub(crate) i_start: R,
    pub(crate) warnings: Vec<Warning>,
}

/// The plain name, as [`IonicStrengthRoute::name`] gives it.
///
/// ```
/// assert_eq!(travertine::medium::IonicStrengthRoute::MajorIons.to_string(), "major ions");
/// ```
impl std::fmt::Display for IonicStrengthRoute {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}

impl<R: Real> FreshBasis<R> {
    /// This basis with every number mapped by `f` (to another type),
    /// without the warnings: a basis on a few tangent slots spread onto
    /// the slots of a wider one, or stripped of its derivatives.
    pub(crate) fn map_numbers<S: Real>(&self, f: impl Fn(R) -> S) -> FreshBasis<S> {
        let c = &f;
        FreshBasis {
            conditions: self.conditions,
            at: self.at.map(c),
            model: self.model,
            dh_a: c(self.dh_a),
            dh_b: c(self.dh_b),
            kh: c(self.kh),
            k1: c(self.k1),
            k2: c(self.k2),
            kw: c(self.kw),
            kb: c(self.kb),
            kp: (c(self.kp.0), c(self.kp.1), c(self.kp.2)),
            ksi: c(self.ksi),
            ks: c(self.ks),
            kf: c(self.kf),
            knh4: c(self.knh4),
            kh2s: c(self.kh2s),
            ksp_calcite: c(self.ksp_calcite),
            ksp_aragonite: c(self.ksp_aragonite),
            k_cahco3: c(self.k_cahco3),
            k_caco3: c(self.k_caco3),
            fugacity_factor: c(self.fugacity_factor),
            vapour_pressure_atm: c(self.vapour_pressure_atm),
            density: c(self.density),
            totals: crate::medium::constants::map_totals(&self.totals, c),
            fits_used: self.fits_used,
            route: self.route,
            fixed_i: self.fixed_i.map(c),
            i_start: c(self.i_start),
            warnings: Vec::new(),
        }
    }
}
