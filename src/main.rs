//! The `travertine` command: parses arguments, calls the library, prints.

use clap::{Arg, ArgMatches, Args, FromArgMatches, Parser, Subcommand};
use std::process::ExitCode;
use std::sync::atomic::{AtomicBool, Ordering};
use travertine::decisions::Profile;
use travertine::output::Precision;
use travertine::sample::inputs::{Input, InputSpec, INPUTS};
use travertine::sample::Sample;
use travertine::sheet::{Format, Progress, SheetError, SheetOptions, Sink, Source, UnitSystem};
use travertine::{Error, RootChoice, SolveOptions, State};

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
    /// How much of a chemical takes a water to a target (alkalinity, pH, free CO2, Ω, calcium
    /// hardness), with the water after treatment and the cautions.
    Dose(Box<DoseArgs>),
    /// What a mix of two waters becomes: two saved `solve --json` results mixed by mass or
    /// volume, solved again at the mix's own conditions.
    Blend(Box<BlendArgs>),
    /// Draw a chart as SVG (and PNG with --png): the species of one sample against pH, a
    /// depth profile, or the overview of a field sheet over time.
    Chart(Box<ChartArgs>),
}

// issue 14: charts
#[derive(Args)]
struct ChartArgs {
    #[command(subcommand)]
    kind: ChartKind,
}

#[derive(Subcommand)]
enum ChartKind {
    /// Fractions of CO2*, HCO3- and CO3-- against pH at one sample's conditions, with its pH
    /// marked and pK1, pK2 labelled; the sample takes the flags of `solve`.
    Speciation(Box<SpeciationChartArgs>),
    /// pCO2, pH and calcite saturation against depth (downward), from a sheet with a depth
    /// column; one line per station.
    Depth(Box<SheetChartArgs>),
    /// pCO2, pH, free CO2 and calcite SI (aragonite Ω in saline water) against date and
    /// time, one line per site, with the limits of the quality-flag profile as bands.
    Overview(Box<SheetChartArgs>),
}

/// Where a chart goes.
#[derive(Args)]
struct ChartOutput {
    /// The SVG file to write.
    #[arg(short, long, value_name = "FILE.svg")]
    output: String,
    /// Also write a PNG beside the SVG (same name, .png).
    #[arg(long)]
    png: bool,
    /// Size of the PNG against the SVG, 1 to 4.
    #[arg(long, default_value = "2", value_name = "FACTOR")]
    png_scale: f32,
}

#[derive(Args)]
struct SpeciationChartArgs {
    /// The sample, with the same flags as `solve`.
    #[command(flatten)]
    inputs: SampleArgs,
    /// Other acid systems to draw, comma-separated: borate, ammonia, phosphate.
    #[arg(long, value_name = "LIST", default_value = "")]
    include: String,
    /// The pH axis, LOW,HIGH (default 3,12; widened to take in the sample's pH).
    #[arg(long, value_name = "LOW,HIGH")]
    ph_range: Option<String>,
    /// Which root where two waters fit: natural, lower-ph, higher-ph.
    #[arg(long, default_value = "natural")]
    root: String,
    #[command(flatten)]
    out: ChartOutput,
}

#[derive(Args)]
struct SheetChartArgs {
    /// The sheet to read (CSV with a header row); `-` for standard input.
    input: String,
    /// Read a column by hand: NAME=HEADER, as `travertine sheet --map`. Repeatable.
    #[arg(long, value_name = "NAME=HEADER")]
    map: Vec<String>,
    /// One value for every row where the sheet has no column: NAME=VALUE, as
    /// `travertine sheet --set`. Repeatable.
    #[arg(long, value_name = "NAME=VALUE", allow_hyphen_values = true)]
    set: Vec<String>,
    /// The quality-flag profile whose limits are drawn: a built-in name (general, the
    /// default; cold-water-fish; shellfish-hatchery) or a TOML file.
    #[arg(long, value_name = "NAME|FILE")]
    profile: Option<String>,
    /// The column naming the site or station (default: a header such as Site, Pond, Station).
    #[arg(long, value_name = "HEADER")]
    site_column: Option<String>,
    /// The column of dates (default: a header such as Date).
    #[arg(long, value_name = "HEADER")]
    date_column: Option<String>,
    /// The column of times of day (default: a header such as Time).
    #[arg(long, value_name = "HEADER")]
    time_column: Option<String>,
    /// The column of depths, read in metres unless its header names a unit (default: a
    /// header such as `Depth (m)`).
    #[arg(long, value_name = "HEADER")]
    depth_column: Option<String>,
    #[command(flatten)]
    out: ChartOutput,
}

#[derive(Args)]
struct BlendArgs {
    /// The first water: a saved `solve --json` result (`-` for standard input).
    first: String,
    /// The second water: a saved `solve --json` result.
    second: String,
    /// The share of the first water in the mix, 0 to 1.
    #[arg(long, value_name = "FRACTION")]
    fraction_first: f64,
    /// Whether the share is by `mass` or by `volume` (each water at its own density).
    #[arg(long, default_value = "mass", value_parser = ["mass", "volume"])]
    by: String,
    /// Quality-flag profile: a built-in name or a TOML file.
    #[arg(long, value_name = "NAME|FILE")]
    profile: Option<String>,
    /// JSON or a table, and its digits.
    #[command(flatten)]
    shown: Shown,
}

