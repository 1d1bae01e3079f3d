//! The validated plan of a sheet: every header read, every `--map` and
//! `--set` applied, the pair rule, the residual and computed columns. It
//! is built once from the header row, before any data row is read.

use super::cell;
use super::columns::UnitSystem;
use super::header::{self, Column, Reading, Recognition};
use super::pair::{choose_pair, rank, RANKING};
use super::{SheetError, SheetOptions};
use crate::base::error::PH_SCALE_ADVICE;
use crate::decisions::uncertainty_settings::Target;
use crate::output::{Output, Precision, Section};
use crate::properties::scales::PhScale;
use crate::sample::inputs::Input;
use crate::sample::measured::Parameter;
use crate::sample::values::MediumChoice;
use crate::sample::Sample;
use crate::solve::SolveOptions;

/// How a sheet states the scale of a pH.
pub(crate) const STATE_THE_SCALE: &str = "in a sheet, name the scale in the pH header (for \
     example `pH (NBS)` or `ph_total`), or give it for every row with --ph-scale NAME or --set \
     ph_scale=NAME";

/// The inputs of the exchange with the air alone (the barometric pressure
/// and the elevation belong to the water: they convert xCO2 too).
const EXCHANGE_INPUTS: [Input; 5] = [
    Input::Wind,
    Input::AirCo2,
    Input::LakeArea,
    Input::K600,
    Input::GasTransfer,
];

/// The exchange columns added to the default set when an input of the
/// exchange is given.
const EXCHANGE_DEFAULTS: [Output; 3] = [Output::Co2SaturationRatio, Output::K600, Output::Co2Flux];

/// A recognised column of the sheet.
#[derive(Debug, Clone)]
pub(crate) struct ReadColumn {
    /// Its position in the row.
    pub index: usize,
    /// Its header as written (for messages).
    pub header: String,
    pub column: Column,
}

/// Where a field's value comes from.
#[derive(Debug, Clone)]
pub(crate) enum Label {
    /// A column: the index in [`Plan::read`].
    Column(usize),
    /// A `--set` value, as written.
    Set(String),
}

/// A residual column.
#[derive(Debug, Clone)]
pub(crate) struct Residual {
    pub parameter: Parameter,
}

/// The columns of a dose, after the residuals: the product per m³ (mg/L)
/// and, where the row has its volume, in total.
pub(crate) const DOSE_COLUMNS: [&str; 3] = ["dose_g_m3", "dose_total_kg", "dose_total_lb"];

/// The plan of a sheet.
#[derive(Debug)]
pub(crate) struct Plan {
    /// Number of fields of the header.
    pub width: usize,
    /// The header fields as read.
    pub headers: Vec<Vec<u8>>,
    /// The recognised columns, in the order of the row.
    pub read: Vec<ReadColumn>,
    /// Where each field comes from.
    pub labels: Vec<(Input, Label)>,
    /// The values given by `--set`.
    pub template: Sample,
    pub forced_pair: Option<(Parameter, Parameter)>,
    pub residuals: Vec<Residual>,
    pub computed: Vec<Output>,
    /// The profile of the `flags` column, where it is written (after the
    /// residuals, before `status`).
    pub flags: Option<crate::decisions::Profile>,
    /// Names of the added columns: computed, residuals, the dose, `flags`,
    /// `status`, `message`.
    pub added: Vec<String>,
    pub units: UnitSystem,
    pub options: SolveOptions,
    pub decimal_comma: bool,
    /// How many digits the CSV output writes.
    pub digits: Precision,
    /// The °C temperature column, checked for readings that look like °F.
    pub warm_check: Option<usize>,
    /// Headers passed through without being read.
    pub passed: Vec<String>,
    /// Notes on header units read only approximately as written.
    pub unit_notes: Vec<String>,
    // issue 11: air–water CO2 exchange
    /// Whether each row's exchange with the air is computed (a second
    /// solve): when a column of it is asked for.
    pub exchange: bool,
    // issue 12: a dose for every row
    /// The dose of every row, where one is asked for: its columns follow
    /// the residuals.
    pub dose: Option<crate::decisions::dose::DoseRequest>,
    // issue 13: uncertainties
    /// The uncertainties of every row, where asked for: their columns
    /// follow the dose's.
    pub uncertainty: Option<UncertaintyPlan>,
    // issue 15: rows given as values
    /// Whether each issue keeps its key, for the sheet's summary (a batch
    /// has none, and saves the copy).
    pub keys: bool,
    /// Whether each solved row keeps its state for the caller
    /// ([`super::row::Scratch::state`]) instead of writing the computed
    /// values out of it: a batch reads the outputs it hands back straight
    /// from the state.
    pub keep_state: bool,
}

