//! How much of a chemical takes a water to a target: the dose, solved
//! exactly as a root over the amount added, each trial a full solve of the
//! treated water through the one solver.
//!
//! A chemical changes three totals per mole that reacts: the alkalinity,
//! the DIC and the calcium ([`Chemical::per_mole`]). The treated water is
//! the same water with those totals moved, solved again from its
//! alkalinity and DIC, closed to the air: the dose is what the water
//! needs once the chemical has reacted and before the pond has exchanged
//! CO2 with the air. Over the days agricultural limestone takes to
//! dissolve, that exchange moves the pH toward its equilibrium with the
//! air (`equilibrium_ph` of the state), so a limestone dose aimed at a pH
//! is a first figure, not a promise. Other ions a chemical brings (sodium, chloride,
//! sulfate) are not added to the ionic strength: at the doses of pond and
//! hatchery work (a few mmol/L) they change a fresh water's activity
//! coefficients by about a percent of their distance from one.

use crate::base::error::{Error, Result};
use crate::base::field::Field;
use crate::base::units::{Amount, Quantity, Unit, CACO3_G_MOL};
use crate::flow::PreparedWater;
use crate::properties::scales::PhScale;
use crate::sample::measured::Measured;
use crate::sample::water::Water;
use crate::solve::fixed_point::falsi;
use crate::state::State;
use serde::Serialize;

/// The change one mole of a chemical makes when it reacts.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
#[non_exhaustive]
pub struct PerMole {
    /// Change in total alkalinity, equivalents.
    pub alkalinity_eq: f64,
    /// Change in DIC, mol.
    pub dic_mol: f64,
    /// Change in total calcium, mol.
    pub calcium_mol: f64,
}

