//! Numbers for the hot path: fast `10^x` and `log10`, and the [`Real`]
//! trait that lets one formula run on plain `f64` or on a [`Tangent`], a
//! number that carries its first derivatives with respect to a few sources
//! (forward-mode differentiation: the chain rule applied at every
//! operation).
//!
//! The published fits are written once, generic over [`Real`]. On `f64`
//! they give the numbers the library reports; on a `Tangent` they give the
//! same value, bit for bit, and its exact first derivatives, which is what
//! the propagation of uncertainties needs.
//!
//! # Example
//! ```
//! use travertine::base::numeric::{Real, Tangent};
//! // d/dT of ln K at T = 298.15 K for ln K = a + b/T, by the chain rule:
//! fn ln_k<R: Real>(t: R) -> R {
//!     t.under(-2000.0) + 5.0
//! }
//! let t = Tangent::<1>::source(298.15, 0);
//! let y = ln_k(t);
//! assert_eq!(y.value(), ln_k(298.15));
//! assert!((y.d[0] - 2000.0 / (298.15f64 * 298.15)).abs() < 1e-15);
//! ```

use std::fmt::Debug;
use std::ops::{Add, AddAssign, Div, DivAssign, Mul, MulAssign, Neg, Sub, SubAssign};

const LN_10: f64 = std::f64::consts::LN_10;
const LOG10_E: f64 = std::f64::consts::LOG10_E;

/// 10^x through `exp`: faster than `powf` and within a few ulp of it.
#[inline]
pub(crate) fn pow10(x: f64) -> f64 {
    (x * LN_10).exp()
}

/// log10 through `ln`: faster than `log10` on common C libraries, within a few ulp.
#[inline]
pub(crate) fn log10(x: f64) -> f64 {
    x.ln() * LOG10_E
}

mod sealed {
    pub trait Sealed {}
    impl Sealed for f64 {}
    impl<const N: usize> Sealed for super::Tangent<N> {}
}

/// What a formula needs of a number: the four operations between two of
/// them and with a plain constant on the right, and the elementary
/// functions. Implemented for `f64` and [`Tangent`] only (sealed).
///
/// The value of every result is computed by exactly the `f64` operation of
/// the same name, so that a formula gives the same value on either type.
/// A constant on the left is written with [`Real::subtracted_from`]
/// (`c − x`) and [`Real::under`] (`c / x`); `c · x` and `c + x` are written
/// `x · c` and `x + c`, which IEEE arithmetic makes exactly equal.
/// Comparisons and branches read [`Real::value`]: a derivative is that of
/// the branch taken.
///
/// # Example
/// ```
/// use travertine::base::numeric::Real;
/// fn twice_ln<R: Real>(x: R) -> R {
///     x.ln() * 2.0
/// }
/// assert_eq!(twice_ln(1.0f64), 0.0);
/// ```
pub trait Real:
    sealed::Sealed
    + Copy
    + Default
    + Debug
    + PartialEq
    + Send
    + Sync
    + 'static
    + Add<Output = Self>
    + Sub<Output = Self>
    + Mul<Output = Self>
    + Div<Output = Self>
    + Neg<Output = Self>
    + Add<f64, Output = Self>
    + Sub<f64, Output = Self>
    + Mul<f64, Output = Self>
    + Div<f64, Output = Self>
    + AddAssign
    + SubAssign
    + MulAssign
    + DivAssign
{
    /// A constant: the value `x` with every derivative zero.
    fn constant(x: f64) -> Self;
    /// The value.
    fn value(self) -> f64;
    /// `c − self`.
    fn subtracted_from(self, c: f64) -> Self;
    /// `c / self`.
    fn under(self, c: f64) -> Self;
    /// Natural logarithm; d ln x = dx / x.
    fn ln(self) -> Self;
    /// Exponential; d eˣ = eˣ dx.
    fn exp(self) -> Self;
    /// log10 as the standard library computes it; d log10 x = log10(e) dx / x.
    fn log10(self) -> Self;
    /// log10 as the library's fast path computes it (`ln x · log10 e`).
    fn log10_via_ln(self) -> Self;
    /// 10ˣ as the library's fast path computes it (`exp(x ln 10)`);
    /// d 10ˣ = ln 10 · 10ˣ dx.
    fn pow10(self) -> Self;
    /// xᵖ for a constant p; d xᵖ = p xᵖ⁻¹ dx.
    fn powf(self, p: f64) -> Self;
    /// bˣ for a constant base b, computed as `b.powf(x)` (not through
    /// `exp`); d bˣ = ln b · bˣ dx.
    fn power_of(self, base: f64) -> Self;
    /// Square root; d √x = dx / (2 √x). At x = 0 a source that does not
    /// move x does not move √x (a slope of 0, not 0 · ∞): a sea-water fit
    /// evaluated at a constant salinity of 0 keeps finite temperature
    /// slopes.
    fn sqrt(self) -> Self;
    /// Absolute value; its derivative is the sign of the value times dx
    /// (that of the positive branch at 0).
    fn abs(self) -> Self;
    /// The larger of the value and a constant `c`, as `f64::max` gives it
    /// (`c` for a NaN value); the derivatives are those of the value where
    /// the result is the value, and zero where it is `c`.
    fn max(self, c: f64) -> Self;
    /// The root x of F(x, sources) = 0, found at `x` by a solver working on
    /// values, with its derivatives by implicit differentiation:
    /// dx/dsource = −(∂F/∂source) / (∂F/∂x), where `residual` is F
    /// evaluated at x held fixed (its derivatives are ∂F/∂source) and
    /// `slope` is ∂F/∂x. On `f64`, `x` alone.
    fn root(x: f64, residual: Self, slope: f64) -> Self;
    /// A number of value `v` whose derivatives are `slope` times this
    /// number's: a function of `self` whose value at this point is known
    /// without its arithmetic (a shortcut such as a pressure factor of
    /// exactly 1 at zero pressure) and whose slope there is `slope`. On
    /// `f64`, `v` alone (the slope is not read, and not computed once
    /// inlined). A slope that is not finite moves only with the sources
    /// that move this number (0 rather than 0 · ∞ or 0 · NaN elsewhere).
    fn with_slope(self, v: f64, slope: f64) -> Self;
}

