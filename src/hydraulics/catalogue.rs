//! Pipe dimension catalogue: nominal size and schedule (or type, class, DR) to
//! outside diameter, wall and inner diameter.
//!
//! Tables and their sources:
//! - carbon steel and galvanized: ASME B36.10M, schedules 10-160, STD, XS, XXS,
//!   NPS 1/8-24 (inch columns);
//! - stainless: ASME B36.19M, 5S, 10S, 40S, 80S, NPS 1/8-24;
//! - PVC: ASTM D1785 schedules 40 and 80, NPS 1/8-24 (OD equals the steel IPS OD);
//! - copper: ASTM B88 types K, L, M, 1/4-12 in (OD = nominal + 1/8 in);
//! - ductile iron: ANSI/AWWA C151/A21.51 pressure classes 150-350, 3-64 in (bare), and
//!   the same with the ANSI/AWWA C104/A21.4 standard cement-mortar lining;
//! - HDPE: IPS OD, DR 7, 9, 11, 13.5, 17, 21, 26, 32.5 (ASTM D3035 / F714), NPS 1/2-24.
//!
//! Inner-diameter convention (stated in each [`PipeSize::standard`]):
//! - steel, stainless, copper, ductile iron: ID = OD - 2 x nominal wall (ductile iron
//!   with lining: minus 2 x the C104 standard lining thickness as well);
//! - PVC and HDPE, whose standards give a minimum wall with a plus-only tolerance:
//!   `wall_m` is that minimum wall, and the ID is the mean ID, OD - 2 x mean wall
//!   (PVC: mean wall = t + max(0.12 t, 0.020 in)/2; HDPE: 1.06 t, i.e. the PPI
//!   average ID OD - 2.12 t). The mean ID is what published "average ID" columns show
//!   and is 1-3 % smaller than OD - 2 t, which matters for head loss (about D^-5).
//!
//! Spellings: see [`pipe_size`].

mod nominal;
mod nonsteel;
mod series;
mod steel;

pub use nominal::size_for_print;
pub use series::{pipe_size, sizes};

/// The schedule 40 table as (inner diameter, nominal size), in, in the table's order:
/// built once (each fitting's K at each flow asks for it).
fn schedule_40_bores() -> &'static [(f64, f64)] {
    static BORES: std::sync::OnceLock<Vec<(f64, f64)>> = std::sync::OnceLock::new();
    BORES.get_or_init(|| {
        steel::B3610_SCH40
            .iter()
            .filter_map(|&(eighths, wall)| {
                let od = steel::IPS_OUTSIDE_DIAMETER_IN
                    .iter()
                    .find(|(e, _)| *e == eighths)
                    .map(|(_, od)| *od)?;
                Some((od - 2.0 * wall, f64::from(eighths) / 8.0))
            })
            .collect()
    })
}

/// The nominal diameter Dn (inches) that Darby's 3-K method needs, from an actual
/// inner diameter in inches: linear interpolation of NPS against inner diameter over
/// ASME B36.10M schedule 40, NPS 1/8-24, so Dn = NPS exactly for schedule 40 pipe.
/// Above NPS 24 the last segment is extrapolated; below NPS 1/8 Dn is proportional
/// to the diameter (stays positive). Non-finite or non-positive input gives the
/// smallest table size's proportional value, 0 for 0.
pub(crate) fn darby_nominal_diameter_in(inner_diameter_in: f64) -> f64 {
    let id = if inner_diameter_in.is_finite() {
        inner_diameter_in.max(0.0)
    } else {
        0.0
    };
    let mut previous: Option<(f64, f64)> = None;
    let mut last_two: Option<((f64, f64), (f64, f64))> = None;
    for &(x, y) in schedule_40_bores() {
        match previous {
            None if id <= x => return y * id / x,
            Some((x0, y0)) if id <= x => return y0 + (y - y0) * (id - x0) / (x - x0),
            Some(p) => last_two = Some((p, (x, y))),
            None => {}
        }
        previous = Some((x, y));
    }
    match last_two {
        Some(((x0, y0), (x1, y1))) => y1 + (y1 - y0) * (id - x1) / (x1 - x0),
        None => id,
    }
}

/// Pipe wall material. Drives the dimension catalogue and the roughness table.
#[derive(Clone, Copy, Debug, PartialEq, Eq, Hash)]
pub enum Material {
    /// Carbon steel pipe, unlined (ASME B36.10M dimensions).
    Steel,
    /// Stainless steel pipe (ASME B36.19M dimensions).
    Stainless,
    /// Galvanized (zinc-coated) carbon steel pipe (ASME B36.10M dimensions).
    Galvanized,
    /// PVC pressure pipe, schedules 40 and 80 (ASTM D1785).
    Pvc,
    /// Copper water tube, types K, L, M (ASTM B88).
    Copper,
    /// Ductile-iron pipe, bare bore (AWWA C151).
    DuctileIron,
    /// Ductile-iron pipe with shop cement-mortar lining (AWWA C151 + C104).
    CementLinedDuctileIron,
    /// High-density polyethylene pipe, IPS OD, DR-rated.
    Hdpe,
    /// Grey cast iron, unlined (roughness only; no dimension catalogue).
    CastIron,
    /// Concrete pipe (roughness only; no dimension catalogue).
    Concrete,
    /// Any other material: inner diameter and roughness must be given explicitly.
    Other,
}

