//! The fresh medium: thermodynamic constants, activity coefficients, ionic
//! strength, calcium ion pairs, the Langelier index and the calcium
//! carbonate precipitation potential.
//!
//! The constants are apparent constants on the NBS scale, where the working
//! h is the activity of H+:
//!
//! ```text
//! K1' = K1/γ1          K2' = K2 γ1/γ2        KW' = Kw/γ1
//! KB', KSi', KH2S' = K/γ1                    KNH4' = Ka γ1
//! KP1' = KP1/γ1   KP2' = KP2 γ1/γ2   KP3' = KP3 γ2/γ3
//! Ksp' = Ksp/(γCa γ2)                        [H+] = aH/γH
//! [CaHCO3+] = K γCa [Ca][HCO3-]              [CaCO3⁰] = K γCa γ2 [Ca][CO3--]
//! ```
//! with γ1, γ2, γ3 the coefficients of ions of charge 1, 2, 3 and neutral
//! species at γ = 1. The ionic strength and free calcium are iterated with
//! the speciation until both agree to 1e-13 relative.

use crate::activity::Gammas;
use crate::alkalinity::non_carbonate;
use crate::conductivity::{langelier1936_ionic_strength, russell1976_ionic_strength};
use crate::constants::fresh as pb;
use crate::constants::{nutrients, sulfate, sulfide, Constants, FitName, FitsUsed, Totals};
use crate::density::density_kg_m3;
use crate::error::{Error, Result};
use crate::measured::Measured;
use crate::scales::PhScale;
use crate::solve::{to_known, Known, Pair, RootChoice, SolveOptions};
use crate::state::{FreshExtras, State};
use crate::units::CACO3_G_MOL;
use crate::warning::{Warning, Warnings};
use crate::water::Water;
use serde::Serialize;

/// Where the ionic strength of a fresh water came from.
///
/// ```
/// use travertine::fresh::IonicStrengthRoute;
/// assert_eq!(IonicStrengthRoute::MajorIons.name(), "major ions");
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[non_exhaustive]
pub enum IonicStrengthRoute {
    /// Computed from the major ions given and the carbonate species, iterated.
    #[serde(rename = "major ions")]
    MajorIons,
    /// From specific conductance, Russell (1976).
    #[serde(rename = "specific conductance (russell1976)")]
    SpecificConductance,
    /// From total dissolved solids, Langelier (1936).
    #[serde(rename = "tds (langelier1936)")]
    Tds,
    /// Given directly.
    #[serde(rename = "given")]
    Given,
    /// From salinity with sea-water ratios, I = 19.924 S/(1000 − 1.005 S).
    #[serde(rename = "salinity")]
    Salinity,
    /// Nothing given: the carbonate species, any calcium, and a monovalent ion balancing the charge.
    #[serde(rename = "alkalinity only")]
    AlkalinityOnly,
}

impl IonicStrengthRoute {
    /// The plain name, as in the output key `ionic_strength_from`.
    ///
    /// ```
    /// # use travertine::fresh::IonicStrengthRoute;
    /// assert_eq!(IonicStrengthRoute::Tds.name(), "tds (langelier1936)");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            IonicStrengthRoute::MajorIons => "major ions",
            IonicStrengthRoute::SpecificConductance => "specific conductance (russell1976)",
            IonicStrengthRoute::Tds => "tds (langelier1936)",
            IonicStrengthRoute::Given => "given",
            IonicStrengthRoute::Salinity => "salinity",
            IonicStrengthRoute::AlkalinityOnly => "alkalinity only",
        }
    }
}

/// Temperature-only thermodynamic constants, evaluated once per solve.
#[derive(Debug, Clone)]
pub(crate) struct Thermo {
    kh: f64,
    k1: f64,
    k2: f64,
    kw: f64,
    kb: f64,
    kp: (f64, f64, f64),
    ksi: f64,
    ks: f64,
    kf: f64,
    knh4: f64,
    kh2s: f64,
    ksp_calcite: f64,
    ksp_aragonite: f64,
    k_cahco3: f64,
    k_caco3: f64,
    rho_w_g_cm3: f64,
    density: f64,
    totals: Totals,
    warnings: Vec<Warning>,
}

