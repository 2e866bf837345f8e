//! Ranking the candidates and recommending one, or saying why none qualifies.
//!
//! Criteria, in order: (1) a candidate qualifies when every case was analysed, has a
//! duty point and no check fails; failing candidates are listed after every qualifying
//! one; (2) qualifying candidates are ranked on an equal basis (issue 10.2): energy per
//! volume delivered. Where a case fixes a volume (its hours × its flow requirement)
//! each candidate runs that volume ÷ its delivered flow; where a case states hours but
//! no flow, each candidate runs those hours and its energy counts per volume it
//! delivers. With an energy price the score is the life-cycle energy cost per volume,
//! without one the specific energy, and without hours the mean pump efficiency. A
//! closed loop delivers no volume: its candidates are compared on the life-cycle energy
//! cost (or the energy) of its stated hours, each required to meet the loop's design
//! flow where a case states one;
//! (3) ties go to the larger smallest NPSH margin ratio.

use super::checks::Status;
use super::CaseResult;
use crate::message::{Message, Part};
use crate::model::Design;
use crate::pumps::{self, LccMethod};

/// One candidate in the ranking.
#[derive(Clone, Debug, PartialEq)]
pub struct Ranked {
    /// Candidate name.
    pub name: String,
    /// Every case analysed with a duty point and no failing check.
    pub qualifies: bool,
    /// The ranking value (lower is better for costs and energy; efficiency is negated).
    pub score: f64,
    /// Energy and cost per year on the ranking basis (hours adjusted to fixed volumes).
    pub annual_energy_j: Option<f64>,
    /// Energy cost per year, currency units (when priced).
    pub annual_cost: Option<f64>,
    /// Life-cycle energy cost (present value), currency units.
    pub life_cost: Option<f64>,
    /// Volume delivered per year on the ranking basis, m³.
    pub annual_volume_m3: Option<f64>,
    /// Energy per volume over the year, J/m³.
    pub specific_energy_j_m3: Option<f64>,
    /// Life-cycle energy cost ÷ (yearly volume × years), currency per m³.
    pub life_cost_per_m3: Option<f64>,
    /// Mean pump efficiency over the cases (fraction).
    pub mean_efficiency: Option<f64>,
    /// Hydraulic energy ÷ electrical energy over the year.
    pub mean_wire_to_water: Option<f64>,
    /// Smallest NPSH available / NPSH required over the cases (dimensionless).
    pub min_npsh_ratio: Option<f64>,
    /// Number of warning checks over the cases.
    pub warnings: usize,
    /// Why it qualifies or not, in one sentence.
    pub why: String,
}

/// The ranking and the recommendation.
#[derive(Clone, Debug, PartialEq)]
pub struct Selection {
    /// The recommended candidate, the first qualifying one.
    pub recommended: Option<String>,
    /// The score in words (`life-cycle energy cost per volume`, `energy per volume`, `mean efficiency`).
    pub criterion: &'static str,
    /// The score in words, for the package.
    pub criteria_text: String,
    /// The basis of the ranking in one sentence.
    pub basis: Message,
    /// Qualifying candidates by score, then the others.
    pub ranking: Vec<Ranked>,
    /// Why nothing is recommended, when nothing is.
    pub refusal: Option<String>,
    /// A remark when the first two qualifying candidates are within
    /// [`CLOSE_CALL_FRACTION`] of each other on the ranking score.
    pub close_call: Option<String>,
}

/// Relative score difference below which the first two qualifying candidates are called
/// equal on the ranking basis: 2 % (ours, stated in the package). Catalogue curves are
/// guaranteed only within the acceptance tolerance of the pump test (ISO 9906:2012 grade
/// 2B: efficiency −5 %, from memory), so a smaller difference in energy does not separate
/// two pumps.
pub const CLOSE_CALL_FRACTION: f64 = 0.02;

