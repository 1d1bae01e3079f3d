//! The fresh medium (issue 3): check values, rainwater and calcite in
//! equilibrium with air, the bicarbonate fraction, and the agreement of the
//! fresh and saline media in their overlap (S 0.5–5).
//!
//! - `tables/fresh_check_values.csv`: one row per published, remembered or
//!   computed check value of a fresh-water constant, activity coefficient or
//!   Debye–Hückel parameter. Each row is sent to the crate function its
//!   (constant, fit, quantity) names, and every constant also through the
//!   crate's fresh-water route (`Water::fresh(..).constants()` at ionic
//!   strength 0); the two must agree. A row that names anything unknown is a
//!   failure, never a skip, and a table that yields no rows fails.
//!
//! Tolerances are written per row: a plain number is absolute, in the units
//! of the value; a number followed by `%` is relative.

use serde::Deserialize;
use std::f64::consts::LN_10;
use std::fmt::Write as _;
use travertine::base::units::Amount;
use travertine::fits::{fluoride, minerals, sulfate, thermodynamic, BoronTotalFit};
use travertine::medium::Constants;
use travertine::medium::IonicStrengthRoute;
use travertine::properties::activity::{self, ActivityModel, Gammas};
use travertine::sample::composition::Composition;
use travertine::{Conditions, Measured, Parameter, SolveOptions, State, Water};

mod common;
use common::{check_source_and_provenance, check_table, Checked, Tolerance};

// ---------------------------------------------------------------------------
// Small helpers
// ---------------------------------------------------------------------------

fn fresh_water(t: f64) -> Water {
    Water::fresh(Conditions::new(t, 0.0).expect("valid conditions")).expect("fresh range")
}

/// Density of pure water, g/cm³ (TEOS-10 at S 0), as the crate uses for A(T).
fn rho_w_g_cm3(t: f64) -> f64 {
    travertine::properties::density::density_kg_m3(0.0, t).expect("density") / 1000.0
}

fn solve(w: &Water, a: Measured, b: Measured) -> State {
    w.solve(a, b)
        .unwrap_or_else(|e| panic!("solve failed: {e}"))
}

/// A bracketed root with Brent's method.
fn brent<F: Fn(f64) -> f64>(f: F, lo: f64, hi: f64, eps: f64) -> f64 {
    let mut conv = roots::SimpleConvergency { eps, max_iter: 200 };
    roots::find_root_brent(lo, hi, &f, &mut conv).expect("the root is bracketed")
}

// ---------------------------------------------------------------------------
// tables/fresh_check_values.csv
// ---------------------------------------------------------------------------

#[derive(Debug, Clone, Deserialize)]
struct Row {
    constant: String,
    fit: String,
    temperature_c: Option<f64>,
    parameters: String,
    quantity: String,
    value: f64,
    tolerance: String,
    source: String,
    provenance: String,
}

impl Row {
    fn label(&self) -> String {
        let t = self
            .temperature_c
            .map_or_else(|| "-".to_string(), |t| format!("{t} °C"));
        let p = if self.parameters.trim().is_empty() {
            String::new()
        } else {
            format!(" ({})", self.parameters.trim())
        };
        format!(
            "{} {} {} at {t}{p} ({})",
            self.constant, self.fit, self.quantity, self.provenance
        )
    }
}

/// The parameters of a row: charge, ionic strength, Debye–Hückel A.
#[derive(Debug, Default)]
struct Parameters {
    z: Option<f64>,
    i: Option<f64>,
    a: Option<f64>,
}

/// `z=1; I=0.01; A=0.509` into [`Parameters`]; unknown or repeated keys fail.
fn parameters(text: &str) -> Result<Parameters, String> {
    let (mut z, mut i, mut a) = (None, None, None);
    for part in text.split(';').map(str::trim).filter(|p| !p.is_empty()) {
        let (key, value) = part
            .split_once('=')
            .ok_or_else(|| format!("parameter {part:?} is not key=value"))?;
        let v: f64 = value
            .trim()
            .parse()
            .map_err(|_| format!("parameter {part:?}: not a number"))?;
        let slot = match key.trim() {
            "z" => &mut z,
            "I" => &mut i,
            "A" => &mut a,
            other => return Err(format!("unknown parameter {other:?}; use z, I or A")),
        };
        if slot.replace(v).is_some() {
            return Err(format!("parameter {key:?} given twice"));
        }
    }
    Ok(Parameters { z, i, a })
}

/// A log10 value in the row's quantity.
fn express_log10(log10: f64, quantity: &str) -> Result<f64, String> {
    match quantity {
        "log_k" => Ok(log10),
        "pk" => Ok(-log10),
        "ln_k" => Ok(log10 * LN_10),
        _ => Err(format!(
            "quantity {quantity:?} unknown for a constant; use log_k, pk or ln_k"
        )),
    }
}

/// The crate's fresh-water constants at `t` and ionic strength 0 (every
/// activity coefficient 1), with a little ammonia so that KNH4 is evaluated.
fn route_constants(t: f64) -> Result<Constants, String> {
    let comp = Composition::default()
        .with_ammonia(Amount::PerKg(1e-6))
        .map_err(|e| e.to_string())?;
    Conditions::new(t, 0.0)
        .and_then(Water::fresh)
        .and_then(|w| w.with_ionic_strength(0.0))
        .map(|w| w.with_composition(comp))
        .and_then(|w| w.constants())
        .map_err(|e| e.to_string())
}

