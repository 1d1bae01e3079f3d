//! `travertine solve` with uncertainties (issue 13), from the outside: the
//! `_u` keys of every numeric output, the Monte Carlo check, the budget, the
//! table's ± column and the errors of a bad setting. Samples are of the
//! invented Larkvane waters.

mod common;

use common::run_travertine;
use travertine::decisions::uncertainty::{Problem, Size, Uncertainties};
use travertine::output::uncertainty::{numeric_outputs, outputs_monte_carlo, outputs_propagated};
use travertine::sample::air::Air;
use travertine::sample::inputs::Input;
use travertine::{Conditions, Measured, Parameter, PhScale, Water};

fn json(args: &[&str]) -> serde_json::Value {
    let o = run_travertine(args, None);
    assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    serde_json::from_slice(&o.stdout).expect("JSON")
}

/// Tarnholm inlet, an invented coastal water: pH 8.05 (total), alkalinity
/// 2300 µmol/kg, 12 °C, salinity 34, wind 6 m/s.
const TARNHOLM: &[&str] = &[
    "solve",
    "--ph",
    "8.05",
    "--ph-scale",
    "total",
    "--alkalinity",
    "2300umol/kg",
    "--temperature",
    "12",
    "--salinity",
    "34",
    "--wind",
    "6",
    "--json",
];

fn tarnholm(extra: &[&str]) -> serde_json::Value {
    let mut args = TARNHOLM.to_vec();
    args.extend_from_slice(extra);
    json(&args)
}

/// The same water and uncertainties through the library.
fn tarnholm_problem() -> (Problem, Uncertainties) {
    let sea = Water::saline(Conditions::new(12.0, 34.0).unwrap()).unwrap();
    let p = Problem::new(
        &sea,
        Measured::ph(8.05, Some(PhScale::Total)).unwrap(),
        Measured::alkalinity_umol_kg(2300.0).unwrap(),
    )
    .unwrap()
    .with_options(travertine::SolveOptions::default().with_precipitation_potential(true))
    .with_air(Air::new().with_wind_m_s(6.0).unwrap(), Some(PhScale::Total));
    let u = Uncertainties::new()
        .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01))
        .unwrap()
        .with_input(Input::Carbon(Parameter::Alkalinity), Size::Absolute(2.0))
        .unwrap()
        .with_input(Input::Wind, Size::Percent(10.0))
        .unwrap();
    (p, u)
}

const SETTINGS: &[&str] = &[
    "--uncertainty",
    "ph=0.01",
    "--uncertainty",
    "alkalinity=2umol/kg",
    "--uncertainty",
    "wind=10%",
];

fn close(a: f64, b: f64, rel: f64) -> bool {
    (a - b).abs() <= rel * a.abs().max(b.abs()) + 1e-300
}

#[test]
fn every_numeric_key_has_its_u_and_it_matches_the_library() {
    let v = tarnholm(SETTINGS);
    let (p, u) = tarnholm_problem();
    let (outputs, lib) = outputs_propagated(&p, &u).unwrap();
    assert_eq!(outputs, numeric_outputs());
    assert!(outputs.len() > 40, "{}", outputs.len());
    for (o, r) in outputs.iter().zip(&lib.outputs) {
        let key = format!("{}_u", o.key());
        let got = v.get(&key).unwrap_or_else(|| panic!("{key} missing"));
        match (got.as_f64(), r.u) {
            (Some(g), Some(l)) => assert!(close(g, l, 1e-9), "{key}: {g} against {l}"),
            (None, None) => {}
            (g, l) => panic!("{key}: {g:?} against {l:?}"),
        }
    }
    // The keys the issue names.
    for key in [
        "pco2_uatm_u",
        "omega_aragonite_u",
        "co2_flux_mmol_m2_d_u",
        "ph_total_u",
    ] {
        assert!(v[key].as_f64().unwrap() > 0.0, "{key}");
    }
    // `_u` stands beside its key.
    let keys: Vec<&String> = v.as_object().unwrap().keys().collect();
    let at = keys.iter().position(|k| *k == "pco2_uatm").unwrap();
    assert_eq!(keys[at + 1], "pco2_uatm_u");
    // No Monte Carlo without asking.
    assert!(v.get("pco2_uatm_u_mc").is_none());
    // Each source is stated, the defaults with their origin.
    let sources = v["uncertainty"]["sources"].as_array().unwrap();
    let pk1 = sources.iter().find(|s| s["name"] == "pk1").unwrap();
    assert_eq!(pk1["standard_uncertainty"], "0.0075 pK units");
    assert!(pk1["origin"].as_str().unwrap().contains("Orr et al. 2018"));
    let ph = sources.iter().find(|s| s["name"] == "ph").unwrap();
    assert_eq!(ph["origin"], "given");
}

