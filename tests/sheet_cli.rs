//! Drives `travertine sheet` from the outside: the demo sheets, the
//! standard streams, the atomic output file, the input never overwritten,
//! exit codes and the summary on stderr.

use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::{Command, Output, Stdio};

fn travertine(args: &[&str]) -> Output {
    Command::new(env!("CARGO_BIN_EXE_travertine"))
        .args(args)
        .current_dir(env!("CARGO_MANIFEST_DIR"))
        .output()
        .expect("the binary runs")
}

fn with_stdin(args: &[&str], input: &[u8]) -> Output {
    let mut child = Command::new(env!("CARGO_BIN_EXE_travertine"))
        .args(args)
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("the binary runs");
    child
        .stdin
        .take()
        .expect("stdin")
        .write_all(input)
        .expect("input written");
    child.wait_with_output().expect("the binary ends")
}

fn stdout(o: &Output) -> String {
    String::from_utf8_lossy(&o.stdout).into_owned()
}

fn stderr(o: &Output) -> String {
    String::from_utf8_lossy(&o.stderr).into_owned()
}

/// A fresh folder for one test.
fn folder(name: &str) -> PathBuf {
    let dir = Path::new(env!("CARGO_TARGET_TMPDIR")).join(format!("sheet-cli-{name}"));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).expect("folder created");
    dir
}

fn names_in(dir: &Path) -> Vec<String> {
    let mut v: Vec<String> = std::fs::read_dir(dir)
        .expect("folder read")
        .map(|e| e.expect("entry").file_name().to_string_lossy().into_owned())
        .collect();
    v.sort();
    v
}

const POND: &str = "tables/demo/larkvane_ponds.csv";
const LAKE: &str = "tables/demo/larkvane_reservoir_profile.csv";
const SEA: &str =
    "temperature_c,salinity,alkalinity_umol_kg,ph_total\n25,35,2300,8\n25,35,2300,7.9\n";

fn records(text: &str) -> Vec<csv::StringRecord> {
    csv::Reader::from_reader(text.as_bytes())
        .records()
        .map(|r| r.expect("CSV"))
        .collect()
}

fn column(text: &str, name: &str) -> Vec<String> {
    let mut rdr = csv::Reader::from_reader(text.as_bytes());
    let k = rdr
        .headers()
        .expect("header")
        .iter()
        .position(|h| h == name)
        .unwrap_or_else(|| panic!("no column {name}"));
    rdr.records()
        .map(|r| r.expect("CSV")[k].to_string())
        .collect()
}

#[test]
fn the_pond_demo_reports_its_defects() {
    let o = travertine(&["sheet", POND]);
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    let out = stdout(&o);
    let input = std::fs::read_to_string(POND).expect("demo sheet");
    assert_eq!(out.lines().count(), input.lines().count());
    let rows = records(&out);
    assert_eq!(rows.len(), 48, "4 ponds, 6 days, dawn and afternoon");
    let status = column(&out, "status");
    let message = column(&out, "message");
    assert_eq!(status.iter().filter(|s| *s == "error").count(), 2);
    assert_eq!(status.iter().filter(|s| *s == "warning").count(), 1);
    // The blank alkalinity (line 15), the typo (line 24), the °F reading (line 37).
    assert_eq!(
        message[13],
        "only ph is given in this row (empty: `Alkalinity (mg/L as CaCO3)`); a pair needs two \
         carbonate parameters"
    );
    assert_eq!(message[22], "column `pH (NBS)`: `7..9` is not a number");
    assert_eq!(status[35], "warning");
    assert!(
        message[35].starts_with(
            "column `Temp (°C)`: 82.2 °C is warmer than natural waters usually are; if it was \
             read in °F it is 27.9 °C, so check the cell"
        ),
        "{}",
        message[35]
    );
    let err = stderr(&o);
    assert!(
        err.starts_with("rows read: 48; ok: 45; warning: 1; error: 2\n"),
        "{err}"
    );
    assert!(err.contains("passed through unread: `Pond`, `Date`, `Time`, `Notes`"));
    assert!(
        err.contains("error: column `pH (NBS)`: not a number (line 24)"),
        "{err}"
    );
    assert!(err.contains(
        "error: only one carbonate parameter in the row (empty: `Alkalinity (mg/L as CaCO3)`) \
         (line 15)"
    ));
    assert!(err.contains("warning: column `Temp (°C)`: above 40 °C (a reading in °F?) (line 37)"));
    // Every computed row is fresh water with a Langelier index.
    let water = column(&out, "water");
    let lsi = column(&out, "langelier_index");
    for (i, s) in status.iter().enumerate() {
        if s != "error" {
            assert_eq!(water[i], "fresh", "row {i}");
            assert!(lsi[i].parse::<f64>().is_ok(), "row {i}: {}", lsi[i]);
        }
    }
}

