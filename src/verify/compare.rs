//! `verify`: a package's attachments recompiled and the result compared with the
//! package byte for byte; where they differ, which attachment or page does.

use std::collections::BTreeMap;

use super::compile::{compile, sha256_hex, Package};
use super::pdf_read::{self, Obj, Pdf};
use super::read::{self, Appended, Embedded, PackageError};
use super::sources::{Manifest, MANIFEST_NAME};

/// Most differences listed one by one; the rest are counted.
pub const MAX_LISTED: usize = 40;
/// Deepest page tree walked.
const MAX_PAGE_TREE_DEPTH: usize = 16;
/// Most pages compared.
const MAX_PAGES: usize = 100_000;

/// The outcome of verifying a package.
#[derive(Debug, Clone, PartialEq)]
pub enum Verdict {
    /// The package is byte for byte what its attachments compile to.
    Identical,
    /// It is not; each finding says where.
    Differs(Vec<String>),
    /// Built by another version of dutyline: the results JSON was compared instead.
    OtherVersion {
        /// The version that built the package.
        built_with: String,
        /// The quantities that moved, one line each (`path: before → after`).
        moved: Vec<String>,
        /// Anything else found (altered attachments, a design that no longer compiles).
        findings: Vec<String>,
    },
}

/// What `verify` found.
#[derive(Debug, Clone, PartialEq)]
pub struct Report {
    /// The overall verdict.
    pub verdict: Verdict,
    /// The attached design's name.
    pub design: String,
    /// Bytes of the first revision (what dutyline wrote).
    pub revision_bytes: usize,
    /// What was appended after it.
    pub appended: Appended,
}

/// Verifies the package `bytes`. Errors are files that are no dutyline package.
pub fn verify(bytes: &[u8]) -> Result<Report, PackageError> {
    let file = read::read(bytes)?;
    let (manifest, sources) = read::sources(&file.embedded).map_err(|e| match e {
        PackageError::NotDutyline { why, .. } => PackageError::NotDutyline {
            producer: file.producer.clone(),
            why,
        },
        other => other,
    })?;
    let mut findings = integrity(&file.embedded, &manifest);
    let rebuilt = compile(&sources);
    let verdict = if manifest.version != crate::VERSION {
        let moved = match &rebuilt {
            Ok(package) => moved_quantities(&file.embedded, &manifest, package, &mut findings),
            Err(e) => {
                findings.push(format!(
                    "the attached sources do not compile with this version: {e}"
                ));
                Vec::new()
            }
        };
        Verdict::OtherVersion {
            built_with: manifest.version.clone(),
            moved,
            findings,
        }
    } else {
        match rebuilt {
            Ok(package) if package.bytes == bytes[..file.revision_end] && findings.is_empty() => {
                Verdict::Identical
            }
            Ok(package) => {
                let altered = !findings.is_empty();
                findings.extend(differences(
                    &bytes[..file.revision_end],
                    &file.embedded,
                    &package,
                    altered,
                ));
                Verdict::Differs(findings)
            }
            Err(e) => {
                findings.push(format!("the attached sources do not compile: {e}"));
                Verdict::Differs(findings)
            }
        }
    };
    Ok(Report {
        verdict,
        design: manifest.design,
        revision_bytes: file.revision_end,
        appended: file.appended,
    })
}

/// Attachments whose content does not match the SHA-256 recorded for it, or that the
/// build record does not list (and listed files that are missing).
fn integrity(embedded: &[Embedded], manifest: &Manifest) -> Vec<String> {
    let mut out = Vec::new();
    let listed: BTreeMap<&str, &str> = manifest
        .files
        .iter()
        .map(|f| (f.name.as_str(), f.sha256.as_str()))
        .collect();
    for e in embedded {
        let actual = sha256_hex(&e.bytes);
        if let Some(recorded) = e.recorded_sha256.as_ref().filter(|r| **r != actual) {
            out.push(format!(
                "attachment `{}` was altered: its content has SHA-256 {actual}, its description records {recorded}",
                e.name
            ));
            continue;
        }
        match listed.get(e.name.as_str()) {
            Some(sha) if *sha != actual => out.push(format!(
                "attachment `{}` does not match the build record (SHA-256 {actual}, recorded {sha})",
                e.name
            )),
            None if e.name != MANIFEST_NAME => out.push(format!(
                "attachment `{}` is not in the build record (added after the build?)",
                e.name
            )),
            _ => {}
        }
    }
    for name in listed.keys() {
        if !embedded.iter().any(|e| e.name == *name) {
            out.push(format!(
                "the build record lists `{name}`, which is not attached"
            ));
        }
    }
    out
}

