//! What a water holds besides its conditions: the measured totals of the
//! acid systems and the major ions, and the totals they give.

use crate::base::error::{check_range, Result};
use crate::base::field::Field;
use crate::base::numeric::Real;
use crate::base::units::Amount;
use crate::fits::BoronTotalFit;
use serde::Serialize;

/// Highest accepted total of a minor acid system (phosphate, silicate,
/// ammonia, sulfide), mol/kg.
pub const MINOR_TOTAL_MAX_MOL_KG: f64 = 0.01;

/// Measured totals of the acid systems and calcium. Anything not given is
/// zero (phosphate, silicate, ammonia, sulfide) or follows from salinity
/// (boron, sulfate, fluoride, calcium).
///
/// # Example
/// ```
/// use travertine::{units::Amount, sample::Composition};
/// let c = Composition::default()
///     .with_phosphate(Amount::PerKg(2e-6))?
///     .with_silicate(Amount::PerKg(40e-6))?;
/// assert!(!c.calcium_given());
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Default, Serialize)]
#[non_exhaustive]
pub struct Composition {
    phosphate: Option<Amount>,
    silicate: Option<Amount>,
    ammonia: Option<Amount>,
    sulfide: Option<Amount>,
    boron: Option<Amount>,
    sulfate: Option<Amount>,
    fluoride: Option<Amount>,
    calcium: Option<Amount>,
    magnesium: Option<Amount>,
    sodium: Option<Amount>,
    potassium: Option<Amount>,
    chloride: Option<Amount>,
    hardness: Option<Amount>,
}

/// An amount in mol/kg at a density: exactly [`Amount::mol_kg`]
/// (`v · 1000 / ρ` for a per-litre amount, the same operations in the same
/// order), generic over [`Real`] in the density. The amount itself is a
/// constant.
#[inline]
fn mol_kg_at<R: Real>(a: Amount, density_kg_m3: R) -> R {
    match a {
        Amount::PerKg(v) => R::constant(v),
        Amount::PerLitre(v) => density_kg_m3.under(v * 1000.0),
    }
}

fn checked(field: Field, a: Amount, min: f64, max: f64) -> Result<Option<Amount>> {
    check_range(field, a.raw(), min, max, " mol/kg")?;
    Ok(Some(a))
}

