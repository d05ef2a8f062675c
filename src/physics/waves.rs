//! Plane waves in a lossy dielectric: wavelength, attenuation, penetration depth and surface reflection.
//!
//! With eps* = eps' - j eps'' and tan(delta) = eps''/eps', the propagation constant gamma = alpha + j beta:
//!   alpha = (2 pi / lambda0) sqrt(eps'/2) [sqrt(1 + tan^2 delta) - 1]^(1/2)   (field, Np/m)
//!   beta  = (2 pi / lambda0) sqrt(eps'/2) [sqrt(1 + tan^2 delta) + 1]^(1/2)   (rad/m)
//!   Dp    = 1 / (2 alpha)  (power falls to 1/e), half-power depth = ln 2 * Dp
//! and at normal incidence from air Gamma = (1 - n)/(1 + n), n = sqrt(eps*), R = |Gamma|^2.
//! The low-loss form Dp ~ lambda0 sqrt(eps') / (2 pi eps'') is offered beside the exact one.
//! Source: Metaxas & Meredith, Industrial Microwave Heating (IEE 1983), ch. 2 (from memory); the
//! same forms in shared/sources.md section 4. Non-magnetic materials (mu_r = 1) are assumed.

use crate::error::{require_in, InputError};
use crate::physics::constants::SPEED_OF_LIGHT_M_PER_S;
use crate::physics::permittivity::ComplexPermittivity;
use serde::Serialize;
use std::f64::consts::{LN_2, PI};

/// Lowest frequency accepted, Hz: 1 kHz (0.001 MHz), far below any dielectric heating band. A
/// floor above zero: a frequency of a few times 1e-300 Hz would give an infinite wavelength.
pub const FREQUENCY_MIN_HZ: f64 = 1.0e3;
/// Highest frequency accepted, Hz: 300 GHz, the top of the microwave range.
pub const FREQUENCY_MAX_HZ: f64 = 300.0e9;

/// How a plane wave travels in one material at one frequency.
#[derive(Debug, Clone, Copy, PartialEq, Serialize)]
pub struct WaveProperties {
    /// Free-space wavelength lambda0 = c0 / f, m.
    pub wavelength_free_space_m: f64,
    /// Wavelength in the material 2 pi / beta, m.
    pub wavelength_in_material_m: f64,
    /// Field attenuation constant alpha, Np/m.
    pub attenuation_np_per_m: f64,
    /// Phase constant beta, rad/m.
    pub phase_constant_rad_per_m: f64,
    /// Power penetration depth Dp = 1/(2 alpha), m; `None` for a lossless material (infinite).
    pub penetration_depth_m: Option<f64>,
    /// Low-loss approximation of Dp, lambda0 sqrt(eps') / (2 pi eps''), m; labelled as such.
    pub penetration_depth_low_loss_m: Option<f64>,
    /// Depth at which the power has halved, ln 2 * Dp, m.
    pub half_power_depth_m: Option<f64>,
    /// Loss tangent eps''/eps'.
    pub loss_tangent: f64,
    /// Power reflectance |Gamma|^2 at normal incidence from air onto a thick layer.
    pub reflectance_normal: f64,
    /// Fraction of incident power entering the surface, 1 - R.
    pub transmittance_normal: f64,
}

/// Check a frequency given in Hz (field name `freq_mhz`, since that is how users enter it).
pub fn checked_frequency_hz(freq_mhz: f64) -> Result<f64, InputError> {
    require_in("freq_mhz", freq_mhz, FREQUENCY_MIN_HZ / 1e6, FREQUENCY_MAX_HZ / 1e6).map(|f| f * 1e6)
}

/// Checked entry point for user input: frequency in MHz and the two parts of the permittivity.
pub fn wave_properties_checked(freq_mhz: f64, eps_real: f64, eps_imag: f64) -> Result<WaveProperties, InputError> {
    let frequency_hz = checked_frequency_hz(freq_mhz)?;
    let eps = ComplexPermittivity::checked(eps_real, eps_imag)?;
    Ok(wave_properties(frequency_hz, eps))
}

