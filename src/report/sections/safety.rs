//! The pressure and surge screening chapter (issue 14): method, shut-off, pressure
//! ratings, an HGL plot and a pressure table per line, the surge screening table, the
//! checks, and the cautions. Reads the analysis' safety screen; computes no
//! engineering value beyond turning pressures into heads for the plot.

use crate::analysis::checks::Status;
use crate::analysis::safety::{CaseSafety, LineSafety, Safety};
use crate::analysis::system::G;
use crate::analysis::Analysis;
use crate::display::Units;
use crate::report::layout::chart::{Chart, Series};
use crate::report::layout::document::{Align, Block, Column};

/// The cautions printed with the screen.
pub const CAUTIONS: [&str; 3] = [
    "These are screening estimates, not a transient (water-hammer) analysis. A pump trip, a valve closure or an air-valve slam can raise and lower pressures far beyond the values here; where a screen fails, or the line is long, rising, or has high points, a transient study by a qualified analyst governs the design of surge protection.",
    "Pressure ratings here follow the named standards' conventions as recalled; the pipe, fitting, valve and flange manufacturers' certified ratings at the operating temperature govern, and so do the codes and the authority having jurisdiction where the system is built.",
    "Column separation, check-valve slam and air in the line are not modelled. The results are to be reviewed by a licensed engineer before the design proceeds.",
];

/// What the screen leaves out of a network design.
const NETWORK_SCOPE: &str = "This screen covers the suction and discharge lines of the station, up to the network's entry node. The pipes, valves and equipment inside the network (its node-to-node lines) are not screened: check each against the shut-off pressure at the entry node and against the surge of a pump trip or valve closure, with the network node pressures of the duty tables, before the design proceeds.";

/// The chapter; nothing when no case could be screened.
pub(super) fn chapter(blocks: &mut Vec<Block>, analysis: &Analysis, units: &Units) {
    let s = &analysis.safety;
    let Some(first) = s.cases.iter().find(|c| c.screened()) else {
        return;
    };
    blocks.push(Block::heading(1, "Pressure and surge screening"));
    blocks.push(Block::caution(CAUTIONS[0]));
    intro(blocks, s, analysis);
    if analysis
        .cases
        .iter()
        .any(|c| c.system.as_ref().is_some_and(|s| s.network.is_some()))
    {
        blocks.push(Block::caution(NETWORK_SCOPE));
    }
    method(blocks);
    shutoff(blocks, s, units);
    ratings_table(blocks, first, units, s.closed_loop_max_pa);
    for (i, line) in first.lines().iter().enumerate() {
        blocks.push(Block::heading(2, format!("Line {}", line.name)));
        blocks.push(Block::text(format!(
            "Profile: {}. Length {}.",
            line.profile_source,
            units.length().fmt(line.length)
        )));
        grade_plot(blocks, s, i, units);
        pressure_table(blocks, s, i, units);
    }
    surge_tables(blocks, s, first, units);
    checks_table(blocks, s, units);
    blocks.push(Block::heading(2, "Cautions"));
    for c in CAUTIONS {
        blocks.push(Block::caution(c));
    }
}

fn intro(blocks: &mut Vec<Block>, s: &Safety, analysis: &Analysis) {
    let who = match &s.candidate {
        Some(c) if analysis.selection.recommended.as_deref() == Some(c.as_str()) => {
            format!("the recommended candidate {c}")
        }
        Some(c) => {
            format!("candidate {c} (no candidate is recommended; the first with a duty point)")
        }
        None => {
            "no candidate (no duty point in any case): only static pressures are screened".into()
        }
    };
    blocks.push(Block::text(format!(
        "The hydraulic grade line and the pressure along every line are computed at each case's duty of {who}, at pump shut-off and with the pumps stopped, and compared with the pipe and fitting ratings; the lowest pressure is compared with vapour pressure and with a stated minimum; the pressure-wave speed gives the pipe period and the surge heads of a pump trip and of a valve closure. Minor losses are taken at the upstream end of their pipe, which lowers the grade downstream of them (conservative for the lowest pressure). The tank end of a line is held at the tank's pressure and is not screened for low pressure."
    )));
}

