//! # travertine for C
//!
//! A small, stable C ABI over the travertine library: a sample is filled
//! input by input under the names of the one list of inputs (the sheet's
//! canonical column names, `alkalinity_mg_l_caco3`, `ph_nbs`,
//! `temperature_c`, ...), solved as `travertine solve` solves it, and its
//! state read output by output under the keys of `travertine solve --json`
//! (the one list of outputs). New inputs and outputs of the library need no
//! new C function.
//!
//! The header `travertine.h` beside this crate is generated from this file
//! by cbindgen; `tests/header.rs` fails when the committed header is not
//! what cbindgen makes of it (`TRV_WRITE_HEADER=1` rewrites it).
//!
//! # The rules at the boundary
//! - **No panic crosses it.** Every function runs its body inside
//!   [`std::panic::catch_unwind`]; a panic (a bug) becomes
//!   [`TRV_ERR_INTERNAL`], a null result or NaN.
//! - **Null pointers are errors, never crashes**: a function given one
//!   returns [`TRV_ERR_NULL`] (or NULL, NaN, 0), and the frees accept one.
//! - **Ownership.** Each `*_new` or [`trv_solve`] result is owned by the
//!   caller and freed with its own `*_free`, once. A string a function
//!   returns is owned by the object it came from and is valid until that
//!   object is freed; the caller never frees it.
//! - **Threads.** An object may move between threads; one object must not
//!   be used from two threads at once. Distinct objects are independent.

#![deny(missing_docs)]
#![deny(unsafe_op_in_unsafe_fn)]
// The C names of the opaque types (`trv_sample`) are the Rust names too.
#![allow(non_camel_case_types)]

use std::ffi::{c_char, c_double, c_int, CStr, CString};
use std::panic::{catch_unwind, AssertUnwindSafe};

use travertine::error::ErrorKind;
use travertine::output::{Output, Value};
use travertine::sample::inputs::{NamedInput, UnreadName};
use travertine::sample::Sample;
use travertine::{SolveOptions, State};

/// Success.
pub const TRV_OK: c_int = 0;
/// A pointer argument was NULL.
pub const TRV_ERR_NULL: c_int = 1;
/// A string argument was not UTF-8.
pub const TRV_ERR_NOT_UTF8: c_int = 2;
/// A name names no input (trv_sample_set) or no option (trv_sample_option).
pub const TRV_ERR_UNKNOWN_NAME: c_int = 3;
/// A name names an input, but its unit is missing or not one of the
/// input's (`alkalinity` alone, `alkalinity_mg_l`): give the unit in the
/// name, as `alkalinity_mg_l_caco3` or `alkalinity_umol_kg`.
pub const TRV_ERR_NAME_UNIT: c_int = 4;
/// A number was given for an input that takes a name (`water`, a fit:
/// use trv_sample_option), or a name for one that takes a number (use
/// trv_sample_set).
pub const TRV_ERR_WRONG_KIND: c_int = 5;
/// A bug in travertine, caught at the boundary (a panic): please report it.
pub const TRV_ERR_INTERNAL: c_int = 6;
/// An error of the library of a kind newer than this header.
pub const TRV_ERR_OTHER: c_int = 99;
/// A number outside the range accepted for its input.
pub const TRV_ERR_OUT_OF_RANGE: c_int = 100;
/// A number that is NaN or infinite.
pub const TRV_ERR_NOT_FINITE: c_int = 101;
/// Text that is not a number.
pub const TRV_ERR_NOT_A_NUMBER: c_int = 102;
/// A number without the unit it needs.
pub const TRV_ERR_MISSING_UNIT: c_int = 103;
/// A unit the input does not accept.
pub const TRV_ERR_WRONG_UNIT: c_int = 104;
/// Two inputs that cannot be used together (a measured pair that does
/// not determine the state, a depth and a pressure, ...).
pub const TRV_ERR_INCOMPATIBLE_PAIR: c_int = 105;
/// No fits for this water.
pub const TRV_ERR_NO_WATER_FITS: c_int = 106;
/// The solver did not converge.
pub const TRV_ERR_NO_CONVERGENCE: c_int = 107;
/// A fit name that is not known.
pub const TRV_ERR_UNKNOWN_FIT: c_int = 108;
/// A choice made for the other medium (a sea-water fit for fresh water).
pub const TRV_ERR_WRONG_MEDIUM: c_int = 109;
/// An option value that is not one of its choices (`water` = `brine`).
pub const TRV_ERR_UNKNOWN_CHOICE: c_int = 110;
/// A pH in saline water without its scale: set `ph_total`, `ph_nbs`, ...
/// or the option `ph_scale`.
pub const TRV_ERR_UNSTATED_PH_SCALE: c_int = 111;
/// Inputs that contradict each other.
pub const TRV_ERR_INCONSISTENT: c_int = 112;
/// An input that is needed is missing (the temperature).
pub const TRV_ERR_MISSING: c_int = 113;
/// Not exactly two measured carbonate parameters.
pub const TRV_ERR_WRONG_COUNT: c_int = 114;
/// A computation without a valid result for these inputs.
pub const TRV_ERR_COMPUTATION: c_int = 115;
/// A target that cannot be reached.
pub const TRV_ERR_UNREACHABLE: c_int = 116;
/// A target already passed.
pub const TRV_ERR_PAST_TARGET: c_int = 117;
/// A profile of quality limits that cannot be read.
pub const TRV_ERR_BAD_PROFILE: c_int = 118;

