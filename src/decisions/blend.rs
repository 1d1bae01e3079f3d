//! What a mix of two waters becomes: make-up water into a recirculating
//! system, river water into a brackish pond.
//!
//! Alkalinity, DIC, salinity and every total (the nutrients, boron,
//! sulfate, fluoride and calcium) are conserved in mixing and mix by mass.
//! The temperature mixes by heat, with the heat capacity of each water;
//! the pressure by mass. The mixture is then solved again at its own
//! conditions, from its alkalinity and DIC, through the one solver.

use crate::base::error::{check_range, Result};
use crate::base::field::Field;
use crate::base::units::Amount;
use crate::base::warning::{Warning, Warnings};
use crate::sample::conditions::Conditions;
use crate::sample::measured::Measured;
use crate::sample::water::{Medium, Water, AUTO_FRESH_BELOW_SALINITY};
use crate::sample::Composition;
use crate::state::State;

/// How the share of the first water is given.
///
/// ```
/// use travertine::decisions::blend::Share;
/// assert_eq!(Share::ByMass(0.3).mass_fraction(1000.0, 1025.0), 0.3);
/// // 30 % by volume of a lighter water is a little less by mass.
/// assert!(Share::ByVolume(0.3).mass_fraction(998.0, 1025.0) < 0.3);
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub enum Share {
    /// Mass fraction of the first water, 0 to 1.
    ByMass(f64),
    /// Volume fraction of the first water, 0 to 1 (each at its own density).
    ByVolume(f64),
}

impl Share {
    /// The mass fraction of the first water, from the densities (kg/m³) of
    /// the two.
    pub fn mass_fraction(self, first_density: f64, second_density: f64) -> f64 {
        match self {
            Share::ByMass(f) => f,
            Share::ByVolume(v) => {
                let (m1, m2) = (v * first_density, (1.0 - v) * second_density);
                m1 / (m1 + m2)
            }
        }
    }

    fn value(self) -> f64 {
        match self {
            Share::ByMass(f) | Share::ByVolume(f) => f,
        }
    }
}

/// Specific heat capacity of a water of practical salinity `s` at about
/// 20 °C, J/(kg K): 4182 for pure water falling linearly to 3993 at
/// salinity 35 (from memory of the TEOS-10 values, unverified; the
/// temperature dependence, under 1 % from 0 to 40 °C, is left out).
///
/// ```
/// use travertine::decisions::blend::heat_capacity_j_kg_k;
/// assert_eq!(heat_capacity_j_kg_k(0.0), 4182.0);
/// assert!((heat_capacity_j_kg_k(35.0) - 3993.0).abs() < 1e-9);
/// ```
pub fn heat_capacity_j_kg_k(s: f64) -> f64 {
    4182.0 - (4182.0 - 3993.0) * s / 35.0
}

/// A mix of two waters, solved.
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub struct Blend {
    /// The mass fraction of the first water.
    pub mass_fraction_first: f64,
    /// The mixed water.
    pub water: Water,
    /// Its state, solved at its own conditions.
    pub state: State,
}

