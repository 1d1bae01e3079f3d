//! From two measured parameters to [H+] and DIC.
//!
//! Every pair reduces to one unknown, h = [H+] on the working scale. Pairs
//! with a closed form (pH with anything; two carbonate species; DIC with
//! one species) are solved directly, the quadratics in their numerically
//! stable forms. Pairs with alkalinity are one bracketed root of the
//! alkalinity equation in x = ln h over pH 0 to 14, found by the
//! safeguarded Newton iteration of `src/root.rs` (`monotone_newton`), with the analytic
//! derivative. The first guess for (TA, DIC) is the root of the
//! carbonate-only quadratic (Munhoven 2013 uses the same idea for his
//! bounds); other pairs start from the middle of the bracket.
//!
//! Two pairs can have two valid states: alkalinity with CO3--, and DIC with
//! HCO3-. By default the root nearer pH 8 (working scale) is returned, since
//! natural waters cluster there; [`RootChoice`] picks the other, and the
//! other root is always reported in a warning.

use crate::base::error::{Error, Result};
use crate::base::field::Field;
use crate::base::numeric::Real;
use crate::base::root::{monotone_newton, Failure, Search};
use crate::base::warning::{Warning, Warnings};
use crate::medium::Constants;
use crate::properties::scales::PhScale;
use crate::sample::measured::{check_pair, Measured, MeasuredValue, Parameter};
use crate::speciation::alkalinity::{carbonate_per_dic, non_carbonate};

pub(crate) mod converge;
pub(crate) mod fixed_point;
pub(crate) mod tangent;
mod two_roots;

#[cfg(test)]
use two_roots::by_root_policy;
use two_roots::{dic_hco3_root, ta_co3_root};

/// Which root to return for the pairs that have two.
///
/// ```
/// use travertine::RootChoice;
/// let r: RootChoice = "higher-ph".parse()?;
/// assert_eq!(r, RootChoice::HigherPh);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
#[non_exhaustive]
pub enum RootChoice {
    /// The root nearer pH 8 on the working scale, where natural waters cluster.
    #[default]
    Natural,
    /// The root with the lower pH.
    LowerPh,
    /// The root with the higher pH.
    HigherPh,
}

impl std::str::FromStr for RootChoice {
    type Err = Error;
    fn from_str(s: &str) -> Result<Self> {
        match s.trim().to_ascii_lowercase().as_str() {
            "natural" => Ok(RootChoice::Natural),
            "lower-ph" => Ok(RootChoice::LowerPh),
            "higher-ph" => Ok(RootChoice::HigherPh),
            _ => Err(Error::UnknownChoice {
                field: Field::Root,
                name: s.to_string(),
                accepted: "natural, lower-ph, higher-ph".to_string(),
            }),
        }
    }
}

/// The name [`RootChoice`]'s `FromStr` reads: `natural`, `lower-ph`, `higher-ph`.
///
/// ```
/// use travertine::RootChoice;
/// for r in [RootChoice::Natural, RootChoice::LowerPh, RootChoice::HigherPh] {
///     assert_eq!(r.to_string().parse::<RootChoice>()?, r);
/// }
/// # Ok::<(), travertine::Error>(())
/// ```
impl std::fmt::Display for RootChoice {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(match self {
            RootChoice::Natural => "natural",
            RootChoice::LowerPh => "lower-ph",
            RootChoice::HigherPh => "higher-ph",
        })
    }
}

