//! Builders shared by the network tests: a fluid, a pipe run of one segment, a
//! quadratic pump curve, and a network from the reference JSON.
#![allow(dead_code)]

use std::sync::Arc;

use dutyline::analysis::network::{
    Element, Equipment, HeadCurve, Link, Network, Node, NodeKind, PipeRun, PumpSet, Valve,
};
use dutyline::analysis::{FluidState, SegmentState};
use dutyline::model::Side;

/// Water-like fluid with the given density (kg/m³) and viscosity (Pa·s).
pub fn fluid(density: f64, viscosity: f64) -> FluidState {
    FluidState {
        name: "water".into(),
        temperature_k: Some(293.15),
        density,
        viscosity,
        vapor_pressure: dutyline::hydraulics::heads::AbsolutePressure::new(2339.0),
        source: "test".into(),
    }
}

/// One Darcy-Weisbach segment (m, m, m) with a stated constant K.
pub fn segment(length: f64, diameter: f64, roughness: f64, k: f64) -> SegmentState {
    SegmentState {
        line: "test".into(),
        side: Side::Discharge,
        index: 0,
        material: "steel",
        size_label: format!("bore {diameter} m"),
        diameter_source: "test".into(),
        length,
        inner_diameter: diameter,
        area: std::f64::consts::PI * diameter * diameter / 4.0,
        roughness,
        roughness_source: "test".into(),
        hazen_williams_c: None,
        fittings: Vec::new(),
        k_constant: k,
        k_laminar_sum: 0.0,
        k_fixed_sum: 0.0,
        equivalent_length: 0.0,
        per_pump: false,
    }
}

/// A pipe-run element of one segment.
pub fn pipe(length: f64, diameter: f64, roughness: f64, k: f64) -> Element {
    Element::Pipe(PipeRun {
        segments: vec![segment(length, diameter, roughness, k)],
    })
}

/// H = h0 − a·Q·|Q| per pump (m, s²/m⁵), published to `max_flow` m³/s.
#[derive(Debug)]
pub struct Quadratic {
    pub h0: f64,
    pub a: f64,
    pub max_flow: f64,
}

impl HeadCurve for Quadratic {
    fn head(&self, q: f64) -> f64 {
        self.h0 - self.a * q * q.abs()
    }
    fn slope(&self, q: f64) -> f64 {
        -2.0 * self.a * q.abs()
    }
    fn max_flow(&self) -> f64 {
        self.max_flow
    }
}

/// A pump set of `parallel` quadratic pumps.
pub fn pumps(h0: f64, a: f64, parallel: u32) -> Element {
    Element::Pump(PumpSet {
        curve: Arc::new(Quadratic {
            h0,
            a,
            max_flow: 1.0,
        }),
        parallel,
        series: 1,
    })
}

/// A fixed-head node.
pub fn tank(name: &str, level: f64) -> Node {
    Node {
        name: name.into(),
        kind: NodeKind::FixedHead {
            level,
            surface_pressure: 0.0,
        },
        elevation: level,
        required_pressure: None,
        word: "tank",
    }
}

/// A junction with a demand (m³/s).
pub fn junction(name: &str, elevation: f64, demand: f64) -> Node {
    Node {
        name: name.into(),
        kind: NodeKind::Junction { demand },
        elevation,
        required_pressure: None,
        word: "junction",
    }
}

/// A link by node names.
pub fn link(net_nodes: &[Node], name: &str, from: &str, to: &str, element: Element) -> Link {
    let at = |n: &str| net_nodes.iter().position(|x| x.name == n).expect(n);
    Link {
        name: name.into(),
        from: at(from),
        to: at(to),
        element,
        check: false,
    }
}

