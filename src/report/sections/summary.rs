//! Summarised packages for designs with many cases (issue 17). A design with more
//! than [`SUMMARY_CASES`] cases would otherwise get a table row, plot curve and
//! detail table per case and candidate (hundreds of pages). Above that threshold the
//! per-case chapters show only the governing cases ([`governing`]), and a case
//! summary chapter ([`chapter`]) covers every case: per candidate, the duties in
//! bins of flow with the range of each quantity, and the envelope. Totals (energy,
//! the ranking, motor sizing, operation) always come from every case.

use crate::analysis::{Analysis, CaseResult};
use crate::display::{count, Units};
use crate::model::Design;
use crate::report::layout::document::{Align, Block, Column};

pub use crate::analysis::SUMMARY_CASES;

/// Most governing cases kept for the per-case chapters of a summarised package.
pub const MAX_GOVERNING: usize = 24;

/// Bins of duty flow per candidate in the case summary.
const FLOW_BINS: usize = 10;

/// Whether the package of `design` is summarised.
pub(crate) fn summarised(design: &Design) -> bool {
    design.cases.len() > SUMMARY_CASES
}

/// The design and analysis restricted to the governing cases when the package of
/// `design` is summarised (`None` otherwise): what a summarised package attaches as
/// its results, so that a package of thousands of cases does not carry gigabytes of
/// JSON; the attached design recomputes every case (`dutyline results`).
pub(crate) fn governing_only(design: &Design, analysis: &Analysis) -> Option<(Design, Analysis)> {
    summarised(design).then(|| {
        let keep: Vec<usize> = governing(analysis).iter().map(|g| g.index).collect();
        restricted(design, analysis, &keep)
    })
}

