//! Linear propagation of uncertainties (issue 13): checks against the
//! definition of K1, against central differences written here, against
//! Monte Carlo draws, and the budget's and zero's rules.

use travertine::decisions::uncertainty::{
    monte_carlo, propagate, Problem, Size, Source, Uncertainties,
};
use travertine::output::uncertainty::{outputs_monte_carlo, outputs_propagated};
use travertine::output::Output;
use travertine::sample::inputs::{Input, Total};
use travertine::sample::Sample;
use travertine::units::Amount;
use travertine::{Composition, Conditions, Measured, Parameter, PhScale, Water};

fn sea() -> Water {
    Water::saline(Conditions::new(25.0, 35.0).unwrap()).unwrap()
}

fn pond() -> Water {
    let c = Composition::default()
        .with_calcium(Amount::PerKg(1.0e-3))
        .unwrap();
    Water::fresh(Conditions::new(15.0, 0.2).unwrap())
        .unwrap()
        .with_composition(c)
}

/// The quantities of a test as `propagate` reads them: appended to its
/// buffer.
fn q(
    f: impl Fn(&travertine::State) -> Vec<Option<f64>>,
) -> impl FnMut(&travertine::State, &mut Vec<Option<f64>>) {
    move |s, out| out.extend(f(s))
}

fn ph_only(u: f64) -> Uncertainties {
    Uncertainties::new()
        .without_constants()
        .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(u))
        .unwrap()
}

/// pH and HCO3-: pCO2 ∝ [H+][HCO3-]/K1, so u(pH) = 0.01 alone gives a
/// relative u(pCO2) of ln(10) × 0.01 = 2.3026 % (follows from the
/// definition of K1), in both media.
#[test]
fn ph_and_bicarbonate_give_ln10_times_u_ph() {
    let expected = std::f64::consts::LN_10 * 0.01; // definition of K1
    for (water, ph) in [
        (sea(), Measured::ph(8.0, Some(PhScale::Total)).unwrap()),
        (pond(), Measured::ph(7.6, None).unwrap()),
    ] {
        let p = Problem::new(&water, ph, Measured::hco3_umol_kg(1800.0).unwrap()).unwrap();
        let r = propagate(&p, &ph_only(0.01), q(|s| vec![Some(s.pco2_uatm)])).unwrap();
        let o = &r.outputs[0];
        let relative = o.u.unwrap() / o.value.unwrap();
        assert!(
            (relative / expected - 1.0).abs() < 1e-3,
            "{:?}: {relative}",
            water.medium()
        );
    }
}

/// pH and alkalinity: the propagated u(pCO2) is the slope of two full
/// solves (a central difference written here, step 0.001 pH) times u(pH).
#[test]
fn ph_and_alkalinity_agree_with_a_central_difference() {
    for (water, scale, ph) in [(sea(), Some(PhScale::Total), 8.05), (pond(), None, 7.4)] {
        let ta = Measured::alkalinity_umol_kg(2000.0).unwrap();
        let solve = |ph: f64| {
            water
                .solve(Measured::ph(ph, scale).unwrap(), ta)
                .unwrap()
                .pco2_uatm
        };
        let h = 1e-3;
        let slope = (solve(ph + h) - solve(ph - h)) / (2.0 * h);
        let p = Problem::new(&water, Measured::ph(ph, scale).unwrap(), ta).unwrap();
        let r = propagate(&p, &ph_only(0.01), q(|s| vec![Some(s.pco2_uatm)])).unwrap();
        let u = r.outputs[0].u.unwrap();
        assert!((u / (slope.abs() * 0.01) - 1.0).abs() < 1e-4, "{u} {slope}");
        // Larger than at fixed HCO3- (the slope d ln CO2*/d ln[H+] at fixed
        // alkalinity is above 1).
        assert!(u / r.outputs[0].value.unwrap() > std::f64::consts::LN_10 * 0.01);
    }
}

/// The sources of the Monte Carlo comparison: every input of the pair,
/// temperature and salinity, calcium in fresh water, and the constants'
/// defaults (Orr et al. 2018 in sea water; the crate's fresh defaults).
fn typical(a: Parameter, b: Parameter, fresh: bool) -> Uncertainties {
    let size = |p: Parameter| match p {
        Parameter::Ph => Size::Absolute(0.01), // a good field meter (common practice)
        Parameter::Alkalinity | Parameter::Dic => Size::Absolute(3.0),
        _ => Size::Percent(1.0),
    };
    let mut u = Uncertainties::new()
        .with_input(Input::Carbon(a), size(a))
        .and_then(|u| u.with_input(Input::Carbon(b), size(b)))
        .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.1)))
        .unwrap();
    if fresh {
        u = u
            .with_input(Input::Total(Total::Calcium), Size::Percent(2.0))
            .unwrap();
    } else {
        u = u.with_input(Input::Salinity, Size::Absolute(0.01)).unwrap();
    }
    u
}

