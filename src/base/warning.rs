//! Cautions that travel with a result. They are values, formatted only when
//! shown, so a solve that raises one stays cheap.

use crate::base::range::FitRange;
use serde::{Serialize, Serializer};
use smallvec::SmallVec;
use std::fmt;
use std::ops::Deref;

/// A caution about a result: a fit used outside its published range, a
/// second root, an approximation, or a note on an input not given.
///
/// Serialised as `{"code": ..., "severity": "note" | "warning", "message": ...}`.
///
/// # Example
/// ```
/// use travertine::{Conditions, Measured, Water};
/// let s = Water::saline(Conditions::new(25.0, 5.0)?)?
///     .solve(Measured::ph(7.8, None)?, Measured::dic_umol_kg(600.0)?)?;
/// // Perez & Fraga (1987) KF is published for salinity 10 to 40.
/// assert!(s.warnings.iter().any(|w| w.to_string().contains("perez-fraga1987")));
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub enum Warning {
    /// A fit used outside its published range.
    Extrapolated {
        /// The constant, for example "KF".
        constant: &'static str,
        /// The fit and its range.
        range: FitRange,
        /// Temperature used, °C.
        temperature_c: f64,
        /// Salinity used.
        salinity: f64,
    },
    /// A pair with two roots: the other one.
    OtherRoot {
        /// First parameter.
        first: &'static str,
        /// Second parameter.
        second: &'static str,
        /// pH of the other root on `scale`.
        ph: f64,
        /// The scale.
        scale: &'static str,
        /// Whether the other root has the higher pH.
        higher: bool,
    },
    /// In the overlap of the media (salinity 0.5 to 5), the other medium
    /// gives a pCO2 that differs by more than 5 %.
    MediaDisagree {
        /// Practical salinity of the sample.
        salinity: f64,
        /// The other medium, `fresh` or `saline`.
        other: &'static str,
        /// pCO2 in the other medium, µatm.
        pco2_uatm: f64,
        /// Its difference from this result, % of this result.
        percent: f64,
    },
    /// A fixed caution.
    Note {
        /// Its stable snake_case code.
        code: &'static str,
        /// Its message.
        text: &'static str,
    },
    /// A caution whose message carries figures.
    Text {
        /// Its stable snake_case code.
        code: &'static str,
        /// Its message.
        text: String,
    },
}

impl fmt::Display for Warning {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        match self {
            Warning::Extrapolated {
                constant,
                range,
                temperature_c,
                salinity,
            } => {
                let r = range;
                if r.salinity == (0.0, 0.0) {
                    write!(
                        f,
                        "{constant} ({}) is extrapolated: published for {} to {} °C, used at {} °C",
                        r.name, r.temperature_c.0, r.temperature_c.1, temperature_c
                    )
                } else {
                    write!(
                        f,
                        "{constant} ({}) is extrapolated: published for {} to {} °C and salinity \
                         {} to {}, used at {} °C and salinity {}",
                        r.name,
                        r.temperature_c.0,
                        r.temperature_c.1,
                        r.salinity.0,
                        r.salinity.1,
                        temperature_c,
                        (salinity * 1e4).round() / 1e4
                    )
                }
            }
            Warning::OtherRoot {
                first,
                second,
                ph,
                scale,
                higher,
            } => {
                let which = if *higher { "higher" } else { "lower" };
                write!(
                    f,
                    "{first} with {second} also fits a water of pH {ph:.4} ({scale} scale); ask \
                     for the {which}-pH root to get it"
                )
            }
            Warning::MediaDisagree {
                salinity,
                other,
                pco2_uatm,
                percent,
            } => write!(
                f,
                "at salinity {salinity:.3} both media apply, and they disagree: the {other} \
                 constants give pCO2 {} µatm, {percent:+.1} % from this result \
                 (mostly their K2; the default medium changes at salinity 1)",
                four_figures(*pco2_uatm)
            ),
            Warning::Note { text, .. } => f.write_str(text),
            Warning::Text { text, .. } => f.write_str(text),
        }
    }
}

/// A positive number to four significant figures, in plain notation
/// between 0.001 and 10⁶.
fn four_figures(v: f64) -> String {
    if !(1e-3..1e6).contains(&v.abs()) {
        return format!("{v:.3e}");
    }
    let decimals = (3 - v.abs().log10().floor() as i32).max(0) as usize;
    format!("{v:.decimals$}")
}

impl FitRange {
    /// Pushes a warning for `constant` when the conditions are outside the
    /// range. A fit with a salinity range of (0, 0) is a pure-water fit and is
    /// checked on temperature alone.
    ///
    /// ```
    /// # use travertine::fits::FitRange;
    /// let r = FitRange::new("mucci1983", (5.0, 40.0), (5.0, 44.0));
    /// let mut w = Vec::new();
    /// r.check_for("calcite and aragonite", 2.0, 35.0, &mut w);
    /// assert!(w[0].to_string().contains("mucci1983"));
    /// ```
    pub fn check_for(
        &self,
        constant: &'static str,
        temperature_c: f64,
        salinity: f64,
        warnings: &mut Vec<Warning>,
    ) {
        let s = if self.salinity == (0.0, 0.0) {
            0.0
        } else {
            salinity
        };
        if !self.contains(temperature_c, s) {
            warnings.push(Warning::Extrapolated {
                constant,
                range: *self,
                temperature_c,
                salinity,
            });
        }
    }
}

