//! Drives `travertine sheet` from the outside: the demo sheets, the
//! standard streams, the atomic output file, the input never overwritten,
//! exit codes and the summary on stderr.

use std::io::Write;
use std::path::{Path, PathBuf};
use std::process::{Command, Output, Stdio};

mod common;
use common::has_figures;

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
    // A program that stops before reading its input (a usage error)
    // closes the pipe: that is its answer, not a failure of the test.
    if let Err(e) = child.stdin.take().expect("stdin").write_all(input) {
        assert_eq!(
            e.kind(),
            std::io::ErrorKind::BrokenPipe,
            "input written: {e}"
        );
    }
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
        // The conditions as computed columns, to their digits (temperature 2
        // decimals, salinity 4 significant figures).
        Some("2300,8,saline,millero2006,25.00,35.00,ok,")
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

// ---- Outputs that are not plain files, stops, and what the input looks like ----

#[cfg(unix)]
fn c_path(p: &Path) -> std::ffi::CString {
    use std::os::unix::ffi::OsStrExt;
    std::ffi::CString::new(p.as_os_str().as_bytes()).expect("no NUL in the path")
}

/// `-o` onto a named pipe writes into the pipe: a reader at its other end
/// gets every row, and the pipe is still a pipe. It used to be replaced by
/// a plain file (and the reader got nothing).
#[test]
#[cfg(unix)]
fn a_named_pipe_is_written_into_not_replaced() {
    use std::os::unix::fs::FileTypeExt;
    let dir = folder("fifo");
    let fifo = dir.join("results.fifo");
    // SAFETY: a valid NUL-terminated path; mkfifo touches nothing else.
    assert_eq!(unsafe { libc::mkfifo(c_path(&fifo).as_ptr(), 0o600) }, 0);
    let reader = {
        let fifo = fifo.clone();
        std::thread::spawn(move || std::fs::read(&fifo).expect("the pipe is read"))
    };
    let o = travertine(&["sheet", POND, "-o", fifo.to_str().unwrap()]);
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    // Looked at before the reader is joined: were the pipe replaced, the
    // reader would wait for ever.
    let kind = std::fs::symlink_metadata(&fifo).unwrap().file_type();
    assert!(kind.is_fifo(), "the pipe was replaced: {kind:?}");
    assert_eq!(names_in(&dir), vec!["results.fifo".to_string()]);
    let text = String::from_utf8(reader.join().unwrap()).unwrap();
    assert_eq!(records(&text).len(), 48);
}

/// A link to standard output (as `/dev/stdout` is, through /proc) writes
/// into the pipe standard output is; the link used to be replaced by a
/// plain file. The link is made in the test's folder, so that a program
/// that replaced it would not replace /dev/stdout itself.
#[test]
#[cfg(target_os = "linux")]
fn a_link_to_standard_output_writes_into_the_pipe() {
    let dir = folder("stdout-link");
    let link = dir.join("stdout");
    std::os::unix::fs::symlink("/proc/self/fd/1", &link).unwrap();
    let o = travertine(&["sheet", POND, "-o", link.to_str().unwrap()]);
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    assert_eq!(records(&stdout(&o)).len(), 48);
    assert!(std::fs::symlink_metadata(&link)
        .unwrap()
        .file_type()
        .is_symlink());
    assert_eq!(names_in(&dir), vec!["stdout".to_string()]);
}

/// `-o` onto a device writes into it and leaves it a device. Run as root,
/// the device is a null device made in the test's folder (the same numbers
/// as /dev/null), so that a program that replaced it would not replace
/// /dev/null itself; otherwise /dev/null, which a user cannot replace.
#[test]
#[cfg(target_os = "linux")]
fn a_device_is_written_into_and_stays_a_device() {
    use std::os::unix::fs::FileTypeExt;
    let dir = folder("device");
    let own = dir.join("null");
    // SAFETY: a valid NUL-terminated path; mknod touches nothing else.
    let made = unsafe {
        libc::mknod(
            c_path(&own).as_ptr(),
            libc::S_IFCHR | 0o666,
            libc::makedev(1, 3),
        )
    } == 0;
    // SAFETY: geteuid has no preconditions.
    let root = unsafe { libc::geteuid() } == 0;
    let device = if made {
        own
    } else if !root {
        PathBuf::from("/dev/null")
    } else {
        panic!("root could not make a device node in {}", dir.display());
    };
    let o = travertine(&["sheet", POND, "-o", device.to_str().unwrap()]);
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    assert!(stderr(&o).starts_with("rows read: 48;"), "{}", stderr(&o));
    let kind = std::fs::symlink_metadata(&device).unwrap().file_type();
    assert!(
        kind.is_char_device(),
        "{} was replaced: {kind:?}",
        device.display()
    );
    if made {
        assert_eq!(names_in(&dir), vec!["null".to_string()]);
    }
}

