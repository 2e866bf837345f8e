//! Reading a package: its first revision, the embedded files and the build record,
//! and what was appended after it (a signature's incremental update).

use std::collections::BTreeMap;

use super::pdf_read::{self, Obj, Pdf, ReadError};
use super::sources::{
    DesignFiles, Manifest, Sources, StyleSource, COMPARE_PREFIX, FORMAT, MANIFEST_NAME,
};

/// Largest package read, in bytes (256 MiB).
pub const MAX_PACKAGE_BYTES: usize = 256 << 20;
/// Most attachments read from one package.
pub const MAX_ATTACHMENTS: usize = 10_000;

/// One embedded file of a package.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Embedded {
    /// Its name (`/UF`, else `/F`).
    pub name: String,
    /// Its content, decoded.
    pub bytes: Vec<u8>,
    /// The SHA-256 its description records (lowercase hex), if any.
    pub recorded_sha256: Option<String>,
}

/// What follows the first revision.
#[derive(Debug, Clone, PartialEq, Eq, Default)]
pub struct Appended {
    /// Bytes after the first revision (white space not counted).
    pub bytes: usize,
    /// Revisions appended (`%%EOF` markers after the first).
    pub revisions: usize,
    /// Byte ranges of signatures found (`/ByteRange [a b c d]`).
    pub signatures: Vec<[u64; 4]>,
}

/// A package as read.
#[derive(Debug)]
pub struct PackageFile {
    /// Length of the first revision, in bytes.
    pub revision_end: usize,
    /// The embedded files, in file order.
    pub embedded: Vec<Embedded>,
    /// The `/Producer` of the document information, if any.
    pub producer: Option<String>,
    /// What was appended after the first revision.
    pub appended: Appended,
}

/// Why a file is not a readable dutyline package.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum PackageError {
    /// Larger than [`MAX_PACKAGE_BYTES`].
    TooLarge(usize),
    /// Not readable as the PDF dutyline writes.
    Pdf(ReadError),
    /// A PDF, but without dutyline's attachments (`producer` says who wrote it).
    NotDutyline {
        /// The PDF's `/Producer`, when it has one.
        producer: Option<String>,
        /// Why it is not taken for a dutyline package.
        why: String,
    },
    /// The build record is missing something or cannot be read.
    Manifest(String),
}

impl std::fmt::Display for PackageError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            PackageError::TooLarge(n) => write!(
                f,
                "the file has {n} bytes, more than the {MAX_PACKAGE_BYTES} a package may have"
            ),
            PackageError::Pdf(e) => write!(f, "not a readable dutyline package: {e}"),
            PackageError::NotDutyline { producer, why } => {
                write!(f, "not a dutyline package: {why}")?;
                match producer {
                    Some(p) => write!(f, " (the PDF says it was produced by `{p}`)"),
                    None => Ok(()),
                }
            }
            PackageError::Manifest(e) => write!(f, "the build record `{MANIFEST_NAME}` {e}"),
        }
    }
}

/// Reads a package's first revision and its embedded files.
pub fn read(bytes: &[u8]) -> Result<PackageFile, PackageError> {
    if bytes.len() > MAX_PACKAGE_BYTES {
        return Err(PackageError::TooLarge(bytes.len()));
    }
    let pdf = pdf_read::read(bytes).map_err(|e| unreadable(bytes, e))?;
    let producer = producer(&pdf);
    let not_ours = |why: &str| PackageError::NotDutyline {
        producer: producer.clone(),
        why: why.to_string(),
    };
    let root = match pdf.get(&pdf.trailer, b"Root") {
        Obj::Dict(d) => d,
        _ => return Err(not_ours("it has no document catalog")),
    };
    let names = match pdf.get(root, b"Names") {
        Obj::Dict(d) => d,
        _ => return Err(not_ours("it carries no embedded files")),
    };
    let tree = match pdf.get(names, b"EmbeddedFiles") {
        Obj::Dict(d) => d,
        _ => return Err(not_ours("it carries no embedded files")),
    };
    let entries = match pdf.get(tree, b"Names") {
        Obj::Array(a) => a,
        _ => {
            return Err(not_ours(
                "its embedded files are not listed as dutyline lists them",
            ))
        }
    };
    if entries.len() / 2 > MAX_ATTACHMENTS {
        return Err(not_ours("it has more embedded files than dutyline writes"));
    }
    let mut embedded = Vec::new();
    for pair in entries.chunks(2) {
        let [_, spec] = pair else {
            return Err(not_ours("its list of embedded files is incomplete"));
        };
        embedded.push(embedded_file(&pdf, spec).map_err(|why| not_ours(&why))?);
    }
    Ok(PackageFile {
        revision_end: pdf.end,
        embedded,
        producer,
        appended: appended(&bytes[pdf.end..]),
    })
}

