//! Benchmarks of a full solve: constants evaluated from scratch, then the
//! two measured parameters turned into the complete state.
//!
//! - `constants/surface`: [`Water::constants`] alone, the floor of every solve;
//! - `full_solve/<a>+<b>`: [`Water::solve`] for each of the 30 usable pairs
//!   (the 36 pairs of nine parameters minus the 6 pairs of two gas
//!   parameters), in sea water at salinity 35, 25 °C, alkalinity 2300 and
//!   DIC 2000 µmol/kg;
//! - `floor_beside/<a>+<b>`: the constants floor again, measured just before
//!   each pair, for a ratio that does not depend on how the shared machine's
//!   speed drifts over the run;
//! - `deep_nutrients/*`: the same water at 2000 dbar with phosphate 2 and
//!   silicate 50 µmol/kg, constants and the alkalinity + DIC pair;
//! - `low_salinity/*`: salinity 5, constants and the alkalinity + DIC pair;
//! - `fresh_with_calcium/<a>+<b>`: every pair in an invented pond (fresh
//!   medium, specific conductance and calcium given), each measured right
//!   after `saline_beside/fresh_with_calcium/<a>+<b>`, the same pair in the
//!   sea water above;
//! - `fresh_without_calcium/*`: the same pond without calcium, alkalinity
//!   with pH and with DIC, each beside its saline pair;
//! - `exchange/<water>/plain` and `exchange/<water>/with_exchange`: the
//!   alkalinity + pH solve of the sea water and of the pond with calcium,
//!   then the same solve followed by [`State::with_exchange`] (a 5 m/s
//!   wind, air CO2 420 ppm: the flux and the water at equilibrium with the
//!   air, a second solve), measured back to back; and the same two with
//!   the water prepared once (`prepared_plain`, `prepared_with_exchange`,
//!   as a sheet of one water solves its rows);
//! - `binding_rows/saline_ph_alkalinity_with_air` and
//!   `binding_rows/fresh_with_calcium_and_air`: 32 rows over the ranges of
//!   the Python binding's speed benchmark, each row a water made, solved
//!   and given its exchange with the default air, as the library loops of
//!   the binding do; measured back to back, their ratio is the
//!   library-level fresh/saline ratio of issue 15.
//!
//! The values of the other seven parameters come from solving the
//! alkalinity + DIC pair once, so every pair describes the same water.
//! Setup checks that every pair solves and gives back that water.

use criterion::{criterion_group, criterion_main, Criterion};
use std::hint::black_box;
use std::time::Duration;
use travertine::base::units::Amount;
use travertine::sample::air::Air;
use travertine::sample::composition::Composition;
use travertine::{Conditions, Measured, Parameter, State, Water};

/// Alkalinity of the benchmark water, µmol/kg (demo value).
const ALKALINITY_UMOL_KG: f64 = 2300.0;
/// DIC of the benchmark water, µmol/kg (demo value).
const DIC_UMOL_KG: f64 = 2000.0;

fn sea_water() -> Water {
    Water::saline(Conditions::new(25.0, 35.0).expect("conditions")).expect("sea water")
}

fn deep_water_with_nutrients() -> Water {
    let conditions = Conditions::new(25.0, 35.0)
        .and_then(|c| c.with_pressure_dbar(2000.0))
        .expect("conditions at 2000 dbar");
    let composition = Composition::default()
        .with_phosphate(Amount::PerKg(2e-6))
        .and_then(|c| c.with_silicate(Amount::PerKg(50e-6)))
        .expect("composition");
    Water::saline(conditions)
        .expect("deep water")
        .with_composition(composition)
}

fn low_salinity_water() -> Water {
    Water::saline(Conditions::new(25.0, 5.0).expect("conditions")).expect("brackish water")
}

fn alkalinity_dic() -> (Measured, Measured) {
    (
        Measured::alkalinity_umol_kg(ALKALINITY_UMOL_KG).expect("alkalinity"),
        Measured::dic_umol_kg(DIC_UMOL_KG).expect("dic"),
    )
}

/// Parameter `p` as measured in the water of `state`.
fn measured(p: Parameter, state: &State) -> Measured {
    state
        .measured(p)
        .unwrap_or_else(|e| panic!("{}: {e}", p.name()))
}

/// Every usable pair, in the order of [`Parameter::ALL`]: 30 of them.
fn usable_pairs() -> Vec<(Parameter, Parameter)> {
    let all = Parameter::ALL;
    let mut pairs = Vec::new();
    for (i, &a) in all.iter().enumerate() {
        for &b in &all[i + 1..] {
            if !(a.is_gas() && b.is_gas()) {
                pairs.push((a, b));
            }
        }
    }
    assert_eq!(pairs.len(), 30, "36 pairs minus 6 gas-gas pairs");
    pairs
}

