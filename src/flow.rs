//! A water bound to its constants: the one entry to the shared solver for
//! both media.
//!
//! ```text
//! Water ──prepare──▶ PreparedWater ──solve(a, b)──▶ State
//!   saline: every constant evaluated once (Constants)
//!   fresh:  the temperature-only constants once; each solve runs the shared
//!           solver inside the ionic-strength and free-calcium fixed point
//! ```

use crate::base::error::Result;
use crate::base::numeric::{Real, Tangent};
use crate::base::warning::{Warning, Warnings};
use crate::fits::CarbonicFit;
use crate::medium::fresh::ionic::add_route_warnings;
use crate::medium::fresh::FreshBasis;
use crate::medium::{ConstantName, Constants};
use crate::properties::scales::PhScale;
use crate::sample::air::Air;
use crate::sample::inputs::Total;
use crate::sample::measured::{Measured, Parameter};
use crate::sample::trade::Sample;
use crate::sample::water::{Medium, Water};
use crate::sample::Conditions;
use crate::solve::{solve_near, Near, Solution, SolveOptions};
use crate::state::exchange::{medium_scale, Exchange};
use crate::state::State;
use std::sync::Arc;

/// Salinities where both media apply and a solve is checked against the
/// other medium (see DEVELOPERS.md, "Fresh and saline media in the overlap").
pub const MEDIA_OVERLAP_SALINITY: (f64, f64) = (0.5, 5.0);
/// Relative difference in pCO2 between the media above which a caution is
/// given (in the overlap).
pub const MEDIA_PCO2_CAUTION: f64 = 0.05;

/// How much the pressure correction of a fresh water may change pCO2 or
/// calcite Ω (relative to the same measurements solved at the surface)
/// before its caution is a warning rather than a note.
///
/// Fresh water under pressure is corrected with the Millero (1995)
/// coefficients fitted for sea water, the only ones the crate has (none
/// for dilute water could be verified). Their error in fresh water is some
/// part of the whole correction. A correction below 2 % is below what a pH
/// uncertainty of 0.01 (a good field meter; common practice) already makes
/// in pCO2 and Ω, ln(10) × 0.01 = 2.3 %, so even if it were wholly wrong it
/// would not change a conclusion: the size is reported in a note
/// (`fresh_pressure_effect_small`). Above it, the warning
/// `fresh_pressure_sea_water_coefficients` gives the size.
///
/// Where that falls, found with the crate by bisection on the depth (the
/// first check is in `tests/depth.rs`,
/// `the_pressure_caution_turns_into_a_warning_where_documented`): with pH
/// and alkalinity measured in situ, calcite Ω reaches 2 % first, at 171 m
/// (168 dbar) in the invented reservoir's bottom water (8.5 °C, pH 7.15,
/// alkalinity 2.00 meq/L), and between 145 m (1 °C, pH 6.8) and 223 m
/// (25 °C, pH 8.3) in three other invented waters. With alkalinity and DIC
/// held instead (a state recomputed at depth, [`State::at`]) Ω moves about
/// twice as fast, and 2 % comes at about 80 to 135 dbar.
///
/// ```
/// use travertine::{Conditions, Measured, Water, base::warning::Severity};
/// let solve = |dbar: f64| {
///     Water::fresh(Conditions::new(8.5, 0.12).unwrap().with_pressure_dbar(dbar).unwrap())
///         .unwrap()
///         .solve(Measured::ph(7.15, None).unwrap(), Measured::alkalinity_umol_kg(2000.0).unwrap())
///         .unwrap()
/// };
/// let caution = |dbar| {
///     let s = solve(dbar);
///     let w = s.warnings.iter().find(|w| w.code().starts_with("fresh_pressure")).unwrap();
///     (w.code(), w.severity())
/// };
/// assert_eq!(caution(50.0), ("fresh_pressure_effect_small", Severity::Note));
/// assert_eq!(caution(300.0), ("fresh_pressure_sea_water_coefficients", Severity::Warning));
/// assert_eq!(travertine::flow::FRESH_PRESSURE_CAUTION, 0.02);
/// ```
pub const FRESH_PRESSURE_CAUTION: f64 = 0.02;

/// A borrowed [`Prepared`], so that a one-off solve need not move its
/// constants (a large value) into one.
#[derive(Clone, Copy)]
enum Basis<'a> {
    Saline(&'a Constants),
    Fresh(&'a FreshBasis),
}

/// What a prepared water holds besides the water.
#[derive(Debug, Clone, PartialEq)]
enum Prepared {
    /// Every constant of a saline water.
    Saline(Constants),
    /// The speciation-independent part of a fresh water's constants.
    Fresh(FreshBasis),
}

impl Prepared {
    /// Borrowed, for a solve.
    fn basis(&self) -> Basis<'_> {
        match self {
            Prepared::Saline(k) => Basis::Saline(k),
            Prepared::Fresh(b) => Basis::Fresh(b),
        }
    }
}

/// A water with its constants evaluated, ready to solve any number of
/// measured pairs. It cannot be given another water's constants: it makes
/// its own. It is `Send + Sync`, so one prepared water can serve many
/// threads.
///
/// # Example
/// ```
/// use travertine::{Conditions, Measured, Water};
/// let pond = Water::fresh(Conditions::new(22.0, 0.2)?)?.prepare()?;
/// let ta = Measured::alkalinity_umol_kg(2400.0)?;
/// for ph in [7.2, 7.6, 8.0] {
///     let s = pond.solve(ta, Measured::ph(ph, None)?)?;
///     assert!((s.ph_nbs - ph).abs() < 1e-12);
/// }
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone)]
#[non_exhaustive]
pub struct PreparedWater {
    water: Water,
    prepared: Prepared,
    /// Sea water's constants on tangents of the temperature (slot 0) and
    /// salinity (slot 1), their values those of `prepared`, where they were
    /// made with them ([`Water::prepare_with_slopes`]): a pass on tangents
    /// of those sources then need not evaluate them again.
    slopes: Option<Arc<Constants<Tangent<2>>>>,
    /// The constants moved from those the water's fits give, in order,
    /// each by its shift of pK ([`PreparedWater::with_constants_perturbed`];
    /// none for a water as prepared): a water made again at other
    /// conditions moves them again, and a pass on tangents that evaluates
    /// them again from the water serves only where there are none.
    moves: Vec<(ConstantName, f64)>,
}

/// Two prepared waters are equal where their waters, constants and the
/// moves of their constants are (the constants on tangents kept beside
/// them are a cache of the same numbers).
impl PartialEq for PreparedWater {
    fn eq(&self, other: &Self) -> bool {
        self.water == other.water && self.prepared == other.prepared && self.moves == other.moves
    }
}

