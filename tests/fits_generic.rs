//! The fits of `travertine::fits`, written once over `Real`, give on a
//! `Tangent` the same value as on `f64`, bit for bit, and derivatives that
//! agree with central differences of the `f64` path.
//!
//! Each fit is evaluated on a grid over and beyond the published ranges:
//! temperature −2 to 45 °C, salinity 0 to 45, gauge pressure 0 to 500 bar,
//! wind 0 to 20 m/s. The four are the sources of a `Tangent<4>`
//! (temperature in °C; a fit of temperature in kelvin is given
//! `t + 273.15`, whose derivative is the same).

use travertine::base::numeric::{Real, Tangent};
use travertine::fits::transfer::{self, GasTransfer};
use travertine::fits::{
    ammonia, boron, carbonic, fluoride, gas, kw, minerals, nutrients, pressure, sulfate, sulfide,
    thermodynamic, BoronTotalFit, CarbonicFit, FluorideFit,
};

type T4 = Tangent<4>;
type Plain = fn(f64, f64, f64, f64) -> Vec<f64>;
type Carried = fn(T4, T4, T4, T4) -> Vec<T4>;

struct Case {
    name: &'static str,
    plain: Plain,
    carried: Carried,
}

/// One fit: a generic function of (t °C, S, P bar, wind m/s) returning its
/// outputs, taken at `f64` and at `Tangent<4>`.
macro_rules! case {
    ($name:expr, |$t:ident, $s:ident, $p:ident, $u:ident| $body:expr) => {{
        #[allow(unused_variables)]
        fn f<R: Real>($t: R, $s: R, $p: R, $u: R) -> Vec<R> {
            $body
        }
        Case {
            name: $name,
            plain: f::<f64>,
            carried: f::<T4>,
        }
    }};
}

fn kelvin<R: Real>(t: R) -> R {
    t + 273.15
}

fn cases() -> Vec<Case> {
    vec![
        case!("lueker2000_pk1_pk2", |t, s, p, u| {
            let (a, b) = carbonic::lueker2000_pk1_pk2(kelvin(t), s);
            vec![a, b]
        }),
        case!("millero2006_pk1_pk2", |t, s, p, u| {
            let (a, b) = carbonic::millero2006_pk1_pk2(kelvin(t), s);
            vec![a, b]
        }),
        case!("roy1993_ln_k1_k2", |t, s, p, u| {
            let (a, b) = carbonic::roy1993_ln_k1_k2(kelvin(t), s);
            vec![a, b]
        }),
        case!("dickson_millero1987_pk1_pk2", |t, s, p, u| {
            let (a, b) = carbonic::dickson_millero1987_pk1_pk2(kelvin(t), s);
            vec![a, b]
        }),
        case!("CarbonicFit::k1_k2", |t, s, p, u| {
            CarbonicFit::ALL
                .iter()
                .flat_map(|f| {
                    let (a, b) = f.k1_k2(kelvin(t), s);
                    [a, b]
                })
                .collect()
        }),
        case!("dickson1990_ln_kb", |t, s, p, u| vec![
            boron::dickson1990_ln_kb(kelvin(t), s)
        ]),
        case!("BoronTotalFit::total_mol_kg", |t, s, p, u| {
            BoronTotalFit::ALL
                .iter()
                .map(|f| f.total_mol_kg(s))
                .collect()
        }),
        case!("FluorideFit::kf", |t, s, p, u| {
            FluorideFit::ALL
                .iter()
                .map(|f| f.kf(kelvin(t), s))
                .collect()
        }),
        case!("riley1965_total_mol_kg", |t, s, p, u| vec![
            fluoride::riley1965_total_mol_kg(s)
        ]),
        case!("seawater_ionic_strength", |t, s, p, u| vec![
            sulfate::seawater_ionic_strength(s)
        ]),
        case!("dickson1990_ln_ks", |t, s, p, u| vec![
            sulfate::dickson1990_ln_ks(kelvin(t), s)
        ]),
        case!("morris_riley1966_total_mol_kg", |t, s, p, u| vec![
            sulfate::morris_riley1966_total_mol_kg(s)
        ]),
        case!("johansson_wedborg1980_pka", |t, s, p, u| vec![
            ammonia::johansson_wedborg1980_pka(kelvin(t), s)
        ]),
        case!("millero1995_ln_kw", |t, s, p, u| vec![
            kw::millero1995_ln_kw(kelvin(t), s)
        ]),
        case!("mucci1983_log_ksp", |t, s, p, u| {
            let (a, b) = minerals::mucci1983_log_ksp(kelvin(t), s);
            vec![a, b]
        }),
        case!("riley_tongudai1967_calcium_mol_kg", |t, s, p, u| vec![
            minerals::riley_tongudai1967_calcium_mol_kg(s)
        ]),
        case!("millero1995_ln_kp", |t, s, p, u| {
            let (a, b, c) = nutrients::millero1995_ln_kp(kelvin(t), s);
            vec![a, b, c]
        }),
        case!("millero1995_ln_ksi", |t, s, p, u| vec![
            nutrients::millero1995_ln_ksi(kelvin(t), s)
        ]),
        case!("millero1988_pk1", |t, s, p, u| vec![
            sulfide::millero1988_pk1(kelvin(t), s)
        ]),
        case!("pressure_factor and pressure_ln_factor", |t, s, p, u| {
            PRESSURE
                .iter()
                .flat_map(|c| {
                    [
                        pressure::pressure_factor(c, t, p),
                        pressure::pressure_ln_factor(c, t, p),
                    ]
                })
                .collect()
        }),
        case!("thermodynamic", |t, s, p, u| {
            let k = kelvin(t);
            use thermodynamic::*;
            vec![
                log_kh(k),
                log_k1(k),
                log_k2(k),
                log_ksp_calcite(k),
                log_ksp_aragonite(k),
                log_k_cahco3(k),
                log_k_caco3(k),
                log_kw(k),
                emerson1975_pka(k),
            ]
        }),
        case!("weiss1974_ln_k0", |t, s, p, u| vec![gas::weiss1974_ln_k0(
            kelvin(t),
            s
        )]),
        case!("weiss1974_fugacity_factor", |t, s, p, u| {
            // The air pressure moved by the pressure source: 0.9 to 1.4 atm.
            vec![gas::weiss1974_fugacity_factor(kelvin(t), p * 1e-3 + 0.9)]
        }),
        case!("weiss_price1980_vapour_pressure_atm", |t, s, p, u| vec![
            gas::weiss_price1980_vapour_pressure_atm(kelvin(t), s)
        ]),
        case!("schmidt numbers", |t, s, p, u| vec![
            transfer::wanninkhof2014_schmidt_fresh(t),
            transfer::wanninkhof2014_schmidt_sea(t),
            transfer::schmidt_number(t, s),
        ]),
        case!(
            "GasTransfer::k600_cm_h and transfer_velocity",
            |t, s, p, u| {
                let mut out = Vec::new();
                for m in GasTransfer::ALL {
                    for area in [None, Some(0.01), Some(1.0), Some(700.0)] {
                        if let Some(k600) = m.k600_cm_h(u, area) {
                            out.push(k600);
                            let sc = transfer::schmidt_number(t, s);
                            for n in [0.5, 2.0 / 3.0] {
                                out.push(transfer::transfer_velocity(k600, sc, n));
                            }
                        }
                    }
                }
                out
            }
        ),
    ]
}

