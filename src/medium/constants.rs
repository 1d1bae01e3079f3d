//! One set of constants for one set of conditions: the [`Constants`] value
//! the solver reads, and its evaluation for saline water.
//!
//! [`Constants::saline`] evaluates every constant once, converts it to the
//! working pH scale (the total scale), applies the Millero (1995) pressure
//! corrections and records a warning for every fit used outside its
//! published range. The fresh medium ([`super::fresh`]) makes the same value
//! from thermodynamic constants and activity coefficients.

use crate::base::error::{Error, Result};
use crate::base::warning::Warning;
use crate::fits::{
    ammonia, boron, gas, kw, minerals, nutrients, pressure, sulfate, sulfide, FitName, Fits,
    FitsUsed,
};
use crate::properties::activity::Gammas;
use crate::properties::density::density_kg_m3;
use crate::properties::scales::{takahashi1982_fh, PhScale};
use crate::sample::{Composition, Conditions, Totals};
use serde::Serialize;

/// Every equilibrium constant for one set of conditions, on the working pH
/// scale, plus the factors that move the working scale to the others.
///
/// The working scale is the total scale in saline water and the NBS
/// (activity) scale in fresh water. Acid constants are
/// K = [H+]\[A-\]/\[HA\] with [H+] on that scale; `kw` is [H+]\[OH-\].
/// Constants of acid systems whose total is zero are not evaluated and hold 0.
///
/// # Invariants
/// The fields are private to the medium layer, which makes the value, and
/// are read through accessors ([`Constants::k1()`], [`Constants::totals()`],
/// ...). Several values follow from others and must stay in step:
/// - `k1e`, `k2e` are K1 and K2 with the calcium ion pairs folded in, and
///   the pair ratios follow from the pair constants and the free calcium
///   (see [`Constants::k1e()`]);
/// - the four `*_per_working` pH-scale factors follow from KS, KF, the
///   sulfate and fluoride totals and the H+ activity factor;
/// - saline constants store log10 of the scale factors and of both Ksp.
///
/// To change one constant (for example to propagate its uncertainty) use
/// [`Constants::with_pk`] or [`Constants::with_scaled`], which re-derive
/// whatever follows from it.
///
/// # Example
/// ```
/// use travertine::{Conditions, Water};
/// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
/// assert!((-k.k1().log10() - 5.8472).abs() < 5e-5); // Lueker 2000, Guide check value
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq, Serialize)]
#[non_exhaustive]
pub struct Constants {
    /// The conditions evaluated.
    pub(in crate::medium) conditions: Conditions,
    /// The working pH scale of every acid constant.
    pub(in crate::medium) working_scale: PhScale,
    /// CO2 solubility, mol kg⁻¹ atm⁻¹.
    pub(in crate::medium) k0: f64,
    /// First dissociation constant of carbonic acid.
    pub(in crate::medium) k1: f64,
    /// Second dissociation constant of carbonic acid.
    pub(in crate::medium) k2: f64,
    /// Boric acid.
    pub(in crate::medium) kb: f64,
    /// Ion product of water.
    pub(in crate::medium) kw: f64,
    /// Phosphoric acid, first.
    pub(in crate::medium) kp1: f64,
    /// Phosphoric acid, second.
    pub(in crate::medium) kp2: f64,
    /// Phosphoric acid, third.
    pub(in crate::medium) kp3: f64,
    /// Silicic acid.
    pub(in crate::medium) ksi: f64,
    /// Ammonium.
    pub(in crate::medium) knh4: f64,
    /// Hydrogen sulfide.
    pub(in crate::medium) kh2s: f64,
    /// Bisulfate, free scale.
    pub(in crate::medium) ks_free: f64,
    /// Hydrogen fluoride, free scale.
    pub(in crate::medium) kf_free: f64,
    /// K1 and K2 for the carbon balances: with calcium ion pairs (fresh
    /// water) DIC and alkalinity count CaHCO3+ with HCO3- and CaCO3⁰ with
    /// CO3--, which is the same as using K1e = K1 (1 + p1) and
    /// K2e = K2 (1 + p2)/(1 + p1), where p1 = [CaHCO3+]/[HCO3-] and
    /// p2 = \[CaCO3⁰\]/[CO3--]. Without pairs K1e = K1, K2e = K2.
    pub(in crate::medium) k1e: f64,
    /// See `k1e`.
    pub(in crate::medium) k2e: f64,
    /// [CaHCO3+]/[HCO3-] (0 in saline water, where pairs are in the constants).
    pub(in crate::medium) pair_hco3: f64,
    /// \[CaCO3⁰\]/[CO3--] (0 in saline water).
    pub(in crate::medium) pair_co3: f64,
    /// Free calcium used for the pairs and Ω, mol/kg (total calcium in saline water).
    pub(in crate::medium) calcium_free_mol_kg: f64,
    /// Ionic strength, mol/kg (sea water: 19.924 S/(1000 − 1.005 S)).
    pub(in crate::medium) ionic_strength: f64,
    /// Calcite solubility product, (mol/kg)².
    pub(in crate::medium) ksp_calcite: f64,
    /// Aragonite solubility product, (mol/kg)².
    pub(in crate::medium) ksp_aragonite: f64,
    /// The totals used.
    pub(in crate::medium) totals: Totals,
    /// [H+] on the free scale per unit of working-scale h.
    pub(in crate::medium) free_per_working: f64,
    /// [H+] on the sea-water scale per unit of working-scale h.
    pub(in crate::medium) seawater_per_working: f64,
    /// [H+] on the total scale per unit of working-scale h.
    pub(in crate::medium) total_per_working: f64,
    /// H+ activity (NBS) per unit of working-scale h.
    pub(in crate::medium) nbs_per_working: f64,
    /// fCO2 / pCO2.
    pub(in crate::medium) fugacity_factor: f64,
    /// Water vapour pressure, atm.
    pub(in crate::medium) vapour_pressure_atm: f64,
    /// Solution density at the surface, kg/m³.
    pub(in crate::medium) density_kg_m3: f64,
    /// The fits behind these numbers.
    pub(in crate::medium) fits_used: FitsUsed,
    /// Every fit used outside its published range, and other cautions.
    pub(in crate::medium) warnings: Vec<Warning>,
    /// Activity coefficients (fresh water only).
    pub(in crate::medium) gammas: Option<Gammas>,
    /// [CaHCO3+]/([Ca++]\[HCO3-\]), concentration basis (fresh water; 0 in saline).
    pub(in crate::medium) k_cahco3: f64,
    /// \[CaCO3⁰\]/([Ca++]\[CO3--\]), concentration basis (fresh water; 0 in saline).
    pub(in crate::medium) k_caco3: f64,
    /// The logarithms a state needs, where evaluated with the constants.
    #[serde(skip)]
    pub(in crate::medium) logs: Option<Log10s>,
}

