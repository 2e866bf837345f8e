//! The three embedded DejaVu faces and their metrics, read straight from the TrueType
//! tables (`head`, `hhea`, `maxp`, `hmtx`, `cmap`; Apple/Microsoft TrueType reference,
//! OpenType 1.9 specification chapter "Font tables").
//!
//! Widths come from the fonts' advance widths without kerning; the PDF output draws
//! the same glyphs without kerning, so measured and printed widths agree exactly.

use std::sync::OnceLock;

static REGULAR: &[u8] = include_bytes!("../../../styles/fonts/DejaVuSans.ttf");
static BOLD: &[u8] = include_bytes!("../../../styles/fonts/DejaVuSans-Bold.ttf");
static MONO: &[u8] = include_bytes!("../../../styles/fonts/DejaVuSansMono.ttf");

/// A typeface of the report.
#[derive(Debug, Clone, Copy, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub enum Face {
    /// DejaVu Sans.
    Regular,
    /// DejaVu Sans Bold.
    Bold,
    /// DejaVu Sans Mono.
    Mono,
}

impl Face {
    /// All faces, in a fixed order.
    pub const ALL: [Face; 3] = [Face::Regular, Face::Bold, Face::Mono];

    /// Index into [`Face::ALL`].
    pub fn index(self) -> usize {
        match self {
            Face::Regular => 0,
            Face::Bold => 1,
            Face::Mono => 2,
        }
    }

    /// PostScript-style name used for the embedded font.
    pub fn font_name(self) -> &'static str {
        match self {
            Face::Regular => "DejaVuSans",
            Face::Bold => "DejaVuSans-Bold",
            Face::Mono => "DejaVuSansMono",
        }
    }
}

/// One parsed font file.
#[derive(Debug)]
pub struct FontFile {
    /// The whole sfnt file.
    pub bytes: &'static [u8],
    /// Design units per em.
    pub units_per_em: f64,
    /// Typographic ascender in design units (positive).
    pub ascent: f64,
    /// Typographic descender in design units (negative).
    pub descent: f64,
    /// Glyph id for every BMP code point (0 = none).
    cmap: Vec<u16>,
    /// Advance width of every glyph in design units.
    advances: Vec<u16>,
}

impl FontFile {
    /// Parses the tables needed for measuring text.
    pub fn parse(bytes: &'static [u8]) -> Result<FontFile, String> {
        let head = table(bytes, b"head")?;
        let hhea = table(bytes, b"hhea")?;
        let maxp = table(bytes, b"maxp")?;
        let hmtx = table(bytes, b"hmtx")?;
        let cmap_table = table(bytes, b"cmap")?;
        let units_per_em = f64::from(read_u16(head, 18)?);
        if units_per_em <= 0.0 {
            return Err("head.unitsPerEm is zero".into());
        }
        let ascent = f64::from(read_u16(hhea, 4)? as i16);
        let descent = f64::from(read_u16(hhea, 6)? as i16);
        let metric_count = usize::from(read_u16(hhea, 34)?);
        let glyph_count = usize::from(read_u16(maxp, 4)?);
        if metric_count == 0 {
            return Err("hhea.numberOfHMetrics is zero".into());
        }
        let mut advances = Vec::with_capacity(glyph_count);
        for gid in 0..glyph_count {
            let record = gid.min(metric_count - 1);
            advances.push(read_u16(hmtx, record * 4)?);
        }
        let cmap = parse_cmap(cmap_table)?;
        Ok(FontFile {
            bytes,
            units_per_em,
            ascent,
            descent,
            cmap,
            advances,
        })
    }

    /// Glyph id of a character, if the face has one.
    pub fn glyph(&self, ch: char) -> Option<u16> {
        let cp = ch as usize;
        match self.cmap.get(cp) {
            Some(&gid) if gid != 0 => Some(gid),
            _ => None,
        }
    }

    /// Advance width of a glyph in em.
    pub fn advance_em(&self, gid: u16) -> f64 {
        let units = self.advances.get(usize::from(gid)).copied().unwrap_or(0);
        f64::from(units) / self.units_per_em
    }

    /// Number of glyphs in the face.
    pub fn glyph_count(&self) -> usize {
        self.advances.len()
    }
}