/// All materials, in declaration order.
const ALL_MATERIALS: &[Material] = &[
    Material::Steel,
    Material::Stainless,
    Material::Galvanized,
    Material::Pvc,
    Material::Copper,
    Material::DuctileIron,
    Material::CementLinedDuctileIron,
    Material::Hdpe,
    Material::CastIron,
    Material::Concrete,
    Material::Other,
];

/// Accepted spellings (after lower-casing and turning spaces and '-' into '_').
const MATERIAL_ALIASES: &[(&str, Material)] = &[
    ("carbon_steel", Material::Steel),
    ("stainless_steel", Material::Stainless),
    ("galvanised", Material::Galvanized),
    ("galvanized_steel", Material::Galvanized),
    ("galvanised_steel", Material::Galvanized),
    ("ductile", Material::DuctileIron),
    ("ductile_iron_lined", Material::CementLinedDuctileIron),
    ("lined_ductile_iron", Material::CementLinedDuctileIron),
    ("polyethylene", Material::Hdpe),
    ("pe", Material::Hdpe),
    ("grey_cast_iron", Material::CastIron),
    ("gray_cast_iron", Material::CastIron),
];

impl Material {
    /// Reads a material keyword as a user writes it: the canonical keyword
    /// ("steel", "stainless", "galvanized", "pvc", "copper", "ductile_iron",
    /// "cement_lined_ductile_iron", "hdpe", "cast_iron", "concrete", "other") or an
    /// alias ("carbon_steel", "stainless_steel", "galvanised", "ductile",
    /// "lined_ductile_iron", "polyethylene", "pe", "grey_cast_iron"), case-insensitive,
    /// with spaces or '-' in place of '_'.
    pub fn from_keyword(s: &str) -> Option<Material> {
        let key: String = s
            .trim()
            .chars()
            .map(|c| match c {
                ' ' | '-' => '_',
                c => c.to_ascii_lowercase(),
            })
            .collect();
        ALL_MATERIALS
            .iter()
            .copied()
            .find(|m| m.keyword() == key)
            .or_else(|| {
                MATERIAL_ALIASES
                    .iter()
                    .find(|(alias, _)| *alias == key)
                    .map(|(_, m)| *m)
            })
    }

    /// The keyword in words for print ("ductile iron" for `ductile_iron`).
    pub fn words(self) -> String {
        self.keyword().replace('_', " ")
    }

    /// The canonical keyword, lower_snake_case.
    pub fn keyword(self) -> &'static str {
        match self {
            Material::Steel => "steel",
            Material::Stainless => "stainless",
            Material::Galvanized => "galvanized",
            Material::Pvc => "pvc",
            Material::Copper => "copper",
            Material::DuctileIron => "ductile_iron",
            Material::CementLinedDuctileIron => "cement_lined_ductile_iron",
            Material::Hdpe => "hdpe",
            Material::CastIron => "cast_iron",
            Material::Concrete => "concrete",
            Material::Other => "other",
        }
    }

    /// Every material, in a fixed order.
    pub fn all() -> &'static [Material] {
        ALL_MATERIALS
    }

    /// Whether [`pipe_size`] has a dimension table for this material.
    pub fn has_catalogue(self) -> bool {
        !matches!(
            self,
            Material::CastIron | Material::Concrete | Material::Other
        )
    }
}

/// Dimensions of one catalogue pipe, SI.
#[derive(Clone, Debug, PartialEq)]
pub struct PipeSize {
    /// Outside diameter, m.
    pub outer_diameter_m: f64,
    /// Wall thickness as tabulated by the standard (nominal; minimum for PVC and HDPE), m.
    pub wall_m: f64,
    /// Inner diameter used for hydraulics, m (convention in the module docs).
    pub inner_diameter_m: f64,
    /// The table the numbers come from and the ID convention applied.
    pub standard: &'static str,
}

/// A size that the catalogue does not know, with valid neighbours.
#[derive(Clone, Debug, PartialEq)]
pub struct CatalogueError {
    /// What was asked and why it is not in the catalogue.
    pub message: String,
    /// Valid spellings near the request, e.g. `["4 in schedule 40", "4 in schedule 80"]`:
    /// the same size in other schedules first, then the same schedule in nearby sizes.
    pub nearest: Vec<String>,
}

impl std::fmt::Display for CatalogueError {
    fn fmt(&self, f: &mut std::fmt::Formatter<'_>) -> std::fmt::Result {
        f.write_str(&self.message)?;
        if !self.nearest.is_empty() {
            write!(f, " (nearest: {})", self.nearest.join(", "))?;
        }
        Ok(())
    }
}

impl std::error::Error for CatalogueError {}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn material_keywords_round_trip() {
        for m in Material::all() {
            assert_eq!(Material::from_keyword(m.keyword()), Some(*m));
        }
        assert_eq!(
            Material::from_keyword("Ductile Iron"),
            Some(Material::DuctileIron)
        );
        assert_eq!(
            Material::from_keyword("stainless-steel"),
            Some(Material::Stainless)
        );
        assert_eq!(Material::from_keyword("PE"), Some(Material::Hdpe));
        assert_eq!(Material::from_keyword("unobtainium"), None);
    }
}
