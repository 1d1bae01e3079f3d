//! Writing rows: CSV with the input's fields unchanged, or one JSON object
//! per line. Numbers are rounded to six significant digits and written
//! with `ryu` (shortest form).

use super::plan::Plan;
use super::row::Scratch;
use super::Format;
use crate::output::Value;

/// How the output is written.
#[derive(Debug, Clone, Copy)]
pub(crate) struct Style {
    pub format: Format,
    pub delimiter: u8,
    pub crlf: bool,
    pub decimal_comma: bool,
}

/// 10^-1 to 10^-22 (nearest doubles), for comparisons.
const NEG_POW10: [f64; 23] = [
    1e0, 1e-1, 1e-2, 1e-3, 1e-4, 1e-5, 1e-6, 1e-7, 1e-8, 1e-9, 1e-10, 1e-11, 1e-12, 1e-13, 1e-14,
    1e-15, 1e-16, 1e-17, 1e-18, 1e-19, 1e-20, 1e-21, 1e-22,
];

/// Powers of ten that are exact in f64.
const POW10: [f64; 23] = [
    1e0, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16,
    1e17, 1e18, 1e19, 1e20, 1e21, 1e22,
];

/// Significant digits written.
pub(crate) const DIGITS: i32 = 6;

/// `v` rounded to [`DIGITS`] significant digits (values too small or too
/// large for the table of exact powers are returned as they are).
pub(crate) fn round_significant(v: f64) -> f64 {
    if v == 0.0 || !v.is_finite() {
        return v;
    }
    let a = v.abs();
    // Decimal exponent from the binary one, corrected by one comparison.
    let e2 = ((a.to_bits() >> 52) & 0x7ff) as i32 - 1023;
    let mut e10 = (f64::from(e2) * std::f64::consts::LOG10_2).floor() as i32;
    let pow = |e: i32| -> Option<f64> {
        if (0..=22).contains(&e) {
            Some(POW10[e as usize])
        } else if (-22..0).contains(&e) {
            Some(1.0 / POW10[(-e) as usize])
        } else {
            None
        }
    };
    match pow(e10 + 1) {
        Some(p) if a >= p => e10 += 1,
        Some(_) => {}
        None => return v,
    }
    let p = DIGITS - 1 - e10;
    if (0..=22).contains(&p) {
        let m = POW10[p as usize];
        (v * m).round() / m
    } else if (-22..0).contains(&p) {
        let m = POW10[(-p) as usize];
        (v / m).round() * m
    } else {
        v
    }
}

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

/// Writes `v` rounded to [`DIGITS`] significant digits, in plain decimal
/// notation without trailing zeros (`29.7193`, `118`, `0.000123457`,
/// `1234570`). Values outside 1e-12 to 1e15 are written by `ryu` after
/// rounding.
fn write_number(out: &mut Vec<u8>, v: f64, style: &Style) {
    let mut buf = [0u8; 40];
    let n = format_number(&mut buf, v, style);
    append(out, &buf, n);
}

/// Appends `buf[..n]`. Numbers are short: a copy of a fixed 24 bytes, cut
/// back to `n`, is a few moves where a copy of `n` bytes is a call.
#[inline(always)]
fn append(out: &mut Vec<u8>, buf: &[u8; 40], n: usize) {
    if n <= 24 {
        let start = out.len();
        out.extend_from_slice(&buf[..24]);
        out.truncate(start + n);
    } else {
        out.extend_from_slice(&buf[..n]);
    }
}