/// Options of a solve.
///
/// ```
/// use travertine::{RootChoice, SolveOptions};
/// let o = SolveOptions::default().with_root(RootChoice::LowerPh);
/// assert_eq!(o.root, RootChoice::LowerPh);
/// assert!(!o.precipitation_potential && o.compare_media);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[non_exhaustive]
pub struct SolveOptions {
    /// Which root to return where two fit.
    pub root: RootChoice,
    /// Whether to compute the calcium carbonate precipitation potential of
    /// a fresh water with calcium (a root of full solves, about twenty
    /// times the cost of the solve itself). Off by default.
    pub precipitation_potential: bool,
    /// Whether a water of salinity 0.5 to 5, where both media apply, is
    /// also solved in the other medium, with a caution where their pCO2
    /// differ by more than 5 %. On by default.
    pub compare_media: bool,
    /// Whether a two-root pair with an explicit choice also looks for the
    /// other root to report it (off only for the crate's own derived
    /// solves, which read the chosen root alone).
    pub(crate) report_other_root: bool,
    /// Whether a fresh water with calcium gets its saturation pH and
    /// Langelier index (off only for the crate's own derived solves that
    /// read neither: the water at equilibrium with the air).
    pub(crate) saturation_ph: bool,
}

impl Default for SolveOptions {
    fn default() -> Self {
        SolveOptions {
            root: RootChoice::Natural,
            precipitation_potential: false,
            compare_media: true,
            report_other_root: true,
            saturation_ph: true,
        }
    }
}

impl SolveOptions {
    /// With a root choice.
    ///
    /// ```
    /// # use travertine::{RootChoice, SolveOptions};
    /// assert_eq!(SolveOptions::default().with_root(RootChoice::HigherPh).root, RootChoice::HigherPh);
    /// ```
    #[must_use]
    pub fn with_root(mut self, root: RootChoice) -> Self {
        self.root = root;
        self
    }

    /// With or without the precipitation potential.
    ///
    /// ```
    /// # use travertine::SolveOptions;
    /// assert!(SolveOptions::default().with_precipitation_potential(true).precipitation_potential);
    /// ```
    #[must_use]
    pub fn with_precipitation_potential(mut self, on: bool) -> Self {
        self.precipitation_potential = on;
        self
    }

    /// With or without the comparison of the two media in their overlap.
    ///
    /// ```
    /// # use travertine::SolveOptions;
    /// assert!(!SolveOptions::default().with_media_comparison(false).compare_media);
    /// ```
    #[must_use]
    pub fn with_media_comparison(mut self, on: bool) -> Self {
        self.compare_media = on;
        self
    }
}

/// The solved unknowns: working-scale h and DIC (mol/kg), plus any warning.
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct Solution {
    pub h: f64,
    pub dic: f64,
    pub warnings: Warnings,
}

/// Lowest working-scale pH searched.
const PH_MIN: f64 = 0.0;
/// Highest working-scale pH searched.
const PH_MAX: f64 = 14.0;
const LN10: f64 = std::f64::consts::LN_10;
/// h at the bracket ends.
const H_AT_PH_MAX: f64 = 1e-14;
const H_AT_PH_MIN: f64 = 1.0;

/// The internal form of one measured parameter.
#[derive(Clone, Copy, Debug)]
pub(crate) enum WorkingValue {
    Ta(f64),
    Dic(f64),
    H(f64),
    Co2(f64),
    Hco3(f64),
    Co3(f64),
}

impl WorkingValue {
    pub(crate) fn rank(self) -> u8 {
        match self {
            WorkingValue::Ta(_) => 0,
            WorkingValue::Dic(_) => 1,
            WorkingValue::H(_) => 2,
            WorkingValue::Co2(_) => 3,
            WorkingValue::Hco3(_) => 4,
            WorkingValue::Co3(_) => 5,
        }
    }
}

