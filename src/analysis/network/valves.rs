//! The valve checks at each duty: every valve's opening, and every control valve's
//! authority.
//!
//! - **Opening**: a valve set below about 10 % open controls coarsely (a small stroke
//!   changes the flow much; the seat wears and may cavitate), above about 90 % it has no
//!   margin left to open (common practice). A shut valve (0 %) isolates and is not checked.
//! - **Authority** of a `kind = control` valve: N = Δp₁₀₀ / (Δp₁₀₀ + Δp_rest), where Δp₁₀₀
//!   is the drop of the fully open valve at the valve's flow at the duty,
//!   Δp₁₀₀ = (ρ/ρ₀)·(Q/Kvs)² (Δp in bar, Q in m³/h; IEC 60534-2-1 with N₁ = 1, from memory),
//!   and Δp_rest the drop across the rest of the valve's branch at the same duty: the
//!   frictional and equipment drops, ρ·g·Σ h_loss, of the links in series with the valve,
//!   found by walking from the valve's end nodes through junctions that draw no demand and
//!   join exactly two links, up to a tank, a demand, a branching node, the station's entry
//!   or a pump. About 0.5 is the usual design aim; below 0.25 the valve controls poorly
//!   (common practice).

use super::elements::{Element, Valve, KV_REFERENCE_DENSITY};
use super::station::{LinkAtDuty, NetworkAtDuty, StationNetwork};
use super::{Network, NodeKind};
use crate::analysis::checks::{Check, Status};
use crate::analysis::limits::{self, CheckId};
use crate::analysis::system::G;
use crate::message::{Message, Part};

/// The valve checks at one duty: an opening check per open valve and an authority
/// check per open control valve.
pub fn valve_checks(net: &StationNetwork, at: &NetworkAtDuty) -> Vec<Check> {
    valve_checks_in(&net.network, net.entry, at)
}

/// [`valve_checks`] on any solved network with the node where the walk of a valve's
/// branch stops as the station's entry (a well field: its first well pump's node).
pub fn valve_checks_in(network: &Network, entry: usize, at: &NetworkAtDuty) -> Vec<Check> {
    let mut out = Vec::new();
    for (k, l) in network.links.iter().enumerate() {
        let Element::Valve(v) = &l.element else {
            continue;
        };
        if v.opening <= 0.0 {
            continue;
        }
        out.push(opening_check(&l.name, v));
        if v.control {
            if let Some(n) = authority(network, entry, &at.links, k, v) {
                out.push(authority_check(&l.name, n));
            }
        }
    }
    out
}

fn opening_check(name: &str, v: &Valve) -> Check {
    let (lo, hi) = (limits::VALVE_OPENING_LOW, limits::VALVE_OPENING_HIGH);
    let x = v.opening;
    let (status, limit, verdict) = if x < lo.value {
        (Status::Warn, lo, "below")
    } else if x > hi.value {
        (Status::Warn, hi, "above")
    } else if x - lo.value < hi.value - x {
        (Status::Pass, lo, "within")
    } else {
        (Status::Pass, hi, "within")
    };
    let limit_shown: Message = if status == Status::Pass {
        crate::message![
            Part::PercentAgainst(lo.value, x),
            " to ",
            Part::PercentAgainst(hi.value, x)
        ]
    } else {
        crate::message![Part::PercentAgainst(limit.value, x)]
    };
    let shown = if status == Status::Pass {
        Part::PercentAgainst(x, lo.value)
    } else {
        Part::PercentAgainst(x, limit.value)
    };
    let advice = match status {
        Status::Pass => String::new(),
        _ if verdict == "below" => {
            "; control is coarse near shut: a smaller valve (lower Kvs) would work further open"
                .into()
        }
        _ => "; no margin is left to open: a larger valve (higher Kvs) would leave one".into(),
    };
    Check::typed(
        CheckId::ValveOpening,
        status,
        Some(x),
        Some(limit.value),
        {
            let mut m = crate::message![
                format!("valve {name}: opening "),
                shown,
                format!(" is {verdict} ")
            ];
            m.append(&limit_shown);
            m.push(advice);
            m
        },
        limit.source,
    )
    .about(name.to_string())
}