#[derive(Args)]
struct DoseArgs {
    /// The water, with the same flags as `solve`, and the volume treated.
    #[command(flatten)]
    inputs: DoseSampleArgs,
    /// The chemical added (or aeration, which removes CO2).
    #[arg(long, value_name = "NAME", value_parser = chemical_names())]
    chemical: String,
    /// What to reach, NAME=VALUE: alkalinity=50 mg/L CaCO3, ph=7.5 (on the scale of the
    /// input pH), free_co2=10 (mg/L), omega_aragonite=1.5, omega_calcite=1,
    /// calcium_hardness=40 mg/L CaCO3.
    #[arg(long, value_name = "NAME=VALUE")]
    target: String,
    /// Purity of the product, % (default: a usual grade of each chemical; check the label).
    #[arg(long, value_name = "PERCENT")]
    purity: Option<f64>,
    /// Fraction of the product that dissolves and reacts, 0 to 1 (default 1; agricultural
    /// limestone often dissolves only in part).
    #[arg(long, value_name = "FRACTION")]
    dissolved_fraction: Option<f64>,
    /// Which root where two waters fit: natural, lower-ph, higher-ph.
    #[arg(long, default_value = "natural")]
    root: String,
    /// JSON or a table, and its digits.
    #[command(flatten)]
    shown: Shown,
    /// The uncertainty of the dose (issue 13).
    #[command(flatten)]
    uncertainty: DoseUncertaintyArgs,
}

/// How a result is shown: the flags of every command that prints one.
#[derive(Args)]
struct Shown {
    /// Print one JSON object instead of a table.
    #[arg(long)]
    json: bool,
    /// Digits of the table: `sensible` rounds each figure to what its
    /// measurement supports (pH 3 decimals, µmol/kg and µatm 4 significant
    /// figures, mg/L 3); `full` gives every digit, to read back exactly. The
    /// JSON always has every digit.
    #[arg(long, default_value = "sensible", value_name = "sensible|full")]
    digits: String,
}

impl Shown {
    fn precision(&self) -> Result<Precision, FlagError> {
        self.digits.parse().map_err(at_flag("--digits"))
    }
}

/// The names `--chemical` takes, from the library's list.
fn chemical_names() -> clap::builder::PossibleValuesParser {
    clap::builder::PossibleValuesParser::new(
        travertine::decisions::dose::Chemical::ALL
            .iter()
            .map(|c| clap::builder::PossibleValue::new(c.name()).help(c.what())),
    )
}

#[derive(Args)]
struct SheetArgs {
    /// The sheet to read (CSV with a header row); `-` for standard input.
    #[arg(required_unless_present = "list_columns")]
    input: Option<String>,
    /// Print every input a sheet can give (its canonical column, the header
    /// spellings and the units read) and stop.
    #[arg(long)]
    list_columns: bool,
    /// Where to write the results (replaced atomically when complete, keeping
    /// its permissions; a link is followed, a pipe or device written into); `-`
    /// or nothing for standard output. Never the input file.
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
    /// for the default set, `all` for every one; `flags` for the column of quality
    /// flags, which `default` and `all` include.
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
    /// One choice for every row (medium, pH scale, fits), one flag per
    /// choice in the library's list of inputs.
    #[command(flatten)]
    choices: EveryRow,
    /// Which root where two waters fit: natural, lower-ph, higher-ph.
    #[arg(long, default_value = "natural")]
    root: String,
    /// Digits of the computed CSV columns: `sensible` rounds each to what its
    /// measurement supports (pH 3 decimals, µmol/kg and µatm 4 significant
    /// figures, mg/L 3); `full` gives every digit, to read back exactly. Input
    /// columns are written as typed; JSON lines always have every digit.
    #[arg(long, default_value = "sensible", value_name = "sensible|full")]
    digits: String,
    /// The limits of the `flags` column: a built-in profile (general, the
    /// default; cold-water-fish; shellfish-hatchery) or a TOML file.
    #[arg(long, value_name = "NAME|FILE")]
    profile: Option<String>,
    /// A dose for every row: the chemical (with --target), as `travertine dose` takes it.
    /// Adds dose_g_m3, and dose_total_kg and dose_total_lb where the row has its volume
    /// (volume_m3, or area_m2 with mean_depth_m).
    #[arg(long, value_name = "NAME", value_parser = chemical_names(), requires = "target")]
    dose_chemical: Option<String>,
    /// What the dose of every row aims at, NAME=VALUE, as `travertine dose --target`.
    #[arg(long, value_name = "NAME=VALUE", requires = "dose_chemical")]
    target: Option<String>,
    /// Purity of the dosed product, % (with --dose-chemical).
    #[arg(long, value_name = "PERCENT", requires = "dose_chemical")]
    purity: Option<f64>,
    /// Fraction of the dosed product that dissolves, 0 to 1 (with --dose-chemical).
    #[arg(long, value_name = "FRACTION", requires = "dose_chemical")]
    dissolved_fraction: Option<f64>,
    /// Standard uncertainty of an input or a constant for every row, NAME=VALUE, as `solve
    /// --uncertainty`; repeatable. A row's `<column>_u` cell replaces it. With any uncertainty
    /// asked for (this, a `_u` input column, --no-constant-uncertainty), every numeric computed
    /// column gets a `<column>_u` column.
    #[arg(
        long = "uncertainty",
        value_name = "NAME=VALUE",
        allow_hyphen_values = true
    )]
    uncertainty: Vec<String>,
    /// No uncertainty in any constant, for every row.
    #[arg(long)]
    no_constant_uncertainty: bool,
}

