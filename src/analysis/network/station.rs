//! The network a station feeds, for one case: built from the design's
//! [`NetworkLayout`], solved at any station flow, and summarised at a duty point.
//!
//! The station's flow Q enters at the entry node (where the discharge lines end); the
//! demands are the case's; the downstream tanks float on the network and take or give
//! the rest, so the split between destinations is a result of each solve. The head the
//! station must supply at Q is then H_entry(Q) plus the chain's losses to the entry node
//! ([`crate::analysis::CaseSystem::head`]): the station's system curve.
//!
//! **A network without a downstream tank** (demands only, [`DemandPattern`]) has nothing
//! to float on: at a station flow Q the case's demands are scaled by Q / D (D their sum
//! at the design, scale 1) so that they draw exactly Q, and the entry head is the
//! smallest that keeps every governing node at its requirement: the head losses from the
//! entry are solved with the entry's head fixed, then every head is raised by
//! max over the governing nodes of (z + p_req/ρg − H). The governing nodes are those
//! with a stated required pressure and those drawing a demand (which must at least be
//! reached at zero gauge pressure). The critical-node rule of the system-head curve of a
//! distribution network (Walski et al., *Advanced Water Distribution Modeling and
//! Management*, 2003, ch. 8, from memory).

use uom::si::{length::meter, pressure::pascal, volume_rate::cubic_meter_per_second};

use super::{
    solve_prepared, Characteristic, Element, Equipment, Link, Network, NetworkError, Node,
    NodeKind, PipeRun, Prepared, Settings, Solution, Valve,
};
use crate::analysis::system::{resolve_segment, FluidState, SystemError, G};
use crate::model::network::{NetLinkKind, NetworkLayout, ValveCharacteristic};
use crate::model::{Scenario, Side, SurfacePressure, Tank};

/// A node is "near vapour pressure" when its absolute pressure is below this multiple
/// of the vapour pressure plus one metre of head (a screening margin, common practice).
pub const NEAR_VAPOUR_HEAD_M: f64 = 3.0;

/// The network downstream of a station in one case, ready to solve at any flow.
#[derive(Clone, Debug)]
pub struct StationNetwork {
    /// The network itself.
    pub network: Network,
    /// Index of the entry node in `network.nodes`.
    pub entry: usize,
    /// The entry node's own demand (m³/s), before the station's inflow is subtracted.
    entry_demand: f64,
    /// Barometric pressure, Pa (for absolute pressures at nodes).
    pub barometric_pa: f64,
    /// The topology prepared once (checks, ordering) for the many solves of a case.
    prepared: Prepared,
    /// Set for a network without a downstream tank: the demands are scaled with the
    /// station's flow and the entry head set by the governing node.
    pub pattern: Option<DemandPattern>,
}

/// A network without a downstream tank: its design demands scale with the station flow.
#[derive(Clone, Debug, PartialEq)]
pub struct DemandPattern {
    /// The design demands' sum D (scale 1), m³/s, the entry node's own included.
    pub design_demand: f64,
}

impl DemandPattern {
    /// The scale Q / D of the design demands that draws a station flow `q` (m³/s).
    pub fn scale(&self, q: f64) -> f64 {
        q / self.design_demand
    }
}

/// A surface pressure as gauge, Pa, at the barometric pressure `barometric` (Pa).
pub(crate) fn gauge(p: SurfacePressure, barometric: f64) -> f64 {
    match p {
        SurfacePressure::Gauge(g) => g.get::<pascal>(),
        SurfacePressure::Absolute(a) => a.get::<pascal>() - barometric,
    }
}

/// A tank as a fixed-head node of the network.
pub(crate) fn tank_node(t: &Tank, barometric: f64) -> Node {
    Node {
        name: t.name.clone(),
        kind: NodeKind::FixedHead {
            level: t.level.get::<meter>(),
            surface_pressure: gauge(t.surface_pressure, barometric),
        },
        elevation: t.level.get::<meter>(),
        required_pressure: None,
        word: "tank",
    }
}

