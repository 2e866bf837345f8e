//! Unstable (rising) head curves: where each candidate's evaluated head curve rises with
//! flow and by how much, which cases have a static head in the band where the curve is
//! crossed twice, and a caution for parallel sets (see [`crate::pumps::stability`] for
//! the method and its sources).

use super::duty::{stages, CandidateCurves};
use super::{CaseResult, Warning};
use crate::diagnostics::Code;
use crate::message::{flow, head};
use crate::model::{ArrangementKind, Design};
use crate::pumps::stability::{rising_region, RisingRegion};

/// Warning code of a rising head curve.
pub const CODE: Code = Code::UnstableCurve;

/// The rising part of each candidate's evaluated published head curve, at its published
/// speed and impeller before any trim (per candidate, design order; `None` for a stable
/// curve or a candidate without a usable curve).
pub fn rising_regions(candidates: &[CandidateCurves]) -> Vec<Option<RisingRegion>> {
    candidates
        .iter()
        .map(|c| {
            let (curves, _) = c.evaluated.as_ref()?;
            rising_region(&|q| curves.head.eval(q), curves.head.domain())
        })
        .collect()
}

/// One warning per candidate whose head curve rises.
pub fn unstable_warnings(
    design: &Design,
    candidates: &[CandidateCurves],
    regions: &[Option<RisingRegion>],
    cases: &[CaseResult],
) -> Vec<Warning> {
    let mut out = Vec::new();
    for (k, (c, region)) in candidates.iter().zip(regions).enumerate() {
        let (Some(region), Some(p)) = (region, design.pumps.get(k)) else {
            continue;
        };
        let (par, ser) = stages(p);
        let trim = c.evaluated.as_ref().map_or(1.0, |e| e.1);
        let one = region.scaled(trim, trim * trim);
        let mut message = crate::message![
            format!("pump {}: the head curve rises with flow from ", c.name),
            flow(one.flow_low),
            " to ",
            flow(one.flow_peak),
            " by ",
            head(one.rise()),
            " (",
            head(one.head_low),
            " to ",
            head(one.head_peak),
            ", one pump at the published speed and the chosen impeller): an unstable (rising) curve (ANSI/HI 9.6.3 guidance on rising head curves, from memory)"
        ];
        let inside = cases_in_band(design, cases, k, region);
        if inside.is_empty() {
            message.append(&crate::message![
                "; no case's static head lies in the band where a level system curve crosses it twice (",
                head(one.head_low * ser as f64),
                " to ",
                head(one.head_peak * ser as f64),
                format!(
                    " for the {} at the published speed, scaled by the affinity laws in each case)",
                    if ser > 1 { "series set" } else { "pump" }
                )
            ]);
        } else {
            for (name, hs, band) in &inside {
                message.push("; in case ");
                message.append(&crate::message![
                    format!("{name} the static head "),
                    head(*hs),
                    " lies in the band ",
                    head(band.head_low),
                    " to ",
                    head(band.head_peak),
                    " where the curve is crossed twice"
                ]);
            }
            message.push_str(": the pump may run at either intersection (the duty point taken is the larger-flow one); confirm a stable curve with the manufacturer");
        }
        if p.arrangement == ArrangementKind::Parallel && par > 1 {
            message.push(format!(
                "; in a parallel set of {par} a pump with a rising curve can be held near shut-off by the others and hunt between intersections (common practice): prefer a continuously falling curve for parallel duty"
            ));
        }
        out.push(Warning {
            code: CODE,
            message,
            span: Some(c.span),
        });
    }
    out
}

/// The cases (name, static head m, the band there) whose static head falls in the
/// two-crossing band of candidate `k`'s curve as installed in that case (speed, trim,
/// series count).
fn cases_in_band(
    design: &Design,
    cases: &[CaseResult],
    k: usize,
    region: &RisingRegion,
) -> Vec<(String, f64, RisingRegion)> {
    let pump = &design.pumps[k];
    cases
        .iter()
        .filter_map(|c| {
            let system = c.system.as_ref()?;
            let result = c.pumps.get(k)?;
            // The pumps running in this case (`PUMP.running`), not the whole set.
            let case = design.cases.iter().find(|d| d.name == c.name)?;
            let (par, ser) = super::duty::stages_in(pump, case);
            let n = result.affinity_scale;
            let band = region.scaled(n * par as f64, n * n * ser as f64);
            band.two_crossings_at(system.static_head)
                .then(|| (c.name.clone(), system.static_head, band))
        })
        .collect()
}

/// Says in the selection remark of each candidate whose curve rises that it does, so a
/// recommended pump with an unstable curve is never recommended without comment.
pub fn annotate_selection(
    selection: &mut super::selection::Selection,
    design: &Design,
    regions: &[Option<RisingRegion>],
) {
    for ranked in &mut selection.ranking {
        let k = design.pumps.iter().position(|p| p.name == ranked.name);
        if k.and_then(|k| regions.get(k)).is_some_and(Option::is_some) {
            ranked.why.push_str(&format!(
                "; its head curve rises with flow (an unstable curve: see the {CODE} warning)"
            ));
        }
    }
}
