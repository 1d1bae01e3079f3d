//! The speciation-independent part of a fresh water's constants, and the
//! apparent constants at an ionic strength and free calcium.

use super::ionic::{fixed_ionic_strength_at, ion_sum, route};
use super::FreshBasis;
use crate::base::error::Result;
use crate::base::numeric::Real;
use crate::fits::thermodynamic as pb;
use crate::fits::{nutrients, sulfate, sulfide, FitName, FitsUsed};
use crate::medium::constants::{scale_factors, Paired, ScaleLink};
use crate::medium::{ConstantName, Constants};
use crate::properties::activity::Gammas;
use crate::properties::density::density_kg_m3;
use crate::properties::scales::PhScale;
use crate::sample::water::Water;
use crate::sample::Totals;

/// The numbers of a fresh water that can be sources of uncertainty, as
/// numbers of any [`Real`], for [`FreshBasis::new_at`]: on a
/// [`Tangent`](crate::base::numeric::Tangent), each seeded with the
/// derivatives the propagation wants carried. Every value must be the
/// water's own (its conditions and options, which the basis still reads for
/// names, ranges and warnings): the derivatives are what they add.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct FreshSources<R: Real = f64> {
    /// Temperature, °C (the water's `temperature_c`).
    pub(crate) temperature_c: R,
    /// Practical salinity (the water's `salinity`).
    pub(crate) salinity: R,
    /// The number the fixed ionic strength is made from, by the water's
    /// route: specific conductance (µS/cm), TDS (mg/L) or the ionic
    /// strength given (mol/kg); `None` for the water's own number (a
    /// constant). Not read on the salinity route (which reads `salinity`)
    /// nor where the ions give the ionic strength.
    pub(crate) fixed_ionic_input: Option<R>,
    /// Added to the total calcium (mol/kg) the composition gives at the
    /// basis's density; `None` adds nothing. A shift of value 0 carrying
    /// the calcium source's derivative keeps the per-litre conversion's
    /// derivatives with temperature and salinity, as moving the calcium
    /// as a per-kg total does in the propagation (`Problem::shifted`).
    pub(crate) calcium_shift_mol_kg: Option<R>,
}

impl<R: Real> FreshSources<R> {
    /// The water's own numbers, as constants (no derivatives).
    pub(crate) fn of(water: &Water) -> Self {
        let c = water.conditions();
        FreshSources {
            temperature_c: R::constant(c.temperature_c()),
            salinity: R::constant(c.salinity()),
            fixed_ionic_input: None,
            calcium_shift_mol_kg: None,
        }
    }
}

impl FreshBasis {
    /// The basis of `water`, a fresh water. With `every_constant` false,
    /// the constants of acid systems whose total is zero, and the calcium
    /// constants without calcium, are not evaluated and hold 0 (as in
    /// saline water); a solve never reads them.
    pub(crate) fn new(water: &Water, every_constant: bool) -> Result<Self> {
        Self::new_at(water, &FreshSources::of(water), every_constant)
    }
}

