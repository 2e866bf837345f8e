//! A well field: several wells, each with its own pump, into one collector network,
//! solved as one network (issue 12, engine part).
//!
//! The candidate pump is installed at every well (identical pumps; the wells and their
//! piping differ, so the flows differ). Each well becomes four nodes and four links of
//! the network: its static water surface (a fixed head), the **drawdown** link to its
//! pumping level ([`Element::Drawdown`], s = B·Q + C·Q², Jacob 1947), the **suction**
//! run from the pumping level to the pump (intake screen, bowl, suction pipe; may be
//! empty), the **pump** as a head-gain link from its curve at speed and trim, and the
//! **discharge** run (column pipe, check valve, connection) to its node of the collector.
//! The global gradient solve ([`super::solve`]) gives every pump's flow and head at
//! once; there is no single station flow and no system curve to meet.
//!
//! NPSH available per pump is from its own well: the absolute pressure head at the pump
//! suction less the vapour-pressure head, NPSHa = p_b/(ρg) + (H_s − z_p) − p_v/(ρg),
//! where H_s is the solved head at the pump suction (static level − drawdown − suction
//! losses) and z_p the pump's elevation (ANSI/HI 9.6.1; Karassik et al., *Pump
//! Handbook*, 4th ed., 2008, ch. 2), the velocity head left out as in the chain.
//!
//! A design states a field with `wellpump` links; [`crate::analysis::well_field`]
//! builds the wells from it and evaluates every candidate (DEVELOPERS.md, "Well fields").

use std::sync::Arc;

use super::{
    solve, Element, HeadCurve, Link, Network, NetworkError, Node, NodeKind, PipeRun, PumpSet,
    Settings,
};
use crate::analysis::system::{WellDrawdown, G};

/// One well of the field with its own pump and piping.
#[derive(Clone, Debug)]
pub struct FieldWell {
    /// The well's name.
    pub name: String,
    /// Static water level, m (datum of the network).
    pub static_level: f64,
    /// Gauge pressure on the well's water surface, Pa (0 for a well open to the air).
    pub surface_pressure: f64,
    /// The well's drawdown law.
    pub drawdown: WellDrawdown,
    /// Elevation of the pump (its suction datum), m.
    pub pump_elevation: f64,
    /// From the pumping level to the pump suction (may have no segments).
    pub suction: PipeRun,
    /// From the pump discharge to the collector node.
    pub discharge: PipeRun,
    /// Index of the collector node it discharges into, in the collector's `nodes`.
    pub collector_node: usize,
}

/// One pump of the field at its solved duty.
#[derive(Clone, Debug, PartialEq)]
pub struct FieldPump {
    /// The well's name.
    pub well: String,
    /// Flow through the pump, m³/s.
    pub flow: f64,
    /// Head the pump adds, m.
    pub head: f64,
    /// The well's pumping level (static level − drawdown), m.
    pub pumping_level: f64,
    /// Drawdown at the pump's flow, m.
    pub drawdown: f64,
    /// NPSH available at the pump, m.
    pub npsh_available: f64,
    /// True when the pump is held at zero flow (its check valve closed).
    pub closed: bool,
}

/// The field solved: each pump's duty, the total flow and the collector's solution.
#[derive(Clone, Debug, PartialEq)]
pub struct FieldSolution {
    /// Each well's pump, in the order of the wells.
    pub pumps: Vec<FieldPump>,
    /// Sum of the pumps' flows, m³/s.
    pub total_flow: f64,
    /// The whole network's solution (collector nodes first, in their order).
    pub network: super::Solution,
}

/// Solve a well field: `collector` holds the main, its tanks and demands; every well
/// adds its nodes and links after them, with `curve` the candidate pump's head curve
/// at its speed and impeller. `barometric_pa` is the site's barometric pressure, Pa.
pub fn solve_field(
    collector: &Network,
    wells: &[FieldWell],
    curve: Arc<dyn HeadCurve>,
    barometric_pa: f64,
) -> Result<FieldSolution, NetworkError> {
    let set = PumpSet {
        curve,
        parallel: 1,
        series: 1,
    };
    solve_field_set(collector, wells, &set, barometric_pa)
}

