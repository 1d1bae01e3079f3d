//! The pass on tangents (forward-mode derivatives through the constants
//! and the state, implicit differentiation at the solver's root) against
//! the differences of full solves, on every numeric output, and against
//! sensitivities known exactly.

mod common;

use travertine::decisions::uncertainty::{
    propagate, propagate_quantities, Problem, Size, Source, Uncertainties,
};
use travertine::medium::ConstantName;
use travertine::output::uncertainty::{numeric_outputs, values_into, OutputQuantities};
use travertine::output::Output;
use travertine::sample::inputs::{Input, Total};
use travertine::units::Amount;
use travertine::{Composition, Conditions, Measured, Parameter, PhScale, Water};

/// Every numeric output's contributions by the pass on tangents and by
/// differences, for `problem` and `u`: they agree to the truncation of the
/// differences (a step of 10⁻⁶ of the source's scale; DEVELOPERS.md,
/// "Uncertainty"), here 2·10⁻⁵ of the output's u plus 10⁻¹² of its value.
/// Returns how many contributions were compared.
fn agree(problem: &Problem, u: &Uncertainties, what: &str) -> usize {
    let outputs = numeric_outputs();
    let by_tangents = propagate_quantities(problem, u, OutputQuantities(&outputs)).unwrap();
    let by_differences = propagate(problem, u, |s, out| values_into(&outputs, s, out)).unwrap();
    assert_eq!(by_tangents.sources, by_differences.sources);
    let mut compared = 0;
    for (k, o) in outputs.iter().enumerate() {
        let (t, d) = (&by_tangents.outputs[k], &by_differences.outputs[k]);
        // Bit for bit: a pass on tangents that covers every source gives
        // the values itself, without a state of numbers.
        assert_eq!(
            t.value.map(f64::to_bits),
            d.value.map(f64::to_bits),
            "{what}: {}",
            o.key()
        );
        let (Some(ut), Some(ud)) = (t.u, d.u) else {
            assert_eq!(t.u.is_some(), d.u.is_some(), "{what}: {}", o.key());
            continue;
        };
        let scale = ud.max(ut);
        let floor = 1e-12 * t.value.unwrap_or(0.0).abs();
        for (j, (ct, cd)) in by_tangents
            .contributions(k)
            .iter()
            .zip(by_differences.contributions(k))
            .enumerate()
        {
            assert!(
                (ct - cd).abs() <= 2e-5 * scale + floor,
                "{what}: {} from {}: tangent {ct:e}, differences {cd:e} (u {scale:e})",
                o.key(),
                by_tangents.sources[j].0.name()
            );
            compared += 1;
        }
    }
    compared
}

/// The problem took the one pass on tangents for `u`: the state's own
/// temperature gets exactly the uncertainty given (a derivative of exactly
/// 1, as the differences do not give it), with every other source of `u`
/// in the same pass. `u` must have a temperature of 0.1 °C.
fn assert_on_tangents(problem: &Problem, u: &Uncertainties, what: &str) {
    let r = propagate_quantities(problem, u, OutputQuantities(&[Output::TemperatureC])).unwrap();
    assert_eq!(r.outputs[0].u, Some(0.1), "{what}: not on tangents");
}

fn sea(t: f64, s: f64, p_dbar: f64) -> Water {
    Water::saline(
        Conditions::new(t, s)
            .and_then(|c| c.with_pressure_dbar(p_dbar))
            .unwrap(),
    )
    .unwrap()
}

