//! Safety screening (issue 14): the hydraulic grade line and the pressure along every
//! line at each case's duty, at pump shut-off and with the pumps stopped; pressure
//! ratings; the lowest pressure against vapour pressure and a stated minimum; surge on
//! pump trip and valve closure. Screening estimates that say when a full transient
//! analysis or a rating change is needed; they are not a transient analysis.
//!
//! The duty screened in a case is the recommended candidate's (else the first
//! candidate, in design order, that has a duty in some case); the shut-off is that
//! candidate's at its maximum speed and largest published impeller.

pub mod checks;
pub mod geometry;
pub mod grade;
pub mod rating;
pub mod surge;

use uom::si::frequency::cycle_per_minute;

use super::checks::Check;
use super::duty::{stages, CandidateCurves};
use super::limits::{self, CheckId};
use super::system::{CaseSystem, G};
use super::CaseResult;
use crate::model::{Adjust, Design, Fluid, Line, Side};

pub use grade::Station;
pub use rating::SegmentRating;
pub use surge::{LineSurge, SegmentWave, ValveClosure};

/// The screen of the whole design.
#[derive(Clone, Debug, Default)]
pub struct Safety {
    /// The candidate whose duties and shut-off are screened.
    pub candidate: Option<String>,
    /// The shut-off condition of the candidate, when it can be computed.
    pub shutoff: Option<Shutoff>,
    /// Per case, in design order.
    pub cases: Vec<CaseSafety>,
    /// A closed loop's maximum reference pressure (gauge), Pa, when the screen takes it
    /// instead of the fill pressure (`closed_loop::rating_system`).
    pub closed_loop_max_pa: Option<f64>,
}

/// The shut-off condition: the pump running against a closed discharge.
#[derive(Clone, Debug, PartialEq)]
pub struct Shutoff {
    /// Shut-off head of the arrangement at the maximum speed and largest impeller, m,
    /// before the test tolerance.
    pub head: f64,
    /// The speed (rpm) and impeller (m) it is taken at, and the series stages.
    pub speed_rpm: f64,
    /// Impeller diameter, m, when known.
    pub impeller: Option<f64>,
    /// Pumps in series (stages).
    pub stages: u32,
    /// Test tolerance added to the head (fraction).
    pub tolerance: f64,
    /// Highest static suction pressure of any case, Pa gauge, and that case.
    pub suction_pressure: f64,
    /// The case with that highest static suction pressure.
    pub suction_case: String,
    /// Density the head is turned into pressure with, kg/m³.
    pub density: f64,
    /// Pressure rise of the pump at shut-off, ρ·g·H·(1 + tolerance), Pa.
    pub pressure_rise: f64,
}

/// One case's screen.
#[derive(Clone, Debug, Default)]
pub struct CaseSafety {
    /// The case's name.
    pub case: String,
    /// The duty flow screened, m³/s (`None`: no duty in this case).
    pub flow: Option<f64>,
    /// Each line's screen in this case.
    pub lines: Vec<LineSafety>,
    /// The pressure-safety checks of this case.
    pub checks: Vec<Check>,
    /// Remarks (profile length, unrated segments, liquids without a bulk modulus).
    pub notes: Vec<String>,
}

