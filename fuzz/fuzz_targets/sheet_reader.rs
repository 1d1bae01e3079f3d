//! Fuzzes the sheet reader: any bytes, read as a sheet with options taken
//! from the first byte, must give a result or an error, never a panic;
//! when a sheet is processed, every row read is written.

#![no_main]

use libfuzzer_sys::fuzz_target;
use travertine::sheet::{process, Format, SheetOptions};

fuzz_target!(|data: &[u8]| {
    let (flags, sheet) = match data.split_first() {
        Some((f, rest)) => (*f, rest),
        None => (0, data),
    };
    let mut options = SheetOptions::default()
        .with_decimal_comma(flags & 1 != 0)
        .with_format(if flags & 2 != 0 {
            Format::Jsonl
        } else {
            Format::Csv
        });
    if flags & 4 != 0 {
        options = options.with_delimiter(";").expect("a valid delimiter");
    }
    if flags & 8 != 0 {
        options = options.with_set("temperature_c=20").expect("a valid --set");
    }
    if flags & 16 != 0 {
        options = options.with_pair("alkalinity,ph").expect("a valid pair");
    }
    let mut out = Vec::new();
    if let Ok(summary) = process(&options, sheet, &mut out) {
        assert_eq!(summary.ok + summary.warning + summary.error, summary.rows);
        if flags & 2 != 0 {
            let lines = out.iter().filter(|b| **b == b'\n').count() as u64;
            assert_eq!(lines, summary.rows, "one JSON line per row");
        }
    }
});
