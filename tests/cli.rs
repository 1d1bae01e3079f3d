//! Drives the built `travertine` binary from the outside: the contract keys
//! of `solve --json`, the table, and the error paths (exit code 2, a message
//! naming the bad flag).

use std::process::{Command, Output};

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
    assert!(v["warnings"].as_array().unwrap().is_empty());
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
    assert_eq!(v["ph_nbs"], 7.6);
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
    let mut args = vec![
        "solve",
        "--temperature",
        "22",
        "--water",
        "fresh",
        "--alkalinity",
        "120 mg/L CaCO3",
        "--ph",
        "7.6",
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
