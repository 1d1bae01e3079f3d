//! The drawing shared by every chart: the page, panels with their series,
//! bands, reference lines and labels, and the legend strip. Everything is
//! drawn with plotters' elements on its SVG backend.

use super::design::{self, Look, Marker, Pattern};
use super::{drawing, ChartError};
use plotters::coord::ranged1d::ValueFormatter;
use plotters::coord::Shift;
use plotters::element::DashedPathElement;
use plotters::prelude::*;
use plotters::style::text_anchor::{HPos, Pos, VPos};

/// A drawing area on the SVG backend.
pub(super) type Area<'a> = DrawingArea<SVGBackend<'a>, Shift>;

/// How an axis maps its values.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(super) enum Scale {
    /// Linear from the first to the second value.
    Linear(f64, f64),
    /// Logarithmic (both positive).
    Log(f64, f64),
}

/// How the tick labels of an axis are written.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(super) enum Ticks {
    /// Numbers, with decimals to suit the range.
    Plain,
    /// Days since 1970-01-01 written as dates.
    Date,
    /// The value negated (depth drawn downward as a negative number).
    Negated,
}

/// One axis: its scale, title and labels.
#[derive(Debug, Clone)]
pub(super) struct Axis {
    pub scale: Scale,
    pub title: String,
    pub ticks: Ticks,
}

/// One series of points.
#[derive(Debug, Clone)]
pub(super) struct Series {
    pub look: Look,
    /// Runs of points to join; each run is drawn as one line.
    pub runs: Vec<Vec<(f64, f64)>>,
    pub line: bool,
    pub markers: bool,
    pub width_px: u32,
}

/// Which axis a band or a rule spans.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
pub(super) enum Along {
    /// A range of x (a vertical band or line).
    X,
    /// A range of y (a horizontal band or line).
    Y,
}

/// A shaded range of one axis.
#[derive(Debug, Clone)]
pub(super) struct Band {
    pub along: Along,
    pub from: f64,
    pub to: f64,
    pub colour: RGBColor,
    pub opacity: f64,
    /// Text written inside the band, at its edge.
    pub text: Option<String>,
}

/// A straight reference line at one value of an axis.
#[derive(Debug, Clone)]
pub(super) struct Rule {
    pub along: Along,
    pub at: f64,
    pub colour: RGBColor,
    pub dashed: bool,
    pub width_px: u32,
    pub text: Option<String>,
}

/// A labelled point.
#[derive(Debug, Clone)]
pub(super) struct Label {
    pub at: (f64, f64),
    pub text: String,
}

/// One panel: axes, series and what is drawn behind and over them.
#[derive(Debug, Clone)]
pub(super) struct Panel {
    pub title: String,
    pub x: Axis,
    pub y: Axis,
    pub series: Vec<Series>,
    pub bands: Vec<Band>,
    pub rules: Vec<Rule>,
    pub labels: Vec<Label>,
    /// Written in the middle of a panel with nothing to show.
    pub empty_note: Option<String>,
}

/// The kind of sample a legend entry shows.
#[derive(Debug, Clone)]
pub(super) enum Swatch {
    /// A line (with its marker where the chart draws markers).
    Line { look: Look, marker: bool },
    /// A shaded band.
    Band(RGBColor, f64),
    /// A reference line.
    Rule(RGBColor),
}

/// One entry of the legend.
#[derive(Debug, Clone)]
pub(super) struct Entry {
    pub swatch: Swatch,
    pub text: String,
}

fn font(px: f64, colour: &RGBColor) -> TextStyle<'static> {
    (design::FONT, px).into_font().color(colour)
}

fn italic(px: f64, colour: &RGBColor) -> TextStyle<'static> {
    (design::FONT, px, FontStyle::Italic)
        .into_font()
        .color(colour)
}

