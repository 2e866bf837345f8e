//! The calculation package: a deterministic PDF built from an analysis.
//! `layout` is the page-layout layer (text, tables, charts, PDF output);
//! `sections` writes the package's content on top of it.

pub mod layout;
pub mod sections;

pub use sections::SUMMARY_CASES;

use crate::analysis::Analysis;
use crate::model::Design;
use layout::style::Style;

/// Choose the style: the command line's, else the design's, else by report units
/// (letter for US customary, A4 for SI). A name is a built-in style; anything else is
/// the text of a style file the caller has read.
pub fn builtin_style_for(design: &Design) -> &'static str {
    match design.project.units {
        crate::model::ReportUnits::Us => "letter",
        crate::model::ReportUnits::Si => "a4",
    }
}

/// Render the calculation package to PDF bytes.
pub fn render_pdf(
    design: &Design,
    analysis: &Analysis,
    source: &str,
    style: &Style,
    changes: Option<&sections::Changes>,
) -> Result<Vec<u8>, String> {
    let sha = crate::results::sha256_hex(source);
    let doc = sections::document(design, analysis, source, &sha, changes);
    layout::render(&doc, style).map_err(|e| e.to_string())
}

/// [`render_pdf`] with `attachments` embedded in the PDF, said on the cover and
/// listed in the appendix.
pub fn render_pdf_attached(
    design: &Design,
    analysis: &Analysis,
    source: &str,
    style: &Style,
    changes: Option<&sections::Changes>,
    attachments: Vec<layout::Attachment>,
) -> Result<Vec<u8>, String> {
    let sha = crate::results::sha256_hex(source);
    let doc = sections::document_attached(design, analysis, source, &sha, changes, attachments);
    layout::render(&doc, style).map_err(|e| e.to_string())
}

/// A quantity of the changes table: its name, its change and how to show a value.
type Quantity<'a> = (
    &'a str,
    &'a crate::diff::NumberChange,
    &'a dyn Fn(f64) -> String,
);

/// The changes section's content from a diff, in the new design's report units;
/// `old_source` is the compared revision's file, whose SHA-256 the section prints.
pub fn changes_from_diff(
    old: &Design,
    diff: &crate::diff::DesignDiff,
    old_source: &str,
) -> sections::Changes {
    let units = crate::display::Units::new(diff.report_units);
    let (fl, hd, pw) = (units.flow(), units.head(), units.power());
    let mut rows = Vec::new();
    let cell = |v: Option<f64>, f: &dyn Fn(f64) -> String| v.map(f).unwrap_or_else(|| "—".into());
    for r in &diff.results.rows {
        let quantities: [Quantity; 5] = [
            ("duty flow", &r.flow_m3_s, &|v| fl.text(v)),
            ("duty head", &r.head_m, &|v| hd.text(v)),
            ("efficiency", &r.efficiency, &|v| crate::display::percent(v)),
            ("shaft power", &r.shaft_power, &|v| pw.text(v)),
            ("NPSH margin (ratio)", &r.npsh_margin, &|v| {
                crate::display::typeset(v, 2)
            }),
        ];
        for (name, c, f) in quantities {
            rows.push(vec![
                r.case.clone(),
                r.pump.clone(),
                name.to_string(),
                cell(c.before, f),
                cell(c.after, f),
                c.change_percent
                    .map(|p| crate::display::signed_percent(p, 1))
                    .unwrap_or_else(|| "—".into()),
            ]);
        }
    }
    for c in &diff.results.cases_added {
        rows.push(vec![
            c.clone(),
            "all".into(),
            "case added".into(),
            "—".into(),
            "new".into(),
            "—".into(),
        ]);
    }
    for c in &diff.results.cases_removed {
        rows.push(vec![
            c.clone(),
            "all".into(),
            "case removed".into(),
            "was analysed".into(),
            "—".into(),
            "—".into(),
        ]);
    }
    sections::Changes {
        old_sha256: crate::results::sha256_hex(old_source),
        old_revision: old
            .revisions
            .last()
            .map(|r| r.id.clone())
            .unwrap_or_else(|| "(none)".into()),
        inputs: diff.inputs.iter().map(|c| c.render()).collect(),
        results: rows,
        checks: diff
            .results
            .checks
            .iter()
            .map(|c| {
                vec![
                    c.case.clone(),
                    c.pump.clone(),
                    c.check.clone(),
                    c.before.unwrap_or("—").to_string(),
                    c.after.unwrap_or("—").to_string(),
                    c.message.clone(),
                ]
            })
            .collect(),
        recommendation: {
            let r = &diff.results.recommendation;
            let name = |x: &Option<String>| x.clone().unwrap_or_else(|| "none".into());
            if r.changed {
                format!(
                    "The recommendation changed: {} → {}.",
                    name(&r.before),
                    name(&r.after)
                )
            } else {
                format!("The recommendation is unchanged: {}.", name(&r.after))
            }
        },
    }
}
