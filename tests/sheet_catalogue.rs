//! A catalogue of malformed field sheets, each with the exact message the
//! sheet gives: for the whole file (the sheet stops before any row) or in
//! the `status` and `message` cells of the bad row (the batch goes on).
//!
//! Where a message comes from the library (a range check, "no water
//! fits"), the expected text is built from the library's own error for the
//! same values, so the test pins down exactly what the sheet adds.

use travertine::sheet::{process, SheetError, SheetOptions, Summary};
use travertine::{Conditions, Measured, Medium, PhScale, Water};

/// The output rows (header first) and the summary.
fn run(input: &[u8], options: &SheetOptions) -> (Vec<Vec<String>>, Summary) {
    let mut out = Vec::new();
    let summary = process(options, input, &mut out).expect("the sheet runs");
    (rows(&out, b','), summary)
}

fn rows(out: &[u8], delimiter: u8) -> Vec<Vec<String>> {
    csv::ReaderBuilder::new()
        .has_headers(false)
        .delimiter(delimiter)
        .from_reader(out)
        .byte_records()
        .map(|r| {
            r.expect("the output is CSV")
                .iter()
                .map(|f| String::from_utf8_lossy(f).into_owned())
                .collect()
        })
        .collect()
}

/// The status and message of data row `i` (0 is the first data row).
fn outcome(rows: &[Vec<String>], i: usize) -> (String, String) {
    let header = &rows[0];
    let row = &rows[i + 1];
    assert_eq!(row.len(), header.len(), "row {i} is as wide as the header");
    let at = |name: &str| {
        let k = header.iter().rposition(|h| h == name).expect(name);
        row[k].clone()
    };
    (at("status"), at("message"))
}

fn fails(input: &[u8], options: &SheetOptions) -> SheetError {
    process(options, input, Vec::new()).expect_err("the sheet stops")
}

const SEA: &str = "temperature_c,salinity,alkalinity_umol_kg,ph_total\n";

fn sea_row(cells: &str) -> Vec<u8> {
    format!("{SEA}{cells}\n").into_bytes()
}

fn default() -> SheetOptions {
    SheetOptions::default()
}

#[test]
fn a_missing_unit_errored() {
    let e = fails(
        b"temperature_c,salinity,Alkalinity,ph_total\n25,35,2300,8\n",
        &default(),
    );
    assert_eq!(e.exit_code(), 2);
    assert_eq!(
        e.to_string(),
        "column `Alkalinity`: the header gives no unit for alkalinity; accepted: umol/kg, \
         mmol/kg, mol/kg, umol/L, mmol/L, mol/L, mg/L CaCO3; ppm for mg/L in a sheet header. Write \
         the unit in the header (for example `alkalinity_mg_l_caco3`), or map the column by hand: --map \
         alkalinity_mg_l_caco3=\"Alkalinity\""
    );
}

#[test]
fn an_ambiguous_unit_errored() {
    let e = fails(
        b"Temp (C),Alkalinity (mg/L),pH (NBS)\n25,120,8\n",
        &default(),
    );
    assert_eq!(
        e.to_string(),
        "column `Alkalinity (mg/L)`: `mg/l` does not say what alkalinity is expressed as (write \
         mg/L as CaCO3); accepted: umol/kg, mmol/kg, mol/kg, umol/L, mmol/L, mol/L, mg/L CaCO3; \
         ppm for mg/L in a sheet header. Write the unit in the header (for example `alkalinity_mg_l_caco3`), or map the column \
         by hand: --map alkalinity_mg_l_caco3=\"Alkalinity (mg/L)\""
    );
}

/// The trade writes salinity in ppt (‰): it is read as practical
/// salinity, never silently: the summary carries a note on the column.
#[test]
fn salinity_in_ppt_is_read_as_practical_salinity_with_a_note() {
    let input = b"Temp (C),Salinity (ppt),Alkalinity (umol/kg),pH (total)\n25,35,2300,8\n";
    let (rows, summary) = run(input, &default());
    assert_eq!(outcome(&rows, 0).0, "ok");
    assert_eq!(summary.unit_notes.len(), 1, "{summary:?}");
    assert!(
        summary.unit_notes[0].starts_with("column `Salinity (ppt)`: read as practical salinity"),
        "{:?}",
        summary.unit_notes
    );
    assert!(summary
        .to_string()
        .contains("note: column `Salinity (ppt)`"));
    // The same water with the salinity as written in psu: the same answer.
    let (psu, quiet) = run(
        b"Temp (C),Salinity (psu),Alkalinity (umol/kg),pH (total)\n25,35,2300,8\n",
        &default(),
    );
    assert_eq!(rows[1], psu[1]);
    assert!(quiet.unit_notes.is_empty());
}

