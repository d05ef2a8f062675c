//! Input errors that name the field, the value given and the valid range.
//!
//! The core never panics on user input: every public entry point checks its numbers with these
//! helpers and returns an [`InputError`] (or a list of them) instead.

use serde::Serialize;
use std::fmt;

/// A value the core refuses, written for the person at the form.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct InputError {
    /// The field or argument name, as the user sees it (`freq_mhz`, `product.density_kg_per_m3`).
    pub field: String,
    /// The offending value as text (`"-3"`, `"NaN"`, `"\"granite\""`).
    pub value: String,
    /// What would have been accepted, in words (`"0.001 to 100000"`).
    pub valid: String,
}

impl InputError {
    /// An error for `field` holding `value`, which should have been `valid`.
    pub fn new(field: impl Into<String>, value: impl fmt::Display, valid: impl Into<String>) -> Self {
        Self { field: field.into(), value: value.to_string(), valid: valid.into() }
    }

    /// The same error with its field name prefixed, for nested documents (`product.` + `density`).
    pub fn within(mut self, prefix: &str) -> Self {
        self.field = format!("{prefix}.{}", self.field);
        self
    }
}

impl fmt::Display for InputError {
    fn fmt(&self, f: &mut fmt::Formatter<'_>) -> fmt::Result {
        write!(f, "{} = {} is not accepted: valid is {}", self.field, self.value, self.valid)
    }
}

impl std::error::Error for InputError {}

/// `text` in double quotes with quotes, backslashes and control characters escaped, for echoing
/// a user's text in a message. Not `{:?}`: the wasm build compiles Debug formatting out
/// (`-Zfmt-debug=none`, see .ci/build-web.sh), and a message must not lose the value it names.
pub fn quoted(text: &str) -> String {
    format!("\"{}\"", text.escape_debug())
}

/// Format a range for messages, trimming needless decimals (`0.001 to 100000`).
pub fn range_text(min: f64, max: f64) -> String {
    format!("{} to {}", short_number(min), short_number(max))
}

fn short_number(x: f64) -> String {
    // Plain decimals for the ranges people type (down to a micrometre in metres); exponent form
    // only for the extremes, where a row of zeros would be harder to read.
    if x == 0.0 || (x.is_finite() && x.abs() >= 1e-6 && x.abs() < 1e7) {
        let text = format!("{x:.9}");
        text.trim_end_matches('0').trim_end_matches('.').to_string()
    } else {
        format!("{x:e}")
    }
}

/// Accept `value` if it is finite and `min <= value <= max`.
pub fn require_in(field: &str, value: f64, min: f64, max: f64) -> Result<f64, InputError> {
    if value.is_finite() && value >= min && value <= max {
        Ok(value)
    } else {
        Err(InputError::new(field, value, range_text(min, max)))
    }
}

/// Accept `value` if it is finite and `0 < value <= max`.
pub fn require_positive(field: &str, value: f64, max: f64) -> Result<f64, InputError> {
    if value.is_finite() && value > 0.0 && value <= max {
        Ok(value)
    } else {
        Err(InputError::new(field, value, format!("more than 0 and at most {}", short_number(max))))
    }
}

#[cfg(test)]
mod tests {
    use super::*;

    #[test]
    fn nan_and_infinity_are_refused_with_the_field_named() {
        for bad in [f64::NAN, f64::INFINITY, f64::NEG_INFINITY] {
            let error = require_in("freq_mhz", bad, 1.0, 10.0).unwrap_err();
            assert_eq!(error.field, "freq_mhz");
            assert!(error.to_string().contains("1 to 10"), "{error}");
        }
    }

    #[test]
    fn ranges_read_as_typed() {
        assert_eq!(range_text(0.0005, 2.0), "0.0005 to 2");
        assert_eq!(range_text(0.0, 1e6), "0 to 1000000");
        assert_eq!(range_text(1e-9, 3e8), "1e-9 to 3e8");
    }

    #[test]
    fn bounds_are_inclusive_and_zero_is_not_positive() {
        assert_eq!(require_in("x", 1.0, 1.0, 2.0), Ok(1.0));
        assert_eq!(require_in("x", 2.0, 1.0, 2.0), Ok(2.0));
        assert!(require_positive("x", 0.0, 2.0).is_err());
        assert!(require_positive("x", 2.5, 2.0).is_err());
    }
}