/// Linear propagation and 20 000 Monte Carlo draws (fixed seed) agree
/// within 5 % for every key output, for six pairs in each medium.
#[test]
fn linear_agrees_with_monte_carlo() {
    use Parameter as P;
    let pairs: [(Measured, Measured); 6] = [
        (
            Measured::alkalinity_umol_kg(2100.0).unwrap(),
            Measured::dic_umol_kg(1950.0).unwrap(),
        ),
        (
            Measured::ph(8.0, Some(PhScale::Total)).unwrap(),
            Measured::alkalinity_umol_kg(2100.0).unwrap(),
        ),
        (
            Measured::ph(8.0, Some(PhScale::Total)).unwrap(),
            Measured::dic_umol_kg(1900.0).unwrap(),
        ),
        (
            Measured::pco2_uatm(500.0).unwrap(),
            Measured::alkalinity_umol_kg(2100.0).unwrap(),
        ),
        (
            Measured::pco2_uatm(500.0).unwrap(),
            Measured::dic_umol_kg(1950.0).unwrap(),
        ),
        (
            Measured::ph(8.0, Some(PhScale::Total)).unwrap(),
            Measured::pco2_uatm(500.0).unwrap(),
        ),
    ];
    let keys = [
        Output::PhTotal,
        Output::PhNbs,
        Output::Pco2,
        Output::DicUmolKg,
        Output::AlkalinityUmolKg,
        Output::Co3UmolKg,
        Output::Hco3UmolKg,
        Output::OmegaCalcite,
        Output::OmegaAragonite,
    ];
    for (water, fresh) in [(sea(), false), (pond(), true)] {
        for (a, b) in pairs {
            let p = Problem::new(&water, a, b).unwrap();
            let u = typical(a.parameter(), b.parameter(), fresh);
            let (outputs, linear) = outputs_propagated(&p, &u).unwrap();
            let (_, mc) = outputs_monte_carlo(&p, &u, 20_000, 13).unwrap();
            assert_eq!(mc.failed, 0);
            let mut compared = 0;
            for (k, o) in outputs.iter().enumerate() {
                if !keys.contains(o) {
                    continue;
                }
                let (Some(l), Some(m)) = (linear.outputs[k].u, mc.std_devs[k]) else {
                    continue;
                };
                if l == 0.0 && m < 1e-9 {
                    continue; // a measured value with no uncertainty of its own
                }
                compared += 1;
                assert!(
                    (l / m - 1.0).abs() < 0.05,
                    "{:?} {:?}+{:?} {}: linear {l}, Monte Carlo {m}",
                    water.medium(),
                    a.parameter(),
                    b.parameter(),
                    o.key()
                );
            }
            assert!(compared >= 5, "{compared}");
            let _ = (P::Ph, fresh);
        }
    }
}

/// No input uncertainty and the constants switched off: every output's
/// uncertainty is exactly zero, and so is the Monte Carlo spread.
#[test]
fn zero_uncertainty_gives_exactly_zero() {
    for water in [sea(), pond()] {
        let p = Problem::new(
            &water,
            Measured::alkalinity_umol_kg(2000.0).unwrap(),
            Measured::dic_umol_kg(1900.0).unwrap(),
        )
        .unwrap();
        let none = Uncertainties::new()
            .without_constants()
            .with_input(Input::Carbon(Parameter::Dic), Size::Absolute(0.0))
            .unwrap();
        let (_, r) = outputs_propagated(&p, &none).unwrap();
        assert!(r.sources.is_empty());
        for o in &r.outputs {
            if o.value.is_some() {
                assert_eq!(o.u, Some(0.0));
            }
        }
        let mc = monte_carlo(&p, &none, q(|s| vec![Some(s.pco2_uatm)]), 10, 1).unwrap();
        assert_eq!(mc.std_devs[0], Some(0.0));
    }
}

/// The budget: the shares of every output with a variance above zero sum
/// to 1, with all the default constants and several inputs.
#[test]
fn budget_shares_sum_to_one() {
    for (water, fresh) in [(sea(), false), (pond(), true)] {
        let p = Problem::new(
            &water,
            Measured::ph(7.9, Some(PhScale::Total)).unwrap(),
            Measured::alkalinity_umol_kg(2000.0).unwrap(),
        )
        .unwrap();
        let u = typical(Parameter::Ph, Parameter::Alkalinity, fresh);
        let (_, r) = outputs_propagated(&p, &u).unwrap();
        assert!(r.sources.len() >= 9, "{:?}", r.sources);
        let mut checked = 0;
        for (k, o) in r.outputs.iter().enumerate() {
            if o.u.is_some_and(|u| u > 0.0) {
                let sum: f64 = r.budget(k).iter().map(|(_, f)| f).sum();
                assert!((sum - 1.0).abs() < 1e-12, "{sum}");
                checked += 1;
            }
        }
        assert!(checked > 10);
    }
}

