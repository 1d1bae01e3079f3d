//! The standard uncertainty of every computed quantity, from the
//! uncertainties of the inputs and of the equilibrium constants (issue 13):
//! linear (first-order) propagation with its error budget, and a Monte
//! Carlo check.
//!
//! - A [`Problem`] is one measured pair in one water (and, optionally, the
//!   air over it), solved by the one shared solver of [`crate::flow`].
//! - [`Uncertainties`] gives the standard uncertainty of each [`Source`]:
//!   an input of the list ([`Input`]: the two carbonate parameters,
//!   temperature, salinity or conductivity, a given ionic strength,
//!   calcium, the nutrient totals, the wind) or a
//!   constant ([`ConstantName`]), each absolute or relative ([`Size`]).
//!   The constants take published defaults unless switched off
//!   ([`Uncertainties::without_constants`]).
//! - [`propagate`] gives, for each quantity asked for, its standard
//!   uncertainty and each source's share of its variance; [`monte_carlo`]
//!   the empirical standard deviations of seeded normal draws.
//!
//! The quantities are given as a function of the [`State`], so that this
//! layer does not depend on the list of outputs below it;
//! [`crate::output::uncertainty`] applies both to every numeric output.
//!
//! **Derivatives.** Two ways, one result to the precision of the second:
//! - **On tangents** ([`propagate_quantities`], with quantities that can
//!   be read from a state of [`Tangents`], as the list of outputs can,
//!   [`crate::output::uncertainty::OutputQuantities`]): exact first
//!   derivatives. The constants and the state are computed once more on
//!   [`Tangent`] numbers, which carry their derivatives with respect to
//!   up to [`TANGENT_WIDTH`] sources through the same generic code that
//!   computes them on `f64` (forward-mode differentiation); the solver's
//!   unknowns h and DIC get theirs by implicit differentiation at its
//!   root. Covered: both media (the measurements, temperature,
//!   salinity, every constant, the measured totals, a TDS or ionic
//!   strength given, the wind), with or without air over the water (the
//!   water at equilibrium with the air is a second state on tangents),
//!   reported where it was measured, from [`TANGENTS_FROM`] sources on
//!   (with fewer, the differences are cheaper).
//! - **By differences** elsewhere (fewer sources, a reading of conductivity,
//!   another temperature or pressure, quantities given as a closure,
//!   [`propagate`], and the precipitation potential's row alone, a search
//!   over full solves, beside the exact rows of the other outputs):
//!   forward differences of solves,
//!   each source moved alone by a step of 10⁻⁶ of its scale (or its own
//!   uncertainty where that is smaller), each perturbed solve started from
//!   the unperturbed state's unknowns (its h, ionic strength, free calcium
//!   and saturation pH) and still run to the full tolerance of its
//!   searches; the constants are moved through their own methods
//!   ([`crate::medium::Constants::with_pk`] and the fresh basis's, as
//!   [`PreparedWater::with_constants_perturbed`]), so that every value
//!   derived from a constant follows it.
//!
//! The two agree to the truncation of the differences (about 10⁻⁶
//! relative; `tests/tangent_propagation.rs` compares every contribution
//! to every numeric output). DEVELOPERS.md ("Uncertainty") gives the
//! reasons, the error of each method and its cost.
//!
//! ```
//! use travertine::decisions::uncertainty::{propagate, Problem, Size, Uncertainties};
//! use travertine::sample::inputs::Input;
//! use travertine::{Conditions, Measured, Parameter, PhScale, Water};
//! let sea = Water::saline(Conditions::new(25.0, 35.0)?)?;
//! let problem = Problem::new(
//!     &sea,
//!     Measured::ph(8.05, Some(PhScale::Total))?,
//!     Measured::alkalinity_umol_kg(2300.0)?,
//! )?;
//! let u = Uncertainties::new()
//!     .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01))?
//!     .with_input(Input::Carbon(Parameter::Alkalinity), Size::Absolute(2.0))?;
//! let p = propagate(&problem, &u, |s, out| out.push(Some(s.pco2_uatm)))?;
//! let pco2 = &p.outputs[0];
//! assert!(pco2.u.unwrap() > 0.02 * pco2.value.unwrap()); // more than 2 %
//! let shares: f64 = p.budget(0).iter().map(|(_, f)| f).sum();
//! assert!((shares - 1.0).abs() < 1e-12);
//! # Ok::<(), travertine::Error>(())
//! ```

use crate::base::error::{Error, Result};
use crate::base::field::Field;
use crate::base::numeric::{Real, Tangent};
use crate::base::units::Amount;
use crate::flow::{PreparedWater, Scratch, Seeds, Unperturbed};
use crate::medium::ConstantName;
use crate::properties::scales::PhScale;
use crate::sample::air::Air;
use crate::sample::inputs::{Input, Total};
use crate::sample::measured::{Measured, Parameter};
use crate::sample::water::{Medium, Water};
use crate::sample::{Conditions, Conductivity};
use crate::solve::{Near, SolveOptions};
use crate::state::State;
use rand::SeedableRng;
use rand_distr::{Distribution, StandardNormal};

/// ln 10, to turn a relative uncertainty of a constant into one of its pK.
const LN_10: f64 = std::f64::consts::LN_10;

/// The size of a standard uncertainty.
///
/// ```
/// use travertine::decisions::uncertainty::Size;
/// assert_eq!(Size::Percent(2.0).of(2000.0), 40.0);
/// assert_eq!(Size::Absolute(0.01).of(8.1), 0.01);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum Size {
    /// In the unit of the source: pH units; µmol/kg (µmol/L for an amount
    /// given per litre) for the carbonate amounts, calcium and the
    /// nutrients; µatm for pCO2 and fCO2; ppm for xCO2; °C; practical
    /// salinity; µS/cm for a conductivity (at the sample temperature or at
    /// 25 °C, as the reading was given); mol/kg for an ionic strength; m/s
    /// for the wind. For a constant, in pK units, except the
    /// total boron, in µmol/kg.
    Absolute(f64),
    /// Per cent of the value (of K itself for a constant).
    Percent(f64),
}

impl Size {
    /// The absolute size for a value `x` (in the unit of the source).
    ///
    /// ```
    /// # use travertine::decisions::uncertainty::Size;
    /// assert!((Size::Percent(10.0).of(-3.0) - 0.3).abs() < 1e-15);
    /// ```
    pub fn of(self, x: f64) -> f64 {
        match self {
            Size::Absolute(u) => u,
            Size::Percent(p) => p / 100.0 * x.abs(),
        }
    }

    /// The number of the size: in the unit of [`Size::Absolute`], or %.
    pub(crate) fn number(self) -> f64 {
        match self {
            Size::Absolute(u) | Size::Percent(u) => u,
        }
    }
}

/// One source of uncertainty.
///
/// ```
/// use travertine::decisions::uncertainty::Source;
/// use travertine::medium::ConstantName;
/// use travertine::sample::inputs::Input;
/// assert_eq!(Source::Constant(ConstantName::K1).name(), "pK1");
/// assert_eq!(Source::Input(Input::Temperature).name(), "temperature");
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum Source {
    /// A measured input, named as in the list of inputs.
    Input(Input),
    /// An equilibrium constant (its pK), or the total boron.
    Constant(ConstantName),
}

impl Source {
    /// The name: the input's flag, or the constant as "pK1", "pKsp calcite",
    /// "total boron".
    ///
    /// ```
    /// # use travertine::decisions::uncertainty::Source;
    /// # use travertine::medium::ConstantName;
    /// assert_eq!(Source::Constant(ConstantName::BoronTotal).name(), "total boron");
    /// ```
    pub fn name(self) -> String {
        match self {
            Source::Input(i) => i.flag().to_string(),
            Source::Constant(ConstantName::BoronTotal) => "total boron".to_string(),
            Source::Constant(c) => format!("p{}", c.name()),
        }
    }
}

/// The inputs whose uncertainty can be propagated (besides the two
/// carbonate parameters of the pair, [`Input::Carbon`]).
///
/// The salinity, the conductivity and the ionic strength each count only
/// where the water was described by them:
/// - **salinity**: where it was given (not computed from a conductivity);
/// - **conductivity**: where the water was made from a reading
///   ([`Water::given_conductivity`]) that sets something: the salinity
///   (none given beside it) or, in fresh water, the ionic strength by its
///   specific conductance (Russell 1976). The moved reading goes through
///   the program's one path ([`crate::sample::Conductivity::specific_and_salinity`]),
///   so the salinity and the specific conductance follow it; a reading at
///   the sample temperature also follows a moved temperature;
/// - **ionic strength**: where a fresh water's ionic strength was given
///   and is the one used (no major ions, conductivity or TDS beside it);
/// - **TDS**: where a fresh water's ionic strength comes from its total
///   dissolved solids (Langelier 1936; no major ions or conductivity
///   beside it).
///
/// Elsewhere their uncertainty is refused with a typed error
/// ([`Error::IncompatiblePair`] naming the uncertainty and the input that
/// was given instead, or [`Error::Missing`]), rather than propagated as
/// zero.
pub const INPUT_SOURCES: &[Input] = &[
    Input::Temperature,
    Input::Salinity,
    Input::Conductivity,
    Input::IonicStrength,
    Input::Tds,
    Input::Total(Total::Calcium),
    Input::Total(Total::Phosphate),
    Input::Total(Total::Silicate),
    Input::Total(Total::Ammonia),
    Input::Total(Total::Sulfide),
    Input::Wind,
];

/// The constants whose uncertainty has a default (in sea water the first
/// eight, [`SALINE_DEFAULTS`]; in fresh water all but the total boron,
/// [`FRESH_DEFAULTS`]).
pub const CONSTANT_SOURCES: [ConstantName; 10] = [
    ConstantName::K0,
    ConstantName::K1,
    ConstantName::K2,
    ConstantName::Kb,
    ConstantName::Kw,
    ConstantName::KspCalcite,
    ConstantName::KspAragonite,
    ConstantName::BoronTotal,
    ConstantName::CaHco3Pair,
    ConstantName::CaCo3Pair,
];

