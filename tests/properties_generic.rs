//! The properties and the totals made generic over `Real` (forward-mode
//! derivatives) against the plain `f64` formulas they replaced.
//!
//! For every converted function, on a grid of inputs:
//! 1. the `f64` path gives the same bits as the formula as it was written
//!    before the change (kept here as `old_*`, operation for operation);
//! 2. the `Tangent` path gives the same value, bit for bit;
//! 3. each derivative of the `Tangent` path agrees with a central
//!    difference of the `f64` path.
//!
//! Central differences take the step h = 1e-5 |x| (1e-5 at x = 0;
//! one-sided, second order, within a step of a bound of the domain). Their
//! truncation error is about h² |f'''| / 6, relative 1e-10 or less for
//! these smooth functions, and their rounding error about ε |f| / h, i.e.
//! 2e-11 |f| / |x|; a derivative must agree within 1e-7 relative, or
//! 1e-9 |f| / |x| absolute where it is near zero.

use travertine::base::numeric::{Real, Tangent};
use travertine::base::units::Amount;
use travertine::fits::{fluoride, minerals, sulfate, BoronTotalFit};
use travertine::properties::activity::{
    davies_gamma, debye_huckel_a, debye_huckel_b, dielectric_constant, extended_debye_huckel_gamma,
    ion_size, ActivityModel, Gammas,
};
use travertine::properties::atmosphere::standard_pressure_kpa;
use travertine::properties::conductivity::{
    langelier1936_ionic_strength, russell1976_ionic_strength, specific_conductance_us_cm,
};
use travertine::properties::density::{density_kg_m3, pressure_dbar_at_depth};
use travertine::properties::scales::takahashi1982_fh;
use travertine::sample::Composition;

type T = Tangent<3>;

/// Up to three arguments: the f64 path, the formula before the change,
/// and the Tangent path.
struct Case<'a> {
    name: &'a str,
    /// Arguments taken as sources (the rest of the 3 are ignored).
    k: usize,
    /// Bounds of each argument's domain (a one-sided difference is taken
    /// within a step of them).
    lower: [f64; 3],
    upper: [f64; 3],
    new: &'a dyn Fn([f64; 3]) -> f64,
    old: &'a dyn Fn([f64; 3]) -> f64,
    tangent: &'a dyn Fn([T; 3]) -> T,
}

fn sources(x: [f64; 3]) -> [T; 3] {
    [T::source(x[0], 0), T::source(x[1], 1), T::source(x[2], 2)]
}

fn check(case: &Case, grid: &[[f64; 3]]) -> usize {
    let mut checked = 0;
    for &x in grid {
        let f = (case.new)(x);
        let old = (case.old)(x);
        assert_eq!(
            f.to_bits(),
            old.to_bits(),
            "{}: f64 path {f} against the formula before the change {old} at {x:?}",
            case.name
        );
        let t = (case.tangent)(sources(x));
        assert_eq!(
            t.value().to_bits(),
            f.to_bits(),
            "{}: tangent value {} against f64 {f} at {x:?}",
            case.name,
            t.value()
        );
        for j in 0..case.k {
            let scale = if x[j] == 0.0 { 1.0 } else { x[j].abs() };
            let h = 1e-5 * scale;
            let at = |dx: f64| {
                let mut y = x;
                y[j] += dx;
                (case.new)(y)
            };
            let cd = if x[j] - h < case.lower[j] {
                (-3.0 * f + 4.0 * at(h) - at(2.0 * h)) / (2.0 * h)
            } else if x[j] + h > case.upper[j] {
                (3.0 * f - 4.0 * at(-h) + at(-2.0 * h)) / (2.0 * h)
            } else {
                (at(h) - at(-h)) / (2.0 * h)
            };
            let d = t.d[j];
            assert!(
                d.is_finite() && (d - cd).abs() <= 1e-7 * cd.abs() + 1e-9 * f.abs() / scale,
                "{}: d/dx{j} {d} against central difference {cd} at {x:?}",
                case.name
            );
            checked += 1;
        }
        // Sources beyond k are not arguments: their derivatives are zero.
        for j in case.k..3 {
            assert_eq!(t.d[j], 0.0, "{}: d/dx{j} at {x:?}", case.name);
        }
    }
    assert!(checked > 0, "{}: nothing checked", case.name);
    checked
}

