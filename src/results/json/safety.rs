//! The safety-screening fields of the results document (issue 14): per case
//! `lines[]` with the profile, grade line and pressures, ratings, surge screen and
//! checks; at the top `safety` with the screened candidate and the shut-off.
//! Documented field by field in docs/results-json.md.

// JSON keys carry SI unit symbols as the contract says.
#![allow(non_snake_case)]

use serde::Serialize;

use super::{check, finite, CheckOut};
use crate::analysis::safety::{CaseSafety, LineSafety, Safety, SegmentWave};
use crate::display::Units;

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct SafetyOut<'a> {
    candidate: Option<&'a str>,
    shutoff: Option<ShutoffOut<'a>>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct ShutoffOut<'a> {
    head_m: f64,
    speed_rpm: f64,
    impeller_diameter_m: Option<f64>,
    stages: u32,
    test_tolerance: f64,
    density_kg_m3: f64,
    pressure_rise_Pa: f64,
    suction_pressure_Pa: f64,
    suction_case: &'a str,
}

pub(super) fn safety(s: &Safety) -> SafetyOut<'_> {
    SafetyOut {
        candidate: s.candidate.as_deref(),
        shutoff: s.shutoff.as_ref().map(|so| ShutoffOut {
            head_m: so.head,
            speed_rpm: so.speed_rpm,
            impeller_diameter_m: so.impeller,
            stages: so.stages,
            test_tolerance: so.tolerance,
            density_kg_m3: so.density,
            pressure_rise_Pa: so.pressure_rise,
            suction_pressure_Pa: so.suction_pressure,
            suction_case: &so.suction_case,
        }),
    }
}

/// Format 2: a line's profile as the top-level `line_profiles` holds it: what does not
/// change with the duty (stations, ratings), as columns; one entry for every case
/// whose values are equal.
#[derive(Serialize, PartialEq)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct ProfileOut<'a> {
    name: &'a str,
    side: &'static str,
    profile_source: &'a str,
    length_m: f64,
    chainage_m: Vec<f64>,
    elevation_m: Vec<f64>,
    segment: Vec<usize>,
    rating_Pa: Vec<Option<f64>>,
    transient_rating_Pa: Vec<Option<f64>>,
    high_points: Vec<StationRef>,
    ratings: Vec<RatingOut<'a>>,
    /// Each segment's wall data for the wave speed (`null` without a surge screen; an
    /// entry `null` for a segment without a wall); the speeds are the case's
    /// `surge.segment_wave_speed_m_s` and `surge.segment_lowest_wave_speed_m_s`.
    wave_segments: Option<Vec<Option<WaveOut>>>,
}

/// Format 2: one line of one case: its profile (an index into `line_profiles`) and
/// the pressures along it as columns, element i at the profile's station i.
#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct LineOut<'a> {
    name: &'a str,
    profile: usize,
    duty_flow_m3_s: Option<f64>,
    vapour_pressure_gauge_Pa: f64,
    grade_duty_m: Vec<Option<f64>>,
    pressure_duty_Pa: Vec<Option<f64>>,
    pressure_static_Pa: Vec<f64>,
    pressure_shutoff_Pa: Vec<Option<f64>>,
    pressure_downsurge_Pa: Vec<Option<f64>>,
    minimum_duty: Option<MinimumOut>,
    surge: Option<SurgeOut>,
    checks: Vec<CheckOut<'a>>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct MinimumOut {
    pressure_Pa: f64,
    chainage_m: f64,
    elevation_m: f64,
}

#[derive(Serialize, PartialEq)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct StationRef {
    chainage_m: f64,
    elevation_m: f64,
}

#[derive(Serialize, PartialEq)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct RatingOut<'a> {
    segment: usize,
    pipe: &'a str,
    working_Pa: Option<f64>,
    transient_Pa: Option<f64>,
    basis: String,
    source: &'a str,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct SurgeOut {
    wave_speed_m_s: f64,
    lowest_wave_speed_m_s: f64,
    period_s: f64,
    period_lowest_s: f64,
    joukowsky_head_m: f64,
    /// Format 2: each segment's wave speed and lowest credible wave speed (`null` for
    /// a segment without a wall), in the order of the profile's `wave_segments`.
    segment_wave_speed_m_s: Vec<Option<f64>>,
    segment_lowest_wave_speed_m_s: Vec<Option<f64>>,
    valve: Option<ValveOut>,
}

#[derive(Serialize, PartialEq)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct WaveOut {
    modulus_Pa: f64,
    poisson_ratio: f64,
    restraint_factor: f64,
    diameter_to_wall: f64,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct ValveOut {
    stroke_s: f64,
    effective_closure_s: f64,
    rapid: bool,
    head_m: f64,
    method: &'static str,
}

