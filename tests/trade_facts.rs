//! Facts of the trade that any carbonate calculation must respect. Each
//! check is marked "common practice" beside its assert: these are the
//! textbook consequences of the definitions, not measured numbers.

use travertine::base::units::Amount;
use travertine::fits::CarbonicFit;
use travertine::medium::Constants;
use travertine::sample::water::SALINE_SALINITY_MIN;
use travertine::sample::Composition;
use travertine::{Conditions, Measured, PhScale, SolveOptions, Water};

/// Saline water with no boron, sulfate or fluoride, so that carbonic acid
/// and water are the only acids and bases in it.
fn carbonic_only(temperature_c: f64, salinity: f64) -> Water {
    let none = Amount::PerKg(0.0);
    let composition = Composition::default()
        .with_boron(none)
        .and_then(|c| c.with_sulfate(none))
        .and_then(|c| c.with_fluoride(none))
        .expect("zero totals are accepted");
    Water::saline(Conditions::new(temperature_c, salinity).expect("valid conditions"))
        .expect("valid saline water")
        .with_composition(composition)
}

fn relative_difference(a: f64, b: f64) -> f64 {
    (a - b).abs() / b.abs()
}

/// CO2 dissolved in water with no other acid or base (alkalinity 0): the
/// charge balance is [H+] = [HCO3-] + 2[CO3--] + [OH-], so [HCO3-] ≈ [H+]
/// and then [CO3--] = K2 [HCO3-]/[H+] ≈ K2, and CO2* > H+ ≈ HCO3- > CO3--.
///
/// The saline medium is used at the lowest salinity it accepts, with boron,
/// sulfate and fluoride set to zero. With no sulfate or fluoride the free,
/// total and sea-water scales coincide, so the working-scale K2 and the free
/// [H+] are on the same footing.
#[test]
fn co2_in_water_without_other_acids() {
    let s = SALINE_SALINITY_MIN;
    for t in [5.0, 15.0, 25.0, 35.0] {
        let water = carbonic_only(t, s);
        let k: Constants = water.constants().expect("constants");
        // With ST = FT = 0 every scale is the free scale (common practice:
        // the definitions of the total and sea-water scales).
        assert!((k.free_per_working() - 1.0).abs() < 1e-15);
        assert!((k.seawater_per_working() - 1.0).abs() < 1e-15);
        for pco2 in [280.0, 400.0, 1000.0] {
            let state = water
                .solve(
                    Measured::alkalinity_umol_kg(0.0).unwrap(),
                    Measured::pco2_uatm(pco2).unwrap(),
                )
                .expect("CO2 in water solves");
            let at = format!("{t} °C, S {s}, pCO2 {pco2} µatm");
            let h = state.free_hydrogen_umol_kg;
            let (co2, hco3, co3) = (state.co2_umol_kg, state.hco3_umol_kg, state.co3_umol_kg);
            // [HCO3-] ≈ [H+] within 2 % (common practice).
            assert!(
                relative_difference(hco3, h) < 0.02,
                "{at}: HCO3- {hco3} µmol/kg against H+ {h} µmol/kg"
            );
            // [CO3--] ≈ K2 within 2 %, both in mol/kg (common practice).
            assert!(
                relative_difference(co3 * 1e-6, k.k2()) < 0.02,
                "{at}: CO3-- {} mol/kg against K2 {} mol/kg",
                co3 * 1e-6,
                k.k2()
            );
            // Order of abundance CO2* > H+ ≈ HCO3- > CO3-- (common practice).
            assert!(co2 > h && co2 > hco3, "{at}: CO2* {co2} is not the largest");
            assert!(
                h > co3 && hco3 > co3,
                "{at}: CO3-- {co3} is not the smallest"
            );
            assert!(
                state.alkalinity_umol_kg.abs() < 1e-6,
                "{at}: alkalinity not 0"
            );
            if t == 25.0 && pco2 == 400.0 {
                // Rain in equilibrium with today's air has a pH of about 5.6
                // (common practice; equations.md §13 gives 5.598 at 420 µatm
                // for pure water, computed).
                assert!(
                    (state.ph_total - 5.6).abs() < 0.05,
                    "{at}: pH {}",
                    state.ph_total
                );
            }
        }
    }
}

