//! The check ids and the limits the checks compare against, each limit one constant
//! with its source as a typed value (issue 19, items 5 and 7).
//!
//! Limits are compared in SI; the outputs print them in report units.

use crate::model::ReportUnits;

/// The stable id of a check: `as_str()` is the string of the JSON and the diff.
#[derive(Clone, Copy, Debug, PartialEq, Eq, PartialOrd, Ord, Hash)]
pub enum CheckId {
    /// The pump curve meets the system curve (or why it does not).
    DutyPoint,
    /// Flow per pump against the best efficiency point.
    OperatingRegion,
    /// NPSH available against NPSH required (ratio and excess).
    NpshMargin,
    /// Velocity in the pipe next to the pump.
    Velocity,
    /// A requirement stated in the design.
    Requirement,
    /// Motor nameplate against the shaft power of the duty and along the curve.
    Motor,
    /// Speed or diameter needed against its limit (variable speed or trim).
    Headroom,
    /// One pump of a parallel set running alone against the lowest-head case.
    OnePumpAlone,
    /// Highest operating pressure along a line against the pipe and fitting ratings.
    PressureRating,
    /// Shut-off pressure along a discharge line against the ratings.
    ShutoffPressure,
    /// Lowest steady pressure along a line against a stated minimum (air ingress).
    MinimumPressure,
    /// Lowest steady pressure against vapour pressure plus a margin.
    VapourMargin,
    /// Pump-trip downsurge along the profile against vapour pressure.
    ColumnSeparation,
    /// Surge (valve closure, pump trip) plus operating pressure against the transient rating.
    Surge,
    /// A network node's pressure at the duty: against its required residual pressure,
    /// atmospheric pressure and the vapour pressure.
    NodePressure,
    /// Flow per pump against the stated minimum continuous flow.
    MinimumFlow,
    /// Every load point of the profile delivered.
    ProfileDelivery,
    /// Hours of the profile outside the preferred and allowable operating regions.
    ProfileRegion,
    /// Hours below the minimum continuous flow.
    ProfileMinFlow,
    /// Hours at minimum speed with the surplus head throttled.
    ProfileMinSpeed,
    /// NPSH margin at every load point.
    ProfileNpsh,
    /// Motor load at every load point.
    ProfileMotorLoad,
    /// Shut-off head at minimum speed against the static head plus a margin.
    Deadhead,
    /// Starts per hour of on/off control against the motor's limit.
    StartsPerHour,
    /// Hours where the control curve lies below the system curve.
    ControlCurve,
    /// A network valve's opening at the duty against the usual 10–90 % control range.
    ValveOpening,
    /// A network control valve's authority at the duty against its usual minimum.
    ValveAuthority,
    /// A glycol mixture's temperature against its freezing point plus a margin.
    FreezeMargin,
    /// A closed loop's high point at rest, at the minimum reference pressure, against
    /// the least pressure it must keep (air ingress).
    LoopHighPoint,
    /// A network without a downstream tank: the duty flow against the design demands.
    DesignDemand,
}

impl CheckId {
    /// Every check id, in the order the package lists them.
    pub const ALL: [CheckId; 30] = [
        CheckId::DutyPoint,
        CheckId::OperatingRegion,
        CheckId::NpshMargin,
        CheckId::Velocity,
        CheckId::Requirement,
        CheckId::Motor,
        CheckId::Headroom,
        CheckId::OnePumpAlone,
        CheckId::PressureRating,
        CheckId::ShutoffPressure,
        CheckId::MinimumPressure,
        CheckId::VapourMargin,
        CheckId::ColumnSeparation,
        CheckId::Surge,
        CheckId::NodePressure,
        CheckId::MinimumFlow,
        CheckId::ProfileDelivery,
        CheckId::ProfileRegion,
        CheckId::ProfileMinFlow,
        CheckId::ProfileMinSpeed,
        CheckId::ProfileNpsh,
        CheckId::ProfileMotorLoad,
        CheckId::Deadhead,
        CheckId::StartsPerHour,
        CheckId::ControlCurve,
        CheckId::ValveOpening,
        CheckId::ValveAuthority,
        CheckId::FreezeMargin,
        CheckId::LoopHighPoint,
        CheckId::DesignDemand,
    ];