#[derive(Args)]
struct SolveArgs {
    /// The inputs of the sample, one flag per row of the library's list of
    /// inputs (`travertine::sample::inputs::INPUTS`).
    #[command(flatten)]
    inputs: SampleArgs,
    /// Give the answers at this temperature (°C), keeping alkalinity, DIC and
    /// totals; the state as measured follows in a short block.
    #[arg(long, allow_hyphen_values = true)]
    at_temperature: Option<f64>,
    /// Give the answers at this gauge pressure (dbar), keeping alkalinity, DIC
    /// and totals; the state as measured follows in a short block.
    #[arg(long, allow_hyphen_values = true)]
    at_pressure: Option<f64>,
    /// Which root where two waters fit (alkalinity with CO3, DIC with HCO3): natural, lower-ph, higher-ph.
    #[arg(long, default_value = "natural")]
    root: String,
    /// JSON or a table, and its digits.
    #[command(flatten)]
    shown: Shown,
    /// The limits of the quality flags: a built-in profile (general, the
    /// default; cold-water-fish; shellfish-hatchery) or a TOML file.
    #[arg(long, value_name = "NAME|FILE")]
    profile: Option<String>,
    /// The standard uncertainties asked for (issue 13).
    #[command(flatten)]
    uncertainty: UncertaintyArgs,
}

/// The flags of the standard uncertainties (`solve` and `dose`).
#[derive(Args)]
struct UncertaintyArgs {
    /// Standard uncertainty of an input or a constant (help generated by `uncertainty_help`).
    #[arg(
        long = "uncertainty",
        help = uncertainty_help(),
        value_name = "NAME=VALUE",
        allow_hyphen_values = true
    )]
    settings: Vec<String>,
    /// No uncertainty in any constant (their defaults off); only the inputs' count.
    #[arg(long)]
    no_constant_uncertainty: bool,
    /// Check the linear propagation with N Monte Carlo draws (2 to 1000000; each a full
    /// solve): `<key>_u_mc` beside `<key>_u`.
    #[arg(long, value_name = "N")]
    monte_carlo: Option<usize>,
    /// Seed of the Monte Carlo draws (default 1; the same seed gives the same numbers).
    #[arg(long, value_name = "S", requires = "monte_carlo")]
    seed: Option<u64>,
    /// Each source's share of the variance of every output (a `budget` object in the JSON).
    #[arg(long)]
    budget: bool,
}

impl UncertaintyArgs {
    /// Whether any uncertainty was asked for.
    fn asked(&self) -> bool {
        !self.settings.is_empty()
            || self.no_constant_uncertainty
            || self.monte_carlo.is_some()
            || self.budget
    }

    /// The report of the uncertainties asked for, of the pair solved in
    /// `solved` with `options`.
    fn report(
        &self,
        solved: &Solved,
        options: SolveOptions,
    ) -> Result<travertine::output::uncertainty_report::Report, FlagError> {
        use travertine::decisions::uncertainty::Problem;
        use travertine::decisions::uncertainty_settings::per_litre_inputs;
        let (a, b) = solved.pair;
        let u = uncertainties(&self.settings, self.no_constant_uncertainty, solved)?;
        let problem = Problem::new(&solved.water, a, b)
            .map(|p| {
                p.with_options(options)
                    .with_air(solved.air, solved.sample.ph_scale_given())
            })
            .map_err(at_flag(&solved.pair_flags))?;
        let mc = self.monte_carlo.map(|n| {
            (
                n,
                self.seed
                    .unwrap_or(travertine::output::uncertainty_report::DEFAULT_SEED),
            )
        });
        travertine::output::uncertainty_report::Report::stated(
            &problem,
            &u,
            mc,
            &per_litre_inputs(&a, &b),
        )
        .map_err(|e| match e {
            Error::OutOfRange { .. } if mc.is_some() => at_flag("--monte-carlo")(e),
            other => at_flag("--uncertainty")(other),
        })
    }
}

/// The help of `solve --uncertainty`: the names it takes, from the
/// library's lists of inputs and constants.
fn uncertainty_help() -> String {
    format!(
        "Standard uncertainty of an input or a constant, NAME=VALUE; repeatable. NAME: {}; an \
         input may also be named by its sheet column. VALUE: in one of the input's units \
         (ph=0.01, alkalinity=2umol/kg, temperature=0.1 for °C; pK units for a constant) or \
         relative (dic=0.5%). The constants take published defaults unless set, and the output \
         lists every source used",
        travertine::decisions::uncertainty_settings::accepted_names().join(", ")
    )
}

/// The uncertainties of `--uncertainty` settings (and
/// `--no-constant-uncertainty`) for the pair of `solved`.
fn uncertainties(
    settings: &[String],
    no_constants: bool,
    solved: &Solved,
) -> Result<travertine::decisions::uncertainty::Uncertainties, FlagError> {
    use travertine::decisions::uncertainty::Uncertainties;
    use travertine::decisions::uncertainty_settings::{with_settings, Setting};
    let bad = |e: travertine::decisions::uncertainty_settings::SettingError| FlagError {
        flag: "--uncertainty".into(),
        error: e.to_string(),
    };
    let settings = settings
        .iter()
        .map(|t| t.parse::<Setting>())
        .collect::<Result<Vec<_>, _>>()
        .map_err(bad)?;
    let (a, b) = solved.pair;
    let mut base = Uncertainties::new();
    if no_constants {
        base = base.without_constants();
    }
    with_settings(base, &settings, &a, &b, solved.state.density_kg_m3).map_err(bad)
}

/// The uncertainty flags of `dose`.
#[derive(Args)]
struct DoseUncertaintyArgs {
    /// Standard uncertainty of an input or a constant, NAME=VALUE, as `solve --uncertainty`;
    /// repeatable. Gives the uncertainty of the dose (dose_g_m3_u, ...), each perturbed dose a
    /// full dose solve.
    #[arg(
        long = "uncertainty",
        value_name = "NAME=VALUE",
        allow_hyphen_values = true
    )]
    settings: Vec<String>,
    /// No uncertainty in any constant (their defaults off).
    #[arg(long)]
    no_constant_uncertainty: bool,
}

