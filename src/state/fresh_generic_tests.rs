//! The fresh medium on tangents: the basis, the apparent constants, the ion
//! sum, the free calcium and the pHs residual, against the `f64` functions
//! (values bit for bit) and their central differences (derivatives).
//!
//! A unit-test module rather than a file in tests/: the fresh basis and the
//! closed forms it checks are crate-private.

use crate::base::numeric::{Real, Tangent};
use crate::base::units::Amount;
use crate::medium::fresh::{FreshBasis, FreshSources, IonicStrengthRoute};
use crate::medium::Constants;
use crate::properties::activity::ActivityModel;
use crate::sample::{Composition, Conditions, Water};
use crate::solve::{Near, SolveOptions};
use crate::speciation::calcium::{free_calcium, ln_omega_at_alkalinity};
use crate::state::fresh_figures::{saturation_ph_on, saturation_ph_residual};

/// Slots of the tangent: temperature, salinity, the fixed ionic-strength
/// input, the calcium shift, then the arguments of the closed forms.
const T: usize = 0;
const S: usize = 1;
const INPUT: usize = 2;
const CA: usize = 3;
const ARG: usize = 4;
type D = Tangent<6>;

/// Invented fresh waters covering every ionic-strength route, calcium per
/// kg and per litre, nutrients, pressure and both activity models.
fn waters() -> Vec<Water> {
    let fresh = |t: f64, s: f64| Water::fresh(Conditions::new(t, s).unwrap()).unwrap();
    let ions = Composition::default()
        .with_calcium(Amount::PerLitre(1.2e-3))
        .unwrap()
        .with_magnesium(Amount::PerLitre(4.5e-4))
        .unwrap()
        .with_sodium(Amount::PerLitre(1.0e-3))
        .unwrap()
        .with_potassium(Amount::PerLitre(8e-5))
        .unwrap()
        .with_chloride(Amount::PerLitre(1.0e-3))
        .unwrap()
        .with_sulfate(Amount::PerLitre(4.2e-4))
        .unwrap()
        .with_phosphate(Amount::PerKg(3e-6))
        .unwrap()
        .with_ammonia(Amount::PerKg(2e-5))
        .unwrap();
    let calcium = |a: Amount| Composition::default().with_calcium(a).unwrap();
    vec![
        fresh(14.0, 0.2).with_composition(ions),
        fresh(19.0, 0.15)
            .with_specific_conductance_us_cm(310.0)
            .unwrap()
            .with_composition(calcium(Amount::PerKg(6e-4))),
        fresh(9.0, 0.1)
            .at(Conditions::new(9.0, 0.1)
                .unwrap()
                .with_pressure_dbar(500.0)
                .unwrap())
            .unwrap()
            .with_tds_mg_l(260.0)
            .unwrap()
            .with_composition(calcium(Amount::PerLitre(7.5e-4))),
        fresh(21.0, 0.05)
            .with_ionic_strength(0.006)
            .unwrap()
            .with_composition(calcium(Amount::PerKg(1.4e-3))),
        fresh(20.0, 0.4).with_composition(calcium(Amount::PerKg(1.25e-3))),
        fresh(5.0, 0.1).with_composition(calcium(Amount::PerLitre(3e-4))),
        fresh(27.0, 0.3)
            .with_specific_conductance_us_cm(95.0)
            .unwrap()
            .with_activity_model(ActivityModel::ExtendedDebyeHuckel)
            .with_composition(calcium(Amount::PerKg(2e-4))),
    ]
}

/// The number behind the fixed ionic strength of a water, by its route.
fn input_of(w: &Water, route: IonicStrengthRoute) -> Option<f64> {
    let f = w.fresh_options();
    match route {
        IonicStrengthRoute::SpecificConductance => f.specific_conductance_us_cm,
        IonicStrengthRoute::Tds => f.tds_mg_l,
        IonicStrengthRoute::Given => f.ionic_strength,
        _ => None,
    }
}

/// The water with that number moved to `x`.
fn with_input(w: &Water, route: IonicStrengthRoute, x: f64) -> Water {
    let w = w.clone();
    match route {
        IonicStrengthRoute::SpecificConductance => w.with_specific_conductance_us_cm(x),
        IonicStrengthRoute::Tds => w.with_tds_mg_l(x),
        _ => w.with_ionic_strength(x),
    }
    .unwrap()
}

