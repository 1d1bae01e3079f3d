//! Property tests over the whole valid saline domain: every valid pair of
//! outputs solves back to the same state, and nothing panics or yields NaN.
//!
//! Tolerance policy (DEVELOPERS.md): a round trip must return every output
//! within 1e-9 relative. States where the two roots of a two-root pair lie
//! within 0.1 pH of each other are skipped for that pair only: there the
//! problem itself is ill-conditioned (a double root), not the solver.

mod common;
use common::{any_value, check_every_pair};
use proptest::prelude::*;
use travertine::base::units::Amount;
use travertine::sample::air::Air;
use travertine::sample::composition::Composition;
use travertine::{
    Conditions, Measured, Parameter, PhScale, RootChoice, SolveOptions, State, Water,
};

fn outputs(s: &State) -> [(&'static str, f64); 14] {
    [
        ("ph_total", s.ph_total),
        ("ph_free", s.ph_free),
        ("alkalinity", s.alkalinity_umol_kg),
        ("dic", s.dic_umol_kg),
        ("co2", s.co2_umol_kg),
        ("hco3", s.hco3_umol_kg),
        ("co3", s.co3_umol_kg),
        ("fco2", s.fco2_uatm),
        ("pco2", s.pco2_uatm),
        ("xco2", s.xco2_ppm),
        ("omega_calcite", s.omega_calcite.unwrap_or(f64::NAN)),
        ("revelle", s.revelle_factor),
        ("borate", s.borate_alkalinity_umol_kg),
        ("hydroxide", s.hydroxide_umol_kg),
    ]
}

fn mismatch(a: &State, b: &State) -> Option<String> {
    for ((name, x), (_, y)) in outputs(a).iter().zip(outputs(b).iter()) {
        let rel = (x - y).abs() / x.abs().max(1e-300);
        if rel.is_nan() || rel > 1e-9 {
            return Some(format!("{name}: expected {x}, got {y} (relative {rel:e})"));
        }
    }
    None
}

#[derive(Debug, Clone)]
struct Case {
    t: f64,
    s: f64,
    p: f64,
    ta: f64,
    dic_ratio: f64,
    nutrients: Option<(f64, f64, f64, f64)>,
}

fn case() -> impl Strategy<Value = Case> {
    (
        0.0..40.0f64,
        1.0..45.0f64,
        0.0..5000.0f64,
        200.0..5000.0f64,
        0.6..1.15f64,
        proptest::option::of((0.0..5.0f64, 0.0..150.0f64, 0.0..20.0f64, 0.0..20.0f64)),
    )
        .prop_map(|(t, s, p, ta, dic_ratio, nutrients)| Case {
            t,
            s,
            p,
            ta,
            dic_ratio,
            nutrients,
        })
}

fn water(c: &Case) -> Water {
    let cond = Conditions::new(c.t, c.s)
        .and_then(|x| x.with_pressure_dbar(c.p))
        .expect("valid conditions");
    let mut comp = Composition::default();
    if let Some((po4, si, nh, hs)) = c.nutrients {
        comp = comp
            .with_phosphate(Amount::PerKg(po4 * 1e-6))
            .and_then(|x| x.with_silicate(Amount::PerKg(si * 1e-6)))
            .and_then(|x| x.with_ammonia(Amount::PerKg(nh * 1e-6)))
            .and_then(|x| x.with_sulfide(Amount::PerKg(hs * 1e-6)))
            .expect("valid totals");
    }
    Water::saline(cond)
        .expect("saline range")
        .with_composition(comp)
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(400))]

    #[test]
    fn every_pair_returns_the_same_state(c in case()) {
        let w = water(&c);
        let base = w.solve(
            Measured::alkalinity_umol_kg(c.ta).unwrap(),
            Measured::dic_umol_kg(c.ta * c.dic_ratio).unwrap(),
        );
        // Some (TA, DIC) combinations imply a pH outside 0–14: not a state to round-trip.
        let Ok(base) = base else { return Ok(()); };
        prop_assume!(base.ph_total > 4.0 && base.ph_total < 10.5);
        let pairs = check_every_pair(&w, &base, |s| s.ph_total, mismatch)?;
        prop_assert!(pairs >= 28, "only {pairs} pairs checked");
    }

    #[test]
    fn in_situ_and_back_returns_the_state(c in case(), t2 in 0.0..40.0f64, p2 in 0.0..5000.0f64) {
        let w = water(&c);
        let Ok(base) = w.solve(
            Measured::alkalinity_umol_kg(c.ta).unwrap(),
            Measured::dic_umol_kg(c.ta * c.dic_ratio).unwrap(),
        ) else { return Ok(()); };
        let there = Conditions::new(t2, c.s).unwrap().with_pressure_dbar(p2).unwrap();
        let Ok(moved) = base.at(there) else { return Ok(()); };
        let back = moved.at(*w.conditions()).unwrap();
        prop_assert!(mismatch(&base, &back).is_none(), "{}", mismatch(&base, &back).unwrap());
        prop_assert!((moved.dic_umol_kg / base.dic_umol_kg - 1.0).abs() < 1e-12);
    }
}

/// Keys that are null by design in saline water: the fresh-water figures
/// (every key of the list is always written, null where the medium has none).
const NULL_IN_SALINE: [&str; 15] = [
    "calcium_activity",
    "cahco3_umol_kg",
    "caco3_pair_umol_kg",
    "ionic_strength_from",
    "gamma_monovalent",
    "gamma_divalent",
    "charge_balance_percent",
    "saturation_ph_nbs",
    "langelier_index",
    "precipitation_potential_mg_l_caco3",
    // The toxic fractions, null without a total of ammonia or sulfide
    // (none is given here).
    "nh3_fraction",
    "nh3_mg_l_n",
    "nh3_mg_l",
    "h2s_fraction",
    "h2s_mg_l",
];

