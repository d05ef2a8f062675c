//! Dielectric heating: power density from the loss factor and the field, and what follows from it.
//!
//!   P_v = 2 pi f eps0 eps'' E_rms^2            [W/m^3]   (E_rms inside the material)
//!   eps''_sigma = sigma / (2 pi f eps0)        (ionic conduction adds to the dipolar loss)
//!   dT/dt = P_v / (rho c_p)                    [K/s]     (initial rate, no losses, no phase change)
//! Source: Komarov, Wang & Tang, "Permittivity and measurement", Encyclopedia of RF and Microwave
//! Engineering (Wiley 2005), Eq. (2) and Eq. (3) ("rho Cp dT/dt = 5.563e-11 f E^2 eps''").

use crate::physics::constants::VACUUM_PERMITTIVITY_F_PER_M;
use std::f64::consts::PI;

/// Volumetric power density P_v = 2 pi f eps0 eps'' E_rms^2, W/m^3.
pub fn power_density_w_per_m3(frequency_hz: f64, eps_imag: f64, e_rms_v_per_m: f64) -> f64 {
    2.0 * PI * frequency_hz * VACUUM_PERMITTIVITY_F_PER_M * eps_imag * e_rms_v_per_m * e_rms_v_per_m
}

/// Power absorbed by a volume at uniform power density, W.
pub fn absorbed_power_w(power_density_w_per_m3: f64, volume_m3: f64) -> f64 {
    power_density_w_per_m3 * volume_m3
}

/// RMS field inside the material needed for a target power density, V/m; `None` if eps'' = 0.
pub fn field_for_power_density_v_per_m(frequency_hz: f64, eps_imag: f64, power_density_w_per_m3: f64) -> Option<f64> {
    let per_field_squared = 2.0 * PI * frequency_hz * VACUUM_PERMITTIVITY_F_PER_M * eps_imag;
    (per_field_squared > 0.0).then(|| (power_density_w_per_m3 / per_field_squared).sqrt())
}

/// Initial heating rate dT/dt = P_v / (rho c_p), K/s.
pub fn heating_rate_k_per_s(power_density_w_per_m3: f64, density_kg_per_m3: f64, specific_heat_j_per_kg_k: f64) -> f64 {
    power_density_w_per_m3 / (density_kg_per_m3 * specific_heat_j_per_kg_k)
}

/// Loss factor contributed by ionic conductivity, eps''_sigma = sigma / (2 pi f eps0).
pub fn conductivity_loss_factor(conductivity_s_per_m: f64, frequency_hz: f64) -> f64 {
    conductivity_s_per_m / (2.0 * PI * frequency_hz * VACUUM_PERMITTIVITY_F_PER_M)
}

/// Effective loss factor: dipolar part plus the conduction term.
pub fn effective_loss_factor(eps_imag_dipolar: f64, conductivity_s_per_m: f64, frequency_hz: f64) -> f64 {
    eps_imag_dipolar + conductivity_loss_factor(conductivity_s_per_m, frequency_hz)
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn published_numeric_form() {
        // Komarov, Wang & Tang (2005) Eq. (3): P_v = 5.563e-11 f E^2 eps''.
        let p = power_density_w_per_m3(2.45e9, 10.0, 1000.0);
        assert_relative_eq!(p, 5.563e-11 * 2.45e9 * 1.0e6 * 10.0, max_relative = 1e-4);
    }

    #[test]
    fn identities() {
        // Zero loss gives zero power; doubling the field quadruples it (common practice checks).
        assert_eq!(power_density_w_per_m3(915e6, 0.0, 5e3), 0.0);
        let one = power_density_w_per_m3(915e6, 12.0, 1e3);
        assert_relative_eq!(power_density_w_per_m3(915e6, 12.0, 2e3), 4.0 * one, max_relative = 1e-12);
        let field = field_for_power_density_v_per_m(915e6, 12.0, one).unwrap();
        assert_relative_eq!(field, 1e3, max_relative = 1e-12);
        assert_eq!(field_for_power_density_v_per_m(915e6, 0.0, one), None);
    }

    #[test]
    fn conduction_loss_factor_table() {
        // shared/sources.md section 2 [CALC], sigma = 1 S/m: 13.56 MHz 1325.60; 27.12 MHz 662.80;
        // 915 MHz 19.6449; 2450 MHz 7.33680. Cross-check with the Meissner-Wentz code constant
        // 1/(2 pi eps0) = 17.97510 GHz m/S (Meissner & Wentz 2004).
        for (f, expected) in [(13.56e6, 1325.60), (27.12e6, 662.80), (915e6, 19.6449), (2450e6, 7.33680)] {
            assert_relative_eq!(conductivity_loss_factor(1.0, f), expected, max_relative = 1e-5);
            assert_relative_eq!(conductivity_loss_factor(1.0, f), 17.97510 / (f / 1e9), max_relative = 1e-6);
        }
        assert_relative_eq!(effective_loss_factor(10.0, 1.0, 2450e6), 17.3368, max_relative = 1e-5);
    }

    #[test]
    fn heating_rate_of_water() {
        // 1 MW/m^3 into water (rho 997 kg/m^3, cp 4182 J/kg K, IAPWS-95 at 25 degC, sources.md 7).
        assert_relative_eq!(heating_rate_k_per_s(1e6, 997.0, 4182.0), 0.23985, max_relative = 1e-4);
    }
}
