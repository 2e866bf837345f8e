//! The inputs of a design as a tree (see [`super::tree`]), and their difference.
//!
//! What is compared, and how things are matched:
//! * project fields; revisions by id; the purpose; assumptions and notes as sets of texts;
//! * the base design: fluid, site, the source and destination tanks by name, the pump
//!   centreline, lines by name, their segments by position, fittings within a segment
//!   by name, extra losses by their reason;
//! * cases by name, each by its effect: the values its overrides change from the base
//!   design (so `1202.0 ft` and `1202 ft` are the same override, and a base change the
//!   case inherits is reported once, on the base);
//! * requirements by quantity and cases (`flow for normal`), whatever their order;
//! * pumps by name with their curves (by impeller diameter or speed) point by point;
//! * motor and energy settings;
//! * load profiles by case (their rows by position) and cost blocks by pump
//!   ([`super::operation`]);
//! * a pipe's wall: thickness (catalogue or stated), rating and the other wall fields.
//!
//! Both designs are shown in the new design's report units, so only real changes
//! appear (a change of `units` itself is reported under `project`).

use super::tree::{diff_nodes, from_leaves, leaves, Node};
use super::values::{number, show, Measure};
use super::InputChange;
use crate::model::*;

/// The input changes from `old` to `new`, in the order of the design file.
pub fn diff_designs(old: &Design, new: &Design) -> Vec<InputChange> {
    let units = new.project.units;
    let mut out = Vec::new();
    diff_nodes(
        &design_tree(old, units),
        &design_tree(new, units),
        &[],
        &mut out,
    );
    out
}

/// The whole design as a tree, values in `units`, in the order a design file
/// usually follows (that of the demo files).
pub fn design_tree(d: &Design, units: ReportUnits) -> Vec<Node> {
    let v = |si: f64, m: Measure| show(si, m, units);
    let mut out = vec![project(&d.project)];
    for r in &d.revisions {
        out.push(Node::group(
            format!("revision {}", r.id),
            format!("{} {:?}", r.date, r.description),
            vec![
                Node::leaf("date", r.date.clone()),
                Node::leaf("description", r.description.clone()),
            ],
        ));
    }
    if let Some(p) = &d.purpose {
        out.push(Node::leaf("purpose", p.clone()));
    }
    out.extend(scenario(&d.base, units, false));
    for c in &d.cases {
        out.push(case(c, &d.base, units));
    }
    if !d.requirements.is_empty() {
        let items: Vec<Node> = d
            .requirements
            .iter()
            .map(|r| requirement(r, units))
            .collect();
        let summary = format!("{} requirement(s)", items.len());
        out.push(Node::group("require", summary, items));
    }
    for p in &d.pumps {
        out.push(pump(p, units));
    }
    let m = &d.motor;
    let mut motor = vec![
        Node::leaf(
            "standard",
            match m.standard {
                MotorStandardChoice::Nema => "nema",
                MotorStandardChoice::Iec => "iec",
            },
        ),
        Node::leaf("service_factor", number(m.service_factor)),
    ];
    if let Some(e) = m.efficiency {
        motor.push(Node::leaf("efficiency", v(e, Measure::Percent)));
    }
    if let Some(e) = m.drive_efficiency {
        motor.push(Node::leaf("drive_efficiency", v(e, Measure::Percent)));
    }
    if let Some(f) = m.supply_hz {
        motor.push(Node::leaf("supply", format!("{} Hz", number(f))));
    }
    if let Some(t) = &m.motor_table {
        for (i, (x, e)) in t.iter().enumerate() {
            motor.push(Node::leaf(
                format!("efficiency table row {}", i + 1),
                format!(
                    "load {}, efficiency {}",
                    v(*x, Measure::Percent),
                    v(*e, Measure::Percent)
                ),
            ));
        }
    }
    if let Some(p) = &m.drive_losses {
        for ((sp, tq), l) in crate::pumps::part_load::IEC_61800_9_2_POINTS.iter().zip(p) {
            motor.push(Node::leaf(
                format!("drive loss at speed {sp} %, torque {tq} %"),
                v(*l, Measure::Percent),
            ));
        }
    }
    out.push(Node::group("motor", "", motor));
    let e = &d.energy;
    let mut energy = Vec::new();
    if let Some(p) = e.price_per_joule {
        // 1 kWh = 3.6e6 J (SI Brochure, 9th edition, table 8).
        energy.push(Node::leaf(
            "price",
            format!("{} {}/kWh", number(p * 3.6e6), e.currency),
        ));
    }
    energy.push(Node::leaf("years", number(e.years)));
    energy.push(Node::leaf(
        "discount_rate",
        v(e.discount_rate, Measure::Percent),
    ));
    energy.push(Node::leaf("escalation", v(e.escalation, Measure::Percent)));
    energy.push(Node::leaf("rates", e.rates.keyword()));
    if e.inflation != 0.0 {
        energy.push(Node::leaf("inflation", v(e.inflation, Measure::Percent)));
    }
    out.push(Node::group("energy", "", energy));
    out.extend(super::operation::operation_nodes(
        &d.operation,
        &e.currency,
        units,
    ));
    for (label, texts) in [("assumption", &d.assumptions), ("note", &d.notes)] {
        for t in texts {
            out.push(Node::leaf(label, t.clone()).keyed(format!("{label}\u{0}{t}")));
        }
    }
    out
}

