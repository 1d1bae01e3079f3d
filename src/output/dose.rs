//! A dose written out: the JSON of `travertine dose --json` and its table.

use super::digits::{Digits, Precision};
use super::fields::{Output, Value};
use crate::decisions::dose::Dose;
use crate::decisions::volume::{Volume, KG_PER_POUND};
use crate::properties::scales::PhScale;
use crate::state::State;
use serde_json::{json, Map, Value as Json};
use std::fmt::Write;

/// The outputs whose change a dose reports, in order: pH on `scale`,
/// alkalinity, DIC, pCO2, free CO2, Ω calcite and aragonite, and calcium
/// hardness.
///
/// ```
/// use travertine::{output::{dose_changes, Output}, PhScale};
/// assert_eq!(dose_changes(PhScale::Nbs)[0], Output::PhNbs);
/// ```
pub fn dose_changes(scale: PhScale) -> [Output; 8] {
    use Output::*;
    [
        match scale {
            PhScale::Total => PhTotal,
            PhScale::Seawater => PhSeawater,
            PhScale::Free => PhFree,
            PhScale::Nbs => PhNbs,
        },
        AlkalinityMgL,
        DicMgL,
        Pco2,
        FreeCo2MgL,
        OmegaCalcite,
        OmegaAragonite,
        CalciumHardness,
    ]
}

fn number(o: Output, s: &State) -> Option<f64> {
    match o.value(s) {
        Value::Number(Some(v)) if v.is_finite() => Some(v),
        _ => None,
    }
}

/// The JSON of a dose: the dose per m³ (`dose_g_m3`, equal to mg/L) and,
/// with a volume, in total (`dose_total_kg`, `dose_total_lb`); the state
/// after treatment (`after`, keyed as `solve --json`); the change of each
/// of [`dose_changes`] (`change`, keyed by output); and the cautions
/// (`cautions`, `{code, message}`), always.
///
/// ```
/// use travertine::decisions::dose::{dose, Chemical, DoseRequest};
/// use travertine::decisions::volume::Volume;
/// use travertine::output::dose_json;
/// use travertine::{units::Unit, Conditions, Measured, PhScale, Water};
/// let pond = Water::fresh(Conditions::new(24.0, 0.1)?)?;
/// let before = pond.solve(Measured::alkalinity(28.0, Unit::MgPerLCaCO3)?, Measured::ph(7.1, None)?)?;
/// let d = dose(&pond, &before,
///     DoseRequest::new(Chemical::SodiumBicarbonate, "alkalinity=50 mg/L CaCO3".parse()?))?;
/// let v: serde_json::Value =
///     serde_json::from_str(&dose_json(&d, Some(Volume::from_m3(9600.0)?), PhScale::Nbs)).unwrap();
/// assert!(v["dose_total_kg"].as_f64().unwrap() > 300.0);
/// assert!((v["change"]["alkalinity_mg_l_caco3"].as_f64().unwrap() - 22.0).abs() < 0.1);
/// assert!(!v["cautions"].as_array().unwrap().is_empty());
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn dose_json(d: &Dose, volume: Option<Volume>, scale: PhScale) -> String {
    dose_json_with_uncertainty(d, volume, scale, None)
}

