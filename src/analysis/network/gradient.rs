//! The global gradient algorithm (Todini, E. and Pilati, S., "A gradient algorithm for
//! the analysis of pipe networks", in *Computer Applications in Water Supply*, vol. 1,
//! Research Studies Press, 1988, pp. 1–20).
//!
//! Unknowns: the heads H of the junctions and the flows Q of the links. Each link k
//! obeys h_k(Q_k) = H_from − H_to; each junction i balances Σ_in Q − Σ_out Q = d_i.
//! Newton's method on both, with D_k = dh_k/dQ_k, eliminates the flows: with
//! c_k = 1/D_k and y_k = Q_k − h_k/D_k, the new heads solve the weighted Laplacian
//!
//! (Σ_k∋i c_k)·H_i − Σ_k∋i c_k·H_other = Σ_in y_k − Σ_out y_k − d_i  (+ c_k·H_fixed terms)
//!
//! which is symmetric positive definite when every part of the network reaches a fixed
//! head; then Q_k = y_k + c_k·(H_from − H_to). The flows therefore balance at every
//! junction after every iteration (to the rounding of the solve); the iterations drive
//! the head-loss residual h_k(Q_k) − (H_from − H_to) to zero.
//!
//! **Check valves** (status switching): a link with a check valve that carries reverse
//! flow is closed (flow held at zero); a closed one opens again when the heads would drive
//! forward flow through it, H_from − H_to > h_k(0⁺). Each status change restarts the
//! Newton iterations; the number of status rounds and of iterations is bounded.

use super::sparse::{Matrix, Pattern, SparseError};
use super::{topology, LinkState, Network, NetworkError, NodeKind, NodeState, Solution};
use crate::analysis::system::G;

/// Iteration limits and tolerances of the solve.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Settings {
    /// Newton iterations per status round.
    pub max_iterations: usize,
    /// Status rounds (check valves opening or closing).
    pub max_status_rounds: usize,
    /// Converged when every link's head residual |h(Q) − ΔH| is below this, m ...
    pub head_tolerance: f64,
    /// ... and every head moved less than this in the last iteration, m.
    pub head_change_tolerance: f64,
}

impl Default for Settings {
    fn default() -> Self {
        Settings {
            max_iterations: 100,
            max_status_rounds: 20,
            head_tolerance: 1e-8,
            head_change_tolerance: 1e-8,
        }
    }
}

/// Solve a network's heads and flows (see the module documentation).
pub fn solve(net: &Network, settings: &Settings) -> Result<Solution, NetworkError> {
    solve_prepared(net, &Prepared::new(net)?, settings)
}

/// What a solve needs from the network's topology alone: the graph checked, the junction
/// numbering and the sparse ordering. Prepare once and solve many times while only
/// demands, levels and element data change (a case's system curve).
#[derive(Clone, Debug)]
pub struct Prepared {
    unknowns: Unknowns,
    pattern: Pattern,
    /// Per link: where its off-diagonal entry is kept ([`Pattern::slot`]), `None` for a
    /// link to a fixed head.
    slots: Vec<Option<usize>>,
}

impl Prepared {
    /// Check the graph and order the matrix (see [`super::sparse`]).
    pub fn new(net: &Network) -> Result<Prepared, NetworkError> {
        topology::check(net)?;
        let unknowns = Unknowns::new(net);
        let pairs: Vec<(usize, usize)> = net
            .links
            .iter()
            .filter_map(|l| match (unknowns.index[l.from], unknowns.index[l.to]) {
                (Some(a), Some(b)) => Some((a, b)),
                _ => None,
            })
            .collect();
        let pattern = Pattern::new(unknowns.count, &pairs).map_err(|_| {
            NetworkError::TooLarge("the network's sparse factor would be too large".into())
        })?;
        let slots = net
            .links
            .iter()
            .map(|l| match (unknowns.index[l.from], unknowns.index[l.to]) {
                (Some(a), Some(b)) => pattern.slot(a, b),
                _ => None,
            })
            .collect();
        Ok(Prepared {
            unknowns,
            pattern,
            slots,
        })
    }
}