/// The layout's junctions and deliveries as network nodes, in file order.
pub(crate) fn junction_nodes(layout: &NetworkLayout) -> Vec<Node> {
    layout
        .nodes
        .iter()
        .map(|n| Node {
            name: n.name.clone(),
            kind: NodeKind::Junction {
                demand: n.demand.get::<cubic_meter_per_second>(),
            },
            elevation: n.elevation.get::<meter>(),
            required_pressure: n.required_pressure.map(|p| p.get::<pascal>()),
            word: if n.delivery { "delivery" } else { "junction" },
        })
        .collect()
}

impl StationNetwork {
    /// Build the case's network from its scenario.
    pub fn build(
        s: &Scenario,
        layout: &NetworkLayout,
        fluid: &FluidState,
        barometric_pa: f64,
    ) -> Result<StationNetwork, SystemError> {
        let mut nodes = junction_nodes(layout);
        for t in std::iter::once(&s.destination)
            .chain(&layout.tanks)
            .chain(std::iter::once(&s.source))
        {
            if !nodes.iter().any(|n| n.name == t.name) {
                nodes.push(tank_node(t, barometric_pa));
            }
        }
        let at = |name: &str| nodes.iter().position(|n| n.name == name);
        let entry = at(&layout.entry).ok_or_else(|| SystemError {
            message: format!("the network's entry node `{}` is not defined", layout.entry),
        })?;
        let mut links = Vec::with_capacity(layout.links.len());
        for l in &layout.links {
            let (Some(from), Some(to)) = (at(&l.from), at(&l.to)) else {
                return Err(SystemError {
                    message: format!("link `{}` names an unknown node", l.name),
                });
            };
            links.push(Link {
                name: l.name.clone(),
                from,
                to,
                element: element(s, &l.name, &l.kind, fluid)?,
                check: l.check,
            });
        }
        // Tanks no link reaches (the source when the network does not return to it).
        let used: Vec<bool> = (0..nodes.len())
            .map(|i| i == entry || links.iter().any(|l| l.from == i || l.to == i))
            .collect();
        let keep: Vec<usize> = (0..nodes.len()).filter(|&i| used[i]).collect();
        let renumber = |i: usize| keep.iter().position(|&k| k == i).unwrap_or(0);
        for l in &mut links {
            l.from = renumber(l.from);
            l.to = renumber(l.to);
        }
        let entry = renumber(entry);
        let nodes: Vec<Node> = keep.iter().map(|&i| nodes[i].clone()).collect();
        let entry_demand = match nodes[entry].kind {
            NodeKind::Junction { demand } => demand,
            NodeKind::FixedHead { .. } => 0.0,
        };
        let mut network = Network {
            fluid: fluid.clone(),
            nodes,
            links,
        };
        let pattern = demand_pattern(&mut network, entry)?;
        let prepared = Prepared::new(&network).map_err(|e| SystemError {
            message: format!("the network: {e}"),
        })?;
        Ok(StationNetwork {
            prepared,
            network,
            entry,
            entry_demand,
            barometric_pa,
            pattern,
        })
    }

    /// Solve with the station delivering `q` (m³/s) into the entry node.
    pub fn solve_at(&self, q: f64) -> Result<Solution, NetworkError> {
        let Some(pattern) = &self.pattern else {
            let mut net = self.network.clone();
            net.nodes[self.entry].kind = NodeKind::Junction {
                demand: self.entry_demand - q,
            };
            return solve_prepared(&net, &self.prepared, &Settings::default());
        };
        debug_assert!(pattern.design_demand > 0.0);
        let mut sol = self.solve_held(q)?;
        self.raise_to_governing(&mut sol);
        Ok(sol)
    }

