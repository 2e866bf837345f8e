//! Published pump curves, their fitted form, and the best efficiency point.

use super::fit::{fit_default, FittedCurve, Quantity};
use super::{require_positive, PumpError};

/// One published curve: points of one impeller diameter at one speed.
///
/// All columns have one entry per point; optional quantities may be missing at some
/// points (`None`, written `-` in a design file), typically NPSHr at shut-off.
#[derive(Clone, Debug, PartialEq)]
pub struct CurveTable {
    /// Speed the curve was published at, rpm.
    pub speed_rpm: f64,
    /// Impeller diameter of the curve, m, when the data sheet states it.
    pub impeller_diameter_m: Option<f64>,
    /// Flow, m³/s, strictly increasing.
    pub flow: Vec<f64>,
    /// Total head, m.
    pub head: Vec<f64>,
    /// Pump efficiency as a fraction (0.77, not 77).
    pub efficiency: Vec<Option<f64>>,
    /// NPSH required, m.
    pub npshr: Vec<Option<f64>>,
    /// Shaft (brake) power, W.
    pub shaft_power: Vec<Option<f64>>,
}

/// A pump's fitted curves at the table's speed and diameter.
#[derive(Clone, Debug, PartialEq)]
pub struct PumpCurves {
    /// Head against flow (always present).
    pub head: FittedCurve,
    /// Efficiency (fraction) against flow, when the table gives efficiencies.
    pub efficiency: Option<FittedCurve>,
    /// NPSHr (m) against flow, when given.
    pub npshr: Option<FittedCurve>,
    /// Shaft power (W) against flow, when given.
    pub shaft_power: Option<FittedCurve>,
    /// Speed of the curves, rpm.
    pub speed_rpm: f64,
    /// Impeller diameter of the curves, m, when known.
    pub impeller_diameter_m: Option<f64>,
    /// What the fitting had to say (fallbacks, drooping data, sparse columns).
    pub warnings: Vec<String>,
}

/// Splits an optional column into the (flow, value) points that are present.
fn present_points(flow: &[f64], column: &[Option<f64>]) -> (Vec<f64>, Vec<f64>) {
    flow.iter()
        .zip(column)
        .filter_map(|(&q, v)| v.map(|v| (q, v)))
        .unzip()
}

fn fit_optional(
    flow: &[f64],
    column: &[Option<f64>],
    quantity: Quantity,
    warnings: &mut Vec<String>,
) -> Result<Option<FittedCurve>, PumpError> {
    let (q, v) = present_points(flow, column);
    if q.is_empty() {
        return Ok(None);
    }
    let (curve, w) = fit_default(&q, &v, quantity)?;
    warnings.extend(w);
    Ok(Some(curve))
}

/// Fits every column of a table with its default method (see [`mod@super::fit`]).
///
/// Errors: columns of different lengths, a speed or diameter that is not a positive
/// finite number, efficiencies above 1 (percent given instead of a fraction), and any
/// error of the individual fits (too few points, NaN, negative values, flows not
/// strictly increasing).
pub fn fit_table(t: &CurveTable) -> Result<PumpCurves, PumpError> {
    require_positive("pump speed (rpm)", t.speed_rpm)?;
    if let Some(d) = t.impeller_diameter_m {
        require_positive("impeller diameter (m)", d)?;
    }
    let n = t.flow.len();
    for (name, len) in [
        ("head", t.head.len()),
        ("efficiency", t.efficiency.len()),
        ("NPSHr", t.npshr.len()),
        ("shaft power", t.shaft_power.len()),
    ] {
        if len != n {
            return Err(PumpError::new(format!(
                "curve table: {n} flows but {len} {name} entries (use an empty entry for a \
                 missing value)"
            )));
        }
    }
    if let Some((i, e)) = t
        .efficiency
        .iter()
        .enumerate()
        .find_map(|(i, e)| e.filter(|&e| e > 1.0).map(|e| (i, e)))
    {
        return Err(PumpError::new(format!(
            "curve table: efficiency of point {} is {e}, above 1; efficiencies are fractions \
             (0.77 for 77 %)",
            i + 1
        )));
    }
    let mut warnings = Vec::new();
    let (head, w) = fit_default(&t.flow, &t.head, Quantity::Head)?;
    warnings.extend(w);
    let efficiency = fit_optional(&t.flow, &t.efficiency, Quantity::Efficiency, &mut warnings)?;
    let npshr = fit_optional(&t.flow, &t.npshr, Quantity::Npshr, &mut warnings)?;
    let shaft_power = fit_optional(&t.flow, &t.shaft_power, Quantity::ShaftPower, &mut warnings)?;
    Ok(PumpCurves {
        head,
        efficiency,
        npshr,
        shaft_power,
        speed_rpm: t.speed_rpm,
        impeller_diameter_m: t.impeller_diameter_m,
        warnings,
    })
}

