//! Water thermodynamics for the energy balance: saturation pressure, boiling point, latent heats.
//!
//! Saturation line, from the IAPWS "Revised Supplementary Release on Saturation Properties of
//! Ordinary Water Substance" (1992), Wagner & Pruss, J. Phys. Chem. Ref. Data 22 (1993) 783,
//! with tau = 1 - T/Tc, theta = T/Tc, Tc = 647.096 K, pc = 22.064 MPa, rho_c = 322 kg/m^3:
//!   ln(p/pc)       = (Tc/T)(a1 tau + a2 tau^1.5 + a3 tau^3 + a4 tau^3.5 + a5 tau^4 + a6 tau^7.5)
//!   rho'/rho_c     = 1 + b1 tau^(1/3) + b2 tau^(2/3) + b3 tau^(5/3) + b4 tau^(16/3) + b5 tau^(43/3) + b6 tau^(110/3)
//!   ln(rho''/rho_c)= c1 tau^(2/6) + c2 tau^(4/6) + c3 tau^(8/6) + c4 tau^(18/6) + c5 tau^(37/6) + c6 tau^(71/6)
//!   alpha/(1000 J/kg) = d_alpha + d1 theta^-19 + d2 theta + d3 theta^4.5 + d4 theta^5 + d5 theta^54.5
//!   h' = alpha + (T/rho') dp/dT,  h'' = alpha + (T/rho'') dp/dT,  h_fg = h'' - h'
//! The auxiliary equations reproduce IAPWS-95 on the saturation line to better than 0.1 % in h_fg
//! from the triple point to 300 degC; the tests check them against IAPWS-IF97 (the `seuif97` crate)
//! and against IAPWS-95 values. The enthalpy reference is the IAPWS one: the saturated liquid at
//! the triple point has u = 0 (h' = 0.6 J/kg). Valid 273.16 K to Tc; this module accepts 0.01 to 370 degC.
//!
//! Fusion: latent heat of fusion of ice at 0 degC and 0.101325 MPa, 333.42 kJ/kg, the difference of
//! IAPWS-95 (liquid) and IAPWS-06 (ice Ih) enthalpies (shared/sources.md section 7). Specific heat of
//! ice: a straight line through the IAPWS-06 values 2.0967 kJ/(kg K) at 0 degC and 1.9498 at -20 degC
//! (it gives 2.0233 at -10 degC against IAPWS-06 2.0231); valid -60 to 0 degC within 1 % to -40 degC
//! (beyond -20 degC an extrapolation of the straight line, which follows the measured slope).

use crate::error::{require_in, InputError};
use crate::physics::constants::ZERO_CELSIUS_K;

/// Critical temperature of water, K (IAPWS).
pub const CRITICAL_TEMPERATURE_K: f64 = 647.096;
/// Critical pressure of water, Pa (IAPWS).
pub const CRITICAL_PRESSURE_PA: f64 = 22.064e6;
/// Critical density of water, kg/m^3 (IAPWS).
pub const CRITICAL_DENSITY_KG_PER_M3: f64 = 322.0;
/// Latent heat of fusion of ice at 0 degC, 0.101325 MPa, J/kg (IAPWS-95 liquid minus IAPWS-06 ice).
pub const LATENT_HEAT_FUSION_J_PER_KG: f64 = 333_420.0;
/// Lowest temperature accepted on the saturation line, degC (the triple point is 0.01 degC).
pub const SATURATION_TEMP_MIN_C: f64 = 0.01;
/// Highest temperature accepted on the saturation line, degC (the critical point is 373.946 degC).
pub const SATURATION_TEMP_MAX_C: f64 = 370.0;
/// Saturation pressure at [`SATURATION_TEMP_MIN_C`] (the triple point), Pa.
pub const TRIPLE_POINT_PRESSURE_PA: f64 = 611.657;