impl<R: Real> FreshBasis<R> {
    /// The basis of `water`, a fresh water, on any [`Real`], with the
    /// numbers that can be sources of uncertainty taken from `sources`
    /// (their values must be the water's): temperature and salinity move
    /// every constant through the fits, the density and through it a total
    /// given per litre; the fixed ionic strength moves with its input (or
    /// the salinity); the calcium total with its shift. Pressure, the air
    /// pressure and the totals other than calcium are the water's
    /// constants. On `f64` with [`FreshSources::of`] the water, it is
    /// [`FreshBasis::new`], the same numbers bit for bit; the range
    /// warnings read the values.
    pub(crate) fn new_at(
        water: &Water,
        sources: &FreshSources<R>,
        every_constant: bool,
    ) -> Result<Self> {
        let c = water.conditions();
        let zero = R::constant(0.0);
        let t_c = sources.temperature_c;
        let s = sources.salinity;
        let t = t_c + 273.15;
        let mut warnings = Vec::new();
        let density = density_kg_m3(s, t_c)?;
        let rho_w = density_kg_m3(zero, t_c)? / 1000.0;
        let mut totals = water.composition().fresh_totals(density);
        if let Some(shift) = sources.calcium_shift_mol_kg {
            totals.calcium_mol_kg += shift;
        }
        let t_value = t_c.value();
        pb::PLUMMER_BUSENBERG1982_RANGE.check_for(
            "K0, K1, K2, calcite and aragonite",
            t_value,
            0.0,
            &mut warnings,
        );
        pb::HARNED_OWEN_RANGE.check_for("KW", t_value, 0.0, &mut warnings);
        if totals.calcium_mol_kg.value() > 0.0 {
            pb::CAHCO3_RANGE.check_for("CaHCO3+ pair", t_value, 0.0, &mut warnings);
            pb::CACO3_RANGE.check_for("CaCO3 pair", t_value, 0.0, &mut warnings);
        }
        if totals.ammonia_mol_kg.value() > 0.0 {
            pb::EMERSON1975_RANGE.check_for("KNH4", t_value, 0.0, &mut warnings);
        }
        // A constant whose total is zero is not evaluated (it stays 0, as in
        // saline water): each costs an exponential per prepared water.
        let given = |total: R, k: &dyn Fn() -> R| {
            if every_constant || total.value() > 0.0 {
                k()
            } else {
                zero
            }
        };
        let kp = if every_constant || totals.phosphate_mol_kg.value() > 0.0 {
            let (lp1, lp2, lp3) = nutrients::millero1995_ln_kp(t, zero);
            (lp1.exp(), lp2.exp(), lp3.exp())
        } else {
            (zero, zero, zero)
        };
        let calcium = totals.calcium_mol_kg;
        let model = water.fresh_options().activity;
        let route = route(water);
        let (dh_a, dh_b) = crate::properties::activity::debye_huckel_coefficients(t_c, rho_w);
        let mut b = FreshBasis {
            conditions: *c,
            at: [t_c, s, R::constant(c.pressure_dbar())],
            model,
            dh_a,
            dh_b,
            kh: pb::log_kh(t).pow10(),
            k1: pb::log_k1(t).pow10(),
            k2: pb::log_k2(t).pow10(),
            kw: pb::log_kw(t).pow10(),
            // Pure-water limits (S = 0) of the sea-water fits.
            kb: given(totals.boron_mol_kg, &|| {
                crate::fits::boron::dickson1990_ln_kb(t, zero).exp()
            }),
            kp,
            ksi: given(totals.silicate_mol_kg, &|| {
                nutrients::millero1995_ln_ksi(t, zero).exp()
            }),
            ks: given(totals.sulfate_mol_kg, &|| {
                sulfate::dickson1990_ln_ks(t, zero).exp()
            }),
            kf: given(totals.fluoride_mol_kg, &|| (t.under(1590.2) - 12.641).exp()),
            knh4: given(totals.ammonia_mol_kg, &|| (-pb::emerson1975_pka(t)).pow10()),
            kh2s: given(totals.sulfide_mol_kg, &|| {
                (-sulfide::millero1988_pk1(t, zero)).pow10()
            }),
            ksp_calcite: given(calcium, &|| pb::log_ksp_calcite(t).pow10()),
            ksp_aragonite: given(calcium, &|| pb::log_ksp_aragonite(t).pow10()),
            k_cahco3: given(calcium, &|| pb::log_k_cahco3(t).pow10()),
            k_caco3: given(calcium, &|| pb::log_k_caco3(t).pow10()),
            fugacity_factor: crate::fits::gas::weiss1974_fugacity_factor(
                t,
                R::constant(c.air_pressure_atm()),
            ),
            vapour_pressure_atm: crate::fits::gas::weiss_price1980_vapour_pressure_atm(t, zero),
            density,
            totals,
            fits_used: fresh_fits_used(&totals, model),
            route,
            fixed_i: fixed_ionic_strength_at(water, route, s, sources.fixed_ionic_input),
            i_start: zero,
            warnings,
        };
        let p_bar = c.pressure_bar();
        if p_bar > 0.0 {
            use crate::fits::pressure::*;
            let p_bar = R::constant(p_bar);
            let f = |k: &PressureCoefficients| pressure_factor(k, t_c, p_bar);
            b.k1 *= f(&K1);
            b.k2 *= f(&K2);
            b.kw *= f(&KW);
            b.kb *= f(&KB);
            b.kp = (b.kp.0 * f(&KP1), b.kp.1 * f(&KP2), b.kp.2 * f(&KP3));
            b.ksi *= f(&KSI);
            b.ks *= f(&KS);
            b.kf *= f(&KF);
            b.knh4 *= f(&KNH4);
            b.kh2s *= f(&KH2S);
            b.ksp_calcite *= f(&CALCITE);
            b.ksp_aragonite *= f(&ARAGONITE);
            // The caution on these sea-water coefficients, a note or a
            // warning by the size of the correction, is given by the flow
            // (`pressure_caution` in src/flow.rs), which compares the
            // solve with one at the surface.
        }
        // Where the ions give the ionic strength, start from the ions given
        // (with all calcium free) and no carbon.
        if b.fixed_i.is_none() {
            b.i_start = b.ion_start();
        }
        Ok(b)
    }