pub(crate) fn to_working(k: &Constants, m: &Measured, warnings: &mut Warnings) -> WorkingValue {
    let rho = k.density_kg_m3();
    match (m.parameter(), m.value()) {
        (_, MeasuredValue::Ph(ph, scale)) => {
            // In saline water the scale changes the answer: a library call
            // that leaves it out is solved on the total scale, and says so
            // (the command line and the sheet refuse it instead).
            if scale.is_none() && k.working_scale() == PhScale::Total {
                warnings.push(Warning::Note {
                    code: "ph_scale_assumed_total",
                    text: "pH without a scale in saline water is taken on the total scale; state \
                     the scale (NBS and total differ by about 0.1 to 0.15 pH)",
                });
            }
            let scale = scale.unwrap_or(k.working_scale());
            if k.working_scale() == PhScale::Nbs
                && matches!(scale, PhScale::Total | PhScale::Seawater)
            {
                warnings.push(Warning::Note {
                    code: "ph_scale_via_free_scale",
                    text: "pH on the total or sea-water scale in fresh water is taken through the \
                     free scale with the sulfate and fluoride given; fresh-water pH is \
                     normally NBS",
                });
            }
            if scale == PhScale::Nbs && k.working_scale() != PhScale::Nbs {
                warnings.push(Warning::Note {
                    code: "nbs_ph_in_saline_approximate",
                    text:
                        "pH on the NBS scale in saline water is approximate: it is converted with \
                     the H+ activity coefficient of Takahashi et al. (1982), meant for salinity \
                     20 to 40, and electrode junction errors are not known",
                });
            }
            WorkingValue::H(k.h_from_ph(ph, scale))
        }
        (Parameter::Pco2, MeasuredValue::Atm(p)) => {
            WorkingValue::Co2(k.k0() * p * k.fugacity_factor())
        }
        (_, MeasuredValue::Atm(f)) => WorkingValue::Co2(k.k0() * f),
        (_, MeasuredValue::MoleFraction(x)) => {
            let p = x * (k.conditions().air_pressure_atm() - k.vapour_pressure_atm());
            WorkingValue::Co2(k.k0() * p * k.fugacity_factor())
        }
        (Parameter::Alkalinity, MeasuredValue::Amount(a)) => WorkingValue::Ta(a.mol_kg(rho)),
        (Parameter::Dic, MeasuredValue::Amount(a)) => WorkingValue::Dic(a.mol_kg(rho)),
        // Free ions, turned into their carbon-balance totals (with Ca pairs).
        (Parameter::Hco3, MeasuredValue::Amount(a)) => {
            WorkingValue::Hco3(a.mol_kg(rho) * (1.0 + k.pair_hco3()))
        }
        (Parameter::Co3, MeasuredValue::Amount(a)) => {
            WorkingValue::Co3(a.mol_kg(rho) * (1.0 + k.pair_co3()))
        }
        (_, MeasuredValue::Amount(a)) => WorkingValue::Co2(a.mol_kg(rho)),
    }
}

/// DIC / CO2*, DIC / HCO3-, DIC / CO3-- at h.
#[inline]
fn dic_per_co2<R: Real>(k: &Constants<R>, h: R) -> R {
    k.k1e() / h + 1.0 + k.k1e() * k.k2e() / (h * h)
}
#[inline]
fn dic_per_hco3<R: Real>(k: &Constants<R>, h: R) -> R {
    h / k.k1e() + 1.0 + k.k2e() / h
}
#[inline]
fn dic_per_co3<R: Real>(k: &Constants<R>, h: R) -> R {
    h * h / (k.k1e() * k.k2e()) + h / k.k2e() + 1.0
}

#[derive(Clone, Copy)]
pub(crate) struct Pair<'a> {
    pub(crate) a: &'a Measured,
    pub(crate) b: &'a Measured,
}

impl Pair<'_> {
    pub(crate) fn no_water(&self, reason: String) -> Error {
        Error::NoWaterFits {
            first: self.a.parameter().field(),
            first_value: self.a.describe(),
            second: self.b.parameter().field(),
            second_value: self.b.describe(),
            reason,
        }
    }
    pub(crate) fn no_convergence(&self, iterations: u32) -> Error {
        Error::NoConvergence {
            first: self.a.parameter().field(),
            second: self.b.parameter().field(),
            iterations,
        }
    }
}

/// Checks that a solved DIC (mol/kg) is one a measurement could have: a pH
/// near 0 with ordinary alkalinity, say, implies an absurd DIC.
#[inline(always)]
pub(crate) fn check_dic(pair: &Pair, dic: f64) -> Result<()> {
    if dic_in_range(dic) {
        return Ok(());
    }
    Err(dic_out_of_range(pair, dic))
}

