//! A result as data: the JSON of a state read back, for programs that keep
//! results and load them again.

use super::fields::Output;
use crate::state::State;
use serde::de::{Deserialize, Deserializer, Error as _};
use serde::ser::{Serialize, SerializeMap, Serializer};
use serde_json::{Map, Value as Json};

/// One value of a [`Record`]: a number or a name.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub enum Item {
    /// A number.
    Number(f64),
    /// A name, such as the medium.
    Text(String),
}

/// One caution of a [`Record`], as the JSON gives it.
#[derive(Debug, Clone, PartialEq, Eq, serde::Serialize, serde::Deserialize)]
#[non_exhaustive]
pub struct Caution {
    /// Its stable snake_case code, as [`crate::Warning::code`].
    pub code: String,
    /// `note` or `warning`.
    pub severity: String,
    /// The message.
    pub message: String,
}

/// A result as data, keyed like the JSON of `solve --json`: every output of
/// the list of outputs ([`Output::ALL`]), the fits used (`constants`), the
/// cautions (`warnings`), any other keys a front end adds, and the state as
/// measured (`as_measured`) where there is one.
///
/// A [`State`] serialises to this shape, and a `Record` reads it back and
/// writes it again unchanged, so results can be stored and loaded without
/// the crate's solver. Keys that this version does not know are kept, in
/// order, in [`Record::other`].
///
/// # Example
/// ```
/// use travertine::output::{Output, Record};
/// use travertine::{Conditions, Measured, Water};
/// let s = Water::saline(Conditions::new(25.0, 35.0)?)?
///     .solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
/// let text = serde_json::to_string(&s).unwrap();
/// let r: Record = serde_json::from_str(&text).unwrap();
/// assert_eq!(r.number(Output::Pco2), Some(s.pco2_uatm));
/// assert_eq!(r.text(Output::Water), Some("saline"));
/// assert_eq!(serde_json::to_string(&r).unwrap(), text);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq, Default)]
#[non_exhaustive]
pub struct Record {
    /// The outputs, in the order of [`Output::ALL`]; `None` where the JSON
    /// has `null` or lacks the key.
    pub values: Vec<(Output, Option<Item>)>,
    /// The fit used for each constant.
    pub constants: Map<String, Json>,
    /// The cautions.
    pub warnings: Vec<Caution>,
    /// Other keys, in order (for example those of a newer version).
    pub other: Map<String, Json>,
    /// The state as measured, for answers at other conditions.
    pub as_measured: Option<Box<Record>>,
}

impl Record {
    /// The record of a state.
    ///
    /// ```
    /// use travertine::output::{Output, Record};
    /// use travertine::{Conditions, Measured, Water};
    /// let s = Water::saline(Conditions::new(25.0, 35.0)?)?
    ///     .solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
    /// assert_eq!(Record::of(&s).number(Output::DicUmolKg), Some(s.dic_umol_kg));
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn of(state: &State) -> Record {
        // Through the JSON itself, so that a record of a state and the
        // record of its JSON are one and the same (flags included).
        serde_json::to_value(super::json::Judged::new(
            state,
            crate::decisions::Profile::shared_default(),
        ))
        .and_then(serde_json::from_value)
        .unwrap_or_default()
    }