#[test]
fn nh3_has_its_uncertainty_in_fresh_water() {
    // Hollin pond, invented: pH 8.4, alkalinity 60 mg/L CaCO3, 22 °C,
    // total ammonia 0.5 mg/L N.
    let v = json(&[
        "solve",
        "--ph",
        "8.4",
        "--alkalinity",
        "60 mg/L CaCO3",
        "--temperature",
        "22",
        "--ammonia",
        "0.5 mg/L N",
        "--uncertainty",
        "ph=0.05",
        "--uncertainty",
        "ammonia=0.02 mg/L N",
        "--json",
    ]);
    assert!(v["nh3_mg_l_n_u"].as_f64().unwrap() > 0.0);
    // The ammonia uncertainty, stated in µmol/kg: 0.02 mg/L N is 1.428 µmol/L.
    let sources = v["uncertainty"]["sources"].as_array().unwrap();
    let nh = sources.iter().find(|s| s["name"] == "ammonia").unwrap();
    let text = nh["standard_uncertainty"].as_str().unwrap();
    let number: f64 = text.split(' ').next().unwrap().parse().unwrap();
    assert!((number - 0.02 / 14.0067 * 1000.0).abs() < 0.01, "{text}");
    // Fresh-water defaults are marked from memory.
    let pk2 = sources.iter().find(|s| s["name"] == "pk2").unwrap();
    assert!(pk2["origin"].as_str().unwrap().contains("from memory"));
}

#[test]
fn monte_carlo_keys_match_the_library() {
    let mut extra = SETTINGS.to_vec();
    extra.extend_from_slice(&["--monte-carlo", "300", "--seed", "11"]);
    let v = tarnholm(&extra);
    let (p, u) = tarnholm_problem();
    let (outputs, mc) = outputs_monte_carlo(&p, &u, 300, 11).unwrap();
    for (o, sd) in outputs.iter().zip(&mc.std_devs) {
        let key = format!("{}_u_mc", o.key());
        match (v[&key].as_f64(), sd) {
            (Some(g), Some(l)) => assert!(close(g, *l, 1e-9), "{key}: {g} against {l}"),
            (None, None) => {}
            (g, l) => panic!("{key}: {g:?} against {l:?}"),
        }
    }
    assert_eq!(v["uncertainty"]["monte_carlo"]["draws"], 300);
    assert_eq!(v["uncertainty"]["monte_carlo"]["seed"], 11);
    // The default seed is stated (1).
    let v = tarnholm(&["--monte-carlo", "20"]);
    assert_eq!(v["uncertainty"]["monte_carlo"]["seed"], 1);
}

#[test]
fn no_source_gives_zero_everywhere() {
    let v = tarnholm(&["--no-constant-uncertainty"]);
    for o in numeric_outputs() {
        let key = format!("{}_u", o.key());
        match (v[o.key()].as_f64(), v[&key].as_f64()) {
            (Some(_), Some(u)) => assert_eq!(u, 0.0, "{key}"),
            (None, None) => {}
            (value, u) => panic!("{key}: value {value:?}, u {u:?}"),
        }
    }
    assert!(v["uncertainty"]["sources"].as_array().unwrap().is_empty());
}