/// `ppm` is the trade's mg/L: read as mg/L with a note; plain `ppm` for
/// alkalinity says no more than plain mg/L does, and is refused the same way.
#[test]
fn ppm_is_read_as_mg_per_litre_with_a_note() {
    let ppm = b"Temp (C),Alkalinity (ppm CaCO3),pH (NBS),TAN (ppm)\n20,85,7.9,0.5\n";
    let mgl = b"Temp (C),Alkalinity (mg/L CaCO3),pH (NBS),TAN (mg/L)\n20,85,7.9,0.5\n";
    let (a, summary) = run(ppm, &default());
    let (b, _) = run(mgl, &default());
    assert_eq!(a[1], b[1]);
    assert_eq!(summary.unit_notes.len(), 2, "{summary:?}");
    assert!(summary
        .unit_notes
        .iter()
        .all(|n| n.contains("ppm read as mg/L")));
    let e = fails(
        b"Temp (C),Alkalinity (ppm),pH (NBS)\n20,85,7.9\n",
        &default(),
    );
    assert!(
        e.to_string()
            .contains("does not say what alkalinity is expressed as"),
        "{e}"
    );
}

#[test]
fn an_unknown_header_passes_through_and_no_pair_errored() {
    let e = fails(
        b"site,Temp (C),Alk titration,pH (NBS)\nA,25,120,8\n",
        &default(),
    );
    assert_eq!(e.exit_code(), 2);
    assert_eq!(
        e.to_string(),
        "no pair of carbonate parameters can be formed: the sheet gives ph (column `pH (NBS)`). \
         A pair is two of alkalinity, dic, ph, pco2, fco2, xco2, co2, hco3, co3 (at most one of \
         pco2, fco2, xco2, co2), each from a column with its unit in the header (such as \
         `alkalinity_mg_l_caco3`, `ph_nbs`, `Alkalinity (mg/L as CaCO3)`) or from --set. \
         Columns passed through unread: `site`, `Alk titration` (--map NAME=HEADER reads one)"
    );
}

#[test]
fn an_unknown_header_can_be_mapped() {
    let options = default()
        .with_map("alkalinity_mg_l_caco3=Alk titration")
        .unwrap();
    let (rows, summary) = run(
        b"site,Temp (C),Alk titration,pH (NBS)\nA,25,120,8\n",
        &options,
    );
    assert_eq!(summary.error, 0);
    // Fresh water without calcium: computed, with the library's notes on
    // what was not given; notes leave the row `ok`.
    let (status, message) = outcome(&rows, 0);
    assert_eq!(status, "ok");
    assert!(message.contains("calcium not given"), "{message}");
    assert_eq!(summary.passed_through, vec!["site".to_string()]);
}

#[test]
fn a_map_to_a_missing_header_errored() {
    let options = default().with_map("alkalinity_mg_l_caco3=Alk").unwrap();
    let e = fails(&sea_row("25,35,2300,8"), &options);
    assert_eq!(
        e.to_string(),
        "--map: alkalinity_mg_l_caco3=Alk: the sheet has no column `Alk`; its columns are \
         `temperature_c`, `salinity`, `alkalinity_umol_kg`, `ph_total`"
    );
}

#[test]
fn a_non_numeric_cell_errored() {
    let (rows, summary) = run(&sea_row("25,35,2300,abc"), &default());
    assert_eq!(
        outcome(&rows, 0),
        (
            "error".into(),
            "column `ph_total`: `abc` is not a number".into()
        )
    );
    assert_eq!(
        summary.messages[0].message,
        "column `ph_total`: not a number"
    );
}

#[test]
fn a_typo_with_two_points_errored() {
    let (rows, _) = run(&sea_row("25,35,2300,7..9"), &default());
    assert_eq!(
        outcome(&rows, 0).1,
        "column `ph_total`: `7..9` is not a number"
    );
}

