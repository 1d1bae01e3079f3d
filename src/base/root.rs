//! A bracketed, safeguarded Newton iteration for one scalar root.
//!
//! The bracket always holds a sign change. Each step is a Newton step when
//! that step stays inside the bracket and shrinks fast enough, and a
//! bisection otherwise, so the iteration converges for any continuous
//! function with a sign change, and quadratically near a simple root. This
//! is the classic safeguarded scheme (Press et al., Numerical Recipes, §9.4
//! "rtsafe"); Munhoven (2013) recommends the same safeguarding for the
//! alkalinity equation. Every function solved here is monotone on its
//! interval, which lets the ends of the interval go unevaluated until a
//! bisection needs them (see [`monotone_newton`]).

/// Relative tolerance on x.
pub(crate) const X_TOLERANCE: f64 = 1e-13;
/// A Newton step shorter than this (in ln x) ends the
/// iteration, returning the point after the step: near a simple root the
/// error after a step of length d is of order d², here about 1e-12
/// relative in h, far inside the 1e-9 of the round-trip tolerance.
pub(crate) const NEWTON_ACCEPT: f64 = 1e-6;
/// Iteration cap; reaching it is reported as non-convergence.
pub(crate) const MAX_ITERATIONS: u32 = 200;

/// Why [`monotone_newton`] found no root.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) enum Failure {
    /// f at the `lo` end has the sign f should have at `hi`, so the whole
    /// interval is on one side of the root (the value of f at `lo`).
    AtLo(f64),
    /// f at the `hi` end has the sign f should have at `lo` (the value of f
    /// at `hi`).
    AtHi(f64),
    /// The iteration cap was reached, or f gave NaN (the iterations spent).
    NoConvergence(u32),
}

/// The interval and shape of a monotone root search for a positive
/// unknown x, such as h. The iteration runs in ln x: Newton steps in ln x,
/// bisection at the geometric middle, tolerances relative in x; but it
/// keeps x itself, so that a step needs no exponential (see
/// [`monotone_newton`]).
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Search {
    /// The ends of the interval, 0 < `lo` < `hi`.
    pub lo: f64,
    pub hi: f64,
    /// Whether f decreases (else increases) over [lo, hi].
    pub decreasing: bool,
    /// f at the ends where already known.
    pub at_lo: Option<f64>,
    pub at_hi: Option<f64>,
    /// A Newton step shorter than this in ln x ends the iteration.
    pub accept: f64,
}

impl Search {
    /// f monotone over [lo, hi], neither end evaluated, ending at a step
    /// shorter than [`NEWTON_ACCEPT`].
    pub(crate) fn new(lo: f64, hi: f64, decreasing: bool) -> Self {
        Search {
            lo,
            hi,
            decreasing,
            at_lo: None,
            at_hi: None,
            accept: NEWTON_ACCEPT,
        }
    }
}