/// The default standard uncertainties of the constants in sea water, from
/// Orr et al. (2018, Marine Chemistry 207:84–107), as
/// ../shared/reference/equations.md §12 gives them: the paper is verified
/// there \[V\], the values are from memory (unverified) \[M\]. pK in pK units,
/// the total boron in per cent.
///
/// ```
/// use travertine::decisions::uncertainty::{SALINE_DEFAULTS, Size};
/// use travertine::medium::ConstantName;
/// assert!(SALINE_DEFAULTS.contains(&(ConstantName::K1, Size::Absolute(0.0075))));
/// ```
pub const SALINE_DEFAULTS: [(ConstantName, Size); 8] = [
    (ConstantName::K0, Size::Absolute(0.002)),
    (ConstantName::K1, Size::Absolute(0.0075)),
    (ConstantName::K2, Size::Absolute(0.015)),
    (ConstantName::Kb, Size::Absolute(0.01)),
    (ConstantName::Kw, Size::Absolute(0.01)),
    (ConstantName::KspCalcite, Size::Absolute(0.02)),
    (ConstantName::KspAragonite, Size::Absolute(0.02)),
    (ConstantName::BoronTotal, Size::Percent(2.0)),
];

/// The default standard uncertainties of the thermodynamic constants of
/// fresh water (Plummer & Busenberg 1982 and the pure-water limits of the
/// sea-water fits), in pK units. These are the crate's stated defaults,
/// from memory (unverified): of the order of the scatter of those fits
/// about the measurements they were fitted to, and no smaller than the
/// sea-water values above. A fresh water's total boron is measured or
/// zero, so it has no default.
///
/// The calcium ion pairs, CaHCO3+ and CaCO3⁰ (association constants of
/// Plummer & Busenberg 1982, log K = 1.11 and 3.22 at 25 °C): 0.05 in
/// log K each, from memory (unverified): of the order of the differences
/// between published determinations of these two constants, which are
/// larger than the fit's scatter about its own measurements. They move
/// calcite and aragonite Ω, the free calcium and the Langelier index (and
/// a little the carbon balance, through K1e and K2e); in a water without
/// calcium they are not evaluated and change nothing.
///
/// ```
/// use travertine::decisions::uncertainty::{FRESH_DEFAULTS, Size};
/// use travertine::medium::ConstantName;
/// assert!(FRESH_DEFAULTS.contains(&(ConstantName::K2, Size::Absolute(0.02))));
/// assert!(FRESH_DEFAULTS.contains(&(ConstantName::CaCo3Pair, Size::Absolute(0.05))));
/// ```
pub const FRESH_DEFAULTS: [(ConstantName, Size); 9] = [
    (ConstantName::K0, Size::Absolute(0.005)),
    (ConstantName::K1, Size::Absolute(0.01)),
    (ConstantName::K2, Size::Absolute(0.02)),
    (ConstantName::Kb, Size::Absolute(0.01)),
    (ConstantName::Kw, Size::Absolute(0.01)),
    (ConstantName::KspCalcite, Size::Absolute(0.02)),
    (ConstantName::KspAragonite, Size::Absolute(0.02)),
    (ConstantName::CaHco3Pair, Size::Absolute(0.05)),
    (ConstantName::CaCo3Pair, Size::Absolute(0.05)),
];

/// The standard uncertainties of the sources: the inputs given, and the
/// constants (their defaults for the medium, each of which can be set; or
/// none at all).
///
/// ```
/// use travertine::decisions::uncertainty::{Size, Uncertainties};
/// use travertine::medium::ConstantName;
/// use travertine::sample::inputs::Input;
/// let u = Uncertainties::new()
///     .with_input(Input::Temperature, Size::Absolute(0.1))?
///     .with_constant(ConstantName::K1, Size::Absolute(0.01))?;
/// assert!(u.with_input(Input::Temperature, Size::Absolute(-1.0)).is_err());
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq, Default)]
pub struct Uncertainties {
    inputs: Vec<(Input, Size)>,
    constants: Vec<(ConstantName, Size)>,
    constants_off: bool,
}

impl Uncertainties {
    /// No input uncertainty, and the default uncertainties of the
    /// constants ([`SALINE_DEFAULTS`], [`FRESH_DEFAULTS`]).
    ///
    /// ```
    /// # use travertine::decisions::uncertainty::Uncertainties;
    /// assert_eq!(Uncertainties::new(), Uncertainties::default());
    /// ```
    pub fn new() -> Self {
        Self::default()
    }

    /// With the standard uncertainty of an input (replacing one given
    /// before): a carbonate parameter ([`Input::Carbon`]) or one of
    /// [`INPUT_SOURCES`].
    ///
    /// # Errors
    /// [`Error::UnknownChoice`] for an input whose uncertainty is not
    /// propagated; [`Error::OutOfRange`] or [`Error::NotFinite`] for a
    /// size that is negative or not finite.
    ///
    /// ```
    /// # use travertine::decisions::uncertainty::{Size, Uncertainties};
    /// # use travertine::sample::inputs::Input;
    /// assert!(Uncertainties::new().with_input(Input::Pressure, Size::Absolute(1.0)).is_err());
    /// ```
    pub fn with_input(mut self, input: Input, size: Size) -> Result<Self> {
        if !(matches!(input, Input::Carbon(_)) || INPUT_SOURCES.contains(&input)) {
            let mut accepted = vec!["the two carbonate parameters".to_string()];
            accepted.extend(INPUT_SOURCES.iter().map(|i| i.flag().to_string()));
            return Err(Error::UnknownChoice {
                field: Field::Uncertainty,
                name: input.flag().to_string(),
                accepted: accepted.join(", "),
            });
        }
        check_size(size)?;
        self.inputs.retain(|(i, _)| *i != input);
        self.inputs.push((input, size));
        Ok(self)
    }

    /// With the standard uncertainty of a constant, replacing its default.
    ///
    /// # Errors
    /// As [`Uncertainties::with_input`] for the size.
    ///
    /// ```
    /// # use travertine::decisions::uncertainty::{Size, Uncertainties};
    /// # use travertine::medium::ConstantName;
    /// assert!(Uncertainties::new().with_constant(ConstantName::K2, Size::Percent(f64::NAN)).is_err());
    /// ```
    pub fn with_constant(mut self, constant: ConstantName, size: Size) -> Result<Self> {
        check_size(size)?;
        self.constants.retain(|(c, _)| *c != constant);
        self.constants.push((constant, size));
        Ok(self)
    }

    /// The inputs given, each with its size, in the order given.
    ///
    /// ```
    /// # use travertine::decisions::uncertainty::{Size, Uncertainties};
    /// # use travertine::sample::inputs::Input;
    /// let u = Uncertainties::new().with_input(Input::Temperature, Size::Absolute(0.1))?;
    /// assert_eq!(u.inputs(), &[(Input::Temperature, Size::Absolute(0.1))]);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn inputs(&self) -> &[(Input, Size)] {
        &self.inputs
    }

    /// Without the default uncertainties of the constants: only the
    /// constants set ([`Uncertainties::with_constant`], before or after)
    /// count.
    ///
    /// ```
    /// # use travertine::decisions::uncertainty::{Size, Uncertainties};
    /// # use travertine::medium::ConstantName;
    /// # use travertine::Medium;
    /// assert_ne!(Uncertainties::new().without_constants(), Uncertainties::new());
    /// assert!(Uncertainties::new().without_constants().constants_in(Medium::Saline).is_empty());
    /// let only_k1 = Uncertainties::new().without_constants().with_constant(ConstantName::K1, Size::Absolute(0.01))?;
    /// assert_eq!(only_k1.constants_in(Medium::Saline), vec![(ConstantName::K1, Size::Absolute(0.01))]);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn without_constants(mut self) -> Self {
        self.constants_off = true;
        self
    }

    /// The size of each constant's uncertainty in `medium`: the defaults
    /// (unless switched off, [`Uncertainties::without_constants`]),
    /// overridden by those set.
    ///
    /// ```
    /// # use travertine::decisions::uncertainty::Uncertainties;
    /// # use travertine::Medium;
    /// assert_eq!(Uncertainties::new().constants_in(Medium::Saline).len(), 8);
    /// assert!(Uncertainties::new().without_constants().constants_in(Medium::Fresh).is_empty());
    /// ```
    pub fn constants_in(&self, medium: Medium) -> Vec<(ConstantName, Size)> {
        // Sized once (a filtered collection would grow on the way).
        let mut all = Vec::with_capacity(self.defaults_in(medium).len() + self.constants.len());
        all.extend(self.constants_of(medium));
        all
    }

    /// The defaults of the constants in `medium` (none where they are
    /// switched off).
    fn defaults_in(&self, medium: Medium) -> &'static [(ConstantName, Size)] {
        match (self.constants_off, medium) {
            (true, _) => &[],
            (false, Medium::Saline) => &SALINE_DEFAULTS,
            (false, Medium::Fresh) => &FRESH_DEFAULTS,
        }
    }

    /// [`Uncertainties::constants_in`], one at a time (without a list).
    fn constants_of(&self, medium: Medium) -> impl Iterator<Item = (ConstantName, Size)> + '_ {
        self.defaults_in(medium)
            .iter()
            .filter(|(c, _)| !self.constants.iter().any(|(d, _)| d == c))
            .chain(&self.constants)
            .copied()
    }
}

fn check_size(size: Size) -> Result<()> {
    let v = size.number();
    if !v.is_finite() {
        return Err(Error::NotFinite {
            field: Field::Uncertainty,
            value: v,
        });
    }
    crate::base::error::check_range(Field::Uncertainty, v, 0.0, f64::MAX, "").map(|_| ())
}

/// One measured pair in one water, to propagate uncertainties through: the
/// water prepared once, the pair, the solve options, and optionally the air
/// over the water (for the exchange figures and the wind's uncertainty).
///
/// ```
/// use travertine::decisions::uncertainty::Problem;
/// use travertine::{Conditions, Measured, Water};
/// let pond = Water::fresh(Conditions::new(18.0, 0.2)?)?;
/// let p = Problem::new(&pond, Measured::ph(7.6, None)?, Measured::alkalinity_umol_kg(1500.0)?)?;
/// assert!((p.solve()?.ph_nbs - 7.6).abs() < 1e-12);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone)]
pub struct Problem {
    prepared: PreparedWater,
    a: Measured,
    b: Measured,
    options: SolveOptions,
    air: Option<(Air, Option<PhScale>)>,
    reported_at: Option<ReportedAt>,
}

/// The conditions a [`Problem`]'s states are reported at, where they are
/// not those of the measurement ([`Problem::reported_at`]).
#[derive(Debug, Clone, Copy, PartialEq)]
struct ReportedAt {
    temperature_c: Option<f64>,
    pressure_dbar: Option<f64>,
}

impl Problem {
    /// The pair `a`, `b` in `water`, with default options (the comparison
    /// with the other medium off: it changes no number).
    ///
    /// # Errors
    /// As [`Water::prepare`].
    pub fn new(water: &Water, a: Measured, b: Measured) -> Result<Self> {
        Ok(Problem::from_prepared(water.prepare_with_slopes()?, a, b))
    }