impl Thermo {
    fn new(water: &Water) -> Result<Self> {
        let c = water.conditions();
        let t_c = c.temperature_c();
        let t = c.temperature_k();
        let mut warnings = Vec::new();
        let density = density_kg_m3(c.salinity(), t_c)?;
        let rho_w = density_kg_m3(0.0, t_c)? / 1000.0;
        let totals = water.composition().fresh_totals(density);
        pb::PLUMMER_BUSENBERG1982_RANGE.check_for(
            "K0, K1, K2, calcite and aragonite",
            t_c,
            0.0,
            &mut warnings,
        );
        pb::HARNED_OWEN_RANGE.check_for("KW", t_c, 0.0, &mut warnings);
        if totals.calcium_mol_kg > 0.0 {
            pb::CAHCO3_RANGE.check_for("CaHCO3+ pair", t_c, 0.0, &mut warnings);
            pb::CACO3_RANGE.check_for("CaCO3 pair", t_c, 0.0, &mut warnings);
        }
        if totals.ammonia_mol_kg > 0.0 {
            pb::EMERSON1975_RANGE.check_for("KNH4", t_c, 0.0, &mut warnings);
        }
        let p10 = crate::numeric::pow10;
        let (lp1, lp2, lp3) = nutrients::millero1995_ln_kp(t, 0.0);
        let mut th = Thermo {
            kh: p10(pb::log_kh(t)),
            k1: p10(pb::log_k1(t)),
            k2: p10(pb::log_k2(t)),
            kw: p10(pb::log_kw(t)),
            // Pure-water limits (S = 0) of the sea-water fits.
            kb: crate::constants::boron::dickson1990_ln_kb(t, 0.0).exp(),
            kp: (lp1.exp(), lp2.exp(), lp3.exp()),
            ksi: nutrients::millero1995_ln_ksi(t, 0.0).exp(),
            ks: sulfate::dickson1990_ln_ks(t, 0.0).exp(),
            kf: (1590.2 / t - 12.641).exp(),
            knh4: p10(-pb::emerson1975_pka(t)),
            kh2s: p10(-sulfide::millero1988_pk1(t, 0.0)),
            ksp_calcite: p10(pb::log_ksp_calcite(t)),
            ksp_aragonite: p10(pb::log_ksp_aragonite(t)),
            k_cahco3: p10(pb::log_k_cahco3(t)),
            k_caco3: p10(pb::log_k_caco3(t)),
            rho_w_g_cm3: rho_w,
            density,
            totals,
            warnings,
        };
        let p_bar = c.pressure_bar();
        if p_bar > 0.0 {
            use crate::constants::pressure::*;
            let f = |k: &PressureCoefficients| pressure_factor(k, t_c, p_bar);
            th.k1 *= f(&K1);
            th.k2 *= f(&K2);
            th.kw *= f(&KW);
            th.kb *= f(&KB);
            th.kp = (th.kp.0 * f(&KP1), th.kp.1 * f(&KP2), th.kp.2 * f(&KP3));
            th.ksi *= f(&KSI);
            th.ks *= f(&KS);
            th.kf *= f(&KF);
            th.knh4 *= f(&KNH4);
            th.kh2s *= f(&KH2S);
            th.ksp_calcite *= f(&CALCITE);
            th.ksp_aragonite *= f(&ARAGONITE);
            th.warnings.push(Warning::Note(
                "fresh water under pressure: the Millero (1995) corrections use sea-water \
                 coefficients",
            ));
        }
        Ok(th)
    }

    /// Apparent constants at ionic strength `i` with free calcium `ca_free`.
    fn constants(&self, water: &Water, i: f64, ca_free: f64) -> Constants {
        let c = water.conditions();
        let g = Gammas::new(
            water.fresh_options().activity,
            c.temperature_c(),
            self.rho_w_g_cm3,
            i,
        );
        let (g1, g2, g3, gh, gca) = (
            g.monovalent,
            g.carbonate,
            g.trivalent,
            g.hydrogen,
            g.calcium,
        );
        let k1 = self.k1 / g1;
        let k2 = self.k2 * g1 / g2;
        let k_cahco3 = self.k_cahco3 * gca;
        let k_caco3 = self.k_caco3 * gca * g2;
        let pair_hco3 = k_cahco3 * ca_free;
        let pair_co3 = k_caco3 * ca_free;
        let t = &self.totals;
        let on = |total: f64, k: f64| if total > 0.0 { k } else { 0.0 };
        Constants {
            conditions: *c,
            working_scale: PhScale::Nbs,
            k0: self.kh,
            k1,
            k2,
            k1e: k1 * (1.0 + pair_hco3),
            k2e: k2 * (1.0 + pair_co3) / (1.0 + pair_hco3),
            pair_hco3,
            pair_co3,
            calcium_free_mol_kg: ca_free,
            ionic_strength: i,
            kb: on(t.boron_mol_kg, self.kb / g1),
            kw: self.kw / g1,
            kp1: on(t.phosphate_mol_kg, self.kp.0 / g1),
            kp2: on(t.phosphate_mol_kg, self.kp.1 * g1 / g2),
            kp3: on(t.phosphate_mol_kg, self.kp.2 * g2 / g3),
            ksi: on(t.silicate_mol_kg, self.ksi / g1),
            knh4: on(t.ammonia_mol_kg, self.knh4 * g1),
            kh2s: on(t.sulfide_mol_kg, self.kh2s / g1),
            // Concentration constants on free [H+]: [H][SO4]/[HSO4] = KS γ1/(γH γ2),
            // [H][F]/[HF] = KF/(γH γ1).
            ks_free: self.ks * g1 / (gh * g2),
            kf_free: self.kf / (gh * g1),
            ksp_calcite: self.ksp_calcite / (gca * g2),
            ksp_aragonite: self.ksp_aragonite / (gca * g2),
            totals: *t,
            free_per_working: 1.0 / gh,
            // Defined as in sea water, from the free [H+] and the sulfate and
            // fluoride given (equal to the free scale when there are none).
            seawater_per_working: (1.0
                + t.sulfate_mol_kg / (self.ks * g1 / (gh * g2))
                + t.fluoride_mol_kg / (self.kf / (gh * g1)))
                / gh,
            total_per_working: (1.0 + t.sulfate_mol_kg / (self.ks * g1 / (gh * g2))) / gh,
            nbs_per_working: 1.0,
            fugacity_factor: crate::constants::gas::weiss1974_fugacity_factor(
                c.temperature_k(),
                c.air_pressure_atm(),
            ),
            vapour_pressure_atm: crate::constants::gas::weiss_price1980_vapour_pressure_atm(
                c.temperature_k(),
                0.0,
            ),
            density_kg_m3: self.density,
            fits_used: fresh_fits_used(t, water.fresh_options().activity),
            // Attached only to the constants a caller sees (not on every
            // trial of the inner iterations, where it would allocate).
            warnings: Vec::new(),
            gammas: Some(g),
            k_cahco3,
            k_caco3,
            logs: None,
        }
    }
}