impl Real for f64 {
    #[inline(always)]
    fn constant(x: f64) -> Self {
        x
    }
    #[inline(always)]
    fn value(self) -> f64 {
        self
    }
    #[inline(always)]
    fn subtracted_from(self, c: f64) -> Self {
        c - self
    }
    #[inline(always)]
    fn under(self, c: f64) -> Self {
        c / self
    }
    #[inline(always)]
    fn ln(self) -> Self {
        f64::ln(self)
    }
    #[inline(always)]
    fn exp(self) -> Self {
        f64::exp(self)
    }
    #[inline(always)]
    fn log10(self) -> Self {
        f64::log10(self)
    }
    #[inline(always)]
    fn log10_via_ln(self) -> Self {
        log10(self)
    }
    #[inline(always)]
    fn pow10(self) -> Self {
        pow10(self)
    }
    #[inline(always)]
    fn powf(self, p: f64) -> Self {
        f64::powf(self, p)
    }
    #[inline(always)]
    fn power_of(self, base: f64) -> Self {
        f64::powf(base, self)
    }
    #[inline(always)]
    fn sqrt(self) -> Self {
        f64::sqrt(self)
    }
    #[inline(always)]
    fn abs(self) -> Self {
        f64::abs(self)
    }
    #[inline(always)]
    fn max(self, c: f64) -> Self {
        f64::max(self, c)
    }
    #[inline(always)]
    fn root(x: f64, _: Self, _: f64) -> Self {
        x
    }
    #[inline(always)]
    fn with_slope(self, v: f64, _: f64) -> Self {
        v
    }
}

/// A value and its first derivatives with respect to `N` sources.
///
/// Arithmetic applies the chain rule: (a·b)' = a'b + ab', (a/b)' =
/// (a' − (a/b) b')/b, f(a)' = f'(a) a'. The value of every operation is the
/// `f64` operation itself.
///
/// # Example
/// ```
/// use travertine::base::numeric::{Real, Tangent};
/// let x = Tangent::<2>::source(3.0, 0);
/// let y = Tangent::<2>::source(2.0, 1);
/// let z = x * y + x.ln();
/// assert_eq!(z.value(), 6.0 + 3f64.ln());
/// assert_eq!(z.d, [2.0 + 1.0 / 3.0, 3.0]);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct Tangent<const N: usize> {
    /// The value.
    pub v: f64,
    /// ∂value/∂source, one per source.
    pub d: [f64; N],
}