impl Water {
    /// This water bound to its constants, for repeated solves.
    ///
    /// # Errors
    /// [`crate::Error::Computation`] if the density cannot be computed.
    ///
    /// ```
    /// # use travertine::{Conditions, Water};
    /// let sea = Water::saline(Conditions::new(25.0, 35.0)?)?.prepare()?;
    /// assert_eq!(sea.water().conditions().salinity(), 35.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn prepare(&self) -> Result<PreparedWater> {
        Ok(PreparedWater {
            water: self.clone(),
            prepared: prepared(self)?,
            slopes: None,
            moves: Vec::new(),
        })
    }

    /// [`Water::prepare`], then the constants `moves` moved, each by its
    /// shift of pK, in order ([`PreparedWater::with_constants_perturbed`]):
    /// this water with the moves another prepared water records
    /// ([`PreparedWater::moves`]), for a water made again at other
    /// conditions or with other calcium.
    pub(crate) fn prepare_moved(&self, moves: &[(ConstantName, f64)]) -> Result<PreparedWater> {
        let mut prepared = self.prepare()?;
        for &(which, delta_pk) in moves {
            prepared = prepared.with_constants_perturbed(which, delta_pk)?;
        }
        Ok(prepared)
    }

    /// [`Water::prepare`], a sea water's constants made on tangents of the
    /// temperature and salinity and kept beside their values (which are
    /// those [`Water::prepare`] makes, bit for bit): for a propagation of
    /// uncertainties, whose pass on tangents of those sources then does
    /// not evaluate every constant a second time. A fresh water is
    /// prepared as by [`Water::prepare`].
    pub(crate) fn prepare_with_slopes(&self) -> Result<PreparedWater> {
        if self.medium() != Medium::Saline {
            return self.prepare();
        }
        let c = self.conditions();
        let on_slopes = Arc::new(Constants::saline_at(
            c,
            Tangent::<2>::source(c.temperature_c(), 0),
            Tangent::<2>::source(c.salinity(), 1),
            self.composition(),
            self.fits(),
        )?);
        Ok(PreparedWater {
            water: self.clone(),
            prepared: Prepared::Saline(on_slopes.values()),
            slopes: Some(on_slopes),
            moves: Vec::new(),
        })
    }

    /// Every constant evaluated for this water. In fresh water the activity
    /// coefficients depend on the ionic strength, which a solve refines with
    /// the speciation; these are the constants at the starting ionic strength.
    ///
    /// # Errors
    /// [`crate::Error::Computation`] if the density cannot be computed.
    ///
    /// ```
    /// # use travertine::{Conditions, Water};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// assert!((k.kb().ln() - -19.7964).abs() < 5e-5); // Dickson 1990, Guide check value
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn constants(&self) -> Result<Constants> {
        match self.medium() {
            Medium::Saline => Constants::saline(self.conditions(), self.composition(), self.fits()),
            Medium::Fresh => Ok(FreshBasis::new(self, true)?.starting_constants()),
        }
    }

    /// The complete state from two measured parameters, with default options.
    ///
    /// # Errors
    /// [`crate::Error::IncompatiblePair`] for a pair that carries one piece of
    /// information (two gas parameters, or one parameter twice);
    /// [`crate::Error::NoWaterFits`] when no water in pH 0–14 fits both;
    /// [`crate::Error::NoConvergence`] if the solver fails (never a wrong number).
    ///
    /// ```
    /// # use travertine::{Conditions, Measured, Water};
    /// let w = Water::saline(Conditions::new(25.0, 35.0)?)?;
    /// let s = w.solve(Measured::pco2_uatm(400.0)?, Measured::alkalinity_umol_kg(2300.0)?)?;
    /// assert!((s.pco2_uatm - 400.0).abs() < 1e-9);
    /// assert!(w.solve(Measured::pco2_uatm(400.0)?, Measured::xco2_ppm(410.0)?).is_err());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn solve(&self, a: Measured, b: Measured) -> Result<State> {
        self.solve_with(a, b, &SolveOptions::default())
    }

    /// As [`Water::solve`], with options (for example which of two roots).
    ///
    /// # Errors
    /// As [`Water::solve`].
    ///
    /// ```
    /// # use travertine::{Conditions, Measured, RootChoice, SolveOptions, Water};
    /// let w = Water::saline(Conditions::new(25.0, 35.0)?)?;
    /// let opts = SolveOptions::default().with_root(RootChoice::LowerPh);
    /// let s = w.solve_with(Measured::dic_umol_kg(2000.0)?, Measured::hco3_umol_kg(1777.7)?, &opts)?;
    /// assert!(s.ph_total < 7.4);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn solve_with(&self, a: Measured, b: Measured, options: &SolveOptions) -> Result<State> {
        self.solve_near(a, b, options, &Near::default())
    }

    /// As [`Water::solve_with`], the searches started from `near`.
    fn solve_near(
        &self,
        a: Measured,
        b: Measured,
        options: &SolveOptions,
        near: &Near,
    ) -> Result<State> {
        // As a prepared water, without moving the constants into one.
        match self.medium() {
            Medium::Saline => {
                let k = Constants::saline(self.conditions(), self.composition(), self.fits())?;
                solve_in(self, Basis::Saline(&k), a, b, options, near)
            }
            Medium::Fresh => {
                let basis = FreshBasis::new(self, false)?;
                solve_in(self, Basis::Fresh(&basis), a, b, options, near)
            }
        }
    }

    /// The same water in the other medium, with the same conditions,
    /// composition, fits and fresh-medium settings.
    fn in_other_medium(&self) -> Result<Water> {
        let other = match self.medium() {
            Medium::Saline => Water::fresh(*self.conditions())?,
            Medium::Fresh => Water::saline(*self.conditions())?,
        };
        Ok(other
            .with_composition(*self.composition())
            .with_fits(*self.fits())
            .with_fresh_options(*self.fresh_options()))
    }
}

