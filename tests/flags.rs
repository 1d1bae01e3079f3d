//! Quality flags: each fires past its limit and not at it (a `_high` limit
//! with `>`, a `_low` limit with `<`), the built-in limits on invented
//! ponds, profile files laid over the default, the errors of a bad profile
//! (key and line), and the JSON shape of the `flags` array.
//!
//! The limits of the built-in profiles are common practice (see
//! profiles/general.toml); the boundary tests set a limit to the state's
//! own value, so they hold whatever the chemistry gives.

use travertine::decisions::{flags, Flag, Limits, Plausibility, Profile};
use travertine::sample::inputs::{Input, Total};
use travertine::sample::{Composition, Sample};
use travertine::units::Amount;
use travertine::{Conditions, Measured, Parameter, PhScale, State, Water};

/// A state from trade-unit inputs, as `travertine solve` reads them.
fn sample(inputs: &[(Input, &str)]) -> State {
    let mut s = Sample::default();
    for (input, text) in inputs {
        s.set(*input, text).unwrap();
    }
    let (a, b) = s.pair().unwrap();
    s.water().unwrap().solve(a, b).unwrap()
}

const PH: Input = Input::Carbon(Parameter::Ph);
const ALK: Input = Input::Carbon(Parameter::Alkalinity);

/// An invented pond at dawn: 27 °C, pH 6.9, 110 mg/L alkalinity,
/// 320 µS/cm, 2.5 mg/L TAN: about 25 mg/L free CO2.
fn dawn_pond() -> State {
    sample(&[
        (Input::Temperature, "27"),
        (PH, "6.9"),
        (ALK, "110 mg/L CaCO3"),
        (Input::Conductivity, "320 uS/cm@25C"),
        (Input::Total(Total::Ammonia), "2.5 mg/L N"),
    ])
}

/// The same pond in the afternoon: pH 8.8 at 30 °C.
fn afternoon_pond() -> State {
    sample(&[
        (Input::Temperature, "30"),
        (PH, "8.8"),
        (ALK, "110 mg/L CaCO3"),
        (Input::Conductivity, "320 uS/cm@25C"),
        (Input::Total(Total::Ammonia), "2.5 mg/L N"),
    ])
}

fn codes(f: &[Flag]) -> Vec<&'static str> {
    f.iter().map(|f| f.code).collect()
}

/// A profile with every flag off.
fn nothing() -> Profile {
    let mut p = Profile::default();
    p.limits = Limits::default();
    p.plausibility = Plausibility::default();
    p
}

/// The flags of `state` under a profile with every flag off but one limit,
/// set by `set`.
fn only(state: &State, set: impl Fn(&mut Profile)) -> Vec<&'static str> {
    let mut p = nothing();
    set(&mut p);
    codes(&flags(state, &p))
}

/// Just past `v` upwards and downwards, by a relative step far above
/// rounding.
fn up(v: f64) -> f64 {
    v * (1.0 + 1e-9)
}
fn down(v: f64) -> f64 {
    v * (1.0 - 1e-9)
}

#[test]
fn with_every_flag_off_nothing_fires() {
    assert!(flags(&dawn_pond(), &nothing()).is_empty());
    assert!(flags(&afternoon_pond(), &nothing()).is_empty());
}

#[test]
fn free_co2_high_fires_above_its_limit_and_not_at_it() {
    let s = dawn_pond();
    let v = s.free_co2_mg_l;
    let at = |l: f64| only(&s, |p| p.limits.free_co2_high_mg_l = Some(l));
    assert_eq!(at(v), Vec::<&str>::new(), "equal to the limit");
    assert_eq!(at(up(v)), Vec::<&str>::new(), "below the limit");
    assert_eq!(at(down(v)), vec!["free_co2_high"], "above the limit");
    let f = &flags(&s, &Profile::default())[0];
    assert_eq!((f.code, f.value, f.threshold), ("free_co2_high", v, 20.0));
}

#[test]
fn nh3_high_fires_above_its_limit_and_not_at_it() {
    let s = afternoon_pond();
    let v = s.nh3_mg_l_n.unwrap();
    let at = |l: f64| only(&s, |p| p.limits.nh3_high_mg_l_n = Some(l));
    assert!(at(v).is_empty());
    assert!(at(up(v)).is_empty());
    assert_eq!(at(down(v)), vec!["nh3_high"]);
    // Without ammonia it cannot fire, whatever the limit.
    let no_ammonia = sample(&[
        (Input::Temperature, "30"),
        (PH, "8.8"),
        (ALK, "110 mg/L CaCO3"),
    ]);
    assert!(only(&no_ammonia, |p| p.limits.nh3_high_mg_l_n = Some(0.0)).is_empty());
}

