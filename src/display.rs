//! Report units: SI engine values shown in the design's chosen units.
//! The one place where outputs (report, text results, diff) turn SI into
//! the units a reader sees. Factors are NIST SP 811 (2008), Appendix B.

use crate::message::{Kind, Message, Part};
use crate::model::ReportUnits;
pub use crate::numbers::{count, plain, significant, significant_trimmed, typeset};
use crate::numbers::{fixed, Fixed};

/// A unit of display: label, and SI value → displayed value.
#[derive(Clone, Copy, Debug)]
pub struct Shown {
    /// The unit's label as printed (`gpm`, `m³/h`).
    pub label: &'static str,
    factor: f64,
    offset: f64,
    /// Decimal places usually shown.
    pub decimals: usize,
}

impl Shown {
    /// The SI value `si` in this unit.
    pub fn value(&self, si: f64) -> f64 {
        si / self.factor - self.offset
    }
    /// "123.4 gpm"
    pub fn fmt(&self, si: f64) -> String {
        format!("{} {}", plain(self.value(si), self.decimals), self.label)
    }
    /// "123.4" without the unit.
    pub fn num(&self, si: f64) -> String {
        plain(self.value(si), self.decimals)
    }
    /// A value and the limit it is compared with, each with its unit, with as many more
    /// decimals (up to four) as it takes for two different values not to print alike,
    /// so that "4.92 ft/s is above 4.92 ft/s" cannot happen.
    pub fn fmt_against(&self, value: f64, limit: f64) -> (String, String) {
        let decimals = decimals_apart(self.decimals, self.value(value), self.value(limit));
        (
            format!("{} {}", plain(self.value(value), decimals), self.label),
            format!("{} {}", plain(self.value(limit), decimals), self.label),
        )
    }
    /// As [`Shown::fmt`], typeset for print: a minus sign (U+2212), never "−0.0".
    pub fn text(&self, si: f64) -> String {
        format!("{} {}", typeset(self.value(si), self.decimals), self.label)
    }
    /// As [`Shown::num`], typeset for print: a minus sign (U+2212), never "−0.0".
    pub fn figure(&self, si: f64) -> String {
        typeset(self.value(si), self.decimals)
    }
    /// A column of figures (SI values, in order) with as many more decimals (up to
    /// three) as it takes for neighbours that differ not to print alike, so a table of
    /// stations never shows "4, 4" for 3.9 and 4.4; equal neighbours still print alike.
    pub fn figures_apart(&self, column: &[f64]) -> Vec<String> {
        let shown: Vec<f64> = column.iter().map(|&si| self.value(si)).collect();
        let decimals = shown
            .windows(2)
            .map(|w| decimals_apart(self.decimals, w[0], w[1]).min(self.decimals + 3))
            .max()
            .unwrap_or(self.decimals);
        shown.iter().map(|&v| typeset(v, decimals)).collect()
    }
}

/// The fewest decimals, from `base` up to `base + 4`, at which `a` and `b` print
/// differently (or `base` when they are equal).
fn decimals_apart(base: usize, a: f64, b: f64) -> usize {
    let mut decimals = base;
    while a != b && decimals < base + 4 && fixed(a, decimals) == fixed(b, decimals) {
        decimals += 1;
    }
    decimals
}

/// A ratio and its limit with two decimals or more (see [`Shown::fmt_against`]).
pub fn ratio_against(value: f64, limit: f64) -> (String, String) {
    let decimals = decimals_apart(2, value, limit);
    (plain(value, decimals), plain(limit, decimals))
}

/// A fraction and its limit as percentages with one decimal or more.
pub fn percent_against(value: f64, limit: f64) -> (String, String) {
    let (a, b) = (100.0 * value, 100.0 * limit);
    let decimals = decimals_apart(1, a, b);
    (
        format!("{} %", plain(a, decimals)),
        format!("{} %", plain(b, decimals)),
    )
}

/// A signed change for print, "+0.2 %", "−1.5 %", and "0.0 %" for a change that
/// rounds to zero.
pub fn signed_percent(percent: f64, decimals: usize) -> String {
    let text = typeset(percent, decimals);
    if text.starts_with('\u{2212}') || text.chars().all(|c| c == '0' || c == '.') {
        format!("{text} %")
    } else {
        format!("+{text} %")
    }
}

