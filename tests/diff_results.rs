//! Result diffs between revisions: structure, not hydraulic numbers (the engine's
//! numbers are checked elsewhere; here only what is compared and how it is shown).

use dutyline::analysis::{analyse, Analysis};
use dutyline::diff::{self, Presence};
use dutyline::Design;

const REV_A: &str = "examples-demo/orchard-lift-rev-a.duty";
const REV_B: &str = "examples-demo/orchard-lift-rev-b.duty";

fn read(path: &str) -> String {
    std::fs::read_to_string(path).unwrap_or_else(|e| panic!("{path}: {e}"))
}

fn compile(src: &str) -> (Design, Analysis) {
    let checked = dutyline::check(src, &dutyline::NoFiles);
    let design = checked
        .design
        .unwrap_or_else(|| panic!("does not lower: {:?}", checked.diagnostics));
    let analysis = analyse(&design);
    (design, analysis)
}

fn revisions() -> (Design, Analysis, Design, Analysis) {
    let (a, aa) = compile(&read(REV_A));
    let (b, ab) = compile(&read(REV_B));
    (a, aa, b, ab)
}

#[test]
fn drought_appears_and_every_common_case_and_pump_has_a_row() {
    let (_, aa, b, ab) = revisions();
    let r = diff::diff_analyses(&aa, &ab, &dutyline::display::Units::new(b.project.units));
    assert_eq!(r.cases_added, vec!["drought".to_string()]);
    assert!(r.cases_removed.is_empty() && r.pumps_added.is_empty() && r.pumps_removed.is_empty());
    let expected: Vec<(String, String)> = ab
        .cases
        .iter()
        .filter(|c| c.name != "drought")
        .flat_map(|c| {
            ab.candidates
                .iter()
                .map(move |p| (c.name.clone(), p.name.clone()))
        })
        .collect();
    let got: Vec<(String, String)> = r
        .rows
        .iter()
        .map(|x| (x.case.clone(), x.pump.clone()))
        .collect();
    assert_eq!(got, expected);
    assert_eq!(got.len(), 5 * 2);
    // Each row holds exactly the duty points of the two analyses.
    for row in &r.rows {
        let duty = |a: &Analysis| {
            a.cases
                .iter()
                .find(|c| c.name == row.case)
                .and_then(|c| c.pumps.iter().find(|p| p.name == row.pump))
                .and_then(|p| p.duty.clone())
        };
        let (before, after) = (duty(&aa), duty(&ab));
        assert_eq!(row.flow_m3_s.before, before.as_ref().map(|d| d.flow));
        assert_eq!(row.flow_m3_s.after, after.as_ref().map(|d| d.flow));
        assert_eq!(
            row.shaft_power.after,
            after.as_ref().and_then(|d| d.shaft_power)
        );
        let presence = match (before.is_some(), after.is_some()) {
            (true, true) => Presence::Both,
            (false, true) => Presence::Appeared,
            (true, false) => Presence::Disappeared,
            (false, false) => Presence::Neither,
        };
        assert_eq!(row.duty, presence);
        if let (Some(b), Some(a)) = (row.head_m.before, row.head_m.after) {
            let pct = row.head_m.change_percent.expect("a change in percent");
            assert!((pct - 100.0 * (a - b) / b.abs()).abs() < 1e-9);
        }
    }
    assert_eq!(r.recommendation.before, aa.selection.recommended);
    assert_eq!(r.recommendation.after, ab.selection.recommended);
    assert_eq!(
        r.recommendation.changed,
        aa.selection.recommended != ab.selection.recommended
    );
    assert!(r.has_differences());
}

#[test]
fn a_design_against_itself_has_no_differences() {
    let (a, aa) = compile(&read(REV_A));
    let d = diff::diff(&a, &aa, &a, &aa);
    assert!(!diff::has_differences(&d));
    assert!(d.inputs.is_empty());
    assert!(d.results.checks.is_empty());
    assert!(d
        .results
        .rows
        .iter()
        .all(|r| !r.flow_m3_s.changed() && !r.efficiency.changed()));
    let text = diff::render_text(&d);
    assert!(
        text.starts_with("Input changes: none\n\nResult changes: none\n"),
        "{text}"
    );
    // Formatting alone changes nothing either.
    let formatted =
        dutyline::syntax::format_source(&read(REV_A).replace("    ", "  ")).expect("formats");
    let (f, fa) = compile(&formatted);
    assert!(!diff::has_differences(&diff::diff(&a, &aa, &f, &fa)));
}

#[test]
fn a_removed_pump_is_listed_and_has_no_rows() {
    let src = read(REV_A);
    let i = src.find("pump B ").expect("pump B");
    let j = src[i..]
        .find("\n}\n")
        .map(|k| i + k + 3)
        .expect("end of pump B");
    let without_b = format!("{}{}", &src[..i], &src[j..]);
    let (a, aa) = compile(&src);
    let (b, ab) = compile(&without_b);
    let d = diff::diff(&a, &aa, &b, &ab);
    assert_eq!(d.results.pumps_removed, vec!["B".to_string()]);
    assert!(d.results.rows.iter().all(|r| r.pump == "A"));
    assert_eq!(d.results.rows.len(), aa.cases.len());
    assert!(d
        .inputs
        .iter()
        .any(|c| c.path == ["pump B"] && c.after.is_none()));
    assert!(diff::render_text(&d).contains("  pumps removed: B\n"));
}

