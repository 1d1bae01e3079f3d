//! Air–water gas exchange: the Schmidt number of CO2 and the transfer
//! velocity k600 of each published model.
//!
//! The transfer velocity of CO2 at the water's own Schmidt number is
//!
//! ```text
//! k = k600 (Sc / 600)^(−n),   n = 2/3 below 3.7 m/s of wind (a smooth surface),
//!                             n = 1/2 at 3.7 m/s and above (a rough, wavy surface)
//! ```
//!
//! The exponent rule is the one of Jähne et al. (1987), in the form lake
//! studies commonly use it (for example Guérin et al. 2007); common
//! practice, the 3.7 m/s threshold from memory (unverified). A k600 given
//! directly without a wind speed (a river, a reaeration study) takes
//! n = 1/2, the value for the turbulent surfaces it is usually measured
//! on (common practice). Wanninkhof (2014) gives k itself with n = 1/2 at
//! every wind.

use super::FitRange;
use crate::base::numeric::Real;

/// Published range of the Wanninkhof (2014) Schmidt-number polynomials:
/// −2 to 40 °C; fresh water (salinity 0) and sea water (salinity 35),
/// between which the crate interpolates linearly in salinity. The range is
/// from memory (unverified).
pub const WANNINKHOF2014_SCHMIDT_RANGE: FitRange =
    FitRange::new("wanninkhof2014", (-2.0, 40.0), (0.0, 35.0));

/// The salinity of the sea-water polynomial of Wanninkhof (2014).
pub const SEA_WATER_SALINITY: f64 = 35.0;

/// The Schmidt number a k600 refers to: CO2 in fresh water at 20 °C.
pub const REFERENCE_SCHMIDT: f64 = 600.0;

/// Wind speed at 10 m below which the water surface is taken as smooth
/// (n = 2/3) and at or above which as rough (n = 1/2), m/s (Jähne et al.
/// 1987 as used by Guérin et al. 2007; common practice, from memory,
/// unverified).
pub const SMOOTH_SURFACE_BELOW_M_S: f64 = 3.7;

/// Schmidt number of CO2 in fresh water, Wanninkhof (2014):
///
/// ```text
/// Sc = 1923.6 − 125.06 t + 4.3773 t² − 0.085681 t³ + 0.00070284 t⁴   (t in °C)
/// ```
///
/// Coefficients from memory (unverified); they give the published check
/// value 600.3 at 20 °C.
///
/// ```
/// use travertine::fits::transfer::wanninkhof2014_schmidt_fresh;
/// // Wanninkhof 2014: 600.3 at 20 °C in fresh water.
/// assert!((wanninkhof2014_schmidt_fresh(20.0) - 600.3).abs() < 0.05);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
pub fn wanninkhof2014_schmidt_fresh<R: Real>(temperature_c: R) -> R {
    let t = temperature_c;
    t * (t * (t * (t * 0.000_702_84 + -0.085681) + 4.3773) + -125.06) + 1923.6
}

/// Schmidt number of CO2 in sea water of salinity 35, Wanninkhof (2014):
///
/// ```text
/// Sc = 2116.8 − 136.25 t + 4.7353 t² − 0.092307 t³ + 0.0007555 t⁴   (t in °C)
/// ```
///
/// Coefficients from memory (unverified); they give the published check
/// value 668.3 at 20 °C.
///
/// ```
/// use travertine::fits::transfer::wanninkhof2014_schmidt_sea;
/// // Wanninkhof 2014: 668.3 at 20 °C in sea water (S 35).
/// assert!((wanninkhof2014_schmidt_sea(20.0) - 668.3).abs() < 0.05);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
pub fn wanninkhof2014_schmidt_sea<R: Real>(temperature_c: R) -> R {
    let t = temperature_c;
    t * (t * (t * (t * 0.000_755_5 + -0.092307) + 4.7353) + -136.25) + 2116.8
}