impl PreparedWater {
    /// The water.
    ///
    /// ```
    /// # use travertine::{Conditions, Medium, Water};
    /// let p = Water::fresh(Conditions::new(12.0, 0.1)?)?.prepare()?;
    /// assert_eq!(p.water().medium(), Medium::Fresh);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn water(&self) -> &Water {
        &self.water
    }

    /// The constants: in saline water every constant; in fresh water those
    /// at the starting ionic strength with all calcium free (a solve refines
    /// both with the speciation), as [`Water::constants`].
    ///
    /// ```
    /// # use travertine::{Conditions, Water};
    /// let p = Water::saline(Conditions::new(25.0, 35.0)?)?.prepare()?;
    /// assert!((-p.constants()?.k1().log10() - 5.8472).abs() < 5e-5); // Lueker 2000, Guide check value
    /// # Ok::<(), travertine::Error>(())
    /// ```
    ///
    /// # Errors
    /// As [`Water::constants`].
    pub fn constants(&self) -> Result<Constants> {
        match &self.prepared {
            Prepared::Saline(k) => Ok(k.clone()),
            // Every constant, also those a solve of this water never reads.
            Prepared::Fresh(_) => self.water.constants(),
        }
    }

    /// This prepared water with one constant perturbed: pK = −log10 K
    /// raised by `delta_pk`, and everything derived from that constant kept
    /// in step. Solves of the result run the one solver with the perturbed
    /// constant; the water, and the fits a state names, are unchanged. This
    /// is the hook for the propagation of the uncertainty of a constant
    /// ([`crate::decisions::uncertainty`]): the change of a result over a
    /// small `delta_pk` is its sensitivity to that pK.
    ///
    /// - Saline water: the constants through [`Constants::with_pk`].
    /// - Fresh water: the thermodynamic constant of the basis (Plummer &
    ///   Busenberg 1982 and the others of `src/medium/fresh/basis.rs`, on the
    ///   activity scale, pressure-corrected), from which the apparent
    ///   constants of every ionic strength and free calcium of the fixed
    ///   point are made. `K0` is Henry's constant there. The calcium ion-pair
    ///   constants ([`ConstantName::CaHco3Pair`], [`ConstantName::CaCo3Pair`],
    ///   Plummer & Busenberg 1982) are perturbed there too, so the pair
    ///   ratios, K1e and K2e of every free calcium follow them. In saline
    ///   water they are zero (no ion pairs) and stay zero.
    ///
    /// In the overlap of the media (salinity 0.5 to 5) the comparison with
    /// the other medium, where it is made, is with the unperturbed water.
    ///
    /// # Errors
    /// As [`Constants::with_pk`] for a perturbation that is not finite or
    /// takes a constant out of range.
    ///
    /// ```
    /// use travertine::{Conditions, Measured, Water, medium::ConstantName};
    /// let sea = Water::saline(Conditions::new(25.0, 35.0)?)?.prepare()?;
    /// let (ta, dic) = (Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?);
    /// let base = sea.solve(ta, dic)?;
    /// // A weaker carbonic acid (pK1 up 0.01) leaves more CO2*: pCO2 rises.
    /// let shifted = sea.with_constants_perturbed(ConstantName::K1, 0.01)?.solve(ta, dic)?;
    /// assert!(shifted.pco2_uatm > base.pco2_uatm);
    /// // The same in fresh water.
    /// let pond = Water::fresh(Conditions::new(20.0, 0.2)?)?.prepare()?;
    /// let (ta, dic) = (Measured::alkalinity_umol_kg(1200.0)?, Measured::dic_umol_kg(1300.0)?);
    /// let there = pond.with_constants_perturbed(ConstantName::K1, 0.01)?.solve(ta, dic)?;
    /// assert!(there.pco2_uatm > pond.solve(ta, dic)?.pco2_uatm);
    /// assert!(pond.with_constants_perturbed(ConstantName::K1, f64::NAN).is_err());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_constants_perturbed(&self, which: ConstantName, delta_pk: f64) -> Result<Self> {
        let prepared = match &self.prepared {
            Prepared::Saline(k) => Prepared::Saline(k.clone().with_pk(which, delta_pk)?),
            Prepared::Fresh(b) => Prepared::Fresh(b.clone().with_pk(which, delta_pk)?),
        };
        let mut moves = self.moves.clone();
        moves.push((which, delta_pk));
        Ok(PreparedWater {
            water: self.water.clone(),
            prepared,
            slopes: None,
            moves,
        })
    }

    /// The constants moved from those of the water's fits, in order, each
    /// by its shift of pK (see [`PreparedWater::with_constants_perturbed`]).
    pub(crate) fn moves(&self) -> &[(ConstantName, f64)] {
        &self.moves
    }

    /// The totals of the acid systems and calcium (mol/kg), as a solve of
    /// this water uses them.
    pub(crate) fn totals(&self) -> &crate::sample::Totals {
        match &self.prepared {
            Prepared::Saline(k) => k.totals(),
            Prepared::Fresh(b) => &b.totals,
        }
    }

    /// A scratch copy of these constants, for
    /// [`PreparedWater::solve_lean_perturbed`].
    pub(crate) fn scratch(&self) -> Scratch {
        Scratch(match &self.prepared {
            Prepared::Saline(k) => {
                let mut copy = k.clone();
                copy.copy_numbers_from(k);
                Prepared::Saline(copy)
            }
            Prepared::Fresh(b) => {
                let mut copy = b.clone();
                copy.copy_numbers_from(b);
                Prepared::Fresh(copy)
            }
        })
    }

    /// The state of the pair `a`, `b` as [`PreparedWater::solve_near`]
    /// gives it, but lean: without any warning or caution (nor the
    /// comparisons of the media and of a fresh water at the surface, which
    /// only give cautions), and without the exchange with the air. Every
    /// number of the state is the same. The propagation of uncertainties
    /// solves its perturbed waters so, and reads only their numbers.
    pub(crate) fn solve_lean(
        &self,
        a: Measured,
        b: Measured,
        options: &SolveOptions,
        near: &Near,
    ) -> Result<State> {
        solve_lean(&self.water, self.prepared.basis(), a, b, options, near)
    }

    /// As [`PreparedWater::solve_lean`], in this water with constant
    /// `which` perturbed by `delta_pk`, as
    /// [`PreparedWater::with_constants_perturbed`] perturbs it (through the
    /// same methods, [`Constants::with_pk`] and the fresh basis's), but in
    /// `scratch`, a copy of these constants made again before each
    /// perturbation, rather than in a new prepared water.
    ///
    /// # Errors
    /// As [`PreparedWater::with_constants_perturbed`] and
    /// [`PreparedWater::solve_near`].
    #[allow(clippy::too_many_arguments)]
    pub(crate) fn solve_lean_perturbed(
        &self,
        scratch: &mut Scratch,
        which: ConstantName,
        delta_pk: f64,
        a: Measured,
        b: Measured,
        options: &SolveOptions,
        near: &Near,
    ) -> Result<State> {
        let basis = match (&mut scratch.0, &self.prepared) {
            (Prepared::Saline(copy), Prepared::Saline(k)) => {
                copy.copy_numbers_from(k);
                copy.pk_in_place(which, delta_pk)?;
                Basis::Saline(copy)
            }
            (Prepared::Fresh(copy), Prepared::Fresh(b)) => {
                copy.copy_numbers_from(b);
                copy.pk_in_place(which, delta_pk)?;
                Basis::Fresh(copy)
            }
            // A scratch of another medium: made again for this one.
            (other, _) => {
                *other = self.scratch().0;
                return self.solve_lean_perturbed(scratch, which, delta_pk, a, b, options, near);
            }
        };
        solve_lean(&self.water, basis, a, b, options, near)
    }

    /// The complete state from two measured parameters, with default options.
    ///
    /// # Errors
    /// As [`Water::solve`].
    ///
    /// ```
    /// # use travertine::{Conditions, Measured, Water};
    /// let p = Water::saline(Conditions::new(25.0, 35.0)?)?.prepare()?;
    /// let s = p.solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
    /// assert!((s.pco2_uatm - 402.75).abs() < 0.05); // worked value computed from Lueker et al. (2000), Dickson (1990), Lee et al. (2010), Millero (1995) and Weiss (1974)
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn solve(&self, a: Measured, b: Measured) -> Result<State> {
        self.solve_with(a, b, &SolveOptions::default())
    }

    /// As [`PreparedWater::solve`], with options.
    ///
    /// # Errors
    /// As [`Water::solve`].
    ///
    /// ```
    /// # use travertine::{Conditions, Measured, RootChoice, SolveOptions, Water};
    /// // An invented fresh water of pH 11.43 (NBS) at 25 °C: alkalinity with
    /// // CO3 fits it and a water near pH 8.4.
    /// let p = Water::fresh(Conditions::new(25.0, 0.2)?)?.prepare()?;
    /// let (ta, co3) = (Measured::alkalinity_umol_kg(3000.0)?, Measured::co3_umol_kg(39.97)?);
    /// let high = p.solve_with(ta, co3, &SolveOptions::default().with_root(RootChoice::HigherPh))?;
    /// assert!((high.ph_nbs - 11.43).abs() < 0.01);
    /// let natural = p.solve(ta, co3)?;
    /// assert!((natural.ph_nbs - 8.38).abs() < 0.01);
    /// assert!(natural.warnings.iter().any(|w| w.to_string().contains("pH 11.4")));
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn solve_with(&self, a: Measured, b: Measured, options: &SolveOptions) -> Result<State> {
        self.solve_near(a, b, options, &Near::default())
    }

    /// As [`PreparedWater::solve_with`], for a water very near the one
    /// `near` describes: the searches start from its unknowns
    /// ([`Near`]), each still on its full bracket with its usual test of
    /// convergence. The propagation of uncertainties solves its perturbed
    /// waters so.
    pub(crate) fn solve_near(
        &self,
        a: Measured,
        b: Measured,
        options: &SolveOptions,
        near: &Near,
    ) -> Result<State> {
        solve_in(&self.water, self.prepared.basis(), a, b, options, near)
    }
}

