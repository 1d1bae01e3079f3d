//! Profiles: the limits the quality flags ([`crate::decisions::flags()`])
//! are judged against, read from small TOML files.
//!
//! A profile is a TOML file with a description, an optional profile it is
//! based on, a list of flags switched off, and two tables of limits:
//!
//! ```toml
//! description = "our trout raceways"
//! based_on = "cold-water-fish"      # a built-in profile; `general` if left out
//! off = ["alkalinity_low"]          # flags not raised under this profile
//!
//! [limits]
//! free_co2_high_mg_l = 12.0         # overrides the profile it is based on
//!
//! [plausibility]
//! pco2_high_uatm = 150000.0
//! ```
//!
//! Every key a file gives overrides the profile it is based on; every key
//! it leaves out keeps that profile's value. An unknown key is an error
//! naming the key and its line, and so is a value of the wrong type or
//! outside its accepted range.
//!
//! The built-in profiles are TOML files of the same form in the crate's
//! `profiles/` folder, compiled in:
//!
//! | name | for | differs from `general` |
//! |---|---|---|
//! | `general` (the default) | ponds, lakes and tanks, no one species in mind | |
//! | `cold-water-fish` | trout, salmon | free CO2 above 10 mg/L, NH3 above 0.010 mg/L as N |
//! | `shellfish-hatchery` | bivalve larvae | aragonite Ω below 1.5 |
//!
//! Each limit is common practice (and marked so in the files, with its
//! source where there is one); limits depend on the species, its life stage
//! and the exposure.
//!
//! ```
//! use travertine::decisions::Profile;
//! let general = Profile::default();
//! assert_eq!(general.name(), "general");
//! assert_eq!(general.limits.free_co2_high_mg_l, Some(20.0));
//! let trout = Profile::built_in("cold-water-fish")?;
//! assert_eq!(trout.limits.free_co2_high_mg_l, Some(10.0));
//! assert_eq!(trout.limits.ph_low_nbs, Some(6.5)); // from `general`
//! let mine = Profile::from_toml("[limits]\nfree_co2_high_mg_l = 15\n", "mine.toml")?;
//! assert_eq!(mine.limits.free_co2_high_mg_l, Some(15.0));
//! assert_eq!(mine.limits.nh3_high_mg_l_n, Some(0.05)); // from `general`
//! # Ok::<(), travertine::Error>(())
//! ```

use crate::base::error::{Error, Result};
use serde::{Deserialize, Serialize};
use std::ops::Range;
use std::sync::OnceLock;
use toml::Spanned;

/// The name of the profile used when none is chosen.
pub const DEFAULT_PROFILE: &str = "general";

/// The built-in profiles: each name with its TOML text (the files of the
/// crate's `profiles/` folder).
const BUILT_IN: &[(&str, &str)] = &[
    ("general", include_str!("../../profiles/general.toml")),
    (
        "cold-water-fish",
        include_str!("../../profiles/cold-water-fish.toml"),
    ),
    (
        "shellfish-hatchery",
        include_str!("../../profiles/shellfish-hatchery.toml"),
    ),
];