const FT: f64 = 0.3048;
const IN: f64 = 0.0254;
const GAL: f64 = 3.785411784e-3;
const PSI: f64 = 6894.757;
const HP: f64 = 745.69987;

/// The display units of one report.
#[derive(Clone, Copy, Debug)]
pub struct Units {
    /// SI or US customary.
    pub system: ReportUnits,
}

impl Units {
    /// The display units of a report in `system`.
    pub fn new(system: ReportUnits) -> Units {
        Units { system }
    }
    fn pick_label(&self, si: &'static str, us: &'static str) -> &'static str {
        match self.system {
            ReportUnits::Si => si,
            ReportUnits::Us => us,
        }
    }
    fn pick(&self, si: Shown, us: Shown) -> Shown {
        match self.system {
            ReportUnits::Si => si,
            ReportUnits::Us => us,
        }
    }
    /// Volume flow: m³/h or gpm (from m³/s).
    pub fn flow(&self) -> Shown {
        self.pick(
            Shown {
                label: "m³/h",
                factor: 1.0 / 3600.0,
                offset: 0.0,
                decimals: 1,
            },
            Shown {
                label: "gpm",
                factor: GAL / 60.0,
                offset: 0.0,
                decimals: 0,
            },
        )
    }
    /// Head: m or ft of fluid (from m).
    pub fn head(&self) -> Shown {
        self.pick(
            Shown {
                label: "m",
                factor: 1.0,
                offset: 0.0,
                decimals: 2,
            },
            Shown {
                label: "ft",
                factor: FT,
                offset: 0.0,
                decimals: 1,
            },
        )
    }
    /// Elevation and level: m or ft (from m).
    pub fn elevation(&self) -> Shown {
        self.pick(
            Shown {
                label: "m",
                factor: 1.0,
                offset: 0.0,
                decimals: 2,
            },
            Shown {
                label: "ft",
                factor: FT,
                offset: 0.0,
                decimals: 1,
            },
        )
    }
    /// Pipe length: m or ft (from m).
    pub fn length(&self) -> Shown {
        self.pick(
            Shown {
                label: "m",
                factor: 1.0,
                offset: 0.0,
                decimals: 1,
            },
            Shown {
                label: "ft",
                factor: FT,
                offset: 0.0,
                decimals: 0,
            },
        )
    }
    /// Diameter: mm or in (from m).
    pub fn diameter(&self) -> Shown {
        self.pick(
            Shown {
                label: "mm",
                factor: 1e-3,
                offset: 0.0,
                decimals: 1,
            },
            Shown {
                label: "in",
                factor: IN,
                offset: 0.0,
                decimals: 3,
            },
        )
    }
    /// Roughness: mm or in (from m).
    pub fn roughness(&self) -> Shown {
        self.pick(
            Shown {
                label: "mm",
                factor: 1e-3,
                offset: 0.0,
                decimals: 4,
            },
            Shown {
                label: "in",
                factor: IN,
                offset: 0.0,
                decimals: 5,
            },
        )
    }
    /// Pressure: kPa or psi (from Pa).
    pub fn pressure(&self) -> Shown {
        self.pick(
            Shown {
                label: "kPa",
                factor: 1e3,
                offset: 0.0,
                decimals: 2,
            },
            Shown {
                label: "psi",
                factor: PSI,
                offset: 0.0,
                decimals: 2,
            },
        )
    }
    /// A gauge pressure (above the local atmosphere): kPa or psig (from Pa). US practice
    /// names the reference in the unit; SI practice writes gauge pressures plain and
    /// marks absolute ones, so neither reader takes a gauge figure for an absolute one
    /// (the classic NPSH error).
    pub fn gauge_pressure(&self) -> Shown {
        Shown {
            label: self.pick_label("kPa", "psig"),
            ..self.pressure()
        }
    }
    /// An absolute pressure: kPa abs or psia (from Pa).
    pub fn absolute_pressure(&self) -> Shown {
        Shown {
            label: self.pick_label("kPa abs", "psia"),
            ..self.pressure()
        }
    }
    /// Power: kW or hp (from W).
    pub fn power(&self) -> Shown {
        self.pick(
            Shown {
                label: "kW",
                factor: 1e3,
                offset: 0.0,
                decimals: 2,
            },
            Shown {
                label: "hp",
                factor: HP,
                offset: 0.0,
                decimals: 2,
            },
        )
    }
    /// Velocity: m/s or ft/s (from m/s).
    pub fn velocity(&self) -> Shown {
        self.pick(
            Shown {
                label: "m/s",
                factor: 1.0,
                offset: 0.0,
                decimals: 2,
            },
            Shown {
                label: "ft/s",
                factor: FT,
                offset: 0.0,
                decimals: 2,
            },
        )
    }
    /// A pressure-wave speed: m/s or ft/s, whole numbers.
    pub fn wave_speed(&self) -> Shown {
        Shown {
            decimals: 0,
            ..self.velocity()
        }
    }
    /// A pressure rating, or a stress in a rating's basis: kPa or psi, one decimal
    /// (ratings are gauge by the standards' convention and printed as they state them).
    pub fn rating(&self) -> Shown {
        Shown {
            decimals: 1,
            ..self.pressure()
        }
    }
    /// A screened operating pressure along a line (gauge): kPa or psig, one decimal.
    pub fn screened_pressure(&self) -> Shown {
        Shown {
            decimals: 1,
            ..self.gauge_pressure()
        }
    }
    /// A modulus of elasticity or bulk modulus: GPa or ksi.
    pub fn modulus(&self) -> Shown {
        self.pick(
            Shown {
                label: "GPa",
                factor: 1e9,
                offset: 0.0,
                decimals: 2,
            },
            Shown {
                label: "ksi",
                factor: PSI * 1000.0,
                offset: 0.0,
                decimals: 0,
            },
        )
    }
    /// Temperature: °C or °F (from K).
    pub fn temperature(&self) -> Shown {
        self.pick(
            Shown {
                label: "°C",
                factor: 1.0,
                offset: 273.15,
                decimals: 1,
            },
            Shown {
                label: "°F",
                factor: 5.0 / 9.0,
                offset: 459.67,
                decimals: 1,
            },
        )
    }
    /// Temperature difference: K or °F (from K).
    pub fn temperature_difference(&self) -> Shown {
        self.pick(
            Shown {
                label: "K",
                factor: 1.0,
                offset: 0.0,
                decimals: 1,
            },
            Shown {
                label: "°F",
                factor: 5.0 / 9.0,
                offset: 0.0,
                decimals: 1,
            },
        )
    }
    /// Density: kg/m³ or lb/ft³ (from kg/m³).
    pub fn density(&self) -> Shown {
        self.pick(
            Shown {
                label: "kg/m³",
                factor: 1.0,
                offset: 0.0,
                decimals: 1,
            },
            Shown {
                label: "lb/ft³",
                factor: 0.45359237 / (FT * FT * FT),
                offset: 0.0,
                decimals: 2,
            },
        )
    }
    /// Dynamic viscosity: cP in both systems (from Pa·s).
    pub fn viscosity(&self) -> Shown {
        Shown {
            label: "cP",
            factor: 1e-3,
            offset: 0.0,
            decimals: 3,
        }
    }
    /// Rotational speed: rpm in both systems (from rpm).
    pub fn speed(&self) -> Shown {
        Shown {
            label: "rpm",
            factor: 1.0,
            offset: 0.0,
            decimals: 0,
        }
    }
    /// Energy per volume delivered: kWh/m³, or kWh per 1000 US gallons.
    pub fn specific_energy(&self) -> Shown {
        self.pick(
            Shown {
                label: "kWh/m³",
                factor: 3.6e6,
                offset: 0.0,
                decimals: 3,
            },
            Shown {
                label: "kWh/1000 gal",
                factor: 3.6e6 / (1000.0 * GAL),
                offset: 0.0,
                decimals: 3,
            },
        )
    }
    /// Volume: m³, or US gallons.
    pub fn volume(&self) -> Shown {
        self.pick(
            Shown {
                label: "m³",
                factor: 1.0,
                offset: 0.0,
                decimals: 0,
            },
            Shown {
                label: "gal",
                factor: GAL,
                offset: 0.0,
                decimals: 0,
            },
        )
    }
    /// Volume in a table column: m³, or thousands of US gallons (the unit specific
    /// energy and cost per volume use), so a year's volume keeps to a few digits.
    pub fn volume_column(&self) -> Shown {
        self.pick(
            Shown {
                label: "m³",
                factor: 1.0,
                offset: 0.0,
                decimals: 0,
            },
            Shown {
                label: "1000 gal",
                factor: 1000.0 * GAL,
                offset: 0.0,
                decimals: 0,
            },
        )
    }
    /// Costs per volume are printed per m³ (SI) or per 1000 gal (US): the factor from
    /// a cost per m³, and the unit's name.
    pub fn volume_per_cost_unit(&self) -> f64 {
        match self.system {
            ReportUnits::Si => 1.0,
            ReportUnits::Us => 1000.0 * GAL,
        }
    }
    /// The name of the volume of a cost per volume (`m³`, `1000 gal`).
    pub fn volume_cost_unit(&self) -> &'static str {
        match self.system {
            ReportUnits::Si => "m³",
            ReportUnits::Us => "1000 gal",
        }
    }
    /// Energy: kWh in both systems (from J).
    pub fn energy(&self) -> Shown {
        Shown {
            label: "kWh",
            factor: 3.6e6,
            offset: 0.0,
            decimals: 0,
        }
    }
}

