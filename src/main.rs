//! The `travertine` command: parses arguments, calls the library, prints.

use clap::{Args, Parser, Subcommand};
use std::process::ExitCode;
use travertine::constants::{BisulfateFit, BoronTotalFit, CarbonicFit, Fits, FluorideFit};
use travertine::units::{units_with, Amount, Quantity, Unit};
use travertine::water::Composition;
use travertine::{
    Conditions, Error, Measured, Parameter, PhScale, RootChoice, SolveOptions, State, Water,
};

#[derive(Parser)]
#[command(
    name = "travertine",
    version,
    about = "The carbonate system of natural waters, from any two measured parameters"
)]
struct Cli {
    #[command(subcommand)]
    command: Command,
}

#[derive(Subcommand)]
enum Command {
    /// Solve one sample from two measured carbonate parameters.
    Solve(SolveArgs),
}

#[derive(Args)]
struct SolveArgs {
    /// Total alkalinity, with a unit: umol/kg, mmol/kg, mmol/L, meq/L, "mg/L CaCO3", ...
    #[arg(long, allow_hyphen_values = true)]
    alkalinity: Option<String>,
    /// Dissolved inorganic carbon, with a unit: umol/kg, mmol/L, "mg/L C", ...
    #[arg(long, allow_hyphen_values = true)]
    dic: Option<String>,
    /// pH, a plain number on the scale given by --ph-scale.
    #[arg(long, allow_hyphen_values = true)]
    ph: Option<String>,
    /// CO2 partial pressure, with a unit: uatm, atm, Pa, kPa.
    #[arg(long, allow_hyphen_values = true)]
    pco2: Option<String>,
    /// CO2 fugacity, with a unit: uatm, atm, Pa, kPa.
    #[arg(long, allow_hyphen_values = true)]
    fco2: Option<String>,
    /// CO2 mole fraction in dry air, with a unit: ppm.
    #[arg(long, allow_hyphen_values = true)]
    xco2: Option<String>,
    /// Dissolved CO2* with a unit: umol/kg, "mg/L CO2", ...
    #[arg(long, allow_hyphen_values = true)]
    co2: Option<String>,
    /// Bicarbonate with a unit: umol/kg, "mg/L HCO3", ...
    #[arg(long, allow_hyphen_values = true)]
    hco3: Option<String>,
    /// Carbonate with a unit: umol/kg, "mg/L CO3", ...
    #[arg(long, allow_hyphen_values = true)]
    co3: Option<String>,
    /// Scale of --ph: total, seawater, free or nbs (default: total in saline water).
    #[arg(long)]
    ph_scale: Option<String>,
    /// Temperature of the measurement, °C.
    #[arg(long, allow_hyphen_values = true)]
    temperature: f64,
    /// Practical salinity.
    #[arg(long, allow_hyphen_values = true)]
    salinity: Option<f64>,
    /// Gauge pressure at the measurement, dbar.
    #[arg(long, default_value_t = 0.0, allow_hyphen_values = true)]
    pressure: f64,
    /// Total air pressure over the water, atm (for xCO2).
    #[arg(long, default_value_t = 1.0, allow_hyphen_values = true)]
    air_pressure: f64,
    /// Report the state at this temperature (°C), keeping alkalinity, DIC and totals.
    #[arg(long, allow_hyphen_values = true)]
    output_temperature: Option<f64>,
    /// Report the state at this gauge pressure (dbar), keeping alkalinity, DIC and totals.
    #[arg(long, allow_hyphen_values = true)]
    output_pressure: Option<f64>,
    /// The ionic medium: fresh, saline or auto.
    #[arg(long, default_value = "auto")]
    water: String,
    /// K1 and K2 of carbonic acid: lueker2000, millero2006, roy1993, dickson-millero1987.
    #[arg(long)]
    carbonic: Option<String>,
    /// Total boron from salinity: lee2010 or uppstrom1974.
    #[arg(long)]
    boron: Option<String>,
    /// KF of hydrogen fluoride: perez-fraga1987 or dickson-riley1979.
    #[arg(long)]
    fluoride: Option<String>,
    /// KS of bisulfate: dickson1990.
    #[arg(long)]
    bisulfate: Option<String>,
    /// Total phosphate, with a unit (umol/kg, "mg/L P", ...).
    #[arg(long, allow_hyphen_values = true)]
    phosphate: Option<String>,
    /// Total silicate, with a unit (umol/kg, "mg/L Si", ...).
    #[arg(long, allow_hyphen_values = true)]
    silicate: Option<String>,
    /// Total ammonia (NH3 + NH4+), with a unit (umol/kg, "mg/L N", ...).
    #[arg(long, allow_hyphen_values = true)]
    ammonia: Option<String>,
    /// Total sulfide, with a unit (umol/kg, "mg/L S", ...).
    #[arg(long, allow_hyphen_values = true)]
    sulfide: Option<String>,
    /// Calcium, with a unit (umol/kg, mmol/L, "mg/L Ca", "mg/L CaCO3" as calcium hardness).
    #[arg(long, allow_hyphen_values = true)]
    calcium: Option<String>,
    /// Measured total boron, with a unit (umol/kg, ...).
    #[arg(long, allow_hyphen_values = true)]
    boron_total: Option<String>,
    /// Which root where two waters fit (alkalinity with CO3, DIC with HCO3): natural, lower-ph, higher-ph.
    #[arg(long, default_value = "natural")]
    root: String,
    /// Print one flat JSON object instead of a table.
    #[arg(long)]
    json: bool,
}