fn fresh_fits_used(t: &Totals, activity: crate::activity::ActivityModel) -> FitsUsed {
    let pb = FitName::PlummerBusenberg1982;
    let given = |total: f64| {
        if total > 0.0 {
            FitName::Measured
        } else {
            FitName::NoneGiven
        }
    };
    FitsUsed {
        k0: pb,
        fugacity: FitName::Weiss1974,
        vapour_pressure: FitName::WeissPrice1980,
        carbonic: pb,
        boric: FitName::Dickson1990AtS0,
        boron_total: given(t.boron_mol_kg),
        water: FitName::HarnedOwen1958,
        bisulfate: FitName::Dickson1990AtS0,
        sulfate_total: given(t.sulfate_mol_kg),
        fluoride: FitName::DicksonRiley1979AtS0,
        fluoride_total: given(t.fluoride_mol_kg),
        phosphate_silicate: FitName::Millero1995AtS0,
        ammonium: FitName::Emerson1975,
        sulfide: FitName::Millero1988AtS0,
        minerals: pb,
        calcium: given(t.calcium_mol_kg),
        pressure: FitName::Millero1995,
        nbs_scale: activity.into(),
        density: FitName::MilleroPoisson1981,
    }
}

/// Which route gives the ionic strength, in the order of preference.
fn route(water: &Water) -> IonicStrengthRoute {
    let f = water.fresh_options();
    if water.composition().major_ions_given() {
        IonicStrengthRoute::MajorIons
    } else if f.specific_conductance_us_cm.is_some() {
        IonicStrengthRoute::SpecificConductance
    } else if f.tds_mg_l.is_some() {
        IonicStrengthRoute::Tds
    } else if f.ionic_strength.is_some() {
        IonicStrengthRoute::Given
    } else if water.conditions().salinity() > 0.0 {
        IonicStrengthRoute::Salinity
    } else {
        IonicStrengthRoute::AlkalinityOnly
    }
}

fn fixed_ionic_strength(water: &Water, route: IonicStrengthRoute) -> Option<f64> {
    let f = water.fresh_options();
    match route {
        IonicStrengthRoute::SpecificConductance => {
            f.specific_conductance_us_cm.map(russell1976_ionic_strength)
        }
        IonicStrengthRoute::Tds => f.tds_mg_l.map(langelier1936_ionic_strength),
        IonicStrengthRoute::Given => f.ionic_strength,
        IonicStrengthRoute::Salinity => Some(sulfate::seawater_ionic_strength(
            water.conditions().salinity(),
        )),
        _ => None,
    }
}

