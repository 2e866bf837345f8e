//! Waterworks pressure ratings through the language (issue 14): municipal PVC by AWWA
//! C900-16 with the AWWA M23 recurring-surge fatigue, waterworks steel by AWWA M11, and
//! flanges by ASME B16.5 material group 1.1, B16.1 cast iron and AWWA C207: the weakest
//! component governs. Values recalled are marked "from memory" in the engine's sources.

use std::collections::BTreeMap;

use dutyline::analysis::Analysis;
use dutyline::hydraulics::catalogue::{pipe_size, Material};
use dutyline::hydraulics::ratings::PSI;

fn orchard() -> String {
    std::fs::read_to_string("examples-demo/orchard-lift-rev-a.duty").unwrap()
}

const PVC: &str = "pipe pvc 8 in schedule 40 { length = 2650 ft + riser }";

fn analysed(src: &str) -> Analysis {
    let c = dutyline::check(src, &BTreeMap::<String, String>::new());
    let errors: Vec<_> = c.diagnostics.iter().filter(|d| d.is_error()).collect();
    assert!(errors.is_empty(), "{errors:?}");
    dutyline::analysis::analyse(&c.design.unwrap())
}

/// The governing (working, transient, note, source) of the discharge line's segment 2.
fn segment_2(src: &str) -> (f64, f64, String, String) {
    let a = analysed(src);
    let line = a.safety.cases[0]
        .lines()
        .iter()
        .find(|l| l.name == "discharge")
        .unwrap();
    let r = &line.ratings[1];
    (
        r.working.unwrap() / PSI,
        r.transient.unwrap() / PSI,
        r.note.clone(),
        r.source.clone(),
    )
}

#[test]
fn c900_dimensions_are_cast_iron_od() {
    // AWWA C900-16, 8 in DR 18: CIOD 9.05 in, minimum wall 9.05/18 = 0.503 in
    // (from memory; the C151 ductile-iron OD of 8 in is also 9.05 in).
    let p = pipe_size(Material::Pvc, "8", "DR 18").unwrap();
    assert!((p.outer_diameter_m / 0.0254 - 9.05).abs() < 1e-9);
    assert!((p.wall_m / 0.0254 - 0.503).abs() < 1e-9);
    assert!(p.standard.contains("C900"));
    // The schedule series are unchanged: schedule 40 is still ASTM D1785.
    assert!(pipe_size(Material::Pvc, "8", "40")
        .unwrap()
        .standard
        .contains("D1785"));
    assert!(pipe_size(Material::Pvc, "8", "DR 17").is_err());
}

#[test]
fn c900_class_governs_with_its_occasional_surge_limit() {
    let src = orchard().replacen(PVC, "pipe pvc 8 in DR 18 { length = 2650 ft + riser }", 1);
    let (working, transient, _, source) = segment_2(&src);
    // PC 235 psi (AWWA C900-16 DR 18, from memory); STR = 12 800/(2.5 × 17) = 301.2 psi.
    assert!((working - 235.0).abs() < 1e-9, "{working}");
    assert!((transient - 12_800.0 / 42.5).abs() < 1e-9, "{transient}");
    assert!(source.contains("C900-16") && source.contains("M23"));
}

#[test]
fn class_150_flanges_govern_a_stronger_pipe() {
    // 8 in DR 14 is PC 305 psi; ASME B16.5 class 150 group 1.1 at 64 degF is 285 psig
    // (Table 2-1.1, from memory): the flanges govern, steady and transient.
    let src = orchard().replacen(
        PVC,
        "pipe pvc 8 in DR 14 {\n        length = 2650 ft + riser\n        flanges = asme_150\n    }",
        1,
    );
    let (working, transient, note, source) = segment_2(&src);
    assert!((working - 285.0).abs() < 1e-9, "{working}");
    assert!((transient - 285.0).abs() < 1e-9, "{transient}");
    assert!(note.contains("class 150"), "{note}");
    assert!(source.contains("B16.5"), "{source}");
    // Class 300 flanges (740 psig) are stronger than the pipe: the pipe governs.
    let (working, _, _, source) = segment_2(&src.replace("asme_150", "asme_300"));
    assert!((working - 305.0).abs() < 1e-9 && source.contains("B16.5"));
    // AWWA C207 class B ring flanges, 86 psi (from memory).
    let (working, ..) = segment_2(&src.replace("asme_150", "awwa_b"));
    assert!((working - 86.0).abs() < 1e-9);
    // B16.1 class 125 cast iron, 200 psig to NPS 12 (from memory).
    let (working, ..) = segment_2(&src.replace("asme_150", "iron_125"));
    assert!((working - 200.0).abs() < 1e-9);
}

#[test]
fn waterworks_steel_by_m11() {
    // 8 in schedule 40 steel: OD 8.625 in, wall 0.322 in (ASME B36.10M). AWWA M11 at
    // 35 ksi yield: P = 2 × 0.322 × 17 500/8.625 = 1 306.7 psi, surge to 1.5× = 1 960.0.
    let src = orchard().replacen(
        PVC,
        "pipe steel 8 in schedule 40 {\n        length = 2650 ft + riser\n        rating_basis = awwa_m11\n    }",
        1,
    );
    let (working, transient, _, source) = segment_2(&src);
    let want = 2.0 * 0.322 * 17_500.0 / 8.625;
    assert!((working - want).abs() < 1e-6, "{working} {want}");
    assert!((transient - 1.5 * want).abs() < 1e-6);
    assert!(source.contains("M11"));
    // A stated yield of 42 ksi scales it: 2 × 0.322 × 21 000/8.625.
    let (working, ..) = segment_2(&src.replace(
        "rating_basis = awwa_m11",
        "rating_basis = awwa_m11\n        yield_strength = 42000 psi",
    ));
    assert!((working - 2.0 * 0.322 * 21_000.0 / 8.625).abs() < 1e-6);
}

#[test]
fn bad_rating_words_are_refused() {
    for (field, code) in [
        ("flanges = asme_600", "expected-word"),
        ("rating_basis = din", "expected-word"),
        ("yield_strength = 5000 psi", "out-of-range"),
    ] {
        let src = orchard().replacen(
            PVC,
            &format!("pipe pvc 8 in schedule 40 {{\n        length = 2650 ft + riser\n        {field}\n    }}"),
            1,
        );
        let c = dutyline::check(&src, &BTreeMap::<String, String>::new());
        let e = c.diagnostics.iter().find(|d| d.is_error()).unwrap();
        assert_eq!(e.code.as_str(), code, "{field}: {}", e.message);
        assert!(e.span.is_some());
    }
}
