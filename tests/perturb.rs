//! A perturbed constant, solved through the one solver: the state follows
//! the perturbation as the algebra of the carbonate system says it must.
//!
//! The water is sea water at 25 °C and salinity 35 with alkalinity 2300 and
//! DIC 2000 µmol/kg (a demo water); every expectation below is computed here
//! from the constants the crate reports, by the formulas in the comments.

use travertine::medium::{ConstantName, Constants};
use travertine::{Conditions, Measured, PhScale, PreparedWater, State, Water};

fn sea_water() -> PreparedWater {
    Water::saline(Conditions::new(25.0, 35.0).expect("conditions"))
        .and_then(|w| w.prepare())
        .expect("sea water")
}

fn solve(p: &PreparedWater) -> State {
    p.solve(
        Measured::alkalinity_umol_kg(2300.0).expect("alkalinity"),
        Measured::dic_umol_kg(2000.0).expect("dic"),
    )
    .expect("the demo water solves")
}

fn perturbed(which: ConstantName, delta_pk: f64) -> (Constants, State) {
    let p = sea_water()
        .with_constants_perturbed(which, delta_pk)
        .expect("a small perturbation is accepted");
    (p.constants().expect("constants"), solve(&p))
}

/// d ln pCO2 / d ln K1 at fixed alkalinity and DIC, analytically, at the
/// working-scale h of `state` and the constants `k` (computed).
///
/// With D = h² + K1 h + K1 K2 and c = (K1 h + 2 K1 K2)/D the carbonate
/// alkalinity per unit DIC, the alkalinity TA = DIC c(h, K1) + N(h) is held,
/// so dh/d ln K1 = −DIC K1 ∂c/∂K1 / (DIC ∂c/∂h + N'(h)), with
/// ∂c/∂h = (K1 − c (2h + K1))/D and ∂c/∂K1 = ((h + 2 K2) − c (h + K2))/D.
/// N(h) = TB KB/(KB + h) + KW/h − hF − ST hF/(KS + hF) − FT hF/(KF + hF),
/// hF = h·(free per working), is the non-carbonate alkalinity of this water
/// (no nutrients, ammonia or sulfide). pCO2 = CO2*/(K0 · fugacity factor)
/// and CO2* = DIC h²/D, so d ln pCO2 = 2 dh/h − dD/D with
/// dD = (2h + K1) dh + K1 (h + K2) d ln K1.
fn dln_pco2_dln_k1(k: &Constants, state: &State) -> f64 {
    let t = k.totals();
    assert_eq!(
        t.phosphate_mol_kg + t.silicate_mol_kg + t.ammonia_mol_kg + t.sulfide_mol_kg,
        0.0,
        "N(h) below has no nutrient, ammonia or sulfide terms"
    );
    let h = k.h_from_ph(state.ph_total, PhScale::Total);
    let dic = state.dic_umol_kg * 1e-6;
    let (k1, k2) = (k.k1(), k.k2());
    let d = h * h + k1 * h + k1 * k2;
    let c = (k1 * h + 2.0 * k1 * k2) / d;
    let dc_dh = (k1 - c * (2.0 * h + k1)) / d;
    let dc_dk1 = ((h + 2.0 * k2) - c * (h + k2)) / d;
    let ff = k.free_per_working();
    let hf = h * ff;
    let (kb, ks, kf) = (k.kb(), k.ks_free(), k.kf_free());
    let dn_dh = -t.boron_mol_kg * kb / ((kb + h) * (kb + h))
        - k.kw() / (h * h)
        - ff
        - t.sulfate_mol_kg * ks * ff / ((ks + hf) * (ks + hf))
        - t.fluoride_mol_kg * kf * ff / ((kf + hf) * (kf + hf));
    let dh_dlnk1 = -dic * k1 * dc_dk1 / (dic * dc_dh + dn_dh);
    2.0 * dh_dlnk1 / h - ((2.0 * h + k1) * dh_dlnk1 + k1 * (h + k2)) / d
}