/// The three faces of the report plus the fallback rules between them.
#[derive(Debug)]
pub struct FontSet {
    files: [FontFile; 3],
    /// [`FontSet::resolve`] and the advance in em of every ASCII character in each
    /// face, worked out once: most of a package's text is ASCII and is measured
    /// character by character.
    ascii: [[(Face, char, f64); 128]; 3],
}

/// Character drawn for a code point that no face has.
pub const REPLACEMENT: char = '\u{FFFD}';

impl FontSet {
    /// The parsed file of a face.
    pub fn file(&self, face: Face) -> &FontFile {
        &self.files[face.index()]
    }

    /// The face and character actually drawn for `ch` requested in `face`: the face
    /// itself when it has the glyph, else DejaVu Sans, else the replacement character.
    /// Control characters (other than none) become the replacement character too.
    pub fn resolve(&self, face: Face, ch: char) -> (Face, char) {
        if let Some(&(face, ch, _)) = self.ascii[face.index()].get(ch as usize) {
            return (face, ch);
        }
        self.resolve_uncached(face, ch)
    }

    fn resolve_uncached(&self, face: Face, ch: char) -> (Face, char) {
        if !ch.is_control() {
            if self.file(face).glyph(ch).is_some() {
                return (face, ch);
            }
            if self.file(Face::Regular).glyph(ch).is_some() {
                return (Face::Regular, ch);
            }
        }
        if self.file(face).glyph(REPLACEMENT).is_some() {
            (face, REPLACEMENT)
        } else {
            (Face::Regular, REPLACEMENT)
        }
    }

    /// Width in points of one character at `size` points (after fallback).
    pub fn char_width(&self, face: Face, ch: char, size: f64) -> f64 {
        match self.ascii[face.index()].get(ch as usize) {
            Some(&(_, _, em)) => em * size,
            None => self.char_em(face, ch) * size,
        }
    }

    /// Advance in em of `ch` requested in `face` (after fallback).
    fn char_em(&self, face: Face, ch: char) -> f64 {
        let (face, ch) = self.resolve_uncached(face, ch);
        let file = self.file(face);
        file.glyph(ch).map_or(0.0, |gid| file.advance_em(gid))
    }

    /// The set of `files` with its ASCII table.
    fn new(files: [FontFile; 3]) -> FontSet {
        let mut set = FontSet {
            files,
            ascii: [[(Face::Regular, '\0', 0.0); 128]; 3],
        };
        let mut ascii = set.ascii;
        for face in Face::ALL {
            for (code, slot) in ascii[face.index()].iter_mut().enumerate() {
                let ch = char::from(code as u8);
                let (f, c) = set.resolve_uncached(face, ch);
                *slot = (f, c, set.char_em(face, ch));
            }
        }
        set.ascii = ascii;
        set
    }

    /// Width in points of `text` set in `face` at `size` points.
    pub fn width(&self, face: Face, text: &str, size: f64) -> f64 {
        text.chars().map(|c| self.char_width(face, c, size)).sum()
    }

    /// Ascender of a face in points at `size`.
    pub fn ascent(&self, face: Face, size: f64) -> f64 {
        let f = self.file(face);
        f.ascent / f.units_per_em * size
    }

    /// Descender (positive number) of a face in points at `size`.
    pub fn descent(&self, face: Face, size: f64) -> f64 {
        let f = self.file(face);
        -f.descent / f.units_per_em * size
    }
}

/// The embedded fonts, parsed once per process.
pub fn fonts() -> Result<&'static FontSet, String> {
    static FONTS: OnceLock<Result<FontSet, String>> = OnceLock::new();
    FONTS
        .get_or_init(|| {
            Ok(FontSet::new([
                FontFile::parse(REGULAR).map_err(|e| format!("DejaVuSans.ttf: {e}"))?,
                FontFile::parse(BOLD).map_err(|e| format!("DejaVuSans-Bold.ttf: {e}"))?,
                FontFile::parse(MONO).map_err(|e| format!("DejaVuSansMono.ttf: {e}"))?,
            ]))
        })
        .as_ref()
        .map_err(Clone::clone)
}

/// Big-endian u16 at `offset`.
pub(crate) fn read_u16(data: &[u8], offset: usize) -> Result<u16, String> {
    data.get(offset..offset + 2)
        .map(|b| u16::from_be_bytes([b[0], b[1]]))
        .ok_or_else(|| format!("truncated font data at {offset}"))
}

