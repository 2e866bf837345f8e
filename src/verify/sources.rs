//! What a package is built from, as attached to it: the design file as read, the
//! files it imported, the style, an earlier revision compared with, and the build
//! record (`dutyline-build.json`) that names each attachment's role.

use std::cell::RefCell;
use std::collections::BTreeMap;

use serde::{Deserialize, Serialize};

use crate::model::{FileAccess, FileError};

/// The `format` of the build record; it changes when a field is removed or renamed.
pub const FORMAT: &str = "dutyline-package/1";

/// Name of the build record attachment.
pub const MANIFEST_NAME: &str = "dutyline-build.json";

/// Prefix of the attachments of the revision a package is compared with.
pub const COMPARE_PREFIX: &str = "compare/";

/// A design and the files it read, by the path the design names them with.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct DesignFiles {
    /// The design's file name as attached (e.g. `orchard-lift-rev-a.duty`).
    pub name: String,
    /// The design file's text, exactly as read.
    pub source: String,
    /// Every file the design read successfully: its path as written in the design →
    /// its text.
    pub imports: BTreeMap<String, String>,
}

/// The style a package was laid out with.
#[derive(Debug, Clone, PartialEq, Eq)]
pub enum StyleSource {
    /// A built-in style by name (`letter`, `a4`).
    Builtin(String),
    /// A style file: its attachment name and its text.
    File {
        /// The attachment name.
        name: String,
        /// The style file's text.
        text: String,
    },
}

/// Everything a package is compiled from.
#[derive(Debug, Clone, PartialEq, Eq)]
pub struct Sources {
    /// The design files.
    pub design: DesignFiles,
    /// The style.
    pub style: StyleSource,
    /// The earlier revision of a `build --compare`, with its files.
    pub compare: Option<DesignFiles>,
}

/// The build record, attached as `dutyline-build.json`.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
pub struct Manifest {
    /// Always [`FORMAT`].
    pub format: String,
    /// The version of dutyline that built the package (e.g. `0.1.0`).
    pub version: String,
    /// The attachment holding the design file.
    pub design: String,
    /// The attachment holding the results JSON.
    pub results: String,
    /// The built-in style's name, or `None` when `style_file` is given.
    pub style: Option<String>,
    /// The attachment holding the style file, if one was used.
    pub style_file: Option<String>,
    /// The attachment holding the earlier revision compared with, if any.
    pub compare: Option<String>,
    /// Every other attachment, in name order.
    pub files: Vec<ManifestFile>,
}

/// One attachment in the build record.
#[derive(Debug, Clone, PartialEq, Eq, Serialize, Deserialize)]
pub struct ManifestFile {
    /// The attachment's name.
    pub name: String,
    /// `design`, `import`, `style`, `compare-design`, `compare-import` or `results`.
    pub role: String,
    /// For an import: the path its design names it with.
    pub reads_as: Option<String>,
    /// SHA-256 of the content (lowercase hex).
    pub sha256: String,
    /// Size in bytes.
    pub bytes: usize,
}

/// A [`FileAccess`] that records every file read successfully through it.
pub struct Recording<'a> {
    inner: &'a dyn FileAccess,
    seen: RefCell<BTreeMap<String, String>>,
}

impl<'a> Recording<'a> {
    /// Records the reads made through `inner`.
    pub fn new(inner: &'a dyn FileAccess) -> Recording<'a> {
        Recording {
            inner,
            seen: RefCell::new(BTreeMap::new()),
        }
    }

    /// The files read: path as asked for → text.
    pub fn into_files(self) -> BTreeMap<String, String> {
        self.seen.into_inner()
    }
}

impl FileAccess for Recording<'_> {
    fn read_text(&self, path: &str) -> Result<String, FileError> {
        let text = self.inner.read_text(path)?;
        self.seen
            .borrow_mut()
            .insert(path.to_string(), text.clone());
        Ok(text)
    }
}

/// The attachment name of an imported file: its path as the design names it, under
/// `prefix` (empty for the design, [`COMPARE_PREFIX`] for the compared revision).
pub fn import_name(prefix: &str, path: &str) -> String {
    format!("{prefix}{path}")
}

/// The attachment name of the results JSON of a design called `design_name`.
pub fn results_name(design_name: &str) -> String {
    let stem = design_name.strip_suffix(".duty").unwrap_or(design_name);
    format!("{stem}.results.json")
}