fn project(p: &Project) -> Node {
    let mut fields: Vec<Node> = [
        ("title", &p.title),
        ("number", &p.number),
        ("client", &p.client),
        ("prepared", &p.prepared),
        ("checked", &p.checked),
        ("approved", &p.approved),
    ]
    .into_iter()
    .map(|(k, v)| Node::leaf(k, v.clone()))
    .collect();
    fields.push(Node::leaf("units", p.units.keyword()));
    if let Some(s) = &p.style {
        fields.push(Node::leaf("style", s.clone()));
    }
    Node::group("project", p.title.clone(), fields)
}

/// The physical setting. `speeds` adds each pump's speed (for case effects).
fn scenario(s: &Scenario, units: ReportUnits, speeds: bool) -> Vec<Node> {
    let v = |si: f64, m: Measure| show(si, m, units);
    let mut fluid = vec![Node::leaf("name", s.fluid.name())];
    match &s.fluid {
        Fluid::Water { temperature } => fluid.push(Node::leaf(
            "temperature",
            v(temperature.value, Measure::Temperature),
        )),
        Fluid::Glycol(g) => {
            fluid.push(Node::leaf("fraction", v(g.fraction, Measure::Percent)));
            fluid.push(Node::leaf(
                "basis",
                match g.basis {
                    crate::model::FractionBasis::Mass => "mass",
                    crate::model::FractionBasis::Volume => "volume",
                },
            ));
            fluid.push(Node::leaf(
                "temperature",
                v(g.temperature.value, Measure::Temperature),
            ));
        }
        Fluid::Custom(c) => {
            if let Some(t) = c.temperature {
                fluid.push(Node::leaf("temperature", v(t.value, Measure::Temperature)));
            }
            fluid.push(Node::leaf("density", v(c.density.value, Measure::Density)));
            fluid.push(Node::leaf(
                "viscosity",
                v(c.viscosity.value, Measure::Viscosity),
            ));
            fluid.push(Node::leaf(
                "vapor_pressure",
                v(c.vapor_pressure.value, Measure::AbsolutePressure),
            ));
        }
    }
    let mut site = vec![Node::leaf(
        "elevation",
        v(s.site.elevation.value, Measure::Length),
    )];
    if let Some(p) = s.site.barometric_pressure {
        site.push(Node::leaf(
            "pressure",
            v(p.value, Measure::AbsolutePressure),
        ));
    }
    let mut out = vec![
        Node::group("fluid", s.fluid.name(), fluid),
        Node::group("site", "", site),
    ];
    // A closed loop's one reference tank is both ends: listed once.
    let closed = s.destination.name == s.source.name;
    // A well field (issue 12): its other wells are tanks of the network.
    let field = s.network.as_ref().filter(|n| !n.wells.is_empty());
    let wells = field.map(|n| n.tanks.as_slice()).unwrap_or_default();
    for t in std::iter::once(&s.source)
        .chain((!closed).then_some(&s.destination))
        .chain(wells)
    {
        let level = v(t.level.value, Measure::Length);
        let pressure = match t.surface_pressure {
            SurfacePressure::Gauge(p) => v(p.value, Measure::GaugePressure),
            SurfacePressure::Absolute(p) => v(p.value, Measure::AbsolutePressure),
        };
        let mut fields = vec![
            Node::leaf("level", level.clone()),
            Node::leaf("pressure", pressure),
        ];
        // A well's drawdown test (issue 12), only where the design states one.
        if let Some(d) = t.drawdown {
            fields.push(Node::leaf("drawdown", v(d.value, Measure::Length)));
        }
        if let Some(q) = t.test_flow {
            fields.push(Node::leaf("test_flow", v(q.value, Measure::Flow)));
        }
        if let Some(w) = t.well_loss {
            fields.push(Node::leaf("well_loss", v(w.value, Measure::Length)));
        }
        // A closed loop's reference (issue 12), only where the design states it.
        let r = &t.reference;
        if let Some(p) = r.max_pressure {
            fields.push(Node::leaf(
                "max_pressure",
                v(p.value, Measure::GaugePressure),
            ));
        }
        if let Some(z) = r.high_point {
            fields.push(Node::leaf("high_point", v(z.value, Measure::Length)));
        }
        if let Some(p) = r.high_point_pressure {
            fields.push(Node::leaf(
                "high_point_pressure",
                v(p.value, Measure::GaugePressure),
            ));
        }
        if r.on_discharge.is_some() {
            fields.push(Node::leaf("connects", "discharge"));
        }
        out.push(Node::group(
            format!("tank {}", t.name),
            format!("level {level}"),
            fields,
        ));
    }
    match field {
        Some(n) => out.extend(n.wells.iter().map(|w| well_pump(w, units))),
        None => out.push(Node::group(
            "station",
            "",
            vec![Node::leaf(
                "centreline",
                v(s.centreline.value, Measure::Length),
            )],
        )),
    }
    for l in s.lines.iter() {
        out.push(line(l, units));
    }
    out.push(Node::leaf("roughness", s.pipe_condition.keyword()));
    out.push(Node::leaf(
        "hours",
        v(s.hours_per_year.value, Measure::Hours),
    ));
    if speeds {
        for (pump, speed) in &s.pump_speeds {
            let mut fields = vec![Node::leaf("speed", v(speed.value, Measure::Speed))];
            // Pumps running (issue 12), only where a case runs fewer than the set has.
            if let Some((_, count, _, running)) = s.pump_running.iter().find(|r| &r.0 == pump) {
                if running < count {
                    fields.push(Node::leaf("running", running.to_string()));
                }
            }
            out.push(Node::group(format!("pump {pump}"), "", fields));
        }
    }
    out
}