fn grid1(a: &[f64]) -> Vec<[f64; 3]> {
    a.iter().map(|&x| [x, 0.0, 0.0]).collect()
}

fn grid2(a: &[f64], b: &[f64]) -> Vec<[f64; 3]> {
    a.iter()
        .flat_map(|&x| b.iter().map(move |&y| [x, y, 0.0]))
        .collect()
}

fn grid3(a: &[f64], b: &[f64], c: &[f64]) -> Vec<[f64; 3]> {
    grid2(a, b)
        .into_iter()
        .flat_map(|[x, y, _]| c.iter().map(move |&z| [x, y, z]))
        .collect()
}

const TEMPERATURES_C: [f64; 6] = [0.0, 4.0, 12.5, 25.0, 33.3, 40.0];
const RHO_W: [f64; 3] = [0.9922, 0.99705, 0.99984];
const STRENGTHS: [f64; 5] = [1e-5, 1e-3, 0.01, 0.1, 0.5];
const SALINITIES: [f64; 7] = [0.0, 0.05, 0.5, 5.0, 20.0, 35.0, 42.0];

// ----- the formulas as they were written before the change (f64) -----

fn old_dielectric(t: f64) -> f64 {
    87.740 - 0.40008 * t + 9.398e-4 * t * t - 1.410e-6 * t * t * t
}
fn old_a(t: f64, rho: f64) -> f64 {
    let et = old_dielectric(t) * (t + 273.15);
    1.82483e6 * rho.sqrt() * et.powf(-1.5)
}
fn old_b(t: f64, rho: f64) -> f64 {
    let et = old_dielectric(t) * (t + 273.15);
    50.2916 * rho.sqrt() * et.powf(-0.5)
}
fn old_pow10(x: f64) -> f64 {
    (x * std::f64::consts::LN_10).exp()
}
fn old_davies(a: f64, z: f64, i: f64) -> f64 {
    let ri = i.sqrt();
    old_pow10(-a * z * z * (ri / (1.0 + ri) - 0.3 * i))
}
fn old_edh(a: f64, b: f64, z: f64, size: f64, i: f64) -> f64 {
    let ri = i.sqrt();
    10f64.powf(-a * z * z * ri / (1.0 + b * size * ri))
}
/// `Gammas::new` before the change, field by field in the order of
/// `Gammas` (hydrogen, monovalent, carbonate, calcium, trivalent).
fn old_gammas(model: ActivityModel, t: f64, rho: f64, i: f64) -> [f64; 5] {
    let (a, b) = (old_a(t, rho), old_b(t, rho));
    match model {
        ActivityModel::Davies => {
            let g1 = old_davies(a, 1.0, i);
            let g2 = (g1 * g1) * (g1 * g1);
            [g1, g1, g2, g2, g2 * g2 * g1]
        }
        _ => [
            old_edh(a, b, 1.0, ion_size::H, i),
            old_edh(a, b, 1.0, ion_size::HCO3, i),
            old_edh(a, b, 2.0, ion_size::CO3, i),
            old_edh(a, b, 2.0, ion_size::CA, i),
            old_edh(a, b, 3.0, ion_size::PO4, i),
        ],
    }
}
fn old_density(s: f64, t: f64) -> f64 {
    let rho_w = 999.842594
        + t * (6.793952e-2
            + t * (-9.095290e-3 + t * (1.001685e-4 + t * (-1.120083e-6 + t * 6.536332e-9))));
    let a = 8.24493e-1 + t * (-4.0899e-3 + t * (7.6438e-5 + t * (-8.2467e-7 + t * 5.3875e-9)));
    let b = -5.72466e-3 + t * (1.0227e-4 - t * 1.6546e-6);
    let c = 4.8314e-4;
    rho_w + a * s + b * s * s.sqrt() + c * s * s
}
fn old_pressure(z: f64, s: f64, t: f64) -> f64 {
    old_density(s, t) * 9.80665 * z / 1e4
}
fn old_fh(t: f64, s: f64) -> f64 {
    1.2948 - 0.002036 * t + (0.0004607 - 0.000001475 * t) * s * s
}
fn old_spc(c: f64, t: f64) -> f64 {
    c / (1.0 + 0.0191 * (t - 25.0))
}
fn old_standard_pressure(h: f64) -> f64 {
    let n = 9.806_65 * 0.028_964_4 / (8.314_32 * 0.0065);
    101.325 * (1.0 - 0.0065 * h / 288.15).powf(n)
}

