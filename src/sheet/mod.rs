//! A field sheet: every row of a CSV file solved, in order, with its status.
//!
//! Practitioners export a field sheet or a logger file with hundreds to
//! millions of rows. [`run`] (files and the standard streams) and
//! [`process`] (any reader and writer) read it as a stream, solve the rows
//! in parallel and write every row back, in input order, with the computed
//! columns, then `status` (`ok`, `warning` or `error`) and `message`. A
//! bad row never stops the batch and is never dropped.
//!
//! # Columns
//! A column is recognised by its header:
//! - the canonical snake_case names with the unit in the name:
//!   `alkalinity_mg_l_caco3`, `alkalinity_umol_kg`, `ph_nbs`, `ph_total`,
//!   `dic_umol_kg`, `pco2_uatm`, `temperature_c`, `salinity`,
//!   `conductivity_us_cm`, `specific_conductance_us_cm`, `calcium_mg_l`,
//!   `pressure_dbar`, `ammonia_mg_l_n`, `phosphate_umol_kg`, ...;
//! - common spellings with the unit in brackets or after a comma, case and
//!   spacing insensitive: `Alkalinity (mg/L as CaCO3)`, `Temp [°C]`,
//!   `pH (NBS)`, `TAN (mg/L)`, `Specific conductance (µS/cm)`;
//! - [`SheetOptions::with_map`] (`--map NAME=HEADER`) for anything else,
//!   and `--map ignore=HEADER` to pass a column through unread.
//!
//! A header that names a quantity without a unit that can be read
//! (`Alkalinity`, `Alkalinity (mg/L)`, `Salinity (ppt)`) stops the sheet
//! with [`SheetError::HeaderUnit`], which names it and suggests `--map`.
//! No unit is ever guessed. A bare `pH` is on the medium's default scale
//! (NBS in fresh water, total in saline water), as in `travertine solve`.
//! Every other column passes through unchanged, in its place.
//!
//! # Rows
//! - Each row takes its pair from the carbonate parameters it has, in the
//!   order alkalinity, DIC, pH, pCO2, fCO2, xCO2, CO2*, HCO3-, CO3-- (the
//!   first two that can be used together), unless
//!   [`SheetOptions::with_pair`] forces one. Every other measured carbonate
//!   parameter gets a `*_residual` column: measured minus calculated, the
//!   internal-consistency check of quality control.
//! - Conditions, medium and fits come from columns or, for every row, from
//!   [`SheetOptions::with_set`] (`--set temperature_c=25`, `--set
//!   water=fresh`). A value may not come from both.
//! - An empty cell, `NA`, `N/A` or `-` means "not measured". A cell that
//!   cannot be read (`7..9`, `NaN`, `78 °F` in a °C column) is an error of
//!   that row only; so is a row with too few or too many fields (the extra
//!   fields are quoted in the message, so nothing is lost).
//! - A temperature above 40 °C in a °C column is computed but cautioned:
//!   it is often a reading in °F.
//! - A cell with a line break that runs on over more than 10 lines or
//!   64 KiB is taken for a quote never closed (which takes every line after
//!   it into the cell): the row is an error naming the line where the
//!   quote opened. The cell is written back unchanged.
//! - Messages and the [`Summary`] give the line a row starts on as an
//!   editor shows it: `\n`, `\r\n` and a lone `\r` each end a line, and a
//!   line break in a quoted cell is a line.
//! - The input is UTF-8 (invalid bytes pass through); a file in UTF-16
//!   stops the sheet with [`SheetError::Utf16`].
//!
//! # Output
//! The input's fields unchanged (invalid UTF-8 included), then the computed
//! columns ([`SheetOptions::with_columns`]; defaults for field work in
//! [`UnitSystem::Trade`] or [`UnitSystem::Ocean`] units), the residuals,
//! `flags` (the codes of the quality flags raised, separated by `;`, judged
//! against a profile: [`SheetOptions::with_profile`]), `status` and
//! `message`. A computed column whose name an input header
//! already has is written as `NAME_calculated`. In CSV output each
//! computed number has the digits its measurement supports, in the unit of
//! its column (pH 3 decimals, µmol/kg and µatm 4 significant figures, mg/L
//! 3 significant figures: [`crate::output::Output::digits`]), or every
//! digit with [`SheetOptions::with_digits`]. CSV output keeps the input's
//! delimiter, line endings, byte-order mark and decimal comma; JSON lines
//! ([`Format::Jsonl`]) give each row as one object with the same keys and
//! every digit.
//!
//! # Example
//! ```
//! use travertine::sheet::{process, SheetOptions};
//! let sheet = "pond,Temp (°C),Specific conductance (µS/cm),pH (NBS),\
//!              Alkalinity (mg/L as CaCO3),Calcium hardness (mg/L as CaCO3)\n\
//!              north,24.5,410,7.9,118,80\n\
//!              south,25.1,395,7..9,102,75\n";
//! let mut out = Vec::new();
//! let summary = process(&SheetOptions::default(), sheet.as_bytes(), &mut out)?;
//! assert_eq!((summary.rows, summary.ok, summary.error), (2, 1, 1));
//! let text = String::from_utf8(out).unwrap();
//! let lines: Vec<&str> = text.lines().collect();
//! assert!(lines[0].ends_with("langelier_index,flags,status,message"));
//! // The inputs as typed, then the computed pH to three decimals.
//! assert!(lines[1].starts_with("north,24.5,410,7.9,118,80,fresh,7.900,"));
//! assert!(lines[2].ends_with(",error,column `pH (NBS)`: `7..9` is not a number"));
//! # Ok::<(), travertine::sheet::SheetError>(())
//! ```

