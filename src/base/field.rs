//! The identity of every named input and quantity an error can point to.
//!
//! An error names its field with a [`Field`], never with a string, so that
//! the command line and the sheet can turn it into a flag or a column in
//! one place (the list of inputs in [`crate::sample::inputs`]) and a
//! renamed flag cannot silently detach from its errors.

use serde::Serialize;
use std::fmt;

macro_rules! fields {
    ($( $(#[$doc:meta])* $variant:ident => $name:literal, )*) => {
        /// A named input or computed quantity.
        ///
        /// ```
        /// use travertine::base::field::Field;
        /// assert_eq!(Field::Temperature.name(), "temperature_c");
        /// assert_eq!(Field::Temperature.to_string(), "temperature_c");
        /// ```
        #[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, PartialOrd, Ord)]
        #[non_exhaustive]
        pub enum Field {
            $( $(#[$doc])* $variant, )*
        }

        impl Field {
            /// Every field, in the order of the list.
            pub const ALL: &'static [Field] = &[ $( Field::$variant, )* ];

            /// The plain snake_case name, as in messages and the JSON of an error.
            ///
            /// ```
            /// # use travertine::base::field::Field;
            /// assert_eq!(Field::Alkalinity.name(), "alkalinity");
            /// ```
            pub fn name(self) -> &'static str {
                match self { $( Field::$variant => $name, )* }
            }
        }
    };
}

fields! {
    /// Total alkalinity.
    Alkalinity => "alkalinity",
    /// Dissolved inorganic carbon.
    Dic => "dic",
    /// pH.
    Ph => "ph",
    /// CO2 partial pressure.
    Pco2 => "pco2",
    /// CO2 fugacity.
    Fco2 => "fco2",
    /// CO2 mole fraction in dry air.
    Xco2 => "xco2",
    /// Dissolved CO2*.
    Co2 => "co2",
    /// Bicarbonate.
    Hco3 => "hco3",
    /// Carbonate.
    Co3 => "co3",
    /// Temperature of the measurement, °C.
    Temperature => "temperature_c",
    /// Practical salinity.
    Salinity => "salinity",
    /// Conductivity at the sample temperature.
    Conductivity => "conductivity",
    /// Specific conductance (conductivity at 25 °C).
    SpecificConductance => "specific_conductance",
    /// Gauge pressure, dbar.
    Pressure => "pressure_dbar",
    /// Barometric pressure: the total pressure of the air over the water.
    Barometric => "barometric_pressure",
    /// Total phosphate.
    Phosphate => "phosphate",
    /// Total silicate.
    Silicate => "silicate",
    /// Total ammonia.
    Ammonia => "ammonia",
    /// Total sulfide.
    Sulfide => "sulfide",
    /// Calcium.
    Calcium => "calcium",
    /// Total hardness.
    Hardness => "hardness",
    /// Magnesium.
    Magnesium => "magnesium",
    /// Sodium.
    Sodium => "sodium",
    /// Potassium.
    Potassium => "potassium",
    /// Chloride.
    Chloride => "chloride",
    /// Sulfate.
    Sulfate => "sulfate",
    /// Measured total boron.
    BoronTotal => "boron_total",
    /// Measured total fluoride.
    Fluoride => "fluoride",
    /// Fraction of the hardness that is calcium.
    CalciumFraction => "calcium_fraction",
    /// Total dissolved solids, mg/L.
    Tds => "tds",
    /// Ionic strength, mol/kg.
    IonicStrength => "ionic_strength",
    /// The ionic medium: fresh, saline or auto.
    Medium => "water",
    /// The scale of a pH.
    PhScale => "ph_scale",
    /// The fit of K1 and K2.
    CarbonicFit => "carbonic_fit",
    /// The fit of total boron from salinity.
    BoronFit => "boron_fit",
    /// The fit of KF.
    FluorideFit => "fluoride_fit",
    /// The fit of KS.
    BisulfateFit => "bisulfate_fit",
    /// The activity model of fresh water.
    Activity => "activity",
    /// Which root of a pair that fits two waters.
    Root => "root",
    /// How many digits a table or a sheet writes.
    Digits => "digits",
    /// A chemical dosed into a water.
    Chemical => "chemical",
    /// What a dose aims at (`alkalinity=50 mg/L CaCO3`).
    Target => "target",
    /// The purity of a product, %.
    Purity => "purity",
    /// The fraction of a product that dissolves and reacts.
    DissolvedFraction => "dissolved_fraction",
    /// The volume of water treated.
    Volume => "volume",
    /// The area of a pond.
    Area => "area",
    /// The mean depth of a pond.
    MeanDepth => "mean_depth",
    /// The share of the first water in a blend.
    Fraction => "fraction",
    /// The density of the solution (computed).
    Density => "density",
    /// A unit named on its own.
    Unit => "unit",
    /// A carbonate parameter named on its own.
    Parameter => "parameter",
    /// An equilibrium constant that is perturbed (the message names which).
    Constant => "constant",
    /// The factor a constant is scaled by.
    Factor => "factor",
    /// The change in a pK.
    DeltaPk => "delta_pk",
    // issue 13: uncertainty
    /// A standard uncertainty given for an input or a constant (the
    /// message names which).
    Uncertainty => "uncertainty",
    /// The number of Monte Carlo draws.
    Draws => "draws",
    // issue 11: depth profiles
    /// Depth below the water surface, m.
    Depth => "depth_m",
    // issue 11: toxic fractions and flags
    /// A profile of quality-flag limits (`--profile`).
    Profile => "profile",
    // issue 11: air–water CO2 exchange
    /// Wind speed at 10 m, m/s.
    Wind => "wind_speed",
    /// CO2 in the air, dry mole fraction, ppm.
    AirCo2 => "air_co2",
    /// Elevation of the water surface above sea level, m.
    Elevation => "elevation",
    /// Area of the lake, km².
    LakeArea => "lake_area",
    /// Gas transfer velocity normalised to a Schmidt number of 600.
    K600 => "k600",
    /// The model of the gas transfer velocity.
    GasTransfer => "gas_transfer",
}

impl fmt::Display for Field {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.name())
    }
}

impl Serialize for Field {
    fn serialize<S: serde::Serializer>(&self, s: S) -> std::result::Result<S::Ok, S::Error> {
        s.serialize_str(self.name())
    }
}

#[cfg(test)]
mod tests {
    use super::Field;

    #[test]
    fn names_are_unique_snake_case() {
        let mut names: Vec<&str> = Field::ALL.iter().map(|f| f.name()).collect();
        assert!(names.iter().all(|n| n
            .chars()
            .all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '_')));
        names.sort_unstable();
        names.dedup();
        assert_eq!(names.len(), Field::ALL.len());
    }
}
