//! What a user sees: failure modes of the duty solve, fit fallbacks and errors, curve
//! families and arrangements. Values here are invented test data (no outside source);
//! expected numbers follow from the stated curves by hand algebra.

use dutyline::pumps::{
    best_efficiency_point, combined_head, family, fit, fit_table, solve_duty, speed_for_duty,
    trim_for_duty, ArrangedPump, Arrangement, CurveTable, DutyOutcome, FitMethod, PumpCurves,
};

fn table(head: &[f64], efficiency: Option<&[f64]>) -> CurveTable {
    let flow: Vec<f64> = (0..head.len()).map(|i| 0.005 * i as f64).collect();
    let n = flow.len();
    CurveTable {
        speed_rpm: 2900.0,
        impeller_diameter_m: Some(0.2),
        flow,
        head: head.to_vec(),
        efficiency: efficiency.map_or(vec![None; n], |e| e.iter().map(|&v| Some(v)).collect()),
        npshr: vec![None; n],
        shaft_power: vec![None; n],
    }
}

const HEAD: [f64; 7] = [52.0, 51.2, 49.3, 46.0, 41.4, 35.3, 27.8];
const EFF: [f64; 7] = [0.0, 0.42, 0.62, 0.72, 0.76, 0.74, 0.66];

#[test]
fn shutoff_below_static_reports_both_heads() {
    let c = fit_table(&table(&HEAD, Some(&EFF))).expect("valid table");
    let pump = |q: f64| c.head.eval(q);
    let out = solve_duty(&pump, &|q| 60.0 + 1.0e4 * q * q, 0.03);
    match out {
        DutyOutcome::ShutoffBelowStatic {
            shutoff_head,
            static_head,
        } => {
            assert!((shutoff_head - c.head.eval(0.0)).abs() < 1e-12);
            assert!((shutoff_head - 52.0).abs() < 0.2); // the fit passes near the 52 m point
            assert_eq!(static_head, 60.0);
        }
        other => panic!("expected ShutoffBelowStatic, got {other:?}"),
    }
}

#[test]
fn curve_ending_above_the_system_reports_the_end_numbers() {
    let c = fit_table(&table(&HEAD, None)).expect("valid table");
    let pump = |q: f64| c.head.eval(q);
    let out = solve_duty(&pump, &|q| 5.0 + 1.0e4 * q * q, 0.03);
    match out {
        DutyOutcome::CurveEndsBeforeSystem {
            end_flow,
            pump_head,
            system_head,
        } => {
            assert_eq!(end_flow, 0.03);
            assert!((pump_head - c.head.eval(0.03)).abs() < 1e-12);
            assert!((system_head - 14.0).abs() < 1e-12); // 5 + 1e4 × 0.03²
        }
        other => panic!("expected CurveEndsBeforeSystem, got {other:?}"),
    }
    // Allowing 10 % extrapolation does not help this system either; 50 % does.
    assert!(matches!(
        solve_duty(&pump, &|q| 5.0 + 1.0e4 * q * q, 0.033),
        DutyOutcome::CurveEndsBeforeSystem { .. }
    ));
    assert!(solve_duty(&pump, &|q| 5.0 + 1.0e4 * q * q, 0.045)
        .point()
        .is_some());
}

#[test]
fn drooping_curve_gives_two_crossings_and_takes_the_larger_flow() {
    // H = 40 + 600 q − 50 000 q²: peak 41.8 m at q = 0.006; system flat at 41 m.
    let pump = |q: f64| 40.0 + 600.0 * q - 50_000.0 * q * q;
    let out = solve_duty(&pump, &|_| 41.0, 0.03);
    match out {
        DutyOutcome::Point {
            flow,
            head,
            crossings,
            all_flows,
            warnings,
        } => {
            // roots of 50 000 q² − 600 q + 1 = 0: q = (600 ± √160 000)/100 000
            let (lo, hi) = (0.002, 0.010);
            assert_eq!(crossings, 2);
            assert!((all_flows[0] - lo).abs() < 1e-12 && (all_flows[1] - hi).abs() < 1e-12);
            assert!((flow - hi).abs() < 1e-12 && (head - 41.0).abs() < 1e-9);
            assert!(warnings.iter().any(|w| w.contains("2 times")));
            assert!(warnings.iter().any(|w| w.contains("shut-off head")));
        }
        other => panic!("expected a point, got {other:?}"),
    }
}

