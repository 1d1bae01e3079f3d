//! Throughput of `travertine sheet` against an I/O floor, and its peak
//! memory on a large file.
//!
//! 1. Generates a sheet of 1 M rows (sea water: temperature, salinity,
//!    alkalinity in µmol/kg and pH on the total scale; invented values) in
//!    a temporary folder.
//! 2. Times the sheet (the library's `run`, file to file, default options:
//!    read, solve on every core, write in order, atomic output) and the
//!    floor: a plain single-threaded `csv` read and write of the same file
//!    that appends as many fields as the sheet's default output adds, as
//!    numbers formatted with `ryu` (nothing computed). Best of three runs.
//! 3. Generates 10 M rows and runs the release binary on them, output to
//!    /dev/null, polling its peak resident memory (VmHWM in
//!    /proc/PID/status) until it exits.
//!
//! 4. Times a fresh sheet with calcium (temperature, specific conductance,
//!    calcium hardness, alkalinity in mg/L as CaCO3, NBS pH; an invented
//!    pond) against a saline sheet of the same size and shape, back to back,
//!    best of three each.
//!
//! `cargo bench --bench sheet_throughput`. Environment: `SHEET_BENCH_ROWS`
//! (default 1000000), `SHEET_BENCH_MEDIA_ROWS` (default 200000; 0 skips the
//! media comparison) and `SHEET_BENCH_RSS_ROWS` (default 10000000; 0 skips
//! the memory run).

use std::fs::File;
use std::io::{BufWriter, Write};
use std::path::{Path, PathBuf};
use std::process::{Command, Stdio};
use std::time::{Duration, Instant};
use travertine::sheet::{run, SheetOptions, Sink, Source};

/// A small deterministic generator (xorshift64*), for invented values.
struct Rng(u64);

impl Rng {
    fn next(&mut self) -> f64 {
        self.0 ^= self.0 >> 12;
        self.0 ^= self.0 << 25;
        self.0 ^= self.0 >> 27;
        (self.0.wrapping_mul(0x2545_F491_4F6C_DD1D) >> 11) as f64 / (1u64 << 53) as f64
    }

    fn between(&mut self, lo: f64, hi: f64) -> f64 {
        lo + (hi - lo) * self.next()
    }
}

/// An invented sheet: its header, and for each column the range of its
/// values and the decimals they are written with.
struct Shape {
    header: &'static str,
    columns: &'static [(f64, f64, usize)],
}

/// Sea water: temperature, salinity, alkalinity in µmol/kg and total-scale pH.
const SEA: Shape = Shape {
    header: "temperature_c,salinity,alkalinity_umol_kg,ph_total",
    columns: &[
        (10.0, 30.0, 2),
        (30.0, 38.0, 3),
        (2150.0, 2450.0, 1),
        (7.85, 8.15, 4),
    ],
};

/// Pond water: temperature, specific conductance, calcium hardness,
/// alkalinity in mg/L as CaCO3 and NBS pH.
const POND: Shape = Shape {
    header: "Temp (°C),Specific conductance (µS/cm),Calcium hardness (mg/L as CaCO3),\
             Alkalinity (mg/L as CaCO3),pH (NBS)",
    columns: &[
        (10.0, 30.0, 1),
        (150.0, 900.0, 0),
        (40.0, 250.0, 0),
        (30.0, 200.0, 0),
        (6.8, 9.0, 2),
    ],
};

/// Sea water in the shape of the pond sheet: temperature, salinity,
/// calcium, alkalinity in mg/L as CaCO3 and total-scale pH.
const SALINE_LIKE_POND: Shape = Shape {
    header: "temperature_c,salinity,calcium_mg_l,alkalinity_mg_l_caco3,ph_total",
    columns: &[
        (10.0, 30.0, 1),
        (30.0, 38.0, 3),
        (380.0, 430.0, 0),
        (105.0, 122.0, 1),
        (7.85, 8.15, 4),
    ],
};

/// Writes `rows` rows of invented values in `shape`.
fn generate(path: &Path, rows: u64, shape: &Shape) -> std::io::Result<()> {
    let mut w = BufWriter::with_capacity(1 << 20, File::create(path)?);
    writeln!(w, "{}", shape.header)?;
    let mut rng = Rng(0x9E37_79B9_7F4A_7C15);
    for _ in 0..rows {
        for (n, &(lo, hi, decimals)) in shape.columns.iter().enumerate() {
            let sep = if n == 0 { "" } else { "," };
            write!(w, "{sep}{:.decimals$}", rng.between(lo, hi))?;
        }
        writeln!(w)?;
    }
    w.flush()
}