#[test]
fn tangents_agree_with_differences_in_sea_water() {
    let ph = |v| Measured::ph(v, Some(PhScale::Total)).unwrap();
    let ph_nbs = |v| Measured::ph(v, Some(PhScale::Nbs)).unwrap();
    let ta = |v| Measured::alkalinity_umol_kg(v).unwrap();
    let ta_l = |v| Measured::alkalinity(v, travertine::units::Unit::UmolPerL).unwrap();
    let dic = |v| Measured::dic_umol_kg(v).unwrap();
    let pco2 = |v| Measured::pco2_uatm(v).unwrap();
    let fco2 = |v| Measured::fco2_uatm(v).unwrap();
    let xco2 = |v| Measured::xco2_ppm(v).unwrap();
    let co3 = |v| Measured::co3_umol_kg(v).unwrap();
    let hco3 = |v| Measured::hco3_umol_kg(v).unwrap();
    let co2 = |v| Measured::co2_umol_kg(v).unwrap();
    let nutrients = sea(12.0, 33.0, 0.0).with_composition(
        Composition::default()
            .with_phosphate(Amount::PerKg(2e-6))
            .and_then(|c| c.with_silicate(Amount::PerKg(30e-6)))
            .and_then(|c| c.with_ammonia(Amount::PerKg(5e-6)))
            .and_then(|c| c.with_sulfide(Amount::PerKg(1e-6)))
            .and_then(|c| c.with_calcium(Amount::PerKg(10.2e-3)))
            .unwrap(),
    );
    let cases: Vec<(&str, Water, Measured, Measured)> = vec![
        ("pH + TA", sea(25.0, 35.0, 0.0), ph(8.05), ta(2300.0)),
        ("TA + DIC", sea(25.0, 35.0, 0.0), ta(2300.0), dic(2000.0)),
        (
            "DIC + pH, deep",
            sea(2.0, 34.7, 3000.0),
            dic(2250.0),
            ph(7.75),
        ),
        ("pCO2 + TA", sea(18.0, 36.0, 0.0), pco2(420.0), ta(2350.0)),
        ("fCO2 + DIC", sea(10.0, 30.0, 0.0), fco2(380.0), dic(2050.0)),
        (
            "xCO2 + pH NBS",
            sea(28.0, 20.0, 0.0),
            xco2(600.0),
            ph_nbs(8.1),
        ),
        ("CO3 + TA", sea(25.0, 35.0, 0.0), co3(220.0), ta(2300.0)),
        ("HCO3 + CO2", sea(15.0, 35.0, 0.0), hco3(1800.0), co2(15.0)),
        (
            "TA per litre + DIC",
            sea(20.0, 35.0, 0.0),
            ta_l(2350.0),
            dic(2050.0),
        ),
        ("nutrients, pH + TA", nutrients, ph(7.9), ta(2250.0)),
    ];
    let mut compared = 0;
    for (what, water, a, b) in cases {
        let problem = Problem::new(&water, a, b).unwrap();
        let u = Uncertainties::new()
            .with_input(Input::Carbon(a.parameter()), Size::Percent(0.5))
            .and_then(|u| u.with_input(Input::Carbon(b.parameter()), Size::Percent(0.3)))
            .and_then(|u| u.with_constant(ConstantName::Ks, Size::Absolute(0.02)))
            .and_then(|u| u.with_constant(ConstantName::Kf, Size::Absolute(0.05)))
            .and_then(|u| u.with_constant(ConstantName::Kp2, Size::Absolute(0.02)))
            .and_then(|u| u.with_constant(ConstantName::Knh4, Size::Absolute(0.02)))
            .and_then(|u| u.with_input(Input::Total(Total::Calcium), Size::Percent(1.0)))
            .and_then(|u| u.with_input(Input::Total(Total::Silicate), Size::Percent(5.0)))
            .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.1)))
            .and_then(|u| u.with_input(Input::Salinity, Size::Absolute(0.02)))
            .unwrap();
        // The totals a water lacks refuse their uncertainty; drop them there.
        let u = match propagate(&problem, &u, |s, out| out.push(Some(s.ph_total))) {
            Ok(_) => u,
            Err(_) => Uncertainties::new()
                .with_input(Input::Carbon(a.parameter()), Size::Percent(0.5))
                .and_then(|u| u.with_input(Input::Carbon(b.parameter()), Size::Percent(0.3)))
                .and_then(|u| u.with_input(Input::Total(Total::Calcium), Size::Percent(1.0)))
                .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.1)))
                .and_then(|u| u.with_input(Input::Salinity, Size::Absolute(0.02)))
                .unwrap(),
        };
        compared += agree(&problem, &u, what);
    }
    assert!(compared > 5000, "{compared} contributions compared");
}

/// From pH and HCO3⁻, pCO2 ∝ [H⁺][HCO3⁻]/K1 (the definition of K1), so
/// u(pH) = 0.01 alone gives a relative u(pCO2) of ln(10) · 0.01 exactly to
/// first order, and u(pK1) = 0.01 the same. Exact derivatives give it to
/// rounding (differences of solves only to about 10⁻⁶).
#[test]
fn exact_sensitivities_come_out_to_rounding() {
    let water = sea(20.0, 35.0, 0.0);
    let problem = Problem::new(
        &water,
        Measured::ph(8.0, Some(PhScale::Total)).unwrap(),
        Measured::hco3_umol_kg(1800.0).unwrap(),
    )
    .unwrap();
    // With the default constants beside it, so that the pass is made
    // (`TANGENTS_FROM`): each source's own contribution is checked.
    let u = Uncertainties::new()
        .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01))
        .and_then(|u| u.with_constant(ConstantName::K1, Size::Absolute(0.01)))
        .unwrap();
    let r = propagate_quantities(&problem, &u, OutputQuantities(&[Output::Pco2])).unwrap();
    assert!(r.sources.len() >= travertine::decisions::uncertainty::TANGENTS_FROM);
    let exact = std::f64::consts::LN_10 * 0.01;
    for name in ["ph", "pK1"] {
        let j = r
            .sources
            .iter()
            .position(|(s, _)| s.name() == name)
            .unwrap();
        let relative = r.contributions(0)[j].abs() / r.outputs[0].value.unwrap();
        assert!(
            (relative / exact - 1.0).abs() < 1e-12,
            "{name}: {relative} against {exact}"
        );
    }
}

