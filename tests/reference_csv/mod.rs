//! Reads the committed reference CSV files in tests/reference/ (written by the Python
//! scripts beside them), so the tests run without Python.

#![allow(dead_code)] // shared by several test crates; not each uses every helper

use std::path::PathBuf;

/// One parsed CSV: the header names and the rows as strings.
pub struct Table {
    pub header: Vec<String>,
    pub rows: Vec<Vec<String>>,
}

impl Table {
    /// Column index by name; panics (in a test) when the column is missing.
    pub fn column(&self, name: &str) -> usize {
        self.header
            .iter()
            .position(|h| h == name)
            .unwrap_or_else(|| panic!("column {name} missing from {:?}", self.header))
    }

    /// A cell as f64, or None when the cell is empty.
    pub fn number(&self, row: &[String], name: &str) -> Option<f64> {
        let cell = &row[self.column(name)];
        if cell.is_empty() {
            None
        } else {
            Some(
                cell.parse()
                    .unwrap_or_else(|e| panic!("bad number {cell:?}: {e}")),
            )
        }
    }

    /// A cell as text.
    pub fn text<'a>(&self, row: &'a [String], name: &str) -> &'a str {
        &row[self.column(name)]
    }
}

/// Loads tests/reference/<file_name>, skipping `#` comment lines.
pub fn load(file_name: &str) -> Table {
    let path: PathBuf = [env!("CARGO_MANIFEST_DIR"), "tests", "reference", file_name]
        .iter()
        .collect();
    let text = std::fs::read_to_string(&path)
        .unwrap_or_else(|e| panic!("cannot read {}: {e}", path.display()));
    let mut lines = text
        .lines()
        .filter(|line| !line.starts_with('#') && !line.trim().is_empty());
    let header = lines
        .next()
        .unwrap_or_else(|| panic!("{} has no header", path.display()))
        .split(',')
        .map(str::to_owned)
        .collect();
    let rows = lines
        .map(|line| line.split(',').map(str::to_owned).collect())
        .collect();
    Table { header, rows }
}