/// One line's screen in one case.
#[derive(Clone, Debug)]
pub struct LineSafety {
    /// The line's name.
    pub name: String,
    /// Whether the line is on the suction or the discharge side.
    pub side: Side,
    /// Where the line's profile comes from (see `LineProfile::source`).
    pub profile_source: String,
    /// Line length, m.
    pub length: f64,
    /// The stations along the line where grade and pressure are computed.
    pub stations: Vec<Station>,
    /// Grade (m) and gauge pressure (Pa) at each station: at duty, static, shut-off.
    pub grade_duty: Option<Vec<f64>>,
    /// Gauge pressure at each station at duty, Pa.
    pub pressure_duty: Option<Vec<f64>>,
    /// Static grade at each station (no flow), m.
    pub grade_static: Vec<f64>,
    /// Static gauge pressure at each station (no flow), Pa.
    pub pressure_static: Vec<f64>,
    /// Gauge pressure at each station at pump shut-off, Pa.
    pub pressure_shutoff: Option<Vec<f64>>,
    /// Pressure at each station after the pump-trip downsurge, Pa gauge.
    pub pressure_downsurge: Option<Vec<f64>>,
    /// Per segment of the line: the governing rating.
    pub ratings: Vec<SegmentRating>,
    /// Per segment of the line: size label and material, as written (`ductile iron 16 in class 350`).
    pub segment_labels: Vec<String>,
    /// Per segment of the line: material keyword, size label and inner diameter (m),
    /// for the outputs to print the pipe in report units.
    pub segment_pipes: Vec<(&'static str, String, f64)>,
    /// Working and transient rating at each station (the weaker at a joint), Pa.
    pub rating_at: Vec<Option<f64>>,
    /// Transient (surge) rating at each station (the weaker at a joint), Pa.
    pub transient_at: Vec<Option<f64>>,
    /// Vapour pressure as a gauge pressure, Pa (negative).
    pub vapour_gauge: f64,
    /// The case's liquid density, kg/m³.
    pub density: f64,
    /// Duty velocity in each segment of the line, m/s (zero without a duty).
    pub velocities: Vec<f64>,
    /// The surge screen of the line at duty, when there is a duty.
    pub surge: Option<LineSurge>,
    /// Local high points of the profile: station indices.
    pub high_points: Vec<usize>,
}

impl LineSafety {
    /// Whether station `i` is in the pipe rather than at its tank end, where the
    /// tank's surface fixes the pressure and reflects a surge (the suction line's
    /// upstream end, the discharge line's downstream end).
    pub fn in_pipe(&self, i: usize) -> bool {
        let st = &self.stations[i];
        match self.side {
            Side::Suction => st.chainage > 0.0,
            Side::Discharge => st.chainage < self.length,
        }
    }

