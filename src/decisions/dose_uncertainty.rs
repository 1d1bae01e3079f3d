//! The standard uncertainty of a dose (issue 13): linear propagation of the
//! uncertainties of the inputs and the constants through the whole dose
//! computation, each derivative a central difference of two full doses.
//!
//! Each source is moved as [`crate::decisions::uncertainty::propagate`]
//! moves it (the same step, h = min(u, 10⁻⁴ × scale)); the water before
//! treatment is solved again, and the dose is solved again from it, every
//! treated water with the same constants moved. Then
//! u(dose)² = Σ (∂dose/∂x_i · u_i)², the sources taken as independent. The
//! volume treated is taken as exact.
//!
//! ```
//! use travertine::decisions::dose::{dose, Chemical, DoseRequest};
//! use travertine::decisions::dose_uncertainty::dose_uncertainty;
//! use travertine::decisions::uncertainty::{Problem, Size, Uncertainties};
//! use travertine::sample::inputs::Input;
//! use travertine::{units::Unit, Conditions, Measured, Parameter, Water};
//! let pond = Water::fresh(Conditions::new(24.0, 0.1)?)?;
//! let (a, b) = (Measured::alkalinity(28.0, Unit::MgPerLCaCO3)?, Measured::ph(7.1, None)?);
//! let request = DoseRequest::new(Chemical::SodiumBicarbonate, "alkalinity=50 mg/L CaCO3".parse()?);
//! let u = Uncertainties::new()
//!     .without_constants()
//!     .with_input(Input::Carbon(Parameter::Alkalinity), Size::Absolute(10.0))?;
//! let r = dose_uncertainty(&Problem::new(&pond, a, b)?, &u, request)?;
//! // The dose makes up the alkalinity missing: 10 µmol/L less alkalinity
//! // needs 10 µmol/L more NaHCO3, 0.84 g/m³ at 84.007 g/mol (and 99 %).
//! assert!((r.dose_g_m3_u - 10e-3 * 84.007 / 0.99).abs() < 0.01);
//! # Ok::<(), travertine::Error>(())
//! ```

use super::dose::{dose_with, DoseRequest, Solver};
use super::uncertainty::{sources_of, Draws, Problem, Running, Source, Uncertainties};
use crate::base::error::Result;
use crate::base::field::Field;

/// The standard uncertainty of a dose, and what makes it up.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub struct DoseUncertainty {
    /// The dose itself, g of product per m³ (as [`super::dose::Dose::dose_g_m3`]).
    pub dose_g_m3: f64,
    /// Its standard uncertainty, g/m³.
    pub dose_g_m3_u: f64,
    /// For each source with an uncertainty above zero: its standard
    /// uncertainty (in the coordinate of
    /// [`crate::decisions::uncertainty::Propagation::sources`]) and its
    /// contribution, sensitivity × u, g/m³, with its sign.
    pub contributions: Vec<(Source, f64, f64)>,
    /// The Monte Carlo check of the linear figure, where asked for
    /// ([`DoseUncertainty::with_monte_carlo`]).
    pub monte_carlo: Option<DoseMonteCarlo>,
}

/// The Monte Carlo check of a dose's uncertainty: `draws` full doses, each
/// with every source drawn at once (as
/// [`crate::decisions::uncertainty::monte_carlo`] draws them).
///
/// ```
/// use travertine::decisions::dose::{Chemical, DoseRequest};
/// use travertine::decisions::dose_uncertainty::dose_uncertainty;
/// use travertine::decisions::uncertainty::{Problem, Uncertainties};
/// use travertine::{units::Unit, Conditions, Measured, Water};
/// let pond = Water::fresh(Conditions::new(24.0, 0.1)?)?;
/// let (a, b) = (Measured::alkalinity(28.0, Unit::MgPerLCaCO3)?, Measured::ph(7.1, None)?);
/// let request = DoseRequest::new(Chemical::SodiumBicarbonate, "alkalinity=50 mg/L CaCO3".parse()?);
/// let p = Problem::new(&pond, a, b)?;
/// let u = Uncertainties::new();
/// let d = dose_uncertainty(&p, &u, request)?.with_monte_carlo(&p, &u, request, 50, 2)?;
/// let mc = d.monte_carlo.unwrap();
/// assert_eq!((mc.draws, mc.seed), (50, 2));
/// assert!(mc.dose_g_m3_mean.unwrap() > 0.0);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub struct DoseMonteCarlo {
    /// The empirical standard deviation of the dose, g/m³, over the draws
    /// that could be dosed (`None` with fewer than two).
    pub dose_g_m3_std_dev: Option<f64>,
    /// The mean dose over the same draws, g/m³.
    pub dose_g_m3_mean: Option<f64>,
    /// The draws asked for.
    pub draws: usize,
    /// The seed.
    pub seed: u64,
    /// The draws dosed.
    pub solved: usize,
    /// The draws that could not be (a value drawn out of its range, a
    /// target already passed).
    pub failed: usize,
}

