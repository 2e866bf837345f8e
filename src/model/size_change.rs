//! The diameter ratio β of a size change taken from the pipes themselves: an expansion
//! or contraction without a stated `beta` takes the ratio of the inner diameters of the
//! pipe that carries it (the small pipe) and its neighbour in the line (the next pipe
//! for an expansion, the previous one for a contraction), so β follows the bores of
//! the pipes as built rather than their nominal sizes (Crane TP-410 defines β on the
//! inner diameters, d₁/d₂).

use super::design::Segment;
use super::fields::missing;
use crate::diagnostics::Diagnostic;
use crate::hydraulics::fittings::KMethod;
use uom::si::length::meter;

/// Which neighbour a size change meets: the next pipe (expansion) or the previous one
/// (contraction); `None` for a fitting that is no size change.
fn neighbour_offset(method: &KMethod) -> Option<isize> {
    match method {
        KMethod::SuddenExpansion | KMethod::GradualExpansion => Some(1),
        KMethod::SuddenContraction | KMethod::GradualContraction => Some(-1),
        _ => None,
    }
}

/// Fill every missing β of a line's size changes from the inner diameters, or report
/// `missing-field` where the neighbour is absent or not the larger pipe.
pub fn fill_ratios(segments: &mut [Segment], diags: &mut Vec<Diagnostic>) {
    let bores: Vec<f64> = segments
        .iter()
        .map(|s| s.inner_diameter.get::<meter>())
        .collect();
    for (i, segment) in segments.iter_mut().enumerate() {
        for f in segment.fittings.iter_mut() {
            let Some(offset) = neighbour_offset(&f.spec.method) else {
                continue;
            };
            if !f.spec.needs_beta || f.beta.is_some() {
                continue;
            }
            let larger = i
                .checked_add_signed(offset)
                .and_then(|j| bores.get(j))
                .filter(|&&d| d > bores[i]);
            match larger {
                Some(&large) => {
                    f.beta = Some(bores[i] / large);
                    f.beta_from_bores = true;
                }
                None => diags.push(missing(
                    "beta",
                    &format!(
                        "fitting {} (no larger pipe {} it in the line)",
                        f.spec.name,
                        if offset > 0 {
                            "follows"
                        } else {
                            "comes before"
                        }
                    ),
                    f.span,
                    &format!("fitting {} {{ beta = 0.75 }}", f.spec.name),
                )),
            }
        }
    }
}
