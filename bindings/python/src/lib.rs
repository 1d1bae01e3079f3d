//! The native part of the Python package `travertine` (issue 15).
//!
//! The Python layer (`python/travertine/__init__.py`) broadcasts the
//! inputs and checks the keywords; this module solves the rows with the
//! library's batch of rows ([`travertine::sheet::Batch`]: each row read,
//! checked and solved exactly as a row of a field sheet), in parallel with
//! rayon and with the GIL released, and hands back numpy arrays.
//!
//! Nothing here describes an input or an output: the names, units and help
//! come from the library's two lists ([`travertine::sample::inputs::INPUTS`]
//! and [`travertine::output::Output`]).

#![forbid(unsafe_code)]

use numpy::{PyArray1, PyReadonlyArray1};
use pyo3::exceptions::PyValueError;
use pyo3::prelude::*;
use pyo3::types::{PyDict, PyList, PyString};
use rayon::prelude::*;
use travertine::decisions::blend::{blend_states, Share};
use travertine::decisions::dose::DoseRequest;
use travertine::decisions::uncertainty::Uncertainties;
use travertine::decisions::Profile;
use travertine::output::{Output, Record, Value};
use travertine::sample::inputs::INPUTS;
use travertine::sheet::{input_named, Batch, Cell, Outcome, SheetOptions};

/// Rows per parallel task.
const TASK: usize = 256;

/// A column of inputs as handed over by the Python layer.
enum Column<'a> {
    /// One number per row.
    Numbers(&'a [f64]),
    /// One number for every row.
    Number(f64),
    /// One text for every row.
    Text(String),
    /// One text (or nothing) per row.
    Texts(Vec<Option<String>>),
}

impl Column<'_> {
    fn cell(&self, i: usize) -> Cell<'_> {
        match self {
            Column::Numbers(v) => Cell::Number(v[i]),
            Column::Number(v) => Cell::Number(*v),
            Column::Text(t) => Cell::Text(t),
            Column::Texts(v) => match &v[i] {
                Some(t) => Cell::Text(t),
                None => Cell::Empty,
            },
        }
    }
}

/// A value error with the library's message.
fn value_error(e: impl std::fmt::Display) -> PyErr {
    PyValueError::new_err(e.to_string())
}

/// The list of inputs: `(name, flag, help, accepted, is_choice)` for every
/// row of the library's list, `name` being the canonical sheet column.
#[pyfunction]
fn inputs() -> Vec<(&'static str, &'static str, &'static str, String, bool)> {
    INPUTS
        .iter()
        .map(|s| {
            (
                s.column,
                s.flag,
                s.help,
                s.input.accepted(),
                s.input.is_choice(),
            )
        })
        .collect()
}

/// The list of outputs: `(key, label, unit)`, in the order of the JSON of
/// `travertine solve --json`.
#[pyfunction]
fn outputs() -> Vec<(&'static str, &'static str, &'static str)> {
    Output::ALL
        .iter()
        .map(|o| (o.key(), o.label(), o.unit()))
        .collect()
}

/// Whether `name` is an input name (as a sheet header reads it).
#[pyfunction]
fn is_input(name: &str) -> bool {
    input_named(name).is_some()
}

/// The output buffers of one task: a slice of every column, each computed
/// one with its output, so that a row's outputs go from its state straight
/// into their columns.
struct Task<'a> {
    start: usize,
    len: usize,
    numbers: Vec<(Output, &'a mut [f64])>,
    texts: Vec<(Output, Coder<'a>)>,
    residuals: Vec<&'a mut [f64]>,
    dose: Vec<&'a mut [f64]>,
    /// The uncertainty column of each computed column, where asked for
    /// (none for a text).
    uncertain: Vec<Option<&'a mut [f64]>>,
    flags: Option<Coder<'a>>,
    status: Coder<'a>,
    message: Coder<'a>,
}

/// The tables of a task's coded columns, in the order of [`Task`]: the
/// texts, the flags, the status and the message.
type Tables = (
    Vec<Vec<String>>,
    Option<Vec<String>>,
    Vec<String>,
    Vec<String>,
);

/// A task's coding of one text column: each row's code written straight
/// into the task's slice of the column's codes (0: none), into the task's
/// own table (code k: `table[k - 1]`); the tables of the tasks are merged
/// after the rows ([`merge_codes`]). With `hashed` a text met before in the
/// task is coded as before (a short search); without, only a run of equal
/// texts is (messages carry the row's figures when they have any).
struct Coder<'a> {
    codes: &'a mut [u32],
    table: Vec<String>,
    hashed: bool,
}

