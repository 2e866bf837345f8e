//! The canonical layout, rule by rule (see `dutyline::syntax::format`).

use dutyline::diagnostics::Code;
use dutyline::syntax::format_source;

fn fmt(src: &str) -> String {
    match format_source(src) {
        Ok(s) => s,
        Err(d) => panic!("formatting failed: {d:?}\n--- source ---\n{src}"),
    }
}

/// Formats to `want`, and `want` is a fixed point.
fn check(src: &str, want: &str) {
    assert_eq!(fmt(src), want, "source:\n{src}");
    assert_eq!(fmt(want), want, "not idempotent:\n{want}");
}

#[test]
fn separators_spacing_and_alignment_are_normalised() {
    check(
        "project {   title   =\"A\" ;units=us,style = letter }\nlet riser          = 38 ft\n",
        "project { title = \"A\", units = us, style = letter }\nlet riser = 38 ft\n",
    );
    check(
        "project {   title   =\"A\" ;units=us\nstyle = letter }\n",
        "project {\n    title = \"A\"\n    units = us\n    style = letter\n}\n",
    );
}

#[test]
fn expressions_get_canonical_spacing_and_keep_number_text() {
    check(
        "let a = 1460ft+35 ft\nlet b = 2*7.50 ft\nlet c = (1.5e3 m - -2 m)/2\nlet d = 2^-2 * x.y\n",
        "let a = 1460 ft + 35 ft\nlet b = 2 * 7.50 ft\nlet c = (1.5e3 m - -2 m) / 2\nlet d = 2^-2 * x.y\n",
    );
    check("let e = 3 × 4 − 1\n", "let e = 3 * 4 - 1\n");
}

#[test]
fn one_field_bodies_and_one_line_bodies_stay_inline_and_others_expand() {
    check(
        "case normal {\n  hours = 1400 h\n}\ncase dry { sump.level = 1 m;hours = 2 h }\ncase wet {\n    sump.level = 1 m, hours = 2 h\n}\ncase none {\n\n}\n",
        "case normal { hours = 1400 h }\ncase dry { sump.level = 1 m, hours = 2 h }\ncase wet {\n    sump.level = 1 m\n    hours = 2 h\n}\ncase none { }\n",
    );
    // The README tour's style: several fields and requirements on the header's line.
    check(
        "project { title = \"Irrigation lift\", number = \"FB-HYD-007\", units = us }\nrequire { flow >= 700 gpm for normal, dry, npsh_margin >= 1.3 }\n",
        "project { title = \"Irrigation lift\", number = \"FB-HYD-007\", units = us }\nrequire { flow >= 700 gpm for normal, dry, npsh_margin >= 1.3 }\n",
    );
    // A one-line body with a nested block, or too wide, expands.
    check(
        "pump A { speed = 1780 rpm, curve x }\n",
        "pump A {\n    speed = 1780 rpm\n    curve x\n}\n",
    );
    let wide = format!("a {{ t = \"{}\", u = 1 }}\n", "x".repeat(70));
    check(
        &wide,
        &format!("a {{\n    t = \"{}\"\n    u = 1\n}}\n", "x".repeat(70)),
    );
    check(
        "require { flow >= 700 gpm for normal,dry }\n",
        "require { flow >= 700 gpm for normal, dry }\n",
    );
    // A nested block is never inline.
    check("pump A { curve x }\n", "pump A {\n    curve x\n}\n");
}

#[test]
fn a_one_field_body_wider_than_the_limit_expands() {
    let text = |n: usize| "x".repeat(n);
    // `note_block { t = "` is 18 characters and `" }` is 3: 59 more make 80.
    let fits = format!("note_block {{ t = \"{}\" }}\n", text(59));
    assert_eq!(fits.trim_end().chars().count(), 80);
    check(&fits, &fits);
    let wide = format!("note_block {{ t = \"{}\" }}\n", text(60));
    check(
        &wide,
        &format!("note_block {{\n    t = \"{}\"\n}}\n", text(60)),
    );
    // Indentation counts towards the width: 4 + `b { t = "` 9 + 64 + 3 = 80.
    let nested = format!("a {{\n    b {{ t = \"{}\" }}\n}}\n", text(64));
    check(&nested, &nested);
    let deeper = format!("a {{\n    b {{ t = \"{}\" }}\n}}\n", text(65));
    check(
        &deeper,
        &format!("a {{\n    b {{\n        t = \"{}\"\n    }}\n}}\n", text(65)),
    );
}

