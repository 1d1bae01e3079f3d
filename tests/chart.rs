//! The charts of `travertine::chart`: the SVG parses and says what it
//! should (axis titles, legend entries, the sample's marker), the
//! speciation curves cross at pK1 and pK2 of the constants used, each chart
//! renders to a PNG that is not blank, and awkward sheets give a chart or a
//! clear message, never a panic.

use resvg::tiny_skia::Pixmap;
use travertine::chart::{
    depth_profile, overview, speciation, ChartError, Include, SheetChartOptions, SpeciationData,
    SpeciationOptions, Species,
};
use travertine::decisions::Profile;
use travertine::sheet::SheetOptions;
use travertine::{Conditions, Measured, PhScale, State, Water};

fn demo(name: &str) -> Vec<u8> {
    let path = format!("{}/tables/demo/{name}", env!("CARGO_MANIFEST_DIR"));
    std::fs::read(&path).unwrap_or_else(|e| panic!("{path}: {e}"))
}

fn sea() -> State {
    Water::saline(Conditions::new(25.0, 35.0).unwrap())
        .unwrap()
        .solve(
            Measured::alkalinity_umol_kg(2300.0).unwrap(),
            Measured::dic_umol_kg(2000.0).unwrap(),
        )
        .unwrap()
}

fn pond() -> State {
    Water::fresh(Conditions::new(24.3, 0.2).unwrap())
        .unwrap()
        .with_specific_conductance_us_cm(415.0)
        .unwrap()
        .solve(
            Measured::alkalinity_umol_kg(2340.0).unwrap(),
            Measured::ph(7.52, None).unwrap(),
        )
        .unwrap()
}

/// Every text of an SVG document, read as XML; fails on SVG that does not
/// parse.
fn texts(svg: &str) -> Vec<String> {
    let doc = roxmltree::Document::parse(svg).expect("the SVG is well-formed XML");
    assert_eq!(doc.root_element().tag_name().name(), "svg");
    // And it is SVG that an SVG reader takes.
    resvg::usvg::Tree::from_str(svg, &resvg::usvg::Options::default()).expect("usvg reads it");
    doc.descendants()
        .filter(|n| n.has_tag_name("text"))
        .map(|n| {
            n.descendants()
                .filter(|t| t.is_text())
                .filter_map(|t| t.text())
                .collect::<String>()
                .trim()
                .to_string()
        })
        .collect()
}

fn has(texts: &[String], wanted: &str) -> bool {
    texts.iter().any(|t| t.contains(wanted))
}

fn assert_has(texts: &[String], wanted: &[&str]) {
    for w in wanted {
        assert!(has(texts, w), "no text {w:?} in {texts:?}");
    }
}

/// The pH where curves `a` and `b` cross (a − b changes sign), by linear
/// interpolation between the two pH values either side.
fn crossing(d: &SpeciationData, a: Species, b: Species) -> f64 {
    let curve = |s: Species| &d.curves.iter().find(|(x, _)| *x == s).unwrap().1;
    let (fa, fb) = (curve(a), curve(b));
    for i in 1..d.ph.len() {
        let (g0, g1) = (fa[i - 1] - fb[i - 1], fa[i] - fb[i]);
        if g0.signum() != g1.signum() {
            return d.ph[i - 1] + (d.ph[i] - d.ph[i - 1]) * g0 / (g0 - g1);
        }
    }
    panic!("{a:?} and {b:?} do not cross");
}

#[test]
fn speciation_svg_has_titles_legend_and_marker() {
    for (state, scale) in [(pond(), "NBS scale"), (sea(), "total scale")] {
        let options = SpeciationOptions::default()
            .with_include("borate,ammonia,phosphate".parse::<Include>().unwrap());
        let chart = speciation(&state, &options).unwrap();
        let t = texts(chart.svg());
        assert_has(
            &t,
            &[
                &format!("pH ({scale})"),
                "fraction of the total (0 to 1)",
                "CO2*",
                "HCO3⁻",
                "CO3²⁻",
                "B(OH)4⁻ of total boron",
                "NH3 of NH3 + NH4⁺",
                "H2PO4⁻",
                "HPO4²⁻",
                "pK1",
                "pK2",
            ],
        );
        let marker = format!(
            "sample pH {:.2}",
            state.ph(if scale == "NBS scale" {
                PhScale::Nbs
            } else {
                PhScale::Total
            })
        );
        assert_has(&t, &[&marker]);
        assert!(!has(&t, "standard uncertainty"));
    }
}

