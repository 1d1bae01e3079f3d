//! Helpers shared by the integration tests: reading the reference tables of
//! `tables/`, their tolerances, and the checks every table row must pass.
//!
//! Each test crate uses only some of these, so unused ones are allowed.
#![allow(dead_code)]

use proptest::prelude::*;
use serde::Deserialize;
use std::fmt::Write as _;
use std::path::PathBuf;
use travertine::{Measured, Parameter, RootChoice, SolveOptions, State, Water};

/// The provenances a row may carry.
pub const PROVENANCES: [&str; 3] = ["published", "memory", "computed"];

/// A table in `tables/`, read with serde. Rows that do not parse are
/// returned as errors with their line, so that they fail rather than vanish.
pub fn read_table<T: for<'de> Deserialize<'de>>(name: &str) -> Vec<Result<T, String>> {
    let path: PathBuf = [env!("CARGO_MANIFEST_DIR"), "tables", name]
        .iter()
        .collect();
    let mut reader = csv::Reader::from_path(&path)
        .unwrap_or_else(|e| panic!("cannot open {}: {e}", path.display()));
    reader
        .deserialize()
        .enumerate()
        .map(|(i, r)| r.map_err(|e| format!("{name} data row {}: cannot read: {e}", i + 1)))
        .collect()
}

/// A tolerance: absolute (plain number) or relative (number followed by `%`).
#[derive(Debug, Clone, Copy)]
pub enum Tolerance {
    Absolute(f64),
    Relative(f64),
}

impl Tolerance {
    pub fn parse(text: &str) -> Result<Self, String> {
        let t = text.trim();
        let (number, relative) = match t.strip_suffix('%') {
            Some(n) => (n.trim(), true),
            None => (t, false),
        };
        let x: f64 = number
            .parse()
            .map_err(|_| format!("tolerance {text:?} is not a number or a percentage"))?;
        if !x.is_finite() || x < 0.0 {
            return Err(format!(
                "tolerance {text:?} must be finite and not negative"
            ));
        }
        Ok(if relative {
            Tolerance::Relative(x / 100.0)
        } else {
            Tolerance::Absolute(x)
        })
    }

    /// The allowed absolute difference around `expected`.
    pub fn allowed(self, expected: f64) -> f64 {
        match self {
            Tolerance::Absolute(a) => a,
            Tolerance::Relative(r) => r * expected.abs(),
        }
    }
}

/// The outcome of one row: how much of its tolerance it used.
pub struct Checked {
    pub label: String,
    pub expected: f64,
    pub actual: f64,
    pub allowed: f64,
}

impl Checked {
    pub fn used(&self) -> f64 {
        let d = (self.actual - self.expected).abs();
        if self.allowed > 0.0 {
            d / self.allowed
        } else if d == 0.0 {
            0.0
        } else {
            f64::INFINITY
        }
    }
    pub fn passes(&self) -> bool {
        // NaN fails: the comparison is false.
        (self.actual - self.expected).abs() <= self.allowed
    }
    pub fn line(&self) -> String {
        format!(
            "{}\n      expected {:<16} actual {:<22} |diff| {:.3e}  allowed {:.3e}",
            self.label,
            self.expected,
            self.actual,
            (self.actual - self.expected).abs(),
            self.allowed
        )
    }
}

/// A row must name its source and carry one of the [`PROVENANCES`].
pub fn check_source_and_provenance(source: &str, provenance: &str) -> Result<(), String> {
    if source.trim().is_empty() {
        return Err("the source is empty".to_string());
    }
    if !PROVENANCES.contains(&provenance.trim()) {
        return Err(format!(
            "provenance {provenance:?} is not one of {}",
            PROVENANCES.join(", ")
        ));
    }
    Ok(())
}

/// Prints the rows that used most of their tolerance, then fails with every
/// failure if there is any.
pub fn finish(table: &str, rows_read: usize, checked: &[Checked], failures: &[String]) {
    let mut ranked: Vec<&Checked> = checked.iter().filter(|c| c.passes()).collect();
    ranked.sort_by(|a, b| b.used().total_cmp(&a.used()));
    println!("{table}: {rows_read} rows; closest to their tolerance:");
    for c in ranked.iter().take(8) {
        println!("  {:5.1} % of tolerance  {}", 100.0 * c.used(), c.line());
    }
    if !failures.is_empty() {
        let mut msg = format!(
            "{} of {rows_read} rows of {table} failed:\n",
            failures.len()
        );
        for f in failures {
            let _ = writeln!(msg, "  - {f}");
        }
        panic!("{msg}");
    }
}