#[test]
fn an_empty_cell_errored() {
    let (rows, summary) = run(&sea_row(",35,2300,8"), &default());
    assert_eq!(
        outcome(&rows, 0),
        (
            "error".into(),
            "column `temperature_c` is empty: the row has no temperature".into()
        )
    );
    assert_eq!(summary.messages[0].message, "no temperature");
    let (rows, _) = run(&sea_row("25,35,,8"), &default());
    assert_eq!(
        outcome(&rows, 0).1,
        "only ph is given in this row (empty: `alkalinity_umol_kg`); a pair needs two carbonate \
         parameters"
    );
}

#[test]
fn not_measured_marks_are_empty_cells() {
    let (rows, _) = run(&sea_row("25,35,NA,8"), &default());
    assert_eq!(
        outcome(&rows, 0).1,
        "only ph is given in this row (empty: `alkalinity_umol_kg`); a pair needs two carbonate \
         parameters"
    );
}

#[test]
fn a_row_with_too_many_fields_errored() {
    let (rows, summary) = run(&sea_row("25,35,2300,8,extra,\"x, y\""), &default());
    assert_eq!(
        outcome(&rows, 0),
        (
            "error".into(),
            "the row has 6 fields, the header has 4; the extra fields are `extra`, `x, y`".into()
        )
    );
    assert_eq!(summary.error, 1);
}

#[test]
fn a_row_with_too_few_fields_errored() {
    let (rows, _) = run(&sea_row("25,35"), &default());
    assert_eq!(
        outcome(&rows, 0).1,
        "the row has 2 fields, the header has 4"
    );
    // The row is padded to the width of the header.
    assert_eq!(&rows[1][..4], &["25", "35", "", ""]);
}

#[test]
fn an_empty_row_errored() {
    let (rows, _) = run(&sea_row(",,,"), &default());
    assert_eq!(
        outcome(&rows, 0),
        ("error".into(), "the row is empty".into())
    );
}

#[test]
fn a_byte_order_mark_is_read_and_kept() {
    let mut input = b"\xEF\xBB\xBF".to_vec();
    input.extend(sea_row("25,35,2300,8"));
    let mut out = Vec::new();
    let summary = process(&default(), &input[..], &mut out).unwrap();
    assert_eq!(summary.ok, 1);
    assert!(out.starts_with(b"\xEF\xBB\xBFtemperature_c,salinity,"));
}

#[test]
fn crlf_line_endings_are_read_and_kept() {
    let input =
        b"temperature_c,salinity,alkalinity_umol_kg,ph_total\r\n25,35,2300,8\r\n25,35,2300,8.1\r\n";
    let mut out = Vec::new();
    let summary = process(&default(), &input[..], &mut out).unwrap();
    assert_eq!((summary.rows, summary.ok), (2, 2));
    let text = String::from_utf8(out).unwrap();
    assert_eq!(text.matches("\r\n").count(), 3);
    assert_eq!(text.matches('\n').count(), 3);
}

#[test]
fn quoted_fields_with_commas_pass_through() {
    let input = b"site,\"Alkalinity, umol/kg\",temperature_c,salinity,ph_total\n\
                  \"Bay, north \"\"A\"\"\",2300,25,35,8\n";
    let mut out = Vec::new();
    let summary = process(&default(), &input[..], &mut out).unwrap();
    assert_eq!(summary.ok, 1);
    let text = String::from_utf8(out).unwrap();
    assert!(text.starts_with("site,\"Alkalinity, umol/kg\",temperature_c"));
    assert!(text
        .lines()
        .nth(1)
        .unwrap()
        .starts_with("\"Bay, north \"\"A\"\"\",2300,25,35,8,saline,"));
}

#[test]
fn a_semicolon_separator_errored_without_delimiter() {
    let input = b"temperature_c;salinity;alkalinity_umol_kg;ph_total\n25;35;2300;8\n";
    let e = fails(input, &default());
    assert_eq!(
        e.to_string(),
        "no pair of carbonate parameters can be formed: the sheet gives no carbonate parameter. \
         A pair is two of alkalinity, dic, ph, pco2, fco2, xco2, co2, hco3, co3 (at most one of \
         pco2, fco2, xco2, co2), each from a column with its unit in the header (such as \
         `alkalinity_mg_l_caco3`, `ph_nbs`, `Alkalinity (mg/L as CaCO3)`) or from --set. \
         Columns passed through unread: `temperature_c;salinity;alkalinity_umol_kg;ph_total` \
         (--map NAME=HEADER reads one). The header is a single column containing ';': if that \
         separates the columns, give --delimiter ';'"
    );
    let options = default().with_delimiter(";").unwrap();
    let mut out = Vec::new();
    let summary = process(&options, &input[..], &mut out).unwrap();
    assert_eq!(summary.ok, 1);
    assert!(String::from_utf8(out).unwrap().contains(";status;message"));
}

