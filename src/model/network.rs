//! The general form of a design: the network the station's discharge lines feed.
//!
//! A single chain (suction lines, the pump, discharge lines into one tank) has no
//! network. When the discharge lines end at a `junction` or `delivery` node instead of
//! a tank, the design has a [`NetworkLayout`]: nodes (junctions, delivery points and the
//! tanks downstream) and links (pipe `line`s between nodes, `valve`s, `equipment`)
//! solved for heads and flows at every station flow.
//!
//! The setters here are shared by the blocks and the case overrides, so a case may
//! change a demand, a required pressure or a valve opening with the same checks.

use uom::si::f64::{Length, Pressure, VolumeRate};
use uom::si::length::meter;
use uom::si::pressure::pascal;
use uom::si::volume_rate::cubic_meter_per_second;

use super::design::{Segment, Tank};
use super::eval::{expect_dim, expect_number, expect_word, Env};
use super::ranges;
use crate::diagnostics::{Code, Diagnostic, Span};
use crate::syntax::ast::Expr;
use crate::units::{Dimension, QuantityKind};

/// One US gallon per minute in m³/s (NIST SP 811 Appendix B: 1 gal = 3.785411784 L).
const GPM_M3_S: f64 = 3.785_411_784e-3 / 60.0;
/// Cv per Kv (common practice, 1.156).
pub const CV_PER_KV: f64 = 1.156;

/// The network downstream of the station.
#[derive(Clone, Debug)]
pub struct NetworkLayout {
    /// The node the discharge lines end at, where the station's flow enters.
    pub entry: String,
    /// Junctions and delivery points, in file order.
    pub nodes: Vec<NetNode>,
    /// The tanks the links reach other than the scenario's source and destination.
    pub tanks: Vec<Tank>,
    /// Links in file order.
    pub links: Vec<NetLink>,
    /// The well pumps of a well field (`wellpump NAME from WELL to NODE`), in file
    /// order; empty for a station design.
    pub wells: Vec<WellPump>,
}

/// One well pump of a well field: the candidate pump set in its well, with its own
/// suction and discharge piping (grammar/LANGUAGE.md, "Well fields").
#[derive(Clone, Debug)]
pub struct WellPump {
    /// The well pump's name.
    pub name: String,
    /// The tank (well, or a sump without `drawdown`) it draws from.
    pub well: String,
    /// The collector node (or tank) its discharge ends at.
    pub to: String,
    /// The pump's setting: the elevation of its suction (bowl) in the design's datum.
    pub elevation: Length,
    /// From the pumping level to the pump (`suction { ... }`; may be empty).
    pub suction: Vec<Segment>,
    /// From the pump to `to`: column pipe, check valve, connection (may be empty).
    pub discharge: Vec<Segment>,
    /// Whether the pump runs in this case (`NAME.running = 0` stops it).
    pub running: bool,
    /// Where the well pump is written.
    pub span: Span,
}

/// Fields of a `wellpump` block (besides its pipes, fittings, losses and `suction`).
pub const WELLPUMP_FIELDS: &[&str] = &["elevation"];

/// A junction or a delivery point.
#[derive(Clone, Debug)]
pub struct NetNode {
    /// The node's name.
    pub name: String,
    /// A delivery point (a demand with a required residual pressure) rather than a junction.
    pub delivery: bool,
    /// Elevation of the node in the design's datum.
    pub elevation: Length,
    /// Flow drawn off the network here.
    pub demand: VolumeRate,
    /// The residual gauge pressure the node must keep, when stated.
    pub required_pressure: Option<Pressure>,
    /// Where the node is written.
    pub span: Span,
}

/// A link between two nodes of the network.
#[derive(Clone, Debug)]
pub struct NetLink {
    /// The link's name.
    pub name: String,
    /// The upstream node, by name.
    pub from: String,
    /// The downstream node, by name.
    pub to: String,
    /// What the link is: pipe run, valve or equipment.
    pub kind: NetLinkKind,
    /// A check valve in the link (a `check_valve...` fitting on a line): no reverse flow.
    pub check: bool,
    /// Where the link is written.
    pub span: Span,
}

