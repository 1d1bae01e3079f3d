//! The charts of a field sheet: the depth profile and the overview over
//! time, one line per site.

use super::design;
use super::draw::{
    self, linear_over, log_over, Along, Axis, Band, Entry, Panel, Rule, Scale, Series, Swatch,
    Ticks,
};
use super::rows::{Row, SheetColumns, SheetRows};
use super::{Chart, ChartError};
use crate::decisions::Profile;
use crate::sheet::SheetOptions;
use std::io::Read;

/// The settings of a sheet chart: how the sheet is read and solved, the
/// quality-flag profile whose limits are drawn, and which columns hold the
/// site, date, time and depth.
///
/// ```
/// use travertine::chart::{SheetChartOptions, SheetColumns};
/// use travertine::decisions::Profile;
/// use travertine::sheet::SheetOptions;
/// let o = SheetChartOptions::new(SheetOptions::default().with_set("water=fresh")?)
///     .with_profile(Profile::built_in("cold-water-fish")?)
///     .with_columns(SheetColumns::default().with_site("Pond"));
/// # let _ = o;
/// # Ok::<(), Box<dyn std::error::Error>>(())
/// ```
#[derive(Debug, Clone)]
#[non_exhaustive]
pub struct SheetChartOptions {
    sheet: SheetOptions,
    profile: Profile,
    columns: SheetColumns,
}

impl SheetChartOptions {
    /// The sheet read with `sheet`, the default profile and the columns
    /// found by their headers.
    pub fn new(sheet: SheetOptions) -> Self {
        SheetChartOptions {
            sheet,
            profile: Profile::default(),
            columns: SheetColumns::default(),
        }
    }

    /// With the limits of this quality-flag profile drawn (also used for
    /// the sheet's own flags).
    #[must_use]
    pub fn with_profile(mut self, profile: Profile) -> Self {
        self.sheet = self.sheet.with_profile(profile.clone());
        self.profile = profile;
        self
    }

    /// With the site, date, time and depth columns named.
    #[must_use]
    pub fn with_columns(mut self, columns: SheetColumns) -> Self {
        self.columns = columns;
        self
    }
}

impl Default for SheetChartOptions {
    fn default() -> Self {
        SheetChartOptions::new(SheetOptions::default())
    }
}

/// The sites in the order they first appear.
fn sites(rows: &[Row]) -> Vec<String> {
    let mut out: Vec<String> = Vec::new();
    for r in rows {
        if !out.contains(&r.site) {
            out.push(r.site.clone());
        }
    }
    out
}

/// Whether most rows are saline.
fn mostly_saline(rows: &[Row]) -> bool {
    rows.iter().filter(|r| r.saline()).count() * 2 > rows.len()
}

/// One quantity a sheet chart draws.
struct Quantity {
    key: &'static str,
    title: &'static str,
    unit_title: &'static str,
    log: bool,
}

const PCO2: Quantity = Quantity {
    key: "pco2_uatm",
    title: "pCO2",
    unit_title: "pCO2 (µatm, log scale)",
    log: true,
};
const PH_NBS: Quantity = Quantity {
    key: "ph_nbs",
    title: "pH",
    unit_title: "pH (NBS scale)",
    log: false,
};
const PH_TOTAL: Quantity = Quantity {
    key: "ph_total",
    title: "pH",
    unit_title: "pH (total scale)",
    log: false,
};
const FREE_CO2: Quantity = Quantity {
    key: "free_co2_mg_l",
    title: "Free CO2",
    unit_title: "free CO2 (mg/L as CO2)",
    log: false,
};
const SI_CALCITE: Quantity = Quantity {
    key: "si_calcite",
    title: "Calcite saturation index",
    unit_title: "calcite SI (log10 Ω, no unit)",
    log: false,
};
const OMEGA_CALCITE: Quantity = Quantity {
    key: "omega_calcite",
    title: "Calcite saturation",
    unit_title: "calcite Ω (no unit)",
    log: false,
};
const OMEGA_ARAGONITE: Quantity = Quantity {
    key: "omega_aragonite",
    title: "Aragonite saturation",
    unit_title: "aragonite Ω (no unit)",
    log: false,
};