    /// The id as the JSON and the diff spell it.
    pub fn as_str(self) -> &'static str {
        match self {
            CheckId::DutyPoint => "duty-point",
            CheckId::OperatingRegion => "operating-region",
            CheckId::NpshMargin => "npsh-margin",
            CheckId::Velocity => "velocity",
            CheckId::Requirement => "requirement",
            CheckId::Motor => "motor",
            CheckId::Headroom => "headroom",
            CheckId::OnePumpAlone => "one-pump-alone",
            CheckId::PressureRating => "pressure-rating",
            CheckId::ShutoffPressure => "shutoff-pressure",
            CheckId::MinimumPressure => "minimum-pressure",
            CheckId::VapourMargin => "vapour-margin",
            CheckId::ColumnSeparation => "column-separation",
            CheckId::Surge => "surge",
            CheckId::NodePressure => "node-pressure",
            CheckId::MinimumFlow => "minimum-flow",
            CheckId::ProfileDelivery => "profile-delivery",
            CheckId::ProfileRegion => "profile-operating-region",
            CheckId::ProfileMinFlow => "profile-min-flow",
            CheckId::ProfileMinSpeed => "profile-min-speed",
            CheckId::ProfileNpsh => "profile-npsh-margin",
            CheckId::ProfileMotorLoad => "profile-motor-load",
            CheckId::Deadhead => "deadhead",
            CheckId::StartsPerHour => "starts-per-hour",
            CheckId::ControlCurve => "control-curve",
            CheckId::ValveOpening => "valve-opening",
            CheckId::ValveAuthority => "valve-authority",
            CheckId::FreezeMargin => "freeze-margin",
            CheckId::LoopHighPoint => "loop-high-point",
            CheckId::DesignDemand => "design-demand",
        }
    }

    /// One line saying what the check compares.
    pub fn description(self) -> &'static str {
        match self {
            CheckId::DutyPoint => "the pump curve meets the system curve within the published data",
            CheckId::OperatingRegion => "flow per pump as a fraction of the best-efficiency flow",
            CheckId::NpshMargin => "NPSH available against NPSH required: margin ratio and excess",
            CheckId::Velocity => "velocity in the pipe next to the pump against typical values",
            CheckId::Requirement => "a requirement the design states",
            CheckId::Motor => {
                "motor nameplate rating against the shaft power at duty and to run-out"
            }
            CheckId::Headroom => {
                "speed or impeller diameter needed against the limit the design allows"
            }
            CheckId::OnePumpAlone => {
                "one pump of a parallel set running alone after the others trip"
            }
            CheckId::PressureRating => {
                "highest operating pressure along a line against the weakest rating there"
            }
            CheckId::ShutoffPressure => {
                "pressure along a discharge line at pump shut-off against the ratings"
            }
            CheckId::MinimumPressure => {
                "lowest steady pressure along a line against a stated minimum (air ingress)"
            }
            CheckId::VapourMargin => {
                "lowest steady absolute pressure against vapour pressure plus a margin"
            }
            CheckId::ColumnSeparation => {
                "pump-trip downsurge along the profile against vapour pressure (screening)"
            }
            CheckId::Surge => {
                "surge head plus operating pressure against the transient rating (screening)"
            }
            CheckId::MinimumFlow => {
                "flow per pump against the manufacturer's minimum continuous flow"
            }
            CheckId::NodePressure => {
                "network node pressure at the duty against its required residual pressure, atmospheric and vapour pressure"
            }
            CheckId::ProfileDelivery => "every load point of the profile is delivered",
            CheckId::ProfileRegion => "hours of the profile outside the preferred operating region",
            CheckId::ProfileMinFlow => {
                "flow per pump against the minimum continuous flow at every load point"
            }
            CheckId::ProfileMinSpeed => "hours at minimum speed with the surplus head throttled",
            CheckId::ProfileNpsh => "NPSH margin ratio at every load point of the profile",
            CheckId::ProfileMotorLoad => "motor load (shaft power / nameplate) at every load point",
            CheckId::Deadhead => {
                "shut-off head at minimum speed against the static head plus a margin"
            }
            CheckId::StartsPerHour => "starts per hour of on/off control against the motor's limit",
            CheckId::ControlCurve => "hours where the control curve lies below the system curve",
            CheckId::ValveOpening => {
                "network valve opening at the duty against the usual 10 % to 90 % control range"
            }
            CheckId::ValveAuthority => {
                "network control valve authority at the duty (fully open valve drop over the drop between its end nodes)"
            }
            CheckId::FreezeMargin => {
                "glycol mixture temperature against its freezing point plus a margin"
            }
            CheckId::LoopHighPoint => {
                "closed loop high point at rest, at the minimum reference pressure, against its least pressure (air ingress)"
            }
            CheckId::DesignDemand => {
                "a demand-only network's duty flow against the sum of its design demands (scale 1)"
            }
        }
    }
}