/// A socket cannot take the results: refused with a message that says so,
/// and left in place (it used to be replaced by a plain file).
#[test]
#[cfg(unix)]
fn a_socket_is_refused() {
    use std::os::unix::fs::FileTypeExt;
    let dir = folder("socket");
    let socket = dir.join("results.sock");
    let _listener = std::os::unix::net::UnixListener::bind(&socket).expect("socket made");
    let o = travertine(&["sheet", POND, "-o", socket.to_str().unwrap()]);
    assert_eq!(o.status.code(), Some(2), "stderr: {}", stderr(&o));
    assert_eq!(
        stderr(&o),
        format!(
            "travertine sheet: cannot write {}: it is a socket, which cannot be opened as a \
             file; write to standard output and send that to the socket instead\n",
            socket.display()
        )
    );
    assert!(std::fs::symlink_metadata(&socket)
        .unwrap()
        .file_type()
        .is_socket());
}

/// A symbolic link given as the output is followed: the file it names gets
/// the results and the link stays a link (it used to be replaced by a
/// plain file). A link to a file not made yet makes that file; a chain of
/// links is followed to its end.
#[test]
#[cfg(unix)]
fn a_link_is_followed_and_kept() {
    let dir = folder("link");
    let real = dir.join("real.csv");
    std::fs::write(&real, "earlier results\n").unwrap();
    let link = dir.join("link.csv");
    std::os::unix::fs::symlink("real.csv", &link).unwrap();
    let chain = dir.join("chain.csv");
    std::os::unix::fs::symlink(&link, &chain).unwrap();
    let dangling = dir.join("dangling.csv");
    std::os::unix::fs::symlink("made.csv", &dangling).unwrap();
    for (name, target, made) in [
        (&link, "real.csv", &real),
        (&chain, link.to_str().unwrap(), &real),
        (&dangling, "made.csv", &dir.join("made.csv")),
    ] {
        std::fs::write(&real, "earlier results\n").unwrap();
        let o = travertine(&["sheet", POND, "-o", name.to_str().unwrap()]);
        assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
        let meta = std::fs::symlink_metadata(name).unwrap();
        assert!(meta.file_type().is_symlink(), "{} replaced", name.display());
        assert_eq!(std::fs::read_link(name).unwrap(), PathBuf::from(target));
        let text = std::fs::read_to_string(made).unwrap();
        assert_eq!(records(&text).len(), 48, "{}", name.display());
    }
    assert_eq!(
        names_in(&dir),
        [
            "chain.csv",
            "dangling.csv",
            "link.csv",
            "made.csv",
            "real.csv"
        ]
    );
}

/// A file replaced keeps its permissions, and its owner where that can be
/// set (as root); it used to get a new file's (0o644 under the usual umask).
#[test]
#[cfg(unix)]
fn a_replaced_file_keeps_its_mode_and_owner() {
    use std::os::unix::fs::{MetadataExt, PermissionsExt};
    let dir = folder("mode");
    let out = dir.join("results.csv");
    // SAFETY: geteuid has no preconditions.
    let root = unsafe { libc::geteuid() } == 0;
    // Two modes, so that no umask gives both by chance.
    for mode in [0o640, 0o604] {
        std::fs::write(&out, "earlier results\n").unwrap();
        std::fs::set_permissions(&out, std::fs::Permissions::from_mode(mode)).unwrap();
        if root {
            std::os::unix::fs::chown(&out, Some(4321), Some(4322)).unwrap();
        }
        let o = travertine(&["sheet", POND, "-o", out.to_str().unwrap()]);
        assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
        let meta = std::fs::metadata(&out).unwrap();
        assert_eq!(meta.permissions().mode() & 0o7777, mode);
        if root {
            assert_eq!((meta.uid(), meta.gid()), (4321, 4322));
        }
        assert_eq!(records(&std::fs::read_to_string(&out).unwrap()).len(), 48);
    }
}

