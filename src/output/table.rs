//! Human-readable output: an aligned table with units.

use super::digits::Precision;
use super::fields::{Output, Place, Section, Value};
use super::uncertainty_report::Report;
use crate::base::warning::Severity;
use crate::decisions::{flags, not_judged, Profile};
use crate::properties::scales::PhScale;
use crate::sample::Medium;
use crate::state::State;
use std::fmt::Write;

/// What the user of each medium asks first, in that order: the key figures
/// that open the table, and the block of the state as measured.
///
/// - fresh water: pH (NBS), free CO2 in mg/L, pCO2, alkalinity in mg/L as
///   CaCO3, the calcite saturation index and the Langelier index;
/// - saline water: pH on `scale` (the scale of the input; total where none
///   was given), pCO2, Ω aragonite and calcite, DIC and alkalinity.
///
/// ```
/// use travertine::{output::{key_figures, Output}, Medium, PhScale};
/// assert_eq!(key_figures(Medium::Fresh, PhScale::Nbs)[1], Output::FreeCo2MgL);
/// assert_eq!(key_figures(Medium::Saline, PhScale::Nbs)[0], Output::PhNbs);
/// ```
pub fn key_figures(medium: Medium, scale: PhScale) -> [Output; 6] {
    use Output::*;
    match medium {
        Medium::Fresh => [PhNbs, FreeCo2MgL, Pco2, AlkalinityMgL, SiCalcite, Langelier],
        _ => [
            match scale {
                PhScale::Total => PhTotal,
                PhScale::Seawater => PhSeawater,
                PhScale::Free => PhFree,
                PhScale::Nbs => PhNbs,
            },
            Pco2,
            OmegaAragonite,
            OmegaCalcite,
            DicUmolKg,
            AlkalinityUmolKg,
        ],
    }
}

/// The label of an output in the table of a medium.
fn label_in(o: Output, medium: Medium) -> &'static str {
    match o.place(medium) {
        Place::Labelled(label) => label,
        _ => o.label(),
    }
}