/// A constant: its published function (log10 K), the same through the
/// fresh-water route, and the fit the route reports.
fn constant_log10(row: &Row, t: f64) -> Result<f64, String> {
    let tk = t + 273.15;
    let k = route_constants(t)?;
    let used = k.fits_used();
    let (fit, named, routed, reported) = match row.constant.as_str() {
        "kh" => (
            "plummer-busenberg1982",
            thermodynamic::log_kh(tk),
            k.k0(),
            used.k0,
        ),
        "k1" => (
            "plummer-busenberg1982",
            thermodynamic::log_k1(tk),
            k.k1(),
            used.carbonic,
        ),
        "k2" => (
            "plummer-busenberg1982",
            thermodynamic::log_k2(tk),
            k.k2(),
            used.carbonic,
        ),
        "ksp_calcite" => (
            "plummer-busenberg1982",
            thermodynamic::log_ksp_calcite(tk),
            k.ksp_calcite(),
            used.minerals,
        ),
        "ksp_aragonite" => (
            "plummer-busenberg1982",
            thermodynamic::log_ksp_aragonite(tk),
            k.ksp_aragonite(),
            used.minerals,
        ),
        "k_cahco3" => (
            "plummer-busenberg1982",
            thermodynamic::log_k_cahco3(tk),
            k.k_cahco3(),
            used.minerals,
        ),
        "k_caco3" => (
            "plummer-busenberg1982",
            thermodynamic::log_k_caco3(tk),
            k.k_caco3(),
            used.minerals,
        ),
        "kw" => (
            "harned-owen1958",
            thermodynamic::log_kw(tk),
            k.kw(),
            used.kw,
        ),
        "knh4" => (
            "emerson1975",
            -thermodynamic::emerson1975_pka(tk),
            k.knh4(),
            used.ammonium,
        ),
        other => return Err(format!("unknown constant {other:?}")),
    };
    if row.fit != fit {
        return Err(format!(
            "the crate evaluates {} with {fit} only, not {:?}",
            row.constant, row.fit
        ));
    }
    if reported != fit {
        return Err(format!(
            "the fresh route reports {reported:?} for {}, not {fit:?}",
            row.constant
        ));
    }
    if (routed.log10() - named).abs() > 1e-9 {
        return Err(format!(
            "the fresh route at I = 0 gives log10 {} = {}, the named function {named}",
            row.constant,
            routed.log10()
        ));
    }
    Ok(named)
}

/// The crate's value for a row, or why the row cannot be evaluated.
fn evaluate(row: &Row) -> Result<f64, String> {
    let Parameters { z, i, a } = parameters(&row.parameters)?;
    let need_t = || {
        row.temperature_c
            .ok_or_else(|| format!("{} needs a temperature", row.constant))
    };
    let plain = |v: f64| {
        if row.quantity == "value" {
            Ok(v)
        } else {
            Err(format!(
                "quantity {:?} unknown for {}; use value",
                row.quantity, row.constant
            ))
        }
    };
    let fit_is = |name: &str| {
        if row.fit == name {
            Ok(())
        } else {
            Err(format!(
                "the crate evaluates {} with {name} only, not {:?}",
                row.constant, row.fit
            ))
        }
    };
    let no_parameters = || {
        if z.is_none() && i.is_none() && a.is_none() {
            Ok(())
        } else {
            Err(format!("{} takes no parameters", row.constant))
        }
    };
    match row.constant.as_str() {
        "davies_gamma" => {
            fit_is("davies1962")?;
            let z = z.ok_or("davies_gamma needs z")?;
            let i = i.ok_or("davies_gamma needs I")?;
            let gamma = match (a, row.temperature_c) {
                (Some(a), None) => activity::davies_gamma(a, z, i),
                (None, Some(t)) => {
                    let rho = rho_w_g_cm3(t);
                    let g = activity::davies_gamma(activity::debye_huckel_a(t, rho), z, i);
                    // The crate's coefficients by charge must be the same number.
                    let by_charge = Gammas::new(ActivityModel::Davies, t, rho, i);
                    let crate_g = match z as i32 {
                        1 => by_charge.monovalent,
                        2 => by_charge.carbonate,
                        3 => by_charge.trivalent,
                        _ => return Err(format!("no crate coefficient for charge {z}")),
                    };
                    if (crate_g - g).abs() > 1e-12 {
                        return Err(format!(
                            "Gammas::new gives {crate_g}, davies_gamma with A(T) {g}"
                        ));
                    }
                    g
                }
                _ => return Err("davies_gamma takes either A or a temperature".to_string()),
            };
            plain(gamma)
        }
        "debye_huckel_a" | "debye_huckel_b" | "dielectric_constant" => {
            fit_is("malmberg-maryott1956")?;
            no_parameters()?;
            let t = need_t()?;
            let rho = rho_w_g_cm3(t);
            plain(match row.constant.as_str() {
                "debye_huckel_a" => activity::debye_huckel_a(t, rho),
                "debye_huckel_b" => activity::debye_huckel_b(t, rho),
                _ => activity::dielectric_constant(t),
            })
        }
        _ => {
            no_parameters()?;
            let t = need_t()?;
            express_log10(constant_log10(row, t)?, &row.quantity)
        }
    }
}

/// Checks one row, or says why it cannot be checked.
fn check_row(row: &Row) -> Result<Checked, String> {
    check_source_and_provenance(&row.source, &row.provenance)?;
    let tolerance = Tolerance::parse(&row.tolerance)?;
    Ok(Checked {
        label: format!("{} ({})", row.label(), row.provenance),
        expected: row.value,
        actual: evaluate(row)?,
        allowed: tolerance.allowed(row.value),
    })
}

#[test]
fn fresh_check_values_table() {
    check_table("fresh_check_values.csv", Row::label, check_row);
}