/// Symmetry: with DIC measured, the DIC output is the DIC input, so its
/// uncertainty is u(DIC) and no other source (alkalinity, temperature,
/// the constants) contributes to it.
#[test]
fn a_measured_dic_carries_only_its_own_uncertainty() {
    for (water, fresh) in [(sea(), false), (pond(), true)] {
        let p = Problem::new(
            &water,
            Measured::alkalinity_umol_kg(2000.0).unwrap(),
            Measured::dic_umol_kg(1900.0).unwrap(),
        )
        .unwrap();
        let only_dic = Uncertainties::new()
            .without_constants()
            .with_input(Input::Carbon(Parameter::Dic), Size::Absolute(4.0))
            .unwrap();
        let r = propagate(&p, &only_dic, q(|s| vec![Some(s.dic_umol_kg)])).unwrap();
        assert!((r.outputs[0].u.unwrap() - 4.0).abs() < 1e-6);
        // With every other source too, DIC's budget is all its own.
        let all = typical(Parameter::Alkalinity, Parameter::Dic, fresh)
            .with_input(Input::Carbon(Parameter::Dic), Size::Absolute(4.0))
            .unwrap();
        let r = propagate(&p, &all, q(|s| vec![Some(s.dic_umol_kg)])).unwrap();
        assert!((r.outputs[0].u.unwrap() - 4.0).abs() < 1e-6);
        for ((source, _), c) in r.sources.iter().zip(r.contributions(0)) {
            if *source != Source::Input(Input::Carbon(Parameter::Dic)) {
                assert!(c.abs() < 1e-6, "{source:?}: {c}");
            }
        }
    }
}

/// The wind's uncertainty reaches the flux and nothing of the water.
#[test]
fn wind_uncertainty_reaches_the_flux_only() {
    use travertine::sample::air::Air;
    let p = Problem::new(
        &pond(),
        Measured::ph(7.6, None).unwrap(),
        Measured::alkalinity_umol_kg(1500.0).unwrap(),
    )
    .unwrap()
    .with_air(Air::new().with_wind_m_s(5.0).unwrap(), None);
    let u = Uncertainties::new()
        .without_constants()
        .with_input(Input::Wind, Size::Absolute(0.5))
        .unwrap();
    let r = propagate(
        &p,
        &u,
        q(|s| {
            vec![
                Some(s.pco2_uatm),
                s.exchange.and_then(|e| e.co2_flux_mmol_m2_d),
            ]
        }),
    )
    .unwrap();
    assert_eq!(r.outputs[0].u, Some(0.0));
    assert!(r.outputs[1].u.unwrap() > 0.0);
    // Without a wind speed (air with none, or no air at all) the wind's
    // uncertainty would move nothing: refused, naming the wind, not
    // counted as a source of zero.
    let ph = Measured::ph(7.6, None).unwrap();
    let ta = Measured::alkalinity_umol_kg(1500.0).unwrap();
    for p in [
        Problem::new(&pond(), ph, ta)
            .unwrap()
            .with_air(Air::new(), None),
        Problem::new(&pond(), ph, ta).unwrap(),
    ] {
        for size in [Size::Absolute(0.5), Size::Percent(10.0)] {
            let u = Uncertainties::new().with_input(Input::Wind, size).unwrap();
            let e = propagate(&p, &u, q(|s| vec![Some(s.pco2_uatm)])).unwrap_err();
            assert!(matches!(e, travertine::Error::Missing { .. }), "{e}");
            assert!(e.to_string().contains("wind"), "{e}");
        }
    }
}

/// The calcium ion pairs of fresh water (CaHCO3+ and CaCO3⁰) are
/// perturbable constants with default uncertainties. A weaker pair (its
/// log K lowered, pK raised) binds less calcium and carbonate, so at the
/// same measured pH and alkalinity the free Ca++ and CO3-- and with them
/// calcite Ω rise (Ω = γCa[Ca++] γ2[CO3--]/Ksp). Each pair has its share of
/// Ω's variance, and its contribution is the slope of a central difference
/// of two solves written here (step 0.001 in pK) times its uncertainty.
#[test]
fn ion_pair_constants_move_calcite_saturation_in_fresh_water() {
    use travertine::decisions::uncertainty::FRESH_DEFAULTS;
    use travertine::medium::ConstantName;
    let water = pond();
    let (ph, ta) = (
        Measured::ph(7.9, None).unwrap(),
        Measured::alkalinity_umol_kg(2400.0).unwrap(),
    );
    let prepared = water.prepare().unwrap();
    let omega = |which: ConstantName, d: f64| {
        prepared
            .with_constants_perturbed(which, d)
            .unwrap()
            .solve(ph, ta)
            .unwrap()
            .omega_calcite
            .unwrap()
    };
    let base = prepared.solve(ph, ta).unwrap();
    let problem = Problem::new(&water, ph, ta).unwrap();
    let r = propagate(
        &problem,
        &Uncertainties::new(),
        q(|s| vec![s.omega_calcite]),
    )
    .unwrap();
    let budget = r.budget(0);
    for which in [ConstantName::CaHco3Pair, ConstantName::CaCo3Pair] {
        // The direction: a weaker pair leaves more free ions.
        let weaker = prepared
            .with_constants_perturbed(which, 0.05)
            .unwrap()
            .solve(ph, ta)
            .unwrap();
        assert!(weaker.omega_calcite.unwrap() > base.omega_calcite.unwrap());
        assert!(weaker.calcium_free_umol_kg.unwrap() > base.calcium_free_umol_kg.unwrap());
        // Its default uncertainty (from memory, unverified; see FRESH_DEFAULTS).
        let u_pk = match FRESH_DEFAULTS.iter().find(|(c, _)| *c == which) {
            Some((_, Size::Absolute(u))) => *u,
            other => panic!("{which:?}: {other:?}"),
        };
        // Its contribution: the central difference of two solves.
        let h = 1e-3;
        let slope = (omega(which, h) - omega(which, -h)) / (2.0 * h);
        let k = r
            .sources
            .iter()
            .position(|(s, _)| *s == Source::Constant(which))
            .unwrap_or_else(|| panic!("{which:?} is not a source"));
        let contribution = r.contributions(0)[k];
        assert!(
            (contribution / (slope * u_pk) - 1.0).abs() < 1e-4,
            "{which:?}: {contribution} against {}",
            slope * u_pk
        );
        assert!(contribution > 0.0, "{which:?}");
        // Its share of Ω's variance.
        let share = budget
            .iter()
            .find(|(s, _)| *s == Source::Constant(which))
            .unwrap()
            .1;
        assert!(share > 1e-4 && share < 1.0, "{which:?}: {share}");
    }
    // In sea water there are no ion pairs, and no such sources.
    let p = Problem::new(&sea(), Measured::ph(8.0, Some(PhScale::Total)).unwrap(), ta).unwrap();
    let r = propagate(&p, &Uncertainties::new(), q(|s| vec![Some(s.pco2_uatm)])).unwrap();
    assert!(r.sources.iter().all(|(s, _)| !matches!(
        s,
        Source::Constant(ConstantName::CaHco3Pair | ConstantName::CaCo3Pair)
    )));
}

