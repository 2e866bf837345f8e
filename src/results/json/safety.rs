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

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
pub(super) struct LineOut<'a> {
    name: &'a str,
    side: &'static str,
    profile_source: &'a str,
    length_m: f64,
    duty_flow_m3_s: Option<f64>,
    vapour_pressure_gauge_Pa: f64,
    profile: Vec<StationOut>,
    minimum_duty: Option<MinimumOut>,
    high_points: Vec<StationRef>,
    ratings: Vec<RatingOut<'a>>,
    surge: Option<SurgeOut>,
    checks: Vec<CheckOut<'a>>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct StationOut {
    chainage_m: f64,
    elevation_m: f64,
    segment: usize,
    grade_duty_m: Option<f64>,
    pressure_duty_Pa: Option<f64>,
    pressure_static_Pa: f64,
    pressure_shutoff_Pa: Option<f64>,
    pressure_downsurge_Pa: Option<f64>,
    rating_Pa: Option<f64>,
    transient_rating_Pa: Option<f64>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct MinimumOut {
    pressure_Pa: f64,
    chainage_m: f64,
    elevation_m: f64,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct StationRef {
    chainage_m: f64,
    elevation_m: f64,
}

#[derive(Serialize)]
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
    segments: Vec<Option<WaveOut>>,
    valve: Option<ValveOut>,
}

#[derive(Serialize)]
#[cfg_attr(test, derive(schemars::JsonSchema))]
struct WaveOut {
    wave_speed_m_s: f64,
    lowest_wave_speed_m_s: f64,
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
        wave_speed_m_s: w.wave_speed,
        lowest_wave_speed_m_s: w.lowest_wave_speed,
        modulus_Pa: w.modulus,
        poisson_ratio: w.poisson,
        restraint_factor: w.restraint_factor,
        diameter_to_wall: w.diameter_to_wall,
    }
}

fn pick(v: &Option<Vec<f64>>, i: usize) -> Option<f64> {
    v.as_ref().and_then(|v| v.get(i).copied()).and_then(finite)
}

fn line<'a>(c: &'a CaseSafety, l: &'a LineSafety, units: Units) -> LineOut<'a> {
    let profile = l
        .stations
        .iter()
        .enumerate()
        .map(|(i, st)| StationOut {
            chainage_m: st.chainage,
            elevation_m: st.elevation,
            segment: st.segment,
            grade_duty_m: pick(&l.grade_duty, i),
            pressure_duty_Pa: pick(&l.pressure_duty, i),
            pressure_static_Pa: l.pressure_static[i],
            pressure_shutoff_Pa: pick(&l.pressure_shutoff, i),
            pressure_downsurge_Pa: pick(&l.pressure_downsurge, i),
            rating_Pa: l.rating_at[i],
            transient_rating_Pa: l.transient_at[i],
        })
        .collect();
    LineOut {
        name: &l.name,
        side: l.side.keyword(),
        profile_source: &l.profile_source,
        length_m: l.length,
        duty_flow_m3_s: c.flow,
        vapour_pressure_gauge_Pa: l.vapour_gauge,
        profile,
        minimum_duty: l.min_duty().map(|(p, i)| MinimumOut {
            pressure_Pa: p,
            chainage_m: l.stations[i].chainage,
            elevation_m: l.stations[i].elevation,
        }),
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
        surge: l.surge.as_ref().map(|s| SurgeOut {
            wave_speed_m_s: s.wave_speed,
            lowest_wave_speed_m_s: s.lowest_wave_speed,
            period_s: s.period,
            period_lowest_s: s.period_lowest,
            joukowsky_head_m: s.joukowsky_head,
            segments: s.segments.iter().map(|w| w.as_ref().map(wave)).collect(),
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

/// The `lines[]` of a case.
pub(super) fn lines(c: Option<&CaseSafety>, units: Units) -> Vec<LineOut<'_>> {
    c.map(|c| c.lines.iter().map(|l| line(c, l, units)).collect())
        .unwrap_or_default()
}