/// An input column of standard uncertainties, `<column>_u`.
#[derive(Debug, Clone)]
pub(crate) struct UncertaintyColumn {
    /// Its position in the row.
    pub index: usize,
    /// Its header as written.
    pub header: String,
    /// What it gives the uncertainty of.
    pub target: Target,
    /// How its value column is read (its unit).
    pub reading: Reading,
}

/// The uncertainties of a sheet (issue 13).
#[derive(Debug, Clone)]
pub(crate) struct UncertaintyPlan {
    /// `--uncertainty` for every row.
    pub settings: Vec<crate::decisions::uncertainty_settings::Setting>,
    /// The `<column>_u` input columns.
    pub columns: Vec<UncertaintyColumn>,
    /// The uncertainties every row starts from, before the settings and
    /// the row's cells: none but the constants' defaults (or not even
    /// those, with `--no-constant-uncertainty`) in a sheet; what the
    /// caller gave in a [`super::Batch`].
    pub base: crate::decisions::uncertainty::Uncertainties,
    /// The computed columns (indexes into [`Plan::computed`]) that get a
    /// `_u` column, in order.
    pub outputs: Vec<usize>,
}

impl Plan {
    /// Where `field` comes from.
    pub(crate) fn label(&self, field: Input) -> Option<&Label> {
        self.labels
            .iter()
            .find(|(f, _)| *f == field)
            .map(|(_, l)| l)
    }