fn wave(w: &SegmentWave) -> WaveOut {
    WaveOut {
        modulus_Pa: w.modulus,
        poisson_ratio: w.poisson,
        restraint_factor: w.restraint_factor,
        diameter_to_wall: w.diameter_to_wall,
    }
}

fn pick(v: &Option<Vec<f64>>, i: usize) -> Option<f64> {
    v.as_ref().and_then(|v| v.get(i).copied()).and_then(finite)
}

/// The profile of a line (the top-level `line_profiles` entry).
pub(super) fn profile(l: &LineSafety) -> ProfileOut<'_> {
    ProfileOut {
        name: &l.name,
        side: l.side.keyword(),
        profile_source: &l.profile_source,
        length_m: l.length,
        chainage_m: l.stations.iter().map(|st| st.chainage).collect(),
        elevation_m: l.stations.iter().map(|st| st.elevation).collect(),
        segment: l.stations.iter().map(|st| st.segment).collect(),
        rating_Pa: l.rating_at.clone(),
        transient_rating_Pa: l.transient_at.clone(),
        high_points: l
            .high_points
            .iter()
            .map(|&i| StationRef {
                chainage_m: l.stations[i].chainage,
                elevation_m: l.stations[i].elevation,
            })
            .collect(),
        ratings: l
            .ratings
            .iter()
            .enumerate()
            .map(|(i, r)| RatingOut {
                segment: i,
                pipe: &l.segment_labels[i],
                working_Pa: r.working,
                transient_Pa: r.transient,
                basis: r.describe(&|p| format!("{:.1} kPa", p / 1e3), &|x| {
                    format!("{:.2} mm", x * 1e3)
                }),
                source: &r.source,
            })
            .collect(),
        wave_segments: l
            .surge
            .as_ref()
            .map(|s| s.segments.iter().map(|w| w.as_ref().map(wave)).collect()),
    }
}

fn line<'a>(c: &'a CaseSafety, l: &'a LineSafety, units: Units, profile: usize) -> LineOut<'a> {
    let n = l.stations.len();
    let column = |v: &Option<Vec<f64>>| (0..n).map(|i| pick(v, i)).collect();
    LineOut {
        name: &l.name,
        profile,
        duty_flow_m3_s: c.flow,
        vapour_pressure_gauge_Pa: l.vapour_gauge,
        grade_duty_m: column(&l.grade_duty),
        pressure_duty_Pa: column(&l.pressure_duty),
        pressure_static_Pa: l.pressure_static.clone(),
        pressure_shutoff_Pa: column(&l.pressure_shutoff),
        pressure_downsurge_Pa: column(&l.pressure_downsurge),
        minimum_duty: l.min_duty().map(|(p, i)| MinimumOut {
            pressure_Pa: p,
            chainage_m: l.stations[i].chainage,
            elevation_m: l.stations[i].elevation,
        }),
        surge: l.surge.as_ref().map(|s| SurgeOut {
            wave_speed_m_s: s.wave_speed,
            lowest_wave_speed_m_s: s.lowest_wave_speed,
            period_s: s.period,
            period_lowest_s: s.period_lowest,
            joukowsky_head_m: s.joukowsky_head,
            segment_wave_speed_m_s: s
                .segments
                .iter()
                .map(|w| w.as_ref().map(|w| w.wave_speed))
                .collect(),
            segment_lowest_wave_speed_m_s: s
                .segments
                .iter()
                .map(|w| w.as_ref().map(|w| w.lowest_wave_speed))
                .collect(),
            valve: s.valve.as_ref().map(|v| ValveOut {
                stroke_s: v.stroke,
                effective_closure_s: v.effective,
                rapid: v.rapid,
                head_m: v.head,
                method: v.method,
            }),
        }),
        checks: c
            .checks
            .iter()
            .filter(|k| k.subject.as_deref() == Some(l.name.as_str()))
            .map(|k| check(k, units))
            .collect(),
    }
}

/// The `lines[]` of a case; `profiles` are the lines' indices into `line_profiles`.
pub(super) fn lines<'a>(
    c: Option<&'a CaseSafety>,
    units: Units,
    profiles: &[usize],
) -> Vec<LineOut<'a>> {
    c.map(|c| {
        c.lines()
            .iter()
            .enumerate()
            .map(|(i, l)| line(c, l, units, profiles.get(i).copied().unwrap_or(0)))
            .collect()
    })
    .unwrap_or_default()
}