/// The attached results against the recomputed ones.
fn moved_quantities(
    embedded: &[Embedded],
    manifest: &Manifest,
    package: &Package,
    findings: &mut Vec<String>,
) -> Vec<String> {
    let Some(attached) = embedded.iter().find(|e| e.name == manifest.results) else {
        findings.push(format!(
            "the results `{}` are not attached",
            manifest.results
        ));
        return Vec::new();
    };
    let old = String::from_utf8_lossy(&attached.bytes);
    match super::results_tree::changes(&old, &package.results_json) {
        Ok(changes) => changes.iter().map(|c| c.render()).collect(),
        Err(e) => {
            findings.push(e);
            Vec::new()
        }
    }
}

/// Where the package and the rebuild differ: attachments, then pages, else the first
/// differing byte. With sources already found `altered`, the build record (which
/// records their SHA-256) differs as a consequence and is not listed.
fn differences(
    original: &[u8],
    embedded: &[Embedded],
    rebuilt: &Package,
    altered: bool,
) -> Vec<String> {
    let mut out = Vec::new();
    for a in &rebuilt.attachments {
        if altered && a.name == MANIFEST_NAME {
            continue;
        }
        match embedded.iter().find(|e| e.name == a.name) {
            Some(e) if e.bytes == a.bytes => {}
            Some(_) => out.push(format!(
                "attachment `{}` differs from what the attached sources compile to",
                a.name
            )),
            None => out.push(format!("attachment `{}` is missing", a.name)),
        }
    }
    for e in embedded {
        if !rebuilt.attachments.iter().any(|a| a.name == e.name) {
            out.push(format!(
                "attachment `{}` is not one dutyline would attach",
                e.name
            ));
        }
    }
    let pages = page_differences(original, &rebuilt.bytes);
    if out.is_empty() && !altered && !pages.is_empty() {
        out.push(
            "the attached sources and results are intact: the pages were changed after the build"
                .into(),
        );
    }
    out.extend(pages.clone());
    if out.is_empty() || pages.is_empty() {
        if let Some(line) = first_byte_difference(original, &rebuilt.bytes) {
            out.push(line);
        }
    }
    out
}

/// The pages whose content differs from the rebuild's, or the page counts.
fn page_differences(original: &[u8], rebuilt: &[u8]) -> Vec<String> {
    let (Ok(a), Ok(b)) = (pdf_read::read(original), pdf_read::read(rebuilt)) else {
        return Vec::new();
    };
    let (Ok(pa), Ok(pb)) = (page_contents(&a), page_contents(&b)) else {
        return vec!["the package's page tree cannot be read".into()];
    };
    let mut out = Vec::new();
    if pa.len() != pb.len() {
        out.push(format!(
            "the package has {} pages, the rebuild {}",
            pa.len(),
            pb.len()
        ));
    }
    let differing: Vec<usize> = pa
        .iter()
        .zip(&pb)
        .enumerate()
        .filter(|(_, (x, y))| x != y)
        .map(|(i, _)| i + 1)
        .collect();
    if !differing.is_empty() {
        let list: Vec<String> = differing
            .iter()
            .take(MAX_LISTED)
            .map(usize::to_string)
            .collect();
        let more = differing.len().saturating_sub(MAX_LISTED);
        out.push(format!(
            "page{} {}{} of {} differ{} from the rebuild (page content)",
            if differing.len() == 1 { "" } else { "s" },
            list.join(", "),
            if more > 0 {
                format!(" and {more} more")
            } else {
                String::new()
            },
            pb.len(),
            if differing.len() == 1 { "s" } else { "" },
        ));
    }
    out
}

/// Each page's decoded content streams, in page order.
fn page_contents(pdf: &Pdf) -> Result<Vec<Vec<u8>>, String> {
    let Obj::Dict(root) = pdf.get(&pdf.trailer, b"Root") else {
        return Err("no catalog".into());
    };
    let mut pages = Vec::new();
    walk_pages(pdf, pdf.get(root, b"Pages"), 0, &mut pages)?;
    Ok(pages)
}

