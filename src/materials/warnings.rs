//! Warnings a practitioner needs from the material data: thermal runaway risk and penetration depth
//! against bed depth.
//!
//! Runaway: where d(eps'')/dT > 0 over the process range, a hotter spot absorbs more power
//! (P_v = 2 pi f eps0 eps'' E^2), heats faster still, and can run away (thawed spots in tempering,
//! salted foods, alumina, nylon; shared/sources.md 9.4). The check samples eps'' every 0.5 K (at
//! least 8 samples) between the two states and reports the rising stretch with the largest rise.
//! Severity (common practice thresholds, not a published criterion): rise ratio eps''_hi/eps''_lo
//! >= 3 "high", >= 1.3 "moderate", above 1.02 "low"; smaller rises are treated as flat.
//!
//! Penetration depth vs bed depth: with the power falling as exp(-z/Dp) from a face, a bed of depth d
//! fed from one side gets exp(-d/Dp) of the surface power density at its far face; fed from both
//! sides the middle gets 2 exp(-d/(2 Dp)) / (1 + exp(-d/Dp)) of the face value (two equal incoherent
//! waves). Common practice: d <= Dp (one side) or d <= 2 Dp (two sides) heats acceptably evenly;
//! beyond 3 Dp the core is heated mainly by conduction.

use crate::error::{require_positive, InputError};
use crate::materials::{permittivity_value, Material, MaterialState};
use serde::Serialize;

/// Ratio of rise below which eps'' is taken as flat.
pub const RISE_FLAT_RATIO: f64 = 1.02;
/// Ratio from which the rise is "moderate".
pub const RISE_MODERATE_RATIO: f64 = 1.3;
/// Ratio from which the rise is "high".
pub const RISE_HIGH_RATIO: f64 = 3.0;
/// Temperature step of the sampling, K.
const SAMPLE_STEP_K: f64 = 0.5;
/// Fewest samples taken between the two states.
const SAMPLES_MIN: usize = 8;
/// Most samples taken (the full -60..300 degC range at 0.5 K).
const SAMPLES_MAX: usize = 721;

/// How strongly eps'' rises.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "lowercase")]
pub enum Severity {
    /// Rise ratio below 1.3.
    Low,
    /// Rise ratio 1.3 to 3.
    Moderate,
    /// Rise ratio 3 or more.
    High,
}

/// A stretch of the process range where the loss factor rises with temperature.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct RunawayRisk {
    /// Start of the rising stretch, degC.
    pub temp_from_c: f64,
    /// End of the rising stretch, degC.
    pub temp_to_c: f64,
    /// eps'' at the start.
    pub eps_imag_from: f64,
    /// eps'' at the end.
    pub eps_imag_to: f64,
    /// eps''_to / eps''_from.
    pub rise_ratio: f64,
    /// Steepest d(eps'')/dT in the stretch, 1/K.
    pub max_slope_per_k: f64,
    /// Severity by the module's thresholds.
    pub severity: Severity,
    /// One sentence for the person planning the line.
    pub message: String,
}