    /// The first ionic strength of a fixed point where the ions give it:
    /// the ions given, all calcium free, no carbon.
    #[inline]
    fn ion_start(&self) -> R {
        let ca = self.totals.calcium_mol_kg;
        let zero = R::constant(0.0);
        ion_sum(&self.constants_at(zero, ca, ca), R::constant(1e-8), zero).0
    }

    /// This basis with one thermodynamic constant perturbed: pK = −log10 K
    /// raised by `delta_pk` (for [`ConstantName::BoronTotal`] the total boron
    /// is multiplied by the same factor, 10^(−`delta_pk`)). The apparent
    /// constants of every ionic strength and free calcium a solve then tries
    /// are made from the perturbed value, so nothing derived from it can fall
    /// out of step; the starting ionic strength is made again with it.
    ///
    /// # Errors
    /// [`crate::Error::NotFinite`] for a `delta_pk` that is not finite;
    /// [`crate::Error::Computation`] for a result that is not finite and
    /// positive (a constant that was evaluated).
    pub(crate) fn with_pk(mut self, which: ConstantName, delta_pk: R) -> Result<Self> {
        self.pk_in_place(which, delta_pk)?;
        Ok(self)
    }

    /// [`FreshBasis::with_pk`] in place (for a scratch copy, see
    /// [`FreshBasis::copy_numbers_from`]); on an error the basis may be
    /// left part-way and must be copied again.
    pub(crate) fn pk_in_place(&mut self, which: ConstantName, delta_pk: R) -> Result<()> {
        use crate::base::error::Error;
        use crate::base::field::Field;
        if !delta_pk.value().is_finite() {
            return Err(Error::NotFinite {
                field: Field::DeltaPk,
                value: delta_pk.value(),
            });
        }
        let factor = (-delta_pk).pow10();
        let slot = self.number_mut(which);
        let before = *slot;
        let after = before * factor;
        let (b, a) = (before.value(), after.value());
        if !a.is_finite() || (b > 0.0 && a <= 0.0) {
            return Err(Error::Computation {
                field: Field::Constant,
                reason: format!(
                    "{} with its pK raised by {} would be {a}",
                    which.name(),
                    delta_pk.value()
                ),
            });
        }
        *slot = after;
        if self.fixed_i.is_none() {
            self.i_start = self.ion_start();
        }
        Ok(())
    }

    /// The number of constant `which` (the total boron for
    /// [`ConstantName::BoronTotal`]), to move in place.
    fn number_mut(&mut self, which: ConstantName) -> &mut R {
        use ConstantName as C;
        match which {
            C::K0 => &mut self.kh,
            C::K1 => &mut self.k1,
            C::K2 => &mut self.k2,
            C::Kb => &mut self.kb,
            C::Kw => &mut self.kw,
            C::KspCalcite => &mut self.ksp_calcite,
            C::KspAragonite => &mut self.ksp_aragonite,
            C::Ks => &mut self.ks,
            C::Kf => &mut self.kf,
            C::Kp1 => &mut self.kp.0,
            C::Kp2 => &mut self.kp.1,
            C::Kp3 => &mut self.kp.2,
            C::Ksi => &mut self.ksi,
            C::Knh4 => &mut self.knh4,
            C::Kh2s => &mut self.kh2s,
            C::BoronTotal => &mut self.totals.boron_mol_kg,
            C::CaHco3Pair => &mut self.k_cahco3,
            C::CaCo3Pair => &mut self.k_caco3,
        }
    }

