//! The exchange of CO2 between a solved water and the air over it: the
//! air's pCO2 and fCO2, the saturation ratio, the Schmidt number, the
//! transfer velocity and the flux. The water at equilibrium with the air
//! needs a second solve, which the flow makes
//! ([`State::with_exchange`](crate::state::State::with_exchange)).
//!
//! # Formulas
//! ```text
//! pCO2(air) = xCO2(air) · (P − pH2O)                          µatm = ppm · atm
//! fCO2(air) = pCO2(air) · φ(T, P)
//! F = k · K0 · (fCO2(water) − fCO2(air))                      positive out of the water
//!
//! F   [mmol m⁻² d⁻¹] = k [cm/h] · 0.24 [m/d per cm/h]
//!                      · K0 [mol kg⁻¹ atm⁻¹] · ρ [kg m⁻³]
//!                      · ΔfCO2 [µatm] · 10⁻⁶ [atm/µatm] · 10³ [mmol/mol]
//! k   = k600 (Sc/600)^(−n)                                    (crate::fits::transfer)
//! ```
//! P is the barometric pressure of the water's conditions (1 atm unless
//! stated or given by the elevation); pH2O the vapour pressure of water
//! at the water's temperature and salinity (Weiss & Price 1980), the air
//! at the surface being saturated with water vapour; φ the fugacity
//! coefficient of CO2 in air (Weiss 1974); K0 the solubility of CO2 of the
//! medium (Weiss 1974 in saline water, Plummer & Busenberg 1982 in fresh
//! water); ρ the density of the water. fCO2(water) is the state's fCO2.
//! All of them are the same values the state itself was solved with.

use crate::base::numeric::Real;
use crate::base::warning::Warning;
use crate::fits::transfer::{
    schmidt_exponent, schmidt_number, transfer_velocity, GasTransfer, WANNINKHOF2014_SCHMIDT_RANGE,
};
use crate::properties::scales::PhScale;
use crate::sample::air::{Air, DEFAULT_AIR_CO2_PPM, DEFAULT_AIR_CO2_YEAR};
use crate::sample::water::Medium;
use crate::state::State;

/// Metres per day in one centimetre per hour: 24 h/d ÷ 100 cm/m.
pub const M_D_PER_CM_H: f64 = 0.24;

/// The CO2 exchange of a water with the air over it.
///
/// # Units
/// pCO2 and fCO2 in µatm, transfer velocities in cm/h, the flux in
/// mmol m⁻² d⁻¹ (positive out of the water), free CO2 in mg/L.
///
/// # Example
/// ```
/// use travertine::{sample::air::Air, Conditions, Measured, Water};
/// // An invented pond at 20 °C, supersaturated in CO2, in a 4 m/s wind.
/// let pond = Water::fresh(Conditions::new(20.0, 0.2)?)?
///     .solve(Measured::ph(7.2, None)?, Measured::alkalinity_umol_kg(1500.0)?)?;
/// let air = Air::new().with_wind_m_s(4.0)?.with_co2_ppm(420.0)?;
/// let with = pond.with_exchange(&air, None)?;
/// let e = with.exchange.unwrap();
/// assert!(e.co2_saturation_ratio > 1.0);
/// assert!(e.co2_flux_mmol_m2_d.unwrap() > 0.0); // out of the water
/// assert!(e.equilibrium_ph.unwrap() > 7.2); // losing CO2 raises the pH
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub struct Exchange<R: Real = f64> {
    /// CO2 of the air, ppm (dry mole fraction), as given or the default.
    pub air_co2_ppm: R,
    /// CO2 partial pressure of the air at the water surface (moist air at
    /// the barometric pressure), µatm.
    pub air_pco2_uatm: R,
    /// CO2 fugacity of that air, µatm.
    pub air_fco2_uatm: R,
    /// The water's pCO2 over the air's: above 1 the water gives off CO2.
    pub co2_saturation_ratio: R,
    /// Schmidt number of CO2 in the water (Wanninkhof 2014).
    pub schmidt_number: R,
    /// The model of the transfer velocity used.
    pub gas_transfer: GasTransfer,
    /// The exponent n of (Sc/600)^(−n) used.
    pub schmidt_exponent: R,
    /// Transfer velocity at Schmidt number 600, cm/h (`None` without a
    /// wind speed or a k600 given).
    pub k600_cm_h: Option<R>,
    /// Transfer velocity of CO2 at the water's Schmidt number, cm/h.
    pub k_cm_h: Option<R>,
    /// CO2 flux, mmol m⁻² d⁻¹, positive out of the water.
    pub co2_flux_mmol_m2_d: Option<R>,
    /// pH of the water at equilibrium with the air, at the same
    /// alkalinity and totals, on [`Exchange::equilibrium_ph_scale`].
    pub equilibrium_ph: Option<R>,
    /// The scale of [`Exchange::equilibrium_ph`]: that of the pH given,
    /// else the medium's own (NBS in fresh water, total in saline water).
    pub equilibrium_ph_scale: PhScale,
    /// Free CO2 of the water at equilibrium with the air, mg/L as CO2.
    pub equilibrium_free_co2_mg_l: Option<R>,
}