mod batch;
mod cell;
mod columns;
mod error;
mod files;
// The header recognition lives with the list of inputs (the bindings name
// inputs the same way); the sheet's modules reach it as `super::header`.
pub(crate) use crate::sample::inputs::header;
mod lines;
mod pair;
mod pipeline;
mod plan;
mod row;
mod summary;
mod write;

pub use batch::{input_named, Batch, Outcome};
pub use cell::Cell;
pub use columns::UnitSystem;
pub use error::SheetError;
pub use files::{remove_unfinished_outputs, Sink, Source};
pub use header::column_guide;
pub use summary::{MessageCount, Summary};

use crate::decisions::dose::DoseRequest;
use crate::decisions::Profile;
use crate::output::Precision;
use crate::sample::measured::Parameter;
use crate::solve::RootChoice;
use std::io::{IsTerminal, Read, Write};

/// The output format.
///
/// ```
/// use travertine::sheet::Format;
/// assert_eq!("jsonl".parse::<Format>()?, Format::Jsonl);
/// # Ok::<(), travertine::sheet::SheetError>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
#[non_exhaustive]
pub enum Format {
    /// CSV with the input's delimiter.
    #[default]
    Csv,
    /// One JSON object per line.
    Jsonl,
}

impl std::str::FromStr for Format {
    type Err = SheetError;
    fn from_str(s: &str) -> Result<Self, SheetError> {
        match s.trim().to_ascii_lowercase().as_str() {
            "csv" => Ok(Format::Csv),
            "jsonl" | "json-lines" | "ndjson" => Ok(Format::Jsonl),
            _ => Err(SheetError::BadOption {
                option: "--format",
                message: format!("`{s}` is not an output format; accepted: csv, jsonl"),
            }),
        }
    }
}

/// The name `FromStr` reads: `csv` or `jsonl`.
///
/// ```
/// use travertine::sheet::Format;
/// assert_eq!(Format::Jsonl.to_string().parse::<Format>()?, Format::Jsonl);
/// # Ok::<(), travertine::sheet::SheetError>(())
/// ```
impl std::fmt::Display for Format {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(match self {
            Format::Csv => "csv",
            Format::Jsonl => "jsonl",
        })
    }
}

/// When to draw a progress bar.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
#[non_exhaustive]
pub enum Progress {
    /// Never.
    #[default]
    Never,
    /// On stderr when it is a terminal, outside CI, for an input file of
    /// at least [`PROGRESS_MIN_BYTES`].
    Auto,
}

/// The smallest input file that gets a progress bar.
pub const PROGRESS_MIN_BYTES: u64 = 32 * 1024 * 1024;

