//! One row: its cells read, the sample built, the pair chosen and solved.

use super::cell::{self, Cell};
use super::columns::UnitSystem;
use super::lines::count_line_ends;
use super::pair::{choose_pair, rank, RANKING};
use super::plan::{Label, Plan, STATE_THE_SCALE};
use crate::base::error::Error;
use crate::base::units::{Amount, Unit, CACO3_G_EQ, CO2_G_MOL, CO3_G_MOL, C_G_MOL, HCO3_G_MOL};
use crate::base::warning::{Severity, Warning};
use crate::decisions::dose::DoseRequest;
use crate::decisions::uncertainty_settings::{Setting, SettingError};
use crate::flow::PreparedWater;
use crate::output::{Digits, Output, Value};
use crate::properties::scales::PhScale;
use crate::sample::inputs::Input;
use crate::sample::measured::{Measured, Parameter};
use crate::sample::water::Medium;
use crate::sample::water::Water;
use crate::sample::{CarbonValue, Sample};
use crate::state::State;
use std::sync::Arc;

/// The outcome of a row.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
pub(crate) enum Status {
    #[default]
    Ok,
    Warning,
    Error,
}

impl Status {
    pub(crate) fn name(self) -> &'static str {
        match self {
            Status::Ok => "ok",
            Status::Warning => "warning",
            Status::Error => "error",
        }
    }
}

/// Something to say about a row. Key and text are shared (`Arc`): the
/// cautions rows have in common (the air's CO2 not given, ...) are written
/// once and handed to every row that has them (see [`Scratch::said`]).
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct Issue {
    /// The message without the row's values, for counting alike issues.
    pub key: Arc<str>,
    /// The message.
    pub text: Arc<str>,
    /// An error (the row is not computed) rather than a warning.
    pub error: bool,
    /// A note (an optional input not given): shown, but the row stays `ok`.
    pub note: bool,
}

/// A row's results, reused from row to row.
#[derive(Debug, Default)]
pub(crate) struct Scratch {
    pub values: Vec<Value>,
    /// Each residual, with the precision of its column at the value
    /// measured (see [`Digits::at`]).
    pub residuals: Vec<Option<(f64, Digits)>>,
    /// The dose columns (product g/m³, total kg and lb), where a dose is
    /// asked for, with their precision.
    pub dose: Vec<Option<(f64, Digits)>>,
    /// The standard uncertainties of the computed columns that have one
    /// (issue 13), where asked for, with their precision.
    pub uncertain: Vec<Option<(f64, Digits)>>,
    pub issues: Vec<Issue>,
    pub status: Status,
    /// The codes of the quality flags raised (issue 11), where the plan
    /// writes them.
    pub flags: Vec<&'static str>,
    /// The last row's water, prepared.
    prepared: Option<PreparedWater>,
    /// The code and field of the row's first error, where it has one.
    pub first_error: Option<(&'static str, Option<String>)>,
    /// The state of the last row the plan kept one for
    /// ([`Plan::keep_state`]: a batch reads its outputs from it), as the
    /// solver returned it and boxed, so that the next one is moved in once
    /// (a state is over a kilobyte); the row's own where `solved`.
    state: Option<Box<Result<State, Error>>>,
    /// Whether `state` is the row's.
    solved: bool,
    /// Whether the last row's water was not the one before it.
    changing: bool,
    /// The cautions of the last rows written as issues, by their place
    /// among a state's warnings: a row whose warnings are those of an
    /// earlier row takes their issues as they are (the same words) instead
    /// of writing them again.
    said: Vec<Said>,
}

/// A caution of a state written as an issue (see [`Scratch::said`]).
#[derive(Debug)]
struct Said {
    warning: Warning,
    issue: Issue,
}

impl Scratch {
    /// The row's state, where the plan keeps it and the row was solved.
    pub fn state(&self) -> Option<&State> {
        match &self.state {
            Some(kept) if self.solved => kept.as_ref().as_ref().ok(),
            _ => None,
        }
    }

    /// Records the code and field of the row's first error.
    fn fail(&mut self, code: &'static str, field: Option<String>) {
        if self.first_error.is_none() {
            self.first_error = Some((code, field));
        }
    }

    fn error(&mut self, key: String, text: String) {
        self.issues.push(Issue {
            key: key.into(),
            text: text.into(),
            error: true,
            note: false,
        });
    }

    fn warning(&mut self, key: String, text: String) {
        self.issues.push(Issue {
            key: key.into(),
            text: text.into(),
            error: false,
            note: false,
        });
    }