fn walk_pages(pdf: &Pdf, node: &Obj, depth: usize, out: &mut Vec<Vec<u8>>) -> Result<(), String> {
    if depth > MAX_PAGE_TREE_DEPTH || out.len() > MAX_PAGES {
        return Err("page tree too deep or too large".into());
    }
    let Obj::Dict(dict) = node else {
        return Err("a page tree node is not a dictionary".into());
    };
    if let Obj::Array(kids) = pdf.get(dict, b"Kids") {
        for kid in kids {
            walk_pages(pdf, pdf.resolve(kid), depth + 1, out)?;
        }
        return Ok(());
    }
    let streams: Vec<&Obj> = match pdf.get(dict, b"Contents") {
        Obj::Array(items) => items.iter().map(|i| pdf.resolve(i)).collect(),
        single => vec![single],
    };
    let mut content = Vec::new();
    for s in streams {
        if let Obj::Stream(d, r) = s {
            content.extend(pdf.decode(d, r).map_err(|e| e.to_string())?);
        }
    }
    out.push(content);
    Ok(())
}

/// The first byte where the two files differ, and the package object holding it.
fn first_byte_difference(original: &[u8], rebuilt: &[u8]) -> Option<String> {
    let at = original
        .iter()
        .zip(rebuilt)
        .position(|(a, b)| a != b)
        .or_else(|| (original.len() != rebuilt.len()).then(|| original.len().min(rebuilt.len())))?;
    let object = pdf_read::read(original)
        .ok()
        .and_then(|pdf| pdf.object_at(at))
        .map(|n| format!(" (in object {n})"))
        .unwrap_or_default();
    Some(format!(
        "the file differs from the rebuild from byte {at}{object}; {} bytes, the rebuild {}",
        original.len(),
        rebuilt.len()
    ))
}

impl Report {
    /// True when the package verified.
    pub fn identical(&self) -> bool {
        self.verdict == Verdict::Identical
    }

    /// The report for a reader: one line when identical, else one finding a line.
    pub fn render(&self, file: &str) -> String {
        let mut text = match &self.verdict {
            Verdict::Identical => format!(
                "{file}: verified: identical to a rebuild of its attached sources with dutyline {} (design `{}`, {} bytes)\n",
                crate::VERSION,
                self.design,
                self.revision_bytes
            ),
            Verdict::Differs(findings) => {
                let mut t = format!(
                    "{file}: NOT verified: the package differs from a rebuild of its attached sources with dutyline {} (design `{}`):\n",
                    crate::VERSION,
                    self.design
                );
                list(&mut t, findings);
                t
            }
            Verdict::OtherVersion {
                built_with,
                moved,
                findings,
            } => {
                let mut t = format!(
                    "{file}: built with dutyline {built_with}, this is dutyline {}: an exact comparison is impossible; the results JSON was recomputed and compared instead.\n",
                    crate::VERSION
                );
                list(&mut t, findings);
                if moved.is_empty() {
                    t.push_str("  no quantity moved (numbers at 6 significant digits)\n");
                } else {
                    let noun = if moved.len() == 1 { "quantity" } else { "quantities" };
                    t.push_str(&format!("  {} {noun} moved:\n", moved.len()));
                    list(&mut t, moved);
                }
                t
            }
        };
        text.push_str(&self.appended_note());
        text
    }

    /// A note on what follows the first revision, if anything.
    fn appended_note(&self) -> String {
        let a = &self.appended;
        if a.bytes == 0 {
            return String::new();
        }
        let mut t = format!(
            "  note: {} byte(s) follow the first revision (the {} bytes dutyline wrote, which were compared): {} later revision(s)",
            a.bytes, self.revision_bytes, a.revisions
        );
        for s in &a.signatures {
            let covers = s[0] == 0 && s[1] >= self.revision_bytes as u64;
            t.push_str(&format!(
                "; a digital signature over bytes {}–{} and {}–{}, which {} the compared revision",
                s[0],
                s[0] + s[1],
                s[2],
                s[2] + s[3],
                if covers { "covers" } else { "does not cover" }
            ));
        }
        t.push_str(
            ". dutyline does not validate signatures: check them with a PDF signature validator.\n",
        );
        t
    }
}

fn list(text: &mut String, items: &[String]) {
    for item in items.iter().take(MAX_LISTED) {
        text.push_str(&format!("  - {item}\n"));
    }
    if items.len() > MAX_LISTED {
        text.push_str(&format!("  … and {} more\n", items.len() - MAX_LISTED));
    }
}