impl Warning {
    /// The stable snake_case code of this caution, for programs that act on
    /// it: `fit_extrapolated`, `other_root`, `media_disagree`, or the code
    /// a note or text was raised with (`calcium_not_given`, ...).
    ///
    /// ```
    /// use travertine::{Conditions, Measured, Water};
    /// let s = Water::saline(Conditions::new(25.0, 5.0)?)?
    ///     .solve(Measured::ph(7.8, None)?, Measured::dic_umol_kg(600.0)?)?;
    /// assert!(s.warnings.iter().any(|w| w.code() == "fit_extrapolated"));
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn code(&self) -> &'static str {
        match self {
            Warning::Extrapolated { .. } => "fit_extrapolated",
            Warning::OtherRoot { .. } => "other_root",
            Warning::MediaDisagree { .. } => "media_disagree",
            Warning::Note { code, .. } | Warning::Text { code, .. } => code,
        }
    }
}

/// How much a caution matters.
///
/// ```
/// use travertine::base::warning::Severity;
/// assert_eq!(Severity::Note.name(), "note");
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
#[non_exhaustive]
pub enum Severity {
    /// Information about an input that was not given (no calcium, so no
    /// saturation), or the size of a correction too small to matter: the
    /// result is what was asked for.
    Note,
    /// The result may be wrong or is extrapolated: a fit out of its range,
    /// another root, an approximation, an input not used.
    Warning,
}

/// The plain name, as in the JSON: `note` or `warning`.
///
/// ```
/// use travertine::base::warning::Severity;
/// assert_eq!(Severity::Warning.to_string(), "warning");
/// ```
impl fmt::Display for Severity {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

impl Severity {
    /// The plain name, as in the JSON.
    pub fn name(self) -> &'static str {
        match self {
            Severity::Note => "note",
            Severity::Warning => "warning",
        }
    }
}

/// The codes of the cautions that are notes: each says what was not
/// computed, or how a missing input was taken, because an optional input
/// was not given; or the size of a correction too small to change a
/// conclusion (the pressure correction of a fresh water at lake depths,
/// see [`crate::flow::FRESH_PRESSURE_CAUTION`]).
const NOTE_CODES: &[&str] = &[
    "calcium_not_given",
    "ionic_strength_from_carbonate",
    "hardness_not_calcium",
    "langelier_not_computed",
    "magnesium_from_hardness",
    "calcium_from_hardness",
    "blend_medium",
    "blend_calcium_unknown",
    // issue 11: depth profiles
    "fresh_pressure_effect_small",
    // issue 11: air–water CO2 exchange
    "barometric_from_elevation",
    "barometric_default",
    "air_co2_default",
    "transfer_velocity_not_given",
    "exchange_below_surface",
    "equilibrium_not_computed",
];

impl Warning {
    /// Whether this is a note (an optional input not given) or a warning
    /// (the result may be wrong or is extrapolated).
    ///
    /// ```
    /// use travertine::{base::warning::Severity, Conditions, Measured, Water};
    /// let pond = Water::fresh(Conditions::new(20.0, 0.2)?)?
    ///     .solve(Measured::ph(7.5, None)?, Measured::alkalinity_umol_kg(1500.0)?)?;
    /// let calcium = pond.warnings.iter().find(|w| w.code() == "calcium_not_given").unwrap();
    /// assert_eq!(calcium.severity(), Severity::Note);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn severity(&self) -> Severity {
        if NOTE_CODES.contains(&self.code()) {
            Severity::Note
        } else {
            Severity::Warning
        }
    }
}

impl Serialize for Warning {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        use serde::ser::SerializeStruct;
        let mut s = serializer.serialize_struct("Warning", 3)?;
        s.serialize_field("code", self.code())?;
        s.serialize_field("severity", self.severity().name())?;
        s.serialize_field("message", &self.to_string())?;
        s.end()
    }
}

/// The cautions of a result, in order. Most results carry none or one, so
/// the first is held in place and only a second one allocates: a solve
/// that raises a caution (a second root, a fit used out of range) stays
/// free of heap allocation. Reads as a slice of [`Warning`]; serialised as
/// a JSON array of `{code, severity, message}` objects.
///
/// ```
/// use travertine::{Conditions, Measured, Water};
/// let s = Water::saline(Conditions::new(25.0, 35.0)?)?
///     .solve(Measured::dic_umol_kg(2000.0)?, Measured::hco3_umol_kg(1777.7)?)?;
/// assert_eq!(s.warnings.len(), 1); // the other root
/// assert!(s.warnings.iter().any(|w| w.to_string().contains("also fits")));
/// let json = serde_json::to_value(&s.warnings).unwrap();
/// assert_eq!(json[0]["code"], "other_root");
/// assert_eq!(json[0]["severity"], "warning");
/// assert!(json[0]["message"].as_str().unwrap().contains("also fits"));
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, PartialEq, Default)]
#[non_exhaustive]
pub struct Warnings(SmallVec<[Warning; 1]>);

