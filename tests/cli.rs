//! Drives the built `travertine` binary from the outside: the contract keys
//! of `solve --json`, the table, and the error paths (exit code 2, a message
//! naming the bad flag).

use std::process::{Command, Output};

mod common;
use common::has_figures;

fn travertine(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_travertine"))
        .args(args)
        .output()
        .expect("the binary runs")
}

fn stdout(o: &Output) -> String {
    String::from_utf8_lossy(&o.stdout).into_owned()
}

fn stderr(o: &Output) -> String {
    String::from_utf8_lossy(&o.stderr).into_owned()
}

const SEA: [&str; 4] = ["--temperature", "25", "--salinity", "35"];

fn solve(extra: &[&str]) -> Output {
    let mut args = vec!["solve"];
    args.extend_from_slice(extra);
    args.extend_from_slice(&SEA);
    travertine(&args)
}

/// The JSON keys of the interface contract (../shared/design.md) for saline water.
const CONTRACT_KEYS: &[&str] = &[
    "temperature_c",
    "salinity",
    "pressure_dbar",
    "ph_total",
    "ph_seawater",
    "ph_free",
    "alkalinity_umol_kg",
    "dic_umol_kg",
    "co2_umol_kg",
    "hco3_umol_kg",
    "co3_umol_kg",
    "fco2_uatm",
    "pco2_uatm",
    "xco2_ppm",
    "omega_calcite",
    "omega_aragonite",
    "si_calcite",
    "si_aragonite",
    "revelle_factor",
    "borate_alkalinity_umol_kg",
    "hydroxide_umol_kg",
    "phosphate_alkalinity_umol_kg",
    "silicate_alkalinity_umol_kg",
    "ammonia_alkalinity_umol_kg",
    "sulfide_alkalinity_umol_kg",
    "alkalinity_mg_l_caco3",
    "dic_mg_l_c",
    "free_co2_mg_l",
    "water",
    "constants",
    "warnings",
];

#[test]
fn json_has_every_contract_key() {
    let o = solve(&[
        "--alkalinity",
        "2300umol/kg",
        "--dic",
        "2000umol/kg",
        "--json",
    ]);
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).expect("one JSON object");
    let obj = v.as_object().expect("an object");
    for key in CONTRACT_KEYS {
        assert!(obj.contains_key(*key), "missing key {key}");
    }
    assert_eq!(v["water"], "saline");
    assert_eq!(v["constants"]["carbonic"], "lueker2000");
    // Nothing that may be wrong: only the notes of the exchange with the
    // air, whose inputs (air CO2, barometric pressure, wind) were not given.
    let codes: Vec<&str> = v["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .inspect(|w| assert_eq!(w["severity"], "note", "{w}"))
        .map(|w| w["code"].as_str().unwrap())
        .collect();
    assert_eq!(
        codes,
        [
            "air_co2_default",
            "barometric_default",
            "transfer_velocity_not_given"
        ]
    );
    // equations.md §13 worked value (computed from the published equations).
    approx::assert_abs_diff_eq!(v["ph_total"].as_f64().unwrap(), 8.0402, epsilon = 5e-4);
}

#[test]
fn spaced_units_and_trade_units_are_read() {
    let o = solve(&[
        "--alkalinity",
        "117.79 mg/L as CaCO3",
        "--ph",
        "8.0402",
        "--ph-scale",
        "total",
        "--json",
    ]);
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    // 117.79 mg/L CaCO3 at 1023.34 kg/m3 is 2300.0 µmol/kg (conversion, computed).
    approx::assert_abs_diff_eq!(
        v["alkalinity_umol_kg"].as_f64().unwrap(),
        2300.0,
        epsilon = 0.2
    );
}

#[test]
fn table_is_aligned_with_units() {
    let o = solve(&["--alkalinity", "2300umol/kg", "--dic", "2000umol/kg"]);
    assert_eq!(o.status.code(), Some(0));
    let out = stdout(&o);
    assert!(out.contains("pH, total scale"));
    assert!(out.contains("µatm") && out.contains("mg/L as CaCO3"));
    // Values in one section start in the same column.
    let cols: Vec<usize> = out
        .lines()
        .filter(|l| l.contains("µmol/kg"))
        .map(|l| l.find("µmol/kg").unwrap())
        .collect();
    assert!(
        cols.windows(2).all(|w| w[0] == w[1]),
        "units not aligned: {cols:?}"
    );
}