/// Finds x in [lo, hi] with f(x) = 0, for f known to be monotone there
/// but with its values at the ends not yet evaluated, except those given
/// in the [`Search`]. `f` returns (f, df/dx).
///
/// The iteration is a safeguarded Newton iteration on the bracket
/// between the points already seen on each side of the root, with the
/// unevaluated ends standing in for the sides not yet seen. By
/// monotonicity, such a bracket holds the root whenever [lo, hi] does. An
/// end is evaluated only when the iteration needs it, that is before a
/// bisection towards it or when a Newton step would leave [lo, hi]; an end
/// of the wrong sign means that no root lies in [lo, hi], and is reported
/// as [`Failure::AtLo`] or [`Failure::AtHi`]. A solve whose Newton steps
/// stay inside the interval (the usual case with a good first guess) thus
/// spends no evaluation on the ends, and convergence is still guaranteed:
/// every bisection is on a bracket whose ends are both evaluated.
#[inline(always)]
pub(crate) fn monotone_newton<F>(mut f: F, search: &Search, guess: f64) -> Result<f64, Failure>
where
    F: FnMut(f64) -> (f64, f64),
{
    let Search {
        lo,
        hi,
        decreasing,
        at_lo,
        at_hi,
        accept,
    } = *search;
    if !(lo < hi && lo > 0.0 && hi.is_finite()) {
        return Err(Failure::NoConvergence(0));
    }
    // Work with s·f, which is decreasing: positive towards lo, negative
    // towards hi.
    let s = if decreasing { 1.0 } else { -1.0 };
    let mut lo_checked = false;
    let mut hi_checked = false;
    // Checks an end value; Ok(Some(x)) when the end is itself the root.
    let check = |value: f64, at_lo_end: bool| -> Result<Option<f64>, Failure> {
        let v = s * value;
        if v.is_nan() {
            return Err(Failure::NoConvergence(0));
        }
        if v == 0.0 {
            return Ok(Some(if at_lo_end { lo } else { hi }));
        }
        match (at_lo_end, v > 0.0) {
            (true, false) => Err(Failure::AtLo(value)),
            (false, true) => Err(Failure::AtHi(value)),
            _ => Ok(None),
        }
    };
    if let Some(v) = at_lo {
        if let Some(root) = check(v, true)? {
            return Ok(root);
        }
        lo_checked = true;
    }
    if let Some(v) = at_hi {
        if let Some(root) = check(v, false)? {
            return Ok(root);
        }
        hi_checked = true;
    }
    let mut pos = lo;
    let mut neg = hi;
    let mut x = if guess.is_finite() {
        guess.clamp(lo, hi)
    } else {
        (lo * hi).sqrt()
    };
    // Step lengths are kept in ln x. The first two steps are judged against
    // the width of the interval in ln x, bounded from above through the
    // binary exponents (the test is a safeguard heuristic, and this needs no
    // logarithm).
    let mut dx_old = ln_width_bound(lo, hi);
    let mut dx = dx_old;
    for iteration in 1..=MAX_ITERATIONS {
        let (fx, dfx) = f(x);
        let (fx, dfx) = (s * fx, s * dfx);
        if fx == 0.0 {
            return Ok(x);
        }
        if fx.is_nan() {
            return Err(Failure::NoConvergence(iteration));
        }
        if fx > 0.0 {
            pos = x;
        } else {
            neg = x;
        }
        // The Newton step in ln x, d = f / (x df/dx), taken as
        // x (2 − d)/(2 + d): the [1/1] Padé form of x e^(−d), which differs
        // from it by O(d³), below the O(d²) error of the Newton step itself,
        // so convergence stays quadratic at the cost of a division instead
        // of an exponential.
        // With s = x df/dx: d = f/s and x (2 − d)/(2 + d) = x (2s − f)/(2s + f),
        // so the new point waits on one division, not two.
        let slope = dfx * x;
        let d = fx / slope;
        let xn = if d.abs() < 0.5 {
            x * (2.0 * slope - fx) / (2.0 * slope + fx)
        } else {
            x * (-d).exp()
        };
        let in_interval = xn.is_finite() && xn >= lo && xn <= hi;
        if in_interval && slope < 0.0 && d.abs() < accept {
            // Converged: a short Newton step, in the direction the known
            // monotonicity allows, that stays in [lo, hi].
            return Ok(xn);
        }
        let newton_ok =
            in_interval && (xn - pos) * (xn - neg) < 0.0 && (2.0 * d).abs() <= dx_old.abs();
        dx_old = dx;
        let x_new = if newton_ok {
            dx = d;
            xn
        } else {
            // Bisect, once the ends of the bracket are known to hold the root.
            if pos == lo && !lo_checked {
                if let Some(root) = check(f(lo).0, true)? {
                    return Ok(root);
                }
                lo_checked = true;
            }
            if neg == hi && !hi_checked {
                if let Some(root) = check(f(hi).0, false)? {
                    return Ok(root);
                }
                hi_checked = true;
            }
            // The geometric middle, without the product's underflow.
            let middle = pos.sqrt() * neg.sqrt();
            dx = (x / middle).ln();
            middle
        };
        let tolerance = X_TOLERANCE * x_new;
        if (x_new - x).abs() < tolerance || (neg - pos).abs() < tolerance {
            return Ok(x_new);
        }
        x = x_new;
    }
    Err(Failure::NoConvergence(MAX_ITERATIONS))
}

