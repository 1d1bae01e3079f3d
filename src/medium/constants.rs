//! One set of constants for one set of conditions: the [`Constants`] value
//! the solver reads, and its evaluation for saline water.
//!
//! [`Constants::saline`] evaluates every constant once, converts it to the
//! working pH scale (the total scale), applies the Millero (1995) pressure
//! corrections and records a warning for every fit used outside its
//! published range. The fresh medium ([`super::fresh`]) makes the same value
//! from thermodynamic constants and activity coefficients.

use crate::base::numeric::Real;
use crate::base::warning::Warning;
use crate::fits::FitsUsed;
use crate::properties::activity::Gammas;
use crate::properties::scales::PhScale;
use crate::sample::{Conditions, Totals};
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
pub struct Constants<R: Real = f64> {
    /// The conditions evaluated.
    pub(in crate::medium) conditions: Conditions,
    /// The working pH scale of every acid constant.
    pub(in crate::medium) working_scale: PhScale,
    /// The temperature (°C), practical salinity and gauge pressure (dbar)
    /// of `conditions`, as numbers of this type (on a [`Tangent`](crate::base::numeric::Tangent),
    /// with their derivatives).
    #[serde(skip)]
    pub(in crate::medium) at: [R; 3],
    /// CO2 solubility, mol kg⁻¹ atm⁻¹.
    pub(in crate::medium) k0: R,
    /// First dissociation constant of carbonic acid.
    pub(in crate::medium) k1: R,
    /// Second dissociation constant of carbonic acid.
    pub(in crate::medium) k2: R,
    /// Boric acid.
    pub(in crate::medium) kb: R,
    /// Ion product of water.
    pub(in crate::medium) kw: R,
    /// Phosphoric acid, first.
    pub(in crate::medium) kp1: R,
    /// Phosphoric acid, second.
    pub(in crate::medium) kp2: R,
    /// Phosphoric acid, third.
    pub(in crate::medium) kp3: R,
    /// Silicic acid.
    pub(in crate::medium) ksi: R,
    /// Ammonium.
    pub(in crate::medium) knh4: R,
    /// Hydrogen sulfide.
    pub(in crate::medium) kh2s: R,
    /// Bisulfate, free scale.
    pub(in crate::medium) ks_free: R,
    /// Hydrogen fluoride, free scale.
    pub(in crate::medium) kf_free: R,
    /// K1 and K2 for the carbon balances: with calcium ion pairs (fresh
    /// water) DIC and alkalinity count CaHCO3+ with HCO3- and CaCO3⁰ with
    /// CO3--, which is the same as using K1e = K1 (1 + p1) and
    /// K2e = K2 (1 + p2)/(1 + p1), where p1 = [CaHCO3+]/[HCO3-] and
    /// p2 = \[CaCO3⁰\]/[CO3--]. Without pairs K1e = K1, K2e = K2.
    pub(in crate::medium) k1e: R,
    /// See `k1e`.
    pub(in crate::medium) k2e: R,
    /// [CaHCO3+]/[HCO3-] (0 in saline water, where pairs are in the constants).
    pub(in crate::medium) pair_hco3: R,
    /// \[CaCO3⁰\]/[CO3--] (0 in saline water).
    pub(in crate::medium) pair_co3: R,
    /// Free calcium used for the pairs and Ω, mol/kg (total calcium in saline water).
    pub(in crate::medium) calcium_free_mol_kg: R,
    /// Ionic strength, mol/kg (sea water: 19.924 S/(1000 − 1.005 S)).
    pub(in crate::medium) ionic_strength: R,
    /// Calcite solubility product, (mol/kg)².
    pub(in crate::medium) ksp_calcite: R,
    /// Aragonite solubility product, (mol/kg)².
    pub(in crate::medium) ksp_aragonite: R,
    /// The totals used.
    pub(in crate::medium) totals: Totals<R>,
    /// [H+] on the free scale per unit of working-scale h.
    pub(in crate::medium) free_per_working: R,
    /// [H+] on the sea-water scale per unit of working-scale h.
    pub(in crate::medium) seawater_per_working: R,
    /// [H+] on the total scale per unit of working-scale h.
    pub(in crate::medium) total_per_working: R,
    /// H+ activity (NBS) per unit of working-scale h.
    pub(in crate::medium) nbs_per_working: R,
    /// fCO2 / pCO2.
    pub(in crate::medium) fugacity_factor: R,
    /// Water vapour pressure, atm.
    pub(in crate::medium) vapour_pressure_atm: R,
    /// Solution density at the surface, kg/m³.
    pub(in crate::medium) density_kg_m3: R,
    /// The fits behind these numbers.
    pub(in crate::medium) fits_used: FitsUsed,
    /// Every fit used outside its published range, and other cautions.
    pub(in crate::medium) warnings: Vec<Warning>,
    /// Activity coefficients (fresh water only).
    pub(in crate::medium) gammas: Option<Gammas<R>>,
    /// [CaHCO3+]/([Ca++]\[HCO3-\]), concentration basis (fresh water; 0 in saline).
    pub(in crate::medium) k_cahco3: R,
    /// \[CaCO3⁰\]/([Ca++]\[CO3--\]), concentration basis (fresh water; 0 in saline).
    pub(in crate::medium) k_caco3: R,
    /// The logarithms a state needs, where evaluated with the constants.
    #[serde(skip)]
    pub(in crate::medium) logs: Option<Log10s<R>>,
}

