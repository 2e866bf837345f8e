//! Results of designs with many cases (issue 17 part C): above `SUMMARY_CASES` the
//! text summarises (the governing cases in full, one line per case and candidate);
//! the JSON (format 2) keeps every case, with what repeats in every case in tables
//! referred to by index.

#[path = "../benches/support/large_design.rs"]
mod large_design;

use dutyline::report::SUMMARY_CASES;
use serde_json::Value;

fn analysed(cases: usize) -> (String, dutyline::Design, dutyline::analysis::Analysis) {
    let src = large_design::large_design(cases);
    let checked = dutyline::check(&src, &dutyline::NoFiles);
    assert!(!checked.has_errors(), "the generated design checks");
    let d = checked.design.expect("design");
    let a = dutyline::analysis::analyse(&d);
    (src, d, a)
}

#[test]
fn the_text_of_many_cases_is_a_line_per_case_and_candidate() {
    let n = SUMMARY_CASES + 1;
    let (_, d, a) = analysed(n);
    let text = dutyline::results::to_text(&d, &a);
    assert!(text.contains(&format!("summary: {n} cases, more than {SUMMARY_CASES}")));
    let lines: Vec<&str> = text.lines().collect();
    let start = lines
        .iter()
        .position(|l| l.starts_with("every case ("))
        .expect("the table of every case");
    let rows: Vec<&&str> = lines[start + 1..]
        .iter()
        .take_while(|l| l.starts_with("  c"))
        .collect();
    // One line per case (its static head) and one per case and candidate.
    assert_eq!(rows.len(), n * (1 + d.pumps.len()));
    let duty = rows.iter().filter(|l| l.contains(" at ")).count();
    let with_duty: usize = a
        .cases
        .iter()
        .map(|c| c.pumps.iter().filter(|p| p.duty.is_some()).count())
        .sum();
    assert_eq!(duty, with_duty);
    // Full detail only for the governing cases.
    let governing = text.matches("\n  governing: ").count();
    assert!((2..=24).contains(&governing), "{governing}");
    assert_eq!(text.matches("\ncase ").count(), governing);
    // The long per-case lists are tallies.
    assert!(text.contains("capacity at the limit: smallest"));
    assert!(!text.contains("capacity at the limit: c0 "));
}

#[test]
fn the_text_of_few_cases_is_in_full() {
    let (_, d, a) = analysed(SUMMARY_CASES);
    let text = dutyline::results::to_text(&d, &a);
    assert!(!text.contains("summary: "));
    assert_eq!(text.matches("\ncase ").count(), SUMMARY_CASES);
}

/// Equal to the last bits serde_json's parser keeps (its default float parsing may be
/// one unit in the last place off).
fn same(v: &Value, x: f64) -> bool {
    v.as_f64()
        .is_some_and(|y| (y - x).abs() <= 1e-15 * x.abs().max(1e-300))
}

fn index(v: &Value) -> usize {
    v.as_u64().expect("an index") as usize
}