/// The stable number of a kind of library error: `TRV_ERR_OUT_OF_RANGE`
/// and on, in the order of `ErrorKind::ALL`; `TRV_ERR_OTHER` for a
/// kind this binding does not know yet.
fn kind_code(kind: ErrorKind) -> c_int {
    match kind {
        ErrorKind::OutOfRange => TRV_ERR_OUT_OF_RANGE,
        ErrorKind::NotFinite => TRV_ERR_NOT_FINITE,
        ErrorKind::NotANumber => TRV_ERR_NOT_A_NUMBER,
        ErrorKind::MissingUnit => TRV_ERR_MISSING_UNIT,
        ErrorKind::WrongUnit => TRV_ERR_WRONG_UNIT,
        ErrorKind::IncompatiblePair => TRV_ERR_INCOMPATIBLE_PAIR,
        ErrorKind::NoWaterFits => TRV_ERR_NO_WATER_FITS,
        ErrorKind::NoConvergence => TRV_ERR_NO_CONVERGENCE,
        ErrorKind::UnknownFit => TRV_ERR_UNKNOWN_FIT,
        ErrorKind::WrongMedium => TRV_ERR_WRONG_MEDIUM,
        ErrorKind::UnknownChoice => TRV_ERR_UNKNOWN_CHOICE,
        ErrorKind::UnstatedPhScale => TRV_ERR_UNSTATED_PH_SCALE,
        ErrorKind::Inconsistent => TRV_ERR_INCONSISTENT,
        ErrorKind::Missing => TRV_ERR_MISSING,
        ErrorKind::WrongCount => TRV_ERR_WRONG_COUNT,
        ErrorKind::Computation => TRV_ERR_COMPUTATION,
        ErrorKind::Unreachable => TRV_ERR_UNREACHABLE,
        ErrorKind::PastTarget => TRV_ERR_PAST_TARGET,
        ErrorKind::BadProfile => TRV_ERR_BAD_PROFILE,
        _ => TRV_ERR_OTHER,
    }
}

/// A sample being described: filled with `trv_sample_set` and
/// `trv_sample_option`, solved with `trv_solve`, freed with
/// `trv_sample_free`.
pub struct trv_sample {
    sample: Sample,
}

/// A solved sample: every output of `travertine solve --json`, read with
/// `trv_state_get`, and its warnings. Freed with `trv_state_free`.
pub struct trv_state {
    state: State,
    /// The warning codes, NUL-terminated, owned here.
    warning_codes: Vec<CString>,
}

/// Why a sample could not be solved: a code and a message that names the
/// input, its value and what is accepted. Freed with `trv_error_free`.
pub struct trv_error {
    code: c_int,
    message: CString,
}

impl trv_error {
    fn new(code: c_int, message: &str) -> trv_error {
        // A message never holds a NUL; if one did, it is cut there.
        let bytes: Vec<u8> = message.bytes().take_while(|b| *b != 0).collect();
        trv_error {
            code,
            message: CString::new(bytes).unwrap_or_default(),
        }
    }
}

/// Runs `body`, turning a panic into `fallback`.
fn guarded<T>(fallback: T, body: impl FnOnce() -> T) -> T {
    catch_unwind(AssertUnwindSafe(body)).unwrap_or(fallback)
}