/// The figures of the water at equilibrium with the air: null where that
/// water cannot be solved, which a note then says (checked on the state).
const NULL_WITHOUT_EQUILIBRIUM: [&str; 2] = ["equilibrium_ph", "equilibrium_free_co2_mg_l"];

fn all_numbers_finite(v: &serde_json::Value) -> bool {
    match v {
        serde_json::Value::Null => false,
        serde_json::Value::Number(n) => n.as_f64().is_some_and(f64::is_finite),
        // serde_json writes NaN as null, so null means NaN, except for the
        // fresh-water figures, which are null by design in saline water.
        serde_json::Value::Object(m) => m.iter().all(|(k, v)| {
            ((NULL_IN_SALINE.contains(&k.as_str())
                || NULL_WITHOUT_EQUILIBRIUM.contains(&k.as_str()))
                && v.is_null())
                || all_numbers_finite(v)
        }),
        serde_json::Value::Array(a) => a.iter().all(all_numbers_finite),
        _ => true,
    }
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(2000))]

    #[test]
    fn arbitrary_inputs_never_panic_or_give_nan(
        t in any_value(), s in any_value(), p in any_value(),
        ia in 0usize..9, ib in 0usize..9, va in any_value(), vb in any_value(),
        po4 in any_value(), scale in 0usize..4,
    ) {
        let scales = [PhScale::Total, PhScale::Seawater, PhScale::Free, PhScale::Nbs];
        let make = |i: usize, v: f64| -> travertine::Result<Measured> {
            match Parameter::ALL[i] {
                Parameter::Ph => Measured::ph(v, Some(scales[scale])),
                Parameter::Alkalinity => Measured::alkalinity_umol_kg(v),
                Parameter::Dic => Measured::dic_umol_kg(v),
                Parameter::Pco2 => Measured::pco2_uatm(v),
                Parameter::Fco2 => Measured::fco2_uatm(v),
                Parameter::Xco2 => Measured::xco2_ppm(v),
                Parameter::Co2 => Measured::co2_umol_kg(v),
                Parameter::Hco3 => Measured::hco3_umol_kg(v),
                _ => Measured::co3_umol_kg(v),
            }
        };
        let result = Conditions::new(t, s)
            .and_then(|c| c.with_pressure_dbar(p))
            .and_then(Water::saline)
            .and_then(|w| Ok(w.with_composition(Composition::default().with_phosphate(Amount::PerKg(po4 * 1e-6))?)))
            .and_then(|w| w.solve(make(ia, va)?, make(ib, vb)?))
            // The exchange with the air too, in a 6 m/s wind.
            .and_then(|s| s.with_exchange(&Air::new().with_wind_m_s(6.0)?, None));
        if let Ok(state) = result {
            let json = serde_json::to_value(&state).unwrap();
            prop_assert!(all_numbers_finite(&json), "non-finite output: {json}");
            let e = state.exchange.unwrap();
            let noted = state.warnings.iter().any(|w| w.code() == "equilibrium_not_computed");
            prop_assert_eq!(e.equilibrium_ph.is_none(), noted, "{}", json);
            prop_assert!(e.equilibrium_ph.is_none_or(f64::is_finite) && e.equilibrium_free_co2_mg_l.is_none_or(f64::is_finite));
        }
    }
}

/// Measurements at the limits of their accepted ranges solve: rounding in
/// the solve must not push a limit value just over its own limit.
#[test]
fn measurements_at_the_range_limits_solve() {
    let w = Water::saline(Conditions::new(25.0, 35.0).unwrap()).unwrap();
    let (_, ta_max) = Parameter::Alkalinity.accepted_range();
    let s = w
        .solve(
            Measured::alkalinity_umol_kg(ta_max).unwrap(),
            Measured::co2_umol_kg(0.001).unwrap(),
        )
        .expect("alkalinity at its upper limit solves");
    assert!((s.alkalinity_umol_kg / ta_max - 1.0).abs() < 1e-9);
    let (_, dic_max) = Parameter::Dic.accepted_range();
    let s = w
        .solve(
            Measured::dic_umol_kg(dic_max).unwrap(),
            Measured::ph(7.0, None).unwrap(),
        )
        .expect("DIC at its upper limit solves");
    assert!((s.dic_umol_kg / dic_max - 1.0).abs() < 1e-12);
}

/// When the root nearer pH 8 fits no measurable water, the default falls
/// back to the other one and does not advertise the first; an explicit
/// choice of the unmeasurable root is refused.
#[test]
fn the_default_root_falls_back_when_the_nearer_one_fits_no_water() {
    let w = Water::saline(Conditions::new(25.0, 35.0).unwrap()).unwrap();
    let (ta, co3) = (
        Measured::alkalinity_umol_kg(13000.0).unwrap(),
        Measured::co3_umol_kg(1.0).unwrap(),
    );
    // The lower-pH root would need a DIC of about 1.4e5 µmol/kg.
    let lower = w.solve_with(
        ta,
        co3,
        &SolveOptions::default().with_root(RootChoice::LowerPh),
    );
    assert!(lower.is_err());
    let natural = w.solve(ta, co3).expect("the higher-pH root fits");
    let higher = w
        .solve_with(
            ta,
            co3,
            &SolveOptions::default().with_root(RootChoice::HigherPh),
        )
        .unwrap();
    assert!((natural.ph_total - higher.ph_total).abs() < 1e-12);
    assert!(natural.ph_total > 11.0);
    assert!(natural.warnings.is_empty(), "{:?}", natural.warnings);
}