#[test]
fn no_efficiency_data_means_no_bep() {
    let c = fit_table(&table(&HEAD, None)).expect("valid table");
    assert!(c.efficiency.is_none());
    assert!(best_efficiency_point(&c).is_none());
    let with = fit_table(&table(&HEAD, Some(&EFF))).expect("valid table");
    let bep = best_efficiency_point(&with).expect("efficiency given");
    assert!(bep.flow > 0.015 && bep.flow < 0.025 && bep.efficiency > 0.75);
}

#[test]
fn monotone_spline_fallback_when_polynomials_turn_upward() {
    // Falling but convex data: quadratic and cubic least squares both rise inside the domain.
    let c = fit_table(&table(&[50.0, 40.0, 34.0, 31.0, 30.0, 29.9], None)).expect("valid");
    assert_eq!(c.head.fit_method(), FitMethod::MonotoneSpline);
    assert!(c
        .warnings
        .iter()
        .any(|w| w.contains("not monotone") && w.contains("spline")));
    let (_, dmax) = c.head.derivative_range_on_domain();
    assert!(dmax <= 1e-9);
    assert!(c.head.residuals().max_abs < 1e-12); // an interpolant
                                                 // Plain data keep the least-squares quadratic and report its residuals.
    let c = fit_table(&table(&[40.0, 39.5, 38.0, 35.5, 32.0], None)).expect("valid");
    assert_eq!(c.head.fit_method(), FitMethod::Polynomial { degree: 2 });
    assert!(c.warnings.is_empty());
    let r = c.head.residuals();
    assert!(r.max_abs < 1e-9 && r.rms <= r.max_abs && r.max_relative < 1e-9); // exact quadratic
}

#[test]
fn residuals_of_an_inexact_fit() {
    // A line through (0,0), (1,1), (2,0)… least squares: y = 1/3, deviations 1/3, 2/3, 1/3.
    let f = fit(
        &[0.0, 1.0, 2.0],
        &[0.0, 1.0, 0.0],
        FitMethod::Polynomial { degree: 1 },
    )
    .expect("fit");
    let r = f.residuals();
    assert!((r.max_abs - 2.0 / 3.0).abs() < 1e-12);
    assert!((r.rms - (6.0_f64 / 27.0).sqrt()).abs() < 1e-12);
    assert!((r.max_relative - 2.0 / 3.0).abs() < 1e-12);
}

#[test]
fn extrapolation_is_flagged() {
    let c = fit_table(&table(&HEAD, None)).expect("valid");
    assert_eq!(c.head.domain(), (0.0, 0.03));
    assert!(!c.head.is_extrapolating(0.0) && !c.head.is_extrapolating(0.03));
    assert!(c.head.is_extrapolating(0.0305) && c.head.is_extrapolating(-1e-6));
    let spline = fit(
        &[0.0, 1.0, 2.0],
        &[3.0, 2.0, 0.0],
        FitMethod::MonotoneSpline,
    )
    .expect("fit");
    assert!(spline.is_extrapolating(2.1));
    assert!(spline.eval(2.1).is_finite());
}

