//! Pure liquid water: complex permittivity from the Ellison (2007) relaxation model.
//!
//! W. J. Ellison, "Permittivity of pure water, at standard atmospheric pressure, over the
//! frequency range 0-25 THz and the temperature range 0-100 degC", J. Phys. Chem. Ref. Data
//! 36(1):1-18 (2007), Eqs. 17a/17b with the coefficients of its Table 2. Three Debye relaxations
//! and two far-infrared resonances, t in degC, nu in Hz:
//!   eps_s(t)   = 87.9144 - 0.404399 t + 9.58726e-4 t^2 - 1.32802e-6 t^3
//!   Delta_i(t) = a_i exp(-b_i t),   tau_i(t) = c_i exp(d_i / (t + t_c))
//!   eps'  = eps_s - (2 pi nu)^2 sum_i tau_i^2 Delta_i / (1 + (2 pi nu tau_i)^2) - resonance terms
//!   eps'' = 2 pi nu sum_i tau_i Delta_i / (1 + (2 pi nu tau_i)^2) + resonance terms
//! (eps = eps' - j eps''). The resonances (near 5 and 18 THz) change eps' by less than 0.01 below
//! 100 GHz; they are kept so the model is the published one, not a truncation.
//! Validity: 0-100 degC, 0-25 THz, 1 atm (the only model in shared/sources.md fitted up to
//! 100 degC). Below 0 degC (supercooled water, and the unfrozen water in frozen foods) and above
//! 100 degC (pressurized water) it is extrapolated: its Vogel-Fulcher form tau ~ exp(d/(t + 133 K))
//! stays physical there, and the tests compare it with Meissner & Wentz (2004) down to -20 degC.
//! Pure water only: dissolved salt is in [`crate::materials::saline`].

use crate::physics::complex::Complex;
use std::f64::consts::PI;

/// Lowest temperature of the fitted range, degC.
pub const FIT_TEMP_MIN_C: f64 = 0.0;
/// Highest temperature of the fitted range, degC.
pub const FIT_TEMP_MAX_C: f64 = 100.0;
/// Highest frequency of the fitted range, Hz (25 THz).
pub const FIT_FREQUENCY_MAX_HZ: f64 = 25.0e12;

// Ellison (2007), Table 2.
const A: [f64; 3] = [79.238_82, 3.815_866, 1.634_967];
const B: [f64; 3] = [0.004_300_598, 0.011_172_95, 0.006_841_548];
const C: [f64; 3] = [1.382_264e-13, 3.510_354e-16, 6.300_35e-15];
const D: [f64; 3] = [652.7648, 1249.533, 405.5169];
const TC: f64 = 133.1383;
const P: [f64; 20] = [
    0.837_969_2,
    -0.006_118_594,
    -0.000_012_936_798,
    4_235_901_000_000.0,
    -14_260_880_000.0,
    273_815_700.0,
    -1_246_943.0,
    9.618_642e-14,
    1.795_786e-16,
    -9.310_017e-18,
    1.655_473e-19,
    0.616_553_2,
    0.007_238_532,
    -0.000_095_233_66,
    15_983_170_000_000.0,
    -74_413_570_000.0,
    497_448_000.0,
    2.882_476e-14,
    -3.142_118e-16,
    3.528_051e-18,
];

/// The temperature-dependent parameters of the model at one temperature.
#[derive(Debug, Clone, Copy, PartialEq)]
pub struct EllisonParameters {
    /// Static permittivity eps_s.
    pub static_permittivity: f64,
    /// Relaxation strengths Delta_1..3.
    pub strengths: [f64; 3],
    /// Relaxation times tau_1..3, s.
    pub relaxation_times_s: [f64; 3],
}

/// Static permittivity eps_s(t) of Ellison (2007).
pub fn static_permittivity(temp_c: f64) -> f64 {
    let t = temp_c;
    87.9144 - 0.404_399 * t + 9.587_26e-4 * t * t - 1.328_02e-6 * t * t * t
}