/// The basis on tangents, every source seeded.
fn seeded(w: &Water) -> FreshBasis<D> {
    let c = w.conditions();
    let route = crate::medium::fresh::ionic::route(w);
    let sources = FreshSources {
        temperature_c: D::source(c.temperature_c(), T),
        salinity: D::source(c.salinity(), S),
        fixed_ionic_input: input_of(w, route).map(|x| D::source(x, INPUT)),
        calcium_shift_mol_kg: Some(D::source(0.0, CA)),
    };
    FreshBasis::new_at(w, &sources, true).unwrap()
}

/// The numbers of a basis, in a fixed order, through `v`.
fn basis_numbers<R: Real>(b: &FreshBasis<R>) -> Vec<R> {
    let t = &b.totals;
    vec![
        b.at[0],
        b.at[1],
        b.at[2],
        b.dh_a,
        b.dh_b,
        b.kh,
        b.k1,
        b.k2,
        b.kw,
        b.kb,
        b.kp.0,
        b.kp.1,
        b.kp.2,
        b.ksi,
        b.ks,
        b.kf,
        b.knh4,
        b.kh2s,
        b.ksp_calcite,
        b.ksp_aragonite,
        b.k_cahco3,
        b.k_caco3,
        b.fugacity_factor,
        b.vapour_pressure_atm,
        b.density,
        b.fixed_i.unwrap_or(b.i_start),
        b.i_start,
        t.calcium_mol_kg,
        t.magnesium_mol_kg,
        t.sodium_mol_kg,
        t.sulfate_mol_kg,
        t.phosphate_mol_kg,
    ]
}

/// The numbers of apparent constants, in a fixed order.
fn constant_numbers<R: Real>(k: &Constants<R>) -> Vec<R> {
    vec![
        k.temperature_c(),
        k.salinity(),
        k.pressure_dbar(),
        k.k0(),
        k.k1(),
        k.k2(),
        k.kb(),
        k.kw(),
        k.kp1(),
        k.kp2(),
        k.kp3(),
        k.ksi(),
        k.knh4(),
        k.kh2s(),
        k.ks_free(),
        k.kf_free(),
        k.k1e(),
        k.k2e(),
        k.pair_hco3(),
        k.pair_co3(),
        k.calcium_free_mol_kg(),
        k.ionic_strength(),
        k.ksp_calcite(),
        k.ksp_aragonite(),
        k.free_per_working(),
        k.seawater_per_working(),
        k.total_per_working(),
        k.nbs_per_working(),
        k.fugacity_factor(),
        k.vapour_pressure_atm(),
        k.density_kg_m3(),
        k.k_cahco3(),
        k.k_caco3(),
    ]
}

/// A derivative `d` against the central difference `(up − down)/(2 step)`
/// of a function of value `f`: within 1e-7 of the derivative, or of
/// 1e-9·|f| per unit of the argument's scale where the derivative is near 0.
fn close(d: f64, up: f64, down: f64, step: f64, f: f64, scale: f64, what: &str) {
    let fd = (up - down) / (2.0 * step);
    let tol = 1e-7 * d.abs().max(fd.abs()) + 1e-9 * f.abs() / scale;
    assert!(
        (d - fd).abs() <= tol,
        "{what}: derivative {d:e}, central difference {fd:e} (tolerance {tol:e})"
    );
}

fn at_settled_state(b: &FreshBasis) -> (f64, f64) {
    // A starting ionic strength and a free calcium of 70 % of the total.
    let ca = b.totals.calcium_mol_kg;
    (b.fixed_i.unwrap_or(b.i_start), 0.7 * ca)
}