    /// Builds the plan from the header row.
    pub(crate) fn new(
        header: &csv::ByteRecord,
        options: &SheetOptions,
    ) -> Result<Plan, SheetError> {
        let headers: Vec<Vec<u8>> = header.iter().map(|f| f.to_vec()).collect();
        let texts: Vec<String> = headers
            .iter()
            .map(|h| String::from_utf8_lossy(h).trim().to_string())
            .collect();

        // --map NAME=HEADER: find each header.
        let mut mapped: Vec<Option<Option<Column>>> = vec![None; texts.len()];
        for (name, target) in &options.maps {
            let wanted = target.trim();
            let Some(i) = texts.iter().position(|t| t.eq_ignore_ascii_case(wanted)) else {
                return Err(SheetError::BadOption {
                    option: "--map",
                    message: format!(
                        "{name}={target}: the sheet has no column `{wanted}`; its columns are {}",
                        quoted_list(&texts)
                    ),
                });
            };
            let column = if name.eq_ignore_ascii_case("ignore") {
                None
            } else {
                Some(map_name(name, target)?)
            };
            mapped[i] = Some(column);
        }

        let mut read = Vec::new();
        let mut labels: Vec<(Input, Label)> = Vec::new();
        let mut passed = Vec::new();
        let mut unit_notes = Vec::new();
        let mut u_columns: Vec<UncertaintyColumn> = Vec::new();
        for (i, text) in texts.iter().enumerate() {
            // issue 13: `<column>_u`, the standard uncertainty of an input
            // column, in that column's unit.
            if mapped[i].is_none() {
                if let Some(u) = uncertainty_column(i, text) {
                    u_columns.push(u);
                    continue;
                }
            }
            let column = match mapped[i] {
                Some(Some(c)) => c,
                Some(None) => {
                    passed.push(text.clone());
                    continue;
                }
                None => match header::recognise(text) {
                    Recognition::Column(c) => c,
                    Recognition::PassThrough => {
                        passed.push(text.clone());
                        continue;
                    }
                    Recognition::Issue(issue) => {
                        return Err(SheetError::HeaderUnit {
                            header: text.clone(),
                            problem: issue.problem,
                            accepted: issue.field.accepted(),
                            canonical: issue.field.column(),
                        })
                    }
                },
            };
            if let Some((_, Label::Column(j))) = labels.iter().find(|(f, _)| *f == column.field) {
                let first: &ReadColumn = &read[*j];
                return Err(SheetError::DuplicateColumn {
                    field: column.field.name(),
                    first: first.header.clone(),
                    second: text.clone(),
                });
            }
            if let Some(note) = column.note {
                unit_notes.push(format!("column `{text}`: {note}"));
            }
            labels.push((column.field, Label::Column(read.len())));
            read.push(ReadColumn {
                index: i,
                header: text.clone(),
                column,
            });
        }

        // --set name=value: a value for every row.
        let mut template = Sample::default();
        for (name, value) in &options.sets {
            let spec = format!("{name}={value}");
            let column = set_name(name, &spec)?;
            if let Some(label) = labels
                .iter()
                .find(|(f, _)| *f == column.field)
                .map(|(_, l)| l)
            {
                let source = match label {
                    Label::Column(j) => format!("column `{}`", read[*j].header),
                    Label::Set(s) => format!("--set {s}"),
                };
                return Err(SheetError::Conflict(format!(
                    "--set {spec}: {} is already given by {source}; keep one of them",
                    column.field.name()
                )));
            }
            match cell::parse(&column, value.as_bytes(), options.decimal_comma) {
                Ok(Some(v)) => template.put(column.field, v),
                Ok(None) => {
                    return Err(SheetError::BadOption {
                        option: "--set",
                        message: format!("{spec}: the value is empty"),
                    })
                }
                Err(problem) => {
                    let message = problem.message(name, value.trim());
                    return Err(SheetError::BadOption {
                        option: "--set",
                        message: message.replacen("column ", "", 1),
                    });
                }
            }
            labels.push((column.field, Label::Set(spec)));
        }

        // A pH column that names its scale leaves no room for a ph_scale.
        if let (Some(scale_label), Some(Label::Column(j))) = (
            labels
                .iter()
                .find(|(f, _)| *f == Input::PhScale)
                .map(|(_, l)| l),
            labels
                .iter()
                .find(|(f, _)| *f == Input::Carbon(Parameter::Ph))
                .map(|(_, l)| l),
        ) {
            if let Reading::Ph(Some(s)) = read[*j].column.reading {
                let source = match scale_label {
                    Label::Column(k) => format!("column `{}`", read[*k].header),
                    Label::Set(spec) => format!("--set {spec}"),
                };
                return Err(SheetError::Conflict(format!(
                    "column `{}` gives pH on the {} scale, so {source} cannot apply; remove one \
                     of them",
                    read[*j].header,
                    s.name()
                )));
            }
        }

        // Saline water in every row (--water saline) and a pH column that
        // names no scale, with none given: every row with a pH would be
        // refused, so the sheet stops before solving.
        let medium_column = labels
            .iter()
            .any(|(f, l)| *f == Input::Medium && matches!(l, Label::Column(_)));
        let scale_given = labels.iter().any(|(f, _)| *f == Input::PhScale);
        if template.medium == MediumChoice::Saline && !medium_column && !scale_given {
            if let Some(Label::Column(j)) = labels
                .iter()
                .find(|(f, _)| *f == Input::Carbon(Parameter::Ph))
                .map(|(_, l)| l)
            {
                if read[*j].column.reading == Reading::Ph(None) {
                    return Err(SheetError::Missing(format!(
                        "column `{}` in saline water: {PH_SCALE_ADVICE}; {STATE_THE_SCALE}",
                        read[*j].header
                    )));
                }
            }
        }

        let present = present(&labels);
        let forced_pair = options.pair;
        let pair = match forced_pair {
            Some((a, b)) => {
                for p in [a, b] {
                    if !present[rank(p)] {
                        return Err(SheetError::NoPair(format!(
                            "--pair {},{}: the sheet has no column for {} (and no --set value); \
                             {}",
                            a.name(),
                            b.name(),
                            p.name(),
                            found(&labels, &read)
                        )));
                    }
                }
                (a, b)
            }
            None => {
                choose_pair(&present).ok_or_else(|| no_pair(&labels, &read, &passed, &texts))?
            }
        };

        if !labels.iter().any(|(f, _)| *f == Input::Temperature) {
            return Err(SheetError::Missing(
                "no temperature: add a column such as `temperature_c` or `Temp (°C)`, or give \
                 one value for every row with --set temperature_c=VALUE"
                    .to_string(),
            ));
        }

        let residuals: Vec<Residual> = RANKING
            .iter()
            .filter(|p| present[rank(**p)] && **p != pair.0 && **p != pair.1)
            .map(|p| Residual { parameter: *p })
            .collect();

        let (mut computed, flags) = match &options.columns {
            Some(spec) => parse_columns(spec, options.units)?,
            None => (Output::defaults(options.units).to_vec(), true),
        };
        // The exchange with the air: computed when a column of it is asked
        // for. Its inputs given (a wind column, --set air_co2_ppm=...) add
        // its key columns to the default set; with columns chosen by hand
        // that have none of them, the inputs are not used, and a note says
        // so.
        let exchange_inputs: Vec<String> = labels
            .iter()
            .filter(|(f, _)| EXCHANGE_INPUTS.contains(f))
            .map(|(_, l)| match l {
                Label::Column(j) => format!("column `{}`", read[*j].header),
                Label::Set(spec) => format!("--set {spec}"),
            })
            .collect();
        let wants_exchange = |c: &[Output]| c.iter().any(|o| o.section() == Section::Exchange);
        if !exchange_inputs.is_empty() && !wants_exchange(&computed) {
            if options.columns.is_none() {
                computed.extend(EXCHANGE_DEFAULTS);
            } else {
                unit_notes.push(format!(
                    "{} not used: no column of the exchange with the air is asked for (add, for \
                     example, {} to --columns)",
                    exchange_inputs.join(", "),
                    EXCHANGE_DEFAULTS.map(Output::key).join(",")
                ));
            }
        }
        let exchange = wants_exchange(&computed);

        // Added names, never equal to an input header.
        let taken = |name: &str, added: &[String]| {
            texts.iter().any(|t| t.eq_ignore_ascii_case(name))
                || added.iter().any(|a| a.eq_ignore_ascii_case(name))
        };
        let mut added: Vec<String> = Vec::new();
        let push = |base: String, added: &mut Vec<String>| {
            let mut name = base.clone();
            if taken(&name, added) {
                name = format!("{base}_calculated");
            }
            let mut n = 2;
            while taken(&name, added) {
                name = format!("{base}_calculated_{n}");
                n += 1;
            }
            added.push(name);
        };
        for c in &computed {
            push(c.name().to_string(), &mut added);
        }
        for r in &residuals {
            let base = residual_name(r.parameter, &labels, &read, options.units);
            push(base, &mut added);
        }
        if options.dose.is_some() {
            for name in DOSE_COLUMNS {
                push(name.to_string(), &mut added);
            }
        } else {
            // The volume serves a dose only.
            let unused: Vec<String> = labels
                .iter()
                .filter(|(f, _)| f.is_for_dose())
                .map(|(_, l)| match l {
                    Label::Column(j) => format!("column `{}`", read[*j].header),
                    Label::Set(spec) => format!("--set {spec}"),
                })
                .collect();
            if !unused.is_empty() {
                unit_notes.push(format!(
                    "{} not used: the volume serves a dose only (--dose-chemical and --target)",
                    unused.join(", ")
                ));
            }
        }
        // issue 13: the `_u` input columns whose value is given somewhere,
        // the others reported unused; the `_u` output columns.
        let mut kept = Vec::new();
        for u in u_columns {
            let given = match u.target {
                Target::Input(field) => labels.iter().any(|(f, _)| *f == field),
                Target::Constant(_) => true,
            };
            if given {
                kept.push(u);
            } else {
                unit_notes.push(format!(
                    "column `{}` not used: the sheet has no column (and no --set value) of \
                     {} for it to be the uncertainty of",
                    u.header,
                    u.target.name()
                ));
            }
        }
        let asked =
            !kept.is_empty() || !options.uncertainty.is_empty() || options.no_constant_uncertainty;
        let uncertainty = asked.then(|| {
            let outputs: Vec<usize> = computed
                .iter()
                .enumerate()
                .filter(|(_, o)| o.digits().is_some())
                .map(|(i, _)| i)
                .collect();
            UncertaintyPlan {
                settings: options.uncertainty.clone(),
                columns: kept,
                base: if options.no_constant_uncertainty {
                    crate::decisions::uncertainty::Uncertainties::new().without_constants()
                } else {
                    crate::decisions::uncertainty::Uncertainties::new()
                },
                outputs,
            }
        });
        if let Some(up) = &uncertainty {
            // Each named after its value column as written (`added` opens
            // with the computed columns, in order).
            for &i in &up.outputs {
                let base = format!("{}_u", added[i]);
                push(base, &mut added);
            }
            unit_notes.push(if !options.no_constant_uncertainty {
                "uncertainties: the constants take their default uncertainties (sea water: Orr \
                 et al. 2018, values from memory; fresh water: the crate's stated values, from \
                 memory); `travertine solve --uncertainty ...` lists each; \
                 --no-constant-uncertainty leaves them out"
                    .to_string()
            } else {
                "uncertainties: the constants without uncertainty (--no-constant-uncertainty)"
                    .to_string()
            });
        }
        if flags {
            push("flags".into(), &mut added);
        }
        push("status".into(), &mut added);
        push("message".into(), &mut added);

        let warm_check = labels.iter().find_map(|(f, l)| match (f, l) {
            (Input::Temperature, Label::Column(j)) => match read[*j].column.reading {
                Reading::Number { label: "°C", .. } => Some(*j),
                _ => None,
            },
            _ => None,
        });

        let wants_potential = computed.contains(&Output::PrecipitationPotential);
        Ok(Plan {
            width: headers.len(),
            headers,
            read,
            labels,
            template,
            forced_pair,
            residuals,
            computed,
            flags: flags.then(|| options.profile.clone()),
            dose: options.dose,
            added,
            units: options.units,
            // The precipitation potential costs about twenty solves: only
            // when its column is asked for.
            options: SolveOptions::default()
                .with_root(options.root)
                .with_precipitation_potential(wants_potential),
            decimal_comma: options.decimal_comma,
            digits: options.digits,
            warm_check,
            passed,
            unit_notes,
            exchange,
            uncertainty,
            keys: true,
            keep_state: false,
        })
    }
}