#[test]
fn budget_shares_sum_to_one() {
    let mut extra = SETTINGS.to_vec();
    extra.push("--budget");
    let v = tarnholm(&extra);
    let budget = v["budget"].as_object().unwrap();
    assert!(budget.contains_key("pco2_uatm") && budget.contains_key("co2_flux_mmol_m2_d"));
    for (key, shares) in budget {
        let sum: f64 = shares
            .as_object()
            .unwrap()
            .values()
            .map(|f| f.as_f64().unwrap())
            .sum();
        assert!((sum - 1.0).abs() < 1e-9, "{key}: {sum}");
    }
    // The wind enters the flux only through the transfer velocity.
    assert!(budget["co2_flux_mmol_m2_d"]["wind"].as_f64().unwrap() > 0.0);
    assert_eq!(budget["pco2_uatm"]["wind"].as_f64().unwrap(), 0.0);
}

#[test]
fn ph_alone_moves_pco2_by_ln10_per_ph_unit_from_ph_and_bicarbonate() {
    // From pH and HCO3-, pCO2 = [H+][HCO3-]/(K0 K1): u(pH) = 0.01 gives a
    // relative u(pCO2) of ln(10) × 0.01 = 2.3026 % to first order (from
    // the definition of K1).
    let v = json(&[
        "solve",
        "--ph",
        "7.9",
        "--ph-scale",
        "total",
        "--hco3",
        "1800umol/kg",
        "--temperature",
        "15",
        "--salinity",
        "30",
        "--no-constant-uncertainty",
        "--uncertainty",
        "ph=0.01",
        "--json",
    ]);
    let rel = v["pco2_uatm_u"].as_f64().unwrap() / v["pco2_uatm"].as_f64().unwrap();
    let expected = std::f64::consts::LN_10 * 0.01;
    assert!(
        (rel / expected - 1.0).abs() < 1e-3,
        "{rel} against {expected}"
    );
    // HCO3- was measured and nothing else enters it.
    assert!(v["hco3_umol_kg_u"].as_f64().unwrap().abs() < 1e-9);
}

#[test]
fn the_table_has_a_plus_minus_column_only_when_asked() {
    let base = [
        "solve",
        "--ph",
        "7.62",
        "--alkalinity",
        "85 mg/L CaCO3",
        "--temperature",
        "14",
    ];
    let plain = run_travertine(&base, None);
    assert!(!String::from_utf8_lossy(&plain.stdout).contains('±'));
    let mut args = base.to_vec();
    args.extend_from_slice(&["--uncertainty", "ph=0.02"]);
    let o = run_travertine(&args, None);
    let t = String::from_utf8_lossy(&o.stdout);
    assert!(
        t.lines()
            .any(|l| l.contains("pH, NBS scale") && l.contains("7.620") && l.contains("± 0.020")),
        "{t}"
    );
    assert!(t.contains("\nUncertainty"));
    assert!(t.contains("pk1") && t.contains("from memory"));
}

fn error_of(extra: &[&str]) -> String {
    let mut args = TARNHOLM.to_vec();
    args.extend_from_slice(extra);
    let o = run_travertine(&args, None);
    assert_eq!(o.status.code(), Some(2), "{extra:?}");
    String::from_utf8_lossy(&o.stderr).into_owned()
}

