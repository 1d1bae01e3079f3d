//! A sample as a user describes it: conditions, medium choice, trade-unit
//! totals, conductivity, hardness. [`Sample::water`] turns it into a
//! validated [`Water`]. The command line and the field sheet share it.

use crate::base::error::{check_range, Error, Result};
use crate::base::field::Field;
use crate::base::units::{list_units, Amount, Quantity, Unit, CACO3_G_MOL, MOLAR_UNITS};
use crate::base::warning::{Warning, Warnings};
use crate::fits::{BisulfateFit, BoronTotalFit, CarbonicFit, Fits, FluorideFit, GasTransfer};
use crate::properties::activity::ActivityModel;
use crate::properties::density::pressure_dbar_at_depth;
use crate::properties::scales::PhScale;
use crate::sample::conditions::Conditions;
use crate::sample::inputs::{Input, Total};
use crate::sample::measured::{check_pair, Measured, Parameter};
use crate::sample::values::{Choice, Conductivity, InputValue, MediumChoice};
use crate::sample::water::AUTO_FRESH_BELOW_SALINITY;
use crate::sample::{Air, Composition, Medium, Water};

/// A measured carbonate value as given: a pH with the scale it names, or
/// a number with its unit.
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum CarbonValue {
    /// A pH and the scale it names, if any.
    Ph(f64, Option<PhScale>),
    /// A number with its unit.
    Quantity(Quantity),
}

impl CarbonValue {
    /// The measured parameter `p` of this value; a pH that names no scale
    /// takes `default_scale`.
    ///
    /// # Errors
    /// As [`Measured::ph`] and [`Measured::new`].
    ///
    /// ```
    /// use travertine::{sample::trade::CarbonValue, Parameter, PhScale};
    /// let m = CarbonValue::Ph(7.8, None).measured(Parameter::Ph, Some(PhScale::Nbs))?;
    /// assert_eq!(m.parameter(), Parameter::Ph);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn measured(self, p: Parameter, default_scale: Option<PhScale>) -> Result<Measured> {
        match self {
            CarbonValue::Ph(v, scale) => Measured::ph(v, scale.or(default_scale)),
            CarbonValue::Quantity(q) => Measured::new(p, q),
        }
    }
}

/// A sample described in the trade's terms, input by input, as the
/// command line and the field sheet give it (see [`crate::sample::inputs`]).
///
/// # Example
/// ```
/// use travertine::sample::{inputs::{Input, Total}, Sample};
/// use travertine::{Medium, Parameter};
/// let mut s = Sample::new(22.0);
/// s.set(Input::Conductivity, "420 uS/cm")?;
/// s.set(Input::Total(Total::Calcium), "48 mg/L Ca")?;
/// s.set(Input::Carbon(Parameter::Alkalinity), "120 mg/L CaCO3")?;
/// s.set(Input::Carbon(Parameter::Ph), "7.6")?;
/// let water = s.water()?;
/// assert_eq!(water.medium(), Medium::Fresh);
/// let (a, b) = s.pair()?;
/// let state = water.solve(a, b)?;
/// assert!(state.langelier_index.is_some());
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Default)]
#[non_exhaustive]
pub struct Sample {
    /// Temperature of the measurement, °C.
    pub temperature_c: Option<f64>,
    /// Practical salinity, if known.
    pub salinity: Option<f64>,
    /// Conductivity, if measured.
    pub conductivity: Option<Conductivity>,
    /// Gauge pressure, dbar (default 0).
    pub pressure_dbar: Option<f64>,
    /// Barometric pressure, atm (default 1; or from the elevation).
    pub barometric_atm: Option<f64>,
    /// The medium.
    pub medium: MediumChoice,
    /// The scale of a pH that names none.
    pub ph_scale: Option<PhScale>,
    /// K1, K2 fit (saline only).
    pub carbonic: Option<CarbonicFit>,
    /// Total boron ratio (saline only).
    pub boron: Option<BoronTotalFit>,
    /// KF fit (saline only).
    pub fluoride_fit: Option<FluorideFit>,
    /// KS fit (its one choice, Dickson 1990).
    pub bisulfate: Option<BisulfateFit>,
    /// Activity model (fresh only).
    pub activity: Option<ActivityModel>,
    /// The measured carbonate values, in the order of [`Parameter::ALL`].
    pub carbon: [Option<CarbonValue>; 9],
    /// The measured totals, in the order of [`Total::ALL`].
    pub totals: [Option<Quantity>; 12],
    /// Fraction of the total hardness that is calcium, 0–1.
    pub calcium_fraction: Option<f64>,
    /// Total dissolved solids, mg/L.
    pub tds_mg_l: Option<f64>,
    /// Ionic strength given directly, mol/kg.
    pub ionic_strength: Option<f64>,
    // issue 11: depth profiles
    /// Depth below the water surface, m: the pressure follows from it
    /// (not with [`Sample::pressure_dbar`]).
    pub depth_m: Option<f64>,
    // issue 11: air–water CO2 exchange
    /// Wind speed at 10 m, m/s.
    pub wind_m_s: Option<f64>,
    /// CO2 of the air, ppm (dry mole fraction).
    pub air_co2_ppm: Option<f64>,
    /// Elevation of the water surface, m above sea level.
    pub elevation_m: Option<f64>,
    /// Area of the lake, km².
    pub lake_area_km2: Option<f64>,
    /// Transfer velocity k600 given directly, cm/h.
    pub k600_cm_h: Option<f64>,
    /// The model of the transfer velocity.
    pub gas_transfer: Option<GasTransfer>,
    // issue 12: the volume a dose treats
    /// The volume of water a dose treats, m³.
    pub volume_m3: Option<f64>,
    /// The area of the pond a dose treats, m².
    pub area_m2: Option<f64>,
    /// The mean depth of the pond a dose treats, m.
    pub mean_depth_m: Option<f64>,
}