#[test]
fn the_basis_and_constants_on_tangents_have_the_f64_values_bit_for_bit() {
    let mut compared = 0;
    for w in waters() {
        for every in [false, true] {
            let f = FreshBasis::new(&w, every).unwrap();
            let g = seeded(&w);
            let g = if every {
                g
            } else {
                let c = w.conditions();
                let route = crate::medium::fresh::ionic::route(&w);
                let sources = FreshSources {
                    temperature_c: D::source(c.temperature_c(), T),
                    salinity: D::source(c.salinity(), S),
                    fixed_ionic_input: input_of(&w, route).map(|x| D::source(x, INPUT)),
                    calcium_shift_mol_kg: Some(D::source(0.0, CA)),
                };
                FreshBasis::new_at(&w, &sources, false).unwrap()
            };
            for (n, (a, b)) in basis_numbers(&f).iter().zip(basis_numbers(&g)).enumerate() {
                assert_eq!(a.to_bits(), b.v.to_bits(), "basis number {n} of {w:?}");
                compared += 1;
            }
            assert_eq!(f.fixed_i.is_some(), g.fixed_i.is_some());
            assert_eq!(f.warnings, g.warnings);
            let (i, ca) = at_settled_state(&f);
            let ca_t = f.totals.calcium_mol_kg;
            let kf = f.constants_at(i, ca, ca_t);
            let kg = g.constants_at(
                D::source(i, ARG),
                D::source(ca, ARG + 1),
                g.totals.calcium_mol_kg,
            );
            for (n, (a, b)) in constant_numbers(&kf)
                .iter()
                .zip(constant_numbers(&kg))
                .enumerate()
            {
                assert_eq!(a.to_bits(), b.v.to_bits(), "constant {n} of {w:?}");
                compared += 1;
            }
            let values = |g: Option<crate::properties::activity::Gammas<D>>| {
                g.map(|g| {
                    [
                        g.hydrogen,
                        g.monovalent,
                        g.carbonate,
                        g.calcium,
                        g.trivalent,
                    ]
                    .map(|x| x.v)
                })
            };
            let plain = kf.gammas().map(|g| {
                [
                    g.hydrogen,
                    g.monovalent,
                    g.carbonate,
                    g.calcium,
                    g.trivalent,
                ]
            });
            assert_eq!(plain, values(kg.gammas()));
            // The starting constants too.
            let (s1, s2) = (f.starting_constants(), g.starting_constants());
            for (a, b) in constant_numbers(&s1).iter().zip(constant_numbers(&s2)) {
                assert_eq!(a.to_bits(), b.v.to_bits());
            }
            assert_eq!(s1.warnings(), s2.warnings());
        }
    }
    assert!(compared > 500, "{compared}");
}

#[test]
fn basis_derivatives_agree_with_central_differences() {
    let mut checked = 0;
    for w in waters() {
        let g = seeded(&w);
        let numbers = basis_numbers(&g);
        let c = *w.conditions();
        let route = g.route;
        let numbers_of = |w: &Water| basis_numbers(&FreshBasis::new(w, true).unwrap());
        // Temperature, 1e-3 °C.
        let dt = 1e-3;
        let moved = |d: f64| w.at(c.with_temperature_c(c.temperature_c() + d).unwrap());
        let (up, down) = (
            numbers_of(&moved(dt).unwrap()),
            numbers_of(&moved(-dt).unwrap()),
        );
        for (n, x) in numbers.iter().enumerate() {
            close(
                x.d[T],
                up[n],
                down[n],
                dt,
                x.v,
                1.0,
                &format!("d/dT {n} {w:?}"),
            );
            checked += 1;
        }
        // Salinity, 1e-4.
        let ds = 1e-4;
        let moved = |d: f64| {
            let s = Conditions::new(c.temperature_c(), c.salinity() + d)
                .unwrap()
                .with_pressure_dbar(c.pressure_dbar())
                .unwrap();
            w.at(s).unwrap()
        };
        let (up, down) = (numbers_of(&moved(ds)), numbers_of(&moved(-ds)));
        for (n, x) in numbers.iter().enumerate() {
            close(
                x.d[S],
                up[n],
                down[n],
                ds,
                x.v,
                1.0,
                &format!("d/dS {n} {w:?}"),
            );
            checked += 1;
        }
        // The fixed ionic-strength input, 1e-5 of itself.
        if let Some(x0) = input_of(&w, route) {
            let dx = 1e-5 * x0;
            let (up, down) = (
                numbers_of(&with_input(&w, route, x0 + dx)),
                numbers_of(&with_input(&w, route, x0 - dx)),
            );
            for (n, x) in numbers.iter().enumerate() {
                close(
                    x.d[INPUT],
                    up[n],
                    down[n],
                    dx,
                    x.v,
                    x0,
                    &format!("d/dinput {n} {w:?}"),
                );
                checked += 1;
            }
            assert!(
                numbers[25].d[INPUT] != 0.0,
                "the fixed I moves with its input"
            );
        }
        // The calcium total as a per-kg total, as the propagation moves it.
        let ca0 = FreshBasis::new(&w, true).unwrap().totals.calcium_mol_kg;
        let dca = 1e-6 * ca0;
        let moved = |d: f64| {
            let comp = w
                .composition()
                .with_calcium(Amount::PerKg(ca0 + d))
                .unwrap();
            w.clone().with_composition(comp)
        };
        let (up, down) = (numbers_of(&moved(dca)), numbers_of(&moved(-dca)));
        for (n, x) in numbers.iter().enumerate() {
            close(
                x.d[CA],
                up[n],
                down[n],
                dca,
                x.v,
                ca0,
                &format!("d/dCa {n} {w:?}"),
            );
            checked += 1;
        }
        assert_eq!(numbers[27].d[CA], 1.0);
        // Temperature moves K1 and a per-litre calcium; salinity the density.
        assert!(numbers[6].d[T] != 0.0 && numbers[24].d[S] != 0.0);
    }
    assert!(checked > 700, "{checked}");
}