    /// The water of a saved result and its state, solved again from the
    /// record's conditions, medium, fits, totals (`*_total_umol_kg`,
    /// calcium; in fresh water its ionic strength) and its alkalinity and
    /// DIC: what a saved result needs to be mixed
    /// ([`crate::decisions::blend`]).
    ///
    /// # Errors
    /// [`crate::Error::Missing`] naming a key the record lacks; errors of the
    /// inputs and of the solve.
    ///
    /// ```
    /// use travertine::output::{Output, Record};
    /// use travertine::{Conditions, Measured, Water};
    /// let s = Water::saline(Conditions::new(25.0, 35.0)?)?
    ///     .solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
    /// let again = Record::of(&s).solved()?;
    /// assert!((again.pco2_uatm - s.pco2_uatm).abs() < 1e-9 * s.pco2_uatm);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn solved(&self) -> crate::Result<State> {
        use crate::base::field::Field;
        use crate::sample::inputs::{Input, Total};
        use crate::sample::values::{Choice, InputValue, MediumChoice};
        use crate::sample::{Medium, Sample};
        use crate::units::{Amount, Quantity, Unit};
        let need = |o: Output| {
            self.number(o).ok_or(crate::Error::Missing {
                field: Field::Parameter,
                why: "; a saved result needs its conditions, alkalinity and DIC (the JSON of \
                      `solve --json`)",
            })
        };
        let saline = self.text(Output::Water) == Some("saline");
        let mut sample = Sample::new(need(Output::TemperatureC)?);
        sample.put(Input::Salinity, InputValue::Number(need(Output::Salinity)?));
        sample.put(
            Input::Pressure,
            InputValue::Number(need(Output::PressureDbar)?),
        );
        let medium = if saline {
            MediumChoice::Saline
        } else {
            MediumChoice::Fresh
        };
        sample.put(Input::Medium, InputValue::Choice(Choice::Medium(medium)));
        let umol = |v: f64| InputValue::Quantity(Quantity::new(v, Unit::UmolPerKg));
        for (o, total) in [
            (Output::PhosphateTotal, Total::Phosphate),
            (Output::SilicateTotal, Total::Silicate),
            (Output::AmmoniaTotal, Total::Ammonia),
            (Output::SulfideTotal, Total::Sulfide),
            (Output::Calcium, Total::Calcium),
        ] {
            if let Some(v) = self.number(o).filter(|v| *v > 0.0) {
                sample.put(Input::Total(total), umol(v));
            }
        }
        if saline {
            for (o, total) in [
                (Output::BoronTotal, Total::Boron),
                (Output::SulfateTotal, Total::Sulfate),
            ] {
                if let Some(v) = self.number(o) {
                    sample.put(Input::Total(total), umol(v));
                }
            }
            for (key, input) in [
                ("carbonic", Input::CarbonicFit),
                ("boron_total", Input::BoronFit),
                ("fluoride", Input::FluorideFit),
            ] {
                if let Some(name) = self.constants.get(key).and_then(|v| v.as_str()) {
                    sample.set(input, name)?;
                }
            }
        } else if let Some(i) = self.number(Output::IonicStrength) {
            sample.put(Input::IonicStrength, InputValue::Number(i));
        }
        let mut water = sample.water()?;
        if water.medium() == Medium::Saline {
            if let Some(v) = self.number(Output::FluorideTotal) {
                let c = water.composition().with_fluoride(Amount::PerKg(v * 1e-6))?;
                water = water.with_composition(c);
            }
        }
        water.solve(
            crate::Measured::alkalinity_umol_kg(need(Output::AlkalinityUmolKg)?)?,
            crate::Measured::dic_umol_kg(need(Output::DicUmolKg)?)?,
        )
    }

    /// The value of `output`, if the record has one.
    pub fn get(&self, output: Output) -> Option<&Item> {
        self.values
            .iter()
            .find(|(o, _)| *o == output)
            .and_then(|(_, v)| v.as_ref())
    }

    /// The number of `output`, if the record has one.
    ///
    /// ```
    /// use travertine::output::{Output, Record};
    /// assert_eq!(Record::default().number(Output::Pco2), None);
    /// ```
    pub fn number(&self, output: Output) -> Option<f64> {
        match self.get(output) {
            Some(Item::Number(v)) => Some(*v),
            _ => None,
        }
    }

    /// The name of `output`, if the record has one.
    pub fn text(&self, output: Output) -> Option<&str> {
        match self.get(output) {
            Some(Item::Text(t)) => Some(t),
            _ => None,
        }
    }
}

