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

use crate::activity::{ActivityModel, Gammas};
use crate::conditions::Conditions;
use crate::conductivity::{langelier1936_ionic_strength, russell1976_ionic_strength};
use crate::constants::fresh as pb;
use crate::constants::{nutrients, sulfate, sulfide, Constants, FitName, FitsUsed, Totals};
use crate::density::density_kg_m3;
use crate::error::{Error, Result};
use crate::measured::{Measured, Parameter};
use crate::scales::PhScale;
use crate::solve::{solve, RootChoice, Solution, SolveOptions};
use crate::state::{FreshExtras, State};
use crate::units::CACO3_G_MOL;
use crate::warning::{Warning, Warnings};
use crate::water::Water;
use serde::Serialize;

/// Where the ionic strength of a fresh water came from.
///
/// ```
/// use travertine::fresh::IonicStrengthRoute;
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
    /// # use travertine::fresh::IonicStrengthRoute;
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
/// and a few products.
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct FreshBasis {
    conditions: Conditions,
    model: ActivityModel,
    /// Debye–Hückel A and B at this temperature.
    dh_a: f64,
    dh_b: f64,
    kh: f64,
    k1: f64,
    k2: f64,
    kw: f64,
    kb: f64,
    kp: (f64, f64, f64),
    ksi: f64,
    ks: f64,
    kf: f64,
    knh4: f64,
    kh2s: f64,
    ksp_calcite: f64,
    ksp_aragonite: f64,
    k_cahco3: f64,
    k_caco3: f64,
    fugacity_factor: f64,
    vapour_pressure_atm: f64,
    density: f64,
    totals: Totals,
    fits_used: FitsUsed,
    route: IonicStrengthRoute,
    /// The ionic strength where it does not depend on the speciation.
    fixed_i: Option<f64>,
    /// The first ionic strength of a fixed point where it comes from the ions.
    i_start: f64,
    warnings: Vec<Warning>,
}

/// A settled solve: the ionic strength and free calcium it was solved at
/// (its constants are [`FreshBasis::constants_of`] them), and its solution.
#[derive(Debug, Clone, PartialEq)]
struct Settled {
    i: f64,
    ca: f64,
    ca_total: f64,
    /// The ionic strength of the ions at the solution (`i` where the ionic
    /// strength does not come from the ions).
    ions: f64,
    sol: Solution,
}

/// Iteration cap of a fixed point; reaching it is reported as non-convergence.
const MAX_OUTER: u32 = 200;
/// Relative change of I and Ca below which a fixed point has converged.
const OUTER_TOLERANCE: f64 = 1e-12;

impl FreshBasis {
    /// The basis of `water`, a fresh water. With `every_constant` false,
    /// the constants of acid systems whose total is zero, and the calcium
    /// constants without calcium, are not evaluated and hold 0 (as in
    /// saline water); a solve never reads them.
    pub(crate) fn new(water: &Water, every_constant: bool) -> Result<Self> {
        let c = water.conditions();
        let t_c = c.temperature_c();
        let t = c.temperature_k();
        let mut warnings = Vec::new();
        let density = density_kg_m3(c.salinity(), t_c)?;
        let rho_w = density_kg_m3(0.0, t_c)? / 1000.0;
        let totals = water.composition().fresh_totals(density);
        pb::PLUMMER_BUSENBERG1982_RANGE.check_for(
            "K0, K1, K2, calcite and aragonite",
            t_c,
            0.0,
            &mut warnings,
        );
        pb::HARNED_OWEN_RANGE.check_for("KW", t_c, 0.0, &mut warnings);
        if totals.calcium_mol_kg > 0.0 {
            pb::CAHCO3_RANGE.check_for("CaHCO3+ pair", t_c, 0.0, &mut warnings);
            pb::CACO3_RANGE.check_for("CaCO3 pair", t_c, 0.0, &mut warnings);
        }
        if totals.ammonia_mol_kg > 0.0 {
            pb::EMERSON1975_RANGE.check_for("KNH4", t_c, 0.0, &mut warnings);
        }
        let p10 = crate::numeric::pow10;
        // A constant whose total is zero is not evaluated (it stays 0, as in
        // saline water): each costs an exponential per prepared water.
        let given = |total: f64, k: &dyn Fn() -> f64| {
            if every_constant || total > 0.0 {
                k()
            } else {
                0.0
            }
        };
        let kp = if every_constant || totals.phosphate_mol_kg > 0.0 {
            let (lp1, lp2, lp3) = nutrients::millero1995_ln_kp(t, 0.0);
            (lp1.exp(), lp2.exp(), lp3.exp())
        } else {
            (0.0, 0.0, 0.0)
        };
        let calcium = totals.calcium_mol_kg;
        let model = water.fresh_options().activity;
        let route = route(water);
        let mut b = FreshBasis {
            conditions: *c,
            model,
            dh_a: crate::activity::debye_huckel_a(t_c, rho_w),
            dh_b: crate::activity::debye_huckel_b(t_c, rho_w),
            kh: p10(pb::log_kh(t)),
            k1: p10(pb::log_k1(t)),
            k2: p10(pb::log_k2(t)),
            kw: p10(pb::log_kw(t)),
            // Pure-water limits (S = 0) of the sea-water fits.
            kb: given(totals.boron_mol_kg, &|| {
                crate::constants::boron::dickson1990_ln_kb(t, 0.0).exp()
            }),
            kp,
            ksi: given(totals.silicate_mol_kg, &|| {
                nutrients::millero1995_ln_ksi(t, 0.0).exp()
            }),
            ks: given(totals.sulfate_mol_kg, &|| {
                sulfate::dickson1990_ln_ks(t, 0.0).exp()
            }),
            kf: given(totals.fluoride_mol_kg, &|| (1590.2 / t - 12.641).exp()),
            knh4: given(totals.ammonia_mol_kg, &|| p10(-pb::emerson1975_pka(t))),
            kh2s: given(totals.sulfide_mol_kg, &|| {
                p10(-sulfide::millero1988_pk1(t, 0.0))
            }),
            ksp_calcite: given(calcium, &|| p10(pb::log_ksp_calcite(t))),
            ksp_aragonite: given(calcium, &|| p10(pb::log_ksp_aragonite(t))),
            k_cahco3: given(calcium, &|| p10(pb::log_k_cahco3(t))),
            k_caco3: given(calcium, &|| p10(pb::log_k_caco3(t))),
            fugacity_factor: crate::constants::gas::weiss1974_fugacity_factor(
                t,
                c.air_pressure_atm(),
            ),
            vapour_pressure_atm: crate::constants::gas::weiss_price1980_vapour_pressure_atm(t, 0.0),
            density,
            totals,
            fits_used: fresh_fits_used(&totals, model),
            route,
            fixed_i: fixed_ionic_strength(water, route),
            i_start: 0.0,
            warnings,
        };
        let p_bar = c.pressure_bar();
        if p_bar > 0.0 {
            use crate::constants::pressure::*;
            let f = |k: &PressureCoefficients| pressure_factor(k, t_c, p_bar);
            b.k1 *= f(&K1);
            b.k2 *= f(&K2);
            b.kw *= f(&KW);
            b.kb *= f(&KB);
            b.kp = (b.kp.0 * f(&KP1), b.kp.1 * f(&KP2), b.kp.2 * f(&KP3));
            b.ksi *= f(&KSI);
            b.ks *= f(&KS);
            b.kf *= f(&KF);
            b.knh4 *= f(&KNH4);
            b.kh2s *= f(&KH2S);
            b.ksp_calcite *= f(&CALCITE);
            b.ksp_aragonite *= f(&ARAGONITE);
            b.warnings.push(Warning::Note {
                code: "fresh_pressure_sea_water_coefficients",
                text: "fresh water under pressure: the Millero (1995) corrections use sea-water \
                 coefficients",
            });
        }
        // Where the ions give the ionic strength, start from the ions given
        // (with all calcium free) and no carbon.
        if b.fixed_i.is_none() {
            let ca = b.totals.calcium_mol_kg;
            b.i_start = ion_sum(&b.constants_at(0.0, ca, ca), 1e-8, 0.0).0;
        }
        Ok(b)
    }

