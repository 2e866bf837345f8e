//! The PDF package read back: pages, section titles, every printed duty value equal
//! to the analysis, fonts embedded; the README example stays valid.

mod report_common;

mod common;
use common::DemoFiles;
use dutyline::display::Units;
use report_common::pdftext::page_texts;

fn package(path: &str) -> (dutyline::Design, dutyline::analysis::Analysis, Vec<u8>) {
    let src = std::fs::read_to_string(path).unwrap();
    let d = dutyline::check(&src, &DemoFiles)
        .design
        .expect("valid demo");
    let a = dutyline::analysis::analyse(&d);
    let style =
        dutyline::report::layout::style::Style::builtin(dutyline::report::builtin_style_for(&d))
            .unwrap();
    let pdf = dutyline::report::render_pdf(&d, &a, &src, &style, None).unwrap();
    (d, a, pdf)
}

#[test]
fn package_has_every_section_and_prints_the_analysed_duties() {
    for demo in [
        "examples-demo/orchard-lift-rev-a.duty",
        "examples-demo/kestrel-booster.duty",
    ] {
        let (d, a, pdf) = package(demo);
        let pages = page_texts(&pdf).unwrap();
        assert!(pages.len() >= 12, "{demo}: {} pages", pages.len());
        let all = pages.join("\n");
        for title in [
            "Revision history",
            "Contents",
            "Purpose and scope",
            "Design basis",
            "Method",
            "System curves",
            "Pump candidate",
            "Selection",
            "Checks",
            "Assumptions, notes and cautions",
            "References",
            "Appendix: design file",
            "Reviewer's seal",
        ] {
            assert!(all.contains(title), "{demo}: no `{title}`");
        }
        assert!(
            all.contains(&format!("page 1 of {}", pages.len())),
            "{demo}: footer"
        );
        let u = Units::new(d.project.units);
        for case in &a.cases {
            for p in &case.pumps {
                let duty = p.duty.as_ref().expect("demo duties exist");
                // The duty table prints flow and head in report units, as the analysis has them.
                let flow = u.flow().num(duty.flow);
                let head = u.head().num(duty.head);
                assert!(
                    all.contains(&flow) && all.contains(&head),
                    "{demo} {} {}: {flow} / {head} not printed",
                    case.name,
                    p.name
                );
            }
        }
        let doc = lopdf::Document::load_mem(&pdf).unwrap();
        let embedded = doc
            .objects
            .values()
            .filter(|o| o.as_dict().map(|d| d.has(b"FontFile2")).unwrap_or(false))
            .count();
        assert!(embedded >= 1, "{demo}: no embedded font");
    }
}

#[test]
fn stress_design_paginates_without_overflow() {
    let src = std::fs::read_to_string("tests/designs/stress.duty").unwrap();
    let d = dutyline::check(&src, &DemoFiles)
        .design
        .expect("valid stress design");
    let a = dutyline::analysis::analyse(&d);
    let style = dutyline::report::layout::style::Style::builtin("letter").unwrap();
    let sha = dutyline::results::sha256_hex(&src);
    let doc = dutyline::report::sections::document(&d, &a, &src, &sha, None);
    let laid = dutyline::report::layout::layout(&doc, &style).expect("lays out");
    assert!(laid.pages.len() > 30);
    for (n, page) in laid.pages.iter().enumerate() {
        for item in &page.items {
            if let dutyline::report::layout::page::Item::Text(t) = item {
                if t.angle_deg == 0.0 {
                    assert!(
                        t.x + t.width <= t.limit_right + 0.01,
                        "page {}: `{}` overflows",
                        n + 1,
                        t.text
                    );
                    assert!(
                        t.x + t.width <= laid.page_width,
                        "page {}: `{}` leaves the page",
                        n + 1,
                        t.text
                    );
                }
            }
        }
    }
}

#[test]
fn readme_language_tour_is_a_valid_design() {
    let readme = std::fs::read_to_string("README.md").unwrap();
    let start = readme
        .find("## A short tour of the language")
        .expect("tour section");
    let block = readme[start..].split("```").nth(1).expect("code block");
    let c = dutyline::check(block, &dutyline::NoFiles);
    assert!(
        !c.has_errors(),
        "{}",
        dutyline::diagnostics::render(&c.diagnostics, "README.md", block)
    );
}

#[test]
fn a_failed_build_leaves_the_previous_pdf_untouched() {
    let dir = std::env::temp_dir().join(format!("dutyline-build-{}", std::process::id()));
    std::fs::create_dir_all(&dir).unwrap();
    let good = dir.join("lift.duty");
    std::fs::copy("examples-demo/orchard-lift-rev-a.duty", &good).unwrap();
    let out = dir.join("lift.pdf");
    let bin = env!("CARGO_BIN_EXE_dutyline");
    let st = std::process::Command::new(bin)
        .args(["build"])
        .arg(&good)
        .status()
        .unwrap();
    assert!(st.success());
    let before = std::fs::read(&out).unwrap();
    std::fs::write(&good, "project { title = 40 psi }\n").unwrap();
    let st = std::process::Command::new(bin)
        .args(["build"])
        .arg(&good)
        .status()
        .unwrap();
    assert_eq!(st.code(), Some(1));
    assert_eq!(
        std::fs::read(&out).unwrap(),
        before,
        "the earlier PDF changed"
    );
    let st = std::process::Command::new(bin)
        .args(["build"])
        .arg(&good)
        .arg("-o")
        .arg(&good)
        .status()
        .unwrap();
    assert_eq!(st.code(), Some(2), "writing over the input must be refused");
    let leftovers: Vec<_> = std::fs::read_dir(&dir)
        .unwrap()
        .filter_map(|e| e.ok())
        .filter(|e| e.file_name().to_string_lossy().contains(".tmp"))
        .collect();
    assert!(leftovers.is_empty());
    let _ = std::fs::remove_dir_all(&dir);
}

#[test]
fn references_list_what_the_design_uses() {
    // The orchard lift: one chain of steel and PVC pipe, constant speed, NEMA motors,
    // water; Kestrel: Hazen-Williams ductile iron, variable speed, IEC, an envelope.
    let text = |demo: &str| {
        let (_, _, pdf) = package(demo);
        let pages = page_texts(&pdf).unwrap();
        let all = pages.join("\n");
        let at = all
            .rfind("Publications the calculation relies on")
            .expect("chapter");
        let start = all[..at].rfind("References").expect("heading");
        all[start..].to_string()
    };
    let orchard = text("examples-demo/orchard-lift-rev-a.duty");
    for used in ["Colebrook", "NEMA MG 1", "ASTM D1785", "Hooper"] {
        assert!(orchard.contains(used), "orchard lacks {used}");
    }
    for unused in [
        "Todini",
        "Jacob",
        "ISO 9906",
        "IEC 60072-1",
        "ANSI/HI 9.6.7",
        "Melinder",
        "IEC 61800-9-2",
    ] {
        assert!(!orchard.contains(unused), "orchard lists {unused}");
    }
    let kestrel = text("examples-demo/kestrel-booster.duty");
    for used in [
        "Williams, G.S. and Hazen",
        "ISO 9906",
        "IEC 60072-1",
        "IEC 61800-9-2",
        "AWWA Manual M41",
    ] {
        assert!(kestrel.contains(used), "kestrel lacks {used}");
    }
    for unused in ["NEMA MG 1,", "Todini", "Uni-Bell", "ANSI/HI 9.6.7"] {
        assert!(!kestrel.contains(unused), "kestrel lists {unused}");
    }
}
