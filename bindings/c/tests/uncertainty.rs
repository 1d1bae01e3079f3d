//! The standard uncertainties through the C surface, called from Rust
//! through the rlib: every `<key>_u` and the budget against `travertine
//! solve --json --uncertainty ... --budget` in sea water and in a fresh
//! pond, `--no-constant-uncertainty`, a repeated name, the codes of bad
//! settings and of a parameter not measured, NaN without uncertainties,
//! NULL pointers, and no panic on odd text.

mod common;

use std::ptr::{null, null_mut};

use common::surface::{c, given, Sample, State};
use common::{agree, cli_json_with, Given};
use travertine::output::Output;
use travertine_c::*;

/// Fennel pond of the invented Larkvane farm on a summer afternoon: fresh,
/// pH on the NBS scale, alkalinity in mg/L as CaCO3, calcium, ammonia and
/// wind (every number invented).
fn fennel() -> Given {
    given(
        &[
            ("temperature_c", 23.4),
            ("specific_conductance_us_cm", 385.0),
            ("ph_nbs", 8.32),
            ("alkalinity_mg_l_caco3", 104.0),
            ("calcium_hardness_mg_l_caco3", 88.0),
            ("ammonia_mg_l_n", 0.21),
            ("wind_m_s", 2.7),
        ],
        &[("water", "fresh")],
    )
}

/// The Tarnholm sea-water intake of the invented farm: pH on the total
/// scale, alkalinity in µmol/kg, phosphate and silicate (invented).
fn tarnholm() -> Given {
    given(
        &[
            ("temperature_c", 12.8),
            ("salinity", 34.1),
            ("ph_total", 8.02),
            ("alkalinity_umol_kg", 2262.0),
            ("phosphate_umol_kg", 0.9),
            ("silicate_umol_kg", 6.0),
        ],
        &[("water", "saline")],
    )
}

/// The flags of `settings` for the program.
fn flags<'a>(settings: &[&'a str]) -> Vec<&'a str> {
    settings.iter().flat_map(|s| ["--uncertainty", s]).collect()
}

/// A sample through C with `settings` (and `--no-constant-uncertainty`
/// where `no_constants`), solved.
fn solved(g: &Given, settings: &[&str], no_constants: bool) -> State {
    let s = Sample::given(g);
    for t in settings {
        assert_eq!(s.uncertainty(t), TRV_OK, "{t}");
    }
    if no_constants {
        assert_eq!(s.no_constant_uncertainty(), TRV_OK);
    }
    s.solve().unwrap_or_else(|e| panic!("{e:?}"))
}

/// Every output's `_u` of the C state against the program's JSON: equal to
/// 1e-12 relative where the program has a number, NaN where it has null or
/// no `_u` (a name). Returns how many numbers were compared and how many
/// of them were above zero.
fn compare_u(name: &str, st: &State, json: &serde_json::Value) -> (usize, usize) {
    let (mut numbers, mut above) = (0, 0);
    for o in Output::ALL {
        let key = format!("{}_u", o.key());
        let got = st.u(o.key());
        match json[key.as_str()].as_f64() {
            Some(v) => {
                assert!(agree(got, v), "{name}: {key}: C {got}, CLI {v}");
                numbers += 1;
                if v > 0.0 {
                    above += 1;
                }
            }
            None => assert!(got.is_nan(), "{name}: {key}: C {got}, CLI {}", json[&key]),
        }
    }
    (numbers, above)
}