/// The error of [`check_dic`], out of line.
#[cold]
#[inline(never)]
fn dic_out_of_range(pair: &Pair, dic: f64) -> Error {
    let (min, max) = Parameter::Dic.accepted_range();
    let umol = dic * 1e6;
    pair.no_water(format!(
        "the DIC would be {umol:.3e} µmol/kg, beyond the accepted {min} to {max} µmol/kg"
    ))
}

/// Whether h lies in pH 0–14 (a pH given as exactly 0 or 14 may come back a
/// few ulp outside).
fn h_in_range(h: f64) -> bool {
    (H_AT_PH_MAX * (1.0 - 1e-12)..=H_AT_PH_MIN * (1.0 + 1e-12)).contains(&h)
}

/// Whether a DIC (mol/kg) is one a measurement could have; a DIC measured
/// at a limit passes despite rounding.
fn dic_in_range(dic: f64) -> bool {
    let (min, max) = Parameter::Dic.accepted_range();
    let umol = dic * 1e6;
    umol.is_finite() && umol >= min * (1.0 - 1e-9) && umol <= max * (1.0 + 1e-9)
}

/// Whether an alkalinity (mol/kg) is one a measurement could have (the
/// test of a state's build, also used here for a root not yet built); an
/// alkalinity measured at the limit passes despite rounding.
pub(crate) fn alkalinity_in_range(ta: f64) -> bool {
    let (_, max) = Parameter::Alkalinity.accepted_range();
    let umol = ta * 1e6;
    umol.is_finite() && umol.abs() <= max * (1.0 + 1e-9)
}

/// Where a solve of a water very near another one may start: the
/// unknowns of the solved neighbour (its working-scale h, and in fresh
/// water its ionic strength, free calcium and saturation pH). Used by the
/// propagation of uncertainties, whose perturbed solves lie within a small
/// step of the unperturbed one, and by the water at equilibrium with the
/// air (the ionic strength and free calcium of the sample): each search
/// still runs with its usual convergence test (and falls back to its full
/// bracket), so a start that is not near changes the cost of a solve,
/// never its result beyond the tolerance of the search.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub(crate) struct Near {
    /// The neighbour's h on the working scale (NaN: none).
    pub(crate) h: f64,
    /// Its ionic strength, mol/kg (fresh water).
    pub(crate) ionic_strength: Option<f64>,
    /// Its free calcium, mol/kg (fresh water with calcium).
    pub(crate) calcium_free: Option<f64>,
    /// Its pHs, the NBS pH of calcite saturation (fresh water).
    pub(crate) saturation_ph: Option<f64>,
}

/// Solves for h and DIC.
pub(crate) fn solve(
    k: &Constants,
    a: &Measured,
    b: &Measured,
    options: &SolveOptions,
) -> Result<Solution> {
    solve_near(k, a, b, options, f64::NAN)
}

/// As [`solve`], the root of a pair with alkalinity searched from `near_h`
/// (where finite and positive) rather than from the usual first guess.
pub(crate) fn solve_near(
    k: &Constants,
    a: &Measured,
    b: &Measured,
    options: &SolveOptions,
    near_h: f64,
) -> Result<Solution> {
    let Working {
        ka,
        kb,
        pair,
        mut warnings,
    } = working(k, a, b)?;
    let (h, dic) = solve_pair(k, ka, kb, pair, options, near_h, &mut warnings)?;
    Ok(Solution { h, dic, warnings })
}

/// A measured pair in its internal form at some constants, in the order
/// the pair algebra takes it, with the notes the conversion gave.
pub(crate) struct Working<'a> {
    ka: WorkingValue,
    kb: WorkingValue,
    pair: Pair<'a>,
    warnings: Warnings,
}