/// Ionic strength from every ion, with a monovalent ion added to carry any
/// charge imbalance; also returns the imbalance as a fraction of the total
/// charge (positive: excess cations).
fn ion_sum(k: &Constants, h: f64, dic: f64) -> (f64, f64) {
    let t = &k.totals;
    let d = h * h + k.k1e * h + k.k1e * k.k2e;
    let hco3_t = dic * k.k1e * h / d;
    let co3_t = dic * k.k1e * k.k2e / d;
    let hco3 = hco3_t / (1.0 + k.pair_hco3);
    let co3 = co3_t / (1.0 + k.pair_co3);
    let cahco3 = hco3_t - hco3;
    let ca = k.calcium_free_mol_kg;
    let hf = h * k.free_per_working;
    let oh = k.kw / h;
    let base = |total: f64, ka: f64| {
        if total > 0.0 {
            total * ka / (ka + h)
        } else {
            0.0
        }
    };
    let borate = base(t.boron_mol_kg, k.kb);
    let silicate = base(t.silicate_mol_kg, k.ksi);
    let hs = base(t.sulfide_mol_kg, k.kh2s);
    let nh4 = t.ammonia_mol_kg - base(t.ammonia_mol_kg, k.knh4);
    let so4 = t.sulfate_mol_kg * k.ks_free / (k.ks_free + hf);
    let hso4 = t.sulfate_mol_kg - so4;
    let fl = t.fluoride_mol_kg * k.kf_free / (k.kf_free + hf);
    let (mut h2po4, mut hpo4, mut po4) = (0.0, 0.0, 0.0);
    if t.phosphate_mol_kg > 0.0 {
        let (a, b, c) = (k.kp1, k.kp1 * k.kp2, k.kp1 * k.kp2 * k.kp3);
        let dp = h * h * h + a * h * h + b * h + c;
        h2po4 = t.phosphate_mol_kg * a * h * h / dp;
        hpo4 = t.phosphate_mol_kg * b * h / dp;
        po4 = t.phosphate_mol_kg * c / dp;
    }
    // Divalent cations whose split is unknown count like Mg.
    let divalent_cations = ca + t.magnesium_mol_kg + t.hardness_mol_kg;
    let mono_cations = hf + t.sodium_mol_kg + t.potassium_mol_kg + nh4 + cahco3;
    let mono_anions = oh + hco3 + t.chloride_mol_kg + borate + silicate + hs + hso4 + fl + h2po4;
    let divalent_anions = co3 + so4 + hpo4;
    let trivalent_anions = po4;
    let charge = mono_cations + 2.0 * divalent_cations
        - mono_anions
        - 2.0 * divalent_anions
        - 3.0 * trivalent_anions;
    let total_charge = mono_cations
        + 2.0 * divalent_cations
        + mono_anions
        + 2.0 * divalent_anions
        + 3.0 * trivalent_anions;
    let i = 0.5
        * (mono_cations
            + mono_anions
            + 4.0 * (divalent_cations + divalent_anions)
            + 9.0 * trivalent_anions
            + charge.abs());
    (
        i,
        if total_charge > 0.0 {
            charge / total_charge
        } else {
            0.0
        },
    )
}

const MAX_OUTER: u32 = 200;
const OUTER_TOLERANCE: f64 = 1e-13;

/// Starting constants: the fixed ionic strength of the route, or that of the
/// given ions alone; calcium all free.
pub(crate) fn starting_constants(water: &Water) -> Result<Constants> {
    let th = Thermo::new(water)?;
    let r = route(water);
    let i = fixed_ionic_strength(water, r).unwrap_or(0.0);
    let k0 = th.constants(water, i, th.totals.calcium_mol_kg);
    let i = match r {
        IonicStrengthRoute::MajorIons | IonicStrengthRoute::AlkalinityOnly => {
            ion_sum(&k0, 1e-8, 0.0).0
        }
        _ => i,
    };
    let mut k = th.constants(water, i, th.totals.calcium_mol_kg);
    k.warnings = th.warnings.clone();
    Ok(k)
}

/// The speciation at one h, from one carbon parameter, with the calcium
/// pairs solved exactly: free CO2* = S, HCO3- = S u, CO3-- = S v with
/// u = K1'/h, v = K1'K2'/h², free Ca = CaT/(1 + S w), w = a u + b v.
#[derive(Debug, Clone, Copy)]
struct Spec {
    co2: f64,
    hco3: f64,
    co3: f64,
    ca_free: f64,
    dic: f64,
    ta: f64,
}

/// Positive root of c w S² + (c + q − p w) S − p = 0 (with w = 0: S = p/c),
/// the balance (p − S c)(1 + S w) = S q.
fn balance_root(c: f64, w: f64, q: f64, p: f64) -> f64 {
    if w == 0.0 {
        return p / c;
    }
    let b = c + q - p * w;
    let disc = (b * b + 4.0 * c * w * p).sqrt();
    if b > 0.0 {
        2.0 * p / (b + disc)
    } else {
        (disc - b) / (2.0 * c * w)
    }
}

fn speciate(k: &Constants, h: f64, carbon: Known) -> Option<Spec> {
    let ca_t = k.totals.calcium_mol_kg;
    let (a, b) = (k.k_cahco3, k.k_caco3);
    let u = k.k1 / h;
    let v = k.k1 * k.k2 / (h * h);
    let w = if ca_t > 0.0 { a * u + b * v } else { 0.0 };
    let nc = non_carbonate(k, h).0;
    let s = match carbon {
        Known::Co2(x) => x,
        Known::Hco3(x) => x / u,
        Known::Co3(x) => x / v,
        Known::Dic(d) => balance_root(1.0 + u + v, w, ca_t * w, d),
        Known::Ta(t) => {
            let carb = t - nc;
            if carb <= 0.0 {
                return None;
            }
            let w2 = if ca_t > 0.0 { a * u + 2.0 * b * v } else { 0.0 };
            balance_root(u + 2.0 * v, w, ca_t * w2, carb)
        }
        Known::H(_) => return None,
    };
    if !(s.is_finite() && s > 0.0) {
        return None;
    }
    let (hco3, co3) = (s * u, s * v);
    let ca_free = if ca_t > 0.0 {
        ca_t / (1.0 + s * w)
    } else {
        0.0
    };
    let (pair1, pair2) = (a * ca_free * hco3, b * ca_free * co3);
    Some(Spec {
        co2: s,
        hco3,
        co3,
        ca_free,
        dic: s + hco3 + co3 + pair1 + pair2,
        ta: hco3 + 2.0 * co3 + pair1 + 2.0 * pair2 + nc,
    })
}

