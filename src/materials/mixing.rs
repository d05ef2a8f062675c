//! Dielectric mixing rules of the Birchak power-law family, for moist and frozen materials.
//!
//!   eps_mix^alpha = sum_i v_i eps_i^alpha        (v_i volume fractions, sum v_i = 1)
//! Birchak, Gardner, Hipp & Victor, "High dielectric constant microwave probes for sensing soil
//! moisture", Proc. IEEE 62(1):93-98 (1974); Lichtenecker & Rother, Phys. Z. 32:255 (1931).
//! - alpha = 1:   linear (volume-weighted average; an upper bound for layers parallel to the field);
//! - alpha = 1/2: CRIM, complex refractive index model (Birchak et al. 1974);
//! - alpha = 1/3: Looyenga (H. Looyenga, Physica 31:401, 1965; Landau-Lifshitz-Looyenga);
//! - alpha -> 0:  Lichtenecker logarithmic rule, ln eps_mix = sum_i v_i ln eps_i (Lichtenecker 1926).
//!
//! Complex powers use the principal branch (shared/sources.md 5). Assumptions: isotropic random
//! mixture, no interaction between phases; bound water at low moisture has a lower permittivity than
//! free water, so these rules over-predict eps'' of nearly dry materials.

use crate::physics::complex::Complex;
use serde::{Deserialize, Serialize};

/// A named mixing rule of the power-law family.
#[derive(Debug, Clone, Copy, PartialEq, Eq, Serialize, Deserialize)]
#[serde(rename_all = "lowercase")]
pub enum MixingRule {
    /// alpha = 1, volume average.
    Linear,
    /// alpha = 1/2, complex refractive index model (Birchak et al. 1974).
    Crim,
    /// alpha = 1/3, Looyenga (1965).
    Looyenga,
    /// alpha -> 0, Lichtenecker's logarithmic rule.
    Lichtenecker,
}

impl MixingRule {
    /// The exponent alpha (0 for the logarithmic rule).
    pub fn exponent(self) -> f64 {
        match self {
            MixingRule::Linear => 1.0,
            MixingRule::Crim => 0.5,
            MixingRule::Looyenga => 1.0 / 3.0,
            MixingRule::Lichtenecker => 0.0,
        }
    }

    /// The rule's name and source, for the `model` text of a lookup.
    pub fn citation(self) -> &'static str {
        match self {
            MixingRule::Linear => "linear volume average (Birchak power law, alpha = 1)",
            MixingRule::Crim => "CRIM (Birchak et al., Proc. IEEE 62:93, 1974; alpha = 1/2)",
            MixingRule::Looyenga => "Looyenga (Physica 31:401, 1965; alpha = 1/3)",
            MixingRule::Lichtenecker => "Lichtenecker logarithmic rule (alpha -> 0)",
        }
    }
}

/// Mix phases given as (volume fraction, eps' - j eps''). Fractions are renormalized to sum to 1;
/// phases with zero fraction are skipped. Returns vacuum for an empty mixture.
pub fn mix(phases: &[(f64, Complex)], rule: MixingRule) -> Complex {
    let total: f64 = phases.iter().map(|(v, _)| v.max(0.0)).filter(|v| v.is_finite()).sum();
    if total <= 0.0 || !total.is_finite() {
        return Complex::ONE;
    }
    let alpha = rule.exponent();
    let mut sum = Complex::ZERO;
    for &(fraction, eps) in phases {
        let v = fraction.max(0.0) / total;
        if v <= 0.0 || !v.is_finite() {
            continue;
        }
        let term = if alpha == 0.0 { eps.ln() } else { eps.powf(alpha) };
        sum = sum + term.scale(v);
    }
    if alpha == 0.0 {
        sum.exp()
    } else {
        sum.powf(1.0 / alpha)
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    const RULES: [MixingRule; 4] =
        [MixingRule::Linear, MixingRule::Crim, MixingRule::Looyenga, MixingRule::Lichtenecker];

    #[test]
    fn a_single_phase_is_returned_unchanged_by_every_rule() {
        // Limits "all water" and "no water": the mixture of one phase is that phase (exact).
        let water = Complex::new(78.0, -10.0);
        let dry = Complex::new(2.5, -0.05);
        for rule in RULES {
            for eps in [water, dry] {
                let mixed = mix(&[(1.0, eps), (0.0, Complex::ONE)], rule);
                assert_relative_eq!(mixed.re, eps.re, max_relative = 1e-12);
                assert_relative_eq!(mixed.im, eps.im, max_relative = 1e-12);
            }
        }
    }

    #[test]
    fn crim_soil_example() {
        // Pedophysics `LR` docstring example (a code example, not a paper; shared/sources.md 5):
        // porosity 1 - 1.3/2.65, water content 0.3, eps air 1, solid 4, water 80, alpha = 0.5 -> 15.006.
        let porosity = 1.0 - 1.3 / 2.65;
        let phases =
            [(0.3, Complex::real(80.0)), (porosity - 0.3, Complex::real(1.0)), (1.0 - porosity, Complex::real(4.0))];
        assert_relative_eq!(mix(&phases, MixingRule::Crim).re, 15.006_70, max_relative = 1e-5);
    }

    #[test]
    fn rules_are_ordered_by_exponent_for_real_permittivities() {
        // For real, positive eps the power mean rises with its exponent (a standard inequality).
        let phases = [(0.4, Complex::real(80.0)), (0.6, Complex::real(3.0))];
        let values: Vec<f64> = RULES.iter().map(|rule| mix(&phases, *rule).re).collect();
        for pair in values.windows(2) {
            assert!(pair[0] > pair[1], "{values:?}");
        }
    }

    #[test]
    fn linear_rule_is_the_volume_average() {
        let phases = [(0.25, Complex::new(80.0, -12.0)), (0.75, Complex::new(4.0, -0.4))];
        let mixed = mix(&phases, MixingRule::Linear);
        assert_relative_eq!(mixed.re, 23.0, max_relative = 1e-12);
        assert_relative_eq!(mixed.im, -3.3, max_relative = 1e-12);
    }
}