/// The three relaxation strengths and times at `temp_c`.
pub fn parameters(temp_c: f64) -> EllisonParameters {
    let mut strengths = [0.0; 3];
    let mut relaxation_times_s = [0.0; 3];
    for i in 0..3 {
        strengths[i] = A[i] * (-B[i] * temp_c).exp();
        relaxation_times_s[i] = C[i] * (D[i] / (temp_c + TC)).exp();
    }
    EllisonParameters { static_permittivity: static_permittivity(temp_c), strengths, relaxation_times_s }
}

/// Complex permittivity eps' - j eps'' of pure water at `frequency_hz` and `temp_c`, with the
/// relaxation strengths scaled by `strength_factor` and the times by `time_factor` (both 1 for pure
/// water; the saline model uses them for the depression of eps_s and tau by dissolved salt).
pub(crate) fn permittivity_scaled(frequency_hz: f64, temp_c: f64, strength_factor: f64, time_factor: f64) -> Complex {
    let t = temp_c;
    let nu = frequency_hz;
    let params = parameters(t);
    let omega = 2.0 * PI * nu;
    let relaxed: f64 = params.strengths.iter().sum();
    // eps_inf of the relaxations (what is left at high frequency) stays fixed; salt changes the
    // relaxing part eps_s - eps_inf.
    let eps_high = params.static_permittivity - relaxed;
    let mut eps_real = eps_high;
    let mut eps_imag = 0.0;
    for i in 0..3 {
        let strength = params.strengths[i] * strength_factor;
        let tau = params.relaxation_times_s[i] * time_factor;
        let x = omega * tau;
        let denominator = 1.0 + x * x;
        eps_real += strength / denominator;
        eps_imag += strength * x / denominator;
    }

    let delta4 = P[0] + P[1] * t + P[2] * t * t;
    let f0 = P[3] + P[4] * t + P[5] * t * t + P[6] * t * t * t;
    let tau4 = P[7] + P[8] * t + P[9] * t * t + P[10] * t * t * t;
    let delta5 = P[11] + P[12] * t + P[13] * t * t;
    let f1 = P[14] + P[15] * t + P[16] * t * t;
    let tau5 = P[17] + P[18] * t + P[19] * t * t;
    for (delta, f_res, tau) in [(delta4, f0, tau4), (delta5, f1, tau5)] {
        let plus = 2.0 * PI * tau * (f_res + nu);
        let minus = 2.0 * PI * tau * (f_res - nu);
        let plus_den = 1.0 + plus * plus;
        let minus_den = 1.0 + minus * minus;
        eps_real -=
            (2.0 * PI * tau).powi(2) * (delta / 2.0) * (nu * (f_res + nu) / plus_den - nu * (f_res - nu) / minus_den);
        eps_imag += PI * nu * tau * delta * (1.0 / plus_den + 1.0 / minus_den);
    }
    Complex::new(eps_real, -eps_imag)
}

/// Complex permittivity eps' - j eps'' of pure water at `frequency_hz` and `temp_c` (Ellison 2007).
pub fn permittivity(frequency_hz: f64, temp_c: f64) -> Complex {
    permittivity_scaled(frequency_hz, temp_c, 1.0, 1.0)
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn static_limit_is_the_static_permittivity() {
        // At 1 kHz every relaxation is complete: eps' = eps_s, eps'' ~ 0 (Debye limit, exact).
        for t in [0.0, 25.0, 60.0, 100.0] {
            let eps = permittivity(1e3, t);
            assert_relative_eq!(eps.re, static_permittivity(t), max_relative = 1e-9);
            assert!(-eps.im < 1e-4, "{eps:?}");
        }
    }

    #[test]
    fn relaxation_time_at_25_c() {
        // shared/sources.md 1.6: tau_1(25 degC) = 8.576 ps [CALC from Ellison Table 2].
        assert_relative_eq!(parameters(25.0).relaxation_times_s[0], 8.576e-12, max_relative = 1e-3);
    }

    #[test]
    fn loss_factor_falls_with_temperature_at_915_and_2450() {
        // The premise: eps'' of water falls several-fold between 20 and 100 degC.
        for f in [915e6, 2.45e9] {
            let cold = -permittivity(f, 20.0).im;
            let hot = -permittivity(f, 100.0).im;
            assert!(cold / hot > 3.0, "{f}: {cold} / {hot}");
        }
    }
}
