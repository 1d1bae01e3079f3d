//! Depth profiles: a depth (`--depth`, a depth column) becomes the pressure
//! P = ρ g z; a depth with a pressure is refused; in fresh water the
//! pressure correction is a note where it is small and a warning where it
//! is not (`travertine::flow::FRESH_PRESSURE_CAUTION`).

use std::process::Output;
use travertine::base::warning::Severity;
use travertine::properties::density::density_kg_m3;
use travertine::sample::inputs::{Input, Total};
use travertine::sample::Sample;
use travertine::Parameter;

/// Standard gravity, m/s²: the conventional value of the 3rd CGPM (1901),
/// kept in ISO 80000-3.
const STANDARD_GRAVITY: f64 = 9.80665;

const LAKE: &str = "tables/demo/larkvane_reservoir_profile.csv";

mod common;
fn travertine(args: &[&str], input: Option<&str>) -> Output {
    common::run_travertine(args, Some(input.unwrap_or_default().as_bytes()))
}

fn stdout(o: &Output) -> String {
    String::from_utf8_lossy(&o.stdout).into_owned()
}

fn stderr(o: &Output) -> String {
    String::from_utf8_lossy(&o.stderr).into_owned()
}

/// The cells of a column of a CSV text, by header.
fn column(text: &str, name: &str) -> Vec<String> {
    let mut rdr = csv::Reader::from_reader(text.as_bytes());
    let k = rdr
        .headers()
        .expect("header")
        .iter()
        .position(|h| h == name)
        .unwrap_or_else(|| panic!("no column {name} in {text}"));
    rdr.records()
        .map(|r| r.expect("CSV")[k].to_string())
        .collect()
}

/// ρ g z in dbar, by hand: the density of the crate (Millero & Poisson
/// 1981, EOS-80, at one atmosphere) and standard gravity.
fn rho_g_z(salinity: f64, temperature_c: f64, depth_m: f64) -> f64 {
    density_kg_m3(salinity, temperature_c).unwrap() * STANDARD_GRAVITY * depth_m / 1e4
}

fn close(a: f64, b: f64) -> bool {
    (a - b).abs() <= 1e-12 * b.abs().max(1.0)
}

#[test]
fn a_depth_column_gives_the_pressure_the_docs_state() {
    let sheet = "temperature_c,salinity,Depth (m),alkalinity_umol_kg,ph_total\n\
                 10,0.1,100,1000,7.5\n\
                 4,0.05,0,500,7.0\n\
                 5,35,1000,2300,7.9\n\
                 20,33,12.5,2250,8.0\n";
    let o = travertine(
        &[
            "sheet",
            "-",
            "--columns",
            "pressure_dbar",
            "--digits",
            "full",
        ],
        Some(sheet),
    );
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    let out = stdout(&o);
    let pressures: Vec<f64> = column(&out, "pressure_dbar")
        .iter()
        .map(|c| c.parse().expect("a number"))
        .collect();
    let expected = [
        rho_g_z(0.1, 10.0, 100.0),
        0.0,
        rho_g_z(35.0, 5.0, 1000.0),
        rho_g_z(33.0, 20.0, 12.5),
    ];
    for (got, want) in pressures.iter().zip(expected) {
        assert!(close(*got, want), "{got} dbar, by hand {want}");
    }
    assert_eq!(pressures.len(), 4);
    // A depth in feet: the international foot, 0.3048 m exactly.
    let feet = "temperature_c,salinity,depth_ft,alkalinity_umol_kg,ph_nbs\n10,0.1,250,1000,7.5\n";
    let o = travertine(
        &[
            "sheet",
            "-",
            "--columns",
            "pressure_dbar",
            "--digits",
            "full",
        ],
        Some(feet),
    );
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    let p: f64 = column(&stdout(&o), "pressure_dbar")[0].parse().unwrap();
    assert!(close(p, rho_g_z(0.1, 10.0, 250.0 * 0.3048)), "{p}");
}

