//! The method chapter: the equations and correlations the analysis uses, with their sources.

use crate::model::Design;
use crate::report::layout::document::Block;

/// The method chapter.
pub(super) fn chapter(blocks: &mut Vec<Block>, design: &Design) {
    blocks.push(Block::heading(1, "Method"));
    let paras = [
        "Energy equation between the two free surfaces: the head the pump must add is H(Q) = (z₂ − z₁) + (p₂ − p₁)/(ρ·g) + Σ h_f + Σ h_m, with free-surface velocities negligible, z the surface levels, p the absolute surface pressures and g = 9.80665 m/s².",
        "Wall friction by Darcy-Weisbach, h_f = f·(L/D)·v²/(2g). The friction factor is 64/Re for Re ≤ 2000 (laminar), Colebrook-White (1939) solved to 10⁻¹³ relative for Re ≥ 4000, and in the transition 2000 < Re < 4000 the Churchill (1977) equation scaled to meet both limits (a warning marks operation there). Segments given a Hazen-Williams C use h_f = 10.67·L·Q^1.852/(C^1.852·D^4.8704) (SI form), valid for water near ordinary temperatures.",
        "Minor losses h_m = K·v²/(2g) on the velocity of the segment that carries the fitting. K comes from the Darby (1999) 3-K or Hooper (1981) 2-K methods where those papers give constants (K depends on Reynolds number and size), from Borda-Carnot and the Crane TP-410 formulas for expansions and contractions, or is given in the design with its reason. Equivalent lengths are converted with the segment's friction factor.",
        "Pump curves: published head, efficiency, NPSHr and power points are fitted by least squares (quadratic or cubic), or by the Fritsch-Carlson (1980) monotone cubic where a polynomial would not keep head falling with flow; residuals are reported per curve. The best efficiency point is the maximum of the efficiency fit.",
        "Affinity laws: at speed ratio r, Q ∝ r, H ∝ r², P ∝ r³, efficiency unchanged; NPSHr ∝ r² (common practice). Impeller trim uses the constant-width trim law (Q ∝ D, H ∝ D², P ∝ D³), an approximation to be confirmed by the manufacturer. Identical pumps in parallel share the flow (H(Q/n)); in series they add head (n·H(Q)).",
        "Duty point: the largest-flow crossing of pump (or arrangement) head and system head, found by a 200-interval scan and Brent's (1973) method to 10⁻¹⁰ relative. Variable-speed pumps are set to the speed that meets the case's flow requirement.",
        "NPSH available = p_abs,surface/(ρg) + (z_surface − z_centreline) − h_suction losses − p_vapour/(ρg) (ANSI/HI 9.6.1). Power: hydraulic ρ·g·Q·H, shaft = hydraulic / η_pump, input = shaft / (η_motor·η_drive). Energy per year = input power × hours of each case; life-cycle energy cost as the present worth of a uniform series, discounted at the stated rate with escalation (Hydraulic Institute and Europump, Pump Life Cycle Costs, 2001).",
        "Viscous liquids: for a liquid other than water the pump-performance viscosity parameter B of ANSI/HI 9.6.7 is computed at each duty; above B = 1 a warning asks for the viscosity correction of head, flow and efficiency, which this calculation does not apply to the published water curves.",
    ];
    for p in paras {
        blocks.push(Block::text(p));
    }
    let _ = design;
}