    /// Every value of `other` but its range warnings, which are left
    /// empty: the copy a perturbation in place starts from again, without
    /// allocating.
    pub(crate) fn copy_numbers_from(&mut self, other: &FreshBasis<R>) {
        *self = FreshBasis {
            warnings: Vec::new(),
            ..*other
        };
    }

    /// Apparent constants at ionic strength `i`, free calcium `ca_free` and
    /// total calcium `ca_total` (mol/kg), without the range warnings.
    pub(crate) fn constants_at(&self, i: R, ca_free: R, ca_total: R) -> Constants<R> {
        let g = Gammas::from_coefficients(self.model, self.dh_a, self.dh_b, i);
        let (g1, g2, g3, gh, gca) = (
            g.monovalent,
            g.carbonate,
            g.trivalent,
            g.hydrogen,
            g.calcium,
        );
        let k1 = self.k1 / g1;
        let k2 = self.k2 * g1 / g2;
        let k_cahco3 = self.k_cahco3 * gca;
        let k_caco3 = self.k_caco3 * gca * g2;
        let mut t = self.totals;
        t.calcium_mol_kg = ca_total;
        let zero = R::constant(0.0);
        // Made only for a system the water has (on tangents a quotient is
        // far from free).
        let on = |total: R, k: &dyn Fn() -> R| if total.value() > 0.0 { k() } else { zero };
        // Concentration constants on free [H+]: [H][SO4]/[HSO4] = KS γ1/(γH γ2),
        // [H][F]/[HF] = KF/(γH γ1).
        let ks_free = self.ks * g1 / (gh * g2);
        let kf_free = self.kf / (gh * g1);
        let factors = scale_factors(
            ScaleLink::Nbs { gamma_h: gh },
            self.totals.sulfate_mol_kg,
            self.totals.fluoride_mol_kg,
            ks_free,
            kf_free,
        );
        // What follows from the free calcium, made before the constants
        // (which are then made where they are returned, not copied).
        let paired = Paired::of(k1, k2, k_cahco3, k_caco3, ca_free);
        Constants {
            conditions: self.conditions,
            working_scale: PhScale::Nbs,
            at: self.at,
            k0: self.kh,
            k1,
            k2,
            k1e: paired.k1e,
            k2e: paired.k2e,
            pair_hco3: paired.pair_hco3,
            pair_co3: paired.pair_co3,
            calcium_free_mol_kg: ca_free,
            ionic_strength: i,
            kb: on(t.boron_mol_kg, &|| self.kb / g1),
            kw: self.kw / g1,
            kp1: on(t.phosphate_mol_kg, &|| self.kp.0 / g1),
            kp2: on(t.phosphate_mol_kg, &|| self.kp.1 * g1 / g2),
            kp3: on(t.phosphate_mol_kg, &|| self.kp.2 * g2 / g3),
            ksi: on(t.silicate_mol_kg, &|| self.ksi / g1),
            knh4: on(t.ammonia_mol_kg, &|| self.knh4 * g1),
            kh2s: on(t.sulfide_mol_kg, &|| self.kh2s / g1),
            ks_free,
            kf_free,
            ksp_calcite: self.ksp_calcite / (gca * g2),
            ksp_aragonite: self.ksp_aragonite / (gca * g2),
            totals: t,
            free_per_working: factors.free_per_working,
            seawater_per_working: factors.seawater_per_working,
            total_per_working: factors.total_per_working,
            nbs_per_working: factors.nbs_per_working,
            fugacity_factor: self.fugacity_factor,
            vapour_pressure_atm: self.vapour_pressure_atm,
            density_kg_m3: self.density,
            fits_used: self.fits_used,
            // Attached only to the constants a caller sees (not on every
            // trial of a fixed point, where it would allocate).
            warnings: Vec::new(),
            gammas: Some(g),
            k_cahco3,
            k_caco3,
            logs: None,
        }
    }

