//! The outputs of a solve, described once.
//!
//! One list, in the `outputs!` invocation of this file, gives every output its
//! key, human label, unit, kind (which decides its precision, [`Digits`]),
//! table section, the tables that show it and how to read it from a
//! [`State`]. Everything that writes a state
//! is made from it:
//!
//! - the JSON of a state (`impl Serialize for State`, [`crate::output::json`]):
//!   every key, in list order, then `constants` and `warnings`;
//! - the human table ([`crate::output::table`]): the rows of each section,
//!   each number to its output's [`Digits`];
//! - the computed columns of the field sheet (`--columns all` is the list),
//!   each to the same rule.
//!
//! Adding an output means adding one row to the list.
//!
//! ```
//! use travertine::output::{Output, Value};
//! use travertine::{Conditions, Measured, Water};
//! let s = Water::saline(Conditions::new(25.0, 35.0)?)?
//!     .solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
//! for o in Output::ALL {
//!     match o.value(&s) {
//!         Value::Number(Some(v)) => println!("{} = {v} {}", o.key(), o.unit()),
//!         Value::Text(Some(t)) => println!("{} = {t}", o.key()),
//!         _ => println!("{}: none here", o.key()),
//!     }
//! }
//! assert_eq!(Output::Pco2.value(&s), Value::Number(Some(s.pco2_uatm)));
//! # Ok::<(), travertine::Error>(())
//! ```

use super::digits::Digits;
use crate::base::numeric::Real;
use crate::base::units::{CACO3_G_MOL, CO3_G_MOL, HCO3_G_MOL};
use crate::sample::water::Medium;
use crate::state::{Exchange, State};
use serde::{Serialize, Serializer};

/// The value of one output in a state: a number, a missing number, or a
/// text such as the medium's name.
///
/// A number is `None` where the state has none, for example Ω without
/// calcium, or a fresh-water figure in saline water; a text is `None` the
/// same way. It serialises as a JSON number or string, or `null` for a
/// missing value and for a number that is not finite.
///
/// ```
/// use travertine::output::Value;
/// assert_eq!(serde_json::to_string(&Value::Number(Some(1.5))).unwrap(), "1.5");
/// assert_eq!(serde_json::to_string(&Value::Number(None)).unwrap(), "null");
/// assert_eq!(serde_json::to_string(&Value::Number(Some(f64::NAN))).unwrap(), "null");
/// assert_eq!(serde_json::to_string(&Value::Text(Some("fresh"))).unwrap(), "\"fresh\"");
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum Value {
    /// A number; `None` when the state has none.
    Number(Option<f64>),
    /// A name; `None` when the state has none.
    Text(Option<&'static str>),
}

impl Serialize for Value {
    fn serialize<S: Serializer>(&self, serializer: S) -> Result<S::Ok, S::Error> {
        match *self {
            Value::Number(Some(v)) if v.is_finite() => serializer.serialize_f64(v),
            Value::Text(Some(t)) => serializer.serialize_str(t),
            _ => serializer.serialize_none(),
        }
    }
}

/// A section of the human table, in the order the table prints them.
///
/// `Conditions` and `Fits` have no rows in the table: the conditions are
/// in its header line and the fits in its `Constants` block.
///
/// ```
/// use travertine::output::{Output, Section};
/// assert_eq!(Output::Pco2.section(), Section::Gas);
/// assert_eq!(Section::AlkalinityParts.title(), "Alkalinity parts");
/// assert!(Section::ALL.windows(2).all(|w| w[0] != w[1]));
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum Section {
    /// Temperature, salinity, pressure and the medium.
    Conditions,
    /// pH on each scale.
    Acidity,
    /// Alkalinity, DIC, the species and the Revelle factor.
    Carbon,
    /// CO2 fugacity, partial pressure and mole fraction.
    Gas,
    /// Ω, saturation indices, calcium and the calcium carbonate figures.
    Saturation,
    /// Each part of the alkalinity.
    AlkalinityParts,
    /// Per-litre (mg/L) figures and the density used for them.
    TradeUnits,
    /// Ionic strength, activity coefficients and the charge balance.
    Medium,
    /// The fits used.
    Fits,
    // issue 11: toxic fractions
    /// The un-ionised (toxic) forms of ammonia and sulfide.
    ToxicFractions,
    // issue 11: air–water CO2 exchange
    /// The exchange of CO2 with the air (shown where it was computed).
    Exchange,
}

/// The title printed above the section.
///
/// ```
/// use travertine::output::Section;
/// assert_eq!(Section::Gas.to_string(), "Gas");
/// ```
impl std::fmt::Display for Section {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.title())
    }
}

impl Section {
    /// Every section, in table order.
    pub const ALL: &'static [Section] = &[
        Section::Conditions,
        Section::Acidity,
        Section::Carbon,
        Section::Gas,
        Section::Saturation,
        Section::AlkalinityParts,
        Section::TradeUnits,
        Section::Medium,
        // issue 11: toxic fractions
        Section::ToxicFractions,
        Section::Exchange,
        Section::Fits,
    ];

    /// The title printed above the section.
    ///
    /// ```
    /// use travertine::output::Section;
    /// assert_eq!(Section::TradeUnits.title(), "Trade units");
    /// ```
    pub fn title(self) -> &'static str {
        match self {
            Section::Conditions => "Conditions",
            Section::Acidity => "Acidity",
            Section::Carbon => "Carbon",
            Section::Gas => "Gas",
            Section::Saturation => "Saturation",
            Section::AlkalinityParts => "Alkalinity parts",
            Section::TradeUnits => "Trade units",
            Section::Medium => "Medium",
            Section::Fits => "Constants",
            Section::ToxicFractions => "Toxic fractions",
            Section::Exchange => "Exchange with the air",
        }
    }
}

