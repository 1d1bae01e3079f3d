//! The list of inputs itself: one row per input.

use super::{Input, InputSpec, NameHint, Total};
use crate::sample::measured::Parameter;

use NameHint::{
    CalciumHardness as CaH, Nitrogen as N, None as Plain, Phosphorus as P, Short, Specific,
};

macro_rules! spec {
    ($input:expr, $flag:literal, $column:literal, $help:literal, [$( ($name:literal, $hint:expr) ),* $(,)?]) => {
        InputSpec {
            input: $input,
            flag: $flag,
            column: $column,
            help: $help,
            spellings: &[ $( ($name, $hint), )* ],
        }
    };
}

/// Every input, in the order of the command line's help.
pub const INPUTS: &[InputSpec] = &[
    spec!(
        Input::Carbon(Parameter::Alkalinity),
        "alkalinity",
        "alkalinity_mg_l_caco3",
        "Total alkalinity, with a unit: umol/kg, mmol/kg, mmol/L, meq/L, \"mg/L CaCO3\", ...",
        [
            ("alkalinity", Plain),
            ("total alkalinity", Plain),
            ("alkalinity total", Plain),
            ("alk", Short),
            ("talk", Short),
            ("ta", Short)
        ]
    ),
    spec!(
        Input::Carbon(Parameter::Dic),
        "dic",
        "dic_umol_kg",
        "Dissolved inorganic carbon, with a unit: umol/kg, mmol/L, \"mg/L C\", ...",
        [
            ("dic", Plain),
            ("tic", Short),
            ("ct", Short),
            ("tco2", Short),
            ("dissolved inorganic carbon", Plain),
            ("total inorganic carbon", Plain)
        ]
    ),
    spec!(
        Input::Carbon(Parameter::Ph),
        "ph",
        "ph_nbs",
        "pH, a plain number on the scale given by --ph-scale, or followed by its own scale (\"7.92 nbs\")",
        [("ph", Plain)]
    ),
    spec!(
        Input::Carbon(Parameter::Pco2),
        "pco2",
        "pco2_uatm",
        "CO2 partial pressure, with a unit: uatm, atm, Pa, kPa",
        [
            ("pco2", Plain),
            ("co2 partial pressure", Plain),
            ("partial pressure of co2", Plain)
        ]
    ),
    spec!(
        Input::Carbon(Parameter::Fco2),
        "fco2",
        "fco2_uatm",
        "CO2 fugacity, with a unit: uatm, atm, Pa, kPa",
        [("fco2", Plain), ("co2 fugacity", Plain)]
    ),
    spec!(
        Input::Carbon(Parameter::Xco2),
        "xco2",
        "xco2_ppm",
        "CO2 mole fraction in dry air, with a unit: ppm",
        [("xco2", Plain)]
    ),
    spec!(
        Input::Carbon(Parameter::Co2),
        "co2",
        "free_co2_mg_l",
        "Dissolved CO2* with a unit: umol/kg, \"mg/L CO2\", ...",
        [
            ("co2", Plain),
            ("free co2", Plain),
            ("co2 free", Plain),
            ("co2*", Plain),
            ("dissolved co2", Plain),
            ("carbon dioxide", Plain),
            ("free carbon dioxide", Plain)
        ]
    ),
    spec!(
        Input::Carbon(Parameter::Hco3),
        "hco3",
        "hco3_mg_l",
        "Bicarbonate with a unit: umol/kg, \"mg/L HCO3\", ...",
        [("hco3", Plain), ("hco3-", Plain), ("bicarbonate", Plain)]
    ),
    spec!(
        Input::Carbon(Parameter::Co3),
        "co3",
        "co3_mg_l",
        "Carbonate with a unit: umol/kg, \"mg/L CO3\", ...",
        [("co3", Plain), ("co3--", Plain), ("carbonate", Plain)]
    ),
    spec!(
        Input::PhScale,
        "ph-scale",
        "ph_scale",
        "Scale of a pH that names none: total, seawater, free or nbs. Fresh water: nbs if \
         not given. Saline water: must be stated (nbs for a meter calibrated with NBS/IUPAC \
         buffers, total for spectrophotometric or Tris-buffer work)",
        [("ph scale", Plain)]
    ),
    spec!(
        Input::Temperature,
        "temperature",
        "temperature_c",
        "Temperature of the measurement, °C",
        [
            ("temperature", Plain),
            ("temp", Plain),
            ("water temperature", Plain),
            ("water temp", Plain)
        ]
    ),
    spec!(
        Input::Salinity,
        "salinity",
        "salinity",
        "Practical salinity (default: from --conductivity, else 0)",
        [
            ("salinity", Plain),
            ("practical salinity", Plain),
            ("sal", Short),
            ("psal", Plain)
        ]
    ),
    spec!(
        Input::Conductivity,
        "conductivity",
        "specific_conductance_us_cm",
        "Conductivity with a unit: uS/cm or mS/cm at the sample temperature, or \"uS/cm@25C\" \
         for specific conductance",
        [
            ("conductivity", Plain),
            ("cond", Short),
            ("ec", Short),
            ("electrical conductivity", Plain),
            ("specific conductance", Specific),
            ("specific conductivity", Specific),
            ("spc", Specific),
            ("spcond", Specific),
            ("sp cond", Specific)
        ]
    ),
    spec!(
        Input::Tds,
        "tds",
        "tds_mg_l",
        "Total dissolved solids, with a unit: mg/L (fresh water, for the ionic strength)",
        [("tds", Plain), ("total dissolved solids", Plain)]
    ),
    spec!(
        Input::IonicStrength,
        "ionic-strength",
        "ionic_strength",
        "Ionic strength, mol/kg (fresh water)",
        [("ionic strength", Plain)]
    ),
    spec!(
        Input::Activity,
        "activity",
        "activity",
        "Activity coefficients in fresh water: davies or extended-debye-huckel",
        [("activity", Plain), ("activity model", Plain)]
    ),
    spec!(
        Input::Total(Total::Hardness),
        "hardness",
        "hardness_mg_l_caco3",
        "Total hardness with a unit (\"mg/L CaCO3\", mmol/L): calcium plus magnesium; with one \
         of them given the other is the difference, with --calcium-fraction it is split; alone \
         it is never taken as calcium",
        [("hardness", Plain), ("total hardness", Plain)]
    ),
    spec!(
        Input::CalciumFraction,
        "calcium-fraction",
        "calcium_fraction",
        "Fraction of --hardness that is calcium, 0 to 1 (the rest is magnesium)",
        [("calcium fraction", Plain)]
    ),
    spec!(
        Input::Total(Total::Magnesium),
        "magnesium",
        "magnesium_mg_l",
        "Magnesium with a unit (\"mg/L Mg\", \"mg/L CaCO3\", mmol/L)",
        [("magnesium", Plain), ("mg", Short)]
    ),
    spec!(
        Input::Total(Total::Sodium),
        "sodium",
        "sodium_mg_l",
        "Sodium with a unit (\"mg/L Na\", mmol/L)",
        [("sodium", Plain), ("na", Short)]
    ),
    spec!(
        Input::Total(Total::Potassium),
        "potassium",
        "potassium_mg_l",
        "Potassium with a unit (\"mg/L K\", mmol/L)",
        [("potassium", Plain), ("k", Short)]
    ),
    spec!(
        Input::Total(Total::Chloride),
        "chloride",
        "chloride_mg_l",
        "Chloride with a unit (\"mg/L Cl\", mmol/L)",
        [("chloride", Plain), ("cl", Short)]
    ),
    spec!(
        Input::Total(Total::Sulfate),
        "sulfate",
        "sulfate_mg_l",
        "Sulfate with a unit (\"mg/L SO4\", mmol/L)",
        [("sulfate", Plain), ("sulphate", Plain), ("so4", Short)]
    ),
    spec!(
        Input::Pressure,
        "pressure",
        "pressure_dbar",
        "Gauge pressure at the measurement, dbar (default 0)",
        [
            ("pressure", Plain),
            ("water pressure", Plain),
            ("sea pressure", Plain),
            ("pres", Short)
        ]
    ),
    spec!(
        Input::Barometric,
        "barometric",
        "barometric_kpa",
        "Barometric pressure over the water, with a unit: kPa, hPa, atm or mmHg (default 1 atm; \
         or give --elevation). Converts xCO2 to pCO2, and gives the air's pCO2 for the exchange",
        [
            ("barometric", Short),
            ("barometric pressure", Plain),
            ("air pressure", Plain),
            ("atmospheric pressure", Plain)
        ]
    ),
    spec!(
        Input::Medium,
        "water",
        "water",
        "The ionic medium: fresh, saline or auto (default auto: fresh below salinity 1)",
        [("water", Plain), ("medium", Plain), ("water type", Plain)]
    ),
    spec!(
        Input::CarbonicFit,
        "carbonic",
        "carbonic_fit",
        "K1 and K2 of carbonic acid (saline): lueker2000, millero2006, roy1993, \
         dickson-millero1987",
        [("carbonic", Plain), ("carbonic fit", Plain)]
    ),
    spec!(
        Input::BoronFit,
        "boron",
        "boron_fit",
        "Total boron from salinity (saline): lee2010 or uppstrom1974",
        [("boron fit", Plain)]
    ),
    spec!(
        Input::FluorideFit,
        "fluoride",
        "fluoride_fit",
        "KF of hydrogen fluoride (saline): perez-fraga1987 or dickson-riley1979",
        [("fluoride fit", Plain)]
    ),
    spec!(
        Input::BisulfateFit,
        "bisulfate",
        "bisulfate_fit",
        "KS of bisulfate: dickson1990",
        [("bisulfate fit", Plain)]
    ),
    spec!(
        Input::Total(Total::Phosphate),
        "phosphate",
        "phosphate_mg_l_p",
        "Total phosphate, with a unit (umol/kg, \"mg/L P\", ...)",
        [
            ("phosphate", Plain),
            ("total phosphate", Plain),
            ("po4", Short),
            ("po4-p", P),
            ("phosphate-p", P)
        ]
    ),
    spec!(
        Input::Total(Total::Silicate),
        "silicate",
        "silicate_mg_l_si",
        "Total silicate, with a unit (umol/kg, \"mg/L Si\", ...)",
        [("silicate", Plain), ("silicic acid", Plain)]
    ),
    spec!(
        Input::Total(Total::Ammonia),
        "ammonia",
        "ammonia_mg_l_n",
        "Total ammonia (NH3 + NH4+), with a unit (umol/kg, \"mg/L N\", ...)",
        [
            ("ammonia", Plain),
            ("total ammonia", Plain),
            ("ammonium", Plain),
            ("tan", N),
            ("total ammonia nitrogen", N),
            ("total ammonia-nitrogen", N),
            ("ammonia nitrogen", N),
            ("ammonia-nitrogen", N),
            ("nh3-n", N),
            ("nh4-n", N)
        ]
    ),
    spec!(
        Input::Total(Total::Sulfide),
        "sulfide",
        "sulfide_mg_l_s",
        "Total sulfide, with a unit (umol/kg, \"mg/L S\", ...)",
        [
            ("sulfide", Plain),
            ("sulphide", Plain),
            ("total sulfide", Plain),
            ("h2s", Short)
        ]
    ),
    spec!(
        Input::Total(Total::Calcium),
        "calcium",
        "calcium_mg_l",
        "Calcium, with a unit (umol/kg, mmol/L, \"mg/L Ca\", or \"mg/L CaCO3\" as calcium \
         hardness)",
        [
            ("calcium", Plain),
            ("ca", Short),
            ("calcium hardness", CaH),
            ("ca hardness", CaH)
        ]
    ),
    spec!(
        Input::Total(Total::Boron),
        "boron-total",
        "boron_total_umol_kg",
        "Measured total boron, with a unit (umol/kg, ...)",
        [("boron total", Plain), ("total boron", Plain)]
    ),
    // issue 11: depth profiles
    spec!(
        Input::Depth,
        "depth",
        "depth_m",
        "Depth of the sample below the water surface, m: the pressure is taken as rho g z \
         (the water's density, standard gravity); give it or --pressure, not both",
        [
            ("depth", Plain),
            ("sample depth", Plain),
            ("sampling depth", Plain),
            ("depth below surface", Plain)
        ]
    ),
    // issue 11: air–water CO2 exchange
    spec!(
        Input::Wind,
        "wind",
        "wind_m_s",
        "Wind speed at 10 m above the water, m/s (or km/h): the transfer velocity and the CO2 \
         flux",
        [
            ("wind", Short),
            ("wind speed", Short),
            ("wind speed at 10 m", Short),
            ("u10", Short)
        ]
    ),
    spec!(
        Input::AirCo2,
        "air-co2",
        "air_co2_ppm",
        "CO2 in the air, dry mole fraction, ppm (default 419.3 ppm, the global mean of 2023, \
         with a note)",
        [
            ("air co2", Short),
            ("atmospheric co2", Short),
            ("co2 in air", Short),
            ("air xco2", Short)
        ]
    ),
    spec!(
        Input::Elevation,
        "elevation",
        "elevation_m",
        "Elevation of the water surface, m above sea level: the barometric pressure from the \
         ICAO standard atmosphere (instead of --barometric)",
        [
            ("elevation", Short),
            ("altitude", Short),
            ("lake elevation", Short)
        ]
    ),
    spec!(
        Input::LakeArea,
        "lake-area",
        "lake_area_km2",
        "Surface area of the lake, with a unit: km2 or ha (for the vachon-prairie2013 model)",
        [
            ("lake area", Plain),
            ("surface area", Plain),
            ("lake surface area", Plain)
        ]
    ),
    spec!(
        Input::K600,
        "k600",
        "k600_cm_h",
        "Gas transfer velocity at Schmidt number 600 given directly, with a unit: cm/h or m/d \
         (rivers, tracer or chamber studies)",
        [("k600", Plain)]
    ),
    spec!(
        Input::GasTransfer,
        "gas-transfer",
        "gas_transfer",
        "Model of the transfer velocity: cole-caraco1998 (default in fresh water), \
         vachon-prairie2013 (default in fresh water with a lake area), wanninkhof2014 (default in \
         saline water), given (with --k600)",
        [("gas transfer", Plain), ("gas transfer model", Plain)]
    ),
    // issue 12: the volume a dose treats (dose, and a sheet with a dose)
    spec!(
        Input::PondVolume,
        "volume",
        "volume_m3",
        "Volume of water a dose treats, with a unit: m3, L, gal (US), acre-ft (dose only)",
        [("volume", Plain), ("pond volume", Plain), ("water volume", Plain)]
    ),
    spec!(
        Input::PondArea,
        "area",
        "area_m2",
        "Area of the pond a dose treats, with a unit: m2, ha, acre; with --mean-depth (dose only)",
        [("area", Plain), ("pond area", Plain), ("surface area of pond", Plain)]
    ),
    spec!(
        Input::MeanDepth,
        "mean-depth",
        "mean_depth_m",
        "Mean depth of the pond a dose treats, m (or ft); with --area (dose only)",
        [("mean depth", Plain), ("average depth", Plain), ("pond depth", Plain)]
    ),
];