    /// The pair `a`, `b` in a water already prepared (its constants made),
    /// as [`Problem::new`] of that water gives it without preparing it
    /// again: for a caller that has solved the water itself (the sheet's
    /// rows, which keep the last row's prepared water). The constants are
    /// taken as they are: a water whose constants were moved
    /// ([`PreparedWater::with_constants_perturbed`]) is propagated about
    /// those moved constants, not the published ones.
    ///
    /// ```
    /// use travertine::decisions::uncertainty::Problem;
    /// use travertine::{Conditions, Measured, Water};
    /// let pond = Water::fresh(Conditions::new(18.0, 0.2)?)?;
    /// let (ph, ta) = (Measured::ph(7.6, None)?, Measured::alkalinity_umol_kg(1500.0)?);
    /// let p = Problem::from_prepared(pond.prepare()?, ph, ta);
    /// assert_eq!(p.solve()?, Problem::new(&pond, ph, ta)?.solve()?);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn from_prepared(prepared: PreparedWater, a: Measured, b: Measured) -> Self {
        Problem {
            prepared,
            a,
            b,
            options: SolveOptions::default().with_media_comparison(false),
            air: None,
            reported_at: None,
        }
    }

    /// With these solve options (the comparison of media stays off).
    ///
    /// ```
    /// # use travertine::decisions::uncertainty::Problem;
    /// # use travertine::{Conditions, Measured, SolveOptions, Water};
    /// let sea = Water::saline(Conditions::new(25.0, 35.0)?)?;
    /// let p = Problem::new(&sea, Measured::dic_umol_kg(2000.0)?, Measured::alkalinity_umol_kg(2300.0)?)?
    ///     .with_options(SolveOptions::default());
    /// assert!(p.solve().is_ok());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_options(mut self, options: SolveOptions) -> Self {
        self.options = options.with_media_comparison(false);
        self
    }

    /// With the air over the water: every solve adds the exchange
    /// ([`PreparedWater::with_exchange`]), its equilibrium pH on
    /// `ph_scale` (`None`: the medium's own).
    ///
    /// ```
    /// # use travertine::decisions::uncertainty::Problem;
    /// # use travertine::{sample::air::Air, Conditions, Measured, Water};
    /// let pond = Water::fresh(Conditions::new(18.0, 0.2)?)?;
    /// let p = Problem::new(&pond, Measured::ph(7.6, None)?, Measured::alkalinity_umol_kg(1500.0)?)?
    ///     .with_air(Air::new().with_wind_m_s(4.0)?, None);
    /// assert!(p.solve()?.exchange.unwrap().co2_flux_mmol_m2_d.is_some());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_air(mut self, air: Air, ph_scale: Option<PhScale>) -> Self {
        self.air = Some((air, ph_scale));
        self
    }

    /// With every state reported at another temperature and/or pressure
    /// (`None`: the measurement's), as [`State::at_with`] moves it: the
    /// alkalinity, DIC and totals kept, the state solved again there (for
    /// example a pH measured in the laboratory at 25 °C, its water reported
    /// at the 9 °C and 120 dbar it was sampled at). The uncertainties are
    /// then those of the state reported: each perturbed state is solved as
    /// measured and moved, its salinity with it; a constant perturbed is
    /// perturbed by the same pK at both conditions (the error of a fit
    /// taken as systematic), and the reporting conditions are taken as
    /// exact. Each perturbed solve is a full one (no warm start, no lean
    /// state).
    ///
    /// ```
    /// use travertine::decisions::uncertainty::{propagate, Problem, Size, Uncertainties};
    /// use travertine::sample::inputs::Input;
    /// use travertine::{Conditions, Measured, Parameter, PhScale, Water};
    /// let lab = Water::saline(Conditions::new(25.0, 35.0)?)?;
    /// let (ph, ta) = (Measured::ph(7.9, Some(PhScale::Total))?, Measured::alkalinity_umol_kg(2300.0)?);
    /// let p = Problem::new(&lab, ph, ta)?.reported_at(Some(9.0), Some(120.0));
    /// assert_eq!(p.solve()?.temperature_c, 9.0);
    /// let u = Uncertainties::new().with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01))?;
    /// let r = propagate(&p, &u, |s, out| out.push(s.omega_calcite))?;
    /// assert!(r.outputs[0].u.unwrap() > 0.0);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn reported_at(mut self, temperature_c: Option<f64>, pressure_dbar: Option<f64>) -> Self {
        self.reported_at =
            (temperature_c.is_some() || pressure_dbar.is_some()).then_some(ReportedAt {
                temperature_c,
                pressure_dbar,
            });
        self
    }

    /// The medium of the water.
    ///
    /// ```
    /// # use travertine::decisions::uncertainty::Problem;
    /// # use travertine::{Conditions, Measured, Medium, Water};
    /// let lake = Water::fresh(Conditions::new(20.0, 0.1)?)?;
    /// let p = Problem::new(&lake, Measured::ph(7.6, None)?, Measured::alkalinity_umol_kg(900.0)?)?;
    /// assert_eq!(p.medium(), Medium::Fresh);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn medium(&self) -> Medium {
        self.prepared.water().medium()
    }

    /// The temperature (°C) and pressure (dbar) the states are reported at,
    /// where [`Problem::reported_at`] moved them (`None` within: the
    /// measurement's).
    ///
    /// ```
    /// # use travertine::decisions::uncertainty::Problem;
    /// # use travertine::{Conditions, Measured, Water};
    /// let lake = Water::fresh(Conditions::new(20.0, 0.1)?)?;
    /// let p = Problem::new(&lake, Measured::ph(7.6, None)?, Measured::alkalinity_umol_kg(900.0)?)?;
    /// assert_eq!(p.reporting_conditions(), None);
    /// assert_eq!(p.reported_at(Some(6.0), None).reporting_conditions(), Some((Some(6.0), None)));
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn reporting_conditions(&self) -> Option<(Option<f64>, Option<f64>)> {
        self.reported_at.map(|r| (r.temperature_c, r.pressure_dbar))
    }

    /// `state`, solved at the measurement's conditions, moved to the
    /// reporting conditions with `constants` perturbed there too; itself
    /// where there are none.
    fn reported(&self, state: State, constants: &[(ConstantName, f64)]) -> Result<State> {
        let Some(at) = self.reported_at else {
            return Ok(state);
        };
        let mut c = *state.water_sample().conditions();
        if let Some(t) = at.temperature_c {
            c = c.with_temperature_c(t)?;
        }
        if let Some(p) = at.pressure_dbar {
            c = c.with_pressure_dbar(p)?;
        }
        state.at_perturbed(c, &self.options, constants)
    }

    /// The state, unperturbed.
    ///
    /// # Errors
    /// As [`PreparedWater::solve`] and [`PreparedWater::with_exchange`].
    pub fn solve(&self) -> Result<State> {
        self.realise(&[], &Near::default())
    }

    /// The state, unperturbed, as [`Problem::solve`] gives it but lean
    /// where no air is over the water ([`PreparedWater::solve_lean`]: every
    /// number the same, no warnings): the propagation reads only numbers.
    fn solve_numbers(&self) -> Result<State> {
        match (self.air, self.reported_at) {
            (Some(_), _) | (_, Some(_)) => self.solve(),
            (None, None) => {
                self.prepared
                    .solve_lean(self.a, self.b, &self.options, &Near::default())
            }
        }
    }

    /// The value of an input source in its unit (see [`Size::Absolute`]),
    /// or of a constant's pK (the total boron in µmol/kg).
    fn value_of(&self, source: Source) -> Result<f64> {
        let water = self.prepared.water();
        let c = water.conditions();
        Ok(match source {
            Source::Input(Input::Carbon(p)) if p == self.a.parameter() => self.a.number(),
            Source::Input(Input::Carbon(p)) if p == self.b.parameter() => self.b.number(),
            Source::Input(Input::Carbon(p)) => {
                return Err(Error::UnknownChoice {
                    field: Field::Uncertainty,
                    name: p.name().to_string(),
                    accepted: format!(
                        "the parameters measured, {} and {}",
                        self.a.parameter().name(),
                        self.b.parameter().name()
                    ),
                })
            }
            Source::Input(Input::Temperature) => c.temperature_c(),
            Source::Input(Input::Salinity) => {
                if water.given_conductivity().is_some_and(|g| g.sets_salinity) {
                    return Err(Error::IncompatiblePair {
                        first: Field::Uncertainty,
                        second: Field::Salinity,
                        reason: "the salinity was computed from the conductivity, so its \
                                 uncertainty comes from the conductivity's: give that \
                                 (conductivity=2% or conductivity=10uS/cm)",
                    });
                }
                c.salinity()
            }
            Source::Input(Input::Conductivity) => {
                let Some(given) = water.given_conductivity() else {
                    return Err(Error::Missing {
                        field: Field::Conductivity,
                        why: "; an uncertainty of the conductivity needs a water described by a \
                              conductivity reading: give the uncertainty of the salinity or \
                              ionic strength it was described by instead",
                    });
                };
                let sets_ionic_strength = water.medium() == Medium::Fresh
                    && crate::medium::fresh::ionic::route(water)
                        == crate::medium::IonicStrengthRoute::SpecificConductance;
                if !given.sets_salinity && !sets_ionic_strength {
                    return Err(Error::IncompatiblePair {
                        first: Field::Uncertainty,
                        second: Field::Conductivity,
                        reason: "the conductivity sets nothing in this water (the salinity was \
                                 given beside it, and the ionic strength comes from elsewhere): \
                                 give the uncertainty of the salinity instead",
                    });
                }
                given.reading.us_cm()
            }
            Source::Input(Input::IonicStrength) => routed(
                water,
                water.fresh_options().ionic_strength,
                crate::medium::IonicStrengthRoute::Given,
                Field::IonicStrength,
                "the ionic strength given is not the one used (the major ions, a conductivity \
                 or the TDS set it): give the uncertainty of what sets it",
                "; an uncertainty of the ionic strength needs a fresh water whose ionic \
                 strength was given (--ionic-strength)",
            )?,
            Source::Input(Input::Tds) => routed(
                water,
                water.fresh_options().tds_mg_l,
                crate::medium::IonicStrengthRoute::Tds,
                Field::Tds,
                "the TDS given is not what sets the ionic strength (the major ions or a \
                 conductivity do): give the uncertainty of what sets it",
                "; an uncertainty of the TDS needs a fresh water whose ionic strength comes \
                 from a TDS (--tds)",
            )?,
            Source::Input(Input::Wind) => {
                self.air
                    .as_ref()
                    .and_then(|(a, _)| a.wind_m_s())
                    .ok_or(Error::Missing {
                        field: Field::Wind,
                        why: "; an uncertainty of the wind speed needs the wind speed it is the \
                          uncertainty of (--wind; with a k600 given instead, the wind moves \
                          nothing)",
                    })?
            }
            Source::Input(Input::Total(t)) => total_umol_kg(&self.prepared, t),
            Source::Input(other) => {
                return Err(Error::UnknownChoice {
                    field: Field::Uncertainty,
                    name: other.flag().to_string(),
                    accepted: INPUT_SOURCES
                        .iter()
                        .map(|i| i.flag())
                        .collect::<Vec<_>>()
                        .join(", "),
                })
            }
            Source::Constant(ConstantName::BoronTotal) => self.prepared.totals().boron_mol_kg * 1e6,
            Source::Constant(_) => 0.0,
        })
    }

    /// The problem with each source moved by its shift (in the unit of
    /// [`Size::Absolute`]; constants in pK units, the total boron too,
    /// as log10 of its factor): the water prepared again where its
    /// conditions, composition or constants moved (`None` where none did),
    /// the pair and the air.
    fn shifted(&self, shifts: &[(Source, f64)]) -> Result<Shifted> {
        let base = self.prepared.water();
        let mut water_changed = false;
        let mut c = *base.conditions();
        let mut composition = *base.composition();
        let mut fresh = *base.fresh_options();
        // The conductivity reading, where the water was described by one,
        // and whether it (or the temperature of a reading at the sample
        // temperature) moved.
        let given = base.given_conductivity();
        let mut reading = given.map(|g| g.reading);
        let mut reading_moved = false;
        let (mut a, mut b) = (self.a, self.b);
        let mut air = self.air;
        for &(source, d) in shifts {
            if d == 0.0 {
                continue;
            }
            match source {
                Source::Input(Input::Carbon(p)) if p == a.parameter() => {
                    a = a.with_number(self.a.number() + d)?
                }
                Source::Input(Input::Carbon(p)) if p == b.parameter() => {
                    b = b.with_number(self.b.number() + d)?
                }
                Source::Input(Input::Temperature) => {
                    c = c.with_temperature_c(c.temperature_c() + d)?;
                    if matches!(reading, Some(Conductivity::AtTemperature { .. })) {
                        reading_moved = true;
                    }
                    water_changed = true;
                }
                Source::Input(Input::Salinity) => {
                    c = with_salinity(&c, c.salinity() + d)?;
                    water_changed = true;
                }
                Source::Input(Input::Conductivity) => {
                    reading = reading.map(|r| r.with_us_cm(r.us_cm() + d));
                    reading_moved = true;
                    water_changed = true;
                }
                Source::Input(Input::IonicStrength) => {
                    fresh.ionic_strength = fresh.ionic_strength.map(|i| i + d);
                    water_changed = true;
                }
                Source::Input(Input::Tds) => {
                    fresh.tds_mg_l = fresh.tds_mg_l.map(|t| t + d);
                    water_changed = true;
                }
                Source::Input(Input::Wind) => {
                    if let Some((air, _)) = &mut air {
                        let wind = air.wind_m_s().unwrap_or(0.0) + d;
                        *air = air.with_wind_m_s(wind)?;
                    }
                }
                Source::Input(Input::Total(t)) => {
                    let x = Amount::PerKg(total_of(self.prepared.totals(), t) + d * 1e-6);
                    composition = match t {
                        Total::Calcium => composition.with_calcium(x)?,
                        Total::Phosphate => composition.with_phosphate(x)?,
                        Total::Silicate => composition.with_silicate(x)?,
                        Total::Ammonia => composition.with_ammonia(x)?,
                        _ => composition.with_sulfide(x)?,
                    };
                    water_changed = true;
                }
                _ => {}
            }
        }
        // A moved reading goes through the program's one path from a
        // conductivity to a water, as `Sample::water` takes it.
        let mut moved_spc = None;
        if let (true, Some(r), Some(g)) = (reading_moved, reading, given) {
            let (spc, s) = r.specific_and_salinity(c.temperature_c())?;
            if g.sets_salinity {
                c = with_salinity(&c, s)?;
            }
            if base.medium() == Medium::Fresh {
                moved_spc = Some(spc);
            }
        }
        // The prepared water is copied only where something in it moves.
        let mut prepared = if water_changed {
            let mut w = base
                .at(c)?
                .with_composition(composition)
                .with_fresh_options(fresh);
            if let Some(spc) = moved_spc {
                w = w.with_specific_conductance_us_cm(spc)?;
            }
            if let Some(i) = fresh
                .ionic_strength
                .filter(|_| base.medium() == Medium::Fresh)
            {
                w = w.with_ionic_strength(i)?;
            }
            if let Some(t) = fresh.tds_mg_l.filter(|_| base.medium() == Medium::Fresh) {
                w = w.with_tds_mg_l(t)?;
            }
            // Constants the prepared water had moved are moved again.
            Some(w.prepare_moved(self.prepared.moves())?)
        } else {
            None
        };
        for &(source, d) in shifts {
            if let (Source::Constant(k), true) = (source, d != 0.0) {
                let from = prepared.as_ref().unwrap_or(&self.prepared);
                prepared = Some(from.with_constants_perturbed(k, d)?);
            }
        }
        Ok(Shifted {
            prepared,
            a,
            b,
            air,
        })
    }

    /// The state with each source moved by its shift (as
    /// [`Problem::shifted`]), its searches started from `near` (the
    /// unperturbed state's unknowns, or none).
    fn realise(&self, shifts: &[(Source, f64)], near: &Near) -> Result<State> {
        let Shifted {
            prepared,
            a,
            b,
            air,
        } = self.shifted(shifts)?;
        let prepared = prepared.as_ref().unwrap_or(&self.prepared);
        let state = prepared.solve_near(a, b, &self.options, near)?;
        let state = if self.reported_at.is_some() {
            // Every constant moved, the water's own and the step's, as
            // the prepared water records them.
            self.reported(state, prepared.moves())?
        } else {
            state
        };
        match &air {
            Some((air, scale)) => prepared.with_exchange(state, air, *scale),
            None => Ok(state),
        }
    }

    /// The solve options.
    pub(crate) fn options(&self) -> &SolveOptions {
        &self.options
    }

    /// The water and the pair with each source moved by its
    /// shift (as [`Problem::shifted`]), not yet solved, the water prepared
    /// even where nothing in it moved; for a quantity that needs more than
    /// the state (the dose, [`crate::decisions::dose_uncertainty`]).
    pub(crate) fn moved(&self, shifts: &[(Source, f64)]) -> Result<Moved> {
        let Shifted {
            prepared,
            a,
            b,
            air: _,
        } = self.shifted(shifts)?;
        Ok(Moved {
            prepared: prepared.unwrap_or_else(|| self.prepared.clone()),
            a,
            b,
        })
    }

    /// Whether `source` is a constant of a system this water does not have
    /// (its total zero: KB and the total boron without boron, the ion
    /// pairs and the solubility products without calcium, the phosphate,
    /// silicate, ammonium, sulfide, bisulfate and fluoride constants
    /// without their totals; the ion pairs in saline water, where they are
    /// zero). Such a constant moves no output, so its contributions are
    /// zero without a solve (a test compares this with the constant
    /// perturbed and solved again).
    pub(crate) fn moves_nothing(&self, source: Source) -> bool {
        let t = self.prepared.totals();
        let Source::Constant(k) = source else {
            return false;
        };
        let total = match k {
            ConstantName::Kb | ConstantName::BoronTotal => t.boron_mol_kg,
            ConstantName::CaHco3Pair | ConstantName::CaCo3Pair
                if self.prepared.water().medium() == Medium::Saline =>
            {
                0.0
            }
            ConstantName::CaHco3Pair
            | ConstantName::CaCo3Pair
            | ConstantName::KspCalcite
            | ConstantName::KspAragonite => t.calcium_mol_kg,
            ConstantName::Kp1 | ConstantName::Kp2 | ConstantName::Kp3 => t.phosphate_mol_kg,
            ConstantName::Ksi => t.silicate_mol_kg,
            ConstantName::Knh4 => t.ammonia_mol_kg,
            ConstantName::Kh2s => t.sulfide_mol_kg,
            ConstantName::Ks => t.sulfate_mol_kg,
            ConstantName::Kf => t.fluoride_mol_kg,
            _ => return false,
        };
        total == 0.0
    }

    /// Whether either measured parameter is a gas-phase one (pCO2, fCO2,
    /// xCO2), whose solve reads K0.
    fn pair_in_gas(&self) -> bool {
        [self.a, self.b].iter().any(|m| {
            matches!(
                m.parameter(),
                Parameter::Pco2 | Parameter::Fco2 | Parameter::Xco2
            )
        })
    }

    /// The state with one source moved by `d`, for a derivative (`base`:
    /// the unperturbed state): as [`Problem::realise`], but lean where no air is over the water (every
    /// number the same, no warnings: [`PreparedWater::solve_lean`]), and a
    /// constant perturbed in `scratch` (made at the first constant) rather
    /// than in a new prepared water.
    fn realise_one(
        &self,
        source: Source,
        d: f64,
        base: &State,
        near: &Near,
        scratch: &mut Option<Scratch>,
    ) -> Result<State> {
        match (source, base.medium) {
            (
                Source::Constant(k @ (ConstantName::KspCalcite | ConstantName::KspAragonite)),
                Medium::Saline,
            )
            | (Source::Constant(k @ ConstantName::KspAragonite), Medium::Fresh) => {
                return Ok(base.with_pksp_moved(k == ConstantName::KspAragonite, d));
            }
            (Source::Constant(ConstantName::K0), _)
                if self.air.is_none() && base.exchange.is_none() && !self.pair_in_gas() =>
            {
                return Ok(base.with_pk0_moved(d));
            }
            _ => {}
        }
        if self.reported_at.is_some() {
            // The unperturbed unknowns are those of the state reported, not
            // of the measurement: a cold start.
            return self.realise(&[(source, d)], &Near::default());
        }
        if self.air.is_some() {
            return self.realise(&[(source, d)], near);
        }
        if let Source::Constant(k) = source {
            let (a, b, options) = (self.a, self.b, &self.options);
            return self.prepared.solve_lean_perturbed(
                scratch.get_or_insert_with(|| self.prepared.scratch()),
                k,
                d,
                a,
                b,
                options,
                near,
            );
        }
        let moved = self.shifted(&[(source, d)])?;
        let prepared = moved.prepared.as_ref().unwrap_or(&self.prepared);
        prepared.solve_lean(moved.a, moved.b, &self.options, near)
    }
}