/// Where the table of one medium puts an output.
///
/// ```
/// use travertine::output::{Output, Place};
/// use travertine::Medium;
/// // Fresh water leads with its working scale; saline water calls that pH approximate.
/// assert_eq!(Output::PhNbs.place(Medium::Fresh), Place::First);
/// assert_eq!(Output::PhNbs.place(Medium::Saline), Place::Labelled("pH, NBS scale (approximate)"));
/// assert_eq!(Output::PhTotal.place(Medium::Fresh), Place::Hidden);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[non_exhaustive]
pub enum Place {
    /// Not a row of this medium's table.
    Hidden,
    /// A row of its section, in list order.
    Row,
    /// A row ahead of the others of its section.
    First,
    /// A row of its section in list order, under this label rather than
    /// [`Output::label`].
    Labelled(&'static str),
}

impl Place {
    /// Whether the table shows the output at all.
    ///
    /// ```
    /// use travertine::output::Place;
    /// assert!(Place::Row.shown() && !Place::Hidden.shown());
    /// ```
    pub fn shown(self) -> bool {
        self != Place::Hidden
    }
}

/// What kind of quantity an output is. The kind decides the precision
/// the table and the sheet write it with, here and nowhere else
/// ([`Kind::digits`]); the unit tests check that the kinds agree with the
/// units.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
enum Kind {
    /// A temperature, °C.
    Temperature,
    /// Practical salinity.
    Salinity,
    /// A gauge pressure, dbar.
    Pressure,
    /// A pH on any scale, the saturation pH included.
    Ph,
    /// An amount of substance or a gas: µmol/kg, µatm, ppm.
    Amount,
    /// A mass per litre: mg/L, mg/L as C, mg/L as CaCO3.
    MassConcentration,
    /// A saturation state Ω.
    SaturationState,
    /// A saturation index: log10 Ω, the Langelier index.
    SaturationIndex,
    /// A buffer factor (the Revelle factor).
    Factor,
    /// Ionic strength, mol/kg.
    IonicStrength,
    /// An activity coefficient.
    ActivityCoefficient,
    /// An activity (molal, dimensionless).
    Activity,
    /// A percentage.
    Percent,
    /// A density, kg/m3.
    Density,
    /// A name, not a number.
    Name,
    // issue 11: toxic fractions
    /// A fraction of a total, 0 to 1.
    Fraction,
    // issue 11: air–water CO2 exchange
    /// A gas transfer velocity, cm/h.
    TransferVelocity,
    /// A flux across the water surface, mmol m⁻² d⁻¹.
    Flux,
}

impl Kind {
    /// The precision rule of each kind: the digits its measurement
    /// supports. `None` for a name.
    ///
    /// - pH, the saturation pH: 3 decimals (a glass electrode reads to
    ///   0.01, a spectrophotometric pH to 0.001);
    /// - µmol/kg, µatm, ppm: 4 significant figures (alkalinity and DIC
    ///   titrate to about 0.1 %);
    /// - mg/L: 3 significant figures (a field titration or kit);
    /// - Ω, the Revelle factor, ionic strength, an activity: 3 significant
    ///   figures (2–3 decimals at their usual sizes, and a small Ω keeps
    ///   its figures);
    /// - saturation index, Langelier index: 2 decimals;
    /// - temperature 2 decimals, pressure 1, salinity 4 significant
    ///   figures, activity coefficient 3 decimals, a percentage 1 decimal,
    ///   density 2 decimals;
    /// - a fraction of a total (the un-ionised ammonia): 3 significant
    ///   figures, as the mg/L it multiplies.
    /// - a transfer velocity (cm/h) and a CO2 flux (mmol m⁻² d⁻¹): 3
    ///   significant figures (the models scatter by tens of percent; the
    ///   Schmidt number and the saturation ratio are factors, 3 too).
    fn digits(self) -> Option<Digits> {
        use Digits::{Decimals, Significant};
        Some(match self {
            Kind::Temperature => Decimals(2),
            Kind::Salinity => Significant(4),
            Kind::Pressure => Decimals(1),
            Kind::Ph => Decimals(3),
            Kind::Amount => Significant(4),
            Kind::MassConcentration => Significant(3),
            Kind::SaturationState => Significant(3),
            Kind::SaturationIndex => Decimals(2),
            Kind::Factor => Significant(3),
            Kind::IonicStrength => Significant(3),
            Kind::ActivityCoefficient => Decimals(3),
            Kind::Activity => Significant(3),
            Kind::Percent => Decimals(1),
            Kind::Density => Decimals(2),
            Kind::Name => return None,
            Kind::Fraction => Significant(3),
            Kind::TransferVelocity => Significant(3),
            Kind::Flux => Significant(3),
        })
    }
}

/// The value of one output in a state of any [`Real`]: what the list
/// reads, before [`Value`] (on `f64`) or [`Output::numbers`] (on any).
enum Reading<'a, R> {
    Number(Option<Num<'a, R>>),
    Text(Option<&'static str>),
}

/// A number of the list: a field of the state, by reference (a number on
/// tangents is a large value, not to be copied only to be read), or one
/// computed from the state's fields.
#[derive(Clone, Copy)]
enum Num<'a, R> {
    At(&'a R),
    Made(R),
}

impl<R: Copy> Num<'_, R> {
    #[inline(always)]
    fn get(self) -> R {
        match self {
            Num::At(r) => *r,
            Num::Made(v) => v,
        }
    }
}

impl From<Reading<'_, f64>> for Value {
    #[inline(always)]
    fn from(r: Reading<'_, f64>) -> Value {
        match r {
            Reading::Number(v) => Value::Number(v.map(Num::get)),
            Reading::Text(t) => Value::Text(t),
        }
    }
}

