//! One solver for both media: the problems that a separate fresh-water
//! solver had, each pinned down by a test named after it, and the prepared
//! water that replaced `solve_with_constants`.
//!
//! The waters are invented; the reference values are this crate's own
//! results from the published fits, named where they are used.

use std::process::Command;
use travertine::base::units::Amount;
use travertine::fits::CarbonicFit;
use travertine::sample::composition::Composition;
use travertine::{
    Conditions, Measured, Medium, Parameter, PreparedWater, RootChoice, SolveOptions, State,
    Warning, Water,
};

fn fresh(t: f64, s: f64) -> Water {
    Water::fresh(Conditions::new(t, s).unwrap()).unwrap()
}

fn other_root_ph(s: &State) -> Option<f64> {
    s.warnings.iter().find_map(|w| match w {
        Warning::OtherRoot { ph, .. } => Some(*ph),
        _ => None,
    })
}

/// The water of the report: pH 11.43 (NBS) with alkalinity 3000 µmol/kg at
/// 25 °C, salinity 0.2, whose CO3 is 39.97 µmol/kg. The old fresh scan never
/// found its high-pH root from alkalinity + CO3, and ignored `--root`.
#[test]
fn the_high_ph_root_of_alkalinity_and_carbonate_is_found_in_fresh_water() {
    let w = fresh(25.0, 0.2);
    let base = w
        .solve(
            Measured::ph(11.43, None).unwrap(),
            Measured::alkalinity_umol_kg(3000.0).unwrap(),
        )
        .unwrap();
    // The CO3 of the report, to the four figures it was given with.
    assert!(
        (base.co3_umol_kg - 39.97).abs() < 0.005,
        "{}",
        base.co3_umol_kg
    );
    let (ta, co3) = (
        base.measured(Parameter::Alkalinity).unwrap(),
        base.measured(Parameter::Co3).unwrap(),
    );
    let higher = w
        .solve_with(
            ta,
            co3,
            &SolveOptions::default().with_root(RootChoice::HigherPh),
        )
        .unwrap();
    assert!((higher.ph_nbs - 11.43).abs() < 1e-9, "{}", higher.ph_nbs);
    // The default is the root nearer pH 8 (the report's 8.376), and it
    // names the other at its own ionic strength.
    let natural = w.solve(ta, co3).unwrap();
    assert!((natural.ph_nbs - 8.376).abs() < 5e-4, "{}", natural.ph_nbs);
    let named = other_root_ph(&natural).expect("the other root is named");
    assert!((named - 11.43).abs() < 1e-9, "{named}");
    let lower = w
        .solve_with(
            ta,
            co3,
            &SolveOptions::default().with_root(RootChoice::LowerPh),
        )
        .unwrap();
    assert_eq!(lower.ph_nbs, natural.ph_nbs);
}

/// Both media find the second root of the same pair; at salinity 1.5 the
/// saline medium gave pH 11.42 in the report.
#[test]
fn both_media_find_both_roots() {
    let ta = Measured::alkalinity_umol_kg(3000.0).unwrap();
    let co3 = Measured::co3_umol_kg(39.97).unwrap();
    let higher = SolveOptions::default().with_root(RootChoice::HigherPh);
    for w in [
        fresh(25.0, 0.2),
        Water::saline(Conditions::new(25.0, 1.5).unwrap()).unwrap(),
    ] {
        let s = w.solve_with(ta, co3, &higher).unwrap();
        assert!(
            s.ph_nbs > 11.3 && s.ph_nbs < 11.5,
            "{:?}: {}",
            w.medium(),
            s.ph_nbs
        );
        assert!(other_root_ph(&s).is_some(), "{:?}", w.medium());
    }
}

/// A prepared water solves exactly as the water does, in both media, and
/// can be shared between threads (the old `solve_with_constants` ignored
/// its constants in fresh water and took another water's in saline water).
#[test]
fn a_prepared_water_solves_as_the_water_does() {
    let pond = fresh(22.0, 0.2)
        .with_specific_conductance_us_cm(350.0)
        .unwrap()
        .with_composition(
            Composition::default()
                .with_calcium(Amount::PerLitre(1.2e-3))
                .unwrap(),
        );
    let sea = Water::saline(Conditions::new(2.0, 20.0).unwrap()).unwrap();
    for w in [pond, sea] {
        let prepared: PreparedWater = w.prepare().unwrap();
        assert_eq!(prepared.water(), &w);
        let pairs = [
            (
                Measured::alkalinity_umol_kg(1850.0).unwrap(),
                Measured::ph(7.9, Some(travertine::PhScale::Nbs)).unwrap(),
            ),
            (
                Measured::dic_umol_kg(1800.0).unwrap(),
                Measured::pco2_uatm(600.0).unwrap(),
            ),
        ];
        let shared = &prepared;
        let results: Vec<State> = std::thread::scope(|scope| {
            let handles: Vec<_> = pairs
                .iter()
                .map(|&(a, b)| scope.spawn(move || shared.solve(a, b).unwrap()))
                .collect();
            handles.into_iter().map(|h| h.join().unwrap()).collect()
        });
        for ((a, b), from_prepared) in pairs.iter().zip(results) {
            assert_eq!(from_prepared, w.solve(*a, *b).unwrap());
        }
    }
}