/// A typo in a row must fail, never skip.
#[test]
fn fresh_check_values_refuse_unknown_rows() {
    let good = Row {
        constant: "k1".into(),
        fit: "plummer-busenberg1982".into(),
        temperature_c: Some(25.0),
        parameters: String::new(),
        quantity: "log_k".into(),
        // Plummer & Busenberg 1982, published 25 °C value.
        value: -6.352,
        tolerance: "0.0005".into(),
        source: "Plummer & Busenberg 1982".into(),
        provenance: "published".into(),
    };
    assert!(check_row(&good)
        .expect("the good row is evaluated")
        .passes());
    let bad = [
        Row {
            constant: "k3".into(),
            ..good.clone()
        },
        Row {
            fit: "plummer-busenberg1983".into(),
            ..good.clone()
        },
        Row {
            quantity: "pK".into(),
            ..good.clone()
        },
        Row {
            temperature_c: None,
            ..good.clone()
        },
        Row {
            parameters: "z=1".into(),
            ..good.clone()
        },
        Row {
            constant: "davies_gamma".into(),
            fit: "davies1962".into(),
            temperature_c: None,
            parameters: "z=1; I=0.01; B=0.509".into(),
            quantity: "value".into(),
            ..good.clone()
        },
        Row {
            constant: "davies_gamma".into(),
            fit: "davies1962".into(),
            temperature_c: Some(25.0),
            parameters: "z=1; I=0.01; A=0.509".into(),
            quantity: "value".into(),
            ..good.clone()
        },
        Row {
            provenance: "folklore".into(),
            ..good.clone()
        },
        Row {
            source: " ".into(),
            ..good.clone()
        },
        Row {
            tolerance: "tight".into(),
            ..good.clone()
        },
    ];
    for row in &bad {
        assert!(check_row(row).is_err(), "row should be refused: {row:?}");
    }
}

// ---------------------------------------------------------------------------
// Rainwater in equilibrium with air
// ---------------------------------------------------------------------------

/// 10^-3.5 atm in µatm.
const PCO2_10_M35_UATM: f64 = 316.227_766_016_837_94;

/// Pure water (no ions, alkalinity 0) with CO2 from the air at 25 °C.
fn rain(gas: Measured) -> State {
    solve(
        &fresh_water(25.0),
        gas,
        Measured::alkalinity_umol_kg(0.0).unwrap(),
    )
}

#[test]
fn rainwater_ph_regression_values() {
    // Regression values: what this model gave when the test was written
    // (Plummer & Busenberg 1982 K1, K2, KH; Harned & Owen Kw; Davies; pCO2
    // through the Weiss 1974 fugacity factor). Not published numbers.
    let cases = [
        (PCO2_10_M35_UATM, 5.660_126),
        (350.0, 5.638_137),
        (400.0, 5.609_194),
        (420.0, 5.598_617),
    ];
    for (pco2, expected) in cases {
        let s = rain(Measured::pco2_uatm(pco2).unwrap());
        assert!(
            (s.ph_nbs - expected).abs() < 1e-6,
            "rain at {pco2} µatm: regression value {expected}, model {}",
            s.ph_nbs
        );
        assert!(s.alkalinity_umol_kg.abs() < 1e-9);
        assert_eq!(
            s.ionic_strength_from,
            Some(IonicStrengthRoute::AlkalinityOnly)
        );
        // The only ions are H+ and HCO3- (CO3-- and OH- are negligible), so
        // by the charge balance I = [H+] to within 0.1 %.
        let h_free = s.free_hydrogen_umol_kg * 1e-6;
        assert!((s.ionic_strength / h_free - 1.0).abs() < 1e-3);
    }
}

#[test]
fn rainwater_ph_is_about_5_6() {
    // Rain in equilibrium with air has pH 5.6–5.7 (common practice,
    // textbook chemistry). The band holds up to about 417 µatm in this
    // model; at 420 µatm the pH is 5.5986, still "about 5.6" to one decimal.
    let mut p = 350.0;
    while p <= 415.0 {
        let ph = rain(Measured::pco2_uatm(p).unwrap()).ph_nbs;
        assert!(
            (5.6..=5.7).contains(&ph),
            "rain at {p} µatm: pH {ph}, outside 5.6–5.7 (common practice)"
        );
        p += 5.0;
    }
    let ph = rain(Measured::pco2_uatm(420.0).unwrap()).ph_nbs;
    assert!(
        (ph - 5.6).abs() < 0.05,
        "rain at 420 µatm: pH {ph} is not 5.6 to one decimal (common practice)"
    );
}

/// The model against the closed form: with CO3-- negligible,
/// aH² = K1 KH fCO2 + Kw (equations.md §9 constants; the charge balance
/// [H+] = [HCO3-] + [OH-]). Independent of the solver's iteration.
#[test]
fn rainwater_matches_the_closed_form() {
    let t = 298.15;
    let p10 = |x: f64| 10f64.powf(x);
    for pco2 in [PCO2_10_M35_UATM, 350.0, 420.0] {
        let s = rain(Measured::pco2_uatm(pco2).unwrap());
        let fco2 = s.fco2_uatm * 1e-6;
        let a_h = (p10(thermodynamic::log_k1(t)) * p10(thermodynamic::log_kh(t)) * fco2
            + p10(thermodynamic::log_kw(t)))
        .sqrt();
        // With Davies γH = γ(HCO3-) = γ(OH-), so the activity coefficients
        // cancel from [H+] = [HCO3-] + [OH-]; left out is CO3-- alone
        // (2 K2/aH ≈ 4e-5 of HCO3-, 1e-5 in pH).
        assert!(
            (s.ph_nbs - -a_h.log10()).abs() < 1e-4,
            "rain at {pco2} µatm: model {}, closed form {}",
            s.ph_nbs,
            -a_h.log10()
        );
    }
}