/// The best efficiency point of a pump curve.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Bep {
    /// Flow at the efficiency maximum, m³/s.
    pub flow: f64,
    /// Head at that flow from the head fit, m.
    pub head: f64,
    /// The maximum efficiency, fraction.
    pub efficiency: f64,
    /// True when the maximum lies at an end of the efficiency data, so the data do not
    /// show a peak and the "BEP" is only the best published point.
    pub at_domain_end: bool,
}

/// Best efficiency point: the flow that maximises the efficiency fit on its data domain,
/// with its head and efficiency; `None` when there are no efficiency data.
///
/// Method: the fit is sampled at 201 evenly spaced flows, and the interval around the
/// best sample is narrowed by golden-section search (Kiefer, "Sequential minimax search
/// for a maximum", Proc. AMS 4, 502–506, 1953). The number of golden-section steps is
/// fixed in advance (the count that shrinks the bracket below 1e-12 of the domain
/// width), so the search is bounded and needs no convergence test.
pub fn best_efficiency_point(c: &PumpCurves) -> Option<Bep> {
    let eff = c.efficiency.as_ref()?;
    let (lo, hi) = eff.domain();
    const SAMPLES: usize = 200;
    let at = |i: usize| lo + (hi - lo) * i as f64 / SAMPLES as f64;
    let best = (0..=SAMPLES).fold(0, |best, i| {
        if eff.eval(at(i)) > eff.eval(at(best)) {
            i
        } else {
            best
        }
    });
    let mut a = at(best.saturating_sub(1));
    let mut b = at((best + 1).min(SAMPLES));
    let inv_phi = (5.0_f64.sqrt() - 1.0) / 2.0;
    // 0.618^k · (2/200) < 1e-12  ⇒  k ≥ 48; a few more for safety.
    const STEPS: usize = 60;
    let mut x1 = b - inv_phi * (b - a);
    let mut x2 = a + inv_phi * (b - a);
    let mut f1 = eff.eval(x1);
    let mut f2 = eff.eval(x2);
    for _ in 0..STEPS {
        if f1 < f2 {
            a = x1;
            x1 = x2;
            f1 = f2;
            x2 = a + inv_phi * (b - a);
            f2 = eff.eval(x2);
        } else {
            b = x2;
            x2 = x1;
            f2 = f1;
            x1 = b - inv_phi * (b - a);
            f1 = eff.eval(x1);
        }
    }
    let mut flow = 0.5 * (a + b);
    // The sampled end points compete too (a peak outside the data shows as an end maximum).
    for candidate in [lo, hi] {
        if eff.eval(candidate) > eff.eval(flow) {
            flow = candidate;
        }
    }
    let width = hi - lo;
    let at_domain_end = flow - lo <= 1e-9 * width || hi - flow <= 1e-9 * width;
    Some(Bep {
        flow,
        head: c.head.eval(flow),
        efficiency: eff.eval(flow),
        at_domain_end,
    })
}