/// An output that the sources do not move has exactly zero uncertainty
/// (DIC measured, only the pH uncertain), and zero uncertainties give
/// exactly zero.
#[test]
fn zeros_stay_exact_on_tangents() {
    let water = sea(25.0, 35.0, 0.0);
    let problem = Problem::new(
        &water,
        Measured::dic_umol_kg(2000.0).unwrap(),
        Measured::ph(8.0, Some(PhScale::Total)).unwrap(),
    )
    .unwrap();
    let outputs = numeric_outputs();
    // The pH alone (by differences: fewer sources than a pass is made
    // for), and with the default constants (on tangents): either way the
    // measured DIC does not move, nor the state's own conditions.
    for (u, boron_moves) in [
        (
            Uncertainties::new()
                .without_constants()
                .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01))
                .unwrap(),
            false,
        ),
        (
            Uncertainties::new()
                .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01))
                .unwrap(),
            true,
        ),
    ] {
        let r = propagate_quantities(&problem, &u, OutputQuantities(&outputs)).unwrap();
        let at = |o: Output| r.outputs[outputs.iter().position(|x| *x == o).unwrap()].u;
        assert_eq!(at(Output::DicUmolKg), Some(0.0));
        assert_eq!(at(Output::TemperatureC), Some(0.0));
        assert_eq!(at(Output::Salinity), Some(0.0));
        // The total boron is a source among the default constants.
        assert_eq!(at(Output::BoronTotal) == Some(0.0), !boron_moves);
    }
    let none = propagate_quantities(
        &problem,
        &Uncertainties::new().without_constants(),
        OutputQuantities(&outputs),
    )
    .unwrap();
    assert!(none
        .outputs
        .iter()
        .all(|p| p.u.is_none() || p.u == Some(0.0)));
}

/// The temperature and the salinity are carried on tangents through every
/// published fit: the state's own temperature and salinity then have
/// exactly the uncertainty given (a derivative of exactly 1).
#[test]
fn temperature_and_salinity_are_sources_on_tangents() {
    let water = sea(12.0, 34.0, 0.0);
    let problem = Problem::new(
        &water,
        Measured::ph(8.0, Some(PhScale::Total)).unwrap(),
        Measured::alkalinity_umol_kg(2250.0).unwrap(),
    )
    .unwrap();
    let u = Uncertainties::new()
        .with_input(Input::Temperature, Size::Absolute(0.1))
        .and_then(|u| u.with_input(Input::Salinity, Size::Absolute(0.02)))
        .unwrap();
    let outputs = [Output::TemperatureC, Output::Salinity, Output::Pco2];
    let r = propagate_quantities(&problem, &u, OutputQuantities(&outputs)).unwrap();
    assert_eq!(r.outputs[0].u, Some(0.1));
    assert_eq!(r.outputs[1].u, Some(0.02));
    assert!(r.outputs[2].u.unwrap() > 0.0);
}

fn pond(t: f64, s: f64) -> Water {
    Water::fresh(Conditions::new(t, s).unwrap()).unwrap()
}

#[test]
fn tangents_agree_with_differences_in_fresh_water() {
    let ph = |v| Measured::ph(v, None).unwrap();
    let ta = |v| Measured::alkalinity_umol_kg(v).unwrap();
    let ta_mg = |v| Measured::alkalinity(v, travertine::units::Unit::MgPerLCaCO3).unwrap();
    let dic = |v| Measured::dic_umol_kg(v).unwrap();
    let pco2 = |v| Measured::pco2_uatm(v).unwrap();
    let hco3 = |v| Measured::hco3_umol_kg(v).unwrap();
    let calcium = |w: Water, c: f64| {
        w.with_composition(
            Composition::default()
                .with_calcium(Amount::PerKg(c))
                .unwrap(),
        )
    };
    let ions = common::ions_water();
    let tds = calcium(pond(20.0, 0.0), 0.8e-3)
        .with_tds_mg_l(350.0)
        .unwrap();
    let given = pond(8.0, 0.0).with_ionic_strength(0.004).unwrap();
    let cases: Vec<(&str, Water, Measured, Measured)> = vec![
        (
            "pond, pH + TA, salinity route",
            calcium(pond(15.0, 0.2), 1e-3),
            ph(7.6),
            ta(2000.0),
        ),
        (
            "pond, TA + DIC",
            calcium(pond(25.0, 0.3), 2e-3),
            ta(2000.0),
            dic(2100.0),
        ),
        (
            "pond, pH + TA in mg/L",
            calcium(pond(28.0, 0.1), 0.5e-3),
            ph(8.4),
            ta_mg(120.0),
        ),
        ("ions, pCO2 + TA", ions, pco2(900.0), ta(1800.0)),
        ("TDS, pH + DIC", tds, ph(7.2), dic(1500.0)),
        (
            "given I, HCO3 + pH, no calcium",
            given,
            hco3(900.0),
            ph(7.0),
        ),
        ("bare, pH + TA", pond(18.0, 0.0), ph(6.8), ta(400.0)),
    ];
    let mut compared = 0;
    for (what, water, a, b) in cases {
        let problem = Problem::new(&water, a, b).unwrap();
        let mut u = Uncertainties::new()
            .with_input(Input::Carbon(a.parameter()), Size::Percent(0.5))
            .and_then(|u| u.with_input(Input::Carbon(b.parameter()), Size::Percent(0.3)))
            .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.1)))
            .unwrap();
        // Each optional source where the water has it (the others refuse it).
        for extra in [
            (Input::Salinity, Size::Percent(5.0)),
            (Input::Total(Total::Calcium), Size::Percent(3.0)),
            (Input::Tds, Size::Percent(5.0)),
            (Input::IonicStrength, Size::Percent(5.0)),
        ] {
            let with = u.clone().with_input(extra.0, extra.1).unwrap();
            if propagate(&problem, &with, |s, out| out.push(Some(s.ph_nbs))).is_ok() {
                u = with;
            }
        }
        compared += agree(&problem, &u, what);
    }
    assert!(compared > 4000, "{compared} contributions compared");
    // The pass covered these waters: the temperature's own uncertainty
    // comes out exact (a derivative of exactly 1), which differences do
    // not give.
    let water = calcium(pond(15.0, 0.2), 1e-3);
    let problem = Problem::new(&water, ph(7.6), ta(2000.0)).unwrap();
    let u = Uncertainties::new()
        .with_input(Input::Temperature, Size::Absolute(0.1))
        .unwrap();
    let r = propagate_quantities(&problem, &u, OutputQuantities(&[Output::TemperatureC])).unwrap();
    assert_eq!(r.outputs[0].u, Some(0.1));
}