impl std::fmt::Display for CheckId {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(self.as_str())
    }
}

impl PartialEq<&str> for CheckId {
    fn eq(&self, other: &&str) -> bool {
        self.as_str() == *other
    }
}

/// Where a limit or a value comes from.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum Source {
    /// A publication's clause or table, read from the document.
    Publication {
        /// Title of the publication, with its edition.
        title: &'static str,
        /// Clause, table or figure.
        clause: &'static str,
    },
    /// A publication's value recalled, not read from the edition in force.
    Recalled {
        /// Title of the publication, with its edition.
        title: &'static str,
        /// Clause, table or figure.
        clause: &'static str,
    },
    /// Common engineering practice, with a word on what.
    CommonPractice(&'static str),
    /// A requirement the design states.
    DesignRequirement,
    /// The design's own data (curves, tables) or a method applied to them.
    DesignData(&'static str),
}

impl Source {
    /// The source as the package prints it.
    pub fn text(&self) -> String {
        match self {
            Source::Publication { title, clause } => format!("{title}, {clause}"),
            Source::Recalled { title, clause } => format!("{title}, {clause} (recalled)"),
            Source::CommonPractice(what) => format!("{what}, common practice"),
            Source::DesignRequirement => "the design's requirement".to_string(),
            Source::DesignData(what) => (*what).to_string(),
        }
    }
}

/// A limit: its value (SI or a fraction) and its source.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct Limit {
    /// The limit, SI or a fraction (the unit of its quantity).
    pub value: f64,
    /// Where it comes from.
    pub source: Source,
}

impl Limit {
    /// A limit recalled from a publication's clause (not read from the edition in force).
    pub const fn recalled(value: f64, title: &'static str, clause: &'static str) -> Limit {
        Limit {
            value,
            source: Source::Recalled { title, clause },
        }
    }

    /// A limit of common engineering practice, with a word on what.
    pub const fn common_practice(value: f64, what: &'static str) -> Limit {
        Limit {
            value,
            source: Source::CommonPractice(what),
        }
    }

    /// Another value with the same source, e.g. the other end of a range.
    pub const fn with_value(self, value: f64) -> Limit {
        Limit {
            value,
            source: self.source,
        }
    }
}

/// ANSI/HI 9.6.3 (Rotodynamic pumps, guideline for operating regions).
const HI_963: &str = "ANSI/HI 9.6.3-2017 Rotodynamic Pumps — Guideline for Operating Regions";
/// ANSI/HI 9.6.1 (Rotodynamic pumps, guideline for NPSH margin).
const HI_961: &str = "ANSI/HI 9.6.1-2017 Rotodynamic Pumps — Guideline for NPSH Margin";

/// Preferred operating region, lower end: 70 % of BEP flow.
pub const POR_LOW: Limit = Limit::recalled(0.70, HI_963, "preferred operating region");
/// Preferred operating region, upper end: 120 % of BEP flow.
pub const POR_HIGH: Limit = POR_LOW.with_value(1.20);
/// Below this fraction of BEP flow operation fails (stand-in for the maker's allowable
/// operating region, which only the maker can give).
pub const AOR_LOW: Limit = Limit::common_practice(
    0.50,
    "allowable operating region stand-in 50–130 % of BEP flow",
);
/// Above this fraction of BEP flow operation fails.
pub const AOR_HIGH: Limit = AOR_LOW.with_value(1.30);
/// NPSH margin ratio NPSHa/NPSH3 when the design states none: 1.3, within the 1.1–2.0
/// range of ANSI/HI 9.6.1 for general water services.
pub const NPSH_RATIO: Limit = Limit::recalled(1.3, HI_961, "NPSH margin ratio guidance");
/// A rule of thumb the trade states as a round figure in each system of units (1 m of
/// NPSH excess in SI practice, 3 ft in US practice): the design's units pick the figure,
/// so a US package reads "2 ft/s to 5 ft/s", not the metric figure converted.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct PracticeLimit {
    /// The SI practice figure (SI value).
    pub si: Limit,
    /// The US practice figure, converted exactly to SI (SI value).
    pub us: Limit,
}

impl PracticeLimit {
    /// The figure of the design's system of units.
    pub const fn for_units(&self, units: ReportUnits) -> Limit {
        match units {
            ReportUnits::Si => self.si,
            ReportUnits::Us => self.us,
        }
    }
}

/// One foot, m (exact, by the 1959 international yard and pound agreement).
const FT: f64 = 0.3048;

