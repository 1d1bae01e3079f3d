//! The choice of fits a water carries, and the record of the fits behind a result.

use super::{BisulfateFit, BoronTotalFit, CarbonicFit, FitName, FluorideFit};
use serde::Serialize;

/// The choice of published fits. `carbonic: None` chooses automatically:
/// Lueker et al. (2000) inside its window (S 19–43, t 2–35 °C), Millero et
/// al. (2006) outside it.
///
/// # Example
/// ```
/// use travertine::fits::{CarbonicFit, Fits};
/// let fits = Fits::default().with_carbonic(CarbonicFit::Roy1993);
/// assert_eq!(fits.carbonic, Some(CarbonicFit::Roy1993));
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Default, Serialize)]
#[non_exhaustive]
pub struct Fits {
    /// K1 and K2 of carbonic acid; `None` for the automatic choice.
    pub carbonic: Option<CarbonicFit>,
    /// Total boron from salinity.
    pub boron_total: BoronTotalFit,
    /// KF of hydrogen fluoride.
    pub fluoride: FluorideFit,
    /// KS of bisulfate.
    pub bisulfate: BisulfateFit,
}

impl Fits {
    /// With a carbonic acid fit.
    ///
    /// ```
    /// # use travertine::fits::{CarbonicFit, Fits};
    /// assert!(Fits::default().with_carbonic(CarbonicFit::Millero2006).carbonic.is_some());
    /// ```
    #[must_use]
    pub fn with_carbonic(mut self, fit: CarbonicFit) -> Self {
        self.carbonic = Some(fit);
        self
    }

    /// With a total-boron ratio.
    ///
    /// ```
    /// # use travertine::fits::{BoronTotalFit, Fits};
    /// let f = Fits::default().with_boron_total(BoronTotalFit::Uppstrom1974);
    /// assert_eq!(f.boron_total, BoronTotalFit::Uppstrom1974);
    /// ```
    #[must_use]
    pub fn with_boron_total(mut self, fit: BoronTotalFit) -> Self {
        self.boron_total = fit;
        self
    }

    /// With a fluoride fit.
    ///
    /// ```
    /// # use travertine::fits::{FluorideFit, Fits};
    /// let f = Fits::default().with_fluoride(FluorideFit::DicksonRiley1979);
    /// assert_eq!(f.fluoride, FluorideFit::DicksonRiley1979);
    /// ```
    #[must_use]
    pub fn with_fluoride(mut self, fit: FluorideFit) -> Self {
        self.fluoride = fit;
        self
    }

    /// The carbonic fit used at these conditions.
    ///
    /// ```
    /// # use travertine::fits::{CarbonicFit, Fits};
    /// assert_eq!(Fits::default().carbonic_at(25.0, 35.0), CarbonicFit::Lueker2000);
    /// assert_eq!(Fits::default().carbonic_at(25.0, 5.0), CarbonicFit::Millero2006);
    /// ```
    pub fn carbonic_at(&self, temperature_c: f64, salinity: f64) -> CarbonicFit {
        self.carbonic.unwrap_or_else(|| {
            if CarbonicFit::Lueker2000
                .range()
                .contains(temperature_c, salinity)
            {
                CarbonicFit::Lueker2000
            } else {
                CarbonicFit::Millero2006
            }
        })
    }
}

/// The names of the fits and methods behind a result, by constant.
/// Serialised as the `constants` object of the JSON output, each value the
/// author-year name of its [`FitName`].
///
/// ```
/// use travertine::{Conditions, Water};
/// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
/// assert_eq!(k.fits_used().carbonic, "lueker2000");
/// assert_eq!(k.fits_used().calcium.as_str(), "riley-tongudai1967");
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[non_exhaustive]
pub struct FitsUsed {
    /// CO2 solubility.
    pub k0: FitName,
    /// CO2 fugacity coefficient.
    pub fugacity: FitName,
    /// Water vapour pressure.
    pub vapour_pressure: FitName,
    /// K1 and K2 of carbonic acid.
    pub carbonic: FitName,
    /// KB of boric acid.
    pub boric: FitName,
    /// Total boron.
    pub boron_total: FitName,
    /// KW of water (serialised as `water`, its key in the JSON).
    #[serde(rename = "water")]
    pub kw: FitName,
    /// KS of bisulfate.
    pub bisulfate: FitName,
    /// Total sulfate.
    pub sulfate_total: FitName,
    /// KF of hydrogen fluoride.
    pub fluoride: FitName,
    /// Total fluoride.
    pub fluoride_total: FitName,
    /// Phosphoric and silicic acids.
    pub phosphate_silicate: FitName,
    /// Ammonium.
    pub ammonium: FitName,
    /// Hydrogen sulfide.
    pub sulfide: FitName,
    /// Calcite and aragonite solubility.
    pub minerals: FitName,
    /// Calcium.
    pub calcium: FitName,
    /// Pressure corrections.
    pub pressure: FitName,
    /// The NBS scale.
    pub nbs_scale: FitName,
    /// Density for per-litre units.
    pub density: FitName,
}
