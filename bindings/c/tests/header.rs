//! The committed header is what cbindgen makes of `src/lib.rs` with
//! `cbindgen.toml`: this test fails when they differ (CI runs it), and
//! rewrites the header when `TRV_WRITE_HEADER=1` is set.

use std::path::Path;

fn generated() -> String {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR"));
    let config = cbindgen::Config::from_file(dir.join("cbindgen.toml")).expect("cbindgen.toml");
    let bindings = cbindgen::Builder::new()
        .with_config(config)
        .with_src(dir.join("src/lib.rs"))
        .generate()
        .expect("cbindgen reads src/lib.rs");
    let mut out = Vec::new();
    bindings.write(&mut out);
    String::from_utf8(out).expect("the header is UTF-8")
}

#[test]
fn the_committed_header_is_current() {
    let path = Path::new(env!("CARGO_MANIFEST_DIR")).join("travertine.h");
    let fresh = generated();
    if std::env::var_os("TRV_WRITE_HEADER").is_some_and(|v| v == "1") {
        std::fs::write(&path, &fresh).expect("write travertine.h");
        return;
    }
    let committed = std::fs::read_to_string(&path).unwrap_or_default();
    assert!(
        committed == fresh,
        "bindings/c/travertine.h is not what cbindgen makes of src/lib.rs; run \
         `TRV_WRITE_HEADER=1 cargo test -p travertine-c --test header` and commit it"
    );
}

/// The header with each line that ends in a comma joined to the next: a
/// parameter list that cbindgen wrapped (by a width rule of its own) on
/// one line.
fn unwrapped(h: &str) -> String {
    let mut out = String::with_capacity(h.len());
    for line in h.lines() {
        if out.ends_with(',') {
            out.push(' ');
            out.push_str(line.trim_start());
        } else {
            if !out.is_empty() {
                out.push('\n');
            }
            out.push_str(line);
        }
    }
    out
}

/// Every function of the surface, and every error code, is in the header
/// with its doc comment.
#[test]
fn the_header_declares_the_whole_surface_with_docs() {
    let h = unwrapped(&generated());
    for f in [
        "trv_sample *trv_sample_new(void);",
        "int trv_sample_set(trv_sample *sample, const char *input_name, double value);",
        "int trv_sample_option(trv_sample *sample, const char *option, const char *value);",
        "int trv_sample_uncertainty(trv_sample *sample, const char *setting);",
        "int trv_sample_no_constant_uncertainty(trv_sample *sample);",
        "trv_state *trv_solve(const trv_sample *sample, trv_error **error);",
        "double trv_state_get(const trv_state *state, const char *output_key);",
        "double trv_state_uncertainty(const trv_state *state, const char *output_key);",
        "size_t trv_state_uncertainty_source_count(const trv_state *state);",
        "const char *trv_state_uncertainty_source(const trv_state *state, size_t index);",
        "double trv_state_budget_share(const trv_state *state, const char *output_key, const char *source_name);",
        "size_t trv_state_warning_count(const trv_state *state);",
        "const char *trv_state_warning_code(const trv_state *state, size_t index);",
        "const char *trv_error_message(const trv_error *error);",
        "int trv_error_code(const trv_error *error);",
        "void trv_sample_free(trv_sample *sample);",
        "void trv_state_free(trv_state *state);",
        "void trv_error_free(trv_error *error);",
    ] {
        let at = h.find(f).unwrap_or_else(|| panic!("no `{f}` in\n{h}"));
        let before = h[..at].trim_end();
        assert!(
            before.ends_with("*/")
                || before
                    .lines()
                    .last()
                    .is_some_and(|l| l.trim_start().starts_with("//")),
            "`{f}` has no doc comment"
        );
    }
    for code in [
        "TRV_OK 0",
        "TRV_ERR_NULL 1",
        "TRV_ERR_BAD_UNCERTAINTY 7",
        "TRV_ERR_UNCERTAINTY_NOT_MEASURED 8",
        "TRV_ERR_OUT_OF_RANGE 100",
        "TRV_ERR_BAD_PROFILE 118",
    ] {
        assert!(h.contains(&format!("#define {code}")), "no #define {code}");
    }
}

/// Every code the header has published, with its number: a code is never
/// renumbered or removed, so each of these is `#define`d with exactly this
/// number; a new code is added here in the commit that adds it.
const PUBLISHED: &[(&str, i32)] = &[
    ("TRV_OK", 0),
    ("TRV_ERR_NULL", 1),
    ("TRV_ERR_NOT_UTF8", 2),
    ("TRV_ERR_UNKNOWN_NAME", 3),
    ("TRV_ERR_NAME_UNIT", 4),
    ("TRV_ERR_WRONG_KIND", 5),
    ("TRV_ERR_INTERNAL", 6),
    ("TRV_ERR_BAD_UNCERTAINTY", 7),
    ("TRV_ERR_UNCERTAINTY_NOT_MEASURED", 8),
    ("TRV_ERR_OTHER", 99),
    ("TRV_ERR_OUT_OF_RANGE", 100),
    ("TRV_ERR_NOT_FINITE", 101),
    ("TRV_ERR_NOT_A_NUMBER", 102),
    ("TRV_ERR_MISSING_UNIT", 103),
    ("TRV_ERR_WRONG_UNIT", 104),
    ("TRV_ERR_INCOMPATIBLE_PAIR", 105),
    ("TRV_ERR_NO_WATER_FITS", 106),
    ("TRV_ERR_NO_CONVERGENCE", 107),
    ("TRV_ERR_UNKNOWN_FIT", 108),
    ("TRV_ERR_WRONG_MEDIUM", 109),
    ("TRV_ERR_UNKNOWN_CHOICE", 110),
    ("TRV_ERR_UNSTATED_PH_SCALE", 111),
    ("TRV_ERR_INCONSISTENT", 112),
    ("TRV_ERR_MISSING", 113),
    ("TRV_ERR_WRONG_COUNT", 114),
    ("TRV_ERR_COMPUTATION", 115),
    ("TRV_ERR_UNREACHABLE", 116),
    ("TRV_ERR_PAST_TARGET", 117),
    ("TRV_ERR_BAD_PROFILE", 118),
];

#[test]
fn no_published_code_is_renumbered_or_removed() {
    let h = generated();
    let defined: Vec<(String, i32)> = h
        .lines()
        .filter_map(|l| l.strip_prefix("#define TRV_"))
        .map(|rest| {
            let mut parts = rest.split_whitespace();
            let name = format!("TRV_{}", parts.next().expect("a name"));
            let number = parts
                .next()
                .and_then(|n| n.parse().ok())
                .unwrap_or_else(|| panic!("{name} has no number"));
            (name, number)
        })
        .collect();
    for (name, number) in PUBLISHED {
        let found = defined.iter().find(|(n, _)| n == name);
        assert_eq!(
            found.map(|(_, v)| *v),
            Some(*number),
            "{name} was published as {number}: it is never renumbered or removed"
        );
    }
    for (name, number) in &defined {
        assert!(
            PUBLISHED.iter().any(|(n, _)| n == name),
            "{name} = {number} is new: add it to PUBLISHED"
        );
    }
    let mut numbers: Vec<i32> = defined.iter().map(|(_, v)| *v).collect();
    numbers.sort_unstable();
    numbers.dedup();
    assert_eq!(numbers.len(), defined.len(), "two codes share a number");
}