    fn note(&mut self, key: String, text: String) {
        self.issues.push(Issue {
            key: key.into(),
            text: text.into(),
            error: false,
            note: true,
        });
    }

    /// The issue of a state's `i`-th caution `w` (a note or a warning by
    /// its severity), written as it was for an earlier row where that row
    /// had the same caution in the same place, else written now; with its
    /// key where `keys` (the sheet's summary counts issues by key).
    fn caution(&mut self, i: usize, w: &Warning, keys: bool) {
        if let Some(said) = self.said.get(i) {
            if said.warning == *w {
                self.issues.push(said.issue.clone());
                return;
            }
        }
        let text = w.to_string();
        let key: Arc<str> = if keys {
            text.split(": ").next().unwrap_or(&text).into()
        } else {
            "".into()
        };
        let issue = Issue {
            key,
            text: text.into(),
            error: false,
            note: w.severity() == Severity::Note,
        };
        let said = Said {
            warning: w.clone(),
            issue: issue.clone(),
        };
        if i < self.said.len() {
            self.said[i] = said;
        } else {
            self.said.push(said);
        }
        self.issues.push(issue);
    }
}

/// The message of a library error without its values.
pub(crate) fn error_key(e: &Error) -> String {
    match e {
        Error::OutOfRange {
            field,
            min,
            max,
            unit,
            ..
        } => format!("{field} outside the accepted range {min} to {max}{unit}"),
        Error::NotFinite { field, .. } => format!("{field} not a finite number"),
        Error::NotANumber { field, .. } => format!("{field} not a number"),
        Error::MissingUnit { field, .. } => format!("{field} without a unit"),
        Error::WrongUnit { field, .. } => format!("{field} in a unit not accepted"),
        Error::NoWaterFits { first, second, .. } => format!("no water fits {first} with {second}"),
        Error::NoConvergence { first, second, .. } => {
            format!("the solver did not converge for {first} with {second}")
        }
        Error::UnknownFit { constant, .. } => format!("{constant}: unknown fit"),
        Error::UnknownChoice { field, .. } => format!("{field}: unknown choice"),
        Error::Computation { field, .. } => format!("{field} could not be computed"),
        Error::Unreachable { field, .. } => format!("{field} out of reach"),
        other => other.to_string(),
    }
}

/// The cells of a row, for messages: the fields of a CSV record, or the
/// values of a [`super::Batch`] row.
#[derive(Clone, Copy)]
pub(crate) enum Cells<'a> {
    /// A CSV record.
    Csv(&'a csv::ByteRecord),
    /// Values given as numbers or texts.
    Values(&'a [Cell<'a>]),
}

/// The cell text of a column in a row, for messages.
fn cell_text(record: Cells<'_>, index: usize) -> String {
    match record {
        Cells::Csv(r) => String::from_utf8_lossy(r.get(index).unwrap_or_default())
            .trim()
            .to_string(),
        Cells::Values(v) => match v.get(index) {
            Some(Cell::Number(x)) => x.to_string(),
            Some(Cell::Text(t)) => t.trim().to_string(),
            _ => String::new(),
        },
    }
}

/// Where a value came from, for messages: `column `X` (`cell`)` or `--set x=v`.
fn source_of(plan: &Plan, record: Cells<'_>, field: Input) -> Option<(String, String)> {
    let label = plan.label(field).or_else(|| match field {
        // Salinity computed from the conductivity.
        Input::Salinity => plan.label(Input::Conductivity),
        _ => None,
    })?;
    Some(match label {
        Label::Column(i) => {
            let rc = &plan.read[*i];
            (
                format!(
                    "column `{}` (`{}`)",
                    rc.header,
                    cell::shorten(&cell_text(record, rc.index))
                ),
                format!("column `{}`", rc.header),
            )
        }
        Label::Set(spec) => (format!("--set {spec}"), format!("--set {spec}")),
    })
}

fn library_issue(plan: &Plan, record: Cells<'_>, e: &Error, s: &mut Scratch) {
    s.fail(e.kind().code(), e.field().map(|f| f.name().to_string()));
    let pair_error = matches!(
        e,
        Error::IncompatiblePair { .. } | Error::NoWaterFits { .. } | Error::NoConvergence { .. }
    );
    let source = if pair_error {
        None
    } else {
        e.field()
            .and_then(Input::from_field)
            .and_then(|f| source_of(plan, record, f))
    };
    match source {
        Some((text, key)) => s.error(format!("{key}: {}", error_key(e)), format!("{text}: {e}")),
        None => s.error(error_key(e), e.to_string()),
    }
}

