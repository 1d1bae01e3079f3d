//! A batch of rows given as values rather than CSV text: the path of the
//! bindings (issue 15). Each column is named as a sheet header would be
//! (`alkalinity_umol_kg`, `ph_total`, `temperature_c`, `water`), each row
//! is read and solved exactly as a row of a sheet, with the same checks,
//! statuses and messages, and its outcome is handed back as numbers.
//!
//! ```
//! use travertine::output::Value;
//! use travertine::sheet::{Batch, Cell, Outcome, SheetOptions};
//! let options = SheetOptions::default().with_columns("ph_total,pco2_uatm")?;
//! let batch = Batch::new(&["temperature_c", "salinity", "alkalinity_umol_kg", "ph_total"], &options)?;
//! let mut out = Outcome::default();
//! batch.solve(&[Cell::Number(25.0), Cell::Number(35.0), Cell::Number(2300.0), Cell::Number(8.05)], &mut out);
//! assert_eq!(out.status(), "ok");
//! let Value::Number(Some(ph)) = out.values(&batch).next().unwrap() else { panic!() };
//! assert!((ph - 8.05).abs() < 1e-12);
//! // The same, read from the row's state.
//! assert_eq!(batch.computed()[0].value(out.state().unwrap()), Value::Number(Some(ph)));
//! // A bad row: its status, message, code and field; the batch goes on.
//! batch.solve(&[Cell::Number(25.0), Cell::Number(35.0), Cell::Number(2300.0), Cell::Number(15.0)], &mut out);
//! assert_eq!(out.status(), "error");
//! assert_eq!(out.error(), Some(("out_of_range", Some("ph"))));
//! assert!(out.state().is_none());
//! assert_eq!(out.values(&batch).count(), 0);
//! # Ok::<(), travertine::sheet::SheetError>(())
//! ```

use super::cell::Cell;
use super::plan::Plan;
use super::row::{evaluate_values, Scratch, Status};
use super::{SheetError, SheetOptions};
use crate::decisions::uncertainty::Uncertainties;
use crate::output::{Output, Value};
use crate::state::State;
use std::sync::Arc;

/// The plan of a batch: its columns read and checked once, as the header of
/// a sheet is, with the options of a sheet ([`SheetOptions::with_columns`],
/// [`SheetOptions::with_set`], [`SheetOptions::with_pair`], ...).
#[derive(Debug)]
pub struct Batch {
    plan: Plan,
}

impl Batch {
    /// The batch of these columns.
    ///
    /// # Errors
    /// What a sheet with this header would stop on
    /// ([`SheetError::HeaderUnit`], [`SheetError::NoPair`],
    /// [`SheetError::Missing`], ...), and [`SheetError::BadOption`] for a
    /// name that is not an input (a sheet would pass such a column
    /// through unread; a batch has no use for it).
    ///
    /// ```
    /// use travertine::sheet::{Batch, SheetOptions};
    /// let o = SheetOptions::default();
    /// assert!(Batch::new(&["temperature_c", "ph_nbs", "alkalinity_mg_l_caco3"], &o).is_ok());
    /// assert!(Batch::new(&["temperature_c", "ph_nbs", "colour"], &o).is_err());
    /// ```
    pub fn new(names: &[&str], options: &SheetOptions) -> Result<Batch, SheetError> {
        let header = csv::ByteRecord::from(names.to_vec());
        let plan = Plan::new(&header, options)?;
        if let Some(name) = plan.passed.first() {
            return Err(SheetError::BadOption {
                option: "name",
                message: format!(
                    "`{name}` is not an input; give inputs by their names with the unit in the \
                     name, such as alkalinity_umol_kg, alkalinity_mg_l_caco3, ph_total, ph_nbs, \
                     dic_umol_kg, temperature_c, salinity, specific_conductance_us_cm, \
                     calcium_mg_l (`travertine sheet --list-columns` lists them)"
                ),
            });
        }
        let mut plan = plan;
        plan.keys = false;
        plan.keep_state = true;
        Ok(Batch { plan })
    }

