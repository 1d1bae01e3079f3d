//! Messages a user in the field sees: inputs that disagree or would be
//! ignored, ranges of the medium actually used, values echoed as typed,
//! blame on the input that was given, and hints for the usual slips.

use travertine::base::error::NumberSlip;
use travertine::base::field::Field;
use travertine::sample::inputs::{Input, Total};
use travertine::sample::values::MediumChoice;
use travertine::sample::Sample;
use travertine::{Error, Parameter, State};

/// A sample at `t` °C from `(input, text)` pairs, as the command line and
/// the sheet give them.
fn sample(t: f64, inputs: &[(Input, &str)]) -> Result<Sample, Error> {
    let mut s = Sample::new(t);
    for (input, text) in inputs {
        s.set(*input, text)?;
    }
    Ok(s)
}

fn solved(s: &Sample) -> Result<State, Error> {
    let (a, b) = s.pair()?;
    s.water()?.solve(a, b)
}

const ALK: Input = Input::Carbon(Parameter::Alkalinity);
const PH: Input = Input::Carbon(Parameter::Ph);

fn codes(s: &State) -> Vec<&'static str> {
    s.warnings.iter().map(|w| w.code()).collect()
}

#[test]
fn a_salinity_and_a_conductivity_that_disagree_are_warned_about() {
    // 42.914 mS/cm at 15 °C is salinity 35 by PSS-78 (UNESCO 1983, the
    // standard sea-water ratio; the check value of properties::conductivity).
    let sea = |salinity: &str| {
        let s = sample(
            15.0,
            &[
                (Input::Salinity, salinity),
                (Input::Conductivity, "42.914 mS/cm"),
                (ALK, "2300 umol/kg"),
                (PH, "8.0"),
                (Input::PhScale, "total"),
            ],
        )
        .unwrap();
        solved(&s).unwrap()
    };
    let agreeing = sea("35");
    assert!(!codes(&agreeing).contains(&"salinity_conductivity_disagree"));
    let off = sea("30");
    let w = off
        .warnings
        .iter()
        .find(|w| w.code() == "salinity_conductivity_disagree")
        .expect("a warning");
    assert_eq!(w.severity(), travertine::base::warning::Severity::Warning);
    let text = w.to_string();
    assert!(
        text.contains("salinity 34.99") && text.contains("the salinity given was used"),
        "{text}"
    );
    // The salinity given is the one used.
    assert_eq!(off.salinity, 30.0);
    // Within 2 % (35 against 34.3): no warning.
    assert!(!codes(&sea("34.4")).contains(&"salinity_conductivity_disagree"));
}

#[test]
fn ions_far_out_of_balance_are_warned_about() {
    let pond = |sodium: &str, chloride: &str| {
        let s = sample(
            20.0,
            &[
                (ALK, "100 mg/L CaCO3"),
                (PH, "8"),
                (Input::Total(Total::Sodium), sodium),
                (Input::Total(Total::Chloride), chloride),
            ],
        )
        .unwrap();
        solved(&s).unwrap()
    };
    // 200 mg/L Na against 1 mg/L Cl and 2 mmol/L of bicarbonate: cations
    // far in excess.
    let skewed = pond("200 mg/L Na", "1 mg/L Cl");
    assert!(skewed.charge_balance_percent.unwrap() > 50.0);
    assert!(
        codes(&skewed).contains(&"ions_out_of_balance"),
        "{:?}",
        codes(&skewed)
    );
    // 46 mg/L Na (2 mmol/L) balances 2 mmol/L of bicarbonate with 0 Cl;
    // a trace of chloride keeps it within a few %.
    let balanced = pond("46 mg/L Na", "1 mg/L Cl");
    assert!(balanced.charge_balance_percent.unwrap().abs() < 10.0);
    assert!(!codes(&balanced).contains(&"ions_out_of_balance"));
}

