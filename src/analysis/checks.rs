//! The checks a reviewer asks for, each with its value, limit, status and the
//! source of its limit (the limits and their sources live in [`super::limits`]).
//!
//! Messages are typed ([`Message`]: words and SI quantities with their kinds), never
//! input syntax; the outputs print them in the design's report units. Limits are
//! compared in SI and printed so that a value and its limit never contradict each
//! other after rounding ([`Part::Against`]).

use super::duty::{Duty, Headroom};
use super::limits::{self, CheckId, Limit, Source};
use crate::message::{self, flow, head, Kind, Message, Part, Words};
use crate::model::{Case, Design, Metric, PumpCandidate, ReportUnits, Requirement};
use crate::numbers::Fixed;

/// The outcome of a check.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord)]
pub enum Status {
    /// Within the limit.
    Pass,
    /// Legal but outside the preferred range: a reviewer should look.
    Warn,
    /// Outside the limit: the candidate does not qualify.
    Fail,
}

impl Status {
    /// The status as written to JSON and the diff (`pass`, `warn`, `fail`).
    pub fn keyword(self) -> &'static str {
        match self {
            Status::Pass => "pass",
            Status::Warn => "warn",
            Status::Fail => "fail",
        }
    }
}

/// One check of one duty.
#[derive(Clone, Debug, PartialEq)]
pub struct Check {
    /// Which check.
    pub id: CheckId,
    /// Its outcome.
    pub status: Status,
    /// The value checked, SI or a fraction (the unit of the check's quantity).
    pub value: Option<f64>,
    /// The limit it is compared with, in the same unit.
    pub limit: Option<f64>,
    /// Plain language with typed quantities (printed in report units by the outputs);
    /// for the checks every duty has, made when read ([`Words::Later`]).
    pub message: Words,
    /// Where the limit comes from (printed by [`Check::source`]).
    pub origin: Source,
    /// What the check is about when an id has several per duty: the velocity's side
    /// (`suction`, `discharge`) or the requirement as written in the design.
    pub subject: Option<std::borrow::Cow<'static, str>>,
}

impl Check {
    /// A check with a typed source.
    pub fn typed(
        id: CheckId,
        status: Status,
        value: Option<f64>,
        limit: Option<f64>,
        message: impl Into<Message>,
        origin: Source,
    ) -> Check {
        // Kept for the whole analysis: no room left from its growth.
        let mut m: Message = message.into();
        m.parts.shrink_to_fit();
        Check::worded(id, status, value, limit, Words::Made(m), origin)
    }

    /// A check whose words are made when read, by `words` from the numbers it holds
    /// (see [`Words`]); otherwise as [`Check::typed`].
    pub fn worded_later(
        id: CheckId,
        status: Status,
        value: Option<f64>,
        limit: Option<f64>,
        words: impl Fn() -> Message + Send + Sync + 'static,
        origin: Source,
    ) -> Check {
        Check::worded(id, status, value, limit, Words::later(words), origin)
    }

    fn worded(
        id: CheckId,
        status: Status,
        value: Option<f64>,
        limit: Option<f64>,
        message: Words,
        origin: Source,
    ) -> Check {
        Check {
            id,
            status,
            value,
            limit,
            message,
            origin,
            subject: None,
        }
    }

    /// Where the limit comes from, as printed: the text of [`Check::origin`], made when
    /// an output asks (a case's checks are many and most are never printed).
    pub fn source(&self) -> String {
        self.origin.text()
    }

    /// The same check about a subject (see [`Check::subject`]).
    pub fn about(mut self, subject: impl Into<std::borrow::Cow<'static, str>>) -> Check {
        self.subject = Some(subject.into());
        self
    }
}

/// Preferred operating region, fraction of BEP flow (see [`limits::POR_LOW`]).
pub const POR: (f64, f64) = (limits::POR_LOW.value, limits::POR_HIGH.value);
/// Fail outside this band of BEP flow (see [`limits::AOR_LOW`]).
pub const AOR: (f64, f64) = (limits::AOR_LOW.value, limits::AOR_HIGH.value);
/// The bands of [`POR`] and [`AOR`] in words, as the operating-region check ends: made
/// once, not for every duty.
static REGION_BANDS: std::sync::LazyLock<String> = std::sync::LazyLock::new(|| {
    format!(
        " (preferred {}–{} %, outside {}–{} % fails)",
        Fixed(100.0 * POR.0, 0),
        Fixed(100.0 * POR.1, 0),
        Fixed(100.0 * AOR.0, 0),
        Fixed(100.0 * AOR.1, 0)
    )
});
/// Default NPSH margin ratio (see [`limits::NPSH_RATIO`]).
pub const DEFAULT_NPSH_RATIO: f64 = limits::NPSH_RATIO.value;
/// Typical suction velocities in the design's practice, m/s (see
/// [`limits::SUCTION_VELOCITY_LOW`]).
pub fn suction_velocity(units: ReportUnits) -> (f64, f64) {
    (
        limits::SUCTION_VELOCITY_LOW.for_units(units).value,
        limits::SUCTION_VELOCITY_HIGH.for_units(units).value,
    )
}