impl Problem {
    /// The columns of the sources this pass on tangents covers (see
    /// [`propagate_quantities`]), filled in `contributions` (a row of
    /// `sources.len()` per quantity of `base`); `true` for each column
    /// filled. A column whose derivative is not finite for a quantity with
    /// a value is left to the differences. A quantity with a value but
    /// none on tangents (the precipitation potential, a search over full
    /// solves the pass does not make) is marked in `apart`: its row is
    /// left to the differences, for every source, and the other rows keep
    /// their exact derivatives.
    fn tangent_columns<Q: Quantities>(
        &self,
        base_state: &State,
        sources: &[(Source, f64, f64)],
        quantities: &mut Q,
        base: &[Option<f64>],
        contributions: &mut [f64],
        apart: &mut [bool],
    ) -> Vec<bool> {
        let m = sources.len();
        let mut done = vec![false; m];
        if !self.on_tangents() {
            return done;
        }
        let covered = self.covered(sources);
        if covered.len() < TANGENTS_FROM {
            return done;
        }
        let per_pass = TANGENT_WIDTH;
        for chunk in covered.chunks(per_pass) {
            let seeds = self.seeds(chunk.iter().copied().enumerate(), sources);
            let mut us = [0.0; TANGENT_WIDTH];
            for (u, &j) in us.iter_mut().zip(chunk) {
                *u = sources[j].1;
            }
            let width = chunk.len();
            // The usual case: the chunk's columns are side by side.
            let first = chunk.first().copied().unwrap_or(0);
            let side_by_side = chunk.iter().enumerate().all(|(i, &j)| j == first + i);
            // Row by row, as the reader gives each quantity (its
            // derivatives lie together), on the state where it lies.
            let mut k = 0;
            // NaN in a slot whose derivative is not finite for a quantity
            // with a value (c · 0 is 0 for a finite c, NaN otherwise), found
            // as the rows are written, all slots at once.
            let mut not_finite = [0.0; TANGENT_WIDTH];
            let mut each = |t: Option<&Tangents>| {
                let (Some(Some(_)), Some(row)) =
                    (base.get(k), contributions.get_mut(k * m..(k + 1) * m))
                else {
                    k += 1;
                    return;
                };
                k += 1;
                let Some(t) = t else {
                    if let Some(x) = apart.get_mut(k - 1) {
                        *x = true;
                    }
                    return;
                };
                let mut c = [0.0; TANGENT_WIDTH];
                contributions_of(t, &us, &mut c);
                for (z, c) in not_finite.iter_mut().zip(&c) {
                    *z += c * 0.0;
                }
                match row.get_mut(first..first + width) {
                    Some(cols) if side_by_side => cols.copy_from_slice(&c[..width]),
                    _ => {
                        for (&j, c) in chunk.iter().zip(&c) {
                            if let Some(x) = row.get_mut(j) {
                                *x = *c;
                            }
                        }
                    }
                }
            };
            let read = self.prepared.solve_tangent(
                Unperturbed::State(base_state),
                &self.a,
                &self.b,
                &seeds,
                self.air_over(),
                |state| quantities.read_tangent(state, &mut each),
            );
            // A column lost or not finite for a quantity with a value is
            // left to the differences.
            let whole = matches!(read, Some(Ok(true))) && k == base.len();
            for (slot, &j) in chunk.iter().enumerate() {
                if !(whole && not_finite[slot] == 0.0) {
                    for row in contributions.chunks_exact_mut(m) {
                        row[j] = 0.0;
                    }
                } else {
                    done[j] = true;
                }
            }
        }
        done
    }
}