/// Runaway risk of `material` at `frequency_hz` between two states (the temperatures define the
/// process range; moisture and salt are taken from `state_from` throughout). `None` when eps''
/// does not rise anywhere in the range.
pub fn runaway_risk(
    material: &Material,
    frequency_hz: f64,
    state_from: &MaterialState,
    state_to: &MaterialState,
) -> Result<Option<RunawayRisk>, InputError> {
    // Validate both ends through the lookup (it names the field and range); only eps'' is read, so
    // the lookups skip their texts.
    permittivity_value(material, frequency_hz, state_from)?;
    permittivity_value(material, frequency_hz, state_to)?;
    let (low, high) = if state_from.temp_c <= state_to.temp_c {
        (state_from.temp_c, state_to.temp_c)
    } else {
        (state_to.temp_c, state_from.temp_c)
    };
    let span = high - low;
    let count = ((span / SAMPLE_STEP_K).ceil() as usize + 1).clamp(SAMPLES_MIN, SAMPLES_MAX);
    let mut samples = Vec::with_capacity(count);
    for i in 0..count {
        let temp_c = low + span * i as f64 / (count - 1) as f64;
        let state = MaterialState { temp_c, ..*state_from };
        samples.push((temp_c, permittivity_value(material, frequency_hz, &state)?.eps_imag));
    }
    // Find the rising stretch (consecutive samples with rising eps'') with the largest ratio.
    let mut best: Option<(usize, usize, f64)> = None;
    let mut start = 0;
    for i in 1..=samples.len() {
        let rising = i < samples.len() && samples[i].1 > samples[i - 1].1;
        if !rising {
            let end = i - 1;
            if end > start {
                let from = samples[start].1;
                let to = samples[end].1;
                let ratio = if from > 0.0 { to / from } else { f64::INFINITY };
                if best.is_none_or(|(_, _, r)| ratio > r) {
                    best = Some((start, end, ratio));
                }
            }
            start = i;
        }
    }
    let Some((start, end, ratio)) = best else {
        return Ok(None);
    };
    if ratio < RISE_FLAT_RATIO {
        return Ok(None);
    }
    let max_slope = samples[start..=end]
        .windows(2)
        .map(|pair| (pair[1].1 - pair[0].1) / (pair[1].0 - pair[0].0))
        .fold(0.0, f64::max);
    let severity = if ratio >= RISE_HIGH_RATIO {
        Severity::High
    } else if ratio >= RISE_MODERATE_RATIO {
        Severity::Moderate
    } else {
        Severity::Low
    };
    let (t0, e0) = samples[start];
    let (t1, e1) = samples[end];
    let ratio_text = if ratio.is_finite() { format!("{ratio:.2}x") } else { "from zero".to_string() };
    let message = format!(
        "{}: the loss factor eps'' rises from {e0:.3} to {e1:.3} ({ratio_text}) between {t0:.1} and {t1:.1} °C at {:.2} MHz; hotter spots absorb more and can run away: control the end temperature, use pulsed power or equalizing holds",
        material.label,
        frequency_hz / 1e6
    );
    Ok(Some(RunawayRisk {
        temp_from_c: t0,
        temp_to_c: t1,
        eps_imag_from: e0,
        eps_imag_to: e1,
        rise_ratio: if ratio.is_finite() { ratio } else { f64::MAX },
        max_slope_per_k: max_slope,
        severity,
        message,
    }))
}

/// How evenly a bed of product heats for its penetration depth.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize)]
#[serde(rename_all = "snake_case")]
pub enum BedVerdict {
    /// Bed depth up to Dp: even enough fed from one side.
    Even,
    /// Up to 2 Dp: feed from both sides (top and bottom).
    FeedBothSides,
    /// Up to 3 Dp: uneven even from both sides; thinner bed or lower frequency.
    Uneven,
    /// Beyond 3 Dp: the core heats mainly by conduction.
    SurfaceHeating,
    /// The material is practically transparent (no loss): it will hardly heat.
    Transparent,
}

/// Penetration depth against bed depth.
#[derive(Debug, Clone, PartialEq, Serialize)]
pub struct BedDepthCheck {
    /// Bed depth / Dp (0 for a lossless material).
    pub depth_ratio: f64,
    /// Power density at the far face / at the fed face, fed from one side: exp(-d/Dp).
    pub far_face_power_ratio_one_side: f64,
    /// Power density in the middle / at the faces, fed from both sides.
    pub middle_power_ratio_two_sides: f64,
    /// Fraction of the entering power absorbed in one pass, 1 - exp(-d/Dp) (one side).
    pub absorbed_fraction_one_pass: f64,
    /// The verdict.
    pub verdict: BedVerdict,
    /// One sentence for the person planning the line.
    pub message: String,
}