const PRESSURE: [pressure::PressureCoefficients; 14] = [
    pressure::K1,
    pressure::K2,
    pressure::KB,
    pressure::KW,
    pressure::KS,
    pressure::KF,
    pressure::KP1,
    pressure::KP2,
    pressure::KP3,
    pressure::KSI,
    pressure::KNH4,
    pressure::KH2S,
    pressure::CALCITE,
    pressure::ARAGONITE,
];

const TEMPERATURE_C: [f64; 12] = [
    -2.0, 0.0, 2.0, 5.0, 10.0, 15.0, 20.0, 25.0, 30.0, 35.0, 40.0, 45.0,
];
const SALINITY: [f64; 9] = [0.0, 0.5, 5.0, 10.0, 20.0, 30.0, 35.0, 40.0, 45.0];
const PRESSURE_BAR: [f64; 6] = [0.0, 1.0, 10.0, 100.0, 250.0, 500.0];
const WIND_M_S: [f64; 8] = [0.0, 0.5, 2.0, 3.7, 5.0, 10.0, 15.0, 20.0];

fn grid() -> impl Iterator<Item = [f64; 4]> {
    TEMPERATURE_C.into_iter().flat_map(|t| {
        SALINITY.into_iter().flat_map(move |s| {
            PRESSURE_BAR
                .into_iter()
                .flat_map(move |p| WIND_M_S.into_iter().map(move |u| [t, s, p, u]))
        })
    })
}

fn carried(c: &Case, x: [f64; 4]) -> Vec<T4> {
    (c.carried)(
        T4::source(x[0], 0),
        T4::source(x[1], 1),
        T4::source(x[2], 2),
        T4::source(x[3], 3),
    )
}

fn plain(c: &Case, x: [f64; 4]) -> Vec<f64> {
    (c.plain)(x[0], x[1], x[2], x[3])
}

#[test]
fn every_fit_gives_the_f64_value_bit_for_bit_on_a_tangent() {
    let mut compared = 0usize;
    for c in cases() {
        for x in grid() {
            let a = plain(&c, x);
            let b = carried(&c, x);
            assert_eq!(a.len(), b.len(), "{} at {x:?}", c.name);
            assert!(!a.is_empty(), "{} at {x:?} gives nothing", c.name);
            for (i, (a, b)) in a.iter().zip(&b).enumerate() {
                assert_eq!(
                    a.to_bits(),
                    b.value().to_bits(),
                    "{} output {i} at {x:?}: {a} vs {}",
                    c.name,
                    b.value()
                );
                compared += 1;
            }
        }
    }
    // 26 cases, 5184 points; most of them several outputs.
    assert!(compared > 26 * 5184, "{compared}");
}