/// An error tied to the flag that caused it.
struct FlagError {
    flag: String,
    error: String,
}

/// The command-line flag of an input.
fn flag(input: Input) -> String {
    format!("--{}", input.flag())
}

fn flagged(e: Error) -> FlagError {
    FlagError {
        flag: e
            .field()
            .and_then(Input::from_field)
            .map_or_else(|| "input".into(), flag),
        error: e.to_string(),
    }
}

fn at_flag(flag: &str) -> impl Fn(Error) -> FlagError + '_ {
    move |e| FlagError {
        flag: flag.to_string(),
        error: e.to_string(),
    }
}

/// Which rows of the library's list of inputs a group of flags offers, and
/// how each flag reads.
trait InputFlags: Sized {
    /// Whether the group has a flag for this input.
    fn offers(input: Input) -> bool;
    /// The flag of one row of the list.
    fn arg(spec: &'static InputSpec) -> Arg;
    /// The group from the inputs given.
    fn from_given(given: Vec<(Input, String)>) -> Self;
}

/// The inputs given in `m` of the group `F`, in the order of the list.
fn given_inputs<F: InputFlags>(m: &ArgMatches) -> F {
    F::from_given(
        INPUTS
            .iter()
            .filter(|spec| F::offers(spec.input))
            .filter_map(|spec| {
                m.get_one::<String>(spec.flag)
                    .map(|v| (spec.input, v.clone()))
            })
            .collect(),
    )
}

/// `cmd` with a flag for every input of the group `F`.
fn input_flags<F: InputFlags>(cmd: clap::Command) -> clap::Command {
    INPUTS
        .iter()
        .filter(|spec| F::offers(spec.input))
        .fold(cmd, |cmd, spec| cmd.arg(F::arg(spec)))
}

/// Implements clap's traits for a group of input flags.
macro_rules! input_flag_group {
    ($ty:ty) => {
        impl FromArgMatches for $ty {
            fn from_arg_matches(m: &ArgMatches) -> Result<Self, clap::Error> {
                Ok(given_inputs::<$ty>(m))
            }

            fn update_from_arg_matches(&mut self, m: &ArgMatches) -> Result<(), clap::Error> {
                *self = given_inputs::<$ty>(m);
                Ok(())
            }
        }

        impl Args for $ty {
            fn augment_args(cmd: clap::Command) -> clap::Command {
                input_flags::<$ty>(cmd)
            }

            fn augment_args_for_update(cmd: clap::Command) -> clap::Command {
                input_flags::<$ty>(cmd)
            }
        }
    };
}

/// The flags of the inputs of a sample: one per row of the library's list.
struct SampleArgs {
    /// Each input given, with its text, in the order of the list.
    given: Vec<(Input, String)>,
}

impl InputFlags for SampleArgs {
    fn offers(input: Input) -> bool {
        !input.is_for_dose()
    }

    fn arg(spec: &'static InputSpec) -> Arg {
        Arg::new(spec.flag)
            .long(spec.flag)
            .value_name(if spec.input.is_choice() {
                "NAME"
            } else {
                "VALUE"
            })
            .help(spec.help)
            .allow_hyphen_values(true)
            .required(spec.input == Input::Temperature)
    }

    fn from_given(given: Vec<(Input, String)>) -> Self {
        Self { given }
    }
}

input_flag_group!(SampleArgs);

/// The flags of `dose`: those of a sample, and the volume treated.
struct DoseSampleArgs {
    /// Each input given, with its text, in the order of the list.
    given: Vec<(Input, String)>,
}

impl InputFlags for DoseSampleArgs {
    fn offers(_: Input) -> bool {
        true
    }

    fn arg(spec: &'static InputSpec) -> Arg {
        SampleArgs::arg(spec)
    }

    fn from_given(given: Vec<(Input, String)>) -> Self {
        Self { given }
    }
}

input_flag_group!(DoseSampleArgs);

/// The choices a sheet can take for every row: one flag per choice in the
/// library's list of inputs, each the same as `--set COLUMN=VALUE`.
struct EveryRow {
    given: Vec<(Input, String)>,
}

impl InputFlags for EveryRow {
    fn offers(input: Input) -> bool {
        input.is_choice()
    }

    fn arg(spec: &'static InputSpec) -> Arg {
        Arg::new(spec.flag)
            .long(spec.flag)
            .value_name("NAME")
            .help(format!(
                "{}; for every row, the same as --set {}=VALUE",
                spec.help, spec.column
            ))
    }

