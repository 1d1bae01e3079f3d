//! The JSON of a state, written from the list of outputs.

use super::fields::Output;
use crate::decisions::{flags, Profile};
use crate::state::State;
use serde::ser::{Serialize, SerializeStruct, Serializer};

/// One flat object: every key of [`Output::ALL`] in its order, always
/// present (`null` where the state has no value, for example the
/// fresh-water figures of a saline water, and for a number that is not
/// finite), then `constants` (the fit used for each constant), `warnings`,
/// `flags`, the quality flags of the default profile (see [`Judged`] for
/// another), and `flags_profile`, its name (`general`).
///
/// ```
/// use travertine::{Conditions, Measured, Water};
/// let s = Water::saline(Conditions::new(25.0, 35.0)?)?
///     .solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
/// let v = serde_json::to_value(&s).unwrap();
/// assert_eq!(v["water"], "saline");
/// assert_eq!(v["carbonic_fit"], "lueker2000");
/// assert!(v["langelier_index"].is_null());
/// assert_eq!(v["constants"]["carbonic"], "lueker2000");
/// # Ok::<(), travertine::Error>(())
/// ```
impl Serialize for State {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        Judged::new(self, Profile::shared_default()).serialize(serializer)
    }
}

/// A state with the quality flags of a profile: serialises as the state
/// does (`impl Serialize for State`), with `flags` judged against
/// `profile`, an array of `{code, message, value, threshold}` objects
/// ([`crate::decisions::Flag`]), empty when none is raised, and then
/// `flags_profile`, the name of the profile.
///
/// ```
/// use travertine::decisions::Profile;
/// use travertine::output::Judged;
/// use travertine::{Conditions, Measured, Water};
/// let pond = Water::fresh(Conditions::new(18.0, 0.1)?)?
///     .solve(Measured::ph(7.4, None)?, Measured::alkalinity_umol_kg(3000.0)?)?;
/// let trout = Profile::built_in("cold-water-fish")?;
/// let v = serde_json::to_value(Judged::new(&pond, &trout)).unwrap();
/// assert_eq!(v["flags"][0]["code"], "free_co2_high");
/// assert_eq!(v["flags"][0]["threshold"], 10.0);
/// // The default profile allows 20 mg/L.
/// assert!(serde_json::to_value(&pond).unwrap()["flags"].as_array().unwrap().is_empty());
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy)]
pub struct Judged<'a> {
    state: &'a State,
    profile: &'a Profile,
}

impl<'a> Judged<'a> {
    /// `state` judged against `profile`.
    ///
    /// ```
    /// # use travertine::{decisions::Profile, output::Judged, Conditions, Measured, Water};
    /// # let s = Water::saline(Conditions::new(25.0, 35.0)?)?
    /// #     .solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
    /// let p = Profile::default();
    /// let _ = Judged::new(&s, &p);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn new(state: &'a State, profile: &'a Profile) -> Self {
        Judged { state, profile }
    }
}

impl Serialize for Judged<'_> {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        let s = self.state;
        let mut object = serializer.serialize_struct("State", Output::ALL.len() + 4)?;
        for o in Output::ALL {
            object.serialize_field(o.key(), &o.value(s))?;
        }
        object.serialize_field("constants", &s.fits_used)?;
        object.serialize_field("warnings", &s.warnings)?;
        // issue 11: quality flags, and the profile that judged them (the
        // default `general` where none was chosen).
        object.serialize_field("flags", &flags(s, self.profile))?;
        object.serialize_field("flags_profile", self.profile.name())?;
        object.end()
    }
}

/// One flat JSON object of a state (see `impl Serialize for State`). When
/// `measured` is given (the state at the conditions of measurement), it is
/// added under the key `as_measured`.
///
/// # Example
/// ```
/// use travertine::{output::json, Conditions, Measured, Water};
/// let s = Water::saline(Conditions::new(25.0, 35.0)?)?
///     .solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
/// let v: serde_json::Value = serde_json::from_str(&json(&s, None)).unwrap();
/// assert_eq!(v["water"], "saline");
/// assert!(v["warnings"].as_array().unwrap().is_empty());
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn json(state: &State, measured: Option<&State>) -> String {
    json_with_profile(state, measured, Profile::shared_default())
}

/// As [`json`], with the quality flags of `profile` (in `as_measured`
/// too).
///
/// ```
/// use travertine::{decisions::Profile, output::json_with_profile, Conditions, Measured, Water};
/// let s = Water::fresh(Conditions::new(18.0, 0.1)?)?
///     .solve(Measured::ph(7.4, None)?, Measured::alkalinity_umol_kg(3000.0)?)?;
/// let trout = Profile::built_in("cold-water-fish")?;
/// let v: serde_json::Value = serde_json::from_str(&json_with_profile(&s, None, &trout)).unwrap();
/// assert_eq!(v["flags"][0]["code"], "free_co2_high");
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn json_with_profile(state: &State, measured: Option<&State>, profile: &Profile) -> String {
    let judged = |s| serde_json::to_value(Judged::new(s, profile));
    let mut v = judged(state).unwrap_or(serde_json::Value::Null);
    if let (Some(m), Some(obj)) = (measured, v.as_object_mut()) {
        obj.insert(
            "as_measured".to_string(),
            judged(m).unwrap_or(serde_json::Value::Null),
        );
    }
    serde_json::to_string_pretty(&v).unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}"))
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::sample::conditions::Conditions;
    use crate::sample::measured::Measured;
    use crate::sample::water::Water;

    fn keys(v: &serde_json::Value) -> Vec<String> {
        v.as_object()
            .map(|m| m.keys().cloned().collect())
            .unwrap_or_default()
    }

    #[test]
    fn the_key_set_is_the_same_in_both_media() {
        let pair = || {
            (
                Measured::alkalinity_umol_kg(2300.0),
                Measured::dic_umol_kg(2000.0),
            )
        };
        let sea = Water::saline(Conditions::new(25.0, 35.0).unwrap()).unwrap();
        let fresh = Water::fresh(Conditions::new(25.0, 0.0).unwrap()).unwrap();
        let (a, b) = pair();
        let s = sea.solve(a.unwrap(), b.unwrap()).unwrap();
        let (a, b) = pair();
        let f = fresh.solve(a.unwrap(), b.unwrap()).unwrap();
        let (vs, vf) = (
            serde_json::to_value(&s).unwrap(),
            serde_json::to_value(&f).unwrap(),
        );
        let mut expected: Vec<String> = Output::ALL.iter().map(|o| o.key().to_string()).collect();
        expected.extend([
            "constants".to_string(),
            "warnings".to_string(),
            "flags".to_string(),
            "flags_profile".to_string(),
        ]);
        assert_eq!(keys(&vs), expected);
        assert_eq!(keys(&vf), expected);
        // Fresh-water figures are null in saline water, not absent.
        assert!(vs["gamma_monovalent"].is_null() && vs["ionic_strength_from"].is_null());
        assert!(vf["gamma_monovalent"].is_number());
        assert_eq!(vf["ionic_strength_from"], "alkalinity only");
        // Flags are an array, empty where nothing passes a limit.
        assert_eq!(vs["flags"], serde_json::json!([]));
        assert_eq!(vs["flags_profile"], "general");
        assert!(vf["flags"].is_array());
    }
}
