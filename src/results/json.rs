//! The JSON view of an analysis. Field order is the contract's; SI units with the
//! unit in the key; ratios as fractions; `null` where a value does not exist.

// JSON keys carry SI unit symbols (`head_m`, `shaft_power_W`) as the contract says.
#![allow(non_snake_case)]

use serde::Serialize;

use crate::analysis::checks::Check;
use crate::analysis::duty::PumpResult;
use crate::analysis::system::CaseSystem;
use crate::analysis::{Analysis, CaseResult};
use crate::diagnostics::{line_col, Diagnostic};
use crate::display::Units;
use crate::model::{ArrangementKind, Design};

mod engineering;
mod envelope;
mod inputs;
mod operation;
mod pretty;
mod safety;
mod sources;
mod well_field;

/// The format string; changes when anything is removed or renamed.
pub const FORMAT: &str = "dutyline-results/2";

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Doc<'a> {
    format: &'static str,
    tool_version: &'static str,
    source: Source<'a>,
    project: Project<'a>,
    /// Format 2: every distinct segment description over the cases, in order of first
    /// use; `cases[].segments` holds indices into it.
    segments: Vec<Segment<'a>>,
    /// Format 2: every distinct line profile (stations, ratings) over the cases;
    /// `cases[].lines[].profile` holds an index into it.
    line_profiles: Vec<safety::ProfileOut<'a>>,
    /// Written case by case as the document is serialised (not held whole).
    #[cfg_attr(test, schemars(with = "Vec<Case<'static>>"))]
    cases: CasesOut<'a>,
    /// Added field: each candidate's published curve points and fit methods.
    candidates: Vec<inputs::Candidate<'a>>,
    /// Wave 2: each requirement across the cases, with each candidate's status.
    requirement_matrix: Vec<engineering::RequirementOut<'a>>,
    /// Issue 13: the design's load profiles, with the binning of hourly ones.
    load_profiles: Vec<operation::LoadProfileOut<'a>>,
    selection: Selection<'a>,
    /// Issue 14: the candidate whose duties the safety screen uses, and its shut-off.
    safety: safety::SafetyOut<'a>,
    warnings: Vec<Warn>,
    /// Format 2: every source text (of a check's limit, a fluid's properties, a motor
    /// efficiency) once; each such `source` field is an index into it. Serialised last,
    /// after every field that refers to it.
    #[cfg_attr(test, schemars(with = "Vec<String>"))]
    sources: sources::SourcesOut,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Source<'a> {
    path: &'a str,
    sha256: String,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Project<'a> {
    title: &'a str,
    number: &'a str,
    client: &'a str,
    revision: Option<&'a str>,
    units: &'static str,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Case<'a> {
    name: &'a str,
    overrides: &'a [String],
    hours_per_year: f64,
    error: Option<&'a str>,
    fluid: Option<Fluid<'a>>,
    barometric_pressure_Pa: Option<f64>,
    /// Added field: true when the design states the barometric pressure; otherwise it
    /// comes from `site_elevation_m` by the U.S. Standard Atmosphere 1976.
    barometric_pressure_given: bool,
    site_elevation_m: Option<f64>,
    levels: Option<Levels>,
    /// Wave 2: `new` or `aged`, the pipe condition the case's roughness comes from.
    pipe_condition: Option<&'static str>,
    static_head_m: Option<f64>,
    /// Format 2: indices into the top-level `segments`, one per segment in order.
    segments: Vec<usize>,
    /// Format 2: per segment, the K of one piece of each of its fittings at the case's
    /// design flow (the first duty's flow, else the middle of the system curve); `null`
    /// where a K is not a number.
    fittings_k: Vec<Vec<Option<f64>>>,
    /// Format 2: the system curve as columns (one array per quantity, equal lengths).
    system_curve: Curve,
    pumps: Vec<Pump<'a>>,
    /// Issue 14: the safety screen of every line.
    lines: Vec<safety::LineOut<'a>>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Fluid<'a> {
    name: &'a str,
    temperature_K: Option<f64>,
    density_kg_m3: f64,
    dynamic_viscosity_Pa_s: f64,
    vapor_pressure_Pa: f64,
    /// Format 2: an index into the top-level `sources`.
    source: usize,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Levels {
    source_m: f64,
    destination_m: f64,
    pump_centreline_m: f64,
    source_gauge_pressure_Pa: f64,
    destination_gauge_pressure_Pa: f64,
}

#[derive(Serialize, PartialEq)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Segment<'a> {
    line: &'a str,
    side: &'static str,
    index: usize,
    material: &'static str,
    size: &'a str,
    length_m: f64,
    inner_diameter_m: f64,
    roughness_m: f64,
    /// Wave 2: where the roughness used comes from (table and condition, or given).
    roughness_source: &'a str,
    friction_model: &'static str,
    hazen_williams_c: Option<f64>,
    fittings: Vec<Fitting<'a>>,
    /// Added field: the `loss { ... }` entries of the segment as written.
    losses: Vec<inputs::Loss<'a>>,
    k_total: f64,
    equivalent_length_m: f64,
    /// Wave 2: `each_pump` on station piping (one copy per pump); absent otherwise.
    #[serde(skip_serializing_if = "Option::is_none")]
    serves: Option<&'static str>,
}

#[derive(Serialize, PartialEq)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Fitting<'a> {
    name: &'a str,
    count: u32,
    /// Added fields: d_small / d_large and the total included angle of size changes.
    beta: Option<f64>,
    angle_deg: Option<f64>,
    source: &'a str,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Curve {
    flow_m3_s: Vec<f64>,
    head_m: Vec<f64>,
    static_head_m: Vec<f64>,
    friction_head_m: Vec<f64>,
    minor_head_m: Vec<f64>,
    /// Wave 2, networks only: the entry head above its zero-flow value.
    #[serde(skip_serializing_if = "Option::is_none")]
    network_head_m: Option<Vec<f64>>,
    /// Wave 2, a source well only: its drawdown at the flow.
    #[serde(skip_serializing_if = "Option::is_none")]
    drawdown_head_m: Option<Vec<f64>>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Arrangement {
    kind: &'static str,
    count: u32,
    standby: u32,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Pump<'a> {
    name: &'a str,
    arrangement: Arrangement,
    speed_rpm: f64,
    impeller_diameter_m: Option<f64>,
    duty: Option<Duty<'a>>,
    failure: Option<String>,
    checks: Vec<CheckOut<'a>>,
    annual_energy_J: Option<f64>,
    annual_energy_cost: Option<f64>,
    /// Wave 2: running hours and volume per year on the ranking basis.
    running_hours_per_year: Option<f64>,
    annual_volume_m3: Option<f64>,
    /// Wave 2: the flow of the arrangement at its limit (maximum speed, largest impeller).
    capacity_flow_m3_s: Option<f64>,
    /// Format 2: an index into the top-level `sources`.
    motor_efficiency_source: usize,
    warnings: Vec<String>,
    /// Wave 2, networks only: the network at the duty point.
    #[serde(skip_serializing_if = "Option::is_none")]
    network: Option<engineering::NetworkOut<'a>>,
    /// Well fields only: the candidate at each running well pump (`duty` is the field's total).
    #[serde(skip_serializing_if = "Option::is_none")]
    wells: Option<Vec<well_field::WellOut<'a>>>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Duty<'a> {
    flow_m3_s: f64,
    head_m: f64,
    flow_per_pump_m3_s: f64,
    head_per_pump_m: f64,
    efficiency: Option<f64>,
    hydraulic_power_W: f64,
    shaft_power_W: Option<f64>,
    input_power_W: Option<f64>,
    bep_flow_m3_s: Option<f64>,
    flow_ratio_to_bep: Option<f64>,
    npsh_available_m: f64,
    npsh_required_m: Option<f64>,
    suction_velocity_m_s: Option<f64>,
    discharge_velocity_m_s: Option<f64>,
    extrapolated: bool,
    /// Wave 2 (docs/results-json.md).
    motor_efficiency: f64,
    drive_efficiency: f64,
    specific_energy_J_m3: Option<f64>,
    wire_to_water_efficiency: Option<f64>,
    npsh_margin_ratio: Option<f64>,
    npsh_excess_m: Option<f64>,
    npsh_terms: engineering::NpshTermsOut,
    segments: engineering::SegmentsOut,
    headroom: Option<engineering::HeadroomOut>,
    /// Wave 2, station piping only: each pump's own branches and the NPSH suction path.
    #[serde(skip_serializing_if = "Option::is_none")]
    station_piping: Option<engineering::StationPipingOut<'a>>,
    /// Wave 2, a source well only: its drawdown and pumping level at the duty.
    #[serde(skip_serializing_if = "Option::is_none")]
    well: Option<engineering::WellOut>,
    /// Issue 15: the duty envelope, when the design asks for one.
    #[serde(skip_serializing_if = "Option::is_none")]
    envelope: Option<envelope::EnvelopeOut<'a>>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct CheckOut<'a> {
    id: &'static str,
    status: &'static str,
    value: Option<f64>,
    limit: Option<f64>,
    message: String,
    /// Format 2: an index into the top-level `sources`.
    source: usize,
    /// Wave 2: what the check is about when an id repeats per duty (the velocity's
    /// side, or the requirement as written in the design).
    subject: Option<&'a str>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Selection<'a> {
    recommended: Option<&'a str>,
    criterion: &'static str,
    criteria: &'a str,
    /// Wave 2: the basis of the ranking in one sentence.
    basis: String,
    refusal: Option<&'a str>,
    /// The first two qualifying candidates are within 2 % on the score: the remark.
    #[serde(skip_serializing_if = "Option::is_none")]
    close_call: Option<&'a str>,
    ranking: Vec<Ranked<'a>>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Ranked<'a> {
    name: &'a str,
    qualifies: bool,
    score: Option<f64>,
    annual_energy_J: Option<f64>,
    annual_energy_cost: Option<f64>,
    life_energy_cost: Option<f64>,
    mean_efficiency: Option<f64>,
    /// Wave 2: the equal basis of the ranking.
    annual_volume_m3: Option<f64>,
    specific_energy_J_m3: Option<f64>,
    life_cost_per_m3: Option<f64>,
    mean_wire_to_water_efficiency: Option<f64>,
    why: &'a str,
    /// Issue 15: with an envelope, whether the candidate also qualifies at every point
    /// of it (duty found, no worst-point check failing).
    #[serde(skip_serializing_if = "Option::is_none")]
    qualifies_across_envelope: Option<bool>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct Warn {
    code: String,
    message: String,
    line: Option<usize>,
    column: Option<usize>,
}

pub(super) fn finite(v: f64) -> Option<f64> {
    v.is_finite().then_some(v)
}

/// The description of one segment of a case as analysed (the top-level `segments`).
fn segment<'a>(
    g: &'a crate::analysis::system::SegmentState,
    d: Option<&'a crate::model::Case>,
) -> Segment<'a> {
    Segment {
        line: &g.line,
        side: g.side.keyword(),
        index: g.index,
        material: g.material,
        size: &g.size_label,
        length_m: g.length,
        inner_diameter_m: g.inner_diameter,
        roughness_m: g.roughness,
        roughness_source: &g.roughness_source,
        friction_model: if g.hazen_williams_c.is_some() {
            "hazen-williams"
        } else {
            "darcy-colebrook"
        },
        hazen_williams_c: g.hazen_williams_c,
        fittings: g
            .fittings
            .iter()
            .map(|f| Fitting {
                name: f.spec.name,
                count: f.count,
                beta: f.beta,
                angle_deg: f.angle_rad.map(f64::to_degrees),
                source: f.spec.source,
            })
            .collect(),
        losses: inputs::losses(d, &g.line, g.index),
        k_total: g.k_constant,
        equivalent_length_m: g.equivalent_length,
        serves: g.per_pump.then_some("each_pump"),
    }
}

/// The per-case part of a case: what the tables (`segments`, `line_profiles`) do not
/// hold. `segments` and `profiles` are the case's indices into them.
fn case<'a>(
    c: &'a CaseResult,
    d: Option<&'a crate::model::Case>,
    safety_case: Option<&'a crate::analysis::safety::CaseSafety>,
    units: Units,
    refs: &CaseRefs,
) -> Case<'a> {
    let s = c.system.as_deref();
    let site = d.map(|d| &d.scenario.site);
    let curve = &c.system_curve;
    let column = |f: &dyn Fn(&crate::analysis::SystemPoint) -> f64| curve.iter().map(f).collect();
    Case {
        name: &c.name,
        overrides: &c.overrides,
        hours_per_year: c.hours_per_year,
        error: c.error.as_deref(),
        fluid: s.map(|s| Fluid {
            name: &s.fluid.name,
            temperature_K: s.fluid.temperature_k,
            density_kg_m3: s.fluid.density,
            dynamic_viscosity_Pa_s: s.fluid.viscosity,
            vapor_pressure_Pa: s.fluid.vapor_pressure.pa(),
            source: sources::index(&s.fluid.source),
        }),
        barometric_pressure_Pa: s.map(|s| s.barometric.pa()),
        barometric_pressure_given: site.is_some_and(|x| x.barometric_pressure.is_some()),
        site_elevation_m: site.map(|x| x.elevation.get::<uom::si::length::meter>()),
        levels: s.map(|s| Levels {
            source_m: s.source_level.m(),
            destination_m: s.destination_level.m(),
            pump_centreline_m: s.centreline.m(),
            source_gauge_pressure_Pa: s.source_gauge().pa(),
            destination_gauge_pressure_Pa: s.destination_gauge().pa(),
        }),
        pipe_condition: s.map(|s| s.pipe_condition.keyword()),
        static_head_m: s.map(|s| s.static_head),
        segments: refs.segments.clone(),
        fittings_k: s
            .map(|s| {
                let q = design_flow(c);
                s.segments
                    .iter()
                    .map(|g| {
                        let re = s.reynolds(g, q);
                        g.fittings
                            .iter()
                            .map(|f| finite(crate::analysis::system::k_of(f, re, g.inner_diameter)))
                            .collect()
                    })
                    .collect()
            })
            .unwrap_or_default(),
        system_curve: Curve {
            flow_m3_s: column(&|p| p.flow),
            head_m: column(&|p| p.head),
            static_head_m: column(&|p| p.static_head),
            friction_head_m: column(&|p| p.friction),
            minor_head_m: column(&|p| p.minor),
            network_head_m: s
                .and_then(|s| s.network.as_ref())
                .map(|_| column(&|p| p.network)),
            drawdown_head_m: s.and_then(|s| s.well).map(|_| column(&|p| p.drawdown)),
        },
        pumps: c.pumps.iter().map(|p| pump(p, s, units)).collect(),
        lines: safety::lines(safety_case, units, &refs.profiles),
    }
}

/// One case's indices into the document's tables.
#[derive(Default)]
struct CaseRefs {
    /// Into `segments`, one per segment of the case.
    segments: Vec<usize>,
    /// Into `line_profiles`, one per screened line of the case.
    profiles: Vec<usize>,
}

/// Distinct values in order of first use; `index` gives a value's position, adding
/// it when new. Values are compared only with those of the same `key` (a segment's
/// line and position), so a lookup is a few comparisons.
struct Table<K, T> {
    items: Vec<T>,
    by_key: std::collections::HashMap<K, Vec<usize>>,
}

impl<K: std::hash::Hash + Eq, T: PartialEq> Table<K, T> {
    fn new() -> Self {
        Table {
            items: Vec::new(),
            by_key: std::collections::HashMap::new(),
        }
    }

    fn index(&mut self, key: K, value: T) -> usize {
        let same = self.by_key.entry(key).or_default();
        if let Some(&i) = same.iter().find(|&&i| self.items[i] == value) {
            return i;
        }
        self.items.push(value);
        same.push(self.items.len() - 1);
        self.items.len() - 1
    }
}

/// The cases, built one at a time while the document is written.
struct CasesOut<'a> {
    analysis: &'a Analysis,
    units: Units,
    /// The design's case of each analysed case (by name), if any.
    design_cases: Vec<Option<&'a crate::model::Case>>,
    refs: Vec<CaseRefs>,
}

impl serde::Serialize for CasesOut<'_> {
    fn serialize<S: serde::Serializer>(&self, ser: S) -> Result<S::Ok, S::Error> {
        use serde::ser::SerializeSeq;
        let a = self.analysis;
        let mut seq = ser.serialize_seq(Some(a.cases.len()))?;
        let none = CaseRefs::default();
        for (i, c) in a.cases.iter().enumerate() {
            let mut out = case(
                c,
                self.design_cases.get(i).copied().flatten(),
                a.safety.cases.get(i),
                self.units,
                self.refs.get(i).unwrap_or(&none),
            );
            if let Some(e) = &a.envelope {
                for (j, p) in out.pumps.iter_mut().enumerate() {
                    if let Some(d) = &mut p.duty {
                        d.envelope = envelope::envelope(e, i, j, self.units);
                    }
                }
            }
            seq.serialize_element(&out)?;
        }
        seq.end()
    }
}