macro_rules! chemicals {
    ($( $(#[$doc:meta])* $variant:ident => $name:literal, $what:literal, $g_mol:expr,
        ($alk:expr, $dic:expr, $ca:expr), $purity:expr; )*) => {
        /// A chemical (or aeration) that changes the carbonate system of a water.
        ///
        /// ```
        /// use travertine::decisions::dose::Chemical;
        /// let c: Chemical = "sodium-bicarbonate".parse()?;
        /// assert_eq!(c.per_mole().alkalinity_eq, 1.0);
        /// assert_eq!(c.to_string(), "sodium-bicarbonate");
        /// # Ok::<(), travertine::Error>(())
        /// ```
        #[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
        #[non_exhaustive]
        pub enum Chemical {
            $( $(#[$doc])* $variant, )*
        }

        impl Chemical {
            /// Every chemical, in the order of `--help`.
            pub const ALL: &'static [Chemical] = &[ $( Chemical::$variant, )* ];

            /// Its plain-English name, as `--chemical` takes it.
            pub fn name(self) -> &'static str {
                match self { $( Chemical::$variant => $name, )* }
            }

            /// What it is, with its formula.
            pub fn what(self) -> &'static str {
                match self { $( Chemical::$variant => $what, )* }
            }

            /// Molar mass of the reacting compound, g/mol (IUPAC 2021
            /// standard atomic weights; common practice).
            pub fn molar_mass_g_mol(self) -> f64 {
                match self { $( Chemical::$variant => $g_mol, )* }
            }

            /// The change one mole makes.
            pub fn per_mole(self) -> PerMole {
                match self {
                    $( Chemical::$variant => PerMole {
                        alkalinity_eq: $alk, dic_mol: $dic, calcium_mol: $ca,
                    }, )*
                }
            }

            /// The purity assumed when none is given, %: a typical grade
            /// sold for the purpose (common practice; check the label).
            pub fn default_purity_percent(self) -> f64 {
                match self { $( Chemical::$variant => $purity, )* }
            }
        }
    };
}

chemicals! {
    /// Sodium bicarbonate, NaHCO3: one equivalent of alkalinity and one
    /// mole of DIC per mole.
    SodiumBicarbonate => "sodium-bicarbonate", "sodium bicarbonate (NaHCO3)", 84.007,
        (1.0, 1.0, 0.0), 99.0;
    /// Sodium carbonate (soda ash), Na2CO3.
    SodiumCarbonate => "sodium-carbonate", "sodium carbonate, soda ash (Na2CO3)", 105.988,
        (2.0, 1.0, 0.0), 99.0;
    /// Sodium hydroxide (caustic soda), NaOH.
    SodiumHydroxide => "sodium-hydroxide", "sodium hydroxide, caustic soda (NaOH)", 39.997,
        (1.0, 0.0, 0.0), 98.0;
    /// Agricultural limestone, CaCO3 (the part that dissolves).
    AgriculturalLimestone => "agricultural-limestone", "agricultural limestone (CaCO3)", 100.087,
        (2.0, 1.0, 1.0), 90.0;
    /// Hydrated (slaked) lime, Ca(OH)2.
    HydratedLime => "hydrated-lime", "hydrated lime (Ca(OH)2)", 74.093,
        (2.0, 0.0, 1.0), 95.0;
    /// Quicklime, CaO (reacts with water to Ca(OH)2).
    Quicklime => "quicklime", "quicklime (CaO)", 56.077, (2.0, 0.0, 1.0), 90.0;
    /// Hydrochloric acid, HCl (the mass is of HCl; a 31–37 % solution is
    /// given by its purity).
    HydrochloricAcid => "hydrochloric-acid", "hydrochloric acid (HCl)", 36.461,
        (-1.0, 0.0, 0.0), 100.0;
    /// Sulfuric acid, H2SO4.
    SulfuricAcid => "sulfuric-acid", "sulfuric acid (H2SO4)", 98.079, (-2.0, 0.0, 0.0), 100.0;
    /// Carbon dioxide injected: DIC rises, alkalinity does not change.
    CarbonDioxide => "carbon-dioxide", "carbon dioxide (CO2) injected", 44.009,
        (0.0, 1.0, 0.0), 100.0;
    /// Aeration: CO2 removed to the air; DIC falls, alkalinity does not
    /// change. The dose is the CO2 removed.
    Aeration => "aeration", "aeration (CO2 removed to the air)", 44.009, (0.0, -1.0, 0.0),
        100.0;
}

impl std::str::FromStr for Chemical {
    type Err = Error;
    fn from_str(s: &str) -> Result<Self> {
        let t = s.trim().to_ascii_lowercase().replace([' ', '_'], "-");
        Chemical::ALL
            .iter()
            .copied()
            .find(|c| c.name() == t)
            .ok_or_else(|| Error::UnknownChoice {
                field: Field::Chemical,
                name: s.to_string(),
                accepted: Chemical::ALL
                    .iter()
                    .map(|c| c.name())
                    .collect::<Vec<_>>()
                    .join(", "),
            })
    }
}

/// The name `--chemical` takes.
impl std::fmt::Display for Chemical {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}

/// What a dose aims at.
///
/// ```
/// use travertine::decisions::dose::Target;
/// let t: Target = "alkalinity=50 mg/L CaCO3".parse()?;
/// assert!(matches!(t, Target::Alkalinity(_)));
/// assert!("omega_aragonite=1.5".parse::<Target>().is_ok());
/// assert!("colour=blue".parse::<Target>().is_err());
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum Target {
    /// Total alkalinity, with its unit.
    Alkalinity(Quantity),
    /// pH, on the scale of the input pH (or the medium's usual scale).
    Ph(f64),
    /// Free CO2, mg/L.
    FreeCo2MgL(f64),
    /// Ω of aragonite.
    OmegaAragonite(f64),
    /// Ω of calcite.
    OmegaCalcite(f64),
    /// Calcium hardness, with its unit (mg/L CaCO3 or molar).
    CalciumHardness(Quantity),
}

/// The names `--target` takes, with what each reads.
pub const TARGET_NAMES: &str = "alkalinity=VALUE UNIT, ph=VALUE, free_co2=MG_PER_L, \
     omega_aragonite=VALUE, omega_calcite=VALUE, calcium_hardness=VALUE UNIT";

impl std::str::FromStr for Target {
    type Err = Error;
    fn from_str(s: &str) -> Result<Self> {
        let bad = |why: &str| Error::UnknownChoice {
            field: Field::Target,
            name: s.to_string(),
            accepted: format!("{why}NAME=VALUE, one of {TARGET_NAMES}"),
        };
        let (name, value) = s.split_once('=').ok_or_else(|| bad(""))?;
        let name = name.trim().to_ascii_lowercase().replace('-', "_");
        let number = || crate::base::error::plain_number(Field::Target, value);
        Ok(match name.as_str() {
            "alkalinity" => Target::Alkalinity(Quantity::parse(
                Field::Target,
                value,
                &crate::sample::measured::Parameter::Alkalinity.accepted_units(),
            )?),
            "ph" => Target::Ph(number()?),
            "free_co2" => Target::FreeCo2MgL(number()?),
            "omega_aragonite" => Target::OmegaAragonite(number()?),
            "omega_calcite" => Target::OmegaCalcite(number()?),
            "calcium_hardness" => {
                let mut units = crate::base::units::MOLAR_UNITS.to_vec();
                units.push(Unit::MgPerLCaCO3);
                Target::CalciumHardness(Quantity::parse(Field::Target, value, &units)?)
            }
            _ => return Err(bad("")),
        })
    }
}

impl Target {
    /// The target's quantity in `state`, on the basis the target is
    /// compared on (µmol/kg for amounts, the pH on `scale`, mg/L, Ω).
    fn of(self, state: &State, scale: PhScale) -> Option<f64> {
        match self {
            Target::Alkalinity(_) => Some(state.alkalinity_umol_kg),
            Target::Ph(_) => Some(state.ph(scale)),
            Target::FreeCo2MgL(_) => Some(state.free_co2_mg_l),
            Target::OmegaAragonite(_) => state.omega_aragonite,
            Target::OmegaCalcite(_) => state.omega_calcite,
            Target::CalciumHardness(_) => state.calcium_umol_kg,
        }
    }

    /// The target value on the same basis as [`Target::of`], with the
    /// water's density for per-litre units.
    fn value(self, density_kg_m3: f64) -> Option<f64> {
        let per_kg = |q: Quantity, mass: Unit, g: f64| {
            Amount::from_quantity(q, mass, g).map(|a| a.mol_kg(density_kg_m3) * 1e6)
        };
        match self {
            Target::Alkalinity(q) => per_kg(q, Unit::MgPerLCaCO3, crate::base::units::CACO3_G_EQ),
            Target::CalciumHardness(q) => per_kg(q, Unit::MgPerLCaCO3, CACO3_G_MOL),
            Target::Ph(v)
            | Target::FreeCo2MgL(v)
            | Target::OmegaAragonite(v)
            | Target::OmegaCalcite(v) => Some(v),
        }
    }

    /// The name of the quantity, for messages.
    fn name(self) -> &'static str {
        match self {
            Target::Alkalinity(_) => "alkalinity",
            Target::Ph(_) => "pH",
            Target::FreeCo2MgL(_) => "free CO2",
            Target::OmegaAragonite(_) => "aragonite Ω",
            Target::OmegaCalcite(_) => "calcite Ω",
            Target::CalciumHardness(_) => "calcium hardness",
        }
    }

    /// A value on the basis of [`Target::of`], written for a message in
    /// the unit the user thinks in.
    fn shown(self, v: f64, density_kg_m3: f64) -> String {
        match self {
            Target::Alkalinity(_) => format!(
                "{:.1} mg/L as CaCO3",
                v * 1e-6 * density_kg_m3 * crate::base::units::CACO3_G_EQ
            ),
            Target::CalciumHardness(_) => {
                format!(
                    "{:.1} mg/L as CaCO3",
                    v * 1e-6 * density_kg_m3 * CACO3_G_MOL
                )
            }
            Target::Ph(_) => format!("{v:.2}"),
            Target::FreeCo2MgL(_) => format!("{v:.3} mg/L"),
            Target::OmegaAragonite(_) | Target::OmegaCalcite(_) => format!("{v:.2}"),
        }
    }
}