/// Zero, with every derivative zero.
impl<const N: usize> Default for Tangent<N> {
    fn default() -> Self {
        Tangent {
            v: 0.0,
            d: [0.0; N],
        }
    }
}

impl<const N: usize> Tangent<N> {
    /// Source `i` itself: value `v`, derivative 1 with respect to source
    /// `i` and 0 to every other. An `i` of `N` or more gives a constant.
    ///
    /// ```
    /// # use travertine::base::numeric::Tangent;
    /// assert_eq!(Tangent::<3>::source(1.5, 1).d, [0.0, 1.0, 0.0]);
    /// ```
    pub fn source(v: f64, i: usize) -> Self {
        let mut d = [0.0; N];
        if let Some(x) = d.get_mut(i) {
            *x = 1.0;
        }
        Tangent { v, d }
    }

    /// A value with the given derivatives.
    ///
    /// ```
    /// # use travertine::base::numeric::Tangent;
    /// assert_eq!(Tangent::new(2.0, [1.0, 0.5]).d[1], 0.5);
    /// ```
    pub fn new(v: f64, d: [f64; N]) -> Self {
        Tangent { v, d }
    }

    /// The chain rule for a function of one variable: value `f`, slope
    /// `df` (df/dx at this value). A zero derivative stays zero even where
    /// the slope is infinite (√x at x = 0): a source that does not move x
    /// does not move f(x), where 0 · ∞ would give NaN.
    #[inline(always)]
    fn chain(self, f: f64, df: f64) -> Self {
        let mut d = self.d;
        for x in &mut d {
            *x *= df;
        }
        Tangent { v: f, d }
    }

    /// [`Tangent::chain`] where the slope may be infinite (√x and x^p,
    /// p < 1, at 0): a source that does not move x does not move f(x)
    /// (0, not 0 · ∞ = NaN).
    #[inline(always)]
    fn chain_steep(self, f: f64, df: f64) -> Self {
        if df.is_finite() {
            return self.chain(f, df);
        }
        let mut d = self.d;
        for x in &mut d {
            if *x != 0.0 {
                *x *= df;
            }
        }
        Tangent { v: f, d }
    }
}

impl<const N: usize> Add for Tangent<N> {
    type Output = Self;
    #[inline(always)]
    fn add(self, o: Self) -> Self {
        let mut d = self.d;
        for (x, y) in d.iter_mut().zip(o.d) {
            *x += y;
        }
        Tangent { v: self.v + o.v, d }
    }
}

impl<const N: usize> Sub for Tangent<N> {
    type Output = Self;
    #[inline(always)]
    fn sub(self, o: Self) -> Self {
        let mut d = self.d;
        for (x, y) in d.iter_mut().zip(o.d) {
            *x -= y;
        }
        Tangent { v: self.v - o.v, d }
    }
}

impl<const N: usize> Mul for Tangent<N> {
    type Output = Self;
    #[inline(always)]
    fn mul(self, o: Self) -> Self {
        let mut d = [0.0; N];
        for ((z, x), y) in d.iter_mut().zip(self.d).zip(o.d) {
            *z = x * o.v + y * self.v;
        }
        Tangent { v: self.v * o.v, d }
    }
}

impl<const N: usize> Div for Tangent<N> {
    type Output = Self;
    #[inline(always)]
    fn div(self, o: Self) -> Self {
        let v = self.v / o.v;
        let inv = 1.0 / o.v;
        let mut d = [0.0; N];
        for ((z, x), y) in d.iter_mut().zip(self.d).zip(o.d) {
            *z = (x - v * y) * inv;
        }
        Tangent { v, d }
    }
}

impl<const N: usize> Neg for Tangent<N> {
    type Output = Self;
    #[inline(always)]
    fn neg(self) -> Self {
        self.chain(-self.v, -1.0)
    }
}

impl<const N: usize> Add<f64> for Tangent<N> {
    type Output = Self;
    #[inline(always)]
    fn add(self, c: f64) -> Self {
        Tangent {
            v: self.v + c,
            d: self.d,
        }
    }
}

impl<const N: usize> Sub<f64> for Tangent<N> {
    type Output = Self;
    #[inline(always)]
    fn sub(self, c: f64) -> Self {
        Tangent {
            v: self.v - c,
            d: self.d,
        }
    }
}

