//! One set of constants for one set of conditions: the [`Constants`] value
//! the solver reads, and its evaluation for saline water.
//!
//! [`Constants::saline`] evaluates every constant once, converts it to the
//! working pH scale (the total scale), applies the Millero (1995) pressure
//! corrections and records a warning for every fit used outside its
//! published range. The fresh medium ([`super::fresh`]) makes the same value
//! from thermodynamic constants and activity coefficients.

use crate::base::error::Result;
use crate::base::warning::Warning;
use crate::fits::{
    ammonia, boron, gas, kw, minerals, nutrients, pressure, sulfate, sulfide, FitName, Fits,
    FitsUsed,
};
use crate::properties::density::density_kg_m3;
use crate::properties::scales::{takahashi1982_fh, PhScale};
use crate::sample::{Composition, Conditions, Totals};
use serde::Serialize;

/// Every equilibrium constant for one set of conditions, on the working pH
/// scale, plus the factors that move the working scale to the others.
///
/// The working scale is the total scale in saline water and the NBS
/// (activity) scale in fresh water. Acid constants are
/// K = [H+]\[A-\]/\[HA\] with [H+] on that scale; `kw` is [H+]\[OH-\].
/// Constants of acid systems whose total is zero are not evaluated and hold 0.
///
/// # Example
/// ```
/// use travertine::{Conditions, Water};
/// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
/// assert!((-k.k1.log10() - 5.8472).abs() < 5e-5); // Lueker 2000, Guide check value
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, PartialEq, Serialize)]
#[non_exhaustive]
pub struct Constants {
    /// The conditions evaluated.
    pub conditions: Conditions,
    /// The working pH scale of every acid constant.
    pub working_scale: PhScale,
    /// CO2 solubility, mol kg⁻¹ atm⁻¹.
    pub k0: f64,
    /// First dissociation constant of carbonic acid.
    pub k1: f64,
    /// Second dissociation constant of carbonic acid.
    pub k2: f64,
    /// Boric acid.
    pub kb: f64,
    /// Ion product of water.
    pub kw: f64,
    /// Phosphoric acid, first.
    pub kp1: f64,
    /// Phosphoric acid, second.
    pub kp2: f64,
    /// Phosphoric acid, third.
    pub kp3: f64,
    /// Silicic acid.
    pub ksi: f64,
    /// Ammonium.
    pub knh4: f64,
    /// Hydrogen sulfide.
    pub kh2s: f64,
    /// Bisulfate, free scale.
    pub ks_free: f64,
    /// Hydrogen fluoride, free scale.
    pub kf_free: f64,
    /// K1 and K2 for the carbon balances: with calcium ion pairs (fresh
    /// water) DIC and alkalinity count CaHCO3+ with HCO3- and CaCO3⁰ with
    /// CO3--, which is the same as using K1e = K1 (1 + p1) and
    /// K2e = K2 (1 + p2)/(1 + p1), where p1 = [CaHCO3+]/[HCO3-] and
    /// p2 = \[CaCO3⁰\]/[CO3--]. Without pairs K1e = K1, K2e = K2.
    pub k1e: f64,
    /// See `k1e`.
    pub k2e: f64,
    /// [CaHCO3+]/[HCO3-] (0 in saline water, where pairs are in the constants).
    pub pair_hco3: f64,
    /// \[CaCO3⁰\]/[CO3--] (0 in saline water).
    pub pair_co3: f64,
    /// Free calcium used for the pairs and Ω, mol/kg (total calcium in saline water).
    pub calcium_free_mol_kg: f64,
    /// Ionic strength, mol/kg (sea water: 19.924 S/(1000 − 1.005 S)).
    pub ionic_strength: f64,
    /// Calcite solubility product, (mol/kg)².
    pub ksp_calcite: f64,
    /// Aragonite solubility product, (mol/kg)².
    pub ksp_aragonite: f64,
    /// The totals used.
    pub totals: Totals,
    /// [H+] on the free scale per unit of working-scale h.
    pub free_per_working: f64,
    /// [H+] on the sea-water scale per unit of working-scale h.
    pub seawater_per_working: f64,
    /// [H+] on the total scale per unit of working-scale h.
    pub total_per_working: f64,
    /// H+ activity (NBS) per unit of working-scale h.
    pub nbs_per_working: f64,
    /// fCO2 / pCO2.
    pub fugacity_factor: f64,
    /// Water vapour pressure, atm.
    pub vapour_pressure_atm: f64,
    /// Solution density at the surface, kg/m³.
    pub density_kg_m3: f64,
    /// The fits behind these numbers.
    pub fits_used: FitsUsed,
    /// Every fit used outside its published range, and other cautions.
    pub warnings: Vec<Warning>,
    /// Activity coefficients (fresh water only).
    pub gammas: Option<crate::properties::activity::Gammas>,
    /// [CaHCO3+]/([Ca++]\[HCO3-\]), concentration basis (fresh water; 0 in saline).
    pub k_cahco3: f64,
    /// \[CaCO3⁰\]/([Ca++]\[CO3--\]), concentration basis (fresh water; 0 in saline).
    pub k_caco3: f64,
    /// The logarithms a state needs, where evaluated with the constants.
    #[serde(skip)]
    pub(crate) logs: Option<Log10s>,
}