#[test]
fn the_lake_profile_demo_runs() {
    let o = travertine(&["sheet", LAKE]);
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    let out = stdout(&o);
    assert_eq!(records(&out).len(), 15);
    assert!(column(&out, "status").iter().all(|s| s != "error"));
    assert_eq!(column(&out, "Depth (m)")[14], "20");
    assert!(stderr(&o).starts_with("rows read: 15; ok: "));
}

#[test]
fn dashes_mean_the_standard_streams() {
    for args in [&["sheet", "-"][..], &["sheet", "-", "-o", "-"]] {
        let o = with_stdin(args, SEA.as_bytes());
        assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
        assert_eq!(records(&stdout(&o)).len(), 2);
        assert!(stderr(&o).starts_with("rows read: 2; ok: 2; warning: 0; error: 0"));
    }
}

#[test]
fn the_output_file_is_complete_and_alone() {
    let dir = folder("output");
    let out = dir.join("results.csv");
    let o = travertine(&["sheet", POND, "-o", out.to_str().unwrap()]);
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    assert!(stdout(&o).is_empty());
    assert_eq!(names_in(&dir), vec!["results.csv".to_string()]);
    let text = std::fs::read_to_string(&out).unwrap();
    assert_eq!(records(&text).len(), 48);
    // Run again: the file is replaced, still alone.
    let o = travertine(&["sheet", LAKE, "-o", out.to_str().unwrap()]);
    assert_eq!(o.status.code(), Some(0));
    assert_eq!(names_in(&dir), vec!["results.csv".to_string()]);
    assert_eq!(records(&std::fs::read_to_string(&out).unwrap()).len(), 15);
}

#[test]
fn a_failed_run_leaves_no_output_file() {
    let dir = folder("failed");
    let input = dir.join("bad.csv");
    std::fs::write(&input, "Temperature,Alkalinity,pH\n25,120,8\n").unwrap();
    let out = dir.join("results.csv");
    let o = travertine(&[
        "sheet",
        input.to_str().unwrap(),
        "-o",
        out.to_str().unwrap(),
    ]);
    assert_eq!(o.status.code(), Some(2));
    assert!(
        stderr(&o).starts_with("travertine sheet: column `Temperature`: the header gives no unit")
    );
    assert_eq!(names_in(&dir), vec!["bad.csv".to_string()]);
    // An earlier output under that name is left as it was.
    std::fs::write(&out, "earlier results\n").unwrap();
    let o = travertine(&[
        "sheet",
        input.to_str().unwrap(),
        "-o",
        out.to_str().unwrap(),
    ]);
    assert_eq!(o.status.code(), Some(2));
    assert_eq!(std::fs::read_to_string(&out).unwrap(), "earlier results\n");
    assert_eq!(
        names_in(&dir),
        vec!["bad.csv".to_string(), "results.csv".to_string()]
    );
}