// By hand for the common case, no caution: `SmallVec`'s own clone goes
// through an iterator even when empty, a few hundred instructions paid by
// every clone of a `Water` (each `State` holds one), which the propagation
// of uncertainties makes once per source.
impl Clone for Warnings {
    fn clone(&self) -> Self {
        if self.0.is_empty() {
            Warnings::new()
        } else {
            Warnings(self.0.clone())
        }
    }
}

impl Warnings {
    /// No cautions.
    ///
    /// ```
    /// # use travertine::base::warning::Warnings;
    /// assert!(Warnings::new().is_empty());
    /// ```
    pub fn new() -> Self {
        Warnings(SmallVec::new())
    }

    /// Adds a caution at the end.
    pub(crate) fn push(&mut self, w: Warning) {
        self.0.push(w);
    }

    /// These cautions after `first`, in order.
    /// Replaces any [`Warning::OtherRoot`] among these with `w` (fresh
    /// water settles each root at its own ionic strength and calcium).
    pub(crate) fn replace_other_root(&mut self, w: Option<Warning>) {
        self.0.retain(|x| !matches!(x, Warning::OtherRoot { .. }));
        if let Some(w) = w {
            self.0.push(w);
        }
    }

    pub(crate) fn after(self, first: &[Warning]) -> Self {
        if first.is_empty() {
            return self;
        }
        let mut all = SmallVec::with_capacity(first.len() + self.0.len());
        all.extend(first.iter().cloned());
        all.extend(self.0);
        Warnings(all)
    }
}

impl Deref for Warnings {
    type Target = [Warning];
    fn deref(&self) -> &[Warning] {
        &self.0
    }
}

impl<'a> IntoIterator for &'a Warnings {
    type Item = &'a Warning;
    type IntoIter = std::slice::Iter<'a, Warning>;
    fn into_iter(self) -> Self::IntoIter {
        self.0.iter()
    }
}

impl From<Warnings> for Vec<Warning> {
    fn from(w: Warnings) -> Self {
        w.0.into_vec()
    }
}

impl Serialize for Warnings {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        self.0.as_slice().serialize(serializer)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Every code is snake_case, and the codes raised in the crate's own
    /// source (`code: "..."`) are each used for one caution only.
    #[test]
    fn codes_are_snake_case_and_each_names_one_caution() {
        // Digits as in the output keys (`air_co2_default`), never first.
        let snake = |c: &str| {
            c.starts_with(|ch: char| ch.is_ascii_lowercase())
                && c.chars()
                    .all(|ch| ch.is_ascii_lowercase() || ch.is_ascii_digit() || ch == '_')
                && !c.ends_with('_')
        };
        let fixed = [
            Warning::OtherRoot {
                first: "alkalinity",
                second: "co3",
                ph: 9.0,
                scale: "total",
                higher: true,
            },
            Warning::MediaDisagree {
                salinity: 1.0,
                other: "fresh",
                pco2_uatm: 400.0,
                percent: 10.0,
            },
        ];
        for w in &fixed {
            assert!(snake(w.code()), "{}", w.code());
        }
        let mut seen = std::collections::BTreeSet::new();
        let mut files = Vec::new();
        let mut folders = vec![std::path::PathBuf::from(concat!(
            env!("CARGO_MANIFEST_DIR"),
            "/src"
        ))];
        while let Some(folder) = folders.pop() {
            for entry in std::fs::read_dir(&folder).expect("src readable") {
                let path = entry.expect("entry").path();
                if path.is_dir() {
                    folders.push(path);
                } else if path.extension().is_some_and(|e| e == "rs")
                    && !path.ends_with("warning.rs")
                {
                    files.push(path);
                }
            }
        }
        for file in files {
            let file = file.display().to_string();
            let text = std::fs::read_to_string(&file).expect("source readable");
            for part in text.split("code: \"").skip(1) {
                let code = part.split('"').next().unwrap_or_default();
                assert!(snake(code), "{file}: {code}");
                assert!(seen.insert(code.to_string()), "{file}: {code} used twice");
            }
        }
        assert!(seen.len() >= 10, "only {} codes found", seen.len());
    }

    #[test]
    fn warnings_keep_their_order_past_the_inline_one() {
        let mut w = Warnings::new();
        let note = |text| Warning::Note { code: "test", text };
        w.push(note("third"));
        w.push(note("fourth"));
        let all = w.after(&[note("first"), note("second")]);
        let text: Vec<String> = all.iter().map(|w| w.to_string()).collect();
        assert_eq!(text, ["first", "second", "third", "fourth"]);
        assert_eq!(Vec::from(all).len(), 4);
        assert!(Warnings::new().after(&[]).is_empty());
    }
}
