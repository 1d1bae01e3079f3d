//! What a row gives before validation, and the pair taken from it.

use super::cell::{Choice, Parsed};
use super::header::{Field, Total};
use crate::base::units::Quantity;
use crate::fits::{BoronTotalFit, CarbonicFit, FluorideFit};
use crate::properties::activity::ActivityModel;
use crate::properties::scales::PhScale;
use crate::sample::measured::Parameter;
use crate::sample::trade::{Conductivity, MediumChoice, Sample};

/// The order in which a row's measured parameters are taken for its pair:
/// the first two present that can be used together. Alkalinity and DIC are
/// conservative and measured most precisely; then pH; then the gas and the
/// single species.
/// It is the order of [`Parameter::ALL`].
pub(crate) const RANKING: [Parameter; 9] = Parameter::ALL;

/// The index of a parameter in [`RANKING`].
pub(crate) fn rank(p: Parameter) -> usize {
    RANKING.iter().position(|q| *q == p).unwrap_or(0)
}

/// The pair taken from the parameters present (by rank), if any.
pub(crate) fn choose_pair(present: &[bool; 9]) -> Option<(Parameter, Parameter)> {
    for i in 0..9 {
        if !present[i] {
            continue;
        }
        for j in i + 1..9 {
            if present[j] && RANKING[i].pairs_with(RANKING[j]) {
                return Some((RANKING[i], RANKING[j]));
            }
        }
    }
    None
}

/// A measured carbonate value of a row.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) enum CarbonValue {
    Ph(f64, Option<PhScale>),
    Quantity(Quantity),
}

/// Everything a row can give, before validation.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub(crate) struct Inputs {
    pub carbon: [Option<CarbonValue>; 9],
    pub temperature: Option<f64>,
    pub salinity: Option<f64>,
    pub conductivity: Option<Conductivity>,
    pub pressure: Option<f64>,
    pub air_pressure: Option<f64>,
    pub totals: [Option<Quantity>; 12],
    pub calcium_fraction: Option<f64>,
    pub tds: Option<f64>,
    pub ionic_strength: Option<f64>,
    pub medium: Option<MediumChoice>,
    pub ph_scale: Option<PhScale>,
    pub carbonic: Option<CarbonicFit>,
    pub boron: Option<BoronTotalFit>,
    pub fluoride: Option<FluorideFit>,
    pub activity: Option<ActivityModel>,
}

impl Inputs {
    /// Stores a cell's value for `field`.
    pub(crate) fn put(&mut self, field: Field, value: Parsed) {
        match (field, value) {
            (Field::Carbon(p), Parsed::Ph(v, s)) => {
                self.carbon[rank(p)] = Some(CarbonValue::Ph(v, s))
            }
            (Field::Carbon(p), Parsed::Quantity(q)) => {
                self.carbon[rank(p)] = Some(CarbonValue::Quantity(q))
            }
            (Field::Temperature, Parsed::Number(v)) => self.temperature = Some(v),
            (Field::Salinity, Parsed::Number(v)) => self.salinity = Some(v),
            (Field::Conductivity, Parsed::Conductivity(c)) => self.conductivity = Some(c),
            (Field::Pressure, Parsed::Number(v)) => self.pressure = Some(v),
            (Field::AirPressure, Parsed::Number(v)) => self.air_pressure = Some(v),
            (Field::Total(t), Parsed::Quantity(q)) => self.totals[t.index()] = Some(q),
            (Field::CalciumFraction, Parsed::Number(v)) => self.calcium_fraction = Some(v),
            (Field::Tds, Parsed::Number(v)) => self.tds = Some(v),
            (Field::IonicStrength, Parsed::Number(v)) => self.ionic_strength = Some(v),
            (_, Parsed::Choice(c)) => match c {
                Choice::Medium(m) => self.medium = Some(m),
                Choice::Scale(s) => self.ph_scale = Some(s),
                Choice::Carbonic(f) => self.carbonic = Some(f),
                Choice::Boron(f) => self.boron = Some(f),
                Choice::Fluoride(f) => self.fluoride = Some(f),
                Choice::Activity(m) => self.activity = Some(m),
            },
            // The reading of a field always gives its own kind of value.
            _ => {}
        }
    }

    /// The sample of these inputs (temperature given).
    pub(crate) fn sample(&self, temperature_c: f64) -> Sample {
        let mut s = Sample::new(temperature_c);
        s.salinity = self.salinity;
        s.conductivity = self.conductivity;
        s.pressure_dbar = self.pressure.unwrap_or(0.0);
        s.air_pressure_atm = self.air_pressure;
        s.medium = self.medium.unwrap_or_default();
        s.carbonic = self.carbonic;
        s.boron = self.boron;
        s.fluoride_fit = self.fluoride;
        s.activity = self.activity;
        let t = |total: Total| self.totals[total.index()];
        s.phosphate = t(Total::Phosphate);
        s.silicate = t(Total::Silicate);
        s.ammonia = t(Total::Ammonia);
        s.sulfide = t(Total::Sulfide);
        s.calcium = t(Total::Calcium);
        s.hardness = t(Total::Hardness);
        s.magnesium = t(Total::Magnesium);
        s.sodium = t(Total::Sodium);
        s.potassium = t(Total::Potassium);
        s.chloride = t(Total::Chloride);
        s.sulfate = t(Total::Sulfate);
        s.boron_total = t(Total::Boron);
        s.calcium_fraction = self.calcium_fraction;
        s.tds_mg_l = self.tds;
        s.ionic_strength = self.ionic_strength;
        s
    }
}