    /// Apparent constants at ionic strength `i`, free calcium `ca_free` and
    /// total calcium `ca_total` (mol/kg), without the range warnings.
    fn constants_at(&self, i: f64, ca_free: f64, ca_total: f64) -> Constants {
        let g = Gammas::from_coefficients(self.model, self.dh_a, self.dh_b, i);
        let (g1, g2, g3, gh, gca) = (
            g.monovalent,
            g.carbonate,
            g.trivalent,
            g.hydrogen,
            g.calcium,
        );
        let k1 = self.k1 / g1;
        let k2 = self.k2 * g1 / g2;
        let k_cahco3 = self.k_cahco3 * gca;
        let k_caco3 = self.k_caco3 * gca * g2;
        let mut t = self.totals;
        t.calcium_mol_kg = ca_total;
        let on = |total: f64, k: f64| if total > 0.0 { k } else { 0.0 };
        // Concentration constants on free [H+]: [H][SO4]/[HSO4] = KS γ1/(γH γ2),
        // [H][F]/[HF] = KF/(γH γ1).
        let ks_free = self.ks * g1 / (gh * g2);
        let kf_free = self.kf / (gh * g1);
        // [HSO4-]/[SO4--] and [HF]/[F-] per unit free [H+] (0 without them).
        let per = |total: f64, k: f64| if total > 0.0 { total / k } else { 0.0 };
        let sulfate = per(self.totals.sulfate_mol_kg, ks_free);
        let fluoride = per(self.totals.fluoride_mol_kg, kf_free);
        let mut k = Constants {
            conditions: self.conditions,
            working_scale: PhScale::Nbs,
            k0: self.kh,
            k1,
            k2,
            // Set with the free calcium below.
            k1e: k1,
            k2e: k2,
            pair_hco3: 0.0,
            pair_co3: 0.0,
            calcium_free_mol_kg: 0.0,
            ionic_strength: i,
            kb: on(t.boron_mol_kg, self.kb / g1),
            kw: self.kw / g1,
            kp1: on(t.phosphate_mol_kg, self.kp.0 / g1),
            kp2: on(t.phosphate_mol_kg, self.kp.1 * g1 / g2),
            kp3: on(t.phosphate_mol_kg, self.kp.2 * g2 / g3),
            ksi: on(t.silicate_mol_kg, self.ksi / g1),
            knh4: on(t.ammonia_mol_kg, self.knh4 * g1),
            kh2s: on(t.sulfide_mol_kg, self.kh2s / g1),
            ks_free,
            kf_free,
            ksp_calcite: self.ksp_calcite / (gca * g2),
            ksp_aragonite: self.ksp_aragonite / (gca * g2),
            totals: t,
            free_per_working: 1.0 / gh,
            // Defined as in sea water, from the free [H+] and the sulfate and
            // fluoride given (equal to the free scale when there are none).
            seawater_per_working: (1.0 + sulfate + fluoride) / gh,
            total_per_working: (1.0 + sulfate) / gh,
            nbs_per_working: 1.0,
            fugacity_factor: self.fugacity_factor,
            vapour_pressure_atm: self.vapour_pressure_atm,
            density_kg_m3: self.density,
            fits_used: self.fits_used,
            // Attached only to the constants a caller sees (not on every
            // trial of a fixed point, where it would allocate).
            warnings: Vec::new(),
            gammas: Some(g),
            k_cahco3,
            k_caco3,
            logs: None,
        };
        set_free_calcium(&mut k, ca_free);
        k
    }

    /// The constants at the first ionic strength of a solve, with all
    /// calcium free, and the range warnings: what [`Water::constants`]
    /// returns for a fresh water.
    pub(crate) fn starting_constants(&self) -> Constants {
        let ca = self.totals.calcium_mol_kg;
        let mut k = self.constants_at(self.fixed_i.unwrap_or(self.i_start), ca, ca);
        k.warnings = self.warnings.clone();
        k
    }

