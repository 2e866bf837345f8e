//! Checks across a load profile: delivery, time outside the operating regions, minimum
//! continuous flow, minimum speed, NPSH margin and motor load at every point, the
//! deadhead check at minimum speed, starts per hour of on/off control, and where the
//! control curve falls below the system curve. Statuses and limits as in
//! `analysis::checks`; each limit names its source.

use super::point::{SetModel, SpeedRange};
use super::{CandidateOperation, PointResult};
use crate::analysis::checks::{npsh_ratio_limit, Check, Status, AOR, POR};
use crate::analysis::limits::{self, CheckId, Limit, Source};
use crate::analysis::CaseResult;
use crate::message::{head, Message, Part};
use crate::model::operation::Control;
use crate::model::Design;

fn hours_where(points: &[PointResult], f: impl Fn(&PointResult) -> bool) -> f64 {
    // `+ 0.0` turns the -0.0 of an empty sum into 0.
    points.iter().filter(|p| f(p)).map(|p| p.hours).sum::<f64>() + 0.0
}

fn share(h: f64, total: f64) -> Part {
    if total > 0.0 {
        Part::Percent(h / total)
    } else {
        "0 %".into()
    }
}

/// Every profile check of one candidate.
pub fn profile_checks(
    design: &Design,
    m: &SetModel,
    op: &CandidateOperation,
    cases: &[CaseResult],
) -> Vec<Check> {
    let pts = &op.points;
    let total: f64 = pts.iter().map(|p| p.hours).sum();
    let mut out = vec![delivery(pts, total)];
    out.extend(region(pts, total));
    out.push(min_flow(design, pts, total));
    if matches!(m.speed, SpeedRange::Variable { .. })
        && op
            .controls
            .iter()
            .any(|c| !matches!(c, Control::Throttle | Control::OnOff))
    {
        let h = hours_where(pts, |p| p.state.as_ref().is_some_and(|s| s.at_min_speed));
        out.push(Check::typed(
            CheckId::ProfileMinSpeed,
            if h > 0.0 { Status::Warn } else { Status::Pass },
            Some(h),
            Some(0.0),
            crate::message![
                format!("{h:.0} h a year ("),
                share(h, total),
                ") at minimum speed with the surplus head throttled"
            ],
            Source::DesignData("the design's minimum speed"),
        ));
        out.extend(deadhead(design, m, op, cases));
        let below = hours_where(pts, |p| {
            p.state.as_ref().is_some_and(|s| s.below_system_curve)
        });
        out.push(Check::typed(
            CheckId::ControlCurve,
            if below > 0.0 {
                Status::Warn
            } else {
                Status::Pass
            },
            Some(below),
            Some(0.0),
            crate::message![
                format!("the control curve lies below the system curve for {below:.0} h a year ("),
                share(below, total),
                "); there the set gives the system head"
            ],
            Source::DesignData("the profile's control curve against the case's system curve"),
        ));
    }
    out.push(npsh(design, pts));
    out.extend(motor_load(pts));
    out.extend(starts(design, pts));
    out
}

fn delivery(pts: &[PointResult], total: f64) -> Check {
    let missed = hours_where(pts, |p| p.state.is_none());
    let first = pts.iter().find_map(|p| p.failure.clone());
    Check::typed(
        CheckId::ProfileDelivery,
        if missed > 0.0 {
            Status::Fail
        } else {
            Status::Pass
        },
        Some(missed),
        Some(0.0),
        match first {
            Some(why) => {
                let mut m = crate::message![
                    format!("{missed:.0} h a year ("),
                    share(missed, total),
                    ") not delivered: "
                ];
                m.append(&why);
                m
            }
            None => Message::text("every load point of the profile is delivered"),
        },
        Source::DesignData("the design's load profile"),
    )
}

fn region(pts: &[PointResult], total: f64) -> Vec<Check> {
    let ratio = |p: &PointResult| p.state.as_ref().and_then(|s| s.bep_ratio);
    let outside_por = hours_where(pts, |p| ratio(p).is_some_and(|r| r < POR.0 || r > POR.1));
    let outside_aor = hours_where(pts, |p| ratio(p).is_some_and(|r| r < AOR.0 || r > AOR.1));
    let status = if outside_aor > 0.0 {
        Status::Fail
    } else if outside_por > 0.0 {
        Status::Warn
    } else {
        Status::Pass
    };
    vec![Check::typed(CheckId::ProfileRegion, status, Some(outside_por), Some(0.0),
        crate::message![format!("{outside_por:.0} h a year ("), share(outside_por, total), format!(") outside the preferred region {:.0}–{:.0} % of BEP flow; {outside_aor:.0} h outside the allowable {:.0}–{:.0} %",
            POR.0 * 100.0, POR.1 * 100.0, AOR.0 * 100.0, AOR.1 * 100.0)],
        limits::POR_LOW.source)]
}

fn min_flow(design: &Design, pts: &[PointResult], total: f64) -> Check {
    let mut worst: Option<f64> = None;
    let mut hours = 0.0;
    for p in pts {
        let Some(r) = p.state.as_ref().and_then(|s| s.bep_ratio) else {
            continue;
        };
        let limit = design
            .operation
            .profiles
            .iter()
            .find(|x| x.case == p.case)
            .and_then(|x| x.min_flow_ratio)
            .unwrap_or(AOR.0);
        worst = Some(worst.map_or(r, |w: f64| w.min(r)));
        if r < limit {
            hours += p.hours;
        }
    }
    let stated = design
        .operation
        .profiles
        .iter()
        .find_map(|x| x.min_flow_ratio);
    let limit = stated.unwrap_or(AOR.0);
    Check::typed(
        CheckId::ProfileMinFlow,
        if hours > 0.0 {
            Status::Fail
        } else {
            Status::Pass
        },
        worst,
        Some(limit),
        crate::message![
            "smallest flow per pump ",
            worst.map_or("–".into(), Part::Percent),
            format!(" of BEP flow; {hours:.0} h a year ("),
            share(hours, total),
            ") below the minimum continuous flow of ",
            Part::Percent(limit)
        ],
        if stated.is_some() {
            Source::DesignRequirement
        } else {
            limits::AOR_LOW.source
        },
    )
}

