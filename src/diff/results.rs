//! The difference of two analyses: per case × candidate present in both, the duty
//! point's key numbers before and after; cases and candidates that appear or
//! disappear; checks whose status changed; and the recommendation.
//!
//! Numbers are SI with the unit in the key, as in the results JSON
//! (`flow_m3_s`, `head_m`, `shaft_power_W`); ratios are fractions.

use crate::display::Units;
use serde::Serialize;

use crate::analysis::checks::Check;
use crate::analysis::duty::{Duty, PumpResult};
use crate::analysis::{Analysis, CaseResult};

/// What changed in the results.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct ResultsDiff {
    /// Cases only in the new analysis, in its order.
    pub cases_added: Vec<String>,
    /// Cases only in the old analysis, in its order.
    pub cases_removed: Vec<String>,
    /// Candidates only in the new analysis, in its order.
    pub pumps_added: Vec<String>,
    /// Candidates only in the old analysis, in its order.
    pub pumps_removed: Vec<String>,
    /// One row per case × candidate present in both, in the new design's order.
    pub rows: Vec<DutyRow>,
    /// Checks whose status changed (or that appeared or disappeared), per case × candidate.
    pub checks: Vec<CheckChange>,
    /// The recommended candidate before and after.
    pub recommendation: RecommendationChange,
}

/// The duty point of one candidate in one case, before and after.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct DutyRow {
    /// Case name.
    pub case: String,
    /// Candidate name.
    pub pump: String,
    /// Whether a duty point exists before and after.
    pub duty: Presence,
    /// Total flow at duty, m³/s.
    pub flow_m3_s: NumberChange,
    /// Total head at duty, m.
    pub head_m: NumberChange,
    /// Pump efficiency at duty (fraction).
    pub efficiency: NumberChange,
    /// Shaft power of the running pumps, W.
    #[serde(rename = "shaft_power_W")]
    pub shaft_power: NumberChange,
    /// NPSH available divided by NPSH required.
    pub npsh_margin: NumberChange,
}

/// Whether a duty point exists before and after.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Presence {
    /// A duty point before and after.
    Both,
    /// Only after.
    Appeared,
    /// Only before.
    Disappeared,
    /// Neither before nor after.
    Neither,
}

/// One number before and after; `change_percent` when both exist and `before` is not zero.
#[derive(Clone, Copy, Debug, PartialEq, Serialize)]
pub struct NumberChange {
    /// The old value (SI, the unit named by the field holding it).
    pub before: Option<f64>,
    /// The new value (SI, same unit).
    pub after: Option<f64>,
    /// 100 × (after − before) / |before|, %.
    pub change_percent: Option<f64>,
}

impl NumberChange {
    fn new(before: Option<f64>, after: Option<f64>) -> NumberChange {
        let change_percent = match (before, after) {
            (Some(b), Some(a)) if b != 0.0 => Some(100.0 * (a - b) / b.abs()),
            _ => None,
        };
        NumberChange {
            before,
            after,
            change_percent,
        }
    }

    /// True when the number appeared, disappeared or moved.
    pub fn changed(&self) -> bool {
        self.before != self.after
    }
}

/// A check of one case × candidate whose status is not what it was.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct CheckChange {
    /// Case name.
    pub case: String,
    /// Candidate name.
    pub pump: String,
    /// The check's id; for `velocity` with the side (`velocity suction`), for
    /// `requirement` with the quantity, comparison and cases of the requirement as
    /// written, its limit left out (`requirement flow >= … for normal`).
    pub check: String,
    /// `pass`, `warn` or `fail`; `None` when the check is not made on that side.
    pub before: Option<&'static str>,
    /// `pass`, `warn` or `fail` after; `None` when not made there.
    pub after: Option<&'static str>,
    /// The message of the new check, or of the old one when it is gone.
    pub message: String,
}

