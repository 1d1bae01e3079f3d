//! The rows of a sheet, solved by the sheet itself, as the sheet charts
//! read them: the site, the date and time, the depth and the computed
//! values of each row.

use super::draw::days_from_civil;
use super::ChartError;
use crate::output::Precision;
use crate::sample::inputs::{number_column, Input};
use crate::sheet::{process, Format, SheetOptions, Summary};
use serde_json::{Map, Value};
use std::io::Read;

/// The computed columns the charts read.
const COMPUTED: &str = "water,ph_nbs,ph_total,pco2_uatm,free_co2_mg_l,si_calcite,omega_calcite,\
                        omega_aragonite,pressure_dbar";

/// Which columns of a sheet hold the site, the date, the time and the
/// depth. Each is found by its header unless named here.
///
/// Headers found by themselves (case and a bracketed unit aside):
/// - site: `site`, `pond`, `station`, `location`, `lake`, `tank`, `well`, `name`;
/// - date: `date`, `sample date`, `datetime`, `date time`, `timestamp`;
/// - time: `time`, `sample time`, `time of day`;
/// - depth: any header the sheet reads as the sample depth (`Depth (m)`,
///   `depth_m`, `Sample depth [ft]`).
///
/// ```
/// use travertine::chart::SheetColumns;
/// let c = SheetColumns::default().with_site("Pond").with_depth("Tiefe");
/// # let _ = c;
/// ```
#[derive(Debug, Clone, Default, PartialEq, Eq)]
#[non_exhaustive]
pub struct SheetColumns {
    site: Option<String>,
    date: Option<String>,
    time: Option<String>,
    depth: Option<String>,
}

impl SheetColumns {
    /// The column naming the site (one line per site).
    #[must_use]
    pub fn with_site(mut self, header: &str) -> Self {
        self.site = Some(header.to_string());
        self
    }
    /// The column of dates (`2031-06-02`, `2031-06-02 06:30`,
    /// `2031-06-02T06:30:00`, `02.06.2031`).
    #[must_use]
    pub fn with_date(mut self, header: &str) -> Self {
        self.date = Some(header.to_string());
        self
    }
    /// The column of times of day (`06:30`, `15:30:10`).
    #[must_use]
    pub fn with_time(mut self, header: &str) -> Self {
        self.time = Some(header.to_string());
        self
    }
    /// The column of depths, in metres unless its header names a unit the
    /// sheet reads (`ft`).
    #[must_use]
    pub fn with_depth(mut self, header: &str) -> Self {
        self.depth = Some(header.to_string());
        self
    }
}

/// One row as the charts read it.
#[derive(Debug, Clone)]
pub(super) struct Row {
    pub site: String,
    /// The data row of the sheet it is (1 for the first).
    pub number_in_sheet: usize,
    /// Days since 1970-01-01 (with the time of day as a fraction).
    pub when: Option<f64>,
    pub depth_m: Option<f64>,
    pub values: Map<String, Value>,
}

impl Row {
    /// A computed number (the `_calculated` column where the input had a
    /// column of the same name).
    pub fn number(&self, key: &str) -> Option<f64> {
        self.values
            .get(&format!("{key}_calculated"))
            .and_then(Value::as_f64)
            .or_else(|| self.values.get(key).and_then(Value::as_f64))
            .filter(|v| v.is_finite())
    }

    /// Whether the row's water is saline.
    pub fn saline(&self) -> bool {
        let w = self
            .values
            .get("water_calculated")
            .or_else(|| self.values.get("water"));
        w.and_then(Value::as_str) == Some("saline")
    }
}

/// A sheet solved for a chart: its rows with their sites, dates and depths.
#[derive(Debug, Clone)]
#[non_exhaustive]
pub struct SheetRows {
    pub(super) rows: Vec<Row>,
    pub(super) total: u64,
    pub(super) errors: u64,
    pub(super) first_error: Option<String>,
    pub(super) site_header: Option<String>,
    pub(super) date_header: Option<String>,
    pub(super) depth_header: Option<String>,
    /// Rows with a date cell that could not be read.
    pub(super) bad_dates: u64,
}

/// A header without its bracketed unit, lower case, single-spaced.
fn plain(header: &str) -> String {
    let h = header.split(['(', '[']).next().unwrap_or(header);
    h.replace('_', " ")
        .split_whitespace()
        .collect::<Vec<_>>()
        .join(" ")
        .to_lowercase()
}

fn find(headers: &[String], explicit: Option<&str>, names: &[&str]) -> Option<String> {
    if let Some(e) = explicit {
        return headers.iter().find(|h| h.as_str() == e).cloned();
    }
    names
        .iter()
        .find_map(|n| headers.iter().find(|h| plain(h) == *n))
        .cloned()
}

/// A number as typed, with a decimal point or comma.
fn cell_number(v: Option<&Value>) -> Option<f64> {
    let s = v?.as_str()?.trim();
    s.parse::<f64>()
        .ok()
        .or_else(|| s.replace(',', ".").parse::<f64>().ok())
        .filter(|x| x.is_finite())
}