fn method(blocks: &mut Vec<Block>) {
    blocks.push(Block::heading(2, "Method"));
    blocks.push(Block::text("Pressure along a line from the hydraulic grade H (energy grade less the velocity head) and the pipe elevation z (gauge):"));
    blocks.push(Block::Equation("p = ρ · g · (H − z)".into()));
    blocks.push(Block::text("Shut-off: the highest static suction pressure of any case plus the shut-off head H₀ at the maximum speed and the largest published impeller, raised by the pump test tolerance t, in cold water (ρc), along the discharge line:"));
    blocks.push(Block::Equation(
        "p = pₛ + ρc · g · H₀ · (1 + t) + ρc · g · (zc − z)".into(),
    ));
    blocks.push(Block::text("Wave speed by Korteweg's formula with the liquid's bulk modulus K (water: ρ·w² with the speed of sound w of IAPWS-IF97), inner diameter D, wall e, the wall's short-term modulus E and the restraint factor ψ (thin wall, D/e ≥ 25: 1 − ν² anchored throughout, 1 − ν/2 anchored upstream only, 1 with expansion joints; thick wall: Halliwell's forms ψ = 2e/D·(1 + ν) + D·ψthin/(D + e)); Wylie and Streeter (1993), eq. 2.16–2.18; Chaudhry (2014), §2.6:"));
    blocks.push(Block::Equation(
        "a = √( (K/ρ) / (1 + ψ · K · D / (E · e)) )".into(),
    ));
    blocks.push(Block::text("The lowest credible wave speed takes 0.1 % free air by volume at the line's mean absolute pressure, 1/Kₑ = 1/K + α/p (Wylie and Streeter, §9.2). A line of several pipes is the equivalent pipe of equal length, travel time and inertia, a = L/Σ(Lᵢ/aᵢ) and A = L/Σ(Lᵢ/Aᵢ); its period is 2L/a. A pump trip stops the duty flow: the downsurge and the following upsurge are screened with Joukowsky's head, taken undiminished along the line. A valve closing within 2L/a at the lowest credible wave speed (its effective closure time, 20 % of the stroke for gate and butterfly valves) gives Joukowsky's head; a slower closure Michaud's approximation with the effective closure time:"));
    blocks.push(Block::Equation("ΔH = a · ΔV / g".into()));
    blocks.push(Block::Equation("ΔH ≈ 2 · L · V / (g · tₑ)".into()));
}

fn shutoff(blocks: &mut Vec<Block>, s: &Safety, units: &Units) {
    let Some(so) = &s.shutoff else { return };
    blocks.push(Block::heading(2, "Shut-off"));
    let mut kv = vec![
        (
            "Candidate".to_string(),
            s.candidate.clone().unwrap_or_default(),
        ),
        (
            "Shut-off head H₀ (largest impeller, maximum speed)".into(),
            format!(
                "{} at {:.0} rpm{}{}",
                units.head().fmt(so.head),
                so.speed_rpm,
                so.impeller
                    .map(|d| format!(", impeller {}", units.diameter().fmt(d)))
                    .unwrap_or_default(),
                if so.stages > 1 {
                    format!(", {} stages in series", so.stages)
                } else {
                    String::new()
                }
            ),
        ),
        (
            "Test tolerance t on head".into(),
            format!(
                "+{:.0} % (ISO 9906:2012 grade 2B, recalled)",
                so.tolerance * 100.0
            ),
        ),
        (
            "Cold-water density ρc".into(),
            units.density().fmt(so.density),
        ),
        (
            "Pump pressure rise at shut-off".into(),
            units.pressure().fmt(so.pressure_rise),
        ),
    ];
    kv.push((
        "Highest static suction pressure pₛ".into(),
        format!(
            "{} (case {})",
            units.gauge_pressure().fmt(so.suction_pressure),
            so.suction_case
        ),
    ));
    blocks.push(Block::KeyValue(kv));
}

fn ratings_table(
    blocks: &mut Vec<Block>,
    c: &CaseSafety,
    units: &Units,
    closed_loop_max: Option<f64>,
) {
    blocks.push(Block::heading(2, "Pressure ratings"));
    blocks.push(Block::text(format!("Ratings at the liquid temperature of case {} (thermoplastic ratings fall with temperature). The weakest of a pipe and the fittings rated on it governs. A rating given in the design is used as given, without a surge allowance.", c.case)));
    if let Some(max) = closed_loop_max {
        blocks.push(Block::text(format!("A closed loop: the rating, shut-off and surge checks take its reference at the maximum pressure, {} gauge (relief setting or hot system); the minimum-pressure, vapour and column-separation checks, the grade plots and the pressure tables take the minimum (fill) pressure.", units.pressure().fmt(max))));
    }
    let pr = units.rating();
    let mut rows = Vec::new();
    for l in c.lines() {
        for (i, r) in l.ratings.iter().enumerate() {
            rows.push(vec![
                l.name.clone(),
                format!("{} {}", i + 1, pipe_text(l, i, units)),
                r.working
                    .map(|w| pr.figure(w))
                    .unwrap_or_else(|| "not rated".into()),
                r.transient
                    .map(|w| pr.figure(w))
                    .unwrap_or_else(|| "–".into()),
                super::wording::plain(&r.describe(&|p| pr.fmt(p), &|x| units.diameter().fmt(x))),
                super::sources::publication(&r.source, units),
            ]);
        }
    }
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Line", 0.11, Align::Left),
            Column::new("Pipe", 0.15, Align::Left),
            Column::new(format!("Working ({})", pr.label), 0.09, Align::Right),
            Column::new(format!("Transient ({})", pr.label), 0.1, Align::Right),
            Column::new("Basis", 0.33, Align::Left),
            Column::new("Source", 0.22, Align::Left),
        ],
        rows,
        caption: Some("Pressure rating of every pipe (gauge)".into()),
    });
}