/// Schmidt number of CO2 at any salinity: the Wanninkhof (2014) fresh-water
/// and sea-water polynomials, interpolated linearly in salinity between 0
/// and 35 (and extrapolated on the same line above 35):
///
/// ```text
/// Sc(t, S) = Sc_fresh(t) + (Sc_sea(t) − Sc_fresh(t)) · S / 35
/// ```
///
/// The linear interpolation is the crate's choice (the paper gives the two
/// end members only); the two differ by about 11 %, so a brackish water
/// is within a few percent whatever the shape between them.
///
/// ```
/// use travertine::fits::transfer::schmidt_number;
/// let half = schmidt_number(20.0, 17.5);
/// assert!((half - (600.326 + 668.344) / 2.0).abs() < 0.01);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
pub fn schmidt_number<R: Real>(temperature_c: R, salinity: R) -> R {
    let fresh = wanninkhof2014_schmidt_fresh(temperature_c);
    let sea = wanninkhof2014_schmidt_sea(temperature_c);
    fresh + (sea - fresh) * salinity / SEA_WATER_SALINITY
}

/// The exponent n of (Sc/600)^(−n) for a model and a wind speed (m/s, if
/// known): 1/2 for Wanninkhof (2014) and for a k600 given without a wind;
/// otherwise 2/3 below [`SMOOTH_SURFACE_BELOW_M_S`] and 1/2 at or above it.
///
/// ```
/// use travertine::fits::transfer::{schmidt_exponent, GasTransfer};
/// assert_eq!(schmidt_exponent(GasTransfer::ColeCaraco1998, Some(2.0)), 2.0 / 3.0);
/// assert_eq!(schmidt_exponent(GasTransfer::ColeCaraco1998, Some(5.0)), 0.5);
/// assert_eq!(schmidt_exponent(GasTransfer::Wanninkhof2014, Some(2.0)), 0.5);
/// assert_eq!(schmidt_exponent(GasTransfer::Given, None), 0.5);
/// ```
pub fn schmidt_exponent(model: GasTransfer, wind_m_s: Option<f64>) -> f64 {
    match (model, wind_m_s) {
        (GasTransfer::Wanninkhof2014, _) | (_, None) => 0.5,
        (_, Some(u)) if u < SMOOTH_SURFACE_BELOW_M_S => 2.0 / 3.0,
        _ => 0.5,
    }
}

/// The transfer velocity at Schmidt number `sc` from k600:
/// k = k600 (Sc/600)^(−n).
///
/// # Units
/// k and k600 in the same unit (cm/h in the crate).
///
/// ```
/// use travertine::fits::transfer::transfer_velocity;
/// assert_eq!(transfer_velocity(5.0, 600.0, 0.5), 5.0);
/// assert!((transfer_velocity(5.0, 2400.0, 0.5) - 2.5).abs() < 1e-12);
/// ```
///
/// Generic over [`Real`]: on `f64` the value, on a
/// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
/// and its derivatives.
pub fn transfer_velocity<R: Real>(k600: R, sc: R, n: f64) -> R {
    k600 * (sc / REFERENCE_SCHMIDT).powf(-n)
}