/// [`write_number`] into a buffer; returns the length.
fn format_number(buf: &mut [u8; 40], v: f64, style: &Style) -> usize {
    let a = v.abs();
    if a == 0.0 {
        buf[0] = b'0';
        return 1;
    }
    let point = if style.decimal_comma { b',' } else { b'.' };
    let Some(e10) = exponent10(a).filter(|e| (-12..15).contains(e)) else {
        let mut r = ryu::Buffer::new();
        let s = r.format_finite(round_significant(v)).as_bytes();
        let n = s.len().min(buf.len());
        for (d, c) in buf.iter_mut().zip(&s[..n]) {
            *d = if *c == b'.' { point } else { *c };
        }
        return n;
    };
    // Decimals so that the integer `m` holds DIGITS significant digits.
    let mut decimals = DIGITS - 1 - e10;
    let scaled = if decimals >= 0 {
        a * POW10[decimals as usize]
    } else {
        a / POW10[(-decimals) as usize]
    };
    // `scaled` is positive and below 1e6 + 1: adding a half and truncating
    // rounds it (halves upwards) without a call to the maths library.
    let mut m = (scaled + 0.5) as i64 as u32;
    if m >= 1_000_000 {
        // Rounded up to the next power of ten.
        m /= 10;
        decimals -= 1;
    }
    let digits = six_digits(m);
    let mut len = 0;
    if v < 0.0 {
        buf[0] = b'-';
        len = 1;
    }
    if decimals <= 0 {
        // An integer: six digits and at most nine zeros (below 1e15).
        buf[len..len + 6].copy_from_slice(&digits);
        len += 6;
        for _ in 0..-decimals {
            buf[len] = b'0';
            len += 1;
        }
        return len;
    }
    let decimals = decimals as usize;
    let int_len = 6usize.saturating_sub(decimals);
    // Trailing zeros of the fraction are dropped.
    let mut last = 6;
    while last > int_len && digits[last - 1] == b'0' {
        last -= 1;
    }
    if int_len == 0 {
        // 0.000ddd: at most eleven leading zeros (above 1e-12).
        buf[len] = b'0';
        buf[len + 1] = point;
        len += 2;
        for _ in 6..decimals {
            buf[len] = b'0';
            len += 1;
        }
        buf[len..len + 6].copy_from_slice(&digits);
        return len + last;
    }
    // ddd.ddd: the six digits with the point put in after `int_len`.
    for i in 0..7 {
        buf[len + i] = match i.cmp(&int_len) {
            std::cmp::Ordering::Less => digits[i],
            std::cmp::Ordering::Equal => point,
            std::cmp::Ordering::Greater => digits[i - 1],
        };
    }
    len + if last > int_len { last + 1 } else { int_len }
}

/// "00" to "99".
const PAIRS: &[u8; 200] = b"0001020304050607080910111213141516171819\
2021222324252627282930313233343536373839\
4041424344454647484950515253545556575859\
6061626364656667686970717273747576777879\
8081828384858687888990919293949596979899";

/// The six decimal digits of `m` (below 1 000 000), leading zeros kept.
fn six_digits(m: u32) -> [u8; 6] {
    let (hi, rest) = ((m / 10_000) as usize, m % 10_000);
    let (mid, lo) = ((rest / 100) as usize, (rest % 100) as usize);
    [
        PAIRS[2 * hi],
        PAIRS[2 * hi + 1],
        PAIRS[2 * mid],
        PAIRS[2 * mid + 1],
        PAIRS[2 * lo],
        PAIRS[2 * lo + 1],
    ]
}

/// A number as a CSV field: quoted only when a decimal comma meets a comma
/// delimiter.
fn csv_number(out: &mut Vec<u8>, v: f64, style: &Style) {
    let mut buf = [0u8; 40];
    let n = format_number(&mut buf, v, style);
    if style.decimal_comma && style.delimiter == b',' && buf[..n].contains(&b',') {
        out.push(b'"');
        append(out, &buf, n);
        out.push(b'"');
    } else {
        append(out, &buf, n);
    }
}

/// Whether a CSV field must be quoted.
fn needs_quotes(field: &[u8], delimiter: u8) -> bool {
    field
        .iter()
        .any(|&b| b == delimiter || b == b'"' || b == b'\n' || b == b'\r')
}

/// Appends one CSV field (quoted when it must be), preceded by the
/// delimiter unless it is the first of its row.
fn csv_field(out: &mut Vec<u8>, field: &[u8], style: &Style, first: bool) {
    if !first {
        out.push(style.delimiter);
    }
    if field.len() <= 16 {
        // Short fields are copied byte by byte, cheaper than a call to
        // copy them, and checked for quoting on the way.
        let start = out.len();
        out.reserve(16);
        let d = style.delimiter;
        for &b in field {
            if b == d || b == b'"' || b == b'\n' || b == b'\r' {
                out.truncate(start);
                return quoted(out, field);
            }
            out.push(b);
        }
        return;
    }
    if needs_quotes(field, style.delimiter) {
        quoted(out, field);
    } else {
        out.extend_from_slice(field);
    }
}

fn quoted(out: &mut Vec<u8>, field: &[u8]) {
    out.push(b'"');
    for &b in field {
        if b == b'"' {
            out.push(b'"');
        }
        out.push(b);
    }
    out.push(b'"');
}