/// The column `text` at `index` as a column of standard uncertainties:
/// any header recognised as an input whose uncertainty can be propagated,
/// followed by `_u` (`ph_nbs_u`, `Alkalinity (mg/L as CaCO3)_u`).
pub(super) fn uncertainty_column(index: usize, text: &str) -> Option<UncertaintyColumn> {
    let t = text.trim();
    let base = t.strip_suffix("_u").or_else(|| t.strip_suffix("_U"))?;
    let Recognition::Column(c) = header::recognise(base) else {
        return None;
    };
    let target = Target::from_name(c.field.flag())?;
    Some(UncertaintyColumn {
        index,
        header: t.to_string(),
        target,
        reading: c.reading,
    })
}

fn quoted_list(items: &[String]) -> String {
    items
        .iter()
        .map(|t| format!("`{t}`"))
        .collect::<Vec<_>>()
        .join(", ")
}

/// The column a `--map` name stands for.
fn map_name(name: &str, target: &str) -> Result<Column, SheetError> {
    header::recognise_name(name).map_err(|issue| SheetError::BadOption {
        option: "--map",
        message: match issue {
            Some(i) => format!(
                "{name}={target}: {}; accepted: {}; for example --map {}=\"{target}\"",
                i.problem,
                i.field.accepted(),
                i.field.column()
            ),
            None => format!(
                "{name}={target}: `{name}` is not a column name travertine reads; use a name \
                 with its unit such as alkalinity_mg_l_caco3, ph_nbs, temperature_c, \
                 specific_conductance_us_cm (or `ignore` to pass the column through)"
            ),
        },
    })
}