impl DoseUncertainty {
    /// The standard uncertainty of the product for a volume, kg (the volume
    /// taken as exact).
    ///
    /// ```
    /// use travertine::decisions::dose::{Chemical, DoseRequest};
    /// use travertine::decisions::dose_uncertainty::dose_uncertainty;
    /// use travertine::decisions::uncertainty::{Problem, Uncertainties};
    /// use travertine::{units::Unit, Conditions, Measured, Water};
    /// let pond = Water::fresh(Conditions::new(24.0, 0.1)?)?;
    /// let (a, b) = (Measured::alkalinity(28.0, Unit::MgPerLCaCO3)?, Measured::ph(7.1, None)?);
    /// let request = DoseRequest::new(Chemical::SodiumBicarbonate, "alkalinity=50 mg/L CaCO3".parse()?);
    /// let d = dose_uncertainty(&Problem::new(&pond, a, b)?, &Uncertainties::new(), request)?;
    /// // 2000 m³: 2 × the g/m³ figure, in kg.
    /// assert!((d.total_kg_u(2000.0) - 2.0 * d.dose_g_m3_u).abs() < 1e-12);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn total_kg_u(&self, volume_m3: f64) -> f64 {
        self.dose_g_m3_u * volume_m3 / 1000.0
    }

    /// With the Monte Carlo check of `draws` full doses of `request` in the
    /// water and pair of `problem`, every source of `u` drawn at once from
    /// `seed` (the same seed, the same numbers).
    ///
    /// # Errors
    /// [`crate::Error::OutOfRange`] for fewer than 2 draws; as
    /// [`dose_uncertainty`] for the sources.
    ///
    /// ```
    /// use travertine::decisions::dose::{Chemical, DoseRequest};
    /// use travertine::decisions::dose_uncertainty::dose_uncertainty;
    /// use travertine::decisions::uncertainty::{Problem, Size, Uncertainties};
    /// use travertine::sample::inputs::Input;
    /// use travertine::{units::Unit, Conditions, Measured, Parameter, Water};
    /// let pond = Water::fresh(Conditions::new(24.0, 0.1)?)?;
    /// let (a, b) = (Measured::alkalinity(28.0, Unit::MgPerLCaCO3)?, Measured::ph(7.1, None)?);
    /// let request = DoseRequest::new(Chemical::SodiumBicarbonate, "alkalinity=50 mg/L CaCO3".parse()?);
    /// let u = Uncertainties::new()
    ///     .without_constants()
    ///     .with_input(Input::Carbon(Parameter::Alkalinity), Size::Absolute(10.0))?;
    /// let p = Problem::new(&pond, a, b)?;
    /// let d = dose_uncertainty(&p, &u, request)?.with_monte_carlo(&p, &u, request, 400, 5)?;
    /// let mc = d.monte_carlo.as_ref().unwrap();
    /// assert_eq!(mc.solved + mc.failed, 400);
    /// // The dose is linear in the alkalinity: the two agree closely.
    /// assert!((mc.dose_g_m3_std_dev.unwrap() / d.dose_g_m3_u - 1.0).abs() < 0.1);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_monte_carlo(
        mut self,
        problem: &Problem,
        u: &Uncertainties,
        request: DoseRequest,
        draws: usize,
        seed: u64,
    ) -> Result<Self> {
        if draws < 2 {
            return Err(crate::Error::OutOfRange {
                field: Field::Draws,
                value: draws as f64,
                min: 2.0,
                max: f64::MAX,
                unit: "",
            });
        }
        let sources = sources_of(problem, u)?
            .into_iter()
            .filter(|(s, _, _)| *s != Source::Input(crate::sample::inputs::Input::Wind))
            .collect();
        let mut draw = Draws::new(sources, seed);
        let mut running = Running::default();
        let (mut solved, mut failed) = (0, 0);
        let mut shifts = Vec::new();
        for _ in 0..draws {
            draw.next_into(&mut shifts);
            match dose_at(problem, request, &shifts) {
                Ok(d) if d.is_finite() => {
                    solved += 1;
                    running.add(d);
                }
                _ => failed += 1,
            }
        }
        self.monte_carlo = Some(DoseMonteCarlo {
            dose_g_m3_std_dev: running.std_dev(),
            dose_g_m3_mean: running.mean(),
            draws,
            seed,
            solved,
            failed,
        });
        Ok(self)
    }
}

/// The dose of `request` with the sources of `problem` moved by `shifts`:
/// the water before treatment solved again, and the dose solved from it,
/// every treated water with the same constants moved.
fn dose_at(problem: &Problem, request: DoseRequest, shifts: &[(Source, f64)]) -> Result<f64> {
    let moved = problem.moved(shifts)?;
    let before = moved
        .prepared
        .solve_with(moved.a, moved.b, problem.options())?;
    let solver = Solver::moved(&moved.prepared);
    Ok(dose_with(solver, &before, request)?.dose_g_m3)
}

/// The dose of `request` for the water and pair of `problem`, with its
/// standard uncertainty from `u` (see the [module](self)). Where one side
/// of a step cannot be dosed (the target passed, a value out of range),
/// the one-sided difference of the other is used.
///
/// # Errors
/// The errors of the dose of the unmoved water; the error of a source
/// whose steps fail on both sides.
pub fn dose_uncertainty(
    problem: &Problem,
    u: &Uncertainties,
    request: DoseRequest,
) -> Result<DoseUncertainty> {
    let dose_at = |shifts: &[(Source, f64)]| dose_at(problem, request, shifts);
    let base = dose_at(&[])?;
    let mut contributions = Vec::new();
    for (source, ui, scale) in sources_of(problem, u)? {
        // Moving the wind changes no dose.
        if source == Source::Input(crate::sample::inputs::Input::Wind) {
            continue;
        }
        let h = ui.min(1e-4 * scale);
        let up = dose_at(&[(source, h)]);
        let down = dose_at(&[(source, -h)]);
        let slope = match (up, down) {
            (Ok(p), Ok(m)) => (p - m) / (2.0 * h),
            (Ok(p), Err(_)) => (p - base) / h,
            (Err(_), Ok(m)) => (base - m) / h,
            (Err(e), Err(_)) => return Err(e),
        };
        contributions.push((source, ui, slope * ui));
    }
    let dose_g_m3_u = contributions
        .iter()
        .map(|(_, _, c)| c * c)
        .sum::<f64>()
        .sqrt();
    Ok(DoseUncertainty {
        dose_g_m3: base,
        dose_g_m3_u,
        contributions,
        monte_carlo: None,
    })
}
