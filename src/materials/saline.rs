//! Salt water (NaCl solutions and the brine in salted foods): ionic conductivity and permittivity.
//!
//!   eps_brine(f, t, w) = eps_water(f, t; Delta x k(N), tau x b(N, t)) - j sigma(t, w) / (2 pi f eps0)
//! where w is the NaCl mass fraction of the solution, N its normality (mol/L) and m its molality
//! (mol/kg water).
//!
//! Conductivity sigma(t, m), S/m:
//! - 25 degC and above: Sen & Goode (1992), "Influence of temperature on electrical conductivity
//!   of shaly sands", Geophysics 57(1):89-96, as used in public petrophysics code:
//!   sigma = (5.6 + 0.27 t - 1.5e-4 t^2) m - (2.36 + 0.099 t) / (1 + 0.214 sqrt(m)) m^1.5.
//!   Fitted to NaCl solutions 20-200 degC, up to about 5 mol/kg.
//! - below 25 degC: its 25 degC value times the temperature ratio exp(-Delta beta) of Stogryn (1971)
//!   as given by Klein & Swift (1977), IEEE Trans. Antennas Propag. AP-25(1):104-111 (Delta = 25 - t,
//!   S in g/kg): beta = 2.0333e-2 + 1.266e-4 Delta + 2.464e-6 Delta^2 - S (1.849e-5 -
//!   2.551e-7 Delta + 2.551e-8 Delta^2). Sen & Goode's form turns negative below about 0 degC, the Stogryn ratio does
//!   not, and the two agree in slope at 25 degC (2.0 vs 2.2 %/K for 1 % NaCl). Below -2 degC (only
//!   the concentrated brine of frozen foods) it is an extrapolation.
//!
//! Dipolar part: Stogryn (1971), IEEE Trans. MTT-19:733-736, normality factors (shared/sources.md 2,
//! read in public code): eps_s(N) = eps_s(0) a(N), a = 1 - 0.2551 N + 5.151e-2 N^2 - 6.889e-3 N^3;
//! tau(N) = tau(0) b(N, t), b = 0.1463e-2 N t + 1 - 0.04896 N - 0.02967 N^2 + 5.644e-3 N^3. Applied
//! here to the Ellison (2007) pure-water relaxations (all three strengths scaled so that eps_s falls
//! by a, all three times by b): a combination of two published models, not a published model itself.
//! The cubic fits are used up to N = 3 (about 16 % NaCl, from memory of Stogryn's range); above it
//! they are held at N = 3 and the caller is told ([`BrinePermittivity::dipolar_held`]).
//!
//! Solution density (for N), kg/m^3: rho = 998.2 + 6.95 W + 0.025 W^2 with W = 100 w, a fit to the CRC
//! Handbook table of NaCl solutions at 20 degC (from memory: 1 % 1005.3, 10 % 1070.7, 20 % 1147.8,
//! 26 % 1197.2; the fit is within 0.2 %). Saturation: 26.4 % NaCl at 20 degC; this module accepts
//! w up to 0.264.

use crate::materials::water;
use crate::physics::complex::Complex;
use crate::physics::constants::VACUUM_PERMITTIVITY_F_PER_M;
use std::f64::consts::PI;

/// Molar mass of NaCl, kg/mol.
pub const NACL_MOLAR_MASS_KG_PER_MOL: f64 = 0.058_443;
/// Saturated NaCl solution at 20 degC, mass fraction (CRC Handbook, from memory).
pub const SATURATION_MASS_FRACTION: f64 = 0.264;
/// Eutectic of NaCl-water: 23.3 % NaCl at -21.1 degC (from memory, textbook phase diagram). In a
/// frozen food the unfrozen brine cannot be more concentrated than this; more salt crystallizes.
pub const EUTECTIC_MASS_FRACTION: f64 = 0.233;
/// Highest normality the Stogryn (1971) dipolar factors are used at, mol/L.
pub const DIPOLAR_NORMALITY_MAX: f64 = 3.0;

