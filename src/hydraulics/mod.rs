//! Hydraulics: pipe dimension catalogue, wall roughness, friction factors and
//! fitting loss coefficients, and the pressure and height types ([`heads`]). Pure physics
//! and data; no I/O.
pub mod catalogue;
pub mod fittings;
pub mod flanges;
pub mod friction;
pub mod heads;
pub mod ratings;
pub mod roughness;
pub mod wave_speed;
