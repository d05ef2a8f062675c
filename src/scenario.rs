//! The scenario: everything a plan is computed from, as one serde document with a schema version.
//!
//! A scenario is what the user enters and saves; a [`crate::plan::Plan`] is what the core computes
//! from it. The JSON form is documented field by field in `demo-loads/README.md`.

pub mod document;
pub mod link;
pub mod validation;

pub use document::*;
pub use validation::{parse_scenario, validate};