    /// With the standard uncertainty of every numeric computed column,
    /// propagated from `u` for each row
    /// ([`crate::decisions::uncertainty::propagate`]; about two solves per
    /// source and row).
    #[must_use]
    pub fn with_uncertainties(mut self, u: Uncertainties) -> Self {
        // Every computed column, so that the uncertainties line up with
        // [`Batch::computed`] (a name gets none).
        self.plan.uncertainty = Some(super::plan::UncertaintyPlan {
            settings: Vec::new(),
            columns: Vec::new(),
            base: u,
            outputs: (0..self.plan.computed.len()).collect(),
        });
        self
    }

    /// With the standard uncertainty of every numeric computed column, as
    /// [`Batch::with_uncertainties`], the sources named as the binding
    /// names them: `(name, size, percent)`, the name an input's column name
    /// (any spelling a sheet header reads, such as `alkalinity_mg_l_caco3`)
    /// with an absolute size in that column's unit, as a sheet's
    /// `<column>_u` cell reads it; or an input's flag or a constant's name
    /// (`pk1` or `K1`, `pksp_calcite`, `boron_total`) with a size in its own unit as
    /// `--uncertainty NAME=VALUE` reads a plain number; or any of them with
    /// a size in % (`percent`). Each is resolved for each row (an amount
    /// per litre through that row's density), after `base`.
    ///
    /// # Errors
    /// [`SheetError::BadOption`] (option `uncertainty`) naming the source:
    /// a name that is neither, or a size its unit does not take.
    ///
    /// ```
    /// use travertine::decisions::uncertainty::Uncertainties;
    /// use travertine::sheet::{Batch, Cell, Outcome, SheetOptions};
    /// let names = ["temperature_c", "salinity", "alkalinity_mg_l_caco3", "ph_nbs"];
    /// let batch = Batch::new(&names, &SheetOptions::default())?
    ///     .with_named_uncertainties(&[("alkalinity_mg_l_caco3".into(), 2.0, false)],
    ///                               Uncertainties::new().without_constants())?;
    /// let k = batch.computed().iter().position(|o| o.key() == "alkalinity_mg_l_caco3").unwrap();
    /// let mut out = Outcome::default();
    /// batch.solve(&[Cell::Number(15.0), Cell::Number(0.2), Cell::Number(100.0), Cell::Number(7.9)], &mut out);
    /// // 2 mg/L as CaCO3 on an alkalinity given in mg/L as CaCO3.
    /// let u = out.uncertainties().nth(k).flatten().unwrap();
    /// assert!((u - 2.0).abs() < 1e-6, "{u}");
    /// // A name that is neither an input nor a constant.
    /// assert!(Batch::new(&names, &SheetOptions::default())?
    ///     .with_named_uncertainties(&[("alkalinty".into(), 2.0, true)], Uncertainties::new())
    ///     .is_err());
    /// # Ok::<(), travertine::sheet::SheetError>(())
    /// ```
    pub fn with_named_uncertainties(
        self,
        named: &[(String, f64, bool)],
        base: Uncertainties,
    ) -> Result<Self, SheetError> {
        use crate::decisions::uncertainty_settings::{Setting, Target};
        let mut settings = Vec::with_capacity(named.len());
        for (name, size, percent) in named {
            let text = if *percent {
                format!("{size}%")
            } else {
                format!("{size}")
            };
            let setting = match super::plan::uncertainty_column(0, &format!("{name}_u")) {
                Some(column) => Setting::of(
                    column.target,
                    &super::row::in_column_unit(&column, text),
                    name,
                ),
                // A constant also by the name of K (`K1` for `pk1`).
                None => match Target::from_name(name)
                    .or_else(|| Target::from_name(&format!("p{}", name.trim())))
                {
                    Some(target) => Setting::of(target, &text, name),
                    // The error of the setting, with its nearest name.
                    None => format!("{name}={text}").parse::<Setting>(),
                },
            }
            .map_err(|e| SheetError::BadOption {
                option: "uncertainty",
                message: e.to_string(),
            })?;
            settings.push(setting);
        }
        let mut batch = self.with_uncertainties(base);
        if let Some(u) = &mut batch.plan.uncertainty {
            u.settings = settings;
        }
        Ok(batch)
    }

