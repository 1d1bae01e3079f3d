//! Linear propagation of uncertainties beside a plain solve, in both media
//! (issue 13): the ratio of the two is the cost of the uncertainty, and the
//! issue's target is at most 10.
//!
//! For each water and pair, measured back to back:
//! - `<water>/<pair>/plain_solve`: [`PreparedWater::solve`] of the pair,
//!   the constants already made;
//! - `<water>/<pair>/linear_pair_only`: [`propagate_quantities`] of pCO2
//!   with the uncertainties of the two measured parameters alone,
//!   constants off;
//! - `<water>/<pair>/plain_solve_from_water`: [`Water::solve`], as a
//!   caller with a sample solves it (the constants made for it);
//! - `<water>/<pair>/linear_default_from_water`: [`Problem::new`] and
//!   [`propagate_quantities`] of pCO2 with the realistic default setup (below), as a
//!   caller with a sample propagates it;
//! - `<water>/<pair>/plain_every_output_from_water`: [`Water::solve`] and
//!   every numeric output read from the state ([`values_into`]), as
//!   `solve --json` reports them without uncertainties;
//! - `<water>/<pair>/linear_default_every_output`: [`Problem::new`] and
//!   [`outputs_propagated`], every numeric output (as `solve --json
//!   --uncertainty` and the sheet's `_u` columns), the same setup;
//! - `<water>/<pair>/differences_default_every_output`: the same by
//!   [`propagate`] with the outputs read by a closure, so by forward
//!   differences of solves for every source: the method the pass on
//!   tangents replaces, measured beside it;
//! - `<water>/<pair>/plain_every_output_with_air`,
//!   `linear_default_every_output_with_air` and
//!   `differences_default_every_output_with_air`: the same three with air
//!   over the water (a 4 m/s wind), as the command line's `solve` always
//!   has it: the exchange with the air and the water at equilibrium with
//!   it (a second solve) in every one, and the wind (10 %) a source more
//!   in the propagations (13 in sea water, 15 in the pond, the wind among
//!   them); the differences by full solves with the exchange, the problem
//!   made once;
//! - `<water>/<pair>/linear_default`: [`propagate_quantities`] with the realistic
//!   default setup: the two measured parameters, temperature (0.1 °C), in
//!   sea water salinity (0.01), in the pond salinity (the route of its
//!   ionic strength, 5 %) and calcium (3 %), and the default uncertainties
//!   of the constants ([`SALINE_DEFAULTS`]: 8 sources; [`FRESH_DEFAULTS`]:
//!   9, the calcium ion pairs included). That is 12 sources in sea water
//!   and 14 in the pond.
//!
//! The waters: sea water at 25 °C and salinity 35; an invented pond at
//! 15 °C, salinity 0.2, calcium 1 mmol/kg. The pairs: pH with alkalinity
//! (2000 µmol/kg), whose solve has a closed form, and alkalinity with DIC
//! (1900 µmol/kg in sea water, 2100 in the pond), a root search. The
//! quantity propagated is pCO2 (one output; the cost of reading more
//! outputs from each perturbed state is that of the reading).
//!
//! [`PreparedWater::solve`]: travertine::PreparedWater::solve
//! [`Water::solve`]: travertine::Water::solve
//! [`outputs_propagated`]: travertine::output::uncertainty::outputs_propagated
//! [`values_into`]: travertine::output::uncertainty::values_into
//! [`SALINE_DEFAULTS`]: travertine::decisions::uncertainty::SALINE_DEFAULTS
//! [`FRESH_DEFAULTS`]: travertine::decisions::uncertainty::FRESH_DEFAULTS
//! [`propagate_quantities`]: travertine::decisions::uncertainty::propagate_quantities
//! [`propagate`]: travertine::decisions::uncertainty::propagate

use criterion::{criterion_group, criterion_main, Criterion};
use std::hint::black_box;
use std::time::Duration;
use travertine::decisions::uncertainty::{
    propagate, propagate_quantities, Problem, Size, Uncertainties,
};
use travertine::output::uncertainty::{
    numeric_outputs, outputs_propagated, values_into, OutputQuantities,
};
use travertine::output::Output;
use travertine::sample::air::Air;
use travertine::sample::inputs::{Input, Total};
use travertine::units::Amount;
use travertine::{Composition, Conditions, Measured, Parameter, PhScale, Water};

/// The uncertainty of a measured parameter: 0.01 in pH, 2 µmol/kg of
/// alkalinity or DIC (common practice for titrations and coulometry).
fn size_of(p: Parameter) -> Size {
    match p {
        Parameter::Ph => Size::Absolute(0.01),
        _ => Size::Absolute(2.0),
    }
}

fn pair_only(a: Measured, b: Measured) -> Uncertainties {
    Uncertainties::new()
        .without_constants()
        .with_input(Input::Carbon(a.parameter()), size_of(a.parameter()))
        .and_then(|u| u.with_input(Input::Carbon(b.parameter()), size_of(b.parameter())))
        .unwrap()
}

fn realistic(a: Measured, b: Measured, fresh: bool) -> Uncertainties {
    let u = Uncertainties::new()
        .with_input(Input::Carbon(a.parameter()), size_of(a.parameter()))
        .and_then(|u| u.with_input(Input::Carbon(b.parameter()), size_of(b.parameter())))
        .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.1)));
    if fresh {
        u.and_then(|u| u.with_input(Input::Salinity, Size::Percent(5.0)))
            .and_then(|u| u.with_input(Input::Total(Total::Calcium), Size::Percent(3.0)))
            .unwrap()
    } else {
        u.and_then(|u| u.with_input(Input::Salinity, Size::Absolute(0.01)))
            .unwrap()
    }
}