/// Ctrl-C, SIGTERM and SIGHUP while a sheet is being written to a file
/// leave no hidden temporary file, and an earlier output as it was; the
/// program ends by the signal. The sheet comes on standard input, which
/// the test keeps open, so the program is surely still writing.
#[test]
#[cfg(unix)]
fn a_stop_signal_leaves_no_temporary_file() {
    use std::os::unix::process::ExitStatusExt;
    let dir = folder("signals");
    let out = dir.join("results.csv");
    for signal in [libc::SIGTERM, libc::SIGINT, libc::SIGHUP] {
        std::fs::write(&out, "earlier results\n").unwrap();
        let mut child = Command::new(env!("CARGO_BIN_EXE_travertine"))
            .args(["sheet", "-", "-o", out.to_str().unwrap()])
            .stdin(Stdio::piped())
            .stdout(Stdio::piped())
            .stderr(Stdio::piped())
            .spawn()
            .expect("the binary runs");
        let mut input = child.stdin.take().expect("stdin");
        input.write_all(SEA.as_bytes()).unwrap();
        for _ in 0..20_000 {
            input.write_all(b"25,35,2300,8\n").unwrap();
        }
        let started = std::time::Instant::now();
        while names_in(&dir).len() < 2 {
            assert!(
                started.elapsed().as_secs() < 30,
                "no temporary file appeared: {:?}",
                names_in(&dir)
            );
            std::thread::sleep(std::time::Duration::from_millis(5));
        }
        let pid = libc::pid_t::try_from(child.id()).unwrap();
        // SAFETY: kill has no memory preconditions; pid is our child.
        assert_eq!(unsafe { libc::kill(pid, signal) }, 0);
        let o = child.wait_with_output().expect("the binary ends");
        drop(input);
        assert_eq!(
            o.status.signal(),
            Some(signal),
            "{:?} {}",
            o.status,
            stderr(&o)
        );
        assert_eq!(
            names_in(&dir),
            vec!["results.csv".to_string()],
            "signal {signal}"
        );
        assert_eq!(std::fs::read_to_string(&out).unwrap(), "earlier results\n");
    }
}

/// A command whose standard output is closed (`>&-`).
#[cfg(unix)]
fn with_stdout_closed(args: &[&str]) -> Output {
    use std::os::unix::process::CommandExt;
    let mut command = Command::new(env!("CARGO_BIN_EXE_travertine"));
    command.args(args).current_dir(env!("CARGO_MANIFEST_DIR"));
    // SAFETY: close is async-signal-safe and only closes the child's fd 1.
    unsafe {
        command.pre_exec(|| {
            libc::close(1);
            Ok(())
        });
    }
    command.output().expect("the binary runs")
}

/// A closed standard output is an error, not exit code 0 with the results
/// lost; with `-o` standard output is not needed.
#[test]
#[cfg(unix)]
fn a_closed_standard_output_is_an_error() {
    let o = with_stdout_closed(&["sheet", POND]);
    assert_eq!(o.status.code(), Some(2));
    assert_eq!(
        stderr(&o),
        "travertine sheet: standard output is closed (as with >&-), so nothing could be written \
         to it; give -o FILE, or send it to a file or a pipe\n"
    );
    let dir = folder("closed");
    let out = dir.join("results.csv");
    let o = with_stdout_closed(&["sheet", POND, "-o", out.to_str().unwrap()]);
    assert_eq!(o.status.code(), Some(0), "stderr: {}", stderr(&o));
    assert_eq!(records(&std::fs::read_to_string(&out).unwrap()).len(), 48);
}

/// A full standard error: the summary cannot be shown, the results are
/// written all the same and nothing panics; an error keeps its exit code.
#[test]
#[cfg(target_os = "linux")]
fn a_full_standard_error_does_not_stop_the_sheet() {
    let full = || {
        std::fs::OpenOptions::new()
            .write(true)
            .open("/dev/full")
            .expect("/dev/full exists on Linux")
    };
    let o = Command::new(env!("CARGO_BIN_EXE_travertine"))
        .args(["sheet", POND])
        .current_dir(env!("CARGO_MANIFEST_DIR"))
        .stderr(full())
        .output()
        .expect("the binary runs");
    assert_eq!(o.status.code(), Some(0));
    assert_eq!(records(&stdout(&o)).len(), 48);
    let o = Command::new(env!("CARGO_BIN_EXE_travertine"))
        .args(["sheet", "no-such-sheet.csv"])
        .stderr(full())
        .output()
        .expect("the binary runs");
    assert_eq!(o.status.code(), Some(2));
}

