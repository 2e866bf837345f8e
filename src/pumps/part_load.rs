//! Motor and drive efficiency away from full load.
//!
//! **Motor.** IEC 60034-30-1 (2014) classes give the efficiency at rated output only.
//! Below it, the ratio η(x)/η(1) at load fraction x = shaft power / nameplate rating
//! follows a published *typical* part-load curve: Washington State Energy Office,
//! *Energy-Efficient Electric Motor Selection Handbook* (1993), the figure of motor
//! part-load efficiency as a share of full-load efficiency, one curve per size class
//! (reproduced in U.S. DOE, *Determining Electric Motor Load and Efficiency*, Motor
//! Challenge fact sheet DOE/GO-10097-517, 1997, Figure 2). The ratios below are read at
//! eleven load fractions **from memory** of that figure and cross-checked against the
//! polynomial transcription of the same figure in the Python `fluids` package
//! (`tests/reference/gen_part_load.py`, within 0.015 at 12 loads and 7 ratings); linear
//! interpolation between them. Validity: 10 % to 100 % load (below 10 % the 10 % value
//! is used and flagged by the caller's motor-load check); above full load the ratio is 1.
//!
//! **Drive.** A variable-frequency drive's losses are modelled as losses, not a constant
//! efficiency: P_loss(x) = P_out · (1/η_d(x) − 1), with η_d(x) at output fraction
//! x = drive output / drive rating from U.S. DOE, *Adjustable Speed Drive Part-Load
//! Efficiency*, Motor Systems Tip Sheet #11 (2012), Table 1 (pulse-width-modulated
//! drives, 3 hp to 400 hp, loads 1.6 % to 100 %), **from memory**, cross-checked against
//! the table transcribed in `fluids` (every cell agrees). A stated full-load drive
//! efficiency scales the whole curve. IEC 61800-9-2 (2017) declares drive losses at
//! eight reference points of relative frequency and torque-producing current
//! ((0, 25), (0, 50), (0, 100), (50, 25), (50, 50), (50, 100), (90, 50), (90, 100) %);
//! [`iec_61800_9_2_points`] evaluates this model there so a reviewer can compare it with
//! a maker's declaration. For a centrifugal pump torque ∝ speed², so a pump at 50 %
//! speed loads its drive near the (50, 25) point.

use super::motor::WATTS_PER_HP;

/// Load fractions of the motor part-load table.
const MOTOR_LOADS: [f64; 11] = [
    0.10, 0.15, 0.20, 0.25, 0.30, 0.35, 0.40, 0.50, 0.60, 0.75, 1.00,
];

/// η(x)/η(1) per size class: (largest rating of the class in hp, ratios at
/// [`MOTOR_LOADS`]). WSEO handbook (1993) figure, from memory (see the module docs).
const MOTOR_RATIOS: [(f64, [f64; 11]); 6] = [
    (
        1.0,
        [
            0.370, 0.497, 0.597, 0.676, 0.737, 0.784, 0.820, 0.871, 0.905, 0.944, 1.0,
        ],
    ),
    (
        5.0,
        [
            0.401, 0.546, 0.664, 0.758, 0.832, 0.888, 0.930, 0.979, 0.998, 1.0, 1.0,
        ],
    ),
    (
        10.0,
        [
            0.544, 0.694, 0.798, 0.868, 0.912, 0.940, 0.956, 0.976, 0.996, 1.0, 1.0,
        ],
    ),
    (
        25.0,
        [
            0.673, 0.787, 0.865, 0.916, 0.947, 0.965, 0.975, 0.985, 0.997, 1.0, 1.0,
        ],
    ),
    (
        60.0,
        [
            0.770, 0.858, 0.916, 0.952, 0.972, 0.982, 0.986, 0.989, 0.998, 1.0, 1.0,
        ],
    ),
    (
        f64::INFINITY,
        [
            0.866, 0.921, 0.957, 0.980, 0.993, 0.998, 1.0, 1.0, 1.0, 1.0, 1.0,
        ],
    ),
];