fn value_of(spec: &Spec, which: Known) -> f64 {
    match which {
        Known::Ta(_) => spec.ta,
        Known::Dic(_) => spec.dic,
        Known::Co2(_) => spec.co2,
        Known::Hco3(_) => spec.hco3,
        Known::Co3(_) => spec.co3,
        Known::H(_) => f64::NAN,
    }
}

fn measured_value(k: Known) -> f64 {
    match k {
        Known::Ta(v) | Known::Dic(v) | Known::Co2(v) | Known::Hco3(v) | Known::Co3(v) => v,
        Known::H(h) => h,
    }
}

/// The speciation at h from one carbon parameter, with the ionic strength
/// (when it comes from the ions) made consistent with it, starting from
/// `i0`. Returns the speciation, the ionic strength and the constants.
fn consistent(
    water: &Water,
    th: &Thermo,
    fixed: Option<f64>,
    h: f64,
    carbon: Known,
    i0: f64,
) -> Option<(Spec, f64)> {
    let mut i = fixed.unwrap_or(i0);
    for _ in 0..MAX_OUTER {
        let k0 = th.constants(water, i, 0.0);
        let spec = speciate(&k0, h, carbon)?;
        if fixed.is_some() {
            return Some((spec, i));
        }
        let k = th.constants(water, i, spec.ca_free);
        let i_new = ion_sum(&k, h, spec.dic).0;
        if (i_new - i).abs() <= OUTER_TOLERANCE * i.max(1e-12) {
            return Some((spec, i));
        }
        i = i_new;
    }
    None
}

/// Every h in pH 0–14 at which the pair fits, each with its own consistent
/// ionic strength. One parameter fixes the speciation at each h; the other
/// is matched by scanning pH in steps of 0.1 for sign changes and refining
/// each with Brent's method to 1e-13 pH.
#[allow(clippy::too_many_arguments)]
fn roots_scan(
    water: &Water,
    th: &Thermo,
    fixed: Option<f64>,
    first: Known,
    second: Known,
    i0: f64,
    pair: &Pair,
) -> Result<Vec<(f64, f64)>> {
    let target = measured_value(second);
    let last_i = std::cell::Cell::new(i0);
    let resid = |ph: f64| -> Option<f64> {
        let h = crate::numeric::pow10(-ph);
        let (spec, i) = consistent(water, th, fixed, h, first, last_i.get())?;
        last_i.set(i);
        Some(value_of(&spec, second) / target - 1.0)
    };
    let steps = 140;
    let mut samples: Vec<Option<(f64, f64, f64)>> = Vec::with_capacity(steps + 1);
    for n in 0..=steps {
        let ph = 14.0 * n as f64 / steps as f64;
        samples.push(resid(ph).map(|r| (ph, r, last_i.get())));
    }
    let refine = |lo: f64, hi: f64, i_start: f64| -> Result<(f64, f64)> {
        last_i.set(i_start);
        let f = |x: f64| resid(x).unwrap_or(f64::NAN);
        let mut conv = roots::SimpleConvergency {
            eps: 1e-13,
            max_iter: 200,
        };
        let x =
            roots::find_root_brent(lo, hi, f, &mut conv).map_err(|_| pair.no_convergence(200))?;
        Ok((x, last_i.get()))
    };
    let mut roots = Vec::new();
    for n in 0..samples.len() {
        let Some((ph, r, i_here)) = samples[n] else {
            continue;
        };
        if r == 0.0 {
            roots.push((ph, i_here));
            continue;
        }
        let prev = if n > 0 { samples[n - 1] } else { None };
        let next = samples.get(n + 1).copied().flatten();
        if let Some((p0, r0, i0)) = prev {
            if r0 != 0.0 && (r0 < 0.0) != (r < 0.0) {
                roots.push(refine(p0, ph, i0)?);
            }
        }
        // Two roots closer than one step leave no sign change: look for an
        // extremum of the residual that reaches across zero.
        if let (Some((p0, r0, i0)), Some((p1, r1, _))) = (prev, next) {
            let same_sign = (r0 < 0.0) == (r < 0.0) && (r1 < 0.0) == (r < 0.0);
            if same_sign && r.abs() < r0.abs() && r.abs() < r1.abs() {
                let sign = r.signum();
                let (mut a, mut b) = (p0, p1);
                let g = 0.5 * (5f64.sqrt() - 1.0);
                for _ in 0..80 {
                    let (c, d) = (b - g * (b - a), a + g * (b - a));
                    last_i.set(i0);
                    let (rc, rd) = (resid(c), resid(d));
                    match (rc, rd) {
                        (Some(rc), Some(rd)) if rc * sign < rd * sign => b = d,
                        (Some(_), Some(_)) => a = c,
                        _ => break,
                    }
                }
                let m = 0.5 * (a + b);
                last_i.set(i0);
                if let Some(rm) = resid(m) {
                    if rm * sign < 0.0 {
                        let im = last_i.get();
                        roots.push(refine(p0, m, i0)?);
                        roots.push(refine(m, p1, im)?);
                    }
                }
            }
        }
    }
    if roots.is_empty() {
        // A root can hide between a defined sample and an undefined
        // neighbour (where the alkalinity left for carbon runs out, the
        // residual tends to −1 without a sample to show it): find the edge
        // of the defined region by bisection and look for a sign change
        // there. Only done when the scan found nothing, so it costs an
        // ordinary solve nothing.
        let edge = |inside: f64, outside: f64, i_start: f64| -> Option<(f64, f64, f64)> {
            let (mut a, mut b) = (inside, outside);
            let mut last = None;
            for _ in 0..48 {
                let m = 0.5 * (a + b);
                last_i.set(i_start);
                match resid(m) {
                    Some(r) => {
                        a = m;
                        last = Some((m, r, last_i.get()));
                    }
                    None => b = m,
                }
            }
            last
        };
        for n in 0..samples.len() {
            let Some((ph, r, i_here)) = samples[n] else {
                continue;
            };
            let neighbours = [n.checked_sub(1), Some(n + 1).filter(|&m| m < samples.len())];
            for m in neighbours.into_iter().flatten() {
                if samples[m].is_some() {
                    continue;
                }
                let outside = 14.0 * m as f64 / steps as f64;
                if let Some((pe, re, ie)) = edge(ph, outside, i_here) {
                    if re != 0.0 && (re < 0.0) != (r < 0.0) {
                        let (lo, hi, i_lo) = if pe < ph {
                            (pe, ph, ie)
                        } else {
                            (ph, pe, i_here)
                        };
                        roots.push(refine(lo, hi, i_lo)?);
                    }
                }
            }
        }
    }
    Ok(roots
        .into_iter()
        .map(|(ph, i)| (crate::numeric::pow10(-ph), i))
        .collect())
}

