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
//! Standard uncertainties are asked for as `travertine solve
//! --uncertainty NAME=VALUE` asks for them (`trv_sample_uncertainty`,
//! `trv_sample_no_constant_uncertainty`); the solve then propagates them to
//! every numeric output, read with `trv_state_uncertainty` (the
//! `<key>_u` of `solve --json`) and `trv_state_budget_share` (its
//! `budget` object).
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

use travertine::decisions::uncertainty::{Problem, Propagation, Source, Uncertainties};
use travertine::decisions::uncertainty_settings::{with_settings, Setting, SettingError, Target};
use travertine::error::ErrorKind;
use travertine::output::uncertainty::outputs_propagated;
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
/// A standard uncertainty that cannot be read (trv_sample_uncertainty):
/// no `=`, a name that is neither an input with an uncertainty nor a
/// constant, a value not in the name's units, or a value below zero or
/// not finite.
pub const TRV_ERR_BAD_UNCERTAINTY: c_int = 7;
/// A standard uncertainty of a carbonate parameter that is not one of the
/// two measured (`dic=1umol/kg` on a pH and an alkalinity): trv_solve's
/// error, as the program refuses it.
pub const TRV_ERR_UNCERTAINTY_NOT_MEASURED: c_int = 8;
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

/// The stable number of a standard uncertainty that cannot be read or
/// used, from the library's code of it ([`SettingError::code`]):
/// `TRV_ERR_UNCERTAINTY_NOT_MEASURED` for a carbonate parameter not
/// measured, `TRV_ERR_BAD_UNCERTAINTY` for every other (and for a kind
/// newer than this binding: each is a setting that cannot be read).
fn setting_code(e: &SettingError) -> c_int {
    match e.code() {
        "uncertainty_not_measured" => TRV_ERR_UNCERTAINTY_NOT_MEASURED,
        _ => TRV_ERR_BAD_UNCERTAINTY,
    }
}

/// A sample being described: filled with `trv_sample_set` and
/// `trv_sample_option` (and the uncertainties asked for with
/// `trv_sample_uncertainty`, `trv_sample_no_constant_uncertainty`), solved
/// with `trv_solve`, freed with `trv_sample_free`.
pub struct trv_sample {
    sample: Sample,
    /// The uncertainty settings, in the order given, every one kept as the
    /// program keeps its `--uncertainty` flags: the library's
    /// `with_settings` replaces a repeated name (the last wins, moved to
    /// the end) and, resolving them in this order, names the same setting
    /// in its error as the program does.
    settings: Vec<Setting>,
    /// The default uncertainties of the constants are off.
    no_constant_uncertainty: bool,
}

impl trv_sample {
    /// Whether any uncertainty was asked for, as the program's
    /// `--uncertainty` or `--no-constant-uncertainty`.
    fn uncertainty_asked(&self) -> bool {
        !self.settings.is_empty() || self.no_constant_uncertainty
    }
}

/// A solved sample: every output of `travertine solve --json`, read with
/// `trv_state_get`, its warnings, and, where asked for, the standard
/// uncertainty of every numeric output. Freed with `trv_state_free`.
pub struct trv_state {
    state: State,
    /// The warning codes, NUL-terminated, owned here.
    warning_codes: Vec<CString>,
    /// The propagation, where uncertainties were asked for.
    uncertainty: Option<Propagated>,
}

/// The propagation of a state's uncertainties to every numeric output.
struct Propagated {
    /// The numeric outputs, in the order of `linear.outputs`.
    outputs: Vec<Output>,
    /// The library's result: each output's u, its budget.
    linear: Propagation,
    /// The name of each source, as the program's `budget` names it, in
    /// the order of `linear.sources`, NUL-terminated, owned here.
    source_names: Vec<CString>,
}

impl Propagated {
    /// The place of the output `key` in `outputs`.
    fn place(&self, key: &str) -> Option<usize> {
        let o = Output::from_key(key)?;
        self.outputs.iter().position(|p| *p == o)
    }
}

