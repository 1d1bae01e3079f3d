//! Property tests over the fresh medium: every valid pair of outputs solves
//! back to the same state, over 0–40 °C and ionic strength 0–0.1 (given
//! directly, from specific conductance, from TDS, from major ions, or from
//! the carbonate species alone), with and without calcium (the CaHCO3+ and
//! CaCO3⁰ pairs on or off), with either activity model; and nothing panics
//! or yields NaN for arbitrary inputs.
//!
//! Tolerance policy (DEVELOPERS.md, as for the saline medium): a round trip
//! must return every output within 1e-9 relative. States where the two roots
//! of a two-root pair lie within 0.1 pH of each other are skipped for that
//! pair only: there the problem itself is ill-conditioned (a double root),
//! not the solver. Quantities that pass through zero (the Langelier index,
//! the precipitation potential) are compared against a scale instead of
//! their own size: 1e-9 pH units and 1e-9 of the alkalinity.
//!
//! pH is on the NBS scale throughout, the working scale of the medium.

mod common;
use common::{any_value, check_every_pair};
use proptest::prelude::*;
use travertine::base::units::Amount;
use travertine::medium::IonicStrengthRoute;
use travertine::properties::activity::ActivityModel;
use travertine::sample::air::Air;
use travertine::sample::composition::Composition;
use travertine::{
    Conditions, Measured, Parameter, PhScale, RootChoice, SolveOptions, State, Water,
};

/// (name, value, scale): compared within 1e-9 of max(|value|, scale).
fn outputs(s: &State) -> Vec<(&'static str, f64, f64)> {
    let tiny = 1e-300;
    let mut v = vec![
        ("ph_nbs", s.ph_nbs, tiny),
        ("ph_free", s.ph_free, tiny),
        ("alkalinity", s.alkalinity_umol_kg, tiny),
        ("dic", s.dic_umol_kg, tiny),
        ("co2", s.co2_umol_kg, tiny),
        ("hco3", s.hco3_umol_kg, tiny),
        ("co3", s.co3_umol_kg, tiny),
        ("fco2", s.fco2_uatm, tiny),
        ("pco2", s.pco2_uatm, tiny),
        ("xco2", s.xco2_ppm, tiny),
        ("revelle", s.revelle_factor, tiny),
        ("hydroxide", s.hydroxide_umol_kg, tiny),
        ("ionic_strength", s.ionic_strength, tiny),
        (
            "gamma_monovalent",
            s.gamma_monovalent.unwrap_or(f64::NAN),
            tiny,
        ),
        ("gamma_divalent", s.gamma_divalent.unwrap_or(f64::NAN), tiny),
        ("free_co2_mg_l", s.free_co2_mg_l, tiny),
    ];
    if s.calcium_umol_kg.is_some() {
        let nan = f64::NAN;
        v.extend([
            ("omega_calcite", s.omega_calcite.unwrap_or(nan), tiny),
            ("omega_aragonite", s.omega_aragonite.unwrap_or(nan), tiny),
            ("calcium_free", s.calcium_free_umol_kg.unwrap_or(nan), tiny),
            ("cahco3", s.cahco3_umol_kg.unwrap_or(nan), tiny),
            ("caco3_pair", s.caco3_pair_umol_kg.unwrap_or(nan), tiny),
            ("calcium_activity", s.calcium_activity.unwrap_or(nan), tiny),
        ]);
        // pHs and the Langelier index exist unless no pH 4–13 saturates the
        // water; they must then be missing in both states (checked below).
        if let Some(phs) = s.saturation_ph_nbs {
            v.push(("saturation_ph_nbs", phs, tiny));
            v.push(("langelier_index", s.langelier_index.unwrap_or(nan), 1.0));
        }
        if let Some(pp) = s.precipitation_potential_mg_l_caco3 {
            v.push(("precipitation_potential", pp, s.alkalinity_mg_l_caco3));
        }
    }
    v
}