impl Units {
    /// The report unit of a message quantity's kind.
    pub fn of(&self, kind: Kind) -> Shown {
        match kind {
            Kind::Flow => self.flow(),
            Kind::Head => self.head(),
            Kind::Elevation => self.elevation(),
            Kind::Length => self.length(),
            Kind::Diameter => self.diameter(),
            Kind::Pressure => self.pressure(),
            Kind::GaugePressure => self.gauge_pressure(),
            Kind::AbsolutePressure => self.absolute_pressure(),
            Kind::Rating => self.rating(),
            Kind::Power => self.power(),
            Kind::Velocity => self.velocity(),
            Kind::WaveSpeed => self.wave_speed(),
            Kind::Temperature => self.temperature(),
            Kind::Speed => self.speed(),
            Kind::Energy => self.energy(),
            Kind::SpecificEnergy => self.specific_energy(),
            Kind::Volume => self.volume(),
        }
    }

    /// A typed message in these units: each quantity with its report unit.
    pub fn render(&self, message: &Message) -> String {
        let mut out = String::new();
        self.render_into(&message.parts, &mut out);
        out
    }

    /// Appends `parts` in these units to `out`.
    fn render_into(&self, parts: &[Part], out: &mut String) {
        for part in parts {
            match part {
                Part::Text(text) => out.push_str(text),
                Part::Owned(text) => out.push_str(text),
                Part::Value(kind, si) => out.push_str(&self.of(*kind).fmt(*si)),
                Part::Against(kind, si, other) => {
                    out.push_str(&self.of(*kind).fmt_against(*si, *other).0)
                }
                Part::Typeset(kind, si) => out.push_str(&self.of(*kind).text(*si)),
                Part::Figure(kind, si) => out.push_str(&self.of(*kind).figure(*si)),
                Part::Percent(f) => out.push_str(&percent(*f)),
                Part::PercentAgainst(f, other) => out.push_str(&percent_against(*f, *other).0),
                Part::RatioAgainst(r, other) => out.push_str(&ratio_against(*r, *other).0),
                Part::Significant(v, digits) => out.push_str(&significant_trimmed(*v, *digits)),
                Part::VolumeCostUnit => out.push_str(self.volume_cost_unit()),
                Part::Shared(shared) => self.render_into(shared, out),
            }
        }
    }
}