#[test]
fn depth_in_solve_gives_the_pressure_in_the_json() {
    let o = travertine(
        &[
            "solve",
            "--depth",
            "42",
            "--temperature",
            "9",
            "--salinity",
            "0.2",
            "--ph",
            "7.4",
            "--alkalinity",
            "1.5meq/L",
            "--json",
        ],
        None,
    );
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    let json: serde_json::Value = serde_json::from_slice(&o.stdout).expect("JSON");
    let p = json["pressure_dbar"].as_f64().expect("pressure_dbar");
    assert!(close(p, rho_g_z(0.2, 9.0, 42.0)), "{p}");
    // 42 m of fresh water at 9 °C is 41.2 dbar: a small correction, a note.
    let caution = json["warnings"]
        .as_array()
        .unwrap()
        .iter()
        .find(|w| w["code"] == "fresh_pressure_effect_small")
        .expect("the note on the pressure correction");
    assert_eq!(caution["severity"], "note");
    assert!(caution["message"]
        .as_str()
        .unwrap()
        .contains("at 41.2 dbar"));
    // The table's header gives the computed pressure to 0.1 dbar.
    let o = travertine(
        &[
            "solve",
            "--depth",
            "42",
            "--temperature",
            "9",
            "--salinity",
            "0.2",
            "--ph",
            "7.4",
            "--alkalinity",
            "1.5meq/L",
        ],
        None,
    );
    assert!(
        stdout(&o).starts_with("fresh water at 9 °C, salinity 0.2, 41.2 dbar;"),
        "{}",
        stdout(&o)
    );
    // A depth out of range names the flag and the range.
    let o = travertine(
        &[
            "solve",
            "--depth",
            "-3",
            "--temperature",
            "9",
            "--ph",
            "7.4",
            "--alkalinity",
            "1.5meq/L",
        ],
        None,
    );
    assert_eq!(o.status.code(), Some(2));
    assert!(
        stderr(&o).contains("--depth: depth_m = -3 m is outside the accepted range 0 to 11000 m"),
        "{}",
        stderr(&o)
    );
}

#[test]
fn a_depth_with_a_pressure_is_refused() {
    let o = travertine(
        &[
            "solve",
            "--depth",
            "20",
            "--pressure",
            "20",
            "--temperature",
            "9",
            "--ph",
            "7.4",
            "--alkalinity",
            "1.5meq/L",
        ],
        None,
    );
    assert_eq!(o.status.code(), Some(2));
    assert!(
        stderr(&o).contains("--depth: depth_m and pressure_dbar cannot be used together"),
        "{}",
        stderr(&o)
    );
    // In a sheet, the row that gives both is an error; the others are computed.
    let sheet = "temperature_c,depth_m,pressure_dbar,alkalinity_umol_kg,ph_nbs\n\
                 10,5,,1000,7.5\n\
                 10,,5,1000,7.5\n\
                 10,5,5,1000,7.5\n";
    let o = travertine(&["sheet", "-"], Some(sheet));
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    let out = stdout(&o);
    assert_eq!(column(&out, "status"), ["ok", "ok", "error"]);
    assert!(column(&out, "message")[2].contains("cannot be used together"));
    // And so is every row with a depth when --set gives the pressure.
    let o = travertine(
        &["sheet", "-", "--set", "pressure_dbar=5"],
        Some("temperature_c,depth_m,alkalinity_umol_kg,ph_nbs\n10,5,1000,7.5\n"),
    );
    assert_eq!(column(&stdout(&o), "status"), ["error"]);
}