/// As [`dose_json`], with the standard uncertainty of the dose (issue 13)
/// where given: `dose_g_m3_u`, and with a volume `dose_total_kg_u` and
/// `dose_total_lb_u`, each beside its key (and each followed by its
/// `_u_mc` where the Monte Carlo check ran), and `uncertainty`, the
/// statement of the sources ([`super::uncertainty_report::dose_statement`]).
///
/// ```
/// use travertine::decisions::dose::{dose, Chemical, DoseRequest};
/// use travertine::decisions::dose_uncertainty::dose_uncertainty;
/// use travertine::decisions::uncertainty::{Problem, Uncertainties};
/// use travertine::decisions::volume::Volume;
/// use travertine::output::dose_json_with_uncertainty;
/// use travertine::{units::Unit, Conditions, Measured, PhScale, Water};
/// let pond = Water::fresh(Conditions::new(24.0, 0.1)?)?;
/// let (a, b) = (Measured::alkalinity(28.0, Unit::MgPerLCaCO3)?, Measured::ph(7.1, None)?);
/// let request = DoseRequest::new(Chemical::SodiumBicarbonate, "alkalinity=50 mg/L CaCO3".parse()?);
/// let d = dose(&pond, &pond.solve(a, b)?, request)?;
/// let u = dose_uncertainty(&Problem::new(&pond, a, b)?, &Uncertainties::new(), request)?;
/// let text = dose_json_with_uncertainty(&d, Some(Volume::from_m3(100.0)?), PhScale::Nbs,
///                                       Some((&u, serde_json::Value::Null)));
/// let v: serde_json::Value = serde_json::from_str(&text).unwrap();
/// assert!((v["dose_total_kg_u"].as_f64().unwrap() - 0.1 * u.dose_g_m3_u).abs() < 1e-12);
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn dose_json_with_uncertainty(
    d: &Dose,
    volume: Option<Volume>,
    scale: PhScale,
    uncertainty: Option<(&crate::decisions::dose_uncertainty::DoseUncertainty, Json)>,
) -> String {
    let mut change = Map::new();
    for o in dose_changes(scale) {
        let delta = match (number(o, &d.before), number(o, &d.after)) {
            (Some(a), Some(b)) => json!(b - a),
            _ => Json::Null,
        };
        change.insert(o.key().to_string(), delta);
    }
    let r = &d.request;
    let total_kg = volume.map(|v| d.total_kg(v.m3()));
    let mut v = json!({
        "chemical": r.chemical.name(),
        "target": target_text(d),
        "purity_percent": r.purity_percent,
        "dissolved_fraction": r.dissolved_fraction,
        "reacted_mmol_kg": d.reacted_mmol_kg,
        "dose_g_m3": d.dose_g_m3,
        "volume_m3": volume.map(Volume::m3),
        "dose_total_kg": total_kg,
        "dose_total_lb": total_kg.map(|kg| kg / KG_PER_POUND),
        "change": change,
        // Keyed as `solve --json`, flags (default profile) included.
        "after": serde_json::to_value(super::json::Judged::new(
            &d.after,
            crate::decisions::Profile::shared_default(),
        ))
        .unwrap_or(Json::Null),
        "cautions": d.cautions,
    });
    if let (Some((u, statement)), Some(object)) = (uncertainty, v.as_object_mut()) {
        let kg_u = volume.map(|v| u.total_kg_u(v.m3()));
        let old = std::mem::take(object);
        for (key, value) in old {
            let u_value = match key.as_str() {
                "dose_g_m3" => Some(json!(u.dose_g_m3_u)),
                "dose_total_kg" => Some(json!(kg_u)),
                "dose_total_lb" => Some(json!(kg_u.map(|kg| kg / KG_PER_POUND))),
                _ => None,
            };
            // The Monte Carlo check, in the same units, where it ran.
            let mc = u.monte_carlo.as_ref().map(|mc| {
                let sd = mc.dose_g_m3_std_dev;
                match key.as_str() {
                    "dose_total_kg" => json!(volume.and_then(|v| sd.map(|s| s * v.m3() / 1000.0))),
                    "dose_total_lb" => {
                        json!(volume.and_then(|v| sd.map(|s| s * v.m3() / 1000.0 / KG_PER_POUND)))
                    }
                    _ => json!(sd),
                }
            });
            let u_key = format!("{key}_u");
            object.insert(key, value);
            if let Some(x) = u_value {
                object.insert(u_key.clone(), x);
                if let Some(m) = mc {
                    object.insert(format!("{u_key}_mc"), m);
                }
            }
        }
        object.insert("uncertainty".into(), statement);
    }
    serde_json::to_string_pretty(&v).unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}"))
}

/// The target as the user gave it, for the heading and the JSON.
fn target_text(d: &Dose) -> String {
    use crate::decisions::dose::Target;
    match d.request.target {
        Target::Alkalinity(q) => format!("alkalinity {q}"),
        Target::Ph(v) => format!("pH {v}"),
        Target::FreeCo2MgL(v) => format!("free CO2 {v} mg/L"),
        Target::OmegaAragonite(v) => format!("aragonite Ω {v}"),
        Target::OmegaCalcite(v) => format!("calcite Ω {v}"),
        Target::CalciumHardness(q) => format!("calcium hardness {q}"),
    }
}

/// The table of a dose: the product to add per m³ and in total, a before,
/// after and change block of [`dose_changes`], then the cautions.
///
/// ```
/// use travertine::decisions::dose::{dose, Chemical, DoseRequest};
/// use travertine::output::{dose_table, Precision};
/// use travertine::{units::Unit, Conditions, Measured, PhScale, Water};
/// let pond = Water::fresh(Conditions::new(24.0, 0.1)?)?;
/// let before = pond.solve(Measured::alkalinity(28.0, Unit::MgPerLCaCO3)?, Measured::ph(7.1, None)?)?;
/// let d = dose(&pond, &before,
///     DoseRequest::new(Chemical::SodiumBicarbonate, "alkalinity=50 mg/L CaCO3".parse()?))?;
/// let t = dose_table(&d, None, PhScale::Nbs, Precision::Sensible);
/// assert!(t.contains("g/m³") && t.contains("Cautions"));
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn dose_table(
    d: &Dose,
    volume: Option<Volume>,
    scale: PhScale,
    precision: Precision,
) -> String {
    dose_table_with_uncertainty(d, volume, scale, precision, None)
}

