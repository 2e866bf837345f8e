//! A vacuum cannot go below absolute zero: a tank's gauge surface pressure has the
//! site's barometric pressure as its lower bound, case by case (the site, the tank
//! pressure or both may be overridden).

use crate::diagnostics::{Code, Diagnostic, Span};
use crate::message::{self, Kind, Message};
use crate::model::Design;

/// Check-time errors for every case in which a tank's absolute surface pressure
/// (barometric + gauge, Pa) is zero or negative. The barometric pressure is the
/// design's, or the U.S. Standard Atmosphere 1976 at the site elevation (NOAA/NASA/USAF,
/// 1976, Eq. 33a). `render` words the typed messages (in the design's report units:
/// the caller's outputs own them).
pub fn absolute_pressure_errors(
    design: &Design,
    render: &dyn Fn(&Message) -> String,
) -> Vec<Diagnostic> {
    let gauge_of = |si| message::value(Kind::GaugePressure, si);
    let absolute_of = |si| message::value(Kind::AbsolutePressure, si);
    let mut out = Vec::new();
    for case in &design.cases {
        let Ok(barometric) = case.scenario.site.barometric() else {
            continue;
        };
        let tanks = [&case.scenario.source, &case.scenario.destination];
        for tank in tanks {
            let Some(gauge) = tank.surface_pressure.stated_gauge() else {
                continue;
            };
            let absolute = gauge.absolute(barometric);
            if absolute.is_above_vacuum() {
                continue;
            }
            let (gauge, barometric) = (gauge.pa(), barometric.pa());
            let message = render(&crate::message![
                format!(
                    "case {}: tank {} has a gauge pressure of ",
                    case.name, tank.name
                ),
                gauge_of(gauge),
                " where the barometric pressure is ",
                absolute_of(barometric),
                ": its absolute pressure would be ",
                absolute_of(absolute.pa()),
                ", below absolute zero"
            ]);
            let at = if case.span == Span::new(0, 0) {
                tank.span
            } else {
                case.span
            };
            out.push(
                Diagnostic::error(Code::OutOfRange, message, Some(at))
                    .with_secondary(tank.span, "the tank")
                    .with_help(render(&crate::message![
                        "a vacuum reaches at most ",
                        message::value(Kind::Pressure, barometric),
                        " below atmospheric at this site; give a gauge pressure above that, or the absolute pressure with `kPa(a)` or `psia`"
                    ])),
            );
        }
    }
    out
}