#[test]
fn output_conditions_keep_dic_and_alkalinity() {
    let o = solve(&[
        "--alkalinity",
        "2300umol/kg",
        "--ph",
        "7.9",
        "--ph-scale",
        "total",
        "--at-temperature",
        "9",
        "--at-pressure",
        "120",
        "--json",
    ]);
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert_eq!(v["temperature_c"], 9.0);
    assert_eq!(v["pressure_dbar"], 120.0);
    let m = &v["as_measured"];
    assert_eq!(m["temperature_c"], 25.0);
    let (d1, d2) = (
        v["dic_umol_kg"].as_f64().unwrap(),
        m["dic_umol_kg"].as_f64().unwrap(),
    );
    assert!((d1 - d2).abs() < 1e-6);
}

#[test]
fn two_root_pairs_warn_and_can_choose() {
    let o = solve(&[
        "--alkalinity",
        "2300umol/kg",
        "--co3",
        "250umol/kg",
        "--json",
    ]);
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    let natural = v["ph_total"].as_f64().unwrap();
    assert_eq!(v["warnings"][0]["code"], "other_root");
    assert!(v["warnings"][0]["message"]
        .as_str()
        .unwrap()
        .contains("also fits"));
    let o = solve(&[
        "--alkalinity",
        "2300umol/kg",
        "--co3",
        "250umol/kg",
        "--root",
        "higher-ph",
        "--json",
    ]);
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert!(v["ph_total"].as_f64().unwrap() > natural + 1.0);
}

fn assert_usage_error(extra: &[&str], flag: &str, words: &str) {
    let o = solve(extra);
    let err = stderr(&o);
    assert_eq!(o.status.code(), Some(2), "args {extra:?}: stderr {err}");
    assert!(
        err.contains(flag),
        "args {extra:?}: `{flag}` not named in: {err}"
    );
    assert!(
        err.contains(words),
        "args {extra:?}: `{words}` not in: {err}"
    );
    assert!(stdout(&o).is_empty());
}

#[test]
fn missing_unit_errored() {
    assert_usage_error(
        &["--alkalinity", "2300", "--dic", "2000umol/kg"],
        "--alkalinity",
        "accepted units: umol/kg",
    );
}

#[test]
fn three_parameters_errored() {
    assert_usage_error(
        &[
            "--alkalinity",
            "2300umol/kg",
            "--dic",
            "2000umol/kg",
            "--ph",
            "8",
        ],
        "--alkalinity, --dic, --ph",
        "exactly two",
    );
}

#[test]
fn incompatible_pair_errored() {
    assert_usage_error(
        &["--pco2", "400uatm", "--xco2", "410ppm"],
        "--pco2, --xco2",
        "same information",
    );
}

#[test]
fn temperature_300_errored() {
    let o = travertine(&[
        "solve",
        "--ph",
        "8",
        "--dic",
        "2000umol/kg",
        "--temperature",
        "300",
        "--salinity",
        "35",
    ]);
    assert_eq!(o.status.code(), Some(2));
    let err = stderr(&o);
    assert!(
        err.contains("--temperature") && err.contains("300"),
        "{err}"
    );
}

#[test]
fn ph_20_errored() {
    assert_usage_error(&["--ph", "20", "--dic", "2000umol/kg"], "--ph", "0 to 14");
}

#[test]
fn negative_dic_errored() {
    assert_usage_error(&["--ph", "8", "--dic", "-5umol/kg"], "--dic", "-5");
}

#[test]
fn impossible_pair_errored() {
    assert_usage_error(
        &["--dic", "2000umol/kg", "--co3", "3000umol/kg"],
        "--dic, --co3",
        "no water fits",
    );
}