/// pK1 raised by 0.01: pCO2 moves by what the analytic derivative predicts,
/// to first order. The error of the linear prediction is second order: a
/// perturbation ten times smaller leaves an error about a hundred times
/// smaller, ten times smaller relative to the change.
#[test]
fn pco2_follows_a_perturbed_k1_to_first_order() {
    let base = solve(&sea_water());
    let k = sea_water().constants().expect("constants");
    let slope = dln_pco2_dln_k1(&k, &base);
    // A weaker first dissociation leaves more CO2*: the slope is negative.
    assert!(slope < -0.5 && slope > -2.0, "slope {slope}");
    let relative_error = |delta_pk: f64| {
        let (_, state) = perturbed(ConstantName::K1, delta_pk);
        let actual = (state.pco2_uatm / base.pco2_uatm).ln();
        // d ln K1 = −delta_pk ln 10.
        let predicted = slope * (-delta_pk * std::f64::consts::LN_10);
        assert!(actual > 0.0, "pCO2 must rise when pK1 rises");
        ((actual - predicted) / predicted).abs()
    };
    let coarse = relative_error(0.01);
    let fine = relative_error(0.001);
    // About 6e-4 and 6e-5 (computed).
    assert!(
        coarse < 2e-3,
        "relative error of the linear prediction {coarse}"
    );
    let ratio = coarse / fine;
    assert!(ratio > 8.0 && ratio < 12.0, "{coarse} / {fine} = {ratio}");
}

/// In saline water the calcium pairs are inside the constants: after a
/// perturbation K1e is K1 and K2e is K2, exactly, and K1 moved by the factor.
#[test]
fn k1e_is_k1_in_saline_water_after_perturbation() {
    let k = sea_water().constants().expect("constants");
    for which in [ConstantName::K1, ConstantName::K2] {
        let (p, _) = perturbed(which, 0.01);
        assert_eq!(p.k1e(), p.k1(), "{which:?}");
        assert_eq!(p.k2e(), p.k2(), "{which:?}");
        assert_eq!((p.pair_hco3(), p.pair_co3()), (0.0, 0.0));
    }
    let (p, _) = perturbed(ConstantName::K1, 0.01);
    assert!((p.k1() / k.k1() - 10f64.powf(-0.01)).abs() < 1e-14);
    assert_eq!(p.k2(), k.k2());
}

/// Ω = [Ca][CO3]/Ksp: a Ksp perturbed by a factor divides Ω by exactly that
/// factor, moves the saturation index by exactly its logarithm, and leaves
/// the speciation and the other mineral alone.
#[test]
fn omega_follows_a_perturbed_ksp_by_the_factor() {
    let base = solve(&sea_water());
    let delta_pk = 0.05;
    // Ksp' = Ksp 10^(−0.05), so Ω' = Ω 10^0.05 and SI' = SI + 0.05.
    let (_, state) = perturbed(ConstantName::KspCalcite, delta_pk);
    let (omega, omega0) = (state.omega_calcite.unwrap(), base.omega_calcite.unwrap());
    assert!((omega / omega0 / 10f64.powf(delta_pk) - 1.0).abs() < 1e-12);
    let (si, si0) = (state.si_calcite.unwrap(), base.si_calcite.unwrap());
    assert!((si - si0 - delta_pk).abs() < 1e-12);
    assert_eq!(state.omega_aragonite, base.omega_aragonite);
    assert_eq!(state.si_aragonite, base.si_aragonite);
    assert_eq!(state.ph_total, base.ph_total);
    assert_eq!(state.co3_umol_kg, base.co3_umol_kg);

    let (_, state) = perturbed(ConstantName::KspAragonite, -delta_pk);
    let (omega, omega0) = (
        state.omega_aragonite.unwrap(),
        base.omega_aragonite.unwrap(),
    );
    assert!((omega / omega0 / 10f64.powf(-delta_pk) - 1.0).abs() < 1e-12);
    let (si, si0) = (state.si_aragonite.unwrap(), base.si_aragonite.unwrap());
    assert!((si - si0 + delta_pk).abs() < 1e-12);
    assert_eq!(state.omega_calcite, base.omega_calcite);
}