#[test]
fn a_failure_part_way_leaves_no_output_file() {
    // A reader that fails after the header and some rows.
    struct Failing(std::io::Cursor<Vec<u8>>);
    impl std::io::Read for Failing {
        fn read(&mut self, buf: &mut [u8]) -> std::io::Result<usize> {
            let n = self.0.read(buf)?;
            if n == 0 {
                Err(std::io::Error::other("the device went away"))
            } else {
                Ok(n)
            }
        }
    }
    let dir = folder("partway");
    let out = dir.join("results.csv");
    let mut text = String::from("temperature_c,salinity,alkalinity_umol_kg,ph_total\n");
    for _ in 0..100_000 {
        text.push_str("25,35,2300,8\n");
    }
    let e = travertine::sheet::process_to(
        &travertine::sheet::SheetOptions::default(),
        Failing(std::io::Cursor::new(text.into_bytes())),
        &travertine::sheet::Sink::Path(out.clone()),
    )
    .unwrap_err();
    assert_eq!(e.exit_code(), 1);
    assert!(e.to_string().contains("the device went away"), "{e}");
    assert!(names_in(&dir).is_empty(), "{:?}", names_in(&dir));
}

#[test]
fn the_input_is_never_overwritten() {
    let dir = folder("overwrite");
    let input = dir.join("field.csv");
    std::fs::write(&input, SEA).unwrap();
    let link = dir.join("link.csv");
    std::fs::hard_link(&input, &link).unwrap();
    let dotted = format!("{}/./field.csv", dir.display());
    for target in [
        input.to_str().unwrap(),
        dotted.as_str(),
        link.to_str().unwrap(),
    ] {
        let o = travertine(&["sheet", input.to_str().unwrap(), "-o", target]);
        assert_eq!(o.status.code(), Some(2), "{target}");
        assert_eq!(
            stderr(&o),
            format!(
                "travertine sheet: refusing to write the output over the input file {target}\n"
            )
        );
        assert_eq!(std::fs::read_to_string(&input).unwrap(), SEA);
    }
}

#[test]
fn an_unreadable_input_exits_2() {
    let o = travertine(&["sheet", "no-such-sheet.csv"]);
    assert_eq!(o.status.code(), Some(2));
    assert_eq!(
        stderr(&o),
        "travertine sheet: cannot read no-such-sheet.csv: No such file or directory (os error 2)\n"
    );
    let o = with_stdin(&["sheet", "-"], b"");
    assert_eq!(o.status.code(), Some(2));
    assert_eq!(
        stderr(&o),
        "travertine sheet: the input is empty: a sheet needs a header row naming its columns\n"
    );
    assert!(stdout(&o).is_empty());
}

#[test]
fn no_pair_exits_2_and_says_what_is_missing() {
    let o = with_stdin(&["sheet", "-"], b"site,temperature_c,ph_nbs\na,20,7.5\n");
    assert_eq!(o.status.code(), Some(2));
    assert!(stderr(&o).starts_with(
        "travertine sheet: no pair of carbonate parameters can be formed: the sheet gives ph \
         (column `ph_nbs`)."
    ));
    // A value for every row makes the pair.
    let o = with_stdin(
        &["sheet", "-", "--set", "alkalinity_mg_l_caco3=100"],
        b"site,temperature_c,ph_nbs\na,20,7.5\n",
    );
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
}

#[test]
fn flags_give_conditions_medium_and_fits() {
    let input = b"alkalinity_umol_kg,ph_total\n2300,8\n";
    let o = with_stdin(
        &[
            "sheet",
            "-",
            "--set",
            "temperature_c=25",
            "--set",
            "salinity=35",
            "--water",
            "saline",
            "--carbonic",
            "millero2006",
            "--columns",
            "water,carbonic_fit,temperature_c,salinity",
        ],
        input,
    );
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    assert_eq!(
        stdout(&o).lines().nth(1),
        Some("2300,8,saline,millero2006,25,35,ok,")
    );
    // The same from columns, row by row.
    let input = b"alkalinity_umol_kg,ph_total,temperature_c,salinity,water,carbonic_fit\n\
                  2300,8,25,35,saline,millero2006\n2300,8,25,35,saline,lueker2000\n";
    let o = with_stdin(&["sheet", "-", "--columns", "carbonic_fit"], input);
    assert_eq!(
        column(&stdout(&o), "carbonic_fit_calculated"),
        vec!["millero2006", "lueker2000"]
    );
}

