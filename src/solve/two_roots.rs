//! The two pairs that can fit two waters: DIC with HCO3- (a quadratic) and
//! alkalinity with CO3-- (a convex equation with a minimum), and the root
//! policy that chooses between their roots.

use super::{Pair, RootChoice, SolveOptions, H_AT_PH_MAX, H_AT_PH_MIN, LN10, PH_MAX, PH_MIN};
use crate::base::error::Result;
use crate::base::root::{monotone_newton, Failure, Search, NEWTON_ACCEPT};
use crate::base::warning::{Warning, Warnings};
use crate::medium::Constants;
use crate::speciation::alkalinity::non_carbonate;

pub(super) fn by_root_policy(root: RootChoice, lower_h: f64, higher_h: f64) -> (f64, f64) {
    // lower_h is the higher pH. Of two pH values, the higher is nearer 8
    // exactly when their mean is below 8 (both below 8, or on either side
    // with the higher one closer): when lower_h higher_h > 1e-16, a product
    // in place of two logarithms.
    match root {
        RootChoice::LowerPh => (higher_h, lower_h),
        RootChoice::HigherPh => (lower_h, higher_h),
        RootChoice::Natural => {
            if (lower_h * 1e8) * (higher_h * 1e8) > 1.0 {
                (lower_h, higher_h)
            } else {
                (higher_h, lower_h)
            }
        }
    }
}

pub(super) fn other_root_warning(pair: &Pair, k: &Constants, chosen: f64, other: f64) -> Warning {
    Warning::OtherRoot {
        first: pair.a.parameter().name(),
        second: pair.b.parameter().name(),
        ph: -crate::base::numeric::log10(other),
        scale: k.working_scale().name(),
        higher: other < chosen,
    }
}

/// DIC with HCO3-: c h² − (1 − c) K1 h + c K1 K2 = 0, c = HCO3/DIC.
pub(super) fn dic_hco3_root(
    k: &Constants,
    pair: &Pair,
    dic: f64,
    hco3: f64,
    options: &SolveOptions,
    fits: impl Fn(f64) -> bool,
    warnings: &mut Warnings,
) -> Result<f64> {
    let root = options.root;
    let c = hco3 / dic;
    let q = 1.0 - c;
    let disc = q * q * k.k1e() * k.k1e() - 4.0 * c * c * k.k1e() * k.k2e();
    if c >= 1.0 || disc < 0.0 {
        let max = 1.0 / (1.0 + 2.0 * (k.k2e() / k.k1e()).sqrt());
        return Err(pair.no_water(format!(
            "HCO3 can be at most {:.4} of DIC at these conditions, but is {:.4} of it",
            max, c
        )));
    }
    let h_high = (q * k.k1e() + disc.sqrt()) / (2.0 * c);
    let h_low = k.k1e() * k.k2e() / h_high;
    if !options.report_other_root && root != RootChoice::Natural {
        return Ok(by_root_policy(root, h_low, h_high).0);
    }
    let two = (h_high / h_low - 1.0).abs() > 1e-9;
    let (chosen, other, report) =
        fall_back_to_measurable(by_root_policy(root, h_low, h_high), root, two, &fits);
    if report {
        warnings.push(other_root_warning(pair, k, chosen, other));
    }
    Ok(chosen)
}

/// The default choice falls back to the other root when the one nearer pH 8
/// fits no measurable water (its pH, DIC or alkalinity beyond what a
/// measurement may be) and the other does. An explicit choice is kept.
/// Returns the chosen root, the other, and whether the other is a second
/// water to report (distinct and measurable).
pub(super) fn fall_back_to_measurable(
    (chosen, other): (f64, f64),
    root: RootChoice,
    two: bool,
    fits: impl Fn(f64) -> bool,
) -> (f64, f64, bool) {
    if !two {
        return (chosen, other, false);
    }
    let other_fits = fits(other);
    if root == RootChoice::Natural && other_fits && !fits(chosen) {
        (other, chosen, false)
    } else {
        (chosen, other, other_fits)
    }
}