/// The derivatives of the propagation (forward differences of perturbed
/// solves started from the unperturbed state's unknowns, built lean) agree
/// with central differences of full, cold solves written here (step 10⁻³
/// of the scale), for sources that move the water (temperature, calcium),
/// every default constant and the pair, in sea water and in two fresh waters (the
/// ionic strength from salinity, and from the ions with calcium, where it
/// is a fixed point), for pCO2, fCO2, xCO2, calcite Ω, the Langelier
/// index, aragonite Ω and its SI: to
/// 10⁻⁴ of the contribution, or 10⁻⁵ of the output's whole uncertainty for
/// a contribution near zero (where the 10⁻¹² tolerance of the fixed
/// points, divided by the 10⁻⁶ step, is what is left: DEVELOPERS.md,
/// "Uncertainty").
#[test]
fn warm_forward_differences_agree_with_cold_central_differences() {
    let lake = Water::fresh(Conditions::new(9.0, 0.0).unwrap())
        .unwrap()
        .with_composition(
            Composition::default()
                .with_calcium(Amount::PerKg(0.8e-3))
                .unwrap(),
        );
    let read = |s: &travertine::State| {
        vec![
            Some(s.pco2_uatm),
            Some(s.fco2_uatm),
            Some(s.xco2_ppm),
            s.omega_calcite,
            s.langelier_index,
            s.omega_aragonite,
            s.si_aragonite,
        ]
    };
    let mut checked = 0;
    for (water, ph) in [
        (sea(), Measured::ph(8.05, Some(PhScale::Total)).unwrap()),
        (pond(), Measured::ph(7.9, None).unwrap()),
        (lake, Measured::ph(7.4, None).unwrap()),
    ] {
        let ta = Measured::alkalinity_umol_kg(2100.0).unwrap();
        let fresh = water.medium() == travertine::Medium::Fresh;
        // Every default constant, and the inputs.
        let mut u = Uncertainties::new()
            .with_input(Input::Carbon(Parameter::Alkalinity), Size::Absolute(2.0))
            .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.1)))
            .unwrap();
        if fresh {
            u = u
                .with_input(Input::Total(Total::Calcium), Size::Absolute(20.0))
                .unwrap();
        }
        let p = Problem::new(&water, ph, ta).unwrap();
        let r = propagate(&p, &u, q(read)).unwrap();
        let prepared = water.prepare().unwrap();
        let calcium = |w: &Water| w.constants().unwrap().totals().calcium_mol_kg;
        for (k, (source, size)) in r.sources.iter().enumerate() {
            // A full, cold solve with the source moved by d.
            let at = |d: f64| -> Vec<Option<f64>> {
                let state = match source {
                    Source::Input(Input::Carbon(_)) => {
                        prepared.solve(ph, Measured::alkalinity_umol_kg(2100.0 + d).unwrap())
                    }
                    Source::Input(Input::Temperature) => {
                        let c = Conditions::new(
                            water.conditions().temperature_c() + d,
                            water.conditions().salinity(),
                        )
                        .unwrap();
                        water.at(c).unwrap().solve(ph, ta)
                    }
                    Source::Input(Input::Total(Total::Calcium)) => water
                        .clone()
                        .with_composition(
                            Composition::default()
                                .with_calcium(Amount::PerKg(calcium(&water) + d * 1e-6))
                                .unwrap(),
                        )
                        .solve(ph, ta),
                    Source::Constant(c) => prepared
                        .with_constants_perturbed(*c, d)
                        .unwrap()
                        .solve(ph, ta),
                    other => panic!("{other:?}"),
                };
                read(&state.unwrap())
            };
            let scale = match source {
                Source::Input(Input::Temperature) => 10.0,
                Source::Input(Input::Carbon(_)) => 2100.0,
                Source::Input(Input::Total(_)) => calcium(&water) * 1e6,
                _ => 1.0,
            };
            let h = 1e-3 * scale;
            let (up, down) = (at(h), at(-h));
            for (q, out) in r.outputs.iter().enumerate() {
                let (Some(a), Some(b), Some(u_out)) = (up[q], down[q], out.u) else {
                    continue;
                };
                let expected = (a - b) / (2.0 * h) * size;
                let got = r.contributions(q)[k];
                assert!(
                    (got - expected).abs() <= 1e-4 * expected.abs() + 1e-5 * u_out,
                    "{:?} {source:?} output {q}: {got} against {expected}",
                    water.medium()
                );
                checked += 1;
            }
        }
    }
    // Sea water: 2 inputs and 8 constants × 6 outputs (no Langelier
    // index; the solubility products and K0 moved without a solve,
    // `State::with_pksp_moved`, `State::with_pk0_moved`); each fresh
    // water: 3 inputs and 9 constants × 7 outputs (aragonite and K0
    // moved without a solve; KB, without boron, moves nothing and is not
    // solved at all).
    assert_eq!(checked, 60 + 2 * 84);
}