    /// The computed columns, in order: [`Outcome::values`] (and
    /// [`Outcome::uncertainties`]) follow it; each one's value is
    /// [`Output::value`] of the row's state ([`Outcome::state`]).
    pub fn computed(&self) -> &[Output] {
        &self.plan.computed
    }

    /// The names of every added column, as a sheet writes them: the
    /// computed columns, the residuals, the dose columns, `flags` where
    /// asked for, `status` and `message`.
    pub fn columns(&self) -> &[String] {
        &self.plan.added
    }

    /// The names of the residual columns ([`Outcome::residuals`]).
    pub fn residual_columns(&self) -> &[String] {
        let start = self.plan.computed.len();
        &self.plan.added[start..start + self.plan.residuals.len()]
    }

    /// The names of the dose columns ([`Outcome::dose`]), where a dose is
    /// asked for.
    pub fn dose_columns(&self) -> &[String] {
        let start = self.plan.computed.len() + self.plan.residuals.len();
        let n = if self.plan.dose.is_some() {
            super::plan::DOSE_COLUMNS.len()
        } else {
            0
        };
        &self.plan.added[start..start + n]
    }

    /// Whether the outcome has a `flags` column.
    pub fn has_flags(&self) -> bool {
        self.plan.flags.is_some()
    }

    /// Notes on the columns that apply to every row (inputs not used, units
    /// read approximately as written).
    pub fn notes(&self) -> &[String] {
        &self.plan.unit_notes
    }

    /// Solves one row, `cells` in the order of the names, into `out`.
    pub fn solve(&self, cells: &[Cell<'_>], out: &mut Outcome) {
        evaluate_values(&self.plan, cells, &mut out.scratch);
        // Rows with the same things to say (the cautions every row of a
        // sheet without air data has) share the words: the message is
        // joined again only when they change.
        let issues = &out.scratch.issues;
        let same = issues.len() == out.parts.len()
            && issues
                .iter()
                .zip(&out.parts)
                .all(|(i, p)| Arc::ptr_eq(&i.text, p));
        if same {
            return;
        }
        out.parts.clear();
        let mut message = String::new();
        for (i, issue) in issues.iter().enumerate() {
            if i > 0 {
                message.push_str("; ");
            }
            message.push_str(&issue.text);
            out.parts.push(Arc::clone(&issue.text));
        }
        out.message = message.into();
    }
}

/// The outcome of a row, reused from row to row.
#[derive(Debug)]
pub struct Outcome {
    scratch: Scratch,
    message: Arc<str>,
    /// The texts `message` was joined from.
    parts: Vec<Arc<str>>,
}

impl Default for Outcome {
    fn default() -> Self {
        Outcome {
            scratch: Scratch::default(),
            message: "".into(),
            parts: Vec::new(),
        }
    }
}

impl Outcome {
    /// The row's state, where it was solved: every output of the row is
    /// [`Output::value`] of it.
    pub fn state(&self) -> Option<&State> {
        self.scratch.state()
    }

    /// The value of each computed column of `batch` ([`Batch::computed`])
    /// for this row, solved by `batch`; none where the row could not be
    /// solved.
    pub fn values<'a>(&'a self, batch: &'a Batch) -> impl Iterator<Item = Value> + 'a {
        self.state()
            .into_iter()
            .flat_map(|s| batch.computed().iter().map(move |o| o.value(s)))
    }

    /// The standard uncertainty of each computed column where the batch
    /// propagates them; empty otherwise, or where the row failed.
    pub fn uncertainties(&self) -> impl Iterator<Item = Option<f64>> + '_ {
        self.scratch.uncertain.iter().map(|u| u.map(|(u, _)| u))
    }

