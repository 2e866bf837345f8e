//! The safety checks of one case, per line: operating and shut-off pressure against
//! the ratings, the lowest pressure against a stated minimum and against vapour
//! pressure plus a margin, the pump-trip downsurge against vapour pressure, and surge
//! plus operating pressure against the transient rating. Limits live in
//! [`crate::analysis::limits`].

use super::{max_at, CaseSafety, LineSafety};
use crate::analysis::checks::{Check, Status};
use crate::analysis::limits::{self, CheckId, Source};
use crate::analysis::system::G;
use crate::display::Units;
use crate::model::{Design, Side};

/// The sentence every failing surge screen ends with.
pub const TRANSIENT_ADVICE: &str =
    "a screening estimate: a full transient (water-hammer) analysis is needed";

/// Where a station is, in report units ("at 805 ft chainage, elevation 1352.0 ft").
fn place(units: &Units, l: &LineSafety, i: usize) -> String {
    let st = &l.stations[i];
    format!(
        "at chainage {}, elevation {}",
        units.length().fmt(st.chainage),
        units.elevation().fmt(st.elevation)
    )
}

/// All safety checks of a case.
pub fn line_checks(design: &Design, c: &CaseSafety) -> Vec<Check> {
    let units = Units::new(design.project.units);
    let mut out = Vec::new();
    for l in &c.lines {
        if let Some(p) = &l.pressure_duty {
            out.extend(rating_check(
                &units,
                l,
                p,
                CheckId::PressureRating,
                "operating",
            ));
            out.extend(minimum_checks(&units, l));
        }
        if let Some(p) = &l.pressure_shutoff {
            out.extend(rating_check(
                &units,
                l,
                p,
                CheckId::ShutoffPressure,
                "shut-off",
            ));
        }
        out.extend(surge_checks(&units, l));
    }
    out
}

/// Pressure against the working rating along a line: the station nearest its rating.
fn rating_check(
    units: &Units,
    l: &LineSafety,
    p: &[f64],
    id: CheckId,
    what: &str,
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
        return Some(
            Check::typed(
                id,
                Status::Warn,
                Some(pmax),
                None,
                format!(
                    "line {}: highest {what} pressure {} {}; no segment has a rating (give `rating = ...` from the manufacturer)",
                    l.name,
                    units.rating().fmt(pmax),
                    place(units, l, i)
                ),
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
    let (vs, rs) = units.rating().fmt_against(pv, r);
    let unrated = l.rating_at.iter().filter(|r| r.is_none()).count();
    let note = if unrated > 0 {
        "; some segments have no rating"
    } else {
        ""
    };
    Some(
        Check::typed(
            id,
            status,
            Some(pv),
            Some(r),
            format!(
                "line {}: {what} pressure {vs} against the rating {rs} {}{note}",
                l.name,
                place(units, l, i)
            ),
            source,
        )
        .about(l.name.clone()),
    )
}

/// Lowest duty pressure against the stated minimum and against vapour pressure plus
/// the margin.
fn minimum_checks(units: &Units, l: &LineSafety) -> Vec<Check> {
    let Some((pmin, i)) = l.min_duty() else {
        return Vec::new();
    };
    let mut out = Vec::new();
    // The suction line of a lift (source below the pump) runs below atmospheric by
    // design; the stated minimum is for lines under positive pressure.
    if l.side == Side::Discharge {
        let lim = limits::MIN_STEADY_PRESSURE_PA;
        let (vs, ls) = units.pressure().fmt_against(pmin, lim.value);
        out.push(
            Check::typed(
                CheckId::MinimumPressure,
                if pmin < lim.value { Status::Warn } else { Status::Pass },
                Some(pmin),
                Some(lim.value),
                format!(
                    "line {}: lowest operating pressure {vs} {}; at least {ls} keeps air valves from admitting air",
                    l.name,
                    place(units, l, i)
                ),
                lim.source,
            )
            .about(l.name.clone()),
        );
    }
    let margin = limits::VAPOUR_MARGIN_PA;
    let floor = l.vapour_gauge + margin.value;
    let (vs, ls) = units.pressure().fmt_against(pmin, floor);
    out.push(
        Check::typed(
            CheckId::VapourMargin,
            if pmin < floor { Status::Fail } else { Status::Pass },
            Some(pmin),
            Some(floor),
            format!(
                "line {}: lowest operating pressure {vs} (gauge) {} against vapour pressure plus margin {ls} (gauge)",
                l.name,
                place(units, l, i)
            ),
            margin.source,
        )
        .about(l.name.clone()),
    );
    out
}

/// The surge screens of a line: pump-trip downsurge against vapour pressure
/// (discharge lines) and surge plus operating pressure against the transient rating.
fn surge_checks(units: &Units, l: &LineSafety) -> Vec<Check> {
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
            let (vs, ls) = units.head().fmt_against(down, room);
            out.push(
                Check::typed(
                    CheckId::ColumnSeparation,
                    if fails { Status::Fail } else { Status::Pass },
                    Some(down),
                    Some(room),
                    format!(
                        "line {}: a pump-trip downsurge of {vs} against {ls} of head above vapour pressure {}{}",
                        l.name,
                        place(units, l, i),
                        if fails {
                            format!("; the column may separate there, and its rejoin and check-valve slam can exceed the Joukowsky rise: {TRANSIENT_ADVICE}")
                        } else {
                            String::new()
                        }
                    ),
                    source,
                )
                .about(l.name.clone()),
            );
        }
    }
    let head = sg
        .valve
        .as_ref()
        .map(|v| v.head)
        .unwrap_or(0.0)
        .max(if l.side == Side::Discharge {
            sg.joukowsky_head
        } else {
            0.0
        });
    if head <= 0.0 {
        return out;
    }
    let worst = p
        .iter()
        .zip(&l.transient_at)
        .enumerate()
        .filter_map(|(i, (p, r))| r.map(|r| (i, p + l.density * G * head, r)))
        .max_by(|a, b| (a.1 / a.2).total_cmp(&(b.1 / b.2)));
    if let Some((i, ps, r)) = worst {
        let fails = ps > r;
        let (vs, rs) = units.rating().fmt_against(ps, r);
        out.push(
            Check::typed(
                CheckId::Surge,
                if fails { Status::Fail } else { Status::Pass },
                Some(ps),
                Some(r),
                format!(
                    "line {}: operating pressure plus a surge of {} reaches {vs} {} against the transient rating {rs}{}",
                    l.name,
                    units.head().fmt(head),
                    place(units, l, i),
                    if fails { format!("; {TRANSIENT_ADVICE}") } else { String::new() }
                ),
                source,
            )
            .about(l.name.clone()),
        );
    }
    out
}
