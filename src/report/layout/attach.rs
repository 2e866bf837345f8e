//! Embedded files: each attachment becomes an embedded file stream (ISO 32000-1,
//! 7.11.4) with its MIME type and size, a file specification naming it, with its
//! SHA-256 in the description and its PDF/A-3 relationship (ISO 19005-3, 6.8), an
//! entry of the catalog's `EmbeddedFiles` name tree (7.9.6, keys in byte order) and of
//! the catalog's associated files `/AF`.
//!
//! Deterministic: attachments are written in name order, the modification date is the
//! document's own date (no clock is read).

use super::document::Attachment;
use super::LayoutError;
use lopdf::{Dictionary, Object, Stream, StringFormat};

/// Adds `attachments` to `doc`; `date` is the PDF date string of the document
/// (`D:YYYYMMDDHHmmSSZ`). Two attachments with the same name are an error.
pub(super) fn embed(
    doc: &mut lopdf::Document,
    attachments: &[Attachment],
    date: &str,
    deflater: &mut super::pdf::Deflater,
) -> Result<(), LayoutError> {
    if attachments.is_empty() {
        return Ok(());
    }
    let mut sorted: Vec<&Attachment> = attachments.iter().collect();
    sorted.sort_by(|a, b| a.name.as_bytes().cmp(b.name.as_bytes()));
    if let Some(pair) = sorted.windows(2).find(|w| w[0].name == w[1].name) {
        return Err(LayoutError::Pdf(format!(
            "two attached files are named `{}`",
            pair[0].name
        )));
    }
    let mut names = Vec::new();
    let mut associated = Vec::new();
    for attachment in sorted {
        let spec = file_spec(doc, attachment, date, deflater);
        names.push(text_string(&attachment.name));
        names.push(Object::Reference(spec));
        associated.push(Object::Reference(spec));
    }
    let root = doc
        .trailer
        .get(b"Root")
        .and_then(Object::as_reference)
        .map_err(|e| LayoutError::Pdf(format!("no catalog: {e}")))?;
    let catalog = doc
        .get_dictionary_mut(root)
        .map_err(|e| LayoutError::Pdf(format!("no catalog: {e}")))?;
    let tree = Dictionary::from_iter(vec![("Names", Object::Array(names))]);
    let name_dict = Dictionary::from_iter(vec![("EmbeddedFiles", Object::Dictionary(tree))]);
    catalog.set("Names", Object::Dictionary(name_dict));
    catalog.set("AF", Object::Array(associated));
    Ok(())
}

/// The embedded file stream and its file specification; returns the specification.
fn file_spec(
    doc: &mut lopdf::Document,
    attachment: &Attachment,
    date: &str,
    deflater: &mut super::pdf::Deflater,
) -> lopdf::ObjectId {
    let params = Dictionary::from_iter(vec![
        ("Size", Object::Integer(attachment.bytes.len() as i64)),
        (
            "ModDate",
            Object::String(date.as_bytes().to_vec(), StringFormat::Literal),
        ),
    ]);
    let stream_dict = Dictionary::from_iter(vec![
        ("Type", Object::Name(b"EmbeddedFile".to_vec())),
        ("Subtype", Object::Name(attachment.mime.as_bytes().to_vec())),
        ("Params", Object::Dictionary(params)),
    ]);
    // Deflated here, from the attachment's own bytes, as the writer's last pass would
    // (the same dictionary and bytes), instead of copying them raw first.
    let stream = match deflater.pack(&attachment.bytes) {
        Some(packed) => {
            let mut stream = Stream::new(stream_dict, packed);
            stream.dict.set("Filter", "FlateDecode");
            stream
        }
        None => Stream::new(stream_dict, attachment.bytes.clone()),
    };
    let stream = doc.add_object(stream);
    let ef = Dictionary::from_iter(vec![
        ("F", Object::Reference(stream)),
        ("UF", Object::Reference(stream)),
    ]);
    let sha = &attachment.sha256;
    let spec = Dictionary::from_iter(vec![
        ("Type", Object::Name(b"Filespec".to_vec())),
        ("F", ascii_string(&attachment.name)),
        ("UF", text_string(&attachment.name)),
        (
            "Desc",
            text_string(&format!("{}; SHA-256 {sha}", attachment.description)),
        ),
        (
            "AFRelationship",
            Object::Name(attachment.relationship.as_str().as_bytes().to_vec()),
        ),
        ("EF", Object::Dictionary(ef)),
    ]);
    doc.add_object(spec)
}

/// A PDF text string (ISO 32000-1, 7.9.2.2): ASCII as a literal string, anything else
/// as UTF-16BE with a byte-order mark, written in hex.
pub(super) fn text_string(text: &str) -> Object {
    if text.is_ascii() {
        return Object::String(text.as_bytes().to_vec(), StringFormat::Literal);
    }
    let mut bytes = vec![0xfe, 0xff];
    for unit in text.encode_utf16() {
        bytes.extend_from_slice(&unit.to_be_bytes());
    }
    Object::String(bytes, StringFormat::Hexadecimal)
}

/// The `/F` byte string: the name with every non-ASCII character replaced by `_`
/// (`/UF` holds the exact name).
fn ascii_string(text: &str) -> Object {
    let bytes = text
        .chars()
        .map(|c| if c.is_ascii() { c as u8 } else { b'_' })
        .collect();
    Object::String(bytes, StringFormat::Literal)
}