    /// Lowest duty pressure in the pipe (tank end excluded) and the station it is at.
    pub fn min_duty(&self) -> Option<(f64, usize)> {
        let p = self.pressure_duty.as_deref()?;
        (0..p.len())
            .filter(|&i| self.in_pipe(i))
            .map(|i| (p[i], i))
            .min_by(|a, b| a.0.total_cmp(&b.0))
    }
}

/// The largest value and its index.
pub fn max_at(v: &[f64]) -> Option<(f64, usize)> {
    v.iter()
        .enumerate()
        .map(|(i, x)| (*x, i))
        .max_by(|a, b| a.0.total_cmp(&b.0))
}

/// Screen every case.
pub fn screen(
    design: &Design,
    cases: &[CaseResult],
    candidates: &[CandidateCurves],
    recommended: Option<&str>,
) -> Safety {
    let k = screened_candidate(design, cases, recommended);
    let shutoff = k.and_then(|k| shutoff(design, cases, &candidates[k], k));
    let cases_out = design
        .cases
        .iter()
        .zip(cases)
        .map(|(case, result)| {
            let flow = k.and_then(|k| {
                let d = result.pumps.get(k)?.duty.as_ref()?;
                Some((d.flow, d.flow_per_pump))
            });
            let screen_at = |sys: &CaseSystem| {
                case_screen(
                    &case.scenario.lines,
                    &case.scenario.fluid,
                    sys,
                    flow,
                    shutoff.as_ref(),
                    &result.name,
                )
            };
            let raised = crate::analysis::closed_loop::rating_system(&case.scenario);
            match (&result.system, raised.as_ref()) {
                (Some(sys), Some(high)) => at_both_pressures(screen_at(sys), screen_at(high)),
                (Some(sys), None) => screen_at(sys),
                _ => CaseSafety {
                    case: result.name.clone(),
                    ..Default::default()
                },
            }
        })
        .collect();
    let closed_loop_max_pa = design
        .base
        .source
        .reference
        .max_pressure
        .filter(|_| crate::analysis::closed_loop::is_closed_loop(&design.base))
        .map(|p| p.get::<uom::si::pressure::pascal>());
    Safety {
        candidate: k.map(|k| design.pumps[k].name.clone()),
        shutoff,
        cases: cases_out,
        closed_loop_max_pa,
    }
}

/// A closed loop screened at both reference pressures: the minimum-pressure, vapour and
/// column-separation checks (and the plotted grades) from the screen at the minimum
/// (fill) pressure `low`; the rating, shut-off and surge checks and the shut-off
/// pressures from the screen at the maximum `high`.
fn at_both_pressures(mut low: CaseSafety, high: CaseSafety) -> CaseSafety {
    let minimum = |c: &Check| {
        matches!(
            c.id,
            CheckId::MinimumPressure | CheckId::VapourMargin | CheckId::ColumnSeparation
        )
    };
    let mut checks: Vec<Check> = low.checks.into_iter().filter(|c| minimum(c)).collect();
    checks.extend(high.checks.into_iter().filter(|c| !minimum(c)));
    low.checks = checks;
    for (l, h) in low.lines.iter_mut().zip(high.lines) {
        l.pressure_shutoff = h.pressure_shutoff;
    }
    low
}

/// The recommended candidate, else the first with a duty in some case.
fn screened_candidate(
    design: &Design,
    cases: &[CaseResult],
    recommended: Option<&str>,
) -> Option<usize> {
    recommended
        .and_then(|r| design.pumps.iter().position(|p| p.name == r))
        .or_else(|| {
            (0..design.pumps.len()).find(|k| {
                cases
                    .iter()
                    .any(|c| c.pumps.get(*k).is_some_and(|p| p.duty.is_some()))
            })
        })
}

/// Shut-off head at the maximum speed and largest impeller of candidate `k`, and the
/// pressure it adds: ρ_cold·g·H₀·(1 + tolerance) on the highest suction pressure.
fn shutoff(
    design: &Design,
    cases: &[CaseResult],
    cc: &CandidateCurves,
    k: usize,
) -> Option<Shutoff> {
    let p = &design.pumps[k];
    let largest = cc
        .published
        .iter()
        .filter_map(|r| r.as_ref().ok())
        .max_by(|a, b| {
            a.impeller_diameter_m
                .unwrap_or(0.0)
                .total_cmp(&b.impeller_diameter_m.unwrap_or(0.0))
        })?;
    let mut ratio: f64 = match p.adjust {
        Adjust::Speed { max_ratio, .. } => max_ratio.max(1.0),
        _ => 1.0,
    };
    for case in &design.cases {
        for (name, s) in &case.scenario.pump_speeds {
            if *name == p.name {
                ratio = ratio.max(s.get::<cycle_per_minute>() / largest.speed_rpm);
            }
        }
    }
    let (_, ser) = stages(p);
    let (q0, _) = largest.head.domain();
    let head = ser as f64 * largest.head.eval(q0.max(0.0)) * ratio * ratio;
    let (suction_pressure, suction_case) = cases
        .iter()
        .zip(&design.cases)
        .filter_map(|(c, case)| {
            let raised = crate::analysis::closed_loop::rating_system(&case.scenario);
            raised
                .as_ref()
                .or(c.system.as_ref())
                .map(|s| (suction_static_pressure(s), c.name.clone()))
        })
        .max_by(|a, b| a.0.total_cmp(&b.0))?;
    let tolerance = limits::SHUTOFF_TOLERANCE.value;
    let density = limits::COLD_WATER_DENSITY.value;
    Some(Shutoff {
        head,
        speed_rpm: largest.speed_rpm * ratio,
        impeller: largest.impeller_diameter_m,
        stages: ser,
        tolerance,
        suction_pressure,
        suction_case,
        density,
        pressure_rise: density * G * head * (1.0 + tolerance),
    })
}

/// Static gauge pressure at the pump suction with no flow, Pa.
pub fn suction_static_pressure(sys: &CaseSystem) -> f64 {
    (sys.source_gauge()
        + sys
            .source_level
            .above(sys.centreline)
            .pressure(sys.fluid.specific_weight()))
    .pa()
}

/// The screen of one case: every line, then its checks.
fn case_screen(
    lines: &[Line],
    fluid: &Fluid,
    sys: &CaseSystem,
    flow: Option<(f64, f64)>,
    shutoff: Option<&Shutoff>,
    name: &str,
) -> CaseSafety {
    let temperature = match fluid {
        Fluid::Water { .. } | Fluid::Glycol(_) => sys.fluid.temperature_k,
        Fluid::Custom(c) => c
            .temperature
            .map(|t| t.get::<uom::si::thermodynamic_temperature::kelvin>()),
    };
    let mut out = CaseSafety {
        case: name.to_string(),
        flow: flow.map(|(q, _)| q),
        ..Default::default()
    };
    let k = surge::bulk_modulus(sys, fluid);
    if k.is_none() {
        out.notes.push(format!("case {name}: no bulk modulus for `{}`; the surge screen needs water or a liquid with a stated bulk modulus, and is not done", sys.fluid.name));
    }
    for line in lines {
        let ls = line_screen(line, sys, flow, shutoff, temperature, k, &mut out.notes);
        out.lines.push(ls);
    }
    out.checks = checks::line_checks(&out);
    out
}

/// The screen of one line; `flow` is the set's and each pump's flow at the duty (m³/s),
/// station piping (`serves = each_pump`) carrying the latter.
fn line_screen(
    line: &Line,
    sys: &CaseSystem,
    flow: Option<(f64, f64)>,
    shutoff: Option<&Shutoff>,
    temperature: Option<f64>,
    k: Option<f64>,
    notes: &mut Vec<String>,
) -> LineSafety {
    let rho = sys.fluid.density;
    // Discharge lines end at the destination surface, or at a network's entry node.
    let (discharge_end, end_name) = match &sys.network {
        Some((net, _)) => (
            net.network.nodes[net.entry].elevation,
            "the network's entry node",
        ),
        None => (sys.destination_level.m(), "the destination level"),
    };
    let ends = match line.side {
        Side::Suction => (sys.source_level.m(), sys.centreline.m()),
        Side::Discharge => (sys.centreline.m(), discharge_end),
    };
    let profile = geometry::line_profile(line, ends, end_name);
    notes.extend(profile.warning.clone());
    let stations = grade::stations(sys, &line.name, &profile);
    let grade_duty = flow.map(|(q, qp)| grade::grade_at(sys, &stations, q, qp));
    let line_flow = flow.map(|(q, qp)| if line.per_pump { qp } else { q });
    let pressure_duty = grade_duty
        .as_ref()
        .map(|g| grade::pressures(&stations, g, rho));
    let grade_static = grade::static_grade(sys, &stations);
    let pressure_static = grade::pressures(&stations, &grade_static, rho);
    let pressure_shutoff = match (line.side, shutoff) {
        (Side::Discharge, Some(so)) => Some(
            stations
                .iter()
                .map(|st| {
                    so.suction_pressure
                        + so.pressure_rise
                        + so.density * G * (sys.centreline.m() - st.elevation)
                })
                .collect(),
        ),
        _ => None,
    };
    let first_segment = stations.first().map(|s| s.segment).unwrap_or(0);
    let ratings: Vec<SegmentRating> = line
        .segments
        .iter()
        .map(|s| rating::segment_rating(s, temperature))
        .collect();
    let rating_at = at_stations(&stations, first_segment, &ratings, |r| r.working);
    let transient_at = at_stations(&stations, first_segment, &ratings, |r| r.transient);
    let velocities: Vec<f64> = (0..line.segments.len())
        .map(|i| {
            line_flow
                .map(|q| q / sys.segments[first_segment + i].area)
                .unwrap_or(0.0)
        })
        .collect();
    let surge = k.and_then(|k| {
        let p_mean = pressure_duty
            .as_ref()
            .map(|p| p.iter().sum::<f64>() / p.len().max(1) as f64)
            .unwrap_or(0.0)
            + sys.barometric.pa();
        let waves = line
            .segments
            .iter()
            .map(|s| {
                surge::segment_wave(s, line, k, rho, p_mean.max(sys.fluid.vapor_pressure.pa()))
            })
            .collect();
        let areas: Vec<f64> = (0..line.segments.len())
            .map(|i| sys.segments[first_segment + i].area)
            .collect();
        surge::line_surge(line, waves, &areas, line_flow.unwrap_or(0.0))
    });
    let pressure_downsurge = match (&surge, &pressure_duty, line.side) {
        (Some(sg), Some(p), Side::Discharge) => Some(
            p.iter()
                .map(|p| {
                    (p - rho * G * sg.joukowsky_head)
                        .max(sys.fluid.vapor_pressure.gauge(sys.barometric).pa())
                })
                .collect(),
        ),
        _ => None,
    };
    let high_points = high_points(&stations);
    LineSafety {
        name: line.name.clone(),
        side: line.side,
        profile_source: profile.source.clone(),
        length: profile.length,
        segment_labels: line
            .segments
            .iter()
            .map(|s| format!("{} {}", s.material.words(), s.size_label))
            .collect(),
        segment_pipes: line
            .segments
            .iter()
            .map(|s| {
                let d = s.inner_diameter.get::<uom::si::length::meter>();
                (s.material.keyword(), s.size_label.clone(), d)
            })
            .collect(),
        stations,
        grade_duty,
        pressure_duty,
        grade_static,
        pressure_static,
        pressure_shutoff,
        pressure_downsurge,
        ratings,
        rating_at,
        transient_at,
        vapour_gauge: sys.fluid.vapor_pressure.gauge(sys.barometric).pa(),
        density: rho,
        velocities,
        surge,
        high_points,
    }
}

/// A per-segment rating at each station; at a joint (the same chainage as the
/// neighbouring segment's end) the weaker of the two.
fn at_stations(
    stations: &[Station],
    first: usize,
    ratings: &[SegmentRating],
    pick: impl Fn(&SegmentRating) -> Option<f64>,
) -> Vec<Option<f64>> {
    let mut out: Vec<Option<f64>> = stations
        .iter()
        .map(|st| pick(&ratings[st.segment - first]))
        .collect();
    for i in 1..stations.len() {
        if stations[i].chainage == stations[i - 1].chainage {
            let weaker = match (out[i - 1], out[i]) {
                (Some(a), Some(b)) => Some(a.min(b)),
                _ => None,
            };
            out[i - 1] = weaker;
            out[i] = weaker;
        }
    }
    out
}

/// Stations at a local high point of the profile (higher than the neighbours on
/// both sides, ends excluded).
fn high_points(stations: &[Station]) -> Vec<usize> {
    let mut out = Vec::new();
    for i in 1..stations.len().saturating_sub(1) {
        let z = stations[i].elevation;
        let before = stations[..i]
            .iter()
            .rev()
            .find(|s| s.elevation != z)
            .map(|s| s.elevation);
        let after = stations[i + 1..]
            .iter()
            .find(|s| s.elevation != z)
            .map(|s| s.elevation);
        if let (Some(b), Some(a)) = (before, after) {
            if z > b
                && z > a
                && out
                    .last()
                    .is_none_or(|&j: &usize| stations[j].elevation != z)
            {
                out.push(i);
            }
        }
    }
    out
}

/// Says in the selection remark of the screened candidate that its pressure and surge
/// screen fails, naming the failing checks, so a package never reads "no failing check"
/// in the ranking while its screen fails (the screen is not a ranking criterion: it
/// screens one candidate, and its failures call for a transient analysis, not another
/// pump).
pub fn annotate_selection(selection: &mut super::selection::Selection, safety: &Safety) {
    let Some(name) = safety.candidate.as_deref() else {
        return;
    };
    let mut failing: Vec<&'static str> = Vec::new();
    for check in safety.cases.iter().flat_map(|c| &c.checks) {
        if check.status == super::checks::Status::Fail && !failing.contains(&check.id.as_str()) {
            failing.push(check.id.as_str());
        }
    }
    if failing.is_empty() {
        return;
    }
    if let Some(ranked) = selection.ranking.iter_mut().find(|r| r.name == name) {
        ranked.why.push_str(&format!(
            "; its pressure and surge screen fails ({}): a transient (water-hammer) analysis is needed before the selection is final",
            failing.join(", ")
        ));
    }
}
