//! The uncertainty of a result as it is shown (issue 13): `<key>_u` (and
//! `<key>_u_mc`) beside every numeric key of the JSON, a `budget` object, an
//! `uncertainty` object stating every source and its size, and the ± column
//! of the table. Everything is generated from the one list of outputs
//! ([`Output`]) through [`super::uncertainty`].

use super::digits::{Digits, Precision};
use super::fields::Output;
use super::uncertainty::{outputs_monte_carlo, outputs_propagated};
use crate::base::error::Result;
use crate::decisions::uncertainty::{
    MonteCarlo, Problem, Propagation, Size, Source, Uncertainties, FRESH_DEFAULTS, SALINE_DEFAULTS,
};
use crate::decisions::uncertainty_settings::constant_name;
use crate::medium::ConstantName;
use crate::sample::inputs::Input;
use crate::sample::measured::Parameter;
use crate::sample::water::Medium;
use serde_json::{json, Map, Value};
use std::fmt::Write;

/// The digits of the standard uncertainty of an output: the decimals of
/// its value where the output is written to fixed decimals (pH, mg/L),
/// else two significant figures.
///
/// ```
/// use travertine::output::{uncertainty_report::u_digits, Digits, Output};
/// assert_eq!(u_digits(Output::PhNbs), Digits::Decimals(3));
/// assert_eq!(u_digits(Output::Pco2), Digits::Significant(2));
/// ```
pub fn u_digits(o: Output) -> Digits {
    match o.digits() {
        Some(Digits::Decimals(d)) => Digits::Decimals(d),
        _ => Digits::Significant(2),
    }
}

/// The method of [`Report`], as its JSON states it.
const METHOD: &str = "linear (first-order) propagation, each derivative a forward difference of \
                      two solves (the source moved alone by a small step; a backward or central \
                      difference where the step up cannot be solved); sources independent";

/// The most draws `--monte-carlo` takes: a check, not a method; 10⁶ full
/// solves take minutes.
pub const MOST_DRAWS: usize = 1_000_000;

/// The seed of the Monte Carlo check when none is given.
pub const DEFAULT_SEED: u64 = 1;

/// The uncertainty of every numeric output of one problem: linear
/// propagation, its budget, and optionally the Monte Carlo check.
///
/// ```
/// use travertine::decisions::uncertainty::{Problem, Size, Uncertainties};
/// use travertine::output::uncertainty_report::Report;
/// use travertine::output::Output;
/// use travertine::sample::inputs::Input;
/// use travertine::{Conditions, Measured, Parameter, Water};
/// let pond = Water::fresh(Conditions::new(15.0, 0.2)?)?;
/// let p = Problem::new(&pond, Measured::ph(7.5, None)?, Measured::alkalinity_umol_kg(1200.0)?)?;
/// let u = Uncertainties::new().with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.02))?;
/// let r = Report::new(&p, &u, None)?;
/// assert!(r.u(Output::Pco2).unwrap() > 0.0);
/// let mut object = serde_json::Map::new();
/// object.insert("pco2_uatm".into(), 1.0.into());
/// r.add_to_json(&mut object, true);
/// assert!(object["pco2_uatm_u"].is_number());
/// assert!(object["budget"]["pco2_uatm"]["ph"].is_number());
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone)]
pub struct Report {
    outputs: Vec<Output>,
    linear: Propagation,
    monte_carlo: Option<(MonteCarlo, usize, u64)>,
    sources: Vec<Described>,
    /// How the state reported was moved from the measurement's
    /// conditions, where it was.
    moved: Option<String>,
}

/// One source as the result states it.
#[derive(Debug, Clone)]
struct Described {
    source: Source,
    size: String,
    origin: &'static str,
}

/// Where a constant's default comes from.
fn default_origin(medium: Medium) -> &'static str {
    match medium {
        Medium::Saline => {
            "default: Orr et al. 2018 (Marine Chemistry 207:84-107); values from memory (unverified)"
        }
        Medium::Fresh => "default: the crate's stated value, from memory (unverified)",
    }
}