impl Serialize for Record {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        let mut map = serializer.serialize_map(None)?;
        for (o, v) in &self.values {
            match v {
                Some(Item::Number(x)) if x.is_finite() => map.serialize_entry(o.key(), x)?,
                Some(Item::Text(t)) => map.serialize_entry(o.key(), t)?,
                _ => map.serialize_entry(o.key(), &Json::Null)?,
            }
        }
        map.serialize_entry("constants", &self.constants)?;
        map.serialize_entry("warnings", &self.warnings)?;
        for (k, v) in &self.other {
            map.serialize_entry(k, v)?;
        }
        if let Some(m) = &self.as_measured {
            map.serialize_entry("as_measured", m)?;
        }
        map.end()
    }
}

impl<'de> Deserialize<'de> for Record {
    fn deserialize<D: Deserializer<'de>>(deserializer: D) -> Result<Self, D::Error> {
        let map = Map::<String, Json>::deserialize(deserializer)?;
        let mut record = Record {
            values: Output::ALL.iter().map(|o| (*o, None)).collect(),
            ..Record::default()
        };
        for (key, value) in map {
            if let Some(o) = Output::from_key(&key) {
                let item = match value {
                    Json::Null => None,
                    Json::Number(n) => Some(Item::Number(n.as_f64().ok_or_else(|| {
                        D::Error::custom(format!("{key}: {n} is not a number travertine reads"))
                    })?)),
                    Json::String(s) => Some(Item::Text(s)),
                    other => {
                        return Err(D::Error::custom(format!(
                            "{key}: expected a number, a name or null, found {other}"
                        )))
                    }
                };
                if let Some(slot) = record.values.iter_mut().find(|(x, _)| *x == o) {
                    slot.1 = item;
                }
                continue;
            }
            match key.as_str() {
                "constants" => match value {
                    Json::Object(m) => record.constants = m,
                    Json::Null => {}
                    other => {
                        return Err(D::Error::custom(format!(
                            "constants: expected an object, found {other}"
                        )))
                    }
                },
                "warnings" => {
                    record.warnings = serde_json::from_value(value).map_err(D::Error::custom)?
                }
                "as_measured" => {
                    record.as_measured = match value {
                        Json::Null => None,
                        v => Some(Box::new(
                            serde_json::from_value(v).map_err(D::Error::custom)?,
                        )),
                    }
                }
                _ => {
                    record.other.insert(key, value);
                }
            }
        }
        Ok(record)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::output::json::json;
    use crate::sample::conditions::Conditions;
    use crate::sample::measured::Measured;
    use crate::sample::water::Water;

    /// The JSON of a state, with and without `as_measured`, in both media,
    /// reads back into a record that writes it again unchanged.
    #[test]
    fn the_json_of_a_state_round_trips() {
        let sea = Water::saline(Conditions::new(25.0, 35.0).unwrap()).unwrap();
        let pond = Water::fresh(Conditions::new(18.0, 0.2).unwrap()).unwrap();
        for water in [sea, pond] {
            let s = water
                .solve(
                    Measured::alkalinity_umol_kg(2000.0).unwrap(),
                    Measured::dic_umol_kg(1900.0).unwrap(),
                )
                .unwrap();
            let cold = s
                .at(Conditions::new(5.0, water.conditions().salinity()).unwrap())
                .unwrap();
            for text in [json(&s, None), json(&cold, Some(&s))] {
                let original: Json = serde_json::from_str(&text).unwrap();
                let r: Record = serde_json::from_str(&text).unwrap();
                assert_eq!(serde_json::to_value(&r).unwrap(), original);
                assert_eq!(r.number(Output::DicUmolKg), Some(s.dic_umol_kg));
            }
            assert_eq!(
                Record::of(&s),
                serde_json::from_str(&json(&s, None)).unwrap()
            );
        }
    }

    #[test]
    fn unknown_keys_are_kept_and_bad_values_refused() {
        let r: Record = serde_json::from_str(r#"{"pco2_uatm": 400, "later": [1]}"#).unwrap();
        assert_eq!(r.number(Output::Pco2), Some(400.0));
        assert_eq!(r.other["later"], serde_json::json!([1]));
        let e = serde_json::from_str::<Record>(r#"{"pco2_uatm": [1]}"#).unwrap_err();
        assert!(e.to_string().contains("pco2_uatm"), "{e}");
    }
}
