//! The speciation chart: the fraction of each species of the carbonate
//! system (and, on request, of borate, ammonia and phosphate) against pH.
//!
//! At a given [H+] on the working scale of the constants (h), with the
//! constants of the sample's own temperature, salinity, pressure and medium
//! (the constants of [`crate::medium`]; in fresh water with the activity
//! coefficients of the state's ionic strength):
//!
//! ```text
//! D = h² + K1 h + K1 K2
//! CO2* = h²/D        HCO3⁻ = K1 h/D        CO3²⁻ = K1 K2/D
//! B(OH)4⁻ = KB/(KB + h)                    NH3 = KNH4/(KNH4 + h)
//! P = h³ + KP1 h² + KP1 KP2 h + KP1 KP2 KP3
//! H3PO4 = h³/P   H2PO4⁻ = KP1 h²/P   HPO4²⁻ = KP1 KP2 h/P   PO4³⁻ = KP1 KP2 KP3/P
//! ```
//!
//! (the standard forms of an acid's species fractions; e.g. Zeebe &
//! Wolf-Gladrow 2001, "CO2 in Seawater", ch. 1). CO2* and HCO3⁻ are equal
//! where h = K1, HCO3⁻ and CO3²⁻ where h = K2 (to a close approximation:
//! exactly where K1 h = K1 K2): the crossings are pK1 and pK2 on the
//! chart's pH scale. The fractions are of free species: the calcium ion
//! pairs of fresh water are not drawn.

use super::design::{self, Look};
use super::draw::{
    self, Along, Axis, Band, Entry, Label, Panel, Rule, Scale, Series, Swatch, Ticks,
};
use super::{Chart, ChartError};
use crate::base::units::Amount;
use crate::medium::Constants;
use crate::properties::scales::PhScale;
use crate::sample::Medium;
use crate::State;

/// A species drawn on the speciation chart.
#[derive(Debug, Clone, Copy, PartialEq, Eq)]
#[non_exhaustive]
pub enum Species {
    /// Dissolved CO2 with carbonic acid, CO2*.
    Co2,
    /// Bicarbonate, HCO3⁻.
    Bicarbonate,
    /// Carbonate, CO3²⁻.
    Carbonate,
    /// Borate, B(OH)4⁻ (of total boron).
    Borate,
    /// Un-ionised ammonia, NH3 (of NH3 + NH4⁺).
    Ammonia,
    /// Phosphoric acid, H3PO4.
    PhosphoricAcid,
    /// Dihydrogen phosphate, H2PO4⁻.
    DihydrogenPhosphate,
    /// Hydrogen phosphate, HPO4²⁻.
    HydrogenPhosphate,
    /// Phosphate, PO4³⁻.
    Phosphate,
}

impl Species {
    /// The label on the chart.
    ///
    /// ```
    /// use travertine::chart::Species;
    /// assert_eq!(Species::Bicarbonate.label(), "HCO3⁻");
    /// ```
    pub fn label(self) -> &'static str {
        match self {
            Species::Co2 => "CO2*",
            Species::Bicarbonate => "HCO3⁻",
            Species::Carbonate => "CO3²⁻",
            Species::Borate => "B(OH)4⁻ of total boron",
            Species::Ammonia => "NH3 of NH3 + NH4⁺",
            Species::PhosphoricAcid => "H3PO4",
            Species::DihydrogenPhosphate => "H2PO4⁻",
            Species::HydrogenPhosphate => "HPO4²⁻",
            Species::Phosphate => "PO4³⁻",
        }
    }
}

/// The other acid systems to draw beside the carbonate system.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default)]
#[non_exhaustive]
pub struct Include {
    /// Borate: B(OH)4⁻ as a fraction of total boron.
    pub borate: bool,
    /// Ammonia: NH3 as a fraction of NH3 + NH4⁺.
    pub ammonia: bool,
    /// Phosphate: its four species.
    pub phosphate: bool,
}

impl std::str::FromStr for Include {
    type Err = ChartError;

    /// A comma-separated list of `borate`, `ammonia`, `phosphate`.
    ///
    /// ```
    /// use travertine::chart::Include;
    /// let i: Include = "borate, ammonia".parse()?;
    /// assert!(i.borate && i.ammonia && !i.phosphate);
    /// assert!("iron".parse::<Include>().is_err());
    /// # Ok::<(), travertine::chart::ChartError>(())
    /// ```
    fn from_str(s: &str) -> Result<Self, ChartError> {
        let mut i = Include::default();
        for name in s.split(',').map(str::trim).filter(|n| !n.is_empty()) {
            match name.to_ascii_lowercase().as_str() {
                "borate" | "boron" => i.borate = true,
                "ammonia" | "ammonium" => i.ammonia = true,
                "phosphate" | "phosphorus" => i.phosphate = true,
                _ => {
                    return Err(ChartError::BadOption {
                        option: "--include",
                        value: name.to_string(),
                        why:
                            "is not a system the chart draws; accepted: borate, ammonia, phosphate"
                                .into(),
                    })
                }
            }
        }
        Ok(i)
    }
}

