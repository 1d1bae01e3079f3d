//! Figures derived from a settled fresh water: the Langelier pHs and index,
//! and the calcium carbonate precipitation potential.

use super::FreshFigures;
use crate::base::numeric::Real;
use crate::base::units::CACO3_G_MOL;
use crate::base::warning::{Warning, Warnings};
use crate::medium::fresh::ionic::ion_sum;
use crate::medium::fresh::{FreshBasis, IonicStrengthRoute};
use crate::medium::Constants;
use crate::sample::measured::{Measured, Parameter};
use crate::solve::fixed_point::falsi;
use crate::solve::{Near, RootChoice, SolveOptions};
use crate::speciation::calcium::{
    free_carbonate, ln_omega_and_slope_at_alkalinity, ln_omega_at_alkalinity,
};

/// The charge imbalance of the ions given, as % of the sum of their
/// charges, beyond which a warning is raised. Laboratories accept about
/// ±5 % for an ion analysis of ordinary waters (APHA Standard Methods 1030 E;
/// common practice, from memory, unverified); twice that cannot be an
/// analytical scatter.
pub const CHARGE_BALANCE_CAUTION_PERCENT: f64 = 10.0;

/// The range of NBS pH in which pHs is sought.
const PHS_LOWEST: f64 = 4.0;
const PHS_HIGHEST: f64 = 13.0;
/// A Newton step of pHs shorter than this (in pH) ends the iteration.
const PHS_ACCEPT: f64 = 1e-6;

/// A first estimate of pHs: the textbook closed form (Langelier 1936, in
/// its usual form; from memory, unverified) with the apparent constants and
/// the calcium pairs of the sample. At saturation the free CO3-- is
/// Ksp′/Ca, Ca being taken as the sample's free calcium; its carbon-balance
/// total is (1 + the CaCO3⁰ pair ratio) times that, the carbonate
/// alkalinity is taken as all the alkalinity (HCO3- total = TA − 2 CO3--
/// total), and h = K2e HCO3- / CO3-- with the K2e of those pairs. Only a
/// start: the Newton iteration then solves the exact balance. `None` where
/// it is not a pH of 4 to 13.
pub(crate) fn saturation_ph_estimate(k: &Constants, ta: f64, ca_total: f64) -> Option<f64> {
    let ca = if k.calcium_free_mol_kg() > 0.0 {
        k.calcium_free_mol_kg()
    } else {
        ca_total
    };
    let co3 = k.ksp_calcite() / ca * (1.0 + k.pair_co3());
    let hco3 = ta - 2.0 * co3;
    let h = k.k2e() * hco3 / co3;
    let ph = -crate::base::numeric::log10(h);
    (hco3 > 0.0 && (PHS_LOWEST..=PHS_HIGHEST).contains(&ph)).then_some(ph)
}

/// The residual of the pHs root on any [`Real`]: ln Ω of calcite at the
/// NBS pH `phs` held fixed (h = 10^(−pHs), a constant), for alkalinity `ta`
/// and total calcium `ca_total` (mol/kg) at the apparent constants of `k`
/// ([`ln_omega_at_alkalinity`], the function whose root the pHs searches
/// find), with its slope ∂ ln Ω/∂pH as a number
/// ([`ln_omega_and_slope_at_alkalinity`]; the slope of an implicit
/// differentiation needs its value alone). At the settled pHs (found on
/// `f64`) the residual's derivatives are ∂F/∂sources, and
/// `R::root(phs, residual, slope)` gives pHs with its derivatives
/// ([`saturation_ph_on`]). `None` where ln Ω is not defined there.
pub(crate) fn saturation_ph_residual<R: Real>(
    k: &Constants<R>,
    ta: R,
    ca_total: R,
    phs: f64,
) -> Option<(R, f64)> {
    let h = R::constant(crate::base::numeric::pow10(-phs));
    ln_omega_and_slope_at_alkalinity(k, ta, ca_total, h)
}

/// pHs on any [`Real`] from its value `phs` (the root the `f64` searches
/// settled on, [`FreshBasis::saturation_ph`]) by implicit differentiation
/// of [`saturation_ph_residual`]: dpHs/dsource = −(∂F/∂source)/(∂F/∂pH).
/// On `f64`, `phs` itself. `None` where ln Ω or its slope is not defined at
/// `phs`, or the slope is zero.
pub(crate) fn saturation_ph_on<R: Real>(
    k: &Constants<R>,
    ta: R,
    ca_total: R,
    phs: f64,
) -> Option<R> {
    let (residual, slope) = saturation_ph_residual(k, ta, ca_total, phs)?;
    (slope != 0.0).then(|| R::root(phs, residual, slope))
}