/// A well pump of a well field: its ends, setting, whether it runs, and its suction and
/// discharge runs as lines.
fn well_pump(w: &crate::model::network::WellPump, units: ReportUnits) -> Node {
    let run = |side: Side, what: &str, segments: &[Segment]| Line {
        name: format!("{} {what}", w.name),
        side,
        from: w.well.clone(),
        to: w.to.clone(),
        segments: segments.to_vec(),
        profile: None,
        closure_time: None,
        restraint: Default::default(),
        per_pump: false,
        span: w.span,
    };
    let mut children = vec![
        Node::leaf("from", w.well.clone()),
        Node::leaf("to", w.to.clone()),
        Node::leaf("elevation", show(w.elevation.value, Measure::Length, units)),
    ];
    if !w.running {
        children.push(Node::leaf("running", "0"));
    }
    children.push(line(&run(Side::Suction, "suction", &w.suction), units));
    children.push(line(
        &run(Side::Discharge, "discharge", &w.discharge),
        units,
    ));
    let summary = format!("from {} to {}", w.well, w.to);
    Node::group(format!("wellpump {}", w.name), summary, children)
}

fn line(l: &Line, units: ReportUnits) -> Node {
    let v = |si: f64, m: Measure| show(si, m, units);
    let mut children = vec![
        Node::leaf("from", l.from.clone()),
        Node::leaf("to", l.to.clone()),
    ];
    for (i, s) in l.segments.iter().enumerate() {
        let length = v(s.length.value, Measure::Length);
        let mut seg = vec![
            Node::leaf("material", s.material.keyword()),
            Node::leaf("size", s.size_label.clone()),
            Node::leaf(
                "inner_diameter",
                v(s.inner_diameter.value, Measure::Diameter),
            ),
            Node::leaf("length", length.clone()),
        ];
        if let Some(r) = s.roughness {
            seg.push(Node::leaf("roughness", v(r.value, Measure::Diameter)));
        }
        if let Some(c) = s.hazen_williams_c {
            seg.push(Node::leaf("hazen_williams_c", number(c)));
        }
        seg.extend(wall_fields(&s.wall, units));
        for f in &s.fittings {
            let mut fields = vec![Node::leaf("count", f.count.to_string())];
            let mut summary = format!("× {}", f.count);
            if let Some(r) = f.rating {
                let r = v(r.value, Measure::GaugePressure);
                fields.push(Node::leaf("rating", r.clone()));
                summary.push_str(&format!(", rating {r}"));
            }
            if let Some(b) = f.beta {
                fields.push(Node::leaf("beta", number(b)));
                summary.push_str(&format!(", beta {}", number(b)));
            }
            if let Some(a) = f.angle_rad {
                let deg = number(a.to_degrees());
                summary.push_str(&format!(", angle {deg} deg"));
                fields.push(Node::leaf("angle", format!("{deg} deg")));
            }
            seg.push(Node::group(
                format!("fitting {}", f.spec.name),
                summary,
                fields,
            ));
        }
        for x in &s.losses {
            let (field, value) = match (x.k, x.equivalent_length) {
                (Some(k), _) => ("k", number(k)),
                (None, Some(le)) => ("equivalent_length", v(le.value, Measure::Length)),
                (None, None) => ("k", "none".to_string()),
            };
            seg.push(
                Node::group(
                    format!("loss {:?}", x.why),
                    format!("{field} = {value}"),
                    vec![Node::leaf(field, value)],
                )
                .keyed(format!("loss\u{0}{}", x.why)),
            );
        }
        let summary = format!("{} {}, {length}", s.material.keyword(), s.size_label);
        children.push(Node::group(format!("segment {}", i + 1), summary, seg));
    }
    children.extend(line_safety_fields(l, units));
    let summary = format!("from {} to {}", l.from, l.to);
    Node::group(format!("line {}", l.name), summary, children)
}