/// The settings of a speciation chart.
///
/// ```
/// use travertine::chart::{Include, SpeciationOptions};
/// use travertine::PhScale;
/// let o = SpeciationOptions::default()
///     .with_include("phosphate".parse::<Include>()?)
///     .with_ph_scale(PhScale::Nbs)
///     .with_ph_range(4.0, 11.0)?
///     .with_ph_uncertainty(0.02)?;
/// assert_eq!(o.ph_range(), (4.0, 11.0));
/// assert!(SpeciationOptions::default().with_ph_uncertainty(-1.0).is_err());
/// # Ok::<(), travertine::chart::ChartError>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub struct SpeciationOptions {
    include: Include,
    ph_scale: Option<PhScale>,
    ph_range: (f64, f64),
    ph_u: Option<f64>,
}

impl Default for SpeciationOptions {
    fn default() -> Self {
        SpeciationOptions {
            include: Include::default(),
            ph_scale: None,
            ph_range: (3.0, 12.0),
            ph_u: None,
        }
    }
}

impl SpeciationOptions {
    /// With other acid systems drawn too.
    #[must_use]
    pub fn with_include(mut self, include: Include) -> Self {
        self.include = include;
        self
    }

    /// With the pH axis on this scale (default: the medium's own, NBS in
    /// fresh water and total in saline water).
    #[must_use]
    pub fn with_ph_scale(mut self, scale: PhScale) -> Self {
        self.ph_scale = Some(scale);
        self
    }

    /// With the pH axis from `low` to `high` (default 3 to 12; it is
    /// widened to take in the sample's pH).
    ///
    /// # Errors
    /// [`ChartError::BadOption`] unless 0 ≤ low < high ≤ 14, at least one
    /// pH unit apart.
    pub fn with_ph_range(mut self, low: f64, high: f64) -> Result<Self, ChartError> {
        if !(low.is_finite() && high.is_finite() && low >= 0.0 && high <= 14.0 && high - low >= 1.0)
        {
            return Err(ChartError::BadOption {
                option: "--ph-range",
                value: format!("{low}..{high}"),
                why: "is not a range of pH within 0 to 14 at least one unit wide".into(),
            });
        }
        self.ph_range = (low, high);
        Ok(self)
    }

    /// With the standard uncertainty of the sample's pH, drawn as a band of
    /// ±1 standard uncertainty around its marker.
    ///
    /// # Errors
    /// [`ChartError::BadOption`] outside 0 < u ≤ 2 pH units.
    pub fn with_ph_uncertainty(mut self, u: f64) -> Result<Self, ChartError> {
        if !(u.is_finite() && u > 0.0 && u <= 2.0) {
            return Err(ChartError::BadOption {
                option: "pH uncertainty",
                value: u.to_string(),
                why: "is outside the accepted range: more than 0, at most 2 pH units".into(),
            });
        }
        self.ph_u = Some(u);
        Ok(self)
    }

    /// The pH range asked for.
    pub fn ph_range(&self) -> (f64, f64) {
        self.ph_range
    }
}

/// The numbers behind a speciation chart.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub struct SpeciationData {
    /// The pH scale of the axis.
    pub ph_scale: PhScale,
    /// The pH values, evenly spaced (0.01 apart).
    pub ph: Vec<f64>,
    /// Each species drawn, with its fraction at each pH.
    pub curves: Vec<(Species, Vec<f64>)>,
    /// pK1 on the axis scale: where CO2* and HCO3⁻ cross.
    pub pk1: f64,
    /// pK2 on the axis scale: where HCO3⁻ and CO3²⁻ cross.
    pub pk2: f64,
    /// The sample's pH on the axis scale.
    pub sample_ph: f64,
    /// The constants used.
    pub constants: Constants,
}

/// The constants of the state's water at its own conditions (in fresh
/// water at the state's ionic strength), with every system `include`
/// asks for evaluated (a system whose total is zero gets a trace total of
/// 1 nmol/kg, so that its constant is evaluated; it changes nothing else).
fn constants_for(state: &State, include: Include) -> Result<Constants, ChartError> {
    let mut water = state.water_sample().clone();
    if water.medium() == Medium::Fresh && water.fresh_options().ionic_strength.is_none() {
        water = water.with_ionic_strength(state.ionic_strength)?;
    }
    let k = water.constants()?;
    let trace = Amount::PerKg(1e-9);
    let mut composition = *water.composition();
    let mut again = false;
    if include.borate && k.kb() <= 0.0 {
        composition = composition.with_boron(trace)?;
        again = true;
    }
    if include.ammonia && k.knh4() <= 0.0 {
        composition = composition.with_ammonia(trace)?;
        again = true;
    }
    if include.phosphate && k.kp1() <= 0.0 {
        composition = composition.with_phosphate(trace)?;
        again = true;
    }
    if !again {
        return Ok(k);
    }
    Ok(water.with_composition(composition).constants()?)
}