/// Authority N (dimensionless) of the valve of link `k` at the duty (see the module
/// documentation), `None` without flow through it.
/// `links` are the links at the duty, in the order of `net.links`; `entry` the index of
/// the station's entry node.
pub fn authority(
    net: &Network,
    entry: usize,
    links: &[LinkAtDuty],
    k: usize,
    v: &Valve,
) -> Option<f64> {
    let q_m3h = links.get(k)?.flow.abs() * 3600.0;
    if !(q_m3h > 0.0 && v.kvs > 0.0) {
        return None;
    }
    let sg = net.fluid.density / KV_REFERENCE_DENSITY;
    let dp_open = sg * (q_m3h / v.kvs).powi(2) * 1e5; // Pa
    let rho_g = net.fluid.density * G;
    let rest: f64 = series_links(net, entry, k)
        .into_iter()
        .filter_map(|j| links.get(j))
        .map(|l| rho_g * l.head_loss.abs())
        .sum();
    let n = dp_open / (dp_open + rest);
    n.is_finite().then_some(n)
}

/// The links in series with link `k` (not `k` itself): walked from both of its ends
/// through pass-through junctions (no demand, not the entry, exactly two links), over
/// pipes, valves and equipment only; bounded by the number of links.
pub fn series_links(net: &Network, entry: usize, k: usize) -> Vec<usize> {
    let mut out = Vec::new();
    let start = &net.links[k];
    for first in [start.from, start.to] {
        let (mut node, mut came) = (first, k);
        for _ in 0..net.links.len() {
            if !pass_through(net, entry, node) {
                break;
            }
            let Some(next) = net
                .links
                .iter()
                .enumerate()
                .position(|(j, l)| j != came && (l.from == node || l.to == node))
            else {
                break;
            };
            let l = &net.links[next];
            if next == k || out.contains(&next) || matches!(l.element, Element::Pump(_)) {
                break;
            }
            out.push(next);
            node = if l.from == node { l.to } else { l.from };
            came = next;
        }
    }
    out
}

fn pass_through(net: &Network, entry: usize, node: usize) -> bool {
    let degree = net
        .links
        .iter()
        .filter(|l| l.from == node || l.to == node)
        .count();
    node != entry
        && degree == 2
        && matches!(net.nodes[node].kind, NodeKind::Junction { demand } if demand == 0.0)
}