/// A PDF dutyline cannot read: truncated, or not written by dutyline when it does
/// not even name a build record, else damaged.
fn unreadable(bytes: &[u8], error: ReadError) -> PackageError {
    let named = bytes
        .windows(MANIFEST_NAME.len())
        .any(|w| w == MANIFEST_NAME.as_bytes());
    match error {
        ReadError::Malformed { .. } | ReadError::Unsupported(_) if !named => {
            PackageError::NotDutyline {
                producer: loose_producer(bytes),
                why: format!(
                    "it names no build record `{MANIFEST_NAME}`, and its structure is not what dutyline writes ({})",
                    match &error {
                        ReadError::Malformed { at, what } => format!("at byte {at}: {what}"),
                        other => other.to_string(),
                    }
                ),
            }
        }
        other => PackageError::Pdf(other),
    }
}

/// The `/Producer` string wherever it stands uncompressed in the file, if anywhere.
fn loose_producer(bytes: &[u8]) -> Option<String> {
    let key = b"/Producer";
    let at = bytes.windows(key.len()).rposition(|w| w == key)? + key.len();
    match pdf_read::parse_object(&bytes[at..bytes.len().min(at + 400)]) {
        Some(Obj::Str(s)) => Some(pdf_read::text(&s).chars().take(200).collect()),
        _ => None,
    }
}

/// One file specification's name, content and recorded SHA-256.
fn embedded_file(pdf: &Pdf, spec: &Obj) -> Result<Embedded, String> {
    let Obj::Dict(spec) = pdf.resolve(spec) else {
        return Err("an embedded file has no file specification".into());
    };
    let name = match (pdf.get(spec, b"UF"), pdf.get(spec, b"F")) {
        (Obj::Str(s), _) | (_, Obj::Str(s)) => pdf_read::text(s),
        _ => return Err("an embedded file has no name".into()),
    };
    let stream = match pdf.get(spec, b"EF") {
        Obj::Dict(ef) => match (pdf.get(ef, b"UF"), pdf.get(ef, b"F")) {
            (Obj::Stream(d, r), _) | (_, Obj::Stream(d, r)) => (d, r),
            _ => return Err(format!("the embedded file `{name}` has no content")),
        },
        _ => return Err(format!("the embedded file `{name}` has no content")),
    };
    let bytes = pdf
        .decode(stream.0, stream.1)
        .map_err(|e| format!("the embedded file `{name}` cannot be read: {e}"))?;
    let recorded_sha256 = match pdf.get(spec, b"Desc") {
        Obj::Str(s) => recorded_sha(&pdf_read::text(s)),
        _ => None,
    };
    Ok(Embedded {
        name,
        bytes,
        recorded_sha256,
    })
}

/// The 64 hex digits after `SHA-256 ` in a description.
fn recorded_sha(description: &str) -> Option<String> {
    let at = description.find("SHA-256 ")? + "SHA-256 ".len();
    let hex = description.get(at..at + 64)?;
    hex.chars()
        .all(|c| c.is_ascii_hexdigit())
        .then(|| hex.to_ascii_lowercase())
}