impl SpeciationData {
    /// The fractions for a solved state.
    ///
    /// # Errors
    /// [`ChartError::Chemistry`] if the constants cannot be evaluated.
    ///
    /// ```
    /// use travertine::chart::{SpeciationData, SpeciationOptions};
    /// use travertine::{Conditions, Measured, Water};
    /// let sea = Water::saline(Conditions::new(25.0, 35.0)?)?;
    /// let s = sea.solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
    /// let d = SpeciationData::new(&s, &SpeciationOptions::default())?;
    /// // Lueker et al. (2000) pK1 on the total scale at 25 °C, S = 35: 5.8472 (Guide check value)
    /// assert!((d.pk1 - 5.8472).abs() < 1e-3);
    /// # Ok::<(), travertine::chart::ChartError>(())
    /// ```
    pub fn new(state: &State, options: &SpeciationOptions) -> Result<Self, ChartError> {
        let scale = options.ph_scale.unwrap_or(match state.medium {
            Medium::Fresh => PhScale::Nbs,
            Medium::Saline => PhScale::Total,
        });
        let k = constants_for(state, options.include)?;
        let sample_ph = state.ph(scale);
        let (mut lo, mut hi) = options.ph_range;
        if sample_ph.is_finite() {
            let u = options.ph_u.unwrap_or(0.0);
            lo = lo.min((sample_ph - u - 0.5).floor()).max(0.0);
            hi = hi.max((sample_ph + u + 0.5).ceil()).min(14.0);
        }
        let n = ((hi - lo) / 0.01).round() as usize;
        let ph: Vec<f64> = (0..=n).map(|i| lo + i as f64 * 0.01).collect();
        let hs: Vec<f64> = ph.iter().map(|p| k.h_from_ph(*p, scale)).collect();
        let (k1, k2) = (k.k1(), k.k2());
        let mut curves = Vec::new();
        let carbon = |f: &dyn Fn(f64, f64) -> f64| -> Vec<f64> {
            hs.iter().map(|&h| f(h, h * h + k1 * h + k1 * k2)).collect()
        };
        curves.push((Species::Co2, carbon(&|h, d| h * h / d)));
        curves.push((Species::Bicarbonate, carbon(&|h, d| k1 * h / d)));
        curves.push((Species::Carbonate, carbon(&|_, d| k1 * k2 / d)));
        if options.include.borate {
            let kb = k.kb();
            curves.push((Species::Borate, hs.iter().map(|&h| kb / (kb + h)).collect()));
        }
        if options.include.ammonia {
            let kn = k.knh4();
            curves.push((
                Species::Ammonia,
                hs.iter().map(|&h| kn / (kn + h)).collect(),
            ));
        }
        if options.include.phosphate {
            let (a, b, c) = (k.kp1(), k.kp2(), k.kp3());
            let p = |h: f64| h * h * h + a * h * h + a * b * h + a * b * c;
            let part =
                |f: &dyn Fn(f64) -> f64| -> Vec<f64> { hs.iter().map(|&h| f(h) / p(h)).collect() };
            curves.push((Species::PhosphoricAcid, part(&|h| h * h * h)));
            curves.push((Species::DihydrogenPhosphate, part(&|h| a * h * h)));
            curves.push((Species::HydrogenPhosphate, part(&|h| a * b * h)));
            curves.push((Species::Phosphate, part(&|_| a * b * c)));
        }
        Ok(SpeciationData {
            ph_scale: scale,
            ph,
            curves,
            pk1: k.ph_from_h(k1, scale),
            pk2: k.ph_from_h(k2, scale),
            sample_ph,
            constants: k,
        })
    }
}

/// A pH scale as written on the chart.
fn scale_label(s: PhScale) -> &'static str {
    match s {
        PhScale::Total => "total scale",
        PhScale::Seawater => "sea-water scale",
        PhScale::Free => "free scale",
        PhScale::Nbs => "NBS scale",
    }
}