/// The column a `--set` name stands for.
fn set_name(name: &str, spec: &str) -> Result<Column, SheetError> {
    header::recognise_name(name).map_err(|issue| SheetError::BadOption {
        option: "--set",
        message: match issue {
            Some(i) => format!(
                "{spec}: {}; accepted: {}; for example --set {}=VALUE",
                i.problem,
                i.field.accepted(),
                i.field.column()
            ),
            None => format!(
                "{spec}: `{name}` is not a name travertine reads; use a name with its unit such \
                 as temperature_c, salinity, pressure_dbar, calcium_mg_l, water, ph_scale"
            ),
        },
    })
}

/// Which carbonate parameters have a column or a `--set` value.
fn present(labels: &[(Input, Label)]) -> [bool; 9] {
    let mut present = [false; 9];
    for (f, _) in labels {
        if let Input::Carbon(p) = f {
            present[rank(*p)] = true;
        }
    }
    present
}

/// The carbonate parameters found, in words.
fn found(labels: &[(Input, Label)], read: &[ReadColumn]) -> String {
    let given: Vec<String> = RANKING
        .iter()
        .filter_map(|p| {
            labels
                .iter()
                .find(|(f, _)| *f == Input::Carbon(*p))
                .map(|(_, l)| match l {
                    Label::Column(j) => format!("{} (column `{}`)", p.name(), read[*j].header),
                    Label::Set(s) => format!("{} (--set {s})", p.name()),
                })
        })
        .collect();
    match given.len() {
        0 => "the sheet gives no carbonate parameter".to_string(),
        _ => format!("the sheet gives {}", given.join(", ")),
    }
}

