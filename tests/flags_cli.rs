//! Quality flags and the toxic fractions from the outside: `solve --json`
//! (the `flags` array), the table's Flags block, `--profile NAME|FILE` in
//! `solve` and `sheet`, and the sheet's `flags` column. All data invented.

use std::path::PathBuf;
use std::process::Output;

mod common;
fn run(args: &[&str], input: Option<&str>) -> Output {
    common::run_travertine(args, input.map(str::as_bytes))
}

fn stdout(o: &Output) -> String {
    String::from_utf8_lossy(&o.stdout).into_owned()
}

fn stderr(o: &Output) -> String {
    String::from_utf8_lossy(&o.stderr).into_owned()
}

/// An invented pond at dawn: 27 °C, pH 6.9, 110 mg/L alkalinity, 2.5 mg/L TAN.
const DAWN: &[&str] = &[
    "solve",
    "--temperature",
    "27",
    "--ph",
    "6.9",
    "--alkalinity",
    "110 mg/L CaCO3",
    "--conductivity",
    "320 uS/cm@25C",
    "--ammonia",
    "2.5 mg/L N",
];

/// A profile file in a folder of its own, removed when dropped.
struct ProfileFile {
    dir: PathBuf,
    path: PathBuf,
}

impl ProfileFile {
    fn new(name: &str, text: &str) -> Self {
        let dir = std::env::temp_dir().join(format!(
            "travertine-flags-cli-{}-{name}",
            std::process::id()
        ));
        std::fs::create_dir_all(&dir).unwrap();
        let path = dir.join(format!("{name}.toml"));
        std::fs::write(&path, text).unwrap();
        ProfileFile { dir, path }
    }

    fn arg(&self) -> &str {
        self.path.to_str().unwrap()
    }
}

impl Drop for ProfileFile {
    fn drop(&mut self) {
        let _ = std::fs::remove_dir_all(&self.dir);
    }
}

fn json(args: &[&str]) -> serde_json::Value {
    let mut all = args.to_vec();
    all.push("--json");
    let o = run(&all, None);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    serde_json::from_slice(&o.stdout).expect("one JSON object")
}

#[test]
fn solve_json_gives_the_toxic_fractions_and_the_flags() {
    let v = json(DAWN);
    // The fraction of a fresh water: 1/(1 + {H+}/(Ka γ)), Emerson et al. 1975.
    let f = v["nh3_fraction"].as_f64().unwrap();
    let ka = 10f64.powf(-(0.09018 + 2729.92 / 300.15));
    let g = v["gamma_monovalent"].as_f64().unwrap();
    let by_hand = 1.0 / (1.0 + 10f64.powf(-6.9) / (ka * g));
    assert!((f / by_hand - 1.0).abs() < 1e-9, "{f} {by_hand}");
    assert!((v["nh3_mg_l_n"].as_f64().unwrap() / (2.5 * f) - 1.0).abs() < 1e-9);
    assert!(v["h2s_fraction"].is_null() && v["h2s_mg_l"].is_null());
    let flags = v["flags"].as_array().unwrap();
    assert_eq!(flags.len(), 1, "{flags:?}");
    assert_eq!(flags[0]["code"], "free_co2_high");
    assert_eq!(flags[0]["threshold"], 20.0);
    assert_eq!(flags[0]["value"], v["free_co2_mg_l"]);
}

#[test]
fn a_profile_file_changes_the_limits_of_solve() {
    let file = ProfileFile::new("tolerant", "[limits]\nfree_co2_high_mg_l = 30\n");
    let mut args = DAWN.to_vec();
    args.extend(["--profile", file.arg()]);
    let v = json(&args);
    assert_eq!(v["flags"], serde_json::json!([]));
    assert_eq!(v["flags_profile"], file.arg());
    // A built-in name.
    let mut args = DAWN.to_vec();
    args.extend(["--profile", "cold-water-fish"]);
    let v = json(&args);
    let codes: Vec<&str> = v["flags"]
        .as_array()
        .unwrap()
        .iter()
        .map(|f| f["code"].as_str().unwrap())
        .collect();
    // 0.012 mg/L NH3-N at dawn passes the 0.010 of cold-water fish.
    assert_eq!(codes, ["free_co2_high", "nh3_high"]);
}

#[test]
fn a_bad_profile_stops_solve_naming_the_flag_the_key_and_the_line() {
    let file = ProfileFile::new("typo", "description = \"x\"\n[limits]\nfree_co2 = 12\n");
    let mut args = DAWN.to_vec();
    args.extend(["--profile", file.arg()]);
    let o = run(&args, None);
    assert_eq!(o.status.code(), Some(2));
    let e = stderr(&o);
    assert!(e.starts_with("travertine: --profile: profile "), "{e}");
    assert!(e.contains("line 3, key `limits.free_co2`"), "{e}");
    assert!(e.contains("unknown field"), "{e}");
    let mut args = DAWN.to_vec();
    args.extend(["--profile", "salmon"]);
    let e = stderr(&run(&args, None));
    assert!(
        e.contains("salmon") && e.contains("general, cold-water-fish, shellfish-hatchery"),
        "{e}"
    );
}

