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
use std::sync::Arc;

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
    /// Each line's screen in this case ([`CaseSafety::lines`]): kept from the screen
    /// when the design has at most [`crate::analysis::SUMMARY_CASES`], else made again
    /// from `inputs` when an output first reads it.
    lines: std::sync::OnceLock<Vec<LineSafety>>,
    /// What the line screens are made from when they were not kept (`None`: kept, or
    /// the case has no system).
    inputs: Option<Arc<ScreenInputs>>,
    /// The pressure-safety checks of this case.
    pub checks: Vec<Check>,
    /// Remarks (profile length, unrated segments, liquids without a bulk modulus).
    pub notes: Vec<String>,
}

impl CaseSafety {
    /// Whether the case's lines were screened (it has a system and lines): whether
    /// [`CaseSafety::lines`] is not empty, without making them.
    pub fn screened(&self) -> bool {
        match self.lines.get() {
            Some(lines) => !lines.is_empty(),
            None => self.inputs.as_ref().is_some_and(|i| !i.lines.is_empty()),
        }
    }

    /// Each line's screen in this case (empty when the case has no system).
    ///
    /// A design of thousands of cases (hourly operation) would hold every station of
    /// every line of every case, about a third of its analysis, although a summarised
    /// output reads the lines of a few governing cases only; so beyond
    /// [`crate::analysis::SUMMARY_CASES`] cases (where the outputs summarise) the screen keeps its checks and notes and makes a case's lines again, by
    /// the same function from the same inputs (so the same numbers), when asked.
    pub fn lines(&self) -> &[LineSafety] {
        self.lines.get_or_init(|| {
            self.inputs
                .as_deref()
                .map(|i| i.line_screens().0)
                .unwrap_or_default()
        })
    }
}

/// A case's inputs to its line screens.
#[derive(Debug)]
struct ScreenInputs {
    /// The case's lines (shared with its scenario).
    lines: Arc<Vec<Line>>,
    /// The case's fluid as written.
    fluid: Fluid,
    /// The case's system.
    system: Arc<CaseSystem>,
    /// A closed loop's system at its highest reference pressure (ratings, shut-off).
    raised: Option<CaseSystem>,
    /// The set's and each pump's flow at the screened duty, m³/s.
    flow: Option<(f64, f64)>,
    /// The screened candidate at shut-off.
    shutoff: Option<Arc<Shutoff>>,
    /// The case's name.
    name: String,
}

impl ScreenInputs {
    /// The line screens, their checks and the notes: at the case's system, or for a
    /// closed loop at both reference pressures ([`at_both_pressures`]).
    fn line_screens(&self) -> (Vec<LineSafety>, Vec<Check>, Vec<String>) {
        let low = self.screen_at(&self.system);
        match &self.raised {
            Some(high) => at_both_pressures(low, self.screen_at(high)),
            None => low,
        }
    }

    fn screen_at(&self, sys: &CaseSystem) -> (Vec<LineSafety>, Vec<Check>, Vec<String>) {
        case_screen(
            &self.lines,
            &self.fluid,
            sys,
            self.flow,
            self.shutoff.as_deref(),
            &self.name,
        )
    }
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
    let keep = design.cases.len() <= crate::analysis::SUMMARY_CASES;
    screen_keeping(design, cases, candidates, recommended, keep)
}