/// The text of a C string argument.
///
/// # Safety
/// `text` is NULL or points to a NUL-terminated string.
unsafe fn text<'a>(text: *const c_char) -> Result<&'a str, c_int> {
    if text.is_null() {
        return Err(TRV_ERR_NULL);
    }
    // SAFETY: not NULL, and NUL-terminated by the caller's contract.
    unsafe { CStr::from_ptr(text) }
        .to_str()
        .map_err(|_| TRV_ERR_NOT_UTF8)
}

/// The code of a name that finds no input.
fn name_code(e: &UnreadName) -> c_int {
    match e {
        UnreadName::Unit { .. } => TRV_ERR_NAME_UNIT,
        _ => TRV_ERR_UNKNOWN_NAME,
    }
}

/// A new, empty sample, or NULL if it cannot be made.
///
/// Free it with trv_sample_free.
#[no_mangle]
pub extern "C" fn trv_sample_new() -> *mut trv_sample {
    guarded(std::ptr::null_mut(), || {
        Box::into_raw(Box::new(trv_sample {
            sample: Sample::default(),
        }))
    })
}

/// Sets the input `input_name` of the sample to `value`, in the unit the
/// name gives.
///
/// The names are the sheet's column names, with the unit in the name:
/// `temperature_c`, `salinity`, `specific_conductance_us_cm`,
/// `alkalinity_mg_l_caco3`, `alkalinity_umol_kg`, `dic_umol_kg`, `ph_nbs`,
/// `ph_total`, `pco2_uatm`, `calcium_mg_l`, `ammonia_mg_l_n`, `wind_m_s`,
/// and so on (`travertine sheet --list-columns` lists every input).
/// Setting an input again replaces its value. Values are checked by
/// trv_solve, which names the input, the value and the accepted range.
///
/// Returns TRV_OK, or TRV_ERR_NULL, TRV_ERR_NOT_UTF8,
/// TRV_ERR_UNKNOWN_NAME, TRV_ERR_NAME_UNIT, TRV_ERR_WRONG_KIND (a name
/// such as `water` takes trv_sample_option) or TRV_ERR_NOT_FINITE (NaN or
/// infinity); the sample is unchanged on error.
///
/// # Safety
/// `sample` is NULL or a live sample of trv_sample_new; `input_name` is
/// NULL or a NUL-terminated string.
#[no_mangle]
pub unsafe extern "C" fn trv_sample_set(
    sample: *mut trv_sample,
    input_name: *const c_char,
    value: c_double,
) -> c_int {
    guarded(TRV_ERR_INTERNAL, || {
        // SAFETY: NULL or live and not shared, by the contract.
        let Some(s) = (unsafe { sample.as_mut() }) else {
            return TRV_ERR_NULL;
        };
        // SAFETY: NULL or NUL-terminated, by the contract.
        let name = match unsafe { text(input_name) } {
            Ok(n) => n,
            Err(code) => return code,
        };
        let named = match NamedInput::find(name) {
            Ok(n) => n,
            Err(e) => return name_code(&e),
        };
        if !value.is_finite() {
            return TRV_ERR_NOT_FINITE;
        }
        match named.number(value) {
            Some(v) => {
                s.sample.put(named.input(), v);
                TRV_OK
            }
            None => TRV_ERR_WRONG_KIND,
        }
    })
}

/// Sets an option of the sample: an input that takes a name.
///
/// The options and their values: `water` (`fresh`, `saline`, `auto`, the
/// default), `ph_scale` (`total`, `seawater`, `free`, `nbs`: the scale of
/// an input `ph` that names none), `carbonic` (`lueker2000`,
/// `millero2006`, ...), `boron_fit`, `fluoride_fit`, `bisulfate_fit`,
/// `activity`, `gas_transfer`; the same names and values as the sheet's
/// columns and the command line.
///
/// Returns TRV_OK, or TRV_ERR_NULL, TRV_ERR_NOT_UTF8,
/// TRV_ERR_UNKNOWN_NAME, TRV_ERR_WRONG_KIND (an input that takes a number:
/// use trv_sample_set), or the code of a value that is not one of the
/// option's (TRV_ERR_UNKNOWN_CHOICE, TRV_ERR_UNKNOWN_FIT); the sample is
/// unchanged on error.
///
/// # Safety
/// `sample` is NULL or a live sample of trv_sample_new; `option` and
/// `value` are NULL or NUL-terminated strings.
#[no_mangle]
pub unsafe extern "C" fn trv_sample_option(
    sample: *mut trv_sample,
    option: *const c_char,
    value: *const c_char,
) -> c_int {
    guarded(TRV_ERR_INTERNAL, || {
        // SAFETY: NULL or live and not shared, by the contract.
        let Some(s) = (unsafe { sample.as_mut() }) else {
            return TRV_ERR_NULL;
        };
        // SAFETY: NULL or NUL-terminated, by the contract.
        let (name, value) = match unsafe { (text(option), text(value)) } {
            (Ok(n), Ok(v)) => (n, v),
            (Err(code), _) | (_, Err(code)) => return code,
        };
        let named = match NamedInput::find(name) {
            Ok(n) => n,
            Err(e) => return name_code(&e),
        };
        if !named.takes_name() {
            return TRV_ERR_WRONG_KIND;
        }
        match named.input().read(value) {
            Ok(v) => {
                s.sample.put(named.input(), v);
                TRV_OK
            }
            Err(e) => kind_code(e.kind()),
        }
    })
}