/// KS perturbed: the working-scale constants are held, the other scales move
/// with it. With T = 1 + ST/KS and W = T + FT/KF on the perturbed KS,
/// pH(free) = pH(total) + log10 T, pH(SWS) = pH(total) − log10(W/T), and
/// pH(NBS) − pH(SWS) = −log10 fH does not depend on KS (the definitions of
/// the scales, and Takahashi et al. 1982 for fH; computed).
#[test]
fn ph_on_every_scale_stays_consistent_after_perturbing_ks() {
    let base = solve(&sea_water());
    for delta_pk in [0.1, -0.1] {
        let (k, state) = perturbed(ConstantName::Ks, delta_pk);
        let t = k.totals();
        let total = 1.0 + t.sulfate_mol_kg / k.ks_free();
        let seawater = total + t.fluoride_mol_kg / k.kf_free();
        let close = |a: f64, b: f64| (a - b).abs() < 1e-12;
        assert!(close(state.ph_free, state.ph_total + total.log10()));
        assert!(close(
            state.ph_seawater,
            state.ph_total - (seawater / total).log10()
        ));
        assert!(close(
            state.ph_nbs - state.ph_seawater,
            base.ph_nbs - base.ph_seawater
        ));
        // The constants convert every scale as the state reports it.
        let h = k.h_from_ph(state.ph_total, PhScale::Total);
        for (scale, ph) in [
            (PhScale::Total, state.ph_total),
            (PhScale::Seawater, state.ph_seawater),
            (PhScale::Free, state.ph_free),
            (PhScale::Nbs, state.ph_nbs),
        ] {
            assert!(close(k.ph_from_h(h, scale), ph), "{scale:?}");
        }
        // The free scale did move against the total scale (by about 0.025
        // for 0.1 in pKS: ST/KS is near 0.3 here).
        let free_shift = (state.ph_free - state.ph_total) - (base.ph_free - base.ph_total);
        assert!(free_shift.abs() > 1e-3, "{free_shift}");
        // The bisulfate is that of the perturbed KS at the solved free [H+].
        let hf = h * k.free_per_working();
        let hso4 = t.sulfate_mol_kg * hf / (k.ks_free() + hf) * 1e6;
        assert!((state.bisulfate_umol_kg / hso4 - 1.0).abs() < 1e-12);
    }
}

/// Fresh water perturbs through its basis: at a fixed ionic strength and
/// without calcium, pH and HCO3- fix CO2* = {H+}[HCO3-]γ1/K1 (the
/// definition of K1, on the activity scale) and pCO2 = CO2*/K0, so pK1 or
/// pK0 up by 0.01 raises pCO2 by the factor 10^0.01 exactly; pK2 leaves
/// it alone. (Before, a fresh water refused every perturbation.)
#[test]
fn fresh_water_constants_perturb_through_their_basis() {
    let pond = Water::fresh(Conditions::new(20.0, 0.2).expect("conditions"))
        .and_then(|w| w.with_ionic_strength(0.004))
        .and_then(|w| w.prepare())
        .expect("pond");
    let ph = Measured::ph(7.4, None).expect("pH");
    let hco3 = Measured::hco3_umol_kg(900.0).expect("HCO3");
    let base = pond.solve(ph, hco3).expect("base");
    for (which, factor) in [
        (ConstantName::K1, 10f64.powf(0.01)),
        (ConstantName::K0, 10f64.powf(0.01)),
        (ConstantName::K2, 1.0),
    ] {
        let moved = pond
            .with_constants_perturbed(which, 0.01)
            .and_then(|p| p.solve(ph, hco3))
            .expect("perturbed");
        let ratio = moved.pco2_uatm / base.pco2_uatm;
        assert!((ratio / factor - 1.0).abs() < 1e-9, "{which:?}: {ratio}");
    }
    let err = pond
        .with_constants_perturbed(ConstantName::K1, f64::NAN)
        .expect_err("not finite");
    assert!(err.to_string().contains("NaN"), "{err}");
}

/// A perturbation of zero gives back the same state, and every constant
/// can be perturbed and still solves the demo water.
#[test]
fn every_constant_perturbs_and_solves() {
    let base = solve(&sea_water());
    let (_, same) = perturbed(ConstantName::K2, 0.0);
    assert_eq!(same.pco2_uatm, base.pco2_uatm);
    for which in ConstantName::ALL {
        let (_, state) = perturbed(which, 0.02);
        assert!(state.pco2_uatm.is_finite(), "{which:?}");
        assert!(
            (state.alkalinity_umol_kg - 2300.0).abs() < 1e-6,
            "{which:?}"
        );
    }
}