#[test]
fn the_json_of_many_cases_refers_to_its_tables() {
    let n = SUMMARY_CASES + 1;
    let (src, d, a) = analysed(n);
    let json = dutyline::results::to_json(&d, &a, "large.duty", &src, &[]);
    let doc: Value = serde_json::from_str(&json).expect("json");
    assert_eq!(doc["format"], "dutyline-results/2");
    let segments = doc["segments"].as_array().expect("segments");
    let profiles = doc["line_profiles"].as_array().expect("profiles");
    let sources = doc["sources"].as_array().expect("sources");
    // 20 segments, new or aged pipe: two descriptions of each, not one per case.
    assert_eq!(segments.len(), 40);
    let cases = doc["cases"].as_array().expect("cases");
    assert_eq!(cases.len(), n);
    for (i, case) in cases.iter().enumerate() {
        let sys = a.cases[i].system.as_ref().expect("system");
        let refs = case["segments"].as_array().expect("indices");
        assert_eq!(refs.len(), sys.segments.len());
        for (j, r) in refs.iter().enumerate() {
            let s = &segments[index(r)];
            assert_eq!(s["line"], &*sys.segments[j].line);
            assert_eq!(index(&s["index"]), sys.segments[j].index);
            assert!(same(&s["roughness_m"], sys.segments[j].roughness));
        }
        let curve = &case["system_curve"];
        assert!(same(&curve["head_m"][3], a.cases[i].system_curve[3].head));
        for (k, p) in case["pumps"].as_array().expect("pumps").iter().enumerate() {
            let r = &a.cases[i].pumps[k];
            for (c, check) in p["checks"].as_array().expect("checks").iter().enumerate() {
                assert_eq!(sources[index(&check["source"])], r.checks[c].source());
            }
            if let Some(duty) = r.duty.as_ref() {
                let cols = &p["duty"]["segments"];
                for (j, g) in duty.segments(sys).iter().enumerate() {
                    assert!(same(&cols["reynolds"][j], g.reynolds));
                    assert!(same(&cols["friction_head_m"][j], g.friction_head));
                }
            }
        }
        for (l, line) in case["lines"].as_array().expect("lines").iter().enumerate() {
            let screened = &a.safety.cases[i].lines()[l];
            let profile = &profiles[index(&line["profile"])];
            assert_eq!(profile["name"], screened.name.as_str());
            let stations = profile["chainage_m"].as_array().expect("chainages");
            assert_eq!(stations.len(), screened.stations.len());
            assert_eq!(
                line["pressure_static_Pa"].as_array().map(Vec::len),
                Some(stations.len())
            );
        }
    }
}

/// Cases whose pipes and liquid are equal share the system table, the tabulated losses
/// and the operating curves (`analysis::shared`): each case analysed alone (nothing to
/// share) gives the same duty, to the bit, as the case among the others. The generated
/// design's cases differ in level and pipe age, so some share and some do not.
#[test]
fn sharing_between_cases_changes_no_bit_of_a_duty() {
    let (src, _, all) = analysed(7);
    for (k, case) in all.cases.iter().enumerate() {
        let own = format!("case c{k} {{");
        let alone: String = src
            .lines()
            .filter(|l| !l.starts_with("case c") || l.starts_with(&own))
            .map(|l| format!("{l}\n"))
            .collect();
        let d = dutyline::check(&alone, &dutyline::NoFiles)
            .design
            .expect("one case checks");
        let a = dutyline::analysis::analyse(&d);
        assert_eq!(a.cases.len(), 1);
        for (shared, single) in case.pumps.iter().zip(&a.cases[0].pumps) {
            let (x, y) = (
                shared.duty.as_ref().expect("a duty"),
                single.duty.as_ref().expect("a duty"),
            );
            let bits = |d: &dutyline::analysis::duty::Duty| {
                [
                    d.flow,
                    d.head,
                    d.efficiency.unwrap_or(-1.0),
                    d.shaft_power.unwrap_or(-1.0),
                    d.npsh_available,
                ]
                .map(f64::to_bits)
            };
            assert_eq!(bits(x), bits(y), "case c{k} pump {}", shared.name);
            assert_eq!(
                shared.capacity_flow.map(f64::to_bits),
                single.capacity_flow.map(f64::to_bits)
            );
            assert_eq!(shared.operating_curve, single.operating_curve);
        }
    }
}

