//! Invariants over random pump tables: a solved duty point satisfies both curves, and no
//! table (valid or not) panics the fitting or yields NaN.

use dutyline::pumps::{
    best_efficiency_point, fit_table, solve_duty, speed_for_duty, CurveTable, DutyOutcome,
    ScaledPump,
};
use proptest::prelude::*;

/// A random plausible table: head falling with flow, efficiency peaking mid-range,
/// NPSHr and power rising.
fn monotone_table() -> impl Strategy<Value = CurveTable> {
    (
        4usize..10,
        5.0f64..200.0,
        1e-3f64..2.0,
        proptest::collection::vec(0.0f64..1.0, 10),
        0.3f64..0.9,
        0.2f64..0.8,
    )
        .prop_map(|(n, h0, q_max, drops, peak_eff, peak_at)| {
            let flow: Vec<f64> = (0..n).map(|i| q_max * i as f64 / (n - 1) as f64).collect();
            // Cumulative drops make a non-increasing head ending between 20 % and 90 % of h0.
            let total: f64 = drops[..n - 1].iter().sum::<f64>() + 1e-9;
            let fall = 0.1 + 0.7 * drops[n - 1];
            let mut head = vec![h0];
            for d in &drops[..n - 1] {
                let last = head[head.len() - 1];
                head.push(last - h0 * fall * d / total);
            }
            let efficiency = flow
                .iter()
                .map(|q| {
                    let x = q / q_max - peak_at;
                    Some((peak_eff * (1.0 - 1.5 * x * x)).max(0.0))
                })
                .collect();
            let npshr = flow
                .iter()
                .map(|q| Some(1.0 + 4.0 * (q / q_max).powi(2)))
                .collect();
            let shaft_power = flow
                .iter()
                .map(|q| Some(1000.0 * h0 * q_max * (0.3 + q / q_max)))
                .collect();
            CurveTable {
                speed_rpm: 1450.0,
                impeller_diameter_m: Some(0.25),
                flow,
                head,
                efficiency,
                npshr,
                shaft_power,
            }
        })
}

/// Tables that are mostly valid but often carry one defect: a NaN or infinity, a falling
/// or repeated flow, a negative value, a percent efficiency, a missing or extra entry.
fn arbitrary_table() -> impl Strategy<Value = CurveTable> {
    let increment = prop_oneof![40 => 0.0f64..1.0, 1 => -0.5f64..0.0, 1 => Just(f64::NAN)];
    let head = prop_oneof![40 => 0.0f64..100.0, 1 => -5.0f64..0.0, 1 => Just(f64::INFINITY)];
    let eff = proptest::option::weighted(
        0.9,
        prop_oneof![40 => 0.0f64..1.0, 1 => 1.0f64..90.0, 1 => -0.5f64..0.0],
    );
    let speed = prop_oneof![30 => 1.0f64..4000.0, 1 => Just(0.0), 1 => Just(f64::NAN)];
    (0usize..12)
        .prop_flat_map(move |n| {
            (
                proptest::collection::vec(increment.clone(), n),
                proptest::collection::vec(head.clone(), n),
                proptest::collection::vec(eff.clone(), n),
                speed.clone(),
                0usize..8,
            )
        })
        .prop_map(|(inc, head, efficiency, speed_rpm, defect)| {
            let mut flow = Vec::with_capacity(inc.len());
            let mut q = 0.0;
            for d in inc {
                flow.push(q);
                q += d * 0.01;
            }
            let n = flow.len();
            let mut t = CurveTable {
                speed_rpm,
                impeller_diameter_m: Some(0.2),
                flow,
                head,
                efficiency,
                npshr: (0..n).map(|i| Some(1.0 + 0.3 * i as f64)).collect(),
                shaft_power: vec![None; n],
            };
            match defect {
                1 => t.npshr.push(None),
                2 => t.impeller_diameter_m = Some(-0.1),
                _ => {}
            }
            t
        })
}

proptest! {
    #![proptest_config(ProptestConfig::with_cases(200))]

    #[test]
    fn solved_duty_point_satisfies_both_curves(
        t in monotone_table(),
        static_frac in 0.0f64..0.95,
        meet in 0.2f64..0.95,
        exponent in prop_oneof![Just(2.0f64), Just(1.9f64)],
    ) {
        let c = fit_table(&t).expect("a valid monotone table fits");
        let (_, q_end) = c.head.domain();
        let h0 = c.head.eval(0.0);
        let hs = static_frac * h0;
        let q_meet = meet * q_end;
        let rise = (c.head.eval(q_meet) - hs).max(0.01 * h0);
        let k = rise / q_meet.powf(exponent);
        let pump = |q: f64| c.head.eval(q);
        let system = move |q: f64| hs + k * q.powf(exponent);
        match solve_duty(&pump, &system, q_end * 1.1) {
            DutyOutcome::Point { flow, head, .. } => {
                prop_assert!(flow.is_finite() && head.is_finite());
                prop_assert!((pump(flow) - system(flow)).abs() <= 1e-6, "miss at {flow}");
                prop_assert!((head - system(flow)).abs() <= 1e-6);
            }
            DutyOutcome::NoSolution { message } => prop_assert!(false, "{message}"),
            _ => {}
        }
    }

    #[test]
    fn random_monotone_tables_give_finite_values(t in monotone_table(), r in 0.3f64..1.2) {
        let c = fit_table(&t).expect("fits");
        let (lo, hi) = c.head.domain();
        for i in 0..=50 {
            let q = lo + (hi - lo) * 1.2 * i as f64 / 50.0;
            prop_assert!(c.head.eval(q).is_finite() && c.head.derivative(q).is_finite());
            for curve in [&c.efficiency, &c.npshr, &c.shaft_power].into_iter().flatten() {
                prop_assert!(curve.eval(q).is_finite());
            }
        }
        let bep = best_efficiency_point(&c).expect("efficiency data");
        prop_assert!(bep.flow.is_finite() && bep.head.is_finite() && bep.efficiency.is_finite());
        prop_assert!(bep.flow >= lo && bep.flow <= hi);
        let s = ScaledPump::new(&c, r, 1.0).expect("valid ratio");
        prop_assert!(s.eval_head(0.5 * hi).is_finite());
        if let Ok(sd) = speed_for_duty(&c, 0.5 * hi, 0.5 * c.head.eval(0.5 * hi), 0.3, 1.2) {
            let at = ScaledPump::new(&c, sd.speed_ratio, 1.0).expect("valid");
            prop_assert!((at.eval_head(0.5 * hi) - 0.5 * c.head.eval(0.5 * hi)).abs() < 1e-8 * c.head.eval(0.0));
        }
    }

    #[test]
    fn arbitrary_tables_never_panic(t in arbitrary_table()) {
        match fit_table(&t) {
            Err(e) => prop_assert!(!e.message.is_empty()),
            Ok(c) => {
            let (lo, hi) = c.head.domain();
            prop_assert!(c.head.eval(0.5 * (lo + hi)).is_finite());
            if let Some(b) = best_efficiency_point(&c) {
                prop_assert!(b.efficiency.is_finite());
            }
            let out = solve_duty(&|q| c.head.eval(q), &|q| 1.0 + q * q, hi.max(1e-3));
            let failed = matches!(out, DutyOutcome::NoSolution { .. });
            prop_assert!(!failed, "{:?}", out);
            }
        }
    }
}
