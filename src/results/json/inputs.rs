//! Added fields of the results document that restate the design's inputs as the
//! engine used them, so that an independent recomputation (for instance
//! `tests/reference/gen_demo_recompute.py`) can start from the JSON alone:
//! each candidate's published curve points with the fit method of every column,
//! and each segment's `loss { ... }` entries.

// JSON keys carry SI unit symbols (`shaft_power_W`) as the contract says.
#![allow(non_snake_case)]

use serde::Serialize;
use uom::si::{
    frequency::cycle_per_minute, length::meter, power::watt, ratio::ratio,
    volume_rate::cubic_meter_per_second,
};

use crate::analysis::Analysis;
use crate::model::{CurveData, Design};
use crate::pumps::PumpCurves;

/// One `loss { ... }` entry of a segment.
#[derive(Serialize, PartialEq)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct Loss<'a> {
    k: Option<f64>,
    equivalent_length_m: Option<f64>,
    why: &'a str,
}

/// One pump candidate: its published curves and which one the cases evaluate.
#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct Candidate<'a> {
    name: &'a str,
    /// Index (from 0) into `curves` of the curve the cases scale by the affinity laws;
    /// `null` when the evaluated impeller is interpolated between published curves.
    evaluated_curve: Option<usize>,
    /// Impeller trim ratio applied to that curve (1 when untrimmed).
    trim_ratio: Option<f64>,
    curves: Vec<Curve<'a>>,
    /// Wave 2: the motor over all cases, one pump of a parallel set alone, and the
    /// flow at the limit in every case.
    motor: Option<super::engineering::MotorOut<'a>>,
    one_pump_alone: Option<super::engineering::OneAloneOut<'a>>,
    capacity: Vec<super::engineering::CapacityOut<'a>>,
    /// Wave 2: the operation over the load profiles (only when the design has one).
    #[serde(flatten)]
    operation: Option<super::operation::OperationOut<'a>>,
}

/// One published curve table in SI, with the fit used for each column.
#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Curve<'a> {
    speed_rpm: f64,
    impeller_diameter_m: Option<f64>,
    flow_m3_s: Vec<f64>,
    head_m: Vec<f64>,
    efficiency: Vec<Option<f64>>,
    npsh_required_m: Vec<Option<f64>>,
    shaft_power_W: Vec<Option<f64>>,
    /// Method names as [`crate::pumps::FittedCurve::method`] gives them; `null` when
    /// the column is absent or the table could not be fitted.
    head_fit: Option<&'static str>,
    efficiency_fit: Option<&'static str>,
    npsh_required_fit: Option<&'static str>,
    shaft_power_fit: Option<&'static str>,
    /// Why the table could not be fitted, when it could not.
    error: Option<&'a str>,
}

/// The `loss` entries of segment `index` of line `line` in a case's scenario.
pub(super) fn losses<'a>(
    case: Option<&'a crate::model::Case>,
    line: &str,
    index: usize,
) -> Vec<Loss<'a>> {
    case.and_then(|c| c.scenario.lines.iter().find(|l| l.name == line))
        .and_then(|l| l.segments.get(index))
        .map(|s| {
            s.losses
                .iter()
                .map(|l| Loss {
                    k: l.k,
                    equivalent_length_m: l.equivalent_length.map(|x| x.get::<meter>()),
                    why: &l.why,
                })
                .collect()
        })
        .unwrap_or_default()
}

fn curve<'a>(c: &CurveData, fitted: Option<&'a Result<PumpCurves, String>>) -> Curve<'a> {
    let ok = fitted.and_then(|r| r.as_ref().ok());
    Curve {
        speed_rpm: c.speed.get::<cycle_per_minute>(),
        impeller_diameter_m: c.impeller.map(|d| d.get::<meter>()),
        flow_m3_s: c
            .flow
            .iter()
            .map(|q| q.get::<cubic_meter_per_second>())
            .collect(),
        head_m: c.head.iter().map(|h| h.get::<meter>()).collect(),
        efficiency: c
            .efficiency
            .iter()
            .map(|e| e.map(|e| e.get::<ratio>()))
            .collect(),
        npsh_required_m: c
            .npshr
            .iter()
            .map(|n| n.map(|n| n.get::<meter>()))
            .collect(),
        shaft_power_W: c
            .shaft_power
            .iter()
            .map(|p| p.map(|p| p.get::<watt>()))
            .collect(),
        head_fit: ok.map(|p| p.head.method()),
        efficiency_fit: ok.and_then(|p| p.efficiency.as_ref().map(|f| f.method())),
        npsh_required_fit: ok.and_then(|p| p.npshr.as_ref().map(|f| f.method())),
        shaft_power_fit: ok.and_then(|p| p.shaft_power.as_ref().map(|f| f.method())),
        error: fitted.and_then(|r| r.as_ref().err().map(String::as_str)),
    }
}

/// Every candidate of the design, in file order.
pub(super) fn candidates<'a>(design: &'a Design, analysis: &'a Analysis) -> Vec<Candidate<'a>> {
    let units = crate::display::Units::new(design.project.units);
    design
        .pumps
        .iter()
        .enumerate()
        .map(|(k, p)| {
            let cc = analysis.candidates.iter().find(|c| c.name == p.name);
            let evaluated = cc.and_then(|c| c.evaluated.as_ref());
            let evaluated_curve = cc.zip(evaluated).and_then(|(c, (base, _))| {
                c.published
                    .iter()
                    .position(|r| r.as_ref().ok() == Some(base))
            });
            Candidate {
                name: &p.name,
                evaluated_curve,
                trim_ratio: evaluated.map(|(_, r)| *r),
                curves: p
                    .curves
                    .iter()
                    .enumerate()
                    .map(|(i, c)| curve(c, cc.and_then(|cc| cc.published.get(i))))
                    .collect(),
                motor: analysis
                    .motor_sizing
                    .get(k)
                    .and_then(|m| m.as_ref())
                    .map(super::engineering::motor),
                one_pump_alone: analysis
                    .one_alone
                    .get(k)
                    .and_then(|a| a.as_ref())
                    .map(|a| super::engineering::one_alone(a, units)),
                capacity: super::engineering::capacity(design, analysis, k),
                operation: analysis
                    .operation
                    .iter()
                    .find(|o| o.name == p.name)
                    .map(|o| super::operation::operation(o, design, units)),
            }
        })
        .collect()
}
