//! The network stage: nodes, links and the global gradient solve of their heads and
//! flows for one case.
//!
//! A network is a graph of **nodes** (fixed-head nodes: free surfaces; junctions with
//! an elevation and a demand drawn off) and **links** between two nodes, each with a
//! head-loss law ([`elements`]): pipe runs, pump sets, equipment, valves, optionally
//! with a check valve that closes against reverse flow. [`solve`] finds the heads and
//! flows by the global gradient algorithm of Todini and Pilati (1988) in
//! [`gradient`], with the sparse positive-definite solve of [`sparse`].
//!
//! Units: SI throughout (m, m³/s, Pa, kg/m³).

pub mod checks;
pub mod elements;
pub mod field;
pub mod gradient;
pub mod sparse;
pub mod station;
pub mod topology;
pub mod valves;

pub use elements::{Characteristic, Element, Equipment, HeadCurve, PipeRun, PumpSet, Valve};
pub use gradient::{solve, solve_prepared, Prepared, Settings};

use crate::analysis::system::{FluidState, G};

/// Largest number of nodes or links a network may have (a cap for untrusted designs).
pub const MAX_ELEMENTS: usize = 100_000;

/// What a node is.
#[derive(Clone, Copy, Debug, PartialEq)]
pub enum NodeKind {
    /// A free surface at a known level with a pressure on it: its head is fixed.
    FixedHead {
        /// Surface level, m.
        level: f64,
        /// Gauge pressure on the surface, Pa.
        surface_pressure: f64,
    },
    /// A junction at an elevation drawing a demand off the network.
    Junction {
        /// Demand drawn off, m³/s (negative: an inflow).
        demand: f64,
    },
}

/// One node.
#[derive(Clone, Debug, PartialEq)]
pub struct Node {
    /// The node's name in the design.
    pub name: String,
    /// Whether the node has a fixed head or is a junction with a demand.
    pub kind: NodeKind,
    /// Elevation, m (for a free surface: its level).
    pub elevation: f64,
    /// The residual (gauge) pressure the node must keep, Pa, when stated.
    pub required_pressure: Option<f64>,
    /// The word for the node in the results: `tank`, `junction`, `delivery`...
    pub word: &'static str,
}

/// One link from `from` to `to` (node indices); flow is positive from → to.
#[derive(Clone, Debug)]
pub struct Link {
    /// The link's name in the design.
    pub name: String,
    /// Index of the upstream node in `Network::nodes`.
    pub from: usize,
    /// Index of the downstream node in `Network::nodes`.
    pub to: usize,
    /// What the link is: pipe run, pump set, equipment or valve.
    pub element: Element,
    /// A check valve in the link: no flow to → from.
    pub check: bool,
}

/// A network for one case: its fluid, nodes and links.
#[derive(Clone, Debug)]
pub struct Network {
    /// The liquid's properties in this case.
    pub fluid: FluidState,
    /// The nodes; links refer to them by index.
    pub nodes: Vec<Node>,
    /// The links.
    pub links: Vec<Link>,
}

impl Network {
    /// The fixed head of a node, m (level + surface pressure head), if it has one.
    pub fn fixed_head(&self, node: usize) -> Option<f64> {
        match self.nodes[node].kind {
            NodeKind::FixedHead {
                level,
                surface_pressure,
            } => Some(level + surface_pressure / (self.fluid.density * G)),
            NodeKind::Junction { .. } => None,
        }
    }
}

/// Why a network could not be solved.
#[derive(Clone, Debug, PartialEq)]
pub enum NetworkError {
    /// The network has too many nodes or links, or its factor too much fill.
    TooLarge(String),
    /// A link names a node that does not exist, or joins a node to itself.
    BadLink(String),
    /// A part of the network reaches no fixed-head node: its heads are undetermined.
    Disconnected {
        /// The nodes of that part, by name (at most a few).
        nodes: Vec<String>,
    },
    /// The iterations did not converge; the node whose head moved most is named.
    NotConverged {
        /// Newton iterations used: the limit in full steps, then as many halved
        /// (`gradient::Steps`), so twice the limit.
        iterations: usize,
        /// The node whose head moved most in the last iteration.
        worst_node: String,
        /// Its last head change, m.
        head_change: f64,
    },
    /// A junction with a demand is cut off from every tank by closed links.
    Unsupplied {
        /// The unsupplied junction, by name.
        node: String,
    },
    /// Check valves kept opening and closing.
    StatusCycling {
        /// The link with the cycling check valve, by name.
        link: String,
    },
    /// A value became non-finite (never printed; reported as this error).
    NonFinite {
        /// The link whose head loss became non-finite, by name.
        link: String,
    },
}

impl std::fmt::Display for NetworkError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        match self {
            NetworkError::TooLarge(m) | NetworkError::BadLink(m) => f.write_str(m),
            NetworkError::Disconnected { nodes } => write!(
                f,
                "node{} {} reach{} no tank or reservoir through the links: their heads are undetermined",
                if nodes.len() == 1 { "" } else { "s" },
                nodes.join(", "),
                if nodes.len() == 1 { "es" } else { "" },
            ),
            NetworkError::NotConverged { iterations, worst_node, head_change } => write!(
                f,
                "the network solve did not converge in {iterations} iterations; the head at node {worst_node} still moved {head_change:.3e} m in the last one"
            ),
            NetworkError::Unsupplied { node } => write!(
                f,
                "node {node} draws a demand but every path to a tank passes a closed valve or a stopped pump"
            ),
            NetworkError::StatusCycling { link } => write!(
                f,
                "the check valve on link {link} kept opening and closing: the network has no steady state with it"
            ),
            NetworkError::NonFinite { link } => write!(
                f,
                "the head loss of link {link} could not be evaluated (a non-finite value)"
            ),
        }
    }
}

/// The solved state of one link.
#[derive(Clone, Debug, PartialEq)]
pub struct LinkState {
    /// Flow, m³/s, positive from → to.
    pub flow: f64,
    /// H(from) − H(to), m (negative across a pump delivering forward).
    pub head_loss: f64,
    /// Largest mean velocity along a pipe run, m/s (`None` for other links).
    pub velocity: Option<f64>,
    /// True when a check valve or a shut valve or stopped pump holds the flow at zero.
    pub closed: bool,
}

/// The solved state of one node.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct NodeState {
    /// Piezometric head, m.
    pub head: f64,
    /// Gauge pressure ρg(H − z), Pa.
    pub pressure: f64,
}

/// A solved network.
#[derive(Clone, Debug, PartialEq)]
pub struct Solution {
    /// The solved state of each node, in `Network::nodes` order.
    pub nodes: Vec<NodeState>,
    /// The solved state of each link, in `Network::links` order.
    pub links: Vec<LinkState>,
    /// Newton iterations used (all status rounds together).
    pub iterations: usize,
}
