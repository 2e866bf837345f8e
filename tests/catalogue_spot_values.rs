//! Catalogue values checked against numbers printed in the standards (or their
//! published transcriptions), and the behaviour of catalogue errors.

use dutyline::hydraulics::catalogue::{pipe_size, sizes, Material, PipeSize};

const INCH: f64 = 0.0254;

fn get(material: Material, nominal: &str, schedule: &str) -> PipeSize {
    pipe_size(material, nominal, schedule)
        .unwrap_or_else(|e| panic!("{material:?} {nominal} {schedule}: {e}"))
}

fn assert_inches(actual_m: f64, expected_in: f64, what: &str) {
    let actual_in = actual_m / INCH;
    assert!(
        (actual_in - expected_in).abs() < 0.0005 + 1e-12,
        "{what}: {actual_in:.4} in, expected {expected_in} in"
    );
}

#[test]
fn steel_inner_diameters_from_b36_10m() {
    let id = |n: &str, s: &str| get(Material::Steel, n, s).inner_diameter_m;
    assert_inches(id("4", "40"), 4.026, "4 in sch 40"); // ASME B36.10M: 4.500 - 2 x 0.237
    assert_inches(id("6", "40"), 6.065, "6 in sch 40"); // ASME B36.10M
    assert_inches(id("8", "40"), 7.981, "8 in sch 40"); // ASME B36.10M
    assert_inches(id("12", "40"), 11.938, "12 in sch 40"); // ASME B36.10M
    assert_inches(id("12", "STD"), 12.000, "12 in STD"); // ASME B36.10M (0.375 in wall)
    assert_inches(id("2", "80"), 1.939, "2 in sch 80"); // ASME B36.10M
    assert_inches(id("1/2", "XXS"), 0.252, "1/2 in XXS"); // ASME B36.10M (0.294 in wall)
    assert_inches(id("24", "XS"), 23.000, "24 in XS"); // ASME B36.10M (0.500 in wall)
    assert_inches(
        get(Material::Steel, "DN100", "sch 40").inner_diameter_m,
        4.026,
        "DN100",
    ); // DN 100 = NPS 4
}

#[test]
fn stainless_s_schedules_differ_from_steel_where_b36_19m_says() {
    let wall = |m: Material, n: &str, s: &str| get(m, n, s).wall_m;
    // ASME B36.19M vs B36.10M: 40S = 40 up to NPS 10, but 0.375 in (= STD) at NPS 12.
    assert_inches(wall(Material::Stainless, "10", "40S"), 0.365, "10 in 40S");
    assert_inches(wall(Material::Stainless, "12", "40S"), 0.375, "12 in 40S");
    assert_inches(wall(Material::Steel, "12", "40"), 0.406, "12 in sch 40");
    // 80S = 80 up to NPS 8, 0.500 in (= XS) at NPS 10 and 12.
    assert_inches(wall(Material::Stainless, "8", "80S"), 0.500, "8 in 80S");
    assert_inches(wall(Material::Stainless, "10", "80S"), 0.500, "10 in 80S");
    assert_inches(wall(Material::Steel, "10", "80"), 0.594, "10 in sch 80");
    assert_inches(wall(Material::Stainless, "12", "80S"), 0.500, "12 in 80S");
    assert_inches(wall(Material::Steel, "12", "80"), 0.688, "12 in sch 80");
    assert_inches(wall(Material::Stainless, "2", "10S"), 0.109, "2 in 10S"); // ASME B36.19M
    assert_inches(wall(Material::Stainless, "24", "5S"), 0.218, "24 in 5S"); // ASME B36.19M
}

#[test]
fn copper_tube_from_b88() {
    let id = |n: &str, t: &str| get(Material::Copper, n, t).inner_diameter_m;
    assert_inches(id("2", "L"), 1.985, "2 in type L"); // ASTM B88: 2.125 - 2 x 0.070
    assert_inches(id("1", "K"), 0.995, "1 in type K"); // ASTM B88: 1.125 - 2 x 0.065
    assert_inches(id("3/4", "M"), 0.811, "3/4 in type M"); // ASTM B88: 0.875 - 2 x 0.032
    assert_inches(id("4", "type L"), 3.905, "4 in type L"); // Copper Tube Handbook (from memory)
    assert_inches(
        get(Material::Copper, "1/2", "K").outer_diameter_m,
        0.625,
        "1/2 in OD",
    ); // B88: nominal + 1/8
}

#[test]
fn pvc_mean_inner_diameter_matches_published_average_id() {
    // "Avg ID" column of a published schedule 40 PVC table (ix23.com, Schedule 40 PVC
    // Pipe Dimensions), minimum walls from ASTM D1785.
    let id = |n: &str| get(Material::Pvc, n, "40").inner_diameter_m;
    assert_inches(id("1/4"), 0.344, "1/4 in");
    assert_inches(id("1/2"), 0.602, "1/2 in");
    assert_inches(id("1"), 1.029, "1 in");
    assert_inches(id("1-1/2"), 1.590, "1-1/2 in");
    assert_inches(id("2"), 2.047, "2 in");
    assert_inches(id("2-1/2"), 2.445, "2-1/2 in");
    assert_inches(id("3"), 3.042, "3 in");
    assert_inches(id("4"), 3.998, "4 in");
    assert_inches(get(Material::Pvc, "2", "40").wall_m, 0.154, "2 in min wall");
    // ASTM D1785
}