/// [`screen`], keeping every case's line screens (`keep`) or the inputs to make them
/// again.
fn screen_keeping(
    design: &Design,
    cases: &[CaseResult],
    candidates: &[CandidateCurves],
    recommended: Option<&str>,
    keep: bool,
) -> Safety {
    let k = screened_candidate(design, cases, recommended);
    let shutoff = k.and_then(|k| shutoff(design, cases, &candidates[k], k));
    let shared_shutoff = shutoff.clone().map(Arc::new);
    // Each case is screened on its own: on every core (`concurrent::map`, in order).
    let pairs: Vec<_> = design.cases.iter().zip(cases).collect();
    let cases_out = super::concurrent::map(&pairs, |&(case, result)| {
        let Some(system) = &result.system else {
            return CaseSafety {
                case: result.name.clone(),
                ..Default::default()
            };
        };
        let flow = k.and_then(|k| {
            let d = result.pumps.get(k)?.duty.as_ref()?;
            Some((d.flow, d.flow_per_pump))
        });
        let inputs = ScreenInputs {
            lines: Arc::clone(&case.scenario.lines),
            fluid: case.scenario.fluid.clone(),
            system: Arc::clone(system),
            raised: crate::analysis::closed_loop::rating_system(&case.scenario),
            flow,
            shutoff: shared_shutoff.clone(),
            name: result.name.clone(),
        };
        let (lines, checks, notes) = inputs.line_screens();
        CaseSafety {
            case: result.name.clone(),
            flow: flow.map(|(q, _)| q),
            lines: match keep {
                true => lines.into(),
                false => Default::default(),
            },
            inputs: (!keep).then(|| Arc::new(inputs)),
            checks,
            notes,
        }
    });
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
fn at_both_pressures(
    (mut lines, low_checks, notes): (Vec<LineSafety>, Vec<Check>, Vec<String>),
    (high_lines, high_checks, _): (Vec<LineSafety>, Vec<Check>, Vec<String>),
) -> (Vec<LineSafety>, Vec<Check>, Vec<String>) {
    let minimum = |c: &Check| {
        matches!(
            c.id,
            CheckId::MinimumPressure | CheckId::VapourMargin | CheckId::ColumnSeparation
        )
    };
    let mut checks: Vec<Check> = low_checks.into_iter().filter(|c| minimum(c)).collect();
    checks.extend(high_checks.into_iter().filter(|c| !minimum(c)));
    for (l, h) in lines.iter_mut().zip(high_lines) {
        l.pressure_shutoff = h.pressure_shutoff;
    }
    (lines, checks, notes)
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
                .or(c.system.as_deref())
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
) -> (Vec<LineSafety>, Vec<Check>, Vec<String>) {
    let temperature = match fluid {
        Fluid::Water { .. } | Fluid::Glycol(_) => sys.fluid.temperature_k,
        Fluid::Custom(c) => c
            .temperature
            .map(|t| t.get::<uom::si::thermodynamic_temperature::kelvin>()),
    };
    let mut notes = Vec::new();
    let k = surge::bulk_modulus(sys, fluid);
    if k.is_none() {
        notes.push(format!("case {name}: no bulk modulus for `{}`; the surge screen needs water or a liquid with a stated bulk modulus, and is not done", sys.fluid.name));
    }
    let screens: Vec<LineSafety> = lines
        .iter()
        .map(|line| {
            let (screen, unsolved) = line_screen(line, sys, flow, shutoff, temperature, k, &mut notes);
            if let Some(why) = unsolved {
                notes.push(format!("case {name}: line {}: the network beyond the station could not be solved at the duty flow ({why}); this line's pressures at duty are not screened", line.name));
            }
            screen
        })
        .collect();
    let checks = checks::line_checks(&screens);
    (screens, checks, notes)
}

/// The screen of one line; `flow` is the set's and each pump's flow at the duty (m³/s),
/// station piping (`serves = each_pump`) carrying the latter. With the screen, why the
/// network beyond the station could not be solved at the duty, if it could not (then
/// the line has no pressures at duty: a tank's level in place of the network's entry
/// head would understate them).
fn line_screen(
    line: &Line,
    sys: &CaseSystem,
    flow: Option<(f64, f64)>,
    shutoff: Option<&Shutoff>,
    temperature: Option<f64>,
    k: Option<f64>,
    notes: &mut Vec<String>,
) -> (LineSafety, Option<String>) {
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
    let (grade_duty, unsolved) = match flow.map(|(q, qp)| grade::grade_at(sys, &stations, q, qp)) {
        Some(Ok(g)) => (Some(g), None),
        Some(Err(why)) => (None, Some(why)),
        None => (None, None),
    };
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
    let screen = LineSafety {
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
    };
    (screen, unsolved)
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

#[cfg(test)]
mod tests {
    use crate::analysis::Analysis;
    use crate::model::Design;

    /// Every demo (chains, a station with a network, a closed loop screened at both
    /// reference pressures, a well field) analysed, with its CSV curve files.
    fn demos() -> Vec<(String, Design, Analysis)> {
        let dir = std::path::Path::new(env!("CARGO_MANIFEST_DIR")).join("examples-demo");
        let mut files = std::collections::BTreeMap::new();
        let mut designs = Vec::new();
        for entry in std::fs::read_dir(&dir).expect("demo folder") {
            let path = entry.expect("entry").path();
            let name = path
                .file_name()
                .expect("name")
                .to_string_lossy()
                .into_owned();
            let Ok(text) = std::fs::read_to_string(&path) else {
                continue;
            };
            match path.extension().and_then(|e| e.to_str()) {
                Some("duty") => designs.push((name, text)),
                _ => drop(files.insert(name, text)),
            }
        }
        designs.sort();
        designs
            .into_iter()
            .map(|(name, text)| {
                let checked = crate::check(&text, &files);
                let design = checked.design.unwrap_or_else(|| panic!("{name} checks"));
                let analysis = crate::analysis::analyse(&design);
                (name, design, analysis)
            })
            .collect()
    }

    #[test]
    fn a_design_of_few_cases_keeps_its_line_screens() {
        for (name, _, analysis) in demos() {
            for c in &analysis.safety.cases {
                assert!(c.inputs.is_none(), "{name} {}: no inputs kept", c.case);
                assert_eq!(c.screened(), !c.lines().is_empty(), "{name} {}", c.case);
            }
        }
    }

    #[test]
    fn a_network_unsolved_at_the_duty_leaves_the_line_unscreened_and_says_so() {
        use crate::analysis::network::NodeKind;
        let (_, design, a) = demos()
            .into_iter()
            .find(|(n, _, _)| n.starts_with("hillside"))
            .expect("network demo");
        let case = &design.cases[0];
        let mut sys = (**a.cases[0].system.as_ref().expect("system")).clone();
        let (net, _) = sys.network.as_mut().expect("a station network");
        // A demand that is not a number: no solve can balance it.
        for node in &mut net.network.nodes {
            if let NodeKind::Junction { demand } = &mut node.kind {
                *demand = f64::NAN;
            }
        }
        let line = case
            .scenario
            .lines
            .iter()
            .find(|l| l.side == crate::model::Side::Discharge)
            .expect("discharge line");
        let d = a.cases[0]
            .pumps
            .iter()
            .find_map(|p| p.duty.as_ref())
            .expect("a duty");
        let mut notes = Vec::new();
        let (screen, unsolved) = super::line_screen(
            line,
            &sys,
            Some((d.flow, d.flow_per_pump)),
            None,
            None,
            None,
            &mut notes,
        );
        assert!(unsolved.is_some(), "the solve failed");
        assert!(screen.grade_duty.is_none() && screen.pressure_duty.is_none());
        // The whole case: the failure is a note that names the case and the line.
        let (_, _, notes) = super::case_screen(
            &case.scenario.lines,
            &case.scenario.fluid,
            &sys,
            Some((d.flow, d.flow_per_pump)),
            None,
            &case.name,
        );
        let said = format!(
            "case {}: line {}: the network beyond the station could not be solved at the duty flow",
            case.name, line.name
        );
        assert!(notes.iter().any(|n| n.starts_with(&said)), "{notes:?}");
    }

    #[test]
    fn line_screens_made_again_are_those_kept() {
        let mut compared = 0;
        let mut both_pressures = 0;
        for (name, design, a) in demos() {
            let recommended = a.selection.recommended.as_deref();
            let kept = super::screen_keeping(&design, &a.cases, &a.candidates, recommended, true);
            let again = super::screen_keeping(&design, &a.cases, &a.candidates, recommended, false);
            for (k, g) in kept.cases.iter().zip(&again.cases) {
                assert!(
                    g.lines.get().is_none(),
                    "{name} {}: not made before asked",
                    g.case
                );
                assert_eq!(k.screened(), g.screened(), "{name} {}", k.case);
                assert_eq!(
                    format!("{:?}", k.lines()),
                    format!("{:?}", g.lines()),
                    "{name} {}",
                    k.case
                );
                assert_eq!(k.checks, g.checks, "{name} {}", k.case);
                assert_eq!(k.notes, g.notes, "{name} {}", k.case);
                compared += usize::from(k.screened());
                both_pressures +=
                    usize::from(g.inputs.as_ref().is_some_and(|i| i.raised.is_some()));
            }
        }
        // The chain demos, the network station and the closed loop have screens; the
        // closed loop is screened at both reference pressures.
        assert!(compared >= 10, "{compared} case screens compared");
        assert!(
            both_pressures > 0,
            "a closed loop at both reference pressures"
        );
    }
}