impl State {
    /// The same water at other conditions: alkalinity, DIC and the totals are
    /// kept, and the state is solved again with the same medium and fits (an
    /// automatic carbonic fit is fixed to the one this state used, with a
    /// range warning if the new conditions lie outside it). For example, pH measured in the
    /// laboratory at 25 °C reported at the in-situ 9 °C and 120 dbar.
    ///
    /// # Errors
    /// As [`Water::at`] and [`Water::solve`].
    ///
    /// ```
    /// # use travertine::{Conditions, Measured, Water};
    /// let lab = Water::saline(Conditions::new(25.0, 35.0)?)?
    ///     .solve(Measured::ph(7.9, None)?, Measured::alkalinity_umol_kg(2300.0)?)?;
    /// let field = lab.at(Conditions::new(9.0, 35.0)?.with_pressure_dbar(120.0)?)?;
    /// assert!((field.dic_umol_kg - lab.dic_umol_kg).abs() < 1e-9);
    /// assert!(field.ph_total > lab.ph_total); // colder water, higher pH
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn at(&self, conditions: Conditions) -> Result<State> {
        self.at_with(conditions, &SolveOptions::default())
    }

    /// As [`State::at`], with solve options (for example the precipitation
    /// potential).
    ///
    /// # Errors
    /// As [`Water::at`] and [`Water::solve`].
    ///
    /// ```
    /// # use travertine::{Conditions, Measured, SolveOptions, Water};
    /// # use travertine::{units::Amount, sample::Composition};
    /// let well = Water::fresh(Conditions::new(12.0, 0.3)?)?
    ///     .with_composition(Composition::default().with_calcium(Amount::PerKg(1.5e-3))?)
    ///     .solve(Measured::ph(7.1, None)?, Measured::alkalinity_umol_kg(3600.0)?)?;
    /// let options = SolveOptions::default().with_precipitation_potential(true);
    /// let warm = well.at_with(Conditions::new(25.0, 0.3)?, &options)?;
    /// assert!(warm.precipitation_potential_mg_l_caco3.is_some());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn at_with(&self, conditions: Conditions, options: &SolveOptions) -> Result<State> {
        self.at_perturbed(conditions, options, &[])
    }

    /// As [`State::at_with`], with each constant of `constants` perturbed
    /// by its shift in pK units in the water at the new conditions, as
    /// [`PreparedWater::with_constants_perturbed`] perturbs it: the
    /// propagation of uncertainties reports a state at other conditions
    /// so, the error of a fit taken as the same at both conditions.
    pub(crate) fn at_perturbed(
        &self,
        conditions: Conditions,
        options: &SolveOptions,
        constants: &[(ConstantName, f64)],
    ) -> Result<State> {
        let mut water = self.water_sample().at(conditions)?;
        // The measured state's model is kept: an automatic carbonic fit
        // becomes the one the measured state used, so that the default
        // cannot switch fits between the two states.
        if water.medium() == Medium::Saline && water.fits().carbonic.is_none() {
            if let Ok(fit) = self.fits_used.carbonic.as_str().parse::<CarbonicFit>() {
                let fits = water.fits().with_carbonic(fit);
                water = water.with_fits(fits);
            }
        }
        let (alkalinity, dic) = (
            Measured::alkalinity_umol_kg(self.alkalinity_umol_kg)?,
            Measured::dic_umol_kg(self.dic_umol_kg)?,
        );
        let mut moved = if constants.is_empty() {
            water.solve_with(alkalinity, dic, options)?
        } else {
            water
                .prepare_moved(constants)?
                .solve_with(alkalinity, dic, options)?
        };
        // issue 11: the parameters of the measurement, not of this re-solve.
        moved.computed_from = self.computed_from;
        Ok(moved)
    }

    /// This state with its exchange of CO2 with `air` ([`State::exchange`]):
    /// the air's pCO2 and the saturation ratio, the Schmidt number, the
    /// transfer velocity and the flux where a wind speed or a k600 is
    /// given, and the water at equilibrium with the air at the same
    /// alkalinity and totals (a second solve, of this state's water with
    /// its alkalinity and the air's fCO2). `ph_scale` is the scale to give
    /// the equilibrium pH on: that of the pH measured, or `None` for the
    /// medium's own (NBS in fresh water, total in saline water).
    ///
    /// The cautions of the exchange are added to the state's: notes for
    /// the CO2 of the air and the barometric pressure taken by default and
    /// for a flux not computed for want of a wind speed; warnings for a
    /// model used outside its published range and for an input not used.
    /// The formulas are in [`crate::state::exchange`].
    ///
    /// # Errors
    /// As [`Air::check`] for inputs of the air that do not go together.
    ///
    /// ```
    /// use travertine::{sample::air::Air, Conditions, Measured, PhScale, Water};
    /// // An invented estuary at 15 °C: pH on the total scale, 8 m/s of wind.
    /// let estuary = Water::saline(Conditions::new(15.0, 20.0)?)?
    ///     .solve(Measured::ph(7.9, Some(PhScale::Total))?, Measured::alkalinity_umol_kg(1900.0)?)?;
    /// let air = Air::new().with_wind_m_s(8.0)?.with_co2_ppm(425.0)?;
    /// let s = estuary.clone().with_exchange(&air, Some(PhScale::Total))?;
    /// let e = s.exchange.unwrap();
    /// assert_eq!(e.gas_transfer.name(), "wanninkhof2014");
    /// assert!(e.co2_flux_mmol_m2_d.unwrap() > 0.0);
    /// assert!((e.co2_saturation_ratio - s.pco2_uatm / e.air_pco2_uatm).abs() < 1e-12);
    /// // Without a wind speed: no flux, and a note says why.
    /// let calm = estuary.with_exchange(&Air::new(), None)?;
    /// assert!(calm.exchange.unwrap().co2_flux_mmol_m2_d.is_none());
    /// assert!(calm.warnings.iter().any(|w| w.code() == "transfer_velocity_not_given"));
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_exchange(self, air: &Air, ph_scale: Option<PhScale>) -> Result<State> {
        add_exchange(self, air, ph_scale, None)
    }
}

impl PreparedWater {
    /// As [`State::with_exchange`], for a state of this water: the water at
    /// equilibrium with the air is solved with these prepared constants
    /// rather than with constants evaluated again, which halves the cost
    /// of the exchange in a batch. A state of another water is given its
    /// exchange as [`State::with_exchange`] does.
    ///
    /// # Errors
    /// As [`State::with_exchange`].
    ///
    /// ```
    /// use travertine::{sample::air::Air, Conditions, Measured, Water};
    /// let pond = Water::fresh(Conditions::new(16.0, 0.1)?)?.prepare()?;
    /// let air = Air::new().with_wind_m_s(2.5)?.with_co2_ppm(430.0)?;
    /// let ta = Measured::alkalinity_umol_kg(900.0)?;
    /// let state = pond.solve(ta, Measured::ph(6.9, None)?)?;
    /// let here = pond.with_exchange(state.clone(), &air, None)?;
    /// assert_eq!(here.exchange, state.with_exchange(&air, None)?.exchange);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_exchange(
        &self,
        state: State,
        air: &Air,
        ph_scale: Option<PhScale>,
    ) -> Result<State> {
        add_exchange(state, air, ph_scale, Some(self))
    }
}