/// Build a network of the reference JSON (tests/reference/network_scipy.json).
pub fn from_reference(v: &serde_json::Value) -> Network {
    let f = &v["fluid"];
    let fl = fluid(
        f["density"].as_f64().unwrap(),
        f["viscosity"].as_f64().unwrap(),
    );
    let nodes: Vec<Node> = v["nodes"]
        .as_array()
        .unwrap()
        .iter()
        .map(|n| {
            let name = n["name"].as_str().unwrap();
            match n["fixed_head_m"].as_f64() {
                Some(h) => tank(name, h),
                None => junction(
                    name,
                    n["elevation_m"].as_f64().unwrap(),
                    n["demand_m3_s"].as_f64().unwrap(),
                ),
            }
        })
        .collect();
    let links = v["links"]
        .as_array()
        .unwrap()
        .iter()
        .map(|l| {
            let num = |k: &str| l[k].as_f64().unwrap();
            let element = match l["kind"].as_str().unwrap() {
                "pipe" => pipe(
                    num("length_m"),
                    num("diameter_m"),
                    num("roughness_m"),
                    num("k"),
                ),
                "pump" => pumps(
                    num("shutoff_m"),
                    num("curve_m_s2_m6"),
                    l["parallel"].as_u64().unwrap() as u32,
                ),
                "valve" => Element::Valve(Valve {
                    kvs: num("kv"),
                    characteristic: dutyline::analysis::network::Characteristic::Linear,
                    opening: 1.0,
                    control: false,
                }),
                "equipment" => Element::Equipment(Equipment {
                    rated_drop: num("rated_drop_pa"),
                    rated_flow: num("rated_flow_m3_s"),
                    exponent: num("exponent"),
                }),
                other => panic!("unknown kind {other}"),
            };
            link(
                &nodes,
                l["name"].as_str().unwrap(),
                l["from"].as_str().unwrap(),
                l["to"].as_str().unwrap(),
                element,
            )
        })
        .collect();
    Network {
        fluid: fl,
        nodes,
        links,
    }
}

/// A w × h looped grid of Colebrook pipes (every 7th link a valve) with a demand at
/// every junction, fed at `feeds` corners from tanks: about 2wh links.
pub fn grid(w: usize, h: usize, feeds: usize) -> Network {
    let mut nodes = Vec::new();
    for r in 0..h {
        for c in 0..w {
            let z = 5.0 * ((r * 7 + c * 3) % 11) as f64 / 11.0;
            nodes.push(junction(&format!("J{r}_{c}"), z, 2.0e-4));
        }
    }
    let corners = [0, w - 1, w * h - 1, w * (h - 1)];
    for (t, _) in corners.iter().enumerate().take(feeds) {
        nodes.push(tank(&format!("T{t}"), 60.0 + 5.0 * t as f64));
    }
    let mut links = Vec::new();
    let mut k = 0usize;
    let mut add = |a: usize, b: usize, links: &mut Vec<Link>| {
        let element = if k % 7 == 3 {
            Element::Valve(Valve {
                kvs: 150.0,
                characteristic: dutyline::analysis::network::Characteristic::Linear,
                opening: 0.8,
                control: false,
            })
        } else {
            pipe(
                100.0 + (k % 13) as f64 * 20.0,
                0.15 + 0.05 * (k % 3) as f64,
                4.5e-5,
                1.2,
            )
        };
        links.push(Link {
            name: format!("L{k}"),
            from: a,
            to: b,
            element,
            check: false,
        });
        k += 1;
    };
    for r in 0..h {
        for c in 0..w {
            let i = r * w + c;
            if c + 1 < w {
                add(i, i + 1, &mut links);
            }
            if r + 1 < h {
                add(i, i + w, &mut links);
            }
        }
    }
    for (t, &corner) in corners.iter().enumerate().take(feeds) {
        add(w * h + t, corner, &mut links);
    }
    let mut d = 0;
    while links.len() < 2000 && d + w + 1 < w * h {
        add(d, d + w + 1, &mut links); // diagonals until 2 000 links
        d += 37;
    }
    Network {
        fluid: fluid(998.2, 1.0e-3),
        nodes,
        links,
    }
}

/// The networks `tests/reference/gen_network.py` solved by scipy's root finder with
/// fluids' friction factors (`tests/reference/network_scipy.json`).
pub fn reference() -> serde_json::Value {
    serde_json::from_str(include_str!("../reference/network_scipy.json")).unwrap()
}

/// The reference's well field named `name`.
pub fn well_field(name: &str) -> serde_json::Value {
    reference()["well_fields"]
        .as_array()
        .unwrap()
        .iter()
        .find(|f| f["name"] == name)
        .unwrap()
        .clone()
}