/// A number computed from the state.
#[inline(always)]
fn n<'a, R: Real>(v: R) -> Reading<'a, R> {
    Reading::Number(Some(Num::Made(v)))
}

/// A number computed from the state, where it has one.
#[inline(always)]
fn o<'a, R: Real>(v: Option<R>) -> Reading<'a, R> {
    Reading::Number(v.map(Num::Made))
}

/// A field of the state.
#[inline(always)]
fn at<R: Real>(v: &R) -> Reading<'_, R> {
    Reading::Number(Some(Num::At(v)))
}

/// A field of the state, where it has one.
#[inline(always)]
fn opt_at<R: Real>(v: &Option<R>) -> Reading<'_, R> {
    Reading::Number(v.as_ref().map(Num::At))
}

/// A figure of the exchange with the air, where it was computed.
#[inline(always)]
fn ex<R: Real>(s: &State<R>, figure: impl Fn(&Exchange<R>) -> Option<R>) -> Reading<'_, R> {
    Reading::Number(s.exchange.as_ref().and_then(figure).map(Num::Made))
}

/// µmol/kg to mg/L of a species of molar mass `g_mol`, with the density of the state.
#[inline(always)]
fn mg_l<R: Real>(s: &State<R>, umol_kg: R, g_mol: f64) -> R {
    umol_kg * 1e-6 * s.density_kg_m3 * g_mol
}