fn end_row(out: &mut Vec<u8>, style: &Style) {
    if style.crlf {
        out.extend_from_slice(b"\r\n");
    } else {
        out.push(b'\n');
    }
}

/// The header of a CSV output (with the input's BOM when it had one).
pub(crate) fn csv_header(plan: &Plan, style: &Style, bom: bool) -> Vec<u8> {
    let mut out = if bom {
        vec![0xEF, 0xBB, 0xBF]
    } else {
        Vec::new()
    };
    let names = plan
        .headers
        .iter()
        .map(Vec::as_slice)
        .chain(plan.added.iter().map(|a| a.as_bytes()));
    for (i, h) in names.enumerate() {
        csv_field(&mut out, h, style, i == 0);
    }
    end_row(&mut out, style);
    out
}

/// JSON string of `bytes` (invalid UTF-8 replaced), appended to `out`.
fn json_string(out: &mut Vec<u8>, bytes: &[u8]) {
    let lossy;
    let text: &str = match std::str::from_utf8(bytes) {
        Ok(t) => t,
        Err(_) => {
            lossy = String::from_utf8_lossy(bytes);
            &lossy
        }
    };
    out.push(b'"');
    let mut start = 0;
    let b = text.as_bytes();
    for (i, &c) in b.iter().enumerate() {
        let esc: Option<&[u8]> = match c {
            b'"' => Some(b"\\\""),
            b'\\' => Some(b"\\\\"),
            b'\n' => Some(b"\\n"),
            b'\r' => Some(b"\\r"),
            b'\t' => Some(b"\\t"),
            0..=0x1f => None,
            _ => continue,
        };
        out.extend_from_slice(&b[start..i]);
        match esc {
            Some(e) => out.extend_from_slice(e),
            None => out.extend_from_slice(format!("\\u{c:04x}").as_bytes()),
        }
        start = i + 1;
    }
    out.extend_from_slice(&b[start..]);
    out.push(b'"');
}

/// The keys of JSON output, each written once as `"key":`. Repeated input
/// headers get `_2`, `_3`, ...
pub(crate) fn json_keys(plan: &Plan) -> Vec<Vec<u8>> {
    let mut names: Vec<String> = Vec::new();
    for h in plan
        .headers
        .iter()
        .map(|h| String::from_utf8_lossy(h).into_owned())
        .chain(plan.added.iter().cloned())
    {
        let mut name = h.clone();
        let mut n = 2;
        while names.contains(&name) {
            name = format!("{h}_{n}");
            n += 1;
        }
        names.push(name);
    }
    names
        .iter()
        .map(|n| {
            let mut k = Vec::new();
            json_string(&mut k, n.as_bytes());
            k.push(b':');
            k
        })
        .collect()
}

/// Writes rows into a buffer.
pub(crate) struct RowWriter<'p> {
    out: Vec<u8>,
    keys: &'p [Vec<u8>],
    style: Style,
    message: String,
}

impl<'p> RowWriter<'p> {
    pub(crate) fn new(style: Style, keys: &'p [Vec<u8>], capacity: usize) -> Self {
        RowWriter {
            out: Vec::with_capacity(capacity),
            keys,
            style,
            message: String::new(),
        }
    }

    /// The bytes written.
    pub(crate) fn finish(self) -> Vec<u8> {
        self.out
    }

    /// Writes one row.
    pub(crate) fn row(&mut self, plan: &Plan, record: &csv::ByteRecord, s: &Scratch) {
        join_messages(&mut self.message, s);
        match self.style.format {
            Format::Csv => self.csv_row(plan, record, s),
            Format::Jsonl => self.json_row(plan, record, s),
        }
    }

    fn csv_row(&mut self, plan: &Plan, record: &csv::ByteRecord, s: &Scratch) {
        let (out, style) = (&mut self.out, &self.style);
        for i in 0..plan.width {
            csv_field(out, record.get(i).unwrap_or_default(), style, i == 0);
        }
        let first = plan.width == 0;
        for i in 0..plan.computed.len() {
            match s.values.get(i) {
                Some(Value::Number(Some(v))) if v.is_finite() => {
                    out.push(style.delimiter);
                    csv_number(out, *v, style);
                }
                Some(Value::Text(Some(t))) => csv_field(out, t.as_bytes(), style, first && i == 0),
                _ => csv_field(out, b"", style, first && i == 0),
            }
        }
        for r in &s.residuals {
            out.push(style.delimiter);
            if let Some(v) = r.filter(|v| v.is_finite()) {
                csv_number(out, v, style);
            }
        }
        csv_field(out, s.status.name().as_bytes(), style, false);
        csv_field(out, self.message.as_bytes(), style, false);
        end_row(out, style);
    }