/// The amount of a total: by its molar unit, or by one of its mass units.
///
/// Inline, so that the common case, a total not given, costs a test.
#[inline]
fn amount(total: Total, q: Option<Quantity>) -> Result<Option<Amount>> {
    match q {
        None => Ok(None),
        Some(q) => amount_of(total, q),
    }
}

/// [`amount`] of a total given.
fn amount_of(total: Total, q: Quantity) -> Result<Option<Amount>> {
    let mass = total.mass_units();
    for (unit, g) in mass {
        if q.unit == *unit {
            return Ok(Amount::from_quantity(q, *unit, *g));
        }
    }
    Amount::from_quantity(q, Unit::UmolPerKg, 1.0)
        .filter(|_| MOLAR_UNITS.contains(&q.unit))
        .map(Some)
        .ok_or_else(|| Error::WrongUnit {
            field: total.field(),
            unit: q.unit.spelling().to_string(),
            accepted: list_units(&total.units()),
        })
}

/// An out-of-range error on a total, given again in the unit it was typed in.
fn retyped(total: Total, q: Option<Quantity>) -> impl Fn(Error) -> Error {
    move |e| match q {
        Some(q) => {
            let per_unit = amount(total, Some(Quantity::new(1.0, q.unit)))
                .ok()
                .flatten()
                .map_or(0.0, Amount::raw);
            e.in_typed_unit(q.value, q.unit.spelling(), per_unit)
        }
        None => e,
    }
}

/// How far a given salinity may lie from the salinity of a conductivity
/// given with it before they are said to disagree: 2 % of the salinity, and
/// at least 0.01 (the resolution of a field salinity).
pub const SALINITY_AGREEMENT: (f64, f64) = (0.02, 0.01);

/// A warning when a given salinity and the salinity of a conductivity given
/// with it disagree by more than [`SALINITY_AGREEMENT`]; the given salinity
/// is the one used.
fn salinity_disagreement(given: f64, from_conductivity: f64, c: Conductivity) -> Option<Warning> {
    let (relative, absolute) = SALINITY_AGREEMENT;
    let difference = from_conductivity - given;
    if difference.abs() <= (relative * given.abs()).max(absolute) {
        return None;
    }
    let percent = if given > 0.0 {
        format!(" ({:+.1} %)", 100.0 * difference / given)
    } else {
        String::new()
    };
    Some(Warning::Text {
        code: "salinity_conductivity_disagree",
        text: format!(
            "the salinity given, {given}, and the conductivity given, {c}, disagree: by PSS-78 \
             the conductivity is salinity {from_conductivity:.3}{percent}; the salinity given \
             was used; check the conductivity's unit and whether it was compensated to 25 °C"
        ),
    })
}

/// How far calcium plus magnesium may lie from a total hardness given with
/// them before they are said to disagree: 5 % of the hardness (an
/// allowance for titration scatter; common practice, from memory).
pub const HARDNESS_AGREEMENT: f64 = 0.05;

/// `whole` less `part`, never below zero, on the basis of `whole` (per
/// litre or per kilogram; a part on the other basis is taken at 1 kg/L, as
/// for a fresh water).
fn difference(whole: Amount, part: Amount) -> Amount {
    match (whole, part) {
        (Amount::PerLitre(w), Amount::PerLitre(p)) => Amount::PerLitre((w - p).max(0.0)),
        (Amount::PerLitre(w), p) => Amount::PerLitre((w - p.mol_kg(1000.0)).max(0.0)),
        (Amount::PerKg(w), p) => Amount::PerKg((w - p.mol_kg(1000.0)).max(0.0)),
    }
}

/// The place of a parameter in [`Sample::carbon`].
fn slot(p: Parameter) -> usize {
    Parameter::ALL.iter().position(|q| *q == p).unwrap_or(0)
}

impl Sample {
    /// A sample at `temperature_c`, everything else unset.
    ///
    /// ```
    /// # use travertine::sample::trade::Sample;
    /// assert_eq!(Sample::new(12.0).temperature_c, Some(12.0));
    /// ```
    pub fn new(temperature_c: f64) -> Self {
        Self {
            temperature_c: Some(temperature_c),
            ..Self::default()
        }
    }

    /// Stores a value of `input`. A value of another kind than the input
    /// reads (a name for a temperature) is not stored: [`Input::read`]
    /// and the sheet's cells always give the input's own kind.
    ///
    /// ```
    /// use travertine::sample::{inputs::Input, values::InputValue, Sample};
    /// let mut s = Sample::default();
    /// s.put(Input::Salinity, InputValue::Number(0.3));
    /// assert_eq!(s.salinity, Some(0.3));
    /// ```
    pub fn put(&mut self, input: Input, value: InputValue) {
        match (input, value) {
            (Input::Carbon(p), InputValue::Ph(v, s)) => {
                self.carbon[slot(p)] = Some(CarbonValue::Ph(v, s))
            }
            (Input::Carbon(p), InputValue::Quantity(q)) => {
                self.carbon[slot(p)] = Some(CarbonValue::Quantity(q))
            }
            (Input::Temperature, InputValue::Number(v)) => self.temperature_c = Some(v),
            (Input::Salinity, InputValue::Number(v)) => self.salinity = Some(v),
            (Input::Conductivity, InputValue::Conductivity(c)) => self.conductivity = Some(c),
            (Input::Pressure, InputValue::Number(v)) => self.pressure_dbar = Some(v),
            (Input::Barometric, InputValue::Number(v)) => self.barometric_atm = Some(v),
            (Input::Wind, InputValue::Number(v)) => self.wind_m_s = Some(v),
            (Input::AirCo2, InputValue::Number(v)) => self.air_co2_ppm = Some(v),
            (Input::Elevation, InputValue::Number(v)) => self.elevation_m = Some(v),
            (Input::LakeArea, InputValue::Number(v)) => self.lake_area_km2 = Some(v),
            (Input::K600, InputValue::Number(v)) => self.k600_cm_h = Some(v),
            (Input::PondVolume, InputValue::Number(v)) => self.volume_m3 = Some(v),
            (Input::PondArea, InputValue::Number(v)) => self.area_m2 = Some(v),
            (Input::MeanDepth, InputValue::Number(v)) => self.mean_depth_m = Some(v),
            (Input::Total(t), InputValue::Quantity(q)) => self.totals[t.index()] = Some(q),
            (Input::CalciumFraction, InputValue::Number(v)) => self.calcium_fraction = Some(v),
            (Input::Tds, InputValue::Number(v)) => self.tds_mg_l = Some(v),
            (Input::IonicStrength, InputValue::Number(v)) => self.ionic_strength = Some(v),
            (Input::Depth, InputValue::Number(v)) => self.depth_m = Some(v),
            (_, InputValue::Choice(c)) => match c {
                Choice::Medium(m) => self.medium = m,
                Choice::Scale(s) => self.ph_scale = Some(s),
                Choice::Carbonic(f) => self.carbonic = Some(f),
                Choice::Boron(f) => self.boron = Some(f),
                Choice::Fluoride(f) => self.fluoride_fit = Some(f),
                Choice::Bisulfate(f) => self.bisulfate = Some(f),
                Choice::Activity(m) => self.activity = Some(m),
                Choice::GasTransfer(m) => self.gas_transfer = Some(m),
            },
            _ => {}
        }
    }