#[test]
fn a_decimal_comma_errored_without_the_flag() {
    let input = "temperature_c;salinity;alkalinity_umol_kg;ph_total\n25;35;2300;7,9\n";
    let options = default().with_delimiter(";").unwrap();
    let mut out = Vec::new();
    process(&options, input.as_bytes(), &mut out).unwrap();
    let rows = rows(&out, b';');
    assert_eq!(
        outcome(&rows, 0).1,
        "column `ph_total`: `7,9` is not a number (a decimal comma? give --decimal-comma)"
    );
    let options = options
        .with_decimal_comma(true)
        .with_columns("ph_total")
        .unwrap();
    let mut out = Vec::new();
    let summary = process(&options, input.as_bytes(), &mut out).unwrap();
    assert_eq!(summary.ok, 1);
    let text = String::from_utf8(out).unwrap();
    // The input as typed, the computed pH to three decimals, with a comma.
    assert_eq!(text.lines().nth(1), Some("25;35;2300;7,9;7,900;ok;"));
}

#[test]
fn nan_and_infinity_errored() {
    for text in ["NaN", "inf", "-Infinity"] {
        let (rows, _) = run(&sea_row(&format!("25,35,2300,{text}")), &default());
        assert_eq!(
            outcome(&rows, 0).1,
            format!("column `ph_total`: `{text}` is not a finite number")
        );
    }
}

#[test]
fn a_negative_alkalinity_errored() {
    let (rows, _) = run(&sea_row("25,35,-5,8"), &default());
    let library = Measured::alkalinity_umol_kg(-5.0).unwrap_err();
    assert_eq!(
        outcome(&rows, 0).1,
        format!("column `alkalinity_umol_kg` (`-5`): {library}")
    );
    assert!(library.to_string().contains("-5"));
}

#[test]
fn ph_0_and_ph_15_errored() {
    let (rows, _) = run(&sea_row("25,35,2300,15"), &default());
    let library = Measured::ph(15.0, Some(PhScale::Total)).unwrap_err();
    assert_eq!(
        outcome(&rows, 0).1,
        format!("column `ph_total` (`15`): {library}")
    );
    // pH 0 is inside the range of a pH, but with an alkalinity it needs an
    // impossible DIC: no water fits.
    let (rows, _) = run(&sea_row("25,35,2300,0"), &default());
    let (status, message) = outcome(&rows, 0);
    assert_eq!(status, "error");
    assert!(
        message.starts_with(
            "no water fits alkalinity = 2300 µmol/kg with ph = 0 (total): the DIC would be "
        ) && message.ends_with(" µmol/kg, beyond the accepted 0.001 to 100000 µmol/kg"),
        "{message}"
    );
}

#[test]
fn a_temperature_out_of_range_errored() {
    let (rows, _) = run(&sea_row("-5,35,2300,8"), &default());
    // The range of saline water, the medium of the row (−2 to 50 °C).
    let library = Medium::Saline.check_temperature_c(-5.0).unwrap_err();
    assert!(library.to_string().contains("-2 to 50 °C"), "{library}");
    assert_eq!(
        outcome(&rows, 0).1,
        format!("column `temperature_c` (`-5`): {library}")
    );
}

#[test]
fn a_temperature_in_fahrenheit_is_caught() {
    // Written with its unit: an error.
    let input = b"Temp (C),Salinity,Alkalinity (umol/kg),pH (total)\n78 F,35,2300,8\n";
    let (rows, _) = run(input, &default());
    assert_eq!(
        outcome(&rows, 0).1,
        "column `Temp (C)`: `78 F` is in °F, but the column is in °C; write the value in °C"
    );
    // Written as a bare number: computed, with a caution.
    let input = b"Temp (C),Specific conductance (uS/cm),Alkalinity (mg/L as CaCO3),pH (NBS)\n\
                  78,400,120,8\n";
    let (rows, summary) = run(input, &default());
    let (status, message) = outcome(&rows, 0);
    assert_eq!(status, "warning");
    assert!(
        message.starts_with(
            "column `Temp (C)`: 78 °C is warmer than natural waters usually are; if it was read \
             in °F it is 25.6 °C, so check the cell"
        ),
        "{message}"
    );
    assert_eq!(
        summary.messages[0].message,
        "column `Temp (C)`: above 40 °C (a reading in °F?)"
    );
}

