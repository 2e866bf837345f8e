//! Results as data: the JSON contract (`shared/design/results-json.md`) and a
//! stable, diff-friendly text summary in report units.

mod envelope_text;
mod json;
mod operation_text;
mod text;
mod well_field_text;

pub use json::{to_json, write_json, FORMAT};
pub use text::{to_text, write_text};

use sha2::{Digest, Sha256};

/// Hex SHA-256 of a source text.
pub fn sha256_hex(source: &str) -> String {
    let digest = Sha256::digest(source.as_bytes());
    digest.iter().map(|b| format!("{b:02x}")).collect()
}