/// Typical discharge velocities in the design's practice, m/s (see
/// [`limits::DISCHARGE_VELOCITY_LOW`]).
pub fn discharge_velocity(units: ReportUnits) -> (f64, f64) {
    (
        limits::DISCHARGE_VELOCITY_LOW.for_units(units).value,
        limits::DISCHARGE_VELOCITY_HIGH.for_units(units).value,
    )
}

/// The NPSH limits a case must meet: the margin ratio ([`npsh_ratio_limit`]) and the
/// smallest excess of the design's practice ([`limits::NPSH_EXCESS`]).
pub fn npsh_limits(design: &Design, case: &Case) -> NpshLimits {
    NpshLimits {
        ratio: npsh_ratio_limit(design, case),
        excess: limits::NPSH_EXCESS.for_units(design.project.units),
    }
}

/// The two NPSH limits of a duty.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct NpshLimits {
    /// NPSHa / NPSH3 at least (a ratio).
    pub ratio: Limit,
    /// NPSHa − NPSH3 at least, m (below it: a warning).
    pub excess: Limit,
}

fn applies(r: &Requirement, case: &Case) -> bool {
    r.cases.is_empty() || r.cases.contains(&case.name)
}

/// The NPSH margin ratio a case must meet: the design's largest `npsh_margin >=`
/// requirement, else the default.
pub fn npsh_ratio_limit(design: &Design, case: &Case) -> Limit {
    design
        .requirements
        .iter()
        .filter(|r| r.metric == Metric::NpshMargin && r.at_least && applies(r, case))
        .map(|r| r.limit_si)
        .fold(None, |a: Option<f64>, b| Some(a.map_or(b, |a| a.max(b))))
        .map(|value| Limit {
            value,
            source: Source::DesignRequirement,
        })
        .unwrap_or(limits::NPSH_RATIO)
}

/// Checks of one duty point that need nothing beyond the case.
pub fn duty_checks(design: &Design, case: &Case, d: &Duty, p: &PumpCandidate) -> Vec<Check> {
    let mut out = pump_point_checks(design, case, d);
    for r in design.requirements.iter().filter(|r| applies(r, case)) {
        out.push(requirement_check(r, d));
    }
    out.extend(minimum_flow(d, p));
    out
}

/// The checks of one pump set at its own duty, without the design's requirements: the
/// same rules as [`duty_checks`] (operating region, NPSH margin, velocities, minimum
/// flow), for a well field's pumps, where the requirements apply to the field's total
/// ([`requirement_checks`]).
pub fn pump_checks(design: &Design, case: &Case, d: &Duty, p: &PumpCandidate) -> Vec<Check> {
    let mut out = pump_point_checks(design, case, d);
    out.extend(minimum_flow(d, p));
    out
}

/// Operating region, NPSH margin and velocities of one duty, the first checks of both
/// [`duty_checks`] and [`pump_checks`].
fn pump_point_checks(design: &Design, case: &Case, d: &Duty) -> Vec<Check> {
    let mut out = vec![operating_region(d)];
    out.push(npsh_margin(
        d.npsh_available,
        d.npsh_required,
        npsh_limits(design, case),
    ));
    out.extend(velocity_checks(d, design.project.units));
    out
}

/// The design's requirements that apply to `case`, checked against a duty.
pub fn requirement_checks(design: &Design, case: &Case, d: &Duty) -> Vec<Check> {
    design
        .requirements
        .iter()
        .filter(|r| applies(r, case))
        .map(|r| requirement_check(r, d))
        .collect()
}

/// Flow per pump against the stated minimum continuous flow (the manufacturer's
/// value; running below it overheats the liquid and loads the bearings, common practice).
fn minimum_flow(d: &Duty, p: &PumpCandidate) -> Option<Check> {
    let min = p
        .min_flow?
        .get::<uom::si::volume_rate::cubic_meter_per_second>();
    let ok = d.flow_per_pump >= min;
    Some(Check::typed(
        CheckId::MinimumFlow,
        if ok { Status::Pass } else { Status::Fail },
        Some(d.flow_per_pump),
        Some(min),
        crate::message![
            "flow per pump ",
            flow(d.flow_per_pump),
            if ok { " is at or above" } else { " is below" },
            " the minimum continuous flow ",
            flow(min),
            if ok {
                ""
            } else {
                ": add a minimum-flow bypass or choose a smaller pump"
            }
        ],
        Source::DesignData("the manufacturer's minimum continuous flow stated in the design"),
    ))
}