impl<'a> Coder<'a> {
    fn new(codes: &'a mut [u32], hashed: bool) -> Self {
        Coder {
            codes,
            table: Vec::new(),
            hashed,
        }
    }

    /// Codes `text` for the task's row `k`.
    fn put(&mut self, k: usize, text: &str) {
        let code = match self.table.last() {
            Some(last) if last == text => self.table.len(),
            _ => {
                // A short search: a longer table is merged by hash later.
                let found = if self.hashed && self.table.len() <= 16 {
                    self.table.iter().position(|t| t == text)
                } else {
                    None
                };
                match found {
                    Some(i) => i + 1,
                    None => {
                        self.table.push(text.to_string());
                        self.table.len()
                    }
                }
            }
        };
        self.codes[k] = code as u32;
    }
}

/// Merges the tables of the tasks of one coded column (`codes`, in chunks
/// of [`TASK`] rows, one per task) into one, and rewrites each task's codes
/// into it: every distinct text once with `hashed`, else each run of equal
/// texts once.
fn merge_codes(codes: Vec<u32>, tables: Vec<Vec<String>>, hashed: bool) -> Coded {
    let mut codes = codes;
    let mut texts: Vec<Option<String>> = vec![None];
    let mut index: std::collections::HashMap<String, u32> = std::collections::HashMap::new();
    let mut maps: Vec<Vec<u32>> = Vec::with_capacity(tables.len());
    for table in tables {
        let mut map = Vec::with_capacity(table.len() + 1);
        map.push(0);
        for text in table {
            let code = if hashed {
                let next = texts.len() as u32;
                *index.entry(text).or_insert_with_key(|t| {
                    texts.push(Some(t.clone()));
                    next
                })
            } else if texts.last().and_then(|t| t.as_deref()) == Some(text.as_str()) {
                (texts.len() - 1) as u32
            } else {
                texts.push(Some(text));
                (texts.len() - 1) as u32
            };
            map.push(code);
        }
        maps.push(map);
    }
    codes
        .par_chunks_mut(TASK)
        .zip(maps)
        .for_each(|(chunk, map)| {
            // A task whose codes are already those of the merged table.
            if map.iter().enumerate().all(|(i, c)| *c as usize == i) {
                return;
            }
            for c in chunk {
                *c = map[*c as usize];
            }
        });
    Coded { codes, texts }
}

/// Where each computed column goes.
#[derive(Clone, Copy)]
enum Slot {
    Number(usize),
    Text(usize),
}

