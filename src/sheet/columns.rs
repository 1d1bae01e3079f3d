//! The computed columns a sheet can write, and the default sets.

use crate::base::units::{CO3_G_MOL, HCO3_G_MOL};
use crate::properties::scales::PhScale;
use crate::sample::measured::Parameter;
use crate::state::State;

/// The two families of units for the default columns and the residuals.
///
/// ```
/// use travertine::sheet::UnitSystem;
/// assert_eq!("ocean".parse::<UnitSystem>()?, UnitSystem::Ocean);
/// # Ok::<(), travertine::sheet::SheetError>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
#[non_exhaustive]
pub enum UnitSystem {
    /// Input units: mg/L as CaCO3, mg/L as C, mg/L, µatm, pH on the NBS scale.
    #[default]
    Trade,
    /// Oceanographic units: µmol/kg, µatm, pH on the total scale.
    Ocean,
}

impl std::str::FromStr for UnitSystem {
    type Err = super::SheetError;
    fn from_str(s: &str) -> Result<Self, Self::Err> {
        match s.trim().to_ascii_lowercase().as_str() {
            "trade" => Ok(UnitSystem::Trade),
            "ocean" => Ok(UnitSystem::Ocean),
            _ => Err(super::SheetError::BadOption {
                option: "--units",
                message: format!("`{s}` is not a unit system; accepted: trade, ocean"),
            }),
        }
    }
}

/// A computed value of a row.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) enum Value {
    /// A number; `None` when the state has none (for example Ω without calcium).
    Number(Option<f64>),
    /// A name.
    Text(&'static str),
}

macro_rules! computed {
    ($( $variant:ident => $name:literal, |$s:ident| $value:expr; )*) => {
        /// A computed column.
        #[derive(Debug, Clone, Copy, PartialEq, Eq)]
        pub(crate) enum Computed { $( $variant, )* }

        impl Computed {
            pub(crate) const ALL: &'static [Computed] = &[ $( Computed::$variant, )* ];

            /// The column name (the JSON key of `solve --json`, where there is one).
            pub(crate) fn name(self) -> &'static str {
                match self { $( Computed::$variant => $name, )* }
            }

            /// The value in a state. Inlined: its result is a small enum that
            /// would otherwise go through memory.
            #[inline(always)]
            pub(crate) fn value(self, state: &State) -> Value {
                match self {
                    $( Computed::$variant => {
                        let $s = state;
                        $value
                    } )*
                }
            }
        }
    };
}

fn n(v: f64) -> Value {
    Value::Number(Some(v))
}

fn o(v: Option<f64>) -> Value {
    Value::Number(v)
}

/// µmol/kg to mg/L of a species of molar mass `g_mol`, with the density of the state.
fn mg_l(s: &State, umol_kg: f64, g_mol: f64) -> f64 {
    umol_kg * 1e-6 * s.density_kg_m3 * g_mol
}

computed! {
    Water => "water", |s| Value::Text(s.water.name());
    TemperatureC => "temperature_c", |s| n(s.temperature_c);
    Salinity => "salinity", |s| n(s.salinity);
    PressureDbar => "pressure_dbar", |s| n(s.pressure_dbar);
    PhTotal => "ph_total", |s| n(s.ph_total);
    PhSeawater => "ph_seawater", |s| n(s.ph_seawater);
    PhFree => "ph_free", |s| n(s.ph_free);
    PhNbs => "ph_nbs", |s| n(s.ph_nbs);
    AlkalinityUmolKg => "alkalinity_umol_kg", |s| n(s.alkalinity_umol_kg);
    DicUmolKg => "dic_umol_kg", |s| n(s.dic_umol_kg);
    Co2UmolKg => "co2_umol_kg", |s| n(s.co2_umol_kg);
    Hco3UmolKg => "hco3_umol_kg", |s| n(s.hco3_umol_kg);
    Co3UmolKg => "co3_umol_kg", |s| n(s.co3_umol_kg);
    Fco2 => "fco2_uatm", |s| n(s.fco2_uatm);
    Pco2 => "pco2_uatm", |s| n(s.pco2_uatm);
    Xco2 => "xco2_ppm", |s| n(s.xco2_ppm);
    OmegaCalcite => "omega_calcite", |s| o(s.omega_calcite);
    OmegaAragonite => "omega_aragonite", |s| o(s.omega_aragonite);
    SiCalcite => "si_calcite", |s| o(s.si_calcite);
    SiAragonite => "si_aragonite", |s| o(s.si_aragonite);
    Revelle => "revelle_factor", |s| n(s.revelle_factor);
    CarbonateAlkalinity => "carbonate_alkalinity_umol_kg", |s| n(s.carbonate_alkalinity_umol_kg);
    BorateAlkalinity => "borate_alkalinity_umol_kg", |s| n(s.borate_alkalinity_umol_kg);
    Hydroxide => "hydroxide_umol_kg", |s| n(s.hydroxide_umol_kg);
    PhosphateAlkalinity => "phosphate_alkalinity_umol_kg", |s| n(s.phosphate_alkalinity_umol_kg);
    SilicateAlkalinity => "silicate_alkalinity_umol_kg", |s| n(s.silicate_alkalinity_umol_kg);
    AmmoniaAlkalinity => "ammonia_alkalinity_umol_kg", |s| n(s.ammonia_alkalinity_umol_kg);
    SulfideAlkalinity => "sulfide_alkalinity_umol_kg", |s| n(s.sulfide_alkalinity_umol_kg);
    FreeHydrogen => "free_hydrogen_umol_kg", |s| n(s.free_hydrogen_umol_kg);
    Bisulfate => "bisulfate_umol_kg", |s| n(s.bisulfate_umol_kg);
    HydrogenFluoride => "hydrogen_fluoride_umol_kg", |s| n(s.hydrogen_fluoride_umol_kg);
    Calcium => "calcium_umol_kg", |s| o(s.calcium_umol_kg);
    CalciumFree => "calcium_free_umol_kg", |s| o(s.calcium_free_umol_kg);
    CalciumActivity => "calcium_activity", |s| o(s.calcium_activity);
    Cahco3 => "cahco3_umol_kg", |s| o(s.cahco3_umol_kg);
    Caco3Pair => "caco3_pair_umol_kg", |s| o(s.caco3_pair_umol_kg);
    IonicStrength => "ionic_strength", |s| n(s.ionic_strength);
    IonicStrengthFrom => "ionic_strength_from", |s| Value::Text(s.ionic_strength_from.map_or("", |r| r.name()));
    ChargeBalance => "charge_balance_percent", |s| o(s.charge_balance_percent);
    GammaMonovalent => "gamma_monovalent", |s| o(s.gamma_monovalent);
    GammaDivalent => "gamma_divalent", |s| o(s.gamma_divalent);
    SaturationPh => "saturation_ph_nbs", |s| o(s.saturation_ph_nbs);
    Langelier => "langelier_index", |s| o(s.langelier_index);
    PrecipitationPotential => "precipitation_potential_mg_l_caco3", |s| o(s.precipitation_potential_mg_l_caco3);
    AlkalinityMgL => "alkalinity_mg_l_caco3", |s| n(s.alkalinity_mg_l_caco3);
    DicMgL => "dic_mg_l_c", |s| n(s.dic_mg_l_c);
    FreeCo2MgL => "free_co2_mg_l", |s| n(s.free_co2_mg_l);
    Hco3MgL => "hco3_mg_l", |s| n(mg_l(s, s.hco3_umol_kg, HCO3_G_MOL));
    Co3MgL => "co3_mg_l", |s| n(mg_l(s, s.co3_umol_kg, CO3_G_MOL));
    Density => "density_kg_m3", |s| n(s.density_kg_m3);
    CarbonicFitUsed => "carbonic_fit", |s| Value::Text(s.constants.carbonic.as_str());
}

