//! The published fits: pure functions of temperature, salinity and
//! pressure, each a named value with its published range, and the choice of
//! fits a water carries.
//!
//! Each acid system, gas and mineral has its own file with one function per
//! published fit. The medium layer ([`crate::medium`]) evaluates them into
//! one set of constants.

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