#[test]
fn constants_at_derivatives_agree_with_central_differences() {
    let mut checked = 0;
    for w in waters() {
        let f = FreshBasis::new(&w, true).unwrap();
        let g = FreshBasis::<D>::new_at(&w, &FreshSources::of(&w), true).unwrap();
        let (i, ca) = at_settled_state(&f);
        let ca_t = f.totals.calcium_mol_kg;
        let k = g.constants_at(D::source(i, ARG), D::source(ca, ARG + 1), D::constant(ca_t));
        let numbers = constant_numbers(&k);
        for (slot, x0) in [(ARG, i), (ARG + 1, ca)] {
            let dx = 1e-6 * x0;
            let at = |x: f64| {
                let k = if slot == ARG {
                    f.constants_at(x, ca, ca_t)
                } else {
                    f.constants_at(i, x, ca_t)
                };
                constant_numbers(&k)
            };
            let (up, down) = (at(x0 + dx), at(x0 - dx));
            for (n, x) in numbers.iter().enumerate() {
                close(
                    x.d[slot],
                    up[n],
                    down[n],
                    dx,
                    x.v,
                    x0,
                    &format!("slot {slot} {n} {w:?}"),
                );
                checked += 1;
            }
        }
        // I moves K1 through the activity coefficients; Ca the pair ratios.
        assert!(numbers[4].d[ARG] != 0.0 && numbers[18].d[ARG + 1] != 0.0);
    }
    assert!(checked > 400, "{checked}");
}

// A water's basis settled at pH and alkalinity (mol/kg), as the figures'
// tests settle theirs.
use super::fresh_figures::tests::settled_water as settled;