#[test]
fn speciation_without_include_draws_only_carbon() {
    let t = texts(
        speciation(&pond(), &SpeciationOptions::default())
            .unwrap()
            .svg(),
    );
    assert!(has(&t, "HCO3⁻"));
    assert!(!has(&t, "B(OH)4⁻"));
    assert!(!has(&t, "NH3"));
}

#[test]
fn uncertainty_band_is_drawn_and_named() {
    let state = pond();
    let u = 0.02;
    let options = SpeciationOptions::default().with_ph_uncertainty(u).unwrap();
    let chart = speciation(&state, &options).unwrap();
    let t = texts(chart.svg());
    assert_has(&t, &["±1 standard uncertainty of pH (±0.020)"]);
    // The band: a sky-blue rectangle (Okabe & Ito #56B4E9), drawn only with
    // an uncertainty given (the carbonate curves use other colours).
    let band = r##"fill="#56B4E9""##;
    assert!(
        chart.svg().matches(band).count() >= 2,
        "band and its legend"
    );
    let plain = speciation(&state, &SpeciationOptions::default()).unwrap();
    assert_eq!(plain.svg().matches(band).count(), 0);
    // Its width: 2u of pH against the 9 pH units of the axis (3 to 12,
    // drawn over the width of the plot), read back from the SVG.
    let doc = roxmltree::Document::parse(chart.svg()).unwrap();
    let widths: Vec<f64> = doc
        .descendants()
        .filter(|n| n.has_tag_name("rect") && n.attribute("fill") == Some("#56B4E9"))
        .filter_map(|n| n.attribute("width")?.parse().ok())
        .collect();
    let panel: f64 = doc
        .descendants()
        .filter(|n| n.has_tag_name("rect") && n.attribute("fill") == Some("#FFFFFF"))
        .filter_map(|n| n.attribute("width")?.parse().ok())
        .fold(0.0, f64::max);
    let expected = panel * 2.0 * u / 9.0;
    assert!(
        widths.iter().any(|w| (w - expected).abs() <= 2.0),
        "band widths {widths:?}, expected about {expected:.1} px"
    );
    assert!(SpeciationOptions::default()
        .with_ph_uncertainty(0.0)
        .is_err());
    assert!(SpeciationOptions::default()
        .with_ph_uncertainty(f64::NAN)
        .is_err());
}

#[test]
fn curves_cross_at_pk1_and_pk2_of_the_constants_used() {
    // Saline: the constants of the water itself, total scale. Reference:
    // Lueker et al. (2000) at 25 °C, S = 35: pK1 5.8472 (the check value
    // of Dickson et al. 2007, the Guide, quoted in src/medium/constants.rs).
    let s = sea();
    let d = SpeciationData::new(&s, &SpeciationOptions::default()).unwrap();
    let k = s.water_sample().constants().unwrap();
    let (pk1, pk2) = (-k.k1().log10(), -k.k2().log10());
    assert!((pk1 - 5.8472).abs() < 5e-4);
    assert!((crossing(&d, Species::Co2, Species::Bicarbonate) - pk1).abs() < 0.01);
    assert!((crossing(&d, Species::Bicarbonate, Species::Carbonate) - pk2).abs() < 0.01);
    assert!((d.pk1 - pk1).abs() < 1e-9 && (d.pk2 - pk2).abs() < 1e-9);

    // The same sea water with the axis on the NBS scale: the crossings move
    // with the scale.
    let nbs = SpeciationData::new(
        &s,
        &SpeciationOptions::default().with_ph_scale(PhScale::Nbs),
    )
    .unwrap();
    let pk1_nbs = k.ph_from_h(k.k1(), PhScale::Nbs);
    assert!((pk1_nbs - pk1).abs() > 0.05, "the scales differ here");
    assert!((crossing(&nbs, Species::Co2, Species::Bicarbonate) - pk1_nbs).abs() < 0.01);

    // Fresh: the constants at the state's ionic strength (NBS scale,
    // activities folded in).
    let p = pond();
    let d = SpeciationData::new(&p, &SpeciationOptions::default()).unwrap();
    let k = p
        .water_sample()
        .clone()
        .with_ionic_strength(p.ionic_strength)
        .unwrap()
        .constants()
        .unwrap();
    let (pk1, pk2) = (-k.k1().log10(), -k.k2().log10());
    assert!((crossing(&d, Species::Co2, Species::Bicarbonate) - pk1).abs() < 0.01);
    assert!((crossing(&d, Species::Bicarbonate, Species::Carbonate) - pk2).abs() < 0.01);
    // Plummer & Busenberg (1982) at infinite dilution, 25 °C: pK1 6.352,
    // pK2 10.329 (from memory, unverified); the pond's ionic strength and
    // 24.3 °C lower both by a few hundredths to a tenth or two.
    assert!(pk1 < 6.352 && pk1 > 6.2, "pK1 {pk1}");
    assert!(pk2 < 10.33 && pk2 > 10.0, "pK2 {pk2}");

    // And the other systems at their own pK.
    let all = SpeciationOptions::default()
        .with_include("borate,ammonia,phosphate".parse::<Include>().unwrap());
    let d = SpeciationData::new(&s, &all).unwrap();
    let half = |sp: Species| {
        let f = &d.curves.iter().find(|(x, _)| *x == sp).unwrap().1;
        let i = f.iter().position(|v| *v >= 0.5).unwrap();
        d.ph[i]
    };
    assert!((half(Species::Borate) - -d.constants.kb().log10()).abs() < 0.011);
    assert!((half(Species::Ammonia) - -d.constants.knh4().log10()).abs() < 0.011);
}