/// Reads table `name`, checks every row with `check` (`label` names a row
/// in messages), prints the rows that used most of their tolerance, and
/// fails with every failure if there is any, or if the table has no rows.
pub fn check_table<T, L, C>(name: &str, label: L, mut check: C)
where
    T: for<'de> Deserialize<'de>,
    L: Fn(&T) -> String,
    C: FnMut(&T) -> Result<Checked, String>,
{
    let rows = read_table::<T>(name);
    assert!(
        !rows.is_empty(),
        "tables/{name} gave zero rows: nothing was checked"
    );
    let mut checked = Vec::new();
    let mut failures = Vec::new();
    for (i, row) in rows.iter().enumerate() {
        let row = match row {
            Ok(r) => r,
            Err(e) => {
                failures.push(e.clone());
                continue;
            }
        };
        match check(row) {
            Ok(c) if c.passes() => checked.push(c),
            Ok(c) => failures.push(format!("data row {}: {}", i + 1, c.line())),
            Err(e) => failures.push(format!("data row {}: {}: {e}", i + 1, label(row))),
        }
    }
    finish(&format!("tables/{name}"), rows.len(), &checked, &failures);
}

/// The pairs that can have two valid states.
pub fn two_roots(a: Parameter, b: Parameter) -> bool {
    let mut p = [a, b];
    p.sort();
    p == [Parameter::Alkalinity, Parameter::Co3] || p == [Parameter::Dic, Parameter::Hco3]
}

/// Parameter `p` of a state as a measurement: the input that reproduces it.
pub fn measured_from(state: &State, p: Parameter) -> Measured {
    state
        .measured(p)
        .expect("outputs of a valid state are valid inputs")
}

/// Whether the ionic strength of a state follows its speciation (fresh
/// water whose ionic strength comes from the ions), so that a pair can fit
/// more self-consistent waters than it has roots at fixed constants.
fn ionic_strength_follows_speciation(s: &State) -> bool {
    use travertine::medium::IonicStrengthRoute::{AlkalinityOnly, MajorIons};
    matches!(s.ionic_strength_from, Some(MajorIons | AlkalinityOnly))
}

/// How much the alkalinity of a state is cancelled away: its largest parts
/// (carbonate alkalinity, free hydrogen, hydroxide) over the alkalinity
/// itself. Above 100 the alkalinity is less than 1 % of its parts, far
/// below what a titration resolves, and a pair that includes it is
/// ill-conditioned.
fn cancellation(s: &State) -> f64 {
    let parts = s.carbonate_alkalinity_umol_kg.abs()
        + s.free_hydrogen_umol_kg.abs()
        + s.hydroxide_umol_kg.abs();
    parts / s.alkalinity_umol_kg.abs()
}

/// Whether `state` reproduces the measured pair (`a`, `b`) of `base`: both
/// amounts within 1e-9 of the scale of the carbon and the acid.
fn fits_pair(state: &State, base: &State, a: Parameter, b: Parameter) -> bool {
    let amount = |s: &State, p: Parameter| match p {
        Parameter::Alkalinity => s.alkalinity_umol_kg,
        Parameter::Dic => s.dic_umol_kg,
        Parameter::Hco3 => s.hco3_umol_kg,
        Parameter::Co3 => s.co3_umol_kg,
        _ => f64::NAN,
    };
    let scale = base.dic_umol_kg + base.free_hydrogen_umol_kg + base.hydroxide_umol_kg;
    [a, b]
        .iter()
        .all(|p| (amount(state, *p) - amount(base, *p)).abs() <= 1e-9 * scale)
}