#[test]
fn a_temperature_error_states_the_range_of_the_medium_used() {
    let at = |t: f64, medium: MediumChoice, salinity: &str| {
        let mut s = sample(t, &[(Input::Salinity, salinity)]).unwrap();
        s.medium = medium;
        s.water().unwrap_err().to_string()
    };
    // Plummer & Busenberg (1982) holds for 0 to 100 °C; the widest saline
    // carbonic fit (Millero et al. 2006) for −2 to 50 °C.
    assert!(at(-1.0, MediumChoice::Fresh, "0.2").contains("0 to 100 °C"));
    assert!(at(-1.0, MediumChoice::Auto, "0.2").contains("0 to 100 °C"));
    assert!(at(101.0, MediumChoice::Saline, "30").contains("-2 to 50 °C"));
    assert!(at(101.0, MediumChoice::Auto, "30").contains("-2 to 50 °C"));
    assert!(at(60.0, MediumChoice::Auto, "30").contains("-2 to 50 °C"));
    assert!(at(-3.0, MediumChoice::Saline, "30").contains("-2 to 50 °C"));
}

#[test]
fn values_are_echoed_as_typed_in_their_unit() {
    let message = |input: Input, text: &str| {
        let s = sample(20.0, &[(input, text), (PH, "8")]);
        let e = match s {
            Err(e) => e,
            Ok(s) => s
                .pair()
                .and_then(|(a, b)| s.water().and_then(|w| w.solve(a, b)))
                .unwrap_err(),
        };
        e.to_string()
    };
    assert_eq!(
        message(ALK, "infumol/kg"),
        "alkalinity = inf is not a finite number"
    );
    assert_eq!(
        message(ALK, "1e308umol/kg"),
        "alkalinity = 1e308 umol/kg is outside the accepted range 0 to 100000 umol/kg"
    );
    // Per litre: the number and the range in the unit typed (100 000 µmol
    // at 50.04 g per equivalent of CaCO3 is 5004.35 mg).
    assert_eq!(
        message(ALK, "-1 mg/L CaCO3"),
        "alkalinity = -1 mg/L CaCO3 is outside the accepted range 0 to 5004.35 mg/L CaCO3"
    );
    let mut s = sample(20.0, &[(ALK, "2000 umol/kg"), (PH, "8")]).unwrap();
    s.set(Input::Total(Total::Phosphate), "-5 umol/kg").unwrap();
    assert_eq!(
        s.water().unwrap_err().to_string(),
        "phosphate = -5 umol/kg is outside the accepted range 0 to 10000 umol/kg"
    );
    s.set(Input::Total(Total::Phosphate), "-5 mg/L P").unwrap();
    assert!(s
        .water()
        .unwrap_err()
        .to_string()
        .starts_with("phosphate = -5 mg/L P is outside the accepted range 0 to 309.7"));
}

#[test]
fn saline_water_without_a_salinity_asks_for_one() {
    let mut s = sample(20.0, &[(ALK, "2000 umol/kg"), (PH, "8")]).unwrap();
    s.medium = MediumChoice::Saline;
    let e = s.water().unwrap_err();
    assert!(
        matches!(
            e,
            Error::Missing {
                field: Field::Salinity,
                ..
            }
        ),
        "{e}"
    );
    assert!(e.to_string().contains("give the salinity"), "{e}");
}

#[test]
fn fresh_water_too_salty_by_its_conductivity_blames_the_conductivity() {
    let mut s = sample(20.0, &[(Input::Conductivity, "60 mS/cm")]).unwrap();
    s.medium = MediumChoice::Fresh;
    let e = s.water().unwrap_err();
    assert_eq!(e.field(), Some(Field::Conductivity), "{e}");
    assert!(e.to_string().contains("60000 uS/cm"), "{e}");
    assert!(!e.to_string().contains("salinity ="), "{e}");
}

