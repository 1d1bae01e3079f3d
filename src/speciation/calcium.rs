//! The calcium ion pairs in the carbon balances: free calcium, the pair
//! ratios in the constants, and ln Ω at a given alkalinity.

use crate::base::numeric::Real;
use crate::medium::Constants;
use crate::sample::measured::{Measured, MeasuredValue, Parameter};

/// Positive root of c w S² + (c + q − p w) S − p = 0 (with w = 0: S = p/c),
/// the balance (p − S c)(1 + S w) = S q.
pub(crate) fn balance_root<R: Real>(c: R, w: R, q: R, p: R) -> R {
    if w.value() == 0.0 {
        return p / c;
    }
    let b = c + q - p * w;
    let disc = (b * b + c * 4.0 * w * p).sqrt();
    if b.value() > 0.0 {
        p * 2.0 / (b + disc)
    } else {
        (disc - b) / (c * 2.0 * w)
    }
}

/// The free calcium that is exactly consistent with h and DIC at the
/// apparent constants of `k`: with CO2* = S, HCO3- = S u, CO3-- = S v,
/// u = K1'/h, v = K1'K2'/h², the pairs give DIC = S (1 + u + v) + Ca S w,
/// w = a u + b v, and Ca = CaT/(1 + S w); one quadratic in S.
pub(crate) fn free_calcium<R: Real>(k: &Constants<R>, h: R, dic: R, ca_total: R) -> R {
    let u = k.k1() / h;
    let v = k.k1() * k.k2() / (h * h);
    let w = k.k_cahco3() * u + k.k_caco3() * v;
    let s = balance_root(u + 1.0 + v, w, ca_total * w, dic);
    ca_total / (s * w + 1.0)
}

/// The free calcium of a water whose h and alkalinity `ta` are both known,
/// at the apparent constants of `k` (its ionic strength; the free calcium
/// set in it is not read): the carbonate alkalinity
/// TA − (non-carbonate) = S (u + 2v) + Ca S (a u + 2 b v) and
/// Ca = CaT/(1 + S (a u + b v)), with CO2* = S, u = K1′/h, v = K1′K2′/h²,
/// one quadratic in S ([`balance_root`]), as in [`ln_omega_at_alkalinity`].
/// The free calcium at which the shared solver, given that pH and
/// alkalinity, returns exactly that water: the fixed point of the free
/// calcium in closed form. `None` where the alkalinity left for carbon is
/// not positive.
pub(crate) fn free_calcium_at_alkalinity<R: Real>(
    k: &Constants<R>,
    ta: R,
    ca_total: R,
    h: R,
) -> Option<R> {
    let carbon = ta - crate::speciation::alkalinity::non_carbonate(k, h).0;
    if carbon.value() <= 0.0 || ca_total.value() <= 0.0 {
        return None;
    }
    let u = k.k1() / h;
    let v = k.k1() * k.k2() / (h * h);
    let (a, b) = (k.k_cahco3(), k.k_caco3());
    let w = a * u + b * v;
    let s = balance_root(u + v * 2.0, w, ca_total * (a * u + b * 2.0 * v), carbon);
    let ca = ca_total / (s * w + 1.0);
    let (c, t) = (ca.value(), ca_total.value());
    (c.is_finite() && c > 0.0 && c <= t).then_some(ca)
}

