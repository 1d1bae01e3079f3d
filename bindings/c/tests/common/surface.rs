//! The C surface wrapped for the tests: a sample and a state made through
//! the C functions, freed on drop, and the C strings between them.

use std::ffi::{c_char, CStr, CString};
use std::ptr::null_mut;

use super::Given;
use travertine_c::*;

/// A C string of `text`.
pub fn c(text: &str) -> CString {
    CString::new(text).expect("no NUL")
}

/// A C string returned by the binding, as Rust text (`None` for NULL).
pub fn text(p: *const c_char) -> Option<String> {
    // SAFETY: NULL or a string owned by a live object.
    (!p.is_null()).then(|| unsafe { CStr::from_ptr(p) }.to_string_lossy().into_owned())
}

/// A sample made through the C surface, freed on drop.
pub struct Sample(pub *mut trv_sample);

impl Sample {
    pub fn new() -> Sample {
        let s = trv_sample_new();
        assert!(!s.is_null());
        Sample(s)
    }

    pub fn set(&self, name: &str, value: f64) -> i32 {
        // SAFETY: a live sample, a C string.
        unsafe { trv_sample_set(self.0, c(name).as_ptr(), value) }
    }

    pub fn option(&self, name: &str, value: &str) -> i32 {
        // SAFETY: a live sample, C strings.
        unsafe { trv_sample_option(self.0, c(name).as_ptr(), c(value).as_ptr()) }
    }

    pub fn given(given: &Given) -> Sample {
        let s = Sample::new();
        for (name, value) in &given.inputs {
            assert_eq!(s.set(name, *value), TRV_OK, "{name}");
        }
        for (name, value) in &given.options {
            assert_eq!(s.option(name, value), TRV_OK, "{name}");
        }
        s
    }

    /// Asks for a standard uncertainty, `NAME=VALUE` (trv_sample_uncertainty).
    pub fn uncertainty(&self, setting: &str) -> i32 {
        // SAFETY: a live sample, a C string.
        unsafe { trv_sample_uncertainty(self.0, c(setting).as_ptr()) }
    }

    /// Switches the default uncertainties of the constants off.
    pub fn no_constant_uncertainty(&self) -> i32 {
        // SAFETY: a live sample.
        unsafe { trv_sample_no_constant_uncertainty(self.0) }
    }

    /// The state, or the error's code and message.
    pub fn solve(&self) -> Result<State, (i32, String)> {
        let mut error: *mut trv_error = null_mut();
        // SAFETY: a live sample, a writable pointer.
        let st = unsafe { trv_solve(self.0, &mut error) };
        if st.is_null() {
            assert!(!error.is_null(), "NULL state without an error");
            // SAFETY: a live error, freed once.
            let out = unsafe {
                let out = (
                    trv_error_code(error),
                    text(trv_error_message(error)).expect("a message"),
                );
                trv_error_free(error);
                out
            };
            Err(out)
        } else {
            assert!(error.is_null(), "a state and an error");
            Ok(State(st))
        }
    }
}

impl Drop for Sample {
    fn drop(&mut self) {
        // SAFETY: made by trv_sample_new, freed once.
        unsafe { trv_sample_free(self.0) }
    }
}

/// A state made through the C surface, freed on drop.
pub struct State(pub *mut trv_state);

impl State {
    pub fn get(&self, key: &str) -> f64 {
        // SAFETY: a live state, a C string.
        unsafe { trv_state_get(self.0, c(key).as_ptr()) }
    }

    /// The standard uncertainty of output `key` (trv_state_uncertainty).
    pub fn u(&self, key: &str) -> f64 {
        // SAFETY: a live state, a C string.
        unsafe { trv_state_uncertainty(self.0, c(key).as_ptr()) }
    }

    /// The share of `source` in the variance of output `key`.
    pub fn share(&self, key: &str, source: &str) -> f64 {
        // SAFETY: a live state, C strings.
        unsafe { trv_state_budget_share(self.0, c(key).as_ptr(), c(source).as_ptr()) }
    }

    /// The names of the sources of the uncertainties.
    pub fn sources(&self) -> Vec<String> {
        // SAFETY: a live state; the names live as long as it does.
        unsafe {
            (0..trv_state_uncertainty_source_count(self.0))
                .map(|i| text(trv_state_uncertainty_source(self.0, i)).expect("a name"))
                .collect()
        }
    }

    /// The warning codes of the state.
    pub fn warnings(&self) -> Vec<String> {
        // SAFETY: a live state; the codes live as long as it does.
        unsafe {
            (0..trv_state_warning_count(self.0))
                .map(|i| text(trv_state_warning_code(self.0, i)).expect("a code"))
                .collect()
        }
    }
}

impl Drop for State {
    fn drop(&mut self) {
        // SAFETY: made by trv_solve, freed once.
        unsafe { trv_state_free(self.0) }
    }
}

pub fn given(inputs: &[(&str, f64)], options: &[(&str, &str)]) -> Given {
    Given {
        inputs: inputs.iter().map(|(n, v)| (n.to_string(), *v)).collect(),
        options: options
            .iter()
            .map(|(n, v)| (n.to_string(), v.to_string()))
            .collect(),
    }
}