/// A dose asked for: the chemical, the target, and how the product is sold.
///
/// ```
/// use travertine::decisions::dose::{Chemical, DoseRequest};
/// let r = DoseRequest::new(Chemical::SodiumBicarbonate, "alkalinity=50 mg/L CaCO3".parse()?);
/// assert_eq!(r.purity_percent, 99.0);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub struct DoseRequest {
    /// The chemical.
    pub chemical: Chemical,
    /// The target.
    pub target: Target,
    /// Purity of the product, % (default: [`Chemical::default_purity_percent`]).
    pub purity_percent: f64,
    /// The fraction of the product that dissolves and reacts (1 but for
    /// agricultural limestone, whose default is 1 with a caution that it
    /// dissolves slowly and incompletely).
    pub dissolved_fraction: f64,
    /// The pH scale of a pH target (default: the medium's usual scale).
    pub ph_scale: Option<PhScale>,
    /// CO2 in the air, ppm, for the limit of aeration (default
    /// [`DEFAULT_AIR_CO2_PPM`]).
    pub air_co2_ppm: f64,
}

/// Atmospheric CO2 assumed for the limit of aeration when none is given:
/// the crate's one default ([`crate::sample::air::DEFAULT_AIR_CO2_PPM`]).
pub use crate::sample::air::DEFAULT_AIR_CO2_PPM;