fn c(x: f64) -> T {
    T::constant(x)
}

#[test]
fn activity() {
    let t = grid1(&TEMPERATURES_C);
    let mut n = check(
        &Case {
            name: "dielectric_constant",
            k: 1,
            lower: [f64::MIN; 3],
            upper: [f64::MAX; 3],
            new: &|x| dielectric_constant(x[0]),
            old: &|x| old_dielectric(x[0]),
            tangent: &|x| dielectric_constant(x[0]),
        },
        &t,
    );
    let t_rho = grid2(&TEMPERATURES_C, &RHO_W);
    n += check(
        &Case {
            name: "debye_huckel_a",
            k: 2,
            lower: [f64::MIN; 3],
            upper: [f64::MAX; 3],
            new: &|x| debye_huckel_a(x[0], x[1]),
            old: &|x| old_a(x[0], x[1]),
            tangent: &|x| debye_huckel_a(x[0], x[1]),
        },
        &t_rho,
    );
    n += check(
        &Case {
            name: "debye_huckel_b",
            k: 2,
            lower: [f64::MIN; 3],
            upper: [f64::MAX; 3],
            new: &|x| debye_huckel_b(x[0], x[1]),
            old: &|x| old_b(x[0], x[1]),
            tangent: &|x| debye_huckel_b(x[0], x[1]),
        },
        &t_rho,
    );
    let a_i = grid2(&[0.49, 0.5108, 0.53], &STRENGTHS);
    for z in [1.0, 2.0, 3.0] {
        n += check(
            &Case {
                name: &format!("davies_gamma z {z}"),
                k: 2,
                lower: [0.0; 3],
                upper: [f64::MAX; 3],
                new: &|x| davies_gamma(x[0], z, x[1]),
                old: &|x| old_davies(x[0], z, x[1]),
                tangent: &|x| davies_gamma(x[0], z, x[1]),
            },
            &a_i,
        );
    }
    let a_b_i = grid3(&[0.49, 0.5108, 0.53], &[0.325, 0.3287, 0.333], &STRENGTHS);
    for (z, size) in [
        (1.0, ion_size::H),
        (2.0, ion_size::CA),
        (3.0, ion_size::PO4),
    ] {
        n += check(
            &Case {
                name: &format!("extended_debye_huckel_gamma z {z}"),
                k: 3,
                lower: [0.0; 3],
                upper: [f64::MAX; 3],
                new: &|x| extended_debye_huckel_gamma(x[0], x[1], z, size, x[2]),
                old: &|x| old_edh(x[0], x[1], z, size, x[2]),
                tangent: &|x| extended_debye_huckel_gamma(x[0], x[1], z, size, x[2]),
            },
            &a_b_i,
        );
    }
    let t_rho_i = grid3(&TEMPERATURES_C, &RHO_W, &STRENGTHS);
    for model in [ActivityModel::Davies, ActivityModel::ExtendedDebyeHuckel] {
        for (f, field) in [
            "hydrogen",
            "monovalent",
            "carbonate",
            "calcium",
            "trivalent",
        ]
        .into_iter()
        .enumerate()
        {
            fn pick<R: Real>(g: Gammas<R>, f: usize) -> R {
                [
                    g.hydrogen,
                    g.monovalent,
                    g.carbonate,
                    g.calcium,
                    g.trivalent,
                ][f]
            }
            n += check(
                &Case {
                    name: &format!("Gammas::new {model} {field}"),
                    k: 3,
                    lower: [f64::MIN, f64::MIN, 0.0],
                    upper: [f64::MAX; 3],
                    new: &|x| pick(Gammas::new(model, x[0], x[1], x[2]), f),
                    old: &|x| old_gammas(model, x[0], x[1], x[2])[f],
                    tangent: &|x| pick(Gammas::new(model, x[0], x[1], x[2]), f),
                },
                &t_rho_i,
            );
            // from_coefficients with tangent A, B and I.
            n += check(
                &Case {
                    name: &format!("Gammas::from_coefficients {model} {field}"),
                    k: 3,
                    lower: [0.0; 3],
                    upper: [f64::MAX; 3],
                    new: &|x| pick(Gammas::from_coefficients(model, x[0], x[1], x[2]), f),
                    old: &|x| match model {
                        ActivityModel::Davies => {
                            let g1 = old_davies(x[0], 1.0, x[2]);
                            let g2 = (g1 * g1) * (g1 * g1);
                            [g1, g1, g2, g2, g2 * g2 * g1][f]
                        }
                        _ => {
                            let (z, size) = [
                                (1.0, ion_size::H),
                                (1.0, ion_size::HCO3),
                                (2.0, ion_size::CO3),
                                (2.0, ion_size::CA),
                                (3.0, ion_size::PO4),
                            ][f];
                            old_edh(x[0], x[1], z, size, x[2])
                        }
                    },
                    tangent: &|x| pick(Gammas::from_coefficients(model, x[0], x[1], x[2]), f),
                },
                &a_b_i,
            );
        }
    }
    assert!(n > 1000, "{n} derivatives checked");
}

