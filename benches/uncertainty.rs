//! Linear propagation of uncertainties beside a plain solve, in both media
//! (issue 13): the ratio of the two is the cost of the uncertainty. Each
//! source costs two full solves (a central difference), so the ratio is
//! about 1 + 2 × the number of sources with an uncertainty.

use criterion::{criterion_group, criterion_main, Criterion};
use std::hint::black_box;
use travertine::decisions::uncertainty::{propagate, Problem, Size, Uncertainties};
use travertine::sample::inputs::Input;
use travertine::units::Amount;
use travertine::{Composition, Conditions, Measured, Parameter, PhScale, Water};

fn bench(c: &mut Criterion) {
    let pond = Water::fresh(Conditions::new(15.0, 0.2).unwrap())
        .unwrap()
        .with_composition(
            Composition::default()
                .with_calcium(Amount::PerKg(1e-3))
                .unwrap(),
        );
    let sea = Water::saline(Conditions::new(25.0, 35.0).unwrap()).unwrap();
    let pair_only = Uncertainties::new()
        .without_constants()
        .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01))
        .and_then(|u| u.with_input(Input::Carbon(Parameter::Alkalinity), Size::Absolute(3.0)))
        .unwrap();
    let everything = Uncertainties::new()
        .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01))
        .and_then(|u| u.with_input(Input::Carbon(Parameter::Alkalinity), Size::Absolute(3.0)))
        .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.1)))
        .unwrap();
    let mut group = c.benchmark_group("uncertainty");
    for (name, water, ph) in [
        (
            "saline",
            sea,
            Measured::ph(8.05, Some(PhScale::Total)).unwrap(),
        ),
        ("fresh", pond, Measured::ph(7.6, None).unwrap()),
    ] {
        let ta = Measured::alkalinity_umol_kg(2000.0).unwrap();
        let problem = Problem::new(&water, ph, ta).unwrap();
        let prepared = water.prepare().unwrap();
        group.bench_function(format!("{name}/plain_solve"), |b| {
            b.iter(|| black_box(prepared.solve(black_box(ph), ta).unwrap()))
        });
        group.bench_function(format!("{name}/linear_pair_only"), |b| {
            b.iter(|| {
                black_box(propagate(&problem, &pair_only, |s| vec![Some(s.pco2_uatm)]).unwrap())
            })
        });
        group.bench_function(format!("{name}/linear_pair_temperature_constants"), |b| {
            b.iter(|| {
                black_box(propagate(&problem, &everything, |s| vec![Some(s.pco2_uatm)]).unwrap())
            })
        });
    }
    group.finish();
}

criterion_group!(benches, bench);
criterion_main!(benches);
