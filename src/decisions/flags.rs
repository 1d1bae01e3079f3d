//! Quality flags: a state judged against the limits of a [`Profile`].
//!
//! A flag fires when a value passes its limit: above a maximum (`>`),
//! below a minimum (`<`); a value equal to its limit raises none. Each has
//! a stable snake_case code:
//!
//! | code | fires when | value, threshold |
//! |---|---|---|
//! | `free_co2_high` | free CO2 above the limit | mg/L |
//! | `nh3_high` | un-ionised ammonia above the limit (only with ammonia given) | mg/L as N |
//! | `alkalinity_low` | total alkalinity below the limit | mg/L as CaCO3 |
//! | `ph_low`, `ph_high` | pH (NBS scale) outside the limits | pH |
//! | `omega_aragonite_low` | aragonite Ω below the limit (only with calcium) | Ω |
//! | `organic_acid_bias` | pH and alkalinity were the measured pair, the pH is below its setting and the alkalinity below its own | alkalinity, µmol/kg |
//! | `implausible_sample` | an alkalinity the specific conductance cannot carry, or pCO2 above its setting | alkalinity mg/L as CaCO3 and the most the conductance carries; or pCO2, µatm |
//!
//! The limits of the built-in profiles are common practice: rough guides
//! for warm-water pond fish (the default, `general`), for salmonids and
//! for bivalve larvae. Limits depend on the species, its life stage and
//! the exposure: a flag is a prompt to look, not a diagnosis. Defer to
//! species guidance, a fish-health professional or veterinarian, and local
//! rules.
//!
//! # The pH of the limits
//! The pH limits are on the NBS scale, the scale of the glass electrodes
//! they are written for; in saline water that pH is approximate (Takahashi
//! et al. 1982), as the state's `ph_nbs` is.
//!
//! # Organic acids
//! In acidic, poorly buffered water rich in dissolved organic matter, part
//! of the titrated alkalinity is organic anions, not bicarbonate, so pCO2
//! computed from pH and alkalinity is too high, often by more than half
//! (Abril et al. 2015, Biogeosciences, "Large overestimation of pCO2
//! calculated from pH and alkalinity in acidic, organic-rich freshwaters";
//! the thresholds pH 7 and 1000 µmol/kg from memory, unverified). The flag
//! is raised only where pH and alkalinity were the measured pair (a state
//! moved to other conditions keeps its measured pair).
//!
//! # Alkalinity against conductance
//! Alkalinity is an excess of anions (bicarbonate, carbonate) balanced by
//! cations, and both conduct. At infinite dilution and 25 °C a meq/L of
//! sodium bicarbonate conducts 94.6 µS/cm (λ HCO3- 44.5, λ Na+ 50.1
//! S cm²/mol; calcium and magnesium bicarbonate more), and the rule of
//! thumb of water analysis is 100 µS/cm per meq/L of anions or cations
//! (common practice, APHA Standard Methods 1030 E; from memory, unverified).
//! Conductance per equivalent falls as the water gets more concentrated
//! and is lower for organic anions, so the bound uses a third of that:
//!
//! ```text
//! largest alkalinity (meq/L) = specific conductance at 25 °C (µS/cm) / 30
//! ```
//! (the `plausibility.conductance_per_alkalinity_min_us_cm_per_meq_l` of
//! a profile). 150 µS/cm carries at most 5 meq/L, 250 mg/L as CaCO3, so
//! 2900 mg/L as CaCO3 beside it is a unit slip in one of the two readings.
//! The check needs the specific conductance, which fresh water keeps when a
//! conductivity is given.
//!
//! ```
//! use travertine::decisions::{flags, Profile};
//! use travertine::{Conditions, Measured, Water};
//! // An invented pond at dawn: pH 6.9 and 38 mg/L alkalinity, 28 °C.
//! let pond = Water::fresh(Conditions::new(28.0, 0.1)?)?;
//! let s = pond.solve(Measured::ph(6.9, None)?, Measured::alkalinity_umol_kg(760.0)?)?;
//! let raised = flags(&s, &Profile::default());
//! let codes: Vec<&str> = raised.iter().map(|f| f.code).collect();
//! assert!(codes.contains(&"organic_acid_bias"));
//! assert!(!codes.contains(&"ph_low"));
//! # Ok::<(), travertine::Error>(())
//! ```

use super::profile::Profile;
use crate::base::units::CACO3_G_EQ;
use crate::sample::measured::Parameter;
use crate::state::State;
use serde::Serialize;