/// Density of an NaCl solution at 20 degC, kg/m^3 (fit to the CRC table, see the module text).
pub fn solution_density_kg_per_m3(mass_fraction: f64) -> f64 {
    let percent = 100.0 * mass_fraction;
    998.2 + 6.95 * percent + 0.025 * percent * percent
}

/// Molality m of an NaCl solution, mol per kg of water.
pub fn molality_mol_per_kg(mass_fraction: f64) -> f64 {
    let w = mass_fraction.clamp(0.0, SATURATION_MASS_FRACTION);
    w / (NACL_MOLAR_MASS_KG_PER_MOL * (1.0 - w))
}

/// Normality N (= molarity for NaCl) of a solution, mol/L.
pub fn normality_mol_per_l(mass_fraction: f64) -> f64 {
    let w = mass_fraction.clamp(0.0, SATURATION_MASS_FRACTION);
    w * solution_density_kg_per_m3(w) / NACL_MOLAR_MASS_KG_PER_MOL / 1000.0
}

/// Sen & Goode (1992) conductivity, S/m, at `temp_c` (>= 20 degC) and molality `m`.
fn sen_goode_s_per_m(temp_c: f64, molality: f64) -> f64 {
    let t = temp_c;
    let m = molality;
    (5.6 + 0.27 * t - 1.5e-4 * t * t) * m - (2.36 + 0.099 * t) / (1.0 + 0.214 * m.sqrt()) * m.powf(1.5)
}

/// Stogryn (1971) / Klein & Swift (1977) conductivity ratio sigma(t)/sigma(25 degC).
fn stogryn_temperature_ratio(temp_c: f64, salinity_g_per_kg: f64) -> f64 {
    let delta = 25.0 - temp_c;
    let s = salinity_g_per_kg;
    let beta = 2.0333e-2 + 1.266e-4 * delta + 2.464e-6 * delta * delta
        - s * (1.849e-5 - 2.551e-7 * delta + 2.551e-8 * delta * delta);
    (-delta * beta).exp()
}

/// Ionic conductivity of an NaCl solution of mass fraction `mass_fraction` at `temp_c`, S/m.
/// Zero for pure water (its own conductivity, about 5.5e-6 S/m, is negligible here).
pub fn conductivity_s_per_m(temp_c: f64, mass_fraction: f64) -> f64 {
    let w = mass_fraction.clamp(0.0, SATURATION_MASS_FRACTION);
    if w <= 0.0 {
        return 0.0;
    }
    let m = molality_mol_per_kg(w);
    let sigma = if temp_c >= 25.0 {
        sen_goode_s_per_m(temp_c, m)
    } else {
        sen_goode_s_per_m(25.0, m) * stogryn_temperature_ratio(temp_c, 1000.0 * w)
    };
    sigma.max(0.0)
}

/// Stogryn (1971) factors (a, b) for eps_s and tau at normality `n` and `temp_c`.
pub fn stogryn_dipolar_factors(normality: f64, temp_c: f64) -> (f64, f64) {
    let n = normality;
    let a = 1.0 - 0.2551 * n + 5.151e-2 * n * n - 6.889e-3 * n * n * n;
    let b = 0.1463e-2 * n * temp_c + 1.0 - 0.04896 * n - 0.02967 * n * n + 5.644e-3 * n * n * n;
    (a, b)
}

/// The permittivity of a brine and how it was obtained.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct BrinePermittivity {
    /// eps' - j eps'' including the conduction loss.
    pub eps: Complex,
    /// Ionic conductivity used, S/m.
    pub conductivity_s_per_m: f64,
    /// True when the solution is stronger than N = 3 and the dipolar factors were held there.
    pub dipolar_held: bool,
}

