//! Perturbing one constant of a [`Constants`] value and re-deriving what
//! follows from it: the hook for propagating the uncertainty of a constant.

use super::constants::{scale_factors, Constants, ScaleLink};
use crate::base::error::{Error, Result};
use crate::base::field::Field;
use crate::base::numeric::{Real, Tangent};
use crate::properties::scales::PhScale;
use crate::sample::inputs::Total;

/// One constant of a [`Constants`] value, to perturb with
/// [`Constants::with_pk`] or [`Constants::with_scaled`].
///
/// ```
/// use travertine::medium::ConstantName;
/// assert_eq!(ConstantName::K1.name(), "K1");
/// assert_eq!(ConstantName::ALL.len(), 18);
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum ConstantName {
    /// K0, the CO2 solubility.
    K0,
    /// K1 of carbonic acid (K1e follows).
    K1,
    /// K2 of carbonic acid (K2e follows).
    K2,
    /// KB, boric acid.
    Kb,
    /// KW, the ion product of water.
    Kw,
    /// Ksp of calcite (its stored logarithm follows).
    KspCalcite,
    /// Ksp of aragonite (its stored logarithm follows).
    KspAragonite,
    /// KS, bisulfate on the free scale (the pH-scale factors follow).
    Ks,
    /// KF, hydrogen fluoride on the free scale (the pH-scale factors follow).
    Kf,
    /// KP1, phosphoric acid.
    Kp1,
    /// KP2, phosphoric acid.
    Kp2,
    /// KP3, phosphoric acid.
    Kp3,
    /// KSi, silicic acid.
    Ksi,
    /// KNH4, ammonium.
    Knh4,
    /// KH2S, hydrogen sulfide.
    Kh2s,
    /// The total boron, mol/kg (scaled like a constant).
    BoronTotal,
    /// K of the CaHCO3+ ion pair (association, Ca++ + HCO3- ⇌ CaHCO3+;
    /// fresh water: the pair ratios, K1e and K2e follow). Its "pK" is
    /// −log10 K. Zero in saline water, which has no ion pairs.
    CaHco3Pair,
    /// K of the CaCO3⁰ ion pair (association, Ca++ + CO3-- ⇌ CaCO3⁰), as
    /// [`ConstantName::CaHco3Pair`].
    CaCo3Pair,
}

impl ConstantName {
    /// Every constant that can be perturbed.
    pub const ALL: [ConstantName; 18] = [
        ConstantName::K0,
        ConstantName::K1,
        ConstantName::K2,
        ConstantName::Kb,
        ConstantName::Kw,
        ConstantName::KspCalcite,
        ConstantName::KspAragonite,
        ConstantName::Ks,
        ConstantName::Kf,
        ConstantName::Kp1,
        ConstantName::Kp2,
        ConstantName::Kp3,
        ConstantName::Ksi,
        ConstantName::Knh4,
        ConstantName::Kh2s,
        ConstantName::BoronTotal,
        ConstantName::CaHco3Pair,
        ConstantName::CaCo3Pair,
    ];

    /// The name, as in warnings and errors.
    ///
    /// ```
    /// # use travertine::medium::ConstantName;
    /// assert_eq!(ConstantName::KspCalcite.name(), "Ksp calcite");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            ConstantName::K0 => "K0",
            ConstantName::K1 => "K1",
            ConstantName::K2 => "K2",
            ConstantName::Kb => "KB",
            ConstantName::Kw => "KW",
            ConstantName::KspCalcite => "Ksp calcite",
            ConstantName::KspAragonite => "Ksp aragonite",
            ConstantName::Ks => "KS",
            ConstantName::Kf => "KF",
            ConstantName::Kp1 => "KP1",
            ConstantName::Kp2 => "KP2",
            ConstantName::Kp3 => "KP3",
            ConstantName::Ksi => "KSi",
            ConstantName::Knh4 => "KNH4",
            ConstantName::Kh2s => "KH2S",
            ConstantName::BoronTotal => "total boron",
            ConstantName::CaHco3Pair => "K CaHCO3+",
            ConstantName::CaCo3Pair => "K CaCO3 pair",
        }
    }
}

