//! Revision diffs: what changed between two designs, and what that did to the results.
//!
//! * [`diff_designs`] compares the inputs semantically: things are matched by name
//!   where order means nothing (cases, pumps, requirements, assumptions, notes,
//!   fittings within a segment) and by position where it matters (segments within
//!   a line, points of a curve). Values are compared as shown in the new design's
//!   report units (6 significant digits), so layout, comments and the spelling of
//!   a number (`1202 ft` or `1202.0 ft`) never count as changes.
//! * [`diff_analyses`] compares the results per case × candidate present in both.
//! * [`diff`] does both; [`render_text`] is the reviewer's view and [`to_json`] the
//!   machine's (`"format": "dutyline-diff/1"`).
//!
//! Pure functions: no I/O, no recomputation of engineering values.

mod inputs;
mod operation;
mod results;
mod text;
pub mod tree;
pub mod values;

use serde::Serialize;

use crate::analysis::Analysis;
use crate::model::{Design, ReportUnits};

pub use inputs::{design_tree, diff_designs};
pub use results::{
    diff_analyses, CheckChange, DutyRow, NumberChange, Presence, RecommendationChange, ResultsDiff,
};
pub use text::render_text;

/// The `format` string of the diff JSON; it changes when a field is removed or renamed.
pub const FORMAT: &str = "dutyline-diff/1";

/// One changed input: where it is, and its value before and after in report units.
/// `before` is `None` for something added, `after` is `None` for something removed.
#[derive(Clone, Debug, PartialEq, Eq, Serialize)]
pub struct InputChange {
    /// E.g. `["line discharge", "segment 2", "length"]`.
    pub path: Vec<String>,
    /// The old value in report units; `None` when added.
    pub before: Option<String>,
    /// The new value in report units; `None` when removed.
    pub after: Option<String>,
}

impl InputChange {
    /// One line for a reviewer: `line discharge › segment 2 › length: 2688 ft → 2750 ft`,
    /// `case drought: added (wet_well.level = 1200.5 ft, hours = 250 h)`.
    pub fn render(&self) -> String {
        let path = self.path.join(" › ");
        let detail = |v: &str| {
            if v.is_empty() {
                String::new()
            } else {
                format!(" ({v})")
            }
        };
        match (&self.before, &self.after) {
            (Some(b), Some(a)) => format!("{path}: {b} → {a}"),
            (None, Some(a)) => format!("{path}: added{}", detail(a)),
            (Some(b), None) => format!("{path}: removed{}", detail(b)),
            (None, None) => format!("{path}: changed"),
        }
    }
}

/// Everything that changed between two revisions of a design.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct DesignDiff {
    /// Always [`FORMAT`].
    pub format: &'static str,
    /// The report units input values are shown in (the new design's): `us` or `si`.
    pub units: &'static str,
    /// Changed inputs, in the new design's order.
    pub inputs: Vec<InputChange>,
    /// Changed results.
    pub results: ResultsDiff,
    /// The new design's report units, for the text rendering.
    #[serde(skip)]
    pub report_units: ReportUnits,
}

/// Compare two designs and their analyses.
pub fn diff(
    old: &Design,
    old_analysis: &Analysis,
    new: &Design,
    new_analysis: &Analysis,
) -> DesignDiff {
    DesignDiff {
        format: FORMAT,
        units: new.project.units.keyword(),
        inputs: diff_designs(old, new),
        results: diff_analyses(
            old_analysis,
            new_analysis,
            &crate::display::Units::new(new.project.units),
        ),
        report_units: new.project.units,
    }
}

/// True when an input or a result differs.
pub fn has_differences(d: &DesignDiff) -> bool {
    !d.inputs.is_empty() || d.results.has_differences()
}

/// The diff as a JSON document (pretty-printed, ends without a line break).
pub fn to_json(d: &DesignDiff) -> String {
    serde_json::to_string_pretty(d).unwrap_or_else(|e| {
        // Serialising plain structs of strings and numbers cannot fail; say so if it does.
        format!(
            "{{\"format\": \"{FORMAT}\", \"error\": {:?}}}",
            e.to_string()
        )
    })
}