/// Solve with a [`Prepared`] topology; the network must have the nodes, links and
/// fixed-head nodes it was prepared with.
pub fn solve_prepared(
    net: &Network,
    prepared: &Prepared,
    settings: &Settings,
) -> Result<Solution, NetworkError> {
    let unknowns = &prepared.unknowns;
    if unknowns.index.len() != net.nodes.len() || prepared.slots.len() != net.links.len() {
        return Err(NetworkError::BadLink(
            "the network changed since it was prepared".into(),
        ));
    }
    let mut state = State::start(net, unknowns);
    let mut iterations = 0;
    for _ in 0..settings.max_status_rounds {
        iterations += newton(net, prepared, &mut state, settings)?;
        if !update_status(net, &mut state) {
            return Ok(state.finish(net, iterations));
        }
    }
    let link = (0..net.links.len())
        .find(|&k| net.links[k].check)
        .map(|k| net.links[k].name.clone())
        .unwrap_or_default();
    Err(NetworkError::StatusCycling { link })
}

/// Numbering of the junction heads as unknowns.
#[derive(Clone, Debug)]
struct Unknowns {
    /// Per node: its unknown index, `None` for a fixed head.
    index: Vec<Option<usize>>,
    count: usize,
}

impl Unknowns {
    fn new(net: &Network) -> Unknowns {
        let mut count = 0;
        let index = (0..net.nodes.len())
            .map(|i| match net.nodes[i].kind {
                NodeKind::FixedHead { .. } => None,
                NodeKind::Junction { .. } => {
                    count += 1;
                    Some(count - 1)
                }
            })
            .collect();
        Unknowns { index, count }
    }
}

/// The iterate: heads of every node, flows and open/closed status of every link.
struct State {
    heads: Vec<f64>,
    flows: Vec<f64>,
    closed: Vec<bool>,
}

impl State {
    fn start(net: &Network, unknowns: &Unknowns) -> State {
        // Junction heads start at the mean fixed head; links at a velocity near 1 m/s in
        // a 0.1 m bore (any positive start converges; this one is of the usual size).
        let fixed: Vec<f64> = (0..net.nodes.len())
            .filter_map(|i| net.fixed_head(i))
            .collect();
        let mean = fixed.iter().sum::<f64>() / fixed.len().max(1) as f64;
        let heads = (0..net.nodes.len())
            .map(|i| net.fixed_head(i).unwrap_or(mean))
            .collect();
        let _ = unknowns;
        State {
            heads,
            flows: vec![0.008; net.links.len()],
            closed: net.links.iter().map(|l| l.element.is_shut()).collect(),
        }
    }

    fn finish(self, net: &Network, iterations: usize) -> Solution {
        let rho_g = net.fluid.density * G;
        // The status is final, so the live set is the one of the last Newton round.
        let live = Live::new(net, &self.closed).ok();
        let carries = |k: usize| live.as_ref().map(|l| l.links[k]).unwrap_or(!self.closed[k]);
        let nodes = net
            .nodes
            .iter()
            .zip(&self.heads)
            .map(|(n, &h)| NodeState {
                head: h,
                pressure: match n.kind {
                    NodeKind::FixedHead {
                        surface_pressure, ..
                    } => surface_pressure,
                    NodeKind::Junction { .. } => rho_g * (h - n.elevation),
                },
            })
            .collect();
        let links = net
            .links
            .iter()
            .enumerate()
            .map(|(k, l)| LinkState {
                flow: self.flows[k],
                head_loss: self.heads[l.from] - self.heads[l.to],
                velocity: match &l.element {
                    super::Element::Pipe(run) => run
                        .segments
                        .iter()
                        .map(|s| self.flows[k].abs() / s.area)
                        .reduce(f64::max),
                    _ => None,
                },
                closed: !carries(k),
            })
            .collect();
        Solution {
            nodes,
            links,
            iterations,
        }
    }
}

