//! `travertine dose` from the outside: the dose of the invented pond of the
//! README, its JSON, the cautions, and targets out of reach.

use std::process::{Command, Output};

fn travertine(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_travertine"))
        .args(args)
        .current_dir(env!("CARGO_MANIFEST_DIR"))
        .output()
        .expect("the binary runs")
}

/// An invented pond of the demo farm: 0.8 ha, 1.2 m deep, alkalinity
/// 28 mg/L as CaCO3, dawn pH 6.9, calcium 8 mg/L.
fn pond(extra: &[&str]) -> Output {
    let mut args = vec![
        "dose",
        "--temperature",
        "24",
        "--alkalinity",
        "28 mg/L CaCO3",
        "--ph",
        "6.9",
        "--calcium",
        "8 mg/L Ca",
        "--area",
        "0.8 ha",
        "--mean-depth",
        "1.2 m",
    ];
    args.extend_from_slice(extra);
    travertine(&args)
}

fn json(o: &Output) -> serde_json::Value {
    assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    serde_json::from_slice(&o.stdout).expect("JSON")
}

/// 22 mg/L as CaCO3 of alkalinity over 9600 m³ is 0.44 meq/L: 0.44 mmol/L
/// of NaHCO3 at 84.007 g/mol, 99 % pure, is 37.3 g/m³ and 358 kg
/// (stoichiometry; common practice).
#[test]
fn sodium_bicarbonate_for_the_pond() {
    let v = json(&pond(&[
        "--chemical",
        "sodium-bicarbonate",
        "--target",
        "alkalinity=50 mg/L CaCO3",
        "--json",
    ]));
    let g_m3 = v["dose_g_m3"].as_f64().unwrap();
    assert!((g_m3 - 0.44 * 84.007 / 0.99).abs() < 0.05, "{g_m3}");
    let kg = v["dose_total_kg"].as_f64().unwrap();
    assert!((kg - g_m3 * 9.6).abs() < 1e-9, "{kg}");
    let lb = v["dose_total_lb"].as_f64().unwrap();
    assert!((lb - kg / 0.453_592_37).abs() < 1e-9);
    // The state after treatment has the keys of `solve --json`.
    assert!((v["after"]["alkalinity_mg_l_caco3"].as_f64().unwrap() - 50.0).abs() < 1e-6);
    assert!(v["after"]["warnings"].is_array());
    assert!((v["change"]["alkalinity_mg_l_caco3"].as_f64().unwrap() - 22.0).abs() < 1e-6);
    let codes: Vec<&str> = v["cautions"]
        .as_array()
        .unwrap()
        .iter()
        .map(|c| c["code"].as_str().unwrap())
        .collect();
    assert!(codes.contains(&"follow_the_label") && codes.contains(&"split_the_dose"));
}

/// The table carries the cautions too, and the caustic ones for lime.
#[test]
fn the_table_shows_the_cautions() {
    let o = pond(&["--chemical", "hydrated-lime", "--target", "ph=7.5"]);
    assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    let text = String::from_utf8_lossy(&o.stdout);
    assert!(text.contains("Cautions"), "{text}");
    assert!(text.contains("burn skin and eyes"), "{text}");
    assert!(text.contains("kg ("), "{text}");
}

/// A target out of reach exits 2 and says why.
#[test]
fn out_of_reach_exits_2_with_the_reason() {
    let o = pond(&["--chemical", "sodium-bicarbonate", "--target", "ph=9"]);
    assert_eq!(o.status.code(), Some(2));
    let err = String::from_utf8_lossy(&o.stderr);
    assert!(
        err.contains("--target") && err.contains("farthest it goes is"),
        "{err}"
    );
    let o = pond(&[
        "--chemical",
        "sulfuric-acid",
        "--target",
        "alkalinity=40 mg/L CaCO3",
    ]);
    assert_eq!(o.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&o.stderr).contains("only lowers it"));
    let o = pond(&["--chemical", "bleach", "--target", "ph=7"]);
    assert_eq!(o.status.code(), Some(2));
    assert!(String::from_utf8_lossy(&o.stderr).contains("sodium-bicarbonate"));
}

fn csv_rows(out: &[u8]) -> Vec<Vec<String>> {
    csv::ReaderBuilder::new()
        .has_headers(false)
        .from_reader(out)
        .records()
        .map(|r| r.unwrap().iter().map(String::from).collect())
        .collect()
}