/// Solves the sample as `travertine solve` does: exactly two measured
/// carbonate parameters and the temperature are needed, the rest is
/// optional.
///
/// Returns the state (free it with trv_state_free), or NULL on error. On
/// error, if `error` is not NULL, `*error` is set to a new error that
/// gives the code and the message (free it with trv_error_free); on
/// success `*error` is set to NULL.
///
/// # Safety
/// `sample` is NULL or a live sample of trv_sample_new; `error` is NULL or
/// points to a writable `trv_error *`.
#[no_mangle]
pub unsafe extern "C" fn trv_solve(
    sample: *const trv_sample,
    error: *mut *mut trv_error,
) -> *mut trv_state {
    let outcome = guarded(
        Err(trv_error::new(
            TRV_ERR_INTERNAL,
            "internal error in travertine (a bug; please report it with the inputs)",
        )),
        || {
            // SAFETY: NULL or live, by the contract.
            let Some(s) = (unsafe { sample.as_ref() }) else {
                return Err(trv_error::new(TRV_ERR_NULL, "the sample is NULL"));
            };
            // One sample at a time, as the command line solves it.
            let options = SolveOptions::default().with_precipitation_potential(true);
            match s.sample.solve(&options) {
                Ok(state) => {
                    let warning_codes = state
                        .warnings
                        .iter()
                        .map(|w| CString::new(w.code()).unwrap_or_default())
                        .collect();
                    Ok(trv_state {
                        state,
                        warning_codes,
                    })
                }
                Err(e) => Err(trv_error::new(kind_code(e.kind()), &e.to_string())),
            }
        },
    );
    let (state, err) = match outcome {
        Ok(st) => (Box::into_raw(Box::new(st)), std::ptr::null_mut()),
        Err(e) => (std::ptr::null_mut(), Box::into_raw(Box::new(e))),
    };
    if error.is_null() {
        if !err.is_null() {
            // SAFETY: made by Box::into_raw just above, not shared.
            drop(unsafe { Box::from_raw(err) });
        }
    } else {
        // SAFETY: writable, by the contract.
        unsafe { *error = err };
    }
    state
}

/// The output `output_key` of the state: a key of `travertine solve
/// --json` (`ph_total`, `ph_nbs`, `dic_umol_kg`, `pco2_uatm`,
/// `omega_calcite`, `langelier_index`, `co2_flux_mmol_m2_d`, ...).
///
/// NaN where the state has no value (a fresh-water figure of a saline
/// water, omega without calcium), for a key that is a name rather than a
/// number (`water`, `carbonic_fit`), for an unknown key, and for NULL
/// arguments.
///
/// # Safety
/// `state` is NULL or a live state of trv_solve; `output_key` is NULL or a
/// NUL-terminated string.
#[no_mangle]
pub unsafe extern "C" fn trv_state_get(
    state: *const trv_state,
    output_key: *const c_char,
) -> c_double {
    guarded(f64::NAN, || {
        // SAFETY: NULL or live, by the contract.
        let Some(st) = (unsafe { state.as_ref() }) else {
            return f64::NAN;
        };
        // SAFETY: NULL or NUL-terminated, by the contract.
        let Ok(key) = (unsafe { text(output_key) }) else {
            return f64::NAN;
        };
        match Output::from_key(key).map(|o| o.value(&st.state)) {
            Some(Value::Number(Some(v))) => v,
            _ => f64::NAN,
        }
    })
}

