//! The C surface called from Rust through the rlib: null pointers, bad
//! names, bad option values, an unsolvable sample, warnings, NaN for an
//! absent key, and every output key against `travertine solve --json` in
//! both media.

mod common;

use std::ptr::{null, null_mut};

use common::surface::{c, given, text, Sample};
use common::{agree, cli_json, Given};
use travertine::output::Output;
use travertine_c::*;

/// A fresh pond of the invented Larkvane farm (Cedar pond in the
/// afternoon), with ammonia, calcium and wind.
fn cedar() -> Given {
    given(
        &[
            ("temperature_c", 26.1),
            ("specific_conductance_us_cm", 470.0),
            ("ph_nbs", 8.71),
            ("alkalinity_mg_l_caco3", 139.0),
            ("calcium_hardness_mg_l_caco3", 101.0),
            ("ammonia_mg_l_n", 0.33),
            ("wind_m_s", 3.1),
        ],
        &[],
    )
}

/// An invented brackish inlet near the farm, alkalinity and DIC in µmol/kg,
/// phosphate and silicate measured.
fn inlet() -> Given {
    given(
        &[
            ("temperature_c", 11.5),
            ("salinity", 28.4),
            ("pressure_dbar", 5.0),
            ("alkalinity_umol_kg", 2105.0),
            ("dic_umol_kg", 1968.0),
            ("phosphate_umol_kg", 1.2),
            ("silicate_umol_kg", 14.0),
        ],
        &[("water", "saline"), ("carbonic", "millero2006")],
    )
}

/// Every output key of the list (`solve --json`'s keys) agrees with the
/// program to 1e-12 relative, NaN where the program has null, in both
/// media; and so do the warnings.
#[test]
fn every_output_key_agrees_with_the_command_line_in_both_media() {
    for (name, g) in [("cedar", cedar()), ("inlet", inlet())] {
        let json = cli_json(&g).unwrap_or_else(|e| panic!("{name}: {e}"));
        let st = Sample::given(&g)
            .solve()
            .unwrap_or_else(|e| panic!("{name}: {e:?}"));
        let mut numbers = 0;
        for o in Output::ALL {
            let got = st.get(o.key());
            match json[o.key()].as_f64() {
                Some(v) => {
                    assert!(agree(got, v), "{name}: {}: C {got}, CLI {v}", o.key());
                    numbers += 1;
                }
                // null, or a name (`water`, `carbonic_fit`): NaN.
                None => assert!(
                    got.is_nan(),
                    "{name}: {}: C {got}, CLI {}",
                    o.key(),
                    json[o.key()]
                ),
            }
        }
        assert!(numbers > 40, "{name}: only {numbers} numbers");
        let codes: Vec<String> = json["warnings"]
            .as_array()
            .expect("warnings")
            .iter()
            .map(|w| w["code"].as_str().expect("a code").to_string())
            .collect();
        assert_eq!(st.warnings(), codes, "{name}");
    }
}

#[test]
fn null_pointers_give_codes_and_never_crash() {
    let s = Sample::new();
    let name = c("temperature_c");
    // SAFETY: every pointer is NULL or live; NULL is the point.
    unsafe {
        assert_eq!(
            trv_sample_set(null_mut(), name.as_ptr(), 12.0),
            TRV_ERR_NULL
        );
        assert_eq!(trv_sample_set(s.0, null(), 12.0), TRV_ERR_NULL);
        assert_eq!(
            trv_sample_option(null_mut(), c("water").as_ptr(), c("fresh").as_ptr()),
            TRV_ERR_NULL
        );
        assert_eq!(
            trv_sample_option(s.0, null(), c("fresh").as_ptr()),
            TRV_ERR_NULL
        );
        assert_eq!(
            trv_sample_option(s.0, c("water").as_ptr(), null()),
            TRV_ERR_NULL
        );

        // A NULL sample: NULL, and an error that says so.
        let mut error: *mut trv_error = null_mut();
        assert!(trv_solve(null(), &mut error).is_null());
        assert_eq!(trv_error_code(error), TRV_ERR_NULL);
        assert!(text(trv_error_message(error)).is_some_and(|m| m.contains("NULL")));
        trv_error_free(error);
        // Nowhere to put the error: NULL all the same.
        assert!(trv_solve(null(), null_mut()).is_null());

        assert!(trv_state_get(null(), name.as_ptr()).is_nan());
        assert_eq!(trv_state_warning_count(null()), 0);
        assert!(trv_state_warning_code(null(), 0).is_null());
        assert!(trv_error_message(null()).is_null());
        assert_eq!(trv_error_code(null()), TRV_ERR_NULL);
        trv_sample_free(null_mut());
        trv_state_free(null_mut());
        trv_error_free(null_mut());
    }
    // A live state with a NULL key.
    let st = Sample::given(&cedar()).solve().expect("solves");
    // SAFETY: a live state, a NULL key.
    assert!(unsafe { trv_state_get(st.0, null()) }.is_nan());
}