    /// Each residual (measured minus calculated), in the order of
    /// [`Batch::residual_columns`].
    pub fn residuals(&self) -> impl Iterator<Item = Option<f64>> + '_ {
        self.scratch.residuals.iter().map(|r| r.map(|(v, _)| v))
    }

    /// The dose columns, in the order of [`Batch::dose_columns`].
    pub fn dose(&self) -> impl Iterator<Item = Option<f64>> + '_ {
        self.scratch.dose.iter().map(|r| r.map(|(v, _)| v))
    }

    /// The codes of the quality flags raised.
    pub fn flags(&self) -> &[&'static str] {
        &self.scratch.flags
    }

    /// `ok`, `warning` or `error`.
    pub fn status(&self) -> &'static str {
        self.scratch.status.name()
    }

    /// Whether the row could not be solved.
    pub fn is_error(&self) -> bool {
        self.scratch.status == Status::Error
    }

    /// The row's message: its errors, warnings and notes, `; `-separated.
    pub fn message(&self) -> &str {
        &self.message
    }

    /// The row's message, shared: rows with the same things to say in a
    /// row of rows (the cautions of a batch without air data, say) hand
    /// back the same text, so a caller that keeps every row's message
    /// keeps one copy of it.
    ///
    /// ```
    /// use std::sync::Arc;
    /// use travertine::sheet::{Batch, Cell, Outcome, SheetOptions};
    /// // The exchange with the air, without air data: the same cautions every row.
    /// let options = SheetOptions::default().with_columns("ph_total,air_pco2_uatm")?;
    /// let batch = Batch::new(&["temperature_c", "salinity", "alkalinity_umol_kg", "ph_total"],
    ///                        &options)?;
    /// let mut out = Outcome::default();
    /// batch.solve(&[Cell::Number(25.0), Cell::Number(35.0), Cell::Number(2300.0), Cell::Number(8.05)], &mut out);
    /// let first = Arc::clone(out.shared_message());
    /// assert!(first.contains("CO2 of the air not given"));
    /// batch.solve(&[Cell::Number(12.0), Cell::Number(33.0), Cell::Number(2200.0), Cell::Number(7.9)], &mut out);
    /// assert!(Arc::ptr_eq(&first, out.shared_message()));
    /// # Ok::<(), travertine::sheet::SheetError>(())
    /// ```
    pub fn shared_message(&self) -> &Arc<str> {
        &self.message
    }

    /// The code and field of the row's first error (the codes of
    /// [`crate::error::ErrorKind::code`]; the field as errors name it, or
    /// the column for a value that cannot be read).
    pub fn error(&self) -> Option<(&'static str, Option<&str>)> {
        if !self.is_error() {
            return None;
        }
        let (code, field) = self.scratch.first_error.as_ref()?;
        Some((code, field.as_deref()))
    }
}

/// The input a name stands for, as a sheet header or a [`Batch`] column
/// (`ph_total`, `alkalinity_mg_l_caco3`, `temperature_c`), with whether a
/// number under that name is in the library's own unit of the input (pH
/// units, µmol/kg, µatm, ppm, °C, practical salinity, m/s, ...), the unit
/// of an absolute uncertainty
/// ([`crate::decisions::uncertainty::Size::Absolute`]).
///
/// ```
/// use travertine::sample::inputs::Input;
/// use travertine::sheet::input_named;
/// use travertine::Parameter;
/// assert_eq!(input_named("ph_total"), Some((Input::Carbon(Parameter::Ph), true)));
/// assert_eq!(input_named("alkalinity_mg_l_caco3"), Some((Input::Carbon(Parameter::Alkalinity), false)));
/// assert_eq!(input_named("colour"), None);
/// ```
pub fn input_named(name: &str) -> Option<(crate::sample::inputs::Input, bool)> {
    use super::header::Reading;
    use crate::base::units::Unit;
    let column = super::header::recognise_name(name).ok()?;
    let own = match column.reading {
        Reading::Ph(_) => true,
        Reading::Number { scale, offset, .. } => scale == 1.0 && offset == 0.0,
        Reading::Quantity(u) => matches!(u, Unit::UmolPerKg | Unit::Uatm | Unit::Ppm),
        _ => false,
    };
    Some((column.field, own))
}