/// How H+ activity (the NBS scale) ties to the concentration scales, the
/// one input of the pH-scale factors besides KS, KF and the totals.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(in crate::medium) enum ScaleLink {
    /// Saline water: the working scale is the total scale, and the H+
    /// activity per unit of sea-water-scale [H+] is fH (Takahashi et al. 1982).
    Total {
        /// fH.
        fh: f64,
    },
    /// Fresh water: the working scale is the NBS scale (h is the H+
    /// activity), and free [H+] = h/γH.
    Nbs {
        /// γH, the activity coefficient of H+.
        gamma_h: f64,
    },
}

/// [H+] on each scale per unit of working-scale h, and what the saline
/// constants store of them.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(in crate::medium) struct ScaleFactors {
    pub(in crate::medium) free_per_working: f64,
    pub(in crate::medium) seawater_per_working: f64,
    pub(in crate::medium) total_per_working: f64,
    pub(in crate::medium) nbs_per_working: f64,
    /// [H+] on the total scale per unit of [H+] on the sea-water scale:
    /// the factor that takes a constant from the sea-water scale to the
    /// total scale.
    pub(in crate::medium) total_per_seawater: f64,
    /// log10 of the four factors (total, sea-water, free, NBS), on the
    /// total working scale only, where the constants store them.
    pub(in crate::medium) logs: Option<[f64; 4]>,
}

/// The pH-scale factors from free-scale KS and KF and the sulfate and
/// fluoride totals (mol/kg): the one place they are derived, for the saline
/// constants, the fresh-water apparent constants and a perturbed KS or KF.
///
/// With S = ST/KS and F = FT/KF (the definitions of the total and
/// sea-water scales), [H+]T = [H+]F (1 + S) and [H+]SWS = [H+]F (1 + S + F);
/// in saline water aH = fH [H+]SWS (Takahashi et al. 1982), in fresh water
/// aH = γH [H+]F.
#[inline]
pub(in crate::medium) fn scale_factors(
    link: ScaleLink,
    sulfate_mol_kg: f64,
    fluoride_mol_kg: f64,
    ks_free: f64,
    kf_free: f64,
) -> ScaleFactors {
    match link {
        ScaleLink::Total { fh } => {
            let tot = 1.0 + sulfate_mol_kg / ks_free;
            let sws = tot + fluoride_mol_kg / kf_free;
            let seawater_per_working = sws / tot;
            let nbs_per_working = fh * seawater_per_working;
            let log10 = crate::base::numeric::log10;
            ScaleFactors {
                free_per_working: 1.0 / tot,
                seawater_per_working,
                total_per_working: 1.0,
                nbs_per_working,
                total_per_seawater: tot / sws,
                logs: Some([
                    0.0,
                    log10(seawater_per_working),
                    -log10(tot),
                    log10(nbs_per_working),
                ]),
            }
        }
        ScaleLink::Nbs { gamma_h } => {
            // [HSO4-]/[SO4--] and [HF]/[F-] per unit free [H+] (0 without
            // them, whose constants may not be evaluated).
            let per = |total: f64, k: f64| if total > 0.0 { total / k } else { 0.0 };
            let sulfate = per(sulfate_mol_kg, ks_free);
            let fluoride = per(fluoride_mol_kg, kf_free);
            ScaleFactors {
                free_per_working: 1.0 / gamma_h,
                // Defined as in sea water, from the free [H+] and the sulfate and
                // fluoride given (equal to the free scale when there are none).
                seawater_per_working: (1.0 + sulfate + fluoride) / gamma_h,
                total_per_working: (1.0 + sulfate) / gamma_h,
                nbs_per_working: 1.0,
                total_per_seawater: (1.0 + sulfate) / (1.0 + sulfate + fluoride),
                logs: None,
            }
        }
    }
}

/// One constant of a [`Constants`] value, to perturb with
/// [`Constants::with_pk`] or [`Constants::with_scaled`].
///
/// ```
/// use travertine::medium::ConstantName;
/// assert_eq!(ConstantName::K1.name(), "K1");
/// assert_eq!(ConstantName::ALL.len(), 16);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum ConstantName {
    /// K0, the CO2 solubility.
    K0,
    /// K1 of carbonic acid (K1e follows).
    K1,
    /// K2 of carbonic acid (K2e follows).
    K2,
    /// KB, boric acid.
    Kb,
    /// KW, the ion product of water.
    Kw,
    /// Ksp of calcite (its stored logarithm follows).
    KspCalcite,
    /// Ksp of aragonite (its stored logarithm follows).
    KspAragonite,
    /// KS, bisulfate on the free scale (the pH-scale factors follow).
    Ks,
    /// KF, hydrogen fluoride on the free scale (the pH-scale factors follow).
    Kf,
    /// KP1, phosphoric acid.
    Kp1,
    /// KP2, phosphoric acid.
    Kp2,
    /// KP3, phosphoric acid.
    Kp3,
    /// KSi, silicic acid.
    Ksi,
    /// KNH4, ammonium.
    Knh4,
    /// KH2S, hydrogen sulfide.
    Kh2s,
    /// The total boron, mol/kg (scaled like a constant).
    BoronTotal,
}

impl ConstantName {
    /// Every constant that can be perturbed.
    pub const ALL: [ConstantName; 16] = [
        ConstantName::K0,
        ConstantName::K1,
        ConstantName::K2,
        ConstantName::Kb,
        ConstantName::Kw,
        ConstantName::KspCalcite,
        ConstantName::KspAragonite,
        ConstantName::Ks,
        ConstantName::Kf,
        ConstantName::Kp1,
        ConstantName::Kp2,
        ConstantName::Kp3,
        ConstantName::Ksi,
        ConstantName::Knh4,
        ConstantName::Kh2s,
        ConstantName::BoronTotal,
    ];