/// Solves `a` with `b` once and checks it gives back the reference water:
/// the same pH and DIC (a consistency check of the benchmark inputs, not a
/// reference value).
fn check_pair(water: &Water, reference: &State, a: Measured, b: Measured) {
    let name = format!("{}+{}", a.parameter().name(), b.parameter().name());
    let s = water
        .solve(a, b)
        .unwrap_or_else(|e| panic!("{name} does not solve: {e}"));
    assert!(
        (s.ph_total - reference.ph_total).abs() < 1e-6,
        "{name}: pH {} against {}",
        s.ph_total,
        reference.ph_total
    );
    assert!(
        (s.dic_umol_kg / reference.dic_umol_kg - 1.0).abs() < 1e-6,
        "{name}: DIC {} against {}",
        s.dic_umol_kg,
        reference.dic_umol_kg
    );
}

fn bench_constants(c: &mut Criterion) {
    let water = sea_water();
    water.constants().expect("constants");
    let mut group = c.benchmark_group("constants");
    group.bench_function("surface", |bench| {
        bench.iter(|| black_box(&water).constants().expect("constants"))
    });
    group.finish();
}

fn bench_full_solve(c: &mut Criterion) {
    let water = sea_water();
    let (ta, dic) = alkalinity_dic();
    let reference = water.solve(ta, dic).expect("reference state");
    let cases: Vec<(String, Measured, Measured)> = usable_pairs()
        .into_iter()
        .map(|(pa, pb)| {
            let (a, b) = (measured(pa, &reference), measured(pb, &reference));
            check_pair(&water, &reference, a, b);
            (format!("{}+{}", pa.name(), pb.name()), a, b)
        })
        .collect();

    // Each pair is measured right after the constants floor, so that the
    // ratio of the two compares measurements a few seconds apart: on a
    // shared machine the speed drifts by tens of percent over a run.
    for (name, a, b) in &cases {
        let mut floor = c.benchmark_group("floor_beside");
        floor.bench_function(name.as_str(), |bench| {
            bench.iter(|| black_box(&water).constants().expect("constants"))
        });
        floor.finish();
        let mut group = c.benchmark_group("full_solve");
        group.bench_function(name.as_str(), |bench| {
            bench.iter(|| {
                black_box(&water)
                    .solve(black_box(*a), black_box(*b))
                    .expect("solve")
            })
        });
        group.finish();
    }
}

/// Constants and the alkalinity + DIC solve for one other water.
fn bench_other_water(c: &mut Criterion, group_name: &str, water: Water) {
    let (ta, dic) = alkalinity_dic();
    water.constants().expect("constants");
    let reference = water.solve(ta, dic).expect("alkalinity+dic solves");
    check_pair(&water, &reference, ta, dic);

    let mut group = c.benchmark_group(group_name);
    group.bench_function("constants", |bench| {
        bench.iter(|| black_box(&water).constants().expect("constants"))
    });
    group.bench_function("alkalinity+dic", |bench| {
        bench.iter(|| {
            black_box(&water)
                .solve(black_box(ta), black_box(dic))
                .expect("solve")
        })
    });
    group.finish();
}

fn bench_deep_nutrients(c: &mut Criterion) {
    bench_other_water(c, "deep_nutrients", deep_water_with_nutrients());
}

fn bench_low_salinity(c: &mut Criterion) {
    bench_other_water(c, "low_salinity", low_salinity_water());
}

/// An invented pond in the fresh medium: 22 °C, specific conductance
/// 350 µS/cm (the ionic strength from Russell 1976, as on a field sheet),
/// with or without calcium 1.2 mmol/L; its state from alkalinity 2400
/// µmol/kg and pH 7.6 (NBS).
fn pond(calcium: bool) -> Water {
    let water = Water::fresh(Conditions::new(22.0, 0.2).expect("conditions"))
        .expect("fresh")
        .with_specific_conductance_us_cm(350.0)
        .expect("conductance");
    if !calcium {
        return water;
    }
    water.with_composition(
        Composition::default()
            .with_calcium(Amount::PerLitre(1.2e-3))
            .expect("calcium"),
    )
}