impl Problem {
    /// Whether a pass on tangents applies to this problem at all (see
    /// [`propagate_quantities`]).
    fn on_tangents(&self) -> bool {
        self.reported_at.is_none()
    }

    /// The air over the water, where the problem has one, and the pH scale
    /// of its water at equilibrium.
    fn air_over(&self) -> Option<(&Air, Option<PhScale>)> {
        self.air.as_ref().map(|(air, scale)| (air, *scale))
    }

    /// The sources a pass on tangents can seed, by their place in `sources`.
    fn covered(&self, sources: &[(Source, f64, f64)]) -> smallvec::SmallVec<[usize; 24]> {
        let water = self.prepared.water();
        let fresh = water.medium() == Medium::Fresh;
        // Found once, not at every source.
        let calcium = self.prepared.totals().calcium_mol_kg > 0.0;
        let no_reading = water.given_conductivity().is_none();
        let mut covered = smallvec::SmallVec::new();
        // A plain loop: a filtered iterator is not made inline here.
        for (j, &(source, _, _)) in sources.iter().enumerate() {
            let covers = !self.moves_nothing(source)
                && match source {
                    Source::Input(Input::Carbon(p)) => {
                        p == self.a.parameter() || p == self.b.parameter()
                    }
                    // In fresh water calcium alone (the other totals move
                    // the ions of the ionic strength), and a calcium the
                    // water has.
                    Source::Input(Input::Total(Total::Calcium)) => calcium,
                    Source::Input(Input::Total(t)) => {
                        !fresh
                            && matches!(
                                t,
                                Total::Phosphate
                                    | Total::Silicate
                                    | Total::Ammonia
                                    | Total::Sulfide
                            )
                    }
                    Source::Constant(_) => true,
                    // Where no conductivity reading is moved with them
                    // (a reading at the sample temperature, a salinity
                    // computed from one).
                    Source::Input(Input::Temperature | Input::Salinity) => no_reading,
                    // The wind over the water (`value_of` refuses it
                    // without one).
                    Source::Input(Input::Wind) => true,
                    // The number a fresh water's fixed ionic strength is
                    // made from (`value_of` refuses it elsewhere).
                    Source::Input(Input::IonicStrength | Input::Tds) => fresh && no_reading,
                    _ => false,
                };
            if covers {
                covered.push(j);
            }
        }
        covered
    }

    /// The seeds of one pass: the sources of `chunk`, each a slot and a
    /// place in `sources`.
    fn seeds(
        &self,
        chunk: impl ExactSizeIterator<Item = (usize, usize)>,
        sources: &[(Source, f64, f64)],
    ) -> Seeds<TANGENT_WIDTH> {
        let mut seeds = Seeds {
            a: Tangent::constant(self.a.number()),
            b: Tangent::constant(self.b.number()),
            constants: smallvec::SmallVec::new(),
            totals: smallvec::SmallVec::new(),
            temperature: None,
            salinity: None,
            ionic_input: None,
            wind: None,
        };
        for (slot, j) in chunk {
            match sources[j].0 {
                Source::Input(Input::Carbon(p)) if p == self.a.parameter() => {
                    seeds.a = Tangent::source(self.a.number(), slot)
                }
                Source::Input(Input::Carbon(_)) => seeds.b = Tangent::source(self.b.number(), slot),
                Source::Input(Input::Total(t)) => seeds.totals.push((t, slot)),
                Source::Input(Input::Temperature) => seeds.temperature = Some(slot),
                Source::Input(Input::Salinity) => seeds.salinity = Some(slot),
                Source::Input(Input::IonicStrength | Input::Tds) => seeds.ionic_input = Some(slot),
                Source::Input(Input::Wind) => seeds.wind = Some(slot),
                Source::Constant(k) => seeds.constants.push((k, slot)),
                Source::Input(_) => {}
            }
        }
        seeds
    }

    /// The whole propagation from one pass on tangents, where it covers
    /// every source that moves anything, from [`TANGENTS_FROM`] to
    /// [`TANGENT_WIDTH`] of them (those that move nothing get
    /// contributions of exactly zero): the unperturbed values are then the values of the
    /// state on tangents, and each u is summed as the row is written. In
    /// sea water no state of numbers is built (the solve gives h and DIC
    /// alone); in fresh water the state of numbers gives the settled ionic
    /// strength, free calcium and figures, and is left in `numbers` for
    /// the general way should this one not serve. The values are those of the state of
    /// numbers, bit for bit: every operation on a tangent takes the `f64`
    /// operation's value, and a source is seeded at a shift of exactly
    /// zero (a factor of exactly 1 on a constant, +0 on a total). KS and
    /// KF are left out: the pH-scale factors they move are derived again
    /// through fH recovered from a quotient, which may round otherwise.
    /// `Err(true)` where the pass does not cover the problem, the sources
    /// or a column (the caller takes the general way); `Err(false)` where
    /// no pass is worth making (the quantities cannot be read on tangents,
    /// or fewer than [`TANGENTS_FROM`] sources move anything).
    #[inline(never)]
    fn propagated_on_tangents<Q: Quantities>(
        &self,
        sources: &[(Source, f64, f64)],
        quantities: &mut Q,
        numbers: &mut Option<State>,
    ) -> std::result::Result<Propagation, bool> {
        let m = sources.len();
        let rounding_apart = |(s, _, _): &(Source, f64, f64)| {
            matches!(s, Source::Constant(ConstantName::Ks | ConstantName::Kf))
        };
        if !self.on_tangents() || sources.iter().any(rounding_apart) {
            return Err(true);
        }
        // Every source covered, in one pass, or moving nothing (no slot:
        // contributions of exactly zero, as the general way gives it).
        let covered = self.covered(sources);
        if covered.len() < TANGENTS_FROM {
            return Err(false);
        }
        let uncovered = m - covered.len();
        if covered.len() > TANGENT_WIDTH
            || (uncovered > 0
                && sources.iter().filter(|s| self.moves_nothing(s.0)).count() != uncovered)
        {
            return Err(true);
        }
        // Sea water: the unknowns alone. Fresh water: the state of
        // numbers (the pass reads its settled ionic strength, free calcium
        // and figures), kept for the general way should this one fail;
        // with air over the water the lean state alone (the pass makes the
        // exchange on tangents; the general way solves with it).
        let lean;
        let base = match self.prepared.solve_unknowns(self.a, self.b, &self.options) {
            Some(Ok((h, dic))) => Unperturbed::Unknowns(h, dic),
            Some(Err(_)) => return Err(true),
            None => {
                let state = if self.air.is_some() {
                    lean = self
                        .prepared
                        .solve_lean(self.a, self.b, &self.options, &Near::default())
                        .map_err(|_| true)?;
                    &lean
                } else {
                    numbers.insert(self.solve_numbers().map_err(|_| true)?)
                };
                if state.precipitation_potential_mg_l_caco3.is_some() {
                    return Err(true);
                }
                Unperturbed::State(state)
            }
        };
        // Each source in its own place where they all fit (the usual
        // case: a source that moves nothing leaves its slot unseeded);
        // else the covered ones side by side, covered[i] in slot i, their
        // rows spread onto every source's place at the end.
        let side_by_side = m > TANGENT_WIDTH;
        let slots = covered
            .iter()
            .enumerate()
            .map(|(i, &j)| (if side_by_side { i } else { j }, j));
        let seeds = self.seeds(slots.clone(), sources);
        let mut us = [0.0; TANGENT_WIDTH];
        for (slot, j) in slots {
            if let Some(u) = us.get_mut(slot) {
                *u = sources[j].1;
            }
        }
        // Room for every output of the list, without growing on the way.
        // Each row is kept whole, the width of a pass (a copy of a fixed
        // size, without a call): the slots beyond the sources hold zeros,
        // and the result reads its rows with that stride.
        let mut outputs = Vec::with_capacity(128);
        let mut rows: Vec<[f64; TANGENT_WIDTH]> = Vec::with_capacity(128);
        // Whether every derivative of a quantity with a value is finite.
        let mut finite = true;
        let mut each = |t: Option<&Tangents>| {
            let mut c = [0.0; TANGENT_WIDTH];
            let u = t.map(|t| {
                contributions_of(t, &us, &mut c);
                // It is finite exactly where every contribution is.
                let u2 = sum_of_squares(&c);
                finite &= u2.is_finite();
                u2.sqrt()
            });
            outputs.push(Propagated {
                value: t.map(|t| t.v),
                u,
            });
            rows.push(c);
        };
        let read =
            self.prepared
                .solve_tangent(base, &self.a, &self.b, &seeds, self.air_over(), |state| {
                    quantities.read_tangent(state, &mut each)
                });
        match read {
            Some(Ok(true)) if finite => {}
            Some(Ok(false)) => return Err(false),
            _ => return Err(true),
        }
        let (contributions, stride) = if side_by_side {
            // Each row onto every source's place (zero where a source
            // moves nothing).
            let mut spread = Vec::with_capacity(outputs.len() * m);
            let mut row = vec![0.0; m];
            for c in &rows {
                for (&j, c) in covered.iter().zip(c) {
                    if let Some(x) = row.get_mut(j) {
                        *x = *c;
                    }
                }
                spread.extend_from_slice(&row);
            }
            (spread, m)
        } else {
            (rows.into_flattened(), TANGENT_WIDTH)
        };
        Ok(Propagation {
            sources: sources.iter().map(|&(s, u, _)| (s, u)).collect(),
            outputs,
            contributions,
            stride,
        })
    }
}