/// Generates [`Output`] and its descriptions from one list. A row reads
///
/// ```text
/// Variant => "key", "label", "unit", Kind, Section, [fresh place, saline place], |state| value;
/// ```
///
/// where the kind gives the precision rule ([`Kind`]) and a place is
/// `Hidden`, `Row`, `First` or `Labelled("label")` (see [`Place`]).
macro_rules! outputs {
    ($(
        $variant:ident => $key:literal, $label:literal, $unit:literal, $kind:ident,
        $section:ident, [$fresh:expr, $saline:expr], |$s:ident| $value:expr;
    )*) => {
        /// An output of a solve: a JSON key of `travertine solve --json`,
        /// a computed column of the field sheet and, where its medium shows
        /// it, a row of the human table.
        ///
        /// ```
        /// use travertine::output::Output;
        /// assert_eq!(Output::from_key("pco2_uatm"), Some(Output::Pco2));
        /// assert_eq!(Output::Pco2.key(), "pco2_uatm");
        /// assert_eq!(Output::Pco2.unit(), "µatm");
        /// ```
        #[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
        #[non_exhaustive]
        pub enum Output {
            $(
                #[doc = concat!("`", $key, "`: ", $label, ".")]
                $variant,
            )*
        }

        impl Output {
            /// Every output, in the order of the JSON keys and of `--columns all`.
            ///
            /// ```
            /// use travertine::output::Output;
            /// assert_eq!(Output::ALL[0].key(), "temperature_c");
            /// ```
            pub const ALL: &'static [Output] = &[ $( Output::$variant, )* ];

            /// How many outputs the list has.
            ///
            /// ```
            /// use travertine::output::Output;
            /// assert_eq!(Output::COUNT, Output::ALL.len());
            /// ```
            pub const COUNT: usize = Self::ALL.len();

            /// Its place in [`Output::ALL`].
            ///
            /// ```
            /// use travertine::output::Output;
            /// assert!(Output::ALL.iter().enumerate().all(|(i, o)| o.index() == i));
            /// ```
            pub fn index(self) -> usize {
                self as usize
            }

            /// Every output's number in a state, in the order of
            /// [`Output::ALL`] (`None` where the state has none, and for a
            /// name): one pass over the list, without a dispatch per
            /// output, for a caller that reads many outputs of many states
            /// (the propagation of uncertainties).
            ///
            /// ```
            /// use travertine::output::{Output, Value};
            /// use travertine::{Conditions, Measured, Water};
            /// let s = Water::saline(Conditions::new(25.0, 35.0)?)?
            ///     .solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
            /// let all = Output::numbers(&s);
            /// for o in Output::ALL {
            ///     let number = match o.value(&s) {
            ///         Value::Number(v) => v,
            ///         _ => None,
            ///     };
            ///     assert_eq!(all[o.index()], number);
            /// }
            /// # Ok::<(), travertine::Error>(())
            /// ```
            ///
            /// On a state of [`Tangent`](crate::base::numeric::Tangent)s
            /// (the propagation of uncertainties), every number with its
            /// derivatives.
            pub fn numbers<R: Real>(state: &State<R>) -> [Option<R>; Output::COUNT] {
                [ $( {
                    let $s = state;
                    match $value {
                        Reading::Number(v) => v.map(Num::get),
                        Reading::Text(_) => None,
                    }
                }, )* ]
            }

            /// Its number in a state of any [`Real`] (`None` where the
            /// state has none, and for a name): one output, where
            /// [`Output::numbers`] reads them all.
            ///
            /// ```
            /// use travertine::output::Output;
            /// use travertine::{Conditions, Measured, Water};
            /// let s = Water::saline(Conditions::new(25.0, 35.0)?)?
            ///     .solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
            /// assert_eq!(Output::Pco2.number(&s), Some(s.pco2_uatm));
            /// assert_eq!(Output::Water.number(&s), None);
            /// # Ok::<(), travertine::Error>(())
            /// ```
            #[inline]
            pub fn number<R: Real>(self, state: &State<R>) -> Option<R> {
                match self {
                    $( Output::$variant => {
                        let $s = state;
                        match $value {
                            Reading::Number(v) => v.map(Num::get),
                            Reading::Text(_) => None,
                        }
                    } )*
                }
            }

            /// Gives `f` its number in a state of any [`Real`] (`None`
            /// where the state has none, and for a name), as
            /// [`Output::number`] but by reference: where the output is a
            /// field of the state, the field where it lies (a number on
            /// tangents is a large value, not to be copied only to be
            /// read).
            #[inline]
            pub(crate) fn with_number<R: Real, T>(
                self,
                state: &State<R>,
                f: impl FnOnce(Option<&R>) -> T,
            ) -> T {
                match self {
                    $( Output::$variant => {
                        let $s = state;
                        match $value {
                            Reading::Number(Some(Num::At(r))) => f(Some(r)),
                            Reading::Number(Some(Num::Made(v))) => f(Some(&v)),
                            _ => f(None),
                        }
                    } )*
                }
            }

            /// The key: the JSON key and the sheet's column name, snake_case.
            ///
            /// ```
            /// use travertine::output::Output;
            /// assert_eq!(Output::AlkalinityMgL.key(), "alkalinity_mg_l_caco3");
            /// ```
            pub fn key(self) -> &'static str {
                match self { $( Output::$variant => $key, )* }
            }

            /// The label of its table row (see [`Output::place`] for a
            /// medium that labels it otherwise).
            ///
            /// ```
            /// use travertine::output::Output;
            /// assert_eq!(Output::Revelle.label(), "Revelle factor");
            /// ```
            pub fn label(self) -> &'static str {
                match self { $( Output::$variant => $label, )* }
            }

            /// The unit, as printed (empty for a plain number or a text).
            ///
            /// ```
            /// use travertine::output::Output;
            /// assert_eq!(Output::DicMgL.unit(), "mg/L as C");
            /// assert_eq!(Output::PhTotal.unit(), "");
            /// ```
            pub fn unit(self) -> &'static str {
                match self { $( Output::$variant => $unit, )* }
            }

            /// What kind of quantity it is, which decides its precision.
            fn kind(self) -> Kind {
                match self { $( Output::$variant => Kind::$kind, )* }
            }

            /// The table section it belongs to.
            ///
            /// ```
            /// use travertine::output::{Output, Section};
            /// assert_eq!(Output::Langelier.section(), Section::Saturation);
            /// ```
            pub fn section(self) -> Section {
                match self { $( Output::$variant => Section::$section, )* }
            }

            /// Where the table of a state in `medium` shows it.
            ///
            /// ```
            /// use travertine::output::{Output, Place};
            /// use travertine::Medium;
            /// assert_eq!(Output::Langelier.place(Medium::Fresh), Place::Row);
            /// assert_eq!(Output::Langelier.place(Medium::Saline), Place::Hidden);
            /// ```
            pub fn place(self, medium: Medium) -> Place {
                #[allow(unused_imports)]
                use Place::*;
                let fresh = medium == Medium::Fresh;
                match self {
                    $( Output::$variant => if fresh { $fresh } else { $saline }, )*
                }
            }

            /// Its value in a state. A plain match: cheap enough for every
            /// cell of a sheet.
            ///
            /// ```
            /// use travertine::output::{Output, Value};
            /// use travertine::{Conditions, Measured, Water};
            /// let s = Water::saline(Conditions::new(25.0, 35.0)?)?
            ///     .solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
            /// assert_eq!(Output::Water.value(&s), Value::Text(Some("saline")));
            /// assert_eq!(Output::Langelier.value(&s), Value::Number(None));
            /// # Ok::<(), travertine::Error>(())
            /// ```
            #[inline(always)]
            pub fn value(self, state: &State) -> Value {
                match self {
                    $( Output::$variant => {
                        let $s = state;
                        Value::from($value)
                    } )*
                }
            }
        }
    };
}

