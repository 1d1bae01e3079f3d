//! The `travertine` command: parses arguments, calls the library, prints.

use clap::{Args, Parser, Subcommand};
use std::process::ExitCode;
use travertine::base::units::{Quantity, Unit};
use travertine::fits::{BisulfateFit, BoronTotalFit, CarbonicFit, FluorideFit};
use travertine::properties::activity::ActivityModel;
use travertine::sample::trade::{Conductivity, MediumChoice, Sample};
use travertine::sheet::{Format, Progress, SheetError, SheetOptions, Sink, Source, UnitSystem};
use travertine::{Error, Measured, Parameter, PhScale, RootChoice, SolveOptions, State};

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
    Solve(Box<SolveArgs>),
    /// Solve every row of a CSV field sheet; results in input order with status and message.
    Sheet(Box<SheetArgs>),
}

#[derive(Args)]
struct SheetArgs {
    /// The sheet to read (CSV with a header row); `-` for standard input.
    input: String,
    /// Where to write the results (replaced atomically when complete); `-` or
    /// nothing for standard output. Never the input file.
    #[arg(short, long)]
    output: Option<String>,
    /// Read a column by hand: NAME=HEADER, such as alkalinity_mg_l_caco3=Alk;
    /// `ignore=HEADER` passes a column through unread. Repeatable.
    #[arg(long, value_name = "NAME=HEADER")]
    map: Vec<String>,
    /// One value for every row where the sheet has no column: NAME=VALUE, such as
    /// temperature_c=25, salinity=0.3, calcium_mg_l=40, water=fresh. Repeatable.
    #[arg(long, value_name = "NAME=VALUE", allow_hyphen_values = true)]
    set: Vec<String>,
    /// Force the pair of every row, such as alkalinity,ph (default: the best two
    /// present in each row; the others get *_residual columns).
    #[arg(long, value_name = "A,B")]
    pair: Option<String>,
    /// Computed columns, comma-separated: names such as ph_total, pco2_uatm; `default`
    /// for the default set, `all` for every one.
    #[arg(long, value_name = "LIST")]
    columns: Option<String>,
    /// Output format: csv or jsonl.
    #[arg(long, default_value = "csv")]
    format: String,
    /// Units of the default columns and residuals: trade (mg/L, µatm, NBS pH) or
    /// ocean (µmol/kg, µatm, total-scale pH).
    #[arg(long, default_value = "trade")]
    units: String,
    /// Field delimiter of input and output: one character, or `tab`.
    #[arg(long, default_value = ",")]
    delimiter: String,
    /// Numbers use a decimal comma (7,9), in the input and the output.
    #[arg(long)]
    decimal_comma: bool,
    /// The ionic medium of every row: fresh, saline or auto (default auto, or a `water` column); same as --set water=VALUE.
    #[arg(long)]
    water: Option<String>,
    /// Scale of a pH column whose header names none: total, seawater, free or nbs; same as --set ph_scale=VALUE.
    #[arg(long)]
    ph_scale: Option<String>,
    /// K1 and K2 of carbonic acid for every row (saline): lueker2000, millero2006, roy1993,
    /// dickson-millero1987; same as --set carbonic_fit=VALUE.
    #[arg(long)]
    carbonic: Option<String>,
    /// Total boron from salinity for every row (saline): lee2010 or uppstrom1974; same as --set boron_fit=VALUE.
    #[arg(long)]
    boron: Option<String>,
    /// KF of hydrogen fluoride for every row (saline): perez-fraga1987 or dickson-riley1979; same as --set fluoride_fit=VALUE.
    #[arg(long)]
    fluoride: Option<String>,
    /// Activity coefficients for every row (fresh): davies or extended-debye-huckel; same as --set activity=VALUE.
    #[arg(long)]
    activity: Option<String>,
    /// Which root where two waters fit: natural, lower-ph, higher-ph.
    #[arg(long, default_value = "natural")]
    root: String,
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
    /// Practical salinity (default: from --conductivity, else 0).
    #[arg(long, allow_hyphen_values = true)]
    salinity: Option<f64>,
    /// Conductivity with a unit: uS/cm or mS/cm at the sample temperature, or
    /// "uS/cm@25C" for specific conductance.
    #[arg(long, allow_hyphen_values = true)]
    conductivity: Option<String>,
    /// Total dissolved solids, with a unit: mg/L (fresh water, for the ionic strength).
    #[arg(long, allow_hyphen_values = true)]
    tds: Option<String>,
    /// Ionic strength, mol/kg (fresh water).
    #[arg(long, allow_hyphen_values = true)]
    ionic_strength: Option<f64>,
    /// Activity coefficients in fresh water: davies or extended-debye-huckel.
    #[arg(long)]
    activity: Option<String>,
    /// Total hardness with a unit ("mg/L CaCO3", mmol/L); never taken as calcium
    /// unless --calcium-fraction is given.
    #[arg(long, allow_hyphen_values = true)]
    hardness: Option<String>,
    /// Fraction of --hardness that is calcium, 0 to 1 (the rest is magnesium).
    #[arg(long, allow_hyphen_values = true)]
    calcium_fraction: Option<f64>,
    /// Magnesium with a unit ("mg/L Mg", "mg/L CaCO3", mmol/L).
    #[arg(long, allow_hyphen_values = true)]
    magnesium: Option<String>,
    /// Sodium with a unit ("mg/L Na", mmol/L).
    #[arg(long, allow_hyphen_values = true)]
    sodium: Option<String>,
    /// Potassium with a unit ("mg/L K", mmol/L).
    #[arg(long, allow_hyphen_values = true)]
    potassium: Option<String>,
    /// Chloride with a unit ("mg/L Cl", mmol/L).
    #[arg(long, allow_hyphen_values = true)]
    chloride: Option<String>,
    /// Sulfate with a unit ("mg/L SO4", mmol/L).
    #[arg(long, allow_hyphen_values = true)]
    sulfate: Option<String>,
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
    /// Calcium, with a unit (umol/kg, mmol/L, "mg/L Ca", or "mg/L CaCO3" as calcium hardness).
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

/// The command-line flag of a library field.
fn flag_of(field: &str) -> String {
    match field {
        "temperature_c" => "--temperature".into(),
        "pressure_dbar" => "--pressure".into(),
        "air_pressure_atm" => "--air-pressure".into(),
        "specific_conductance" => "--conductivity".into(),
        "ph_scale" => "--ph-scale".into(),
        f => format!("--{}", f.replace('_', "-")),
    }
}

fn flagged(e: Error) -> FlagError {
    FlagError {
        flag: e.field().map(flag_of).unwrap_or_else(|| "input".into()),
        error: e.to_string(),
    }
}

fn at_flag(flag: &str) -> impl Fn(Error) -> FlagError + '_ {
    move |e| FlagError {
        flag: flag.to_string(),
        error: e.to_string(),
    }
}