/// Smallest NPSH excess NPSHa − NPSHr, m: 1 m in SI practice, 3 ft in US practice.
pub const NPSH_EXCESS: PracticeLimit = PracticeLimit {
    si: Limit::common_practice(1.0, "NPSH excess of about 1 m"),
    us: Limit::common_practice(3.0 * FT, "NPSH excess of about 3 ft"),
};
/// Typical suction velocity, m/s, lower end: 0.6 m/s (SI practice), 2 ft/s (US).
pub const SUCTION_VELOCITY_LOW: PracticeLimit = PracticeLimit {
    si: Limit::common_practice(0.6, "typical velocities"),
    us: Limit::common_practice(2.0 * FT, "typical velocities"),
};
/// Typical suction velocity, m/s, upper end: 1.5 m/s (SI practice), 5 ft/s (US).
pub const SUCTION_VELOCITY_HIGH: PracticeLimit = PracticeLimit {
    si: SUCTION_VELOCITY_LOW.si.with_value(1.5),
    us: SUCTION_VELOCITY_LOW.us.with_value(5.0 * FT),
};
/// Typical discharge velocity, m/s, lower end: 1.5 m/s (SI practice), 5 ft/s (US).
pub const DISCHARGE_VELOCITY_LOW: PracticeLimit = SUCTION_VELOCITY_HIGH;
/// Typical discharge velocity, m/s, upper end: 3 m/s (SI practice), 10 ft/s (US).
pub const DISCHARGE_VELOCITY_HIGH: PracticeLimit = PracticeLimit {
    si: SUCTION_VELOCITY_LOW.si.with_value(3.0),
    us: SUCTION_VELOCITY_LOW.us.with_value(10.0 * FT),
};
/// Smallest headroom of speed or diameter to its limit, as a fraction of the limit: 5 %.
pub const HEADROOM: Limit = Limit::common_practice(0.05, "speed or diameter headroom of 5 %");
/// Site altitude up to which motor ratings hold, m (with 40 °C ambient): IEC 60034-1
/// and NEMA MG 1 usual service conditions.
pub const MOTOR_ALTITUDE_M: Limit = Limit::recalled(
    1000.0,
    "IEC 60034-1 Rotating electrical machines — Rating and performance; NEMA MG 1 Motors and Generators",
    "usual service conditions: altitude up to 1000 m, ambient up to 40 °C",
);
/// Ambient temperature up to which motor ratings hold, K (40 °C).
pub const MOTOR_AMBIENT_K: Limit = MOTOR_ALTITUDE_M.with_value(313.15);
/// Motor rating and service factor: NEMA MG 1 (service factor; Parts 30/31 for inverter
/// supply) and IEC 60034-1 (continuous duty S1 rating; it defines no service factor).
pub const MOTOR_RATING_SOURCE: Source = Source::Recalled {
    title: "NEMA MG 1 Motors and Generators (service factor; Parts 30 and 31 on inverter supply); IEC 60034-1 (continuous duty S1)",
    clause: "nameplate rating covers the largest shaft power, service factor as margin only (sizing rule: common practice)",
};
/// The standard rating series the motor is chosen from, NEMA.
pub const NEMA_SERIES: Source = Source::Recalled {
    title: "NEMA MG 1 Motors and Generators",
    clause: "standard horsepower ratings",
};
/// The standard rating series the motor is chosen from, IEC.
pub const IEC_SERIES: Source = Source::Recalled {
    title: "IEC 60072-1 Dimensions and output series for rotating electrical machines",
    clause: "preferred rated outputs",
};
/// Motor load below which a motor is lightly loaded and its efficiency falls off:
/// 40 % of nameplate (common practice; the typical part-load curves steepen there).
pub const MOTOR_LIGHT_LOAD: Limit = Limit {
    value: 0.40,
    source: Source::CommonPractice("motor load of at least 40 % of nameplate"),
};
/// Deadhead margin: shut-off head at minimum speed above the static head by 10 % of it
/// (dutyline's default; the design states its own with `deadhead_margin`).
pub const DEADHEAD_MARGIN: Limit = Limit {
    value: crate::model::operation::DEFAULT_DEADHEAD_MARGIN_FRACTION,
    source: Source::CommonPractice(
        "shut-off head at minimum speed above the static head by a margin",
    ),
};
/// Starts per hour a motor allows when the design states none.
pub const STARTS_PER_HOUR: Limit = Limit {
    value: crate::model::operation::DEFAULT_MAX_STARTS_PER_HOUR,
    source: Source::Recalled {
        title: "NEMA MG 1 Motors and Generators, Part 12 (12.54, number of successive starts); the motor maker's limit governs",
        clause: "6 starts per hour for small and medium motors (common practice)",
    },
};