    /// The value of `input` in this sample, if it has one: what
    /// [`Sample::put`] stored. The medium is `None` while it is `auto`.
    ///
    /// ```
    /// use travertine::sample::{inputs::Input, values::InputValue, Sample};
    /// let mut s = Sample::new(12.0);
    /// assert_eq!(s.get(Input::Temperature), Some(InputValue::Number(12.0)));
    /// s.set(Input::Conductivity, "420 uS/cm")?;
    /// assert_eq!(s.get(Input::Conductivity).unwrap().to_string(), "420 uS/cm");
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn get(&self, input: Input) -> Option<InputValue> {
        let number = |v: Option<f64>| v.map(InputValue::Number);
        let choice = |c: Option<Choice>| c.map(InputValue::Choice);
        match input {
            Input::Carbon(p) => self.carbon_value(p).map(|v| match v {
                CarbonValue::Ph(x, scale) => InputValue::Ph(x, scale),
                CarbonValue::Quantity(q) => InputValue::Quantity(q),
            }),
            Input::Temperature => number(self.temperature_c),
            Input::Salinity => number(self.salinity),
            Input::Conductivity => self.conductivity.map(InputValue::Conductivity),
            Input::Pressure => number(self.pressure_dbar),
            Input::Barometric => number(self.barometric_atm),
            Input::Wind => number(self.wind_m_s),
            Input::AirCo2 => number(self.air_co2_ppm),
            Input::Elevation => number(self.elevation_m),
            Input::LakeArea => number(self.lake_area_km2),
            Input::K600 => number(self.k600_cm_h),
            Input::PondVolume => number(self.volume_m3),
            Input::PondArea => number(self.area_m2),
            Input::MeanDepth => number(self.mean_depth_m),
            Input::GasTransfer => choice(self.gas_transfer.map(Choice::GasTransfer)),
            Input::Total(t) => self.total(t).map(InputValue::Quantity),
            Input::CalciumFraction => number(self.calcium_fraction),
            Input::Tds => number(self.tds_mg_l),
            Input::IonicStrength => number(self.ionic_strength),
            Input::Medium => {
                choice((self.medium != MediumChoice::Auto).then_some(Choice::Medium(self.medium)))
            }
            Input::PhScale => choice(self.ph_scale.map(Choice::Scale)),
            Input::CarbonicFit => choice(self.carbonic.map(Choice::Carbonic)),
            Input::BoronFit => choice(self.boron.map(Choice::Boron)),
            Input::FluorideFit => choice(self.fluoride_fit.map(Choice::Fluoride)),
            Input::BisulfateFit => choice(self.bisulfate.map(Choice::Bisulfate)),
            Input::Activity => choice(self.activity.map(Choice::Activity)),
            Input::Depth => number(self.depth_m),
        }
    }

