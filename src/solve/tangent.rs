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
use crate::medium::fresh::ionic::ion_sum;
use crate::medium::fresh::FreshBasis;
use crate::medium::Constants;
use crate::sample::measured::{Measured, MeasuredValue, Parameter};
use crate::speciation::alkalinity::{carbonate_per_dic, non_carbonate};
use crate::speciation::calcium::free_calcium;

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

/// The residuals of a fresh solve at the unknowns `u` = (h, DIC, I, free
/// Ca): the two measurements' (as [`residual`]) at the apparent constants
/// of (I, Ca), and the fixed point's, I − (the ionic strength of the ions
/// there) where the ions give it (`from_ions`) and Ca − (the free calcium
/// of the pair balance there) where the water has calcium (`with_ca`);
/// zero where not.
fn fresh_residuals<R: Real>(
    basis: &FreshBasis<R>,
    u: [R; 4],
    a: (&Measured, R),
    b: (&Measured, R),
    from_ions: bool,
    with_ca: bool,
) -> [R; 4] {
    let k = fresh_constants(basis, u, from_ions, with_ca);
    fresh_residuals_at(&k, basis, u, a, b, from_ions, with_ca)
}

/// The apparent constants of [`fresh_residuals`] at the unknowns `u`.
fn fresh_constants<R: Real>(
    basis: &FreshBasis<R>,
    [_, _, i, ca]: [R; 4],
    from_ions: bool,
    with_ca: bool,
) -> Constants<R> {
    let zero = R::constant(0.0);
    let i_used = match basis.fixed_i {
        Some(fixed) if !from_ions => fixed,
        _ => i,
    };
    basis.constants_at(
        i_used,
        if with_ca { ca } else { zero },
        basis.totals.calcium_mol_kg,
    )
}

/// [`fresh_residuals`] at its apparent constants `k` ([`fresh_constants`]).
fn fresh_residuals_at<R: Real>(
    k: &Constants<R>,
    basis: &FreshBasis<R>,
    [h, dic, i, ca]: [R; 4],
    a: (&Measured, R),
    b: (&Measured, R),
    from_ions: bool,
    with_ca: bool,
) -> [R; 4] {
    let zero = R::constant(0.0);
    let ca_total = basis.totals.calcium_mol_kg;
    [
        residual(k, h, dic, a.0, a.1),
        residual(k, h, dic, b.0, b.1),
        if from_ions {
            i - ion_sum(k, h, dic).0
        } else {
            zero
        },
        if with_ca {
            ca - free_calcium(k, h, dic, ca_total)
        } else {
            zero
        },
    ]
}

/// The unknowns of a fresh solve, h, DIC, the ionic strength and the free
/// calcium, as [`Tangent`]s: the values `u` of the solve (its fixed point
/// settled), and their derivatives by implicit differentiation of all the
/// equations the solve satisfies at once, the two measurements and the
/// fixed point's two (see [`fresh_residuals`]): J (du/ds) = −∂G/∂s, J up
/// to 4 × 4, solved by Gaussian elimination with partial pivoting on the
/// unknowns scaled by their values. `basis` carries the sources'
/// derivatives; `plain` is the same basis without them (J comes from it,
/// the unknowns seeded on its four slots). Where the ionic strength does
/// not come from the ions it is the basis's own (with its derivatives),
/// and without calcium the free calcium is 0. `held` are the apparent
/// constants at the unknowns held ([`held_constants`]: the sources'
/// derivatives alone), which the caller keeps (its constants at the
/// unknowns follow from them, without a copy of their large numbers).
/// `None` where J is singular or a derivative is not finite.
// Index loops read as the elimination is written.
#[allow(clippy::needless_range_loop)]
pub(crate) fn fresh_unknowns<const N: usize>(
    basis: &FreshBasis<Tangent<N>>,
    plain: &FreshBasis<Tangent<4>>,
    held: &Constants<Tangent<N>>,
    u: [f64; 4],
    a: (&Measured, Tangent<N>),
    b: (&Measured, Tangent<N>),
) -> Option<[Tangent<N>; 4]> {
    let (from_ions, with_ca) = fixed_point_equations(basis);
    let mut all = [0usize; 4];
    let mut n = 0;
    for (i, on) in [true, true, from_ions, with_ca].into_iter().enumerate() {
        if on {
            all[n] = i;
            n += 1;
        }
    }
    let active = &all[..n];
    // J, columns scaled by the unknowns' values (h and DIC differ by five
    // orders of magnitude).
    let seeded = [0, 1, 2, 3].map(|i| Tangent::<4>::source(u[i], i));
    let ja = (a.0, Tangent::constant(a.0.number()));
    let jb = (b.0, Tangent::constant(b.0.number()));
    let g = fresh_residuals(plain, seeded, ja, jb, from_ions, with_ca);
    let mut scale = [1.0; 4];
    for (x, &i) in scale.iter_mut().zip(active) {
        if u[i] != 0.0 && u[i].is_finite() {
            *x = u[i].abs();
        }
    }
    let mut j = [[0.0; 4]; 4];
    for (r, &gr) in active.iter().enumerate() {
        for (c, &uc) in active.iter().enumerate() {
            j[r][c] = g[gr].d[uc] * scale[c];
        }
    }
    // ∂G/∂s at the unknowns held.
    let u_held = u.map(Tangent::<N>::constant);
    let gs = fresh_residuals_at(held, basis, u_held, a, b, from_ions, with_ca);
    let mut rhs = [[0.0; N]; 4];
    for (r, &gr) in active.iter().enumerate() {
        for (x, d) in rhs[r].iter_mut().zip(gs[gr].d) {
            *x = -d;
        }
    }
    // Gaussian elimination with partial pivoting, every source at once.
    for col in 0..n {
        let pivot = (col..n).max_by(|&p, &q| j[p][col].abs().total_cmp(&j[q][col].abs()))?;
        if !(j[pivot][col].is_finite() && j[pivot][col] != 0.0) {
            return None;
        }
        j.swap(col, pivot);
        rhs.swap(col, pivot);
        for r in col + 1..n {
            let f = j[r][col] / j[col][col];
            for c in col..n {
                j[r][c] -= f * j[col][c];
            }
            for s in 0..N {
                rhs[r][s] -= f * rhs[col][s];
            }
        }
    }
    let mut x = [[0.0; N]; 4];
    for r in (0..n).rev() {
        for s in 0..N {
            let mut v = rhs[r][s];
            for c in r + 1..n {
                v -= j[r][c] * x[c][s];
            }
            x[r][s] = v / j[r][r];
        }
    }
    let mut out = [
        Tangent::constant(u[0]),
        Tangent::constant(u[1]),
        basis
            .fixed_i
            .filter(|_| !from_ions)
            .unwrap_or(Tangent::constant(u[2])),
        Tangent::constant(if with_ca { u[3] } else { 0.0 }),
    ];
    for (r, &ur) in active.iter().enumerate() {
        let d = x[r].map(|v| v * scale[r]);
        if d.iter().any(|v| !v.is_finite()) {
            return None;
        }
        out[ur] = Tangent::new(u[ur], d);
    }
    Some(out)
}