fn authority_check(name: &str, n: f64) -> Check {
    let limit = limits::VALVE_AUTHORITY;
    let (status, text) = if n < limit.value {
        (
            Status::Warn,
            "below; the valve controls poorly: a smaller valve (lower Kvs) takes a larger share of the drop",
        )
    } else {
        (Status::Pass, "at or above")
    };
    Check::typed(
        CheckId::ValveAuthority,
        status,
        Some(n),
        Some(limit.value),
        crate::message![
            format!("control valve {name}: authority "),
            Part::RatioAgainst(n, limit.value),
            format!(" (fully open valve drop over it plus the rest of its branch) is {text} "),
            Part::RatioAgainst(limit.value, n)
        ],
        limit.source,
    )
    .about(name.to_string())
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::analysis::network::elements::{Characteristic, Equipment};
    use crate::analysis::network::{Link, Node};
    use crate::analysis::system::FluidState;

    fn valve(kvs: f64, opening: f64) -> Valve {
        Valve {
            kvs,
            characteristic: Characteristic::Linear,
            opening,
            control: true,
        }
    }

    fn node(name: &str, demand: f64) -> Node {
        Node {
            name: name.into(),
            kind: NodeKind::Junction { demand },
            elevation: 0.0,
            required_pressure: None,
            word: "junction",
        }
    }

    /// Entry A → control valve → B (no demand) → equipment → C (draws 36 m³/h), water
    /// at ρ = 1000 kg/m³ (SG = 1); the equipment drops exactly 0.3 bar at the duty.
    fn branch(kvs: f64) -> (Network, Vec<LinkAtDuty>) {
        let net = Network {
            fluid: FluidState {
                name: "water".into(),
                temperature_k: Some(293.15),
                density: 1000.0,
                viscosity: 1.0e-3,
                vapor_pressure: crate::hydraulics::heads::AbsolutePressure::new(2339.0),
                source: "test".into(),
            },
            nodes: vec![node("A", 0.0), node("B", 0.0), node("C", 0.01)],
            links: vec![
                Link {
                    name: "cv".into(),
                    from: 0,
                    to: 1,
                    element: Element::Valve(valve(kvs, 1.0)),
                    check: false,
                },
                Link {
                    name: "coil".into(),
                    from: 1,
                    to: 2,
                    element: Element::Equipment(Equipment {
                        rated_drop: 30_000.0,
                        rated_flow: 0.01,
                        exponent: 2.0,
                    }),
                    check: false,
                },
            ],
        };
        let at = |name: &str, kind, head_loss| LinkAtDuty {
            name: String::from(name),
            kind,
            from: String::new(),
            to: String::new(),
            flow: 0.01,
            velocity: None,
            head_loss,
            closed: false,
        };
        // 0.3 bar = 30 000 Pa = ρ·g·h, h = 30 000 / (1000 · 9.80665) m.
        let links = vec![
            at("cv", "valve", 0.0),
            at("coil", "equipment", 30_000.0 / (1000.0 * G)),
        ];
        (net, links)
    }

    #[test]
    fn the_branch_is_the_links_in_series_with_the_valve() {
        let (net, _) = branch(40.0);
        // A is the entry (stop), B passes through to the equipment, C draws a demand.
        assert_eq!(series_links(&net, 0, 0), vec![1]);
    }

    #[test]
    fn a_well_sized_control_valve_has_authority() {
        // Q = 0.01 m³/s = 36 m³/h; Δp₁₀₀ = 1·(36/40)² = 0.81 bar (Δp = SG·(Q/Kv)²);
        // N = 0.81 / (0.81 + 0.30) = 0.7297 ≥ 0.25: pass.
        let (net, links) = branch(40.0);
        let n = authority(&net, 0, &links, 0, &valve(40.0, 1.0)).unwrap();
        assert!((n - 0.81 / 1.11).abs() < 1e-9, "{n}");
        let c = authority_check("cv", n);
        assert_eq!((c.id, c.status), (CheckId::ValveAuthority, Status::Pass));
        assert_eq!(c.limit, Some(0.25));
    }

    #[test]
    fn an_oversized_control_valve_lacks_authority() {
        // Δp₁₀₀ = 1·(36/150)² = 0.0576 bar; N = 0.0576 / (0.0576 + 0.30) = 0.1611 < 0.25:
        // warn.
        let (net, links) = branch(150.0);
        let n = authority(&net, 0, &links, 0, &valve(150.0, 1.0)).unwrap();
        assert!((n - 0.0576 / 0.3576).abs() < 1e-9, "{n}");
        assert_eq!(authority_check("cv", n).status, Status::Warn);
    }

    #[test]
    fn openings_outside_ten_to_ninety_percent_warn() {
        // 10 % and 90 % are the common-practice bounds; 50 % lies between them.
        let pass = opening_check("v", &valve(40.0, 0.50));
        assert_eq!(
            (pass.id, pass.status),
            (CheckId::ValveOpening, Status::Pass)
        );
        let low = opening_check("v", &valve(40.0, 0.05));
        assert_eq!((low.status, low.limit), (Status::Warn, Some(0.10)));
        let high = opening_check("v", &valve(40.0, 0.95));
        assert_eq!((high.status, high.limit), (Status::Warn, Some(0.90)));
        assert!(
            high.source().ends_with("common practice"),
            "{}",
            high.source()
        );
    }
}
