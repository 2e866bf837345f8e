"""Write units_pint.csv: the SI factor and offset of dutyline units according to pint.

Run from this folder:  python3 gen_units.py  (needs `pip install pint`).
Each row: dutyline unit text, SI factor, SI offset, the pint expression used, pint version.
The Rust test tests/units_conversions.rs reads the CSV and matches every factor to 1e-9.
"""

import csv
import os

import pint

ureg = pint.UnitRegistry()

# (dutyline unit, pint expression, SI unit to convert to in pint)
ROWS = [
    ("in", "inch", "meter"),
    ("ft", "foot", "meter"),
    ("yd", "yard", "meter"),
    ("mi", "mile", "meter"),
    ("km", "kilometer", "meter"),
    ("gal", "gallon", "meter**3"),
    ("L", "liter", "meter**3"),
    ("ft^3", "foot**3", "meter**3"),
    ("gpm", "gallon/minute", "meter**3/second"),
    ("MGD", "megagallon/day", "meter**3/second"),
    ("cfs", "foot**3/second", "meter**3/second"),
    ("m^3/h", "meter**3/hour", "meter**3/second"),
    ("L/min", "liter/minute", "meter**3/second"),
    ("lb", "pound", "kilogram"),
    ("t", "metric_ton", "kilogram"),
    ("lb/ft^3", "pound/foot**3", "kilogram/meter**3"),
    ("lbf", "force_pound", "newton"),
    ("lbf/ft^3", "force_pound/foot**3", "newton/meter**3"),
    ("psi", "psi", "pascal"),
    ("psig", "psi", "pascal"),
    ("lbf/in^2", "force_pound/inch**2", "pascal"),
    ("bar", "bar", "pascal"),
    ("atm", "atmosphere", "pascal"),
    ("in_Hg", "inch_Hg", "pascal"),
    ("mmHg", "millimeter_Hg", "pascal"),
    ("hp", "horsepower", "watt"),
    ("Btu", "Btu_it", "joule"),
    ("kWh", "kilowatt_hour", "joule"),
    ("cP", "centipoise", "pascal*second"),
    ("P", "poise", "pascal*second"),
    ("cSt", "centistokes", "meter**2/second"),
    ("St", "stokes", "meter**2/second"),
    ("kg/(m*s)", "kilogram/(meter*second)", "pascal*second"),
    ("min", "minute", "second"),
    ("day", "day", "second"),
    ("week", "week", "second"),
    ("year", "common_year", "second"),
    ("rpm", "revolution/minute", "revolution/second"),
    ("deg", "degree", "radian"),
    ("%", "percent", "dimensionless"),
    ("degC", "degC", "kelvin"),
    ("degF", "degF", "kelvin"),
    ("degR", "degR", "kelvin"),
    ("delta_degF", "delta_degF", "kelvin"),
    ("W/(m*degF)", "watt/(meter*delta_degF)", "watt/(meter*kelvin)"),
]


def factor_and_offset(expr, target):
    """SI factor and offset: SI = value * factor + offset."""
    zero = ureg.Quantity(0.0, expr).to(target).magnitude
    one = ureg.Quantity(1.0, expr).to(target).magnitude
    return one - zero, zero


def main():
    here = os.path.dirname(os.path.abspath(__file__))
    path = os.path.join(here, "units_pint.csv")
    with open(path, "w", newline="") as f:
        out = csv.writer(f, lineterminator="\n")
        out.writerow(["unit", "factor", "offset", "pint_expression", "pint_version"])
        for unit, expr, target in ROWS:
            factor, offset = factor_and_offset(expr, target)
            out.writerow([unit, repr(factor), repr(offset), expr, pint.__version__])
    print(f"wrote {len(ROWS)} rows to {path}")


if __name__ == "__main__":
    main()
