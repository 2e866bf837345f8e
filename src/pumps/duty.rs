//! The duty point: where the pump (or arrangement) head curve meets the system curve.

use super::PumpError;

/// Number of grid intervals on which [`solve_duty`] samples the pump curve for crossings.
pub const DUTY_GRID_INTERVALS: usize = 200;
/// Relative tolerance on flow of each duty root.
pub const DUTY_REL_TOL: f64 = 1e-10;
/// Iteration cap of each Brent solve in [`solve_duty`].
pub const DUTY_MAX_ITER: usize = 200;

/// Result of intersecting a pump curve with a system curve.
#[derive(Clone, Debug, PartialEq)]
pub enum DutyOutcome {
    /// The operating point (the crossing at the largest flow).
    Point {
        /// Duty flow, m³/s.
        flow: f64,
        /// Pump head at the duty flow, m (equal to the system head within the tolerance).
        head: f64,
        /// How many crossings were found on [0, q_end].
        crossings: usize,
        /// Flows of all crossings, ascending, m³/s.
        all_flows: Vec<f64>,
        /// Remarks: several crossings (drooping curve), shut-off below static head.
        warnings: Vec<String>,
    },
    /// The pump's shut-off head is below the static head and the curves never meet.
    ShutoffBelowStatic {
        /// Pump head at zero flow, m.
        shutoff_head: f64,
        /// System head at zero flow (the static head), m.
        static_head: f64,
    },
    /// The pump is still above the system curve where its allowed range ends.
    CurveEndsBeforeSystem {
        /// End of the allowed flow range, m³/s.
        end_flow: f64,
        /// Pump head there, m.
        pump_head: f64,
        /// System head there, m.
        system_head: f64,
    },
    /// No answer could be computed (non-finite curve values, bad range, failed solve).
    NoSolution {
        /// Why.
        message: String,
    },
}

impl DutyOutcome {
    /// The duty flow and head, when there is a duty point.
    pub fn point(&self) -> Option<(f64, f64)> {
        match self {
            DutyOutcome::Point { flow, head, .. } => Some((*flow, *head)),
            _ => None,
        }
    }

    /// One sentence for a failed check, or the remarks of a found point joined.
    pub fn describe(&self) -> String {
        match self {
            DutyOutcome::Point {
                flow,
                head,
                warnings,
                ..
            } => {
                let mut s = format!("duty point at {flow:.6} m3/s and {head:.3} m");
                for w in warnings {
                    s.push_str("; ");
                    s.push_str(w);
                }
                s
            }
            DutyOutcome::ShutoffBelowStatic {
                shutoff_head,
                static_head,
            } => format!(
                "no duty point: the shut-off head {shutoff_head:.3} m is below the static head \
                 {static_head:.3} m"
            ),
            DutyOutcome::CurveEndsBeforeSystem {
                end_flow,
                pump_head,
                system_head,
            } => format!(
                "no duty point on the curve: at its end ({end_flow:.6} m3/s) the pump still gives \
                 {pump_head:.3} m against {system_head:.3} m of system head"
            ),
            DutyOutcome::NoSolution { message } => format!("no duty point: {message}"),
        }
    }
}