/// The gas constants a state was solved with, kept for the exchange.
#[derive(Debug, Clone, Copy, PartialEq, Default)]
pub(crate) struct GasTerms<R: Real = f64> {
    /// CO2 solubility, mol kg⁻¹ atm⁻¹.
    pub k0: R,
    /// fCO2/pCO2 of CO2 in air.
    pub fugacity_factor: R,
    /// Water vapour pressure, atm.
    pub vapour_pressure_atm: R,
}

/// The usual pH scale of a medium: NBS in fresh water, total in saline.
pub(crate) fn medium_scale(medium: Medium) -> PhScale {
    match medium {
        Medium::Fresh => PhScale::Nbs,
        _ => PhScale::Total,
    }
}

/// The flux, mmol m⁻² d⁻¹, from k (cm/h), K0 (mol kg⁻¹ atm⁻¹), the density
/// (kg m⁻³) and the fCO2 of water and air (µatm); positive out of the water.
///
/// ```
/// use travertine::state::exchange::flux_mmol_m2_d;
/// // k 5 cm/h = 1.2 m/d; K0·ρ = 0.0391 · 998 = 39.0 mol m⁻³ atm⁻¹; ΔfCO2 600 µatm:
/// // 1.2 · 39.02 · 600e-6 mol m⁻² d⁻¹ = 28.1 mmol m⁻² d⁻¹ (computed by hand).
/// let f = flux_mmol_m2_d(5.0, 0.0391, 998.0, 1000.0, 400.0);
/// assert!((f - 28.09).abs() < 0.01);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
pub fn flux_mmol_m2_d<R: Real>(
    k_cm_h: R,
    k0_mol_kg_atm: R,
    density_kg_m3: R,
    fco2_water_uatm: R,
    fco2_air_uatm: R,
) -> R {
    let k_m_d = k_cm_h * M_D_PER_CM_H;
    let solubility_mol_m3_atm = k0_mol_kg_atm * density_kg_m3;
    let delta_atm = (fco2_water_uatm - fco2_air_uatm) * 1e-6;
    k_m_d * solubility_mol_m3_atm * delta_atm * 1e3
}

