//! Pure ice Ih: complex permittivity from Maetzler (2006).
//!
//! C. Maetzler, "Microwave dielectric properties of ice", in Thermal Microwave Radiation:
//! Applications for Remote Sensing (IET 2006), pp. 456-461 (shared/sources.md 3.1, read in public
//! code). T in K, f in GHz, theta = 300/T - 1:
//!   eps'  = 3.1884 + 9.1e-4 (T - 273.15)
//!   alpha = (0.00504 + 0.0062 theta) exp(-22.1 theta)
//!   beta  = (0.0207/T) e^(335/T) / (e^(335/T) - 1)^2 + 1.16e-11 f^2 + exp(-9.963 + 0.0372 (T - 273.15))
//!   eps'' = alpha/f + beta f
//! Validity (from memory): about 0.01-300 GHz and 240-273 K (-33 to 0 degC); the core uses it to
//! -60 degC (an extrapolation) for deep-frozen products. Pure ice: real ice in foods carries
//! impurities and is several times lossier (von Hippel 1954: tan delta 9e-4 at 3 GHz, -12 degC, from
//! memory), which is one reason the frozen-food model is dominated by its unfrozen brine.

use crate::physics::complex::Complex;
use crate::physics::constants::ZERO_CELSIUS_K;

/// Lowest temperature of the model's stated range, degC.
pub const MODEL_TEMP_MIN_C: f64 = -33.0;
/// Highest temperature (the melting point), degC.
pub const MODEL_TEMP_MAX_C: f64 = 0.0;

/// Complex permittivity eps' - j eps'' of pure ice at `frequency_hz` and `temp_c`.
pub fn permittivity(frequency_hz: f64, temp_c: f64) -> Complex {
    let t_k = temp_c + ZERO_CELSIUS_K;
    let f_ghz = frequency_hz / 1e9;
    let eps_real = 3.1884 + 9.1e-4 * temp_c;
    let theta = 300.0 / t_k - 1.0;
    let alpha = (0.00504 + 0.0062 * theta) * (-22.1 * theta).exp();
    let exponential = (335.0 / t_k).exp();
    let beta = 0.0207 / t_k * exponential / (exponential - 1.0).powi(2)
        + 1.16e-11 * f_ghz * f_ghz
        + (-9.963 + 0.0372 * temp_c).exp();
    Complex::new(eps_real, -(alpha / f_ghz + beta * f_ghz))
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn ice_is_nearly_lossless_with_eps_near_3_2() {
        let eps = permittivity(2.45e9, -10.0);
        assert_relative_eq!(eps.re, 3.1793, max_relative = 1e-4);
        // Maetzler's pure ice at -10 degC, 2.45 GHz: eps'' of order 1e-4 to 1e-3 [CALC].
        assert!(-eps.im > 1e-4 && -eps.im < 1e-3, "{eps:?}");
    }

    #[test]
    fn loss_rises_towards_the_melting_point() {
        let cold = -permittivity(915e6, -30.0).im;
        let warm = -permittivity(915e6, -1.0).im;
        assert!(warm > cold);
    }
}
