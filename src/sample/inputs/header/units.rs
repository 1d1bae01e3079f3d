//! Reading the unit of a header or of a cell: temperature, pH scale and
//! conductivity words, and the units of the trade, for each field.

use super::{normalise, Column, Input, Reading};
use crate::base::units::{Unit, MOLAR_UNITS};
use crate::properties::scales::PhScale;
use crate::sample::inputs::NameHint;
use crate::sample::measured::Parameter;

/// Whether some field would read `unit` as a unit.
pub(super) fn is_unit_text(unit: &str) -> bool {
    Unit::parse(unit).is_some()
        || temperature_unit(unit).is_some()
        || scale_word(unit).is_some()
        || conductivity_unit(unit).is_some()
        || matches!(
            unit,
            "psu"
                | "pss"
                | "pss-78"
                | "ppt"
                | "g/kg"
                | "‰"
                | "dbar"
                | "db"
                | "bar"
                | "hpa"
                | "mbar"
                | "mmhg"
                | "kpa"
                | "atm"
                | "m s"
                | "m/s"
                | "km h"
                | "km/h"
                | "ppmv"
                | "ft"
                | "km"
                | "km2"
                | "ha"
                | "cm h"
                | "cm/h"
                | "m d"
                | "m/d"
                | "g/l"
                | "%"
                | "m"
        )
}

pub(super) fn temperature_unit(u: &str) -> Option<Reading> {
    match u {
        "c" | "degc" | "deg c" | "celsius" | "degrees c" | "deg. c" => Some(Reading::Number {
            scale: 1.0,
            offset: 0.0,
            label: "°C",
        }),
        "f" | "degf" | "deg f" | "fahrenheit" | "degrees f" | "deg. f" => Some(Reading::Number {
            scale: 5.0 / 9.0,
            offset: -32.0 * 5.0 / 9.0,
            label: "°F",
        }),
        "k" | "kelvin" => Some(Reading::Number {
            scale: 1.0,
            offset: -273.15,
            label: "K",
        }),
        _ => None,
    }
}

pub(super) fn scale_word(u: &str) -> Option<Option<PhScale>> {
    let u = u
        .trim_end_matches(" scale")
        .trim_start_matches("scale ")
        .trim();
    match u {
        "nbs" | "nist" => Some(Some(PhScale::Nbs)),
        "total" | "t" => Some(Some(PhScale::Total)),
        "seawater" | "sea water" | "sws" => Some(Some(PhScale::Seawater)),
        "free" | "f" => Some(Some(PhScale::Free)),
        "su" | "s.u." | "units" | "std units" | "standard units" => Some(None),
        _ => None,
    }
}

pub(super) fn conductivity_unit(u: &str) -> Option<(f64, bool)> {
    let compact: String = u.chars().filter(|c| !c.is_whitespace()).collect();
    let (scale, rest) = if let Some(r) = compact.strip_prefix("us/cm") {
        (1.0, r)
    } else if let Some(r) = compact.strip_prefix("ms/cm") {
        (1000.0, r)
    } else {
        return None;
    };
    match rest {
        "" => Some((scale, false)),
        "@25c" | "at25c" | "25c" | "@25" | "at25" => Some((scale, true)),
        _ => None,
    }
}