impl DoseRequest {
    /// A request with the chemical's default purity, all of it reacting,
    /// the medium's usual pH scale and [`DEFAULT_AIR_CO2_PPM`].
    pub fn new(chemical: Chemical, target: Target) -> Self {
        DoseRequest {
            chemical,
            target,
            purity_percent: chemical.default_purity_percent(),
            dissolved_fraction: 1.0,
            ph_scale: None,
            air_co2_ppm: DEFAULT_AIR_CO2_PPM,
        }
    }

    /// With a purity, %.
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside (0, 100].
    pub fn with_purity_percent(mut self, purity: f64) -> Result<Self> {
        crate::base::error::check_range(Field::Purity, purity, 1e-3, 100.0, " %")?;
        self.purity_percent = purity;
        Ok(self)
    }

    /// With the fraction that dissolves and reacts.
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside (0, 1].
    pub fn with_dissolved_fraction(mut self, fraction: f64) -> Result<Self> {
        crate::base::error::check_range(Field::DissolvedFraction, fraction, 1e-3, 1.0, "")?;
        self.dissolved_fraction = fraction;
        Ok(self)
    }

    /// With the pH scale of a pH target.
    #[must_use]
    pub fn with_ph_scale(mut self, scale: PhScale) -> Self {
        self.ph_scale = Some(scale);
        self
    }

    /// With the CO2 of the air, ppm.
    ///
    /// # Errors
    /// [`Error::OutOfRange`] outside 100 to 10 000 ppm.
    pub fn with_air_co2_ppm(mut self, ppm: f64) -> Result<Self> {
        crate::base::error::check_range(Field::Xco2, ppm, 100.0, 10_000.0, " ppm")?;
        self.air_co2_ppm = ppm;
        Ok(self)
    }
}

/// A caution that comes with every dose.
#[derive(Debug, Clone, PartialEq, Eq, Serialize)]
#[non_exhaustive]
pub struct Caution {
    /// Its stable snake_case code.
    pub code: &'static str,
    /// The caution.
    pub message: &'static str,
}

/// The cautions of a dose of `chemical`: always the general ones, and those
/// of the chemical.
///
/// ```
/// use travertine::decisions::dose::{cautions, Chemical};
/// let c = cautions(Chemical::Quicklime);
/// assert!(c.iter().any(|c| c.code == "caustic"));
/// assert!(c.iter().any(|c| c.code == "follow_the_label"));
/// ```
pub fn cautions(chemical: Chemical) -> Vec<Caution> {
    let mut out = Vec::new();
    match chemical {
        Chemical::Quicklime | Chemical::HydratedLime | Chemical::SodiumHydroxide => {
            out.push(Caution {
                code: "caustic",
                message: "quicklime, hydrated lime and caustic soda burn skin and eyes: wear eye \
                          and skin protection; they can raise pH within hours to levels that \
                          kill fish, so never put them into water holding fish without expert \
                          guidance",
            })
        }
        Chemical::AgriculturalLimestone => out.push(Caution {
            code: "limestone_slow",
            message: "agricultural limestone is far milder, but it dissolves slowly and \
                      incompletely, more so in hard or alkaline water; the dose assumes the \
                      dissolved fraction given, and the water may take weeks to reach the \
                      target",
        }),
        Chemical::HydrochloricAcid | Chemical::SulfuricAcid => out.push(Caution {
            code: "acid",
            message: "acids burn skin and eyes and give off fumes: wear eye and skin \
                      protection, always add acid to water, never water to acid, and dilute \
                      before dosing; a fast pH drop and the CO2 it releases can kill fish",
        }),
        Chemical::CarbonDioxide => out.push(Caution {
            code: "carbon_dioxide_gas",
            message: "free CO2 above about 20 mg/L stresses most fish, and CO2 gas displaces \
                      air in closed spaces: dose slowly and ventilate",
        }),
        Chemical::SodiumBicarbonate | Chemical::SodiumCarbonate | Chemical::Aeration => {}
    }
    if chemical != Chemical::Aeration {
        out.push(Caution {
            code: "closed_to_air",
            message: "the water after treatment is the water just after the chemical has \
                      reacted, before it exchanges CO2 with the air; over the following hours \
                      to days its pH and free CO2 move toward equilibrium with the air, while \
                      its alkalinity and hardness stay",
        });
    }
    out.push(Caution {
        code: "split_the_dose",
        message: "split a large dose into parts, and measure again between them",
    });
    if chemical.per_mole().alkalinity_eq > 0.0 && chemical.per_mole().calcium_mol > 0.0 {
        out.push(Caution {
            code: "mud_demand",
            message: "pond mud and acid soils take up lime too: the real requirement of a pond \
                      is larger than this water-column figure",
        });
    }
    out.push(Caution {
        code: "follow_the_label",
        message: "these figures describe the chemistry only: follow the product label, local \
                  rules, and licensed or extension advice for your species and site",
    });
    out
}