/// The unit of an absolute size of an input (see [`Size::Absolute`]).
fn input_unit(input: Input, per_litre: bool) -> &'static str {
    match input {
        Input::Carbon(Parameter::Ph) => "pH units",
        Input::Carbon(Parameter::Pco2) | Input::Carbon(Parameter::Fco2) => "µatm",
        Input::Carbon(Parameter::Xco2) => "ppm",
        Input::Carbon(_) if per_litre => "µmol/L",
        Input::Carbon(_) | Input::Total(_) => "µmol/kg",
        Input::Temperature => "°C",
        Input::Wind => "m/s",
        Input::Conductivity => "µS/cm",
        Input::IonicStrength => "mol/kg",
        _ => "",
    }
}

/// A size as stated: to 4 significant figures (a value converted from
/// another unit has more digits than were typed), with its unit.
fn size_text(size: Size, unit: &str) -> String {
    let four = |x: f64| {
        format!("{x:.3e}")
            .parse::<f64>()
            .map_or_else(|_| x.to_string(), |r| r.to_string())
    };
    match size {
        Size::Percent(p) => format!("{} %", four(p)),
        Size::Absolute(x) if unit.is_empty() => four(x),
        Size::Absolute(x) => format!("{} {unit}", four(x)),
    }
}

/// A source as the result states it: its size as given (or its default)
/// in its unit, and where it comes from.
fn describe(source: Source, u: &Uncertainties, medium: Medium, per_litre: &[Input]) -> Described {
    let defaults: &[(ConstantName, Size)] = match medium {
        Medium::Saline => &SALINE_DEFAULTS,
        Medium::Fresh => &FRESH_DEFAULTS,
    };
    match source {
        Source::Input(i) => Described {
            source,
            size: u
                .inputs()
                .iter()
                .find(|(j, _)| *j == i)
                .map(|(_, s)| size_text(*s, input_unit(i, per_litre.contains(&i))))
                .unwrap_or_default(),
            origin: "given",
        },
        Source::Constant(c) => {
            let size = u
                .constants_in(medium)
                .into_iter()
                .find(|(d, _)| *d == c)
                .map(|(_, s)| s);
            let unit = if c == ConstantName::BoronTotal {
                "µmol/kg"
            } else {
                "pK units"
            };
            Described {
                source,
                size: size.map(|s| size_text(s, unit)).unwrap_or_default(),
                origin: if size.is_some_and(|s| defaults.contains(&(c, s))) {
                    default_origin(medium)
                } else {
                    "given"
                },
            }
        }
    }
}

/// Every source of a propagation stated as the JSON's `uncertainty`
/// object states it (`name`, `standard_uncertainty`, `origin`), each with
/// `extra`'s fields added (for a dose, its share of the variance).
fn stated_json(d: &Described, extra: Map<String, Value>) -> Value {
    let mut o = Map::new();
    o.insert("name".into(), json!(Report::source_name(d.source)));
    o.insert("standard_uncertainty".into(), json!(d.size));
    o.insert("origin".into(), json!(d.origin));
    o.extend(extra);
    Value::Object(o)
}