#[test]
fn unknown_fit_errored() {
    assert_usage_error(
        &[
            "--ph",
            "8",
            "--dic",
            "2000umol/kg",
            "--carbonic",
            "guesswork2024",
        ],
        "--carbonic",
        "lueker2000",
    );
}

#[test]
fn wrong_unit_errored() {
    assert_usage_error(
        &["--ph", "8", "--dic", "2000 mg/L CaCO3"],
        "--dic",
        "mg/L C",
    );
}

#[test]
fn missing_temperature_is_a_usage_error() {
    let o = travertine(&["solve", "--ph", "8", "--dic", "2000umol/kg"]);
    assert_eq!(o.status.code(), Some(2));
    assert!(stderr(&o).contains("--temperature"));
}

/// The JSON keys the interface contract names for fresh water (../shared/design.md).
#[test]
fn fresh_json_has_its_contract_keys() {
    let o = travertine(&[
        "solve",
        "--ph",
        "7.6",
        "--alkalinity",
        "120 mg/L CaCO3",
        "--temperature",
        "22",
        "--conductivity",
        "420uS/cm",
        "--calcium",
        "48 mg/L Ca",
        "--json",
    ]);
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    for key in [
        "ph_nbs",
        "ionic_strength",
        "langelier_index",
        "free_co2_mg_l",
        "dic_mg_l_c",
        "alkalinity_mg_l_caco3",
        "si_calcite",
        "pco2_uatm",
    ] {
        assert!(
            v[key].is_number(),
            "{key} missing or not a number: {}",
            v[key]
        );
    }
    assert_eq!(v["water"], "fresh");
    assert_eq!(v["constants"]["carbonic"], "plummer-busenberg1982");
    // The pH given comes back: the fresh solve takes it through the H+
    // activity and back, so to the last bit or so. (The exact comparison
    // passed only while serde_json parsed 7.6000000000000005 as 7.6; the
    // tests now parse numbers exactly, feature `float_roundtrip`.)
    assert!(
        (v["ph_nbs"].as_f64().unwrap() - 7.6).abs() < 1e-12,
        "{}",
        v["ph_nbs"]
    );
}

#[test]
fn saline_fit_in_fresh_water_errored() {
    let o = travertine(&[
        "solve",
        "--ph",
        "7.6",
        "--alkalinity",
        "120 mg/L CaCO3",
        "--temperature",
        "22",
        "--water",
        "fresh",
        "--boron",
        "lee2010",
    ]);
    assert_eq!(o.status.code(), Some(2));
    let err = stderr(&o);
    assert!(
        err.contains("--boron") && err.contains("saline water only"),
        "{err}"
    );
}

#[test]
fn hardness_is_not_taken_as_calcium() {
    let o = travertine(&[
        "solve",
        "--ph",
        "7.5",
        "--alkalinity",
        "100 mg/L CaCO3",
        "--temperature",
        "20",
        "--hardness",
        "150 mg/L CaCO3",
        "--json",
    ]);
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert!(v["omega_calcite"].is_null());
    let warnings = v["warnings"].to_string();
    assert!(warnings.contains("not taken as calcium"), "{warnings}");
}

/// The arguments of a plain sea-water solve.
fn sea_solve_args() -> Vec<&'static str> {
    let mut args = vec![
        "solve",
        "--alkalinity",
        "2300umol/kg",
        "--dic",
        "2000umol/kg",
    ];
    args.extend_from_slice(&SEA);
    args
}

/// A full disk under standard output is one line on standard error and exit
/// code 1; it used to panic (exit code 101).
#[test]
#[cfg(target_os = "linux")]
fn a_full_disk_under_the_result_is_an_error_not_a_panic() {
    let full = std::fs::OpenOptions::new()
        .write(true)
        .open("/dev/full")
        .expect("/dev/full exists on Linux");
    let o = Command::new(env!("CARGO_BIN_EXE_travertine"))
        .args(sea_solve_args())
        .stdout(full)
        .output()
        .expect("the binary runs");
    assert_eq!(o.status.code(), Some(1), "stderr: {}", stderr(&o));
    assert!(
        stderr(&o).contains("could not be written"),
        "{}",
        stderr(&o)
    );
    assert!(!stderr(&o).contains("panicked"));
}

