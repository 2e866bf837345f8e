//! The catalogue's series (one per material family and schedule), lookups, and the
//! "nearest valid size" suggestions of [`CatalogueError`].

use super::nominal::{
    format_nominal, normalise_schedule, parse_nominal, schedule_phrase, NominalProblem,
};
use super::nonsteel as ns;
use super::steel as st;
use super::{CatalogueError, Material, PipeSize};
use crate::names::{edit_distance, nearest_within as nearest_by_edit_distance};

/// Metres per inch, exact (NIST SP 811, Appendix B).
const METRES_PER_INCH: f64 = 0.0254;

/// Sizes suggested on each side of a requested size in the same schedule.
const NEIGHBOURS_EACH_SIDE: usize = 2;
/// Other schedules suggested for the requested size.
const SAME_SIZE_SUGGESTIONS: usize = 4;

/// Material families that share tables.
#[derive(Clone, Copy, Debug, PartialEq, Eq)]
enum Family {
    WroughtSteel,
    Stainless,
    Pvc,
    Copper,
    DuctileIron,
    Hdpe,
}

/// How a series gets its outside diameter.
#[derive(Clone, Copy, Debug)]
enum Outside {
    /// NPS / IPS outside diameters.
    Ips,
    /// Copper water tube: nominal + 1/8 in (ASTM B88).
    CopperTube,
    /// Ductile iron (AWWA C151).
    DuctileIron,
    /// Cast-iron outside diameters of AWWA C900 PVC.
    Ciod,
}