/// Mixes `first` and `second`, each a water and its solved state, with
/// `share` of the first.
///
/// Each conserved quantity X mixes as X = f·X₁ + (1 − f)·X₂ with f the
/// mass fraction of the first; the temperature as
/// T = (f·c₁·T₁ + (1 − f)·c₂·T₂) / (f·c₁ + (1 − f)·c₂) with c the heat
/// capacity ([`heat_capacity_j_kg_k`]). Two waters of one medium give a
/// mix of that medium where its salinity allows; otherwise the mix takes
/// the medium its salinity calls for (fresh below 1), with a note. In
/// fresh water the mix gets the mixed ionic strength; its calcium is known
/// only where both waters' is.
///
/// # Errors
/// [`crate::Error::OutOfRange`] for a share outside 0 to 1; errors of the solve.
///
/// ```
/// use travertine::decisions::blend::{blend, Share};
/// use travertine::{Conditions, Measured, Water};
/// let river = Water::fresh(Conditions::new(12.0, 0.2)?)?;
/// let r = river.solve(Measured::alkalinity_umol_kg(1500.0)?, Measured::dic_umol_kg(1600.0)?)?;
/// let sea = Water::saline(Conditions::new(18.0, 34.0)?)?;
/// let s = sea.solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2050.0)?)?;
/// let b = blend((&river, &r), (&sea, &s), Share::ByMass(0.5))?;
/// assert!((b.state.alkalinity_umol_kg - 1900.0).abs() < 1e-9);
/// assert!((b.state.salinity - 17.1).abs() < 1e-12);
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn blend(first: (&Water, &State), second: (&Water, &State), share: Share) -> Result<Blend> {
    check_range(Field::Fraction, share.value(), 0.0, 1.0, "")?;
    let (w1, s1) = first;
    let (w2, s2) = second;
    let f = share.mass_fraction(s1.density_kg_m3, s2.density_kg_m3);
    let g = 1.0 - f;
    let mix = |a: f64, b: f64| f * a + g * b;
    let salinity = mix(s1.salinity, s2.salinity);
    let (c1, c2) = (
        heat_capacity_j_kg_k(s1.salinity),
        heat_capacity_j_kg_k(s2.salinity),
    );
    let temperature = (f * c1 * s1.temperature_c + g * c2 * s2.temperature_c) / (f * c1 + g * c2);
    let conditions = Conditions::new(temperature, salinity)?
        .with_pressure_dbar(mix(s1.pressure_dbar, s2.pressure_dbar))?
        .with_air_pressure_atm(mix(
            w1.conditions().air_pressure_atm(),
            w2.conditions().air_pressure_atm(),
        ))?;
    let mut notes = Warnings::new();
    let medium = if w1.medium() == w2.medium() {
        w1.medium()
    } else {
        let m = if salinity < AUTO_FRESH_BELOW_SALINITY {
            Medium::Fresh
        } else {
            Medium::Saline
        };
        notes.push(Warning::Text {
            code: "blend_medium",
            text: format!(
                "a fresh and a saline water mixed to salinity {salinity:.3}: the mix is solved \
                 as {} water (fresh below salinity {AUTO_FRESH_BELOW_SALINITY})",
                m.name()
            ),
        });
        m
    };
    // The medium of both where its range holds the mix, else by salinity.
    let water = match medium {
        Medium::Saline => Water::saline(conditions).or_else(|_| Water::fresh(conditions)),
        _ => Water::fresh(conditions).or_else(|_| Water::saline(conditions)),
    }?;
    let (t1, t2) = (s1.totals, s2.totals);
    let per_kg = |a: f64, b: f64| Amount::PerKg(mix(a, b));
    let mut c = Composition::default()
        .with_phosphate(per_kg(t1.phosphate_mol_kg, t2.phosphate_mol_kg))?
        .with_silicate(per_kg(t1.silicate_mol_kg, t2.silicate_mol_kg))?
        .with_ammonia(per_kg(t1.ammonia_mol_kg, t2.ammonia_mol_kg))?
        .with_sulfide(per_kg(t1.sulfide_mol_kg, t2.sulfide_mol_kg))?;
    if water.medium() == Medium::Saline {
        c = c
            .with_boron(per_kg(t1.boron_mol_kg, t2.boron_mol_kg))?
            .with_sulfate(per_kg(t1.sulfate_mol_kg, t2.sulfate_mol_kg))?
            .with_fluoride(per_kg(t1.fluoride_mol_kg, t2.fluoride_mol_kg))?;
    }
    let calcium_known = |w: &Water| w.medium() == Medium::Saline || w.composition().calcium_given();
    if calcium_known(w1) && calcium_known(w2) {
        c = c.with_calcium(per_kg(t1.calcium_mol_kg, t2.calcium_mol_kg))?;
    } else {
        notes.push(Warning::Note {
            code: "blend_calcium_unknown",
            text: "the calcium of one of the waters is not known, so neither is the mix's: \
                   saturation is left out in fresh water, and follows the salinity in saline \
                   water",
        });
    }
    let fits = if w1.medium() == Medium::Saline || w2.medium() != Medium::Saline {
        *w1.fits()
    } else {
        *w2.fits()
    };
    let mut water = water.with_fits(fits).with_composition(c);
    if water.medium() == Medium::Fresh {
        let activity = if w1.medium() == Medium::Fresh {
            w1.fresh_options().activity
        } else {
            w2.fresh_options().activity
        };
        water = water
            .with_activity_model(activity)
            .with_ionic_strength(mix(s1.ionic_strength, s2.ionic_strength))?;
    }
    let water = water.with_input_cautions(notes);
    let state = water.solve(
        Measured::alkalinity_umol_kg(mix(s1.alkalinity_umol_kg, s2.alkalinity_umol_kg))?,
        Measured::dic_umol_kg(mix(s1.dic_umol_kg, s2.dic_umol_kg))?,
    )?;
    Ok(Blend {
        mass_fraction_first: f,
        water,
        state,
    })
}