/// A limit of the profile on one quantity: the band from the limit
/// outward, and its text.
struct Limit {
    value: f64,
    high: bool,
    text: String,
}

/// The limits of `profile` that fall on the quantity `key`.
fn limits(profile: &Profile, key: &str) -> Vec<Limit> {
    let l = &profile.limits;
    let p = &profile.plausibility;
    let mut out = Vec::new();
    let mut add = |v: Option<f64>, high: bool, code: &str, unit: &str| {
        if let Some(v) = v.filter(|v| v.is_finite()) {
            let side = if high { "above" } else { "below" };
            out.push(Limit {
                value: v,
                high,
                text: format!("{code}: {side} {v}{unit}"),
            });
        }
    };
    match key {
        "pco2_uatm" => add(p.pco2_high_uatm, true, "implausible_sample", " µatm"),
        "ph_nbs" => {
            add(l.ph_low_nbs, false, "ph_low", "");
            add(l.ph_high_nbs, true, "ph_high", "");
        }
        "free_co2_mg_l" => add(l.free_co2_high_mg_l, true, "free_co2_high", " mg/L"),
        "omega_aragonite" => add(l.omega_aragonite_low, false, "omega_aragonite_low", ""),
        _ => {}
    }
    out
}

/// The points of `q` of every row of each site, `(along, value)` for the
/// overview or `(value, -depth)` for the profile, sorted along the run.
fn site_series(
    rows: &[Row],
    q: &Quantity,
    position: &dyn Fn(&Row) -> Option<f64>,
    value_on_x: bool,
) -> Vec<Series> {
    sites(rows)
        .iter()
        .enumerate()
        .map(|(i, site)| {
            let mut pts: Vec<(f64, f64)> = rows
                .iter()
                .filter(|r| &r.site == site)
                .filter_map(|r| Some((position(r)?, r.number(q.key)?)))
                .filter(|(_, v)| !q.log || *v > 0.0)
                .collect();
            pts.sort_by(|a, b| a.0.total_cmp(&b.0));
            let runs = vec![if value_on_x {
                pts.iter().map(|(p, v)| (*v, *p)).collect()
            } else {
                pts
            }];
            Series {
                look: design::look(i),
                runs,
                line: true,
                markers: true,
                width_px: design::LINE_PX,
            }
        })
        .collect()
}

/// The scale over the values of `series` on one axis, widened to take in
/// `also` (the limits drawn).
fn value_scale(series: &[Series], on_x: bool, log: bool, also: &[f64]) -> Scale {
    let values = series
        .iter()
        .flat_map(|s| s.runs.iter().flatten())
        .map(|&(x, y)| if on_x { x } else { y })
        .chain(also.iter().copied());
    if log {
        log_over(values, (100.0, 10000.0))
    } else {
        linear_over(values, 0.06, 0.2, (0.0, 1.0))
    }
}

/// The note of a panel with no values.
fn empty_note(series: &[Series], q: &Quantity) -> Option<String> {
    series
        .iter()
        .all(|s| s.runs.iter().all(Vec::is_empty))
        .then(|| {
            format!(
                "no row has {} (its inputs are missing)",
                q.title.to_lowercase()
            )
        })
}

/// The legend of the sites.
fn site_legend(rows: &[Row]) -> Vec<Entry> {
    sites(rows)
        .iter()
        .enumerate()
        .map(|(i, s)| Entry {
            swatch: Swatch::Line {
                look: design::look(i),
                marker: true,
            },
            text: s.clone(),
        })
        .collect()
}

