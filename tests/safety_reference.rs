//! The safety screen of the demos against an independent recomputation:
//! tests/reference/safety_reference.csv, written by tests/reference/gen_safety.py
//! (fluids, iapws) from the inputs of the demos' results JSON only: duty flow, grade
//! line pressures at duty, static and at shut-off along every line's stations, water's
//! bulk modulus ρ·w², the Korteweg wave speed of every segment, the equivalent pipe's
//! wave speed, period and Joukowsky head.

mod common;

use common::{num, read_csv, text};
use dutyline::analysis::safety::CaseSafety;
use dutyline::analysis::Analysis;

const CSV: &str = include_str!("reference/safety_reference.csv");

struct DemoFiles;
impl dutyline::FileAccess for DemoFiles {
    fn read_text(&self, path: &str) -> Result<String, dutyline::model::FileError> {
        let full = format!("{}/examples-demo/{path}", env!("CARGO_MANIFEST_DIR"));
        std::fs::read_to_string(full)
            .map_err(|e| dutyline::model::FileError::Unreadable(e.to_string()))
    }
}

fn analysed(demo: &str) -> Analysis {
    let path = format!("{}/examples-demo/{demo}.duty", env!("CARGO_MANIFEST_DIR"));
    let source = std::fs::read_to_string(&path).unwrap();
    let checked = dutyline::check(&source, &DemoFiles);
    assert!(!checked.has_errors(), "{demo} has errors");
    dutyline::analysis::analyse(&checked.design.unwrap())
}

fn case<'a>(a: &'a Analysis, name: &str) -> &'a CaseSafety {
    a.safety.cases.iter().find(|c| c.case == name).unwrap()
}

/// Relative tolerance with an absolute floor (Pa for pressures).
fn close(engine: f64, reference: f64, rel: f64, abs: f64) -> bool {
    (engine - reference).abs() <= rel * reference.abs() + abs
}

#[test]
fn demos_match_the_independent_recomputation() {
    let rows = read_csv(CSV);
    assert!(rows.len() > 300, "the reference has {} rows", rows.len());
    let demos = [
        ("orchard-lift-rev-a", analysed("orchard-lift-rev-a")),
        ("kestrel-booster", analysed("kestrel-booster")),
    ];
    let mut compared = 0;
    for row in &rows {
        let demo = text(row, "demo");
        let a = &demos.iter().find(|(d, _)| *d == demo).unwrap().1;
        let c = case(a, text(row, "case"));
        let want = num(row, "value");
        let quantity = text(row, "quantity");
        let line = c.lines().iter().find(|l| l.name == text(row, "line"));
        let index: Option<usize> = text(row, "index").parse().ok();
        // Pressures: 0.2 % (the two duty solves differ in their last digits and the
        // fluid is evaluated by two IF97 codes) with a 50 Pa floor.
        let (got, rel, abs) = match quantity {
            "duty_flow_m3_s" => (c.flow.unwrap(), 1e-3, 0.0),
            // Compared in its own test below.
            "bulk_modulus_Pa" => continue,
            "pressure_duty_Pa" => (
                line.unwrap().pressure_duty.as_ref().unwrap()[index.unwrap()],
                2e-3,
                50.0,
            ),
            "pressure_static_Pa" => (line.unwrap().pressure_static[index.unwrap()], 1e-4, 5.0),
            "pressure_shutoff_Pa" => (
                line.unwrap().pressure_shutoff.as_ref().unwrap()[index.unwrap()],
                2e-3,
                50.0,
            ),
            "wave_speed_m_s" => {
                let sg = line.unwrap().surge.as_ref().unwrap();
                (
                    sg.segments[index.unwrap()].as_ref().unwrap().wave_speed,
                    1e-3,
                    0.0,
                )
            }
            "equivalent_wave_speed_m_s" => {
                (line.unwrap().surge.as_ref().unwrap().wave_speed, 1e-3, 0.0)
            }
            "period_s" => (line.unwrap().surge.as_ref().unwrap().period, 1e-3, 0.0),
            "joukowsky_head_m" => (
                line.unwrap().surge.as_ref().unwrap().joukowsky_head,
                2e-3,
                0.0,
            ),
            other => panic!("unknown quantity {other}"),
        };
        assert!(
            close(got, want, rel, abs),
            "{demo} {} {} {:?} {quantity}: engine {got}, reference {want}",
            text(row, "case"),
            text(row, "line"),
            index
        );
        compared += 1;
    }
    assert!(compared > 300);
}

#[test]
fn water_bulk_modulus_matches_iapws_speed_of_sound() {
    // K = ρ·w² from the iapws package's IAPWS-IF97 at the case temperature and the
    // source surface pressure (reference CSV), against the engine's seuif97 value.
    let rows = read_csv(CSV);
    let row = rows
        .iter()
        .find(|r| {
            text(r, "quantity") == "bulk_modulus_Pa" && text(r, "demo") == "orchard-lift-rev-a"
        })
        .unwrap();
    let k = dutyline::fluid::water_bulk_modulus_pa(
        (64.0 - 32.0) / 1.8 + 273.15,
        analysed("orchard-lift-rev-a").cases[0]
            .system
            .as_ref()
            .unwrap()
            .source_surface
            .pa(),
    )
    .unwrap();
    assert!(
        close(k, num(row, "value"), 1e-4, 0.0),
        "{k} vs {}",
        num(row, "value")
    );
}