#[test]
fn fit_errors_name_the_problem() {
    let e = |r: Result<_, dutyline::pumps::PumpError>| {
        r.map(|_: dutyline::pumps::FittedCurve| ())
            .expect_err("must fail")
            .message
    };
    let cubic = FitMethod::Polynomial { degree: 3 };
    assert!(e(fit(&[0.0, 1.0, 2.0], &[3.0, 2.0, 1.0], cubic)).contains("at least 4"));
    assert!(
        e(fit(&[0.0, 2.0, 1.0, 3.0], &[3.0, 2.0, 1.0, 0.5], cubic)).contains("strictly increasing")
    );
    assert!(e(fit(&[0.0, 1.0, 2.0, 3.0], &[3.0, -2.0, 1.0, 0.5], cubic)).contains("negative"));
    assert!(e(fit(
        &[0.0, 1.0, f64::NAN, 3.0],
        &[3.0, 2.0, 1.0, 0.5],
        cubic
    ))
    .contains("not a finite"));
    assert!(e(fit(
        &[0.0, 1.0],
        &[3.0, f64::INFINITY],
        FitMethod::MonotoneSpline
    ))
    .contains("not a finite"));
    assert!(e(fit(
        &[0.0, 1.0],
        &[3.0, 2.0],
        FitMethod::Polynomial { degree: 0 }
    ))
    .contains("degree"));
    let mut t = table(&HEAD, Some(&EFF));
    t.efficiency[3] = Some(72.0);
    assert!(fit_table(&t)
        .expect_err("percent")
        .message
        .contains("fraction"));
    let mut t = table(&HEAD, None);
    t.npshr.pop();
    assert!(fit_table(&t).is_err());
    let t = table(&[10.0, 9.0], None);
    assert!(fit_table(&t)
        .expect_err("short")
        .message
        .contains("head curve"));
}

#[test]
fn sparse_optional_columns_use_only_the_points_given() {
    let mut t = table(&HEAD, None);
    t.npshr = vec![
        None,
        Some(1.3),
        Some(1.6),
        Some(2.0),
        Some(2.6),
        Some(3.4),
        Some(4.5),
    ];
    let c = fit_table(&t).expect("valid");
    let n = c.npshr.expect("npshr fitted");
    assert_eq!(n.domain(), (0.005, 0.03));
    assert!(n.is_extrapolating(0.0));
}

fn trimmed_copy(base: &CurveTable, ratio: f64) -> CurveTable {
    // Constant-width trim law: Q ∝ D, H ∝ D².
    let mut t = base.clone();
    t.impeller_diameter_m = base.impeller_diameter_m.map(|d| d * ratio);
    t.flow = base.flow.iter().map(|q| q * ratio).collect();
    t.head = base.head.iter().map(|h| h * ratio * ratio).collect();
    t
}

#[test]
fn family_interpolates_between_diameters_and_warns_outside() {
    let big = table(&HEAD, Some(&EFF));
    let small = trimmed_copy(&big, 0.9);
    let fam = family(vec![
        fit_table(&big).expect("big"),
        fit_table(&small).expect("small"),
    ])
    .expect("a diameter family");
    let (lo, hi) = fam.range();
    assert!((lo - 0.18).abs() < 1e-15 && (hi - 0.2).abs() < 1e-15);
    // The small curve is the exact trim-law image of the big one, so the blend at any
    // diameter between them equals the trim law from either.
    let big_curves = &fam.members()[1];
    let p = fam.at(0.19).expect("inside");
    assert!(p.warnings().iter().any(|w| w.contains("interpolated")));
    for i in 0..=10 {
        let q = 0.0025 * i as f64;
        let r = 0.19 / 0.2;
        let expected = r * r * big_curves.head.eval(q / r);
        assert!((p.eval_head(q) - expected).abs() < 1e-9, "q {q}");
    }
    // At a published diameter the published curve comes back unchanged.
    let p = fam.at(0.18).expect("member");
    assert!((p.eval_head(0.01) - fam.members()[0].head.eval(0.01)).abs() < 1e-12);
    assert!(p.warnings().is_empty());
    // Outside: trim law from the nearest member, with a warning.
    let p = fam.at(0.14).expect("outside");
    assert!(p
        .warnings()
        .iter()
        .any(|w| w.contains("outside the published range")));
    assert!(p.warnings().iter().any(|w| w.contains("below about 80 %")));
    // A family must vary one thing.
    assert!(family(vec![
        fit_table(&big).expect("b"),
        fit_table(&big).expect("b")
    ])
    .is_err());
    assert!(family(vec![fit_table(&big).expect("b")]).is_err());
}

