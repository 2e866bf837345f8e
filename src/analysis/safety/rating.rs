//! The governing pressure rating of each segment: the pipe's rating by its standard
//! ([`crate::hydraulics::ratings`]) or the rating the design gives, and the ratings of
//! the fittings on it; the weakest governs.

use uom::si::{length::meter, pressure::pascal};

use crate::hydraulics::ratings::{self, RatingInput};
use crate::model::Segment;

/// The rating that governs one segment.
#[derive(Clone, Debug, PartialEq)]
pub struct SegmentRating {
    /// Highest operating pressure allowed, Pa gauge (`None`: not rated).
    pub working: Option<f64>,
    /// Highest pressure allowed during a surge, Pa gauge.
    pub transient: Option<f64>,
    /// How the pipe's rating was found by its standard (`None`: stated or not rated).
    pub basis: Option<ratings::Basis>,
    /// What else governs, or why there is no rating, in words without numbers.
    pub note: String,
    /// The publication, or "given in the design".
    pub source: String,
}

impl SegmentRating {
    /// The basis in words: the standard's computation (numbers by `pressure`, Pa, and
    /// `length`, m) and the note.
    pub fn describe(
        &self,
        pressure: &dyn Fn(f64) -> String,
        length: &dyn Fn(f64) -> String,
    ) -> String {
        match (&self.basis, self.note.is_empty()) {
            (Some(b), true) => b.describe(pressure, length),
            (Some(b), false) => format!("{}; {}", self.note, b.describe(pressure, length)),
            (None, _) => self.note.clone(),
        }
    }
}

/// The governing rating of a model segment for a liquid at `temperature_k`.
pub fn segment_rating(seg: &Segment, temperature_k: Option<f64>) -> SegmentRating {
    let w = &seg.wall;
    let mut out = match w.rating {
        Some(r) => SegmentRating {
            working: Some(r.get::<pascal>()),
            transient: Some(r.get::<pascal>()),
            basis: None,
            note: "pipe rating given in the design (no surge allowance added)".into(),
            source: "given in the design".into(),
        },
        None => {
            let input = RatingInput {
                material: Some(seg.material),
                outer_diameter: w.outer_diameter.map(|d| d.get::<meter>()),
                wall: w.thickness.map(|t| t.get::<meter>()),
                designation: w.designation.as_deref(),
                threaded: w.threaded,
                corrosion_allowance: w.corrosion_allowance.map(|c| c.get::<meter>()),
                temperature_k,
                m11: w.m11,
                yield_strength: w.yield_strength.map(|y| y.get::<pascal>()),
            };
            match ratings::pipe_rating(&input) {
                Ok(r) => SegmentRating {
                    working: Some(r.working_pa),
                    transient: Some(r.transient_pa),
                    basis: Some(r.basis),
                    note: String::new(),
                    source: r.source.to_string(),
                },
                Err(why) => SegmentRating {
                    working: None,
                    transient: None,
                    basis: None,
                    note: why,
                    source: String::new(),
                },
            }
        }
    };
    if let Some(class) = w.flanges {
        flanges_govern(&mut out, class, seg, temperature_k);
    }
    for f in &seg.fittings {
        let Some(r) = f.rating.map(|r| r.get::<pascal>()) else {
            continue;
        };
        if out.working.is_none_or(|w| r < w) {
            out.working = Some(r);
            out.note = format!(
                "the {} (rated in the design) is weaker than the pipe and governs",
                f.spec
                    .description
                    .split(" (")
                    .next()
                    .unwrap_or(f.spec.description)
            );
            out.source = "given in the design".into();
        }
        if out.transient.is_none_or(|t| r < t) {
            out.transient = Some(r);
        }
    }
    out
}

/// The segment's flanges by their standard (ASME B16.5, B16.1, AWWA C207): where weaker
/// than the pipe they govern (steady and transient alike: a flange rating has no surge
/// allowance); above their tabulated temperature the segment is not rated.
fn flanges_govern(
    out: &mut SegmentRating,
    class: crate::hydraulics::flanges::FlangeClass,
    seg: &Segment,
    temperature_k: Option<f64>,
) {
    use crate::hydraulics::flanges::flange_rating;
    let od = seg
        .wall
        .outer_diameter
        .unwrap_or(seg.inner_diameter)
        .get::<meter>();
    match flange_rating(
        class,
        od,
        temperature_k.unwrap_or(crate::hydraulics::ratings::REFERENCE_73_F_K),
    ) {
        Ok(r) => {
            if out.working.is_none_or(|w| r < w) {
                out.working = Some(r);
                out.note = format!(
                    "the {} are weaker than the pipe and govern",
                    class.description()
                );
                out.source = class.source().to_string();
            } else {
                out.source = format!("{}; {}", out.source, class.source());
            }
            if out.transient.is_none_or(|t| r < t) {
                out.transient = Some(r);
                if !out.note.contains(class.description()) {
                    out.note = format!("the {} limit the transient pressure", class.description());
                }
            }
        }
        Err(why) => {
            out.working = None;
            out.transient = None;
            out.note = why;
        }
    }
}
