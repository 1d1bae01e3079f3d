//! The C example (`examples/larkvane.c`) compiles with the system's C
//! compiler against the committed header and the static library, runs,
//! and prints the numbers `travertine solve --json` gives for the same
//! inputs, to 1e-12 relative (and the standard uncertainty the program
//! gives with the same `--uncertainty` settings); its warnings are the
//! program's, and its error message is the program's.

mod common;

use common::{agree, cli_json_with, static_lib, Given};
use std::path::{Path, PathBuf};
use std::process::Command;

/// Compiles a C file (a path in this crate, or absolute) against
/// travertine.h and the static library, with warnings as errors, into the
/// program `name` (each test its own, as tests run at once).
fn compile(source: &str, name: &str) -> PathBuf {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR"));
    let out = Path::new(env!("CARGO_TARGET_TMPDIR")).join(name);
    let cc = c_compiler();
    let status = Command::new(&cc)
        .args(["-std=c99", "-Wall", "-Wextra", "-Werror", "-pedantic"])
        .arg(format!("-I{}", dir.display()))
        .arg(dir.join(source))
        .arg(static_lib())
        // What a Rust static library needs from the system on Linux.
        .args(["-lpthread", "-ldl", "-lm"])
        .arg("-o")
        .arg(&out)
        .status()
        .unwrap_or_else(|e| panic!("{cc} runs: {e}"));
    assert!(status.success(), "{cc} failed on {source}");
    out
}

/// The C compiler: `$CC`, or `cc`.
fn c_compiler() -> String {
    std::env::var("CC").unwrap_or_else(|_| "cc".to_string())
}

/// One sample as the example printed it.
#[derive(Debug, Default)]
struct Printed {
    title: String,
    given: Given,
    outputs: Vec<(String, f64)>,
    /// The uncertainty settings given (`ph=0.01`).
    settings: Vec<String>,
    /// The standard uncertainties printed, by output key.
    uncertainties: Vec<(String, f64)>,
    warnings: Vec<String>,
    error: Option<(i32, String)>,
}

fn number(text: &str) -> f64 {
    if text == "none" {
        f64::NAN
    } else {
        text.parse()
            .unwrap_or_else(|_| panic!("not a number: {text}"))
    }
}

/// Reads the example's `--all-digits` output.
fn read(stdout: &str) -> Vec<Printed> {
    let mut samples: Vec<Printed> = Vec::new();
    for line in stdout.lines() {
        if let Some(title) = line.strip_prefix("sample ") {
            samples.push(Printed {
                title: title.to_string(),
                ..Printed::default()
            });
            continue;
        }
        let s = samples.last_mut().expect("a sample line first");
        let words: Vec<&str> = line.split_whitespace().collect();
        match words.as_slice() {
            ["input", name, value] => s.given.inputs.push((name.to_string(), number(value))),
            ["option", name, value] => s.given.options.push((name.to_string(), value.to_string())),
            ["output", key, value] => s.outputs.push((key.to_string(), number(value))),
            ["uncertainty", setting] => s.settings.push(setting.to_string()),
            ["u", key, value] => s.uncertainties.push((key.to_string(), number(value))),
            ["warning", code] => s.warnings.push(code.to_string()),
            ["error", code, ..] => {
                let message = line.trim_start()["error".len()..]
                    .trim_start()
                    .split_once(' ')
                    .map(|(_, m)| m.to_string())
                    .unwrap_or_default();
                s.error = Some((code.parse().expect("a code"), message));
            }
            other => panic!("an unexpected line: {other:?}"),
        }
    }
    samples
}

#[test]
fn the_c_example_gives_the_numbers_of_the_command_line() {
    let exe = compile("examples/larkvane.c", "larkvane");
    let out = Command::new(&exe)
        .arg("--all-digits")
        .output()
        .expect("the example runs");
    let stdout = String::from_utf8(out.stdout).expect("UTF-8");
    assert!(out.status.success(), "the example failed:\n{stdout}");
    let samples = read(&stdout);
    assert_eq!(samples.len(), 3, "{stdout}");

    let mut compared = 0;
    let mut compared_u = 0;
    for s in &samples {
        let flags: Vec<&str> = s
            .settings
            .iter()
            .flat_map(|t| ["--uncertainty", t.as_str()])
            .collect();
        match (&s.error, cli_json_with(&s.given, &flags)) {
            (None, Ok(json)) => {
                for (key, c) in &s.uncertainties {
                    let v = json[format!("{key}_u").as_str()]
                        .as_f64()
                        .unwrap_or_else(|| panic!("{}: no {key}_u from the program", s.title));
                    assert!(agree(*c, v), "{}: {key}_u: C {c}, CLI {v}", s.title);
                    assert!(*c > 0.0, "{}: {key}_u is {c}", s.title);
                    compared_u += 1;
                }
                assert!(!s.outputs.is_empty(), "{}: no outputs", s.title);
                for (key, c) in &s.outputs {
                    match json[key.as_str()].as_f64() {
                        Some(v) => assert!(agree(*c, v), "{}: {key}: C {c}, CLI {v}", s.title),
                        None => assert!(c.is_nan(), "{}: {key}: C {c}, CLI none", s.title),
                    }
                    compared += 1;
                }
                let codes: Vec<&str> = json["warnings"]
                    .as_array()
                    .expect("warnings")
                    .iter()
                    .map(|w| w["code"].as_str().expect("a code"))
                    .collect();
                assert_eq!(codes, s.warnings, "{}", s.title);
            }
            (Some((code, message)), Err(stderr)) => {
                assert_eq!(
                    *code,
                    travertine_c::TRV_ERR_UNSTATED_PH_SCALE,
                    "{}",
                    s.title
                );
                assert!(
                    stderr.contains(message.as_str()),
                    "{}: C `{message}`, CLI `{stderr}`",
                    s.title
                );
            }
            (c, cli) => panic!("{}: C {c:?}, CLI {cli:?}", s.title),
        }
    }
    assert!(compared >= 20, "only {compared} numbers compared");
    // The tank's pCO2 with its standard uncertainty.
    assert_eq!(compared_u, 1, "{stdout}");
    assert_eq!(samples[1].settings, ["ph=0.01", "alkalinity=2umol/kg"]);
    // Both media, and a number on each side of the example: a fresh
    // Langelier index, no Langelier index in saline water.
    assert!(samples[0]
        .outputs
        .iter()
        .any(|(k, v)| k == "langelier_index" && v.is_finite()));
    assert!(samples[1]
        .outputs
        .iter()
        .any(|(k, v)| k == "langelier_index" && v.is_nan()));
}