fn quantity(field: &'static str, text: &Option<String>) -> Result<Option<Quantity>, FlagError> {
    text.as_deref()
        .map(|t| Quantity::parse(field, t, &Sample::units_for(field)))
        .transpose()
        .map_err(flagged)
}

fn parse_opt<T: std::str::FromStr<Err = Error>>(
    flag: &str,
    text: &Option<String>,
) -> Result<Option<T>, FlagError> {
    text.as_deref()
        .map(str::parse::<T>)
        .transpose()
        .map_err(at_flag(flag))
}

fn sample(a: &SolveArgs) -> Result<Sample, FlagError> {
    let mut s = Sample::new(a.temperature);
    s.salinity = a.salinity;
    s.pressure_dbar = a.pressure;
    s.air_pressure_atm = Some(a.air_pressure);
    s.medium = a
        .water
        .parse::<MediumChoice>()
        .map_err(at_flag("--water"))?;
    s.conductivity = a
        .conductivity
        .as_deref()
        .map(Conductivity::parse)
        .transpose()
        .map_err(at_flag("--conductivity"))?;
    s.carbonic = parse_opt::<CarbonicFit>("--carbonic", &a.carbonic)?;
    s.boron = parse_opt::<BoronTotalFit>("--boron", &a.boron)?;
    s.fluoride_fit = parse_opt::<FluorideFit>("--fluoride", &a.fluoride)?;
    parse_opt::<BisulfateFit>("--bisulfate", &a.bisulfate)?;
    s.activity = parse_opt::<ActivityModel>("--activity", &a.activity)?;
    s.phosphate = quantity("phosphate", &a.phosphate)?;
    s.silicate = quantity("silicate", &a.silicate)?;
    s.ammonia = quantity("ammonia", &a.ammonia)?;
    s.sulfide = quantity("sulfide", &a.sulfide)?;
    s.calcium = quantity("calcium", &a.calcium)?;
    s.hardness = quantity("hardness", &a.hardness)?;
    s.calcium_fraction = a.calcium_fraction;
    s.magnesium = quantity("magnesium", &a.magnesium)?;
    s.sodium = quantity("sodium", &a.sodium)?;
    s.potassium = quantity("potassium", &a.potassium)?;
    s.chloride = quantity("chloride", &a.chloride)?;
    s.sulfate = quantity("sulfate", &a.sulfate)?;
    s.boron_total = quantity("boron_total", &a.boron_total)?;
    s.tds_mg_l = a
        .tds
        .as_deref()
        .map(|t| Quantity::parse("tds", t, &[Unit::MgPerL]).map(|q| q.value))
        .transpose()
        .map_err(flagged)?;
    s.ionic_strength = a.ionic_strength;
    Ok(s)
}

