//! Physical constants, from the CODATA 2018 recommended values (Tiesinga et al., Rev. Mod. Phys. 93,
//! 025010, 2021), plus the exact SI definitions. Every other module takes its constants from here.

/// Speed of light in vacuum, m/s (exact by the SI definition of the metre).
pub const SPEED_OF_LIGHT_M_PER_S: f64 = 299_792_458.0;

/// Vacuum electric permittivity eps0, F/m (CODATA 2018).
pub const VACUUM_PERMITTIVITY_F_PER_M: f64 = 8.854_187_812_8e-12;

/// Vacuum magnetic permeability mu0, N/A^2 (CODATA 2018).
pub const VACUUM_PERMEABILITY_N_PER_A2: f64 = 1.256_637_062_12e-6;

/// Characteristic impedance of vacuum eta0 = mu0 c, ohm (CODATA 2018).
pub const VACUUM_IMPEDANCE_OHM: f64 = 376.730_313_668;

/// Offset between the Celsius and Kelvin scales, K (exact by definition).
pub const ZERO_CELSIUS_K: f64 = 273.15;

/// Standard atmosphere, Pa (exact by definition).
pub const STANDARD_ATMOSPHERE_PA: f64 = 101_325.0;

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn impedance_is_consistent_with_permeability_and_light_speed() {
        // CODATA 2018: eta0 = mu0 c and eps0 = 1/(mu0 c^2), to the stated digits.
        assert_relative_eq!(
            VACUUM_PERMEABILITY_N_PER_A2 * SPEED_OF_LIGHT_M_PER_S,
            VACUUM_IMPEDANCE_OHM,
            max_relative = 1e-10
        );
        assert_relative_eq!(
            1.0 / (VACUUM_PERMEABILITY_N_PER_A2 * SPEED_OF_LIGHT_M_PER_S.powi(2)),
            VACUUM_PERMITTIVITY_F_PER_M,
            max_relative = 1e-10
        );
    }
}
