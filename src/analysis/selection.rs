//! Ranking the candidates and recommending one, or saying why none qualifies.
//!
//! Criteria, in order: (1) a candidate qualifies when every case has a duty
//! point and no check fails; (2) qualifying candidates are ranked by life-cycle
//! energy cost when an energy price and operating hours are given, else by
//! yearly energy, else by the mean pump efficiency over the cases; (3) ties go
//! to the larger smallest NPSH margin ratio.

use super::checks::Status;
use super::CaseResult;
use crate::model::Design;
use crate::pumps::{self, LccMethod};

#[derive(Clone, Debug, PartialEq)]
pub struct Ranked {
    pub name: String,
    pub qualifies: bool,
    /// The ranking value (lower is better for costs and energy; efficiency is negated).
    pub score: f64,
    pub annual_energy_j: Option<f64>,
    pub annual_cost: Option<f64>,
    pub life_cost: Option<f64>,
    pub mean_efficiency: Option<f64>,
    pub min_npsh_ratio: Option<f64>,
    pub warnings: usize,
    pub why: String,
}

#[derive(Clone, Debug, PartialEq)]
pub struct Selection {
    pub recommended: Option<String>,
    pub criterion: &'static str,
    pub criteria_text: String,
    pub ranking: Vec<Ranked>,
    /// Why nothing is recommended, when nothing is.
    pub refusal: Option<String>,
}

/// Rank the candidates over the analysed cases.
pub fn rank(design: &Design, cases: &[CaseResult]) -> Selection {
    let priced = design.energy.price_per_joule.is_some();
    let hours: f64 = cases.iter().map(|c| c.hours_per_year).sum();
    let criterion = if priced && hours > 0.0 {
        "life-cycle energy cost"
    } else if hours > 0.0 {
        "yearly energy"
    } else {
        "mean efficiency"
    };
    let method = if design.energy.discount_rate != 0.0 || design.energy.escalation != 0.0 {
        LccMethod::Discounted {
            rate: design.energy.discount_rate,
            escalation: design.energy.escalation,
        }
    } else {
        LccMethod::Simple
    };
    let mut ranking: Vec<Ranked> = Vec::new();
    for (i, p) in design.pumps.iter().enumerate() {
        let results: Vec<_> = cases
            .iter()
            .filter_map(|c| c.pumps.get(i).map(|r| (c, r)))
            .collect();
        let mut fails: Vec<String> = Vec::new();
        let mut warnings = 0;
        for (c, r) in &results {
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
        let energy: Option<f64> = results
            .iter()
            .map(|(_, r)| r.energy.map(|e| e.energy_j))
            .sum();
        let cost: Option<f64> = if priced {
            results
                .iter()
                .map(|(_, r)| r.energy.and_then(|e| e.cost))
                .sum()
        } else {
            None
        };
        let life =
            cost.and_then(|c| pumps::life_cycle_energy_cost(c, design.energy.years, method).ok());
        let effs: Vec<f64> = results
            .iter()
            .filter_map(|(_, r)| r.duty.as_ref().and_then(|d| d.efficiency))
            .collect();
        let mean_eff = (!effs.is_empty()).then(|| effs.iter().sum::<f64>() / effs.len() as f64);
        let min_npsh = results
            .iter()
            .filter_map(|(_, r)| {
                r.duty.as_ref().and_then(|d| {
                    d.npsh_required
                        .filter(|n| *n > 0.0)
                        .map(|n| d.npsh_available / n)
                })
            })
            .fold(None, |a: Option<f64>, b| Some(a.map_or(b, |a| a.min(b))));
        let score = match criterion {
            "life-cycle energy cost" => life.or(cost).unwrap_or(f64::INFINITY),
            "yearly energy" => energy.unwrap_or(f64::INFINITY),
            _ => -mean_eff.unwrap_or(0.0),
        };
        let qualifies = fails.is_empty();
        let why = if qualifies {
            format!("qualifies: duty point in every case, no failing check ({warnings} warning(s))")
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
            mean_efficiency: mean_eff,
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
            "no candidate qualifies: {}",
            ranking
                .iter()
                .map(|r| format!("{} {}", r.name, r.why))
                .collect::<Vec<_>>()
                .join("; ")
        ))
    } else {
        None
    };
    let criteria_text = format!(
        "A candidate qualifies when every case has a duty point and no check fails. Qualifying candidates are ranked by {criterion}{}; ties go to the larger smallest NPSH margin.",
        match (criterion, method) {
            ("life-cycle energy cost", LccMethod::Discounted { rate, escalation }) =>
                format!(" over {:.0} years, discounted at {:.1} % with {:.1} % energy-price escalation", design.energy.years, rate * 100.0, escalation * 100.0),
            ("life-cycle energy cost", _) => format!(" over {:.0} years, undiscounted", design.energy.years),
            _ => String::new(),
        }
    );
    Selection {
        recommended,
        criterion,
        criteria_text,
        ranking,
        refusal,
    }
}