    /// Attaches the range warnings of this basis to constants made from it
    /// (those a caller sees; not those of every trial of a fixed point).
    pub(crate) fn attach_warnings(&self, k: &mut Constants<R>) {
        k.warnings = self.warnings.clone();
    }

    /// The constants at the first ionic strength of a solve, with all
    /// calcium free, and the range warnings: what [`Water::constants`]
    /// returns for a fresh water.
    pub(crate) fn starting_constants(&self) -> Constants<R> {
        let ca = self.totals.calcium_mol_kg;
        let mut k = self.constants_at(self.fixed_i.unwrap_or(self.i_start), ca, ca);
        self.attach_warnings(&mut k);
        k
    }
}

pub(crate) fn fresh_fits_used<R: Real>(
    t: &Totals<R>,
    activity: crate::properties::activity::ActivityModel,
) -> FitsUsed {
    let pb = FitName::PlummerBusenberg1982;
    let given = |total: R| {
        if total.value() > 0.0 {
            FitName::Measured
        } else {
            FitName::NoneGiven
        }
    };
    FitsUsed {
        k0: pb,
        fugacity: FitName::Weiss1974,
        vapour_pressure: FitName::WeissPrice1980,
        carbonic: pb,
        boric: FitName::Dickson1990AtS0,
        boron_total: given(t.boron_mol_kg),
        kw: FitName::HarnedOwen1958,
        bisulfate: FitName::Dickson1990AtS0,
        sulfate_total: given(t.sulfate_mol_kg),
        fluoride: FitName::DicksonRiley1979AtS0,
        fluoride_total: given(t.fluoride_mol_kg),
        phosphate_silicate: FitName::Millero1995AtS0,
        ammonium: FitName::Emerson1975,
        sulfide: FitName::Millero1988AtS0,
        minerals: pb,
        calcium: given(t.calcium_mol_kg),
        pressure: FitName::Millero1995,
        nbs_scale: activity.into(),
        density: FitName::MilleroPoisson1981,
    }
}