const A: [f64; 6] = [-7.859_517_83, 1.844_082_59, -11.786_649_7, 22.680_741_1, -15.961_871_9, 1.801_225_02];
const A_EXP: [f64; 6] = [1.0, 1.5, 3.0, 3.5, 4.0, 7.5];
const B: [f64; 6] = [1.992_740_64, 1.099_653_42, -0.510_839_303, -1.754_934_79, -45.517_035_2, -6.746_944_50e5];
const B_EXP: [f64; 6] = [1.0 / 3.0, 2.0 / 3.0, 5.0 / 3.0, 16.0 / 3.0, 43.0 / 3.0, 110.0 / 3.0];
const C: [f64; 6] = [-2.031_502_40, -2.683_029_40, -5.386_264_92, -17.299_160_5, -44.758_658_1, -63.920_106_3];
const C_EXP: [f64; 6] = [2.0 / 6.0, 4.0 / 6.0, 8.0 / 6.0, 18.0 / 6.0, 37.0 / 6.0, 71.0 / 6.0];
const D_ALPHA: f64 = -1_135.905_627_715;
const D: [f64; 5] = [-5.651_349_98e-8, 2_690.666_31, 127.287_297, -135.003_439, 0.981_825_814];
const D_EXP: [f64; 5] = [-19.0, 1.0, 4.5, 5.0, 54.5];

/// Ice specific heat at 0 degC, J/(kg K) (IAPWS-06, shared/sources.md section 7).
const ICE_CP_AT_ZERO_J_PER_KG_K: f64 = 2096.7;
/// Slope of the ice specific heat, J/(kg K^2): (2096.7 - 1949.8)/20 from the IAPWS-06 values.
const ICE_CP_SLOPE_J_PER_KG_K2: f64 = (2096.7 - 1949.8) / 20.0;

fn check_saturation_temp(temp_c: f64) -> Result<f64, InputError> {
    require_in("temp_c", temp_c, SATURATION_TEMP_MIN_C, SATURATION_TEMP_MAX_C)
}

/// tau = 1 - T/Tc for a temperature already checked.
fn tau_of(temp_c: f64) -> f64 {
    1.0 - (temp_c + ZERO_CELSIUS_K) / CRITICAL_TEMPERATURE_K
}

/// The sum S(tau) = sum a_i tau^e_i and its derivative dS/dtau.
fn pressure_series(tau: f64) -> (f64, f64) {
    let mut sum = 0.0;
    let mut derivative = 0.0;
    for (a, e) in A.iter().zip(A_EXP) {
        sum += a * tau.powf(e);
        derivative += a * e * tau.powf(e - 1.0);
    }
    (sum, derivative)
}

fn saturation_pressure_unchecked(temp_c: f64) -> f64 {
    let t_k = temp_c + ZERO_CELSIUS_K;
    let (sum, _) = pressure_series(tau_of(temp_c));
    CRITICAL_PRESSURE_PA * (CRITICAL_TEMPERATURE_K / t_k * sum).exp()
}

/// dp/dT on the saturation line, Pa/K: dp/dT = -(p/T) [ln(p/pc) + dS/dtau].
fn saturation_slope_pa_per_k(temp_c: f64) -> f64 {
    let t_k = temp_c + ZERO_CELSIUS_K;
    let tau = tau_of(temp_c);
    let (sum, derivative) = pressure_series(tau);
    let ln_ratio = CRITICAL_TEMPERATURE_K / t_k * sum;
    let p = CRITICAL_PRESSURE_PA * ln_ratio.exp();
    -(p / t_k) * (ln_ratio + derivative)
}

fn liquid_density_unchecked(temp_c: f64) -> f64 {
    let tau = tau_of(temp_c);
    let series: f64 = B.iter().zip(B_EXP).map(|(b, e)| b * tau.powf(e)).sum();
    CRITICAL_DENSITY_KG_PER_M3 * (1.0 + series)
}

fn vapour_density_unchecked(temp_c: f64) -> f64 {
    let tau = tau_of(temp_c);
    let series: f64 = C.iter().zip(C_EXP).map(|(c, e)| c * tau.powf(e)).sum();
    CRITICAL_DENSITY_KG_PER_M3 * series.exp()
}

/// The auxiliary quantity alpha, J/kg.
fn alpha_j_per_kg(temp_c: f64) -> f64 {
    let theta = (temp_c + ZERO_CELSIUS_K) / CRITICAL_TEMPERATURE_K;
    let series: f64 = D.iter().zip(D_EXP).map(|(d, e)| d * theta.powf(e)).sum();
    1000.0 * (D_ALPHA + series)
}

fn liquid_enthalpy_unchecked(temp_c: f64) -> f64 {
    let t_k = temp_c + ZERO_CELSIUS_K;
    alpha_j_per_kg(temp_c) + t_k / liquid_density_unchecked(temp_c) * saturation_slope_pa_per_k(temp_c)
}