/// How H+ activity (the NBS scale) ties to the concentration scales, the
/// one input of the pH-scale factors besides KS, KF and the totals.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(in crate::medium) enum ScaleLink<R: Real = f64> {
    /// Saline water: the working scale is the total scale, and the H+
    /// activity per unit of sea-water-scale [H+] is fH (Takahashi et al. 1982).
    Total {
        /// fH.
        fh: R,
    },
    /// Fresh water: the working scale is the NBS scale (h is the H+
    /// activity), and free [H+] = h/γH.
    Nbs {
        /// γH, the activity coefficient of H+.
        gamma_h: R,
    },
}

/// [H+] on each scale per unit of working-scale h, and what the saline
/// constants store of them.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(in crate::medium) struct ScaleFactors<R: Real = f64> {
    pub(in crate::medium) free_per_working: R,
    pub(in crate::medium) seawater_per_working: R,
    pub(in crate::medium) total_per_working: R,
    pub(in crate::medium) nbs_per_working: R,
    /// [H+] on the total scale per unit of [H+] on the sea-water scale:
    /// the factor that takes a constant from the sea-water scale to the
    /// total scale.
    pub(in crate::medium) total_per_seawater: R,
    /// log10 of the four factors (total, sea-water, free, NBS), on the
    /// total working scale only, where the constants store them.
    pub(in crate::medium) logs: Option<[R; 4]>,
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
pub(in crate::medium) fn scale_factors<R: Real>(
    link: ScaleLink<R>,
    sulfate_mol_kg: R,
    fluoride_mol_kg: R,
    ks_free: R,
    kf_free: R,
) -> ScaleFactors<R> {
    match link {
        ScaleLink::Total { fh } => {
            let tot = (sulfate_mol_kg / ks_free) + 1.0;
            let sws = tot + fluoride_mol_kg / kf_free;
            let seawater_per_working = sws / tot;
            let nbs_per_working = fh * seawater_per_working;
            ScaleFactors {
                free_per_working: tot.under(1.0),
                seawater_per_working,
                total_per_working: R::constant(1.0),
                nbs_per_working,
                total_per_seawater: tot / sws,
                logs: Some([
                    R::constant(0.0),
                    seawater_per_working.log10_via_ln(),
                    -tot.log10_via_ln(),
                    nbs_per_working.log10_via_ln(),
                ]),
            }
        }
        ScaleLink::Nbs { gamma_h } => {
            // [HSO4-]/[SO4--] and [HF]/[F-] per unit free [H+] (0 without
            // them, whose constants may not be evaluated).
            let per = |total: R, k: R| {
                if total.value() > 0.0 {
                    total / k
                } else {
                    R::constant(0.0)
                }
            };
            let sulfate = per(sulfate_mol_kg, ks_free);
            let fluoride = per(fluoride_mol_kg, kf_free);
            ScaleFactors {
                free_per_working: gamma_h.under(1.0),
                // Defined as in sea water, from the free [H+] and the sulfate and
                // fluoride given (equal to the free scale when there are none).
                seawater_per_working: ((sulfate + 1.0) + fluoride) / gamma_h,
                total_per_working: (sulfate + 1.0) / gamma_h,
                nbs_per_working: R::constant(1.0),
                total_per_seawater: (sulfate + 1.0) / ((sulfate + 1.0) + fluoride),
                logs: None,
            }
        }
    }
}