/// h and the free calcium of a water whose alkalinity `ta` and CO2* `co2`
/// are both known, at the apparent constants of `k` (its ionic strength;
/// the free calcium set in it is not read). At a given h the free ions are
/// HCO3- = CO2* u and CO3-- = CO2* v (u = K1′/h, v = K1′K2′/h²), so the
/// free calcium is Ca(h) = CaT/(1 + CO2* (a u + b v)) in closed form, and
/// the alkalinity
///
/// ```text
/// TA(h) = CO2* (u (1 + a Ca) + 2 v (1 + b Ca)) + non-carbonate(h)
/// ```
///
/// falls with h in natural waters (the pair term a u CaT/(1 + CO2* (a u +
/// b v)) rises with u while the CaCO3⁰ ratio b CO2* v, about 0.2 at
/// CO3-- = 10⁻⁴ mol/kg, stays below 1; the other terms always rise), a
/// single root in h found by [`crate::base::root::monotone_newton`] on
/// pH 0 to 14 with the analytic derivative, from `guess`. The free
/// calcium at which the shared
/// solver, given that alkalinity and CO2*, returns that water: the fixed
/// point of the free calcium as a root in h, used as the fixed point's
/// start (which the fixed point then checks, so a water where the root
/// were not unique would cost iterations, not accuracy). `None` where no
/// root is found in that range.
pub(crate) fn free_calcium_at_alkalinity_and_co2(
    k: &Constants,
    ta: f64,
    co2: f64,
    ca_total: f64,
    guess: f64,
) -> Option<(f64, f64)> {
    use crate::base::root::{monotone_newton, Search};
    if ca_total <= 0.0 || co2 <= 0.0 {
        return None;
    }
    let (k1, k12) = (k.k1(), k.k1() * k.k2());
    let (a, b) = (k.k_cahco3(), k.k_caco3());
    let calcium = |u: f64, v: f64| ca_total / (1.0 + co2 * (a * u + b * v));
    let f = |h: f64| {
        let u = k1 / h;
        let v = k12 / (h * h);
        let (du, dv) = (-u / h, -2.0 * v / h);
        let d = 1.0 + co2 * (a * u + b * v);
        let ca = ca_total / d;
        let dca = -ca_total * co2 * (a * du + b * dv) / (d * d);
        let (nc, dnc) = crate::speciation::alkalinity::non_carbonate(k, h);
        let carb = co2 * (u + 2.0 * v + ca * (a * u + 2.0 * b * v));
        let dcarb =
            co2 * (du + 2.0 * dv + dca * (a * u + 2.0 * b * v) + ca * (a * du + 2.0 * b * dv));
        (carb + nc - ta, dcarb + dnc)
    };
    let search = Search::new(1e-14, 1.0, true);
    let h = monotone_newton(f, &search, guess).ok()?;
    let ca = calcium(k1 / h, k12 / (h * h));
    (ca.is_finite() && ca > 0.0 && ca <= ca_total).then_some((h, ca))
}

/// h and the free calcium of a water whose alkalinity `ta` and DIC `dic`
/// are both known, at the apparent constants of `k` (its ionic strength;
/// the free calcium set in it is not read). At a given h the DIC balance
/// fixes CO2* = S and the free calcium as in [`free_calcium`] (one
/// quadratic, G(S, h) = (DIC − S c)(1 + S w) − S q = 0 with c = 1 + u + v,
/// w = a u + b v, q = CaT w), and the alkalinity is
///
/// ```text
/// TA(h) = S (u + 2v) + Ca S (a u + 2 b v) + non-carbonate(h),   Ca = CaT/(1 + S w)
/// dS/dh = −G_h/G_S,  G_S = −c (1 + S w) + (DIC − S c) w − q,
/// G_h = −S c′ (1 + S w) + (DIC − S c) S w′ − S q′      (primes: d/dh)
/// ```
///
/// (implicit differentiation; our own derivation). TA(h) falls with h in
/// natural waters; its root, by [`crate::base::root::monotone_newton`] on
/// pH 0 to 14 from `guess`, gives the free calcium at which the shared
/// solver, given that alkalinity and DIC, returns that water: a start for
/// the fixed point, which checks it. `None` where no root is found.
pub(crate) fn free_calcium_at_alkalinity_and_dic(
    k: &Constants,
    ta: f64,
    dic: f64,
    ca_total: f64,
    guess: f64,
) -> Option<(f64, f64)> {
    use crate::base::root::{monotone_newton, Search};
    if ca_total <= 0.0 || dic <= 0.0 {
        return None;
    }
    let (k1, k12) = (k.k1(), k.k1() * k.k2());
    let (a, b) = (k.k_cahco3(), k.k_caco3());
    // S and Ca at h, with the pieces of the derivative.
    let at = |h: f64| {
        let u = k1 / h;
        let v = k12 / (h * h);
        let w = a * u + b * v;
        let c = 1.0 + u + v;
        let q = ca_total * w;
        let s = balance_root(c, w, q, dic);
        (u, v, w, c, q, s)
    };
    let f = |h: f64| {
        let (u, v, w, c, q, s) = at(h);
        let (du, dv) = (-u / h, -2.0 * v / h);
        let (dc, dw) = (du + dv, a * du + b * dv);
        let dq = ca_total * dw;
        let one_sw = 1.0 + s * w;
        let left = dic - s * c;
        let g_s = -c * one_sw + left * w - q;
        let g_h = -s * dc * one_sw + left * s * dw - s * dq;
        let ds = -g_h / g_s;
        let ca = ca_total / one_sw;
        let dca = -ca_total * (ds * w + s * dw) / (one_sw * one_sw);
        let (e, de) = (a * u + 2.0 * b * v, a * du + 2.0 * b * dv);
        let carb = s * (u + 2.0 * v) + ca * s * e;
        let dcarb =
            ds * (u + 2.0 * v) + s * (du + 2.0 * dv) + dca * s * e + ca * ds * e + ca * s * de;
        let (nc, dnc) = crate::speciation::alkalinity::non_carbonate(k, h);
        (carb + nc - ta, dcarb + dnc)
    };
    let search = Search::new(1e-14, 1.0, true);
    let h = monotone_newton(f, &search, guess).ok()?;
    let (_, _, w, _, _, s) = at(h);
    let ca = ca_total / (1.0 + s * w);
    (ca.is_finite() && ca > 0.0 && ca <= ca_total).then_some((h, ca))
}

