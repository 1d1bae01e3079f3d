//! The complete carbonate state of a sample.

use crate::base::error::Result;
use crate::base::numeric::Real;
use crate::base::units::{CACO3_G_EQ, CO2_G_MOL, C_G_MOL, H2S_G_MOL, NH3_G_MOL, N_G_MOL};
use crate::base::warning::Warnings;
use crate::fits::FitsUsed;
use crate::medium::Constants;
use crate::medium::IonicStrengthRoute;
use crate::properties::scales::PhScale;
use crate::sample::measured::{Measured, Parameter};
use crate::sample::water::{Medium, Water};
use crate::speciation::alkalinity::parts_with_slopes;

pub mod exchange;
mod fresh_figures;
#[cfg(test)]
mod fresh_generic_tests;

pub use exchange::Exchange;

/// The fresh-water results computed beside the carbonate state.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct FreshFigures<R: Real = f64> {
    pub ionic_strength_from: IonicStrengthRoute,
    pub charge_balance_percent: Option<R>,
    pub saturation_ph_nbs: Option<R>,
    pub langelier_index: Option<R>,
    pub precipitation_potential_mg_l_caco3: Option<R>,
}

/// Every output of a solve. Field names are the JSON keys of the interface
/// contract; concentrations are µmol per kg of solution unless the name says
/// otherwise.
///
/// The outputs are listed once, in [`crate::output::Output`]: the JSON of a
/// state (its `Serialize`, written in the output layer), the human table and
/// the sheet's computed columns are all made from that list, which also has
/// outputs derived from these fields (`hco3_mg_l`, `co3_mg_l`,
/// `carbonic_fit`). Every key is always in the JSON, `null` where the
/// medium has no value.
///
/// # Formulas
/// ```text
/// CO2* = DIC h²/D,  HCO3- = DIC K1 h/D,  CO3-- = DIC K1 K2/D,  D = h² + K1 h + K1 K2
/// fCO2 = CO2*/K0,  pCO2 = fCO2 / (fugacity coefficient),  xCO2 = pCO2 / (P_air − pH2O)
/// Ω = [Ca] [CO3--] / Ksp,  SI = log10 Ω
/// Revelle factor = (∂ ln pCO2 / ∂ ln DIC) at constant alkalinity and totals (analytic)
/// ```
///
/// # Example
/// ```
/// use travertine::{Conditions, Measured, Water};
/// let s = Water::saline(Conditions::new(25.0, 35.0)?)?
///     .solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
/// // worked values computed from Lueker et al. (2000), Dickson (1990), Lee et al. (2010), Millero (1995) and Weiss (1974)
/// assert!((s.co3_umol_kg - 210.90).abs() < 0.05);
/// assert!((s.omega_aragonite.unwrap() - 3.346).abs() < 5e-3);
/// assert!((s.fco2_uatm - 401.47).abs() < 0.05);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq)]
#[non_exhaustive]
pub struct State<R: Real = f64> {
    /// Temperature, °C.
    pub temperature_c: R,
    /// Practical salinity.
    pub salinity: R,
    /// Gauge pressure, dbar.
    pub pressure_dbar: R,
    /// The medium: `saline`.
    pub medium: Medium,
    /// pH, total scale.
    pub ph_total: R,
    /// pH, sea-water scale.
    pub ph_seawater: R,
    /// pH, free scale.
    pub ph_free: R,
    /// pH, NBS scale (in saline water an approximation, Takahashi et al. 1982).
    pub ph_nbs: R,
    /// Total alkalinity.
    pub alkalinity_umol_kg: R,
    /// Dissolved inorganic carbon.
    pub dic_umol_kg: R,
    /// CO2* (dissolved CO2 + H2CO3).
    pub co2_umol_kg: R,
    /// Bicarbonate.
    pub hco3_umol_kg: R,
    /// Carbonate.
    pub co3_umol_kg: R,
    /// CO2 fugacity, µatm: CO2*/K0, with K0 and the fugacity coefficient
    /// at one atmosphere and no Poynting term. At depth CO2* is that of the
    /// water at its pressure, so this is the fugacity it would have at the
    /// surface pressure (the ocean convention); the fugacity in situ is
    /// higher by exp(V̄ ΔP / RT), V̄ ≈ 32.3 cm³/mol (Weiss 1974; from memory,
    /// unverified), about 1.4 % per 100 dbar at 10 °C.
    pub fco2_uatm: R,
    /// CO2 partial pressure (moist air at the air pressure), µatm; at depth
    /// on the same convention as `fco2_uatm`.
    pub pco2_uatm: R,
    /// CO2 mole fraction in dry air, ppm.
    pub xco2_ppm: R,
    /// Saturation state of calcite (`None` in fresh water without calcium).
    pub omega_calcite: Option<R>,
    /// Saturation state of aragonite.
    pub omega_aragonite: Option<R>,
    /// Saturation index of calcite, log10 Ω (= log10 IAP/Ksp).
    pub si_calcite: Option<R>,
    /// Saturation index of aragonite, log10 Ω.
    pub si_aragonite: Option<R>,
    /// Revelle (buffer) factor.
    pub revelle_factor: R,
    /// Carbonate alkalinity, [HCO3-] + 2[CO3--].
    pub carbonate_alkalinity_umol_kg: R,
    /// Borate alkalinity.
    pub borate_alkalinity_umol_kg: R,
    /// Hydroxide, [OH-].
    pub hydroxide_umol_kg: R,
    /// Phosphate alkalinity, [HPO4--] + 2[PO4---] − \[H3PO4\].
    pub phosphate_alkalinity_umol_kg: R,
    /// Silicate alkalinity.
    pub silicate_alkalinity_umol_kg: R,
    /// Ammonia alkalinity, \[NH3\].
    pub ammonia_alkalinity_umol_kg: R,
    /// Sulfide alkalinity, [HS-].
    pub sulfide_alkalinity_umol_kg: R,
    /// Free hydrogen ion, counted against alkalinity.
    pub free_hydrogen_umol_kg: R,
    /// Bisulfate, counted against alkalinity.
    pub bisulfate_umol_kg: R,
    /// Hydrogen fluoride, counted against alkalinity.
    pub hydrogen_fluoride_umol_kg: R,
    /// Total calcium (`None` in fresh water without calcium).
    pub calcium_umol_kg: Option<R>,
    /// Free Ca++ (fresh water: total less the CaHCO3+ and CaCO3⁰ pairs).
    pub calcium_free_umol_kg: Option<R>,
    /// Activity of free Ca++ (molal, fresh water).
    pub calcium_activity: Option<R>,
    /// CaHCO3+ ion pair (fresh water).
    pub cahco3_umol_kg: Option<R>,
    /// CaCO3⁰ ion pair (fresh water).
    pub caco3_pair_umol_kg: Option<R>,
    /// Ionic strength, mol/kg.
    pub ionic_strength: R,
    /// Where the ionic strength came from (fresh water).
    pub ionic_strength_from: Option<IonicStrengthRoute>,
    /// Charge imbalance of the ions given, % of the total charge (fresh
    /// water with major ions; positive: excess cations).
    pub charge_balance_percent: Option<R>,
    /// Activity coefficient of monovalent ions (fresh water).
    pub gamma_monovalent: Option<R>,
    /// Activity coefficient of divalent ions such as CO3-- (fresh water).
    pub gamma_divalent: Option<R>,
    /// pHs, the NBS pH of calcite saturation at this alkalinity and calcium (fresh water).
    pub saturation_ph_nbs: Option<R>,
    /// Langelier index, pH − pHs (fresh water with calcium; null otherwise).
    pub langelier_index: Option<R>,
    /// Calcium carbonate precipitation potential, mg/L as CaCO3: positive to
    /// precipitate, negative to dissolve (fresh water with calcium).
    pub precipitation_potential_mg_l_caco3: Option<R>,
    /// Alkalinity, mg/L as CaCO3.
    pub alkalinity_mg_l_caco3: R,
    /// DIC, mg/L as C.
    pub dic_mg_l_c: R,
    /// Free CO2 (CO2*), mg/L as CO2.
    pub free_co2_mg_l: R,
    /// Density used for per-litre units, kg/m³ (Millero & Poisson 1981, EOS-80).
    pub density_kg_m3: R,
    /// The fit used for each constant.
    pub fits_used: FitsUsed,
    /// Cautions: fits used outside their range, other roots, approximations.
    pub warnings: Warnings,
    water_sample: Water,
    h: R,
    /// DIC as solved, mol/kg (`dic_umol_kg` is this times 10⁶).
    dic: R,
    /// The free calcium as solved, mol/kg, where the water has calcium
    /// (`calcium_free_umol_kg` is this times 10⁶, which divided again may
    /// round otherwise).
    calcium_free: Option<R>,
    // issue 11: toxic fractions
    /// Un-ionised fraction of the total ammonia, \[NH3\]/(\[NH3\] + [NH4+])
    /// (`None` where no ammonia was given, or zero).
    ///
    /// ```text
    /// fresh:   f = 1 / (1 + {H+} / (Ka γNH4)),  {H+} = 10^−pH(NBS), γNH3 = 1
    ///          pKa = 0.09018 + 2729.92/T        (Emerson et al. 1975)
    /// saline:  f = 1 / (1 + [H+]T / KNH4,T)     (Johansson & Wedborg 1980, on the total scale)
    /// ```
    /// In fresh water γNH4 is the activity coefficient of monovalent ions
    /// at the sample's ionic strength ([`State::gamma_monovalent`], Davies
    /// by default), so that at zero ionic strength f is the textbook
    /// fraction of field tables, which ignore activity; at I = 0.01 (about
    /// 600 µS/cm) the fraction is about 10 % lower. Ka and KNH4 carry the
    /// pressure correction of the other constants.
    ///
    /// ```
    /// use travertine::{Conditions, Measured, Water, units::Amount, sample::Composition};
    /// // Zero ionic strength, 25 °C, pH 8.0 (NBS): 0.0537 (Emerson et al. 1975).
    /// let pond = Water::fresh(Conditions::new(25.0, 0.0)?)?
    ///     .with_ionic_strength(0.0)?
    ///     .with_composition(Composition::default().with_ammonia(Amount::PerKg(50e-6))?);
    /// let s = pond.solve(Measured::ph(8.0, None)?, Measured::alkalinity_umol_kg(1000.0)?)?;
    /// assert!((s.nh3_fraction.unwrap() - 0.0537).abs() < 5e-5);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub nh3_fraction: Option<R>,
    /// Un-ionised ammonia NH3, mg/L as N.
    pub nh3_mg_l_n: Option<R>,
    /// Un-ionised ammonia NH3, mg/L as NH3.
    pub nh3_mg_l: Option<R>,
    /// Fraction of the total sulfide that is H2S, \[H2S\]/(\[H2S\] + [HS-])
    /// (`None` where no sulfide was given, or zero); S-- is negligible
    /// below pH 12.
    ///
    /// ```text
    /// fresh:   f = 1 / (1 + K1 / (γHS {H+}))      K1: Millero et al. (1988) at S = 0
    /// saline:  f = 1 / (1 + K1,T / [H+]T)         Millero et al. (1988), total scale
    /// ```
    pub h2s_fraction: Option<R>,
    /// Hydrogen sulfide H2S, mg/L as H2S.
    pub h2s_mg_l: Option<R>,
    /// The two measured parameters this state comes from. A state moved to
    /// other conditions ([`State::at`]) keeps those of its measurement, so
    /// that a judgement on how it was measured (the organic-acid bias of
    /// pCO2 from pH and alkalinity) follows it.
    pub computed_from: [Parameter; 2],
    // issue 12: blending
    /// The totals of the acid systems and calcium this state was solved
    /// with, mol/kg: as measured, or from salinity in saline water. A
    /// saved result carries them (`*_total_umol_kg`), so that two saved
    /// results can be mixed.
    pub totals: crate::sample::composition::Totals<R>,
    // issue 11: air–water CO2 exchange
    /// The exchange of CO2 with the air: the air's pCO2, the saturation
    /// ratio, the transfer velocity, the flux and the water at equilibrium
    /// with the air. `None` unless asked for with [`State::with_exchange`]
    /// (the command line always asks; a sheet asks when it has an
    /// exchange column or input).
    pub exchange: Option<Exchange<R>>,
    gas: exchange::GasTerms<R>,
}