    /// Reads `text` as a value of `input` ([`Input::read`]) and stores it.
    ///
    /// # Errors
    /// As [`Input::read`].
    ///
    /// ```
    /// use travertine::sample::{inputs::Input, Sample};
    /// let mut s = Sample::default();
    /// s.set(Input::Medium, "fresh")?;
    /// assert!(s.set(Input::Medium, "brine").is_err());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn set(&mut self, input: Input, text: &str) -> Result<()> {
        let value = input.read(text)?;
        self.put(input, value);
        Ok(())
    }

    /// A measured total, as given.
    ///
    /// ```
    /// use travertine::sample::{inputs::{Input, Total}, Sample};
    /// let mut s = Sample::default();
    /// s.set(Input::Total(Total::Sodium), "12 mg/L Na")?;
    /// assert!(s.total(Total::Sodium).is_some());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn total(&self, t: Total) -> Option<Quantity> {
        self.totals[t.index()]
    }

    /// A measured carbonate value, as given.
    pub fn carbon_value(&self, p: Parameter) -> Option<CarbonValue> {
        self.carbon[slot(p)]
    }

    /// The measured parameter `p`, if given; a pH that names no scale takes
    /// [`Sample::ph_scale`].
    ///
    /// ```
    /// use travertine::{sample::Sample, Parameter};
    /// assert!(Sample::new(20.0).measured(Parameter::Dic).is_none());
    /// ```
    pub fn measured(&self, p: Parameter) -> Option<Result<Measured>> {
        self.carbon_value(p).map(|v| v.measured(p, self.ph_scale))
    }

    /// The volume of water a dose treats, m³: as given, or the pond's area
    /// times its mean depth; `None` when neither is given.
    ///
    /// # Errors
    /// [`Error::IncompatiblePair`] for a volume given with an area or a
    /// depth; [`Error::Missing`] for an area without its depth or the other
    /// way round.
    ///
    /// ```
    /// use travertine::sample::{inputs::Input, Sample};
    /// let mut s = Sample::new(24.0);
    /// s.set(Input::PondArea, "0.8 ha")?;
    /// s.set(Input::MeanDepth, "1.2 m")?;
    /// assert!((s.volume_treated_m3()?.unwrap() - 9600.0).abs() < 1e-9);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn volume_treated_m3(&self) -> Result<Option<f64>> {
        match (self.volume_m3, self.area_m2, self.mean_depth_m) {
            (Some(_), Some(_), _) | (Some(_), _, Some(_)) => Err(Error::IncompatiblePair {
                first: Field::Volume,
                second: Field::Area,
                reason: "give the volume, or the area with the mean depth, not both",
            }),
            (Some(v), None, None) => Ok(Some(v)),
            (None, Some(a), Some(d)) => Ok(Some(a * d)),
            (None, Some(_), None) => Err(Error::Missing {
                field: Field::MeanDepth,
                why: "; the volume is the area times the mean depth",
            }),
            (None, None, Some(_)) => Err(Error::Missing {
                field: Field::Area,
                why: "; the volume is the area times the mean depth",
            }),
            (None, None, None) => Ok(None),
        }
    }

    /// The pH scale of this sample's answers: the scale its pH names, or
    /// the one given for it, or the medium's usual scale (NBS in fresh
    /// water, total in saline water).
    ///
    /// ```
    /// use travertine::{sample::{inputs::Input, Sample}, Medium, Parameter, PhScale};
    /// let mut s = Sample::new(20.0);
    /// assert_eq!(s.input_ph_scale(Medium::Saline), PhScale::Total);
    /// s.set(Input::Carbon(Parameter::Ph), "7.92 nbs")?;
    /// assert_eq!(s.input_ph_scale(Medium::Saline), PhScale::Nbs);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn input_ph_scale(&self, medium: Medium) -> PhScale {
        let own = match self.carbon_value(Parameter::Ph) {
            Some(CarbonValue::Ph(_, scale)) => scale,
            _ => None,
        };
        own.or(self.ph_scale).unwrap_or(match medium {
            Medium::Fresh => PhScale::Nbs,
            _ => PhScale::Total,
        })
    }

    /// Refuses a pH without its scale in saline water ([`Error::UnstatedPhScale`]):
    /// there the NBS and total scales differ by about 0.1 to 0.15 pH, so the
    /// scale is never assumed. In fresh water a pH without a scale is NBS
    /// (the activity scale). A scale is stated by the pH value itself (a
    /// header such as `pH (NBS)`) or by [`Sample::ph_scale`].
    ///
    /// # Errors
    /// [`Error::UnstatedPhScale`] in saline water.
    ///
    /// ```
    /// use travertine::sample::{inputs::Input, Sample};
    /// use travertine::{Medium, Parameter};
    /// let mut s = Sample::new(21.0);
    /// s.set(Input::Carbon(Parameter::Ph), "7.92")?;
    /// assert!(s.check_ph_scale(Medium::Saline).is_err());
    /// assert!(s.check_ph_scale(Medium::Fresh).is_ok());
    /// s.set(Input::PhScale, "nbs")?;
    /// assert!(s.check_ph_scale(Medium::Saline).is_ok());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn check_ph_scale(&self, medium: Medium) -> Result<()> {
        match self.carbon_value(Parameter::Ph) {
            Some(CarbonValue::Ph(ph, None))
                if medium == Medium::Saline && self.ph_scale.is_none() =>
            {
                Err(Error::UnstatedPhScale { ph })
            }
            _ => Ok(()),
        }
    }

    /// The measured pair: exactly two carbonate parameters given, which
    /// can be used together.
    ///
    /// # Errors
    /// [`Error::WrongCount`] unless exactly two are given; the pair rule
    /// of [`check_pair`]; the validation of each value.
    ///
    /// ```
    /// use travertine::sample::{inputs::Input, Sample};
    /// use travertine::Parameter;
    /// let mut s = Sample::new(20.0);
    /// s.set(Input::Carbon(Parameter::Ph), "8.1")?;
    /// assert!(s.pair().is_err());
    /// s.set(Input::Carbon(Parameter::Dic), "2000 umol/kg")?;
    /// assert!(s.pair().is_ok());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn pair(&self) -> Result<(Measured, Measured)> {
        let given: Vec<(Parameter, Result<Measured>)> = Parameter::ALL
            .into_iter()
            .filter_map(|p| self.measured(p).map(|m| (p, m)))
            .collect();
        let count = given.len();
        let mut values = given.into_iter();
        let (Some((_, ma)), Some((_, mb)), None) = (values.next(), values.next(), values.next())
        else {
            return Err(Error::WrongCount {
                field: Field::Alkalinity,
                given: count,
                wanted: 2,
                what: "measured carbonate parameters (of alkalinity, dic, ph, pco2, fco2, \
                       xco2, co2, hco3, co3)",
            });
        };
        if let (Some(CarbonValue::Ph(_, Some(own))), Some(stated)) =
            (self.carbon_value(Parameter::Ph), self.ph_scale)
        {
            if own != stated {
                return Err(Error::Inconsistent {
                    first: Field::Ph,
                    second: Field::PhScale,
                    reason: "the pH names one scale and the pH scale given is another; keep one",
                });
            }
        }
        let (ma, mb) = (ma?, mb?);
        check_pair(&ma, &mb)?;
        Ok((ma, mb))
    }

    /// The barometric pressure, atm: as given, or from the elevation by
    /// the ICAO standard atmosphere (with a note giving it); `None` when
    /// neither is given (1 atm).
    ///
    /// # Errors
    /// [`Error::IncompatiblePair`] when both are given;
    /// [`Error::OutOfRange`] for an elevation outside −500 to 7000 m.
    fn air_pressure_atm(&self, cautions: &mut Warnings) -> Result<Option<f64>> {
        use crate::properties::atmosphere::{
            standard_pressure_kpa, ELEVATION_MAX_M, ELEVATION_MIN_M, KPA_PER_ATM,
        };
        match (self.barometric_atm, self.elevation_m) {
            (Some(_), Some(_)) => Err(Error::IncompatiblePair {
                first: Field::Barometric,
                second: Field::Elevation,
                reason: "each gives the barometric pressure; give one (a barometer reading is \
                         better than the standard atmosphere of an elevation)",
            }),
            (Some(p), None) => Ok(Some(p)),
            (None, Some(h)) => {
                check_range(Field::Elevation, h, ELEVATION_MIN_M, ELEVATION_MAX_M, " m")?;
                let kpa = standard_pressure_kpa(h);
                cautions.push(Warning::Text {
                    code: "barometric_from_elevation",
                    text: format!(
                        "barometric pressure {kpa:.2} kPa from the elevation {h} m by the ICAO \
                         standard atmosphere; the weather moves it by a few percent, so a \
                         barometer reading is better"
                    ),
                });
                Ok(Some(kpa / KPA_PER_ATM))
            }
            (None, None) => Ok(None),
        }
    }

    /// The air side of the exchange of CO2: wind, CO2 of the air, lake
    /// area, k600 and model, each checked against its range, and checked
    /// together ([`Air::check`]). The barometric pressure is in the water
    /// ([`Sample::water`]).
    ///
    /// # Errors
    /// As the builders of [`Air`] and [`Air::check`].
    ///
    /// ```
    /// use travertine::sample::{inputs::Input, Sample};
    /// let mut s = Sample::new(18.0);
    /// s.set(Input::Wind, "3.5")?;
    /// s.set(Input::LakeArea, "240 ha")?;
    /// let air = s.air()?;
    /// assert_eq!(air.wind_m_s(), Some(3.5));
    /// assert!((air.lake_area_km2().unwrap() - 2.4).abs() < 1e-12);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn air(&self) -> Result<Air> {
        let mut air = Air::new();
        if let Some(v) = self.wind_m_s {
            air = air.with_wind_m_s(v)?;
        }
        if let Some(v) = self.air_co2_ppm {
            air = air.with_co2_ppm(v)?;
        }
        if let Some(v) = self.lake_area_km2 {
            air = air.with_lake_area_km2(v)?;
        }
        if let Some(v) = self.k600_cm_h {
            air = air.with_k600_cm_h(v)?;
        }
        if let Some(m) = self.gas_transfer {
            air = air.with_model(m);
        }
        air.check()?;
        Ok(air)
    }

    /// The scale of the pH given, where a pH is given: the scale its value
    /// names, else [`Sample::ph_scale`]; `None` without a pH or without a
    /// scale (the medium's own then).
    ///
    /// ```
    /// use travertine::sample::{inputs::Input, Sample};
    /// use travertine::{Parameter, PhScale};
    /// let mut s = Sample::new(18.0);
    /// assert_eq!(s.ph_scale_given(), None);
    /// s.set(Input::Carbon(Parameter::Ph), "7.9")?;
    /// s.set(Input::PhScale, "total")?;
    /// assert_eq!(s.ph_scale_given(), Some(PhScale::Total));
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn ph_scale_given(&self) -> Option<PhScale> {
        match self.carbon_value(Parameter::Ph) {
            Some(CarbonValue::Ph(_, scale)) => scale.or(self.ph_scale),
            _ => None,
        }
    }

    /// The validated water.
    ///
    /// Salinity: as given; otherwise from the conductivity by PSS-78 (Hill
    /// et al. 1986 below S 2); otherwise 0. Conductivity at the sample
    /// temperature becomes specific conductance by linear compensation
    /// (0.0191 per °C). Total hardness is calcium plus magnesium (both as
    /// CaCO3): with a calcium fraction it is split; with one of calcium and
    /// magnesium given, the other is the difference (a note says so); with
    /// both, a hardness more than 5 % from their sum is warned about; alone
    /// it is never taken as calcium and counts only in the ionic strength.
    /// A salinity given with a conductivity is used, and a warning raised
    /// where the two disagree by more than 2 %. A depth becomes the
    /// pressure through the density of the water
    /// ([`pressure_dbar_at_depth`]: P = ρ g z). The barometric pressure is
    /// as given, or from the elevation by the ICAO standard atmosphere
    /// (a note gives it), or 1 atm.
    ///
    /// # Errors
    /// Any validation error of the parts, naming the field; a saline-only
    /// fit chosen for fresh water, or an activity model for saline water;
    /// [`Error::IncompatiblePair`] for a depth given with a pressure, or a
    /// barometric pressure and an elevation both given.
    ///
    /// ```
    /// # use travertine::{sample::{MediumChoice, Sample}, fits::CarbonicFit};
    /// let mut s = Sample::new(20.0);
    /// s.medium = MediumChoice::Fresh;
    /// s.carbonic = Some(CarbonicFit::Lueker2000);
    /// assert!(s.water().is_err());
    ///
    /// // 50 m of fresh water at 8 °C: ρ g z = 999.85 × 9.80665 × 50 / 10⁴ dbar.
    /// let mut deep = Sample::new(8.0);
    /// deep.depth_m = Some(50.0);
    /// let p = deep.water().unwrap().conditions().pressure_dbar();
    /// assert!((p - 49.03).abs() < 0.005);
    /// deep.pressure_dbar = Some(49.0);
    /// assert!(deep.water().is_err()); // a depth and a pressure: give one
    /// ```
    pub fn water(&self) -> Result<Water> {
        let t = self.temperature_c.ok_or(Error::Missing {
            field: Field::Temperature,
            why: "",
        })?;
        // The medium's own temperature range, where the medium is known
        // before the conductivity is read (the widest range is checked by
        // the conditions).
        let known_medium = match (self.medium, self.salinity, self.conductivity) {
            (MediumChoice::Fresh, ..) => Some(Medium::Fresh),
            (MediumChoice::Saline, ..) => Some(Medium::Saline),
            (MediumChoice::Auto, Some(s), _) if s < AUTO_FRESH_BELOW_SALINITY => {
                Some(Medium::Fresh)
            }
            (MediumChoice::Auto, Some(_), _) => Some(Medium::Saline),
            (MediumChoice::Auto, None, None) => Some(Medium::Fresh),
            (MediumChoice::Auto, None, Some(_)) => None,
        };
        if let Some(m) = known_medium {
            m.check_temperature_c(t)?;
        }
        if self.medium == MediumChoice::Saline
            && self.salinity.is_none()
            && self.conductivity.is_none()
        {
            return Err(Error::Missing {
                field: Field::Salinity,
                why: "; the constants of saline water follow its salinity: give the salinity, or \
                      a conductivity to compute it from",
            });
        }
        let mut spc = None;
        let mut salinity = self.salinity;
        let mut cautions = Warnings::new();
        if let Some(c) = self.conductivity {
            let (specific, from_conductivity) = c.specific_and_salinity(t)?;
            spc = Some(specific);
            match salinity {
                None => {
                    salinity = Some(from_conductivity);
                    let fresh_limit = crate::sample::water::FRESH_SALINITY_MAX;
                    if self.medium == MediumChoice::Fresh && from_conductivity > fresh_limit {
                        return Err(Error::WrongMedium {
                            field: Field::Conductivity,
                            name: c.to_string(),
                            medium: "saline",
                            hint: "by PSS-78 it is a salinity above 10, the most fresh water \
                                   accepts; choose saline water (or auto), or check the reading \
                                   and its unit",
                        });
                    }
                }
                Some(given) => {
                    if let Some(w) = salinity_disagreement(given, from_conductivity, c) {
                        cautions.push(w);
                    }
                }
            }
        }
        let salinity = salinity.unwrap_or(0.0);
        // Temperature and salinity validated before the depth uses them.
        let conditions = Conditions::new(t, salinity)?;
        let pressure_dbar = match (self.depth_m, self.pressure_dbar) {
            (Some(_), Some(_)) => {
                return Err(Error::IncompatiblePair {
                    first: Field::Depth,
                    second: Field::Pressure,
                    reason: "the pressure follows from the depth, so the two could disagree; give \
                             one of them (depth in m, or pressure in dbar)",
                })
            }
            (Some(z), None) => pressure_dbar_at_depth(z, salinity, t)?,
            (None, p) => p.unwrap_or(0.0),
        };
        let mut conditions = conditions.with_pressure_dbar(pressure_dbar)?;
        if let Some(p) = self.air_pressure_atm(&mut cautions)? {
            conditions = conditions.with_air_pressure_atm(p)?;
        }
        let water = match self.medium {
            MediumChoice::Auto => Water::auto(conditions)?,
            MediumChoice::Fresh => Water::fresh(conditions)?,
            MediumChoice::Saline => Water::saline(conditions)?,
        };
        let fresh = water.medium() == Medium::Fresh;
        if fresh {
            let saline_only = [
                (Field::CarbonicFit, self.carbonic.map(|f| f.name())),
                (Field::BoronFit, self.boron.map(|f| f.name())),
                (Field::FluorideFit, self.fluoride_fit.map(|f| f.name())),
            ];
            for (field, name) in saline_only {
                if let Some(name) = name {
                    return Err(Error::WrongMedium {
                        field,
                        name: name.to_string(),
                        medium: "saline",
                        hint: "fresh water uses Plummer & Busenberg (1982) with activity \
                               coefficients; drop the option, or choose --water saline",
                    });
                }
            }
        } else if let Some(model) = self.activity {
            return Err(Error::WrongMedium {
                field: Field::Activity,
                name: model.name().to_string(),
                medium: "fresh",
                hint: "saline constants are stoichiometric and need no activity model; drop \
                       the option, or choose --water fresh",
            });
        } else {
            // Inputs that only set a fresh water's ionic strength would be
            // dropped in saline water, where salinity sets it: refused, not
            // ignored. Most samples give none of them: one test first.
            let any_fresh_only = self.tds_mg_l.is_some()
                || self.ionic_strength.is_some()
                || [
                    Total::Hardness,
                    Total::Magnesium,
                    Total::Sodium,
                    Total::Potassium,
                    Total::Chloride,
                ]
                .iter()
                .any(|t| self.total(*t).is_some());
            if any_fresh_only {
                let fresh_only = [
                    (Field::Tds, self.tds_mg_l.map(|v| format!("{v} mg/L"))),
                    (
                        Field::IonicStrength,
                        self.ionic_strength.map(|v| format!("{v} mol/kg")),
                    ),
                    (
                        Field::Hardness,
                        self.total(Total::Hardness).map(|q| q.to_string()),
                    ),
                    (
                        Field::Magnesium,
                        self.total(Total::Magnesium).map(|q| q.to_string()),
                    ),
                    (
                        Field::Sodium,
                        self.total(Total::Sodium).map(|q| q.to_string()),
                    ),
                    (
                        Field::Potassium,
                        self.total(Total::Potassium).map(|q| q.to_string()),
                    ),
                    (
                        Field::Chloride,
                        self.total(Total::Chloride).map(|q| q.to_string()),
                    ),
                ];
                if let Some((field, Some(name))) = fresh_only.into_iter().find(|(_, v)| v.is_some())
                {
                    return Err(Error::WrongMedium {
                        field,
                        name,
                        medium: "fresh",
                        hint: "in saline water the ionic strength and the major ions follow from \
                               salinity, so this would not be used; drop it, or choose --water \
                               fresh",
                    });
                }
            }
        }
        if self.calcium_fraction.is_some() && self.total(Total::Hardness).is_none() {
            return Err(Error::Missing {
                field: Field::Hardness,
                why: "; a calcium fraction is a fraction of the total hardness: give the \
                      hardness too, or give calcium itself",
            });
        }
        let mut fits = Fits::default();
        if let Some(f) = self.carbonic {
            fits = fits.with_carbonic(f);
        }
        if let Some(f) = self.boron {
            fits = fits.with_boron_total(f);
        }
        if let Some(f) = self.fluoride_fit {
            fits = fits.with_fluoride(f);
        }
        if let Some(f) = self.bisulfate {
            fits.bisulfate = f;
        }

        let mut comp = Composition::default();
        // Most samples give no totals: one test instead of one per total.
        if self.totals.iter().any(Option::is_some) {
            if let Some(a) = amount(Total::Phosphate, self.total(Total::Phosphate))? {
                comp = comp
                    .with_phosphate(a)
                    .map_err(retyped(Total::Phosphate, self.total(Total::Phosphate)))?;
            }
            if let Some(a) = amount(Total::Silicate, self.total(Total::Silicate))? {
                comp = comp
                    .with_silicate(a)
                    .map_err(retyped(Total::Silicate, self.total(Total::Silicate)))?;
            }
            if let Some(a) = amount(Total::Ammonia, self.total(Total::Ammonia))? {
                comp = comp
                    .with_ammonia(a)
                    .map_err(retyped(Total::Ammonia, self.total(Total::Ammonia)))?;
            }
            if let Some(a) = amount(Total::Sulfide, self.total(Total::Sulfide))? {
                comp = comp
                    .with_sulfide(a)
                    .map_err(retyped(Total::Sulfide, self.total(Total::Sulfide)))?;
            }
            let calcium = amount(Total::Calcium, self.total(Total::Calcium))?;
            if let Some(a) = calcium {
                comp = comp
                    .with_calcium(a)
                    .map_err(retyped(Total::Calcium, self.total(Total::Calcium)))?;
            }
            if let Some(h) = amount(Total::Hardness, self.total(Total::Hardness))? {
                // Calcium is part of the total hardness; more calcium than
                // hardness is a slip in one of them. Compared at 1 kg/L, with
                // 1 % to spare for the per-litre and per-kilogram bases.
                if let Some(ca) = calcium {
                    if ca.mol_kg(1000.0) > 1.01 * h.mol_kg(1000.0) {
                        return Err(Error::Inconsistent {
                            first: Field::Calcium,
                            second: Field::Hardness,
                            reason:
                                "calcium is more than the total hardness, of which it is a part; \
                                     check both (calcium hardness and total hardness are both \
                                     written as mg/L CaCO3)",
                        });
                    }
                }
                match self.calcium_fraction {
                    Some(f) => {
                        check_range(Field::CalciumFraction, f, 0.0, 1.0, "")?;
                        if self.total(Total::Calcium).is_some() {
                            return Err(Error::IncompatiblePair {
                                first: Field::Calcium,
                                second: Field::CalciumFraction,
                                reason:
                                    "give calcium, or hardness with a calcium fraction, not both",
                            });
                        }
                        let scale = |a: Amount, x: f64| match a {
                            Amount::PerKg(v) => Amount::PerKg(v * x),
                            Amount::PerLitre(v) => Amount::PerLitre(v * x),
                        };
                        if f > 0.0 {
                            comp = comp.with_calcium(scale(h, f))?;
                        }
                        comp = comp.with_magnesium(scale(h, 1.0 - f))?;
                    }
                    None => {
                        let magnesium = amount(Total::Magnesium, self.total(Total::Magnesium))?;
                        match (calcium, magnesium) {
                            // Total hardness is calcium plus magnesium (both as
                            // CaCO3): the one not given is the difference.
                            (Some(ca), None) => {
                                comp = comp.with_magnesium(difference(h, ca))?;
                                cautions.push(Warning::Note {
                                    code: "magnesium_from_hardness",
                                    text: "magnesium taken as the total hardness less the calcium",
                                });
                            }
                            (None, Some(mg)) => {
                                if mg.mol_kg(1000.0) > 1.01 * h.mol_kg(1000.0) {
                                    return Err(Error::Inconsistent {
                                        first: Field::Magnesium,
                                        second: Field::Hardness,
                                        reason:
                                            "magnesium is more than the total hardness, of which \
                                                 it is a part; check both",
                                    });
                                }
                                comp = comp.with_calcium(difference(h, mg))?;
                                cautions.push(Warning::Note {
                                    code: "calcium_from_hardness",
                                    text: "calcium taken as the total hardness less the magnesium",
                                });
                            }
                            (Some(ca), Some(mg)) => {
                                let sum = ca.mol_kg(1000.0) + mg.mol_kg(1000.0);
                                let total = h.mol_kg(1000.0);
                                if (sum - total).abs() > HARDNESS_AGREEMENT * total {
                                    cautions.push(Warning::Text {
                                        code: "hardness_disagrees",
                                        text: format!(
                                            "calcium and magnesium given add up to {:.0} mg/L as \
                                             CaCO3, the total hardness given is {:.0}: calcium and \
                                             magnesium were used; check the three",
                                            sum * CACO3_G_MOL * 1000.0,
                                            total * CACO3_G_MOL * 1000.0
                                        ),
                                    });
                                }
                            }
                            (None, None) => {
                                comp = comp.with_unassigned_hardness(h).map_err(retyped(
                                    Total::Hardness,
                                    self.total(Total::Hardness),
                                ))?
                            }
                        }
                    }
                }
            }
            if let Some(a) = amount(Total::Magnesium, self.total(Total::Magnesium))? {
                comp = comp
                    .with_magnesium(a)
                    .map_err(retyped(Total::Magnesium, self.total(Total::Magnesium)))?;
            }
            if let Some(a) = amount(Total::Sodium, self.total(Total::Sodium))? {
                comp = comp
                    .with_sodium(a)
                    .map_err(retyped(Total::Sodium, self.total(Total::Sodium)))?;
            }
            if let Some(a) = amount(Total::Potassium, self.total(Total::Potassium))? {
                comp = comp
                    .with_potassium(a)
                    .map_err(retyped(Total::Potassium, self.total(Total::Potassium)))?;
            }
            if let Some(a) = amount(Total::Chloride, self.total(Total::Chloride))? {
                comp = comp
                    .with_chloride(a)
                    .map_err(retyped(Total::Chloride, self.total(Total::Chloride)))?;
            }
            if let Some(a) = amount(Total::Sulfate, self.total(Total::Sulfate))? {
                comp = comp
                    .with_sulfate(a)
                    .map_err(retyped(Total::Sulfate, self.total(Total::Sulfate)))?;
            }
            if let Some(a) = amount(Total::Boron, self.total(Total::Boron))? {
                comp = comp
                    .with_boron(a)
                    .map_err(retyped(Total::Boron, self.total(Total::Boron)))?;
            }
        }

        let mut water = water.with_fits(fits).with_composition(comp);
        // A new water has no cautions: set only where there are some.
        if !cautions.is_empty() {
            water = water.with_input_cautions(cautions);
        }
        if let Some(c) = self.conductivity {
            water = water.with_given_conductivity(c, self.salinity.is_none());
        }
        if fresh {
            if let Some(m) = self.activity {
                water = water.with_activity_model(m);
            }
            if let Some(v) = spc {
                water = water.with_specific_conductance_us_cm(v)?;
            }
            if let Some(v) = self.tds_mg_l {
                water = water.with_tds_mg_l(v)?;
            }
            if let Some(v) = self.ionic_strength {
                water = water.with_ionic_strength(v)?;
            }
        }
        Ok(water)
    }
}

