//! Well fields stated in the language (issue 12): `wellpump NAME from WELL to NODE`.
//!
//! - Against tests/reference/gen_network.py (`well_fields`, scipy.optimize.root with
//!   fluids' Colebrook): each reference field written as a design (a custom fluid of the
//!   reference's properties, pipes by bore and roughness, K as stated losses, the
//!   reference's quadratic pump curve as a table, which the least-squares quadratic fits
//!   exactly), checked through `check` → `analyse`: every well's flow, head, pumping
//!   level and NPSH available within 1e-6 of scipy's, the total the sum.
//! - Two identical wells split equally; a pump set above its pumping level fails its
//!   NPSH margin at that well only; a stopped well pump leaves the field.
//! - `tests/designs/well-field-three.duty` (the same field as a file) end to end, with
//!   the package built.

mod common;
mod network_common;

use dutyline::analysis::duty::PumpResult;
use dutyline::analysis::limits::CheckId;
use dutyline::analysis::Analysis;
use dutyline::NoFiles;
use network_common::well_field;

/// A pipe by bore and roughness with its K as a stated loss.
fn pipe(p: &serde_json::Value) -> String {
    let n = |k: &str| p[k].as_f64().unwrap();
    let mut s = format!(
        "pipe other bore {} mm {{ length = {} m, roughness = {} mm }}\n",
        n("diameter_m") * 1000.0,
        n("length_m"),
        n("roughness_m") * 1000.0
    );
    if n("k") > 0.0 {
        s += &format!("loss {{ k = {}, why = \"reference K\" }}\n", n("k"));
    }
    s
}

/// The reference field as a design; `extra` is appended (cases, overrides).
fn design_of(f: &serde_json::Value, extra: &str) -> String {
    let fl = &f["fluid"];
    let mut s = format!(
        "project {{ title = \"well field reference\" }}\n\
         fluid \"reference water\" {{ density = {} kg/m^3, viscosity = {} Pa*s, vapor_pressure = {} Pa }}\n\
         site {{ pressure = {} Pa }}\n",
        fl["density"], fl["viscosity"], fl["vapor_pressure_pa"], f["barometric_pa"]
    );
    let c = &f["collector"];
    for n in c["nodes"].as_array().unwrap() {
        let name = n["name"].as_str().unwrap();
        match n["fixed_head_m"].as_f64() {
            Some(h) => s += &format!("tank {name} {{ level = {h} m }}\n"),
            None => {
                s += &format!(
                    "junction {name} {{ elevation = {} m, demand = {} m^3/s }}\n",
                    n["elevation_m"], n["demand_m3_s"]
                )
            }
        }
    }
    for l in c["links"].as_array().unwrap() {
        s += &format!(
            "line {} from {} to {} {{\n{}}}\n",
            l["name"].as_str().unwrap(),
            l["from"].as_str().unwrap(),
            l["to"].as_str().unwrap(),
            pipe(l)
        );
    }
    for w in f["wells"].as_array().unwrap() {
        let name = w["name"].as_str().unwrap();
        s += &format!(
            "tank well_{name} {{ level = {} m, drawdown = {} m, test_flow = {} m^3/s, well_loss = {} m }}\n",
            w["static_level_m"], w["drawdown_m"], w["test_flow_m3_s"], w["well_loss_m"]
        );
        s += &format!(
            "wellpump {name} from well_{name} to {} {{\nelevation = {} m\nsuction {{\n{}}}\n{}}}\n",
            w["collector_node"].as_str().unwrap(),
            w["pump_elevation_m"],
            pipe(&w["suction"]),
            pipe(&w["discharge"])
        );
    }
    let h0 = f["pump"]["shutoff_m"].as_f64().unwrap();
    let a = f["pump"]["curve_m_s2_m6"].as_f64().unwrap();
    s += "pump P \"reference quadratic\" {\nspeed = 2900 rpm\ncurve impeller 150 mm {\nflow m^3/s   head m   efficiency %   npshr m\n";
    for (i, (eta, npshr)) in [
        (0.0, 2.0),
        (55.0, 2.5),
        (74.0, 3.5),
        (68.0, 5.0),
        (55.0, 6.0),
    ]
    .iter()
    .enumerate()
    {
        let q = [0.0, 0.01, 0.02, 0.03, 0.035][i];
        s += &format!("{q} {} {eta} {npshr}\n", h0 - a * q * q);
    }
    s + "}\n}\n" + extra
}

fn analysed(src: &str) -> (dutyline::Design, Analysis) {
    common::analyse_valid(src, &NoFiles)
}

fn pump<'a>(a: &'a Analysis, case: &str) -> &'a PumpResult {
    let c = a.cases.iter().find(|c| c.name == case).unwrap();
    assert!(c.error.is_none(), "{:?}", c.error);
    &c.pumps[0]
}