    fn from_given(given: Vec<(Input, String)>) -> Self {
        Self { given }
    }
}

input_flag_group!(EveryRow);

/// A sample solved from its flags: the sample, its water, the pair's flags
/// (for messages) and the state.
struct Solved {
    sample: Sample,
    water: travertine::Water,
    pair_flags: String,
    state: State,
    air: travertine::sample::Air,
    /// The pair measured.
    pair: (travertine::Measured, travertine::Measured),
}

fn solve_sample(
    given: &[(Input, String)],
    root: &str,
    options: SolveOptions,
) -> Result<Solved, FlagError> {
    let mut sample = Sample::default();
    for (input, text) in given {
        sample.set(*input, text).map_err(at_flag(&flag(*input)))?;
    }
    let carbon: Vec<String> = given
        .iter()
        .filter(|(i, _)| matches!(i, Input::Carbon(_)))
        .map(|(i, _)| flag(*i))
        .collect();
    let pair_flags = if carbon.is_empty() {
        "--alkalinity, --dic, --ph, ...".to_string()
    } else {
        carbon.join(", ")
    };
    let (first, second) = sample.pair().map_err(|e| match e {
        Error::WrongCount { .. } | Error::IncompatiblePair { .. } => at_flag(&pair_flags)(e),
        other => flagged(other),
    })?;
    let water = sample.water().map_err(flagged)?;
    sample.check_ph_scale(water.medium()).map_err(flagged)?;
    let air = sample.air().map_err(flagged)?;
    let root: RootChoice = root.parse().map_err(at_flag("--root"))?;
    // One sample: the exchange with the air (a second solve, for the
    // water at equilibrium with the air) is always given.
    let state = water
        .solve_with(first, second, &options.with_root(root))
        .and_then(|s| s.with_exchange(&air, sample.ph_scale_given()))
        .map_err(at_flag(&pair_flags))?;
    Ok(Solved {
        sample,
        water,
        pair_flags,
        state,
        air,
        pair: (first, second),
    })
}

fn run(a: &SolveArgs) -> Result<String, FlagError> {
    let precision = a.shown.precision()?;
    let profile = chosen_profile(a.profile.as_deref()).map_err(at_flag("--profile"))?;
    // One sample: the precipitation potential's cost does not matter.
    let options = SolveOptions::default().with_precipitation_potential(true);
    let solved = solve_sample(&a.inputs.given, &a.root, options)?;
    let options = options.with_root(a.root.parse().map_err(at_flag("--root"))?);
    // issue 13: the uncertainties, of the state as measured.
    let report = if a.uncertainty.asked() {
        if a.at_temperature.is_some() || a.at_pressure.is_some() {
            return Err(FlagError {
                flag: "--uncertainty".into(),
                error: "uncertainties are given for the state as measured; leave out \
                        --at-temperature and --at-pressure, or solve the water at those \
                        conditions"
                    .into(),
            });
        }
        Some(a.uncertainty.report(&solved, options)?)
    } else {
        None
    };
    let Solved {
        sample,
        water,
        state,
        air,
        ..
    } = solved;
    if let Some(r) = &report {
        let scale = Some(sample.input_ph_scale(water.medium()));
        return Ok(if a.shown.json {
            travertine::output::uncertainty_report::json_with_uncertainty(
                &state,
                &profile,
                r,
                a.uncertainty.budget,
            )
        } else {
            travertine::output::table_with_uncertainty(
                &state,
                None,
                scale,
                precision,
                &profile,
                Some(r),
            )
        });
    }
    let exchange = |s: State| s.with_exchange(&air, sample.ph_scale_given());

    let reported = if a.at_temperature.is_some() || a.at_pressure.is_some() {
        let mut c = *water.conditions();
        if let Some(t) = a.at_temperature {
            c = c
                .with_temperature_c(t)
                .map_err(at_flag("--at-temperature"))?;
        }
        if let Some(p) = a.at_pressure {
            c = c.with_pressure_dbar(p).map_err(at_flag("--at-pressure"))?;
        }
        Some(
            state
                .at_with(c, &options)
                .and_then(exchange)
                .map_err(at_flag("--at-temperature"))?,
        )
    } else {
        None
    };
    Ok(render(
        &state,
        reported.as_ref(),
        a.shown.json,
        Some(sample.input_ph_scale(water.medium())),
        precision,
        &profile,
    ))
}

fn dose(a: &DoseArgs) -> Result<String, FlagError> {
    use travertine::decisions::dose::{dose, DoseRequest};
    use travertine::decisions::volume::Volume;
    let precision = a.shown.precision()?;
    let solved = solve_sample(&a.inputs.given, &a.root, SolveOptions::default())?;
    let asked = !a.uncertainty.settings.is_empty() || a.uncertainty.no_constant_uncertainty;
    let u = if asked {
        Some(uncertainties(
            &a.uncertainty.settings,
            a.uncertainty.no_constant_uncertainty,
            &solved,
        )?)
    } else {
        None
    };
    let (first, second) = solved.pair;
    let Solved {
        sample,
        water,
        pair_flags,
        state,
        air,
        ..
    } = solved;
    let mut request = DoseRequest::new(
        a.chemical.parse().map_err(at_flag("--chemical"))?,
        a.target.parse().map_err(at_flag("--target"))?,
    );
    if let Some(p) = a.purity {
        request = request
            .with_purity_percent(p)
            .map_err(at_flag("--purity"))?;
    }
    if let Some(f) = a.dissolved_fraction {
        request = request
            .with_dissolved_fraction(f)
            .map_err(at_flag("--dissolved-fraction"))?;
    }
    let scale = sample.input_ph_scale(water.medium());
    request = request.with_ph_scale(scale);
    if let Some(ppm) = sample.air_co2_ppm {
        request = request
            .with_air_co2_ppm(ppm)
            .map_err(at_flag("--air-co2"))?;
    }
    let volume = sample
        .volume_treated_m3()
        .and_then(|v| v.map(Volume::from_m3).transpose())
        .map_err(flagged)?;
    let mut d = dose(&water, &state, request).map_err(|e| match e {
        Error::Unreachable { .. } | Error::PastTarget { .. } | Error::UnknownChoice { .. } => {
            at_flag("--target")(e)
        }
        Error::Missing { .. } => flagged(e),
        other => at_flag(&pair_flags)(other),
    })?;
    // The water after treatment with its exchange with the air, as the
    // water before it.
    d.after = d
        .after
        .clone()
        .with_exchange(&air, sample.ph_scale_given())
        .map_err(at_flag(&pair_flags))?;
    // issue 13: the uncertainty of the dose, each perturbed dose a full
    // dose solve.
    let uncertainty = match &u {
        Some(u) => {
            use travertine::decisions::dose_uncertainty::dose_uncertainty;
            use travertine::decisions::uncertainty::Problem;
            let root = a.root.parse().map_err(at_flag("--root"))?;
            let problem = Problem::new(&water, first, second)
                .map(|p| p.with_options(SolveOptions::default().with_root(root)))
                .map_err(at_flag(&pair_flags))?;
            let dose_u =
                dose_uncertainty(&problem, u, d.request).map_err(at_flag("--uncertainty"))?;
            let per_litre =
                travertine::decisions::uncertainty_settings::per_litre_inputs(&first, &second);
            let statement = travertine::output::uncertainty_report::dose_statement(
                &dose_u,
                u,
                water.medium(),
                &per_litre,
            );
            Some((dose_u, statement))
        }
        None => None,
    };
    Ok(if a.shown.json {
        travertine::output::dose_json_with_uncertainty(
            &d,
            volume,
            scale,
            uncertainty.as_ref().map(|(u, (json, _))| (u, json.clone())),
        )
    } else {
        travertine::output::dose_table_with_uncertainty(
            &d,
            volume,
            scale,
            precision,
            uncertainty
                .as_ref()
                .map(|(u, (_, block))| (u, block.as_str())),
        )
    })
}

/// The profile of `--profile`, or the default.
fn chosen_profile(arg: Option<&str>) -> Result<Profile, Error> {
    arg.map_or_else(|| Ok(Profile::default()), Profile::from_arg)
}

/// A saved result, read and solved again.
fn saved(path: &str) -> Result<State, FlagError> {
    let what = if path == "-" { "standard input" } else { path };
    let text = if path == "-" {
        let mut t = String::new();
        std::io::Read::read_to_string(&mut std::io::stdin(), &mut t).map(|_| t)
    } else {
        std::fs::read_to_string(path)
    }
    .map_err(|e| FlagError {
        flag: what.to_string(),
        error: format!("cannot read it: {e}"),
    })?;
    let record: travertine::output::Record =
        serde_json::from_str(&text).map_err(|e| FlagError {
            flag: what.to_string(),
            error: format!("not a saved result (the JSON of `solve --json`): {e}"),
        })?;
    record.solved().map_err(|e| FlagError {
        flag: what.to_string(),
        error: e.to_string(),
    })
}

fn blend(a: &BlendArgs) -> Result<String, FlagError> {
    use travertine::decisions::blend::{blend_states, Share};
    let precision = a.shown.precision()?;
    let profile = chosen_profile(a.profile.as_deref()).map_err(at_flag("--profile"))?;
    let (first, second) = (saved(&a.first)?, saved(&a.second)?);
    let share = if a.by == "volume" {
        Share::ByVolume(a.fraction_first)
    } else {
        Share::ByMass(a.fraction_first)
    };
    let mixed = blend_states(&first, &second, share).map_err(at_flag("--fraction-first"))?;
    Ok(render(
        &mixed.state,
        None,
        a.shown.json,
        None,
        precision,
        &profile,
    ))
}

fn render(
    measured: &State,
    reported: Option<&State>,
    json: bool,
    ph_scale: Option<travertine::PhScale>,
    precision: Precision,
    profile: &Profile,
) -> String {
    use travertine::output::{json_with_profile, table_with_profile};
    match (json, reported) {
        (true, None) => json_with_profile(measured, None, profile),
        (true, Some(r)) => json_with_profile(r, Some(measured), profile),
        (false, None) => table_with_profile(measured, None, ph_scale, precision, profile),
        (false, Some(r)) => table_with_profile(r, Some(measured), ph_scale, precision, profile),
    }
}

/// The library settings of `travertine sheet`.
fn sheet_options(a: &SheetArgs) -> Result<SheetOptions, SheetError> {
    let mut o = SheetOptions::default()
        .with_format(a.format.parse::<Format>()?)
        .with_units(a.units.parse::<UnitSystem>()?)
        .with_delimiter(&a.delimiter)?
        .with_decimal_comma(a.decimal_comma)
        .with_digits(a.digits.parse().map_err(|e: Error| SheetError::BadOption {
            option: "--digits",
            message: e.to_string(),
        })?)
        .with_progress(Progress::Auto)
        .with_profile(
            chosen_profile(a.profile.as_deref()).map_err(|e| SheetError::BadOption {
                option: "--profile",
                message: e.to_string(),
            })?,
        )
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
    for (input, value) in &a.choices.given {
        o = o.with_set(&format!("{}={value}", input.column()))?;
    }
    if let Some(p) = &a.pair {
        o = o.with_pair(p)?;
    }
    for u in &a.uncertainty {
        o = o.with_uncertainty(u)?;
    }
    if a.no_constant_uncertainty {
        o = o.without_constant_uncertainty();
    }
    if let Some(c) = &a.columns {
        o = o.with_columns(c)?;
    }
    if let (Some(chemical), Some(target)) = (&a.dose_chemical, &a.target) {
        let bad = |option: &'static str| {
            move |e: Error| SheetError::BadOption {
                option,
                message: e.to_string(),
            }
        };
        let mut request = travertine::decisions::dose::DoseRequest::new(
            chemical.parse().map_err(bad("--dose-chemical"))?,
            target.parse().map_err(bad("--target"))?,
        );
        if let Some(p) = a.purity {
            request = request.with_purity_percent(p).map_err(bad("--purity"))?;
        }
        if let Some(f) = a.dissolved_fraction {
            request = request
                .with_dissolved_fraction(f)
                .map_err(bad("--dissolved-fraction"))?;
        }
        o = o.with_dose(request);
    }
    Ok(o)
}