/// A full standard error (the message of an error cannot be shown) keeps
/// the exit code of the error and does not panic.
#[test]
#[cfg(target_os = "linux")]
fn a_full_standard_error_keeps_the_exit_code() {
    let full = std::fs::OpenOptions::new()
        .write(true)
        .open("/dev/full")
        .expect("/dev/full exists on Linux");
    let o = Command::new(env!("CARGO_BIN_EXE_travertine"))
        .args(["solve", "--alkalinity", "2300umol/kg"])
        .args(SEA)
        .stderr(full)
        .output()
        .expect("the binary runs");
    assert_eq!(o.status.code(), Some(2));
}

/// A closed standard output (`>&-`) is one line on standard error and exit
/// code 1; it used to be exit code 0 with the result lost (the Rust runtime
/// puts /dev/null in place of a closed stream before `main`).
#[test]
#[cfg(unix)]
fn a_closed_standard_output_is_an_error() {
    use std::os::unix::process::CommandExt;
    let mut command = Command::new(env!("CARGO_BIN_EXE_travertine"));
    command.args(sea_solve_args());
    // SAFETY: close is async-signal-safe and only closes the child's fd 1.
    unsafe {
        command.pre_exec(|| {
            libc::close(1);
            Ok(())
        });
    }
    let o = command.output().expect("the binary runs");
    assert_eq!(o.status.code(), Some(1));
    assert_eq!(
        stderr(&o),
        "travertine: standard output is closed (as with >&-), so nothing could be written to \
         it; send the result to a file or a pipe\n"
    );
    // Sent to /dev/null on purpose, the result is written there: no error.
    let o = Command::new(env!("CARGO_BIN_EXE_travertine"))
        .args(sea_solve_args())
        .stdout(std::process::Stdio::null())
        .output()
        .expect("the binary runs");
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
}

/// A reader that goes away at once (as `| head -c 10` does) ends the
/// command quietly: exit code 0, never a panic.
#[test]
fn a_reader_that_goes_away_ends_the_command_quietly() {
    for _ in 0..20 {
        let mut child = Command::new(env!("CARGO_BIN_EXE_travertine"))
            .args(sea_solve_args())
            .stdout(std::process::Stdio::piped())
            .stderr(std::process::Stdio::piped())
            .spawn()
            .expect("the binary runs");
        drop(child.stdout.take());
        let o = child.wait_with_output().expect("the binary ends");
        assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    }
}

/// An oyster-hatchery intake (invented: S 28, 21 °C, alkalinity 1950
/// µmol/kg, pH 7.92 from a hand-held meter). Without a scale the pH is
/// refused in saline water, naming --ph-scale and how to choose; stated,
/// the scale decides whether Ω aragonite passes 1.5 (the NBS reading gives
/// less than 1.5, the same number on the total scale more: computed with
/// this crate's constants, and the review found 1.35 and 1.72).
#[test]
fn a_saline_ph_without_its_scale_is_refused_and_the_scale_matters() {
    let hatchery = |extra: &[&str]| {
        let mut args = vec![
            "solve",
            "--temperature",
            "21",
            "--salinity",
            "28",
            "--alkalinity",
            "1950umol/kg",
            "--ph",
            "7.92",
            "--json",
        ];
        args.extend_from_slice(extra);
        travertine(&args)
    };
    let o = hatchery(&[]);
    assert_eq!(o.status.code(), Some(2));
    let err = stderr(&o);
    assert!(err.contains("--ph-scale"), "{err}");
    assert!(
        err.contains("nbs for a meter calibrated with NBS/IUPAC buffers"),
        "{err}"
    );
    assert!(err.contains("total for spectrophotometric"), "{err}");
    let omega = |scale: &str| {
        let o = hatchery(&["--ph-scale", scale]);
        assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
        let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
        v["omega_aragonite"].as_f64().unwrap()
    };
    let (nbs, total) = (omega("nbs"), omega("total"));
    assert!(nbs < 1.5 && total > 1.5, "nbs {nbs}, total {total}");
}

