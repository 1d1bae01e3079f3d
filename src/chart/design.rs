//! The look of travertine's charts, in one place: palette, line patterns,
//! markers, sizes and type.
//!
//! - **Colours.** The eight colours of Okabe & Ito (2008, "Color Universal
//!   Design", J*FLY), chosen so that the common kinds of colour blindness
//!   still tell them apart. [`SERIES`] takes them in an order that
//!   alternates dark and light (by relative luminance), so that two
//!   neighbouring lines also differ in grayscale.
//! - **Patterns.** Each series also has its own dash pattern
//!   ([`Pattern`]) and, where points are drawn, its own marker shape
//!   ([`Marker`]), so that a chart printed in grayscale or read by someone
//!   who sees no colour at all still keeps its lines apart.
//! - **Page.** A pale stone-coloured page with white panels; the title is
//!   set left, with a line of conditions under it in grey; legends sit in a
//!   strip under the panels, never over the data; flag limits are pale
//!   hatched-looking bands edged by a thin dashed line.

use plotters::style::RGBColor;

/// Okabe & Ito (2008) blue, #0072B2.
pub const BLUE: RGBColor = RGBColor(0x00, 0x72, 0xB2);
/// Okabe & Ito (2008) orange, #E69F00.
pub const ORANGE: RGBColor = RGBColor(0xE6, 0x9F, 0x00);
/// Okabe & Ito (2008) vermillion, #D55E00.
pub const VERMILLION: RGBColor = RGBColor(0xD5, 0x5E, 0x00);
/// Okabe & Ito (2008) sky blue, #56B4E9.
pub const SKY_BLUE: RGBColor = RGBColor(0x56, 0xB4, 0xE9);
/// Okabe & Ito (2008) bluish green, #009E73.
pub const BLUISH_GREEN: RGBColor = RGBColor(0x00, 0x9E, 0x73);
/// Okabe & Ito (2008) reddish purple, #CC79A7.
pub const REDDISH_PURPLE: RGBColor = RGBColor(0xCC, 0x79, 0xA7);
/// Okabe & Ito (2008) yellow, #F0E442 (for fills only: too light for lines).
pub const YELLOW: RGBColor = RGBColor(0xF0, 0xE4, 0x42);
/// Okabe & Ito (2008) black.
pub const INK: RGBColor = RGBColor(0x1A, 0x1A, 0x1A);

/// The page behind the panels: pale stone.
pub const PAGE: RGBColor = RGBColor(0xF4, 0xF1, 0xEA);
/// The panels.
pub const PANEL: RGBColor = RGBColor(0xFF, 0xFF, 0xFF);
/// Grid lines.
pub const GRID: RGBColor = RGBColor(0xE2, 0xDE, 0xD5);
/// Secondary text (conditions, notes).
pub const MUTED: RGBColor = RGBColor(0x5C, 0x58, 0x50);
/// The band of a flag limit.
pub const BAND: RGBColor = VERMILLION;
/// The sample's pH marker and its uncertainty band.
pub const MARKER: RGBColor = INK;

/// The series colours, in the order they are given out: dark and light
/// alternate (relative luminance about 0.15, 0.43, 0.20, 0.27, 0.10, 0.40,
/// 0.01), so neighbours differ in grayscale as well as in hue.
pub const SERIES: [RGBColor; 7] = [
    BLUE,
    ORANGE,
    BLUISH_GREEN,
    REDDISH_PURPLE,
    VERMILLION,
    SKY_BLUE,
    INK,
];

/// The dash pattern of a line.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[non_exhaustive]
pub enum Pattern {
    /// Unbroken.
    Solid,
    /// Long dashes.
    LongDash,
    /// Short dashes.
    ShortDash,
    /// Dots.
    Dotted,
    /// Very long dashes with short gaps.
    Rail,
}

impl Pattern {
    /// Dash and gap lengths, px (`None` for solid and dotted lines).
    pub fn dash_px(self) -> Option<(u32, u32)> {
        match self {
            Pattern::Solid | Pattern::Dotted => None,
            Pattern::LongDash => Some((11, 5)),
            Pattern::ShortDash => Some((4, 4)),
            Pattern::Rail => Some((22, 4)),
        }
    }
}

/// The patterns, in the order they are given out.
pub const PATTERNS: [Pattern; 5] = [
    Pattern::Solid,
    Pattern::LongDash,
    Pattern::ShortDash,
    Pattern::Dotted,
    Pattern::Rail,
];

/// The marker shape of a series' points.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[non_exhaustive]
pub enum Marker {
    /// A filled circle.
    Disc,
    /// A filled triangle.
    Triangle,
    /// A hollow square.
    Square,
    /// A cross.
    Cross,
    /// A hollow circle.
    Ring,
}

/// The markers, in the order they are given out.
pub const MARKERS: [Marker; 5] = [
    Marker::Disc,
    Marker::Triangle,
    Marker::Square,
    Marker::Cross,
    Marker::Ring,
];

/// The look of the `i`-th series of a chart: colour, pattern and marker.
///
/// ```
/// use travertine::chart::design::{look, Pattern};
/// assert_eq!(look(0).pattern, Pattern::Solid);
/// assert_ne!(look(0).colour, look(1).colour);
/// assert_ne!(look(1).pattern, look(2).pattern);
/// ```
pub fn look(i: usize) -> Look {
    Look {
        colour: SERIES[i % SERIES.len()],
        pattern: PATTERNS[i % PATTERNS.len()],
        marker: MARKERS[i % MARKERS.len()],
    }
}

/// The look of one series.
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub struct Look {
    /// Its colour.
    pub colour: RGBColor,
    /// Its dash pattern.
    pub pattern: Pattern,
    /// Its marker shape.
    pub marker: Marker,
}

/// The type family of every text (the SVG names it; a viewer picks the
/// face).
pub const FONT: &str = "sans-serif";
/// Title size, px.
pub const TITLE_PX: f64 = 22.0;
/// Size of the line under the title, px.
pub const SUBTITLE_PX: f64 = 13.0;
/// Axis titles, px.
pub const AXIS_TITLE_PX: f64 = 14.0;
/// Tick labels, px.
pub const TICK_PX: f64 = 12.0;
/// Legend and notes, px.
pub const LEGEND_PX: f64 = 13.0;
/// Line width of a series, px.
pub const LINE_PX: u32 = 2;