#[test]
fn bad_settings_are_errors_naming_the_setting() {
    let e = error_of(&["--uncertainty", "temprature=0.1"]);
    assert!(
        e.contains("--uncertainty") && e.contains("temprature"),
        "{e}"
    );
    assert!(e.contains("did you mean `temperature`"), "{e}");
    let e = error_of(&["--uncertainty", "alkalinity=2"]);
    assert!(e.contains("alkalinity=2") && e.contains("umol/kg"), "{e}");
    let e = error_of(&["--uncertainty", "dic=2umol/kg"]);
    assert!(
        e.contains("not measured") && e.contains("alkalinity"),
        "{e}"
    );
    let e = error_of(&["--uncertainty", "pk1=-0.01"]);
    assert!(e.contains("pk1=-0.01") && e.contains("0 or more"), "{e}");
    let e = error_of(&["--monte-carlo", "1"]);
    assert!(e.contains("--monte-carlo"), "{e}");
}

/// An invented pond of the Larkvane farm, dosed with hydrated lime to pH
/// 8.0: 9600 m³, alkalinity 28 mg/L as CaCO3, pH 6.9, calcium 8 mg/L.
fn lime_dose(ph: &str, extra: &[&str]) -> serde_json::Value {
    let mut args = vec![
        "dose",
        "--temperature",
        "24",
        "--alkalinity",
        "28 mg/L CaCO3",
        "--ph",
        ph,
        "--calcium",
        "8 mg/L Ca",
        "--volume",
        "9600 m3",
        "--chemical",
        "hydrated-lime",
        "--target",
        "ph=8.0",
        "--json",
    ];
    args.extend_from_slice(extra);
    json(&args)
}

#[test]
fn dose_uncertainty_matches_a_central_difference_of_two_doses() {
    let v = lime_dose(
        "6.9",
        &["--no-constant-uncertainty", "--uncertainty", "ph=0.05"],
    );
    let u = v["dose_g_m3_u"].as_f64().unwrap();
    assert!(u > 0.0);
    // A central difference of two whole dose runs, h = 0.001 pH.
    let up = lime_dose("6.901", &[])["dose_g_m3"].as_f64().unwrap();
    let down = lime_dose("6.899", &[])["dose_g_m3"].as_f64().unwrap();
    let expected = ((up - down) / 0.002 * 0.05).abs();
    assert!(close(u, expected, 1e-3), "{u} against {expected}");
    // The totals follow the volume: 9600 m³ is 9.6 kg per g/m³.
    let kg_u = v["dose_total_kg_u"].as_f64().unwrap();
    assert!(close(kg_u, 9.6 * u, 1e-12));
    // 1 lb = 0.45359237 kg (exact by definition).
    let lb_u = v["dose_total_lb_u"].as_f64().unwrap();
    assert!(close(lb_u, kg_u / 0.453_592_37, 1e-12));
    // The keys stand beside their own.
    let keys: Vec<&String> = v.as_object().unwrap().keys().collect();
    let at = keys.iter().position(|k| *k == "dose_g_m3").unwrap();
    assert_eq!(keys[at + 1], "dose_g_m3_u");
    assert_eq!(v["uncertainty"]["sources"][0]["name"], "ph");
}

#[test]
fn dose_without_uncertainty_has_no_u_keys_and_constants_count_when_asked() {
    let plain = lime_dose("6.9", &[]);
    assert!(plain.get("dose_g_m3_u").is_none());
    let with = lime_dose("6.9", &["--uncertainty", "ph=0.05"]);
    let only_ph = lime_dose(
        "6.9",
        &["--no-constant-uncertainty", "--uncertainty", "ph=0.05"],
    );
    // The default constants add to the variance.
    assert!(with["dose_g_m3_u"].as_f64().unwrap() > only_ph["dose_g_m3_u"].as_f64().unwrap());
    let shares: f64 = with["uncertainty"]["sources"]
        .as_array()
        .unwrap()
        .iter()
        .map(|s| s["share_of_variance"].as_f64().unwrap())
        .sum();
    assert!((shares - 1.0).abs() < 1e-9, "{shares}");
}