/// An upper bound of ln(hi / lo) for 0 < lo < hi, from the binary
/// exponents: (e(hi) − e(lo) + 1) ln 2.
fn ln_width_bound(lo: f64, hi: f64) -> f64 {
    let exponent = |v: f64| ((v.to_bits() >> 52) & 0x7ff) as f64;
    (exponent(hi) - exponent(lo) + 1.0) * std::f64::consts::LN_2
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

    fn search(lo: f64, hi: f64, decreasing: bool) -> Search {
        Search {
            accept: 1e-9,
            ..Search::new(lo, hi, decreasing)
        }
    }

    #[test]
    fn monotone_finds_roots_without_the_ends() {
        let mut calls = 0;
        let f = |x: f64| {
            calls += 1;
            (2.0 - x * x, -2.0 * x)
        };
        let r = monotone_newton(f, &search(0.1, 3.0, true), 1.5).unwrap();
        assert!((r - 2f64.sqrt()).abs() < 1e-12);
        assert!(calls < 8, "{calls} evaluations");
        // Increasing, from a poor guess.
        let g = |x: f64| (x.powi(3) - 0.1, 3.0 * x * x);
        let r = monotone_newton(g, &search(1e-3, 1.0, false), 0.99).unwrap();
        assert!((r - 0.1f64.cbrt()).abs() < 1e-12);
    }

    #[test]
    fn spans_decades() {
        // h from 1e-14 to 1 with the root at 1e-8, from a guess far off;
        // f = 1e-8/h − 1 is decreasing.
        let f = |h: f64| (1e-8 / h - 1.0, -1e-8 / (h * h));
        for guess in [1e-14, 1e-12, 1e-3, 1.0, f64::NAN] {
            let r = monotone_newton(f, &Search::new(1e-14, 1.0, true), guess).unwrap();
            assert!((r / 1e-8 - 1.0).abs() < 1e-10, "from {guess}: {r}");
        }
        // A useless derivative: geometric bisection still converges.
        let f = |h: f64| (-(h.ln() + 20.0), 0.0);
        let r = monotone_newton(f, &Search::new(1e-14, 1.0, true), 0.5).unwrap();
        assert!((r.ln() + 20.0).abs() < 1e-10, "{r}");
    }

    #[test]
    fn monotone_reports_which_end_has_no_root() {
        // Decreasing and positive throughout: the root lies above hi.
        let f = |x: f64| (5.0 - x, -1.0);
        assert!(matches!(
            monotone_newton(f, &search(0.5, 3.0, true), 1.0),
            Err(Failure::AtHi(v)) if (v - 2.0).abs() < 1e-12
        ));
        // Negative throughout: the root lies below lo.
        let f = |x: f64| (-1.0 - x, -1.0);
        assert!(matches!(
            monotone_newton(f, &search(0.5, 3.0, true), 1.0),
            Err(Failure::AtLo(_))
        ));
        // Across decades.
        let f = |h: f64| (1e-16 / h - 1.0, -1e-16 / (h * h));
        assert!(matches!(
            monotone_newton(f, &Search::new(1e-14, 1.0, true), 1e-8),
            Err(Failure::AtLo(_))
        ));
        // A known end of the wrong sign is refused at once.
        let f = |_: f64| -> (f64, f64) { panic!("not evaluated") };
        let known = Search {
            at_lo: Some(1.0),
            ..search(0.5, 3.0, false)
        };
        assert!(matches!(
            monotone_newton(f, &known, 1.0),
            Err(Failure::AtLo(_))
        ));
        // A useless derivative still converges, by bisection.
        let f = |x: f64| (0.5 - x.powi(3), 0.0);
        let r = monotone_newton(f, &search(0.1, 1.0, true), 0.9).unwrap();
        assert!((r - 0.5f64.cbrt()).abs() < 1e-12);
        // A derivative of the wrong sign never ends the search at a non-root.
        let f = |x: f64| (1.0 - x, 1.0);
        let r = monotone_newton(f, &search(0.5, 2.0, true), 1.0 + 1e-7).unwrap();
        assert!((r - 1.0).abs() < 1e-12, "{r}");
        // Intervals far from 1 bisect without underflow.
        let f = |x: f64| (1e-170 / x - 1.0, 0.0);
        let r = monotone_newton(f, &search(1e-200, 1e-150, true), 1e-190).unwrap();
        assert!((r / 1e-170 - 1.0).abs() < 1e-10, "{r}");
        // An empty or reversed interval is refused, not looped on.
        let f = |x: f64| (x, 1.0);
        assert!(monotone_newton(f, &search(1.0, 0.5, true), 0.7).is_err());
        assert!(monotone_newton(f, &search(f64::NAN, 1.0, true), 0.5).is_err());
        assert!(monotone_newton(f, &search(-1.0, 1.0, true), 0.5).is_err());
        assert!(monotone_newton(f, &search(0.5, f64::INFINITY, true), 0.7).is_err());
    }
}