/// The lines in messages are the lines an editor shows, whatever ends
/// them: `\r\n` (Windows), a lone `\r` (old Mac) or a mix; a line break in
/// a quoted cell is a line too. The CSV reader's own count was one early
/// for CRLF and lost for a lone `\r`.
#[test]
fn messages_give_the_line_an_editor_shows() {
    let header = "site,temperature_c,salinity,alkalinity_umol_kg,ph_total";
    for (name, text, line) in [
        (
            "LF",
            format!("{header}\na,25,35,2300,8\nb,25,35,2300,x\n"),
            3,
        ),
        (
            "CRLF",
            format!("{header}\r\na,25,35,2300,8\r\nb,25,35,2300,x\r\n"),
            3,
        ),
        (
            "CR",
            format!("{header}\ra,25,35,2300,8\rb,25,35,2300,x\r"),
            3,
        ),
        (
            "mixed",
            format!("{header}\r\na,25,35,2300,8\nb,25,35,2300,x\rc,25,35,2300,8\n"),
            3,
        ),
        (
            "byte-order mark and CRLF",
            format!("\u{feff}{header}\r\na,25,35,2300,8\r\nb,25,35,2300,x\r\n"),
            3,
        ),
        (
            "blank lines and a quoted break",
            format!("{header}\r\n\r\n\"a\r\nshore\",25,35,2300,8\r\nb,25,35,2300,x\r\n"),
            5,
        ),
    ] {
        let o = with_stdin(&["sheet", "-"], text.as_bytes());
        assert_eq!(o.status.code(), Some(0), "{name}: {}", stderr(&o));
        let expected = format!("error: column `ph_total`: not a number (line {line})");
        assert!(stderr(&o).contains(&expected), "{name}: {}", stderr(&o));
        let summary = travertine::sheet::process(
            &travertine::sheet::SheetOptions::default(),
            text.as_bytes(),
            Vec::new(),
        )
        .unwrap();
        assert_eq!(summary.messages[0].lines, vec![line], "{name}");
    }
}

/// A quote never closed swallows the lines after it into one cell. That
/// row is an error naming the line where the quote opened and saying that
/// the lines after it were read into the cell (which is written back
/// unchanged, so nothing is lost). It used to be `ok`, with the lines gone
/// from the sheet without a word. A note over a few lines stays `ok`.
#[test]
fn a_quote_never_closed_is_an_error_of_its_row() {
    let mut text = String::from("site,temperature_c,salinity,alkalinity_umol_kg,ph_total,notes\n");
    text.push_str("a,25,35,2300,8,\"calm\nno wind\"\n");
    text.push_str("b,25,35,2300,8,\"lid left open\n");
    for _ in 0..20 {
        text.push_str("c,25,35,2300,8,\n");
    }
    let o = with_stdin(&["sheet", "-"], text.as_bytes());
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let out = stdout(&o);
    assert_eq!(column(&out, "status"), vec!["ok", "error"]);
    assert_eq!(
        column(&out, "message")[1],
        "column `notes`: the quote that opens this cell on line 4 seems never to be closed: the \
         cell runs on over 21 lines (lines 4 to 24), so the lines after it were read into this \
         one cell and are not rows of their own; close or remove the quote and run the sheet \
         again"
    );
    assert_eq!(column(&out, "notes")[1].lines().count(), 21);
    assert!(stderr(&o)
        .contains("error: a quote that is never closed runs on over the lines after it (line 4)"));
    // A few long lines swallowed: over 64 KiB in the cell.
    let mut text = String::from("site,temperature_c,salinity,alkalinity_umol_kg,ph_total,notes\n");
    text.push_str("b,25,35,2300,8,\"lid left open\n");
    for _ in 0..3 {
        text.push_str(&"x".repeat(30_000));
        text.push('\n');
    }
    let o = with_stdin(&["sheet", "-"], text.as_bytes());
    let out = stdout(&o);
    assert_eq!(column(&out, "status"), vec!["error"]);
    assert!(
        column(&out, "message")[0].contains("on line 2 seems never to be closed: the cell runs on over 4 lines (lines 2 to 5, 87 KiB)"),
        "{}",
        column(&out, "message")[0]
    );
}

