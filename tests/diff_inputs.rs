//! Input diffs between revisions of a design: what a reviewer sees as changed.

use dutyline::diff::{diff_designs, InputChange};
use dutyline::Design;

const REV_A: &str = "examples-demo/orchard-lift-rev-a.duty";
const REV_B: &str = "examples-demo/orchard-lift-rev-b.duty";

fn read(path: &str) -> String {
    std::fs::read_to_string(path).unwrap_or_else(|e| panic!("{path}: {e}"))
}

fn design(src: &str) -> Design {
    let checked = dutyline::check(src, &dutyline::NoFiles);
    checked
        .design
        .unwrap_or_else(|| panic!("does not lower: {:?}\n{src}", checked.diagnostics))
}

/// The changes from rev A to rev A edited by `(from, to)` replacements.
fn changes_after(edits: &[(&str, &str)]) -> Vec<String> {
    let old = read(REV_A);
    let mut new = old.clone();
    for (from, to) in edits {
        assert!(new.contains(from), "rev A no longer contains {from:?}");
        new = new.replacen(from, to, 1);
    }
    diff_designs(&design(&old), &design(&new))
        .iter()
        .map(InputChange::render)
        .collect()
}

/// Move the block that starts with `start` (through its closing line `end`) to just
/// before the line that starts with `before`.
fn move_block(src: &str, start: &str, end: &str, before: &str) -> String {
    let i = src.find(start).unwrap_or_else(|| panic!("no {start:?}"));
    let j = src[i..]
        .find(end)
        .map(|k| i + k + end.len())
        .unwrap_or_else(|| panic!("no {end:?}"));
    let block = src[i..j].to_string();
    let rest = format!("{}{}", &src[..i], &src[j..]);
    let at = rest.find(before).unwrap_or_else(|| panic!("no {before:?}"));
    format!("{}{}{}", &rest[..at], block, &rest[at..])
}

#[test]
fn revision_b_changes_are_exactly_these() {
    let old = design(&read(REV_A));
    let new = design(&read(REV_B));
    let changes = diff_designs(&old, &new);
    let rendered: Vec<String> = changes.iter().map(InputChange::render).collect();
    assert_eq!(
        rendered,
        vec![
            "revision B: added (2026-11-30 \"Drought case added; PVC run re-measured at 2712 ft\")",
            "line discharge › segment 2 › length: 2688 ft → 2750 ft",
            // The survey's last point moves with the re-measured run (issue 14).
            "line discharge › profile › point 8: chainage 2700 ft, elevation 1330 ft → chainage 2762 ft, elevation 1330 ft",
            "case drought: added (wet_well.level = 1200.5 ft, hours = 250 h)",
            "require › flow for drought: added (>= 600 gpm)",
            // Revision B was written before the yearly operation (issue 13) and has no
            // profile or cost blocks: the diff says so.
            "load_profile normal: removed (5 rows, 3100 h)",
            "cost A: removed (initial 21500 USD)",
            "cost B: removed (initial 27900 USD)",
            "assumption: added (The drought case takes the intake 1.5 ft below the lowest recorded summer stage.)",
        ]
    );
    assert_eq!(
        changes[1],
        InputChange {
            path: vec!["line discharge".into(), "segment 2".into(), "length".into()],
            before: Some("2688 ft".into()),
            after: Some("2750 ft".into()),
        }
    );
    // And back: the same changes the other way round.
    let back: Vec<String> = diff_designs(&new, &old)
        .iter()
        .map(InputChange::render)
        .collect();
    assert_eq!(
        back[0],
        "revision B: removed (2026-11-30 \"Drought case added; PVC run re-measured at 2712 ft\")"
    );
    assert_eq!(
        back[1],
        "line discharge › segment 2 › length: 2750 ft → 2688 ft"
    );
    assert_eq!(back.len(), 9);
}