fn measured(
    p: Parameter,
    v: CarbonValue,
    default_scale: Option<PhScale>,
) -> Result<Measured, Error> {
    match v {
        CarbonValue::Ph(v, scale) => Measured::ph(v, scale.or(default_scale)),
        CarbonValue::Quantity(q) => Measured::new(p, q),
    }
}

/// Molar (equivalent) mass of the mass-concentration unit of a parameter.
fn mass_of(p: Parameter) -> (Unit, f64) {
    match p {
        Parameter::Alkalinity => (Unit::MgPerLCaCO3, CACO3_G_EQ),
        Parameter::Dic => (Unit::MgPerLC, C_G_MOL),
        Parameter::Co2 => (Unit::MgPerLCO2, CO2_G_MOL),
        Parameter::Hco3 => (Unit::MgPerLHCO3, HCO3_G_MOL),
        _ => (Unit::MgPerLCO3, CO3_G_MOL),
    }
}

/// The residual of a measured value (measured minus calculated) in the
/// units of its residual column, with the precision the column's rule
/// gives the measured value there: a residual is written to the place its
/// values are.
fn measured_in_output(
    p: Parameter,
    v: CarbonValue,
    state: &State,
    units: UnitSystem,
    scale: PhScale,
) -> Option<(f64, Digits)> {
    let column = Output::of_parameter(p, units, Some(scale));
    let digits = column.digits()?;
    match v {
        CarbonValue::Ph(v, _) => Some((v - state.ph(scale), digits.at(v))),
        CarbonValue::Quantity(q) => {
            let uatm = match q.unit {
                Unit::Uatm | Unit::Ppm => q.value,
                Unit::Atm => q.value * 1e6,
                Unit::Pa => q.value / 101_325.0 * 1e6,
                Unit::KPa => q.value * 1000.0 / 101_325.0 * 1e6,
                _ => f64::NAN,
            };
            let calculated = match column.value(state) {
                Value::Number(v) => v?,
                Value::Text(_) => return None,
            };
            let measured = match p {
                Parameter::Pco2 | Parameter::Fco2 | Parameter::Xco2 => uatm,
                _ => {
                    let (mass_unit, g) = mass_of(p);
                    let umol_kg =
                        Amount::from_quantity(q, mass_unit, g)?.mol_kg(state.density_kg_m3) * 1e6;
                    match units {
                        UnitSystem::Trade => umol_kg * 1e-6 * state.density_kg_m3 * g,
                        UnitSystem::Ocean => umol_kg,
                    }
                }
            };
            Some((measured - calculated, digits.at(measured)))
        }
    }
}

/// A solved state whose carbon lies outside what the crate accepts as
/// input (for example pH 0 with an alkalinity, which needs a DIC of
/// hundreds of thousands of mol/kg) fits no real water: the message says
/// so, in the words of the library's own "no water fits".
fn implausible(state: &State, a: &Measured, b: &Measured) -> Option<String> {
    for (p, v) in [
        (Parameter::Dic, state.dic_umol_kg),
        (Parameter::Alkalinity, state.alkalinity_umol_kg),
    ] {
        let (min, max) = p.accepted_range();
        // Alkalinity may be slightly negative in acid water; only its size is checked.
        let bad = if p == Parameter::Alkalinity {
            !v.is_finite() || v.abs() > max
        } else {
            !v.is_finite() || v < min || v > max
        };
        if bad {
            return Some(format!(
                "no water fits {} = {} with {} = {}: the {} would be {v:.3e} µmol/kg, beyond the \
                 accepted {min} to {max} µmol/kg",
                a.parameter().field(),
                a.describe(),
                b.parameter().field(),
                b.describe(),
                p.name()
            ));
        }
    }
    None
}

/// The default pH scale of a medium.
fn medium_scale(m: Medium) -> PhScale {
    match m {
        Medium::Fresh => PhScale::Nbs,
        _ => PhScale::Total,
    }
}

/// Temperatures above this in a °C column get a caution: a reading in °F
/// written in the wrong column is a common slip.
pub(crate) const WARM_C: f64 = 40.0;

/// Evaluates one row into `s`.
pub(crate) fn evaluate(plan: &Plan, record: &csv::ByteRecord, line: u64, s: &mut Scratch) {
    start(plan, s);
    let status = if unclosed_quote(plan, record, line, s) {
        None
    } else {
        solve_row(plan, record, s)
    };
    finish(status, s);
}