fn choose(roots: &[(f64, f64)], root: RootChoice) -> Option<(f64, f64)> {
    let ph = |h: f64| -h.log10();
    let key = |r: &(f64, f64)| -> f64 {
        match root {
            RootChoice::LowerPh => ph(r.0),
            RootChoice::HigherPh => -ph(r.0),
            _ => (ph(r.0) - 8.0).abs(),
        }
    };
    roots
        .iter()
        .copied()
        .min_by(|a, b| key(a).total_cmp(&key(b)))
}

/// The fresh-water solve. At each trial h the pair's carbon parameter fixes
/// the speciation, with the calcium pairs solved exactly and the ionic
/// strength (when it comes from the ions) iterated to 1e-13; pairs without a
/// pH are then a scan-and-refine root in pH, so every root is found with its
/// own ionic strength.
pub(crate) fn solve_fresh(
    water: &Water,
    a: Measured,
    b: Measured,
    options: &SolveOptions,
) -> Result<State> {
    crate::solve::check_pair(&a, &b)?;
    let th = Thermo::new(water)?;
    let r = route(water);
    let fixed = fixed_ionic_strength(water, r);
    let mut i_guess = match fixed {
        Some(i) => i,
        None => ion_sum(&th.constants(water, 0.0, 0.0), 1e-8, 0.0).0,
    };
    // A pH on a scale other than NBS depends on the activity of H+, so its
    // conversion is repeated until the ionic strength it used is the final one.
    for _ in 0..MAX_OUTER {
        let k_conv = th.constants(water, i_guess, 0.0);
        let mut warnings = Warnings::new();
        let mut ka = to_known(&k_conv, &a, &mut warnings);
        let mut kb = to_known(&k_conv, &b, &mut warnings);
        let (mut ma, mut mb) = (&a, &b);
        if ka.rank() > kb.rank() {
            std::mem::swap(&mut ka, &mut kb);
            std::mem::swap(&mut ma, &mut mb);
        }
        let pair = Pair { a: ma, b: mb };
        let (h, carbon, roots) = match (ka, kb) {
            (Known::H(h), c) | (c, Known::H(h)) => (h, c, vec![(h, i_guess)]),
            (first, second) => {
                let roots = roots_scan(water, &th, fixed, first, second, i_guess, &pair)?;
                let Some((h, _)) = choose(&roots, options.root) else {
                    return Err(pair.no_water(
                        "no pH between 0 and 14 gives both at these conditions".to_string(),
                    ));
                };
                (h, first, roots)
            }
        };
        let Some((spec, i)) = consistent(water, &th, fixed, h, carbon, i_guess) else {
            return Err(pair.no_water(
                "the alkalinity left for carbon at this pH is not positive".to_string(),
            ));
        };
        let ph_scale_depends_on_i = [&a, &b].iter().any(|m| {
            matches!(
                m.value(),
                crate::measured::Value::Ph(_, Some(s)) if s != PhScale::Nbs
            )
        });
        if ph_scale_depends_on_i && (i - i_guess).abs() > OUTER_TOLERANCE * i.max(1e-12) {
            i_guess = i;
            continue;
        }
        crate::solve::check_dic(&pair, spec.dic)?;
        let mut k = th.constants(water, i, spec.ca_free);
        k.warnings = th.warnings.clone();
        let (_, imbalance) = ion_sum(&k, h, spec.dic);
        add_route_warnings(water, r, i, &mut warnings);
        for &(other, _) in &roots {
            if (other / h - 1.0).abs() > 1e-6 {
                warnings.push(Warning::OtherRoot {
                    first: pair.a.parameter().name(),
                    second: pair.b.parameter().name(),
                    ph: -other.log10(),
                    scale: k.working_scale.name(),
                    higher: other < h,
                });
            }
        }
        let extras = extras(&k, h, spec.dic, r, imbalance, &mut warnings);
        return State::build_fresh(water, &k, h, spec.dic, warnings, extras, (&a, &b));
    }
    Err(Error::NoConvergence {
        first: a.parameter().name(),
        second: b.parameter().name(),
        iterations: MAX_OUTER,
    })
}