/// `ph=0.01` and `alkalinity=2umol/kg`, with the constants' defaults: every
/// `_u` of `solve --json`, the sources in the program's order, and every
/// share of the program's `budget`, in sea water and in a fresh pond.
#[test]
fn every_u_and_the_budget_agree_with_the_command_line_in_both_media() {
    let settings = ["ph=0.01", "alkalinity=2umol/kg"];
    for (name, g) in [("tarnholm", tarnholm()), ("fennel", fennel())] {
        let mut extra = flags(&settings);
        extra.push("--budget");
        let json = cli_json_with(&g, &extra).unwrap_or_else(|e| panic!("{name}: {e}"));
        let st = solved(&g, &settings, false);
        // The values are those of a solve without uncertainties.
        assert!(agree(
            st.get("pco2_uatm"),
            json["pco2_uatm"].as_f64().expect("pCO2")
        ));
        let (numbers, above) = compare_u(name, &st, &json);
        assert!(numbers > 40, "{name}: only {numbers} numbers");
        assert!(above > 30, "{name}: only {above} above zero");

        let cli_sources = cli_sources(&json);
        let sources = st.sources();
        assert_eq!(sources, cli_sources, "{name}");
        assert!(sources.contains(&"ph".to_string()), "{sources:?}");
        assert!(sources.contains(&"pk1".to_string()), "{sources:?}");

        let budget = json["budget"].as_object().expect("a budget");
        let mut shares = 0;
        for o in Output::ALL {
            match budget.get(o.key()) {
                Some(b) => {
                    let b = b.as_object().expect("shares");
                    assert_eq!(b.len(), sources.len(), "{name}: {}", o.key());
                    for (source, v) in b {
                        let v = v.as_f64().expect("a share");
                        let got = st.share(o.key(), source);
                        assert!(
                            agree(got, v),
                            "{name}: {} {source}: C {got}, CLI {v}",
                            o.key()
                        );
                        shares += 1;
                    }
                }
                // Not in the program's budget: no variance, no value, or
                // a name.
                None => assert!(
                    st.share(o.key(), "ph").is_nan(),
                    "{name}: {} has no budget in the program",
                    o.key()
                ),
            }
        }
        assert!(shares > 100, "{name}: only {shares} shares");
        // The pH measured: its own uncertainty is the one given, all of it
        // from the pH (sea water: ph_total; the pond: ph_nbs).
        let ph_key = if name == "tarnholm" {
            "ph_total"
        } else {
            "ph_nbs"
        };
        assert!((st.u(ph_key) - 0.01).abs() < 1e-9, "{}", st.u(ph_key));
        assert!((st.share(ph_key, "ph") - 1.0).abs() < 1e-9);
        // Any name of the source, and a source with no uncertainty.
        assert_eq!(st.share("pco2_uatm", "ph"), st.share("pco2_uatm", "PH"));
        let alkalinity = st.share("pco2_uatm", "alkalinity");
        assert!(alkalinity > 0.0 && alkalinity < 1.0, "{alkalinity}");
        // Any column name with its unit names it too.
        assert_eq!(st.share("pco2_uatm", "alkalinity_mg_l_caco3"), alkalinity);
        assert_eq!(st.share("pco2_uatm", "ph_nbs"), st.share("pco2_uatm", "ph"));
        assert_eq!(st.share("pco2_uatm", "alkalinity_umol_kg"), alkalinity);
        assert_eq!(st.share("pco2_uatm", "wind"), 0.0);
        // Not a source name, not an output key.
        assert!(st.share("pco2_uatm", "colour").is_nan());
        assert!(st.share("no_such_key", "ph").is_nan());
    }
}

/// `--no-constant-uncertainty`: with a setting, the program's numbers, and
/// less than with the constants' defaults; alone, every `_u` is 0.
#[test]
fn no_constant_uncertainty_matches_the_command_line() {
    for (name, g) in [("tarnholm", tarnholm()), ("fennel", fennel())] {
        let mut extra = flags(&["ph=0.01"]);
        extra.push("--no-constant-uncertainty");
        let json = cli_json_with(&g, &extra).unwrap_or_else(|e| panic!("{name}: {e}"));
        let st = solved(&g, &["ph=0.01"], true);
        let (numbers, above) = compare_u(name, &st, &json);
        assert!(numbers > 40 && above > 20, "{name}: {numbers} {above}");
        assert_eq!(st.sources(), ["ph"], "{name}");
        let with_constants = solved(&g, &["ph=0.01"], false);
        assert!(
            st.u("dic_umol_kg") < with_constants.u("dic_umol_kg"),
            "{name}: the constants add nothing"
        );

        // Alone: every output with a value has u = 0, as the program says.
        let json = cli_json_with(&g, &["--no-constant-uncertainty"]).expect("solves");
        let alone = solved(&g, &[], true);
        let (numbers, above) = compare_u(name, &alone, &json);
        assert!(numbers > 40, "{name}: {numbers}");
        assert_eq!(above, 0, "{name}");
        assert_eq!(alone.u("pco2_uatm"), 0.0);
        assert!(alone.sources().is_empty());
        assert!(alone.share("pco2_uatm", "ph").is_nan());
    }
}

