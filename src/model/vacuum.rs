//! A vacuum cannot go below absolute zero: a tank's gauge surface pressure has the
//! site's barometric pressure as its lower bound, case by case (the site, the tank
//! pressure or both may be overridden).

use crate::diagnostics::{Code, Diagnostic, Span};
use crate::message::{self, Kind, Message};
use crate::model::{Design, Scenario, SurfacePressure, Tank};
use uom::si::length::meter;
use uom::si::pressure::pascal;

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
    let absolute = |si| message::value(Kind::AbsolutePressure, si);
    let mut out = Vec::new();
    for case in &design.cases {
        let Some(barometric) = barometric_pa(&case.scenario) else {
            continue;
        };
        let tanks = [&case.scenario.source, &case.scenario.destination];
        for tank in tanks {
            let Some(gauge) = gauge_pa(tank) else {
                continue;
            };
            if barometric + gauge > 0.0 {
                continue;
            }
            let message = render(&crate::message![
                format!(
                    "case {}: tank {} has a gauge pressure of ",
                    case.name, tank.name
                ),
                gauge_of(gauge),
                " where the barometric pressure is ",
                absolute(barometric),
                ": its absolute pressure would be ",
                absolute(barometric + gauge),
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

/// The case's barometric pressure in Pa, absolute; `None` where the site elevation is
/// outside the standard atmosphere (an error reported elsewhere).
fn barometric_pa(scenario: &Scenario) -> Option<f64> {
    match scenario.site.barometric_pressure {
        Some(p) => Some(p.get::<pascal>()),
        None => crate::fluid::barometric_pressure_pa(scenario.site.elevation.get::<meter>()).ok(),
    }
}

/// The tank's gauge surface pressure in Pa, when it is given as gauge.
fn gauge_pa(tank: &Tank) -> Option<f64> {
    match tank.surface_pressure {
        SurfacePressure::Gauge(g) => Some(g.get::<pascal>()),
        SurfacePressure::Absolute(_) => None,
    }
}