/// Newton iterations at fixed link status; returns the number used.
///
/// Full Newton steps first. Where they have not converged within the limit, the
/// iterations go on from where they stopped, settling ([`Steps::Settling`]); a network
/// that converges by full steps never settles, so its heads and flows are the full
/// steps' to the bit. Seen on random networks (tests/network_properties.rs): heads
/// moving about 7e-8 m to and fro at every full step (a link law whose slope jumps, at
/// the critical-zone bridge or the zero-flow chord, so the steps straddle the kink),
/// and heads of 3 000 m behind a nearly shut valve whose 1/slope spans seven decades,
/// where the rounding of the solve alone moves them 1e-6 m while every link's law holds
/// to 1e-12 m.
fn newton(
    net: &Network,
    prepared: &Prepared,
    state: &mut State,
    settings: &Settings,
) -> Result<usize, NetworkError> {
    let limit = settings.max_iterations;
    match newton_steps(net, prepared, state, settings, Steps::Full) {
        // The limit reached (not a solve that gave non-finite heads, which settling
        // would only repeat): settle from there.
        Err(NetworkError::NotConverged { iterations, .. }) if iterations == limit => {
            match newton_steps(net, prepared, state, settings, Steps::Settling) {
                Ok(more) => Ok(limit + more),
                Err(NetworkError::NotConverged {
                    iterations,
                    worst_node,
                    head_change,
                }) if iterations == limit => Err(NetworkError::NotConverged {
                    iterations: 2 * limit,
                    worst_node,
                    head_change,
                }),
                other => other,
            }
        }
        done => done,
    }
}

/// How the Newton iterations step and when they stop.
#[derive(Clone, Copy, PartialEq)]
enum Steps {
    /// Full steps; stop when every head moved less than `head_change_tolerance`.
    Full,
    /// Each step halved (damped Newton: Deuflhard, *Newton Methods for Nonlinear
    /// Problems*, Springer, 2004, ch. 3), which settles a cycle across a kink; stop when
    /// every head moved less than `head_change_tolerance` times the largest head (at
    /// least 1 m), the rounding of heads of any size.
    Settling,
}

/// Newton iterations at fixed link status, stepping and stopping as `steps` says;
/// returns the number used.
fn newton_steps(
    net: &Network,
    prepared: &Prepared,
    state: &mut State,
    settings: &Settings,
    steps: Steps,
) -> Result<usize, NetworkError> {
    let live = Live::new(net, &state.closed)?;
    let mut worst = (0usize, f64::INFINITY);
    for iteration in 1..=settings.max_iterations + 1 {
        // The law at the current flows gives both the residual of the last update and
        // the next linearisation, so each link's law is evaluated once per iteration.
        let (c, y, residual) = linearise(net, state, &live)?;
        let change_tolerance = match steps {
            Steps::Full => settings.head_change_tolerance,
            Steps::Settling => {
                let largest = state.heads.iter().fold(1.0f64, |a, h| a.max(h.abs()));
                settings.head_change_tolerance * largest
            }
        };
        if worst.1 < change_tolerance && residual < settings.head_tolerance {
            return Ok(iteration - 1);
        }
        if iteration > settings.max_iterations {
            break;
        }
        let full = solve_heads(net, prepared, &c, &y, &live, &state.heads)?;
        // A part of the step: the full step's flows balance at every junction, as did
        // the last ones, so flows between them balance too.
        let step = |old: f64, new: f64| match steps {
            Steps::Full => new,
            Steps::Settling => old + 0.5 * (new - old),
        };
        for (k, l) in net.links.iter().enumerate() {
            let q = match live.links[k] {
                false => 0.0,
                true => y[k] + c[k] * (full[l.from] - full[l.to]),
            };
            state.flows[k] = step(state.flows[k], q);
        }
        worst = (0, 0.0);
        for (i, h) in full.into_iter().enumerate() {
            let new = step(state.heads[i], h);
            let change = (new - state.heads[i]).abs();
            if change > worst.1 {
                worst = (i, change);
            }
            state.heads[i] = new;
        }
    }
    Err(NetworkError::NotConverged {
        iterations: settings.max_iterations,
        worst_node: net.nodes[worst.0].name.clone(),
        head_change: worst.1,
    })
}