/// Central differences of the f64 path against the tangent's derivatives.
///
/// The difference is the five-point one,
/// f′ ≈ (8 (f(x+h) − f(x−h)) − (f(x+2h) − f(x−2h))) / (12 h),
/// whose truncation error is h⁴ f⁽⁵⁾/30: exact for the quartic Schmidt
/// polynomials and the quadratic pressure terms, and for the powers of T,
/// √S and ln T of the fits about (h/x)⁴ of the slope. Steps: 0.02 K in
/// temperature (the Schmidt number, a quartic in °C, sets the scale: its
/// power −n at 40 °C failed with 0.25 K); 2e-3 · max(x, 1) in salinity,
/// pressure and wind (√S at
/// S = 0.5, the smallest salinity but one, gives 6e-11). The truncation
/// of a term can be 100 times that of a slope whose terms cancel (KP3's
/// √S and S terms at −2 °C; 1e-2 steps failed there). Steps that large
/// keep the rounding error small: it is about
/// 4.5·ε·M/h, M the largest term of the fit before cancellation, up to
/// about 400 times the result (log K of CaCO3⁰ near 5 °C, whose terms of
/// ±1200 nearly cancel). The tolerance is 1e-7 of the slope plus that
/// rounding floor, taken as 1e4·ε·max(|f|, 1)/h.
///
/// Not compared: the salinity slope at S = 0 and the wind slope at
/// wind 0, the end of their domain, where √S has no finite slope and the
/// difference would step outside (the temperature slope at S = 0 is
/// compared: a constant salinity of 0 must not make it NaN).
#[test]
fn every_fit_has_the_slopes_of_central_differences() {
    let mut compared = 0usize;
    for c in cases() {
        for x in grid() {
            let b = carried(&c, x);
            for k in 0..4 {
                if (k == 1 || k == 3) && x[k] == 0.0 {
                    continue;
                }
                let h = if k == 0 {
                    0.02
                } else {
                    2e-3 * x[k].abs().max(1.0)
                };
                let at = |steps: f64| {
                    let mut y = x;
                    y[k] += steps * h;
                    plain(&c, y)
                };
                let (f2, f1, g1, g2) = (at(2.0), at(1.0), at(-1.0), at(-2.0));
                for (i, d) in b.iter().enumerate() {
                    let cd = (8.0 * (f1[i] - g1[i]) - (f2[i] - g2[i])) / (12.0 * h);
                    let size = [f2[i], f1[i], g1[i], g2[i]]
                        .iter()
                        .fold(0.0f64, |m, v| m.max(v.abs()));
                    let floor = 1e4 * f64::EPSILON * size / h;
                    let slope = d.d[k];
                    assert!(
                        slope.is_finite() && (slope - cd).abs() <= 1e-7 * cd.abs() + floor,
                        "{} output {i}, source {k} at {x:?}: tangent {slope}, central difference {cd}",
                        c.name
                    );
                    compared += 1;
                }
            }
        }
    }
    assert!(compared > 26 * 5184, "{compared}");
}

/// The shortcut of the pressure correction at zero pressure keeps the
/// formula's slope: d ln(K_P/K_0)/dP = −ΔV/(RT) there (Millero 1995; the
/// form verified, the coefficients from memory, unverified), so a
/// pressure source at the surface moves the constants.
#[test]
fn the_pressure_correction_at_zero_pressure_keeps_its_slope() {
    let c = pressure::CALCITE;
    let t = 25.0;
    let dv = c.a[0] + c.a[1] * t + c.a[2] * t * t;
    let expected = -dv / (pressure::R_CM3_BAR * (t + 273.15));
    let p = Tangent::<1>::source(0.0, 0);
    let t = Tangent::<1>::constant(t);
    let f = pressure::pressure_factor(&c, t, p);
    let l = pressure::pressure_ln_factor(&c, t, p);
    assert_eq!((f.v, l.v), (1.0, 0.0));
    assert!(expected > 0.0);
    assert!((f.d[0] / expected - 1.0).abs() < 1e-15, "{:?}", f.d);
    assert!((l.d[0] / expected - 1.0).abs() < 1e-15, "{:?}", l.d);
}

/// A water of salinity 0 (a fresh water evaluating a sea-water fit at
/// S = 0, as the fresh medium does with KB) has finite temperature
/// slopes: √0 of a constant has no slope, not 0 · ∞.
#[test]
fn a_constant_salinity_of_zero_leaves_the_temperature_slope_finite() {
    let t = Tangent::<1>::source(298.15, 0);
    let s = Tangent::<1>::constant(0.0);
    let l = boron::dickson1990_ln_kb(t, s);
    assert_eq!(l.v, boron::dickson1990_ln_kb(298.15, 0.0));
    assert!(l.d[0].is_finite(), "{:?}", l.d);
}
