//! Compiling a package from its [`Sources`] alone: the one path `build` and `verify`
//! both take, so a rebuild from the attachments is byte-identical to the build.

use std::collections::BTreeMap;

use super::sources::{
    import_name, results_name, DesignFiles, Manifest, ManifestFile, Sources, StyleSource,
    COMPARE_PREFIX, FORMAT, MANIFEST_NAME,
};
use crate::analysis::Analysis;
use crate::diagnostics::Diagnostic;
use crate::model::Design;
use crate::report::layout::style::{Style, StyleError};
use crate::report::layout::{Attachment, Relationship};

/// A package compiled from its sources.
pub struct Package {
    /// The PDF.
    pub bytes: Vec<u8>,
    /// The files embedded in it.
    pub attachments: Vec<Attachment>,
    /// The analysis the package shows.
    pub analysis: Analysis,
    /// The results JSON (also attached).
    pub results_json: String,
}

/// Why sources could not be compiled into a package.
#[derive(Debug, Clone, PartialEq)]
pub enum CompileError {
    /// The design (or the compared revision, `compared`) has errors.
    Design {
        /// True when the errors are in the compared (earlier) revision.
        compared: bool,
        /// The design's diagnostics.
        diagnostics: Vec<Diagnostic>,
    },
    /// The style file is not a valid style.
    Style(StyleError),
    /// The package could not be laid out or written.
    Layout(String),
}

impl std::fmt::Display for CompileError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            CompileError::Design {
                compared,
                diagnostics,
            } => {
                let errors: Vec<&Diagnostic> =
                    diagnostics.iter().filter(|d| d.is_error()).collect();
                let which = if *compared {
                    "the compared revision"
                } else {
                    "the design"
                };
                write!(f, "{which} has {} error(s)", errors.len())?;
                if let Some(first) = errors.first() {
                    write!(f, ", the first: {}", first.message)?;
                }
                Ok(())
            }
            CompileError::Style(e) => write!(f, "the style file is not valid: {}", e.message),
            CompileError::Layout(e) => write!(f, "the package could not be laid out: {e}"),
        }
    }
}

/// Check, analyse and lay out the package of `sources`, with its attachments.
pub fn compile(sources: &Sources) -> Result<Package, CompileError> {
    let (design, diagnostics) = checked(&sources.design, false)?;
    let style = match &sources.style {
        StyleSource::Builtin(name) => Style::builtin(name)
            .ok_or_else(|| CompileError::Layout(format!("`{name}` is not a built-in style")))?,
        StyleSource::File { text, .. } => Style::from_toml(text).map_err(CompileError::Style)?,
    };
    let analysis = crate::analysis::analyse(&design);
    let changes = match &sources.compare {
        Some(old) => {
            let (old_design, _) = checked(old, true)?;
            let old_analysis = crate::analysis::analyse(&old_design);
            let diff = crate::diff::diff(&old_design, &old_analysis, &design, &analysis);
            Some(crate::report::changes_from_diff(
                &old_design,
                &diff,
                &old.source,
            ))
        }
        None => None,
    };
    // A summarised package attaches the governing cases' results only (see
    // `summary::governing_only`).
    let governing = crate::report::sections::summary::governing_only(&design, &analysis);
    let (in_json, analysed) = governing
        .as_ref()
        .map_or((&design, &analysis), |(d, a)| (d, a));
    let results_json = crate::results::to_json(
        in_json,
        analysed,
        &sources.design.name,
        &sources.design.source,
        &diagnostics,
    );
    drop(governing);
    let scope = match crate::report::sections::summary::summarised(&design) {
        true => ResultsScope::Governing,
        false => ResultsScope::Every,
    };
    let attachments = attachments(sources, &results_json, scope);
    let bytes = crate::report::render_pdf_attached(
        &design,
        &analysis,
        &sources.design.source,
        &style,
        changes.as_ref(),
        attachments.clone(),
    )
    .map_err(CompileError::Layout)?;
    Ok(Package {
        bytes,
        attachments,
        analysis,
        results_json,
    })
}

/// The design of `files`, checked with its imports from memory.
fn checked(files: &DesignFiles, compared: bool) -> Result<(Design, Vec<Diagnostic>), CompileError> {
    let checked = crate::check(&files.source, &files.imports);
    match checked.design {
        Some(design) if !checked.has_errors() => Ok((design, checked.diagnostics)),
        _ => Err(CompileError::Design {
            compared,
            diagnostics: checked.diagnostics,
        }),
    }
}

/// Which cases the attached results JSON holds.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum ResultsScope {
    /// Every case of the design.
    Every,
    /// The governing cases of a summarised package (the design recomputes the rest).
    Governing,
}