/// Head of a gauge pressure `p` at elevation `z`: z + p/(ρg), m.
fn head_of(z: f64, p: f64, rho: f64) -> f64 {
    z + p / (rho * G)
}

fn grade_plot(blocks: &mut Vec<Block>, s: &Safety, i: usize, units: &Units) {
    let ln = units.length();
    let hd = units.elevation();
    let Some(base) = s.cases.iter().find_map(|c| c.lines().get(i)) else {
        return;
    };
    let pts = |f: &dyn Fn(usize) -> Option<f64>, l: &LineSafety| -> Vec<(f64, f64)> {
        (0..l.stations.len())
            .map(|k| {
                let y = f(k).map(|y| hd.value(y)).unwrap_or(f64::NAN);
                (ln.value(l.stations[k].chainage), y)
            })
            .collect()
    };
    let mut series = vec![Series {
        name: "pipe profile".into(),
        points: pts(&|k| Some(base.stations[k].elevation), base),
        style_index: 0,
        solid: true,
        ..Default::default()
    }];
    for (j, c) in s.cases.iter().enumerate() {
        let Some(l) = c.lines().get(i) else { continue };
        let Some(g) = &l.grade_duty else { continue };
        series.push(Series {
            name: format!("HGL, {}", c.case),
            points: pts(&|k| Some(g[k]), l),
            style_index: j + 1,
            ..Default::default()
        });
    }
    let rho = base.density;
    if let Some(p) = &base.pressure_shutoff {
        series.push(Series {
            name: "HGL at shut-off".into(),
            points: pts(
                &|k| Some(head_of(base.stations[k].elevation, p[k], rho)),
                base,
            ),
            style_index: 6,
            dashed: true,
            ..Default::default()
        });
    }
    series.push(Series {
        name: "vapour pressure".into(),
        points: pts(
            &|k| Some(head_of(base.stations[k].elevation, base.vapour_gauge, rho)),
            base,
        ),
        style_index: 5,
        dashed: true,
        ..Default::default()
    });
    if let Some(p) = &base.pressure_downsurge {
        series.push(Series {
            name: format!(
                "after pump-trip downsurge, {}",
                s.cases
                    .iter()
                    .find(|c| c.lines().get(i).is_some())
                    .map(|c| c.case.as_str())
                    .unwrap_or("")
            ),
            points: pts(
                &|k| Some(head_of(base.stations[k].elevation, p[k], rho)),
                base,
            ),
            style_index: 7,
            dashed: true,
            ..Default::default()
        });
    }
    series.push(Series {
        name: "rating envelope (working)".into(),
        points: pts(
            &|k| base.rating_at[k].map(|r| head_of(base.stations[k].elevation, r, rho)),
            base,
        ),
        style_index: 4,
        dashed: true,
        ..Default::default()
    });
    let chart = Chart {
        x_label: format!("Chainage ({})", ln.label),
        y_label: format!("Elevation and grade ({})", hd.label),
        y_range: grade_range(&series),
        series,
        ..Default::default()
    };
    blocks.push(Block::Figure {
        chart,
        height_mm: 105.0,
        caption: format!("Line {}: pipe profile, hydraulic grade line per case and at shut-off, rating envelope (above the plot where not drawn) and vapour pressure; rating and vapour lines are elevation + pressure/(ρg) of case {}; where the pump-trip downsurge would fall below vapour pressure the column separates and its line is held on the vapour-pressure line", base.name, s.cases.iter().find(|c| c.lines().get(i).is_some()).map(|c| c.case.as_str()).unwrap_or("")),
    });
}