    /// The fixed point of a solve: the shared solver at the apparent
    /// constants of (I, Ca), until the free calcium and the ionic strength
    /// are those of its (h, DIC). `held_i` holds the ionic strength (the
    /// derived figures hold the sample's); `pair` gives the measured pair at
    /// the current constants (the saturation pH asks for the CO3 that
    /// saturates the current free calcium). Returns the constants of the
    /// last solve, with which its (h, DIC) are exactly consistent.
    ///
    /// Where the ions give the ionic strength, it is the outer unknown and
    /// the free calcium the inner one, each a one-dimensional fixed point
    /// ([`fixed_point`]). A solve that fails on the way (the pair fits no
    /// water at that ionic strength) steps back towards the last ionic
    /// strength that solved; before any has, ionic strengths ever further
    /// from the first (that of the ions given, without carbon) are tried on
    /// either side.
    fn settle<F>(
        &self,
        ca_total: f64,
        held_i: Option<f64>,
        start_calcium: Option<f64>,
        root: RootChoice,
        pair: F,
    ) -> Result<Settled>
    where
        F: Fn(&Constants) -> Result<(Measured, Measured)>,
    {
        let options = SolveOptions {
            // The other root of a two-root pair is settled on its own.
            report_other_root: root == RootChoice::Natural,
            ..SolveOptions::default().with_root(root)
        };
        let calcium = std::cell::Cell::new(start_calcium);
        let from_ions = held_i.is_none() && self.fixed_i.is_none();
        let at =
            |i: f64| self.settle_calcium(ca_total, i, calcium.get(), &options, &pair, from_ions);
        match held_i.or(self.fixed_i) {
            Some(i) => at(i),
            None => {
                let bracket = Bracket {
                    lo: Some(0.0),
                    hi: None,
                    failure: Failure::Unknown,
                    floor: 1e-12,
                };
                let mut last = None;
                fixed_point(self.i_start, bracket, |i| {
                    let settled = last.insert(at(i)?);
                    calcium.set(Some(settled.ca));
                    Ok((settled.ions, ()))
                })?;
                last.ok_or(Error::NoConvergence {
                    first: "ionic strength",
                    second: "free calcium",
                    iterations: 0,
                })
            }
        }
    }

    /// The inner fixed point at ionic strength `i`: the free calcium,
    /// starting from `start` (else from the free ions given, else all
    /// calcium free). With `ions`, also the ionic strength of the ions at
    /// the result.
    fn settle_calcium<F>(
        &self,
        ca_total: f64,
        i: f64,
        start: Option<f64>,
        options: &SolveOptions,
        pair: &F,
        ions: bool,
    ) -> Result<Settled>
    where
        F: Fn(&Constants) -> Result<(Measured, Measured)>,
    {
        // Only small values pass through the iteration: the constants, a
        // large value to copy, are made again from (I, Ca) where needed.
        // The constants at this ionic strength, made once; each trial sets
        // only the free calcium and what follows from it.
        let mut k = self.constants_at(i, ca_total, ca_total);
        let mut solve_at = |ca: f64| -> Result<(Settled, f64)> {
            set_free_calcium(&mut k, ca);
            let k = &k;
            let (a, b) = pair(k)?;
            let sol = solve(k, &a, &b, options)?;
            let f = if ca_total > 0.0 {
                free_calcium(k, sol.h, sol.dic, ca_total)
            } else {
                0.0
            };
            let ions = if ions {
                ion_sum(k, sol.h, sol.dic).0
            } else {
                i
            };
            let settled = Settled {
                i,
                ca,
                ca_total,
                ions,
                sol,
            };
            Ok((settled, f))
        };
        if ca_total <= 0.0 {
            return solve_at(0.0).map(|(s, _)| s);
        }
        let start = start.unwrap_or_else(|| {
            // A free ion given fixes its own pair: a first calcium much
            // nearer the settled one than all calcium free.
            let k = self.constants_at(i, ca_total, ca_total);
            pair(&k).map_or(ca_total, |(a, b)| {
                ca_total / (1.0 + free_ion_pairs(&k, &a) + free_ion_pairs(&k, &b))
            })
        });
        // g(Ca) = F(Ca) − Ca > 0 at Ca = 0 and ≤ 0 at CaT (pairs only take
        // calcium away). All calcium taken as free overstates the pairs of
        // the free ions given (HCO3-, CO3--) or of the carbon they bind,
        // and the pair may then fit no water: a failure is too much calcium.
        let bracket = Bracket {
            lo: Some(0.0),
            hi: Some(ca_total),
            failure: Failure::High,
            floor: 1e-30,
        };
        let mut last = None;
        fixed_point(start.clamp(0.0, ca_total), bracket, |ca| {
            let (settled, f) = solve_at(ca)?;
            last = Some(settled);
            Ok((f, ()))
        })?;
        last.ok_or(Error::NoConvergence {
            first: "free calcium",
            second: "ionic strength",
            iterations: 0,
        })
    }

    /// The constants of a settled solve, exactly those it was solved with.
    fn constants_of(&self, s: &Settled) -> Constants {
        self.constants_at(s.i, s.ca, s.ca_total)
    }

    /// The complete state of `water` (whose basis this is) from two
    /// measured parameters.
    pub(crate) fn solve(
        &self,
        water: &Water,
        a: Measured,
        b: Measured,
        options: &SolveOptions,
    ) -> Result<State> {
        let ca_total = self.totals.calcium_mol_kg;
        let given = |_: &Constants| Ok((a, b));
        let settled = if two_roots(&a, &b) {
            self.two_roots(&a, &b, options.root)?
        } else {
            self.settle(ca_total, None, None, options.root, given)?
        };
        let mut k = self.constants_of(&settled);
        let Solution {
            h,
            dic,
            mut warnings,
        } = settled.sol;
        k.warnings = self.warnings.clone();
        let imbalance = ion_sum(&k, h, dic).1;
        add_route_warnings(water, self.route, k.ionic_strength, &mut warnings);
        let extras = self.extras(&k, h, dic, imbalance, options, &mut warnings);
        State::build_fresh(water, &k, h, dic, warnings, extras, (&a, &b))
    }

