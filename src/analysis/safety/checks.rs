//! The safety checks of one case, per line: operating and shut-off pressure against
//! the ratings, the lowest pressure against a stated minimum and against vapour
//! pressure plus a margin, the pump-trip downsurge against vapour pressure, and surge
//! plus operating pressure against the transient rating. Limits live in
//! [`crate::analysis::limits`].

use super::{max_at, LineSafety};
use crate::analysis::checks::{Check, Status};
use crate::analysis::limits::{self, CheckId, Source};
use crate::analysis::system::G;
use crate::message::{self, head, Kind, Message};
use crate::model::Side;
use std::sync::Arc;

/// The sentence every failing surge screen ends with.
pub const TRANSIENT_ADVICE: &str =
    "a screening estimate: a full transient (water-hammer) analysis is needed";

/// Where station `i` is: its chainage and elevation, m, for [`place_words`].
fn place(l: &LineSafety, i: usize) -> (f64, f64) {
    let st = &l.stations[i];
    (st.chainage, st.elevation)
}

/// Where a station is ("at chainage 805 ft, elevation 1352.0 ft" in report units), from
/// its chainage and elevation (m).
fn place_words((chainage, elevation): (f64, f64)) -> Message {
    crate::message![
        "at chainage ",
        message::value(Kind::Length, chainage),
        ", elevation ",
        message::value(Kind::Elevation, elevation)
    ]
}

/// A line's name shared by the words of its checks (made when read, see
/// [`crate::message::Words`]).
fn shared_name(l: &LineSafety) -> Arc<str> {
    Arc::from(l.name.as_str())
}

/// A pressure rating or screened pressure (Pa) that must not read like `other`.
fn rating_against(si: f64, other: f64) -> message::Part {
    message::against(Kind::Rating, si, other)
}

/// A gauge pressure (Pa) that must not read like `other`.
fn pressure_against(si: f64, other: f64) -> message::Part {
    message::against(Kind::GaugePressure, si, other)
}

/// All safety checks of a case.
pub fn line_checks(lines: &[LineSafety]) -> Vec<Check> {
    let mut out = Vec::new();
    for l in lines {
        let name = shared_name(l);
        if let Some(p) = &l.pressure_duty {
            out.extend(rating_check(
                l,
                &name,
                p,
                CheckId::PressureRating,
                "operating",
            ));
            out.extend(minimum_checks(l, &name));
        }
        if let Some(p) = &l.pressure_shutoff {
            out.extend(rating_check(
                l,
                &name,
                p,
                CheckId::ShutoffPressure,
                "shut-off",
            ));
        }
        out.extend(surge_checks(l, &name));
    }
    out
}

/// Pressure against the working rating along a line: the station nearest its rating.
fn rating_check(
    l: &LineSafety,
    name: &Arc<str>,
    p: &[f64],
    id: CheckId,
    what: &'static str,
) -> Option<Check> {
    let rated: Vec<(usize, f64, f64)> = p
        .iter()
        .zip(&l.rating_at)
        .enumerate()
        .filter_map(|(i, (p, r))| r.map(|r| (i, *p, r)))
        .collect();
    let source = Source::DesignData(
        "the governing rating of each pipe, by the standards named in the pressure-rating table",
    );
    if rated.is_empty() {
        let (pmax, i) = max_at(p)?;
        let (name, at) = (Arc::clone(name), place(l, i));
        return Some(
            Check::worded_later(
                id,
                Status::Warn,
                Some(pmax),
                None,
                move || {
                    let mut m = crate::message![
                        format!("line {name}: highest {what} pressure "),
                        message::value(Kind::Rating, pmax),
                        " "
                    ];
                    m.append(&place_words(at));
                    m.push("; no segment has a rating (give `rating = ...` from the manufacturer)");
                    m
                },
                source,
            )
            .about(l.name.clone()),
        );
    }
    let (i, pv, r) = rated
        .iter()
        .copied()
        .max_by(|a, b| (a.1 / a.2).total_cmp(&(b.1 / b.2)))?;
    let status = if pv > r { Status::Fail } else { Status::Pass };
    let unrated = l.rating_at.iter().filter(|r| r.is_none()).count();
    let note = if unrated > 0 {
        "; some segments have no rating"
    } else {
        ""
    };
    let (name, at) = (Arc::clone(name), place(l, i));
    Some(
        Check::worded_later(
            id,
            status,
            Some(pv),
            Some(r),
            move || {
                let mut m = crate::message![
                    format!("line {name}: {what} pressure "),
                    rating_against(pv, r),
                    " against the rating ",
                    rating_against(r, pv),
                    " "
                ];
                m.append(&place_words(at));
                m.push(note);
                m
            },
            source,
        )
        .about(l.name.clone()),
    )
}