/// log10 of the pH-scale factors and of the solubility products. Saline
/// constants evaluate them once (the Mucci 1983 fits give log10 Ksp
/// directly), so that a state needs one logarithm for its four pH values
/// and one for both saturation indices; fresh-water constants, evaluated on
/// every trial of their inner iterations, leave them to the state.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Log10s<R: Real = f64> {
    /// log10 of [H+] on the total, sea-water, free and NBS scales per unit
    /// of working-scale h, in that order.
    pub per_working: [R; 4],
    /// log10 Ksp of calcite and of aragonite (with the pressure correction).
    pub ksp_calcite: R,
    pub ksp_aragonite: R,
}

/// `t` with every number mapped by `f` (to another type).
pub(crate) fn map_totals<R: Real, S: Real>(t: &Totals<R>, f: impl Fn(R) -> S) -> Totals<S> {
    Totals {
        boron_mol_kg: f(t.boron_mol_kg),
        sulfate_mol_kg: f(t.sulfate_mol_kg),
        fluoride_mol_kg: f(t.fluoride_mol_kg),
        phosphate_mol_kg: f(t.phosphate_mol_kg),
        silicate_mol_kg: f(t.silicate_mol_kg),
        ammonia_mol_kg: f(t.ammonia_mol_kg),
        sulfide_mol_kg: f(t.sulfide_mol_kg),
        calcium_mol_kg: f(t.calcium_mol_kg),
        magnesium_mol_kg: f(t.magnesium_mol_kg),
        sodium_mol_kg: f(t.sodium_mol_kg),
        potassium_mol_kg: f(t.potassium_mol_kg),
        chloride_mol_kg: f(t.chloride_mol_kg),
        hardness_mol_kg: f(t.hardness_mol_kg),
    }
}

impl Constants {
    /// These constants as numbers of another type, each a constant (no
    /// derivatives), without the warnings: the start of a pass on
    /// [`Tangent`](crate::base::numeric::Tangent)s where the sources are
    /// seeded afterwards.
    pub(crate) fn lift<S: Real>(&self) -> Constants<S> {
        self.map_numbers(S::constant)
    }
}

impl<const N: usize> Constants<crate::base::numeric::Tangent<N>> {
    /// The values of these constants on tangents, their warnings kept: on a
    /// tangent every value is that of the same evaluation on `f64`, so the
    /// numbers are those [`Constants::saline`] gives for the same water.
    pub(crate) fn values(&self) -> Constants {
        let mut k = self.map_numbers(|x| x.v);
        k.warnings.clone_from(&self.warnings);
        k
    }
}