/// Saturation (vapour) pressure of water at `temp_c`, Pa. Accepts 0.01 to 370 degC.
pub fn saturation_pressure_pa(temp_c: f64) -> Result<f64, InputError> {
    let temp_c = check_saturation_temp(temp_c)?;
    Ok(saturation_pressure_unchecked(temp_c))
}

/// Density of the saturated liquid, kg/m^3. Accepts 0.01 to 370 degC.
pub fn saturated_liquid_density_kg_per_m3(temp_c: f64) -> Result<f64, InputError> {
    let temp_c = check_saturation_temp(temp_c)?;
    Ok(liquid_density_unchecked(temp_c))
}

/// Density of the saturated vapour, kg/m^3. Accepts 0.01 to 370 degC.
pub fn saturated_vapour_density_kg_per_m3(temp_c: f64) -> Result<f64, InputError> {
    let temp_c = check_saturation_temp(temp_c)?;
    Ok(vapour_density_unchecked(temp_c))
}

/// Specific enthalpy of the saturated liquid h'(T), J/kg, IAPWS reference (u = 0 for the liquid at
/// the triple point). Accepts 0.01 to 370 degC.
pub fn saturated_liquid_enthalpy_j_per_kg(temp_c: f64) -> Result<f64, InputError> {
    let temp_c = check_saturation_temp(temp_c)?;
    Ok(liquid_enthalpy_unchecked(temp_c))
}

/// Specific enthalpy of the saturated vapour h''(T), J/kg. Accepts 0.01 to 370 degC.
pub fn saturated_vapour_enthalpy_j_per_kg(temp_c: f64) -> Result<f64, InputError> {
    let temp_c = check_saturation_temp(temp_c)?;
    let t_k = temp_c + ZERO_CELSIUS_K;
    Ok(alpha_j_per_kg(temp_c) + t_k / vapour_density_unchecked(temp_c) * saturation_slope_pa_per_k(temp_c))
}

/// Latent heat of vaporization h_fg(T) = h'' - h' = T (dp/dT) (1/rho'' - 1/rho'), J/kg.
/// Accepts 0.01 to 370 degC (it falls to zero at the critical point, 373.946 degC).
pub fn latent_heat_vaporization_j_per_kg(temp_c: f64) -> Result<f64, InputError> {
    let temp_c = check_saturation_temp(temp_c)?;
    let t_k = temp_c + ZERO_CELSIUS_K;
    let volume_change = 1.0 / vapour_density_unchecked(temp_c) - 1.0 / liquid_density_unchecked(temp_c);
    Ok(t_k * saturation_slope_pa_per_k(temp_c) * volume_change)
}

/// Boiling point of pure water at `pressure_pa`, degC: the inverse of [`saturation_pressure_pa`],
/// solved by bisection to 1e-9 K. Accepts 611.657 Pa (triple point) to 21 MPa.
pub fn boiling_point_c(pressure_pa: f64) -> Result<f64, InputError> {
    let pressure_pa = require_in(
        "pressure_pa",
        pressure_pa,
        TRIPLE_POINT_PRESSURE_PA,
        saturation_pressure_unchecked(SATURATION_TEMP_MAX_C),
    )?;
    // The saturation pressure rises monotonically with temperature, so bisection always converges.
    let target = pressure_pa.ln();
    let (mut low, mut high) = (SATURATION_TEMP_MIN_C - 1e-6, SATURATION_TEMP_MAX_C);
    for _ in 0..100 {
        let middle = 0.5 * (low + high);
        if saturation_pressure_unchecked(middle).ln() < target {
            low = middle;
        } else {
            high = middle;
        }
        if high - low < 1e-9 {
            break;
        }
    }
    Ok(0.5 * (low + high))
}

/// Specific heat of ice Ih, J/(kg K): the straight line through the IAPWS-06 values at 0 and -20 degC.
/// Accepts -60 to 0 degC.
pub fn ice_specific_heat_j_per_kg_k(temp_c: f64) -> Result<f64, InputError> {
    let temp_c = require_in("temp_c", temp_c, -60.0, 0.0)?;
    Ok(ice_cp_unchecked(temp_c))
}

pub(crate) fn ice_cp_unchecked(temp_c: f64) -> f64 {
    ICE_CP_AT_ZERO_J_PER_KG_K + ICE_CP_SLOPE_J_PER_KG_K2 * temp_c
}

