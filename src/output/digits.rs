//! How many digits a number is written with: the precision rule of each
//! output ([`Digits`], chosen once per output in the list of outputs) and
//! the choice between it and every digit ([`Precision`]).

use std::fmt::Write as _;

/// The precision rule of an output: the digits the measurement behind it
/// supports. Each output takes its rule from its kind (a pH, an amount in
/// µmol/kg, a mass concentration in mg/L, a saturation state, ...) in the
/// list of outputs; see [`crate::output::Output::digits`].
///
/// # How a number is written
/// - `Decimals(d)`: rounded to `d` decimals, in plain decimal notation,
///   trailing zeros kept (`8.040`, `-0.26`). A value that rounds to zero
///   is written without a sign (`0.00`).
/// - `Significant(n)`: rounded to `n` significant figures, trailing zeros
///   kept (`402.8`, `0.00610`, `14120`). Between 1e-6 and 1e9 in
///   magnitude the notation is always plain decimal, never an exponent.
///   Outside that range, where plain notation would be mostly zeros, the
///   number is written with an exponent and the same significant figures
///   (`1.235e-7`, `4.560e12`). Zero is `0`.
///
/// Halves round away from zero. A number that is not finite is written as
/// Rust writes it (`NaN`, `inf`); the table and the sheet show nothing
/// there instead.
///
/// ```
/// use travertine::output::Digits;
/// assert_eq!(Digits::Decimals(3).format(8.040231), "8.040");
/// assert_eq!(Digits::Significant(3).format(0.00609678), "0.00610");
/// assert_eq!(Digits::Significant(4).format(402.7547), "402.8");
/// assert_eq!(Digits::Significant(4).format(14123.0), "14120");
/// assert_eq!(Digits::Significant(4).format(1.23456e-7), "1.235e-7");
/// assert_eq!(Digits::Decimals(2).format(-0.001), "0.00");
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
pub enum Digits {
    /// A fixed number of decimals.
    Decimals(u8),
    /// A fixed number of significant figures.
    Significant(u8),
}

/// The range of magnitudes a [`Digits::Significant`] number is written in
/// plain decimal notation: from `PLAIN_FROM` (included) to `PLAIN_BELOW`.
const PLAIN_FROM: f64 = 1e-6;
const PLAIN_BELOW: f64 = 1e9;

/// Powers of ten that are exact in f64.
const POW10: [f64; 23] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16,
    1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
];

/// 10^0 to 10^-22 (nearest doubles), for comparisons.
const NEG_POW10: [f64; 23] = [
    1e0, 1e-1, 1e-2, 1e-3, 1e-4, 1e-5, 1e-6, 1e-7, 1e-8, 1e-9, 1e-10, 1e-11, 1e-12, 1e-13, 1e-14,
    1e-15, 1e-16, 1e-17, 1e-18, 1e-19, 1e-20, 1e-21, 1e-22,
];

/// Below 2^53 every integer is a double, so a scaled value below it is
/// rounded exactly by [`round_half_up`].
const EXACT_INTEGERS: f64 = 9_007_199_254_740_992.0;

/// The decimal exponent of `a` (> 0, normal): `floor(log10(a))`, from the
/// binary exponent and one comparison; `None` outside 1e-22 to 1e22.
fn exponent10(a: f64) -> Option<i32> {
    let e2 = ((a.to_bits() >> 52) & 0x7ff) as i32 - 1023;
    // floor(e2 log10 2) in integers: 78913 / 2^18 is log10 2 to 6e-7,
    // exact for |e2| < 1700.
    let e10 = (e2 * 78913) >> 18;
    let next = e10 + 1;
    let p = if (0..=22).contains(&next) {
        POW10[next as usize]
    } else if (-22..0).contains(&next) {
        NEG_POW10[(-next) as usize]
    } else {
        return None;
    };
    Some(if a >= p { next } else { e10 })
}