/// Output fractions of the drive table.
const DRIVE_LOADS: [f64; 7] = [0.016, 0.125, 0.25, 0.42, 0.50, 0.75, 1.00];

/// Drive efficiency per rating (hp) at [`DRIVE_LOADS`]: DOE Tip Sheet #11 (2012),
/// Table 1, from memory (see the module docs).
const DRIVE_TABLE: [(f64, [f64; 7]); 11] = [
    (3.0, [0.31, 0.77, 0.86, 0.90, 0.91, 0.93, 0.94]),
    (5.0, [0.35, 0.80, 0.88, 0.91, 0.92, 0.94, 0.95]),
    (10.0, [0.41, 0.83, 0.90, 0.93, 0.94, 0.95, 0.96]),
    (20.0, [0.47, 0.86, 0.93, 0.94, 0.95, 0.96, 0.97]),
    (30.0, [0.50, 0.88, 0.93, 0.95, 0.95, 0.96, 0.97]),
    (50.0, [0.46, 0.86, 0.92, 0.95, 0.95, 0.96, 0.97]),
    (60.0, [0.51, 0.87, 0.92, 0.95, 0.95, 0.96, 0.97]),
    (75.0, [0.47, 0.86, 0.93, 0.95, 0.96, 0.97, 0.97]),
    (100.0, [0.55, 0.89, 0.94, 0.95, 0.96, 0.97, 0.97]),
    (200.0, [0.61, 0.91, 0.95, 0.96, 0.96, 0.97, 0.97]),
    (400.0, [0.61, 0.91, 0.95, 0.96, 0.96, 0.97, 0.97]),
];

/// Linear interpolation in a table with ascending `xs`, clamped at both ends.
fn interp(xs: &[f64], ys: &[f64], x: f64) -> f64 {
    let n = xs.len().min(ys.len());
    if n == 0 || !x.is_finite() {
        return ys.first().copied().unwrap_or(1.0);
    }
    if x <= xs[0] {
        return ys[0];
    }
    for i in 1..n {
        if x <= xs[i] {
            let t = (x - xs[i - 1]) / (xs[i] - xs[i - 1]);
            return ys[i - 1] + t * (ys[i] - ys[i - 1]);
        }
    }
    ys[n - 1]
}

/// Motor efficiency (fraction) at load fraction `load` from the design's own table of
/// (load fraction, efficiency) with ascending loads: linear between its points and
/// held at its first and last values beyond them.
pub fn motor_efficiency_from_table(table: &[(f64, f64)], load: f64) -> f64 {
    let xs: Vec<f64> = table.iter().map(|r| r.0).collect();
    let ys: Vec<f64> = table.iter().map(|r| r.1).collect();
    interp(&xs, &ys, load)
}

/// Motor efficiency at part load as a share of its full-load efficiency, η(x)/η(1),
/// for a motor of nameplate `rating_w` (W) at load fraction `load` (shaft power /
/// rating). WSEO handbook (1993) typical curve; 10 %–100 % load (clamped outside).
pub fn motor_part_load_ratio(rating_w: f64, load: f64) -> f64 {
    let hp = rating_w / WATTS_PER_HP;
    let row = MOTOR_RATIOS
        .iter()
        .find(|(max_hp, _)| hp <= *max_hp * (1.0 + 1e-9))
        .unwrap_or(&MOTOR_RATIOS[MOTOR_RATIOS.len() - 1]);
    interp(&MOTOR_LOADS, &row.1, load.clamp(0.0, 1.0))
}

/// Drive efficiency η_d at output fraction `load` (drive output / drive rating) for a
/// drive of `rating_w` (W): DOE Tip Sheet #11 Table 1, bilinear in load and rating
/// (ratings clamped to 3–400 hp, loads to 1.6 %–100 %).
pub fn drive_efficiency_table(rating_w: f64, load: f64) -> f64 {
    let hp = (rating_w / WATTS_PER_HP).clamp(3.0, 400.0);
    let ratings: Vec<f64> = DRIVE_TABLE.iter().map(|(r, _)| *r).collect();
    let at: Vec<f64> = DRIVE_TABLE
        .iter()
        .map(|(_, row)| interp(&DRIVE_LOADS, row, load.clamp(0.016, 1.0)))
        .collect();
    interp(&ratings, &at, hp)
}