/// What a link is.
#[derive(Clone, Debug)]
pub enum NetLinkKind {
    /// A pipe run: segments in series with their fittings.
    Pipe(Vec<Segment>),
    /// A valve by flow coefficient.
    Valve(ValveData),
    /// An equipment item with a drop at a rated flow.
    Equipment(EquipmentData),
}

impl NetLinkKind {
    /// The word for the link's kind.
    pub fn word(&self) -> &'static str {
        match self {
            NetLinkKind::Pipe(_) => "line",
            NetLinkKind::Valve(_) => "valve",
            NetLinkKind::Equipment(_) => "equipment",
        }
    }
}

/// A valve by flow coefficient.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct ValveData {
    /// Kv of the fully open valve, m³/h at 1 bar (a `cvs` is converted, Kv = Cv/1.156).
    pub kvs: f64,
    /// The valve's inherent characteristic.
    pub characteristic: ValveCharacteristic,
    /// Opening, 0..=1.
    pub opening: f64,
    /// `kind = control`: a control valve, whose authority is checked; `balancing`
    /// (the default) is a set-and-leave valve, checked for its opening only.
    pub control: bool,
}

/// The inherent characteristic of a valve.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum ValveCharacteristic {
    /// Kv = x·Kvs.
    Linear,
    /// Kv = Kvs·R^(x−1), R the rangeability.
    EqualPercentage {
        /// Rangeability R (dimensionless).
        rangeability: f64,
    },
}

/// Equipment given by its pressure drop at a rated flow.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct EquipmentData {
    /// Pressure drop across the item at the rated flow.
    pub drop: Pressure,
    /// The flow at which the drop is stated.
    pub rated_flow: VolumeRate,
    /// Exponent n of Δp ∝ Qⁿ (2 unless stated).
    pub exponent: f64,
    /// `rated_on = water`: the drop is the maker's rating on water, restated for the
    /// design's fluid (`false`: the drop is for the design's fluid, the default).
    pub rated_on_water: bool,
}

/// Fields of `junction` and `delivery` blocks.
pub const NODE_FIELDS: &[&str] = &["elevation", "demand", "pressure"];
/// Fields of a `valve` block.
pub const VALVE_FIELDS: &[&str] = &[
    "kvs",
    "cvs",
    "characteristic",
    "opening",
    "rangeability",
    "kind",
];
/// Fields of an `equipment` block.
pub const EQUIPMENT_FIELDS: &[&str] = &["drop", "rated_flow", "exponent", "rated_on"];

fn out_of_range(what: &str, why: &str, span: Span) -> Diagnostic {
    Diagnostic::error(Code::OutOfRange, format!("{what} {why}"), Some(span))
        .with_label(why.to_string())
}

/// Set a field of a junction or delivery point.
pub fn set_node(node: &mut NetNode, field: &str, e: &Expr, env: &Env) -> Result<(), Diagnostic> {
    match field {
        "elevation" => {
            let z = expect_dim(e, env, Dimension::LENGTH, "node elevation")?.si;
            node.elevation = Length::new::<meter>(env.in_range(&ranges::LEVEL, z, e.span)?);
        }
        "demand" => {
            let q = expect_dim(e, env, Dimension::VOLUME_RATE, "demand")?.si;
            if !(q.is_finite() && q >= 0.0) {
                return Err(out_of_range("a demand", "must not be negative", e.span));
            }
            node.demand = VolumeRate::new::<cubic_meter_per_second>(q);
        }
        "pressure" => {
            let p = expect_dim(e, env, Dimension::PRESSURE, "required residual pressure")?;
            if p.kind == QuantityKind::AbsolutePressure {
                return Err(Diagnostic::error(
                    Code::UnitMismatch,
                    "a required residual pressure is a gauge pressure",
                    Some(e.span),
                )
                .with_help("write it as `40 psi`, `40 psig` or `280 kPa(g)`"));
            }
            let v = env.in_range(&ranges::GAUGE_PRESSURE, p.si, e.span)?;
            node.required_pressure = Some(Pressure::new::<pascal>(v));
        }
        other => return Err(unknown_field("a node", other, e.span)),
    }
    Ok(())
}

