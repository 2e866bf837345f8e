//! Wall roughness by material: equivalent sand-grain roughness for the
//! Colebrook / Darcy-Weisbach route and the Hazen-Williams C factor, each new and
//! aged.
//!
//! "New" values come from the cited tables. "Aged" values are judgement, stated as
//! common practice: they stand for roughly 20-30 years of service in ordinary potable
//! water (general tuberculation of unlined ferrous pipe, slime and deposits in smooth
//! pipe), and each entry's `aged_note` says what it represents. Where a roughness
//! was chosen to match a C factor, the match is Colebrook (1939) against
//! Hazen-Williams at D = 150 mm, V = 1.5 m/s, 15 degC water (our conversion, checked
//! by `tests/reference/gen_roughness.py`): at that point C = 140 corresponds to
//! about 0.06 mm, C = 130 to 0.15 mm, C = 120 to 0.30 mm, C = 100 to 1.1 mm and
//! C = 110 to 0.57 mm, C = 90 to 1.9 mm. The correspondence shifts with diameter and velocity, which is
//! why the two routes are separate entries and not derived from each other.

use super::catalogue::Material;

/// Roughness and Hazen-Williams C of one material.
#[derive(Clone, Debug, PartialEq)]
pub struct RoughnessEntry {
    /// The material this entry describes.
    pub material: Material,
    /// Absolute (equivalent sand-grain) roughness of new pipe, m.
    pub new_m: f64,
    /// Absolute roughness of aged pipe, m (see `aged_note`).
    pub aged_m: f64,
    /// Hazen-Williams C of new pipe.
    pub hw_c_new: f64,
    /// Hazen-Williams C of aged pipe.
    pub hw_c_aged: f64,
    /// Where the new values come from.
    pub source: &'static str,
    /// What "aged" represents for this material and how the values were chosen.
    pub aged_note: &'static str,
}

/// Feet to metres, exact (NIST SP 811, Appendix B).
const FT: f64 = 0.3048;