/// One quality flag raised on a state.
///
/// It serialises as `{"code", "message", "value", "threshold"}`: the
/// `flags` array of `travertine solve --json`.
///
/// ```
/// use travertine::decisions::{flags, Profile};
/// use travertine::{Conditions, Measured, Water};
/// let s = Water::fresh(Conditions::new(20.0, 0.1)?)?
///     .solve(Measured::ph(9.4, None)?, Measured::alkalinity_umol_kg(2000.0)?)?;
/// let f = flags(&s, &Profile::default());
/// assert_eq!(f[0].code, "ph_high");
/// let v = serde_json::to_value(&f[0]).unwrap();
/// assert_eq!(v["threshold"], 9.0);
/// assert!(v["message"].as_str().unwrap().contains("above"));
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq, Serialize)]
#[non_exhaustive]
pub struct Flag {
    /// The stable snake_case code, such as `free_co2_high`.
    pub code: &'static str,
    /// What was found, against what, in words.
    pub message: String,
    /// The value judged, in the unit of the flag (see the module table).
    pub value: f64,
    /// The limit it passed, in the same unit.
    pub threshold: f64,
}

/// A number to three significant figures, for messages.
fn sig3(v: f64) -> String {
    if v == 0.0 || !v.is_finite() {
        return format!("{v}");
    }
    let decimals = (2 - v.abs().log10().floor() as i32).clamp(0, 12) as usize;
    format!("{v:.decimals$}")
}

/// Whether `value` is above the limit `limit` (`None`: the flag is off).
fn above(value: f64, limit: Option<f64>) -> Option<f64> {
    limit.filter(|l| value > *l)
}

/// Whether `value` is below the limit `limit`.
fn below(value: f64, limit: Option<f64>) -> Option<f64> {
    limit.filter(|l| value < *l)
}

/// Every flag `profile` raises on `state`, in the order of the module's
/// table. Empty when nothing passes a limit.
///
/// ```
/// use travertine::decisions::{flags, Profile};
/// use travertine::{Conditions, Measured, Water};
/// let sea = Water::saline(Conditions::new(25.0, 35.0)?)?
///     .solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
/// assert!(flags(&sea, &Profile::default()).is_empty());
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn flags(state: &State, profile: &Profile) -> Vec<Flag> {
    let mut out = Vec::new();
    judge(state, profile, &mut |code, message, value, threshold| {
        out.push(Flag {
            code,
            message: message(),
            value,
            threshold,
        })
    });
    out
}

/// The codes of the flags `profile` raises on `state`, appended to `out`
/// in the order of [`flags`], without making their messages: cheap enough
/// for every row of a sheet.
///
/// ```
/// use travertine::decisions::{codes_into, Profile};
/// use travertine::{Conditions, Measured, Water};
/// let s = Water::fresh(Conditions::new(20.0, 0.1)?)?
///     .solve(Measured::ph(9.4, None)?, Measured::alkalinity_umol_kg(2000.0)?)?;
/// let mut codes = Vec::new();
/// codes_into(&s, &Profile::default(), &mut codes);
/// assert_eq!(codes, ["ph_high"]);
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn codes_into(state: &State, profile: &Profile, out: &mut Vec<&'static str>) {
    judge(state, profile, &mut |code, _, _, _| out.push(code));
}

/// A flag found: its code, its message (made only when wanted), its value
/// and its threshold.
type Found<'a> = dyn FnMut(&'static str, &dyn Fn() -> String, f64, f64) + 'a;