outputs! {
    // Conditions: in the table's header line, not in its rows.
    TemperatureC => "temperature_c", "temperature", "°C", Temperature,
        Conditions, [Hidden, Hidden], |s| at(&s.temperature_c);
    Salinity => "salinity", "practical salinity", "", Salinity,
        Conditions, [Hidden, Hidden], |s| at(&s.salinity);
    PressureDbar => "pressure_dbar", "gauge pressure", "dbar", Pressure,
        Conditions, [Hidden, Hidden], |s| at(&s.pressure_dbar);
    Water => "water", "medium", "", Name,
        Conditions, [Hidden, Hidden], |s| Reading::Text(Some(s.medium.name()));

    // Acidity: fresh water leads with its working scale, the NBS scale.
    PhTotal => "ph_total", "pH, total scale", "", Ph,
        Acidity, [Hidden, Row], |s| at(&s.ph_total);
    PhSeawater => "ph_seawater", "pH, sea-water scale", "", Ph,
        Acidity, [Hidden, Row], |s| at(&s.ph_seawater);
    PhFree => "ph_free", "pH, free scale", "", Ph,
        Acidity, [Row, Row], |s| at(&s.ph_free);
    PhNbs => "ph_nbs", "pH, NBS scale", "", Ph,
        Acidity, [First, Labelled("pH, NBS scale (approximate)")], |s| at(&s.ph_nbs);

    AlkalinityUmolKg => "alkalinity_umol_kg", "alkalinity", "µmol/kg", Amount,
        Carbon, [Row, Row], |s| at(&s.alkalinity_umol_kg);
    DicUmolKg => "dic_umol_kg", "dissolved inorganic carbon", "µmol/kg", Amount,
        Carbon, [Row, Row], |s| at(&s.dic_umol_kg);
    Co2UmolKg => "co2_umol_kg", "CO2*", "µmol/kg", Amount,
        Carbon, [Row, Row], |s| at(&s.co2_umol_kg);
    Hco3UmolKg => "hco3_umol_kg", "bicarbonate HCO3-", "µmol/kg", Amount,
        Carbon, [Row, Row], |s| at(&s.hco3_umol_kg);
    Co3UmolKg => "co3_umol_kg", "carbonate CO3--", "µmol/kg", Amount,
        Carbon, [Row, Row], |s| at(&s.co3_umol_kg);

    Fco2 => "fco2_uatm", "fCO2", "µatm", Amount,
        Gas, [Row, Row], |s| at(&s.fco2_uatm);
    Pco2 => "pco2_uatm", "pCO2", "µatm", Amount,
        Gas, [Row, Row], |s| at(&s.pco2_uatm);
    Xco2 => "xco2_ppm", "xCO2 (dry air)", "ppm", Amount,
        Gas, [Row, Row], |s| at(&s.xco2_ppm);

    OmegaCalcite => "omega_calcite", "calcite Ω", "", SaturationState,
        Saturation, [Row, Row], |s| opt_at(&s.omega_calcite);
    OmegaAragonite => "omega_aragonite", "aragonite Ω", "", SaturationState,
        Saturation, [Row, Row], |s| opt_at(&s.omega_aragonite);
    SiCalcite => "si_calcite", "calcite SI (log10 Ω)", "", SaturationIndex,
        Saturation, [Row, Row], |s| opt_at(&s.si_calcite);
    SiAragonite => "si_aragonite", "aragonite SI (log10 Ω)", "", SaturationIndex,
        Saturation, [Row, Row], |s| opt_at(&s.si_aragonite);

    Revelle => "revelle_factor", "Revelle factor", "", Factor,
        Carbon, [Row, Row], |s| at(&s.revelle_factor);

    CarbonateAlkalinity => "carbonate_alkalinity_umol_kg", "carbonate", "µmol/kg", Amount,
        AlkalinityParts, [Row, Row], |s| at(&s.carbonate_alkalinity_umol_kg);
    BorateAlkalinity => "borate_alkalinity_umol_kg", "borate", "µmol/kg", Amount,
        AlkalinityParts, [Row, Row], |s| at(&s.borate_alkalinity_umol_kg);
    Hydroxide => "hydroxide_umol_kg", "hydroxide", "µmol/kg", Amount,
        AlkalinityParts, [Row, Row], |s| at(&s.hydroxide_umol_kg);
    PhosphateAlkalinity => "phosphate_alkalinity_umol_kg", "phosphate", "µmol/kg", Amount,
        AlkalinityParts, [Row, Row], |s| at(&s.phosphate_alkalinity_umol_kg);
    SilicateAlkalinity => "silicate_alkalinity_umol_kg", "silicate", "µmol/kg", Amount,
        AlkalinityParts, [Row, Row], |s| at(&s.silicate_alkalinity_umol_kg);
    AmmoniaAlkalinity => "ammonia_alkalinity_umol_kg", "ammonia", "µmol/kg", Amount,
        AlkalinityParts, [Row, Row], |s| at(&s.ammonia_alkalinity_umol_kg);
    SulfideAlkalinity => "sulfide_alkalinity_umol_kg", "sulfide", "µmol/kg", Amount,
        AlkalinityParts, [Row, Row], |s| at(&s.sulfide_alkalinity_umol_kg);
    FreeHydrogen => "free_hydrogen_umol_kg", "free hydrogen (minus)", "µmol/kg", Amount,
        AlkalinityParts, [Row, Row], |s| at(&s.free_hydrogen_umol_kg);
    Bisulfate => "bisulfate_umol_kg", "bisulfate (minus)", "µmol/kg", Amount,
        AlkalinityParts, [Row, Row], |s| at(&s.bisulfate_umol_kg);
    HydrogenFluoride => "hydrogen_fluoride_umol_kg", "hydrogen fluoride (minus)", "µmol/kg", Amount,
        AlkalinityParts, [Row, Row], |s| at(&s.hydrogen_fluoride_umol_kg);

    Calcium => "calcium_umol_kg", "calcium", "µmol/kg", Amount,
        Saturation, [Row, Row], |s| opt_at(&s.calcium_umol_kg);
    CalciumFree => "calcium_free_umol_kg", "free calcium", "µmol/kg", Amount,
        Saturation, [Row, Hidden], |s| opt_at(&s.calcium_free_umol_kg);
    CalciumActivity => "calcium_activity", "free calcium activity", "", Activity,
        Saturation, [Hidden, Hidden], |s| opt_at(&s.calcium_activity);
    Cahco3 => "cahco3_umol_kg", "CaHCO3+ pair", "µmol/kg", Amount,
        Saturation, [Row, Hidden], |s| opt_at(&s.cahco3_umol_kg);
    Caco3Pair => "caco3_pair_umol_kg", "CaCO3 pair", "µmol/kg", Amount,
        Saturation, [Row, Hidden], |s| opt_at(&s.caco3_pair_umol_kg);

    // The source of the ionic strength is in the table's header line.
    IonicStrength => "ionic_strength", "ionic strength", "mol/kg", IonicStrength,
        Medium, [Row, Row], |s| at(&s.ionic_strength);
    IonicStrengthFrom => "ionic_strength_from", "ionic strength from", "", Name,
        Medium, [Hidden, Hidden], |s| Reading::Text(s.ionic_strength_from.map(|r| r.name()));
    GammaMonovalent => "gamma_monovalent", "activity coefficient, z = 1", "", ActivityCoefficient,
        Medium, [Row, Hidden], |s| opt_at(&s.gamma_monovalent);
    GammaDivalent => "gamma_divalent", "activity coefficient, z = 2", "", ActivityCoefficient,
        Medium, [Row, Hidden], |s| opt_at(&s.gamma_divalent);
    ChargeBalance => "charge_balance_percent", "charge balance of ions given", "%", Percent,
        Medium, [Row, Hidden], |s| opt_at(&s.charge_balance_percent);

    SaturationPh => "saturation_ph_nbs", "saturation pH, pHs (NBS)", "", Ph,
        Saturation, [Row, Hidden], |s| opt_at(&s.saturation_ph_nbs);
    Langelier => "langelier_index", "Langelier index", "", SaturationIndex,
        Saturation, [Row, Hidden], |s| opt_at(&s.langelier_index);
    PrecipitationPotential => "precipitation_potential_mg_l_caco3",
        "CaCO3 precipitation potential", "mg/L as CaCO3", MassConcentration,
        Saturation, [Row, Hidden], |s| opt_at(&s.precipitation_potential_mg_l_caco3);

    AlkalinityMgL => "alkalinity_mg_l_caco3", "alkalinity", "mg/L as CaCO3", MassConcentration,
        TradeUnits, [Row, Row], |s| at(&s.alkalinity_mg_l_caco3);
    DicMgL => "dic_mg_l_c", "dissolved inorganic carbon", "mg/L as C", MassConcentration,
        TradeUnits, [Row, Row], |s| at(&s.dic_mg_l_c);
    FreeCo2MgL => "free_co2_mg_l", "free CO2", "mg/L", MassConcentration,
        TradeUnits, [Row, Row], |s| at(&s.free_co2_mg_l);
    Hco3MgL => "hco3_mg_l", "bicarbonate HCO3-", "mg/L", MassConcentration,
        TradeUnits, [Hidden, Hidden], |s| n(mg_l(s, s.hco3_umol_kg, HCO3_G_MOL));
    Co3MgL => "co3_mg_l", "carbonate CO3--", "mg/L", MassConcentration,
        TradeUnits, [Hidden, Hidden], |s| n(mg_l(s, s.co3_umol_kg, CO3_G_MOL));
    CalciumHardness => "calcium_hardness_mg_l_caco3", "calcium hardness", "mg/L as CaCO3",
        MassConcentration, TradeUnits, [Row, Hidden],
        |s| o(s.calcium_umol_kg.map(|c| c * 1e-6 * s.density_kg_m3 * CACO3_G_MOL));
    Density => "density_kg_m3", "density used", "kg/m3", Density,
        TradeUnits, [Row, Row], |s| at(&s.density_kg_m3);
    // issue 12: the totals a saved result carries, for blending (not rows
    // of the table: the inputs show them)
    PhosphateTotal => "phosphate_total_umol_kg", "total phosphate", "µmol/kg", Amount,
        Carbon, [Hidden, Hidden], |s| n(s.totals.phosphate_mol_kg * 1e6);
    SilicateTotal => "silicate_total_umol_kg", "total silicate", "µmol/kg", Amount,
        Carbon, [Hidden, Hidden], |s| n(s.totals.silicate_mol_kg * 1e6);
    AmmoniaTotal => "ammonia_total_umol_kg", "total ammonia", "µmol/kg", Amount,
        Carbon, [Hidden, Hidden], |s| n(s.totals.ammonia_mol_kg * 1e6);
    SulfideTotal => "sulfide_total_umol_kg", "total sulfide", "µmol/kg", Amount,
        Carbon, [Hidden, Hidden], |s| n(s.totals.sulfide_mol_kg * 1e6);
    BoronTotal => "boron_total_umol_kg", "total boron", "µmol/kg", Amount,
        Carbon, [Hidden, Hidden], |s| n(s.totals.boron_mol_kg * 1e6);
    SulfateTotal => "sulfate_total_umol_kg", "total sulfate", "µmol/kg", Amount,
        Carbon, [Hidden, Hidden], |s| n(s.totals.sulfate_mol_kg * 1e6);
    FluorideTotal => "fluoride_total_umol_kg", "total fluoride", "µmol/kg", Amount,
        Carbon, [Hidden, Hidden], |s| n(s.totals.fluoride_mol_kg * 1e6);

    // The fits are in the table's Constants block.
    CarbonicFit => "carbonic_fit", "K1, K2", "", Name,
        Fits, [Hidden, Hidden], |s| Reading::Text(Some(s.fits_used.carbonic.as_str()));

    // issue 11: toxic fractions (null where the total was not given)
    Nh3Fraction => "nh3_fraction", "un-ionised ammonia, fraction of total", "", Fraction,
        ToxicFractions, [Row, Row], |s| opt_at(&s.nh3_fraction);
    Nh3MgLN => "nh3_mg_l_n", "un-ionised ammonia NH3", "mg/L as N", MassConcentration,
        ToxicFractions, [Row, Row], |s| opt_at(&s.nh3_mg_l_n);
    Nh3MgL => "nh3_mg_l", "un-ionised ammonia NH3", "mg/L", MassConcentration,
        ToxicFractions, [Row, Row], |s| opt_at(&s.nh3_mg_l);
    H2sFraction => "h2s_fraction", "hydrogen sulfide H2S, fraction of total", "", Fraction,
        ToxicFractions, [Row, Row], |s| opt_at(&s.h2s_fraction);
    H2sMgL => "h2s_mg_l", "hydrogen sulfide H2S", "mg/L", MassConcentration,
        ToxicFractions, [Row, Row], |s| opt_at(&s.h2s_mg_l);
    // issue 11: air–water CO2 exchange (null unless computed: see State::with_exchange)
    AirPco2 => "air_pco2_uatm", "pCO2 of the air", "µatm", Amount,
        Exchange, [Row, Row], |s| ex(s, |e| Some(e.air_pco2_uatm));
    Co2SaturationRatio => "co2_saturation_ratio", "CO2 saturation (water/air pCO2)", "", Factor,
        Exchange, [Row, Row], |s| ex(s, |e| Some(e.co2_saturation_ratio));
    EquilibriumPh => "equilibrium_ph", "pH at equilibrium with the air", "", Ph,
        Exchange, [Row, Row], |s| ex(s, |e| e.equilibrium_ph);
    EquilibriumPhScale => "equilibrium_ph_scale", "its pH scale", "", Name,
        Exchange, [Row, Row],
        |s| Reading::Text(s.exchange.as_ref().map(|e| e.equilibrium_ph_scale.name()));
    EquilibriumFreeCo2 => "equilibrium_free_co2_mg_l", "free CO2 at equilibrium with the air",
        "mg/L", MassConcentration,
        Exchange, [Row, Row], |s| ex(s, |e| e.equilibrium_free_co2_mg_l);
    SchmidtNumber => "schmidt_number", "Schmidt number of CO2", "", Factor,
        Exchange, [Row, Row], |s| ex(s, |e| Some(e.schmidt_number));
    GasTransfer => "gas_transfer", "transfer velocity model", "", Name,
        Exchange, [Row, Row], |s| Reading::Text(s.exchange.as_ref().map(|e| e.gas_transfer.name()));
    K600 => "k600_cm_h", "k600", "cm/h", TransferVelocity,
        Exchange, [Row, Row], |s| ex(s, |e| e.k600_cm_h);
    KCo2 => "k_cm_h", "transfer velocity of CO2, k", "cm/h", TransferVelocity,
        Exchange, [Row, Row], |s| ex(s, |e| e.k_cm_h);
    Co2Flux => "co2_flux_mmol_m2_d", "CO2 flux (+ out of the water)", "mmol/m2/d", Flux,
        Exchange, [Row, Row], |s| ex(s, |e| e.co2_flux_mmol_m2_d);
}