/// Brent's root finder on a bracket [a, b] with f(a)·f(b) ≤ 0.
///
/// Source: R. P. Brent, *Algorithms for Minimization without Derivatives*,
/// Prentice-Hall (1973), chapter 4 (procedure *zero*): inverse quadratic interpolation
/// and secant steps, safeguarded by bisection, so it never does worse than bisection.
///
/// Stops when the bracket half-width is at most 2ε|x| + ½·rel_tol·max(|x|, |b − a|)
/// (ε = machine epsilon; the second term makes the tolerance relative to the root,
/// floored by the initial bracket width for roots near zero). Errors: a non-finite
/// end, rel_tol or function value, a bracket without a sign change, or no
/// convergence within `max_iter` iterations.
pub fn brent(
    f: impl Fn(f64) -> f64,
    a: f64,
    b: f64,
    rel_tol: f64,
    max_iter: usize,
) -> Result<f64, PumpError> {
    if !(a.is_finite() && b.is_finite() && rel_tol.is_finite() && rel_tol >= 0.0) {
        return Err(PumpError::new(format!(
            "Brent: bracket [{a}, {b}] and tolerance {rel_tol} must be finite"
        )));
    }
    let eval = |x: f64| {
        let v = f(x);
        if v.is_finite() {
            Ok(v)
        } else {
            Err(PumpError::new(format!(
                "Brent: the function is not finite at {x} ({v})"
            )))
        }
    };
    let width0 = (b - a).abs();
    let (mut a, mut b) = (a, b);
    let mut fa = eval(a)?;
    let mut fb = eval(b)?;
    if fa == 0.0 {
        return Ok(a);
    }
    if fb == 0.0 {
        return Ok(b);
    }
    if (fa > 0.0) == (fb > 0.0) {
        return Err(PumpError::new(format!(
            "Brent: no sign change on [{a}, {b}] (f = {fa} and {fb})"
        )));
    }
    let (mut c, mut fc) = (a, fa);
    let mut d = b - a;
    let mut e = d;
    for _ in 0..max_iter {
        if (fb > 0.0) == (fc > 0.0) {
            c = a;
            fc = fa;
            d = b - a;
            e = d;
        }
        if fc.abs() < fb.abs() {
            a = b;
            b = c;
            c = a;
            fa = fb;
            fb = fc;
            fc = fa;
        }
        let tol = 2.0 * f64::EPSILON * b.abs() + 0.5 * rel_tol * b.abs().max(width0);
        let m = 0.5 * (c - b);
        if m.abs() <= tol || fb == 0.0 {
            return Ok(b);
        }
        if e.abs() >= tol && fa.abs() > fb.abs() {
            let s = fb / fa;
            let (mut p, mut q) = if a == c {
                (2.0 * m * s, 1.0 - s)
            } else {
                let qq = fa / fc;
                let r = fb / fc;
                (
                    s * (2.0 * m * qq * (qq - r) - (b - a) * (r - 1.0)),
                    (qq - 1.0) * (r - 1.0) * (s - 1.0),
                )
            };
            if p > 0.0 {
                q = -q;
            } else {
                p = -p;
            }
            let previous_e = e;
            e = d;
            if 2.0 * p < 3.0 * m * q - (tol * q).abs() && p < (0.5 * previous_e * q).abs() {
                d = p / q;
            } else {
                d = m;
                e = m;
            }
        } else {
            d = m;
            e = m;
        }
        a = b;
        fa = fb;
        b += if d.abs() > tol { d } else { tol.copysign(m) };
        fb = eval(b)?;
    }
    Err(PumpError::new(format!(
        "Brent: no convergence in {max_iter} iterations (last estimate {b})"
    )))
}

/// Solves pump_head(q) = system_head(q) on [0, q_end].
///
/// `q_end` is the end of the pump data domain times the extrapolation factor the
/// caller allows (1.0 to stay on the published curve, 1.1 to allow 10 %).
///
/// Precondition: `system_head` does not fall with flow. Every system curve meets it
/// (static head plus losses that grow with flow); the engine's is tested for it across
/// all flow regimes. `pump_head` may have any shape.
///
/// Method: the pump head is sampled on [`DUTY_GRID_INTERVALS`] equal intervals. Where it
/// does not rise from one node to the next, g(q) = pump − system cannot rise either, so a
/// run of such intervals holds at most one crossing and g is needed only at the run's
/// ends; where the pump head rises (a drooping curve), g is sampled at every node. Each
/// bracket with a sign change (or a node where g = 0) holds a crossing, which [`brent`]
/// refines to [`DUTY_REL_TOL`] relative in q within [`DUTY_MAX_ITER`] iterations. Two
/// crossings closer together than one grid interval can be missed. For a falling pump
/// curve this costs two system evaluations plus Brent's, instead of one per node.
///
/// Outcome:
/// - the pump is still above the system at q_end → [`DutyOutcome::CurveEndsBeforeSystem`];
/// - otherwise, crossings found → [`DutyOutcome::Point`] at the **largest** crossing flow:
///   there the pump curve passes from above the system curve to below it, which is the
///   stable operating point for a system curve rising with flow (a drooping pump curve
///   can cross a rising system curve twice; the lower crossing is unstable). More than
///   one crossing, or a shut-off head below the static head, adds a warning;
/// - no crossing and the pump below the system at zero flow →
///   [`DutyOutcome::ShutoffBelowStatic`];
/// - non-finite curve values or a bad q_end → [`DutyOutcome::NoSolution`].
pub fn solve_duty(
    pump_head: &dyn Fn(f64) -> f64,
    system_head: &dyn Fn(f64) -> f64,
    q_end: f64,
) -> DutyOutcome {
    if !(q_end.is_finite() && q_end > 0.0) {
        return bad_range(q_end);
    }
    solve_duty_scanned(
        pump_head,
        system_head,
        q_end,
        &PumpScan::new(pump_head, q_end),
    )
}