impl Exchange {
    /// The exchange of `state` with `air`, all but the equilibrium water,
    /// and the cautions that go with it.
    pub(crate) fn of(state: &State, air: &Air, scale: PhScale) -> (Exchange, Vec<Warning>) {
        let mut notes = Vec::new();
        let conditions = state.water_sample().conditions();
        let (t, s) = (state.temperature_c, state.salinity);

        // The air.
        if !air.co2_stated() {
            notes.push(Warning::Text {
                code: "air_co2_default",
                text: format!(
                    "CO2 of the air not given: {DEFAULT_AIR_CO2_PPM} ppm used, the global mean \
                     at the surface in {DEFAULT_AIR_CO2_YEAR} (NOAA Global Monitoring \
                     Laboratory; from memory, unverified); the air over land varies by tens of \
                     ppm, so a local value is better"
                ),
            });
        }
        if !conditions.air_pressure_stated() {
            notes.push(Warning::Note {
                code: "barometric_default",
                text: "barometric pressure not given: 1 atm (sea level) used for the air pCO2; \
                       give the barometric pressure or the elevation (at 1000 m the air holds \
                       about 11 % less CO2)",
            });
        }
        if state.pressure_dbar > 0.0 {
            notes.push(Warning::Note {
                code: "exchange_below_surface",
                text: "the water is below the surface: its exchange figures are those it \
                       would have at the surface, with the air",
            });
        }

        // The transfer velocity.
        let mut extrapolated = Vec::new();
        WANNINKHOF2014_SCHMIDT_RANGE.check_for("Schmidt number of CO2", t, s, &mut extrapolated);
        notes.extend(extrapolated);
        let model = air.model_in(state.medium);
        let wind = air.wind_m_s();
        if let (Some(u), Some((lo, hi))) = (wind, model.wind_range_m_s()) {
            if !(lo..=hi).contains(&u) {
                notes.push(Warning::Text {
                    code: "gas_transfer_wind_extrapolated",
                    text: format!(
                        "the transfer velocity of {model} is extrapolated: published for winds \
                         of {lo} to {hi} m/s at 10 m (from memory, unverified), used at {u} m/s"
                    ),
                });
            }
        }
        if let (Some(a), Some((lo, hi))) = (air.lake_area_km2(), model.area_range_km2()) {
            if !(lo..=hi).contains(&a) {
                notes.push(Warning::Text {
                    code: "lake_area_extrapolated",
                    text: format!(
                        "the transfer velocity of {model} is extrapolated: fitted to lakes of \
                         {lo} to {hi} km2 (from memory, unverified), used for {a} km2"
                    ),
                });
            }
        }
        if let (Some(a), None) = (air.lake_area_km2(), model.area_range_km2()) {
            notes.push(Warning::Text {
                code: "lake_area_unused",
                text: format!(
                    "the lake area given, {a} km2, is not used: the transfer velocity is that of \
                     {model}, which does not depend on it (vachon-prairie2013 does)"
                ),
            });
        }
        let exchange = Exchange::figures_on(state, air, scale, wind);
        if exchange.k600_cm_h.is_none() {
            if air.model().is_some_and(GasTransfer::needs_wind) {
                notes.push(Warning::Text {
                    code: "gas_transfer_unused",
                    text: format!(
                        "the model {model} was chosen, but no wind speed is given: no transfer \
                         velocity and no flux; give the wind speed at 10 m"
                    ),
                });
            } else {
                notes.push(Warning::Note {
                    code: "transfer_velocity_not_given",
                    text: "no wind speed and no k600 given: the transfer velocity and the CO2 \
                           flux are not computed; give the wind speed at 10 m, or k600",
                });
            }
        }
        (exchange, notes)
    }
}

impl<R: Real> Exchange<R> {
    /// The figures of the exchange of `state` with `air` on any [`Real`],
    /// all but the water at equilibrium with the air, as [`Exchange::of`]
    /// gives them without its cautions: `wind_m_s` is the air's wind speed
    /// (with its derivatives where it is a source), `scale` the scale of
    /// the equilibrium pH. On `f64`, the same numbers as [`Exchange::of`]
    /// bit for bit (it computes them here).
    pub(crate) fn figures_on(
        state: &State<R>,
        air: &Air,
        scale: PhScale,
        wind_m_s: Option<R>,
    ) -> Exchange<R> {
        let gas = state.gas_terms();
        let air_co2_ppm = R::constant(air.co2_ppm());
        let p_air = state.water_sample().conditions().air_pressure_atm();
        let air_pco2_uatm = air_co2_ppm * gas.vapour_pressure_atm.subtracted_from(p_air);
        let air_fco2_uatm = air_pco2_uatm * gas.fugacity_factor;
        let sc = schmidt_number(state.temperature_c, state.salinity);
        let model = air.model_in(state.medium);
        let k600_cm_h = match model {
            GasTransfer::Given => air.k600_cm_h().map(R::constant),
            m => wind_m_s.and_then(|u| m.k600_cm_h(u, air.lake_area_km2())),
        };
        // The exponent changes by a step at a wind speed (no derivative).
        let n = schmidt_exponent(model, wind_m_s.map(|u| u.value()));
        let k_cm_h = k600_cm_h.map(|k6| transfer_velocity(k6, sc, n));
        let co2_flux_mmol_m2_d = k_cm_h.map(|k| {
            flux_mmol_m2_d(
                k,
                gas.k0,
                state.density_kg_m3,
                state.fco2_uatm,
                air_fco2_uatm,
            )
        });
        Exchange {
            air_co2_ppm,
            air_pco2_uatm,
            air_fco2_uatm,
            co2_saturation_ratio: state.pco2_uatm / air_pco2_uatm,
            schmidt_number: sc,
            gas_transfer: model,
            schmidt_exponent: R::constant(n),
            k600_cm_h,
            k_cm_h,
            co2_flux_mmol_m2_d,
            equilibrium_ph: None,
            equilibrium_ph_scale: scale,
            equilibrium_free_co2_mg_l: None,
        }
    }
}