/// Recomputing at other conditions keeps the measured state's carbonic fit:
/// the automatic choice used to switch from Lueker et al. (2000) to Millero
/// et al. (2006) below 2 °C, and pCO2 jumped 1.9 % between the two sides.
#[test]
fn a_recomputed_state_keeps_the_carbonic_fit_it_was_measured_with() {
    let lab = Water::saline(Conditions::new(25.0, 35.0).unwrap())
        .unwrap()
        .solve(
            Measured::ph(7.9, Some(travertine::PhScale::Total)).unwrap(),
            Measured::alkalinity_umol_kg(2300.0).unwrap(),
        )
        .unwrap();
    assert_eq!(lab.fits_used.carbonic, "lueker2000");
    let above = lab.at(Conditions::new(2.01, 35.0).unwrap()).unwrap();
    let below = lab.at(Conditions::new(1.99, 35.0).unwrap()).unwrap();
    assert_eq!(below.fits_used.carbonic, "lueker2000");
    // Outside Lueker's published 2–35 °C: said, not silent.
    assert!(below.warnings.iter().any(|w| matches!(
        w,
        Warning::Extrapolated {
            constant: "K1 and K2",
            ..
        }
    )));
    // 0.02 °C moves pCO2 by about 0.08 % (roughly 4 % per °C); a switch of
    // fit moved it 1.9 %.
    let step = (below.pco2_uatm / above.pco2_uatm - 1.0).abs();
    assert!(step < 2e-3, "pCO2 moved {step}");
    // A fit the user chose is kept too.
    let chosen = Water::saline(Conditions::new(25.0, 35.0).unwrap())
        .unwrap()
        .with_fits(travertine::fits::Fits::default().with_carbonic(CarbonicFit::Roy1993))
        .solve(
            Measured::ph(7.9, Some(travertine::PhScale::Total)).unwrap(),
            Measured::alkalinity_umol_kg(2300.0).unwrap(),
        )
        .unwrap();
    let moved = chosen.at(Conditions::new(10.0, 35.0).unwrap()).unwrap();
    assert_eq!(moved.fits_used.carbonic, "roy1993");
}

fn media_caution(s: &State) -> Option<(&'static str, f64)> {
    s.warnings.iter().find_map(|w| match w {
        Warning::MediaDisagree {
            other, pco2_uatm, ..
        } => Some((*other, *pco2_uatm)),
        _ => None,
    })
}

/// The switch between the media: alkalinity = DIC = 2000 µmol/kg at 20 °C
/// gave pCO2 596 µatm at salinity 0.99 (fresh) and 736 µatm at 1.0 (saline)
/// without a word. Each side now names the other's figure.
#[test]
fn each_side_of_the_switch_names_the_other_medium() {
    let pair = (
        Measured::alkalinity_umol_kg(2000.0).unwrap(),
        Measured::dic_umol_kg(2000.0).unwrap(),
    );
    let at = |s: f64| Water::auto(Conditions::new(20.0, s).unwrap()).unwrap();
    let fresh_side = at(0.99).solve(pair.0, pair.1).unwrap();
    let saline_side = at(1.0).solve(pair.0, pair.1).unwrap();
    assert_eq!(fresh_side.medium, Medium::Fresh);
    assert_eq!(saline_side.medium, Medium::Saline);
    // The figures of the report (this crate's results, 20 °C).
    assert!((fresh_side.pco2_uatm - 596.0).abs() < 1.0);
    assert!((saline_side.pco2_uatm - 736.0).abs() < 1.0);
    let (other, pco2) = media_caution(&fresh_side).expect("a caution on the fresh side");
    assert_eq!(other, "saline");
    assert!((pco2 - 734.7).abs() < 0.5, "{pco2}");
    let (other, pco2) = media_caution(&saline_side).expect("a caution on the saline side");
    assert_eq!(other, "fresh");
    assert!((pco2 - 596.3).abs() < 0.5, "{pco2}");
    // Outside the overlap, or when switched off, no comparison.
    assert!(media_caution(&at(0.3).solve(pair.0, pair.1).unwrap()).is_none());
    let quiet = SolveOptions::default().with_media_comparison(false);
    assert!(media_caution(&at(0.99).solve_with(pair.0, pair.1, &quiet).unwrap()).is_none());
    // Where the media agree within 5 %, as with pCO2 given, no caution.
    let with_gas = at(2.0)
        .solve(
            Measured::alkalinity_umol_kg(200.0).unwrap(),
            Measured::pco2_uatm(400.0).unwrap(),
        )
        .unwrap();
    assert!(
        media_caution(&with_gas).is_none(),
        "{:?}",
        with_gas.warnings
    );
}