#[test]
fn json_lines_and_ocean_units() {
    let o = with_stdin(
        &["sheet", "-", "--format", "jsonl", "--units", "ocean"],
        SEA.as_bytes(),
    );
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let out = stdout(&o);
    let lines: Vec<&str> = out.lines().collect();
    assert_eq!(lines.len(), 2);
    let v: serde_json::Value = serde_json::from_str(lines[0]).unwrap();
    assert_eq!(v["temperature_c"], "25");
    assert_eq!(v["water"], "saline");
    assert_eq!(v["status"], "ok");
    assert_eq!(v["message"], "");
    for key in [
        "ph_total_calculated",
        "dic_umol_kg",
        "co3_umol_kg",
        "omega_aragonite",
        "revelle_factor",
    ] {
        assert!(v[key].is_number(), "{key}: {}", v[key]);
    }
}

#[test]
fn residuals_are_measured_minus_calculated() {
    use travertine::{Conditions, Measured, PhScale, Water};
    // The pCO2 of this water from the library, then a sheet whose pCO2 is
    // 10 µatm higher: the residual is +10 (consistency, not a reference value).
    let state = Water::saline(Conditions::new(25.0, 35.0).unwrap())
        .unwrap()
        .solve(
            Measured::alkalinity_umol_kg(2300.0).unwrap(),
            Measured::ph(8.0, Some(PhScale::Total)).unwrap(),
        )
        .unwrap();
    let input = format!(
        "temperature_c,salinity,alkalinity_umol_kg,ph_total,pco2_uatm\n25,35,2300,8,{}\n25,35,2300,8,\n",
        state.pco2_uatm + 10.0
    );
    let o = with_stdin(&["sheet", "-"], input.as_bytes());
    let out = stdout(&o);
    let r = column(&out, "pco2_uatm_residual");
    assert!(
        (r[0].parse::<f64>().unwrap() - 10.0).abs() < 1e-3,
        "{}",
        r[0]
    );
    assert_eq!(r[1], "", "no residual without a measurement");
    // Forcing the pair makes pH the checked parameter.
    let o = with_stdin(
        &["sheet", "-", "--pair", "alkalinity,pco2"],
        input.as_bytes(),
    );
    let out = stdout(&o);
    let r = column(&out, "ph_total_residual");
    let calculated: f64 = column(&out, "ph_nbs")[0].parse().unwrap();
    assert!(calculated.is_finite());
    assert!(
        r[0].parse::<f64>().unwrap() > 0.0,
        "a higher pCO2 means a lower pH"
    );
    assert_eq!(column(&out, "status")[1], "error");
    assert_eq!(
        column(&out, "message")[1],
        "pair alkalinity,pco2: column `pco2_uatm` is empty in this row"
    );
}

#[test]
fn the_summary_is_plain_text_on_a_pipe() {
    let o = travertine(&["sheet", POND]);
    let err = stderr(&o);
    assert!(!err.contains('\r') && !err.contains('\u{1b}'), "{err:?}");
}

/// `--list-columns` prints every input of the library's list with its
/// canonical column, and needs no sheet.
#[test]
fn list_columns_prints_every_input() {
    let o = travertine(&["sheet", "--list-columns"]);
    assert!(o.status.success(), "{}", stderr(&o));
    let text = stdout(&o);
    for spec in travertine::sample::inputs::INPUTS {
        assert!(
            text.contains(&format!("  column:  {}\n", spec.column)),
            "{} missing",
            spec.column
        );
    }
    assert!(text.contains("total alkalinity"));
    assert!(text.contains("ppm for mg/L"));
}

/// A cell with a unicode minus gets the hint, in the row's message.
#[test]
fn a_unicode_minus_in_a_cell_gets_a_hint() {
    let o = with_stdin(
        &["sheet", "-", "--columns", "ph_nbs"],
        "temperature_c,alkalinity_umol_kg,ph_nbs,phosphate_umol_kg\n20,2000,7.9,\u{2212}1\n"
            .as_bytes(),
    );
    assert!(o.status.success(), "{}", stderr(&o));
    let out = stdout(&o);
    assert!(out.contains("type `-1`"), "{out}");
}