/// equations.md §13 (computed): pH 5.659 at 10^-3.5 atm and 5.598 at 420
/// µatm. The crate gives those two numbers when the gas value is taken as
/// the fugacity; with pCO2 proper (fCO2 = 0.9969 pCO2 at 25 °C, Weiss 1974)
/// the pH is 0.0007 higher (5.6601 and 5.5986).
#[test]
fn rainwater_against_equations_md() {
    for (gas, expected) in [(PCO2_10_M35_UATM, 5.659), (420.0, 5.598)] {
        let by_f = rain(Measured::fco2_uatm(gas).unwrap()).ph_nbs;
        let by_p = rain(Measured::pco2_uatm(gas).unwrap()).ph_nbs;
        // Half a unit in the last printed digit.
        assert!(
            (by_f - expected).abs() <= 5e-4,
            "fCO2 {gas} µatm: equations.md §13 {expected}, model {by_f}"
        );
        // The same number as pCO2 is a fugacity 0.9969 times smaller: less
        // CO2, a higher pH, by half the log of the fugacity factor (0.0007).
        let shift = by_p - by_f;
        assert!(
            shift > 5e-4 && shift < 9e-4,
            "pCO2 against fCO2 of {gas} µatm: shift {shift}"
        );
    }
}

// ---------------------------------------------------------------------------
// Calcite in equilibrium with air
// ---------------------------------------------------------------------------

/// Water with only calcium and carbonate (dissolved CaCO3 plus CO2) at 25 °C
/// with pCO2 fixed: calcium total = alkalinity/2 by charge balance.
fn calcite_water(ta_umol_kg: f64) -> Water {
    let ca = Amount::PerKg(ta_umol_kg / 2.0 * 1e-6);
    fresh_water(25.0).with_composition(Composition::default().with_calcium(ca).unwrap())
}

fn calcite_state(ta_umol_kg: f64, gas: Measured) -> State {
    solve(
        &calcite_water(ta_umol_kg),
        gas,
        Measured::alkalinity_umol_kg(ta_umol_kg).unwrap(),
    )
}

/// The alkalinity at which calcite is exactly saturated, by a bracketed root
/// of ln Ω in alkalinity.
fn calcite_saturation(gas: Measured) -> State {
    let ln_omega = |ta: f64| calcite_state(ta, gas).omega_calcite.unwrap().ln();
    let ta = brent(ln_omega, 200.0, 5000.0, 1e-9);
    calcite_state(ta, gas)
}

#[test]
fn calcite_in_equilibrium_with_air() {
    let s = calcite_saturation(Measured::pco2_uatm(PCO2_10_M35_UATM).unwrap());
    let omega = s.omega_calcite.unwrap();
    assert!((omega - 1.0).abs() < 1e-8, "Ω calcite {omega}");
    let ca_mol_kg = s.calcium_umol_kg.unwrap() * 1e-6;
    let ca_mmol_l = ca_mol_kg * s.density_kg_m3;
    println!(
        "calcite + air (pCO2 10^-3.5 atm, 25 °C): pH {:.4}, Ca {:.4e} mol/kg = {:.4} mmol/L, \
         alkalinity {:.4e} eq/kg, I {:.4e}, LSI {:.2e}",
        s.ph_nbs,
        ca_mol_kg,
        ca_mmol_l,
        s.alkalinity_umol_kg * 1e-6,
        s.ionic_strength,
        s.langelier_index.unwrap()
    );
    // Textbook: pH about 8.3 and Ca about 0.5 mmol/L (from memory, unverified).
    assert!((8.2..=8.35).contains(&s.ph_nbs), "pH {}", s.ph_nbs);
    assert!((0.4..=0.6).contains(&ca_mmol_l), "Ca {ca_mmol_l} mmol/L");

    // Regression values of this model with pCO2 proper (fCO2 = 0.99685
    // pCO2, Weiss 1974). An independent script of the same equations
    // (equations.md §9: Plummer & Busenberg 1982, Harned & Owen Kw, Davies
    // with A = 0.5108, both Ca pairs) gave pH 8.28027, Ca 4.9363e-4 mol/kg,
    // alkalinity 9.8725e-4 eq/kg and I 1.4640e-3 (computed).
    assert!((s.ph_nbs - 8.28027).abs() <= 2e-5, "pH {}", s.ph_nbs);
    assert!((ca_mol_kg - 4.9363e-4).abs() <= 2e-8, "Ca {ca_mol_kg}");
    assert!((s.alkalinity_umol_kg * 1e-6 - 9.8725e-4).abs() <= 4e-8);
    assert!((s.ionic_strength - 1.4640e-3).abs() <= 5e-8);

    // The route: calcium alone is not an ion analysis, so the ionic strength
    // comes from the speciation with a balancing ion ("alkalinity only").
    // With Ca total = TA/2 the balance is exact and no counter-ion is added:
    // I = ½(4 Ca++ + CaHCO3+ + HCO3- + 4 CO3-- + H+ + OH-), CaCO3⁰ neutral.
    assert_eq!(
        s.ionic_strength_from,
        Some(IonicStrengthRoute::AlkalinityOnly)
    );
    let u = 1e-6;
    let i_ions = 0.5
        * u
        * (4.0 * s.calcium_free_umol_kg.unwrap()
            + s.cahco3_umol_kg.unwrap()
            + s.hco3_umol_kg
            + 4.0 * s.co3_umol_kg
            + s.free_hydrogen_umol_kg
            + s.hydroxide_umol_kg);
    assert!(
        (s.ionic_strength / i_ions - 1.0).abs() < 1e-9,
        "I {} against the ions {i_ions}",
        s.ionic_strength
    );
    // Calcium balance: free + CaHCO3+ + CaCO3⁰ = total.
    let ca_sum =
        s.calcium_free_umol_kg.unwrap() + s.cahco3_umol_kg.unwrap() + s.caco3_pair_umol_kg.unwrap();
    assert!((ca_sum / s.calcium_umol_kg.unwrap() - 1.0).abs() < 1e-9);

    // At saturation the Langelier index is 0, pHs is the pH, and nothing
    // precipitates (definitions, equations.md §9).
    assert!(s.langelier_index.unwrap().abs() < 1e-6);
    assert!((s.saturation_ph_nbs.unwrap() - s.ph_nbs).abs() < 1e-6);
    // The precipitation potential is computed on request.
    assert_eq!(s.precipitation_potential_mg_l_caco3, None);
    let with_potential = SolveOptions::default().with_precipitation_potential(true);
    let asked = s
        .water_sample()
        .solve_with(
            s.measured(Parameter::Ph).unwrap(),
            s.measured(Parameter::Alkalinity).unwrap(),
            &with_potential,
        )
        .unwrap();
    assert!(asked.precipitation_potential_mg_l_caco3.unwrap().abs() < 1e-3);
    // Ω aragonite / Ω calcite = Kc/Ka: 10^(-8.4798 + 8.3361) at 25 °C
    // (Plummer & Busenberg 1982, equations.md §9).
    let ratio = s.omega_aragonite.unwrap() / omega;
    let t = 298.15;
    let expected =
        10f64.powf(thermodynamic::log_ksp_calcite(t) - thermodynamic::log_ksp_aragonite(t));
    assert!((ratio / expected - 1.0).abs() < 1e-9);
    assert!((ratio - 0.7184).abs() < 1e-3);
}