/// A pipe's material and size as a reader of these units expects them: the material in
/// words, an inch nominal size as its DN in SI (and a DN as inches in US units), and a
/// given bore as its inner diameter in report units. `label` is the size as written.
pub fn pipe(material_keyword: &str, label: &str, inner_diameter_m: f64, units: &Units) -> String {
    let size = if label.starts_with("bore ") {
        format!("bore {}", units.diameter().text(inner_diameter_m))
    } else {
        match crate::hydraulics::catalogue::Material::from_keyword(material_keyword) {
            Some(m) => crate::hydraulics::catalogue::size_for_print(
                m,
                label,
                units.system == ReportUnits::Si,
            ),
            None => label.to_string(),
        }
    };
    format!("{} {size}", material_keyword.replace('_', " "))
}

/// A fraction as a percentage, "76.5 %".
pub fn percent(f: f64) -> String {
    format!("{} %", Fixed(100.0 * f, 1))
}

/// An input range of the design's uncertainty in words and report units: what varies,
/// and its range ("Hazen-Williams C of every Hazen-Williams pipe", "90 % to 105 % of
/// each case's value").
pub fn uncertainty_range(r: &crate::model::uncertainty::InputRange, u: &Units) -> (String, String) {
    use crate::model::uncertainty::{RangeKind, Spread};
    let spread = |s: &Spread, absolute: &dyn Fn(f64) -> String| match s {
        Spread::Factor(a, b) => format!("{} to {} of each case's value", percent(*a), percent(*b)),
        Spread::Absolute(a, b) => format!("{} to {} in every case", absolute(*a), absolute(*b)),
    };
    match &r.kind {
        RangeKind::Roughness(s) => (
            "Absolute roughness of every Darcy-Weisbach pipe".into(),
            spread(s, &|v| u.roughness().fmt(v)),
        ),
        RangeKind::HazenWilliamsC(s) => (
            "Hazen-Williams C of every Hazen-Williams pipe".into(),
            spread(s, &|v| format!("{v:.0}")),
        ),
        RangeKind::Level { tank, plus_minus_m } => (
            format!("Level of tank {tank}"),
            format!(
                "± {} about each case's level",
                u.length().fmt(*plus_minus_m)
            ),
        ),
        RangeKind::Temperature { plus_minus_k } => (
            "Water temperature".into(),
            format!(
                "± {} about each case's temperature",
                u.temperature_difference().fmt(*plus_minus_k)
            ),
        ),
        RangeKind::Loss { plus_minus } => (
            "Every stated loss (K and equivalent length)".into(),
            format!("± {}", percent(*plus_minus)),
        ),
    }
}