/// How a series gets its wall.
#[derive(Clone, Copy, Debug)]
enum Walls {
    /// Tabulated (nominal size in eighths, wall in inches).
    Table(&'static [(u16, f64)]),
    /// Minimum wall OD / DR on the listed sizes.
    DimensionRatio { dr: f64, sizes: &'static [u16] },
}

/// How the inner diameter follows from OD and wall.
#[derive(Clone, Copy, Debug)]
enum Inner {
    NominalWall,
    PvcMeanWall,
    PeMeanWall,
    DuctileIron,
}

/// One schedule of one material family.
#[derive(Clone, Copy, Debug)]
struct Series {
    family: Family,
    key: &'static str,
    outside: Outside,
    walls: Walls,
    inner: Inner,
}

const fn table(
    family: Family,
    key: &'static str,
    outside: Outside,
    inner: Inner,
    rows: &'static [(u16, f64)],
) -> Series {
    Series {
        family,
        key,
        outside,
        walls: Walls::Table(rows),
        inner,
    }
}
const fn wrought(key: &'static str, rows: &'static [(u16, f64)]) -> Series {
    table(
        Family::WroughtSteel,
        key,
        Outside::Ips,
        Inner::NominalWall,
        rows,
    )
}
const fn stainless(key: &'static str, rows: &'static [(u16, f64)]) -> Series {
    table(
        Family::Stainless,
        key,
        Outside::Ips,
        Inner::NominalWall,
        rows,
    )
}
const fn pvc(key: &'static str, rows: &'static [(u16, f64)]) -> Series {
    table(Family::Pvc, key, Outside::Ips, Inner::PvcMeanWall, rows)
}
const fn copper(key: &'static str, rows: &'static [(u16, f64)]) -> Series {
    table(
        Family::Copper,
        key,
        Outside::CopperTube,
        Inner::NominalWall,
        rows,
    )
}
const fn ductile(key: &'static str, rows: &'static [(u16, f64)]) -> Series {
    table(
        Family::DuctileIron,
        key,
        Outside::DuctileIron,
        Inner::DuctileIron,
        rows,
    )
}
const fn pe(index: usize) -> Series {
    let (dr, key, sizes) = ns::PE_DR_SERIES[index];
    Series {
        family: Family::Hdpe,
        key,
        outside: Outside::Ips,
        walls: Walls::DimensionRatio { dr, sizes },
        inner: Inner::PeMeanWall,
    }
}

const fn c900(index: usize) -> Series {
    let (dr, key, sizes) = ns::C900_DR_SERIES[index];
    Series {
        family: Family::Pvc,
        key,
        outside: Outside::Ciod,
        walls: Walls::DimensionRatio { dr, sizes },
        // The +12 % wall tolerance of C900, as for PE: mean wall 1.06 × minimum (from memory).
        inner: Inner::PeMeanWall,
    }
}

/// Every series, in the order used by [`sizes`] and suggestions.
#[rustfmt::skip]
const SERIES: &[Series] = &[
    wrought("10", st::B3610_SCH10), wrought("20", st::B3610_SCH20), wrought("30", st::B3610_SCH30),
    wrought("40", st::B3610_SCH40), wrought("STD", st::B3610_STD), wrought("60", st::B3610_SCH60),
    wrought("80", st::B3610_SCH80), wrought("XS", st::B3610_XS), wrought("100", st::B3610_SCH100),
    wrought("120", st::B3610_SCH120), wrought("140", st::B3610_SCH140), wrought("160", st::B3610_SCH160),
    wrought("XXS", st::B3610_XXS),
    stainless("5S", st::B3619_5S), stainless("10S", st::B3619_10S),
    stainless("40S", st::B3619_40S), stainless("80S", st::B3619_80S),
    pvc("40", ns::D1785_SCH40), pvc("80", ns::D1785_SCH80),
    c900(0), c900(1), c900(2), c900(3),
    copper("K", ns::B88_TYPE_K), copper("L", ns::B88_TYPE_L), copper("M", ns::B88_TYPE_M),
    ductile("150", ns::C151_CLASS_150), ductile("200", ns::C151_CLASS_200),
    ductile("250", ns::C151_CLASS_250), ductile("300", ns::C151_CLASS_300),
    ductile("350", ns::C151_CLASS_350),
    pe(0), pe(1), pe(2), pe(3), pe(4), pe(5), pe(6), pe(7),
];

/// The table family of a material, or `None` where there is no catalogue.
fn family_of(material: Material) -> Option<Family> {
    match material {
        Material::Steel | Material::Galvanized => Some(Family::WroughtSteel),
        Material::Stainless => Some(Family::Stainless),
        Material::Pvc => Some(Family::Pvc),
        Material::Copper => Some(Family::Copper),
        Material::DuctileIron | Material::CementLinedDuctileIron => Some(Family::DuctileIron),
        Material::Hdpe => Some(Family::Hdpe),
        Material::CastIron | Material::Concrete | Material::Other => None,
    }
}

/// The standard and ID convention reported in [`PipeSize::standard`].
fn standard_of(material: Material, key: &str) -> &'static str {
    match material {
        Material::Pvc if key.starts_with("DR") => {
            "ANSI/AWWA C900-16 (cast-iron OD, minimum wall OD/DR; mean ID = OD - 2.12t)"
        }
        Material::Steel => "ASME B36.10M (inch dimensions; ID = OD - 2 x nominal wall)",
        Material::Galvanized => {
            "ASME B36.10M (inch dimensions, galvanized pipe to ASTM A53; ID = OD - 2 x nominal wall)"
        }
        Material::Stainless => "ASME B36.19M (inch dimensions; ID = OD - 2 x nominal wall)",
        Material::Pvc => {
            "ASTM D1785 (minimum wall; mean ID = OD - 2t - max(0.12t, 0.020 in))"
        }
        Material::Copper => "ASTM B88 (inch sizes; ID = OD - 2 x nominal wall)",
        Material::DuctileIron => {
            "ANSI/AWWA C151/A21.51 pressure class (nominal thickness; bare ID, unlined)"
        }
        Material::CementLinedDuctileIron => {
            "ANSI/AWWA C151/A21.51 pressure class with ANSI/AWWA C104/A21.4 standard cement-mortar lining (ID net of lining)"
        }
        Material::Hdpe => {
            "ASTM D3035 / F714 IPS DR series (minimum wall OD/DR; mean ID = OD - 2.12t, PPI Handbook)"
        }
        Material::CastIron | Material::Concrete | Material::Other => "",
    }
}

/// The standard's short name, for messages.
fn short_standard(family: Family) -> &'static str {
    match family {
        Family::WroughtSteel => "ASME B36.10M",
        Family::Stainless => "ASME B36.19M",
        Family::Pvc => "ASTM D1785",
        Family::Copper => "ASTM B88",
        Family::DuctileIron => "AWWA C151",
        Family::Hdpe => "the ASTM D3035 / F714 DR series",
    }
}

impl Series {
    fn outside_in(&self, eighths: u16) -> Option<f64> {
        match self.outside {
            Outside::Ips => lookup(st::IPS_OUTSIDE_DIAMETER_IN, eighths),
            Outside::CopperTube => Some(f64::from(eighths) / 8.0 + 0.125),
            Outside::DuctileIron => lookup(ns::C151_OUTSIDE_DIAMETER_IN, eighths),
            Outside::Ciod => lookup(ns::C900_CIOD_IN, eighths),
        }
    }