/// A sheet saved as UTF-16 ("Unicode text") is refused with a message that
/// says so and how to convert it; it used to be read as garbled headers.
#[test]
fn a_utf16_sheet_is_refused_with_advice() {
    let le: Vec<u8> = SEA.encode_utf16().flat_map(u16::to_le_bytes).collect();
    let be: Vec<u8> = SEA.encode_utf16().flat_map(u16::to_be_bytes).collect();
    let with_bom = |bom: &[u8], body: &[u8]| [bom, body].concat();
    for (name, bytes, how) in [
        (
            "LE with BOM",
            with_bom(b"\xFF\xFE", &le),
            "little-endian, with a byte-order mark), not UTF-8: save it as UTF-8 (in a \
             spreadsheet, \"CSV UTF-8\"), or convert it, for example `iconv -f UTF-16 -t UTF-8",
        ),
        (
            "BE with BOM",
            with_bom(b"\xFE\xFF", &be),
            "big-endian, with a byte-order mark), not UTF-8: save it as UTF-8 (in a \
             spreadsheet, \"CSV UTF-8\"), or convert it, for example `iconv -f UTF-16 -t UTF-8",
        ),
        (
            "LE without BOM",
            le.clone(),
            "little-endian, without a byte-order mark), not UTF-8: save it as UTF-8 (in a \
             spreadsheet, \"CSV UTF-8\"), or convert it, for example `iconv -f UTF-16LE -t UTF-8",
        ),
        (
            "BE without BOM",
            be.clone(),
            "big-endian, without a byte-order mark), not UTF-8: save it as UTF-8 (in a \
             spreadsheet, \"CSV UTF-8\"), or convert it, for example `iconv -f UTF-16BE -t UTF-8",
        ),
    ] {
        let o = with_stdin(&["sheet", "-"], &bytes);
        assert_eq!(o.status.code(), Some(2), "{name}");
        let expected = format!("travertine sheet: standard input is in UTF-16 ({how}");
        assert!(stderr(&o).starts_with(&expected), "{name}: {}", stderr(&o));
        assert!(stdout(&o).is_empty());
    }
    // UTF-8 with non-ASCII headers is still read.
    let o = with_stdin(
        &["sheet", "-"],
        "Temp (°C),salinity,alkalinity_umol_kg,ph_total\n25,35,2300,8\n".as_bytes(),
    );
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
}

/// Decimals of a plain decimal text.
fn decimals(text: &str) -> usize {
    text.split_once(['.', ',']).map_or(0, |(_, d)| d.len())
}

/// Each computed column of the pond demo is written to the digits its
/// measurement supports: pH 3 decimals, pCO2 4 significant figures, mg/L 3,
/// the Langelier index 2 decimals, and no exponent anywhere; the input
/// columns are as typed. Before, every number had six significant digits
/// with trailing zeros dropped (`7.4`, `29.7193`, `4199.18`).
#[test]
fn the_pond_demo_is_written_to_the_digits_of_each_column() {
    let o = travertine(&["sheet", POND]);
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let out = stdout(&o);
    let status = column(&out, "status");
    let ok: Vec<usize> = (0..status.len())
        .filter(|i| status[*i] != "error")
        .collect();
    assert_eq!(ok.len(), 46);
    for i in &ok {
        let ph = &column(&out, "ph_nbs")[*i];
        assert_eq!(decimals(ph), 3, "row {i}: pH {ph}");
        let pco2 = &column(&out, "pco2_uatm")[*i];
        assert!(has_figures(pco2, 4), "row {i}: pCO2 {pco2}");
        for name in ["dic_mg_l_c", "free_co2_mg_l", "hco3_mg_l", "co3_mg_l"] {
            let v = &column(&out, name)[*i];
            assert!(has_figures(v, 3), "row {i}: {name} {v}");
        }
        let lsi = &column(&out, "langelier_index")[*i];
        assert_eq!(decimals(lsi), 2, "row {i}: Langelier {lsi}");
    }
    for row in records(&out) {
        for cell in row.iter().skip(10) {
            let number = cell.starts_with(|c: char| c.is_ascii_digit() || c == '-');
            assert!(!(number && cell.contains(['e', 'E'])), "{cell}");
        }
    }
    // The input as typed: `7.40` stays `7.40`, the computed pH is `7.400`.
    let input = std::fs::read_to_string(POND).expect("demo sheet");
    assert!(input.lines().nth(3).unwrap().contains(",7.40,"));
    let third = out.lines().nth(3).unwrap();
    assert!(
        third.contains(",7.40,") && third.contains(",fresh,7.400,"),
        "{third}"
    );
}