/// Specific enthalpy of ice relative to liquid water at 0 degC, J/kg:
/// h_ice(T) = -L_f + integral from 0 to T of cp_ice dT (the reference differs from the IAPWS
/// triple-point one by 0.01 K x 4.2 kJ/(kg K) = 0.04 kJ/kg, far below the accuracy needed here).
pub(crate) fn ice_enthalpy_unchecked(temp_c: f64) -> f64 {
    -LATENT_HEAT_FUSION_J_PER_KG + ICE_CP_AT_ZERO_J_PER_KG_K * temp_c + 0.5 * ICE_CP_SLOPE_J_PER_KG_K2 * temp_c * temp_c
}

/// Liquid-water enthalpy relative to the liquid at 0 degC, J/kg, for any temperature the core
/// accepts: h'(T) - h'(0.01 degC) from the saturation line at 0.01 to 370 degC; below 0.01 degC
/// (supercooled liquid) a straight line with the IAPWS-95 cp at 0.01 degC, 4219.4 J/(kg K).
pub(crate) fn liquid_enthalpy_from_zero(temp_c: f64) -> f64 {
    const CP_AT_TRIPLE_POINT: f64 = 4219.4;
    let at_triple = liquid_enthalpy_unchecked(SATURATION_TEMP_MIN_C);
    if temp_c >= SATURATION_TEMP_MIN_C {
        let clipped = temp_c.min(SATURATION_TEMP_MAX_C);
        liquid_enthalpy_unchecked(clipped) - at_triple + CP_AT_TRIPLE_POINT * SATURATION_TEMP_MIN_C
    } else {
        CP_AT_TRIPLE_POINT * temp_c
    }
}

#[cfg(test)]
mod tests {
    use super::*;
    use approx::assert_relative_eq;

    #[test]
    fn triple_and_normal_boiling_points() {
        // IAPWS: p(273.16 K) = 611.657 Pa; the normal boiling point at 101 325 Pa is 99.974 degC
        // on ITS-90 (IAPWS-95; IF97 gives 99.9743).
        assert_relative_eq!(saturation_pressure_pa(0.01).unwrap(), 611.657, max_relative = 1e-4);
        assert_relative_eq!(boiling_point_c(101_325.0).unwrap(), 99.974, epsilon = 0.002);
    }

    #[test]
    fn boiling_point_inverts_saturation_pressure() {
        for t in [0.5, 20.0, 45.0, 99.0, 150.0, 300.0] {
            let p = saturation_pressure_pa(t).unwrap();
            assert_relative_eq!(boiling_point_c(p).unwrap(), t, epsilon = 1e-6);
        }
    }

    #[test]
    fn latent_heat_equals_vapour_minus_liquid_enthalpy() {
        for t in [1.0, 50.0, 100.0, 200.0] {
            let difference =
                saturated_vapour_enthalpy_j_per_kg(t).unwrap() - saturated_liquid_enthalpy_j_per_kg(t).unwrap();
            assert_relative_eq!(latent_heat_vaporization_j_per_kg(t).unwrap(), difference, max_relative = 1e-12);
        }
    }

    #[test]
    fn out_of_range_is_refused_with_the_field() {
        assert_eq!(latent_heat_vaporization_j_per_kg(-5.0).unwrap_err().field, "temp_c");
        assert_eq!(boiling_point_c(10.0).unwrap_err().field, "pressure_pa");
        assert!(saturation_pressure_pa(f64::NAN).is_err());
        assert!(ice_specific_heat_j_per_kg_k(1.0).is_err());
    }

    #[test]
    fn ice_enthalpy_is_minus_latent_heat_at_zero() {
        assert_relative_eq!(ice_enthalpy_unchecked(0.0), -LATENT_HEAT_FUSION_J_PER_KG);
        // Its derivative is the specific heat: a central difference at -10 degC.
        let slope = (ice_enthalpy_unchecked(-9.999) - ice_enthalpy_unchecked(-10.001)) / 0.002;
        assert_relative_eq!(slope, ice_cp_unchecked(-10.0), max_relative = 1e-6);
    }

    #[test]
    fn liquid_enthalpy_from_zero_is_continuous_at_the_triple_point() {
        let below = liquid_enthalpy_from_zero(0.01 - 1e-9);
        let above = liquid_enthalpy_from_zero(0.01 + 1e-9);
        assert!((above - below).abs() < 0.01, "{below} vs {above}");
        assert_relative_eq!(liquid_enthalpy_from_zero(0.0), 0.0);
    }
}