    /// Nominal sizes (eighths) of this series, ascending.
    fn nominal_sizes(&self) -> Vec<u16> {
        match self.walls {
            Walls::Table(rows) => rows.iter().map(|(e, _)| *e).collect(),
            Walls::DimensionRatio { sizes, .. } => sizes.to_vec(),
        }
    }

    /// (OD, wall, ID) in inches, if the series lists the size.
    fn dimensions_in(&self, material: Material, eighths: u16) -> Option<(f64, f64, f64)> {
        let od = self.outside_in(eighths)?;
        let wall = match self.walls {
            Walls::Table(rows) => lookup(rows, eighths)?,
            Walls::DimensionRatio { dr, sizes } => {
                if !sizes.contains(&eighths) {
                    return None;
                }
                ns::pe_minimum_wall_in(od, dr)
            }
        };
        let id = match self.inner {
            Inner::NominalWall => od - 2.0 * wall,
            Inner::PvcMeanWall => od - 2.0 * ns::pvc_mean_wall_in(wall),
            Inner::PeMeanWall => od - 2.0 * ns::pe_mean_wall_in(wall),
            Inner::DuctileIron if material == Material::CementLinedDuctileIron => {
                od - 2.0 * wall - 2.0 * ns::c104_standard_lining_in(eighths)
            }
            Inner::DuctileIron => od - 2.0 * wall,
        };
        Some((od, wall, id))
    }
}

fn lookup(rows: &[(u16, f64)], eighths: u16) -> Option<f64> {
    rows.iter().find(|(e, _)| *e == eighths).map(|(_, v)| *v)
}

fn series_of(family: Family) -> impl Iterator<Item = &'static Series> {
    SERIES.iter().filter(move |s| s.family == family)
}

fn spelling(material: Material, eighths: u16, key: &str) -> String {
    format!(
        "{} in {}",
        format_nominal(eighths),
        schedule_phrase(material, key)
    )
}

/// Looks up a catalogue pipe.
///
/// `nominal` is an inch nominal size ("1/2", "3/4", "1", "1-1/4", "1 1/2", "2.5",
/// "24", optionally followed by "in" or '"', or prefixed "NPS"), or for steel,
/// galvanized, stainless, PVC and HDPE a DN designation ("DN100" = NPS 4).
/// `schedule` is, case-insensitively and with or without a leading word:
/// steel "40", "sch 40", "schedule 40", "STD", "XS", "XXS" (also "standard", "XH",
/// "XXH"); stainless "5S", "10S", "40S", "80S" (plain "40" is refused: 40S and 40
/// differ at NPS 12); PVC "40", "80"; copper "K", "L", "M", "type L"; ductile iron
/// "350", "class 350", "pressure class 350"; HDPE "11", "DR11", "SDR 11", "13.5".
///
/// # Errors
/// A [`CatalogueError`] when the material has no catalogue, the size or schedule
/// cannot be read, or the combination is not listed; `nearest` then holds valid
/// spellings close to the request.
pub fn pipe_size(
    material: Material,
    nominal: &str,
    schedule: &str,
) -> Result<PipeSize, CatalogueError> {
    let Some(family) = family_of(material) else {
        return Err(CatalogueError {
            message: format!(
                "there is no dimension catalogue for {}: give the inner diameter explicitly",
                material.keyword()
            ),
            nearest: Vec::new(),
        });
    };
    let key = normalise_schedule(material, schedule);
    let series = series_of(family).find(|s| s.key == key);
    let eighths = match parse_nominal(material, nominal) {
        Ok(e) => e,
        Err(problem) => return Err(nominal_error(material, family, series, nominal, problem)),
    };
    let Some(series) = series else {
        return Err(schedule_error(material, family, eighths, schedule));
    };
    match series.dimensions_in(material, eighths) {
        Some((od, wall, id)) => Ok(PipeSize {
            outer_diameter_m: od * METRES_PER_INCH,
            wall_m: wall * METRES_PER_INCH,
            inner_diameter_m: id * METRES_PER_INCH,
            standard: standard_of(material, series.key),
        }),
        None => Err(CatalogueError {
            message: format!(
                "{} is not listed for {} in {}",
                spelling(material, eighths, series.key),
                material.keyword(),
                short_standard(family)
            ),
            nearest: nearest_valid(material, family, eighths, Some(series), series.key),
        }),
    }
}