#[test]
fn reordering_cases_pumps_requirements_and_texts_is_no_change() {
    let src = read(REV_B);
    let mut moved = move_block(&src, "case aged {", "}\n", "case normal {");
    moved = move_block(&moved, "case drought {", "}\n", "case low_river {");
    moved = move_block(&moved, "pump B ", "\n}\n", "pump A ");
    moved = moved.replacen(
        "    flow >= 700 gpm for normal\n    flow >= 600 gpm for drought\n    npsh_margin >= 1.3\n",
        "    npsh_margin >= 1.3\n    flow >= 600 gpm for drought\n    flow >= 700 gpm for normal\n",
        1,
    );
    moved = move_block(&moved, "assume \"Reservoir", "\n", "assume \"The wet well");
    moved = move_block(&moved, "note ", "\n", "assume \"The drought");
    assert_ne!(moved, src);
    let (a, b) = (design(&src), design(&moved));
    assert_ne!(
        a.cases.iter().map(|c| &c.name).collect::<Vec<_>>(),
        b.cases.iter().map(|c| &c.name).collect::<Vec<_>>()
    );
    assert_ne!(a.pumps[0].name, b.pumps[0].name);
    assert_ne!(a.assumptions, b.assumptions);
    assert_eq!(diff_designs(&a, &b), vec![]);
}

#[test]
fn layout_comments_and_number_spelling_are_no_change() {
    let src = read(REV_A);
    let messy = src
        .replace(
            "    fitting gate_valve\n",
            "    fitting gate_valve   # shut-off for maintenance\n",
        )
        .replace(
            "case aged { roughness = aged }",
            "case aged {\n\n  roughness   =   aged  # 20 years\n}",
        )
        .replace("wet_well.level = 1202.0 ft", "wet_well.level = 1202 ft")
        .replace("length = 2650 ft + riser", "length = 2688 ft")
        .replace(
            "project {\n    title",
            "# the client's project\nproject { title",
        )
        .replace("\n    number =", ", number =");
    assert_ne!(messy, src);
    assert_eq!(diff_designs(&design(&src), &design(&messy)), vec![]);
    let formatted = dutyline::syntax::format_source(&messy).expect("formats");
    assert_eq!(diff_designs(&design(&src), &design(&formatted)), vec![]);
}

#[test]
fn field_changes_are_reported_with_their_path() {
    assert_eq!(
        changes_after(&[("number = \"FB-HYD-007\"", "number = \"FB-HYD-007A\"")]),
        vec!["project › number: FB-HYD-007 → FB-HYD-007A"]
    );
    assert_eq!(
        changes_after(&[("\"Issued for review\"", "\"Issued for comment\"")]),
        vec!["revision A › description: Issued for review → Issued for comment"]
    );
    assert_eq!(
        changes_after(&[("temperature = 64 degF", "temperature = 70 degF")]),
        vec!["fluid › temperature: 64 degF → 70 degF"]
    );
    assert_eq!(
        changes_after(&[(
            "let ridge_overflow = 1342.0 ft",
            "let ridge_overflow = 1345.0 ft"
        )]),
        vec!["tank reservoir › level: 1339.5 ft → 1342.5 ft"]
    );
    assert_eq!(
        changes_after(&[(
            "        400        179       62",
            "        400        181       62"
        )]),
        vec!["pump A › curve impeller 12.5 in › point 3 › head: 179 ft → 181 ft"]
    );
    assert_eq!(
        changes_after(&[("    price = 0.118 USD/kWh", "    price = 0.125 USD/kWh")]),
        vec!["energy › price: 0.118 USD/kWh → 0.125 USD/kWh"]
    );
    assert_eq!(
        changes_after(&[(
            "    service_factor = 1.15\n",
            "    service_factor = 1.15\n    efficiency = 94.1 %\n"
        )]),
        vec!["motor › efficiency: added (94.1 %)"]
    );
    // Issue 12: a well's drawdown test and a line serving each pump are inputs too.
    let changes = changes_after(&[(
        "tank wet_well { level = 1208.5 ft }",
        "tank wet_well {\n    level = 1208.5 ft\n    drawdown = 6 ft\n    test_flow = 700 gpm\n}",
    )]);
    assert_eq!(
        changes,
        vec![
            "tank wet_well › drawdown: added (6 ft)",
            "tank wet_well › test_flow: added (700 gpm)"
        ]
    );
    assert_eq!(
        changes_after(&[(
            "line suction from wet_well to pump {\n",
            "line suction from wet_well to pump {\n    serves = each_pump\n"
        )]),
        vec!["line suction › serves: added (each_pump)"]
    );
}