/// The number of warnings and notes of the state: the entries of the
/// `warnings` array of `travertine solve --json`. 0 for NULL.
///
/// # Safety
/// `state` is NULL or a live state of trv_solve.
#[no_mangle]
pub unsafe extern "C" fn trv_state_warning_count(state: *const trv_state) -> usize {
    guarded(0, || {
        // SAFETY: NULL or live, by the contract.
        unsafe { state.as_ref() }.map_or(0, |st| st.warning_codes.len())
    })
}

/// The stable snake_case code of warning `index` of the state
/// (`air_co2_default`, `fit_extrapolated`, ...), or NULL for an index
/// past the last or a NULL state.
///
/// The string is owned by the state and valid until trv_state_free.
///
/// # Safety
/// `state` is NULL or a live state of trv_solve.
#[no_mangle]
pub unsafe extern "C" fn trv_state_warning_code(
    state: *const trv_state,
    index: usize,
) -> *const c_char {
    guarded(std::ptr::null(), || {
        // SAFETY: NULL or live, by the contract.
        unsafe { state.as_ref() }
            .and_then(|st| st.warning_codes.get(index))
            .map_or(std::ptr::null(), |c| c.as_ptr())
    })
}

/// The message of the error: it names the input, the value given and what
/// is accepted. NULL for a NULL error.
///
/// The string is owned by the error and valid until trv_error_free.
///
/// # Safety
/// `error` is NULL or a live error of trv_solve.
#[no_mangle]
pub unsafe extern "C" fn trv_error_message(error: *const trv_error) -> *const c_char {
    guarded(std::ptr::null(), || {
        // SAFETY: NULL or live, by the contract.
        unsafe { error.as_ref() }.map_or(std::ptr::null(), |e| e.message.as_ptr())
    })
}

/// The code of the error: one of the TRV_ERR_ constants; TRV_ERR_NULL for
/// a NULL error.
///
/// # Safety
/// `error` is NULL or a live error of trv_solve.
#[no_mangle]
pub unsafe extern "C" fn trv_error_code(error: *const trv_error) -> c_int {
    guarded(TRV_ERR_INTERNAL, || {
        // SAFETY: NULL or live, by the contract.
        unsafe { error.as_ref() }.map_or(TRV_ERR_NULL, |e| e.code)
    })
}

/// Frees a sample of trv_sample_new; NULL is ignored.
///
/// # Safety
/// `sample` is NULL or a live sample, not used again.
#[no_mangle]
pub unsafe extern "C" fn trv_sample_free(sample: *mut trv_sample) {
    if !sample.is_null() {
        // SAFETY: made by Box::into_raw in trv_sample_new, freed once.
        guarded((), || drop(unsafe { Box::from_raw(sample) }));
    }
}

/// Frees a state of trv_solve; NULL is ignored.
///
/// # Safety
/// `state` is NULL or a live state, not used again.
#[no_mangle]
pub unsafe extern "C" fn trv_state_free(state: *mut trv_state) {
    if !state.is_null() {
        // SAFETY: made by Box::into_raw in trv_solve, freed once.
        guarded((), || drop(unsafe { Box::from_raw(state) }));
    }
}

/// Frees an error of trv_solve; NULL is ignored.
///
/// # Safety
/// `error` is NULL or a live error, not used again.
#[no_mangle]
pub unsafe extern "C" fn trv_error_free(error: *mut trv_error) {
    if !error.is_null() {
        // SAFETY: made by Box::into_raw in trv_solve, freed once.
        guarded((), || drop(unsafe { Box::from_raw(error) }));
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Every kind of library error has its own number, none of them a
    /// binding code or TRV_ERR_OTHER.
    #[test]
    fn every_error_kind_has_its_own_stable_number() {
        let mut seen = std::collections::BTreeSet::new();
        for (i, k) in ErrorKind::ALL.into_iter().enumerate() {
            let code = kind_code(k);
            assert_eq!(code, TRV_ERR_OUT_OF_RANGE + i as c_int, "{k}");
            assert!(seen.insert(code), "{k}: {code} twice");
        }
    }

    /// A panic inside a guarded body becomes the fallback, and does not
    /// unwind past it.
    #[test]
    fn a_panic_becomes_the_fallback() {
        let code = guarded(TRV_ERR_INTERNAL, || -> c_int { panic!("a planted bug") });
        assert_eq!(code, TRV_ERR_INTERNAL);
        assert_eq!(guarded(TRV_ERR_INTERNAL, || TRV_OK), TRV_OK);
    }
}