fn run(a: &SolveArgs) -> Result<String, FlagError> {
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
    let scale = parse_opt::<PhScale>("--ph-scale", &a.ph_scale)?;
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
        .map_err(at_flag(&flag))?;
        measured.push(m);
    }

    let water = sample(a)?.water().map_err(flagged)?;
    let root: RootChoice = a.root.parse().map_err(at_flag("--root"))?;
    // One sample: the precipitation potential's cost does not matter.
    let options = SolveOptions::default()
        .with_root(root)
        .with_precipitation_potential(true);
    let state = water
        .solve_with(measured[0], measured[1], &options)
        .map_err(at_flag(&flags.join(", ")))?;

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
        Some(
            state
                .at_with(c, &options)
                .map_err(at_flag("--output-temperature"))?,
        )
    } else {
        None
    };
    Ok(render(&state, reported.as_ref(), a.json))
}

fn render(measured: &State, reported: Option<&State>, json: bool) -> String {
    match (json, reported) {
        (true, None) => travertine::output::json(measured, None),
        (true, Some(r)) => travertine::output::json(r, Some(measured)),
        (false, None) => travertine::output::table(measured, None),
        (false, Some(r)) => travertine::output::table(r, Some(measured)),
    }
}

/// The library settings of `travertine sheet`.
fn sheet_options(a: &SheetArgs) -> Result<SheetOptions, SheetError> {
    let mut o = SheetOptions::default()
        .with_format(a.format.parse::<Format>()?)
        .with_units(a.units.parse::<UnitSystem>()?)
        .with_delimiter(&a.delimiter)?
        .with_decimal_comma(a.decimal_comma)
        .with_progress(Progress::Auto)
        .with_root(a.root.parse().map_err(|e: Error| SheetError::BadOption {
            option: "--root",
            message: e.to_string(),
        })?);
    for m in &a.map {
        o = o.with_map(m)?;
    }
    for s in &a.set {
        o = o.with_set(s)?;
    }
    let choices = [
        ("water", &a.water),
        ("ph_scale", &a.ph_scale),
        ("carbonic_fit", &a.carbonic),
        ("boron_fit", &a.boron),
        ("fluoride_fit", &a.fluoride),
        ("activity", &a.activity),
    ];
    for (name, value) in choices {
        if let Some(v) = value {
            o = o.with_set(&format!("{name}={v}"))?;
        }
    }
    if let Some(p) = &a.pair {
        o = o.with_pair(p)?;
    }
    if let Some(c) = &a.columns {
        o = o.with_columns(c)?;
    }
    Ok(o)
}

fn sheet(a: &SheetArgs) -> ExitCode {
    let result = sheet_options(a).and_then(|o| {
        travertine::sheet::run(
            &o,
            &Source::from_arg(&a.input),
            &Sink::from_arg(a.output.as_deref()),
        )
    });
    match result {
        Ok(summary) => {
            eprint!("{summary}");
            ExitCode::SUCCESS
        }
        Err(e) if e.is_broken_pipe() => ExitCode::SUCCESS,
        Err(e) => {
            eprintln!("travertine sheet: {e}");
            ExitCode::from(e.exit_code())
        }
    }
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    match cli.command {
        Command::Sheet(args) => sheet(&args),
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