    /// A pair that can fit two waters (alkalinity with CO3, DIC with HCO3).
    /// Each side is settled at its own ionic strength and calcium, and the
    /// shared root policy is applied to the settled roots: the one asked
    /// for, or by default the one nearer pH 8; the other, where it is a
    /// distinct, measurable water, is named in the warning.
    ///
    /// Near a double root the side of a root at fixed constants need not be
    /// its side once the ionic strength and calcium are settled, so a side
    /// can fail to settle. The default then takes the side that settles; a
    /// side asked for that does not settle, where the other does, is
    /// refused with the other root's pH.
    fn two_roots(&self, a: &Measured, b: &Measured, root: RootChoice) -> Result<Settled> {
        let ca_total = self.totals.calcium_mol_kg;
        let given = |_: &Constants| Ok((*a, *b));
        let side = |r| self.settle(ca_total, None, None, r, given);
        let ph = |s: &Settled| -crate::numeric::log10(s.sol.h);
        let (lower, higher) = (side(RootChoice::LowerPh), side(RootChoice::HigherPh));
        let higher_first = match root {
            RootChoice::LowerPh => false,
            RootChoice::HigherPh => true,
            _ => match (&lower, &higher) {
                (Ok(l), Ok(h)) => (ph(h) - 8.0).abs() < (ph(l) - 8.0).abs(),
                (Err(_), Ok(_)) => true,
                _ => false,
            },
        };
        let (chosen, other, other_side) = if higher_first {
            (higher, lower, RootChoice::LowerPh)
        } else {
            (lower, higher, RootChoice::HigherPh)
        };
        let mut found = match (chosen, &other) {
            (Ok(found), _) => found,
            (Err(e @ Error::NoConvergence { .. }), Ok(settled)) => {
                return Err(Error::NoWaterFits {
                    first: a.parameter().name(),
                    first_value: a.describe(),
                    second: b.parameter().name(),
                    second_value: b.describe(),
                    reason: format!(
                        "that root does not settle with its own ionic strength and calcium \
                         ({e}); the pair fits a water of pH {:.4} (nbs scale), and near it \
                         the two roots are one water within the precision of a measurement",
                        ph(settled)
                    ),
                })
            }
            (Err(e), _) => return Err(e),
        };
        let distinct = |o: &Settled| (o.sol.h / found.sol.h - 1.0).abs() > 1e-9;
        let measurable = |o: &Settled| {
            let parts = crate::alkalinity::parts(&self.constants_of(o), o.sol.h, o.sol.dic);
            crate::solve::alkalinity_in_range(parts.total())
        };
        let named = match &other {
            Ok(o) if distinct(o) && measurable(o) => Some(ph(o)),
            // The other side did not settle: it is reported as it is at
            // the constants of the chosen one.
            Err(Error::NoConvergence { .. }) => {
                let options = SolveOptions::default().with_root(other_side);
                solve(&self.constants_of(&found), a, b, &options)
                    .ok()
                    .filter(|o| (o.h / found.sol.h - 1.0).abs() > 1e-9)
                    .map(|o| -crate::numeric::log10(o.h))
            }
            _ => None,
        };
        let (first, second) = if a.parameter() < b.parameter() {
            (a, b)
        } else {
            (b, a)
        };
        let here = ph(&found);
        found
            .sol
            .warnings
            .replace_other_root(named.map(|p| Warning::OtherRoot {
                first: first.parameter().name(),
                second: second.parameter().name(),
                ph: p,
                scale: PhScale::Nbs.name(),
                higher: p > here,
            }));
        Ok(found)
    }

    fn extras(
        &self,
        k: &Constants,
        h: f64,
        dic: f64,
        imbalance: f64,
        options: &SolveOptions,
        warnings: &mut Warnings,
    ) -> FreshExtras {
        let mut e = FreshExtras {
            ionic_strength_from: self.route,
            charge_balance_percent: (self.route == IonicStrengthRoute::MajorIons)
                .then_some(100.0 * imbalance),
            saturation_ph_nbs: None,
            langelier_index: None,
            precipitation_potential_mg_l_caco3: None,
        };
        if self.totals.calcium_mol_kg <= 0.0 {
            return e;
        }
        let ta = crate::alkalinity::parts(k, h, dic).total();
        match self.saturation_ph(k, ta, -crate::numeric::log10(h)) {
            Some(phs) => {
                e.saturation_ph_nbs = Some(phs);
                e.langelier_index = Some(-crate::numeric::log10(h) - phs);
            }
            None => warnings.push(Warning::Note {
 code: "langelier_not_computed",
 text: "no pH between 4 and 13 saturates this water with calcite at its alkalinity and \
                 calcium: Langelier index not computed",
 }),
        }
        if options.precipitation_potential {
            match self.precipitation_potential(k, ta, dic) {
                Some(x) => {
                    e.precipitation_potential_mg_l_caco3 = Some(x * k.density_kg_m3 * CACO3_G_MOL)
                }
                None => warnings.push(Warning::Note {
                    code: "precipitation_potential_not_bracketed",
                    text: "the calcium carbonate precipitation potential could not be bracketed",
                }),
            }
        }
        e
    }