/// The document's tables (`segments`, `line_profiles`) and each case's indices into
/// them, in one pass over the cases.
fn tables<'a>(
    analysis: &'a Analysis,
    design_cases: &[Option<&'a crate::model::Case>],
) -> (Vec<Segment<'a>>, Vec<safety::ProfileOut<'a>>, Vec<CaseRefs>) {
    let mut segments = Table::new();
    let mut profiles = Table::new();
    let mut refs = Vec::with_capacity(analysis.cases.len());
    for (i, c) in analysis.cases.iter().enumerate() {
        let d = design_cases.get(i).copied().flatten();
        let mut r = CaseRefs::default();
        if let Some(s) = c.system.as_ref() {
            for g in s.segments.iter() {
                r.segments
                    .push(segments.index((&*g.line, g.index), segment(g, d)));
            }
        }
        if let Some(sc) = analysis.safety.cases.get(i) {
            for l in sc.lines() {
                r.profiles
                    .push(profiles.index(l.name.as_str(), safety::profile(l)));
            }
        }
        refs.push(r);
    }
    (segments.items, profiles.items, refs)
}

/// The flow at which fitting K values are reported: the first duty of the case, or
/// the middle of the curve range.
fn design_flow(c: &CaseResult) -> f64 {
    c.pumps
        .iter()
        .find_map(|p| p.duty.as_ref().map(|d| d.flow))
        .unwrap_or_else(|| {
            c.system_curve
                .get(c.system_curve.len() / 2)
                .map(|p| p.flow)
                .unwrap_or(0.0)
        })
}

