//! The sheet computes what the library computes: each row's values, with
//! every digit (`with_digits(Precision::Full)`), are the library's solve of
//! the same sample.

use travertine::base::units::{Quantity, Unit};
use travertine::output::Precision;
use travertine::sample::{
    inputs::{Input, Total},
    values::InputValue,
};
use travertine::sample::{values::Conductivity, Sample};
use travertine::sheet::{process, SheetOptions};
use travertine::{Measured, Parameter, PhScale};

/// The header and first row of the sheet, every digit written.
fn sheet(input: &str, options: &SheetOptions) -> (Vec<String>, Vec<String>) {
    let options = options.clone().with_digits(Precision::Full);
    let mut out = Vec::new();
    process(&options, input.as_bytes(), &mut out).expect("the sheet runs");
    let mut rdr = csv::Reader::from_reader(&out[..]);
    let header: Vec<String> = rdr.headers().unwrap().iter().map(str::to_string).collect();
    let row: Vec<String> = rdr
        .records()
        .next()
        .expect("one row")
        .unwrap()
        .iter()
        .map(str::to_string)
        .collect();
    (header, row)
}

fn value(header: &[String], row: &[String], name: &str) -> f64 {
    let k = header.iter().position(|h| h == name).expect(name);
    row[k]
        .parse()
        .unwrap_or_else(|_| panic!("{name}: `{}`", row[k]))
}

/// Agreement to six significant digits (the sheet once wrote no more).
fn close(a: f64, b: f64) -> bool {
    (a - b).abs() <= 1e-5 * b.abs().max(1e-9)
}

#[test]
fn sea_water_worked_values() {
    let options = SheetOptions::default()
        .with_columns("ph_total,co3_umol_kg,omega_aragonite,fco2_uatm")
        .unwrap();
    let (h, r) = sheet(
        "temperature_c,salinity,alkalinity_umol_kg,dic_umol_kg\n25,35,2300,2000\n",
        &options,
    );
    // equations.md §13 worked values (computed from the published equations).
    assert!((value(&h, &r, "ph_total") - 8.0402).abs() < 5e-4);
    assert!((value(&h, &r, "co3_umol_kg") - 210.90).abs() < 0.05);
    assert!((value(&h, &r, "omega_aragonite") - 3.346).abs() < 5e-3);
    assert!((value(&h, &r, "fco2_uatm") - 401.47).abs() < 0.05);
}

#[test]
fn a_pond_row_is_the_library_solve_of_its_sample() {
    let options = SheetOptions::default().with_columns("all").unwrap();
    let (h, r) = sheet(
        "Pond,Temp (°C),Specific conductance (µS/cm),pH (NBS),Alkalinity (mg/L as CaCO3),\
         Calcium hardness (mg/L as CaCO3),TAN (mg/L)\nAlder,24.3,415,7.52,117,83,0.41\n",
        &options,
    );
    let mut s = Sample::new(24.3);
    s.conductivity = Some(Conductivity::Specific { us_cm: 415.0 });
    s.put(
        Input::Total(Total::Calcium),
        InputValue::Quantity(Quantity::new(83.0, Unit::MgPerLCaCO3)),
    );
    s.put(
        Input::Total(Total::Ammonia),
        InputValue::Quantity(Quantity::new(0.41, Unit::MgPerLN)),
    );
    let state = s
        .water()
        .unwrap()
        .solve(
            Measured::new(
                Parameter::Alkalinity,
                Quantity::new(117.0, Unit::MgPerLCaCO3),
            )
            .unwrap(),
            Measured::ph(7.52, Some(PhScale::Nbs)).unwrap(),
        )
        .unwrap();
    for (name, expected) in [
        ("ph_nbs", state.ph_nbs),
        ("alkalinity_mg_l_caco3", state.alkalinity_mg_l_caco3),
        ("dic_mg_l_c", state.dic_mg_l_c),
        ("free_co2_mg_l", state.free_co2_mg_l),
        ("pco2_uatm", state.pco2_uatm),
        ("ionic_strength", state.ionic_strength),
        ("omega_calcite", state.omega_calcite.unwrap()),
        ("langelier_index", state.langelier_index.unwrap()),
        (
            "ammonia_alkalinity_umol_kg",
            state.ammonia_alkalinity_umol_kg,
        ),
        ("salinity", state.salinity),
    ] {
        let got = value(&h, &r, name);
        assert!(
            close(got, expected),
            "{name}: sheet {got}, library {expected}"
        );
    }
    let k = h.iter().position(|x| x == "water").unwrap();
    assert_eq!(r[k], "fresh");
}

#[test]
fn trade_units_of_the_species_follow_the_density() {
    let options = SheetOptions::default()
        .with_columns("hco3_umol_kg,hco3_mg_l,co3_umol_kg,co3_mg_l,density_kg_m3")
        .unwrap();
    let (h, r) = sheet(
        "temperature_c,salinity,alkalinity_umol_kg,dic_umol_kg\n25,35,2300,2000\n",
        &options,
    );
    let rho = value(&h, &r, "density_kg_m3");
    // mg/L = µmol/kg × 1e-6 × density (kg/m³) × molar mass (g/mol); molar
    // masses of HCO3- 61.0168 and CO3-- 60.0089 (IUPAC standard atomic weights).
    let hco3 = value(&h, &r, "hco3_umol_kg") * 1e-6 * rho * 61.0168;
    let co3 = value(&h, &r, "co3_umol_kg") * 1e-6 * rho * 60.0089;
    assert!(close(value(&h, &r, "hco3_mg_l"), hco3));
    assert!(close(value(&h, &r, "co3_mg_l"), co3));
}