/// The settings of a sheet, checked when they are given; the header is
/// checked against them before any row is read.
///
/// # Example
/// ```
/// use travertine::sheet::{Format, SheetOptions, UnitSystem};
/// let options = SheetOptions::default()
///     .with_map("alkalinity_mg_l_caco3=Alk")?
///     .with_set("temperature_c=25")?
///     .with_pair("alkalinity,ph")?
///     .with_units(UnitSystem::Ocean)
///     .with_format(Format::Jsonl)
///     .with_delimiter(";")?
///     .with_decimal_comma(true);
/// # let _ = options;
/// # Ok::<(), travertine::sheet::SheetError>(())
/// ```
#[derive(Debug, Clone)]
#[non_exhaustive]
pub struct SheetOptions {
    maps: Vec<(String, String)>,
    sets: Vec<(String, String)>,
    pair: Option<(Parameter, Parameter)>,
    columns: Option<String>,
    format: Format,
    units: UnitSystem,
    delimiter: u8,
    decimal_comma: bool,
    root: RootChoice,
    progress: Progress,
    digits: Precision,
    // issue 11: quality flags
    profile: Profile,
    // issue 12: a dose for every row
    dose: Option<DoseRequest>,
    // issue 13: uncertainties for every row
    uncertainty: Vec<crate::decisions::uncertainty_settings::Setting>,
    no_constant_uncertainty: bool,
}

impl Default for SheetOptions {
    fn default() -> Self {
        SheetOptions {
            maps: Vec::new(),
            sets: Vec::new(),
            pair: None,
            columns: None,
            format: Format::Csv,
            units: UnitSystem::Trade,
            delimiter: b',',
            decimal_comma: false,
            root: RootChoice::Natural,
            progress: Progress::Never,
            digits: Precision::Sensible,
            profile: Profile::default(),
            dose: None,
            uncertainty: Vec::new(),
            no_constant_uncertainty: false,
        }
    }
}

fn split_spec(
    option: &'static str,
    spec: &str,
    example: &str,
) -> Result<(String, String), SheetError> {
    match spec.split_once('=') {
        Some((name, value)) if !name.trim().is_empty() => {
            Ok((name.trim().to_string(), value.to_string()))
        }
        _ => Err(SheetError::BadOption {
            option,
            message: format!("`{spec}` is not NAME=VALUE; for example {option} {example}"),
        }),
    }
}

impl SheetOptions {
    /// Maps a column by hand: `NAME=HEADER`, where NAME is any header
    /// travertine recognises (`alkalinity_mg_l_caco3`, `Temp (°F)`), or
    /// `ignore` to pass the column through unread.
    ///
    /// # Errors
    /// [`SheetError::BadOption`] when the text is not `NAME=HEADER`; the
    /// name is checked with the header.
    ///
    /// ```
    /// # use travertine::sheet::SheetOptions;
    /// assert!(SheetOptions::default().with_map("ph_nbs=pH lab").is_ok());
    /// assert!(SheetOptions::default().with_map("ph_nbs").is_err());
    /// ```
    pub fn with_map(mut self, spec: &str) -> Result<Self, SheetError> {
        let (name, header) = split_spec("--map", spec, "alkalinity_mg_l_caco3=Alk")?;
        self.maps.push((name, header));
        Ok(self)
    }

    /// A value for every row where the sheet has no column: `NAME=VALUE`,
    /// for example `temperature_c=25`, `salinity=0.2`, `water=fresh`,
    /// `ph_scale=nbs`, `carbonic_fit=millero2006`, `calcium_mg_l=40`.
    ///
    /// # Errors
    /// [`SheetError::BadOption`] when the text is not `NAME=VALUE`; the name
    /// and value are checked with the header.
    ///
    /// ```
    /// # use travertine::sheet::SheetOptions;
    /// assert!(SheetOptions::default().with_set("temperature_c=25").is_ok());
    /// ```
    pub fn with_set(mut self, spec: &str) -> Result<Self, SheetError> {
        let (name, value) = split_spec("--set", spec, "temperature_c=25")?;
        self.sets.push((name, value));
        Ok(self)
    }

    /// Forces the pair of every row: `alkalinity,ph`.
    ///
    /// # Errors
    /// [`SheetError::BadOption`] for unknown names or a pair that carries one
    /// piece of information (two gases, one parameter twice).
    ///
    /// ```
    /// # use travertine::sheet::SheetOptions;
    /// assert!(SheetOptions::default().with_pair("alkalinity,ph").is_ok());
    /// assert!(SheetOptions::default().with_pair("pco2,xco2").is_err());
    /// ```
    pub fn with_pair(mut self, spec: &str) -> Result<Self, SheetError> {
        self.pair = Some(plan::parse_pair(spec)?);
        Ok(self)
    }

