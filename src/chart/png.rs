//! PNG: a chart's SVG rendered by `resvg`.
//!
//! Text needs a font. The system's fonts are read once (through fontconfig's
//! configuration where there is one); where none is installed the PNG is
//! drawn without its text (lines, bands and markers are all still there),
//! and the SVG, which names only the generic family, keeps every word.

use super::ChartError;
use resvg::{tiny_skia, usvg};
use std::sync::{Arc, OnceLock};

/// The system's fonts, read once, with `sans-serif` pointed at a face that
/// is there.
fn fonts() -> Arc<usvg::fontdb::Database> {
    static FONTS: OnceLock<Arc<usvg::fontdb::Database>> = OnceLock::new();
    FONTS
        .get_or_init(|| {
            let mut db = usvg::fontdb::Database::new();
            db.load_system_fonts();
            let families: Vec<String> = db
                .faces()
                .filter_map(|f| f.families.first().map(|(name, _)| name.clone()))
                .collect();
            // Sans faces a fresh machine may have, most likely first; else
            // any face at all.
            let preferred = [
                "DejaVu Sans",
                "Liberation Sans",
                "Noto Sans",
                "FreeSans",
                "Arial",
                "Helvetica",
            ];
            let chosen = preferred
                .iter()
                .find(|p| families.iter().any(|f| f == *p))
                .map(|p| p.to_string())
                .or_else(|| families.first().cloned());
            if let Some(family) = chosen {
                db.set_sans_serif_family(family);
            }
            Arc::new(db)
        })
        .clone()
}

/// Renders an SVG document to PNG at `scale` times its size (1 to 4).
///
/// # Errors
/// [`ChartError::BadOption`] for a scale outside 1 to 4;
/// [`ChartError::Png`] for SVG that cannot be read or a PNG that cannot be
/// encoded.
///
/// ```
/// use travertine::chart::svg_to_png;
/// let svg = r#"<svg xmlns="http://www.w3.org/2000/svg" width="20" height="10">
///              <rect width="20" height="10" fill="navy"/></svg>"#;
/// let png = svg_to_png(svg, 2.0)?;
/// assert!(png.starts_with(b"\x89PNG"));
/// assert!(svg_to_png("not svg", 1.0).is_err());
/// # Ok::<(), travertine::chart::ChartError>(())
/// ```
pub fn svg_to_png(svg: &str, scale: f32) -> Result<Vec<u8>, ChartError> {
    render(svg, scale, fonts())
}

/// [`svg_to_png`] with the fonts given.
fn render(
    svg: &str,
    scale: f32,
    fonts: Arc<usvg::fontdb::Database>,
) -> Result<Vec<u8>, ChartError> {
    if !(scale.is_finite() && (1.0..=4.0).contains(&scale)) {
        return Err(ChartError::BadOption {
            option: "scale",
            value: scale.to_string(),
            why: "is outside the accepted range 1 to 4".into(),
        });
    }
    let options = usvg::Options {
        fontdb: fonts,
        ..usvg::Options::default()
    };
    let tree = usvg::Tree::from_str(svg, &options).map_err(|e| ChartError::Png(e.to_string()))?;
    let size = tree.size();
    let (w, h) = (
        (size.width() * scale).ceil() as u32,
        (size.height() * scale).ceil() as u32,
    );
    let mut pixmap = tiny_skia::Pixmap::new(w.max(1), h.max(1))
        .ok_or_else(|| ChartError::Png(format!("a picture of {w}×{h} px cannot be made")))?;
    resvg::render(
        &tree,
        tiny_skia::Transform::from_scale(scale, scale),
        &mut pixmap.as_mut(),
    );
    pixmap
        .encode_png()
        .map_err(|e| ChartError::Png(e.to_string()))
}

#[cfg(test)]
mod tests {
    use super::*;

    /// On a machine without a single font the PNG is still drawn (without
    /// its text): the lines of a chart are there.
    #[test]
    fn a_png_without_fonts_still_has_its_lines() {
        let svg = r##"<svg xmlns="http://www.w3.org/2000/svg" width="200" height="100">
            <rect width="200" height="100" fill="#FFFFFF"/>
            <polyline points="10,90 190,10" stroke="#0072B2" stroke-width="2" fill="none"/>
            <text x="20" y="20" font-family="sans-serif">pH</text></svg>"##;
        let png = render(svg, 1.0, Arc::new(usvg::fontdb::Database::new())).unwrap();
        let p = tiny_skia::Pixmap::decode_png(&png).unwrap();
        let blue = p
            .pixels()
            .iter()
            .filter(|c| c.blue() > 150 && c.red() < 60)
            .count();
        assert!(blue > 150, "{blue} line pixels");
    }
}
