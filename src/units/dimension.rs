//! Dimensions as integer exponents of five base dimensions.

use std::fmt;

/// Exponents of base dimensions. Money is a base dimension (for energy prices).
///
/// Angles and revolutions are dimensionless, so a rotational speed in rpm is a
/// [`Dimension::FREQUENCY`].
#[derive(Clone, Copy, PartialEq, Eq, Debug, Hash, Default)]
pub struct Dimension {
    /// Exponent of length (L, metre).
    pub length: i8,
    /// Exponent of mass (M, kilogram).
    pub mass: i8,
    /// Exponent of time (T, second).
    pub time: i8,
    /// Exponent of thermodynamic temperature (Θ, kelvin).
    pub temperature: i8,
    /// Exponent of money (any currency, see the module docs).
    pub money: i8,
}

#[rustfmt::skip]
const fn dim(length: i8, mass: i8, time: i8, temperature: i8, money: i8) -> Dimension {
    Dimension { length, mass, time, temperature, money }
}

// `mul`/`div` are the module's agreed names; they are plain methods, not operator traits.
#[allow(clippy::should_implement_trait)]
impl Dimension {
    /// A pure number.
    pub const NONE: Self = dim(0, 0, 0, 0, 0);
    /// L.
    pub const LENGTH: Self = dim(1, 0, 0, 0, 0);
    /// M.
    pub const MASS: Self = dim(0, 1, 0, 0, 0);
    /// T.
    pub const TIME: Self = dim(0, 0, 1, 0, 0);
    /// Θ.
    pub const TEMPERATURE: Self = dim(0, 0, 0, 1, 0);
    /// Money.
    pub const MONEY: Self = dim(0, 0, 0, 0, 1);
    /// L².
    pub const AREA: Self = dim(2, 0, 0, 0, 0);
    /// L³.
    pub const VOLUME: Self = dim(3, 0, 0, 0, 0);
    /// L·T⁻¹.
    pub const VELOCITY: Self = dim(1, 0, -1, 0, 0);
    /// L·T⁻².
    pub const ACCELERATION: Self = dim(1, 0, -2, 0, 0);
    /// L³·T⁻¹.
    pub const VOLUME_RATE: Self = dim(3, 0, -1, 0, 0);
    /// M·T⁻¹.
    pub const MASS_RATE: Self = dim(0, 1, -1, 0, 0);
    /// M·L·T⁻².
    pub const FORCE: Self = dim(1, 1, -2, 0, 0);
    /// M·L⁻¹·T⁻².
    pub const PRESSURE: Self = dim(-1, 1, -2, 0, 0);
    /// M·L⁻³.
    pub const DENSITY: Self = dim(-3, 1, 0, 0, 0);
    /// M·L⁻¹·T⁻¹.
    pub const DYNAMIC_VISCOSITY: Self = dim(-1, 1, -1, 0, 0);
    /// L²·T⁻¹.
    pub const KINEMATIC_VISCOSITY: Self = dim(2, 0, -1, 0, 0);
    /// M·L²·T⁻³.
    pub const POWER: Self = dim(2, 1, -3, 0, 0);
    /// M·L²·T⁻².
    pub const ENERGY: Self = dim(2, 1, -2, 0, 0);
    /// T⁻¹.
    pub const FREQUENCY: Self = dim(0, 0, -1, 0, 0);
    /// Money·M⁻¹·L⁻²·T².
    pub const MONEY_PER_ENERGY: Self = dim(-2, -1, 2, 0, 1);
    /// Money·T⁻¹.
    pub const MONEY_PER_TIME: Self = dim(0, 0, -1, 0, 1);
    /// Force per volume, M·L⁻²·T⁻².
    pub const SPECIFIC_WEIGHT: Self = dim(-2, 1, -2, 0, 0);

    #[rustfmt::skip]
    fn exponents(self) -> [i8; 5] {
        [self.length, self.mass, self.time, self.temperature, self.money]
    }

    fn from_exponents(e: [i8; 5]) -> Self {
        dim(e[0], e[1], e[2], e[3], e[4])
    }

    fn combine(self, o: Self, f: impl Fn(i8, i8) -> Option<i8>) -> Option<Self> {
        let (a, b) = (self.exponents(), o.exponents());
        let mut out = [0i8; 5];
        for i in 0..5 {
            out[i] = f(a[i], b[i])?;
        }
        Some(Self::from_exponents(out))
    }

    /// Dimension of a product, `None` if an exponent leaves the `i8` range.
    pub fn checked_mul(self, o: Self) -> Option<Self> {
        self.combine(o, i8::checked_add)
    }

    /// Dimension of a quotient, `None` if an exponent leaves the `i8` range.
    pub fn checked_div(self, o: Self) -> Option<Self> {
        self.combine(o, i8::checked_sub)
    }

    /// Dimension of a product. Exponents saturate at the `i8` range (never panics);
    /// use [`Dimension::checked_mul`] where overflow must be reported.
    pub fn mul(self, o: Self) -> Self {
        self.combine(o, |a, b| Some(a.saturating_add(b)))
            .unwrap_or_default()
    }

