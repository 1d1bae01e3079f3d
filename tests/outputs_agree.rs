//! The outputs are described once (src/output/fields.rs): the JSON of
//! `travertine solve --json` and the computed columns of
//! `travertine sheet --columns all` must name the same outputs and give
//! them the same values, for one saline water and one fresh water with
//! calcium.
//!
//! The two commands are two routes through the same library, so the values
//! are compared with each other, not with a reference: with `--digits full`
//! every sheet cell reads back as exactly the f64 of the JSON (a round trip
//! of the text), and with the default digits every cell is the JSON value
//! written to its output's precision rule (`Output::digits`). The sheet's
//! JSON lines always give every digit.

use std::collections::BTreeSet;
use std::process::Output;

mod common;
fn run(args: &[&str], input: Option<&[u8]>) -> Output {
    let o = common::run_travertine(args, input);
    assert_eq!(
        o.status.code(),
        Some(0),
        "{args:?}: {}",
        String::from_utf8_lossy(&o.stderr)
    );
    o
}

/// One water given both ways: as flags of `solve`, and as a one-row sheet
/// whose headers are spellings with units (so no input column shares a name
/// with a computed one). The values are demo data.
struct Case {
    name: &'static str,
    flags: &'static [&'static str],
    sheet: &'static str,
}

const SALINE: Case = Case {
    name: "saline",
    flags: &[
        "--temperature",
        "25",
        "--salinity",
        "35",
        "--alkalinity",
        "2300 umol/kg",
        "--dic",
        "2000 umol/kg",
    ],
    sheet: "Temp (°C),Practical salinity,Alkalinity (umol/kg),DIC (umol/kg)\n25,35,2300,2000\n",
};

const FRESH_WITH_CALCIUM: Case = Case {
    name: "fresh with calcium",
    flags: &[
        "--temperature",
        "24.3",
        "--conductivity",
        "415 uS/cm@25C",
        "--ph",
        "7.52",
        "--ph-scale",
        "nbs",
        "--alkalinity",
        "117 mg/L CaCO3",
        "--calcium",
        "83 mg/L CaCO3",
        "--ammonia",
        "0.41 mg/L N",
        "--wind",
        "3.2",
        "--air-co2",
        "428",
        "--barometric",
        "988 hPa",
    ],
    sheet: "Temp (°C),Specific conductance (µS/cm),pH (NBS),Alkalinity (mg/L as CaCO3),\
            Calcium hardness (mg/L as CaCO3),TAN (mg/L),Wind (m/s),Air CO2 (ppm),\
            Barometric (hPa)\n24.3,415,7.52,117,83,0.41,3.2,428,988\n",
};

/// The outputs that are texts rather than numbers.
const TEXT_KEYS: [&str; 5] = [
    "water",
    "ionic_strength_from",
    "carbonic_fit",
    "equilibrium_ph_scale",
    "gas_transfer",
];

/// The JSON object of `solve --json` for the case.
fn solved(case: &Case) -> serde_json::Map<String, serde_json::Value> {
    let mut args = vec!["solve", "--json"];
    args.extend_from_slice(case.flags);
    let o = run(&args, None);
    let v: serde_json::Value = serde_json::from_slice(&o.stdout).expect("one JSON object");
    v.as_object().expect("an object").clone()
}

/// The computed columns of `sheet --columns all --digits DIGITS` for the
/// case: header and cell, without the input columns passed through,
/// `status` and `message`.
fn sheeted(case: &Case, digits: &str) -> Vec<(String, String)> {
    let o = run(
        &[
            "sheet",
            "-",
            "-o",
            "-",
            "--columns",
            "all",
            "--digits",
            digits,
        ],
        Some(case.sheet.as_bytes()),
    );
    let mut reader = csv::Reader::from_reader(&o.stdout[..]);
    let header: Vec<String> = reader
        .headers()
        .expect("a header")
        .iter()
        .map(String::from)
        .collect();
    let rows: Vec<csv::StringRecord> = reader.records().map(|r| r.expect("CSV")).collect();
    assert_eq!(rows.len(), 1, "{}: one row", case.name);
    let row = &rows[0];
    let inputs = case
        .sheet
        .lines()
        .next()
        .map_or(0, |h| h.split(',').count());
    let n = header.len();
    assert!(n >= inputs + 2, "{}: header {header:?}", case.name);
    assert_eq!(
        &header[n - 2..],
        ["status", "message"],
        "{}: status and message close the row",
        case.name
    );
    assert_eq!(&row[n - 2], "ok", "{}: {}", case.name, &row[n - 1]);
    // The input columns come through first, unchanged.
    let given: Vec<&str> = case
        .sheet
        .lines()
        .next()
        .map(|h| h.split(',').collect())
        .unwrap_or_default();
    assert_eq!(&header[..inputs], given.as_slice(), "{}", case.name);
    (inputs..n - 2)
        .map(|i| (header[i].clone(), row[i].to_string()))
        .collect()
}

