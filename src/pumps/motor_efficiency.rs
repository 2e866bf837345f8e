//! Default full-load motor efficiency by rating, poles and supply frequency: the
//! IE3 (premium) class values of IEC 60034-30-1 (2014), Table 3 (50 Hz) and the
//! 60 Hz values, which equal NEMA Premium (NEMA MG 1, Table 12-12, totally enclosed).
//!
//! All values are **from memory**; confirm against the edition in force. The 60 Hz
//! values from 1 hp to 200 hp were cross-checked against the transcription of the
//! CSA C390 / NEMA Premium nominal efficiencies in the Python `fluids` package
//! (`nema_high_full_closed_2p/4p/6p`), and agree to every digit; the 250–500 hp and
//! the 50 Hz values were not cross-checked. Below the smallest tabulated rating the
//! smallest entry is used and said so; more than six poles use the six-pole column.

use super::motor::{MotorStandard, WATTS_PER_HP};

/// The efficiency class the defaults come from.
pub const CLASS: &str = "IE3";

/// IE3 at 50 Hz: (rated output kW, 2-pole, 4-pole, 6-pole) in %.
const IE3_50HZ: [(f64, f64, f64, f64); 22] = [
    (0.75, 80.7, 82.5, 78.9),
    (1.1, 82.7, 84.1, 81.0),
    (1.5, 84.2, 85.3, 82.5),
    (2.2, 85.9, 86.7, 84.3),
    (3.0, 87.1, 87.7, 85.6),
    (4.0, 88.1, 88.6, 86.8),
    (5.5, 89.2, 89.6, 88.0),
    (7.5, 90.1, 90.4, 89.1),
    (11.0, 91.2, 91.4, 90.3),
    (15.0, 91.9, 92.1, 91.2),
    (18.5, 92.4, 92.6, 91.7),
    (22.0, 92.7, 93.0, 92.2),
    (30.0, 93.3, 93.6, 92.9),
    (37.0, 93.7, 93.9, 93.3),
    (45.0, 94.0, 94.2, 93.7),
    (55.0, 94.3, 94.6, 94.1),
    (75.0, 94.7, 95.0, 94.6),
    (90.0, 95.0, 95.2, 94.9),
    (110.0, 95.2, 95.4, 95.1),
    (132.0, 95.4, 95.6, 95.4),
    (160.0, 95.6, 95.8, 95.6),
    (200.0, 95.8, 96.0, 95.8),
];

/// IE3 at 60 Hz = NEMA Premium, totally enclosed: (rated output hp, 2-, 4-, 6-pole) in %.
const IE3_60HZ: [(f64, f64, f64, f64); 20] = [
    (1.0, 77.0, 85.5, 82.5),
    (1.5, 84.0, 86.5, 87.5),
    (2.0, 85.5, 86.5, 88.5),
    (3.0, 86.5, 89.5, 89.5),
    (5.0, 88.5, 89.5, 89.5),
    (7.5, 89.5, 91.7, 91.0),
    (10.0, 90.2, 91.7, 91.0),
    (15.0, 91.0, 92.4, 91.7),
    (20.0, 91.0, 93.0, 91.7),
    (25.0, 91.7, 93.6, 93.0),
    (30.0, 91.7, 93.6, 93.0),
    (40.0, 92.4, 94.1, 94.1),
    (50.0, 93.0, 94.5, 94.1),
    (60.0, 93.6, 95.0, 94.5),
    (75.0, 93.6, 95.4, 94.5),
    (100.0, 94.1, 95.4, 95.0),
    (125.0, 95.0, 95.4, 95.0),
    (150.0, 95.0, 95.8, 95.8),
    (200.0, 95.4, 96.2, 95.8),
    (250.0, 95.8, 96.2, 95.8),
];

/// The supply frequency assumed for a rating series when the design states none
/// (`motor { supply = ... }`): 60 Hz for NEMA, 50 Hz for IEC.
pub fn supply_hz(std: MotorStandard) -> f64 {
    match std {
        MotorStandard::Nema => 60.0,
        MotorStandard::Iec => 50.0,
    }
}

/// Poles of an induction motor running at `speed_rpm` on `supply_hz`: the even
/// number whose synchronous speed 120·f/p is the nearest at or above the speed.
pub fn poles(speed_rpm: f64, supply_hz: f64) -> u32 {
    if !(speed_rpm > 0.0 && speed_rpm.is_finite()) {
        return 4;
    }
    let p = (120.0 * supply_hz / speed_rpm).floor() as u32;
    (p - p % 2).max(2)
}