/// The sections of the table of a state, each with its rows in order: the
/// outputs its medium shows (see [`Output::place`]) and their labels, less
/// the key figures shown above them. Sections without a row are left out.
fn rows(s: &State, key: &[Output]) -> Vec<(Section, Vec<(Output, &'static str)>)> {
    Section::ALL
        .iter()
        // The exchange with the air is shown where it was computed.
        .filter(|&&section| section != Section::Exchange || s.exchange.is_some())
        .filter_map(|&section| {
            let mut first = Vec::new();
            let mut rest = Vec::new();
            for &o in Output::ALL
                .iter()
                .filter(|o| o.section() == section && !key.contains(o))
            {
                match o.place(s.medium) {
                    Place::Hidden => {}
                    Place::First => first.push((o, o.label())),
                    Place::Row => rest.push((o, o.label())),
                    Place::Labelled(label) => rest.push((o, label)),
                }
            }
            first.extend(rest);
            (!first.is_empty()).then_some((section, first))
        })
        .collect()
}

/// The printed value of an output: a number to its digits (see
/// [`Output::digits`]) or every digit, a text as it is, a dash for nothing.
fn cell(o: Output, s: &State, precision: Precision) -> String {
    match (o.value(s), o.digits()) {
        (Value::Number(Some(v)), Some(digits)) if v.is_finite() => precision.format(v, digits),
        (Value::Number(Some(v)), None) if v.is_finite() => v.to_string(),
        (Value::Text(Some(t)), _) => t.to_string(),
        _ => "—".to_string(),
    }
}

/// The header line: the medium and the conditions as given (a salinity
/// computed from a conductivity to 4 decimals and a pressure computed from
/// a depth to 1, or every digit).
fn header(s: &State, precision: Precision) -> String {
    // A temperature as given stays as typed; one computed (a blend) is
    // rounded to hundredths.
    let (salinity, pressure, temperature) = match precision {
        Precision::Full => (s.salinity, s.pressure_dbar, s.temperature_c),
        _ => (
            (s.salinity * 1e4).round() / 1e4,
            (s.pressure_dbar * 10.0).round() / 10.0,
            (s.temperature_c * 100.0).round() / 100.0,
        ),
    };
    let mut h = format!(
        "{} water at {} °C, salinity {}, {} dbar",
        s.medium.name(),
        temperature,
        salinity,
        pressure
    );
    match s.ionic_strength_from {
        Some(crate::medium::fresh::IonicStrengthRoute::Given) => {
            h.push_str("; ionic strength given")
        }
        Some(r) => h.push_str(&format!("; ionic strength from {}", r.name())),
        None => {}
    }
    h
}

/// An aligned table of a state, with units, as [`table_on_scale`] with the
/// pH of saline water on the total scale and each number to the digits its
/// measurement supports ([`Precision::Sensible`]).
///
/// # Example
/// ```
/// use travertine::{output::table, Conditions, Measured, Water};
/// let s = Water::saline(Conditions::new(25.0, 35.0)?)?
///     .solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
/// let t = table(&s, None);
/// assert!(t.contains("pH, total scale"));
/// assert!(t.contains("µatm"));
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn table(state: &State, measured: Option<&State>) -> String {
    table_on_scale(state, measured, None, Precision::Sensible)
}

/// An aligned table of a state, with units: a header line with the
/// conditions, the key figures of its medium ([`key_figures`], the pH of
/// saline water on `ph_scale`, the scale of the input), then the detail by
/// section, the fits used and the warnings. When `measured` is given (the
/// same water at the conditions it was measured at), the table is of the
/// requested conditions and a short block beneath gives the key figures as
/// measured.
///
/// Each number is written to its output's [`Output::digits`]
/// ([`Precision::Sensible`]: pH to 3 decimals, pCO2 to 4 significant
/// figures, ..., never an exponent between 1e-6 and 1e9) or with every
/// digit ([`Precision::Full`]: the shortest text that reads back as the
/// same f64, as in the JSON).
///
/// ```
/// use travertine::output::{table_on_scale, Precision};
/// use travertine::{Conditions, Measured, PhScale, Water};
/// let lab = Water::saline(Conditions::new(25.0, 33.0)?)?
///     .solve(Measured::ph(7.95, Some(PhScale::Nbs))?, Measured::alkalinity_umol_kg(2250.0)?)?;
/// let field = lab.at(Conditions::new(9.0, 33.0)?.with_pressure_dbar(120.0)?)?;
/// let t = table_on_scale(&field, Some(&lab), Some(PhScale::Nbs), Precision::Sensible);
/// let key = t.find("Key figures").unwrap();
/// let measured = t.find("As measured").unwrap();
/// assert!(key < measured);
/// assert!(t.lines().nth(3).unwrap().contains("pH, NBS scale"));
/// // The pH as measured, to three decimals.
/// assert!(t[measured..].contains(" 7.950\n"));
/// let full = table_on_scale(&field, Some(&lab), Some(PhScale::Nbs), Precision::Full);
/// assert!(full.contains(&format!(" {}\n", field.ph_nbs)));
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn table_on_scale(
    state: &State,
    measured: Option<&State>,
    ph_scale: Option<PhScale>,
    precision: Precision,
) -> String {
    table_with_profile(
        state,
        measured,
        ph_scale,
        precision,
        Profile::shared_default(),
    )
}

/// As [`table_on_scale`], with the quality flags of `profile`: a `Flags`
/// block closes the table, naming the profile, each flag raised on the
/// state (of the requested conditions) with its code and message, or
/// `none raised`, and the flags that could not be judged for want of an
/// input (no ammonia total above zero, no calcium).
///
/// ```
/// use travertine::decisions::Profile;
/// use travertine::output::{table_with_profile, Precision};
/// use travertine::{Conditions, Measured, Water};
/// let s = Water::fresh(Conditions::new(18.0, 0.1)?)?
///     .solve(Measured::ph(7.4, None)?, Measured::alkalinity_umol_kg(3000.0)?)?;
/// let trout = Profile::built_in("cold-water-fish")?;
/// let t = table_with_profile(&s, None, None, Precision::Sensible, &trout);
/// let block = &t[t.find("\nFlags").unwrap()..];
/// assert!(block.contains("cold-water-fish"));
/// assert!(block.contains("free_co2_high: free CO2 is 12.4 mg/L, above 10 mg/L"));
/// assert!(block.contains("not judged: nh3_high (no ammonia total above zero)"));
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn table_with_profile(
    state: &State,
    measured: Option<&State>,
    ph_scale: Option<PhScale>,
    precision: Precision,
    profile: &Profile,
) -> String {
    table_with_uncertainty(state, measured, ph_scale, precision, profile, None)
}

/// As [`table_with_profile`], with the standard uncertainties of
/// `report` (issue 13) where given: a ± column beside the values of the
/// state (a second one, `MC ±`, with the Monte Carlo check), and a block
/// stating every source of uncertainty, its size and its origin.
///
/// ```
/// use travertine::decisions::{uncertainty::{Problem, Size, Uncertainties}, Profile};
/// use travertine::output::{table_with_uncertainty, uncertainty_report::Report, Precision};
/// use travertine::sample::inputs::Input;
/// use travertine::{Conditions, Measured, Parameter, Water};
/// let pond = Water::fresh(Conditions::new(15.0, 0.2)?)?;
/// let (a, b) = (Measured::ph(7.5, None)?, Measured::alkalinity_umol_kg(1200.0)?);
/// let s = pond.solve(a, b)?;
/// let u = Uncertainties::new().with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.02))?;
/// let r = Report::new(&Problem::new(&pond, a, b)?, &u, None)?;
/// let t = table_with_uncertainty(&s, None, None, Precision::Sensible, &Profile::default(), Some(&r));
/// assert!(t.lines().any(|l| l.contains("pH, NBS scale") && l.contains("± 0.020")));
/// assert!(t.contains("\nUncertainty"));
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn table_with_uncertainty(
    state: &State,
    measured: Option<&State>,
    ph_scale: Option<PhScale>,
    precision: Precision,
    profile: &Profile,
    report: Option<&Report>,
) -> String {
    let mut out = String::new();
    let key = key_figures(state.medium, ph_scale.unwrap_or(PhScale::Total));
    let sections = rows(state, &key);
    let label_w = sections
        .iter()
        .flat_map(|(_, r)| r.iter().map(|(_, label)| label.chars().count()))
        .chain(
            key.iter()
                .map(|o| label_in(*o, state.medium).chars().count()),
        )
        .max()
        .unwrap_or(10)
        + 2;
    let measured_key =
        measured.map(|m| (m, key_figures(m.medium, ph_scale.unwrap_or(PhScale::Total))));
    // Values are right-aligned in a column wide enough for the longest.
    let value_w = key
        .iter()
        .chain(sections.iter().flat_map(|(_, r)| r.iter().map(|(o, _)| o)))
        .map(|o| cell(*o, state, precision).chars().count())
        .chain(
            measured_key
                .iter()
                .flat_map(|(m, k)| k.iter().map(|o| cell(*o, m, precision).chars().count())),
        )
        .max()
        .unwrap_or(0)
        .max(14);
    // issue 13: the ± columns, for the state itself (not the block as
    // measured, whose uncertainty was not asked for).
    let pm = |o: Output, mc: bool| {
        report
            .and_then(|r| {
                if mc {
                    r.cell_mc(o, precision)
                } else {
                    r.cell(o, precision)
                }
            })
            .unwrap_or_default()
    };
    let all_rows = || {
        key.iter()
            .chain(sections.iter().flat_map(|(_, r)| r.iter().map(|(o, _)| o)))
    };
    let pm_w = all_rows()
        .map(|o| pm(*o, false).chars().count())
        .max()
        .unwrap_or(0);
    let mc_w = all_rows()
        .map(|o| pm(*o, true).chars().count())
        .max()
        .unwrap_or(0);
    let line = |o: Output, label: &str, s: &State| {
        let mut line = format!("  {label:<label_w$}{:>value_w$}", cell(o, s, precision));
        if report.is_some() {
            let own = std::ptr::eq(s, state);
            let (u, m) = if own {
                (pm(o, false), pm(o, true))
            } else {
                (String::new(), String::new())
            };
            line.push_str(&format!("  {u:<pm_w$}"));
            if mc_w > 0 {
                let m = if m.is_empty() { m } else { format!("MC {m}") };
                line.push_str(&format!("  {m:<w$}", w = mc_w + 3));
            }
        }
        if !o.unit().is_empty() {
            line.push_str("  ");
            line.push_str(o.unit());
        }
        line.trim_end().to_string()
    };
    let _ = writeln!(out, "{}", header(state, precision));
    let _ = writeln!(out, "\nKey figures");
    for &o in &key {
        let _ = writeln!(out, "{}", line(o, label_in(o, state.medium), state));
    }
    for (section, rs) in &sections {
        let _ = writeln!(out, "\n{}", section.title());
        for &(o, label) in rs {
            let _ = writeln!(out, "{}", line(o, label, state));
        }
    }
    if let Some((m, measured_key)) = &measured_key {
        let _ = writeln!(out, "\nAs measured: {}", header(m, precision));
        for &o in measured_key {
            let _ = writeln!(out, "{}", line(o, label_in(o, m.medium), m));
        }
    }
    let c = &state.fits_used;
    let _ = writeln!(out, "\nConstants");
    let fits = [
        ("K1, K2", c.carbonic),
        ("KB", c.boric),
        ("total boron", c.boron_total),
        ("KW", c.kw),
        ("KS", c.bisulfate),
        ("KF", c.fluoride),
        ("K0, fugacity", c.k0),
        ("calcite, aragonite", c.minerals),
        ("calcium", c.calcium),
        ("pressure", c.pressure),
    ];
    for (what, name) in fits {
        let _ = writeln!(out, "  {what:<label_w$}{name}");
    }
    // Notes (an optional input not given, a default used) apart from the
    // warnings (a result that may be wrong or is extrapolated).
    let mut cautions: Vec<(Severity, String)> = Vec::new();
    for w in state
        .warnings
        .iter()
        .chain(measured.iter().flat_map(|m| m.warnings.iter()))
    {
        let entry = (w.severity(), w.to_string());
        if !cautions.contains(&entry) {
            cautions.push(entry);
        }
    }
    for (severity, title) in [(Severity::Warning, "Warnings"), (Severity::Note, "Notes")] {
        let mut shown = cautions.iter().filter(|(s, _)| *s == severity).peekable();
        if shown.peek().is_some() {
            let _ = writeln!(out, "\n{title}");
            for (_, w) in shown {
                let _ = writeln!(out, "  - {w}");
            }
        }
    }
    if let Some(r) = report {
        out.push_str(&r.block());
    }
    // issue 11: quality flags
    let raised = flags(state, profile);
    let _ = writeln!(
        out,
        "\nFlags, profile {} (limits depend on species and life stage)",
        profile.name()
    );
    if raised.is_empty() {
        let _ = writeln!(out, "  none raised");
    }
    for f in &raised {
        let _ = writeln!(out, "  - {}: {}", f.code, f.message);
    }
    let missing: Vec<String> = not_judged(state, profile)
        .iter()
        .map(|(code, why)| format!("{code} ({why})"))
        .collect();
    if !missing.is_empty() {
        let _ = writeln!(out, "  not judged: {}", missing.join(", "));
    }
    out
}
