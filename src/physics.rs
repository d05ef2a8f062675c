//! Physics of dielectric heating: constants, complex arithmetic, waves in lossy media, heating and bands.

pub mod bands;
pub mod complex;
pub mod constants;
pub mod heating;
pub mod layers;
pub mod permittivity;
pub mod waves;