/// The C code of the README's "From C" section compiles and runs, inside
/// a `main`, and prints the pond's pCO2, its standard uncertainty and the
/// pH's share of it, and its notes.
#[test]
fn the_readme_c_code_compiles_and_runs() {
    let readme =
        std::fs::read_to_string(common::workspace_root().join("README.md")).expect("README.md");
    let section = readme
        .split_once("### From C")
        .map(|(_, rest)| rest)
        .expect("a From C section");
    let code = section
        .split_once("```c\n")
        .and_then(|(_, rest)| rest.split_once("```"))
        .map(|(code, _)| code)
        .expect("a C block");
    let source = Path::new(env!("CARGO_TARGET_TMPDIR")).join("readme_from_c.c");
    std::fs::write(
        &source,
        format!("#include <stdio.h>\n#include \"travertine.h\"\n\nint main(void)\n{{\n{code}return 0;\n}}\n"),
    )
    .expect("write the C file");
    let exe = compile(source.to_str().expect("UTF-8 path"), "readme_from_c");
    let out = Command::new(&exe).output().expect("it runs");
    let stdout = String::from_utf8_lossy(&out.stdout);
    assert!(out.status.success(), "{stdout}");
    // The program, given the inputs and options the code sets.
    let mut given = Given::default();
    let mut settings = Vec::new();
    for line in code.lines().map(str::trim) {
        let args = |prefix: &str| {
            line.strip_prefix(prefix)
                .and_then(|rest| rest.strip_suffix(");"))
                .map(|rest| {
                    rest.split(", ")
                        .map(|a| a.trim_matches('"').to_string())
                        .collect::<Vec<_>>()
                })
        };
        if let Some(a) = args("trv_sample_set(s, ") {
            given
                .inputs
                .push((a[0].clone(), a[1].parse().expect("a number")));
        } else if let Some(a) = args("trv_sample_option(s, ") {
            given.options.push((a[0].clone(), a[1].clone()));
        } else if let Some(a) = args("trv_sample_uncertainty(s, ") {
            settings.push(a[0].clone());
        }
    }
    assert_eq!(given.inputs.len(), 5, "{given:?}");
    assert_eq!(settings.len(), 2, "{settings:?}");
    let mut flags: Vec<&str> = settings
        .iter()
        .flat_map(|t| ["--uncertainty", t.as_str()])
        .collect();
    flags.push("--budget");
    let json = cli_json_with(&given, &flags).expect("the program solves it");
    let expected = format!(
        "pCO2 {:.0} uatm, Langelier index {:.2}\n\
         pCO2 standard uncertainty {:.0} uatm, {:.0}% of it from the pH\n",
        json["pco2_uatm"].as_f64().expect("pCO2"),
        json["langelier_index"].as_f64().expect("a Langelier index"),
        json["pco2_uatm_u"].as_f64().expect("its uncertainty"),
        100.0
            * json["budget"]["pco2_uatm"]["ph"]
                .as_f64()
                .expect("the pH's share"),
    );
    assert!(stdout.starts_with(&expected), "C {stdout}, CLI {expected}");
    assert!(stdout.contains("note: air_co2_default"), "{stdout}");
}

/// The shared library, linked as the README says (`-L... -ltravertine_c`),
/// gives the example the same output as the static one.
#[cfg(target_os = "linux")]
#[test]
fn the_shared_library_gives_the_same_output() {
    let dir = Path::new(env!("CARGO_MANIFEST_DIR"));
    let lib_dir = static_lib().parent().expect("a directory").to_path_buf();
    assert!(
        lib_dir.join("libtravertine_c.so").exists(),
        "no shared library"
    );
    let exe = Path::new(env!("CARGO_TARGET_TMPDIR")).join("larkvane_shared");
    let status = Command::new(c_compiler())
        .args(["-std=c99", "-Wall", "-Wextra", "-Werror", "-pedantic"])
        .arg(format!("-I{}", dir.display()))
        .arg(dir.join("examples/larkvane.c"))
        .arg(format!("-L{}", lib_dir.display()))
        .args(["-ltravertine_c", "-lm", "-o"])
        .arg(&exe)
        .status()
        .expect("cc runs");
    assert!(status.success(), "cc failed linking the shared library");
    let run = |exe: &Path| {
        let out = Command::new(exe)
            .arg("--all-digits")
            .env("LD_LIBRARY_PATH", &lib_dir)
            .output()
            .expect("it runs");
        assert!(out.status.success());
        String::from_utf8(out.stdout).expect("UTF-8")
    };
    let shared = run(&exe);
    assert!(shared.contains("output pco2_uatm"), "{shared}");
    assert_eq!(
        shared,
        run(&compile("examples/larkvane.c", "larkvane_static"))
    );
}