/// A small mg/L value is written with three significant figures in plain
/// notation (0.00xyz); `--digits full` writes every digit, which reads back
/// as exactly the f64 of the JSON lines, and JSON lines always have every
/// digit.
#[test]
fn small_values_and_full_digits_in_the_sheet() {
    // An invented lime-dosed pond at pH 10.1: little free CO2.
    let input = b"temperature_c,ph_nbs,alkalinity_mg_l_caco3\n22,10.1,120\n";
    let run = |extra: &[&str]| {
        let o = with_stdin(&[&["sheet", "-"][..], extra].concat(), input);
        assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
        stdout(&o)
    };
    let json: serde_json::Value =
        serde_json::from_str(run(&["--format", "jsonl"]).trim()).expect("one JSON line");
    let free = json["free_co2_mg_l"].as_f64().unwrap();
    assert!((0.001..0.01).contains(&free), "{free}");
    // Three significant figures of a value below 0.01 are five decimals.
    assert_eq!(column(&run(&[]), "free_co2_mg_l")[0], format!("{free:.5}"));
    let full = run(&["--digits", "full"]);
    let mut checked = 0;
    let mut rdr = csv::Reader::from_reader(full.as_bytes());
    let header: Vec<String> = rdr.headers().unwrap().iter().map(String::from).collect();
    let row = rdr.records().next().unwrap().unwrap();
    for (name, cell) in header.iter().zip(row.iter()).skip(3) {
        if let Some(x) = json[name].as_f64() {
            let got: f64 = cell.parse().unwrap_or_else(|_| panic!("{name}: `{cell}`"));
            assert_eq!(got.to_bits(), x.to_bits(), "{name}: `{cell}` and {x}");
            checked += 1;
        }
    }
    assert_eq!(checked, 7, "{header:?}");
    let o = with_stdin(&["sheet", "-", "--digits", "most"], input);
    assert_eq!(o.status.code(), Some(2));
    assert!(stderr(&o).contains("--digits"), "{}", stderr(&o));
}

/// The decimal comma works with rounded numbers: a semicolon sheet with
/// decimal commas gets its computed numbers rounded and with a comma, its
/// input cells as typed; with a comma delimiter such a number is quoted.
#[test]
fn a_decimal_comma_with_rounded_numbers() {
    let input = "temperature_c;salinity;alkalinity_umol_kg;dic_umol_kg\n25,0;35;2300;2000,0\n";
    let o = with_stdin(
        &[
            "sheet",
            "-",
            "--delimiter",
            ";",
            "--decimal-comma",
            "--columns",
            "ph_total,pco2_uatm,free_co2_mg_l,omega_aragonite",
        ],
        input.as_bytes(),
    );
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let out = stdout(&o);
    let row = out.lines().nth(1).unwrap();
    // The inputs as typed, then pH to 3 decimals, pCO2 to 4 figures, mg/L
    // and Ω to 3, each with a comma (the worked values of ../shared/reference
    // equations.md §13, computed from the published equations: pH_T 8.0402,
    // pCO2 402.75 µatm, Ω aragonite 3.346).
    let cells: Vec<&str> = row.split(';').collect();
    assert_eq!(&cells[..4], ["25,0", "35", "2300", "2000,0"]);
    assert_eq!(cells[4], "8,040");
    assert_eq!(cells[5], "402,8");
    assert!(has_figures(&cells[6].replace(',', "."), 3), "{row}");
    assert_eq!(cells[7], "3,35");
    assert_eq!(&cells[8..], ["ok", ""]);
}

/// A residual is written to the place of the value it is the residual of:
/// pH to 3 decimals, a pCO2 of about 400 µatm (4 figures) to 0.1 µatm.
#[test]
fn residuals_are_written_to_the_place_of_their_values() {
    let input = "temperature_c,salinity,alkalinity_umol_kg,dic_umol_kg,ph_total,pco2_uatm\n\
                 25,35,2300,2000,8.05,410\n";
    let o = with_stdin(&["sheet", "-", "--units", "ocean"], input.as_bytes());
    assert_eq!(o.status.code(), Some(0), "{}", stderr(&o));
    let out = stdout(&o);
    let ph = &column(&out, "ph_total_residual")[0];
    let pco2 = &column(&out, "pco2_uatm_residual")[0];
    assert_eq!(decimals(ph), 3, "{ph}");
    assert_eq!(decimals(pco2), 1, "{pco2}");
    let full = stdout(&with_stdin(
        &["sheet", "-", "--units", "ocean", "--digits", "full"],
        input.as_bytes(),
    ));
    let exact: f64 = column(&full, "pco2_uatm_residual")[0].parse().unwrap();
    assert!((pco2.parse::<f64>().unwrap() - exact).abs() <= 0.05 + 1e-12);
}