/// Set a field of a valve.
pub fn set_valve(v: &mut ValveData, field: &str, e: &Expr, env: &Env) -> Result<(), Diagnostic> {
    match field {
        "kvs" | "cvs" => {
            // Kv is m³/h at 1 bar and Cv US gal/min at 1 psi: written as a flow.
            let q = expect_dim(e, env, Dimension::VOLUME_RATE, "flow coefficient")?.si;
            if !(q.is_finite() && q > 0.0) {
                return Err(out_of_range(
                    "a flow coefficient",
                    "must be greater than zero",
                    e.span,
                ));
            }
            v.kvs = if field == "kvs" {
                q * 3600.0
            } else {
                q / GPM_M3_S / CV_PER_KV
            };
        }
        "characteristic" => {
            let word = expect_word(
                e,
                env,
                "valve characteristic",
                &["linear", "equal_percentage"],
            )?;
            v.characteristic = match word.as_str() {
                "linear" => ValveCharacteristic::Linear,
                _ => ValveCharacteristic::EqualPercentage {
                    rangeability: match v.characteristic {
                        ValveCharacteristic::EqualPercentage { rangeability } => rangeability,
                        ValveCharacteristic::Linear => 50.0,
                    },
                },
            };
        }
        "rangeability" => {
            let r = expect_number(e, env, "rangeability")?;
            if !(r.is_finite() && r > 1.0 && r <= 1000.0) {
                return Err(out_of_range(
                    "a rangeability",
                    "must be above 1 and at most 1000",
                    e.span,
                ));
            }
            if let ValveCharacteristic::EqualPercentage { rangeability } = &mut v.characteristic {
                *rangeability = r;
            }
        }
        "opening" => {
            let x = expect_number(e, env, "valve opening")?;
            if !(x.is_finite() && (0.0..=1.0).contains(&x)) {
                return Err(out_of_range(
                    "a valve opening",
                    "must lie between 0 % and 100 %",
                    e.span,
                ));
            }
            v.opening = x;
        }
        "kind" => {
            let word = expect_word(e, env, "valve kind", &["control", "balancing"])?;
            v.control = word == "control";
        }
        other => return Err(unknown_field("a valve", other, e.span)),
    }
    Ok(())
}

/// Set a field of an equipment item.
pub fn set_equipment(
    q: &mut EquipmentData,
    field: &str,
    e: &Expr,
    env: &Env,
) -> Result<(), Diagnostic> {
    match field {
        "drop" => {
            let p = expect_dim(e, env, Dimension::PRESSURE, "pressure drop")?.si;
            if !(p.is_finite() && p > 0.0 && p < 1e8) {
                return Err(out_of_range(
                    "a pressure drop",
                    "must be above zero and below 100 MPa",
                    e.span,
                ));
            }
            q.drop = Pressure::new::<pascal>(p);
        }
        "rated_flow" => {
            let v = expect_dim(e, env, Dimension::VOLUME_RATE, "rated flow")?.si;
            if !(v.is_finite() && v > 0.0) {
                return Err(out_of_range(
                    "a rated flow",
                    "must be greater than zero",
                    e.span,
                ));
            }
            q.rated_flow = VolumeRate::new::<cubic_meter_per_second>(v);
        }
        "exponent" => {
            let n = expect_number(e, env, "exponent")?;
            if !(n.is_finite() && (1.0..=2.5).contains(&n)) {
                return Err(out_of_range(
                    "an exponent of Δp ∝ Qⁿ",
                    "must lie between 1 and 2.5",
                    e.span,
                ));
            }
            q.exponent = n;
        }
        "rated_on" => {
            let w = expect_word(e, env, "rating fluid", &["water", "fluid"])?;
            q.rated_on_water = w == "water";
        }
        other => return Err(unknown_field("equipment", other, e.span)),
    }
    Ok(())
}

