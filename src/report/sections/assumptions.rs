//! The assumptions chapter: the design's and the method's assumptions, the design's
//! notes, the analysis warnings and the cautions.

use crate::analysis::Analysis;
use crate::model::Design;
use crate::report::layout::document::Block;

/// The assumptions, notes and cautions chapter.
pub(super) fn chapter(blocks: &mut Vec<Block>, design: &Design, analysis: &Analysis) {
    let units = crate::display::Units::new(design.project.units);
    blocks.push(Block::heading(1, "Assumptions, notes and cautions"));
    blocks.push(Block::heading(2, "Assumptions of the design"));
    if design.assumptions.is_empty() {
        blocks.push(Block::text("The design file states no assumptions."));
    }
    for s in &design.assumptions {
        blocks.push(Block::text(format!("• {s}")));
    }
    blocks.push(Block::heading(2, "Assumptions of the method"));
    for s in [
        "Steady flow; free-surface velocities are negligible; the suction and discharge lines each run in series from one source to one destination.",
        "Identical pumps in parallel share one suction and one discharge line in this model; branch losses of individual pumps are not modelled unless given as fittings.",
        "Published pump curves are taken as given; no tolerance (ISO 9906 acceptance grades) is applied to them.",
        "Motor efficiency is the design's value or a stated default; it is held constant over the load range.",
    ] {
        blocks.push(Block::text(format!("• {s}")));
    }
    if !design.notes.is_empty() {
        blocks.push(Block::heading(2, "Notes"));
        for n in &design.notes {
            blocks.push(Block::note(n.clone()));
        }
    }
    if !analysis.warnings.is_empty() {
        blocks.push(Block::heading(2, "Warnings of the analysis"));
        for w in &analysis.warnings {
            blocks.push(Block::note(super::wording::plain(
                &units.render(&w.message),
            )));
        }
    }
    blocks.push(Block::heading(2, "Cautions"));
    let screened = analysis.safety.cases.iter().any(|c| c.screened());
    let surge = if screened {
        "Surge and pressure ratings are screened in the chapter \"Pressure and surge screening\" only: a screen is not a transient analysis, and the manufacturers' certified ratings govern. Thrust restraint, structural supports, electrical design and controls are outside this calculation. Pump trips and valve closures on long mains can raise pressures far above the steady values here."
    } else {
        "Surge and pipe pressure ratings are not screened in this package: the shut-off pressures, the ratings of pipe, valves and flanges and the surge of pump trips and valve closures must be checked separately (a transient analysis where mains are long), against the manufacturers' certified ratings. Thrust restraint, structural supports, electrical design and controls are outside this calculation."
    };
    for c in [
        "The results depend on the pump manufacturer's certified curves and on the installed conditions. Confirm every selected duty point, NPSH required and motor rating against certified test data before purchase.",
        surge,
        "Cavitation damages pumps: an NPSH margin below the limits shown must be resolved before the design proceeds. A motor that overloads at run-out needs protection or a larger rating.",
        "This work is to be reviewed by a licensed engineer and checked against the codes and the authority having jurisdiction where the system is built.",
    ] {
        blocks.push(Block::caution(c));
    }
}
