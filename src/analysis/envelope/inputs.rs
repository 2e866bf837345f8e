//! The case's system at one point of the input ranges: levels and the water
//! temperature set on a copy of the case's scenario, then roughness, Hazen-Williams C
//! and the stated losses set on the resolved segments. The case's own data are not
//! changed.

use uom::si::f64::{Length, ThermodynamicTemperature};
use uom::si::{length::meter, thermodynamic_temperature::kelvin};

use crate::analysis::system::CaseSystem;
use crate::model::uncertainty::{InputRange, RangeKind};
use crate::model::Scenario;

/// The case's system with every input `j` at `x[j]` of its range (0 low end, 1 high
/// end, 0.5 the case's value for ± ranges).
pub fn system_at(s: &Scenario, inputs: &[InputRange], x: &[f64]) -> Result<CaseSystem, String> {
    let mut s = s.clone();
    for (r, &x) in inputs.iter().zip(x) {
        let signed = 2.0 * x - 1.0;
        match &r.kind {
            RangeKind::Level { tank, plus_minus_m } => {
                for t in [&mut s.source, &mut s.destination] {
                    if t.name == *tank {
                        t.level =
                            Length::new::<meter>(t.level.get::<meter>() + signed * plus_minus_m);
                    }
                }
            }
            RangeKind::Temperature { plus_minus_k } => {
                if let Some(temperature) = s.fluid.temperature_mut() {
                    let t = temperature.get::<kelvin>() + signed * plus_minus_k;
                    *temperature = ThermodynamicTemperature::new::<kelvin>(t);
                }
            }
            _ => {}
        }
    }
    let mut sys = CaseSystem::new(&s).map_err(|e| e.message)?;
    for (r, &x) in inputs.iter().zip(x) {
        for seg in std::sync::Arc::make_mut(&mut sys.segments).iter_mut() {
            match (&r.kind, seg.hazen_williams_c) {
                (RangeKind::Roughness(sp), None) => {
                    seg.roughness = InputRange::spread_at(*sp, seg.roughness, x)
                }
                (RangeKind::HazenWilliamsC(sp), Some(c)) => {
                    seg.hazen_williams_c = Some(InputRange::spread_at(*sp, c, x))
                }
                (RangeKind::Loss { plus_minus }, _) => {
                    let (k, le) = stated_loss(&s, &seg.line, seg.index);
                    let f = (2.0 * x - 1.0) * plus_minus;
                    seg.k_constant += f * k;
                    seg.equivalent_length += f * le;
                }
                _ => {}
            }
        }
    }
    Ok(sys)
}

/// Σ K and Σ equivalent length (m) of the `loss` items on one segment.
fn stated_loss(s: &Scenario, line: &str, index: usize) -> (f64, f64) {
    let Some(seg) = s
        .lines
        .iter()
        .find(|l| l.name == line)
        .and_then(|l| l.segments.get(index))
    else {
        return (0.0, 0.0);
    };
    seg.losses.iter().fold((0.0, 0.0), |(k, le), l| {
        (
            k + l.k.unwrap_or(0.0),
            le + l.equivalent_length.map_or(0.0, |x| x.get::<meter>()),
        )
    })
}

/// The words naming input `r` at the low (`false`) or high end, for corner names.
pub fn end_words(r: &InputRange, high: bool) -> String {
    let end = if high { "high" } else { "low" };
    match &r.kind {
        RangeKind::Roughness(_) => format!("roughness {end}"),
        RangeKind::HazenWilliamsC(_) => format!("C {end}"),
        RangeKind::Level { tank, .. } => format!("{tank} level {end}"),
        RangeKind::Temperature { .. } => format!("temperature {end}"),
        RangeKind::Loss { .. } => format!("stated losses {end}"),
    }
}

/// The `i`-th point (i ≥ 1) of the radical-inverse (van der Corput) sequence in `base`,
/// in [0, 1): one coordinate of the Halton sequence (Halton 1960).
pub fn radical_inverse(mut i: u64, base: u64) -> f64 {
    let mut f = 1.0;
    let mut r = 0.0;
    while i > 0 {
        f /= base as f64;
        r += f * (i % base) as f64;
        i /= base;
    }
    r
}

/// The first primes, one Halton base per dimension (the pump and up to 8 inputs).
pub const PRIMES: [u64; 9] = [2, 3, 5, 7, 11, 13, 17, 19, 23];

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn van_der_corput_base_2() {
        // 1 → 0.5, 2 → 0.25, 3 → 0.75, 4 → 0.125 (Halton 1960, the binary reversal).
        let v: Vec<f64> = (1..=4).map(|i| radical_inverse(i, 2)).collect();
        assert_eq!(v, vec![0.5, 0.25, 0.75, 0.125]);
        assert!((radical_inverse(5, 3) - (2.0 / 3.0 + 1.0 / 9.0)).abs() < 1e-15);
    }
}