#[test]
fn texts_are_requoted_and_multi_line_texts_become_blocks() {
    check(
        "note \"say \\\"hi\\\" \\\\ \\q\"\n",
        "note \"say \\\"hi\\\" \\\\ q\"\n",
    );
    check(
        "purpose \"\"\"\n  first line\n    indented\n\n  last\n  \"\"\"\n",
        "purpose \"\"\"\n    first line\n      indented\n\n    last\n\"\"\"\n",
    );
    check(
        "project {\n  title = \"\"\"one\ntwo\"\"\"\n}\n",
        "project {\n    title = \"\"\"\n        one\n        two\n    \"\"\"\n}\n",
    );
    // A one-line triple-quoted text becomes a plain one.
    check("purpose \"\"\" short \"\"\"\n", "purpose \"short\"\n");
}

#[test]
fn curve_tables_align_left_with_dashes() {
    check(
        "pump A {\n curve impeller 12.5 in {\n\n flow gpm head ft npshr ft\n 0 186 —\n\n 1200 112.25 16.4\n }\n}\n",
        "pump A {\n    curve impeller 12.5 in {\n        flow gpm   head ft   npshr ft\n        0          186       -\n        1200       112.25    16.4\n    }\n}\n",
    );
}

#[test]
fn blank_lines_collapse_to_one_and_vanish_at_edges() {
    check(
        "\n\n# head\n\n\n\nsite { }\nfluid water { }\n\n\ntank a {\n\n    level = 1 m\n\n    pressure = 0 kPa\n\n}\n\n\n",
        "# head\n\nsite { }\nfluid water { }\n\ntank a {\n    level = 1 m\n\n    pressure = 0 kPa\n}\n",
    );
}

#[test]
fn comments_stay_with_their_statements() {
    let src = "\
# own line at the top
site { elevation = 1205 ft }     # trailing a one-line block
line suction from a to pump {# on the header
        # before the pipe
    pipe steel 8 in schedule 40 { length = 18 ft }#trailing the pipe
    fitting gate_valve , fitting exit   # shared line: the last statement
    # dangling before the brace
}   # after the brace
case dry { hours = 1 h }  # after an inline body
case wet {
    hours = 2 h  # inside the body: the body stays expanded
}
case empty {
    # nothing yet
}
# at the end
";
    let want = "\
# own line at the top
site { elevation = 1205 ft }  # trailing a one-line block
line suction from a to pump {  # on the header
    # before the pipe
    pipe steel 8 in schedule 40 { length = 18 ft }  #trailing the pipe
    fitting gate_valve
    fitting exit  # shared line: the last statement
    # dangling before the brace
}  # after the brace
case dry { hours = 1 h }  # after an inline body
case wet {
    hours = 2 h  # inside the body: the body stays expanded
}
case empty {
    # nothing yet
}
# at the end
";
    check(src, want);
}

#[test]
fn comments_in_tables_stay_on_their_rows() {
    check(
        "pump A {\n  curve x {  # header follows\n    # units from the sheet\n    flow gpm head ft # columns\n    0 186   # shut-off\n    # mid\n    100 180\n    # last\n  }\n}\n",
        "pump A {\n    curve x {  # header follows\n        # units from the sheet\n        flow gpm   head ft  # columns\n        0          186  # shut-off\n        # mid\n        100        180\n        # last\n    }\n}\n",
    );
}

#[test]
fn a_comment_after_a_multi_line_text_stays_after_it() {
    check(
        "purpose \"\"\"\na\nb\n\"\"\"   # why\nnote \"x\"\n",
        "purpose \"\"\"\n    a\n    b\n\"\"\"  # why\nnote \"x\"\n",
    );
}

#[test]
fn hash_signs_inside_texts_are_not_comments() {
    check("note \"pump #2\"   # real\n", "note \"pump #2\"  # real\n");
}

#[test]
fn crlf_and_empty_files() {
    check(
        "site { }\r\n\r\n\r\nfluid water { }\r\n",
        "site { }\n\nfluid water { }\n",
    );
    check("", "");
    check("\n\n  \n", "");
    check("# only a comment", "# only a comment\n");
}

#[test]
fn syntax_errors_are_returned_as_diagnostics() {
    let err = format_source("project {\n title = \n}\n").unwrap_err();
    assert!(err.iter().any(|d| d.code == Code::Syntax), "{err:?}");
}

#[test]
fn requirement_text_excludes_a_trailing_comment() {
    // Spans end at the last token, so the text a requirement reports has no comment.
    let src = std::fs::read_to_string("examples-demo/orchard-lift-rev-a.duty").unwrap();
    let src = src.replace(
        "flow >= 700 gpm for normal",
        "flow >= 700 gpm for normal   # contract duty",
    );
    let checked = dutyline::check(&src, &dutyline::NoFiles);
    let design = checked.design.expect("the demo is valid");
    assert_eq!(design.requirements[0].text, "flow >= 700 gpm for normal");
}
