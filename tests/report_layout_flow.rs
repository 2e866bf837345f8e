//! Page flow, checked on the laid-out pages: tables repeat their header and never
//! split rows, tall rows split, listings split, text stays inside its box, figures
//! stay whole, and odd input gives errors or sane output rather than panics.

mod report_common;

use dutyline::report::layout::{
    layout, page_count, render, Align, Block, Chart, Column, Document, Item, Layout, LayoutError,
    Series, Style,
};

fn letter() -> Style {
    Style::builtin("letter").expect("letter style")
}

fn doc(blocks: Vec<Block>) -> Document {
    Document {
        title: "Test".into(),
        id_seed: "seed".into(),
        blocks,
        ..Document::default()
    }
}

/// Index of the first page whose text contains `needle`.
fn page_of(layout: &Layout, needle: &str) -> Option<usize> {
    layout
        .pages
        .iter()
        .position(|p| p.texts().any(|t| t.text == needle))
}

fn assert_no_overflow(layout: &Layout, right_margin: f64) {
    for (n, page) in layout.pages.iter().enumerate() {
        for item in &page.items {
            if let Item::Path { points, .. } = item {
                for p in points {
                    assert!(
                        p.0 <= right_margin + 0.5,
                        "page {}: path at x {:.2} past the margin",
                        n + 1,
                        p.0
                    );
                    assert!(
                        p.1 >= 0.0 && p.1 <= layout.page_height,
                        "page {}: path off the page",
                        n + 1
                    );
                }
            }
        }
        for t in page.texts().filter(|t| t.angle_deg == 0.0) {
            assert!(
                t.x + t.width <= t.limit_right + 1e-6,
                "page {}: {:?} ends at {:.2} past its box edge {:.2}",
                n + 1,
                t.text,
                t.x + t.width,
                t.limit_right
            );
            assert!(
                t.limit_right <= right_margin + 1e-6,
                "box edge past the margin: {:?}",
                t.text
            );
        }
    }
}

fn long_table(rows: usize) -> Block {
    Block::Table {
        columns: vec![
            Column::new("Item", 0.2, Align::Left),
            Column::new("Description", 0.6, Align::Left),
            Column::new("Value", 0.2, Align::Right),
        ],
        rows: (0..rows)
            .map(|i| {
                let description = if i % 7 == 3 {
                    "a description long enough to wrap onto a second and maybe a third line in its column"
                } else {
                    "short"
                };
                vec![format!("R{i}"), description.into(), format!("{:.2}", i as f64 * 1.5)]
            })
            .collect(),
        caption: Some("Long table".into()),
    }
}

#[test]
fn long_tables_repeat_their_header_and_keep_rows_whole() {
    let rows = 150;
    let laid = layout(
        &doc(vec![Block::heading(1, "Data"), long_table(rows)]),
        &letter(),
    )
    .expect("layout");
    assert!(laid.pages.len() >= 3, "{} pages", laid.pages.len());
    for (n, page) in laid.pages.iter().enumerate() {
        let texts: Vec<_> = page.texts().collect();
        let rows_here: Vec<_> = texts.iter().filter(|t| t.text.starts_with('R')).collect();
        if rows_here.is_empty() {
            continue;
        }
        let header = texts
            .iter()
            .find(|t| t.text == "Description")
            .expect("header on every page");
        assert!(
            rows_here.iter().all(|r| r.baseline > header.baseline),
            "page {}",
            n + 1
        );
        if n > 0 {
            assert!(
                texts.iter().any(|t| t.text.contains("(continued)")),
                "page {}",
                n + 1
            );
        }
    }
    // Every row and all lines of its wrapped description sit on one page.
    for i in (3..rows).step_by(7) {
        let row_page = page_of(&laid, &format!("R{i}")).expect("row placed");
        let page = &laid.pages[row_page];
        let row = page
            .texts()
            .find(|t| t.text == format!("R{i}"))
            .expect("row");
        let next_row_top = page
            .texts()
            .find(|t| t.text == format!("R{}", i + 1))
            .map_or(f64::INFINITY, |t| t.baseline);
        let lines_of_row = page
            .texts()
            .filter(|t| {
                t.baseline >= row.baseline - 0.01 && t.baseline < next_row_top && t.x > row.x + 50.0
            })
            .filter(|t| t.text != "short" && !t.text.contains('.'))
            .count();
        assert!(
            lines_of_row >= 2,
            "row R{i} lost its wrapped lines ({lines_of_row})"
        );
    }
    for i in 0..rows {
        assert!(
            page_of(&laid, &format!("R{i}")).is_some(),
            "row R{i} missing"
        );
    }
}