/// The JSON lines of `sheet` on `csv`, and its summary.
fn sheet_rows(csv: &str, extra: &[&str]) -> (Vec<serde_json::Value>, String) {
    let mut args = vec!["sheet", "-", "--format", "jsonl"];
    args.extend_from_slice(extra);
    let o = run_travertine(&args, Some(csv.as_bytes()));
    assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    let rows = String::from_utf8_lossy(&o.stdout)
        .lines()
        .map(|l| serde_json::from_str(l).expect("a JSON line"))
        .collect();
    (rows, String::from_utf8_lossy(&o.stderr).into_owned())
}

/// The computed columns the sheet tests compare.
const COMPARED: &str = "pco2_uatm,free_co2_mg_l,dic_mg_l_c,hco3_umol_kg,co3_umol_kg,revelle_factor";

/// Fennel pond (invented): 18 °C, pH 7.4, alkalinity 150 mg/L as CaCO3.
fn fennel_solve(extra: &[&str]) -> serde_json::Value {
    let mut args = vec![
        "solve",
        "--temperature",
        "18",
        "--ph",
        "7.4",
        "--alkalinity",
        "150 mg/L CaCO3",
        "--json",
    ];
    args.extend_from_slice(extra);
    json(&args)
}

/// The `_u` of every compared key agree between a sheet row and the solve
/// command to `rel`.
fn assert_same_u(row: &serde_json::Value, solved: &serde_json::Value, rel: f64) {
    for key in COMPARED.split(',') {
        let k = format!("{key}_u");
        let (a, b) = (row[&k].as_f64().unwrap(), solved[&k].as_f64().unwrap());
        assert!(close(a, b, rel), "{k}: sheet {a}, solve {b}");
    }
}

#[test]
fn sheet_u_columns_equal_the_solve_command() {
    let csv = "site,temperature_c,ph_nbs,Alkalinity (mg/L as CaCO3),ph_nbs_u,\
               Alkalinity (mg/L as CaCO3)_u\n\
               Fennel pond,18,7.4,150,0.02,2\n";
    let (rows, _) = sheet_rows(csv, &["--columns", COMPARED]);
    let solved = fennel_solve(&[
        "--uncertainty",
        "ph=0.02",
        "--uncertainty",
        "alkalinity=2 mg/L CaCO3",
    ]);
    // Eleven sources (the pair and the constants): both take the one pass
    // on tangents, the command with the exchange with the air too, so the
    // same exact derivatives, to rounding.
    assert_same_u(&rows[0], &solved, 1e-12);
    assert!(rows[0]["pco2_uatm_u"].as_f64().unwrap() > 0.0);
}

#[test]
fn sheet_uncertainty_for_every_row_and_a_fahrenheit_column() {
    // --uncertainty for every row, and a temperature uncertainty in °F
    // (0.18 °F is 0.1 °C: a difference, 5/9 of a degree F per degree C).
    let csv = "Temp (°F),ph_nbs,alkalinity_mg_l_caco3,Temp (°F)_u\n64.4,7.4,150,0.18\n";
    let (rows, _) = sheet_rows(
        csv,
        &[
            "--columns",
            COMPARED,
            "--uncertainty",
            "ph=0.02",
            "--no-constant-uncertainty",
        ],
    );
    let solved = fennel_solve(&[
        "--uncertainty",
        "ph=0.02",
        "--uncertainty",
        "temperature=0.1",
        "--no-constant-uncertainty",
    ]);
    // Two sources: both take forward differences of warm-started solves,
    // good to about 1e-6 relative (tests/uncertainty.rs), from solves
    // started apart (the command's with the exchange) and a temperature
    // converted from °F.
    assert_same_u(&rows[0], &solved, 1e-6);
}