/// At I = 0 the values are still those of f64, and a temperature source
/// gets a finite derivative (√I of a constant 0 has slope ∞, but I does
/// not move).
#[test]
fn gammas_at_zero_ionic_strength() {
    for model in [ActivityModel::Davies, ActivityModel::ExtendedDebyeHuckel] {
        let f = Gammas::new(model, 25.0, 0.99705, 0.0);
        let t = Gammas::new(model, T::source(25.0, 0), c(0.99705), c(0.0));
        assert_eq!(t.calcium.value().to_bits(), f.calcium.to_bits());
        assert_eq!(f.calcium, 1.0);
        assert_eq!(t.calcium.d, [0.0; 3], "{model}");
    }
}

#[test]
fn density_and_depth() {
    // At S = 0 the S^1.5 term makes a one-sided difference in S wrong by
    // O(√h); there dρ/dS is checked against its closed form below.
    let s_t = grid2(&SALINITIES[1..], &TEMPERATURES_C);
    let mut n = check(
        &Case {
            name: "density_kg_m3",
            k: 2,
            lower: [0.0, f64::MIN, 0.0],
            upper: [f64::MAX; 3],
            new: &|x| density_kg_m3(x[0], x[1]).unwrap(),
            old: &|x| old_density(x[0], x[1]),
            tangent: &|x| density_kg_m3(x[0], x[1]).unwrap(),
        },
        &s_t,
    );
    let z_s_t = grid3(
        &[0.0, 0.5, 20.0, 250.0, 4000.0],
        &SALINITIES[1..],
        &[2.0, 8.5, 25.0],
    );
    n += check(
        &Case {
            name: "pressure_dbar_at_depth",
            k: 3,
            lower: [0.0, 0.0, f64::MIN],
            upper: [f64::MAX; 3],
            new: &|x| pressure_dbar_at_depth(x[0], x[1], x[2]).unwrap(),
            old: &|x| old_pressure(x[0], x[1], x[2]),
            tangent: &|x| pressure_dbar_at_depth(x[0], x[1], x[2]).unwrap(),
        },
        &z_s_t,
    );
    // S = 0: temperature and depth by central differences, and dρ/dS is the
    // coefficient A(t) of the equation of state (Millero & Poisson 1981),
    // since the S^1.5 and S² terms have zero slope there.
    n += check(
        &Case {
            name: "density_kg_m3 at S 0",
            k: 1,
            lower: [f64::MIN; 3],
            upper: [f64::MAX; 3],
            new: &|x| density_kg_m3(0.0, x[0]).unwrap(),
            old: &|x| old_density(0.0, x[0]),
            tangent: &|x| density_kg_m3(c(0.0), x[0]).unwrap(),
        },
        &grid1(&TEMPERATURES_C),
    );
    n += check(
        &Case {
            name: "pressure_dbar_at_depth at S 0",
            k: 2,
            lower: [0.0, f64::MIN, 0.0],
            upper: [f64::MAX; 3],
            new: &|x| pressure_dbar_at_depth(x[0], 0.0, x[1]).unwrap(),
            old: &|x| old_pressure(x[0], 0.0, x[1]),
            tangent: &|x| pressure_dbar_at_depth(x[0], c(0.0), x[1]).unwrap(),
        },
        &grid2(&[0.0, 0.5, 20.0, 250.0], &TEMPERATURES_C),
    );
    for t in TEMPERATURES_C {
        let a = 8.24493e-1 + t * (-4.0899e-3 + t * (7.6438e-5 + t * (-8.2467e-7 + t * 5.3875e-9)));
        let r = density_kg_m3(T::source(0.0, 0), c(t)).unwrap();
        assert_eq!(r.value().to_bits(), old_density(0.0, t).to_bits());
        assert!(
            (r.d[0] - a).abs() <= 1e-15,
            "dρ/dS at S 0, {t} °C: {} against A {a}",
            r.d[0]
        );
    }
    assert!(n > 100);
    // Fresh water: salinity a constant 0, temperature a source.
    let r = density_kg_m3(c(0.0), T::source(10.0, 0)).unwrap();
    assert!(r.d[0].is_finite() && r.d[0] < 0.0);
    // The errors are those of f64, judged on the value.
    assert!(density_kg_m3(c(35.0), c(f64::NAN)).is_err());
    assert!(density_kg_m3(T::source(400.0, 0), c(25.0)).is_err());
    assert!(pressure_dbar_at_depth(T::source(-1.0, 0), c(0.0), c(10.0)).is_err());
}