/// The plot's height: every series but the rating envelope, padded; the envelope
/// when it lies within 60 % of that span above it (else it runs above the plot).
fn grade_range(series: &[Series]) -> Option<(f64, f64)> {
    let finite = |s: &Series| -> Vec<f64> {
        s.points
            .iter()
            .map(|p| p.1)
            .filter(|y| y.is_finite())
            .collect()
    };
    let (rating, rest): (Vec<&Series>, Vec<&Series>) =
        series.iter().partition(|s| s.name.starts_with("rating"));
    let ys: Vec<f64> = rest.iter().flat_map(|s| finite(s)).collect();
    let lo = ys.iter().copied().fold(f64::INFINITY, f64::min);
    let mut hi = ys.iter().copied().fold(f64::NEG_INFINITY, f64::max);
    if !lo.is_finite() || !hi.is_finite() {
        return None;
    }
    let span = (hi - lo).max(1.0);
    let cap = hi + 0.6 * span;
    for y in rating.iter().flat_map(|s| finite(s)) {
        if y <= cap {
            hi = hi.max(y);
        }
    }
    let span = (hi - lo).max(1.0);
    Some((lo - 0.05 * span, hi + 0.08 * span))
}

fn pressure_table(blocks: &mut Vec<Block>, s: &Safety, i: usize, units: &Units) {
    let (ln, el, pr) = (units.length(), units.elevation(), units.screened_pressure());
    let cases: Vec<(&CaseSafety, &LineSafety)> = s
        .cases
        .iter()
        .filter_map(|c| c.lines().get(i).map(|l| (c, l)))
        .filter(|(_, l)| l.pressure_duty.is_some())
        .take(super::CASES_PER_GROUP)
        .collect();
    let Some(base) = s.cases.iter().find_map(|c| c.lines().get(i)) else {
        return;
    };
    let n = 5 + cases.len();
    let w = 1.0 / n as f64;
    let mut columns = vec![
        Column::new(format!("Chainage ({})", ln.label), w, Align::Right),
        Column::new(format!("Elevation ({})", el.label), w, Align::Right),
    ];
    for (c, _) in &cases {
        columns.push(Column::new(
            format!("{} ({})", c.case, pr.label),
            w,
            Align::Right,
        ));
    }
    columns.push(Column::new(
        format!("Shut-off ({})", pr.label),
        w,
        Align::Right,
    ));
    columns.push(Column::new(
        format!("Static ({})", pr.label),
        w,
        Align::Right,
    ));
    columns.push(Column::new(
        format!("Rating ({})", pr.label),
        w,
        Align::Right,
    ));
    let chainages: Vec<f64> = base.stations.iter().map(|st| st.chainage).collect();
    let chainage_text = ln.figures_apart(&chainages);
    let rows = (0..base.stations.len())
        .map(|k| {
            let st = &base.stations[k];
            let mut r = vec![chainage_text[k].clone(), el.figure(st.elevation)];
            for (_, l) in &cases {
                r.push(
                    l.pressure_duty
                        .as_ref()
                        .map(|p| pr.figure(p[k]))
                        .unwrap_or_default(),
                );
            }
            r.push(
                base.pressure_shutoff
                    .as_ref()
                    .map(|p| pr.figure(p[k]))
                    .unwrap_or_else(|| "–".into()),
            );
            r.push(pr.figure(base.pressure_static[k]));
            r.push(
                base.rating_at[k]
                    .map(|x| pr.figure(x))
                    .unwrap_or_else(|| "–".into()),
            );
            r
        })
        .collect();
    blocks.push(Block::Table {
        columns,
        rows,
        caption: Some(format!("Line {}: gauge pressure at duty per case, at shut-off and static, and the working rating; a chainage repeats where a pipe's fitting losses drop the grade", base.name)),
    });
}