/// The first error of a batch: row, code, field, message.
type FirstError = (usize, &'static str, Option<String>, String);

/// A column of texts as codes into its distinct texts (code 0: none),
/// which the Python layer turns into an object array by indexing: far
/// cheaper than one Python object per row, and made without the GIL.
struct Coded {
    codes: Vec<u32>,
    texts: Vec<Option<String>>,
}

/// The solved rows, column by column.
struct Solved {
    names: Vec<String>,
    slots: Vec<Slot>,
    numbers: Vec<Vec<f64>>,
    number_names: Vec<String>,
    texts: Vec<Coded>,
    flags: Option<Coded>,
    status: Coded,
    message: Coded,
    first_error: Option<FirstError>,
}

/// Solves `n` rows of `columns` (named `names`) with `batch`, in parallel.
fn solve_rows(batch: &Batch, columns: &[Column<'_>], n: usize, uncertain: bool) -> Solved {
    let computed = batch.computed();
    let probe = travertine::Conditions::new(25.0, 35.0)
        .and_then(travertine::Water::saline)
        .and_then(|w| {
            w.solve(
                travertine::Measured::alkalinity_umol_kg(2300.0)?,
                travertine::Measured::dic_umol_kg(2000.0)?,
            )
        })
        .ok();
    let mut slots = Vec::new();
    let mut number_names: Vec<String> = Vec::new();
    let mut text_count = 0;
    for o in computed {
        let is_text = match &probe {
            Some(s) => matches!(o.value(s), Value::Text(_)),
            None => false,
        };
        if is_text {
            slots.push(Slot::Text(text_count));
            text_count += 1;
        } else {
            slots.push(Slot::Number(number_names.len()));
            number_names.push(o.key().to_string());
        }
    }
    let computed_numbers = number_names.len();
    number_names.extend(batch.residual_columns().iter().cloned());
    number_names.extend(batch.dose_columns().iter().cloned());
    if uncertain {
        for i in 0..computed_numbers {
            let u = format!("{}_u", number_names[i]);
            number_names.push(u);
        }
    }
    let mut numbers: Vec<Vec<f64>> = number_names.iter().map(|_| vec![f64::NAN; n]).collect();
    // The codes of the text columns (zeroed: code 0 is none), written by
    // the tasks.
    let mut texts: Vec<Vec<u32>> = (0..text_count).map(|_| vec![0; n]).collect();
    let mut flags: Option<Vec<u32>> = batch.has_flags().then(|| vec![0; n]);
    let mut status: Vec<u32> = vec![0; n];
    let mut message: Vec<u32> = vec![0; n];

    let mut tasks = Vec::with_capacity(n.div_ceil(TASK));
    {
        let mut number_chunks: Vec<_> = numbers.iter_mut().map(|v| v.chunks_mut(TASK)).collect();
        let mut text_chunks: Vec<_> = texts.iter_mut().map(|v| v.chunks_mut(TASK)).collect();
        let mut flag_chunks = flags.as_mut().map(|v| v.chunks_mut(TASK));
        let mut status_chunks = status.chunks_mut(TASK);
        let mut message_chunks = message.chunks_mut(TASK);
        let residuals_at = computed_numbers;
        let dose_at = residuals_at + batch.residual_columns().len();
        let u_at = dose_at + batch.dose_columns().len();
        let mut start = 0;
        while let (Some(status), Some(message)) = (status_chunks.next(), message_chunks.next()) {
            let len = status.len();
            let mut number = number_chunks.iter_mut().filter_map(Iterator::next);
            let mut text = text_chunks.iter_mut().filter_map(Iterator::next);
            let mut numbers = Vec::with_capacity(computed_numbers);
            let mut texts = Vec::with_capacity(text_count);
            for (o, slot) in computed.iter().zip(&slots) {
                match slot {
                    Slot::Number(_) => numbers.extend(number.next().map(|c| (*o, c))),
                    Slot::Text(_) => texts.extend(text.next().map(|c| (*o, Coder::new(c, true)))),
                }
            }
            let residuals: Vec<_> = number.by_ref().take(dose_at - residuals_at).collect();
            let dose: Vec<_> = number.by_ref().take(u_at - dose_at).collect();
            let uncertain = if uncertain {
                slots
                    .iter()
                    .map(|slot| match slot {
                        Slot::Number(_) => number.next(),
                        Slot::Text(_) => None,
                    })
                    .collect()
            } else {
                Vec::new()
            };
            tasks.push(Task {
                start,
                len,
                numbers,
                texts,
                residuals,
                dose,
                uncertain,
                flags: flag_chunks
                    .as_mut()
                    .and_then(Iterator::next)
                    .map(|c| Coder::new(c, true)),
                status: Coder::new(status, true),
                message: Coder::new(message, false),
            });
            start += len;
        }
    }
    let done: Vec<(Option<FirstError>, Tables)> = tasks
        .into_par_iter()
        .map(|mut t| {
            let mut out = Outcome::default();
            let mut first = None;
            let mut cells: Vec<Cell<'_>> = columns.iter().map(|c| c.cell(t.start)).collect();
            // The row's message where it is the last one coded (rows with
            // the same things to say share it: no comparing of texts).
            let mut last_message: Option<std::sync::Arc<str>> = None;
            for k in 0..t.len {
                let row = t.start + k;
                for (cell, column) in cells.iter_mut().zip(columns) {
                    *cell = column.cell(row);
                }
                batch.solve(&cells, &mut out);
                t.status.put(k, out.status());
                // Every row has a message ("" where there is nothing to say).
                let shared = out.shared_message();
                match &last_message {
                    Some(last) if std::sync::Arc::ptr_eq(last, shared) => {
                        t.message.codes[k] = t.message.table.len() as u32;
                    }
                    _ => {
                        t.message.put(k, shared);
                        last_message = Some(shared.clone());
                    }
                }
                // And flags ("" where none), where they are asked for.
                if let Some(f) = t.flags.as_mut() {
                    if out.flags().is_empty() {
                        f.put(k, "");
                    } else {
                        f.put(k, &out.flags().join(";"));
                    }
                }
                if let Some((code, field)) = out.error() {
                    if first.is_none() {
                        first = Some((
                            row,
                            code,
                            field.map(str::to_string),
                            out.message().to_string(),
                        ));
                    }
                    continue;
                }
                // Each output read from the row's state straight into its
                // column.
                if let Some(state) = out.state() {
                    for (o, column) in t.numbers.iter_mut() {
                        if let Value::Number(Some(v)) = o.value(state) {
                            column[k] = v;
                        }
                    }
                    for (o, column) in t.texts.iter_mut() {
                        if let Value::Text(Some(s)) = o.value(state) {
                            column.put(k, s);
                        }
                    }
                }
                for (column, r) in t.residuals.iter_mut().zip(out.residuals()) {
                    column[k] = r.unwrap_or(f64::NAN);
                }
                for (column, d) in t.dose.iter_mut().zip(out.dose()) {
                    column[k] = d.unwrap_or(f64::NAN);
                }
                for (column, u) in t.uncertain.iter_mut().zip(out.uncertainties()) {
                    if let Some(column) = column {
                        column[k] = u.unwrap_or(f64::NAN);
                    }
                }
            }
            let tables = (
                t.texts.into_iter().map(|(_, c)| c.table).collect(),
                t.flags.map(|c| c.table),
                t.status.table,
                t.message.table,
            );
            (first, tables)
        })
        .collect();
    let mut firsts = Vec::with_capacity(done.len());
    let mut text_tables: Vec<Vec<Vec<String>>> = (0..text_count)
        .map(|_| Vec::with_capacity(done.len()))
        .collect();
    let mut flag_tables = Vec::with_capacity(done.len());
    let mut status_tables = Vec::with_capacity(done.len());
    let mut message_tables = Vec::with_capacity(done.len());
    for (first, (texts, flags, status, message)) in done {
        firsts.push(first);
        for (tables, table) in text_tables.iter_mut().zip(texts) {
            tables.push(table);
        }
        flag_tables.extend(flags);
        status_tables.push(status);
        message_tables.push(message);
    }
    let texts = texts
        .into_iter()
        .zip(text_tables)
        .map(|(codes, tables)| merge_codes(codes, tables, true))
        .collect();
    let flags = flags.map(|codes| merge_codes(codes, flag_tables, true));
    let status = merge_codes(status, status_tables, true);
    let message = merge_codes(message, message_tables, false);
    Solved {
        names: computed.iter().map(|o| o.key().to_string()).collect(),
        slots,
        numbers,
        number_names,
        texts,
        flags,
        status,
        message,
        first_error: firsts.into_iter().flatten().next(),
    }
}

/// A list of Python strings, one object per distinct text.
fn text_list<'py>(
    py: Python<'py>,
    values: impl Iterator<Item = Option<&'py str>>,
) -> PyResult<Bound<'py, PyList>> {
    let mut cache: Vec<(&str, Bound<'py, PyString>)> = Vec::new();
    let mut last: Option<(&str, Bound<'py, PyString>)> = None;
    let list = PyList::empty(py);
    for v in values {
        match v {
            None => list.append(py.None())?,
            Some(s) => {
                if let Some((t, o)) = &last {
                    if *t == s {
                        list.append(o)?;
                        continue;
                    }
                }
                let obj = match cache.iter().find(|(t, _)| *t == s) {
                    Some((_, o)) => o.clone(),
                    None => {
                        let o = PyString::new(py, s);
                        if cache.len() < 64 {
                            cache.push((s, o.clone()));
                        }
                        o
                    }
                };
                list.append(&obj)?;
                last = Some((s, obj));
            }
        }
    }
    Ok(list)
}

/// The result dictionary of solved rows, and the first error.
fn result_dict<'py>(
    py: Python<'py>,
    solved: Solved,
) -> PyResult<(Bound<'py, PyDict>, Option<FirstError>)> {
    let Solved {
        names,
        slots,
        numbers,
        number_names,
        texts,
        flags,
        status,
        message,
        first_error,
    } = solved;
    let dict = PyDict::new(py);
    let mut numbers: Vec<Option<Vec<f64>>> = numbers.into_iter().map(Some).collect();
    let mut texts: Vec<Option<Coded>> = texts.into_iter().map(Some).collect();
    let coded_pair = |c: Coded| -> PyResult<Bound<'py, PyAny>> {
        Ok((PyArray1::from_vec(py, c.codes), c.texts)
            .into_pyobject(py)?
            .into_any())
    };
    for (name, slot) in names.iter().zip(&slots) {
        match slot {
            Slot::Number(j) => {
                let v = numbers[*j].take().unwrap_or_default();
                dict.set_item(name, PyArray1::from_vec(py, v))?;
            }
            Slot::Text(j) => {
                if let Some(c) = texts[*j].take() {
                    dict.set_item(name, coded_pair(c)?)?;
                }
            }
        }
    }
    for (j, name) in number_names.iter().enumerate() {
        if let Some(v) = numbers[j].take() {
            dict.set_item(name, PyArray1::from_vec(py, v))?;
        }
    }
    if let Some(f) = flags {
        dict.set_item("flags", coded_pair(f)?)?;
    }
    dict.set_item("status", coded_pair(status)?)?;
    dict.set_item("message", coded_pair(message)?)?;
    Ok((dict, first_error))
}

