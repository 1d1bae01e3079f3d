//! The constants of saline water: every published fit evaluated once for
//! one set of conditions, on the total scale, pressure-corrected.

use super::constants::{scale_factors, Constants, Log10s, ScaleLink};
use crate::base::error::Result;
use crate::base::numeric::Real;
use crate::fits::{
    ammonia, boron, gas, kw, minerals, nutrients, pressure, sulfate, sulfide, FitName, Fits,
    FitsUsed,
};
use crate::properties::density::density_kg_m3;
use crate::properties::scales::{takahashi1982_fh, PhScale};
use crate::sample::{Composition, Conditions};

impl Constants {
    /// Evaluates every constant for saline water.
    ///
    /// # Errors
    /// [`crate::Error::Computation`] if the density cannot be computed.
    ///
    /// ```
    /// use travertine::{Conditions, medium::Constants, fits::Fits, sample::Composition};
    /// let c = Conditions::new(25.0, 35.0)?;
    /// let k = Constants::saline(&c, &Composition::default(), &Fits::default())?;
    /// assert!(k.warnings().is_empty());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn saline(conditions: &Conditions, composition: &Composition, fits: &Fits) -> Result<Self> {
        Constants::saline_at(
            conditions,
            conditions.temperature_c(),
            conditions.salinity(),
            composition,
            fits,
        )
    }
}

