//! The JSON `envelope` of a duty and `qualifies_across_envelope` of a ranking row
//! (issue 15; docs/results-json.md).

use serde::Serialize;

use super::{check, finite, CheckOut};
use crate::analysis::envelope::{DutyEnvelope, Envelopes};

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
#[allow(non_snake_case)]
pub(super) struct EnvelopeOut<'a> {
    test_grade: &'static str,
    test_grade_assumed: bool,
    combine: &'static str,
    flow_min_m3_s: f64,
    flow_max_m3_s: f64,
    head_min_m: f64,
    head_max_m: f64,
    npsh_margin_worst: Option<f64>,
    shaft_power_max_W: Option<f64>,
    shaft_power_max_flow_per_pump_m3_s: Option<f64>,
    corners: CornersOut<'a>,
    points: Vec<PointOut<'a>>,
    checks: Vec<WorstOut<'a>>,
}

/// The point giving each extreme, by name.
#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct CornersOut<'a> {
    flow_min: &'a str,
    flow_max: &'a str,
    head_min: &'a str,
    head_max: &'a str,
    npsh_margin_worst: Option<&'a str>,
    shaft_power_max: Option<&'static str>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
#[allow(non_snake_case)]
struct PointOut<'a> {
    name: &'a str,
    pump: f64,
    inputs: &'a [f64],
    flow_m3_s: Option<f64>,
    head_m: Option<f64>,
    shaft_power_W: Option<f64>,
    npsh_available_m: Option<f64>,
    npsh_required_m: Option<f64>,
    failure: Option<&'a str>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct WorstOut<'a> {
    id: &'static str,
    nominal: CheckOut<'a>,
    worst: CheckOut<'a>,
    corner: &'a str,
}

/// The envelope of candidate `pump` in case `case`, if there is one.
pub(super) fn envelope<'a>(
    e: &'a Envelopes,
    case: usize,
    pump: usize,
    units: crate::display::Units,
) -> Option<EnvelopeOut<'a>> {
    let d: &DutyEnvelope = e.cases.get(case)?.pumps.get(pump)?.as_ref()?;
    let (t, assumed) = e.grades.get(pump)?;
    let name = |i: usize| d.corners[i].name.as_str();
    Some(EnvelopeOut {
        test_grade: t.grade.label(),
        test_grade_assumed: *assumed,
        combine: match e.combine {
            crate::model::uncertainty::Combine::Corners => "corners",
            crate::model::uncertainty::Combine::Samples(_) => "samples",
        },
        flow_min_m3_s: d.flow_min.value,
        flow_max_m3_s: d.flow_max.value,
        head_min_m: d.head_min.value,
        head_max_m: d.head_max.value,
        npsh_margin_worst: d.npsh_margin_worst.map(|x| x.value).and_then(finite),
        shaft_power_max_W: d.shaft_power_max.map(|x| x.0).and_then(finite),
        shaft_power_max_flow_per_pump_m3_s: d.shaft_power_max.map(|x| x.2),
        corners: CornersOut {
            flow_min: name(d.flow_min.corner),
            flow_max: name(d.flow_max.corner),
            head_min: name(d.head_min.corner),
            head_max: name(d.head_max.corner),
            npsh_margin_worst: d.npsh_margin_worst.map(|x| name(x.corner)),
            shaft_power_max: d.shaft_power_max.map(|x| match x.1 {
                s if s < 0.0 => "pump minus",
                s if s > 0.0 => "pump plus",
                _ => "pump nominal",
            }),
        },
        points: d
            .corners
            .iter()
            .map(|c| {
                let ok = c.duty.as_ref().ok();
                PointOut {
                    name: &c.name,
                    pump: c.pump,
                    inputs: &c.inputs,
                    flow_m3_s: ok.map(|x| x.flow),
                    head_m: ok.map(|x| x.head),
                    shaft_power_W: ok.and_then(|x| x.shaft_power),
                    npsh_available_m: ok.map(|x| x.npsh_available),
                    npsh_required_m: ok.and_then(|x| x.npsh_required),
                    failure: c.duty.as_ref().err().map(String::as_str),
                }
            })
            .collect(),
        checks: d
            .checks
            .iter()
            .map(|w| WorstOut {
                id: w.worst.id.as_str(),
                nominal: check(&w.nominal, units),
                worst: check(&w.worst, units),
                corner: &w.corner,
            })
            .collect(),
    })
}