/// A default efficiency and what it is.
#[derive(Clone, Debug, PartialEq)]
pub struct DefaultEfficiency {
    /// Full-load efficiency, fraction.
    pub efficiency: f64,
    /// "IE3 class value, IEC 60034-30-1, 4 poles at 50 Hz, 75 kW (recalled)".
    pub source: String,
}

/// Whether a supply frequency (Hz) reads the 50 Hz table of IEC 60034-30-1 (else the
/// 60 Hz one): below 55 Hz.
fn is_50hz(supply_hz: f64) -> bool {
    supply_hz < 55.0
}

/// The class efficiency of a rating (W) with `poles` on a supply of `supply_hz` (50 or
/// 60 Hz; IEC 60034-30-1 has one table per frequency, the 50 Hz one by kW and the
/// 60 Hz one by hp, whatever the rating series): the entry of the largest tabulated
/// rating at or below it (ratings between two rows take the lower row's value).
pub fn default_efficiency(rating_w: f64, poles: u32, supply_hz: f64) -> DefaultEfficiency {
    let fifty = is_50hz(supply_hz);
    let (rows, size): (Vec<(f64, f64, f64, f64)>, f64) = if fifty {
        (IE3_50HZ.to_vec(), rating_w / 1000.0)
    } else {
        (IE3_60HZ.to_vec(), rating_w / WATTS_PER_HP)
    };
    let column = |r: &(f64, f64, f64, f64)| match poles {
        0..=2 => r.1,
        3 | 4 => r.2,
        _ => r.3,
    };
    // The largest row not above the rating (ratings between rows take the lower row).
    let row = rows
        .iter()
        .rev()
        .find(|r| r.0 <= size * (1.0 + 1e-9))
        .unwrap_or(&rows[0]);
    let below = size < rows[0].0 * (1.0 - 1e-9);
    let (unit, at) = if fifty {
        ("kW", format!("{} kW", row.0))
    } else {
        ("hp", format!("{} hp", row.0))
    };
    let note = if below {
        format!(" (smallest tabulated rating, {} {unit}, used)", rows[0].0)
    } else {
        String::new()
    };
    DefaultEfficiency {
        efficiency: column(row) / 100.0,
        source: format!(
            "{CLASS} class value, IEC 60034-30-1{}, {} poles at {:.0} Hz, {at}{note} (recalled)",
            if fifty {
                ""
            } else {
                " (the 60 Hz values are NEMA Premium's, NEMA MG 1 Table 12-12, enclosed motors)"
            },
            poles.clamp(2, 6),
            if fifty { 50.0 } else { 60.0 }
        ),
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn poles_from_speed() {
        assert_eq!(poles(1780.0, 60.0), 4); // 1800 rpm synchronous
        assert_eq!(poles(1480.0, 50.0), 4); // 1500 rpm synchronous
        assert_eq!(poles(3550.0, 60.0), 2);
        assert_eq!(poles(980.0, 50.0), 6);
    }

    #[test]
    fn class_values() {
        // NEMA Premium 4-pole 7.5 hp is 91.7 % (NEMA MG 1 Table 12-12, from memory;
        // fluids 1.3 nema_high_full_closed_4p agrees).
        let e = default_efficiency(7.5 * WATTS_PER_HP, 4, 60.0);
        assert!((e.efficiency - 0.917).abs() < 1e-12, "{e:?}");
        // IE3 4-pole 75 kW at 50 Hz is 95.0 % (IEC 60034-30-1, from memory).
        let e = default_efficiency(75e3, 4, 50.0);
        assert!((e.efficiency - 0.950).abs() < 1e-12, "{e:?}");
        assert!(e.source.contains("IE3") && e.source.contains("50 Hz"));
        let e = default_efficiency(0.37e3, 4, 50.0);
        assert!(e.source.contains("smallest tabulated"));
        // The supply, not the rating series, selects the table: a 75 kW 4-pole motor
        // on 60 Hz reads the 100 hp row (74.6 kW is the largest row not above 75 kW),
        // 95.4 % (NEMA MG 1 Table 12-12, from memory), and a 100 hp (74.57 kW) motor on
        // 50 Hz reads the 55 kW row of the 50 Hz table (75 kW is above it), 94.6 %.
        let e = default_efficiency(75e3, 4, 60.0);
        assert!(
            (e.efficiency - 0.954).abs() < 1e-12 && e.source.contains("60 Hz"),
            "{e:?}"
        );
        let e = default_efficiency(100.0 * WATTS_PER_HP, 4, 50.0);
        assert!(
            (e.efficiency - 0.946).abs() < 1e-12 && e.source.contains("50 Hz"),
            "{e:?}"
        );
    }
}