/// [CaHCO3+]/[Ca++] or [CaCO3⁰]/[Ca++] of a free ion given (0 for any
/// other parameter), at the apparent pair constants of `k`.
pub(crate) fn free_ion_pairs<R: Real>(k: &Constants<R>, m: &Measured) -> R {
    use crate::base::units::Amount;
    let amount = match m.value() {
        MeasuredValue::Amount(Amount::PerKg(v)) => R::constant(v),
        // As `Amount::mol_kg` computes it: v · 1000 / density.
        MeasuredValue::Amount(Amount::PerLitre(v)) => k.density_kg_m3().under(v * 1000.0),
        _ => R::constant(0.0),
    };
    free_ion_pairs_of(k, m.parameter(), amount)
}

/// [`free_ion_pairs`] of a free ion `parameter` whose amount (mol/kg) is
/// `amount_mol_kg`, on any [`Real`] (the amount can carry the derivatives
/// of the measured pair): K_CaHCO3′ HCO3- or K_CaCO3′ CO3--, 0 for any
/// other parameter.
#[inline]
pub(crate) fn free_ion_pairs_of<R: Real>(
    k: &Constants<R>,
    parameter: Parameter,
    amount_mol_kg: R,
) -> R {
    match parameter {
        Parameter::Hco3 => k.k_cahco3() * amount_mol_kg,
        Parameter::Co3 => k.k_caco3() * amount_mol_kg,
        _ => R::constant(0.0),
    }
}

/// ln Ω of calcite at activity h (NBS) for alkalinity `ta` and total
/// calcium `ca_total` (mol/kg), at the apparent constants of `k` (its
/// ionic strength held), with the calcium pairs solved exactly: with
/// CO2* = S, HCO3- = S u, CO3-- = S v, u = K1'/h, v = K1'K2'/h², the
/// carbonate alkalinity TA − (non-carbonate) = S (u + 2v) + Ca S (a u + 2 b v)
/// and Ca = CaT/(1 + S (a u + b v)): one quadratic in S. `None` where the
/// alkalinity left for carbon is not positive.
pub(crate) fn ln_omega_at_alkalinity<R: Real>(
    k: &Constants<R>,
    ta: R,
    ca_total: R,
    h: R,
) -> Option<R> {
    let carbon = ta - crate::speciation::alkalinity::non_carbonate(k, h).0;
    if carbon.value() <= 0.0 {
        return None;
    }
    let u = k.k1() / h;
    let v = k.k1() * k.k2() / (h * h);
    let (a, b) = (k.k_cahco3(), k.k_caco3());
    let w = a * u + b * v;
    let s = balance_root(u + v * 2.0, w, ca_total * (a * u + b * 2.0 * v), carbon);
    let ca = ca_total / (s * w + 1.0);
    let ln = (ca * s * v / k.ksp_calcite()).ln();
    ln.value().is_finite().then_some(ln)
}