/// As [`dose_table`], with the standard uncertainty of the dose (issue
/// 13) where given: ± beside the dose per m³ and in total (to two
/// significant figures), and `block`, the statement of its sources
/// ([`super::uncertainty_report::dose_statement`]), after the cautions.
///
/// ```
/// use travertine::decisions::dose::{dose, Chemical, DoseRequest};
/// use travertine::decisions::dose_uncertainty::dose_uncertainty;
/// use travertine::decisions::uncertainty::{Problem, Uncertainties};
/// use travertine::output::{dose_table_with_uncertainty, Precision};
/// use travertine::{units::Unit, Conditions, Measured, PhScale, Water};
/// let pond = Water::fresh(Conditions::new(24.0, 0.1)?)?;
/// let (a, b) = (Measured::alkalinity(28.0, Unit::MgPerLCaCO3)?, Measured::ph(7.1, None)?);
/// let request = DoseRequest::new(Chemical::SodiumBicarbonate, "alkalinity=50 mg/L CaCO3".parse()?);
/// let d = dose(&pond, &pond.solve(a, b)?, request)?;
/// let u = dose_uncertainty(&Problem::new(&pond, a, b)?, &Uncertainties::new(), request)?;
/// let t = dose_table_with_uncertainty(&d, None, PhScale::Nbs, Precision::Sensible, Some((&u, "")));
/// assert!(t.lines().nth(1).unwrap().contains(" ± "));
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn dose_table_with_uncertainty(
    d: &Dose,
    volume: Option<Volume>,
    scale: PhScale,
    precision: Precision,
    uncertainty: Option<(&crate::decisions::dose_uncertainty::DoseUncertainty, &str)>,
) -> String {
    let mut out = String::new();
    let r = &d.request;
    let three = Digits::Significant(3);
    let pm = |x: f64| {
        uncertainty.map_or_else(String::new, |_| {
            format!(" ± {}", precision.format(x, Digits::Significant(2)))
        })
    };
    let u = uncertainty.map_or(0.0, |(u, _)| u.dose_g_m3_u);
    let _ = writeln!(out, "Dose of {} to {}", r.chemical.what(), target_text(d));
    let _ = writeln!(
        out,
        "  add {}{} g/m³ (mg/L) of product at {} % purity{}",
        precision.format(d.dose_g_m3, three),
        pm(u),
        r.purity_percent,
        if r.dissolved_fraction < 1.0 {
            format!(", {} of it dissolving", r.dissolved_fraction)
        } else {
            String::new()
        }
    );
    if let Some(v) = volume {
        let kg = d.total_kg(v.m3());
        let _ = writeln!(
            out,
            "  for {} m³: {}{} kg ({}{} lb)",
            precision.format(v.m3(), three),
            precision.format(kg, three),
            pm(u * v.m3() / 1000.0),
            precision.format(kg / KG_PER_POUND, three),
            pm(u * v.m3() / 1000.0 / KG_PER_POUND)
        );
    }
    let rows: Vec<(Output, [String; 3])> = dose_changes(scale)
        .into_iter()
        .filter_map(|o| {
            let digits = o.digits()?;
            let (a, b) = (number(o, &d.before)?, number(o, &d.after)?);
            let change = precision.format(b - a, digits.at(a.abs().max(b.abs())));
            let change = if b >= a { format!("+{change}") } else { change };
            Some((
                o,
                [
                    precision.format(a, digits),
                    precision.format(b, digits),
                    change,
                ],
            ))
        })
        .collect();
    let label_w = rows
        .iter()
        .map(|(o, _)| o.label().chars().count())
        .max()
        .unwrap_or(8)
        + 2;
    let w = rows
        .iter()
        .flat_map(|(_, c)| c.iter().map(|s| s.chars().count()))
        .max()
        .unwrap_or(6)
        .max(8)
        + 2;
    let _ = writeln!(
        out,
        "\n  {:<label_w$}{:>w$}{:>w$}{:>w$}",
        "", "before", "after", "change"
    );
    for (o, [a, b, c]) in &rows {
        let line = format!(
            "  {:<label_w$}{a:>w$}{b:>w$}{c:>w$}  {}",
            o.label(),
            o.unit()
        );
        let _ = writeln!(out, "{}", line.trim_end());
    }
    let _ = writeln!(out, "\nCautions");
    for c in &d.cautions {
        let _ = writeln!(out, "  - {}", c.message);
    }
    if let Some((_, block)) = uncertainty {
        out.push_str(block);
    }
    if !d.after.warnings.is_empty() {
        let _ = writeln!(out, "\nAbout the water after treatment");
        for w in &d.after.warnings {
            let _ = writeln!(out, "  - {w}");
        }
    }
    out
}