/// Alkalinity with CO3--: g(h) = CO3 (h/K2 + 2) + non-carbonate(h) − TA is
/// convex in h, so it has a single minimum and up to two roots.
pub(super) fn ta_co3_root(
    k: &Constants,
    pair: &Pair,
    ta: f64,
    co3: f64,
    options: &SolveOptions,
    fits: impl Fn(f64) -> bool,
    warnings: &mut Warnings,
) -> Result<f64> {
    let root = options.root;
    // g and dg/dh at h.
    let co3_per_k2 = co3 / k.k2e();
    let g = |h: f64| {
        let (n, dn) = non_carbonate(k, h);
        (co3_per_k2 * h + 2.0 * co3 + n - ta, co3_per_k2 + dn)
    };
    let (lo, hi) = (H_AT_PH_MAX, H_AT_PH_MIN);
    // The minimum: dg/dh = CO3/K2 + d(non-carbonate)/dh = 0, searched in
    // x = ln h.
    let slope = |x: f64| {
        let h = x.exp();
        co3_per_k2 + non_carbonate(k, h).1
    };
    // Where hydroxide dominates the non-carbonate part, the minimum is near
    // h = sqrt(KW K2 / CO3); if g is already negative there, that point
    // separates the roots and no search is needed.
    let h_guess = (k.kw() * k.k2e() / co3).sqrt().clamp(lo, hi);
    let g_guess = g(h_guess).0;
    let h_min = if g_guess < 0.0 {
        h_guess
    } else if g(hi).1 <= 0.0 {
        hi
    } else if g(lo).1 >= 0.0 {
        lo
    } else {
        // Any point where g < 0 separates the two roots, so the minimum is
        // first found loosely (1e-6 in ln h) and refined only if g there is
        // not yet negative (a near-double root).
        let (x_lo, x_hi) = (-PH_MAX * LN10, -PH_MIN * LN10);
        let mut conv = roots::SimpleConvergency {
            eps: 1e-6,
            max_iter: 200,
        };
        let x = roots::find_root_brent(x_lo, x_hi, slope, &mut conv)
            .map_err(|_| pair.no_convergence(200))?;
        let h = x.exp().clamp(lo, hi);
        if g(h).0 < 0.0 {
            h
        } else {
            let mut conv = roots::SimpleConvergency {
                eps: 1e-14,
                max_iter: 400,
            };
            roots::find_root_brent(x_lo, x_hi, slope, &mut conv)
                .map_err(|_| pair.no_convergence(400))?
                .exp()
                .clamp(lo, hi)
        }
    };
    let g_min = if h_min == h_guess {
        g_guess
    } else {
        g(h_min).0
    };
    if g_min > 0.0 {
        return Err(pair.no_water(format!(
            "with that CO3 the alkalinity is at least {:.6} µmol/kg at any pH",
            (g_min + ta) * 1e6
        )));
    }
    // Root at lower h (higher pH), between lo and h_min; root at higher h
    // between h_min and hi. g is convex with g(h_min) < 0, so on each side
    // it changes sign once, and its far end is evaluated only if needed.
    // (Where h_min is only a point with g < 0 rather than the minimum
    // itself, g may still fall for a while beyond it; the search needs only
    // the single sign change, and a derivative of the unexpected sign never
    // ends it early: see `monotone_newton`.)
    // First guesses: hydroxide carries the alkalinity at the high-pH root,
    // carbonate at the low-pH one.
    // The corrections take only the borate and water parts at the first
    // estimate, a few divisions against a full evaluation.
    let borate = |h: f64| k.totals().boron_mol_kg * k.kb() / (k.kb() + h);
    let guess_high = {
        // TA − 2 CO3 ≈ OH + borate + CO3 h/K2 there: the hydroxide estimate,
        // then one correction for the borate and carbonate at that h.
        let excess = ta - 2.0 * co3;
        let h0 = if excess > 0.0 { k.kw() / excess } else { 0.0 };
        let excess1 = if h0 > 0.0 {
            excess - borate(h0) - co3_per_k2 * h0
        } else {
            0.0
        };
        if excess1 > 0.0 {
            k.kw() / excess1
        } else if h0 > 0.0 {
            h0
        } else {
            (lo * h_min).sqrt()
        }
    };
    let guess_low = {
        // Two corrections for the borate and hydroxide: h = K2 (TA′/CO3 − 2),
        // a fixed-point step that contracts fast where carbonate carries
        // the alkalinity.
        let step = |h: f64| k.k2e() * ((ta - borate(h) - k.kw() / h) / co3 - 2.0);
        let h0 = k.k2e() * (ta / co3 - 2.0);
        let h1 = if h0 > 0.0 { step(h0) } else { h0 };
        let h2 = if h1 > 0.0 { step(h1) } else { h1 };
        [h2, h1, h0]
            .into_iter()
            .find(|h| *h > 0.0)
            .unwrap_or((h_min * hi).sqrt())
    };
    // The high-pH root to about 1e-4 relative in h (enough to report it),
    // polished to full precision when it is chosen or lies near the other.
    const ROUGH: f64 = 1e-2;
    let high_side = |guess: f64, accept: f64| {
        let search = Search {
            at_hi: Some(g_min),
            accept,
            ..Search::new(lo, h_min, true)
        };
        monotone_newton(g, &search, guess)
    };
    let low_side = |guess: f64, accept: f64| {
        let search = Search {
            at_lo: Some(g_min),
            accept,
            ..Search::new(h_min, hi, false)
        };
        monotone_newton(g, &search, guess)
    };
    let found = |r: std::result::Result<f64, Failure>| match r {
        Ok(h) => Ok(Some(h)),
        Err(Failure::NoConvergence(n)) => Err(pair.no_convergence(n)),
        // The far end is on the same side as the minimum: no root there.
        Err(Failure::AtLo(_) | Failure::AtHi(_)) => Ok(None),
    };
    let rough_high = || {
        if h_min > lo {
            found(high_side(guess_high, ROUGH))
        } else {
            Ok(None)
        }
    };
    // The low-pH root, where natural waters lie and the default usually
    // chooses, is found to full precision at once; the other roughly, and
    // polished only if needed.
    let precise_low = || {
        if h_min < hi {
            found(low_side(guess_low, NEWTON_ACCEPT))
        } else {
            Ok(None)
        }
    };
    let polish = |h: f64, on_high_side: bool| -> Result<f64> {
        if !on_high_side {
            return Ok(h);
        }
        found(high_side(h, NEWTON_ACCEPT))?.ok_or_else(|| pair.no_convergence(0))
    };
    // An explicit side with no report of the other: that side alone,
    // unless it has no root.
    if !options.report_other_root {
        let side = match root {
            RootChoice::HigherPh => rough_high()?.map(|h| (h, true)),
            RootChoice::LowerPh => precise_low()?.map(|h| (h, false)),
            _ => None,
        };
        if let Some((h, on_high_side)) = side {
            return polish(h, on_high_side);
        }
    }
    let (high_ph, low_ph) = (rough_high()?, precise_low()?);
    match (high_ph, low_ph) {
        (Some(h_low), Some(h_high)) => {
            let two = (h_high / h_low - 1.0).abs() > 1e-9;
            let (chosen, other, report) =
                fall_back_to_measurable(by_root_policy(root, h_low, h_high), root, two, &fits);
            let chosen_on_high_side = chosen == h_low;
            let other_on_high_side = !chosen_on_high_side;
            let chosen = polish(chosen, chosen_on_high_side)?;
            if report {
                // Roots within a pH unit of each other are near a double
                // root, where the rough one is least accurate: polish it
                // too, so that the warning's four decimals hold.
                let other = if h_high < 10.0 * h_low {
                    polish(other, other_on_high_side)?
                } else {
                    other
                };
                warnings.push(other_root_warning(pair, k, chosen, other));
            }
            Ok(chosen)
        }
        (Some(h), None) => polish(h, true),
        (None, Some(h)) => polish(h, false),
        (None, None) => Err(pair.no_water(format!(
            "no pH between {PH_MIN} and {PH_MAX} gives that alkalinity with that CO3"
        ))),
    }
}
