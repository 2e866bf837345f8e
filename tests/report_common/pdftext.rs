//! Reads text back out of a PDF with lopdf: content-stream strings decoded through
//! each font's ToUnicode CMap (ISO 32000-1, 9.10.3), so tests need no external tool.

use lopdf::content::Content;
use lopdf::{Document, Object};
use std::collections::BTreeMap;

/// Code -> text for one font, from the `bfchar` entries of its ToUnicode CMap.
fn parse_to_unicode(cmap: &str) -> Result<BTreeMap<u16, String>, String> {
    if cmap.contains("beginbfrange") {
        return Err("bfrange is not handled by this test reader".into());
    }
    let mut map = BTreeMap::new();
    let mut in_block = false;
    for line in cmap.lines() {
        let line = line.trim();
        if line.ends_with("beginbfchar") {
            in_block = true;
        } else if line == "endbfchar" {
            in_block = false;
        } else if in_block {
            let hexes: Vec<&str> = line
                .split(['<', '>'])
                .map(str::trim)
                .filter(|s| !s.is_empty())
                .collect();
            let [code, target] = hexes[..] else {
                return Err(format!("bad bfchar line {line:?}"));
            };
            let code = u16::from_str_radix(code, 16).map_err(|e| e.to_string())?;
            let units: Vec<u16> = (0..target.len() / 4)
                .map(|i| u16::from_str_radix(&target[4 * i..4 * i + 4], 16).unwrap_or(0xFFFD))
                .collect();
            map.insert(code, String::from_utf16_lossy(&units));
        }
    }
    Ok(map)
}

/// The text of every page: one line per text-showing operator, in stream order.
pub fn page_texts(bytes: &[u8]) -> Result<Vec<String>, String> {
    let doc = Document::load_mem(bytes).map_err(|e| e.to_string())?;
    let mut pages = Vec::new();
    for (_, page_id) in doc.get_pages() {
        let mut cmaps: BTreeMap<Vec<u8>, BTreeMap<u16, String>> = BTreeMap::new();
        for (name, font) in doc.get_page_fonts(page_id).map_err(|e| e.to_string())? {
            let reference = font
                .get(b"ToUnicode")
                .and_then(Object::as_reference)
                .map_err(|e| format!("font without ToUnicode: {e}"))?;
            let stream = doc
                .get_object(reference)
                .and_then(Object::as_stream)
                .map_err(|e| e.to_string())?;
            let data = stream
                .decompressed_content()
                .unwrap_or_else(|_| stream.content.clone());
            cmaps.insert(name, parse_to_unicode(&String::from_utf8_lossy(&data))?);
        }
        let content = doc.get_page_content(page_id);
        let content = Content::decode(&content).map_err(|e| e.to_string())?;
        let mut font: Option<&BTreeMap<u16, String>> = None;
        let mut text = String::new();
        for op in &content.operations {
            match op.operator.as_str() {
                "Tf" => {
                    let name = op.operands.first().and_then(|o| o.as_name().ok());
                    font = name.and_then(|n| cmaps.get(n));
                }
                "Tj" | "TJ" => {
                    let strings: Vec<&[u8]> = match op.operands.first() {
                        Some(Object::String(s, _)) => vec![s.as_slice()],
                        Some(Object::Array(items)) => items
                            .iter()
                            .filter_map(|i| match i {
                                Object::String(s, _) => Some(s.as_slice()),
                                _ => None,
                            })
                            .collect(),
                        _ => Vec::new(),
                    };
                    let map = font.ok_or("text shown before a font was set")?;
                    for s in strings {
                        for pair in s.chunks(2) {
                            let code = u16::from_be_bytes([pair[0], *pair.get(1).unwrap_or(&0)]);
                            match map.get(&code) {
                                Some(t) => text.push_str(t),
                                None => return Err(format!("code {code:04X} not in ToUnicode")),
                            }
                        }
                    }
                    text.push('\n');
                }
                _ => {}
            }
        }
        pages.push(text);
    }
    Ok(pages)
}