impl<R: Real> Constants<R> {
    /// How the NBS scale ties to the others in these constants, recovered
    /// rather than stored (a stored copy would be one more value to keep in
    /// step): γH from the activity coefficients in fresh water; in saline
    /// water fH as the ratio of the NBS and sea-water factors, which does not
    /// depend on KS or KF.
    fn scale_link(&self) -> ScaleLink<R> {
        match (self.working_scale, self.gammas) {
            (PhScale::Nbs, Some(g)) => ScaleLink::Nbs {
                gamma_h: g.hydrogen,
            },
            (PhScale::Nbs, None) => ScaleLink::Nbs {
                gamma_h: self.free_per_working.under(1.0),
            },
            _ => ScaleLink::Total {
                fh: self.nbs_per_working / self.seawater_per_working,
            },
        }
    }

    /// Re-derives the pH-scale factors from the stored KS, KF and totals, by
    /// [`scale_factors`], with their stored logarithms.
    fn refresh_scale_factors(&mut self) {
        let f = scale_factors(
            self.scale_link(),
            self.totals.sulfate_mol_kg,
            self.totals.fluoride_mol_kg,
            self.ks_free,
            self.kf_free,
        );
        self.free_per_working = f.free_per_working;
        self.seawater_per_working = f.seawater_per_working;
        self.total_per_working = f.total_per_working;
        self.nbs_per_working = f.nbs_per_working;
        match (&mut self.logs, f.logs) {
            (Some(logs), Some(per_working)) => logs.per_working = per_working,
            // Not stored with the factors: evaluated by the state instead.
            (logs, _) => *logs = None,
        }
    }

