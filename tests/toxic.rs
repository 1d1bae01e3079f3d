//! The toxic fractions: un-ionised ammonia and hydrogen sulfide, in fresh
//! water (with the activity of the ions at the sample's ionic strength)
//! and in sea water, against values computed by hand here from the
//! published formulas.

use travertine::sample::inputs::Input;
use travertine::sample::{Composition, Sample};
use travertine::units::Amount;
use travertine::{Conditions, Measured, Parameter, State, Water};

/// pKa of NH4+, Emerson et al. (1975): 0.09018 + 2729.92/T.
fn emerson_pka(t_c: f64) -> f64 {
    0.09018 + 2729.92 / (t_c + 273.15)
}

/// A fresh water at `t_c` and ionic strength `i`, with 1 mg/L of ammonia
/// as N and 0.5 mg/L of sulfide as S, solved from pH (NBS) and alkalinity.
fn fresh(t_c: f64, i: f64, ph: f64) -> State {
    let mut s = Sample::new(t_c);
    s.set(Input::Medium, "fresh").unwrap();
    s.set(Input::IonicStrength, &i.to_string()).unwrap();
    s.set(Input::Carbon(Parameter::Ph), &ph.to_string())
        .unwrap();
    s.set(Input::Carbon(Parameter::Alkalinity), "1000 umol/kg")
        .unwrap();
    s.set(
        Input::Total(travertine::sample::inputs::Total::Ammonia),
        "1 mg/L N",
    )
    .unwrap();
    s.set(
        Input::Total(travertine::sample::inputs::Total::Sulfide),
        "0.5 mg/L S",
    )
    .unwrap();
    let (a, b) = s.pair().unwrap();
    s.water().unwrap().solve(a, b).unwrap()
}

#[test]
fn nh3_fraction_at_ph_8_25_c_and_zero_ionic_strength() {
    let s = fresh(25.0, 0.0, 8.0);
    let f = s.nh3_fraction.unwrap();
    // 0.0537 at pH 8.0 and 25 °C (Emerson et al. 1975).
    assert!((f - 0.0537).abs() < 5e-5, "{f}");
    // The textbook fraction exactly, at I = 0.
    let textbook = 1.0 / (1.0 + 10f64.powf(emerson_pka(25.0) - 8.0));
    assert!((f / textbook - 1.0).abs() < 1e-9, "{f} {textbook}");
}

#[test]
fn nh3_fraction_at_20_and_30_c() {
    // Computed from Emerson et al. (1975): pKa 9.4025 at 20 °C, 9.0954 at
    // 30 °C, so 0.0381 and 0.0743 at pH 8.0.
    for (t, expected) in [(20.0, 0.0381), (30.0, 0.0743)] {
        let f = fresh(t, 0.0, 8.0).nh3_fraction.unwrap();
        assert!((f - expected).abs() < 5e-5, "{t} °C: {f}");
        let textbook = 1.0 / (1.0 + 10f64.powf(emerson_pka(t) - 8.0));
        assert!((f / textbook - 1.0).abs() < 1e-9, "{t} °C");
    }
}

/// The Davies activity coefficient of a monovalent ion (Davies 1962), with
/// A from the dielectric constant of water (Malmberg & Maryott 1956) and
/// the density of pure water at 25 °C, 0.99705 g/cm³ (CRC Handbook).
fn davies_monovalent_25c(i: f64) -> f64 {
    let t: f64 = 25.0;
    let eps = 87.740 - 0.40008 * t + 9.398e-4 * t * t - 1.410e-6 * t * t * t;
    let a = 1.82483e6 * 0.99705f64.sqrt() * (eps * (t + 273.15)).powf(-1.5);
    let r = i.sqrt();
    10f64.powf(-a * (r / (1.0 + r) - 0.3 * i))
}

#[test]
fn nh3_fraction_with_the_activity_of_nh4_at_ionic_strength_0_05() {
    let i = 0.05;
    let s = fresh(25.0, i, 8.0);
    let g = davies_monovalent_25c(i);
    // By hand: f = 1 / (1 + {H+} / (Ka γNH4)), γNH3 = 1.
    let ka = 10f64.powf(-emerson_pka(25.0));
    let by_hand = 1.0 / (1.0 + 1e-8 / (ka * g));
    let f = s.nh3_fraction.unwrap();
    assert!((f / by_hand - 1.0).abs() < 1e-4, "{f} {by_hand} (γ {g})");
    // The activity lowers it visibly: γ ≈ 0.82, about 17 % less than at I = 0.
    let at_zero = fresh(25.0, 0.0, 8.0).nh3_fraction.unwrap();
    assert!(f < 0.85 * at_zero && f > 0.80 * at_zero, "{f} {at_zero}");
}