/// As [`blend`], for two solved states, each with the water it was solved
/// from ([`State::water_sample`]).
///
/// # Errors
/// As [`blend`].
///
/// ```
/// use travertine::decisions::blend::{blend_states, Share};
/// use travertine::{Conditions, Measured, Water};
/// let a = Water::fresh(Conditions::new(12.0, 0.2)?)?
///     .solve(Measured::alkalinity_umol_kg(1500.0)?, Measured::dic_umol_kg(1600.0)?)?;
/// let b = Water::fresh(Conditions::new(20.0, 0.2)?)?
///     .solve(Measured::alkalinity_umol_kg(2500.0)?, Measured::dic_umol_kg(2400.0)?)?;
/// let m = blend_states(&a, &b, Share::ByMass(0.25))?;
/// assert!((m.state.alkalinity_umol_kg - 2250.0).abs() < 1e-9);
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn blend_states(first: &State, second: &State, share: Share) -> Result<Blend> {
    blend(
        (first.water_sample(), first),
        (second.water_sample(), second),
        share,
    )
}

#[cfg(test)]
mod tests {
    use super::*;

    fn pond() -> (Water, State) {
        let w = Water::fresh(Conditions::new(26.0, 0.3).unwrap())
            .unwrap()
            .with_composition(
                Composition::default()
                    .with_calcium(Amount::PerKg(1.0e-3))
                    .unwrap(),
            );
        let s = w
            .solve(
                Measured::alkalinity_umol_kg(2400.0).unwrap(),
                Measured::dic_umol_kg(2450.0).unwrap(),
            )
            .unwrap();
        (w, s)
    }

    fn makeup() -> (Water, State) {
        let w = Water::fresh(Conditions::new(14.0, 0.1).unwrap())
            .unwrap()
            .with_composition(
                Composition::default()
                    .with_calcium(Amount::PerKg(0.4e-3))
                    .unwrap(),
            );
        let s = w
            .solve(
                Measured::alkalinity_umol_kg(900.0).unwrap(),
                Measured::dic_umol_kg(1100.0).unwrap(),
            )
            .unwrap();
        (w, s)
    }

    /// Conserved quantities are conserved exactly (1e-12 relative).
    #[test]
    fn a_half_and_half_blend_conserves_alkalinity_and_dic() {
        let (w1, s1) = pond();
        let (w2, s2) = makeup();
        let b = blend((&w1, &s1), (&w2, &s2), Share::ByMass(0.5)).unwrap();
        let half = |a: f64, c: f64| 0.5 * (a + c);
        let rel = |a: f64, c: f64| ((a - c) / c).abs();
        assert!(rel(b.state.alkalinity_umol_kg, half(2400.0, 900.0)) < 1e-12);
        assert!(rel(b.state.dic_umol_kg, half(2450.0, 1100.0)) < 1e-12);
        assert!(rel(b.state.calcium_umol_kg.unwrap(), half(1000.0, 400.0)) < 1e-12);
        // Same salinity-free heat capacities: the mean temperature.
        assert!((b.state.temperature_c - 20.0).abs() < 1e-3);
    }

    /// A fraction of 1 gives the first water back.
    #[test]
    fn all_of_the_first_is_the_first() {
        let (w1, s1) = pond();
        let (w2, s2) = makeup();
        let b = blend((&w1, &s1), (&w2, &s2), Share::ByMass(1.0)).unwrap();
        for (x, y) in [
            (b.state.ph_nbs, s1.ph_nbs),
            (b.state.pco2_uatm, s1.pco2_uatm),
            (b.state.alkalinity_umol_kg, s1.alkalinity_umol_kg),
            (b.state.omega_calcite.unwrap(), s1.omega_calcite.unwrap()),
        ] {
            assert!(((x - y) / y).abs() < 1e-6, "{x} {y}");
        }
        assert!(blend((&w1, &s1), (&w2, &s2), Share::ByMass(1.5)).is_err());
    }

    /// River water into sea water: the medium follows the mixed salinity,
    /// with a note.
    #[test]
    fn fresh_into_saline_switches_medium_with_a_note() {
        let (w1, s1) = makeup();
        let sea = Water::saline(Conditions::new(18.0, 34.0).unwrap()).unwrap();
        let s2 = sea
            .solve(
                Measured::alkalinity_umol_kg(2300.0).unwrap(),
                Measured::dic_umol_kg(2050.0).unwrap(),
            )
            .unwrap();
        let brackish = blend((&w1, &s1), (&sea, &s2), Share::ByMass(0.8)).unwrap();
        assert_eq!(brackish.state.medium, Medium::Saline);
        assert!(brackish
            .state
            .warnings
            .iter()
            .any(|w| w.code() == "blend_medium"));
        let fresh = blend((&w1, &s1), (&sea, &s2), Share::ByMass(0.99)).unwrap();
        assert_eq!(fresh.state.medium, Medium::Fresh);
    }
}
