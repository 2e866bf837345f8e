//! Formatting invariants on the demo: layout noise formats away, formatting is
//! idempotent, comments survive, and the lowered design never changes.

use dutyline::syntax::comments::scan_comments;
use dutyline::syntax::format_source;
use proptest::prelude::*;

const DEMOS: &[&str] = &[
    "examples-demo/orchard-lift-rev-a.duty",
    "examples-demo/orchard-lift-rev-b.duty",
    "examples-demo/wrenfield-chilled-water.duty",
];

fn read(path: &str) -> String {
    std::fs::read_to_string(path).unwrap_or_else(|e| panic!("{path}: {e}"))
}

fn fmt(src: &str) -> String {
    format_source(src).unwrap_or_else(|d| panic!("formatting failed: {d:?}\n{src}"))
}

/// The demo with comments in every kind of place, in canonical form.
fn commented_demo() -> String {
    let mut s = read(DEMOS[0]);
    let edits: &[(&str, &str)] = &[
        ("    units = us\n", "    units = us  # report units: us | si\n"),
        (
            "site { elevation = 1205 ft }\n",
            "site { elevation = 1205 ft }  # sets the barometric pressure\n",
        ),
        (
            "line suction from wet_well to pump {\n",
            "line suction from wet_well to pump {  # flooded suction\n",
        ),
        (
            "    fitting check_valve_swing\n",
            "    # at the pump flange\n    fitting check_valve_swing\n",
        ),
        (
            "case aged { roughness = aged }\n",
            "case aged { roughness = aged }  # 20-year allowance\n",
        ),
        (
            "    npsh_margin >= 1.3\n",
            "    npsh_margin >= 1.3\n    # more requirements in revision B\n",
        ),
        (
            "\npump A ",
            "\n# Candidates from two vendors\npump A ",
        ),
        (
            "        0          186       0              -\n",
            "        0          186       0              -  # shut-off\n",
        ),
        (
            "        600        170       74             8.0\n",
            "        # best efficiency near 800 gpm\n        600        170       74             8.0\n",
        ),
        ("    }\n}\n\npump B", "    }\n}  # end of pump A\n\npump B"),
    ];
    for (from, to) in edits {
        assert!(s.contains(from), "the demo no longer contains {from:?}");
        s = s.replacen(from, to, 1);
    }
    s.push_str("# end of file\n");
    s
}

/// What the design means, without places: the lowered design's Debug text with
/// spans and all white space removed (requirement and override texts are kept
/// as written, so spacing inside them must not count).
fn fingerprint(src: &str) -> String {
    let checked = dutyline::check(src, &dutyline::NoFiles);
    let design = checked
        .design
        .unwrap_or_else(|| panic!("does not lower: {:?}", checked.diagnostics));
    let debug = format!("{design:?}");
    let mut out = String::with_capacity(debug.len());
    let mut rest = debug.as_str();
    while let Some(k) = rest.find("Span {") {
        out.push_str(&rest[..k]);
        rest = rest[k..].find('}').map_or("", |e| &rest[k + e + 1..]);
    }
    out.push_str(rest);
    // Debug escapes tabs inside texts as `\t`: drop those too.
    out.replace("\\t", "")
        .chars()
        .filter(|c| !c.is_whitespace())
        .collect()
}

/// A stream of small random choices.
struct Choices<'a> {
    list: &'a [u8],
    at: usize,
}

impl Choices<'_> {
    fn pick(&mut self, n: u8) -> u8 {
        let c = self.list.get(self.at % self.list.len().max(1)).copied();
        self.at += 1;
        c.unwrap_or(0) % n.max(1)
    }
}

/// The code part of a line (before a comment, outside quotes) and the rest.
fn split_code(line: &str) -> (&str, &str) {
    let mut quoted = false;
    let mut escaped = false;
    for (i, c) in line.char_indices() {
        match c {
            _ if escaped => escaped = false,
            '\\' if quoted => escaped = true,
            '"' => quoted = !quoted,
            '#' if !quoted => return (&line[..i], &line[i..]),
            _ => {}
        }
    }
    (line, "")
}