#[test]
fn fractions_add_up_to_one() {
    let d = SpeciationData::new(&pond(), &SpeciationOptions::default()).unwrap();
    for i in 0..d.ph.len() {
        let sum: f64 = d.curves.iter().map(|(_, f)| f[i]).sum();
        assert!((sum - 1.0).abs() < 1e-12, "at pH {}: {sum}", d.ph[i]);
    }
    assert!((d.ph[1] - d.ph[0] - 0.01).abs() < 1e-9);
}

/// Pixels of `png` inside the middle of the drawing (the plot area: 20 % in
/// from each side) that are neither the page, the panel nor the grid.
fn ink_in_plot_area(png: &[u8]) -> usize {
    let p = Pixmap::decode_png(png).expect("a PNG");
    let (w, h) = (p.width() as usize, p.height() as usize);
    let background = [[0xF4, 0xF1, 0xEA], [0xFF, 0xFF, 0xFF], [0xE2, 0xDE, 0xD5]];
    let mut ink = 0;
    for y in h / 5..h * 4 / 5 {
        for x in w / 5..w * 4 / 5 {
            let c = p.pixel(x as u32, y as u32).unwrap().demultiply();
            let rgb = [c.red(), c.green(), c.blue()];
            let near = |b: &[u8; 3]| rgb.iter().zip(b).all(|(a, b)| a.abs_diff(*b) <= 12);
            if !background.iter().any(near) {
                ink += 1;
            }
        }
    }
    ink
}

#[test]
fn every_chart_renders_to_a_png_that_is_not_blank() {
    let sheet = SheetChartOptions::default();
    let charts = [
        speciation(&pond(), &SpeciationOptions::default()).unwrap(),
        depth_profile(&sheet, &demo("larkvane_reservoir_profile.csv")[..]).unwrap(),
        overview(&sheet, &demo("larkvane_ponds.csv")[..]).unwrap(),
    ];
    for c in &charts {
        let png = c.png(1.0).unwrap();
        let ink = ink_in_plot_area(&png);
        assert!(ink >= 1500, "only {ink} drawn pixels in the plot area");
    }
    // The check itself: a blank page has no ink.
    let blank = travertine::chart::svg_to_png(
        r##"<svg xmlns="http://www.w3.org/2000/svg" width="300" height="200">
            <rect width="300" height="200" fill="#F4F1EA"/></svg>"##,
        1.0,
    )
    .unwrap();
    assert_eq!(ink_in_plot_area(&blank), 0);
}

#[test]
fn depth_profile_of_the_demo_reservoir() {
    let c = depth_profile(
        &SheetChartOptions::default(),
        &demo("larkvane_reservoir_profile.csv")[..],
    )
    .unwrap();
    let t = texts(c.svg());
    assert_has(
        &t,
        &[
            "depth (m)",
            "pCO2 (µatm, log scale)",
            "pH (NBS scale)",
            "calcite Ω (no unit)",
            "Station A",
            "Ω = 1",
        ],
    );
    assert!(c.notes().is_empty(), "{:?}", c.notes());
}