impl State {
    /// h on the working scale: [H+] on the total scale in saline water
    /// (mol/kg), the H+ activity (NBS) in fresh water.
    ///
    /// ```
    /// # use travertine::{Conditions, Measured, PhScale, Water};
    /// let s = Water::saline(Conditions::new(25.0, 35.0)?)?
    ///     .solve(Measured::ph(8.0, None)?, Measured::dic_umol_kg(2000.0)?)?;
    /// assert!((s.h_mol_kg() - 1e-8).abs() < 1e-20);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn h_mol_kg(&self) -> f64 {
        self.h
    }

    /// Parameter `p` of this state as a measurement, with pH on the
    /// medium's working scale (total in saline water, NBS in fresh water):
    /// the input that reproduces this value. Useful for residuals against a
    /// measured third parameter, and for round trips.
    ///
    /// # Errors
    /// [`crate::Error::OutOfRange`] if the value lies outside what a
    /// measurement may be (for example a pH above 14).
    ///
    /// ```
    /// # use travertine::{Conditions, Measured, Parameter, Water};
    /// let w = Water::saline(Conditions::new(25.0, 35.0)?)?;
    /// let s = w.solve(Measured::alkalinity_umol_kg(2300.0)?, Measured::dic_umol_kg(2000.0)?)?;
    /// let back = w.solve(s.measured(Parameter::Ph)?, s.measured(Parameter::Pco2)?)?;
    /// assert!((back.dic_umol_kg - 2000.0).abs() < 1e-6);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn measured(&self, p: Parameter) -> Result<Measured> {
        match p {
            Parameter::Alkalinity => Measured::alkalinity_umol_kg(self.alkalinity_umol_kg),
            Parameter::Dic => Measured::dic_umol_kg(self.dic_umol_kg),
            Parameter::Ph => match self.medium {
                Medium::Fresh => Measured::ph(self.ph_nbs, Some(PhScale::Nbs)),
                _ => Measured::ph(self.ph_total, Some(PhScale::Total)),
            },
            Parameter::Pco2 => Measured::pco2_uatm(self.pco2_uatm),
            Parameter::Fco2 => Measured::fco2_uatm(self.fco2_uatm),
            Parameter::Xco2 => Measured::xco2_ppm(self.xco2_ppm),
            Parameter::Co2 => Measured::co2_umol_kg(self.co2_umol_kg),
            Parameter::Hco3 => Measured::hco3_umol_kg(self.hco3_umol_kg),
            Parameter::Co3 => Measured::co3_umol_kg(self.co3_umol_kg),
        }
    }

    /// DIC as solved, mol/kg.
    pub(crate) fn dic_mol_kg(&self) -> f64 {
        self.dic
    }

    /// The free calcium as solved, mol/kg (0 without calcium): the number
    /// the constants were made at, which `calcium_free_umol_kg` · 10⁻⁶ may
    /// miss by a rounding.
    pub(crate) fn calcium_free_mol_kg(&self) -> f64 {
        self.calcium_free.unwrap_or(0.0)
    }

    /// The unknowns of this state, from which the solve of a water very
    /// near it may start ([`crate::solve::Near`]).
    pub(crate) fn near(&self) -> crate::solve::Near {
        crate::solve::Near {
            h: self.h,
            ionic_strength: self.ionic_strength_from.map(|_| self.ionic_strength),
            calcium_free: self.calcium_free,
            saturation_ph: self.saturation_ph_nbs,
        }
    }

    /// This state with the pKsp of calcite (or of aragonite, `aragonite`)
    /// moved by `d_pk`, where nothing but the saturation of that mineral
    /// depends on it (sea water: no saturation pH, no ion pairs; in fresh
    /// water aragonite, which neither the ion pairs nor the saturation pH
    /// read): Ksp is multiplied by 10^−d_pk, so
    ///
    /// ```text
    /// Ω' = [Ca] [CO3--] / Ksp' = Ω 10^d_pk,   SI' = log10 Ω' = SI + d_pk
    /// ```
    ///
    /// the formulas of [`State::omega_calcite`] and [`State::si_calcite`].
    /// The propagation of uncertainties moves such a solubility product
    /// so, without a solve (a test compares it with the constant perturbed
    /// and solved again).
    pub(crate) fn with_pksp_moved(&self, aragonite: bool, d_pk: f64) -> State {
        let mut s = self.clone();
        let factor = 10f64.powf(d_pk);
        let (omega, si) = if aragonite {
            (&mut s.omega_aragonite, &mut s.si_aragonite)
        } else {
            (&mut s.omega_calcite, &mut s.si_calcite)
        };
        *omega = omega.map(|o| o * factor);
        *si = si.map(|i| i + d_pk);
        s
    }

    /// This state with pK0 moved by `d_pk`, where the solve did not read K0
    /// (no gas-phase parameter measured) and there is no exchange with the
    /// air: K0 is multiplied by 10^−d_pk, and only the gas-phase figures,
    /// which divide CO2* by it, move:
    ///
    /// ```text
    /// fCO2' = CO2*/K0' = fCO2 10^d_pk,   pCO2' = pCO2 10^d_pk,   xCO2' = xCO2 10^d_pk
    /// ```
    ///
    /// the formulas of [`State::fco2_uatm`], [`State::pco2_uatm`] and
    /// [`State::xco2_ppm`] (a test compares it with the constant perturbed
    /// and solved again).
    pub(crate) fn with_pk0_moved(&self, d_pk: f64) -> State {
        let mut s = self.clone();
        let factor = 10f64.powf(d_pk);
        s.fco2_uatm *= factor;
        s.pco2_uatm *= factor;
        s.xco2_ppm *= factor;
        s.gas.k0 /= factor;
        s
    }

    /// Builds the state from the solved h and DIC of the measured pair
    /// (`a`, `b`), refusing it as [`implausible`] where its alkalinity is
    /// beyond any measurement.
    pub(crate) fn build(
        water: &Water,
        k: &Constants,
        h: f64,
        dic: f64,
        warnings: Warnings,
        (a, b): (&Measured, &Measured),
    ) -> Result<State> {
        let all = warnings.after(k.warnings());
        Self::build_fresh_or_saline(water, k, h, dic, all, None, a, b)
    }

    /// Builds a fresh-water state with its figures.
    pub(crate) fn build_fresh(
        water: &Water,
        k: &Constants,
        h: f64,
        dic: f64,
        warnings: Warnings,
        figures: FreshFigures,
        (a, b): (&Measured, &Measured),
    ) -> Result<State> {
        let all = warnings.after(k.warnings());
        Self::build_fresh_or_saline(water, k, h, dic, all, Some(figures), a, b)
    }

    /// Builds a state, fresh (with its figures) or saline, without any
    /// warning, not even the constants': the lean state of a perturbed
    /// solve ([`crate::flow::PreparedWater::solve_lean`]), whose numbers
    /// alone are read.
    pub(crate) fn build_quiet(
        water: &Water,
        k: &Constants,
        h: f64,
        dic: f64,
        figures: Option<FreshFigures>,
        (a, b): (&Measured, &Measured),
    ) -> Result<State> {
        Self::build_fresh_or_saline(water, k, h, dic, Warnings::new(), figures, a, b)
    }
}