    fn json_row(&mut self, plan: &Plan, record: &csv::ByteRecord, s: &Scratch) {
        let plain = Style {
            decimal_comma: false,
            ..self.style
        };
        let (out, keys) = (&mut self.out, self.keys);
        out.push(b'{');
        let mut k = 0;
        let key = |out: &mut Vec<u8>, k: &mut usize| {
            if *k > 0 {
                out.push(b',');
            }
            out.extend_from_slice(&keys[*k]);
            *k += 1;
        };
        for i in 0..plan.width {
            key(out, &mut k);
            json_string(out, record.get(i).unwrap_or_default());
        }
        for i in 0..plan.computed.len() {
            key(out, &mut k);
            match s.values.get(i) {
                Some(Value::Number(Some(v))) if v.is_finite() => write_number(out, *v, &plain),
                Some(Value::Text(Some(t))) if !t.is_empty() => json_string(out, t.as_bytes()),
                _ => out.extend_from_slice(b"null"),
            }
        }
        for r in &s.residuals {
            key(out, &mut k);
            match r {
                Some(v) if v.is_finite() => write_number(out, *v, &plain),
                _ => out.extend_from_slice(b"null"),
            }
        }
        key(out, &mut k);
        json_string(out, s.status.name().as_bytes());
        key(out, &mut k);
        json_string(out, self.message.as_bytes());
        out.extend_from_slice(b"}\n");
    }
}

fn join_messages(message: &mut String, s: &Scratch) {
    message.clear();
    for (i, issue) in s.issues.iter().enumerate() {
        if i > 0 {
            message.push_str("; ");
        }
        message.push_str(&issue.text);
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn six_significant_digits() {
        // Plain arithmetic facts about rounding, not reference values.
        assert_eq!(round_significant(7.912345678), 7.91235);
        assert_eq!(round_significant(2300.123456), 2300.12);
        assert_eq!(round_significant(-0.000123456789), -0.000123457);
        assert_eq!(round_significant(1234567.0), 1234570.0);
        assert_eq!(round_significant(1000.0), 1000.0);
        assert_eq!(round_significant(999999.7), 1000000.0);
        assert_eq!(round_significant(0.0), 0.0);
        assert_eq!(round_significant(1e-30), 1e-30);
        let mut b = ryu::Buffer::new();
        assert_eq!(b.format_finite(round_significant(8.040199999)), "8.0402");
    }

    fn text(v: f64, decimal_comma: bool) -> String {
        let style = Style {
            format: Format::Csv,
            delimiter: b';',
            crlf: false,
            decimal_comma,
        };
        let mut out = Vec::new();
        write_number(&mut out, v, &style);
        String::from_utf8(out).unwrap()
    }

    #[test]
    fn plain_decimal_numbers() {
        // Formatting facts (six significant digits), not reference values.
        for (v, t) in [
            (29.71934, "29.7193"),
            (118.0, "118"),
            (118.00004, "118"),
            (7.9, "7.9"),
            (-0.000123456789, "-0.000123457"),
            (1234567.0, "1234570"),
            (999999.7, "1000000"),
            (0.99999995, "1"),
            (0.0, "0"),
            (-0.0, "0"),
            (1e-13, "1e-13"),
            (2.5e20, "2.5e20"),
            (0.5, "0.5"),
            (100000.0, "100000"),
            (0.00100000, "0.001"),
        ] {
            assert_eq!(text(v, false), t, "{v}");
        }
        assert_eq!(text(7.9, true), "7,9");
        for i in 1..2000 {
            let v = i as f64 * 0.7319 - 300.0;
            let t: f64 = text(v, false).parse().unwrap();
            assert_eq!(t, round_significant(v), "{v}");
        }
    }

    #[test]
    fn json_strings_are_escaped() {
        let mut out = Vec::new();
        json_string(&mut out, b"a\"b\\c\nd\x01\xff");
        assert_eq!(
            String::from_utf8(out).unwrap(),
            "\"a\\\"b\\\\c\\nd\\u0001\u{fffd}\""
        );
    }
}