/// The SVG of a page `width`×`height` px: the title, the line under it,
/// the body drawn by `body`, the legend and the notes.
pub(super) fn page(
    size: (u32, u32),
    title: &str,
    subtitle: &str,
    legend: &[Entry],
    notes: &[String],
    body: impl FnOnce(&Area<'_>) -> Result<(), ChartError>,
) -> Result<String, ChartError> {
    let mut svg = String::new();
    {
        let root = SVGBackend::with_string(&mut svg, size).into_drawing_area();
        root.fill(&design::PAGE).map_err(drawing)?;
        let (head, rest) = root.split_vertically(66);
        head.draw(&Text::new(
            title.to_string(),
            (24, 14),
            (design::FONT, design::TITLE_PX)
                .into_font()
                .style(FontStyle::Bold)
                .color(&design::INK),
        ))
        .map_err(drawing)?;
        head.draw(&Text::new(
            subtitle.to_string(),
            (24, 44),
            font(design::SUBTITLE_PX, &design::MUTED),
        ))
        .map_err(drawing)?;
        let rows = legend_rows(legend, size.0);
        let foot_px = 16 + 24 * rows as u32 + 18 * notes.len() as u32;
        let (main, foot) = rest.split_vertically(rest.dim_in_pixel().1.saturating_sub(foot_px));
        body(&main)?;
        draw_legend(&foot, legend)?;
        for (i, n) in notes.iter().enumerate() {
            foot.draw(&Text::new(
                n.clone(),
                (24, 8 + 24 * rows as i32 + 18 * i as i32 + 6),
                italic(design::LEGEND_PX, &design::MUTED),
            ))
            .map_err(drawing)?;
        }
        root.present().map_err(drawing)?;
    }
    Ok(svg)
}

/// Width of a legend entry, px (a fair estimate of the text's width).
fn entry_px(e: &Entry) -> i32 {
    40 + (e.text.chars().count() as f64 * design::LEGEND_PX * 0.56) as i32 + 22
}

/// How many rows the legend takes at this page width.
fn legend_rows(legend: &[Entry], width: u32) -> usize {
    let mut rows = usize::from(!legend.is_empty());
    let mut x = 24;
    for e in legend {
        let w = entry_px(e);
        if x + w > width as i32 - 16 && x > 24 {
            rows += 1;
            x = 24;
        }
        x += w;
    }
    rows
}

fn draw_legend(area: &Area<'_>, legend: &[Entry]) -> Result<(), ChartError> {
    let width = area.dim_in_pixel().0 as i32;
    let (mut x, mut y) = (24, 16);
    for e in legend {
        let w = entry_px(e);
        if x + w > width - 16 && x > 24 {
            x = 24;
            y += 24;
        }
        match &e.swatch {
            Swatch::Line { look, marker } => {
                line_sample(area, *look, (x, y), 32)?;
                if *marker {
                    marker_at(area, look.marker, look.colour, (x + 16, y))?;
                }
            }
            Swatch::Band(c, a) => {
                area.draw(&Rectangle::new(
                    [(x, y - 7), (x + 32, y + 7)],
                    c.mix(*a).filled(),
                ))
                .map_err(drawing)?;
            }
            Swatch::Rule(c) => {
                area.draw(&PathElement::new(
                    vec![(x + 16, y - 9), (x + 16, y + 9)],
                    c.stroke_width(2),
                ))
                .map_err(drawing)?;
            }
        }
        area.draw(&Text::new(
            e.text.clone(),
            (x + 40, y),
            font(design::LEGEND_PX, &design::INK).pos(Pos::new(HPos::Left, VPos::Center)),
        ))
        .map_err(drawing)?;
        x += w;
    }
    Ok(())
}

/// A short horizontal sample of a line, in pixels.
fn line_sample(
    area: &Area<'_>,
    look: Look,
    (x, y): (i32, i32),
    len: i32,
) -> Result<(), ChartError> {
    let style = look.colour.stroke_width(design::LINE_PX);
    let pts = vec![(x, y), (x + len, y)];
    match (look.pattern, look.pattern.dash_px()) {
        (_, Some((d, g))) => area
            .draw(&DashedPathElement::new(pts, d, g, style))
            .map_err(drawing),
        (Pattern::Dotted, None) => {
            for k in (0..=len).step_by(6) {
                area.draw(&Circle::new((x + k, y), 1.6, look.colour.filled()))
                    .map_err(drawing)?;
            }
            Ok(())
        }
        _ => area.draw(&PathElement::new(pts, style)).map_err(drawing),
    }
}

/// Runs `$body` with `$shape` a function that makes the shape of marker
/// `$m` in colour `$c`, centred on (0, 0) (each shape is its own type).
macro_rules! with_marker {
    ($m:expr, $c:expr, |$shape:ident| $body:expr) => {{
        let c: RGBColor = $c;
        match $m {
            Marker::Disc => {
                let $shape = || Circle::new((0, 0), 4, c.filled());
                $body
            }
            Marker::Triangle => {
                let $shape = || TriangleMarker::new((0, 0), 5, c.filled());
                $body
            }
            Marker::Square => {
                let $shape = || Rectangle::new([(-4, -4), (4, 4)], c.stroke_width(2));
                $body
            }
            Marker::Cross => {
                let $shape = || Cross::new((0, 0), 4, c.stroke_width(2));
                $body
            }
            Marker::Ring => {
                let $shape = || Circle::new((0, 0), 4, c.stroke_width(2));
                $body
            }
        }
    }};
}

/// One marker, in pixels.
fn marker_at(area: &Area<'_>, m: Marker, c: RGBColor, p: (i32, i32)) -> Result<(), ChartError> {
    with_marker!(m, c, |shape| area
        .draw(&(EmptyElement::at(p) + shape()))
        .map_err(drawing))
}

/// Draws `panels` side by side (`across`) or one under the other.
pub(super) fn panels(area: &Area<'_>, panels: &[Panel], across: bool) -> Result<(), ChartError> {
    if panels.is_empty() {
        return Ok(());
    }
    let parts = if across {
        area.split_evenly((1, panels.len()))
    } else {
        area.split_evenly((panels.len(), 1))
    };
    for (p, a) in panels.iter().zip(parts.iter()) {
        panel(a, p)?;
    }
    Ok(())
}

/// Draws one panel in `area`.
pub(super) fn panel(area: &Area<'_>, p: &Panel) -> Result<(), ChartError> {
    let area = area.margin(4, 4, 12, 16);
    let (head, body) = area.split_vertically(24);
    head.draw(&Text::new(
        p.title.clone(),
        (64, 4),
        (design::FONT, design::AXIS_TITLE_PX + 1.0)
            .into_font()
            .style(FontStyle::Bold)
            .color(&design::INK),
    ))
    .map_err(drawing)?;
    let mut builder = ChartBuilder::on(&body);
    builder
        .margin_right(10)
        .margin_top(4)
        .x_label_area_size(44)
        .y_label_area_size(64);
    match (p.x.scale, p.y.scale) {
        (Scale::Linear(x0, x1), Scale::Linear(y0, y1)) => {
            let chart = builder
                .build_cartesian_2d(x0..x1, y0..y1)
                .map_err(drawing)?;
            fill(chart, p)
        }
        (Scale::Linear(x0, x1), Scale::Log(y0, y1)) => {
            let chart = builder
                .build_cartesian_2d(
                    x0..x1,
                    (y0..y1).log_scale().with_key_points(log_ticks(y0, y1)),
                )
                .map_err(drawing)?;
            fill(chart, p)
        }
        (Scale::Log(x0, x1), Scale::Linear(y0, y1)) => {
            let chart = builder
                .build_cartesian_2d(
                    (x0..x1).log_scale().with_key_points(log_ticks(x0, x1)),
                    y0..y1,
                )
                .map_err(drawing)?;
            fill(chart, p)
        }
        (Scale::Log(x0, x1), Scale::Log(y0, y1)) => {
            let chart = builder
                .build_cartesian_2d(
                    (x0..x1).log_scale().with_key_points(log_ticks(x0, x1)),
                    (y0..y1).log_scale().with_key_points(log_ticks(y0, y1)),
                )
                .map_err(drawing)?;
            fill(chart, p)
        }
    }
}

/// Tick label text.
fn tick(t: Ticks, span: f64, v: f64) -> String {
    match t {
        Ticks::Date => date_label(v, span),
        Ticks::Negated => number(-v, span),
        Ticks::Plain => number(v, span),
    }
}

/// A number with decimals to suit the span of its axis.
pub(super) fn number(v: f64, span: f64) -> String {
    let v = if v == 0.0 { 0.0 } else { v }; // no "-0"
    let decimals = if span >= 20.0 || v.abs() >= 1000.0 {
        0
    } else if span >= 2.0 {
        1
    } else if span >= 0.2 {
        2
    } else {
        3
    };
    format!("{v:.decimals$}")
}

const MONTHS: [&str; 12] = [
    "Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec",
];

/// A date axis label: `2 Jun`, with the time where the axis spans less
/// than three days.
fn date_label(days: f64, span: f64) -> String {
    if !days.is_finite() {
        return String::new();
    }
    let whole = days.floor();
    let (y, m, d) = civil_from_days(whole as i64);
    let minutes = (((days - whole) * 1440.0).round() as i64).min(1439);
    let month = MONTHS[((m as usize).max(1) - 1).min(11)];
    if span < 3.0 {
        format!("{d} {month} {:02}:{:02}", minutes / 60, minutes % 60)
    } else if span > 400.0 {
        format!("{month} {y}")
    } else {
        format!("{d} {month}")
    }
}

/// Year, month, day of a count of days since 1970-01-01 (the proleptic
/// Gregorian calendar; the algorithm of Hinnant, "chrono-Compatible
/// Low-Level Date Algorithms").
pub(super) fn civil_from_days(z: i64) -> (i64, u32, u32) {
    let z = z + 719_468;
    let era = z.div_euclid(146_097);
    let doe = z.rem_euclid(146_097);
    let yoe = (doe - doe / 1460 + doe / 36_524 - doe / 146_096) / 365;
    let y = yoe + era * 400;
    let doy = doe - (365 * yoe + yoe / 4 - yoe / 100);
    let mp = (5 * doy + 2) / 153;
    let d = (doy - (153 * mp + 2) / 5 + 1) as u32;
    let m = if mp < 10 { mp + 3 } else { mp - 9 } as u32;
    (if m <= 2 { y + 1 } else { y }, m, d)
}

/// Days since 1970-01-01 of a date (the inverse of [`civil_from_days`]).
pub(super) fn days_from_civil(y: i64, m: u32, d: u32) -> i64 {
    let y = if m <= 2 { y - 1 } else { y };
    let era = y.div_euclid(400);
    let yoe = y.rem_euclid(400);
    let m = i64::from(m);
    let doy = (153 * (if m > 2 { m - 3 } else { m + 9 }) + 2) / 5 + i64::from(d) - 1;
    let doe = yoe * 365 + yoe / 4 - yoe / 100 + doy;
    era * 146_097 + doe - 719_468
}

fn span_of(s: Scale) -> f64 {
    match s {
        Scale::Linear(a, b) | Scale::Log(a, b) => (b - a).abs(),
    }
}

fn bounds(s: Scale) -> (f64, f64) {
    match s {
        Scale::Linear(a, b) | Scale::Log(a, b) => (a.min(b), a.max(b)),
    }
}

/// Draws the mesh, bands, rules, series and labels of a panel.
fn fill<X, Y>(
    mut chart: ChartContext<'_, SVGBackend<'_>, Cartesian2d<X, Y>>,
    p: &Panel,
) -> Result<(), ChartError>
where
    X: Ranged<ValueType = f64> + ValueFormatter<f64>,
    Y: Ranged<ValueType = f64> + ValueFormatter<f64>,
{
    let (xs, ys) = (span_of(p.x.scale), span_of(p.y.scale));
    let (xt, yt) = (p.x.ticks, p.y.ticks);
    let xf = move |v: &f64| tick(xt, xs, *v);
    let yf = move |v: &f64| tick(yt, ys, *v);
    chart
        .plotting_area()
        .fill(&design::PANEL)
        .map_err(drawing)?;
    chart
        .configure_mesh()
        .bold_line_style(design::GRID.stroke_width(1))
        .light_line_style(TRANSPARENT)
        .axis_style(design::MUTED.stroke_width(1))
        .label_style(font(design::TICK_PX, &design::MUTED))
        .axis_desc_style(font(design::AXIS_TITLE_PX, &design::INK))
        .x_desc(p.x.title.clone())
        .y_desc(p.y.title.clone())
        .x_labels(7)
        .y_labels(6)
        .x_label_formatter(&xf)
        .y_label_formatter(&yf)
        .draw()
        .map_err(drawing)?;
    let (x0, x1) = bounds(p.x.scale);
    let (y0, y1) = bounds(p.y.scale);
    for b in &p.bands {
        let (lo, hi) = (b.from.min(b.to), b.from.max(b.to));
        let corners = match b.along {
            Along::X => [(lo.max(x0), y0), (hi.min(x1), y1)],
            Along::Y => [(x0, lo.max(y0)), (x1, hi.min(y1))],
        };
        if corners[0].0 >= corners[1].0 || corners[0].1 >= corners[1].1 {
            continue;
        }
        chart
            .draw_series(std::iter::once(Rectangle::new(
                corners,
                b.colour.mix(b.opacity).filled(),
            )))
            .map_err(drawing)?;
        if let Some(t) = &b.text {
            let at = match b.along {
                Along::X => (corners[0].0, y1),
                Along::Y => (x0, if hi <= y1 && hi < y1 { hi } else { lo.max(y0) }),
            };
            chart
                .draw_series(std::iter::once(
                    EmptyElement::at(at)
                        + Text::new(
                            t.clone(),
                            (
                                6,
                                if b.along == Along::Y && hi < y1 {
                                    -16
                                } else {
                                    4
                                },
                            ),
                            font(design::TICK_PX, &b.colour),
                        ),
                ))
                .map_err(drawing)?;
        }
    }
    for r in &p.rules {
        let pts = match r.along {
            Along::X => vec![(r.at, y0), (r.at, y1)],
            Along::Y => vec![(x0, r.at), (x1, r.at)],
        };
        if !(r.at >= if r.along == Along::X { x0 } else { y0 }
            && r.at <= if r.along == Along::X { x1 } else { y1 })
        {
            continue;
        }
        let style = r.colour.stroke_width(r.width_px);
        if r.dashed {
            chart
                .draw_series(std::iter::once(DashedPathElement::new(pts, 6, 4, style)))
                .map_err(drawing)?;
        } else {
            chart
                .draw_series(std::iter::once(PathElement::new(pts, style)))
                .map_err(drawing)?;
        }
        if let Some(t) = &r.text {
            let at = match r.along {
                Along::X => (r.at, y1),
                Along::Y => (x0, r.at),
            };
            let offset = match r.along {
                Along::X => (5, 4),
                Along::Y => (6, -16),
            };
            chart
                .draw_series(std::iter::once(
                    EmptyElement::at(at)
                        + Text::new(t.clone(), offset, font(design::TICK_PX, &r.colour)),
                ))
                .map_err(drawing)?;
        }
    }
    for s in &p.series {
        let style = s.look.colour.stroke_width(s.width_px);
        for run in &s.runs {
            if s.line && run.len() > 1 {
                match (s.look.pattern, s.look.pattern.dash_px()) {
                    (_, Some((d, g))) => {
                        chart
                            .draw_series(DashedLineSeries::new(run.iter().copied(), d, g, style))
                            .map_err(drawing)?;
                    }
                    (Pattern::Dotted, None) => {
                        let c = s.look.colour;
                        let r = 0.9 + s.width_px as f64 * 0.45;
                        chart
                            .draw_series(DottedLineSeries::new(
                                run.iter().copied(),
                                0,
                                5,
                                move |p| Circle::new(p, r, c.filled()),
                            ))
                            .map_err(drawing)?;
                    }
                    _ => {
                        chart
                            .draw_series(LineSeries::new(run.iter().copied(), style))
                            .map_err(drawing)?;
                    }
                }
            }
            if s.markers {
                with_marker!(s.look.marker, s.look.colour, |shape| chart
                    .draw_series(run.iter().map(|&pt| EmptyElement::at(pt) + shape()))
                    .map_err(drawing))?;
            }
        }
    }
    for l in &p.labels {
        chart
            .draw_series(std::iter::once(
                EmptyElement::at(l.at)
                    + Circle::new((0, 0), 3, design::INK.filled())
                    + Text::new(l.text.clone(), (7, 2), font(design::TICK_PX, &design::INK)),
            ))
            .map_err(drawing)?;
    }
    if let Some(n) = &p.empty_note {
        let area = chart.plotting_area();
        let mid = match (p.x.scale, p.y.scale) {
            (Scale::Log(..), _) | (_, Scale::Log(..)) => {
                let g = |s: Scale| match s {
                    Scale::Log(a, b) => (a * b).sqrt(),
                    Scale::Linear(a, b) => (a + b) / 2.0,
                };
                (g(p.x.scale), g(p.y.scale))
            }
            _ => ((x0 + x1) / 2.0, (y0 + y1) / 2.0),
        };
        area.draw(
            &(EmptyElement::at(mid)
                + Text::new(
                    n.clone(),
                    (0, 0),
                    italic(design::LEGEND_PX, &design::MUTED)
                        .pos(Pos::new(HPos::Center, VPos::Center)),
                )),
        )
        .map_err(drawing)?;
    }
    Ok(())
}

/// A linear scale over `values`, padded by `pad` of the span (at least
/// `min_span` wide), or `fallback` where there are none.
pub(super) fn linear_over(
    values: impl Iterator<Item = f64>,
    pad: f64,
    min_span: f64,
    fallback: (f64, f64),
) -> Scale {
    let (lo, hi) = values
        .filter(|v| v.is_finite())
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), v| {
            (a.min(v), b.max(v))
        });
    if !lo.is_finite() {
        return Scale::Linear(fallback.0, fallback.1);
    }
    let span = (hi - lo).max(min_span);
    let mid = (hi + lo) / 2.0;
    let half = span / 2.0 * (1.0 + 2.0 * pad);
    Scale::Linear(mid - half, mid + half)
}