/// Every (nominal, schedule key) the catalogue knows for `material`, e.g.
/// `("1-1/2", "40")`, `("2", "L")`, `("8", "350")`, `("4", "DR11")`; empty for
/// materials without a catalogue.
pub fn sizes(material: Material) -> Vec<(String, String)> {
    let Some(family) = family_of(material) else {
        return Vec::new();
    };
    series_of(family)
        .flat_map(|s| {
            s.nominal_sizes()
                .into_iter()
                .map(move |e| (format_nominal(e), s.key.to_string()))
        })
        .collect()
}

/// Same size in up to four other schedules (those listed nearest to the requested
/// schedule, or nearest in spelling when it is unknown), then up to two smaller and
/// two larger sizes in the requested schedule.
fn nearest_valid(
    material: Material,
    family: Family,
    eighths: u16,
    wanted: Option<&Series>,
    typed_key: &str,
) -> Vec<String> {
    let family_series: Vec<&Series> = series_of(family).collect();
    let wanted_index = wanted.and_then(|w| family_series.iter().position(|s| s.key == w.key));
    let mut same_size: Vec<(usize, usize, &Series)> = family_series
        .iter()
        .enumerate()
        .filter(|(_, s)| s.dimensions_in(material, eighths).is_some())
        .map(|(i, s)| {
            let closeness = match wanted_index {
                Some(w) => i.abs_diff(w),
                None => edit_distance(typed_key, s.key),
            };
            (closeness, i, *s)
        })
        .collect();
    same_size.sort_by_key(|(closeness, i, _)| (*closeness, *i));
    let mut out: Vec<String> = same_size
        .iter()
        .take(SAME_SIZE_SUGGESTIONS)
        .map(|(_, _, s)| spelling(material, eighths, s.key))
        .collect();
    if let Some(series) = wanted {
        let all = series.nominal_sizes();
        let below = all
            .iter()
            .filter(|e| **e < eighths)
            .rev()
            .take(NEIGHBOURS_EACH_SIDE);
        let above = all
            .iter()
            .filter(|e| **e > eighths)
            .take(NEIGHBOURS_EACH_SIDE);
        let mut near: Vec<u16> = below.chain(above).copied().collect();
        near.sort_unstable();
        out.extend(near.into_iter().map(|e| spelling(material, e, series.key)));
    }
    out
}

fn schedule_error(
    material: Material,
    family: Family,
    eighths: u16,
    schedule: &str,
) -> CatalogueError {
    let keys: Vec<&str> = series_of(family).map(|s| s.key).collect();
    let mut message = format!(
        "unknown schedule \"{}\" for {} (known: {})",
        schedule.trim(),
        material.keyword(),
        keys.join(", ")
    );
    if family == Family::Stainless {
        message.push_str("; stainless schedules carry an S, e.g. 40S");
    }
    let typed = normalise_schedule(material, schedule);
    let mut nearest = nearest_valid(material, family, eighths, None, &typed);
    if nearest.is_empty() {
        nearest = nearest_by_edit_distance(&typed, keys.iter().copied(), 3, 3)
            .into_iter()
            .filter_map(|k| series_of(family).find(|s| s.key == k))
            .filter_map(|s| {
                s.nominal_sizes()
                    .first()
                    .map(|e| spelling(material, *e, s.key))
            })
            .collect();
    }
    CatalogueError { message, nearest }
}

fn nominal_error(
    material: Material,
    family: Family,
    series: Option<&Series>,
    nominal: &str,
    problem: NominalProblem,
) -> CatalogueError {
    let fallback = series.or_else(|| series_of(family).next());
    let message = match problem {
        NominalProblem::Unreadable => format!(
            "cannot read nominal size \"{}\" (write e.g. 4, 1-1/2 or DN100)",
            nominal.trim()
        ),
        NominalProblem::UnknownDn(dn) => format!("DN {dn} is not a standard DN size"),
        NominalProblem::DnNotAccepted => format!(
            "DN designations do not apply to {}: give the inch nominal size",
            material.keyword()
        ),
    };
    let nearest = match fallback {
        None => Vec::new(),
        Some(s) => {
            let names: Vec<String> = s.nominal_sizes().into_iter().map(format_nominal).collect();
            let typed = nominal.trim().trim_end_matches(['i', 'n', ' ', '"']);
            nearest_by_edit_distance(typed, names.iter().map(String::as_str), 4, 2)
                .into_iter()
                .map(|n| format!("{n} in {}", schedule_phrase(material, s.key)))
                .collect()
        }
    };
    CatalogueError { message, nearest }
}