/// With air over the water the pass on tangents carries the exchange too:
/// the air's pCO2, the flux and the water at equilibrium with the air (a
/// second state on tangents, its pair the alkalinity and the air's fCO2
/// with their derivatives). Every contribution agrees with differences of
/// full solves with the exchange, in both media, with each model of the
/// transfer velocity.
#[test]
fn tangents_carry_the_exchange_with_the_air() {
    use travertine::fits::transfer::GasTransfer;
    use travertine::sample::air::Air;
    let ph = |v| Measured::ph(v, None).unwrap();
    let ta = |v| Measured::alkalinity_umol_kg(v).unwrap();
    let dic = |v| Measured::dic_umol_kg(v).unwrap();
    let with_calcium = |w: Water| {
        w.with_composition(
            Composition::default()
                .with_calcium(Amount::PerKg(1e-3))
                .unwrap(),
        )
    };
    let wind = |u| Air::new().with_wind_m_s(u).unwrap();
    type Case = (
        &'static str,
        Water,
        Measured,
        Measured,
        Air,
        Option<PhScale>,
    );
    let cases: Vec<Case> = vec![
        (
            "sea, pH + TA, Wanninkhof 2014",
            sea(25.0, 35.0, 0.0),
            ph(8.05),
            ta(2300.0),
            wind(7.0).with_co2_ppm(425.0).unwrap(),
            None,
        ),
        (
            "sea, TA + DIC, k600 given, NBS",
            sea(12.0, 33.0, 0.0),
            ta(2250.0),
            dic(2080.0),
            Air::new().with_k600_cm_h(9.0).unwrap(),
            Some(PhScale::Nbs),
        ),
        (
            "pond, pH + TA, Cole & Caraco 1998",
            with_calcium(pond(15.0, 0.2)),
            ph(7.6),
            ta(2000.0),
            wind(3.0),
            None,
        ),
        (
            "lake, TA + DIC, Vachon & Prairie 2013",
            with_calcium(pond(22.0, 0.1)),
            ta(1500.0),
            dic(1650.0),
            wind(4.5).with_lake_area_km2(2.0).unwrap(),
            None,
        ),
        (
            "pond, pH + TA, Wanninkhof 2014 chosen, smooth surface",
            with_calcium(pond(9.0, 0.3)),
            ph(8.3),
            ta(2600.0),
            wind(2.0).with_model(GasTransfer::Wanninkhof2014),
            None,
        ),
    ];
    let mut compared = 0;
    for (what, water, a, b, air, scale) in cases {
        let problem = Problem::new(&water, a, b).unwrap().with_air(air, scale);
        let mut u = Uncertainties::new()
            .with_input(Input::Carbon(a.parameter()), Size::Percent(0.5))
            .and_then(|u| u.with_input(Input::Carbon(b.parameter()), Size::Percent(0.3)))
            .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.1)))
            .and_then(|u| u.with_input(Input::Salinity, Size::Percent(2.0)))
            .unwrap();
        if air.wind_m_s().is_some() {
            u = u.with_input(Input::Wind, Size::Percent(10.0)).unwrap();
        }
        if water.medium() == travertine::Medium::Fresh {
            u = u
                .with_input(Input::Total(Total::Calcium), Size::Percent(3.0))
                .unwrap();
        }
        compared += agree(&problem, &u, what);
        assert_on_tangents(&problem, &u, what);
    }
    assert!(compared > 1500, "{compared} contributions compared");

    // Wanninkhof 2014: k600 = 0.251 U² (Sc/660)^−0.5, so the flux is
    // proportional to U² and d ln F / d ln U = 2 exactly (the formula;
    // nothing else in the flux depends on the wind). With 10 % of the wind
    // the wind's contribution to u(F) is 20 % of F, to rounding on
    // tangents (differences of solves give it to about 10⁻⁶).
    let (flux, c) = wind_share(
        Problem::new(&sea(25.0, 35.0, 0.0), ph(8.05), ta(2300.0))
            .unwrap()
            .with_air(wind(7.0).with_co2_ppm(425.0).unwrap(), None),
        Size::Percent(10.0),
    );
    assert!(
        (c / (0.2 * flux) - 1.0).abs() < 1e-12,
        "wind's share {c}, flux {flux}"
    );

    // In fresh water too (its pass has a fixed point of its own): Cole &
    // Caraco 1998, k600 = 2.07 + 0.215 U^1.7, so d ln F / d U =
    // 0.215 · 1.7 U^0.7 / k600 (the formula).
    let (flux, c) = wind_share(
        Problem::new(&with_calcium(pond(15.0, 0.2)), ph(7.6), ta(2000.0))
            .unwrap()
            .with_air(wind(3.0), None),
        Size::Absolute(0.3),
    );
    let k600 = 2.07 + 0.215 * 3f64.powf(1.7);
    let expected = flux * 0.215 * 1.7 * 3f64.powf(0.7) / k600 * 0.3;
    assert!(
        (c / expected - 1.0).abs() < 1e-12,
        "wind's share {c}, expected {expected}"
    );
}