#[test]
fn ion_sum_and_free_calcium_derivatives_agree_with_central_differences() {
    use crate::medium::fresh::ionic::ion_sum;
    let mut checked = 0;
    let mut kinks = 0;
    for w in waters() {
        for (ph, ta) in [(6.8, 4e-4), (7.9, 2.2e-3), (9.1, 5e-3)] {
            let (b, k, h, dic) = settled(&w, ph, ta);
            let g = FreshBasis::<D>::new_at(&w, &FreshSources::of(&w), false).unwrap();
            let kd = g.constants_at(
                D::constant(k.ionic_strength()),
                D::constant(k.calcium_free_mol_kg()),
                g.totals.calcium_mol_kg,
            );
            let (hd, dd) = (D::source(h, ARG), D::source(dic, ARG + 1));
            let (i, bal) = ion_sum(&kd, hd, dd);
            let (i0, bal0) = ion_sum(&k, h, dic);
            assert_eq!(
                (i.v.to_bits(), bal.v.to_bits()),
                (i0.to_bits(), bal0.to_bits())
            );
            let ca_t = b.totals.calcium_mol_kg;
            let cad = D::source(ca_t, ARG); // reuse a slot: a separate evaluation
            let fc = free_calcium(&kd, hd, dd, D::constant(ca_t));
            let fc_t = free_calcium(&kd, D::constant(h), D::constant(dic), cad);
            assert_eq!(fc.v.to_bits(), free_calcium(&k, h, dic, ca_t).to_bits());
            for (slot, x0) in [(ARG, h), (ARG + 1, dic)] {
                let dx = 1e-6 * x0;
                let at = |x: f64| {
                    let (hh, dc) = if slot == ARG { (x, dic) } else { (h, x) };
                    let (i, bal) = ion_sum(&k, hh, dc);
                    (i, bal, free_calcium(&k, hh, dc, ca_t))
                };
                let (u, d) = (at(x0 + dx), at(x0 - dx));
                let what = format!("slot {slot} pH {ph} {w:?}");
                // |charge| has a kink where the ions balance exactly (a
                // water of calcium and carbonate alone at TA = 2 CaT): no
                // derivative there to compare with a central difference.
                if bal0.abs() > 1e-9 {
                    close(i.d[slot], u.0, d.0, dx, i.v, x0, &format!("I {what}"));
                }
                close(
                    bal.d[slot],
                    u.1,
                    d.1,
                    dx,
                    1.0,
                    x0,
                    &format!("balance {what}"),
                );
                close(
                    fc.d[slot],
                    u.2,
                    d.2,
                    dx,
                    fc.v,
                    x0,
                    &format!("free Ca {what}"),
                );
                checked += 3;
            }
            let dx = 1e-6 * ca_t;
            let (u, d) = (
                free_calcium(&k, h, dic, ca_t + dx),
                free_calcium(&k, h, dic, ca_t - dx),
            );
            close(
                fc_t.d[ARG],
                u,
                d,
                dx,
                fc_t.v,
                ca_t,
                &format!("free Ca by CaT {w:?}"),
            );
            assert!(i.d[ARG] != 0.0 && fc.d[ARG + 1] != 0.0);
            kinks += usize::from(bal0.abs() <= 1e-9);
            checked += 1;
        }
    }
    assert!(checked > 100 && kinks < 3, "{checked} {kinks}");
}

#[test]
fn saturation_ph_on_tangents_agrees_with_the_search_moved() {
    let mut checked = 0;
    let options = SolveOptions::default();
    for w in waters() {
        for (ph, ta) in [(7.2, 1.5e-3), (7.9, 2.2e-3), (8.4, 4e-3)] {
            let (b, k, h, dic) = settled(&w, ph, ta);
            let ca_t = b.totals.calcium_mol_kg;
            let ta = crate::speciation::alkalinity::parts(&k, h, dic).total();
            let Some(phs) = b.saturation_ph(&k, ta, -h.log10_via_ln(), None) else {
                continue;
            };
            // The residual on f64 is ln Ω at pHs, near 0, and its slope the f64 one.
            let (r, slope) = saturation_ph_residual(&k, ta, ca_t, phs).unwrap();
            let h_s = crate::base::numeric::pow10(-phs);
            assert_eq!(
                r.to_bits(),
                ln_omega_at_alkalinity(&k, ta, ca_t, h_s).unwrap().to_bits()
            );
            assert!(r.abs() < 1e-9 && slope > 0.0, "{r} {slope}");
            assert_eq!(saturation_ph_on(&k, ta, ca_t, phs), Some(phs));
            // The residual's derivatives by alkalinity and calcium.
            let (tad, cad) = (D::source(ta, ARG), D::source(ca_t, ARG + 1));
            let kd = FreshBasis::<D>::new_at(&w, &FreshSources::of(&w), false)
                .unwrap()
                .constants_at(
                    D::constant(k.ionic_strength()),
                    D::constant(k.calcium_free_mol_kg()),
                    D::constant(ca_t),
                );
            let (rd, sd) = saturation_ph_residual(&kd, tad, cad, phs).unwrap();
            assert_eq!(
                (rd.v.to_bits(), sd.to_bits()),
                (r.to_bits(), slope.to_bits())
            );
            let (dta, dca) = (1e-6 * ta, 1e-6 * ca_t);
            let f = |t: f64, c: f64| ln_omega_at_alkalinity(&k, t, c, h_s).unwrap();
            let what = format!("pH {ph} {w:?}");
            close(
                rd.d[ARG],
                f(ta + dta, ca_t),
                f(ta - dta, ca_t),
                dta,
                1.0,
                ta,
                &what,
            );
            close(
                rd.d[ARG + 1],
                f(ta, ca_t + dca),
                f(ta, ca_t - dca),
                dca,
                1.0,
                ca_t,
                &what,
            );
            // pHs by implicit differentiation against the search moved.
            let p = saturation_ph_on(&kd, tad, cad, phs).unwrap();
            let search = |t: f64, c: f64| {
                let mut b2 = b.clone();
                b2.totals.calcium_mol_kg = c;
                b2.saturation_ph(&k, t, ph, None).unwrap()
            };
            close(
                p.d[ARG],
                search(ta + dta, ca_t),
                search(ta - dta, ca_t),
                dta,
                1.0,
                ta,
                &what,
            );
            close(
                p.d[ARG + 1],
                search(ta, ca_t + dca),
                search(ta, ca_t - dca),
                dca,
                1.0,
                ca_t,
                &what,
            );
            assert!(
                p.d[ARG] < 0.0 && p.d[ARG + 1] < 0.0,
                "more alkalinity or calcium: lower pHs"
            );
            // Temperature through the constants, at the same I and free Ca.
            let g = seeded(&w);
            let kt = g.constants_at(
                D::constant(k.ionic_strength()),
                D::constant(k.calcium_free_mol_kg()),
                D::constant(ca_t),
            );
            let pt = saturation_ph_on(&kt, D::constant(ta), D::constant(ca_t), phs).unwrap();
            let dt = 1e-3;
            let c = *w.conditions();
            let at_t = |d: f64| {
                let moved = w.at(c.with_temperature_c(c.temperature_c() + d).unwrap());
                let mut bt = FreshBasis::new(&moved.unwrap(), false).unwrap();
                // The calcium held (a total per litre moves with the density).
                bt.totals.calcium_mol_kg = ca_t;
                let kt = bt.constants_at(k.ionic_strength(), k.calcium_free_mol_kg(), ca_t);
                bt.saturation_ph(&kt, ta, ph, None).unwrap()
            };
            close(
                pt.d[T],
                at_t(dt),
                at_t(-dt),
                dt,
                1.0,
                1.0,
                &format!("dpHs/dT {what}"),
            );
            assert!(pt.d[T] < 0.0, "calcite is less soluble warmer: lower pHs");
            // The figures on f64 are the f64 solve's, bit for bit.
            let mut warnings = crate::base::warning::Warnings::new();
            let e = b.fresh_figures(&k, h, dic, &options, &Near::default(), &mut warnings);
            assert_eq!(
                b.fresh_figures_on(&k, h, dic, &e, e.precipitation_potential_mg_l_caco3),
                e
            );
            checked += 6;
        }
    }
    assert!(checked > 60, "{checked}");
}