impl<const N: usize> Mul<f64> for Tangent<N> {
    type Output = Self;
    #[inline(always)]
    fn mul(self, c: f64) -> Self {
        self.chain(self.v * c, c)
    }
}

impl<const N: usize> Div<f64> for Tangent<N> {
    type Output = Self;
    #[inline(always)]
    fn div(self, c: f64) -> Self {
        // The slope 1/c is rounded, the value is the exact f64 division.
        self.chain(self.v / c, 1.0 / c)
    }
}

macro_rules! assign_ops {
    ($($tr:ident $method:ident $op:tt),*) => {$(
        impl<const N: usize> $tr for Tangent<N> {
            #[inline(always)]
            fn $method(&mut self, o: Self) {
                *self = *self $op o;
            }
        }
    )*};
}
assign_ops!(AddAssign add_assign +, SubAssign sub_assign -, MulAssign mul_assign *, DivAssign div_assign /);

impl<const N: usize> Real for Tangent<N> {
    #[inline(always)]
    fn constant(x: f64) -> Self {
        Tangent { v: x, d: [0.0; N] }
    }
    #[inline(always)]
    fn value(self) -> f64 {
        self.v
    }
    #[inline(always)]
    fn subtracted_from(self, c: f64) -> Self {
        self.chain(c - self.v, -1.0)
    }
    #[inline(always)]
    fn under(self, c: f64) -> Self {
        let v = c / self.v;
        self.chain(v, -v / self.v)
    }
    #[inline(always)]
    fn ln(self) -> Self {
        self.chain(self.v.ln(), 1.0 / self.v)
    }
    #[inline(always)]
    fn exp(self) -> Self {
        let e = self.v.exp();
        self.chain(e, e)
    }
    #[inline(always)]
    fn log10(self) -> Self {
        self.chain(self.v.log10(), LOG10_E / self.v)
    }
    #[inline(always)]
    fn log10_via_ln(self) -> Self {
        self.chain(log10(self.v), LOG10_E / self.v)
    }
    #[inline(always)]
    fn pow10(self) -> Self {
        let e = pow10(self.v);
        self.chain(e, e * LN_10)
    }
    #[inline(always)]
    fn powf(self, p: f64) -> Self {
        let e = self.v.powf(p);
        self.chain_steep(e, p * self.v.powf(p - 1.0))
    }
    #[inline(always)]
    fn power_of(self, base: f64) -> Self {
        let e = base.powf(self.v);
        self.chain(e, e * base.ln())
    }
    #[inline(always)]
    fn sqrt(self) -> Self {
        let r = self.v.sqrt();
        self.chain_steep(r, 0.5 / r)
    }
    #[inline(always)]
    fn abs(self) -> Self {
        if self.v < 0.0 {
            -self
        } else {
            self
        }
    }
    #[inline(always)]
    fn max(self, c: f64) -> Self {
        let v = self.v.max(c);
        if v == self.v {
            Tangent { v, d: self.d }
        } else {
            Self::constant(v)
        }
    }
    #[inline(always)]
    fn root(x: f64, residual: Self, slope: f64) -> Self {
        residual.chain(x, -1.0 / slope)
    }
    #[inline(always)]
    fn with_slope(self, v: f64, slope: f64) -> Self {
        self.chain_steep(v, slope)
    }
}

#[cfg(test)]
mod tests {
    use super::{Real, Tangent};

    #[test]
    fn agree_with_std() {
        for x in [-14.0, -8.04, -0.5, 0.0, 3.3, 12.0] {
            let a = super::pow10(x);
            assert!((a / 10f64.powf(x) - 1.0).abs() < 1e-14);
            assert!((super::log10(a) - x).abs() < 1e-13);
        }
    }