/// The exchange of `state` with `air` ([`State::with_exchange`]), the water
/// at equilibrium with the air solved with `prepared` where that is the
/// state's water.
fn add_exchange(
    mut state: State,
    air: &Air,
    ph_scale: Option<PhScale>,
    prepared: Option<&PreparedWater>,
) -> Result<State> {
    air.check()?;
    let scale = ph_scale.unwrap_or(medium_scale(state.medium));
    let (mut exchange, notes) = Exchange::of(&state, air, scale);
    match at_equilibrium_with(&state, exchange.air_fco2_uatm, prepared) {
        Ok(e) => {
            exchange.equilibrium_ph = Some(e.ph(scale));
            exchange.equilibrium_free_co2_mg_l = Some(e.free_co2_mg_l);
        }
        Err(e) => state.warnings.push(Warning::Text {
            code: "equilibrium_not_computed",
            text: format!("the water at equilibrium with the air is not computed: {e}"),
        }),
    }
    for w in notes {
        state.warnings.push(w);
    }
    state.exchange = Some(exchange);
    Ok(state)
}

/// The water of `state` at equilibrium with air of CO2 fugacity
/// `fco2_uatm`: its alkalinity and totals kept, in the same medium, with
/// the same fits and conditions.
fn at_equilibrium_with(
    state: &State,
    fco2_uatm: f64,
    prepared: Option<&PreparedWater>,
) -> Result<State> {
    let options = equilibrium_options();
    let a = Measured::alkalinity_umol_kg(state.alkalinity_umol_kg)?;
    let b = Measured::fco2_uatm(fco2_uatm)?;
    // In fresh water its fixed point starts from the state's ionic
    // strength and free calcium (the same water at another pH: nearer its
    // own than the first guesses); it is settled to the same tolerance.
    let here = state.near();
    let near = Near {
        ionic_strength: here.ionic_strength,
        calcium_free: here.calcium_free,
        ..Near::default()
    };
    match prepared {
        Some(p) if p.water() == state.water_sample() => p.solve_near(a, b, &options, &near),
        // The state's water (reported at other conditions) with the
        // constants the prepared water moved, moved again.
        Some(p) if !p.moves().is_empty() => state
            .water_sample()
            .prepare_moved(p.moves())?
            .solve_near(a, b, &options, &near),
        _ => state.water_sample().solve_near(a, b, &options, &near),
    }
}

/// The options of the solve of a water at equilibrium with the air: only
/// its pH and free CO2 are read, so no saturation pH (a search of its own)
/// is made for it.
fn equilibrium_options() -> SolveOptions {
    SolveOptions {
        saturation_ph: false,
        ..SolveOptions::default().with_media_comparison(false)
    }
}

/// The constants of `water`, or the basis of its fresh-water constants.
fn prepared(water: &Water) -> Result<Prepared> {
    Ok(match water.medium() {
        Medium::Saline => Prepared::Saline(Constants::saline(
            water.conditions(),
            water.composition(),
            water.fits(),
        )?),
        Medium::Fresh => Prepared::Fresh(FreshBasis::new(water, false)?),
    })
}

/// A scratch copy of a prepared water's constants, which
/// [`PreparedWater::solve_lean_perturbed`] perturbs in place.
#[derive(Debug, Clone)]
pub(crate) struct Scratch(Prepared);

/// The lean state of [`PreparedWater::solve_lean`]: the one solver, and
/// the state built from its solution without warnings.
fn solve_lean(
    water: &Water,
    basis: Basis,
    a: Measured,
    b: Measured,
    options: &SolveOptions,
    near: &Near,
) -> Result<State> {
    match basis {
        Basis::Saline(k) => {
            let sol = solve_near(k, &a, &b, options, near.h)?;
            State::build_quiet(water, k, sol.h, sol.dic, None, (&a, &b))
        }
        Basis::Fresh(basis) => {
            let settled = basis.converge_pair(&a, &b, options.root, near)?;
            let (h, dic) = (settled.sol.h, settled.sol.dic);
            // Borrowed where it lies: the constants are a large value.
            let k = &settled.k;
            let mut ignored = Warnings::new();
            let figures = basis.fresh_figures(k, h, dic, options, near, &mut ignored);
            State::build_quiet(water, k, h, dic, Some(figures), (&a, &b))
        }
    }
}

/// The state of `water`, prepared as `prepared`, from a measured pair: the
/// one solver in both media, then the comparison of the media in their
/// overlap.
#[inline(always)]
fn solve_in(
    water: &Water,
    basis: Basis,
    a: Measured,
    b: Measured,
    options: &SolveOptions,
    near: &Near,
) -> Result<State> {
    let (lo, hi) = MEDIA_OVERLAP_SALINITY;
    let in_overlap = (lo..=hi).contains(&water.conditions().salinity());
    let compare_media = options.compare_media && in_overlap;
    let fresh_under_pressure =
        water.medium() == Medium::Fresh && water.conditions().pressure_dbar() > 0.0;
    if !(compare_media || fresh_under_pressure) {
        // Returned as built: a state is a large value to copy.
        return solve_once(water, basis, a, b, options, near);
    }
    let mut result = solve_once(water, basis, a, b, options, near);
    if let Ok(state) = &mut result {
        if compare_media {
            if let Some(w) = media_caution(water, state, a, b, options) {
                state.warnings.push(w);
            }
        }
        if fresh_under_pressure {
            let w = pressure_caution(water, state, a, b, options);
            state.warnings.push(w);
        }
    }
    result
}

/// The state of `water` from a measured pair by the one solver.
#[inline(always)]
fn solve_once(
    water: &Water,
    basis: Basis,
    a: Measured,
    b: Measured,
    options: &SolveOptions,
    near: &Near,
) -> Result<State> {
    let result = match basis {
        Basis::Saline(k) => match solve_near(k, &a, &b, options, near.h) {
            Ok(sol) => State::build(water, k, sol.h, sol.dic, sol.warnings, (&a, &b)),
            Err(e) => Err(e),
        },
        Basis::Fresh(basis) => solve_fresh(water, basis, a, b, options, near),
    };
    match result {
        Ok(mut state) if !water.input_cautions().is_empty() => {
            for w in water.input_cautions() {
                state.warnings.push(w.clone());
            }
            Ok(state)
        }
        other => other,
    }
}

/// The state of `water`, a fresh water with basis `basis`, from a measured
/// pair: the pair settled at its own ionic strength and free calcium, then
/// the state at exactly the constants it settled with.
fn solve_fresh(
    water: &Water,
    basis: &FreshBasis,
    a: Measured,
    b: Measured,
    options: &SolveOptions,
    near: &Near,
) -> Result<State> {
    let settled = basis.converge_pair(&a, &b, options.root, near)?;
    let mut k = settled.k;
    let Solution {
        h,
        dic,
        mut warnings,
    } = settled.sol;
    basis.attach_warnings(&mut k);
    add_route_warnings(water, basis.route, k.ionic_strength(), &mut warnings);
    let figures = basis.fresh_figures(&k, h, dic, options, near, &mut warnings);
    State::build_fresh(water, &k, h, dic, warnings, figures, (&a, &b))
}