/// The name of a source as the program's `uncertainty` and `budget`
/// objects write it (an input's flag, `pk1`, `boron_total`).
fn source_name(source: Source) -> String {
    match source {
        Source::Input(i) => Target::Input(i).name(),
        Source::Constant(c) => Target::Constant(c).name(),
        // A kind of source newer than this binding: its debug name.
        other => format!("{other:?}"),
    }
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
            settings: Vec::new(),
            no_constant_uncertainty: false,
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

/// Asks for the standard uncertainty of an input or a constant, as the
/// program's `travertine solve --uncertainty NAME=VALUE` takes it:
/// `setting` is one `NAME=VALUE` text, read by the library as the flag is.
///
/// NAME is a carbonate parameter (`ph`, `alkalinity`, `dic`, `pco2`, ...),
/// another input whose uncertainty is propagated (`temperature`,
/// `salinity`, `calcium`, `wind`, ...), or a constant (`pk0`, `pk1`, `pk2`,
/// `pkb`, `pkw`, `pksp_calcite`, `pksp_aragonite`, `boron_total`, ...);
/// case and `-`/`_` do not matter. VALUE is absolute in one of the input's
/// units (`ph=0.01`, `alkalinity=2umol/kg`, `alkalinity=1 mg/L CaCO3`,
/// `temperature=0.1` for °C, a constant in pK units: `pk1=0.01`) or
/// relative (`dic=0.5%`). An input may also be named as trv_sample_set
/// names it, by a column name with its unit; a bare number is then in that
/// unit (`ph_total=0.01`, `alkalinity_umol_kg=2`, `temperature_f=0.18`).
/// `travertine solve --help` lists every name.
///
/// Asking for the uncertainty of a name again replaces the earlier value,
/// as on the command line. Unless trv_sample_no_constant_uncertainty is
/// called, the constants keep their published default uncertainties
/// besides those set. Once any uncertainty is asked for, trv_solve
/// propagates them to every numeric output (trv_state_uncertainty).
/// Whether a carbonate parameter named was measured is checked by
/// trv_solve (TRV_ERR_UNCERTAINTY_NOT_MEASURED), since the pair may be set
/// after this call.
///
/// Returns TRV_OK, or TRV_ERR_NULL, TRV_ERR_NOT_UTF8, or
/// TRV_ERR_BAD_UNCERTAINTY for a setting that cannot be read (no `=`, an
/// unknown name, a value not in the name's units, a negative or infinite
/// value); the sample is unchanged on error.
///
/// # Safety
/// `sample` is NULL or a live sample of trv_sample_new; `setting` is NULL
/// or a NUL-terminated string. The sample keeps no pointer to `setting`.
#[no_mangle]
pub unsafe extern "C" fn trv_sample_uncertainty(
    sample: *mut trv_sample,
    setting: *const c_char,
) -> c_int {
    guarded(TRV_ERR_INTERNAL, || {
        // SAFETY: NULL or live and not shared, by the contract.
        let Some(s) = (unsafe { sample.as_mut() }) else {
            return TRV_ERR_NULL;
        };
        // SAFETY: NULL or NUL-terminated, by the contract.
        let text = match unsafe { text(setting) } {
            Ok(t) => t,
            Err(code) => return code,
        };
        match text.parse::<Setting>() {
            Ok(new) => {
                // Kept in order as the program's flags are; the library's
                // `with_settings` lets the last of a name win.
                s.settings.push(new);
                TRV_OK
            }
            Err(e) => setting_code(&e),
        }
    })
}

/// Switches off the published default uncertainties of the constants, as
/// the program's `--no-constant-uncertainty`: only the uncertainties set
/// with trv_sample_uncertainty count (a constant set there still does).
/// It also asks for the propagation: with no uncertainty set, every
/// output's standard uncertainty is then 0.
///
/// Returns TRV_OK, or TRV_ERR_NULL.
///
/// # Safety
/// `sample` is NULL or a live sample of trv_sample_new.
#[no_mangle]
pub unsafe extern "C" fn trv_sample_no_constant_uncertainty(sample: *mut trv_sample) -> c_int {
    guarded(TRV_ERR_INTERNAL, || {
        // SAFETY: NULL or live and not shared, by the contract.
        let Some(s) = (unsafe { sample.as_mut() }) else {
            return TRV_ERR_NULL;
        };
        s.no_constant_uncertainty = true;
        TRV_OK
    })
}

/// The propagation of the sample's uncertainties to every numeric output
/// of `state` (its solve), as `travertine solve --uncertainty` makes it:
/// the settings resolved for the pair measured at the state's density,
/// the problem of the sample's water, pair, solve options, air and pH
/// scale given, and the library's linear propagation of every output.
fn propagated(
    s: &trv_sample,
    state: &State,
    options: SolveOptions,
) -> Result<Propagated, trv_error> {
    let library = |e: travertine::Error| trv_error::new(kind_code(e.kind()), &e.to_string());
    // Each of these succeeded in the solve that made `state`.
    let (a, b) = s.sample.pair().map_err(library)?;
    let water = s.sample.water().map_err(library)?;
    let air = s.sample.air().map_err(library)?;
    let mut base = Uncertainties::new();
    if s.no_constant_uncertainty {
        base = base.without_constants();
    }
    let u = with_settings(base, &s.settings, &a, &b, state.density_kg_m3)
        .map_err(|e| trv_error::new(setting_code(&e), &e.to_string()))?;
    let problem = Problem::new(&water, a, b)
        .map_err(library)?
        .with_options(options)
        .with_air(air, s.sample.ph_scale_given());
    let (outputs, linear) = outputs_propagated(&problem, &u).map_err(library)?;
    let source_names = linear
        .sources
        .iter()
        .map(|(source, _)| CString::new(source_name(*source)).unwrap_or_default())
        .collect();
    Ok(Propagated {
        outputs,
        linear,
        source_names,
    })
}

/// Solves the sample as `travertine solve` does: exactly two measured
/// carbonate parameters and the temperature are needed, the rest is
/// optional.
///
/// Where any uncertainty was asked for (trv_sample_uncertainty,
/// trv_sample_no_constant_uncertainty), the solve also propagates them to
/// every numeric output, as `travertine solve --uncertainty` does (read
/// them with trv_state_uncertainty). That costs a few full solves per
/// source. An uncertainty that cannot be used fails the whole solve, as it
/// fails the program: NULL, and an error with the program's message and
/// TRV_ERR_UNCERTAINTY_NOT_MEASURED (a carbonate parameter that is not one
/// of the pair), TRV_ERR_BAD_UNCERTAINTY (a size that is no longer finite
/// once converted for the pair, `alkalinity=1e308 mg/L CaCO3`), or the
/// library's code where the propagation cannot be made. There is no
/// state without its uncertainties once they were asked for.
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
            let state = s
                .sample
                .solve(&options)
                .map_err(|e| trv_error::new(kind_code(e.kind()), &e.to_string()))?;
            let uncertainty = if s.uncertainty_asked() {
                Some(propagated(s, &state, options)?)
            } else {
                None
            };
            let warning_codes = state
                .warnings
                .iter()
                .map(|w| CString::new(w.code()).unwrap_or_default())
                .collect();
            Ok(trv_state {
                state,
                warning_codes,
                uncertainty,
            })
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

/// The standard uncertainty of the output `output_key` of the state: the
/// `<key>_u` of `travertine solve --json --uncertainty ...` for the same
/// sample and uncertainties (linear propagation; the sources taken as
/// independent), in the unit of the output (pH units for `ph_total`,
/// µmol/kg for `dic_umol_kg`, µatm for `pco2_uatm`, ...).
///
/// NaN where no uncertainty was asked for before trv_solve, where the
/// output has no value (as trv_state_get), for a key that is a name or
/// unknown, and for NULL arguments. 0 where no source moves the output.
///
/// # Safety
/// `state` is NULL or a live state of trv_solve; `output_key` is NULL or a
/// NUL-terminated string.
#[no_mangle]
pub unsafe extern "C" fn trv_state_uncertainty(
    state: *const trv_state,
    output_key: *const c_char,
) -> c_double {
    guarded(f64::NAN, || {
        // SAFETY: NULL or live, by the contract.
        let Some(p) = (unsafe { state.as_ref() }).and_then(|st| st.uncertainty.as_ref()) else {
            return f64::NAN;
        };
        // SAFETY: NULL or NUL-terminated, by the contract.
        let Ok(key) = (unsafe { text(output_key) }) else {
            return f64::NAN;
        };
        p.place(key)
            .and_then(|k| p.linear.outputs.get(k))
            .and_then(|o| o.u)
            .unwrap_or(f64::NAN)
    })
}

/// The number of sources of the state's uncertainties: every input and
/// constant given a standard uncertainty above zero (a constant of a
/// system the water lacks moves nothing, and counts with zero shares), the
/// `sources` of the `uncertainty` object of `solve --json` in its order.
/// 0 where no uncertainty was asked for, and for NULL.
///
/// # Safety
/// `state` is NULL or a live state of trv_solve.
#[no_mangle]
pub unsafe extern "C" fn trv_state_uncertainty_source_count(state: *const trv_state) -> usize {
    guarded(0, || {
        // SAFETY: NULL or live, by the contract.
        unsafe { state.as_ref() }
            .and_then(|st| st.uncertainty.as_ref())
            .map_or(0, |p| p.source_names.len())
    })
}

/// The name of source `index` of the state's uncertainties, as the
/// program's `budget` names it: an input's flag (`ph`, `alkalinity`,
/// `temperature`) or a constant (`pk1`, `pksp_calcite`, `boron_total`).
/// NULL for an index past the last, without uncertainties, or for NULL.
///
/// The string is owned by the state and valid until trv_state_free.
///
/// # Safety
/// `state` is NULL or a live state of trv_solve.
#[no_mangle]
pub unsafe extern "C" fn trv_state_uncertainty_source(
    state: *const trv_state,
    index: usize,
) -> *const c_char {
    guarded(std::ptr::null(), || {
        // SAFETY: NULL or live, by the contract.
        unsafe { state.as_ref() }
            .and_then(|st| st.uncertainty.as_ref())
            .and_then(|p| p.source_names.get(index))
            .map_or(std::ptr::null(), |c| c.as_ptr())
    })
}

/// The share of source `source_name` in the variance of output
/// `output_key`: u_i² / u², between 0 and 1, the shares of an output
/// summing to 1; the `budget` object of `solve --json --budget`.
///
/// `source_name` is any name trv_sample_uncertainty takes for it (`ph`,
/// `ph_nbs`, `alkalinity`, `alkalinity_mg_l_caco3`, `pk1`, ...), whatever
/// unit or scale the input was given in. 0 for a source that is a valid
/// name but not among the state's sources (its uncertainty is 0). NaN
/// where the output's variance is not above zero (the program's budget
/// leaves such an output out), where the output has no value, for an
/// unknown key or name, where no uncertainty was asked for, and for NULL
/// arguments.
///
/// # Safety
/// `state` is NULL or a live state of trv_solve; `output_key` and
/// `source_name` are NULL or NUL-terminated strings.
#[no_mangle]
pub unsafe extern "C" fn trv_state_budget_share(
    state: *const trv_state,
    output_key: *const c_char,
    source_name: *const c_char,
) -> c_double {
    guarded(f64::NAN, || {
        // SAFETY: NULL or live, by the contract.
        let Some(p) = (unsafe { state.as_ref() }).and_then(|st| st.uncertainty.as_ref()) else {
            return f64::NAN;
        };
        // SAFETY: NULL or NUL-terminated, by the contract.
        let (Ok(key), Ok(name)) = (unsafe { (text(output_key), text(source_name)) }) else {
            return f64::NAN;
        };
        let (Some(k), Some(target)) = (p.place(key), Target::from_name(name)) else {
            return f64::NAN;
        };
        if !p
            .linear
            .outputs
            .get(k)
            .and_then(|o| o.u)
            .is_some_and(|u| u > 0.0)
        {
            return f64::NAN;
        }
        let wanted = target.source();
        p.linear
            .budget(k)
            .into_iter()
            .find(|(s, _)| *s == wanted)
            .map_or(0.0, |(_, share)| share)
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