/// A check in JSON, its message in `units`.
pub(super) fn check(c: &Check, units: Units) -> CheckOut<'_> {
    CheckOut {
        id: c.id.as_str(),
        status: c.status.keyword(),
        value: c.value.and_then(finite),
        limit: c.limit.and_then(finite),
        message: units.render(&c.message.get()),
        source: sources::index(&c.source()),
        subject: c.subject.as_deref(),
    }
}

fn pump<'a>(p: &'a PumpResult, sys: Option<&CaseSystem>, units: Units) -> Pump<'a> {
    Pump {
        name: &p.name,
        arrangement: Arrangement {
            kind: match p.arrangement {
                ArrangementKind::Single => "single",
                ArrangementKind::Parallel => "parallel",
                ArrangementKind::Series => "series",
            },
            count: p.count,
            standby: p.standby,
        },
        speed_rpm: p.speed_rpm,
        impeller_diameter_m: p.impeller_diameter_m,
        duty: p.duty.as_ref().map(|d| Duty {
            flow_m3_s: d.flow,
            head_m: d.head,
            flow_per_pump_m3_s: d.flow_per_pump,
            head_per_pump_m: d.head_per_pump,
            efficiency: d.efficiency,
            hydraulic_power_W: d.hydraulic_power,
            shaft_power_W: d.shaft_power,
            input_power_W: d.input_power,
            bep_flow_m3_s: d.bep_flow,
            flow_ratio_to_bep: d.flow_ratio_to_bep,
            npsh_available_m: d.npsh_available,
            npsh_required_m: d.npsh_required,
            suction_velocity_m_s: d.suction_velocity,
            discharge_velocity_m_s: d.discharge_velocity,
            extrapolated: d.extrapolated,
            motor_efficiency: d.motor_efficiency,
            drive_efficiency: d.drive_efficiency,
            specific_energy_J_m3: d.specific_energy,
            wire_to_water_efficiency: d.wire_to_water_efficiency,
            npsh_margin_ratio: d
                .npsh_required
                .filter(|n| *n > 0.0)
                .map(|n| d.npsh_available / n),
            npsh_excess_m: d.npsh_required.map(|n| d.npsh_available - n),
            npsh_terms: engineering::npsh_terms(&d.npsh_terms),
            segments: engineering::segments(&sys.map(|s| d.segments(s)).unwrap_or_default()),
            headroom: p.headroom.as_ref().map(engineering::headroom),
            station_piping: d.station.as_ref().map(engineering::station_piping),
            well: d.well.as_ref().map(engineering::well),
            envelope: None,
        }),
        failure: p.failure.as_ref().map(|m| units.render(m)),
        checks: p.checks.iter().map(|c| check(c, units)).collect(),
        annual_energy_J: p.energy.map(|e| e.energy_j),
        annual_energy_cost: p.energy.and_then(|e| e.cost),
        running_hours_per_year: p.energy.map(|e| e.hours),
        annual_volume_m3: p.energy.map(|e| e.volume_m3),
        capacity_flow_m3_s: p.capacity_flow,
        motor_efficiency_source: sources::index(&p.motor_efficiency.1),
        warnings: p.warnings.iter().map(|w| units.render(w)).collect(),
        network: p.network.as_deref().map(engineering::network),
        wells: (!p.wells.is_empty()).then(|| well_field::wells(&p.wells)),
    }
}

