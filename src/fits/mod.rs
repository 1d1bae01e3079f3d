//! The published fits: pure functions of temperature, salinity and
//! pressure, each a named value with its published range, and the choice of
//! fits a water carries.
//!
//! Each acid system, gas and mineral has its own file with one function per
//! published fit. The medium layer ([`crate::medium`]) evaluates them into
//! one set of constants.
//!
//! Every fit is generic over [`Real`](crate::base::numeric::Real) in its
//! numeric arguments (temperature, salinity, pressure, wind): on `f64` it
//! gives the constant, on a [`Tangent`](crate::base::numeric::Tangent) the
//! same value, bit for bit, and its derivatives with respect to the
//! tangent's sources. The choices of fit (names, ranges, [`Fits`]) stay
//! plain values.
//!
//! ```
//! use travertine::base::numeric::{Real, Tangent};
//! use travertine::fits::boron::dickson1990_ln_kb;
//! let t = Tangent::<2>::source(298.15, 0); // d/dT
//! let s = Tangent::<2>::source(35.0, 1); // d/dS
//! let l = dickson1990_ln_kb(t, s);
//! assert_eq!(l.value(), dickson1990_ln_kb(298.15, 35.0));
//! assert!(l.d[0] > 0.0); // boric acid is stronger in warmer water
//! ```

/// `FromStr` for a fit enum with `ALL` and `name()`: the author-year name,
/// case-insensitive, or an error listing the accepted names.
macro_rules! fit_from_str {
    ($ty:ty, $constant:expr) => {
        impl std::str::FromStr for $ty {
            type Err = crate::base::error::Error;
            fn from_str(s: &str) -> crate::base::error::Result<Self> {
                let wanted = s.trim().to_ascii_lowercase();
                <$ty>::ALL
                    .into_iter()
                    .find(|f| f.name() == wanted)
                    .ok_or_else(|| crate::base::error::Error::UnknownFit {
                        constant: $constant,
                        name: s.to_string(),
                        accepted: <$ty>::ALL.map(|f| f.name()).join(", "),
                    })
            }
        }
    };
}

pub mod ammonia;
pub mod boron;
pub mod carbonic;
mod choice;
pub mod fluoride;
pub mod gas;
pub mod kw;
pub mod minerals;
mod names;
pub mod nutrients;
pub mod pressure;
pub mod sulfate;
pub mod sulfide;
pub mod thermodynamic;
pub mod transfer;

pub use crate::base::range::FitRange;
pub use boron::BoronTotalFit;
pub use carbonic::CarbonicFit;
pub use choice::{Fits, FitsUsed};
pub use fluoride::FluorideFit;
pub use names::FitName;
pub use sulfate::BisulfateFit;
pub use transfer::GasTransfer;