/// The safety-screen inputs of a line (issue 14), only where the design gives them.
fn line_safety_fields(l: &Line, units: ReportUnits) -> Vec<Node> {
    let v = |si: f64, m: Measure| show(si, m, units);
    let mut out = Vec::new();
    if let Some(p) = &l.profile {
        let points: Vec<Node> = p
            .points
            .iter()
            .enumerate()
            .map(|(i, (x, z))| {
                Node::leaf(
                    format!("point {}", i + 1),
                    format!(
                        "chainage {}, elevation {}",
                        v(x.value, Measure::Length),
                        v(z.value, Measure::Length)
                    ),
                )
            })
            .collect();
        let summary = format!("{} points, {}", p.points.len(), p.source);
        out.push(Node::group("profile", summary, points));
    }
    if let Some(t) = l.closure_time {
        out.push(Node::leaf("closure_time", format!("{} s", number(t.value))));
    }
    if l.restraint != crate::model::Restraint::default() {
        out.push(Node::leaf("restraint", l.restraint.keyword()));
    }
    if l.per_pump {
        out.push(Node::leaf("serves", "each_pump"));
    }
    out
}

/// The wall fields of a pipe the design states (issue 14).
fn wall_fields(w: &crate::model::WallData, units: ReportUnits) -> Vec<Node> {
    let v = |si: f64, m: Measure| show(si, m, units);
    let mut out = Vec::new();
    if let Some(t) = w.thickness {
        out.push(Node::leaf("wall", v(t.value, Measure::Diameter)));
    }
    if let Some(r) = w.rating {
        out.push(Node::leaf("rating", v(r.value, Measure::GaugePressure)));
    }
    if let Some(m) = w.modulus {
        out.push(Node::leaf("modulus", v(m.value, Measure::Pressure)));
    }
    if let Some(c) = w.corrosion_allowance {
        out.push(Node::leaf(
            "corrosion_allowance",
            v(c.value, Measure::Diameter),
        ));
    }
    if w.threaded {
        out.push(Node::leaf("joints", "threaded"));
    }
    if let Some(f) = w.flanges {
        out.push(Node::leaf("flanges", f.description()));
    }
    if w.m11 {
        out.push(Node::leaf("rating_basis", "AWWA M11"));
    }
    if let Some(y) = w.yield_strength {
        out.push(Node::leaf("yield_strength", v(y.value, Measure::Pressure)));
    }
    if let Some(z) = w.start_elevation {
        out.push(Node::leaf("start_elevation", v(z.value, Measure::Length)));
    }
    if let Some(z) = w.end_elevation {
        out.push(Node::leaf("end_elevation", v(z.value, Measure::Length)));
    }
    out
}

/// A case by its effect: the values that differ from the base design.
fn case(c: &Case, base: &Scenario, units: ReportUnits) -> Node {
    let reference = leaves(&scenario(base, units, true));
    let effect: Vec<_> = leaves(&scenario(&c.scenario, units, true))
        .into_iter()
        .filter(|(keys, _, value)| !reference.iter().any(|(k, _, v)| k == keys && v == value))
        .collect();
    let written: Vec<String> = c
        .overrides
        .iter()
        .map(|o| o.split_whitespace().collect::<Vec<_>>().join(" "))
        .collect();
    let summary = if written.is_empty() {
        "no overrides".to_string()
    } else {
        written.join(", ")
    };
    Node::group(format!("case {}", c.name), summary, from_leaves(&effect))
}