fn sheet(a: &SheetArgs) -> ExitCode {
    let Some(input) = a.input.as_deref().filter(|_| !a.list_columns) else {
        return print_result(travertine::sheet::column_guide().trim_end());
    };
    let sink = Sink::from_arg(a.output.as_deref());
    match sink {
        Sink::Stdout if stdout_closed() => {
            say(&format!(
                "travertine sheet: {CLOSED}; give -o FILE, or send it to a file or a pipe\n"
            ));
            return ExitCode::from(2);
        }
        Sink::Stdout => {}
        _ => remove_unfinished_output_on_stop(),
    }
    let result =
        sheet_options(a).and_then(|o| travertine::sheet::run(&o, &Source::from_arg(input), &sink));
    match result {
        Ok(summary) => {
            // The results are written; a summary that cannot be shown
            // (standard error closed or full) does not change that.
            say(&summary.to_string());
            ExitCode::SUCCESS
        }
        Err(e) if e.is_broken_pipe() => ExitCode::SUCCESS,
        Err(e) => {
            say(&format!("travertine sheet: {e}\n"));
            ExitCode::from(e.exit_code())
        }
    }
}

/// The signals that stop the program: from the terminal (Ctrl-C, Ctrl-\\,
/// a closed terminal), from `kill` and service managers, from timers and
/// limits. The others are left as they are: the runtime ignores SIGPIPE,
/// and SIGSEGV and the like cannot be handled safely.
#[cfg(unix)]
const STOP_SIGNALS: [i32; 11] = {
    use signal_hook::consts::signal::*;
    [
        SIGHUP, SIGINT, SIGQUIT, SIGTERM, SIGALRM, SIGUSR1, SIGUSR2, SIGXCPU, SIGXFSZ, SIGVTALRM,
        SIGPROF,
    ]
};