/// A dose: how much, and the water after it.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub struct Dose {
    /// The request it answers.
    pub request: DoseRequest,
    /// The pure compound that reacts, mmol per kg of water.
    pub reacted_mmol_kg: f64,
    /// The product to add, g per m³ of water (equal to mg/L), at the
    /// purity and dissolved fraction of the request.
    pub dose_g_m3: f64,
    /// The water before treatment.
    pub before: State,
    /// The water after treatment.
    pub after: State,
    /// The cautions, always.
    pub cautions: Vec<Caution>,
}

impl Dose {
    /// The product for a volume of water, kg.
    ///
    /// ```
    /// // 67.2 g/m³ over 1000 m³ is 67.2 kg.
    /// # let g_m3 = 67.2;
    /// assert!((g_m3 * 1000.0 / 1000.0_f64 - 67.2).abs() < 1e-12);
    /// ```
    pub fn total_kg(&self, volume_m3: f64) -> f64 {
        self.dose_g_m3 * volume_m3 / 1000.0
    }
}

/// The most a dose may add, mol per kg of water: far beyond any treatment,
/// and inside the accepted range of alkalinity and DIC.
const MOST_MOL_KG: f64 = 0.05;

/// How a dose solves its waters: as they are, or with constants moved by
/// their uncertainty ([`crate::decisions::dose_uncertainty`]), the same
/// moves made again in every treated water.
#[derive(Clone, Copy)]
pub(crate) struct Solver<'a> {
    water: &'a Water,
    /// The water prepared with its constants moved (the moves it
    /// records are made again in every treated water).
    moved: Option<&'a PreparedWater>,
}

impl<'a> Solver<'a> {
    /// The water as it is.
    fn plain(water: &'a Water) -> Self {
        Solver { water, moved: None }
    }

    /// `prepared`, its constants moved (as it records them).
    pub(crate) fn moved(prepared: &'a PreparedWater) -> Self {
        Solver {
            water: prepared.water(),
            moved: Some(prepared),
        }
    }

    /// The pair solved in the water, with its calcium set to `calcium`
    /// where given.
    fn solve(&self, calcium: Option<f64>, a: Measured, b: Measured) -> Result<State> {
        let with_calcium = |c: f64| -> Result<Water> {
            let composition = self.water.composition().with_calcium(Amount::PerKg(c))?;
            Ok(self.water.clone().with_composition(composition))
        };
        match (self.moved, calcium) {
            (None, None) => self.water.solve(a, b),
            (None, Some(c)) => with_calcium(c)?.solve(a, b),
            (Some(p), None) => p.solve(a, b),
            (Some(moved), Some(c)) => with_calcium(c)?.prepare_moved(moved.moves())?.solve(a, b),
        }
    }

    fn medium(&self) -> crate::sample::water::Medium {
        self.water.medium()
    }
}

/// The water after `n` mol/kg of `chemical` has reacted.
fn treated(water: Solver<'_>, before: &State, chemical: Chemical, n: f64) -> Result<State> {
    let d = chemical.per_mole();
    let alkalinity = before.alkalinity_umol_kg + d.alkalinity_eq * n * 1e6;
    let dic = before.dic_umol_kg + d.dic_mol * n * 1e6;
    let calcium = (d.calcium_mol != 0.0)
        .then(|| before.calcium_umol_kg.unwrap_or(0.0) * 1e-6 + d.calcium_mol * n);
    water.solve(
        calcium,
        Measured::alkalinity_umol_kg(alkalinity)?,
        Measured::dic_umol_kg(dic)?,
    )
}