/// Per link c_k = 1/D_k and y_k = Q_k − h_k/D_k at the current flows, and the largest
/// head residual |h_k(Q_k) − (H_from − H_to)| over the live links, m.
fn linearise(
    net: &Network,
    state: &State,
    live: &Live,
) -> Result<(Vec<f64>, Vec<f64>, f64), NetworkError> {
    let mut c = Vec::with_capacity(net.links.len());
    let mut y = Vec::with_capacity(net.links.len());
    let mut residual: f64 = 0.0;
    for (k, l) in net.links.iter().enumerate() {
        if !live.links[k] {
            c.push(0.0);
            y.push(0.0);
            continue;
        }
        let q = state.flows[k];
        let (h, slope) = l.element.law(&net.fluid, q);
        if !(h.is_finite() && slope.is_finite() && slope > 0.0) {
            return Err(NetworkError::NonFinite {
                link: l.name.clone(),
            });
        }
        residual = residual.max((h - (state.heads[l.from] - state.heads[l.to])).abs());
        c.push(1.0 / slope);
        y.push(q - h / slope);
    }
    Ok((c, y, residual))
}

/// Assemble and solve the weighted Laplacian for the heads of all nodes.
fn solve_heads(
    net: &Network,
    prepared: &Prepared,
    c: &[f64],
    y: &[f64],
    live: &Live,
    heads: &[f64],
) -> Result<Vec<f64>, NetworkError> {
    let unknowns = &prepared.unknowns;
    let mut m = Matrix::zeros(&prepared.pattern);
    let mut rhs = vec![0.0; unknowns.count];
    for (i, n) in net.nodes.iter().enumerate() {
        match (unknowns.index[i], n.kind) {
            // A dead node keeps the head of its live neighbours across the closed links.
            (Some(u), _) if live.dead[i] => {
                m.add_diagonal(u, 1.0);
                rhs[u] = live.anchor(net, i, heads);
            }
            (Some(u), NodeKind::Junction { demand }) => rhs[u] -= demand,
            _ => {}
        }
    }
    for (k, l) in net.links.iter().enumerate() {
        if !live.links[k] {
            continue;
        }
        let (a, b) = (unknowns.index[l.from], unknowns.index[l.to]);
        if let Some(a) = a {
            m.add_diagonal(a, c[k]);
            rhs[a] -= y[k];
        }
        if let Some(b) = b {
            m.add_diagonal(b, c[k]);
            rhs[b] += y[k];
        }
        match (a, b) {
            (Some(a), Some(b)) => match prepared.slots[k] {
                Some(slot) => m.add_at(slot, -c[k]),
                None => m.add_off_diagonal(a, b, -c[k]),
            },
            (Some(a), None) => rhs[a] += c[k] * net.fixed_head(l.to).unwrap_or(0.0),
            (None, Some(b)) => rhs[b] += c[k] * net.fixed_head(l.from).unwrap_or(0.0),
            (None, None) => {}
        }
    }
    let x = m.solve(&rhs).map_err(|e| match e {
        SparseError::TooLarge => NetworkError::TooLarge("the network is too large".into()),
        SparseError::NotPositiveDefinite(u) => {
            let node = unknowns
                .index
                .iter()
                .position(|&v| v == Some(u))
                .unwrap_or(0);
            NetworkError::Disconnected {
                nodes: vec![net.nodes[node].name.clone()],
            }
        }
    })?;
    let heads: Vec<f64> = (0..net.nodes.len())
        .map(|i| match unknowns.index[i] {
            Some(u) => x[u],
            None => net.fixed_head(i).unwrap_or(0.0),
        })
        .collect();
    if let Some(i) = heads.iter().position(|h| !h.is_finite()) {
        return Err(NetworkError::NotConverged {
            iterations: 0,
            worst_node: net.nodes[i].name.clone(),
            head_change: f64::INFINITY,
        });
    }
    Ok(heads)
}