#[cfg(test)]
mod render_tests {
    use super::*;
    use crate::message::{flow, Kind, Part};

    #[test]
    fn a_message_is_worded_in_the_report_units() {
        let m = crate::message!["flow ", flow(0.0630902), " at ", Part::Percent(0.765)];
        // 1 gpm = 6.30902e-5 m³/s (NIST SP 811, Appendix B): 0.0630902 m³/s = 1000 gpm.
        assert_eq!(
            Units::new(ReportUnits::Us).render(&m),
            "flow 1000 gpm at 76.5 %"
        );
        assert_eq!(
            Units::new(ReportUnits::Si).render(&m),
            "flow 227.1 m³/h at 76.5 %"
        );
    }

    #[test]
    fn a_value_and_its_limit_never_read_alike() {
        // 1.4996 and 1.5004 m/s both round to "1.50 m/s" at the usual two decimals.
        let m = crate::message![
            Part::Against(Kind::Velocity, 1.5004, 1.4996),
            " above ",
            Part::Against(Kind::Velocity, 1.4996, 1.5004)
        ];
        assert_eq!(
            Units::new(ReportUnits::Si).render(&m),
            "1.5004 m/s above 1.4996 m/s"
        );
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Stations 0.9 ft apart print with a decimal (not "4, 4"); a repeated station
    /// still prints twice alike.
    #[test]
    fn neighbouring_figures_print_apart() {
        let ft = Units::new(ReportUnits::Us).length();
        let column: Vec<f64> = [0.0, 0.0, 3.9, 4.4, 5.0].iter().map(|x| x * FT).collect();
        let shown = ft.figures_apart(&column);
        assert_eq!(shown, ["0.0", "0.0", "3.9", "4.4", "5.0"]);
        let wide: Vec<f64> = [0.0, 100.0, 200.0].iter().map(|x| x * FT).collect();
        assert_eq!(ft.figures_apart(&wide), ["0", "100", "200"]);
    }
}