    /// The name, as in warnings and errors.
    ///
    /// ```
    /// # use travertine::medium::ConstantName;
    /// assert_eq!(ConstantName::KspCalcite.name(), "Ksp calcite");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            ConstantName::K0 => "K0",
            ConstantName::K1 => "K1",
            ConstantName::K2 => "K2",
            ConstantName::Kb => "KB",
            ConstantName::Kw => "KW",
            ConstantName::KspCalcite => "Ksp calcite",
            ConstantName::KspAragonite => "Ksp aragonite",
            ConstantName::Ks => "KS",
            ConstantName::Kf => "KF",
            ConstantName::Kp1 => "KP1",
            ConstantName::Kp2 => "KP2",
            ConstantName::Kp3 => "KP3",
            ConstantName::Ksi => "KSi",
            ConstantName::Knh4 => "KNH4",
            ConstantName::Kh2s => "KH2S",
            ConstantName::BoronTotal => "total boron",
        }
    }
}

/// log10 of the pH-scale factors and of the solubility products. Saline
/// constants evaluate them once (the Mucci 1983 fits give log10 Ksp
/// directly), so that a state needs one logarithm for its four pH values
/// and one for both saturation indices; fresh-water constants, evaluated on
/// every trial of their inner iterations, leave them to the state.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Log10s {
    /// log10 of [H+] on the total, sea-water, free and NBS scales per unit
    /// of working-scale h, in that order.
    pub per_working: [f64; 4],
    /// log10 Ksp of calcite and of aragonite (with the pressure correction).
    pub ksp_calcite: f64,
    pub ksp_aragonite: f64,
}

impl Constants {
    /// Sets the free calcium of fresh-water constants and what follows from
    /// it: the pair ratios and the pair-inclusive K1e, K2e (see
    /// [`Constants::k1e()`]). The one place these are computed, so that
    /// constants made again from (I, Ca) are exactly those solved with.
    pub(crate) fn set_free_calcium(&mut self, ca_free: f64) {
        let pair_hco3 = self.k_cahco3 * ca_free;
        let pair_co3 = self.k_caco3 * ca_free;
        self.pair_hco3 = pair_hco3;
        self.pair_co3 = pair_co3;
        self.k1e = self.k1 * (1.0 + pair_hco3);
        self.k2e = self.k2 * (1.0 + pair_co3) / (1.0 + pair_hco3);
        self.calcium_free_mol_kg = ca_free;
    }

    /// How the NBS scale ties to the others in these constants, recovered
    /// rather than stored (a stored copy would be one more value to keep in
    /// step): γH from the activity coefficients in fresh water; in saline
    /// water fH as the ratio of the NBS and sea-water factors, which does not
    /// depend on KS or KF.
    fn scale_link(&self) -> ScaleLink {
        match (self.working_scale, self.gammas) {
            (PhScale::Nbs, Some(g)) => ScaleLink::Nbs {
                gamma_h: g.hydrogen,
            },
            (PhScale::Nbs, None) => ScaleLink::Nbs {
                gamma_h: 1.0 / self.free_per_working,
            },
            _ => ScaleLink::Total {
                fh: self.nbs_per_working / self.seawater_per_working,
            },
        }
    }

    /// Re-derives the pH-scale factors from the stored KS, KF and totals, by
    /// [`scale_factors`], with their stored logarithms.
    fn refresh_scale_factors(&mut self) {
        let f = scale_factors(
            self.scale_link(),
            self.totals.sulfate_mol_kg,
            self.totals.fluoride_mol_kg,
            self.ks_free,
            self.kf_free,
        );
        self.free_per_working = f.free_per_working;
        self.seawater_per_working = f.seawater_per_working;
        self.total_per_working = f.total_per_working;
        self.nbs_per_working = f.nbs_per_working;
        match (&mut self.logs, f.logs) {
            (Some(logs), Some(per_working)) => logs.per_working = per_working,
            // Not stored with the factors: evaluated by the state instead.
            (logs, _) => *logs = None,
        }
    }