/// A sample as data: an object keyed by the command-line names of the
/// inputs given (`temperature`, `alkalinity`, `calcium`, `water`, ...),
/// each value as it would be typed: a number in the input's base unit, or
/// text with its unit or name (`"120 mg/L CaCO3"`, `"7.92 nbs"`, `"fresh"`).
///
/// ```
/// use travertine::sample::{inputs::Input, Sample};
/// use travertine::Parameter;
/// let mut s = Sample::new(22.0);
/// s.set(Input::Carbon(Parameter::Alkalinity), "120 mg/L CaCO3")?;
/// s.set(Input::Carbon(Parameter::Ph), "7.6")?;
/// let text = serde_json::to_string(&s).unwrap();
/// assert_eq!(text, r#"{"alkalinity":"120 mg/L CaCO3","ph":7.6,"temperature":22.0}"#);
/// assert_eq!(serde_json::from_str::<Sample>(&text).unwrap(), s);
/// # Ok::<(), travertine::Error>(())
/// ```
impl serde::Serialize for Sample {
    fn serialize<S: serde::Serializer>(
        &self,
        serializer: S,
    ) -> std::result::Result<S::Ok, S::Error> {
        use serde::ser::SerializeMap;
        let mut map = serializer.serialize_map(None)?;
        for spec in crate::sample::inputs::INPUTS {
            let Some(value) = self.get(spec.input) else {
                continue;
            };
            // A bare number where the input reads one; text otherwise.
            let text = spec.input.write(&value);
            match text.parse::<f64>() {
                Ok(v) => map.serialize_entry(spec.flag, &v)?,
                Err(_) => map.serialize_entry(spec.flag, &text)?,
            }
        }
        map.end()
    }
}