/// A model of the gas transfer velocity, chosen by name
/// (`--gas-transfer NAME`).
///
/// | name | for | k600, cm/h (U10 in m/s, A in km²) |
/// |---|---|---|
/// | `cole-caraco1998` | lakes; the default in fresh water | 2.07 + 0.215 U10^1.7 |
/// | `vachon-prairie2013` | lakes of known area; the default in fresh water when an area is given | 2.51 + 1.48 U10 + 0.39 U10 log10 A |
/// | `wanninkhof2014` | the ocean and estuaries; the default in saline water | 0.251 U10² (600/660)^(−1/2) |
/// | `given` | rivers, anything measured: k600 given directly | — |
///
/// ```
/// use travertine::fits::transfer::GasTransfer;
/// let m: GasTransfer = "cole-caraco1998".parse()?;
/// // Computed from the published formula at U10 = 5 m/s: 5.387 cm/h.
/// assert!((m.k600_cm_h(5.0, None).unwrap() - 5.387).abs() < 5e-4);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Eq, Hash)]
#[non_exhaustive]
pub enum GasTransfer {
    /// Cole & Caraco (1998), Limnology and Oceanography 43: 647–656, from
    /// SF6 in a small lake: k600 = 2.07 + 0.215 U10^1.7 cm/h.
    ColeCaraco1998,
    /// Vachon & Prairie (2013), Canadian Journal of Fisheries and Aquatic
    /// Sciences 70: 1757–1764, wind and lake area:
    /// k600 = 2.51 + 1.48 U10 + 0.39 U10 log10(A) cm/h, A in km².
    /// The formula and its range are FROM MEMORY (unverified): verify them
    /// against the paper before relying on the results.
    VachonPrairie2013,
    /// Wanninkhof (2014), Limnology and Oceanography: Methods 12: 351–362,
    /// the ocean: k = 0.251 U10² (Sc/660)^(−1/2) cm/h, so
    /// k600 = 0.251 U10² (600/660)^(−1/2).
    Wanninkhof2014,
    /// A k600 given directly (a river, a tracer or chamber study).
    Given,
}

/// Published wind range of Cole & Caraco (1998), m/s (from memory, unverified).
pub const COLE_CARACO1998_WIND_M_S: (f64, f64) = (0.0, 8.0);
/// Published wind range of Vachon & Prairie (2013), m/s (from memory, unverified).
pub const VACHON_PRAIRIE2013_WIND_M_S: (f64, f64) = (0.0, 8.0);
/// Range of lake areas of Vachon & Prairie (2013), km² (from memory, unverified).
pub const VACHON_PRAIRIE2013_AREA_KM2: (f64, f64) = (0.01, 700.0);
/// Wind range of the Wanninkhof (2014) quadratic, m/s: it is given for
/// moderate winds and departs from observations at low and high ones
/// (from memory, unverified).
pub const WANNINKHOF2014_WIND_M_S: (f64, f64) = (3.0, 15.0);

impl GasTransfer {
    /// Every model, in the order of the help.
    pub const ALL: [GasTransfer; 4] = [
        GasTransfer::ColeCaraco1998,
        GasTransfer::VachonPrairie2013,
        GasTransfer::Wanninkhof2014,
        GasTransfer::Given,
    ];