/// Reads the columns handed over by the Python layer.
fn read_columns<'a>(
    values: &'a [Bound<'_, PyAny>],
    arrays: &'a [Option<PyReadonlyArray1<'_, f64>>],
    n: usize,
) -> PyResult<Vec<Column<'a>>> {
    let mut columns = Vec::with_capacity(values.len());
    for (v, a) in values.iter().zip(arrays) {
        columns.push(if let Some(a) = a {
            let s = a.as_slice().map_err(value_error)?;
            if s.len() != n {
                return Err(value_error(format!(
                    "an input has {} values, not {n}",
                    s.len()
                )));
            }
            Column::Numbers(s)
        } else if let Ok(x) = v.extract::<f64>() {
            Column::Number(x)
        } else if let Ok(t) = v.extract::<String>() {
            Column::Text(t)
        } else {
            let texts: Vec<Option<String>> = v.extract()?;
            if texts.len() != n {
                return Err(value_error(format!(
                    "an input has {} values, not {n}",
                    texts.len()
                )));
            }
            Column::Texts(texts)
        });
    }
    Ok(columns)
}

/// Solves `n` rows: `names[i]` is the input name of `values[i]`, a float64
/// array of `n` values, a float, a str, or a list of `n` str or None.
#[pyfunction]
#[pyo3(signature = (names, values, n, columns, pair=None, root=None, profile=None, dose=None, uncertainty=None, constants=true))]
#[allow(clippy::too_many_arguments)]
fn solve_columns<'py>(
    py: Python<'py>,
    names: Vec<String>,
    values: Vec<Bound<'py, PyAny>>,
    n: usize,
    columns: String,
    pair: Option<String>,
    root: Option<String>,
    profile: Option<String>,
    dose: Option<(String, String, Option<f64>, Option<f64>)>,
    uncertainty: Option<Vec<(String, f64, bool)>>,
    constants: bool,
) -> PyResult<(Bound<'py, PyDict>, Option<FirstError>)> {
    let mut options = SheetOptions::default()
        .with_columns(&columns)
        .map_err(value_error)?;
    if let Some(p) = pair {
        options = options.with_pair(&p).map_err(value_error)?;
    }
    if let Some(r) = root {
        options = options.with_root(r.parse().map_err(value_error)?);
    }
    if let Some(p) = profile {
        options = options.with_profile(Profile::from_arg(&p).map_err(value_error)?);
    }
    if let Some((chemical, target, purity, dissolved)) = dose {
        let mut request = DoseRequest::new(
            chemical.parse().map_err(value_error)?,
            target.parse().map_err(value_error)?,
        );
        if let Some(p) = purity {
            request = request.with_purity_percent(p).map_err(value_error)?;
        }
        if let Some(f) = dissolved {
            request = request.with_dissolved_fraction(f).map_err(value_error)?;
        }
        options = options.with_dose(request);
    }
    let name_refs: Vec<&str> = names.iter().map(String::as_str).collect();
    let mut batch = Batch::new(&name_refs, &options).map_err(value_error)?;
    let uncertain = uncertainty.is_some();
    if let Some(u) = &uncertainty {
        // Each source read as a sheet reads it: an input's column name
        // with a size in that column's unit, a constant's name, or a %.
        let base = if constants {
            Uncertainties::new()
        } else {
            Uncertainties::new().without_constants()
        };
        batch = batch
            .with_named_uncertainties(u, base)
            .map_err(value_error)?;
    }
    let arrays: Vec<Option<PyReadonlyArray1<'py, f64>>> =
        values.iter().map(|v| v.extract().ok()).collect();
    let columns = read_columns(&values, &arrays, n)?;
    let solved = py.detach(|| solve_rows(&batch, &columns, n, uncertain));
    result_dict(py, solved)
}