/// The recommended candidate before and after.
#[derive(Clone, Debug, PartialEq, Serialize)]
pub struct RecommendationChange {
    /// Recommended candidate before, if any.
    pub before: Option<String>,
    /// Recommended candidate after, if any.
    pub after: Option<String>,
    /// True when they differ.
    pub changed: bool,
}

impl ResultsDiff {
    /// True when any result differs.
    pub fn has_differences(&self) -> bool {
        !(self.cases_added.is_empty()
            && self.cases_removed.is_empty()
            && self.pumps_added.is_empty()
            && self.pumps_removed.is_empty()
            && self.checks.is_empty()
            && !self.recommendation.changed
            && self.rows.iter().all(|r| {
                !(r.flow_m3_s.changed()
                    || r.head_m.changed()
                    || r.efficiency.changed()
                    || r.shaft_power.changed()
                    || r.npsh_margin.changed())
            }))
    }
}

/// Compare two analyses (check messages in `units`, the new design's). Cases and candidates are matched by name.
pub fn diff_analyses(old: &Analysis, new: &Analysis, units: &Units) -> ResultsDiff {
    let names = |cases: &[CaseResult]| cases.iter().map(|c| c.name.clone()).collect::<Vec<_>>();
    let (old_cases, new_cases) = (names(&old.cases), names(&new.cases));
    let pumps = |a: &Analysis| {
        a.candidates
            .iter()
            .map(|c| c.name.clone())
            .collect::<Vec<_>>()
    };
    let (old_pumps, new_pumps) = (pumps(old), pumps(new));
    let only = |a: &[String], b: &[String]| -> Vec<String> {
        a.iter().filter(|x| !b.contains(x)).cloned().collect()
    };
    let mut rows = Vec::new();
    let mut checks = Vec::new();
    for nc in &new.cases {
        let Some(oc) = old.cases.iter().find(|c| c.name == nc.name) else {
            continue;
        };
        for pump in new_pumps.iter().filter(|p| old_pumps.contains(p)) {
            let find = |c: &'_ CaseResult| c.pumps.iter().find(|r| &r.name == pump).cloned();
            let (before, after) = (find(oc), find(nc));
            rows.push(row(&nc.name, pump, before.as_ref(), after.as_ref()));
            checks.extend(check_changes(
                &nc.name,
                pump,
                before.as_ref(),
                after.as_ref(),
                units,
            ));
        }
    }
    let (rb, ra) = (
        old.selection.recommended.clone(),
        new.selection.recommended.clone(),
    );
    ResultsDiff {
        cases_added: only(&new_cases, &old_cases),
        cases_removed: only(&old_cases, &new_cases),
        pumps_added: only(&new_pumps, &old_pumps),
        pumps_removed: only(&old_pumps, &new_pumps),
        rows,
        checks,
        recommendation: RecommendationChange {
            changed: rb != ra,
            before: rb,
            after: ra,
        },
    }
}

fn npsh_ratio(d: &Duty) -> Option<f64> {
    d.npsh_required
        .filter(|n| *n > 0.0)
        .map(|n| d.npsh_available / n)
}

fn row(case: &str, pump: &str, before: Option<&PumpResult>, after: Option<&PumpResult>) -> DutyRow {
    let duty = |r: Option<&PumpResult>| r.and_then(|r| r.duty.clone());
    let (b, a) = (duty(before), duty(after));
    let pick = |f: fn(&Duty) -> Option<f64>| {
        NumberChange::new(b.as_ref().and_then(f), a.as_ref().and_then(f))
    };
    DutyRow {
        case: case.to_string(),
        pump: pump.to_string(),
        duty: match (b.is_some(), a.is_some()) {
            (true, true) => Presence::Both,
            (false, true) => Presence::Appeared,
            (true, false) => Presence::Disappeared,
            (false, false) => Presence::Neither,
        },
        flow_m3_s: pick(|d| Some(d.flow)),
        head_m: pick(|d| Some(d.head)),
        efficiency: pick(|d| d.efficiency),
        shaft_power: pick(|d| d.shaft_power),
        npsh_margin: pick(npsh_ratio),
    }
}