/// An error tied to the flag that caused it.
struct FlagError {
    flag: String,
    error: String,
}

fn at_flag(flag: &str) -> impl Fn(Error) -> FlagError + '_ {
    move |e| FlagError {
        flag: flag.to_string(),
        error: e.to_string(),
    }
}

fn total(
    flag: &str,
    text: &Option<String>,
    mass: Option<(Unit, f64)>,
) -> Result<Option<Amount>, FlagError> {
    let Some(text) = text else { return Ok(None) };
    let field = match flag {
        "--phosphate" => "phosphate",
        "--silicate" => "silicate",
        "--ammonia" => "ammonia",
        "--sulfide" => "sulfide",
        "--calcium" => "calcium",
        _ => "boron_total",
    };
    let accepted = match mass {
        Some((unit, _)) => units_with(unit),
        None => travertine::units::MOLAR_UNITS.to_vec(),
    };
    let q = Quantity::parse(field, text, &accepted).map_err(at_flag(flag))?;
    let (unit, g) = mass.unwrap_or((Unit::UmolPerKg, 1.0));
    Amount::from_quantity(q, unit, g)
        .map(Some)
        .ok_or_else(|| FlagError {
            flag: flag.to_string(),
            error: format!("unit {} not accepted", q.unit.spelling()),
        })
}