/// Solves `water` again from every usable pair of the outputs of `base` and
/// checks each result with `mismatch` (None: the same state). For the two
/// pairs that can have two roots, one of the two must be `base`, the
/// default must be the one nearer pH 8 (on the working scale `ph`), and it
/// must warn of the other; pairs whose roots lie within 0.1 pH of each
/// other are skipped (a near-double root), and so are pairs with an output
/// beyond the accepted range of its input. Where the ionic strength follows
/// the speciation, a two-root pair may fit a third self-consistent water:
/// then each root returned must reproduce the pair, and a pair whose
/// alkalinity is cancelled away (below 1 % of its parts) may fail to
/// converge. Returns the number of pairs checked.
pub fn check_every_pair(
    water: &Water,
    base: &State,
    ph: fn(&State) -> f64,
    mismatch: fn(&State, &State) -> Option<String>,
) -> Result<usize, TestCaseError> {
    let mut pairs = 0;
    for (i, &a) in Parameter::ALL.iter().enumerate() {
        for &b in &Parameter::ALL[i + 1..] {
            if a.is_gas() && b.is_gas() {
                continue;
            }
            // An output beyond what a measurement may be (CO3 below
            // 1e-6 µmol/kg in acid water, say) is no input to round-trip.
            let (Ok(ma), Ok(mb)) = (base.measured(a), base.measured(b)) else {
                continue;
            };
            if two_roots(a, b) {
                let feedback = ionic_strength_follows_speciation(base);
                let choose = |root| SolveOptions::default().with_root(root);
                let lower = water.solve_with(ma, mb, &choose(RootChoice::LowerPh));
                let higher = water.solve_with(ma, mb, &choose(RootChoice::HigherPh));
                // One side only: the other root fits no measurable water,
                // or (fresh water, near a double root) does not settle with
                // its own ionic strength and calcium and is refused naming
                // the other. The one side must be the state, and the
                // default; within 0.1 pH of a double root the pair is
                // skipped, as the tolerance policy says.
                if let (Ok(one), Err(e)) | (Err(e), Ok(one)) = (&lower, &higher) {
                    let other = one.warnings.iter().find_map(|w| match w {
                        travertine::Warning::OtherRoot { ph: p, .. } => Some(*p),
                        _ => None,
                    });
                    let near = other.is_some_and(|p| (p - ph(one)).abs() < 0.1);
                    if near && e.to_string().contains("does not settle") {
                        continue;
                    }
                    prop_assert!(
                        matches!(e, travertine::Error::NoWaterFits { .. }),
                        "{a:?}+{b:?}: {e}"
                    );
                    let m = mismatch(base, one);
                    // A third self-consistent water (see below) must fit the pair.
                    prop_assert!(
                        m.is_none() || (feedback && fits_pair(one, base, a, b)),
                        "{a:?}+{b:?}, the one root: {}",
                        m.unwrap_or_default()
                    );
                    let natural = water.solve(ma, mb);
                    prop_assert!(natural.is_ok(), "{a:?}+{b:?}: {:?}", natural.err());
                    let natural = natural.unwrap();
                    prop_assert!(mismatch(one, &natural).is_none());
                    pairs += 1;
                    continue;
                }
                // Both sides refused for want of convergence: allowed only
                // where the ionic strength follows the speciation and the
                // pair is ill-conditioned (its alkalinity cancelled away, or
                // the default refuses too), as DEVELOPERS.md says.
                let refused = |r: &Result<State, travertine::Error>| {
                    matches!(r, Err(travertine::Error::NoConvergence { .. }))
                };
                if feedback && refused(&lower) && refused(&higher) {
                    let natural = water.solve(ma, mb);
                    if cancellation(base) > 100.0 || refused(&natural) {
                        continue;
                    }
                }
                prop_assert!(
                    lower.is_ok() && higher.is_ok(),
                    "{a:?}+{b:?}: lower {:?}, higher {:?}",
                    lower.as_ref().err(),
                    higher.as_ref().err()
                );
                let (lower, higher) = (lower.unwrap(), higher.unwrap());
                if (ph(&lower) - ph(&higher)).abs() < 0.1 {
                    continue;
                }
                let ok = mismatch(base, &lower).is_none() || mismatch(base, &higher).is_none();
                if !ok && feedback {
                    prop_assert!(
                        fits_pair(&lower, base, a, b) && fits_pair(&higher, base, a, b),
                        "{a:?}+{b:?}: a root returned does not fit the pair"
                    );
                    pairs += 1;
                    continue;
                }
                prop_assert!(
                    ok,
                    "{a:?}+{b:?}: neither root returns the state; lower {:?}, higher {:?}",
                    mismatch(base, &lower),
                    mismatch(base, &higher)
                );
                let natural = water.solve(ma, mb);
                prop_assert!(
                    natural.is_ok(),
                    "{a:?}+{b:?}, nearer pH 8: {:?}",
                    natural.err()
                );
                let natural = natural.unwrap();
                let nearer = if (ph(&lower) - 8.0).abs() < (ph(&higher) - 8.0).abs() {
                    &lower
                } else {
                    &higher
                };
                prop_assert!(mismatch(nearer, &natural).is_none());
                prop_assert!(natural
                    .warnings
                    .iter()
                    .any(|w| w.to_string().contains("also fits")));
            } else {
                let s = water.solve(ma, mb);
                prop_assert!(s.is_ok(), "{a:?}+{b:?} failed: {:?}", s.err());
                let s = s.unwrap();
                let m = mismatch(base, &s);
                prop_assert!(m.is_none(), "{a:?}+{b:?}: {}", m.unwrap_or_default());
            }
            pairs += 1;
        }
    }
    Ok(pairs)
}