impl Output {
    /// The output of this key.
    ///
    /// ```
    /// use travertine::output::Output;
    /// assert_eq!(Output::from_key("langelier_index"), Some(Output::Langelier));
    /// assert_eq!(Output::from_key("no_such_key"), None);
    /// ```
    pub fn from_key(key: &str) -> Option<Output> {
        Output::ALL.iter().copied().find(|o| o.key() == key)
    }

    /// The precision rule the table and the CSV of a sheet write it with
    /// (unless every digit is asked for, [`crate::output::Precision::Full`]);
    /// `None` for a name. It follows from the kind of quantity the output
    /// is, in one place: pH 3 decimals, µmol/kg, µatm and ppm 4 significant
    /// figures, mg/L 3 significant figures, Ω 3 significant figures,
    /// saturation and Langelier indices 2 decimals.
    ///
    /// ```
    /// use travertine::output::{Digits, Output};
    /// assert_eq!(Output::PhTotal.digits(), Some(Digits::Decimals(3)));
    /// assert_eq!(Output::Pco2.digits(), Some(Digits::Significant(4)));
    /// assert_eq!(Output::FreeCo2MgL.digits(), Some(Digits::Significant(3)));
    /// assert_eq!(Output::Water.digits(), None);
    /// ```
    pub fn digits(self) -> Option<Digits> {
        self.kind().digits()
    }