#[test]
fn the_usual_slips_in_a_number_get_a_hint() {
    let slip = |input: Input, text: &str| match input.read(text) {
        Err(Error::NotANumber { slip, .. }) => slip,
        other => panic!("{text}: {other:?}"),
    };
    assert_eq!(
        slip(ALK, "\u{2212}5 umol/kg"),
        Some(NumberSlip::UnicodeMinus)
    );
    assert_eq!(slip(PH, "\u{2212}1"), Some(NumberSlip::UnicodeMinus));
    assert_eq!(slip(PH, "8,1"), Some(NumberSlip::DecimalComma));
    assert_eq!(
        slip(Input::Temperature, "12,5"),
        Some(NumberSlip::DecimalComma)
    );
    // These were blamed on the unit (`x8FCumol/kg`, `,300umol/kg`).
    assert_eq!(slip(ALK, "0x8FCumol/kg"), Some(NumberSlip::Hexadecimal));
    assert_eq!(slip(ALK, "2,300umol/kg"), Some(NumberSlip::CommaInNumber));
    assert_eq!(slip(PH, "abc"), None);
    let e = ALK.read("2,300umol/kg").unwrap_err().to_string();
    assert!(e.contains("write 2300") && e.contains("2.300"), "{e}");
    let e = ALK.read("0x8FCumol/kg").unwrap_err().to_string();
    assert!(e.contains("0x8FC is 2300"), "{e}");
    let e = PH.read("\u{2212}1").unwrap_err().to_string();
    assert!(e.contains("type `-1`"), "{e}");
}

/// Total hardness is calcium plus magnesium: with one of them given, the
/// other is the difference, and said so; with both, a hardness that
/// disagrees with their sum is warned about. Before, a hardness given with
/// calcium was dropped without a word.
#[test]
fn hardness_with_calcium_or_magnesium_is_used_and_said_so() {
    let pond = |extra: &[(Input, &str)]| {
        let mut inputs = vec![(ALK, "120 mg/L CaCO3"), (PH, "7.8")];
        inputs.extend_from_slice(extra);
        solved(&sample(20.0, &inputs).unwrap()).unwrap()
    };
    let hardness = (Input::Total(Total::Hardness), "200 mg/L CaCO3");
    let calcium = (Input::Total(Total::Calcium), "120 mg/L CaCO3");
    let magnesium = (Input::Total(Total::Magnesium), "80 mg/L CaCO3");

    let ca_only = pond(&[calcium]);
    let ca_and_h = pond(&[calcium, hardness]);
    let ca_and_mg = pond(&[calcium, magnesium]);
    assert!(codes(&ca_and_h).contains(&"magnesium_from_hardness"));
    // The magnesium of the difference counts in the ionic strength, as if
    // it had been given.
    assert!(ca_and_h.ionic_strength > ca_only.ionic_strength);
    assert!((ca_and_h.ionic_strength - ca_and_mg.ionic_strength).abs() < 1e-12);

    let mg_and_h = pond(&[magnesium, hardness]);
    assert!(codes(&mg_and_h).contains(&"calcium_from_hardness"));
    assert!((mg_and_h.omega_calcite.unwrap() - ca_and_mg.omega_calcite.unwrap()).abs() < 1e-9);

    let agreeing = pond(&[calcium, magnesium, hardness]);
    assert!(!codes(&agreeing).contains(&"hardness_disagrees"));
    let off = pond(&[
        calcium,
        magnesium,
        (Input::Total(Total::Hardness), "300 mg/L CaCO3"),
    ]);
    assert!(
        codes(&off).contains(&"hardness_disagrees"),
        "{:?}",
        codes(&off)
    );

    let e = sample(
        20.0,
        &[(Input::Total(Total::Magnesium), "300 mg/L CaCO3"), hardness],
    )
    .unwrap()
    .water()
    .unwrap_err();
    assert!(matches!(e, Error::Inconsistent { .. }), "{e}");
}