fn add_route_warnings(water: &Water, r: IonicStrengthRoute, i: f64, w: &mut Warnings) {
    let f = water.fresh_options();
    let unused = [
        (
            f.specific_conductance_us_cm.is_some(),
            IonicStrengthRoute::SpecificConductance,
        ),
        (f.tds_mg_l.is_some(), IonicStrengthRoute::Tds),
        (f.ionic_strength.is_some(), IonicStrengthRoute::Given),
    ];
    for (given, other) in unused {
        if given && other != r {
            w.push(Warning::Text(format!(
                "ionic strength from {} was not used: {} comes first",
                other.name(),
                r.name()
            )));
        }
    }
    if r == IonicStrengthRoute::AlkalinityOnly {
        w.push(Warning::Note(
            "no major-ion analysis, conductance, TDS or ionic strength given: the ionic \
             strength is computed from the carbonate species, any calcium given and a \
             monovalent ion balancing the charge",
        ));
    }
    let limit = match water.fresh_options().activity {
        crate::activity::ActivityModel::ExtendedDebyeHuckel => 0.1,
        _ => 0.5,
    };
    if i > limit {
        w.push(Warning::Text(format!(
            "ionic strength {i:.3} mol/kg is above {limit}, where the {} activity model holds",
            water.fresh_options().activity.name()
        )));
    }
    if water.composition().calcium_given() {
        return;
    }
    if water.composition().fresh_totals(1000.0).hardness_mol_kg > 0.0 {
        w.push(Warning::Note(
            "total hardness was given without a calcium fraction: it is not taken as \
             calcium (it counts in the ionic strength only); give calcium or a calcium fraction",
        ));
    }
    w.push(Warning::Note(
        "calcium not given: calcite and aragonite saturation and the Langelier index are \
         not computed",
    ));
}

#[allow(clippy::too_many_arguments)]
fn extras(
    k: &Constants,
    h: f64,
    dic: f64,
    r: IonicStrengthRoute,
    imbalance: f64,
    warnings: &mut Warnings,
) -> FreshExtras {
    let ca_t = k.totals.calcium_mol_kg;
    let mut e = FreshExtras {
        ionic_strength_from: r,
        charge_balance_percent: if r == IonicStrengthRoute::MajorIons {
            Some(100.0 * imbalance)
        } else {
            None
        },
        saturation_ph_nbs: None,
        langelier_index: None,
        precipitation_potential_mg_l_caco3: None,
    };
    if ca_t <= 0.0 {
        return e;
    }
    let ta = crate::alkalinity::parts(k, h, dic).total();
    match saturation_ph(k, ta) {
        Some(phs) => {
            e.saturation_ph_nbs = Some(phs);
            e.langelier_index = Some(-h.log10() - phs);
        }
        None => warnings.push(Warning::Note(
            "no pH between 4 and 13 saturates this water with calcite at its alkalinity and \
             calcium: Langelier index not computed",
        )),
    }
    match precipitation_potential(k, ta, dic, h) {
        Some(x) => e.precipitation_potential_mg_l_caco3 = Some(x * k.density_kg_m3 * CACO3_G_MOL),
        None => warnings.push(Warning::Note(
            "the calcium carbonate precipitation potential could not be bracketed",
        )),
    }
    e
}

/// ln(IAP/Ksp) of calcite at h for alkalinity `ta` and the calcium of `k`,
/// with the pairs solved exactly and the ionic strength held.
fn log_saturation_at(k: &Constants, ta: f64, h: f64) -> Option<f64> {
    let spec = speciate(k, h, Known::Ta(ta))?;
    Some((spec.ca_free * spec.co3 / k.ksp_calcite).ln())
}

