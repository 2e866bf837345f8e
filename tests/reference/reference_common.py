"""Shared pieces of the independent reference generators (gen_well.py, gen_station.py).

Constants with their sources, water properties through the iapws package and the
Darcy-Weisbach pipe loss with the Colebrook friction factor of the fluids package, so
that each generator states its design and nothing else. No dutyline code is used.
"""
import math

from fluids.friction import Colebrook
from iapws import IAPWS97

G = 9.80665  # standard gravity, m/s^2 (CGPM 1901)
FT = 0.3048  # international foot, m (NIST SP 811, B.8)
INCH = 0.0254  # inch, m (NIST SP 811, B.8)
GPM = 3.785411784e-3 / 60.0  # US gallon per minute, m^3/s (NIST SP 811, B.8)
M3H = 1.0 / 3600.0  # m^3/h, m^3/s
P_BARO = 101325.0  # sea-level pressure, Pa (U.S. Standard Atmosphere 1976)
ROUGH_STEEL = 0.00015 * FT  # new commercial steel, m (Moody 1944, Trans. ASME 66, Fig. 2)


def water(t_k, p_pa=P_BARO):
    """(density kg/m^3, viscosity Pa s, vapour pressure Pa) of water at t_k and p_pa:
    IAPWS-IF97 and IAPWS 2008 through iapws."""
    state = IAPWS97(T=t_k, P=p_pa / 1e6)
    return state.rho, state.mu, IAPWS97(T=t_k, x=0).P * 1e6


def pipe_loss(q, d, length, k, rho, mu, roughness=ROUGH_STEEL):
    """Head loss of q m^3/s through length m of bore d m with K velocity heads, m:
    Darcy-Weisbach, friction factor by Colebrook (1939)."""
    v = q / (math.pi * d * d / 4.0)
    f = Colebrook(rho * v * d / mu, roughness / d)
    return (f * length / d + k) * v * v / (2.0 * G)