/// Lowest steady gauge pressure along a line, Pa: 2 m of water (≈ 20 kPa, 2.8 psi)
/// above atmospheric, so that air valves at high points do not admit air and joints
/// do not draw in ground water.
pub const MIN_STEADY_PRESSURE_PA: Limit = Limit {
    value: 2.0 * 9.80665 * 1000.0,
    source: Source::CommonPractice(
        "lowest steady pressure of 2 m of water above atmospheric at high points",
    ),
};
/// Margin of the lowest absolute pressure above vapour pressure, Pa: 1 m of water
/// (≈ 10 kPa).
pub const VAPOUR_MARGIN_PA: Limit = Limit {
    value: 9.80665 * 1000.0,
    source: Source::CommonPractice("margin of 1 m of water above vapour pressure"),
};
/// Pump test acceptance tolerance on head added to the shut-off head: +5 % (ISO 9906
/// grade 2B head tolerance ±5 %).
pub const SHUTOFF_TOLERANCE: Limit = Limit {
    value: 0.05,
    source: Source::Recalled {
        title: "ISO 9906:2012 Rotodynamic pumps — Hydraulic performance acceptance tests",
        clause: "Table 8, grade 2B head tolerance ±5 %",
    },
};
/// Density of cold water for the shut-off pressure, kg/m³ (water at 4 °C, 999.97 kg/m³,
/// IAPWS-95; taken as 1000).
pub const COLD_WATER_DENSITY: Limit = Limit {
    value: 1000.0,
    source: Source::CommonPractice("cold water, 1000 kg/m³"),
};
/// Free-gas volume fraction for the lowest credible wave speed: 0.1 % (Wylie and
/// Streeter, *Fluid Transients in Systems*, 1993, §9.2: a few tenths of a per cent of
/// free air halve the wave speed).
pub const ENTRAINED_AIR_FRACTION: Limit = Limit {
    value: 0.001,
    source: Source::Recalled {
        title: "Wylie and Streeter, Fluid Transients in Systems (1993)",
        clause: "§9.2, wave speed with free gas",
    },
};
/// Effective closure time of a gate or butterfly valve as a fraction of its full
/// stroke: 20 %, the lower end of the usual 20–25 % (the flow is cut in the last part
/// of the stroke).
pub const EFFECTIVE_CLOSURE_FRACTION: Limit = Limit {
    value: 0.20,
    source: Source::CommonPractice(
        "effective closure time of 20 % of the stroke (gate, butterfly)",
    ),
};

/// Smallest valve opening with fair control resolution: 10 % (near shut, a small
/// movement changes the flow much, and the plug and seat wear).
pub const VALVE_OPENING_LOW: Limit =
    Limit::common_practice(0.10, "a valve works between about 10 % and 90 % open");
/// Largest valve opening that leaves a control margin: 90 %.
pub const VALVE_OPENING_HIGH: Limit = VALVE_OPENING_LOW.with_value(0.90);
/// Smallest control-valve authority: 0.25 (about 0.5 is the usual design aim).
pub const VALVE_AUTHORITY: Limit = Limit::common_practice(
    0.25,
    "a control valve authority of at least 0.25, about 0.5 typical",
);

/// Least margin of a glycol mixture's temperature above its freezing point, K: 3 K
/// (freeze protection is usually specified a few kelvin below the lowest temperature
/// the fluid can see; common practice).
pub const FREEZE_MARGIN_K: Limit = Limit::common_practice(
    3.0,
    "glycol freezing point at least 3 K below the fluid temperature",
);
/// Least gauge pressure at a closed loop's high point when the design states none, Pa:
/// 30 kPa (0.3 bar), so that air vents do not draw air in (common practice).
pub const LOOP_HIGH_POINT_PA: Limit = Limit::common_practice(
    30.0e3,
    "least gauge pressure of 30 kPa at a closed loop's high point",
);

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn ids_are_distinct_and_described() {
        let mut seen = std::collections::BTreeSet::new();
        for id in CheckId::ALL {
            assert!(seen.insert(id.as_str()), "duplicate id {id}");
            assert!(!id.description().is_empty());
        }
    }

    #[test]
    fn sources_print_their_kind() {
        assert!(NPSH_RATIO.source.text().ends_with("(recalled)"));
        assert!(HEADROOM.source.text().ends_with("common practice"));
        assert_eq!(Source::DesignRequirement.text(), "the design's requirement");
    }
}