#[test]
fn the_three_well_field_as_a_design_matches_scipy() {
    let f = well_field("three_wells");
    let (_, a) = analysed(&design_of(&f, "case design { hours = 1000 h }\n"));
    let p = pump(&a, "design");
    let want = &f["solution"];
    assert_eq!(p.wells.len(), 3);
    for (w, r) in p.wells.iter().zip(want["pumps"].as_array().unwrap()) {
        let num = |k: &str| r[k].as_f64().unwrap();
        assert_eq!(w.name, r["well"].as_str().unwrap());
        assert!(
            (w.duty.flow - num("flow_m3_s")).abs() <= 1e-6 * num("flow_m3_s"),
            "{w:?}"
        );
        assert!((w.duty.head - num("head_m")).abs() < 1e-6, "{w:?}");
        assert!((w.pumping_level - num("pumping_level_m")).abs() < 1e-6);
        assert!((w.duty.npsh_available - num("npsh_available_m")).abs() < 1e-6);
        // The printed terms add up to NPSH available (the suction losses recomputed).
        assert!((w.duty.npsh_terms.sum() - w.duty.npsh_available).abs() < 1e-6);
    }
    let d = p.duty.as_ref().unwrap();
    let total = want["total_flow_m3_s"].as_f64().unwrap();
    assert!((d.flow - total).abs() <= 1e-6 * total);
    // Totals: power summed, the head such that ρgQH is the summed hydraulic power.
    let shaft: f64 = p.wells.iter().map(|w| w.duty.shaft_power.unwrap()).sum();
    assert!((d.shaft_power.unwrap() - shaft).abs() < 1e-9 * shaft);
    let hydraulic: f64 = p.wells.iter().map(|w| w.duty.hydraulic_power).sum();
    assert!((d.hydraulic_power - hydraulic).abs() < 1e-9 * hydraulic);
    // Unequal wells, unequal flows; every well checked on its own.
    assert!((p.wells[0].duty.flow - p.wells[1].duty.flow).abs() > 1e-3);
    for w in &p.wells {
        assert!(p
            .checks
            .iter()
            .any(|c| c.id == CheckId::NpshMargin && c.subject.as_deref() == Some(&w.name)));
        assert!(p
            .checks
            .iter()
            .any(|c| c.id == CheckId::Motor && c.subject.as_deref() == Some(&w.name)));
    }
    // The network at the duty carries the wells' nodes and balances at the reservoir.
    let at = p.network.as_ref().unwrap();
    let reservoir = at.nodes.iter().find(|n| n.name == "reservoir").unwrap();
    assert!((reservoir.inflow.unwrap() - total).abs() < 1e-9);
}

#[test]
fn two_identical_wells_split_equally() {
    let f = well_field("twin_wells");
    let (_, a) = analysed(&design_of(&f, "case design { hours = 1000 h }\n"));
    let p = pump(&a, "design");
    let (q0, q1) = (p.wells[0].duty.flow, p.wells[1].duty.flow);
    assert!((q0 - q1).abs() < 1e-9 * q0, "{q0} {q1}");
    let r = f["solution"]["pumps"][0]["flow_m3_s"].as_f64().unwrap();
    assert!((q0 - r).abs() <= 1e-6 * r);
    assert!((p.duty.as_ref().unwrap().flow - 2.0 * q0).abs() < 1e-9);
}

#[test]
fn a_pump_set_above_its_pumping_level_fails_npsh_there_only() {
    let f = well_field("twin_wells");
    // Setting pump a at its static level (above the pumping level): NPSH available
    // falls by the drop of its setting; the hydraulics do not change.
    let extra = "case low { hours = 100 h }\ncase high { hours = 100 h, a.elevation = 70 m }\n";
    let (_, an) = analysed(&design_of(&f, extra));
    let (low, high) = (pump(&an, "low"), pump(&an, "high"));
    let npsh = |p: &PumpResult, w: &str| {
        p.checks
            .iter()
            .find(|c| c.id == CheckId::NpshMargin && c.subject.as_deref() == Some(w))
            .unwrap()
            .status
    };
    use dutyline::analysis::checks::Status;
    assert_eq!(npsh(low, "a"), Status::Pass);
    assert_eq!(npsh(high, "a"), Status::Fail);
    assert_eq!(npsh(high, "b"), Status::Pass);
    assert!((low.wells[0].duty.flow - high.wells[0].duty.flow).abs() < 1e-9);
    let drop = low.wells[0].duty.npsh_available - high.wells[0].duty.npsh_available;
    assert!((drop - 15.0).abs() < 1e-6, "{drop}");
    // The candidate does not qualify with a failing check in some case.
    assert!(an.selection.recommended.is_none());
}

#[test]
fn a_stopped_well_pump_leaves_the_field() {
    let f = well_field("twin_wells");
    let extra = "case both { hours = 100 h }\ncase one { hours = 100 h, b.running = 0 }\n";
    let (_, an) = analysed(&design_of(&f, extra));
    let (both, one) = (pump(&an, "both"), pump(&an, "one"));
    assert_eq!(one.wells.len(), 1);
    assert_eq!(one.count, 1);
    let (q_both, q_one) = (
        both.duty.as_ref().unwrap().flow,
        one.duty.as_ref().unwrap().flow,
    );
    // One well alone gives more than half the field's flow (less friction in the main),
    // less than all of it.
    assert!(q_one > 0.5 * q_both && q_one < q_both, "{q_one} {q_both}");
}