/// The `uncertainty` object of a dose's JSON (`method`, and `sources`,
/// each with its share of the dose's variance), and the lines of its
/// table block; `dose_u` from
/// [`crate::decisions::dose_uncertainty::dose_uncertainty`] with the same
/// `u`, in a water of `medium`.
///
/// ```
/// use travertine::decisions::dose::{Chemical, DoseRequest};
/// use travertine::decisions::dose_uncertainty::dose_uncertainty;
/// use travertine::decisions::uncertainty::{Problem, Uncertainties};
/// use travertine::output::uncertainty_report::dose_statement;
/// use travertine::{units::Unit, Conditions, Measured, Medium, Water};
/// let pond = Water::fresh(Conditions::new(24.0, 0.1)?)?;
/// let (a, b) = (Measured::alkalinity(28.0, Unit::MgPerLCaCO3)?, Measured::ph(7.1, None)?);
/// let request = DoseRequest::new(Chemical::SodiumBicarbonate, "alkalinity=50 mg/L CaCO3".parse()?);
/// let u = Uncertainties::new();
/// let d = dose_uncertainty(&Problem::new(&pond, a, b)?, &u, request)?;
/// let (json, block) = dose_statement(&d, &u, Medium::Fresh, &[]);
/// assert_eq!(json["sources"][1]["name"], "pk1");
/// assert!(block.contains("pk1"));
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn dose_statement(
    dose_u: &crate::decisions::dose_uncertainty::DoseUncertainty,
    u: &Uncertainties,
    medium: Medium,
    per_litre: &[Input],
) -> (Value, String) {
    let var = dose_u.dose_g_m3_u * dose_u.dose_g_m3_u;
    let mut sources = Vec::new();
    let mut block =
        String::from("\nUncertainty of the dose (linear; sources independent; the volume exact)\n");
    for &(source, _, c) in &dose_u.contributions {
        let d = describe(source, u, medium, per_litre);
        let share = if var > 0.0 { c * c / var } else { 0.0 };
        let mut extra = Map::new();
        extra.insert("share_of_variance".into(), json!(share));
        sources.push(stated_json(&d, extra));
        let _ = writeln!(
            block,
            "  {:<16}{}  ({}); share {:.2}",
            Report::source_name(source),
            d.size,
            d.origin,
            share
        );
    }
    if dose_u.contributions.is_empty() {
        block.push_str("  no source has an uncertainty: the ± is 0\n");
    }
    let mut json = json!({
        "method": "linear (first-order) propagation, each derivative a central difference of two full doses; sources independent; the volume taken as exact",
        "sources": sources,
    });
    if let (Some(mc), Some(o)) = (&dose_u.monte_carlo, json.as_object_mut()) {
        o.insert(
            "monte_carlo".into(),
            json!({"draws": mc.draws, "seed": mc.seed, "solved": mc.solved, "failed": mc.failed}),
        );
        let _ = writeln!(
            block,
            "  Monte Carlo check: {} draws, seed {}, {} dosed, {} failed: ± {} g/m³",
            mc.draws,
            mc.seed,
            mc.solved,
            mc.failed,
            mc.dose_g_m3_std_dev
                .map_or_else(|| "—".to_string(), |sd| format!("{sd:.3}"))
        );
    }
    (json, block)
}

impl Report {
    /// The linear propagation of `u` through `problem` for every numeric
    /// output, with the Monte Carlo check of `draws` draws from `seed`
    /// where `monte_carlo` is given.
    ///
    /// `per_litre` tells, for a carbonate amount measured per litre, that
    /// its absolute size is in µmol/L (for the statement of the sources).
    ///
    /// # Errors
    /// As [`outputs_propagated`] and [`outputs_monte_carlo`];
    /// [`crate::Error::OutOfRange`] for more draws than [`MOST_DRAWS`].
    pub fn new(
        problem: &Problem,
        u: &Uncertainties,
        monte_carlo: Option<(usize, u64)>,
    ) -> Result<Self> {
        Self::stated(problem, u, monte_carlo, &[])
    }