/// `scaled` (0 ≤ scaled < 2^53) rounded to an integer, halves upwards,
/// without a call to the maths library: the fraction `scaled - trunc` is
/// exact.
#[inline]
fn round_half_up(scaled: f64) -> u64 {
    let t = scaled as u64;
    t + u64::from(scaled - t as f64 >= 0.5)
}

/// A number written: into a fixed buffer on the usual path, or a string
/// where Rust's own formatting wrote it.
pub(crate) struct Written {
    buf: [u8; 48],
    len: usize,
    text: Option<String>,
}

impl Written {
    fn new() -> Self {
        Written {
            buf: [0; 48],
            len: 0,
            text: None,
        }
    }

    /// Appends a byte; the callers write at most 41 (a sign, 16 digits, a
    /// point, 22 decimals and a leading zero).
    fn push(&mut self, b: u8) {
        self.buf[self.len] = b;
        self.len += 1;
    }

    /// The text written (ASCII).
    pub(crate) fn as_bytes(&self) -> &[u8] {
        match &self.text {
            Some(t) => t.as_bytes(),
            None => &self.buf[..self.len],
        }
    }

    /// `m` with a decimal point `decimals` digits from its end (a negative
    /// `decimals` appends that many zeros), a minus sign first when
    /// `negative` and `m` is not zero. `m` is below 2^53 and `decimals` at
    /// most 22.
    fn plain(negative: bool, m: u64, decimals: i32) -> Self {
        let mut w = Written::new();
        if negative && m != 0 {
            w.push(b'-');
        }
        let mut digits = [0u8; 20];
        let mut n = 0;
        let mut rest = m;
        loop {
            digits[19 - n] = b'0' + (rest % 10) as u8;
            n += 1;
            rest /= 10;
            if rest == 0 {
                break;
            }
        }
        let digits = &digits[20 - n..];
        if decimals <= 0 {
            for &d in digits {
                w.push(d);
            }
            for _ in 0..-decimals {
                w.push(b'0');
            }
            return w;
        }
        let decimals = decimals as usize;
        if n <= decimals {
            w.push(b'0');
            w.push(b'.');
            for _ in n..decimals {
                w.push(b'0');
            }
            for &d in digits {
                w.push(d);
            }
        } else {
            for &d in &digits[..n - decimals] {
                w.push(d);
            }
            w.push(b'.');
            for &d in &digits[n - decimals..] {
                w.push(d);
            }
        }
        w
    }

    /// The text of Rust's own formatting, for the rare cases the fast
    /// path leaves (very large or small values, many digits).
    fn from_std(args: std::fmt::Arguments<'_>) -> Self {
        let mut s = String::new();
        let _ = s.write_fmt(args);
        Written {
            text: Some(s),
            ..Written::new()
        }
    }
}

impl Digits {
    /// `v` written by this rule (see the type's documentation).
    ///
    /// ```
    /// use travertine::output::Digits;
    /// assert_eq!(Digits::Decimals(2).format(-0.2567), "-0.26");
    /// assert_eq!(Digits::Significant(4).format(2300.0), "2300");
    /// assert_eq!(Digits::Significant(4).format(0.0), "0");
    /// ```
    pub fn format(self, v: f64) -> String {
        let w = self.write(v);
        // ASCII by construction.
        String::from_utf8_lossy(w.as_bytes()).into_owned()
    }