/// `HH:MM` or `HH:MM:SS` as a fraction of a day.
fn time_of_day(s: &str) -> Option<f64> {
    let s = s.trim().trim_end_matches('Z');
    let parts: Vec<&str> = s.split(':').collect();
    if !(2..=3).contains(&parts.len()) {
        return None;
    }
    let h: u32 = parts[0].trim().parse().ok()?;
    let m: u32 = parts[1].trim().parse().ok()?;
    let sec: f64 = parts.get(2).map_or(Some(0.0), |p| p.trim().parse().ok())?;
    (h < 24 && m < 60 && (0.0..61.0).contains(&sec))
        .then(|| (f64::from(h) * 3600.0 + f64::from(m) * 60.0 + sec) / 86400.0)
}

/// A date (`2031-06-02`, `2031/06/02`, `02.06.2031`), with an optional
/// time after a space or `T`, as days since 1970-01-01.
///
/// The calendar arithmetic is in [`days_from_civil`].
pub(super) fn date_value(s: &str) -> Option<f64> {
    let s = s.trim();
    let (date, time) = match s.split_once(['T', ' ']) {
        Some((d, t)) => (d, Some(t)),
        None => (s, None),
    };
    let (y, m, d) = if date.contains('.') {
        let p: Vec<&str> = date.split('.').collect();
        if p.len() != 3 || p[2].len() != 4 {
            return None;
        }
        (p[2].parse().ok()?, p[1].parse().ok()?, p[0].parse().ok()?)
    } else {
        let p: Vec<&str> = date.split(['-', '/']).collect();
        if p.len() != 3 || p[0].len() != 4 {
            return None;
        }
        (
            p[0].parse::<i64>().ok()?,
            p[1].parse().ok()?,
            p[2].parse().ok()?,
        )
    };
    let days_in = [31, 29, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];
    if !(1..=12).contains(&m)
        || d == 0
        || d > days_in[(m - 1) as usize]
        || !(1000..=9999).contains(&y)
    {
        return None;
    }
    let day = days_from_civil(y, m, d) as f64;
    match time {
        Some(t) if !t.trim().is_empty() => Some(day + time_of_day(t)?),
        _ => Some(day),
    }
}

impl SheetRows {
    /// Solves the sheet `input` with `options` (its maps, settings, fits
    /// and profile; the output format and columns are the chart's own) and
    /// reads each row's site, date and time, and depth.
    ///
    /// # Errors
    /// [`ChartError::Sheet`] for a sheet that cannot be started (empty
    /// input, a header without a unit, no carbonate pair, ...).
    ///
    /// ```
    /// use travertine::chart::{SheetColumns, SheetRows};
    /// use travertine::sheet::SheetOptions;
    /// let sheet = "Pond,Date,Time,Temp (°C),pH (NBS),Alkalinity (mg/L as CaCO3)\n\
    ///              Alder,2031-06-02,06:30,24.3,7.52,117\n\
    ///              Alder,2031-06-02,15:30,26.7,8.39,abc\n";
    /// let rows = SheetRows::read(&SheetOptions::default(), &SheetColumns::default(), sheet.as_bytes())?;
    /// assert_eq!((rows.rows(), rows.errors()), (2, 1));
    /// # Ok::<(), travertine::chart::ChartError>(())
    /// ```
    pub fn read<R: Read + Send>(
        options: &SheetOptions,
        columns: &SheetColumns,
        input: R,
    ) -> Result<SheetRows, ChartError> {
        let options = options
            .clone()
            .with_format(Format::Jsonl)
            .with_digits(Precision::Full)
            .with_columns(COMPUTED)?;
        let mut out = Vec::new();
        let summary: Summary = process(&options, input, &mut out)?;
        let text = String::from_utf8_lossy(&out);
        let objects: Vec<Map<String, Value>> = text
            .lines()
            .filter_map(|l| serde_json::from_str::<Map<String, Value>>(l).ok())
            .collect();
        let computed: Vec<&str> = COMPUTED.split(',').collect();
        let headers: Vec<String> = objects
            .first()
            .map(|o| {
                o.keys()
                    .filter(|k| {
                        !computed.contains(&k.as_str())
                            && !k.ends_with("_calculated")
                            && !matches!(k.as_str(), "flags" | "status" | "message")
                    })
                    .cloned()
                    .collect()
            })
            .unwrap_or_default();
        let site = find(
            &headers,
            columns.site.as_deref(),
            &[
                "site", "pond", "station", "location", "lake", "tank", "well", "name",
            ],
        );
        let date = find(
            &headers,
            columns.date.as_deref(),
            &["date", "sample date", "datetime", "date time", "timestamp"],
        );
        let time = find(
            &headers,
            columns.time.as_deref(),
            &["time", "sample time", "time of day"],
        );
        let depth: Option<(String, f64, f64)> = match columns.depth.as_deref() {
            Some(h) => headers
                .iter()
                .find(|x| x.as_str() == h)
                .map(|x| match number_column(x) {
                    Some((Input::Depth, f, o)) => (x.clone(), f, o),
                    _ => (x.clone(), 1.0, 0.0),
                }),
            None => headers.iter().find_map(|h| match number_column(h) {
                Some((Input::Depth, f, o)) => Some((h.clone(), f, o)),
                _ => None,
            }),
        };
        for (what, asked, found) in [
            ("--site-column", &columns.site, &site),
            ("--date-column", &columns.date, &date),
            ("--time-column", &columns.time, &time),
        ] {
            if let (Some(a), None) = (asked, found) {
                return Err(ChartError::BadOption {
                    option: what,
                    value: a.clone(),
                    why: format!(
                        "is not a header of the sheet; its headers: {}",
                        headers.join(", ")
                    ),
                });
            }
        }
        if let (Some(a), None) = (&columns.depth, &depth) {
            return Err(ChartError::BadOption {
                option: "--depth-column",
                value: a.clone(),
                why: format!(
                    "is not a header of the sheet; its headers: {}",
                    headers.join(", ")
                ),
            });
        }
        let mut rows = Vec::new();
        let mut bad_dates = 0;
        for (i, o) in objects.into_iter().enumerate() {
            let status = o.get("status").and_then(Value::as_str).unwrap_or("error");
            if status == "error" {
                continue;
            }
            let when = date.as_ref().and_then(|d| {
                let cell = o.get(d).and_then(Value::as_str).unwrap_or("");
                let day = date_value(cell);
                let t = time
                    .as_ref()
                    .and_then(|t| o.get(t).and_then(Value::as_str))
                    .filter(|t| !t.trim().is_empty());
                match (day, t) {
                    (Some(day), Some(t)) if day.fract() == 0.0 => time_of_day(t).map(|f| day + f),
                    (day, _) => day,
                }
            });
            if date.is_some() && when.is_none() {
                bad_dates += 1;
            }
            let depth_m = depth
                .as_ref()
                .and_then(|(h, f, off)| cell_number(o.get(h)).map(|v| v * f + off));
            let site_name = site
                .as_ref()
                .and_then(|s| o.get(s).and_then(Value::as_str))
                .map(str::trim)
                .filter(|s| !s.is_empty())
                .unwrap_or(if site.is_some() {
                    "(no site)"
                } else {
                    "all samples"
                })
                .to_string();
            rows.push(Row {
                site: site_name,
                number_in_sheet: i + 1,
                when,
                depth_m,
                values: o,
            });
        }
        let first_error =
            summary
                .messages
                .iter()
                .find(|m| m.error)
                .map(|m| match m.lines.first() {
                    Some(l) => format!("line {l}: {}", m.message),
                    None => m.message.clone(),
                });
        Ok(SheetRows {
            rows,
            total: summary.rows,
            errors: summary.error,
            first_error,
            site_header: site,
            date_header: date,
            depth_header: depth.map(|d| d.0),
            bad_dates,
        })
    }