impl<R: Real> Constants<R> {
    /// [`Constants::saline`] on any [`Real`], at the temperature `t_c` (°C)
    /// and practical salinity `s` given as numbers of that type (their
    /// values those of `conditions`): on a [`Tangent`](crate::base::numeric::Tangent)
    /// every constant carries its derivatives with respect to them (the
    /// propagation of uncertainties). On `f64` the same numbers as
    /// [`Constants::saline`], which calls it.
    ///
    /// # Errors
    /// As [`Constants::saline`].
    ///
    /// ```
    /// use travertine::base::numeric::{Real, Tangent};
    /// use travertine::{Conditions, medium::Constants, fits::Fits, sample::Composition};
    /// let c = Conditions::new(25.0, 35.0)?;
    /// let (t, s) = (Tangent::<2>::source(25.0, 0), Tangent::<2>::source(35.0, 1));
    /// let k = Constants::saline_at(&c, t, s, &Composition::default(), &Fits::default())?;
    /// let plain = Constants::saline(&c, &Composition::default(), &Fits::default())?;
    /// assert_eq!(k.k1().value(), plain.k1());
    /// assert!(k.k1().d[0] > 0.0); // K1 rises with temperature
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn saline_at(
        conditions: &Conditions,
        t_c: R,
        s: R,
        composition: &Composition,
        fits: &Fits,
    ) -> Result<Self> {
        let t = t_c + 273.15;
        let p_bar = conditions.pressure_bar();
        let (tcv, sv) = (t_c.value(), s.value());
        let mut warnings = Vec::new();

        let density = density_kg_m3(s, t_c)?;
        let totals = composition.saline_totals(s, density, fits.boron_total);

        // Free-scale KS and KF at the surface.
        if totals.sulfate_mol_kg.value() > 0.0 {
            sulfate::DICKSON1990_KS_RANGE.check_for("KS", tcv, sv, &mut warnings);
        }
        let ks0 = sulfate::dickson1990_ln_ks(t, s).exp();
        if totals.fluoride_mol_kg.value() > 0.0 {
            fits.fluoride
                .range()
                .check_for("KF", tcv, sv, &mut warnings);
        }
        let kf_native = fits.fluoride.kf(t, s);
        let kf0 = match fits.fluoride.scale() {
            PhScale::Total => kf_native / (totals.sulfate_mol_kg / ks0 + 1.0),
            _ => kf_native,
        };
        let tot0 = totals.sulfate_mol_kg / ks0 + 1.0;
        let sws0 = tot0 + totals.fluoride_mol_kg / kf0;
        // K on the sea-water scale = K on the native scale * [H]SWS/[H]native.
        let total_to_sws0 = sws0 / tot0;
        let to_sws0 = |scale: PhScale| match scale {
            PhScale::Total => total_to_sws0,
            PhScale::Free => sws0,
            _ => R::constant(1.0),
        };

        let carbonic = fits.carbonic_at(tcv, sv);
        carbonic
            .range()
            .check_for("K1 and K2", tcv, sv, &mut warnings);
        let (k1n, k2n) = carbonic.k1_k2(t, s);
        let mut k1 = k1n * to_sws0(carbonic.scale());
        let mut k2 = k2n * to_sws0(carbonic.scale());

        if totals.boron_mol_kg.value() > 0.0 {
            boron::DICKSON1990_KB_RANGE.check_for("KB", tcv, sv, &mut warnings);
        }
        let mut kb = boron::dickson1990_ln_kb(t, s).exp() * total_to_sws0;
        kw::MILLERO1995_KW_RANGE.check_for("KW", tcv, sv, &mut warnings);
        let mut kw = kw::millero1995_ln_kw(t, s).exp() * total_to_sws0;

        let zero = R::constant(0.0);
        let (mut kp1, mut kp2, mut kp3, mut ksi) = (zero, zero, zero, zero);
        if totals.phosphate_mol_kg.value() > 0.0 || totals.silicate_mol_kg.value() > 0.0 {
            nutrients::MILLERO1995_NUTRIENT_RANGE.check_for("KP and KSi", tcv, sv, &mut warnings);
        }
        if totals.phosphate_mol_kg.value() > 0.0 {
            let (a, b, c) = nutrients::millero1995_ln_kp(t, s);
            kp1 = a.exp() * total_to_sws0;
            kp2 = b.exp() * total_to_sws0;
            kp3 = c.exp() * total_to_sws0;
        }
        if totals.silicate_mol_kg.value() > 0.0 {
            ksi = nutrients::millero1995_ln_ksi(t, s).exp() * total_to_sws0;
        }
        let mut knh4 = zero;
        if totals.ammonia_mol_kg.value() > 0.0 {
            ammonia::JOHANSSON_WEDBORG1980_RANGE.check_for("KNH4", tcv, sv, &mut warnings);
            knh4 = (-ammonia::johansson_wedborg1980_pka(t, s)).pow10();
        }
        let mut kh2s = zero;
        if totals.sulfide_mol_kg.value() > 0.0 {
            sulfide::MILLERO1988_RANGE.check_for("KH2S", tcv, sv, &mut warnings);
            kh2s = (-sulfide::millero1988_pk1(t, s)).pow10() * total_to_sws0;
        }

        minerals::MUCCI1983_RANGE.check_for("calcite and aragonite", tcv, sv, &mut warnings);
        let (mut lc, mut la) = minerals::mucci1983_log_ksp(t, s);

        let (mut ks, mut kf) = (ks0, kf0);
        if p_bar > 0.0 {
            use pressure::*;
            let p = R::constant(p_bar);
            let f = |c: &PressureCoefficients| pressure_factor(c, t_c, p);
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
            lc += pressure_ln_factor(&CALCITE, t_c, p) * std::f64::consts::LOG10_E;
            la += pressure_ln_factor(&ARAGONITE, t_c, p) * std::f64::consts::LOG10_E;
        }
        let ksp_calcite = lc.pow10();
        let ksp_aragonite = la.pow10();

        // Sea-water scale to the working (total) scale at pressure.
        let scale_link = ScaleLink::Total {
            fh: takahashi1982_fh(t, s),
        };
        let factors = scale_factors(
            scale_link,
            totals.sulfate_mol_kg,
            totals.fluoride_mol_kg,
            ks,
            kf,
        );
        let sws_to_total = factors.total_per_seawater;
        for k in [
            &mut k1, &mut k2, &mut kb, &mut kw, &mut kp1, &mut kp2, &mut kp3, &mut ksi, &mut knh4,
            &mut kh2s,
        ] {
            *k *= sws_to_total;
        }

        gas::WEISS1974_RANGE.check_for("K0", tcv, sv, &mut warnings);
        let k0 = gas::weiss1974_ln_k0(t, s).exp();
        let fugacity_factor =
            gas::weiss1974_fugacity_factor(t, R::constant(conditions.air_pressure_atm()));
        let vapour_pressure_atm = gas::weiss_price1980_vapour_pressure_atm(t, s);

        let logs = Log10s {
            per_working: factors.logs.unwrap_or([zero; 4]),
            ksp_calcite: lc,
            ksp_aragonite: la,
        };

        Ok(Constants {
            conditions: *conditions,
            working_scale: PhScale::Total,
            at: [t_c, s, R::constant(conditions.pressure_dbar())],
            k0,
            k1,
            k2,
            k1e: k1,
            k2e: k2,
            pair_hco3: zero,
            pair_co3: zero,
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
            free_per_working: factors.free_per_working,
            seawater_per_working: factors.seawater_per_working,
            total_per_working: factors.total_per_working,
            nbs_per_working: factors.nbs_per_working,
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
                kw: FitName::Millero1995,
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
            k_cahco3: zero,
            k_caco3: zero,
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
