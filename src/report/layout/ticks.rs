//! Axis ranges and tick marks at "nice" steps (1, 2, 2.5 or 5 times a power of ten),
//! with labels rounded to the step, and the plotters coordinate type that uses them.

use plotters::coord::ranged1d::{DefaultFormatting, KeyPointHint, Ranged};
use std::ops::Range;

/// One chart axis: its range, tick values and label precision.
#[derive(Debug, Clone, PartialEq)]
pub struct Axis {
    /// Lower end of the axis.
    pub lo: f64,
    /// Upper end of the axis.
    pub hi: f64,
    /// Tick values inside `lo..=hi`, ascending.
    pub ticks: Vec<f64>,
    /// Tick step.
    pub step: f64,
    /// Decimal places of tick labels.
    pub decimals: usize,
}

/// The nice step (1, 2, 2.5 or 5 times a power of ten) whose interval count over
/// `span` comes closest to `target`; ties go to the larger step.
pub fn nice_step(span: f64, target: usize) -> f64 {
    let target = target.max(1) as f64;
    let raw = span / target;
    if !(raw.is_finite() && raw > 0.0) {
        return 1.0;
    }
    let base = raw.log10().floor() as i32;
    let mut best = (f64::INFINITY, 1.0);
    for k in base - 1..=base + 1 {
        for m in [1.0, 2.0, 2.5, 5.0] {
            let step = m * 10f64.powi(k);
            let miss = ((span / step - 1e-9).ceil() - target).abs();
            if miss < best.0 || (miss == best.0 && step > best.1) {
                best = (miss, step);
            }
        }
    }
    best.1
}

/// Decimal places that show every multiple of `step` exactly.
fn decimals_for(step: f64) -> usize {
    for d in 0..10usize {
        let scaled = step * 10f64.powi(d as i32);
        if (scaled - scaled.round()).abs() < 1e-6 * scaled.abs().max(1.0) {
            return d;
        }
    }
    10
}

impl Axis {
    /// An axis with ticks at multiples of `step` inside `lo..=hi`.
    pub fn with_step(lo: f64, hi: f64, step: f64) -> Axis {
        let first = (lo / step - 1e-9).ceil() as i64;
        let last = (hi / step + 1e-9).floor() as i64;
        let ticks = (first..=last.min(first + 200))
            .map(|i| {
                let v = i as f64 * step;
                if v.abs() < step * 1e-9 {
                    0.0
                } else {
                    v
                }
            })
            .collect();
        Axis {
            lo,
            hi,
            ticks,
            step,
            decimals: decimals_for(step),
        }
    }

    /// An axis covering the data `min..=max` with about `target` intervals, ends
    /// rounded out to the step. With `zero_base` and non-negative data it starts at 0.
    pub fn auto(min: f64, max: f64, zero_base: bool, target: usize) -> Axis {
        let (mut min, mut max) = if min.is_finite() && max.is_finite() && min <= max {
            (min, max)
        } else {
            (0.0, 1.0)
        };
        if zero_base && min >= 0.0 {
            min = 0.0;
        }
        if max - min <= f64::EPSILON * max.abs().max(1.0) {
            let pad = if max.abs() > 0.0 {
                max.abs() * 0.1
            } else {
                1.0
            };
            max += pad;
            if !(zero_base && min == 0.0) {
                min -= pad;
            }
        }
        let headroom = 0.03 * (max - min);
        let step = nice_step(max - min + headroom, target);
        let lo = (min / step + 1e-9).floor() * step;
        let hi = ((max + headroom) / step - 1e-9).ceil() * step;
        Axis::with_step(lo, hi.max(lo + step), step)
    }

    /// A fixed range given by the caller; ticks at a nice step inside it.
    /// A reversed range is put in order; an empty or non-finite one falls back to
    /// `0..1`.
    pub fn fixed(lo: f64, hi: f64, target: usize) -> Axis {
        let (lo, hi) = if lo.is_finite() && hi.is_finite() && lo != hi {
            (lo.min(hi), lo.max(hi))
        } else {
            (0.0, 1.0)
        };
        Axis::with_step(lo, hi, nice_step(hi - lo, target))
    }