/// The CO2 flux of `problem` and the wind's contribution to its u, with
/// `wind` the wind's uncertainty and 0.1 °C of temperature (and the
/// default constants: enough sources for the pass on tangents).
fn wind_share(problem: Problem, wind: Size) -> (f64, f64) {
    let u = Uncertainties::new()
        .with_input(Input::Wind, wind)
        .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.1)))
        .unwrap();
    let r = propagate_quantities(&problem, &u, OutputQuantities(&[Output::Co2Flux])).unwrap();
    let j = r
        .sources
        .iter()
        .position(|(s, _)| *s == Source::Input(Input::Wind))
        .unwrap();
    (r.outputs[0].value.unwrap(), r.contributions(0)[j])
}

/// Air whose inputs do not go together (a model that needs a lake area,
/// without one) is the same error on tangents as in a solve, in both
/// media: not an exchange without a flux.
#[test]
fn air_that_does_not_go_together_is_an_error_on_tangents_too() {
    use travertine::fits::transfer::GasTransfer;
    use travertine::sample::air::Air;
    let air = Air::new()
        .with_wind_m_s(5.0)
        .unwrap()
        .with_model(GasTransfer::VachonPrairie2013);
    for water in [sea(25.0, 35.0, 0.0), pond(15.0, 0.2)] {
        let problem = Problem::new(
            &water,
            Measured::ph(8.0, None).unwrap(),
            Measured::alkalinity_umol_kg(2000.0).unwrap(),
        )
        .unwrap()
        .with_air(air, None);
        let u = Uncertainties::new();
        let solved = problem.solve().unwrap_err();
        let by_differences = propagate(&problem, &u, |s, out| out.push(Some(s.pco2_uatm)));
        let on_tangents = propagate_quantities(&problem, &u, OutputQuantities(&[Output::Co2Flux]));
        assert_eq!(by_differences.unwrap_err(), solved);
        assert_eq!(on_tangents.unwrap_err(), solved);
    }
}

/// More sources than one pass has slots still take it where the extra
/// ones move nothing (constants of acid systems the water lacks): the
/// covered sources side by side, their rows spread onto every source's
/// place, zero for the others, every contribution as by differences.
#[test]
fn more_sources_than_slots_where_the_extra_ones_move_nothing() {
    let water = sea(18.0, 34.0, 0.0);
    let (a, b) = (
        Measured::ph(8.02, Some(PhScale::Total)).unwrap(),
        Measured::alkalinity_umol_kg(2280.0).unwrap(),
    );
    let problem = Problem::new(&water, a, b).unwrap();
    let mut u = Uncertainties::new()
        .with_input(Input::Carbon(a.parameter()), Size::Absolute(0.01))
        .and_then(|u| u.with_input(Input::Carbon(b.parameter()), Size::Absolute(2.0)))
        .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.1)))
        .and_then(|u| u.with_input(Input::Salinity, Size::Absolute(0.01)))
        .unwrap();
    // No phosphate, silicate, ammonia or sulfide in this water: their
    // constants move nothing.
    for k in [
        ConstantName::Kp1,
        ConstantName::Kp2,
        ConstantName::Kp3,
        ConstantName::Ksi,
        ConstantName::Knh4,
        ConstantName::Kh2s,
    ] {
        u = u.with_constant(k, Size::Absolute(0.02)).unwrap();
    }
    let n = propagate_quantities(&problem, &u, OutputQuantities(&[Output::Pco2]))
        .unwrap()
        .sources
        .len();
    assert_eq!(n, 18, "4 inputs, 8 default constants, 6 that move nothing");
    agree(&problem, &u, "18 sources, 6 moving nothing");
    assert_on_tangents(&problem, &u, "18 sources, 6 moving nothing");
}