    /// These constants with one of them multiplied by `factor`, and every
    /// value that follows from it derived again:
    /// - K1 or K2: K1e, K2e and the pair ratios, by the code that sets the
    ///   free calcium, at the current free calcium (K1e = K1 (1 + p1),
    ///   K2e = K2 (1 + p2)/(1 + p1); in saline water K1e = K1, K2e = K2);
    /// - a Ksp: its stored logarithm, raised by log10 `factor`;
    /// - KS or KF: the pH-scale factors, by the function that derives them
    ///   for [`Constants::saline`] (see [`Constants::free_per_working`]).
    ///   The other acid constants are held on the working scale: only the
    ///   other scales, and the bisulfate and HF parts of the alkalinity,
    ///   move.
    ///
    /// A constant that was not evaluated (its total is zero) stays 0. This is
    /// the step of a perturbation analysis (the uncertainty of a result from
    /// that of a constant); [`crate::PreparedWater::with_constants_perturbed`]
    /// solves with the result.
    ///
    /// # Errors
    /// [`crate::Error::NotFinite`] for a factor, or a result, that is not
    /// finite; [`crate::Error::Computation`] for a factor that is not
    /// positive, or a constant or scale factor it would take to zero or
    /// beyond the largest number.
    ///
    /// ```
    /// use travertine::{Conditions, Water, medium::ConstantName};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// let more = k.clone().with_scaled(ConstantName::KspCalcite, 1.5)?;
    /// assert!((more.ksp_calcite() / k.ksp_calcite() - 1.5).abs() < 1e-15);
    /// assert!(k.with_scaled(ConstantName::K1, f64::NAN).is_err());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_scaled(mut self, which: ConstantName, factor: f64) -> Result<Constants> {
        use ConstantName as C;
        if !factor.is_finite() {
            return Err(Error::NotFinite {
                field: "factor",
                value: factor,
            });
        }
        if factor <= 0.0 {
            return Err(Error::Computation {
                field: which.name(),
                reason: format!("a constant can only be scaled by a positive factor, not {factor}"),
            });
        }
        let slot = match which {
            C::K0 => &mut self.k0,
            C::K1 => &mut self.k1,
            C::K2 => &mut self.k2,
            C::Kb => &mut self.kb,
            C::Kw => &mut self.kw,
            C::KspCalcite => &mut self.ksp_calcite,
            C::KspAragonite => &mut self.ksp_aragonite,
            C::Ks => &mut self.ks_free,
            C::Kf => &mut self.kf_free,
            C::Kp1 => &mut self.kp1,
            C::Kp2 => &mut self.kp2,
            C::Kp3 => &mut self.kp3,
            C::Ksi => &mut self.ksi,
            C::Knh4 => &mut self.knh4,
            C::Kh2s => &mut self.kh2s,
            C::BoronTotal => &mut self.totals.boron_mol_kg,
        };
        let before = *slot;
        let after = before * factor;
        if !after.is_finite() {
            return Err(Error::NotFinite {
                field: which.name(),
                value: after,
            });
        }
        if before > 0.0 && after <= 0.0 {
            return Err(Error::Computation {
                field: which.name(),
                reason: format!("scaled by {factor} it would be zero"),
            });
        }
        *slot = after;
        let log10 = crate::base::numeric::log10;
        match which {
            C::K1 | C::K2 => self.set_free_calcium(self.calcium_free_mol_kg),
            C::KspCalcite => {
                if let Some(logs) = &mut self.logs {
                    logs.ksp_calcite += log10(factor);
                }
            }
            C::KspAragonite => {
                if let Some(logs) = &mut self.logs {
                    logs.ksp_aragonite += log10(factor);
                }
            }
            C::Ks | C::Kf => self.refresh_scale_factors(),
            _ => {}
        }
        self.check_derived(which)?;
        Ok(self)
    }

    /// These constants with pK = −log10 K of one of them raised by
    /// `delta_pk`: K multiplied by 10^(−`delta_pk`), and everything that
    /// follows from it derived again, as [`Constants::with_scaled`]. For
    /// [`ConstantName::BoronTotal`] the total is multiplied by the same
    /// factor (use [`Constants::with_scaled`] for a relative change).
    ///
    /// # Errors
    /// As [`Constants::with_scaled`]; [`crate::Error::NotFinite`] also for a
    /// `delta_pk` that is not finite.
    ///
    /// ```
    /// use travertine::{Conditions, Water, medium::ConstantName};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// let p = k.clone().with_pk(ConstantName::K1, 0.01)?;
    /// assert!((-p.k1().log10() + k.k1().log10() - 0.01).abs() < 1e-12);
    /// assert_eq!(p.k1e(), p.k1()); // no calcium pairs in saline water
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_pk(self, which: ConstantName, delta_pk: f64) -> Result<Constants> {
        if !delta_pk.is_finite() {
            return Err(Error::NotFinite {
                field: "delta_pk",
                value: delta_pk,
            });
        }
        self.with_scaled(which, crate::base::numeric::pow10(-delta_pk))
    }

    /// Refuses constants whose derived values a perturbation of `which`
    /// took out of range (a K1e that overflows, a scale factor of zero).
    fn check_derived(&self, which: ConstantName) -> Result<()> {
        let positive = [
            self.free_per_working,
            self.seawater_per_working,
            self.total_per_working,
            self.nbs_per_working,
        ];
        let finite = [self.k1e, self.k2e, self.pair_hco3, self.pair_co3];
        let logs = self.logs.map(|l| {
            let [a, b, c, d] = l.per_working;
            [a, b, c, d, l.ksp_calcite, l.ksp_aragonite]
        });
        let bad = positive
            .iter()
            .copied()
            .find(|v| !(v.is_finite() && *v > 0.0))
            .or_else(|| finite.iter().copied().find(|v| !v.is_finite()))
            .or_else(|| logs.and_then(|l| l.into_iter().find(|v| !v.is_finite())));
        match bad {
            None => Ok(()),
            Some(value) => Err(Error::Computation {
                field: which.name(),
                reason: format!("the perturbed constants would hold a value of {value}"),
            }),
        }
    }

    /// The conditions evaluated.
    #[inline]
    pub fn conditions(&self) -> &Conditions {
        &self.conditions
    }

    /// The working pH scale of every acid constant: total in saline water,
    /// NBS in fresh water.
    ///
    /// ```
    /// use travertine::{Conditions, PhScale, Water};
    /// let k = Water::fresh(Conditions::new(15.0, 0.1)?)?.constants()?;
    /// assert_eq!(k.working_scale(), PhScale::Nbs);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    #[inline]
    pub fn working_scale(&self) -> PhScale {
        self.working_scale
    }

    /// K0, the CO2 solubility \[CO2*\]/fCO2, mol kg⁻¹ atm⁻¹.
    #[inline]
    pub fn k0(&self) -> f64 {
        self.k0
    }

    /// K1 = h [HCO3-]/\[CO2*\], first dissociation constant of carbonic acid.
    ///
    /// ```
    /// use travertine::{Conditions, Water};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// assert!((-k.k1().log10() - 5.8472).abs() < 5e-5); // Lueker 2000, Guide check value
    /// # Ok::<(), travertine::Error>(())
    /// ```
    #[inline]
    pub fn k1(&self) -> f64 {
        self.k1
    }

    /// K2 = h [CO3--]/[HCO3-], second dissociation constant of carbonic acid.
    #[inline]
    pub fn k2(&self) -> f64 {
        self.k2
    }

    /// KB = h [B(OH)4-]/[B(OH)3], boric acid (0 without boron).
    ///
    /// ```
    /// use travertine::{Conditions, Water};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// assert!((k.kb().ln() - -19.7964).abs() < 5e-5); // Dickson 1990, Guide check value
    /// # Ok::<(), travertine::Error>(())
    /// ```
    #[inline]
    pub fn kb(&self) -> f64 {
        self.kb
    }

    /// KW = h [OH-], the ion product of water.
    #[inline]
    pub fn kw(&self) -> f64 {
        self.kw
    }

    /// KP1 of phosphoric acid (0 without phosphate).
    #[inline]
    pub fn kp1(&self) -> f64 {
        self.kp1
    }

    /// KP2 of phosphoric acid (0 without phosphate).
    #[inline]
    pub fn kp2(&self) -> f64 {
        self.kp2
    }

    /// KP3 of phosphoric acid (0 without phosphate).
    #[inline]
    pub fn kp3(&self) -> f64 {
        self.kp3
    }

    /// KSi of silicic acid (0 without silicate).
    #[inline]
    pub fn ksi(&self) -> f64 {
        self.ksi
    }

    /// KNH4 of ammonium (0 without ammonia).
    #[inline]
    pub fn knh4(&self) -> f64 {
        self.knh4
    }

    /// KH2S of hydrogen sulfide (0 without sulfide).
    #[inline]
    pub fn kh2s(&self) -> f64 {
        self.kh2s
    }

    /// KS = [H+]F [SO4--]/[HSO4-], bisulfate on the free scale.
    #[inline]
    pub fn ks_free(&self) -> f64 {
        self.ks_free
    }

    /// KF = [H+]F [F-]/\[HF\], hydrogen fluoride on the free scale.
    #[inline]
    pub fn kf_free(&self) -> f64 {
        self.kf_free
    }

    /// K1 for the carbon balances. With calcium ion pairs (fresh water)
    /// DIC and alkalinity count CaHCO3+ with HCO3- and CaCO3⁰ with CO3--,
    /// which is the same as using K1e = K1 (1 + p1) and
    /// K2e = K2 (1 + p2)/(1 + p1), where p1 = [CaHCO3+]/[HCO3-] and
    /// p2 = \[CaCO3⁰\]/[CO3--] ([`Constants::pair_hco3`],
    /// [`Constants::pair_co3`]). Without pairs (saline water, or no
    /// calcium) K1e = K1 and K2e = K2.
    ///
    /// ```
    /// use travertine::{Conditions, Water, units::Amount, sample::Composition};
    /// let well = Water::fresh(Conditions::new(15.0, 0.3)?)?
    ///     .with_composition(Composition::default().with_calcium(Amount::PerKg(2e-3))?);
    /// let k = well.constants()?;
    /// assert!((k.k1e() / (k.k1() * (1.0 + k.pair_hco3())) - 1.0).abs() < 1e-15);
    /// assert!(k.pair_hco3() > 0.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    #[inline]
    pub fn k1e(&self) -> f64 {
        self.k1e
    }

    /// K2 for the carbon balances, K2e = K2 (1 + p2)/(1 + p1); see
    /// [`Constants::k1e()`].
    #[inline]
    pub fn k2e(&self) -> f64 {
        self.k2e
    }

    /// p1 = [CaHCO3+]/[HCO3-] = K(CaHCO3+) [Ca++] (0 in saline water, where
    /// the pairs are in the constants).
    #[inline]
    pub fn pair_hco3(&self) -> f64 {
        self.pair_hco3
    }

    /// p2 = \[CaCO3⁰\]/[CO3--] = K(CaCO3⁰) [Ca++] (0 in saline water).
    #[inline]
    pub fn pair_co3(&self) -> f64 {
        self.pair_co3
    }

    /// Free calcium used for the pairs and Ω, mol/kg (total calcium in
    /// saline water).
    #[inline]
    pub fn calcium_free_mol_kg(&self) -> f64 {
        self.calcium_free_mol_kg
    }

    /// Ionic strength, mol/kg (sea water: 19.924 S/(1000 − 1.005 S)).
    #[inline]
    pub fn ionic_strength(&self) -> f64 {
        self.ionic_strength
    }

    /// Calcite solubility product [Ca++]\[CO3--\] at saturation, (mol/kg)²,
    /// with the pressure correction (apparent, with the activity
    /// coefficients, in fresh water; 0 in fresh water without calcium).
    ///
    /// ```
    /// use travertine::{Conditions, Water};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// assert!((k.ksp_calcite().log10() - -6.3693).abs() < 5e-4); // computed from the Mucci (1983) fit
    /// # Ok::<(), travertine::Error>(())
    /// ```
    #[inline]
    pub fn ksp_calcite(&self) -> f64 {
        self.ksp_calcite
    }

    /// Aragonite solubility product, (mol/kg)²; as [`Constants::ksp_calcite`].
    #[inline]
    pub fn ksp_aragonite(&self) -> f64 {
        self.ksp_aragonite
    }

    /// The totals used (boron, sulfate, fluoride, calcium, nutrients, ...).
    ///
    /// ```
    /// use travertine::{Conditions, Water};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// // Lee et al. (2010): 432.6 µmol/kg at S 35, from memory (unverified).
    /// assert!((k.totals().boron_mol_kg * 1e6 - 432.6).abs() < 0.5);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    #[inline]
    pub fn totals(&self) -> &Totals {
        &self.totals
    }

    /// [H+] on the free scale per unit of working-scale h: 1/(1 + ST/KS)
    /// in saline water, 1/γH in fresh water.
    #[inline]
    pub fn free_per_working(&self) -> f64 {
        self.free_per_working
    }

    /// [H+] on the sea-water scale per unit of working-scale h:
    /// (1 + ST/KS + FT/KF)/(1 + ST/KS) in saline water.
    #[inline]
    pub fn seawater_per_working(&self) -> f64 {
        self.seawater_per_working
    }

    /// [H+] on the total scale per unit of working-scale h (1 in saline
    /// water, whose working scale it is).
    #[inline]
    pub fn total_per_working(&self) -> f64 {
        self.total_per_working
    }

    /// H+ activity (NBS) per unit of working-scale h: fH times the
    /// sea-water factor in saline water (Takahashi et al. 1982), 1 in fresh
    /// water.
    #[inline]
    pub fn nbs_per_working(&self) -> f64 {
        self.nbs_per_working
    }

    /// fCO2/pCO2 (Weiss 1974).
    #[inline]
    pub fn fugacity_factor(&self) -> f64 {
        self.fugacity_factor
    }

    /// Water vapour pressure, atm (Weiss & Price 1980).
    #[inline]
    pub fn vapour_pressure_atm(&self) -> f64 {
        self.vapour_pressure_atm
    }

    /// Solution density at the surface, kg/m³.
    #[inline]
    pub fn density_kg_m3(&self) -> f64 {
        self.density_kg_m3
    }

    /// The fits behind these numbers.
    ///
    /// ```
    /// use travertine::{Conditions, Water};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// assert_eq!(k.fits_used().carbonic, "lueker2000");
    /// # Ok::<(), travertine::Error>(())
    /// ```
    #[inline]
    pub fn fits_used(&self) -> &FitsUsed {
        &self.fits_used
    }

    /// Every fit used outside its published range, and other cautions.
    #[inline]
    pub fn warnings(&self) -> &[Warning] {
        &self.warnings
    }

    /// Activity coefficients (fresh water only).
    #[inline]
    pub fn gammas(&self) -> Option<Gammas> {
        self.gammas
    }

    /// K(CaHCO3+) = [CaHCO3+]/([Ca++]\[HCO3-\]), concentration basis (fresh
    /// water; 0 in saline water).
    #[inline]
    pub fn k_cahco3(&self) -> f64 {
        self.k_cahco3
    }

    /// K(CaCO3⁰) = \[CaCO3⁰\]/([Ca++]\[CO3--\]), concentration basis (fresh
    /// water; 0 in saline water).
    #[inline]
    pub fn k_caco3(&self) -> f64 {
        self.k_caco3
    }

    /// H on the working scale from a pH on `scale`.
    ///
    /// ```
    /// use travertine::{Conditions, PhScale, Water};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// let h = k.h_from_ph(8.0, PhScale::Total);
    /// assert!((h - 1e-8).abs() < 1e-20);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn h_from_ph(&self, ph: f64, scale: PhScale) -> f64 {
        crate::base::numeric::pow10(-ph) / self.per_working(scale)
    }

    /// pH on `scale` from H on the working scale.
    ///
    /// ```
    /// use travertine::{Conditions, PhScale, Water};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// let sws = k.ph_from_h(1e-8, PhScale::Seawater);
    /// // About 0.010 below the total scale (computed from Dickson 1990 KS and the Riley 1965 fluoride); 0.013 with
    /// // the default Perez & Fraga KF taken on the total scale.
    /// assert!(8.0 - sws > 0.008 && 8.0 - sws < 0.014);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn ph_from_h(&self, h: f64, scale: PhScale) -> f64 {
        -crate::base::numeric::log10(h * self.per_working(scale))
    }

    /// The logarithms a state needs: stored, or evaluated now.
    pub(crate) fn log10s(&self) -> Log10s {
        self.logs.unwrap_or_else(|| {
            let log10 = crate::base::numeric::log10;
            Log10s {
                per_working: [
                    log10(self.total_per_working),
                    log10(self.seawater_per_working),
                    log10(self.free_per_working),
                    log10(self.nbs_per_working),
                ],
                ksp_calcite: log10(self.ksp_calcite),
                ksp_aragonite: log10(self.ksp_aragonite),
            }
        })
    }

    fn per_working(&self, scale: PhScale) -> f64 {
        match scale {
            PhScale::Total => self.total_per_working,
            PhScale::Seawater => self.seawater_per_working,
            PhScale::Free => self.free_per_working,
            PhScale::Nbs => self.nbs_per_working,
        }
    }

    /// Evaluates every constant for saline water.
    ///
    /// # Errors
    /// [`crate::Error::Computation`] if the density cannot be computed.
    ///
    /// ```
    /// use travertine::{Conditions, medium::Constants, fits::Fits, sample::Composition};
    /// let c = Conditions::new(25.0, 35.0)?;
    /// let k = Constants::saline(&c, &Composition::default(), &Fits::default())?;
    /// assert!(k.warnings().is_empty());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn saline(conditions: &Conditions, composition: &Composition, fits: &Fits) -> Result<Self> {
        let t_c = conditions.temperature_c();
        let t = conditions.temperature_k();
        let s = conditions.salinity();
        let p_bar = conditions.pressure_bar();
        let mut warnings = Vec::new();

        let density = density_kg_m3(s, t_c)?;
        let totals = composition.saline_totals(s, density, fits.boron_total);

        // Free-scale KS and KF at the surface.
        if totals.sulfate_mol_kg > 0.0 {
            sulfate::DICKSON1990_KS_RANGE.check_for("KS", t_c, s, &mut warnings);
        }
        let ks0 = sulfate::dickson1990_ln_ks(t, s).exp();
        if totals.fluoride_mol_kg > 0.0 {
            fits.fluoride.range().check_for("KF", t_c, s, &mut warnings);
        }
        let kf_native = fits.fluoride.kf(t, s);
        let kf0 = match fits.fluoride.scale() {
            PhScale::Total => kf_native / (1.0 + totals.sulfate_mol_kg / ks0),
            _ => kf_native,
        };
        let tot0 = 1.0 + totals.sulfate_mol_kg / ks0;
        let sws0 = tot0 + totals.fluoride_mol_kg / kf0;
        // K on the sea-water scale = K on the native scale * [H]SWS/[H]native.
        let total_to_sws0 = sws0 / tot0;
        let to_sws0 = |scale: PhScale| match scale {
            PhScale::Total => total_to_sws0,
            PhScale::Free => sws0,
            _ => 1.0,
        };

        let carbonic = fits.carbonic_at(t_c, s);
        carbonic
            .range()
            .check_for("K1 and K2", t_c, s, &mut warnings);
        let (k1n, k2n) = carbonic.k1_k2(t, s);
        let mut k1 = k1n * to_sws0(carbonic.scale());
        let mut k2 = k2n * to_sws0(carbonic.scale());

        if totals.boron_mol_kg > 0.0 {
            boron::DICKSON1990_KB_RANGE.check_for("KB", t_c, s, &mut warnings);
        }
        let mut kb = boron::dickson1990_ln_kb(t, s).exp() * total_to_sws0;
        kw::MILLERO1995_KW_RANGE.check_for("KW", t_c, s, &mut warnings);
        let mut kw = kw::millero1995_ln_kw(t, s).exp() * total_to_sws0;

        let (mut kp1, mut kp2, mut kp3, mut ksi) = (0.0, 0.0, 0.0, 0.0);
        if totals.phosphate_mol_kg > 0.0 || totals.silicate_mol_kg > 0.0 {
            nutrients::MILLERO1995_NUTRIENT_RANGE.check_for("KP and KSi", t_c, s, &mut warnings);
        }
        if totals.phosphate_mol_kg > 0.0 {
            let (a, b, c) = nutrients::millero1995_ln_kp(t, s);
            kp1 = a.exp() * total_to_sws0;
            kp2 = b.exp() * total_to_sws0;
            kp3 = c.exp() * total_to_sws0;
        }
        if totals.silicate_mol_kg > 0.0 {
            ksi = nutrients::millero1995_ln_ksi(t, s).exp() * total_to_sws0;
        }
        let mut knh4 = 0.0;
        if totals.ammonia_mol_kg > 0.0 {
            ammonia::JOHANSSON_WEDBORG1980_RANGE.check_for("KNH4", t_c, s, &mut warnings);
            knh4 = crate::base::numeric::pow10(-ammonia::johansson_wedborg1980_pka(t, s));
        }
        let mut kh2s = 0.0;
        if totals.sulfide_mol_kg > 0.0 {
            sulfide::MILLERO1988_RANGE.check_for("KH2S", t_c, s, &mut warnings);
            kh2s = crate::base::numeric::pow10(-sulfide::millero1988_pk1(t, s)) * total_to_sws0;
        }

        minerals::MUCCI1983_RANGE.check_for("calcite and aragonite", t_c, s, &mut warnings);
        let (mut lc, mut la) = minerals::mucci1983_log_ksp(t, s);

        let (mut ks, mut kf) = (ks0, kf0);
        if p_bar > 0.0 {
            use pressure::*;
            let f = |c: &PressureCoefficients| pressure_factor(c, t_c, p_bar);
            ks *= f(&KS);
            kf *= f(&KF);
            k1 *= f(&K1);
            k2 *= f(&K2);
            kb *= f(&KB);
            kw *= f(&KW);
            kp1 *= f(&KP1);
            kp2 *= f(&KP2);
            kp3 *= f(&KP3);
            ksi *= f(&KSI);
            knh4 *= f(&KNH4);
            kh2s *= f(&KH2S);
            lc += pressure_ln_factor(&CALCITE, t_c, p_bar) * std::f64::consts::LOG10_E;
            la += pressure_ln_factor(&ARAGONITE, t_c, p_bar) * std::f64::consts::LOG10_E;
        }
        let ksp_calcite = crate::base::numeric::pow10(lc);
        let ksp_aragonite = crate::base::numeric::pow10(la);

        // Sea-water scale to the working (total) scale at pressure.
        let scale_link = ScaleLink::Total {
            fh: takahashi1982_fh(t, s),
        };
        let factors = scale_factors(
            scale_link,
            totals.sulfate_mol_kg,
            totals.fluoride_mol_kg,
            ks,
            kf,
        );
        let sws_to_total = factors.total_per_seawater;
        for k in [
            &mut k1, &mut k2, &mut kb, &mut kw, &mut kp1, &mut kp2, &mut kp3, &mut ksi, &mut knh4,
            &mut kh2s,
        ] {
            *k *= sws_to_total;
        }

        gas::WEISS1974_RANGE.check_for("K0", t_c, s, &mut warnings);
        let k0 = gas::weiss1974_ln_k0(t, s).exp();
        let fugacity_factor = gas::weiss1974_fugacity_factor(t, conditions.air_pressure_atm());
        let vapour_pressure_atm = gas::weiss_price1980_vapour_pressure_atm(t, s);

        let logs = Log10s {
            per_working: factors.logs.unwrap_or_default(),
            ksp_calcite: lc,
            ksp_aragonite: la,
        };

        Ok(Constants {
            conditions: *conditions,
            working_scale: PhScale::Total,
            k0,
            k1,
            k2,
            k1e: k1,
            k2e: k2,
            pair_hco3: 0.0,
            pair_co3: 0.0,
            calcium_free_mol_kg: totals.calcium_mol_kg,
            ionic_strength: sulfate::seawater_ionic_strength(s),
            kb,
            kw,
            kp1,
            kp2,
            kp3,
            ksi,
            knh4,
            kh2s,
            ks_free: ks,
            kf_free: kf,
            ksp_calcite,
            ksp_aragonite,
            totals,
            free_per_working: factors.free_per_working,
            seawater_per_working: factors.seawater_per_working,
            total_per_working: factors.total_per_working,
            nbs_per_working: factors.nbs_per_working,
            fugacity_factor,
            vapour_pressure_atm,
            density_kg_m3: density,
            fits_used: FitsUsed {
                k0: FitName::Weiss1974,
                fugacity: FitName::Weiss1974,
                vapour_pressure: FitName::WeissPrice1980,
                carbonic: carbonic.into(),
                boric: FitName::Dickson1990,
                boron_total: measured_or(composition.boron_given(), fits.boron_total.into()),
                water: FitName::Millero1995,
                bisulfate: fits.bisulfate.into(),
                sulfate_total: measured_or(composition.sulfate_given(), FitName::MorrisRiley1966),
                fluoride: fits.fluoride.into(),
                fluoride_total: measured_or(composition.fluoride_given(), FitName::Riley1965),
                phosphate_silicate: FitName::Millero1995,
                ammonium: FitName::JohanssonWedborg1980,
                sulfide: FitName::Millero1988,
                minerals: FitName::Mucci1983,
                calcium: measured_or(composition.calcium_given(), FitName::RileyTongudai1967),
                pressure: FitName::Millero1995,
                nbs_scale: FitName::Takahashi1982,
                density: FitName::MilleroPoisson1981,
            },
            warnings,
            gammas: None,
            k_cahco3: 0.0,
            k_caco3: 0.0,
            logs: Some(logs),
        })
    }
}