#[test]
fn scales_conductivity_atmosphere() {
    let mut n = check(
        &Case {
            name: "takahashi1982_fh",
            k: 2,
            lower: [f64::MIN; 3],
            upper: [f64::MAX; 3],
            new: &|x| takahashi1982_fh(x[0], x[1]),
            old: &|x| old_fh(x[0], x[1]),
            tangent: &|x| takahashi1982_fh(x[0], x[1]),
        },
        &grid2(&[275.15, 288.15, 298.15, 308.15], &[20.0, 30.0, 35.0, 40.0]),
    );
    n += check(
        &Case {
            name: "specific_conductance_us_cm",
            k: 2,
            lower: [0.0, 0.0, 0.0],
            upper: [100_000.0, 50.0, f64::MAX],
            new: &|x| specific_conductance_us_cm(x[0], x[1]).unwrap(),
            old: &|x| old_spc(x[0], x[1]),
            tangent: &|x| specific_conductance_us_cm(x[0], x[1]).unwrap(),
        },
        &grid2(
            &[0.0, 35.0, 415.0, 5200.0, 52000.0],
            &[0.0, 8.0, 25.0, 37.5, 50.0],
        ),
    );
    n += check(
        &Case {
            name: "russell1976_ionic_strength",
            k: 1,
            lower: [0.0; 3],
            upper: [f64::MAX; 3],
            new: &|x| russell1976_ionic_strength(x[0]),
            old: &|x| 1.6e-5 * x[0],
            tangent: &|x| russell1976_ionic_strength(x[0]),
        },
        &grid1(&[0.0, 60.0, 415.0, 3000.0]),
    );
    n += check(
        &Case {
            name: "langelier1936_ionic_strength",
            k: 1,
            lower: [0.0; 3],
            upper: [f64::MAX; 3],
            new: &|x| langelier1936_ionic_strength(x[0]),
            old: &|x| 2.5e-5 * x[0],
            tangent: &|x| langelier1936_ionic_strength(x[0]),
        },
        &grid1(&[0.0, 40.0, 400.0, 2500.0]),
    );
    n += check(
        &Case {
            name: "standard_pressure_kpa",
            k: 1,
            lower: [f64::MIN; 3],
            upper: [f64::MAX; 3],
            new: &|x| standard_pressure_kpa(x[0]),
            old: &|x| old_standard_pressure(x[0]),
            tangent: &|x| standard_pressure_kpa(x[0]),
        },
        &grid1(&[-500.0, 0.0, 240.0, 1000.0, 4500.0, 7000.0]),
    );
    assert!(n > 40);
    assert!(specific_conductance_us_cm(T::source(-1.0, 0), c(20.0)).is_err());
    assert!(specific_conductance_us_cm(c(100.0), T::source(55.0, 0)).is_err());
}