/// equations.md §13 (computed): pH 8.279, Ca 4.94e-4 mol/kg, alkalinity
/// 9.88e-4 eq/kg, I 1.47e-3. Those numbers take 10^-3.5 atm as the CO2
/// fugacity (as §13 does for rainwater): given as fCO2 the model reproduces
/// every one to half a unit in its last printed digit. With pCO2 proper the
/// model gives pH 8.2803 and I 1.4640e-3, which round away from §13.
#[test]
fn calcite_in_equilibrium_with_air_against_equations_md() {
    let s = calcite_saturation(Measured::fco2_uatm(PCO2_10_M35_UATM).unwrap());
    let ca_mol_kg = s.calcium_umol_kg.unwrap() * 1e-6;
    assert!((s.ph_nbs - 8.279).abs() <= 5e-4, "pH {}", s.ph_nbs);
    assert!((ca_mol_kg - 4.94e-4).abs() <= 0.5e-6, "Ca {ca_mol_kg}");
    assert!((s.alkalinity_umol_kg * 1e-6 - 9.88e-4).abs() <= 0.5e-6);
    assert!(
        (s.ionic_strength - 1.47e-3).abs() <= 0.5e-5,
        "I {}",
        s.ionic_strength
    );
    // The independent script (see above) with fCO2 = 10^-3.5 atm: pH
    // 8.27936, Ca 4.9416e-4, I 1.4656e-3 (computed).
    assert!((s.ph_nbs - 8.27936).abs() <= 2e-5, "pH {}", s.ph_nbs);
    assert!((ca_mol_kg - 4.9416e-4).abs() <= 2e-8, "Ca {ca_mol_kg}");
    assert!((s.ionic_strength - 1.4656e-3).abs() <= 5e-8);
}

/// Open to more CO2, calcite dissolves more and the pH falls (common
/// practice: Ca rises about as pCO2^(1/3)).
#[test]
fn calcite_dissolves_more_under_more_co2() {
    let low = calcite_saturation(Measured::pco2_uatm(PCO2_10_M35_UATM).unwrap());
    let high = calcite_saturation(Measured::pco2_uatm(10.0 * PCO2_10_M35_UATM).unwrap());
    let ratio = high.calcium_umol_kg.unwrap() / low.calcium_umol_kg.unwrap();
    // 10^(1/3) = 2.154 at constant activity coefficients; with more ions the
    // coefficients fall and more calcite dissolves, and more Ca is paired.
    assert!(
        ratio > 10f64.powf(1.0 / 3.0) && ratio < 2.4,
        "Ca ratio {ratio}"
    );
    assert!(high.ph_nbs < low.ph_nbs - 0.5);
}

// ---------------------------------------------------------------------------
// Bicarbonate fraction
// ---------------------------------------------------------------------------

/// HCO3- and CO3-- as fractions of DIC at pH (NBS), 25 °C, given I.
fn fractions(ph: f64, ionic_strength: f64) -> (f64, f64) {
    let w = fresh_water(25.0)
        .with_ionic_strength(ionic_strength)
        .unwrap();
    let s = solve(
        &w,
        Measured::ph(ph, None).unwrap(),
        Measured::dic_umol_kg(1000.0).unwrap(),
    );
    (
        s.hco3_umol_kg / s.dic_umol_kg,
        s.co3_umol_kg / s.dic_umol_kg,
    )
}

/// The pH of the HCO3- maximum, by golden section.
fn hco3_peak(ionic_strength: f64) -> f64 {
    let f = |ph: f64| fractions(ph, ionic_strength).0;
    let g = (5f64.sqrt() - 1.0) / 2.0;
    let (mut a, mut b) = (6.0, 11.0);
    while b - a > 1e-7 {
        let (c, d) = (b - g * (b - a), a + g * (b - a));
        if f(c) > f(d) {
            b = d;
        } else {
            a = c;
        }
    }
    0.5 * (a + b)
}

