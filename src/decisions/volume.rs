//! The volume of water a dose treats. The volume, or a pond's area and
//! mean depth, are inputs of a sample like any other
//! ([`crate::sample::inputs::Input::PondVolume`] and its neighbours, read in
//! the units of the trade); [`crate::sample::Sample::volume_treated_m3`]
//! gives the volume in m³.

use crate::base::error::{check_range, Result};
use crate::base::field::Field;

/// Kilograms in one avoirdupois pound: 0.453 592 37 exactly (NIST
/// Handbook 44; common practice).
pub const KG_PER_POUND: f64 = 0.453_592_37;

/// A volume of water, m³.
///
/// ```
/// use travertine::decisions::volume::Volume;
/// assert_eq!(Volume::from_m3(9600.0)?.m3(), 9600.0);
/// assert!(Volume::from_m3(-1.0).is_err());
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq)]
#[non_exhaustive]
pub struct Volume {
    m3: f64,
}

impl Volume {
    /// A volume in m³.
    ///
    /// # Errors
    /// [`crate::Error::OutOfRange`] unless positive and finite.
    pub fn from_m3(m3: f64) -> Result<Self> {
        check_range(Field::Volume, m3, 1e-9, 1e12, " m³")?;
        Ok(Volume { m3 })
    }

    /// The volume, m³.
    pub fn m3(self) -> f64 {
        self.m3
    }
}