/// The measured alkalinity is fixed by its measurement: with only the pH
/// and the constants uncertain its contributions are exactly zero on
/// tangents too (it is computed again from the solved unknowns, whose
/// derivatives cancel in it to rounding, which the floor of the pass
/// removes), in both media.
#[test]
fn a_measured_alkalinity_gets_no_contribution_from_the_others() {
    for (water, ph) in [
        (sea(25.0, 35.0, 0.0), 8.05),
        (
            pond(12.0, 0.1).with_composition(
                Composition::default()
                    .with_calcium(Amount::PerKg(0.9e-3))
                    .unwrap(),
            ),
            7.4,
        ),
    ] {
        let problem = Problem::new(
            &water,
            Measured::ph(ph, None).unwrap(),
            Measured::alkalinity_umol_kg(1900.0).unwrap(),
        )
        .unwrap();
        let u = Uncertainties::new()
            .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.02))
            .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.1)))
            .unwrap();
        assert_on_tangents(&problem, &u, "alkalinity fixed");
        let r = propagate_quantities(&problem, &u, OutputQuantities(&[Output::AlkalinityUmolKg]))
            .unwrap();
        assert_eq!(r.outputs[0].u, Some(0.0));
        assert!(r.contributions(0).iter().all(|c| *c == 0.0));
    }
}

/// The precipitation potential (a search over full solves) is not made on
/// tangents: its row alone takes differences, for every source, and every
/// other output keeps its exact derivatives (the pond of an aquaculture
/// check, calcium measured, as the command line solves it by default).
#[test]
fn the_precipitation_potential_alone_takes_differences() {
    let water = pond(24.0, 0.3).with_composition(
        Composition::default()
            .with_calcium(Amount::PerKg(1.5e-3))
            .unwrap(),
    );
    for (a, b) in [
        (
            Measured::ph(8.4, None).unwrap(),
            Measured::alkalinity_umol_kg(2600.0).unwrap(),
        ),
        (
            Measured::alkalinity_umol_kg(2600.0).unwrap(),
            Measured::dic_umol_kg(2500.0).unwrap(),
        ),
    ] {
        let problem = Problem::new(&water, a, b)
            .unwrap()
            .with_options(travertine::SolveOptions::default().with_precipitation_potential(true));
        let u = Uncertainties::new()
            .with_input(Input::Carbon(a.parameter()), Size::Percent(0.5))
            .and_then(|u| u.with_input(Input::Carbon(b.parameter()), Size::Percent(0.3)))
            .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.1)))
            .and_then(|u| u.with_input(Input::Total(Total::Calcium), Size::Percent(3.0)))
            .unwrap();
        agree(&problem, &u, "precipitation potential");
        assert_on_tangents(&problem, &u, "precipitation potential");
        let r = propagate_quantities(
            &problem,
            &u,
            OutputQuantities(&[Output::PrecipitationPotential, Output::TemperatureC]),
        )
        .unwrap();
        assert!(r.outputs[0].value.is_some());
        assert!(r.outputs[0].u.unwrap() > 0.0);
        assert_eq!(r.outputs[1].u, Some(0.1));
    }
}

proptest::proptest! {
    #![proptest_config(proptest::prelude::ProptestConfig::with_cases(256))]

    /// Over the domain of both media (temperature, salinity, pH,
    /// alkalinity, calcium; with and without air over the water), the
    /// pass on tangents agrees with the differences of full solves on
    /// every contribution to every numeric output, its values bit for bit,
    /// and is the way taken.
    #[test]
    fn tangents_agree_with_differences_over_the_domain(
        fresh in proptest::bool::ANY,
        t in 1.0..32.0f64,
        s_fraction in 0.0..1.0f64,
        ph in 6.6..8.6f64,
        ta in 400.0..3500.0f64,
        calcium in 0.0..3e-3f64,
        wind in proptest::option::of(1.0..12.0f64),
        potential in proptest::bool::ANY,
    ) {
        // Fresh salinity from 0.05: the forward difference's truncation,
        // about h/(2S) relative at a step h of 10⁻⁶ (the activity
        // coefficients go as √I, I as S), passes the 2·10⁻⁵ of `agree`
        // below about 0.03; the pass on tangents has no such limit.
        let water = if fresh {
            pond(t, 0.05 + 0.45 * s_fraction)
        } else {
            sea(t, 20.0 + 20.0 * s_fraction, 0.0)
        };
        let water = if calcium > 1e-4 || !fresh {
            water.with_composition(
                Composition::default()
                    .with_calcium(Amount::PerKg(if fresh { calcium } else { 10.28e-3 }))
                    .unwrap(),
            )
        } else {
            water
        };
        let (a, b) = (
            Measured::ph(if fresh { ph } else { 7.5 + 0.5 * (ph - 6.6) }, None).unwrap(),
            Measured::alkalinity_umol_kg(if fresh { ta } else { 1800.0 + 0.25 * ta }).unwrap(),
        );
        // The precipitation potential (its row by differences beside the
        // exact others) where the water has calcium, in half the cases.
        let options = travertine::SolveOptions::default().with_precipitation_potential(potential);
        let mut problem = Problem::new(&water, a, b).unwrap().with_options(options);
        let mut u = Uncertainties::new()
            .with_input(Input::Carbon(a.parameter()), Size::Absolute(0.01))
            .and_then(|u| u.with_input(Input::Carbon(b.parameter()), Size::Percent(0.2)))
            .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.1)))
            .and_then(|u| u.with_input(Input::Salinity, Size::Percent(2.0)))
            .unwrap();
        if let Some(w) = wind {
            problem = problem.with_air(travertine::sample::air::Air::new().with_wind_m_s(w).unwrap(), None);
            u = u.with_input(Input::Wind, Size::Percent(10.0)).unwrap();
        }
        if water.composition().calcium_given() {
            u = u.with_input(Input::Total(Total::Calcium), Size::Percent(2.0)).unwrap();
        }
        agree(&problem, &u, "the domain");
        assert_on_tangents(&problem, &u, "the domain");
    }
}