/// A solve of an invented pond (22 °C, fresh, alkalinity 120 mg/L as
/// CaCO3, pH 7.6), with more flags.
fn pond_solve(extra: &[&str]) -> Output {
    pond_solve_at("7.6", extra)
}

/// The invented pond of [`pond_solve`] at another pH.
fn pond_solve_at(ph: &str, extra: &[&str]) -> Output {
    let mut args = vec![
        "solve",
        "--temperature",
        "22",
        "--water",
        "fresh",
        "--alkalinity",
        "120 mg/L CaCO3",
        "--ph",
        ph,
    ];
    args.extend_from_slice(extra);
    travertine(&args)
}

/// In fresh water a pH without a scale is NBS, as before.
#[test]
fn a_fresh_ph_without_its_scale_is_nbs() {
    let o = pond_solve(&["--json"]);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let v: serde_json::Value = serde_json::from_str(&stdout(&o)).unwrap();
    assert!((v["ph_nbs"].as_f64().unwrap() - 7.6).abs() < 1e-9);
}

/// The table leads with what the user of each medium asks first, and with
/// --at-temperature gives the requested conditions first and the state as
/// measured in a short block beneath; the old option names are gone.
#[test]
fn the_table_leads_with_the_key_figures_of_its_medium() {
    let pond = pond_solve(&["--calcium", "48 mg/L Ca", "--at-temperature", "30"]);
    assert_eq!(pond.status.code(), Some(0), "{}", stderr(&pond));
    let text = stdout(&pond);
    let lines: Vec<&str> = text.lines().collect();
    assert!(lines[0].starts_with("fresh water at 30 °C"), "{text}");
    assert_eq!(lines[2], "Key figures");
    for (line, label) in lines[3..9].iter().zip([
        "pH, NBS scale",
        "free CO2",
        "pCO2",
        "alkalinity",
        "calcite SI",
        "Langelier index",
    ]) {
        assert!(line.trim_start().starts_with(label), "{line} / {label}");
    }
    let measured = text
        .find("As measured: fresh water at 22 °C")
        .expect("a measured block");
    assert!(measured > text.find("Medium").unwrap_or(0), "{text}");
    let old = travertine(&[
        "solve",
        "--temperature",
        "22",
        "--alkalinity",
        "120 mg/L CaCO3",
        "--ph",
        "7.6",
        "--output-temperature",
        "30",
    ]);
    assert_eq!(old.status.code(), Some(2));
}

/// Inputs that saline water would drop are refused, not ignored; a calcium
/// fraction without a hardness, and calcium above the total hardness, are
/// refused with the reason.
#[test]
fn ignored_or_contradictory_inputs_are_refused() {
    let sea = |extra: &[&str]| {
        let mut args = sea_solve_args();
        args.extend_from_slice(extra);
        travertine(&args)
    };
    for (flag, value) in [
        ("--tds", "300 mg/L"),
        ("--ionic-strength", "0.01"),
        ("--hardness", "100 mg/L CaCO3"),
        ("--magnesium", "10 mg/L Mg"),
    ] {
        let o = sea(&[flag, value]);
        assert_eq!(o.status.code(), Some(2), "{flag}");
        let err = stderr(&o);
        assert!(
            err.contains(flag) && err.contains("fresh water only"),
            "{err}"
        );
    }
    let pond = pond_solve;
    let o = pond(&["--calcium-fraction", "0.6"]);
    assert_eq!(o.status.code(), Some(2));
    assert!(stderr(&o).contains("--hardness"), "{}", stderr(&o));
    let o = pond(&[
        "--calcium",
        "120 mg/L CaCO3",
        "--hardness",
        "100 mg/L CaCO3",
    ]);
    assert_eq!(o.status.code(), Some(2));
    assert!(
        stderr(&o).contains("more than the total hardness"),
        "{}",
        stderr(&o)
    );
    let o = pond(&["--calcium", "80 mg/L CaCO3", "--hardness", "100 mg/L CaCO3"]);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
}