/// Every fresh pair with calcium, each measured right after the same pair
/// in sea water (`saline_beside/<pair>`), for a ratio that does not depend
/// on how the machine's speed drifts over the run; and alkalinity + pH and
/// alkalinity + DIC without calcium.
fn bench_fresh(c: &mut Criterion) {
    let sea = sea_water();
    let sea_reference = sea
        .solve(alkalinity_dic().0, alkalinity_dic().1)
        .expect("sea");
    let ta = Measured::alkalinity_umol_kg(2400.0).expect("alkalinity");
    let ph = Measured::ph(7.6, None).expect("ph");
    for (group_name, calcium) in [
        ("fresh_with_calcium", true),
        ("fresh_without_calcium", false),
    ] {
        let water = pond(calcium);
        let reference = water.solve(ta, ph).expect("alkalinity+ph solves");
        let pairs = if calcium {
            usable_pairs()
        } else {
            vec![
                (Parameter::Alkalinity, Parameter::Ph),
                (Parameter::Alkalinity, Parameter::Dic),
            ]
        };
        for (pa, pb) in pairs {
            let name = format!("{}+{}", pa.name(), pb.name());
            let (a, b) = (measured(pa, &reference), measured(pb, &reference));
            check_fresh_pair(&water, &reference, a, b);
            let (sa, sb) = (measured(pa, &sea_reference), measured(pb, &sea_reference));
            let mut beside = c.benchmark_group("saline_beside");
            beside.bench_function(format!("{group_name}/{name}"), |bench| {
                bench.iter(|| {
                    black_box(&sea)
                        .solve(black_box(sa), black_box(sb))
                        .expect("solve")
                })
            });
            beside.finish();
            let mut group = c.benchmark_group(group_name);
            group.bench_function(name.as_str(), |bench| {
                bench.iter(|| {
                    black_box(&water)
                        .solve(black_box(a), black_box(b))
                        .expect("solve")
                })
            });
            group.finish();
        }
    }
}

/// The plain solve beside the solve with the exchange with the air, for
/// sea water and the pond with calcium.
fn bench_exchange(c: &mut Criterion) {
    let air = Air::new()
        .with_wind_m_s(5.0)
        .and_then(|a| a.with_co2_ppm(420.0))
        .expect("air");
    let sea = sea_water();
    let sea_state = sea
        .solve(alkalinity_dic().0, alkalinity_dic().1)
        .expect("sea");
    let sea_pair = (
        measured(Parameter::Alkalinity, &sea_state),
        measured(Parameter::Ph, &sea_state),
    );
    let ta = Measured::alkalinity_umol_kg(2400.0).expect("alkalinity");
    let ph = Measured::ph(7.6, None).expect("ph");
    for (name, water, (a, b)) in [("sea", sea, sea_pair), ("pond", pond(true), (ta, ph))] {
        let with = water
            .solve(a, b)
            .and_then(|s| s.with_exchange(&air, None))
            .expect("exchange");
        assert!(with
            .exchange
            .is_some_and(|e| e.co2_flux_mmol_m2_d.is_some() && e.equilibrium_ph.is_some()));
        let mut group = c.benchmark_group("exchange");
        group.bench_function(format!("{name}/plain"), |bench| {
            bench.iter(|| {
                black_box(&water)
                    .solve(black_box(a), black_box(b))
                    .expect("solve")
            })
        });
        group.bench_function(format!("{name}/with_exchange"), |bench| {
            bench.iter(|| {
                black_box(&water)
                    .solve(black_box(a), black_box(b))
                    .and_then(|s| s.with_exchange(black_box(&air), None))
                    .expect("solve with exchange")
            })
        });
        let prepared = water.prepare().expect("prepared");
        group.bench_function(format!("{name}/prepared_plain"), |bench| {
            bench.iter(|| {
                black_box(&prepared)
                    .solve(black_box(a), black_box(b))
                    .expect("solve")
            })
        });
        group.bench_function(format!("{name}/prepared_with_exchange"), |bench| {
            bench.iter(|| {
                let p = black_box(&prepared);
                p.solve(black_box(a), black_box(b))
                    .and_then(|s| p.with_exchange(s, black_box(&air), None))
                    .expect("solve with exchange")
            })
        });
        group.finish();
    }
}

/// Rows of the Python binding's speed benchmark
/// (`bindings/python/benches/speed.py`), drawn evenly over its ranges by a
/// fixed sequence (invented values): fresh rows of 5–30 °C, specific
/// conductance 150–600 µS/cm, alkalinity 40–160 mg/L as CaCO3, pH (NBS)
/// 7.0–8.6 and calcium 10–80 mg/L; saline rows of 10–30 °C, salinity
/// 30–35, alkalinity 2100–2400 µmol/kg and pH (total) 7.8–8.2.
const BINDING_ROWS: usize = 32;