/// Any f64, with the awkward ones (NaN, infinities, zero) and plausible
/// ranges weighted in: for the no-panic property tests.
pub fn any_value() -> impl Strategy<Value = f64> {
    prop_oneof![
        any::<f64>(),
        Just(f64::NAN),
        Just(f64::INFINITY),
        Just(f64::NEG_INFINITY),
        Just(0.0),
        -10.0..60.0f64,
        0.0..10000.0f64,
    ]
}

/// Whether a plain decimal text has `n` significant figures: with a
/// point, `n` digits after the leading zeros; an integer, at least `n`
/// digits of which at most `n` before its trailing zeros (`3940` has 3 or
/// 4, `14120` 4 or 5).
pub fn has_figures(text: &str, n: usize) -> bool {
    let t = text.trim_start_matches('-');
    let digits: String = t.chars().filter(char::is_ascii_digit).collect();
    let digits = digits.trim_start_matches('0');
    if t.contains(['.', ',']) {
        digits.len() == n
    } else {
        digits.len() >= n && digits.trim_end_matches('0').len() <= n
    }
}

/// Runs the program with `args`, from the crate's folder, with `input` on
/// its standard input. A program that stops before reading its input (a
/// usage error) closes the pipe: that is its answer, not a failure.
#[cfg(feature = "cli")]
pub fn run_travertine(args: &[&str], input: Option<&[u8]>) -> std::process::Output {
    use std::io::Write;
    use std::process::{Command, Stdio};
    let mut child = Command::new(env!("CARGO_BIN_EXE_travertine"))
        .args(args)
        .current_dir(env!("CARGO_MANIFEST_DIR"))
        .stdin(Stdio::piped())
        .stdout(Stdio::piped())
        .stderr(Stdio::piped())
        .spawn()
        .expect("the binary runs");
    let mut stdin = child.stdin.take().expect("stdin");
    if let Some(bytes) = input {
        if let Err(e) = stdin.write_all(bytes) {
            assert_eq!(
                e.kind(),
                std::io::ErrorKind::BrokenPipe,
                "input written: {e}"
            );
        }
    }
    drop(stdin);
    child.wait_with_output().expect("the binary ends")
}

/// An invented fresh water described by its major ions (12 °C; calcium
/// 1.2, sodium 1.0, chloride 1.5, magnesium 0.3, sulfate 0.2 mmol/kg),
/// whose ionic strength comes from them: the uncertainty tests' water of
/// that route.
pub fn ions_water() -> Water {
    use travertine::{units::Amount, Composition, Conditions};
    Water::fresh(Conditions::new(12.0, 0.0).unwrap())
        .unwrap()
        .with_composition(
            Composition::default()
                .with_calcium(Amount::PerKg(1.2e-3))
                .and_then(|c| c.with_sodium(Amount::PerKg(1e-3)))
                .and_then(|c| c.with_chloride(Amount::PerKg(1.5e-3)))
                .and_then(|c| c.with_magnesium(Amount::PerKg(0.3e-3)))
                .and_then(|c| c.with_sulfate(Amount::PerKg(0.2e-3)))
                .unwrap(),
        )
}

/// An invented pond at `t_c` °C: salinity 0.2 (the route of its ionic
/// strength) and 1 mmol/kg of calcium, the uncertainty tests' fresh water
/// with calcium pairs.
pub fn calcium_pond(t_c: f64) -> Water {
    use travertine::{units::Amount, Composition, Conditions};
    Water::fresh(Conditions::new(t_c, 0.2).unwrap())
        .unwrap()
        .with_composition(
            Composition::default()
                .with_calcium(Amount::PerKg(1e-3))
                .unwrap(),
        )
}