#[test]
fn an_incompatible_pair_errored() {
    let e = default().with_pair("pco2,xco2").unwrap_err();
    assert_eq!(
        e.to_string(),
        "--pair: pco2 and xco2 carry the same information (the dissolved CO2); a pair may hold \
         at most one of pco2, fco2, xco2, co2"
    );
    // A row left with two gases only.
    let input = b"temperature_c,salinity,ph_total,pco2_uatm,xco2_ppm\n25,35,,400,410\n";
    let (rows, _) = run(input, &default());
    assert_eq!(
        outcome(&rows, 0).1,
        "only pco2 and xco2 are given in this row (empty: `ph_total`); they carry the same \
         information (the dissolved CO2), so a pair needs one of alkalinity, dic, ph, hco3, co3 \
         as well"
    );
}

#[test]
fn an_impossible_pair_errored() {
    let input = b"temperature_c,salinity,dic_umol_kg,co3_umol_kg\n25,35,2000,3000\n";
    let (rows, _) = run(input, &default());
    let library = Water::saline(Conditions::new(25.0, 35.0).unwrap())
        .unwrap()
        .solve(
            Measured::dic_umol_kg(2000.0).unwrap(),
            Measured::co3_umol_kg(3000.0).unwrap(),
        )
        .unwrap_err();
    assert_eq!(outcome(&rows, 0), ("error".into(), library.to_string()));
    assert!(library.to_string().starts_with("no water fits"));
}

#[test]
fn a_huge_field_is_shortened_in_messages() {
    let long = format!("{}x", "7".repeat(99_999));
    let notes = "n".repeat(1_000_000);
    let input = format!("{SEA}25,35,2300,{long}\n");
    let (rows, _) = run(input.as_bytes(), &default());
    assert_eq!(
        outcome(&rows, 0).1,
        format!(
            "column `ph_total`: `{}… (100000 bytes)` is not a number",
            "7".repeat(40)
        )
    );
    // A huge pass-through field is kept whole.
    let input = format!("notes,{SEA}{notes},25,35,2300,8\n");
    let (rows, summary) = run(input.as_bytes(), &default());
    assert_eq!(summary.ok, 1);
    assert_eq!(rows[1][0].len(), 1_000_000);
}

#[test]
fn invalid_utf8_passes_through_and_errors_only_where_read() {
    let input = b"site,temperature_c,salinity,alkalinity_umol_kg,ph_total\n\
                  Baie \xE9t\xE9,25,35,2300,8\n\
                  b,25,35,2300,8\xFF\n";
    let mut out = Vec::new();
    let summary = process(&default(), &input[..], &mut out).unwrap();
    assert_eq!((summary.ok, summary.error), (1, 1));
    // The Latin-1 bytes of the site name come back unchanged.
    let site = b"\nBaie \xE9t\xE9,25,35,";
    assert!(out.windows(site.len()).any(|w| w == site));
    let rows = rows(&out, b',');
    assert_eq!(
        outcome(&rows, 1).1,
        "column `ph_total`: `8\u{fffd}` is not a number"
    );
}

#[test]
fn an_empty_file_errored() {
    for input in [&b""[..], b"\n\n", b"\xEF\xBB\xBF"] {
        let e = fails(input, &default());
        assert_eq!(e.exit_code(), 2);
        assert_eq!(
            e.to_string(),
            "the input is empty: a sheet needs a header row naming its columns"
        );
    }
}

#[test]
fn a_header_only_file_gives_a_header_only_output() {
    let mut out = Vec::new();
    let summary = process(&default(), SEA.as_bytes(), &mut out).unwrap();
    assert_eq!(summary.rows, 0);
    let text = String::from_utf8(out).unwrap();
    assert_eq!(text.lines().count(), 1);
    assert!(text.starts_with("temperature_c,salinity,alkalinity_umol_kg,ph_total,water,"));
    assert!(summary
        .to_string()
        .contains("the sheet has a header but no data rows"));
}

