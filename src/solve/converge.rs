//! The fixed point around the shared solver: the free calcium inside the
//! ionic strength, and both roots of a two-root pair settled apart.

use super::fixed_point::{fixed_point, Bracket, Failure};
use super::{
    depends_on_calcium, solve, solve_near, solve_working, working, Near, RootChoice, Solution,
    SolveOptions, WorkingValue,
};
use crate::base::error::{Error, Result};
use crate::base::field::Field;
use crate::base::warning::Warning;
use crate::medium::fresh::ionic::ion_sum;
use crate::medium::fresh::FreshBasis;
use crate::medium::Constants;
use crate::properties::scales::PhScale;
use crate::sample::measured::is_two_root_pair;
use crate::sample::measured::Measured;
use crate::speciation::calcium::{
    free_calcium, free_calcium_at_alkalinity, free_calcium_at_alkalinity_and_co2,
    free_calcium_at_alkalinity_and_dic, free_ion_pairs,
};

impl FreshBasis {
    /// The fixed point of a solve: the shared solver at the apparent
    /// constants of (I, Ca), until the free calcium and the ionic strength
    /// are those of its (h, DIC). `held_i` holds the ionic strength (the
    /// derived figures hold the sample's); `pair` gives the measured pair at
    /// the constants of an ionic strength (asked once for each). Returns the last solve with the
    /// ionic strength and free calcium it was made at, and exactly the
    /// constants it was made with.
    ///
    /// Where the ions give the ionic strength, it is the outer unknown and
    /// the free calcium the inner one, each a one-dimensional fixed point
    /// ([`fixed_point`]). A solve that fails on the way (the pair fits no
    /// water at that ionic strength) steps back towards the last ionic
    /// strength that solved; before any has, ionic strengths ever further
    /// from the first (that of the ions given, without carbon) are tried on
    /// either side. The ionic strength, the free calcium and h start from
    /// those of `near` where it has them (a water very near this one),
    /// else from the ions given, all calcium free and the usual guess.
    pub(crate) fn converge<F>(
        &self,
        ca_total: f64,
        held_i: Option<f64>,
        start_calcium: Option<f64>,
        root: RootChoice,
        near: &Near,
        pair: F,
    ) -> Result<Converged>
    where
        F: Fn(&Constants) -> Result<(Measured, Measured)>,
    {
        let options = SolveOptions {
            // The other root of a two-root pair is settled on its own.
            report_other_root: root == RootChoice::Natural,
            ..SolveOptions::default().with_root(root)
        };
        let calcium = std::cell::Cell::new(start_calcium.or(near.calcium_free));
        let from_ions = held_i.is_none() && self.fixed_i.is_none();
        let at = |i: f64| {
            let start = calcium.get();
            self.converge_calcium(ca_total, i, start, &options, &pair, from_ions, near.h)
        };
        let settled = match held_i.or(self.fixed_i) {
            Some(i) => at(i),
            None => {
                let bracket = Bracket {
                    lo: Some(0.0),
                    hi: None,
                    failure: Failure::Unknown,
                    floor: 1e-12,
                };
                let mut last = None;
                let start = near.ionic_strength.filter(|i| *i > 0.0);
                fixed_point(start.unwrap_or(self.i_start), bracket, |i| {
                    let settled = last.insert(at(i)?);
                    calcium.set(Some(settled.ca));
                    Ok((settled.ions, ()))
                })?;
                last.ok_or(Error::NoConvergence {
                    first: Field::IonicStrength,
                    second: Field::Calcium,
                    iterations: 0,
                })
            }
        };
        // A fixed point that did not settle names the measured pair.
        settled.map_err(|e| match e {
            Error::NoConvergence { iterations, .. } => {
                match pair(&self.constants_at(self.i_start, ca_total, ca_total)) {
                    Ok((a, b)) => Error::NoConvergence {
                        first: a.parameter().field(),
                        second: b.parameter().field(),
                        iterations,
                    },
                    Err(other) => other,
                }
            }
            other => other,
        })
    }