/// The rows of a table: (label, value, unit) of each line `  label  value
/// unit` (the fits of the Constants block have no unit; warnings are left
/// out).
fn table_rows(text: &str) -> Vec<(String, String, String)> {
    text.lines()
        .filter(|l| l.starts_with("  ") && !l.starts_with("  - "))
        .map(|l| {
            let parts: Vec<&str> = l
                .split("  ")
                .map(str::trim)
                .filter(|p| !p.is_empty())
                .collect();
            (
                parts[0].to_string(),
                parts.get(1).unwrap_or(&"").to_string(),
                parts.get(2).unwrap_or(&"").to_string(),
            )
        })
        .collect()
}

/// The value of the row of this label and unit.
fn cell<'a>(rows: &'a [(String, String, String)], label: &str, unit: &str) -> &'a str {
    rows.iter()
        .find(|(l, _, u)| l == label && u == unit)
        .map(|(_, v, _)| v.as_str())
        .unwrap_or_else(|| panic!("no row `{label}` in {unit:?}: {rows:?}"))
}

/// No number of the table is written with an exponent.
fn assert_no_exponent(text: &str, what: &str) {
    for (label, value, _) in table_rows(text) {
        let number = value.starts_with(|c: char| c.is_ascii_digit() || c == '-');
        assert!(
            !(number && value.contains(['e', 'E'])),
            "{what}: {label} = {value}\n{text}"
        );
    }
}

/// The table writes each figure to the digits its measurement supports:
/// pH to 3 decimals, pCO2 to 4 significant figures, mg/L to 3 (a small
/// free CO2 as 0.00xyz, not with an exponent). Before, pH had 4 decimals,
/// pCO2 2 and small values an exponent (`4.082e-3`).
#[test]
fn the_table_writes_each_figure_to_its_digits() {
    let sea = ["--alkalinity", "2300umol/kg", "--dic", "2000umol/kg"];
    let o = solve(&sea);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let text = stdout(&o);
    let rows = table_rows(&text);
    let json: serde_json::Value =
        serde_json::from_slice(&solve(&[&sea[..], &["--json"]].concat()).stdout).unwrap();
    let ph = cell(&rows, "pH, total scale", "");
    let (int, dec) = ph.split_once('.').expect("a decimal point");
    assert!(int.len() == 1 && dec.len() == 3, "pH {ph}");
    assert!((ph.parse::<f64>().unwrap() - json["ph_total"].as_f64().unwrap()).abs() <= 5e-4);
    let pco2 = cell(&rows, "pCO2", "µatm");
    assert!(has_figures(pco2, 4), "pCO2 {pco2}");
    assert!((pco2.parse::<f64>().unwrap() - json["pco2_uatm"].as_f64().unwrap()).abs() <= 0.05);
    assert!(has_figures(cell(&rows, "free CO2", "mg/L"), 3));
    assert_no_exponent(&text, "sea water");

    // An invented lime-dosed pond at pH 10.1: little free CO2.
    let pond = |extra: &[&str]| pond_solve_at("10.1", extra);
    let json: serde_json::Value = serde_json::from_slice(&pond(&["--json"]).stdout).unwrap();
    let free = json["free_co2_mg_l"].as_f64().unwrap();
    assert!((0.001..0.01).contains(&free), "{free}");
    let o = pond(&[]);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let text = stdout(&o);
    // Three significant figures of a value below 0.01 are five decimals.
    assert_eq!(
        cell(&table_rows(&text), "free CO2", "mg/L"),
        format!("{free:.5}")
    );
    assert_no_exponent(&text, "the pond at pH 10.1");
}