/// A water made from a sample described by a conductivity reading (the
/// program's path, `Sample::water`), at temperature `t` °C.
fn from_conductivity(t: f64, conductivity: &str, medium: &str, calcium: bool) -> Water {
    let mut s = Sample::new(t);
    s.set(Input::Conductivity, conductivity).unwrap();
    s.set(Input::Medium, medium).unwrap();
    if calcium {
        s.set(Input::Total(Total::Calcium), "1000 umol/kg").unwrap();
    }
    s.water().unwrap()
}

fn only(input: Input, size: Size) -> Uncertainties {
    Uncertainties::new()
        .without_constants()
        .with_input(input, size)
        .unwrap()
}

/// A conductivity's uncertainty moves the salinity and (fresh water) the
/// ionic strength it gives, so pCO2 from pH and alkalinity and Ω calcite
/// carry it: the propagated u is the slope of two full solves of waters
/// rebuilt from the reading ± 0.1 % (central differences written here)
/// times u, in both media and for both kinds of reading; its budget share
/// is all of the variance.
#[test]
fn conductivity_uncertainty_agrees_with_a_central_difference() {
    let cases = [
        // Fresh: a pond reading at the sample temperature, and a specific
        // conductance; saline: an estuary reading (invented Larkvane values).
        (14.0, 420.0, "uS/cm", "fresh", None, 7.6, true),
        (14.0, 420.0, "uS/cm@25C", "fresh", None, 7.6, true),
        (
            18.0,
            30_000.0,
            "uS/cm",
            "saline",
            Some(PhScale::Total),
            7.95,
            false,
        ),
    ];
    for (t, x, unit, medium, scale, ph, calcium) in cases {
        let reading = |v: f64| format!("{v} {unit}");
        let ph = Measured::ph(ph, scale).unwrap();
        let ta = Measured::alkalinity_umol_kg(1800.0).unwrap();
        let outputs = |s: &travertine::State| vec![Some(s.pco2_uatm), s.omega_calcite];
        let solve = |v: f64| {
            let s = from_conductivity(t, &reading(v), medium, calcium)
                .solve(ph, ta)
                .unwrap();
            outputs(&s)
        };
        let h = 1e-3 * x;
        let (up, down) = (solve(x + h), solve(x - h));
        let water = from_conductivity(t, &reading(x), medium, calcium);
        let p = Problem::new(&water, ph, ta).unwrap();
        let u = only(Input::Conductivity, Size::Percent(5.0));
        let r = propagate(&p, &u, q(outputs)).unwrap();
        assert_eq!(
            r.sources,
            vec![(Source::Input(Input::Conductivity), 0.05 * x)]
        );
        for (k, o) in r.outputs.iter().enumerate() {
            let slope = (up[k].unwrap() - down[k].unwrap()) / (2.0 * h);
            let expected = (slope * 0.05 * x).abs();
            let got = o.u.unwrap();
            assert!(got > 0.0, "{medium} {unit} output {k}");
            assert!(
                (got / expected - 1.0).abs() < 1e-3,
                "{medium} {unit} output {k}: {got} against {expected}"
            );
            let budget = r.budget(k);
            assert_eq!(budget[0].0, Source::Input(Input::Conductivity));
            assert!((budget[0].1 - 1.0).abs() < 1e-12);
        }
        // Absolute in µS/cm gives the same as the percentage it equals.
        let abs = only(Input::Conductivity, Size::Absolute(0.05 * x));
        let r2 = propagate(&p, &abs, q(outputs)).unwrap();
        assert_eq!(r.outputs[0].u, r2.outputs[0].u);
    }
}

/// In a water made from a reading at the sample temperature, a moved
/// temperature also moves the salinity and specific conductance the
/// reading gives, as rebuilding the sample at t ± 0.01 °C does (central
/// difference written here).
#[test]
fn temperature_moves_a_reading_at_the_sample_temperature() {
    let ph = Measured::ph(7.6, None).unwrap();
    let ta = Measured::alkalinity_umol_kg(1800.0).unwrap();
    let solve = |t: f64| {
        from_conductivity(t, "420 uS/cm", "fresh", true)
            .solve(ph, ta)
            .unwrap()
            .omega_calcite
            .unwrap()
    };
    let h = 1e-2;
    let slope = (solve(14.0 + h) - solve(14.0 - h)) / (2.0 * h);
    let water = from_conductivity(14.0, "420 uS/cm", "fresh", true);
    let p = Problem::new(&water, ph, ta).unwrap();
    let u = only(Input::Temperature, Size::Absolute(0.2));
    let r = propagate(&p, &u, q(|s| vec![s.omega_calcite])).unwrap();
    let got = r.outputs[0].u.unwrap();
    assert!(
        (got / (slope * 0.2).abs() - 1.0).abs() < 1e-3,
        "{got} {slope}"
    );
}