#[test]
fn alkalinity_low_fires_below_its_limit_and_not_at_it() {
    let s = dawn_pond();
    let v = s.alkalinity_mg_l_caco3;
    let at = |l: f64| only(&s, |p| p.limits.alkalinity_low_mg_l_caco3 = Some(l));
    assert!(at(v).is_empty());
    assert!(at(down(v)).is_empty());
    assert_eq!(at(up(v)), vec!["alkalinity_low"]);
}

#[test]
fn ph_low_and_ph_high_fire_outside_their_limits_and_not_at_them() {
    let s = dawn_pond();
    let v = s.ph_nbs;
    let low = |l: f64| only(&s, |p| p.limits.ph_low_nbs = Some(l));
    assert!(low(v).is_empty());
    assert!(low(v - 1e-9).is_empty());
    assert_eq!(low(v + 1e-9), vec!["ph_low"]);
    let high = |l: f64| only(&s, |p| p.limits.ph_high_nbs = Some(l));
    assert!(high(v).is_empty());
    assert!(high(v + 1e-9).is_empty());
    assert_eq!(high(v - 1e-9), vec!["ph_high"]);
}

#[test]
fn omega_aragonite_low_fires_below_its_limit_and_not_at_it() {
    let sea = Water::saline(Conditions::new(20.0, 33.0).unwrap()).unwrap();
    let s = sea
        .solve(
            Measured::ph(7.7, Some(PhScale::Total)).unwrap(),
            Measured::alkalinity_umol_kg(2200.0).unwrap(),
        )
        .unwrap();
    let v = s.omega_aragonite.unwrap();
    let at = |l: f64| only(&s, |p| p.limits.omega_aragonite_low = Some(l));
    assert!(at(v).is_empty());
    assert!(at(down(v)).is_empty());
    assert_eq!(at(up(v)), vec!["omega_aragonite_low"]);
    // The shellfish-hatchery profile's 1.5 (Waldbusser et al. 2015): this
    // water of pH 7.7 is below it, a water of pH 8.1 is not.
    let hatchery = Profile::built_in("shellfish-hatchery").unwrap();
    assert!(v < 1.5, "{v}");
    assert!(codes(&flags(&s, &hatchery)).contains(&"omega_aragonite_low"));
    let good = sea
        .solve(
            Measured::ph(8.1, Some(PhScale::Total)).unwrap(),
            Measured::alkalinity_umol_kg(2200.0).unwrap(),
        )
        .unwrap();
    assert!(good.omega_aragonite.unwrap() > 1.5);
    assert!(flags(&good, &hatchery).is_empty());
    // The default profile does not judge aragonite.
    assert!(flags(&s, &Profile::default()).is_empty());
}

/// An invented brown-water lake: pH 6.3, alkalinity 250 µmol/kg (12.5 mg/L
/// as CaCO3), 15 °C.
fn brown_lake() -> Vec<(Input, &'static str)> {
    vec![
        (Input::Temperature, "15"),
        (PH, "6.3"),
        (ALK, "250 umol/kg"),
    ]
}