    /// Every operation's value is the f64 operation's, and its derivative
    /// agrees with a central difference of the f64 operation (step 1e-6,
    /// truncation about 1e-12 relative for these smooth functions).
    #[test]
    fn tangent_values_are_the_f64_values_and_slopes_agree_with_central_differences() {
        type F = fn(Tangent<1>) -> Tangent<1>;
        type G = fn(f64) -> f64;
        let cases: [(&str, F, G); 17] = [
            ("ln", |x| x.ln(), |x| x.ln()),
            ("exp", |x| x.exp(), |x| x.exp()),
            ("log10", |x| Real::log10(x), f64::log10),
            ("log10_via_ln", |x| x.log10_via_ln(), super::log10),
            ("pow10", |x| x.pow10(), super::pow10),
            ("powf", |x| x.powf(1.7), |x| x.powf(1.7)),
            ("power_of", |x| x.power_of(10.0), |x| 10f64.powf(x)),
            ("sqrt", |x| x.sqrt(), |x| x.sqrt()),
            ("under", |x| x.under(3.0), |x| 3.0 / x),
            ("subtracted_from", |x| x.subtracted_from(3.0), |x| 3.0 - x),
            ("neg abs", |x| (-x).abs(), |x| (-x).abs()),
            (
                "mixed",
                |x| x * x / (x + 1.0) - x * 0.5,
                |x| x * x / (x + 1.0) - x * 0.5,
            ),
            ("div const", |x| x / 7.0, |x| x / 7.0),
            ("max, the value", |x| x.max(0.2), |x| x.max(0.2)),
            ("max, the constant", |x| x.max(9.0), |x| x.max(9.0)),
            (
                "with_slope",
                |x| x.with_slope(x.value().sqrt(), 0.5 / x.value().sqrt()),
                |x| x.sqrt(),
            ),
            (
                "assign",
                |x| {
                    let mut y = x;
                    y *= x;
                    y -= x;
                    y /= x + 2.0;
                    y += x;
                    y
                },
                |x| {
                    let mut y = x;
                    y *= x;
                    y -= x;
                    y /= x + 2.0;
                    y += x;
                    y
                },
            ),
        ];
        for (name, f, g) in cases {
            for x in [0.37, 1.3, 2.9, 7.5] {
                let t = f(Tangent::source(x, 0));
                assert_eq!(t.value().to_bits(), g(x).to_bits(), "{name} value at {x}");
                let h = 1e-6 * x;
                let cd = (g(x + h) - g(x - h)) / (2.0 * h);
                assert!(
                    (t.d[0] - cd).abs() <= 1e-8 * cd.abs().max(1.0),
                    "{name} at {x}: {} vs {cd}",
                    t.d[0]
                );
            }
        }
    }

    /// Implicit differentiation: the root of x² − s = 0 is √s, and
    /// dx/ds = 1/(2√s).
    #[test]
    fn root_takes_its_slope_from_implicit_differentiation() {
        let s = Tangent::<1>::source(2.0, 0);
        let x = 2f64.sqrt();
        let residual = s.subtracted_from(x * x); // F = x² − s at x held
        let r = Tangent::root(x, residual, 2.0 * x);
        assert_eq!(r.v, x);
        assert!((r.d[0] - 0.5 / x).abs() < 1e-15);
        assert_eq!(<f64 as Real>::root(x, 1.0, 2.0), x);
    }

    /// √x at x = 0: infinite slope for a source that moves x, none for
    /// one that does not (0 · ∞ would be NaN).
    #[test]
    fn sqrt_at_zero_moves_only_with_the_sources_that_move_its_argument() {
        let x = Tangent::new(0.0, [1.0, 0.0]);
        let r = x.sqrt();
        assert_eq!(r.v, 0.0);
        assert_eq!(r.d, [f64::INFINITY, 0.0]);
        assert_eq!(Tangent::<2>::constant(0.0).sqrt().d, [0.0, 0.0]);
    }

    /// `max` takes `f64::max`'s value, NaN included.
    #[test]
    fn max_of_nan_is_the_constant_without_slope() {
        let t = Tangent::new(f64::NAN, [1.0]).max(0.0);
        assert_eq!((t.v, t.d), (0.0, [0.0]));
        assert_eq!(<f64 as Real>::max(f64::NAN, 0.0), 0.0);
    }

    /// A constant zero under an infinite slope keeps a zero derivative
    /// (√x and x^p, p < 1, at 0).
    #[test]
    fn a_constant_zero_under_an_infinite_slope_keeps_a_zero_derivative() {
        let x = Tangent::<2>::new(0.0, [0.0, 1.0]);
        assert_eq!(x.sqrt().d, [0.0, f64::INFINITY]);
        assert_eq!(x.powf(0.5).d, [0.0, f64::INFINITY]);
        assert_eq!(Tangent::<1>::constant(0.0).powf(0.5).d, [0.0]);
    }

    #[test]
    fn a_source_beyond_the_width_is_a_constant() {
        assert_eq!(Tangent::<2>::source(1.0, 5).d, [0.0, 0.0]);
    }
}