#[test]
fn two_columns_for_one_quantity_errored() {
    let e = fails(
        b"temperature_c,Temp (F),salinity,alkalinity_umol_kg,ph_total\n",
        &default(),
    );
    assert_eq!(
        e.to_string(),
        "columns `temperature_c` and `Temp (F)` both give temperature; keep one, or pass one \
         through with --map ignore=\"Temp (F)\""
    );
}

#[test]
fn a_set_value_beside_a_column_errored() {
    let options = default().with_set("temperature_c=20").unwrap();
    let e = fails(&sea_row("25,35,2300,8"), &options);
    assert_eq!(
        e.to_string(),
        "--set temperature_c=20: temperature is already given by column `temperature_c`; keep \
         one of them"
    );
}

#[test]
fn a_bad_set_value_errored() {
    let options = default().with_set("salinity=thirty").unwrap();
    let e = fails(
        b"temperature_c,alkalinity_umol_kg,ph_total\n25,2300,8\n",
        &options,
    );
    assert_eq!(e.to_string(), "--set: `salinity`: `thirty` is not a number");
}

#[test]
fn no_temperature_errored() {
    let e = fails(
        b"salinity,alkalinity_umol_kg,ph_total\n35,2300,8\n",
        &default(),
    );
    assert_eq!(
        e.to_string(),
        "no temperature: add a column such as `temperature_c` or `Temp (°C)`, or give one value \
         for every row with --set temperature_c=VALUE"
    );
}

#[test]
fn an_unknown_medium_errored() {
    let input = b"temperature_c,salinity,alkalinity_umol_kg,ph_total,water\n25,35,2300,8,lake\n";
    let (rows, _) = run(input, &default());
    let library = "lake"
        .parse::<travertine::sample::values::MediumChoice>()
        .unwrap_err();
    assert_eq!(outcome(&rows, 0).1, format!("column `water`: {library}"));
}

#[test]
fn a_ph_scale_twice_errored() {
    let options = default().with_set("ph_scale=nbs").unwrap();
    let e = fails(&sea_row("25,35,2300,8"), &options);
    assert_eq!(
        e.to_string(),
        "column `ph_total` gives pH on the total scale, so --set ph_scale=nbs cannot apply; \
         remove one of them"
    );
}

#[test]
fn bad_options_errored() {
    assert_eq!(
        default()
            .with_columns("ph_total,colour")
            .unwrap_err()
            .to_string()[..48],
        *"--columns: `colour` is not a computed column; ac"
    );
    assert_eq!(
        default().with_delimiter("::").unwrap_err().to_string(),
        "--delimiter: `::` cannot separate fields; give one character such as ; or |, or tab"
    );
    assert_eq!(
        default().with_set("temperature_c").unwrap_err().to_string(),
        "--set: `temperature_c` is not NAME=VALUE; for example --set temperature_c=25"
    );
    assert_eq!(
        "xml"
            .parse::<travertine::sheet::Format>()
            .unwrap_err()
            .to_string(),
        "--format: `xml` is not an output format; accepted: csv, jsonl"
    );
}

#[test]
fn one_bad_row_does_not_stop_the_batch() {
    let input = format!("{SEA}25,35,2300,8\n25,35,2300,x\n25,35,2300,8.1\n");
    let (rows, summary) = run(input.as_bytes(), &default());
    assert_eq!(rows.len(), 4);
    assert_eq!((summary.ok, summary.error), (2, 1));
    assert_eq!(outcome(&rows, 0).0, "ok");
    assert_eq!(outcome(&rows, 1).0, "error");
    assert_eq!(outcome(&rows, 2).0, "ok");
    assert_eq!(summary.messages[0].lines, vec![3]);
}

#[test]
fn a_number_with_twenty_digits_regression() {
    // Found by the fuzzer: a long run of digits overflowed the fast reader
    // of plain decimals (a panic in debug builds).
    let (rows, _) = run(&sea_row("25,35,99999999999999999999,8"), &default());
    let library = Measured::alkalinity_umol_kg(1e20).unwrap_err();
    assert_eq!(
        outcome(&rows, 0).1,
        format!("column `alkalinity_umol_kg` (`99999999999999999999`): {library}")
    );
}