    /// pHs of the Langelier index: the NBS pH at which this water, with its
    /// alkalinity and total calcium (and the ionic strength of `k`, the
    /// sample's), is exactly saturated with calcite; the lowest such pH
    /// between 4 and 13, else `None`.
    ///
    /// At fixed alkalinity, ln Ω rises with pH to a maximum (where hydroxide
    /// starts to take the alkalinity from carbonate) and falls beyond, and
    /// each trial pH costs one quadratic ([`ln_omega_at_alkalinity`]). From
    /// the sample's pH a first step assumes the slope ln 10 of a
    /// bicarbonate water; steps of 0.5 pH then walk to a sign change on the
    /// rising side, and [`falsi`] refines it to 1e-12 pH. This is the
    /// same root as the alkalinity + CO3 pair at CO3 = Ksp'/Ca (its lower
    /// root), at a tenth of the cost.
    fn saturation_ph(&self, k: &Constants, ta: f64, ph: f64) -> Option<f64> {
        const LOWEST: f64 = 4.0;
        const HIGHEST: f64 = 13.0;
        const STEP: f64 = 0.5;
        let ca_total = self.totals.calcium_mol_kg;
        let f = |p: f64| ln_omega_at_alkalinity(k, ta, ca_total, crate::numeric::pow10(-p));
        let refine = |lo: f64, hi: f64| {
            falsi(|p| f(p).unwrap_or(f64::NAN), lo, hi).filter(|p| (LOWEST..=HIGHEST).contains(p))
        };
        let p0 = ph.clamp(LOWEST, HIGHEST);
        let f0 = f(p0)?;
        if f0 == 0.0 {
            return Some(p0);
        }
        // The first step, then steps of 0.5, towards saturation.
        let first = (p0 - f0 / std::f64::consts::LN_10).clamp(LOWEST, HIGHEST);
        let f1 = f(first);
        if let Some(f1) = f1 {
            if (f1 < 0.0) != (f0 < 0.0) {
                let (lo, hi) = if first < p0 { (first, p0) } else { (p0, first) };
                return refine(lo, hi);
            }
        }
        if f0 > 0.0 {
            // Supersaturated: walk down to an undersaturated pH.
            let mut hi = p0;
            while hi > LOWEST {
                let lo = (hi - STEP).max(LOWEST);
                match f(lo) {
                    Some(v) if v < 0.0 => return refine(lo, hi),
                    _ => hi = lo,
                }
            }
            return None;
        }
        // Undersaturated: walk up while ln Ω rises; past its maximum, the
        // rising side (and any root) lies below the sample's pH.
        let mut lo = p0;
        let mut f_lo = f0;
        while lo < HIGHEST {
            let hi = (lo + STEP).min(HIGHEST);
            match f(hi) {
                Some(v) if v >= 0.0 => return refine(lo, hi),
                Some(v) if v > f_lo => (lo, f_lo) = (hi, v),
                _ => break,
            }
        }
        // Past the maximum: walk down over it to a supersaturated pH, then
        // on to the undersaturated one below it.
        let mut hi = p0;
        let mut supersaturated = false;
        while hi > LOWEST {
            let lo = (hi - STEP).max(LOWEST);
            match f(lo) {
                Some(v) if v >= 0.0 => supersaturated = true,
                Some(_) if supersaturated => return refine(lo, hi),
                _ => {}
            }
            hi = lo;
        }
        None
    }

    /// Calcium carbonate precipitation potential (mol/kg): the calcite that
    /// would precipitate (positive) or dissolve (negative) in a closed
    /// system to reach saturation, removing x of calcium and DIC and 2x of
    /// alkalinity (Rossum & Merrill 1983; from memory, unverified). Each
    /// trial x is a full solve of (TA − 2x, DIC − x) with calcium Ca − x
    /// through the shared solver, the ionic strength held at the sample's;
    /// the root in x is Brent's, to 1e-12 relative.
    fn precipitation_potential(&self, k: &Constants, ta: f64, dic: f64) -> Option<f64> {
        let ca_t = self.totals.calcium_mol_kg;
        let held = Some(k.ionic_strength);
        let log_omega = |x: f64| -> f64 {
            let pair = (
                Measured::per_kg(Parameter::Alkalinity, ta - 2.0 * x),
                Measured::per_kg(Parameter::Dic, dic - x),
            );
            let (Ok(a), Ok(b)) = pair else {
                return f64::NAN;
            };
            match self.settle(ca_t - x, held, None, RootChoice::Natural, |_| Ok((a, b))) {
                Ok(settled) => {
                    let (kx, s) = (self.constants_of(&settled), settled.sol);
                    let co3 = free_carbonate(&kx, s.h, s.dic);
                    (kx.calcium_free_mol_kg * co3 / kx.ksp_calcite).ln()
                }
                Err(_) => f64::NAN,
            }
        };
        let f0 = log_omega(0.0);
        if !f0.is_finite() {
            return None;
        }
        if f0 == 0.0 {
            return Some(0.0);
        }
        // Supersaturated: the root lies between 0 and the most that can
        // precipitate; undersaturated: between 0 and 0.01 mol/kg dissolved.
        let (lo, hi) = if f0 > 0.0 {
            (0.0, ca_t.min(dic).min(ta / 2.0) * (1.0 - 1e-9))
        } else {
            (-0.01, 0.0)
        };
        let far = if f0 > 0.0 { hi } else { lo };
        let f_far = log_omega(far);
        if !f_far.is_finite() || f_far * f0 > 0.0 {
            return None;
        }
        let mut conv = crate::root::Relative {
            rel: 1e-12,
            y_tol: 1e-13,
            max_iter: 200,
        };
        roots::find_root_brent(lo, hi, log_omega, &mut conv).ok()
    }
}

/// What is known of where a fixed point x = F(x) lies, for
/// [`fixed_point`]: g(x) = F(x) − x is positive below it and negative
/// above it.
#[derive(Debug, Clone, Copy)]
struct Bracket {
    /// A value at or below the fixed point, if known.
    lo: Option<f64>,
    /// A value at or above it, if known.
    hi: Option<f64>,
    /// Where a value at which F cannot be evaluated lies.
    failure: Failure,
    /// Absolute floor of the relative tolerance.
    floor: f64,
}

/// Multiples of the start tried in turn when F cannot be evaluated at the
/// start, nor yet anywhere, and the side of the failure is unknown; then
/// the values of [`LADDER`].
const AROUND_START: [f64; 10] = [1.001, 0.999, 1.01, 0.99, 1.03, 0.97, 1.1, 0.9, 1.3, 0.75];
/// Values tried after [`AROUND_START`]: ionic strengths (mol/kg) over the
/// range of the activity models and beyond.
const LADDER: [f64; 10] = [1e-4, 3e-4, 1e-3, 3e-3, 0.01, 0.03, 0.1, 0.3, 1.0, 3.0];