/// Field attenuation constant alpha, Np/m (exact, any loss).
pub fn attenuation_np_per_m(frequency_hz: f64, eps: ComplexPermittivity) -> f64 {
    let k0 = 2.0 * PI * frequency_hz / SPEED_OF_LIGHT_M_PER_S;
    let tan_delta = eps.loss_tangent();
    let root = (1.0 + tan_delta * tan_delta).sqrt();
    // sqrt(1 + t^2) - 1 = t^2 / (sqrt(1 + t^2) + 1): no cancellation for very low loss (PTFE, quartz).
    let lower = tan_delta * tan_delta / (root + 1.0);
    k0 * (eps.eps_real / 2.0).sqrt() * lower.sqrt()
}

/// Phase constant beta, rad/m (exact).
pub fn phase_constant_rad_per_m(frequency_hz: f64, eps: ComplexPermittivity) -> f64 {
    let k0 = 2.0 * PI * frequency_hz / SPEED_OF_LIGHT_M_PER_S;
    let tan_delta = eps.loss_tangent();
    let root = (1.0 + tan_delta * tan_delta).sqrt();
    k0 * (eps.eps_real / 2.0).sqrt() * (root + 1.0).sqrt()
}

/// Power penetration depth Dp = 1/(2 alpha), m; `None` when the material is lossless.
pub fn penetration_depth_m(frequency_hz: f64, eps: ComplexPermittivity) -> Option<f64> {
    let alpha = attenuation_np_per_m(frequency_hz, eps);
    (alpha > 0.0).then(|| 1.0 / (2.0 * alpha))
}

/// Power reflectance at normal incidence from air onto a semi-infinite material.
pub fn reflectance_normal(eps: ComplexPermittivity) -> f64 {
    let n = eps.refractive_index();
    let one = crate::physics::complex::Complex::ONE;
    ((one - n) / (one + n)).norm_sqr()
}

