//! Style files: the built-in ones load, broken ones are located by line and column.

use dutyline::report::layout::Style;

const LETTER: &str = include_str!("../styles/letter.toml");

/// 1-based line of the first line starting with `prefix`.
fn line_of(text: &str, prefix: &str) -> usize {
    text.lines()
        .position(|l| l.starts_with(prefix))
        .map(|i| i + 1)
        .expect("prefix present")
}

#[test]
fn builtin_styles_have_the_paper_sizes() {
    let letter = Style::builtin("letter").expect("letter");
    assert_eq!(
        (letter.page.width_mm, letter.page.height_mm),
        (215.9, 279.4)
    ); // ANSI/ASME Y14.1 Letter
    let a4 = Style::builtin("a4").expect("a4");
    assert_eq!((a4.page.width_mm, a4.page.height_mm), (210.0, 297.0)); // ISO 216 A4
    assert_eq!(letter.chart.palette.len(), 8);
    assert_eq!(Style::from_toml(LETTER).expect("parse"), letter);
}

#[test]
fn unknown_key_is_an_error_at_its_position() {
    let text = LETTER.replace(
        "line_spacing = 1.32",
        "line_spacing = 1.32\nline_spacin = 1.4",
    );
    let err = Style::from_toml(&text).expect_err("unknown key");
    assert_eq!(err.line, line_of(&text, "line_spacin ="));
    assert_eq!(err.column, 1);
    assert!(err.message.contains("unknown field"), "{}", err.message);
    assert!(err.help.contains("spelling"), "{}", err.help);
}

#[test]
fn syntax_error_is_located() {
    let text = LETTER.replace("table_size_pt = 8.3", "table_size_pt = = 8.3");
    let err = Style::from_toml(&text).expect_err("syntax error");
    assert_eq!(err.line, line_of(&text, "table_size_pt"));
    assert!(err.column > 1, "column {}", err.column);
}

#[test]
fn wrong_types_and_values_are_located() {
    let text = LETTER.replace("base_size_pt = 9.5", "base_size_pt = \"9.5\"");
    let err = Style::from_toml(&text).expect_err("string for a number");
    assert_eq!(err.line, line_of(&text, "base_size_pt"));

    let text = LETTER.replace("\"dash-dot\", \"solid\"", "\"wavy\", \"solid\"");
    let err = Style::from_toml(&text).expect_err("unknown line style");
    assert_eq!(err.line, line_of(&text, "line_styles"));
    assert!(err.help.contains("dash-dot"), "{}", err.help);

    let text = LETTER.replace("base_size_pt = 9.5", "base_size_pt = 0.5");
    let err = Style::from_toml(&text).expect_err("tiny type");
    assert_eq!(err.line, line_of(&text, "base_size_pt"));
    assert!(err.message.contains("outside"), "{}", err.message);

    let text = LETTER.replace("[chart]\n", "");
    let err = Style::from_toml(&text).expect_err("keys moved into [text]");
    assert!(err.line > 0 && err.column > 0);
    assert!(err.to_string().contains("help:"));
}