/// One run of the sheet with default options, file to file, timed; every
/// row must solve.
fn time_sheet(input: &Path, output: &Path, rows: u64) -> Duration {
    let t = Instant::now();
    let s = run(
        &SheetOptions::default(),
        &Source::Path(input.to_path_buf()),
        &Sink::Path(output.to_path_buf()),
    )
    .expect("the sheet runs");
    let d = t.elapsed();
    assert_eq!(s.rows, rows);
    assert_eq!(s.error, 0, "every generated row solves");
    d
}

/// A fresh sheet with calcium against a saline sheet of the same size and
/// shape, back to back, best of three each.
fn media(dir: &Path, rows: u64) {
    let mut times = Vec::new();
    for fresh in [true, false] {
        let input = dir.join(if fresh { "fresh.csv" } else { "saline.csv" });
        let output = dir.join("media_out.csv");
        let shape = if fresh { &POND } else { &SALINE_LIKE_POND };
        generate(&input, rows, shape).expect("input generated");
        let (time, runs) = best_of(3, || time_sheet(&input, &output, rows));
        println!(
            "  {:<6} {rows} rows       {:.3} s  {:.2} M rows/s  (runs: {runs} s)",
            if fresh { "fresh" } else { "saline" },
            time.as_secs_f64(),
            rows as f64 / time.as_secs_f64() / 1e6
        );
        times.push(time.as_secs_f64());
        let _ = std::fs::remove_file(&input);
        let _ = std::fs::remove_file(&output);
    }
    println!("  fresh / saline          {:.2}x", times[0] / times[1]);
}

/// The fields the sheet's default output adds to each row (computed
/// columns, `status`, `message`), from its own header.
fn added_fields(input: &Path, dir: &Path) -> usize {
    let head = dir.join("head.csv");
    let out = dir.join("head_out.csv");
    let text = std::fs::read_to_string(input).expect("input");
    let first: String = text.lines().take(2).map(|l| format!("{l}\n")).collect();
    std::fs::write(&head, first).expect("head written");
    run(
        &SheetOptions::default(),
        &Source::Path(head.clone()),
        &Sink::Path(out.clone()),
    )
    .expect("the sheet runs");
    let out_fields = std::fs::read_to_string(&out)
        .expect("output")
        .lines()
        .next()
        .map_or(0, |l| l.split(',').count());
    let in_fields = text.lines().next().map_or(0, |l| l.split(',').count());
    let _ = std::fs::remove_file(head);
    let _ = std::fs::remove_file(out);
    out_fields - in_fields
}

/// The floor: read each record, write it back with `extra` numeric fields
/// formatted by `ryu`.
fn floor(input: &Path, output: &Path, extra: usize) -> csv::Result<u64> {
    let mut rdr = csv::ReaderBuilder::new()
        .has_headers(false)
        .from_path(input)?;
    let mut wtr = csv::Writer::from_path(output)?;
    let mut record = csv::ByteRecord::new();
    let mut buf = ryu::Buffer::new();
    let mut rows = 0u64;
    let mut first = true;
    while rdr.read_byte_record(&mut record)? {
        for f in record.iter() {
            wtr.write_field(f)?;
        }
        for k in 0..extra {
            if first {
                wtr.write_field(format!("extra_{k}"))?;
            } else {
                // Values of five to seven significant digits, like the sheet's.
                let v = ((rows * 7919 + k as u64 * 104_729) % 10_000_000) as f64 / 100.0;
                wtr.write_field(buf.format(v))?;
            }
        }
        wtr.write_record(None::<&[u8]>)?;
        if !first {
            rows += 1;
        }
        first = false;
    }
    wtr.flush()?;
    Ok(rows)
}

/// The best of `n` runs, and every run in seconds (the machine may be shared).
fn best_of<F: FnMut() -> Duration>(n: usize, mut f: F) -> (Duration, String) {
    let runs: Vec<Duration> = (0..n).map(|_| f()).collect();
    let all = runs
        .iter()
        .map(|d| format!("{:.3}", d.as_secs_f64()))
        .collect::<Vec<_>>()
        .join(", ");
    (runs.into_iter().min().unwrap_or_default(), all)
}

fn machine() -> String {
    let cpu = std::fs::read_to_string("/proc/cpuinfo")
        .ok()
        .and_then(|t| {
            t.lines()
                .find(|l| l.starts_with("model name"))
                .and_then(|l| l.split(':').nth(1))
                .map(|s| s.trim().to_string())
        })
        .unwrap_or_else(|| "unknown processor".into());
    let cores = std::thread::available_parallelism().map_or(0, |n| n.get());
    format!("{cpu}, {cores} cores")
}