fn producer(pdf: &Pdf) -> Option<String> {
    let Obj::Dict(info) = pdf.get(&pdf.trailer, b"Info") else {
        return None;
    };
    match pdf.get(info, b"Producer") {
        Obj::Str(s) => Some(pdf_read::text(s).chars().take(200).collect()),
        _ => None,
    }
}

/// What follows the first revision.
fn appended(rest: &[u8]) -> Appended {
    let bytes = rest.iter().filter(|c| !c.is_ascii_whitespace()).count();
    let count = |needle: &[u8]| rest.windows(needle.len()).filter(|w| *w == needle).count();
    let mut signatures = Vec::new();
    let key = b"/ByteRange";
    let mut from = 0;
    while let Some(at) = rest[from..].windows(key.len()).position(|w| w == key) {
        let start = from + at + key.len();
        if let Some(Obj::Array(items)) =
            pdf_read::parse_object(&rest[start..rest.len().min(start + 200)])
        {
            let ints: Vec<u64> = items
                .iter()
                .filter_map(|o| match o {
                    Obj::Int(i) => u64::try_from(*i).ok(),
                    _ => None,
                })
                .collect();
            if let [a, b, c, d] = ints[..] {
                signatures.push([a, b, c, d]);
            }
        }
        from = start;
        if signatures.len() > 100 {
            break;
        }
    }
    Appended {
        bytes,
        revisions: count(b"%%EOF"),
        signatures,
    }
}

/// The build record and the sources it names, from a package's embedded files.
pub fn sources(embedded: &[Embedded]) -> Result<(Manifest, Sources), PackageError> {
    let files: BTreeMap<&str, &Embedded> = embedded.iter().map(|e| (e.name.as_str(), e)).collect();
    let record = files
        .get(MANIFEST_NAME)
        .ok_or_else(|| PackageError::NotDutyline {
            producer: None,
            why: format!("it carries no build record `{MANIFEST_NAME}`"),
        })?;
    let manifest: Manifest = serde_json::from_slice(&record.bytes)
        .map_err(|e| PackageError::Manifest(format!("cannot be read: {e}")))?;
    if manifest.format != FORMAT {
        return Err(PackageError::Manifest(format!(
            "has format `{}`; this dutyline reads `{FORMAT}`",
            manifest.format
        )));
    }
    let text = |name: &str| -> Result<String, PackageError> {
        let file = files.get(name).ok_or_else(|| {
            PackageError::Manifest(format!("names `{name}`, which is not attached"))
        })?;
        String::from_utf8(file.bytes.clone())
            .map_err(|_| PackageError::Manifest(format!("names `{name}`, which is not UTF-8 text")))
    };
    let imports = |role: &str| -> Result<BTreeMap<String, String>, PackageError> {
        super::compile::imports_of(&manifest, role)
            .into_iter()
            .map(|(reads_as, name)| Ok((reads_as, text(&name)?)))
            .collect()
    };
    let design = DesignFiles {
        name: manifest.design.clone(),
        source: text(&manifest.design)?,
        imports: imports("import")?,
    };
    let style = match (&manifest.style, &manifest.style_file) {
        (_, Some(name)) => StyleSource::File {
            name: name.clone(),
            text: text(name)?,
        },
        (Some(name), None) => StyleSource::Builtin(name.clone()),
        (None, None) => return Err(PackageError::Manifest("names no style".into())),
    };
    let compare = match &manifest.compare {
        Some(name) => Some(DesignFiles {
            name: name
                .strip_prefix(COMPARE_PREFIX)
                .unwrap_or(name)
                .to_string(),
            source: text(name)?,
            imports: imports("compare-import")?,
        }),
        None => None,
    };
    Ok((
        manifest,
        Sources {
            design,
            style,
            compare,
        },
    ))
}
