//! One-dimensional root finding for the fresh medium: the safeguarded
//! secant of a fixed point, and the Illinois regula falsi.

use crate::base::error::{Error, Result};
use crate::base::field::Field;

/// Iteration cap of a fixed point; reaching it is reported as non-convergence.
const MAX_OUTER: u32 = 200;
/// Relative change of I and Ca below which a fixed point has converged.
const OUTER_TOLERANCE: f64 = 1e-12;

/// What is known of where a fixed point x = F(x) lies, for
/// [`fixed_point`]: g(x) = F(x) − x is positive below it and negative
/// above it.
#[derive(Debug, Clone, Copy)]
pub(crate) struct Bracket {
    /// A value at or below the fixed point, if known.
    pub(super) lo: Option<f64>,
    /// A value at or above it, if known.
    pub(super) hi: Option<f64>,
    /// Where a value at which F cannot be evaluated lies.
    pub(super) failure: Failure,
    /// Absolute floor of the relative tolerance.
    pub(super) floor: f64,
}

/// Multiples of the start tried in turn when F cannot be evaluated at the
/// start, nor yet anywhere, and the side of the failure is unknown; then
/// the values of [`LADDER`].
pub(super) const AROUND_START: [f64; 10] =
    [1.001, 0.999, 1.01, 0.99, 1.03, 0.97, 1.1, 0.9, 1.3, 0.75];

/// Values tried after [`AROUND_START`]: ionic strengths (mol/kg) over the
/// range of the activity models and beyond.
pub(super) const LADDER: [f64; 10] = [1e-4, 3e-4, 1e-3, 3e-3, 0.01, 0.03, 0.1, 0.3, 1.0, 3.0];

/// Where a value at which a fixed point's F cannot be evaluated lies.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(crate) enum Failure {
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
pub(crate) fn fixed_point<T>(
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
        first: Field::IonicStrength,
        second: Field::Calcium,
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
        let inside = |v: f64| v.is_finite() && lo.is_none_or(|l| v > l) && hi.is_none_or(|h| v < h);
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

/// The root of f in [a, b], where f changes sign, by the Illinois
/// variant of regula falsi (Dowell & Jarratt 1971): a secant step inside
/// the bracket, with the value kept at an end that stays twice in a row
/// halved, so the bracket closes from both sides and convergence is
/// superlinear. Stops at a step below 1e-12 (absolute: the unknown is a pH)
/// or an exact zero; `None` without a sign change or on a NaN.
pub(crate) fn falsi(f: impl Fn(f64) -> f64, a: f64, b: f64) -> Option<f64> {
    let (fa, fb) = (f(a), f(b));
    falsi_known(f, (a, fa), (b, fb))
}

/// [`falsi`] with f already known at both ends: `(a, f(a))`, `(b, f(b))`.
fn falsi_known(
    f: impl Fn(f64) -> f64,
    (mut a, mut fa): (f64, f64),
    (mut b, mut fb): (f64, f64),
) -> Option<f64> {
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