#[test]
fn sheet_reports_unused_and_bad_u_cells_in_their_rows() {
    let csv = "temperature_c,ph_nbs,alkalinity_mg_l_caco3,ph_nbs_u,salinity_u\n\
               18,7.4,150,x,0.1\n\
               18,7.4,150,0.02,0.1\n";
    let (rows, summary) = sheet_rows(csv, &["--columns", "pco2_uatm"]);
    assert!(
        summary.contains("column `salinity_u` not used"),
        "{summary}"
    );
    assert_eq!(rows[0]["status"], "warning");
    assert!(rows[0]["pco2_uatm_u"].is_null());
    assert!(rows[0]["message"].as_str().unwrap().contains("ph_nbs_u"));
    // The bad row stays in its row: the next is computed.
    assert!(rows[1]["pco2_uatm_u"].as_f64().unwrap() > 0.0);
    // The defaults of the constants are stated.
    assert!(summary.contains("Orr et al. 2018"), "{summary}");
    // Without any uncertainty asked for, no _u columns.
    let (plain, _) = sheet_rows(
        "temperature_c,ph_nbs,alkalinity_mg_l_caco3\n18,7.4,150\n",
        &["--columns", "pco2_uatm"],
    );
    assert!(plain[0].get("pco2_uatm_u").is_none());
    // The guide of the columns tells of `_u`.
    let guide = run_travertine(&["sheet", "--list-columns"], None);
    assert!(String::from_utf8_lossy(&guide.stdout).contains("`ph_nbs_u`"));
}

#[test]
fn sheet_setting_of_a_parameter_outside_a_rows_pair_is_noted_in_that_row() {
    // Tarnholm inlet samples (invented): one with alkalinity and DIC, one
    // with pH and alkalinity.
    let csv = "temperature_c,salinity,ph_total,alkalinity_umol_kg,dic_umol_kg\n\
               12,34,,2300,2050\n\
               12,34,8.05,2300,\n";
    let (rows, _) = sheet_rows(
        csv,
        &["--columns", "pco2_uatm", "--uncertainty", "dic=2umol/kg"],
    );
    assert_eq!(rows[0]["status"], "ok");
    assert!(rows[0]["pco2_uatm_u"].as_f64().unwrap() > 0.0);
    // The second row is computed, with the constants' uncertainty only, and
    // says why the DIC setting did not count.
    assert_eq!(rows[1]["status"], "ok");
    assert!(rows[1]["pco2_uatm_u"].as_f64().unwrap() > 0.0);
    let message = rows[1]["message"].as_str().unwrap();
    assert!(
        message.contains("not used in this row") && message.contains("dic"),
        "{message}"
    );
}

/// A wind uncertainty for every row: counted in the row with a wind speed
/// (the flux gets an uncertainty), noted and left out in the row without
/// one, whose other uncertainties are still given (Tarnholm inlet,
/// invented).
#[test]
fn sheet_wind_uncertainty_in_a_row_without_wind_is_noted_in_that_row() {
    let csv = "temperature_c,salinity,ph_total,alkalinity_umol_kg,wind_m_s\n\
               12,34,8.05,2300,6\n\
               12,34,8.05,2300,\n";
    let (rows, _) = sheet_rows(
        csv,
        &[
            "--columns",
            "pco2_uatm,co2_flux_mmol_m2_d",
            "--uncertainty",
            "wind=0.5",
        ],
    );
    assert_eq!(rows[0]["status"], "ok");
    assert!(rows[0]["co2_flux_mmol_m2_d_u"].as_f64().unwrap() > 0.0);
    assert_eq!(rows[1]["status"], "ok");
    assert!(rows[1]["pco2_uatm_u"].as_f64().unwrap() > 0.0);
    let message = rows[1]["message"].as_str().unwrap();
    assert!(
        message.contains("not used in this row") && message.contains("wind"),
        "{message}"
    );
    // `solve` without a wind speed (the Tarnholm sample with its wind
    // left out) refuses it outright, naming the wind.
    let mut args: Vec<&str> = TARNHOLM
        .iter()
        .copied()
        .filter(|a| !matches!(*a, "--wind" | "6"))
        .collect();
    args.extend(["--uncertainty", "wind=0.5"]);
    let o = run_travertine(&args, None);
    assert_eq!(o.status.code(), Some(2));
    let e = String::from_utf8_lossy(&o.stderr);
    assert!(e.contains("wind"), "{e}");
}