/// The k-th of `BINDING_ROWS` points of a low-discrepancy sequence in
/// [lo, hi] (the golden-ratio sequence, shifted per input by `shift`).
fn spread(k: usize, shift: f64, lo: f64, hi: f64) -> f64 {
    let golden = 0.618_033_988_749_894_9;
    let u = (shift + golden * k as f64).fract();
    lo + (hi - lo) * u
}

/// The library's own loop over the binding's rows, as
/// `library_loop_fresh` and `library_loop` in `bindings/python/src`
/// solve them: a water made for each row, the pair solved, then the
/// exchange with the default air (the water at equilibrium with it, a
/// second solve). Each fresh row and each saline row, measured back to
/// back in one run (`binding_rows/fresh_with_calcium_and_air` beside
/// `binding_rows/saline_ph_alkalinity_with_air`), gives the library-level
/// ratio of issue 15.
fn bench_binding_rows(c: &mut Criterion) {
    use travertine::units::{Quantity, Unit, CA_G_MOL};
    use travertine::PhScale;
    let air = Air::new();
    let fresh_row = |k: usize| -> State {
        let calcium = Amount::from_quantity(
            Quantity::new(spread(k, 0.1, 10.0, 80.0), Unit::MgPerLCa),
            Unit::MgPerLCa,
            CA_G_MOL,
        )
        .expect("calcium");
        Water::fresh(Conditions::new(spread(k, 0.3, 5.0, 30.0), 0.0).expect("conditions"))
            .and_then(|w| w.with_specific_conductance_us_cm(spread(k, 0.5, 150.0, 600.0)))
            .map(|w| w.with_composition(Composition::default().with_calcium(calcium).expect("ca")))
            .and_then(|w| {
                w.solve(
                    Measured::new(
                        Parameter::Alkalinity,
                        Quantity::new(spread(k, 0.7, 40.0, 160.0), Unit::MgPerLCaCO3),
                    )?,
                    Measured::ph(spread(k, 0.9, 7.0, 8.6), None)?,
                )
            })
            .and_then(|s| s.with_exchange(&air, None))
            .expect("fresh row")
    };
    let saline_row = |k: usize| -> State {
        Water::saline(
            Conditions::new(spread(k, 0.3, 10.0, 30.0), spread(k, 0.5, 30.0, 35.0))
                .expect("conditions"),
        )
        .and_then(|w| {
            w.solve(
                Measured::alkalinity_umol_kg(spread(k, 0.7, 2100.0, 2400.0))?,
                Measured::ph(spread(k, 0.9, 7.8, 8.2), Some(PhScale::Total))?,
            )
        })
        .and_then(|s| s.with_exchange(&air, None))
        .expect("saline row")
    };
    for k in 0..BINDING_ROWS {
        let (f, s) = (fresh_row(k), saline_row(k));
        assert!(f.langelier_index.is_some() && f.exchange.and_then(|e| e.equilibrium_ph).is_some());
        assert!(s.exchange.and_then(|e| e.equilibrium_ph).is_some());
    }
    let mut group = c.benchmark_group("binding_rows");
    group.bench_function("saline_ph_alkalinity_with_air", |bench| {
        bench.iter(|| {
            for k in 0..BINDING_ROWS {
                black_box(saline_row(black_box(k)));
            }
        })
    });
    group.bench_function("fresh_with_calcium_and_air", |bench| {
        bench.iter(|| {
            for k in 0..BINDING_ROWS {
                black_box(fresh_row(black_box(k)));
            }
        })
    });
    group.finish();
}

/// As [`check_pair`], on the NBS scale of the fresh medium.
fn check_fresh_pair(water: &Water, reference: &State, a: Measured, b: Measured) {
    let name = format!("{}+{}", a.parameter().name(), b.parameter().name());
    let s = water
        .solve(a, b)
        .unwrap_or_else(|e| panic!("fresh {name} does not solve: {e}"));
    assert!(
        (s.ph_nbs - reference.ph_nbs).abs() < 1e-6
            && (s.dic_umol_kg / reference.dic_umol_kg - 1.0).abs() < 1e-6,
        "fresh {name}: pH {} DIC {} against {} {}",
        s.ph_nbs,
        s.dic_umol_kg,
        reference.ph_nbs,
        reference.dic_umol_kg
    );
}

fn settings() -> Criterion {
    Criterion::default()
        .measurement_time(Duration::from_secs(2))
        .warm_up_time(Duration::from_secs(1))
        .sample_size(50)
}

criterion_group! {
    name = benches;
    config = settings();
    targets = bench_constants, bench_full_solve, bench_deep_nutrients, bench_low_salinity, bench_fresh,
        bench_exchange, bench_binding_rows
}
criterion_main!(benches);
