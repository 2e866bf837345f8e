//! TrueType subsetting: cut a face down to the glyphs one document uses.
//!
//! printpdf 0.12 subsets fonts only with its `text_layout` feature (which pulls in a
//! text-shaping stack); without it `PdfSaveOptions::subset_fonts` is ignored and the
//! whole font is embedded. This module builds a small, valid TrueType file instead:
//! glyph 0 (.notdef), the used glyphs in code-point order, then any composite
//! components, renumbered from 0; new `glyf`/`loca` (long offsets), `hmtx`, a format 4
//! `cmap` for the used code points, `post` format 3, and the original hinting tables
//! (`cvt `, `fpgm`, `prep`, `gasp`), `OS/2` and `name` (which carries the copyright and
//! licence notice the DejaVu/Bitstream Vera licence asks to keep).
//!
//! Table layouts follow the OpenType 1.9 specification ("glyf", "loca", "hmtx", "cmap"
//! format 4, "post", and the table-directory checksum rules). The output is a pure
//! function of the font and the character set, so it is deterministic.

use super::font::{read_u16, read_u32, table, FontFile};
use std::collections::{BTreeMap, BTreeSet};

/// Tables copied verbatim when present.
const COPIED: [&[u8; 4]; 6] = [b"OS/2", b"cvt ", b"fpgm", b"gasp", b"name", b"prep"];

/// Composite glyph flags (OpenType "glyf", composite glyph description).
const ARG_1_AND_2_ARE_WORDS: u16 = 0x0001;
const WE_HAVE_A_SCALE: u16 = 0x0008;
const MORE_COMPONENTS: u16 = 0x0020;
const WE_HAVE_AN_X_AND_Y_SCALE: u16 = 0x0040;
const WE_HAVE_A_TWO_BY_TWO: u16 = 0x0080;

/// Builds a subset font holding the glyphs for `chars` (characters without a glyph are
/// skipped; callers resolve fallbacks first).
pub fn subset(font: &FontFile, chars: &BTreeSet<char>) -> Result<Vec<u8>, String> {
    let bytes = font.bytes;
    let head = table(bytes, b"head")?;
    let long_loca = read_u16(head, 50)? == 1;
    let loca = table(bytes, b"loca")?;
    let glyf = table(bytes, b"glyf")?;
    let glyph_range = |gid: u16| -> Result<(usize, usize), String> {
        let i = usize::from(gid);
        let (a, b) = if long_loca {
            (
                read_u32(loca, 4 * i)? as usize,
                read_u32(loca, 4 * i + 4)? as usize,
            )
        } else {
            (
                2 * usize::from(read_u16(loca, 2 * i)?),
                2 * usize::from(read_u16(loca, 2 * i + 2)?),
            )
        };
        if a > b || b > glyf.len() {
            return Err(format!("bad loca entry for glyph {gid}"));
        }
        Ok((a, b))
    };

    // New glyph order: .notdef, used glyphs by code point, then composite components.
    let mut order: Vec<u16> = vec![0];
    let mut new_id: BTreeMap<u16, u16> = BTreeMap::from([(0, 0)]);
    let mut cmap: Vec<(u16, u16)> = Vec::new();
    for &ch in chars {
        let Ok(cp) = u16::try_from(ch as u32) else {
            continue;
        };
        let Some(gid) = font.glyph(ch) else { continue };
        let id = *new_id.entry(gid).or_insert_with(|| {
            order.push(gid);
            (order.len() - 1) as u16
        });
        cmap.push((cp, id));
    }
    let mut next = 0;
    while next < order.len() {
        let (a, b) = glyph_range(order[next])?;
        for component in components(&glyf[a..b])? {
            if usize::from(component) >= font.glyph_count() {
                return Err(format!("composite refers to missing glyph {component}"));
            }
            if let std::collections::btree_map::Entry::Vacant(slot) = new_id.entry(component) {
                order.push(component);
                slot.insert((order.len() - 1) as u16);
            }
        }
        next += 1;
        if order.len() > usize::from(u16::MAX) {
            return Err("too many glyphs".into());
        }
    }

    // glyf + loca (long format).
    let mut new_glyf = Vec::new();
    let mut new_loca = Vec::with_capacity(4 * (order.len() + 1));
    for &gid in &order {
        new_loca.extend_from_slice(&(new_glyf.len() as u32).to_be_bytes());
        let (a, b) = glyph_range(gid)?;
        let mut data = glyf[a..b].to_vec();
        renumber_components(&mut data, &new_id)?;
        new_glyf.extend_from_slice(&data);
        while new_glyf.len() % 4 != 0 {
            new_glyf.push(0);
        }
    }
    new_loca.extend_from_slice(&(new_glyf.len() as u32).to_be_bytes());

    // hmtx with one full record per glyph.
    let hhea = table(bytes, b"hhea")?;
    let hmtx = table(bytes, b"hmtx")?;
    let metric_count = usize::from(read_u16(hhea, 34)?);
    let mut new_hmtx = Vec::with_capacity(4 * order.len());
    for &gid in &order {
        let g = usize::from(gid);
        let advance = read_u16(hmtx, 4 * g.min(metric_count.saturating_sub(1)))?;
        let lsb = if g < metric_count {
            read_u16(hmtx, 4 * g + 2)?
        } else {
            read_u16(hmtx, 4 * metric_count + 2 * (g - metric_count))?
        };
        new_hmtx.extend_from_slice(&advance.to_be_bytes());
        new_hmtx.extend_from_slice(&lsb.to_be_bytes());
    }
    let glyph_count = (order.len() as u16).to_be_bytes();
    let mut new_hhea = hhea.to_vec();
    patch(&mut new_hhea, 34, &glyph_count)?;
    let mut new_maxp = table(bytes, b"maxp")?.to_vec();
    patch(&mut new_maxp, 4, &glyph_count)?;
    let mut new_head = head.to_vec();
    patch(&mut new_head, 8, &[0, 0, 0, 0])?; // checkSumAdjustment, set below
    patch(&mut new_head, 50, &[0, 1])?; // indexToLocFormat = long
    let mut new_post = table(bytes, b"post")?
        .get(..32)
        .ok_or("post table too short")?
        .to_vec();
    patch(&mut new_post, 0, &[0, 3, 0, 0])?; // version 3.0: no glyph names

    let mut tables: Vec<([u8; 4], Vec<u8>)> = vec![
        (*b"cmap", format4_cmap(&cmap)),
        (*b"glyf", new_glyf),
        (*b"head", new_head),
        (*b"hhea", new_hhea),
        (*b"hmtx", new_hmtx),
        (*b"loca", new_loca),
        (*b"maxp", new_maxp),
        (*b"post", new_post),
    ];
    for tag in COPIED {
        if let Ok(data) = table(bytes, tag) {
            tables.push((*tag, data.to_vec()));
        }
    }
    tables.sort_by_key(|t| t.0);
    Ok(assemble(tables))
}