    /// The name it is chosen by.
    ///
    /// ```
    /// # use travertine::fits::transfer::GasTransfer;
    /// assert_eq!(GasTransfer::VachonPrairie2013.name(), "vachon-prairie2013");
    /// ```
    pub fn name(self) -> &'static str {
        match self {
            GasTransfer::ColeCaraco1998 => "cole-caraco1998",
            GasTransfer::VachonPrairie2013 => "vachon-prairie2013",
            GasTransfer::Wanninkhof2014 => "wanninkhof2014",
            GasTransfer::Given => "given",
        }
    }

    /// The published range of wind speeds at 10 m, m/s; `None` for a k600
    /// given directly.
    ///
    /// ```
    /// # use travertine::fits::transfer::GasTransfer;
    /// assert_eq!(GasTransfer::Wanninkhof2014.wind_range_m_s(), Some((3.0, 15.0)));
    /// assert_eq!(GasTransfer::Given.wind_range_m_s(), None);
    /// ```
    pub fn wind_range_m_s(self) -> Option<(f64, f64)> {
        match self {
            GasTransfer::ColeCaraco1998 => Some(COLE_CARACO1998_WIND_M_S),
            GasTransfer::VachonPrairie2013 => Some(VACHON_PRAIRIE2013_WIND_M_S),
            GasTransfer::Wanninkhof2014 => Some(WANNINKHOF2014_WIND_M_S),
            GasTransfer::Given => None,
        }
    }

    /// The range of lake areas the model was fitted to, km², where it uses
    /// one.
    ///
    /// ```
    /// # use travertine::fits::transfer::GasTransfer;
    /// assert!(GasTransfer::VachonPrairie2013.area_range_km2().is_some());
    /// assert!(GasTransfer::ColeCaraco1998.area_range_km2().is_none());
    /// ```
    pub fn area_range_km2(self) -> Option<(f64, f64)> {
        match self {
            GasTransfer::VachonPrairie2013 => Some(VACHON_PRAIRIE2013_AREA_KM2),
            _ => None,
        }
    }

    /// Whether the model needs a wind speed.
    pub fn needs_wind(self) -> bool {
        self != GasTransfer::Given
    }

    /// k600 in cm/h at a wind speed `wind_m_s` at 10 m and, for
    /// Vachon & Prairie (2013), a lake area; `None` for a k600 given
    /// directly (it is not computed) and for Vachon & Prairie without an
    /// area. A negative result (Vachon & Prairie on a very small lake in a
    /// strong wind) is kept at zero.
    ///
    /// The wind is generic (an uncertainty source); the area is a plain
    /// number. Zero has no slope.
    ///
    /// # Units
    /// Wind in m/s, area in km², k600 in cm/h.
    ///
    /// ```
    /// # use travertine::fits::transfer::GasTransfer;
    /// let vp = GasTransfer::VachonPrairie2013;
    /// // Computed from the formula: 2.51 + 1.48·4 + 0.39·4·log10(10) = 9.99 cm/h.
    /// assert!((vp.k600_cm_h(4.0, Some(10.0)).unwrap() - 9.99).abs() < 1e-9);
    /// assert_eq!(vp.k600_cm_h(4.0, None), None);
    /// ```
    ///
    /// Generic over [`Real`]: on `f64` the value, on a
    /// [`Tangent`](crate::base::numeric::Tangent) the same value, bit for bit,
    /// and its derivatives.
    pub fn k600_cm_h<R: Real>(self, wind_m_s: R, area_km2: Option<f64>) -> Option<R> {
        let u = wind_m_s;
        let k = match self {
            GasTransfer::ColeCaraco1998 => u.powf(1.7) * 0.215 + 2.07,
            GasTransfer::VachonPrairie2013 => u * 1.48 + 2.51 + u * 0.39 * area_km2?.log10(),
            GasTransfer::Wanninkhof2014 => u * 0.251 * u * (REFERENCE_SCHMIDT / 660.0).powf(-0.5),
            GasTransfer::Given => return None,
        };
        Some(k.max(0.0))
    }
}

fit_from_str!(GasTransfer, crate::base::field::Field::GasTransfer);

impl std::fmt::Display for GasTransfer {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.name())
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn schmidt_check_values() {
        // Wanninkhof 2014: 600.3 (fresh) and 668.3 (sea water) at 20 °C.
        assert!((schmidt_number(20.0, 0.0) - 600.3).abs() < 0.05);
        assert!((schmidt_number(20.0, 35.0) - 668.3).abs() < 0.05);
    }

    #[test]
    fn cole_caraco_at_five_metres_per_second() {
        // Computed from the published formula: 2.07 + 0.215·5^1.7 = 5.387 cm/h.
        let k = GasTransfer::ColeCaraco1998.k600_cm_h(5.0, None).unwrap();
        assert!((k - 5.387).abs() < 5e-4, "{k}");
    }

    #[test]
    fn wanninkhof_k_at_its_own_schmidt_number() {
        // Wanninkhof 2014: k = 0.251 U² (Sc/660)^-0.5; at Sc 660 and 10 m/s, 25.1 cm/h.
        let m = GasTransfer::Wanninkhof2014;
        let k600 = m.k600_cm_h(10.0, None).unwrap();
        let k = transfer_velocity(k600, 660.0, schmidt_exponent(m, Some(10.0)));
        assert!((k - 25.1).abs() < 1e-9, "{k}");
    }

    #[test]
    fn names_read_back() {
        for m in GasTransfer::ALL {
            assert_eq!(m.name().parse::<GasTransfer>().unwrap(), m);
        }
        assert!("cole1998".parse::<GasTransfer>().is_err());
    }
}