    /// Data rows read.
    pub fn rows(&self) -> u64 {
        self.total
    }

    /// Rows that could not be computed (left out of the charts).
    pub fn errors(&self) -> u64 {
        self.errors
    }

    /// The note on the rows left out, where any were.
    pub(super) fn error_note(&self) -> Option<String> {
        (self.errors > 0).then(|| {
            format!(
                "{} of {} rows are errors and are left out{}.",
                self.errors,
                self.total,
                self.first_error
                    .as_ref()
                    .map(|e| format!(" (the first, {e})"))
                    .unwrap_or_default()
            )
        })
    }

    /// An error for a sheet with no row to draw.
    pub(super) fn nothing(&self, what: &'static str) -> ChartError {
        let why = if self.total == 0 {
            "the sheet has a header but no data rows".to_string()
        } else {
            format!(
                "all {} rows of the sheet are errors{}; `travertine sheet` shows the message of each row",
                self.total,
                self.first_error
                    .as_ref()
                    .map(|e| format!(" (the first, {e})"))
                    .unwrap_or_default()
            )
        };
        ChartError::NothingToDraw { what, why }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn dates_read() {
        let d = date_value("2031-06-02").unwrap();
        assert_eq!(d, days_from_civil(2031, 6, 2) as f64);
        assert_eq!(date_value("02.06.2031"), Some(d));
        assert_eq!(date_value("2031/06/02"), Some(d));
        assert!((date_value("2031-06-02 06:30").unwrap() - (d + 0.270_833_333)).abs() < 1e-6);
        assert!((date_value("2031-06-02T15:30:00").unwrap() - (d + 0.645_833_333)).abs() < 1e-6);
        for bad in [
            "",
            "06/02/2031",
            "2031-13-01",
            "2031-02-30",
            "yesterday",
            "2031-06-02 25:00",
        ] {
            assert_eq!(date_value(bad), None, "{bad}");
        }
    }

    #[test]
    fn headers_found_without_their_units() {
        let h: Vec<String> = ["Pond", "Date", "Time", "Temp (°C)"]
            .iter()
            .map(|s| s.to_string())
            .collect();
        assert_eq!(find(&h, None, &["site", "pond"]), Some("Pond".into()));
        assert_eq!(find(&h, None, &["time"]), Some("Time".into()));
        assert_eq!(find(&h, Some("Nope"), &["time"]), None);
    }
}