#[test]
fn a_row_taller_than_a_page_is_split_without_losing_lines() {
    let tall: String = (0..1500).map(|i| format!("line{i} ")).collect();
    let table = Block::Table {
        columns: vec![
            Column::new("Key", 0.2, Align::Left),
            Column::new("Text", 0.8, Align::Left),
        ],
        rows: vec![vec!["big".into(), tall], vec!["after".into(), "x".into()]],
        caption: None,
    };
    let laid = layout(&doc(vec![table]), &letter()).expect("layout");
    assert!(laid.pages.len() >= 2);
    let all: String = laid
        .pages
        .iter()
        .flat_map(|p| p.texts().map(|t| format!("{} ", t.text)))
        .collect();
    for i in 0..1500 {
        assert!(all.contains(&format!("line{i} ")), "line{i} lost");
    }
    assert!(page_of(&laid, "after").is_some());
}

#[test]
fn long_listings_split_across_pages_with_continuous_line_numbers() {
    let lines: Vec<String> = (1..=260)
        .map(|i| {
            if i % 50 == 0 {
                "x".repeat(400)
            } else {
                format!("let value_{i} = {i};")
            }
        })
        .collect();
    let laid = layout(
        &doc(vec![Block::Preformatted {
            lines,
            line_numbers: true,
        }]),
        &letter(),
    )
    .expect("layout");
    assert!(laid.pages.len() >= 3, "{} pages", laid.pages.len());
    let numbers: Vec<usize> = laid
        .pages
        .iter()
        .flat_map(|p| {
            p.texts()
                .filter_map(|t| t.text.parse::<usize>().ok())
                .collect::<Vec<_>>()
        })
        .collect();
    let body_numbers: Vec<usize> = numbers.into_iter().filter(|n| *n <= 260).collect();
    assert_eq!(body_numbers, (1..=260).collect::<Vec<_>>());
    let marks = laid
        .pages
        .iter()
        .flat_map(|p| p.texts())
        .filter(|t| t.text == "↪")
        .count();
    assert!(marks >= 5 * 3, "continuation marks: {marks}");
    assert_no_overflow(&laid, right_edge(&letter()));
}

fn right_edge(style: &Style) -> f64 {
    (style.page.width_mm - style.page.margin_right_mm) * 72.0 / 25.4
}

#[test]
fn text_never_overflows_its_cell_or_the_page() {
    let word = "ThisIsAnExtremelyLongIdentifierWithoutAnyBreakOpportunityAtAll_0123456789";
    let table = Block::Table {
        columns: vec![
            Column::new("N", 0.05, Align::Right),
            Column::new(word, 0.15, Align::Center),
            Column::new("Text", 0.8, Align::Left),
        ],
        rows: vec![vec![word.into(), word.into(), format!("{word} {word} {word}")]; 3],
        caption: Some(word.into()),
    };
    let blocks = vec![
        Block::heading(2, word),
        table,
        Block::text(word.repeat(3)),
        Block::KeyValue(vec![(word.into(), word.repeat(2))]),
        Block::caution(word.repeat(2)),
    ];
    let style = letter();
    let laid = layout(&doc(blocks), &style).expect("layout");
    assert_no_overflow(&laid, right_edge(&style));
    let sample = layout(&report_common::sample_document(), &style).expect("sample");
    assert_no_overflow(&sample, right_edge(&style));
}