/// Open or close check valves; true when any status changed.
fn update_status(net: &Network, state: &mut State) -> bool {
    let mut changed = false;
    for (k, l) in net.links.iter().enumerate() {
        if !l.check || l.element.is_shut() {
            continue;
        }
        if !state.closed[k] && state.flows[k] < 0.0 {
            state.closed[k] = true;
            state.flows[k] = 0.0;
            changed = true;
        } else if state.closed[k] {
            let drive = state.heads[l.from] - state.heads[l.to];
            let (h0, _) = l.element.law(&net.fluid, 0.0);
            if drive > h0 + 1e-9 {
                state.closed[k] = false;
                state.flows[k] = 1e-6;
                changed = true;
            }
        }
    }
    changed
}

/// Which links carry flow and which nodes are cut off, at a fixed link status: a node is
/// dead when every path from it to a fixed head passes a closed link; links touching a
/// dead node carry nothing and are left out of the matrix.
struct Live {
    links: Vec<bool>,
    dead: Vec<bool>,
}

impl Live {
    fn new(net: &Network, closed: &[bool]) -> Result<Live, NetworkError> {
        let n = net.nodes.len();
        // The open links' adjacency in one flat array (counting sort by node): no list
        // per node to allocate.
        let open = || {
            net.links
                .iter()
                .zip(closed)
                .filter(|(_, &c)| !c)
                .map(|(l, _)| l)
        };
        let mut start = vec![0usize; n + 1];
        for l in open() {
            start[l.from + 1] += 1;
            start[l.to + 1] += 1;
        }
        for i in 0..n {
            start[i + 1] += start[i];
        }
        let mut next = start.clone();
        let mut adjacency = vec![0usize; start[n]];
        for l in open() {
            adjacency[next[l.from]] = l.to;
            next[l.from] += 1;
            adjacency[next[l.to]] = l.from;
            next[l.to] += 1;
        }
        let mut reached: Vec<bool> = (0..n).map(|i| net.fixed_head(i).is_some()).collect();
        let mut stack: Vec<usize> = (0..n).filter(|&i| reached[i]).collect();
        while let Some(i) = stack.pop() {
            for &j in &adjacency[start[i]..start[i + 1]] {
                if !reached[j] {
                    reached[j] = true;
                    stack.push(j);
                }
            }
        }
        let dead: Vec<bool> = reached.iter().map(|r| !r).collect();
        for (i, node) in net.nodes.iter().enumerate() {
            if let (true, NodeKind::Junction { demand }) = (dead[i], node.kind) {
                if demand != 0.0 {
                    return Err(NetworkError::Unsupplied {
                        node: node.name.clone(),
                    });
                }
            }
        }
        let links = net
            .links
            .iter()
            .enumerate()
            .map(|(k, l)| !closed[k] && !dead[l.from] && !dead[l.to])
            .collect();
        Ok(Live { links, dead })
    }

    /// The head a dead node is shown at: the highest head of a live node joined to it by
    /// a closed link (the trapped pressure is not determined by a steady solve), else
    /// its previous head.
    fn anchor(&self, net: &Network, node: usize, heads: &[f64]) -> f64 {
        net.links
            .iter()
            .filter_map(|l| match (l.from == node, l.to == node) {
                (true, _) if !self.dead[l.to] => Some(heads[l.to]),
                (_, true) if !self.dead[l.from] => Some(heads[l.from]),
                _ => None,
            })
            .reduce(f64::max)
            .unwrap_or(heads[node])
    }
}