#[test]
fn nh3_in_mg_per_litre_is_the_total_times_the_fraction() {
    let s = fresh(25.0, 0.0, 8.0);
    let f = s.nh3_fraction.unwrap();
    let n = s.nh3_mg_l_n.unwrap();
    // 1 mg/L as N given: the un-ionised part is f mg/L as N.
    assert!((n / f - 1.0).abs() < 1e-9, "{n} {f}");
    // As NH3: molar masses 17.0305 and 14.0067 g/mol (IUPAC atomic weights).
    let nh3 = s.nh3_mg_l.unwrap();
    assert!((nh3 / n - 17.0305 / 14.0067).abs() < 1e-5, "{nh3} {n}");
    // The same NH3 as the ammonia part of the alkalinity.
    let from_alkalinity = s.ammonia_alkalinity_umol_kg * 1e-6 * s.density_kg_m3 * 14.0067;
    assert!((n / from_alkalinity - 1.0).abs() < 1e-6);
}

#[test]
fn nh3_fraction_in_sea_water_follows_johansson_and_wedborg() {
    let sea = Water::saline(Conditions::new(25.0, 35.0).unwrap())
        .unwrap()
        .with_composition(
            Composition::default()
                .with_ammonia(Amount::PerKg(5e-6))
                .unwrap(),
        );
    let s = sea
        .solve(
            Measured::alkalinity_umol_kg(2300.0).unwrap(),
            Measured::dic_umol_kg(2000.0).unwrap(),
        )
        .unwrap();
    // Johansson & Wedborg (1980), pKa on the sea-water scale:
    // −0.467 + 0.00113 S + 2887.9/T = 9.2586 at S 35, 25 °C (computed).
    let pka: f64 = -0.467 + 0.00113 * 35.0 + 2887.9 / 298.15;
    assert!((pka - 9.2586).abs() < 5e-5);
    // The ratio K/[H+] is the same on any scale: use the sea-water pH.
    let by_hand = 1.0 / (1.0 + 10f64.powf(pka - s.ph_seawater));
    let f = s.nh3_fraction.unwrap();
    assert!((f / by_hand - 1.0).abs() < 1e-9, "{f} {by_hand}");
    assert!(f > 0.05 && f < 0.10, "{f}");
}

/// pK1 of H2S, Millero, Plese & Fernandez (1988).
fn millero_pk1(t_c: f64, s: f64) -> f64 {
    let t = t_c + 273.15;
    -98.080 + 5765.4 / t + 15.0455 * t.ln() - 0.1498 * s.sqrt() + 0.0119 * s
}

#[test]
fn h2s_fraction_in_fresh_water() {
    // At I = 0 and pH 7.0 (NBS), 25 °C: pK1 6.9804 (computed from Millero
    // et al. 1988 at S = 0), so 1/(1 + 10^(7.0 − 6.9804)) = 0.4887.
    let s = fresh(25.0, 0.0, 7.0);
    let f = s.h2s_fraction.unwrap();
    let by_hand = 1.0 / (1.0 + 10f64.powf(7.0 - millero_pk1(25.0, 0.0)));
    assert!((f / by_hand - 1.0).abs() < 1e-9, "{f} {by_hand}");
    assert!((f - 0.4887).abs() < 5e-5, "{f}");
    // 0.5 mg/L as S given: H2S in mg/L as H2S, molar masses 34.081 and
    // 32.065 g/mol (IUPAC atomic weights).
    let mg = s.h2s_mg_l.unwrap();
    assert!(
        (mg / (0.5 * f * 34.081 / 32.065) - 1.0).abs() < 1e-5,
        "{mg}"
    );
    // With ionic strength, HS- is the ion: γ raises the H2S share.
    let i = 0.05;
    let g = davies_monovalent_25c(i);
    let k1 = 10f64.powf(-millero_pk1(25.0, 0.0));
    let by_hand = 1.0 / (1.0 + k1 / (g * 1e-7));
    let f = fresh(25.0, i, 7.0).h2s_fraction.unwrap();
    assert!((f / by_hand - 1.0).abs() < 1e-4, "{f} {by_hand}");
}

