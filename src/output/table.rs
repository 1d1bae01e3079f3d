//! Human-readable output: an aligned table with units.

use super::fields::{Output, Place, Section, Value};
use crate::state::State;
use std::fmt::Write;

/// The sections of the table of a state, each with its rows in order: the
/// outputs its medium shows (see [`Output::place`]) and their labels.
/// Sections without a row are left out.
fn rows(s: &State) -> Vec<(Section, Vec<(Output, &'static str)>)> {
    Section::ALL
        .iter()
        .filter_map(|&section| {
            let mut first = Vec::new();
            let mut rest = Vec::new();
            for &o in Output::ALL.iter().filter(|o| o.section() == section) {
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

/// The printed value of an output: a number to its decimals, a text as it
/// is, a dash for nothing.
fn cell(o: Output, s: &State) -> String {
    match o.value(s) {
        Value::Number(v) => fmt_num(v.unwrap_or(f64::NAN), o.decimals()),
        Value::Text(Some(t)) => t.to_string(),
        Value::Text(None) => "—".to_string(),
    }
}

fn header(s: &State) -> String {
    let mut h = format!(
        "{} water at {} °C, salinity {}, {} dbar",
        s.medium.name(),
        s.temperature_c,
        (s.salinity * 1e4).round() / 1e4,
        s.pressure_dbar
    );
    if let Some(r) = s.ionic_strength_from {
        h.push_str(&format!("; ionic strength from {}", r.name()));
    }
    h
}

/// An aligned table of a state, with units. When `measured` is given (the
/// state at the conditions of measurement), both are shown side by side.
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
    let mut out = String::new();
    let sections = rows(state);
    let label_w = sections
        .iter()
        .flat_map(|(_, r)| r.iter().map(|(_, label)| label.chars().count()))
        .max()
        .unwrap_or(10)
        + 2;
    let _ = writeln!(out, "{}", header(state));
    if let Some(m) = measured {
        let _ = writeln!(out, "measured at: {}", header(m));
        let _ = writeln!(
            out,
            "\n  {:<label_w$}{:>14}{:>14}",
            "", "reported", "as measured"
        );
    }
    for (section, rs) in &sections {
        let _ = writeln!(out, "\n{}", section.title());
        for &(o, label) in rs {
            let mut line = format!("  {label:<label_w$}{:>14}", cell(o, state));
            if let Some(m) = measured {
                line.push_str(&format!("{:>14}", cell(o, m)));
            }
            if !o.unit().is_empty() {
                line.push_str("  ");
                line.push_str(o.unit());
            }
            let _ = writeln!(out, "{}", line.trim_end());
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
    let mut warnings: Vec<String> = state.warnings.iter().map(|w| w.to_string()).collect();
    if let Some(m) = measured {
        for w in &m.warnings {
            let w = w.to_string();
            if !warnings.contains(&w) {
                warnings.push(w);
            }
        }
    }
    if !warnings.is_empty() {
        let _ = writeln!(out, "\nWarnings");
        for w in warnings {
            let _ = writeln!(out, "  - {w}");
        }
    }
    out
}

fn fmt_num(v: f64, decimals: usize) -> String {
    if !v.is_finite() {
        return "—".to_string();
    }
    if v != 0.0 && v.abs() < 10f64.powi(-(decimals as i32)) * 10.0 {
        return format!("{v:.3e}");
    }
    format!("{v:.decimals$}")
}