/// The close-call remark of a sorted ranking, if the first two qualifying candidates'
/// scores differ by less than [`CLOSE_CALL_FRACTION`] of the first.
fn close_call(ranking: &[Ranked], criterion: &str) -> Option<String> {
    let [first, second] = ranking.get(..2)? else {
        return None;
    };
    if !(first.qualifies && second.qualifies && first.score > 0.0) {
        return None;
    }
    let difference = (second.score - first.score) / first.score;
    (difference.is_finite() && difference < CLOSE_CALL_FRACTION).then(|| {
        format!(
            "{} and {} are within {:.1} % of each other on {criterion}, less than the {:.0} % taken as resolvable from catalogue curves (pump test tolerances, ISO 9906): treat them as equal on this basis and decide on the warnings, NPSH margin, capital and maintenance cost and the manufacturers' certified data",
            first.name,
            second.name,
            100.0 * difference,
            100.0 * CLOSE_CALL_FRACTION
        )
    })
}

/// Why a candidate does not qualify, and how many warnings it has.
fn failures(cases: &[CaseResult], i: usize) -> (Vec<String>, usize) {
    let mut fails: Vec<String> = Vec::new();
    let mut warnings = 0;
    for c in cases {
        let Some(r) = c.pumps.get(i) else {
            fails.push(format!(
                "case {} could not be analysed ({})",
                c.name,
                c.error.as_deref().unwrap_or("no result")
            ));
            continue;
        };
        if r.duty.is_none() {
            fails.push(format!("no duty point in case {}", c.name));
        }
        for ch in &r.checks {
            match ch.status {
                Status::Fail => fails.push(format!("{} fails in case {}", ch.id, c.name)),
                Status::Warn => warnings += 1,
                Status::Pass => {}
            }
        }
    }
    fails.dedup();
    (fails, warnings)
}

fn lcc_method(design: &Design) -> LccMethod {
    if design.energy.discount_rate != 0.0 || design.energy.escalation != 0.0 {
        LccMethod::Discounted {
            rate: design.energy.discount_rate,
            escalation: design.energy.escalation,
        }
    } else {
        LccMethod::Simple
    }
}

/// The closed loop's criteria: a loop circulates for its hours and delivers no volume,
/// so energy per volume would favour the pump that over-circulates; candidates are
/// compared on the cost (or energy) of running the stated hours, each required to meet
/// the loop's design flow (a `flow >=` requirement, checked).
const LOOP_LIFE_COST: &str = "life-cycle energy cost of the stated running hours";
/// The closed loop's criterion without an energy price.
const LOOP_ENERGY: &str = "energy per year of the stated running hours";