/// `measured` where the total was given, else the fit that supplies it.
fn measured_or(given: bool, fit: FitName) -> FitName {
    if given {
        FitName::Measured
    } else {
        fit
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The logarithms stored with saline constants are those of the values
    /// stored beside them, at the surface and under pressure.
    #[test]
    fn stored_logarithms_match_the_values() {
        for (t, s, p) in [(25.0, 35.0, 0.0), (2.0, 5.0, 0.0), (10.0, 38.0, 4000.0)] {
            let c = Conditions::new(t, s).and_then(|c| c.with_pressure_dbar(p));
            let k =
                Constants::saline(&c.unwrap(), &Composition::default(), &Fits::default()).unwrap();
            let stored = k.log10s();
            let evaluated = Constants { logs: None, ..k }.log10s();
            for (a, b) in stored.per_working.iter().zip(evaluated.per_working) {
                assert!((a - b).abs() < 1e-13, "{a} against {b}");
            }
            assert!((stored.ksp_calcite - evaluated.ksp_calcite).abs() < 1e-12);
            assert!((stored.ksp_aragonite - evaluated.ksp_aragonite).abs() < 1e-12);
        }
    }

    fn sea_water(p_dbar: f64) -> Constants {
        let c = Conditions::new(25.0, 35.0).and_then(|c| c.with_pressure_dbar(p_dbar));
        Constants::saline(&c.unwrap(), &Composition::default(), &Fits::default()).unwrap()
    }

    /// A perturbed Ksp, KS or KF keeps the stored logarithms those of the
    /// values stored beside them, at the surface and under pressure.
    #[test]
    fn perturbed_constants_keep_their_logarithms_in_step() {
        for p in [0.0, 3000.0] {
            for which in [
                ConstantName::KspCalcite,
                ConstantName::KspAragonite,
                ConstantName::Ks,
                ConstantName::Kf,
            ] {
                let k = sea_water(p).with_pk(which, 0.07).unwrap();
                let stored = k.log10s();
                let evaluated = Constants { logs: None, ..k }.log10s();
                for (a, b) in stored.per_working.iter().zip(evaluated.per_working) {
                    assert!((a - b).abs() < 1e-13, "{which:?}: {a} against {b}");
                }
                assert!((stored.ksp_calcite - evaluated.ksp_calcite).abs() < 1e-12);
                assert!((stored.ksp_aragonite - evaluated.ksp_aragonite).abs() < 1e-12);
            }
        }
    }

    /// Perturbing KS twice by opposite amounts gives the scale factors
    /// back: they are derived from KS, not carried along.
    #[test]
    fn scale_factors_follow_ks_both_ways() {
        let k = sea_water(1000.0);
        let there_and_back = k
            .clone()
            .with_pk(ConstantName::Ks, 0.3)
            .and_then(|k| k.with_pk(ConstantName::Ks, -0.3))
            .unwrap();
        for (a, b) in [
            (k.free_per_working, there_and_back.free_per_working),
            (k.seawater_per_working, there_and_back.seawater_per_working),
            (k.nbs_per_working, there_and_back.nbs_per_working),
        ] {
            assert!((a / b - 1.0).abs() < 1e-14, "{a} against {b}");
        }
        // The moved KS moves the free scale as 1/(1 + ST/KS).
        let moved = k.clone().with_pk(ConstantName::Ks, 0.3).unwrap();
        let expected = 1.0 / (1.0 + k.totals.sulfate_mol_kg / (k.ks_free * 10f64.powf(-0.3)));
        assert!((moved.free_per_working / expected - 1.0).abs() < 1e-14);
        assert_eq!(moved.total_per_working, 1.0);
    }

    /// Every constant can be perturbed, and only the one named (and what
    /// follows from it) moves.
    #[test]
    fn each_name_moves_its_own_constant() {
        use crate::base::units::Amount;
        let every_total = Composition::default()
            .with_phosphate(Amount::PerKg(2e-6))
            .and_then(|c| c.with_silicate(Amount::PerKg(50e-6)))
            .and_then(|c| c.with_ammonia(Amount::PerKg(1e-6)))
            .and_then(|c| c.with_sulfide(Amount::PerKg(1e-6)))
            .unwrap();
        let c = Conditions::new(25.0, 35.0).unwrap();
        let k = Constants::saline(&c, &every_total, &Fits::default()).unwrap();
        let value = |k: &Constants, which: ConstantName| match which {
            ConstantName::K0 => k.k0,
            ConstantName::K1 => k.k1,
            ConstantName::K2 => k.k2,
            ConstantName::Kb => k.kb,
            ConstantName::Kw => k.kw,
            ConstantName::KspCalcite => k.ksp_calcite,
            ConstantName::KspAragonite => k.ksp_aragonite,
            ConstantName::Ks => k.ks_free,
            ConstantName::Kf => k.kf_free,
            ConstantName::Kp1 => k.kp1,
            ConstantName::Kp2 => k.kp2,
            ConstantName::Kp3 => k.kp3,
            ConstantName::Ksi => k.ksi,
            ConstantName::Knh4 => k.knh4,
            ConstantName::Kh2s => k.kh2s,
            ConstantName::BoronTotal => k.totals.boron_mol_kg,
        };
        for which in ConstantName::ALL {
            assert!(value(&k, which) > 0.0, "{which:?} not evaluated");
            let p = k.clone().with_scaled(which, 1.25).unwrap();
            for other in ConstantName::ALL {
                let (a, b) = (value(&k, other), value(&p, other));
                if other == which {
                    assert!((b - 1.25 * a).abs() <= 1e-15 * b.abs(), "{which:?}");
                } else {
                    assert_eq!(a, b, "{which:?} moved {other:?}");
                }
            }
        }
    }

    /// A perturbation that cannot give finite, positive constants is
    /// refused, never a panic.
    #[test]
    fn impossible_perturbations_are_refused() {
        let k = sea_water(0.0);
        let refused = |which, factor: f64| k.clone().with_scaled(which, factor).is_err();
        assert!(refused(ConstantName::K1, f64::NAN));
        assert!(refused(ConstantName::K1, f64::INFINITY));
        assert!(refused(ConstantName::K1, 0.0));
        assert!(refused(ConstantName::K1, -1.0));
        // A product beyond the largest number, one below the smallest.
        let twice = k
            .clone()
            .with_scaled(ConstantName::K0, 1e300)
            .and_then(|k| k.with_scaled(ConstantName::K0, 1e300));
        assert!(matches!(twice, Err(Error::NotFinite { field: "K0", .. })));
        assert!(refused(ConstantName::K1, 1e-320));
        // A KF so small that FT/KF overflows the sea-water scale factor.
        assert!(refused(ConstantName::Kf, 1e-310));
        assert!(k.clone().with_pk(ConstantName::K1, f64::NAN).is_err());
        assert!(k.clone().with_pk(ConstantName::K1, -400.0).is_err());
        assert!(k.clone().with_pk(ConstantName::K1, 400.0).is_err());
        // Errors name the constant.
        match k.clone().with_scaled(ConstantName::Kf, 1e-310) {
            Err(Error::Computation { field, .. }) => assert_eq!(field, "KF"),
            other => panic!("{other:?}"),
        }
    }
}