/// In the overlap of the two media (the caller checks the salinity), the
/// same sample solved in the other medium; a caution with the figure where pCO2 differs by more than
/// [`MEDIA_PCO2_CAUTION`]. A pH with its scale unstated keeps the scale it
/// had in this medium (NBS in fresh water, total in saline).
fn media_caution(
    water: &Water,
    state: &State,
    a: Measured,
    b: Measured,
    options: &SolveOptions,
) -> Option<Warning> {
    let s = water.conditions().salinity();
    let scale = match water.medium() {
        Medium::Fresh => PhScale::Nbs,
        _ => PhScale::Total,
    };
    let stated = |m: Measured| match m.parameter() {
        Parameter::Ph => m.with_scale_if_unstated(scale),
        _ => m,
    };
    let other = water.in_other_medium().ok()?;
    let quiet = options.with_media_comparison(false);
    let there = other.solve_with(stated(a), stated(b), &quiet).ok()?;
    let difference = there.pco2_uatm / state.pco2_uatm - 1.0;
    (difference.abs() > MEDIA_PCO2_CAUTION).then(|| Warning::MediaDisagree {
        salinity: s,
        other: other.medium().name(),
        pco2_uatm: there.pco2_uatm,
        percent: 100.0 * difference,
    })
}

/// The caution on the pressure correction of a fresh water (the caller
/// checks the medium and that the pressure is above zero): the same
/// measurements solved at the surface, and the change the correction makes
/// in pCO2 and in calcite Ω; a note up to [`FRESH_PRESSURE_CAUTION`], a
/// warning above it. Without calcium, calcite Ω changes by the ratio of
/// CO3-- over that of the calcite solubility product (the calcium and the
/// activity coefficients are the same at both pressures, to within the
/// ion pairs), which is what Ω would change by once calcium is known.
fn pressure_caution(
    water: &Water,
    state: &State,
    a: Measured,
    b: Measured,
    options: &SolveOptions,
) -> Warning {
    let c = water.conditions();
    let dbar = c.pressure_dbar();
    let quiet = options
        .with_media_comparison(false)
        .with_precipitation_potential(false);
    let surface = c
        .with_pressure_dbar(0.0)
        .and_then(|at_surface| water.at(at_surface))
        .and_then(|w| w.solve_with(a, b, &quiet));
    // The relative changes of pCO2 and calcite Ω.
    let change = surface.ok().map(|surface| {
        let pco2 = state.pco2_uatm / surface.pco2_uatm - 1.0;
        let omega = match (state.omega_calcite, surface.omega_calcite) {
            (Some(here), Some(there)) => here / there - 1.0,
            _ => {
                let ksp = crate::fits::pressure::pressure_factor(
                    &crate::fits::pressure::CALCITE,
                    c.temperature_c(),
                    c.pressure_bar(),
                );
                state.co3_umol_kg / surface.co3_umol_kg / ksp - 1.0
            }
        };
        (pco2, omega)
    });
    let size = |(pco2, omega): (f64, f64)| {
        format!(
            "at {dbar:.1} dbar it changes pCO2 by {} % and calcite Ω by {} % against the same \
             measurements at the surface",
            percent(pco2),
            percent(omega)
        )
    };
    match change {
        // A change that is not a number (it cannot be small) is a warning.
        Some((pco2, omega)) if pco2.abs().max(omega.abs()) <= FRESH_PRESSURE_CAUTION => {
            Warning::Text {
                code: "fresh_pressure_effect_small",
                text: format!(
                    "pressure correction small in fresh water: {}, less than a pH error of 0.01 \
                     makes; its coefficients are those of Millero (1995) for sea water",
                    size((pco2, omega))
                ),
            }
        }
        _ => {
            let detail = match change {
                Some(change) => format!(
                    "{}, more than a pH error of 0.01 makes, and its coefficients are those of \
                     Millero (1995) for sea water: results at this depth are uncertain by part \
                     of that change",
                    size(change)
                ),
                None => format!(
                    "at {dbar:.1} dbar the coefficients of Millero (1995) for sea water are \
                     used, and the size of the correction is not known: the pair does not \
                     solve at the surface"
                ),
            };
            Warning::Text {
                code: "fresh_pressure_sea_water_coefficients",
                text: format!(
                    "pressure correction in fresh water with sea-water coefficients: {detail}"
                ),
            }
        }
    }
}

/// A relative change as a percentage to 2 decimals, with its sign (none
/// when it rounds to zero).
fn percent(change: f64) -> String {
    let p = (100.0 * change * 100.0).round() / 100.0;
    if p == 0.0 {
        "0.00".to_string()
    } else {
        format!("{p:+.2}")
    }
}

impl Sample {
    /// Solves a sample given input by input, as `travertine solve` does:
    /// the measured pair ([`Sample::pair`]), the water ([`Sample::water`]),
    /// the pH scale rule ([`Sample::check_ph_scale`]), the solve with
    /// `options`, and the exchange with the air ([`State::with_exchange`],
    /// with [`Sample::air`]). The bindings solve through it, so that their
    /// numbers are the command line's.
    ///
    /// # Errors
    /// The first error of those steps, in that order.
    ///
    /// ```
    /// use travertine::sample::{inputs::NamedInput, Sample};
    /// use travertine::{PhScale, SolveOptions};
    /// let mut s = Sample::default();
    /// for (name, value) in [("temperature_c", 18.0), ("specific_conductance_us_cm", 420.0),
    ///                       ("alkalinity_mg_l_caco3", 120.0), ("ph_nbs", 7.6)] {
    ///     let named = NamedInput::find(name).unwrap();
    ///     s.put(named.input(), named.number(value).unwrap());
    /// }
    /// let state = s.solve(&SolveOptions::default())?;
    /// assert!((state.ph(PhScale::Nbs) - 7.6).abs() < 1e-9);
    /// assert!(state.exchange.is_some());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn solve(&self, options: &SolveOptions) -> Result<State> {
        let (first, second) = self.pair()?;
        let water = self.water()?;
        self.check_ph_scale(water.medium())?;
        let air = self.air()?;
        water
            .solve_with(first, second, options)?
            .with_exchange(&air, self.ph_scale_given())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// A sea water prepared with its constants on tangents of the
    /// temperature and salinity has the very constants (warnings
    /// included) of one prepared without them: in range, beyond the range
    /// of its fits (warnings), under pressure, with nutrients, and at a low
    /// salinity.
    #[test]
    fn slopes_leave_the_prepared_constants_as_they_are() {
        use crate::units::Amount;
        let waters = [
            (25.0, 35.0, 0.0),
            (45.0, 35.0, 0.0),
            (2.0, 30.0, 3000.0),
            (20.0, 2.0, 0.0),
        ];
        for (i, (t, s, p)) in waters.into_iter().enumerate() {
            let c = Conditions::new(t, s)
                .and_then(|c| c.with_pressure_dbar(p))
                .unwrap();
            let mut w = Water::saline(c).unwrap();
            if i == 2 {
                w = w.with_composition(
                    crate::sample::Composition::default()
                        .with_phosphate(Amount::PerKg(2e-6))
                        .and_then(|c| c.with_silicate(Amount::PerKg(40e-6)))
                        .unwrap(),
                );
            }
            let (with, without) = (w.prepare_with_slopes().unwrap(), w.prepare().unwrap());
            assert!(with.slopes.is_some());
            let (Prepared::Saline(a), Prepared::Saline(b)) = (&with.prepared, &without.prepared)
            else {
                panic!("sea water is prepared as sea water");
            };
            assert_eq!(a, b, "{t} °C, salinity {s}, {p} dbar");
            // 45 °C is beyond the range of the default fits.
            if i == 1 {
                assert!(!a.warnings().is_empty());
            }
        }
    }