fn is_field_line(line: &str) -> bool {
    let t = line.trim_start();
    let name_end = t
        .find(|c: char| !(c.is_ascii_alphanumeric() || c == '_' || c == '.'))
        .unwrap_or(t.len());
    let after = t[name_end..].trim_start();
    name_end > 0
        && !t.starts_with("let ")
        && (after.starts_with("= ") || after.starts_with(">= ") || after.starts_with("<= "))
        && !line.contains('#')
        && !line.contains("\"\"\"")
}

/// Layout noise that must format away: separators instead of line breaks,
/// extra spaces and tabs, spacing around `=`, indentation, trailing blanks and
/// blank lines where the canonical layout drops or collapses them.
fn mutate_layout(canonical: &str, ch: &mut Choices) -> String {
    // 1. Join some neighbouring one-fact lines with `,` or `;`.
    let mut lines: Vec<String> = Vec::new();
    let mut ends_with_field = false;
    let mut opens_body = false;
    for line in canonical.lines() {
        let field = is_field_line(line);
        // A `}` is never joined: a body written on one line is kept on one line, which
        // is layout the formatter keeps, not noise.
        let joinable = (ends_with_field || opens_body) && field;
        if joinable && ch.pick(3) == 0 {
            let prev = lines.pop().unwrap_or_default();
            let sep = if opens_body {
                " "
            } else if ch.pick(2) == 0 {
                ", "
            } else {
                " ; "
            };
            lines.push(format!("{prev}{sep}{}", line.trim_start()));
        } else {
            lines.push(line.to_string());
        }
        ends_with_field = field;
        opens_body = line.ends_with(" {") && !line.contains('#') && !line.contains("curve ");
    }
    // 2. Respace code outside texts and comments; add blank lines where they vanish.
    let mut out = String::new();
    let mut in_text = false;
    let mut in_table = false;
    for _ in 0..ch.pick(3) {
        out.push('\n');
    }
    for line in &lines {
        let starts_in_text = in_text;
        if line.matches("\"\"\"").count() % 2 == 1 {
            in_text = !in_text;
        }
        if starts_in_text || line.contains("\"\"\"") {
            out.push_str(line);
            out.push('\n');
            continue;
        }
        if line.trim() == "}" && ch.pick(4) == 0 {
            out.push('\n');
        }
        let (code, comment) = split_code(line);
        let body = code.trim_start();
        let indent = ["", " ", "\t", "  \t", "        "][ch.pick(5) as usize];
        out.push_str(indent);
        let mut quoted = false;
        let mut prev = '\0';
        for c in body.chars() {
            if c == '"' && prev != '\\' {
                quoted = !quoted;
            }
            if !quoted && c == ' ' {
                if prev == '=' && ch.pick(3) == 0 {
                    prev = c;
                    continue; // `a =1`: the space after `=` removed
                }
                out.push_str(["", " ", "\t", "   "][ch.pick(4) as usize]);
            }
            out.push(c);
            prev = c;
        }
        out.push_str(comment);
        out.push_str(["", " ", "\t "][ch.pick(3) as usize]);
        out.push('\n');
        let trimmed = line.trim();
        let code_only = code.trim();
        if trimmed.is_empty() {
            for _ in 0..ch.pick(3) {
                out.push('\n');
            }
        }
        if in_table && code_only != "}" && ch.pick(4) == 0 {
            out.push('\n');
        }
        if code_only.starts_with("curve ") && code_only.ends_with('{') {
            in_table = true;
        } else if code_only == "}" {
            in_table = false;
        }
        if trimmed.ends_with('{') && !trimmed.contains('#') && ch.pick(4) == 0 {
            out.push('\n');
        }
    }
    for _ in 0..ch.pick(3) {
        out.push_str("\n  ");
    }
    out
}