#[test]
fn overview_of_the_demo_ponds_notes_the_error_rows_and_draws_the_limits() {
    let c = overview(
        &SheetChartOptions::default(),
        &demo("larkvane_ponds.csv")[..],
    )
    .unwrap();
    let t = texts(c.svg());
    assert_has(
        &t,
        &[
            "Alder",
            "Birch",
            "Cedar",
            "Damson",
            "pCO2 (µatm, log scale)",
            "pH (NBS scale)",
            "free CO2 (mg/L as CO2)",
            "calcite SI (log10 Ω, no unit)",
            "date (time of sampling)",
            "ph_high: above 9",
            "ph_low: below 6.5",
            "free_co2_high: above 20 mg/L",
            "flag raised (profile `general`)",
            "2 of 48 rows are errors and are left out",
        ],
    );
    // Another profile, other limits.
    let trout =
        SheetChartOptions::default().with_profile(Profile::built_in("cold-water-fish").unwrap());
    let t = texts(
        overview(&trout, &demo("larkvane_ponds.csv")[..])
            .unwrap()
            .svg(),
    );
    assert_has(
        &t,
        &["free_co2_high: above 10 mg/L", "profile `cold-water-fish`"],
    );
}

#[test]
fn overview_of_saline_rows_draws_aragonite() {
    let sheet = "site,date,temperature_c,salinity,ph_total,alkalinity_umol_kg\n\
                 bay,2031-06-01,18,33,8.05,2250\n\
                 bay,2031-06-02,19,33,7.95,2240\n";
    let profile = Profile::built_in("shellfish-hatchery").unwrap();
    let c = overview(
        &SheetChartOptions::default().with_profile(profile),
        sheet.as_bytes(),
    )
    .unwrap();
    let t = texts(c.svg());
    assert_has(
        &t,
        &[
            "aragonite Ω (no unit)",
            "omega_aragonite_low: below 1.5",
            "pH (total scale)",
        ],
    );
}

fn message(e: ChartError) -> String {
    let m = e.to_string();
    assert!(!m.is_empty());
    m
}

#[test]
fn an_empty_sheet_is_a_clear_message() {
    let o = SheetChartOptions::default();
    for f in [overview::<&[u8]>, depth_profile::<&[u8]>] {
        let m = message(f(&o, b"".as_slice()).unwrap_err());
        assert!(m.contains("empty"), "{m}");
        let m = message(
            f(
                &o,
                b"Pond,Date,pH (NBS),Alkalinity (mg/L as CaCO3),Temp (C)\n".as_slice(),
            )
            .unwrap_err(),
        );
        assert!(m.contains("no data rows"), "{m}");
    }
}

#[test]
fn a_sheet_whose_rows_are_all_errors_is_a_clear_message() {
    let sheet = "Pond,Date,Depth (m),Temp (°C),pH (NBS),Alkalinity (mg/L as CaCO3)\n\
                 Alder,2031-06-02,1,24,7..5,117\n\
                 Birch,2031-06-02,2,24,abc,97\n";
    let o = SheetChartOptions::default();
    for e in [
        overview(&o, sheet.as_bytes()).unwrap_err(),
        depth_profile(&o, sheet.as_bytes()).unwrap_err(),
    ] {
        assert_eq!(e.code(), "chart_nothing_to_draw");
        let m = message(e);
        assert!(m.contains("all 2 rows of the sheet are errors"), "{m}");
        assert!(m.contains("line 2"), "{m}");
    }
}

#[test]
fn a_sheet_without_a_date_column_is_drawn_in_sheet_order() {
    let sheet = "Pond,Temp (°C),pH (NBS),Alkalinity (mg/L as CaCO3)\n\
                 Alder,24,7.5,117\nAlder,26,8.4,119\nBirch,24,7.4,97\n";
    let c = overview(&SheetChartOptions::default(), sheet.as_bytes()).unwrap();
    let t = texts(c.svg());
    assert_has(
        &t,
        &[
            "row of the sheet (no date column)",
            "No date column",
            "Alder",
            "Birch",
        ],
    );
    assert!(c.notes().iter().any(|n| n.contains("sheet order")));
}

#[test]
fn a_single_row_sheet_gives_a_chart() {
    let sheet = "Pond,Date,Time,Depth (m),Temp (°C),pH (NBS),Alkalinity (mg/L as CaCO3)\n\
                 Alder,2031-06-02,06:30,1.5,24,7.5,117\n";
    let o = SheetChartOptions::default();
    let c = overview(&o, sheet.as_bytes()).unwrap();
    let t = texts(c.svg());
    assert_has(&t, &["Alder", "1 computed rows of 1"]);
    // No calcium: SI calcite is not computed, and the panel says so.
    assert_has(&t, &["no row has calcite saturation index"]);
    let c = depth_profile(&o, sheet.as_bytes()).unwrap();
    assert!(c.notes().iter().any(|n| n.contains("One depth only")));
    assert!(c.png(1.0).is_ok());
}