/// A governing case: its index in the design and why it is kept.
pub(crate) struct Governing {
    /// Index of the case in design order.
    pub index: usize,
    /// Why it is kept: the criterion ("largest flow") and the candidate it is of
    /// (index), if any.
    pub reasons: Vec<(&'static str, Option<usize>)>,
}

impl Governing {
    /// The reasons in words, each criterion once with its candidates: "highest static
    /// head; largest flow of every candidate; smallest NPSH ratio of A, B".
    pub(crate) fn why(&self, names: &[&str]) -> String {
        let mut kinds: Vec<(&str, Vec<&str>)> = Vec::new();
        for (kind, k) in &self.reasons {
            let at = kinds
                .iter()
                .position(|(x, _)| x == kind)
                .unwrap_or_else(|| {
                    kinds.push((kind, Vec::new()));
                    kinds.len() - 1
                });
            if let Some(name) = k.and_then(|k| names.get(k)) {
                kinds[at].1.push(name);
            }
        }
        kinds
            .into_iter()
            .map(|(kind, of)| match of.len() {
                0 => kind.to_string(),
                n if n == names.len() && n > 1 => format!("{kind} of every candidate"),
                _ => format!("{kind} of {}", of.join(", ")),
            })
            .collect::<Vec<_>>()
            .join("; ")
    }
}

/// NPSH available over required at a duty (the ratio the NPSH check compares).
fn npsh_ratio(r: &crate::analysis::duty::PumpResult) -> Option<f64> {
    let d = r.duty.as_ref()?;
    d.npsh_required
        .filter(|n| *n > 0.0)
        .map(|n| d.npsh_available / n)
}

/// The case where `key` is least (`lowest`) or greatest, among cases that have it.
fn extreme(
    cases: &[CaseResult],
    key: &dyn Fn(&CaseResult) -> Option<f64>,
    lowest: bool,
) -> Option<usize> {
    let mut best: Option<(usize, f64)> = None;
    for (i, c) in cases.iter().enumerate() {
        let Some(v) = key(c).filter(|v| v.is_finite()) else {
            continue;
        };
        let better = best.is_none_or(|(_, b)| if lowest { v < b } else { v > b });
        if better {
            best = Some((i, v));
        }
    }
    best.map(|(i, _)| i)
}

/// The governing cases, in design order: the highest and lowest static head, the
/// first case that could not be set up or has no duty, and per candidate the
/// smallest and largest duty flow, the largest shaft power and the smallest NPSH
/// ratio. At most [`MAX_GOVERNING`], taken in that order of criteria.
pub(crate) fn governing(analysis: &Analysis) -> Vec<Governing> {
    let cases = &analysis.cases;
    let static_head = |c: &CaseResult| c.system_curve.first().map(|p| p.static_head);
    type Pick = (Option<usize>, &'static str, Option<usize>);
    let mut picks: Vec<Pick> = vec![
        (
            extreme(cases, &static_head, false),
            "highest static head",
            None,
        ),
        (
            extreme(cases, &static_head, true),
            "lowest static head",
            None,
        ),
        (
            cases.iter().position(|c| c.system.is_none()),
            "could not be set up",
            None,
        ),
    ];
    for k in 0..analysis.candidates.len() {
        fn duty(c: &CaseResult, k: usize) -> Option<&crate::analysis::duty::Duty> {
            c.pumps.get(k).and_then(|r| r.duty.as_ref())
        }
        let no_duty = cases
            .iter()
            .position(|c| c.pumps.get(k).is_some_and(|r| r.duty.is_none()));
        picks.push((no_duty, "no duty point", Some(k)));
        let flow = move |c: &CaseResult| duty(c, k).map(|d| d.flow);
        picks.push((extreme(cases, &flow, true), "smallest flow", Some(k)));
        picks.push((extreme(cases, &flow, false), "largest flow", Some(k)));
        let power = move |c: &CaseResult| duty(c, k).and_then(|d| d.shaft_power);
        picks.push((
            extreme(cases, &power, false),
            "largest shaft power",
            Some(k),
        ));
        let npsh = move |c: &CaseResult| c.pumps.get(k).and_then(npsh_ratio);
        picks.push((extreme(cases, &npsh, true), "smallest NPSH ratio", Some(k)));
    }
    let mut kept: Vec<Governing> = Vec::new();
    for (index, kind, k) in picks {
        let Some(index) = index else { continue };
        let reason = (kind, k);
        if let Some(g) = kept.iter_mut().find(|g| g.index == index) {
            g.reasons.push(reason);
        } else if kept.len() < MAX_GOVERNING {
            kept.push(Governing {
                index,
                reasons: vec![reason],
            });
        }
    }
    kept.sort_by_key(|g| g.index);
    kept
}

/// The design and analysis restricted to the cases at `keep` (design order), for the
/// per-case chapters. Everything computed over all cases (ranking, motors, operation,
/// warnings) is kept whole.
pub(crate) fn restricted(
    design: &Design,
    analysis: &Analysis,
    keep: &[usize],
) -> (Design, Analysis) {
    let pick = |v: &[bool]| keep.iter().filter_map(|&i| v.get(i).copied()).collect();
    let d = Design {
        project: design.project.clone(),
        revisions: design.revisions.clone(),
        purpose: design.purpose.clone(),
        assumptions: design.assumptions.clone(),
        notes: design.notes.clone(),
        base: design.base.clone(),
        cases: keep
            .iter()
            .filter_map(|&i| design.cases.get(i).cloned())
            .collect(),
        requirements: design.requirements.clone(),
        node_requirements: design.node_requirements.clone(),
        pumps: design.pumps.clone(),
        motor: design.motor.clone(),
        energy: design.energy.clone(),
        operation: design.operation.clone(),
        uncertainty: design.uncertainty.clone(),
    };
    let a = Analysis {
        cases: keep
            .iter()
            .filter_map(|&i| analysis.cases.get(i).cloned())
            .collect(),
        candidates: analysis.candidates.clone(),
        selection: analysis.selection.clone(),
        warnings: analysis.warnings.clone(),
        flow_max: analysis.flow_max,
        report_units: analysis.report_units,
        // Indexed by case: the envelope chapter reads the whole analysis.
        envelope: None,
        motors: analysis.motors.clone(),
        motor_sizing: analysis.motor_sizing.clone(),
        one_alone: analysis.one_alone.clone(),
        capacity: analysis
            .capacity
            .iter()
            .map(|row| keep.iter().filter_map(|&i| row.get(i).copied()).collect())
            .collect(),
        requirement_matrix: analysis
            .requirement_matrix
            .iter()
            .map(|r| crate::analysis::capacity::RequirementRow {
                written: r.written.clone(),
                text: r.text.clone(),
                applies: pick(&r.applies),
                status: r
                    .status
                    .iter()
                    .map(|s| keep.iter().filter_map(|&i| s.get(i).copied()).collect())
                    .collect(),
            })
            .collect(),
        safety: crate::analysis::safety::Safety {
            candidate: analysis.safety.candidate.clone(),
            shutoff: analysis.safety.shutoff.clone(),
            cases: keep
                .iter()
                .filter_map(|&i| analysis.safety.cases.get(i).cloned())
                .collect(),
            closed_loop_max_pa: analysis.safety.closed_loop_max_pa,
        },
        operation: analysis.operation.clone(),
    };
    (d, a)
}

/// "a–b" of the smallest and largest value shown by `f`, or one value when they print alike.
fn range(values: &[f64], f: &dyn Fn(f64) -> String) -> String {
    let finite = values.iter().copied().filter(|v| v.is_finite());
    let lo = finite.clone().fold(f64::INFINITY, f64::min);
    let hi = finite.fold(f64::NEG_INFINITY, f64::max);
    if !lo.is_finite() {
        return "—".into();
    }
    let (a, b) = (f(lo), f(hi));
    if a == b {
        a
    } else {
        format!("{a}–{b}")
    }
}

/// One candidate's duty in one case, for the bins.
struct Run {
    flow: f64,
    head: f64,
    efficiency: Option<f64>,
    power: Option<f64>,
    npsh: Option<f64>,
    hours: f64,
}

/// Every case's duty of candidate `k` (cases without one are counted apart).
fn runs(analysis: &Analysis, k: usize) -> (Vec<Run>, usize) {
    let mut out = Vec::new();
    let mut missing = 0;
    for c in &analysis.cases {
        let Some(r) = c.pumps.get(k) else {
            missing += 1;
            continue;
        };
        let Some(d) = r.duty.as_ref() else {
            missing += 1;
            continue;
        };
        out.push(Run {
            flow: d.flow,
            head: d.head,
            efficiency: d.efficiency,
            power: d.shaft_power,
            npsh: npsh_ratio(r),
            hours: r.energy.as_ref().map_or(c.hours_per_year, |e| e.hours),
        });
    }
    (out, missing)
}

/// One table row of `runs` labelled `label`.
fn bin_row(label: String, runs: &[&Run], units: &Units) -> Vec<String> {
    let (hd, pw) = (units.head(), units.power());
    let col =
        |f: &dyn Fn(&Run) -> Option<f64>| runs.iter().filter_map(|r| f(r)).collect::<Vec<_>>();
    vec![
        label,
        runs.len().to_string(),
        format!("{:.0}", runs.iter().map(|r| r.hours).sum::<f64>()),
        range(&col(&|r| Some(r.head)), &|v| hd.figure(v)),
        range(&col(&|r| r.efficiency), &|v| {
            crate::display::typeset(v * 100.0, 1)
        }),
        range(&col(&|r| r.power), &|v| pw.figure(v)),
        range(&col(&|r| r.npsh), &|v| crate::display::typeset(v, 2)),
    ]
}

/// Candidate `k`'s duties of every case in [`FLOW_BINS`] equal bins of flow.
fn candidate_bins(blocks: &mut Vec<Block>, analysis: &Analysis, k: usize, units: &Units) {
    let (runs, missing) = runs(analysis, k);
    let name = &analysis.candidates[k].name;
    let (fl, hd, pw) = (units.flow(), units.head(), units.power());
    let lo = runs.iter().map(|r| r.flow).fold(f64::INFINITY, f64::min);
    let hi = runs
        .iter()
        .map(|r| r.flow)
        .fold(f64::NEG_INFINITY, f64::max);
    let mut rows = Vec::new();
    if lo.is_finite() {
        let width = (hi - lo) / FLOW_BINS as f64;
        let mut bins: Vec<Vec<&Run>> = (0..FLOW_BINS).map(|_| Vec::new()).collect();
        for r in &runs {
            let b = if width > 0.0 {
                (((r.flow - lo) / width) as usize).min(FLOW_BINS - 1)
            } else {
                0
            };
            bins[b].push(r);
        }
        for (b, members) in bins.iter().enumerate() {
            if !members.is_empty() {
                let edges = [lo + width * b as f64, lo + width * (b + 1) as f64];
                rows.push(bin_row(range(&edges, &|v| fl.figure(v)), members, units));
            }
        }
        rows.push(bin_row(
            "all duties".into(),
            &runs.iter().collect::<Vec<_>>(),
            units,
        ));
    }
    if missing > 0 {
        let mut row = vec!["no duty point".to_string(), missing.to_string()];
        row.resize(7, "—".into());
        rows.push(row);
    }
    blocks.push(Block::heading(2, format!("Candidate {name}")));
    blocks.push(Block::Table {
        columns: vec![
            Column::new(format!("Flow ({})", fl.label), 0.20, Align::Left),
            Column::new("Cases", 0.09, Align::Right),
            Column::new("Hours per year", 0.13, Align::Right),
            Column::new(format!("Head ({})", hd.label), 0.16, Align::Right),
            Column::new("Efficiency (%)", 0.13, Align::Right),
            Column::new(format!("Shaft power ({})", pw.label), 0.16, Align::Right),
            Column::new("NPSH ratio", 0.13, Align::Right),
        ],
        rows,
        caption: Some(format!(
            "Candidate {name}: every case's duty in {FLOW_BINS} equal bins of duty flow (smallest to largest), with the range of each quantity in the bin"
        )),
    });
}

/// The case summary chapter: what is summarised and how, the governing cases and the
/// binned duties of every candidate over every case.
pub(super) fn chapter(
    blocks: &mut Vec<Block>,
    analysis: &Analysis,
    kept: &[Governing],
    units: &Units,
) {
    blocks.push(Block::PageBreak);
    blocks.push(Block::heading(1, "Case summary"));
    blocks.push(Block::text(format!(
        "This design has {}, more than the {SUMMARY_CASES} this package shows one by one. The design basis, system curve, network, candidate, selection, checks and safety chapters therefore show only the {} listed in the next table, chosen as the extremes of static head, duty flow, shaft power and NPSH ratio; the totals (energy per year, ranking, motor sizing, operation) are over every case. The tables of this chapter cover every case, in bins of duty flow. Every case's full results are in the results file attached to this package.",
        count(analysis.cases.len(), "operating case", "operating cases"),
        count(kept.len(), "governing case", "governing cases"),
    )));
    let names: Vec<&str> = analysis
        .candidates
        .iter()
        .map(|c| c.name.as_str())
        .collect();
    let rows = kept
        .iter()
        .filter_map(|g| {
            let c = analysis.cases.get(g.index)?;
            Some(vec![
                c.name.clone(),
                format!("{:.0}", c.hours_per_year),
                g.why(&names),
            ])
        })
        .collect();
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Case", 0.22, Align::Left),
            Column::new("Hours per year", 0.14, Align::Right),
            Column::new("Why it is shown", 0.64, Align::Left),
        ],
        rows,
        caption: Some("Governing cases shown in the per-case chapters".into()),
    });
    for k in 0..analysis.candidates.len() {
        candidate_bins(blocks, analysis, k, units);
    }
    checks_tally(blocks, analysis, units);
}