/// Rank the candidates over the analysed cases.
pub fn rank(design: &Design, cases: &[CaseResult]) -> Selection {
    // A life-cycle cost needs a life: without `years` the priced energy ranks per volume.
    let priced = design.energy.price_per_joule.is_some() && design.energy.years > 0.0;
    let hours: f64 = cases.iter().map(|c| c.hours_per_year).sum();
    let closed = super::closed_loop::is_closed_loop(&design.base);
    let criterion = match (priced, hours > 0.0, closed) {
        (true, true, false) => "life-cycle energy cost per volume",
        (false, true, false) => "energy per volume",
        (true, true, true) => LOOP_LIFE_COST,
        (false, true, true) => LOOP_ENERGY,
        _ => "mean efficiency",
    };
    let method = lcc_method(design);
    let mut ranking: Vec<Ranked> = Vec::new();
    for (i, p) in design.pumps.iter().enumerate() {
        let results: Vec<_> = cases.iter().filter_map(|c| c.pumps.get(i)).collect();
        let (fails, warnings) = failures(cases, i);
        let with_hours: Vec<_> = results
            .iter()
            .filter(|r| r.energy.is_some_and(|e| e.hours > 0.0))
            .collect();
        let energy: Option<f64> = with_hours
            .iter()
            .map(|r| r.energy.map(|e| e.energy_j))
            .sum();
        let volume: Option<f64> = with_hours
            .iter()
            .map(|r| r.energy.map(|e| e.volume_m3))
            .sum();
        let hydraulic: f64 = with_hours
            .iter()
            .filter_map(|r| Some(r.duty.as_ref()?.hydraulic_power * r.energy?.hours * 3600.0))
            .sum();
        let cost: Option<f64> = if design.energy.price_per_joule.is_some() {
            with_hours
                .iter()
                .map(|r| r.energy.and_then(|e| e.cost))
                .sum()
        } else {
            None
        };
        let life =
            cost.and_then(|c| pumps::life_cycle_energy_cost(c, design.energy.years, method).ok());
        let specific = energy.zip(volume.filter(|v| *v > 0.0)).map(|(e, v)| e / v);
        let life_per_m3 = life
            .zip(volume.filter(|v| *v > 0.0 && design.energy.years > 0.0))
            .map(|(l, v)| l / (v * design.energy.years));
        let effs: Vec<f64> = results
            .iter()
            .filter_map(|r| r.duty.as_ref().and_then(|d| d.efficiency))
            .collect();
        let mean_eff = (!effs.is_empty()).then(|| effs.iter().sum::<f64>() / effs.len() as f64);
        let min_npsh = results
            .iter()
            .filter_map(|r| {
                r.duty.as_ref().and_then(|d| {
                    d.npsh_required
                        .filter(|n| *n > 0.0)
                        .map(|n| d.npsh_available / n)
                })
            })
            .fold(None, |a: Option<f64>, b| Some(a.map_or(b, |a| a.min(b))));
        let score = match criterion {
            "life-cycle energy cost per volume" => life_per_m3.unwrap_or(f64::INFINITY),
            "energy per volume" => specific.unwrap_or(f64::INFINITY),
            LOOP_LIFE_COST => life.unwrap_or(f64::INFINITY),
            LOOP_ENERGY => energy.unwrap_or(f64::INFINITY),
            _ => -mean_eff.unwrap_or(0.0),
        };
        let qualifies = fails.is_empty();
        let why = if qualifies {
            format!(
                "qualifies: every case analysed with a duty point, no failing check ({})",
                crate::numbers::count(warnings, "warning", "warnings")
            )
        } else {
            format!(
                "does not qualify: {}",
                fails.iter().take(4).cloned().collect::<Vec<_>>().join("; ")
            )
        };
        ranking.push(Ranked {
            name: p.name.clone(),
            qualifies,
            score,
            annual_energy_j: energy,
            annual_cost: cost,
            life_cost: life,
            annual_volume_m3: volume,
            specific_energy_j_m3: specific,
            life_cost_per_m3: life_per_m3,
            mean_efficiency: mean_eff,
            mean_wire_to_water: energy.filter(|e| *e > 0.0).map(|e| hydraulic / e),
            min_npsh_ratio: min_npsh,
            warnings,
            why,
        });
    }
    ranking.sort_by(|a, b| {
        b.qualifies
            .cmp(&a.qualifies)
            .then(a.score.total_cmp(&b.score))
            .then(
                b.min_npsh_ratio
                    .unwrap_or(0.0)
                    .total_cmp(&a.min_npsh_ratio.unwrap_or(0.0)),
            )
            .then(a.name.cmp(&b.name))
    });
    let recommended = ranking
        .first()
        .filter(|r| r.qualifies)
        .map(|r| r.name.clone());
    let refusal = if design.pumps.is_empty() {
        Some("the design has no pump candidates".to_string())
    } else if recommended.is_none() {
        Some(format!(
            "no recommendation: no candidate qualifies: {}",
            ranking
                .iter()
                .map(|r| format!("{} {}", r.name, r.why))
                .collect::<Vec<_>>()
                .join("; ")
        ))
    } else {
        None
    };
    Selection {
        recommended,
        criterion,
        criteria_text: criteria_text(design, criterion, method),
        basis: basis(design, cases, criterion),
        close_call: close_call(&ranking, criterion),
        ranking,
        refusal,
    }
}