/// A sheet of ponds with areas and depths gives one dose per row, rows in
/// equal rows out, each pond's dose the same as `travertine dose` gives it.
#[test]
fn a_sheet_of_ponds_gives_a_dose_per_row() {
    let o = travertine(&[
        "sheet",
        "tables/demo/larkvane_pond_sizes.csv",
        "--dose-chemical",
        "sodium-bicarbonate",
        "--target",
        "alkalinity=50 mg/L CaCO3",
        "--digits",
        "full",
    ]);
    assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    let rows = csv_rows(&o.stdout);
    let input = std::fs::read_to_string(concat!(
        env!("CARGO_MANIFEST_DIR"),
        "/tables/demo/larkvane_pond_sizes.csv"
    ))
    .unwrap();
    assert_eq!(rows.len(), input.lines().count());
    let header = &rows[0];
    let at =
        |row: &Vec<String>, name: &str| row[header.iter().position(|h| h == name).unwrap()].clone();
    let fennel = rows.iter().find(|r| r[0] == "Fennel").unwrap();
    let g_m3: f64 = at(fennel, "dose_g_m3").parse().unwrap();
    let kg: f64 = at(fennel, "dose_total_kg").parse().unwrap();
    // 0.8 ha × 1.2 m = 9600 m³.
    assert!((kg - g_m3 * 9.6).abs() < 1e-9 * kg);
    let single = json(&travertine(&[
        "dose",
        "--temperature",
        "24.0",
        "--conductivity",
        "95 uS/cm@25C",
        "--ph",
        "6.85",
        "--alkalinity",
        "28 mg/L CaCO3",
        "--calcium",
        "20 mg/L CaCO3",
        "--chemical",
        "sodium-bicarbonate",
        "--target",
        "alkalinity=50 mg/L CaCO3",
        "--json",
    ]));
    assert!((single["dose_g_m3"].as_f64().unwrap() - g_m3).abs() < 1e-9 * g_m3);
    // The ponds already above 50 mg/L need none: a note, the row `ok`.
    let alder = rows.iter().find(|r| r[0] == "Alder").unwrap();
    assert_eq!(at(alder, "status"), "ok");
    assert!(at(alder, "message").contains("no dose"), "{alder:?}");
    assert_eq!(at(alder, "dose_g_m3"), "");
}

/// A row whose target is out of reach gets the reason, as a warning, and
/// the batch goes on.
#[test]
fn an_unreachable_row_says_why_and_the_sheet_goes_on() {
    let o = travertine(&[
        "sheet",
        "tables/demo/larkvane_pond_sizes.csv",
        "--dose-chemical",
        "sodium-bicarbonate",
        "--target",
        "ph=9",
    ]);
    assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    let rows = csv_rows(&o.stdout);
    assert_eq!(rows.len(), 6);
    let status = rows[0].iter().position(|h| h == "status").unwrap();
    assert!(rows[1..].iter().all(|r| r[status] == "warning"), "{rows:?}");
    assert!(rows[1..]
        .iter()
        .all(|r| r[status + 1].contains("farthest it goes")));
}

/// Volume columns without a dose are reported unused.
#[test]
fn volume_columns_without_a_dose_are_reported() {
    let o = travertine(&["sheet", "tables/demo/larkvane_pond_sizes.csv"]);
    assert!(o.status.success());
    let err = String::from_utf8_lossy(&o.stderr);
    assert!(
        err.contains("`Area (ha)`") && err.contains("not used"),
        "{err}"
    );
}

/// Saves the JSON of a solve to a file of the test's own folder.
fn saved(name: &str, args: &[&str]) -> std::path::PathBuf {
    let dir = std::env::temp_dir().join(format!("travertine-blend-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let mut all = vec!["solve"];
    all.extend_from_slice(args);
    all.push("--json");
    let o = travertine(&all);
    assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    let path = dir.join(name);
    std::fs::write(&path, &o.stdout).unwrap();
    path
}

/// Two saved results blend 50:50 into a water whose alkalinity and DIC
/// are the means of theirs (1e-12 relative); a share of 1 gives the first
/// water back.
#[test]
fn blending_two_saved_results() {
    // An invented pond and its invented make-up water.
    let pond = saved(
        "pond.json",
        &[
            "--temperature",
            "26",
            "--alkalinity",
            "120 mg/L CaCO3",
            "--ph",
            "7.8",
            "--calcium",
            "40 mg/L Ca",
            "--conductivity",
            "400 uS/cm@25C",
        ],
    );
    let makeup = saved(
        "makeup.json",
        &[
            "--temperature",
            "14",
            "--alkalinity",
            "45 mg/L CaCO3",
            "--ph",
            "7.2",
            "--calcium",
            "12 mg/L Ca",
        ],
    );
    let read = |p: &std::path::Path| -> serde_json::Value {
        serde_json::from_str(&std::fs::read_to_string(p).unwrap()).unwrap()
    };
    let (a, b) = (read(&pond), read(&makeup));
    let blend = |fraction: &str| {
        json(&travertine(&[
            "blend",
            pond.to_str().unwrap(),
            makeup.to_str().unwrap(),
            "--fraction-first",
            fraction,
            "--json",
        ]))
    };
    let half = blend("0.5");
    for key in ["alkalinity_umol_kg", "dic_umol_kg", "calcium_umol_kg"] {
        let mean = 0.5 * (a[key].as_f64().unwrap() + b[key].as_f64().unwrap());
        let got = half[key].as_f64().unwrap();
        assert!(
            ((got - mean) / mean).abs() < 1e-12,
            "{key}: {got} against {mean}"
        );
    }
    let all = blend("1");
    for key in ["ph_nbs", "pco2_uatm", "alkalinity_umol_kg", "omega_calcite"] {
        let (x, y) = (all[key].as_f64().unwrap(), a[key].as_f64().unwrap());
        assert!(((x - y) / y).abs() < 1e-6, "{key}: {x} against {y}");
    }
    let o = travertine(&[
        "blend",
        pond.to_str().unwrap(),
        "no-such.json",
        "--fraction-first",
        "0.5",
    ]);
    assert_eq!(o.status.code(), Some(2));
}
