//! Which case governs (issue 10.3): each candidate's flow at the limit the design
//! allows in every case, the requirement × case matrix, and a warning, naming both
//! cases, where a case's capacity at the limit is below the largest flow requirement
//! stated for another case.

use super::checks::Status;
use super::limits::CheckId;
use super::{CaseResult, Warning};
use crate::diagnostics::Code;
use crate::message::{Kind, Message, Part};
use crate::model::{Design, Metric};

/// One requirement across the cases.
#[derive(Clone, Debug, PartialEq)]
pub struct RequirementRow {
    /// As written in the design (the diff's key).
    pub written: String,
    /// In plain words with its limit (printed in report units).
    pub text: Message,
    /// Per case (design order): whether the requirement applies there.
    pub applies: Vec<bool>,
    /// Per candidate (design order), per case: the requirement check's status where it applies.
    pub status: Vec<Vec<Option<Status>>>,
}

/// The requirement × case matrix.
pub fn requirement_matrix(design: &Design, cases: &[CaseResult]) -> Vec<RequirementRow> {
    design
        .requirements
        .iter()
        .map(|r| {
            let applies: Vec<bool> = cases
                .iter()
                .map(|c| r.cases.is_empty() || r.cases.contains(&c.name))
                .collect();
            let status = (0..design.pumps.len())
                .map(|k| {
                    cases
                        .iter()
                        .map(|c| {
                            c.pumps.get(k).and_then(|p| {
                                p.checks
                                    .iter()
                                    .find(|ch| {
                                        ch.id == CheckId::Requirement
                                            && ch.subject.as_deref() == Some(r.text.as_str())
                                    })
                                    .map(|ch| ch.status)
                            })
                        })
                        .collect()
                })
                .collect();
            RequirementRow {
                written: r.text.clone(),
                text: super::checks::requirement_text(r),
                applies,
                status,
            }
        })
        .collect()
}

/// Per candidate, per case: the flow at the limit (m³/s), `None` where the curves do
/// not meet within the published data or the case was not analysed.
pub fn capacity_table(design: &Design, cases: &[CaseResult]) -> Vec<Vec<Option<f64>>> {
    (0..design.pumps.len())
        .map(|k| {
            cases
                .iter()
                .map(|c| c.pumps.get(k).and_then(|p| p.capacity_flow))
                .collect()
        })
        .collect()
}

/// A warning per candidate × case without a flow requirement of its own whose
/// capacity at the limit is below the largest flow requirement of another case.
pub fn governing_warnings(design: &Design, cases: &[CaseResult]) -> Vec<Warning> {
    let own = |name: &str| super::duty::required_flow(design, name);
    // The largest stated `flow >=` requirement and its case.
    let Some((q_max, governing)) = cases
        .iter()
        .filter_map(|c| own(&c.name).map(|q| (q, c.name.clone())))
        .max_by(|a, b| a.0.total_cmp(&b.0))
    else {
        return Vec::new();
    };
    let any_flow_requirement = design
        .requirements
        .iter()
        .any(|r| r.metric == Metric::Flow && r.at_least);
    let mut out = Vec::new();
    for (k, p) in design.pumps.iter().enumerate() {
        for c in cases
            .iter()
            .filter(|c| c.name != governing && own(&c.name).is_none())
        {
            let Some(q) = c.pumps.get(k).and_then(|r| r.capacity_flow) else {
                continue;
            };
            if any_flow_requirement && q < q_max {
                out.push(Warning {
                    code: Code::GoverningCase,
                    message: crate::message![
                        format!("pump {}: in case {} the set delivers ", p.name, c.name),
                        Part::Against(Kind::Flow, q, q_max),
                        " at its limit (maximum speed, largest impeller allowed), below the ",
                        Part::Against(Kind::Flow, q_max, q),
                        format!(" required in case {governing}; if case {} must deliver that flow, give it its own flow requirement", c.name)
                    ],
                    span: design.cases.iter().find(|d| d.name == c.name).map(|d| d.span),
                });
            }
        }
    }
    out
}