/// Shut-off head at minimum speed: H₀,min = (N_min/N_r)²·H₀ (affinity laws) per pump,
/// times the pumps in series, against the static head of each profile's case plus the
/// margin.
fn deadhead(
    design: &Design,
    m: &SetModel,
    op: &CandidateOperation,
    cases: &[CaseResult],
) -> Vec<Check> {
    let SpeedRange::Variable { min, .. } = m.speed else {
        return Vec::new();
    };
    let shutoff = min * min * m.base.head.eval(0.0) * m.trim * m.trim * m.series.max(1) as f64;
    let mut out = Vec::new();
    for (profile, control) in design.operation.profiles.iter().zip(&op.controls) {
        if matches!(control, Control::Throttle | Control::OnOff) {
            continue;
        }
        let Some(sys) = cases
            .iter()
            .find(|c| c.name == profile.case)
            .and_then(|c| c.system.as_ref())
        else {
            continue;
        };
        let margin = profile
            .deadhead_margin
            .unwrap_or(limits::DEADHEAD_MARGIN.value * sys.static_head.max(0.0));
        let need = sys.static_head + margin;
        let status = if shutoff > need {
            Status::Pass
        } else {
            Status::Fail
        };
        out.push(
            Check::typed(
                CheckId::Deadhead,
                status,
                Some(shutoff),
                Some(need),
                crate::message![
                    format!(
                        "case {}: shut-off head at minimum speed ({:.0} %) ",
                        profile.case,
                        min * 100.0
                    ),
                    head(shutoff),
                    " against static head ",
                    head(sys.static_head),
                    " plus margin ",
                    head(margin),
                    if status == Status::Fail {
                        ": the pump would deadhead; raise the minimum speed"
                    } else {
                        ""
                    }
                ],
                if profile.deadhead_margin.is_some() {
                    Source::DesignRequirement
                } else {
                    limits::DEADHEAD_MARGIN.source
                },
            )
            .about(profile.case.clone()),
        );
    }
    out
}

fn npsh(design: &Design, pts: &[PointResult]) -> Check {
    let mut worst: Option<(f64, f64, Limit)> = None;
    for p in pts {
        let Some(s) = &p.state else { continue };
        let (Some(r), Some(case)) = (
            s.npsh_required.filter(|n| *n > 0.0),
            design.cases.iter().find(|c| c.name == p.case),
        ) else {
            continue;
        };
        let ratio = s.npsh_available / r;
        let limit = npsh_ratio_limit(design, case);
        if worst.is_none_or(|(w, l, _)| ratio / limit.value < w / l) {
            worst = Some((ratio, limit.value, limit));
        }
    }
    match worst {
        Some((ratio, lv, limit)) => Check::typed(
            CheckId::ProfileNpsh,
            if ratio < lv {
                Status::Fail
            } else {
                Status::Pass
            },
            Some(ratio),
            Some(lv),
            format!("smallest NPSH margin ratio over the profile {ratio:.2} (limit {lv:.2})"),
            limit.source,
        ),
        None => Check::typed(
            CheckId::ProfileNpsh,
            Status::Warn,
            None,
            None,
            "no NPSH required data at the load points",
            Source::DesignData("the curve tables of the design"),
        ),
    }
}

fn motor_load(pts: &[PointResult]) -> Vec<Check> {
    let loads: Vec<f64> = pts
        .iter()
        .filter_map(|p| p.state.as_ref().map(|s| s.motor_load))
        .collect();
    let (Some(max), Some(min)) = (
        loads.iter().copied().reduce(f64::max),
        loads.iter().copied().reduce(f64::min),
    ) else {
        return Vec::new();
    };
    let status = if max > 1.0 + 1e-9 {
        Status::Fail
    } else if min < limits::MOTOR_LIGHT_LOAD.value {
        Status::Warn
    } else {
        Status::Pass
    };
    vec![Check::typed(
        CheckId::ProfileMotorLoad,
        status,
        Some(max),
        Some(1.0),
        crate::message![
            "motor load ",
            Part::Percent(min),
            "–",
            Part::Percent(max),
            " of nameplate over the profile (above 100 % fails; below ",
            Part::Percent(limits::MOTOR_LIGHT_LOAD.value),
            " the part-load efficiency falls off)"
        ],
        limits::MOTOR_LIGHT_LOAD.source,
    )]
}

fn starts(design: &Design, pts: &[PointResult]) -> Vec<Check> {
    let worst = pts
        .iter()
        .filter_map(|p| p.starts_per_hour)
        .reduce(f64::max);
    let Some(w) = worst else { return Vec::new() };
    let stated = design
        .operation
        .profiles
        .iter()
        .find_map(|p| p.max_starts_per_hour);
    let limit = stated.unwrap_or(limits::STARTS_PER_HOUR.value);
    vec![Check::typed(CheckId::StartsPerHour, if w > limit { Status::Fail } else { Status::Pass }, Some(w), Some(limit),
        format!("worst starts per hour {w:.1} (inflow half the pump flow, Q/(4·V)) against {limit:.1} allowed"),
        if stated.is_some() { Source::DesignRequirement } else { limits::STARTS_PER_HOUR.source })]
}
