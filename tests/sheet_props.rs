//! Properties of the sheet reader that hold for every input:
//! - rows in = rows out, in order, whatever the cells hold (random sheets
//!   with random bad cells, ragged rows, quotes and line breaks in fields);
//! - no input, however broken, makes it panic (arbitrary bytes, alone or
//!   after a valid header).

use proptest::prelude::*;
use travertine::sheet::{process, Format, SheetOptions};

/// A cell of a numeric column: usually valid, often not.
fn cell(valid: std::ops::Range<f64>) -> impl Strategy<Value = String> {
    prop_oneof![
        6 => valid.prop_map(|v| format!("{v:.3}")),
        1 => Just(String::new()),
        1 => Just("NA".to_string()),
        1 => prop::sample::select(vec!["7..9", "abc", "NaN", "inf", "-5", "1e999", "15", "0", "78 F", "\u{fffd}"])
            .prop_map(str::to_string),
        1 => (-1e6f64..1e6).prop_map(|v| v.to_string()),
    ]
}

/// A free-text cell that needs quoting now and then.
fn note() -> impl Strategy<Value = String> {
    prop_oneof![
        Just(String::new()),
        "[a-z ]{0,12}",
        Just("a, b".to_string()),
        Just("say \"hi\"".to_string()),
        Just("two\nlines".to_string()),
    ]
}

/// One data row: id, temperature, salinity, alkalinity, pH, pCO2, note;
/// sometimes fields are dropped or added.
fn row() -> impl Strategy<Value = (Vec<String>, i8)> {
    (
        cell(0.0..35.0),
        cell(0.0..40.0),
        cell(100.0..3000.0),
        cell(6.5..9.0),
        cell(100.0..2000.0),
        note(),
        prop_oneof![8 => Just(0i8), 1 => Just(-3i8), 1 => Just(2i8)],
    )
        .prop_map(|(t, s, ta, ph, pco2, n, ragged)| (vec![t, s, ta, ph, pco2, n], ragged))
}

fn quote(field: &str) -> String {
    if field.contains([',', '"', '\n']) {
        format!("\"{}\"", field.replace('"', "\"\""))
    } else {
        field.to_string()
    }
}

fn sheet(rows: &[(Vec<String>, i8)]) -> String {
    let mut text =
        String::from("id,temperature_c,salinity,alkalinity_umol_kg,ph_total,pco2_uatm,notes\n");
    for (i, (cells, ragged)) in rows.iter().enumerate() {
        let mut fields = vec![format!("r{i}")];
        fields.extend(cells.iter().map(|c| quote(c)));
        match *ragged {
            r if r < 0 => fields.truncate(fields.len().saturating_sub((-r) as usize).max(1)),
            r if r > 0 => fields.extend((0..r).map(|k| format!("extra{k}"))),
            _ => {}
        }
        text.push_str(&fields.join(","));
        text.push('\n');
    }
    text
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(96))]

    #[test]
    fn rows_in_equal_rows_out_in_order(rows in prop::collection::vec(row(), 0..60)) {
        let input = sheet(&rows);
        let mut out = Vec::new();
        let summary = process(&SheetOptions::default(), input.as_bytes(), &mut out).unwrap();
        prop_assert_eq!(summary.rows as usize, rows.len());
        prop_assert_eq!(summary.ok + summary.warning + summary.error, summary.rows);
        let records: Vec<csv::StringRecord> = csv::ReaderBuilder::new()
            .has_headers(true)
            .from_reader(&out[..])
            .records()
            .map(|r| r.unwrap())
            .collect();
        prop_assert_eq!(records.len(), rows.len());
        for (i, r) in records.iter().enumerate() {
            let id = format!("r{i}");
            prop_assert_eq!(r.get(0), Some(id.as_str()));
            let status = r.get(r.len() - 2).unwrap();
            prop_assert!(["ok", "warning", "error"].contains(&status), "status {}", status);
        }
    }

    #[test]
    fn rows_in_equal_rows_out_as_json_lines(rows in prop::collection::vec(row(), 0..30)) {
        let input = sheet(&rows);
        let mut out = Vec::new();
        let options = SheetOptions::default().with_format(Format::Jsonl);
        process(&options, input.as_bytes(), &mut out).unwrap();
        let text = String::from_utf8(out).unwrap();
        let lines: Vec<&str> = text.lines().collect();
        prop_assert_eq!(lines.len(), rows.len());
        for (i, line) in lines.iter().enumerate() {
            let v: serde_json::Value = serde_json::from_str(line).unwrap();
            let id = format!("r{i}");
            prop_assert_eq!(v["id"].as_str(), Some(id.as_str()));
        }
    }

}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(400))]

    #[test]
    fn arbitrary_bytes_never_panic(bytes in prop::collection::vec(any::<u8>(), 0..600)) {
        let _ = process(&SheetOptions::default(), &bytes[..], Vec::new());
    }

    #[test]
    fn arbitrary_bytes_after_a_header_never_panic(
        bytes in prop::collection::vec(
            prop_oneof![
                4 => prop::sample::select(b"0123456789.,;-+eE \"\n\r".to_vec()),
                1 => any::<u8>(),
            ],
            0..600,
        ),
        semicolon in any::<bool>(),
        decimal_comma in any::<bool>(),
        json in any::<bool>(),
    ) {
        let d = if semicolon { ';' } else { ',' };
        let mut input = format!(
            "temperature_c{d}Salinity{d}Alkalinity (mg/L as CaCO3){d}pH (NBS){d}pco2_uatm{d}note\n"
        )
        .into_bytes();
        input.extend(&bytes);
        let options = SheetOptions::default()
            .with_delimiter(&d.to_string())
            .unwrap()
            .with_decimal_comma(decimal_comma)
            .with_format(if json { Format::Jsonl } else { Format::Csv });
        let mut out = Vec::new();
        let summary = process(&options, &input[..], &mut out).unwrap();
        if json {
            prop_assert_eq!(
                String::from_utf8(out).unwrap().lines().count() as u64,
                summary.rows
            );
        }
    }
}