/// The ticks of a log axis from `lo` to `hi`: 1, 2 and 5 times each power
/// of ten inside it (plotters alone marks the powers of ten only, which
/// leaves an axis of a decade or so with a single label).
pub(super) fn log_ticks(lo: f64, hi: f64) -> Vec<f64> {
    let mut out = Vec::new();
    if !(lo > 0.0 && hi > lo && lo.is_finite() && hi.is_finite()) {
        return out;
    }
    let first = lo.log10().floor() as i32;
    let last = hi.log10().ceil() as i32;
    for k in first..=last.min(first + 12) {
        for m in [1.0, 2.0, 5.0] {
            let v = m * 10f64.powi(k);
            if v >= lo && v <= hi {
                out.push(v);
            }
        }
    }
    out
}

/// A log scale over the positive `values`, a little beyond them (at least
/// 1.2 decades wide), or `fallback`.
pub(super) fn log_over(values: impl Iterator<Item = f64>, fallback: (f64, f64)) -> Scale {
    let (lo, hi) = values
        .filter(|v| v.is_finite() && *v > 0.0)
        .fold((f64::INFINITY, f64::NEG_INFINITY), |(a, b), v| {
            (a.min(v), b.max(v))
        });
    if !lo.is_finite() {
        return Scale::Log(fallback.0, fallback.1);
    }
    let (l, h) = (lo.log10() - 0.08, hi.log10() + 0.08);
    let (l, h) = if h - l < 1.2 {
        let mid = (l + h) / 2.0;
        (mid - 0.6, mid + 0.6)
    } else {
        (l, h)
    };
    Scale::Log(10f64.powf(l), 10f64.powf(h))
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn dates_round_trip() {
        for (y, m, d) in [(1970, 1, 1), (2031, 6, 2), (2000, 2, 29), (1969, 12, 31)] {
            let z = days_from_civil(y, m, d);
            assert_eq!(civil_from_days(z), (y, m, d));
        }
        assert_eq!(days_from_civil(1970, 1, 1), 0);
        // 2000-03-01 is day 11017 since 1970-01-01 (common practice: Unix time 951868800 / 86400).
        assert_eq!(days_from_civil(2000, 3, 1), 11017);
    }

    #[test]
    fn log_ticks_are_one_two_five() {
        assert_eq!(
            log_ticks(300.0, 6000.0),
            vec![500.0, 1000.0, 2000.0, 5000.0]
        );
        assert!(log_ticks(-1.0, 10.0).is_empty());
    }

    #[test]
    fn log_scale_pads_a_narrow_range() {
        let Scale::Log(a, b) = log_over([500.0, 600.0].into_iter(), (1.0, 10.0)) else {
            panic!("not a log scale");
        };
        assert!(a < 500.0 && b > 600.0);
        let Scale::Log(a, b) = log_over(std::iter::empty(), (1.0, 10.0)) else {
            panic!("not a log scale");
        };
        assert_eq!((a, b), (1.0, 10.0));
    }
}