#[test]
fn bicarbonate_fraction_peaks_near_8_3() {
    // At I = 0 the maximum of K1 h/(h² + K1 h + K1 K2) is at h² = K1 K2:
    // pH = (pK1 + pK2)/2 = 8.3404 (Plummer & Busenberg 1982, equations.md §9).
    let t = 298.15;
    let mid = -(thermodynamic::log_k1(t) + thermodynamic::log_k2(t)) / 2.0;
    assert!((mid - 8.3404).abs() < 1e-4);
    let peak = hco3_peak(0.0);
    assert!((peak - mid).abs() < 1e-4, "peak {peak}, (pK1+pK2)/2 {mid}");
    // Common practice: the HCO3- fraction peaks near pH 8.3.
    assert!((8.25..=8.4).contains(&peak), "peak {peak}");
    let (top, _) = fractions(peak, 0.0);
    // At the peak HCO3- is 98 % of DIC (computed: 1/(1 + 2·10^-1.99)).
    assert!(top > 0.97 && top < 0.99, "HCO3 fraction at the peak {top}");
}

#[test]
fn carbonate_exceeds_bicarbonate_only_above_ph_10_3() {
    // CO3-- = HCO3- at aH = K2 γ1/γ2: pK2 = 10.329 at I = 0 (Plummer &
    // Busenberg 1982). Common practice: CO3-- dominates only above about 10.3.
    let cross = |i: f64| {
        brent(
            |ph| {
                let (h, c) = fractions(ph, i);
                c - h
            },
            9.0,
            12.0,
            1e-10,
        )
    };
    let pk2 = -thermodynamic::log_k2(298.15);
    let at_zero = cross(0.0);
    assert!(
        (at_zero - pk2).abs() < 1e-6,
        "crossing {at_zero}, pK2 {pk2}"
    );
    assert!((10.25..=10.4).contains(&at_zero), "crossing {at_zero}");
    for ph in [7.0, 8.3, 9.5, 10.2, 10.3] {
        let (h, c) = fractions(ph, 0.0);
        assert!(h > c, "pH {ph}: HCO3 {h} should exceed CO3 {c}");
    }
    for ph in [10.35, 10.5, 11.0] {
        let (h, c) = fractions(ph, 0.0);
        assert!(c > h, "pH {ph}: CO3 {c} should exceed HCO3 {h}");
    }
    // In a real fresh water the crossing moves down by log10(γ1/γ2)
    // (Davies): at I = 0.01 by 3·0.0449 = 0.135 (computed from the equation
    // with the crate's A(25 °C) = 0.5108).
    let at_001 = cross(0.01);
    let g = Gammas::new(ActivityModel::Davies, 25.0, rho_w_g_cm3(25.0), 0.01);
    let shift = (g.monovalent / g.carbonate).log10();
    assert!((at_zero - at_001 - shift).abs() < 1e-6);
    assert!((shift - 0.1347).abs() < 1e-3, "shift {shift}");
}

// ---------------------------------------------------------------------------
// The two media in their overlap, S 0.5–5
// ---------------------------------------------------------------------------

/// Major ions of standard sea water at S 35, mol/kg-soln, Millero et al.
/// 2008 reference composition (from memory, unverified).
const NA_S35: f64 = 0.468_967_4;
const MG_S35: f64 = 0.052_817_1;
const K_S35: f64 = 0.010_207_7;
const CL_S35: f64 = 0.545_869_6;

/// Diluted sea water as a fresh water: Na, Mg, K, Cl from Millero et al.
/// 2008 (from memory), and the ratios the saline medium itself uses for Ca
/// (Riley & Tongudai 1967), SO4 (Morris & Riley 1966), F (Riley 1965) and B
/// (Lee et al. 2010), all scaled by S/35, so the two media share every total.
fn diluted_seawater_as_fresh(t: f64, s: f64) -> Water {
    let r = s / 35.0;
    let a = Amount::PerKg;
    let comp = Composition::default()
        .with_calcium(a(minerals::riley_tongudai1967_calcium_mol_kg(s)))
        .and_then(|c| c.with_magnesium(a(MG_S35 * r)))
        .and_then(|c| c.with_sodium(a(NA_S35 * r)))
        .and_then(|c| c.with_potassium(a(K_S35 * r)))
        .and_then(|c| c.with_chloride(a(CL_S35 * r)))
        .and_then(|c| c.with_sulfate(a(sulfate::morris_riley1966_total_mol_kg(s))))
        .and_then(|c| c.with_fluoride(a(fluoride::riley1965_total_mol_kg(s))))
        .and_then(|c| c.with_boron(a(BoronTotalFit::Lee2010.total_mol_kg(s))))
        .expect("valid totals");
    Water::fresh(Conditions::new(t, s).unwrap())
        .unwrap()
        .with_composition(comp)
}

fn saline_water(t: f64, s: f64) -> Water {
    Water::saline(Conditions::new(t, s).unwrap()).unwrap()
}

/// One comparison: the fresh and saline states of the same sample.
struct Overlap {
    t: f64,
    s: f64,
    fresh: State,
    saline: State,
}

impl Overlap {
    fn d_ph_nbs(&self) -> f64 {
        self.fresh.ph_nbs - self.saline.ph_nbs
    }
    fn d_ph_free(&self) -> f64 {
        self.fresh.ph_free - self.saline.ph_free
    }
    fn pct(a: f64, b: f64) -> f64 {
        100.0 * (a / b - 1.0)
    }
    fn d_pco2_pct(&self) -> f64 {
        Self::pct(self.fresh.pco2_uatm, self.saline.pco2_uatm)
    }
    fn d_dic_pct(&self) -> f64 {
        Self::pct(self.fresh.dic_umol_kg, self.saline.dic_umol_kg)
    }
    fn d_omega_pct(&self) -> f64 {
        Self::pct(
            self.fresh.omega_calcite.unwrap(),
            self.saline.omega_calcite.unwrap(),
        )
    }
}

const OVERLAP_T: [f64; 4] = [10.0, 15.0, 20.0, 25.0];
const OVERLAP_S: [f64; 5] = [0.5, 1.0, 2.0, 3.0, 5.0];