    /// The inner fixed point at ionic strength `i`: the free calcium,
    /// starting from `start` (else from the free ions given, else all
    /// calcium free). With `ions`, also the ionic strength of the ions at
    /// the result. A root search starts from `near_h` where it is positive
    /// ([`solve_near`]).
    #[allow(clippy::too_many_arguments)]
    pub(crate) fn converge_calcium<F>(
        &self,
        ca_total: f64,
        i: f64,
        start: Option<f64>,
        options: &SolveOptions,
        pair: &F,
        ions: bool,
        near_h: f64,
    ) -> Result<Converged>
    where
        F: Fn(&Constants) -> Result<(Measured, Measured)>,
    {
        // The constants at this ionic strength are made once, and each trial
        // sets only the free calcium and what follows from it; the last
        // trial's constants are returned with it (exactly those
        // `constants_at(i, ca, ca_total)` makes).
        let mut k = self.constants_at(i, ca_total, ca_total);
        let (a, b) = pair(&k)?;
        // A free ion given fixes its own pair: a first calcium much nearer
        // the settled one than all calcium free.
        let start = start
            .unwrap_or_else(|| ca_total / (1.0 + free_ion_pairs(&k, &a) + free_ion_pairs(&k, &b)));
        // The internal form of the pair, made once where it does not
        // depend on the free calcium.
        let fixed = if depends_on_calcium(&a) || depends_on_calcium(&b) {
            None
        } else {
            Some(working(&k, &a, &b)?)
        };
        // A pH with the alkalinity fixes the free calcium in closed form
        // (`free_calcium_at_alkalinity`): the fixed point then starts at
        // its root, and its first trial settles it.
        // So does an alkalinity with CO2* (or a gas), as one monotone root
        // in h (`free_calcium_at_alkalinity_and_co2`); the fixed point
        // starts at it, its root search at its h.
        let mut from_h = near_h;
        let start = match fixed.as_ref().map(|w| (w.ka, w.kb)) {
            Some((WorkingValue::Ta(ta), WorkingValue::H(h))) => {
                free_calcium_at_alkalinity(&k, ta, ca_total, h).unwrap_or(start)
            }
            Some((WorkingValue::Ta(ta), WorkingValue::Co2(co2))) => {
                // The bicarbonate water's h (HCO3- = TA) where no start is given.
                let guess = if near_h > 0.0 && near_h.is_finite() {
                    near_h
                } else {
                    k.k1() * co2 / ta
                };
                match free_calcium_at_alkalinity_and_co2(&k, ta, co2, ca_total, guess) {
                    Some((h, ca)) => {
                        from_h = h;
                        ca
                    }
                    None => start,
                }
            }
            Some((WorkingValue::Ta(ta), WorkingValue::Dic(dic))) => {
                // From the carbonate-only root where no start is given.
                let guess = if near_h > 0.0 && near_h.is_finite() {
                    near_h
                } else {
                    super::carbonate_only_root(&k, ta, dic)
                };
                match free_calcium_at_alkalinity_and_dic(&k, ta, dic, ca_total, guess) {
                    Some((h, ca)) => {
                        from_h = h;
                        ca
                    }
                    None => start,
                }
            }
            _ => start,
        };
        // Each root search after the first starts from the h of the last
        // solve (a trial of the free calcium moves it little).
        let mut solve_at = |ca: f64| -> Result<(Trial, f64)> {
            k.set_free_calcium(ca);
            let k = &k;
            let sol = match &fixed {
                Some(w) => solve_working(k, w, options, from_h)?,
                None => solve_near(k, &a, &b, options, from_h)?,
            };
            from_h = sol.h;
            let f = if ca_total > 0.0 {
                free_calcium(k, sol.h, sol.dic, ca_total)
            } else {
                0.0
            };
            let ions = if ions {
                ion_sum(k, sol.h, sol.dic).0
            } else {
                i
            };
            Ok((Trial { ca, ions, sol }, f))
        };
        let last = if ca_total <= 0.0 {
            solve_at(0.0)?.0
        } else {
            // g(Ca) = F(Ca) − Ca > 0 at Ca = 0 and ≤ 0 at CaT (pairs only
            // take calcium away). All calcium taken as free overstates the
            // pairs of the free ions given (HCO3-, CO3--) or of the carbon
            // they bind, and the pair may then fit no water: a failure is
            // too much calcium.
            let bracket = Bracket {
                lo: Some(0.0),
                hi: Some(ca_total),
                failure: Failure::High,
                floor: 1e-30,
            };
            let mut last = None;
            fixed_point(start.clamp(0.0, ca_total), bracket, |ca| {
                let (trial, f) = solve_at(ca)?;
                last = Some(trial);
                Ok((f, ()))
            })?;
            last.ok_or(Error::NoConvergence {
                first: Field::Calcium,
                second: Field::IonicStrength,
                iterations: 0,
            })?
        };
        // The fixed point returns right after the trial it returns, so `k`
        // holds that trial's free calcium.
        debug_assert_eq!(k.calcium_free_mol_kg(), last.ca);
        Ok(Converged {
            i,
            ca: last.ca,
            ca_total,
            ions: last.ions,
            sol: last.sol,
            k,
        })
    }