/// The speciation chart of a solved sample.
///
/// # Errors
/// [`ChartError::Chemistry`] if the constants cannot be evaluated;
/// [`ChartError::Draw`] if the drawing fails.
///
/// ```
/// use travertine::chart::{speciation, Include, SpeciationOptions};
/// use travertine::{Conditions, Measured, Water};
/// let sea = Water::saline(Conditions::new(12.0, 33.0)?)?;
/// let s = sea.solve(Measured::alkalinity_umol_kg(2250.0)?, Measured::dic_umol_kg(2050.0)?)?;
/// let options = SpeciationOptions::default()
///     .with_include("borate".parse::<Include>()?)
///     .with_ph_uncertainty(0.015)?;
/// let chart = speciation(&s, &options)?;
/// assert!(chart.svg().contains("pK2"));
/// assert!(chart.svg().contains("±1 standard uncertainty"));
/// # Ok::<(), travertine::chart::ChartError>(())
/// ```
pub fn speciation(state: &State, options: &SpeciationOptions) -> Result<Chart, ChartError> {
    let data = SpeciationData::new(state, options)?;
    let scale = data.ph_scale;
    let (lo, hi) = (data.ph[0], *data.ph.last().unwrap_or(&data.ph[0]));
    let mut series = Vec::new();
    let mut legend = Vec::new();
    for (i, (sp, f)) in data.curves.iter().enumerate() {
        let look: Look = design::look(i);
        let main = matches!(sp, Species::Co2 | Species::Bicarbonate | Species::Carbonate);
        series.push(Series {
            look,
            runs: vec![data.ph.iter().copied().zip(f.iter().copied()).collect()],
            line: true,
            markers: false,
            width_px: if main { 3 } else { 2 },
        });
        legend.push(Entry {
            swatch: Swatch::Line {
                look,
                marker: false,
            },
            text: sp.label().to_string(),
        });
    }
    let ph_text = format!("sample pH {:.2}", data.sample_ph);
    let mut bands = Vec::new();
    if let Some(u) = options.ph_u {
        bands.push(Band {
            along: Along::X,
            from: data.sample_ph - u,
            to: data.sample_ph + u,
            colour: design::SKY_BLUE,
            opacity: 0.35,
            text: None,
        });
        legend.push(Entry {
            swatch: Swatch::Band(design::SKY_BLUE, 0.35),
            text: format!("±1 standard uncertainty of pH (±{u:.3})"),
        });
    }
    let rules = vec![Rule {
        along: Along::X,
        at: data.sample_ph,
        colour: design::MARKER,
        dashed: false,
        width_px: 2,
        text: Some(ph_text.clone()),
    }];
    legend.push(Entry {
        swatch: Swatch::Rule(design::MARKER),
        text: format!("{ph_text} ({})", scale_label(scale)),
    });
    let labels = vec![
        Label {
            at: (data.pk1, 0.5),
            text: format!("pK1 {:.2}", data.pk1),
        },
        Label {
            at: (data.pk2, 0.5),
            text: format!("pK2 {:.2}", data.pk2),
        },
    ];
    let panel = Panel {
        title: "Fraction of each species".into(),
        x: Axis {
            scale: Scale::Linear(lo, hi),
            title: format!("pH ({})", scale_label(scale)),
            ticks: Ticks::Plain,
        },
        y: Axis {
            scale: Scale::Linear(0.0, 1.04),
            title: "fraction of the total (0 to 1)".into(),
            ticks: Ticks::Plain,
        },
        series,
        bands,
        rules,
        labels,
        empty_note: None,
    };
    let strength = match state.medium {
        Medium::Fresh => format!("ionic strength {:.4} mol/kg", state.ionic_strength),
        Medium::Saline => format!("salinity {:.2}", state.salinity),
    };
    let subtitle = format!(
        "{} water at {:.1} °C, {strength}, {:.0} dbar; K1 and K2: {}",
        state.medium.name(),
        state.temperature_c,
        state.pressure_dbar,
        fits_text(state),
    );
    let size = (960, 640);
    let caption = vec![format!(
        "Fractions of free species at the sample's conditions; pK1 and pK2 on the {}.",
        scale_label(scale)
    )];
    let svg = draw::page(
        size,
        "Carbonate species against pH",
        &subtitle,
        &legend,
        &caption,
        |area| draw::panel(area, &panel),
    )?;
    Ok(Chart {
        svg,
        width_px: size.0,
        height_px: size.1,
        notes: Vec::new(),
    })
}

/// The fits of the carbonate constants, as the subtitle names them.
fn fits_text(state: &State) -> String {
    serde_json::to_value(state.fits_used)
        .ok()
        .and_then(|v| {
            v.as_object().map(|o| {
                o.iter()
                    .filter(|(k, _)| k.as_str() == "carbonic")
                    .filter_map(|(_, v)| v.as_str().map(str::to_string))
                    .collect::<Vec<_>>()
                    .join(", ")
            })
        })
        .filter(|s| !s.is_empty())
        .unwrap_or_else(|| "see `solve --json`".into())
}