/// Case A: TA and DIC scaled from 2300 and 2000 µmol/kg at S 35.
/// Case B: TA scaled the same way, in equilibrium with 400 µatm of CO2.
fn overlap(air: bool) -> Vec<Overlap> {
    let mut v = Vec::new();
    for &t in &OVERLAP_T {
        for &s in &OVERLAP_S {
            let ta = Measured::alkalinity_umol_kg(2300.0 * s / 35.0).unwrap();
            let other = if air {
                Measured::pco2_uatm(400.0).unwrap()
            } else {
                Measured::dic_umol_kg(2000.0 * s / 35.0).unwrap()
            };
            let fresh = solve(&diluted_seawater_as_fresh(t, s), ta, other);
            let saline = solve(&saline_water(t, s), ta, other);
            assert_eq!(
                fresh.ionic_strength_from,
                Some(IonicStrengthRoute::MajorIons)
            );
            v.push(Overlap {
                t,
                s,
                fresh,
                saline,
            });
        }
    }
    v
}

/// Three significant digits, plainly written.
fn sig3(x: f64) -> String {
    let digits = (2 - x.abs().log10().floor() as i32).max(0) as usize;
    format!("{x:.digits$}")
}

fn markdown(rows: &[Overlap], air: bool) -> String {
    let mut out = String::new();
    let third = if air { "DIC" } else { "pCO2" };
    let _ = writeln!(
        out,
        "| t °C | S | I (fresh) | pH NBS fresh | pH NBS saline | Δ | pH free fresh | \
         pH free saline | Δ | {third} fresh | {third} saline | Δ % | Ω calcite fresh | \
         Ω calcite saline | Δ % |"
    );
    let _ = writeln!(out, "|{}", "---|".repeat(15));
    for r in rows {
        let (third_f, third_s, third_d) = if air {
            (r.fresh.dic_umol_kg, r.saline.dic_umol_kg, r.d_dic_pct())
        } else {
            (r.fresh.pco2_uatm, r.saline.pco2_uatm, r.d_pco2_pct())
        };
        let _ = writeln!(
            out,
            "| {} | {} | {:.4} | {:.3} | {:.3} | {:+.3} | {:.3} | {:.3} | {:+.3} | {:.1} | \
             {:.1} | {:+.1} | {} | {} | {:+.1} |",
            r.t,
            r.s,
            r.fresh.ionic_strength,
            r.fresh.ph_nbs,
            r.saline.ph_nbs,
            r.d_ph_nbs(),
            r.fresh.ph_free,
            r.saline.ph_free,
            r.d_ph_free(),
            third_f,
            third_s,
            third_d,
            sig3(r.fresh.omega_calcite.unwrap()),
            sig3(r.saline.omega_calcite.unwrap()),
            r.d_omega_pct(),
        );
    }
    out
}

/// The agreement each salinity holds over 10–25 °C: (S, |Δ pH NBS|,
/// |Δ pH free|, |Δ third| %, |Δ Ω| %), the third being pCO2 (case A) or
/// DIC (case B). Chosen from the computed table with a small margin, not
/// from wishes: see the report printed by the tests.
const AGREEMENT_A: [(f64, f64, f64, f64, f64); 5] = [
    (0.5, 0.09, 0.03, 7.5, 8.0),
    (1.0, 0.05, 0.05, 12.0, 6.0),
    (2.0, 0.035, 0.085, 19.0, 10.0),
    (3.0, 0.08, 0.11, 23.0, 18.0),
    (5.0, 0.15, 0.155, 30.0, 34.0),
];
const AGREEMENT_B: [(f64, f64, f64, f64, f64); 5] = [
    (0.5, 0.115, 0.01, 0.3, 13.0),
    (1.0, 0.095, 0.01, 0.3, 16.0),
    (2.0, 0.065, 0.01, 0.3, 17.0),
    (3.0, 0.045, 0.01, 0.4, 17.0),
    (5.0, 0.015, 0.01, 0.7, 13.0),
];

fn hold(rows: &[Overlap], air: bool, limits: &[(f64, f64, f64, f64, f64)]) {
    let mut failures = Vec::new();
    for r in rows {
        let &(_, nbs, free, third, omega) = limits
            .iter()
            .find(|l| l.0 == r.s)
            .expect("a limit for every salinity");
        let d_third = if air { r.d_dic_pct() } else { r.d_pco2_pct() };
        let checks = [
            ("pH NBS", r.d_ph_nbs(), nbs),
            ("pH free", r.d_ph_free(), free),
            (if air { "DIC %" } else { "pCO2 %" }, d_third, third),
            ("Ω calcite %", r.d_omega_pct(), omega),
        ];
        for (name, d, limit) in checks {
            if d.is_nan() || d.abs() > limit {
                failures.push(format!(
                    "{} °C, S {}: {name} differs by {d:+.4}, held to {limit}",
                    r.t, r.s
                ));
            }
        }
    }
    assert!(failures.is_empty(), "{}", failures.join("\n"));
}

/// Case A, TA and DIC scaled with salinity. These waters hold almost no CO2
/// (pCO2 2–35 µatm, pH 8.4–9.0), where pCO2 is most sensitive to K2: the two
/// media differ mainly in K2, because the fresh medium pairs CO3-- with
/// calcium only, while the saline constants carry the Mg and Na pairs of sea
/// water. The disagreement grows with salinity.
#[test]
fn media_overlap_alkalinity_and_dic() {
    let rows = overlap(false);
    println!(
        "Case A: TA and DIC scaled from 2300 and 2000 µmol/kg at S 35\n{}",
        markdown(&rows, false)
    );
    hold(&rows, false, &AGREEMENT_A);
    // The fresh medium gives the lower pCO2 at every point (less CO3--
    // paired means a larger apparent pK2), and the gap widens with S.
    for r in &rows {
        assert!(r.d_pco2_pct() < 0.0, "{} °C, S {}", r.t, r.s);
    }
    for &t in &OVERLAP_T {
        let gaps: Vec<f64> = rows
            .iter()
            .filter(|r| r.t == t)
            .map(|r| r.d_pco2_pct().abs())
            .collect();
        assert!(gaps.windows(2).all(|w| w[1] > w[0]), "{t} °C: {gaps:?}");
    }
}

