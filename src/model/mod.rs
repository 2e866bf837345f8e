//! Model: the syntax tree lowered to a typed, unit-checked [`Design`], with
//! names resolved, pipe sizes looked up, fittings found and cases applied.

pub mod design;
pub mod eval;
mod fields;
mod lower;
mod pumps;
pub mod ranges;
pub mod scenario;

pub use design::*;
pub use lower::{lower, MAX_CASES, MAX_PUMPS, MAX_SEGMENTS};
pub use pumps::{MAX_CURVES, MAX_CURVE_POINTS};

/// The only door to other files (CSV curve tables): the caller decides what
/// a path means. The CLI reads relative to the design file; tests use a map.
pub trait FileAccess {
    fn read_text(&self, path: &str) -> Result<String, String>;
}

/// File access that finds nothing (for sources without imports).
pub struct NoFiles;

impl FileAccess for NoFiles {
    fn read_text(&self, path: &str) -> Result<String, String> {
        Err(format!("no file access was given to read `{path}`"))
    }
}

/// Files from an in-memory map, for tests.
impl FileAccess for std::collections::BTreeMap<String, String> {
    fn read_text(&self, path: &str) -> Result<String, String> {
        self.get(path)
            .cloned()
            .ok_or_else(|| "no such file".to_string())
    }
}