fn bad_range(q_end: f64) -> DutyOutcome {
    DutyOutcome::NoSolution {
        message: format!("the flow range end must be a positive finite flow, got {q_end}"),
    }
}

/// Where a pump head curve rises on the [`DUTY_GRID_INTERVALS`] equal intervals of
/// [0, q_end]: what [`solve_duty`] learns by sampling the pump, kept so that it can be
/// reused. A curve scaled by the affinity laws (flow × s, head × s²) and searched to the
/// same multiple of its data end has the same grid in its own flows, hence the same
/// rising intervals: one scan of a candidate's published curve serves every case.
#[derive(Clone, Debug, PartialEq, Eq)]
pub struct PumpScan {
    /// The grid nodes (0..=[`DUTY_GRID_INTERVALS`]) where g = pump − system is needed:
    /// both ends, and both ends of every interval over which the pump head rises (or is
    /// not finite at an end, so that the solve's error names it), ascending.
    nodes: Vec<usize>,
}

impl PumpScan {
    /// Sample `pump_head` at the grid nodes of [0, q_end] (m³/s).
    pub fn new(pump_head: &dyn Fn(f64) -> f64, q_end: f64) -> PumpScan {
        let node = |i: usize| q_end * i as f64 / DUTY_GRID_INTERVALS as f64;
        let pump: Vec<f64> = (0..=DUTY_GRID_INTERVALS)
            .map(|i| pump_head(node(i)))
            .collect();
        let rises =
            |i: usize| pump[i + 1] > pump[i] || !pump[i].is_finite() || !pump[i + 1].is_finite();
        let nodes = (0..=DUTY_GRID_INTERVALS)
            .filter(|&i| i == 0 || i == DUTY_GRID_INTERVALS || rises(i - 1) || rises(i))
            .collect();
        PumpScan { nodes }
    }

    /// True when the head never rises (and is finite) on the whole grid.
    pub fn never_rises(&self) -> bool {
        self.nodes.len() == 2
    }
}

