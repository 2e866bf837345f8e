//! dutyline: compiles a unit-checked pumped-system design file (`*.duty`)
//! into a calculation package. See DEVELOPERS.md for the codemap.
//!
//! The pipeline runs one way: [`syntax`] → [`model`] → engine
//! ([`fluid`], [`hydraulics`], [`pumps`], [`analysis`]) → outputs.

// Diagnostics are returned by value on the cold error path; boxing them would only
// add noise to every stage.
#![allow(clippy::result_large_err)]

pub mod analysis;
pub mod diagnostics;
pub mod diff;
pub mod display;
pub mod fluid;
pub mod hydraulics;
pub mod lsp;
pub mod model;
pub mod names;
pub mod pumps;
pub mod report;
pub mod results;
pub mod syntax;
pub mod units;
pub mod verify;

use diagnostics::Diagnostic;
pub use model::{Design, FileAccess, NoFiles};

/// Version of the tool, printed in outputs.
pub const VERSION: &str = env!("CARGO_PKG_VERSION");

/// The result of checking a design: the design when it is valid, and every diagnostic.
pub struct Checked {
    pub design: Option<Design>,
    pub diagnostics: Vec<Diagnostic>,
}

impl Checked {
    pub fn has_errors(&self) -> bool {
        self.diagnostics.iter().any(|d| d.is_error())
    }
}

/// Parse and lower a design file. Never panics; all problems are diagnostics.
pub fn check(source: &str, files: &dyn FileAccess) -> Checked {
    match syntax::parse(source) {
        Ok(file) => {
            let (mut design, mut diagnostics) = model::lower(&file, source, files);
            // Cases whose water cannot be analysed are errors at check time (issue 10.5).
            if let Some(d) = &design {
                let mut water = model::vacuum::absolute_pressure_errors(d);
                if water.is_empty() {
                    water = model::scenario::water_state_errors(d);
                }
                if !water.is_empty() {
                    diagnostics.extend(water);
                    design = None;
                }
            }
            Checked {
                design,
                diagnostics,
            }
        }
        Err(diagnostics) => Checked {
            design: None,
            diagnostics,
        },
    }
}