/// Changes that a formatter must keep rather than undo: new comments on their own
/// lines or after code, and new blank lines.
fn add_comments(canonical: &str, ch: &mut Choices) -> String {
    let mut out = String::new();
    let mut in_text = false;
    for (n, line) in canonical.lines().enumerate() {
        let starts_in_text = in_text;
        if line.matches("\"\"\"").count() % 2 == 1 {
            in_text = !in_text;
        }
        let code_line = !starts_in_text && !line.contains("\"\"\"");
        if code_line && ch.pick(6) == 0 {
            out.push_str(&format!("  # own line {n}\n"));
        }
        if code_line && ch.pick(8) == 0 {
            out.push('\n');
        }
        out.push_str(line);
        if code_line && !line.trim().is_empty() && !line.contains('#') && ch.pick(5) == 0 {
            out.push_str(&format!(" # after {n}"));
        }
        out.push('\n');
    }
    out
}

#[test]
fn demo_files_are_canonical() {
    for path in DEMOS {
        let src = read(path);
        let formatted = fmt(&src);
        assert!(
            formatted == src,
            "{path} is not in canonical form; format it:\n{formatted}"
        );
    }
}

#[test]
fn the_commented_demo_is_canonical() {
    let s = commented_demo();
    assert_eq!(fmt(&s), s);
    assert_eq!(fingerprint(&s), fingerprint(&read(DEMOS[0])));
}

#[test]
fn formatting_keeps_case_names_and_segment_lengths() {
    let src = read(DEMOS[0]);
    let noisy = mutate_layout(
        &src,
        &mut Choices {
            list: &[1, 0, 2, 3, 0, 1],
            at: 0,
        },
    );
    let before = dutyline::check(&noisy, &dutyline::NoFiles)
        .design
        .expect("valid");
    let after = dutyline::check(&fmt(&noisy), &dutyline::NoFiles)
        .design
        .expect("valid");
    let key = |d: &dutyline::Design| {
        let cases: Vec<&str> = d.cases.iter().map(|c| c.name.as_str()).collect();
        let lengths: Vec<f64> = d
            .base
            .lines
            .iter()
            .flat_map(|l| &l.segments)
            .map(|s| s.length.value)
            .collect();
        let levels: Vec<f64> = d
            .cases
            .iter()
            .map(|c| c.scenario.source.level.value)
            .collect();
        format!(
            "{cases:?} {lengths:?} {levels:?} {:?}",
            d.requirements
                .iter()
                .map(|r| r.limit_si)
                .collect::<Vec<_>>()
        )
    };
    assert_eq!(key(&before), key(&after));
    assert!(dutyline::diff::diff_designs(&before, &after).is_empty());
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(48))]

    #[test]
    fn layout_noise_formats_back_to_the_canonical_demo(
        choices in proptest::collection::vec(any::<u8>(), 1..400)
    ) {
        let canonical = commented_demo();
        let noisy = mutate_layout(&canonical, &mut Choices { list: &choices, at: 0 });
        prop_assert!(dutyline::syntax::parse(&noisy).is_ok(), "mutation broke the syntax:\n{}", noisy);
        let once = fmt(&noisy);
        prop_assert_eq!(&once, &canonical, "noisy source:\n{}", noisy);
        prop_assert_eq!(fingerprint(&noisy), fingerprint(&canonical));
    }

    #[test]
    fn new_comments_and_blank_lines_are_kept_idempotently(
        choices in proptest::collection::vec(any::<u8>(), 1..400)
    ) {
        let canonical = read(DEMOS[1]);
        let edited = add_comments(&canonical, &mut Choices { list: &choices, at: 0 });
        let noisy = mutate_layout(&edited, &mut Choices { list: &choices, at: 7 });
        let once = fmt(&noisy);
        prop_assert_eq!(fmt(&once), once.clone());
        let texts = |s: &str| scan_comments(s).into_iter().map(|c| c.text).collect::<Vec<_>>();
        prop_assert_eq!(texts(&once), texts(&edited));
        prop_assert_eq!(fingerprint(&once), fingerprint(&canonical));
        // Formatting the edited file without the noise gives the same text.
        prop_assert_eq!(fmt(&edited), once);
    }
}