/// Cases share the base scenario's lines until an override changes a segment: the
/// override reaches its own case only, and the base and the other cases keep theirs.
#[test]
fn a_segment_override_changes_its_own_case_only() {
    let src = large_design::large_design(3);
    let plain = "case c1 { low.level = 99.03 m, hours = 80 h }";
    assert!(src.contains(plain), "the generated design's second case");
    let src = src.replace(
        plain,
        "case c1 { low.level = 99.03 m, hours = 80 h, discharge.2.length = 500 m }",
    );
    let checked = dutyline::check(&src, &dutyline::NoFiles);
    assert!(!checked.has_errors(), "{:?}", checked.diagnostics);
    let d = checked.design.expect("design");
    let length = |scenario: &dutyline::model::Scenario, seg: usize| {
        let line = scenario
            .lines
            .iter()
            .find(|l| l.name == "discharge")
            .expect("line");
        line.segments[seg].length.get::<uom::si::length::meter>()
    };
    let case = |n: &str| &d.cases.iter().find(|k| k.name == n).expect(n).scenario;
    assert_eq!(length(&d.base, 1), 47.0);
    assert_eq!(length(case("c1"), 1), 500.0);
    assert_eq!(length(case("c1"), 0), 40.0);
    assert_eq!(length(case("c0"), 1), 47.0);
    assert_eq!(length(case("c2"), 1), 47.0);
    assert!(std::sync::Arc::ptr_eq(&case("c0").lines, &case("c2").lines));
    assert!(!std::sync::Arc::ptr_eq(
        &case("c0").lines,
        &case("c1").lines
    ));
}

/// Above `SUMMARY_CASES` the safety screen keeps each case's checks and makes its line
/// screens again when they are read (`CaseSafety::lines`): the checks drawn from the
/// lines made again are the ones the screen drew from its own (an open chain, so every
/// check of the screen comes from these lines).
#[test]
fn line_screens_made_again_give_the_checks_the_screen_kept() {
    let (_, _, a) = analysed(SUMMARY_CASES + 1);
    assert_eq!(a.safety.cases.len(), SUMMARY_CASES + 1);
    for c in &a.safety.cases {
        assert!(c.screened(), "case {}", c.case);
        let lines = c.lines();
        assert!(!lines.is_empty(), "case {}", c.case);
        assert!(!c.checks.is_empty(), "case {}", c.case);
        assert_eq!(
            dutyline::analysis::safety::checks::line_checks(lines),
            c.checks,
            "case {}",
            c.case
        );
    }
}

/// A stream that takes `room` bytes, then fails every write.
struct Full {
    taken: Vec<u8>,
    room: usize,
    writes: usize,
}

impl std::io::Write for Full {
    fn write(&mut self, buf: &[u8]) -> std::io::Result<usize> {
        self.writes += 1;
        if self.taken.len() + buf.len() > self.room {
            return Err(std::io::Error::other("no room left"));
        }
        self.taken.extend_from_slice(buf);
        Ok(buf.len())
    }
    fn flush(&mut self) -> std::io::Result<()> {
        Ok(())
    }
}

#[test]
fn the_text_written_in_pieces_is_the_text_made_whole() {
    for n in [3, SUMMARY_CASES + 200] {
        let (_, d, a) = analysed(n);
        let whole = dutyline::results::to_text(&d, &a);
        let mut out = Full {
            taken: Vec::new(),
            room: usize::MAX,
            writes: 0,
        };
        dutyline::results::write_text(&mut out, &d, &a).expect("room for all");
        assert_eq!(
            String::from_utf8(out.taken).expect("UTF-8"),
            whole,
            "{n} cases"
        );
        if n > SUMMARY_CASES {
            // Written in pieces, not held whole: 240 cases make about 300 KB.
            assert!(whole.len() > 4 * 64 * 1024, "{}", whole.len());
            assert!(out.writes > 3, "{} writes", out.writes);
        }
    }
}

#[test]
fn a_failed_write_of_the_text_is_reported_and_ends_the_writing() {
    let (_, d, a) = analysed(SUMMARY_CASES + 200);
    let mut out = Full {
        taken: Vec::new(),
        room: 100 * 1024,
        writes: 0,
    };
    let err = dutyline::results::write_text(&mut out, &d, &a).expect_err("the stream fills");
    assert_eq!(err.to_string(), "no room left");
    // The first failure ends the writing: no later piece is tried.
    let whole = dutyline::results::to_text(&d, &a);
    let tried = out.writes;
    assert!(tried < whole.len() / (64 * 1024), "{tried} writes");
    assert!(whole.starts_with(std::str::from_utf8(&out.taken).expect("UTF-8")));
}