#[test]
fn figures_are_never_split_and_move_to_the_next_page() {
    let chart = Chart {
        x_label: "Q [m³/h]".into(),
        y_label: "H [m]".into(),
        series: vec![Series {
            name: "curve".into(),
            points: vec![(0.0, 10.0), (50.0, 8.0), (100.0, 3.0)],
            ..Series::default()
        }],
        ..Chart::default()
    };
    let filler: Vec<Block> = (0..9)
        .map(|_| Block::text("Filler paragraph. ".repeat(20)))
        .collect();
    let mut blocks = filler;
    blocks.push(Block::Figure {
        chart,
        height_mm: 120.0,
        caption: "Tall figure".into(),
    });
    let laid = layout(&doc(blocks), &letter()).expect("layout");
    let caption_page = page_of(&laid, "Figure 1").expect("caption");
    let axis_page = page_of(&laid, "H [m]").expect("axis title");
    assert_eq!(caption_page, axis_page);
    assert!(
        caption_page >= 1,
        "the figure should have moved to a new page"
    );
}

#[test]
fn malformed_tables_are_errors() {
    let ragged = Block::Table {
        columns: vec![
            Column::new("A", 1.0, Align::Left),
            Column::new("B", 1.0, Align::Left),
        ],
        rows: vec![vec!["only one".into()]],
        caption: Some("Ragged".into()),
    };
    match layout(&doc(vec![ragged]), &letter()) {
        Err(LayoutError::Table { table, message }) => {
            assert_eq!(table, "Table 1");
            assert!(message.contains("row 1"), "{message}");
        }
        other => panic!("expected a table error, got {other:?}"),
    }
    let bad_width = Block::Table {
        columns: vec![Column::new("A", -1.0, Align::Left)],
        rows: vec![],
        caption: None,
    };
    assert!(matches!(
        layout(&doc(vec![bad_width]), &letter()),
        Err(LayoutError::Table { .. })
    ));
}

#[test]
fn odd_input_renders_without_panicking() {
    let nasty = Chart {
        series: vec![
            Series {
                points: vec![
                    (f64::NAN, 1.0),
                    (1.0, f64::INFINITY),
                    (2.0, 2.0),
                    (3.0, 1.0),
                ],
                ..Series::default()
            },
            Series {
                points: vec![(5.0, 5.0)],
                markers: true,
                ..Series::default()
            },
            Series {
                points: vec![],
                ..Series::default()
            },
        ],
        x_range: Some((10.0, 0.0)),
        y2_range: Some((f64::NAN, 3.0)),
        y2_label: Some(String::new()),
        ..Chart::default()
    };
    let blocks = vec![
        Block::Heading {
            level: 9,
            text: String::new(),
        },
        Block::Paragraph(vec![]),
        Block::text("\u{0}\u{7}control and 𝄞 non-BMP characters\r\n"),
        Block::Spacer(f64::NAN),
        Block::Spacer(-5.0),
        Block::PageBreak,
        Block::PageBreak,
        Block::Preformatted {
            lines: vec![String::new(), "\t\t".into()],
            line_numbers: false,
        },
        Block::Figure {
            chart: nasty,
            height_mm: 1e9,
            caption: String::new(),
        },
        Block::Figure {
            chart: Chart::default(),
            height_mm: f64::NAN,
            caption: "empty".into(),
        },
        Block::KeyValue(vec![]),
        Block::Contents,
        Block::TitleBlock {
            lines: vec![],
            seal_box: true,
            signatures: vec![],
        },
    ];
    let odd = doc(blocks);
    let laid = layout(&odd, &letter()).expect("layout");
    assert_no_overflow(&laid, right_edge(&letter()));
    let bytes = render(&odd, &letter()).expect("render");
    assert!(bytes.starts_with(b"%PDF-"));
    assert_eq!(page_count(&doc(vec![]), &letter()).expect("empty"), 1);
    let laid = layout(&doc(vec![]), &letter()).expect("empty layout");
    assert!(
        laid.pages[0]
            .items
            .iter()
            .any(|i| matches!(i, Item::Path { .. })),
        "header rule"
    );
}

#[test]
fn letter_and_a4_differ_only_in_geometry() {
    let d = report_common::sample_document();
    let letter = layout(&d, &letter()).expect("letter");
    let a4 = layout(&d, &Style::builtin("a4").expect("a4")).expect("a4");
    assert!((letter.page_width - 612.0).abs() < 0.01); // 8.5 in x 72 pt/in
    assert!((a4.page_height - 841.89).abs() < 0.01); // 297 mm / 25.4 x 72
    assert_eq!(letter.headings.len(), a4.headings.len());
}