/// On a stop signal, removes the hidden temporary file of an output still
/// being written, then ends the program by that signal, as it would have
/// ended without this (so a shell sees Ctrl-C as Ctrl-C). The work is done
/// on a thread of its own, woken by the signal, not in a signal handler.
#[cfg(unix)]
fn remove_unfinished_output_on_stop() {
    let Ok(mut signals) = signal_hook::iterator::Signals::new(STOP_SIGNALS) else {
        return;
    };
    std::thread::spawn(move || {
        if let Some(signal) = signals.forever().next() {
            travertine::sheet::remove_unfinished_outputs();
            let _ = signal_hook::low_level::emulate_default_handler(signal);
            std::process::exit(128 + signal);
        }
    });
}

#[cfg(not(unix))]
fn remove_unfinished_output_on_stop() {}

/// The message for a closed standard output.
const CLOSED: &str = "standard output is closed (as with >&-), so nothing could be written to it";

/// Standard output was closed when the program started. The Rust runtime
/// opens /dev/null over a closed standard stream before `main` runs, so
/// that writes to it succeed and are lost; [`look_at_stdout`] looks before
/// that, when the program is loaded.
static STDOUT_CLOSED: AtomicBool = AtomicBool::new(false);

/// Notes whether standard output is closed (`fcntl` fails with EBADF).
/// Run by the loader before the Rust runtime starts, from the list of
/// start-up functions of the executable.
#[cfg(unix)]
extern "C" fn look_at_stdout() {
    // SAFETY: F_GETFD only reads the flags of a descriptor number, open or
    // not; it touches no memory of ours.
    if unsafe { libc::fcntl(libc::STDOUT_FILENO, libc::F_GETFD) } == -1 {
        STDOUT_CLOSED.store(true, Ordering::Relaxed);
    }
}

#[cfg(any(
    target_os = "linux",
    target_os = "android",
    target_os = "freebsd",
    target_os = "netbsd",
    target_os = "openbsd",
    target_os = "dragonfly",
    target_os = "illumos",
    target_os = "solaris"
))]
#[used]
#[link_section = ".init_array"]
static LOOK_AT_STDOUT: extern "C" fn() = look_at_stdout;

#[cfg(any(target_os = "macos", target_os = "ios"))]
#[used]
#[link_section = "__DATA,__mod_init_func"]
static LOOK_AT_STDOUT: extern "C" fn() = look_at_stdout;

/// Whether standard output was closed when the program started.
fn stdout_closed() -> bool {
    #[cfg(unix)]
    // SAFETY: as in `look_at_stdout`; for a system whose runtime leaves a
    // closed stream closed.
    let closed_now = unsafe { libc::fcntl(libc::STDOUT_FILENO, libc::F_GETFD) } == -1;
    #[cfg(not(unix))]
    let closed_now = false;
    closed_now || STDOUT_CLOSED.load(Ordering::Relaxed)
}

/// Writes a message to standard error; one that cannot be written (the
/// stream closed or full) is dropped rather than a panic.
fn say(text: &str) {
    use std::io::Write;
    let mut err = std::io::stderr().lock();
    let _ = err.write_all(text.as_bytes()).and_then(|()| err.flush());
}

/// Prints a result to standard output. A reader that went away (a broken
/// pipe, as with `| head`) ends the command quietly; any other failure to
/// write (a full disk, a closed stream) is reported in one line with exit
/// code 1, never a panic.
fn print_result(text: &str) -> ExitCode {
    use std::io::Write;
    if stdout_closed() {
        say(&format!(
            "travertine: {CLOSED}; send the result to a file or a pipe\n"
        ));
        return ExitCode::from(1);
    }
    let mut out = std::io::stdout().lock();
    let written = out
        .write_all(text.as_bytes())
        .and_then(|()| out.write_all(b"\n"))
        .and_then(|()| out.flush());
    match written {
        Ok(()) => ExitCode::SUCCESS,
        Err(e) if e.kind() == std::io::ErrorKind::BrokenPipe => ExitCode::SUCCESS,
        Err(e) => {
            say(&format!(
                "travertine: the result could not be written: {e}\n"
            ));
            ExitCode::from(1)
        }
    }
}