#[test]
fn case_changes_are_reported_by_their_effect() {
    assert_eq!(
        changes_after(&[(
            "    wet_well.level = 1202.0 ft\n    hours = 300 h",
            "    wet_well.level = 1201.0 ft\n    hours = 300 h"
        )]),
        vec!["case low_river › tank wet_well › level: 1202 ft → 1201 ft"]
    );
    assert_eq!(
        changes_after(&[(
            "case aged { roughness = aged }",
            "case aged {\n    roughness = aged\n    discharge.2.length = 3000 ft\n}"
        )]),
        vec!["case aged › line discharge › segment 2 › length: added (3000 ft)"]
    );
    assert_eq!(
        changes_after(&[(
            "case normal { hours = 1400 h }",
            "case normal {\n    hours = 1400 h\n    A.speed = 1750 rpm\n}"
        )]),
        vec!["case normal › pump A › speed: added (1750 rpm)"]
    );
    let removed = changes_after(&[("case aged { roughness = aged }\n", "")]);
    assert_eq!(removed, vec!["case aged: removed (roughness = aged)"]);
}

#[test]
fn line_segments_and_fittings_are_compared_in_place() {
    // A fitting count: the path names the line, the segment and the fitting.
    let old = design(&read(REV_A));
    let new =
        design(&read(REV_A).replacen("fitting elbow_90_long * 2", "fitting elbow_90_long * 3", 1));
    let changes = diff_designs(&old, &new);
    assert_eq!(changes.len(), 1, "{changes:?}");
    assert_eq!(changes[0].path[..2], ["line suction", "segment 1"]);
    assert!(changes[0].path[2].starts_with("fitting "));
    assert_eq!(changes[0].path[3], "count");
    assert_eq!(
        (changes[0].before.as_deref(), changes[0].after.as_deref()),
        (Some("2"), Some("3"))
    );
    // Removing a fitting is one change, wherever it stood.
    let new = design(&read(REV_A).replacen("    fitting exit\n", "", 1));
    let changes = diff_designs(&old, &new);
    assert_eq!(changes.len(), 1, "{changes:?}");
    assert_eq!(changes[0].path[..2], ["line discharge", "segment 2"]);
    assert_eq!(changes[0].after, None);
    // Fittings listed in another order are the same fittings.
    let swapped = read(REV_A).replacen(
        "    fitting check_valve_swing\n    fitting gate_valve\n",
        "    fitting gate_valve\n    fitting check_valve_swing\n",
        1,
    );
    assert_eq!(diff_designs(&old, &design(&swapped)), vec![]);
    // A new segment at the end of a line.
    let last = "        why = \"air-release valve tee and flow meter allowance\"\n    }\n";
    let extended = read(REV_A).replacen(
        last,
        &format!("{last}    pipe pvc 8 in schedule 40 {{ length = 40 ft }}\n    fitting exit\n"),
        1,
    );
    let changes: Vec<String> = diff_designs(&old, &design(&extended))
        .iter()
        .map(InputChange::render)
        .collect();
    assert_eq!(changes.len(), 1, "{changes:?}");
    assert!(
        changes[0].starts_with("line discharge › segment 3: added ("),
        "{changes:?}"
    );
    assert!(
        changes[0].ends_with(" 8 in schedule 40, 40 ft)"),
        "{changes:?}"
    );
}

#[test]
fn pumps_requirements_and_texts_added_and_removed() {
    let pump_b = {
        let src = read(REV_A);
        let i = src.find("pump B ").unwrap_or(0);
        let j = src[i..].find("\n}\n").map_or(src.len(), |k| i + k + 3);
        src[i..j].to_string()
    };
    assert_eq!(
        changes_after(&[(&pump_b, "")]),
        vec![
            "pump B: removed (\"Horizontal split case, 1780 rpm\")",
            // Its cost block stays in the file (a warning) and is no longer used.
            "cost B: removed (initial 27900 USD)"
        ]
    );
    assert_eq!(
        changes_after(&[("    npsh_margin >= 1.3\n", "    npsh_margin >= 1.5\n")]),
        vec!["require › npsh_margin: >= 1.3 → >= 1.5"]
    );
    assert_eq!(
        changes_after(&[("note \"Pump data", "note \"Pump data (rev 2)")]),
        vec![
            "note: removed (Pump data are catalogue curves, not certified test curves.)",
            "note: added (Pump data (rev 2) are catalogue curves, not certified test curves.)",
        ]
    );
}

