//! The computed columns a sheet can write, and the default sets.

use crate::output::Output;
use crate::properties::scales::PhScale;
use crate::sample::measured::Parameter;

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

/// The name `FromStr` reads: `trade` or `ocean`.
///
/// ```
/// use travertine::sheet::UnitSystem;
/// assert_eq!(UnitSystem::Ocean.to_string().parse::<UnitSystem>()?, UnitSystem::Ocean);
/// # Ok::<(), travertine::sheet::SheetError>(())
/// ```
impl std::fmt::Display for UnitSystem {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(match self {
            UnitSystem::Trade => "trade",
            UnitSystem::Ocean => "ocean",
        })
    }
}

// The sheet's own view of the outputs (names, default sets, the column of
// a parameter), kept here beside the sheet's unit systems.
impl Output {
    /// The column name: the output's key (the JSON key of `solve --json`).
    pub(crate) fn name(self) -> &'static str {
        self.key()
    }

    /// The default columns for field work in each unit system.
    pub(crate) fn defaults(units: UnitSystem) -> &'static [Output] {
        use Output::*;
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
    pub(crate) fn from_name(name: &str) -> Option<Output> {
        Output::from_key(name)
    }

    /// Every name, for messages.
    pub(crate) fn all_names() -> String {
        Output::ALL
            .iter()
            .map(|c| c.name())
            .collect::<Vec<_>>()
            .join(", ")
    }

    /// The column of a carbonate parameter in a unit system, for the
    /// residual of that parameter; pH takes the scale of the measurement.
    pub(crate) fn of_parameter(p: Parameter, units: UnitSystem, scale: Option<PhScale>) -> Output {
        use Output::*;
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
        for c in Output::ALL {
            assert_eq!(Output::from_name(c.name()), Some(*c));
        }
        let mut names: Vec<&str> = Output::ALL.iter().map(|c| c.name()).collect();
        names.sort_unstable();
        names.dedup();
        assert_eq!(names.len(), Output::ALL.len());
    }
}