/// Every check over every case: per candidate and check, how many cases pass, warn
/// and fail, and the first case of the worst status with its finding.
fn checks_tally(blocks: &mut Vec<Block>, analysis: &Analysis, units: &Units) {
    use crate::analysis::checks::Status;
    // (pump, check) → [pass, warn, fail] counts and the first worst (status, case, finding).
    type Tally<'a> = ([usize; 3], Option<(Status, &'a str, String)>);
    let mut order: Vec<(usize, crate::analysis::limits::CheckId)> = Vec::new();
    let mut tallies: Vec<Tally> = Vec::new();
    for c in &analysis.cases {
        for (k, p) in c.pumps.iter().enumerate() {
            for check in &p.checks {
                let key = (k, check.id);
                // Few keys (candidates × kinds of check): a scan is cheaper than hashing.
                let at = order.iter().position(|x| *x == key).unwrap_or_else(|| {
                    order.push(key);
                    tallies.push(([0; 3], None));
                    order.len() - 1
                });
                let (counts, worst) = &mut tallies[at];
                let rank = check.status as usize;
                counts[rank] += 1;
                let worse = worst.as_ref().is_none_or(|(s, _, _)| rank > *s as usize);
                if rank > 0 && worse {
                    *worst = Some((
                        check.status,
                        c.name.as_str(),
                        units.render(&check.message.get()),
                    ));
                }
            }
        }
    }
    let rows = order
        .into_iter()
        .zip(tallies)
        .map(|((k, id), (counts, worst))| {
            let pump = analysis
                .candidates
                .get(k)
                .map_or(String::new(), |c| c.name.clone());
            let check = super::checks::check_name(id.as_str());
            let first = worst.map_or("—".to_string(), |(_, case, finding)| {
                format!("{case}: {}", super::wording::plain(&finding))
            });
            vec![
                pump,
                check,
                counts[0].to_string(),
                counts[1].to_string(),
                counts[2].to_string(),
                first,
            ]
        })
        .collect();
    blocks.push(Block::heading(2, "Checks over every case"));
    blocks.push(Block::Table {
        columns: vec![
            Column::new("Pump", 0.08, Align::Left),
            Column::new("Check", 0.16, Align::Left),
            Column::new("Pass", 0.07, Align::Right),
            Column::new("WARN", 0.07, Align::Right),
            Column::new("FAIL", 0.07, Align::Right),
            Column::new(
                "First case of the worst status, its finding",
                0.55,
                Align::Left,
            ),
        ],
        rows,
        caption: Some(
            "Every check of every case: cases per status, and the first case with the worst status"
                .into(),
        ),
    });
}