/// Case B, TA scaled with salinity and pCO2 400 µatm. The free-scale pH
/// agrees within 0.01 and DIC within 0.7 %; the NBS pH of the saline medium
/// comes through the Takahashi et al. 1982 fH, fitted for S 20–40, which
/// tends to 0.69 rather than 1 as S → 0, so saline NBS pH runs up to 0.11
/// above the fresh one at low salinity.
#[test]
fn media_overlap_alkalinity_and_air() {
    let rows = overlap(true);
    println!(
        "Case B: TA scaled from 2300 µmol/kg at S 35, pCO2 400 µatm\n{}",
        markdown(&rows, true)
    );
    hold(&rows, true, &AGREEMENT_B);
    for r in &rows {
        // The fresh pH NBS is below the saline one everywhere here.
        assert!(r.d_ph_nbs() < 0.0, "{} °C, S {}", r.t, r.s);
    }
}

/// Why the media differ: the apparent constants on the free scale. pK1
/// agrees within 0.02 at every point; the fresh pK2 (with the CaCO3⁰ and
/// CaHCO3+ pairs) is 0.07–0.24 above the saline one, the share of CO3--
/// that sea water pairs with Mg and Na and the fresh medium leaves free.
/// The fresh constants are those at the starting ionic strength (the ions
/// given, without the carbonate species, which add under 0.5 % here).
#[test]
fn media_overlap_differ_in_k2() {
    for &t in &OVERLAP_T {
        let mut previous = 0.0;
        for &s in &OVERLAP_S {
            let kf = diluted_seawater_as_fresh(t, s).constants().unwrap();
            let ks = saline_water(t, s).constants().unwrap();
            let p = |k: f64, per: f64| -(k * per).log10();
            let d_pk1 = p(kf.k1e(), kf.free_per_working()) - p(ks.k1(), ks.free_per_working());
            let d_pk2 = p(kf.k2e(), kf.free_per_working()) - p(ks.k2(), ks.free_per_working());
            assert!(d_pk1.abs() < 0.02, "{t} °C, S {s}: ΔpK1 {d_pk1}");
            assert!((0.07..0.24).contains(&d_pk2), "{t} °C, S {s}: ΔpK2 {d_pk2}");
            assert!(
                d_pk2 > previous,
                "{t} °C, S {s}: ΔpK2 {d_pk2} should grow with S"
            );
            previous = d_pk2;
        }
    }
}

/// The hard water of the two tests below and its state.
fn hard_water_near_the_bicarbonate_maximum() -> (Water, State) {
    let comp = Composition::default()
        .with_calcium(Amount::PerKg(0.0019853))
        .and_then(|c| c.with_sodium(Amount::PerKg(0.0016466)))
        .and_then(|c| c.with_chloride(Amount::PerKg(0.0016466)))
        .unwrap();
    let w = Water::fresh(Conditions::new(18.27, 0.0).unwrap())
        .unwrap()
        .with_composition(comp);
    let s = w
        .solve(
            Measured::ph(8.1305, None).unwrap(),
            Measured::dic_umol_kg(2878.37).unwrap(),
        )
        .unwrap();
    (w, s)
}

/// Known limitation (open): a hard pond water near the bicarbonate maximum
/// (18.27 °C, Davies, Na = Cl = 1.6466 mmol/kg, Ca 1.9853 mmol/kg, pH 8.1305
/// with DIC 2878.37 µmol/kg; the values are a random case of the
/// whole-domain property test) solved again from its own DIC and HCO3: the
/// fixed point in ionic strength and free calcium does not settle on either
/// side of the two-root pair, and the pair is refused with `NoConvergence`
/// naming it. A refusal, never a wrong number; 0.1 % less HCO3 solves. Run
/// with `--ignored` once the fixed point handles it.
#[test]
#[ignore = "open: the fresh fixed point does not settle near the HCO3 maximum with calcium pairs"]
fn a_hard_water_near_the_bicarbonate_maximum_solves_from_dic_and_hco3() {
    let (w, s) = hard_water_near_the_bicarbonate_maximum();
    let again = w.solve(
        s.measured(Parameter::Dic).unwrap(),
        s.measured(Parameter::Hco3).unwrap(),
    );
    assert!(again.is_ok(), "{:?}", again.err());
}

/// The same pair is refused, naming the pair, rather than answered wrongly.
#[test]
fn near_the_bicarbonate_maximum_a_pair_that_does_not_settle_is_refused_by_name() {
    let (w, s) = hard_water_near_the_bicarbonate_maximum();
    match w.solve(
        s.measured(Parameter::Dic).unwrap(),
        s.measured(Parameter::Hco3).unwrap(),
    ) {
        // Solved: then it must be this water or its other root.
        Ok(again) => assert!(
            (again.ph_nbs - s.ph_nbs).abs() < 1e-6
                || again.warnings.iter().any(|w| w.code() == "other_root")
        ),
        Err(e) => {
            assert_eq!(e.kind(), travertine::error::ErrorKind::NoConvergence);
            assert!(e.to_string().contains("dic"), "{e}");
            assert!(e.to_string().contains("hco3"), "{e}");
        }
    }
}