    #[test]
    fn a_prepared_water_can_be_shared_between_threads() {
        fn shareable<T: Send + Sync>() {}
        shareable::<PreparedWater>();
    }
}

/// The unperturbed solve a pass on [`Tangent`]s differentiates: its
/// unknowns h and DIC (mol/kg; enough in sea water), or its state (fresh
/// water reads the ionic strength, the free calcium and the figures too).
#[derive(Debug, Clone, Copy)]
pub(crate) enum Unperturbed<'a> {
    Unknowns(f64, f64),
    State(&'a State),
}

/// Where each source of a pass on [`Tangent`]s sits: its slot (its place
/// in every number's derivatives), for the propagation of uncertainties
/// ([`crate::decisions::uncertainty`]).
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct Seeds<const N: usize> {
    /// The two measurements, as numbers in the unit of
    /// [`Measured::number`], seeded where a measurement is a source.
    pub a: Tangent<N>,
    pub b: Tangent<N>,
    /// Constants whose pK is a source (the total boron: log10 of its
    /// factor), each with its slot (room for every constant without the
    /// heap).
    pub constants: smallvec::SmallVec<[(ConstantName, usize); 18]>,
    /// Totals that are sources (µmol/kg), each with its slot.
    pub totals: smallvec::SmallVec<[(Total, usize); 5]>,
    /// The slots of the temperature (°C) and the salinity, where they are
    /// sources.
    pub temperature: Option<usize>,
    pub salinity: Option<usize>,
    /// The slot of the number a fresh water's fixed ionic strength is made
    /// from (a TDS or an ionic strength given), where it is a source.
    pub ionic_input: Option<usize>,
    /// The slot of the wind speed (m/s), where it is a source.
    pub wind: Option<usize>,
}

impl PreparedWater {
    /// The unknowns h and DIC of the pair `a`, `b` in this water, as
    /// [`PreparedWater::solve_lean`] solves them, without the state: for
    /// a pass on tangents that gives the state itself
    /// ([`PreparedWater::solve_tangent`]). `None` in fresh water.
    pub(crate) fn solve_unknowns(
        &self,
        a: Measured,
        b: Measured,
        options: &SolveOptions,
    ) -> Option<Result<(f64, f64)>> {
        let Prepared::Saline(k) = &self.prepared else {
            return None;
        };
        Some(solve_near(k, &a, &b, options, Near::default().h).map(|sol| (sol.h, sol.dic)))
    }

    /// The state of the solve `base` of the pair `a`, `b` in this water
    /// (its unknowns in sea water, its state of numbers in fresh water) on
    /// [`Tangent`]s: the same numbers, each with its derivatives with
    /// respect to the sources of `seeds` (forward-mode differentiation
    /// through the constants and the state, and implicit differentiation
    /// at the solver's root, [`crate::solve::tangent`]); with `air` (and
    /// the pH scale of its water at equilibrium) the exchange with the air
    /// too ([`PreparedWater::exchange_on_tangents`]).
    ///
    /// `None` where this pass does not cover the water or a source: a
    /// total the water lacks, a fresh water with totals other than
    /// calcium as sources, a singular root, a water
    /// at equilibrium with the air that cannot be built on tangents. The
    /// caller then takes differences of full solves instead.
    /// The state is given to `read` where it lies (a state on tangents is
    /// a large value, not to be moved).
    pub(crate) fn solve_tangent<const N: usize, T>(
        &self,
        base: Unperturbed<'_>,
        a: &Measured,
        b: &Measured,
        seeds: &Seeds<N>,
        air: Option<(&Air, Option<PhScale>)>,
        read: impl FnOnce(&State<Tangent<N>>) -> T,
    ) -> Option<Result<T>> {
        self.state_on_tangents(base, a, b, seeds, |state| {
            if let Some((air, ph_scale)) = air {
                match self.exchange_on_tangents(state, base, seeds, air, ph_scale)? {
                    Ok(exchange) => state.exchange = Some(exchange),
                    Err(e) => return Some(Err(e)),
                }
            }
            Some(Ok(read(state)))
        })
    }

    /// The exchange of `state` (the state on tangents of the solve `base`)
    /// with `air` on tangents, the water at equilibrium with the air
    /// included: that water is solved in numbers as
    /// [`State::with_exchange`] solves it, and its state made on tangents
    /// as any other ([`PreparedWater::state_on_tangents`]), its pair the
    /// alkalinity of `state` and the fCO2 of the air, both with their
    /// derivatives. Its pH and free CO2 are `None` where its solve in
    /// numbers fails (as [`State::with_exchange`] leaves them, with a
    /// warning). `None` where the pass does not cover that water or its
    /// state on tangents cannot be built (the caller then takes
    /// differences); the error of [`Air::check`] where the air's inputs do
    /// not go together.
    fn exchange_on_tangents<const N: usize>(
        &self,
        state: &State<Tangent<N>>,
        base: Unperturbed<'_>,
        seeds: &Seeds<N>,
        air: &Air,
        ph_scale: Option<PhScale>,
    ) -> Option<Result<Exchange<Tangent<N>>>> {
        // As `add_exchange`: inputs of the air that do not go together are
        // an error, not an exchange without a flux.
        if let Err(e) = air.check() {
            return Some(Err(e));
        }
        let scale = ph_scale.unwrap_or(medium_scale(state.medium));
        let wind = air.wind_m_s().map(|u| match seeds.wind {
            Some(slot) => Tangent::source(u, slot),
            None => Tangent::constant(u),
        });
        let mut exchange = Exchange::figures_on(state, air, scale, wind);
        let (ta, fco2) = (state.alkalinity_umol_kg, exchange.air_fco2_uatm);
        let pair =
            Measured::alkalinity_umol_kg(ta.v).and_then(|a| Ok((a, Measured::fco2_uatm(fco2.v)?)));
        let Ok((a, b)) = pair else {
            return Some(Ok(exchange));
        };
        // The unknowns of that water, in numbers, as `at_equilibrium_with`
        // solves it.
        let equilibrium;
        let base = match base {
            Unperturbed::Unknowns(..) => {
                match self.solve_unknowns(a, b, &equilibrium_options())? {
                    Ok((h, dic)) => Unperturbed::Unknowns(h, dic),
                    Err(_) => return Some(Ok(exchange)),
                }
            }
            Unperturbed::State(s) => match at_equilibrium_with(s, fco2.v, Some(self)) {
                Ok(e) => {
                    equilibrium = e;
                    Unperturbed::State(&equilibrium)
                }
                Err(_) => return Some(Ok(exchange)),
            },
        };
        let seeds = Seeds {
            a: ta,
            b: fco2,
            ..seeds.clone()
        };
        let (ph, free_co2) = self
            .state_on_tangents(base, &a, &b, &seeds, |e| {
                Some(Ok((e.ph(scale), e.free_co2_mg_l)))
            })?
            .ok()?;
        exchange.equilibrium_ph = Some(ph);
        exchange.equilibrium_free_co2_mg_l = Some(free_co2);
        Some(Ok(exchange))
    }