#[test]
fn h2s_fraction_in_sea_water() {
    let sea = Water::saline(Conditions::new(25.0, 35.0).unwrap())
        .unwrap()
        .with_composition(
            Composition::default()
                .with_sulfide(Amount::PerKg(2e-6))
                .unwrap(),
        );
    let s = sea
        .solve(
            Measured::ph(7.5, Some(travertine::PhScale::Total)).unwrap(),
            Measured::dic_umol_kg(2000.0).unwrap(),
        )
        .unwrap();
    // Millero et al. (1988) on the total scale: pK1* 6.5107 at S 35, 25 °C (computed).
    let pk = millero_pk1(25.0, 35.0);
    assert!((pk - 6.5107).abs() < 5e-5);
    let by_hand = 1.0 / (1.0 + 10f64.powf(7.5 - pk));
    let f = s.h2s_fraction.unwrap();
    assert!((f / by_hand - 1.0).abs() < 1e-6, "{f} {by_hand}");
}

#[test]
fn no_total_no_fraction() {
    let s = Water::fresh(Conditions::new(20.0, 0.1).unwrap())
        .unwrap()
        .solve(
            Measured::ph(8.0, None).unwrap(),
            Measured::alkalinity_umol_kg(1000.0).unwrap(),
        )
        .unwrap();
    assert_eq!(
        (s.nh3_fraction, s.nh3_mg_l_n, s.nh3_mg_l),
        (None, None, None)
    );
    assert_eq!((s.h2s_fraction, s.h2s_mg_l), (None, None));
    let v = serde_json::to_value(&s).unwrap();
    for key in [
        "nh3_fraction",
        "nh3_mg_l_n",
        "nh3_mg_l",
        "h2s_fraction",
        "h2s_mg_l",
    ] {
        assert!(v[key].is_null(), "{key}: {}", v[key]);
    }
}

#[test]
fn the_fraction_follows_the_state_to_other_conditions() {
    let lab = fresh(25.0, 0.0, 8.0);
    let cold = lab.at(Conditions::new(10.0, 0.0).unwrap()).unwrap();
    // Colder water: a higher pKa; the pH rises too, but less (Emerson
    // et al. 1975: pKa up 0.46 from 25 to 10 °C).
    let f = cold.nh3_fraction.unwrap();
    let by_hand = 1.0 / (1.0 + 10f64.powf(emerson_pka(10.0) - cold.ph_nbs));
    assert!((f / by_hand - 1.0).abs() < 1e-9, "{f} {by_hand}");
    assert!(f < lab.nh3_fraction.unwrap());
    // The measured pair is kept.
    assert_eq!(cold.computed_from, lab.computed_from);
    assert!(lab.computed_from.contains(&Parameter::Ph));
    assert!(lab.computed_from.contains(&Parameter::Alkalinity));
}

proptest::proptest! {
    #![proptest_config(proptest::prelude::ProptestConfig::with_cases(300))]

    /// Over the fresh and saline domains, with ammonia and sulfide, the
    /// fractions are finite and between 0 and 1, and the concentrations
    /// are the totals times the fractions.
    #[test]
    fn fractions_are_fractions_everywhere(
        t in 0.0f64..40.0, ph in 4.0f64..12.0, alk in 10.0f64..5000.0,
        nh4 in 1e-7f64..1e-3, hs in 1e-7f64..1e-3, saline in proptest::bool::ANY,
        i in 0.0f64..0.1,
    ) {
        let comp = Composition::default()
            .with_ammonia(Amount::PerKg(nh4)).unwrap()
            .with_sulfide(Amount::PerKg(hs)).unwrap();
        let water = if saline {
            Water::saline(Conditions::new(t, 35.0).unwrap()).unwrap()
        } else {
            Water::fresh(Conditions::new(t, 0.0).unwrap()).unwrap().with_ionic_strength(i).unwrap()
        }.with_composition(comp);
        let scale = if saline { Some(travertine::PhScale::Total) } else { None };
        if let Ok(s) = water.solve(Measured::ph(ph, scale).unwrap(), Measured::alkalinity_umol_kg(alk).unwrap()) {
            for f in [s.nh3_fraction.unwrap(), s.h2s_fraction.unwrap()] {
                proptest::prop_assert!(f.is_finite() && (0.0..=1.0).contains(&f), "{f}");
            }
            let n = s.nh3_mg_l_n.unwrap();
            let expected = nh4 * s.nh3_fraction.unwrap() * s.density_kg_m3 * 14.0067;
            proptest::prop_assert!((n - expected).abs() <= 1e-9 * expected.max(1e-12), "{n} {expected}");
            proptest::prop_assert!(s.h2s_mg_l.unwrap().is_finite());
        }
    }
}
