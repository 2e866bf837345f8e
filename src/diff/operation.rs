//! The yearly-operation inputs as a tree (issue 13): each `load_profile` by its case,
//! its fields and its rows by position, and each `cost` block by its pump, so a changed
//! hours row, control head or cost element shows in the revision diff.

use super::tree::Node;
use super::values::{number, show, Measure};
use crate::model::operation::{Control, CostElements, LoadProfile, OperationSettings};
use crate::model::ReportUnits;

/// The suffix of a yearly cost element (they are stored per year).
const PER_YEAR: &str = "/year";

/// The profiles and cost blocks of a design, in file order.
pub fn operation_nodes(op: &OperationSettings, currency: &str, units: ReportUnits) -> Vec<Node> {
    let mut out: Vec<Node> = op.profiles.iter().map(|p| profile(p, units)).collect();
    out.extend(op.costs.iter().map(|c| cost(c, currency)));
    out
}

/// The control strategy with its head, as one value: `proportional, 40 m at zero flow`.
fn control(c: Control, units: ReportUnits) -> String {
    let head = |h: f64| show(h, Measure::Length, units);
    match c {
        Control::ConstantPressure { head: h } => format!("constant_pressure, {}", head(h)),
        Control::SystemCurve { residual } => format!("system_curve, {} residual", head(residual)),
        Control::Proportional { zero_flow_head } => {
            format!("proportional, {} at zero flow", head(zero_flow_head))
        }
        other => other.keyword().to_string(),
    }
}

fn profile(p: &LoadProfile, units: ReportUnits) -> Node {
    let v = |si: f64, m: Measure| show(si, m, units);
    let mut fields = vec![
        Node::leaf("control", control(p.control, units)),
        Node::leaf("staging", p.staging.keyword()),
    ];
    if p.design_flow.is_finite() {
        fields.push(Node::leaf("design_flow", v(p.design_flow, Measure::Flow)));
    }
    if let Some(m) = p.deadhead_margin {
        fields.push(Node::leaf("deadhead_margin", v(m, Measure::Length)));
    }
    if let Some(r) = p.min_flow_ratio {
        fields.push(Node::leaf("min_flow", v(r, Measure::Percent)));
    }
    if let Some(s) = p.storage_volume {
        fields.push(Node::leaf("storage", volume(s, units)));
    }
    if p.level_band > 0.0 {
        fields.push(Node::leaf("level_band", v(p.level_band, Measure::Length)));
    }
    if let Some(s) = p.max_starts_per_hour {
        fields.push(Node::leaf("max_starts_per_hour", number(s)));
    }
    if let Some(b) = &p.binning {
        fields.push(Node::leaf(
            "hourly flows",
            format!("{}, {} rows, {} bins", b.source, b.rows, b.hours.len()),
        ));
    }
    for (i, pt) in p.points.iter().enumerate() {
        fields.push(Node::group(
            format!("row {}", i + 1),
            format!(
                "flow {}, hours {}",
                v(pt.flow, Measure::Flow),
                v(pt.hours * 3600.0, Measure::Hours)
            ),
            vec![
                Node::leaf("flow", v(pt.flow, Measure::Flow)),
                Node::leaf("hours", v(pt.hours * 3600.0, Measure::Hours)),
            ],
        ));
    }
    let total: f64 = p.points.iter().map(|pt| pt.hours).sum();
    let summary = format!("{} rows, {} h", p.points.len(), number(total));
    Node::group(format!("load_profile {}", p.case), summary, fields)
}

/// A volume in m³ or US gallons (1 gal = 3.785411784e-3 m³, NIST SP 811 B.8).
fn volume(m3: f64, units: ReportUnits) -> String {
    match units {
        ReportUnits::Us => format!("{} gal", number(m3 / 3.785_411_784e-3)),
        ReportUnits::Si => format!("{} m³", number(m3)),
    }
}

fn cost(c: &CostElements, currency: &str) -> Node {
    let once = |v: f64| format!("{} {currency}", number(v));
    let yearly = |v: f64| format!("{} {currency}{PER_YEAR}", number(v));
    let fields = vec![
        Node::leaf("initial", once(c.initial)),
        Node::leaf("installation", once(c.installation)),
        Node::leaf("operation", yearly(c.operation)),
        Node::leaf("maintenance", yearly(c.maintenance)),
        Node::leaf("downtime", yearly(c.downtime)),
        Node::leaf("environmental", yearly(c.environmental)),
        Node::leaf("disposal", once(c.disposal)),
    ];
    let summary = format!("initial {}", once(c.initial));
    Node::group(format!("cost {}", c.pump), summary, fields)
}
