//! What a reviewer rejects at a glance, tested on the text of every page of each demo
//! package: PDF metadata (title with the calculation number, author, a creation date
//! from the revision, no producer timestamp, no empty keys), no input syntax or raw
//! identifiers, no value in the other unit system, no negative zero, and the
//! calculation number and "page x of y" on every page.

mod report_common;

use report_common::pdftext::page_texts;

struct DemoFiles;
impl dutyline::FileAccess for DemoFiles {
    fn read_text(&self, path: &str) -> Result<String, dutyline::model::FileError> {
        std::fs::read_to_string(format!("examples-demo/{path}"))
            .map_err(|e| dutyline::model::FileError::Unreadable(e.to_string()))
    }
}

const DEMOS: [&str; 6] = [
    "orchard-lift-rev-a",
    "orchard-lift-rev-b",
    "kestrel-booster",
    "hillside-district",
    "wrenfield-chilled-water",
    "cedar-flats-well-field",
];

struct Package {
    design: dutyline::Design,
    pdf: Vec<u8>,
    pages: Vec<String>,
}

fn package(demo: &str) -> Package {
    let src = std::fs::read_to_string(format!("examples-demo/{demo}.duty")).unwrap();
    let design = dutyline::check(&src, &DemoFiles)
        .design
        .expect("valid demo");
    let a = dutyline::analysis::analyse(&design);
    let style = dutyline::report::layout::style::Style::builtin(
        dutyline::report::builtin_style_for(&design),
    )
    .unwrap();
    let pdf = dutyline::report::render_pdf(&design, &a, &src, &style, None).unwrap();
    let pages = page_texts(&pdf).unwrap();
    Package { design, pdf, pages }
}

/// The pages before the appendix, which reproduces the design file verbatim (input
/// syntax and the file's own units belong there).
fn body(p: &Package) -> &[String] {
    let end = p
        .pages
        .iter()
        .position(|t| t.contains("The file compiled, verbatim"))
        .expect("an appendix");
    &p.pages[..end]
}

/// The words of a page, punctuation around them trimmed.
fn words(text: &str) -> Vec<&str> {
    text.split(|c: char| c.is_whitespace() || c == '|')
        .map(|w| w.trim_matches(|c: char| ",;:()[]\"'".contains(c)))
        .filter(|w| !w.is_empty())
        .collect()
}

/// A text string of the PDF Info dictionary (UTF-16BE with its byte-order mark, or
/// PDFDocEncoding read as Latin-1).
fn info_text(info: &lopdf::Dictionary, key: &[u8]) -> Option<String> {
    let bytes = info.get(key).ok()?.as_str().ok()?;
    Some(match bytes.strip_prefix(&[0xFE, 0xFF]) {
        Some(utf16) => {
            let units: Vec<u16> = utf16
                .chunks(2)
                .map(|c| u16::from_be_bytes([c[0], *c.get(1).unwrap_or(&0)]))
                .collect();
            String::from_utf16_lossy(&units)
        }
        None => bytes.iter().map(|&b| b as char).collect(),
    })
}

#[test]
fn metadata_names_the_calculation_and_dates_it_by_its_revision() {
    for demo in DEMOS {
        let p = package(demo);
        let doc = lopdf::Document::load_mem(&p.pdf).unwrap();
        let info_ref = doc.trailer.get(b"Info").unwrap().as_reference().unwrap();
        let info = doc.get_object(info_ref).unwrap().as_dict().unwrap();
        let title = info_text(info, b"Title").unwrap();
        assert!(
            title.contains(&p.design.project.number) && title.contains(&p.design.project.title),
            "{demo}: title {title:?}"
        );
        assert_eq!(
            info_text(info, b"Author").as_deref(),
            Some(p.design.project.prepared.as_str()),
            "{demo}: author"
        );
        let revision_date = p.design.revisions.last().expect("a revision").date.clone();
        let expected = format!("D:{}000000", revision_date.replace('-', ""));
        for key in [&b"CreationDate"[..], b"ModDate"] {
            let date = info_text(info, key).unwrap_or_default();
            assert!(
                date.starts_with(&expected),
                "{demo}: {} {date:?}, expected the revision's date {expected}",
                String::from_utf8_lossy(key)
            );
        }
        let producer = info_text(info, b"Producer").unwrap();
        assert!(
            !producer.chars().any(|c| c.is_ascii_digit()),
            "{demo}: producer {producer:?} carries a version or timestamp"
        );
        for (key, value) in info.iter() {
            if let Ok(s) = value.as_str() {
                assert!(
                    !s.is_empty() && s != [0xFE, 0xFF],
                    "{demo}: empty Info key {}",
                    String::from_utf8_lossy(key)
                );
            }
            assert!(
                !key.starts_with(b"GTS_PDFX"),
                "{demo}: a PDF/X key in a document that is not PDF/X"
            );
        }
        let again = package(demo);
        assert!(again.pdf == p.pdf, "{demo}: two builds differ");
    }
}