#[test]
fn ductile_iron_from_c151_and_c104() {
    // ANSI/AWWA C151 pressure class table as reproduced by a manufacturer.
    let p = get(Material::DuctileIron, "8", "class 350");
    assert_inches(p.outer_diameter_m, 9.05, "8 in OD");
    assert_inches(p.wall_m, 0.25, "8 in class 350 wall");
    assert_inches(p.inner_diameter_m, 8.55, "8 in bare ID");
    assert_inches(
        get(Material::DuctileIron, "12", "350").inner_diameter_m,
        12.64,
        "12 in bare ID",
    );
    assert_inches(
        get(Material::DuctileIron, "16", "250").wall_m,
        0.30,
        "16 in class 250",
    );
    assert_inches(
        get(Material::DuctileIron, "24", "pressure class 200").wall_m,
        0.33,
        "24 in class 200",
    );
    // With the AWWA C104 standard lining, 1/16 in to 12 in, 3/32 in for 14-24 in (from memory).
    let lined = |n: &str, c: &str| get(Material::CementLinedDuctileIron, n, c).inner_diameter_m;
    assert_inches(lined("8", "350"), 8.425, "8 in lined");
    assert_inches(lined("16", "250"), 16.6125, "16 in lined");
    assert!(pipe_size(Material::DuctileIron, "8", "250").is_err()); // C151 lists only class 350 below 14 in
}

#[test]
fn hdpe_dr_walls_and_ppi_mean_id() {
    let p = get(Material::Hdpe, "4", "DR11");
    assert_inches(p.wall_m, 0.409, "4 in DR11 min wall"); // ASTM F714 / F2619: 4.500 / 11
    assert_inches(p.inner_diameter_m, 3.633, "4 in DR11 mean ID"); // PPI: 4.500 - 2.12 x 0.409
    let q = get(Material::Hdpe, "6", "17");
    assert_inches(q.wall_m, 0.390, "6 in DR17 min wall"); // 6.625 / 17 = 0.3897
    assert_inches(q.inner_diameter_m, 5.798, "6 in DR17 mean ID"); // 6.625 - 2.12 x 0.390
    assert_inches(
        get(Material::Hdpe, "DN150", "SDR 17").inner_diameter_m,
        5.798,
        "DN150",
    );
}

#[test]
fn every_listed_size_has_sane_dimensions() {
    for material in Material::all() {
        let list = sizes(*material);
        assert_eq!(list.is_empty(), !material.has_catalogue(), "{material:?}");
        for (nominal, schedule) in list {
            let p = get(*material, &nominal, &schedule);
            assert!(
                p.wall_m > 0.0 && p.inner_diameter_m > 0.0,
                "{material:?} {nominal} {schedule}"
            );
            assert!(p.inner_diameter_m < p.outer_diameter_m - 1.9 * p.wall_m);
            assert!(!p.standard.is_empty());
        }
    }
}

#[test]
fn missing_combination_lists_same_size_and_same_schedule_neighbours() {
    let err = pipe_size(Material::Steel, "22", "40").expect_err("B36.10M has no NPS 22 sch 40");
    for want in [
        "22 in schedule 30",
        "22 in schedule STD",
        "20 in schedule 40",
        "24 in schedule 40",
    ] {
        assert!(
            err.nearest.iter().any(|n| n == want),
            "{want} not in {:?}",
            err.nearest
        );
    }
    assert!(err.message.contains("22 in schedule 40"), "{}", err.message);

    let err = pipe_size(Material::Steel, "4-1/2", "40").expect_err("no NPS 4-1/2");
    assert!(
        err.nearest.iter().any(|n| n == "4 in schedule 40"),
        "{:?}",
        err.nearest
    );
    assert!(
        err.nearest.iter().any(|n| n == "5 in schedule 40"),
        "{:?}",
        err.nearest
    );
}

#[test]
fn unknown_schedule_lists_the_schedules_of_that_size() {
    let err = pipe_size(Material::Steel, "4", "45").expect_err("no schedule 45");
    assert!(
        err.nearest.contains(&"4 in schedule 40".to_string()),
        "{:?}",
        err.nearest
    );
    assert!(
        err.nearest.contains(&"4 in schedule 80".to_string()),
        "{:?}",
        err.nearest
    );

    let err = pipe_size(Material::Stainless, "4", "40").expect_err("stainless needs 40S");
    assert!(err.message.contains("40S"), "{}", err.message);
    assert!(
        err.nearest.contains(&"4 in schedule 40S".to_string()),
        "{:?}",
        err.nearest
    );

    let err = pipe_size(Material::Copper, "2", "X").expect_err("no type X");
    assert!(
        err.nearest.contains(&"2 in type L".to_string()),
        "{:?}",
        err.nearest
    );
}

#[test]
fn unreadable_inputs_are_errors_not_panics() {
    let err = pipe_size(Material::Copper, "DN50", "L").expect_err("DN not for copper");
    assert!(err.message.contains("DN"), "{}", err.message);
    let err = pipe_size(Material::CastIron, "4", "40").expect_err("no cast iron catalogue");
    assert!(err.message.contains("inner diameter"), "{}", err.message);
    for bad in [
        "",
        "four",
        "1/0",
        "-2",
        "NaN",
        "inf",
        "1e300",
        "9999999999999999999999",
    ] {
        assert!(pipe_size(Material::Steel, bad, "40").is_err(), "{bad}");
    }
    assert!(pipe_size(Material::Hdpe, "4", "").is_err());
    let long = "x".repeat(100_000);
    assert!(pipe_size(Material::Pvc, &long, &long).is_err());
}