    /// `v` written by this rule into a buffer, without allocating on the
    /// usual path.
    pub(crate) fn write(self, v: f64) -> Written {
        if !v.is_finite() {
            return Written::from_std(format_args!("{v}"));
        }
        let negative = v < 0.0;
        let a = v.abs();
        match self {
            Digits::Decimals(d) => {
                let d = i32::from(d);
                if d <= 22 {
                    let scaled = a * POW10[d as usize];
                    if scaled < EXACT_INTEGERS {
                        return Written::plain(negative, round_half_up(scaled), d);
                    }
                }
                // Rounded as Rust rounds; a value that rounds to zero has
                // no sign.
                let text = format!("{a:.prec$}", prec = d as usize);
                let zero = text.bytes().all(|b| b == b'0' || b == b'.');
                let sign = if negative && !zero { "-" } else { "" };
                Written::from_std(format_args!("{sign}{text}"))
            }
            Digits::Significant(n) => {
                let n = i32::from(n.max(1));
                if a == 0.0 {
                    return Written::plain(false, 0, 0);
                }
                let e10 = match exponent10(a) {
                    Some(e) if (PLAIN_FROM..PLAIN_BELOW).contains(&a) => e,
                    _ => {
                        return Written::from_std(format_args!(
                            "{v:.prec$e}",
                            prec = (n - 1) as usize
                        ))
                    }
                };
                let mut decimals = n - 1 - e10;
                let scaled = if (0..=22).contains(&decimals) {
                    a * POW10[decimals as usize]
                } else if (-22..0).contains(&decimals) {
                    a / POW10[(-decimals) as usize]
                } else {
                    f64::INFINITY
                };
                if scaled >= EXACT_INTEGERS {
                    return Written::from_std(format_args!(
                        "{v:.prec$}",
                        prec = decimals.max(0) as usize
                    ));
                }
                let mut m = round_half_up(scaled);
                // Rounded up to the next power of ten: one figure fewer
                // after the point (m is then exactly 10^n).
                if n <= 19 && m >= 10u64.pow(n as u32) {
                    m /= 10;
                    decimals -= 1;
                }
                Written::plain(negative, m, decimals)
            }
        }
    }

    /// The rule for a difference of values of magnitude `magnitude` (a
    /// residual: measured minus calculated): the decimals this rule gives
    /// such a value, so the difference is written to the place the values
    /// themselves are. A decimals rule is itself; significant figures give
    /// the decimals of the last figure, at least none (zero gives the
    /// decimals of 1).
    ///
    /// ```
    /// use travertine::output::Digits;
    /// // 117 mg/L to three figures is whole mg/L: so is its residual.
    /// assert_eq!(Digits::Significant(3).at(117.0), Digits::Decimals(0));
    /// assert_eq!(Digits::Significant(3).at(0.274), Digits::Decimals(3));
    /// assert_eq!(Digits::Decimals(3).at(7.9), Digits::Decimals(3));
    /// ```
    pub fn at(self, magnitude: f64) -> Digits {
        match self {
            Digits::Decimals(_) => self,
            Digits::Significant(n) => {
                let a = magnitude.abs();
                let a = if a > 0.0 && a.is_finite() { a } else { 1.0 };
                let e10 = exponent10(a).unwrap_or_else(|| a.log10().floor() as i32);
                let d = (i32::from(n) - 1 - e10).clamp(0, 22);
                Digits::Decimals(d as u8)
            }
        }
    }
}

/// How many digits the table of `travertine solve` and the CSV of
/// `travertine sheet` write: each output to its own rule ([`Digits`]), or
/// every digit.
///
/// The JSON of a state and the sheet's JSON lines always give every digit.
///
/// ```
/// use travertine::output::{Digits, Precision};
/// assert_eq!("full".parse::<Precision>()?, Precision::Full);
/// assert_eq!(Precision::default(), Precision::Sensible);
/// assert_eq!(Precision::Sensible.format(8.040231466279433, Digits::Decimals(3)), "8.040");
/// assert_eq!(Precision::Full.format(8.040231466279433, Digits::Decimals(3)), "8.040231466279433");
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Default)]
#[non_exhaustive]
pub enum Precision {
    /// Each output rounded to the digits its measurement supports (the
    /// [`Digits`] of the output): for reading.
    #[default]
    Sensible,
    /// Every digit: the shortest text that reads back as exactly the same
    /// f64 (Rust's `{}` formatting, never an exponent), for machine use.
    Full,
}

impl Precision {
    /// Every choice, for messages and help.
    ///
    /// ```
    /// use travertine::output::Precision;
    /// assert_eq!(Precision::ALL.len(), 2);
    /// ```
    pub const ALL: &'static [Precision] = &[Precision::Sensible, Precision::Full];