/// [`solve_field`] with the candidate as arranged at every well: `set` is the pump set
/// (its curve, pumps in parallel and in series) installed in each well.
pub fn solve_field_set(
    collector: &Network,
    wells: &[FieldWell],
    set: &PumpSet,
    barometric_pa: f64,
) -> Result<FieldSolution, NetworkError> {
    let net = field_network_set(collector, wells, set)?;
    let sol = solve(&net, &Settings::default())?;
    let rho_g = net.fluid.density * G;
    let base_nodes = collector.nodes.len();
    let base_links = collector.links.len();
    let pumps = wells
        .iter()
        .enumerate()
        .map(|(i, w)| {
            // Nodes per well: surface, pumping level, suction, discharge.
            let suction = base_nodes + 4 * i + 2;
            let pump_link = base_links + 4 * i + 2;
            let flow = sol.links[pump_link].flow;
            let drawdown = w.drawdown.at(flow.max(0.0));
            let h_s = sol.nodes[suction].head;
            FieldPump {
                well: w.name.clone(),
                flow,
                head: -sol.links[pump_link].head_loss,
                pumping_level: w.static_level - drawdown,
                drawdown,
                npsh_available: barometric_pa / rho_g + (h_s - w.pump_elevation)
                    - net.fluid.vapor_pressure.pa() / rho_g,
                closed: sol.links[pump_link].closed,
            }
        })
        .collect::<Vec<_>>();
    let total_flow = pumps.iter().map(|p| p.flow).sum();
    Ok(FieldSolution {
        pumps,
        total_flow,
        network: sol,
    })
}

/// The collector with every well's nodes and links appended (see the module's doc),
/// one pump at each well.
pub fn field_network(
    collector: &Network,
    wells: &[FieldWell],
    curve: Arc<dyn HeadCurve>,
) -> Result<Network, NetworkError> {
    let set = PumpSet {
        curve,
        parallel: 1,
        series: 1,
    };
    field_network_set(collector, wells, &set)
}

/// [`field_network`] with the pump set `set` at every well.
pub fn field_network_set(
    collector: &Network,
    wells: &[FieldWell],
    set: &PumpSet,
) -> Result<Network, NetworkError> {
    let mut net = collector.clone();
    for w in wells {
        if w.collector_node >= collector.nodes.len() {
            return Err(NetworkError::BadLink(format!(
                "well {} discharges into a node the collector does not have",
                w.name
            )));
        }
        let first = net.nodes.len();
        let node = |suffix: &str, elevation: f64, kind: NodeKind, word: &'static str| Node {
            name: format!("{} {suffix}", w.name),
            kind,
            elevation,
            required_pressure: None,
            word,
        };
        let junction = NodeKind::Junction { demand: 0.0 };
        net.nodes.push(node(
            "static level",
            w.static_level,
            NodeKind::FixedHead {
                level: w.static_level,
                surface_pressure: w.surface_pressure,
            },
            "tank",
        ));
        net.nodes
            .push(node("pumping level", w.static_level, junction, "junction"));
        net.nodes
            .push(node("pump suction", w.pump_elevation, junction, "junction"));
        net.nodes.push(node(
            "pump discharge",
            w.pump_elevation,
            junction,
            "junction",
        ));
        let link = |suffix: &str, from: usize, to: usize, element: Element, check: bool| Link {
            name: format!("{} {suffix}", w.name),
            from,
            to,
            element,
            check,
        };
        net.links.push(link(
            "drawdown",
            first,
            first + 1,
            Element::Drawdown(w.drawdown),
            false,
        ));
        net.links.push(link(
            "suction",
            first + 1,
            first + 2,
            Element::Pipe(w.suction.clone()),
            false,
        ));
        net.links.push(link(
            "pump",
            first + 2,
            first + 3,
            Element::Pump(set.clone()),
            // A well pump has a check valve (common practice): no backflow into a well.
            true,
        ));
        net.links.push(link(
            "discharge",
            first + 3,
            w.collector_node,
            Element::Pipe(w.discharge.clone()),
            false,
        ));
    }
    Ok(net)
}