/// Lowest duty pressure against the stated minimum and against vapour pressure plus
/// the margin.
fn minimum_checks(l: &LineSafety, name: &Arc<str>) -> Vec<Check> {
    let Some((pmin, i)) = l.min_duty() else {
        return Vec::new();
    };
    let mut out = Vec::new();
    let (name, at) = (Arc::clone(name), place(l, i));
    // The suction line of a lift (source below the pump) runs below atmospheric by
    // design; the stated minimum is for lines under positive pressure.
    if l.side == Side::Discharge {
        let name = Arc::clone(&name);
        let lim = limits::MIN_STEADY_PRESSURE_PA;
        out.push(
            Check::worded_later(
                CheckId::MinimumPressure,
                if pmin < lim.value {
                    Status::Warn
                } else {
                    Status::Pass
                },
                Some(pmin),
                Some(lim.value),
                move || {
                    let mut m = crate::message![
                        format!("line {name}: lowest operating pressure "),
                        pressure_against(pmin, lim.value),
                        " "
                    ];
                    m.append(&place_words(at));
                    m.push("; at least ");
                    m.push(pressure_against(lim.value, pmin));
                    m.push(" keeps air valves from admitting air");
                    m
                },
                lim.source,
            )
            .about(l.name.clone()),
        );
    }
    let margin = limits::VAPOUR_MARGIN_PA;
    let floor = l.vapour_gauge + margin.value;
    out.push(
        Check::worded_later(
            CheckId::VapourMargin,
            if pmin < floor {
                Status::Fail
            } else {
                Status::Pass
            },
            Some(pmin),
            Some(floor),
            move || {
                let mut m = crate::message![
                    format!("line {name}: lowest operating pressure "),
                    pressure_against(pmin, floor),
                    " "
                ];
                m.append(&place_words(at));
                m.push(" against vapour pressure plus margin ");
                m.push(pressure_against(floor, pmin));
                m
            },
            margin.source,
        )
        .about(l.name.clone()),
    );
    out
}

/// The surge screens of a line: pump-trip downsurge against vapour pressure
/// (discharge lines) and surge plus operating pressure against the transient rating.
fn surge_checks(l: &LineSafety, name: &Arc<str>) -> Vec<Check> {
    let (Some(sg), Some(p)) = (&l.surge, &l.pressure_duty) else {
        return Vec::new();
    };
    let mut out = Vec::new();
    let source = Source::Recalled {
        title: "Wylie and Streeter, Fluid Transients in Systems (1993)",
        clause: "ch. 1–2, Joukowsky and Korteweg",
    };
    if l.side == Side::Discharge {
        // The downsurge a·V/g against the head above vapour pressure at each station.
        let worst = l
            .min_duty()
            .map(|(p, i)| ((p - l.vapour_gauge) / (l.density * G), i));
        if let Some((room, i)) = worst {
            let down = sg.joukowsky_head;
            let fails = down >= room;
            let (name, at) = (Arc::clone(name), place(l, i));
            out.push(
                Check::worded_later(
                    CheckId::ColumnSeparation,
                    if fails { Status::Fail } else { Status::Pass },
                    Some(down),
                    Some(room),
                    move || {
                        let mut m = crate::message![
                            format!("line {name}: a pump-trip downsurge of "),
                            message::against(Kind::Head, down, room),
                            " against ",
                            message::against(Kind::Head, room, down),
                            " of head above vapour pressure "
                        ];
                        m.append(&place_words(at));
                        if fails {
                            m.push(format!("; the column may separate there, and its rejoin and check-valve slam can exceed the Joukowsky rise: {TRANSIENT_ADVICE}"));
                        }
                        m
                    },
                    source,
                )
                .about(l.name.clone()),
            );
        }
    }
    let surge_head =
        sg.valve
            .as_ref()
            .map(|v| v.head)
            .unwrap_or(0.0)
            .max(if l.side == Side::Discharge {
                sg.joukowsky_head
            } else {
                0.0
            });
    if surge_head <= 0.0 {
        return out;
    }
    let worst = p
        .iter()
        .zip(&l.transient_at)
        .enumerate()
        .filter_map(|(i, (p, r))| r.map(|r| (i, p + l.density * G * surge_head, r)))
        .max_by(|a, b| (a.1 / a.2).total_cmp(&(b.1 / b.2)));
    if let Some((i, ps, r)) = worst {
        let fails = ps > r;
        let (name, at) = (Arc::clone(name), place(l, i));
        out.push(
            Check::worded_later(
                CheckId::Surge,
                if fails { Status::Fail } else { Status::Pass },
                Some(ps),
                Some(r),
                move || {
                    let mut m = crate::message![
                        format!("line {name}: operating pressure plus a surge of "),
                        head(surge_head),
                        " reaches ",
                        rating_against(ps, r),
                        " "
                    ];
                    m.append(&place_words(at));
                    m.push(" against the transient rating ");
                    m.push(rating_against(r, ps));
                    if fails {
                        m.push(format!("; {TRANSIENT_ADVICE}"));
                    }
                    m
                },
                source,
            )
            .about(l.name.clone()),
        );
    }
    out
}