#[test]
fn every_page_carries_the_calculation_number_and_page_x_of_y() {
    for demo in DEMOS {
        let p = package(demo);
        let n = p.pages.len();
        for (k, text) in p.pages.iter().enumerate() {
            assert!(
                text.contains(&p.design.project.number),
                "{demo}: page {} lacks the number",
                k + 1
            );
            assert!(
                text.contains(&format!("page {} of {n}", k + 1)),
                "{demo}: page {} lacks 'page {} of {n}'",
                k + 1,
                k + 1
            );
        }
    }
}

#[test]
fn no_input_syntax_or_raw_identifiers_before_the_appendix() {
    for demo in DEMOS {
        let p = package(demo);
        let d = &p.design;
        // The designer's own names (cases, tanks, lines, pumps) are the reader's names too.
        let mut names: Vec<&str> = d.cases.iter().map(|c| c.name.as_str()).collect();
        names.extend([
            d.base.source.name.as_str(),
            d.base.destination.name.as_str(),
        ]);
        names.extend(d.base.lines.iter().map(|l| l.name.as_str()));
        names.extend(d.pumps.iter().map(|p| p.name.as_str()));
        // Network nodes, floating tanks and links are named by the designer too.
        if let Some(net) = &d.base.network {
            names.extend(net.nodes.iter().map(|n| n.name.as_str()));
            names.extend(net.tanks.iter().map(|t| t.name.as_str()));
            names.extend(net.links.iter().map(|l| l.name.as_str()));
        }
        let fittings: Vec<&str> = dutyline::hydraulics::fittings::all_fittings()
            .iter()
            .map(|f| f.name)
            .collect();
        for (k, text) in body(&p).iter().enumerate() {
            for typed in ["`", "m^3", "ft^3", "degC", "degF", ">=", "<=", "Kinf"] {
                assert!(
                    !text.contains(typed),
                    "{demo}: page {} prints input syntax {typed:?}",
                    k + 1
                );
            }
            for w in words(text) {
                let identifier = w.contains('_')
                    && w.chars()
                        .all(|c| c.is_ascii_lowercase() || c.is_ascii_digit() || c == '_');
                assert!(
                    !identifier || names.contains(&w),
                    "{demo}: page {} prints the identifier {w:?}",
                    k + 1
                );
                assert!(
                    !fittings.contains(&w) || !w.contains('_'),
                    "{demo}: page {} prints the fitting keyword {w:?}",
                    k + 1
                );
                assert!(
                    !w.contains("fluids."),
                    "{demo}: page {} names a library function {w:?}",
                    k + 1
                );
            }
        }
    }
}

/// Units that must not appear in a package of the other system (as whole words).
const SI_ONLY: [&str; 14] = [
    "m", "mm", "m³", "m³/h", "m³/s", "m/s", "kPa", "Pa", "MPa", "°C", "kg/m³", "L/s", "kW", "bar",
];
const US_ONLY: [&str; 10] = [
    "ft", "gpm", "psi", "psig", "psia", "hp", "°F", "ft/s", "lb/ft³", "gal",
];