/// Reads the object [`Sample`] serialises to; an unknown name or a value
/// the input cannot read is an error naming it.
///
/// ```
/// use travertine::sample::Sample;
/// let s: Sample = serde_json::from_str(
///     r#"{"temperature": 18, "alkalinity": "85 mg/L CaCO3", "ph": "7.9", "calcium": "30 mg/L Ca"}"#,
/// ).unwrap();
/// assert!(s.water().is_ok() && s.pair().is_ok());
/// let e = serde_json::from_str::<Sample>(r#"{"temprature": 18}"#).unwrap_err();
/// assert!(e.to_string().contains("temprature"));
/// ```
impl<'de> serde::Deserialize<'de> for Sample {
    fn deserialize<D: serde::Deserializer<'de>>(
        deserializer: D,
    ) -> std::result::Result<Self, D::Error> {
        use serde::de::Error as _;
        let map = serde_json::Map::<String, serde_json::Value>::deserialize(deserializer)?;
        let mut sample = Sample::default();
        for (key, value) in map {
            let Some(spec) = crate::sample::inputs::INPUTS.iter().find(|s| s.flag == key) else {
                let names: Vec<&str> = crate::sample::inputs::INPUTS
                    .iter()
                    .map(|s| s.flag)
                    .collect();
                return Err(D::Error::custom(format!(
                    "`{key}` is not an input; the inputs are {}",
                    names.join(", ")
                )));
            };
            let text = match value {
                serde_json::Value::Null => continue,
                serde_json::Value::String(t) => t,
                serde_json::Value::Number(n) => n.to_string(),
                other => {
                    return Err(D::Error::custom(format!(
                        "{key}: expected a number or text, found {other}"
                    )))
                }
            };
            sample
                .set(spec.input, &text)
                .map_err(|e| D::Error::custom(format!("{key}: {e}")))?;
        }
        Ok(sample)
    }
}