/// The result of a propagation from the unperturbed values `base`, the
/// quantities `lost` on both sides of a step, and the contributions (a row
/// of `sources.len()` per quantity, zero for a quantity without a value or
/// lost).
fn assembled(
    sources: &[(Source, f64, f64)],
    base: Vec<Option<f64>>,
    lost: &[bool],
    contributions: Vec<f64>,
) -> Propagation {
    let m = sources.len();
    let mut outputs = Vec::with_capacity(base.len());
    for (k, (v, lost)) in base.iter().zip(lost).enumerate() {
        let row = contributions.get(k * m..(k + 1) * m).unwrap_or(&[]);
        let u = v
            .filter(|_| !lost)
            .map(|_| row.iter().map(|c| c * c).sum::<f64>().sqrt());
        outputs.push(Propagated { value: *v, u });
    }
    let sources = sources.iter().map(|&(s, u, _)| (s, u)).collect();
    Propagation {
        sources,
        outputs,
        contributions,
        stride: m,
    }
}

/// A problem with its sources moved ([`Problem::shifted`]).
struct Shifted {
    prepared: Option<PreparedWater>,
    a: Measured,
    b: Measured,
    air: Option<(Air, Option<PhScale>)>,
}

/// A [`Problem`] with its sources moved ([`Problem::moved`]).
#[derive(Debug, Clone)]
pub(crate) struct Moved {
    /// The water, prepared, its constants moved (it records the moves,
    /// those of the problem's own water first:
    /// [`PreparedWater::moves`]).
    pub(crate) prepared: PreparedWater,
    /// The pair.
    pub(crate) a: Measured,
    /// The pair.
    pub(crate) b: Measured,
}

/// The value `given` of an input that sets a fresh water's ionic strength
/// by `route`, where it is the one that does; else the error naming
/// `field`: `not_used` where it was given beside what sets the ionic
/// strength instead, `missing` where it was not given.
fn routed(
    water: &Water,
    given: Option<f64>,
    route: crate::medium::IonicStrengthRoute,
    field: Field,
    not_used: &'static str,
    missing: &'static str,
) -> Result<f64> {
    let used =
        water.medium() == Medium::Fresh && crate::medium::fresh::ionic::route(water) == route;
    match given {
        Some(v) if used => Ok(v),
        Some(_) => Err(Error::IncompatiblePair {
            first: Field::Uncertainty,
            second: field,
            reason: not_used,
        }),
        None => Err(Error::Missing {
            field,
            why: missing,
        }),
    }
}

/// The conditions `c` at salinity `s`, everything else kept.
fn with_salinity(c: &Conditions, s: f64) -> Result<Conditions> {
    let moved = Conditions::new(c.temperature_c(), s)?.with_pressure_dbar(c.pressure_dbar())?;
    if c.air_pressure_stated() {
        moved.with_air_pressure_atm(c.air_pressure_atm())
    } else {
        Ok(moved)
    }
}

fn total_of(t: &crate::sample::Totals, which: Total) -> f64 {
    match which {
        Total::Calcium => t.calcium_mol_kg,
        Total::Phosphate => t.phosphate_mol_kg,
        Total::Silicate => t.silicate_mol_kg,
        Total::Ammonia => t.ammonia_mol_kg,
        _ => t.sulfide_mol_kg,
    }
}

fn total_umol_kg(prepared: &PreparedWater, which: Total) -> f64 {
    total_of(prepared.totals(), which) * 1e6
}

/// The standard uncertainty of one quantity.
///
/// ```
/// use travertine::decisions::uncertainty::Propagated;
/// let p = Propagated { value: Some(10.0), u: Some(5.0) };
/// assert_eq!(p.u, Some(5.0));
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Propagated {
    /// The value, unperturbed (`None` where the state has none).
    pub value: Option<f64>,
    /// The standard uncertainty (`None` where there is no value, or where
    /// the quantity disappears on both sides of a source's step).
    pub u: Option<f64>,
}

/// The result of [`propagate`].
#[derive(Clone)]
#[non_exhaustive]
pub struct Propagation {
    /// Every source with an uncertainty above zero, with its standard
    /// uncertainty (in the unit of [`Size::Absolute`]; a constant in pK
    /// units, the total boron as log10 of its factor).
    pub sources: Vec<(Source, f64)>,
    /// One entry per quantity, in the order the quantities were given.
    pub outputs: Vec<Propagated>,
    /// Each quantity's contributions (a row of `stride` per quantity, in
    /// the order of `outputs`, its first `sources.len()` the sources').
    contributions: Vec<f64>,
    /// The length of a row of `contributions`, at least `sources.len()`.
    stride: usize,
}

/// Two results are equal where their sources, quantities and
/// contributions are, however their rows are laid out.
impl PartialEq for Propagation {
    fn eq(&self, other: &Self) -> bool {
        self.sources == other.sources
            && self.outputs == other.outputs
            && (0..self.outputs.len()).all(|k| self.contributions(k) == other.contributions(k))
    }
}

/// The sources, the quantities and each quantity's contributions (not the
/// layout of the rows).
impl std::fmt::Debug for Propagation {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        let rows: Vec<&[f64]> = (0..self.outputs.len())
            .map(|k| self.contributions(k))
            .collect();
        f.debug_struct("Propagation")
            .field("sources", &self.sources)
            .field("outputs", &self.outputs)
            .field("contributions", &rows)
            .finish()
    }
}

impl Propagation {
    /// For quantity `k` (its place in [`Propagation::outputs`]), each
    /// source's sensitivity times its standard uncertainty, with its sign,
    /// in the order of [`Propagation::sources`]; empty for a `k` beyond the
    /// quantities. u² is the sum of their squares.
    ///
    /// ```
    /// use travertine::decisions::uncertainty::{propagate, Problem, Size, Uncertainties};
    /// use travertine::sample::inputs::Input;
    /// use travertine::{Conditions, Measured, Parameter, Water};
    /// let pond = Water::fresh(Conditions::new(15.0, 0.2)?)?;
    /// let p = Problem::new(&pond, Measured::ph(7.5, None)?, Measured::alkalinity_umol_kg(1200.0)?)?;
    /// let u = Uncertainties::new().with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.02))?;
    /// let r = propagate(&p, &u, |s, out| out.push(Some(s.pco2_uatm)))?;
    /// let c = r.contributions(0);
    /// let u2: f64 = c.iter().map(|c| c * c).sum();
    /// assert!((u2.sqrt() - r.outputs[0].u.unwrap()).abs() < 1e-12 * u2.sqrt());
    /// assert!(r.contributions(1).is_empty());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn contributions(&self, k: usize) -> &[f64] {
        let m = self.sources.len();
        self.contributions
            .get(k * self.stride..k * self.stride + m)
            .filter(|_| k < self.outputs.len())
            .unwrap_or(&[])
    }

    /// Each source's share of the variance of quantity `k`, u_i² / u²; the
    /// shares sum to 1 where the variance is above zero, and are all zero
    /// where it is zero.
    ///
    /// ```
    /// use travertine::decisions::uncertainty::{propagate, Problem, Size, Uncertainties};
    /// use travertine::sample::inputs::Input;
    /// use travertine::{Conditions, Measured, Parameter, PhScale, Water};
    /// let sea = Water::saline(Conditions::new(25.0, 35.0)?)?;
    /// let p = Problem::new(&sea, Measured::ph(8.05, Some(PhScale::Total))?, Measured::alkalinity_umol_kg(2300.0)?)?;
    /// let u = Uncertainties::new().with_input(Input::Temperature, Size::Absolute(0.1))?;
    /// let r = propagate(&p, &u, |s, out| out.push(Some(s.pco2_uatm)))?;
    /// let shares: f64 = r.budget(0).iter().map(|(_, f)| f).sum();
    /// assert!((shares - 1.0).abs() < 1e-12);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn budget(&self, k: usize) -> Vec<(Source, f64)> {
        let c = self.contributions(k);
        let var: f64 = c.iter().map(|c| c * c).sum();
        self.sources
            .iter()
            .zip(c)
            .map(|((s, _), c)| (*s, if var > 0.0 { c * c / var } else { 0.0 }))
            .collect()
    }
}