fn composition() -> Composition {
    Composition::default()
        .with_calcium(Amount::PerLitre(1.2e-3))
        .and_then(|c| c.with_magnesium(Amount::PerKg(3e-4)))
        .and_then(|c| c.with_sodium(Amount::PerLitre(5e-4)))
        .and_then(|c| c.with_chloride(Amount::PerLitre(6e-4)))
        .and_then(|c| c.with_phosphate(Amount::PerLitre(2e-6)))
        .and_then(|c| c.with_ammonia(Amount::PerKg(1e-5)))
        .and_then(|c| c.with_unassigned_hardness(Amount::PerLitre(2e-4)))
        .expect("valid amounts")
}

/// Every field of `Totals`, in declaration order.
fn fields<R: Real>(t: &travertine::sample::Totals<R>) -> [R; 13] {
    [
        t.boron_mol_kg,
        t.sulfate_mol_kg,
        t.fluoride_mol_kg,
        t.phosphate_mol_kg,
        t.silicate_mol_kg,
        t.ammonia_mol_kg,
        t.sulfide_mol_kg,
        t.calcium_mol_kg,
        t.magnesium_mol_kg,
        t.sodium_mol_kg,
        t.potassium_mol_kg,
        t.chloride_mol_kg,
        t.hardness_mol_kg,
    ]
}

#[test]
fn fresh_totals() {
    let given = composition();
    let amounts: [Option<Amount>; 13] = [
        None,
        None,
        None,
        Some(Amount::PerLitre(2e-6)),
        None,
        Some(Amount::PerKg(1e-5)),
        None,
        Some(Amount::PerLitre(1.2e-3)),
        Some(Amount::PerKg(3e-4)),
        Some(Amount::PerLitre(5e-4)),
        None,
        Some(Amount::PerLitre(6e-4)),
        Some(Amount::PerLitre(2e-4)),
    ];
    let mut n = 0;
    for (f, amount) in amounts.into_iter().enumerate() {
        n += check(
            &Case {
                name: &format!("fresh_totals field {f}"),
                k: 1,
                lower: [0.0; 3],
                upper: [f64::MAX; 3],
                new: &|x| fields(&given.fresh_totals(x[0]))[f],
                old: &|x| amount.map_or(0.0, |a| a.mol_kg(x[0])),
                tangent: &|x| fields(&given.fresh_totals(x[0]))[f],
            },
            &grid1(&[995.0, 998.2, 999.97, 1000.0]),
        );
    }
    assert_eq!(n, 52);
}

#[test]
fn saline_totals() {
    let given = Composition::default()
        .with_calcium(Amount::PerLitre(1.0e-2))
        .and_then(|c| c.with_phosphate(Amount::PerLitre(2e-6)))
        .and_then(|c| c.with_silicate(Amount::PerKg(4e-5)))
        .expect("valid amounts");
    let plain = Composition::default();
    for boron in BoronTotalFit::ALL {
        for s in [5.0, 20.0, 35.0, 40.0] {
            for comp in [&given, &plain] {
                let old = |rho: f64| {
                    let get = |a: Option<Amount>, d: f64| a.map_or(d, |a| a.mol_kg(rho));
                    let is = comp == &given;
                    [
                        boron.total_mol_kg(s),
                        sulfate::morris_riley1966_total_mol_kg(s),
                        fluoride::riley1965_total_mol_kg(s),
                        get(is.then_some(Amount::PerLitre(2e-6)), 0.0),
                        get(is.then_some(Amount::PerKg(4e-5)), 0.0),
                        0.0,
                        0.0,
                        get(
                            is.then_some(Amount::PerLitre(1.0e-2)),
                            minerals::riley_tongudai1967_calcium_mol_kg(s),
                        ),
                        0.0,
                        0.0,
                        0.0,
                        0.0,
                        0.0,
                    ]
                };
                for f in 0..13 {
                    check(
                        &Case {
                            name: &format!("saline_totals {boron:?} S {s} field {f}"),
                            k: 1,
                            lower: [0.0; 3],
                            upper: [f64::MAX; 3],
                            new: &|x| fields(&comp.saline_totals(s, x[0], boron))[f],
                            old: &|x| old(x[0])[f],
                            tangent: &|x| {
                                fields(&comp.saline_totals(Tangent::constant(s), x[0], boron))[f]
                            },
                        },
                        &grid1(&[1003.0, 1023.3, 1031.0]),
                    );
                }
            }
        }
    }
}