/// Judges `state` against `profile`, calling `push` for every flag raised.
fn judge(state: &State, profile: &Profile, push: &mut Found) {
    let name = profile.name();
    let l = &profile.limits;

    let co2 = state.free_co2_mg_l;
    if let Some(t) = above(co2, l.free_co2_high_mg_l) {
        push(
            "free_co2_high",
            &|| {
                format!(
                "free CO2 is {} mg/L, above {t} mg/L (profile {name}): fish shed their own CO2 \
                 less easily",
                sig3(co2)
            )
            },
            co2,
            t,
        );
    }
    if let Some(nh3) = state.nh3_mg_l_n {
        if let Some(t) = above(nh3, l.nh3_high_mg_l_n) {
            push(
                "nh3_high",
                &|| {
                    format!(
                    "un-ionised ammonia is {} mg/L as N, above {t} mg/L as N (profile {name}); \
                     its share of the total ammonia rises about tenfold per pH unit, so it \
                     peaks with the afternoon pH",
                    sig3(nh3)
                )
                },
                nh3,
                t,
            );
        }
    }
    let alk = state.alkalinity_mg_l_caco3;
    if let Some(t) = below(alk, l.alkalinity_low_mg_l_caco3) {
        push(
            "alkalinity_low",
            &|| {
                format!(
                    "alkalinity is {} mg/L as CaCO3, below {t} mg/L as CaCO3 (profile {name}): \
                 poorly buffered, so the pH swings widely between dawn and afternoon",
                    sig3(alk)
                )
            },
            alk,
            t,
        );
    }
    let ph = state.ph_nbs;
    if let Some(t) = below(ph, l.ph_low_nbs) {
        push(
            "ph_low",
            &|| format!("pH (NBS) is {ph:.2}, below {t} (profile {name})"),
            ph,
            t,
        );
    }
    if let Some(t) = above(ph, l.ph_high_nbs) {
        push(
            "ph_high",
            &|| format!("pH (NBS) is {ph:.2}, above {t} (profile {name})"),
            ph,
            t,
        );
    }
    if let Some(omega) = state.omega_aragonite {
        if let Some(t) = below(omega, l.omega_aragonite_low) {
            push(
                "omega_aragonite_low",
                &|| {
                    format!(
                    "aragonite Ω is {}, below {t} (profile {name}): bivalve larvae build their \
                     first shell from aragonite (Waldbusser et al. 2015)",
                    sig3(omega)
                )
                },
                omega,
                t,
            );
        }
    }

    let p = &profile.plausibility;
    let pair = state.computed_from;
    let from_ph_and_alkalinity =
        pair.contains(&Parameter::Ph) && pair.contains(&Parameter::Alkalinity);
    let alk_umol = state.alkalinity_umol_kg;
    if let (true, Some(ph_t), Some(alk_t)) = (
        from_ph_and_alkalinity,
        below(ph, p.organic_acid_ph_below_nbs),
        below(alk_umol, p.organic_acid_alkalinity_below_umol_kg),
    ) {
        push(
            "organic_acid_bias",
            &|| {
                format!(
                "pCO2 from pH {ph:.2} (below {ph_t}) and alkalinity {} µmol/kg (below {alk_t}) \
                 may be far too high where organic acids carry part of the alkalinity (Abril et \
                 al. 2015); measure pCO2 or DIC directly in acidic, poorly buffered water",
                sig3(alk_umol)
            )
            },
            alk_umol,
            alk_t,
        );
    }
    let spc = state
        .water_sample()
        .fresh_options()
        .specific_conductance_us_cm;
    if let (Some(spc), Some(per_meq)) = (spc, p.conductance_per_alkalinity_min_us_cm_per_meq_l) {
        if per_meq > 0.0 {
            let most = spc / per_meq * CACO3_G_EQ;
            if alk > most {
                push(
                    "implausible_sample",
                    &|| {
                        format!(
                        "alkalinity {} mg/L as CaCO3 is more than a specific conductance of {} \
                         µS/cm can carry (at most about {} mg/L as CaCO3, {per_meq} µS/cm for \
                         each meq/L): check the units of both readings",
                        sig3(alk),
                        sig3(spc),
                        sig3(most)
                    )
                    },
                    alk,
                    most,
                );
            }
        }
    }
    let pco2 = state.pco2_uatm;
    if let Some(t) = above(pco2, p.pco2_high_uatm) {
        push(
            "implausible_sample",
            &|| {
                format!(
                    "pCO2 is {} µatm, above {t} µatm: more than nearly any surface water holds; \
                 check the pH and alkalinity and their units (or it is a CO2-charged spring \
                 or groundwater)",
                    sig3(pco2)
                )
            },
            pco2,
            t,
        );
    }
}

/// The flags of `profile` that cannot be judged on `state` for want of an
/// input, each with the input it needs: `nh3_high` without ammonia,
/// `omega_aragonite_low` without calcium. A flag switched off by the
/// profile is not listed.
///
/// ```
/// use travertine::decisions::{not_judged, Profile};
/// use travertine::{Conditions, Measured, Water};
/// let s = Water::fresh(Conditions::new(20.0, 0.1)?)?
///     .solve(Measured::ph(7.5, None)?, Measured::alkalinity_umol_kg(2000.0)?)?;
/// assert_eq!(not_judged(&s, &Profile::default()), vec![("nh3_high", "no ammonia total above zero")]);
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn not_judged(state: &State, profile: &Profile) -> Vec<(&'static str, &'static str)> {
    let l = &profile.limits;
    let mut out = Vec::new();
    if l.nh3_high_mg_l_n.is_some() && state.nh3_mg_l_n.is_none() {
        out.push(("nh3_high", "no ammonia total above zero"));
    }
    if l.omega_aragonite_low.is_some() && state.omega_aragonite.is_none() {
        out.push(("omega_aragonite_low", "no calcium given"));
    }
    out
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn three_significant_figures() {
        // Formatting facts, not reference values.
        assert_eq!(sig3(28.44), "28.4");
        assert_eq!(sig3(0.05123), "0.0512");
        assert_eq!(sig3(2900.0), "2900");
        assert_eq!(sig3(0.0), "0");
    }

    #[test]
    fn a_limit_is_passed_strictly() {
        assert_eq!(above(20.0, Some(20.0)), None);
        assert_eq!(above(20.000001, Some(20.0)), Some(20.0));
        assert_eq!(below(6.5, Some(6.5)), None);
        assert_eq!(below(6.4999, Some(6.5)), Some(6.5));
        assert_eq!(above(1e9, None), None);
        assert_eq!(above(f64::INFINITY, Some(f64::NAN)), None);
    }
}