/// How much a solve from alkalinity magnifies errors in the carbon: the
/// non-carbonate alkalinity over 100 times the carbonate alkalinity. In a
/// high-pH, carbon-poor water (pH 12.3, DIC 1 µmol/kg, alkalinity 20 000
/// µmol/kg of hydroxide) the carbon is a difference of two numbers 10⁴
/// apart, and the settled ionic strength, good to 1e-12, moves the
/// hydroxide by more than 1e-9 of the carbon: the problem's condition, not
/// the solver's error. The round-trip tolerance grows by this factor where
/// it exceeds 1 (DEVELOPERS.md, tolerance policy).
fn carbon_by_difference(s: &State) -> f64 {
    let carbonate = s.carbonate_alkalinity_umol_kg.abs();
    (s.alkalinity_umol_kg - s.carbonate_alkalinity_umol_kg).abs() / (100.0 * carbonate)
}

fn mismatch(a: &State, b: &State) -> Option<String> {
    let (oa, ob) = (outputs(a), outputs(b));
    if oa.len() != ob.len() {
        let names = |o: &[(&'static str, f64, f64)]| o.iter().map(|x| x.0).collect::<Vec<_>>();
        return Some(format!(
            "different outputs: {:?} against {:?}",
            names(&oa),
            names(&ob)
        ));
    }
    if a.ionic_strength_from != b.ionic_strength_from {
        return Some(format!(
            "ionic strength route {:?} against {:?}",
            a.ionic_strength_from, b.ionic_strength_from
        ));
    }
    let tolerance = 1e-9 * carbon_by_difference(a).max(1.0);
    for ((name, x, scale), (_, y, _)) in oa.iter().zip(ob.iter()) {
        let rel = (x - y).abs() / x.abs().max(*scale);
        if rel.is_nan() || rel > tolerance {
            return Some(format!("{name}: expected {x}, got {y} (relative {rel:e})"));
        }
    }
    None
}

/// Where the ionic strength comes from.
#[derive(Debug, Clone)]
enum Source {
    /// Given directly, mol/kg.
    Given(f64),
    /// Specific conductance at 25 °C, µS/cm.
    Conductance(f64),
    /// Total dissolved solids, mg/L.
    Tds(f64),
    /// Major ions: NaCl, MgSO4 and KCl making (nearly) this ionic strength,
    /// in these proportions.
    Ions(f64, (f64, f64, f64)),
    /// Nothing: the carbonate species alone.
    Nothing,
}

#[derive(Debug, Clone)]
struct Case {
    t: f64,
    source: Source,
    calcium: Option<f64>,
    model: ActivityModel,
    ta: f64,
    dic_ratio: f64,
}

fn source() -> impl Strategy<Value = Source> {
    prop_oneof![
        (0.0..0.1f64).prop_map(Source::Given),
        Just(Source::Given(0.0)),
        // Russell 1976: I = 1.6e-5 SpC, so 6250 µS/cm is I 0.1.
        (0.0..6250.0f64).prop_map(Source::Conductance),
        // Langelier 1936: I = 2.5e-5 TDS, so 4000 mg/L is I 0.1.
        (0.0..4000.0f64).prop_map(Source::Tds),
        (0.0..0.09f64, (0.01..1.0f64, 0.0..1.0f64, 0.0..1.0f64))
            .prop_map(|(i, w)| Source::Ions(i, w)),
        Just(Source::Nothing),
    ]
}

fn case() -> impl Strategy<Value = Case> {
    (
        0.0..40.0f64,
        source(),
        proptest::option::of(1e-5..2e-3f64),
        prop_oneof![
            Just(ActivityModel::Davies),
            Just(ActivityModel::ExtendedDebyeHuckel)
        ],
        20.0..5000.0f64,
        0.6..1.15f64,
    )
        .prop_map(|(t, source, calcium, model, ta, dic_ratio)| Case {
            t,
            source,
            calcium,
            model,
            ta,
            dic_ratio,
        })
}

fn water(c: &Case) -> Water {
    let mut comp = Composition::default();
    if let Some(ca) = c.calcium {
        comp = comp.with_calcium(Amount::PerKg(ca)).expect("valid calcium");
    }
    let mut w = Water::fresh(Conditions::new(c.t, 0.0).expect("valid conditions"))
        .expect("fresh range")
        .with_activity_model(c.model);
    match c.source {
        Source::Given(i) => w = w.with_ionic_strength(i).expect("valid I"),
        Source::Conductance(spc) => w = w.with_specific_conductance_us_cm(spc).expect("valid"),
        Source::Tds(tds) => w = w.with_tds_mg_l(tds).expect("valid TDS"),
        Source::Ions(i, (na_cl, mg_so4, k_cl)) => {
            // I of NaCl = c, of MgSO4 = 4c, of KCl = c.
            let sum = na_cl + mg_so4 + k_cl;
            let (na, mg, k) = (i * na_cl / sum, i * mg_so4 / sum / 4.0, i * k_cl / sum);
            comp = comp
                .with_sodium(Amount::PerKg(na))
                .and_then(|x| x.with_chloride(Amount::PerKg(na + k)))
                .and_then(|x| x.with_magnesium(Amount::PerKg(mg)))
                .and_then(|x| x.with_sulfate(Amount::PerKg(mg)))
                .and_then(|x| x.with_potassium(Amount::PerKg(k)))
                .expect("valid ions");
        }
        Source::Nothing => {}
    }
    w.with_composition(comp)
}

fn expected_route(c: &Case) -> IonicStrengthRoute {
    match c.source {
        Source::Given(_) => IonicStrengthRoute::Given,
        Source::Conductance(_) => IonicStrengthRoute::SpecificConductance,
        Source::Tds(_) => IonicStrengthRoute::Tds,
        Source::Ions(..) => IonicStrengthRoute::MajorIons,
        Source::Nothing => IonicStrengthRoute::AlkalinityOnly,
    }
}

/// `cases` cases, and no failure file: a failing case is printed, shrunk,
/// and is to be turned into a named test.
fn config(cases: u32) -> ProptestConfig {
    ProptestConfig {
        cases,
        failure_persistence: None,
        ..ProptestConfig::default()
    }
}

proptest! {
    #![proptest_config(config(1000))]

    #[test]
    fn every_pair_returns_the_same_state(c in case()) {
        let w = water(&c);
        let base = w.solve(
            Measured::alkalinity_umol_kg(c.ta).unwrap(),
            Measured::dic_umol_kg(c.ta * c.dic_ratio).unwrap(),
        );
        // Some (TA, DIC) combinations imply a pH outside 0–14: not a state to round-trip.
        let Ok(base) = base else { return Ok(()); };
        prop_assume!(base.ph_nbs > 4.0 && base.ph_nbs < 10.5);
        prop_assert_eq!(base.ionic_strength_from, Some(expected_route(&c)));
        prop_assert!(base.ionic_strength >= 0.0 && base.ionic_strength <= 0.11,
            "I {} outside the domain", base.ionic_strength);
        prop_assert_eq!(base.omega_calcite.is_some(), c.calcium.is_some());
        let pairs = check_every_pair(&w, &base, |s| s.ph_nbs, mismatch)?;
        prop_assert!(pairs >= 28, "only {pairs} pairs checked");
    }

}

/// A fresh state anywhere in the domain: pH 4 to 12.5 (NBS) and DIC 1 to
/// 5000 µmol/kg (uniform in its logarithm), so that high-pH, carbon-poor
/// waters, where hydroxide carries the alkalinity and alkalinity with CO3
/// has its second root, are drawn as often as ordinary ones.
fn anywhere() -> impl Strategy<Value = (Case, f64, f64)> {
    (case(), 4.0..12.5f64, 0.0..3.7f64).prop_map(|(c, ph, log_dic)| (c, ph, 10f64.powf(log_dic)))
}

proptest! {
    #![proptest_config(config(1000))]

    #[test]
    fn every_pair_returns_the_same_state_over_the_whole_domain((c, ph, dic) in anywhere()) {
        let w = water(&c);
        let Ok(base) = w.solve(
            Measured::ph(ph, None).unwrap(),
            Measured::dic_umol_kg(dic).unwrap(),
        ) else {
            // A state whose alkalinity is beyond the accepted range.
            return Ok(());
        };
        prop_assert!((base.ph_nbs - ph).abs() < 1e-12);
        let pairs = check_every_pair(&w, &base, |s| s.ph_nbs, mismatch)?;
        // pH, DIC, HCO3 and the four gas parameters are always valid inputs.
        prop_assert!(pairs >= 10, "only {pairs} pairs checked");
    }
}

proptest! {
    #![proptest_config(config(500))]

    #[test]
    fn another_temperature_and_back_returns_the_state(c in case(), t2 in 0.0..40.0f64) {
        let w = water(&c);
        let Ok(base) = w.solve(
            Measured::alkalinity_umol_kg(c.ta).unwrap(),
            Measured::dic_umol_kg(c.ta * c.dic_ratio).unwrap(),
        ) else { return Ok(()); };
        prop_assume!(base.ph_nbs > 4.0 && base.ph_nbs < 10.5);
        let Ok(moved) = base.at(Conditions::new(t2, 0.0).unwrap()) else { return Ok(()); };
        let back = moved.at(*w.conditions()).unwrap();
        prop_assert!(mismatch(&base, &back).is_none(), "{}", mismatch(&base, &back).unwrap());
        prop_assert!((moved.dic_umol_kg / base.dic_umol_kg - 1.0).abs() < 1e-12);
        prop_assert!((moved.alkalinity_umol_kg / base.alkalinity_umol_kg - 1.0).abs() < 1e-9);
    }
}

/// Inside the domain most of the time, anything at all otherwise.
fn in_domain(lo: f64, hi: f64) -> impl Strategy<Value = f64> {
    prop_oneof![3 => lo..hi, 1 => any_value()]
}

/// Keys that are null, legitimately, when no calcium was given (every key
/// is written, null where the state has no value; the charge balance is
/// null unless major ions were given).
const NULL_WITHOUT_CALCIUM: [&str; 19] = [
    "omega_calcite",
    "omega_aragonite",
    "si_calcite",
    "si_aragonite",
    "calcium_umol_kg",
    "calcium_hardness_mg_l_caco3",
    "calcium_free_umol_kg",
    "calcium_activity",
    "cahco3_umol_kg",
    "caco3_pair_umol_kg",
    "saturation_ph_nbs",
    "langelier_index",
    "precipitation_potential_mg_l_caco3",
    "charge_balance_percent",
    // The toxic fractions: no ammonia or sulfide is given here.
    "nh3_fraction",
    "nh3_mg_l_n",
    "nh3_mg_l",
    "h2s_fraction",
    "h2s_mg_l",
];

/// Keys that may be null even with calcium: no pH 4–13 saturates the water
/// (a warning says so), the charge balance of ions not given, the
/// precipitation potential not asked for. Every key is written, null where
/// the state has no value; their values, when present, are checked on the
/// state itself, since serde writes NaN as null too.
const NULL_WITH_CALCIUM: [&str; 9] = [
    "saturation_ph_nbs",
    "langelier_index",
    "charge_balance_percent",
    "precipitation_potential_mg_l_caco3",
    // The toxic fractions: no ammonia or sulfide is given here.
    "nh3_fraction",
    "nh3_mg_l_n",
    "nh3_mg_l",
    "h2s_fraction",
    "h2s_mg_l",
];

/// Every optional number of the state, where present, is finite.
fn options_finite(s: &State) -> bool {
    [
        s.omega_calcite,
        s.omega_aragonite,
        s.si_calcite,
        s.si_aragonite,
        s.calcium_umol_kg,
        s.calcium_free_umol_kg,
        s.calcium_activity,
        s.cahco3_umol_kg,
        s.caco3_pair_umol_kg,
        s.charge_balance_percent,
        s.gamma_monovalent,
        s.gamma_divalent,
        s.saturation_ph_nbs,
        s.langelier_index,
        s.precipitation_potential_mg_l_caco3,
        s.nh3_fraction,
        s.nh3_mg_l_n,
        s.nh3_mg_l,
        s.h2s_fraction,
        s.h2s_mg_l,
        s.exchange.and_then(|e| e.co2_flux_mmol_m2_d),
        s.exchange.and_then(|e| e.equilibrium_ph),
        s.exchange.and_then(|e| e.equilibrium_free_co2_mg_l),
    ]
    .iter()
    .all(|v| v.is_none_or(f64::is_finite))
}

/// Every number finite; a null (which is also how serde writes NaN) only
/// where `allowed_null` names the key.
fn all_numbers_finite(key: &str, v: &serde_json::Value, allowed_null: &[&str]) -> bool {
    match v {
        serde_json::Value::Null => allowed_null.contains(&key),
        serde_json::Value::Number(n) => n.as_f64().is_some_and(f64::is_finite),
        serde_json::Value::Object(m) => m
            .iter()
            .all(|(k, x)| all_numbers_finite(k, x, allowed_null)),
        serde_json::Value::Array(a) => a.iter().all(|x| all_numbers_finite(key, x, allowed_null)),
        _ => true,
    }
}

proptest! {
    #![proptest_config(config(3000))]

    #[test]
    fn arbitrary_inputs_never_panic_or_give_nan(
        t in in_domain(0.0, 40.0), i in in_domain(0.0, 0.1), route in 0usize..5,
        ca in proptest::option::of(in_domain(0.0, 3e-3)), edh in any::<bool>(),
        ia in 0usize..9, ib in 0usize..9, va in any_value(), vb in any_value(),
        scale in 0usize..4,
    ) {
        let scales = [PhScale::Nbs, PhScale::Free, PhScale::Total, PhScale::Seawater];
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
        let model = if edh { ActivityModel::ExtendedDebyeHuckel } else { ActivityModel::Davies };
        let result = Conditions::new(t, 0.0)
            .and_then(Water::fresh)
            .map(|w| w.with_activity_model(model))
            .and_then(|w| match route {
                0 => w.with_ionic_strength(i),
                1 => w.with_specific_conductance_us_cm(i / 1.6e-5),
                2 => w.with_tds_mg_l(i / 2.5e-5),
                3 => Ok(w.with_composition(Composition::default().with_sodium(Amount::PerKg(i))?
                    .with_chloride(Amount::PerKg(i))?)),
                _ => Ok(w),
            })
            .and_then(|w| match ca {
                Some(ca) => {
                    let comp = w.composition().with_calcium(Amount::PerKg(ca))?;
                    Ok(w.with_composition(comp))
                }
                None => Ok(w),
            })
            .and_then(|w| w.solve(make(ia, va)?, make(ib, vb)?))
            // The exchange with the air too, in a 4 m/s wind.
            .and_then(|s| s.with_exchange(&Air::new().with_wind_m_s(4.0)?, None));
        if let Ok(state) = result {
            let json = serde_json::to_value(&state).unwrap();
            let e = state.exchange.unwrap();
            // The water at equilibrium with the air is null only where it
            // cannot be solved, and a note then says so.
            let noted = state.warnings.iter().any(|w| w.code() == "equilibrium_not_computed");
            prop_assert_eq!(e.equilibrium_ph.is_none(), noted, "{}", json);
            let mut allowed: Vec<&str> = if state.calcium_umol_kg.is_some() { NULL_WITH_CALCIUM.to_vec() } else { NULL_WITHOUT_CALCIUM.to_vec() };
            if noted {
                allowed.extend(["equilibrium_ph", "equilibrium_free_co2_mg_l"]);
            }
            let allowed = allowed.as_slice();
            prop_assert!(all_numbers_finite("", &json, allowed), "non-finite output: {json}");
            prop_assert!(options_finite(&state), "non-finite optional output: {json}");
        }
    }
}

// ---------------------------------------------------------------------------
// Named cases found by the properties above
// ---------------------------------------------------------------------------

/// A fresh water at 25 °C with calcium only (the ionic strength from the
/// speciation), solved from (TA, DIC) or (pH, DIC).
fn calcium_water(calcium_mol_kg: f64) -> Water {
    let comp = Composition::default()
        .with_calcium(Amount::PerKg(calcium_mol_kg))
        .unwrap();
    Water::fresh(Conditions::new(25.0, 0.0).unwrap())
        .unwrap()
        .with_composition(comp)
}

fn assert_same(base: &State, back: travertine::Result<State>, what: &str) {
    match back {
        Ok(s) => assert!(
            mismatch(base, &s).is_none(),
            "{what}: {}",
            mismatch(base, &s).unwrap()
        ),
        Err(e) => panic!(
            "{what}: the water exists (pH {:.4}) but the solve says: {e}",
            base.ph_nbs
        ),
    }
}

/// An ordinary hard water (Ca 2 mmol/kg, pH 8.0, DIC 3000 µmol/kg): its own
/// DIC and free HCO3- must give it back. The lower-pH root is this water;
/// the other is near pH 8.6.
#[test]
fn dic_and_bicarbonate_with_calcium_solve_back() {
    let w = calcium_water(2e-3);
    let base = w
        .solve(
            Measured::ph(8.0, None).unwrap(),
            Measured::dic_umol_kg(3000.0).unwrap(),
        )
        .unwrap();
    let opts = SolveOptions::default().with_root(RootChoice::LowerPh);
    let back = w.solve_with(
        Measured::dic_umol_kg(base.dic_umol_kg).unwrap(),
        Measured::hco3_umol_kg(base.hco3_umol_kg).unwrap(),
        &opts,
    );
    assert_same(&base, back, "DIC + HCO3 with Ca 2 mmol/kg");
}

/// Ca 1 mmol/kg, TA 3000 and DIC 2000 µmol/kg (pH 9.95): its own TA and free
/// CO3-- must give it back.
#[test]
fn alkalinity_and_carbonate_with_calcium_solve_back() {
    let w = calcium_water(1e-3);
    let base = w
        .solve(
            Measured::alkalinity_umol_kg(3000.0).unwrap(),
            Measured::dic_umol_kg(2000.0).unwrap(),
        )
        .unwrap();
    let back = w.solve(
        Measured::alkalinity_umol_kg(base.alkalinity_umol_kg).unwrap(),
        Measured::co3_umol_kg(base.co3_umol_kg).unwrap(),
    );
    assert_same(&base, back, "TA + CO3 with Ca 1 mmol/kg");
}

/// Ca 1 mmol/kg, TA 4000 and DIC 2400 µmol/kg (pH 10.22): its own DIC and
/// free CO3-- must give it back (one root only).
#[test]
fn dic_and_carbonate_with_calcium_solve_back() {
    let w = calcium_water(1e-3);
    let base = w
        .solve(
            Measured::alkalinity_umol_kg(4000.0).unwrap(),
            Measured::dic_umol_kg(2400.0).unwrap(),
        )
        .unwrap();
    let back = w.solve(
        Measured::dic_umol_kg(base.dic_umol_kg).unwrap(),
        Measured::co3_umol_kg(base.co3_umol_kg).unwrap(),
    );
    assert_same(&base, back, "DIC + CO3 with Ca 1 mmol/kg");
}

/// Sodium chloride 0.01 mol/kg and no calcium, TA 20 and DIC 12 µmol/kg
/// (pH 8.83): its own TA and CO3-- must give it back, as they do when the
/// same ionic strength is given directly.
#[test]
fn alkalinity_and_carbonate_with_major_ions_solve_back() {
    let comp = Composition::default()
        .with_sodium(Amount::PerKg(0.01))
        .and_then(|c| c.with_chloride(Amount::PerKg(0.01)))
        .unwrap();
    let by_ions = Water::fresh(Conditions::new(25.0, 0.0).unwrap())
        .unwrap()
        .with_composition(comp);
    let (ta, dic) = (
        Measured::alkalinity_umol_kg(20.0).unwrap(),
        Measured::dic_umol_kg(12.0).unwrap(),
    );
    let base = by_ions.solve(ta, dic).unwrap();
    assert_eq!(
        base.ionic_strength_from,
        Some(IonicStrengthRoute::MajorIons)
    );
    let co3 = Measured::co3_umol_kg(base.co3_umol_kg).unwrap();
    let opts = SolveOptions::default().with_root(RootChoice::LowerPh);
    // The same water with its ionic strength given: solves back.
    let given = Water::fresh(Conditions::new(25.0, 0.0).unwrap())
        .unwrap()
        .with_ionic_strength(base.ionic_strength)
        .unwrap();
    let base_given = given.solve(ta, dic).unwrap();
    assert!((base_given.ph_nbs - base.ph_nbs).abs() < 1e-9);
    assert_same(
        &base_given,
        given.solve_with(
            ta,
            Measured::co3_umol_kg(base_given.co3_umol_kg).unwrap(),
            &opts,
        ),
        "TA + CO3 with I given",
    );
    assert_same(
        &base,
        by_ions.solve_with(ta, co3, &opts),
        "TA + CO3 with NaCl 0.01 mol/kg",
    );
}

/// A water whose two (DIC, HCO3) roots are almost equally far from pH 8
/// (7.329 and 8.684, with calcium pairs): the default root choice must still
/// give one of them, the one nearer pH 8 once both are solved.
fn near_tie() -> (Water, State) {
    let comp = Composition::default()
        .with_calcium(Amount::PerKg(0.001_485_832_085_949_184_7))
        .unwrap();
    let w = Water::fresh(Conditions::new(36.148_406_000_113_43, 0.0).unwrap())
        .unwrap()
        .with_ionic_strength(0.011_103_595_310_382_453)
        .unwrap()
        .with_composition(comp);
    let ta = 1_750.825_313_496_791_3;
    let base = w
        .solve(
            Measured::alkalinity_umol_kg(ta).unwrap(),
            Measured::dic_umol_kg(ta * 1.079_085_760_223_640_8).unwrap(),
        )
        .unwrap();
    (w, base)
}

#[test]
fn natural_root_of_dic_and_bicarbonate_converges() {
    let (w, base) = near_tie();
    let (d, h) = (
        Measured::dic_umol_kg(base.dic_umol_kg).unwrap(),
        Measured::hco3_umol_kg(base.hco3_umol_kg).unwrap(),
    );
    let lower = w
        .solve_with(
            d,
            h,
            &SolveOptions::default().with_root(RootChoice::LowerPh),
        )
        .unwrap();
    let higher = w
        .solve_with(
            d,
            h,
            &SolveOptions::default().with_root(RootChoice::HigherPh),
        )
        .unwrap();
    let nearer = if (lower.ph_nbs - 8.0).abs() < (higher.ph_nbs - 8.0).abs() {
        &lower
    } else {
        &higher
    };
    match w.solve(d, h) {
        Ok(natural) => assert!(mismatch(nearer, &natural).is_none()),
        Err(e) => panic!(
            "roots at pH {:.4} and {:.4}, but the default choice fails: {e}",
            lower.ph_nbs, higher.ph_nbs
        ),
    }
}

/// The warning of a two-root pair names the pH of the other root; asking
/// for that root must give that pH (to the 4 decimals the warning prints).
#[test]
fn other_root_warning_names_the_other_root() {
    let (w, base) = near_tie();
    let (d, h) = (
        Measured::dic_umol_kg(base.dic_umol_kg).unwrap(),
        Measured::hco3_umol_kg(base.hco3_umol_kg).unwrap(),
    );
    let lower = w
        .solve_with(
            d,
            h,
            &SolveOptions::default().with_root(RootChoice::LowerPh),
        )
        .unwrap();
    let higher = w
        .solve_with(
            d,
            h,
            &SolveOptions::default().with_root(RootChoice::HigherPh),
        )
        .unwrap();
    let named = |s: &State| {
        s.warnings
            .iter()
            .find_map(|w| match w {
                travertine::Warning::OtherRoot { ph, .. } => Some(*ph),
                _ => None,
            })
            .expect("a two-root pair warns of the other root")
    };
    for (chosen, other) in [(&lower, &higher), (&higher, &lower)] {
        let said = named(chosen);
        assert!(
            (said - other.ph_nbs).abs() < 5e-5,
            "the warning at pH {:.4} names the other root at pH {said:.4}, but that root is at {:.4}",
            chosen.ph_nbs,
            other.ph_nbs
        );
    }
}

/// Waters whose root lies between the last pH sample of the scan that
/// leaves carbon alkalinity and the first that leaves none (tiny DIC, high
/// pH) are found, not refused.
#[test]
fn roots_beside_the_edge_of_the_scan_are_found() {
    let w = Water::fresh(Conditions::new(25.0, 0.1).unwrap()).unwrap();
    for (ph, dic) in [(11.0, 1.0), (10.0, 0.1), (11.5, 5.0), (7.0, 0.01)] {
        let base = w
            .solve(
                Measured::ph(ph, None).unwrap(),
                Measured::dic_umol_kg(dic).unwrap(),
            )
            .unwrap();
        let back = w
            .solve(
                Measured::alkalinity_umol_kg(base.alkalinity_umol_kg).unwrap(),
                Measured::dic_umol_kg(dic).unwrap(),
            )
            .unwrap_or_else(|e| panic!("pH {ph}, DIC {dic}: {e}"));
        assert!((back.ph_nbs - ph).abs() < 1e-9, "pH {ph}: {}", back.ph_nbs);
    }
}
