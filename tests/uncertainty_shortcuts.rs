//! The constants the propagation moves without a solve (a solubility
//! product that moves only its mineral's Ω and SI, K0 where the pair has no
//! gas-phase parameter, a constant of a system the water does not have)
//! move every numeric output as a full solve with the constant perturbed
//! does: checked here on every numeric output of the list, for every
//! constant, in waters and pairs that take each path (a gas-phase pair,
//! which must solve; fresh waters with the precipitation potential and the
//! ionic strength from the ions; sea water without sulfate; at depth).

mod common;

use travertine::decisions::uncertainty::{propagate, Problem, Size, Uncertainties};
use travertine::medium::ConstantName;
use travertine::output::uncertainty::{numeric_outputs, values_into};
use travertine::units::Amount;
use travertine::{Composition, Conditions, Measured, PhScale, SolveOptions, Water};

fn read(s: &travertine::State) -> Vec<Option<f64>> {
    let mut v = Vec::new();
    values_into(&numeric_outputs(), s, &mut v);
    v
}

#[test]
fn constants_moved_without_a_solve_move_every_output_as_a_solve_does() {
    let sea = Water::saline(Conditions::new(25.0, 35.0).unwrap()).unwrap();
    let sea_without_sulfate = sea.clone().with_composition(
        Composition::default()
            .with_sulfate(Amount::PerKg(0.0))
            .unwrap(),
    );
    let deep = Water::saline(
        Conditions::new(8.0, 34.0)
            .and_then(|c| c.with_pressure_dbar(2000.0))
            .unwrap(),
    )
    .unwrap();
    let pond = common::calcium_pond(15.0);
    let ions = common::ions_water();
    let bare = Water::fresh(Conditions::new(12.0, 0.1).unwrap()).unwrap();
    let ph = |v| Measured::ph(v, None).unwrap();
    let ph_total = |v| Measured::ph(v, Some(PhScale::Total)).unwrap();
    let ta = |v| Measured::alkalinity_umol_kg(v).unwrap();
    let dic = |v| Measured::dic_umol_kg(v).unwrap();
    let pco2 = |v| Measured::pco2_uatm(v).unwrap();
    let co2 = |v| Measured::co2_umol_kg(v).unwrap();
    let with_pp = SolveOptions::default().with_precipitation_potential(true);
    let plain = SolveOptions::default();
    let cases = [
        (&sea, ph_total(8.05), ta(2300.0), plain),
        (&sea, pco2(450.0), ta(2300.0), plain),
        (&sea, co2(12.0), ta(2300.0), plain),
        (&sea_without_sulfate, ph_total(8.05), ta(2300.0), plain),
        (&deep, ph_total(7.8), ta(2350.0), plain),
        (&pond, ph(7.9), ta(2100.0), with_pp),
        (&pond, pco2(2000.0), ta(2100.0), with_pp),
        (&pond, co2(40.0), ta(2100.0), plain),
        (&ions, ph(7.6), ta(2000.0), with_pp),
        (&ions, dic(2100.0), ta(2000.0), with_pp),
        (&bare, ph(7.2), ta(1500.0), plain),
    ];
    // 5 % of K (of the total boron) is 0.05/ln 10 in pK.
    let (h, size) = (1e-6, 0.05 / std::f64::consts::LN_10);
    let mut checked = 0;
    for (water, a, b, options) in cases {
        let prepared = water.prepare().unwrap();
        let base = read(&prepared.solve_with(a, b, &options).unwrap());
        let p = Problem::new(water, a, b).unwrap().with_options(options);
        for which in ConstantName::ALL {
            let u = Uncertainties::new()
                .without_constants()
                .with_constant(which, Size::Percent(5.0))
                .unwrap();
            let r = propagate(&p, &u, |s, out| values_into(&numeric_outputs(), s, out)).unwrap();
            let moved = read(
                &prepared
                    .with_constants_perturbed(which, h)
                    .and_then(|w| w.solve_with(a, b, &options))
                    .unwrap(),
            );
            for (k, (y, m)) in base.iter().zip(&moved).enumerate() {
                let (Some(y), Some(m)) = (y, m) else {
                    assert_eq!(y.is_some(), r.outputs[k].u.is_some());
                    continue;
                };
                let expected = (m - y) / h * size;
                let got = r.contributions(k).first().copied().unwrap_or(0.0);
                // The solves agree to about 1e-12 relative, divided by h.
                assert!(
                    (got - expected).abs() <= 1e-6 * expected.abs() + 1e-7 * y.abs().max(1e-3),
                    "{:?} {:?}+{:?} {which:?} {:?}: {got} against {expected}",
                    water.medium(),
                    a.parameter(),
                    b.parameter(),
                    numeric_outputs()[k],
                );
                checked += 1;
            }
        }
    }
    eprintln!("checked {checked}");
    assert!(checked > 11 * 18 * 30, "{checked}");
}