    /// A demand-only network solved at station flow `q` (m³/s) with the demands scaled
    /// and the entry head held at the entry's elevation (before the governing rise).
    fn solve_held(&self, q: f64) -> Result<Solution, NetworkError> {
        let mut net = self.network.clone();
        let scale = self.pattern.as_ref().map_or(1.0, |p| p.scale(q));
        for n in &mut net.nodes {
            if let NodeKind::Junction { demand } = &mut n.kind {
                *demand *= scale;
            }
        }
        solve_prepared(&net, &self.prepared, &Settings::default())
    }

    /// Raise every head of a demand-only solve (entry held at its elevation) by the
    /// largest shortfall of a governing node (see the module's doc), and restate the
    /// pressures ρg(H − z).
    fn raise_to_governing(&self, sol: &mut Solution) {
        let net = &self.network;
        let rho_g = net.fluid.density * G;
        let Some((_, shift)) = self.governing(sol) else {
            return;
        };
        for (st, n) in sol.nodes.iter_mut().zip(&net.nodes) {
            st.head += shift;
            st.pressure = rho_g * (st.head - n.elevation);
        }
    }

    /// The governing node of a demand-only solve and its shortfall z + p_req/ρg − H, m:
    /// the largest over the nodes that govern (the first in design order on a tie).
    fn governing(&self, sol: &Solution) -> Option<(usize, f64)> {
        let rho_g = self.network.fluid.density * G;
        self.network
            .nodes
            .iter()
            .enumerate()
            .filter(|(i, n)| self.governs(*i, n))
            .map(|(i, n)| {
                let need = n.elevation + n.required_pressure.unwrap_or(0.0) / rho_g;
                (i, need - sol.nodes[i].head)
            })
            .fold(None, |best: Option<(usize, f64)>, x| match best {
                Some(b) if b.1 >= x.1 => Some(b),
                _ => Some(x),
            })
    }

    /// A demand-only network's governing node at zero station flow (the highest
    /// elevation plus required pressure head), by index; `None` when a tank floats on it.
    pub fn governing_at_zero(&self) -> Option<usize> {
        self.pattern.as_ref()?;
        let sol = self.solve_held(0.0).ok()?;
        self.governing(&sol).map(|(i, _)| i)
    }

    /// Whether node `i` governs a demand-only network's entry head: it states a required
    /// pressure or draws a demand.
    fn governs(&self, i: usize, n: &Node) -> bool {
        let demand = match n.kind {
            _ if i == self.entry => self.entry_demand,
            NodeKind::Junction { demand } => demand,
            NodeKind::FixedHead { .. } => 0.0,
        };
        n.required_pressure.is_some() || demand > 0.0
    }

    /// The demand drawn at node `i` with the station delivering `q` (m³/s): the design
    /// demand, scaled in a network without a downstream tank; 0 for a tank.
    fn demand_at(&self, i: usize, q: f64) -> f64 {
        let scale = self.pattern.as_ref().map_or(1.0, |p| p.scale(q));
        match self.network.nodes[i].kind {
            _ if i == self.entry => self.entry_demand * scale,
            NodeKind::Junction { demand } => demand * scale,
            NodeKind::FixedHead { .. } => 0.0,
        }
    }

    /// Head at the entry node, m, with the station delivering `q` (m³/s).
    pub fn entry_head(&self, q: f64) -> Result<f64, NetworkError> {
        Ok(self.solve_at(q)?.nodes[self.entry].head)
    }
}