#[test]
fn the_lake_profile_demo_has_notes_not_warnings_from_pressure() {
    let o = travertine(
        &[
            "sheet",
            LAKE,
            "--columns",
            "pressure_dbar,pco2_uatm,omega_calcite",
        ],
        None,
    );
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    let out = stdout(&o);
    assert_eq!(column(&out, "status"), vec!["ok"; 15]);
    for (depth, (pressure, message)) in column(&out, "Depth (m)").iter().zip(
        column(&out, "pressure_dbar")
            .iter()
            .zip(column(&out, "message")),
    ) {
        let depth: f64 = depth.parse().unwrap();
        let pressure: f64 = pressure.parse().unwrap();
        // Fresh water: about 0.98 dbar per metre (written to 0.1 dbar).
        assert!(
            (pressure - 0.98 * depth).abs() < 0.06,
            "{depth} m: {pressure}"
        );
        assert!(
            message.starts_with("pressure correction small in fresh water: at "),
            "{depth} m: {message}"
        );
    }
    // The depth column is read, not passed through.
    assert!(
        stderr(&o).contains("passed through unread: `Station`, `Date`\n"),
        "{}",
        stderr(&o)
    );
    // Calcite: supersaturated at the surface, undersaturated at the bottom.
    let omega = column(&out, "omega_calcite");
    assert!(omega[0].parse::<f64>().unwrap() > 1.0);
    assert!(omega[14].parse::<f64>().unwrap() < 1.0);
}

/// The bottom water of the demo reservoir at another depth: the last row
/// of the demo sheet.
fn bottom_water(depth_m: f64) -> Sample {
    let mut s = Sample::new(8.5);
    s.set(Input::Carbon(Parameter::Ph), "7.15").unwrap();
    s.set(Input::Carbon(Parameter::Alkalinity), "2.00 meq/L")
        .unwrap();
    s.set(Input::Conductivity, "178 uS/cm").unwrap();
    s.set(Input::Total(Total::Calcium), "38.2 mg/L Ca").unwrap();
    s.set(Input::Depth, &depth_m.to_string()).unwrap();
    s
}

/// The caution on the pressure correction of a sample.
fn pressure_caution(s: &Sample) -> (String, Severity, String) {
    let (a, b) = s.pair().unwrap();
    let state = s.water().unwrap().solve(a, b).unwrap();
    let w = state
        .warnings
        .iter()
        .find(|w| w.code().starts_with("fresh_pressure"))
        .expect("a caution on the pressure correction");
    (w.code().to_string(), w.severity(), w.to_string())
}

/// The depth the docs of `FRESH_PRESSURE_CAUTION` give for the demo's
/// bottom water (171 m, computed with the crate by bisection): a note
/// above it, a warning below it.
#[test]
fn the_pressure_caution_turns_into_a_warning_where_documented() {
    let (code, severity, text) = pressure_caution(&bottom_water(168.0));
    assert_eq!(
        (code.as_str(), severity),
        ("fresh_pressure_effect_small", Severity::Note),
        "{text}"
    );
    let (code, severity, text) = pressure_caution(&bottom_water(174.0));
    assert_eq!(
        (code.as_str(), severity),
        ("fresh_pressure_sea_water_coefficients", Severity::Warning),
        "{text}"
    );
    // The figures in the message: calcite Ω moves most, by just over 2 %.
    assert!(text.contains("calcite Ω by -2.0"), "{text}");
}

#[test]
fn a_deep_row_of_a_profile_still_warns() {
    let lake = std::fs::read_to_string(LAKE).expect("demo sheet");
    let header = lake.lines().next().unwrap();
    let bottom = lake.lines().last().unwrap();
    let deep = bottom.replacen(",20,", ",250,", 1);
    assert_ne!(deep, bottom);
    let sheet = format!("{header}\n{bottom}\n{deep}\n");
    let o = travertine(&["sheet", "-"], Some(&sheet));
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    let out = stdout(&o);
    assert_eq!(column(&out, "status"), ["ok", "warning"]);
    let message = &column(&out, "message")[1];
    assert!(
        message.starts_with(
            "pressure correction in fresh water with sea-water coefficients: at 245.1 dbar"
        ),
        "{message}"
    );
    assert!(stderr(&o).contains("warning: 1"), "{}", stderr(&o));
}