    /// Settles a measured pair: one fixed point, or for a pair that can
    /// fit two waters each side settled and the root policy applied.
    /// The searches of a pair with one root start from `near`'s unknowns
    /// where it has them.
    pub(crate) fn converge_pair(
        &self,
        a: &Measured,
        b: &Measured,
        root: RootChoice,
        near: &Near,
    ) -> Result<Converged> {
        if is_two_root_pair(a, b) {
            self.two_roots(a, b, root)
        } else {
            let (a, b) = (*a, *b);
            self.converge(
                self.totals.calcium_mol_kg,
                None,
                None,
                root,
                near,
                |_: &Constants| Ok((a, b)),
            )
        }
    }

    /// A pair that can fit two waters (alkalinity with CO3, DIC with HCO3).
    /// Each side is settled at its own ionic strength and calcium, and the
    /// shared root policy is applied to the settled roots: the one asked
    /// for, or by default the one nearer pH 8; the other, where it is a
    /// distinct, measurable water, is named in the warning.
    ///
    /// Near a double root the side of a root at fixed constants need not be
    /// its side once the ionic strength and calcium are settled, so a side
    /// can fail to settle. The default then takes the side that settles; a
    /// side asked for that does not settle, where the other does, is
    /// refused with the other root's pH.
    pub(crate) fn two_roots(
        &self,
        a: &Measured,
        b: &Measured,
        root: RootChoice,
    ) -> Result<Converged> {
        let ca_total = self.totals.calcium_mol_kg;
        let given = |_: &Constants| Ok((*a, *b));
        let cold = Near::default();
        let side = |r| self.converge(ca_total, None, None, r, &cold, given);
        let ph = |s: &Converged| -crate::base::numeric::log10(s.sol.h);
        let (lower, higher) = (side(RootChoice::LowerPh), side(RootChoice::HigherPh));
        let higher_first = match root {
            RootChoice::LowerPh => false,
            RootChoice::HigherPh => true,
            _ => match (&lower, &higher) {
                (Ok(l), Ok(h)) => (ph(h) - 8.0).abs() < (ph(l) - 8.0).abs(),
                (Err(_), Ok(_)) => true,
                _ => false,
            },
        };
        let (chosen, other, other_side) = if higher_first {
            (higher, lower, RootChoice::LowerPh)
        } else {
            (lower, higher, RootChoice::HigherPh)
        };
        let mut found = match (chosen, &other) {
            (Ok(found), _) => found,
            (Err(e @ Error::NoConvergence { .. }), Ok(settled)) => {
                return Err(Error::NoWaterFits {
                    first: a.parameter().field(),
                    first_value: a.describe(),
                    second: b.parameter().field(),
                    second_value: b.describe(),
                    reason: format!(
                        "that root does not settle with its own ionic strength and calcium \
                         ({e}); the pair fits a water of pH {:.4} (nbs scale), and near it \
                         the two roots are one water within the precision of a measurement",
                        ph(settled)
                    ),
                })
            }
            // Neither side settles: the error names the measured pair.
            (Err(Error::NoConvergence { iterations, .. }), _) => {
                return Err(Error::NoConvergence {
                    first: a.parameter().field(),
                    second: b.parameter().field(),
                    iterations,
                })
            }
            (Err(e), _) => return Err(e),
        };
        let distinct = |o: &Converged| (o.sol.h / found.sol.h - 1.0).abs() > 1e-9;
        let measurable = |o: &Converged| {
            let parts = crate::speciation::alkalinity::parts(&o.k, o.sol.h, o.sol.dic);
            crate::solve::alkalinity_in_range(parts.total())
        };
        let named = match &other {
            Ok(o) if distinct(o) && measurable(o) => Some(ph(o)),
            // The other side did not settle: it is reported as it is at
            // the constants of the chosen one.
            Err(Error::NoConvergence { .. }) => {
                let options = SolveOptions::default().with_root(other_side);
                solve(&found.k, a, b, &options)
                    .ok()
                    .filter(|o| (o.h / found.sol.h - 1.0).abs() > 1e-9)
                    .map(|o| -crate::base::numeric::log10(o.h))
            }
            _ => None,
        };
        let (first, second) = if a.parameter() < b.parameter() {
            (a, b)
        } else {
            (b, a)
        };
        let here = ph(&found);
        found
            .sol
            .warnings
            .replace_other_root(named.map(|p| Warning::OtherRoot {
                first: first.parameter().name(),
                second: second.parameter().name(),
                ph: p,
                scale: PhScale::Nbs.name(),
                higher: p > here,
            }));
        Ok(found)
    }
}

