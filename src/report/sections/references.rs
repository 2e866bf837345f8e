//! The references chapter: the publications the calculation relies on.

use crate::report::layout::document::Block;

/// The references chapter.
pub(super) fn chapter(blocks: &mut Vec<Block>) {
    blocks.push(Block::heading(1, "References"));
    for r in [
        "IAPWS R7-97(2012), Revised Release on the IAPWS Industrial Formulation 1997 for the Thermodynamic Properties of Water and Steam (IAPWS-IF97).",
        "IAPWS R12-08(2008), Release on the IAPWS Formulation 2008 for the Viscosity of Ordinary Water Substance.",
        "U.S. Standard Atmosphere, 1976. NOAA, NASA, USAF, Washington D.C.; ISO 2533:1975 Standard Atmosphere.",
        "Colebrook, C.F. (1939), Turbulent flow in pipes, with particular reference to the transition region between the smooth and rough pipe laws. J. Inst. Civil Eng. 11, 133–156.",
        "Churchill, S.W. (1977), Friction-factor equation spans all fluid-flow regimes. Chemical Engineering 84(24), 91–92.",
        "Moody, L.F. (1944), Friction factors for pipe flow. Trans. ASME 66, 671–684.",
        "Williams, G.S. and Hazen, A. (1920), Hydraulic Tables, 3rd ed. Wiley, New York.",
        "Hooper, W.B. (1981), The two-K method predicts head losses in pipe fittings. Chemical Engineering, 24 August 1981, 96–100.",
        "Darby, R. (1999), Correlate pressure drops through fittings. Chemical Engineering 106(7), July 1999, 101–104.",
        "Crane Co. (2009), Flow of Fluids through Valves, Fittings and Pipe, Technical Paper No. 410.",
        "ASME B36.10M and B36.19M, Welded and Seamless Wrought Steel Pipe; Stainless Steel Pipe. ASTM D1785 (PVC pipe), ASTM B88 (copper tube), AWWA C151/A21.51 (ductile iron pipe), ASTM F714 (PE pipe).",
        "Fritsch, F.N. and Carlson, R.E. (1980), Monotone piecewise cubic interpolation. SIAM J. Numer. Anal. 17(2), 238–246.",
        "Brent, R.P. (1973), Algorithms for Minimization without Derivatives. Prentice-Hall, ch. 4.",
        "ANSI/HI 9.6.1, Rotodynamic Pumps Guideline for NPSH Margin; ANSI/HI 9.6.3, Rotodynamic Pumps Guideline for Allowable Operating Region. Hydraulic Institute.",
        "NEMA MG 1, Motors and Generators; IEC 60072-1, Dimensions and output series for rotating electrical machines.",
        "Hydraulic Institute and Europump (2001), Pump Life Cycle Costs: A Guide to LCC Analysis for Pumping Systems.",
        "NIST Special Publication 811 (2008), Guide for the Use of the International System of Units, Appendix B.",
    ] {
        blocks.push(Block::text(r));
    }
}