/// Every source with its standard uncertainty in the coordinate that
/// [`Problem::realise`] shifts, and the scale of its difference step.
pub(crate) fn sources_of(problem: &Problem, u: &Uncertainties) -> Result<Vec<(Source, f64, f64)>> {
    let medium = problem.prepared.water().medium();
    let mut out =
        Vec::with_capacity(u.inputs.len() + u.defaults_in(medium).len() + u.constants.len());
    for &(input, size) in &u.inputs {
        let source = Source::Input(input);
        let x = problem.value_of(source)?;
        let scale = match input {
            Input::Carbon(crate::sample::measured::Parameter::Ph) => 1.0,
            Input::Temperature => 10.0,
            // Ionic strengths are far below 1 mol/kg: the value itself.
            Input::IonicStrength => x.abs().max(1e-6),
            _ => x.abs().max(1.0),
        };
        out.push((source, size.of(x), scale));
    }
    // The ion pairs exist only in fresh water with calcium; elsewhere their
    // constants are not evaluated and would move nothing.
    let pairs = medium == Medium::Fresh && problem.prepared.totals().calcium_mol_kg > 0.0;
    for (k, size) in u.constants_of(medium) {
        if matches!(k, ConstantName::CaHco3Pair | ConstantName::CaCo3Pair) && !pairs {
            continue;
        }
        let source = Source::Constant(k);
        let in_pk = match (k, size) {
            (ConstantName::BoronTotal, Size::Absolute(umol)) => {
                let tb = problem.value_of(source)?;
                if tb > 0.0 {
                    umol / tb / LN_10
                } else {
                    0.0
                }
            }
            (_, Size::Percent(p)) => p / 100.0 / LN_10,
            (_, Size::Absolute(pk)) => pk,
        };
        out.push((source, in_pk, 1.0));
    }
    out.retain(|(_, u, _)| *u > 0.0);
    Ok(out)
}

/// The step of a difference, as a fraction of its source's scale (see
/// [`propagate`]). The error of a forward difference is about half the
/// step times the relative curvature, 10⁻⁶ here; that of the solves it
/// differences, about 10⁻¹² relative (the tolerances of the root searches
/// and fixed points), is divided by the step, 10⁻⁶ again. DEVELOPERS.md
/// ("Uncertainty") compares it with central differences.
const STEP: f64 = 1e-6;

/// Linear (first-order) propagation: for each quantity `quantities` reads
/// from a state (appending them, in a fixed order, to the buffer it is
/// given, which is empty), its standard uncertainty
/// u = √Σ (∂y/∂x_i · u_i)² over the sources (taken as independent), each
/// derivative a forward difference (y(x_i + h) − y(x_i))/h of the
/// unperturbed state and one solve with the source moved by
/// h = min(u_i, 10⁻⁶ × scale): the scale is 1 pH or pK unit, 10 °C, or the
/// value itself (at least 1 in its unit). Each perturbed solve starts its
/// searches from the unperturbed state's unknowns and builds its state
/// without warnings (its numbers are those of a full solve); a constant is
/// perturbed through its own method in a scratch copy of the constants.
/// Three kinds of constant need no solve: a solubility product that moves
/// only its mineral's saturation state and index (Ω ∝ 1/Ksp,
/// SI = log10 Ω; both in sea water, aragonite's in fresh water), K0 where
/// the pair has no gas-phase parameter and no air is over the water (it
/// moves only fCO2, pCO2 and xCO2, ∝ 1/K0), whose perturbed states are the
/// unperturbed one with those moved; and a constant of a system the water
/// does not have (its total zero), which moves nothing and gets zero
/// contributions.
/// Where the step up cannot be solved (a value taken out of its range) or
/// loses a quantity (no value, or one that is not a finite number), the
/// step down is taken too: the central difference for each quantity both
/// steps kept, the backward one where the step up lost it, the forward one
/// where the step down did. A quantity lost on both sides, or without a
/// value at all, has no uncertainty and no contributions.
///
/// # Errors
/// As [`Problem::solve`] for the unperturbed state; an error of a source
/// whose steps fail on both sides, or an input that is not part of the
/// problem (a carbonate parameter not measured).
pub fn propagate<F>(problem: &Problem, u: &Uncertainties, quantities: F) -> Result<Propagation>
where
    F: FnMut(&State, &mut Vec<Option<f64>>),
{
    propagate_quantities(problem, u, ByDifferences(quantities))
}

/// The number of derivatives a number of a pass on tangents carries: the
/// sources of one pass (see [`propagate_quantities`]). 14 covers the
/// realistic sets of both media in one pass (12 sources in sea water, 14
/// in a pond with calcium).
///
/// ```
/// assert_eq!(travertine::decisions::uncertainty::TANGENT_WIDTH, 14);
/// ```
pub const TANGENT_WIDTH: usize = 14;

// `sum_of_squares` takes the slots two at a time.
const _: () = assert!(TANGENT_WIDTH.is_multiple_of(2));

/// The fewest sources a pass on tangents is made for: the pass costs about
/// as much as five or six solves of the water (measured in both media,
/// DEVELOPERS.md, "Uncertainty", the ninth session), and a difference one
/// solve, so fewer sources are cheaper by differences (for example the
/// two measurements alone).
///
/// ```
/// assert_eq!(travertine::decisions::uncertainty::TANGENTS_FROM, 6);
/// ```
pub const TANGENTS_FROM: usize = 6;

/// A number of a pass on tangents: a value and [`TANGENT_WIDTH`]
/// derivatives.
pub type Tangents = Tangent<TANGENT_WIDTH>;

/// Quantities read from a state, for [`propagate_quantities`]: from a
/// state of numbers, and (where the reader can) the same quantities, in
/// the same order, from a state of [`Tangents`], whose derivatives are
/// then the sensitivities.
///
/// ```
/// use travertine::decisions::uncertainty::{Quantities, Tangents};
/// use travertine::State;
/// struct Pco2;
/// impl Quantities for Pco2 {
///     fn read(&mut self, s: &State, out: &mut Vec<Option<f64>>) {
///         out.push(Some(s.pco2_uatm));
///     }
///     fn read_tangent(
///         &mut self,
///         s: &State<Tangents>,
///         each: &mut dyn FnMut(Option<&Tangents>),
///     ) -> bool {
///         each(Some(&s.pco2_uatm));
///         true
///     }
/// }
/// ```
pub trait Quantities {
    /// Appends the quantities of `state` to `out` (which is empty).
    fn read(&mut self, state: &State, out: &mut Vec<Option<f64>>);
    /// Gives `each` the same quantities of a state of [`Tangents`], one at
    /// a time in the same order (`None` where the state has none), and
    /// returns `true`; or returns `false` where the quantities are read
    /// only from states of numbers, and the derivatives are then
    /// differences of solves. (One at a time, by reference: a number on
    /// tangents is a large value to copy.)
    fn read_tangent(
        &mut self,
        state: &State<Tangents>,
        each: &mut dyn FnMut(Option<&Tangents>),
    ) -> bool;
    /// Whether [`Quantities::read_tangent`] reads anything: `false` saves
    /// the pass on tangents where it would be thrown away.
    fn reads_tangents(&self) -> bool {
        true
    }
}

/// Quantities given as a function of a state of numbers: their
/// derivatives are differences of solves.
struct ByDifferences<F>(F);

impl<F: FnMut(&State, &mut Vec<Option<f64>>)> Quantities for ByDifferences<F> {
    fn read(&mut self, state: &State, out: &mut Vec<Option<f64>>) {
        (self.0)(state, out)
    }
    fn read_tangent(&mut self, _: &State<Tangents>, _: &mut dyn FnMut(Option<&Tangents>)) -> bool {
        false
    }
    fn reads_tangents(&self) -> bool {
        false
    }
}

/// As [`propagate`], for quantities that can also be read from a state of
/// [`Tangents`] ([`Quantities`]): the sensitivities to the sources this
/// pass covers are then exact derivatives rather than differences, from
/// one state on tangents per [`TANGENT_WIDTH`] sources. The constants
/// and the state are computed on tangents (forward-mode differentiation,
/// the chain rule at every operation, through the same generic code that
/// computes them on numbers), and the derivatives of the solver's unknowns
/// h and DIC (in fresh water also the ionic strength and free calcium of
/// the fixed point, and pHs) come from implicit differentiation at its
/// root ([`crate::solve`]'s `tangent` module): J du = −∂G/∂s, G the
/// residuals of the equations the solve satisfies.
///
/// Covered: both media reported at the conditions of their measurement,
/// from [`TANGENTS_FROM`] covered sources on; the two measurements,
/// temperature and salinity (not where a conductivity reading moves with
/// them), every constant, the measured totals (in fresh water calcium
/// alone), a TDS or an ionic strength given, and with air over the water
/// the wind (the exchange is computed on tangents too, the water at
/// equilibrium with the air a second state on tangents whose pair, the
/// alkalinity and the air's fCO2, carries its derivatives). Every other source, and every source in other problems, takes
/// differences of solves as [`propagate`] does; the two agree to about
/// 10⁻⁶ relative.
///
/// # Errors
/// As [`propagate`].
pub fn propagate_quantities<Q: Quantities>(
    problem: &Problem,
    u: &Uncertainties,
    mut quantities: Q,
) -> Result<Propagation> {
    // One pass on tangents alone where it covers every source (the usual
    // case); its sources are found again below otherwise, so
    // that an error of the solve comes before one of the sources.
    let mut tangents = true;
    let found = sources_of(problem, u);
    let mut numbers = None;
    if let Ok(sources) = &found {
        match problem.propagated_on_tangents(sources, &mut quantities, &mut numbers) {
            Ok(p) => return Ok(p),
            Err(worth_it) => tangents = worth_it,
        }
    }
    let base_state = match numbers {
        Some(state) => state,
        None => problem.solve_numbers()?,
    };
    // Room for a few quantities; every output of the list grows it thrice.
    let mut base = Vec::with_capacity(16);
    quantities.read(&base_state, &mut base);
    let sources = found?;
    let (n, m) = (base.len(), sources.len());
    // A row of m contributions per quantity; source j fills column j.
    let mut contributions = vec![0.0; n * m];
    let mut lost = vec![false; n];
    // The quantities whose rows the pass on tangents leaves to the
    // differences, for every source.
    let mut apart = vec![false; n];
    let done = if tangents {
        problem.tangent_columns(
            &base_state,
            &sources,
            &mut quantities,
            &base,
            &mut contributions,
            &mut apart,
        )
    } else {
        vec![false; m]
    };
    let any_apart = apart.contains(&true);
    let near = base_state.near();
    // The scratch constants are copied at the first constant source; the
    // step down's buffer grows only where one is taken.
    let mut scratch = None;
    // Allocated at the first source taken by differences.
    let (mut up, mut down) = (Vec::new(), Vec::new());
    for (j, &(source, ui, scale)) in sources.iter().enumerate() {
        if (done[j] && !any_apart) || problem.moves_nothing(source) {
            continue;
        }
        // The rows this source's differences fill: every row, or where the
        // pass filled its column, the rows it left apart.
        let fills = |k: usize| !done[j] || apart.get(k).copied().unwrap_or(false);
        let h = ui.min(STEP * scale);
        let mut at_step = |d: f64, out: &mut Vec<Option<f64>>| {
            out.clear();
            problem
                .realise_one(source, d, &base_state, &near, &mut scratch)
                .map(|s| quantities.read(&s, out))
        };
        let up_solved = at_step(h, &mut up);
        // The usual case: the step up solved and kept every value, so the
        // slope is the forward difference (source j fills column j).
        let mut kept = up_solved.is_ok() && up.len() == n;
        if kept {
            let per_step = ui / h;
            for (k, (row, (p, y))) in contributions
                .chunks_exact_mut(m)
                .zip(up.iter().zip(&base))
                .enumerate()
            {
                if !fills(k) {
                    continue;
                }
                match (p, y) {
                    (Some(p), Some(y)) if p.is_finite() => {
                        row[j] = beyond_rounding(*p, *y) * per_step
                    }
                    // A value lost, or not a number, at the step.
                    (_, Some(_)) => {
                        kept = false;
                        break;
                    }
                    _ => {}
                }
            }
        }
        if kept {
            continue;
        }
        // Otherwise the step down too, and the central or backward
        // difference where the step up failed or lost a value.
        let down_solved = at_step(-h, &mut down);
        if let (Err(e), Err(_)) = (&up_solved, &down_solved) {
            return Err(e.clone());
        }
        let read = |r: &Result<()>, v: &[Option<f64>], k: usize| {
            r.as_ref()
                .ok()
                .and_then(|_| v.get(k).copied().flatten())
                .filter(|x| x.is_finite())
        };
        for (k, (row, y)) in contributions.chunks_exact_mut(m).zip(&base).enumerate() {
            if !fills(k) {
                continue;
            }
            let slope = match (read(&up_solved, &up, k), *y, read(&down_solved, &down, k)) {
                (Some(p), _, Some(m)) => Some(beyond_rounding(p, m) / (2.0 * h)),
                (Some(p), Some(y), None) => Some(beyond_rounding(p, y) / h),
                (None, Some(y), Some(m)) => Some(beyond_rounding(y, m) / h),
                _ => None,
            };
            row[j] = slope.map_or(0.0, |s| s * ui);
            if slope.is_none() {
                lost[k] = true;
            }
        }
    }
    // A quantity without a value, or lost on both sides of a source's
    // step, has no uncertainty: no contributions either, so that its
    // budget is all zeros rather than shares of a variance it lacks.
    for ((row, y), lost) in contributions
        .chunks_exact_mut(m.max(1))
        .zip(&base)
        .zip(&lost)
    {
        if y.is_none() || *lost {
            row.fill(0.0);
        }
    }
    Ok(assembled(&sources, base, &lost, contributions))
}