/// Compare a penetration depth (`None` = lossless) with a bed depth, both in m.
pub fn bed_depth_check(penetration_depth_m: Option<f64>, bed_depth_m: f64) -> Result<BedDepthCheck, InputError> {
    let bed = require_positive("bed_depth_m", bed_depth_m, 10.0)?;
    let Some(dp) = penetration_depth_m else {
        return Ok(BedDepthCheck {
            depth_ratio: 0.0,
            far_face_power_ratio_one_side: 1.0,
            middle_power_ratio_two_sides: 1.0,
            absorbed_fraction_one_pass: 0.0,
            verdict: BedVerdict::Transparent,
            message: "the material is lossless at this frequency: it will hardly heat".into(),
        });
    };
    // A nanometre floor: no dielectric has a smaller penetration depth, and below it bed / Dp
    // can overflow to infinity.
    let dp = crate::error::require_in("penetration_depth_m", dp, 1e-9, 1e9)?;
    let ratio = bed / dp;
    let far = (-ratio).exp();
    let middle = 2.0 * (-ratio / 2.0).exp() / (1.0 + far);
    let absorbed = 1.0 - far;
    let (verdict, advice) = if ratio > 3.0 {
        (
            BedVerdict::SurfaceHeating,
            "the surface takes most of the power and the core heats by conduction: use a thinner bed or a lower frequency",
        )
    } else if ratio > 2.0 {
        (BedVerdict::Uneven, "uneven even when fed from both sides: reduce the bed depth or use a lower frequency")
    } else if ratio > 1.0 {
        (BedVerdict::FeedBothSides, "feed from both sides (top and bottom) for even heating")
    } else if absorbed < 0.05 {
        (
            BedVerdict::Transparent,
            "the bed absorbs under 5 % per pass: it heats evenly but slowly and needs a resonant (multimode) applicator",
        )
    } else {
        (BedVerdict::Even, "heats evenly enough from one side")
    };
    Ok(BedDepthCheck {
        depth_ratio: ratio,
        far_face_power_ratio_one_side: far,
        middle_power_ratio_two_sides: middle,
        absorbed_fraction_one_pass: absorbed,
        verdict,
        message: format!(
            "bed depth {:.1} mm is {ratio:.2} x the penetration depth {:.1} mm: {advice}",
            1000.0 * bed,
            1000.0 * dp
        ),
    })
}

#[cfg(test)]
mod tests {
    use super::*;
    use crate::materials::library;
    use approx::assert_relative_eq;

    #[test]
    fn tempering_beef_is_a_high_runaway_risk() {
        // Frozen lean meat: eps'' jumps about tenfold across -5..0 degC (shared/sources.md 3.2).
        let beef = library().get("beef-lean").unwrap();
        let risk = runaway_risk(beef, 915e6, &MaterialState::at(-20.0), &MaterialState::at(-1.0)).unwrap().unwrap();
        assert_eq!(risk.severity, Severity::High);
        assert!(risk.temp_to_c > -3.0);
    }

    #[test]
    fn pure_water_heating_has_no_runaway_at_2450() {
        // Pure water's eps'' falls with temperature at 2450 MHz (Ellison 2007).
        let water = library().get("water").unwrap();
        let risk = runaway_risk(water, 2.45e9, &MaterialState::at(20.0), &MaterialState::at(90.0)).unwrap();
        assert_eq!(risk, None);
    }

    #[test]
    fn salted_water_at_rf_does_run_away() {
        // At 27.12 MHz brine loss is ionic, and conductivity rises about 2 %/K.
        let water = library().get("water").unwrap();
        let from = MaterialState { salt_pct: Some(2.0), ..MaterialState::at(20.0) };
        let to = MaterialState { temp_c: 80.0, ..from };
        let risk = runaway_risk(water, 27.12e6, &from, &to).unwrap().unwrap();
        assert!(risk.rise_ratio > 1.5, "{risk:?}");
    }

    #[test]
    fn bed_depth_verdicts() {
        let thin = bed_depth_check(Some(0.05), 0.02).unwrap();
        assert_eq!(thin.verdict, BedVerdict::Even);
        assert_relative_eq!(thin.far_face_power_ratio_one_side, (-0.4f64).exp(), max_relative = 1e-12);
        assert_eq!(bed_depth_check(Some(0.05), 0.08).unwrap().verdict, BedVerdict::FeedBothSides);
        assert_eq!(bed_depth_check(Some(0.01), 0.1).unwrap().verdict, BedVerdict::SurfaceHeating);
        assert_eq!(bed_depth_check(None, 0.1).unwrap().verdict, BedVerdict::Transparent);
        assert_eq!(bed_depth_check(Some(0.05), -1.0).unwrap_err().field, "bed_depth_m");
    }
}
