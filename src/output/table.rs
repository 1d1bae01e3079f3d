//! Human-readable output: an aligned table with units.

use crate::sample::water::Medium;
use crate::state::State;
use std::fmt::Write;

/// One row of the table: label, value, unit, number of decimals.
type Row = (&'static str, f64, &'static str, usize);

fn opt(v: Option<f64>) -> f64 {
    v.unwrap_or(f64::NAN)
}

fn rows(s: &State) -> Vec<(&'static str, Vec<Row>)> {
    let fresh = s.water == Medium::Fresh;
    let acidity = if fresh {
        vec![
            ("pH, NBS scale", s.ph_nbs, "", 4),
            ("pH, free scale", s.ph_free, "", 4),
        ]
    } else {
        vec![
            ("pH, total scale", s.ph_total, "", 4),
            ("pH, sea-water scale", s.ph_seawater, "", 4),
            ("pH, free scale", s.ph_free, "", 4),
            ("pH, NBS scale (approximate)", s.ph_nbs, "", 4),
        ]
    };
    let mut saturation = vec![
        ("calcite Ω", opt(s.omega_calcite), "", 3),
        ("aragonite Ω", opt(s.omega_aragonite), "", 3),
        ("calcite SI (log10 Ω)", opt(s.si_calcite), "", 3),
        ("aragonite SI (log10 Ω)", opt(s.si_aragonite), "", 3),
        ("calcium", opt(s.calcium_umol_kg), "µmol/kg", 1),
    ];
    if fresh {
        saturation.extend([
            ("free calcium", opt(s.calcium_free_umol_kg), "µmol/kg", 1),
            ("CaHCO3+ pair", opt(s.cahco3_umol_kg), "µmol/kg", 2),
            ("CaCO3 pair", opt(s.caco3_pair_umol_kg), "µmol/kg", 2),
            ("saturation pH, pHs (NBS)", opt(s.saturation_ph_nbs), "", 3),
            ("Langelier index", opt(s.langelier_index), "", 3),
            (
                "CaCO3 precipitation potential",
                opt(s.precipitation_potential_mg_l_caco3),
                "mg/L as CaCO3",
                2,
            ),
        ]);
    }
    let mut sections = vec![
        ("Acidity", acidity),
        (
            "Carbon",
            vec![
                ("alkalinity", s.alkalinity_umol_kg, "µmol/kg", 2),
                ("dissolved inorganic carbon", s.dic_umol_kg, "µmol/kg", 2),
                ("CO2*", s.co2_umol_kg, "µmol/kg", 3),
                ("bicarbonate HCO3-", s.hco3_umol_kg, "µmol/kg", 2),
                ("carbonate CO3--", s.co3_umol_kg, "µmol/kg", 2),
                ("Revelle factor", s.revelle_factor, "", 3),
            ],
        ),
        (
            "Gas",
            vec![
                ("fCO2", s.fco2_uatm, "µatm", 2),
                ("pCO2", s.pco2_uatm, "µatm", 2),
                ("xCO2 (dry air)", s.xco2_ppm, "ppm", 2),
            ],
        ),
        ("Saturation", saturation),
        (
            "Alkalinity parts",
            vec![
                ("carbonate", s.carbonate_alkalinity_umol_kg, "µmol/kg", 2),
                ("borate", s.borate_alkalinity_umol_kg, "µmol/kg", 2),
                ("hydroxide", s.hydroxide_umol_kg, "µmol/kg", 3),
                ("phosphate", s.phosphate_alkalinity_umol_kg, "µmol/kg", 3),
                ("silicate", s.silicate_alkalinity_umol_kg, "µmol/kg", 3),
                ("ammonia", s.ammonia_alkalinity_umol_kg, "µmol/kg", 3),
                ("sulfide", s.sulfide_alkalinity_umol_kg, "µmol/kg", 3),
                (
                    "free hydrogen (minus)",
                    s.free_hydrogen_umol_kg,
                    "µmol/kg",
                    4,
                ),
                ("bisulfate (minus)", s.bisulfate_umol_kg, "µmol/kg", 4),
                (
                    "hydrogen fluoride (minus)",
                    s.hydrogen_fluoride_umol_kg,
                    "µmol/kg",
                    4,
                ),
            ],
        ),
        (
            "Trade units",
            vec![
                ("alkalinity", s.alkalinity_mg_l_caco3, "mg/L as CaCO3", 2),
                ("dissolved inorganic carbon", s.dic_mg_l_c, "mg/L as C", 3),
                ("free CO2", s.free_co2_mg_l, "mg/L", 3),
                ("density used", s.density_kg_m3, "kg/m3", 3),
            ],
        ),
    ];
    let mut medium = vec![("ionic strength", s.ionic_strength, "mol/kg", 5)];
    if fresh {
        medium.extend([
            (
                "activity coefficient, z = 1",
                opt(s.gamma_monovalent),
                "",
                4,
            ),
            ("activity coefficient, z = 2", opt(s.gamma_divalent), "", 4),
            (
                "charge balance of ions given",
                opt(s.charge_balance_percent),
                "%",
                2,
            ),
        ]);
    }
    sections.push(("Medium", medium));
    sections
}

fn header(s: &State) -> String {
    let mut h = format!(
        "{} water at {} °C, salinity {}, {} dbar",
        s.water.name(),
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
    let other = measured.map(rows);
    let label_w = sections
        .iter()
        .flat_map(|(_, r)| r.iter().map(|row| row.0.chars().count()))
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
    for (i, (title, rs)) in sections.iter().enumerate() {
        let _ = writeln!(out, "\n{title}");
        for (j, (label, value, unit, dec)) in rs.iter().enumerate() {
            let mut line = format!("  {label:<label_w$}{:>14}", fmt_num(*value, *dec));
            if let Some(o) = &other {
                let v = o[i].1[j].1;
                line.push_str(&format!("{:>14}", fmt_num(v, *dec)));
            }
            if !unit.is_empty() {
                line.push_str("  ");
                line.push_str(unit);
            }
            let _ = writeln!(out, "{}", line.trim_end());
        }
    }
    let c = &state.constants;
    let _ = writeln!(out, "\nConstants");
    let fits = [
        ("K1, K2", c.carbonic),
        ("KB", c.boric),
        ("total boron", c.boron_total),
        ("KW", c.water),
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

/// One flat JSON object of a state. When `measured` is given (the state at
/// the conditions of measurement), it is added under the key `as_measured`.
///
/// # Example
/// ```
/// use travertine::{output::json, Conditions, Measured, Water};
/// let s = Water::saline(Conditions::new(25.0, 35.0)?)?
///     .solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
/// let v: serde_json::Value = serde_json::from_str(&json(&s, None)).unwrap();
/// assert_eq!(v["water"], "saline");
/// assert!(v["warnings"].as_array().unwrap().is_empty());
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn json(state: &State, measured: Option<&State>) -> String {
    let mut v = serde_json::to_value(state).unwrap_or(serde_json::Value::Null);
    if let (Some(m), Some(obj)) = (measured, v.as_object_mut()) {
        obj.insert(
            "as_measured".to_string(),
            serde_json::to_value(m).unwrap_or(serde_json::Value::Null),
        );
    }
    // Non-finite numbers have no JSON form: serde_json writes them as null.
    serde_json::to_string_pretty(&v).unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}"))
}