#[test]
fn the_test_design_builds_its_package() {
    let src = std::fs::read_to_string("tests/designs/well-field-three.duty").unwrap();
    let (design, a) = analysed(&src);
    let p = pump(&a, "all_wells");
    let want = &well_field("three_wells")["solution"];
    let total = want["total_flow_m3_s"].as_f64().unwrap();
    assert!((p.duty.as_ref().unwrap().flow - total).abs() <= 1e-6 * total);
    assert!(p
        .checks
        .iter()
        .any(|c| c.id == CheckId::Requirement
            && c.status == dutyline::analysis::checks::Status::Pass));
    let json = dutyline::results::to_json(&design, &a, "well-field-three.duty", &src, &[]);
    let v: serde_json::Value = serde_json::from_str(&json).unwrap();
    let wells = v["cases"][0]["pumps"][0]["wells"].as_array().unwrap();
    assert_eq!(wells.len(), 3);
    assert_eq!(wells[2]["well"], "w3");
    // WP2 is stopped in case w2_off.
    assert_eq!(
        v["cases"][1]["pumps"][0]["wells"].as_array().unwrap().len(),
        2
    );
}

#[test]
fn a_pump_that_cannot_lift_against_the_collector_fails_its_duty_at_that_well() {
    let f = well_field("twin_wells");
    // Well b 60 m deeper: the pump's 90 m shut-off cannot reach the collector's head,
    // so its check valve stays shut and well a carries the field alone.
    let extra = "case deep { hours = 100 h, well_b.level = 10 m }\n";
    let (design, an) = analysed(&design_of(&f, extra));
    let p = pump(&an, "deep");
    let b = p.wells.iter().find(|w| w.name == "b").unwrap();
    assert!(b.closed, "{b:?}");
    assert!(b.duty.flow.abs() < 1e-9);
    let duty_b = p
        .checks
        .iter()
        .find(|c| c.id == CheckId::DutyPoint && c.subject.as_deref() == Some("b"))
        .unwrap();
    assert_eq!(duty_b.status, dutyline::analysis::checks::Status::Fail);
    let total = p.duty.as_ref().unwrap().flow;
    assert!((total - p.wells[0].duty.flow).abs() < 1e-12);
    let src = design_of(&f, extra);
    let json = dutyline::results::to_json(&design, &an, "deep.duty", &src, &[]);
    let v: serde_json::Value =
        serde_json::from_str(&json).expect("valid JSON, every number finite");
    assert!(v["cases"][0]["pumps"][0]["wells"][1]["closed"]
        .as_bool()
        .unwrap());
    // serde_json writes a non-finite number as null: the closed well's numbers are finite.
    let wb = &v["cases"][0]["pumps"][0]["wells"][1];
    for key in [
        "flow_m3_s",
        "head_m",
        "npsh_available_m",
        "pumping_level_m",
        "hydraulic_power_W",
    ] {
        assert!(wb[key].as_f64().is_some_and(f64::is_finite), "{key}: {wb}");
    }
}

#[test]
fn a_flow_requirement_at_the_reservoir_reads_the_field_total() {
    let f = well_field("twin_wells");
    let extra = "case design { hours = 100 h }\nrequire { flow at reservoir >= 60 L/s }\n";
    let (_, an) = analysed(&design_of(&f, extra));
    let p = pump(&an, "design");
    let c = p
        .checks
        .iter()
        .find(|c| c.id == CheckId::Requirement)
        .unwrap();
    // The twin field delivers about 40.8 L/s: below the 60 L/s asked.
    assert_eq!(c.status, dutyline::analysis::checks::Status::Fail);
    let q = c.value.unwrap();
    assert!((q - p.duty.as_ref().unwrap().flow).abs() < 1e-9, "{q}");
}

#[test]
fn the_motor_loading_and_the_ranking_basis_follow_the_field_demo() {
    // Review of the Cedar Flats package: the printed loading must be the printed
    // largest shaft power over the rating (it was the field mean's), and a design that
    // prices energy but gives no life is ranked per volume, not on a zero life cost.
    let src = std::fs::read_to_string("examples-demo/cedar-flats-well-field.duty").unwrap();
    let (design, a) = common::analyse_valid(&src, &common::DemoFiles);
    assert_eq!(design.energy.years, 0.0);
    for m in a.motor_sizing.iter().flatten() {
        let ratio = m.max_operating_shaft_power / m.choice.rating_w;
        assert!((m.choice.loading_ratio - ratio).abs() < 1e-12);
    }
    assert_eq!(a.selection.criterion, "energy per volume");
    assert!(a.selection.ranking.iter().all(|r| r.annual_cost.is_some()));
}