#[test]
fn a_profile_with_one_depth_gives_a_chart() {
    let sheet = "Station,Depth (m),Temperature (°C),pH,Alkalinity (meq/L),Conductivity (µS/cm)\n\
                 A,4,20.0,8.1,1.8,225\nB,4,20.5,8.0,1.7,220\n";
    let c = depth_profile(&SheetChartOptions::default(), sheet.as_bytes()).unwrap();
    let t = texts(c.svg());
    assert_has(&t, &["A", "B", "depth (m)", "One depth only"]);
}

#[test]
fn a_profile_without_depth_is_a_clear_message() {
    let sheet = "Station,Temperature (°C),pH,Alkalinity (meq/L)\nA,20.0,8.1,1.8\n";
    let e = depth_profile(&SheetChartOptions::default(), sheet.as_bytes()).unwrap_err();
    assert_eq!(e.code(), "chart_missing_column");
    assert!(message(e).contains("Depth (m)"));
    // Named by hand, read in metres.
    let sheet = "Station,Tiefe,Temperature (°C),pH,Alkalinity (meq/L)\nA,3,20.0,8.1,1.8\n";
    let o = SheetChartOptions::default()
        .with_columns(travertine::chart::SheetColumns::default().with_depth("Tiefe"));
    assert!(depth_profile(&o, sheet.as_bytes()).is_ok());
    let o = SheetChartOptions::default()
        .with_columns(travertine::chart::SheetColumns::default().with_depth("Depth"));
    let e = depth_profile(&o, sheet.as_bytes()).unwrap_err();
    assert!(message(e).contains("is not a header of the sheet"));
}

#[test]
fn a_sheet_that_cannot_start_is_the_sheet_error() {
    // A header without a unit stops the sheet; the chart passes its message on.
    let sheet = "Pond,Date,pH (NBS),Alkalinity\nAlder,2031-06-02,7.5,117\n";
    let e = overview(&SheetChartOptions::default(), sheet.as_bytes()).unwrap_err();
    assert_eq!(e.code(), "chart_sheet_error");
    assert!(message(e).contains("Alkalinity"));
    // Settings reach the sheet.
    let o = SheetChartOptions::new(
        SheetOptions::default()
            .with_set("temperature_c=20")
            .unwrap(),
    );
    let sheet = "Pond,Date,pH (NBS),Alkalinity (mg/L as CaCO3)\nAlder,2031-06-02,7.5,117\n";
    assert!(overview(&o, sheet.as_bytes()).is_ok());
}

#[test]
fn the_band_can_come_from_the_propagated_uncertainty() {
    // A sea-water sample from pH (total scale) and alkalinity, with the
    // propagation of decisions::uncertainty: the pH on the chart's scale
    // gets its standard uncertainty, which the chart draws as the band.
    use travertine::decisions::uncertainty::{propagate, Problem, Size, Uncertainties};
    use travertine::sample::inputs::Input;
    use travertine::Parameter;
    let water = Water::saline(Conditions::new(15.0, 34.0).unwrap()).unwrap();
    let a = Measured::ph(8.05, Some(PhScale::Total)).unwrap();
    let b = Measured::alkalinity_umol_kg(2250.0).unwrap();
    let problem = Problem::new(&water, a, b).unwrap();
    let u = Uncertainties::new()
        .with_input(Input::Carbon(Parameter::Ph), Size::Absolute(0.015))
        .unwrap();
    let p = propagate(&problem, &u, |s, out| out.push(Some(s.ph(PhScale::Total)))).unwrap();
    let u_ph = p.outputs[0].u.unwrap();
    // pH measured on the chart's scale: its uncertainty is the input's.
    assert!((u_ph - 0.015).abs() < 1e-6, "{u_ph}");
    let state = problem.solve().unwrap();
    let options = SpeciationOptions::default()
        .with_ph_scale(PhScale::Total)
        .with_ph_uncertainty(u_ph)
        .unwrap();
    let t = texts(speciation(&state, &options).unwrap().svg());
    assert_has(
        &t,
        &[
            &format!("±1 standard uncertainty of pH (±{u_ph:.3})"),
            "sample pH 8.05",
        ],
    );
}