#[test]
fn a_column_can_be_passed_through_unread() {
    let options = default().with_map("ignore=Temp (F)").unwrap();
    let input = b"temperature_c,Temp (F),salinity,alkalinity_umol_kg,ph_total\n25,77,35,2300,8\n";
    let (rows, summary) = run(input, &options);
    assert_eq!(summary.ok, 1);
    assert_eq!(summary.passed_through, vec!["Temp (F)".to_string()]);
    assert_eq!(rows[1][1], "77");
}

#[test]
fn repeated_headers_get_distinct_json_keys() {
    let input = b"note,note,temperature_c,salinity,alkalinity_umol_kg,ph_total\na,b,25,35,2300,8\n";
    let options = default().with_format(travertine::sheet::Format::Jsonl);
    let mut out = Vec::new();
    process(&options, &input[..], &mut out).unwrap();
    let v: serde_json::Value = serde_json::from_slice(&out).unwrap();
    assert_eq!(
        (v["note"].as_str(), v["note_2"].as_str()),
        (Some("a"), Some("b"))
    );
}

#[test]
fn ocean_residuals_are_in_umol_per_kg() {
    // The alkalinity of this water from the library, then a sheet whose
    // alkalinity is 5 µmol/kg higher (consistency, not a reference value).
    let state = Water::saline(Conditions::new(25.0, 35.0).unwrap())
        .unwrap()
        .solve(
            Measured::dic_umol_kg(2000.0).unwrap(),
            Measured::ph(8.0, Some(PhScale::Total)).unwrap(),
        )
        .unwrap();
    let input = format!(
        "temperature_c,salinity,dic_umol_kg,ph_total,alkalinity_umol_kg\n25,35,2000,8,{}\n",
        state.alkalinity_umol_kg + 5.0
    );
    let options = default()
        .with_units(travertine::sheet::UnitSystem::Ocean)
        .with_pair("dic,ph")
        .unwrap();
    let (rows, _) = run(input.as_bytes(), &options);
    let k = rows[0]
        .iter()
        .position(|h| h == "alkalinity_umol_kg_residual")
        .expect("a residual column");
    let r: f64 = rows[1][k].parse().unwrap();
    assert!((r - 5.0).abs() < 1e-3, "{r}");
}

/// One plain `pH` column over a saline row and a fresh row (invented
/// values): the fresh row reads it as NBS and is computed; the saline row
/// is an error row that says how to state the scale, and the sheet goes on.
#[test]
fn a_plain_ph_in_a_saline_row_errored_and_the_fresh_row_is_computed() {
    let (rows, summary) = run(
        b"site,temperature_c,salinity,alkalinity_umol_kg,pH\n\
          intake,21,28,1950,7.92\n\
          pond,21,0.2,1950,7.92\n",
        &default(),
    );
    assert_eq!((summary.error, summary.rows), (1, 2));
    let (status, message) = outcome(&rows, 0);
    assert_eq!(status, "error");
    assert!(message.contains("pH scale is not stated"), "{message}");
    assert!(message.contains("`pH (NBS)`"), "{message}");
    assert!(message.contains("--ph-scale"), "{message}");
    let (status, _) = outcome(&rows, 1);
    assert_eq!(status, "ok");
}

/// `--set water=saline` with a plain `pH` column: every row would be
/// refused, so the sheet stops before solving, with the same advice.
#[test]
fn a_plain_ph_column_in_saline_water_errored_before_solving() {
    let options = default().with_set("water=saline").unwrap();
    let e = fails(
        b"temperature_c,salinity,alkalinity_umol_kg,pH\n21,28,1950,7.92\n",
        &options,
    );
    let text = e.to_string();
    assert!(text.contains("column `pH` in saline water"), "{text}");
    assert!(text.contains("nbs for a meter"), "{text}");
    assert_eq!(e.exit_code(), 2);
    // Stated, it is computed (NBS in saline water carries its caution).
    let options = options.with_set("ph_scale=nbs").unwrap();
    let (rows, summary) = run(
        b"temperature_c,salinity,alkalinity_umol_kg,pH\n21,28,1950,7.92\n",
        &options,
    );
    assert_eq!(summary.error, 0, "{:?}", outcome(&rows, 0));
}