#[test]
fn a_us_package_prints_no_si_value_and_an_si_package_no_us_value() {
    for demo in DEMOS {
        let p = package(demo);
        let us = p.design.project.units == dutyline::model::ReportUnits::Us;
        let forbidden: &[&str] = if us { &SI_ONLY } else { &US_ONLY };
        for (k, text) in body(&p).iter().enumerate() {
            for w in words(text) {
                assert!(
                    !forbidden.contains(&w),
                    "{demo}: page {} prints the unit {w:?} ({})",
                    k + 1,
                    if us { "US package" } else { "SI package" }
                );
            }
            if !us {
                // Inches after a number ("16 in"): "in" alone is also an English word.
                let ws = words(text);
                for pair in ws.windows(3) {
                    let numeric = pair[0]
                        .chars()
                        .all(|c| c.is_ascii_digit() || "./-".contains(c));
                    let arrangement = ["parallel", "series"].contains(&pair[2]);
                    // A network tank's inflow column ("in 116.1") after a pressure.
                    let exempt = arrangement || pair[2].parse::<f64>().is_ok();
                    assert!(
                        !(numeric && pair[1] == "in" && !exempt),
                        "{demo}: page {} prints {} in",
                        k + 1,
                        pair[0]
                    );
                }
            }
            if us {
                assert!(!text.contains("kWh/m³"), "{demo}: page {}", k + 1);
            } else {
                assert!(!text.contains("1000 gal"), "{demo}: page {}", k + 1);
            }
        }
    }
}

#[test]
fn no_negative_zero_is_printed() {
    for demo in DEMOS {
        let p = package(demo);
        for (k, text) in p.pages.iter().enumerate() {
            for w in words(text) {
                let unsigned = w.strip_prefix('-').or_else(|| w.strip_prefix('\u{2212}'));
                if let Some(digits) = unsigned {
                    let zero = !digits.is_empty()
                        && digits.starts_with('0')
                        && digits.chars().all(|c| c == '0' || c == '.');
                    assert!(!zero, "{demo}: page {} prints {w:?}", k + 1);
                }
            }
        }
    }
}

#[test]
fn warnings_of_a_us_design_are_in_us_units_in_the_package_and_text_results() {
    // The orchard demo made to raise the remarks that carry values: Hazen-Williams at
    // 90 °F (outside about 41–77 °F) and an impeller between published diameters.
    let src = std::fs::read_to_string("examples-demo/orchard-lift-rev-a.duty")
        .unwrap()
        .replace("temperature = 64 degF", "temperature = 90 degF")
        .replace(
            "pipe pvc 8 in schedule 40 { length = 2650 ft + riser }",
            "pipe pvc 8 in schedule 40 {\n        length = 2650 ft + riser\n        hazen_williams_c = 150\n    }",
        )
        .replace(
            "pump B \"Horizontal split case, 1780 rpm\" {\n    speed = 1780 rpm",
            "pump B \"Horizontal split case, 1780 rpm\" {\n    speed = 1780 rpm\n    impeller = 12.5 in",
        );
    let design = dutyline::check(&src, &DemoFiles)
        .design
        .expect("valid variant");
    let a = dutyline::analysis::analyse(&design);
    let text = dutyline::results::to_text(&design, &a);
    assert!(text.contains("Hazen-Williams is fitted to water at ordinary temperatures (about 41.0–77.0 °F); 90.0 °F is outside"), "{text}");
    assert!(
        text.contains("impeller 12.500 in from the published 13.000 in by the trim law"),
        "{text}"
    );
    let style = dutyline::report::layout::style::Style::builtin("letter").unwrap();
    let pdf = dutyline::report::render_pdf(&design, &a, &src, &style, None).unwrap();
    let p = Package {
        design,
        pages: page_texts(&pdf).unwrap(),
        pdf,
    };
    let mut lines: Vec<String> = text.lines().map(str::to_string).collect();
    lines.extend(body(&p).iter().cloned());
    for line in &lines {
        for w in words(line) {
            assert!(!SI_ONLY.contains(&w), "SI unit {w:?} in {line:?}");
        }
        assert!(!line.contains("degC") && !line.contains('`'), "{line:?}");
    }
}