fn no_pair(
    labels: &[(Input, Label)],
    read: &[ReadColumn],
    passed: &[String],
    texts: &[String],
) -> SheetError {
    let present = present(labels);
    let gases_only = present.iter().filter(|p| **p).count() >= 2;
    let mut message = format!(
        "no pair of carbonate parameters can be formed: {}{}. A pair is two of alkalinity, dic, \
         ph, pco2, fco2, xco2, co2, hco3, co3 (at most one of pco2, fco2, xco2, co2), each from \
         a column with its unit in the header (such as `alkalinity_mg_l_caco3`, `ph_nbs`, \
         `Alkalinity (mg/L as CaCO3)`) or from --set",
        found(labels, read),
        if gases_only {
            ", which carry the same information"
        } else {
            ""
        }
    );
    if !passed.is_empty() {
        message.push_str(&format!(
            ". Columns passed through unread: {} (--map NAME=HEADER reads one)",
            quoted_list(passed)
        ));
    }
    if texts.len() == 1 {
        for (c, name) in [(';', "';'"), ('\t', "tab"), ('|', "'|'")] {
            if texts[0].contains(c) {
                message.push_str(&format!(
                    ". The header is a single column containing {name}: if that separates the \
                     columns, give --delimiter {name}"
                ));
                break;
            }
        }
    }
    SheetError::NoPair(message)
}