    /// The computed columns, comma-separated: names such as `ph_total`,
    /// `pco2_uatm`, `omega_aragonite`; `default` for the default set of the
    /// unit system; `all` for every one. The names are the keys of
    /// [`crate::output::Output`], the keys of the JSON of a state, and
    /// `all` writes them in that list's order. `flags` asks for the
    /// column of quality flags (see [`SheetOptions::with_profile`]), which
    /// `default` and `all` include, and which a list without either leaves
    /// out unless it names it.
    ///
    /// # Errors
    /// [`SheetError::BadOption`] for a name that is not a computed column.
    ///
    /// ```
    /// # use travertine::sheet::SheetOptions;
    /// assert!(SheetOptions::default().with_columns("default,revelle_factor").is_ok());
    /// assert!(SheetOptions::default().with_columns("colour").is_err());
    /// ```
    pub fn with_columns(mut self, spec: &str) -> Result<Self, SheetError> {
        plan::parse_columns(spec, self.units)?;
        self.columns = Some(spec.to_string());
        Ok(self)
    }

    /// CSV or JSON lines.
    ///
    /// ```
    /// # use travertine::sheet::{Format, SheetOptions};
    /// let _ = SheetOptions::default().with_format(Format::Jsonl);
    /// ```
    #[must_use]
    pub fn with_format(mut self, format: Format) -> Self {
        self.format = format;
        self
    }

    /// Trade or ocean units, for the default columns and the residuals.
    ///
    /// ```
    /// # use travertine::sheet::{SheetOptions, UnitSystem};
    /// let _ = SheetOptions::default().with_units(UnitSystem::Ocean);
    /// ```
    #[must_use]
    pub fn with_units(mut self, units: UnitSystem) -> Self {
        self.units = units;
        self
    }

    /// The field delimiter of the input and the output: one ASCII
    /// character, or `tab`.
    ///
    /// # Errors
    /// [`SheetError::BadOption`] for anything else, or a quote or line end.
    ///
    /// ```
    /// # use travertine::sheet::SheetOptions;
    /// assert!(SheetOptions::default().with_delimiter(";").is_ok());
    /// assert!(SheetOptions::default().with_delimiter("tab").is_ok());
    /// assert!(SheetOptions::default().with_delimiter(";;").is_err());
    /// ```
    pub fn with_delimiter(mut self, spec: &str) -> Result<Self, SheetError> {
        let d = match spec {
            "tab" | "\\t" | "\t" => b'\t',
            s if s.len() == 1 && s.is_ascii() => s.as_bytes()[0],
            _ => 0,
        };
        if d == 0 || matches!(d, b'"' | b'\n' | b'\r') || d.is_ascii_alphanumeric() {
            return Err(SheetError::BadOption {
                option: "--delimiter",
                message: format!(
                    "`{spec}` cannot separate fields; give one character such as ; or |, or tab"
                ),
            });
        }
        self.delimiter = d;
        Ok(self)
    }

    /// Numbers written with a decimal comma (`7,9`), read and written.
    ///
    /// ```
    /// # use travertine::sheet::SheetOptions;
    /// let _ = SheetOptions::default().with_decimal_comma(true);
    /// ```
    #[must_use]
    pub fn with_decimal_comma(mut self, on: bool) -> Self {
        self.decimal_comma = on;
        self
    }

    /// Which root where two waters fit (alkalinity with CO3, DIC with HCO3).
    ///
    /// ```
    /// # use travertine::{sheet::SheetOptions, RootChoice};
    /// let _ = SheetOptions::default().with_root(RootChoice::HigherPh);
    /// ```
    #[must_use]
    pub fn with_root(mut self, root: RootChoice) -> Self {
        self.root = root;
        self
    }