fn operating_region(d: &Duty) -> Check {
    let Some(r) = d.flow_ratio_to_bep else {
        return Check::typed(
            CheckId::OperatingRegion,
            Status::Warn,
            None,
            None,
            "no efficiency data: the best efficiency point is unknown",
            Source::DesignData("pump curve data"),
        );
    };
    let status = if (POR.0..=POR.1).contains(&r) {
        Status::Pass
    } else if (AOR.0..=AOR.1).contains(&r) {
        Status::Warn
    } else {
        Status::Fail
    };
    let limit = if r < 1.0 {
        limits::POR_LOW
    } else {
        limits::POR_HIGH
    };
    let origin = if status == Status::Fail {
        limits::AOR_LOW.source
    } else {
        limit.source
    };
    Check::worded_later(
        CheckId::OperatingRegion,
        status,
        Some(r),
        Some(limit.value),
        move || {
            crate::message![
                format!("flow per pump is {} % of BEP flow", Fixed(100.0 * r, 0)),
                REGION_BANDS.as_str()
            ]
        },
        origin,
    )
}

/// NPSH available against NPSH required (NPSH3, 3 % head drop) at one point.
pub fn npsh_margin(available: f64, required: Option<f64>, npsh: NpshLimits) -> Check {
    let (ratio, min_excess) = (npsh.ratio, npsh.excess.value);
    let Some(nr) = required.filter(|n| *n > 0.0) else {
        return Check::typed(
            CheckId::NpshMargin,
            if available <= 0.0 {
                Status::Fail
            } else {
                Status::Warn
            },
            None,
            Some(ratio.value),
            crate::message![
                "NPSH available is ",
                head(available),
                "; the curve gives no NPSH required at this flow: obtain it from the manufacturer"
            ],
            ratio.source,
        );
    };
    let r = available / nr;
    let excess = available - nr;
    let status = if available <= nr || r < ratio.value {
        Status::Fail
    } else if excess < min_excess {
        Status::Warn
    } else {
        Status::Pass
    };
    let origin = if status == Status::Warn {
        npsh.excess.source
    } else {
        ratio.source
    };
    let limit = ratio.value;
    Check::worded_later(
        CheckId::NpshMargin,
        status,
        Some(r),
        Some(limit),
        move || npsh_margin_words(available, nr, limit, min_excess),
        origin,
    )
}

/// The words of the NPSH-margin check: NPSH available and required (m), the limit
/// ratio and the least excess (m).
fn npsh_margin_words(available: f64, nr: f64, ratio: f64, min_excess: f64) -> Message {
    let r = available / nr;
    let excess = available - nr;
    let limit_ratio = Part::RatioAgainst(ratio, r);
    let mut msg = if available <= 0.0 {
        crate::message![
            "NPSH available is ",
            head(available),
            " (zero or negative): the liquid boils before it reaches the impeller; NPSH required ",
            head(nr),
            " (limit ratio ",
            limit_ratio,
            ")"
        ]
    } else {
        crate::message![
            "NPSH available ",
            head(available),
            " is ",
            Part::RatioAgainst(r, ratio),
            " times the NPSH required ",
            head(nr),
            " (limit ",
            limit_ratio,
            "); excess ",
            message::against(Kind::Head, excess, min_excess),
            " (at least ",
            message::against(Kind::Head, min_excess, excess),
            ")"
        ]
    };
    if available <= nr {
        msg.push_str(": the pump will cavitate");
    }
    msg
}

fn velocity_checks(d: &Duty, units: ReportUnits) -> Vec<Check> {
    let mut out = Vec::new();
    for (label, v, (lo, hi)) in [
        ("suction", d.suction_velocity, suction_velocity(units)),
        ("discharge", d.discharge_velocity, discharge_velocity(units)),
    ] {
        let Some(v) = v else { continue };
        let (status, note, bound) = if v > hi {
            (
                Status::Warn,
                "above the typical range: check losses, noise, erosion and surge",
                hi,
            )
        } else if v < lo {
            (
                Status::Pass,
                "below the typical range (larger pipe than usual)",
                lo,
            )
        } else {
            (Status::Pass, "within the typical range", hi)
        };
        let words = move || {
            let speed = |si, other| message::against(Kind::Velocity, si, other);
            crate::message![
                format!("{label} velocity at the pump "),
                speed(v, bound),
                format!(", {note} ("),
                speed(lo, v),
                " to ",
                speed(hi, v),
                ")"
            ]
        };
        out.push(
            Check::worded_later(
                CheckId::Velocity,
                status,
                Some(v),
                Some(hi),
                words,
                limits::SUCTION_VELOCITY_LOW.for_units(units).source,
            )
            .about(label),
        );
    }
    out
}