/// The files a package carries: sources, results JSON and the build record.
pub fn attachments(sources: &Sources, results_json: &str, scope: ResultsScope) -> Vec<Attachment> {
    let mut list = Vec::new();
    let mut record = Vec::new();
    let mut add = |list: &mut Vec<Attachment>, file: AttachedFile| {
        let attachment = Attachment::new(
            file.name,
            file.mime,
            file.description.to_string(),
            file.relationship,
            file.text.into_bytes(),
        );
        record.push(ManifestFile {
            name: attachment.name.clone(),
            role: file.role.to_string(),
            reads_as: file.reads_as,
            sha256: attachment.sha256.clone(),
            bytes: attachment.bytes.len(),
        });
        list.push(attachment);
    };
    design_files(&sources.design, "", &mut |f| add(&mut list, f));
    if let Some(old) = &sources.compare {
        design_files(old, COMPARE_PREFIX, &mut |f| add(&mut list, f));
    }
    let style_file = match &sources.style {
        StyleSource::File { name, text } => {
            add(
                &mut list,
                AttachedFile::source(name.clone(), "style", None, text, "style file"),
            );
            Some(name.clone())
        }
        StyleSource::Builtin(_) => None,
    };
    let results = results_name(&sources.design.name);
    add(
        &mut list,
        AttachedFile {
            name: results.clone(),
            role: "results",
            reads_as: None,
            text: results_json.to_string(),
            mime: "application/json",
            description: match scope {
                ResultsScope::Every => "results (JSON)",
                ResultsScope::Governing => "results of the governing cases (JSON)",
            },
            relationship: Relationship::Data,
        },
    );
    record.sort_by(|a, b| a.name.as_bytes().cmp(b.name.as_bytes()));
    let manifest = Manifest {
        format: FORMAT.to_string(),
        version: crate::VERSION.to_string(),
        design: sources.design.name.clone(),
        results,
        style: match &sources.style {
            StyleSource::Builtin(name) => Some(name.clone()),
            StyleSource::File { .. } => None,
        },
        style_file,
        compare: sources
            .compare
            .as_ref()
            .map(|old| format!("{COMPARE_PREFIX}{}", old.name)),
        files: record,
    };
    let json = serde_json::to_string_pretty(&manifest).unwrap_or_default() + "\n";
    list.push(Attachment::new(
        MANIFEST_NAME.to_string(),
        "application/json",
        "build record".into(),
        Relationship::Supplement,
        json.into_bytes(),
    ));
    list
}

/// One file to attach, before it is recorded.
struct AttachedFile {
    name: String,
    role: &'static str,
    reads_as: Option<String>,
    text: String,
    mime: &'static str,
    description: &'static str,
    relationship: Relationship,
}

impl AttachedFile {
    fn source(
        name: String,
        role: &'static str,
        reads_as: Option<String>,
        text: &str,
        description: &'static str,
    ) -> AttachedFile {
        AttachedFile {
            mime: mime_of(&name),
            name,
            role,
            reads_as,
            text: text.to_string(),
            description,
            relationship: Relationship::Source,
        }
    }
}

/// A design and its imports as files to attach, their names under `prefix`.
fn design_files(files: &DesignFiles, prefix: &str, add: &mut dyn FnMut(AttachedFile)) {
    let compared = !prefix.is_empty();
    add(AttachedFile::source(
        format!("{prefix}{}", files.name),
        if compared { "compare-design" } else { "design" },
        None,
        &files.source,
        if compared {
            "compared revision"
        } else {
            "design file"
        },
    ));
    for (path, text) in &files.imports {
        add(AttachedFile::source(
            import_name(prefix, path),
            if compared { "compare-import" } else { "import" },
            Some(path.clone()),
            text,
            "imported file",
        ));
    }
}

/// The MIME type of a file by its extension (RFC 4180 `text/csv`; TOML's
/// `application/toml`, registered 2024; a design is plain text).
fn mime_of(name: &str) -> &'static str {
    let lower = name.to_ascii_lowercase();
    if lower.ends_with(".csv") {
        "text/csv"
    } else if lower.ends_with(".toml") {
        "application/toml"
    } else if lower.ends_with(".json") {
        "application/json"
    } else {
        "text/plain"
    }
}

/// SHA-256 as lowercase hex.
pub fn sha256_hex(bytes: &[u8]) -> String {
    crate::report::layout::document::sha256_hex(bytes)
}

/// The imports of the compared revision in a record: reads-as path → attachment name.
pub fn imports_of(manifest: &Manifest, role: &str) -> BTreeMap<String, String> {
    manifest
        .files
        .iter()
        .filter(|f| f.role == role)
        .filter_map(|f| Some((f.reads_as.clone()?, f.name.clone())))
        .collect()
}