/// A case override of a well pump: `NAME.running = 0` (stopped) or `1` (running),
/// `NAME.elevation` (its setting).
fn set_well_pump(w: &mut WellPump, field: &str, e: &Expr, env: &Env) -> Result<(), Diagnostic> {
    match field {
        "running" => {
            let n = expect_number(e, env, "well pump running")?;
            if n != 0.0 && n != 1.0 {
                return Err(out_of_range(
                    "a well pump's `running`",
                    "must be 0 (stopped) or 1 (running)",
                    e.span,
                ));
            }
            w.running = n == 1.0;
        }
        "elevation" => {
            let z = expect_dim(e, env, Dimension::LENGTH, "well pump elevation")?.si;
            w.elevation = Length::new::<meter>(env.in_range(&ranges::LEVEL, z, e.span)?);
        }
        other => {
            return Err(Diagnostic::error(
                Code::UnknownPath,
                format!("a case cannot set `{other}` of well pump `{}`", w.name),
                Some(e.span),
            )
            .with_help("a case may set a well pump's `running` (0 or 1) or `elevation`"))
        }
    }
    Ok(())
}

fn unknown_field(what: &str, field: &str, span: Span) -> Diagnostic {
    Diagnostic::error(
        Code::UnknownField,
        format!("{what} has no field `{field}`"),
        Some(span),
    )
}

impl NetworkLayout {
    /// True when a node, network tank or link has this name.
    pub fn has(&self, name: &str) -> bool {
        self.nodes.iter().any(|n| n.name == name)
            || self.tanks.iter().any(|t| t.name == name)
            || self.links.iter().any(|l| l.name == name)
            || self.wells.iter().any(|w| w.name == name)
    }

    /// Apply a case override `NAME.field = value` to a node, valve, equipment or
    /// network tank; `None` when the name is none of them.
    pub fn apply_override(
        &mut self,
        name: &str,
        field: &str,
        e: &Expr,
        env: &Env,
    ) -> Option<Result<(), Diagnostic>> {
        if let Some(n) = self.nodes.iter_mut().find(|n| n.name == name) {
            if !NODE_FIELDS.contains(&field) {
                return Some(Err(unknown_field("a node", field, e.span)));
            }
            return Some(set_node(n, field, e, env));
        }
        if let Some(t) = self.tanks.iter_mut().find(|t| t.name == name) {
            return Some(super::scenario::set_tank(t, field, e, env));
        }
        if let Some(w) = self.wells.iter_mut().find(|w| w.name == name) {
            return Some(set_well_pump(w, field, e, env));
        }
        let link = self.links.iter_mut().find(|l| l.name == name)?;
        Some(match &mut link.kind {
            NetLinkKind::Valve(v) if field == "opening" => set_valve(v, field, e, env),
            NetLinkKind::Equipment(q) if EQUIPMENT_FIELDS.contains(&field) => {
                set_equipment(q, field, e, env)
            }
            _ => Err(Diagnostic::error(
                Code::UnknownPath,
                format!("a case cannot set `{field}` of {} `{name}`", link.kind.word()),
                Some(e.span),
            )
            .with_help("a case may set a valve's `opening`, an equipment's fields, a node's `demand` or `pressure`")),
        })
    }
}

/// What a node requirement constrains.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum NodeQuantity {
    /// `pressure at NODE`: the node's gauge pressure at each duty, Pa.
    Pressure,
    /// `flow at TANK`: the flow into a downstream tank at each duty, m³/s.
    Flow,
}

/// A requirement at a network node: `pressure at NODE >= 35 psi [for CASE, ...]`.
#[derive(Clone, Debug)]
pub struct NodeRequirement {
    /// Whether the requirement is on pressure or on flow.
    pub quantity: NodeQuantity,
    /// The node (or tank, for flow) the requirement is at, by name.
    pub node: String,
    /// True for `>=` (a lower limit), false for `<=` (an upper limit).
    pub at_least: bool,
    /// SI value (Pa gauge, m³/s).
    pub limit_si: f64,
    /// As written, for messages.
    pub text: String,
    /// Cases it applies to; empty means every case.
    pub cases: Vec<String>,
    /// Where the requirement is written.
    pub span: Span,
}