/// log10 of the pH-scale factors and of the solubility products. Saline
/// constants evaluate them once (the Mucci 1983 fits give log10 Ksp
/// directly), so that a state needs one logarithm for its four pH values
/// and one for both saturation indices; fresh-water constants, evaluated on
/// every trial of their inner iterations, leave them to the state.
#[derive(Debug, Clone, Copy, PartialEq)]
pub(crate) struct Log10s {
    /// log10 of [H+] on the total, sea-water, free and NBS scales per unit
    /// of working-scale h, in that order.
    pub per_working: [f64; 4],
    /// log10 Ksp of calcite and of aragonite (with the pressure correction).
    pub ksp_calcite: f64,
    pub ksp_aragonite: f64,
}

impl Constants {
    /// Sets the free calcium of fresh-water constants and what follows from
    /// it: the pair ratios and the pair-inclusive K1e, K2e (see
    /// [`Constants::k1e`]). The one place these are computed, so that
    /// constants made again from (I, Ca) are exactly those solved with.
    pub(crate) fn set_free_calcium(&mut self, ca_free: f64) {
        let pair_hco3 = self.k_cahco3 * ca_free;
        let pair_co3 = self.k_caco3 * ca_free;
        self.pair_hco3 = pair_hco3;
        self.pair_co3 = pair_co3;
        self.k1e = self.k1 * (1.0 + pair_hco3);
        self.k2e = self.k2 * (1.0 + pair_co3) / (1.0 + pair_hco3);
        self.calcium_free_mol_kg = ca_free;
    }