/// The results document as pretty JSON. `warnings` are the design's diagnostics of
/// warning severity plus the analysis warnings.
pub fn to_json(
    design: &Design,
    analysis: &Analysis,
    path: &str,
    source: &str,
    diagnostics: &[Diagnostic],
) -> String {
    let mut out = Vec::new();
    if let Err(e) = write_json(&mut out, design, analysis, path, source, diagnostics) {
        return format!("{{\"error\": \"{e}\"}}\n");
    }
    String::from_utf8(out).unwrap_or_else(|e| format!("{{\"error\": \"{e}\"}}\n"))
}

/// The results document written to `w` as it is built, case by case (a design of
/// 10 000 cases is never held whole as text or as JSON values); `to_json` in a buffer.
pub fn write_json<W: std::io::Write>(
    w: W,
    design: &Design,
    analysis: &Analysis,
    path: &str,
    source: &str,
    diagnostics: &[Diagnostic],
) -> std::io::Result<()> {
    use std::io::Write as _;
    sources::reset();
    let units = Units::new(design.project.units);
    let mut warnings: Vec<Warn> = diagnostics
        .iter()
        .map(|d| {
            let lc = d.span.map(|s| line_col(source, s.start));
            Warn {
                code: d.code.to_string(),
                message: d.message.clone(),
                line: lc.map(|x| x.0),
                column: lc.map(|x| x.1),
            }
        })
        .collect();
    for w in &analysis.warnings {
        let lc = w.span.map(|s| line_col(source, s.start));
        warnings.push(Warn {
            code: w.code.to_string(),
            message: units.render(&w.message),
            line: lc.map(|x| x.0),
            column: lc.map(|x| x.1),
        });
    }
    let sel = &analysis.selection;
    let by_name: std::collections::HashMap<&str, &crate::model::Case> =
        design.cases.iter().map(|d| (d.name.as_str(), d)).collect();
    let design_cases: Vec<Option<&crate::model::Case>> = analysis
        .cases
        .iter()
        .map(|c| by_name.get(c.name.as_str()).copied())
        .collect();
    let (segments, line_profiles, refs) = tables(analysis, &design_cases);
    let doc = Doc {
        format: FORMAT,
        tool_version: crate::VERSION,
        source: Source {
            path,
            sha256: super::sha256_hex(source),
        },
        project: Project {
            title: &design.project.title,
            number: &design.project.number,
            client: &design.project.client,
            revision: design.revisions.last().map(|r| r.id.as_str()),
            units: design.project.units.keyword(),
        },
        segments,
        line_profiles,
        cases: CasesOut {
            analysis,
            units,
            design_cases,
            refs,
        },
        candidates: inputs::candidates(design, analysis),
        requirement_matrix: engineering::requirement_matrix(
            design,
            analysis,
            &analysis.requirement_matrix,
        ),
        load_profiles: operation::load_profiles(design),
        selection: Selection {
            recommended: sel.recommended.as_deref(),
            criterion: sel.criterion,
            criteria: &sel.criteria_text,
            basis: units.render(&sel.basis),
            refusal: sel.refusal.as_deref(),
            close_call: sel.close_call.as_deref(),
            ranking: sel
                .ranking
                .iter()
                .map(|r| Ranked {
                    name: &r.name,
                    qualifies: r.qualifies,
                    score: finite(r.score),
                    annual_energy_J: r.annual_energy_j,
                    annual_energy_cost: r.annual_cost,
                    life_energy_cost: r.life_cost,
                    mean_efficiency: r.mean_efficiency,
                    annual_volume_m3: r.annual_volume_m3,
                    specific_energy_J_m3: r.specific_energy_j_m3,
                    life_cost_per_m3: r.life_cost_per_m3,
                    mean_wire_to_water_efficiency: r.mean_wire_to_water,
                    why: &r.why,
                    qualifies_across_envelope: analysis.envelope.as_ref().map(|e| {
                        r.qualifies
                            && design
                                .pumps
                                .iter()
                                .position(|p| p.name == r.name)
                                .is_some_and(|i| e.across[i])
                    }),
                })
                .collect(),
        },
        safety: safety::safety(&analysis.safety),
        warnings,
        sources: sources::SourcesOut,
    };
    let mut w = std::io::BufWriter::with_capacity(1 << 16, w);
    let mut ser = serde_json::Serializer::with_formatter(&mut w, pretty::Formatter::new());
    // An I/O error keeps its kind (a closed pipe stays a closed pipe).
    doc.serialize(&mut ser).map_err(std::io::Error::from)?;
    w.write_all(b"\n")?;
    w.flush()
}

#[cfg(test)]
mod schema_tests;

#[cfg(test)]
mod table_tests {
    #[test]
    fn a_table_keeps_each_distinct_value_once_in_order_of_first_use() {
        let mut t = super::Table::new();
        assert_eq!(t.index(("a", 0), 1.5), 0);
        assert_eq!(t.index(("a", 1), 1.5), 1, "another key is another entry");
        assert_eq!(t.index(("a", 0), 2.5), 2);
        assert_eq!(t.index(("a", 0), 1.5), 0);
        assert_eq!(t.index(("a", 0), 2.5), 2);
        assert_eq!(t.items, vec![1.5, 1.5, 2.5]);
    }
}