/// Blends two sets of saved results row by row: `first` and `second` are
/// `(key, values)` pairs (float64 arrays or lists of str) of the JSON keys,
/// as `solve` returns them; `fraction` the share of the first, by mass or
/// by volume.
#[pyfunction]
fn blend_columns<'py>(
    py: Python<'py>,
    first: Vec<(String, Bound<'py, PyAny>)>,
    second: Vec<(String, Bound<'py, PyAny>)>,
    fraction: PyReadonlyArray1<'py, f64>,
    by_volume: bool,
) -> PyResult<(Bound<'py, PyDict>, Option<FirstError>)> {
    let fraction = fraction.as_slice().map_err(value_error)?.to_vec();
    let n = fraction.len();
    let rows = |given: &[(String, Bound<'py, PyAny>)]| -> PyResult<Vec<serde_json::Map<String, serde_json::Value>>> {
        let mut rows = vec![serde_json::Map::new(); n];
        for (key, v) in given {
            if let Ok(a) = v.extract::<PyReadonlyArray1<'py, f64>>() {
                for (row, x) in rows.iter_mut().zip(a.as_slice().map_err(value_error)?) {
                    if let Some(num) = serde_json::Number::from_f64(*x) {
                        row.insert(key.clone(), serde_json::Value::Number(num));
                    }
                }
            } else if let Ok(texts) = v.extract::<Vec<Option<String>>>() {
                for (row, t) in rows.iter_mut().zip(texts) {
                    if let Some(t) = t {
                        row.insert(key.clone(), serde_json::Value::String(t));
                    }
                }
            }
        }
        Ok(rows)
    };
    let (a, b) = (rows(&first)?, rows(&second)?);
    let solved = py.detach(|| {
        let outcomes: Vec<Result<travertine::State, String>> = (0..n)
            .into_par_iter()
            .map(|i| {
                let saved = |m: &serde_json::Map<String, serde_json::Value>| {
                    serde_json::from_value::<Record>(serde_json::Value::Object(m.clone()))
                        .map_err(|e| format!("not a saved result: {e}"))
                        .and_then(|r| r.solved().map_err(|e| e.to_string()))
                };
                let (s1, s2) = (saved(&a[i])?, saved(&b[i])?);
                let share = if by_volume {
                    Share::ByVolume(fraction[i])
                } else {
                    Share::ByMass(fraction[i])
                };
                blend_states(&s1, &s2, share)
                    .map(|m| m.state)
                    .map_err(|e| e.to_string())
            })
            .collect();
        outcomes
    });
    let dict = PyDict::new(py);
    let probe = solved.iter().find_map(|r| r.as_ref().ok());
    for o in Output::ALL {
        let is_text = probe.is_some_and(|s| matches!(o.value(s), Value::Text(_)));
        if is_text {
            let texts = solved.iter().map(|r| match r {
                Ok(s) => match o.value(s) {
                    Value::Text(t) => t,
                    _ => None,
                },
                Err(_) => None,
            });
            dict.set_item(o.key(), text_list(py, texts)?)?;
        } else {
            let v: Vec<f64> = solved
                .iter()
                .map(|r| match r.as_ref().map(|s| o.value(s)) {
                    Ok(Value::Number(Some(x))) => x,
                    _ => f64::NAN,
                })
                .collect();
            dict.set_item(o.key(), PyArray1::from_vec(py, v))?;
        }
    }
    let status = solved.iter().map(|r| {
        Some(match r {
            Ok(s)
                if s.warnings
                    .iter()
                    .any(|w| w.severity() != travertine::base::warning::Severity::Note) =>
            {
                "warning"
            }
            Ok(_) => "ok",
            Err(_) => "error",
        })
    });
    dict.set_item("status", text_list(py, status)?)?;
    let messages: Vec<String> = solved
        .iter()
        .map(|r| match r {
            Ok(s) => s
                .warnings
                .iter()
                .map(|w| w.to_string())
                .collect::<Vec<_>>()
                .join("; "),
            Err(e) => e.clone(),
        })
        .collect();
    dict.set_item(
        "message",
        text_list(py, messages.iter().map(|s| Some(s.as_str())))?,
    )?;
    let first = solved
        .iter()
        .enumerate()
        .find_map(|(i, r)| r.as_ref().err().map(|e| (i, "blend", None, e.clone())));
    Ok((dict, first))
}

/// The library's own loop, for the benchmark beside `solve`: every row's
/// saline water built and solved from alkalinity (µmol/kg) and pH (total
/// scale) through the library's API (`Water::saline`, `Water::solve`, and
/// `State::with_exchange` when `exchange`, as `solve --json` does), with
/// the numeric outputs of `keys` read from each state
/// (`Output::value`) into one array each: the same answer as
/// `travertine.solve` gives for those keys, made in Rust from end to end,
/// in parallel on the same rayon pool with the GIL released.
#[pyfunction]
#[pyo3(signature = (temperature_c, salinity, alkalinity_umol_kg, ph_total, keys, exchange=false))]
fn library_loop<'py>(
    py: Python<'py>,
    temperature_c: PyReadonlyArray1<'py, f64>,
    salinity: PyReadonlyArray1<'py, f64>,
    alkalinity_umol_kg: PyReadonlyArray1<'py, f64>,
    ph_total: PyReadonlyArray1<'py, f64>,
    keys: Vec<String>,
    exchange: bool,
) -> PyResult<Bound<'py, PyDict>> {
    use travertine::{Conditions, Measured, PhScale, Water};
    let t = temperature_c.as_slice().map_err(value_error)?;
    let s = salinity.as_slice().map_err(value_error)?;
    let a = alkalinity_umol_kg.as_slice().map_err(value_error)?;
    let p = ph_total.as_slice().map_err(value_error)?;
    let n = t.len();
    library_columns(py, n, &keys, |i| {
        Conditions::new(t[i], s[i])
            .and_then(Water::saline)
            .and_then(|w| {
                w.solve(
                    Measured::alkalinity_umol_kg(a[i])?,
                    Measured::ph(p[i], Some(PhScale::Total))?,
                )
            })
            .and_then(|state| {
                if exchange {
                    state.with_exchange(&travertine::sample::Air::new(), None)
                } else {
                    Ok(state)
                }
            })
    })
}