/// Where a value at which a fixed point's F cannot be evaluated lies.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Failure {
    /// Above the fixed point.
    High,
    /// Either side: the iteration steps back halfway to the last value
    /// that could be evaluated (or, before any, tries values ever further
    /// from the start on either side).
    Unknown,
}

/// A one-dimensional fixed point x = F(x), where g(x) = F(x) − x falls
/// through zero once, by a safeguarded secant iteration: each step is the
/// secant step on g through the last two values where it falls inside the
/// bracket of values known to lie on either side, else the plain step F(x),
/// else a bisection of the bracket (or an expansion of it where it is open
/// above). The secant converges superlinearly where the plain iteration
/// x ← F(x) converges slowly or not at all (near a double root of a
/// two-root pair the root moves fast with the constants, and F is steep),
/// and the bracket makes convergence certain. `eval` returns F(x) and the
/// value to return if x is the fixed point, or an error where F cannot be
/// evaluated (the pair fits no water at x), which moves the bracket. Stops
/// when |F(x) − x| ≤ 1e-12 max(|x|, floor).
///
/// # Errors
/// Where no evaluation succeeded, the last evaluation error once the
/// bracket has shrunk to nothing; otherwise [`Error::NoConvergence`] (the
/// fixed point did not settle).
fn fixed_point<T>(
    start: f64,
    bracket: Bracket,
    mut eval: impl FnMut(f64) -> Result<(f64, T)>,
) -> Result<T> {
    let Bracket {
        mut lo,
        mut hi,
        failure,
        floor,
    } = bracket;
    let mut x = start;
    let mut previous: Option<(f64, f64)> = None;
    let mut last_error = None;
    let mut solved_once = false;
    let mut feasible = None;
    let mut tried = 0;
    let not_settled = || Error::NoConvergence {
        first: "ionic strength",
        second: "free calcium",
        iterations: MAX_OUTER,
    };
    for _ in 0..MAX_OUTER {
        let (f, value) = match eval(x) {
            Ok(v) => v,
            Err(e) => {
                previous = None;
                let next = match (failure, feasible) {
                    // Back halfway to the last value that solved.
                    (Failure::Unknown, Some(v)) => 0.5 * (x + v),
                    // Before any has solved: values ever further from the
                    // start on either side, then give up.
                    (Failure::Unknown, None) => {
                        let n = tried;
                        tried += 1;
                        if let Some(m) = AROUND_START.get(n) {
                            start.abs().max(floor) * m
                        } else if let Some(v) = LADDER.get(n - AROUND_START.len()) {
                            *v
                        } else {
                            return Err(e);
                        }
                    }
                    (Failure::High, _) => {
                        hi = Some(x);
                        lo.map_or(0.5 * x, |l| 0.5 * (l + x))
                    }
                };
                if (next - x).abs() <= OUTER_TOLERANCE * x.abs().max(floor) {
                    // Solved on one side, failing on the other: no fixed
                    // point between (it did not settle).
                    return Err(if solved_once { not_settled() } else { e });
                }
                x = next;
                last_error = Some(e);
                continue;
            }
        };
        solved_once = true;
        feasible = Some(x);
        let g = f - x;
        if g.abs() <= OUTER_TOLERANCE * x.abs().max(floor) {
            return Ok(value);
        }
        if g > 0.0 {
            lo = Some(x);
        } else {
            hi = Some(x);
        }
        let inside =
            |v: f64| v.is_finite() && lo.map_or(true, |l| v > l) && hi.map_or(true, |h| v < h);
        let secant = match previous {
            Some((x0, g0)) if g0 != g => x - g * (x - x0) / (g - g0),
            _ => f,
        };
        previous = Some((x, g));
        x = if inside(secant) {
            secant
        } else if inside(f) {
            f
        } else {
            match (lo, hi) {
                (Some(l), Some(h)) => 0.5 * (l + h),
                (Some(l), None) => 2.0 * l + 1e-4,
                (None, Some(h)) => 0.5 * h,
                (None, None) => f,
            }
        };
    }
    Err(match last_error {
        Some(e) if !solved_once => e,
        _ => not_settled(),
    })
}

/// Sets the free calcium of fresh-water constants and what follows from
/// it: the pair ratios and the pair-inclusive K1e, K2e (see
/// [`Constants::k1e`]). The one place these are computed, so that
/// constants made again from (I, Ca) are exactly those solved with.
fn set_free_calcium(k: &mut Constants, ca_free: f64) {
    let pair_hco3 = k.k_cahco3 * ca_free;
    let pair_co3 = k.k_caco3 * ca_free;
    k.pair_hco3 = pair_hco3;
    k.pair_co3 = pair_co3;
    k.k1e = k.k1 * (1.0 + pair_hco3);
    k.k2e = k.k2 * (1.0 + pair_co3) / (1.0 + pair_hco3);
    k.calcium_free_mol_kg = ca_free;
}

/// The root of f in [a, b], where f changes sign, by the Illinois
/// variant of regula falsi (Dowell & Jarratt 1971): a secant step inside
/// the bracket, with the value kept at an end that stays twice in a row
/// halved, so the bracket closes from both sides and convergence is
/// superlinear. Stops at a step below 1e-12 (absolute: the unknown is a pH)
/// or an exact zero; `None` without a sign change or on a NaN.
fn falsi(f: impl Fn(f64) -> f64, mut a: f64, mut b: f64) -> Option<f64> {
    let (mut fa, mut fb) = (f(a), f(b));
    if fa == 0.0 {
        return Some(a);
    }
    if fb == 0.0 {
        return Some(b);
    }
    if fa.is_nan() || fb.is_nan() || (fa < 0.0) == (fb < 0.0) {
        return None;
    }
    let mut kept = 0i8;
    let mut last = f64::NAN;
    for _ in 0..MAX_OUTER {
        let c = (a * fb - b * fa) / (fb - fa);
        let fc = f(c);
        if fc.is_nan() {
            return None;
        }
        if fc == 0.0 || (c - last).abs() <= 1e-12 {
            return Some(c);
        }
        last = c;
        if (fc < 0.0) == (fb < 0.0) {
            (b, fb) = (c, fc);
            if kept == -1 {
                fa *= 0.5;
            }
            kept = -1;
        } else {
            (a, fa) = (c, fc);
            if kept == 1 {
                fb *= 0.5;
            }
            kept = 1;
        }
    }
    None
}