#[test]
fn requirement_checks_that_change_status_are_listed() {
    // The same requirement text, met before (limit 0) and missed after (limit 1e6).
    let base = read(REV_A).replacen("    npsh_margin >= 1.3\n", "    npsh_margin >= limit\n", 1);
    let old_src = base.replacen(
        "let riser = 38 ft\n",
        "let riser = 38 ft\nlet limit = 0\n",
        1,
    );
    let new_src = base.replacen(
        "let riser = 38 ft\n",
        "let riser = 38 ft\nlet limit = 1000000\n",
        1,
    );
    let (a, aa) = compile(&old_src);
    let (b, ab) = compile(&new_src);
    let r = diff::diff_analyses(&aa, &ab, &dutyline::display::Units::new(b.project.units));
    let key = "requirement npsh_margin >= …";
    // Expected from the analyses themselves: every case × pump whose status differs.
    let status = |an: &Analysis, case: &str, pump: &str| {
        an.cases
            .iter()
            .find(|c| c.name == case)
            .and_then(|c| c.pumps.iter().find(|p| p.name == pump))
            .and_then(|p| {
                p.checks.iter().find(|c| {
                    c.id == "requirement"
                        && c.subject
                            .as_deref()
                            .is_some_and(|s| s.contains("npsh_margin"))
                })
            })
            .map(|c| c.status.keyword())
    };
    let mut expected = Vec::new();
    for c in &ab.cases {
        for p in &ab.candidates {
            let (before, after) = (status(&aa, &c.name, &p.name), status(&ab, &c.name, &p.name));
            if before != after {
                expected.push((c.name.clone(), p.name.clone(), before, after));
            }
        }
    }
    assert!(
        !expected.is_empty(),
        "the stricter limit must change some status"
    );
    let got: Vec<_> = r
        .checks
        .iter()
        .filter(|c| c.check == key)
        .map(|c| (c.case.clone(), c.pump.clone(), c.before, c.after))
        .collect();
    assert_eq!(got, expected);
    assert!(got.iter().all(|g| g.3 == Some("fail")));
    // The input change is the constant's effect on the requirement's limit.
    let inputs: Vec<String> = diff::diff_designs(&a, &b)
        .iter()
        .map(|c| c.render())
        .collect();
    assert_eq!(inputs, vec!["require › npsh_margin: >= 0 → >= 1000000"]);
    let text = diff::render_text(&diff::diff(&a, &aa, &b, &ab));
    assert!(text.contains("\nCheck changes ("), "{text}");
    assert!(
        text.contains(&format!("{} × {}: {key} ", expected[0].0, expected[0].1)),
        "{text}"
    );
}

#[test]
fn json_has_the_documented_shape() {
    let (a, aa, b, ab) = revisions();
    let d = diff::diff(&a, &aa, &b, &ab);
    let json: serde_json::Value = serde_json::from_str(&diff::to_json(&d)).expect("valid JSON");
    assert_eq!(json["format"], "dutyline-diff/1");
    assert_eq!(json["units"], "us");
    let inputs = json["inputs"].as_array().expect("inputs");
    assert_eq!(inputs.len(), d.inputs.len());
    assert_eq!(
        inputs[1]["path"],
        serde_json::json!(["line discharge", "segment 2", "length"])
    );
    assert_eq!(inputs[1]["before"], "2688 ft");
    assert_eq!(inputs[0]["before"], serde_json::Value::Null);
    let results = &json["results"];
    assert_eq!(results["cases_added"], serde_json::json!(["drought"]));
    let rows = results["rows"].as_array().expect("rows");
    assert_eq!(rows.len(), 10);
    for key in [
        "flow_m3_s",
        "head_m",
        "efficiency",
        "shaft_power_W",
        "npsh_margin",
    ] {
        let n = &rows[0][key];
        assert!(
            n.get("before").is_some()
                && n.get("after").is_some()
                && n.get("change_percent").is_some(),
            "{key}: {n}"
        );
    }
    assert!(["both", "appeared", "disappeared", "neither"]
        .contains(&rows[0]["duty"].as_str().unwrap_or("")));
    assert!(results["recommendation"].get("changed").is_some());
}

#[test]
fn text_lists_inputs_then_a_table_per_case_and_pump() {
    let (a, aa, b, ab) = revisions();
    let d = diff::diff(&a, &aa, &b, &ab);
    let text = diff::render_text(&d);
    assert!(
        text.starts_with("Input changes (9)\n  revision B: added ("),
        "{text}"
    );
    assert!(
        text.contains("\n  line discharge › segment 2 › length: 2688 ft → 2750 ft\n"),
        "{text}"
    );
    assert!(
        text.contains("\nResult changes\n  cases added: drought\n"),
        "{text}"
    );
    let header = text
        .lines()
        .find(|l| l.trim_start().starts_with("case ") && l.contains("quantity"))
        .expect("a table header");
    for col in ["pump", "quantity", "before", "after", "change"] {
        assert!(header.contains(col), "{header}");
    }
    // One block per case × pump: its first line names both.
    for row in &d.results.rows {
        let named = text.lines().any(|l| {
            let mut w = l.split_whitespace();
            w.next() == Some(row.case.as_str()) && w.next() == Some(row.pump.as_str())
        });
        assert!(named, "no line for {} × {}:\n{text}", row.case, row.pump);
    }
    assert!(
        text.contains(" gpm"),
        "flows are shown in the report units:\n{text}"
    );
    assert!(
        text.lines().all(|l| l == l.trim_end()),
        "trailing white space:\n{text}"
    );
}