/// Fennel pond described by its conductivity (invented: 420 µS/cm at the
/// sample temperature, calcium 1 mmol/kg): `conductivity=5%` and the same
/// size in µS/cm (21) or mS/cm (0.021) give the same uncertainty, above
/// zero for pCO2 and Ω calcite, and the budget names the conductivity.
#[test]
fn conductivity_uncertainty_from_the_command_line() {
    let base = [
        "--conductivity",
        "420 uS/cm",
        "--calcium",
        "1000umol/kg",
        "--no-constant-uncertainty",
        "--budget",
    ];
    let with = |setting: &str| {
        let mut args = base.to_vec();
        args.extend_from_slice(&["--uncertainty", setting]);
        fennel_solve(&args)
    };
    let pct = with("conductivity=5%");
    let us = with("conductivity=21uS/cm");
    let ms = with("conductivity=0.021 mS/cm");
    for key in ["pco2_uatm_u", "omega_calcite_u"] {
        let u = pct[key].as_f64().unwrap();
        assert!(u > 0.0, "{key}");
        assert!(close(u, us[key].as_f64().unwrap(), 1e-12), "{key}");
        assert!(close(u, ms[key].as_f64().unwrap(), 1e-12), "{key}");
    }
    let share = pct["budget"]["pco2_uatm"]["conductivity"].as_f64().unwrap();
    assert!((share - 1.0).abs() < 1e-12, "{share}");
    // Without a conductivity, its uncertainty is refused, naming it.
    let o = run_travertine(
        &[
            "solve",
            "--temperature",
            "18",
            "--salinity",
            "0.2",
            "--ph",
            "7.4",
            "--alkalinity",
            "150 mg/L CaCO3",
            "--uncertainty",
            "conductivity=5%",
        ],
        None,
    );
    assert!(!o.status.success());
    let e = String::from_utf8_lossy(&o.stderr);
    assert!(e.contains("conductivity"), "{e}");
}

/// The sheet reads a `specific_conductance_us_cm_u` column in the unit of
/// its value column, and gives what the solve command gives.
#[test]
fn sheet_specific_conductance_u_column_equals_the_solve_command() {
    let csv = "site,temperature_c,ph_nbs,alkalinity_mg_l_caco3,specific_conductance_us_cm,\
               specific_conductance_us_cm_u\n\
               Fennel pond,18,7.4,150,420,21\n";
    let (rows, _) = sheet_rows(csv, &["--columns", COMPARED, "--no-constant-uncertainty"]);
    let solved = fennel_solve(&[
        "--conductivity",
        "420 uS/cm@25C",
        "--uncertainty",
        "conductivity=5%",
        "--no-constant-uncertainty",
    ]);
    // Eleven sources (the pair and the constants): both take the one pass
    // on tangents, the command with the exchange with the air too, so the
    // same exact derivatives, to rounding.
    assert_same_u(&rows[0], &solved, 1e-12);
    assert!(rows[0]["pco2_uatm_u"].as_f64().unwrap() > 0.0);
}