/// Positive root of c w S² + (c + q − p w) S − p = 0 (with w = 0: S = p/c),
/// the balance (p − S c)(1 + S w) = S q.
fn balance_root(c: f64, w: f64, q: f64, p: f64) -> f64 {
    if w == 0.0 {
        return p / c;
    }
    let b = c + q - p * w;
    let disc = (b * b + 4.0 * c * w * p).sqrt();
    if b > 0.0 {
        2.0 * p / (b + disc)
    } else {
        (disc - b) / (2.0 * c * w)
    }
}

/// The free calcium that is exactly consistent with h and DIC at the
/// apparent constants of `k`: with CO2* = S, HCO3- = S u, CO3-- = S v,
/// u = K1'/h, v = K1'K2'/h², the pairs give DIC = S (1 + u + v) + Ca S w,
/// w = a u + b v, and Ca = CaT/(1 + S w); one quadratic in S.
fn free_calcium(k: &Constants, h: f64, dic: f64, ca_total: f64) -> f64 {
    let u = k.k1 / h;
    let v = k.k1 * k.k2 / (h * h);
    let w = k.k_cahco3 * u + k.k_caco3 * v;
    let s = balance_root(1.0 + u + v, w, ca_total * w, dic);
    ca_total / (1.0 + s * w)
}

/// Whether a pair can fit two waters (alkalinity with CO3, DIC with HCO3).
fn two_roots(a: &Measured, b: &Measured) -> bool {
    let mut p = [a.parameter(), b.parameter()];
    p.sort();
    matches!(
        p,
        [Parameter::Alkalinity, Parameter::Co3] | [Parameter::Dic, Parameter::Hco3]
    )
}

/// [CaHCO3+]/[Ca++] or [CaCO3⁰]/[Ca++] of a free ion given (0 for any
/// other parameter), at the apparent pair constants of `k`.
fn free_ion_pairs(k: &Constants, m: &Measured) -> f64 {
    let amount = |m: &Measured| match m.value() {
        crate::measured::Value::Amount(a) => a.mol_kg(k.density_kg_m3),
        _ => 0.0,
    };
    match m.parameter() {
        Parameter::Hco3 => k.k_cahco3 * amount(m),
        Parameter::Co3 => k.k_caco3 * amount(m),
        _ => 0.0,
    }
}

/// ln Ω of calcite at activity h (NBS) for alkalinity `ta` and total
/// calcium `ca_total` (mol/kg), at the apparent constants of `k` (its
/// ionic strength held), with the calcium pairs solved exactly: with
/// CO2* = S, HCO3- = S u, CO3-- = S v, u = K1'/h, v = K1'K2'/h², the
/// carbonate alkalinity TA − (non-carbonate) = S (u + 2v) + Ca S (a u + 2 b v)
/// and Ca = CaT/(1 + S (a u + b v)): one quadratic in S. `None` where the
/// alkalinity left for carbon is not positive.
fn ln_omega_at_alkalinity(k: &Constants, ta: f64, ca_total: f64, h: f64) -> Option<f64> {
    let carbon = ta - crate::alkalinity::non_carbonate(k, h).0;
    if carbon <= 0.0 {
        return None;
    }
    let u = k.k1 / h;
    let v = k.k1 * k.k2 / (h * h);
    let (a, b) = (k.k_cahco3, k.k_caco3);
    let w = a * u + b * v;
    let s = balance_root(u + 2.0 * v, w, ca_total * (a * u + 2.0 * b * v), carbon);
    let ca = ca_total / (1.0 + s * w);
    let ln = (ca * s * v / k.ksp_calcite).ln();
    ln.is_finite().then_some(ln)
}

/// Free CO3-- at h and DIC (the carbon-balance total less the CaCO3⁰ pair).
fn free_carbonate(k: &Constants, h: f64, dic: f64) -> f64 {
    let k12 = k.k1e * k.k2e;
    dic * k12 / (h * h + k.k1e * h + k12) / (1.0 + k.pair_co3)
}

fn fresh_fits_used(t: &Totals, activity: crate::activity::ActivityModel) -> FitsUsed {
    let pb = FitName::PlummerBusenberg1982;
    let given = |total: f64| {
        if total > 0.0 {
            FitName::Measured
        } else {
            FitName::NoneGiven
        }
    };
    FitsUsed {
        k0: pb,
        fugacity: FitName::Weiss1974,
        vapour_pressure: FitName::WeissPrice1980,
        carbonic: pb,
        boric: FitName::Dickson1990AtS0,
        boron_total: given(t.boron_mol_kg),
        water: FitName::HarnedOwen1958,
        bisulfate: FitName::Dickson1990AtS0,
        sulfate_total: given(t.sulfate_mol_kg),
        fluoride: FitName::DicksonRiley1979AtS0,
        fluoride_total: given(t.fluoride_mol_kg),
        phosphate_silicate: FitName::Millero1995AtS0,
        ammonium: FitName::Emerson1975,
        sulfide: FitName::Millero1988AtS0,
        minerals: pb,
        calcium: given(t.calcium_mol_kg),
        pressure: FitName::Millero1995,
        nbs_scale: activity.into(),
        density: FitName::MilleroPoisson1981,
    }
}

/// Which route gives the ionic strength, in the order of preference.
fn route(water: &Water) -> IonicStrengthRoute {
    let f = water.fresh_options();
    if water.composition().major_ions_given() {
        IonicStrengthRoute::MajorIons
    } else if f.specific_conductance_us_cm.is_some() {
        IonicStrengthRoute::SpecificConductance
    } else if f.tds_mg_l.is_some() {
        IonicStrengthRoute::Tds
    } else if f.ionic_strength.is_some() {
        IonicStrengthRoute::Given
    } else if water.conditions().salinity() > 0.0 {
        IonicStrengthRoute::Salinity
    } else {
        IonicStrengthRoute::AlkalinityOnly
    }
}