fn criteria_text(design: &Design, criterion: &str, method: LccMethod) -> String {
    format!(
        "A candidate qualifies when every case is analysed, has a duty point and no check fails; candidates that do not qualify are listed after those that do. Qualifying candidates are ranked by {criterion}{}; ties go to the larger smallest NPSH margin.",
        match (criterion, method) {
            ("life-cycle energy cost per volume" | LOOP_LIFE_COST, LccMethod::Discounted { rate, escalation }) =>
                format!("{} over {:.0} years, discounted at {:.1} % with {:.1} % energy-price escalation", price_text(design), design.energy.years, rate * 100.0, escalation * 100.0),
            ("life-cycle energy cost per volume" | LOOP_LIFE_COST, _) => format!("{} over {:.0} years, undiscounted", price_text(design), design.energy.years),
            _ => String::new(),
        }
    )
}

/// " at 0.118 USD/kWh" (the energy price the costs use), or nothing without a price.
fn price_text(design: &Design) -> String {
    match design.energy.price_per_joule {
        Some(p) => format!(
            " at {} {}/kWh",
            crate::numbers::significant_trimmed(p * 3.6e6, 4),
            design.energy.currency
        ),
        None => String::new(),
    }
}

/// The basis sentence printed beside the ranking.
fn basis(design: &Design, cases: &[CaseResult], criterion: &str) -> Message {
    let fixed: Vec<&str> = design
        .cases
        .iter()
        .filter(|c| super::duty::fixed_volume(design, c).is_some())
        .map(|c| c.name.as_str())
        .collect();
    let open: Vec<&str> = cases
        .iter()
        .filter(|c| c.hours_per_year > 0.0 && !fixed.contains(&c.name.as_str()))
        .map(|c| c.name.as_str())
        .collect();
    if criterion == "mean efficiency" {
        return "No case states operating hours, so energy cannot be compared: qualifying candidates are ranked by their mean pump efficiency over the cases.".into();
    }
    if criterion == LOOP_LIFE_COST || criterion == LOOP_ENERGY {
        return loop_basis(design, criterion);
    }
    let mut s = crate::message![
        if criterion.starts_with("life") {
            "Candidates are compared per volume delivered (life-cycle energy cost per "
        } else {
            "Candidates are compared per volume delivered (energy per "
        },
        Part::VolumeCostUnit,
        ")."
    ];
    let cases_word = |names: &[&str], one: &str, many: &str| {
        if names.len() == 1 {
            format!("Case {} {one}", names[0])
        } else {
            format!("Cases {} {many}", names.join(", "))
        }
    };
    if !fixed.is_empty() {
        s.push(format!(
            " {} the volume to pump (hours × required flow): each candidate runs that volume ÷ its delivered flow.",
            cases_word(&fixed, "fixes", "fix")
        ));
    }
    if !open.is_empty() {
        s.push(format!(
            " {} hours but no flow: each candidate runs those hours and is compared by the energy per volume it delivers.",
            cases_word(&open, "states", "state")
        ));
    }
    s
}

/// The basis sentence of a closed loop, and a warning when no case states its design
/// flow (a pump that under-circulates would then rank first on energy).
fn loop_basis(design: &Design, criterion: &str) -> Message {
    let mut s: Message = format!(
        "The design is a closed loop: the flow circulated is not a volume delivered, so candidates are compared by the {criterion}, not per volume (which would favour the pump that over-circulates)."
    )
    .into();
    let with_flow: Vec<&str> = design
        .cases
        .iter()
        .filter(|c| super::duty::required_flow(design, &c.name).is_some())
        .map(|c| c.name.as_str())
        .collect();
    if with_flow.is_empty() {
        s.push(" No case states the loop's design flow (a flow requirement), so a pump that circulates less ranks better here: state it, so that a candidate below it does not qualify.");
    } else {
        s.push(format!(
            " A candidate must meet the loop's design flow in {} to qualify; above it the balancing or control valves take the surplus head at the flow the pump gives, and that flow is what it is ranked at.",
            with_flow.join(", ")
        ));
    }
    s
}