    /// The label of its row in the table of `medium`, `None` where that
    /// table does not show it.
    ///
    /// ```
    /// use travertine::output::Output;
    /// use travertine::Medium;
    /// assert_eq!(Output::PhNbs.label_in(Medium::Fresh), Some("pH, NBS scale"));
    /// assert_eq!(Output::PhTotal.label_in(Medium::Fresh), None);
    /// ```
    pub fn label_in(self, medium: Medium) -> Option<&'static str> {
        match self.place(medium) {
            Place::Hidden => None,
            Place::Row | Place::First => Some(self.label()),
            Place::Labelled(l) => Some(l),
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The unit a key's suffix promises, most specific suffix first.
    const SUFFIX_UNITS: &[(&str, &str)] = &[
        ("_mg_l_caco3", "mg/L as CaCO3"),
        ("_mg_l_c", "mg/L as C"),
        ("_mg_l_n", "mg/L as N"),
        ("_mg_l", "mg/L"),
        ("_umol_kg", "µmol/kg"),
        ("_uatm", "µatm"),
        ("_ppm", "ppm"),
        ("_kg_m3", "kg/m3"),
        ("_percent", "%"),
        ("_dbar", "dbar"),
        ("_c", "°C"),
        ("_cm_h", "cm/h"),
        ("_mmol_m2_d", "mmol/m2/d"),
    ];

    #[test]
    fn keys_are_unique_and_snake_case() {
        let mut keys: Vec<&str> = Output::ALL.iter().map(|o| o.key()).collect();
        for k in &keys {
            let snake = !k.is_empty()
                && k.starts_with(|c: char| c.is_ascii_lowercase())
                && !k.ends_with('_')
                && !k.contains("__")
                && k.chars()
                    .all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '_');
            assert!(snake, "`{k}` is not snake_case");
        }
        keys.sort_unstable();
        keys.dedup();
        assert_eq!(keys.len(), Output::ALL.len(), "a key is listed twice");
        for o in Output::ALL {
            assert_eq!(Output::from_key(o.key()), Some(*o));
        }
        // The JSON adds these two after the list.
        assert!(Output::from_key("constants").is_none());
        assert!(Output::from_key("warnings").is_none());
    }

