//! A load profile imported from a CSV of hourly flows (issue 13): 8 760 rows (8 784 in a
//! leap year) summarised into equal-width bins. The Kestrel demo's profile written out
//! hour by hour must give the same load points and the same yearly energy as the table
//! it came from (the bins then hold one flow each, so the binned profile is the table
//! itself: a check by construction that the import, the binning and the hours agree);
//! bad files get located diagnostics.

use std::collections::BTreeMap;

/// The Kestrel profile (examples-demo/kestrel-booster.duty): % of 560 m³/h and hours.
const TABLE: [(f64, usize); 6] = [
    (30.0, 400),
    (45.0, 1100),
    (60.0, 2300),
    (75.0, 2200),
    (90.0, 1200),
    (100.0, 500),
];

/// The same year hour by hour: the table's hours in order, then zero flow to 8 760 h
/// (or `hours` rows), in m³/h.
fn hourly_csv(hours: usize) -> String {
    let mut s = String::from("# invented hourly demand for a test\nflow m^3/h\n");
    let mut n = 0;
    for (pct, h) in TABLE {
        for _ in 0..h {
            s.push_str(&format!("{}\n", pct / 100.0 * 560.0));
            n += 1;
        }
    }
    for _ in n..hours {
        s.push_str("0\n");
    }
    s
}

fn files(csv: String) -> BTreeMap<String, String> {
    let mut f = BTreeMap::new();
    f.insert(
        "kestrel-kr1-430.csv".to_string(),
        std::fs::read_to_string("examples-demo/kestrel-kr1-430.csv").unwrap(),
    );
    f.insert("hourly.csv".to_string(), csv);
    f
}

fn kestrel() -> String {
    std::fs::read_to_string("examples-demo/kestrel-booster.duty").unwrap()
}

/// The demo with its profile table replaced by `curve hourly from "hourly.csv"`.
fn hourly_design(extra: &str) -> String {
    let src = kestrel();
    let start = src.find("    curve {\n        flow %   hours h").unwrap();
    let end = start + src[start..].find("    }\n").unwrap() + 6;
    format!(
        "{}    bins = 10\n{extra}    curve hourly from \"hourly.csv\"\n{}",
        &src[..start],
        &src[end..]
    )
}

fn errors(src: &str, csv: String) -> Vec<dutyline::diagnostics::Diagnostic> {
    let c = dutyline::check(src, &files(csv));
    c.diagnostics.into_iter().filter(|d| d.is_error()).collect()
}

#[test]
fn an_hourly_year_bins_to_the_table_it_came_from() {
    let f = files(hourly_csv(8760));
    let table = dutyline::check(&kestrel(), &f).design.unwrap();
    let c = dutyline::check(&hourly_design("").replace("bins = 10", "bins = 20"), &f);
    let hourly = c.design.unwrap_or_else(|| panic!("{:?}", c.diagnostics));
    let p = &hourly.operation.profiles[0];
    let b = p.binning.as_ref().unwrap();
    // 20 bins of 28 m³/h from 0 to the largest hourly flow, 560 m³/h.
    assert_eq!(b.rows, 8760);
    assert_eq!(b.edges.len(), 21);
    assert!((b.edges[20] - 560.0 / 3600.0).abs() < 1e-12);
    // 8 760 − (400 + 1100 + 2300 + 2200 + 1200 + 500) = 8 760 − 7 700 = 1 060 zero hours.
    assert_eq!(b.zero_hours, 1060.0);
    // Each table row is one bin: 252 m³/h (45 %) in bin 10 [252, 280), 560 m³/h in bin
    // 20 (the last includes its upper edge); 168 m³/h sits on the edge of bins 6 and 7.
    assert_eq!(b.hours[9], 1100.0);
    assert_eq!(b.hours[19], 500.0);
    assert_eq!(b.hours.iter().sum::<f64>(), 7700.0);
    let want = &table.operation.profiles[0].points;
    assert_eq!(p.points.len(), want.len());
    for (a, w) in p.points.iter().zip(want) {
        assert!(
            (a.flow - w.flow).abs() < 1e-12 && a.hours == w.hours,
            "{a:?} {w:?}"
        );
    }
    let ea = dutyline::analysis::analyse(&table);
    let eb = dutyline::analysis::analyse(&hourly);
    for (x, y) in ea.operation.iter().zip(&eb.operation) {
        let (ex, ey) = (x.yearly.energy_j, y.yearly.energy_j);
        assert!(ex > 0.0 && ((ex - ey) / ex).abs() < 1e-9, "{ex} {ey}");
    }
}