/// `--at-temperature`/`--at-pressure` with uncertainties: the state shown
/// is the one moved to the reporting conditions, with its `_u` keys equal
/// to the library's propagation with [`Problem::reported_at`], the state as
/// measured under `as_measured`, and the method saying how it was moved.
#[test]
fn uncertainties_at_other_conditions_are_those_of_the_state_reported() {
    let v = tarnholm(&[
        "--at-temperature",
        "4",
        "--at-pressure",
        "300",
        "--uncertainty",
        "ph=0.01",
    ]);
    assert_eq!(v["temperature_c"], 4.0);
    assert_eq!(v["pressure_dbar"], 300.0);
    assert_eq!(v["as_measured"]["temperature_c"], 12.0);
    let (p, _) = tarnholm_problem();
    let p = p.reported_at(Some(4.0), Some(300.0));
    let u = Uncertainties::new()
        .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01))
        .unwrap();
    let (outputs, lib) = outputs_propagated(&p, &u).unwrap();
    let mut checked = 0;
    for (o, r) in outputs.iter().zip(&lib.outputs) {
        let key = format!("{}_u", o.key());
        match (v[&key].as_f64(), r.u) {
            (Some(g), Some(l)) => {
                assert!(close(g, l, 1e-9), "{key}: {g} against {l}");
                checked += 1;
            }
            (None, None) => {}
            (g, l) => panic!("{key}: {g:?} against {l:?}"),
        }
    }
    assert!(checked > 40, "{checked}");
    assert!(v["omega_calcite_u"].as_f64().unwrap() > 0.0);
    let method = v["uncertainty"]["method"].as_str().unwrap();
    assert!(method.contains("reported at 4 °C and 300 dbar"), "{method}");
    // The table says so too.
    let mut args: Vec<&str> = TARNHOLM
        .iter()
        .copied()
        .filter(|a| *a != "--json")
        .collect();
    args.extend(["--at-temperature", "4", "--uncertainty", "ph=0.01"]);
    let o = run_travertine(&args, None);
    let text = String::from_utf8_lossy(&o.stdout);
    assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    assert!(text.contains("of the state reported at 4 °C"), "{text}");
}

/// `dose --monte-carlo N --seed S`: `_u_mc` beside each `_u` of the dose,
/// close to the linear figure for a small pH uncertainty (the dose is
/// nearly linear over ±0.02 pH), the draws stated, the same seed giving
/// the same numbers; and the library's check equal to the command's.
#[test]
fn dose_monte_carlo_checks_the_linear_dose_uncertainty() {
    let extra = [
        "--no-constant-uncertainty",
        "--uncertainty",
        "ph=0.02",
        "--monte-carlo",
        "2000",
        "--seed",
        "9",
    ];
    let v = lime_dose("6.9", &extra);
    let (u, mc) = (
        v["dose_g_m3_u"].as_f64().unwrap(),
        v["dose_g_m3_u_mc"].as_f64().unwrap(),
    );
    assert!(close(u, mc, 0.05), "{u} against {mc}");
    let keys: Vec<&String> = v.as_object().unwrap().keys().collect();
    let at = keys.iter().position(|k| *k == "dose_total_kg_u").unwrap();
    assert_eq!(keys[at + 1], "dose_total_kg_u_mc");
    assert!(close(
        v["dose_total_kg_u_mc"].as_f64().unwrap(),
        9.6 * mc,
        1e-12
    ));
    let check = &v["uncertainty"]["monte_carlo"];
    assert_eq!(check["draws"], 2000);
    assert_eq!(check["seed"], 9);
    assert_eq!(
        check["solved"].as_u64().unwrap() + check["failed"].as_u64().unwrap(),
        2000
    );
    assert_eq!(
        lime_dose("6.9", &extra)["dose_g_m3_u_mc"],
        v["dose_g_m3_u_mc"]
    );
    // Without asking, no check.
    assert!(lime_dose("6.9", &["--uncertainty", "ph=0.02"])
        .get("dose_g_m3_u_mc")
        .is_none());
}

/// `--no-constant-uncertainty` switches off the constants' defaults, not a
/// constant given by name: `pk1=0.01` beside it still counts, alone.
#[test]
fn a_constant_given_counts_without_the_defaults() {
    let v = tarnholm(&["--no-constant-uncertainty", "--uncertainty", "pk1=0.01"]);
    let sources = v["uncertainty"]["sources"].as_array().unwrap();
    assert_eq!(sources.len(), 1, "{sources:?}");
    assert_eq!(sources[0]["name"], "pk1");
    assert!(v["pco2_uatm_u"].as_f64().unwrap() > 0.0);
}
