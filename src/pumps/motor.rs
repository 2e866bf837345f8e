//! Standard motor ratings and motor selection.
//!
//! Rating series (from memory, to be checked against the standards' tables):
//! - NEMA MG 1 (Motors and Generators), the horsepower ratings of fractional and
//!   integral-horsepower induction motors: 1/4, 1/3, 1/2, 3/4, 1, 1.5, 2, 3, 5, 7.5, 10,
//!   15, 20, 25, 30, 40, 50, 60, 75, 100, 125, 150, 200, 250, 300, 350, 400, 450, 500,
//!   600, 700, 800, 900, 1000 hp. Converted with 1 hp = 550 ft·lbf/s = 745.699 87 W
//!   (NIST SP 811, 2008, Appendix B; 1 ft = 0.3048 m, 1 lbf = 4.448 221 615 260 5 N).
//! - IEC 60072-1, the preferred rated outputs in kW: 0.06, 0.09, 0.12, 0.18, 0.25, 0.37,
//!   0.55, 0.75, 1.1, 1.5, 2.2, 3, 4, 5.5, 7.5, 11, 15, 18.5, 22, 30, 37, 45, 55, 75, 90,
//!   110, 132, 160, 200, 250, 315, 355, 400, 450, 500, 560, 630, 710, 800, 900, 1000 kW.
//!
//! Sizing rule (common practice, after NEMA MG 1 and IEC 60034-1): the nameplate rating,
//! without the service factor, covers the largest shaft power at every operating point.
//! The service factor is a margin for abnormal conditions and is reported only; makers
//! commonly void it on inverter supply (NEMA MG 1 Parts 30 and 31), so it is taken as
//! 1.0 on a variable-frequency drive. IEC 60034-1 rates continuous duty (S1) and defines
//! no service factor. Defaults ([`default_service_factor`]), common practice: 1.0 for
//! IEC motors, 1.15 for NEMA open drip-proof motors. No other sizing margin is applied.

use super::PumpError;

/// Which rating series to select from.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
pub enum MotorStandard {
    /// NEMA MG 1 horsepower ratings.
    Nema,
    /// IEC 60072-1 kW ratings.
    Iec,
}

/// One horsepower (550 ft·lbf/s) in watts: 550 × 0.3048 m × 4.4482216152605 N
/// (NIST SP 811, 2008, Appendix B).
pub const WATTS_PER_HP: f64 = 550.0 * 0.3048 * 4.448_221_615_260_5;

const NEMA_HP: [(f64, &str); 34] = [
    (0.25, "1/4 hp"),
    (1.0 / 3.0, "1/3 hp"),
    (0.5, "1/2 hp"),
    (0.75, "3/4 hp"),
    (1.0, "1 hp"),
    (1.5, "1.5 hp"),
    (2.0, "2 hp"),
    (3.0, "3 hp"),
    (5.0, "5 hp"),
    (7.5, "7.5 hp"),
    (10.0, "10 hp"),
    (15.0, "15 hp"),
    (20.0, "20 hp"),
    (25.0, "25 hp"),
    (30.0, "30 hp"),
    (40.0, "40 hp"),
    (50.0, "50 hp"),
    (60.0, "60 hp"),
    (75.0, "75 hp"),
    (100.0, "100 hp"),
    (125.0, "125 hp"),
    (150.0, "150 hp"),
    (200.0, "200 hp"),
    (250.0, "250 hp"),
    (300.0, "300 hp"),
    (350.0, "350 hp"),
    (400.0, "400 hp"),
    (450.0, "450 hp"),
    (500.0, "500 hp"),
    (600.0, "600 hp"),
    (700.0, "700 hp"),
    (800.0, "800 hp"),
    (900.0, "900 hp"),
    (1000.0, "1000 hp"),
];