    /// How many digits the computed columns and residuals of CSV output
    /// have: [`Precision::Sensible`] (the default) writes each to its
    /// output's [`crate::output::Output::digits`], in the unit of its
    /// column (pH 3 decimals, µmol/kg and µatm 4 significant figures, mg/L
    /// 3; a residual to the place of the value it is the residual of);
    /// [`Precision::Full`] writes every digit, the shortest text that reads
    /// back as the same f64. Input columns are written as they were typed,
    /// and JSON lines always have every digit.
    ///
    /// ```
    /// use travertine::output::Precision;
    /// use travertine::sheet::{process, SheetOptions};
    /// let sheet = "temperature_c,salinity,alkalinity_umol_kg,dic_umol_kg\n25,35,2300,2000\n";
    /// let columns = SheetOptions::default().with_columns("ph_total,pco2_uatm")?;
    /// let mut out = Vec::new();
    /// process(&columns.clone(), sheet.as_bytes(), &mut out)?;
    /// // worked values computed from Lueker et al. (2000), Dickson (1990), Lee et al. (2010),
    /// // Millero (1995) and Weiss (1974): pH_T 8.0402, pCO2 402.75 µatm
    /// assert!(String::from_utf8(out).unwrap().contains("25,35,2300,2000,8.040,402.8,ok"));
    /// let mut out = Vec::new();
    /// process(&columns.with_digits(Precision::Full), sheet.as_bytes(), &mut out)?;
    /// let text = String::from_utf8(out).unwrap();
    /// let ph: f64 = text.lines().nth(1).unwrap().split(',').nth(4).unwrap().parse().unwrap();
    /// assert!((ph - 8.0402).abs() < 5e-5 && text.contains(&ph.to_string()));
    /// # Ok::<(), travertine::sheet::SheetError>(())
    /// ```
    #[must_use]
    pub fn with_digits(mut self, digits: Precision) -> Self {
        self.digits = digits;
        self
    }

    /// A dose for every row: how much of `request.chemical` takes the
    /// row's water to `request.target` (its purity and dissolved fraction
    /// as the request gives them; each row's pH scale and air CO2 its own).
    /// The sheet adds the columns `dose_g_m3`, `dose_total_kg` and
    /// `dose_total_lb`; the totals need the row's volume (a `volume_m3`
    /// column, or `area_m2` with `mean_depth_m`, or `--set`). A row whose
    /// target cannot be reached gets the reason in its message and a
    /// `warning`, and the sheet goes on.
    ///
    /// ```
    /// use travertine::decisions::dose::{Chemical, DoseRequest};
    /// use travertine::sheet::{process, SheetOptions};
    /// let sheet = "Temp (C),pH (NBS),Alkalinity (mg/L as CaCO3),Area (ha),Mean depth (m)\n\
    ///              24,6.85,28,0.8,1.2\n";
    /// let request = DoseRequest::new(Chemical::SodiumBicarbonate, "alkalinity=50 mg/L CaCO3".parse()?);
    /// let options = SheetOptions::default().with_dose(request).with_columns("ph_nbs")?;
    /// let mut out = Vec::new();
    /// process(&options, sheet.as_bytes(), &mut out)?;
    /// let text = String::from_utf8(out).unwrap();
    /// assert!(text.lines().next().unwrap().contains("dose_g_m3,dose_total_kg,dose_total_lb"));
    /// # Ok::<(), Box<dyn std::error::Error>>(())
    /// ```
    #[must_use]
    pub fn with_dose(mut self, request: DoseRequest) -> Self {
        self.dose = Some(request);
        self
    }

    /// The standard uncertainty of an input or a constant for every row,
    /// `NAME=VALUE` as `solve --uncertainty` reads it
    /// ([`crate::decisions::uncertainty_settings`]); a later one of the same
    /// name, and a row's own `<column>_u` cell, replace it.
    ///
    /// Whenever an uncertainty is asked for (this, a `<column>_u` input
    /// column, or [`SheetOptions::without_constant_uncertainty`]), every
    /// numeric computed column gets its standard uncertainty in a column
    /// `<column>_u`, after the residuals and the dose columns, each row
    /// propagated as `solve --uncertainty` propagates it (the constants
    /// with their defaults unless switched off). A row whose uncertainty
    /// cannot be computed keeps its values, with the reason in its message.
    ///
    /// # Errors
    /// [`SheetError::BadOption`] with the setting's error.
    ///
    /// ```
    /// use travertine::sheet::{process, SheetOptions};
    /// let sheet = "temperature_c,ph_nbs,alkalinity_mg_l_caco3,ph_nbs_u\n18,7.4,150,0.02\n";
    /// let options = SheetOptions::default()
    ///     .with_columns("pco2_uatm")?
    ///     .with_uncertainty("alkalinity=2%")?;
    /// let mut out = Vec::new();
    /// process(&options, sheet.as_bytes(), &mut out)?;
    /// let text = String::from_utf8(out).unwrap();
    /// assert!(text.lines().next().unwrap().contains(",pco2_uatm,pco2_uatm_u,status"));
    /// assert!(SheetOptions::default().with_uncertainty("ph=-1").is_err());
    /// # Ok::<(), travertine::sheet::SheetError>(())
    /// ```
    pub fn with_uncertainty(mut self, spec: &str) -> Result<Self, SheetError> {
        let setting =
            spec.parse()
                .map_err(|e: crate::decisions::uncertainty_settings::SettingError| {
                    SheetError::BadOption {
                        option: "--uncertainty",
                        message: e.to_string(),
                    }
                })?;
        self.uncertainty.push(setting);
        Ok(self)
    }