/// Evaluates one row given as values, one per column of the plan, into `s`.
pub(crate) fn evaluate_values(plan: &Plan, cells: &[Cell<'_>], s: &mut Scratch) {
    start(plan, s);
    let status = solve_values(plan, cells, s);
    finish(status, s);
}

/// Clears the scratch for a new row.
fn start(plan: &Plan, s: &mut Scratch) {
    s.first_error = None;
    s.solved = false;
    s.issues.clear();
    s.values.clear();
    s.residuals.clear();
    s.residuals.resize(plan.residuals.len(), None);
    s.dose.clear();
    if plan.dose.is_some() {
        s.dose.resize(super::plan::DOSE_COLUMNS.len(), None);
    }
    s.uncertain.clear();
    if let Some(up) = &plan.uncertainty {
        s.uncertain.resize(up.outputs.len(), None);
    }
    s.flags.clear();
}

/// The status of a row from its issues; no values where it failed.
fn finish(status: Option<()>, s: &mut Scratch) {
    if status.is_none() {
        s.values.clear();
        s.residuals.iter_mut().for_each(|r| *r = None);
        s.uncertain.iter_mut().for_each(|r| *r = None);
        s.flags.clear();
    }
    s.status = if s.issues.iter().any(|i| i.error) {
        Status::Error
    } else if s.issues.iter().all(|i| i.note) {
        Status::Ok
    } else {
        Status::Warning
    };
}

/// A cell that holds a line break and runs on over more than this many
/// lines, or [`RUN_ON_BYTES`], is taken for a quote that was never closed.
const RUN_ON_LINES: u64 = 10;
/// See [`RUN_ON_LINES`].
const RUN_ON_BYTES: usize = 64 * 1024;

/// Makes the row an error when one of its cells looks like a quote left
/// open: the CSV reader then reads every line after it, up to the next
/// quote or the end of the file, into that one cell. Those lines are not
/// lost (they are in the cell, written back unchanged) but they are not
/// rows of their own, so the message says so and where the quote opened.
fn unclosed_quote(plan: &Plan, record: &csv::ByteRecord, line: u64, s: &mut Scratch) -> bool {
    // The line each field starts on.
    let mut at = line;
    for (k, field) in record.iter().enumerate() {
        let (all_ends, _) = count_line_ends(field, false);
        // A quote open to the end of the file takes the file's last line
        // end too, which starts no line.
        let body = field
            .strip_suffix(b"\r\n")
            .or_else(|| field.strip_suffix(b"\n"))
            .or_else(|| field.strip_suffix(b"\r"))
            .unwrap_or(field);
        let (ends, _) = count_line_ends(body, false);
        if ends > 0 && (ends + 1 > RUN_ON_LINES || field.len() > RUN_ON_BYTES) {
            let column = match plan.headers.get(k) {
                Some(h) => format!("column `{}`", String::from_utf8_lossy(h).trim()),
                None => format!("field {}", k + 1),
            };
            let size = if field.len() > RUN_ON_BYTES {
                format!(", {} KiB", field.len() / 1024)
            } else {
                String::new()
            };
            s.error(
                "a quote that is never closed runs on over the lines after it".into(),
                format!(
                    "{column}: the quote that opens this cell on line {at} seems never to be \
                     closed: the cell runs on over {} lines (lines {at} to {}{size}), so the \
                     lines after it were read into this one cell and are not rows of their own; \
                     close or remove the quote and run the sheet again",
                    ends + 1,
                    at + ends,
                ),
            );
            return true;
        }
        at += all_ends;
    }
    false
}

/// The work of [`evaluate`]; `None` when the row cannot be computed.
fn solve_row(plan: &Plan, record: &csv::ByteRecord, s: &mut Scratch) -> Option<()> {
    if record.len() != plan.width {
        ragged(plan, record, s);
        return None;
    }
    if record.iter().all(|f| f.trim_ascii().is_empty()) {
        s.error("the row is empty".into(), "the row is empty".into());
        return None;
    }
    let mut inputs = plan.template;
    for rc in &plan.read {
        let bytes = record.get(rc.index).unwrap_or_default();
        match cell::parse(&rc.column, bytes, plan.decimal_comma) {
            Ok(Some(v)) => inputs.put(rc.column.field, v),
            Ok(None) => {}
            Err(problem) => {
                let text = String::from_utf8_lossy(bytes);
                s.fail(problem.code(), Some(rc.header.clone()));
                s.error(
                    problem.key(&rc.header),
                    problem.message(&rc.header, text.trim()),
                );
            }
        }
    }
    if !s.issues.is_empty() {
        return None;
    }
    solve_inputs(plan, Cells::Csv(record), &inputs, s)
}

/// The work of [`evaluate_values`]: each value read as a cell of its
/// column would be (a number in the column's unit; a text as typed in a
/// cell; NaN or [`Cell::Empty`] for "not measured"), then solved as a row.
fn solve_values(plan: &Plan, cells: &[Cell<'_>], s: &mut Scratch) -> Option<()> {
    let mut inputs = plan.template;
    for rc in &plan.read {
        let parsed = match cells.get(rc.index).copied().unwrap_or(Cell::Empty) {
            Cell::Empty => Ok(None),
            Cell::Number(v) if v.is_nan() => Ok(None),
            Cell::Number(v) => cell::number_value(&rc.column, v),
            Cell::Text(t) => cell::parse(&rc.column, t.as_bytes(), plan.decimal_comma),
        };
        match parsed {
            Ok(Some(v)) => inputs.put(rc.column.field, v),
            Ok(None) => {}
            Err(problem) => {
                let text = cell_text(Cells::Values(cells), rc.index);
                s.fail(problem.code(), Some(rc.header.clone()));
                s.error(problem.key(&rc.header), problem.message(&rc.header, &text));
            }
        }
    }
    if !s.issues.is_empty() {
        return None;
    }
    solve_inputs(plan, Cells::Values(cells), &inputs, s)
}

/// Solves a row whose inputs are read.
fn solve_inputs(plan: &Plan, record: Cells<'_>, inputs: &Sample, s: &mut Scratch) -> Option<()> {
    let Some(t) = inputs.temperature_c else {
        let label = match plan.label(Input::Temperature) {
            Some(Label::Column(i)) => format!("column `{}` is empty", plan.read[*i].header),
            _ => "no temperature".to_string(),
        };
        s.fail("missing", Some("temperature".into()));
        s.error(
            "no temperature".into(),
            format!("{label}: the row has no temperature"),
        );
        return None;
    };
    if let Some(i) = plan.warm_check {
        if t > WARM_C {
            let header = &plan.read[i].header;
            s.warning(
                format!("column `{header}`: above {WARM_C} °C (a reading in °F?)"),
                format!(
                    "column `{header}`: {t} °C is warmer than natural waters usually are; if it \
                     was read in °F it is {:.1} °C, so check the cell",
                    (t - 32.0) * 5.0 / 9.0
                ),
            );
        }
    }
    // Borrowed in place, not moved out (a water is several hundred bytes).
    let water = inputs.water();
    let water = match &water {
        Ok(w) => w,
        Err(e) => {
            library_issue(plan, record, e, s);
            return None;
        }
    };
    if let Err(e) = inputs.check_ph_scale(water.medium()) {
        let column = match plan.label(Input::Carbon(Parameter::Ph)) {
            Some(Label::Column(i)) => format!("column `{}`: ", plan.read[*i].header),
            _ => String::new(),
        };
        s.fail(e.kind().code(), Some("ph_scale".into()));
        s.error(
            format!("{column}pH scale not stated in saline water"),
            format!("{column}{e}; {STATE_THE_SCALE}"),
        );
        return None;
    }
    let mut present = [false; 9];
    for (i, v) in inputs.carbon.iter().enumerate() {
        present[i] = v.is_some();
    }
    let (a, b) = match plan.forced_pair {
        Some((a, b)) => {
            for p in [a, b] {
                if !present[rank(p)] {
                    let where_ = match plan.label(Input::Carbon(p)) {
                        Some(Label::Column(i)) => format!("column `{}`", plan.read[*i].header),
                        _ => p.name().to_string(),
                    };
                    s.fail("missing", Some(p.field().name().to_string()));
                    s.error(
                        format!("pair {},{}: {where_} is empty", a.name(), b.name()),
                        format!(
                            "pair {},{}: {where_} is empty in this row",
                            a.name(),
                            b.name()
                        ),
                    );
                    return None;
                }
            }
            (a, b)
        }
        None => match choose_pair(&present) {
            Some(pair) => pair,
            None => {
                no_pair(plan, &present, s);
                return None;
            }
        },
    };
    let scale = inputs.ph_scale;
    let mut pair = [None, None];
    for (slot, p) in pair.iter_mut().zip([a, b]) {
        let v = inputs.carbon[rank(p)]?;
        match measured(p, v, scale) {
            Ok(m) => *slot = Some(m),
            Err(e) => {
                library_issue(plan, record, &e, s);
                return None;
            }
        }
    }
    let (ma, mb) = (pair[0]?, pair[1]?);
    // Rows with the same water (a sheet of one station or one pond, or
    // values from --set) share its prepared constants. Where the water
    // changes from row to row and no exchange (which solves the water
    // again) is asked for, a row is solved straight from its water, with
    // the same constants: keeping a copy of them that no other row will use
    // costs more than it saves.
    let same = s.prepared.as_ref().map(|p| p.water()) == Some(water);
    let direct = !same && !plan.exchange && s.changing;
    s.changing = !same;
    if !same && !direct {
        // With uncertainties, sea water's constants are kept on tangents
        // of the temperature and salinity too (the same numbers), which
        // each row's propagation would make again otherwise.
        let prepared = if plan.uncertainty.is_some() {
            water.prepare_with_slopes()
        } else {
            water.prepare()
        };
        match prepared {
            Ok(p) => s.prepared = Some(p),
            Err(e) => {
                s.prepared = None;
                library_issue(plan, record, &e, s);
                return None;
            }
        }
    }
    let prepared = s.prepared.as_ref();
    let solve = || {
        let Some(prepared) = prepared.filter(|_| !direct) else {
            return water.solve_with(ma, mb, &plan.options);
        };
        if plan.exchange {
            match prepared.solve_with(ma, mb, &plan.options) {
                Ok(state) => match inputs.air() {
                    Ok(air) => prepared.with_exchange(state, &air, inputs.ph_scale_given()),
                    Err(e) => Err(e),
                },
                Err(e) => Err(e),
            }
        } else {
            prepared.solve_with(ma, mb, &plan.options)
        }
    };
    // A state is over a kilobyte, so it is made in its place and borrowed:
    // on the stack, or where the plan keeps it, in the scratch's box (moved
    // in once; the box goes back to the scratch at the end).
    let mut kept = None;
    let local;
    let result: &Result<State, Error> = if plan.keep_state {
        let place = match s.state.take() {
            Some(mut place) => {
                *place = solve();
                place
            }
            None => Box::new(solve()),
        };
        kept.insert(place)
    } else {
        local = solve();
        &local
    };
    let state = match result {
        Ok(state) => state,
        Err(e) => {
            library_issue(plan, record, e, s);
            return None;
        }
    };
    if let Some(text) = implausible(state, &ma, &mb) {
        s.fail("no_water_fits", Some(a.field().name().to_string()));
        s.error(
            format!("no water fits {} with {}", a.name(), b.name()),
            text,
        );
        return None;
    }
    if !plan.keep_state {
        for c in &plan.computed {
            s.values.push(c.value(state));
        }
    }
    if let Some(profile) = &plan.flags {
        crate::decisions::codes_into(state, profile, &mut s.flags);
    }
    let default_scale = scale.unwrap_or(medium_scale(water.medium()));
    for (i, rc) in plan.residuals.iter().enumerate() {
        let p = rc.parameter;
        if p == a || p == b {
            continue;
        }
        let Some(v) = inputs.carbon[rank(p)] else {
            continue;
        };
        // An extra measurement must itself be valid to be compared.
        if let Err(e) = measured(p, v, scale) {
            let mut tmp = Scratch::default();
            library_issue(plan, record, &e, &mut tmp);
            for issue in tmp.issues {
                s.warning(
                    format!("{} (no residual)", issue.key),
                    format!("{} (no residual)", issue.text),
                );
            }
            continue;
        }
        let ph_scale = match v {
            CarbonValue::Ph(_, Some(sc)) => sc,
            _ => default_scale,
        };
        s.residuals[i] = measured_in_output(p, v, state, plan.units, ph_scale);
    }
    if let Some(request) = plan.dose {
        dose_row(inputs, water, state, request, s);
    }
    if let Some(up) = &plan.uncertainty {
        uncertainty_row(plan, up, record, inputs, water, (ma, mb), state, s);
    }
    for (i, w) in state.warnings.iter().enumerate() {
        s.caution(i, w, plan.keys);
    }
    if let Some(place) = kept {
        s.state = Some(place);
        s.solved = true;
    }
    Some(())
}

/// The dose of a row: its columns, or the reason it has none in the
/// row's message (a warning: the water itself was computed).
fn dose_row(inputs: &Sample, water: &Water, state: &State, request: DoseRequest, s: &mut Scratch) {
    let mut request = request.with_ph_scale(inputs.input_ph_scale(water.medium()));
    if let Some(ppm) = inputs.air_co2_ppm {
        match request.with_air_co2_ppm(ppm) {
            Ok(r) => request = r,
            Err(e) => return s.warning(error_key(&e), format!("no dose: {e}")),
        }
    }
    let volume = match inputs.volume_treated_m3() {
        Ok(v) => v,
        Err(e) => {
            return s.warning(
                format!("no dose: {}", error_key(&e)),
                format!("no dose: {e}"),
            )
        }
    };
    match crate::decisions::dose::dose(water, state, request) {
        Ok(d) => {
            let three = Digits::Significant(3);
            s.dose[0] = Some((d.dose_g_m3, three));
            if let Some(m3) = volume {
                let kg = d.total_kg(m3);
                s.dose[1] = Some((kg, three));
                s.dose[2] = Some((kg / crate::decisions::volume::KG_PER_POUND, three));
            } else {
                s.note(
                    "no volume: dose per m³ only".into(),
                    "no volume (volume_m3, or area_m2 with mean_depth_m): the dose is per m³ only"
                        .into(),
                );
            }
        }
        // Beyond the target already: no dose, and the row is as it was.
        Err(e @ Error::PastTarget { .. }) => s.note(
            "no dose: the water is already beyond the target".into(),
            format!("no dose: {e}"),
        ),
        Err(e) => s.warning(
            format!("no dose: {}", error_key(&e)),
            format!("no dose: {e}"),
        ),
    }
}

/// The setting of a row's `<column>_u` cell: its number in the unit of
/// its value column (a temperature in °F as a difference), or a
/// percentage; `None` for an empty cell.
fn cell_setting(
    u: &super::plan::UncertaintyColumn,
    record: Cells<'_>,
    decimal_comma: bool,
) -> Option<Result<Setting, SettingError>> {
    let mut text = cell_text(record, u.index).trim().to_string();
    if text.is_empty() {
        return None;
    }
    if decimal_comma {
        text = text.replace(',', ".");
    }
    Some(Setting::of(u.target, &in_column_unit(u, text), &u.header))
}

/// The text of an uncertainty of `u`'s value column, a number in that
/// column's unit (a temperature in °F as a difference) or a percentage, as
/// a setting's value reads it (the one reading, in the input layer).
pub(super) fn in_column_unit(u: &super::plan::UncertaintyColumn, text: String) -> String {
    u.reading.difference_text(text)
}

/// The standard uncertainty of every numeric computed column of a row
/// (issue 13): the sheet's settings, then the row's `_u` cells, propagated
/// through the row's water and pair as `solve --uncertainty` does. A
/// setting of a carbonate parameter outside the row's pair is noted and
/// left out; any other problem leaves the row's `_u` cells empty, with the
/// reason as a warning.
#[allow(clippy::too_many_arguments)]
fn uncertainty_row(
    plan: &Plan,
    up: &super::plan::UncertaintyPlan,
    record: Cells<'_>,
    inputs: &Sample,
    water: &Water,
    (a, b): (Measured, Measured),
    state: &State,
    s: &mut Scratch,
) {
    use crate::decisions::uncertainty::{propagate_quantities, Problem, Uncertainties};
    use crate::decisions::uncertainty_settings::{with_settings, Target};
    let mut settings: Vec<Setting> = up.settings.clone();
    for u in &up.columns {
        match cell_setting(u, record, plan.decimal_comma) {
            None => {}
            Some(Ok(setting)) => settings.push(setting),
            Some(Err(e)) => {
                return s.warning(
                    format!("no uncertainties: {}", e.code()),
                    format!("no uncertainties: {e}"),
                )
            }
        }
    }
    let base = up.base.clone();
    let mut used = Vec::with_capacity(settings.len());
    // The wind's uncertainty counts only in a row with a wind speed (and
    // the exchange figures); elsewhere it is noted and left out, as a
    // carbonate parameter the row did not measure is.
    let wind = plan.exchange && inputs.air().is_ok_and(|air| air.wind_m_s().is_some());
    for setting in settings {
        if setting.target() == Target::Input(Input::Wind) && !wind {
            s.note(
                format!("uncertainty not used: {}", setting.name()),
                "not used in this row: it has no wind speed".to_string(),
            );
            continue;
        }
        match with_settings(
            Uncertainties::new(),
            std::slice::from_ref(&setting),
            &a,
            &b,
            state.density_kg_m3,
        ) {
            Ok(_) => used.push(setting),
            Err(e @ SettingError::NotMeasured { .. }) => s.note(
                format!("uncertainty not used: {}", setting.name()),
                format!("not used in this row: {e}"),
            ),
            Err(e) => {
                return s.warning(
                    format!("no uncertainties: {}", e.code()),
                    format!("no uncertainties: {e}"),
                )
            }
        }
    }
    let u = match with_settings(base, &used, &a, &b, state.density_kg_m3) {
        Ok(u) => u,
        Err(e) => {
            return s.warning(
                format!("no uncertainties: {}", e.code()),
                format!("no uncertainties: {e}"),
            )
        }
    };
    // The row's own prepared water where it is this water (as the row's
    // solve found it), else the water prepared again.
    let prepared = match s.prepared.as_ref().filter(|p| p.water() == water) {
        Some(p) => Ok(p.clone()),
        None => water.prepare_with_slopes(),
    };
    let problem = match prepared.map(|p| Problem::from_prepared(p, a, b)) {
        Ok(p) => p.with_options(plan.options),
        Err(e) => {
            return s.warning(
                format!("no uncertainties: {}", error_key(&e)),
                format!("no uncertainties: {e}"),
            )
        }
    };
    let problem = if plan.exchange {
        match inputs.air() {
            Ok(air) => problem.with_air(air, inputs.ph_scale_given()),
            Err(_) => problem,
        }
    } else {
        problem
    };
    let outputs: Vec<Output> = up.outputs.iter().map(|&i| plan.computed[i]).collect();
    let result = propagate_quantities(
        &problem,
        &u,
        crate::output::uncertainty::OutputQuantities(&outputs),
    );
    match result {
        Ok(p) => {
            for (slot, (o, r)) in s.uncertain.iter_mut().zip(outputs.iter().zip(&p.outputs)) {
                *slot =
                    r.u.map(|u| (u, crate::output::uncertainty_report::u_digits(*o)));
            }
        }
        Err(e) => s.warning(
            format!("no uncertainties: {}", error_key(&e)),
            format!("no uncertainties: {e}"),
        ),
    }
}

fn ragged(plan: &Plan, record: &csv::ByteRecord, s: &mut Scratch) {
    let n = record.len();
    let w = plan.width;
    let text = if n < w {
        format!("the row has {n} fields, the header has {w}")
    } else {
        let extra: Vec<String> = record
            .iter()
            .skip(w)
            .map(|f| format!("`{}`", cell::shorten(&String::from_utf8_lossy(f))))
            .collect();
        format!(
            "the row has {n} fields, the header has {w}; the extra fields are {}",
            extra.join(", ")
        )
    };
    let key = if n < w {
        "fewer fields than the header"
    } else {
        "more fields than the header"
    };
    s.error(key.into(), text);
}

fn no_pair(plan: &Plan, present: &[bool; 9], s: &mut Scratch) {
    s.fail("wrong_count", None);
    let given: Vec<&str> = RANKING
        .iter()
        .zip(present)
        .filter(|(_, p)| **p)
        .map(|(q, _)| q.name())
        .collect();
    let empty: Vec<String> = RANKING
        .iter()
        .zip(present)
        .filter(|(_, p)| !**p)
        .filter_map(|(q, _)| match plan.label(Input::Carbon(*q)) {
            Some(Label::Column(i)) => Some(format!("`{}`", plan.read[*i].header)),
            _ => None,
        })
        .collect();
    let empty = if empty.is_empty() {
        String::new()
    } else {
        format!(" (empty: {})", empty.join(", "))
    };
    let (key, text) = match given.len() {
        0 => (
            format!("no carbonate parameter in the row{empty}"),
            format!("no carbonate parameter is given in this row{empty}; a pair needs two"),
        ),
        1 => (
            format!("only one carbonate parameter in the row{empty}"),
            format!(
                "only {} is given in this row{empty}; a pair needs two carbonate parameters",
                given[0]
            ),
        ),
        _ => (
            format!("only gas parameters in the row{empty}"),
            format!(
                "only {} are given in this row{empty}; they carry the same information (the \
                 dissolved CO2), so a pair needs one of alkalinity, dic, ph, hco3, co3 as well",
                given.join(" and ")
            ),
        ),
    };
    s.error(key, text);
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ranking_chooses_the_best_pair() {
        let mut present = [false; 9];
        present[rank(Parameter::Ph)] = true;
        present[rank(Parameter::Pco2)] = true;
        present[rank(Parameter::Alkalinity)] = true;
        assert_eq!(
            choose_pair(&present),
            Some((Parameter::Alkalinity, Parameter::Ph))
        );
        let mut gases = [false; 9];
        gases[rank(Parameter::Pco2)] = true;
        gases[rank(Parameter::Xco2)] = true;
        assert_eq!(choose_pair(&gases), None);
        gases[rank(Parameter::Co3)] = true;
        assert_eq!(choose_pair(&gases), Some((Parameter::Pco2, Parameter::Co3)));
    }
}