/// The dose of `request.chemical` that takes `water`, whose state is
/// `before`, to `request.target`.
///
/// # Method
/// With q(n) the target's quantity after n mol/kg has reacted, the dose
/// is the root of q(n) − target over n ≥ 0, bracketed by doubling from
/// 10⁻⁶ mol/kg and closed by the Illinois variant of regula falsi; each
/// q(n) is a full solve of the treated water from its alkalinity and DIC.
/// The product per m³ is n·ρ·M / (purity · dissolved fraction).
///
/// # Errors
/// [`Error::PastTarget`] when the water is already beyond the target in
/// the direction the chemical moves it; [`Error::Unreachable`] when the
/// chemical cannot take it as far as the target (with the farthest it
/// can);
/// [`Error::Missing`] for a saturation or hardness target in a fresh
/// water without calcium; errors of the solves.
///
/// ```
/// use travertine::decisions::dose::{dose, Chemical, DoseRequest};
/// use travertine::{Conditions, Measured, Water};
/// let pond = Water::fresh(Conditions::new(24.0, 0.1)?)?;
/// let before = pond.solve(Measured::alkalinity(28.0, travertine::units::Unit::MgPerLCaCO3)?,
///                         Measured::ph(7.1, None)?)?;
/// let d = dose(&pond, &before,
///              DoseRequest::new(Chemical::SodiumBicarbonate, "alkalinity=50 mg/L CaCO3".parse()?))?;
/// // 22 mg/L as CaCO3 is 0.44 meq/L: 37 g/m³ of NaHCO3 at 99 %.
/// assert!((d.dose_g_m3 - 0.44 * 84.007 / 0.99).abs() < 0.3);
/// assert!((d.after.alkalinity_mg_l_caco3 - 50.0).abs() < 1e-6);
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn dose(water: &Water, before: &State, request: DoseRequest) -> Result<Dose> {
    dose_with(Solver::plain(water), before, request)
}

/// As [`dose`], every water solved by `water`.
pub(crate) fn dose_with(water: Solver<'_>, before: &State, request: DoseRequest) -> Result<Dose> {
    let chemical = request.chemical;
    let target = request.target;
    let scale = request.ph_scale.unwrap_or(match water.medium() {
        crate::sample::water::Medium::Fresh => PhScale::Nbs,
        _ => PhScale::Total,
    });
    let rho = before.density_kg_m3;
    let missing_calcium = || Error::Missing {
        field: Field::Calcium,
        why: "; a saturation or calcium target needs the water's calcium",
    };
    let goal = target.value(rho).ok_or_else(missing_calcium)?;
    let start = target.of(before, scale).ok_or_else(missing_calcium)?;
    let quantity = |n: f64| -> Result<f64> {
        let s = treated(water, before, chemical, n)?;
        target.of(&s, scale).ok_or_else(missing_calcium)
    };
    let relative = 1e-12 * goal.abs().max(1e-9);
    if (start - goal).abs() <= relative {
        return finish(water, before, request, 0.0);
    }
    // The farthest dose: alkalinity and DIC stay positive and in range.
    let d = chemical.per_mole();
    let mut most = MOST_MOL_KG;
    for (change, amount) in [
        (d.alkalinity_eq, before.alkalinity_umol_kg),
        (d.dic_mol, before.dic_umol_kg),
    ] {
        if change < 0.0 {
            most = most.min(0.999 * amount * 1e-6 / -change);
        }
    }
    if chemical == Chemical::Aeration {
        let air = equilibrium_dic_umol_kg(water, before, request.air_co2_ppm)?;
        let room = (before.dic_umol_kg - air) * 1e-6;
        if room <= 0.0 {
            return Err(Error::Unreachable {
                field: Field::Target,
                reason: format!(
                    "the water is already at or below equilibrium with air of {} ppm CO2 \
                     (free CO2 {}): aeration cannot lower its CO2 further",
                    request.air_co2_ppm,
                    Target::FreeCo2MgL(0.0).shown(before.free_co2_mg_l, rho)
                ),
            });
        }
        most = most.min(room);
    }
    // Which way the chemical moves the quantity, from the first step.
    let first = 1e-7_f64.min(0.5 * most);
    let up = quantity(first)? > start;
    if up != (goal > start) {
        return Err(Error::PastTarget {
            field: Field::Target,
            reason: format!(
                "{} is already {}, {} the target {}: {} only {} it",
                target.name(),
                target.shown(start, rho),
                if up { "above" } else { "below" },
                target.shown(goal, rho),
                chemical.what(),
                if up { "raises" } else { "lowers" },
            ),
        });
    }
    // Bracket by doubling, then close it.
    let past = |q: f64| if up { q >= goal } else { q <= goal };
    let (mut lo, mut hi) = (0.0, first);
    let mut at_hi = quantity(hi)?;
    while !past(at_hi) {
        if hi >= most {
            let limit = if chemical == Chemical::Aeration {
                " (equilibrium with the air)"
            } else {
                ""
            };
            return Err(Error::Unreachable {
                field: Field::Target,
                reason: format!(
                    "{} cannot take {} to {} in this water: the farthest it goes is {}{limit}",
                    chemical.what(),
                    target.name(),
                    target.shown(goal, rho),
                    target.shown(at_hi, rho)
                ),
            });
        }
        lo = hi;
        hi = (2.0 * hi).min(most);
        at_hi = match quantity(hi) {
            Ok(q) => q,
            // Beyond what the solver can take: the last solvable dose is
            // the farthest.
            Err(_) => {
                hi = lo;
                most = lo;
                quantity(lo)?
            }
        };
    }
    let span = hi - lo;
    let n = falsi(
        |x| quantity(lo + x * span).map_or(f64::NAN, |q| q - goal),
        0.0,
        1.0,
    )
    .map(|x| lo + x * span)
    .ok_or(Error::NoConvergence {
        first: Field::Chemical,
        second: Field::Target,
        iterations: 200,
    })?;
    finish(water, before, request, n)
}

