//! # Units and dimensions
//!
//! Every physical number in a design file carries a unit, written right after the number:
//! `40 ft`, `260 gpm`, `0.14 USD/kWh`, `58 degF`, `35 psig`. The unit is parsed to an SI
//! factor, an offset (temperature scales only) and a dimension; the value becomes a
//! [`Quantity`] in SI (m, kg, s, K, Pa, m³/s, W). Counts and ratios may be bare numbers;
//! percentages take `%`.
//!
//! ## Writing a unit
//!
//! | form | example | meaning |
//! |---|---|---|
//! | name | `ft`, `gpm`, `kPa(g)` | one unit of the table below (names are case-sensitive) |
//! | product | `N*m`, `Pa·s` | `*`, `·` or `⋅` |
//! | quotient | `m^3/h`, `kg/m/s` | `/`, left to right: `a/b/c` = `a/(b*c)` |
//! | power | `m^3`, `s^-1`, `s^(-1)`, `m²`, `s⁻¹` | integer exponents from −9 to 9, not 0 |
//! | parentheses | `kg/(m*s)`, `W/(m*delta_K)` | grouping, nested at most 16 deep |
//! | reciprocal | `1/s`, `1/min` | a number is allowed only as this leading `1` |
//!
//! No spaces inside a unit (`m^3/h`, not `m^3 / h`). A `*` after a `/` is rejected as
//! ambiguous: write `kg/(m*s)` or `kg*s/m`. A digit glued to a name (`ft3`) is an unknown
//! unit with the hint `ft^3`. Every error carries the byte range of the offending part of
//! the unit and, for an unknown name, up to three known names close to it (edit distance,
//! ignoring case): `gmp/ft` points at `gmp` and suggests `gpm`.
//!
//! ## Unit names
//!
//! SI values are exact unless marked ≈. Sources: NIST Special Publication 811 (2008),
//! Appendix B.8 (B8); the SI Brochure, 9th edition (SI); otherwise a definition.
//!
//! | dimension | names |
//! |---|---|
//! | length (also head) | `m`, `mm`, `cm`, `km`, `in` 0.0254 m, `ft` 0.3048 m, `yd` 0.9144 m, `mi` 1609.344 m |
//! | volume | `L` 1e-3 m³, `mL`, `gal` (US) 3.785411784e-3 m³; `m^3`, `ft^3`, `in^3` by powers |
//! | volume flow | `gpm` = gal/min, `MGD` = 1e6 gal/day, `cfs` = ft³/s; `m^3/s`, `m^3/h`, `L/s`, `L/min`, `ft^3/s` by compounds |
//! | mass | `kg`, `g`, `t` (tonne) 1000 kg, `lb` = `lbm` 0.45359237 kg |
//! | time | `s`, `min`, `h` = `hr`, `day`, `week`, `year` = `yr` (365 days) |
//! | frequency, rotational speed | `Hz`, `rps`, `rpm` = 1/60 s⁻¹, `1/s` |
//! | temperature | `K`, `degC` = `°C`, `degF` = `°F`, `degR`; differences `delta_K`, `delta_degC`, `delta_degF`, `delta_degR` |
//! | force | `N`, `kN`, `lbf` = lb × 9.80665 m/s² (≈ 4.448222 N) |
//! | pressure, no reference | `Pa`, `kPa`, `MPa`, `bar`, `psi` = lbf/in² (≈ 6894.757 Pa), `atm` 101325 Pa, `in_Hg` = `inHg` (≈ 3386.389 Pa), `mmHg` (≈ 133.3224 Pa) |
//! | pressure, gauge | `psig`, `Pa(g)`, `kPa(g)`, `MPa(g)`, `bar(g)` = `barg` |
//! | pressure, absolute | `psia`, `Pa(a)`, `kPa(a)`, `MPa(a)`, `bar(a)` = `bara` |
//! | power | `W`, `kW`, `MW`, `hp` = 550 ft·lbf/s (≈ 745.6999 W) |
//! | energy | `J`, `kJ`, `MJ`, `Wh`, `kWh`, `MWh`, `Btu` (IT) 1055.05585262 J |
//! | dynamic viscosity | `P` 0.1 Pa·s, `cP` 1e-3 Pa·s; `Pa*s`, `kg/(m*s)` by compounds |
//! | kinematic viscosity | `St` 1e-4 m²/s, `cSt` 1e-6 m²/s; `m^2/s` by compound |
//! | density, specific weight | `kg/m^3`, `lb/ft^3`, `N/m^3`, `lbf/ft^3` by compounds |
//! | money | `USD`, `EUR`, `GBP`, `CAD`, `AUD`, `cu` (currency-neutral); prices `USD/kWh`, `cu/MWh` |
//! | dimensionless | `%` = 0.01, `deg` (angle) = π/180, `rad` = 1 |
//!
//! [`registry`] lists every name with its factor, dimension, source and a note.
//! Inch and millimetre of mercury are the conventional units (mercury at 13 595.1 kg/m³
//! under standard gravity, as B8 "conventional"); B8 gives 3386.38 Pa for mercury at 32 °F.
//! Head is a length: write `m` or `ft`. The consumer turns head into pressure with the
//! fluid's specific weight.
//!
//! ## Temperatures: points and differences
//!
//! A temperature scale standing alone (`degC`, `°C`, `degF`, `°F`, `K`, `degR`) makes the
//! number a **temperature point**: `68 degF` is 293.15 K (K = (°F + 459.67)/1.8). A
//! temperature **difference** is spelled with `delta_`: `5 delta_degC`, `9 delta_degF`.
//! Inside a compound unit a scale name is a degree size, not a point, and has no offset:
//! `0.6 W/(m*degC)` is 0.6 W/(m·K). The arithmetic:
//!
//! | expression | result |
//! |---|---|
//! | point − point | difference (`20 degC − 10 degC` = 10 K) |
//! | point ± difference, difference + point | point |
//! | point + point | error: "cannot add two temperatures; did you mean a temperature difference (delta_degC)?" |
//! | difference − point | error |
//! | point × or ÷ anything, point ^ n | plain quantity, using the point's kelvin value (its distance from absolute zero) |
//! | − point | plain quantity (write a negative temperature as `-5 degC`, a negative literal) |
//!
//! A point read in a scale unit gets the scale's offset; a difference read in a scale unit
//! (`degF`) is a count of degrees; a point cannot be read in a `delta_` unit.
//!
//! ## Pressures: gauge, absolute and plain
//!
//! `psig`, `kPa(g)`, `bar(g)` ... make a **gauge pressure** (above the local barometric
//! pressure); `psia`, `kPa(a)`, `bar(a)` ... an **absolute pressure**. A plain `psi`, `kPa`,
//! `bar`, `atm`, `in_Hg` states no reference: the field that receives it decides what it
//! means (a pressure difference, a barometric pressure, ...). The markers `(g)` and `(a)`
//! go on `Pa`, `kPa`, `MPa` and `bar` only, and a referenced unit must stand alone (no
//! `psig/ft`). Arithmetic: gauge ± plain = gauge; absolute ± plain = absolute;
//! gauge − gauge and absolute − absolute = plain; gauge + gauge, absolute + absolute,
//! gauge with absolute, and plain − gauge are errors. Converting gauge to absolute needs the
//! barometric pressure of the site and is done by the consumer, never here.
//!
//! ## Money
//!
//! All currencies share one dimension, money, with factor 1: dutyline has **no exchange
//! rates** and never converts. So that two currencies never meet silently, one unit may
//! name at most one currency (`USD/EUR` is an error). A consumer that meets several money
//! values feeds their units to a [`CurrencyGuard`], which rejects a second currency and
//! points at it (today the design has one money field, `energy.price`). [`Unit::currency`] tells a unit's currency; `cu` is a
//! currency of its own ("currency unit") for currency-neutral designs.
//!
//! ## Time, rotation and angles
//!
//! `year` and `yr` are 365 days (31 536 000 s), the year of energy-cost calculations;
//! leap days are ignored. `rpm` counts revolutions as cycles: 1 rpm = 1/60 s⁻¹ (the
//! angular velocity is 2π times that). Angles are dimensionless: `deg` = π/180.
//!
//! ## Numbers
//!
//! Quantity arithmetic keeps numbers finite: a result that overflows to infinity or NaN
//! is the error "result is too large"; division by zero is an error too.
//!
//! ```
//! use dutyline::units::{parse_unit, Quantity};
//! let gpm = parse_unit("gpm").unwrap();
//! let flow = Quantity::from_value(100.0, &gpm);
//! let ft3_s = flow.in_unit(&parse_unit("ft^3/s").unwrap()).unwrap();
//! assert!((ft3_s - 0.2228).abs() < 1e-4);
//! ```

mod dimension;
mod parse;
mod quantity;
mod registry;
mod unit;

pub use dimension::Dimension;
pub use parse::parse_unit;
pub use quantity::{Quantity, QuantityError, QuantityKind};
pub use registry::{lookup, registry, suggest, temperature_spelling, UnitDef};
pub use unit::{CurrencyGuard, PressureReference, Unit, UnitError};
