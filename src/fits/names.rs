//! The names of the published fits and methods reported with a result.
//!
//! A result carries one [`FitName`] per constant in [`super::FitsUsed`]: a
//! one-byte value rather than a string, so that a result stays small and
//! cheap to copy, serialised and displayed as the author-year name.

use super::boron::BoronTotalFit;
use super::carbonic::CarbonicFit;
use super::fluoride::FluorideFit;
use super::sulfate::BisulfateFit;
use crate::properties::activity::ActivityModel;
use serde::{Serialize, Serializer};
use std::fmt;

macro_rules! fit_names {
    ($($(#[$doc:meta])* $variant:ident => $name:literal,)*) => {
        /// A published fit, method or source behind a reported constant,
        /// shown and serialised as its author-year name (for example
        /// `lueker2000`).
        ///
        /// ```
        /// use travertine::fits::FitName;
        /// assert_eq!(FitName::Lueker2000.as_str(), "lueker2000");
        /// assert_eq!(FitName::Lueker2000, "lueker2000");
        /// assert_eq!(FitName::Measured.to_string(), "measured");
        /// ```
        #[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
        #[non_exhaustive]
        pub enum FitName {
            $($(#[$doc])* $variant,)*
        }

        impl FitName {
            /// Every name, in declaration order.
            ///
            /// ```
            /// # use travertine::fits::FitName;
            /// assert!(FitName::ALL.contains(&FitName::Mucci1983));
            /// ```
            pub const ALL: &'static [FitName] = &[$(FitName::$variant,)*];

            /// The author-year name.
            ///
            /// ```
            /// # use travertine::fits::FitName;
            /// assert_eq!(FitName::DicksonMillero1987.as_str(), "dickson-millero1987");
            /// ```
            pub fn as_str(self) -> &'static str {
                match self {
                    $(FitName::$variant => $name,)*
                }
            }
        }
    };
}

fit_names! {
    /// Weiss (1974): K0 and the CO2 fugacity coefficient.
    Weiss1974 => "weiss1974",
    /// Weiss & Price (1980): water vapour pressure.
    WeissPrice1980 => "weiss-price1980",
    /// Lueker, Dickson & Keeling (2000): K1, K2.
    Lueker2000 => "lueker2000",
    /// Millero et al. (2006): K1, K2.
    Millero2006 => "millero2006",
    /// Roy et al. (1993): K1, K2.
    Roy1993 => "roy1993",
    /// Dickson & Millero (1987), the refit of Mehrbach et al. (1973): K1, K2.
    DicksonMillero1987 => "dickson-millero1987",
    /// Dickson (1990): KB, KS.
    Dickson1990 => "dickson1990",
    /// Lee et al. (2010): total boron.
    Lee2010 => "lee2010",
    /// Uppström (1974): total boron.
    Uppstrom1974 => "uppstrom1974",
    /// The total was measured and given.
    Measured => "measured",
    /// Millero (1995): KW, phosphate and silicate, pressure corrections.
    Millero1995 => "millero1995",
    /// Morris & Riley (1966): total sulfate.
    MorrisRiley1966 => "morris-riley1966",
    /// Perez & Fraga (1987): KF.
    PerezFraga1987 => "perez-fraga1987",
    /// Dickson & Riley (1979): KF.
    DicksonRiley1979 => "dickson-riley1979",
    /// Riley (1965): total fluoride.
    Riley1965 => "riley1965",
    /// Johansson & Wedborg (1980): ammonium.
    JohanssonWedborg1980 => "johansson-wedborg1980",
    /// Millero, Plese & Fernandez (1988): hydrogen sulfide.
    Millero1988 => "millero1988",
    /// Mucci (1983): calcite and aragonite.
    Mucci1983 => "mucci1983",
    /// Riley & Tongudai (1967): calcium.
    RileyTongudai1967 => "riley-tongudai1967",
    /// Takahashi et al. (1982): the H+ activity coefficient for the NBS scale.
    Takahashi1982 => "takahashi1982",
    /// Millero & Poisson (1981), EOS-80: density.
    MilleroPoisson1981 => "millero-poisson1981",
    /// Plummer & Busenberg (1982): fresh-water KH, K1, K2 and minerals.
    PlummerBusenberg1982 => "plummer-busenberg1982",
    /// Dickson (1990) at salinity 0 (fresh water).
    Dickson1990AtS0 => "dickson1990 at S 0",
    /// Dickson & Riley (1979) at salinity 0 (fresh water).
    DicksonRiley1979AtS0 => "dickson-riley1979 at S 0",
    /// Millero (1995) at salinity 0 (fresh water).
    Millero1995AtS0 => "millero1995 at S 0",
    /// Millero, Plese & Fernandez (1988) at salinity 0 (fresh water).
    Millero1988AtS0 => "millero1988 at S 0",
    /// Harned & Owen (1958): fresh-water KW.
    HarnedOwen1958 => "harned-owen1958",
    /// Emerson et al. (1975): fresh-water ammonium.
    Emerson1975 => "emerson1975",
    /// The Davies equation (activity coefficients).
    Davies => "davies",
    /// The extended Debye–Hückel equation (activity coefficients).
    ExtendedDebyeHuckel => "extended-debye-huckel",
    /// Nothing given and nothing assumed (a total left at zero).
    NoneGiven => "none",
}

impl fmt::Display for FitName {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        f.write_str(self.as_str())
    }
}

impl Serialize for FitName {
    fn serialize<S: Serializer>(&self, s: S) -> std::result::Result<S::Ok, S::Error> {
        s.serialize_str(self.as_str())
    }
}

impl PartialEq<str> for FitName {
    fn eq(&self, other: &str) -> bool {
        self.as_str() == other
    }
}

impl PartialEq<&str> for FitName {
    fn eq(&self, other: &&str) -> bool {
        self.as_str() == *other
    }
}

impl From<CarbonicFit> for FitName {
    fn from(fit: CarbonicFit) -> Self {
        match fit {
            CarbonicFit::Lueker2000 => FitName::Lueker2000,
            CarbonicFit::Millero2006 => FitName::Millero2006,
            CarbonicFit::Roy1993 => FitName::Roy1993,
            CarbonicFit::DicksonMillero1987 => FitName::DicksonMillero1987,
        }
    }
}

impl From<BoronTotalFit> for FitName {
    fn from(fit: BoronTotalFit) -> Self {
        match fit {
            BoronTotalFit::Lee2010 => FitName::Lee2010,
            BoronTotalFit::Uppstrom1974 => FitName::Uppstrom1974,
        }
    }
}

impl From<FluorideFit> for FitName {
    fn from(fit: FluorideFit) -> Self {
        match fit {
            FluorideFit::PerezFraga1987 => FitName::PerezFraga1987,
            FluorideFit::DicksonRiley1979 => FitName::DicksonRiley1979,
        }
    }
}

impl From<BisulfateFit> for FitName {
    fn from(fit: BisulfateFit) -> Self {
        match fit {
            BisulfateFit::Dickson1990 => FitName::Dickson1990,
        }
    }
}

impl From<ActivityModel> for FitName {
    fn from(model: ActivityModel) -> Self {
        match model {
            ActivityModel::Davies => FitName::Davies,
            ActivityModel::ExtendedDebyeHuckel => FitName::ExtendedDebyeHuckel,
        }
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn names_are_unique_and_match_the_fit_enums() {
        let mut seen = std::collections::HashSet::new();
        for n in FitName::ALL {
            assert!(seen.insert(n.as_str()), "{} twice", n.as_str());
        }
        for f in CarbonicFit::ALL {
            assert_eq!(FitName::from(f).as_str(), f.name());
        }
        for f in BoronTotalFit::ALL {
            assert_eq!(FitName::from(f).as_str(), f.name());
        }
        for f in FluorideFit::ALL {
            assert_eq!(FitName::from(f).as_str(), f.name());
        }
        assert_eq!(
            FitName::from(BisulfateFit::Dickson1990).as_str(),
            BisulfateFit::Dickson1990.name()
        );
        for m in [ActivityModel::Davies, ActivityModel::ExtendedDebyeHuckel] {
            assert_eq!(FitName::from(m).as_str(), m.name());
        }
    }
}