fn surge_tables(blocks: &mut Vec<Block>, s: &Safety, first: &CaseSafety, units: &Units) {
    blocks.push(Block::heading(2, "Surge screening"));
    let (dia, md, ws) = (units.diameter(), units.modulus(), units.wave_speed());
    let mut rows = Vec::new();
    for l in first.lines() {
        let Some(sg) = &l.surge else {
            rows.push(vec![
                l.name.clone(),
                "–".into(),
                "–".into(),
                "–".into(),
                "–".into(),
                "–".into(),
                "–".into(),
                "–".into(),
                "wall or modulus unknown: not screened".into(),
            ]);
            continue;
        };
        for (k, w) in sg.segments.iter().enumerate() {
            let Some(w) = w else { continue };
            rows.push(vec![
                l.name.clone(),
                format!("{} {}", k + 1, pipe_text(l, k, units)),
                format!("{:.1}", w.diameter_to_wall),
                md.figure(w.modulus),
                format!("{:.2}", w.poisson),
                format!("{:.3}", w.restraint_factor),
                ws.figure(w.wave_speed),
                ws.figure(w.lowest_wave_speed),
                format!(
                    "{}{}",
                    if w.diameter_to_wall < 25.0 {
                        "thick wall; "
                    } else {
                        ""
                    },
                    super::sources::publication(&w.modulus_source, units)
                ),
            ]);
        }
    }
    let _ = dia;
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Line", 0.11, Align::Left),
            Column::new("Pipe", 0.15, Align::Left),
            Column::new("D/e", 0.06, Align::Right),
            Column::new(format!("E ({})", md.label), 0.08, Align::Right),
            Column::new("ν", 0.05, Align::Right),
            Column::new("ψ", 0.07, Align::Right),
            Column::new(format!("a ({})", ws.label), 0.08, Align::Right),
            Column::new(format!("a lowest ({})", ws.label), 0.09, Align::Right),
            Column::new("Modulus source", 0.31, Align::Left),
        ],
        rows,
        caption: Some(format!("Wave speed of every pipe, case {} (restraint as each line states; anchored throughout by default)", first.case)),
    });
    let hd = units.head();
    let mut rows = Vec::new();
    for c in &s.cases {
        for l in c.lines() {
            let Some(sg) = &l.surge else { continue };
            let valve = sg
                .valve
                .as_ref()
                .map(|v| {
                    format!(
                        "{} s stroke, {} s effective: {}; {} {}",
                        v.stroke,
                        fmt_s(v.effective),
                        if v.rapid { "rapid" } else { "slow" },
                        v.method,
                        hd.fmt(v.head)
                    )
                })
                .unwrap_or_else(|| "no closure time given".into());
            rows.push(vec![
                c.case.clone(),
                l.name.clone(),
                ws.figure(sg.wave_speed),
                ws.figure(sg.lowest_wave_speed),
                fmt_s(sg.period),
                fmt_s(sg.period_lowest),
                units.velocity().figure(sg.equivalent_velocity),
                hd.figure(sg.joukowsky_head),
                valve,
            ]);
        }
    }
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.13, Align::Left),
            Column::new("Line", 0.11, Align::Left),
            Column::new(format!("a ({})", ws.label), 0.07, Align::Right),
            Column::new(format!("a lowest ({})", ws.label), 0.08, Align::Right),
            Column::new("2L/a (s)", 0.07, Align::Right),
            Column::new("2L/a lowest (s)", 0.08, Align::Right),
            Column::new(format!("V ({})", units.velocity().label), 0.07, Align::Right),
            Column::new(format!("a·V/g ({})", hd.label), 0.08, Align::Right),
            Column::new("Valve closure", 0.31, Align::Left),
        ],
        rows,
        caption: Some("Surge screening per case and line: equivalent pipe, pipe period, Joukowsky head of the duty flow stopped, and the valve closure".into()),
    });
}

/// Seconds with sensible decimals.
fn fmt_s(t: f64) -> String {
    if t < 1.0 {
        format!("{t:.3}")
    } else {
        format!("{t:.2}")
    }
}

fn checks_table(blocks: &mut Vec<Block>, s: &Safety, units: &Units) {
    blocks.push(Block::heading(2, "Screening checks"));
    let mut rows = Vec::new();
    for c in &s.cases {
        for check in &c.checks {
            rows.push(vec![
                c.case.clone(),
                check.id.to_string(),
                match check.status {
                    Status::Pass => "pass",
                    Status::Warn => "WARN",
                    Status::Fail => "FAIL",
                }
                .to_string(),
                super::wording::plain(&units.render(&check.message.get())),
                super::sources::publication(&check.source(), units),
            ]);
        }
    }
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.13, Align::Left),
            Column::new("Check", 0.14, Align::Left),
            Column::new("Status", 0.07, Align::Left),
            Column::new("Finding", 0.44, Align::Left),
            Column::new("Source of the limit", 0.22, Align::Left),
        ],
        rows,
        caption: Some("Pressure and surge screening checks per case and line (screening: a fail asks for a rating change or a transient analysis; it does not disqualify a candidate)".into()),
    });
}

/// Segment `i` of a screened line as the package prints a pipe (report units, DN in SI).
fn pipe_text(line: &crate::analysis::safety::LineSafety, i: usize, units: &Units) -> String {
    let (material, label, inner) = &line.segment_pipes[i];
    crate::display::pipe(material, label, *inner, units)
}