    /// No default uncertainty of the constants, for every row (a constant
    /// set with [`SheetOptions::with_uncertainty`] still counts; and the
    /// `_u` columns are written even with no other uncertainty asked for:
    /// all 0).
    ///
    /// ```
    /// # use travertine::sheet::SheetOptions;
    /// let _ = SheetOptions::default().without_constant_uncertainty();
    /// ```
    #[must_use]
    pub fn without_constant_uncertainty(mut self) -> Self {
        self.no_constant_uncertainty = true;
        self
    }

    /// The profile the `flags` column is judged against (default:
    /// `general`, [`Profile::default`]). The column holds the codes of the
    /// flags raised on the row, separated by `;` (`free_co2_high;nh3_high`),
    /// empty when none is raised or the row is an error; in JSON lines it
    /// is an array of the codes (`null` for an error row). It is written
    /// after the residuals, before `status`, whenever the computed columns
    /// are the default ones or `all`, or name `flags`
    /// ([`SheetOptions::with_columns`]). A flag leaves the row's `status`
    /// as it is: the status is about the computation, a flag about the
    /// water.
    ///
    /// ```
    /// use travertine::{decisions::Profile, sheet::{process, SheetOptions}};
    /// let sheet = "temperature_c,ph_nbs,alkalinity_mg_l_caco3\n18,7.4,150\n";
    /// let trout = SheetOptions::default().with_profile(Profile::built_in("cold-water-fish")?);
    /// let mut out = Vec::new();
    /// process(&trout, sheet.as_bytes(), &mut out).unwrap();
    /// let text = String::from_utf8(out).unwrap();
    /// assert!(text.lines().next().unwrap().ends_with(",flags,status,message"));
    /// assert!(text.lines().nth(1).unwrap().contains(",free_co2_high,ok,"));
    /// # Ok::<(), travertine::Error>(())
    /// ```
    #[must_use]
    pub fn with_profile(mut self, profile: Profile) -> Self {
        self.profile = profile;
        self
    }

    /// When to draw a progress bar.
    ///
    /// ```
    /// # use travertine::sheet::{Progress, SheetOptions};
    /// let _ = SheetOptions::default().with_progress(Progress::Auto);
    /// ```
    #[must_use]
    pub fn with_progress(mut self, progress: Progress) -> Self {
        self.progress = progress;
        self
    }
}

/// Reads a sheet from `input` and writes the results to `output`.
///
/// # Errors
/// [`SheetError`] when the sheet cannot be started (empty input, a header
/// without a unit, no pair, a bad option) or fails part-way (read or write
/// error). Bad rows are not errors: they are reported in their rows and
/// counted in the [`Summary`].
///
/// ```
/// use travertine::sheet::{process, SheetOptions};
/// let sheet = "temperature_c,salinity,alkalinity_umol_kg,dic_umol_kg\n25,35,2300,2000\n";
/// let mut out = Vec::new();
/// let options = SheetOptions::default().with_columns("ph_total")?;
/// process(&options, sheet.as_bytes(), &mut out)?;
/// let text = String::from_utf8(out).unwrap();
/// // worked value computed from Lueker et al. (2000), Dickson (1990), Lee et al. (2010), Millero (1995) and Weiss (1974): pH_T 8.0402
/// assert!(text.lines().nth(1).unwrap().starts_with("25,35,2300,2000,8.040"));
/// # Ok::<(), travertine::sheet::SheetError>(())
/// ```
pub fn process<R: Read + Send, W: Write + Send>(
    options: &SheetOptions,
    input: R,
    output: W,
) -> Result<Summary, SheetError> {
    process_stream(options, input, output, None, "the input").map(|(s, _)| s)
}

/// Bytes looked at before the CSV reader starts, for the byte-order mark
/// and the line ending.
const PEEK: u64 = 64 * 1024;
const BOM: &[u8] = b"\xEF\xBB\xBF";