/// The library's own loop over fresh rows with calcium, for the benchmark
/// beside `solve` (the time only: the salinity here is 0, where a sheet
/// derives it from the conductance): `Water::fresh` with the specific
/// conductance and calcium (mg/L), solved from alkalinity (mg/L as CaCO3)
/// and pH (NBS), with the exchange with the air, the numeric outputs of
/// `keys` read into arrays.
#[pyfunction]
#[allow(clippy::too_many_arguments)]
fn library_loop_fresh<'py>(
    py: Python<'py>,
    temperature_c: PyReadonlyArray1<'py, f64>,
    specific_conductance_us_cm: PyReadonlyArray1<'py, f64>,
    alkalinity_mg_l_caco3: PyReadonlyArray1<'py, f64>,
    ph_nbs: PyReadonlyArray1<'py, f64>,
    calcium_mg_l: PyReadonlyArray1<'py, f64>,
    keys: Vec<String>,
) -> PyResult<Bound<'py, PyDict>> {
    use travertine::units::{Amount, Quantity, Unit, CA_G_MOL};
    use travertine::{Composition, Conditions, Measured, Parameter, Water};
    let t = temperature_c.as_slice().map_err(value_error)?;
    let c = specific_conductance_us_cm.as_slice().map_err(value_error)?;
    let a = alkalinity_mg_l_caco3.as_slice().map_err(value_error)?;
    let p = ph_nbs.as_slice().map_err(value_error)?;
    let ca = calcium_mg_l.as_slice().map_err(value_error)?;
    let n = t.len();
    library_columns(py, n, &keys, |i| {
        (|| {
            let calcium = Amount::from_quantity(
                Quantity::new(ca[i], Unit::MgPerLCa),
                Unit::MgPerLCa,
                CA_G_MOL,
            )
            .ok_or(travertine::Error::Missing {
                field: travertine::base::field::Field::Calcium,
                why: "",
            })?;
            let water = Water::fresh(Conditions::new(t[i], 0.0)?)?
                .with_specific_conductance_us_cm(c[i])?
                .with_composition(Composition::default().with_calcium(calcium)?);
            let state = water.solve(
                Measured::new(
                    Parameter::Alkalinity,
                    Quantity::new(a[i], Unit::MgPerLCaCO3),
                )?,
                Measured::ph(p[i], None)?,
            )?;
            state.with_exchange(&travertine::sample::Air::new(), None)
        })()
    })
}