    /// These constants with one of them multiplied by `factor`, and every
    /// value that follows from it derived again:
    /// - K1, K2 or an ion-pair constant: K1e, K2e and the pair ratios, by
    ///   the code that sets the free calcium, at the current free calcium
    ///   (p1 = K_CaHCO3 Ca, p2 = K_CaCO3 Ca, K1e = K1 (1 + p1),
    ///   K2e = K2 (1 + p2)/(1 + p1); in saline water K1e = K1, K2e = K2);
    /// - a Ksp: its stored logarithm, raised by log10 `factor`;
    /// - KS or KF: the pH-scale factors, by the function that derives them
    ///   for [`Constants::saline`] (see [`Constants::free_per_working`]).
    ///   The other acid constants are held on the working scale: only the
    ///   other scales, and the bisulfate and HF parts of the alkalinity,
    ///   move.
    ///
    /// A constant that was not evaluated (its total is zero) stays 0. This is
    /// the step of a perturbation analysis (the uncertainty of a result from
    /// that of a constant); [`crate::PreparedWater::with_constants_perturbed`]
    /// solves with the result.
    ///
    /// # Errors
    /// [`crate::Error::NotFinite`] for a factor, or a result, that is not
    /// finite; [`crate::Error::Computation`] for a factor that is not
    /// positive, or a constant or scale factor it would take to zero or
    /// beyond the largest number.
    ///
    /// ```
    /// use travertine::{Conditions, Water, medium::ConstantName};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// let more = k.clone().with_scaled(ConstantName::KspCalcite, 1.5)?;
    /// assert!((more.ksp_calcite() / k.ksp_calcite() - 1.5).abs() < 1e-15);
    /// assert!(k.with_scaled(ConstantName::K1, f64::NAN).is_err());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_scaled(mut self, which: ConstantName, factor: R) -> Result<Constants<R>> {
        self.scale_in_place(which, factor)?;
        Ok(self)
    }

    /// [`Constants::with_scaled`] in place (for the propagation of
    /// uncertainties, which perturbs a scratch copy of the constants one
    /// constant at a time: see [`Constants::copy_numbers_from`]). On an
    /// error the constants may be left part-way and must be copied again.
    pub(crate) fn scale_in_place(&mut self, which: ConstantName, factor: R) -> Result<()> {
        use ConstantName as C;
        if !factor.value().is_finite() {
            return Err(Error::NotFinite {
                field: Field::Factor,
                value: factor.value(),
            });
        }
        if factor.value() <= 0.0 {
            return Err(Error::Computation {
                field: Field::Constant,
                reason: format!(
                    "{} can only be scaled by a positive factor, not {}",
                    which.name(),
                    factor.value()
                ),
            });
        }
        let slot = self.number_mut(which);
        let before = *slot;
        let after = before * factor;
        let (f, a) = (factor.value(), after.value());
        if !a.is_finite() {
            return Err(Error::Computation {
                field: Field::Constant,
                reason: format!("{} scaled by {f} would be {a}", which.name()),
            });
        }
        if before.value() > 0.0 && a <= 0.0 {
            return Err(Error::Computation {
                field: Field::Constant,
                reason: format!("{} scaled by {f} would be zero", which.name()),
            });
        }
        *slot = after;
        let log10 = |x: R| x.log10_via_ln();
        match which {
            C::K1 | C::K2 | C::CaHco3Pair | C::CaCo3Pair => {
                self.set_free_calcium(self.calcium_free_mol_kg)
            }
            C::KspCalcite => {
                if let Some(logs) = &mut self.logs {
                    logs.ksp_calcite += log10(factor);
                }
            }
            C::KspAragonite => {
                if let Some(logs) = &mut self.logs {
                    logs.ksp_aragonite += log10(factor);
                }
            }
            C::Ks | C::Kf => self.refresh_scale_factors(),
            _ => {}
        }
        self.check_derived(which)
    }

    /// These constants with pK = −log10 K of one of them raised by
    /// `delta_pk`: K multiplied by 10^(−`delta_pk`), and everything that
    /// follows from it derived again, as [`Constants::with_scaled`]. For
    /// [`ConstantName::BoronTotal`] the total is multiplied by the same
    /// factor (use [`Constants::with_scaled`] for a relative change).
    ///
    /// # Errors
    /// As [`Constants::with_scaled`]; [`crate::Error::NotFinite`] also for a
    /// `delta_pk` that is not finite.
    ///
    /// ```
    /// use travertine::{Conditions, Water, medium::ConstantName};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// let p = k.clone().with_pk(ConstantName::K1, 0.01)?;
    /// assert!((-p.k1().log10() + k.k1().log10() - 0.01).abs() < 1e-12);
    /// assert_eq!(p.k1e(), p.k1()); // no calcium pairs in saline water
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn with_pk(mut self, which: ConstantName, delta_pk: R) -> Result<Constants<R>> {
        self.pk_in_place(which, delta_pk)?;
        Ok(self)
    }

    /// [`Constants::with_pk`] in place, as [`Constants::scale_in_place`].
    pub(crate) fn pk_in_place(&mut self, which: ConstantName, delta_pk: R) -> Result<()> {
        if !delta_pk.value().is_finite() {
            return Err(Error::NotFinite {
                field: Field::DeltaPk,
                value: delta_pk.value(),
            });
        }
        self.scale_in_place(which, (-delta_pk).pow10())
    }

    /// Saline constants with total `which` raised by `by_mol_kg`, and what
    /// follows from it (calcium: the free calcium of Ω, which is the total
    /// in saline water), for a total the water has (above zero: the
    /// constants of its system were evaluated) and that no other constant
    /// follows: phosphate, silicate, ammonia, sulfide or calcium. `false`
    /// (and nothing changed) otherwise, and in fresh water, whose totals
    /// move the ionic strength and the ion pairs of the fixed point.
    pub(crate) fn shift_saline_total(&mut self, which: Total, by_mol_kg: R) -> bool {
        if self.working_scale != PhScale::Total {
            return false;
        }
        let t = &mut self.totals;
        let slot = match which {
            Total::Phosphate => &mut t.phosphate_mol_kg,
            Total::Silicate => &mut t.silicate_mol_kg,
            Total::Ammonia => &mut t.ammonia_mol_kg,
            Total::Sulfide => &mut t.sulfide_mol_kg,
            Total::Calcium => &mut t.calcium_mol_kg,
            _ => return false,
        };
        if slot.value() <= 0.0 {
            return false;
        }
        *slot += by_mol_kg;
        if which == Total::Calcium {
            self.calcium_free_mol_kg = self.totals.calcium_mol_kg;
        }
        true
    }

    /// Every value of `other` but its warnings, which are left empty: the
    /// copy a perturbation in place starts from again, without allocating.
    pub(crate) fn copy_numbers_from(&mut self, other: &Constants<R>) {
        *self = Constants {
            warnings: Vec::new(),
            ..*other
        };
    }

    /// The number of constant `which` (the total boron for
    /// [`ConstantName::BoronTotal`]), to scale in place.
    fn number_mut(&mut self, which: ConstantName) -> &mut R {
        use ConstantName as C;
        match which {
            C::K0 => &mut self.k0,
            C::K1 => &mut self.k1,
            C::K2 => &mut self.k2,
            C::Kb => &mut self.kb,
            C::Kw => &mut self.kw,
            C::KspCalcite => &mut self.ksp_calcite,
            C::KspAragonite => &mut self.ksp_aragonite,
            C::Ks => &mut self.ks_free,
            C::Kf => &mut self.kf_free,
            C::Kp1 => &mut self.kp1,
            C::Kp2 => &mut self.kp2,
            C::Kp3 => &mut self.kp3,
            C::Ksi => &mut self.ksi,
            C::Knh4 => &mut self.knh4,
            C::Kh2s => &mut self.kh2s,
            C::BoronTotal => &mut self.totals.boron_mol_kg,
            C::CaHco3Pair => &mut self.k_cahco3,
            C::CaCo3Pair => &mut self.k_caco3,
        }
    }

    /// Refuses constants whose derived values a perturbation of `which`
    /// took out of range (a K1e that overflows, a scale factor of zero).
    fn check_derived(&self, which: ConstantName) -> Result<()> {
        // Values only: a copy of the numbers would carry their derivatives.
        let positive = [
            self.free_per_working.value(),
            self.seawater_per_working.value(),
            self.total_per_working.value(),
            self.nbs_per_working.value(),
        ];
        let finite = [
            self.k1e.value(),
            self.k2e.value(),
            self.pair_hco3.value(),
            self.pair_co3.value(),
        ];
        let logs = self.logs.as_ref().map(|l| {
            let v = |x: &R| x.value();
            [
                v(&l.per_working[0]),
                v(&l.per_working[1]),
                v(&l.per_working[2]),
                v(&l.per_working[3]),
                v(&l.ksp_calcite),
                v(&l.ksp_aragonite),
            ]
        });
        let bad = positive
            .into_iter()
            .find(|v| !(v.is_finite() && *v > 0.0))
            .or_else(|| finite.into_iter().find(|v| !v.is_finite()))
            .or_else(|| logs.and_then(|l| l.into_iter().find(|v| !v.is_finite())));
        match bad {
            None => Ok(()),
            Some(value) => Err(Error::Computation {
                field: Field::Constant,
                reason: format!(
                    "perturbing {} would leave a derived value of {value}",
                    which.name()
                ),
            }),
        }
    }
}

