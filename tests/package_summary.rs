//! Designs with more than `SUMMARY_CASES` cases get a summarised package (issue 17):
//! a case summary chapter over every case, and per-case chapters for the governing
//! cases only. The demos (a handful of cases each) are not summarised.

#[path = "../benches/support/large_design.rs"]
mod large_design;

use dutyline::report::layout::{Block, Span};
use dutyline::report::SUMMARY_CASES;

/// The words of the package's headings, paragraphs and tables for `cases` generated
/// cases (not the appendix's listing of the design file, which names every case).
fn package(cases: usize) -> (usize, String) {
    let src = large_design::large_design(cases);
    let checked = dutyline::check(&src, &dutyline::NoFiles);
    assert!(!checked.has_errors(), "the generated design checks");
    let d = checked.design.expect("design");
    let a = dutyline::analysis::analyse(&d);
    let doc = dutyline::report::sections::document(&d, &a, &src, "0", None);
    let mut words = Vec::new();
    for block in &doc.blocks {
        match block {
            Block::Heading { text, .. } => words.push(text.clone()),
            Block::Paragraph(spans) => words.extend(spans.iter().map(|s| match s {
                Span::Plain(t) | Span::Bold(t) | Span::Mono(t) => t.clone(),
            })),
            Block::Table { rows, .. } => words.extend(rows.iter().flatten().cloned()),
            _ => {}
        }
    }
    let body = words.join(" ");
    let body = body.split_whitespace().collect::<Vec<_>>().join(" ");
    (doc.blocks.len(), body)
}

#[test]
fn a_design_above_the_threshold_is_summarised_over_every_case() {
    let n = SUMMARY_CASES + 20;
    let (_, body) = package(n);
    assert!(body.contains("Case summary"));
    assert!(
        body.contains(&format!("This design has {n} operating cases")),
        "the summary says how many cases it covers"
    );
    // The generator sets the wet-well level 99.00 m + 0.03 m × case number: case c0
    // has the lowest source level, hence the highest static head (140 m − 99 m = 41 m),
    // and the last case the lowest. Both are governing cases and say why.
    assert!(body.contains("highest static head"));
    assert!(body.contains("lowest static head"));
    // Each candidate's bins end with an "all duties" row counting every case.
    let all_rows = body.matches("all duties").count();
    assert_eq!(all_rows, 10, "one row per candidate");
    // A middle case is neither an extreme of level nor of any duty: it appears in no
    // per-case table (only in the design file, which this text excludes).
    assert!(
        !body.split_whitespace().any(|w| w == "c30" || w == "c30:"),
        "c30 is not a governing case"
    );
}

#[test]
fn a_design_at_the_threshold_is_not_summarised() {
    let (_, body) = package(SUMMARY_CASES);
    assert!(!body.contains("Case summary"));
    assert!(
        body.split_whitespace().any(|w| w == "c30"),
        "every case is shown"
    );
}

#[test]
fn a_summarised_package_attaches_the_governing_cases_results() {
    use dutyline::verify::{DesignFiles, Sources, StyleSource};
    let n = SUMMARY_CASES + 20;
    let src = large_design::large_design(n);
    let d = dutyline::check(&src, &dutyline::NoFiles)
        .design
        .expect("design");
    let sources = Sources {
        design: DesignFiles {
            name: "large.duty".into(),
            source: src.clone(),
            imports: Default::default(),
        },
        style: StyleSource::Builtin(dutyline::report::builtin_style_for(&d).to_string()),
        compare: None,
    };
    let package = dutyline::verify::compile(&sources).expect("compiles");
    let json: serde_json::Value = serde_json::from_str(&package.results_json).expect("json");
    let cases = json["cases"].as_array().expect("cases").len();
    assert!(cases > 0 && cases < n, "{cases} of {n} cases attached");
    let results = package
        .attachments
        .iter()
        .find(|a| a.name.ends_with(".json") && a.description.contains("results"))
        .expect("results attached");
    assert!(
        results.description.contains("governing"),
        "{}",
        results.description
    );
    // The ranking still covers every case: the same as the whole design's.
    let whole = dutyline::analysis::analyse(&d);
    assert_eq!(
        json["selection"]["recommended"].as_str(),
        whole.selection.recommended.as_deref()
    );
}