impl<R: Real> State<R> {
    /// pH on any scale.
    ///
    /// ```
    /// # use travertine::{Conditions, Measured, PhScale, Water};
    /// let s = Water::saline(Conditions::new(25.0, 35.0)?)?
    ///     .solve(Measured::ph(8.0, Some(PhScale::Total))?, Measured::dic_umol_kg(2000.0)?)?;
    /// assert!((s.ph(PhScale::Total) - 8.0).abs() < 1e-12);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn ph(&self, scale: PhScale) -> R {
        match scale {
            PhScale::Total => self.ph_total,
            PhScale::Seawater => self.ph_seawater,
            PhScale::Free => self.ph_free,
            PhScale::Nbs => self.ph_nbs,
        }
    }

    /// The water this state was solved for.
    ///
    /// ```
    /// # use travertine::{Conditions, Measured, Water};
    /// let w = Water::saline(Conditions::new(25.0, 35.0)?)?;
    /// let s = w.solve(Measured::ph(8.0, None)?, Measured::dic_umol_kg(2000.0)?)?;
    /// assert_eq!(s.water_sample(), &w);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn water_sample(&self) -> &Water {
        &self.water_sample
    }

    /// The gas constants this state was solved with.
    pub(crate) fn gas_terms(&self) -> exchange::GasTerms<R> {
        self.gas
    }

    /// Builds a state, fresh (with its figures) or saline, from the solved
    /// h and DIC and the constants, on any [`Real`]: on `f64` the state of
    /// a solve, on a [`Tangent`](crate::base::numeric::Tangent) the same
    /// numbers with their derivatives (the propagation of uncertainties).
    ///
    /// The two measurements are passed apart from the rest so that the
    /// implausibility error can name them; the state is checked before it
    /// is built, so a large value is never built only to be thrown away.
    /// `warnings` are all the state's: the callers put the constants' first.
    #[allow(clippy::too_many_arguments)]
    pub(crate) fn build_fresh_or_saline(
        water: &Water,
        k: &Constants<R>,
        h: R,
        dic: R,
        warnings: Warnings,
        figures: Option<FreshFigures<R>>,
        a: &Measured,
        b: &Measured,
    ) -> Result<State<R>> {
        let k12 = k.k1e() * k.k2e();
        let d = h * h + k.k1e() * h + k12;
        let dic_per_d = dic / d;
        let co2 = dic_per_d * h * h;
        // Carbon-balance totals, then the free ions and the Ca pairs.
        let hco3_t = dic_per_d * k.k1e() * h;
        let co3_t = dic_per_d * k12;
        let hco3 = hco3_t / (k.pair_hco3() + 1.0);
        let co3 = co3_t / (k.pair_co3() + 1.0);
        let s = parts_with_slopes(k, h, dic);
        let p = s.parts;
        let ta = p.total();
        implausible(ta.value(), a, b)?;
        let fco2 = co2 / k.k0();
        let pco2 = fco2 / k.fugacity_factor();
        let xco2 = pco2
            / k.vapour_pressure_atm()
                .subtracted_from(k.conditions().air_pressure_atm());
        let ca_known = k.totals().calcium_mol_kg.value() > 0.0;
        let ca_free = k.calcium_free_mol_kg();
        let omega_c = ca_known.then(|| ca_free * co3 / k.ksp_calcite());
        let omega_a = ca_known.then(|| ca_free * co3 / k.ksp_aragonite());
        // One logarithm for the four pH values and one for both indices.
        let logs = k.log10s();
        let ph_working = -h.log10_via_ln();
        let ph = |scale: usize| ph_working - logs.per_working[scale];
        let log_iap = ca_known.then(|| (ca_free * co3).log10_via_ln());

        // Revelle factor at constant TA (and pairs): dh/dDIC = −c(h) / (DIC c'(h) + n'(h)).
        let dh_ddic = -s.carbonate_per_dic / (dic * s.d_carbonate_per_dic + s.d_non_carbonate);
        let revelle = dic * (k.k1e() * h + k12 * 2.0) / (h * d) * dh_ddic + 1.0;

        let rho = k.density_kg_m3();
        let (ammonia, sulfide) = toxic_fractions(k, h);
        let u = 1e6;
        let fresh = figures.is_some();
        let fresh_only = |v: R| fresh.then_some(v);
        Ok(State {
            temperature_c: k.temperature_c(),
            salinity: k.salinity(),
            pressure_dbar: k.pressure_dbar(),
            medium: water.medium(),
            ph_total: ph(0),
            ph_seawater: ph(1),
            ph_free: ph(2),
            ph_nbs: ph(3),
            alkalinity_umol_kg: ta * u,
            dic_umol_kg: dic * u,
            co2_umol_kg: co2 * u,
            hco3_umol_kg: hco3 * u,
            co3_umol_kg: co3 * u,
            fco2_uatm: fco2 * u,
            pco2_uatm: pco2 * u,
            xco2_ppm: xco2 * u,
            omega_calcite: omega_c,
            omega_aragonite: omega_a,
            si_calcite: log_iap.map(|l| l - logs.ksp_calcite),
            si_aragonite: log_iap.map(|l| l - logs.ksp_aragonite),
            revelle_factor: revelle,
            carbonate_alkalinity_umol_kg: p.carbonate * u,
            borate_alkalinity_umol_kg: p.borate * u,
            hydroxide_umol_kg: p.hydroxide * u,
            phosphate_alkalinity_umol_kg: p.phosphate * u,
            silicate_alkalinity_umol_kg: p.silicate * u,
            ammonia_alkalinity_umol_kg: p.ammonia * u,
            sulfide_alkalinity_umol_kg: p.sulfide * u,
            free_hydrogen_umol_kg: p.free_hydrogen * u,
            bisulfate_umol_kg: p.bisulfate * u,
            hydrogen_fluoride_umol_kg: p.hydrogen_fluoride * u,
            calcium_umol_kg: ca_known.then_some(k.totals().calcium_mol_kg * u),
            calcium_free_umol_kg: ca_known.then_some(ca_free * u),
            calcium_activity: k.gammas().filter(|_| ca_known).map(|g| g.calcium * ca_free),
            cahco3_umol_kg: fresh_only((hco3_t - hco3) * u).filter(|_| ca_known),
            caco3_pair_umol_kg: fresh_only((co3_t - co3) * u).filter(|_| ca_known),
            ionic_strength: k.ionic_strength(),
            ionic_strength_from: figures.map(|e| e.ionic_strength_from),
            charge_balance_percent: figures.and_then(|e| e.charge_balance_percent),
            gamma_monovalent: k.gammas().map(|g| g.monovalent),
            gamma_divalent: k.gammas().map(|g| g.carbonate),
            saturation_ph_nbs: figures.and_then(|e| e.saturation_ph_nbs),
            langelier_index: figures.and_then(|e| e.langelier_index),
            precipitation_potential_mg_l_caco3: figures
                .and_then(|e| e.precipitation_potential_mg_l_caco3),
            alkalinity_mg_l_caco3: ta * rho * CACO3_G_EQ,
            dic_mg_l_c: dic * rho * C_G_MOL,
            free_co2_mg_l: co2 * rho * CO2_G_MOL,
            density_kg_m3: rho,
            fits_used: *k.fits_used(),
            warnings,
            water_sample: water.clone(),
            h,
            dic,
            calcium_free: ca_known.then_some(ca_free),
            nh3_fraction: ammonia.map(|(f, _)| f),
            nh3_mg_l_n: ammonia.map(|(_, c)| c * rho * N_G_MOL),
            nh3_mg_l: ammonia.map(|(_, c)| c * rho * NH3_G_MOL),
            h2s_fraction: sulfide.map(|(f, _)| f),
            h2s_mg_l: sulfide.map(|(_, c)| c * rho * H2S_G_MOL),
            computed_from: [a.parameter(), b.parameter()],
            totals: *k.totals(),
            exchange: None,
            gas: exchange::GasTerms {
                k0: k.k0(),
                fugacity_factor: k.fugacity_factor(),
                vapour_pressure_atm: k.vapour_pressure_atm(),
            },
        })
    }
}

