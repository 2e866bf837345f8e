//! Life-cycle cost after Hydraulic Institute and Europump, *Pump Life Cycle Costs: A
//! Guide to LCC Analysis for Pumping Systems* (2001), its cost elements and present
//! value:
//!
//! LCC = C_ic + C_in + C_e + C_o + C_m + C_s + C_env + C_d,
//!
//! with initial (ic), installation and commissioning (in), energy (e), operation (o),
//! maintenance and repair (m), downtime (s), environmental (env) and decommissioning /
//! disposal (d). Yearly amounts A (stated at today's prices, paid at the end of each
//! year n = 1..N) are brought to present value at discount rate i with growth g:
//! PV = A · Σ ((1+g)/(1+i))ⁿ = A · P/A(i, g, N) (`pumps::present_worth_factor`);
//! disposal at year N: PV = C_d · (1+g)ᴺ/(1+i)ᴺ. Energy grows at the stated energy
//! escalation. Under **real** rates (default) the other costs stay in today's money
//! (g = 0); under **nominal** rates they grow with the stated general inflation, and
//! the discount and escalation rates must be nominal too: the two are never mixed.

use crate::model::operation::{CostElements, RateBasis};
use crate::model::Design;
use crate::pumps::present_worth_factor;

/// One candidate's life-cycle cost, present values in the design's currency.
#[derive(Clone, Debug, PartialEq)]
pub struct LifeCycleCost {
    /// Initial cost C_ic (paid now, not discounted), currency.
    pub initial: f64,
    /// Installation and commissioning cost C_in (paid now, not discounted), currency.
    pub installation: f64,
    /// Present value of the energy cost C_e over the life, currency.
    pub energy: f64,
    /// Present value of the operation cost C_o over the life, currency.
    pub operation: f64,
    /// Present value of the maintenance and repair cost C_m over the life, currency.
    pub maintenance: f64,
    /// Present value of the downtime cost C_s over the life, currency.
    pub downtime: f64,
    /// Present value of the environmental cost C_env over the life, currency.
    pub environmental: f64,
    /// Present value of the decommissioning and disposal cost C_d at the end of the life, currency.
    pub disposal: f64,
    /// The sum, currency.
    pub total: f64,
    /// P/A factor applied to the yearly energy cost and to the other yearly costs.
    pub energy_factor: f64,
    /// P/A factor applied to the other yearly costs (dimensionless).
    pub recurring_factor: f64,
    /// The life, years, and the rates (fractions).
    pub years: f64,
    /// Discount rate i, fraction per year.
    pub discount_rate: f64,
    /// Energy price escalation, fraction per year.
    pub escalation: f64,
    /// Growth applied to the other yearly costs, fraction per year (0 under real rates).
    pub inflation: f64,
    /// Whether the rates are real or nominal.
    pub rates: RateBasis,
    /// Whether the design stated any cost element for this candidate.
    pub elements_stated: bool,
}

/// The LCC of a candidate with yearly energy cost `energy_cost` (currency per year)
/// and its stated elements (`None`: energy alone). `None` when the design gives no
/// life in years or the rates are invalid.
pub fn life_cycle_cost(
    design: &Design,
    energy_cost: f64,
    elements: Option<&CostElements>,
) -> Option<LifeCycleCost> {
    let e = &design.energy;
    if e.years.is_nan() || e.years <= 0.0 || !energy_cost.is_finite() {
        return None;
    }
    let growth = match e.rates {
        RateBasis::Real => 0.0,
        RateBasis::Nominal => e.inflation,
    };
    let energy_factor = present_worth_factor(e.discount_rate, e.escalation, e.years).ok()?;
    let recurring_factor = present_worth_factor(e.discount_rate, growth, e.years).ok()?;
    let end_factor = ((1.0 + growth) / (1.0 + e.discount_rate)).powf(e.years);
    let c = elements.cloned().unwrap_or_default();
    let mut l = LifeCycleCost {
        initial: c.initial,
        installation: c.installation,
        energy: energy_cost * energy_factor,
        operation: c.operation * recurring_factor,
        maintenance: c.maintenance * recurring_factor,
        downtime: c.downtime * recurring_factor,
        environmental: c.environmental * recurring_factor,
        disposal: c.disposal * end_factor,
        total: 0.0,
        energy_factor,
        recurring_factor,
        years: e.years,
        discount_rate: e.discount_rate,
        escalation: e.escalation,
        inflation: growth,
        rates: e.rates,
        elements_stated: elements.is_some(),
    };
    l.total = l.initial
        + l.installation
        + l.energy
        + l.operation
        + l.maintenance
        + l.downtime
        + l.environmental
        + l.disposal;
    l.total.is_finite().then_some(l)
}