    /// As [`Report::new`], with the inputs given per litre named in
    /// `per_litre` (so that their sizes are stated in µmol/L).
    ///
    /// # Errors
    /// As [`Report::new`].
    pub fn stated(
        problem: &Problem,
        u: &Uncertainties,
        monte_carlo: Option<(usize, u64)>,
        per_litre: &[Input],
    ) -> Result<Self> {
        if let Some((draws, _)) = monte_carlo {
            crate::base::error::check_range(
                crate::base::field::Field::Draws,
                draws as f64,
                2.0,
                MOST_DRAWS as f64,
                "",
            )?;
        }
        let (outputs, linear) = outputs_propagated(problem, u)?;
        let monte_carlo = match monte_carlo {
            Some((draws, seed)) => {
                let (_, mc) = outputs_monte_carlo(problem, u, draws, seed)?;
                Some((mc, draws, seed))
            }
            None => None,
        };
        let medium = problem.medium();
        let sources = linear
            .sources
            .iter()
            .map(|(source, _)| describe(*source, u, medium, per_litre))
            .collect();
        let moved = problem.reporting_conditions().map(|(t, p)| {
            let at: Vec<String> = t
                .map(|t| format!("{t} °C"))
                .into_iter()
                .chain(p.map(|p| format!("{p} dbar")))
                .collect();
            format!(
                "of the state reported at {}: each perturbed state solved as measured and \
                 moved there, a constant moved by the same pK at both conditions, the \
                 reporting conditions taken as exact",
                at.join(" and ")
            )
        });
        Ok(Report {
            outputs,
            linear,
            monte_carlo,
            sources,
            moved,
        })
    }

    /// The standard uncertainty of an output (`None` where it has no value,
    /// or is not a number).
    pub fn u(&self, o: Output) -> Option<f64> {
        let k = self.outputs.iter().position(|p| *p == o)?;
        self.linear.outputs[k].u
    }

    /// The Monte Carlo standard deviation of an output, where the check ran.
    pub fn u_mc(&self, o: Output) -> Option<f64> {
        let k = self.outputs.iter().position(|p| *p == o)?;
        self.monte_carlo
            .as_ref()
            .and_then(|(mc, _, _)| mc.std_devs[k])
    }

    /// Whether the Monte Carlo check ran.
    pub fn has_monte_carlo(&self) -> bool {
        self.monte_carlo.is_some()
    }

    /// The name of a source as the result writes it: an input's flag, a
    /// constant's setting name (`pk1`, `boron_total`).
    fn source_name(s: Source) -> String {
        match s {
            Source::Input(i) => i.flag().to_string(),
            Source::Constant(c) => constant_name(c),
        }
    }

    /// Adds to a JSON object of a state: `<key>_u` after every numeric
    /// output key (and `<key>_u_mc` with the Monte Carlo check), `null`
    /// where the output has no value; then `uncertainty` (the method and
    /// every source with its size and origin, and the draws of the check)
    /// and, with `budget`, `budget`: for each output with a variance above
    /// zero, each source's share of it (the shares sum to 1).
    pub fn add_to_json(&self, object: &mut Map<String, Value>, budget: bool) {
        let old = std::mem::take(object);
        for (key, value) in old {
            let numeric = self.outputs.iter().position(|o| o.key() == key);
            object.insert(key.clone(), value);
            if let Some(k) = numeric {
                object.insert(format!("{key}_u"), json!(self.linear.outputs[k].u));
                if let Some((mc, _, _)) = &self.monte_carlo {
                    object.insert(format!("{key}_u_mc"), json!(mc.std_devs[k]));
                }
            }
        }
        let sources: Vec<Value> = self
            .sources
            .iter()
            .map(|d| stated_json(d, Map::new()))
            .collect();
        let mut method = String::from(METHOD);
        if let Some(m) = &self.moved {
            method.push_str("; ");
            method.push_str(m);
        }
        let mut about = json!({
            "method": method,
            "sources": sources,
        });
        if let (Some((mc, draws, seed)), Some(a)) = (&self.monte_carlo, about.as_object_mut()) {
            a.insert(
                "monte_carlo".into(),
                json!({"draws": draws, "seed": seed, "solved": mc.solved, "failed": mc.failed}),
            );
        }
        object.insert("uncertainty".into(), about);
        if budget {
            let mut all = Map::new();
            for (k, (o, p)) in self.outputs.iter().zip(&self.linear.outputs).enumerate() {
                if !p.u.is_some_and(|u| u > 0.0) {
                    continue;
                }
                let shares: Map<String, Value> = self
                    .linear
                    .budget(k)
                    .into_iter()
                    .map(|(s, f)| (Self::source_name(s), json!(f)))
                    .collect();
                all.insert(o.key().to_string(), Value::Object(shares));
            }
            object.insert("budget".into(), Value::Object(all));
        }
    }