/// The companion of `salinity_from_conductivity` that carries derivatives:
/// its value is the f64 result bit for bit (and on f64 it is that result),
/// and its derivatives, themselves central differences of gsw with the
/// step 1e-5 max(|x|, X), agree with central differences taken here with a
/// step a hundred times larger (truncation about 1e-6 relative), within
/// 1e-5 relative. This checks the chain rule's wiring (which source, sign
/// and scale), not gsw.
#[test]
fn salinity_from_conductivity_with_derivatives() {
    use travertine::properties::conductivity::{
        salinity_from_conductivity, salinity_from_conductivity_generic,
    };
    let f = |x: [f64; 3]| {
        salinity_from_conductivity(x[0], x[1], x[2]).unwrap_or_else(|e| panic!("{x:?}: {e}"))
    };
    let mut n = 0;
    for cond in [0.0, 60.0, 415.0, 5200.0, 42914.0, 99_000.0] {
        for t in [0.0, 15.0, 25.0, 35.0] {
            for p in [0.0, 100.0, 1000.0] {
                let x = [cond, t, p];
                let Ok(s) = salinity_from_conductivity(cond, t, p) else {
                    // gsw refuses some zero conductivities (a rounded
                    // salinity below 0): so does the companion.
                    assert!(
                        salinity_from_conductivity_generic(T::source(cond, 0), c(t), c(p)).is_err()
                    );
                    assert_eq!(cond, 0.0, "{x:?}");
                    continue;
                };
                assert_eq!(
                    salinity_from_conductivity_generic(cond, t, p)
                        .unwrap()
                        .to_bits(),
                    s.to_bits()
                );
                let r = salinity_from_conductivity_generic(
                    T::source(cond, 0),
                    T::source(t, 1),
                    T::source(p, 2),
                )
                .unwrap();
                assert_eq!(r.value().to_bits(), s.to_bits(), "{x:?}");
                if cond == 0.0 {
                    // PSS-78's low-salinity terms go as √Rt: no finite
                    // slope, and gsw refuses the points just above 0.
                    assert!(r.d[0].is_nan(), "{x:?}");
                    // S is 0 to rounding whatever t and p.
                    assert!(r.d[1].abs() < 1e-12 && r.d[2].abs() < 1e-12, "{x:?}: {r:?}");
                    continue;
                }
                for j in 0..3 {
                    let h = 1e-3 * x[j].abs().max([1.0, 1.0, 100.0][j]);
                    let at = |dx: f64| {
                        let mut y = x;
                        y[j] += dx;
                        f(y)
                    };
                    let cd = if x[j] - h < 0.0 {
                        (-3.0 * s + 4.0 * at(h) - at(2.0 * h)) / (2.0 * h)
                    } else {
                        (at(h) - at(-h)) / (2.0 * h)
                    };
                    assert!(
                        (r.d[j] - cd).abs() <= 1e-5 * cd.abs() + 1e-12,
                        "dS/dx{j} {} against {cd} at {x:?}",
                        r.d[j]
                    );
                    n += 1;
                }
            }
        }
    }
    assert_eq!(n, 5 * 4 * 3 * 3);
}