/// No figure of the table of any demo pond (tables/demo/larkvane_ponds.csv)
/// or of sea water has an exponent; before, the small alkalinity parts had
/// one (`2.755e-4`).
#[test]
fn no_exponent_in_the_tables_of_the_demo_ponds_and_sea_water() {
    let path = concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tables/demo/larkvane_ponds.csv"
    );
    let mut reader = csv::Reader::from_path(path).expect("the demo sheet");
    let mut solved = 0;
    for record in reader.records() {
        let r = record.expect("CSV");
        let (t, sc, ph, alk, ca, tan) = (&r[3], &r[4], &r[5], &r[6], &r[7], &r[8]);
        let conductivity = format!("{sc} uS/cm@25C");
        let alkalinity = format!("{alk} mg/L CaCO3");
        let calcium = format!("{ca} mg/L CaCO3");
        let ammonia = format!("{tan} mg/L N");
        let o = travertine(&[
            "solve",
            "--temperature",
            t,
            "--conductivity",
            &conductivity,
            "--ph",
            ph,
            "--alkalinity",
            &alkalinity,
            "--calcium",
            &calcium,
            "--ammonia",
            &ammonia,
        ]);
        // The planted defects (an empty alkalinity, `7..9`) are refused.
        if o.status.code() != Some(0) {
            continue;
        }
        solved += 1;
        assert_no_exponent(&stdout(&o), &format!("{} {} {}", &r[0], &r[1], &r[2]));
    }
    assert_eq!(solved, 46, "48 rows, two of them refused");
    for extra in [
        &["--alkalinity", "2300umol/kg", "--dic", "2000umol/kg"][..],
        &["--ph", "7.6", "--ph-scale", "total", "--pco2", "1200uatm"][..],
        &[
            "--ph",
            "8.3",
            "--ph-scale",
            "total",
            "--alkalinity",
            "2300umol/kg",
        ][..],
    ] {
        let o = solve(extra);
        assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
        assert_no_exponent(&stdout(&o), &format!("{extra:?}"));
    }
}

/// `--digits full` writes every figure of the table as the shortest text
/// that reads back as exactly the f64 of the JSON, in both media.
#[test]
fn full_digits_in_the_table_read_back_as_the_json() {
    use travertine::output::Output;
    use travertine::Medium;
    let sea: Vec<&str> = [
        "solve",
        "--alkalinity",
        "2300umol/kg",
        "--dic",
        "2000umol/kg",
    ]
    .into_iter()
    .chain(SEA)
    .collect();
    let pond: Vec<&str> = [
        "solve",
        "--temperature",
        "24.3",
        "--conductivity",
        "415 uS/cm@25C",
        "--ph",
        "7.52",
        "--alkalinity",
        "117 mg/L CaCO3",
        "--calcium",
        "83 mg/L CaCO3",
        "--ammonia",
        "0.41 mg/L N",
    ]
    .into_iter()
    .collect();
    for (args, medium) in [(sea, Medium::Saline), (pond, Medium::Fresh)] {
        let json: serde_json::Value =
            serde_json::from_slice(&travertine(&[&args[..], &["--json"]].concat()).stdout)
                .expect("JSON");
        let o = travertine(&[&args[..], &["--digits", "full"]].concat());
        assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
        let text = stdout(&o);
        let rows = table_rows(&text);
        let mut checked = 0;
        for o in Output::ALL {
            let Some(label) = o.label_in(medium) else {
                continue;
            };
            let Some(expected) = json[o.key()].as_f64() else {
                continue;
            };
            let shown = cell(&rows, label, o.unit());
            let got: f64 = shown
                .parse()
                .unwrap_or_else(|_| panic!("{}: `{shown}`", o.key()));
            assert_eq!(got.to_bits(), expected.to_bits(), "{}: `{shown}`", o.key());
            checked += 1;
        }
        assert!(checked > 25, "{medium:?}: {checked} rows checked");
        // The salinity of the header line too (computed from the
        // conductivity in the pond).
        let salinity = json["salinity"].as_f64().unwrap();
        let first = text.lines().next().unwrap();
        assert!(first.contains(&format!("salinity {salinity}, ")), "{first}");
        assert_no_exponent(&text, "full digits");
    }
    // A choice that is not one is refused, naming the flag.
    let o = solve(&[
        "--alkalinity",
        "2300umol/kg",
        "--dic",
        "2000umol/kg",
        "--digits",
        "all",
    ]);
    assert_eq!(o.status.code(), Some(2));
    assert!(
        stderr(&o).contains("--digits") && stderr(&o).contains("sensible, full"),
        "{}",
        stderr(&o)
    );
}