/// The names of the sources in the program's JSON, in its order.
fn cli_sources(json: &serde_json::Value) -> Vec<String> {
    json["uncertainty"]["sources"]
        .as_array()
        .expect("sources")
        .iter()
        .map(|s| s["name"].as_str().expect("a name").to_string())
        .collect()
}

/// Every output's uncertainty equal in two states (NaN in both where
/// there is none).
fn same_u(a: &State, b: &State) {
    for o in Output::ALL {
        let (x, y) = (a.u(o.key()), b.u(o.key()));
        assert!(x == y || (x.is_nan() && y.is_nan()), "{}: {x} {y}", o.key());
    }
}

/// A name given twice keeps the last value, as the program does; a
/// constant set replaces its default.
#[test]
fn a_repeated_name_replaces_the_earlier_value() {
    let g = tarnholm();
    let twice = solved(&g, &["ph=0.5", "alkalinity=2umol/kg", "PH=0.01"], false);
    let once = solved(&g, &["alkalinity=2umol/kg", "ph=0.01"], false);
    same_u(&twice, &once);
    let json =
        cli_json_with(&g, &flags(&["ph=0.5", "alkalinity=2umol/kg", "PH=0.01"])).expect("solves");
    compare_u("twice", &twice, &json);
    // The sources in the program's order: the name given again last.
    let cli_sources = cli_sources(&json);
    assert_eq!(twice.sources(), cli_sources);
    assert_eq!(twice.sources()[..2], ["alkalinity", "ph"]);

    // Named as trv_sample_set names the inputs, a bare number in the
    // name's unit: the same as the flags with the unit in the value.
    let by_column = solved(&g, &["alkalinity_umol_kg=2", "ph_total=0.01"], false);
    same_u(&by_column, &once);

    // pk1 set to 0.1 pK instead of its default moves DIC's uncertainty.
    let pk1 = solved(&g, &["ph=0.01", "pk1=0.1"], false);
    let default = solved(&g, &["ph=0.01"], false);
    assert!(pk1.u("dic_umol_kg") > default.u("dic_umol_kg"));
    let json = cli_json_with(&g, &flags(&["ph=0.01", "pk1=0.1"])).expect("solves");
    compare_u("pk1", &pk1, &json);
}

/// Without any uncertainty asked for: NaN for every key, no sources, no
/// budget; the values are there.
#[test]
fn without_uncertainties_every_u_is_nan() {
    let st = solved(&fennel(), &[], false);
    assert!(st.get("pco2_uatm").is_finite());
    for o in Output::ALL {
        assert!(st.u(o.key()).is_nan(), "{}", o.key());
        assert!(st.share(o.key(), "ph").is_nan(), "{}", o.key());
    }
    assert!(st.sources().is_empty());
    // SAFETY: a live state.
    assert!(unsafe { trv_state_uncertainty_source(st.0, 0) }.is_null());

    // With them: a name, an unknown key and an output without a value are
    // NaN all the same (no calcium in the sea water: no Langelier index).
    let sea = solved(&tarnholm(), &["ph=0.01"], false);
    assert!(sea.u("water").is_nan());
    assert!(sea.u("carbonic_fit").is_nan());
    assert!(sea.u("no_such_key").is_nan());
    assert!(sea.u("pco2_uatm_u").is_nan());
    assert!(sea.u("langelier_index").is_nan());
    assert!(sea.u("pco2_uatm") > 0.0);
    // SAFETY: a live state, an index past the last.
    assert!(unsafe { trv_state_uncertainty_source(sea.0, sea.sources().len()) }.is_null());
    assert!(unsafe { trv_state_uncertainty_source(sea.0, usize::MAX) }.is_null());
}