/// A given fresh-water ionic strength is a source too: its u matches a
/// central difference of two full solves at I ± 0.1 %.
#[test]
fn ionic_strength_uncertainty_agrees_with_a_central_difference() {
    let ph = Measured::ph(7.8, None).unwrap();
    let ta = Measured::alkalinity_umol_kg(1800.0).unwrap();
    let water = |i: f64| pond().with_ionic_strength(i).unwrap();
    let solve = |i: f64| water(i).solve(ph, ta).unwrap().omega_calcite.unwrap();
    let (i, h) = (0.006, 6e-6);
    let slope = (solve(i + h) - solve(i - h)) / (2.0 * h);
    let p = Problem::new(&water(i), ph, ta).unwrap();
    let u = only(Input::IonicStrength, Size::Absolute(0.0005));
    let r = propagate(&p, &u, q(|s| vec![s.omega_calcite])).unwrap();
    let got = r.outputs[0].u.unwrap();
    assert!(got > 0.0);
    assert!(
        (got / (slope * 0.0005).abs() - 1.0).abs() < 1e-3,
        "{got} {slope}"
    );
}

/// A fresh water's TDS, where it sets the ionic strength (Langelier
/// 1936), is a source too: its u matches a central difference of two full
/// solves at TDS ± 0.1 %; and the `tds=` setting reads mg/L and g/L.
#[test]
fn tds_uncertainty_agrees_with_a_central_difference() {
    use travertine::decisions::uncertainty_settings::{with_settings, Setting};
    let ph = Measured::ph(7.8, None).unwrap();
    let ta = Measured::alkalinity_umol_kg(1800.0).unwrap();
    let water = |t: f64| {
        Water::fresh(Conditions::new(15.0, 0.0).unwrap())
            .unwrap()
            .with_composition(
                Composition::default()
                    .with_calcium(Amount::PerKg(1.0e-3))
                    .unwrap(),
            )
            .with_tds_mg_l(t)
            .unwrap()
    };
    let solve = |t: f64| water(t).solve(ph, ta).unwrap().omega_calcite.unwrap();
    let (t, h) = (300.0, 0.3);
    let slope = (solve(t + h) - solve(t - h)) / (2.0 * h);
    let p = Problem::new(&water(t), ph, ta).unwrap();
    let u = only(Input::Tds, Size::Absolute(20.0));
    let r = propagate(&p, &u, q(|s| vec![s.omega_calcite])).unwrap();
    let got = r.outputs[0].u.unwrap();
    assert!(got > 0.0);
    assert!(
        (got / (slope * 20.0).abs() - 1.0).abs() < 1e-3,
        "{got} {slope}"
    );
    // Where the ionic strength comes from elsewhere (the salinity of
    // `pond`), a TDS uncertainty is refused.
    let p = Problem::new(&pond(), ph, ta).unwrap();
    assert!(propagate(
        &p,
        &only(Input::Tds, Size::Percent(5.0)),
        q(|s| vec![s.omega_calcite])
    )
    .is_err());
    // The setting, in mg/L and in g/L.
    for text in ["tds=20", "tds=20 mg/L", "tds=0.02 g/L"] {
        let s: Setting = text.parse().unwrap();
        let u = with_settings(Uncertainties::new(), &[s], &ph, &ta, 999.0).unwrap();
        match u.inputs() {
            [(Input::Tds, Size::Absolute(x))] => assert!((x - 20.0).abs() < 1e-9, "{text}: {x}"),
            other => panic!("{text}: {other:?}"),
        }
    }
}