// issue 14: charts
/// Draws the chart asked for and writes its files; the lines to print.
fn chart(a: &ChartArgs) -> Result<String, FlagError> {
    use travertine::chart::{self, ChartError, SheetChartOptions, SheetColumns};
    let failed = |flag: &str| {
        let flag = flag.to_string();
        move |e: ChartError| FlagError {
            flag: flag.clone(),
            error: e.to_string(),
        }
    };
    let mut said = Vec::new();
    let (drawn, out) = match &a.kind {
        ChartKind::Speciation(s) => {
            // The exchange with the air is not drawn: its inputs are named.
            let unused: Vec<String> = s
                .inputs
                .given
                .iter()
                .filter(|(i, _)| {
                    matches!(
                        i,
                        Input::Wind
                            | Input::AirCo2
                            | Input::Elevation
                            | Input::LakeArea
                            | Input::K600
                            | Input::GasTransfer
                    )
                })
                .map(|(i, _)| flag(*i))
                .collect();
            if !unused.is_empty() {
                said.push(format!(
                    "note: not drawn on this chart (the exchange with the air): {}",
                    unused.join(", ")
                ));
            }
            let Solved {
                sample,
                water,
                state,
                ..
            } = solve_sample(&s.inputs.given, &s.root, SolveOptions::default())?;
            let mut options = chart::SpeciationOptions::default()
                .with_include(s.include.parse().map_err(failed("--include"))?)
                .with_ph_scale(sample.input_ph_scale(water.medium()));
            if let Some(r) = &s.ph_range {
                let (lo, hi) = r.split_once(',').unwrap_or((r, ""));
                let (lo, hi) = (lo.trim().parse(), hi.trim().parse());
                let (Ok(lo), Ok(hi)) = (lo, hi) else {
                    return Err(FlagError {
                        flag: "--ph-range".into(),
                        error: format!("`{r}` is not LOW,HIGH, for example 4,11"),
                    });
                };
                options = options
                    .with_ph_range(lo, hi)
                    .map_err(failed("--ph-range"))?;
            }
            (
                chart::speciation(&state, &options).map_err(failed("chart"))?,
                &s.out,
            )
        }
        ChartKind::Depth(s) | ChartKind::Overview(s) => {
            let bad = |flag: &str| {
                let flag = flag.to_string();
                move |e: SheetError| FlagError {
                    flag: flag.clone(),
                    error: e.to_string(),
                }
            };
            let mut sheet = SheetOptions::default();
            for m in &s.map {
                sheet = sheet.with_map(m).map_err(bad("--map"))?;
            }
            for v in &s.set {
                sheet = sheet.with_set(v).map_err(bad("--set"))?;
            }
            let mut columns = SheetColumns::default();
            for (value, with) in [
                (
                    &s.site_column,
                    SheetColumns::with_site as fn(SheetColumns, &str) -> SheetColumns,
                ),
                (&s.date_column, SheetColumns::with_date),
                (&s.time_column, SheetColumns::with_time),
                (&s.depth_column, SheetColumns::with_depth),
            ] {
                if let Some(v) = value {
                    columns = with(columns, v);
                }
            }
            let profile = chosen_profile(s.profile.as_deref()).map_err(at_flag("--profile"))?;
            let options = SheetChartOptions::new(sheet)
                .with_profile(profile)
                .with_columns(columns);
            let input: Box<dyn std::io::Read + Send> = if s.input == "-" {
                Box::new(std::io::stdin())
            } else {
                Box::new(std::fs::File::open(&s.input).map_err(|e| FlagError {
                    flag: s.input.clone(),
                    error: format!("cannot read it: {e}"),
                })?)
            };
            let drawn = if matches!(a.kind, ChartKind::Depth(_)) {
                chart::depth_profile(&options, input)
            } else {
                chart::overview(&options, input)
            };
            (drawn.map_err(failed(&s.input))?, &s.out)
        }
    };
    let write = |path: &str, bytes: &[u8]| {
        std::fs::write(path, bytes).map_err(|e| FlagError {
            flag: "--output".into(),
            error: format!("cannot write {path}: {e}"),
        })
    };
    write(&out.output, drawn.svg().as_bytes())?;
    said.insert(0, format!("wrote {}", out.output));
    if out.png {
        let path = std::path::Path::new(&out.output).with_extension("png");
        let png = drawn.png(out.png_scale).map_err(failed("--png-scale"))?;
        write(&path.to_string_lossy(), &png)?;
        said.insert(1, format!("wrote {}", path.display()));
    }
    for n in drawn.notes() {
        said.push(format!("note: {n}"));
    }
    Ok(said.join("\n"))
}

fn main() -> ExitCode {
    let cli = Cli::parse();
    match cli.command {
        Command::Chart(args) => match chart(&args) {
            Ok(text) => print_result(&text),
            Err(e) => {
                say(&format!("travertine: {}: {}\n", e.flag, e.error));
                ExitCode::from(2)
            }
        },
        Command::Sheet(args) => sheet(&args),
        Command::Blend(args) => match blend(&args) {
            Ok(text) => print_result(text.trim_end()),
            Err(e) => {
                say(&format!("travertine: {}: {}\n", e.flag, e.error));
                ExitCode::from(2)
            }
        },
        Command::Dose(args) => match dose(&args) {
            Ok(text) => print_result(text.trim_end()),
            Err(e) => {
                say(&format!("travertine: {}: {}\n", e.flag, e.error));
                ExitCode::from(2)
            }
        },
        Command::Solve(args) => match run(&args) {
            Ok(text) => print_result(text.trim_end()),
            Err(e) => {
                say(&format!("travertine: {}: {}\n", e.flag, e.error));
                ExitCode::from(2)
            }
        },
    }
}