/// The name of the residual column of a parameter: its computed column
/// name in the unit system, then `_residual`.
fn residual_name(
    p: Parameter,
    labels: &[(Input, Label)],
    read: &[ReadColumn],
    units: UnitSystem,
) -> String {
    let scale: Option<PhScale> = if p == Parameter::Ph {
        labels.iter().find_map(|(f, l)| match (f, l) {
            (Input::Carbon(Parameter::Ph), Label::Column(j)) => match read[*j].column.reading {
                Reading::Ph(s) => s,
                _ => None,
            },
            _ => None,
        })
    } else {
        None
    };
    if p == Parameter::Ph && scale.is_none() {
        return "ph_residual".to_string();
    }
    format!("{}_residual", Output::of_parameter(p, units, scale).name())
}

/// Parses `--pair a,b`.
pub(crate) fn parse_pair(spec: &str) -> Result<(Parameter, Parameter), SheetError> {
    let bad = |message: String| SheetError::BadOption {
        option: "--pair",
        message,
    };
    let names: Vec<&str> = spec.split(',').map(str::trim).collect();
    if names.len() != 2 {
        return Err(bad(format!(
            "`{spec}` is not two parameters; write for example --pair alkalinity,ph"
        )));
    }
    let mut pair = [Parameter::Alkalinity; 2];
    for (slot, name) in pair.iter_mut().zip(&names) {
        *slot = Parameter::ALL
            .iter()
            .copied()
            .find(|p| p.name().eq_ignore_ascii_case(name))
            .ok_or_else(|| {
                bad(format!(
                    "`{name}` is not a carbonate parameter; accepted: alkalinity, dic, ph, pco2, \
                     fco2, xco2, co2, hco3, co3"
                ))
            })?;
    }
    if !pair[0].pairs_with(pair[1]) {
        return Err(bad(if pair[0] == pair[1] {
            format!("`{spec}` names {} twice", pair[0].name())
        } else {
            format!(
                "{} and {} carry the same information (the dissolved CO2); a pair may hold at \
                 most one of pco2, fco2, xco2, co2",
                pair[0].name(),
                pair[1].name()
            )
        }));
    }
    Ok((pair[0], pair[1]))
}

/// Parses `--columns`: names of computed columns, `default` for the
/// default set of the unit system, `all` for every one; with whether the
/// `flags` column is asked for (by `flags`, `default` or `all`).
pub(crate) fn parse_columns(
    spec: &str,
    units: UnitSystem,
) -> Result<(Vec<Output>, bool), SheetError> {
    let mut out: Vec<Output> = Vec::new();
    let mut flags = false;
    let add = |c: Output, out: &mut Vec<Output>| {
        if !out.contains(&c) {
            out.push(c);
        }
    };
    for name in spec.split(',').map(str::trim).filter(|n| !n.is_empty()) {
        match name.to_ascii_lowercase().as_str() {
            "default" => {
                flags = true;
                Output::defaults(units)
                    .iter()
                    .for_each(|c| add(*c, &mut out))
            }
            "all" => {
                flags = true;
                Output::ALL.iter().for_each(|c| add(*c, &mut out))
            }
            "flags" => flags = true,
            lower => add(
                Output::from_name(lower).ok_or_else(|| SheetError::BadOption {
                    option: "--columns",
                    message: format!(
                        "`{name}` is not a computed column; accepted: default, all, flags, {}",
                        Output::all_names()
                    ),
                })?,
                &mut out,
            ),
        }
    }
    Ok((out, flags))
}