/// All wave properties for a checked frequency (Hz) and permittivity.
pub fn wave_properties(frequency_hz: f64, eps: ComplexPermittivity) -> WaveProperties {
    let wavelength_free_space_m = SPEED_OF_LIGHT_M_PER_S / frequency_hz;
    let alpha = attenuation_np_per_m(frequency_hz, eps);
    let beta = phase_constant_rad_per_m(frequency_hz, eps);
    let penetration_depth = penetration_depth_m(frequency_hz, eps);
    let low_loss =
        (eps.eps_imag > 0.0).then(|| wavelength_free_space_m * eps.eps_real.sqrt() / (2.0 * PI * eps.eps_imag));
    let reflectance = reflectance_normal(eps);
    WaveProperties {
        wavelength_free_space_m,
        wavelength_in_material_m: 2.0 * PI / beta,
        attenuation_np_per_m: alpha,
        phase_constant_rad_per_m: beta,
        penetration_depth_m: penetration_depth,
        penetration_depth_low_loss_m: low_loss,
        half_power_depth_m: penetration_depth.map(|dp| LN_2 * dp),
        loss_tangent: eps.loss_tangent(),
        reflectance_normal: reflectance,
        transmittance_normal: 1.0 - reflectance,
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;
    use num_complex::Complex64;

    #[test]
    fn a_vanishing_frequency_is_refused_by_name() {
        // Found by the property test in tests/it/physics_properties.rs: 1.1e-308 MHz passed a
        // "more than 0" check and gave an infinite free-space wavelength.
        let error = wave_properties_checked(1.1125369292536007e-308, 476.1, 0.0).unwrap_err();
        assert_eq!(error.field, "freq_mhz");
        assert_eq!(error.valid, "0.001 to 300000");
        assert!(wave_properties_checked(0.001, 2.0, 0.1).is_ok());
    }

    /// Independent route: gamma = j k0 sqrt(eps*) computed with the `num-complex` crate.
    fn reference_alpha_beta(frequency_hz: f64, eps: ComplexPermittivity) -> (f64, f64) {
        let k0 = 2.0 * PI * frequency_hz / SPEED_OF_LIGHT_M_PER_S;
        let n = Complex64::new(eps.eps_real, -eps.eps_imag).sqrt();
        (-k0 * n.im, k0 * n.re)
    }

    #[test]
    fn closed_form_matches_complex_square_root() {
        let cases = [
            (2.45e9, ComplexPermittivity::new(78.0, 13.4)),
            (915e6, ComplexPermittivity::new(56.0, 21.0)),
            (27.12e6, ComplexPermittivity::new(60.0, 1325.0)),
            (2.45e9, ComplexPermittivity::new(2.08, 6e-4)),
            (13.56e6, ComplexPermittivity::new(4.0, 0.4)),
        ];
        for (f, eps) in cases {
            let (alpha, beta) = reference_alpha_beta(f, eps);
            assert_relative_eq!(attenuation_np_per_m(f, eps), alpha, max_relative = 1e-10);
            assert_relative_eq!(phase_constant_rad_per_m(f, eps), beta, max_relative = 1e-10);
        }
    }

    #[test]
    fn douglas_fir_depths_scale_as_published() {
        // Schiffmann, "Microwave and RF drying of heat sensitive and difficult to dry materials",
        // Table 1 (shared/sources.md 3.3): Dp = 0.130 m at 915 MHz and 0.049 m at 2450 MHz with
        // one constant permittivity. Their ratio equals the frequency ratio for constant eps.
        let eps = ComplexPermittivity::new(2.0, 0.2);
        let ratio = penetration_depth_m(915e6, eps).unwrap() / penetration_depth_m(2450e6, eps).unwrap();
        assert_relative_eq!(ratio, 0.130 / 0.049, max_relative = 0.01);
    }

    #[test]
    fn fat_tissue_textbook_exercise() {
        // Textbook exercise quoted in shared/sources.md section 4: fat at 2.45 GHz, eps' = 5.5,
        // sigma = 0.12 S/m -> eps'' = 0.88041, exact 1/e field depth 1/alpha = 10.408 cm,
        // low-loss approximation 10.365 cm, Dp = 5.204 cm [CALC there, recomputed here].
        let eps = ComplexPermittivity::new(5.5, 0.88041);
        let props = wave_properties(2.45e9, eps);
        assert_relative_eq!(1.0 / props.attenuation_np_per_m, 0.10408, max_relative = 5e-4);
        // The exercise rounds 1/pi to 0.318, which alone makes its 10.365 cm 0.1 % short of ours.
        assert_relative_eq!(2.0 * props.penetration_depth_low_loss_m.unwrap(), 0.10365, max_relative = 1.5e-3);
        assert_relative_eq!(props.penetration_depth_m.unwrap(), 0.05204, max_relative = 5e-4);
    }

    #[test]
    fn water_at_2450_penetration_depth() {
        // Datta & Ramaswamy (2001) water eps = 78 - j13.4 at 2.45 GHz gives Dp = 1.29 cm
        // (shared/sources.md section 4, [CALC]).
        let dp = penetration_depth_m(2.45e9, ComplexPermittivity::new(78.0, 13.4)).unwrap();
        assert_relative_eq!(dp, 0.0129, max_relative = 0.01);
    }

    #[test]
    fn lossless_limits() {
        let eps = ComplexPermittivity::new(4.0, 0.0);
        let props = wave_properties(1e9, eps);
        assert_eq!(props.penetration_depth_m, None);
        assert_eq!(props.attenuation_np_per_m, 0.0);
        // Lossless n = 2: R = ((1 - 2)/(1 + 2))^2 = 1/9 (Fresnel, exact).
        assert_relative_eq!(props.reflectance_normal, 1.0 / 9.0, max_relative = 1e-12);
        // Wavelength shrinks by n.
        assert_relative_eq!(props.wavelength_in_material_m, props.wavelength_free_space_m / 2.0, max_relative = 1e-12);
        assert_relative_eq!(wave_properties(1e9, ComplexPermittivity::VACUUM).reflectance_normal, 0.0);
    }

    #[test]
    fn low_loss_approximation_converges_to_exact() {
        let eps = ComplexPermittivity::new(2.1, 1e-4);
        let props = wave_properties(2.45e9, eps);
        assert_relative_eq!(
            props.penetration_depth_m.unwrap(),
            props.penetration_depth_low_loss_m.unwrap(),
            max_relative = 1e-8
        );
        assert_relative_eq!(props.half_power_depth_m.unwrap(), LN_2 * props.penetration_depth_m.unwrap());
    }
}