/// A requirement in plain words: "flow at least 560.0 m³/h (case peak)" in report units.
pub fn requirement_text(r: &Requirement) -> Message {
    let word = if r.at_least { "at least" } else { "at most" };
    let cases = match r.cases.len() {
        0 => String::new(),
        1 => format!(" (case {})", r.cases[0]),
        _ => format!(" (cases {})", r.cases.join(", ")),
    };
    crate::message![
        format!("{} {word} ", metric_words(r.metric)),
        metric_value(r.metric, r.limit_si),
        cases
    ]
}

fn metric_words(m: Metric) -> &'static str {
    match m {
        Metric::Flow => "flow",
        Metric::Head => "head",
        Metric::NpshMargin => "NPSH margin ratio",
        Metric::NpshExcess => "NPSH excess",
        Metric::Efficiency => "pump efficiency",
        Metric::SuctionVelocity => "suction velocity",
        Metric::DischargeVelocity => "discharge velocity",
        Metric::ShaftPower => "shaft power",
    }
}

/// A value of a requirement's quantity (SI, or a fraction or ratio) as a message part.
pub fn metric_value(m: Metric, si: f64) -> Part {
    match m {
        Metric::Flow => flow(si),
        Metric::Head | Metric::NpshExcess => head(si),
        Metric::NpshMargin => Part::from(crate::numbers::fixed(si, 2)),
        Metric::Efficiency => Part::Percent(si),
        Metric::SuctionVelocity | Metric::DischargeVelocity => message::value(Kind::Velocity, si),
        Metric::ShaftPower => message::value(Kind::Power, si),
    }
}

fn requirement_check(r: &Requirement, d: &Duty) -> Check {
    let value = match r.metric {
        Metric::Flow => Some(d.flow),
        Metric::Head => Some(d.head),
        Metric::NpshMargin => d
            .npsh_required
            .filter(|n| *n > 0.0)
            .map(|n| d.npsh_available / n),
        Metric::NpshExcess => d.npsh_required.map(|n| d.npsh_available - n),
        Metric::Efficiency => d.efficiency,
        Metric::SuctionVelocity => d.suction_velocity,
        Metric::DischargeVelocity => d.discharge_velocity,
        Metric::ShaftPower => d.shaft_power,
    };
    let text = requirement_text(r);
    let check = match value {
        Some(v) => {
            // A solved duty meets its target to the solver's tolerance (1e-9 relative).
            let tol = 1e-7 * r.limit_si.abs();
            let ok = if r.at_least {
                v >= r.limit_si - tol
            } else {
                v <= r.limit_si + tol
            };
            Check::typed(
                CheckId::Requirement,
                if ok { Status::Pass } else { Status::Fail },
                Some(v),
                Some(r.limit_si),
                {
                    let mut m = text;
                    m.push(if ok { ": met, " } else { ": not met, " });
                    m.push(metric_value(r.metric, v));
                    m
                },
                Source::DesignRequirement,
            )
        }
        None => Check::typed(
            CheckId::Requirement,
            Status::Fail,
            None,
            Some(r.limit_si),
            {
                let mut m = text;
                m.push(": no value to compare (missing curve data)");
                m
            },
            Source::DesignRequirement,
        ),
    };
    check.about(r.text.clone())
}

/// The headroom check of an adjusted pump: warn below [`limits::HEADROOM`], fail
/// when the limit is short of what the requirement needs.
pub fn headroom_check(headroom: &Option<Headroom>) -> Option<Check> {
    let h = headroom.as_ref()?;
    let what = match h.limit {
        super::duty::AdjustLimit::Speed => "speed",
        super::duty::AdjustLimit::Trim => "impeller diameter",
    };
    let Some(fraction) = h.fraction() else {
        return Some(Check::typed(
            CheckId::Headroom,
            Status::Fail,
            None,
            Some(limits::HEADROOM.value),
            format!("the flow requirement cannot be reached at any {what}"),
            limits::HEADROOM.source,
        ));
    };
    let needed = h.needed.unwrap_or(0.0);
    let status = if fraction < -1e-9 {
        Status::Fail
    } else if fraction < limits::HEADROOM.value {
        Status::Warn
    } else {
        Status::Pass
    };
    Some(Check::typed(
        CheckId::Headroom,
        status,
        Some(fraction),
        Some(limits::HEADROOM.value),
        crate::message![
            format!(
                "{what} needed {:.1} % of the published value against a limit of {:.1} %: headroom ",
                100.0 * needed,
                100.0 * h.limit_value,
            ),
            Part::PercentAgainst(fraction, limits::HEADROOM.value),
            " (at least ",
            Part::PercentAgainst(limits::HEADROOM.value, fraction),
            ")"
        ],
        limits::HEADROOM.source,
    ))
}