/// Glyph ids referenced by a composite glyph (empty for simple glyphs).
fn components(glyph: &[u8]) -> Result<Vec<u16>, String> {
    let mut found = Vec::new();
    walk_components(glyph, |_, gid| found.push(gid))?;
    Ok(found)
}

/// Rewrites the component glyph ids of a composite glyph to the subset's ids.
fn renumber_components(glyph: &mut [u8], new_id: &BTreeMap<u16, u16>) -> Result<(), String> {
    let mut patches = Vec::new();
    walk_components(glyph, |at, gid| {
        patches.push((at, new_id.get(&gid).copied().unwrap_or(0)));
    })?;
    for (at, id) in patches {
        patch(glyph, at, &id.to_be_bytes())?;
    }
    Ok(())
}

/// Calls `visit(offset_of_glyph_index, glyph_index)` for every component.
fn walk_components(glyph: &[u8], mut visit: impl FnMut(usize, u16)) -> Result<(), String> {
    if glyph.len() < 10 || (read_u16(glyph, 0)? as i16) >= 0 {
        return Ok(());
    }
    let mut at = 10;
    for _ in 0..glyph.len() {
        let flags = read_u16(glyph, at)?;
        let gid = read_u16(glyph, at + 2)?;
        visit(at + 2, gid);
        at += 4 + if flags & ARG_1_AND_2_ARE_WORDS != 0 {
            4
        } else {
            2
        };
        if flags & WE_HAVE_A_SCALE != 0 {
            at += 2;
        } else if flags & WE_HAVE_AN_X_AND_Y_SCALE != 0 {
            at += 4;
        } else if flags & WE_HAVE_A_TWO_BY_TWO != 0 {
            at += 8;
        }
        if flags & MORE_COMPONENTS == 0 {
            return Ok(());
        }
    }
    Err("composite glyph does not terminate".into())
}

fn patch(data: &mut [u8], at: usize, value: &[u8]) -> Result<(), String> {
    data.get_mut(at..at + value.len())
        .ok_or_else(|| format!("font table too short to patch at {at}"))?
        .copy_from_slice(value);
    Ok(())
}