const IEC_KW: [(f64, &str); 41] = [
    (0.06, "0.06 kW"),
    (0.09, "0.09 kW"),
    (0.12, "0.12 kW"),
    (0.18, "0.18 kW"),
    (0.25, "0.25 kW"),
    (0.37, "0.37 kW"),
    (0.55, "0.55 kW"),
    (0.75, "0.75 kW"),
    (1.1, "1.1 kW"),
    (1.5, "1.5 kW"),
    (2.2, "2.2 kW"),
    (3.0, "3 kW"),
    (4.0, "4 kW"),
    (5.5, "5.5 kW"),
    (7.5, "7.5 kW"),
    (11.0, "11 kW"),
    (15.0, "15 kW"),
    (18.5, "18.5 kW"),
    (22.0, "22 kW"),
    (30.0, "30 kW"),
    (37.0, "37 kW"),
    (45.0, "45 kW"),
    (55.0, "55 kW"),
    (75.0, "75 kW"),
    (90.0, "90 kW"),
    (110.0, "110 kW"),
    (132.0, "132 kW"),
    (160.0, "160 kW"),
    (200.0, "200 kW"),
    (250.0, "250 kW"),
    (315.0, "315 kW"),
    (355.0, "355 kW"),
    (400.0, "400 kW"),
    (450.0, "450 kW"),
    (500.0, "500 kW"),
    (560.0, "560 kW"),
    (630.0, "630 kW"),
    (710.0, "710 kW"),
    (800.0, "800 kW"),
    (900.0, "900 kW"),
    (1000.0, "1000 kW"),
];

/// (rating in W, label) pairs of a series, ascending.
fn series(std: MotorStandard) -> Vec<(f64, &'static str)> {
    match std {
        MotorStandard::Nema => NEMA_HP
            .iter()
            .map(|&(hp, l)| (hp * WATTS_PER_HP, l))
            .collect(),
        MotorStandard::Iec => IEC_KW.iter().map(|&(kw, l)| (kw * 1000.0, l)).collect(),
    }
}

/// Standard rated outputs of a series in W, ascending (see the module docs).
pub fn standard_ratings_w(std: MotorStandard) -> Vec<f64> {
    series(std).into_iter().map(|(w, _)| w).collect()
}

/// Service factor used when the design states none (common practice): 1.0 for IEC,
/// 1.15 for NEMA open drip-proof motors.
pub fn default_service_factor(std: MotorStandard) -> f64 {
    match std {
        MotorStandard::Nema => 1.15,
        MotorStandard::Iec => 1.0,
    }
}

/// The selected motor and how it is loaded.
#[derive(Clone, Debug, PartialEq)]
pub struct MotorChoice {
    /// Rating series.
    pub standard: MotorStandard,
    /// Nameplate rating, W.
    pub rating_w: f64,
    /// Nameplate rating as the series states it ("15 hp", "11 kW").
    pub rating_label: String,
    /// Service factor on the nameplate: reported as margin, never used for sizing.
    pub service_factor: f64,
    /// Largest shaft power over the operating points divided by the rating.
    pub loading_ratio: f64,
    /// Largest shaft power along the curve to run-out divided by the rating.
    pub runout_loading_ratio: f64,
    /// The largest operating shaft power is within the nameplate rating.
    pub within_nameplate: bool,
    /// The shaft power along the whole curve to run-out is within the nameplate rating.
    pub non_overloading: bool,
    /// Remarks: above nameplate at duty, overloading at run-out.
    pub warnings: Vec<String>,
}