/// Permittivity of an NaCl solution of mass fraction `mass_fraction` (0 = pure water) at
/// `frequency_hz` and `temp_c`. With `conductivity_override_s_per_m` the ionic loss uses that
/// conductivity instead of the NaCl model (the salt still depresses the dipolar part).
pub fn permittivity(
    frequency_hz: f64,
    temp_c: f64,
    mass_fraction: f64,
    conductivity_override_s_per_m: Option<f64>,
) -> BrinePermittivity {
    let w = mass_fraction.clamp(0.0, SATURATION_MASS_FRACTION);
    let normality = normality_mol_per_l(w);
    let dipolar_held = normality > DIPOLAR_NORMALITY_MAX;
    let (a, b) = stogryn_dipolar_factors(normality.min(DIPOLAR_NORMALITY_MAX), temp_c);
    let params = water::parameters(temp_c);
    let relaxed: f64 = params.strengths.iter().sum();
    let eps_high = params.static_permittivity - relaxed;
    // Scale the relaxing part so that the static permittivity becomes a x eps_s(0).
    let strength_factor = ((a * params.static_permittivity - eps_high) / relaxed).max(0.0);
    let time_factor = b.max(0.05);
    let dipolar = water::permittivity_scaled(frequency_hz, temp_c, strength_factor, time_factor);
    let sigma = conductivity_override_s_per_m.unwrap_or_else(|| conductivity_s_per_m(temp_c, w));
    let conduction_loss = sigma / (2.0 * PI * frequency_hz * VACUUM_PERMITTIVITY_F_PER_M);
    BrinePermittivity { eps: dipolar - Complex::new(0.0, conduction_loss), conductivity_s_per_m: sigma, dipolar_held }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn pure_water_is_unchanged() {
        let brine = permittivity(2.45e9, 25.0, 0.0, None);
        let pure = water::permittivity(2.45e9, 25.0);
        assert_relative_eq!(brine.eps.re, pure.re, max_relative = 1e-12);
        assert_relative_eq!(brine.eps.im, pure.im, max_relative = 1e-12);
        assert_eq!(brine.conductivity_s_per_m, 0.0);
    }

    #[test]
    fn conductivity_is_continuous_at_25_c() {
        for w in [0.005, 0.02, 0.1, 0.26] {
            let below = conductivity_s_per_m(25.0 - 1e-9, w);
            let above = conductivity_s_per_m(25.0, w);
            assert_relative_eq!(below, above, max_relative = 1e-6);
        }
    }

    #[test]
    fn conductivity_rises_with_temperature_and_concentration() {
        let mut previous = 0.0;
        for t in [-20.0, -5.0, 0.0, 10.0, 25.0, 50.0, 80.0, 100.0] {
            let sigma = conductivity_s_per_m(t, 0.02);
            assert!(sigma > previous, "{t}: {sigma}");
            previous = sigma;
        }
        assert!(conductivity_s_per_m(20.0, 0.05) > conductivity_s_per_m(20.0, 0.02));
    }

    #[test]
    fn salt_adds_loss_mostly_at_low_frequency() {
        // eps''_sigma = sigma/(omega eps0): at 27.12 MHz it dwarfs the dipolar loss; 1 S/m adds
        // 662.80 there and 7.3368 at 2450 MHz (shared/sources.md section 2).
        let brine = permittivity(27.12e6, 20.0, 0.01, Some(1.0));
        let pure = water::permittivity(27.12e6, 20.0);
        assert_relative_eq!(-brine.eps.im - (-pure.im) * 1.0, 662.80, max_relative = 0.01);
        let brine = permittivity(2.45e9, 20.0, 0.0, Some(1.0));
        let pure = water::permittivity(2.45e9, 20.0);
        assert_relative_eq!(-brine.eps.im + pure.im, 7.3368, max_relative = 1e-4);
    }

    #[test]
    fn strong_brine_holds_the_dipolar_factors() {
        assert!(permittivity(915e6, 20.0, 0.25, None).dipolar_held);
        assert!(!permittivity(915e6, 20.0, 0.10, None).dipolar_held);
    }
}