    /// The name on the command line: `sensible` or `full`.
    ///
    /// ```
    /// use travertine::output::Precision;
    /// assert_eq!(Precision::Full.name(), "full");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            Precision::Sensible => "sensible",
            Precision::Full => "full",
        }
    }

    /// `v` written with `digits` ([`Precision::Sensible`]) or every digit
    /// ([`Precision::Full`]).
    ///
    /// ```
    /// use travertine::output::{Digits, Precision};
    /// let v = 0.1 + 0.2;
    /// assert_eq!(Precision::Sensible.format(v, Digits::Significant(3)), "0.300");
    /// assert_eq!(Precision::Full.format(v, Digits::Significant(3)).parse::<f64>().unwrap(), v);
    /// ```
    pub fn format(self, v: f64, digits: Digits) -> String {
        match self {
            Precision::Sensible => digits.format(v),
            Precision::Full => v.to_string(),
        }
    }

    /// [`Precision::format`] appended to `out` as bytes, with `point` for
    /// the decimal point (the field sheet's writer).
    #[cfg(feature = "sheet")]
    pub(crate) fn append(self, out: &mut Vec<u8>, v: f64, digits: Digits, point: u8) {
        let start = out.len();
        match self {
            Precision::Sensible => out.extend_from_slice(digits.write(v).as_bytes()),
            Precision::Full => {
                use std::io::Write as _;
                let _ = write!(out, "{v}");
            }
        }
        if point != b'.' {
            for b in &mut out[start..] {
                if *b == b'.' {
                    *b = point;
                }
            }
        }
    }
}

impl std::fmt::Display for Precision {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}

impl std::str::FromStr for Precision {
    type Err = crate::base::error::Error;