/// The un-ionised fractions of ammonia and sulfide at `h`, each with the
/// concentration of the un-ionised form (mol/kg); `None` for a total not
/// given. In both media the constants are on the working scale of `h`
/// (see [`State::nh3_fraction`] and [`State::h2s_fraction`]).
#[allow(clippy::type_complexity)]
fn toxic_fractions<R: Real>(k: &Constants<R>, h: R) -> (Option<(R, R)>, Option<(R, R)>) {
    let totals = k.totals();
    let ammonia = (totals.ammonia_mol_kg.value() > 0.0 && k.knh4().value() > 0.0).then(|| {
        let f = k.knh4() / (k.knh4() + h);
        (f, f * totals.ammonia_mol_kg)
    });
    let sulfide = (totals.sulfide_mol_kg.value() > 0.0 && k.kh2s().value() > 0.0).then(|| {
        let f = h / (h + k.kh2s());
        (f, f * totals.sulfide_mol_kg)
    });
    (ammonia, sulfide)
}

/// A state whose alkalinity (µmol/kg) is beyond what any measurement may be
/// (for example DIC with a pH near 0, which needs an alkalinity of about
/// −1 mol/kg) fits no real water.
fn implausible(alkalinity_mol_kg: f64, a: &Measured, b: &Measured) -> Result<()> {
    if crate::solve::alkalinity_in_range(alkalinity_mol_kg) {
        return Ok(());
    }
    let (_, max) = Parameter::Alkalinity.accepted_range();
    let v = alkalinity_mol_kg * 1e6;
    Err(crate::Error::NoWaterFits {
        first: a.parameter().field(),
        first_value: a.describe(),
        second: b.parameter().field(),
        second_value: b.describe(),
        reason: format!("the alkalinity would be {v:.3e} µmol/kg, beyond ±{max} µmol/kg"),
    })
}