#[test]
fn bad_names_and_values_give_their_codes_and_leave_the_sample_unchanged() {
    let s = Sample::new();
    assert_eq!(s.set("colour_hazen", 5.0), TRV_ERR_UNKNOWN_NAME);
    assert_eq!(s.set("", 5.0), TRV_ERR_UNKNOWN_NAME);
    // An input's name without a unit, or with one that is not the input's.
    assert_eq!(s.set("alkalinity", 120.0), TRV_ERR_NAME_UNIT);
    assert_eq!(s.set("alkalinity_mg_l", 120.0), TRV_ERR_NAME_UNIT);
    assert_eq!(s.set("depth_dbar", 3.0), TRV_ERR_NAME_UNIT);
    // A known name followed by words that are no unit is another column
    // in a sheet, and no input here.
    assert_eq!(s.set("depth_fathoms", 3.0), TRV_ERR_UNKNOWN_NAME);
    // A number for an option, a name for a number.
    assert_eq!(s.set("water", 1.0), TRV_ERR_WRONG_KIND);
    assert_eq!(s.option("temperature_c", "12"), TRV_ERR_WRONG_KIND);
    assert_eq!(s.option("colour", "brown"), TRV_ERR_UNKNOWN_NAME);
    // Bad option values.
    assert_eq!(s.option("water", "brine"), TRV_ERR_UNKNOWN_CHOICE);
    assert_eq!(s.option("ph_scale", "acid"), TRV_ERR_UNKNOWN_CHOICE);
    assert_eq!(s.option("carbonic", "guesswork1999"), TRV_ERR_UNKNOWN_FIT);
    // Not finite.
    assert_eq!(s.set("temperature_c", f64::NAN), TRV_ERR_NOT_FINITE);
    assert_eq!(s.set("temperature_c", f64::INFINITY), TRV_ERR_NOT_FINITE);
    // Text that is not UTF-8.
    let bad = [0xffu8, 0xfe, 0];
    // SAFETY: a live sample, a NUL-terminated byte string.
    let code = unsafe { trv_sample_set(s.0, bad.as_ptr().cast(), 1.0) };
    assert_eq!(code, TRV_ERR_NOT_UTF8);

    // Nothing above was stored: the sample lacks its temperature and pair.
    match s.solve() {
        Err((code, message)) => {
            assert_eq!(code, TRV_ERR_WRONG_COUNT, "{message}");
            assert!(
                message.contains("measured carbonate parameters"),
                "{message}"
            );
        }
        Ok(_) => panic!("an empty sample solved"),
    }
}