/// The name a check is matched by between the two analyses.
fn check_key(c: &Check) -> String {
    // Requirement and velocity checks always name their subject.
    let subject = c.subject.as_deref().unwrap_or_default();
    match c.id.as_str() {
        "requirement" => format!("requirement {}", requirement_key(subject)),
        "velocity" => match subject.split_whitespace().next() {
            Some(side) => format!("velocity {side}"),
            None => "velocity".to_string(),
        },
        id => id.to_string(),
    }
}

/// A requirement check's message starts with the requirement as written, in
/// backticks (`` `flow >= 700 gpm for normal`: met ``). Its key keeps the quantity,
/// the comparison and the cases, not the limit (`flow >= … for normal`), so a
/// changed limit shows as a changed status of the same requirement.
fn requirement_key(message: &str) -> String {
    let written = message.split('`').nth(1).unwrap_or(message);
    let written = written.split_whitespace().collect::<Vec<_>>().join(" ");
    let op = [">=", "<=", "≥", "≤"]
        .iter()
        .filter_map(|op| written.find(op).map(|at| (at, *op)))
        .min();
    let Some((at, op)) = op else {
        return written;
    };
    let quantity = written[..at].trim();
    let symbol = if op == ">=" || op == "≥" {
        ">="
    } else {
        "<="
    };
    let scope = written[at + op.len()..]
        .split_once(" for ")
        .map(|(_, cases)| format!(" for {}", cases.trim()))
        .unwrap_or_default();
    format!("{quantity} {symbol} …{scope}")
}

/// Checks keyed uniquely: a repeated key gets `#2`, `#3`, ... in order.
fn keyed(r: Option<&PumpResult>) -> Vec<(String, &Check)> {
    let mut out: Vec<(String, &Check)> = Vec::new();
    for c in r.map(|r| r.checks.as_slice()).unwrap_or(&[]) {
        let base = check_key(c);
        let n = out
            .iter()
            .filter(|(k, _)| k == &base || k.starts_with(&format!("{base} #")))
            .count();
        let key = if n == 0 {
            base
        } else {
            format!("{base} #{}", n + 1)
        };
        out.push((key, c));
    }
    out
}

fn check_changes(
    case: &str,
    pump: &str,
    before: Option<&PumpResult>,
    after: Option<&PumpResult>,
    units: &Units,
) -> Vec<CheckChange> {
    let (old, new) = (keyed(before), keyed(after));
    let mut out = Vec::new();
    let mut push = |key: &str, b: Option<&Check>, a: Option<&Check>| {
        let status = |c: Option<&Check>| c.map(|c| c.status.keyword());
        if status(b) != status(a) {
            out.push(CheckChange {
                case: case.to_string(),
                pump: pump.to_string(),
                check: key.to_string(),
                before: status(b),
                after: status(a),
                message: a
                    .or(b)
                    .map(|c| units.render(&c.message.get()))
                    .unwrap_or_default(),
            });
        }
    };
    for (key, a) in &new {
        let b = old.iter().find(|(k, _)| k == key).map(|x| x.1);
        push(key, b, Some(a));
    }
    for (key, b) in old.iter().filter(|(k, _)| !new.iter().any(|(n, _)| n == k)) {
        push(key, Some(b), None);
    }
    out
}

#[cfg(test)]
mod tests {
    use super::requirement_key;

    #[test]
    fn requirement_keys_leave_out_the_limit() {
        assert_eq!(
            requirement_key("`flow  >= 700 gpm for normal, dry`: met (SI value 0.05)"),
            "flow >= … for normal, dry"
        );
        assert_eq!(
            requirement_key("`npsh_margin ≥ 1.3`: not met"),
            "npsh_margin >= …"
        );
        assert_eq!(requirement_key("`head <= 60 m`: no value"), "head <= …");
        assert_eq!(requirement_key("no backticks"), "no backticks");
    }
}
