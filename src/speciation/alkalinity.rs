//! Total alkalinity and its parts at a given [H+], with derivatives.
//!
//! The Dickson (1981) definition, extended with ammonia and sulfide:
//!
//! ```text
//! TA = [HCO3-] + 2[CO3--] + [B(OH)4-] + [OH-] + [HPO4--] + 2[PO4---] + [SiO(OH)3-]
//!      + [NH3] + [HS-] - [H+]F - [HSO4-] - [HF] - [H3PO4]
//! ```
//! Here h is [H+] on the working scale of the [`Constants`].

use crate::base::numeric::Real;
use crate::medium::Constants;
use serde::Serialize;

/// Each part of the alkalinity, mol/kg.
///
/// # Example
/// ```
/// use travertine::{speciation::alkalinity::parts, Conditions, Water};
/// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
/// let p = parts(&k, 1e-8, 2000e-6);
/// assert!(p.total() > 2000e-6 && p.borate > 0.0);
/// # Ok::<(), travertine::Error>(())
/// ```
#[derive(Debug, Clone, Copy, PartialEq, Serialize, Default)]
#[non_exhaustive]
pub struct AlkalinityParts<R: Real = f64> {
    /// [HCO3-] + 2[CO3--] (+ [CaHCO3+] + 2\[CaCO3⁰\] in fresh water).
    pub carbonate: R,
    /// [B(OH)4-].
    pub borate: R,
    /// [OH-].
    pub hydroxide: R,
    /// [HPO4--] + 2[PO4---] - \[H3PO4\].
    pub phosphate: R,
    /// [SiO(OH)3-].
    pub silicate: R,
    /// \[NH3\].
    pub ammonia: R,
    /// [HS-].
    pub sulfide: R,
    /// [H+] on the free scale (counted negatively).
    pub free_hydrogen: R,
    /// [HSO4-] (counted negatively).
    pub bisulfate: R,
    /// \[HF\] (counted negatively).
    pub hydrogen_fluoride: R,
}

impl<R: Real> AlkalinityParts<R> {
    /// The total alkalinity these parts make.
    ///
    /// ```
    /// # use travertine::speciation::alkalinity::AlkalinityParts;
    /// assert_eq!(AlkalinityParts::<f64>::default().total(), 0.0);
    /// ```
    pub fn total(&self) -> R {
        self.carbonate + self.non_carbonate()
    }

    /// Everything but the carbonate part.
    ///
    /// ```
    /// # use travertine::speciation::alkalinity::AlkalinityParts;
    /// assert_eq!(AlkalinityParts::<f64>::default().non_carbonate(), 0.0);
    /// ```
    pub fn non_carbonate(&self) -> R {
        self.borate + self.hydroxide + self.phosphate + self.silicate + self.ammonia + self.sulfide
            - self.free_hydrogen
            - self.bisulfate
            - self.hydrogen_fluoride
    }
}

/// Carbonate alkalinity per unit DIC, (K1 h + 2 K1 K2)/(h² + K1 h + K1 K2)
/// (with the pair-inclusive K1e, K2e),
/// and its derivative with respect to h.
#[inline]
pub(crate) fn carbonate_per_dic<R: Real>(k: &Constants<R>, h: R) -> (R, R) {
    let k12 = k.k1e() * k.k2e();
    let n = k.k1e() * h + k12 * 2.0;
    let d = h * h + k.k1e() * h + k12;
    let inv = d.under(1.0);
    let c = n * inv;
    // d/dh (n/d) = (K1 − c (2h + K1)) / d.
    (c, (k.k1e() - c * (h * 2.0 + k.k1e())) * inv)
}

/// Base form of a monoprotic acid, T·K/(K + h), and its derivative
/// −T·K/(K + h)², with one division.
#[inline]
fn base<R: Real>(total: R, ka: R, h: R) -> (R, R) {
    if total.value() == 0.0 {
        return (R::constant(0.0), R::constant(0.0));
    }
    let inv = (ka + h).under(1.0);
    let v = total * ka * inv;
    (v, -v * inv)
}

/// Acid form on the free scale, T·hf/(K + hf) with hf = ff·h, and its
/// derivative with respect to h, T·K·ff/(K + hf)², with one division.
#[inline]
fn acid_free<R: Real>(total: R, ka: R, hf: R, ff: R) -> (R, R) {
    let inv = (ka + hf).under(1.0);
    let v = total * hf * inv;
    (v, total * ka * ff * inv * inv)
}

