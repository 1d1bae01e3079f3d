//! The pair taken from the carbonate parameters a row gives.

use crate::sample::measured::Parameter;

/// The order in which a row's measured parameters are taken for its pair:
/// the first two present that can be used together. Alkalinity and DIC are
/// conservative and measured most precisely; then pH; then the gas and the
/// single species.
/// It is the order of [`Parameter::ALL`].
pub(crate) const RANKING: [Parameter; 9] = Parameter::ALL;

/// The index of a parameter in [`RANKING`].
pub(crate) fn rank(p: Parameter) -> usize {
    RANKING.iter().position(|q| *q == p).unwrap_or(0)
}

/// The pair taken from the parameters present (by rank), if any.
pub(crate) fn choose_pair(present: &[bool; 9]) -> Option<(Parameter, Parameter)> {
    for i in 0..9 {
        if !present[i] {
            continue;
        }
        for j in i + 1..9 {
            if present[j] && RANKING[i].pairs_with(RANKING[j]) {
                return Some((RANKING[i], RANKING[j]));
            }
        }
    }
    None
}