impl<const N: usize> FreshBasis<crate::base::numeric::Tangent<N>> {
    /// The pK of each constant of `seeds` a source at zero on its slot, for
    /// a pass on tangents: [`FreshBasis::pk_in_place`] with a δ of zero on
    /// the slot (a factor 10^−δ of exactly 1 with the slope −ln 10), the
    /// same numbers, without an exponential per constant: each constant's
    /// value stays, and it gains −ln 10 · K in its slot. The starting
    /// ionic strength of a water whose ions give it follows once.
    pub(crate) fn seed_pks(&mut self, seeds: &[(ConstantName, usize)]) {
        let slope = -std::f64::consts::LN_10;
        for &(which, slot) in seeds {
            let k = self.number_mut(which);
            let v = k.v;
            if let Some(d) = k.d.get_mut(slot) {
                *d += slope * v;
            }
        }
        if self.fixed_i.is_none() && !seeds.is_empty() {
            self.i_start = self.ion_start();
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::sample::{Composition, Conditions};

    /// Seeding pK sources on tangents all at once gives the very numbers
    /// (values and derivatives) that raising each pK by a source at zero
    /// gives one at a time, for a water whose ionic strength is fixed and
    /// one whose ions give it (its starting ionic strength follows).
    #[test]
    fn seeded_pks_are_raises_by_zero_on_tangents() {
        use crate::base::numeric::Tangent;
        use crate::base::units::Amount;
        let ions = Composition::default()
            .with_calcium(Amount::PerKg(1e-3))
            .and_then(|c| c.with_magnesium(Amount::PerKg(4e-4)))
            .and_then(|c| c.with_sodium(Amount::PerKg(1e-3)))
            .and_then(|c| c.with_potassium(Amount::PerKg(1e-4)))
            .and_then(|c| c.with_chloride(Amount::PerKg(1.5e-3)))
            .and_then(|c| c.with_sulfate(Amount::PerKg(5e-4)))
            .unwrap();
        let fixed = Composition::default()
            .with_calcium(Amount::PerKg(1e-3))
            .unwrap();
        for composition in [fixed, ions] {
            let water = Water::fresh(Conditions::new(12.0, 0.3).unwrap())
                .unwrap()
                .with_composition(composition);
            let basis = FreshBasis::new(&water, true).unwrap();
            let lifted: FreshBasis<Tangent<18>> = basis.map_numbers(Tangent::constant);
            let seeds: Vec<(ConstantName, usize)> = ConstantName::ALL
                .iter()
                .enumerate()
                .map(|(slot, &c)| (c, slot))
                .collect();
            let mut seeded = lifted.clone();
            seeded.seed_pks(&seeds);
            let mut raised = lifted;
            for &(which, slot) in &seeds {
                raised
                    .pk_in_place(which, Tangent::source(0.0, slot))
                    .unwrap();
            }
            assert_eq!(seeded.fixed_i.is_none(), composition == ions);
            assert_eq!(seeded, raised);
        }
    }

    /// In fresh water with calcium, a perturbed K1 or K2 keeps
    /// K1e = K1 (1 + p1) and K2e = K2 (1 + p2)/(1 + p1), and setting another
    /// free calcium afterwards keeps them (with the perturbed K1, K2).
    #[test]
    fn pairs_follow_a_perturbed_k1_in_fresh_water() {
        use crate::base::units::Amount;
        let composition = Composition::default()
            .with_calcium(Amount::PerKg(2e-3))
            .unwrap();
        let water = Water::fresh(Conditions::new(15.0, 0.3).unwrap())
            .unwrap()
            .with_composition(composition);
        let k = FreshBasis::new(&water, true).unwrap().starting_constants();
        assert!(k.pair_hco3 > 0.0 && k.pair_co3 > 0.0);
        let consistent = |k: &Constants| {
            let k1e = k.k1 * (1.0 + k.pair_hco3);
            let k2e = k.k2 * (1.0 + k.pair_co3) / (1.0 + k.pair_hco3);
            (k.k1e / k1e - 1.0).abs() < 1e-15 && (k.k2e / k2e - 1.0).abs() < 1e-15
        };
        for which in [ConstantName::K1, ConstantName::K2] {
            let mut p = k.clone().with_pk(which, 0.01).unwrap();
            assert!(consistent(&p), "{which:?}");
            // The pair ratios depend on the free calcium only.
            assert_eq!(p.pair_hco3, k.pair_hco3);
            let (k1, k2) = (p.k1, p.k2);
            p.set_free_calcium(0.5 * k.calcium_free_mol_kg);
            assert!(consistent(&p), "{which:?} after set_free_calcium");
            assert_eq!((p.k1, p.k2), (k1, k2), "the perturbation is kept");
            assert!((p.pair_hco3 / k.pair_hco3 - 0.5).abs() < 1e-15);
        }
        // An ion-pair constant moves its pair ratio by the factor, and K1e
        // and K2e with it.
        let factor = crate::base::numeric::pow10(-0.05);
        let hco3 = |k: &Constants| k.pair_hco3;
        let co3 = |k: &Constants| k.pair_co3;
        for (which, ratio) in [
            (
                ConstantName::CaHco3Pair,
                &hco3 as &dyn Fn(&Constants) -> f64,
            ),
            (ConstantName::CaCo3Pair, &co3),
        ] {
            let p = k.clone().with_pk(which, 0.05).unwrap();
            assert!(consistent(&p), "{which:?}");
            assert!((ratio(&p) / ratio(&k) / factor - 1.0).abs() < 1e-14);
            assert!(p.k1e != k.k1e || which == ConstantName::CaCo3Pair);
            assert!(p.k2e != k.k2e, "{which:?}");
        }
        // The perturbation moved K1 by the factor, K1e with it.
        let p = k.clone().with_pk(ConstantName::K1, 0.01).unwrap();
        let factor = crate::base::numeric::pow10(-0.01);
        assert!((p.k1 / k.k1 / factor - 1.0).abs() < 1e-15);
        assert!((p.k1e / k.k1e / factor - 1.0).abs() < 1e-14);
    }
}
