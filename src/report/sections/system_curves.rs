//! The system curves chapter: head against flow per case, as tables and plots.

use super::{group_label, CASES_PER_GROUP};
use crate::analysis::{Analysis, CaseResult};
use crate::display::Units;
use crate::report::layout::chart::{Chart, Series};
use crate::report::layout::document::{Align, Block, Column};

/// The system curves chapter, in groups of cases.
pub(super) fn chapter(blocks: &mut Vec<Block>, analysis: &Analysis, units: &Units) {
    blocks.push(Block::heading(1, "System curves"));
    if analysis
        .cases
        .iter()
        .any(|c| c.pumps.iter().any(|p| !p.wells.is_empty()))
    {
        blocks.push(Block::text(
            "A well field has no single station flow and so no system curve: each well \
             pump's duty is solved with the collector network (see Well field).",
        ));
    }
    let (fl, hd) = (units.flow(), units.head());
    let cases: Vec<&CaseResult> = analysis
        .cases
        .iter()
        .filter(|c| !c.system_curve.is_empty())
        .collect();
    let groups = cases.len().div_ceil(CASES_PER_GROUP).max(1);
    for (k, group) in cases.chunks(CASES_PER_GROUP).enumerate() {
        let mut columns = vec![Column::new(
            format!("Flow ({})", fl.label),
            0.16,
            Align::Right,
        )];
        let w = 0.84 / group.len().max(1) as f64;
        for c in group {
            columns.push(Column::new(
                format!("{} ({})", c.name, hd.label),
                w,
                Align::Right,
            ));
        }
        let n = group[0].system_curve.len();
        let rows: Vec<Vec<String>> = (0..n)
            .step_by(2)
            .map(|i| {
                let mut r = vec![fl.figure(group[0].system_curve[i].flow)];
                for c in group {
                    r.push(
                        c.system_curve
                            .get(i)
                            .map(|p| hd.figure(p.head))
                            .unwrap_or_default(),
                    );
                }
                r
            })
            .collect();
        blocks.push(Block::Table {
            columns,
            rows,
            caption: Some(format!(
                "System head against flow{}{}",
                group_label(k, groups),
                match group
                    .iter()
                    .any(|c| c.system.as_ref().is_some_and(|s| s.well.is_some()))
                {
                    true => "; from a well's static level, with its drawdown at each flow added (s = B·Q + C·Q², the candidate chapters' well tables)",
                    false => "",
                }
            )),
        });
        let chart = Chart {
            x_label: format!("Flow ({})", fl.label),
            y_label: format!("Head ({})", hd.label),
            series: group
                .iter()
                .enumerate()
                .map(|(i, c)| Series {
                    name: format!("system, {}", c.name),
                    points: c
                        .system_curve
                        .iter()
                        .map(|p| (fl.value(p.flow), hd.value(p.head)))
                        .collect(),
                    style_index: i,
                    ..Default::default()
                })
                .collect(),
            ..Default::default()
        };
        blocks.push(Block::Figure {
            chart,
            height_mm: 95.0,
            caption: format!("System curves{}", group_label(k, groups)),
        });
    }
}
