//! The reviewer's view of a diff: the input changes as a list, then the results
//! per case × candidate as a table, then the checks whose status changed.

use super::results::{DutyRow, NumberChange, Presence};
use super::values::{convert, fixed, unit_label, Measure};
use super::DesignDiff;
use crate::model::ReportUnits;

/// Render a diff as plain text (UTF-8, `\n` line ends, no trailing white space).
pub fn render_text(d: &DesignDiff) -> String {
    let mut out = String::new();
    if d.inputs.is_empty() {
        out.push_str("Input changes: none\n");
    } else {
        out.push_str(&format!("Input changes ({})\n", d.inputs.len()));
        for c in &d.inputs {
            out.push_str(&format!("  {}\n", c.render()));
        }
    }
    out.push('\n');
    let r = &d.results;
    out.push_str(if r.has_differences() {
        "Result changes\n"
    } else {
        "Result changes: none\n"
    });
    for (what, names) in [
        ("cases added", &r.cases_added),
        ("cases removed", &r.cases_removed),
        ("pumps added", &r.pumps_added),
        ("pumps removed", &r.pumps_removed),
    ] {
        if !names.is_empty() {
            out.push_str(&format!("  {what}: {}\n", names.join(", ")));
        }
    }
    let name = |n: &Option<String>| n.clone().unwrap_or_else(|| "none".to_string());
    let rec = &r.recommendation;
    if rec.changed {
        out.push_str(&format!(
            "  recommendation: {} → {}\n",
            name(&rec.before),
            name(&rec.after)
        ));
    } else {
        out.push_str(&format!(
            "  recommendation: {} (unchanged)\n",
            name(&rec.after)
        ));
    }
    if !r.rows.is_empty() {
        out.push('\n');
        out.push_str(&table(&r.rows, d.report_units));
    }
    if !r.checks.is_empty() {
        out.push_str(&format!("\nCheck changes ({})\n", r.checks.len()));
        for c in &r.checks {
            let status = |s: Option<&str>| s.unwrap_or("not made").to_string();
            out.push_str(&format!(
                "  {} × {}: {} {} → {}: {}\n",
                c.case,
                c.pump,
                c.check,
                status(c.before),
                status(c.after),
                c.message
            ));
        }
    }
    out
}

/// How one quantity of the table is shown.
struct Column {
    name: &'static str,
    measure: Option<Measure>,
    decimals: usize,
    get: fn(&DutyRow) -> &NumberChange,
}

fn columns(units: ReportUnits) -> [Column; 5] {
    let si = units == ReportUnits::Si;
    [
        Column {
            name: "flow",
            measure: Some(Measure::Flow),
            decimals: 1,
            get: |r| &r.flow_m3_s,
        },
        Column {
            name: "head",
            measure: Some(Measure::Length),
            decimals: if si { 2 } else { 1 },
            get: |r| &r.head_m,
        },
        Column {
            name: "efficiency",
            measure: Some(Measure::Percent),
            decimals: 1,
            get: |r| &r.efficiency,
        },
        Column {
            name: "shaft power",
            measure: Some(Measure::Power),
            decimals: 2,
            get: |r| &r.shaft_power,
        },
        Column {
            name: "NPSH margin",
            measure: None,
            decimals: 2,
            get: |r| &r.npsh_margin,
        },
    ]
}

fn table(rows: &[DutyRow], units: ReportUnits) -> String {
    let mut lines: Vec<[String; 6]> = vec![[
        "case".into(),
        "pump".into(),
        "quantity".into(),
        "before".into(),
        "after".into(),
        "change".into(),
    ]];
    for r in rows {
        let mut first = true;
        let mut push = |q: String, b: String, a: String, c: String| {
            let (case, pump) = if first {
                (r.case.clone(), r.pump.clone())
            } else {
                (String::new(), String::new())
            };
            first = false;
            lines.push([case, pump, q, b, a, c]);
        };
        if r.duty == Presence::Neither {
            push(
                "duty point".into(),
                "none".into(),
                "none".into(),
                String::new(),
            );
            continue;
        }
        for col in columns(units) {
            let n = (col.get)(r);
            if n.before.is_none() && n.after.is_none() {
                continue;
            }
            let show = |v: Option<f64>| match (v, col.measure) {
                (None, _) => "-".to_string(),
                (Some(v), Some(m)) => {
                    format!(
                        "{} {}",
                        fixed(convert(v, m, units), col.decimals),
                        unit_label(m, units)
                    )
                }
                (Some(v), None) => fixed(v, col.decimals),
            };
            let change = match (r.duty, n.change_percent) {
                (Presence::Appeared, _) => "appeared".to_string(),
                (Presence::Disappeared, _) => "disappeared".to_string(),
                (_, Some(p)) => format!("{} %", signed(p)),
                _ => "-".to_string(),
            };
            push(col.name.into(), show(n.before), show(n.after), change);
        }
    }
    let mut widths = [0usize; 6];
    for l in &lines {
        for (w, cell) in widths.iter_mut().zip(l) {
            *w = (*w).max(cell.chars().count());
        }
    }
    let mut out = String::new();
    for l in &lines {
        let mut text = String::from(" ");
        for (j, cell) in l.iter().enumerate() {
            let pad = " ".repeat(widths[j] - cell.chars().count());
            text.push(' ');
            if j >= 3 {
                text.push_str(&pad);
                text.push_str(cell);
            } else {
                text.push_str(cell);
                text.push_str(&pad);
            }
            text.push(' ');
        }
        out.push_str(text.trim_end());
        out.push('\n');
    }
    out
}

/// A percentage change with its sign, one decimal: `+0.5`, `-12.0`, `0.0`.
fn signed(p: f64) -> String {
    let s = fixed(p, 1);
    if s.starts_with('-') || s == "0.0" {
        s
    } else {
        format!("+{s}")
    }
}