    #[test]
    fn units_agree_with_key_suffixes() {
        for o in Output::ALL {
            let (key, unit) = (o.key(), o.unit());
            if let Some((suffix, expected)) = SUFFIX_UNITS.iter().find(|(s, _)| key.ends_with(s)) {
                assert_eq!(unit, *expected, "`{key}` ends in `{suffix}`");
            }
            // And a unit that has a suffix is never given without it.
            if let Some((suffix, _)) = SUFFIX_UNITS.iter().find(|(_, u)| *u == unit) {
                assert!(
                    key.ends_with(suffix),
                    "`{key}` is in {unit} but lacks `{suffix}`"
                );
            }
        }
    }

    /// The kind of quantity each unit is; the precision follows the unit.
    const UNIT_KINDS: &[(&str, Kind)] = &[
        ("µmol/kg", Kind::Amount),
        ("µatm", Kind::Amount),
        ("ppm", Kind::Amount),
        ("mg/L", Kind::MassConcentration),
        ("mg/L as C", Kind::MassConcentration),
        ("mg/L as CaCO3", Kind::MassConcentration),
        ("mg/L as N", Kind::MassConcentration),
        ("°C", Kind::Temperature),
        ("dbar", Kind::Pressure),
        ("kg/m3", Kind::Density),
        ("%", Kind::Percent),
        ("mol/kg", Kind::IonicStrength),
        ("cm/h", Kind::TransferVelocity),
        ("mmol/m2/d", Kind::Flux),
    ];

    #[test]
    fn kinds_agree_with_units_and_values() {
        for o in Output::ALL {
            if let Some((_, kind)) = UNIT_KINDS.iter().find(|(u, _)| *u == o.unit()) {
                assert_eq!(o.kind(), *kind, "{}", o.key());
            } else {
                assert!(
                    o.unit().is_empty(),
                    "{}: unit {} has no kind",
                    o.key(),
                    o.unit()
                );
            }
            if o.key().starts_with("ph_") || o.key().starts_with("saturation_ph") {
                assert_eq!(o.kind(), Kind::Ph, "{}", o.key());
            }
            if o.key().starts_with("omega_") {
                assert_eq!(o.kind(), Kind::SaturationState, "{}", o.key());
            }
            if o.key().starts_with("si_") {
                assert_eq!(o.kind(), Kind::SaturationIndex, "{}", o.key());
            }
            if o.key().ends_with("_fraction") {
                assert_eq!(o.kind(), Kind::Fraction, "{}", o.key());
            }
            // A name has no digits, a number has.
            let is_name = matches!(o.value(&sea_state()), Value::Text(_));
            assert_eq!(o.digits().is_none(), is_name, "{}", o.key());
        }
    }

    fn sea_state() -> State {
        use crate::sample::conditions::Conditions;
        use crate::sample::measured::Measured;
        use crate::sample::water::Water;
        Water::saline(Conditions::new(25.0, 35.0).unwrap())
            .unwrap()
            .solve(
                Measured::alkalinity_umol_kg(2300.0).unwrap(),
                Measured::dic_umol_kg(2000.0).unwrap(),
            )
            .unwrap()
    }

    #[test]
    fn every_section_but_the_header_ones_has_rows_in_a_table() {
        for section in Section::ALL {
            let shown = Output::ALL.iter().any(|o| {
                o.section() == *section
                    && (o.place(Medium::Fresh).shown() || o.place(Medium::Saline).shown())
            });
            let header_only = matches!(section, Section::Conditions | Section::Fits);
            assert_eq!(shown, !header_only, "{section:?}");
        }
    }

    #[test]
    fn a_section_has_at_most_one_first_row_per_medium() {
        for medium in [Medium::Fresh, Medium::Saline] {
            for section in Section::ALL {
                let first = Output::ALL
                    .iter()
                    .filter(|o| o.section() == *section && o.place(medium) == Place::First)
                    .count();
                assert!(first <= 1, "{section:?} in {medium:?}");
            }
        }
    }
}