/// A prepared water whose constants were moved is propagated about those
/// moved constants, for every source (the doc of
/// `Problem::from_prepared`): the values are those of its own solve, and
/// the temperature's contribution is the slope of solves of the same
/// moved constants at other temperatures (a central difference of waters
/// prepared at T ± 0.001 °C, K1 moved again in each), in both media. The
/// temperature moves the constants, so neither the pass on tangents nor
/// the differences may make them again from the water's fits alone.
#[test]
fn moved_constants_stay_moved_for_the_temperature_too() {
    let pond_at = common::calcium_pond;
    let sea_at = |t: f64| sea(t, 35.0, 0.0);
    type WaterAt<'a> = &'a dyn Fn(f64) -> Water;
    let cases: [(WaterAt, Measured, f64); 2] = [
        (
            &sea_at,
            Measured::ph(8.05, Some(PhScale::Total)).unwrap(),
            25.0,
        ),
        (&pond_at, Measured::ph(7.6, None).unwrap(), 15.0),
    ];
    let ta = Measured::alkalinity_umol_kg(2000.0).unwrap();
    for (water_at, ph, t) in cases {
        let moved = |t: f64| {
            water_at(t)
                .prepare()
                .and_then(|p| p.with_constants_perturbed(ConstantName::K1, 0.05))
                .unwrap()
        };
        let problem = Problem::from_prepared(moved(t), ph, ta);
        let u = Uncertainties::new()
            .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01))
            .and_then(|u| u.with_input(Input::Carbon(Parameter::Alkalinity), Size::Absolute(2.0)))
            .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.1)))
            .unwrap();
        let r = propagate_quantities(&problem, &u, OutputQuantities(&[Output::Pco2])).unwrap();
        let own = moved(t).solve(ph, ta).unwrap();
        assert_eq!(r.outputs[0].value, Some(own.pco2_uatm));
        let h = 1e-3;
        let slope = (moved(t + h).solve(ph, ta).unwrap().pco2_uatm
            - moved(t - h).solve(ph, ta).unwrap().pco2_uatm)
            / (2.0 * h);
        let j = r
            .sources
            .iter()
            .position(|(s, _)| *s == Source::Input(Input::Temperature))
            .unwrap();
        let c = r.contributions(0)[j];
        assert!(
            (c - slope * 0.1).abs() <= 1e-5 * c.abs(),
            "{}: {c} against {}",
            own.medium.name(),
            slope * 0.1
        );
    }
}

/// A prepared water whose constants were moved, reported at
/// another temperature, is reported with the same moved constants (the
/// doc of `Problem::from_prepared`): the reported state is the moved
/// water at 10 °C with the measured state's alkalinity and DIC.
#[test]
fn moved_constants_stay_moved_where_the_state_is_reported_elsewhere() {
    let moved = |t: f64| {
        sea(t, 35.0, 0.0)
            .prepare()
            .and_then(|p| p.with_constants_perturbed(ConstantName::K1, 0.05))
            .unwrap()
    };
    let ph = Measured::ph(8.05, Some(PhScale::Total)).unwrap();
    let ta = Measured::alkalinity_umol_kg(2000.0).unwrap();
    let own = moved(25.0).solve(ph, ta).unwrap();
    let (ta2, dic) = (
        Measured::alkalinity_umol_kg(own.alkalinity_umol_kg).unwrap(),
        Measured::dic_umol_kg(own.dic_umol_kg).unwrap(),
    );
    let expected = moved(10.0).solve(ta2, dic).unwrap().pco2_uatm;
    let unmoved = sea(10.0, 35.0, 0.0).solve(ta2, dic).unwrap().pco2_uatm;
    let reported = Problem::from_prepared(moved(25.0), ph, ta)
        .reported_at(Some(10.0), None)
        .solve()
        .unwrap()
        .pco2_uatm;
    assert!(
        (reported - expected).abs() <= 1e-9 * expected,
        "reported {reported}, moved water at 10 °C {expected}, unmoved {unmoved}"
    );
    // With air over the water, the water at equilibrium with it is the
    // moved water at 10 °C too (a second solve, of the state reported).
    let air = travertine::sample::air::Air::new();
    let state = moved(10.0).solve(ta2, dic).unwrap();
    let expected = moved(10.0)
        .with_exchange(state.clone(), &air, None)
        .unwrap()
        .exchange
        .and_then(|e| e.equilibrium_ph)
        .unwrap();
    let unmoved = sea(10.0, 35.0, 0.0)
        .prepare()
        .and_then(|p| p.with_exchange(state, &air, None))
        .unwrap()
        .exchange
        .and_then(|e| e.equilibrium_ph)
        .unwrap();
    let reported = Problem::from_prepared(moved(25.0), ph, ta)
        .with_air(air, None)
        .reported_at(Some(10.0), None)
        .solve()
        .unwrap()
        .exchange
        .and_then(|e| e.equilibrium_ph)
        .unwrap();
    assert!(
        (reported - expected).abs() <= 1e-9,
        "equilibrium pH {reported}, of the moved water at 10 °C {expected}, unmoved {unmoved}"
    );
}