/// Whether the head of a file is UTF-16: a byte-order mark, or (without
/// one) text whose every other byte is zero, as ASCII in UTF-16 is. Gives
/// how it is written and its name for `iconv` (which reads the byte-order
/// mark itself, and takes UTF-16 without one as big-endian).
fn utf16(head: &[u8]) -> Option<(&'static str, &'static str)> {
    if head.starts_with(b"\xFF\xFE") {
        return Some(("little-endian, with a byte-order mark", "UTF-16"));
    }
    if head.starts_with(b"\xFE\xFF") {
        return Some(("big-endian, with a byte-order mark", "UTF-16"));
    }
    // Pairs of bytes of the first lines: in UTF-8 text a zero byte has no
    // place at all.
    let pairs: Vec<&[u8]> = head[..head.len().min(1024)].chunks_exact(2).collect();
    if pairs.len() < 2 {
        return None;
    }
    let mostly = |n: usize| n * 10 >= pairs.len() * 9;
    let high_zero = pairs.iter().filter(|p| p[1] == 0 && p[0] != 0).count();
    let low_zero = pairs.iter().filter(|p| p[0] == 0 && p[1] != 0).count();
    if mostly(high_zero) {
        Some(("little-endian, without a byte-order mark", "UTF-16LE"))
    } else if mostly(low_zero) {
        Some(("big-endian, without a byte-order mark", "UTF-16BE"))
    } else {
        None
    }
}

fn process_stream<R: Read + Send, W: Write + Send>(
    options: &SheetOptions,
    mut input: R,
    output: W,
    size: Option<u64>,
    what: &str,
) -> Result<(Summary, W), SheetError> {
    let unreadable = |source| SheetError::Unreadable {
        what: what.to_string(),
        source,
    };
    let mut head = Vec::with_capacity(PEEK as usize);
    (&mut input)
        .take(PEEK)
        .read_to_end(&mut head)
        .map_err(unreadable)?;
    if let Some((order, iconv)) = utf16(&head) {
        return Err(SheetError::Utf16 {
            what: what.to_string(),
            order,
            iconv,
        });
    }
    let bom = head.starts_with(BOM);
    let crlf = head
        .iter()
        .position(|b| *b == b'\n')
        .is_some_and(|i| i > 0 && head[i - 1] == b'\r');
    let reader = lines::Lines::new(std::io::Cursor::new(head).chain(input));
    let mut csv = csv::ReaderBuilder::new()
        .has_headers(false)
        .flexible(true)
        .delimiter(options.delimiter)
        .buffer_capacity(256 * 1024)
        .from_reader(reader);
    let mut header = csv::ByteRecord::new();
    match csv.read_byte_record(&mut header) {
        Ok(true) => {}
        Ok(false) => return Err(SheetError::Empty),
        Err(e) => {
            return Err(unreadable(match e.into_kind() {
                csv::ErrorKind::Io(io) => io,
                other => std::io::Error::other(format!("{other:?}")),
            }))
        }
    }
    let plan = plan::Plan::new(&header, options)?;
    let style = write::Style {
        format: options.format,
        delimiter: options.delimiter,
        crlf,
        decimal_comma: options.decimal_comma,
    };
    let (keys, header_bytes) = match options.format {
        Format::Csv => (Vec::new(), write::csv_header(&plan, &style, bom)),
        Format::Jsonl => (write::json_keys(&plan), Vec::new()),
    };
    let bar = match (options.progress, size) {
        (Progress::Auto, Some(n))
            if n >= PROGRESS_MIN_BYTES
                && std::io::stderr().is_terminal()
                && std::env::var_os("CI").is_none() =>
        {
            let bar = indicatif::ProgressBar::new(n);
            if let Ok(style) = indicatif::ProgressStyle::with_template(
                "{bar:40} {bytes}/{total_bytes} {bytes_per_sec} eta {eta}",
            ) {
                bar.set_style(style);
            }
            Some(bar)
        }
        _ => None,
    };
    let result = pipeline::run(&plan, style, &keys, csv, output, header_bytes, bar.as_ref());
    if let Some(b) = bar {
        b.finish_and_clear();
    }
    result
}

