//! Self-verifying packages. `build` attaches to the PDF the design file exactly as
//! read, every file it imported, the style file, the compared revision and the results
//! JSON, with a build record ([`sources::Manifest`]); [`compile()`] is the one way from
//! those sources to a package, so [`verify`] can recompile the attachments and compare
//! the result with the package byte for byte.
//!
//! Pure functions over bytes: the CLI reads and writes the files. A package is
//! untrusted input: [`pdf_read`] bounds every read.

pub mod compare;
pub mod compile;
pub mod pdf_read;
pub mod read;
pub mod results_tree;
pub mod sources;

pub use compare::{verify, Report, Verdict};
pub use compile::{compile, CompileError, Package};
pub use read::{PackageError, PackageFile};
pub use sources::{DesignFiles, Recording, Sources, StyleSource};