/// A drive's losses against its output.
#[derive(Clone, Copy, Debug, PartialEq)]
pub struct DriveLosses {
    /// Drive rating (output), W.
    pub rating_w: f64,
    /// Full-load efficiency the curve is scaled to (fraction); the table's own
    /// full-load value when the design states none.
    pub full_load_efficiency: f64,
    /// Losses the design declares at the eight IEC 61800-9-2 points
    /// ([`IEC_61800_9_2_POINTS`] order), fraction of the rating; used instead of the
    /// DOE table when given.
    pub declared: Option<[f64; 8]>,
}

/// The IEC 61800-9-2 (2017) reference points, (relative speed %, relative torque %).
pub const IEC_61800_9_2_POINTS: [(f64, f64); 8] = [
    (0.0, 25.0),
    (0.0, 50.0),
    (0.0, 100.0),
    (50.0, 25.0),
    (50.0, 50.0),
    (50.0, 100.0),
    (90.0, 50.0),
    (90.0, 100.0),
];

/// Losses (fraction of the rating) from the eight declared IEC 61800-9-2 points at
/// `speed` and `torque` (fractions of rated). At each declared speed (0, 50, 90 %) the
/// loss is linear in torque between 25, 50 and 100 % (held below 25 % and above 100 %);
/// the (90, 25) point the standard does not declare is p(50, 25) + p(90, 50) − p(50,
/// 50) (dutyline's completion: the same speed step as at 50 % torque). Between speeds
/// the loss is linear, and above 90 % it continues the 50–90 % slope, held at 100 %.
pub fn declared_drive_loss(p: &[f64; 8], speed: f64, torque: f64) -> f64 {
    let torques = [0.25, 0.5, 1.0];
    let p90_25 = p[3] + p[6] - p[4];
    let rows = [[p[0], p[1], p[2]], [p[3], p[4], p[5]], [p90_25, p[6], p[7]]];
    let at: Vec<f64> = rows
        .iter()
        .map(|r| interp(&torques, r, torque.clamp(0.25, 1.0)))
        .collect();
    let s = speed.clamp(0.0, 1.0);
    let loss = if s <= 0.9 {
        interp(&[0.0, 0.5, 0.9], &at, s)
    } else {
        at[2] + (at[2] - at[1]) / 0.4 * (s - 0.9)
    };
    loss.max(0.0)
}

impl DriveLosses {
    /// A drive of `rating_w` (W), its curve scaled to `full_load_efficiency` when given.
    pub fn new(rating_w: f64, full_load_efficiency: Option<f64>) -> DriveLosses {
        DriveLosses {
            rating_w,
            full_load_efficiency: full_load_efficiency
                .unwrap_or_else(|| drive_efficiency_table(rating_w, 1.0)),
            declared: None,
        }
    }

    /// Losses at an output of `output_w` (W) with the motor at `speed` and `torque`
    /// (fractions of rated): the declared IEC 61800-9-2 losses when the design gives
    /// them, else [`DriveLosses::losses_w`], W.
    pub fn losses_at(&self, output_w: f64, speed: f64, torque: f64) -> f64 {
        match &self.declared {
            Some(p) if output_w > 0.0 => declared_drive_loss(p, speed, torque) * self.rating_w,
            Some(_) => 0.0,
            None => self.losses_w(output_w),
        }
    }

    /// Efficiency at output fraction `load`: the table's shape scaled to the stated
    /// full-load efficiency.
    pub fn efficiency(&self, load: f64) -> f64 {
        let shape = drive_efficiency_table(self.rating_w, load)
            / drive_efficiency_table(self.rating_w, 1.0);
        (self.full_load_efficiency * shape).clamp(0.05, 1.0)
    }

