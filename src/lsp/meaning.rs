//! Hover backed by the checked design: a pipe's inner diameter and roughness (with their
//! sources), a pump candidate's fitted best efficiency point. Used only when the
//! document checks without errors.

use uom::si::length::meter;

use crate::display::Units;
use crate::hydraulics::roughness::roughness;
use crate::model::Design;

/// The pipe segment whose statement holds `offset`, described; `None` elsewhere.
pub fn pipe(design: &Design, offset: usize) -> Option<(String, (usize, usize))> {
    let units = Units::new(design.project.units);
    let segment = design
        .base
        .lines
        .iter()
        .flat_map(|l| &l.segments)
        .find(|s| s.span.start <= offset && offset < s.span.end)?;
    let d = segment.inner_diameter.get::<meter>();
    let mut text = format!(
        "pipe {} {}\n\nInner diameter: {} ({}), {}",
        segment.material.keyword(),
        segment.size_label,
        units.diameter().fmt(d),
        si_metres(d),
        segment.diameter_source
    );
    match (segment.roughness, roughness(segment.material)) {
        (Some(e), _) => text.push_str(&format!(
            "\n\nRoughness: {} as given",
            units.roughness().fmt(e.get::<meter>())
        )),
        (None, Some(entry)) => text.push_str(&format!(
            "\n\nRoughness: new {} ({}), aged {} ({}); source: {}",
            units.roughness().fmt(entry.new_m),
            si_metres(entry.new_m),
            units.roughness().fmt(entry.aged_m),
            si_metres(entry.aged_m),
            entry.source
        )),
        (None, None) => {}
    }
    if let Some(c) = segment.hazen_williams_c {
        text.push_str(&format!(
            "\n\nHazen-Williams C = {c} (friction by Hazen-Williams)"
        ));
    }
    Some((text, (segment.span.start, segment.span.end)))
}

/// The pump candidate named `word`: its fitted best efficiency point at the evaluated
/// impeller and published speed.
pub fn pump(design: &Design, word: &str) -> Option<String> {
    let p = design.pumps.iter().find(|p| p.name == word)?;
    let curves = crate::analysis::duty::CandidateCurves::fit(p);
    let units = Units::new(design.project.units);
    let bep = curves.evaluated_bep?;
    let speed = curves.evaluated.as_ref().map_or(0.0, |(c, _)| c.speed_rpm);
    Some(format!(
        "pump {} \"{}\"\n\nBest efficiency point of the fitted published curve ({speed:.0} rpm): {} at {}, efficiency {:.1} %{}",
        p.name,
        p.description,
        units.flow().fmt(bep.flow),
        units.head().fmt(bep.head),
        100.0 * bep.efficiency,
        if bep.at_domain_end {
            " (at the end of the efficiency data: the data show no peak)"
        } else {
            ""
        }
    ))
}

/// A length in millimetres to six significant digits (the SI side of the hover).
fn si_metres(x: f64) -> String {
    format!("{} mm", super::hover::significant(1000.0 * x))
}