impl<const N: usize> Constants<Tangent<N>> {
    /// The pK of each constant of `seeds` a source at zero on its slot
    /// (the total boron: log10 of its factor), for a pass on tangents:
    /// each constant scaled by 10^(−δ) at δ = 0, a factor of exactly 1 with
    /// the slope −ln 10 in its slot, as [`Constants::scale_in_place`]
    /// scales it. The values do not move (K · 1 is K), so nothing derived
    /// from them can leave its range and nothing is checked again; each
    /// constant's number gains −ln 10 · K in its slot (K · (1 + ε) to
    /// first order), a solubility product's log10 −ln 10 · log10 e, and
    /// the apparent constants that follow from K1, K2 and the calcium ion
    /// pairs are derived again once for all of them. KS and KF, whose
    /// pH-scale factors follow, take [`Constants::scale_in_place`] itself.
    ///
    /// # Errors
    /// As [`Constants::scale_in_place`] for KS and KF.
    pub(crate) fn seed_pks(&mut self, seeds: &[(ConstantName, usize)]) -> Result<()> {
        use ConstantName as C;
        let slope = -std::f64::consts::LN_10;
        let mut apparent = false;
        for &(which, slot) in seeds {
            if matches!(which, C::Ks | C::Kf) {
                let mut factor = Tangent::<N>::new(1.0, [0.0; N]);
                if let Some(d) = factor.d.get_mut(slot) {
                    *d = slope;
                }
                self.scale_in_place(which, factor)?;
                continue;
            }
            let k = self.number_mut(which);
            let v = k.v;
            if let Some(d) = k.d.get_mut(slot) {
                *d += slope * v;
            }
            let log = match which {
                C::KspCalcite => self.logs.as_mut().map(|l| &mut l.ksp_calcite),
                C::KspAragonite => self.logs.as_mut().map(|l| &mut l.ksp_aragonite),
                _ => None,
            };
            if let Some(d) = log.and_then(|l| l.d.get_mut(slot)) {
                *d += slope * std::f64::consts::LOG10_E;
            }
            apparent |= matches!(which, C::K1 | C::K2 | C::CaHco3Pair | C::CaCo3Pair);
        }
        if apparent {
            self.set_free_calcium(self.calcium_free_mol_kg);
        }
        Ok(())
    }
}

/// The plain name, as [`ConstantName::name`] gives it.
///
/// ```
/// assert_eq!(travertine::medium::ConstantName::K1.to_string(), "K1");
/// ```
impl std::fmt::Display for ConstantName {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::base::field::Field;
    use crate::fits::Fits;
    use crate::sample::{Composition, Conditions};

