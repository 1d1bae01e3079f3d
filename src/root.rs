//! A bracketed, safeguarded Newton iteration for one scalar root.
//!
//! The bracket [a, b] always holds a sign change. Each step is a Newton step
//! when that step stays inside the bracket and shrinks fast enough, and a
//! bisection otherwise, so the iteration converges for any continuous
//! function with a sign change, and quadratically near a simple root. This
//! is the classic safeguarded scheme (Press et al., Numerical Recipes, §9.4
//! "rtsafe"); Munhoven (2013) recommends the same safeguarding for the
//! alkalinity equation.

/// Absolute tolerance on x (here x = ln h, so a relative tolerance on h).
pub(crate) const X_TOLERANCE: f64 = 1e-13;
/// A Newton step shorter than this ends the iteration, returning the point
/// after the step: near a simple root the error after a step of length d is
/// of order d², here about 1e-12 relative in h, far inside the 1e-9 of
/// the round-trip tolerance.
pub(crate) const NEWTON_ACCEPT: f64 = 1e-6;
/// Iteration cap; reaching it is reported as non-convergence.
pub(crate) const MAX_ITERATIONS: u32 = 200;

/// Finds x in [lo, hi] with f(x) = 0, where `f` returns (f, df/dx) and
/// `f_lo`, `f_hi` are f at the ends, of opposite sign (or one of them zero).
/// `guess` is clamped into the bracket. Returns the number of iterations
/// spent as the error when the cap is reached.
pub(crate) fn safeguarded_newton<F>(
    f: F,
    lo: f64,
    f_lo: f64,
    hi: f64,
    f_hi: f64,
    guess: f64,
) -> Result<f64, u32>
where
    F: FnMut(f64) -> (f64, f64),
{
    safeguarded_newton_to(f, lo, f_lo, hi, f_hi, guess, NEWTON_ACCEPT)
}

/// As [`safeguarded_newton`], ending at a Newton step shorter than `accept`.
pub(crate) fn safeguarded_newton_to<F>(
    mut f: F,
    lo: f64,
    f_lo: f64,
    hi: f64,
    f_hi: f64,
    guess: f64,
    accept: f64,
) -> Result<f64, u32>
where
    F: FnMut(f64) -> (f64, f64),
{
    if f_lo == 0.0 {
        return Ok(lo);
    }
    if f_hi == 0.0 {
        return Ok(hi);
    }
    if f_lo.is_nan() || f_hi.is_nan() || (f_lo > 0.0) == (f_hi > 0.0) {
        return Err(0);
    }
    // Orient so that f(xl) < 0 < f(xh).
    let (mut xl, mut xh) = if f_lo < 0.0 { (lo, hi) } else { (hi, lo) };
    let mut x = if guess.is_finite() {
        guess.clamp(lo.min(hi), lo.max(hi))
    } else {
        0.5 * (lo + hi)
    };
    let mut dx_old = (hi - lo).abs();
    let mut dx = dx_old;
    for iteration in 1..=MAX_ITERATIONS {
        let (fx, dfx) = f(x);
        if fx == 0.0 {
            return Ok(x);
        }
        if fx.is_nan() {
            return Err(iteration);
        }
        if fx < 0.0 {
            xl = x;
        } else {
            xh = x;
        }
        if dfx != 0.0 && dfx.is_finite() && (fx / dfx).abs() < accept {
            // Converged: a short Newton step (quadratic convergence), also
            // where the bracket end sits on x itself and the inside test
            // cannot hold.
            return Ok(x - fx / dfx);
        }
        let newton_ok = dfx != 0.0 && dfx.is_finite() && {
            let xn = x - fx / dfx;
            let inside = (xn - xl) * (xn - xh) < 0.0;
            inside && (2.0 * fx).abs() <= (dx_old * dfx).abs()
        };
        dx_old = dx;
        let x_new = if newton_ok {
            dx = fx / dfx;
            x - dx
        } else {
            dx = 0.5 * (xh - xl);
            xl + dx
        };
        if (x_new - x).abs() < X_TOLERANCE || (xh - xl).abs() < X_TOLERANCE {
            return Ok(x_new);
        }
        x = x_new;
    }
    Err(MAX_ITERATIONS)
}

/// A convergence test for the `roots` crate that is relative in x: Brent's
/// method stops when the bracket is narrower than `rel` times |x| (plus a
/// tiny absolute floor), so it serves quantities of any magnitude, or when
/// |f| falls below `y_tol` (f being a relative residual or a log ratio).
pub(crate) struct Relative {
    /// Relative width of the final bracket.
    pub rel: f64,
    /// |f| below which x is a root.
    pub y_tol: f64,
    /// Iteration cap.
    pub max_iter: usize,
}

impl roots::Convergency<f64> for Relative {
    fn is_root_found(&mut self, y: f64) -> bool {
        y.abs() <= self.y_tol
    }
    fn is_converged(&mut self, x1: f64, x2: f64) -> bool {
        (x1 - x2).abs() <= self.rel * x1.abs().max(x2.abs()) + 1e-300
    }
    fn is_iteration_limit_reached(&mut self, iter: usize) -> bool {
        iter >= self.max_iter
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn finds_a_simple_root() {
        let f = |x: f64| (x * x - 2.0, 2.0 * x);
        let r = safeguarded_newton(f, 0.0, -2.0, 2.0, 2.0, 1.0).unwrap();
        assert!((r - 2f64.sqrt()).abs() < 1e-12);
    }

    #[test]
    fn survives_a_useless_derivative() {
        // A derivative of zero everywhere forces bisection; it must still converge.
        let f = |x: f64| (x.powi(3) - 0.1, 0.0);
        let r = safeguarded_newton(f, -1.0, -1.1, 1.0, 0.9, 0.9).unwrap();
        assert!((r - 0.1f64.cbrt()).abs() < 1e-12);
    }

    #[test]
    fn refuses_a_bracket_without_a_sign_change() {
        let f = |x: f64| (x * x + 1.0, 2.0 * x);
        assert!(safeguarded_newton(f, -1.0, 2.0, 1.0, 2.0, 0.0).is_err());
    }
}
