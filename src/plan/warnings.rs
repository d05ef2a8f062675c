//! Warnings: "computed, but look at this". Each has a stable code for scripts and a message that
//! says what is weak and what to change.

use serde::Serialize;

/// One warning on a plan.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct Warning {
    /// Stable identifier (`bed_deeper_than_penetration`).
    pub code: &'static str,
    /// What is weak and what to change, in words for the person at the form.
    pub message: String,
}

impl Warning {
    /// A warning with its code and message.
    pub fn new(code: &'static str, message: impl Into<String>) -> Self {
        Self { code, message: message.into() }
    }
}

/// Bed depth over penetration depth above which a top-fed bed heats unevenly: the bottom then
/// gets less than 1/e of the surface power density (common practice: keep d <= Dp per fed face).
pub const BED_OVER_DP_LIMIT_ONE_SIDE: f64 = 1.0;
/// The same for a bed fed from both faces: d <= 2 Dp (common practice).
pub const BED_OVER_DP_LIMIT_TWO_SIDES: f64 = 2.0;
/// Running point below which a generator is oversized for its share (common practice).
pub const LOW_OPERATING_FRACTION: f64 = 0.4;
/// Mean RMS field in the product above which arcing in the air around it is a real risk, V/m:
/// a tenth of the ~3 MV/m breakdown of dry air at 1 atm (shared/sources.md 9.5, from memory), the
/// margin practice keeps for edge enhancement, humidity and vapour.
pub const FIELD_ARCING_CONCERN_V_PER_M: f64 = 3.0e5;
/// Loss factor below which a product couples poorly and the applicator efficiency assumed is
/// optimistic (common practice).
pub const LOW_LOSS_FACTOR: f64 = 0.05;
/// Tunnel length beyond which the line is unusually long for one conveyor, m (common practice).
pub const LONG_TUNNEL_M: f64 = 40.0;
/// Margin below the initial freezing point within which a tempering outlet is too close: the
/// enthalpy curve is steep there and small errors thaw the surface (common practice).
pub const TEMPERING_MARGIN_K: f64 = 1.0;
