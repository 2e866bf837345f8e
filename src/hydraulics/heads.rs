//! Pressures and heights that must not be mixed: absolute against gauge pressure, and a
//! head of fluid against an elevation on the design's datum. Adding a gauge surface
//! pressure where NPSH needs the absolute one, or a level where a head is meant, is the
//! classic NPSH error (ANSI/HI 9.6.1; Karassik et al., *Pump Handbook*, 4th ed., ch. 2:
//! NPSHa = p_abs/(ρg) + z_s − h_loss − p_v/(ρg)). Each type is one SI `f64`; the
//! conversions between them are the only arithmetic they offer, so the engine states
//! which reference a pressure has and converts at the edges (`pa()`, `m()`).

use std::ops::{Add, Neg, Sub};

/// Standard acceleration of gravity, 9.80665 m/s² (CGPM 1901; NIST SP 330).
pub const G: f64 = 9.80665;

/// Specific weight ρg of a liquid, N/m³: turns a pressure into a head (p/(ρg)).
#[derive(Clone, Copy, Debug, PartialEq, PartialOrd)]
pub struct SpecificWeight(f64);

impl SpecificWeight {
    /// ρ·g for a density ρ (kg/m³) under standard gravity [`G`].
    pub fn of_density(density_kg_m3: f64) -> SpecificWeight {
        SpecificWeight(density_kg_m3 * G)
    }
}

/// A pressure above absolute zero (vacuum), Pa.
#[derive(Clone, Copy, Debug, PartialEq, PartialOrd)]
pub struct AbsolutePressure(f64);

/// A pressure above the local barometric pressure, Pa (negative for a vacuum).
#[derive(Clone, Copy, Debug, PartialEq, PartialOrd)]
pub struct GaugePressure(f64);

/// The difference of two pressures of the same reference, Pa.
#[derive(Clone, Copy, Debug, PartialEq, PartialOrd)]
pub struct PressureDifference(f64);

/// A height on the design's datum (a level, a centreline, a pipe station), m.
#[derive(Clone, Copy, Debug, PartialEq, PartialOrd)]
pub struct Elevation(f64);

/// A head of fluid, m: energy per unit weight (a pressure head, a height difference,
/// a loss, NPSH).
#[derive(Clone, Copy, Debug, Default, PartialEq, PartialOrd)]
pub struct Head(f64);

impl AbsolutePressure {
    /// An absolute pressure of `pa` Pa.
    pub fn new(pa: f64) -> AbsolutePressure {
        AbsolutePressure(pa)
    }
    /// The value, Pa (absolute).
    pub fn pa(self) -> f64 {
        self.0
    }
    /// The same pressure above `barometric`: p − p_baro.
    pub fn gauge(self, barometric: AbsolutePressure) -> GaugePressure {
        GaugePressure(self.0 - barometric.0)
    }
    /// The absolute pressure head p/(ρg), m.
    pub fn head(self, w: SpecificWeight) -> Head {
        Head(self.0 / w.0)
    }
    /// True above absolute zero (a vacuum cannot go below it).
    pub fn is_above_vacuum(self) -> bool {
        self.0 > 0.0
    }
}

impl Sub for AbsolutePressure {
    type Output = PressureDifference;
    fn sub(self, other: AbsolutePressure) -> PressureDifference {
        PressureDifference(self.0 - other.0)
    }
}

impl GaugePressure {
    /// A gauge pressure of `pa` Pa.
    pub fn new(pa: f64) -> GaugePressure {
        GaugePressure(pa)
    }
    /// The value, Pa (gauge).
    pub fn pa(self) -> f64 {
        self.0
    }
    /// The same pressure above absolute zero: p_baro + p_g.
    pub fn absolute(self, barometric: AbsolutePressure) -> AbsolutePressure {
        AbsolutePressure(barometric.0 + self.0)
    }
    /// The gauge pressure head p_g/(ρg), m.
    pub fn head(self, w: SpecificWeight) -> Head {
        Head(self.0 / w.0)
    }
}

impl Add<PressureDifference> for GaugePressure {
    type Output = GaugePressure;
    fn add(self, d: PressureDifference) -> GaugePressure {
        GaugePressure(self.0 + d.0)
    }
}

impl PressureDifference {
    /// The value, Pa.
    pub fn pa(self) -> f64 {
        self.0
    }
    /// The difference as a head Δp/(ρg), m.
    pub fn head(self, w: SpecificWeight) -> Head {
        Head(self.0 / w.0)
    }
}

impl Elevation {
    /// An elevation of `m` metres on the datum.
    pub fn new(m: f64) -> Elevation {
        Elevation(m)
    }
    /// The value, m on the datum.
    pub fn m(self) -> f64 {
        self.0
    }
    /// The height of this elevation above `datum` as a head, m (negative below it).
    pub fn above(self, datum: Elevation) -> Head {
        Head(self.0 - datum.0)
    }
    /// The elevation a head `h` above this one: a grade line is an elevation plus a
    /// pressure head.
    pub fn raised(self, h: Head) -> Elevation {
        Elevation(self.0 + h.0)
    }
    /// The elevation a head `h` below this one (a well's pumping level is its static
    /// level lowered by the drawdown).
    pub fn lowered(self, h: Head) -> Elevation {
        Elevation(self.0 - h.0)
    }
}