    /// The state on tangents of [`PreparedWater::solve_tangent`], without
    /// the exchange with the air, given to `with` where it lies.
    fn state_on_tangents<const N: usize, T>(
        &self,
        base: Unperturbed<'_>,
        a: &Measured,
        b: &Measured,
        seeds: &Seeds<N>,
        with: impl FnOnce(&mut State<Tangent<N>>) -> Option<Result<T>>,
    ) -> Option<Result<T>> {
        let k0 = match (&self.prepared, base) {
            (Prepared::Saline(k0), _) => k0,
            (Prepared::Fresh(_), Unperturbed::State(base)) => {
                return self.state_on_tangents_fresh(base, a, b, seeds, with)
            }
            (Prepared::Fresh(_), Unperturbed::Unknowns(..)) => return None,
        };
        let (h, dic) = match base {
            Unperturbed::Unknowns(h, dic) => (h, dic),
            Unperturbed::State(s) => (s.h_mol_kg(), s.dic_mol_kg()),
        };
        let plain: Constants<Tangent<2>> = k0.lift();
        let mut k: Constants<Tangent<N>> = match (seeds.temperature, seeds.salinity) {
            (None, None) => k0.lift(),
            // Constants moved from those of the water's fits are not
            // evaluated again from the water.
            _ if !self.moves.is_empty() => return None,
            (t, s) => {
                // Every constant evaluated again by the one evaluation the
                // plain constants came from, on tangents of the temperature
                // and salinity alone (two slots, a seventh of the work),
                // then spread onto their slots; made once where the water
                // was prepared with them.
                let made;
                let k = match &self.slopes {
                    Some(k) => k.as_ref(),
                    None => {
                        let c = self.water.conditions();
                        made = match Constants::saline_at(
                            c,
                            Tangent::<2>::source(c.temperature_c(), 0),
                            Tangent::<2>::source(c.salinity(), 1),
                            self.water.composition(),
                            self.water.fits(),
                        ) {
                            Ok(k) => k,
                            Err(e) => return Some(Err(e)),
                        };
                        &made
                    }
                };
                k.map_numbers(|x| {
                    let mut d = [0.0; N];
                    for (slot, dx) in [(t, x.d[0]), (s, x.d[1])] {
                        if let Some(x) = slot.and_then(|i| d.get_mut(i)) {
                            *x = dx;
                        }
                    }
                    Tangent::new(x.v, d)
                })
            }
        };
        // pK raised by each source at zero: K times 10^−δ at δ = 0, the
        // number `pk_in_place` would make (without its exponential).
        if let Err(e) = k.seed_pks(&seeds.constants) {
            return Some(Err(e));
        }
        for &(which, slot) in &seeds.totals {
            if !k.shift_saline_total(which, Tangent::source(0.0, slot) * 1e-6) {
                return None;
            }
        }
        let (h, dic) =
            crate::solve::tangent::unknowns(&k, &plain, (h, dic), (a, seeds.a), (b, seeds.b))?;
        let mut state =
            State::build_fresh_or_saline(&self.water, &k, h, dic, Warnings::new(), None, a, b);
        match &mut state {
            Ok(state) => with(state),
            Err(e) => Some(Err(e.clone())),
        }
    }

    /// [`PreparedWater::solve_tangent`] in fresh water: the basis on
    /// tangents of its own sources (temperature, salinity, the number of
    /// a fixed ionic strength, calcium) spread onto the sources' slots, the
    /// constants perturbed on their slots, the four unknowns of the fixed
    /// point by implicit differentiation
    /// ([`crate::solve::tangent::fresh_unknowns`]), the apparent constants
    /// at them, the figures (pHs by implicit differentiation at its root)
    /// and the state. The precipitation potential (a search over full
    /// solves) is not made on tangents: the state on tangents has none,
    /// and the caller takes its derivatives by differences.
    fn state_on_tangents_fresh<const N: usize, T>(
        &self,
        base: &State,
        a: &Measured,
        b: &Measured,
        seeds: &Seeds<N>,
        with: impl FnOnce(&mut State<Tangent<N>>) -> Option<Result<T>>,
    ) -> Option<Result<T>> {
        use crate::medium::fresh::{FreshSources, IonicStrengthRoute};
        // The basis is made again from the water: constants moved from
        // those of its fits would be lost.
        if !self.moves.is_empty() {
            return None;
        }
        let water = &self.water;
        let c = water.conditions();
        let f = water.fresh_options();
        let calcium = seeds
            .totals
            .iter()
            .find(|(t, _)| *t == Total::Calcium)
            .map(|&(_, s)| s);
        if seeds.totals.iter().any(|(t, _)| *t != Total::Calcium) {
            return None;
        }
        let route = crate::medium::fresh::ionic::route(water);
        let ionic_value = match route {
            IonicStrengthRoute::Tds => f.tds_mg_l,
            IonicStrengthRoute::Given => f.ionic_strength,
            _ => None,
        };
        if seeds.ionic_input.is_some() && ionic_value.is_none() {
            return None;
        }
        // The basis on four slots: temperature, salinity, the fixed ionic
        // input, calcium.
        let four = FreshSources {
            temperature_c: Tangent::<4>::source(c.temperature_c(), 0),
            salinity: Tangent::source(c.salinity(), 1),
            fixed_ionic_input: ionic_value.map(|v| Tangent::source(v, 2)),
            calcium_shift_mol_kg: Some(Tangent::source(0.0, 3)),
        };
        let b4 = match FreshBasis::new_at(water, &four, false) {
            Ok(b4) => b4,
            Err(e) => return Some(Err(e)),
        };
        // Each slot's derivative per unit of its source: the calcium's per
        // µmol/kg (the unit of its uncertainty), the others in their own.
        let slots = [
            seeds.temperature,
            seeds.salinity,
            seeds.ionic_input,
            calcium,
        ];
        let per_unit = [1.0, 1.0, 1.0, 1e-6];
        let mut basis = b4.map_numbers(|x| {
            let mut d = [0.0; N];
            for ((slot, dx), p) in slots.iter().zip(x.d).zip(per_unit) {
                if let Some(x) = slot.and_then(|i| d.get_mut(i)) {
                    *x = dx * p;
                }
            }
            Tangent::new(x.v, d)
        });
        basis.seed_pks(&seeds.constants);
        let plain = b4.map_numbers(|x| Tangent::<4>::constant(x.v));
        let u = [
            base.h_mol_kg(),
            base.dic_mol_kg(),
            base.ionic_strength,
            base.calcium_free_mol_kg(),
        ];
        let mut held = crate::solve::tangent::held_constants(&basis, u);
        let [h, dic, i, ca] = crate::solve::tangent::fresh_unknowns(
            &basis,
            &plain,
            &held,
            u,
            (a, seeds.a),
            (b, seeds.b),
        )?;
        // The constants at the unknowns. Where the ionic strength is fixed
        // (not the ions'), only the free calcium moves them from those at
        // the unknowns held: the pair terms follow from it
        // (`set_free_calcium`, the very numbers `constants_at` makes).
        let from_ions;
        let k = if basis.fixed_i.is_some() {
            held.set_free_calcium(ca);
            &held
        } else {
            from_ions = basis.constants_at(i, ca, basis.totals.calcium_mol_kg);
            &from_ions
        };
        let values = crate::state::FreshFigures {
            ionic_strength_from: base.ionic_strength_from?,
            charge_balance_percent: base.charge_balance_percent,
            saturation_ph_nbs: base.saturation_ph_nbs,
            langelier_index: base.langelier_index,
            precipitation_potential_mg_l_caco3: None,
        };
        let figures = basis.fresh_figures_on(k, h, dic, &values, None);
        let mut state =
            State::build_fresh_or_saline(water, k, h, dic, Warnings::new(), Some(figures), a, b);
        match &mut state {
            Ok(state) => with(state),
            Err(e) => Some(Err(e.clone())),
        }
    }
}