    /// The ± text of an output in the table: with the decimals of its
    /// value where the output is written to fixed decimals, else to two
    /// significant figures; every digit with [`Precision::Full`].
    pub fn cell(&self, o: Output, precision: Precision) -> Option<String> {
        let u = self.u(o)?;
        Some(Self::format(o, u, precision))
    }

    /// The Monte Carlo ± text of an output, as [`Report::cell`].
    pub fn cell_mc(&self, o: Output, precision: Precision) -> Option<String> {
        let u = self.u_mc(o)?;
        Some(Self::format(o, u, precision))
    }

    fn format(o: Output, u: f64, precision: Precision) -> String {
        format!("± {}", precision.format(u, u_digits(o)))
    }

    /// The block closing the table: the method and each source, with its
    /// size and where it comes from, and the Monte Carlo draws.
    pub fn block(&self) -> String {
        let mut out = String::from("\nUncertainty (linear propagation; sources independent)\n");
        if let Some(m) = &self.moved {
            out.push_str(&format!("  {m}\n"));
        }
        if self.sources.is_empty() {
            out.push_str("  no source has an uncertainty: every ± is 0\n");
        }
        for d in &self.sources {
            let _ = writeln!(
                out,
                "  {:<16}{}  ({})",
                Self::source_name(d.source),
                d.size,
                d.origin
            );
        }
        if let Some((mc, draws, seed)) = &self.monte_carlo {
            let _ = writeln!(
                out,
                "  Monte Carlo check: {draws} draws, seed {seed}, {} solved, {} failed",
                mc.solved, mc.failed
            );
        }
        out
    }
}

/// The JSON of a state judged against `profile` ([`super::Judged`]), with
/// the uncertainties of `report` added ([`Report::add_to_json`]), and the
/// state as measured under `as_measured` where `state` was moved to other
/// conditions ([`crate::decisions::uncertainty::Problem::reported_at`]; the
/// uncertainties are those of `state`).
///
/// ```
/// use travertine::decisions::{uncertainty::{Problem, Uncertainties}, Profile};
/// use travertine::output::uncertainty_report::{json_with_uncertainty, Report};
/// use travertine::{Conditions, Measured, Water};
/// let sea = Water::saline(Conditions::new(25.0, 35.0)?)?;
/// let (a, b) = (Measured::dic_umol_kg(2000.0)?, Measured::alkalinity_umol_kg(2300.0)?);
/// let r = Report::new(&Problem::new(&sea, a, b)?, &Uncertainties::new(), None)?;
/// let text = json_with_uncertainty(&sea.solve(a, b)?, None, &Profile::default(), &r, false);
/// let v: serde_json::Value = serde_json::from_str(&text).unwrap();
/// assert!(v["omega_aragonite_u"].as_f64().unwrap() > 0.0);
/// assert_eq!(v["uncertainty"]["sources"][1]["name"], "pk1");
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn json_with_uncertainty(
    state: &crate::state::State,
    measured: Option<&crate::state::State>,
    profile: &crate::decisions::Profile,
    report: &Report,
    budget: bool,
) -> String {
    let judged = |s| serde_json::to_value(super::Judged::new(s, profile));
    let mut v = judged(state).unwrap_or(Value::Null);
    if let Some(object) = v.as_object_mut() {
        report.add_to_json(object, budget);
        if let Some(m) = measured {
            object.insert("as_measured".into(), judged(m).unwrap_or(Value::Null));
        }
    }
    serde_json::to_string_pretty(&v).unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}"))
}