/// Salinity, conductivity and ionic strength count only where the water
/// was described by them; elsewhere a typed error, not a silent zero.
#[test]
fn a_source_the_water_was_not_described_by_is_refused() {
    let ph = Measured::ph(7.6, None).unwrap();
    let ta = Measured::alkalinity_umol_kg(1800.0).unwrap();
    let outputs = |s: &travertine::State| vec![Some(s.pco2_uatm)];
    let run = |w: &Water, input: Input| {
        let p = Problem::new(w, ph, ta).unwrap();
        propagate(&p, &only(input, Size::Percent(5.0)), q(outputs))
    };
    // Described by salinity: no conductivity, no ionic strength.
    let e = run(&pond(), Input::Conductivity).unwrap_err();
    assert!(e.to_string().contains("conductivity"), "{e}");
    assert!(run(&pond(), Input::IonicStrength).is_err());
    assert!(run(&pond(), Input::Salinity).is_ok());
    // Described by conductivity: the salinity computed from it is refused.
    let w = from_conductivity(14.0, "420 uS/cm", "fresh", false);
    let e = run(&w, Input::Salinity).unwrap_err();
    assert!(
        e.to_string().contains("computed from the conductivity"),
        "{e}"
    );
    // Saline water with a salinity given beside the reading: the reading
    // sets nothing.
    let mut s = Sample::new(18.0);
    s.set(Input::Conductivity, "30 mS/cm").unwrap();
    s.set(Input::Salinity, "20").unwrap();
    s.set(Input::Medium, "saline").unwrap();
    let w = s.water().unwrap();
    let p = Problem::new(&w, Measured::ph(7.9, Some(PhScale::Total)).unwrap(), ta).unwrap();
    let e = propagate(
        &p,
        &only(Input::Conductivity, Size::Percent(5.0)),
        q(outputs),
    )
    .unwrap_err();
    assert!(e.to_string().contains("sets nothing"), "{e}");
    // A given ionic strength that a conductivity overrides is refused.
    let w = from_conductivity(14.0, "420 uS/cm", "fresh", false)
        .with_ionic_strength(0.01)
        .unwrap();
    assert!(run(&w, Input::IonicStrength).is_err());
    assert!(run(&w, Input::Conductivity).is_ok());
}

/// Uncertainties of a state reported at other conditions
/// ([`Problem::reported_at`]: pH measured at 25 °C, reported at 9 °C and
/// 120 dbar) agree with central differences of full solves written here:
/// the measured state solved with the source moved, then moved to the
/// reporting conditions with its alkalinity and DIC (and, for a constant,
/// the same pK shift in the water there). To 10⁻⁴ of the contribution, or
/// 10⁻⁵ of the output's u.
#[test]
fn uncertainties_at_the_reporting_conditions_agree_with_moved_solves() {
    use travertine::medium::ConstantName;
    let water = sea();
    let (ph, ta) = (
        Measured::ph(7.9, Some(PhScale::Total)).unwrap(),
        Measured::alkalinity_umol_kg(2300.0).unwrap(),
    );
    let at = |w: &Water| {
        Conditions::new(9.0, w.conditions().salinity())
            .unwrap()
            .with_pressure_dbar(120.0)
            .unwrap()
    };
    let read = |s: &travertine::State| vec![Some(s.ph_total), Some(s.pco2_uatm), s.omega_calcite];
    // pK1 alone among the constants (the others set to zero).
    let mut u = Uncertainties::new()
        .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01))
        .and_then(|u| u.with_input(Input::Temperature, Size::Absolute(0.2)))
        .unwrap();
    for (c, _) in travertine::decisions::uncertainty::SALINE_DEFAULTS {
        let size = if c == ConstantName::K1 { 0.01 } else { 0.0 };
        u = u.with_constant(c, Size::Absolute(size)).unwrap();
    }
    let p = Problem::new(&water, ph, ta)
        .unwrap()
        .reported_at(Some(9.0), Some(120.0));
    let r = propagate(&p, &u, q(read)).unwrap();
    assert_eq!(r.sources.len(), 3);
    let base = read(&p.solve().unwrap());
    assert_eq!(
        base,
        read(&water.solve(ph, ta).unwrap().at(at(&water)).unwrap())
    );
    let mut checked = 0;
    for (k, (source, size)) in r.sources.iter().enumerate() {
        let moved = |d: f64| -> Vec<Option<f64>> {
            let state = match source {
                Source::Input(Input::Carbon(_)) => water
                    .solve(Measured::ph(7.9 + d, Some(PhScale::Total)).unwrap(), ta)
                    .and_then(|s| s.at(at(&water))),
                Source::Input(Input::Temperature) => {
                    let c = Conditions::new(25.0 + d, 35.0).unwrap();
                    let w = water.at(c).unwrap();
                    w.solve(ph, ta).and_then(|s| s.at(at(&w)))
                }
                Source::Constant(c) => {
                    let measured = water
                        .prepare()
                        .and_then(|w| w.with_constants_perturbed(*c, d))
                        .and_then(|w| w.solve(ph, ta))
                        .unwrap();
                    water
                        .at(at(&water))
                        .and_then(|w| w.prepare())
                        .and_then(|w| w.with_constants_perturbed(*c, d))
                        .and_then(|w| {
                            w.solve(
                                Measured::alkalinity_umol_kg(measured.alkalinity_umol_kg)?,
                                Measured::dic_umol_kg(measured.dic_umol_kg)?,
                            )
                        })
                }
                other => panic!("{other:?}"),
            };
            read(&state.unwrap())
        };
        let h = 1e-3;
        let (up, down) = (moved(h), moved(-h));
        for (q, out) in r.outputs.iter().enumerate() {
            let (Some(a), Some(b), Some(u_out)) = (up[q], down[q], out.u) else {
                panic!("{source:?} output {q}: no value");
            };
            let expected = (a - b) / (2.0 * h) * size;
            let got = r.contributions(q)[k];
            assert!(
                (got - expected).abs() <= 1e-4 * expected.abs() + 1e-5 * u_out,
                "{source:?} output {q}: {got} against {expected}"
            );
            assert!(base[q].is_some());
            checked += 1;
        }
    }
    assert_eq!(checked, 9);
}