impl Computed {
    /// The default columns for field work in each unit system.
    pub(crate) fn defaults(units: UnitSystem) -> &'static [Computed] {
        use Computed::*;
        match units {
            UnitSystem::Trade => &[
                Water,
                PhNbs,
                AlkalinityMgL,
                DicMgL,
                FreeCo2MgL,
                Hco3MgL,
                Co3MgL,
                Pco2,
                OmegaCalcite,
                Langelier,
            ],
            UnitSystem::Ocean => &[
                Water,
                PhTotal,
                AlkalinityUmolKg,
                DicUmolKg,
                Co2UmolKg,
                Hco3UmolKg,
                Co3UmolKg,
                Pco2,
                Fco2,
                OmegaCalcite,
                OmegaAragonite,
                Revelle,
            ],
        }
    }

    /// The column of this name.
    pub(crate) fn from_name(name: &str) -> Option<Computed> {
        Computed::ALL.iter().copied().find(|c| c.name() == name)
    }

    /// Every name, for messages.
    pub(crate) fn all_names() -> String {
        Computed::ALL
            .iter()
            .map(|c| c.name())
            .collect::<Vec<_>>()
            .join(", ")
    }

    /// The column of a carbonate parameter in a unit system, for the
    /// residual of that parameter; pH takes the scale of the measurement.
    pub(crate) fn of_parameter(
        p: Parameter,
        units: UnitSystem,
        scale: Option<PhScale>,
    ) -> Computed {
        use Computed::*;
        let trade = units == UnitSystem::Trade;
        match p {
            Parameter::Alkalinity if trade => AlkalinityMgL,
            Parameter::Alkalinity => AlkalinityUmolKg,
            Parameter::Dic if trade => DicMgL,
            Parameter::Dic => DicUmolKg,
            Parameter::Co2 if trade => FreeCo2MgL,
            Parameter::Co2 => Co2UmolKg,
            Parameter::Hco3 if trade => Hco3MgL,
            Parameter::Hco3 => Hco3UmolKg,
            Parameter::Co3 if trade => Co3MgL,
            Parameter::Co3 => Co3UmolKg,
            Parameter::Pco2 => Pco2,
            Parameter::Fco2 => Fco2,
            Parameter::Xco2 => Xco2,
            _ => match scale {
                Some(PhScale::Total) => PhTotal,
                Some(PhScale::Seawater) => PhSeawater,
                Some(PhScale::Free) => PhFree,
                Some(PhScale::Nbs) => PhNbs,
                // The medium's default scale: named plainly.
                _ => PhNbs,
            },
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn names_are_unique_and_found() {
        for c in Computed::ALL {
            assert_eq!(Computed::from_name(c.name()), Some(*c));
        }
        let mut names: Vec<&str> = Computed::ALL.iter().map(|c| c.name()).collect();
        names.sort_unstable();
        names.dedup();
        assert_eq!(names.len(), Computed::ALL.len());
    }
}