/// A design link's element (pipe run, valve, equipment) for the solve.
pub fn element(
    s: &Scenario,
    name: &str,
    kind: &NetLinkKind,
    fluid: &FluidState,
) -> Result<Element, SystemError> {
    Ok(match kind {
        NetLinkKind::Pipe(segments) => Element::Pipe(PipeRun {
            segments: segments
                .iter()
                .enumerate()
                .map(|(i, seg)| resolve_segment(s, name, Side::Discharge, i, seg))
                .collect::<Result<_, _>>()?,
        }),
        NetLinkKind::Valve(v) => Element::Valve(Valve {
            kvs: v.kvs,
            characteristic: match v.characteristic {
                ValveCharacteristic::Linear => Characteristic::Linear,
                ValveCharacteristic::EqualPercentage { rangeability } => {
                    Characteristic::EqualPercentage { rangeability }
                }
            },
            opening: v.opening,
            control: v.control,
        }),
        NetLinkKind::Equipment(q) => Element::Equipment(Equipment {
            rated_drop: q.drop.get::<pascal>() * water_rating_factor(q, fluid),
            rated_flow: q.rated_flow.get::<cubic_meter_per_second>(),
            exponent: q.exponent,
        }),
    })
}

/// The factor restating an equipment drop rated on water for the case's fluid: ρ/ρ_w
/// (ρ_w = 1000 kg/m³, the reference of the flow coefficient Kv, IEC 60534-2-1) — at the
/// same flow in fully turbulent flow Δp = K·ρ·v²/2, so the drop scales with density (the
/// specific-gravity correction; no viscosity correction is applied). 1 when the drop is
/// stated for the design's fluid.
pub fn water_rating_factor(q: &crate::model::network::EquipmentData, fluid: &FluidState) -> f64 {
    if q.rated_on_water {
        fluid.density / super::elements::KV_REFERENCE_DENSITY
    } else {
        1.0
    }
}

/// For a network with no fixed-head node (no tank downstream): hold the entry node's
/// head for the solve (at its elevation; [`StationNetwork::solve_at`] raises it to the
/// governing node) and return the design demand pattern. `None` when a tank floats on
/// the network; an error when the demands of the case sum to zero.
fn demand_pattern(net: &mut Network, entry: usize) -> Result<Option<DemandPattern>, SystemError> {
    if net
        .nodes
        .iter()
        .any(|n| matches!(n.kind, NodeKind::FixedHead { .. }))
    {
        return Ok(None);
    }
    let design_demand: f64 = net
        .nodes
        .iter()
        .map(|n| match n.kind {
            NodeKind::Junction { demand } => demand,
            NodeKind::FixedHead { .. } => 0.0,
        })
        .sum();
    if design_demand.is_nan() || design_demand <= 0.0 || !design_demand.is_finite() {
        return Err(SystemError {
            message: "the network reaches no tank downstream of the station and its demands sum to zero in this case: the station's flow has nowhere to go".into(),
        });
    }
    let n = &mut net.nodes[entry];
    n.kind = NodeKind::FixedHead {
        level: n.elevation,
        surface_pressure: 0.0,
    };
    Ok(Some(DemandPattern { design_demand }))
}

/// One node at a duty point, with the flags a reviewer looks for.
#[derive(Clone, Debug, PartialEq)]
pub struct NodeAtDuty {
    /// The node's name in the design.
    pub name: String,
    /// `tank`, `junction` or `delivery`.
    pub kind: &'static str,
    /// Elevation, m.
    pub elevation: f64,
    /// Piezometric head, m.
    pub head: f64,
    /// Gauge pressure, Pa.
    pub pressure: f64,
    /// Demand drawn off, m³/s (0 for a tank).
    pub demand: f64,
    /// Flow into a tank from the network, m³/s (negative: the tank supplies it).
    pub inflow: Option<f64>,
    /// Required residual gauge pressure, Pa, when stated.
    pub required_pressure: Option<f64>,
    /// Below its required pressure.
    pub below_required: bool,
    /// Below zero gauge pressure.
    pub below_atmospheric: bool,
    /// Absolute pressure within [`NEAR_VAPOUR_HEAD_M`] of vapour pressure.
    pub near_vapour: bool,
}