    /// `sensible` or `full`, case and surrounding spaces ignored.
    ///
    /// # Errors
    /// [`crate::Error`] naming the text and the accepted names.
    fn from_str(s: &str) -> Result<Self, Self::Err> {
        let t = s.trim().to_ascii_lowercase();
        Precision::ALL
            .iter()
            .copied()
            .find(|p| p.name() == t)
            .ok_or_else(|| crate::base::error::Error::UnknownChoice {
                field: crate::base::field::Field::Digits,
                name: s.to_string(),
                accepted: "sensible, full".to_string(),
            })
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    // Formatting facts (rounding arithmetic), not reference values.

    #[test]
    fn decimals() {
        for (d, v, t) in [
            (3, 8.040231466, "8.040"),
            (3, 7.9, "7.900"),
            (3, 7.0, "7.000"),
            (2, -0.256696, "-0.26"),
            (2, 0.671601, "0.67"),
            (2, -0.004, "0.00"),
            (2, 0.0, "0.00"),
            (2, -0.0, "0.00"),
            (1, 0.05, "0.1"),
            (0, 2.5, "3"),
            (2, 1023.3431, "1023.34"),
            (3, 0.00061, "0.001"),
            (3, 123456789.0, "123456789.000"),
            (2, -1.5e20, "-150000000000000000000.00"),
            (30, 0.5, "0.500000000000000000000000000000"),
        ] {
            assert_eq!(Digits::Decimals(d).format(v), t, "{v} to {d} decimals");
        }
    }

    #[test]
    fn significant() {
        for (n, v, t) in [
            (3, 0.00609678, "0.00610"),
            (4, 402.7547, "402.8"),
            (4, 4199.18, "4199"),
            (4, 14123.0, "14120"),
            (4, 2300.0, "2300"),
            (4, 2000.0000001, "2000"),
            (4, 9999.7, "10000"),
            (3, 0.99995, "1.00"),
            (3, 117.00004, "117"),
            (3, 29.7193, "29.7"),
            (3, 0.274258, "0.274"),
            (3, -0.5, "-0.500"),
            (4, 0.0, "0"),
            (4, 4.082e-3, "0.004082"),
            (4, 1e-6, "0.000001000"),
            (4, 999_999_999.0, "1000000000"),
            (4, 123_456_789.0, "123500000"),
            (4, 1.23456e-7, "1.235e-7"),
            (4, 4.56e12, "4.560e12"),
            (4, -2.5e-9, "-2.500e-9"),
            (40, 1.0, "1.000000000000000000000000000000000000000"),
        ] {
            assert_eq!(Digits::Significant(n).format(v), t, "{v} to {n} figures");
        }
    }

    #[test]
    fn plain_notation_between_a_millionth_and_a_billion() {
        let mut v = 1e-6;
        while v < 1e9 {
            for n in 1..=8 {
                let t = Digits::Significant(n).format(v * 1.2345678);
                assert!(!t.contains('e'), "{t}");
                let back: f64 = t.parse().unwrap();
                // Within half a unit of the last figure written.
                let e = (v * 1.2345678).log10().floor() as i32;
                let unit = 10f64.powi(e + 1 - i32::from(n));
                assert!(
                    (back - v * 1.2345678).abs() <= 0.5 * unit * (1.0 + 1e-9),
                    "{t}"
                );
            }
            v *= 10.0;
        }
    }

    #[test]
    fn written_values_are_within_half_a_unit() {
        let mut x = 0.000_123_4_f64;
        for i in 0..5000 {
            x = (x * 1.618_033_988 + 0.000_7 * f64::from(i)) % 5000.0;
            let v = if i % 2 == 0 { x } else { -x };
            for d in 0..=6u8 {
                let back: f64 = Digits::Decimals(d).format(v).parse().unwrap();
                let unit = 10f64.powi(-i32::from(d));
                assert!((back - v).abs() <= 0.5 * unit * (1.0 + 1e-9), "{v} {d}");
                let std = format!("{v:.prec$}", prec = usize::from(d));
                let std: f64 = std.parse().unwrap();
                // Rust rounds the exact binary value, halves to even; the
                // two differ at most at a tie.
                assert!((back - std).abs() <= unit * (1.0 + 1e-9), "{v} {d}");
            }
        }
    }

    #[test]
    fn residual_places() {
        assert_eq!(Digits::Significant(4).at(2300.0), Digits::Decimals(0));
        assert_eq!(Digits::Significant(4).at(402.0), Digits::Decimals(1));
        assert_eq!(Digits::Significant(4).at(14000.0), Digits::Decimals(0));
        assert_eq!(Digits::Significant(4).at(0.0), Digits::Decimals(3));
        assert_eq!(Digits::Significant(3).at(f64::NAN), Digits::Decimals(2));
    }

    #[test]
    fn precision_names() {
        for p in Precision::ALL {
            assert_eq!(p.name().parse::<Precision>().unwrap(), *p);
        }
        assert_eq!(" Full ".parse::<Precision>().unwrap(), Precision::Full);
        let e = "some".parse::<Precision>().unwrap_err().to_string();
        assert!(e.contains("some") && e.contains("sensible, full"), "{e}");
    }

    #[test]
    fn full_reads_back_exactly() {
        for v in [8.040231466279433, 0.1 + 0.2, 1e-7, 2300.0, -0.0, 1.0 / 3.0] {
            let t = Precision::Full.format(v, Digits::Decimals(3));
            assert!(!t.contains('e'), "{t}");
            assert_eq!(t.parse::<f64>().unwrap().to_bits(), v.to_bits(), "{t}");
        }
    }

    #[test]
    #[cfg(feature = "sheet")]
    fn appended_with_a_decimal_comma() {
        for (p, v, d, t) in [
            (
                Precision::Full,
                8.040231466279433,
                Digits::Decimals(3),
                "8,040231466279433",
            ),
            (
                Precision::Sensible,
                8.040231466279433,
                Digits::Decimals(3),
                "8,040",
            ),
            (
                Precision::Sensible,
                2300.0001,
                Digits::Significant(4),
                "2300",
            ),
            (
                Precision::Sensible,
                0.00609678,
                Digits::Significant(3),
                "0,00610",
            ),
        ] {
            let mut out = b"x;".to_vec();
            p.append(&mut out, v, d, b',');
            assert_eq!(String::from_utf8(out).unwrap(), format!("x;{t}"));
        }
    }
}