/// K1/K2 ≥ 1000 (pK2 − pK1 ≥ 3) for every carbonic fit: the two steps are
/// well apart, which is why bicarbonate dominates between them.
///
/// The grid is 0–40 °C and salinity 0–40 in steps of 1, cut to each fit's
/// published range: Lueker et al. 2000 (2–35 °C, S 19–43), Roy et al. 1993
/// (0–45 °C, S 5–45) and Dickson & Millero 1987 (2–35 °C, S 20–40) are not
/// published at S 0, so only their ranges are used; Millero et al. 2006
/// covers the whole grid.
///
/// The bound of 1000 holds up to 30 °C. Above that, in salty water, every
/// published fit brings the two steps a little closer than three pK units:
/// Roy et al. 1993 from 31 °C at S 39 (849 at 40 °C, S 40), Millero et al.
/// 2006 from 38 °C at S 40 (951 at 40 °C, S 40); Lueker et al. 2000 and
/// Dickson & Millero 1987 stop at 35 °C with 1016 and 1025, and fall below
/// 1000 beyond it. So over the whole grid the separation checked is the
/// looser "about three pK units": pK2 − pK1 > 2.9.
#[test]
fn k1_over_k2_is_at_least_1000() {
    const WARM_C: f64 = 30.0;
    let check = |label: &str, t: f64, s: f64, ratio: f64| {
        if t <= WARM_C {
            // K1/K2 ≥ 1000 up to 30 °C (common practice).
            assert!(ratio >= 1000.0, "{label} at {t} °C, S {s}: K1/K2 = {ratio}");
        }
        // pK2 − pK1 > 2.9 everywhere on the grid (common practice: the
        // steps are about three pK units apart).
        assert!(
            ratio.log10() > 2.9,
            "{label} at {t} °C, S {s}: pK2 - pK1 = {}",
            ratio.log10()
        );
    };
    for fit in CarbonicFit::ALL {
        let range = fit.range();
        let mut points = 0;
        let mut lowest = f64::INFINITY;
        for t in 0..=40 {
            for s in 0..=40 {
                let (t, s) = (f64::from(t), f64::from(s));
                if !range.contains(t, s) {
                    continue;
                }
                let (k1, k2) = fit.k1_k2(t + 273.15, s);
                check(fit.name(), t, s, k1 / k2);
                lowest = lowest.min(k1 / k2);
                points += 1;
            }
        }
        assert!(points > 100, "{}: only {points} grid points", fit.name());
        println!("{}: {points} points, lowest K1/K2 {lowest:.0}", fit.name());
    }

    // The same through the crate's own choice of fit (Lueker 2000 inside its
    // window, Millero 2006 outside) over the whole grid from the lowest
    // salinity the saline medium accepts. Outside a fit's range the values
    // carry warnings but are still computed.
    for t in 0..=40 {
        for s in std::iter::once(SALINE_SALINITY_MIN).chain((1..=40).map(f64::from)) {
            let t = f64::from(t);
            let k = Water::saline(Conditions::new(t, s).unwrap())
                .unwrap()
                .constants()
                .unwrap();
            check(k.fits_used().carbonic.as_str(), t, s, k.k1() / k.k2());
        }
    }
}

/// The bicarbonate fraction K1 h/(h² + K1 h + K1 K2) is largest where
/// h² = K1 K2, that is at pH = (pK1 + pK2)/2. Checked numerically: a fine
/// scan of pH with solves from (pH, DIC), whose argmax must fall within one
/// scan step of the midpoint.
#[test]
fn bicarbonate_peaks_midway_between_pk1_and_pk2() {
    const STEP: f64 = 0.001;
    let cases = [(25.0, 35.0), (2.0, 35.0), (10.0, 5.0), (30.0, 20.0)];
    for (t, s) in cases {
        let water = Water::saline(Conditions::new(t, s).unwrap()).unwrap();
        let prepared = water.prepare().unwrap();
        let k = prepared.constants().unwrap();
        // pK on the working (total) scale, and pH scanned on the same scale.
        let midpoint = -(k.k1().log10() + k.k2().log10()) / 2.0;
        let dic = Measured::dic_umol_kg(2000.0).unwrap();
        let options = SolveOptions::default();
        let n = ((11.0 - 4.0) / STEP).round() as usize;
        let mut best = (f64::NAN, f64::NEG_INFINITY);
        for i in 0..=n {
            let ph = 4.0 + i as f64 * STEP;
            let state = prepared
                .solve_with(
                    Measured::ph(ph, Some(PhScale::Total)).unwrap(),
                    dic,
                    &options,
                )
                .unwrap();
            let fraction = state.hco3_umol_kg / state.dic_umol_kg;
            if fraction > best.1 {
                best = (ph, fraction);
            }
        }
        let (peak_ph, peak) = best;
        assert!(
            peak_ph > 4.0 + STEP && peak_ph < 11.0 - STEP,
            "{t} °C, S {s}: the peak {peak_ph} is at the end of the scan"
        );
        // The peak of HCO3-/DIC is at (pK1 + pK2)/2 (common practice).
        assert!(
            (peak_ph - midpoint).abs() <= STEP,
            "{t} °C, S {s}: HCO3- fraction peaks at pH {peak_ph}, (pK1 + pK2)/2 = {midpoint}"
        );
        // And there it is 1/(1 + 2 sqrt(K2/K1)) (common practice: the value of
        // the fraction at h = sqrt(K1 K2)).
        let analytic = 1.0 / (1.0 + 2.0 * (k.k2() / k.k1()).sqrt());
        assert!(
            peak <= analytic + 1e-12 && analytic - peak < 1e-6,
            "{t} °C, S {s}: peak fraction {peak}, analytic {analytic}"
        );
    }
}