fn fixed_ionic_strength(water: &Water, route: IonicStrengthRoute) -> Option<f64> {
    let f = water.fresh_options();
    match route {
        IonicStrengthRoute::SpecificConductance => {
            f.specific_conductance_us_cm.map(russell1976_ionic_strength)
        }
        IonicStrengthRoute::Tds => f.tds_mg_l.map(langelier1936_ionic_strength),
        IonicStrengthRoute::Given => f.ionic_strength,
        IonicStrengthRoute::Salinity => Some(sulfate::seawater_ionic_strength(
            water.conditions().salinity(),
        )),
        _ => None,
    }
}

/// Ionic strength from every ion, with a monovalent ion added to carry any
/// charge imbalance; also returns the imbalance as a fraction of the total
/// charge (positive: excess cations).
fn ion_sum(k: &Constants, h: f64, dic: f64) -> (f64, f64) {
    let t = &k.totals;
    let d = h * h + k.k1e * h + k.k1e * k.k2e;
    let hco3_t = dic * k.k1e * h / d;
    let co3_t = dic * k.k1e * k.k2e / d;
    let hco3 = hco3_t / (1.0 + k.pair_hco3);
    let co3 = co3_t / (1.0 + k.pair_co3);
    let cahco3 = hco3_t - hco3;
    let ca = k.calcium_free_mol_kg;
    let hf = h * k.free_per_working;
    let oh = k.kw / h;
    let base = |total: f64, ka: f64| {
        if total > 0.0 {
            total * ka / (ka + h)
        } else {
            0.0
        }
    };
    let borate = base(t.boron_mol_kg, k.kb);
    let silicate = base(t.silicate_mol_kg, k.ksi);
    let hs = base(t.sulfide_mol_kg, k.kh2s);
    let nh4 = t.ammonia_mol_kg - base(t.ammonia_mol_kg, k.knh4);
    let so4 = t.sulfate_mol_kg * k.ks_free / (k.ks_free + hf);
    let hso4 = t.sulfate_mol_kg - so4;
    let fl = t.fluoride_mol_kg * k.kf_free / (k.kf_free + hf);
    let (mut h2po4, mut hpo4, mut po4) = (0.0, 0.0, 0.0);
    if t.phosphate_mol_kg > 0.0 {
        let (a, b, c) = (k.kp1, k.kp1 * k.kp2, k.kp1 * k.kp2 * k.kp3);
        let dp = h * h * h + a * h * h + b * h + c;
        h2po4 = t.phosphate_mol_kg * a * h * h / dp;
        hpo4 = t.phosphate_mol_kg * b * h / dp;
        po4 = t.phosphate_mol_kg * c / dp;
    }
    // Divalent cations whose split is unknown count like Mg.
    let divalent_cations = ca + t.magnesium_mol_kg + t.hardness_mol_kg;
    let mono_cations = hf + t.sodium_mol_kg + t.potassium_mol_kg + nh4 + cahco3;
    let mono_anions = oh + hco3 + t.chloride_mol_kg + borate + silicate + hs + hso4 + fl + h2po4;
    let divalent_anions = co3 + so4 + hpo4;
    let trivalent_anions = po4;
    let charge = mono_cations + 2.0 * divalent_cations
        - mono_anions
        - 2.0 * divalent_anions
        - 3.0 * trivalent_anions;
    let total_charge = mono_cations
        + 2.0 * divalent_cations
        + mono_anions
        + 2.0 * divalent_anions
        + 3.0 * trivalent_anions;
    let i = 0.5
        * (mono_cations
            + mono_anions
            + 4.0 * (divalent_cations + divalent_anions)
            + 9.0 * trivalent_anions
            + charge.abs());
    (
        i,
        if total_charge > 0.0 {
            charge / total_charge
        } else {
            0.0
        },
    )
}

fn add_route_warnings(water: &Water, r: IonicStrengthRoute, i: f64, w: &mut Warnings) {
    let f = water.fresh_options();
    let unused = [
        (
            f.specific_conductance_us_cm.is_some(),
            IonicStrengthRoute::SpecificConductance,
        ),
        (f.tds_mg_l.is_some(), IonicStrengthRoute::Tds),
        (f.ionic_strength.is_some(), IonicStrengthRoute::Given),
    ];
    for (given, other) in unused {
        if given && other != r {
            w.push(Warning::Text {
                code: "ionic_strength_input_unused",
                text: format!(
                    "ionic strength from {} was not used: {} comes first",
                    other.name(),
                    r.name()
                ),
            });
        }
    }
    if r == IonicStrengthRoute::AlkalinityOnly {
        w.push(Warning::Note {
            code: "ionic_strength_from_carbonate",
            text: "no major-ion analysis, conductance, TDS or ionic strength given: the ionic \
             strength is computed from the carbonate species, any calcium given and a \
             monovalent ion balancing the charge",
        });
    }
    let limit = match water.fresh_options().activity {
        crate::activity::ActivityModel::ExtendedDebyeHuckel => 0.1,
        _ => 0.5,
    };
    if i > limit {
        w.push(Warning::Text {
            code: "ionic_strength_above_model_range",
            text: format!(
                "ionic strength {i:.3} mol/kg is above {limit}, where the {} activity model holds",
                water.fresh_options().activity.name()
            ),
        });
    }
    if water.composition().calcium_given() {
        return;
    }
    if water.composition().fresh_totals(1000.0).hardness_mol_kg > 0.0 {
        w.push(Warning::Note {
            code: "hardness_not_calcium",
            text: "total hardness was given without a calcium fraction: it is not taken as \
             calcium (it counts in the ionic strength only); give calcium or a calcium fraction",
        });
    }
    w.push(Warning::Note {
        code: "calcium_not_given",
        text: "calcium not given: calcite and aragonite saturation and the Langelier index are \
         not computed",
    });
}