#[test]
fn the_table_has_a_toxic_fractions_section_and_a_flags_block() {
    let o = run(DAWN, None);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let t = stdout(&o);
    let toxic = t
        .find("\nToxic fractions\n")
        .expect("a Toxic fractions section");
    assert!(t[toxic..].contains("un-ionised ammonia NH3"));
    let flags = t.find("\nFlags, profile general").expect("a Flags block");
    assert!(flags > toxic);
    let block = &t[flags..];
    assert!(
        block.contains("  - free_co2_high: free CO2 is 24.7 mg/L, above 20 mg/L"),
        "{block}"
    );
    // Without ammonia the ammonia flag cannot be judged, and says so.
    let o = run(
        &[
            "solve",
            "--temperature",
            "20",
            "--ph",
            "7.5",
            "--alkalinity",
            "2 meq/L",
        ],
        None,
    );
    let t = stdout(&o);
    let block = &t[t.find("\nFlags").unwrap()..];
    assert!(block.contains("none raised"), "{block}");
    assert!(
        block.contains("not judged: nh3_high (no ammonia total above zero)"),
        "{block}"
    );
}

/// An invented pond sheet: dawn, afternoon, and a row whose pH is not a number.
const SHEET: &str = "pond,Temp (°C),pH (NBS),Alkalinity (mg/L as CaCO3),TAN (mg/L)\n\
                     east,27,6.9,110,2.5\n\
                     east,30,8.8,110,2.5\n\
                     west,28,7..2,90,1.0\n";

fn column(csv_text: &str, name: &str, delimiter: u8) -> Vec<String> {
    let mut r = csv::ReaderBuilder::new()
        .delimiter(delimiter)
        .from_reader(csv_text.as_bytes());
    let i = r
        .headers()
        .unwrap()
        .iter()
        .position(|h| h == name)
        .unwrap_or_else(|| panic!("no column {name}"));
    r.records().map(|rec| rec.unwrap()[i].to_string()).collect()
}

fn sheet(extra: &[&str], input: &str) -> String {
    let mut args = vec!["sheet", "-"];
    args.extend_from_slice(extra);
    let o = run(&args, Some(input));
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    stdout(&o)
}

#[test]
fn the_sheet_writes_a_flags_column_by_default() {
    let out = sheet(&[], SHEET);
    let header = out.lines().next().unwrap();
    assert!(header.ends_with(",flags,status,message"), "{header}");
    assert_eq!(
        column(&out, "flags", b','),
        ["free_co2_high", "nh3_high", ""]
    );
    // A flag leaves the status alone; the bad row is an error with no flags.
    assert_eq!(column(&out, "status", b','), ["ok", "ok", "error"]);
    // Another profile: codes separated by `;`.
    let out = sheet(&["--profile", "cold-water-fish"], SHEET);
    assert_eq!(
        column(&out, "flags", b','),
        ["free_co2_high;nh3_high", "nh3_high", ""]
    );
    // With `;` as the delimiter the cell is quoted.
    let semi = SHEET.replace(',', ";");
    let out = sheet(&["--profile", "cold-water-fish", "--delimiter", ";"], &semi);
    assert!(out.contains(";\"free_co2_high;nh3_high\";ok;"), "{out}");
    assert_eq!(column(&out, "flags", b';')[0], "free_co2_high;nh3_high");
}

#[test]
fn the_summary_counts_the_rows_of_each_flag() {
    let o = run(&["sheet", "-"], Some(SHEET));
    let e = stderr(&o);
    assert!(
        e.contains("flags (profile general): free_co2_high 1 row, nh3_high 1 row\n"),
        "{e}"
    );
    let o = run(&["sheet", "-", "--columns", "ph_nbs"], Some(SHEET));
    assert!(!stderr(&o).contains("flags ("), "{}", stderr(&o));
    let o = run(&["sheet", "-", "--profile", "cold-water-fish"], Some(SHEET));
    assert!(
        stderr(&o)
            .contains("flags (profile cold-water-fish): free_co2_high 1 row, nh3_high 2 rows"),
        "{}",
        stderr(&o)
    );
}

#[test]
fn the_sheet_flags_column_follows_the_columns_asked_for() {
    let out = sheet(&["--columns", "ph_nbs,nh3_mg_l_n"], SHEET);
    assert!(
        out.lines()
            .next()
            .unwrap()
            .ends_with(",ph_nbs,nh3_mg_l_n,status,message"),
        "{out}"
    );
    let out = sheet(&["--columns", "nh3_mg_l_n,flags"], SHEET);
    assert!(out
        .lines()
        .next()
        .unwrap()
        .ends_with(",nh3_mg_l_n,flags,status,message"));
    // The un-ionised ammonia in the afternoon, to three significant figures.
    let nh3: f64 = column(&out, "nh3_mg_l_n", b',')[1].parse().unwrap();
    assert!(nh3 > 0.05, "{nh3}");
    let out = sheet(&["--columns", "default"], SHEET);
    assert!(out.lines().next().unwrap().contains(",flags,"));
}

#[test]
fn json_lines_give_the_flags_as_an_array() {
    let out = sheet(&["--format", "jsonl"], SHEET);
    let rows: Vec<serde_json::Value> = out
        .lines()
        .map(|l| serde_json::from_str(l).unwrap())
        .collect();
    assert_eq!(rows[0]["flags"], serde_json::json!(["free_co2_high"]));
    assert_eq!(rows[1]["flags"], serde_json::json!(["nh3_high"]));
    assert!(rows[2]["flags"].is_null(), "{}", rows[2]);
}

#[test]
fn a_bad_profile_stops_the_sheet() {
    let file = ProfileFile::new("range", "[limits]\n\nph_high_nbs = 15\n");
    let o = run(&["sheet", "-", "--profile", file.arg()], Some(SHEET));
    assert_eq!(o.status.code(), Some(2));
    let e = stderr(&o);
    assert!(e.contains("--profile: profile"), "{e}");
    assert!(e.contains("line 3, key `limits.ph_high_nbs`"), "{e}");
    assert!(e.contains("outside the accepted range 0 to 14"), "{e}");
    assert!(o.stdout.is_empty());
}
