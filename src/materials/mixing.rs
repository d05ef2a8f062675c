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
    let mut prepared = [(0.0, Phase::Permittivity(Complex::ONE)); 8];
    if phases.len() > prepared.len() {
        let owned: Vec<(f64, Phase)> = phases.iter().map(|&(v, eps)| (v, Phase::Permittivity(eps))).collect();
        return mix_phases(&owned, rule);
    }
    for (slot, &(fraction, eps)) in prepared.iter_mut().zip(phases) {
        *slot = (fraction, Phase::Permittivity(eps));
    }
    mix_phases(&prepared[..phases.len()], rule)
}

/// A phase of a mixture: its permittivity, or its term in the power mean already worked out
/// ([`mixing_term`]), for a phase whose permittivity does not change between many mixtures.
#[derive(Debug, Clone, Copy, PartialEq)]
pub enum Phase {
    /// eps' - j eps''.
    Permittivity(Complex),
    /// [`mixing_term`] of the phase's permittivity under the rule it is mixed by.
    Term(Complex),
}

/// A phase's term in the power mean: eps^alpha, or ln eps under the logarithmic rule (alpha = 0).
pub fn mixing_term(eps: Complex, rule: MixingRule) -> Complex {
    let alpha = rule.exponent();
    if alpha == 0.0 {
        eps.ln()
    } else {
        eps.powf(alpha)
    }
}

/// [`mix`] with some phases given by their terms: the same mixture, bit for bit, as [`mix`] of
/// the permittivities the terms were worked out from.
pub fn mix_phases(phases: &[(f64, Phase)], rule: MixingRule) -> Complex {
    let total: f64 = phases.iter().map(|(v, _)| v.max(0.0)).filter(|v| v.is_finite()).sum();
    if total <= 0.0 || !total.is_finite() {
        return Complex::ONE;
    }
    let alpha = rule.exponent();
    let mut sum = Complex::ZERO;
    for &(fraction, phase) in phases {
        let v = fraction.max(0.0) / total;
        if v <= 0.0 || !v.is_finite() {
            continue;
        }
        let term = match phase {
            Phase::Permittivity(eps) => mixing_term(eps, rule),
            Phase::Term(term) => term,
        };
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
    fn terms_worked_out_beforehand_give_the_same_mixture_bit_for_bit() {
        // Four phases as the frozen-food model mixes them (ice, brine, fat, solids), one of them
        // empty, with fat and solids given by their terms.
        let (ice, brine, fat, solids) =
            (Complex::new(3.15, -0.003), Complex::new(55.0, -40.0), Complex::new(2.6, -0.2), Complex::new(2.5, -0.1));
        for rule in RULES {
            for ice_fraction in [0.0, 0.31] {
                let phases = [(ice_fraction, ice), (0.42, brine), (0.05, fat), (0.22, solids)];
                let prepared = [
                    (ice_fraction, Phase::Permittivity(ice)),
                    (0.42, Phase::Permittivity(brine)),
                    (0.05, Phase::Term(mixing_term(fat, rule))),
                    (0.22, Phase::Term(mixing_term(solids, rule))),
                ];
                let (plain, from_terms) = (mix(&phases, rule), mix_phases(&prepared, rule));
                assert_eq!(
                    (plain.re.to_bits(), plain.im.to_bits()),
                    (from_terms.re.to_bits(), from_terms.im.to_bits())
                );
            }
        }
        // More phases than the stack holds take the same path.
        let many: Vec<(f64, Complex)> = (1..=12).map(|i| (f64::from(i), Complex::real(f64::from(i)))).collect();
        let linear = mix(&many, MixingRule::Linear);
        assert_relative_eq!(linear.re, (1..=12).map(|i| f64::from(i * i)).sum::<f64>() / 78.0, max_relative = 1e-12);
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