/// A settled solve: the ionic strength and free calcium it was solved at,
/// its solution, and its constants.
#[derive(Debug, Clone, PartialEq)]
pub(crate) struct Converged {
    pub(crate) i: f64,
    pub(crate) ca: f64,
    pub(crate) ca_total: f64,
    /// The ionic strength of the ions at the solution (`i` where the ionic
    /// strength does not come from the ions).
    pub(crate) ions: f64,
    pub(crate) sol: Solution,
    /// The constants it was solved at: exactly those
    /// [`FreshBasis::constants_at`] makes from `i`, `ca` and `ca_total`
    /// (without the range warnings).
    pub(crate) k: Constants,
}

/// One trial of the free calcium: the value tried, the ionic strength of
/// the ions at its solution, and the solution.
struct Trial {
    ca: f64,
    ions: f64,
    sol: Solution,
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::base::units::Amount;
    use crate::sample::{Composition, Conditions, Water};

    /// The constants a settled solve carries are exactly those of its
    /// ionic strength and free calcium, for pairs whose internal form is
    /// made once (pH, alkalinity, DIC) and for one made at each free
    /// calcium (HCO3-), with the ionic strength from the ions and given.
    #[test]
    fn a_settled_solve_carries_its_own_constants() {
        let composition = Composition::default()
            .with_calcium(Amount::PerKg(1.5e-3))
            .unwrap();
        let ions = Water::fresh(Conditions::new(12.0, 0.0).unwrap())
            .unwrap()
            .with_composition(composition);
        let given = ions.clone().with_specific_conductance_us_cm(350.0).unwrap();
        let pairs = [
            (
                Measured::ph(7.8, None),
                Measured::alkalinity_umol_kg(2100.0),
            ),
            (
                Measured::alkalinity_umol_kg(2100.0),
                Measured::dic_umol_kg(2200.0),
            ),
            (Measured::ph(7.8, None), Measured::hco3_umol_kg(2000.0)),
        ];
        for water in [ions, given] {
            let basis = FreshBasis::new(&water, false).unwrap();
            for (a, b) in &pairs {
                let (a, b) = (a.clone().unwrap(), b.clone().unwrap());
                let s = basis
                    .converge_pair(&a, &b, RootChoice::Natural, &Near::default())
                    .unwrap();
                assert_eq!(s.k, basis.constants_at(s.i, s.ca, s.ca_total));
                assert!(s.ca > 0.0 && s.ca < 1.5e-3);
            }
        }
    }

    /// Where the closed form has no answer (the alkalinity is below the
    /// hydroxide of the pH given), the fixed point starts as before and the
    /// pair is refused as before: no water fits.
    #[test]
    fn without_a_closed_form_the_fixed_point_starts_as_before() {
        let water = Water::fresh(Conditions::new(20.0, 0.0).unwrap())
            .unwrap()
            .with_specific_conductance_us_cm(300.0)
            .unwrap()
            .with_composition(
                Composition::default()
                    .with_calcium(Amount::PerKg(1e-3))
                    .unwrap(),
            );
        let basis = FreshBasis::new(&water, false).unwrap();
        let k = basis.constants_at(basis.fixed_i.unwrap(), 1e-3, 1e-3);
        let (ph, ta) = (11.0, 5e-5);
        let h = crate::base::numeric::pow10(-ph);
        assert_eq!(free_calcium_at_alkalinity(&k, ta, 1e-3, h), None);
        let (a, b) = (
            Measured::ph(ph, None).unwrap(),
            Measured::per_kg(crate::sample::measured::Parameter::Alkalinity, ta).unwrap(),
        );
        let e = basis
            .converge_pair(&a, &b, RootChoice::Natural, &Near::default())
            .unwrap_err();
        assert!(matches!(e, Error::NoWaterFits { .. }), "{e}");
    }