#[test]
fn organic_acid_bias_fires_for_acidic_poorly_buffered_water_from_ph_and_alkalinity() {
    let s = sample(&brown_lake());
    assert_eq!(
        codes(&flags(&s, &Profile::default())),
        vec!["alkalinity_low", "ph_low", "organic_acid_bias"]
    );
    let f = flags(&s, &Profile::default()).pop().unwrap();
    assert_eq!((f.value, f.threshold), (s.alkalinity_umol_kg, 1000.0));
    // Each of its two limits is passed strictly.
    let both = |ph: f64, alk: f64| {
        only(&s, |p| {
            p.plausibility.organic_acid_ph_below_nbs = Some(ph);
            p.plausibility.organic_acid_alkalinity_below_umol_kg = Some(alk);
        })
    };
    let (ph, alk) = (s.ph_nbs, s.alkalinity_umol_kg);
    assert_eq!(both(ph + 1e-9, up(alk)), vec!["organic_acid_bias"]);
    assert!(both(ph, up(alk)).is_empty(), "pH equal to its limit");
    assert!(
        both(ph + 1e-9, alk).is_empty(),
        "alkalinity equal to its limit"
    );
    // The same water from DIC and alkalinity: no pH-alkalinity pCO2, no flag.
    let from_dic = Water::fresh(Conditions::new(15.0, 0.0).unwrap())
        .unwrap()
        .solve(
            Measured::dic_umol_kg(s.dic_umol_kg).unwrap(),
            Measured::alkalinity_umol_kg(s.alkalinity_umol_kg).unwrap(),
        )
        .unwrap();
    assert!(!codes(&flags(&from_dic, &Profile::default())).contains(&"organic_acid_bias"));
    // Moved to other conditions, the state keeps its measured pair.
    let warm = s.at(Conditions::new(25.0, 0.0).unwrap()).unwrap();
    assert!(codes(&flags(&warm, &Profile::default())).contains(&"organic_acid_bias"));
}

#[test]
fn an_alkalinity_the_conductance_cannot_carry_is_implausible() {
    // 2900 mg/L as CaCO3 beside 150 µS/cm: a unit slip (from the issue).
    let slip = sample(&[
        (Input::Temperature, "20"),
        (PH, "7.8"),
        (ALK, "2900 mg/L CaCO3"),
        (Input::Conductivity, "150 uS/cm@25C"),
    ]);
    let raised = flags(&slip, &Profile::default());
    let f = raised
        .iter()
        .find(|f| f.code == "implausible_sample")
        .expect("implausible_sample");
    // At most 150/30 = 5 meq/L, 250.2 mg/L as CaCO3 (50.04 g/eq).
    assert!(
        (f.threshold - 150.0 / 30.0 * 50.04345).abs() < 1e-6,
        "{}",
        f.threshold
    );
    assert!((f.value - 2900.0).abs() < 1.0, "{}", f.value);
    assert!(f.message.contains("150 µS/cm"), "{}", f.message);
    // The same reading with a plausible alkalinity raises nothing.
    let fine = sample(&[
        (Input::Temperature, "20"),
        (PH, "7.8"),
        (ALK, "60 mg/L CaCO3"),
        (Input::Conductivity, "150 uS/cm@25C"),
    ]);
    assert!(!codes(&flags(&fine, &Profile::default())).contains(&"implausible_sample"));
    // At the bound and just under it: not implausible; just over it: implausible.
    let spc = 150.0;
    let alk = fine.alkalinity_mg_l_caco3;
    let per_meq_at_bound = spc * 50.04345 / alk;
    let at = |per: f64| {
        only(&fine, |p| {
            p.plausibility
                .conductance_per_alkalinity_min_us_cm_per_meq_l = Some(per)
        })
    };
    assert!(at(down(per_meq_at_bound)).is_empty());
    assert_eq!(at(up(per_meq_at_bound)), vec!["implausible_sample"]);
}

#[test]
fn a_pco2_above_its_limit_is_implausible() {
    // pH 5.0 with 500 µmol/kg of alkalinity: over 0.3 atm of CO2.
    let s = sample(&[
        (Input::Temperature, "20"),
        (PH, "5.0"),
        (ALK, "500 umol/kg"),
    ]);
    assert!(s.pco2_uatm > 100_000.0, "{}", s.pco2_uatm);
    let raised = flags(&s, &Profile::default());
    assert!(raised
        .iter()
        .any(|f| f.code == "implausible_sample" && f.threshold == 100_000.0));
    let v = s.pco2_uatm;
    let at = |l: f64| only(&s, |p| p.plausibility.pco2_high_uatm = Some(l));
    assert!(at(v).is_empty());
    assert!(at(up(v)).is_empty());
    assert_eq!(at(down(v)), vec!["implausible_sample"]);
}