/// The depth profile of a sheet: pCO2 (log axis), pH and calcite Ω against
/// depth, depth increasing downward, one panel each, one line per site
/// (station).
///
/// The depth comes from the sheet's depth column (any header the sheet
/// reads as the sample depth, or [`SheetColumns::with_depth`]); a sheet
/// without one but with pressures is drawn against gauge pressure (dbar).
///
/// # Errors
/// [`ChartError::Sheet`] for a sheet that cannot be started;
/// [`ChartError::NothingToDraw`] for a sheet without data rows or whose
/// rows are all errors; [`ChartError::MissingColumn`] without depth or
/// pressure.
///
/// ```
/// use travertine::chart::{depth_profile, SheetChartOptions};
/// let sheet = "Depth (m),Temperature (°C),pH,Alkalinity (meq/L),Conductivity (µS/cm)\n\
///              1,22.0,8.3,1.79,225\n5,19.0,7.9,1.82,228\n12,12.0,7.4,1.90,240\n";
/// let chart = depth_profile(&SheetChartOptions::default(), sheet.as_bytes())?;
/// assert!(chart.svg().contains("depth (m)"));
/// # Ok::<(), travertine::chart::ChartError>(())
/// ```
pub fn depth_profile<R: Read + Send>(
    options: &SheetChartOptions,
    input: R,
) -> Result<Chart, ChartError> {
    const WHAT: &str = "depth profile";
    let sheet = SheetRows::read(&options.sheet, &options.columns, input)?;
    if sheet.rows.is_empty() {
        return Err(sheet.nothing(WHAT));
    }
    let by_depth = sheet.depth_header.is_some();
    if !by_depth
        && !sheet
            .rows
            .iter()
            .any(|r| r.number("pressure_dbar").unwrap_or(0.0) > 0.0)
    {
        return Err(ChartError::MissingColumn {
            what: WHAT,
            why: "the sheet has no depth column: name one with its unit, such as `Depth (m)`, \
                  or give --depth-column HEADER (read in metres)"
                .into(),
        });
    }
    let position = move |r: &Row| -> Option<f64> {
        if by_depth {
            r.depth_m.map(|d| -d)
        } else {
            r.number("pressure_dbar").map(|p| -p)
        }
    };
    let saline = mostly_saline(&sheet.rows);
    let ph = if saline { &PH_TOTAL } else { &PH_NBS };
    let quantities = [&PCO2, ph, &OMEGA_CALCITE];
    let depths: Vec<f64> = sheet.rows.iter().filter_map(&position).collect();
    let depth_scale = {
        let lo = depths.iter().copied().fold(f64::INFINITY, f64::min);
        let hi = depths.iter().copied().fold(f64::NEG_INFINITY, f64::max);
        if lo.is_finite() {
            // From the surface (0) down past the deepest sample.
            let deepest = lo.min(-1.0);
            let span = (hi.max(0.0) - deepest).max(1.0);
            Scale::Linear(deepest - 0.05 * span, hi.max(0.0) + 0.02 * span)
        } else {
            Scale::Linear(-10.0, 0.0)
        }
    };
    let depth_title = if by_depth {
        "depth (m)"
    } else {
        "gauge pressure (dbar)"
    };
    let mut panels = Vec::new();
    for q in quantities {
        let series = site_series(&sheet.rows, q, &position, true);
        let mut rules = Vec::new();
        if q.key == "omega_calcite" {
            rules.push(Rule {
                along: Along::X,
                at: 1.0,
                colour: design::MUTED,
                dashed: true,
                width_px: 1,
                text: Some("Ω = 1".into()),
            });
        }
        let also: Vec<f64> = if q.key == "omega_calcite" {
            vec![1.0]
        } else {
            vec![]
        };
        panels.push(Panel {
            title: q.title.to_string(),
            x: Axis {
                scale: value_scale(&series, true, q.log, &also),
                title: q.unit_title.to_string(),
                ticks: Ticks::Plain,
            },
            y: Axis {
                scale: depth_scale,
                title: depth_title.to_string(),
                ticks: Ticks::Negated,
            },
            empty_note: empty_note(&series, q),
            series,
            bands: Vec::new(),
            rules,
            labels: Vec::new(),
        });
    }
    let mut legend = site_legend(&sheet.rows);
    legend.push(Entry {
        swatch: Swatch::Rule(design::MUTED),
        text: "calcite saturation (Ω = 1)".into(),
    });
    let mut notes: Vec<String> = sheet.error_note().into_iter().collect();
    let missing = sheet.rows.iter().filter(|r| position(r).is_none()).count();
    if missing > 0 {
        notes.push(format!(
            "{missing} computed rows have no depth and are left out."
        ));
    }
    if !by_depth {
        notes.push("No depth column: drawn against the gauge pressure of each row.".into());
    }
    let distinct: Vec<f64> = {
        let mut d = depths.clone();
        d.sort_by(f64::total_cmp);
        d.dedup();
        d
    };
    if distinct.len() == 1 {
        notes.push("One depth only: each panel shows single points.".into());
    }
    let size = (1080, 720);
    let subtitle = format!(
        "{} computed rows of {}, {} water; pH on the {} scale",
        sheet.rows.len(),
        sheet.total,
        if saline { "saline" } else { "fresh" },
        if saline { "total" } else { "NBS" }
    );
    let svg = draw::page(size, "Depth profile", &subtitle, &legend, &notes, |area| {
        draw::panels(area, &panels, true)
    })?;
    Ok(Chart {
        svg,
        width_px: size.0,
        height_px: size.1,
        notes,
    })
}