#[test]
fn speed_family_blends_affinity_predictions() {
    let base = table(&HEAD, Some(&EFF));
    let mut slow = base.clone();
    slow.speed_rpm = 1450.0;
    slow.flow = base.flow.iter().map(|q| q * 0.5).collect();
    slow.head = base.head.iter().map(|h| h * 0.25).collect();
    let fam = family(vec![
        fit_table(&base).expect("a"),
        fit_table(&slow).expect("b"),
    ])
    .expect("speed family");
    let p = fam.at(2175.0).expect("inside");
    let r: f64 = 0.75;
    let b = &fam.members()[1];
    assert!((p.eval_head(0.01) - r * r * b.head.eval(0.01 / r)).abs() < 1e-9);
    assert!((p.speed_rpm() - 2175.0).abs() < 1e-9);
}

#[test]
fn parallel_and_series_heads() {
    let h = |q: f64| 50.0 - 20_000.0 * q * q;
    assert_eq!(
        combined_head(&h, Arrangement::Parallel(2), 0.02).expect("ok"),
        h(0.01)
    );
    assert_eq!(
        combined_head(&h, Arrangement::Series(3), 0.02).expect("ok"),
        3.0 * h(0.02)
    );
    assert_eq!(
        combined_head(
            &h,
            Arrangement::DutyStandby {
                duty: 2,
                standby: 1
            },
            0.02
        )
        .expect("ok"),
        h(0.01)
    );
    assert!(combined_head(&h, Arrangement::Parallel(0), 0.02).is_err());
    // Two in parallel against H = 10 + 20 000 Q²: 50 − 5000 Q² = 10 + 20 000 Q² → Q = 0.04.
    let set = ArrangedPump::new(Arrangement::Parallel(2)).expect("valid");
    let out = solve_duty(&|q| set.head(&h, q), &|q| 10.0 + 20_000.0 * q * q, 0.08);
    let (q, head) = out.point().expect("duty");
    assert!((q - 0.04).abs() < 1e-12 && (head - 42.0).abs() < 1e-9);
    assert!((set.per_pump_flow(q) - 0.02).abs() < 1e-12);
    assert!((set.shaft_power(&|q| 1000.0 + 1e5 * q, q) - 2.0 * 3000.0).abs() < 1e-9);
}

fn quadratic_pump() -> PumpCurves {
    let flow = [0.0, 0.01, 0.02, 0.03];
    let head: Vec<f64> = flow.iter().map(|q| 50.0 - 20_000.0 * q * q).collect();
    PumpCurves {
        head: fit(&flow, &head, FitMethod::Polynomial { degree: 2 }).expect("fit"),
        efficiency: None,
        npshr: None,
        shaft_power: None,
        speed_rpm: 1800.0,
        impeller_diameter_m: None,
        warnings: Vec::new(),
    }
}

#[test]
fn speed_for_duty_by_hand() {
    // r²·50 − 20 000 q² = h  →  with q = 0.02, h = 24: r² = (24 + 8)/50 = 0.64, r = 0.8.
    let p = quadratic_pump();
    let s = speed_for_duty(&p, 0.02, 24.0, 0.5, 1.1).expect("reachable");
    assert!((s.speed_ratio - 0.8).abs() < 1e-12 && (s.speed_rpm - 1440.0).abs() < 1e-9);
    assert!(s.warnings.is_empty());
    let too_high = speed_for_duty(&p, 0.02, 80.0, 0.5, 1.1).expect_err("out of reach");
    assert!(too_high.message.contains("below the 80.000 m required"));
    assert!(speed_for_duty(&p, 0.02, 3.0, 0.5, 1.1).is_err()); // 0.5² · 50 − 8 = 4.5 m > 3 m
    let fast = speed_for_duty(&p, 0.02, 50.0, 0.5, 1.1).expect("reachable above rated");
    assert!(fast.speed_ratio > 1.0 && !fast.warnings.is_empty());
    let (d, w) = trim_for_duty(&p, 0.02, 24.0, 0.7).expect("reachable");
    assert!((d - 0.8).abs() < 1e-12 && w.iter().any(|w| w.contains("efficiency held")));
    assert!(trim_for_duty(&p, 0.02, 45.0, 0.7).is_err());
}