/// Σ c², u² of a row of contributions: two sums side by side, the even
/// and the odd slots (the chain of additions half as long, the order of
/// the sources kept within each), added at the end. It may round
/// differently in the last bit from the sum in the order of the sources
/// that the general way makes ([`assembled`]).
#[inline(always)]
fn sum_of_squares(c: &[f64; TANGENT_WIDTH]) -> f64 {
    let mut lanes = [0.0; 2];
    for pair in c.chunks_exact(2) {
        lanes[0] += pair[0] * pair[0];
        lanes[1] += pair[1] * pair[1];
    }
    lanes[0] + lanes[1]
}

/// Into `c`, the contributions of a quantity on tangents `t` from the
/// sources of standard uncertainties `us` (one per slot): each derivative
/// times its source's u, or exactly zero where that is no larger than
/// 8 ε |value| (8 to 16 units in the last place of the value), a change
/// that cannot be told from the rounding of the value itself. An output
/// that the measurements fix (the measured alkalinity when only the pH
/// and the constants are uncertain) is computed again from the solved
/// unknowns, whose derivatives cancel in it only to rounding: this floor
/// makes its contributions exactly zero where that rounding stays under
/// it (the usual case; an output much smaller than its own terms, an
/// alkalinity near zero, may keep a u of rounding). The floor is far
/// below that of the differences ([`beyond_rounding`] drops a change of
/// 8 ε over a step up to 10⁶ times smaller than u): it never drops more
/// than the value's own rounding.
#[inline(always)]
fn contributions_of(t: &Tangents, us: &[f64; TANGENT_WIDTH], c: &mut [f64; TANGENT_WIDTH]) {
    let floor = 8.0 * f64::EPSILON * t.v.abs();
    for ((c, d), u) in c.iter_mut().zip(&t.d).zip(us) {
        let x = d * u;
        // NaN stays NaN (a comparison with it is false).
        *c = if x.abs() <= floor { 0.0 } else { x };
    }
}

/// The difference `a − b` of an output at two steps, or exactly zero where
/// it is no larger than rounding (8 units in the last place of the larger):
/// an output that a source does not move (the measured HCO3⁻ when only the
/// pH is uncertain) then gets exactly no contribution from it, rather than
/// rounding noise divided by the small step. A real sensitivity would have
/// to be below about 10⁻⁸ (relative) to fall under this floor at the step
/// used.
fn beyond_rounding(a: f64, b: f64) -> f64 {
    let d = a - b;
    let (a, b) = (a.abs(), b.abs());
    // The larger magnitude, without `f64::max`'s handling of NaN (a NaN
    // difference stays NaN either way).
    let larger = if a > b { a } else { b };
    if d.abs() <= 8.0 * f64::EPSILON * larger {
        0.0
    } else {
        d
    }
}

/// The draws of a Monte Carlo check: every source drawn at once from a
/// normal distribution of its standard uncertainty (independent), by a
/// ChaCha8 generator (the same numbers on every platform).
pub(crate) struct Draws {
    sources: Vec<(Source, f64, f64)>,
    rng: rand_chacha::ChaCha8Rng,
}

impl Draws {
    /// The draws of `sources` (as [`sources_of`] gives them) from `seed`.
    pub(crate) fn new(sources: Vec<(Source, f64, f64)>, seed: u64) -> Self {
        Draws {
            sources,
            rng: rand_chacha::ChaCha8Rng::seed_from_u64(seed),
        }
    }

    /// The next draw, as shifts of the sources, into `shifts`.
    pub(crate) fn next_into(&mut self, shifts: &mut Vec<(Source, f64)>) {
        shifts.clear();
        for &(s, ui, _) in &self.sources {
            let z: f64 = StandardNormal.sample(&mut self.rng);
            shifts.push((s, z * ui));
        }
    }
}

/// Welford's running mean and sum of squared deviations of one quantity.
#[derive(Debug, Clone, Copy, Default)]
pub(crate) struct Running {
    count: usize,
    mean: f64,
    m2: f64,
}

impl Running {
    /// Adds a value.
    pub(crate) fn add(&mut self, v: f64) {
        self.count += 1;
        let d = v - self.mean;
        self.mean += d / self.count as f64;
        self.m2 += d * (v - self.mean);
    }

    /// The sample standard deviation (`None` with fewer than two values).
    pub(crate) fn std_dev(&self) -> Option<f64> {
        (self.count >= 2).then(|| (self.m2 / (self.count - 1) as f64).sqrt())
    }

    /// The mean (`None` without a value).
    pub(crate) fn mean(&self) -> Option<f64> {
        (self.count >= 1).then_some(self.mean)
    }
}

/// The result of [`monte_carlo`].
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub struct MonteCarlo {
    /// The empirical standard deviation of each quantity over the draws
    /// that gave it (`None` with fewer than two).
    pub std_devs: Vec<Option<f64>>,
    /// The mean of each quantity over the same draws.
    pub means: Vec<Option<f64>>,
    /// The draws that solved.
    pub solved: usize,
    /// The draws that did not (a value drawn out of its range, or a pair
    /// that fits no water).
    pub failed: usize,
}

/// The Monte Carlo check of [`propagate`]: `draws` solves, each with every
/// source drawn at once from a normal distribution of its standard
/// uncertainty (independent), by a ChaCha8 generator seeded with `seed`
/// (the same numbers on every platform).
///
/// # Errors
/// [`Error::OutOfRange`] for fewer than 2 draws; as [`propagate`] for the
/// sources.
///
/// ```
/// use travertine::decisions::uncertainty::{monte_carlo, Problem, Uncertainties};
/// use travertine::{Conditions, Measured, PhScale, Water};
/// let sea = Water::saline(Conditions::new(25.0, 35.0)?)?;
/// let p = Problem::new(&sea, Measured::ph(8.05, Some(PhScale::Total))?, Measured::alkalinity_umol_kg(2300.0)?)?;
/// let mc = monte_carlo(&p, &Uncertainties::new(), |s, out| out.push(Some(s.pco2_uatm)), 200, 7)?;
/// assert_eq!(mc.solved + mc.failed, 200);
/// assert!(mc.std_devs[0].unwrap() > 0.0);
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn monte_carlo<F>(
    problem: &Problem,
    u: &Uncertainties,
    mut quantities: F,
    draws: usize,
    seed: u64,
) -> Result<MonteCarlo>
where
    F: FnMut(&State, &mut Vec<Option<f64>>),
{
    if draws < 2 {
        return Err(Error::OutOfRange {
            field: Field::Draws,
            value: draws as f64,
            min: 2.0,
            max: f64::MAX,
            unit: "",
        });
    }
    let mut values = Vec::new();
    quantities(&problem.solve()?, &mut values);
    let n = values.len();
    let mut draw = Draws::new(sources_of(problem, u)?, seed);
    let mut running = vec![Running::default(); n];
    let (mut solved, mut failed) = (0, 0);
    let mut shifts: Vec<(Source, f64)> = Vec::new();
    for _ in 0..draws {
        draw.next_into(&mut shifts);
        match problem.realise(&shifts, &Near::default()) {
            Ok(state) => {
                solved += 1;
                values.clear();
                quantities(&state, &mut values);
                for (r, v) in running.iter_mut().zip(&values) {
                    if let Some(v) = v.filter(|v| v.is_finite()) {
                        r.add(v);
                    }
                }
            }
            Err(_) => failed += 1,
        }
    }
    let std_devs = running.iter().map(Running::std_dev).collect();
    let means = running.iter().map(Running::mean).collect();
    Ok(MonteCarlo {
        std_devs,
        means,
        solved,
        failed,
    })
}