/// Every part of the alkalinity but the carbonate, with the derivative of
/// their sum with respect to h.
#[inline]
fn non_carbonate_parts<R: Real>(k: &Constants<R>, h: R) -> (AlkalinityParts<R>, R) {
    let t = &k.totals();
    let (b, db) = base(t.boron_mol_kg, k.kb(), h);
    let (si, dsi) = base(t.silicate_mol_kg, k.ksi(), h);
    let (nh, dnh) = base(t.ammonia_mol_kg, k.knh4(), h);
    let (hs, dhs) = base(t.sulfide_mol_kg, k.kh2s(), h);
    let inv_h = h.under(1.0);
    let oh = k.kw() * inv_h;
    let doh = -oh * inv_h;
    let ff = k.free_per_working();
    let hf = h * ff;
    // HSO4- = ST hf/(KS + hf); HF = FT hf/(KF + hf) (both on the free scale).
    let (hso4, dhso4) = acid_free(t.sulfate_mol_kg, k.ks_free(), hf, ff);
    let (hfl, dhfl) = acid_free(t.fluoride_mol_kg, k.kf_free(), hf, ff);
    let (p, dp) = phosphate(k, h);
    let parts = AlkalinityParts {
        carbonate: R::constant(0.0),
        borate: b,
        hydroxide: oh,
        phosphate: p,
        silicate: si,
        ammonia: nh,
        sulfide: hs,
        free_hydrogen: hf,
        bisulfate: hso4,
        hydrogen_fluoride: hfl,
    };
    (parts, db + dsi + dnh + dhs + doh + dp - ff - dhso4 - dhfl)
}

/// Non-carbonate alkalinity at h and its derivative with respect to h.
#[inline]
pub(crate) fn non_carbonate<R: Real>(k: &Constants<R>, h: R) -> (R, R) {
    let (p, d) = non_carbonate_parts(k, h);
    (p.non_carbonate(), d)
}

/// Every part of the alkalinity at h and DIC (mol/kg), with the slopes a
/// state needs, from one evaluation.
#[derive(Debug, Clone, Copy)]
pub(crate) struct PartsWithSlopes<R: Real = f64> {
    pub parts: AlkalinityParts<R>,
    /// Carbonate alkalinity per unit DIC, and its derivative with respect to h.
    pub carbonate_per_dic: R,
    pub d_carbonate_per_dic: R,
    /// Derivative of the non-carbonate sum with respect to h.
    pub d_non_carbonate: R,
}

/// [`PartsWithSlopes`] at h and DIC (mol/kg).
#[inline]
pub(crate) fn parts_with_slopes<R: Real>(
    k: &Constants<R>,
    h: R,
    dic_mol_kg: R,
) -> PartsWithSlopes<R> {
    let (c, dc) = carbonate_per_dic(k, h);
    let (mut parts, dn) = non_carbonate_parts(k, h);
    parts.carbonate = dic_mol_kg * c;
    PartsWithSlopes {
        parts,
        carbonate_per_dic: c,
        d_carbonate_per_dic: dc,
        d_non_carbonate: dn,
    }
}

#[inline]
fn phosphate<R: Real>(k: &Constants<R>, h: R) -> (R, R) {
    let tp = k.totals().phosphate_mol_kg;
    if tp.value() == 0.0 {
        return (R::constant(0.0), R::constant(0.0));
    }
    let (k1, k12, k123) = (k.kp1(), k.kp1() * k.kp2(), k.kp1() * k.kp2() * k.kp3());
    let h2 = h * h;
    let h3 = h2 * h;
    let d = h3 + k1 * h2 + k12 * h + k123;
    let n = k12 * h + k123 * 2.0 - h3;
    let dn = k12 - h2 * 3.0;
    let dd = h2 * 3.0 + k1 * 2.0 * h + k12;
    let inv = d.under(1.0);
    let v = n * inv;
    (tp * v, tp * (dn - v * dd) * inv)
}

/// Every part of the alkalinity at working-scale h and DIC (mol/kg).
///
/// # Example
/// ```
/// use travertine::{speciation::alkalinity::parts, Conditions, Water};
/// let k = Water::saline(Conditions::new(25.0, 35.0)?)?.constants()?;
/// let p = parts(&k, 10f64.powf(-8.0402), 2000e-6);
/// assert!((p.total() * 1e6 - 2300.0).abs() < 0.5); // worked value computed from Lueker et al. (2000), Dickson (1990), Lee et al. (2010), Millero (1995) and Weiss (1974)
/// # Ok::<(), travertine::Error>(())
/// ```
pub fn parts<R: Real>(k: &Constants<R>, h: R, dic_mol_kg: R) -> AlkalinityParts<R> {
    parts_with_slopes(k, h, dic_mol_kg).parts
}