impl Head {
    /// A head of `m` metres of fluid.
    pub fn new(m: f64) -> Head {
        Head(m)
    }
    /// The value, m of fluid.
    pub fn m(self) -> f64 {
        self.0
    }
    /// The pressure of this column of fluid ρg·h, Pa.
    pub fn pressure(self, w: SpecificWeight) -> PressureDifference {
        PressureDifference(w.0 * self.0)
    }
}

impl Add for Head {
    type Output = Head;
    fn add(self, other: Head) -> Head {
        Head(self.0 + other.0)
    }
}

impl Sub for Head {
    type Output = Head;
    fn sub(self, other: Head) -> Head {
        Head(self.0 - other.0)
    }
}

impl Neg for Head {
    type Output = Head;
    fn neg(self) -> Head {
        Head(-self.0)
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    /// Absolute zero is the bound (a perfect vacuum is not "above" it); a gauge
    /// pressure keeps its value and its sign (mutation survivors of the NPSH run).
    #[test]
    fn absolute_zero_and_gauge_values() {
        assert!(!AbsolutePressure::new(0.0).is_above_vacuum());
        assert!(!AbsolutePressure::new(-1.0).is_above_vacuum());
        assert!(AbsolutePressure::new(1e-6).is_above_vacuum());
        // −80 kPa(g) at 101 325 Pa is 21 325 Pa absolute; its gauge value is −80 000 Pa.
        let g = GaugePressure::new(-80_000.0);
        assert_eq!(g.pa(), -80_000.0);
        assert_eq!(g.absolute(AbsolutePressure::new(101_325.0)).pa(), 21_325.0);
        // A difference of two absolute pressures, added to a gauge pressure: 300 − 100
        // = 200 kPa, and −80 + 200 = 120 kPa(g).
        let d = AbsolutePressure::new(300_000.0) - AbsolutePressure::new(100_000.0);
        assert_eq!(d.pa(), 200_000.0);
        assert_eq!((g + d).pa(), 120_000.0);
    }

    #[test]
    fn gauge_and_absolute_differ_by_the_barometric_pressure() {
        // A 50 kPa(g) tank under the standard atmosphere (101 325 Pa, U.S. Standard
        // Atmosphere 1976) is at 151 325 Pa absolute, and back again.
        let baro = AbsolutePressure::new(101_325.0);
        let p = GaugePressure::new(50_000.0).absolute(baro);
        assert_eq!(p.pa(), 151_325.0);
        assert_eq!(p.gauge(baro).pa(), 50_000.0);
        // A 101 325 Pa vacuum at sea level reaches absolute zero, and no further.
        assert!(!GaugePressure::new(-101_325.0)
            .absolute(baro)
            .is_above_vacuum());
        assert!(GaugePressure::new(-101_000.0)
            .absolute(baro)
            .is_above_vacuum());
    }

    #[test]
    fn one_atmosphere_is_about_ten_metres_of_cold_water() {
        // 101 325 Pa / (999.97 kg/m³ × 9.80665 m/s²) = 10.3326 m (water at 4 °C,
        // density from IAPWS-95 tables, from memory: 999.97 kg/m³).
        let w = SpecificWeight::of_density(999.97);
        let h = AbsolutePressure::new(101_325.0).head(w).m();
        assert!((h - 10.3326).abs() < 1e-4, "{h}");
        assert!((Head::new(h).pressure(w).pa() - 101_325.0).abs() < 1e-6);
    }

    #[test]
    fn a_level_above_the_pump_is_a_positive_suction_head() {
        let centreline = Elevation::new(100.0);
        assert_eq!(Elevation::new(103.5).above(centreline).m(), 3.5);
        assert_eq!(Elevation::new(96.0).above(centreline).m(), -4.0);
        assert_eq!(centreline.raised(Head::new(2.5)).m(), 102.5);
        assert_eq!(centreline.lowered(Head::new(2.5)).m(), 97.5);
    }

    #[test]
    fn heads_add_subtract_and_negate_and_pressures_turn_into_heads() {
        // 3 m + 1.5 m, 3 m − 1.5 m, −3 m: plain arithmetic on metres of liquid.
        let (a, b) = (Head::new(3.0), Head::new(1.5));
        assert_eq!((a + b).m(), 4.5);
        assert_eq!((a - b).m(), 1.5);
        assert_eq!((-a).m(), -3.0);
        // 19 613.3 Pa under 1000 kg/m³ × 9.80665 m/s² is exactly 2 m, gauge or as a
        // difference; a negative gauge pressure is a negative head.
        let w = SpecificWeight::of_density(1000.0);
        assert!((GaugePressure::new(19_613.3).head(w).m() - 2.0).abs() < 1e-12);
        assert!((GaugePressure::new(-19_613.3).head(w).m() + 2.0).abs() < 1e-12);
        let d = AbsolutePressure::new(119_613.3) - AbsolutePressure::new(100_000.0);
        assert!((d.head(w).m() - 2.0).abs() < 1e-9);
        assert!((Head::new(2.0).pressure(w).pa() - 19_613.3).abs() < 1e-9);
    }
}