impl<R: Real> FreshBasis<R> {
    /// The figures of [`FreshBasis::fresh_figures`] on any [`Real`], for the
    /// settled `k`, `h` and `dic` of this type, from `values`, the figures
    /// the `f64` solve found (their searches are not run again): the
    /// charge balance from the ions ([`ion_sum`]); pHs by implicit
    /// differentiation at the value found ([`saturation_ph_on`]) and the
    /// Langelier index pH − pHs; the precipitation potential (a search over
    /// full solves, not differentiated here) as the caller gives it in
    /// `precipitation_potential`. On `f64`, with the `f64` solve's
    /// numbers, the same figures bit for bit.
    pub(crate) fn fresh_figures_on(
        &self,
        k: &Constants<R>,
        h: R,
        dic: R,
        values: &FreshFigures,
        precipitation_potential: Option<R>,
    ) -> FreshFigures<R> {
        let charge_balance_percent = values
            .charge_balance_percent
            .map(|_| ion_sum(k, h, dic).1 * 100.0);
        let mut e = FreshFigures {
            ionic_strength_from: values.ionic_strength_from,
            charge_balance_percent,
            saturation_ph_nbs: None,
            langelier_index: None,
            precipitation_potential_mg_l_caco3: precipitation_potential,
        };
        if let Some(phs) = values.saturation_ph_nbs {
            let ta = crate::speciation::alkalinity::parts(k, h, dic).total();
            let ph = -h.log10_via_ln();
            if let Some(phs) = saturation_ph_on(k, ta, self.totals.calcium_mol_kg, phs) {
                e.saturation_ph_nbs = Some(phs);
                e.langelier_index = Some(ph - phs);
            }
        }
        e
    }
}

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
        if self.totals.calcium_mol_kg <= 0.0
            || !(options.saturation_ph || options.precipitation_potential)
        {
            return e;
        }
        let ta = crate::speciation::alkalinity::parts(k, h, dic).total();
        let ph = -crate::base::numeric::log10(h);
        if options.saturation_ph {
            let phs = self.saturation_ph(k, ta, ph, near.saturation_ph);
            match phs {
                Some(phs) => {
                    e.saturation_ph_nbs = Some(phs);
                    e.langelier_index = Some(ph - phs);
                }
                None => warnings.push(Warning::Note {
                    code: "langelier_not_computed",
                    text: "no pH between 4 and 13 saturates this water with calcite at its \
                           alkalinity and calcium: Langelier index not computed",
                }),
            }
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
    pub(crate) fn saturation_ph_search(&self, k: &Constants, ta: f64, ph: f64) -> Option<f64> {
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

    /// pHs of the Langelier index, as [`FreshBasis::saturation_ph_search`]
    /// defines and finds it, found first by Newton's iteration
    /// ([`FreshBasis::saturation_ph_newton`]) from `near` (the pHs of a
    /// water very near this one, in the propagation of uncertainties) or
    /// else from the closed-form estimate of [`saturation_ph_estimate`];
    /// where that iteration does not settle on the rising side of ln Ω
    /// within pH 4 to 13, by the bracketing search from the sample's pH
    /// `ph`.
    pub(crate) fn saturation_ph(
        &self,
        k: &Constants,
        ta: f64,
        ph: f64,
        near: Option<f64>,
    ) -> Option<f64> {
        let start = near
            .filter(|p| (PHS_LOWEST..=PHS_HIGHEST).contains(p))
            .or_else(|| saturation_ph_estimate(k, ta, self.totals.calcium_mol_kg))
            .unwrap_or(ph);
        self.saturation_ph_newton(k, ta, start)
            .or_else(|| self.saturation_ph_search(k, ta, ph))
    }

    /// The pHs root by Newton's iteration on ln Ω(pH) at fixed alkalinity
    /// and calcium, with the analytic slope of
    /// [`ln_omega_and_slope_at_alkalinity`], from the pH `start`. The
    /// iteration runs in h (each step multiplies h by 10^(−Δ pH), in the
    /// [1/1] Padé form of the exponential for short steps, an error of
    /// order Δ³ against the Newton step's Δ²). It ends at a step shorter
    /// than [`PHS_ACCEPT`], returning the point after that step: near a
    /// simple root the error after a step of length d is of order
    /// (f″/2f′) d², here below 1e-12 pH, the tolerance of the bracketing
    /// search (the same rule as the root in h, [`crate::base::root`]). A
    /// start within a derivative step of the root (the pHs of the
    /// unperturbed water, for a perturbed one) thus takes one evaluation. `None`, for the caller to search in full, where a slope is
    /// not positive (the iterate is past the maximum of ln Ω, or at it: the
    /// root sought is the one on the rising side, the only one there since
    /// ln Ω rises to a single maximum), where an iterate leaves pH 4 to 13
    /// or ln Ω is not defined there, or after 20 steps.
    pub(crate) fn saturation_ph_newton(&self, k: &Constants, ta: f64, start: f64) -> Option<f64> {
        const MAX_STEPS: usize = 20;
        let ca_total = self.totals.calcium_mol_kg;
        if !(PHS_LOWEST..=PHS_HIGHEST).contains(&start) {
            return None;
        }
        let (h_low, h_high) = (
            crate::base::numeric::pow10(-PHS_HIGHEST),
            crate::base::numeric::pow10(-PHS_LOWEST),
        );
        let mut h = crate::base::numeric::pow10(-start);
        // The pH of h where known without a logarithm (at the start).
        let mut ph = Some(start);
        for _ in 0..MAX_STEPS {
            let (f, slope) = ln_omega_and_slope_at_alkalinity(k, ta, ca_total, h)?;
            if slope.is_nan() || slope <= 0.0 {
                return None;
            }
            if f == 0.0 {
                return Some(ph.unwrap_or_else(|| -crate::base::numeric::log10(h)));
            }
            // The step in pH, and in ln h: Δ ln h = −ln 10 Δ pH.
            let step = -f / slope;
            let y = -std::f64::consts::LN_10 * step;
            let next = if y.abs() < 0.5 {
                h * (2.0 + y) / (2.0 - y)
            } else {
                h * y.exp()
            };
            if !(h_low..=h_high).contains(&next) {
                return None;
            }
            if step.abs() < PHS_ACCEPT {
                return Some(match ph {
                    Some(p) => p + step,
                    None => -crate::base::numeric::log10(next),
                });
            }
            h = next;
            ph = None;
        }
        None
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
                    let (kx, s) = (settled.k, settled.sol);
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

#[cfg(test)]
pub(super) mod tests {
    use super::*;
    use crate::base::units::Amount;
    use crate::sample::{Composition, Conditions, Water};

    /// A water's basis settled at pH and alkalinity (mol/kg): its
    /// constants at the settled ionic strength and free calcium, h and DIC
    /// (also the generic tests' settled water).
    pub(in crate::state) fn settled_water(
        w: &Water,
        ph: f64,
        ta: f64,
    ) -> (FreshBasis, Constants, f64, f64) {
        let basis = FreshBasis::new(w, false).unwrap();
        let (a, b) = (
            Measured::ph(ph, None).unwrap(),
            Measured::per_kg(Parameter::Alkalinity, ta).unwrap(),
        );
        let s = basis
            .converge_pair(&a, &b, RootChoice::Natural, &Near::default())
            .unwrap();
        (basis, s.k, s.sol.h, s.sol.dic)
    }

    /// A fresh water's basis and its constants at a settled ionic strength
    /// and free calcium, from pH and alkalinity (invented waters).
    fn settled(
        t: f64,
        conductance: f64,
        calcium: f64,
        ph: f64,
        ta: f64,
    ) -> (FreshBasis, Constants, f64) {
        let water = Water::fresh(Conditions::new(t, 0.0).unwrap())
            .unwrap()
            .with_specific_conductance_us_cm(conductance)
            .unwrap()
            .with_composition(
                Composition::default()
                    .with_calcium(Amount::PerKg(calcium))
                    .unwrap(),
            );
        let (basis, k, h, dic) = settled_water(&water, ph, ta);
        let ta = crate::speciation::alkalinity::parts(&k, h, dic).total();
        (basis, k, ta)
    }

    /// A grid of invented fresh waters: 1 to 35 °C, conductance 50 to
    /// 1500 µS/cm, calcium 0.05 to 4 mmol/kg, alkalinity 0.1 to 6 mmol/kg,
    /// pH 6 to 9.5.
    fn grid() -> Vec<(f64, f64, f64, f64, f64)> {
        let mut g = Vec::new();
        for t in [1.0, 12.0, 25.0, 35.0] {
            for c in [50.0, 400.0, 1500.0] {
                for ca in [5e-5, 8e-4, 4e-3] {
                    for ta in [1e-4, 1.5e-3, 6e-3] {
                        for ph in [6.0, 7.6, 9.5] {
                            g.push((t, c, ca, ph, ta));
                        }
                    }
                }
            }
        }
        g
    }

    /// The value of ln Ω with its slope is the same number as without it,
    /// and the slope is that of a central difference.
    #[test]
    fn ln_omega_slope_is_its_derivative() {
        for (t, c, ca, ph, ta) in grid() {
            let (_, k, ta) = settled(t, c, ca, ph, ta);
            for p in [5.0, 7.0, 8.5] {
                let at =
                    |p: f64| ln_omega_at_alkalinity(&k, ta, ca, crate::base::numeric::pow10(-p));
                let Some((v, slope)) =
                    ln_omega_and_slope_at_alkalinity(&k, ta, ca, crate::base::numeric::pow10(-p))
                else {
                    assert!(at(p).is_none());
                    continue;
                };
                assert_eq!(Some(v), at(p));
                let d = 1e-5;
                if let (Some(up), Some(down)) = (at(p + d), at(p - d)) {
                    let central = (up - down) / (2.0 * d);
                    assert!(
                        (slope - central).abs() <= 1e-6 * central.abs().max(1.0),
                        "{t} {c} {ca} {ph} {ta} at pH {p}: {slope} against {central}"
                    );
                }
            }
        }
    }

    /// pHs by Newton's iteration (from the estimate, and warm from a
    /// neighbour's pHs) is the root the bracketing search finds, to 1e-12
    /// relative, on a grid of fresh waters; where the search finds none,
    /// neither does the whole.
    #[test]
    fn newton_saturation_ph_agrees_with_the_search() {
        let mut found = 0;
        let mut missed = 0;
        for (t, c, ca, ph, ta) in grid() {
            let (basis, k, ta) = settled(t, c, ca, ph, ta);
            let search = basis.saturation_ph_search(&k, ta, ph);
            let whole = basis.saturation_ph(&k, ta, ph, None);
            match search {
                Some(s) => {
                    found += 1;
                    let w = whole.expect("the whole finds the root the search finds");
                    assert!(
                        (w / s - 1.0).abs() <= 1e-12,
                        "{t} {c} {ca} {ph} {ta}: {w} {s}"
                    );
                    // From the estimate, where there is one.
                    if let Some(start) = saturation_ph_estimate(&k, ta, ca) {
                        if let Some(n) = basis.saturation_ph_newton(&k, ta, start) {
                            assert!((n / s - 1.0).abs() <= 1e-12, "{n} {s}");
                        }
                    }
                    // Warm, from a neighbour's pHs a derivative step away.
                    for near in [s + 1e-7, s - 3e-7] {
                        let n = basis.saturation_ph(&k, ta, ph, Some(near)).unwrap();
                        assert!((n / s - 1.0).abs() <= 1e-12, "warm {n} {s}");
                    }
                }
                // The search walks in steps of 0.5 pH and can step over a
                // narrow supersaturated window just below the maximum of
                // ln Ω (near pH 10 in a cold, weakly buffered water): the
                // iteration then finds that root, which must be a true
                // root on the rising side.
                None => {
                    if let Some(p) = whole {
                        missed += 1;
                        let h = crate::base::numeric::pow10(-p);
                        let (f, slope) = ln_omega_and_slope_at_alkalinity(&k, ta, ca, h).unwrap();
                        assert!(f.abs() < 1e-9 && slope > 0.0, "{t} {c} {ca} {ph} {ta}: {p}");
                        assert!((PHS_LOWEST..=PHS_HIGHEST).contains(&p));
                    }
                }
            }
        }
        assert!(found > 200, "the grid has waters with a pHs: {found}");
        assert!(
            missed < 10,
            "roots the search steps over are rare: {missed}"
        );
    }

    /// Where Newton's iteration cannot settle on the rising side of ln Ω
    /// (a start past its maximum, where hydroxide takes the alkalinity),
    /// it gives nothing, and the whole falls back to the search.
    #[test]
    fn saturation_ph_falls_back_to_the_search() {
        let (basis, k, ta) = settled(20.0, 300.0, 1e-3, 7.5, 1e-3);
        let search = basis.saturation_ph_search(&k, ta, 7.5).unwrap();
        // At pH 12.9 the slope of ln Ω is negative (or ln Ω undefined).
        let far = 12.9;
        let slope =
            ln_omega_and_slope_at_alkalinity(&k, ta, 1e-3, crate::base::numeric::pow10(-far));
        assert!(slope.is_none_or(|(_, s)| s <= 0.0), "{slope:?}");
        assert_eq!(basis.saturation_ph_newton(&k, ta, far), None);
        let whole = basis.saturation_ph(&k, ta, 7.5, Some(far)).unwrap();
        assert_eq!(whole, search);
        // A start outside pH 4 to 13 is refused too.
        assert_eq!(basis.saturation_ph_newton(&k, ta, 13.5), None);
    }
}