impl<R: Real> Constants<R> {
    /// These constants with every number mapped by `f` (to another type),
    /// without the warnings: for example constants on a two-slot tangent
    /// (temperature and salinity) spread onto the slots of a wider one.
    pub(crate) fn map_numbers<S: Real>(&self, f: impl Fn(R) -> S) -> Constants<S> {
        let c = &f;
        Constants {
            conditions: self.conditions,
            working_scale: self.working_scale,
            at: self.at.map(c),
            k0: c(self.k0),
            k1: c(self.k1),
            k2: c(self.k2),
            kb: c(self.kb),
            kw: c(self.kw),
            kp1: c(self.kp1),
            kp2: c(self.kp2),
            kp3: c(self.kp3),
            ksi: c(self.ksi),
            knh4: c(self.knh4),
            kh2s: c(self.kh2s),
            ks_free: c(self.ks_free),
            kf_free: c(self.kf_free),
            k1e: c(self.k1e),
            k2e: c(self.k2e),
            pair_hco3: c(self.pair_hco3),
            pair_co3: c(self.pair_co3),
            calcium_free_mol_kg: c(self.calcium_free_mol_kg),
            ionic_strength: c(self.ionic_strength),
            ksp_calcite: c(self.ksp_calcite),
            ksp_aragonite: c(self.ksp_aragonite),
            totals: map_totals(&self.totals, c),
            free_per_working: c(self.free_per_working),
            seawater_per_working: c(self.seawater_per_working),
            total_per_working: c(self.total_per_working),
            nbs_per_working: c(self.nbs_per_working),
            fugacity_factor: c(self.fugacity_factor),
            vapour_pressure_atm: c(self.vapour_pressure_atm),
            density_kg_m3: c(self.density_kg_m3),
            fits_used: self.fits_used,
            warnings: Vec::new(),
            gammas: self.gammas.map(|g| Gammas {
                hydrogen: c(g.hydrogen),
                monovalent: c(g.monovalent),
                carbonate: c(g.carbonate),
                calcium: c(g.calcium),
                trivalent: c(g.trivalent),
            }),
            k_cahco3: c(self.k_cahco3),
            k_caco3: c(self.k_caco3),
            logs: self.logs.map(|l| Log10s {
                per_working: l.per_working.map(c),
                ksp_calcite: c(l.ksp_calcite),
                ksp_aragonite: c(l.ksp_aragonite),
            }),
        }
    }
}

/// What follows from the free calcium in fresh water: the pair ratios
/// [CaHCO3+]/[HCO3-] and [CaCO3⁰]/[CO3--], and the pair-inclusive K1e,
/// K2e ([`Constants::set_free_calcium`]).
#[derive(Debug, Clone, Copy)]
pub(crate) struct Paired<R: Real> {
    pub pair_hco3: R,
    pub pair_co3: R,
    pub k1e: R,
    pub k2e: R,
}

impl<R: Real> Paired<R> {
    /// From K1, K2, the two pair constants and the free calcium (mol/kg).
    #[inline]
    pub(crate) fn of(k1: R, k2: R, k_cahco3: R, k_caco3: R, ca_free: R) -> Self {
        let pair_hco3 = k_cahco3 * ca_free;
        let pair_co3 = k_caco3 * ca_free;
        Paired {
            pair_hco3,
            pair_co3,
            k1e: k1 * (pair_hco3 + 1.0),
            k2e: k2 * (pair_co3 + 1.0) / (pair_hco3 + 1.0),
        }
    }
}

impl<R: Real> Constants<R> {
    /// Sets the free calcium of fresh-water constants and what follows from
    /// it: the pair ratios and the pair-inclusive K1e, K2e (see
    /// [`Constants::k1e()`]). The one place these are computed, so that
    /// constants made again from (I, Ca) are exactly those solved with.
    pub(crate) fn set_free_calcium(&mut self, ca_free: R) {
        let p = Paired::of(self.k1, self.k2, self.k_cahco3, self.k_caco3, ca_free);
        self.pair_hco3 = p.pair_hco3;
        self.pair_co3 = p.pair_co3;
        self.k1e = p.k1e;
        self.k2e = p.k2e;
        self.calcium_free_mol_kg = ca_free;
    }

