//! Helpers of the C binding's tests: the workspace's build directory, the
//! `travertine` program (built if needed), and the CLI's JSON of a sample.

#![allow(dead_code)]

use std::path::{Path, PathBuf};
use std::process::Command;
use std::sync::OnceLock;

use travertine::sample::inputs::NamedInput;

pub mod surface;

/// The build directory of this test's profile (`target/release` or
/// `target/debug`), where the static library and the program are.
pub fn profile_dir() -> PathBuf {
    let exe = std::env::current_exe().expect("the test's own path");
    // target/<profile>/deps/<test>
    exe.parent()
        .and_then(Path::parent)
        .expect("target/<profile>/deps")
        .to_path_buf()
}

/// The repository's root (the workspace).
pub fn workspace_root() -> PathBuf {
    Path::new(env!("CARGO_MANIFEST_DIR")).join("../..")
}

/// Builds a package of the workspace in this test's profile, once per
/// test binary: a no-op where `cargo test --workspace` has built it.
fn build(what: &'static [&'static str], done: &'static OnceLock<()>) {
    done.get_or_init(|| {
        let release = profile_dir().file_name().is_some_and(|n| n == "release");
        let mut cmd = Command::new(env!("CARGO"));
        cmd.arg("build")
            .arg("--quiet")
            .args(what)
            .current_dir(workspace_root());
        if release {
            cmd.arg("--release");
        }
        let status = cmd.status().expect("cargo runs");
        assert!(status.success(), "cargo build {what:?} failed");
    });
}

/// The `travertine` program of the workspace.
pub fn cli() -> PathBuf {
    static BUILT: OnceLock<()> = OnceLock::new();
    build(&["-p", "travertine", "--bin", "travertine"], &BUILT);
    profile_dir().join(format!("travertine{}", std::env::consts::EXE_SUFFIX))
}

/// The static library of the binding, built in this test's profile if
/// needed: `cargo test` leaves it in `deps/` only, and `cargo build` puts
/// it (with the shared library) where the README's link line looks.
pub fn static_lib() -> PathBuf {
    static BUILT: OnceLock<()> = OnceLock::new();
    build(&["-p", "travertine-c", "--lib"], &BUILT);
    let name = if cfg!(windows) {
        "travertine_c.lib"
    } else {
        "libtravertine_c.a"
    };
    let path = profile_dir().join(name);
    assert!(path.exists(), "no {}", path.display());
    path
}

/// A sample as the C interface is given it: inputs by name with a number,
/// options by name with a name.
#[derive(Debug, Clone, Default)]
pub struct Given {
    pub inputs: Vec<(String, f64)>,
    pub options: Vec<(String, String)>,
}

impl Given {
    /// The command-line flags that give the same sample: each input's flag
    /// with the value in the unit its name says, written as the program
    /// reads it back (`Input::write`).
    pub fn flags(&self) -> Vec<String> {
        let mut args = Vec::new();
        for (name, value) in &self.inputs {
            let named = NamedInput::find(name).unwrap_or_else(|e| panic!("{e}"));
            let v = named.number(*value).expect("a number input");
            args.push(format!(
                "--{}={}",
                named.input().flag(),
                named.input().write(&v)
            ));
        }
        for (name, value) in &self.options {
            let named = NamedInput::find(name).unwrap_or_else(|e| panic!("{e}"));
            args.push(format!("--{}={value}", named.input().flag()));
        }
        args
    }
}

/// What `travertine solve --json` gives for the sample: the JSON object,
/// or the error message (stderr) when it fails.
pub fn cli_json(given: &Given) -> Result<serde_json::Value, String> {
    cli_json_with(given, &[])
}

/// As [`cli_json`], with more flags after the sample's (`--uncertainty
/// ph=0.01`, `--budget`).
pub fn cli_json_with(given: &Given, extra: &[&str]) -> Result<serde_json::Value, String> {
    let out = Command::new(cli())
        .arg("solve")
        .arg("--json")
        .args(given.flags())
        .args(extra)
        .output()
        .expect("travertine runs");
    if out.status.success() {
        Ok(serde_json::from_slice(&out.stdout).expect("solve --json is JSON"))
    } else {
        Err(String::from_utf8_lossy(&out.stderr).into_owned())
    }
}

/// `a` and `b` agree to 1e-12 relative (and exactly at 0).
pub fn agree(a: f64, b: f64) -> bool {
    a == b || (a - b).abs() <= 1e-12 * a.abs().max(b.abs())
}
