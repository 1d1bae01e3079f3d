//! Inputs and results as data: a `Sample` and a result `Record` write to
//! JSON and read back unchanged; trade-unit constructors agree with the
//! per-kilogram ones.

use proptest::prelude::*;
use travertine::output::{Output, Record};
use travertine::sample::inputs::{Input, Total, INPUTS};
use travertine::sample::Sample;
use travertine::units::Unit;
use travertine::{Measured, Parameter};

/// A value every input reads, as a user would type it.
fn typical(input: Input) -> &'static str {
    match input {
        Input::Carbon(Parameter::Alkalinity) => "120 mg/L CaCO3",
        Input::Carbon(Parameter::Dic) => "2.1 mmol/kg",
        Input::Carbon(Parameter::Ph) => "7.92 nbs",
        Input::Carbon(Parameter::Pco2 | Parameter::Fco2) => "410 uatm",
        Input::Carbon(Parameter::Xco2) => "415 ppm",
        Input::Carbon(_) => "12 umol/kg",
        Input::Temperature => "18.5",
        Input::Salinity => "0.3",
        Input::Conductivity => "350 uS/cm@25C",
        Input::Pressure => "12",
        Input::Barometric => "95 kPa",
        Input::Wind => "4.5",
        Input::AirCo2 => "425",
        Input::Elevation => "300",
        Input::LakeArea => "2.5 km2",
        Input::K600 => "6 cm/h",
        Input::GasTransfer => "cole-caraco1998",
        Input::Depth => "3.5",
        Input::PondVolume => "2.5 acre-ft",
        Input::PondArea => "0.8 ha",
        Input::MeanDepth => "4 ft",
        Input::Total(Total::Calcium) => "48 mg/L Ca",
        Input::Total(Total::Hardness) => "160 mg/L CaCO3",
        Input::Total(_) => "3 umol/kg",
        Input::CalciumFraction => "0.7",
        Input::Tds => "250 mg/L",
        Input::IonicStrength => "0.005",
        Input::Medium => "fresh",
        Input::PhScale => "nbs",
        Input::CarbonicFit => "millero2006",
        Input::BoronFit => "uppstrom1974",
        Input::FluorideFit => "dickson-riley1979",
        Input::BisulfateFit => "dickson1990",
        Input::Activity => "extended-debye-huckel",
        _ => "1",
    }
}

/// Every input of the list, given at once (not a sensible water, but every
/// slot of the sample filled), writes and reads back unchanged.
#[test]
fn a_sample_with_every_input_round_trips() {
    let mut s = Sample::default();
    for spec in INPUTS {
        s.set(spec.input, typical(spec.input))
            .unwrap_or_else(|e| panic!("{}: {e}", spec.flag));
    }
    let text = serde_json::to_string(&s).unwrap();
    let back: Sample = serde_json::from_str(&text).unwrap();
    assert_eq!(back, s, "{text}");
    for spec in INPUTS {
        assert!(
            text.contains(&format!("\"{}\":", spec.flag)),
            "{} not written",
            spec.flag
        );
    }
}

proptest! {
    /// Any finite numbers round-trip through the JSON of a sample exactly.
    #[test]
    fn sample_numbers_round_trip(t in -1e6f64..1e6, alk in 0.0f64..1e7, ph in -1e3f64..1e3) {
        let mut s = Sample::new(t);
        s.set(Input::Carbon(Parameter::Alkalinity), &format!("{alk} umol/kg")).unwrap();
        s.set(Input::Carbon(Parameter::Ph), &format!("{ph}")).unwrap();
        let back: Sample = serde_json::from_str(&serde_json::to_string(&s).unwrap()).unwrap();
        prop_assert_eq!(back, s);
    }
}

/// `solve --json` reads into a `Record` and writes back unchanged.
#[test]
fn the_json_of_solve_reads_back_unchanged() {
    let o = std::process::Command::new(env!("CARGO_BIN_EXE_travertine"))
        .args([
            "solve",
            "--temperature",
            "18",
            "--alkalinity",
            "85 mg/L CaCO3",
            "--ph",
            "7.9",
            "--calcium",
            "30 mg/L Ca",
            "--at-temperature",
            "25",
            "--json",
        ])
        .output()
        .unwrap();
    assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
    let original: serde_json::Value = serde_json::from_slice(&o.stdout).unwrap();
    let r: Record = serde_json::from_slice(&o.stdout).unwrap();
    assert_eq!(serde_json::to_value(&r).unwrap(), original);
    assert_eq!(r.number(Output::TemperatureC), Some(25.0));
    assert_eq!(
        r.as_measured
            .as_ref()
            .and_then(|m| m.number(Output::TemperatureC)),
        Some(18.0)
    );
}

/// The trade-unit constructors give the same value as the per-kilogram
/// ones where the units agree, and refuse a unit the parameter does not
/// take.
#[test]
fn trade_unit_constructors() {
    assert_eq!(
        Measured::alkalinity(2300.0, Unit::UmolPerKg).unwrap(),
        Measured::alkalinity_umol_kg(2300.0).unwrap()
    );
    assert_eq!(
        Measured::dic(2.0, Unit::MmolPerKg).unwrap(),
        Measured::dic_umol_kg(2000.0).unwrap()
    );
    assert_eq!(
        Measured::pco2(41.0, Unit::Pa).unwrap(),
        Measured::pco2_uatm(41.0 / 101_325.0 * 1e6).unwrap()
    );
    assert!(Measured::alkalinity(85.0, Unit::MgPerLCaCO3).is_ok());
    assert!(Measured::alkalinity(85.0, Unit::MgPerLCa).is_err());
    assert_eq!(
        Measured::alkalinity(85.0, Unit::MgPerLCaCO3).unwrap(),
        Measured::parse(Parameter::Alkalinity, "85 mg/L CaCO3").unwrap()
    );
}