/// Unsolvable samples: the code of the library's kind and the message the
/// program prints.
#[test]
fn an_unsolvable_sample_gives_the_code_and_the_message_of_the_program() {
    let cases = [
        // Salinity 70 is outside the accepted range.
        (
            given(
                &[
                    ("temperature_c", 20.0),
                    ("salinity", 70.0),
                    ("alkalinity_umol_kg", 2300.0),
                    ("dic_umol_kg", 2000.0),
                ],
                &[],
            ),
            TRV_ERR_OUT_OF_RANGE,
        ),
        // A saline pH without its scale.
        (
            given(
                &[
                    ("temperature_c", 20.0),
                    ("salinity", 35.0),
                    ("alkalinity_umol_kg", 2300.0),
                    ("ph", 8.0),
                ],
                &[],
            ),
            TRV_ERR_UNSTATED_PH_SCALE,
        ),
        // Three measured parameters.
        (
            given(
                &[
                    ("temperature_c", 20.0),
                    ("salinity", 35.0),
                    ("alkalinity_umol_kg", 2300.0),
                    ("dic_umol_kg", 2000.0),
                    ("ph_total", 8.0),
                ],
                &[],
            ),
            TRV_ERR_WRONG_COUNT,
        ),
        // A sea-water fit for a fresh water.
        (
            given(
                &[
                    ("temperature_c", 20.0),
                    ("alkalinity_mg_l_caco3", 100.0),
                    ("ph_nbs", 7.5),
                ],
                &[("water", "fresh"), ("carbonic", "lueker2000")],
            ),
            TRV_ERR_WRONG_MEDIUM,
        ),
    ];
    for (g, code) in cases {
        let (got, message) = match Sample::given(&g).solve() {
            Err(e) => e,
            Ok(_) => panic!("{g:?} solved"),
        };
        assert_eq!(got, code, "{g:?}: {message}");
        let stderr = cli_json(&g).expect_err("the program refuses it too");
        assert!(stderr.contains(&message), "C `{message}`, CLI `{stderr}`");
    }
}

#[test]
fn warnings_have_their_codes_and_absent_keys_are_nan() {
    // Fresh, no air CO2, no barometric pressure, no wind: three notes.
    let st = Sample::given(&given(
        &[
            ("temperature_c", 18.0),
            ("alkalinity_mg_l_caco3", 80.0),
            ("ph_nbs", 7.4),
        ],
        &[],
    ))
    .solve()
    .expect("solves");
    let codes = st.warnings();
    assert!(codes.contains(&"air_co2_default".to_string()), "{codes:?}");
    assert!(
        codes.contains(&"transfer_velocity_not_given".to_string()),
        "{codes:?}"
    );
    // SAFETY: a live state, indexes past the end.
    unsafe {
        assert!(trv_state_warning_code(st.0, codes.len()).is_null());
        assert!(trv_state_warning_code(st.0, usize::MAX).is_null());
    }
    // Past a fit's range: a warning with its code (10 °C below the lowest
    // temperature of Lueker et al. 2000 is not, 40 °C above it is).
    let hot = Sample::given(&given(
        &[
            ("temperature_c", 39.0),
            ("salinity", 35.0),
            ("alkalinity_umol_kg", 2300.0),
            ("dic_umol_kg", 2000.0),
        ],
        &[],
    ))
    .solve()
    .expect("solves");
    assert!(
        hot.warnings().iter().any(|c| c == "fit_extrapolated"),
        "{:?}",
        hot.warnings()
    );

    // No calcium: no Ω, NaN; a saline water has no Langelier index; a
    // name is no number; an unknown key is NaN.
    assert!(st.get("omega_calcite").is_nan());
    assert!(hot.get("langelier_index").is_nan());
    assert!(st.get("water").is_nan());
    assert!(st.get("no_such_key").is_nan());
    assert!(st.get("ph_nbs").is_finite());
}

/// A pH named with a scale and a `ph_scale` option that names another: the
/// program's inconsistency error; a `ph` with the option: as `ph_total`.
#[test]
fn the_ph_scale_option_reads_as_on_the_command_line() {
    let base = [
        ("temperature_c", 15.0),
        ("salinity", 33.0),
        ("alkalinity_umol_kg", 2250.0),
    ];
    let mut named = base.to_vec();
    named.push(("ph_total", 7.95));
    let mut plain = base.to_vec();
    plain.push(("ph", 7.95));
    let a = Sample::given(&given(&named, &[])).solve().expect("solves");
    let b = Sample::given(&given(&plain, &[("ph_scale", "total")]))
        .solve()
        .expect("solves");
    assert_eq!(a.get("dic_umol_kg"), b.get("dic_umol_kg"));
    let clash = Sample::given(&given(&named, &[("ph_scale", "nbs")])).solve();
    assert!(
        matches!(clash, Err((TRV_ERR_INCONSISTENT, _))),
        "{:?}",
        clash.err()
    );
}