/// [`solve_duty`] with the pump's grid scan already done ([`PumpScan::new`] on this pump
/// and `q_end`, or on the published curve it is scaled from): the same brackets, the same
/// roots, the same outcome, without sampling the pump at every node. The fast duty path
/// of the analysis pairs it with the tabulated system curve of
/// [`crate::analysis::system_table`].
pub fn solve_duty_scanned(
    pump_head: &dyn Fn(f64) -> f64,
    system_head: &dyn Fn(f64) -> f64,
    q_end: f64,
    scan: &PumpScan,
) -> DutyOutcome {
    if !(q_end.is_finite() && q_end > 0.0) {
        return bad_range(q_end);
    }
    let g = |q: f64| pump_head(q) - system_head(q);
    let node = |i: usize| q_end * i as f64 / DUTY_GRID_INTERVALS as f64;
    let nodes = &scan.nodes;
    let mut values = Vec::with_capacity(nodes.len());
    for &i in nodes {
        let v = g(node(i));
        if !v.is_finite() {
            return DutyOutcome::NoSolution {
                message: format!(
                    "the pump or system head is not finite at {} m3/s (pump {}, system {})",
                    node(i),
                    pump_head(node(i)),
                    system_head(node(i))
                ),
            };
        }
        values.push(v);
    }
    let mut roots = Vec::new();
    for k in 0..nodes.len() - 1 {
        let (g0, g1) = (values[k], values[k + 1]);
        let (q0, q1) = (node(nodes[k]), node(nodes[k + 1]));
        if g0 == 0.0 {
            roots.push(q0);
        } else if g1 != 0.0 && (g0 > 0.0) != (g1 > 0.0) {
            // Brent's tolerance is floored by its bracket width: scale it so that a bracket
            // of several grid intervals is refined as finely as one interval would be.
            let intervals = (nodes[k + 1] - nodes[k]) as f64;
            match brent(g, q0, q1, DUTY_REL_TOL / intervals, DUTY_MAX_ITER) {
                Ok(q) => roots.push(q),
                Err(e) => return DutyOutcome::NoSolution { message: e.message },
            }
        }
    }
    let g_end = values[values.len() - 1];
    if g_end == 0.0 {
        roots.push(q_end);
    }
    if g_end > 0.0 {
        return DutyOutcome::CurveEndsBeforeSystem {
            end_flow: q_end,
            pump_head: pump_head(q_end),
            system_head: system_head(q_end),
        };
    }
    let Some(&flow) = roots.last() else {
        return DutyOutcome::ShutoffBelowStatic {
            shutoff_head: pump_head(0.0),
            static_head: system_head(0.0),
        };
    };
    let mut warnings = Vec::new();
    if roots.len() > 1 {
        let list: Vec<String> = roots.iter().map(|q| format!("{q:.6}")).collect();
        warnings.push(format!(
            "the pump curve crosses the system curve {} times (at {} m3/s): a drooping curve; \
             the crossing at the largest flow is taken as the stable duty point",
            roots.len(),
            list.join(", ")
        ));
    }
    if values[0] < 0.0 {
        warnings.push(format!(
            "the shut-off head {:.3} m is below the static head {:.3} m: the pump may not \
             start against a full line",
            pump_head(0.0),
            system_head(0.0)
        ));
    }
    DutyOutcome::Point {
        flow,
        head: pump_head(flow),
        crossings: roots.len(),
        all_flows: roots,
        warnings,
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn brent_finds_cube_root_of_two() {
        let x = brent(|x| x * x * x - 2.0, 0.0, 2.0, 1e-14, 100).expect("root");
        assert!((x - 2.0_f64.cbrt()).abs() < 1e-13);
    }

    #[test]
    fn brent_reports_missing_sign_change_and_cap() {
        assert!(brent(|x| x * x + 1.0, -1.0, 1.0, 1e-10, 100).is_err());
        assert!(brent(|x| x * x * x - 2.0, 0.0, 2.0, 0.0, 2).is_err());
        assert!(brent(|_| f64::NAN, 0.0, 1.0, 1e-10, 100).is_err());
    }

    #[test]
    fn straight_lines_meet_where_expected() {
        // pump 50 − 1000 q, system 10 + 1000 q  →  q = 0.02, h = 30
        let out = solve_duty(&|q| 50.0 - 1000.0 * q, &|q| 10.0 + 1000.0 * q, 0.05);
        let (q, h) = out.point().expect("point");
        assert!((q - 0.02).abs() < 1e-12);
        assert!((h - 30.0).abs() < 1e-9);
    }

    #[test]
    fn falling_pump_needs_few_system_evaluations() {
        let calls = std::cell::Cell::new(0usize);
        let system = |q: f64| {
            calls.set(calls.get() + 1);
            10.0 + 20_000.0 * q * q
        };
        // pump 50 − 5000 q² meets 10 + 20 000 q² at q = 0.04 (h = 42).
        let out = solve_duty(&|q| 50.0 - 5000.0 * q * q, &system, 0.08);
        let (q, h) = out.point().expect("point");
        assert!((q - 0.04).abs() < 1e-13 && (h - 42.0).abs() < 1e-9);
        assert!(calls.get() < 30, "{} system evaluations", calls.get());
    }

    #[test]
    fn drooping_pump_finds_both_crossings() {
        // pump 40 + 400 q − 10 000 q² (peak 44 m at 0.02) against a flat 42 m system:
        // crossings at q = 0.02 ∓ √0.0002.
        let out = solve_duty(&|q| 40.0 + 400.0 * q - 10_000.0 * q * q, &|_| 42.0, 0.05);
        let DutyOutcome::Point {
            all_flows, flow, ..
        } = out
        else {
            panic!("{out:?}");
        };
        let d = 0.0002f64.sqrt();
        assert_eq!(all_flows.len(), 2);
        assert!((all_flows[0] - (0.02 - d)).abs() < 1e-11, "{all_flows:?}");
        assert!((flow - (0.02 + d)).abs() < 1e-11, "{flow}");
    }

    #[test]
    fn a_scan_of_the_unscaled_curve_serves_the_scaled_one() {
        // Affinity scaling H(q) = s²·H0(q/s) maps the grid of [0, s·q0] onto that of
        // [0, q0]: the scan of H0 gives the same crossings as sampling the scaled curve.
        let h0 = |q: f64| 40.0 + 400.0 * q - 10_000.0 * q * q;
        let scan = PumpScan::new(&h0, 0.05);
        assert!(!scan.never_rises());
        for s in [0.7, 1.0, 1.15] {
            let pump = |q: f64| s * s * h0(q / s);
            let system = |q: f64| 30.0 * s * s + 2_000.0 * q * q;
            let exact = solve_duty(&pump, &system, 0.05 * s);
            let scanned = solve_duty_scanned(&pump, &system, 0.05 * s, &scan);
            assert_eq!(exact, scanned, "speed ratio {s}");
        }
    }

    #[test]
    fn bad_range_is_no_solution() {
        let out = solve_duty(&|_| 1.0, &|_| 0.0, f64::NAN);
        assert!(matches!(out, DutyOutcome::NoSolution { .. }));
    }
}