/// The internal form of the pair `a`, `b` at the constants `k`
/// ([`to_working`]), after the pair is checked.
#[inline(always)]
pub(crate) fn working<'a>(k: &Constants, a: &'a Measured, b: &'a Measured) -> Result<Working<'a>> {
    check_pair(a, b)?;
    let mut warnings = Warnings::new();
    let mut ka = to_working(k, a, &mut warnings);
    let mut kb = to_working(k, b, &mut warnings);
    let (mut ma, mut mb) = (a, b);
    if ka.rank() > kb.rank() {
        std::mem::swap(&mut ka, &mut kb);
        std::mem::swap(&mut ma, &mut mb);
    }
    Ok(Working {
        ka,
        kb,
        pair: Pair { a: ma, b: mb },
        warnings,
    })
}

/// Whether the internal form of a measured parameter depends on the free
/// calcium of fresh water: the free HCO3- and CO3-- given are turned into
/// carbon-balance totals with the calcium pairs. Every other form depends
/// only on the ionic strength and the temperature-only constants, so a
/// fixed point over the free calcium converts it once ([`working`]).
pub(crate) fn depends_on_calcium(m: &Measured) -> bool {
    matches!(m.parameter(), Parameter::Hco3 | Parameter::Co3)
}

/// As [`solve_near`], for a pair already in its internal form at `k`
/// ([`working`]).
pub(crate) fn solve_working(
    k: &Constants,
    w: &Working,
    options: &SolveOptions,
    near_h: f64,
) -> Result<Solution> {
    let mut warnings = w.warnings.clone();
    let (h, dic) = solve_pair(k, w.ka, w.kb, w.pair, options, near_h, &mut warnings)?;
    Ok(Solution { h, dic, warnings })
}