    fn sea_water(p_dbar: f64) -> Constants {
        let c = Conditions::new(25.0, 35.0).and_then(|c| c.with_pressure_dbar(p_dbar));
        Constants::saline(&c.unwrap(), &Composition::default(), &Fits::default()).unwrap()
    }

    /// A perturbed Ksp, KS or KF keeps the stored logarithms those of the
    /// values stored beside them, at the surface and under pressure.
    #[test]
    fn perturbed_constants_keep_their_logarithms_in_step() {
        for p in [0.0, 3000.0] {
            for which in [
                ConstantName::KspCalcite,
                ConstantName::KspAragonite,
                ConstantName::Ks,
                ConstantName::Kf,
            ] {
                let k = sea_water(p).with_pk(which, 0.07).unwrap();
                let stored = k.log10s();
                let evaluated = Constants { logs: None, ..k }.log10s();
                for (a, b) in stored.per_working.iter().zip(evaluated.per_working) {
                    assert!((a - b).abs() < 1e-13, "{which:?}: {a} against {b}");
                }
                assert!((stored.ksp_calcite - evaluated.ksp_calcite).abs() < 1e-12);
                assert!((stored.ksp_aragonite - evaluated.ksp_aragonite).abs() < 1e-12);
            }
        }
    }

    /// Seeding pK sources on tangents all at once gives the very numbers
    /// that scaling each constant by a factor of 1 with the slope −ln 10
    /// in its slot gives, one at a time (the values bit for bit, the
    /// derivatives to rounding), in both media.
    #[test]
    fn seeded_pks_are_scalings_by_one_on_tangents() {
        let fresh = crate::sample::Water::fresh(Conditions::new(15.0, 0.3).unwrap())
            .unwrap()
            .with_composition(
                Composition::default()
                    .with_calcium(crate::units::Amount::PerKg(1e-3))
                    .unwrap(),
            )
            .constants()
            .unwrap();
        for k in [sea_water(0.0), sea_water(2000.0), fresh] {
            let seeds: Vec<(ConstantName, usize)> = ConstantName::ALL
                .iter()
                .enumerate()
                .map(|(slot, &c)| (c, slot))
                .collect();
            let lifted: Constants<Tangent<18>> = k.lift();
            let mut seeded = lifted.clone();
            seeded.seed_pks(&seeds).unwrap();
            let mut scaled = lifted;
            for &(which, slot) in &seeds {
                let mut factor = Tangent::<18>::new(1.0, [0.0; 18]);
                factor.d[slot] = -std::f64::consts::LN_10;
                scaled.scale_in_place(which, factor).unwrap();
            }
            let values = |c: &Constants<Tangent<18>>| c.map_numbers(|x| x.v);
            assert_eq!(values(&seeded), values(&scaled));
            let derivatives = |c: &Constants<Tangent<18>>| {
                let all = std::cell::RefCell::new(Vec::new());
                let _ = c.map_numbers(|x| {
                    all.borrow_mut().extend(x.d);
                    x.v
                });
                all.into_inner()
            };
            let (a, b) = (derivatives(&seeded), derivatives(&scaled));
            assert_eq!(a.len(), b.len());
            assert!(a.iter().any(|d| *d != 0.0));
            for (x, y) in a.iter().zip(&b) {
                assert!(
                    (x - y).abs() <= 1e-12 * x.abs().max(y.abs()),
                    "{x} against {y}"
                );
            }
        }
    }

    /// Perturbing KS twice by opposite amounts gives the scale factors
    /// back: they are derived from KS, not carried along.
    #[test]
    fn scale_factors_follow_ks_both_ways() {
        let k = sea_water(1000.0);
        let there_and_back = k
            .clone()
            .with_pk(ConstantName::Ks, 0.3)
            .and_then(|k| k.with_pk(ConstantName::Ks, -0.3))
            .unwrap();
        for (a, b) in [
            (k.free_per_working, there_and_back.free_per_working),
            (k.seawater_per_working, there_and_back.seawater_per_working),
            (k.nbs_per_working, there_and_back.nbs_per_working),
        ] {
            assert!((a / b - 1.0).abs() < 1e-14, "{a} against {b}");
        }
        // The moved KS moves the free scale as 1/(1 + ST/KS).
        let moved = k.clone().with_pk(ConstantName::Ks, 0.3).unwrap();
        let expected = 1.0 / (1.0 + k.totals.sulfate_mol_kg / (k.ks_free * 10f64.powf(-0.3)));
        assert!((moved.free_per_working / expected - 1.0).abs() < 1e-14);
        assert_eq!(moved.total_per_working, 1.0);
    }