/// Generates a public table of settings (each an `Option<f64>`, `None`
/// for a flag switched off), the struct its TOML table is read into, and
/// the code that lays one over the other with each value checked against
/// its range.
macro_rules! settings {
    (
        $(#[$meta:meta])* $public:ident, $file:ident, $table:literal,
        { $( $(#[$doc:meta])* $key:ident: $code:literal, [$lo:expr, $hi:expr], $unit:literal; )* }
    ) => {
        $(#[$meta])*
        #[derive(Debug, Clone, Copy, PartialEq, Default, Serialize)]
        #[non_exhaustive]
        pub struct $public {
            $( $(#[$doc])* pub $key: Option<f64>, )*
        }

        /// The TOML table, as written.
        #[derive(Debug, Default, Deserialize)]
        #[serde(deny_unknown_fields)]
        struct $file {
            $( $key: Option<Spanned<f64>>, )*
        }

        impl $public {
            /// The codes of the flags these settings belong to.
            const CODES: &'static [&'static str] = &[ $( $code, )* ];

            /// Switches off every setting of the flag `code`.
            fn switch_off(&mut self, code: &str) {
                $( if code == $code { self.$key = None; } )*
            }
        }

        impl $file {
            /// Lays the values given over `onto`, each checked against its range.
            fn overlay(&self, onto: &mut $public, text: &Text) -> Result<()> {
                $(
                    if let Some(v) = &self.$key {
                        let x = *v.get_ref();
                        if !(x.is_finite() && ($lo..=$hi).contains(&x)) {
                            return Err(text.error(
                                Some(v.span()),
                                Some(concat!($table, ".", stringify!($key)).to_string()),
                                format!(
                                    "{} is outside the accepted range {} to {}{}",
                                    x, $lo, $hi, $unit
                                ),
                            ));
                        }
                        onto.$key = Some(x);
                    }
                )*
                Ok(())
            }

            /// The span of the value of `key`, where the file gives it.
            #[allow(dead_code)]
            fn span_of(&self, key: &str) -> Option<Range<usize>> {
                $( if key == stringify!($key) { return self.$key.as_ref().map(|v| v.span()); } )*
                None
            }
        }
    };
}

settings! {
    /// The limits of the quality flags of water quality. `None` is a flag
    /// switched off. A `_high` limit fires above it (>), a `_low` limit
    /// below it (<); a value equal to its limit raises no flag. A limit
    /// that is not finite never fires.
    Limits, LimitsFile, "limits", {
        /// `free_co2_high`: free CO2 (CO2*) above this, mg/L.
        free_co2_high_mg_l: "free_co2_high", [0.0, 1000.0], " mg/L";
        /// `nh3_high`: un-ionised ammonia above this, mg/L as N.
        nh3_high_mg_l_n: "nh3_high", [0.0, 100.0], " mg/L as N";
        /// `alkalinity_low`: total alkalinity below this, mg/L as CaCO3.
        alkalinity_low_mg_l_caco3: "alkalinity_low", [0.0, 10000.0], " mg/L as CaCO3";
        /// `ph_low`: pH on the NBS scale below this.
        ph_low_nbs: "ph_low", [0.0, 14.0], "";
        /// `ph_high`: pH on the NBS scale above this.
        ph_high_nbs: "ph_high", [0.0, 14.0], "";
        /// `omega_aragonite_low`: aragonite saturation state Ω below this.
        omega_aragonite_low: "omega_aragonite_low", [0.0, 100.0], "";
    }
}

settings! {
    /// The settings of the plausibility checks: samples that the chemistry
    /// says are unlikely as measured. `None` is a check switched off.
    Plausibility, PlausibilityFile, "plausibility", {
        /// `organic_acid_bias`: fires below this pH (NBS) ...
        organic_acid_ph_below_nbs: "organic_acid_bias", [0.0, 14.0], "";
        /// ... and this alkalinity, µmol/kg, when pH and alkalinity were
        /// the measured pair.
        organic_acid_alkalinity_below_umol_kg: "organic_acid_bias", [0.0, 100000.0], " µmol/kg";
        /// `implausible_sample`: the least specific conductance, µS/cm at
        /// 25 °C, that each meq/L of alkalinity brings with it.
        conductance_per_alkalinity_min_us_cm_per_meq_l: "implausible_sample", [0.0, 1000.0], " µS/cm per meq/L";
        /// `implausible_sample`: pCO2 above this, µatm.
        pco2_high_uatm: "implausible_sample", [0.0, 10000000.0], " µatm";
    }
}

/// A profile as written in TOML.
#[derive(Debug, Deserialize)]
#[serde(deny_unknown_fields)]
struct ProfileFile {
    description: Option<String>,
    based_on: Option<Spanned<String>>,
    #[serde(default)]
    off: Vec<Spanned<String>>,
    #[serde(default)]
    limits: LimitsFile,
    #[serde(default)]
    plausibility: PlausibilityFile,
}

/// A set of limits for the quality flags: a built-in profile or one read
/// from a TOML file (see the [module documentation](self) for the form).
///
/// ```
/// use travertine::decisions::Profile;
/// let p = Profile::from_arg("shellfish-hatchery")?;
/// assert_eq!(p.limits.omega_aragonite_low, Some(1.5));
/// assert_eq!(Profile::default().limits.omega_aragonite_low, None);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub struct Profile {
    name: String,
    description: String,
    /// The limits of the water-quality flags.
    pub limits: Limits,
    /// The settings of the plausibility checks.
    pub plausibility: Plausibility,
}

/// The TOML text of a profile and where it came from, for messages.
struct Text<'a> {
    origin: &'a str,
    text: &'a str,
}

impl Text<'_> {
    /// The error at byte range `span` of the text: its line, and the key
    /// (with its table) written on that line unless one is given.
    fn error(&self, span: Option<Range<usize>>, key: Option<String>, problem: String) -> Error {
        let line = span.map(|s| {
            let at = s.start.min(self.text.len());
            self.text.get(..at).map_or(0, |t| t.matches('\n').count()) + 1
        });
        let key = key.or_else(|| line.and_then(|l| self.key_on_line(l)));
        Error::BadProfile {
            origin: self.origin.to_string(),
            line,
            key,
            problem,
        }
    }

    /// The key written on line `line` (from 1), with the table it is in:
    /// `limits.free_co2_high_mg_l`; a table header names its table.
    fn key_on_line(&self, line: usize) -> Option<String> {
        let lines: Vec<&str> = self.text.lines().collect();
        let here = lines.get(line.checked_sub(1)?)?.trim();
        let header = |l: &str| {
            let l = l.trim();
            (l.starts_with('[') && !l.starts_with("[[")).then(|| {
                l.trim_start_matches('[')
                    .split(']')
                    .next()
                    .unwrap_or("")
                    .trim()
                    .to_string()
            })
        };
        if let Some(table) = header(here) {
            return Some(table);
        }
        let key = here.split('=').next()?.trim().trim_matches('"').trim();
        if key.is_empty() || key.starts_with('#') {
            return None;
        }
        let table = lines[..line - 1].iter().rev().find_map(|l| header(l));
        Some(match table {
            Some(t) if !t.is_empty() => format!("{t}.{key}"),
            _ => key.to_string(),
        })
    }
}

impl Default for Profile {
    /// The default profile, `general`.
    fn default() -> Self {
        Profile::shared_default().clone()
    }
}

impl Profile {
    /// The names of the built-in profiles, the default first.
    ///
    /// ```
    /// use travertine::decisions::Profile;
    /// assert_eq!(Profile::BUILT_IN_NAMES[0], "general");
    /// ```
    pub const BUILT_IN_NAMES: &'static [&'static str] =
        &["general", "cold-water-fish", "shellfish-hatchery"];

    /// The codes of every flag a profile can switch off.
    ///
    /// ```
    /// use travertine::decisions::Profile;
    /// assert!(Profile::flag_codes().contains(&"nh3_high"));
    /// ```
    pub fn flag_codes() -> Vec<&'static str> {
        let mut codes: Vec<&'static str> = Vec::new();
        for c in Limits::CODES.iter().chain(Plausibility::CODES) {
            if !codes.contains(c) {
                codes.push(c);
            }
        }
        codes
    }

    /// A profile with every flag off, named `name`.
    fn nothing(name: &str) -> Profile {
        Profile {
            name: name.to_string(),
            description: String::new(),
            limits: Limits::default(),
            plausibility: Plausibility::default(),
        }
    }

    /// The default profile, read once.
    pub(crate) fn shared_default() -> &'static Profile {
        static DEFAULT: OnceLock<Profile> = OnceLock::new();
        DEFAULT.get_or_init(|| {
            // The built-in texts are checked by the tests; should one fail
            // to read, no flag is raised rather than a panic.
            Profile::built_in(DEFAULT_PROFILE).unwrap_or_else(|_| Profile::nothing(DEFAULT_PROFILE))
        })
    }

    /// The name: a built-in name, or the path of the file it was read from.
    ///
    /// ```
    /// # use travertine::decisions::Profile;
    /// assert_eq!(Profile::built_in("shellfish-hatchery")?.name(), "shellfish-hatchery");
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn name(&self) -> &str {
        &self.name
    }

    /// The description, as written in the profile (empty where it has none).
    ///
    /// ```
    /// # use travertine::decisions::Profile;
    /// assert!(Profile::default().description().contains("common practice"));
    /// ```
    pub fn description(&self) -> &str {
        &self.description
    }

    /// A built-in profile by name (see [`Profile::BUILT_IN_NAMES`]).
    ///
    /// # Errors
    /// [`Error::BadProfile`] for a name that is not built in, listing
    /// those that are.
    ///
    /// ```
    /// # use travertine::decisions::Profile;
    /// assert!(Profile::built_in("cold-water-fish").is_ok());
    /// let e = Profile::built_in("trout").unwrap_err();
    /// assert!(e.to_string().contains("general, cold-water-fish, shellfish-hatchery"));
    /// ```
    pub fn built_in(name: &str) -> Result<Profile> {
        let Some((name, text)) = BUILT_IN.iter().find(|(n, _)| *n == name) else {
            return Err(Error::BadProfile {
                origin: format!("`{name}`"),
                line: None,
                key: None,
                problem: format!(
                    "not a built-in profile; built in: {}",
                    Profile::BUILT_IN_NAMES.join(", ")
                ),
            });
        };
        // `general` is the root: it is read over no profile; the others
        // are read over the one they name (or `general`).
        let root = *name == DEFAULT_PROFILE;
        parse(text, name, name, root)
    }

    /// A profile from TOML text; `origin` names it in messages (a file
    /// path, say) and becomes its name. It is laid over the built-in
    /// profile named by its `based_on` key, or over `general`.
    ///
    /// # Errors
    /// [`Error::BadProfile`], naming the line and the key, for TOML that
    /// does not parse, an unknown key, a value of the wrong type or outside
    /// its range, a `ph_low_nbs` not below `ph_high_nbs`, an unknown
    /// `based_on` profile or an unknown flag code under `off`.
    ///
    /// ```
    /// use travertine::decisions::Profile;
    /// let e = Profile::from_toml("[limits]\nfree_co2_high = 12\n", "pond.toml").unwrap_err();
    /// let m = e.to_string();
    /// assert!(m.contains("pond.toml") && m.contains("line 2") && m.contains("free_co2_high"), "{m}");
    /// let off = Profile::from_toml("off = [\"alkalinity_low\"]\n", "soft.toml")?;
    /// assert_eq!(off.limits.alkalinity_low_mg_l_caco3, None);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn from_toml(text: &str, origin: &str) -> Result<Profile> {
        parse(text, origin, origin, false)
    }

    /// A profile from a TOML file (see [`Profile::from_toml`]).
    ///
    /// # Errors
    /// [`Error::BadProfile`] for a file that cannot be read, and as
    /// [`Profile::from_toml`].
    ///
    /// ```
    /// # use travertine::decisions::Profile;
    /// let e = Profile::from_file("no/such/profile.toml").unwrap_err();
    /// assert!(e.to_string().contains("no/such/profile.toml"));
    /// ```
    pub fn from_file(path: impl AsRef<std::path::Path>) -> Result<Profile> {
        let path = path.as_ref();
        let origin = path.display().to_string();
        let text = std::fs::read_to_string(path).map_err(|e| Error::BadProfile {
            origin: origin.clone(),
            line: None,
            key: None,
            problem: format!(
                "cannot be read ({e}); give a built-in name ({}) or the path of a TOML file",
                Profile::BUILT_IN_NAMES.join(", ")
            ),
        })?;
        Profile::from_toml(&text, &origin)
    }

    /// The profile an argument names: a built-in name, else the path of a
    /// TOML file. A built-in name wins over a file of the same name in the
    /// working folder; write `./general` for the file.
    ///
    /// # Errors
    /// As [`Profile::from_file`].
    ///
    /// ```
    /// # use travertine::decisions::Profile;
    /// assert_eq!(Profile::from_arg("general")?, Profile::default());
    /// assert!(Profile::from_arg("no-such-profile").is_err());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn from_arg(arg: &str) -> Result<Profile> {
        match Profile::built_in(arg) {
            Ok(p) => Ok(p),
            Err(_) => Profile::from_file(arg),
        }
    }
}