/// Big-endian u32 at `offset`.
pub(crate) fn read_u32(data: &[u8], offset: usize) -> Result<u32, String> {
    data.get(offset..offset + 4)
        .map(|b| u32::from_be_bytes([b[0], b[1], b[2], b[3]]))
        .ok_or_else(|| format!("truncated font data at {offset}"))
}

/// The bytes of one table of an sfnt file.
pub(crate) fn table<'a>(font: &'a [u8], tag: &[u8; 4]) -> Result<&'a [u8], String> {
    let count = usize::from(read_u16(font, 4)?);
    for i in 0..count {
        let record = 12 + 16 * i;
        if font.get(record..record + 4) == Some(&tag[..]) {
            let offset = read_u32(font, record + 8)? as usize;
            let length = read_u32(font, record + 12)? as usize;
            return font
                .get(offset..offset + length)
                .ok_or_else(|| format!("table {} out of bounds", String::from_utf8_lossy(tag)));
        }
    }
    Err(format!("missing table {}", String::from_utf8_lossy(tag)))
}

/// BMP code point -> glyph id from the Windows Unicode (3,1) format 4 subtable.
fn parse_cmap(cmap: &[u8]) -> Result<Vec<u16>, String> {
    let count = usize::from(read_u16(cmap, 2)?);
    let mut subtable = None;
    for i in 0..count {
        let record = 4 + 8 * i;
        let platform = read_u16(cmap, record)?;
        let encoding = read_u16(cmap, record + 2)?;
        let offset = read_u32(cmap, record + 4)? as usize;
        let unicode = (platform == 3 && encoding == 1) || (platform == 0 && subtable.is_none());
        if unicode && read_u16(cmap, offset)? == 4 {
            subtable = Some(offset);
        }
    }
    let base = subtable.ok_or("no Unicode format 4 cmap subtable")?;
    let seg_count = usize::from(read_u16(cmap, base + 6)? / 2);
    let ends = base + 14;
    let starts = ends + 2 * seg_count + 2;
    let deltas = starts + 2 * seg_count;
    let range_offsets = deltas + 2 * seg_count;
    let mut map = vec![0u16; 0x1_0000];
    for seg in 0..seg_count {
        let end = read_u16(cmap, ends + 2 * seg)?;
        let start = read_u16(cmap, starts + 2 * seg)?;
        let delta = read_u16(cmap, deltas + 2 * seg)?;
        let range_offset_at = range_offsets + 2 * seg;
        let range_offset = usize::from(read_u16(cmap, range_offset_at)?);
        if start > end {
            continue;
        }
        for cp in start..=end {
            let gid = if range_offset == 0 {
                cp.wrapping_add(delta)
            } else {
                let at = range_offset_at + range_offset + 2 * usize::from(cp - start);
                match read_u16(cmap, at)? {
                    0 => 0,
                    g => g.wrapping_add(delta),
                }
            };
            map[usize::from(cp)] = gid;
        }
    }
    Ok(map)
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn required_characters_have_glyphs_in_every_face() {
        let fonts = fonts().expect("fonts parse");
        for face in Face::ALL {
            for ch in "°³²µηΔ≤≥·±×–—".chars() {
                assert!(
                    fonts.file(face).glyph(ch).is_some(),
                    "{face:?} lacks {ch:?}"
                );
            }
        }
    }

    #[test]
    fn widths_match_the_font_tables() {
        let fonts = fonts().expect("fonts parse");
        // DejaVu Sans Mono: every ASCII glyph advances 1233 of 2048 units (read from its
        // hmtx table; 0.602 em).
        let w = fonts.width(Face::Mono, "abc", 10.0);
        assert!((w - 3.0 * 1233.0 / 2048.0 * 10.0).abs() < 1e-9, "{w}");
        // A bold "m" is wider than a regular one.
        assert!(fonts.width(Face::Bold, "m", 10.0) > fonts.width(Face::Regular, "m", 10.0));
    }

    #[test]
    fn missing_glyphs_fall_back() {
        let fonts = fonts().expect("fonts parse");
        let (face, ch) = fonts.resolve(Face::Mono, '\u{1}');
        assert_eq!(ch, REPLACEMENT);
        assert!(fonts.file(face).glyph(ch).is_some());
    }
}