macro_rules! setter {
    ($(#[$doc:meta])* $fn:ident, $field:ident, $name:expr, $min:expr, $max:expr) => {
        $(#[$doc])*
        ///
        /// # Errors
        /// [`crate::Error::OutOfRange`] for a negative amount or one above the accepted maximum.
        pub fn $fn(mut self, amount: Amount) -> Result<Self> {
            self.$field = checked($name, amount, $min, $max)?;
            Ok(self)
        }
    };
}

impl Composition {
    setter!(
        /// With total phosphate.
        with_phosphate, phosphate, Field::Phosphate, 0.0, MINOR_TOTAL_MAX_MOL_KG);
    setter!(
        /// With total silicate.
        with_silicate, silicate, Field::Silicate, 0.0, MINOR_TOTAL_MAX_MOL_KG);
    setter!(
        /// With total ammonia (NH3 + NH4+).
        with_ammonia, ammonia, Field::Ammonia, 0.0, MINOR_TOTAL_MAX_MOL_KG);
    setter!(
        /// With total sulfide (H2S + HS-).
        with_sulfide, sulfide, Field::Sulfide, 0.0, MINOR_TOTAL_MAX_MOL_KG);
    setter!(
        /// With measured total boron instead of the salinity ratio.
        with_boron, boron, Field::BoronTotal, 0.0, 0.01);
    setter!(
        /// With measured total sulfate instead of the salinity ratio.
        with_sulfate, sulfate, Field::Sulfate, 0.0, 0.1);
    setter!(
        /// With measured total fluoride instead of the salinity ratio.
        with_fluoride, fluoride, Field::Fluoride, 0.0, 0.01);
    setter!(
        /// With measured calcium instead of the salinity ratio.
        with_calcium, calcium, Field::Calcium, 1e-9, 0.1);
    setter!(
        /// With magnesium (fresh water: counted in the ionic strength).
        with_magnesium, magnesium, Field::Magnesium, 0.0, 0.1);
    setter!(
        /// With sodium (fresh water: counted in the ionic strength).
        with_sodium, sodium, Field::Sodium, 0.0, 1.0);
    setter!(
        /// With potassium (fresh water: counted in the ionic strength).
        with_potassium, potassium, Field::Potassium, 0.0, 0.1);
    setter!(
        /// With chloride (fresh water: counted in the ionic strength).
        with_chloride, chloride, Field::Chloride, 0.0, 1.0);
    setter!(
        /// With total hardness (Ca + Mg, mol/kg) whose split is unknown: it is
        /// counted in the ionic strength as divalent cations, and never taken
        /// as calcium.
        with_unassigned_hardness, hardness, Field::Hardness, 0.0, 0.1);

    /// Whether any major ion besides calcium was given (Mg, Na, K, Cl or
    /// SO4; fresh water: the ionic strength is then computed from the ions).
    ///
    /// ```
    /// # use travertine::{units::Amount, sample::Composition};
    /// assert!(Composition::default().with_sodium(Amount::PerKg(1e-3))?.major_ions_given());
    /// assert!(!Composition::default().major_ions_given());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn major_ions_given(&self) -> bool {
        // Calcium or hardness alone is not an ion analysis: they take part
        // in the speciation, but the ionic strength then comes from the
        // next route (conductance, TDS, ...).
        [
            self.magnesium,
            self.sodium,
            self.potassium,
            self.chloride,
            self.sulfate,
        ]
        .iter()
        .any(Option::is_some)
    }

    /// The totals for fresh water: nothing follows from salinity; what was
    /// not given is zero. Generic over [`Real`] in the density (used for
    /// per-litre amounts); the amounts themselves are constants.
    ///
    /// ```
    /// # use travertine::{units::Amount, sample::Composition};
    /// use travertine::base::numeric::{Real, Tangent};
    /// let c = Composition::default().with_calcium(Amount::PerLitre(1e-3))?;
    /// let t = c.fresh_totals(998.0);
    /// assert!((t.calcium_mol_kg - 1e-3 / 0.998).abs() < 1e-12);
    /// assert_eq!(t.boron_mol_kg, 0.0);
    /// // d[Ca]/dρ = −[Ca]/ρ for a per-litre amount:
    /// let d = c.fresh_totals(Tangent::<1>::source(998.0, 0));
    /// assert_eq!(d.calcium_mol_kg.value(), t.calcium_mol_kg);
    /// assert!((d.calcium_mol_kg.d[0] + t.calcium_mol_kg / 998.0).abs() < 1e-18);
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn fresh_totals<R: Real>(&self, density_kg_m3: R) -> Totals<R> {
        let get = |a: Option<Amount>| a.map_or(R::constant(0.0), |a| mol_kg_at(a, density_kg_m3));
        Totals {
            boron_mol_kg: get(self.boron),
            sulfate_mol_kg: get(self.sulfate),
            fluoride_mol_kg: get(self.fluoride),
            phosphate_mol_kg: get(self.phosphate),
            silicate_mol_kg: get(self.silicate),
            ammonia_mol_kg: get(self.ammonia),
            sulfide_mol_kg: get(self.sulfide),
            calcium_mol_kg: get(self.calcium),
            magnesium_mol_kg: get(self.magnesium),
            sodium_mol_kg: get(self.sodium),
            potassium_mol_kg: get(self.potassium),
            chloride_mol_kg: get(self.chloride),
            hardness_mol_kg: get(self.hardness),
        }
    }

    /// Whether calcium was measured.
    ///
    /// ```
    /// # use travertine::{units::Amount, sample::Composition};
    /// assert!(Composition::default().with_calcium(Amount::PerKg(0.01))?.calcium_given());
    /// # Ok::<(), travertine::Error>(())
    /// ```
    pub fn calcium_given(&self) -> bool {
        self.calcium.is_some()
    }

    /// Whether total boron was measured.
    ///
    /// ```
    /// # use travertine::sample::composition::Composition;
    /// assert!(!Composition::default().boron_given());
    /// ```
    pub fn boron_given(&self) -> bool {
        self.boron.is_some()
    }

    /// Whether total sulfate was measured.
    ///
    /// ```
    /// # use travertine::sample::composition::Composition;
    /// assert!(!Composition::default().sulfate_given());
    /// ```
    pub fn sulfate_given(&self) -> bool {
        self.sulfate.is_some()
    }

    /// Whether total fluoride was measured.
    ///
    /// ```
    /// # use travertine::sample::composition::Composition;
    /// assert!(!Composition::default().fluoride_given());
    /// ```
    pub fn fluoride_given(&self) -> bool {
        self.fluoride.is_some()
    }

    /// The totals for saline water of practical salinity `salinity`, with
    /// the density used for per-litre amounts. Generic over [`Real`] in the
    /// density; the salinity is a plain number for now, so the totals that
    /// follow from it (boron, sulfate, fluoride, calcium not given) are
    /// constants without derivatives.
    ///
    /// ```
    /// # use travertine::{fits::BoronTotalFit, sample::Composition};
    /// use travertine::base::numeric::{Real, Tangent};
    /// let t = Composition::default().saline_totals(35.0, 1023.3, BoronTotalFit::Lee2010);
    /// assert!((t.boron_mol_kg * 1e6 - 432.5).abs() < 0.05);
    /// let s = Tangent::<1>::constant(35.0);
    /// let d = Composition::default().saline_totals(s, Tangent::<1>::source(1023.3, 0), BoronTotalFit::Lee2010);
    /// assert_eq!(d.boron_mol_kg.value(), t.boron_mol_kg);
    /// ```
    pub fn saline_totals<R: Real>(
        &self,
        salinity: R,
        density_kg_m3: R,
        boron: BoronTotalFit,
    ) -> Totals<R> {
        // A measured total is taken as given (its amount carries no
        // derivatives but the density's); one that follows from salinity
        // carries the salinity's.
        let get =
            |a: Option<Amount>, default: R| a.map_or(default, |a| mol_kg_at(a, density_kg_m3));
        use crate::fits::{fluoride, minerals, sulfate};
        let zero = R::constant(0.0);
        Totals {
            boron_mol_kg: get(self.boron, boron.total_mol_kg(salinity)),
            sulfate_mol_kg: get(
                self.sulfate,
                sulfate::morris_riley1966_total_mol_kg(salinity),
            ),
            fluoride_mol_kg: get(self.fluoride, fluoride::riley1965_total_mol_kg(salinity)),
            phosphate_mol_kg: get(self.phosphate, zero),
            silicate_mol_kg: get(self.silicate, zero),
            ammonia_mol_kg: get(self.ammonia, zero),
            sulfide_mol_kg: get(self.sulfide, zero),
            calcium_mol_kg: get(
                self.calcium,
                minerals::riley_tongudai1967_calcium_mol_kg(salinity),
            ),
            magnesium_mol_kg: zero,
            sodium_mol_kg: zero,
            potassium_mol_kg: zero,
            chloride_mol_kg: zero,
            hardness_mol_kg: zero,
        }
    }
}

/// Totals of the acid systems and calcium, mol/kg-soln: plain numbers
/// (`Totals`, i.e. `Totals<f64>`), or numbers with derivatives
/// (`Totals<Tangent<N>>`, from [`Composition::fresh_totals`] or
/// [`Composition::saline_totals`] given a density with derivatives).
///
/// ```
/// use travertine::{Conditions, Water};
/// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
/// assert!((k.totals().sulfate_mol_kg - 0.02824).abs() < 5e-6);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Default)]
#[non_exhaustive]
pub struct Totals<R: Real = f64> {
    /// Total boron.
    pub boron_mol_kg: R,
    /// Total sulfate.
    pub sulfate_mol_kg: R,
    /// Total fluoride.
    pub fluoride_mol_kg: R,
    /// Total phosphate.
    pub phosphate_mol_kg: R,
    /// Total silicate.
    pub silicate_mol_kg: R,
    /// Total ammonia (NH3 + NH4+).
    pub ammonia_mol_kg: R,
    /// Total sulfide (H2S + HS-).
    pub sulfide_mol_kg: R,
    /// Calcium.
    pub calcium_mol_kg: R,
    /// Magnesium (fresh water, for the ionic strength).
    pub magnesium_mol_kg: R,
    /// Sodium (fresh water).
    pub sodium_mol_kg: R,
    /// Potassium (fresh water).
    pub potassium_mol_kg: R,
    /// Chloride (fresh water).
    pub chloride_mol_kg: R,
    /// Hardness whose split between Ca and Mg is unknown (fresh water).
    pub hardness_mol_kg: R,
}