/// One link at a duty point.
#[derive(Clone, Debug, PartialEq)]
pub struct LinkAtDuty {
    /// The link's name in the design.
    pub name: String,
    /// `pipe`, `valve` or `equipment`.
    pub kind: &'static str,
    /// The upstream node, by name.
    pub from: String,
    /// The downstream node, by name.
    pub to: String,
    /// m³/s, positive from → to.
    pub flow: f64,
    /// Largest velocity along a pipe run, m/s.
    pub velocity: Option<f64>,
    /// H(from) − H(to), m.
    pub head_loss: f64,
    /// Held shut (check valve against reverse flow, shut valve).
    pub closed: bool,
}

/// The network at one duty point.
#[derive(Clone, Debug, PartialEq)]
pub struct NetworkAtDuty {
    /// The station's flow, m³/s.
    pub station_flow: f64,
    /// Every node at the duty.
    pub nodes: Vec<NodeAtDuty>,
    /// Every link at the duty.
    pub links: Vec<LinkAtDuty>,
    /// Newton iterations the solve used.
    pub iterations: usize,
    /// A network without a downstream tank: the scale Q / D of the design demands at
    /// this duty (dimensionless); `None` when a tank floats on the network.
    pub demand_scale: Option<f64>,
}

impl StationNetwork {
    /// The network at a station flow, with flags (see [`NodeAtDuty`]).
    pub fn at_duty(&self, q: f64) -> Result<NetworkAtDuty, NetworkError> {
        let sol = self.solve_at(q)?;
        let net = &self.network;
        let rho_g = net.fluid.density * G;
        // A demand-only network's governing node sits at its required pressure by
        // construction: a micrometre of head absorbs the rounding of the rise.
        let slack = if self.pattern.is_some() {
            1e-6 * rho_g
        } else {
            0.0
        };
        let nodes = net
            .nodes
            .iter()
            .enumerate()
            .map(|(i, n)| {
                let st = sol.nodes[i];
                let fixed = matches!(n.kind, NodeKind::FixedHead { .. })
                    && !(self.pattern.is_some() && i == self.entry);
                let inflow = fixed.then(|| {
                    net.links
                        .iter()
                        .enumerate()
                        .map(|(k, l)| {
                            let f = sol.links[k].flow;
                            if l.to == i {
                                f
                            } else if l.from == i {
                                -f
                            } else {
                                0.0
                            }
                        })
                        .sum()
                });
                let absolute = st.pressure + self.barometric_pa;
                let demand = self.demand_at(i, q);
                NodeAtDuty {
                    name: n.name.clone(),
                    kind: n.word,
                    elevation: n.elevation,
                    head: st.head,
                    pressure: st.pressure,
                    demand,
                    inflow,
                    required_pressure: n.required_pressure,
                    below_required: n.required_pressure.is_some_and(|r| st.pressure < r - slack),
                    below_atmospheric: !fixed && st.pressure < 0.0,
                    near_vapour: !fixed
                        && absolute < net.fluid.vapor_pressure.pa() + NEAR_VAPOUR_HEAD_M * rho_g,
                }
            })
            .collect();
        let links = net
            .links
            .iter()
            .enumerate()
            .map(|(k, l)| LinkAtDuty {
                name: l.name.clone(),
                kind: l.element.kind(),
                from: net.nodes[l.from].name.clone(),
                to: net.nodes[l.to].name.clone(),
                // A flow at rounding level is shown as zero (never "-0").
                flow: if sol.links[k].flow.abs() < 1e-12 {
                    0.0
                } else {
                    sol.links[k].flow
                },
                velocity: sol.links[k]
                    .velocity
                    .map(|v| if v < 1e-12 { 0.0 } else { v }),
                head_loss: sol.links[k].head_loss,
                closed: sol.links[k].closed,
            })
            .collect();
        Ok(NetworkAtDuty {
            station_flow: q,
            nodes,
            links,
            iterations: sol.iterations,
            demand_scale: self.pattern.as_ref().map(|p| p.scale(q)),
        })
    }
}
