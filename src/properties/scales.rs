//! pH scales and the conversions between them.
//!
//! ```text
//! [H+]T   = [H+]F (1 + ST/KS)                    total scale
//! [H+]SWS = [H+]F (1 + ST/KS + FT/KF)            sea-water scale (KS, KF on the free scale)
//! aH      = fH [H+]SWS                           NBS scale in saline water (Takahashi et al. 1982)
//! ```
//! The first two are the standard definitions (Dickson 1990; Millero 2010
//! abstract). In fresh water the NBS scale is the activity of H+ itself,
//! computed with an activity coefficient.

use crate::base::error::{Error, Result};
use crate::base::field::Field;
use crate::base::numeric::Real;
use serde::Serialize;

/// A pH scale. Every pH in this crate carries one.
///
/// # Example
/// ```
/// use travertine::PhScale;
/// let s: PhScale = "seawater".parse()?;
/// assert_eq!(s, PhScale::Seawater);
/// assert_eq!(s.name(), "seawater");
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash, Serialize)]
#[serde(rename_all = "lowercase")]
#[non_exhaustive]
pub enum PhScale {
    /// Total scale: free H+ plus HSO4-.
    Total,
    /// Sea-water scale: free H+ plus HSO4- plus HF.
    Seawater,
    /// Free scale: the concentration of free H+.
    Free,
    /// NBS (activity) scale, as measured with NBS buffers.
    Nbs,
}

impl PhScale {
    /// Every scale.
    pub const ALL: [PhScale; 4] = [
        PhScale::Total,
        PhScale::Seawater,
        PhScale::Free,
        PhScale::Nbs,
    ];

    /// The plain name used on the command line and in output keys.
    ///
    /// ```
    /// # use travertine::PhScale;
    /// assert_eq!(PhScale::Nbs.name(), "nbs");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            PhScale::Total => "total",
            PhScale::Seawater => "seawater",
            PhScale::Free => "free",
            PhScale::Nbs => "nbs",
        }
    }
}

impl std::str::FromStr for PhScale {
    type Err = Error;
    fn from_str(s: &str) -> Result<Self> {
        let t = s.trim().to_ascii_lowercase();
        let t = t.as_str();
        PhScale::ALL
            .into_iter()
            .find(|p| p.name() == t || (t == "sws" && *p == PhScale::Seawater))
            .ok_or_else(|| Error::UnknownChoice {
                field: Field::PhScale,
                name: s.to_string(),
                accepted: "total, seawater, free, nbs".to_string(),
            })
    }
}

/// Apparent activity coefficient of H+ on the sea-water scale, fH, of
/// Takahashi et al. (1982), used to place saline pH on the NBS scale:
/// `pH_NBS = pH_SWS - log10(fH)`.
///
/// ```text
/// fH = 1.2948 - 0.002036 T + (0.0004607 - 0.000001475 T) S^2
/// ```
/// Coefficients from memory (unverified); intended for sea water of about
/// S 20–40. This is an approximation: a measured NBS pH in sea water also
/// carries the electrode's liquid-junction error, so every use is warned.
/// Generic over [`Real`]: on a [`crate::base::numeric::Tangent`] it gives
/// the same value with its derivatives.
///
/// ```
/// use travertine::base::numeric::{Real, Tangent};
/// use travertine::properties::scales::takahashi1982_fh;
/// let fh = takahashi1982_fh(298.15, 35.0);
/// assert!((fh - 0.7134).abs() < 1e-3);
/// let d = takahashi1982_fh(Real::constant(298.15), Tangent::<1>::source(35.0, 0));
/// assert_eq!(d.value(), fh);
/// ```
pub fn takahashi1982_fh<R: Real>(temperature_k: R, salinity: R) -> R {
    let t = temperature_k;
    (t * 0.002036).subtracted_from(1.2948)
        + (t * 0.000001475).subtracted_from(0.0004607) * salinity * salinity
}

/// The plain name, as [`PhScale::name`] gives it.
///
/// ```
/// assert_eq!(travertine::PhScale::Nbs.to_string(), "nbs");
/// ```
impl std::fmt::Display for PhScale {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}