    /// An axis with exactly `intervals` steps covering `min..=max`, so its ticks line
    /// up with another axis' grid (used for the secondary y axis).
    pub fn matched(min: f64, max: f64, zero_base: bool, intervals: usize) -> Axis {
        let n = intervals.max(1) as f64;
        let (mut min, max) = if min.is_finite() && max.is_finite() && min <= max {
            (min, max)
        } else {
            (0.0, 1.0)
        };
        if zero_base && min >= 0.0 {
            min = 0.0;
        }
        let span = (max - min).max(f64::EPSILON * max.abs().max(1.0));
        let base = (span / n).log10().floor() as i32;
        // A wider set of steps than for free axes, since the count is fixed.
        for k in base - 1..=base + 2 {
            for m in [1.0, 1.5, 2.0, 2.5, 3.0, 4.0, 5.0, 6.0, 8.0] {
                let step = m * 10f64.powi(k);
                let lo = (min / step + 1e-9).floor() * step;
                if lo + n * step >= max + 1e-9 * span {
                    return Axis::with_step(lo, lo + n * step, step);
                }
            }
        }
        Axis::auto(min, max, zero_base, intervals)
    }

    /// Tick label text: rounded to the step's precision, never "-0".
    /// Very large or very small scales switch to exponent notation ("2.5e7").
    pub fn format(&self, value: f64) -> String {
        let magnitude = self.lo.abs().max(self.hi.abs());
        if magnitude >= 1e7 || (self.step < 1e-4 && magnitude < 1e-2) {
            let exponent = magnitude.log10().floor();
            let digits = decimals_for(self.step / 10f64.powf(exponent)).min(6);
            if value == 0.0 {
                return "0".to_string();
            }
            return format!("{value:.digits$e}");
        }
        crate::display::typeset(value, self.decimals)
    }

    /// Number of intervals between the first and last tick.
    pub fn intervals(&self) -> usize {
        self.ticks.len().saturating_sub(1)
    }

    /// Whether `v` lies on the axis (with a tolerance of a millionth of its span).
    pub fn contains(&self, v: f64) -> bool {
        let tol = (self.hi - self.lo) * 1e-6;
        v >= self.lo - tol && v <= self.hi + tol
    }
}

/// The plotters coordinate for an [`Axis`]: linear, with the axis' own tick values.
#[derive(Debug, Clone)]
pub struct NiceRange(pub Axis);

impl Ranged for NiceRange {
    type FormatOption = DefaultFormatting;
    type ValueType = f64;

    fn map(&self, value: &f64, limit: (i32, i32)) -> i32 {
        let span = self.0.hi - self.0.lo;
        let f = if span > 0.0 {
            (value - self.0.lo) / span
        } else {
            0.0
        };
        let pixel = f64::from(limit.0) + f * f64::from(limit.1 - limit.0);
        pixel.round().clamp(-1e8, 1e8) as i32
    }

    fn key_points<H: KeyPointHint>(&self, _hint: H) -> Vec<f64> {
        self.0.ticks.clone()
    }

    fn range(&self) -> Range<f64> {
        self.0.lo..self.0.hi
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn steps_are_nice() {
        assert_eq!(nice_step(100.0, 5), 20.0);
        assert_eq!(nice_step(12.0, 5), 2.5);
        assert!((nice_step(0.7, 6) - 0.1).abs() < 1e-12);
    }

    #[test]
    fn auto_axis_starts_at_zero_and_rounds_labels() {
        let a = Axis::auto(3.2, 87.0, true, 6);
        assert_eq!(a.lo, 0.0);
        assert!(a.hi >= 87.0);
        assert_eq!(a.format(a.ticks[1]), "20");
        let b = Axis::auto(0.0, 0.37, true, 6);
        assert_eq!(b.format(b.ticks[1]), "0.1");
        assert_eq!(b.format(-0.000001), "0.0");
    }

    #[test]
    fn matched_axis_has_the_same_interval_count() {
        let primary = Axis::auto(0.0, 55.0, true, 6);
        let second = Axis::matched(0.0, 83.0, true, primary.intervals());
        assert_eq!(second.intervals(), primary.intervals());
        assert!(second.hi >= 83.0);
    }

    #[test]
    fn extreme_scales_use_exponents() {
        let big = Axis::auto(0.0, 4.2e13, true, 5);
        assert_eq!(big.format(1e13), "1e13");
        let small = Axis::auto(0.0, 1e-9, true, 5);
        assert!(
            small.format(small.ticks[1]).contains("e-"),
            "{}",
            small.format(small.ticks[1])
        );
    }

    #[test]
    fn degenerate_data_still_gives_an_axis() {
        let a = Axis::auto(5.0, 5.0, false, 5);
        assert!(a.lo < 5.0 && a.hi > 5.0);
        let b = Axis::auto(f64::NAN, 1.0, true, 5);
        assert!(b.hi > b.lo);
    }
}