/// ln Ω of calcite as [`ln_omega_at_alkalinity`] gives it, and its
/// derivative with respect to the NBS pH at the same alkalinity and
/// calcium, by implicit differentiation of the balance. With x = ln h,
/// u′ = −u, v′ = −2v (primes: d/dx) and, in the balance
/// G(S, x) = (C − S c)(1 + S w) − S q = 0 of [`balance_root`] (C the
/// carbonate alkalinity, c = u + 2v, w = a u + b v, q = CaT (a u + 2 b v)):
///
/// ```text
/// G_S = −c (1 + S w) + (C − S c) w − q
/// G_x = (C′ − S c′)(1 + S w) + (C − S c) S w′ − S q′,   S′ = −G_x / G_S
/// C′ = −h d(non-carbonate)/dh,  c′ = −u − 4v,  w′ = −a u − 2 b v,  q′ = −CaT (a u + 4 b v)
/// ln Ω = ln CaT − ln(1 + S w) + ln S + ln v − ln Ksp′
/// d ln Ω/dx = −(S′ w + S w′)/(1 + S w) + S′/S − 2,   d ln Ω/dpH = −ln 10 · d ln Ω/dx
/// ```
/// (implicit differentiation; our own derivation). The value is the same
/// number [`ln_omega_at_alkalinity`] returns; the slope is a number, made
/// from the values (a Newton step and an implicit differentiation read no
/// more of it), the same on `f64`.
pub(crate) fn ln_omega_and_slope_at_alkalinity<R: Real>(
    k: &Constants<R>,
    ta: R,
    ca_total: R,
    h: R,
) -> Option<(R, f64)> {
    let (nc, dnc) = crate::speciation::alkalinity::non_carbonate(k, h);
    let carbon = ta - nc;
    if carbon.value() <= 0.0 {
        return None;
    }
    let u = k.k1() / h;
    let v = k.k1() * k.k2() / (h * h);
    let (a, b) = (k.k_cahco3(), k.k_caco3());
    let w = a * u + b * v;
    let c = u + v * 2.0;
    let q = ca_total * (a * u + b * 2.0 * v);
    let s = balance_root(c, w, q, carbon);
    let one_sw = s * w + 1.0;
    let ca = ca_total / one_sw;
    let ln = (ca * s * v / k.ksp_calcite()).ln();
    if !ln.value().is_finite() {
        return None;
    }
    // The slope in numbers, from the values (a Newton step and an implicit
    // differentiation read its value alone; on f64 the same operations).
    let (h, u, v, a, b, ca_total) = (
        h.value(),
        u.value(),
        v.value(),
        a.value(),
        b.value(),
        ca_total.value(),
    );
    let (w, c, q, s, one_sw) = (w.value(), c.value(), q.value(), s.value(), one_sw.value());
    let d_carbon = -h * dnc.value();
    let dc = -u - v * 4.0;
    let dw = -a * u - b * 2.0 * v;
    let dq = -ca_total * (a * u + b * 4.0 * v);
    let left = carbon.value() - s * c;
    let g_s = -c * one_sw + left * w - q;
    let g_x = (d_carbon - s * dc) * one_sw + left * s * dw - s * dq;
    let ds = -g_x / g_s;
    let d_ln_dx = -(ds * w + s * dw) / one_sw + ds / s - 2.0;
    let slope = d_ln_dx * -std::f64::consts::LN_10;
    slope.is_finite().then_some((ln, slope))
}
/// Free CO3-- at h and DIC (the carbon-balance total less the CaCO3⁰ pair).
pub(crate) fn free_carbonate<R: Real>(k: &Constants<R>, h: R, dic: R) -> R {
    let k12 = k.k1e() * k.k2e();
    dic * k12 / (h * h + k.k1e() * h + k12) / (k.pair_co3() + 1.0)
}