/// Settings that cannot be read give TRV_ERR_BAD_UNCERTAINTY and leave the
/// sample as it was; one naming a parameter not measured fails the solve
/// with TRV_ERR_UNCERTAINTY_NOT_MEASURED and the program's message.
#[test]
fn bad_settings_give_their_codes() {
    let s = Sample::given(&fennel());
    for bad in [
        "ph",
        "ph 0.01",
        "",
        "colour=1",
        "alkalinty=2umol/kg",
        "ph=abc",
        "ph=-0.01",
        "ph=0.01 furlongs",
        "alkalinity=2 parsecs",
        "temperature=0.1 rankine",
        "pk1=1e400",
    ] {
        assert_eq!(s.uncertainty(bad), TRV_ERR_BAD_UNCERTAINTY, "`{bad}`");
    }
    // Text that is not UTF-8.
    let not_utf8 = [b'p', b'h', b'=', 0xff, 0];
    // SAFETY: a live sample, a NUL-terminated byte string.
    let code = unsafe { trv_sample_uncertainty(s.0, not_utf8.as_ptr().cast()) };
    assert_eq!(code, TRV_ERR_NOT_UTF8);
    // Nothing was stored: no uncertainty asked for.
    let st = s.solve().expect("solves");
    assert!(st.u("pco2_uatm").is_nan());
    drop(st);

    // The program refuses the same text with the same message.
    let json = cli_json_with(&fennel(), &flags(&["ph=-0.01"]));
    assert!(
        json.as_ref()
            .is_err_and(|e| e.contains("out of range") && e.contains("--uncertainty")),
        "{json:?}"
    );

    // DIC is not measured (pH and alkalinity are): the solve fails, as
    // the program does, with its message.
    assert_eq!(s.uncertainty("dic=1umol/kg"), TRV_OK);
    let (code, message) = match s.solve() {
        Err(e) => e,
        Ok(_) => panic!("a DIC uncertainty without a DIC solved"),
    };
    assert_eq!(code, TRV_ERR_UNCERTAINTY_NOT_MEASURED, "{message}");
    assert!(message.contains("not measured"), "{message}");
    let stderr = cli_json_with(&fennel(), &flags(&["dic=1umol/kg"])).expect_err("refused");
    assert!(stderr.contains(&message), "C `{message}`, CLI `{stderr}`");
}

/// Two settings the pair cannot use, one of them given twice: the solve
/// fails naming the setting the program names (the first given), not the
/// one given again.
#[test]
fn a_repeated_unusable_name_fails_as_the_program_says() {
    let settings = ["dic=1umol/kg", "pco2=1uatm", "dic=2umol/kg"];
    let (code, message) = match solved_or_error(&fennel(), &settings) {
        Err(e) => e,
        Ok(_) => panic!("DIC and pCO2 uncertainties without either solved"),
    };
    assert_eq!(code, TRV_ERR_UNCERTAINTY_NOT_MEASURED, "{message}");
    let stderr = cli_json_with(&fennel(), &flags(&settings)).expect_err("refused");
    assert!(stderr.contains(&message), "C `{message}`, CLI `{stderr}`");
    assert!(message.contains("`dic=1umol/kg`"), "{message}");
}

/// A size read as finite that is not once converted for the pair (1e308
/// mg/L as CaCO3 is more than f64 holds in µmol/L): the setting is taken,
/// and the solve fails with TRV_ERR_BAD_UNCERTAINTY and the program's
/// message, as its doc says.
#[test]
fn a_size_too_large_once_converted_fails_the_solve() {
    let setting = "alkalinity=1e308 mg/L CaCO3";
    let (code, message) = match solved_or_error(&fennel(), &[setting]) {
        Err(e) => e,
        Ok(_) => panic!("an infinite alkalinity uncertainty solved"),
    };
    assert_eq!(code, TRV_ERR_BAD_UNCERTAINTY, "{message}");
    let stderr = cli_json_with(&fennel(), &flags(&[setting])).expect_err("refused");
    assert!(stderr.contains(&message), "C `{message}`, CLI `{stderr}`");
}

/// A sample with `settings`, solved or refused (the code and message).
fn solved_or_error(g: &Given, settings: &[&str]) -> Result<State, (i32, String)> {
    let s = Sample::given(g);
    for t in settings {
        assert_eq!(s.uncertainty(t), TRV_OK, "{t}");
    }
    s.solve()
}