/// The codes of the `flags` array of a `solve --json` object.
fn flag_codes(json: &serde_json::Map<String, serde_json::Value>) -> Vec<String> {
    json["flags"]
        .as_array()
        .expect("flags is an array")
        .iter()
        .map(|f| f["code"].as_str().expect("a code").to_string())
        .collect()
}

fn check(case: &Case) {
    let json = solved(case);
    let mut columns = sheeted(case, "full");
    // The flags column (issue 11) holds the codes of the JSON's `flags`
    // array, separated by `;`; the other columns are outputs.
    let at = columns
        .iter()
        .position(|(k, _)| k == "flags")
        .unwrap_or_else(|| panic!("{}: no flags column with --columns all", case.name));
    let (_, flags_cell) = columns.remove(at);
    assert_eq!(
        flags_cell,
        flag_codes(&json).join(";"),
        "{}: flags",
        case.name
    );

    // The keys: numbers or null, plus the text outputs.
    let json_keys: BTreeSet<&str> = json
        .iter()
        .filter(|(k, v)| v.is_number() || v.is_null() || TEXT_KEYS.contains(&k.as_str()))
        .map(|(k, _)| k.as_str())
        .collect();
    let column_keys: BTreeSet<&str> = columns.iter().map(|(k, _)| k.as_str()).collect();
    assert_eq!(
        columns.len(),
        column_keys.len(),
        "{}: a column twice",
        case.name
    );
    assert_eq!(
        json_keys, column_keys,
        "{}: JSON keys (left) and sheet columns (right) differ",
        case.name
    );
    for key in TEXT_KEYS {
        assert!(
            json.contains_key(key),
            "{}: no `{key}` in the JSON",
            case.name
        );
    }

    // The values.
    for (key, cell) in &columns {
        match &json[key] {
            serde_json::Value::Null => {
                assert!(
                    cell.is_empty(),
                    "{}: {key} null in JSON, `{cell}` in the sheet",
                    case.name
                )
            }
            serde_json::Value::String(s) => {
                assert_eq!(cell, s, "{}: {key}", case.name)
            }
            serde_json::Value::Number(x) => {
                let expected = x.as_f64().expect("a finite number");
                let got: f64 = cell
                    .parse()
                    .unwrap_or_else(|_| panic!("{}: {key} = `{cell}` in the sheet", case.name));
                assert_eq!(
                    got.to_bits(),
                    expected.to_bits(),
                    "{}: {key}: solve {x}, sheet `{cell}`",
                    case.name
                );
            }
            other => panic!("{}: {key} is {other} in the JSON", case.name),
        }
    }

    // JSON lines always have every digit, whatever the digits asked for.
    let o = run(
        &["sheet", "-", "--columns", "all", "--format", "jsonl"],
        Some(case.sheet.as_bytes()),
    );
    let line: serde_json::Value = serde_json::from_slice(&o.stdout).expect("one JSON line");
    let codes: Vec<String> = line["flags"]
        .as_array()
        .expect("flags is an array in JSON lines")
        .iter()
        .map(|c| c.as_str().expect("a code").to_string())
        .collect();
    assert_eq!(
        codes,
        flag_codes(&json),
        "{}: flags in JSON lines",
        case.name
    );
    for (key, _) in &columns {
        if let Some(x) = json[key].as_f64() {
            let got = line[key]
                .as_f64()
                .unwrap_or_else(|| panic!("{key}: {}", line[key]));
            assert_eq!(
                got.to_bits(),
                x.to_bits(),
                "{}: {key} in JSON lines",
                case.name
            );
        }
    }

    // With the default digits each number is the JSON value to its rule.
    for (key, cell) in sheeted(case, "sensible") {
        if key == "flags" {
            continue;
        }
        let Some(x) = json[&key].as_f64() else {
            continue;
        };
        let digits = travertine::output::Output::from_key(&key)
            .and_then(|o| o.digits())
            .unwrap_or_else(|| panic!("{key}: a number without digits"));
        assert_eq!(cell, digits.format(x), "{}: {key}", case.name);
    }
}

#[test]
fn saline_json_keys_are_the_sheet_columns() {
    check(&SALINE);
    // The saline water has no fresh-water figures: null, not absent.
    let json = solved(&SALINE);
    assert!(json["ionic_strength_from"].is_null());
    assert!(json["gamma_monovalent"].is_null());
    assert_eq!(json["water"], "saline");
}

#[test]
fn fresh_json_keys_are_the_sheet_columns() {
    check(&FRESH_WITH_CALCIUM);
    // The water is fresh and has calcium, so its calcium figures are numbers.
    let json = solved(&FRESH_WITH_CALCIUM);
    assert_eq!(json["water"], "fresh");
    assert!(json["langelier_index"].is_number());
    assert!(json["cahco3_umol_kg"].is_number());
    assert!(json["ionic_strength_from"].is_string());
    // With a wind and the air's CO2, the exchange is complete.
    assert!(json["co2_flux_mmol_m2_d"].is_number());
    assert_eq!(json["gas_transfer"], "cole-caraco1998");
    assert_eq!(json["equilibrium_ph_scale"], "nbs");
}