/// The reading of `field` with the unit text `unit` (normalised; empty
/// when the header gives none), or what is wrong with it.
pub(super) fn interpret(field: Input, hint: NameHint, unit: &str) -> Result<Reading, String> {
    let missing = || format!("the header gives no unit for {}", field.name());
    let unknown = || {
        format!(
            "`{unit}` is not a unit travertine knows for {}",
            field.name()
        )
    };
    match field {
        Input::Carbon(Parameter::Ph) => scale_word(unit)
            .or(if unit.is_empty() { Some(None) } else { None })
            .map(Reading::Ph)
            .ok_or_else(|| format!("`{unit}` is not a pH scale")),
        Input::Carbon(p) => {
            if unit.is_empty() {
                return Err(missing());
            }
            let ppm = (p != Parameter::Xco2).then(|| ppm_as_mg_l(unit)).flatten();
            let parsed = Unit::parse(ppm.as_deref().unwrap_or(unit)).ok_or_else(unknown)?;
            let resolved = match (p, parsed) {
                (Parameter::Co2, Unit::MgPerL) => Unit::MgPerLCO2,
                (Parameter::Hco3, Unit::MgPerL) => Unit::MgPerLHCO3,
                (Parameter::Co3, Unit::MgPerL) => Unit::MgPerLCO3,
                (Parameter::Alkalinity, Unit::MgPerL) => {
                    return Err(format!(
                    "`{unit}` does not say what alkalinity is expressed as (write mg/L as CaCO3)"
                ))
                }
                (Parameter::Dic, Unit::MgPerL) => {
                    return Err(format!(
                        "`{unit}` does not say what DIC is expressed as (write mg/L as C)"
                    ))
                }
                (_, u) => u,
            };
            if p.accepted_units().contains(&resolved) {
                Ok(Reading::Quantity(resolved))
            } else {
                Err(format!("`{unit}` is not a unit of {}", p.name()))
            }
        }
        Input::Temperature => {
            if unit.is_empty() {
                return Err(missing());
            }
            temperature_unit(unit).ok_or_else(unknown)
        }
        Input::Salinity => match unit {
            "" | "psu" | "pss" | "pss-78" | "pss78" | "practical" => Ok(Reading::PLAIN),
            // Read as practical salinity, with a note (see `unit_note`).
            "ppt" | "g/kg" | "‰" | "permil" | "ppth" => Ok(Reading::Number {
                scale: 1.0,
                offset: 0.0,
                label: "ppt",
            }),
            _ => Err(unknown()),
        },
        Input::Conductivity => {
            if unit.is_empty() {
                return Err(missing());
            }
            let (scale, at_25) = conductivity_unit(unit).ok_or_else(unknown)?;
            Ok(Reading::Conductivity {
                scale,
                specific: at_25 || hint == NameHint::Specific,
            })
        }
        Input::Pressure => match unit {
            "" => Err(missing()),
            "dbar" | "db" | "decibar" => Ok(Reading::Number {
                scale: 1.0,
                offset: 0.0,
                label: "dbar",
            }),
            "bar" => Ok(Reading::Number {
                scale: 10.0,
                offset: 0.0,
                label: "bar",
            }),
            _ => Err(unknown()),
        },
        // The barometric pressure and the inputs of the exchange with the
        // air: the units of the list of inputs. Where the header has none,
        // the base unit where a bare number has one.
        numbered if !numbered.number_units().is_empty() => {
            // `km²` loses its `²` in a normalised header.
            let unit = if field == Input::LakeArea && unit == "km" {
                "km2"
            } else {
                unit
            };
            if unit.is_empty() {
                return match field.number_units().first() {
                    Some(base) if !field.unit_required() => Ok(Reading::Number {
                        scale: 1.0,
                        offset: 0.0,
                        label: base.label,
                    }),
                    _ => Err(missing()),
                };
            }
            let u = field.number_unit(unit).ok_or_else(unknown)?;
            Ok(Reading::Number {
                scale: u.to_base,
                offset: 0.0,
                label: u.label,
            })
        }
        Input::Total(t) => {
            if unit.is_empty() {
                return Err(missing());
            }
            let ppm = ppm_as_mg_l(unit);
            let parsed = Unit::parse(ppm.as_deref().unwrap_or(unit)).ok_or_else(unknown)?;
            let resolved = match (parsed, hint) {
                (Unit::MgPerL, NameHint::Nitrogen) => Unit::MgPerLN,
                (Unit::MgPerL, NameHint::Phosphorus) => Unit::MgPerLP,
                (Unit::MgPerL, NameHint::CalciumHardness) => {
                    return Err(format!(
                        "`{unit}` does not say what calcium hardness is expressed as (write mg/L \
                         as CaCO3)"
                    ))
                }
                (Unit::MgPerL, _) => t.own_mass_unit().ok_or_else(|| {
                    format!(
                        "`{unit}` does not say what {} is expressed as (write, for example, {})",
                        t.field().name(),
                        t.units().last().map_or("umol/kg", |u| u.spelling())
                    )
                })?,
                (u, _) => u,
            };
            let ok = if hint == NameHint::CalciumHardness {
                resolved == Unit::MgPerLCaCO3 || MOLAR_UNITS.contains(&resolved)
            } else {
                t.units().contains(&resolved)
            };
            if ok {
                Ok(Reading::Quantity(resolved))
            } else {
                Err(format!("`{unit}` is not a unit of {}", t.field().name()))
            }
        }
        Input::CalciumFraction => match unit {
            "" | "fraction" => Ok(Reading::PLAIN),
            "%" | "percent" => Ok(Reading::Number {
                scale: 0.01,
                offset: 0.0,
                label: "%",
            }),
            _ => Err(unknown()),
        },
        Input::Tds => match unit {
            "" => Err(missing()),
            "mg/l" | "ppm" => Ok(Reading::Number {
                scale: 1.0,
                offset: 0.0,
                label: "mg/L",
            }),
            "g/l" => Ok(Reading::Number {
                scale: 1000.0,
                offset: 0.0,
                label: "g/L",
            }),
            _ => Err(unknown()),
        },
        Input::IonicStrength => match unit {
            "" | "mol/kg" | "m" => Ok(Reading::PLAIN),
            "mmol/kg" => Ok(Reading::Number {
                scale: 1e-3,
                offset: 0.0,
                label: "mmol/kg",
            }),
            _ => Err(unknown()),
        },
        // issue 11: depth profiles
        Input::Depth => match unit {
            "" => Err(missing()),
            "m" | "metre" | "metres" | "meter" | "meters" => Ok(Reading::Number {
                scale: 1.0,
                offset: 0.0,
                label: "m",
            }),
            // The international foot, 0.3048 m exactly (1959 agreement).
            "ft" | "feet" | "foot" => Ok(Reading::Number {
                scale: 0.3048,
                offset: 0.0,
                label: "ft",
            }),
            _ => Err(unknown()),
        },
        // A name in each cell, no unit.
        choice if choice.is_choice() => {
            if unit.is_empty() {
                Ok(Reading::Text)
            } else {
                Err(format!("{} takes no unit", field.name()))
            }
        }
        // An input without a reading of its own here is never read.
        _ => Err(unknown()),
    }
}

