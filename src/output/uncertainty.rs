//! The uncertainty of every numeric output of the list
//! ([`crate::output::Output`]): [`crate::decisions::uncertainty`] applied to
//! the outputs, so that the list stays the one description of them.

use super::fields::{Output, Value};
use crate::base::error::Result;
use crate::base::numeric::Real;
use crate::decisions::uncertainty::{
    monte_carlo, propagate_quantities, MonteCarlo, Problem, Propagation, Quantities, Tangents,
    Uncertainties,
};
use crate::state::State;

/// The outputs of the list whose value is a number (not a name), in list
/// order.
///
/// ```
/// use travertine::output::{uncertainty::numeric_outputs, Output};
/// let numeric = numeric_outputs();
/// assert!(numeric.contains(&Output::Pco2));
/// assert!(!numeric.contains(&Output::Water));
/// ```
pub fn numeric_outputs() -> Vec<Output> {
    numeric_list().to_vec()
}

/// The numeric outputs, found once: a state of any water tells which
/// outputs are numbers (an output's kind does not depend on the state).
fn numeric_list() -> &'static [Output] {
    static NUMERIC: std::sync::OnceLock<Vec<Output>> = std::sync::OnceLock::new();
    NUMERIC.get_or_init(|| {
        let probe = crate::sample::Conditions::new(25.0, 35.0)
            .and_then(crate::sample::Water::saline)
            .and_then(|w| {
                w.solve(
                    crate::sample::Measured::alkalinity_umol_kg(2300.0)?,
                    crate::sample::Measured::dic_umol_kg(2000.0)?,
                )
            });
        match probe {
            Ok(s) => Output::ALL
                .iter()
                .copied()
                .filter(|o| matches!(o.value(&s), Value::Number(_)))
                .collect(),
            Err(_) => Vec::new(),
        }
    })
}

/// Appends the values of `outputs` in `state` to `out`, `None` where it
/// has none (or where the output is a name), reading every output of the
/// state in one pass ([`Output::numbers`]).
///
/// ```
/// use travertine::output::{uncertainty::values_into, Output};
/// use travertine::{Conditions, Measured, Water};
/// let s = Water::saline(Conditions::new(25.0, 35.0)?)?
///     .solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
/// let mut out = Vec::new();
/// values_into(&[Output::Pco2, Output::Water], &s, &mut out);
/// assert_eq!(out, vec![Some(s.pco2_uatm), None]);
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn values_into<R: Real>(outputs: &[Output], state: &State<R>, out: &mut Vec<Option<R>>) {
    let all = Output::numbers(state);
    out.extend(outputs.iter().map(|o| all[o.index()]));
}

/// Outputs of the list as the quantities of a propagation
/// ([`propagate_quantities`]): read by [`values_into`] from a state of
/// numbers or of [`Tangents`], so that their sensitivities are exact
/// derivatives wherever the pass on tangents covers the problem.
///
/// ```
/// use travertine::decisions::uncertainty::{propagate_quantities, Problem, Size, Uncertainties};
/// use travertine::output::{uncertainty::OutputQuantities, Output};
/// use travertine::sample::inputs::Input;
/// use travertine::{Conditions, Measured, Parameter, PhScale, Water};
/// let sea = Water::saline(Conditions::new(25.0, 35.0)?)?;
/// let p = Problem::new(&sea, Measured::ph(8.0, Some(PhScale::Total))?, Measured::dic_umol_kg(2000.0)?)?;
/// let u = Uncertainties::new().with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01))?;
/// let r = propagate_quantities(&p, &u, OutputQuantities(&[Output::Pco2]))?;
/// // pCO2 ∝ [H+] at fixed DIC to first order only partly; its u is about 2 % here.
/// assert!(r.outputs[0].u.unwrap() > 0.01 * r.outputs[0].value.unwrap());
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy)]
pub struct OutputQuantities<'a>(pub &'a [Output]);

impl Quantities for OutputQuantities<'_> {
    fn read(&mut self, state: &State, out: &mut Vec<Option<f64>>) {
        values_into(self.0, state, out)
    }
    fn read_tangent(
        &mut self,
        state: &State<Tangents>,
        each: &mut dyn FnMut(Option<&Tangents>),
    ) -> bool {
        for o in self.0 {
            o.with_number(state, &mut *each);
        }
        true
    }
}

/// The standard uncertainty and budget of every numeric output: the
/// outputs of [`numeric_outputs`], and [`propagate_quantities`]'s result (exact derivatives where the pass on tangents covers the problem) for them in
/// the same order.
///
/// # Errors
/// As [`propagate_quantities`].
///
/// ```
/// use travertine::decisions::uncertainty::{Problem, Size, Uncertainties};
/// use travertine::output::{uncertainty::outputs_propagated, Output};
/// use travertine::sample::inputs::Input;
/// use travertine::{Conditions, Measured, Parameter, Water};
/// let pond = Water::fresh(Conditions::new(15.0, 0.2)?)?;
/// let p = Problem::new(&pond, Measured::ph(7.5, None)?, Measured::alkalinity_umol_kg(1200.0)?)?;
/// let u = Uncertainties::new().with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.02))?;
/// let (outputs, result) = outputs_propagated(&p, &u)?;
/// let k = outputs.iter().position(|o| *o == Output::Pco2).unwrap();
/// assert!(result.outputs[k].u.unwrap() > 0.0);
/// assert_eq!(result.contributions(k).len(), result.sources.len());
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn outputs_propagated(
    problem: &Problem,
    u: &Uncertainties,
) -> Result<(Vec<Output>, Propagation)> {
    let outputs = numeric_outputs();
    let result = propagate_quantities(problem, u, OutputQuantities(&outputs))?;
    Ok((outputs, result))
}

/// The Monte Carlo check of every numeric output: [`monte_carlo`] for the
/// outputs of [`numeric_outputs`], in the same order.
///
/// # Errors
/// As [`monte_carlo`].
///
/// ```
/// use travertine::decisions::uncertainty::{Problem, Uncertainties};
/// use travertine::output::uncertainty::outputs_monte_carlo;
/// use travertine::{Conditions, Measured, Water};
/// let sea = Water::saline(Conditions::new(25.0, 35.0)?)?;
/// let p = Problem::new(&sea, Measured::dic_umol_kg(2000.0)?, Measured::alkalinity_umol_kg(2300.0)?)?;
/// let (outputs, mc) = outputs_monte_carlo(&p, &Uncertainties::new(), 50, 1)?;
/// assert_eq!(outputs.len(), mc.std_devs.len());
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn outputs_monte_carlo(
    problem: &Problem,
    u: &Uncertainties,
    draws: usize,
    seed: u64,
) -> Result<(Vec<Output>, MonteCarlo)> {
    let outputs = numeric_outputs();
    let result = monte_carlo(
        problem,
        u,
        |s, out| values_into(&outputs, s, out),
        draws,
        seed,
    )?;
    Ok((outputs, result))
}
