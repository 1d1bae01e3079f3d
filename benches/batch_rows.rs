//! The rows of the bindings beside the library's own loop (issue 15): the
//! Rust half of `bindings/python/benches/speed.py`, one thread, no Python.
//!
//! On the same 2,000 generated saline rows (alkalinity in µmol/kg and pH on
//! the total scale, temperature 10–30 °C, salinity 30–35: invented values in
//! natural ranges), measured back to back:
//! - `library_loop`: `Water::saline(Conditions::new(t, s)?)?.solve(...)`
//!   and `State::with_exchange`, every numeric output read from each state
//!   into its column;
//! - `batch`: [`Batch::solve`] of each row (the sheet's row path: the sample
//!   validated from its inputs, the pair chosen, flags judged, every caution
//!   written into the row's message), every numeric output read from the
//!   row's state ([`Outcome::state`]) into its column;
//! - `library_loop_no_exchange`, `batch_no_exchange`: the same without the
//!   exchange with the air and its outputs.
//!
//! The ratio `batch / library_loop` is what the binding's row path adds to
//! a row. The instructions per row in the README were counted with
//! callgrind on these two loops in a small program of their own (one
//! thread; 11,000 rows less 1,000, so that the set-up cancels), which the
//! clock of a shared machine cannot give as steadily.
//!
//! [`Batch::solve`]: travertine::sheet::Batch::solve
//! [`Outcome::state`]: travertine::sheet::Outcome::state

use criterion::{criterion_group, criterion_main, Criterion};
use std::hint::black_box;
use std::time::Duration;
use travertine::output::{Output, Value};
use travertine::sample::Air;
use travertine::sheet::{Batch, Cell, Outcome, SheetOptions};
use travertine::{Conditions, Measured, PhScale, Water};

const ROWS: usize = 2000;

/// The outputs of the exchange with the air.
const EXCHANGE: [&str; 10] = [
    "air_pco2_uatm",
    "co2_saturation_ratio",
    "equilibrium_ph",
    "equilibrium_ph_scale",
    "equilibrium_free_co2_mg_l",
    "schmidt_number",
    "gas_transfer",
    "k600_cm_h",
    "k_cm_h",
    "co2_flux_mmol_m2_d",
];

/// Temperature, salinity, alkalinity and pH of each row, from a fixed
/// linear congruential sequence (Knuth's MMIX constants).
fn rows() -> Vec<[f64; 4]> {
    let mut x: u64 = 15;
    let mut next = || {
        x = x
            .wrapping_mul(6_364_136_223_846_793_005)
            .wrapping_add(1_442_695_040_888_963_407);
        (x >> 11) as f64 / (1u64 << 53) as f64
    };
    (0..ROWS)
        .map(|_| {
            [
                10.0 + 20.0 * next(),
                30.0 + 5.0 * next(),
                2100.0 + 300.0 * next(),
                7.8 + 0.4 * next(),
            ]
        })
        .collect()
}

/// Every output but the precipitation potential (which costs about twenty
/// solves: the binding computes it only when asked), without the
/// exchange's where `exchange` is false.
fn outputs(exchange: bool) -> Vec<Output> {
    Output::ALL
        .iter()
        .copied()
        .filter(|o| o.key() != "precipitation_potential_mg_l_caco3")
        .filter(|o| exchange || !EXCHANGE.contains(&o.key()))
        .collect()
}

/// The numeric outputs of a state into row `i` of `columns`.
fn read(state: &travertine::State, outputs: &[Output], columns: &mut [Vec<f64>], i: usize) {
    for (column, o) in columns.iter_mut().zip(outputs) {
        if let Value::Number(Some(v)) = o.value(state) {
            column[i] = v;
        }
    }
}

fn library_loop(rows: &[[f64; 4]], outputs: &[Output], exchange: bool) -> Vec<Vec<f64>> {
    let mut columns = vec![vec![f64::NAN; rows.len()]; outputs.len()];
    for (i, r) in rows.iter().enumerate() {
        let state = Conditions::new(r[0], r[1])
            .and_then(Water::saline)
            .and_then(|w| {
                w.solve(
                    Measured::alkalinity_umol_kg(r[2])?,
                    Measured::ph(r[3], Some(PhScale::Total))?,
                )
            })
            .and_then(|s| {
                if exchange {
                    s.with_exchange(&Air::new(), None)
                } else {
                    Ok(s)
                }
            });
        if let Ok(state) = state {
            read(&state, outputs, &mut columns, i);
        }
    }
    columns
}

fn batch_rows(batch: &Batch, rows: &[[f64; 4]]) -> (Vec<Vec<f64>>, usize) {
    let outputs = batch.computed();
    let mut columns = vec![vec![f64::NAN; rows.len()]; outputs.len()];
    let mut out = Outcome::default();
    let mut message_bytes = 0;
    for (i, r) in rows.iter().enumerate() {
        let cells = r.map(Cell::Number);
        batch.solve(&cells, &mut out);
        message_bytes += out.message().len() + out.flags().len() + out.status().len();
        if let Some(state) = out.state() {
            read(state, outputs, &mut columns, i);
        }
    }
    (columns, message_bytes)
}

fn bench(c: &mut Criterion) {
    let rows = rows();
    let names = [
        "temperature_c",
        "salinity",
        "alkalinity_umol_kg",
        "ph_total",
    ];
    let mut group = c.benchmark_group("batch_rows");
    group
        .warm_up_time(Duration::from_millis(500))
        .measurement_time(Duration::from_secs(3))
        .sample_size(10);
    for exchange in [true, false] {
        let outputs = outputs(exchange);
        let keys: Vec<&str> = outputs.iter().map(|o| o.key()).collect();
        let options = SheetOptions::default()
            .with_columns(&(keys.join(",") + ",flags"))
            .unwrap();
        let batch = Batch::new(&names, &options).unwrap();
        // The same numbers both ways.
        let (mine, _) = batch_rows(&batch, &rows);
        let theirs = library_loop(&rows, &outputs, exchange);
        for (a, b) in mine.iter().zip(&theirs) {
            assert!(a
                .iter()
                .zip(b)
                .all(|(x, y)| x == y || (x.is_nan() && y.is_nan())));
        }
        let suffix = if exchange { "" } else { "_no_exchange" };
        group.bench_function(format!("library_loop{suffix}"), |b| {
            b.iter(|| library_loop(black_box(&rows), &outputs, exchange))
        });
        group.bench_function(format!("batch{suffix}"), |b| {
            b.iter(|| batch_rows(&batch, black_box(&rows)))
        });
    }
    group.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);