/// Reads `text` as a profile named `name`: over nothing where it is the
/// root profile, else over its `based_on` profile or `general`.
fn parse(text: &str, origin: &str, name: &str, root: bool) -> Result<Profile> {
    let t = Text { origin, text };
    let file: ProfileFile = toml::from_str(text).map_err(|e| {
        let message = e.message().trim().replace('\n', " ");
        t.error(e.span(), None, message)
    })?;
    let mut profile = match (&file.based_on, root) {
        (Some(b), true) => {
            return Err(t.error(
                Some(b.span()),
                Some("based_on".to_string()),
                format!("the root profile `{name}` is based on no other"),
            ))
        }
        (None, true) => Profile::nothing(name),
        (Some(b), false) => {
            let base = b.get_ref().trim();
            if base == name {
                return Err(t.error(
                    Some(b.span()),
                    Some("based_on".to_string()),
                    "a profile cannot be based on itself".to_string(),
                ));
            }
            Profile::built_in(base).map_err(|_| {
                t.error(
                    Some(b.span()),
                    Some("based_on".to_string()),
                    format!(
                        "`{base}` is not a built-in profile; built in: {}",
                        Profile::BUILT_IN_NAMES.join(", ")
                    ),
                )
            })?
        }
        (None, false) => Profile::shared_default().clone(),
    };
    profile.name = name.to_string();
    if let Some(d) = file.description {
        profile.description = d;
    }
    file.limits.overlay(&mut profile.limits, &t)?;
    file.plausibility.overlay(&mut profile.plausibility, &t)?;
    if let (Some(lo), Some(hi)) = (profile.limits.ph_low_nbs, profile.limits.ph_high_nbs) {
        if lo >= hi {
            let span = file
                .limits
                .span_of("ph_low_nbs")
                .or_else(|| file.limits.span_of("ph_high_nbs"));
            return Err(t.error(
                span,
                Some("limits.ph_low_nbs".to_string()),
                format!("ph_low_nbs {lo} is not below ph_high_nbs {hi}"),
            ));
        }
    }
    let codes = Profile::flag_codes();
    for code in &file.off {
        let c = code.get_ref().trim();
        if !codes.contains(&c) {
            return Err(t.error(
                Some(code.span()),
                Some("off".to_string()),
                format!("`{c}` is not a flag; flags: {}", codes.join(", ")),
            ));
        }
        profile.limits.switch_off(c);
        profile.plausibility.switch_off(c);
    }
    Ok(profile)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_built_in_profile_reads_and_is_listed() {
        let listed: Vec<&str> = BUILT_IN.iter().map(|(n, _)| *n).collect();
        assert_eq!(listed, Profile::BUILT_IN_NAMES);
        for name in Profile::BUILT_IN_NAMES {
            let p = Profile::built_in(name).unwrap_or_else(|e| panic!("{name}: {e}"));
            assert_eq!(p.name(), *name);
            assert!(p
                .description()
                .contains("limits depend on species and life stage"));
            // Every built-in carries the plausibility checks.
            assert!(p.plausibility.pco2_high_uatm.is_some(), "{name}");
        }
        assert_eq!(Profile::default().name(), DEFAULT_PROFILE);
    }

    #[test]
    fn the_general_profile_has_the_issue_defaults() {
        // Common practice, as quoted in profiles/general.toml.
        let g = Profile::default();
        assert_eq!(g.limits.free_co2_high_mg_l, Some(20.0));
        assert_eq!(g.limits.nh3_high_mg_l_n, Some(0.05));
        assert_eq!(g.limits.alkalinity_low_mg_l_caco3, Some(20.0));
        assert_eq!(g.limits.ph_low_nbs, Some(6.5));
        assert_eq!(g.limits.ph_high_nbs, Some(9.0));
        assert_eq!(g.limits.omega_aragonite_low, None);
    }

    #[test]
    fn the_key_of_an_error_is_found_with_its_table() {
        let text = "description = \"x\"\n\n[limits]\n# a comment\nph_low_nbs = 6\n";
        let t = Text {
            origin: "x.toml",
            text,
        };
        assert_eq!(t.key_on_line(5).as_deref(), Some("limits.ph_low_nbs"));
        assert_eq!(t.key_on_line(3).as_deref(), Some("limits"));
        assert_eq!(t.key_on_line(1).as_deref(), Some("description"));
        assert_eq!(t.key_on_line(4), None);
        assert_eq!(t.key_on_line(99), None);
    }

    #[test]
    fn the_root_profile_may_not_be_based_on_another() {
        let e = parse("based_on = \"general\"\n", "general", "general", true).unwrap_err();
        assert!(e.to_string().contains("based_on"), "{e}");
        let e = Profile::from_toml("based_on = \"x.toml\"\n", "x.toml").unwrap_err();
        assert!(e.to_string().contains("itself"), "{e}");
    }
}