/// The DIC of `water` at equilibrium with air of `air_co2_ppm` at the
/// alkalinity of `before`, µmol/kg.
fn equilibrium_dic_umol_kg(water: Solver<'_>, before: &State, air_co2_ppm: f64) -> Result<f64> {
    let s = water.solve(
        None,
        Measured::alkalinity_umol_kg(before.alkalinity_umol_kg)?,
        Measured::xco2_ppm(air_co2_ppm)?,
    )?;
    Ok(s.dic_umol_kg)
}

fn finish(water: Solver<'_>, before: &State, request: DoseRequest, n: f64) -> Result<Dose> {
    let after = treated(water, before, request.chemical, n)?;
    let product = n * before.density_kg_m3 * request.chemical.molar_mass_g_mol()
        / (request.purity_percent / 100.0 * request.dissolved_fraction);
    Ok(Dose {
        request,
        reacted_mmol_kg: n * 1e3,
        dose_g_m3: product,
        before: before.clone(),
        after,
        cautions: cautions(request.chemical),
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::sample::conditions::Conditions;

    fn pond() -> (Water, State) {
        let w = Water::fresh(Conditions::new(24.0, 0.1).unwrap())
            .unwrap()
            .with_composition(
                crate::sample::Composition::default()
                    .with_calcium(Amount::PerLitre(0.2e-3))
                    .unwrap(),
            );
        let s = w
            .solve(
                Measured::alkalinity(28.0, Unit::MgPerLCaCO3).unwrap(),
                Measured::ph(6.9, None).unwrap(),
            )
            .unwrap();
        (w, s)
    }

    /// Common practice: 40 mg/L as CaCO3 is 0.8 meq/L, which takes 67.2 g
    /// of NaHCO3 or 29.6 g of Ca(OH)2 per m³ (at 1 kg/L and 100 %).
    #[test]
    fn stoichiometry_of_the_trade() {
        let (w, s) = pond();
        let target = |mg: f64| Target::Alkalinity(Quantity::new(mg, Unit::MgPerLCaCO3));
        let goal = s.alkalinity_mg_l_caco3 + 40.0;
        for (chemical, g_m3) in [
            (Chemical::SodiumBicarbonate, 67.2),
            (Chemical::HydratedLime, 29.6),
        ] {
            let r = DoseRequest::new(chemical, target(goal))
                .with_purity_percent(100.0)
                .unwrap();
            let d = dose(&w, &s, r).unwrap();
            assert!(
                (d.dose_g_m3 - g_m3).abs() < 0.06,
                "{chemical}: {}",
                d.dose_g_m3
            );
            assert!((d.after.alkalinity_mg_l_caco3 - goal).abs() < 1e-6 * goal);
        }
    }

    /// A dose solved to a target reproduces it when the treated water is
    /// solved again, to 1e-6.
    #[test]
    fn doses_reproduce_their_targets() {
        let (w, s) = pond();
        let sea = Water::saline(Conditions::new(21.0, 28.0).unwrap()).unwrap();
        // The invented hatchery intake of issue 10: Ω aragonite about 1.35.
        let intake = sea
            .solve(
                Measured::alkalinity_umol_kg(1950.0).unwrap(),
                Measured::ph(7.92, Some(PhScale::Nbs)).unwrap(),
            )
            .unwrap();
        type Case<'a> = (&'a Water, &'a State, Chemical, &'a str, fn(&State) -> f64);
        let cases: Vec<Case> = vec![
            (
                &w,
                &s,
                Chemical::SodiumBicarbonate,
                "alkalinity=50 mg/L CaCO3",
                |x| x.alkalinity_mg_l_caco3,
            ),
            (&w, &s, Chemical::AgriculturalLimestone, "ph=7.4", |x| {
                x.ph_nbs
            }),
            (&w, &s, Chemical::HydratedLime, "omega_calcite=1", |x| {
                x.omega_calcite.unwrap()
            }),
            (&w, &s, Chemical::Aeration, "free_co2=2", |x| {
                x.free_co2_mg_l
            }),
            (&w, &s, Chemical::CarbonDioxide, "free_co2=15", |x| {
                x.free_co2_mg_l
            }),
            (&w, &s, Chemical::HydrochloricAcid, "ph=6.5", |x| x.ph_nbs),
            (
                &sea,
                &intake,
                Chemical::SodiumCarbonate,
                "omega_aragonite=1.6",
                |x| x.omega_aragonite.unwrap(),
            ),
        ];
        for (water, before, chemical, target, read) in cases {
            let t: Target = target.parse().unwrap();
            let mut r = DoseRequest::new(chemical, t);
            if water.medium() == crate::sample::water::Medium::Saline {
                r = r.with_ph_scale(PhScale::Total);
            }
            let d = dose(water, before, r).unwrap_or_else(|e| panic!("{chemical} {target}: {e}"));
            let goal: f64 = target
                .split_once('=')
                .unwrap()
                .1
                .split(' ')
                .next()
                .unwrap()
                .parse()
                .unwrap();
            let got = read(&d.after);
            assert!(
                (got - goal).abs() <= 1e-6 * goal,
                "{chemical} {target}: {got}"
            );
            assert!(d.dose_g_m3 > 0.0);
            assert!(d.cautions.iter().any(|c| c.code == "follow_the_label"));
        }
    }

    /// A target the chemical cannot reach is refused with the reason, and
    /// the limit where there is one.
    #[test]
    fn unreachable_targets_say_why() {
        let (w, s) = pond();
        let refused = |chemical: Chemical, target: &str| {
            let r = DoseRequest::new(chemical, target.parse().unwrap());
            match dose(&w, &s, r) {
                Err(Error::Unreachable { reason, .. } | Error::PastTarget { reason, .. }) => reason,
                other => panic!("{chemical} {target}: {other:?}"),
            }
        };
        // Bicarbonate tends to the pH of pure bicarbonate, about 8.3
        // ((pK1 + pK2)/2; common practice).
        let why = refused(Chemical::SodiumBicarbonate, "ph=9");
        assert!(why.contains("the farthest it goes is 8."), "{why}");
        let why = refused(Chemical::HydrochloricAcid, "alkalinity=50 mg/L CaCO3");
        assert!(
            why.contains("below the target") && why.contains("only lowers"),
            "{why}"
        );
        let why = refused(Chemical::Aeration, "free_co2=0.1");
        assert!(why.contains("equilibrium with the air"), "{why}");
        let why = refused(Chemical::CarbonDioxide, "ph=8");
        assert!(why.contains("only lowers it"), "{why}");
    }

    /// Every chemical carries the general cautions; the caustic ones say so.
    #[test]
    fn every_dose_has_its_cautions() {
        for c in Chemical::ALL {
            let list = cautions(*c);
            assert!(list.iter().any(|x| x.code == "split_the_dose"), "{c}");
            assert!(list.iter().any(|x| x.code == "follow_the_label"), "{c}");
        }
        for c in [
            Chemical::Quicklime,
            Chemical::HydratedLime,
            Chemical::SodiumHydroxide,
        ] {
            assert!(cautions(c).iter().any(|x| x.code == "caustic"), "{c}");
        }
        assert!(cautions(Chemical::AgriculturalLimestone)
            .iter()
            .any(|x| x.code == "limestone_slow"));
    }
}