/// The precipitation potential, a root of full solves, is computed on
/// request; the Langelier index is in every result with calcium.
#[test]
fn the_precipitation_potential_is_computed_on_request() {
    let well = fresh(12.0, 0.3).with_composition(
        Composition::default()
            .with_calcium(Amount::PerKg(1.5e-3))
            .unwrap(),
    );
    let (ph, ta) = (
        Measured::ph(7.1, None).unwrap(),
        Measured::alkalinity_umol_kg(3600.0).unwrap(),
    );
    let plain = well.solve(ph, ta).unwrap();
    assert!(plain.langelier_index.is_some());
    assert_eq!(plain.precipitation_potential_mg_l_caco3, None);
    let asked = well
        .solve_with(
            ph,
            ta,
            &SolveOptions::default().with_precipitation_potential(true),
        )
        .unwrap();
    // Undersaturated (Langelier index below 0): calcite would dissolve.
    assert!(plain.langelier_index.unwrap() < 0.0);
    assert!(asked.precipitation_potential_mg_l_caco3.unwrap() < 0.0);
    assert_eq!(asked.langelier_index, plain.langelier_index);
}

/// The sheet writes the precipitation potential when its column is asked
/// for, and `solve` always shows it.
#[test]
fn the_sheet_writes_the_precipitation_potential_only_when_asked() {
    let run = |args: &[&str]| {
        let o = Command::new(env!("CARGO_BIN_EXE_travertine"))
            .args(args)
            .current_dir(env!("CARGO_MANIFEST_DIR"))
            .output()
            .expect("the binary runs");
        assert!(o.status.success(), "{}", String::from_utf8_lossy(&o.stderr));
        String::from_utf8_lossy(&o.stdout).into_owned()
    };
    let pond = "tables/demo/larkvane_ponds.csv";
    let default = run(&["sheet", pond]);
    assert!(!default
        .lines()
        .next()
        .unwrap()
        .contains("precipitation_potential"));
    let asked = run(&[
        "sheet",
        pond,
        "--columns",
        "langelier_index,precipitation_potential_mg_l_caco3",
    ]);
    let header: Vec<&str> = asked.lines().next().unwrap().split(',').collect();
    let col = header
        .iter()
        .position(|h| *h == "precipitation_potential_mg_l_caco3")
        .expect("the column");
    let filled = asked
        .lines()
        .skip(1)
        .filter(|l| {
            l.split(',')
                .nth(col)
                .is_some_and(|v| v.parse::<f64>().is_ok())
        })
        .count();
    // The demo sheet has 48 rows with calcium, 3 of them defective.
    assert!(filled >= 40, "{filled} rows with a potential");
    let json = run(&[
        "solve",
        "--ph",
        "7.1",
        "--alkalinity",
        "180 mg/L CaCO3",
        "--temperature",
        "12",
        "--conductivity",
        "520uS/cm",
        "--calcium",
        "60 mg/L Ca",
        "--json",
    ]);
    let v: serde_json::Value = serde_json::from_str(&json).unwrap();
    assert!(v["precipitation_potential_mg_l_caco3"].is_number());
}

/// A library call that gives a saline pH without its scale is solved on the
/// total scale and says so with a warning of its own code; a stated scale
/// raises none, and fresh water (NBS by definition) raises none.
#[test]
fn an_unstated_saline_ph_scale_is_a_stated_assumption() {
    let sea = Water::saline(Conditions::new(21.0, 28.0).unwrap()).unwrap();
    let ta = Measured::alkalinity_umol_kg(1950.0).unwrap();
    let unstated = sea.solve(ta, Measured::ph(7.92, None).unwrap()).unwrap();
    assert!(unstated
        .warnings
        .iter()
        .any(|w| w.code() == "ph_scale_assumed_total"));
    let stated = sea
        .solve(
            ta,
            Measured::ph(7.92, Some(travertine::PhScale::Total)).unwrap(),
        )
        .unwrap();
    assert!(!stated
        .warnings
        .iter()
        .any(|w| w.code() == "ph_scale_assumed_total"));
    assert_eq!(stated.ph_total, unstated.ph_total);
    let pond = Water::fresh(Conditions::new(21.0, 0.2).unwrap()).unwrap();
    let fresh = pond.solve(ta, Measured::ph(7.92, None).unwrap()).unwrap();
    assert!(!fresh
        .warnings
        .iter()
        .any(|w| w.code() == "ph_scale_assumed_total"));
}
