//! `travertine chart` from the outside: each chart writes its SVG (and a
//! PNG with --png), says what it wrote, and awkward input gives a message
//! with exit code 2, never a panic.

mod common;

use common::run_travertine;
use std::path::PathBuf;

/// A fresh folder for one test's files.
fn folder(name: &str) -> PathBuf {
    let dir = std::env::temp_dir().join(format!("travertine-chart-{name}-{}", std::process::id()));
    let _ = std::fs::remove_dir_all(&dir);
    std::fs::create_dir_all(&dir).unwrap();
    dir
}

fn text(b: &[u8]) -> String {
    String::from_utf8_lossy(b).into_owned()
}

#[test]
fn speciation_writes_svg_and_png() {
    let dir = folder("speciation");
    let svg = dir.join("pond.svg");
    let out = run_travertine(
        &[
            "chart",
            "speciation",
            "--temperature",
            "24.3",
            "--conductivity",
            "415 uS/cm at 25C",
            "--ph",
            "7.52",
            "--alkalinity",
            "117 mg/L CaCO3",
            "--include",
            "borate,ammonia",
            "--wind",
            "3",
            "-o",
            svg.to_str().unwrap(),
            "--png",
        ],
        None,
    );
    assert!(out.status.success(), "{}", text(&out.stderr));
    let said = text(&out.stdout);
    assert!(
        said.contains("pond.svg") && said.contains("pond.png"),
        "{said}"
    );
    let body = std::fs::read_to_string(&svg).unwrap();
    roxmltree::Document::parse(&body).expect("well-formed SVG");
    for wanted in [
        "sample pH 7.52",
        "pH (NBS scale)",
        "NH3 of NH3 + NH4⁺",
        "pK1",
        "pK2",
    ] {
        assert!(body.contains(wanted), "no {wanted:?}");
    }
    let png = std::fs::read(dir.join("pond.png")).unwrap();
    assert!(png.starts_with(b"\x89PNG"));
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn speciation_in_saline_water_needs_the_ph_scale_as_solve_does() {
    let dir = folder("saline");
    let svg = dir.join("sea.svg");
    let base = [
        "chart",
        "speciation",
        "--temperature",
        "12",
        "--salinity",
        "33",
        "--ph",
        "8.02",
        "--alkalinity",
        "2250umol/kg",
        "-o",
        svg.to_str().unwrap(),
    ];
    let out = run_travertine(&base, None);
    assert_eq!(out.status.code(), Some(2));
    assert!(text(&out.stderr).contains("scale"), "{}", text(&out.stderr));
    let mut with_scale = base.to_vec();
    with_scale.extend(["--ph-scale", "total"]);
    let out = run_travertine(&with_scale, None);
    assert!(out.status.success(), "{}", text(&out.stderr));
    let body = std::fs::read_to_string(&svg).unwrap();
    assert!(body.contains("pH (total scale)") && body.contains("sample pH 8.02"));
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn bad_chart_options_are_named() {
    let dir = folder("bad");
    let svg = dir.join("x.svg");
    let sample = [
        "chart",
        "speciation",
        "--temperature",
        "20",
        "--ph",
        "7.5",
        "--alkalinity",
        "100 mg/L CaCO3",
        "-o",
        svg.to_str().unwrap(),
    ];
    for (extra, flag) in [
        (vec!["--include", "iron"], "--include"),
        (vec!["--ph-range", "9,4"], "--ph-range"),
        (vec!["--ph-range", "four"], "--ph-range"),
        (vec!["--png", "--png-scale", "9"], "--png-scale"),
    ] {
        let mut args = sample.to_vec();
        args.extend(extra.iter().copied());
        let out = run_travertine(&args, None);
        let err = text(&out.stderr);
        assert_eq!(out.status.code(), Some(2), "{extra:?}: {err}");
        assert!(err.contains(flag), "{extra:?}: {err}");
        assert!(!err.contains("panicked"), "{err}");
    }
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn sheet_charts_of_the_demo_data() {
    let dir = folder("sheets");
    for (kind, sheet, wanted) in [
        (
            "depth",
            "tables/demo/larkvane_reservoir_profile.csv",
            "depth (m)",
        ),
        ("overview", "tables/demo/larkvane_ponds.csv", "Damson"),
    ] {
        let svg = dir.join(format!("{kind}.svg"));
        let out = run_travertine(
            &["chart", kind, sheet, "-o", svg.to_str().unwrap(), "--png"],
            None,
        );
        assert!(out.status.success(), "{kind}: {}", text(&out.stderr));
        let body = std::fs::read_to_string(&svg).unwrap();
        assert!(body.contains(wanted), "{kind}");
        assert!(dir.join(format!("{kind}.png")).exists());
    }
    // The overview repeats its note on the rows left out.
    let out = run_travertine(
        &[
            "chart",
            "overview",
            "tables/demo/larkvane_ponds.csv",
            "--profile",
            "cold-water-fish",
            "-o",
            dir.join("o.svg").to_str().unwrap(),
        ],
        None,
    );
    assert!(text(&out.stdout).contains("note: 2 of 48 rows are errors"));
    assert!(std::fs::read_to_string(dir.join("o.svg"))
        .unwrap()
        .contains("free_co2_high: above 10 mg/L"));
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn awkward_sheets_give_messages_not_panics() {
    let dir = folder("awkward");
    let svg = dir.join("x.svg");
    let svg = svg.to_str().unwrap();
    for (kind, input, wanted) in [
        ("overview", "", "empty"),
        ("depth", "", "empty"),
        (
            "overview",
            "Pond,Date,pH (NBS),Alkalinity (mg/L as CaCO3),Temp (C)\n",
            "no data rows",
        ),
        (
            "overview",
            "Pond,Date,Temp (°C),pH (NBS),Alkalinity (mg/L as CaCO3)\nA,2031-06-02,20,7..5,100\n",
            "all 1 rows of the sheet are errors",
        ),
        (
            "depth",
            "Station,Temperature (°C),pH,Alkalinity (meq/L)\nA,20.0,8.1,1.8\n",
            "no depth column",
        ),
    ] {
        let out = run_travertine(&["chart", kind, "-", "-o", svg], Some(input.as_bytes()));
        let err = text(&out.stderr);
        assert_eq!(out.status.code(), Some(2), "{kind} {input:?}: {err}");
        assert!(err.contains(wanted), "{kind} {input:?}: {err}");
        assert!(!err.contains("panicked"), "{err}");
    }
    // A single row, no date column, one depth: charts, with notes.
    for (kind, input, note) in [
        (
            "overview",
            "Pond,Temp (°C),pH (NBS),Alkalinity (mg/L as CaCO3)\nA,20,7.5,100\n",
            "No date column",
        ),
        (
            "depth",
            "Station,Depth (m),Temperature (°C),pH,Alkalinity (meq/L)\nA,3,20.0,8.1,1.8\n",
            "One depth only",
        ),
    ] {
        let out = run_travertine(&["chart", kind, "-", "-o", svg], Some(input.as_bytes()));
        assert!(out.status.success(), "{kind}: {}", text(&out.stderr));
        assert!(text(&out.stdout).contains(note), "{}", text(&out.stdout));
    }
    let out = run_travertine(&["chart", "overview", "no-such-sheet.csv", "-o", svg], None);
    assert_eq!(out.status.code(), Some(2));
    assert!(text(&out.stderr).contains("no-such-sheet.csv"));
    std::fs::remove_dir_all(&dir).unwrap();
}

#[test]
fn the_ph_band_is_the_uncertainty_solve_gives() {
    let dir = folder("uncertainty");
    let svg = dir.join("u.svg");
    let sample = [
        "--temperature",
        "24.3",
        "--alkalinity",
        "117 mg/L CaCO3",
        "--dic",
        "30 mg/L C",
        "--uncertainty",
        "dic=1%",
        "--uncertainty",
        "alkalinity=1%",
    ];
    let mut args = vec!["chart", "speciation", "-o", svg.to_str().unwrap()];
    args.extend(sample);
    let out = run_travertine(&args, None);
    assert!(out.status.success(), "{}", text(&out.stderr));
    let mut solve = vec!["solve", "--json"];
    solve.extend(sample);
    let json: serde_json::Value =
        serde_json::from_slice(&run_travertine(&solve, None).stdout).unwrap();
    let u = json["ph_nbs_u"].as_f64().unwrap();
    assert!(u > 0.01, "{u}");
    let said = text(&out.stdout);
    assert!(said.contains(&format!("±{u:.4}")), "{said} against {u}");
    let body = std::fs::read_to_string(&svg).unwrap();
    assert!(body.contains(&format!("±1 standard uncertainty of pH (±{u:.3})")));
    // A name that is not an input or constant is named.
    let out = run_travertine(
        &[
            "chart",
            "speciation",
            "--temperature",
            "20",
            "--ph",
            "7.5",
            "--alkalinity",
            "100 mg/L CaCO3",
            "--uncertainty",
            "colour=3",
            "-o",
            svg.to_str().unwrap(),
        ],
        None,
    );
    assert_eq!(out.status.code(), Some(2));
    assert!(text(&out.stderr).contains("--uncertainty"));
    std::fs::remove_dir_all(&dir).unwrap();
}
