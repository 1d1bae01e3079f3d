//! The derivatives of the solve's unknowns, h and DIC, by implicit
//! differentiation at the root.
//!
//! A solve finds h and DIC such that the state reproduces both
//! measurements: G(h, DIC; sources) = 0, one residual per measurement,
//! G = (the state's value of the measured quantity) − (the measurement),
//! in the working units of [`super::to_working`]. At the root, for every
//! source s (a measurement, a condition, a constant),
//!
//! ```text
//! J · (dh/ds, dDIC/ds)ᵀ = −∂G/∂s,     J = ∂G/∂(h, DIC)   (2 × 2)
//! ```
//!
//! The residuals are evaluated twice on [`Tangent`]s: with h and DIC
//! seeded and the sources held (their derivatives are J), and with h and
//! DIC held and the sources seeded (∂G/∂s). The values come from the solve on `f64`, which
//! stays the one solver; only the derivatives are made here.

use super::{dic_per_co2, dic_per_co3, dic_per_hco3};
use crate::base::numeric::{Real, Tangent};
use crate::base::units::Amount;
use crate::medium::Constants;
use crate::sample::measured::{Measured, MeasuredValue, Parameter};
use crate::speciation::alkalinity::{carbonate_per_dic, non_carbonate};

/// The residual of measurement `m` at (h, DIC) (mol/kg): the state's value
/// of what `m` measures less the measurement, in the working units of
/// [`super::to_working`] (h on the working scale, CO2* for the gas-phase
/// parameters, the carbon-balance totals for the ions), where `number` is
/// the measurement in the unit of [`Measured::number`] (pH; µmol/kg or
/// µmol/L; µatm; ppm), with its derivatives.
pub(crate) fn residual<R: Real>(k: &Constants<R>, h: R, dic: R, m: &Measured, number: R) -> R {
    let amount = |x: R| match m.value() {
        MeasuredValue::Amount(Amount::PerLitre(_)) => x * 1e-3 / k.density_kg_m3(),
        _ => x * 1e-6,
    };
    let co2 = || dic / dic_per_co2(k, h);
    match (m.parameter(), m.value()) {
        (_, MeasuredValue::Ph(_, scale)) => {
            h - k.h_from_ph(number, scale.unwrap_or(k.working_scale()))
        }
        (Parameter::Pco2, MeasuredValue::Atm(_)) => {
            co2() - k.k0() * (number * 1e-6) * k.fugacity_factor()
        }
        (_, MeasuredValue::Atm(_)) => co2() - k.k0() * (number * 1e-6),
        (_, MeasuredValue::MoleFraction(_)) => {
            let dry = k
                .vapour_pressure_atm()
                .subtracted_from(k.conditions().air_pressure_atm());
            co2() - k.k0() * (number * 1e-6 * dry) * k.fugacity_factor()
        }
        (Parameter::Alkalinity, MeasuredValue::Amount(_)) => {
            let (c, _) = carbonate_per_dic(k, h);
            let (n, _) = non_carbonate(k, h);
            dic * c + n - amount(number)
        }
        (Parameter::Dic, MeasuredValue::Amount(_)) => dic - amount(number),
        (Parameter::Hco3, MeasuredValue::Amount(_)) => {
            dic / dic_per_hco3(k, h) - amount(number) * (k.pair_hco3() + 1.0)
        }
        (Parameter::Co3, MeasuredValue::Amount(_)) => {
            dic / dic_per_co3(k, h) - amount(number) * (k.pair_co3() + 1.0)
        }
        (_, MeasuredValue::Amount(_)) => co2() - amount(number),
    }
}

/// h and DIC as [`Tangent`]s: the values `h`, `dic` of the solve, and their
/// derivatives with respect to every source by implicit differentiation
/// (see the module). `k` carries the sources' derivatives; `plain` is the
/// same constants without them (its numbers on a two-slot tangent, which
/// gives J: h and DIC are seeded there). `a` and `b` are the two
/// measurements with their numbers (seeded where a measurement is a
/// source). `None` where J is singular (a double root of a two-root pair)
/// or a derivative is not finite.
pub(crate) fn unknowns<const N: usize>(
    k: &Constants<Tangent<N>>,
    plain: &Constants<Tangent<2>>,
    (h, dic): (f64, f64),
    a: (&Measured, Tangent<N>),
    b: (&Measured, Tangent<N>),
) -> Option<(Tangent<N>, Tangent<N>)> {
    // J = ∂G/∂(h, DIC) at the constants and measurements held.
    let (th, tdic) = (Tangent::<2>::source(h, 0), Tangent::<2>::source(dic, 1));
    let ja = residual(plain, th, tdic, a.0, Tangent::constant(a.0.number()));
    let jb = residual(plain, th, tdic, b.0, Tangent::constant(b.0.number()));
    let j = [ja.d, jb.d];
    let det = j[0][0] * j[1][1] - j[0][1] * j[1][0];
    if !(det.is_finite() && det != 0.0) {
        return None;
    }
    // ∂G/∂s at h and DIC held.
    let (hh, dh0) = (Tangent::<N>::constant(h), Tangent::<N>::constant(dic));
    let ga = residual(k, hh, dh0, a.0, a.1);
    let gb = residual(k, hh, dh0, b.0, b.1);
    let (mut dh, mut ddic) = ([0.0; N], [0.0; N]);
    for s in 0..N {
        let (ra, rb) = (ga.d[s], gb.d[s]);
        // (dh, dDIC) = −J⁻¹ (ra, rb), by Cramer's rule.
        dh[s] = -(ra * j[1][1] - rb * j[0][1]) / det;
        ddic[s] = -(j[0][0] * rb - j[1][0] * ra) / det;
    }
    if dh.iter().chain(&ddic).any(|x| !x.is_finite()) {
        return None;
    }
    Some((Tangent::new(h, dh), Tangent::new(dic, ddic)))
}