/// A constant of a system the water does not have (its total zero) moves
/// no output: the propagation gives it zero contributions without a solve
/// (`Problem::moves_nothing`), and a full solve with the constant perturbed
/// (written here) indeed gives the same numbers. Checked for every constant
/// in a fresh water without calcium or nutrients and in sea water without
/// nutrients (and the ion pairs, zero there), and the other way: a constant
/// that does move something gets a contribution.
#[test]
fn a_constant_of_an_absent_system_moves_nothing() {
    use travertine::medium::ConstantName;
    let bare = Water::fresh(Conditions::new(12.0, 0.1).unwrap()).unwrap();
    let cases = [
        (bare, Measured::ph(7.2, None).unwrap()),
        (sea(), Measured::ph(8.0, Some(PhScale::Total)).unwrap()),
    ];
    let read = |s: &travertine::State| {
        let mut v = Vec::new();
        travertine::output::uncertainty::values_into(
            &travertine::output::uncertainty::numeric_outputs(),
            s,
            &mut v,
        );
        v
    };
    let ta = Measured::alkalinity_umol_kg(1500.0).unwrap();
    let mut zero = 0;
    for (water, ph) in cases {
        let p = Problem::new(&water, ph, ta).unwrap();
        let prepared = water.prepare().unwrap();
        let base = read(&prepared.solve(ph, ta).unwrap());
        for which in ConstantName::ALL {
            let u = Uncertainties::new()
                .without_constants()
                .with_constant(which, Size::Absolute(0.05))
                .unwrap();
            let r = propagate(&p, &u, q(read)).unwrap();
            let moved = prepared
                .with_constants_perturbed(which, 0.05)
                .and_then(|w| w.solve(ph, ta))
                .map(|s| read(&s));
            let unmoved = moved.as_ref().is_ok_and(|m| *m == base);
            let all_zero = r.outputs.iter().all(|o| o.u.unwrap_or(0.0) == 0.0);
            if unmoved {
                zero += 1;
                assert!(all_zero, "{:?} {which:?}", water.medium());
            } else {
                assert!(!all_zero, "{:?} {which:?}: moved {moved:?}", water.medium());
            }
        }
    }
    // Fresh: KB, the boron total, the ion pairs, both solubility products,
    // KP1–3, KSi, KNH4, KH2S, KS and KF; sea water (no nutrients given):
    // the two ion pairs, KP1–3, KSi, KNH4 and KH2S.
    assert_eq!(zero, 14 + 8);
}

/// A quantity lost on both sides of one source's step has no uncertainty,
/// and no contributions from the other sources either: its budget is all
/// zeros, not shares of a variance it does not have. Here DIC is read
/// only while the pH stays at its measured 8.05: alkalinity's steps keep
/// it (the pH is measured, so it does not move), the pH's steps lose it.
#[test]
fn a_lost_quantity_has_no_contributions() {
    let ph = Measured::ph(8.05, Some(PhScale::Total)).unwrap();
    let ta = Measured::alkalinity_umol_kg(2300.0).unwrap();
    let p = Problem::new(&sea(), ph, ta).unwrap();
    let u = Uncertainties::new()
        .without_constants()
        .with_input(Input::Carbon(Parameter::Alkalinity), Size::Absolute(2.0))
        .and_then(|u| u.with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.01)))
        .unwrap();
    let r = propagate(&p, &u, |s, out| {
        out.push(Some(s.dic_umol_kg).filter(|_| (s.ph_total - 8.05).abs() < 1e-9));
        out.push(Some(s.dic_umol_kg));
    })
    .unwrap();
    assert_eq!(r.outputs[0].u, None);
    assert!(r.outputs[0].value.is_some());
    assert!(r.contributions(0).iter().all(|c| *c == 0.0));
    assert!(r.budget(0).iter().all(|(_, share)| *share == 0.0));
    // The other quantity, read at every step, keeps both contributions.
    assert!(r.contributions(1).iter().all(|c| *c != 0.0));
}

/// A quantity that is not a number at a step falls back to the other
/// side's difference instead of giving a NaN uncertainty: here DIC, made
/// NaN by the closure above (first quantity) or below (second) the
/// measured pH, against DIC read plainly (third), whose u comes from the
/// forward difference; the backward and forward ones agree with it to the
/// step's curvature (10⁻⁶ here).
#[test]
fn a_quantity_not_a_number_at_one_step_uses_the_other_side() {
    let ph = Measured::ph(8.05, Some(PhScale::Total)).unwrap();
    let ta = Measured::alkalinity_umol_kg(2300.0).unwrap();
    let p = Problem::new(&sea(), ph, ta).unwrap();
    let r = propagate(&p, &ph_only(0.01), |s, out| {
        let dic = s.dic_umol_kg;
        out.push(Some(if s.ph_total > 8.05 + 5e-7 {
            f64::NAN
        } else {
            dic
        }));
        out.push(Some(if s.ph_total < 8.05 - 5e-7 {
            f64::NAN
        } else {
            dic
        }));
        out.push(Some(dic));
    })
    .unwrap();
    let plain = r.outputs[2].u.unwrap();
    assert!(plain > 0.0);
    for o in &r.outputs[..2] {
        let u = o.u.unwrap();
        assert!((u / plain - 1.0).abs() < 1e-4, "{u} against {plain}");
    }
}