/// h and DIC from a pair in its internal form, ordered by rank; notes go
/// to `warnings`. (Inlined into both callers, so that [`solve_near`]
/// costs what it did as one function.)
#[inline(always)]
fn solve_pair(
    k: &Constants,
    ka: WorkingValue,
    kb: WorkingValue,
    pair: Pair,
    options: &SolveOptions,
    near_h: f64,
    warnings: &mut Warnings,
) -> Result<(f64, f64)> {
    let warm = near_h > 0.0 && near_h.is_finite();
    let start = |cold: f64| if warm { near_h } else { cold };
    let (ma, mb) = (pair.a, pair.b);
    let k12 = k.k1e() * k.k2e();

    let (h, dic) = match (ka, kb) {
        (WorkingValue::Ta(ta), WorkingValue::Dic(dic)) => {
            let h = ta_root(
                k,
                &pair,
                ta,
                |h| {
                    let (c, dc) = carbonate_per_dic(k, h);
                    (dic * c, dic * dc)
                },
                start(carbonate_guess(k, ta, dic)),
            )?;
            (h, dic)
        }
        (WorkingValue::Ta(ta), WorkingValue::H(h)) => {
            let carb = ta - non_carbonate(k, h).0;
            if carb <= 0.0 {
                return Err(pair.no_water(format!(
                    "at this pH the non-carbonate alkalinity alone is {:.6} µmol/kg, so the \
                     carbonate alkalinity would be {:.6} µmol/kg, not positive",
                    (ta - carb) * 1e6,
                    carb * 1e6
                )));
            }
            (h, carb / carbonate_per_dic(k, h).0)
        }
        (WorkingValue::Ta(ta), WorkingValue::Co2(co2)) => {
            let h = ta_root(
                k,
                &pair,
                ta,
                |h| {
                    let v = co2 * (k.k1e() / h + 2.0 * k12 / (h * h));
                    (v, -co2 * (k.k1e() / (h * h) + 4.0 * k12 / (h * h * h)))
                },
                start(f64::NAN),
            )?;
            (h, co2 * dic_per_co2(k, h))
        }
        (WorkingValue::Ta(ta), WorkingValue::Hco3(hco3)) => {
            let h = ta_root(
                k,
                &pair,
                ta,
                |h| {
                    (
                        hco3 * (1.0 + 2.0 * k.k2e() / h),
                        -2.0 * hco3 * k.k2e() / (h * h),
                    )
                },
                start(f64::NAN),
            )?;
            (h, hco3 * dic_per_hco3(k, h))
        }
        (WorkingValue::Ta(ta), WorkingValue::Co3(co3)) => {
            let fits = |h: f64| h_in_range(h) && dic_in_range(co3 * dic_per_co3(k, h));
            let h = ta_co3_root(k, &pair, ta, co3, options, fits, warnings)?;
            (h, co3 * dic_per_co3(k, h))
        }
        (WorkingValue::Dic(dic), WorkingValue::H(h)) => (h, dic),
        (WorkingValue::Dic(dic), WorkingValue::Co2(co2)) => {
            let c = co2 / dic;
            if c >= 1.0 {
                return Err(pair.no_water("CO2* must be less than DIC".to_string()));
            }
            let disc = c * c * k.k1e() * k.k1e() + 4.0 * (1.0 - c) * c * k12;
            ((c * k.k1e() + disc.sqrt()) / (2.0 * (1.0 - c)), dic)
        }
        (WorkingValue::Dic(dic), WorkingValue::Hco3(hco3)) => {
            // The alkalinity at h is bounded by 2 DIC, every total and the
            // water terms; only where that bound is beyond the accepted range
            // is the alkalinity itself evaluated.
            let t = &k.totals();
            let totals = t.boron_mol_kg
                + t.silicate_mol_kg
                + t.ammonia_mol_kg
                + t.sulfide_mol_kg
                + 2.0 * t.phosphate_mol_kg
                + t.sulfate_mol_kg
                + t.fluoride_mol_kg;
            let fits = |h: f64| {
                let bound = 2.0 * dic + totals + k.kw() / h + h * k.free_per_working();
                h_in_range(h)
                    && (alkalinity_in_range(bound)
                        || alkalinity_in_range(
                            crate::speciation::alkalinity::parts(k, h, dic).total(),
                        ))
            };
            let h = dic_hco3_root(k, &pair, dic, hco3, options, fits, warnings)?;
            (h, dic)
        }
        (WorkingValue::Dic(dic), WorkingValue::Co3(co3)) => {
            let c = co3 / dic;
            if c >= 1.0 {
                return Err(pair.no_water("CO3 must be less than DIC".to_string()));
            }
            let disc = c * c * k.k1e() * k.k1e() + 4.0 * c * (1.0 - c) * k12;
            (2.0 * (1.0 - c) * k12 / (c * k.k1e() + disc.sqrt()), dic)
        }
        (WorkingValue::H(h), WorkingValue::Co2(co2)) => (h, co2 * dic_per_co2(k, h)),
        (WorkingValue::H(h), WorkingValue::Hco3(hco3)) => (h, hco3 * dic_per_hco3(k, h)),
        (WorkingValue::H(h), WorkingValue::Co3(co3)) => (h, co3 * dic_per_co3(k, h)),
        (WorkingValue::Co2(co2), WorkingValue::Hco3(hco3)) => {
            let h = k.k1e() * co2 / hco3;
            (h, co2 * dic_per_co2(k, h))
        }
        (WorkingValue::Co2(co2), WorkingValue::Co3(co3)) => {
            let h = (k12 * co2 / co3).sqrt();
            (h, co2 * dic_per_co2(k, h))
        }
        (WorkingValue::Hco3(hco3), WorkingValue::Co3(co3)) => {
            let h = k.k2e() * hco3 / co3;
            (h, hco3 * dic_per_hco3(k, h))
        }
        _ => {
            return Err(Error::IncompatiblePair {
                first: ma.parameter().field(),
                second: mb.parameter().field(),
                reason: "this pair is not supported",
            })
        }
    };
    if !h_in_range(h) || !dic.is_finite() || dic <= 0.0 {
        let ph = -crate::base::numeric::log10(h);
        return Err(pair.no_water(format!(
            "they imply a pH of {ph:.3} ({} scale), outside {PH_MIN} to {PH_MAX}",
            k.working_scale().name()
        )));
    }
    check_dic(&pair, dic)?;
    Ok((h, dic))
}