/// pHs of the Langelier index: the NBS pH at which this water, with its
/// alkalinity and calcium (and ionic strength), is exactly saturated with
/// calcite. Scans pH 4–13 for the lowest saturating pH, then refines with Brent.
fn saturation_ph(k: &Constants, ta: f64) -> Option<f64> {
    let f = |ph: f64| log_saturation_at(k, ta, 10f64.powf(-ph));
    let mut prev: Option<(f64, f64)> = None;
    let mut ph = 4.0;
    while ph <= 13.0 + 1e-9 {
        if let Some(v) = f(ph) {
            if let Some((p0, v0)) = prev {
                if v0 < 0.0 && v >= 0.0 {
                    let g = |x: f64| f(x).unwrap_or(-1e3);
                    let mut conv = roots::SimpleConvergency {
                        eps: 1e-12,
                        max_iter: 200,
                    };
                    return roots::find_root_brent(p0, ph, g, &mut conv).ok();
                }
            }
            prev = Some((ph, v));
        }
        ph += 0.25;
    }
    None
}

/// Calcium carbonate precipitation potential (mol/kg): the calcite that
/// would precipitate (positive) or dissolve (negative) in a closed system
/// to reach saturation, removing x of calcium and DIC and 2x of alkalinity
/// (Rossum & Merrill 1983; from memory, unverified). Ionic strength is held
/// at the sample's.
fn precipitation_potential(k: &Constants, ta: f64, dic: f64, h: f64) -> Option<f64> {
    let ca_t = k.totals.calcium_mol_kg;
    let mut kx = k.clone();
    kx.warnings.clear();
    // The pH of the last trial, to start the next one's bracket near it.
    let last_ph = std::cell::Cell::new(-h.log10());
    let mut log_omega = |x: f64| -> f64 {
        kx.totals.calcium_mol_kg = ca_t - x;
        let (ta2, dic2) = (ta - 2.0 * x, dic - x);
        // At fixed alkalinity DIC rises with h: one bracketed root in pH.
        let resid = |ph: f64| {
            speciate(&kx, crate::numeric::pow10(-ph), Known::Ta(ta2))
                .map_or(f64::NAN, |s| s.dic / dic2 - 1.0)
        };
        let ph0 = last_ph.get();
        let (mut lo, mut hi) = (ph0 - 0.1, ph0 + 0.1);
        let mut widen = 0.2;
        while resid(lo).partial_cmp(&0.0) != Some(std::cmp::Ordering::Greater) && lo > 0.0 {
            lo -= widen;
            widen *= 2.0;
        }
        // Above some pH the alkalinity is all hydroxide and no carbon fits
        // (NaN); just below that edge DIC tends to 0, so the residual is negative.
        let mut valid = lo;
        widen = 0.2;
        let mut edge: Option<f64> = None;
        for _ in 0..200 {
            let r = resid(hi);
            if r < 0.0 {
                break;
            }
            if r.is_nan() {
                edge = Some(hi);
            } else {
                valid = hi;
            }
            // Widen until past the root or onto the edge, then bisect
            // between the last positive point and the edge.
            hi = match edge {
                Some(e) => 0.5 * (valid + e),
                None => {
                    widen *= 2.0;
                    hi + widen
                }
            };
            if hi > 14.0 && edge.is_none() {
                edge = Some(14.0);
            }
        }
        if !(resid(lo) > 0.0 && resid(hi) < 0.0) {
            return f64::NAN;
        }
        let mut conv = crate::root::Relative {
            rel: 1e-15,
            y_tol: 1e-15,
            max_iter: 200,
        };
        let Ok(ph) = roots::find_root_brent(lo, hi, resid, &mut conv) else {
            return f64::NAN;
        };
        last_ph.set(ph);
        let h = crate::numeric::pow10(-ph);
        speciate(&kx, h, Known::Ta(ta2))
            .map_or(f64::NAN, |s| (s.ca_free * s.co3 / kx.ksp_calcite).ln())
    };
    let f0 = log_omega(0.0);
    if !f0.is_finite() {
        return None;
    }
    if f0 == 0.0 {
        return Some(0.0);
    }
    // Supersaturated: the root lies between 0 and the most that can
    // precipitate; undersaturated: between 0 and 0.01 mol/kg dissolved.
    let (lo, hi) = if f0 > 0.0 {
        (0.0, ca_t.min(dic).min(ta / 2.0) * (1.0 - 1e-9))
    } else {
        (-0.01, 0.0)
    };
    let far = if f0 > 0.0 { hi } else { lo };
    let f_far = log_omega(far);
    if !f_far.is_finite() || f_far * f0 > 0.0 {
        return None;
    }
    // Relative 1e-12, whatever the size of the potential.
    let mut conv = crate::root::Relative {
        rel: 1e-12,
        y_tol: 1e-13,
        max_iter: 200,
    };
    roots::find_root_brent(lo, hi, log_omega, &mut conv).ok()
}