/// VmHWM of a process, KiB.
fn peak_kib(pid: u32) -> Option<u64> {
    let status = std::fs::read_to_string(format!("/proc/{pid}/status")).ok()?;
    status
        .lines()
        .find(|l| l.starts_with("VmHWM:"))?
        .split_whitespace()
        .nth(1)?
        .parse()
        .ok()
}

fn rows_from_env(name: &str, default: u64) -> u64 {
    std::env::var(name)
        .ok()
        .and_then(|v| v.parse().ok())
        .unwrap_or(default)
}

fn main() {
    // `cargo bench` passes --bench; `cargo test --benches` runs this without
    // it, and then nothing is measured.
    if !std::env::args().any(|a| a == "--bench") {
        println!("sheet_throughput: run it with `cargo bench --bench sheet_throughput`");
        return;
    }
    let dir = PathBuf::from(env!("CARGO_TARGET_TMPDIR")).join("sheet-bench");
    std::fs::create_dir_all(&dir).expect("bench folder");
    let rows = rows_from_env("SHEET_BENCH_ROWS", 1_000_000);
    let input = dir.join("sea.csv");
    let output = dir.join("sea_out.csv");
    let floor_out = dir.join("floor_out.csv");
    eprintln!("machine: {}", machine());
    eprintln!("generating {rows} rows ...");
    generate(&input, rows, &SEA).expect("input generated");
    let extra = added_fields(&input, &dir);

    let (sheet_time, sheet_runs) = best_of(3, || time_sheet(&input, &output, rows));
    let (floor_time, floor_runs) = best_of(3, || {
        let t = Instant::now();
        let n = floor(&input, &floor_out, extra).expect("the floor runs");
        let d = t.elapsed();
        assert_eq!(n, rows);
        d
    });
    let size = |p: &Path| std::fs::metadata(p).map_or(0, |m| m.len());
    let per_s = rows as f64 / sheet_time.as_secs_f64();
    println!(
        "sheet throughput ({rows} rows, TA + pH with temperature and salinity, default columns)"
    );
    println!("  machine                 {}", machine());
    println!(
        "  sheet                   {:.3} s  {:.2} M rows/s  output {:.1} MB  (runs: {sheet_runs} s)",
        sheet_time.as_secs_f64(),
        per_s / 1e6,
        size(&output) as f64 / 1e6
    );
    println!(
        "  I/O floor (+{extra} fields) {:.3} s  {:.2} M rows/s  output {:.1} MB  (runs: {floor_runs} s)",
        floor_time.as_secs_f64(),
        rows as f64 / floor_time.as_secs_f64() / 1e6,
        size(&floor_out) as f64 / 1e6
    );
    println!(
        "  sheet / floor           {:.2}x",
        sheet_time.as_secs_f64() / floor_time.as_secs_f64()
    );
    let _ = std::fs::remove_file(&output);
    let _ = std::fs::remove_file(&floor_out);
    let _ = std::fs::remove_file(&input);

    let media_rows = rows_from_env("SHEET_BENCH_MEDIA_ROWS", 200_000);
    if media_rows > 0 {
        println!(
            "fresh sheet with calcium against a saline sheet of the same shape (default columns)"
        );
        media(&dir, media_rows);
    }

    let big_rows = rows_from_env("SHEET_BENCH_RSS_ROWS", 10_000_000);
    if big_rows > 0 {
        let big = dir.join("sea_big.csv");
        eprintln!("generating {big_rows} rows ...");
        generate(&big, big_rows, &SEA).expect("large input generated");
        let t = Instant::now();
        let mut child = Command::new(env!("CARGO_BIN_EXE_travertine"))
            .arg("sheet")
            .arg(&big)
            .stdout(Stdio::null())
            .stderr(Stdio::piped())
            .spawn()
            .expect("the binary runs");
        let mut peak = 0;
        loop {
            if let Some(kib) = peak_kib(child.id()) {
                peak = peak.max(kib);
            }
            if child.try_wait().expect("child state").is_some() {
                break;
            }
            std::thread::sleep(Duration::from_millis(20));
        }
        let elapsed = t.elapsed();
        let out = child.wait_with_output().expect("child output");
        assert!(
            out.status.success(),
            "{}",
            String::from_utf8_lossy(&out.stderr)
        );
        println!(
            "peak memory ({big_rows} rows, release binary, stdout to /dev/null): {:.1} MiB VmHWM, \
             {:.2} M rows/s",
            peak as f64 / 1024.0,
            big_rows as f64 / elapsed.as_secs_f64() / 1e6
        );
        let _ = std::fs::remove_file(&big);
    }
}
