//! Writing rows: CSV with the input's fields unchanged, or one JSON object
//! per line. CSV numbers are written to the precision rule of their column
//! ([`crate::output::Output::digits`]) or with every digit
//! ([`Precision::Full`]); JSON numbers always have every digit (`ryu`,
//! shortest form).

use super::plan::Plan;
use super::row::Scratch;
use super::Format;
use crate::output::{Digits, Precision, Value};

/// How the output is written.
#[derive(Debug, Clone, Copy)]
pub(crate) struct Style {
    pub format: Format,
    pub delimiter: u8,
    pub crlf: bool,
    pub decimal_comma: bool,
}

/// A number as a CSV field: to `digits` or every digit (`precision`),
/// with the decimal comma where asked for, and quoted only when a decimal
/// comma meets a comma delimiter.
fn csv_number(out: &mut Vec<u8>, v: f64, digits: Digits, precision: Precision, style: &Style) {
    let point = if style.decimal_comma { b',' } else { b'.' };
    let start = out.len();
    precision.append(out, v, digits, point);
    if style.decimal_comma && style.delimiter == b',' && out[start..].contains(&b',') {
        out.insert(start, b'"');
        out.push(b'"');
    }
}

/// A number as a JSON value: every digit, as `solve --json` writes it
/// (`ryu`, the shortest text that reads back as the same f64).
fn json_number(out: &mut Vec<u8>, v: f64) {
    let mut r = ryu::Buffer::new();
    out.extend_from_slice(r.format_finite(v).as_bytes());
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
        for (i, column) in plan.computed.iter().enumerate() {
            match (s.values.get(i), column.digits()) {
                (Some(Value::Number(Some(v))), Some(digits)) if v.is_finite() => {
                    if !(first && i == 0) {
                        out.push(style.delimiter);
                    }
                    csv_number(out, *v, digits, plan.digits, style);
                }
                (Some(Value::Text(Some(t))), _) => {
                    csv_field(out, t.as_bytes(), style, first && i == 0)
                }
                _ => csv_field(out, b"", style, first && i == 0),
            }
        }
        for r in s.residuals.iter().chain(&s.dose).chain(&s.uncertain) {
            out.push(style.delimiter);
            if let Some((v, digits)) = r.filter(|(v, _)| v.is_finite()) {
                csv_number(out, v, digits, plan.digits, style);
            }
        }
        if plan.flags.is_some() {
            // The codes, separated by `;` (quoted where `;` is the delimiter).
            csv_field(out, s.flags.join(";").as_bytes(), style, false);
        }
        csv_field(out, s.status.name().as_bytes(), style, false);
        csv_field(out, self.message.as_bytes(), style, false);
        end_row(out, style);
    }

    fn json_row(&mut self, plan: &Plan, record: &csv::ByteRecord, s: &Scratch) {
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
                Some(Value::Number(Some(v))) if v.is_finite() => json_number(out, *v),
                Some(Value::Text(Some(t))) if !t.is_empty() => json_string(out, t.as_bytes()),
                _ => out.extend_from_slice(b"null"),
            }
        }
        for r in s.residuals.iter().chain(&s.dose).chain(&s.uncertain) {
            key(out, &mut k);
            match r {
                Some((v, _)) if v.is_finite() => json_number(out, *v),
                _ => out.extend_from_slice(b"null"),
            }
        }
        if plan.flags.is_some() {
            key(out, &mut k);
            if s.status == super::row::Status::Error {
                out.extend_from_slice(b"null");
            } else {
                out.push(b'[');
                for (i, code) in s.flags.iter().enumerate() {
                    if i > 0 {
                        out.push(b',');
                    }
                    json_string(out, code.as_bytes());
                }
                out.push(b']');
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

    fn csv(v: f64, digits: Digits, precision: Precision, delimiter: u8, comma: bool) -> String {
        let style = Style {
            format: Format::Csv,
            delimiter,
            crlf: false,
            decimal_comma: comma,
        };
        let mut out = Vec::new();
        csv_number(&mut out, v, digits, precision, &style);
        String::from_utf8(out).unwrap()
    }

    #[test]
    fn numbers_to_their_digits_with_a_decimal_point_or_comma() {
        // Formatting facts (rounding), not reference values.
        let s = Precision::Sensible;
        assert_eq!(
            csv(0.00609678, Digits::Significant(3), s, b',', false),
            "0.00610"
        );
        assert_eq!(
            csv(0.00609678, Digits::Significant(3), s, b';', true),
            "0,00610"
        );
        assert_eq!(
            csv(0.00609678, Digits::Significant(3), s, b',', true),
            "\"0,00610\""
        );
        assert_eq!(csv(117.00004, Digits::Significant(3), s, b',', true), "117");
        assert_eq!(csv(7.52, Digits::Decimals(3), s, b'\t', true), "7,520");
        let full = csv(
            8.040231466279433,
            Digits::Decimals(3),
            Precision::Full,
            b';',
            true,
        );
        assert_eq!(full, "8,040231466279433");
    }

    #[test]
    fn json_numbers_have_every_digit() {
        for v in [8.040231466279433, 0.00609678123, 2300.0, 1.5e-7] {
            let mut out = Vec::new();
            json_number(&mut out, v);
            let t = String::from_utf8(out).unwrap();
            assert_eq!(t.parse::<f64>().unwrap(), v, "{t}");
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