fn run(a: &SolveArgs) -> Result<String, FlagError> {
    use travertine::units::*;
    let given: Vec<(Parameter, &String)> = [
        (Parameter::Alkalinity, &a.alkalinity),
        (Parameter::Dic, &a.dic),
        (Parameter::Ph, &a.ph),
        (Parameter::Pco2, &a.pco2),
        (Parameter::Fco2, &a.fco2),
        (Parameter::Xco2, &a.xco2),
        (Parameter::Co2, &a.co2),
        (Parameter::Hco3, &a.hco3),
        (Parameter::Co3, &a.co3),
    ]
    .into_iter()
    .filter_map(|(p, v)| v.as_ref().map(|v| (p, v)))
    .collect();
    let flags: Vec<String> = given
        .iter()
        .map(|(p, _)| format!("--{}", p.name()))
        .collect();
    if given.len() != 2 {
        return Err(FlagError {
            flag: if flags.is_empty() {
                "--alkalinity, --dic, --ph, ...".to_string()
            } else {
                flags.join(", ")
            },
            error: format!(
                "give exactly two measured parameters (of --alkalinity, --dic, --ph, --pco2, \
                 --fco2, --xco2, --co2, --hco3, --co3); {} given",
                given.len()
            ),
        });
    }
    let scale = a
        .ph_scale
        .as_deref()
        .map(str::parse::<PhScale>)
        .transpose()
        .map_err(at_flag("--ph-scale"))?;
    let mut measured = Vec::with_capacity(2);
    for (p, text) in &given {
        let flag = format!("--{}", p.name());
        let m = if *p == Parameter::Ph {
            let v: f64 = text.trim().parse().map_err(|_| FlagError {
                flag: flag.clone(),
                error: format!("`{text}` is not a number"),
            })?;
            Measured::ph(v, scale)
        } else {
            Measured::parse(*p, text)
        }
        .map_err(|e| FlagError {
            flag: flag.clone(),
            error: e.to_string(),
        })?;
        measured.push(m);
    }

    let salinity = a.salinity.unwrap_or(0.0);
    let conditions = Conditions::new(a.temperature, salinity)
        .map_err(|e| match e {
            Error::OutOfRange {
                field: "salinity", ..
            }
            | Error::NotFinite {
                field: "salinity", ..
            } => at_flag("--salinity")(e),
            e => at_flag("--temperature")(e),
        })?
        .with_pressure_dbar(a.pressure)
        .map_err(at_flag("--pressure"))?
        .with_air_pressure_atm(a.air_pressure)
        .map_err(at_flag("--air-pressure"))?;

    let mut fits = Fits::default();
    if let Some(c) = &a.carbonic {
        fits = fits.with_carbonic(c.parse::<CarbonicFit>().map_err(at_flag("--carbonic"))?);
    }
    if let Some(b) = &a.boron {
        fits = fits.with_boron_total(b.parse::<BoronTotalFit>().map_err(at_flag("--boron"))?);
    }
    if let Some(f) = &a.fluoride {
        fits = fits.with_fluoride(f.parse::<FluorideFit>().map_err(at_flag("--fluoride"))?);
    }
    if let Some(b) = &a.bisulfate {
        b.parse::<BisulfateFit>().map_err(at_flag("--bisulfate"))?;
    }

    let mut comp = Composition::default();
    let set = |r: Result<Composition, Error>, flag: &str| r.map_err(at_flag(flag));
    if let Some(v) = total("--phosphate", &a.phosphate, Some((Unit::MgPerLP, P_G_MOL)))? {
        comp = set(comp.with_phosphate(v), "--phosphate")?;
    }
    if let Some(v) = total("--silicate", &a.silicate, Some((Unit::MgPerLSi, SI_G_MOL)))? {
        comp = set(comp.with_silicate(v), "--silicate")?;
    }
    if let Some(v) = total("--ammonia", &a.ammonia, Some((Unit::MgPerLN, N_G_MOL)))? {
        comp = set(comp.with_ammonia(v), "--ammonia")?;
    }
    if let Some(v) = total("--sulfide", &a.sulfide, Some((Unit::MgPerLS, S_G_MOL)))? {
        comp = set(comp.with_sulfide(v), "--sulfide")?;
    }
    if let Some(v) = total("--calcium", &a.calcium, Some((Unit::MgPerLCa, CA_G_MOL)))? {
        comp = set(comp.with_calcium(v), "--calcium")?;
    }
    if let Some(v) = total("--boron-total", &a.boron_total, None)? {
        comp = set(comp.with_boron(v), "--boron-total")?;
    }

    let water = match a.water.as_str() {
        "saline" | "auto" => Water::saline(conditions).map_err(at_flag("--temperature"))?,
        other => {
            return Err(FlagError {
                flag: "--water".to_string(),
                error: format!("unknown or unavailable medium `{other}`; accepted: saline, auto"),
            })
        }
    }
    .with_fits(fits)
    .with_composition(comp);

    let root: RootChoice = a.root.parse().map_err(at_flag("--root"))?;
    let options = SolveOptions::default().with_root(root);
    let state = water
        .solve_with(measured[0], measured[1], &options)
        .map_err(|e| FlagError {
            flag: flags.join(", "),
            error: e.to_string(),
        })?;

    let reported = if a.output_temperature.is_some() || a.output_pressure.is_some() {
        let mut c = *water.conditions();
        if let Some(t) = a.output_temperature {
            c = c
                .with_temperature_c(t)
                .map_err(at_flag("--output-temperature"))?;
        }
        if let Some(p) = a.output_pressure {
            c = c
                .with_pressure_dbar(p)
                .map_err(at_flag("--output-pressure"))?;
        }
        Some(state.at(c).map_err(at_flag("--output-temperature"))?)
    } else {
        None
    };
    Ok(render(&state, reported.as_ref(), a.json))
}

fn render(measured: &State, reported: Option<&State>, json: bool) -> String {
    match (json, reported) {
        (true, None) => travertine::report::json(measured, None),
        (true, Some(r)) => travertine::report::json(r, Some(measured)),
        (false, None) => travertine::report::table(measured, None),
        (false, Some(r)) => travertine::report::table(r, Some(measured)),
    }
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    match cli.command {
        Command::Solve(args) => match run(&args) {
            Ok(text) => {
                println!("{}", text.trim_end());
                ExitCode::SUCCESS
            }
            Err(e) => {
                eprintln!("travertine: {}: {}", e.flag, e.error);
                ExitCode::from(2)
            }
        },
    }
}