/// A (3,1) format 4 cmap; runs of consecutive code points with consecutive glyph ids
/// share one segment.
fn format4_cmap(map: &[(u16, u16)]) -> Vec<u8> {
    let mut segments: Vec<(u16, u16, u16)> = Vec::new(); // (start, end, first gid)
    for &(cp, gid) in map {
        match segments.last_mut() {
            Some((start, end, first))
                if cp == end.wrapping_add(1)
                    && u32::from(gid) == u32::from(*first) + u32::from(cp - *start) =>
            {
                *end = cp;
            }
            _ => segments.push((cp, cp, gid)),
        }
    }
    if segments.last().is_none_or(|s| s.1 != 0xFFFF) {
        segments.push((0xFFFF, 0xFFFF, 0));
    }
    let seg_count = segments.len() as u16;
    let mut search_range = 2u16;
    let mut entry_selector = 0u16;
    while search_range * 2 <= seg_count * 2 {
        search_range *= 2;
        entry_selector += 1;
    }
    let mut sub = Vec::new();
    let length = 16 + 8 * segments.len();
    for v in [
        4,
        length as u16,
        0,
        seg_count * 2,
        search_range,
        entry_selector,
        seg_count * 2 - search_range,
    ] {
        sub.extend_from_slice(&v.to_be_bytes());
    }
    for s in &segments {
        sub.extend_from_slice(&s.1.to_be_bytes());
    }
    sub.extend_from_slice(&[0, 0]); // reservedPad
    for s in &segments {
        sub.extend_from_slice(&s.0.to_be_bytes());
    }
    for s in &segments {
        let delta = if s.0 == 0xFFFF && s.2 == 0 {
            1
        } else {
            s.2.wrapping_sub(s.0)
        };
        sub.extend_from_slice(&delta.to_be_bytes());
    }
    for _ in &segments {
        sub.extend_from_slice(&[0, 0]); // idRangeOffset
    }
    let mut cmap = Vec::with_capacity(12 + sub.len());
    for v in [0u16, 1, 3, 1] {
        cmap.extend_from_slice(&v.to_be_bytes());
    }
    cmap.extend_from_slice(&12u32.to_be_bytes());
    cmap.extend_from_slice(&sub);
    cmap
}

fn checksum(data: &[u8]) -> u32 {
    data.chunks(4).fold(0u32, |sum, chunk| {
        let mut word = [0u8; 4];
        word[..chunk.len()].copy_from_slice(chunk);
        sum.wrapping_add(u32::from_be_bytes(word))
    })
}

/// Writes the sfnt header, table directory and 4-byte aligned tables, then sets
/// `head.checkSumAdjustment`.
fn assemble(tables: Vec<([u8; 4], Vec<u8>)>) -> Vec<u8> {
    let count = tables.len() as u16;
    let mut entry_selector = 0u16;
    while (2u16 << entry_selector) <= count {
        entry_selector += 1;
    }
    let search_range = 16 * (1u16 << entry_selector);
    let mut out = Vec::new();
    out.extend_from_slice(&0x0001_0000u32.to_be_bytes());
    for v in [
        count,
        search_range,
        entry_selector,
        16 * count - search_range,
    ] {
        out.extend_from_slice(&v.to_be_bytes());
    }
    let mut offset = 12 + 16 * tables.len();
    let mut head_at = None;
    for (tag, data) in &tables {
        out.extend_from_slice(tag);
        out.extend_from_slice(&checksum(data).to_be_bytes());
        out.extend_from_slice(&(offset as u32).to_be_bytes());
        out.extend_from_slice(&(data.len() as u32).to_be_bytes());
        if tag == b"head" {
            head_at = Some(offset);
        }
        offset += data.len().div_ceil(4) * 4;
    }
    for (_, data) in &tables {
        out.extend_from_slice(data);
        while out.len() % 4 != 0 {
            out.push(0);
        }
    }
    if let Some(at) = head_at {
        let adjustment = 0xB1B0_AFBAu32.wrapping_sub(checksum(&out));
        out[at + 8..at + 12].copy_from_slice(&adjustment.to_be_bytes());
    }
    out
}

#[cfg(test)]
mod tests {
    use super::super::font::{fonts, Face, FontFile};
    use super::*;

    #[test]
    fn subset_keeps_metrics_and_mapping() {
        let fonts = fonts().expect("fonts");
        let file = fonts.file(Face::Regular);
        let chars: BTreeSet<char> = "Head m³/h η Δp ≤ 5 °C Åå".chars().collect();
        let bytes = subset(file, &chars).expect("subset");
        assert!(bytes.len() < file.bytes.len() / 10, "{} bytes", bytes.len());
        let leaked: &'static [u8] = Box::leak(bytes.into_boxed_slice());
        let small = FontFile::parse(leaked).expect("subset parses");
        for ch in chars {
            let (a, b) = (file.glyph(ch), small.glyph(ch));
            assert!(a.is_some() && b.is_some(), "{ch:?}");
            let (a, b) = (a.unwrap_or(0), b.unwrap_or(0));
            assert_eq!(file.advance_em(a), small.advance_em(b), "{ch:?}");
        }
        assert!(small.glyph('Z').is_none());
        assert_eq!(checksum(leaked), 0xB1B0_AFBA);
    }
}