/// Reads a sheet from a file or standard input and writes the results to a
/// file (atomically) or standard output.
///
/// The output file is written to a temporary file in the same folder and
/// renamed when complete, so a failure part-way leaves no half file under
/// its name; a file it replaces keeps its permissions (and its owner where
/// the system allows). A symbolic link is followed: the file it names is
/// replaced (or created, for a link to nothing yet) and the link stays. A
/// named pipe or a device (`/dev/null`, a terminal) is written straight
/// into, never replaced. The output is never the input file.
///
/// # Errors
/// As [`process`]; [`SheetError::Unreadable`] for an input that cannot be
/// opened; [`SheetError::OverwriteInput`] when the output is the input;
/// [`SheetError::Output`] when the output cannot be written (a folder, a
/// socket, a folder that does not exist).
///
/// ```no_run
/// use travertine::sheet::{run, Sink, SheetOptions, Source};
/// let summary = run(&SheetOptions::default(), &Source::from_arg("field.csv"),
///                   &Sink::from_arg(Some("results.csv")))?;
/// eprint!("{summary}");
/// # Ok::<(), travertine::sheet::SheetError>(())
/// ```
pub fn run(options: &SheetOptions, input: &Source, output: &Sink) -> Result<Summary, SheetError> {
    let what = input.describe();
    if let (Source::Path(i), Sink::Path(o)) = (input, output) {
        if files::same_file(i, o) {
            return Err(SheetError::OverwriteInput(o.clone()));
        }
    }
    let (reader, size): (Box<dyn Read + Send>, Option<u64>) = match input {
        Source::Stdin => (Box::new(std::io::stdin()), None),
        Source::Path(p) => {
            let unreadable = |source| SheetError::Unreadable {
                what: what.clone(),
                source,
            };
            let file = std::fs::File::open(p).map_err(unreadable)?;
            let meta = file.metadata().map_err(unreadable)?;
            if meta.is_dir() {
                return Err(unreadable(std::io::Error::other(
                    "it is a folder, not a file",
                )));
            }
            (Box::new(file), Some(meta.len()))
        }
    };
    to_sink(options, reader, size, &what, output)
}

/// Reads a sheet from any reader and writes the results to a file
/// (atomically, as [`run`]) or standard output.
///
/// # Errors
/// As [`run`].
///
/// ```
/// use travertine::sheet::{process_to, SheetOptions, Sink};
/// let dir = std::env::temp_dir().join(format!("travertine-doc-{}", std::process::id()));
/// std::fs::create_dir_all(&dir).unwrap();
/// let out = dir.join("results.csv");
/// let sheet = "temperature_c,salinity,alkalinity_umol_kg,dic_umol_kg\n25,35,2300,2000\n";
/// process_to(&SheetOptions::default(), sheet.as_bytes(), &Sink::Path(out.clone()))?;
/// assert_eq!(std::fs::read_to_string(&out).unwrap().lines().count(), 2);
/// # std::fs::remove_dir_all(&dir).unwrap();
/// # Ok::<(), travertine::sheet::SheetError>(())
/// ```
pub fn process_to<R: Read + Send>(
    options: &SheetOptions,
    input: R,
    output: &Sink,
) -> Result<Summary, SheetError> {
    to_sink(options, input, None, "the input", output)
}

fn to_sink<R: Read + Send>(
    options: &SheetOptions,
    reader: R,
    size: Option<u64>,
    what: &str,
    output: &Sink,
) -> Result<Summary, SheetError> {
    match output {
        Sink::Stdout => {
            process_stream(options, reader, std::io::stdout(), size, what).map(|(s, _)| s)
        }
        Sink::Path(shown) => {
            let fail = |source| SheetError::Output {
                path: shown.clone(),
                source,
            };
            // What the path names is asked of the system first, which
            // follows every link, /proc's links to open files included
            // (`/dev/stdout` names the pipe standard output is).
            match files::target_kind(shown)? {
                files::Target::Stream => {
                    // A pipe or a device cannot be replaced, only written
                    // into; a file put in its place would hide it.
                    let file = std::fs::OpenOptions::new()
                        .write(true)
                        .open(shown)
                        .map_err(fail)?;
                    process_stream(options, reader, file, size, what).map(|(s, _)| s)
                }
                files::Target::File => {
                    let path = files::follow_links(shown).map_err(fail)?;
                    let mut temp = files::TempFile::create(&path, shown)?;
                    let file = temp
                        .take_file()
                        .ok_or_else(|| fail(std::io::Error::other("the temporary file is gone")))?;
                    let (summary, file) = process_stream(options, reader, file, size, what)?;
                    temp.persist(file)?;
                    Ok(summary)
                }
            }
        }
    }
}