#[test]
fn the_issue_s_dawn_pond_figures_under_the_built_in_profiles() {
    // 16 mg/L of free CO2 at dawn: within the general 20 mg/L, above the
    // cold-water 10 mg/L (common practice, profiles/*.toml).
    let s = sample(&[
        (Input::Temperature, "26"),
        (PH, "7.08"),
        (ALK, "105 mg/L CaCO3"),
    ]);
    assert!((s.free_co2_mg_l - 16.0).abs() < 1.0, "{}", s.free_co2_mg_l);
    assert!(flags(&s, &Profile::default()).is_empty());
    let trout = Profile::built_in("cold-water-fish").unwrap();
    assert_eq!(codes(&flags(&s, &trout)), vec!["free_co2_high"]);
    // 28 mg/L of alkalinity: above the 20 mg/L limit; 15 mg/L is below it.
    let buffered = sample(&[
        (Input::Temperature, "26"),
        (PH, "7.5"),
        (ALK, "28 mg/L CaCO3"),
    ]);
    assert!(flags(&buffered, &Profile::default()).is_empty());
    let soft = sample(&[
        (Input::Temperature, "26"),
        (PH, "7.5"),
        (ALK, "15 mg/L CaCO3"),
    ]);
    assert_eq!(
        codes(&flags(&soft, &Profile::default())),
        vec!["alkalinity_low"]
    );
    // The invented pond of the README: CO2 at dawn, ammonia in the afternoon.
    assert_eq!(
        codes(&flags(&dawn_pond(), &Profile::default())),
        vec!["free_co2_high"]
    );
    assert_eq!(
        codes(&flags(&afternoon_pond(), &Profile::default())),
        vec!["nh3_high"]
    );
}