    /// H on the working scale from a pH on `scale`.
    ///
    /// ```
    /// use travertine::{Conditions, PhScale, Water};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// let h = k.h_from_ph(8.0, PhScale::Total);
    /// assert!((h - 1e-8).abs() < 1e-20);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn h_from_ph(&self, ph: f64, scale: PhScale) -> f64 {
        crate::base::numeric::pow10(-ph) / self.per_working(scale)
    }

    /// pH on `scale` from H on the working scale.
    ///
    /// ```
    /// use travertine::{Conditions, PhScale, Water};
    /// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
    /// let sws = k.ph_from_h(1e-8, PhScale::Seawater);
    /// // About 0.010 below the total scale (computed from Dickson 1990 KS and the Riley 1965 fluoride); 0.013 with
    /// // the default Perez & Fraga KF taken on the total scale.
    /// assert!(8.0 - sws > 0.008 && 8.0 - sws < 0.014);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn ph_from_h(&self, h: f64, scale: PhScale) -> f64 {
        -crate::base::numeric::log10(h * self.per_working(scale))
    }

    /// The logarithms a state needs: stored, or evaluated now.
    pub(crate) fn log10s(&self) -> Log10s {
        self.logs.unwrap_or_else(|| {
            let log10 = crate::base::numeric::log10;
            Log10s {
                per_working: [
                    log10(self.total_per_working),
                    log10(self.seawater_per_working),
                    log10(self.free_per_working),
                    log10(self.nbs_per_working),
                ],
                ksp_calcite: log10(self.ksp_calcite),
                ksp_aragonite: log10(self.ksp_aragonite),
            }
        })
    }

    fn per_working(&self, scale: PhScale) -> f64 {
        match scale {
            PhScale::Total => self.total_per_working,
            PhScale::Seawater => self.seawater_per_working,
            PhScale::Free => self.free_per_working,
            PhScale::Nbs => self.nbs_per_working,
        }
    }

    /// Evaluates every constant for saline water.
    ///
    /// # Errors
    /// [`crate::Error::Computation`] if the density cannot be computed.
    ///
    /// ```
    /// use travertine::{Conditions, medium::Constants, fits::Fits, sample::Composition};
    /// let c = Conditions::new(25.0, 35.0)?;
    /// let k = Constants::saline(&c, &Composition::default(), &Fits::default())?;
    /// assert!(k.warnings.is_empty());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn saline(conditions: &Conditions, composition: &Composition, fits: &Fits) -> Result<Self> {
        let t_c = conditions.temperature_c();
        let t = conditions.temperature_k();
        let s = conditions.salinity();
        let p_bar = conditions.pressure_bar();
        let mut warnings = Vec::new();

        let density = density_kg_m3(s, t_c)?;
        let totals = composition.saline_totals(s, density, fits.boron_total);

        // Free-scale KS and KF at the surface.
        if totals.sulfate_mol_kg > 0.0 {
            sulfate::DICKSON1990_KS_RANGE.check_for("KS", t_c, s, &mut warnings);
        }
        let ks0 = sulfate::dickson1990_ln_ks(t, s).exp();
        if totals.fluoride_mol_kg > 0.0 {
            fits.fluoride.range().check_for("KF", t_c, s, &mut warnings);
        }
        let kf_native = fits.fluoride.kf(t, s);
        let kf0 = match fits.fluoride.scale() {
            PhScale::Total => kf_native / (1.0 + totals.sulfate_mol_kg / ks0),
            _ => kf_native,
        };
        let tot0 = 1.0 + totals.sulfate_mol_kg / ks0;
        let sws0 = tot0 + totals.fluoride_mol_kg / kf0;
        // K on the sea-water scale = K on the native scale * [H]SWS/[H]native.
        let total_to_sws0 = sws0 / tot0;
        let to_sws0 = |scale: PhScale| match scale {
            PhScale::Total => total_to_sws0,
            PhScale::Free => sws0,
            _ => 1.0,
        };

        let carbonic = fits.carbonic_at(t_c, s);
        carbonic
            .range()
            .check_for("K1 and K2", t_c, s, &mut warnings);
        let (k1n, k2n) = carbonic.k1_k2(t, s);
        let mut k1 = k1n * to_sws0(carbonic.scale());
        let mut k2 = k2n * to_sws0(carbonic.scale());

        if totals.boron_mol_kg > 0.0 {
            boron::DICKSON1990_KB_RANGE.check_for("KB", t_c, s, &mut warnings);
        }
        let mut kb = boron::dickson1990_ln_kb(t, s).exp() * total_to_sws0;
        kw::MILLERO1995_KW_RANGE.check_for("KW", t_c, s, &mut warnings);
        let mut kw = kw::millero1995_ln_kw(t, s).exp() * total_to_sws0;

        let (mut kp1, mut kp2, mut kp3, mut ksi) = (0.0, 0.0, 0.0, 0.0);
        if totals.phosphate_mol_kg > 0.0 || totals.silicate_mol_kg > 0.0 {
            nutrients::MILLERO1995_NUTRIENT_RANGE.check_for("KP and KSi", t_c, s, &mut warnings);
        }
        if totals.phosphate_mol_kg > 0.0 {
            let (a, b, c) = nutrients::millero1995_ln_kp(t, s);
            kp1 = a.exp() * total_to_sws0;
            kp2 = b.exp() * total_to_sws0;
            kp3 = c.exp() * total_to_sws0;
        }
        if totals.silicate_mol_kg > 0.0 {
            ksi = nutrients::millero1995_ln_ksi(t, s).exp() * total_to_sws0;
        }
        let mut knh4 = 0.0;
        if totals.ammonia_mol_kg > 0.0 {
            ammonia::JOHANSSON_WEDBORG1980_RANGE.check_for("KNH4", t_c, s, &mut warnings);
            knh4 = crate::base::numeric::pow10(-ammonia::johansson_wedborg1980_pka(t, s));
        }
        let mut kh2s = 0.0;
        if totals.sulfide_mol_kg > 0.0 {
            sulfide::MILLERO1988_RANGE.check_for("KH2S", t_c, s, &mut warnings);
            kh2s = crate::base::numeric::pow10(-sulfide::millero1988_pk1(t, s)) * total_to_sws0;
        }

        minerals::MUCCI1983_RANGE.check_for("calcite and aragonite", t_c, s, &mut warnings);
        let (mut lc, mut la) = minerals::mucci1983_log_ksp(t, s);

        let (mut ks, mut kf) = (ks0, kf0);
        if p_bar > 0.0 {
            use pressure::*;
            let f = |c: &PressureCoefficients| pressure_factor(c, t_c, p_bar);
            ks *= f(&KS);
            kf *= f(&KF);
            k1 *= f(&K1);
            k2 *= f(&K2);
            kb *= f(&KB);
            kw *= f(&KW);
            kp1 *= f(&KP1);
            kp2 *= f(&KP2);
            kp3 *= f(&KP3);
            ksi *= f(&KSI);
            knh4 *= f(&KNH4);
            kh2s *= f(&KH2S);
            lc += pressure_ln_factor(&CALCITE, t_c, p_bar) * std::f64::consts::LOG10_E;
            la += pressure_ln_factor(&ARAGONITE, t_c, p_bar) * std::f64::consts::LOG10_E;
        }
        let ksp_calcite = crate::base::numeric::pow10(lc);
        let ksp_aragonite = crate::base::numeric::pow10(la);

        // Sea-water scale to the working (total) scale at pressure.
        let tot = 1.0 + totals.sulfate_mol_kg / ks;
        let sws = tot + totals.fluoride_mol_kg / kf;
        let sws_to_total = tot / sws;
        for k in [
            &mut k1, &mut k2, &mut kb, &mut kw, &mut kp1, &mut kp2, &mut kp3, &mut ksi, &mut knh4,
            &mut kh2s,
        ] {
            *k *= sws_to_total;
        }

        gas::WEISS1974_RANGE.check_for("K0", t_c, s, &mut warnings);
        let k0 = gas::weiss1974_ln_k0(t, s).exp();
        let fugacity_factor = gas::weiss1974_fugacity_factor(t, conditions.air_pressure_atm());
        let vapour_pressure_atm = gas::weiss_price1980_vapour_pressure_atm(t, s);

        let seawater_per_working = sws / tot;
        let fh = takahashi1982_fh(t, s);
        let nbs_per_working = fh * seawater_per_working;
        let log10 = crate::base::numeric::log10;
        let logs = Log10s {
            per_working: [
                0.0,
                log10(seawater_per_working),
                -log10(tot),
                log10(nbs_per_working),
            ],
            ksp_calcite: lc,
            ksp_aragonite: la,
        };

        Ok(Constants {
            conditions: *conditions,
            working_scale: PhScale::Total,
            k0,
            k1,
            k2,
            k1e: k1,
            k2e: k2,
            pair_hco3: 0.0,
            pair_co3: 0.0,
            calcium_free_mol_kg: totals.calcium_mol_kg,
            ionic_strength: sulfate::seawater_ionic_strength(s),
            kb,
            kw,
            kp1,
            kp2,
            kp3,
            ksi,
            knh4,
            kh2s,
            ks_free: ks,
            kf_free: kf,
            ksp_calcite,
            ksp_aragonite,
            totals,
            free_per_working: 1.0 / tot,
            seawater_per_working,
            total_per_working: 1.0,
            nbs_per_working,
            fugacity_factor,
            vapour_pressure_atm,
            density_kg_m3: density,
            fits_used: FitsUsed {
                k0: FitName::Weiss1974,
                fugacity: FitName::Weiss1974,
                vapour_pressure: FitName::WeissPrice1980,
                carbonic: carbonic.into(),
                boric: FitName::Dickson1990,
                boron_total: measured_or(composition.boron_given(), fits.boron_total.into()),
                water: FitName::Millero1995,
                bisulfate: fits.bisulfate.into(),
                sulfate_total: measured_or(composition.sulfate_given(), FitName::MorrisRiley1966),
                fluoride: fits.fluoride.into(),
                fluoride_total: measured_or(composition.fluoride_given(), FitName::Riley1965),
                phosphate_silicate: FitName::Millero1995,
                ammonium: FitName::JohanssonWedborg1980,
                sulfide: FitName::Millero1988,
                minerals: FitName::Mucci1983,
                calcium: measured_or(composition.calcium_given(), FitName::RileyTongudai1967),
                pressure: FitName::Millero1995,
                nbs_scale: FitName::Takahashi1982,
                density: FitName::MilleroPoisson1981,
            },
            warnings,
            gammas: None,
            k_cahco3: 0.0,
            k_caco3: 0.0,
            logs: Some(logs),
        })
    }
}

/// `measured` where the total was given, else the fit that supplies it.
fn measured_or(given: bool, fit: FitName) -> FitName {
    if given {
        FitName::Measured
    } else {
        fit
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// The logarithms stored with saline constants are those of the values
    /// stored beside them, at the surface and under pressure.
    #[test]
    fn stored_logarithms_match_the_values() {
        for (t, s, p) in [(25.0, 35.0, 0.0), (2.0, 5.0, 0.0), (10.0, 38.0, 4000.0)] {
            let c = Conditions::new(t, s).and_then(|c| c.with_pressure_dbar(p));
            let k =
                Constants::saline(&c.unwrap(), &Composition::default(), &Fits::default()).unwrap();
            let stored = k.log10s();
            let evaluated = Constants { logs: None, ..k }.log10s();
            for (a, b) in stored.per_working.iter().zip(evaluated.per_working) {
                assert!((a - b).abs() < 1e-13, "{a} against {b}");
            }
            assert!((stored.ksp_calcite - evaluated.ksp_calcite).abs() < 1e-12);
            assert!((stored.ksp_aragonite - evaluated.ksp_aragonite).abs() < 1e-12);
        }
    }
}