/// First guess for (TA, DIC): the root of the carbonate-only equation
/// TA h² + (TA − DIC) K1 h + (TA − 2 DIC) K1 K2 = 0. In sea water it lies
/// about 0.2 pH above the root, which Newton steps close in four
/// evaluations. Better guesses were tried (a fixed-point step for the
/// borate alkalinity, with Aitken's extrapolation): they save an
/// evaluation but cost more than one in square roots and divisions.
fn carbonate_guess(k: &Constants, ta: f64, dic: f64) -> f64 {
    carbonate_only_root(k, ta, dic)
}

/// The positive root h of TA h² + (TA − DIC) K1 h + (TA − 2 DIC) K1 K2 = 0,
/// or NaN where there is none (TA not between 0 and 2 DIC).
fn carbonate_only_root(k: &Constants, ta: f64, dic: f64) -> f64 {
    if ta <= 0.0 || ta >= 2.0 * dic {
        return f64::NAN;
    }
    let a = ta;
    let b = (ta - dic) * k.k1e();
    let c = (ta - 2.0 * dic) * k.k1e() * k.k2e();
    let disc = b * b - 4.0 * a * c;
    if disc < 0.0 {
        return f64::NAN;
    }
    // c < 0 so the positive root is (-b + sqrt(disc)) / 2a = 2c / (-b - sqrt(disc)).
    if b >= 0.0 {
        2.0 * c / (-b - disc.sqrt())
    } else {
        (-b + disc.sqrt()) / (2.0 * a)
    }
}

/// Root in h of carbonate(h) + non_carbonate(h) = ta, where the carbonate
/// part is decreasing in h (so the whole is decreasing, every
/// non-carbonate part being decreasing too). Newton steps are taken in
/// ln h (with h kept and updated without an exponential) and bisection in
/// ln h, and the ends of the pH range are evaluated only if the iteration
/// needs them ([`monotone_newton`]).
fn ta_root<C>(k: &Constants, pair: &Pair, ta: f64, carbonate: C, guess: f64) -> Result<f64>
where
    C: Fn(f64) -> (f64, f64),
{
    let f = |h: f64| {
        let (c, dc) = carbonate(h);
        let (n, dn) = non_carbonate(k, h);
        (c + n - ta, dc + dn)
    };
    let guess = if guess > 0.0 { guess } else { 1e-8 };
    let search = Search::new(H_AT_PH_MAX, H_AT_PH_MIN, true);
    match monotone_newton(f, &search, guess) {
        Ok(h) => Ok(h),
        Err(Failure::AtLo(_)) => Err(pair.no_water(format!(
            "the alkalinity is higher than any water with that {} can have below pH {PH_MAX}",
            pair.b.parameter().name()
        ))),
        Err(Failure::AtHi(_)) => Err(pair.no_water(format!(
            "the alkalinity is lower than any water with that {} can have above pH {PH_MIN}",
            pair.b.parameter().name()
        ))),
        Err(Failure::NoConvergence(n)) => Err(pair.no_convergence(n)),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn the_natural_root_is_the_one_nearer_ph_8() {
        let h = |ph: f64| 10f64.powf(-ph);
        // (higher pH, lower pH, the natural choice)
        for (high, low, natural) in [
            (10.35, 8.14, 8.14),
            (8.3, 6.0, 8.3),
            (9.5, 7.0, 7.0),
            (7.5, 6.0, 7.5),
            (11.0, 9.0, 9.0),
        ] {
            let (chosen, other) = by_root_policy(RootChoice::Natural, h(high), h(low));
            assert!((-chosen.log10() - natural).abs() < 1e-9, "{high}, {low}");
            assert!((-other.log10() - natural).abs() > 0.1);
            assert_eq!(
                by_root_policy(RootChoice::HigherPh, h(high), h(low)).0,
                h(high)
            );
            assert_eq!(
                by_root_policy(RootChoice::LowerPh, h(high), h(low)).0,
                h(low)
            );
        }
    }
}