#[test]
fn a_profile_file_overrides_the_default_and_keeps_the_rest() {
    let s = sample(&[
        (Input::Temperature, "26"),
        (PH, "7.08"),
        (ALK, "105 mg/L CaCO3"),
    ]);
    let text = "description = \"our nursery ponds\"\n\n[limits]\nfree_co2_high_mg_l = 15\n";
    let p = Profile::from_toml(text, "nursery.toml").unwrap();
    assert_eq!(p.name(), "nursery.toml");
    assert_eq!(p.description(), "our nursery ponds");
    assert_eq!(p.limits.free_co2_high_mg_l, Some(15.0));
    // The rest from `general`.
    let g = Profile::default();
    assert_eq!(p.limits.nh3_high_mg_l_n, g.limits.nh3_high_mg_l_n);
    assert_eq!(p.plausibility, g.plausibility);
    let raised = flags(&s, &p);
    assert_eq!(codes(&raised), vec!["free_co2_high"]);
    assert_eq!(raised[0].threshold, 15.0);
    assert!(
        raised[0].message.contains("profile nursery.toml"),
        "{}",
        raised[0].message
    );
    assert!(flags(&s, &g).is_empty());
    // Based on another built-in; a flag switched off.
    let text =
        "based_on = \"shellfish-hatchery\"\noff = [\"alkalinity_low\", \"implausible_sample\"]\n";
    let p = Profile::from_toml(text, "oysters.toml").unwrap();
    assert_eq!(p.limits.omega_aragonite_low, Some(1.5));
    assert_eq!(p.limits.alkalinity_low_mg_l_caco3, None);
    assert_eq!(p.plausibility.pco2_high_uatm, None);
    assert_eq!(
        p.plausibility
            .conductance_per_alkalinity_min_us_cm_per_meq_l,
        None
    );
    // Read from a file, too.
    let dir = std::env::temp_dir().join(format!("travertine-flags-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let path = dir.join("nursery.toml");
    std::fs::write(&path, "[limits]\nfree_co2_high_mg_l = 15.0\n").unwrap();
    let p = Profile::from_arg(path.to_str().unwrap()).unwrap();
    assert_eq!(p.limits.free_co2_high_mg_l, Some(15.0));
    std::fs::remove_dir_all(&dir).unwrap();
}

/// The message of the error of a profile text.
fn bad(text: &str) -> String {
    Profile::from_toml(text, "bad.toml")
        .unwrap_err()
        .to_string()
}

#[test]
fn a_bad_profile_names_the_key_and_the_line() {
    let cases: &[(&str, &str, &str, &str)] = &[
        // (text, line, key, part of the problem)
        (
            "description = \"x\"\n\n[limits]\nfree_co2_high = 12\n",
            "line 4",
            "limits.free_co2_high",
            "unknown field",
        ),
        (
            "[limits]\nph_low_nbs = 6.5\nnh3_high_mg_l_n = \"low\"\n",
            "line 3",
            "limits.nh3_high_mg_l_n",
            "invalid type",
        ),
        (
            "[plausibility]\n\npco2_high_uatm = -5\n",
            "line 3",
            "plausibility.pco2_high_uatm",
            "outside the accepted range 0 to 10000000 µatm",
        ),
        (
            "[limits]\nph_low_nbs = 9.5\n",
            "line 2",
            "limits.ph_low_nbs",
            "not below ph_high_nbs 9",
        ),
        (
            "based_on = \"trout\"\n",
            "line 1",
            "based_on",
            "general, cold-water-fish, shellfish-hatchery",
        ),
        (
            "off = [\"ph_low\", \"too_warm\"]\n",
            "line 1",
            "off",
            "`too_warm` is not a flag",
        ),
        (
            "[limitz]\nph_low_nbs = 6\n",
            "line 1",
            "limitz",
            "unknown field",
        ),
        (
            "[limits]\nfree_co2_high_mg_l = \n",
            "line 2",
            "limits.free_co2_high_mg_l",
            "",
        ),
    ];
    for (text, line, key, problem) in cases {
        let m = bad(text);
        assert!(m.starts_with("profile bad.toml"), "{m}");
        assert!(m.contains(&format!("{line}, key `{key}`")), "{text:?}: {m}");
        assert!(m.contains(problem), "{text:?}: {m}");
    }
    // A file that is not there names itself and the built-in names.
    let m = Profile::from_arg("no-such-profile.toml")
        .unwrap_err()
        .to_string();
    assert!(
        m.contains("no-such-profile.toml") && m.contains("cold-water-fish"),
        "{m}"
    );
}

#[test]
fn the_json_flags_array_has_code_message_value_and_threshold() {
    let s = afternoon_pond();
    let v = serde_json::to_value(&s).unwrap();
    let keys: Vec<&String> = v.as_object().unwrap().keys().collect();
    // `flags` follows `warnings`, and the profile's name closes the object.
    let n = keys.len();
    let last: Vec<&str> = keys[n - 3..].iter().map(|k| k.as_str()).collect();
    assert_eq!(last, ["warnings", "flags", "flags_profile"]);
    assert_eq!(v["flags_profile"], "general");
    let array = v["flags"].as_array().unwrap();
    assert_eq!(array.len(), 1);
    let f = array[0].as_object().unwrap();
    let names: Vec<&String> = f.keys().collect();
    assert_eq!(names, ["code", "message", "value", "threshold"]);
    assert_eq!(f["code"], "nh3_high");
    assert!(f["message"].as_str().unwrap().contains("mg/L as N"));
    assert_eq!(f["value"].as_f64(), s.nh3_mg_l_n);
    assert_eq!(f["threshold"].as_f64(), Some(0.05));
    // A profile given: the Judged view.
    let trout = Profile::built_in("cold-water-fish").unwrap();
    let v = serde_json::to_value(travertine::output::Judged::new(&dawn_pond(), &trout)).unwrap();
    assert_eq!(v["flags"][0]["threshold"], 10.0);
    assert_eq!(v["flags_profile"], "cold-water-fish");
}

#[test]
fn sea_water_with_ammonia_is_judged_too() {
    let sea = Water::saline(Conditions::new(28.0, 35.0).unwrap())
        .unwrap()
        .with_composition(
            Composition::default()
                .with_ammonia(Amount::PerKg(100e-6))
                .unwrap(),
        )
        .solve(
            Measured::ph(8.2, Some(PhScale::Total)).unwrap(),
            Measured::alkalinity_umol_kg(2300.0).unwrap(),
        )
        .unwrap();
    // 100 µmol/kg of TAN (1.4 mg/L as N) at pH 8.2: about 0.1 mg/L NH3-N.
    assert!(sea.nh3_mg_l_n.unwrap() > 0.05);
    assert_eq!(codes(&flags(&sea, &Profile::default())), vec!["nh3_high"]);
}

#[test]
fn the_codes_alone_are_the_codes_of_the_flags() {
    let states = [
        dawn_pond(),
        afternoon_pond(),
        sample(&brown_lake()),
        sample(&[
            (Input::Temperature, "20"),
            (PH, "5.0"),
            (ALK, "500 umol/kg"),
        ]),
    ];
    for name in Profile::BUILT_IN_NAMES {
        let p = Profile::built_in(name).unwrap();
        for s in &states {
            let mut c = Vec::new();
            travertine::decisions::codes_into(s, &p, &mut c);
            assert_eq!(c, codes(&flags(s, &p)), "{name}");
        }
    }
}