#[test]
fn values_follow_the_new_designs_report_units() {
    // Only the units change: every value is shown in SI on both sides, so nothing else differs.
    assert_eq!(
        changes_after(&[("units = us", "units = si")]),
        vec!["project › units: us → si"]
    );
    // 2688 ft = 819.302 m and 2750 ft = 838.2 m (1 ft = 0.3048 m, NIST SP 811 B.8).
    let old = design(&read(REV_A));
    let new = design(&read(REV_B).replacen("units = us", "units = si", 1));
    let rendered: Vec<String> = diff_designs(&old, &new)
        .iter()
        .map(InputChange::render)
        .collect();
    assert!(
        rendered.contains(&"line discharge › segment 2 › length: 819.302 m → 838.2 m".to_string()),
        "{rendered:?}"
    );
    assert!(
        rendered.contains(&"require › flow for drought: added (>= 136.275 m³/h)".to_string()),
        "{rendered:?}"
    );
}

#[test]
fn profile_cost_and_motor_changes_show() {
    // Issue 13: a changed hours row, a cost element, the price, the rates and the supply.
    assert_eq!(
        changes_after(&[("        500        900\n", "        500        1000\n")]),
        vec!["load_profile normal › row 3 › hours: 900 h → 1000 h"]
    );
    assert_eq!(
        changes_after(&[(
            "    max_starts_per_hour = 4\n",
            "    max_starts_per_hour = 5\n"
        )]),
        vec!["load_profile normal › max_starts_per_hour: 4 → 5"]
    );
    assert_eq!(
        changes_after(&[(
            "    maintenance = 650 USD/year\n",
            "    maintenance = 720 USD/year\n"
        )]),
        vec!["cost A › maintenance: 650 USD/year → 720 USD/year"]
    );
    assert_eq!(
        changes_after(&[("    price = 0.118 USD/kWh", "    price = 0.125 USD/kWh")]),
        vec!["energy › price: 0.118 USD/kWh → 0.125 USD/kWh"]
    );
    assert_eq!(
        changes_after(&[(
            "    service_factor = 1.15\n",
            "    service_factor = 1.15\n    supply = 50 Hz\n"
        )]),
        vec!["motor › supply: added (50 Hz)"]
    );
}

#[test]
fn wall_and_rating_changes_show() {
    // Issue 14: a stated wall thickness or rating, and a pressure class, change the wall.
    assert_eq!(
        changes_after(&[(
            "pipe pvc 8 in schedule 40 { length = 2650 ft + riser }",
            "pipe pvc 8 in schedule 40 { length = 2650 ft + riser\n rating = 160 psi }"
        )]),
        vec!["line discharge › segment 2 › rating: added (160 psig)"]
    );
    assert_eq!(
        changes_after(&[(
            "pipe pvc 8 in schedule 40 { length = 2650 ft + riser }",
            "pipe pvc 8 in schedule 80 { length = 2650 ft + riser }"
        )]),
        // PVC 8 in: minimum wall 0.322 in at schedule 40 and 0.500 in at schedule 80
        // (ASTM D1785 table 1, from memory; the catalogue's values); the bore follows,
        // and so does the β the expansion takes from the bores: 6.065 / 7.565 = 0.80172.
        vec![
            "line discharge › segment 1 › fitting expansion_gradual › beta: 0.763627 → 0.801718",
            "line discharge › segment 2 › size: 8 in schedule 40 → 8 in schedule 80",
            "line discharge › segment 2 › inner_diameter: 7.94236 in → 7.565 in",
            "line discharge › segment 2 › wall: 0.322 in → 0.5 in",
        ]
    );
    assert_eq!(
        changes_after(&[(
            "pipe pvc 8 in schedule 40 { length = 2650 ft + riser }",
            "pipe pvc 8 in schedule 40 { length = 2650 ft + riser\n flanges = asme_150 }"
        )]),
        vec!["line discharge › segment 2 › flanges: added (ASME B16.5 class 150 flanges (material group 1.1))"]
    );
}
