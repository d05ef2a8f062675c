//! Doubleprime's computation core: from a material and a throughput target to a dielectric heating plan.
//!
//! Architecture invariant: nothing under this crate root does I/O or knows about the browser.
//! Every function is value in, value out; the command-line tool (`src/main.rs`) and the browser
//! app (`src/web/`) are the only parts that touch the outside world, and both call this core.
#![warn(missing_docs)]
#![deny(clippy::unwrap_used)]

pub mod error;
pub mod export;
pub mod finite;
pub mod materials;
pub mod physics;
pub mod plan;
pub mod safety;
pub mod scenario;
pub mod search;
pub mod sizing;
pub mod timing;