fn requirement(r: &Requirement, units: ReportUnits) -> Node {
    let mut cases = r.cases.clone();
    cases.sort();
    cases.dedup();
    let mut label = r.metric.keyword().to_string();
    if !cases.is_empty() {
        label.push_str(" for ");
        label.push_str(&cases.join(", "));
    }
    let measure = match r.metric {
        Metric::Flow => Some(Measure::Flow),
        Metric::Head | Metric::NpshExcess => Some(Measure::Length),
        Metric::NpshMargin => None,
        Metric::Efficiency => Some(Measure::Percent),
        Metric::SuctionVelocity | Metric::DischargeVelocity => Some(Measure::Velocity),
        Metric::ShaftPower => Some(Measure::Power),
    };
    let limit = match measure {
        Some(m) => show(r.limit_si, m, units),
        None => number(r.limit_si),
    };
    let op = if r.at_least { ">=" } else { "<=" };
    Node::leaf(label, format!("{op} {limit}"))
}

fn pump(p: &PumpCandidate, units: ReportUnits) -> Node {
    let v = |si: f64, m: Measure| show(si, m, units);
    let mut fields = vec![
        Node::leaf("description", p.description.clone()),
        Node::leaf("speed", v(p.rated_speed.value, Measure::Speed)),
        Node::leaf(
            "arrangement",
            match p.arrangement {
                ArrangementKind::Single => "single",
                ArrangementKind::Parallel => "parallel",
                ArrangementKind::Series => "series",
            },
        ),
        Node::leaf("count", p.count.to_string()),
        Node::leaf("standby", p.standby.to_string()),
        Node::leaf(
            "impeller",
            p.impeller.map_or("largest published".to_string(), |d| {
                v(d.value, Measure::Diameter)
            }),
        ),
        Node::leaf(
            "adjust",
            match p.adjust {
                Adjust::None => "none".to_string(),
                Adjust::Speed {
                    min_ratio,
                    max_ratio,
                } => format!(
                    "speed {}–{}",
                    v(min_ratio, Measure::Percent),
                    v(max_ratio, Measure::Percent)
                ),
                Adjust::Trim { min_ratio } => {
                    format!("trim down to {}", v(min_ratio, Measure::Percent))
                }
            },
        ),
    ];
    for c in &p.curves {
        fields.push(curve(c, units));
    }
    Node::group(
        format!("pump {}", p.name),
        format!("{:?}", p.description),
        fields,
    )
}

fn curve(c: &CurveData, units: ReportUnits) -> Node {
    let v = |si: f64, m: Measure| show(si, m, units);
    let speed = v(c.speed.value, Measure::Speed);
    let label = match c.impeller {
        Some(d) => format!("curve impeller {}", v(d.value, Measure::Diameter)),
        None => format!("curve speed {speed}"),
    };
    let mut fields = vec![
        Node::leaf("speed", speed),
        Node::leaf("points", c.flow.len().to_string()),
    ];
    for (i, q) in c.flow.iter().enumerate() {
        let mut point = vec![Node::leaf("flow", v(q.value, Measure::Flow))];
        if let Some(h) = c.head.get(i) {
            point.push(Node::leaf("head", v(h.value, Measure::Length)));
        }
        if let Some(Some(e)) = c.efficiency.get(i) {
            point.push(Node::leaf("efficiency", v(e.value, Measure::Percent)));
        }
        if let Some(Some(n)) = c.npshr.get(i) {
            point.push(Node::leaf("npshr", v(n.value, Measure::Length)));
        }
        if let Some(Some(p)) = c.shaft_power.get(i) {
            point.push(Node::leaf("power", v(p.value, Measure::Power)));
        }
        let summary: Vec<String> = point
            .iter()
            .map(|n| format!("{} {}", n.label, n.describe()))
            .collect();
        fields.push(Node::group(
            format!("point {}", i + 1),
            summary.join(", "),
            point,
        ));
    }
    let range = match (c.flow.first(), c.flow.last()) {
        (Some(a), Some(b)) => format!(
            ", {}–{}",
            number(super::values::convert(a.value, Measure::Flow, units)),
            v(b.value, Measure::Flow)
        ),
        _ => String::new(),
    };
    Node::group(label, format!("{} points{range}", c.flow.len()), fields)
}
