//! Figures derived from a settled fresh water: the Langelier pHs and index,
//! and the calcium carbonate precipitation potential.

use super::FreshFigures;
use crate::base::units::CACO3_G_MOL;
use crate::base::warning::{Warning, Warnings};
use crate::medium::fresh::ionic::ion_sum;
use crate::medium::fresh::{FreshBasis, IonicStrengthRoute};
use crate::medium::Constants;
use crate::sample::measured::{Measured, Parameter};
use crate::solve::fixed_point::{falsi, falsi_known};
use crate::solve::{Near, RootChoice, SolveOptions};
use crate::speciation::calcium::{free_carbonate, ln_omega_at_alkalinity};

/// The charge imbalance of the ions given, as % of the sum of their
/// charges, beyond which a warning is raised. Laboratories accept about
/// ±5 % for an ion analysis of ordinary waters (APHA Standard Methods 1030 E;
/// common practice, from memory, unverified); twice that cannot be an
/// analytical scatter.
pub const CHARGE_BALANCE_CAUTION_PERCENT: f64 = 10.0;

impl FreshBasis {
    pub(crate) fn fresh_figures(
        &self,
        k: &Constants,
        h: f64,
        dic: f64,
        options: &SolveOptions,
        near: &Near,
        warnings: &mut Warnings,
    ) -> FreshFigures {
        // The charge balance of an ion analysis; other routes have none.
        let charge_balance_percent =
            (self.route == IonicStrengthRoute::MajorIons).then(|| 100.0 * ion_sum(k, h, dic).1);
        if let Some(b) = charge_balance_percent.filter(|b| b.abs() > CHARGE_BALANCE_CAUTION_PERCENT)
        {
            let more = if b > 0.0 { "cations" } else { "anions" };
            warnings.push(Warning::Text {
                code: "ions_out_of_balance",
                text: format!(
                    "the ions given are out of balance by {b:+.1} % ({more} exceed): an ion is \
                     missing from the analysis, or one is in the wrong unit; the ionic strength \
                     taken from them may be wrong"
                ),
            });
        }
        let mut e = FreshFigures {
            ionic_strength_from: self.route,
            charge_balance_percent,
            saturation_ph_nbs: None,
            langelier_index: None,
            precipitation_potential_mg_l_caco3: None,
        };
        if self.totals.calcium_mol_kg <= 0.0 {
            return e;
        }
        let ta = crate::speciation::alkalinity::parts(k, h, dic).total();
        let ph = -crate::base::numeric::log10(h);
        let phs = near
            .saturation_ph
            .and_then(|p| self.saturation_ph_near(k, ta, p))
            .or_else(|| self.saturation_ph(k, ta, ph));
        match phs {
            Some(phs) => {
                e.saturation_ph_nbs = Some(phs);
                e.langelier_index = Some(ph - phs);
            }
            None => warnings.push(Warning::Note {
 code: "langelier_not_computed",
 text: "no pH between 4 and 13 saturates this water with calcite at its alkalinity and \
                 calcium: Langelier index not computed",
 }),
        }
        if options.precipitation_potential {
            match self.precipitation_potential(k, ta, dic) {
                Some(x) => {
                    e.precipitation_potential_mg_l_caco3 = Some(x * k.density_kg_m3() * CACO3_G_MOL)
                }
                None => warnings.push(Warning::Note {
                    code: "precipitation_potential_not_bracketed",
                    text: "the calcium carbonate precipitation potential could not be bracketed",
                }),
            }
        }
        e
    }

    /// pHs of the Langelier index: the NBS pH at which this water, with its
    /// alkalinity and total calcium (and the ionic strength of `k`, the
    /// sample's), is exactly saturated with calcite; the lowest such pH
    /// between 4 and 13, else `None`.
    ///
    /// At fixed alkalinity, ln Ω rises with pH to a maximum (where hydroxide
    /// starts to take the alkalinity from carbonate) and falls beyond, and
    /// each trial pH costs one quadratic ([`ln_omega_at_alkalinity`]). From
    /// the sample's pH a first step assumes the slope ln 10 of a
    /// bicarbonate water; steps of 0.5 pH then walk to a sign change on the
    /// rising side, and [`falsi`] refines it to 1e-12 pH. This is the
    /// same root as the alkalinity + CO3 pair at CO3 = Ksp'/Ca (its lower
    /// root), at a tenth of the cost.
    pub(crate) fn saturation_ph(&self, k: &Constants, ta: f64, ph: f64) -> Option<f64> {
        const LOWEST: f64 = 4.0;
        const HIGHEST: f64 = 13.0;
        const STEP: f64 = 0.5;
        let ca_total = self.totals.calcium_mol_kg;
        let f = |p: f64| ln_omega_at_alkalinity(k, ta, ca_total, crate::base::numeric::pow10(-p));
        let refine = |lo: f64, hi: f64| {
            falsi(|p| f(p).unwrap_or(f64::NAN), lo, hi).filter(|p| (LOWEST..=HIGHEST).contains(p))
        };
        let p0 = ph.clamp(LOWEST, HIGHEST);
        let f0 = f(p0)?;
        if f0 == 0.0 {
            return Some(p0);
        }
        // The first step, then steps of 0.5, towards saturation.
        let first = (p0 - f0 / std::f64::consts::LN_10).clamp(LOWEST, HIGHEST);
        let f1 = f(first);
        if let Some(f1) = f1 {
            if (f1 < 0.0) != (f0 < 0.0) {
                let (lo, hi) = if first < p0 { (first, p0) } else { (p0, first) };
                return refine(lo, hi);
            }
        }
        if f0 > 0.0 {
            // Supersaturated: walk down to an undersaturated pH.
            let mut hi = p0;
            while hi > LOWEST {
                let lo = (hi - STEP).max(LOWEST);
                match f(lo) {
                    Some(v) if v < 0.0 => return refine(lo, hi),
                    _ => hi = lo,
                }
            }
            return None;
        }
        // Undersaturated: walk up while ln Ω rises; past its maximum, the
        // rising side (and any root) lies below the sample's pH.
        let mut lo = p0;
        let mut f_lo = f0;
        while lo < HIGHEST {
            let hi = (lo + STEP).min(HIGHEST);
            match f(hi) {
                Some(v) if v >= 0.0 => return refine(lo, hi),
                Some(v) if v > f_lo => (lo, f_lo) = (hi, v),
                _ => break,
            }
        }
        // Past the maximum: walk down over it to a supersaturated pH, then
        // on to the undersaturated one below it.
        let mut hi = p0;
        let mut supersaturated = false;
        while hi > LOWEST {
            let lo = (hi - STEP).max(LOWEST);
            match f(lo) {
                Some(v) if v >= 0.0 => supersaturated = true,
                Some(_) if supersaturated => return refine(lo, hi),
                _ => {}
            }
            hi = lo;
        }
        None
    }