/// The numeric outputs `keys` of `n` rows solved by `row` (its index in,
/// a state or an error out), in parallel without the GIL, as arrays (NaN
/// where a row failed): the scaffold of the library's own loops of the
/// benchmark.
fn library_columns<'py>(
    py: Python<'py>,
    n: usize,
    keys: &[String],
    row: impl Fn(usize) -> travertine::Result<travertine::State> + Sync,
) -> PyResult<Bound<'py, PyDict>> {
    let outputs: Vec<Output> = keys
        .iter()
        .map(|k| Output::from_key(k).ok_or_else(|| value_error(format!("no output `{k}`"))))
        .collect::<PyResult<_>>()?;
    let mut columns: Vec<Vec<f64>> = outputs.iter().map(|_| vec![f64::NAN; n]).collect();
    py.detach(|| {
        let mut chunks: Vec<_> = columns.iter_mut().map(|c| c.chunks_mut(TASK)).collect();
        let tasks: Vec<(usize, Vec<&mut [f64]>)> = (0..n.div_ceil(TASK))
            .map(|k| {
                (
                    k * TASK,
                    chunks.iter_mut().filter_map(Iterator::next).collect(),
                )
            })
            .collect();
        tasks.into_par_iter().for_each(|(start, mut out)| {
            let len = out.first().map_or(0, |c| c.len());
            for k in 0..len {
                let i = start + k;
                let solved = row(i);
                if let Ok(state) = solved {
                    for (column, o) in out.iter_mut().zip(&outputs) {
                        if let Value::Number(Some(v)) = o.value(&state) {
                            column[k] = v;
                        }
                    }
                }
            }
        });
    });
    let dict = PyDict::new(py);
    for (k, c) in keys.iter().zip(columns) {
        dict.set_item(k, PyArray1::from_vec(py, c))?;
    }
    Ok(dict)
}

/// The native module.
#[pymodule]
fn _native(m: &Bound<'_, PyModule>) -> PyResult<()> {
    m.add_function(wrap_pyfunction!(inputs, m)?)?;
    m.add_function(wrap_pyfunction!(outputs, m)?)?;
    m.add_function(wrap_pyfunction!(is_input, m)?)?;
    m.add_function(wrap_pyfunction!(solve_columns, m)?)?;
    m.add_function(wrap_pyfunction!(blend_columns, m)?)?;
    m.add_function(wrap_pyfunction!(library_loop, m)?)?;
    m.add_function(wrap_pyfunction!(library_loop_fresh, m)?)?;
    m.add("__version__", env!("CARGO_PKG_VERSION"))?;
    Ok(())
}
