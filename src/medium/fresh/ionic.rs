//! The ionic strength of a fresh water: its route, its value where it is
//! given, and the sum over the ions.

use super::IonicStrengthRoute;
use crate::base::numeric::Real;
use crate::base::warning::{Warning, Warnings};
use crate::fits::sulfate;
use crate::medium::Constants;
use crate::properties::conductivity::{langelier1936_ionic_strength, russell1976_ionic_strength};
use crate::sample::water::Water;

/// Which route gives the ionic strength, in the order of preference.
pub(crate) fn route(water: &Water) -> IonicStrengthRoute {
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

/// The ionic strength of `water` where it does not depend on the
/// speciation (by `route`; `None` where the ions give it), on any [`Real`], from the numbers that can be
/// sources of uncertainty: the salinity `salinity` (its value the water's)
/// on the salinity route, and on the specific-conductance, TDS and given
/// routes `input`, the number of that route (µS/cm, mg/L, mol/kg) in place
/// of the water's own (`None`: the water's own, as a constant). Russell
/// (1976), Langelier (1936) and the sea-water ratios, as on `f64`.
pub(crate) fn fixed_ionic_strength_at<R: Real>(
    water: &Water,
    route: IonicStrengthRoute,
    salinity: R,
    input: Option<R>,
) -> Option<R> {
    let f = water.fresh_options();
    let number = |own: Option<f64>| own.map(|x| input.unwrap_or(R::constant(x)));
    match route {
        IonicStrengthRoute::SpecificConductance => {
            number(f.specific_conductance_us_cm).map(russell1976_ionic_strength)
        }
        IonicStrengthRoute::Tds => number(f.tds_mg_l).map(langelier1936_ionic_strength),
        IonicStrengthRoute::Given => number(f.ionic_strength),
        IonicStrengthRoute::Salinity => Some(sulfate::seawater_ionic_strength(salinity)),
        _ => None,
    }
}

/// Ionic strength from every ion, with a monovalent ion added to carry any
/// charge imbalance; also returns the imbalance as a fraction of the total
/// charge (positive: excess cations).
pub(crate) fn ion_sum<R: Real>(k: &Constants<R>, h: R, dic: R) -> (R, R) {
    let zero = R::constant(0.0);
    let t = &k.totals;
    let d = h * h + k.k1e * h + k.k1e * k.k2e;
    let hco3_t = dic * k.k1e * h / d;
    let co3_t = dic * k.k1e * k.k2e / d;
    let hco3 = hco3_t / (k.pair_hco3 + 1.0);
    let co3 = co3_t / (k.pair_co3 + 1.0);
    let cahco3 = hco3_t - hco3;
    let ca = k.calcium_free_mol_kg;
    let hf = h * k.free_per_working;
    let oh = k.kw / h;
    let base = |total: R, ka: R| {
        if total.value() > 0.0 {
            total * ka / (ka + h)
        } else {
            zero
        }
    };
    let borate = base(t.boron_mol_kg, k.kb);
    let silicate = base(t.silicate_mol_kg, k.ksi);
    let hs = base(t.sulfide_mol_kg, k.kh2s);
    let nh4 = t.ammonia_mol_kg - base(t.ammonia_mol_kg, k.knh4);
    let so4 = t.sulfate_mol_kg * k.ks_free / (k.ks_free + hf);
    let hso4 = t.sulfate_mol_kg - so4;
    let fl = t.fluoride_mol_kg * k.kf_free / (k.kf_free + hf);
    let (mut h2po4, mut hpo4, mut po4) = (zero, zero, zero);
    if t.phosphate_mol_kg.value() > 0.0 {
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
    let charge = mono_cations + divalent_cations * 2.0
        - mono_anions
        - divalent_anions * 2.0
        - trivalent_anions * 3.0;
    let total_charge = mono_cations
        + divalent_cations * 2.0
        + mono_anions
        + divalent_anions * 2.0
        + trivalent_anions * 3.0;
    let i = (mono_cations
        + mono_anions
        + (divalent_cations + divalent_anions) * 4.0
        + trivalent_anions * 9.0
        + charge.abs())
        * 0.5;
    (
        i,
        if total_charge.value() > 0.0 {
            charge / total_charge
        } else {
            zero
        },
    )
}

pub(crate) fn add_route_warnings(water: &Water, r: IonicStrengthRoute, i: f64, w: &mut Warnings) {
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
            w.push(Warning::Text {
                code: "ionic_strength_input_unused",
                text: format!(
                    "ionic strength from {} was not used: {} comes first",
                    other.name(),
                    r.name()
                ),
            });
        }
    }
    if r == IonicStrengthRoute::AlkalinityOnly {
        w.push(Warning::Note {
            code: "ionic_strength_from_carbonate",
            text: "no major-ion analysis, conductance, TDS or ionic strength given: the ionic \
             strength is computed from the carbonate species, any calcium given and a \
             monovalent ion balancing the charge",
        });
    }
    let limit = match water.fresh_options().activity {
        crate::properties::activity::ActivityModel::ExtendedDebyeHuckel => 0.1,
        _ => 0.5,
    };
    if i > limit {
        w.push(Warning::Text {
            code: "ionic_strength_above_model_range",
            text: format!(
                "ionic strength {i:.3} mol/kg is above {limit}, where the {} activity model holds",
                water.fresh_options().activity.name()
            ),
        });
    }
    if water.composition().calcium_given() {
        return;
    }
    if water.composition().fresh_totals(1000.0).hardness_mol_kg > 0.0 {
        w.push(Warning::Note {
            code: "hardness_not_calcium",
            text: "total hardness was given without a calcium fraction: it is not taken as \
             calcium (it counts in the ionic strength only); give calcium or a calcium fraction",
        });
    }
    w.push(Warning::Note {
        code: "calcium_not_given",
        text: "calcium not given: calcite and aragonite saturation and the Langelier index are \
         not computed",
    });
}