/// Smallest standard rating whose nameplate (service factor not counted) carries
/// `runout_power_w`, the largest shaft power along the whole curve to its end: a
/// non-overloading motor, so that no credible operating point (one pump of a parallel set
/// alone, a low static head, a drained line refilling) loads it above its nameplate
/// (common practice in municipal and building-services specifications; ANSI/HI 1.3 and
/// HI guidance recalled). Where the run-out power is above the largest rating of the
/// series, the smallest rating carrying `max_shaft_power_w` (the largest shaft power at
/// every operating point) is taken and flagged as overloading. The service factor is
/// validated and reported only: NEMA MG 1 treats it as a margin for abnormal conditions,
/// and IEC 60034-1 rates continuous duty (S1) without one (sizing rule: common practice).
///
/// Comparisons allow a relative 1e-9 so that a power equal to a rating selects it.
/// Errors: non-finite or non-positive maximum power, negative run-out power, a service
/// factor outside 1.0–1.5 (NEMA MG 1 service factors lie in about 1.0–1.4, from
/// memory), and a power above the largest rating of the series.
pub fn select_motor(
    std: MotorStandard,
    max_shaft_power_w: f64,
    runout_power_w: f64,
    service_factor: f64,
) -> Result<MotorChoice, PumpError> {
    check_inputs(max_shaft_power_w, runout_power_w, service_factor)?;
    let ratings = series(std);
    let carrying = |power_w: f64| ratings.iter().find(|(w, _)| *w >= power_w * SLACK);
    let Some(&(rating_w, rating_label)) =
        carrying(runout_power_w.max(max_shaft_power_w)).or_else(|| carrying(max_shaft_power_w))
    else {
        let (largest, label) = ratings.last().copied().unwrap_or((0.0, "none"));
        return Err(PumpError::new(format!(
            "shaft power {:.1} kW exceeds the largest standard rating ({label}, {:.1} kW)",
            max_shaft_power_w / 1000.0,
            largest / 1000.0
        )));
    };
    Ok(assess(
        std,
        rating_w,
        rating_label.to_string(),
        max_shaft_power_w,
        runout_power_w,
        service_factor,
    ))
}

/// A motor of a stated nameplate rating (W) judged by the rule of [`select_motor`].
/// The label is the series' when the rating is a standard one.
pub fn motor_of_rating(
    std: MotorStandard,
    rating_w: f64,
    max_shaft_power_w: f64,
    runout_power_w: f64,
    service_factor: f64,
) -> Result<MotorChoice, PumpError> {
    check_inputs(max_shaft_power_w, runout_power_w, service_factor)?;
    super::require_positive("motor rating (W)", rating_w)?;
    let label = series(std)
        .iter()
        .find(|(w, _)| (w - rating_w).abs() <= 1e-6 * rating_w)
        .map(|(_, l)| l.to_string())
        .unwrap_or_else(|| match std {
            MotorStandard::Nema => format!("{:.3} hp", rating_w / WATTS_PER_HP),
            MotorStandard::Iec => format!("{:.3} kW", rating_w / 1000.0),
        });
    Ok(assess(
        std,
        rating_w,
        label,
        max_shaft_power_w,
        runout_power_w,
        service_factor,
    ))
}

/// Relative allowance so that a power equal to a rating is within it.
const SLACK: f64 = 1.0 - 1e-9;

fn check_inputs(max_w: f64, runout_w: f64, service_factor: f64) -> Result<(), PumpError> {
    super::require_positive("largest shaft power (W)", max_w)?;
    super::require_non_negative("run-out shaft power (W)", runout_w)?;
    if !(service_factor.is_finite() && (1.0..=1.5).contains(&service_factor)) {
        return Err(PumpError::new(format!(
            "service factor must lie between 1.0 and 1.5, got {service_factor}"
        )));
    }
    Ok(())
}

fn assess(
    std: MotorStandard,
    rating_w: f64,
    rating_label: String,
    max_w: f64,
    runout_w: f64,
    service_factor: f64,
) -> MotorChoice {
    let within_nameplate = max_w * SLACK <= rating_w;
    let non_overloading = runout_w * SLACK <= rating_w;
    let mut warnings = Vec::new();
    if !within_nameplate {
        warnings.push(format!(
            "the {rating_label} motor is loaded above its nameplate at duty: {:.1} % of rating",
            100.0 * max_w / rating_w
        ));
    }
    if !non_overloading {
        warnings.push(format!(
            "the {rating_label} motor is overloaded along the curve to run-out: {:.1} % of rating",
            100.0 * runout_w / rating_w
        ));
    }
    MotorChoice {
        standard: std,
        rating_w,
        rating_label,
        service_factor,
        loading_ratio: max_w / rating_w,
        runout_loading_ratio: runout_w / rating_w,
        within_nameplate,
        non_overloading,
        warnings,
    }
}