    /// Every constant can be perturbed, and only the one named (and what
    /// follows from it) moves.
    #[test]
    fn each_name_moves_its_own_constant() {
        use crate::base::units::Amount;
        let every_total = Composition::default()
            .with_phosphate(Amount::PerKg(2e-6))
            .and_then(|c| c.with_silicate(Amount::PerKg(50e-6)))
            .and_then(|c| c.with_ammonia(Amount::PerKg(1e-6)))
            .and_then(|c| c.with_sulfide(Amount::PerKg(1e-6)))
            .unwrap();
        let c = Conditions::new(25.0, 35.0).unwrap();
        let k = Constants::saline(&c, &every_total, &Fits::default()).unwrap();
        let value = |k: &Constants, which: ConstantName| match which {
            ConstantName::K0 => k.k0,
            ConstantName::K1 => k.k1,
            ConstantName::K2 => k.k2,
            ConstantName::Kb => k.kb,
            ConstantName::Kw => k.kw,
            ConstantName::KspCalcite => k.ksp_calcite,
            ConstantName::KspAragonite => k.ksp_aragonite,
            ConstantName::Ks => k.ks_free,
            ConstantName::Kf => k.kf_free,
            ConstantName::Kp1 => k.kp1,
            ConstantName::Kp2 => k.kp2,
            ConstantName::Kp3 => k.kp3,
            ConstantName::Ksi => k.ksi,
            ConstantName::Knh4 => k.knh4,
            ConstantName::Kh2s => k.kh2s,
            ConstantName::BoronTotal => k.totals.boron_mol_kg,
            ConstantName::CaHco3Pair => k.k_cahco3,
            ConstantName::CaCo3Pair => k.k_caco3,
        };
        let pairs = [ConstantName::CaHco3Pair, ConstantName::CaCo3Pair];
        for which in ConstantName::ALL {
            if pairs.contains(&which) {
                // No ion pairs in sea water: they stay 0, and so does every
                // other constant.
                let p = k.clone().with_scaled(which, 1.25).unwrap();
                assert_eq!((value(&p, which), p.k1e, p.k2e), (0.0, k.k1e, k.k2e));
                continue;
            }
            assert!(value(&k, which) > 0.0, "{which:?} not evaluated");
            let p = k.clone().with_scaled(which, 1.25).unwrap();
            for other in ConstantName::ALL {
                let (a, b) = (value(&k, other), value(&p, other));
                if other == which {
                    assert!((b - 1.25 * a).abs() <= 1e-15 * b.abs(), "{which:?}");
                } else {
                    assert_eq!(a, b, "{which:?} moved {other:?}");
                }
            }
        }
    }

    /// A perturbation that cannot give finite, positive constants is
    /// refused, never a panic.
    #[test]
    fn impossible_perturbations_are_refused() {
        let k = sea_water(0.0);
        let refused = |which, factor: f64| k.clone().with_scaled(which, factor).is_err();
        assert!(refused(ConstantName::K1, f64::NAN));
        assert!(refused(ConstantName::K1, f64::INFINITY));
        assert!(refused(ConstantName::K1, 0.0));
        assert!(refused(ConstantName::K1, -1.0));
        // A product beyond the largest number, one below the smallest.
        let twice = k
            .clone()
            .with_scaled(ConstantName::K0, 1e300)
            .and_then(|k| k.with_scaled(ConstantName::K0, 1e300));
        assert!(matches!(
            twice,
            Err(Error::Computation {
                field: Field::Constant,
                ..
            })
        ));
        assert!(refused(ConstantName::K1, 1e-320));
        // A KF so small that FT/KF overflows the sea-water scale factor.
        assert!(refused(ConstantName::Kf, 1e-310));
        assert!(k.clone().with_pk(ConstantName::K1, f64::NAN).is_err());
        assert!(k.clone().with_pk(ConstantName::K1, -400.0).is_err());
        assert!(k.clone().with_pk(ConstantName::K1, 400.0).is_err());
        // Errors name the constant.
        match k.clone().with_scaled(ConstantName::Kf, 1e-310) {
            Err(e @ Error::Computation { .. }) => {
                assert_eq!(e.field(), Some(Field::Constant));
                assert!(e.to_string().contains("KF"), "{e}");
            }
            other => panic!("{other:?}"),
        }
    }
}