/// The new codes follow the binding's own and change no existing one.
#[test]
fn the_new_codes_are_appended() {
    assert_eq!(TRV_ERR_INTERNAL, 6);
    assert_eq!(TRV_ERR_BAD_UNCERTAINTY, 7);
    assert_eq!(TRV_ERR_UNCERTAINTY_NOT_MEASURED, 8);
    assert_eq!(TRV_ERR_OTHER, 99);
    assert_eq!(TRV_ERR_OUT_OF_RANGE, 100);
}

#[test]
fn null_pointers_give_codes_and_never_crash() {
    let s = Sample::given(&fennel());
    // SAFETY: every pointer is NULL or live; NULL is the point.
    unsafe {
        assert_eq!(
            trv_sample_uncertainty(null_mut(), c("ph=0.01").as_ptr()),
            TRV_ERR_NULL
        );
        assert_eq!(trv_sample_uncertainty(s.0, null()), TRV_ERR_NULL);
        assert_eq!(trv_sample_no_constant_uncertainty(null_mut()), TRV_ERR_NULL);
        assert!(trv_state_uncertainty(null(), c("pco2_uatm").as_ptr()).is_nan());
        assert_eq!(trv_state_uncertainty_source_count(null()), 0);
        assert!(trv_state_uncertainty_source(null(), 0).is_null());
        assert!(trv_state_budget_share(null(), c("pco2_uatm").as_ptr(), c("ph").as_ptr()).is_nan());
    }
    assert_eq!(s.uncertainty("ph=0.01"), TRV_OK);
    let st = s.solve().expect("solves");
    // SAFETY: a live state, NULL strings.
    unsafe {
        assert!(trv_state_uncertainty(st.0, null()).is_nan());
        assert!(trv_state_budget_share(st.0, null(), c("ph").as_ptr()).is_nan());
        assert!(trv_state_budget_share(st.0, c("pco2_uatm").as_ptr(), null()).is_nan());
    }
    assert!(st.u("pco2_uatm") > 0.0);
}

/// Odd text never panics (a panic would come back as TRV_ERR_INTERNAL):
/// each setting is read or refused with a code, and a sample with large
/// but readable uncertainties solves or fails with a library code.
#[test]
fn odd_text_gives_a_code_and_never_panics() {
    let long = format!("ph={}", "9".repeat(5000));
    let many_equals = "=".repeat(1000);
    let odd = [
        "=",
        "==",
        "=0.01",
        "ph==0.01",
        "ph=0.01%%",
        "ph=%",
        "ph=.",
        "ph=0,01",
        "ph=1e-400",
        "ph=nan",
        "ph=inf",
        "ph=0x10",
        "pH\u{2009}=\u{2009}0.01",
        "alkalinity=2µmol/kg",
        "alkalinity=2 µmol/L",
        "temperature=0.1 °F",
        "temperature=-0",
        "\u{1F41F}=1",
        "boron_total=4 umol/kg",
        "pksp_calcite=0.02",
        long.as_str(),
        many_equals.as_str(),
    ];
    for t in odd {
        let s = Sample::given(&tarnholm());
        let code = s.uncertainty(t);
        assert!(
            code == TRV_OK || code == TRV_ERR_BAD_UNCERTAINTY,
            "`{t}`: {code}"
        );
        match s.solve() {
            Ok(st) => {
                let u = st.u("pco2_uatm");
                assert!(u.is_nan() || u >= 0.0, "`{t}`: {u}");
            }
            Err((code, message)) => assert!(
                code != TRV_ERR_INTERNAL && code != TRV_ERR_OTHER,
                "`{t}`: {code} {message}"
            ),
        }
    }
    // Readable but huge: a temperature known to ±30 °C and a pH to ±3.
    let s = Sample::given(&fennel());
    assert_eq!(s.uncertainty("temperature=30"), TRV_OK);
    assert_eq!(s.uncertainty("ph=3"), TRV_OK);
    assert_eq!(s.uncertainty("alkalinity=500%"), TRV_OK);
    match s.solve() {
        Ok(st) => assert!(st.u("pco2_uatm") >= 0.0 || st.u("pco2_uatm").is_nan()),
        Err((code, message)) => assert!(code != TRV_ERR_INTERNAL, "{message}"),
    }
}