#[test]
fn a_constant_perturbed_on_tangents_keeps_the_f64_values_and_moves_by_ln_10() {
    use crate::medium::ConstantName as C;
    let mut checked = 0;
    for w in waters() {
        let f = FreshBasis::new(&w, true).unwrap();
        let g = FreshBasis::<D>::new_at(&w, &FreshSources::of(&w), true).unwrap();
        for which in [
            C::K1,
            C::K2,
            C::Kw,
            C::KspCalcite,
            C::CaHco3Pair,
            C::CaCo3Pair,
        ] {
            let delta = 0.01;
            let pf = f.clone().with_pk(which, delta).unwrap();
            let mut pg = g.clone();
            pg.copy_numbers_from(&g);
            pg.pk_in_place(which, D::source(delta, ARG)).unwrap();
            let (nf, ng) = (basis_numbers(&pf), basis_numbers(&pg));
            for (n, (a, b)) in nf.iter().zip(&ng).enumerate() {
                assert_eq!(a.to_bits(), b.v.to_bits(), "{which:?} number {n} {w:?}");
            }
            // Each number against the central difference in the pK step.
            let dd = 1e-6;
            let at = |d: f64| basis_numbers(&f.clone().with_pk(which, d).unwrap());
            let (up, down) = (at(delta + dd), at(delta - dd));
            for (n, x) in ng.iter().enumerate() {
                close(
                    x.d[ARG],
                    up[n],
                    down[n],
                    dd,
                    x.v,
                    1.0,
                    &format!("{which:?} {n} {w:?}"),
                );
                checked += 1;
            }
        }
        // A step that is not finite is refused on tangents too.
        let mut pg = g.clone();
        assert!(pg.pk_in_place(C::K1, D::constant(f64::NAN)).is_err());
    }
    assert!(checked > 1000, "{checked}");
}
