//! A load profile from a CSV of hourly flows (`curve hourly from "flows.csv"` inside a
//! `load_profile`): 8 760 rows (8 784 for a leap year) of one `flow` column, read by the
//! one CSV reader ([`crate::model::pumps::read_csv_table_lines`]) and summarised into
//! equal-width flow bins ([`bin_hourly`]). See grammar/LANGUAGE.md, "Operation over the
//! year".

use crate::diagnostics::{Code, Diagnostic, Span};
use crate::model::eval;
use crate::model::operation::{HourlyBinning, LoadPoint, HOURS_IN_YEARS};
use crate::model::pumps::read_csv_table_lines;
use crate::model::FileAccess;
use crate::units::{Dimension, Quantity};

/// Most located diagnostics for bad rows of one file; the rest are counted.
const MAX_ROW_DIAGNOSTICS: usize = 10;

/// The load points of an hourly file summarised into `bins` bins, with the binning;
/// located diagnostics (the file's line number in the message) otherwise.
pub fn hourly_points(
    files: &dyn FileAccess,
    path: &str,
    at: Span,
    bins: usize,
    design_flow: f64,
    d: &mut Vec<Diagnostic>,
) -> Option<(Vec<LoadPoint>, HourlyBinning)> {
    let (table, lines) = match read_csv_table_lines(files, path, at, "flow m^3/h") {
        Ok(t) => t,
        Err(e) => {
            d.push(e);
            return None;
        }
    };
    let bad = |msg: String| {
        Diagnostic::error(Code::BadCsv, format!("{path}: {msg}"), Some(at)).with_help(
            "an hourly profile is a CSV with the header `flow m^3/h` (or `flow gpm`, `flow %`) and one row per hour of the year",
        )
    };
    let [column] = table.columns.as_slice() else {
        d.push(bad(format!(
            "an hourly profile has one column, `flow`; this file has {}",
            table.columns.len()
        )));
        return None;
    };
    let unit = match eval::unit(&column.unit) {
        Ok(u)
            if column.name.name == "flow"
                && (u.dim == Dimension::VOLUME_RATE || u.dim == Dimension::NONE) =>
        {
            u
        }
        Ok(_) => {
            d.push(bad(
                "the column is `flow` with a flow unit (m^3/h, L/s, gpm) or `%` of the design flow"
                    .into(),
            ));
            return None;
        }
        Err(e) => {
            d.push(e);
            return None;
        }
    };
    if unit.dim == Dimension::NONE && !design_flow.is_finite() {
        d.push(bad("flows in % need the profile's `design_flow`".into()));
        return None;
    }
    let rows = table.rows.len();
    if !HOURS_IN_YEARS.contains(&rows) {
        d.push(bad(format!(
            "an hourly profile has 8760 rows (8784 in a leap year); this file has {rows}"
        )));
        return None;
    }
    let before = d.len();
    let mut bad_rows = 0usize;
    let mut flows = Vec::with_capacity(rows);
    for (i, row) in table.rows.iter().enumerate() {
        let line = lines.get(i).copied().unwrap_or(0);
        let value = match row.cells.as_slice() {
            [c] => c.value.as_ref().map(|n| n.value),
            _ => None,
        };
        let q = value.map(|v| {
            let q = Quantity::from_value(v, &unit).si;
            if unit.dim == Dimension::NONE {
                q * design_flow
            } else {
                q
            }
        });
        match q {
            Some(q) if q.is_finite() && (0.0..1.0e3).contains(&q) => flows.push(q),
            _ => {
                bad_rows += 1;
                if bad_rows <= MAX_ROW_DIAGNOSTICS {
                    d.push(bad(format!(
                        "line {line} (hour {}): expected one flow of zero or more",
                        i + 1
                    )));
                }
            }
        }
    }
    if bad_rows > MAX_ROW_DIAGNOSTICS {
        d.push(bad(format!(
            "{} more bad rows not listed",
            bad_rows - MAX_ROW_DIAGNOSTICS
        )));
    }
    if d.len() > before {
        return None;
    }
    let Some(binning) = bin_hourly(&flows, bins, path) else {
        d.push(bad(
            "every hour has zero flow: there is nothing to pump".into()
        ));
        return None;
    };
    let points = binning
        .hours
        .iter()
        .zip(&binning.mean_flow)
        .filter(|(h, _)| **h > 0.0)
        .map(|(h, q)| LoadPoint {
            flow: *q,
            hours: *h,
            span: at,
        })
        .collect();
    Some((points, binning))
}

/// Hourly flows (m³/s, each ≥ 0) in `bins` equal-width bins from 0 to the largest flow.
/// A flow q > 0 falls in bin ⌊q/q_max · n⌋ (the largest flow in the last bin); zero
/// flows are counted apart. Each bin's mean flow is the mean of its hours, so
/// Σ hours × mean flow is the year's volume. `None` when no hour has a flow.
pub fn bin_hourly(flows: &[f64], bins: usize, source: &str) -> Option<HourlyBinning> {
    let n = bins.max(1);
    let q_max = flows.iter().copied().fold(0.0_f64, f64::max);
    if q_max <= 0.0 {
        return None;
    }
    let mut hours = vec![0.0; n];
    let mut sums = vec![0.0; n];
    let mut zero_hours = 0.0;
    for &q in flows {
        if q <= 0.0 {
            zero_hours += 1.0;
            continue;
        }
        let i = ((q / q_max * n as f64).floor() as usize).min(n - 1);
        hours[i] += 1.0;
        sums[i] += q;
    }
    let mean_flow = sums
        .iter()
        .zip(&hours)
        .map(|(s, h)| if *h > 0.0 { s / h } else { 0.0 })
        .collect();
    Some(HourlyBinning {
        source: source.to_string(),
        rows: flows.len(),
        edges: (0..=n).map(|i| q_max * i as f64 / n as f64).collect(),
        hours,
        mean_flow,
        zero_hours,
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn bins_keep_hours_and_volume() {
        // Hand check: flows 0, 1, 2, ..., 9 (10 hours) in 2 bins of width 4.5:
        // bin 1 holds 1..4 (mean 2.5, 4 h), bin 2 holds 5..9 (mean 7, 5 h), one zero hour.
        let flows: Vec<f64> = (0..10).map(f64::from).collect();
        let b = bin_hourly(&flows, 2, "x.csv").unwrap();
        assert_eq!(b.edges, vec![0.0, 4.5, 9.0]);
        assert_eq!(b.hours, vec![4.0, 5.0]);
        assert_eq!(b.mean_flow, vec![2.5, 7.0]);
        assert_eq!(b.zero_hours, 1.0);
        let volume: f64 = b.hours.iter().zip(&b.mean_flow).map(|(h, q)| h * q).sum();
        assert!((volume - 45.0).abs() < 1e-12);
        assert!(bin_hourly(&[0.0, 0.0], 4, "x.csv").is_none());
    }
}
