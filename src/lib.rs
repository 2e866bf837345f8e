//! dutyline compiles a unit-checked pumped-system design file (`*.duty`) into a
//! calculation package: a PDF, JSON and text results, and a semantic diff of two
//! revisions. The library does no I/O of its own: files a design names come through
//! [`FileAccess`], and outputs are returned as values.
//!
//! # The pipeline
//!
//! A compile is one straight pass; each stage reads only the ones above it.
//!
//! | stage | module | from → to |
//! |---|---|---|
//! | parse | [`syntax`] | text → spanned syntax tree ([`syntax::ast`]), input limits, `fmt` |
//! | lower | [`model`] | tree → [`Design`]: units checked ([`units`]), names resolved, pipes and fittings looked up, cases applied, ranges checked |
//! | engine | [`fluid`], [`hydraulics`], [`pumps`] | water properties, atmosphere; pipe catalogue, friction, fittings; curve fits, affinity laws, duty solve, motors, energy (SI `f64`) |
//! | analysis | [`analysis`] | [`Design`] → [`analysis::Analysis`]: each case × candidate, checks, motor sizing, ranking |
//! | outputs | [`results`], [`report`], [`diff`] | JSON and text results, the PDF package, the difference of two revisions; report units only in [`display`] |
//!
//! Every problem is a [`diagnostics::Diagnostic`] with a typed [`diagnostics::Code`];
//! [`names`] gives the "did you mean" suggestions. DEVELOPERS.md has the file-level
//! codemap.
//!
//! # Example
//!
//! Check a small design, analyse it and read the duty point:
//!
//! ```
//! let source = r#"
//! project { title = "Example" }
//! fluid water { temperature = 15 degC }
//! site { elevation = 100 m }
//! tank sump { level = 10 m }
//! tank top { level = 40 m }
//! station { centreline = 11 m }
//! line suction from sump to pump {
//!     pipe steel 6 in schedule 40 { length = 10 m }
//!     fitting entrance_flush
//! }
//! line discharge from pump to top {
//!     pipe steel 4 in schedule 40 { length = 200 m }
//!     fitting exit
//! }
//! case normal { hours = 1000 h }
//! pump P "example" {
//!     speed = 1780 rpm
//!     curve impeller 10 in {
//!         flow m^3/h   head m
//!         0            50
//!         100          45
//!         200          30
//!     }
//! }
//! "#;
//! let checked = dutyline::check(source, &dutyline::NoFiles);
//! assert!(!checked.has_errors(), "{:?}", checked.diagnostics);
//! let design = checked.design.expect("a valid design");
//! let analysis = dutyline::analysis::analyse(&design);
//! let duty = analysis.cases[0].pumps[0].duty.as_ref().expect("a duty point");
//! // SI inside: m³/s and m. The system's 30 m static head plus friction meets the
//! // falling curve between its 100 and 200 m³/h points.
//! let flow_m3_h = duty.flow * 3600.0;
//! assert!(flow_m3_h > 80.0 && flow_m3_h < 95.0, "{flow_m3_h}");
//! assert!(duty.head > 30.0 && duty.head < 50.0, "{}", duty.head);
//! let json = dutyline::results::to_json(&design, &analysis, "example.duty", source, &checked.diagnostics);
//! assert!(json.contains("\"duty\""));
//! ```

// Diagnostics are returned by value on the cold error path; boxing them would only
// add noise to every stage.
#![allow(clippy::result_large_err)]
#![deny(missing_docs)]

pub mod analysis;
pub mod diagnostics;
pub mod diff;
pub mod display;
pub mod fluid;
pub mod hydraulics;
pub mod lsp;
pub mod message;
pub mod model;
pub mod names;
pub mod numbers;
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
    /// The design, when it has no errors.
    pub design: Option<Design>,
    /// Every error and warning, in the order found.
    pub diagnostics: Vec<Diagnostic>,
}

impl Checked {
    /// True when any diagnostic is an error.
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
                let units = display::Units::new(d.project.units);
                let render = |m: &message::Message| units.render(m);
                let mut water = model::vacuum::absolute_pressure_errors(d, &render);
                if water.is_empty() {
                    water = model::scenario::water_state_errors(d, &render);
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