/// Rank again where the design has load profiles (issue 13): every candidate delivers
/// the same profile, so the volume is equal and the score is the life-cycle cost (HI and
/// Europump, *Pump Life Cycle Costs*, 2001) when the energy is priced and a life is
/// given, else the yearly input energy. A failing profile check disqualifies; designs
/// without a profile keep [`rank`]'s ranking.
pub fn rank_by_profile(
    design: &Design,
    selection: &mut Selection,
    ops: &[super::operation::CandidateOperation],
) {
    let priced = ops.iter().any(|o| o.lcc.is_some());
    selection.criterion = if priced {
        "life-cycle cost at equal delivered volume"
    } else {
        "yearly energy at equal delivered volume"
    };
    for r in &mut selection.ranking {
        let Some(op) = ops.iter().find(|o| o.name == r.name) else {
            continue;
        };
        let y = &op.yearly;
        r.annual_energy_j = Some(y.energy_j);
        r.annual_cost = y.cost;
        r.annual_volume_m3 = Some(y.volume_m3);
        r.specific_energy_j_m3 = y.specific_energy;
        r.mean_wire_to_water = y.mean_wire_to_water;
        r.life_cost = op.lcc.as_ref().map(|l| l.total);
        r.life_cost_per_m3 = op
            .lcc
            .as_ref()
            .filter(|l| y.volume_m3 > 0.0 && l.years > 0.0)
            .map(|l| l.total / (y.volume_m3 * l.years));
        let fails: Vec<String> = op
            .checks
            .iter()
            .filter(|c| c.status == Status::Fail)
            .map(|c| format!("{} fails over the profile", c.id))
            .chain(op.failure.clone())
            .collect();
        if !fails.is_empty() {
            r.why = if r.qualifies {
                format!("does not qualify: {}", fails.join("; "))
            } else {
                format!("{}; {}", r.why, fails.join("; "))
            };
            r.qualifies = false;
        }
        r.score = if priced {
            r.life_cost.unwrap_or(f64::INFINITY)
        } else if op.failure.is_none() {
            y.energy_j
        } else {
            f64::INFINITY
        };
    }
    selection.ranking.sort_by(|a, b| {
        b.qualifies
            .cmp(&a.qualifies)
            .then(a.score.total_cmp(&b.score))
            .then(a.name.cmp(&b.name))
    });
    selection.recommended = selection
        .ranking
        .first()
        .filter(|r| r.qualifies)
        .map(|r| r.name.clone());
    selection.refusal = match &selection.recommended {
        Some(_) => None,
        None => Some(format!(
            "no recommendation: no candidate qualifies: {}",
            selection
                .ranking
                .iter()
                .map(|r| format!("{} {}", r.name, r.why))
                .collect::<Vec<_>>()
                .join("; ")
        )),
    };
    selection.criteria_text = format!(
        "A candidate qualifies when every case is analysed, has a duty point, no check fails and every load point of the profile is delivered with no failing profile check. Qualifying candidates are ranked by {}.",
        if priced {
            format!("life-cycle cost over {:.0} years ({} rates, discounted at {:.1} % with {:.1} % energy-price escalation)", design.energy.years, design.energy.rates.keyword(), design.energy.discount_rate * 100.0, design.energy.escalation * 100.0)
        } else {
            "yearly input energy".to_string()
        }
    );
    selection.basis = profile_basis(design, priced).into();
    selection.close_call = close_call(&selection.ranking, selection.criterion);
}

/// The basis sentence where the design has load profiles.
fn profile_basis(design: &Design, priced: bool) -> String {
    let cases: Vec<&str> = design
        .operation
        .profiles
        .iter()
        .map(|p| p.case.as_str())
        .collect();
    format!(
        "Candidates run the load profile{} of case{} {} and so deliver the same volume; they are compared by {}, from the energy at every load point with part-load motor and drive efficiency.",
        if cases.len() > 1 { "s" } else { "" },
        if cases.len() > 1 { "s" } else { "" },
        cases.join(", "),
        if priced {
            "life-cycle cost (initial, installation, energy, operation, maintenance, downtime, environmental and disposal costs where the design gives them)"
        } else {
            "yearly input energy"
        }
    )
}