    /// The conditions evaluated.
    #[inline]
    pub fn conditions(&self) -> &Conditions {
        &self.conditions
    }

    /// The temperature (°C) evaluated, as a number of this type: on a
    /// [`Tangent`](crate::base::numeric::Tangent), with its derivatives.
    ///
    /// ```
    /// use travertine::{Conditions, Water};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// assert_eq!(k.temperature_c(), 25.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    #[inline]
    pub fn temperature_c(&self) -> R {
        self.at[0]
    }

    /// The practical salinity evaluated, as [`Constants::temperature_c`].
    #[inline]
    pub fn salinity(&self) -> R {
        self.at[1]
    }

    /// The gauge pressure evaluated, dbar, as [`Constants::temperature_c`].
    #[inline]
    pub fn pressure_dbar(&self) -> R {
        self.at[2]
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
    pub fn k0(&self) -> R {
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
    pub fn k1(&self) -> R {
        self.k1
    }

    /// K2 = h [CO3--]/[HCO3-], second dissociation constant of carbonic acid.
    #[inline]
    pub fn k2(&self) -> R {
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
    pub fn kb(&self) -> R {
        self.kb
    }

    /// KW = h [OH-], the ion product of water.
    #[inline]
    pub fn kw(&self) -> R {
        self.kw
    }

    /// KP1 of phosphoric acid (0 without phosphate).
    #[inline]
    pub fn kp1(&self) -> R {
        self.kp1
    }

    /// KP2 of phosphoric acid (0 without phosphate).
    #[inline]
    pub fn kp2(&self) -> R {
        self.kp2
    }

    /// KP3 of phosphoric acid (0 without phosphate).
    #[inline]
    pub fn kp3(&self) -> R {
        self.kp3
    }

    /// KSi of silicic acid (0 without silicate).
    #[inline]
    pub fn ksi(&self) -> R {
        self.ksi
    }

    /// KNH4 of ammonium (0 without ammonia).
    #[inline]
    pub fn knh4(&self) -> R {
        self.knh4
    }

    /// KH2S of hydrogen sulfide (0 without sulfide).
    #[inline]
    pub fn kh2s(&self) -> R {
        self.kh2s
    }

    /// KS = [H+]F [SO4--]/[HSO4-], bisulfate on the free scale.
    #[inline]
    pub fn ks_free(&self) -> R {
        self.ks_free
    }

    /// KF = [H+]F [F-]/\[HF\], hydrogen fluoride on the free scale.
    #[inline]
    pub fn kf_free(&self) -> R {
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
    pub fn k1e(&self) -> R {
        self.k1e
    }

    /// K2 for the carbon balances, K2e = K2 (1 + p2)/(1 + p1); see
    /// [`Constants::k1e()`].
    #[inline]
    pub fn k2e(&self) -> R {
        self.k2e
    }

    /// p1 = [CaHCO3+]/[HCO3-] = K(CaHCO3+) [Ca++] (0 in saline water, where
    /// the pairs are in the constants).
    #[inline]
    pub fn pair_hco3(&self) -> R {
        self.pair_hco3
    }

    /// p2 = \[CaCO3⁰\]/[CO3--] = K(CaCO3⁰) [Ca++] (0 in saline water).
    #[inline]
    pub fn pair_co3(&self) -> R {
        self.pair_co3
    }

    /// Free calcium used for the pairs and Ω, mol/kg (total calcium in
    /// saline water).
    #[inline]
    pub fn calcium_free_mol_kg(&self) -> R {
        self.calcium_free_mol_kg
    }

    /// Ionic strength, mol/kg (sea water: 19.924 S/(1000 − 1.005 S)).
    #[inline]
    pub fn ionic_strength(&self) -> R {
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
    pub fn ksp_calcite(&self) -> R {
        self.ksp_calcite
    }

    /// Aragonite solubility product, (mol/kg)²; as [`Constants::ksp_calcite`].
    #[inline]
    pub fn ksp_aragonite(&self) -> R {
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
    pub fn totals(&self) -> &Totals<R> {
        &self.totals
    }

    /// [H+] on the free scale per unit of working-scale h: 1/(1 + ST/KS)
    /// in saline water, 1/γH in fresh water.
    #[inline]
    pub fn free_per_working(&self) -> R {
        self.free_per_working
    }

    /// [H+] on the sea-water scale per unit of working-scale h:
    /// (1 + ST/KS + FT/KF)/(1 + ST/KS) in saline water.
    #[inline]
    pub fn seawater_per_working(&self) -> R {
        self.seawater_per_working
    }

    /// [H+] on the total scale per unit of working-scale h (1 in saline
    /// water, whose working scale it is).
    #[inline]
    pub fn total_per_working(&self) -> R {
        self.total_per_working
    }

    /// H+ activity (NBS) per unit of working-scale h: fH times the
    /// sea-water factor in saline water (Takahashi et al. 1982), 1 in fresh
    /// water.
    #[inline]
    pub fn nbs_per_working(&self) -> R {
        self.nbs_per_working
    }

    /// fCO2/pCO2 (Weiss 1974).
    #[inline]
    pub fn fugacity_factor(&self) -> R {
        self.fugacity_factor
    }

    /// Water vapour pressure, atm (Weiss & Price 1980).
    #[inline]
    pub fn vapour_pressure_atm(&self) -> R {
        self.vapour_pressure_atm
    }

    /// Solution density at the surface, kg/m³.
    #[inline]
    pub fn density_kg_m3(&self) -> R {
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
    pub fn gammas(&self) -> Option<Gammas<R>> {
        self.gammas
    }

    /// K(CaHCO3+) = [CaHCO3+]/([Ca++]\[HCO3-\]), concentration basis (fresh
    /// water; 0 in saline water).
    #[inline]
    pub fn k_cahco3(&self) -> R {
        self.k_cahco3
    }

    /// K(CaCO3⁰) = \[CaCO3⁰\]/([Ca++]\[CO3--\]), concentration basis (fresh
    /// water; 0 in saline water).
    #[inline]
    pub fn k_caco3(&self) -> R {
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
    pub fn h_from_ph(&self, ph: R, scale: PhScale) -> R {
        (-ph).pow10() / self.per_working(scale)
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
    pub fn ph_from_h(&self, h: R, scale: PhScale) -> R {
        -(h * self.per_working(scale)).log10_via_ln()
    }

    /// The logarithms a state needs: stored, or evaluated now.
    pub(crate) fn log10s(&self) -> Log10s<R> {
        self.logs.unwrap_or_else(|| {
            let log10 = |x: R| x.log10_via_ln();
            // Without sulfate and fluoride the total, sea-water and free
            // scales are one, and the NBS scale is the working scale of
            // fresh water: one logarithm where the values (and their
            // derivatives) are equal.
            let free = log10(self.free_per_working);
            let like_free = |v: R| {
                if v == self.free_per_working {
                    free
                } else if v == R::constant(1.0) {
                    R::constant(0.0)
                } else {
                    log10(v)
                }
            };
            Log10s {
                per_working: [
                    like_free(self.total_per_working),
                    like_free(self.seawater_per_working),
                    free,
                    like_free(self.nbs_per_working),
                ],
                ksp_calcite: log10(self.ksp_calcite),
                ksp_aragonite: log10(self.ksp_aragonite),
            }
        })
    }

    fn per_working(&self, scale: PhScale) -> R {
        match scale {
            PhScale::Total => self.total_per_working,
            PhScale::Seawater => self.seawater_per_working,
            PhScale::Free => self.free_per_working,
            PhScale::Nbs => self.nbs_per_working,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::fits::Fits;
    use crate::sample::Composition;

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
}