/// The one output of the pCO2 cases.
const PCO2: [Output; 1] = [Output::Pco2];

fn bench(c: &mut Criterion) {
    let pond = Water::fresh(Conditions::new(15.0, 0.2).unwrap())
        .unwrap()
        .with_composition(
            Composition::default()
                .with_calcium(Amount::PerKg(1e-3))
                .unwrap(),
        );
    let sea = Water::saline(Conditions::new(25.0, 35.0).unwrap()).unwrap();
    let ta = Measured::alkalinity_umol_kg(2000.0).unwrap();
    let mut group = c.benchmark_group("uncertainty");
    group
        .warm_up_time(Duration::from_millis(500))
        .measurement_time(Duration::from_secs(2));
    for (name, water, ph, dic, fresh) in [
        (
            "saline",
            sea,
            Measured::ph(8.05, Some(PhScale::Total)).unwrap(),
            Measured::dic_umol_kg(1900.0).unwrap(),
            false,
        ),
        (
            "fresh",
            pond,
            Measured::ph(7.6, None).unwrap(),
            Measured::dic_umol_kg(2100.0).unwrap(),
            true,
        ),
    ] {
        let prepared = water.prepare().unwrap();
        for (pair, a, b) in [("ph+alkalinity", ph, ta), ("alkalinity+dic", ta, dic)] {
            let problem = Problem::new(&water, a, b).unwrap();
            let only = pair_only(a, b);
            let default = realistic(a, b, fresh);
            group.bench_function(format!("{name}/{pair}/plain_solve"), |bench| {
                bench.iter(|| black_box(prepared.solve(black_box(a), b).unwrap()))
            });
            group.bench_function(format!("{name}/{pair}/linear_pair_only"), |bench| {
                bench.iter(|| {
                    black_box(
                        propagate_quantities(&problem, &only, OutputQuantities(&PCO2)).unwrap(),
                    )
                })
            });
            group.bench_function(format!("{name}/{pair}/plain_solve_from_water"), |bench| {
                bench.iter(|| black_box(black_box(&water).solve(black_box(a), b).unwrap()))
            });
            group.bench_function(
                format!("{name}/{pair}/linear_default_from_water"),
                |bench| {
                    bench.iter(|| {
                        let problem = Problem::new(black_box(&water), a, b).unwrap();
                        black_box(
                            propagate_quantities(&problem, &default, OutputQuantities(&PCO2))
                                .unwrap(),
                        )
                    })
                },
            );
            let outputs = numeric_outputs();
            group.bench_function(
                format!("{name}/{pair}/plain_every_output_from_water"),
                |bench| {
                    let mut values = Vec::with_capacity(outputs.len());
                    bench.iter(|| {
                        let s = black_box(&water).solve(black_box(a), b).unwrap();
                        values.clear();
                        values_into(&outputs, &s, &mut values);
                        black_box(&values);
                    })
                },
            );
            group.bench_function(
                format!("{name}/{pair}/linear_default_every_output"),
                |bench| {
                    bench.iter(|| {
                        let problem = Problem::new(black_box(&water), a, b).unwrap();
                        black_box(outputs_propagated(&problem, &default).unwrap())
                    })
                },
            );
            group.bench_function(
                format!("{name}/{pair}/differences_default_every_output"),
                |bench| {
                    bench.iter(|| {
                        let problem = Problem::new(black_box(&water), a, b).unwrap();
                        black_box(
                            propagate(&problem, &default, |s, out| values_into(&outputs, s, out))
                                .unwrap(),
                        )
                    })
                },
            );
            // With air over the water, as the command line's `solve`
            // always has it: the exchange and the water at equilibrium with
            // the air (a second solve) in both; the wind (10 %) a source
            // more in the propagation.
            let air = Air::new().with_wind_m_s(4.0).unwrap();
            let with_wind = default
                .clone()
                .with_input(Input::Wind, Size::Percent(10.0))
                .unwrap();
            let with_air = Problem::new(&water, a, b).unwrap().with_air(air, None);
            group.bench_function(
                format!("{name}/{pair}/plain_every_output_with_air"),
                |bench| {
                    let mut values = Vec::with_capacity(outputs.len());
                    bench.iter(|| {
                        let s = black_box(&water)
                            .solve(black_box(a), b)
                            .and_then(|s| s.with_exchange(&air, None))
                            .unwrap();
                        values.clear();
                        values_into(&outputs, &s, &mut values);
                        black_box(&values);
                    })
                },
            );
            group.bench_function(
                format!("{name}/{pair}/linear_default_every_output_with_air"),
                |bench| {
                    bench.iter(|| {
                        let problem = Problem::new(black_box(&water), a, b)
                            .unwrap()
                            .with_air(air, None);
                        black_box(outputs_propagated(&problem, &with_wind).unwrap())
                    })
                },
            );
            group.bench_function(
                format!("{name}/{pair}/differences_default_every_output_with_air"),
                |bench| {
                    bench.iter(|| {
                        black_box(
                            propagate(black_box(&with_air), &with_wind, |s, out| {
                                values_into(&outputs, s, out)
                            })
                            .unwrap(),
                        )
                    })
                },
            );
            group.bench_function(format!("{name}/{pair}/linear_default"), |bench| {
                bench.iter(|| {
                    black_box(
                        propagate_quantities(&problem, &default, OutputQuantities(&PCO2)).unwrap(),
                    )
                })
            });
        }
    }
    group.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);