/// `ppm` (`ppm caco3`, `ppm as n`) as the trade writes it for mg/L: the
/// unit text with `mg/l` in its place; `None` when the text is no ppm.
fn ppm_as_mg_l(unit: &str) -> Option<String> {
    let rest = unit.strip_prefix("ppm")?;
    (rest.is_empty() || rest.starts_with(' ')).then(|| format!("mg/l{rest}"))
}

/// A note on a unit that is read, but only approximately as written: `ppm`
/// read as mg/L, and `ppt`, `‰` or `g/kg` read as practical salinity.
pub(super) fn unit_note(field: Input, unit: &str) -> Option<&'static str> {
    let concentration = matches!(field, Input::Total(_) | Input::Tds)
        || matches!(field, Input::Carbon(p) if p != Parameter::Xco2);
    if concentration && ppm_as_mg_l(unit).is_some() {
        return Some(
            "ppm read as mg/L; the two agree within about 0.1 % in fresh water, but in sea \
             water a ppm (mg/kg) is about 2.5 % more per litre, so give mg/L or a per-kg unit \
             there",
        );
    }
    if field == Input::Salinity && matches!(unit, "ppt" | "g/kg" | "‰" | "permil" | "ppth") {
        return Some(
            "read as practical salinity; if the values are absolute salinity (g/kg), they are \
             about 0.5 % above practical salinity in sea water (TEOS-10: SA ≈ 1.0047 SP), so \
             results are close but not exact",
        );
    }
    None
}

/// The reading of a unit written after the number in a cell (`25 °C`,
/// `120 mg/L as CaCO3`), for a column of `field`; `None` when the text is
/// no unit of that field.
#[cfg_attr(not(feature = "sheet"), allow(dead_code))]
pub(crate) fn cell_unit(column: &Column, text: &str) -> Option<Reading> {
    let unit = normalise(text);
    let hint = match column.reading {
        Reading::Conductivity { specific: true, .. } => NameHint::Specific,
        _ => NameHint::None,
    };
    interpret(column.field, hint, &unit).ok()
}