/// Which of the fixed point's equations a fresh solve has: the ionic
/// strength's (where the ions give it) and the free calcium's (where the
/// water has calcium).
fn fixed_point_equations<R: Real>(basis: &FreshBasis<R>) -> (bool, bool) {
    (
        basis.fixed_i.is_none(),
        basis.totals.calcium_mol_kg.value() > 0.0,
    )
}

/// The apparent constants of a fresh solve at its unknowns `u` held (the
/// values of the solve, without derivatives): the `held` of
/// [`fresh_unknowns`], on the sources' derivatives alone.
pub(crate) fn held_constants<const N: usize>(
    basis: &FreshBasis<Tangent<N>>,
    u: [f64; 4],
) -> Constants<Tangent<N>> {
    let (from_ions, with_ca) = fixed_point_equations(basis);
    fresh_constants(basis, u.map(Tangent::<N>::constant), from_ions, with_ca)
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::medium::fresh::FreshSources;
    use crate::sample::{Composition, Conditions, Water};
    use crate::units::Amount;

    /// Where a fresh water's ionic strength is fixed, the constants at the
    /// unknowns are those held with the free calcium set again: every
    /// number and derivative that `constants_at` makes at the free calcium
    /// on tangents, for waters with and without calcium.
    #[test]
    fn constants_at_the_unknowns_follow_from_those_held() {
        for calcium in [0.0, 1e-3] {
            let mut composition = Composition::default();
            if calcium > 0.0 {
                composition = composition.with_calcium(Amount::PerKg(calcium)).unwrap();
            }
            let water = Water::fresh(Conditions::new(15.0, 0.2).unwrap())
                .unwrap()
                .with_composition(composition);
            let s = water
                .solve(
                    Measured::ph(7.6, None).unwrap(),
                    Measured::alkalinity_umol_kg(2000.0).unwrap(),
                )
                .unwrap();
            let c = water.conditions();
            let sources = FreshSources {
                temperature_c: Tangent::<3>::source(c.temperature_c(), 0),
                salinity: Tangent::source(c.salinity(), 1),
                fixed_ionic_input: None,
                calcium_shift_mol_kg: Some(Tangent::source(0.0, 2)),
            };
            let basis = FreshBasis::new_at(&water, &sources, false).unwrap();
            let fixed = basis.fixed_i.unwrap();
            let u = [
                s.h_mol_kg(),
                s.dic_mol_kg(),
                fixed.v,
                s.calcium_free_mol_kg(),
            ];
            // The free calcium with derivatives of its own, as the
            // implicit differentiation gives them.
            let ca = Tangent::new(u[3], [0.3 * u[3], -0.2 * u[3], 0.9]);
            let mut held = held_constants(&basis, u);
            held.set_free_calcium(ca);
            let made = basis.constants_at(fixed, ca, basis.totals.calcium_mol_kg);
            assert_eq!(held, made, "calcium {calcium}");
        }
    }
}