/// The table. Moody, L. F. (1944), "Friction factors for pipe flow", Trans. ASME 66,
/// 671-684, Fig. 2 lists (feet): drawn tubing 0.000005, commercial steel or wrought
/// iron 0.00015, galvanized iron 0.0005, cast iron 0.00085, concrete 0.001-0.01.
const TABLE: &[RoughnessEntry] = &[
    RoughnessEntry {
        material: Material::Steel,
        new_m: 0.000_15 * FT,
        aged_m: 1.0e-3,
        hw_c_new: 140.0,
        hw_c_aged: 100.0,
        source: "roughness: Moody (1944), Trans. ASME 66, Fig. 2, commercial steel 0.00015 ft; C = 140 new unlined steel: Williams & Hazen, Hydraulic Tables, 3rd ed. (1920) (from memory)",
        aged_note: "common practice: unlined steel after about 20-25 years in potable water with general tuberculation; C = 100, roughness 1.0 mm chosen to match C = 100 at 150 mm",
    },
    RoughnessEntry {
        material: Material::Stainless,
        new_m: 1.5e-5,
        aged_m: 4.5e-5,
        hw_c_new: 150.0,
        hw_c_aged: 140.0,
        source: "common practice for welded stainless pipe, 0.015 mm (from memory; Moody's drawn-tubing 0.000005 ft is the lower bound); C = 150 common practice",
        aged_note: "common practice: light deposits only (stainless does not tuberculate); roughness of new commercial steel, C = 140",
    },
    RoughnessEntry {
        material: Material::Galvanized,
        new_m: 0.000_5 * FT,
        aged_m: 1.0e-3,
        hw_c_new: 120.0,
        hw_c_aged: 100.0,
        source: "roughness: Moody (1944), Trans. ASME 66, Fig. 2, galvanized iron 0.0005 ft; C = 120: Williams & Hazen, Hydraulic Tables, 3rd ed. (1920) (from memory)",
        aged_note: "common practice: zinc coating consumed and tuberculation started, about 20 years; as aged steel",
    },
    RoughnessEntry {
        material: Material::Pvc,
        new_m: 0.000_005 * FT,
        aged_m: 1.5e-5,
        hw_c_new: 150.0,
        hw_c_aged: 140.0,
        source: "roughness: Moody (1944), Trans. ASME 66, Fig. 2, drawn tubing 0.000005 ft (hydraulically smooth); C = 150: Uni-Bell PVC Pipe Association, Handbook of PVC Pipe (from memory)",
        aged_note: "common practice: allowance for slime and joints after long service; 0.015 mm and C = 140",
    },
    RoughnessEntry {
        material: Material::Copper,
        new_m: 0.000_005 * FT,
        aged_m: 1.5e-5,
        hw_c_new: 140.0,
        hw_c_aged: 130.0,
        source: "roughness: Moody (1944), Trans. ASME 66, Fig. 2, drawn tubing 0.000005 ft; C = 140 common practice (from memory)",
        aged_note: "common practice: oxide film and light scale; 0.015 mm and C = 130",
    },
    RoughnessEntry {
        material: Material::DuctileIron,
        new_m: 0.000_85 * FT,
        aged_m: 1.5e-3,
        hw_c_new: 130.0,
        hw_c_aged: 100.0,
        source: "roughness: Moody (1944), Trans. ASME 66, Fig. 2, cast iron 0.00085 ft (bare iron bore); C = 130 new unlined iron: Williams & Hazen, Hydraulic Tables, 3rd ed. (1920) (from memory)",
        aged_note: "common practice: unlined iron after about 20 years with tuberculation, C = 100; 1.5 mm roughness (C = 100 is about 1.1 mm at 150 mm, more at larger sizes)",
    },
    RoughnessEntry {
        material: Material::CementLinedDuctileIron,
        new_m: 6.0e-5,
        aged_m: 1.5e-4,
        hw_c_new: 140.0,
        hw_c_aged: 130.0,
        source: "C = 140: AWWA Manual M41, Ductile-Iron Pipe and Fittings (design value for cement-mortar-lined pipe, from memory); roughness 0.06 mm chosen to match C = 140 at 150 mm",
        aged_note: "C = 130 retained by cement-lined iron after decades (DIPRA, Bonds, \"Cement-mortar linings for ductile iron pipe\": 1922 Charleston main tested at C = 130 in 1999); roughness 0.15 mm matches C = 130 at 150 mm",
    },
    RoughnessEntry {
        material: Material::Hdpe,
        new_m: 0.000_005 * FT,
        aged_m: 1.5e-5,
        hw_c_new: 150.0,
        hw_c_aged: 140.0,
        source: "roughness 0.000005 ft and C = 150-155: PPI, Handbook of Polyethylene Pipe, 2nd ed. (2008), ch. 6 (from memory); same value as Moody's drawn tubing",
        aged_note: "common practice: PE does not corrode; allowance for slime and fusion beads, 0.015 mm and C = 140",
    },
    RoughnessEntry {
        material: Material::CastIron,
        new_m: 0.000_85 * FT,
        aged_m: 2.0e-3,
        hw_c_new: 130.0,
        hw_c_aged: 90.0,
        source: "roughness: Moody (1944), Trans. ASME 66, Fig. 2, cast iron 0.00085 ft; C = 130 new: Williams & Hazen, Hydraulic Tables, 3rd ed. (1920) (from memory)",
        aged_note: "common practice: unlined cast iron after about 30 years (Williams & Hazen tabulate C falling to about 90-100 by 20-30 years, from memory); 2.0 mm roughness matches C = 90 at 150 mm",
    },
    RoughnessEntry {
        material: Material::Concrete,
        new_m: 0.001 * FT,
        aged_m: 6.0e-4,
        hw_c_new: 130.0,
        hw_c_aged: 110.0,
        source: "roughness: Moody (1944), Trans. ASME 66, Fig. 2, concrete 0.001-0.01 ft, smooth end of the range; C = 130 common practice for good concrete pipe (from memory)",
        aged_note: "common practice: surface wear and deposits; C = 110, roughness 0.6 mm (inside Moody's range) matches C = 110 at 150 mm",
    },
];

/// The roughness entry for a material, or `None` for [`Material::Other`] (whose
/// roughness must be given explicitly; there is no default to fall back on).
pub fn roughness(material: Material) -> Option<&'static RoughnessEntry> {
    TABLE.iter().find(|e| e.material == material)
}

/// Every roughness entry (all materials except [`Material::Other`]).
pub fn roughness_table() -> &'static [RoughnessEntry] {
    TABLE
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn every_material_but_other_has_one_entry() {
        for m in Material::all() {
            let count = TABLE.iter().filter(|e| e.material == *m).count();
            let expected = usize::from(*m != Material::Other);
            assert_eq!(count, expected, "{m:?}");
        }
        assert!(roughness(Material::Other).is_none());
    }

    #[test]
    fn moody_values_convert_exactly() {
        let steel = roughness(Material::Steel).map(|e| e.new_m);
        assert!((steel.unwrap_or(0.0) - 4.572e-5).abs() < 1e-15); // Moody (1944): 0.00015 ft = 0.04572 mm
        let cast = roughness(Material::CastIron).map(|e| e.new_m);
        assert!((cast.unwrap_or(0.0) - 2.5908e-4).abs() < 1e-12); // Moody (1944): 0.00085 ft
    }

    #[test]
    fn ageing_never_improves_a_pipe() {
        for e in TABLE {
            assert!(e.aged_m >= e.new_m, "{:?}", e.material);
            assert!(e.hw_c_aged <= e.hw_c_new, "{:?}", e.material);
            assert!(e.new_m > 0.0 && e.hw_c_aged > 0.0);
        }
    }
}