    /// The free calcium of a pH with an alkalinity in closed form is the
    /// fixed point of the free calcium: the shared solver at it gives back
    /// the same free calcium, to rounding, over a grid of invented waters.
    #[test]
    fn the_closed_form_free_calcium_is_the_fixed_point() {
        for t in [2.0, 15.0, 30.0] {
            for ca_total in [1e-4, 1e-3, 5e-3] {
                for (ph, ta) in [(6.5, 3e-4), (7.6, 2e-3), (8.8, 5e-3)] {
                    let water = Water::fresh(Conditions::new(t, 0.0).unwrap())
                        .unwrap()
                        .with_specific_conductance_us_cm(400.0)
                        .unwrap()
                        .with_composition(
                            Composition::default()
                                .with_calcium(Amount::PerKg(ca_total))
                                .unwrap(),
                        );
                    let basis = FreshBasis::new(&water, false).unwrap();
                    let i = basis.fixed_i.unwrap();
                    let mut k = basis.constants_at(i, ca_total, ca_total);
                    let h = crate::base::numeric::pow10(-ph);
                    let ca = free_calcium_at_alkalinity(&k, ta, ca_total, h).unwrap();
                    k.set_free_calcium(ca);
                    let (a, b) = (
                        Measured::ph(ph, None).unwrap(),
                        Measured::per_kg(crate::sample::measured::Parameter::Alkalinity, ta)
                            .unwrap(),
                    );
                    let sol = solve(&k, &a, &b, &SolveOptions::default()).unwrap();
                    let again = free_calcium(&k, sol.h, sol.dic, ca_total);
                    assert!((again / ca - 1.0).abs() < 1e-13, "{t} {ca_total} {ph} {ta}");
                    // The fixed point settles there at its first trial.
                    let s = basis
                        .converge_pair(&a, &b, RootChoice::Natural, &Near::default())
                        .unwrap();
                    assert_eq!(s.ca, ca, "{t} {ca_total} {ph} {ta}");
                    // Alkalinity with the CO2* of that water: the root in h
                    // gives back its h and free calcium, and the shared
                    // solver at that calcium gives back the same calcium.
                    let co2 =
                        sol.dic / (1.0 + k.k1e() / sol.h + k.k1e() * k.k2e() / (sol.h * sol.h));
                    let k0 = basis.constants_at(i, ca_total, ca_total);
                    let (h2, ca2) =
                        free_calcium_at_alkalinity_and_co2(&k0, ta, co2, ca_total, 1e-8).unwrap();
                    assert!((h2 / sol.h - 1.0).abs() < 1e-9, "{t} {ca_total} {ph} {ta}");
                    assert!((ca2 / ca - 1.0).abs() < 1e-9, "{t} {ca_total} {ph} {ta}");
                    let mut k2 = k0.clone();
                    k2.set_free_calcium(ca2);
                    let gas =
                        Measured::per_kg(crate::sample::measured::Parameter::Co2, co2).unwrap();
                    let sol2 = solve(&k2, &b, &gas, &SolveOptions::default()).unwrap();
                    let again = free_calcium(&k2, sol2.h, sol2.dic, ca_total);
                    assert!(
                        (again / ca2 - 1.0).abs() < 1e-12,
                        "{t} {ca_total} {ph} {ta}"
                    );
                    let s2 = basis
                        .converge_pair(&b, &gas, RootChoice::Natural, &Near::default())
                        .unwrap();
                    assert!(
                        (s2.ca / ca2 - 1.0).abs() < 1e-12,
                        "{t} {ca_total} {ph} {ta}"
                    );
                    // Alkalinity with the DIC of that water: the same.
                    let (h3, ca3) =
                        free_calcium_at_alkalinity_and_dic(&k0, ta, sol.dic, ca_total, 1e-8)
                            .unwrap();
                    assert!((h3 / sol.h - 1.0).abs() < 1e-9, "{t} {ca_total} {ph} {ta}");
                    assert!((ca3 / ca - 1.0).abs() < 1e-9, "{t} {ca_total} {ph} {ta}");
                    let dic =
                        Measured::per_kg(crate::sample::measured::Parameter::Dic, sol.dic).unwrap();
                    let s3 = basis
                        .converge_pair(&b, &dic, RootChoice::Natural, &Near::default())
                        .unwrap();
                    assert!(
                        (s3.ca / ca3 - 1.0).abs() < 1e-12,
                        "{t} {ca_total} {ph} {ta}"
                    );
                    assert!(
                        (s3.sol.h / h3 - 1.0).abs() < 1e-9,
                        "{t} {ca_total} {ph} {ta}"
                    );
                }
            }
        }
    }
}