    /// pHs as [`FreshBasis::saturation_ph`] gives it, for a water very near
    /// one whose pHs is `near` (a perturbed solve of the propagation of
    /// uncertainties): one Newton step from `near` with the slope ln 10 of
    /// [`FreshBasis::saturation_ph`]'s first step, taken twice as far so
    /// that the step brackets the root, then [`falsi`] to 1e-12 pH on that
    /// bracket. The root found is the one on the rising side of ln Ω next
    /// to `near`, the same as the full search finds for a water that near.
    /// `None` where `near` is not within 0.01 pH of a bracketed root on
    /// that side (the caller then searches in full).
    pub(crate) fn saturation_ph_near(&self, k: &Constants, ta: f64, near: f64) -> Option<f64> {
        const LOWEST: f64 = 4.0;
        const HIGHEST: f64 = 13.0;
        const REACH: f64 = 0.01;
        let ca_total = self.totals.calcium_mol_kg;
        let f = |p: f64| ln_omega_at_alkalinity(k, ta, ca_total, crate::base::numeric::pow10(-p));
        if !(LOWEST..=HIGHEST).contains(&near) {
            return None;
        }
        let f0 = f(near)?;
        if f0 == 0.0 {
            return Some(near);
        }
        let step = -2.0 * f0 / std::f64::consts::LN_10;
        if step.abs() > REACH {
            return None;
        }
        let far = (near + step).clamp(LOWEST, HIGHEST);
        let f1 = f(far)?;
        // On the rising side ln Ω is below zero under the root, above it over.
        let rising = (f0 < 0.0 && f1 > 0.0 && far > near) || (f0 > 0.0 && f1 < 0.0 && far < near);
        if !rising {
            return None;
        }
        falsi_known(|p| f(p).unwrap_or(f64::NAN), (near, f0), (far, f1))
            .filter(|p| (LOWEST..=HIGHEST).contains(p))
    }

    /// Calcium carbonate precipitation potential (mol/kg): the calcite that
    /// would precipitate (positive) or dissolve (negative) in a closed
    /// system to reach saturation, removing x of calcium and DIC and 2x of
    /// alkalinity (Rossum & Merrill 1983; from memory, unverified). Each
    /// trial x is a full solve of (TA − 2x, DIC − x) with calcium Ca − x
    /// through the shared solver, the ionic strength held at the sample's;
    /// the root in x is Brent's, to 1e-12 relative.
    pub(crate) fn precipitation_potential(&self, k: &Constants, ta: f64, dic: f64) -> Option<f64> {
        let ca_t = self.totals.calcium_mol_kg;
        let held = Some(k.ionic_strength());
        let log_omega = |x: f64| -> f64 {
            let pair = (
                Measured::per_kg(Parameter::Alkalinity, ta - 2.0 * x),
                Measured::per_kg(Parameter::Dic, dic - x),
            );
            let (Ok(a), Ok(b)) = pair else {
                return f64::NAN;
            };
            let cold = Near::default();
            let given = |_: &Constants| Ok((a, b));
            match self.converge(ca_t - x, held, None, RootChoice::Natural, &cold, given) {
                Ok(settled) => {
                    let (kx, s) = (self.constants_of(&settled), settled.sol);
                    let co3 = free_carbonate(&kx, s.h, s.dic);
                    (kx.calcium_free_mol_kg() * co3 / kx.ksp_calcite()).ln()
                }
                Err(_) => f64::NAN,
            }
        };
        let f0 = log_omega(0.0);
        if !f0.is_finite() {
            return None;
        }
        if f0 == 0.0 {
            return Some(0.0);
        }
        // Supersaturated: the root lies between 0 and the most that can
        // precipitate; undersaturated: between 0 and 0.01 mol/kg dissolved.
        let (lo, hi) = if f0 > 0.0 {
            (0.0, ca_t.min(dic).min(ta / 2.0) * (1.0 - 1e-9))
        } else {
            (-0.01, 0.0)
        };
        let far = if f0 > 0.0 { hi } else { lo };
        let f_far = log_omega(far);
        if !f_far.is_finite() || f_far * f0 > 0.0 {
            return None;
        }
        let mut conv = crate::base::root::Relative {
            rel: 1e-12,
            y_tol: 1e-13,
            max_iter: 200,
        };
        roots::find_root_brent(lo, hi, log_omega, &mut conv).ok()
    }
}