    /// Dimension of a quotient. Exponents saturate at the `i8` range (never panics);
    /// use [`Dimension::checked_div`] where overflow must be reported.
    pub fn div(self, o: Self) -> Self {
        self.combine(o, |a, b| Some(a.saturating_sub(b)))
            .unwrap_or_default()
    }

    /// Dimension raised to an integer power; `None` on overflow.
    pub fn powi(self, n: i8) -> Option<Self> {
        self.combine(Self::NONE, |a, _| a.checked_mul(n))
    }

    /// True for a pure number.
    pub fn is_dimensionless(self) -> bool {
        self == Self::NONE
    }

    /// A phrase for diagnostics: "a length", "a pressure", "an energy price", ...;
    /// "a quantity of dimension L^2·T^-1" for combinations without a name.
    pub fn describe(self) -> String {
        const NAMED: &[(Dimension, &str)] = &[
            (Dimension::NONE, "a dimensionless number"),
            (Dimension::LENGTH, "a length"),
            (Dimension::MASS, "a mass"),
            (Dimension::TIME, "a time"),
            (Dimension::TEMPERATURE, "a temperature"),
            (Dimension::MONEY, "an amount of money"),
            (Dimension::AREA, "an area"),
            (Dimension::VOLUME, "a volume"),
            (Dimension::VELOCITY, "a velocity"),
            (Dimension::ACCELERATION, "an acceleration"),
            (Dimension::VOLUME_RATE, "a volume flow rate"),
            (Dimension::MASS_RATE, "a mass flow rate"),
            (Dimension::FORCE, "a force"),
            (Dimension::PRESSURE, "a pressure"),
            (Dimension::DENSITY, "a density"),
            (Dimension::DYNAMIC_VISCOSITY, "a dynamic viscosity"),
            (Dimension::KINEMATIC_VISCOSITY, "a kinematic viscosity"),
            (Dimension::POWER, "a power"),
            (Dimension::ENERGY, "an energy"),
            (Dimension::FREQUENCY, "a frequency or rotational speed"),
            (Dimension::MONEY_PER_ENERGY, "an energy price"),
            (Dimension::MONEY_PER_TIME, "a cost per time"),
            (Dimension::SPECIFIC_WEIGHT, "a specific weight"),
        ];
        match NAMED.iter().find(|(d, _)| *d == self) {
            Some((_, name)) => (*name).to_string(),
            None => format!("a quantity of dimension {self}"),
        }
    }
}

impl fmt::Display for Dimension {
    /// Writes the exponents as `L^2·T^-1`; a pure number is `1`.
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        const SYMBOLS: [&str; 5] = ["L", "M", "T", "Θ", "money"];
        let parts: Vec<String> = SYMBOLS
            .iter()
            .zip(self.exponents())
            .filter(|(_, e)| *e != 0)
            .map(|(s, e)| {
                if e == 1 {
                    s.to_string()
                } else {
                    format!("{s}^{e}")
                }
            })
            .collect();
        if parts.is_empty() {
            f.write_str("1")
        } else {
            f.write_str(&parts.join("·"))
        }
    }
}

#[cfg(test)]
mod tests {
    use super::Dimension as D;

    #[test]
    fn derived_dimensions_compose_from_base_ones() {
        assert_eq!(D::LENGTH.mul(D::LENGTH).mul(D::LENGTH), D::VOLUME);
        assert_eq!(D::VOLUME.div(D::TIME), D::VOLUME_RATE);
        assert_eq!(D::FORCE.div(D::AREA), D::PRESSURE);
        assert_eq!(D::PRESSURE.mul(D::TIME), D::DYNAMIC_VISCOSITY);
        assert_eq!(D::MONEY.div(D::ENERGY), D::MONEY_PER_ENERGY);
        assert_eq!(D::FORCE.div(D::VOLUME), D::SPECIFIC_WEIGHT);
        assert_eq!(D::PRESSURE.mul(D::VOLUME_RATE), D::POWER);
    }

    #[test]
    fn powers_overflow_to_none_and_products_saturate() {
        assert_eq!(D::TIME.powi(-1), Some(D::FREQUENCY));
        assert_eq!(D::VOLUME.powi(100), None);
        let big = D {
            length: 120,
            ..D::NONE
        };
        assert_eq!((big.checked_mul(big), big.mul(big).length), (None, i8::MAX));
    }

    #[test]
    fn descriptions_name_known_dimensions_and_fall_back_to_exponents() {
        assert_eq!(D::VOLUME_RATE.describe(), "a volume flow rate");
        assert_eq!(D::MONEY_PER_ENERGY.describe(), "an energy price");
        assert_eq!(D::NONE.describe(), "a dimensionless number");
        let odd = D::AREA.div(D::TIME).div(D::TIME).div(D::TEMPERATURE);
        assert_eq!(odd.describe(), "a quantity of dimension L^2·T^-2·Θ^-1");
        assert_eq!(D::MONEY.div(D::LENGTH).to_string(), "L^-1·money");
    }
}