/// The dose of a problem whose prepared water had its constants
/// moved treats the water with the same moved constants, also for a
/// chemical that adds calcium (whose treated water is prepared again with
/// the new calcium, `Solver::solve` in src/decisions/dose.rs). Raising
/// the pH from 7 to 8 is a dose of sodium hydroxide and of hydrated lime
/// alike.
#[test]
fn moved_constants_stay_moved_in_a_treated_water_with_calcium() {
    use travertine::decisions::dose::{Chemical, DoseRequest, Target};
    use travertine::decisions::dose_uncertainty::dose_uncertainty;
    let moved = common::calcium_pond(15.0)
        .prepare()
        .and_then(|p| p.with_constants_perturbed(ConstantName::K1, 0.3))
        .unwrap();
    let (ph, ta) = (
        Measured::ph(7.0, None).unwrap(),
        Measured::alkalinity_umol_kg(1000.0).unwrap(),
    );
    let u = Uncertainties::new()
        .without_constants()
        .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01))
        .unwrap();
    let problem = Problem::from_prepared(moved, ph, ta);
    for chemical in [Chemical::SodiumHydroxide, Chemical::HydratedLime] {
        let request = DoseRequest::new(chemical, Target::Ph(8.0));
        let r = dose_uncertainty(&problem, &u, request);
        assert!(r.is_ok(), "{}: {r:?}", chemical.name());
    }
}

/// The pass on tangents of a problem made by `Problem::new` (sea
/// water's constants kept on tangents of T and S) gives every value,
/// u and contribution bit for bit as that of the same water prepared
/// without them (`Problem::from_prepared`, the constants evaluated again
/// in the pass).
#[test]
fn kept_slopes_give_the_numbers_of_slopes_made_in_the_pass() {
    let water = sea(12.0, 33.0, 500.0);
    let ph = Measured::ph(8.0, Some(PhScale::Total)).unwrap();
    let ta = Measured::alkalinity_umol_kg(2250.0).unwrap();
    let u = Uncertainties::new()
        .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01))
        .and_then(|u| u.with_input(Input::Carbon(Parameter::Alkalinity), Size::Absolute(2.0)))
        .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.1)))
        .and_then(|u| u.with_input(Input::Salinity, Size::Absolute(0.05)))
        .unwrap();
    let outputs = numeric_outputs();
    let kept = propagate_quantities(
        &Problem::new(&water, ph, ta).unwrap(),
        &u,
        OutputQuantities(&outputs),
    )
    .unwrap();
    let again = propagate_quantities(
        &Problem::from_prepared(water.prepare().unwrap(), ph, ta),
        &u,
        OutputQuantities(&outputs),
    )
    .unwrap();
    assert_eq!(kept.sources, again.sources);
    for (k, o) in outputs.iter().enumerate() {
        let bits = |p: &travertine::decisions::uncertainty::Propagation| {
            (
                p.outputs[k].value.map(f64::to_bits),
                p.outputs[k].u.map(f64::to_bits),
                p.contributions(k)
                    .iter()
                    .map(|c| c.to_bits())
                    .collect::<Vec<_>>(),
            )
        };
        assert_eq!(bits(&kept), bits(&again), "{}", o.key());
    }
    assert_eq!(kept, again);
}

/// Two propagations whose every public number is the same compare
/// equal, whichever way (a pass on tangents, or differences) made them:
/// here the Langelier index, which sea water has not (no value, no u, no
/// contributions either way).
#[test]
fn propagations_with_the_same_numbers_are_equal() {
    let p = Problem::new(
        &sea(20.0, 35.0, 0.0),
        Measured::ph(8.0, Some(PhScale::Total)).unwrap(),
        Measured::alkalinity_umol_kg(2300.0).unwrap(),
    )
    .unwrap();
    let u = Uncertainties::new()
        .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01))
        .and_then(|u| u.with_input(Input::Carbon(Parameter::Alkalinity), Size::Absolute(2.0)))
        .unwrap();
    let outputs = [Output::Langelier];
    let by_tangents = propagate_quantities(&p, &u, OutputQuantities(&outputs)).unwrap();
    let by_differences = propagate(&p, &u, |s, out| values_into(&outputs, s, out)).unwrap();
    assert_eq!(by_tangents.outputs, by_differences.outputs);
    assert_eq!(by_tangents.sources, by_differences.sources);
    for k in 0..2 {
        assert_eq!(
            by_tangents.contributions(k),
            by_differences.contributions(k)
        );
    }
    assert_eq!(by_tangents, by_differences);
}