#[test]
fn coarse_bins_keep_hours_and_volume() {
    // 3 bins of 560/3 = 186.67 m³/h: 30 % (168) alone in bin 1, 400 h at 168 m³/h;
    // 45 % and 60 % (252, 336) in bin 2 [186.7, 373.3): 1100 + 2300 = 3 400 h at
    // (1100·252 + 2300·336)/3400 = (277 200 + 772 800)/3 400 = 308.82 m³/h; 75 %, 90 %,
    // 100 % (420, 504, 560) in bin 3: 3 900 h at (2200·420 + 1200·504 + 500·560)/3900
    // = (924 000 + 604 800 + 280 000)/3 900 = 463.79 m³/h.
    let src = hourly_design("").replace("bins = 10", "bins = 3");
    let c = dutyline::check(&src, &files(hourly_csv(8784)));
    let d = c.design.unwrap_or_else(|| panic!("{:?}", c.diagnostics));
    let b = d.operation.profiles[0].binning.as_ref().unwrap();
    assert_eq!(b.rows, 8784);
    assert_eq!(b.hours, vec![400.0, 3400.0, 3900.0]);
    assert!((b.mean_flow[0] * 3600.0 - 168.0).abs() < 1e-9);
    assert!((b.mean_flow[1] * 3600.0 - 1_050_000.0 / 3400.0).abs() < 1e-9);
    assert!((b.mean_flow[2] * 3600.0 - 1_808_800.0 / 3900.0).abs() < 1e-9);
    assert_eq!(b.zero_hours, 8784.0 - 7700.0);
    assert_eq!(d.operation.profiles[0].points.len(), 3);
}

/// The results JSON carries the binning (`load_profiles[].hourly`), so a reviewer can
/// rebuild the load points from the file: the same 3 bins as above.
#[test]
fn the_results_json_states_the_binning() {
    let src = hourly_design("").replace("bins = 10", "bins = 3");
    let c = dutyline::check(&src, &files(hourly_csv(8784)));
    let d = c.design.unwrap_or_else(|| panic!("{:?}", c.diagnostics));
    let a = dutyline::analysis::analyse(&d);
    let json = dutyline::results::to_json(&d, &a, "x.duty", &src, &[]);
    let v: serde_json::Value = serde_json::from_str(&json).unwrap();
    let profile = &v["load_profiles"][0];
    assert_eq!(profile["case"], "average");
    let h = &profile["hourly"];
    assert_eq!(h["source"], "hourly.csv");
    assert_eq!(h["rows"], 8784);
    assert_eq!(h["hours"], serde_json::json!([400.0, 3400.0, 3900.0]));
    assert_eq!(h["zero_flow_hours"], 8784.0 - 7700.0);
    let edges = h["bin_edges_m3_s"].as_array().unwrap();
    assert_eq!(edges.len(), 4);
    assert!((edges[3].as_f64().unwrap() * 3600.0 - 560.0).abs() < 1e-9);
    let points = profile["points"].as_array().unwrap();
    assert_eq!(points.len(), 3);
    assert_eq!(points[1]["hours"], 3400.0);
    // A design that gives the table itself has no binning.
    let table = dutyline::check(&kestrel(), &files(hourly_csv(8760)))
        .design
        .unwrap();
    let at = dutyline::analysis::analyse(&table);
    let json = dutyline::results::to_json(&table, &at, "x.duty", &kestrel(), &[]);
    let v: serde_json::Value = serde_json::from_str(&json).unwrap();
    assert!(v["load_profiles"][0]["hourly"].is_null());
}

#[test]
fn bad_hourly_files_get_located_diagnostics() {
    let src = hourly_design("");
    // A row too many: not a year of hours.
    let e = errors(&src, hourly_csv(8761));
    assert_eq!(e[0].code.as_str(), "bad-csv");
    assert!(e[0].message.contains("8761"), "{}", e[0].message);
    assert!(e[0].span.is_some());
    // A negative flow on file line 5 (the comment and header are lines 1 and 2, so the
    // third hour).
    let csv = hourly_csv(8760).replacen("168\n168\n168\n", "168\n168\n-3\n", 1);
    let e = errors(&src, csv);
    assert_eq!(e.len(), 1, "{e:?}");
    assert!(e[0].message.contains("line 5 (hour 3)"), "{}", e[0].message);
    // Many bad rows: ten located, the rest counted, never one diagnostic per row.
    let csv = hourly_csv(8760).replace("\n0\n", "\n-\n");
    let e = errors(&src, csv);
    assert_eq!(e.len(), 11);
    assert!(e[10].message.contains("more bad rows"), "{}", e[10].message);
    // Two columns, a wrong unit, a missing file, a bin count out of range.
    let e = errors(
        &src,
        hourly_csv(8760).replace("flow m^3/h", "flow m^3/h, head m"),
    );
    assert_eq!(e[0].code.as_str(), "bad-csv");
    let e = errors(&src, hourly_csv(8760).replace("flow m^3/h", "flow m"));
    assert_eq!(e[0].code.as_str(), "bad-csv");
    let e = errors(&src.replace("hourly.csv", "gone.csv"), hourly_csv(8760));
    assert!(!e.is_empty() && e[0].span.is_some());
    let e = errors(&src.replace("bins = 10", "bins = 0"), hourly_csv(8760));
    assert_eq!(e[0].code.as_str(), "out-of-range");
    let e = errors(
        &src.replace("curve hourly from", "curve daily from"),
        hourly_csv(8760),
    );
    assert_eq!(e[0].code.as_str(), "unexpected-statement");
}