/// The overview of a field sheet over time: pCO2 (log axis), pH, free CO2,
/// and calcite SI (aragonite Ω where most rows are saline), one line per
/// site, with the limits of the profile's quality flags drawn as bands
/// (the flag is raised inside the band).
///
/// The time axis comes from the date column, with the time column where
/// there is one. A sheet without a date column is drawn in sheet order
/// (noted on the chart). Error rows are left out, and a note gives their
/// number.
///
/// # Errors
/// [`ChartError::Sheet`] for a sheet that cannot be started;
/// [`ChartError::NothingToDraw`] for a sheet without data rows or whose
/// rows are all errors.
///
/// ```
/// use travertine::chart::{overview, SheetChartOptions};
/// let sheet = "Pond,Date,Time,Temp (°C),pH (NBS),Alkalinity (mg/L as CaCO3),Calcium (mg/L)\n\
///              Alder,2031-06-02,06:30,24.3,7.52,117,33\n\
///              Alder,2031-06-02,15:30,26.7,8.39,119,34\n";
/// let chart = overview(&SheetChartOptions::default(), sheet.as_bytes())?;
/// assert!(chart.svg().contains("Alder"));
/// assert!(chart.svg().contains("ph_high"));
/// # Ok::<(), travertine::chart::ChartError>(())
/// ```
pub fn overview<R: Read + Send>(
    options: &SheetChartOptions,
    input: R,
) -> Result<Chart, ChartError> {
    const WHAT: &str = "sheet overview";
    let sheet = SheetRows::read(&options.sheet, &options.columns, input)?;
    if sheet.rows.is_empty() {
        return Err(sheet.nothing(WHAT));
    }
    let dated = sheet.date_header.is_some() && sheet.rows.iter().any(|r| r.when.is_some());
    // Without dates, the rows in sheet order: the number of each data row.
    let position = |r: &Row| -> Option<f64> {
        if dated {
            r.when
        } else {
            Some(r.number_in_sheet as f64)
        }
    };
    let saline = mostly_saline(&sheet.rows);
    let quantities: [&Quantity; 4] = if saline {
        [&PCO2, &PH_TOTAL, &FREE_CO2, &OMEGA_ARAGONITE]
    } else {
        [&PCO2, &PH_NBS, &FREE_CO2, &SI_CALCITE]
    };
    let times: Vec<f64> = sheet.rows.iter().filter_map(position).collect();
    let time_scale = linear_over(
        times.iter().copied(),
        0.04,
        if dated { 1.0 } else { 2.0 },
        (0.0, 1.0),
    );
    let mut panels = Vec::new();
    let mut any_band = false;
    for q in quantities {
        let series = site_series(&sheet.rows, q, &position, false);
        let lims = limits(&options.profile, q.key);
        // Each limit, and room beyond it for its band to show.
        let also: Vec<f64> = lims
            .iter()
            .flat_map(|l| {
                let beyond = match (q.log, l.high) {
                    (true, true) => l.value * 1.6,
                    (true, false) => l.value / 1.6,
                    (false, _) => l.value,
                };
                [l.value, beyond]
            })
            .collect();
        let scale = value_scale(&series, false, q.log, &also);
        let (lo, hi) = match scale {
            Scale::Linear(a, b) | Scale::Log(a, b) => (a, b),
        };
        let bands: Vec<Band> = lims
            .iter()
            .map(|l| Band {
                along: Along::Y,
                from: l.value,
                to: if l.high { hi } else { lo },
                colour: design::BAND,
                opacity: 0.13,
                text: Some(l.text.clone()),
            })
            .collect();
        any_band |= !bands.is_empty();
        let mut rules = Vec::new();
        match q.key {
            "si_calcite" => rules.push(Rule {
                along: Along::Y,
                at: 0.0,
                colour: design::MUTED,
                dashed: true,
                width_px: 1,
                text: Some("saturated (SI = 0)".into()),
            }),
            "omega_aragonite" => rules.push(Rule {
                along: Along::Y,
                at: 1.0,
                colour: design::MUTED,
                dashed: true,
                width_px: 1,
                text: Some("saturated (Ω = 1)".into()),
            }),
            _ => {}
        }
        let scale = if rules.is_empty() {
            scale
        } else {
            value_scale(
                &series,
                false,
                q.log,
                &[also.as_slice(), &[rules[0].at]].concat(),
            )
        };
        panels.push(Panel {
            title: q.title.to_string(),
            x: Axis {
                scale: time_scale,
                title: if dated {
                    "date (time of sampling)".into()
                } else {
                    "row of the sheet (no date column)".into()
                },
                ticks: if dated { Ticks::Date } else { Ticks::Plain },
            },
            y: Axis {
                scale,
                title: q.unit_title.to_string(),
                ticks: Ticks::Plain,
            },
            empty_note: empty_note(&series, q),
            series,
            bands,
            rules,
            labels: Vec::new(),
        });
    }
    let mut legend = site_legend(&sheet.rows);
    if any_band {
        legend.push(Entry {
            swatch: Swatch::Band(design::BAND, 0.13),
            text: format!("flag raised (profile `{}`)", options.profile.name()),
        });
    }
    let mut notes: Vec<String> = sheet.error_note().into_iter().collect();
    if sheet.site_header.is_none() {
        notes.push("No site column: every sample on one line.".into());
    }
    if !dated {
        notes.push(if sheet.date_header.is_some() {
            "No date in the date column could be read: samples drawn in sheet order.".into()
        } else {
            "No date column: samples drawn in sheet order.".into()
        });
    } else if sheet.bad_dates > 0 {
        notes.push(format!(
            "{} computed rows have a date that cannot be read (use 2031-06-02 or 02.06.2031) \
             and are left out.",
            sheet.bad_dates
        ));
    }
    if saline && options.profile.limits.ph_low_nbs.is_some() {
        notes
            .push("pH limits are on the NBS scale and are not drawn on the total-scale pH.".into());
    }
    let size = (1080, 1180);
    let subtitle = format!(
        "{} computed rows of {}, {} water, {} site{}; limits of the profile `{}`",
        sheet.rows.len(),
        sheet.total,
        if saline { "saline" } else { "fresh" },
        sites(&sheet.rows).len(),
        if sites(&sheet.rows).len() == 1 {
            ""
        } else {
            "s"
        },
        options.profile.name()
    );
    let svg = draw::page(
        size,
        "Field sheet over time",
        &subtitle,
        &legend,
        &notes,
        |area| draw::panels(area, &panels, false),
    )?;
    Ok(Chart {
        svg,
        width_px: size.0,
        height_px: size.1,
        notes,
    })
}