    /// Losses at an output of `output_w` (W): P_out · (1/η_d − 1), W.
    pub fn losses_w(&self, output_w: f64) -> f64 {
        if output_w <= 0.0 || self.rating_w <= 0.0 {
            return 0.0;
        }
        let eta = self.efficiency(output_w / self.rating_w);
        output_w * (1.0 / eta - 1.0)
    }
}

/// The eight IEC 61800-9-2 (2017) reference points (relative frequency %, relative
/// torque-producing current %) with this model's losses there as a share of the
/// drive rating, taking output power ∝ frequency × torque (so the 0 % frequency
/// points carry the table's lowest-load losses).
pub fn iec_61800_9_2_points(d: &DriveLosses) -> [(f64, f64, f64); 8] {
    IEC_61800_9_2_POINTS.map(|(f, t)| {
        let x = (f / 100.0 * t / 100.0).max(DRIVE_LOADS[0]);
        let loss = d.losses_w(x * d.rating_w) / d.rating_w;
        (f, t, loss)
    })
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn full_load_is_the_class_value() {
        for r in [750.0, 7500.0, 75_000.0] {
            assert!((motor_part_load_ratio(r, 1.0) - 1.0).abs() < 1e-12);
        }
        // Small motors lose more at light load than large ones (WSEO 1993 figure).
        assert!(motor_part_load_ratio(2_000.0, 0.25) < motor_part_load_ratio(90_000.0, 0.25));
    }

    #[test]
    fn declared_drive_losses_by_hand() {
        // Declared (fractions of rating) at (0,25) (0,50) (0,100) (50,25) (50,50)
        // (50,100) (90,50) (90,100): 0.010 0.012 0.018 0.014 0.017 0.024 0.022 0.030.
        let p = [0.010, 0.012, 0.018, 0.014, 0.017, 0.024, 0.022, 0.030];
        // On a declared point the loss is that value.
        assert!((declared_drive_loss(&p, 0.5, 0.5) - 0.017).abs() < 1e-12);
        assert!((declared_drive_loss(&p, 0.9, 1.0) - 0.030).abs() < 1e-12);
        // (90, 25) completed: 0.014 + 0.022 − 0.017 = 0.019.
        assert!((declared_drive_loss(&p, 0.9, 0.25) - 0.019).abs() < 1e-12);
        // (70, 75): at 50 % speed 0.017 + (0.024 − 0.017)/2 = 0.0205; at 90 % 0.022 +
        // 0.004 = 0.026; halfway between: 0.02325.
        assert!((declared_drive_loss(&p, 0.7, 0.75) - 0.02325).abs() < 1e-12);
        // Full speed and torque: 0.030 + (0.030 − 0.024)/0.4 × 0.1 = 0.0315.
        assert!((declared_drive_loss(&p, 1.0, 1.0) - 0.0315).abs() < 1e-12);
        let mut d = DriveLosses::new(10_000.0, None);
        d.declared = Some(p);
        assert!((d.losses_at(5_000.0, 0.5, 0.5) - 170.0).abs() < 1e-9);
        // A motor table: 90 % at 25 % load, 94 % at 100 %: 92 % at 62.5 % load.
        let t = [(0.25, 0.90), (1.0, 0.94)];
        assert!((motor_efficiency_from_table(&t, 0.625) - 0.92).abs() < 1e-12);
        assert!((motor_efficiency_from_table(&t, 0.1) - 0.90).abs() < 1e-12);
    }

    #[test]
    fn drive_losses_grow_with_output() {
        let d = DriveLosses::new(75_000.0, Some(0.97));
        assert!((d.efficiency(1.0) - 0.97).abs() < 1e-12);
        assert!(d.losses_w(20_000.0) < d.losses_w(60_000.0));
        // DOE Tip Sheet #11, 100 hp at 25 % load: 0.94 (from memory).
        assert!((drive_efficiency_table(100.0 * WATTS_PER_HP, 0.25) - 0.94).abs() < 1e-9);
    }
}
